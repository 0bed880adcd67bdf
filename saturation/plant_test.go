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
