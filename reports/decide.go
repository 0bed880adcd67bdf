package reports

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"scalerisk/saturation"
	"scalerisk/water"
)

// outcomeSample turns a water after a treatment into the assess JSON
// object.
func outcomeSample(name string, o saturation.Outcome) SampleJSON {
	ix := o.Indices
	return Sample(saturation.Assessment{Name: name, Input: o.Water, Quality: o.Water.Quality(), Result: o.Result, Indices: &ix})
}

// DoseJSON is one sample of the JSON output of dose. The key names are a
// contract: extend, never rename.
type DoseJSON struct {
	Name            string   `json:"name"`
	Reagent         string   `json:"reagent"`
	StrengthPercent float64  `json:"strength_percent"`
	Target          string   `json:"target"`
	DoseMgPerL      float64  `json:"dose_mg_per_l"`
	DoseKgPerDay    *float64 `json:"dose_kg_per_day,omitempty"`
	// CostPerDay is the product's cost per day at the flow and the price
	// per kg of product given (currency as the price's).
	CostPerDay *float64 `json:"cost_per_day,omitempty"`
	Reached    bool     `json:"reached"`
	JudgementJSON
	Before   *SampleJSON `json:"before,omitempty"`
	After    *SampleJSON `json:"after,omitempty"`
	Warnings []string    `json:"warnings"`
	Error    *string     `json:"error"`
}

// DoseOutcome is the dose answer for one sample, or why there is none.
type DoseOutcome struct {
	Name   string
	Result *saturation.DoseResult
	Flow   float64 // m³/h, 0 when not given
	Price  float64 // price per kg of product (any currency), 0 when not given
	Err    error
}

// WriteDoses writes dose answers in format f (JSON indented).
func WriteDoses(w io.Writer, f Format, ds []DoseOutcome) error {
	return NewDoseWriter(w, f, WriteOptions{Indent: true}).WriteAll(ds...)
}

// NewDoseWriter returns a writer of dose answers, one at a time, in format f.
func NewDoseWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[DoseOutcome] {
	return NewSampleWriter(w, f, Layout[DoseOutcome]{
		JSON: func(d DoseOutcome) any { return doseJSON(d) },
		Header: []string{"name", "reagent", "strength_percent", "target", "dose_mg_per_l", "dose_kg_per_day", "reached",
			"ph_before", "ph_after", "lsi_before", "lsi_after", "error", "warnings", "cost_per_day"},
		CSV:     func(d DoseOutcome) [][]string { return [][]string{doseRow(doseJSON(d))} },
		Text:    writeDoseText,
		Caution: DoseCaution,
	}, opt)
}

// doseJSON is the JSON object of one dose answer.
func doseJSON(d DoseOutcome) DoseJSON {
	j := DoseJSON{Name: d.Name, Warnings: []string{}}
	if d.Err != nil {
		msg := d.Err.Error()
		j.Error = &msg
		return j
	}
	r := d.Result
	j.Reagent, j.StrengthPercent, j.Target = r.Reagent.Name, r.Strength, r.Target.String()
	j.DoseMgPerL, j.Reached = sig(r.Dose, 5), r.Reached
	if d.Flow > 0 {
		j.DoseKgPerDay = optional(saturation.KgPerDay(r.Dose, d.Flow), func(x float64) float64 { return sig(x, 4) })
		if d.Price > 0 {
			j.CostPerDay = optional(saturation.KgPerDay(r.Dose, d.Flow)*d.Price, func(x float64) float64 { return sig(x, 4) })
		}
	}
	j.JudgementJSON = judgementJSON(r.Judged, "dose")
	before, after := outcomeSample(d.Name, r.Before), outcomeSample(d.Name, r.After)
	j.Before, j.After = &before, &after
	j.Warnings = append(j.Warnings, r.Warnings...)
	return j
}

