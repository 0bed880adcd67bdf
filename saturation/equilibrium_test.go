package saturation

import (
	"math"
	"math/rand/v2"
	"testing"

	"scalerisk/water"
)

// equilibriumAgreement is the relative tolerance within which the
// equilibrium solve and the bracketing search must find the same amount:
// both solve to about 1e-8 of the amount (eqTolerance, searchTolerance).
const equilibriumAgreement = 1e-6

// TestEquilibriumSolveAgreesWithSearch: for random waters, the amount of
// each supersaturated mineral that precipitates alone (and, for calcite,
// the CCPP either way) found by the equilibrium solve equals the one Brent's
// method finds over whole speciations; a full speciation of the water with
// that amount removed has SI 0. Most searches must take the fast path.
func TestEquilibriumSolveAgreesWithSearch(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	sp := NewSpeciator(nil)
	searches, fallbacks := 0, 0
	for w := 0; w < 60; w++ {
		a := randomWater(rng)
		r, err := sp.Speciate(a, Options{})
		if err != nil {
			continue
		}
		for _, mr := range r.Minerals {
			if mr.SI <= 0 && mr.Name != "calcite" {
				continue
			}
			sr, err := sp.newSearch(r)
			if err != nil {
				t.Fatal(err)
			}
			i, _ := sr.mineral(mr.Name)
			want, werr := sr.bracketed(i, mr.SI)
			sr.reset()
			x := sr.x[:1]
			err = sr.s.solveEquilibrium(sr.p, []int{i}, x)
			searches++
			if err != nil || werr != nil {
				if werr == nil {
					fallbacks++
				}
				continue
			}
			got := x[0]
			if d := math.Abs(got - want); d > equilibriumAgreement*math.Abs(want)+1e-12 {
				t.Errorf("water %d, %s (SI %.3f): equilibrium solve %.10g mol/kg, bracketing search %.10g", w, mr.Name, mr.SI, got, want)
			}
			// Independently: remove it and speciate in full.
			after := sp.model.removeMinerals(r.Analysis, []int{sp.model.mineralIdx[mr.Name]}, []float64{got})
			r2, err := sp.Speciate(after, Options{AtTemperature: true, Temperature: r.Temperature, Activity: r.Activity})
			if err != nil {
				t.Errorf("water %d, %s: %v", w, mr.Name, err)
				continue
			}
			if si, _ := r2.SI(mr.Name); math.Abs(si) > 1e-6 {
				t.Errorf("water %d: after removing %.6g mol/kg of %s, SI = %.2g, want 0 ± 1e-6", w, got, mr.Name, si)
			}
		}
	}
	t.Logf("%d searches, %d fell back on the bracketing search", searches, fallbacks)
	if searches < 50 || fallbacks > searches/10 {
		t.Errorf("%d of %d equilibrium solves failed, want at most a tenth", fallbacks, searches)
	}
}

// TestJointActiveSet: the joint equilibrium of random waters meets its
// conditions, checked by a full speciation of the water with the amounts
// removed: every amount ≥ 0, each mineral with an amount saturated
// (|SI| ≤ 1e-6), none of the others supersaturated beyond 1e-6.
func TestJointActiveSet(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	sp := NewSpeciator(nil)
	checked := 0
	for w := 0; w < 200; w++ {
		a := randomWater(rng)
		r, err := sp.Speciate(a, Options{})
		if err != nil {
			continue
		}
		var cand []int
		for _, mr := range r.Minerals {
			if reach, ok := InhibitorReach(mr.Name); mr.SI > 0 && !(ok && reach.Slow) {
				cand = append(cand, sp.model.mineralIdx[mr.Name])
			}
		}
		cand = competing(sp.model, r, cand)
		if len(cand) < 2 {
			continue
		}
		sr, _ := sp.newSearch(r)
		x, err := sr.joint(cand)
		if err != nil {
			t.Errorf("water %d: %v", w, err)
			continue
		}
		// The fallback, Newton with a finite-difference Jacobian, finds the
		// same amounts (it stops at |SI| < 1e-8).
		own := make([]int, len(cand)) // the minerals in the search's model
		for k, i := range cand {
			own[k], _ = sr.mineral(sp.model.minerals[i].name)
		}
		if y, err := sr.jointByDifferences(own); err != nil {
			t.Errorf("water %d: fallback: %v", w, err)
		} else {
			for k := range x {
				if math.Abs(y[k]-x[k]) > 1e-5*math.Abs(x[k])+1e-12 {
					t.Errorf("water %d: %s: active set %.8g mol/kg, fallback %.8g", w, sp.model.minerals[cand[k]].name, x[k], y[k])
				}
			}
		}
		after := sp.model.removeMinerals(r.Analysis, cand, x)
		r2, err := sp.Speciate(after, Options{AtTemperature: true, Temperature: r.Temperature, Activity: r.Activity})
		if err != nil {
			t.Errorf("water %d: %v", w, err)
			continue
		}
		checked++
		for k, i := range cand {
			name := sp.model.minerals[i].name
			si, _ := r2.SI(name)
			switch {
			case x[k] < 0:
				t.Errorf("water %d: %s amount %g < 0", w, name, x[k])
			case x[k] > 0 && math.Abs(si) > 1e-6:
				t.Errorf("water %d: %s precipitated %g mol/kg but SI %.2g", w, name, x[k], si)
			case x[k] == 0 && si > 1e-6:
				t.Errorf("water %d: %s left out but SI %.2g", w, name, si)
			}
		}
	}
	if checked < 10 {
		t.Errorf("only %d waters with two or more minerals checked", checked)
	}
}

// removeMinerals (the tests' independent way to precipitate) returns water a with amounts x[k] (mol/kg of water) of
// minerals idx[k] taken out: each component total falls by x times the
// mineral's coefficient, alkalinity by x times the mineral's alkalinity
// (its coefficients on the masters weighted by their alkalinity: 2 per
// carbonate, −1 per H⁺, so 2 for CaCO3 and Mg(OH)2, 0 for CaSO4).
func (m *Model) removeMinerals(a water.Analysis, idx []int, x []float64) water.Analysis {
	b := a
	for k, i := range idx {
		mn := &m.minerals[i]
		for _, nt := range mn.nu {
			if nt.j == 0 {
				b.Alkalinity += x[k] * nt.coef // −Σν·alk with alk(H+) = −1
				continue
			}
			for c := range water.NumComponents {
				if m.compMaster[c] == nt.j {
					b.Totals[c] -= x[k] * nt.coef
				}
			}
			b.Alkalinity -= x[k] * nt.coef * masterAlkalinity[m.masters[nt.j]]
		}
	}
	b.PH = math.NaN()
	return b
}
