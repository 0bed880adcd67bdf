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
	// SkinAfter is the dosed water judged at the skin temperature (nil
	// without one); Judged says which temperature governs Dose.
	SkinAfter *Outcome
	Judged    Judgement
	Warnings  []string
	// Beyond reports that the water is already at or beyond the target in
	// the direction the reagent moves it: no dose is needed (Reached is
	// false, Dose 0).
	Beyond bool
}

// maxDose bounds the dose search, mg/L of product: 10 g/L, far beyond any
// plant dose.
const maxDose = 10000

// safeBelow reports whether the target is an upper bound (saturation
// indices and the Langelier index: more is more scale) rather than a lower
// one (the Ryznar and Puckorius indices: less is more scale).
func (t Target) safeBelow() bool { return t.Kind == "si" || t.Kind == "lsi" }

// DoseToTarget finds the dose of reagent r (mg/L of product at strength
// percent; 0 means the table's usual strength) that brings water a to
// target under opt (closed carbonate system by default: the CO2 an acid
// frees stays in the water), by Brent's method on a bracket grown from
// 1 mg/L by doubling. It reports what the dose does to every mineral and
// index through Before and After. Where the reagent moves the quantity away
// from the target, or cannot reach it below 10 g/L, Reached is false and a
// warning says why.
//
// With opt.Skin above the water's temperature, an index or saturation
// target is also judged at the skin (bulk pH held, as in MaxCycles): the
// dose is the one after which the water is on the safe side of the target
// at both temperatures (at or below an SI or LSI target, at or above an
// RSI or PSI target), and Judged says which temperature governs. A pH
// target is a bulk set point and is judged at the bulk only.
func DoseToTarget(a water.Analysis, r water.Reagent, strength float64, target Target, opt Options) (*DoseResult, error) {
	sp := NewSpeciator(opt.Model)
	base, _, err := sp.Fix(a, opt)
	if err != nil {
		return nil, err
	}
	if strength == 0 {
		strength = r.Strength
	}
	bulkT := a.Temperature
	if opt.AtTemperature {
		bulkT = opt.Temperature
	}
	skin := skinOf(bulkT, opt)
	if target.Kind == "ph" {
		skin = math.NaN()
	}
	pb := doseProblem{sp: sp, base: base, r: r, strength: strength, target: target, opt: opt, skin: skin}
	res := &DoseResult{Reagent: r, Strength: strength, Target: target,
		Judged: Judgement{Bulk: bulkT, Skin: skin, AtSkin: math.NaN(), Governing: bulkT}}
	pick, err := pb.pick(res)
	if err != nil {
		return nil, err
	}
	res.Dose, res.Reached, res.Beyond = pick.dose, pick.reached, pick.beyond
	res.Warnings = append(res.Warnings, pick.warnings...)
	if !pick.reached {
		res.After = res.Before
		return res, nil
	}
	if err := pb.after(res, pick.dose); err != nil {
		return nil, err
	}
	return res, nil
}

// doseProblem is one DoseToTarget search: the fixed water, the reagent at
// its strength, the target and the skin temperature (NaN when the target
// is judged at the bulk only).
type doseProblem struct {
	sp       *Speciator
	base     water.Analysis
	r        water.Reagent
	strength float64
	target   Target
	opt      Options
	skin     float64
}

// dosed is the base water after dose d (mg/L of reagent as supplied),
// speciated at the bulk temperature with its classic indices.
func (pb doseProblem) dosed(d float64) (Outcome, error) {
	w, err := pb.base.Dose(pb.r, d, pb.strength)
	if err != nil {
		return Outcome{}, err
	}
	rr, err := pb.sp.Speciate(w, pb.opt)
	if err != nil {
		return Outcome{}, err
	}
	ix, _ := pb.sp.ClassicIndicesNoCCPP(rr)
	return Outcome{Water: w, Result: rr, Indices: ix}, nil
}

// gap is the target's quantity of o less the target value; an error
// (ErrInconsistent) when the quantity cannot be evaluated for this water.
func (pb doseProblem) gap(o Outcome) (float64, error) {
	v, ok := pb.target.Measure(o.Result, o.Indices)
	if !ok {
		return 0, fmt.Errorf("%w: %s cannot be evaluated for this water (see the warnings of assess)", ErrInconsistent, pb.target.Kind)
	}
	return v - pb.target.Value, nil
}

// atBulk is the outcome of dose d and its gap to the target at the bulk
// temperature.
func (pb doseProblem) atBulk(d float64) (Outcome, float64, error) {
	o, err := pb.dosed(d)
	if err != nil {
		return Outcome{}, 0, err
	}
	f, err := pb.gap(o)
	return o, f, err
}

// atSkin is the outcome of dose d heated to the skin temperature (bulk pH
// held, see heat) and its gap to the target there.
func (pb doseProblem) atSkin(d float64) (Outcome, float64, error) {
	o, err := pb.dosed(d)
	if err != nil {
		return Outcome{}, 0, err
	}
	hr, hix, err := pb.sp.heat(o.Result, pb.skin, pb.opt)
	if err != nil {
		return Outcome{}, 0, err
	}
	h := Outcome{Water: o.Water, Result: hr, Indices: hix}
	f, err := pb.gap(h)
	return h, f, err
}

