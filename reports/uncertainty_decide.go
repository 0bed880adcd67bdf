package reports

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"

	"scalerisk/uncertainty"
)

// UncertainDose is a dose answer with its Monte Carlo summary (nil when
// not computed).
type UncertainDose struct {
	DoseOutcome
	Uncertainty    *uncertainty.DoseSummary
	UncertaintyErr error
}

// UncertainCycles is a cycles answer with its Monte Carlo summary (nil when
// not computed).
type UncertainCycles struct {
	CyclesOutcome
	Uncertainty    *uncertainty.CyclesSummary
	UncertaintyErr error
}

// SpreadJSON is the spread of a decision over the draws.
type SpreadJSON struct {
	Median *float64 `json:"median"`
	Low    *float64 `json:"low"`
	High   *float64 `json:"high"`
	SD     *float64 `json:"sd"`
}

// DoseUncertaintyJSON is the "uncertainty" object of a dose answer.
type DoseUncertaintyJSON struct {
	RunJSON
	// DoseAtConfidence reaches the target in Confidence of the draws;
	// null when more than 1 − Confidence of the draws cannot reach it.
	DoseAtConfidence *float64    `json:"dose_mg_per_l_at_confidence"`
	Dose             *SpreadJSON `json:"dose_mg_per_l,omitempty"`
	PCentralReaches  *float64    `json:"p_central_reaches,omitempty"`
	PUnreachable     *float64    `json:"p_unreachable,omitempty"`
	Sensitivity      []ShareJSON `json:"sensitivity,omitempty"`
	Narrowing        string      `json:"narrowing_input,omitempty"`
}

// CyclesUncertaintyJSON is the "uncertainty" object of a cycles answer.
type CyclesUncertaintyJSON struct {
	RunJSON
	MaxCyclesAtConfidence *float64        `json:"max_cycles_at_confidence"`
	MaxCycles             *SpreadJSON     `json:"max_cycles,omitempty"`
	PCentralHolds         *float64        `json:"p_central_holds,omitempty"`
	Limiting              []FrequencyJSON `json:"limiting,omitempty"`
	Sensitivity           []ShareJSON     `json:"sensitivity,omitempty"`
	Narrowing             string          `json:"narrowing_input,omitempty"`
}

// FrequencyJSON is how often a quantity limits the draws ("" for draws
// that reach the search's end).
type FrequencyJSON struct {
	Quantity string  `json:"quantity"`
	Fraction float64 `json:"fraction"`
}

func spreadJSON(iv uncertainty.Interval, round func(float64) float64) *SpreadJSON {
	return &SpreadJSON{Median: optional(iv.Median, round), Low: optional(iv.Low, round),
		High: optional(iv.High, round), SD: optional(iv.SD, round)}
}

// doseUncertaintyJSON is the "uncertainty" object of d; nil without one.
func doseUncertaintyJSON(d UncertainDose) *DoseUncertaintyJSON {
	if d.UncertaintyErr != nil {
		return &DoseUncertaintyJSON{RunJSON: runError(d.UncertaintyErr)}
	}
	s := d.Uncertainty
	if s == nil {
		return nil
	}
	mg := func(x float64) float64 { return sig(x, 4) }
	d3 := func(x float64) float64 { return dec(x, 3) }
	return &DoseUncertaintyJSON{RunJSON: runJSON(s.Run), DoseAtConfidence: optional(s.AtConfidence, mg),
		Dose: spreadJSON(s.Interval, mg), PCentralReaches: optional(s.PCentral, d3),
		PUnreachable: optional(s.PUnreachable, d3), Sensitivity: sharesJSON(s.Sensitivity), Narrowing: s.Sensitivity.Top()}
}

