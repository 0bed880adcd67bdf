package saturation

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"scalerisk/water"
)

// form is one concentration a limit names: an analyte of the analyte table
// in mg/L of its own form ("SiO2", "Mg", "PO4", "Mg-hardness"), or in mg/L
// as CaCO3 when written ANALYTE_as_CaCO3 ("Mg_as_CaCO3").
type form struct {
	analyte  water.Analyte
	comp     water.Component
	asCaCO3  bool
	asString string
}

// asCaCO3Suffix marks a form expressed as CaCO3.
const asCaCO3Suffix = "_as_caco3"

// parseForm reads ANALYTE or ANALYTE_as_CaCO3 (the suffix without regard
// to case). An analyte as CaCO3 must be an ion (charge ≠ 0): its mg/L as
// CaCO3 are its equivalents times 50.04 g/eq.
func parseForm(s string) (form, error) {
	s = strings.TrimSpace(s)
	f := form{asString: s}
	name := s
	if strings.HasSuffix(strings.ToLower(s), asCaCO3Suffix) {
		name, f.asCaCO3 = s[:len(s)-len(asCaCO3Suffix)], true
	}
	an, ok := water.Analytes().Lookup(name)
	if !ok {
		return form{}, fmt.Errorf("unknown analyte %q", name)
	}
	c, isComp := water.ParseComponent(an.Component)
	if !isComp {
		return form{}, fmt.Errorf("analyte %q is not a component total (alkalinity is limited through lsi or si)", name)
	}
	if f.asCaCO3 && an.Charge == 0 {
		return form{}, fmt.Errorf("analyte %q has no charge: it cannot be expressed as CaCO3", name)
	}
	f.analyte, f.comp = an, c
	return f, nil
}

// mgPerL returns the concentration of the form in water a, mg/L (of the
// form, or as CaCO3); ok is false when a holds none of the component.
//
// As CaCO3: mg/L = mol/L × |charge| / per-form × 50.04 g/eq × 1000
// (Standard Methods 2340 for hardness).
func (f form) mgPerL(a water.Analysis) (float64, bool) {
	molPerL := a.Totals[f.comp] * a.WaterPerLitre
	if !(molPerL > 0) {
		return 0, false
	}
	if f.asCaCO3 {
		return water.AsCaCO3(molPerL / f.analyte.PerForm * math.Abs(f.analyte.Charge)), true
	}
	return molPerL * f.analyte.FormMass / f.analyte.PerForm * 1000, true
}

// parseProduct reads FORM*FORM[*FORM…] (two or three factors).
func parseProduct(s string) ([]form, error) {
	parts := strings.Split(s, "*")
	if len(parts) < 2 || len(parts) > 3 {
		return nil, errors.New("a product names two or three forms joined by *, e.g. product:Mg_as_CaCO3*SiO2")
	}
	out := make([]form, len(parts))
	for i, p := range parts {
		f, err := parseForm(p)
		if err != nil {
			return nil, err
		}
		out[i] = f
	}
	return out, nil
}

// productValue is the product of the forms' mg/L in a; ok is false when
// any factor is absent.
func productValue(fs []form, a water.Analysis) (float64, bool) {
	v := 1.0
	for _, f := range fs {
		x, ok := f.mgPerL(a)
		if !ok {
			return 0, false
		}
		v *= x
	}
	return v, true
}
