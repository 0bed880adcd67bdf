package water

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
)

// fieldKind is what a column (wide) or an analyte row (long) holds.
type fieldKind int

const (
	fieldUnknown fieldKind = iota
	fieldBlank             // a header cell with nothing in it
	fieldName
	fieldDate
	fieldComment
	fieldRole
	fieldSystem
	fieldTemperature
	fieldPH
	fieldPHTemperature
	fieldDensity
	fieldTDS
	fieldConductivity
	fieldPressure
	fieldAnalyte
	fieldUncertainty // a sample's own uncertainty of a value (csv_uncertainty.go)
	fieldOther       // a column the equilibrium does not use, passed through (csv_other.go)
)

var fieldLabels = [...]string{
	fieldName: "name", fieldDate: "date", fieldComment: "comment", fieldRole: "role", fieldSystem: "system", fieldTemperature: "temperature",
	fieldPH: "pH", fieldPHTemperature: "pH_temperature", fieldDensity: "density", fieldTDS: "TDS",
	fieldConductivity: "conductivity", fieldPressure: "pressure",
}

// fieldNames maps a header label, folded by fieldKey, to the field it names.
var fieldNames = map[string]fieldKind{
	"name": fieldName, "sample": fieldName, "samplename": fieldName, "sampleid": fieldName, "id": fieldName,
	"date": fieldDate, "sampledate": fieldDate, "samplingdate": fieldDate,
	"comment": fieldComment, "comments": fieldComment, "note": fieldComment, "notes": fieldComment,
	"remark": fieldComment, "remarks": fieldComment,
	"role": fieldRole, "samplerole": fieldRole,
	"system": fieldSystem, "circuit": fieldSystem,
	"temperature": fieldTemperature, "temp": fieldTemperature, "t": fieldTemperature,
	"watertemperature": fieldTemperature, "sampletemperature": fieldTemperature,
	"ph":            fieldPH,
	"phtemperature": fieldPHTemperature, "phtemp": fieldPHTemperature, "temperatureofph": fieldPHTemperature,
	"density": fieldDensity,
	"tds":     fieldTDS, "totaldissolvedsolids": fieldTDS,
	"conductivity": fieldConductivity, "ec": fieldConductivity, "specificconductance": fieldConductivity,
	"electricalconductivity": fieldConductivity, "cond": fieldConductivity,
	"pressure": fieldPressure,
}

// fieldKey folds case and drops spaces, underscores, hyphens and dots:
// "pH_temperature", "pH temperature" and "PH-Temperature" meet.
func fieldKey(s string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(s) {
		switch r {
		case ' ', '_', '-', '.', '\t', '\u00a0':
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}

// pressureUnit converts a pressure to atm: v·scale + offset (offset 1 atm
// for gauge units).
type pressureUnit struct{ scale, offset float64 }

// pressureUnits are the pressure units a header may carry. 1 atm =
// 101.325 kPa = 1.01325 bar (definition); 1 psi = 6.894757 kPa.
var pressureUnits = map[string]pressureUnit{
	"atm": {1, 0}, "bar": {1 / 1.01325, 0}, "bara": {1 / 1.01325, 0}, "barg": {1 / 1.01325, 1},
	"kpa": {1 / 101.325, 0}, "mpa": {1000 / 101.325, 0},
	"psia": {6.894757 / 101.325, 0}, "psig": {6.894757 / 101.325, 1},
}

// headerColumn is one column of a wide header, or the analyte and unit of a
// long-form row.
type headerColumn struct {
	index   int    // 1-based column number
	header  string // as written, trimmed
	label   string // the header without its unit
	kind    fieldKind
	analyte *Analyte // the column's analyte, shared by the measurements of its rows
	unit    Unit
	press   pressureUnit
	uKey    string      // what an uncertainty column qualifies (UncertaintyKey)
	other   string      // fieldOther: the lab measurement it names, "" when not recognised
	problem *InputError // non-nil when the column cannot be used
}

// key returns what two columns of one sample may not share.
func (c headerColumn) key() string {
	switch c.kind {
	case fieldAnalyte:
		return "analyte " + c.analyte.Name
	case fieldUncertainty:
		return "uncertainty " + c.uKey
	case fieldOther:
		if c.other != "" && c.analyte != nil {
			return "lab " + c.other
		}
		return "other " + strconv.Itoa(c.index) + " " + c.label
	}
	return "field " + strconv.Itoa(int(c.kind))
}

// componentKey returns the component a concentration column adds to, or ""
// for alkalinity forms (which Sample.Analysis reconciles) and fields.
func (c headerColumn) componentKey() string {
	if c.kind != fieldAnalyte || c.analyte.IsAlkalinity() {
		return ""
	}
	return c.analyte.Component
}

func (c headerColumn) name() string {
	switch c.kind {
	case fieldAnalyte:
		return c.analyte.Name
	case fieldUncertainty:
		return "the uncertainty of " + c.uKey
	case fieldOther:
		return c.label
	}
	return fieldLabels[c.kind]
}

// splitHeader splits "Ca [mg/L]" or "Ca (mg/L)" into label and unit.
// A header with no bracket at its end has no unit.
func splitHeader(h string) (label, unit string, hasUnit bool) {
	switch {
	case strings.HasSuffix(h, "]"):
		if i := strings.LastIndex(h, "["); i >= 0 {
			return strings.TrimSpace(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1]), true
		}
	case strings.HasSuffix(h, ")"):
		depth := 0
		for i := len(h) - 1; i >= 0; i-- {
			switch h[i] {
			case ')':
				depth++
			case '(':
				depth--
				if depth == 0 {
					return strings.TrimSpace(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1]), true
				}
			}
		}
	}
	return h, "", false
}

