package plan

import (
	"slices"

	"scalerisk/saturation"
	"scalerisk/water"
)

// ChartMineral is a mineral of ChartOrder with the components the
// laboratory must report for it to be charted.
type ChartMineral struct {
	Mineral string
	Needs   []water.Component
}

// chartOrder is the table behind ChartOrder; no code writes it.
var chartOrder = []ChartMineral{
	{"calcite", []water.Component{water.Ca}},
	{"gypsum", []water.Component{water.Ca, water.S}},
	{"silica_amorphous", []water.Component{water.Si}},
	{"barite", []water.Component{water.Ba, water.S}},
	{"celestite", []water.Component{water.Sr, water.S}},
	{"fluorite", []water.Component{water.Ca, water.F}},
	{"tricalcium_phosphate", []water.Component{water.Ca, water.P}},
}

// ChartOrder returns the fixed order of the minerals a report charts: the
// scale formers that matter for a cooling or process water (common
// practice: calcium carbonate, calcium sulfate and silica first, then the
// sulfates of barium and strontium, calcium fluoride and calcium
// phosphate), each with the components the laboratory must report for it
// to be charted. The slice and its Needs are copies: a caller may edit
// them without changing a later call.
func ChartOrder() []ChartMineral {
	out := slices.Clone(chartOrder)
	for i := range out {
		out[i].Needs = slices.Clone(out[i].Needs)
	}
	return out
}

// mineralsStep chooses the minerals the charts of a sample show: those of
// ChartOrder whose components were reported, then any other mineral past
// its limit in the sample or anywhere on its sweeps, in table order, unless
// a mineral of the same formula is already charted.
func mineralsStep(p *Sample, s Settings) error {
	prof := s.LimitProfile()
	var out []string
	for _, c := range chartOrder {
		reported := true
		for _, comp := range c.Needs {
			reported = reported && p.Input.Measured[comp]
		}
		if _, ok := p.Result.SI(c.Mineral); ok && reported {
			out = append(out, c.Mineral)
		}
	}
	past := map[string]bool{}
	results := []*saturation.Result{p.Result}
	for _, sw := range []Sweep{p.Temperature, p.Cycles, p.Dose} {
		for _, pt := range sw.Points {
			results = append(results, pt.Result)
		}
	}
	for _, r := range results {
		if r == nil {
			continue
		}
		for _, m := range r.Minerals {
			if finite(m.SI) && saturation.BandUnder(prof, m.Name, m.SI) == saturation.BeyondReach {
				past[m.Name] = true
			}
		}
	}
	formulas := map[string]bool{}
	for _, m := range p.Result.Minerals {
		if slices.Contains(out, m.Name) {
			formulas[m.Formula] = true
		}
	}
	for _, m := range p.Result.Minerals { // table order
		// A polymorph of a charted mineral (aragonite beside calcite) is
		// left to the table: it has the same limit and a lower SI.
		if past[m.Name] && !slices.Contains(out, m.Name) && !formulas[m.Formula] {
			out = append(out, m.Name)
			formulas[m.Formula] = true
		}
	}
	p.Minerals = out
	return nil
}

// Pass is a mineral that goes past its limit along a sweep.
type Pass struct {
	Sweep   string // "temperature", "cycles" or "dose"
	Mineral string
	X       float64 // the first point computed past the limit, in the axis unit
	AtStart bool    // already past at the first point
}

// passesStep finds, along the temperature, cycles and dose sweeps, the
// minerals that go past their limit under the settings' profile, and the
// first point where they do.
func passesStep(p *Sample, s Settings) error {
	prof := s.LimitProfile()
	for _, sw := range []struct {
		name string
		sw   Sweep
	}{{"temperature", p.Temperature}, {"cycles", p.Cycles}, {"dose", p.Dose}} {
		seen := map[string]bool{}
		for k, pt := range sw.sw.Points {
			if pt.Result == nil {
				continue
			}
			for _, m := range pt.Result.Minerals {
				if seen[m.Name] || !finite(m.SI) || saturation.BandUnder(prof, m.Name, m.SI) != saturation.BeyondReach {
					continue
				}
				seen[m.Name] = true
				p.Passes = append(p.Passes, Pass{Sweep: sw.name, Mineral: m.Name, X: pt.X, AtStart: k == 0})
			}
		}
	}
	return nil
}