// doseRow is the CSV row of one dose answer.
func doseRow(j DoseJSON) []string {
	row := []string{j.Name, j.Reagent, fmtF(j.StrengthPercent), j.Target, fmtF(j.DoseMgPerL), fmtG(j.DoseKgPerDay),
		strconv.FormatBool(j.Reached)}
	if j.Before != nil {
		row = append(row, fmtG(j.Before.PH), fmtG(j.After.PH), fmtG(lsiOf(j.Before)), fmtG(lsiOf(j.After)))
	} else {
		row = append(row, "", "", "", "")
	}
	return append(row, errOf(j.Error), strings.Join(j.Warnings, "; "), fmtG(j.CostPerDay))
}

// writeDoseText writes the text block of one dose answer.
func writeDoseText(b *strings.Builder, d DoseOutcome) {
	if d.Err != nil {
		fmt.Fprintf(b, "%s: not computed: %v\n", d.Name, d.Err)
		return
	}
	r := d.Result
	if r.Reached {
		fmt.Fprintf(b, "%s: %.4g mg/L of %s (%g %%) brings %s to %g", d.Name, r.Dose, r.Reagent.Name, r.Strength, targetWords(r.Target), r.Target.Value)
		if r.Judged.SkinGoverns() {
			fmt.Fprintf(b, " at the %g °C skin", r.Judged.Skin)
		}
		if d.Flow > 0 {
			fmt.Fprintf(b, " — %.3g kg/day of product at %g m³/h", saturation.KgPerDay(r.Dose, d.Flow), d.Flow)
			if d.Price > 0 {
				fmt.Fprintf(b, ", %.4g a day at %g per kg", saturation.KgPerDay(r.Dose, d.Flow)*d.Price, d.Price)
			}
		}
		b.WriteString(".\n")
	} else if len(r.Warnings) > 0 {
		fmt.Fprintf(b, "%s: %s.\n", d.Name, r.Warnings[0])
	} else {
		fmt.Fprintf(b, "%s: %s does not reach %s.\n", d.Name, r.Reagent.Name, r.Target)
	}
	writeJudgement(b, r.Judged, func(v float64) string { return fmt.Sprintf("%.4g mg/L", v) })
	writeOutcomeChange(b, r.Before, r.After)
	notes := r.Warnings
	if !r.Reached && len(notes) > 0 {
		notes = notes[1:] // the first said it above
	}
	writeNotes(b, notes)
}

// targetWords names a target's quantity for a sentence: "pH", "LSI",
// "the SI of calcite".
func targetWords(t saturation.Target) string {
	switch t.Kind {
	case "ph":
		return "pH"
	case "si":
		return "the SI of " + t.Mineral
	}
	return strings.ToUpper(t.Kind)
}

// DoseCaution is the caution every dose answer carries.
const DoseCaution = "Acid and caustic dosing is hazardous: overfeed gives low pH and corrosion, acids and " +
	"caustic burn, sulfuric acid dilution is strongly exothermic (add acid to water), and acids must " +
	"never meet hypochlorite feeds. Control the feed on measured pH, respect discharge limits, and " +
	"follow the SDS, local codes and licensed practice. " + Caution

func lsiOf(s *SampleJSON) *float64 {
	if s == nil || s.Indices == nil {
		return nil
	}
	return s.Indices.LSI
}

func errOf(p *string) string {
	if p == nil {
		return ""
	}
	return *p
}

