package saturation

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"scalerisk/water"
)

// IonCycles is one ion of a makeup–tower pair: its concentration in each,
// its cycles of concentration (tower / makeup) and its mass balance against
// the pair's reference cycles.
type IonCycles struct {
	Ion    string // "Cl", "Mg", "Na", "SiO2", "conductivity", "Ca", "alkalinity", "SO4", "PO4", …
	Unit   string // "mg/L", "mg/L as CaCO3" (alkalinity) or "µS/cm" (conductivity)
	Makeup float64
	Tower  float64
	// Cycles is Tower / Makeup.
	Cycles float64
	// Conservative marks the ions that stay in solution in a healthy tower
	// and so give its cycles (Cl, Mg, Na, SiO2, conductivity; common
	// practice, practice-2.md).
	Conservative bool
	// Expected is Makeup × the pair's reference cycles: what the tower
	// would hold if nothing left the water but blowdown. Deficit is
	// Expected − Tower (positive: missing from the tower), in Unit.
	Expected, Deficit float64
	// DeficitKgPerDay is the deficit carried by the blowdown flow, kg/day
	// (as CaCO3 for alkalinity); NaN without a flow or for conductivity.
	DeficitKgPerDay float64
	// Missing and Gained mark an ion whose cycles fall below, or rise
	// above, the reference cycles by more than BalanceTolerance; ions
	// below 0.1 mg/L in the makeup (trace levels) are not judged, and ions
	// reported below detection take no part.
	Missing, Gained bool
}

// Deposit is a likely deposit named from the ions a tower is missing.
type Deposit struct {
	Name     string // "calcium carbonate"
	Formula  string // "CaCO3"
	Evidence string // the deficits that point to it, in words
}

// Balance is the mass balance of one makeup–tower pair.
type Balance struct {
	Makeup, Tower string // sample names
	System, Date  string
	// Cycles is the tower's cycles of concentration: the median of the
	// conservative ions' cycles (Basis names them), robust to one ion
	// skewed by chlorination (Cl), acid or caustic feed (conductivity, Na)
	// or a deposit (Mg, SiO2).
	Cycles float64
	Basis  []string
	// Spread is the highest minus the lowest of the conservative ions'
	// cycles, a check on the pair.
	Spread   float64
	Ions     []IonCycles
	Deposits []Deposit
	// Notes say what else the balance shows (acid feed, treatment
	// chemicals, a dubious pair).
	Notes []string
}

// BalanceTolerance is the relative gap between an ion's cycles and the
// reference cycles beyond which the ion is called missing or gained: 10 %.
// Two analyses of typical precision (titrations 1–3 %, ion chromatography
// 2–5 %; practice-2.md, from memory) make a ratio good to about 5–7 %, so a
// 10 % gap is beyond analytical scatter (this tool's choice; common
// practice speaks of cycles "well below" the chloride cycles).
const BalanceTolerance = 0.10

// balanceIon is an ion the balance looks at.
type balanceIon struct {
	name         string
	conservative bool
}

// balanceIons are the ions of a balance, conservative ones first.
var balanceIons = []balanceIon{
	{"Cl", true}, {"Mg", true}, {"Na", true}, {"SiO2", true}, {"conductivity", true},
	{"Ca", false}, {"alkalinity", false}, {"SO4", false}, {"PO4", false}, {"F", false},
	{"Ba", false}, {"Sr", false}, {"Fe", false}, {"Mn", false}, {"K", false},
}

// ionValue returns the concentration of ion in a (mg/L; alkalinity as
// CaCO3; conductivity µS/cm) and whether the laboratory reported it.
func ionValue(a water.Analysis, ion string) (float64, string, bool) {
	switch ion {
	case "conductivity":
		v := a.MeasuredConductivity
		return v, "µS/cm", !math.IsNaN(v) && v > 0
	case "alkalinity":
		v := a.AlkalinityAsCaCO3()
		return v, "mg/L as CaCO3", !math.IsNaN(v) && v > 0
	}
	f, err := parseForm(ion)
	if err != nil || !a.Measured[f.comp] || belowDetection(a, f.comp) {
		return 0, "", false
	}
	v, ok := f.mgPerL(a)
	return v, "mg/L", ok
}

// belowDetection reports whether the laboratory gave component c of a as
// "<x": a substitute value has no ratio to take.
func belowDetection(a water.Analysis, c water.Component) bool {
	for _, m := range a.Entered {
		if m.BelowDetection && m.Analyte != nil && m.Analyte.Component == c.String() {
			return true
		}
	}
	return false
}

