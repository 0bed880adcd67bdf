package saturation

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"

	"scalerisk/water"
)

// Precipitation is how much of one mineral would form for the water to
// reach equilibrium with it.
type Precipitation struct {
	Mineral string
	SI      float64 // saturation index before precipitation
	// Alone is the amount, mg of mineral per litre of water, that forms
	// when this mineral alone precipitates to saturation (closed system).
	Alone float64
	// Together is its amount when every supersaturated mineral that forms
	// readily precipitates at once to a joint equilibrium; NaN when the
	// joint equilibrium was not computed.
	Together float64
}

// mineralIndex returns the index of mineral name in the model.
func (m *Model) mineralIndex(name string) (int, error) {
	i, ok := m.mineralIdx[name]
	if !ok {
		return 0, fmt.Errorf("no mineral %q in the thermodynamic table", name)
	}
	return i, nil
}

// removeMinerals returns water a with amounts x[k] (mol/kg of water) of
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

// maxRemovable returns the most of mineral i that water a holds, mol/kg:
// the least total over its components divided by their coefficients.
func (m *Model) maxRemovable(a water.Analysis, i int) float64 {
	best := math.Inf(1)
	for _, nt := range m.minerals[i].nu {
		if nt.j == 0 || nt.coef <= 0 {
			continue
		}
		for c := range water.NumComponents {
			if m.compMaster[c] == nt.j {
				best = math.Min(best, a.Totals[c]/nt.coef)
			}
		}
	}
	return best
}

// internalOptions are the options of the re-speciations inside a
// precipitation or CCPP calculation: the result's temperature and activity
// model, closed carbonate system.
func internalOptions(r *Result, opt Options) Options {
	o := opt
	o.AtTemperature, o.Temperature = true, r.Temperature
	o.Carbonate = Closed
	o.Activity = r.Activity
	return o
}

// mineralToEquilibrium returns x, mol/kg of water, of mineral name that
// must precipitate (x > 0) or dissolve (x < 0) for the water of r to reach
// saturation with it, closed system, by Brent's method on x.
func (sp *Speciator) mineralToEquilibrium(r *Result, name string, opt Options) (float64, error) {
	m := sp.model
	i, err := m.mineralIndex(name)
	if err != nil {
		return 0, err
	}
	si0, ok := r.SI(name)
	if !ok {
		return 0, fmt.Errorf("%s has no saturation index in this water", name)
	}
	if si0 == 0 {
		return 0, nil
	}
	o := internalOptions(r, opt)
	base := r.Analysis
	f := func(x float64) (float64, error) {
		res, err := sp.Speciate(m.removeMinerals(base, []int{i}, []float64{x}), o)
		if err != nil {
			return 0, err
		}
		si, ok := res.SI(name)
		if !ok {
			return 0, fmt.Errorf("%s vanished from the water", name)
		}
		return si, nil
	}
	if si0 > 0 {
		hi := m.maxRemovable(base, i) * (1 - 1e-9)
		if !(hi > 0) {
			return 0, errors.New("nothing to precipitate")
		}
		return findRoot(f, 0, hi, 1e-13)
	}
	// Dissolution: widen until the water is saturated.
	lo := -1e-5
	for k := 0; k < 30; k++ {
		v, err := f(lo)
		if err != nil {
			return 0, err
		}
		if v >= 0 {
			return findRoot(f, lo, 0, 1e-13)
		}
		lo *= 2
		if lo < -1 {
			break
		}
	}
	return 0, errors.New("no saturation reached by dissolving up to 1 mol/kg")
}

