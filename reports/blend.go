package reports

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"scalerisk/saturation"
)

// BlendOutcome is the answer of blend: the blend's assessment, and its
// judgement against a limit profile at the bulk and at the skin with the
// safe share of the first water (nil when it could not be computed: Err
// says why).
type BlendOutcome struct {
	Assessment saturation.Assessment
	// First and Second name the two waters; Fraction is the first's share.
	First, Second string
	Fraction      float64
	Judged        *saturation.BlendResult
	Err           error
}

// blendSampleJSON is one sample of the JSON output of blend: the assess
// object of the blend with the keys of the judgement after it.
type blendSampleJSON struct {
	SampleJSON
	Fraction     float64           `json:"fraction"`
	BlendLimits  *BlendLimitsJSON  `json:"blend_limits,omitempty"`
	SafeFraction *SafeFractionJSON `json:"safe_fraction,omitempty"`
	BlendError   *string           `json:"blend_error,omitempty"`
}

// BlendLimitsJSON is a blend judged against a limit profile: each limit
// at the bulk and at the skin, whether all hold, the quantity furthest
// past its limit ("" when all hold) and the temperature that governs (the
// one with the larger value − limit).
type BlendLimitsJSON struct {
	Profile  string            `json:"profile"`
	Within   bool              `json:"within"`
	Limiting string            `json:"limiting"`
	Limits   []LimitMarginJSON `json:"limits"`
	JudgementJSON
}

// SafeFractionJSON is the safe share of the first water of a blend: the
// bound ("at_most", "at_least", or "none" with a null fraction), the
// quantity that sets it, the judgement keys, and the points of the search.
type SafeFractionJSON struct {
	Profile  string   `json:"profile"`
	Fraction *float64 `json:"fraction"`
	Bound    string   `json:"bound"`
	Limiting string   `json:"limiting"`
	Exceeded []string `json:"exceeded"`
	JudgementJSON
	Points   []BlendPointJSON `json:"points"`
	Warnings []string         `json:"warnings"`
}

// BlendPointJSON is the blend at one share of the first water, judged at
// the bulk and at the skin.
type BlendPointJSON struct {
	Fraction              float64            `json:"fraction"`
	PH                    *float64           `json:"ph,omitempty"`
	LSI                   *float64           `json:"lsi,omitempty"`
	SaturationIndex       map[string]float64 `json:"saturation_index,omitempty"`
	SkinSaturationIndex   map[string]float64 `json:"skin_saturation_index,omitempty"`
	Within                bool               `json:"within"`
	Limiting              string             `json:"limiting,omitempty"`
	GoverningTemperatureC *float64           `json:"governing_temperature_c,omitempty"`
	Error                 *string            `json:"error,omitempty"`
}

// NewBlendWriter returns a writer of blends in format f: the layout of
// NewAssessWriter with the judgement after it — the keys of
// blendSampleJSON in JSON, the columns of blendHeader after the assess
// columns of CSV, and a judgement block after the assess text.
func NewBlendWriter(w io.Writer, f Format, minerals []string, opt WriteOptions) *SampleWriter[BlendOutcome] {
	return NewSampleWriter(w, f, Layout[BlendOutcome]{
		JSON:   func(o BlendOutcome) any { return blendJSON(o) },
		Header: append(assessHeader(minerals), blendHeader...),
		CSV: func(o BlendOutcome) [][]string {
			return [][]string{append(assessRow(o.Assessment, minerals), blendRow(blendJSON(o))...)}
		},
		Text: func(b *strings.Builder, o BlendOutcome) {
			writeAssessText(b, o.Assessment)
			writeBlendText(b, o)
		},
		Caution: Caution,
	}, opt)
}

