package water

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// ErrNotUsed marks the note a read gives once per file on the columns it
// keeps and passes through but does not use (see OtherValue; total
// hardness and P-alkalinity read for the data-quality checks are used, and
// not named). The note is an *InputError wrapping ErrNotUsed; it is a
// notice, not a fault: the samples are computed all the same.
var ErrNotUsed = errors.New("not used in the equilibrium")

// OtherValue is a cell of a column the equilibrium does not use: a common
// laboratory measurement that is not speciated (turbidity, TOC, free
// chlorine, colour …) or a column the reader does not recognise. It is kept
// as written and passed through to the outputs. Total hardness and
// P-alkalinity in a concentration unit are read as numbers for the
// data-quality checks instead (Analysis.TotalHardness, PAlkalinity): only a
// cell of theirs that is not a number is an OtherValue.
type OtherValue struct {
	Column string // the header as written, e.g. "Turbidity [NTU]"
	Name   string // the known measurement it names ("turbidity"), or "" when not recognised
	Value  string // the cell as written, trimmed
}

// Label returns the name of the measurement (its usual name where the
// column is a known one, else the column's label) and the unit of the
// column's header ("" when the header has none): "Turbidity [NTU]" gives
// "turbidity" and "NTU".
func (o OtherValue) Label() (name, unit string) {
	label, unit, _ := splitHeader(o.Column)
	if o.Name != "" {
		return o.Name, unit
	}
	return label, unit
}

// labColumns maps a header label, folded by fieldKey, to the laboratory
// measurement it names, for the measurements a water laboratory commonly
// reports that the equilibrium does not use. Total hardness and
// P-alkalinity are read as numbers for data-quality checks instead
// (checkedLab; Analysis.TotalHardness, Analysis.PAlkalinity) where the
// header's unit is a concentration. The names are the usual
// ones of Standard Methods (APHA/AWWA/WEF; from memory).
var labColumns = map[string]string{
	"totalhardness": "total hardness", "hardness": "total hardness", "th": "total hardness",
	"totalhardnessascaco3": "total hardness", "hardnesstotal": "total hardness",
	"palkalinity": "P-alkalinity", "palk": "P-alkalinity", "phenolphthaleinalkalinity": "P-alkalinity",
	"turbidity": "turbidity", "turb": "turbidity",
	"toc": "TOC", "totalorganiccarbon": "TOC", "doc": "DOC", "dissolvedorganiccarbon": "DOC",
	"cod": "COD", "chemicaloxygendemand": "COD", "bod": "BOD", "bod5": "BOD",
	"freechlorine": "free chlorine", "freecl2": "free chlorine", "freeresidualchlorine": "free chlorine",
	"totalchlorine": "total chlorine", "totalcl2": "total chlorine", "combinedchlorine": "combined chlorine",
	"chlorinedioxide": "chlorine dioxide", "clo2": "chlorine dioxide",
	"colour": "colour", "color": "colour", "truecolour": "colour", "truecolor": "colour",
	"apparentcolour": "colour", "apparentcolor": "colour",
	"tss": "suspended solids", "suspendedsolids": "suspended solids", "totalsuspendedsolids": "suspended solids",
	"dissolvedoxygen": "dissolved oxygen", "do": "dissolved oxygen", "oxygen": "dissolved oxygen",
	"orp": "redox potential", "redoxpotential": "redox potential",
	"sdi": "silt density index", "siltdensityindex": "silt density index",
	"oilandgrease": "oil and grease", "oil": "oil and grease",
	"bacteria": "bacteria", "totalcoliforms": "total coliforms", "ecoli": "E. coli",
	"heterotrophicplatecount": "heterotrophic plate count", "hpc": "heterotrophic plate count",
	"legionella": "Legionella", "atp": "ATP",
	"copper": "copper", "cu": "copper", "zinc": "zinc", "zn": "zinc", "aluminium": "aluminium",
	"aluminum": "aluminium", "al": "aluminium", "molybdate": "molybdate", "mo": "molybdate",
	"inhibitor": "inhibitor", "phosphonate": "phosphonate", "azole": "azole", "tolyltriazole": "azole",
}

// checkedLab are the lab measurements read as numbers too, with the
// analyte of data/analytes.csv whose unit rules they follow (both are
// reported as CaCO3 by convention, Standard Methods 2340 and 2320).
var checkedLab = map[string]string{"total hardness": "Ca-hardness", "P-alkalinity": "alkalinity"}