// PrecipitationPotential returns, for every supersaturated mineral of r
// that forms readily (not those InhibitorReach marks slow), the amount that
// would precipitate alone and in the joint equilibrium of all of them.
// Polymorphs compete: of minerals with the same composition (calcite,
// aragonite, vaterite; gypsum and anhydrite) only the most supersaturated
// takes part in the joint equilibrium, which is solved by Newton's method
// on the amounts with an active set (a mineral whose amount would turn
// negative leaves it).
func (sp *Speciator) PrecipitationPotential(r *Result, opt Options) ([]Precipitation, []string) {
	m := sp.model
	var out []Precipitation
	var warnings []string
	var cand []int
	for _, mr := range r.Minerals {
		if mr.SI <= 0 {
			continue
		}
		if reach, ok := InhibitorReach(mr.Name); ok && reach.Slow {
			continue
		}
		i, _ := m.mineralIndex(mr.Name)
		p := Precipitation{Mineral: mr.Name, SI: mr.SI, Alone: math.NaN(), Together: math.NaN()}
		x, err := sp.mineralToEquilibrium(r, mr.Name, opt)
		mass, merr := water.FormulaMass(m.minerals[i].formula)
		switch {
		case err != nil:
			warnings = append(warnings, fmt.Sprintf("precipitation of %s not computed: %v", mr.Name, err))
		case merr != nil:
			warnings = append(warnings, fmt.Sprintf("precipitation of %s: %v", mr.Name, merr))
		default:
			p.Alone = x * r.Analysis.WaterPerLitre * mass * 1000
		}
		out = append(out, p)
		cand = append(cand, i)
	}
	cand = competing(m, r, cand)
	x, err := sp.jointEquilibrium(r, cand, opt)
	if err != nil {
		warnings = append(warnings, fmt.Sprintf("joint precipitation not computed: %v", err))
		return out, warnings
	}
	for k := range out {
		out[k].Together = 0
		i, _ := m.mineralIndex(out[k].Mineral)
		if j := slices.Index(cand, i); j >= 0 {
			mass, _ := water.FormulaMass(m.minerals[i].formula)
			out[k].Together = x[j] * r.Analysis.WaterPerLitre * mass * 1000
		}
	}
	return out, warnings
}

// competing keeps, of candidate minerals with the same composition on the
// masters (water aside), the one with the highest SI.
func competing(m *Model, r *Result, cand []int) []int {
	key := func(i int) string { return fmt.Sprint(m.minerals[i].nu) }
	best := map[string]int{}
	for _, i := range cand {
		k := key(i)
		j, ok := best[k]
		si, _ := r.SI(m.minerals[i].name)
		sj, _ := r.SI(m.minerals[j].name)
		if !ok || si > sj {
			best[k] = i
		}
	}
	var out []int
	for _, i := range cand {
		if best[key(i)] == i {
			out = append(out, i)
		}
	}
	return out
}

// jointEquilibrium solves SI_k(x) = 0 for the amounts x (mol/kg) of the
// minerals idx removed together, x ≥ 0, by damped Newton with a
// finite-difference Jacobian and an active set.
func (sp *Speciator) jointEquilibrium(r *Result, idx []int, opt Options) ([]float64, error) {
	m := sp.model
	n := len(idx)
	x := make([]float64, n)
	if n == 0 {
		return x, nil
	}
	o := internalOptions(r, opt)
	base := r.Analysis
	active := make([]bool, n)
	for k := range active {
		active[k] = true
	}
	sis := func(x []float64) ([]float64, error) {
		res, err := sp.Speciate(m.removeMinerals(base, idx, x), o)
		if err != nil {
			return nil, err
		}
		out := make([]float64, n)
		for k, i := range idx {
			v, ok := res.SI(m.minerals[i].name)
			if !ok {
				v = math.Inf(-1)
			}
			out[k] = v
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
			if !feasible(m, base, idx, xn) {
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
		// An amount pinned at zero that still wants to go negative leaves.
		for c, k := range act {
			if x[k] == 0 && dx.AtVec(c) < 0 {
				active[k] = false
			}
		}
	}
	return nil, errors.New("joint equilibrium did not converge")
}

// feasible reports whether removing x of the minerals leaves every total
// non-negative.
func feasible(m *Model, a water.Analysis, idx []int, x []float64) bool {
	b := m.removeMinerals(a, idx, x)
	for c := range water.NumComponents {
		if b.Totals[c] < -1e-15 {
			return false
		}
	}
	return true
}
