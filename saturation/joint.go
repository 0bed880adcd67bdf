package saturation

// The joint precipitation equilibrium of PrecipitationPotential: the
// amounts of several supersaturated minerals that precipitate together
// until each is saturated or gone. It is solved by equilibrium solves over
// an active set of minerals (joint, jointActiveSet, startingSet, join,
// independent) and, where that fails, by damped Newton with a
// finite-difference Jacobian (jointByDifferences, feasible,
// differenceStep, projectedStep). The search type and its single-mineral
// solves are in precipitate.go.

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"
)

// joint returns the amounts x, mol/kg of water, of the minerals idx
// (indices in the sp's model) removed together at their joint equilibrium,
// x ≥ 0: each mineral with x > 0 saturated, each with x = 0 at most
// saturated. It solves the equilibrium over an active set (a mineral whose
// amount comes out negative leaves it, one left out that is still
// supersaturated rejoins it); where that fails, by damped Newton with a
// finite-difference Jacobian on the saturation indices.
func (sr *search) joint(idx []int) ([]float64, error) {
	si := make([]int, len(idx)) // the minerals in the search's model
	for k, i := range idx {
		var err error
		if si[k], err = sr.mineral(sr.s.m.minerals[i].name); err != nil {
			return nil, err
		}
	}
	if x, err := sr.jointActiveSet(si); err == nil {
		return x, nil
	}
	return sr.jointByDifferences(si)
}

// jointActiveSet is joint by equilibrium solves over an active set.
func (sr *search) jointActiveSet(idx []int) ([]float64, error) {
	n := len(idx)
	x := make([]float64, n)
	active, err := sr.startingSet(idx)
	if err != nil {
		return nil, err
	}
	act, mins := make([]int, 0, n), make([]int, 0, n)
	xa, x0 := make([]float64, n), make([]float64, n)
	for round := 0; round < 3*n+3; round++ {
		act, mins, x0 = act[:0], mins[:0], x0[:0]
		for k := range idx {
			if active[k] {
				// Each round starts from the last round's amounts, the
				// negative ones at zero.
				act, mins, x0 = append(act, k), append(mins, idx[k]), append(x0, max(x[k], 0))
			}
			x[k] = 0
		}
		sr.reset()
		if len(mins) == 0 {
			if err := sr.s.solve(sr.p, true); err != nil {
				return nil, err
			}
		} else {
			sr.remove(mins, x0)
			if err := sr.s.solveEquilibrium(sr.p, mins, xa); err != nil {
				return nil, err
			}
			for q, k := range act {
				x[k] = xa[q] + x0[q]
			}
			// The most negative amount leaves the active set.
			worst, at := 0.0, -1
			for _, k := range act {
				if x[k] < worst {
					worst, at = x[k], k
				}
			}
			if at >= 0 {
				active[at] = false
				continue
			}
		}
		// The most supersaturated of the minerals left out rejoins.
		best, at := 1e-8, -1
		for k := range idx {
			if !active[k] {
				if v, ok := sr.s.mineralSI(idx[k]); ok && v > best {
					best, at = v, k
				}
			}
		}
		if at < 0 {
			return x, nil
		}
		if err := sr.join(idx, active, x, at); err != nil {
			return nil, err
		}
	}
	return nil, errors.New("the active set did not settle")
}

// startingSet returns the first active set of jointActiveSet: the minerals
// idx, most supersaturated first, each kept only when its reaction is
// linearly independent of those kept before it. Minerals whose reactions
// are dependent — a reciprocal salt pair such as calcite + celestite =
// strontianite + anhydrite — cannot in general all be saturated at once
// (the phase rule), and holding them all makes the equilibrium system
// singular.
func (sr *search) startingSet(idx []int) ([]bool, error) {
	sr.reset()
	if err := sr.s.solve(sr.p, true); err != nil {
		return nil, err
	}
	order := make([]int, len(idx))
	si := make([]float64, len(idx))
	for k := range idx {
		order[k] = k
		si[k], _ = sr.s.mineralSI(idx[k])
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(si[b], si[a]) })
	active := make([]bool, len(idx))
	var kept []int
	for _, k := range order {
		if sr.independent(append(kept, idx[k])) {
			kept = append(kept, idx[k])
			active[k] = true
		}
	}
	return active, nil
}

// join adds mineral at (an index into idx) to the active set. When its
// reaction depends on those of the active minerals, it takes the place of
// the active mineral of that dependence with the smallest amount x (the
// one nearest to dissolving), as a pivot of the phase assemblage.
func (sr *search) join(idx []int, active []bool, x []float64, at int) error {
	set := func(skip int) []int {
		var out []int
		for k := range idx {
			if active[k] && k != skip {
				out = append(out, idx[k])
			}
		}
		return append(out, idx[at])
	}
	if sr.independent(set(-1)) {
		active[at] = true
		return nil
	}
	out := -1
	for k := range idx {
		if active[k] && sr.independent(set(k)) && (out < 0 || x[k] < x[out]) {
			out = k
		}
	}
	if out < 0 {
		return fmt.Errorf("%s cannot join the minerals at saturation", sr.s.m.minerals[idx[at]].name)
	}
	active[out], active[at] = false, true
	return nil
}

