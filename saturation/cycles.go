package saturation

import (
	"fmt"
	"math"
	"strings"

	"scalerisk/water"
)

// CarbonateRule says how the carbonate system of a concentrated water is
// found at each cycle.
type CarbonateRule struct {
	Name string        // as given: closed, air, ph=7.8, natural, relation=A,B
	Mode CarbonateMode // Closed, Air, FixedPHAlkalinity (relations)
	// A and B, when set (A ≠ 0), give the pH from the total alkalinity as
	// pH = A·log10(TA, mg/L as CaCO3) + B, alkalinity conserved and carbon
	// following: a relation observed in the tower, or the "natural" one,
	// 1.465 and 4.54 (Puckorius & Brooke 1991, as read in UFC 3-240-13FN
	// and a trade glossary; common practice).
	A, B float64
	// SetPoint, when above 0, is an acid-controlled pH: at each cycle the
	// dose of Reagent that brings the alkalinity to what the natural tower
	// relation gives for SetPoint is added (none where the water is already
	// at or below it), with its sulfate or chloride.
	SetPoint float64
	Reagent  water.Reagent
}

// ParseCarbonateRule parses "closed", "air", "acid=7.8" (acid control:
// the set point held with reagent, sulfuric acid when zero), "natural" or
// "relation=A,B". The older "ph=7.8" still reads as acid control; see
// CarbonateDeprecation.
func ParseCarbonateRule(s string) (CarbonateRule, error) {
	s = strings.ToLower(strings.TrimSpace(s))
	r := CarbonateRule{Name: s}
	switch {
	case s == "" || s == "closed":
		r.Name, r.Mode = "closed", Closed
	case s == "air":
		r.Mode = FixedPCO2
	case s == "natural":
		r.Mode, r.A, r.B = FixedPHAlkalinity, naturalA, naturalB
	case strings.HasPrefix(s, "acid=") || strings.HasPrefix(s, "ph="):
		_, num, _ := strings.Cut(s, "=")
		v, err := water.ParseNumber(num)
		if err != nil || v < 2 || v > 12 {
			return CarbonateRule{}, fmt.Errorf("carbonate rule %q: want acid= a set point from 2 to 12", s)
		}
		r.Name = "acid=" + num
		r.Mode, r.SetPoint = FixedPHAlkalinity, v
		acid, err := water.LookupReagent("h2so4")
		if err != nil {
			return CarbonateRule{}, err
		}
		r.Reagent = acid
	case strings.HasPrefix(s, "relation="):
		a, b, ok := strings.Cut(strings.TrimPrefix(s, "relation="), ",")
		av, err1 := water.ParseNumber(a)
		bv, err2 := water.ParseNumber(b)
		if !ok || err1 != nil || err2 != nil || av <= 0 || av > 10 || math.Abs(bv) > 20 {
			return CarbonateRule{}, fmt.Errorf("carbonate rule %q: want relation=A,B for pH = A·log10(TA) + B, 0 < A ≤ 10, |B| ≤ 20", s)
		}
		r.Mode, r.A, r.B = FixedPHAlkalinity, av, bv
	default:
		return CarbonateRule{}, fmt.Errorf("unknown carbonate rule %q (want natural, relation=A,B, air, acid=VALUE or closed)", s)
	}
	return r, nil
}

// CarbonateDeprecation returns the note an old spelling of a carbonate
// rule or mode deserves, or "". One vocabulary serves every command:
// acid=V is acid control (a dose of acid holds pH V, alkalinity falls),
// fixed-ph=V a pH held with carbon conserved; the bare ph=V meant the one in
// cycles and the other in assess, and still does, with this note.
func CarbonateDeprecation(s string, rule bool) string {
	s = strings.ToLower(strings.TrimSpace(s))
	if !strings.HasPrefix(s, "ph=") {
		return ""
	}
	if rule {
		return fmt.Sprintf("--carbonate %s is read as acid control; write acid=%s (ph= is deprecated: it reads as a fixed pH elsewhere)", s, s[3:])
	}
	return fmt.Sprintf("--carbonate %s is read as a fixed pH; write fixed-ph=%s (ph= is deprecated: it reads as acid control in cycles)", s, s[3:])
}

