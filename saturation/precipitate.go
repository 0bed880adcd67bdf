package saturation

import (
	"errors"
	"fmt"
	"math"
	"slices"

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

// search re-speciates the water of a result, closed at the result's
// temperature and activity model, with amounts of minerals removed: the
// inner solve of the precipitation potential and the CCPP. It builds no
// Result and copies no analysis; its work arrays are made once per search
// and every solve starts from the solver's last solution.
//
// Amounts are found by the solver's equilibrium solve (Newton's method on
// the speciation and the amounts together, to eqTolerance: about 1e-8 of
// each amount); where that fails, by Brent's method on the saturation
// index over a bracket of amounts, to searchTolerance.
type search struct {
	s      *solver
	p      problem   // the water of the result; p.totals is a work array
	totals []float64 // the totals of the water of the result, per master
	alk    float64   // its alkalinity, eq/kg
	x      []float64 // work amounts, mol/kg
}

// searchTolerance is the bracketing fallback's tolerance on an amount,
// mol/kg of water: 1e-12 mol/kg is 1e-7 mg/L of CaCO3, far below the four
// significant figures printed.
const searchTolerance = 1e-12

// newSearch prepares the searches on the water of r (a result of this
// Speciator) as Speciate would re-speciate r.Analysis closed at
// r.Temperature under r.Activity.
func (sp *Speciator) newSearch(r *Result) (*search, error) {
	s, err := sp.engine(r.Activity)
	if err != nil {
		return nil, err
	}
	m := s.m
	a := &r.Analysis
	sr := &search{s: s, totals: make([]float64, len(m.masters)), alk: a.Alkalinity,
		x: make([]float64, maxEquilibria)}
	for c := range water.NumComponents {
		if c != water.C {
			sr.totals[m.compMaster[c]] = a.Totals[c]
		}
	}
	sr.p = problem{t: r.Temperature, model: r.Activity, totals: make([]float64, len(m.masters)),
		hRow: rowAlk, alk: a.Alkalinity, cRow: rowAbsent}
	if a.CarbonKnown && a.Totals[water.C] > 0 {
		sr.totals[m.compMaster[water.C]] = a.Totals[water.C]
		sr.p.cRow = rowMass
	}
	if math.IsNaN(a.Alkalinity) {
		sr.p.hRow = rowCharge
	}
	copy(sr.p.totals, sr.totals)
	return sr, nil
}

// mineral returns the index of mineral name in the search's model.
func (sr *search) mineral(name string) (int, error) {
	return sr.s.m.mineralIndex(name)
}

// reset sets the search's problem back to the water of the result.
func (sr *search) reset() {
	copy(sr.p.totals, sr.totals)
	sr.p.alk = sr.alk
}

// siAfter returns the saturation indices of minerals idx (into si) once
// amounts x of them are removed from the water, by one ordinary solve.
func (sr *search) siAfter(idx []int, x, si []float64) error {
	s := sr.s
	sr.reset()
	sr.remove(idx, x)
	if err := s.solve(sr.p, true); err != nil {
		return err
	}
	for k, i := range idx {
		v, ok := s.mineralSI(i)
		if !ok {
			return errVanished(s.m.minerals[i].name)
		}
		si[k] = v
	}
	return nil
}

// maxRemovable returns the most of mineral i that the water holds, mol/kg:
// the least total over its components divided by their coefficients.
func (sr *search) maxRemovable(i int) float64 {
	best := math.Inf(1)
	for _, nt := range sr.s.m.minerals[i].nu {
		if nt.j == 0 || nt.coef <= 0 {
			continue
		}
		best = math.Min(best, sr.totals[nt.j]/nt.coef)
	}
	return best
}

// toEquilibrium returns x, mol/kg of water, of mineral i (saturation index
// si0 in the water) that must precipitate (x > 0) or dissolve (x < 0) for
// the water to reach saturation with it, closed system. x0 is where the
// equilibrium solve starts: 0, or the amount of a mineral of the same
// composition that the solver has just brought to saturation (its state
// then differs from the answer by the two minerals' log K only).
func (sr *search) toEquilibrium(i int, si0, x0 float64) (float64, error) {
	if si0 == 0 {
		return 0, nil
	}
	sr.reset()
	idx := [1]int{i}
	x := sr.x[:1]
	if x0 != 0 {
		x[0] = x0
		sr.remove(idx[:], x)
	}
	if err := sr.s.solveEquilibrium(sr.p, idx[:], x); err == nil {
		x[0] += x0
		if (x[0] > 0) == (si0 > 0) && x[0] < sr.maxRemovable(i) {
			return x[0], nil
		}
	}
	return sr.bracketed(i, si0)
}

// remove takes amounts x of minerals idx out of the search's problem.
func (sr *search) remove(idx []int, x []float64) {
	m := sr.s.m
	for k, i := range idx {
		for _, nt := range m.minerals[i].nu {
			sr.p.totals[nt.j] -= x[k] * nt.coef
			sr.p.alk -= x[k] * nt.coef * m.species[nt.j].alk
		}
	}
	sr.p.totals[0] = 0
}

// bracketed is toEquilibrium by Brent's method on the saturation index.
func (sr *search) bracketed(i int, si0 float64) (float64, error) {
	idx := [1]int{i}
	var xs, si [1]float64
	f := func(x float64) (float64, error) {
		xs[0] = x
		err := sr.siAfter(idx[:], xs[:], si[:])
		return si[0], err
	}
	if si0 > 0 {
		hi := sr.maxRemovable(i) * (1 - 1e-9)
		if !(hi > 0) {
			return 0, errors.New("nothing to precipitate")
		}
		return findRoot(f, 0, hi, searchTolerance)
	}
	// Dissolution: widen until the water is saturated.
	lo := -1e-5
	for k := 0; k < 30; k++ {
		v, err := f(lo)
		if err != nil {
			return 0, err
		}
		if v >= 0 {
			return findRoot(f, lo, 0, searchTolerance)
		}
		lo *= 2
		if lo < -1 {
			break
		}
	}
	return 0, errors.New("no saturation reached by dissolving up to 1 mol/kg")
}

// mineralToEquilibrium returns x, mol/kg of water, of mineral name that
// must precipitate (x > 0) or dissolve (x < 0) for the water of r to reach
// saturation with it, closed system (see search for the method and its
// tolerance).
func (sp *Speciator) mineralToEquilibrium(r *Result, name string) (float64, error) {
	if c := sp.lastSearch; c.r == r && c.name == name {
		return c.x, c.err
	}
	if _, ok := r.SI(name); !ok {
		return 0, fmt.Errorf("%s has no saturation index in this water", name)
	}
	sr, err := sp.newSearch(r)
	if err != nil {
		return 0, err
	}
	return sp.alone(sr, r, name)
}

// alone returns the amount of mineral name that precipitates alone from the
// water of r by search sr (or dissolves, for a negative answer), reusing
// the last answer for the same question (the CCPP and calcite alone ask
// one), and starting from the last answer for a mineral of the same
// composition while the solver still holds it (calcite, aragonite,
// vaterite in turn).
func (sp *Speciator) alone(sr *search, r *Result, name string) (float64, error) {
	c := sp.lastSearch
	if c.r == r && c.name == name {
		return c.x, c.err
	}
	si0, ok := r.SI(name)
	if !ok {
		return 0, fmt.Errorf("%s has no saturation index in this water", name)
	}
	i, err := sr.mineral(name)
	if err != nil {
		return 0, err
	}
	x0 := 0.0
	if c.r == r && c.err == nil && c.solver == sr.s && c.solves == sr.s.solves &&
		slices.Equal(sr.s.m.minerals[c.i].nu, sr.s.m.minerals[i].nu) {
		x0 = c.x
	}
	x, err := sr.toEquilibrium(i, si0, x0)
	sp.lastSearch = searchMemo{r: r, name: name, i: i, x: x, err: err, solver: sr.s, solves: sr.s.solves}
	return x, err
}

// searchMemo is the last answer of alone, and the solver state it left
// (solver and its count of solves).
type searchMemo struct {
	r      *Result
	name   string
	i      int // the mineral in the solver's model
	x      float64
	err    error
	solver *solver
	solves int
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
	var alone []float64 // mol/kg, per candidate; NaN when not computed
	sr, err := sp.newSearch(r)
	for _, mr := range r.Minerals {
		if mr.SI <= 0 {
			continue
		}
		if reach, ok := InhibitorReach(mr.Name); ok && reach.Slow {
			continue
		}
		i, _ := m.mineralIndex(mr.Name)
		p := Precipitation{Mineral: mr.Name, SI: mr.SI, Alone: math.NaN(), Together: math.NaN()}
		x := math.NaN()
		if err == nil {
			x, err = sp.alone(sr, r, mr.Name)
		}
		mass, merr := water.FormulaMass(m.minerals[i].formula)
		switch {
		case err != nil:
			warnings = append(warnings, fmt.Sprintf("precipitation of %s not computed: %v", mr.Name, err))
			x, err = math.NaN(), nil
			if sr == nil {
				sr, err = sp.newSearch(r)
			}
		case merr != nil:
			warnings = append(warnings, fmt.Sprintf("precipitation of %s: %v", mr.Name, merr))
		default:
			p.Alone = x * r.Analysis.WaterPerLitre * mass * 1000
		}
		out = append(out, p)
		cand = append(cand, i)
		alone = append(alone, x)
	}
	if sr == nil {
		warnings = append(warnings, fmt.Sprintf("joint precipitation not computed: %v", err))
		return out, warnings
	}
	kept := competing(m, r, cand)
	var x []float64
	if len(kept) == 1 && !math.IsNaN(alone[slices.Index(cand, kept[0])]) {
		// One mineral alone in the joint equilibrium: its amount alone.
		x = []float64{alone[slices.Index(cand, kept[0])]}
	} else {
		x, err = sr.joint(kept)
	}
	if err != nil {
		warnings = append(warnings, fmt.Sprintf("joint precipitation not computed: %v", err))
		return out, warnings
	}
	for k := range out {
		out[k].Together = 0
		i, _ := m.mineralIndex(out[k].Mineral)
		if j := slices.Index(kept, i); j >= 0 {
			mass, _ := water.FormulaMass(m.minerals[i].formula)
			out[k].Together = x[j] * r.Analysis.WaterPerLitre * mass * 1000
		}
	}
	return out, warnings
}

// competing keeps, of candidate minerals with the same composition on the
// masters (water aside), the one with the highest SI (the first of equals).
func competing(m *Model, r *Result, cand []int) []int {
	var out []int
	for p, i := range cand {
		si, _ := r.SI(m.minerals[i].name)
		best := true
		for q, j := range cand {
			if q == p || !slices.Equal(m.minerals[i].nu, m.minerals[j].nu) {
				continue
			}
			if sj, _ := r.SI(m.minerals[j].name); sj > si || sj == si && q < p {
				best = false
				break
			}
		}
		if best {
			out = append(out, i)
		}
	}
	return out
}
