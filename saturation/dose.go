package saturation

import (
	"fmt"
	"math"
	"strings"

	"scalerisk/water"
)

// Target is what a dose must reach: a pH, an index (lsi, rsi, psi) or a
// mineral's saturation index.
type Target struct {
	Kind    string // "ph", "lsi", "rsi", "psi" or "si"
	Mineral string // for "si"
	Value   float64
}

func (t Target) String() string {
	if t.Kind == "si" {
		return fmt.Sprintf("si:%s=%g", t.Mineral, t.Value)
	}
	return fmt.Sprintf("%s=%g", t.Kind, t.Value)
}

// ParseTarget parses "ph=7.0", "lsi=0.5", "rsi=6", "psi=6" or
// "si:calcite=0.8".
func ParseTarget(s string, m *Model) (Target, error) {
	if m == nil {
		m = DefaultModel()
	}
	lhs, rhs, ok := strings.Cut(strings.TrimSpace(s), "=")
	if !ok {
		return Target{}, fmt.Errorf("target %q: want QUANTITY=VALUE, e.g. ph=7.0, lsi=0.5, si:calcite=0.8", s)
	}
	v, err := water.ParseNumber(rhs)
	if err != nil {
		return Target{}, fmt.Errorf("target %q: value %q is not a number", s, rhs)
	}
	t := Target{Value: v}
	kind, arg, _ := strings.Cut(strings.ToLower(strings.TrimSpace(lhs)), ":")
	switch kind {
	case "ph", "lsi", "rsi", "psi":
		if arg != "" {
			return Target{}, fmt.Errorf("target %q: %s takes no mineral", s, kind)
		}
	case "si":
		if _, ok := m.mineralIdx[arg]; !ok {
			return Target{}, fmt.Errorf("target %q: unknown mineral %q", s, arg)
		}
		t.Mineral = arg
	default:
		return Target{}, fmt.Errorf("target %q: unknown quantity %q (want ph, lsi, rsi, psi or si:MINERAL)", s, kind)
	}
	t.Kind = kind
	return t, nil
}

// Measure returns the value of the target's quantity in result r with
// indices ix; ok is false when the water lacks it.
func (t Target) Measure(r *Result, ix Indices) (float64, bool) {
	var v float64
	switch t.Kind {
	case "ph":
		v = r.PH
	case "lsi":
		v = ix.LSI
	case "rsi":
		v = ix.RSI
	case "psi":
		v = ix.PSI
	case "si":
		var ok bool
		if v, ok = r.SI(t.Mineral); !ok {
			return 0, false
		}
	}
	return v, !math.IsNaN(v)
}

// Outcome is a water after a treatment, with its indices.
type Outcome struct {
	Water   water.Analysis
	Result  *Result
	Indices Indices
}

// DoseResult is the answer of DoseToTarget.
type DoseResult struct {
	Reagent  water.Reagent
	Strength float64 // percent of the product used
	Target   Target
	Dose     float64 // mg/L of product
	Reached  bool    // the target value is met by the dose
	Before   Outcome
	After    Outcome
	Warnings []string
}

// maxDose bounds the dose search, mg/L of product: 10 g/L, far beyond any
// plant dose.
const maxDose = 10000

