package reports

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"scalerisk/saturation"
)

// BalanceOutcome is the answer for one makeup–tower pair: its mass
// balance, and the tower's margin to its limits.
type BalanceOutcome struct {
	Balance  *saturation.Balance
	SameDate bool    // false when only the system column paired them
	Blowdown float64 // m³/h used for kg/day, 0 when none
	Margin   *saturation.MarginResult
	// MarginErr says why the margin could not be computed.
	MarginErr error
	// Name, Err: a pair that could not be balanced.
	Name string
	Err  error
}

// BalanceJSON is one pair of the JSON output of balance. The key names are
// a contract: extend, never rename.
type BalanceJSON struct {
	Tower          string        `json:"tower"`
	Makeup         string        `json:"makeup"`
	System         string        `json:"system"`
	Date           string        `json:"date"`
	SameDate       bool          `json:"same_date"`
	Cycles         *float64      `json:"cycles"`
	CyclesBasis    []string      `json:"cycles_basis"`
	CyclesSpread   *float64      `json:"cycles_spread"`
	BlowdownM3PerH *float64      `json:"blowdown_m3_per_h"`
	Ions           []IonJSON     `json:"ions"`
	Deposits       []DepositJSON `json:"deposits"`
	Notes          []string      `json:"notes"`
	Margin         *MarginJSON   `json:"margin"`
	Error          *string       `json:"error"`
}

// IonJSON is one ion of a balance.
type IonJSON struct {
	Ion             string   `json:"ion"`
	Unit            string   `json:"unit"`
	Makeup          float64  `json:"makeup"`
	Tower           float64  `json:"tower"`
	Cycles          float64  `json:"cycles"`
	Conservative    bool     `json:"conservative"`
	Expected        float64  `json:"expected"`
	Deficit         float64  `json:"deficit"`
	DeficitKgPerDay *float64 `json:"deficit_kg_per_day"`
	Missing         bool     `json:"missing"`
	Gained          bool     `json:"gained"`
}

// DepositJSON is a likely deposit.
type DepositJSON struct {
	Name     string `json:"name"`
	Formula  string `json:"formula"`
	Evidence string `json:"evidence"`
}

// MarginJSON is how far a recirculating water is from its limits.
type MarginJSON struct {
	Profile string            `json:"profile"`
	Limits  []LimitMarginJSON `json:"limits"`
	// FurtherFactor is how many times the water can still be concentrated
	// (1: a limit is already passed); MaxCycles and CyclesMargin are in
	// cycles of the system when its cycles are known.
	FurtherFactor float64  `json:"further_factor"`
	Limiting      string   `json:"limiting"`
	Exceeded      []string `json:"exceeded"`
	MaxCycles     *float64 `json:"max_cycles"`
	CyclesMargin  *float64 `json:"cycles_margin"`
	JudgementJSON
	Error *string `json:"error,omitempty"`
}

// LimitMarginJSON is one limit of a margin.
type LimitMarginJSON struct {
	Quantity              string   `json:"quantity"`
	Max                   float64  `json:"max"`
	Value                 float64  `json:"value"`
	SkinValue             *float64 `json:"skin_value"`
	Margin                float64  `json:"margin"`
	GoverningTemperatureC float64  `json:"governing_temperature_c"`
}

// NewBalanceWriter returns a writer of balance answers, one pair at a
// time, in format f.
func NewBalanceWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[BalanceOutcome] {
	return NewSampleWriter(w, f, Layout[BalanceOutcome]{
		JSON: func(b BalanceOutcome) any { return balanceJSON(b) },
		Header: []string{"tower", "makeup", "system", "date", "cycles", "ion", "unit", "makeup_value", "tower_value",
			"ion_cycles", "expected", "deficit", "deficit_kg_per_day", "missing", "gained", "deposits", "error"},
		CSV:     func(b BalanceOutcome) [][]string { return balanceRows(balanceJSON(b)) },
		Text:    writeBalanceText,
		Caution: Caution,
	}, opt)
}

// MarginOf is the JSON of a margin (nil for none).
func MarginOf(m *saturation.MarginResult, err error) *MarginJSON {
	if err != nil {
		msg := err.Error()
		return &MarginJSON{Error: &msg, Limits: []LimitMarginJSON{}, Exceeded: []string{}}
	}
	if m == nil {
		return nil
	}
	j := &MarginJSON{Profile: m.Profile.Name, Limits: []LimitMarginJSON{}, Exceeded: []string{},
		FurtherFactor: dec(m.Further.MaxCycles, 3), Limiting: m.Further.Limiting,
		MaxCycles:     optional(m.MaxCycles, func(x float64) float64 { return dec(x, 2) }),
		CyclesMargin:  optional(m.CyclesMargin, func(x float64) float64 { return dec(x, 2) }),
		JudgementJSON: judgementJSON(m.Further.Judged, "cycles")}
	j.Exceeded = append(j.Exceeded, m.Further.Exceeded...)
	j.Limits = append(j.Limits, limitMarginsJSON(m.Limits)...)
	return j
}

