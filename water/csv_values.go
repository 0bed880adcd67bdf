package water

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"
)

// DetectionPolicy says what a "<x" (below the detection limit x) value
// becomes.
type DetectionPolicy int

// The detection policies.
const (
	DetectionHalf  DetectionPolicy = iota // x/2 (the default; common practice)
	DetectionZero                         // 0
	DetectionLimit                        // x
)

// ParseDetectionPolicy returns the policy named s: "half", "zero" or "limit"
// (case and surrounding spaces are ignored).
func ParseDetectionPolicy(s string) (DetectionPolicy, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "half":
		return DetectionHalf, nil
	case "zero":
		return DetectionZero, nil
	case "limit":
		return DetectionLimit, nil
	}
	return 0, fmt.Errorf("unknown detection policy %q (want half, zero or limit)", s)
}

// String returns "half", "zero" or "limit".
func (p DetectionPolicy) String() string {
	switch p {
	case DetectionHalf:
		return "half"
	case DetectionZero:
		return "zero"
	case DetectionLimit:
		return "limit"
	}
	return "DetectionPolicy(" + strconv.Itoa(int(p)) + ")"
}

// substitute returns the value a "<limit" cell is taken as.
func (p DetectionPolicy) substitute(limit float64) float64 {
	switch p {
	case DetectionHalf:
		return limit / 2
	case DetectionZero:
		return 0
	case DetectionLimit:
		return limit
	}
	panic("water: invalid " + p.String())
}

type cellKind int

const (
	cellBlank       cellKind = iota
	cellNumber               // a plain number
	cellBelow                // "<x": below the detection limit x
	cellAbove                // ">x": above the measuring range
	cellNotDetected          // "n.d." with no limit
	cellBad                  // not a value; err says why
)

// cellValue is one value cell as written; it implements gocsv's
// TypeUnmarshaller for the long form and never fails there, so that a bad
// cell stops its sample and not the file.
type cellValue struct {
	raw  string
	kind cellKind
	v    float64 // the number, or the detection limit
	err  error   // for cellBad
}

// UnmarshalCSV parses s into c; the error is always nil (see cellValue).
func (c *cellValue) UnmarshalCSV(s string) error {
	*c = parseCell(s)
	return nil
}

// notDetected are the spellings of "not detected, no limit given", folded
// to lower case with spaces collapsed.
var notDetected = map[string]bool{
	"nd": true, "n.d.": true, "n.d": true, "n/d": true, "not detected": true, "bdl": true,
	"<dl": true, "< dl": true, "<lod": true, "< lod": true, "below detection limit": true,
}

// collapseSpaces trims s and collapses its runs of white space (non-breaking
// spaces included) to one space; a cell that needs none of that, as most
// do, is returned as it is, without allocating.
func collapseSpaces(s string) string {
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= utf8.RuneSelf || c == '\t' || c == '\n' || c == '\v' || c == '\f' || c == '\r' ||
			c == ' ' && (i == 0 || i == len(s)-1 || s[i+1] == ' ') {
			return strings.Join(strings.Fields(strings.ReplaceAll(s, "\u00a0", " ")), " ")
		}
	}
	return s
}

func parseCell(raw string) cellValue {
	c := cellValue{raw: raw}
	s := collapseSpaces(raw)
	switch {
	case s == "":
		c.kind = cellBlank
	case notDetected[strings.ToLower(s)]:
		c.kind = cellNotDetected
	case s[0] == '<':
		v, err := ParseNumber(s[1:])
		switch {
		case err != nil:
			c.kind, c.err = cellBad, errors.New("a detection limit needs a number after <")
		case v < 0:
			c.kind, c.err = cellBad, errors.New("negative detection limit")
		default:
			c.kind, c.v = cellBelow, v
		}
	case s[0] == '>':
		c.kind = cellAbove
	default:
		v, err := ParseNumber(s)
		switch {
		case err == nil:
			c.kind, c.v = cellNumber, v
		case strings.Contains(s, ","):
			c.kind, c.err = cellBad, errNotNumberComma
		default:
			c.kind, c.err = cellBad, ErrNotNumber
		}
	}
	return c
}

