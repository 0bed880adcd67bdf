package saturation

import (
	"math"
	"strconv"
	"testing"

	"scalerisk/water"
)

// tolAuto is the relative tolerance of γ± of single salts under the
// automatic model against Robinson & Stokes (1959) (issue 10: 3 %).
const tolAuto = 0.03

// saltComponents are the water components of each salt's ions.
var saltComponents = map[string]water.Component{"Na[+]": water.Na, "K[+]": water.K, "Ca[2+]": water.Ca,
	"Mg[2+]": water.Mg, "Ba[2+]": water.Ba, "Cl[-]": water.Cl, "SO4[2-]": water.S}

// stoichiometricGamma speciates the single-salt solution s of molality m at
// 25 °C under opt and returns its stoichiometric γ±: the mean of the free
// ions' activities over the salt's molalities, as the tables define it
// (ion pairs, where the model has them, lower it).
func stoichiometricGamma(t *testing.T, s salt, m float64, opt Options) (float64, ActivityModel) {
	t.Helper()
	a := newWater(s.name, 25, map[water.Component]float64{saltComponents[s.cation]: s.nuC * m, saltComponents[s.anion]: s.nuA * m})
	r, err := Speciate(a, opt)
	if err != nil {
		t.Fatalf("%s %g mol/kg: %v", s.name, m, err)
	}
	lnC := math.Log(r.Gamma(s.cation) * r.Molality(s.cation) / (s.nuC * m))
	lnA := math.Log(r.Gamma(s.anion) * r.Molality(s.anion) / (s.nuA * m))
	return math.Exp((s.nuC*lnC + s.nuA*lnA) / (s.nuC + s.nuA)), r.Activity
}

// TestMeanActivityAutomatic: γ± of NaCl, KCl, CaCl2, MgCl2, Na2SO4, K2SO4
// and MgSO4 at 25 °C under the automatic model, over their tabulated range,
// within tolAuto of Robinson & Stokes (1959) — except the listed gaps
// (CaCl2 above 3 mol/kg, MgSO4 below 3 mol/kg), which are held to the
// tolerance the parameter set is known to meet there (DEVELOPERS.md).
func TestMeanActivityAutomatic(t *testing.T) {
	const rsK = "Robinson & Stokes 1959 App. 8.10 [FROM MEMORY, uncertain]"
	rows := append([]meanActivityRow{
		{saltK2SO4, 0.1, 0.441, tolAuto, rsK, ""},
		{saltK2SO4, 0.2, 0.360, tolAuto, rsK, ""},
		{saltK2SO4, 0.5, 0.264, tolAuto, rsK, ""},
		{saltK2SO4, 0.7, 0.233, tolAuto, rsK, ""}, // saturation about 0.69 mol/kg
	}, meanActivityTable...)
	for _, tc := range rows {
		if tc.s == saltBaCl2 {
			continue // not among the salts of the check
		}
		got, model := stoichiometricGamma(t, tc.s, tc.m, Options{})
		tol := tolAuto
		if tc.gap != "" {
			tol = tc.tol
			t.Logf("gap: γ±(%s, %g mol/kg) = %.4g against %.4g (%+.1f %%): %s", tc.s.name, tc.m, got, tc.want, 100*(got/tc.want-1), tc.gap)
		}
		if model != Pitzer {
			t.Errorf("%s %g mol/kg: automatic model %s, want pitzer", tc.s.name, tc.m, model)
		}
		if math.Abs(got/tc.want-1) > tol {
			t.Errorf("γ±(%s, %g mol/kg, 25 °C, automatic model) = %.4g, want %.4g ± %g %% (%s)", tc.s.name, tc.m, got, tc.want, 100*tol, tc.source)
		}
	}
}

// gypsumInNa2SO4 is the water of a gypsum-in-Na2SO4 solubility experiment:
// x mol/kg of CaSO4 dissolved in Na2SO4 of molality c.
func gypsumInNa2SO4(c float64) func(x float64) water.Analysis {
	return func(x float64) water.Analysis {
		return newWater("gypsum+Na2SO4", 25, map[water.Component]float64{water.Na: 2 * c, water.Ca: x, water.S: x + c})
	}
}