// WithReagent returns the rule with the acid of its set point replaced.
func (c CarbonateRule) WithReagent(r water.Reagent) CarbonateRule {
	c.Reagent = r
	return c
}

// options returns opt set for water w under the rule (the acid of a set
// point is applied by apply).
func (c CarbonateRule) options(w water.Analysis, opt Options) (Options, error) {
	o := opt
	o.Carbonate = c.Mode
	if c.A != 0 {
		ta := w.AlkalinityAsCaCO3()
		if !(ta > 0) {
			return o, fmt.Errorf("%w: the %s rule needs a positive alkalinity", ErrInconsistent, c.Name)
		}
		o.PH = c.A*math.Log10(ta) + c.B
		if o.PH < 2 || o.PH > 12 {
			return o, fmt.Errorf("%w: the %s rule gives pH %.3g at %.3g mg/L alkalinity", ErrInconsistent, c.Name, o.PH, ta)
		}
	}
	return o, nil
}

// naturalA and naturalB are the coefficients of the natural tower relation
// pH = 1.465·log10(TA) + 4.54 (Puckorius & Brooke 1991; common practice).
const (
	naturalA = 1.465
	naturalB = 4.54
)

// apply speciates w under the rule. For a set point it first adds the dose
// of acid (returned, mg/L of product; 0 when none is needed) that brings
// the alkalinity down to the value the natural tower relation gives for
// the set point — TA = 10^((pH − 4.54)/1.465) — the way an acid feed on pH
// control settles a tower; pH then sits at the set point, alkalinity is
// conserved and carbon follows.
func (c CarbonateRule) apply(sp *Speciator, w water.Analysis, opt Options) (*Result, water.Analysis, float64, error) {
	if c.SetPoint == 0 {
		o, err := c.options(w, opt)
		if err != nil {
			return nil, w, 0, err
		}
		r, err := sp.Speciate(w, o)
		return r, w, 0, err
	}
	o := opt
	o.Carbonate = FixedPHAlkalinity
	ta := w.AlkalinityAsCaCO3()
	if !(ta > 0) {
		return nil, w, 0, fmt.Errorf("%w: the %s rule needs a positive alkalinity", ErrInconsistent, c.Name)
	}
	taSet := math.Pow(10, (c.SetPoint-naturalB)/naturalA)
	if ta <= taSet {
		// Already at or below the set point: no acid, the natural pH.
		o.PH = naturalA*math.Log10(ta) + naturalB
		r, err := sp.Speciate(w, o)
		return r, w, 0, err
	}
	per := -c.Reagent.AlkalinityFactor(0) // mg/L as CaCO3 removed per mg/L of product
	if !(per > 0) {
		return nil, w, 0, fmt.Errorf("%s is not an acid: it cannot hold pH %g", c.Reagent.Name, c.SetPoint)
	}
	dose := (ta - taSet) / per
	dosed, err := w.Dose(c.Reagent, dose, 0)
	if err != nil {
		return nil, w, 0, err
	}
	o.PH = c.SetPoint
	r, err := sp.Speciate(dosed, o)
	return r, dosed, dose, err
}

// CyclePoint is the water at one number of cycles.
type CyclePoint struct {
	Cycles  float64
	Result  *Result
	Indices Indices
	// Skin and SkinIndices are the same water judged at the skin
	// temperature, bulk pH held (nil when the decision has none; see
	// Options.Skin).
	Skin        *Result
	SkinIndices Indices
	// Dose is the acid dose, mg/L of product, that holds the rule's pH set
	// point at this cycle (0 without a set point or when none is needed).
	Dose float64
	Err  error
}

// maxCyclePoints bounds the points of a cycles table.
const maxCyclePoints = 1000

