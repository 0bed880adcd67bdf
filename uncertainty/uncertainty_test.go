package uncertainty

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"scalerisk/saturation"
	"scalerisk/water"
)

// diluteBarite is a 0.01 mol/kg sodium chloride water with traces of barium
// and sulfate at 25 °C: the undrawn NaCl holds the ionic strength, so the
// activity coefficients do not move with the drawn Ba and SO4, and the
// BaSO4⁰ pair is minor; the barite SI is then linear in ln m(Ba) and
// ln m(SO4) with slope 1/ln 10 (checked below) — the case the checks of the
// propagation law need. Invented water.
const diluteBarite = "name,temperature [C],pH,Na [mg/L],Cl [mg/L],Ba [mg/L],SO4 [mg/L]\nbarite trace water,25,7.0,230,355,1.6,2\n"

func readOne(t testing.TB, csv string) water.Analysis {
	t.Helper()
	recs, _, err := water.Read("test.csv", strings.NewReader(csv), water.ReadOptions{})
	if err != nil || len(recs) != 1 || recs[0].Err != nil {
		t.Fatalf("reading the test water: %v %v", err, recs)
	}
	return recs[0].Analysis
}

// bariteTable draws only Ba (20 %) and SO4 (5 %).
func bariteTable(t testing.TB) *Table {
	t.Helper()
	tab, err := newTable([]tableRow{
		{Input: "Ba", U: 20, Unit: "%", Source: "test figure"},
		{Input: "SO4", U: 5, Unit: "%", Source: "test figure"},
	})
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

// deltaSD returns the first-order standard uncertainty of the barite SI of
// a: u(SI)² = Σ (∂SI/∂ln xᵢ · uᵢ)², with the sensitivity coefficients by
// central differences through the engine (JCGM 100:2008, 5.1.2 and 5.1.3),
// and the coefficients themselves.
func deltaSD(t *testing.T, a water.Analysis, us map[water.Component]float64) (float64, map[water.Component]float64) {
	t.Helper()
	const h = 1e-4
	si := func(b water.Analysis) float64 {
		r, err := saturation.Speciate(b, saturation.Options{})
		if err != nil {
			t.Fatal(err)
		}
		v, _ := r.SI("barite")
		return v
	}
	var sum float64
	coef := map[water.Component]float64{}
	for c, u := range us {
		up, down := a, a
		up.Totals[c] *= math.Exp(h)
		down.Totals[c] *= math.Exp(-h)
		coef[c] = (si(up) - si(down)) / (2 * h)
		sum += coef[c] * coef[c] * u * u
	}
	return math.Sqrt(sum), coef
}

// TestDeltaMethod: where SI is linear in the log concentrations, the Monte
// Carlo standard deviation of SI matches the law of propagation of
// uncertainty (JCGM 100:2008 GUM, 5.1.2; the delta method) within 5 %.
func TestDeltaMethod(t *testing.T) {
	const tol = 0.05 // relative, the figure
	a := readOne(t, diluteBarite)
	central := saturation.AssessAnalysis(a, saturation.Options{})
	want, coef := deltaSD(t, a, map[water.Component]float64{water.Ba: 0.20, water.S: 0.05})
	for c, k := range coef {
		// The premise: slope 1/ln 10 = 0.434 per unit of ln m (within 2 %).
		if math.Abs(k*math.Ln10-1) > 0.02 {
			t.Fatalf("∂SI(barite)/∂ln m(%s) = %.4f, want 1/ln 10 = 0.4343 ± 2 %%: the test water is not linear", c, k)
		}
	}
	s, err := Assess(central, saturation.Options{}, Settings{Draws: 4000, Seed: 7, Table: bariteTable(t), KeepAll: true})
	if err != nil {
		t.Fatal(err)
	}
	q, _ := s.Quantity("barite")
	t.Logf("SD of SI(barite): Monte Carlo %.5f over %d draws, delta method %.5f (ratio %.4f)", q.SD, q.N, want, q.SD/want)
	if math.Abs(q.SD/want-1) > tol {
		t.Errorf("SD of SI(barite) over %d draws = %.4f, want %.4f ± %.0f %% (delta method, JCGM 100:2008 5.1.2)", q.N, q.SD, want, 100*tol)
	}
}

// TestProbabilityNormal: with SI linear in two log-normal inputs, SI is
// normal with mean SI₀ and the delta-method SD, so P(SI > 0) is the normal
// distribution function Φ(SI₀/σ) (JCGM 101:2008, 6.4.7 and 9.2: a known
// normal case), within three binomial standard errors of 4000 draws.
func TestProbabilityNormal(t *testing.T) {
	a := readOne(t, diluteBarite)
	central := saturation.AssessAnalysis(a, saturation.Options{})
	sigma, _ := deltaSD(t, a, map[water.Component]float64{water.Ba: 0.20, water.S: 0.05})
	si0, _ := central.Result.SI("barite")
	want := distuv.Normal{Mu: si0, Sigma: sigma}.Survival(0)
	if want < 0.2 || want > 0.8 {
		t.Fatalf("test water: P = %.2f is too near 0 or 1 to test", want)
	}
	const n = 4000
	s, err := Assess(central, saturation.Options{}, Settings{Draws: n, Seed: 11, Table: bariteTable(t), KeepAll: true})
	if err != nil {
		t.Fatal(err)
	}
	q, _ := s.Quantity("barite")
	tol := 3 * math.Sqrt(want*(1-want)/n)
	t.Logf("P(SI barite > 0): Monte Carlo %.4f, Φ(SI₀/σ) %.4f (3 SE %.4f)", q.PPositive, want, tol)
	if math.Abs(q.PPositive-want) > tol {
		t.Errorf("P(SI barite > 0) = %.4f, want Φ(%.4f/%.4f) = %.4f ± %.4f (normal distribution function)", q.PPositive, si0, sigma, want, tol)
	}
	// The interval of a normal result: median SI₀, 5 % and 95 % at ∓1.645σ.
	z := distuv.UnitNormal.Quantile(0.95)
	if math.Abs(q.Low-(si0-z*sigma)) > 0.1*sigma || math.Abs(q.High-(si0+z*sigma)) > 0.1*sigma {
		t.Errorf("interval [%.4f, %.4f], want [%.4f, %.4f] ± %.4f", q.Low, q.High, si0-z*sigma, si0+z*sigma, 0.1*sigma)
	}
}

// TestReproducible: the same seed gives the same numbers with any number
// of workers, and another seed other numbers (JCGM 101:2008, 7.2: the
// generator and its seed are part of the method).
func TestReproducible(t *testing.T) {
	a := demoWater(t, 1)
	central := saturation.AssessAnalysis(a, saturation.Options{})
	base := Settings{Draws: 200, Seed: 42, Workers: 1}
	one, err := Assess(central, saturation.Options{}, base)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []int{1, 2, 3} {
		s := base
		s.Workers = w
		got, err := Assess(central, saturation.Options{}, s)
		if err != nil {
			t.Fatal(err)
		}
		// Printed, as NaN (no limit) never equals itself.
		if fmt.Sprintf("%+v", got) != fmt.Sprintf("%+v", one) {
			t.Errorf("seed 42 with %d workers gives other numbers than with 1", w)
		}
	}
	s := base
	s.Seed = 43
	other, err := Assess(central, saturation.Options{}, s)
	if err != nil {
		t.Fatal(err)
	}
	q1, _ := one.Quantity("calcite")
	q2, _ := other.Quantity("calcite")
	if q1.Median == q2.Median && q1.Low == q2.Low {
		t.Errorf("seeds 42 and 43 give the same calcite interval %+v", q1.Interval)
	}
}

// TestMedianErrorShrinks: the Monte Carlo standard error of the median
// falls as 1/√N (JCGM 101:2008, 7.9; the asymptotic variance of a sample
// median, π σ²/(2N) for a normal result — Kendall's Advanced Theory of
// Statistics, vol. 1, from memory). Over 100 seeds, the spread of the
// median at N = 100 is twice that at N = 400 within 30 %, and at N = 400 it
// is σ·√(π/2)/√N within 30 % (100 seeds estimate an SD to about 7 %, the
// ratio of two to about 10 %).
func TestMedianErrorShrinks(t *testing.T) {
	const seeds, tol = 100, 0.30
	a := readOne(t, diluteBarite)
	central := saturation.AssessAnalysis(a, saturation.Options{})
	sigma, _ := deltaSD(t, a, map[water.Component]float64{water.Ba: 0.20, water.S: 0.05})
	spread := func(n int) float64 {
		med := make([]float64, seeds)
		for k := range med {
			s, err := Assess(central, saturation.Options{}, Settings{Draws: n, Seed: uint64(k+1) * 0x9e3779b97f4a7c15, Table: bariteTable(t), KeepAll: true})
			if err != nil {
				t.Fatal(err)
			}
			q, _ := s.Quantity("barite")
			med[k] = q.Median
		}
		return stat.StdDev(med, nil)
	}
	s100, s400 := spread(100), spread(400)
	t.Logf("SD of the median over %d seeds: %.5f at N=100, %.5f at N=400 (ratio %.3f); σ√(π/2N) at N=400 = %.5f",
		seeds, s100, s400, s100/s400, sigma*math.Sqrt(math.Pi/2)/20)
	if r := s100 / s400; math.Abs(r/2-1) > tol {
		t.Errorf("SD of the median: %.5f at N=100, %.5f at N=400: ratio %.2f, want √4 = 2 ± %.0f %%", s100, s400, r, 100*tol)
	}
	if want := sigma * math.Sqrt(math.Pi/2) / math.Sqrt(400); math.Abs(s400/want-1) > tol {
		t.Errorf("SD of the median at N=400 = %.5f, want σ√(π/2N) = %.5f ± %.0f %%", s400, want, 100*tol)
	}
}

// demoWater returns demo water i of data/demo.csv.
func demoWater(t testing.TB, i int) water.Analysis {
	t.Helper()
	f, err := water.OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, _, err := water.Read("demo.csv", f, water.ReadOptions{})
	if err != nil || recs[i].Err != nil {
		t.Fatalf("demo water %d: %v", i, err)
	}
	return recs[i].Analysis
}

// TestSensitivityShares: for SI linear in ln m(Ba) and ln m(SO4), the
// share of the variance each input explains is its term of the law of
// propagation, c²u²/Σc²u² (JCGM 100:2008, 5.1.2; with c = 1/ln 10 for
// both, σ²(ln Ba)/(σ²(ln Ba) + σ²(ln SO4))), within 0.02, and the linear
// fit explains over 99 % of the variance.
func TestSensitivityShares(t *testing.T) {
	const tol = 0.02
	a := readOne(t, diluteBarite)
	central := saturation.AssessAnalysis(a, saturation.Options{})
	s, err := Assess(central, saturation.Options{}, Settings{Draws: 2000, Seed: 5, Table: bariteTable(t), KeepAll: true})
	if err != nil {
		t.Fatal(err)
	}
	q, _ := s.Quantity("barite")
	vBa, vSO4 := math.Log1p(0.20*0.20), math.Log1p(0.05*0.05) // σ² of the logs
	want := map[string]float64{"Ba": vBa / (vBa + vSO4), "SO4": vSO4 / (vBa + vSO4)}
	got := map[string]float64{}
	for _, sh := range q.Sensitivity.Shares {
		got[sh.Input] = sh.Share
	}
	t.Logf("shares %v, want %v; R² %.4f", got, want, q.Sensitivity.Explained)
	for in, w := range want {
		if math.Abs(got[in]-w) > tol {
			t.Errorf("share of %s = %.3f, want %.3f ± %.2f (law of propagation)", in, got[in], w, tol)
		}
	}
	if q.Sensitivity.Explained < 0.99 || q.Sensitivity.Top() != "Ba" {
		t.Errorf("R² %.4f, top %q: want above 0.99 and Ba", q.Sensitivity.Explained, q.Sensitivity.Top())
	}
}