func fmtF(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// writeOutcomeChange lists pH, LSI and the minerals whose SI a treatment
// moves, before → after.
func writeOutcomeChange(b *strings.Builder, before, after saturation.Outcome) {
	fmt.Fprintf(b, "  pH %.2f → %.2f", before.Result.PH, after.Result.PH)
	if !math.IsNaN(before.Indices.LSI) && !math.IsNaN(after.Indices.LSI) {
		fmt.Fprintf(b, ", LSI %+.2f → %+.2f", before.Indices.LSI, after.Indices.LSI)
	}
	if !math.IsNaN(before.Indices.LarsonSkold) && !math.IsNaN(after.Indices.LarsonSkold) {
		fmt.Fprintf(b, ", Larson–Skold %.2f → %.2f", before.Indices.LarsonSkold, after.Indices.LarsonSkold)
	}
	b.WriteString("\n")
	w := len("mineral")
	for _, m := range after.Result.Minerals {
		w = max(w, len(m.Name))
	}
	for _, m := range after.Result.Minerals {
		sb, ok := before.Result.SI(m.Name)
		if !ok || math.Abs(m.SI-sb) < 0.005 || (sb < -1 && m.SI < -1) {
			continue
		}
		fmt.Fprintf(b, "    %-*s  %+6.2f → %+6.2f  %s\n", w, m.Name, sb, m.SI, saturation.RiskBand(m.Name, m.SI))
	}
}

// CyclesJSON is one sample of the JSON output of cycles.
type CyclesJSON struct {
	Name      string   `json:"name"`
	Profile   string   `json:"profile"`
	Carbonate string   `json:"carbonate"`
	MaxCycles float64  `json:"max_cycles"`
	Limiting  string   `json:"limiting"`
	Exceeded  []string `json:"exceeded,omitempty"`
	JudgementJSON
	MakeupM3PerH    *float64          `json:"makeup_m3_per_h,omitempty"`
	BlowdownM3PerH  *float64          `json:"blowdown_m3_per_h,omitempty"`
	Points          []CyclesPointJSON `json:"points"`
	Warnings        []string          `json:"warnings"`
	Error           *string           `json:"error"`
	LimitsAtMaximum map[string]string `json:"limits,omitempty"`
	// Role is the sample's role when the file gives one; a recirculating
	// or blowdown sample is asked its Margin, and its max_cycles is the
	// factor it can still be concentrated by.
	Role   string      `json:"role,omitempty"`
	Margin *MarginJSON `json:"margin,omitempty"`
}

// CyclesPointJSON is the water at one number of cycles.
type CyclesPointJSON struct {
	Cycles          float64            `json:"cycles"`
	ActivityModel   string             `json:"activity_model,omitempty"`
	AcidMgPerL      *float64           `json:"acid_mg_per_l,omitempty"`
	PH              *float64           `json:"ph,omitempty"`
	IonicStrength   *float64           `json:"ionic_strength,omitempty"`
	SaturationIndex map[string]float64 `json:"saturation_index,omitempty"`
	LSI             *float64           `json:"lsi,omitempty"`
	Warnings        []string           `json:"warnings,omitempty"`
	Error           *string            `json:"error,omitempty"`
}

// CyclesOutcome is the cycles answer for one sample.
type CyclesOutcome struct {
	Name      string
	Carbonate string
	Result    *saturation.CyclesResult
	// Margin, for a recirculating or blowdown sample, is how far it is
	// from its limits (Result is then its Further search).
	Margin      *saturation.MarginResult
	Role        string
	Evaporation float64 // m³/h, 0 when not given
	Err         error
}

// WriteCycles writes cycles answers in format f (JSON indented).
func WriteCycles(w io.Writer, f Format, cs []CyclesOutcome) error {
	return NewCyclesWriter(w, f, WriteOptions{Indent: true}).WriteAll(cs...)
}

// NewCyclesWriter returns a writer of cycles answers, one at a time, in
// format f.
func NewCyclesWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[CyclesOutcome] {
	header := []string{"name", "profile", "carbonate", "max_cycles", "limiting", "makeup_m3_per_h", "blowdown_m3_per_h",
		"cycles", "acid_mg_per_l", "ph", "lsi"}
	for _, m := range cyclesMinerals {
		header = append(header, "si_"+m)
	}
	return NewSampleWriter(w, f, Layout[CyclesOutcome]{
		JSON:    func(c CyclesOutcome) any { return cyclesJSON(c) },
		Header:  append(header, "error"),
		CSV:     func(c CyclesOutcome) [][]string { return cyclesRows(cyclesJSON(c)) },
		Text:    writeCyclesText,
		Caution: Caution,
	}, opt)
}

// cyclesJSON is the JSON object of one cycles answer.
func cyclesJSON(c CyclesOutcome) CyclesJSON {
	j := CyclesJSON{Name: c.Name, Carbonate: c.Carbonate, Warnings: []string{}, Points: []CyclesPointJSON{}}
	if c.Err != nil {
		msg := c.Err.Error()
		j.Error = &msg
		return j
	}
	r := c.Result
	j.Profile, j.MaxCycles, j.Limiting, j.Exceeded = r.Profile.Name, dec(r.MaxCycles, 2), r.Limiting, r.Exceeded
	j.JudgementJSON = judgementJSON(r.Judged, "cycles")
	j.Role, j.Margin = c.Role, MarginOf(c.Margin, nil)
	if c.Evaporation > 0 && r.MaxCycles > 1 {
		m, bd := water.MakeupAndBlowdown(c.Evaporation, r.MaxCycles)
		j.MakeupM3PerH = optional(m, func(x float64) float64 { return sig(x, 4) })
		j.BlowdownM3PerH = optional(bd, func(x float64) float64 { return sig(x, 4) })
	}
	j.LimitsAtMaximum = map[string]string{}
	for _, l := range r.Profile.Limits {
		j.LimitsAtMaximum[l.Quantity] = fmt.Sprintf("≤ %g (%s)", l.Max, l.Source)
	}
	for _, p := range r.Points {
		j.Points = append(j.Points, cyclesPointJSON(p, r.Rule.SetPoint > 0))
	}
	j.Warnings = append(j.Warnings, r.Warnings...)
	return j
}

// cyclesPointJSON is the water at one point of the cycles table; acid says
// whether an acid holds a pH set point.
func cyclesPointJSON(p saturation.CyclePoint, acid bool) CyclesPointJSON {
	pj := CyclesPointJSON{Cycles: dec(p.Cycles, 3)}
	if p.Err != nil {
		msg := p.Err.Error()
		pj.Error = &msg
		return pj
	}
	pj.ActivityModel = p.Result.Activity.String()
	if acid {
		pj.AcidMgPerL = optional(p.Dose, func(x float64) float64 { return sig(x, 4) })
	}
	pj.Warnings = p.Result.Warnings
	pj.PH = optional(p.Result.PH, func(x float64) float64 { return dec(x, 3) })
	pj.IonicStrength = optional(p.Result.IonicStrength, func(x float64) float64 { return sig(x, 4) })
	pj.LSI = optional(p.Indices.LSI, func(x float64) float64 { return dec(x, 2) })
	pj.SaturationIndex = map[string]float64{}
	for _, m := range p.Result.Minerals {
		pj.SaturationIndex[m.Name] = dec(m.SI, 3)
	}
	return pj
}

// cyclesRows are the CSV rows of one cycles answer: one per point, or one
// carrying the error.
func cyclesRows(j CyclesJSON) [][]string {
	if j.Error != nil {
		return [][]string{{j.Name, j.Profile, j.Carbonate, "", "", "", "", "", "", "", "", "", "", "", "", "", *j.Error}}
	}
	var rows [][]string
	for _, p := range j.Points {
		row := []string{j.Name, j.Profile, j.Carbonate, fmtF(j.MaxCycles), j.Limiting, fmtG(j.MakeupM3PerH), fmtG(j.BlowdownM3PerH),
			fmtF(p.Cycles), fmtG(p.AcidMgPerL), fmtG(p.PH), fmtG(p.LSI)}
		for _, m := range cyclesMinerals {
			if v, ok := p.SaturationIndex[m]; ok {
				row = append(row, fmtF(v))
			} else {
				row = append(row, "")
			}
		}
		rows = append(rows, append(row, errOf(p.Error)))
	}
	return rows
}

// writeCyclesText writes the text block of one cycles answer: the answer
// in a sentence, the table of points and the notes.
func writeCyclesText(b *strings.Builder, c CyclesOutcome) {
	if c.Err != nil {
		fmt.Fprintf(b, "%s: not computed: %v\n", c.Name, c.Err)
		return
	}
	r := c.Result
	if c.Margin != nil {
		fmt.Fprintf(b, "%s (%s): asked how far it is from its limits, not how many cycles it could run as a makeup.\n", c.Name, c.Role)
		writeMarginText(b, c.Margin, nil)
		writeCyclesTable(b, r)
		return
	}
	switch {
	case len(r.Exceeded) > 0:
		var fits []string
		for _, q := range r.Exceeded {
			if note := saturation.FitNote(nil, q, r.Judged.Governing); note != "" {
				fits = append(fits, strings.TrimPrefix(q, "si:")+": "+note)
			}
		}
		fit := ""
		if len(fits) > 0 {
			fit = " (" + strings.Join(fits, "; ") + ")"
		}
		fmt.Fprintf(b, "%s: the makeup itself is past the %s limits for %s%s (%s carbonate): treat it before cycling.\n",
			c.Name, r.Profile.Name, quantityLabels(r.Exceeded), fit, c.Carbonate)
	case r.Limiting == "":
		fmt.Fprintf(b, "%s: no limit of the %s profile is reached up to %.3g cycles (%s carbonate).\n", c.Name, r.Profile.Name, r.MaxCycles, c.Carbonate)
	default:
		l, _ := r.Profile.Lookup(r.Limiting)
		fit := ""
		if note := saturation.FitNote(nil, r.Limiting, r.Judged.Governing); note != "" {
			fit = " (" + clientText(note) + ")"
		}
		fmt.Fprintf(b, "%s: at most %.2f cycles of concentration under the %s profile (%s carbonate, at %.3g °C); %s reaches its limit of %g there%s.\n",
			c.Name, r.MaxCycles, r.Profile.Name, c.Carbonate, r.Judged.Governing, quantityLabel(r.Limiting), l.Max, fit)
	}
	writeJudgement(b, r.Judged, func(v float64) string { return fmt.Sprintf("%.2f cycles", v) })
	if c.Evaporation > 0 && r.MaxCycles > 1 {
		m, bd := water.MakeupAndBlowdown(c.Evaporation, r.MaxCycles)
		fmt.Fprintf(b, "  At %.3g m³/h evaporation: make-up %.3g m³/h, blowdown %.3g m³/h (drift neglected).\n", c.Evaporation, m, bd)
	}
	writeCyclesTable(b, r)
	seen := map[string]bool{}
	notes := append([]string(nil), r.Warnings...)
	for _, p := range r.Points {
		if p.Result != nil {
			notes = append(notes, p.Result.Warnings...)
		}
	}
	for _, wn := range notes {
		if !seen[wn] {
			seen[wn] = true
			fmt.Fprintf(b, "  - %s\n", clientText(wn))
		}
	}
}

// quantityLabels names limit quantities in words, joined by commas.
func quantityLabels(qs []string) string {
	words := make([]string, len(qs))
	for i, q := range qs {
		words[i] = quantityLabel(q)
	}
	return strings.Join(words, ", ")
}

// writeCyclesTable writes the text table of a cycles answer: pH, LSI, the
// acid dose under a set point and the SI of each mineral the profile
// limits, at every point.
func writeCyclesTable(b *strings.Builder, r *saturation.CyclesResult) {
	acid := r.Rule.SetPoint > 0
	fmt.Fprintf(b, "  %7s  %6s  %6s", "Cycles", "pH", "LSI")
	if acid {
		fmt.Fprintf(b, "  %9s", "acid mg/L")
	}
	var names []string
	for _, l := range r.Profile.Limits {
		if strings.HasPrefix(l.Quantity, "si:") {
			names = append(names, strings.TrimPrefix(l.Quantity, "si:"))
		}
	}
	for _, n := range names {
		b.WriteString("  " + padLeft(mineralTitle(n), titleWidth(mineralTitle(n), 8)))
	}
	b.WriteString("\n")
	for _, p := range r.Points {
		if p.Err != nil {
			fmt.Fprintf(b, "  %7.2f  %v\n", p.Cycles, p.Err)
			continue
		}
		fmt.Fprintf(b, "  %7.2f  %6.2f  %6s", p.Cycles, p.Result.PH, siText(p.Indices.LSI))
		if acid {
			fmt.Fprintf(b, "  %9.4g", p.Dose)
		}
		for _, n := range names {
			cell := "–"
			if v, ok := p.Result.SI(n); ok {
				cell = siText(v)
			}
			b.WriteString("  " + padLeft(cell, titleWidth(mineralTitle(n), 8)))
		}
		b.WriteString("\n")
	}
}