// number returns the plain number of c, or why it is not one.
func (c cellValue) number() (float64, error) {
	switch c.kind {
	case cellNumber:
		return c.v, nil
	case cellBad:
		return 0, c.err
	case cellAbove:
		return 0, errAboveRange
	}
	return 0, ErrNotNumber
}

// sampleBuilder collects the cells of one sample.
type sampleBuilder struct {
	s     Sample
	notes []string   // warnings on not-detected values
	dates DateFormat // how date cells are written
}

// set stores cell v of column c in the sample, or says why it cannot.
func (b *sampleBuilder) set(c headerColumn, v cellValue, policy DetectionPolicy) error {
	if c.kind == fieldAnalyte {
		return b.setConcentration(c, v, policy)
	}
	switch c.kind {
	case fieldName:
		b.s.Name = cleanText(v.raw)
		return nil
	case fieldDate:
		if b.s.Date == "" {
			d, err := NormalizeDate(v.raw, b.dates)
			if err != nil {
				return err
			}
			b.s.Date = d
		}
		return nil
	case fieldComment:
		return nil
	case fieldRole:
		r, err := ParseRole(cleanText(v.raw))
		if err != nil {
			return err
		}
		b.s.Role = r
		return nil
	case fieldSystem:
		b.s.System = cleanText(v.raw)
		return nil
	}
	x, err := v.number()
	if err != nil {
		return err
	}
	switch c.kind {
	case fieldTemperature, fieldPHTemperature:
		t := c.unit.ToCelsius(x)
		if t < -2 || t > 300 {
			return fmt.Errorf("%.4g °C is outside -2 to 300 °C", t)
		}
		if c.kind == fieldTemperature {
			b.s.Temperature = t
		} else {
			b.s.PHTemperature = t
		}
	case fieldPH:
		if x < 0 || x > 14 {
			return errors.New("impossible pH: outside 0 to 14")
		}
		b.s.PH = x
	case fieldDensity:
		d := c.unit.ToKgPerLitre(x)
		if d < 0.5 || d > 2.5 {
			return fmt.Errorf("density %.4g kg/L is outside 0.5 to 2.5 kg/L", d)
		}
		b.s.Density = d
	case fieldTDS:
		if x < 0 {
			return errors.New("negative dissolved solids")
		}
		b.s.TDS = x * c.unit.scale * 1000
	case fieldConductivity:
		if x < 0 {
			return errors.New("negative conductivity")
		}
		b.s.Conductivity = c.unit.ToMicroSiemens(x)
	case fieldUncertainty:
		return b.setUncertainty(c, x)
	case fieldPressure:
		p := x*c.press.scale + c.press.offset
		if p <= 0 || p > 1000 {
			return fmt.Errorf("pressure %.4g atm is outside 0 to 1000 atm", p)
		}
		b.s.Pressure = p
	default:
		return errNotAField
	}
	return nil
}

func (b *sampleBuilder) setConcentration(c headerColumn, v cellValue, policy DetectionPolicy) error {
	m := Measurement{Analyte: c.analyte, Unit: c.unit, Column: c.label}
	switch v.kind {
	case cellNumber:
		if v.v < 0 {
			return errNegative
		}
		m.Value = v.v
	case cellBelow:
		m.Value, m.BelowDetection, m.Limit = policy.substitute(v.v), true, v.v
	case cellNotDetected:
		b.notes = append(b.notes, c.label+": not detected and no detection limit given: taken as 0")
	case cellAbove:
		return errAboveRange
	case cellBad:
		return v.err
	default:
		return nil
	}
	b.s.Measurements = append(b.s.Measurements, m)
	return nil
}

// analysis converts the sample; notes on not-detected values join the
// warnings.
func (b *sampleBuilder) analysis(table *AnalyteTable) (Analysis, error) {
	entered := b.s.Measurements // the builder's own slice, handed over
	if len(entered) == 0 {
		entered = nil
	}
	a, err := b.s.analysis(table, entered)
	if err != nil {
		return Analysis{}, err
	}
	a.Warnings = append(a.Warnings, b.notes...)
	return a, nil
}