// pick searches the dose at the bulk and, with a skin temperature, at the
// skin, and returns the stricter answer. It sets res.Before and the
// doses of res.Judged (and Governing when the skin governs).
func (pb doseProblem) pick(res *DoseResult) (doseAnswer, error) {
	bulk, err := searchDose(pb.atBulk, pb.r, pb.target)
	if err != nil {
		return doseAnswer{}, err
	}
	res.Before = bulk.before
	pick := bulk
	res.Judged.AtBulk = bulk.dose
	if !math.IsNaN(pb.skin) {
		hot, err := searchDose(pb.atSkin, pb.r, pb.target)
		if err != nil {
			return doseAnswer{}, err
		}
		res.Judged.AtSkin = hot.dose
		if stricterDose(pb.target, bulk, hot, pb.atBulk, pb.atSkin) {
			pick, res.Judged.Governing = hot, pb.skin
		}
	}
	return pick, nil
}

// after fills res with the water after dose d: res.After at the bulk,
// res.SkinAfter at the skin (when judged there), and the warnings of the
// dosed water and of the dose's side effects.
func (pb doseProblem) after(res *DoseResult, d float64) error {
	after, _, err := pb.atBulk(d)
	if err != nil {
		return err
	}
	res.After = after
	if !math.IsNaN(pb.skin) {
		h, _, err := pb.atSkin(d)
		if err != nil {
			return err
		}
		res.SkinAfter = &h
	}
	res.Warnings = append(res.Warnings, after.Water.Warnings...)
	res.Warnings = append(res.Warnings, sideEffects(res.Before, after)...)
	return nil
}

// doseAnswer is the dose that reaches a target judged at one temperature.
type doseAnswer struct {
	dose     float64
	reached  bool
	beyond   bool // already beyond the target in the reagent's direction
	before   Outcome
	gap0     float64 // the target's value minus the target, undosed
	warnings []string
}

// searchDose finds the dose where gap (the target's value minus the
// target, judged at one temperature) crosses zero.
func searchDose(eval func(float64) (Outcome, float64, error), r water.Reagent, target Target) (doseAnswer, error) {
	before, f0, err := eval(0)
	if err != nil {
		return doseAnswer{}, err
	}
	ans := doseAnswer{before: before, gap0: f0}
	if f0 == 0 {
		ans.reached = true
		return ans, nil
	}
	// Which way does the reagent move the quantity?
	_, f1, err := eval(1)
	if err != nil {
		return doseAnswer{}, err
	}
	if (f1-f0)*f0 >= 0 {
		ans.beyond = true
		ans.warnings = append(ans.warnings, fmt.Sprintf(
			"%s is already beyond the target in the direction %s moves it (now %.3g, target %g): no dose is needed, and none reaches the target exactly",
			target.Kind, r.Name, f0+target.Value, target.Value))
		return ans, nil
	}
	lo, hi := 0.0, 1.0
	fhi := f1
	for (fhi > 0) == (f0 > 0) {
		lo, hi = hi, hi*2
		if hi > maxDose {
			ans.warnings = append(ans.warnings, fmt.Sprintf("the target %s is not reached below %g mg/L of %s", target, float64(maxDose), r.Name))
			return ans, nil
		}
		if _, fhi, err = eval(hi); err != nil {
			ans.warnings = append(ans.warnings, fmt.Sprintf("the search stopped at %g mg/L: %v", hi, err))
			return ans, nil
		}
	}
	d, err := findRoot(func(d float64) (float64, error) {
		_, v, err := eval(d)
		return v, err
	}, lo, hi, 1e-6)
	if err != nil {
		return doseAnswer{}, err
	}
	ans.dose, ans.reached = d, true
	return ans, nil
}

// stricterDose reports whether the skin's dose, rather than the bulk's,
// is the decision: the dose after which the water is on the safe side of
// the target at both temperatures, the smaller such dose when both are.
//
// Where the target is not reached at one temperature, that temperature
// governs when its undosed water is on the unsafe side (the decision is
// then that no dose reaches the target), and the other one when it is
// already safe there.
func stricterDose(t Target, bulk, hot doseAnswer, atBulk, atSkin func(float64) (Outcome, float64, error)) bool {
	safe := func(f float64) bool {
		if t.safeBelow() {
			return f <= 1e-9
		}
		return f >= -1e-9
	}
	switch {
	case !hot.reached:
		return !safe(hot.gap0)
	case !bulk.reached:
		return safe(bulk.gap0)
	}
	_, fSkinAtBulkDose, err1 := atSkin(bulk.dose)
	_, fBulkAtSkinDose, err2 := atBulk(hot.dose)
	bulkOK := err1 == nil && safe(fSkinAtBulkDose)
	hotOK := err2 == nil && safe(fBulkAtSkinDose)
	switch {
	case bulkOK && hotOK:
		return hot.dose < bulk.dose
	case hotOK:
		return true
	}
	return false
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