// blendJSON is the JSON object of one blend.
func blendJSON(o BlendOutcome) blendSampleJSON {
	j := blendSampleJSON{SampleJSON: Sample(o.Assessment), Fraction: o.Fraction}
	if o.Err != nil {
		msg := o.Err.Error()
		j.BlendError = &msg
		return j
	}
	if r := o.Judged; r != nil {
		j.BlendLimits = blendLimitsJSON(r)
		j.SafeFraction = safeFractionJSON(r)
	}
	return j
}

// blendLimitsJSON is the blend at its fraction judged against the profile.
func blendLimitsJSON(r *saturation.BlendResult) *BlendLimitsJSON {
	p := r.Point
	return &BlendLimitsJSON{Profile: r.Profile.Name, Within: p.Within(), Limiting: p.Limiting, Limits: limitMarginsJSON(r.Limits),
		JudgementJSON: judgementJSON(p.Judgement(), "")}
}

// safeFractionJSON is the safe share of the first water and its search.
func safeFractionJSON(r *saturation.BlendResult) *SafeFractionJSON {
	s := r.Share
	j := &SafeFractionJSON{Profile: r.Profile.Name, Fraction: optional(s.Fraction, func(x float64) float64 { return dec(x, 4) }),
		Bound: shareBound(s), Limiting: s.Limiting, Exceeded: append([]string{}, s.Exceeded...),
		JudgementJSON: judgementJSON(s.Judged, "blend"), Points: []BlendPointJSON{}, Warnings: append([]string{}, s.Warnings...)}
	for _, p := range s.Points {
		j.Points = append(j.Points, blendPointJSON(p))
	}
	return j
}

// shareBound is the "bound" key of a safe share.
func shareBound(s saturation.SafeShare) string {
	switch {
	case math.IsNaN(s.Fraction):
		return "none"
	case s.AtLeast:
		return "at_least"
	}
	return "at_most"
}

// blendPointJSON is one point of the safe-share search.
func blendPointJSON(p saturation.BlendPoint) BlendPointJSON {
	j := BlendPointJSON{Fraction: dec(p.Fraction, 4), Within: p.Within()}
	if p.Err != nil {
		msg := p.Err.Error()
		j.Error = &msg
		return j
	}
	j.PH = optional(p.Result.PH, func(x float64) float64 { return dec(x, 3) })
	j.LSI = optional(p.Indices.LSI, func(x float64) float64 { return dec(x, 2) })
	j.SaturationIndex = siMap(p.Result)
	if p.Skin != nil {
		j.SkinSaturationIndex = siMap(p.Skin)
	}
	j.Limiting = p.Limiting
	if !math.IsInf(p.Excess, -1) {
		j.GoverningTemperatureC = optional(p.Governing, func(x float64) float64 { return dec(x, 2) })
	}
	return j
}

// siMap is the saturation index of every mineral of r, to 3 decimals.
func siMap(r *saturation.Result) map[string]float64 {
	out := map[string]float64{}
	for _, m := range r.Minerals {
		if !math.IsNaN(m.SI) && !math.IsInf(m.SI, 0) {
			out[m.Name] = dec(m.SI, 3)
		}
	}
	return out
}

// blendHeader lists the CSV columns of the judgement, after the assess
// columns.
var blendHeader = []string{"fraction", "profile", "within_limits", "blend_limiting", "governing_temperature_c", "governing",
	"skin_temperature_c", "safe_fraction", "safe_fraction_bound", "safe_fraction_limiting",
	"safe_fraction_governing_temperature_c", "safe_fraction_governing", "safe_fraction_bulk", "safe_fraction_skin", "blend_error"}

// blendRow is the CSV part of one blend (blank cells without a judgement).
func blendRow(j blendSampleJSON) []string {
	row := make([]string, 0, len(blendHeader))
	row = append(row, fmtF(j.Fraction))
	l, s := j.BlendLimits, j.SafeFraction
	if l == nil || s == nil {
		row = append(row, make([]string, len(blendHeader)-2)...)
		return append(row, errOf(j.BlendError))
	}
	row = append(row, l.Profile, strconv.FormatBool(l.Within), l.Limiting, fmtF(l.GoverningTemperatureC), l.Governing,
		fmtG(l.SkinTemperatureC), fmtG(s.Fraction), s.Bound, s.Limiting, fmtF(s.GoverningTemperatureC), s.Governing,
		fmtG(s.SafeFractionBulk), fmtG(s.SafeFractionSkin))
	return append(row, errOf(j.BlendError))
}

