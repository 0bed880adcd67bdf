package reports

import (
	"fmt"
	"strings"

	"scalerisk/plan"
	"scalerisk/saturation"
)

// balanceView is the makeup and tower water balance of one pair.
type balanceView struct {
	Title   string // "tower 1 recirculating against Kestrel Fen makeup well 2"
	Where   string // system and date
	Error   string // why the pair could not be balanced
	Cycles  string // the median cycles
	Basis   string // the conservative ions behind it, in words
	Spread  string
	Kg      bool // the table has a kg/day column
	Rows    []balanceRow
	Missing string   // the ions missing from the tower, in words
	Deposit string   // the likely deposit sentence
	Notes   []string // what else the balance shows
}

// balanceRow is one ion of the balance table.
type balanceRow struct {
	Ion, Unit, Makeup, Tower, Cycles, Deficit, Kg, Reading string
}

// balanceWords are the client's words for the ions of a balance.
var balanceWords = map[string]string{
	"Cl": "Chloride", "Mg": "Magnesium", "Na": "Sodium", "SiO2": "Silica (SiO2)", "conductivity": "Conductivity",
	"Ca": "Calcium", "alkalinity": "Alkalinity", "SO4": "Sulfate", "PO4": "Phosphate", "F": "Fluoride",
	"Ba": "Barium", "Sr": "Strontium", "Fe": "Iron", "Mn": "Manganese", "K": "Potassium",
}

// balanceWord names ion in the client's words, lower case unless first.
func balanceWord(ion string, first bool) string {
	w, ok := balanceWords[ion]
	if !ok {
		return ion
	}
	if first {
		return w
	}
	if ion == "SiO2" {
		return "silica"
	}
	return strings.ToLower(w[:1]) + w[1:]
}

// balanceViews lays out the pair balances of a report.
func balanceViews(pbs []plan.PairBalance) []balanceView {
	out := make([]balanceView, 0, len(pbs))
	for _, pb := range pbs {
		bv := balanceView{Title: pb.Tower + " against " + pb.Makeup}
		if pb.Err != nil {
			bv.Error = clientText(pb.Err.Error())
			out = append(out, bv)
			continue
		}
		b := pb.Balance
		bv.Where = balanceWhere(b, pb.SameDate)
		bv.Cycles, bv.Spread = num(b.Cycles, 2), num(b.Spread, 2)
		var basis, missing []string
		for _, ion := range b.Basis {
			basis = append(basis, balanceWord(ion, false))
		}
		bv.Basis = joinWords(basis)
		bv.Kg = pb.Blowdown > 0
		for _, ic := range b.Ions {
			bv.Rows = append(bv.Rows, balanceRowOf(ic, bv.Kg))
			if ic.Missing {
				missing = append(missing, balanceWord(ic.Ion, false))
			}
		}
		bv.Missing = "No ion is missing from the tower beyond 10 % of its cycles."
		if len(missing) > 0 {
			bv.Missing = "Missing from the tower (cycles more than 10 % below " + bv.Cycles + "): " + joinWords(missing) + "."
		}
		bv.Deposit = depositSentence(b.Deposits)
		for _, n := range b.Notes {
			bv.Notes = append(bv.Notes, balanceNote(n))
		}
		out = append(out, bv)
	}
	return out
}

// balanceRowOf is the table row of one ion.
func balanceRowOf(ic saturation.IonCycles, kg bool) balanceRow {
	r := balanceRow{Ion: balanceWord(ic.Ion, true), Unit: ic.Unit, Makeup: sigText(ic.Makeup, 4), Tower: sigText(ic.Tower, 4),
		Cycles: num(ic.Cycles, 2), Deficit: sigText(ic.Deficit, 4)}
	if kg {
		r.Kg = sigText(ic.DeficitKgPerDay, 3)
	}
	switch {
	case ic.Missing:
		r.Reading = "missing from the tower"
	case ic.Gained:
		r.Reading = "added in the system"
	case ic.Conservative:
		r.Reading = "gives the cycles"
	default:
		r.Reading = "in balance"
	}
	return r
}

// balanceWhere names the system and date of a pair.
func balanceWhere(b *saturation.Balance, sameDate bool) string {
	var parts []string
	if b.System != "" {
		parts = append(parts, "System "+b.System)
	}
	if b.Date != "" {
		parts = append(parts, "sampled "+b.Date)
	}
	s := strings.Join(parts, ", ")
	if !sameDate {
		s += " (the makeup was sampled on another date: paired by system)"
	}
	return s
}

// depositSentence names the likely deposits of a balance.
func depositSentence(ds []saturation.Deposit) string {
	if len(ds) == 0 {
		return "The balance points to no deposit."
	}
	var names []string
	for _, d := range ds {
		names = append(names, fmt.Sprintf("%s (%s)", d.Name, d.Formula))
	}
	if len(names) == 1 {
		return "The likely deposit is " + names[0] + "."
	}
	return "The likely deposits are " + joinWords(names) + "."
}

// balanceNote is a note of a balance in the client's words: an ion symbol
// that starts it named, and a full stop.
func balanceNote(n string) string {
	if ion, rest, ok := strings.Cut(n, " "); ok {
		if _, known := balanceWords[ion]; known {
			n = balanceWord(ion, true) + " " + rest
		}
	}
	n = clientText(n)
	if !strings.HasSuffix(n, ".") {
		n += "."
	}
	return strings.ToUpper(n[:1]) + n[1:]
}
