package reports

import (
	"fmt"
	"math"
	"regexp"

	"scalerisk/saturation"
	"scalerisk/water"
)

// digits matches the numbers of a note.
var digits = regexp.MustCompile(`[0-9.]+`)

// sweepNotes returns the warnings of the charts' points (a constant used
// beyond its fitted temperature range on the way to the skin temperature,
// say) that the sample's own warnings do not already say, once each.
func sweepNotes(sw *sweepSet, have []string) []string {
	seen := map[string]bool{}
	for _, w := range have {
		seen[w] = true
	}
	var out []string
	for _, pts := range [][]saturation.Point{sw.temp, sw.cycles, sw.dose} {
		for _, p := range pts {
			if p.Result == nil {
				continue
			}
			for _, w := range p.Result.Warnings {
				// The same note at the next point differs only in its
				// numbers: keep the first, where it starts to apply.
				key := digits.ReplaceAllString(w, "#")
				if !seen[w] && !seen[key] {
					seen[w], seen[key] = true, true
					out = append(out, "On the charts, from the first point it applies to: "+w)
				}
			}
		}
	}
	return out
}

// sweepSet is what the charts of one sample show: its saturation state
// over temperature, cycles of concentration, reagent dose, and the grid of
// temperature and cycles, as computed by saturation.Sweep.
type sweepSet struct {
	bulk, hot float64 // temperature axis, °C
	temp      []saturation.Point
	cycles    []saturation.Point
	maxCycles float64
	// fromSearch reports that cycles are the points of the treatment's
	// highest-cycles search rather than a sweep.
	fromSearch bool
	dose       []saturation.Point
	maxDose    float64
	gridT      []float64
	gridC      []float64
	grid       []saturation.Point
	minerals   []saturation.MineralResult // the minerals charted
	err        error                      // the water could not be swept
	failed     int                        // points that could not be computed
	total      int
	firstErr   error // of the first point that could not be computed
}

// Points of the sweeps.
const (
	tempPoints  = 15
	cyclePoints = 15
	dosePoints  = 13
	gridSide    = 8
)

func (b *builder) sweeps(index int, s ReportSample) *sweepSet {
	r := s.Result
	opt := b.o.Speciation
	sw := &sweepSet{bulk: r.Temperature, maxCycles: b.o.maxCycles()}
	sw.hot = b.o.skin()
	if sw.hot < sw.bulk+5 {
		sw.hot = sw.bulk + 20
	}
	temps := saturation.Range(sw.bulk, sw.hot, tempPoints)
	var err error
	if sw.temp, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryTemperature, Values: temps}, nil, opt); err != nil {
		sw.err = err
		return sw
	}
	if t := s.Treatment; t != nil && t.Cycles != nil && len(t.Cycles.Points) > 1 {
		// The points of the highest-cycles search, under its carbonate rule.
		sw.fromSearch = true
		sw.maxCycles = 1
		for _, p := range t.Cycles.Points {
			sw.cycles = append(sw.cycles, saturation.Point{X: p.Cycles, Y: math.NaN(), Result: p.Result, Err: p.Err})
			sw.maxCycles = math.Max(sw.maxCycles, p.Cycles)
		}
	} else {
		sw.cycles, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryCycles,
			Values: saturation.Range(1, sw.maxCycles, cyclePoints), Rule: b.o.CyclesRule}, nil, opt)
		if err != nil {
			sw.err = err
			return sw
		}
	}
	sw.maxDose = b.o.MaxDose
	if sw.maxDose == 0 {
		sw.maxDose = autoDose(r, b.reagent, b.o.Strength)
	}
	sw.dose, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryDose,
		Values: saturation.Range(0, sw.maxDose, dosePoints), Reagent: b.reagent, Strength: b.o.Strength}, nil, opt)
	if err != nil {
		sw.err = err
		return sw
	}
	sw.gridT = saturation.Range(sw.bulk, sw.hot, gridSide)
	sw.gridC = saturation.Range(1, sw.maxCycles, gridSide)
	sw.grid, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryTemperature, Values: sw.gridT},
		&saturation.Axis{Var: saturation.VaryCycles, Values: sw.gridC, Rule: b.o.CyclesRule}, opt)
	if err != nil {
		sw.err = err
		return sw
	}
	results := []*saturation.Result{r}
	for _, pts := range [][]saturation.Point{sw.temp, sw.cycles, sw.dose, sw.grid} {
		for _, p := range pts {
			sw.total++
			if p.Err != nil || p.Result == nil {
				sw.failed++
				if sw.firstErr == nil {
					sw.firstErr = p.Err
				}
				continue
			}
			results = append(results, p.Result)
		}
	}
	sw.minerals = chartMinerals(results)
	return sw
}

// autoDoseShare is the share of the alkalinity the automatic dose axis
// reaches: most of it, but short of the steep fall of pH near the end
// point.
const autoDoseShare = 0.8

// autoDose is the end of the dose axis, mg/L of product: the dose that
// would change the alkalinity of r by autoDoseShare, rounded up to a
// round number; 100 mg/L when the reagent does not change alkalinity or
// the water has none.
func autoDose(r *saturation.Result, reagent water.Reagent, strength float64) float64 {
	alk := r.Analysis.AlkalinityAsCaCO3()
	factor := math.Abs(reagent.AlkalinityFactor(strength))
	if !finite(alk) || alk <= 0 || !(factor > 0) {
		return 100
	}
	return roundUp(autoDoseShare * alk / factor)
}

// sweepFailed reports whether any point of a sweep failed.
func sweepFailed(pts []saturation.Point) bool {
	for _, p := range pts {
		if p.Err != nil || p.Result == nil {
			return true
		}
	}
	return false
}

// sweepWhy says why a sweep gave nothing to draw: how many of its points
// could not be computed and the first error, or that its values were not
// finite.
func sweepWhy(pts []saturation.Point) string {
	failed := 0
	var first error
	for _, p := range pts {
		if p.Err != nil || p.Result == nil {
			failed++
			if first == nil {
				first = p.Err
			}
		}
	}
	switch {
	case failed == 0:
		return "no finite value came out of its points"
	case first == nil:
		return fmt.Sprintf("%d of its %d points could not be computed", failed, len(pts))
	}
	return fmt.Sprintf("%d of its %d points could not be computed (%v)", failed, len(pts), first)
}
