package saturation

import (
	"math"
	"sync"

	"scalerisk/data"
)

// Band is a plain-word risk band of a saturation index.
type Band int

// The risk bands, from least to most risk.
const (
	Undersaturated  Band = iota // SI < −0.2: the water dissolves the mineral
	NearEquilibrium             // −0.2 ≤ SI ≤ 0.2
	SlowToForm                  // supersaturated, but the mineral rarely forms as scale here
	WithinReach                 // supersaturated, within what an inhibitor usually holds
	Supersaturated              // supersaturated, no common inhibitor figure
	BeyondReach                 // supersaturated beyond what an inhibitor usually holds
)

var bandNames = [...]string{
	"undersaturated",
	"near equilibrium",
	"supersaturated, slow to form",
	"supersaturated – within inhibitor reach",
	"supersaturated",
	"beyond inhibitor reach",
}

func (b Band) String() string { return bandNames[b] }

// NearEquilibriumSI is the half-width of the near-equilibrium band in SI
// units: ±0.2, the "stable" band of the Langelier scale as commonly
// tabulated (from memory; common practice). RiskBand and the report's
// charts use it.
const NearEquilibriumSI = 0.2

// Reach is what the embedded tables say of one mineral: the highest SI a
// typical inhibitor programme holds (the "inhibitor" profile of
// data/limits.csv) and whether it is slow to form (data/slow_minerals.csv).
type Reach struct {
	Mineral string
	MaxSI   float64 // NaN when the inhibitor profile gives no figure
	Slow    bool
	Source  string
}

type slowRow struct {
	Mineral string `csv:"mineral"`
	Source  string `csv:"source"`
}

var slowTable = sync.OnceValues(func() (map[string]string, error) {
	var rows []slowRow
	if err := data.Unmarshal("slow_minerals.csv", &rows); err != nil {
		return nil, err
	}
	out := map[string]string{}
	for _, row := range rows {
		out[row.Mineral] = row.Source
	}
	return out, nil
})

// InhibitorReach returns what the embedded tables say of mineral, and
// whether they say anything.
func InhibitorReach(mineral string) (Reach, bool) {
	slow, err := slowTable()
	if err != nil {
		panic("saturation: embedded slow-mineral table is broken: " + err.Error())
	}
	r := Reach{Mineral: mineral, MaxSI: math.NaN()}
	src, isSlow := slow[mineral]
	if isSlow {
		r.Slow, r.Source = true, src
	}
	prof, _ := LimitProfileNamed("inhibitor")
	l, hasLimit := prof.Lookup("si:" + mineral)
	if hasLimit {
		r.MaxSI = l.Max
		if !isSlow {
			r.Source = l.Source
		}
	}
	return r, isSlow || hasLimit
}

// RiskBand returns the plain-word band of saturation index si of mineral:
// undersaturated below −0.2, near equilibrium to +0.2 (or to the inhibitor
// limit where that is lower), and above that
// "slow to form" for minerals that rarely scale at these temperatures,
// "within inhibitor reach" up to the inhibitor profile's limit,
// "beyond inhibitor reach" above it, and plain "supersaturated" where the
// profile gives no figure.
func RiskBand(mineral string, si float64) Band {
	if si < -NearEquilibriumSI {
		return Undersaturated
	}
	r, ok := InhibitorReach(mineral)
	limited := ok && !r.Slow && !math.IsNaN(r.MaxSI)
	if si <= NearEquilibriumSI && !(limited && si > r.MaxSI) {
		// Near equilibrium, unless the inhibitor limit is tighter than the
		// band (amorphous silica: +0.18).
		return NearEquilibrium
	}
	switch {
	case ok && r.Slow:
		return SlowToForm
	case !ok || math.IsNaN(r.MaxSI):
		return Supersaturated
	case si <= r.MaxSI:
		return WithinReach
	}
	return BeyondReach
}