// cyclesUncertaintyJSON is the "uncertainty" object of c; nil without one.
func cyclesUncertaintyJSON(c UncertainCycles) *CyclesUncertaintyJSON {
	if c.UncertaintyErr != nil {
		return &CyclesUncertaintyJSON{RunJSON: runError(c.UncertaintyErr)}
	}
	s := c.Uncertainty
	if s == nil {
		return nil
	}
	d2 := func(x float64) float64 { return dec(x, 2) }
	d3 := func(x float64) float64 { return dec(x, 3) }
	j := &CyclesUncertaintyJSON{RunJSON: runJSON(s.Run), MaxCyclesAtConfidence: optional(s.AtConfidence, d2),
		MaxCycles: spreadJSON(s.Interval, d2), PCentralHolds: optional(s.PCentral, d3),
		Sensitivity: sharesJSON(s.Sensitivity), Narrowing: s.Sensitivity.Top()}
	for _, f := range s.Limiting {
		j.Limiting = append(j.Limiting, FrequencyJSON{Quantity: f.Name, Fraction: dec(f.Fraction, 3)})
	}
	return j
}

// withKey is a JSON object: the object base encodes to, with one more key
// at its end (left out when value is a nil pointer).
type withKey struct {
	base  any
	key   string
	value any
}

// MarshalJSON writes base's object with the key appended.
func (k withKey) MarshalJSON() ([]byte, error) {
	enc := func(v any) ([]byte, error) {
		var b bytes.Buffer
		e := json.NewEncoder(&b)
		e.SetEscapeHTML(false)
		if err := e.Encode(v); err != nil {
			return nil, err
		}
		return bytes.TrimSpace(b.Bytes()), nil
	}
	base, err := enc(k.base)
	if err != nil {
		return nil, err
	}
	val, err := enc(k.value)
	if err != nil || string(val) == "null" {
		return base, err
	}
	if len(base) < 2 || base[len(base)-1] != '}' {
		return nil, fmt.Errorf("reports: %T does not encode to a JSON object", k.base)
	}
	key, _ := enc(k.key)
	out := append(bytes.Clone(base[:len(base)-1]), ',')
	if len(base) == 2 { // {}
		out = out[:1]
	}
	out = append(append(append(out, key...), ':'), val...)
	return append(out, '}'), nil
}

// NewUncertainDoseWriter returns a writer of dose answers with their
// uncertainty: the layout of NewDoseWriter with the "uncertainty" key in
// JSON, the columns dose_mg_per_l_at_confidence, confidence, draws, seed,
// p_central_reaches and narrowing_input in CSV, and a paragraph in text.
func NewUncertainDoseWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[UncertainDose] {
	base := NewDoseWriter(io.Discard, f, opt).layout
	return NewSampleWriter(w, f, Layout[UncertainDose]{
		JSON: func(d UncertainDose) any {
			return withKey{base: base.JSON(d.DoseOutcome), key: "uncertainty", value: doseUncertaintyJSON(d)}
		},
		Header: append(base.Header, "dose_mg_per_l_at_confidence", "confidence", "draws", "seed", "p_central_reaches", "narrowing_input"),
		CSV: func(d UncertainDose) [][]string {
			j := doseUncertaintyJSON(d)
			extra := make([]string, 6)
			if j != nil && j.Error == nil {
				extra = []string{fmtG(j.DoseAtConfidence), fmtF(j.Confidence), fmtF(float64(j.Draws)),
					fmtF(float64(j.Seed)), fmtG(j.PCentralReaches), j.Narrowing}
			}
			return appendColumns(base.CSV(d.DoseOutcome), extra)
		},
		Text: func(b *strings.Builder, d UncertainDose) {
			base.Text(b, d.DoseOutcome)
			writeDoseUncertaintyText(b, d)
		},
		Caution: base.Caution,
	}, opt)
}

// NewUncertainCyclesWriter returns a writer of cycles answers with their
// uncertainty: the layout of NewCyclesWriter with the "uncertainty" key in
// JSON, the columns max_cycles_at_confidence, confidence, draws, seed,
// p_central_holds and narrowing_input in CSV (on every row of a sample),
// and a paragraph in text.
func NewUncertainCyclesWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[UncertainCycles] {
	base := NewCyclesWriter(io.Discard, f, opt).layout
	return NewSampleWriter(w, f, Layout[UncertainCycles]{
		JSON: func(c UncertainCycles) any {
			return withKey{base: base.JSON(c.CyclesOutcome), key: "uncertainty", value: cyclesUncertaintyJSON(c)}
		},
		Header: append(base.Header, "max_cycles_at_confidence", "confidence", "draws", "seed", "p_central_holds", "narrowing_input"),
		CSV: func(c UncertainCycles) [][]string {
			j := cyclesUncertaintyJSON(c)
			extra := make([]string, 6)
			if j != nil && j.Error == nil {
				extra = []string{fmtG(j.MaxCyclesAtConfidence), fmtF(j.Confidence), fmtF(float64(j.Draws)),
					fmtF(float64(j.Seed)), fmtG(j.PCentralHolds), j.Narrowing}
			}
			return appendColumns(base.CSV(c.CyclesOutcome), extra)
		},
		Text: func(b *strings.Builder, c UncertainCycles) {
			base.Text(b, c.CyclesOutcome)
			writeCyclesUncertaintyText(b, c)
		},
		Caution: base.Caution,
	}, opt)
}

