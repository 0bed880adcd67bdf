package saturation

import (
	"math"
	"strings"
	"testing"

	"scalerisk/water"
)

// plantWaters reads invented plant waters from CSV text (wide form, the
// units in the headers) and returns them by name.
func plantWaters(t *testing.T, text string) map[string]water.Analysis {
	t.Helper()
	recs, probs, err := water.Read("plant.csv", strings.NewReader(text), water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range probs {
		t.Fatal(p)
	}
	out := map[string]water.Analysis{}
	for _, r := range recs {
		if r.Err != nil {
			t.Fatal(r.Err)
		}
		out[r.Name] = r.Analysis
	}
	return out
}

// TestLimitForms: a limit on a form as CaCO3 and a product rule read the
// water's concentrations. Mg as CaCO3 = Mg × 100.09/24.305 = Mg × 4.118
// (Standard Methods 2340 B, the hardness factor 4.118); the product rule
// multiplies the two (common practice, practice-2.md). Invented Kestrel Fen
// tower water: Mg 30 mg/L, SiO2 150 mg/L → 123.5 and 18 530.
func TestLimitForms(t *testing.T) {
	const tol = 0.002 // relative: the hardness factor is printed to 4 figures
	ws := plantWaters(t, "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n"+
		"Kestrel Fen tower 3,30,8.1,120,30,90,140,150,200,150\n")
	r, err := Speciate(ws["Kestrel Fen tower 3"], Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		quantity string
		want     float64
		source   string
	}{
		{"mg_per_l:Mg_as_CaCO3", 30 * 4.118, "Standard Methods 2340 B factor 4.118"},
		{"mg_per_l:Ca_as_CaCO3", 120 * 2.497, "Standard Methods 2340 B factor 2.497"},
		{"mg_per_l:SiO2", 150, "the analysis itself"},
		{"product:Mg_as_CaCO3*SiO2", 30 * 4.118 * 150, "common practice magnesium-silicate product"},
	} {
		if _, _, err := parseQuantity(c.quantity, DefaultModel()); err != nil {
			t.Fatalf("%s: %v", c.quantity, err)
		}
		v, ok := Limit{Quantity: c.quantity}.Value(r, Indices{})
		if !ok || math.Abs(v/c.want-1) > tol {
			t.Errorf("%s = %.5g (ok %v), want %.5g ± %.1f %% (%s)", c.quantity, v, ok, c.want, tol*100, c.source)
		}
	}
	for _, bad := range []string{"product:SiO2", "mg_per_l:SiO2_as_CaCO3", "product:Mg*Xx", "product:a*b*c*d"} {
		if _, _, err := parseQuantity(bad, DefaultModel()); err == nil {
			t.Errorf("%s: accepted, want an error", bad)
		}
	}
}

// TestMagnesiumSilicateRule: the built-in profiles carry the trade's
// magnesium-silicate rule (Mg as CaCO3 × SiO2 below about 35 000, common
// practice) and sepiolite is judged by it, not by its own SI: an invented
// Kestrel Fen tower water supersaturated with sepiolite but at a product of
// 18 530 is not limited by magnesium silicate, and sepiolite is not a
// scale former in the bands (slow to form).
func TestMagnesiumSilicateRule(t *testing.T) {
	ws := plantWaters(t, "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n"+
		"Kestrel Fen tower 3,30,8.6,40,30,90,140,150,120,150\n")
	r, err := Speciate(ws["Kestrel Fen tower 3"], Options{})
	if err != nil {
		t.Fatal(err)
	}
	si, _ := r.SI("sepiolite")
	if !(si > 0) {
		t.Fatalf("SI(sepiolite) = %.2f: the case needs a supersaturated water", si)
	}
	if b := RiskBand("sepiolite", si); b != SlowToForm {
		t.Errorf("sepiolite SI %+.2f is %q, want %q (judged on the product rule)", si, b, SlowToForm)
	}
	for _, name := range []string{"no-inhibitor", "inhibitor"} {
		p, err := LimitProfileNamed(name)
		if err != nil {
			t.Fatal(err)
		}
		l, ok := p.Lookup("product:Mg_as_CaCO3*SiO2")
		if !ok || l.Max != 35000 || !strings.Contains(l.Source, "common practice") {
			t.Fatalf("profile %s: magnesium-silicate rule %+v, want 35 000 marked common practice", name, l)
		}
		if v, _ := l.Value(r, Indices{}); v > l.Max {
			t.Errorf("profile %s: product %.0f above %g in a water built below it", name, v, l.Max)
		}
	}
}

// kestrelWell is an invented 14 °C well makeup of the Kestrel Fen plant.
const kestrelWell = "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n" +
	"Kestrel Fen well 4,14,7.6,78,19,28,36,52,196,16\n"

// TestCyclesSkinGoverns: calcite is less soluble hot (Plummer & Busenberg
// 1982: log Ksp falls with temperature), so a 14 °C well makeup allows
// fewer cycles when its tower water is also judged at a 60 °C tube wall
// (the water heated closed). The skin answer is the decision and is
// reported as governing; the bulk answer is kept beside it.
func TestCyclesSkinGoverns(t *testing.T) {
	w := plantWaters(t, kestrelWell)["Kestrel Fen well 4"]
	profile, _ := LimitProfileNamed("inhibitor")
	rule, _ := ParseCarbonateRule("natural")
	bulk, err := MaxCycles(w, profile, rule, 10, 0.5, Options{})
	if err != nil {
		t.Fatal(err)
	}
	hot, err := MaxCycles(w, profile, rule, 10, 0.5, Options{Skin: 60})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("bulk %.2f (%s), with a 60 °C skin %.2f (%s), judged %+v", bulk.MaxCycles, bulk.Limiting, hot.MaxCycles, hot.Limiting, hot.Judged)
	if !(hot.MaxCycles < bulk.MaxCycles-0.1) {
		t.Errorf("cycles with a 60 °C skin %.2f, want below the bulk answer %.2f", hot.MaxCycles, bulk.MaxCycles)
	}
	if !hot.Judged.SkinGoverns() || hot.Judged.Governing != 60 || hot.Judged.Bulk != 14 {
		t.Errorf("judged %+v: want the 60 °C skin governing over the 14 °C bulk", hot.Judged)
	}
	if math.Abs(hot.Judged.AtBulk-bulk.MaxCycles) > 1e-9 || math.Abs(hot.Judged.AtSkin-hot.MaxCycles) > 1e-9 {
		t.Errorf("judged %+v: the answers at each temperature should be %.4f (bulk) and %.4f (skin)", hot.Judged, bulk.MaxCycles, hot.MaxCycles)
	}
	if bulk.Judged.SkinGoverns() || !math.IsNaN(bulk.Judged.Skin) {
		t.Errorf("without a skin the bulk governs: %+v", bulk.Judged)
	}
	// A skin no hotter than the water is no second judgement.
	cold, err := MaxCycles(w, profile, rule, 10, 0.5, Options{Skin: 10})
	if err != nil {
		t.Fatal(err)
	}
	if cold.MaxCycles != bulk.MaxCycles || cold.Judged.SkinGoverns() {
		t.Errorf("a 10 °C skin under 14 °C water changed the answer: %.3f, %+v", cold.MaxCycles, cold.Judged)
	}
}

// kestrelTower is an invented 30 °C recirculating water of the Kestrel
// Fen plant (tower 2), about five cycles of well 4.
const kestrelTower = "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n" +
	"Kestrel Fen tower 2,30,8.4,300,95,140,180,260,420,78\n"

// TestDoseSkinGoverns: sulfuric acid to a Langelier index of 0.5 needs
// more acid when the index is also judged at a 60 °C tube wall (the
// saturation pH falls with temperature: Standard Methods 2330's pHs,
// common practice), so the skin governs and both doses are reported; a pH
// target is a bulk set point and is judged at the bulk only.
func TestDoseSkinGoverns(t *testing.T) {
	w := plantWaters(t, kestrelTower)["Kestrel Fen tower 2"]
	acid := mustReagent(t, "h2so4")
	lsi, _ := ParseTarget("lsi=0.5", nil)
	bulk, err := DoseToTarget(w, acid, 0, lsi, Options{})
	if err != nil {
		t.Fatal(err)
	}
	hot, err := DoseToTarget(w, acid, 0, lsi, Options{Skin: 60})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("bulk %.1f mg/L, with a 60 °C skin %.1f mg/L, judged %+v", bulk.Dose, hot.Dose, hot.Judged)
	if !bulk.Reached || !hot.Reached || !(hot.Dose > bulk.Dose+1) {
		t.Fatalf("doses %.2f (bulk) and %.2f (skin): want both reached and the skin's larger", bulk.Dose, hot.Dose)
	}
	if !hot.Judged.SkinGoverns() || math.Abs(hot.Judged.AtBulk-bulk.Dose) > 1e-6 || hot.SkinAfter == nil {
		t.Errorf("judged %+v: want the skin governing, the bulk dose %.3f beside it, and the skin state", hot.Judged, bulk.Dose)
	}
	if got := hot.SkinAfter.Indices.LSI; math.Abs(got-0.5) > 1e-3 {
		t.Errorf("LSI at the skin after the dose = %.4f, want 0.5", got)
	}
	ph, _ := ParseTarget("ph=7.5", nil)
	p, err := DoseToTarget(w, acid, 0, ph, Options{Skin: 60})
	if err != nil {
		t.Fatal(err)
	}
	if p.Judged.SkinGoverns() || !math.IsNaN(p.Judged.Skin) {
		t.Errorf("a pH target judged %+v: want the bulk only", p.Judged)
	}
}

// TestFitNote: the calcium phosphates are fitted to 5–37 °C (Gregory et al.
// 1974; McDowell et al. 1977, data/thermo.csv), so a 60 °C finding headed
// by tricalcium phosphate says so; calcite (Plummer & Busenberg 1982,
// 0–90 °C) needs no note at 60 °C.
func TestFitNote(t *testing.T) {
	if n := FitNote(nil, "si:tricalcium_phosphate", 60); !strings.Contains(n, "fitted to 5–37 °C") {
		t.Errorf("tricalcium phosphate at 60 °C: %q, want the fitted range", n)
	}
	if n := FitNote(nil, "calcite", 60); n != "" {
		t.Errorf("calcite at 60 °C: %q, want none", n)
	}
	if n := FitNote(nil, "product:Mg_as_CaCO3*SiO2", 60); n != "" {
		t.Errorf("a product rule: %q, want none", n)
	}
}
