package saturation

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
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