// DoseToTarget finds the dose of reagent r (mg/L of product at strength
// percent; 0 means the table's usual strength) that brings water a to
// target under opt (closed carbonate system by default: the CO2 an acid
// frees stays in the water), by Brent's method on a bracket grown from
// 1 mg/L by doubling. It reports what the dose does to every mineral and
// index through Before and After. Where the reagent moves the quantity away
// from the target, or cannot reach it below 10 g/L, Reached is false and a
// warning says why.
func DoseToTarget(a water.Analysis, r water.Reagent, strength float64, target Target, opt Options) (*DoseResult, error) {
	sp := NewSpeciator(opt.Model)
	base, _, err := sp.Fix(a, opt)
	if err != nil {
		return nil, err
	}
	if strength == 0 {
		strength = r.Strength
	}
	res := &DoseResult{Reagent: r, Strength: strength, Target: target}
	eval := func(d float64) (Outcome, float64, error) {
		w, err := base.Dose(r, d, strength)
		if err != nil {
			return Outcome{}, 0, err
		}
		rr, err := sp.Speciate(w, opt)
		if err != nil {
			return Outcome{}, 0, err
		}
		ix, _ := sp.ClassicIndicesNoCCPP(rr)
		v, ok := target.Measure(rr, ix)
		if !ok {
			return Outcome{}, 0, fmt.Errorf("%w: %s cannot be evaluated for this water (see the warnings of assess)", ErrInconsistent, target.Kind)
		}
		return Outcome{Water: w, Result: rr, Indices: ix}, v - target.Value, nil
	}
	before, f0, err := eval(0)
	if err != nil {
		return nil, err
	}
	res.Before = before
	if f0 == 0 {
		res.Reached, res.After = true, before
		return res, nil
	}
	// Which way does the reagent move the quantity?
	_, f1, err := eval(1)
	if err != nil {
		return nil, err
	}
	if (f1-f0)*f0 >= 0 {
		res.After = before
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"%s is already beyond the target in the direction %s moves it (now %.3g, target %g): no dose is needed, and none reaches the target exactly",
			target.Kind, r.Name, f0+target.Value, target.Value))
		return res, nil
	}
	lo, hi := 0.0, 1.0
	fhi := f1
	for (fhi > 0) == (f0 > 0) {
		lo, hi = hi, hi*2
		if hi > maxDose {
			res.After = before
			res.Warnings = append(res.Warnings, fmt.Sprintf("the target %s is not reached below %g mg/L of %s", target, float64(maxDose), r.Name))
			return res, nil
		}
		if _, fhi, err = eval(hi); err != nil {
			res.Warnings = append(res.Warnings, fmt.Sprintf("the search stopped at %g mg/L: %v", hi, err))
			res.After = before
			return res, nil
		}
	}
	d, err := findRoot(func(d float64) (float64, error) {
		_, v, err := eval(d)
		return v, err
	}, lo, hi, 1e-6)
	if err != nil {
		return nil, err
	}
	after, _, err := eval(d)
	if err != nil {
		return nil, err
	}
	res.Dose, res.Reached, res.After = d, true, after
	res.Warnings = append(res.Warnings, after.Water.Warnings...)
	res.Warnings = append(res.Warnings, sideEffects(before, after)...)
	return res, nil
}

// sideEffects names the minerals a dose pushes across a band edge and the
// rise of the Larson–Skold index.
func sideEffects(before, after Outcome) []string {
	var out []string
	for _, m := range after.Result.Minerals {
		b, ok := before.Result.SI(m.Name)
		if !ok {
			continue
		}
		bb, ab := RiskBand(m.Name, b), RiskBand(m.Name, m.SI)
		if ab > bb && ab != SlowToForm {
			out = append(out, fmt.Sprintf("the dose raises %s from %+.2f to %+.2f (%s)", m.Name, b, m.SI, ab))
		}
	}
	if lb, la := before.Indices.LarsonSkold, after.Indices.LarsonSkold; la > lb && la > 0.8 && !math.IsNaN(lb) {
		out = append(out, fmt.Sprintf("the Larson–Skold index rises from %.2f to %.2f: chloride and sulfate against alkalinity raise the corrosion rate of mild steel above about 0.8–1.2 (Larson & Skold 1958)", lb, la))
	}
	return out
}

// ClassicIndicesNoCCPP computes the classic indices of r without the
// CCPP, which needs a search of its own (CCPP is NaN).
func (sp *Speciator) ClassicIndicesNoCCPP(r *Result) (Indices, []string) {
	return sp.classicIndices(r, Options{}, false)
}
