package reports

import (
	"cmp"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"scalerisk/saturation"
	"scalerisk/uncertainty"
)

// UncertainAssessment is an assessment with its Monte Carlo summary (nil
// when it was not computed: --draws 0, a bad row, a failed speciation).
type UncertainAssessment struct {
	saturation.Assessment
	Uncertainty *uncertainty.Summary
	// UncertaintyErr is why the summary could not be computed.
	UncertaintyErr error
}

// UncertaintyJSON is the "uncertainty" object of a sample: the run, and
// per mineral, index and pH the median, the interval at the run's
// confidence, the probabilities and the sensitivity ranking.
type UncertaintyJSON struct {
	RunJSON
	LimitProfile    string                  `json:"limit_profile,omitempty"`
	SaturationIndex map[string]QuantityJSON `json:"saturation_index,omitempty"`
	Indices         map[string]QuantityJSON `json:"indices,omitempty"`
	PH              *QuantityJSON           `json:"ph,omitempty"`
	Narrowing       string                  `json:"narrowing_input,omitempty"`
	InDoubt         []string                `json:"in_doubt,omitempty"`
}

// RunJSON describes a Monte Carlo run: the draws asked for, kept (after
// the ion-balance rule), rejected and failed, the seed, the confidence and
// the interval's percentiles, the inputs drawn, and warnings; Error says
// why the run could not be made.
type RunJSON struct {
	Draws           int         `json:"draws"`
	Kept            int         `json:"kept"`
	Rejected        int         `json:"rejected_ion_balance"`
	Failed          int         `json:"failed"`
	Seed            uint64      `json:"seed"`
	Confidence      float64     `json:"confidence"`
	IntervalPercent [2]float64  `json:"interval_percent"`
	Inputs          []InputJSON `json:"inputs"`
	Warnings        []string    `json:"warnings"`
	Error           *string     `json:"error,omitempty"`
}

// InputJSON is one uncertain input: its standard uncertainty in unit ("%"
// of the value, "pH" units or "C"), how it is drawn and where the figure
// comes from.
type InputJSON struct {
	Input        string  `json:"input"`
	U            float64 `json:"u"`
	Unit         string  `json:"unit"`
	Distribution string  `json:"distribution"`
	Origin       string  `json:"origin"`
}

// QuantityJSON is the spread of one result over the draws.
type QuantityJSON struct {
	Central     *float64    `json:"central"`
	Median      *float64    `json:"median"`
	Low         *float64    `json:"low"`
	High        *float64    `json:"high"`
	SD          *float64    `json:"sd"`
	PPositive   *float64    `json:"p_positive,omitempty"`
	Limit       *float64    `json:"limit,omitempty"`
	PAboveLimit *float64    `json:"p_above_limit,omitempty"`
	Sensitivity []ShareJSON `json:"sensitivity"`
	Explained   *float64    `json:"explained,omitempty"`
}

// ShareJSON is the share of a result's explained variance one input
// carries.
type ShareJSON struct {
	Input string  `json:"input"`
	Share float64 `json:"share"`
}

// uncertainSampleJSON is the JSON object of an assessment with its
// uncertainty: the assess object with one more key.
type uncertainSampleJSON struct {
	SampleJSON
	Uncertainty *UncertaintyJSON `json:"uncertainty,omitempty"`
}

// unitNames are the units of InputJSON.
var unitNames = map[uncertainty.Unit]string{uncertainty.Relative: "%", uncertainty.PHUnits: "pH", uncertainty.Celsius: "C"}

// runJSON is the run part of an uncertainty object.
func runJSON(r uncertainty.Run) RunJSON {
	tail := 100 * (1 - r.Confidence) / 2
	j := RunJSON{Draws: r.Draws, Kept: r.Kept, Rejected: r.Rejected, Failed: r.Failed, Seed: r.Seed,
		Confidence: r.Confidence, IntervalPercent: [2]float64{dec(tail, 2), dec(100-tail, 2)},
		Warnings: append([]string{}, r.Warnings...)}
	for _, in := range r.Inputs {
		u := in.U
		if in.Unit == uncertainty.Relative {
			u *= 100
		}
		if in.Distribution == uncertainty.Uniform {
			u = 0 // drawn from 0 to the detection limit, not by a figure
		}
		j.Inputs = append(j.Inputs, InputJSON{Input: in.Name, U: sig(u, 4), Unit: unitNames[in.Unit],
			Distribution: string(in.Distribution), Origin: string(in.Origin)})
	}
	return j
}