// normalizeHeader trims a header, makes non-breaking spaces plain and
// collapses runs of spaces.
func normalizeHeader(h string) string {
	h = strings.ReplaceAll(h, "\u00a0", " ")
	return strings.Join(strings.Fields(h), " ")
}

// knownLabel reports whether label names a field or an analyte.
func (rd *reader) knownLabel(label string) bool {
	if _, ok := fieldNames[fieldKey(label)]; ok {
		return true
	}
	_, ok := rd.table.Lookup(label)
	return ok
}

// classify decides what label with unit text unit (hasUnit false when none
// is written) holds. It returns the column with kind fieldOther when label
// names neither a field nor an analyte (classifyOther); a non-nil error says
// why the column cannot be used, and unitFault whether its unit (rather than
// its label) is at fault.
func (rd *reader) classify(label, unit string, hasUnit bool) (c headerColumn, unitFault bool, err error) {
	c.label = label
	if label == "" && !hasUnit {
		c.kind = fieldBlank
		return c, false, nil
	}
	if target, ok := uncertaintyTarget(label); ok {
		c, unitFault, err = rd.classifyUncertainty(target, unit, hasUnit)
		c.label = label
		return c, unitFault, err
	}
	if k, ok := fieldNames[fieldKey(label)]; ok {
		c.kind = k
	} else if a, ok := rd.table.Lookup(label); ok {
		c.kind, c.analyte = fieldAnalyte, &a
	} else {
		return rd.classifyOther(label, unit, hasUnit), false, nil
	}
	switch c.kind {
	case fieldName, fieldDate, fieldComment, fieldRole, fieldSystem:
		return c, false, nil // a bracket on a text column is a format hint
	case fieldPH:
		if hasUnit {
			u, err := ParseUnit(unit)
			if err != nil || u.Quantity != Dimensionless {
				return c, true, fmt.Errorf("pH takes no unit, not %q", unit)
			}
		}
		return c, false, nil
	case fieldPressure:
		if !hasUnit {
			return c, true, errors.New("no unit: write pressure [atm], [bar], [kPa], [psia] or [psig]")
		}
		p, ok := pressureUnits[strings.ToLower(strings.ReplaceAll(unit, " ", ""))]
		if !ok {
			return c, true, fmt.Errorf("unknown pressure unit %q (try atm, bar, barg, kPa, MPa, psia, psig)", unit)
		}
		c.press = p
		return c, false, nil
	}
	if !hasUnit {
		return c, true, fmt.Errorf("no unit: write it in brackets, as in %q", exampleHeader(c))
	}
	u, err := ParseUnit(unit)
	if err != nil {
		return c, true, err
	}
	c.unit = u
	switch c.kind {
	case fieldTemperature, fieldPHTemperature:
		if u.Quantity != Temperature {
			return c, true, fmt.Errorf("%s needs a temperature unit (C, F or K), not %q", c.name(), unit)
		}
	case fieldDensity:
		if u.Quantity != Density {
			return c, true, fmt.Errorf("density needs a density unit (kg/L, g/mL, kg/m3), not %q", unit)
		}
	case fieldConductivity:
		if u.Quantity != Conductivity {
			return c, true, fmt.Errorf("conductivity needs a conductivity unit (µS/cm, mS/cm), not %q", unit)
		}
	case fieldTDS:
		if u.Quantity != Concentration || u.amount != byMass || u.Basis != PerLitre || u.As != "" {
			return c, true, fmt.Errorf("TDS needs a mass per litre (mg/L or g/L), not %q", unit)
		}
	case fieldAnalyte:
		if u.Quantity != Concentration {
			return c, true, fmt.Errorf("unit %q is not a concentration", unit)
		}
		if _, err := u.Amount(*c.analyte, 1, rd.table); err != nil {
			return c, true, err
		}
		c.unit = u.withForm(c.analyte.Component, rd.table)
	}
	return c, false, nil
}

// exampleHeader returns a well-formed header for the kind of c, for messages.
func exampleHeader(c headerColumn) string {
	switch c.kind {
	case fieldTemperature:
		return c.label + " [C]"
	case fieldPHTemperature:
		return c.label + " [C]"
	case fieldDensity:
		return c.label + " [kg/L]"
	case fieldConductivity:
		return c.label + " [µS/cm]"
	case fieldAnalyte:
		if c.analyte.IsAlkalinity() && c.analyte.Name == "alkalinity" {
			return c.label + " [mg/L as CaCO3]"
		}
	}
	return c.label + " [mg/L]"
}
