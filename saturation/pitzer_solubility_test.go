package saturation

// Checks of speciation with the Pitzer model set against published
// solubilities and activities: water activity, gypsum, anhydrite, barite
// and halite in NaCl solutions and seawater, agreement with the
// ion-association model in dilute water, the automatic choice, convergence
// on random brines, and the benchmarks.

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"scalerisk/water"
)

// seawater is standard seawater of salinity 35 at 25 °C, pH 8.1, mol/kg of
// water: the reference composition of Millero et al. (2008) Deep-Sea Res. I
// 55:50 [FROM MEMORY], converted from per kg of seawater (÷ 0.96484); Br is
// counted as Cl.
func seawater() water.Analysis {
	a := newWater("seawater S=35", 25, map[water.Component]float64{water.Na: 0.4861, water.Mg: 0.05474,
		water.Ca: 0.01065, water.K: 0.01058, water.Sr: 0.0000940, water.Cl: 0.5667, water.S: 0.02927,
		water.F: 0.0000705, water.B: 0.000425})
	a.PH, a.PHTemperature = 8.1, 25
	a.Alkalinity = 0.00238
	return a
}

// TestPitzerWaterActivity: the water activity of 6 mol/kg NaCl and of
// seawater from the speciation (ln a_w = −φ·M_w·Σm).
func TestPitzerWaterActivity(t *testing.T) {
	brine := newWater("NaCl 6 mol/kg", 25, map[water.Component]float64{water.Na: 6, water.Cl: 6})
	r, err := Speciate(brine, Options{Activity: Pitzer})
	if err != nil {
		t.Fatal(err)
	}
	// φ = 1.2706 (Robinson & Stokes 1959 [FROM MEMORY, testdata/reference/thermo.md §7.2]):
	// a_w = exp(−1.2706·12·0.0180153) = 0.7598.
	if want := math.Exp(-1.2706 * 12 * waterMolarMass); math.Abs(r.WaterActivity-want) > tolAw {
		t.Errorf("a_w(NaCl 6 mol/kg, 25 °C) = %.4f, want %.4f ± %g (Robinson & Stokes 1959 φ)", r.WaterActivity, want, tolAw)
	}
	sw, err := Speciate(seawater(), Options{Activity: Pitzer})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("a_w: NaCl 6 mol/kg %.4f, seawater %.4f", r.WaterActivity, sw.WaterActivity)
	if math.Abs(sw.WaterActivity-0.981) > 0.001 {
		t.Errorf("a_w(seawater S=35, 25 °C) = %.4f, want 0.981 ± 0.001 (osmotic coefficient 0.90, from memory)", sw.WaterActivity)
	}
}

// gypsumIn is the water of a gypsum-in-NaCl solubility experiment: x mol/kg
// of CaSO4 dissolved in NaCl of molality nacl.
func gypsumIn(nacl float64) func(x float64) water.Analysis {
	return func(x float64) water.Analysis {
		return newWater("gypsum+NaCl", 25, map[water.Component]float64{water.Na: nacl, water.Cl: nacl, water.Ca: x, water.S: x})
	}
}

