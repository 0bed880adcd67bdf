package saturation

import (
	"encoding/csv"
	"fmt"
	"math"
	"strings"
	"sync"

	"github.com/gocarina/gocsv"

	"scalerisk/data"
	"scalerisk/water"
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

// nearEquilibrium is the half-width of the near-equilibrium band in SI
// units: ±0.2, the "stable" band of the Langelier scale as commonly
// tabulated (practice.md §1.4, from memory; common practice).
const nearEquilibrium = 0.2

// Reach is what the embedded table data/inhibitor_reach.csv says of one
// mineral.
type Reach struct {
	Mineral string
	MaxSI   float64 // highest SI an inhibitor usually holds; NaN when no figure
	Slow    bool    // rarely forms as scale at cooling-water temperatures
	Source  string
}

type reachRow struct {
	Mineral string `csv:"mineral"`
	MaxSI   string `csv:"max_si"`
	Slow    string `csv:"slow"`
	Source  string `csv:"source"`
}

var reachTable = sync.OnceValues(func() (map[string]Reach, error) {
	f, err := data.FS.Open("inhibitor_reach.csv")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	var rows []reachRow
	if err := gocsv.UnmarshalCSV(r, &rows); err != nil {
		return nil, fmt.Errorf("data/inhibitor_reach.csv: %w", err)
	}
	out := map[string]Reach{}
	for _, row := range rows {
		rc := Reach{Mineral: row.Mineral, MaxSI: math.NaN(), Slow: strings.EqualFold(row.Slow, "yes"), Source: row.Source}
		if row.MaxSI != "" {
			v, err := water.ParseNumber(row.MaxSI)
			if err != nil {
				return nil, fmt.Errorf("data/inhibitor_reach.csv: %s: max_si %q: %w", row.Mineral, row.MaxSI, err)
			}
			rc.MaxSI = v
		}
		out[rc.Mineral] = rc
	}
	return out, nil
})

// InhibitorReach returns what the embedded table says of mineral, and
// whether it says anything.
func InhibitorReach(mineral string) (Reach, bool) {
	t, err := reachTable()
	if err != nil {
		panic("saturation: embedded inhibitor table is broken: " + err.Error())
	}
	r, ok := t[mineral]
	return r, ok
}

// RiskBand returns the plain-word band of saturation index si of mineral:
// undersaturated below −0.2, near equilibrium to +0.2, and above that
// "slow to form" for minerals that rarely scale at these temperatures,
// "within inhibitor reach" up to the common inhibitor figure of
// data/inhibitor_reach.csv, "beyond inhibitor reach" above it, and plain
// "supersaturated" where there is no figure.
func RiskBand(mineral string, si float64) Band {
	switch {
	case si < -nearEquilibrium:
		return Undersaturated
	case si <= nearEquilibrium:
		return NearEquilibrium
	}
	r, ok := InhibitorReach(mineral)
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
