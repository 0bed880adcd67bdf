package saturation

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"scalerisk/water"
)

// randomWater draws an electroneutral water (before pH) of ionic strength
// about 1e-4 to 0.7 mol/kg with random carbon, pH 3–11 measured at 25 °C.
func randomWater(rng *rand.Rand) water.Analysis {
	I := math.Pow(10, -4+rng.Float64()*math.Log10(0.7/1e-4))
	// Fractions of a 1:1 and 2:2 mix give roughly the target I.
	f := rng.Float64()
	na := I * (1 - f) * rng.Float64()
	ca := I * f / 4 * rng.Float64()
	mg := I * f / 4 * rng.Float64()
	k := I * 0.05 * rng.Float64()
	so4 := (ca + mg) * rng.Float64()
	cl := na + k + 2*(ca+mg) - 2*so4
	totals := map[water.Component]float64{water.Na: na, water.Ca: ca, water.Mg: mg, water.K: k,
		water.S: so4, water.Cl: cl,
		water.C:  math.Pow(10, -5+3*rng.Float64()),
		water.Si: math.Pow(10, -6+3*rng.Float64()),
	}
	if rng.IntN(3) == 0 {
		totals[water.P] = math.Pow(10, -7+2*rng.Float64())
		totals[water.F] = math.Pow(10, -6+2*rng.Float64())
		totals[water.B] = math.Pow(10, -6+2*rng.Float64())
		totals[water.Ba] = math.Pow(10, -8+2*rng.Float64())
		totals[water.Sr] = math.Pow(10, -6+2*rng.Float64())
		totals[water.Fe] = math.Pow(10, -7+2*rng.Float64())
	}
	a := newWater("random", 100*rng.Float64(), totals)
	a.PH = 3 + 8*rng.Float64()
	a.PHTemperature = 25
	return a
}

// TestRandomWatersConverge: random waters over pH 3–11, I 1e-4–0.7 mol/kg,
// 0–100 °C either converge with mass balances closed to 1e-10 and
// alkalinity conserved, or return an error that says why (never a NaN).
func TestRandomWatersConverge(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	m := DefaultModel()
	sp := NewSpeciator(m)
	failures := 0
	n := 400
	if testing.Short() {
		n = 100
	}
	for i := 0; i < n; i++ {
		a := randomWater(rng)
		for _, model := range []ActivityModel{Auto, BDot} {
			r, err := sp.Speciate(a, Options{Activity: model})
			if err != nil {
				if !errors.Is(err, ErrNoConvergence) {
					t.Errorf("water %d: error without the no-convergence cause: %v", i, err)
				}
				failures++
				continue
			}
			if math.IsNaN(r.PH) || math.IsNaN(r.IonicStrength) {
				t.Fatalf("water %d: NaN in a converged result", i)
			}
			checkBalance(t, r, m)
			for _, mn := range r.Minerals {
				if math.IsNaN(mn.SI) || math.IsInf(mn.SI, 0) {
					t.Errorf("water %d: SI(%s) = %v", i, mn.Name, mn.SI)
				}
			}
		}
	}
	if failures > 0 {
		t.Errorf("%d of %d random speciations did not converge", failures, 2*n)
	}
}

// TestRandomChargeBalance: in charge-balance mode the solution is
// electroneutral to 1e-10 of the total charge.
func TestRandomChargeBalance(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	sp := NewSpeciator(nil)
	for i := 0; i < 200; i++ {
		a := randomWater(rng)
		a.PH = math.NaN()
		r, err := sp.Speciate(a, Options{Carbonate: ChargeBalance})
		if err != nil {
			t.Errorf("water %d: %v", i, err)
			continue
		}
		if math.Abs(r.ChargeBalance) > 1e-8 {
			t.Errorf("water %d: charge balance %.3g %%, want 0", i, r.ChargeBalance)
		}
	}
}