// TestGypsumInNaCl: gypsum solubility in NaCl solutions at 25 °C rises to a
// broad maximum near 2–4 mol/kg NaCl and falls towards halite saturation.
// The values are recalled, not read [FROM MEMORY], and the recollections
// disagree: Marshall & Slusher (1966) J. Phys. Chem. 70:4015 as remembered
// gives 0.0153 mol/kg in water and a maximum of 0.050–0.052 mol/kg; the
// oilfield rule of about 7.5 g/L CaSO4 near 150 g/L NaCl (also from memory)
// gives 0.056–0.058 mol/kg. The second is used (0.057); this check is only
// as good as that memory, and a published table should replace it.
func TestGypsumInNaCl(t *testing.T) {
	opt := Options{} // the automatic model (issue 10)
	const src = "Marshall & Slusher 1966 [FROM MEMORY]"
	s0 := solubility(t, "gypsum", opt, gypsumIn(0))
	if math.Abs(s0/0.0153-1) > tolGypsum {
		t.Errorf("gypsum solubility in water, 25 °C = %.4f mol/kg, want 0.0153 ± %g %% (%s; Lebedev & Kosorukov 2017 [READ] range 0.0147–0.0182 M)", s0, 100*tolGypsum, src)
	}
	best, bestAt := 0.0, 0.0
	var s6 float64
	for _, nacl := range []float64{1, 1.5, 2, 2.5, 3, 3.5, 4, 5, 6} {
		s := solubility(t, "gypsum", opt, gypsumIn(nacl))
		t.Logf("gypsum in %g mol/kg NaCl, 25 °C: %.4f mol/kg (%.2f× water)", nacl, s, s/s0)
		if s > best {
			best, bestAt = s, nacl
		}
		s6 = s
	}
	if math.Abs(best/0.057-1) > tolGypsum || bestAt < 2 || bestAt > 4 {
		t.Errorf("gypsum solubility maximum = %.4f mol/kg at %g mol/kg NaCl, want 0.057 ± %g %% between 2 and 4 mol/kg (%s)", best, bestAt, 100*tolGypsum, src)
	}
	if s6 > 0.9*best {
		t.Errorf("gypsum solubility at 6 mol/kg NaCl = %.4f, want clearly below the maximum %.4f (%s)", s6, best, src)
	}
}

// TestBariteInNaCl: barite solubility rises several-fold with NaCl at
// 25 °C (Templeton 1960 J. Chem. Eng. Data 5:514 and Blount 1977 Am.
// Mineral. 62:942, "isothermal solubilities increase with rising NaCl
// concentration" [READ abstract]). Templeton's numbers are not at hand:
// the fold increase at 1 mol/kg NaCl (about 8×) and the plateau beyond
// 3 mol/kg are from memory, so the bounds are wide.
func TestBariteInNaCl(t *testing.T) {
	opt := Options{Activity: Pitzer}
	build := func(nacl float64) func(x float64) water.Analysis {
		return func(x float64) water.Analysis {
			return newWater("barite+NaCl", 25, map[water.Component]float64{water.Na: nacl, water.Cl: nacl, water.Ba: x, water.S: x})
		}
	}
	s0 := solubility(t, "barite", opt, build(0))
	// √K at 25 °C = 10.4 µmol/L ≈ 2.4 mg/L (Blount 1977 [READ + COMPUTED], testdata/reference/practice.md §3.5).
	if math.Abs(s0/1.04e-5-1) > 0.05 {
		t.Errorf("barite solubility in water, 25 °C = %.3g mol/kg, want 1.04e-5 ± 5 %% (Blount 1977)", s0)
	}
	prev := s0
	for _, nacl := range []float64{0.1, 0.5, 1, 2, 4} {
		s := solubility(t, "barite", opt, build(nacl))
		t.Logf("barite in %g mol/kg NaCl, 25 °C: %.3g mol/kg (%.1f× water)", nacl, s, s/s0)
		if s <= prev {
			t.Errorf("barite solubility at %g mol/kg NaCl = %.3g, not above the previous %.3g (Blount 1977 [READ])", nacl, s, prev)
		}
		if nacl == 1 && (s/s0 < 5 || s/s0 > 12) {
			t.Errorf("barite solubility ratio 1 mol/kg NaCl / water = %.1f, want 5–12 (Templeton 1960 [FROM MEMORY], about 8)", s/s0)
		}
		prev = s
	}
}