// traceLevel is the makeup concentration, mg/L, below which an ion's
// cycles are shown but not judged: near the detection limit trace metals
// are good to 10–30 % (practice-2.md, from memory), so their ratio says
// little (this tool's choice).
const traceLevel = 0.1

// BalanceOf computes the mass balance of a tower (or blowdown) water
// against its makeup: the cycles of each ion both report, the tower's
// cycles from the conservative ones (Cl, Mg, Na, SiO2, conductivity:
// cycles = tower / makeup; common practice, practice-2.md), the ions the
// tower is missing or has gained beyond BalanceTolerance, the deficit in
// mg/L and, with blowdown (m³/h, 0 for none), in kg/day, and the likely
// deposits: calcium and alkalinity missing → calcium carbonate; calcium and
// sulfate → calcium sulfate; calcium and phosphate → calcium phosphate;
// magnesium and silica → magnesium silicate; silica alone → silica; and
// so on (common practice: calcium or alkalinity cycles well below chloride
// cycles point to deposition).
//
// It returns an error when the two waters share no conservative ion.
func BalanceOf(makeup, tower water.Analysis, blowdown float64) (*Balance, error) {
	b := &Balance{Makeup: makeup.Name, Tower: tower.Name, System: tower.System, Date: tower.Date}
	var basis []float64
	for _, ion := range balanceIons {
		m, unit, okM := ionValue(makeup, ion.name)
		t, _, okT := ionValue(tower, ion.name)
		if !okM || !okT || !(m > 0) {
			continue
		}
		ic := IonCycles{Ion: ion.name, Unit: unit, Makeup: m, Tower: t, Cycles: t / m, Conservative: ion.conservative}
		b.Ions = append(b.Ions, ic)
		if ion.conservative {
			basis = append(basis, ic.Cycles)
			b.Basis = append(b.Basis, ion.name)
		}
	}
	if len(basis) == 0 {
		return nil, fmt.Errorf("%w: %s and %s share no conservative ion (Cl, Mg, Na, SiO2 or conductivity): their cycles cannot be found",
			ErrInconsistent, makeup.Name, tower.Name)
	}
	b.Cycles = median(basis)
	b.Spread = slices.Max(basis) - slices.Min(basis)
	if b.Cycles < 1 {
		b.Notes = append(b.Notes, fmt.Sprintf("the tower is more dilute than its makeup (%.2f cycles): check that the pair is right", b.Cycles))
	}
	for i := range b.Ions {
		ic := &b.Ions[i]
		ic.Expected = ic.Makeup * b.Cycles
		ic.Deficit = ic.Expected - ic.Tower
		ic.DeficitKgPerDay = math.NaN()
		if blowdown > 0 && ic.Ion != "conductivity" {
			ic.DeficitKgPerDay = KgPerDay(ic.Deficit, blowdown)
		}
		if math.Abs(ic.Deficit) < 1e-9*ic.Expected {
			ic.Deficit = 0 // the conservative ion that sets the median
		}
		judged := ic.Unit != "mg/L" || ic.Makeup >= traceLevel
		ic.Missing = judged && ic.Cycles < b.Cycles*(1-BalanceTolerance)
		ic.Gained = judged && ic.Cycles > b.Cycles*(1+BalanceTolerance)
	}
	b.Deposits, b.Notes = nameDeposits(b, b.Notes)
	return b, nil
}

// median returns the median of xs (not empty); xs is sorted in place.
func median(xs []float64) float64 {
	slices.Sort(xs)
	n := len(xs)
	if n%2 == 1 {
		return xs[n/2]
	}
	return (xs[n/2-1] + xs[n/2]) / 2
}

// ion returns the balance line of name, if the pair has it.
func (b *Balance) ion(name string) (IonCycles, bool) {
	for _, ic := range b.Ions {
		if ic.Ion == name {
			return ic, true
		}
	}
	return IonCycles{}, false
}

// depositRule names a deposit from the ions that must be missing together.
type depositRule struct {
	ions    []string
	name    string
	formula string
}

