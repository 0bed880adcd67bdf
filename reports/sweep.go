package reports

import (
	"fmt"
	"io"
	"maps"
	"math"
	"slices"
	"strings"

	"scalerisk/saturation"
)

// SweepOutcome is one sample's sweep.
type SweepOutcome struct {
	Name   string
	X      saturation.Axis
	Y      *saturation.Axis
	Points []saturation.Point
	Err    error
}

// SweepJSON is one sample of the JSON output of sweep.
type SweepJSON struct {
	Name   string           `json:"name"`
	Vary   []string         `json:"vary"`
	Points []map[string]any `json:"points"`
	Error  *string          `json:"error"`
}

// variableKey is the JSON key of a swept variable.
func variableKey(v saturation.Variable) string {
	switch v {
	case saturation.VaryTemperature:
		return "temperature_c"
	case saturation.VaryDose:
		return "dose_mg_per_l"
	}
	return v.String()
}

// WriteSweeps writes sweeps in format f (JSON indented).
func WriteSweeps(w io.Writer, f Format, ss []SweepOutcome) error {
	return NewSweepWriter(w, f, WriteOptions{Indent: true}).WriteAll(ss...)
}

// NewSweepWriter returns a writer of sweeps, one sample at a time, in
// format f.
func NewSweepWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[SweepOutcome] {
	header := []string{"name", "x_variable", "x", "y_variable", "y", "ph", "ionic_strength", "lsi", "rsi"}
	for _, m := range sweepMinerals {
		header = append(header, "si_"+m)
	}
	header = append(header, "error")
	return NewSampleWriter(w, f, Layout[SweepOutcome]{
		JSON:    func(s SweepOutcome) any { return sweepJSON(s) },
		Header:  header,
		CSV:     func(s SweepOutcome) [][]string { return sweepRows(s, len(header)) },
		Text:    writeSweepText,
		Caution: Caution,
	}, opt)
}

// sweepJSON is the JSON object of one sample's sweep.
func sweepJSON(s SweepOutcome) SweepJSON {
	j := SweepJSON{Name: s.Name, Vary: []string{s.X.Var.String()}, Points: []map[string]any{}}
	if s.Y != nil {
		j.Vary = append(j.Vary, s.Y.Var.String())
	}
	if s.Err != nil {
		msg := s.Err.Error()
		j.Error = &msg
		return j
	}
	for _, p := range s.Points {
		pt := map[string]any{variableKey(s.X.Var): sig(p.X, 6)}
		if s.Y != nil {
			pt[variableKey(s.Y.Var)] = sig(p.Y, 6)
		}
		if p.Err != nil {
			pt["error"] = p.Err.Error()
		} else {
			pt["activity_model"] = p.Result.Activity.String()
			if len(p.Result.Warnings) > 0 {
				pt["warnings"] = p.Result.Warnings
			}
			pt["ph"] = dec(p.Result.PH, 3)
			pt["ionic_strength"] = sig(p.Result.IonicStrength, 4)
			si := map[string]float64{}
			for _, m := range p.Result.Minerals {
				si[m.Name] = dec(m.SI, 3)
			}
			pt["saturation_index"] = si
			ix := p.Indices
			pt["indices"] = indicesJSON(&ix)
		}
		j.Points = append(j.Points, pt)
	}
	return j
}

// sweepRows are the CSV rows of one sample's sweep, width cells each: one
// per point, or one carrying the error.
func sweepRows(s SweepOutcome, width int) [][]string {
	if s.Err != nil {
		return [][]string{append([]string{s.Name, s.X.Var.String()}, append(make([]string, width-3), s.Err.Error())...)}
	}
	var rows [][]string
	for _, p := range s.Points {
		yv, yn := "", ""
		if s.Y != nil {
			yv, yn = fmtF(sig(p.Y, 6)), s.Y.Var.String()
		}
		row := []string{s.Name, s.X.Var.String(), fmtF(sig(p.X, 6)), yn, yv}
		if p.Err != nil {
			row = append(row, make([]string, width-len(row)-1)...)
			rows = append(rows, append(row, p.Err.Error()))
			continue
		}
		ix := p.Indices
		row = append(row, fmtF(dec(p.Result.PH, 3)), fmtF(sig(p.Result.IonicStrength, 4)), numOrBlank(ix.LSI, 2), numOrBlank(ix.RSI, 2))
		for _, m := range sweepMinerals {
			if v, ok := p.Result.SI(m); ok {
				row = append(row, fmtF(dec(v, 3)))
			} else {
				row = append(row, "")
			}
		}
		rows = append(rows, append(row, ""))
	}
	return rows
}

// writeSweepText writes the text table of one sample's sweep: pH, LSI and
// the SI of each mineral of sweepMinerals the water has, then the notes.
func writeSweepText(b *strings.Builder, s SweepOutcome) {
	if s.Err != nil {
		fmt.Fprintf(b, "%s: not computed: %v\n", s.Name, s.Err)
		return
	}
	fmt.Fprintf(b, "%s: sweep of %s", s.Name, s.X.Var)
	if s.Y != nil {
		fmt.Fprintf(b, " and %s", s.Y.Var)
	}
	b.WriteString("\n")
	shown := shownMinerals(s.Points)
	xw := titleWidth(variableTitle(s.X.Var), 8)
	b.WriteString("  " + padLeft(variableTitle(s.X.Var), xw))
	yw := 0
	if s.Y != nil {
		yw = titleWidth(variableTitle(s.Y.Var), 8)
		b.WriteString("  " + padLeft(variableTitle(s.Y.Var), yw))
	}
	fmt.Fprintf(b, "  %6s  %6s", "pH", "LSI")
	for _, m := range shown {
		b.WriteString("  " + padLeft(mineralTitle(m), titleWidth(mineralTitle(m), 8)))
	}
	b.WriteString("\n")
	notes := map[string]bool{}
	for _, p := range s.Points {
		b.WriteString("  " + padLeft(variableText(s.X.Var, p.X), xw))
		if s.Y != nil {
			b.WriteString("  " + padLeft(variableText(s.Y.Var, p.Y), yw))
		}
		if p.Err != nil {
			fmt.Fprintf(b, "  %v\n", p.Err)
			continue
		}
		fmt.Fprintf(b, "  %6.2f  %6s", p.Result.PH, siText(p.Indices.LSI))
		for _, wn := range p.Result.Warnings {
			notes[wn] = true
		}
		for _, m := range shown {
			cell := "–"
			if v, ok := p.Result.SI(m); ok {
				cell = siText(v)
			}
			b.WriteString("  " + padLeft(cell, titleWidth(mineralTitle(m), 8)))
		}
		b.WriteString("\n")
	}
	for _, wn := range slices.Sorted(maps.Keys(notes)) {
		fmt.Fprintf(b, "  - %s\n", wn)
	}
}

// shownMinerals are the minerals of sweepMinerals computed at any point.
func shownMinerals(points []saturation.Point) []string {
	var shown []string
	for _, m := range sweepMinerals {
		for _, p := range points {
			if p.Result != nil {
				if _, ok := p.Result.SI(m); ok {
					shown = append(shown, m)
					break
				}
			}
		}
	}
	return shown
}

func numOrBlank(v float64, decimals int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return ""
	}
	return fmtF(dec(v, decimals))
}