// TestGypsumInNa2SO4: gypsum solubility in sodium sulfate solutions at
// 25 °C under the automatic model. The common ion lowers it from 15.3
// mmol/kg in water to a minimum near 0.1–0.3 mol/kg Na2SO4, beyond which it
// rises again (Block & Waters 1968 J. Chem. Eng. Data 13:336, the shape as
// recalled [FROM MEMORY]). The value recalled for 0.1 mol/kg, 10.7 mmol/kg
// [FROM MEMORY, uncertain], is checked within tolGypsum. No measured table
// could be read here beyond that; TestGypsumHMW84 checks the whole curve to
// 2 mol/kg against the published HMW84 model, whose ψ(Na,Ca,SO4) was fitted
// to this system [FROM MEMORY].
func TestGypsumInNa2SO4(t *testing.T) {
	const src = "Block & Waters 1968 [FROM MEMORY, uncertain]"
	s0 := solubility(t, "gypsum", Options{}, gypsumInNa2SO4(0))
	s01 := solubility(t, "gypsum", Options{}, gypsumInNa2SO4(0.1))
	if math.Abs(s01/0.0107-1) > tolGypsum {
		t.Errorf("gypsum in 0.1 mol/kg Na2SO4, 25 °C = %.4f mol/kg, want 0.0107 ± %g %% (%s)", s01, 100*tolGypsum, src)
	}
	lowest, lowestAt := s0, 0.0
	var prev float64
	for _, c := range []float64{0.05, 0.1, 0.2, 0.3, 0.5, 1, 2} {
		s := solubility(t, "gypsum", Options{}, gypsumInNa2SO4(c))
		if s < lowest {
			lowest, lowestAt = s, c
		}
		prev = s
	}
	if lowestAt < 0.05 || lowestAt > 0.3 || lowest > 0.8*s0 || prev <= lowest {
		t.Errorf("gypsum in Na2SO4: lowest %.4f mol/kg at %g mol/kg, %.4f at 2 mol/kg; want a minimum below 80 %% of the %.4f in water between 0.05 and 0.3 mol/kg and a rise beyond (%s)",
			lowest, lowestAt, prev, s0, src)
	}
}

// tolHMW84 is the relative tolerance of gypsum solubility against the
// independent evaluation of HMW84: the two differ in the J(x)
// approximation (Harvie's series here, Pitzer 1975 there) and in the
// gypsum log K (−4.58 here, HMW84's −4.581 there), about 0.5 % together.
const tolHMW84 = 0.015

// TestGypsumHMW84: gypsum solubility at 25 °C in Na2SO4 to 2 mol/kg and in
// NaCl to 6 mol/kg under the automatic model against the Harvie, Møller &
// Weare (1984) model evaluated by an independent script
// (testdata/reference/hmw84_gypsum.py, written from the equations of
// testdata/reference/thermo.md §6 without the Go code; values in
// testdata/hmw84_gypsum.csv [COMPUTED]). It checks that the one activity
// treatment reproduces the published model in the sulfate-rich and salty
// waters it was fitted to, not the measurements themselves.
func TestGypsumHMW84(t *testing.T) {
	rows := readTestCSV(t, "../testdata/hmw84_gypsum.csv", []string{"medium", "medium_mol_per_kg", "gypsum_mmol_per_kg", "source"})
	if len(rows) < 10 {
		t.Fatalf("hmw84_gypsum.csv: %d rows, want the whole curve", len(rows))
	}
	for _, row := range rows {
		c, err1 := strconv.ParseFloat(row.cells[1], 64)
		want, err2 := strconv.ParseFloat(row.cells[2], 64)
		if err1 != nil || err2 != nil || row.cells[3] == "" {
			t.Fatalf("hmw84_gypsum.csv:%d: malformed row %q", row.line, row.cells)
		}
		build := gypsumInNa2SO4(c)
		switch row.cells[0] {
		case "water", "Na2SO4":
		case "NaCl":
			build = gypsumIn(c)
		default:
			t.Fatalf("hmw84_gypsum.csv:%d: unknown medium %q", row.line, row.cells[0])
		}
		got := 1000 * solubility(t, "gypsum", Options{}, build)
		if math.Abs(got/want-1) > tolHMW84 {
			t.Errorf("gypsum in %g mol/kg %s, 25 °C = %.2f mmol/kg, want %.2f ± %g %% (%s)", c, row.cells[0], got, want, 100*tolHMW84, row.cells[3])
		}
	}
}

// BenchmarkDiluteAutomatic is one speciation of the eight cooling waters
// of BenchmarkSpeciateWarm (I ≈ 0.03 mol/kg) under the automatic model
// (the Pitzer set), reusing one Speciator; BenchmarkDiluteDavies is the
// same under Davies, the automatic choice for such waters before issue 10.
// Their ratio is the cost of the one activity treatment on a dilute water.
func BenchmarkDiluteAutomatic(b *testing.B) { benchDilute(b, Auto) }

// BenchmarkDiluteDavies: see BenchmarkDiluteAutomatic.
func BenchmarkDiluteDavies(b *testing.B) { benchDilute(b, Davies) }

func benchDilute(b *testing.B, model ActivityModel) {
	ws := benchWaters()
	sp := NewSpeciator(nil)
	i := 0
	for b.Loop() {
		if _, err := sp.Speciate(ws[i%len(ws)], Options{Activity: model}); err != nil {
			b.Fatal(err)
		}
		i++
	}
}
