package uncertainty

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/stat"

	"scalerisk/saturation"
	"scalerisk/water"
)

// Frequency is how often one outcome occurs among the draws.
type Frequency struct {
	Name     string
	Fraction float64
}

// CyclesSummary is the Monte Carlo answer of a cycles search.
type CyclesSummary struct {
	Run
	// Central is the highest cycles of the analysis as reported.
	Central float64
	// AtConfidence is the highest cycles at which every limit holds in at
	// least Confidence of the draws: the (1 − Confidence) empirical
	// quantile of the draws' highest cycles (gonum stat.Quantile,
	// Empirical). 1 means no concentration is safe with that confidence.
	AtConfidence float64
	// Interval spreads the draws' highest cycles.
	Interval
	// PCentral is the fraction of draws whose limits still hold at Central.
	PCentral float64
	// Limiting lists the quantities that limit the draws, most frequent
	// first ("" counts draws that reach the search's end).
	Limiting    []Frequency
	Sensitivity Sensitivity
}

// Cycles repeats the cycles search of central (saturation.MaxCycles, with
// its profile and carbonate rule, up to maxN in steps of step) on each draw
// of makeup water a under opt, and summarises the highest cycles. Each draw
// runs the search warm-started within it, first only a little past the
// central answer (drawCycles): the cost is about s.Draws short searches,
// shared among s.Workers.
func Cycles(a water.Analysis, central *saturation.CyclesResult, maxN, step float64, opt saturation.Options, s Settings) (*CyclesSummary, error) {
	if err := s.Check(); err != nil {
		return nil, err
	}
	if central == nil {
		return nil, errors.New("uncertainty: no central cycles result")
	}
	p, err := newPlan(a, s)
	if err != nil {
		return nil, err
	}
	eval := func(_ *saturation.Speciator, w water.Analysis, out []float64) (string, error) {
		r, err := drawCycles(w, central, maxN, step, opt)
		if err != nil {
			return "", err
		}
		out[0] = r.MaxCycles
		if len(r.Exceeded) > 0 {
			return r.Exceeded[0], nil
		}
		return r.Limiting, nil
	}
	smp := run(p, s, opt.Model, 1, nil, eval)
	if len(smp.out) < minDraws {
		return nil, fmt.Errorf("%s: only %d of %d draws could be computed", a.Name, len(smp.out), s.Draws)
	}
	col := column(smp, 0)
	sum := &CyclesSummary{Run: runOf(smp, s), Central: central.MaxCycles}
	var sorted []float64
	sum.Interval, sorted = interval(col, s.confidence())
	sum.AtConfidence = stat.Quantile(1-s.confidence(), stat.Empirical, sorted, nil)
	sum.PCentral = 1 - below(col, central.MaxCycles-cyclesTolerance)
	sum.Limiting = frequencies(smp.labels)
	sum.Sensitivity = sensitivities(smp)[0]
	return sum, nil
}

// drawCycles is saturation.MaxCycles for one draw, searched first only up
// to a grid point past 1.5 times the central answer: the draws' answers
// lie near the central one, and the grid below that point is the full
// search's, so the first crossing — the answer — is the same (to the
// search's tolerance). Only a draw that reaches that point with every
// limit held is searched again to maxN.
func drawCycles(w water.Analysis, central *saturation.CyclesResult, maxN, step float64, opt saturation.Options) (*saturation.CyclesResult, error) {
	if step <= 0 {
		step = 0.5 // MaxCycles' default
	}
	short := 1 + math.Ceil((cyclesReach*central.MaxCycles-1)/step)*step
	if short < maxN && central.MaxCycles < maxN {
		r, err := saturation.MaxCycles(w, central.Profile, central.Rule, short, step, opt)
		if err != nil || r.Limiting != "" || len(r.Exceeded) > 0 || r.MaxCycles < short {
			return r, err
		}
	}
	return saturation.MaxCycles(w, central.Profile, central.Rule, maxN, step, opt)
}

// cyclesReach is how far past the central answer, as a multiple, the
// first search of a draw goes.
const cyclesReach = 1.5

