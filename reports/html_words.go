package reports

import (
	"regexp"
	"strings"
	"sync"

	"scalerisk/saturation"
	"scalerisk/water"
)

// Client words: what the report says is written for the client, in words
// and units, never in the tool's flags, keys or internal tags.

// snakeKey matches a lower-case key with an underscore
// (tricalcium_phosphate, silica_amorphous, Mg_as_CaCO3).
var snakeKey = regexp.MustCompile(`\b[A-Za-z][a-z0-9]*(?:_[A-Za-z0-9]+)+\b`)

// viaEntry matches the "(via name, " of a constant's range note.
var viaEntry = regexp.MustCompile(`\(via [A-Za-z_]+, `)

// clientText rewrites text from the lower layers (warnings, sources) for a
// reader: limit quantities in words, mineral keys as mineral names, and no
// "(via key, …)" of the table entries.
func clientText(s string) string {
	s = reagentKey().ReplaceAllStringFunc(s, func(k string) string {
		if r, err := water.LookupReagent(k); err == nil {
			return r.Label
		}
		return k
	})
	s = quantityKey.ReplaceAllStringFunc(s, quantityLabel)
	s = viaEntry.ReplaceAllString(s, "(")
	return snakeKey.ReplaceAllStringFunc(s, func(k string) string {
		if strings.Contains(k, "_as_") {
			return strings.ReplaceAll(k, "_", " ")
		}
		return mineralLabel(k)
	})
}

// reagentKey matches the names of the reagent table (h2so4, naoh, …).
var reagentKey = sync.OnceValue(func() *regexp.Regexp {
	var names []string
	for _, r := range water.Reagents() {
		names = append(names, regexp.QuoteMeta(r.Name))
	}
	return regexp.MustCompile(`\b(?:` + strings.Join(names, "|") + `)\b`)
})

// quantityKey matches a limit quantity as the limit files write it.
var quantityKey = regexp.MustCompile(`\b(?:si|mg_per_l|product):[A-Za-z0-9_*]+|\blsi\b`)

// ruleWords says in words how the carbonate system of a concentrated water
// is found under rule.
func ruleWords(r saturation.CarbonateRule) string {
	switch {
	case r.SetPoint > 0:
		return "acid dosed to hold pH " + num(r.SetPoint, 1) + ", its sulfate or chloride added"
	case r.Name == "natural":
		return "the pH an open tower settles at for its alkalinity, a common-practice relation"
	case r.A != 0:
		return "the pH from the tower's own relation, pH = " + num(r.A, 3) + "·log₁₀(alkalinity) " +
			signedGap(r.B)
	case r.Mode == saturation.Air:
		return "in equilibrium with the carbon dioxide of air"
	}
	return "closed to air: no carbon dioxide exchanged, pH recomputed"
}

// signedGap writes "+ 4.54" or "− 1.20".
func signedGap(x float64) string {
	if x < 0 {
		return "− " + num(-x, 2)
	}
	return "+ " + num(x, 2)
}

// profileWords names a limit profile for a reader.
func profileWords(name string) string {
	switch name {
	case "inhibitor":
		return "the usual limits with an antiscalant"
	case "no-inhibitor":
		return "the usual limits without an antiscalant"
	}
	return "the limits of " + name
}

// activityWords names an activity model as the literature does.
func activityWords(m saturation.ActivityModel) string {
	switch s := m.String(); s {
	case "davies":
		return "Davies"
	case "truesdell-jones":
		return "Truesdell–Jones"
	case "pitzer":
		return "Pitzer"
	default:
		return s
	}
}

// exceededWords names the limits a makeup water is already past, a mineral
// by its name (its polymorphs, whose limit is the same, left out) and any
// other quantity in words.
func exceededWords(c *saturation.CyclesResult) []string {
	var out []string
	formulas := map[string]bool{}
	for _, q := range c.Exceeded {
		kind, mineral, _ := strings.Cut(q, ":")
		if kind != "si" {
			out = append(out, quantityLabel(q))
			continue
		}
		if e, ok := saturation.DefaultTable().Entry(mineral); ok {
			if formulas[e.Formula] {
				continue
			}
			formulas[e.Formula] = true
		}
		out = append(out, mineralLabel(mineral))
	}
	return out
}
