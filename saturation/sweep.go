package saturation

import (
	"errors"
	"fmt"
	"math"

	"scalerisk/water"
)

// Variable is what a sweep varies.
type Variable int

// The sweep variables.
const (
	VaryTemperature Variable = iota // °C; the water re-speciated at each temperature
	VaryCycles                      // cycles of concentration (≥ 1)
	VaryDose                        // mg/L of a reagent product
	VaryFraction                    // share (0–1) of the water in a blend with Axis.Partner
)

var variableNames = [...]string{"temperature", "cycles", "dose", "fraction"}

func (v Variable) String() string { return variableNames[v] }

// ParseVariable parses "temperature", "cycles", "dose" or "fraction".
func ParseVariable(s string) (Variable, error) {
	for i, n := range variableNames {
		if s == n {
			return Variable(i), nil
		}
	}
	return 0, fmt.Errorf("unknown sweep variable %q (want temperature, cycles, dose or fraction)", s)
}

// Axis is one swept variable and its values.
type Axis struct {
	Var    Variable
	Values []float64
	// Reagent and Strength (percent; 0 means the table's usual) serve
	// VaryDose.
	Reagent  water.Reagent
	Strength float64
	// Partner is the second water of VaryFraction; Values are the share of
	// the swept water.
	Partner water.Analysis
	// Rule, when set on a VaryCycles axis, finds the carbonate state of
	// each concentrated water as MaxCycles does (natural, relation, air,
	// acid control or closed) instead of Options.Carbonate.
	Rule *CarbonateRule
}

// Point is one point of a sweep: the values of the axes (Y is NaN for a
// one-axis sweep) and the equilibrium state there, or why it failed.
type Point struct {
	X, Y    float64
	Result  *Result
	Indices Indices // classic indices without the CCPP
	Err     error
}

// Range returns n values evenly spaced from lo to hi inclusive (n ≥ 2;
// n = 1 gives lo).
func Range(lo, hi float64, n int) []float64 {
	if n <= 1 {
		return []float64{lo}
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = lo + (hi-lo)*float64(i)/float64(n-1)
	}
	return out
}

// Fix speciates a at its own state and returns the water with inorganic
// carbon and alkalinity fixed and pH as computed at its temperature: the
// starting point of every transformation (concentrate, dose, blend), which
// conserve carbon and alkalinity.
func (sp *Speciator) Fix(a water.Analysis, opt Options) (water.Analysis, *Result, error) {
	o := opt
	o.AtTemperature = false
	o.Carbonate = Closed
	r, err := sp.Speciate(a, o)
	if err != nil {
		return water.Analysis{}, nil, err
	}
	b := r.Analysis
	b.Temperature = a.Temperature
	return b, r, nil
}

// Sweep evaluates water a over axis x, or over the grid of x and y when y
// is not nil (x varying fastest), with one warm-started Speciator. Cycles,
// doses and blends are applied to the fixed water (see Fix) in that order
// (concentrate, then dose, then blend) and the result is re-speciated under
// opt: closed carbonate system unless opt says otherwise. Temperature sets
// the evaluation temperature. A point that fails carries its error; the
// sweep goes on. The error is non-nil only when a itself cannot be
// speciated or an axis is malformed.
func Sweep(a water.Analysis, x Axis, y *Axis, opt Options) ([]Point, error) {
	if len(x.Values) == 0 || (y != nil && len(y.Values) == 0) {
		return nil, errors.New("sweep: an axis has no values")
	}
	if y != nil && y.Var == x.Var {
		return nil, fmt.Errorf("sweep: both axes vary %s", x.Var)
	}
	sp := NewSpeciator(opt.Model)
	base, _, err := sp.Fix(a, opt)
	if err != nil {
		return nil, err
	}
	var partner water.Analysis
	for _, ax := range []*Axis{&x, y} {
		if ax != nil && ax.Var == VaryFraction {
			partner, _, err = NewSpeciator(opt.Model).Fix(ax.Partner, opt)
			if err != nil {
				return nil, fmt.Errorf("sweep: blend partner: %w", err)
			}
		}
	}
	ys := []float64{math.NaN()}
	if y != nil {
		ys = y.Values
	}
	points := sweepPoints(sp, base, partner, x, y, ys, opt)
	if m, mixed := uniformModel(points, opt); mixed {
		// One model across the sweep: the automatic choice would switch
		// models between points and put a step into every curve.
		o := opt
		o.Activity = m
		points = sweepPoints(sp, base, partner, x, y, ys, o)
	}
	return points, nil
}