// depositRules are the trade's readings of missing ions, most specific
// first (common practice).
var depositRules = []depositRule{
	{[]string{"Ca", "alkalinity"}, "calcium carbonate", "CaCO3"},
	{[]string{"Ca", "SO4"}, "calcium sulfate", "CaSO4·2H2O"},
	{[]string{"Ca", "PO4"}, "calcium phosphate", "Ca3(PO4)2"},
	{[]string{"Ca", "F"}, "calcium fluoride", "CaF2"},
	{[]string{"Mg", "SiO2"}, "magnesium silicate", "Mg3Si4O10(OH)2"},
	{[]string{"Ba", "SO4"}, "barium sulfate", "BaSO4"},
	{[]string{"Sr", "SO4"}, "strontium sulfate", "SrSO4"},
	{[]string{"Fe"}, "iron oxides (or iron removed by oxidation)", "Fe2O3"},
	{[]string{"Mn"}, "manganese oxides (or manganese removed by oxidation)", "MnO2"},
}

// nameDeposits reads the missing ions of b as deposits and adds notes on
// what the gained ions and the leftovers say.
func nameDeposits(b *Balance, notes []string) ([]Deposit, []string) {
	missing := func(name string) bool { ic, ok := b.ion(name); return ok && ic.Missing }
	gained := func(name string) bool { ic, ok := b.ion(name); return ok && ic.Gained }
	explained := map[string]bool{}
	var out []Deposit
	for _, r := range depositRules {
		all := true
		for _, ion := range r.ions {
			all = all && missing(ion)
		}
		if !all {
			continue
		}
		var ev []string
		for _, ion := range r.ions {
			ic, _ := b.ion(ion)
			ev = append(ev, fmt.Sprintf("%s at %.2f cycles (%.3g %s missing)", ion, ic.Cycles, ic.Deficit, ic.Unit))
			explained[ion] = true
		}
		d := Deposit{Name: r.name, Formula: r.formula,
			Evidence: fmt.Sprintf("%s, against %.2f cycles by %s", strings.Join(ev, " and "), b.Cycles, strings.Join(b.Basis, ", "))}
		if r.formula == "CaCO3" {
			d.Evidence += caCO3Ratio(b)
		}
		out = append(out, d)
	}
	if missing("SiO2") && !explained["SiO2"] {
		ic, _ := b.ion("SiO2")
		out = append(out, Deposit{Name: "silica", Formula: "SiO2",
			Evidence: fmt.Sprintf("SiO2 at %.2f cycles (%.3g mg/L missing) against %.2f cycles", ic.Cycles, ic.Deficit, b.Cycles)})
		explained["SiO2"] = true
	}
	if missing("Ca") && !explained["Ca"] {
		ic, _ := b.ion("Ca")
		out = append(out, Deposit{Name: "a calcium salt (the anion is not identified)", Formula: "Ca",
			Evidence: fmt.Sprintf("Ca at %.2f cycles (%.3g mg/L missing) with no matching anion deficit: check the alkalinity, sulfate and phosphate results (calcium carbonate is the usual one)",
				ic.Cycles, ic.Deficit)})
	}
	if missing("alkalinity") && !explained["alkalinity"] {
		if gained("SO4") || gained("Cl") {
			notes = append(notes, "alkalinity is low and sulfate or chloride high: the signature of acid feed, not of a deposit")
		} else {
			notes = append(notes, "alkalinity is low with calcium in balance: CO2 loss does not change alkalinity, so suspect acid feed, a deposit of another carbonate, or the analyses")
		}
	}
	for _, ion := range []string{"PO4", "SO4", "Cl", "Na"} {
		if gained(ion) {
			notes = append(notes, fmt.Sprintf("%s is above the tower's cycles: added in the system (treatment chemicals, acid or caustic feed, chlorination), so its cycles do not measure concentration", ion))
		}
	}
	return out, notes
}

// caCO3Ratio compares the calcium and alkalinity deficits in the same
// unit (mg/L as CaCO3): a calcium carbonate deposit takes them 1:1.
func caCO3Ratio(b *Balance) string {
	ca, _ := b.ion("Ca")
	alk, _ := b.ion("alkalinity")
	caAs := water.AsCaCO3(2 * ca.Deficit / 40.078 / 1000) // mg/L Ca → eq/L → mg/L as CaCO3 (Standard Methods 2340)
	out := fmt.Sprintf("; the calcium deficit is %.3g and the alkalinity deficit %.3g mg/L as CaCO3 (a calcium carbonate deposit takes them 1:1)", caAs, alk.Deficit)
	if alk.Deficit > 1.5*caAs {
		out += "; the larger alkalinity deficit points to acid feed as well"
	}
	return out
}