// cyclesTolerance is the slack, in cycles, of "the limits still hold at
// the central answer": the search refines its crossing to 1e-4.
const cyclesTolerance = 1e-3

// DoseSummary is the Monte Carlo answer of a dose search.
type DoseSummary struct {
	Run
	// Central is the dose of the analysis as reported, mg/L of product.
	Central float64
	// AtConfidence is the dose that reaches the target in at least
	// Confidence of the draws: the Confidence empirical quantile of the
	// doses the draws need (0 for a draw already at or beyond the target).
	// +Inf when more than 1 − Confidence of the draws cannot reach it.
	AtConfidence float64
	// Interval spreads the doses the draws need (reachable draws only).
	Interval
	// PCentral is the fraction of draws the central dose brings to the
	// target; PUnreachable the fraction no dose below 10 g/L brings there.
	PCentral, PUnreachable float64
	Sensitivity            Sensitivity
}

// Dose repeats the dose search of central (saturation.DoseToTarget, same
// reagent, strength and target) on each draw of water a under opt, and
// summarises the dose each draw needs. Each draw runs the whole search.
func Dose(a water.Analysis, central *saturation.DoseResult, opt saturation.Options, s Settings) (*DoseSummary, error) {
	if err := s.Check(); err != nil {
		return nil, err
	}
	if central == nil {
		return nil, errors.New("uncertainty: no central dose result")
	}
	p, err := newPlan(a, s)
	if err != nil {
		return nil, err
	}
	eval := func(_ *saturation.Speciator, w water.Analysis, out []float64) (string, error) {
		r, err := saturation.DoseToTarget(w, central.Reagent, central.Strength, central.Target, opt)
		switch {
		case err != nil:
			return "", err
		case r.Reached:
			out[0] = r.Dose
		case r.Beyond:
			out[0] = 0
		default:
			out[0] = math.Inf(1)
		}
		return "", nil
	}
	smp := run(p, s, opt.Model, 1, nil, eval)
	if len(smp.out) < minDraws {
		return nil, fmt.Errorf("%s: only %d of %d draws could be computed", a.Name, len(smp.out), s.Draws)
	}
	col := column(smp, 0)
	sum := &DoseSummary{Run: runOf(smp, s), Central: central.Dose}
	all := slices.Clone(col)
	slices.Sort(all)
	sum.AtConfidence = stat.Quantile(s.confidence(), stat.Empirical, all, nil)
	finite := make([]float64, 0, len(col))
	for _, d := range col {
		if !math.IsInf(d, 1) {
			finite = append(finite, d)
		}
	}
	sum.Interval, _ = interval(finite, s.confidence())
	sum.PUnreachable = 1 - float64(len(finite))/float64(len(col))
	sum.PCentral = below(col, central.Dose*(1+doseTolerance)+doseTolerance)
	sum.Sensitivity = sensitivities(smp)[0]
	return sum, nil
}

// doseTolerance is the relative (and absolute, mg/L) slack of "the central
// dose reaches the target": the search refines its dose to 1e-6.
const doseTolerance = 1e-4

// column returns output o of every computed draw.
func column(smp sample, o int) []float64 {
	col := make([]float64, len(smp.out))
	for i := range smp.out {
		col[i] = smp.out[i][o]
	}
	return col
}

// below returns the fraction of xs at or below limit.
func below(xs []float64, limit float64) float64 {
	k := 0
	for _, x := range xs {
		if x <= limit {
			k++
		}
	}
	return float64(k) / float64(len(xs))
}

// frequencies counts labels, most frequent first (ties by name).
func frequencies(labels []string) []Frequency {
	counts := map[string]int{}
	for _, l := range labels {
		counts[l]++
	}
	var out []Frequency
	for name, n := range counts {
		out = append(out, Frequency{Name: name, Fraction: float64(n) / float64(len(labels))})
	}
	slices.SortFunc(out, func(a, b Frequency) int {
		switch {
		case a.Fraction > b.Fraction:
			return -1
		case a.Fraction < b.Fraction:
			return 1
		case a.Name < b.Name:
			return -1
		case a.Name > b.Name:
			return 1
		}
		return 0
	})
	return out
}