// uniformModel reports whether the automatic choice gave points of one
// sweep different activity models, and returns the one for the most
// concentrated of them (Pitzer over Truesdell–Jones over Davies).
func uniformModel(points []Point, opt Options) (ActivityModel, bool) {
	if opt.Activity != Auto {
		return opt.Activity, false
	}
	best, seen := Auto, map[ActivityModel]bool{}
	for _, p := range points {
		if p.Result == nil {
			continue
		}
		seen[p.Result.Activity] = true
		if rank(p.Result.Activity) > rank(best) {
			best = p.Result.Activity
		}
	}
	return best, len(seen) > 1
}

// rank orders the activity models by the ionic strength they serve.
func rank(m ActivityModel) int {
	switch m {
	case Davies:
		return 1
	case TruesdellJones, BDot:
		return 2
	case Pitzer:
		return 3
	}
	return 0
}

// sweepPoints evaluates every point of a sweep.
func sweepPoints(sp *Speciator, base, partner water.Analysis, x Axis, y *Axis, ys []float64, opt Options) []Point {
	points := make([]Point, 0, len(x.Values)*len(ys))
	for _, yv := range ys {
		for _, xv := range x.Values {
			pt := Point{X: xv, Y: yv}
			settings := map[Variable]float64{x.Var: xv}
			if y != nil {
				settings[y.Var] = yv
			}
			w, o, err := applySettings(base, partner, settings, x, y, opt)
			if err == nil {
				if rule := cyclesRule(x, y); rule != nil {
					pt.Result, _, _, err = rule.apply(sp, w, o)
				} else {
					pt.Result, err = sp.Speciate(w, o)
				}
			}
			if err == nil {
				pt.Indices, _ = sp.ClassicIndicesNoCCPP(pt.Result)
			}
			pt.Err = err
			points = append(points, pt)
		}
	}
	return points
}

// cyclesRule returns the carbonate rule of the sweep's cycles axis, if any.
func cyclesRule(x Axis, y *Axis) *CarbonateRule {
	if x.Var == VaryCycles && x.Rule != nil {
		return x.Rule
	}
	if y != nil && y.Var == VaryCycles && y.Rule != nil {
		return y.Rule
	}
	return nil
}

// applySettings transforms the fixed water by the settings of one sweep
// point and returns it with the options to speciate it under.
func applySettings(base, partner water.Analysis, set map[Variable]float64, x Axis, y *Axis, opt Options) (water.Analysis, Options, error) {
	w := base
	o := opt
	axis := func(v Variable) Axis {
		if x.Var == v || y == nil {
			return x
		}
		return *y
	}
	var err error
	if n, ok := set[VaryCycles]; ok {
		if w, err = w.Concentrate(n); err != nil {
			return w, o, err
		}
	}
	if d, ok := set[VaryDose]; ok {
		ax := axis(VaryDose)
		if w, err = w.Dose(ax.Reagent, d, ax.Strength); err != nil {
			return w, o, err
		}
	}
	if f, ok := set[VaryFraction]; ok {
		if w, err = water.Blend([]water.Analysis{w, partner}, []float64{f, 1 - f}); err != nil {
			return w, o, err
		}
	}
	if t, ok := set[VaryTemperature]; ok {
		o.AtTemperature, o.Temperature = true, t
	}
	return w, o, nil
}
