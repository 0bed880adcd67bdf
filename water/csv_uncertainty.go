package water

import (
	"errors"
	"fmt"
	"strings"
)

// A sample's own standard uncertainties are columns named like the value
// they qualify followed by "±" (or "+/-"):
//
//	Ca ± [%]             relative, percent of the reported value
//	alkalinity ± [%]     (any analyte; its component's total is drawn)
//	pH ±                 pH units
//	temperature ± [C]    °C (also K)
//
// A blank cell leaves the default of data/uncertainty.csv. They are read
// into Sample.Uncertainty and Analysis.Uncertainty, keyed by UncertaintyKey.

// uncertaintySuffixes mark an uncertainty column.
var uncertaintySuffixes = []string{"±", "+/-"}

// uncertaintyTarget returns the label an uncertainty column qualifies
// ("Ca" for "Ca ±"), and whether label is one.
func uncertaintyTarget(label string) (string, bool) {
	for _, sfx := range uncertaintySuffixes {
		if base, ok := strings.CutSuffix(strings.TrimSpace(label), sfx); ok {
			return strings.TrimSpace(base), true
		}
	}
	return "", false
}

// UncertaintyKey returns the key of Analysis.Uncertainty for an analyte:
// its component's symbol ("Ca", "S" for sulfate, "Si" for silica), or
// "alkalinity" for the alkalinity forms. pH and temperature use "pH" and
// "temperature".
func UncertaintyKey(a Analyte) string {
	if a.IsAlkalinity() {
		return "alkalinity"
	}
	return a.Component
}

// classifyUncertainty classifies the uncertainty column of target with
// unit text unit.
func (rd *reader) classifyUncertainty(target, unit string, hasUnit bool) (c headerColumn, unitFault bool, err error) {
	c.kind = fieldUncertainty
	unit = strings.TrimSpace(unit)
	switch k := fieldNames[fieldKey(target)]; {
	case k == fieldPH:
		c.uKey = "pH"
		if hasUnit && !strings.EqualFold(unit, "pH") {
			return c, true, fmt.Errorf("the uncertainty of pH is in pH units, not %q", unit)
		}
	case k == fieldTemperature:
		c.uKey = "temperature"
		u, err := ParseUnit(unit)
		if !hasUnit || err != nil || u.Quantity != Temperature {
			return c, true, errors.New("the uncertainty of temperature needs a unit: [C] or [K]")
		}
		c.unit = u
	default:
		a, ok := rd.table.Lookup(target)
		if !ok {
			return c, false, fmt.Errorf("%q is not an analyte, pH or temperature: nothing to give an uncertainty to", target)
		}
		c.analyte, c.uKey = &a, UncertaintyKey(a)
		if !hasUnit || unit != "%" {
			return c, true, fmt.Errorf("the uncertainty of %s is a percentage of the value: write %q", target, target+" ± [%]")
		}
	}
	return c, false, nil
}

// setUncertainty stores the value x of uncertainty column c: a fraction
// for a percentage, pH units, or °C.
func (b *sampleBuilder) setUncertainty(c headerColumn, x float64) error {
	var u float64
	switch c.uKey {
	case "pH":
		if !(x > 0 && x <= 2) {
			return errors.New("the uncertainty of pH must be above 0 and at most 2 pH units")
		}
		u = x
	case "temperature":
		u = c.unit.ToCelsius(x) - c.unit.ToCelsius(0) // a difference
		if !(u > 0 && u <= 20) {
			return errors.New("the uncertainty of temperature must be above 0 and at most 20 °C")
		}
	default:
		if !(x > 0 && x < 100) {
			return errors.New("a relative uncertainty must be above 0 and below 100 %")
		}
		u = x / 100
	}
	if b.s.Uncertainty == nil {
		b.s.Uncertainty = map[string]float64{}
	}
	b.s.Uncertainty[c.uKey] = u
	return nil
}
