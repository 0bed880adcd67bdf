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
	Mode CarbonateMode // Closed, FixedPCO2 (air) or FixedPH
	PH   float64       // for FixedPH
	// A and B, when set (A ≠ 0), give the pH from the total alkalinity as
	// pH = A·log10(TA, mg/L as CaCO3) + B: a relation observed in the
	// tower, or the "natural" one, 1.465 and 4.54 (Puckorius & Brooke 1991,
	// as read in UFC 3-240-13FN and a trade glossary; common practice).
	A, B float64
}

// ParseCarbonateRule parses "closed", "air", "ph=7.8", "natural" or
// "relation=A,B".
func ParseCarbonateRule(s string) (CarbonateRule, error) {
	s = strings.ToLower(strings.TrimSpace(s))
	switch {
	case s == "" || s == "closed":
		return CarbonateRule{Mode: Closed}, nil
	case s == "air":
		return CarbonateRule{Mode: FixedPCO2}, nil
	case s == "natural":
		return CarbonateRule{Mode: FixedPH, A: 1.465, B: 4.54}, nil
	case strings.HasPrefix(s, "ph="):
		v, err := water.ParseNumber(strings.TrimPrefix(s, "ph="))
		if err != nil || v < 0 || v > 14 {
			return CarbonateRule{}, fmt.Errorf("carbonate rule %q: want ph= a pH from 0 to 14", s)
		}
		return CarbonateRule{Mode: FixedPH, PH: v}, nil
	case strings.HasPrefix(s, "relation="):
		a, b, ok := strings.Cut(strings.TrimPrefix(s, "relation="), ",")
		av, err1 := water.ParseNumber(a)
		bv, err2 := water.ParseNumber(b)
		if !ok || err1 != nil || err2 != nil || av == 0 {
			return CarbonateRule{}, fmt.Errorf("carbonate rule %q: want relation=A,B for pH = A·log10(TA) + B", s)
		}
		return CarbonateRule{Mode: FixedPH, A: av, B: bv}, nil
	}
	return CarbonateRule{}, fmt.Errorf("unknown carbonate rule %q (want closed, air, ph=VALUE, natural or relation=A,B)", s)
}

// options returns opt set for water w under the rule.
func (c CarbonateRule) options(w water.Analysis, opt Options) Options {
	o := opt
	o.Carbonate = c.Mode
	switch {
	case c.A != 0:
		ta := w.Alkalinity * w.WaterPerLitre * 1000 * equivalentMassCaCO3
		o.PH = c.A*math.Log10(ta) + c.B
	case c.Mode == FixedPH:
		o.PH = c.PH
	}
	return o
}

// CyclePoint is the water at one number of cycles.
type CyclePoint struct {
	Cycles  float64
	Result  *Result
	Indices Indices
	Err     error
}

// CyclesResult is the answer of MaxCycles.
type CyclesResult struct {
	Profile LimitProfile
	// MaxCycles is the highest number of cycles at which every limit of the
	// profile holds; Limiting is the quantity that reaches its limit there.
	// When no limit is reached up to the search's end, MaxCycles is that
	// end and Limiting is empty; when a limit is already passed in the
	// makeup, MaxCycles is 1 and Exceeded names it.
	MaxCycles float64
	Limiting  string
	Exceeded  []string
	Points    []CyclePoint
	Warnings  []string
}

// MaxCycles concentrates makeup water a by cycles from 1 to maxN (at a's
// temperature, or opt's), finds the carbonate state at each by rule, and
// returns the highest number of cycles at which every limit of profile
// holds, with the limiting quantity. The points are on a grid of step
// (0.5 when 0); the crossing is refined between grid points by Brent's
// method. Blowdown and make-up follow from the answer (water.MakeupAndBlowdown).
func MaxCycles(a water.Analysis, profile LimitProfile, rule CarbonateRule, maxN, step float64, opt Options) (*CyclesResult, error) {
	if !(maxN > 1) {
		return nil, fmt.Errorf("the highest cycles to search must be above 1, got %g", maxN)
	}
	if step <= 0 {
		step = 0.5
	}
	sp := NewSpeciator(opt.Model)
	base, _, err := sp.Fix(a, opt)
	if err != nil {
		return nil, err
	}
	res := &CyclesResult{Profile: profile, MaxCycles: maxN}
	eval := func(n float64) CyclePoint {
		pt := CyclePoint{Cycles: n}
		w, err := base.Concentrate(n)
		if err != nil {
			pt.Err = err
			return pt
		}
		pt.Result, pt.Err = sp.Speciate(w, rule.options(w, opt))
		if pt.Err == nil {
			pt.Indices, _ = sp.ClassicIndicesNoCCPP(pt.Result)
		}
		return pt
	}
	// excess returns the largest value − limit over the profile at one point,
	// and the quantity it belongs to.
	excess := func(pt CyclePoint) (float64, string, []string) {
		worst, which := math.Inf(-1), ""
		var over []string
		for _, l := range profile.Limits {
			v, ok := l.Value(pt.Result, pt.Indices)
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
	for n := 1.0; n <= maxN+1e-9; n += step {
		res.Points = append(res.Points, eval(n))
	}
	if last := res.Points[len(res.Points)-1].Cycles; last < maxN-1e-9 {
		res.Points = append(res.Points, eval(maxN))
	}
	first := res.Points[0]
	if first.Err != nil {
		return nil, first.Err
	}
	if w, _, over := excess(first); w > 0 {
		res.MaxCycles, res.Exceeded = 1, over
		res.Warnings = append(res.Warnings, fmt.Sprintf("the makeup itself already exceeds the %s profile for %s: no cycles are safe without treatment",
			profile.Name, strings.Join(over, ", ")))
		return res, nil
	}
	for k := 1; k < len(res.Points); k++ {
		pt := res.Points[k]
		if pt.Err != nil {
			res.Warnings = append(res.Warnings, fmt.Sprintf("at %g cycles: %v", pt.Cycles, pt.Err))
			res.MaxCycles = res.Points[k-1].Cycles
			return res, nil
		}
		w, which, _ := excess(pt)
		if w <= 0 {
			continue
		}
		lo, hi := res.Points[k-1].Cycles, pt.Cycles
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
			res.Warnings = append(res.Warnings, fmt.Sprintf("the crossing between %g and %g cycles was not refined: %v", lo, hi, err))
		}
		crossing := eval(n + 1e-3)
		if crossing.Err == nil {
			_, which, _ = excess(crossing)
		}
		res.MaxCycles, res.Limiting = n, which
		return res, nil
	}
	res.Warnings = append(res.Warnings, fmt.Sprintf("no limit of the %s profile is reached up to %g cycles", profile.Name, maxN))
	return res, nil
}