// runError is the run part of a run that could not be made.
func runError(err error) RunJSON {
	msg := err.Error()
	return RunJSON{Inputs: []InputJSON{}, Warnings: []string{}, Error: &msg}
}

// UncertaintyObject returns the "uncertainty" object of an assessment's
// summary; nil without one.
func UncertaintyObject(u UncertainAssessment) *UncertaintyJSON {
	if u.UncertaintyErr != nil {
		return &UncertaintyJSON{RunJSON: runError(u.UncertaintyErr)}
	}
	s := u.Uncertainty
	if s == nil {
		return nil
	}
	j := UncertaintyJSON{RunJSON: runJSON(s.Run)}
	j.LimitProfile = s.LimitProfile
	j.SaturationIndex = map[string]QuantityJSON{}
	j.Indices = map[string]QuantityJSON{}
	for _, q := range s.Quantities {
		qj := quantityJSON(q)
		switch {
		case q.Mineral:
			j.SaturationIndex[q.Name] = qj
		case q.Name == "ph":
			j.PH = &qj
		default:
			j.Indices[q.Name] = qj
		}
	}
	j.Narrowing, j.InDoubt = s.Narrowing()
	return &j
}

// quantityJSON rounds one quantity for JSON: results to 3 decimals,
// probabilities and shares to 3.
func quantityJSON(q uncertainty.Quantity) QuantityJSON {
	d3 := func(x float64) float64 { return dec(x, 3) }
	return QuantityJSON{Central: optional(q.Central, d3), Median: optional(q.Median, d3), Low: optional(q.Low, d3),
		High: optional(q.High, d3), SD: optional(q.SD, d3), PPositive: optional(q.PPositive, d3),
		Limit: optional(q.Limit, d3), PAboveLimit: optional(q.PAboveLimit, d3),
		Sensitivity: sharesJSON(q.Sensitivity), Explained: optional(q.Sensitivity.Explained, d3)}
}

func sharesJSON(s uncertainty.Sensitivity) []ShareJSON {
	out := []ShareJSON{}
	for _, sh := range s.Shares {
		out = append(out, ShareJSON{Input: sh.Input, Share: dec(sh.Share, 3)})
	}
	return out
}

// NewUncertainAssessWriter returns a writer of assessments with their
// uncertainty: the layout of NewAssessWriter with the "uncertainty" key in
// JSON, the columns of uncertaintyHeader after the assess columns of CSV,
// and an uncertainty block after each sample's text.
func NewUncertainAssessWriter(w io.Writer, f Format, minerals []string, opt WriteOptions) *SampleWriter[UncertainAssessment] {
	indices := []string{"lsi", "lsi_simplified", "rsi", "psi", "stiff_davis", "larson_skold"}
	return NewSampleWriter(w, f, Layout[UncertainAssessment]{
		JSON: func(u UncertainAssessment) any {
			return uncertainSampleJSON{SampleJSON: Sample(u.Assessment), Uncertainty: UncertaintyObject(u)}
		},
		Header: append(assessHeader(minerals), uncertaintyHeader(minerals, indices)...),
		CSV: func(u UncertainAssessment) [][]string {
			return [][]string{append(assessRow(u.Assessment, minerals), uncertaintyRow(u, minerals, indices)...)}
		},
		Text: func(b *strings.Builder, u UncertainAssessment) {
			writeAssessText(b, u.Assessment)
			writeUncertaintyText(b, u)
		},
		Caution: Caution,
	}, opt)
}

// uncertaintyHeader lists the CSV columns of the uncertainty: the run,
// then per mineral the interval and the probabilities, per index the
// interval.
func uncertaintyHeader(minerals, indices []string) []string {
	h := []string{"draws", "draws_kept", "seed", "confidence", "narrowing_input"}
	for _, m := range minerals {
		h = append(h, "si_"+m+"_median", "si_"+m+"_low", "si_"+m+"_high", "si_"+m+"_p_positive", "si_"+m+"_p_above_limit")
	}
	for _, ix := range indices {
		h = append(h, ix+"_low", ix+"_high")
	}
	return h
}