// limitMarginsJSON is the JSON of the limits of a margin, each at the bulk
// and at the skin.
func limitMarginsJSON(ls []saturation.LimitMargin) []LimitMarginJSON {
	out := []LimitMarginJSON{}
	for _, l := range ls {
		out = append(out, LimitMarginJSON{Quantity: l.Quantity, Max: l.Max, Value: sig(l.Value, 4),
			SkinValue: optional(l.SkinValue, func(x float64) float64 { return sig(x, 4) }),
			Margin:    sig(l.Margin, 4), GoverningTemperatureC: dec(l.Governing, 2)})
	}
	return out
}

// balanceJSON is the JSON object of one pair.
func balanceJSON(o BalanceOutcome) BalanceJSON {
	j := BalanceJSON{Tower: o.Name, CyclesBasis: []string{}, Ions: []IonJSON{}, Deposits: []DepositJSON{}, Notes: []string{}}
	if o.Err != nil {
		msg := o.Err.Error()
		j.Error = &msg
		return j
	}
	b := o.Balance
	j.Tower, j.Makeup, j.System, j.Date, j.SameDate = b.Tower, b.Makeup, b.System, b.Date, o.SameDate
	r2 := func(x float64) float64 { return dec(x, 2) }
	j.Cycles, j.CyclesSpread = optional(b.Cycles, r2), optional(b.Spread, r2)
	j.CyclesBasis = append(j.CyclesBasis, b.Basis...)
	if o.Blowdown > 0 {
		j.BlowdownM3PerH = optional(o.Blowdown, func(x float64) float64 { return sig(x, 4) })
	}
	for _, ic := range b.Ions {
		j.Ions = append(j.Ions, IonJSON{Ion: ic.Ion, Unit: ic.Unit, Makeup: sig(ic.Makeup, 4), Tower: sig(ic.Tower, 4),
			Cycles: dec(ic.Cycles, 2), Conservative: ic.Conservative, Expected: sig(ic.Expected, 4), Deficit: sig(ic.Deficit, 4),
			DeficitKgPerDay: optional(ic.DeficitKgPerDay, func(x float64) float64 { return sig(x, 3) }),
			Missing:         ic.Missing, Gained: ic.Gained})
	}
	for _, d := range b.Deposits {
		j.Deposits = append(j.Deposits, DepositJSON(d))
	}
	j.Notes = append(j.Notes, b.Notes...)
	if !o.SameDate {
		j.Notes = append(j.Notes, "paired by the system column: the two samples were taken on different dates")
	}
	j.Margin = MarginOf(o.Margin, o.MarginErr)
	return j
}

// balanceRows are the CSV rows of one pair: one per ion.
func balanceRows(j BalanceJSON) [][]string {
	if j.Error != nil {
		return [][]string{{j.Tower, j.Makeup, j.System, j.Date, "", "", "", "", "", "", "", "", "", "", "", "", *j.Error}}
	}
	var deps []string
	for _, d := range j.Deposits {
		deps = append(deps, d.Name)
	}
	var rows [][]string
	for _, ic := range j.Ions {
		rows = append(rows, []string{j.Tower, j.Makeup, j.System, j.Date, fmtG(j.Cycles), ic.Ion, ic.Unit, fmtF(ic.Makeup),
			fmtF(ic.Tower), fmtF(ic.Cycles), fmtF(ic.Expected), fmtF(ic.Deficit), fmtG(ic.DeficitKgPerDay),
			strconv.FormatBool(ic.Missing), strconv.FormatBool(ic.Gained), strings.Join(deps, "; "), ""})
	}
	return rows
}