// CyclesResult is the answer of MaxCycles.
type CyclesResult struct {
	Profile LimitProfile
	Rule    CarbonateRule
	// MaxCycles is the highest number of cycles at which every limit of the
	// profile holds at the bulk and at the skin temperature; Limiting is the
	// quantity that reaches its limit there. When no limit is reached up to
	// the search's end, MaxCycles is that end and Limiting is empty; when a
	// limit is already passed in the makeup, MaxCycles is 1 and Exceeded
	// names it.
	MaxCycles float64
	Limiting  string
	Exceeded  []string
	// Judged says at which temperatures the limits were judged and which
	// one governs MaxCycles.
	Judged   Judgement
	Points   []CyclePoint
	Warnings []string
}

// Judgement records the two temperatures a decision is judged at — the
// bulk water's and the hottest surface it meets — the answer at each, and
// which governs (the stricter one).
type Judgement struct {
	Bulk float64 // °C, the temperature of evaluation
	// Skin is the skin temperature, °C; NaN when the decision was judged at
	// the bulk temperature only (no skin asked, or one not above the bulk).
	Skin float64
	// AtBulk and AtSkin are the answers judged at each temperature alone
	// (cycles, or mg/L of a dose); AtSkin is NaN without a skin.
	AtBulk, AtSkin float64
	// Governing is the temperature whose answer is the decision, °C.
	Governing float64
}

// SkinGoverns reports whether the skin temperature governs the decision.
func (j Judgement) SkinGoverns() bool { return !math.IsNaN(j.Skin) && j.Governing == j.Skin }

// skinOf returns the skin temperature a decision on water r is also
// judged at: opt.Skin when it is above r's temperature, else NaN.
func skinOf(bulk float64, opt Options) float64 {
	if opt.Skin > bulk {
		return opt.Skin
	}
	return math.NaN()
}

// heat returns the water of r as the trade judges it at a hot surface of
// temperature t °C: the bulk pH held, alkalinity conserved, every constant
// at t. This is the classic skin-temperature index — the water's pH against
// the saturation pH at the hottest waterside temperature (UFC 3-240-13FN
// Example B-1 takes that temperature; practice.md §4.1; common practice).
// It is the cautious side: heated in a closed tube the pH would fall by
// some tenths, and most saturation indices with it.
func (sp *Speciator) heat(r *Result, t float64, opt Options) (*Result, Indices, error) {
	o := opt
	o.AtTemperature, o.Temperature = true, t
	o.Carbonate, o.PH = FixedPHAlkalinity, r.PH
	hr, err := sp.Speciate(r.Analysis, o)
	if err != nil {
		return nil, Indices{}, fmt.Errorf("at the skin temperature %g °C: %w", t, err)
	}
	ix, _ := sp.ClassicIndicesNoCCPP(hr)
	return hr, ix, nil
}

// excessOf returns the largest value − limit over profile for one result,
// the quantity it belongs to, and the quantities above their limits.
func excessOf(profile LimitProfile, r *Result, ix Indices) (float64, string, []string) {
	worst, which := math.Inf(-1), ""
	var over []string
	for _, l := range profile.Limits {
		v, ok := l.Value(r, ix)
		if !ok {
			continue
		}
		if v-l.Max > worst {
			worst, which = v-l.Max, l.Quantity
		}
		if v > l.Max {
			over = append(over, l.Quantity)
		}
	}
	return worst, which, over
}