// TestBariteSeawater: the stoichiometric mean activity coefficient of
// BaSO4 in seawater (S=35, 22 °C), √(a_Ba·a_SO4/(m_Ba,T·m_SO4,T)), measured
// as 0.108 ("Solubility of BaSO4 and the physicochemical state of barium in
// seawater" [READ abstract], testdata/reference/practice.md §3.5). Monnin & Galinier (1988)
// Chem. Geol. 71:283 [READ abstract] found Pitzer predictions of barite in
// seawater above such measurements (a (Ba,Sr)SO4 solid solution in the
// experiments), and the measured solubility product carries ± 11 %, so the
// tolerance is 15 %.
func TestBariteSeawater(t *testing.T) {
	a := seawater()
	a.Totals[water.Ba], a.Measured[water.Ba] = 2.24e-7, true // 30.7 µg/L
	r, err := Speciate(a, Options{Activity: Pitzer, AtTemperature: true, Temperature: 22})
	if err != nil {
		t.Fatal(err)
	}
	var aBa, aSO4 float64
	for _, s := range r.Species {
		switch s.Name {
		case "Ba[2+]":
			aBa = s.Activity
		case "SO4[2-]":
			aSO4 = s.Activity
		}
	}
	got := math.Sqrt(aBa * aSO4 / (a.Totals[water.Ba] * a.Totals[water.S]))
	t.Logf("γT±(BaSO4, seawater, 22 °C) = %.3f", got)
	if math.Abs(got/0.108-1) > 0.15 {
		t.Errorf("γT±(BaSO4, seawater, 22 °C) = %.3f, want 0.108 ± 15 %% (measured, testdata/reference/practice.md §3.5)", got)
	}
}

// TestGypsumAnhydriteInNaCl: the gypsum–anhydrite transition falls with
// the water activity of NaCl brines: Blount & Dickson (1973) Am. Mineral.
// 58:323 [READ]: 56 ± 3 °C in water, 48 °C at 2 mol/kg NaCl, 36 °C at 4,
// 20 °C at 6 (± 4 °C); Hardie (1967) Am. Mineral. 52:171 [READ abstract]:
// a_w = 0.770 at 23 °C, 0.845 at 39 °C. Gypsum = anhydrite + 2 H2O, so the
// transition depends on a_w and the two log K only: this checks the Pitzer
// water activity (and the log K functions of thermo.csv).
func TestGypsumAnhydriteInNaCl(t *testing.T) {
	crossing := func(nacl float64) float64 {
		diff := func(tc float64) float64 {
			a := newWater("CaSO4+NaCl", tc, map[water.Component]float64{water.Na: nacl, water.Cl: nacl, water.Ca: 0.02, water.S: 0.02})
			r, err := Speciate(a, Options{Activity: Pitzer})
			if err != nil {
				t.Fatal(err)
			}
			g, _ := r.SI("gypsum")
			an, _ := r.SI("anhydrite")
			return an - g
		}
		lo, hi := 0.0, 90.0
		if diff(lo) > 0 || diff(hi) < 0 {
			t.Fatalf("no gypsum–anhydrite crossing in %g mol/kg NaCl between 0 and 90 °C", nacl)
		}
		for i := 0; i < 30; i++ {
			mid := (lo + hi) / 2
			if diff(mid) > 0 {
				hi = mid
			} else {
				lo = mid
			}
		}
		return (lo + hi) / 2
	}
	for _, tc := range []struct{ nacl, want float64 }{{2, 48}, {4, 36}, {6, 20}} {
		got := crossing(tc.nacl)
		t.Logf("gypsum–anhydrite transition in %g mol/kg NaCl: %.1f °C", tc.nacl, got)
		if math.Abs(got-tc.want) > 5 {
			t.Errorf("gypsum–anhydrite transition in %g mol/kg NaCl = %.1f °C, want %g ± 5 °C (Blount & Dickson 1973)", tc.nacl, got, tc.want)
		}
	}
}