// classifyOther returns the column of a label that names neither a field
// nor an analyte: kept as text, with its number read when it is total
// hardness or P-alkalinity in a concentration unit.
func (rd *reader) classifyOther(label, unit string, hasUnit bool) headerColumn {
	c := headerColumn{label: label, kind: fieldOther, other: labColumns[fieldKey(label)]}
	form, ok := checkedLab[c.other]
	if !ok {
		return c
	}
	a, ok := rd.table.Lookup(form)
	if !ok {
		return c
	}
	if !hasUnit {
		unit = "mg/L as CaCO3"
	}
	u, err := ParseUnit(unit)
	if err != nil || u.Quantity != Concentration {
		return c
	}
	if _, err := u.Amount(a, 1, rd.table); err != nil {
		return c
	}
	c.analyte, c.unit = &a, u
	return c
}

// setOther keeps the cell of an other column, or for a checked lab
// measurement (checked) its value in mg/L as CaCO3 (a per-kg unit is taken
// as per litre: the checks have a 10 % tolerance). A cell of a checked
// measurement that is not a number is kept as written.
func (b *sampleBuilder) setOther(c headerColumn, v cellValue, table *AnalyteTable) {
	mol, err := math.NaN(), error(nil)
	if c.checked() && v.kind == cellNumber && v.v >= 0 {
		mol, err = c.unit.Amount(*c.analyte, v.v, table)
	}
	if math.IsNaN(mol) || err != nil {
		b.s.Other = append(b.s.Other, OtherValue{Column: c.header, Name: c.other, Value: cleanText(v.raw)})
		return
	}
	switch c.other {
	case "total hardness":
		b.s.TotalHardness = AsCaCO3(2 * mol) // mol of Ca + Mg, 2 eq each
	case "P-alkalinity":
		b.s.PAlkalinity = AsCaCO3(mol)
	}
}

// checked says whether c is a lab measurement read as a number for the
// data-quality checks (total hardness or P-alkalinity in a concentration
// unit): used, so not named in the note on the columns passed through.
func (c headerColumn) checked() bool { return c.kind == fieldOther && c.analyte != nil }

// otherNote returns the once-per-file note on the other columns of cols,
// or nil when there are none (the checked ones are not named).
func (rd *reader) otherNote(cols []headerColumn, line int) error {
	var known, unknown []string
	for _, c := range cols {
		if c.kind != fieldOther || c.checked() {
			continue
		}
		if c.other != "" {
			known = append(known, strconv.Quote(clipText(c.header)))
		} else {
			unknown = append(unknown, strconv.Quote(clipText(c.header)))
		}
	}
	return rd.notUsedNote(line, known, unknown)
}

// notUsedNote words the note on the known and the unrecognised other
// columns (each quoted); nil when both are empty.
func (rd *reader) notUsedNote(line int, known, unknown []string) error {
	var parts []string
	if len(known) > 0 {
		parts = append(parts, fmt.Sprintf("%s kept and passed through", strings.Join(known, ", ")))
	}
	if len(unknown) > 0 {
		parts = append(parts, fmt.Sprintf("%s not recognised, kept as written (if one is an analyte, check its name: `scalerisk template` writes every known column)",
			strings.Join(unknown, ", ")))
	}
	if len(parts) == 0 {
		return nil
	}
	return &InputError{File: rd.file, Line: line, Err: fmt.Errorf("%s (%w)", strings.Join(parts, "; "), ErrNotUsed)}
}

// Constants of the lab-measurement checks.
const (
	// hardnessTolerance is the relative disagreement between the reported
	// total hardness and Ca + Mg as CaCO3 (Standard Methods 2340 B, hardness
	// by calculation, from memory) above which a data-quality flag is
	// raised, with hardnessSlack mg/L as CaCO3 allowed besides for low
	// hardness; common practice.
	hardnessTolerance = 0.10
	hardnessSlack     = 2.0
	// phenolphthaleinPH is the end point of the P-alkalinity titration, pH
	// 8.3 (Standard Methods 2320 B, from memory); a water below
	// phenolphthaleinPH − pAlkPHSlack has no P-alkalinity.
	phenolphthaleinPH = 8.3
	pAlkPHSlack       = 0.2
	// pAlkSlack is the P-alkalinity, mg/L as CaCO3, read as zero in the pH
	// check (the titration's usual resolution; common practice).
	pAlkSlack = 2.0
)