// uncertaintyRow is the CSV part of one sample (blank cells without a
// summary).
func uncertaintyRow(u UncertainAssessment, minerals, indices []string) []string {
	row := make([]string, 0, 5+5*len(minerals)+2*len(indices))
	j := UncertaintyObject(u)
	if j == nil || j.Error != nil {
		return append(row, make([]string, cap(row))...)
	}
	row = append(row, strconv.Itoa(j.Draws), strconv.Itoa(j.Kept), strconv.FormatUint(j.Seed, 10),
		strconv.FormatFloat(j.Confidence, 'g', -1, 64), j.Narrowing)
	for _, m := range minerals {
		q, ok := j.SaturationIndex[m]
		if !ok {
			row = append(row, "", "", "", "", "")
			continue
		}
		row = append(row, fmtG(q.Median), fmtG(q.Low), fmtG(q.High), fmtG(q.PPositive), fmtG(q.PAboveLimit))
	}
	for _, ix := range indices {
		q := j.Indices[ix]
		row = append(row, fmtG(q.Low), fmtG(q.High))
	}
	return row
}

// writeUncertaintyText writes the uncertainty block of one sample.
func writeUncertaintyText(b *strings.Builder, u UncertainAssessment) {
	if u.UncertaintyErr != nil {
		fmt.Fprintf(b, "  Uncertainty not computed: %v\n", u.UncertaintyErr)
		return
	}
	s := u.Uncertainty
	if s == nil {
		return
	}
	writeRunText(b, s.Run)
	qs := slices.Clone(s.Quantities)
	slices.SortStableFunc(qs, func(x, y uncertainty.Quantity) int {
		if x.Mineral != y.Mineral {
			return cmp.Compare(boolRank(y.Mineral), boolRank(x.Mineral))
		}
		if x.Mineral {
			return cmp.Compare(y.Central, x.Central)
		}
		return 0
	})
	w := len("mineral")
	for _, q := range qs {
		w = max(w, len(q.Name))
	}
	fmt.Fprintf(b, "    %-*s  %7s  %7s  %7s  %7s  %7s  %-13s  %s\n", w, "result", "central", "median", "low", "high",
		"P(>0)", "P(>limit)", "most from")
	for _, q := range qs {
		fmt.Fprintf(b, "    %-*s  %+7.2f  %+7.2f  %+7.2f  %+7.2f  %7s  %-13s  %s\n", w, q.Name, q.Central, q.Median,
			q.Low, q.High, probText(q.PPositive), limitText(q), topText(q.Sensitivity))
	}
	if in, doubt := s.Narrowing(); in != "" {
		if len(doubt) > 0 {
			fmt.Fprintf(b, "    A better %s measurement would narrow most the verdicts in doubt (%s).\n", in, strings.Join(doubt, ", "))
		} else {
			fmt.Fprintf(b, "    No verdict is in doubt; %s carries most of the spread.\n", in)
		}
	}
	writeNotes(b, s.Warnings)
}

// writeRunText writes the heading line of a Monte Carlo run.
func writeRunText(b *strings.Builder, r uncertainty.Run) {
	tail := 100 * (1 - r.Confidence) / 2
	fmt.Fprintf(b, "  Uncertainty of the analysis (Monte Carlo: %d draws, %d kept, seed %d; interval %s–%s %%):\n",
		r.Draws, r.Kept, r.Seed, strconv.FormatFloat(dec(tail, 2), 'f', -1, 64), strconv.FormatFloat(dec(100-tail, 2), 'f', -1, 64))
}

func boolRank(b bool) int {
	if b {
		return 1
	}
	return 0
}

func probText(p float64) string {
	if math.IsNaN(p) {
		return ""
	}
	return strconv.FormatFloat(p, 'f', 2, 64)
}

func limitText(q uncertainty.Quantity) string {
	if math.IsNaN(q.Limit) {
		return ""
	}
	return fmt.Sprintf("%.2f (%+.2f)", q.PAboveLimit, q.Limit)
}

func topText(s uncertainty.Sensitivity) string {
	if len(s.Shares) == 0 {
		return ""
	}
	return fmt.Sprintf("%s (%.0f %%)", s.Shares[0].Input, 100*s.Shares[0].Share)
}