// MaxCycles concentrates makeup water a by cycles from 1 to maxN (at a's
// temperature, or opt's), finds the carbonate state at each by rule, and
// returns the highest number of cycles at which every limit of profile
// holds, with the limiting quantity. With opt.Skin above the bulk
// temperature, each point is also judged at the skin temperature (bulk pH
// held, see heat); the answer is the lower of the two and
// Judged says which temperature governs. The points are on a grid of step
// (0.5 when 0); the crossing is refined between grid points by Brent's
// method. Blowdown and make-up follow from the answer (water.MakeupAndBlowdown).
func MaxCycles(a water.Analysis, profile LimitProfile, rule CarbonateRule, maxN, step float64, opt Options) (*CyclesResult, error) {
	if !(maxN > 1) {
		return nil, fmt.Errorf("the highest cycles to search must be above 1, got %g", maxN)
	}
	if step <= 0 {
		step = 0.5
	}
	if step < (maxN-1)/maxCyclePoints {
		return nil, fmt.Errorf("a step of %g cycles makes more than %d points up to %g cycles", step, maxCyclePoints, maxN)
	}
	sp := NewSpeciator(opt.Model)
	base, _, err := sp.Fix(a, opt)
	if err != nil {
		return nil, err
	}
	bulkT := a.Temperature
	if opt.AtTemperature {
		bulkT = opt.Temperature
	}
	cp := &cyclesProblem{sp: sp, base: base, rule: rule, opt: opt, skin: skinOf(bulkT, opt)}
	res := &CyclesResult{Profile: profile, Rule: rule, MaxCycles: maxN,
		Judged: Judgement{Bulk: bulkT, Skin: cp.skin, AtSkin: math.NaN(), Governing: bulkT}}
	res.Points = cp.grid(maxN, step)
	if first := res.Points[0]; first.Err != nil {
		return nil, first.Err
	}
	pick := cp.judge(res, profile)
	res.MaxCycles, res.Limiting, res.Exceeded = pick.max, pick.limiting, pick.exceeded
	res.Warnings = append(res.Warnings, pick.warnings...)
	if w := cyclesVerdict(res, pick, maxN); w != "" {
		res.Warnings = append(res.Warnings, w)
	}
	return res, nil
}

// cyclesProblem is one MaxCycles search: the fixed makeup, the carbonate
// rule, the options (whose activity model grid may pin, see grid) and the
// skin temperature (NaN when judged at the bulk only).
type cyclesProblem struct {
	sp   *Speciator
	base water.Analysis
	rule CarbonateRule
	opt  Options
	skin float64
}

// eval is the makeup concentrated n times with its carbonate state set by
// rule, speciated at the bulk and, with a skin temperature, heated to it.
// A failure is kept in the point's Err.
func (cp *cyclesProblem) eval(n float64) CyclePoint {
	pt := CyclePoint{Cycles: n}
	w, err := cp.base.Concentrate(n)
	if err != nil {
		pt.Err = err
		return pt
	}
	pt.Result, _, pt.Dose, pt.Err = cp.rule.apply(cp.sp, w, cp.opt)
	if pt.Err == nil {
		pt.Indices, _ = cp.sp.ClassicIndicesNoCCPP(pt.Result)
	}
	if pt.Err == nil && !math.IsNaN(cp.skin) {
		pt.Skin, pt.SkinIndices, pt.Err = cp.sp.heat(pt.Result, cp.skin, cp.opt)
	}
	return pt
}

// grid evaluates the points 1, 1+step, ... up to maxN (maxN always
// included), with one activity model over the whole search (see
// gridPoints).
func (cp *cyclesProblem) grid(maxN, step float64) []CyclePoint {
	var values []float64
	for k := 0; ; k++ {
		n := 1 + float64(k)*step
		if n > maxN+1e-9 {
			break
		}
		values = append(values, n)
	}
	if last := values[len(values)-1]; last < maxN-1e-9 {
		values = append(values, maxN)
	}
	return gridPoints(values, cp.eval, &cp.opt)
}

// gridPoints evaluates eval at each value, in order. With the Auto
// activity model, when the points would mix models, one model is pinned
// for the whole search (see Sweep) in *opt — the options eval reads — and
// the points are evaluated again with it.
func gridPoints(values []float64, eval func(float64) CyclePoint, opt *Options) []CyclePoint {
	pts := make([]CyclePoint, 0, len(values))
	for _, v := range values {
		pts = append(pts, eval(v))
	}
	if opt.Activity == Auto {
		var ps []Point
		for _, p := range pts {
			ps = append(ps, Point{Result: p.Result})
		}
		if m, mixed := uniformModel(ps, *opt); mixed {
			opt.Activity = m
			for k := range pts {
				pts[k] = eval(pts[k].Cycles)
			}
		}
	}
	return pts
}

// judge finds the highest cycles under profile at the bulk and, with a
// skin temperature, at the skin (see judgeAtBoth).
func (cp *cyclesProblem) judge(res *CyclesResult, profile LimitProfile) cyclesAnswer {
	return judgeAtBoth(res.Points, profile, cp.eval, cp.skin, &res.Judged)
}

