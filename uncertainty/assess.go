package uncertainty

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"scalerisk/saturation"
	"scalerisk/water"
)

// Run describes a Monte Carlo run: what was drawn and how many draws the
// figures rest on.
type Run struct {
	Draws      int     // asked for
	Kept       int     // computed and summarised
	Rejected   int     // left out by the ion-balance rule
	Failed     int     // whose computation failed
	Seed       uint64  // of the random source
	Confidence float64 // of the interval and the decisions
	Inputs     []Used
	Warnings   []string
}

// Quantity is the spread of one result of an assessment over the draws.
type Quantity struct {
	// Name is a mineral name ("calcite"), an index key ("lsi", "rsi",
	// "psi", "lsi_simplified", "stiff_davis", "larson_skold") or "ph".
	Name    string
	Mineral bool
	// Central is the result of the analysis as reported.
	Central float64
	Interval
	// PPositive is the fraction of draws with SI > 0 (minerals; NaN for
	// indices).
	PPositive float64
	// Limit is the mineral's limit in Settings.Limits and PAboveLimit the
	// fraction of draws above it; both NaN when the profile has none.
	Limit, PAboveLimit float64
	Sensitivity        Sensitivity
}

// Summary is the Monte Carlo assessment of one water.
type Summary struct {
	Run
	LimitProfile string
	// Quantities lists the minerals in the central result's order, then
	// the classic indices and the pH at the evaluation temperature.
	Quantities []Quantity
}

// Quantity returns the summary of the result called name.
func (s *Summary) Quantity(name string) (Quantity, bool) {
	for _, q := range s.Quantities {
		if q.Name == name {
			return q, true
		}
	}
	return Quantity{}, false
}

// indexOutputs are the classic indices a draw records, by their JSON keys.
var indexOutputs = []struct {
	key string
	get func(saturation.Indices) float64
}{
	{"lsi", func(ix saturation.Indices) float64 { return ix.LSI }},
	{"lsi_simplified", func(ix saturation.Indices) float64 { return ix.LSISimplified }},
	{"rsi", func(ix saturation.Indices) float64 { return ix.RSI }},
	{"psi", func(ix saturation.Indices) float64 { return ix.PSI }},
	{"stiff_davis", func(ix saturation.Indices) float64 { return ix.StiffDavis }},
	{"larson_skold", func(ix saturation.Indices) float64 { return ix.LarsonSkold }},
}

