package plan

import (
	"scalerisk/saturation"
	"scalerisk/water"
)

// BalanceInput is a makeup or circulating sample kept for the pair
// balances, with the blowdown (m³/h, 0 for none) that gives its deficits
// in kg/day.
type BalanceInput struct {
	Water    water.Analysis
	Blowdown float64
}

// Balances keep the makeup and circulating (recirculating or blowdown)
// waters of a report as they come, and balance their pairs at the end.
// Only these waters are kept: a report's memory stays bounded by them.
type Balances struct {
	inputs []BalanceInput
}

// Keep keeps a for the balances when it has a makeup or circulating role
// (water.Role); other waters take no part.
func (bs *Balances) Keep(a water.Analysis, blowdown float64) {
	if a.Role == water.RoleMakeup || a.Role.Circulating() {
		bs.inputs = append(bs.inputs, BalanceInput{Water: a, Blowdown: blowdown})
	}
}

// PairBalance is the mass balance of one makeup–tower pair, or why it
// could not be made.
type PairBalance struct {
	Makeup, Tower string // sample names
	// SameDate is false when only the system column paired them.
	SameDate bool
	// Blowdown is the tower's blowdown, m³/h, behind the kg/day figures
	// (0: none given).
	Blowdown float64
	Balance  *saturation.Balance // nil when Err != nil
	Err      error
}

// Pairs pairs the waters kept (water.Pairs: by role, system and date) and
// balances each pair with saturation.BalanceOf, in the order of the tower
// samples; the notes say which circulating samples found no makeup.
func (bs *Balances) Pairs() ([]PairBalance, []string) {
	waters := make([]water.Analysis, len(bs.inputs))
	for i, in := range bs.inputs {
		waters[i] = in.Water
	}
	pairs, notes := water.Pairs(waters)
	out := make([]PairBalance, 0, len(pairs))
	for _, p := range pairs {
		m, t := bs.inputs[p.Makeup], bs.inputs[p.Tower]
		pb := PairBalance{Makeup: m.Water.Name, Tower: t.Water.Name, SameDate: p.SameDate, Blowdown: t.Blowdown}
		pb.Balance, pb.Err = saturation.BalanceOf(m.Water, t.Water, t.Blowdown)
		out = append(out, pb)
	}
	return out, notes
}