// TestPoorStart: a cold solve after a very different water (warm start from
// far away) still converges to the same answer as a fresh solver.
func TestPoorStart(t *testing.T) {
	sp := NewSpeciator(nil)
	brine := newWater("brine", 80, map[water.Component]float64{water.Na: 0.6, water.Cl: 0.6, water.C: 1e-2})
	brine.PH, brine.PHTemperature = 10.5, 80
	if _, err := sp.Speciate(brine, Options{}); err != nil {
		t.Fatal(err)
	}
	cw := coolingWater()
	r1, err := sp.Speciate(cw, Options{AtTemperature: true, Temperature: 40})
	if err != nil {
		t.Fatal(err)
	}
	r2, err := Speciate(cw, Options{AtTemperature: true, Temperature: 40})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r1.PH-r2.PH) > 1e-9 {
		t.Errorf("warm start from a brine: pH %.12f, fresh solver %.12f", r1.PH, r2.PH)
	}
}

// TestEdges: waters at the ends of the pH scale (0.5–13.5, evaluated at
// 60 °C) and waters of a single component each converge with closed
// balances; any error, non-convergence included, fails the test.
func TestEdges(t *testing.T) {
	for _, ph := range []float64{0.5, 2, 12, 13.5} {
		a := newWater("edge", 25, map[water.Component]float64{water.Na: 0.01, water.Cl: 0.01, water.C: 1e-3, water.Ca: 1e-4})
		a.PH = ph
		r, err := Speciate(a, Options{AtTemperature: true, Temperature: 60})
		if err != nil {
			t.Errorf("pH %g: %v", ph, err)
			continue
		}
		checkBalance(t, r, DefaultModel())
	}
	// Zero everything but one component.
	for c := range water.NumComponents {
		a := newWater("single", 25, map[water.Component]float64{c: 1e-3})
		if _, err := Speciate(a, Options{}); err != nil {
			t.Errorf("water with only %s: %v", c, err)
		}
	}
}

// TestRandomWatersFromAlkalinity takes the path real samples take: pH and
// alkalinity measured, carbon unknown, pH 3–11. Each water converges with
// closed mass balances, or fails with ErrInconsistent (pH and alkalinity
// that do not fit) or ErrNoConvergence; below pH 4.5 carbon comes from air
// CO2 with a warning, and no result claims a CO2 pressure above 3 atm
// without saying so.
func TestRandomWatersFromAlkalinity(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	sp := NewSpeciator(nil)
	inconsistent := 0
	for i := 0; i < 300; i++ {
		a := randomWater(rng)
		a.Totals[water.C], a.CarbonKnown, a.Measured[water.C] = 0, false, false
		a.Alkalinity = 5e-3 * rng.Float64()
		r, err := sp.Speciate(a, Options{})
		if err != nil {
			switch {
			case errors.Is(err, ErrInconsistent):
				inconsistent++
			case errors.Is(err, ErrNoConvergence):
				t.Errorf("water %d (pH %.2f): %v", i, a.PH, err)
			default:
				t.Errorf("water %d: unexplained error %v", i, err)
			}
			continue
		}
		checkBalance(t, r, DefaultModel())
		warned := strings.Contains(strings.Join(r.Warnings, " "), "CO2")
		if a.PH < acidPH && !warned {
			t.Errorf("water %d: pH %.2f below %.1f without the air-CO2 note", i, a.PH, acidPH)
		}
		if r.LogPCO2 > implausibleLogPCO2 && !warned {
			t.Errorf("water %d: log pCO2 %.2f without a warning", i, r.LogPCO2)
		}
	}
	t.Logf("%d of 300 waters had pH and alkalinity that do not fit", inconsistent)
}

// TestRandomJointPrecipitation: the joint precipitation of all readily
// forming supersaturated minerals converges for random waters (each of
// which speciates: a failed speciation fails the test too).
func TestRandomJointPrecipitation(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	sp := NewSpeciator(nil)
	for i := 0; i < 150; i++ {
		a := randomWater(rng)
		r, err := sp.Speciate(a, Options{})
		if err != nil {
			t.Errorf("water %d: %v", i, err)
			continue
		}
		if _, w := sp.PrecipitationPotential(r, Options{}); strings.Contains(strings.Join(w, " "), "not computed") {
			t.Errorf("water %d: %v", i, w)
		}
	}
}
