package saturation

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"regexp"
	"strings"
	"testing"

	"scalerisk/water"
)

// Tolerances of the Pitzer checks, named as the handbook tables are.
const (
	tolGammaTable = 0.02  // relative, γ± against Robinson & Stokes / Hamer & Wu (issue 4)
	tolPhiNaCl    = 0.005 // absolute, φ of NaCl and KCl against Robinson & Stokes
	tolComputed   = 0.009 // relative, against testdata/reference/thermo.md §7.3 [COMPUTED] values (A_φ 0.3915 there, 0.392 here: up to 0.8 % for 2-2 salts)
	tolGypsum     = 0.05  // relative, gypsum solubility in NaCl (issue 4)
	tolAw         = 0.002 // absolute, water activity
)

// pitzerActivity evaluates the Pitzer equations at t °C for the given
// molalities (mol/kg, Pitzer species only) without speciation: ln γ of each
// species given and the osmotic coefficient, for the checks against tables
// of single salts and mixtures.
func (set *pitzerSet) pitzerActivity(t float64, mol map[string]float64) (map[string]float64, float64, error) {
	ps := newPitzerState(set)
	ps.setTemperature(t)
	var I2, Z, S float64
	for name, v := range mol {
		i, ok := set.model.speciesIdx[name]
		if !ok || set.posOf[i] < 0 {
			return nil, 0, fmt.Errorf("%s is not a species of the Pitzer model set", name)
		}
		p := set.posOf[i]
		ps.m[p] = v
		z := set.z[p]
		I2 += z * z * v
		Z += math.Abs(z) * v
		S += v
	}
	phi := ps.gammas(I2/2, Z, S)
	out := map[string]float64{}
	for name := range mol {
		out[name] = ps.lng[set.posOf[set.model.speciesIdx[name]]]
	}
	return out, phi, nil
}

func pitzerSetT(t *testing.T) *pitzerSet {
	t.Helper()
	set, err := DefaultModel().pitzerSet()
	if err != nil {
		t.Fatal(err)
	}
	return set
}

// salt is a single electrolyte of the check tables.
type salt struct {
	name          string
	cation, anion string
	nuC, nuA      float64
}

var (
	saltNaCl   = salt{"NaCl", "Na[+]", "Cl[-]", 1, 1}
	saltKCl    = salt{"KCl", "K[+]", "Cl[-]", 1, 1}
	saltCaCl2  = salt{"CaCl2", "Ca[2+]", "Cl[-]", 1, 2}
	saltMgCl2  = salt{"MgCl2", "Mg[2+]", "Cl[-]", 1, 2}
	saltBaCl2  = salt{"BaCl2", "Ba[2+]", "Cl[-]", 1, 2}
	saltNa2SO4 = salt{"Na2SO4", "Na[+]", "SO4[2-]", 2, 1}
	saltMgSO4  = salt{"MgSO4", "Mg[2+]", "SO4[2-]", 1, 1}
	saltK2SO4  = salt{"K2SO4", "K[+]", "SO4[2-]", 2, 1}
)

// meanActivity returns γ± and φ of salt s at molality m and 25 °C from the
// Pitzer equations alone (no speciation: the salt fully dissociated, as
// the tables define γ±).
func meanActivity(t *testing.T, set *pitzerSet, s salt, m float64) (gpm, phi float64) {
	t.Helper()
	lng, phi, err := set.pitzerActivity(25, map[string]float64{s.cation: s.nuC * m, s.anion: s.nuA * m})
	if err != nil {
		t.Fatal(err)
	}
	return math.Exp((s.nuC*lng[s.cation] + s.nuA*lng[s.anion]) / (s.nuC + s.nuA)), phi
}

// meanActivityRow is one tabulated γ± of a single salt at 25 °C, the
// tolerance the Pitzer equations meet against it, and, where the automatic
// model cannot meet tolAuto, why (a gap listed in DEVELOPERS.md).
type meanActivityRow struct {
	s       salt
	m, want float64
	tol     float64
	source  string
	gap     string
}