// TestPitzerDiluteAgreement: in a fresh cooling water (I ≈ 0.03 mol/kg) the
// two model sets must agree, since both reproduce the same dilute
// solubility data: saturation indices within 0.025 per ion of the ion
// activity product (0.05 for calcite, about the ±0.04 spread of published
// calcite constants, testdata/reference/practice.md §3.4; 0.1 for dolomite's four ions).
func TestPitzerDiluteAgreement(t *testing.T) {
	a := coolingWater()
	ia, err := Speciate(a, Options{Activity: TruesdellJones})
	if err != nil {
		t.Fatal(err)
	}
	pz, err := Speciate(a, Options{Activity: Pitzer})
	if err != nil {
		t.Fatal(err)
	}
	const tolPerIon = 0.025
	for _, tc := range []struct {
		name string
		ions float64
	}{{"calcite", 3}, {"gypsum", 2}, {"barite", 2}, {"celestite", 4}, {"dolomite", 4}} {
		// Celestite: the ion-association set's solubility in pure water
		// sits 9 % below the 0.71 mmol/kg the Pitzer set is fitted to
		// (TestSolubilities), 0.08 in SI; its tolerance is doubled.
		// Calcite: both sets use Plummer & Busenberg's constant; in this
		// cooling water they differ by about 0.02 (the activity
		// coefficients and the pairs), well within 0.075.
		x, _ := ia.SI(tc.name)
		y, _ := pz.SI(tc.name)
		if tol := tolPerIon * tc.ions; math.Abs(x-y) > tol {
			t.Errorf("SI(%s, cooling water): ion association %.3f, Pitzer %.3f; want within %g", tc.name, x, y, tol)
		}
	}
	if len(pz.Minerals) != len(ia.Minerals) {
		t.Errorf("Pitzer result has %d minerals, ion association %d: both sets must report the same minerals", len(pz.Minerals), len(ia.Minerals))
	}
	for _, s := range pz.Species {
		if s.Name == "CaSO4[0]" || s.Name == "NaSO4[-]" || s.Name == "CaHCO3[+]" {
			t.Errorf("Pitzer result holds %s, an ion pair its parameters already count", s.Name)
		}
	}
}

