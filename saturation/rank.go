package saturation

import (
	"cmp"
	"math"
	"slices"
)

// Ranked is one mineral of a result with what a reader must act on: its
// saturation index, the limit a profile sets on it, the margin left to
// that limit and its risk band.
type Ranked struct {
	MineralResult
	// Band is the risk band of SI (RiskBand, or BandUnder a profile).
	Band Band
	// Limit is the highest SI the profile allows; NaN when it sets none.
	Limit float64
	// Margin is Limit − SI: positive while the mineral is within its
	// limit, negative past it; NaN without a limit.
	Margin float64
}

// BandUnder returns the risk band of saturation index si of mineral under
// the SI limits of profile p: the bands of RiskBand, with p's limit in
// place of the inhibitor profile's (WithinReach up to it, BeyondReach past
// it). Minerals that are slow to form stay SlowToForm; a mineral p gives no
// SI limit is Supersaturated above the near-equilibrium band.
func BandUnder(p LimitProfile, mineral string, si float64) Band {
	if si < -NearEquilibriumSI {
		return Undersaturated
	}
	r, _ := InhibitorReach(mineral)
	l, limited := p.Lookup("si:" + mineral)
	limited = limited && !r.Slow && !math.IsNaN(l.Max)
	if si <= NearEquilibriumSI && !(limited && si > l.Max) {
		return NearEquilibrium
	}
	switch {
	case r.Slow:
		return SlowToForm
	case !limited:
		return Supersaturated
	case si <= l.Max:
		return WithinReach
	}
	return BeyondReach
}

// Rank returns the scale formers of r that are not undersaturated, the most
// at risk first, under the limits of profile p (the inhibitor profile when
// p is nil): those past their limit first, by how far past; then the
// supersaturated ones with or without a limit together, by saturation
// index; then those near equilibrium, by saturation index. A scale former
// is a mineral not marked slow to form that p gives a limit or that is
// supersaturated. Minerals with a non-finite SI are left out. The first
// element, when there is one, is the limiting mineral.
//
// The ranking is a common-practice reading: the mineral closest to (or
// furthest past) its limit governs the treatment.
func Rank(r *Result, p *LimitProfile) []Ranked {
	if r == nil {
		return nil
	}
	prof := inhibitorProfile()
	if p != nil {
		prof = *p
	}
	var out []Ranked
	for _, m := range r.Minerals {
		if math.IsNaN(m.SI) || math.IsInf(m.SI, 0) {
			continue
		}
		reach, _ := InhibitorReach(m.Name)
		l, limited := prof.Lookup("si:" + m.Name)
		band := BandUnder(prof, m.Name, m.SI)
		if reach.Slow || band == Undersaturated || !(limited || band == Supersaturated) {
			continue
		}
		rk := Ranked{MineralResult: m, Band: band, Limit: math.NaN(), Margin: math.NaN()}
		if limited && !math.IsNaN(l.Max) {
			rk.Limit, rk.Margin = l.Max, l.Max-m.SI
		}
		out = append(out, rk)
	}
	slices.SortStableFunc(out, func(x, y Ranked) int { return compareRisk(y, x) })
	return out
}

// Limiting returns the limiting mineral of r under profile p (see Rank);
// ok is false when no scale former is at or above near equilibrium.
func Limiting(r *Result, p *LimitProfile) (Ranked, bool) {
	rk := Rank(r, p)
	if len(rk) == 0 {
		return Ranked{}, false
	}
	return rk[0], true
}

// riskClass groups the bands for ranking: past a limit, supersaturated
// (with or without a limit), near equilibrium.
func riskClass(b Band) int {
	switch b {
	case BeyondReach:
		return 2
	case WithinReach, Supersaturated:
		return 1
	}
	return 0
}

// compareRisk orders two ranked minerals by risk (see Rank).
func compareRisk(x, y Ranked) int {
	if c := cmp.Compare(riskClass(x.Band), riskClass(y.Band)); c != 0 {
		return c
	}
	if x.Band == BeyondReach {
		return cmp.Compare(-x.Margin, -y.Margin)
	}
	return cmp.Compare(x.SI, y.SI)
}

// inhibitorProfile is the embedded "inhibitor" profile, whose SI limits
// are the edges of RiskBand.
func inhibitorProfile() LimitProfile {
	// The shared embedded profile, not a copy: Rank and BandUnder only read
	// it, and Rank runs for every sample written.
	for _, p := range embedded() {
		if p.Name == "inhibitor" {
			return p
		}
	}
	return LimitProfile{}
}