// appendColumns appends extra to every row.
func appendColumns(rows [][]string, extra []string) [][]string {
	for i := range rows {
		rows[i] = append(rows[i], extra...)
	}
	return rows
}

func writeDoseUncertaintyText(b *strings.Builder, d UncertainDose) {
	if d.UncertaintyErr != nil {
		fmt.Fprintf(b, "  Uncertainty not computed: %v\n", d.UncertaintyErr)
		return
	}
	s := d.Uncertainty
	if s == nil || d.Result == nil {
		return
	}
	writeRunText(b, s.Run)
	conf := 100 * s.Confidence
	if math.IsInf(s.AtConfidence, 1) {
		fmt.Fprintf(b, "    No dose below 10 g/L reaches %s in %.0f %% of the draws (%.0f %% cannot reach it).\n",
			d.Result.Target, conf, 100*s.PUnreachable)
	} else {
		fmt.Fprintf(b, "    With %.0f %% confidence, %.3g mg/L of %s reaches %s; the dose of the analysis as reported (%.3g mg/L) does in %.0f %% of the draws.\n",
			conf, s.AtConfidence, d.Result.Reagent.Name, d.Result.Target, s.Central, 100*s.PCentral)
		if s.N > 0 {
			fmt.Fprintf(b, "    Doses the draws need: median %.3g, %s %.3g to %.3g mg/L.\n", s.Median, intervalWords(s.Confidence), s.Low, s.High)
		}
	}
	if top := s.Sensitivity.Top(); top != "" {
		fmt.Fprintf(b, "    A better %s measurement would narrow the dose most (%.0f %% of its spread).\n", top, 100*s.Sensitivity.Shares[0].Share)
	}
	writeNotes(b, s.Warnings)
}

func writeCyclesUncertaintyText(b *strings.Builder, c UncertainCycles) {
	if c.UncertaintyErr != nil {
		fmt.Fprintf(b, "  Uncertainty not computed: %v\n", c.UncertaintyErr)
		return
	}
	s := c.Uncertainty
	if s == nil {
		return
	}
	writeRunText(b, s.Run)
	fmt.Fprintf(b, "    With %.0f %% confidence every limit holds up to %.2f cycles; the answer of the analysis as reported (%.2f) holds in %.0f %% of the draws.\n",
		100*s.Confidence, s.AtConfidence, s.Central, 100*s.PCentral)
	fmt.Fprintf(b, "    Highest cycles of the draws: median %.2f, %s %.2f to %.2f.\n", s.Median, intervalWords(s.Confidence), s.Low, s.High)
	var lim []string
	for _, f := range s.Limiting {
		name := f.Name
		if name == "" {
			name = "no limit reached"
		}
		lim = append(lim, fmt.Sprintf("%s %.0f %%", name, 100*f.Fraction))
	}
	if len(lim) > 0 {
		fmt.Fprintf(b, "    Limiting in the draws: %s.\n", strings.Join(lim, ", "))
	}
	if top := s.Sensitivity.Top(); top != "" {
		fmt.Fprintf(b, "    A better %s measurement would narrow the answer most (%.0f %% of its spread).\n", top, 100*s.Sensitivity.Shares[0].Share)
	}
	writeNotes(b, s.Warnings)
}

// intervalWords names the interval of a confidence: "5–95 %".
func intervalWords(conf float64) string {
	tail := 100 * (1 - conf) / 2
	return fmt.Sprintf("%s–%s %%", fmtF(dec(tail, 2)), fmtF(dec(100-tail, 2)))
}
