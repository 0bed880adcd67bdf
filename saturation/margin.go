package saturation

import (
	"math"

	"scalerisk/water"
)

// LimitMargin is how far one quantity of a water is from its limit.
type LimitMargin struct {
	Quantity string
	Max      float64
	// Value is the quantity in the water as it is (its measured pH) at the
	// bulk temperature; SkinValue at the skin temperature, bulk pH held
	// (NaN without a skin).
	Value, SkinValue float64
	// Margin is Max minus the higher of Value and SkinValue, in the
	// quantity's own unit (SI units, mg/L, …): negative past the limit.
	Margin float64
	// Governing is the temperature of the higher value, °C.
	Governing float64
}

// MarginResult is the answer of Margin.
type MarginResult struct {
	Profile LimitProfile
	Limits  []LimitMargin // in profile order; quantities the water lacks are left out
	// Further is the highest further concentration of the water under the
	// profile (MaxCycles on the water as a makeup): its MaxCycles is the
	// factor the water can still be concentrated by (1 when a limit is
	// already passed), its Limiting the quantity that runs out first and
	// its Judged the temperature that governs.
	Further *CyclesResult
	// Cycles is the water's own cycles of concentration when known (from
	// its makeup; NaN otherwise); MaxCycles is then Cycles × the further
	// factor, and CyclesMargin MaxCycles − Cycles: how many more cycles the
	// system can run.
	Cycles, MaxCycles, CyclesMargin float64
}

// Margin answers the question a recirculating water is asked: how far is
// it from its limits? Each limit of profile is measured in the water as it
// is (at its measured pH), at the bulk and, with opt.Skin above the bulk,
// at the skin temperature (bulk pH held, as in MaxCycles); the margin is
// taken at the worse of the two. The margin in cycles comes from
// concentrating the water further under rule up to maxN times; cycles, the
// water's own cycles against its makeup (NaN when unknown), turns the
// further factor into cycles of the system.
func Margin(a water.Analysis, profile LimitProfile, rule CarbonateRule, maxN, cycles float64, opt Options) (*MarginResult, error) {
	sp := NewSpeciator(opt.Model)
	r, err := sp.Speciate(a, opt)
	if err != nil {
		return nil, err
	}
	ix, _ := sp.ClassicIndicesNoCCPP(r)
	skin := skinOf(r.Temperature, opt)
	var hot *Result
	var hix Indices
	if !math.IsNaN(skin) {
		if hot, hix, err = sp.heat(r, skin, opt); err != nil {
			return nil, err
		}
	}
	res := &MarginResult{Profile: profile, Cycles: cycles, MaxCycles: math.NaN(), CyclesMargin: math.NaN(),
		Limits: limitMargins(profile, r, ix, hot, hix, skin)}
	if res.Further, err = MaxCycles(a, profile, rule, maxN, 0, opt); err != nil {
		return nil, err
	}
	if cycles > 0 {
		res.MaxCycles = cycles * res.Further.MaxCycles
		res.CyclesMargin = res.MaxCycles - cycles
	}
	return res, nil
}

// limitMargins measures each limit of profile in r (at the bulk, with its
// indices ix) and, when hot is not nil, in hot (the water heated to skin
// °C, with its indices hix); the margin of each is taken at the worse of
// the two. Quantities the water lacks are left out; the rest keep profile
// order.
func limitMargins(profile LimitProfile, r *Result, ix Indices, hot *Result, hix Indices, skin float64) []LimitMargin {
	var out []LimitMargin
	for _, l := range profile.Limits {
		v, ok := l.Value(r, ix)
		if !ok {
			continue
		}
		m := LimitMargin{Quantity: l.Quantity, Max: l.Max, Value: v, SkinValue: math.NaN(), Governing: r.Temperature}
		worst := v
		if hot != nil {
			if hv, ok := l.Value(hot, hix); ok {
				m.SkinValue = hv
				if hv > worst {
					worst, m.Governing = hv, skin
				}
			}
		}
		m.Margin = l.Max - worst
		out = append(out, m)
	}
	return out
}