// judgeAtBoth walks points (see judgeCycles) judged at the bulk and, with
// a skin temperature (skin not NaN), at the skin, and returns the lower
// answer (on a tie, the one with more limits already exceeded). It sets
// the answers of j at each temperature, and Governing to skin when the
// skin governs.
func judgeAtBoth(points []CyclePoint, profile LimitProfile, eval func(float64) CyclePoint, skin float64, j *Judgement) cyclesAnswer {
	bulk := judgeCycles(points, profile, eval, func(p CyclePoint) (*Result, Indices) { return p.Result, p.Indices })
	pick := bulk
	j.AtBulk = bulk.max
	if !math.IsNaN(skin) {
		hot := judgeCycles(points, profile, eval, func(p CyclePoint) (*Result, Indices) { return p.Skin, p.SkinIndices })
		j.AtSkin = hot.max
		if hot.max < bulk.max || (hot.max == bulk.max && len(hot.exceeded) > len(bulk.exceeded)) {
			pick, j.Governing = hot, skin
		}
	}
	return pick
}

// cyclesVerdict is the closing warning of a MaxCycles answer: the makeup
// (heated to the skin when that governs) already over the profile, or no
// limit reached up to maxN; "" otherwise.
func cyclesVerdict(res *CyclesResult, pick cyclesAnswer, maxN float64) string {
	if len(pick.exceeded) > 0 {
		where := "the makeup itself"
		if res.Judged.SkinGoverns() {
			where = fmt.Sprintf("the makeup heated to the %g °C skin", res.Judged.Skin)
		}
		return fmt.Sprintf("%s already exceeds the %s profile for %s: no cycles are safe without treatment",
			where, res.Profile.Name, strings.Join(pick.exceeded, ", "))
	}
	if pick.limiting == "" && pick.err == nil {
		return fmt.Sprintf("no limit of the %s profile is reached up to %g cycles", res.Profile.Name, maxN)
	}
	return ""
}

// cyclesAnswer is the highest cycles under a profile judged at one
// temperature.
type cyclesAnswer struct {
	max      float64
	limiting string
	exceeded []string
	warnings []string
	err      error // a point that could not be computed ended the search
}

// judgeCycles walks the points (their result at one temperature, given by
// at) to the first that passes a limit, and refines the crossing by
// Brent's method with eval. When the first point already passes a limit,
// the answer is that point (1 cycle) with the limits it exceeds.
func judgeCycles(points []CyclePoint, profile LimitProfile, eval func(float64) CyclePoint, at func(CyclePoint) (*Result, Indices)) cyclesAnswer {
	excess := func(p CyclePoint) (float64, string, []string) {
		r, ix := at(p)
		return excessOf(profile, r, ix)
	}
	ans := cyclesAnswer{max: points[len(points)-1].Cycles}
	if w, _, over := excess(points[0]); w > 0 {
		ans.max, ans.exceeded = points[0].Cycles, over
		return ans
	}
	for k := 1; k < len(points); k++ {
		pt := points[k]
		if pt.Err != nil {
			ans.warnings = append(ans.warnings, fmt.Sprintf("at %g cycles: %v", pt.Cycles, pt.Err))
			ans.max, ans.err = points[k-1].Cycles, pt.Err
			return ans
		}
		w, which, _ := excess(pt)
		if w <= 0 {
			continue
		}
		lo, hi := points[k-1].Cycles, pt.Cycles
		n, err := findRoot(func(n float64) (float64, error) {
			p := eval(n)
			if p.Err != nil {
				return 0, p.Err
			}
			v, _, _ := excess(p)
			return v, nil
		}, lo, hi, 1e-4)
		if err != nil {
			n = lo
			ans.warnings = append(ans.warnings, fmt.Sprintf("the crossing between %g and %g cycles was not refined: %v", lo, hi, err))
		}
		if crossing := eval(n + 1e-3); crossing.Err == nil {
			_, which, _ = excess(crossing)
		}
		ans.max, ans.limiting = n, which
		return ans
	}
	return ans
}
