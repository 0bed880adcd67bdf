package plan

import (
	"math"

	"scalerisk/saturation"
	"scalerisk/water"
)

// Sweep is one sweep behind a chart: the points from From to To along its
// axis and how many of them could not be computed.
type Sweep struct {
	From, To float64
	Points   []saturation.Point
	// FromSearch reports that the points are those of the highest-cycles
	// search (under its carbonate rule) rather than a sweep of their own.
	FromSearch bool
	// Failed counts the points without a result; FirstErr is the error of
	// the first of them (nil when it had none).
	Failed   int
	FirstErr error
}

// Computed counts the points with a result.
func (s Sweep) Computed() int { return len(s.Points) - s.Failed }

// newSweep counts the failed points of pts.
func newSweep(from, to float64, pts []saturation.Point) Sweep {
	sw := Sweep{From: from, To: to, Points: pts}
	for _, p := range pts {
		if p.Err != nil || p.Result == nil {
			sw.Failed++
			if sw.FirstErr == nil {
				sw.FirstErr = p.Err
			}
		}
	}
	return sw
}

// Points of the sweeps.
const (
	TemperaturePoints = 15
	CyclePoints       = 15
	DosePoints        = 13
)

// HotEnd is the end of the temperature axis of a sample at bulk °C: the
// skin temperature, or 20 °C above the sample when it is within 5 °C of it.
func (s Settings) HotEnd(bulk float64) float64 {
	hot := s.Skin()
	if hot < bulk+5 {
		hot = bulk + 20
	}
	return hot
}

func temperatureStep(p *Sample, s Settings) error {
	bulk := p.Result.Temperature
	hot := s.HotEnd(bulk)
	pts, err := saturation.Sweep(p.Input, saturation.Axis{Var: saturation.VaryTemperature,
		Values: saturation.Range(bulk, hot, TemperaturePoints)}, nil, s.Speciation)
	if err != nil {
		return err
	}
	p.Temperature = newSweep(bulk, hot, pts)
	return nil
}

func cyclesSweepStep(p *Sample, s Settings) error {
	if c := p.CyclesAnswer; c != nil && len(c.Points) > 1 {
		// The points of the highest-cycles search, under its carbonate rule.
		hi := 1.0
		var pts []saturation.Point
		for _, cp := range c.Points {
			pts = append(pts, saturation.Point{X: cp.Cycles, Y: math.NaN(), Result: cp.Result, Err: cp.Err})
			hi = math.Max(hi, cp.Cycles)
		}
		p.Cycles = newSweep(1, hi, pts)
		p.Cycles.FromSearch = true
		return nil
	}
	pts, err := saturation.Sweep(p.Input, saturation.Axis{Var: saturation.VaryCycles,
		Values: saturation.Range(1, s.Cycles(), CyclePoints), Rule: s.CyclesRule}, nil, s.Speciation)
	if err != nil {
		return err
	}
	p.Cycles = newSweep(1, s.Cycles(), pts)
	return nil
}

func doseSweepStep(p *Sample, s Settings) error {
	reagent := s.ReagentOrDefault()
	top := s.MaxDose
	if top == 0 {
		top = AutoDose(p.Result, reagent, s.Strength)
	}
	pts, err := saturation.Sweep(p.Input, saturation.Axis{Var: saturation.VaryDose,
		Values: saturation.Range(0, top, DosePoints), Reagent: reagent, Strength: s.Strength}, nil, s.Speciation)
	if err != nil {
		return err
	}
	p.Dose = newSweep(0, top, pts)
	return nil
}

// autoDoseShare is the share of the alkalinity the automatic dose axis
// reaches: most of it, but short of the steep fall of pH near the end
// point.
const autoDoseShare = 0.8

// AutoDose is the end of the dose axis, mg/L of product: the dose that
// would change the alkalinity of r by 80 %, rounded up to a round number;
// 100 mg/L when the reagent does not change alkalinity or the water has
// none.
func AutoDose(r *saturation.Result, reagent water.Reagent, strength float64) float64 {
	alk := r.Analysis.AlkalinityAsCaCO3()
	factor := math.Abs(reagent.AlkalinityFactor(strength))
	if !finite(alk) || alk <= 0 || !(factor > 0) {
		return 100
	}
	return roundUp(autoDoseShare * alk / factor)
}

// roundUp rounds x > 0 up to a multiple of a twentieth of its power of
// ten (153 → 155, 1234 → 1250, 7.12 → 7.15).
func roundUp(x float64) float64 {
	if !(x > 0) || !finite(x) {
		return 1
	}
	step := math.Pow(10, math.Floor(math.Log10(x))) / 20
	v := math.Ceil(x/step*(1-1e-12)) * step
	return math.Round(v*1e6) / 1e6
}
