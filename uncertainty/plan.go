package uncertainty

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/stat/distuv"

	"scalerisk/saturation"
	"scalerisk/water"
)

// DefaultConfidence is the confidence of the decisions and of the
// two-sided interval when Settings.Confidence is 0: 90 %, a 5–95 % interval.
const DefaultConfidence = 0.9

// Settings configures a Monte Carlo run. The zero value is not useful: set
// Draws.
type Settings struct {
	// Draws is the number of draws of the analysis (at least minDraws).
	Draws int
	// Seed seeds the random source (PCG); the same seed and inputs give
	// the same numbers with any number of Workers.
	Seed uint64
	// Confidence is the confidence of the decisions and of the two-sided
	// interval, in (0, 1); 0 means DefaultConfidence.
	Confidence float64
	// Relative, when above 0, is the relative standard uncertainty (a
	// fraction) of every concentration and of the alkalinity, in place of
	// the table's (a whole-run override). A sample's own figures still win.
	Relative float64
	// Workers is the number of goroutines; below 1 means 1.
	Workers int
	// Limits is the profile behind P(SI > limit); empty means the
	// "inhibitor" profile (the edge of "beyond inhibitor reach").
	Limits saturation.LimitProfile
	// KeepAll keeps every draw whatever its ion balance (see Assess).
	KeepAll bool
	// Table holds the default uncertainties; nil means Defaults().
	Table *Table
}

// minDraws is the fewest draws a run accepts: the 5 % and 95 % quantiles
// need a few dozen draws beyond them to mean anything.
const minDraws = 20

// maxDraws bounds a run (memory: draws × inputs values are held).
const maxDraws = 1_000_000

// confidence returns s.Confidence or the default.
func (s Settings) confidence() float64 {
	if s.Confidence == 0 {
		return DefaultConfidence
	}
	return s.Confidence
}

// Check validates s: the number of draws, the confidence and the
// whole-run uncertainty.
func (s Settings) Check() error {
	switch c := s.confidence(); {
	case s.Draws < minDraws || s.Draws > maxDraws:
		return fmt.Errorf("draws %d: want %d to %d", s.Draws, minDraws, maxDraws)
	case !(c > 0 && c < 1):
		return fmt.Errorf("confidence %g: want a fraction between 0 and 1", c)
	case !(s.Relative >= 0 && s.Relative < 1):
		return fmt.Errorf("relative uncertainty %g: want a fraction from 0 to below 1", s.Relative)
	}
	return nil
}

// Distribution names how an input is drawn.
type Distribution string

// The distributions of the inputs (JCGM 101:2008, 6.4).
const (
	// LogNormal draws a concentration with its median at the reported value
	// and coefficient of variation U: never negative, and symmetric in
	// log concentration, which a saturation index is nearly linear in.
	LogNormal Distribution = "log-normal"
	// Normal draws pH and temperature about the reported value with
	// standard deviation U.
	Normal Distribution = "normal"
	// Uniform draws a value reported below its detection limit evenly
	// between 0 and the limit (JCGM 101:2008, 6.4.2: only the bounds are
	// known).
	Uniform Distribution = "uniform"
)

// Origin says where an input's uncertainty came from.
type Origin string

// The origins of an uncertainty.
const (
	FromTable  Origin = "table"  // data/uncertainty.csv
	FromRun    Origin = "run"    // Settings.Relative
	FromSample Origin = "sample" // the sample's own figure in the input file
	FromLimit  Origin = "detection limit"
)

// Used is one input as a run draws it.
type Used struct {
	Input
	Distribution Distribution
	Origin       Origin
	// Value is the central value in the unit the solver takes: mol/kg of
	// water for a component, eq/kg for alkalinity, pH units, °C. For a
	// Uniform input it is the detection limit.
	Value float64
}

type target int

const (
	toComponent target = iota
	toAlkalinity
	toPH
	toTemperature
)

// planned is one input with where its draws go.
type planned struct {
	Used
	to   target
	comp water.Component
}

// plan is the set of uncertain inputs of one analysis.
type plan struct {
	central water.Analysis
	inputs  []planned
}