// LabCheckKind names a check of a laboratory measurement the equilibrium
// does not use (LabCheck).
type LabCheckKind int

// The lab-measurement checks, in the order Quality runs them.
const (
	// HardnessCheck holds the reported total hardness against Ca + Mg as
	// CaCO3 (Standard Methods 2340 B, hardness by calculation).
	HardnessCheck LabCheckKind = iota + 1
	// PAlkalinityCheck holds the P-alkalinity against the total (M-)
	// alkalinity, which it cannot exceed.
	PAlkalinityCheck
	// PAlkalinityPHCheck holds the P-alkalinity against the pH: a water
	// below the phenolphthalein end point (pH 8.3) has none.
	PAlkalinityPHCheck
)

// LabCheck is the outcome of one check of a laboratory measurement that
// the equilibrium does not use (Quality.Lab). Value is the lab's
// measurement, mg/L as CaCO3; Against what it is held against: Ca + Mg as
// CaCO3 (mg/L) for HardnessCheck, the total alkalinity (mg/L as CaCO3)
// for PAlkalinityCheck, the pH for PAlkalinityPHCheck. Limit says in words
// what passes. A check that fails also has its flag in Quality.Flags.
type LabCheck struct {
	Kind           LabCheckKind
	Value, Against float64
	Limit          string
	Pass           bool
}

// checkLab runs the checks of the lab measurements that are not used in
// the equilibrium, where the lab reported them: total hardness against
// Ca + Mg as CaCO3, and P-alkalinity against the total (M-) alkalinity and
// the pH. Each check that ran is listed in q.Lab; each that fails adds a
// flag.
func (q *Quality) checkLab(a Analysis) {
	if th := a.TotalHardness; !math.IsNaN(th) && (a.Measured[Ca] || a.Measured[Mg]) {
		caMg := AsCaCO3(2 * (a.Totals[Ca] + a.Totals[Mg]) * a.WaterPerLitre)
		pass := !(math.Abs(th-caMg) > hardnessTolerance*math.Max(th, caMg)+hardnessSlack)
		q.Lab = append(q.Lab, LabCheck{Kind: HardnessCheck, Value: th, Against: caMg, Pass: pass,
			Limit: fmt.Sprintf("within %.0f %% of the larger, plus %.0f mg/L as CaCO3", 100*hardnessTolerance, hardnessSlack)})
		if !pass {
			q.Flags = append(q.Flags, fmt.Sprintf(
				"total hardness %.0f mg/L as CaCO3 differs from Ca + Mg (%.0f mg/L as CaCO3) by more than %.0f %%: a hardness, Ca or Mg value may be in error",
				th, caMg, 100*hardnessTolerance))
		}
	}
	p := a.PAlkalinity
	if math.IsNaN(p) {
		return
	}
	if m := a.AlkalinityAsCaCO3(); !math.IsNaN(m) {
		pass := p <= m+pAlkSlack
		q.Lab = append(q.Lab, LabCheck{Kind: PAlkalinityCheck, Value: p, Against: m, Pass: pass,
			Limit: fmt.Sprintf("not above the total alkalinity, %.0f mg/L as CaCO3 allowed", pAlkSlack)})
		if !pass {
			q.Flags = append(q.Flags, fmt.Sprintf(
				"P-alkalinity %.0f mg/L as CaCO3 exceeds the total (M-) alkalinity %.0f: one of them is in error", p, m))
		}
	}
	if !math.IsNaN(a.PH) {
		pass := p <= pAlkSlack || a.PH >= phenolphthaleinPH-pAlkPHSlack
		q.Lab = append(q.Lab, LabCheck{Kind: PAlkalinityPHCheck, Value: p, Against: a.PH, Pass: pass,
			Limit: fmt.Sprintf("none below pH %.1f (the phenolphthalein end point is pH %.1f), %.0f mg/L as CaCO3 allowed",
				phenolphthaleinPH-pAlkPHSlack, phenolphthaleinPH, pAlkSlack)})
		if !pass {
			q.Flags = append(q.Flags, fmt.Sprintf(
				"P-alkalinity %.0f mg/L as CaCO3 at pH %.2f: a water below pH %.1f (the phenolphthalein end point) has none; the pH or the P-alkalinity is in error",
				p, a.PH, phenolphthaleinPH))
		}
	}
}
