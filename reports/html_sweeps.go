package reports

import (
	"fmt"
	"regexp"

	"scalerisk/plan"
	"scalerisk/saturation"
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
					out = append(out, "On the charts, from the first point it applies to: "+clientText(w))
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

// sweeps gathers the sweeps of a plan for the charts: the first error of
// its sweep steps, the points failed, and the minerals to chart.
func (b *builder) sweeps(s *plan.Sample) *sweepSet {
	r := s.Result
	sw := &sweepSet{bulk: r.Temperature, hot: s.Temperature.To, temp: s.Temperature.Points,
		cycles: s.Cycles.Points, maxCycles: s.Cycles.To, fromSearch: s.Cycles.FromSearch,
		dose: s.Dose.Points, maxDose: s.Dose.To}
	if s.Temperature.Points == nil {
		sw.hot = b.o.Plan.HotEnd(r.Temperature)
	}
	if s.Cycles.Points == nil {
		sw.maxCycles = b.o.Plan.Cycles()
	}
	if w := s.Window; w != nil {
		sw.gridT, sw.gridC, sw.grid = w.Temperatures, w.Cycles, w.Points
	}
	for _, part := range []string{"temperature sweep", "cycles sweep", "dose sweep", "operating window"} {
		if err := s.PartErr(part); err != nil && sw.err == nil {
			sw.err = err
		}
	}
	for _, pts := range [][]saturation.Point{sw.temp, sw.cycles, sw.dose, sw.grid} {
		for _, p := range pts {
			sw.total++
			if p.Err != nil || p.Result == nil {
				sw.failed++
				if sw.firstErr == nil {
					sw.firstErr = p.Err
				}
			}
		}
	}
	for _, name := range s.Minerals {
		if m, ok := mineralOf(r, name); ok {
			sw.minerals = append(sw.minerals, m)
		}
	}
	return sw
}

// mineralOf returns the result of mineral name in r.
func mineralOf(r *saturation.Result, name string) (saturation.MineralResult, bool) {
	for _, m := range r.Minerals {
		if m.Name == name {
			return m, true
		}
	}
	return saturation.MineralResult{}, false
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
