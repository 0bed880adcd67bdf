package saturation

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"

	"scalerisk/water"
)

// brineWater draws an electroneutral water from fresh (I 1e-4 mol/kg) to
// brine (about 5 mol/kg), pH 2–12 measured at the sample temperature
// 0–100 °C, random inorganic carbon (half of them given as alkalinity
// instead), and in most waters trace Ba, Sr, F,
// SiO2, PO4, Fe and Mn (each drawn over two to three decades).
func brineWater(rng *rand.Rand) water.Analysis {
	logI := -4 + rng.Float64()*(math.Log10(5)+4)
	I := math.Pow(10, logI)
	f := rng.Float64() // share of the 2:1 and 2:2 salts
	na := I * (1 - f) * rng.Float64()
	ca := I * f / 3 * rng.Float64()
	mg := I * f / 3 * rng.Float64()
	k := I * 0.05 * rng.Float64()
	so4 := math.Min((ca+mg)*rng.Float64(), 0.3) // sulfate of a brine is bounded by its calcium sulfate
	cl := na + k + 2*(ca+mg) - 2*so4
	totals := map[water.Component]float64{water.Na: na, water.Ca: ca, water.Mg: mg, water.K: k,
		water.S: so4, water.Cl: cl, water.C: math.Pow(10, -5+3*rng.Float64())}
	traces := []struct {
		c        water.Component
		from, to float64 // log10 mol/kg
	}{{water.Ba, -8, -5}, {water.Sr, -6, -3}, {water.F, -6, -3.5}, {water.Si, -6, -2.7},
		{water.P, -7, -4}, {water.Fe, -8, -5}, {water.Mn, -8, -5}}
	for _, tr := range traces {
		if rng.IntN(4) > 0 {
			totals[tr.c] = math.Pow(10, tr.from+(tr.to-tr.from)*rng.Float64())
		}
	}
	t := 100 * rng.Float64()
	a := newWater("random", t, totals)
	a.PH = 2 + 10*rng.Float64()
	a.PHTemperature = t
	if rng.IntN(2) == 0 { // half as a laboratory reports them: alkalinity, not DIC
		a.Totals[water.C], a.CarbonKnown = 0, false
		a.Alkalinity = math.Pow(10, -5+3.5*rng.Float64()) // eq/kg
	}
	return a
}

// outcome is what became of one random water.
type outcome string

const (
	converged    outcome = "converged"
	inconsistent outcome = "sample error: inconsistent"
	noConverge   outcome = "sample error: no convergence"
	otherError   outcome = "failure: error without a reason"
	nanResult    outcome = "failure: NaN"
	panicked     outcome = "failure: panic"
	jointFailed  outcome = "failure: joint precipitation"
)

// assessRandom speciates a, checks every number of the result and runs
// the joint precipitation, turning a panic into an outcome.
func assessRandom(sp *Speciator, a water.Analysis) (o outcome, detail string) {
	defer func() {
		if p := recover(); p != nil {
			o, detail = panicked, fmt.Sprint(p)
		}
	}()
	r, err := sp.Speciate(a, Options{})
	switch {
	case errors.Is(err, ErrInconsistent):
		return inconsistent, err.Error()
	case errors.Is(err, ErrNoConvergence):
		return noConverge, err.Error()
	case err != nil:
		return otherError, err.Error()
	}
	if !finite(r.PH) || !finite(r.IonicStrength) {
		return nanResult, fmt.Sprintf("pH %v, I %v", r.PH, r.IonicStrength)
	}
	for _, mn := range r.Minerals {
		if !finite(mn.SI) {
			return nanResult, fmt.Sprintf("SI(%s) = %v", mn.Name, mn.SI)
		}
	}
	ps, w := sp.PrecipitationPotential(r, Options{})
	if s := strings.Join(w, "; "); strings.Contains(s, "not computed") {
		return jointFailed, s
	}
	for _, p := range ps {
		if !finite(p.Alone) || !finite(p.Together) { // NaN Together only with a "not computed" warning
			return nanResult, fmt.Sprintf("precipitate %s: alone %v, together %v", p.Mineral, p.Alone, p.Together)
		}
	}
	return converged, ""
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// TestRandomWaterSuite runs random waters from fresh to brine (brineWater)
// through speciation, saturation indices and joint precipitation: every
// one converges or is a sample error with its reason (inconsistent, no
// convergence); none panics and none gives NaN. Joint-precipitation
// failures are counted in the summary line (see below). 10,000 waters (300 with -short); SCALERISK_RANDOM_WATERS=N
// sets another number (scripts/random-waters.sh runs 100,000). The summary
// line counts each outcome.
func TestRandomWaterSuite(t *testing.T) {
	n := 10000
	if testing.Short() {
		n = 300
	}
	if s := os.Getenv("SCALERISK_RANDOM_WATERS"); s != "" {
		v, err := strconv.Atoi(s)
		if err != nil || v < 1 {
			t.Fatalf("SCALERISK_RANDOM_WATERS=%q: want a count", s)
		}
		n = v
	}
	rng := rand.New(rand.NewPCG(2026, 12))
	sp := NewSpeciator(nil)
	counts := map[outcome]int{}
	for i := range n {
		a := brineWater(rng)
		o, detail := assessRandom(sp, a)
		counts[o]++
		// Every failure fails the test, joint precipitation included
		// (it failed on 3 in 10,000 of this seed while a reciprocal salt
		// pair — calcite, strontianite, anhydrite and celestite — could
		// all be held at saturation at once, a singular system).
		if strings.HasPrefix(string(o), "failure") && counts[o] <= 5 {
			t.Errorf("water %d (I≈%.3g, pH %.3g, %.3g °C): %s: %s", i, ionicStrengthOf(a), a.PH, a.Temperature, o, detail)
		}
	}
	t.Logf("random waters: %d; converged %d; sample errors: inconsistent %d, no convergence %d; failures: panic %d, NaN %d, joint precipitation %d, error without a reason %d",
		n, counts[converged], counts[inconsistent], counts[noConverge], counts[panicked], counts[nanResult], counts[jointFailed], counts[otherError])
}

// ionicStrengthOf is the ionic strength of a's totals taken as free ions
// (for messages only).
func ionicStrengthOf(a water.Analysis) float64 {
	I := 0.0
	for c, m := range a.Totals {
		z := water.Component(c).Charge()
		I += 0.5 * m * z * z
	}
	return I
}