// writeBalanceText writes the text block of one pair: its cycles, the
// table of ions, the likely deposits and the tower's margin.
func writeBalanceText(b *strings.Builder, o BalanceOutcome) {
	if o.Err != nil {
		fmt.Fprintf(b, "%s: not balanced: %v\n", o.Name, o.Err)
		return
	}
	bal := o.Balance
	fmt.Fprintf(b, "%s against its makeup %s", bal.Tower, bal.Makeup)
	if bal.System != "" {
		fmt.Fprintf(b, " (system %s", bal.System)
		if bal.Date != "" {
			fmt.Fprintf(b, ", %s", bal.Date)
		}
		b.WriteString(")")
	}
	fmt.Fprintf(b, ": %.2f cycles of concentration (median of %s; spread %.2f).\n", bal.Cycles, strings.Join(bal.Basis, ", "), bal.Spread)
	fmt.Fprintf(b, "  %-12s  %10s  %10s  %6s  %10s  %8s  %s\n", "ion", "makeup", "tower", "cycles", "deficit", "kg/day", "")
	for _, ic := range bal.Ions {
		flag := ""
		switch {
		case ic.Missing:
			flag = "missing from the tower"
		case ic.Gained:
			flag = "gained in the system"
		}
		kg := "–"
		if !math.IsNaN(ic.DeficitKgPerDay) {
			kg = fmt.Sprintf("%.3g", ic.DeficitKgPerDay)
		}
		fmt.Fprintf(b, "  %-12s  %10.4g  %10.4g  %6.2f  %10.4g  %8s  %s\n", ic.Ion, ic.Makeup, ic.Tower, ic.Cycles, ic.Deficit, kg, flag)
	}
	if len(bal.Deposits) == 0 {
		b.WriteString("  No ion is missing beyond 10 % of the tower's cycles: no deposit is indicated by the balance.\n")
	}
	for _, d := range bal.Deposits {
		fmt.Fprintf(b, "  Likely deposit: %s (%s): %s.\n", d.Name, d.Formula, d.Evidence)
	}
	if o.Blowdown > 0 {
		fmt.Fprintf(b, "  kg/day: the deficit carried by %.3g m³/h of blowdown (the mass left in the system each day).\n", o.Blowdown)
	}
	writeMarginText(b, o.Margin, o.MarginErr)
	notes := append([]string(nil), bal.Notes...)
	if !o.SameDate {
		notes = append(notes, "paired by the system column: the two samples were taken on different dates")
	}
	writeNotes(b, notes)
}

// writeMarginText says how far a recirculating water is from its limits.
func writeMarginText(b *strings.Builder, m *saturation.MarginResult, err error) {
	if err != nil {
		fmt.Fprintf(b, "  Margin to the limits not computed: %v\n", err)
		return
	}
	if m == nil {
		return
	}
	f := m.Further
	where := fmt.Sprintf("%.3g °C", f.Judged.Governing)
	if f.Judged.SkinGoverns() {
		where = fmt.Sprintf("the %g °C skin", f.Judged.Skin)
	}
	switch {
	case len(f.Exceeded) > 0:
		for _, q := range f.Exceeded {
			if note := saturation.FitNote(nil, q, f.Judged.Governing); note != "" {
				where += "; " + strings.TrimPrefix(q, "si:") + ": " + note
			}
		}
		fmt.Fprintf(b, "  Margin under the %s profile: none — already past the limit for %s (at %s).\n", m.Profile.Name, quantityLabels(f.Exceeded), clientText(where))
	case f.Limiting == "":
		fmt.Fprintf(b, "  Margin under the %s profile: no limit is reached even at %.3g times the present concentration.\n", m.Profile.Name, f.MaxCycles)
	case !math.IsNaN(m.MaxCycles):
		fmt.Fprintf(b, "  Margin under the %s profile: the water can be concentrated %.2f times further, to %.2f cycles (%.2f more), when %s reaches its limit (at %s).\n",
			m.Profile.Name, f.MaxCycles, m.MaxCycles, m.CyclesMargin, quantityLabel(f.Limiting), clientText(where))
	default:
		fmt.Fprintf(b, "  Margin under the %s profile: the water can be concentrated %.2f times further, when %s reaches its limit (at %s).\n",
			m.Profile.Name, f.MaxCycles, quantityLabel(f.Limiting), clientText(where))
	}
	writeLimitMargins(b, m.Limits)
}

// writeLimitMargins writes a line per limit: the worse of the bulk and
// skin values, the limit, the margin and the temperature it was taken at.
func writeLimitMargins(b *strings.Builder, ls []saturation.LimitMargin) {
	for _, l := range ls {
		fmt.Fprintf(b, "    %-40s  %10.4g  limit %-8g  margin %+.3g (at %.3g °C)\n", quantityLabel(l.Quantity), math.Max(l.Value, nanTo(l.SkinValue, l.Value)), l.Max, l.Margin, l.Governing)
	}
}

// nanTo returns x, or def when x is NaN.
func nanTo(x, def float64) float64 {
	if math.IsNaN(x) {
		return def
	}
	return x
}
