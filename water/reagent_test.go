package water

import (
	"fmt"
	"math"
	"strings"
	"testing"
)

// rgMust returns the named reagent or stops the test.
func rgMust(t *testing.T, name string) Reagent {
	t.Helper()
	r, err := LookupReagent(name)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// TestReagentTable15_3 checks the alkalinity factor of each pure reagent,
// mg/L as CaCO3 per mg/L, against "Power Plant Engineering" Table 15-3 (READ,
// as quoted in testdata/reference/practice.md §6). CO2 is listed there as acidity: one
// equivalent per mol (CO2 + OH- → HCO3-), which the table carries as
// carbon_per_mol.
func TestReagentTable15_3(t *testing.T) {
	const src = `"Power Plant Engineering" Table 15-3 (READ, testdata/reference/practice.md §6)`
	const tol = 0.01
	tests := []struct {
		name string
		want float64
	}{
		{"h2so4", 1.02}, {"hcl", 1.37}, {"naoh", 1.25}, {"na2co3", 0.94}, {"caoh2", 1.35},
	}
	for _, tt := range tests {
		r := rgMust(t, tt.name)
		if got := math.Abs(r.AlkalinityFactor(100)); math.Abs(got-tt.want) > tol {
			t.Errorf("|alkalinity factor|(%s, 100 %%) = %.4f, want %.2f ± %g (%s)", tt.name, got, tt.want, tol, src)
		}
	}
	co2 := rgMust(t, "co2")
	if got := co2.CarbonPerMol * EquivalentMassCaCO3 * 1000 * co2.MolPerMg(100); math.Abs(got-1.14) > tol {
		t.Errorf("acidity factor(co2) = %.4f, want 1.14 ± %g (%s)", got, tol, src)
	}
	if co2.AlkalinityFactor(100) != 0 {
		t.Errorf("alkalinity factor(co2) = %g, want 0 (CO2 changes acidity, not alkalinity)", co2.AlkalinityFactor(100))
	}
}

// TestReagentProductFactors checks the per-product factors of testdata/reference/practice.md
// §6: change in alkalinity (mg/L as CaCO3) and ion added (mg/L) per mg/L of
// product. Those factors are COMPUTED there from molar masses and
// cross-checked with Table 15-3: regression targets, not published answers.
func TestReagentProductFactors(t *testing.T) {
	const src = "testdata/reference/practice.md §6 (COMPUTED from molar masses)"
	const tol = 0.01
	tests := []struct {
		name     string
		strength float64
		alk      float64
		ion      Component
		ionMg    float64
	}{
		{"h2so4", 93, -0.949, S, 0.911},
		{"h2so4", 98, -1.000, S, 0.960},
		{"h2so4", 100, -1.0205, S, 0.9794},
		{"hcl", 31.45, -0.432, Cl, 0.306},
		{"hcl", 37, -0.508, Cl, 0.360},
		{"hcl", 100, -1.3725, Cl, 0.9724},
		{"naoh", 50, 0.626, Na, 0.287},
		{"naoh", 100, 1.2512, Na, 0.5748},
		{"caoh2", 100, 1.3508, Ca, 0.5409},
		{"na2co3", 100, 0.9443, Na, 0.4338},
		{"nahco3", 100, 0.5957, Na, 0.2737},
	}
	for _, tt := range tests {
		r := rgMust(t, tt.name)
		if got := r.AlkalinityFactor(tt.strength); math.Abs(got-tt.alk) > tol {
			t.Errorf("alkalinity factor(%s, %g %%) = %.4f mg/L as CaCO3 per mg/L, want %.4f ± %g (%s)", tt.name, tt.strength, got, tt.alk, tol, src)
		}
		if got := r.IonFactor(tt.ion, tt.strength); math.Abs(got-tt.ionMg) > tol {
			t.Errorf("%s factor(%s, %g %%) = %.4f mg/L per mg/L, want %.4f ± %g (%s)", tt.ion, tt.name, tt.strength, got, tt.ionMg, tol, src)
		}
	}
	// Inorganic carbon added, µmol/L per mg/L of pure reagent.
	carbon := []struct {
		name string
		want float64
	}{
		{"na2co3", 9.435}, {"nahco3", 11.90}, {"co2", 22.72},
	}
	for _, tt := range carbon {
		r := rgMust(t, tt.name)
		if got := 1e6 * r.CarbonPerMol * r.MolPerMg(100); math.Abs(got-tt.want) > 0.01 {
			t.Errorf("C_T added(%s) = %.4f µmol/L per mg/L, want %.4g ± 0.01 (%s)", tt.name, got, tt.want, src)
		}
	}
}

// TestReagentMolarMasses recomputes each molar mass from the IUPAC 2021
// abridged standard atomic weights (Prohaska et al. 2022, Table 2).
func TestReagentMolarMasses(t *testing.T) {
	const (
		h, c, o, na, p, s, cl, ca = 1.008, 12.011, 15.999, 22.990, 30.974, 32.06, 35.45, 40.078
	)
	want := map[string]float64{
		"h2so4": 2*h + s + 4*o, "hcl": h + cl, "naoh": na + o + h, "caoh2": ca + 2*(o+h),
		"na2co3": 2*na + c + 3*o, "nahco3": na + h + c + 3*o, "co2": c + 2*o,
		"h3po4": 3*h + p + 4*o, "cacl2": ca + 2*cl,
	}
	for _, r := range Reagents() {
		w, ok := want[r.Name]
		if !ok {
			t.Errorf("reagent %s has no check value", r.Name)
			continue
		}
		if math.Abs(r.MolarMass-w) > 0.001 {
			t.Errorf("M(%s) = %g g/mol, want %.3f ± 0.001 (IUPAC 2021 abridged atomic weights)", r.Formula, r.MolarMass, w)
		}
	}
}

// TestReagentElectroneutrality checks each row's alkalinity change against
// its added components: the change in total alkalinity equals the charge
// the reagent's conservative ions bring, counting each component at its
// charge at the alkalinity zero level (the ion-balance charge, and −1 for
// phosphate whose zero level is H2PO4-). This is the definition of total
// alkalinity as the excess of conservative cations over conservative anions
// (Stumm & Morgan, Aquatic Chemistry, 3rd ed., ch. 4, from memory).
func TestReagentElectroneutrality(t *testing.T) {
	for _, r := range Reagents() {
		want := 0.0
		for c, n := range r.Adds {
			z := c.Charge()
			if c == P {
				z = -1
			}
			want += n * z
		}
		if r.AlkalinityPerMol != want {
			t.Errorf("Δalkalinity(%s) = %g eq/mol, want %g from its ions (electroneutrality)", r.Name, r.AlkalinityPerMol, want)
		}
	}
}

// TestReagentTable checks the table's order, the usual strengths of the
// design, the cautions of acids and caustic, and that the results are
// copies.
func TestReagentTable(t *testing.T) {
	var names []string
	for _, r := range Reagents() {
		names = append(names, r.Name)
		if r.Strength < r.StrengthMin || r.Strength > r.StrengthMax || r.Source == "" || r.Label == "" {
			t.Errorf("%s: strength %g outside %g–%g, or no source or label", r.Name, r.Strength, r.StrengthMin, r.StrengthMax)
		}
		if r.AlkalinityPerMol < 0 || r.Name == "naoh" || r.Name == "caoh2" {
			if !strings.Contains(r.Caution, "burn") {
				t.Errorf("%s: caution %q, want a burn warning for an acid or caustic", r.Name, r.Caution)
			}
		}
	}
	if got, want := strings.Join(names, ","), "h2so4,hcl,naoh,caoh2,na2co3,nahco3,co2,h3po4,cacl2"; got != want {
		t.Errorf("Reagents() = %s, want %s (design: reagents named by formula)", got, want)
	}
	usual := map[string]float64{"h2so4": 93, "hcl": 33, "naoh": 50, "na2co3": 100, "nahco3": 100, "co2": 100, "h3po4": 75}
	for name, want := range usual {
		if got := rgMust(t, name).Strength; got != want {
			t.Errorf("usual strength(%s) = %g %%, want %g %% (common practice)", name, got, want)
		}
	}
	for _, name := range []string{"H2SO4", " hcl ", "NaOH"} {
		if _, err := LookupReagent(name); err != nil {
			t.Errorf("LookupReagent(%q): %v", name, err)
		}
	}
	_, err := LookupReagent("oleum")
	if err == nil || !strings.Contains(err.Error(), "h2so4") || !strings.Contains(err.Error(), "cacl2") {
		t.Errorf("LookupReagent(oleum) error %v, want one listing the known names", err)
	}
	r := rgMust(t, "na2co3")
	r.Adds[Na] = 99
	if got := rgMust(t, "na2co3").Adds[Na]; got != 2 {
		t.Errorf("changing a looked-up reagent's Adds changed the table: Na = %g, want 2", got)
	}
}

// ExampleReagent_AlkalinityFactor prints results for an invented water.
//
// The numbers can be checked by hand (0.93 × 2 × 50.04/98.08 = 0.949; 0.93 × 96.06/98.08 = 0.911); they are still a regression pin of
// the program's output.
func ExampleReagent_AlkalinityFactor() {
	r, err := LookupReagent("h2so4")
	if err != nil {
		panic(err)
	}
	fmt.Printf("%s %g %%: %.3f mg/L alkalinity as CaCO3 and %+.3f mg/L SO4 per mg/L\n",
		r.Label, r.Strength, r.AlkalinityFactor(0), r.IonFactor(S, 0))
	// Output:
	// sulfuric acid 93 %: -0.949 mg/L alkalinity as CaCO3 and +0.911 mg/L SO4 per mg/L
}

// TestLookupReagentByName: a plant writes reagents by name as often as by
// formula; each spelling must find the same row (names: common usage of the
// trade).
func TestLookupReagentByName(t *testing.T) {
	cases := []struct{ in, want string }{
		{"sulfuric", "h2so4"}, {"Sulphuric acid", "h2so4"}, {"H2SO4", "h2so4"},
		{"hydrochloric", "hcl"}, {"muriatic acid", "hcl"},
		{"caustic", "naoh"}, {"Caustic Soda", "naoh"}, {"caustic-soda", "naoh"},
		{"lime", "caoh2"}, {"hydrated lime", "caoh2"}, {"Ca(OH)2", "caoh2"},
		{"soda ash", "na2co3"}, {"bicarbonate", "nahco3"},
		{"CO2", "co2"}, {"carbon dioxide", "co2"},
		{"phosphoric", "h3po4"}, {"calcium chloride", "cacl2"},
	}
	for _, c := range cases {
		r, err := LookupReagent(c.in)
		if err != nil {
			t.Errorf("LookupReagent(%q): %v", c.in, err)
			continue
		}
		if r.Name != c.want {
			t.Errorf("LookupReagent(%q) = %s, want %s", c.in, r.Name, c.want)
		}
	}
	if _, err := LookupReagent("vinegar"); err == nil || !strings.Contains(err.Error(), "sulfuric acid") {
		t.Errorf("LookupReagent(vinegar) error %v, want the known reagents listed in words", err)
	}
}

func TestCheckStrength(t *testing.T) {
	r, err := LookupReagent("h2so4")
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []float64{0, -5, 100.5, math.NaN()} {
		if err := r.CheckStrength(s); err == nil {
			t.Errorf("CheckStrength(%g) accepted", s)
		}
	}
	for _, s := range []float64{1, 50, 93, 100} {
		if err := r.CheckStrength(s); err != nil {
			t.Errorf("CheckStrength(%g): %v", s, err)
		}
	}
}