// writeBlendText writes the judgement of a blend: its verdict at the bulk
// and the skin, each limit, the safe share of the first water and which
// temperature governs it, and the search's table.
func writeBlendText(b *strings.Builder, o BlendOutcome) {
	if o.Err != nil {
		fmt.Fprintf(b, "  Blend not judged against the limits: %v\n", o.Err)
		return
	}
	r := o.Judged
	if r == nil {
		return
	}
	p := r.Point
	where := fmt.Sprintf("at %.1f °C", p.Governing)
	if p.Judgement().SkinGoverns() {
		where = fmt.Sprintf("at the %g °C skin (bulk pH held)", p.Skin.Temperature)
	}
	skin := ""
	if p.Skin != nil {
		skin = fmt.Sprintf(" and at the %g °C skin", p.Skin.Temperature)
	}
	if p.Within() {
		fmt.Fprintf(b, "  Under the %s profile this blend holds every limit at %.1f °C%s.\n", r.Profile.Name, p.Result.Temperature, skin)
	} else {
		fmt.Fprintf(b, "  Under the %s profile this blend is past the limit for %s, %s.\n", r.Profile.Name, quantityLabel(p.Limiting), where)
	}
	writeLimitMargins(b, r.Limits)
	writeShareText(b, o)
}

// writeShareText says how much of the first water a blend can take, which
// temperature governs, and the table of the search.
func writeShareText(b *strings.Builder, o BlendOutcome) {
	s := o.Judged.Share
	pct := func(f float64) string { return fmt.Sprintf("%.0f %% %s", 100*f, o.First) }
	switch {
	case math.IsNaN(s.Fraction):
		fmt.Fprintf(b, "  No share of %s is safe to search: neither water alone holds every limit.\n", o.First)
	case s.Limiting == "":
		fmt.Fprintf(b, "  Every share of %s holds every limit, from %s alone to %s alone.\n", o.First, o.Second, o.First)
	case s.AtLeast:
		fmt.Fprintf(b, "  Safe share: at least %s (%.2f), when %s reaches its limit.\n", pct(s.Fraction), s.Fraction, quantityLabel(s.Limiting))
	default:
		fmt.Fprintf(b, "  Safe share: at most %s (%.2f), when %s reaches its limit.\n", pct(s.Fraction), s.Fraction, quantityLabel(s.Limiting))
	}
	if !math.IsNaN(s.Fraction) {
		writeJudgement(b, s.Judged, func(v float64) string { return fmt.Sprintf("a share of %.2f", v) })
	}
	fmt.Fprintf(b, "  %8s  %6s  %6s  %-34s  %s\n", "Share", "pH", "LSI", "Verdict", "Governing")
	for _, p := range s.Points {
		if p.Err != nil {
			fmt.Fprintf(b, "  %8.2f  %v\n", p.Fraction, p.Err)
			continue
		}
		verdict, at := "within every limit", ""
		if !p.Within() {
			verdict = "past " + quantityLabel(p.Limiting)
		}
		if !math.IsInf(p.Excess, -1) {
			at = fmt.Sprintf("%.1f °C", p.Governing)
		}
		fmt.Fprintf(b, "  %8.2f  %6.2f  %6s  %-34s  %s\n", p.Fraction, p.Result.PH, siText(p.Indices.LSI), verdict, at)
	}
	notes := make([]string, len(s.Warnings))
	for i, w := range s.Warnings {
		notes[i] = clientText(w)
	}
	writeNotes(b, notes)
}