// Sources of the γ± tables (values as gathered in
// testdata/reference/thermo.md §7.1).
const (
	rs   = "Robinson & Stokes 1959 App. 8.10 [FROM MEMORY, testdata/reference/thermo.md §7.1]"
	crc  = "CRC Handbook (Hamer & Wu 1972; Goldberg) [READ, testdata/reference/thermo.md §7.1]"
	rsMg = "Robinson & Stokes 1959 App. 8.10 [FROM MEMORY]"
)

// meanActivityTable holds the γ± checks of TestPitzerMeanActivity and
// TestMeanActivityAutomatic.
var meanActivityTable = []meanActivityRow{
	{saltNaCl, 0.1, 0.778, tolGammaTable, rs, ""},
	{saltNaCl, 0.5, 0.681, tolGammaTable, rs, ""},
	{saltNaCl, 1, 0.657, tolGammaTable, rs, ""},
	{saltNaCl, 2, 0.668, tolGammaTable, rs, ""},
	{saltNaCl, 3, 0.714, tolGammaTable, rs, ""},
	{saltNaCl, 4, 0.783, tolGammaTable, rs, ""},
	{saltNaCl, 5, 0.874, tolGammaTable, rs, ""},
	{saltNaCl, 6, 0.986, tolGammaTable, rs, ""},
	{saltKCl, 0.1, 0.770, tolGammaTable, rs, ""},
	{saltKCl, 0.5, 0.649, tolGammaTable, rs, ""},
	{saltKCl, 1, 0.604, tolGammaTable, rs, ""},
	{saltKCl, 2, 0.573, tolGammaTable, rs, ""},
	{saltKCl, 3, 0.569, tolGammaTable, rs, ""},
	{saltKCl, 4, 0.577, tolGammaTable, rs, ""}, // saturation about 4.8 mol/kg
	{saltCaCl2, 0.1, 0.518, tolGammaTable, rs, ""},
	{saltCaCl2, 0.5, 0.448, tolGammaTable, rs, ""},
	{saltCaCl2, 1, 0.500, tolGammaTable, rs, ""},
	{saltCaCl2, 2, 0.792, tolGammaTable, rs, ""},
	{saltCaCl2, 3, 1.483, tolGammaTable, rs, ""},
	{saltCaCl2, 0.1, 0.517, tolGammaTable, crc, ""},
	{saltCaCl2, 0.5, 0.444, tolGammaTable, crc, ""},
	{saltCaCl2, 1, 0.495, tolGammaTable, crc, ""},
	// The two tables differ by 1 % at 2 mol/kg (0.784 and 0.792).
	{saltCaCl2, 2, 0.784, 0.025, crc, ""},
	// Beyond 3 mol/kg CaCl2 the PM73 = HMW84 parameters (fitted to about
	// 2.5 mol/kg) run high: 3 % at 4–5 mol/kg, 7 % at 6. A known limit,
	// stated in DEVELOPERS.md; checked here with that tolerance.
	{saltCaCl2, 4, 2.934, 0.04, rs, ""},
	{saltCaCl2, 5, 5.907, 0.04, crc, ""},
	{saltCaCl2, 6, 11.11, 0.08, rs, "HMW84 = PM73 CaCl2 parameters are fitted to about 2.5 mol/kg: 3 % low at 4–5 mol/kg, 7 % high at 6"},
	{saltMgCl2, 0.1, 0.529, tolGammaTable, rsMg, ""},
	{saltMgCl2, 0.5, 0.481, tolGammaTable, rsMg, ""},
	{saltMgCl2, 1, 0.570, tolGammaTable, rsMg, ""},
	{saltMgCl2, 2, 1.053, tolGammaTable, rsMg, ""},
	{saltMgCl2, 3, 2.32, tolGammaTable, rsMg, ""},
	{saltMgCl2, 4, 5.53, tolGammaTable, rsMg, ""},
	{saltMgCl2, 5, 13.92, tolGammaTable, rsMg, ""}, // saturation about 5.8 mol/kg
	{saltBaCl2, 0.1, 0.500, tolGammaTable, rsMg, ""},
	{saltBaCl2, 0.5, 0.397, tolGammaTable, rsMg, ""},
	{saltBaCl2, 1, 0.395, tolGammaTable, rsMg, ""},
	// CRC BaCl2 lies 1.5 % below R&S; PM73 follows R&S.
	{saltBaCl2, 0.1, 0.492, 0.03, crc, ""},
	{saltBaCl2, 0.5, 0.391, 0.03, crc, ""},
	{saltBaCl2, 1, 0.393, 0.03, crc, ""},
	// Na2SO4: the recalled R&S values are uncertain and lie about 2 %
	// below every Pitzer fit (testdata/reference/thermo.md §7.1); 3 % is the honest
	// tolerance against them.
	{saltNa2SO4, 0.1, 0.445, 0.03, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", ""},
	{saltNa2SO4, 0.5, 0.266, 0.03, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", ""},
	{saltNa2SO4, 1, 0.201, 0.03, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", ""},
	{saltNa2SO4, 2, 0.152, 0.03, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", ""},
	{saltNa2SO4, 3, 0.139, 0.03, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", ""},
	// MgSO4: R&S (recalled) lies 9–13 % below the HMW84 = Pitzer &
	// Mayorga 1974 curve at 0.1–2 mol/kg, a different low-concentration
	// anchor for 2-2 salts (testdata/reference/thermo.md §7.1 advises not to use it as a
	// tight test); the code is checked tightly against the [COMPUTED]
	// values in TestPitzerComputedValues.
	{saltMgSO4, 0.1, 0.150, 0.13, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", "the recalled R&S MgSO4 values lie 9–13 % below the HMW84 = Pitzer & Mayorga 1974 curve (a different low-concentration anchor for 2-2 salts, thermo.md §7.1); uncertain reference, not a 3 % check"},
	{saltMgSO4, 0.5, 0.0675, 0.13, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", "the recalled R&S MgSO4 values lie 9–13 % below the HMW84 = Pitzer & Mayorga 1974 curve (a different low-concentration anchor for 2-2 salts, thermo.md §7.1); uncertain reference, not a 3 % check"},
	{saltMgSO4, 1, 0.0485, 0.13, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", "the recalled R&S MgSO4 values lie 9–13 % below the HMW84 = Pitzer & Mayorga 1974 curve (a different low-concentration anchor for 2-2 salts, thermo.md §7.1); uncertain reference, not a 3 % check"},
	{saltMgSO4, 2, 0.0424, 0.13, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", "the recalled R&S MgSO4 values lie 9–13 % below the HMW84 = Pitzer & Mayorga 1974 curve (a different low-concentration anchor for 2-2 salts, thermo.md §7.1); uncertain reference, not a 3 % check"},
	{saltMgSO4, 3, 0.0532, 0.03, "Robinson & Stokes 1959 [FROM MEMORY, uncertain; testdata/reference/thermo.md §7.1]", ""},
}

// TestPitzerMeanActivity compares γ± of single salts at 25 °C with the
// standard tables (values as gathered in testdata/reference/thermo.md §7.1).
func TestPitzerMeanActivity(t *testing.T) {
	set := pitzerSetT(t)
	for _, tc := range meanActivityTable {
		got, _ := meanActivity(t, set, tc.s, tc.m)
		if math.Abs(got/tc.want-1) > tc.tol {
			t.Errorf("γ±(%s, %g mol/kg, 25 °C) = %.4g, want %.4g ± %g %% (%s)", tc.s.name, tc.m, got, tc.want, 100*tc.tol, tc.source)
		}
	}
}

// TestPitzerOsmotic compares the osmotic coefficients of NaCl and KCl at
// 25 °C with Robinson & Stokes (1959) [FROM MEMORY, testdata/reference/thermo.md §7.2].
func TestPitzerOsmotic(t *testing.T) {
	set := pitzerSetT(t)
	const src = "Robinson & Stokes 1959 [FROM MEMORY, testdata/reference/thermo.md §7.2]"
	tests := []struct {
		s       salt
		m, want float64
	}{
		{saltNaCl, 0.1, 0.9324}, {saltNaCl, 0.2, 0.9245}, {saltNaCl, 0.5, 0.9209}, {saltNaCl, 1.0, 0.9355},
		{saltNaCl, 1.5, 0.9580}, {saltNaCl, 2.0, 0.9833}, {saltNaCl, 2.5, 1.0112}, {saltNaCl, 3.0, 1.0453},
		{saltNaCl, 4.0, 1.1158}, {saltNaCl, 5.0, 1.1916}, {saltNaCl, 6.0, 1.2706},
		{saltKCl, 0.1, 0.9266}, {saltKCl, 0.5, 0.9000}, {saltKCl, 1.0, 0.8992}, {saltKCl, 2.0, 0.9120},
		{saltKCl, 3.0, 0.9367}, {saltKCl, 4.0, 0.9639},
	}
	for _, tc := range tests {
		_, got := meanActivity(t, set, tc.s, tc.m)
		if math.Abs(got-tc.want) > tolPhiNaCl {
			t.Errorf("φ(%s, %g mol/kg, 25 °C) = %.4f, want %.4f ± %g (%s)", tc.s.name, tc.m, got, tc.want, tolPhiNaCl, src)
		}
	}
}

// TestPitzerComputedValues guards the implementation against the values
// computed independently from the same equations and parameters in
// testdata/reference/thermo.md §7.1 and §7.3 [COMPUTED regression]: the 2-1, 1-2 and 2-2 salts
// whose tables are uncertain, including φ, which R&S tables here lack.
func TestPitzerComputedValues(t *testing.T) {
	set := pitzerSetT(t)
	const src = "testdata/reference/thermo.md §7.3 [COMPUTED regression, A_φ 0.3915]"
	tests := []struct {
		s    salt
		m    float64
		phi  bool
		want float64
	}{
		{saltMgCl2, 0.1, false, 0.5288}, {saltMgCl2, 1, false, 0.5701}, {saltMgCl2, 3, false, 2.299}, {saltMgCl2, 6, false, 38.03},
		{saltNa2SO4, 0.1, true, 0.7935}, {saltNa2SO4, 1, true, 0.6414}, {saltNa2SO4, 3, true, 0.6630}, {saltNa2SO4, 6, true, 0.9505},
		{saltNa2SO4, 0.5, false, 0.2723}, {saltNa2SO4, 4, false, 0.1378},
		{saltMgSO4, 0.1, true, 0.5953}, {saltMgSO4, 1, true, 0.5281}, {saltMgSO4, 3, true, 0.9146},
		{saltMgSO4, 0.1, false, 0.1660}, {saltMgSO4, 1, false, 0.0547}, {saltMgSO4, 2, false, 0.0466},
		{saltCaCl2, 0.1, true, 0.8553}, {saltCaCl2, 1, true, 1.0474}, {saltCaCl2, 3, true, 1.7632},
	}
	for _, tc := range tests {
		g, phi := meanActivity(t, set, tc.s, tc.m)
		got, what := g, "γ±"
		if tc.phi {
			got, what = phi, "φ"
		}
		if math.Abs(got/tc.want-1) > tolComputed {
			t.Errorf("%s(%s, %g mol/kg, 25 °C) = %.4g, want %.4g ± %g %% (%s)", what, tc.s.name, tc.m, got, tc.want, 100*tolComputed, src)
		}
	}
}

// TestPitzerGibbsDuhem checks that the activity and osmotic coefficients of
// a mixed brine (every kind of term: B, C, θ, ^Eθ, ψ, λ) derive from one
// excess Gibbs energy, G/(w RT) = Σ m_i (1 − φ + ln γ_i): ln γ_i must equal
// ∂G/∂m_i. A sign or factor slip in any term breaks it.
func TestPitzerGibbsDuhem(t *testing.T) {
	set := pitzerSetT(t)
	rng := rand.New(rand.NewPCG(7, 11))
	names := []string{"Na[+]", "K[+]", "Ca[2+]", "Mg[2+]", "H[+]", "MgOH[+]", "Sr[2+]", "Ba[2+]",
		"Cl[-]", "SO4[2-]", "HCO3[-]", "CO3[2-]", "OH[-]", "HSO4[-]", "CO2[0]"}
	for trial := 0; trial < 5; trial++ {
		mol := map[string]float64{}
		for _, n := range names {
			mol[n] = 0.01 + 0.6*rng.Float64()
		}
		gex := func(mol map[string]float64) float64 {
			lng, phi, err := set.pitzerActivity(40, mol)
			if err != nil {
				t.Fatal(err)
			}
			var g float64
			for n, m := range mol {
				g += m * (1 - phi + lng[n])
			}
			return g
		}
		lng, _, _ := set.pitzerActivity(40, mol)
		for _, n := range names {
			h := 1e-6 * mol[n]
			up, down := maps(mol), maps(mol)
			up[n] += h
			down[n] -= h
			d := (gex(up) - gex(down)) / (2 * h)
			if math.Abs(d-lng[n]) > 1e-6*(1+math.Abs(d)) {
				t.Errorf("trial %d: ∂G/∂m(%s) = %.8f, ln γ = %.8f: not one Gibbs energy", trial, n, d, lng[n])
			}
		}
	}
}

func maps(m map[string]float64) map[string]float64 {
	out := make(map[string]float64, len(m))
	for k, v := range m {
		out[k] = v
	}
	return out
}

// TestPitzerJ checks J(x) and J'(x) of the unsymmetrical mixing terms
// against the defining integral J(x) = (1/x)∫₀^∞ [1 + q + q²/2 − e^q] y² dy,
// q = −(x/y)e^−y, evaluated here independently by Simpson's rule on an even
// grid in y (fine enough for x ≥ 0.5), and against Pitzer's (1975)
// approximation J ≈ x/[4 + 4.581 x^−0.7237 exp(−0.0120 x^0.528)] (from
// memory, testdata/reference/thermo.md §6.1), which is good to about 1.3 %.
func TestPitzerJ(t *testing.T) {
	integral := func(x float64) float64 {
		f := func(y float64) float64 {
			if y == 0 {
				return x * x / 2
			}
			q := -x / y * math.Exp(-y)
			// y²(1 + q + q²/2) written out so that y → 0 stays finite.
			return y*y - x*y*math.Exp(-y) + x*x*math.Exp(-2*y)/2 - y*y*math.Exp(q)
		}
		const n, top = 200000, 60.0
		h := top / n
		s := f(0) + f(top)
		for i := 1; i < n; i++ {
			w := 2.0
			if i%2 == 1 {
				w = 4
			}
			s += w * f(float64(i)*h)
		}
		return s * h / 3 / x
	}
	for _, x := range []float64{0.5, 0.77, 1, 2, 3.3, 5, 10, 30, 100} {
		want := integral(x)
		got, gotP := pitzerJ(x)
		if math.Abs(got/want-1) > 1e-5 {
			t.Errorf("J(%g) = %.7f, defining integral %.7f (± 1e-5 relative)", x, got, want)
		}
		h := 1e-3 * x
		wantP := (integral(x+h) - integral(x-h)) / (2 * h)
		if math.Abs(gotP/wantP-1) > 1e-4 {
			t.Errorf("J'(%g) = %.7f, derivative of the integral %.7f (± 1e-4 relative)", x, gotP, wantP)
		}
		approx := x / (4 + 4.581*math.Pow(x, -0.7237)*math.Exp(-0.0120*math.Pow(x, 0.528)))
		if math.Abs(approx/got-1) > 0.013 {
			t.Errorf("J(%g) = %.6f, Pitzer (1975) approximation %.6f: more than 1.3 %% apart", x, got, approx)
		}
	}
	// Small x: J ≈ x²·ln(1/x)/6 to leading order; the table's smooth
	// continuation below 1e−6 and its tangent beyond 1e3 keep J' positive.
	for _, x := range []float64{1e-8, 1e-5, 1e-3, 0.01, 0.1, 2e3} {
		J, Jp := pitzerJ(x)
		if !(J > 0) || !(Jp > 0) {
			t.Errorf("J(%g) = %g, J' = %g; want both positive", x, J, Jp)
		}
	}
	if J, _ := pitzerJ(1e-3); math.Abs(J/(1e-6*math.Log(1e3)/6)-1) > 0.3 {
		t.Errorf("J(1e-3) = %g, want about x² ln(1/x)/6 = %g", J, 1e-6*math.Log(1e3)/6)
	}
}

// TestPitzerAphi checks A_φ(T) against the Debye–Hückel A tabulated by
// Helgeson & Kirkham (1974) (A_φ = A·ln 10/3; the values of activity_test.go,
// [READ]), and the anchored Møller (1988) function against its own
// [COMPUTED] table (testdata/reference/thermo.md §6.2).
func TestPitzerAphi(t *testing.T) {
	ps := newPitzerState(pitzerSetT(t))
	hk := map[float64]float64{0: 0.4911, 25: 0.5092, 50: 0.5336, 100: 0.5998}
	m88 := map[float64]float64{0: 0.3767, 25: 0.3915, 50: 0.4103, 75: 0.4333, 100: 0.4605}
	for _, tc := range []float64{0, 25, 50, 75, 100} {
		ps.setTemperature(tc)
		if A, ok := hk[tc]; ok {
			if want := A * math.Ln10 / 3; math.Abs(ps.aphi/want-1) > 0.005 {
				t.Errorf("A_φ(%g °C) = %.4f, want %.4f ± 0.5 %% (Helgeson & Kirkham 1974 A·ln10/3)", tc, ps.aphi, want)
			}
		}
		// Anchored at HMW84's 0.392: the change from 25 °C is M88's.
		if got, want := ps.aphi-0.392, m88[tc]-0.3915; math.Abs(got-want) > 2e-4 {
			t.Errorf("A_φ(%g °C) − A_φ(25 °C) = %.4f, want %.4f ± 0.0002 (Møller 1988, testdata/reference/thermo.md §6.2 [COMPUTED])", tc, got, want)
		}
	}
}

// TestPitzerTemperatureFunctions guards the transcription of the Møller
// (1988) and Greenberg & Møller (1989) functions: the change of each
// parameter from 25 °C must match testdata/reference/thermo.md §6.3's [COMPUTED] table.
func TestPitzerTemperatureFunctions(t *testing.T) {
	tab, err := defaultPitzerTable()
	if err != nil {
		t.Fatal(err)
	}
	find := func(kind pitzerKind, c, a string) *pitzerParam {
		for i := range tab.params {
			p := &tab.params[i]
			if p.kind == kind && p.names[0] == c && p.names[1] == a {
				return p
			}
		}
		t.Fatalf("no %s(%s,%s) row", pitzerKindNames[kind], c, a)
		return nil
	}
	const src = "testdata/reference/thermo.md §6.3 [COMPUTED] from the M88/GM89 functions"
	tests := []struct {
		kind        pitzerKind
		c, a        string
		tc          float64
		at25, value float64
	}{
		{pzBeta0, "Na[+]", "Cl[-]", 0, 0.07536, 0.04926},
		{pzBeta0, "Na[+]", "Cl[-]", 100, 0.07536, 0.10020},
		{pzBeta1, "Na[+]", "Cl[-]", 50, 0.27703, 0.29672},
		{pzCphi, "Na[+]", "Cl[-]", 100, 0.00141, -0.00331},
		{pzBeta0, "Na[+]", "SO4[2-]", 0, 0.01869, -0.08596},
		{pzBeta1, "Na[+]", "SO4[2-]", 100, 1.0994, 1.3337},
		{pzCphi, "Na[+]", "SO4[2-]", 50, 0.00630, -0.00388},
		{pzBeta0, "Ca[2+]", "Cl[-]", 100, 0.30532, 0.30321},
		{pzBeta1, "Ca[2+]", "Cl[-]", 75, 1.70813, 1.96461},
		{pzBeta0, "K[+]", "Cl[-]", 0, 0.04808, 0.02929},
		{pzBeta1, "K[+]", "Cl[-]", 100, 0.21802, 0.30451},
	}
	for _, tc := range tests {
		p := find(tc.kind, tc.c, tc.a)
		got := p.at(tc.tc) - p.value
		want := tc.value - tc.at25
		if math.Abs(got-want) > 2e-4*(1+math.Abs(tc.value)) {
			t.Errorf("%s at %g °C − at 25 °C = %.5f, want %.5f (%s)", p.label(), tc.tc, got, want, src)
		}
	}
	// CaCl2 below 25 °C, where M88's function does not reach: the second
	// row's Silvester & Pitzer (1979) slopes (Pitzer 1991 Table 13 [READ],
	// thermo.md §6.3), with no step at 25 °C.
	for _, tc := range []struct {
		kind  pitzerKind
		slope float64
	}{{pzBeta0, -0.561e-3}, {pzBeta1, 2.66e-3}, {pzCphi, -0.723e-4}} {
		p := find(tc.kind, "Ca[2+]", "Cl[-]")
		if p.below == nil || p.tMin != 0 {
			t.Fatalf("%s: no row below 25 °C (range %g–%g °C)", p.label(), p.tMin, p.tMax)
		}
		if got, want := p.at(10)-p.value, tc.slope*(10-25); math.Abs(got-want) > 1e-12 {
			t.Errorf("%s at 10 °C − at 25 °C = %.6f, want %.6f (Silvester & Pitzer 1979 slope)", p.label(), got, want)
		}
		if step := p.at(25) - p.at(25-1e-9); math.Abs(step) > 1e-9 {
			t.Errorf("%s steps by %g at 25 °C", p.label(), step)
		}
	}
	// Outside its range a parameter is held at the range limit: MgCl2
	// (Silvester & Pitzer slopes, 0–50 °C) at 75 °C keeps its 50 °C value.
	if p := find(pzBeta1, "Mg[2+]", "Cl[-]"); p.at(75) != p.at(50) || p.at(50) == p.value {
		t.Errorf("β1(Mg,Cl) at 75 °C = %g, want the 50 °C value %g (held beyond the fitted range)", p.at(75), p.at(50))
	}
}

// TestPitzerTable checks the rows of data/pitzer.csv: every parameter has a
// provenance tag, and the reconciliation with the ion-association table is
// complete — every aqueous species of data/thermo.csv made only of the
// Pitzer set's masters is declared a Pitzer species, excluded (its
// interaction already in the binary parameters) or kept, exactly once.
func TestPitzerTable(t *testing.T) {
	tab, err := defaultPitzerTable()
	if err != nil {
		t.Fatal(err)
	}
	tag := regexp.MustCompile(`\[(READ|FROM MEMORY|COMPUTED)[^\]]*\]`)
	declared := map[string]pitzerKind{}
	for _, p := range tab.params {
		if p.kind >= pzSpecies {
			declared[p.names[0]] = p.kind
			continue
		}
		for q := &p; q != nil; q = q.below {
			if !tag.MatchString(q.source) {
				t.Errorf("data/pitzer.csv line %d (%s): source %q has no provenance tag", q.line, q.label(), q.source)
			}
		}
	}
	m := DefaultModel()
	pitzerMaster := map[int]bool{}
	for j, n := range m.masters {
		pitzerMaster[j] = declared[n] == pzSpecies
	}
	for i := len(m.masters); i < len(m.species); i++ {
		sp := &m.species[i]
		all := true
		for _, nt := range sp.nu {
			all = all && pitzerMaster[nt.j]
		}
		_, ok := declared[sp.name]
		if all && !ok {
			t.Errorf("%s is made of Pitzer-set ions but data/pitzer.csv neither declares, excludes nor keeps it", sp.name)
		}
	}
	for name, k := range declared {
		if _, ok := m.speciesIdx[name]; !ok {
			t.Errorf("data/pitzer.csv %s row names %s, which data/thermo.csv lacks", pitzerKindNames[k], name)
		}
	}
	set := pitzerSetT(t)
	if len(set.fallback) != 7 {
		t.Errorf("components outside the Pitzer set: %v, want Fe, Mn, Si, P, F, N, B", set.fallback)
	}
}

// TestPitzerTableErrors: bad rows are located errors.
func TestPitzerTableErrors(t *testing.T) {
	head := strings.Join(pitzerHeader, ",") + "\n"
	species := "species,Na[+],,,,,,,,,,,,,,x\nspecies,Cl[-],,,,,,,,,,,,,,x\nspecies,Ca[2+],,,,,,,,,,,,,,x\n"
	for _, tc := range []struct {
		name, body, want string
	}{
		{"anion first", "beta0,Cl[-],Na[+],,0.1,,,,,,,,,25,25,x [READ]\n", "cation, then an anion"},
		{"no value", "beta0,Na[+],Cl[-],,,,,,,,,,,25,25,x [READ]\n", "required"},
		{"range", "beta0,Na[+],Cl[-],,0.1,,,,,,,,,0,50,x [READ]\n", "25 °C only"},
		{"twice", "theta,Na[+],Ca[2+],,0.1,,,,,,,,,25,25,x\ntheta,Ca[2+],Na[+],,0.1,,,,,,,,,25,25,x\n", "twice"},
		{"undeclared", "beta0,K[+],Cl[-],,0.1,,,,,,,,,25,25,x\n", "no species row"},
		{"kind", "gamma,Na[+],Cl[-],,0.1,,,,,,,,,25,25,x\n", "unknown kind"},
		{"NaN", "beta0,Na[+],Cl[-],,NaN,,,,,,,,,25,25,x\n", "value_25"},
		{"two rows on one side", "beta0,Na[+],Cl[-],,0.1,,1e-3,,,,,,,0,50,x\nbeta0,Na[+],Cl[-],,0.1,,2e-3,,,,,,,0,25,x\n", "end at 25 °C"},
		{"two rows, two values", "beta0,Na[+],Cl[-],,0.1,,1e-3,,,,,,,25,50,x\nbeta0,Na[+],Cl[-],,0.2,,2e-3,,,,,,,0,25,x\n", "same 25 °C value"},
		{"two rows at 25 only", "beta0,Na[+],Cl[-],,0.1,,,,,,,,,25,25,x\nbeta0,Na[+],Cl[-],,0.1,,2e-3,,,,,,,0,25,x\n", "below 25 °C"},
	} {
		_, err := readPitzerTable("p.csv", strings.NewReader(head+species+tc.body))
		var ie *water.InputError
		if !errors.As(err, &ie) || ie.Line < 5 || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want a located error containing %q", tc.name, err, tc.want)
		}
	}
}

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
		// Calcite: the Pitzer set takes HMW84's own constant (−8.406,
		// which puts seawater on the stoichiometric constants,
		// TestSeawaterCalciteSaturation), 0.074 above Plummer &
		// Busenberg's −8.480 of the ion-association set; in fresh water
		// the two then differ by about 0.05, so 0.075 is allowed.
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

// TestPitzerCustomTable: a table extended at run time (--thermo) gets its
// own Pitzer model set; a new species of Pitzer-set ions that
// data/pitzer.csv does not classify is kept with ion-association γ.
func TestPitzerCustomTable(t *testing.T) {
	extra := strings.Join(tableHeader, ",") + "\n" +
		"NaCl[0],aqueous,NaCl,Na[+] + Cl[-] = NaCl[0],-0.5,,,,,,,,25,25,,,invented for a test\n"
	tab, err := DefaultTable().Extend("extra.csv", strings.NewReader(extra))
	if err != nil {
		t.Fatal(err)
	}
	m, err := NewModel(tab)
	if err != nil {
		t.Fatal(err)
	}
	a := newWater("brine", 25, map[water.Component]float64{water.Na: 3, water.Cl: 3, water.Ca: 0.01, water.S: 0.01})
	r, err := Speciate(a, Options{Model: m, Activity: Pitzer})
	if err != nil {
		t.Fatal(err)
	}
	if r.Molality("NaCl[0]") <= 0 {
		t.Error("the added NaCl[0] is missing from the Pitzer result")
	}
	set, err := m.pitzerSet()
	if err != nil || set.posOf[set.model.speciesIdx["NaCl[0]"]] >= 0 {
		t.Errorf("NaCl[0] in the Pitzer set of the extended table: %v; want it kept with ion-association γ", err)
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
	// calcite SI +0.54
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