// independent reports whether the reactions of the minerals (indices in
// the search's model) on the masters (H+ included) are linearly
// independent: the rank of their stoichiometric matrix, by singular values
// (gonum), equals their number.
func (sr *search) independent(minerals []int) bool {
	m := sr.s.m
	rows, cols := len(minerals), len(m.masters)
	if rows > cols {
		return false
	}
	a := mat.NewDense(rows, cols, nil)
	for r, i := range minerals {
		for _, t := range m.minerals[i].nu {
			a.Set(r, t.j, t.coef)
		}
	}
	var svd mat.SVD
	if !svd.Factorize(a, mat.SVDNone) {
		return false
	}
	vals := svd.Values(nil)
	return vals[len(vals)-1] > 1e-9*vals[0]
}

// jointByDifferences is joint by damped Newton with a finite-difference
// Jacobian and an active set, each step a solve of the water.
func (sr *search) jointByDifferences(idx []int) ([]float64, error) {
	n := len(idx)
	x := make([]float64, n)
	if n == 0 {
		return x, nil
	}
	active, err := sr.startingSet(idx)
	if err != nil {
		return nil, err
	}
	sis := func(x []float64) ([]float64, error) {
		out := make([]float64, len(x))
		if err := sr.siAfter(idx, x, out); err != nil {
			return nil, err
		}
		return out, nil
	}
	for iter := 0; iter < 100; iter++ {
		f, err := sis(x)
		if err != nil {
			return nil, err
		}
		var act []int
		worst := 0.0
		for k := range idx {
			if active[k] {
				act = append(act, k)
				worst = math.Max(worst, math.Abs(f[k]))
			}
		}
		if worst < 1e-8 {
			// Converged on the active set: a mineral left out that is
			// still supersaturated rejoins it.
			rejoined := false
			for k := range idx {
				if !active[k] && f[k] > 1e-8 {
					active[k], rejoined = true, true
				}
			}
			if !rejoined {
				return x, nil
			}
			continue
		}
		dx, err := differenceStep(sis, x, f, act)
		if err != nil {
			return nil, err
		}
		sr.projectedStep(sis, idx, x, dx, act, worst)
		// An amount pinned at zero that still wants to go negative leaves.
		for c, k := range act {
			if x[k] == 0 && dx.AtVec(c) < 0 {
				active[k] = false
			}
		}
	}
	return nil, errors.New("joint equilibrium did not converge")
}

// feasible reports whether removing x of the minerals idx leaves every
// total non-negative.
func (sr *search) feasible(idx []int, x []float64) bool {
	m := sr.s.m
	for j, t := range sr.totals {
		if j == 0 {
			continue
		}
		for k, i := range idx {
			for _, nt := range m.minerals[i].nu {
				if nt.j == j {
					t -= x[k] * nt.coef
				}
			}
		}
		if t < -1e-15 {
			return false
		}
	}
	return true
}

// differenceStep returns the Newton step of the active amounts act (index
// into x) for the saturation indices f = sis(x), with the Jacobian by
// forward differences.
func differenceStep(sis func([]float64) ([]float64, error), x, f []float64, act []int) (*mat.VecDense, error) {
	// Finite-difference Jacobian over the active amounts.
	J := mat.NewDense(len(act), len(act), nil)
	for c, k := range act {
		h := math.Max(1e-7*x[k], 1e-10)
		xh := slices.Clone(x)
		xh[k] += h
		fh, err := sis(xh)
		if err != nil {
			return nil, err
		}
		for rr, kk := range act {
			J.Set(rr, c, (fh[kk]-f[kk])/h)
		}
	}
	rhs := mat.NewVecDense(len(act), nil)
	for rr, k := range act {
		rhs.SetVec(rr, -f[k])
	}
	var dx mat.VecDense
	if err := dx.SolveVec(J, rhs); err != nil {
		return nil, fmt.Errorf("singular system: %w", err)
	}
	return &dx, nil
}

// projectedStep moves x (in place) along the step dx of the active amounts
// act, from a state whose worst active |SI| is worst.
func (sr *search) projectedStep(sis func([]float64) ([]float64, error), idx []int, x []float64, dx *mat.VecDense, act []int, worst float64) {
	// A projected step: an amount the step would take below zero stops
	// at zero (and leaves the active set below), without holding the
	// others back. The step is halved while a total would turn negative
	// or, a few times, while it does not bring the active SIs closer to
	// zero.
	lambda := 1.0
	worstAt := func(fs []float64) float64 {
		w := 0.0
		for _, k := range act {
			w = math.Max(w, math.Abs(fs[k]))
		}
		return w
	}
	for tries := 0; tries < 40; tries++ {
		xn := slices.Clone(x)
		for c, k := range act {
			xn[k] = math.Max(x[k]+lambda*dx.AtVec(c), 0)
		}
		if !sr.feasible(idx, xn) {
			lambda /= 2
			continue
		}
		if tries < 6 {
			if fn, err := sis(xn); err == nil && worstAt(fn) >= worst {
				lambda /= 2
				continue
			}
		}
		copy(x, xn)
		break
	}
}