// TestAutoChoosesPitzer: Auto picks Pitzer for a brine and for seawater and
// reports it.
func TestAutoChoosesPitzer(t *testing.T) {
	brine := newWater("produced water", 60, map[water.Component]float64{water.Na: 2.0, water.Ca: 0.15,
		water.Mg: 0.03, water.K: 0.01, water.Sr: 0.002, water.Ba: 1e-4, water.Cl: 2.36, water.S: 1e-4, water.C: 5e-3})
	brine.PH, brine.PHTemperature = 6.5, 25
	r, err := Speciate(brine, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if r.Activity != Pitzer || r.Activity.String() != "pitzer" {
		t.Errorf("brine of I = %.2f mol/kg: model %s, want pitzer", r.IonicStrength, r.Activity)
	}
	joined := strings.Join(r.Warnings, "\n")
	t.Logf("brine at 60 °C (I = %.2f):\n%s", r.IonicStrength, joined)
	if !strings.Contains(joined, "25 °C only") {
		t.Errorf("brine at 60 °C: warnings %q, want one naming Pitzer parameters known at 25 °C only", joined)
	}
	sw, err := Speciate(seawater(), Options{})
	if err != nil {
		t.Fatal(err)
	}
	if sw.Activity != Pitzer {
		t.Errorf("seawater (I = %.2f): model %s, want pitzer", sw.IonicStrength, sw.Activity)
	}
	at25, err := Speciate(brine, Options{AtTemperature: true, Temperature: 25})
	if err != nil {
		t.Fatal(err)
	}
	if strings.Contains(strings.Join(at25.Warnings, "\n"), "25 °C only") {
		t.Errorf("brine at 25 °C: warnings %q name 25 °C-only parameters", at25.Warnings)
	}
}

// randomBrine draws an electroneutral brine of ionic strength about 0.5 to
// 6 mol/kg (NaCl with Ca, Mg, K, sulfate, carbonate and traces), pH 4–10
// at 25 °C.
func randomBrine(rng *rand.Rand) water.Analysis {
	I := 0.5 + 5.5*rng.Float64()
	fCa, fMg := 0.3*rng.Float64(), 0.2*rng.Float64()
	ca := I * fCa / 3
	mg := I * fMg / 3
	na := I * (1 - fCa - fMg) * (0.9 + 0.1*rng.Float64())
	k := 0.02 * na * rng.Float64()
	so4 := math.Min(0.05, 0.1*na) * rng.Float64()
	cl := na + k + 2*(ca+mg) - 2*so4
	totals := map[water.Component]float64{water.Na: na, water.Ca: ca, water.Mg: mg, water.K: k,
		water.S: so4, water.Cl: cl, water.C: math.Pow(10, -4+2*rng.Float64()),
		water.Sr: 1e-3 * rng.Float64(), water.Ba: 1e-5 * rng.Float64()}
	if rng.IntN(2) == 0 {
		totals[water.Si] = 1e-3 * rng.Float64()
		totals[water.F] = 1e-4 * rng.Float64()
		totals[water.Fe] = 1e-4 * rng.Float64()
		totals[water.B] = 1e-3 * rng.Float64()
	}
	a := newWater("random brine", 100*rng.Float64(), totals)
	a.PH, a.PHTemperature = 4+6*rng.Float64(), 25
	return a
}

// TestPitzerRandomBrinesConverge: random brines to 6 mol/kg at 0–100 °C
// converge under Pitzer with mass balances closed to 1e-10 and no NaN, or
// fail with ErrNoConvergence (none do here).
func TestPitzerRandomBrinesConverge(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	set := pitzerSetT(t)
	sp := NewSpeciator(nil)
	n := 300
	if testing.Short() {
		n = 60
	}
	failures := 0
	for i := 0; i < n; i++ {
		a := randomBrine(rng)
		for _, mode := range []CarbonateMode{Closed, ChargeBalance} {
			r, err := sp.Speciate(a, Options{Activity: Pitzer, Carbonate: mode})
			if err != nil {
				if !errors.Is(err, ErrNoConvergence) {
					t.Errorf("brine %d: error without the no-convergence cause: %v", i, err)
				}
				failures++
				continue
			}
			if math.IsNaN(r.PH) || math.IsNaN(r.IonicStrength) || math.IsNaN(r.WaterActivity) {
				t.Fatalf("brine %d: NaN in a converged result", i)
			}
			checkBalance(t, r, set.model)
			for _, mn := range r.Minerals {
				if math.IsNaN(mn.SI) || math.IsInf(mn.SI, 0) {
					t.Errorf("brine %d: SI(%s) = %v", i, mn.Name, mn.SI)
				}
			}
			if mode == ChargeBalance && math.Abs(r.ChargeBalance) > 1e-8 {
				t.Errorf("brine %d: charge balance %.3g %%, want 0", i, r.ChargeBalance)
			}
		}
	}
	if failures > 0 {
		t.Errorf("%d of %d Pitzer speciations did not converge", failures, 2*n)
	}
}

// TestPitzerJacobianFD checks the analytic Jacobian of the Pitzer solver
// (coefficients held at their last refresh, the Debye–Hückel term and the
// water row following the unknowns) against finite differences.
func TestPitzerJacobianFD(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	a := randomBrine(rng)
	set := pitzerSetT(t)
	s := newPitzerSolver(set)
	m := set.model
	totals := make([]float64, len(m.masters))
	for c := range water.NumComponents {
		totals[m.compMaster[c]] = a.Totals[c]
	}
	for _, hrow := range []rowKind{rowAlk, rowCharge} {
		p := problem{t: 40, model: Pitzer, totals: totals, hRow: hrow, cRow: rowMass, alk: 1e-3}
		if err := s.solve(p, false); err != nil {
			t.Fatal(err)
		}
		checkJacobianFD(t, s, fmt.Sprint(hrow))
	}
}

// seawaterBench is seawater concentrated 1.5× (I ≈ 1.1 mol/kg): an RO
// concentrate of seawater, the water the automatic switch sends to Pitzer.
func seawaterBench() water.Analysis {
	a := seawater()
	for c := range a.Totals {
		a.Totals[c] *= 1.5
	}
	a.Alkalinity *= 1.5
	a.Temperature = 30
	return a
}

// BenchmarkSpeciatePitzerSeawater is one Pitzer speciation of a
// seawater-strength water (carbon fixed at 25 °C, evaluated closed at 30 °C,
// all saturation indices) by a fresh Speciator, as BenchmarkSpeciateCold.
func BenchmarkSpeciatePitzerSeawater(b *testing.B) {
	benchSeawater(b, Pitzer, false)
}

// BenchmarkSpeciateIonPairSeawater is the same water under the
// ion-association set (Truesdell–Jones), for comparison.
func BenchmarkSpeciateIonPairSeawater(b *testing.B) {
	benchSeawater(b, TruesdellJones, false)
}

// BenchmarkSpeciatePitzerSeawaterWarm reuses one Speciator.
func BenchmarkSpeciatePitzerSeawaterWarm(b *testing.B) {
	benchSeawater(b, Pitzer, true)
}

// BenchmarkSpeciateIonPairSeawaterWarm reuses one Speciator.
func BenchmarkSpeciateIonPairSeawaterWarm(b *testing.B) {
	benchSeawater(b, TruesdellJones, true)
}

func benchSeawater(b *testing.B, model ActivityModel, warm bool) {
	a := seawaterBench()
	m := DefaultModel()
	if _, err := m.pitzerSet(); err != nil { // built once per model, outside the loop
		b.Fatal(err)
	}
	opt := Options{Model: m, Activity: model}
	sp := NewSpeciator(m)
	i := 0
	for b.Loop() {
		w := a
		w.PH = 7.9 + 0.05*float64(i%4) // a different water each time: no cached carbon fix
		if !warm {
			sp = NewSpeciator(m)
		}
		if _, err := sp.Speciate(w, opt); err != nil {
			b.Fatal(err)
		}
		i++
	}
}

// ExampleSpeciate_brine speciates an invented oilfield produced water
// (I ≈ 2.5 mol/kg): the automatic choice runs the Pitzer model set.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleSpeciate_brine() {
	a := water.Analysis{Name: "produced water", Temperature: 25, PH: 6.8, PHTemperature: 25, Pressure: 1,
		Alkalinity: 2e-3, CarbonateAlkalinity: math.NaN(), FreeCO2: math.NaN(), WaterPerLitre: 0.93, Density: 1.09}
	for c, v := range map[water.Component]float64{water.Na: 1.9, water.Ca: 0.16, water.Mg: 0.035,
		water.K: 0.011, water.Sr: 0.002, water.Ba: 2e-5, water.Cl: 2.3, water.S: 3e-3} {
		a.Totals[c], a.Measured[c] = v, true
	}
	r, err := Speciate(a, Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("I %.2f mol/kg (%s), water activity %.3f\n", r.IonicStrength, r.Activity, r.WaterActivity)
	for _, name := range []string{"calcite", "gypsum", "barite", "celestite"} {
		si, _ := r.SI(name)
		fmt.Printf("%s SI %+.2f\n", name, si)
	}
	// Output:
	// I 2.51 mol/kg (pitzer), water activity 0.922
	// calcite SI +0.61
	// gypsum SI -0.83
	// barite SI +0.44
	// celestite SI -0.76
}

// TestHaliteSaturation: with the Pitzer model, NaCl solutions reach halite
// saturation near 6.15 mol/kg at 25 °C (CRC Handbook solubility of NaCl,
// 36.0 g per 100 g water, from memory); tolerance 0.2 mol/kg.
func TestHaliteSaturation(t *testing.T) {
	build := func(x float64) water.Analysis {
		return newWater("brine", 25, map[water.Component]float64{water.Na: x, water.Cl: x})
	}
	lo, hi := 4.0, 8.0
	si := func(x float64) float64 {
		r, err := Speciate(build(x), Options{Activity: Pitzer})
		if err != nil {
			t.Fatal(err)
		}
		v, ok := r.SI("halite")
		if !ok {
			t.Fatal("no halite SI")
		}
		return v
	}
	for i := 0; i < 40; i++ {
		mid := (lo + hi) / 2
		if si(mid) > 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	if math.Abs(lo-6.15) > 0.2 {
		t.Errorf("halite saturation at %.3f mol/kg NaCl, want 6.15 ± 0.2 (CRC Handbook, from memory)", lo)
	}
}