// newPlan lists the uncertain inputs of a: every measured component total,
// the alkalinity, the pH and the temperature, with the uncertainty of the
// sample (a.Uncertainty), of the run (s.Relative, concentrations and
// alkalinity only) or of the table, in that order of precedence. A component reported only below its detection limit is drawn
// uniformly between 0 and the limit.
func newPlan(a water.Analysis, s Settings) (plan, error) {
	t := s.Table
	if t == nil {
		t = Defaults()
	}
	p := plan{central: a}
	// own returns the sample's own figure for key, in the unit of in.
	own := func(in Input, key string) (Input, bool) {
		u, ok := a.Uncertainty[key]
		if ok {
			in.U, in.Source = u, "the sample's own figure"
		}
		return in, ok
	}
	relative := func(in Input, key string, ok bool) (Input, Origin, bool) {
		if mine, found := own(in, key); found {
			mine.Unit = Relative
			return mine, FromSample, true
		}
		if s.Relative > 0 {
			in.U, in.Unit, in.Source = s.Relative, Relative, "whole-run figure"
			return in, FromRun, true
		}
		return in, FromTable, ok
	}
	absolute := func(i int, key string, value float64) {
		in, ok := t.row(i)
		if !ok || math.IsNaN(value) {
			return
		}
		origin := FromTable
		if mine, found := own(in, key); found {
			in, origin = mine, FromSample
		}
		to := toPH
		if in.Unit == Celsius {
			to = toTemperature
		}
		p.inputs = append(p.inputs, planned{Used: Used{Input: in, Distribution: Normal, Origin: origin, Value: value}, to: to})
	}
	for c := range water.NumComponents {
		if !a.Measured[c] || (c == water.C && !a.CarbonKnown) {
			continue
		}
		if lim, ok := detectionLimit(a, c); ok {
			p.inputs = append(p.inputs, planned{Used: Used{
				Input:        Input{Name: c.String(), Unit: Relative, Source: "below the detection limit"},
				Distribution: Uniform, Origin: FromLimit, Value: lim}, to: toComponent, comp: c})
			continue
		}
		in, _ := t.component(c)
		if in.Name == "" {
			in.Name = c.String()
		}
		in, origin, ok := relative(in, c.String(), in.U > 0)
		if !ok || !(a.Totals[c] > 0) {
			continue
		}
		p.inputs = append(p.inputs, planned{Used: Used{Input: in, Distribution: LogNormal,
			Origin: origin, Value: a.Totals[c]}, to: toComponent, comp: c})
	}
	if alk := a.Alkalinity; alk > 0 {
		in, ok := t.row(t.alk)
		if in, origin, ok := relative(in, "alkalinity", ok); ok {
			in.Name = "alkalinity"
			p.inputs = append(p.inputs, planned{Used: Used{Input: in, Distribution: LogNormal,
				Origin: origin, Value: alk}, to: toAlkalinity})
		}
	}
	absolute(t.ph, "pH", a.PH)
	absolute(t.temp, "temperature", a.Temperature)
	if len(p.inputs) == 0 {
		return plan{}, fmt.Errorf("%s: no input carries an uncertainty", a.Name)
	}
	return p, nil
}

// detectionLimit returns the detection limit of component c, mol/kg of
// water, when a's only measurement of c was reported below it.
func detectionLimit(a water.Analysis, c water.Component) (float64, bool) {
	var bdl *water.Measurement
	n := 0
	for i, m := range a.Entered {
		comp, ok := water.ParseComponent(m.Analyte.Component)
		if !ok || comp != c {
			continue
		}
		n++
		if m.BelowDetection {
			bdl = &a.Entered[i]
		}
	}
	if n != 1 || bdl == nil || !(bdl.Limit > 0) {
		return 0, false
	}
	if bdl.Value > 0 {
		return a.Totals[c] * bdl.Limit / bdl.Value, true
	}
	// Taken as zero: convert the limit the way the reader converts values.
	mol, err := bdl.Unit.Amount(*bdl.Analyte, bdl.Limit, water.Analytes())
	if err != nil {
		return 0, false
	}
	switch bdl.Unit.Basis {
	case water.PerLitre:
		mol /= a.WaterPerLitre
	case water.PerKgSolution:
		mol *= a.Density / a.WaterPerLitre
	}
	return mol, mol > 0
}

// draws returns n draws of the plan's inputs from one PCG source seeded
// with seed, draw-major: values[i][j] is input j of draw i. The order of
// the calls to the source is fixed, so the numbers do not depend on how the
// draws are later shared among workers.
func (p plan) draws(n int, seed uint64) [][]float64 {
	src := rand.NewPCG(seed, pcgStream)
	k := len(p.inputs)
	flat := make([]float64, n*k)
	out := make([][]float64, n)
	dists := make([]distuv.Rander, k)
	for j, in := range p.inputs {
		switch in.Distribution {
		case LogNormal:
			// Coefficient of variation U: σ² = ln(1 + U²); median at the value.
			dists[j] = distuv.LogNormal{Mu: math.Log(in.Value), Sigma: math.Sqrt(math.Log1p(in.U * in.U)), Src: src}
		case Normal:
			dists[j] = distuv.Normal{Mu: in.Value, Sigma: in.U, Src: src}
		case Uniform:
			dists[j] = distuv.Uniform{Min: 0, Max: in.Value, Src: src}
		}
	}
	for i := range out {
		out[i] = flat[i*k : (i+1)*k : (i+1)*k]
		for j := range dists {
			out[i][j] = dists[j].Rand()
		}
	}
	return out
}

// pcgStream is the second word of the PCG state: a fixed constant, so that
// the reported seed alone fixes the draws.
const pcgStream = 0x5ca1e215c

// apply returns the central analysis with the draw's values in place. The
// temperature shift moves the pH measurement temperature with it (one
// thermometer reading). Slices are dropped: a draw needs only the numbers.
func (p plan) apply(values []float64) water.Analysis {
	a := p.central
	a.Entered, a.BelowDetection, a.Warnings = nil, nil, nil
	for j, in := range p.inputs {
		v := values[j]
		switch in.to {
		case toComponent:
			a.Totals[in.comp] = v
		case toAlkalinity:
			a.Alkalinity = v
		case toPH:
			a.PH = v
		case toTemperature:
			a.PHTemperature += v - a.Temperature
			a.Temperature = v
		}
	}
	return a
}

// regressor returns input j of a draw on the scale the sensitivity fit
// uses: the logarithm of a log-normal input, the value otherwise.
func (p plan) regressor(j int, v float64) float64 {
	if p.inputs[j].Distribution == LogNormal {
		return math.Log(v)
	}
	return v
}