// Assess draws s.Draws analyses of a (see Settings and the table
// data/uncertainty.csv), speciates each under opt with the activity model
// of the central result, and summarises every saturation index, the
// classic indices (without the CCPP, which needs a search per draw) and the
// pH at the evaluation temperature: median, interval, P(SI > 0),
// P(SI > limit) and a sensitivity ranking.
//
// Every draw is warm-started from the central solution: the draws are
// shared among workers in fixed chunks, and each chunk's solver first
// solves the water as reported. No table is read again.
//
// Draws whose ion balance is far from balance are left out (balanceRule);
// s.KeepAll keeps them. central is the assessment of a as reported (its
// Result must be set).
func Assess(central saturation.Assessment, opt saturation.Options, s Settings) (*Summary, error) {
	if err := s.Check(); err != nil {
		return nil, err
	}
	if central.Result == nil {
		return nil, errors.New("uncertainty: the water as reported has no result")
	}
	limits, err := limitsOf(s)
	if err != nil {
		return nil, err
	}
	a := central.Input
	p, err := newPlan(a, s)
	if err != nil {
		return nil, err
	}
	opt.Activity = central.Result.Activity
	minerals := central.Result.Minerals
	nOut := len(minerals) + len(indexOutputs) + 1
	eval := func(sp *saturation.Speciator, w water.Analysis, out []float64) (string, error) {
		r, err := sp.Speciate(w, opt)
		if err != nil {
			return "", err
		}
		k := 0
		for i, m := range minerals {
			out[i] = math.NaN()
			for k < len(r.Minerals) && r.Minerals[k].Name != m.Name {
				k++
			}
			if k < len(r.Minerals) {
				out[i] = r.Minerals[k].SI
			}
		}
		ix, _ := sp.ClassicIndicesNoCCPP(r)
		for i, io := range indexOutputs {
			out[len(minerals)+i] = io.get(ix)
		}
		out[nOut-1] = r.PH
		return "", nil
	}
	warm := func(sp *saturation.Speciator) { _, _ = sp.Speciate(a, opt) }
	smp := run(p, s, opt.Model, nOut, warm, eval)
	if len(smp.out) < minDraws {
		return nil, fmt.Errorf("%s: only %d of %d draws could be computed", a.Name, len(smp.out), s.Draws)
	}
	sum := &Summary{Run: runOf(smp, s), LimitProfile: limits.Name}
	sens := sensitivities(smp)
	conf := s.confidence()
	for i, m := range minerals {
		col := column(smp, i)
		q := Quantity{Name: m.Name, Mineral: true, Central: m.SI, PPositive: above(col, 0),
			Limit: math.NaN(), PAboveLimit: math.NaN(), Sensitivity: sens[i]}
		q.Interval, _ = interval(col, conf)
		if l, ok := limits.Lookup("si:" + m.Name); ok {
			q.Limit, q.PAboveLimit = l.Max, above(col, l.Max)
		}
		sum.Quantities = append(sum.Quantities, q)
	}
	ix := central.Indices
	for i, io := range indexOutputs {
		if ix == nil || math.IsNaN(io.get(*ix)) {
			continue
		}
		o := len(minerals) + i
		q := Quantity{Name: io.key, Central: io.get(*ix), PPositive: math.NaN(), Limit: math.NaN(),
			PAboveLimit: math.NaN(), Sensitivity: sens[o]}
		q.Interval, _ = interval(column(smp, o), conf)
		sum.Quantities = append(sum.Quantities, q)
	}
	q := Quantity{Name: "ph", Central: central.Result.PH, PPositive: math.NaN(), Limit: math.NaN(),
		PAboveLimit: math.NaN(), Sensitivity: sens[nOut-1]}
	q.Interval, _ = interval(column(smp, nOut-1), conf)
	sum.Quantities = append(sum.Quantities, q)
	return sum, nil
}

// limitsOf returns s.Limits or the embedded inhibitor profile.
func limitsOf(s Settings) (saturation.LimitProfile, error) {
	if s.Limits.Name != "" || len(s.Limits.Limits) > 0 {
		return s.Limits, nil
	}
	return saturation.LimitProfileNamed("inhibitor")
}

// runOf describes the run behind smp.
func runOf(smp sample, s Settings) Run {
	r := Run{Draws: s.Draws, Kept: len(smp.out), Rejected: smp.rejected, Failed: smp.failed,
		Seed: s.Seed, Confidence: s.confidence(), Warnings: smp.warnings}
	for _, in := range smp.plan.inputs {
		r.Inputs = append(r.Inputs, in.Used)
	}
	return r
}

// decisive is the band of probability in which a result is still in doubt:
// between 5 % and 95 % of the draws on either side of 0 or of the limit.
const decisive = 0.05

// Narrowing returns the input whose uncertainty matters most to the
// minerals whose verdict is in doubt — SI > 0 or SI > limit in more than
// 5 % and less than 95 % of the draws — ranked by Σ share × variance over
// them; when no verdict is in doubt, over every mineral. It returns the
// input and the minerals in doubt; "" when nothing varies.
func (s *Summary) Narrowing() (input string, inDoubt []string) {
	doubtful := func(p float64) bool { return p > decisive && p < 1-decisive }
	for _, q := range s.Quantities {
		if q.Mineral && (doubtful(q.PPositive) || doubtful(q.PAboveLimit)) {
			inDoubt = append(inDoubt, q.Name)
		}
	}
	weight := map[string]float64{}
	for _, q := range s.Quantities {
		if !q.Mineral || (len(inDoubt) > 0 && !slices.Contains(inDoubt, q.Name)) {
			continue
		}
		for _, sh := range q.Sensitivity.Shares {
			weight[sh.Input] += sh.Share * q.SD * q.SD
		}
	}
	best := 0.0
	for _, in := range s.Inputs {
		if w := weight[in.Name]; w > best {
			input, best = in.Name, w
		}
	}
	return input, inDoubt
}
