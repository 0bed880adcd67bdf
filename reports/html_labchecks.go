package reports

import (
	"fmt"
	"math"
	"strings"

	"scalerisk/water"
)

// checkLine is one data-quality check of a sample said in a sentence:
// what was compared, the result and what is acceptable, with its verdict.
type checkLine struct {
	Text    string
	Verdict chip
}

// verdictChip is the chip of a check that ran: ok, or check where it
// failed.
func verdictChip(pass bool) chip {
	if pass {
		return chip{"ok", "v-ok"}
	}
	return chip{"check", "v-check"}
}

// labCheckLines says in words the checks of a sample beyond the ion
// balance and the Standard Methods ratios of the quality table: the
// salinity of a seawater-like water (PSS-78) and the checks of the lab
// measurements the equilibrium does not use (total hardness, P-alkalinity).
// A check listed in q but not run (no conductivity for the salinity) says
// so, and so does a lab measurement of in that no check could use (a total
// hardness without calcium or magnesium).
func labCheckLines(q water.Quality, in water.Analysis) []checkLine {
	var out []checkLine
	salinity := water.SalinityCriterion().Name
	for _, c := range q.Checks {
		if c.Criterion.Name != salinity {
			continue
		}
		const lead = "Salinity of a seawater-like water (mostly sodium and chloride), checked in place of the " +
			"fresh-water conductivity checks: "
		if !c.Done {
			out = append(out, checkLine{lead + "not checked, as the conductivity was not measured.", chip{"not measured", "v-none"}})
			continue
		}
		out = append(out, checkLine{fmt.Sprintf("%spractical salinity %s from the measured conductivity (PSS-78) "+
			"against %s from the composition, a ratio of %s; acceptable: %s.", lead, num(q.SalinityFromEC, 2),
			num(q.SalinityFromComposition, 2), num(c.Value, 3), c.Criterion.Limit), verdictChip(c.Pass)})
	}
	for _, c := range q.Lab {
		var text string
		switch c.Kind {
		case water.HardnessCheck:
			text = fmt.Sprintf("Total hardness reported by the lab, %s mg/L as CaCO3, against %s from the calcium "+
				"and magnesium of the analysis; acceptable: %s.", sigText(c.Value, 4), sigText(c.Against, 4), c.Limit)
		case water.PAlkalinityCheck:
			text = fmt.Sprintf("P-alkalinity reported by the lab, %s mg/L as CaCO3, against the total alkalinity, "+
				"%s; acceptable: %s.", sigText(c.Value, 4), sigText(c.Against, 4), c.Limit)
		case water.PAlkalinityPHCheck:
			text = fmt.Sprintf("P-alkalinity reported by the lab, %s mg/L as CaCO3, against the pH, %s; acceptable: %s.",
				sigText(c.Value, 4), num(c.Against, 2), c.Limit)
		default:
			continue
		}
		out = append(out, checkLine{text, verdictChip(c.Pass)})
	}
	return append(out, uncheckedLab(q, in)...)
}

// uncheckedLab says the total hardness and P-alkalinity of in that no
// check of q used, with their values.
func uncheckedLab(q water.Quality, in water.Analysis) []checkLine {
	ran := map[water.LabCheckKind]bool{}
	for _, c := range q.Lab {
		ran[c.Kind] = true
	}
	var out []checkLine
	notChecked := chip{"not checked", "v-none"}
	if !math.IsNaN(in.TotalHardness) && !ran[water.HardnessCheck] {
		out = append(out, checkLine{fmt.Sprintf("Total hardness reported by the lab, %s mg/L as CaCO3: not checked, "+
			"as the analysis gives neither calcium nor magnesium.", sigText(in.TotalHardness, 4)), notChecked})
	}
	if !math.IsNaN(in.PAlkalinity) && !ran[water.PAlkalinityCheck] && !ran[water.PAlkalinityPHCheck] {
		out = append(out, checkLine{fmt.Sprintf("P-alkalinity reported by the lab, %s mg/L as CaCO3: not checked, "+
			"as the analysis gives neither the total alkalinity nor the pH.", sigText(in.PAlkalinity, 4)), notChecked})
	}
	return out
}

// labReported lists what the lab reported that the calculation does not
// use, "name value unit" joined by "; " (blank cells left out), named and
// with the unit as water.OtherValue.Label gives them.
func labReported(others []water.OtherValue) string {
	var parts []string
	for _, o := range others {
		if o.Value == "" {
			continue
		}
		label, unit := o.Label()
		label = strings.ReplaceAll(label, "_", " ") // a column's own key, in words
		parts = append(parts, strings.TrimSpace(label+" "+o.Value+" "+unit))
	}
	return strings.Join(parts, "; ")
}
