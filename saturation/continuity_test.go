package saturation

import (
	"math"
	"testing"

	"scalerisk/water"
)

// tolStep is the largest step of a saturation index between neighbouring
// points of a sweep beyond its smooth trend (issue 10: "no saturation index
// may step by more than 0.01 between neighbouring points of a sweep of
// cycles or blend fraction that crosses a model boundary").
const tolStep = 0.01

// continuityMinerals are the minerals whose curves a client reads.
var continuityMinerals = []string{"calcite", "gypsum", "anhydrite", "barite", "celestite", "dolomite", "halite"}

// brackishWater is a sodium chloride–sulfate water of stoichiometric ionic
// strength about 0.05 mol/kg with carbon and alkalinity given (no pH, so
// each concentrated water is solved by its alkalinity): an invented
// brackish make-up.
func brackishWater() water.Analysis {
	a := newWater("brackish make-up", 25, map[water.Component]float64{
		water.Na: 0.030, water.K: 0.0006, water.Ca: 0.004, water.Mg: 0.003, water.Sr: 3e-5, water.Ba: 5e-7,
		water.Cl: 0.030, water.S: 0.006, water.C: 0.003, water.Si: 3e-4, water.F: 4e-5, water.N: 1e-4, water.B: 5e-5,
	})
	a.Alkalinity = 0.0029
	return a
}

// scaled returns a with every total and the alkalinity multiplied by f.
func scaled(a water.Analysis, f float64) water.Analysis {
	b := a.Clone()
	for c := range b.Totals {
		b.Totals[c] *= f
	}
	b.Alkalinity *= f
	return b
}

// blended returns the mixture of share f of a with 1 − f of b (totals and
// alkalinity mix linearly in mol/kg).
func blended(a, b water.Analysis, f float64) water.Analysis {
	m := a.Clone()
	for c := range m.Totals {
		m.Totals[c] = f*a.Totals[c] + (1-f)*b.Totals[c]
		m.Measured[c] = a.Measured[c] || b.Measured[c]
	}
	m.Alkalinity = f*a.Alkalinity + (1-f)*b.Alkalinity
	return m
}

// sweepSIs speciates each water independently under model (Auto makes the
// automatic choice at every point, as a report of separate samples does)
// and returns the SI of each continuity mineral per point and the models
// used.
func sweepSIs(t *testing.T, ws []water.Analysis, model ActivityModel, choose func(water.Analysis) ActivityModel) (map[string][]float64, []ActivityModel) {
	t.Helper()
	sp := NewSpeciator(nil)
	si := map[string][]float64{}
	var models []ActivityModel
	for i, w := range ws {
		opt := Options{Activity: model}
		if choose != nil {
			opt.Activity = choose(w)
		}
		r, err := sp.Speciate(w, opt)
		if err != nil {
			t.Fatalf("point %d: %v", i, err)
		}
		models = append(models, r.Activity)
		for _, m := range continuityMinerals {
			v, ok := r.SI(m)
			if !ok {
				v = math.NaN()
			}
			si[m] = append(si[m], v)
		}
	}
	return si, models
}

// worstStep returns the largest departure of a step SI[k+1] − SI[k] from
// the mean of its neighbouring steps (the smooth trend), and where.
func worstStep(si []float64) (step float64, at int) {
	for k := 1; k+2 < len(si); k++ {
		d := si[k+1] - si[k]
		trend := (si[k] - si[k-1] + si[k+2] - si[k+1]) / 2
		if v := math.Abs(d - trend); v > step {
			step, at = v, k
		}
	}
	return step, at
}

// cyclesSweep is the brackish water concentrated 1 to 40 times in 80
// geometric steps: stoichiometric ionic strength 0.05 to 2 mol/kg, across
// the 0.1 and 1 mol/kg at which the earlier automatic choice switched
// models.
func cyclesSweep() []water.Analysis {
	var ws []water.Analysis
	for k := 0; k < 80; k++ {
		ws = append(ws, scaled(brackishWater(), math.Pow(40, float64(k)/79)))
	}
	return ws
}

// blendSweep blends the brackish water with its 30-fold concentrate
// (an RO-style brine, I ≈ 1.5 mol/kg) in 60 steps of the share.
func blendSweep() []water.Analysis {
	a, b := brackishWater(), scaled(brackishWater(), 30)
	var ws []water.Analysis
	for k := 0; k < 60; k++ {
		ws = append(ws, blended(b, a, math.Pow(float64(k)/59, 2)))
	}
	return ws
}

// TestAutomaticModelContinuity: under the automatic activity treatment no
// saturation index steps by more than tolStep beyond its trend between
// neighbouring points of a cycles sweep and a blend sweep that cross the
// ionic strengths where models used to switch (0.1 and 1 mol/kg), and one
// model serves the whole sweep.
func TestAutomaticModelContinuity(t *testing.T) {
	for _, tc := range []struct {
		name string
		ws   []water.Analysis
	}{{"cycles 1–40", cyclesSweep()}, {"blend 0–1", blendSweep()}} {
		si, models := sweepSIs(t, tc.ws, Auto, nil)
		for k, m := range models {
			if m != models[0] {
				t.Errorf("%s: point %d uses %s, point 0 %s: the automatic choice switches model", tc.name, k, m, models[0])
				break
			}
		}
		for _, m := range continuityMinerals {
			step, at := worstStep(si[m])
			t.Logf("%s: SI(%s) %.3f → %.3f, largest step beyond trend %.4f at point %d", tc.name, m, si[m][0], si[m][len(si[m])-1], step, at)
			if step > tolStep {
				t.Errorf("%s: SI(%s) steps by %.3f beyond its trend between points %d and %d; want ≤ %g", tc.name, m, step, at, at+1, tolStep)
			}
		}
	}
}

// TestContinuityCheckDetectsSwitch proves the check above can fail: with
// the earlier automatic choice (Davies up to 0.1 mol/kg on its own
// solution, Truesdell–Jones to 1 mol/kg, Pitzer above) the same
// cycles sweep has a step larger than tolStep.
func TestContinuityCheckDetectsSwitch(t *testing.T) {
	old := func(w water.Analysis) ActivityModel {
		if r, err := Speciate(w, Options{Activity: Davies}); err == nil && r.IonicStrength <= 0.1 {
			return Davies
		}
		if r, err := Speciate(w, Options{Activity: TruesdellJones}); err == nil && r.IonicStrength <= 1 {
			return TruesdellJones
		}
		return Pitzer
	}
	si, _ := sweepSIs(t, cyclesSweep(), Auto, old)
	var worst float64
	for _, m := range continuityMinerals {
		step, at := worstStep(si[m])
		t.Logf("switching at 0.1 and 1 mol/kg: SI(%s) steps by %.3f beyond its trend at point %d", m, step, at)
		worst = math.Max(worst, step)
	}
	if worst <= tolStep {
		t.Errorf("the switching choice gives steps of at most %.4f: the continuity check cannot tell it from a smooth one", worst)
	}
}
