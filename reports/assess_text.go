package reports

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"text/tabwriter"

	"scalerisk/saturation"
	"scalerisk/water"
)

// writeAssessText writes the text block of one assessment.
func writeAssessText(b *strings.Builder, a saturation.Assessment) {
	where := ""
	if a.File != "" {
		where = fmt.Sprintf("  (%s, line %d)", a.File, a.Line)
	}
	fmt.Fprintf(b, "%s%s\n", a.Name, where)
	if a.BadInput {
		fmt.Fprintf(b, "  not computed: %v\n", a.Err)
		return
	}
	writeQualityText(b, a.Quality)
	if a.Result == nil {
		fmt.Fprintf(b, "  speciation failed: %v\n", a.Err)
	} else {
		writeResultText(b, a.Result)
		writeIndicesText(b, a)
	}
	var warnings []string
	warnings = append(warnings, a.Input.BelowDetection...)
	warnings = append(warnings, a.Input.Warnings...)
	if a.Result != nil {
		warnings = append(warnings, a.Result.Warnings...)
		warnings = append(warnings, a.Warnings...)
	}
	writeNotes(b, warnings)
}

// writeNotes writes notes as an indented list under a "Notes" heading;
// nothing when there are none.
func writeNotes(b *strings.Builder, notes []string) {
	if len(notes) == 0 {
		return
	}
	b.WriteString("  Notes\n")
	for _, n := range notes {
		fmt.Fprintf(b, "    - %s\n", n)
	}
}

func okWord(pass bool) string {
	if pass {
		return "ok"
	}
	return "CHECK"
}

func writeQualityText(b *strings.Builder, q water.Quality) {
	b.WriteString("  Data quality\n")
	tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', 0)
	balance := "n/a"
	if !math.IsNaN(q.BalancePercent) {
		balance = fmt.Sprintf("%+.2f %%", q.BalancePercent)
	}
	fmt.Fprintf(tw, "    ion balance\tcations %.3g meq/L, anions %.3g meq/L: %s\t%s\t%s\n",
		q.Cations, q.Anions, balance, q.BalanceLimit, okWord(q.BalanceAcceptable))
	tds := fmt.Sprintf("calculated %.0f mg/L", q.TDSCalculated)
	tdsVerdict := "not measured"
	if !math.IsNaN(q.TDSMeasured) {
		tds += fmt.Sprintf(", measured %.0f mg/L (ratio %.2f)", q.TDSMeasured, q.TDSRatio)
		tdsVerdict = checkVerdict(q, "tds-ratio")
	}
	fmt.Fprintf(tw, "    dissolved solids\t%s\t1.0–1.2\t%s\n", tds, tdsVerdict)
	ec := fmt.Sprintf("calculated %.0f µS/cm", q.ConductivityCalculated)
	ecVerdict := "not measured"
	if !math.IsNaN(q.ConductivityMeasured) {
		ec += fmt.Sprintf(", measured %.0f µS/cm (ratio %.2f)", q.ConductivityMeasured, q.ConductivityRatio)
		ecVerdict = checkVerdict(q, "ec-ratio")
	}
	if q.Seawater {
		ecVerdict = "seawater-like: see salinity"
	}
	fmt.Fprintf(tw, "    conductivity\t%s\t0.9–1.1\t%s\n", ec, ecVerdict)
	if q.Seawater {
		sal := fmt.Sprintf("from composition %.2f", q.SalinityFromComposition)
		salVerdict := "EC not measured"
		if !math.IsNaN(q.SalinityFromEC) {
			sal += fmt.Sprintf(", from EC %.2f (PSS-78)", q.SalinityFromEC)
			salVerdict = checkVerdict(q, "salinity-ec")
		}
		fmt.Fprintf(tw, "    practical salinity\t%s\t%s\t%s\n", sal, water.SalinityCriterion().Limit, salVerdict)
	}
	is := fmt.Sprintf("composition %.3g, from TDS %.3g", q.IonicStrength, q.IonicStrengthFromTDS)
	if !math.IsNaN(q.IonicStrengthFromConductivity) {
		is += fmt.Sprintf(", from EC %.3g", q.IonicStrengthFromConductivity)
	}
	fmt.Fprintf(tw, "    ionic strength\t%s mol/kg\t\t\n", is)
	tw.Flush()
	for _, f := range q.Flags {
		fmt.Fprintf(b, "    ! %s\n", f)
	}
}

func checkVerdict(q water.Quality, name string) string {
	for _, c := range q.Checks {
		if c.Criterion.Name == name && c.Done {
			return okWord(c.Pass)
		}
	}
	return ""
}

func writeResultText(b *strings.Builder, r *saturation.Result) {
	fmt.Fprintf(b, "  Equilibrium at %.1f °C: pH %.2f, ionic strength %.3g mol/kg (%s activity model)",
		r.Temperature, r.PH, r.IonicStrength, r.Activity)
	if !math.IsNaN(r.LogPCO2) {
		fmt.Fprintf(b, ", log pCO2 %.2f", r.LogPCO2)
	}
	b.WriteString("\n")
	if len(r.Minerals) == 0 {
		b.WriteString("  No mineral of the table has all its components in this water.\n")
		return
	}
	ms := slices.Clone(r.Minerals)
	slices.SortStableFunc(ms, func(x, y saturation.MineralResult) int { return cmp.Compare(y.SI, x.SI) })
	nameW, formW := len("mineral"), len("formula")
	for _, m := range ms {
		nameW = max(nameW, len([]rune(mineralTitle(m.Name))))
		formW = max(formW, len([]rune(m.Formula)))
	}
	fmt.Fprintf(b, "    %-*s  %-*s  %7s  %s\n", nameW, "Mineral", formW, "Formula", "SI", "Band")
	for _, m := range ms {
		fmt.Fprintf(b, "    %-*s  %-*s  %7s  %s\n", nameW, mineralTitle(m.Name), formW, m.Formula, siText(m.SI), saturation.RiskBand(m.Name, m.SI))
	}
}

// writeIndicesText writes the classic indices and the scale that could
// form, in plain words.
func writeIndicesText(b *strings.Builder, a saturation.Assessment) {
	if ix := a.Indices; ix != nil {
		var parts []string
		add := func(name string, v float64, format string) {
			if !math.IsNaN(v) {
				parts = append(parts, fmt.Sprintf("%s "+format, name, v))
			}
		}
		add("LSI", ix.LSI, "%+.2f")
		add("LSI simplified form", ix.LSISimplified, "%+.2f")
		add("RSI", ix.RSI, "%.2f")
		add("PSI", ix.PSI, "%.2f")
		add("Stiff–Davis", ix.StiffDavis, "%+.2f")
		add("Larson–Skold", ix.LarsonSkold, "%.2f")
		if ix.LarsonSkoldUndefined {
			parts = append(parts, "Larson–Skold "+notDefined)
		}
		if len(parts) > 0 {
			fmt.Fprintf(b, "  Classic indices: %s\n", strings.Join(parts, ", "))
		}
		if !math.IsNaN(ix.CCPP) {
			verb := "would precipitate"
			if ix.CCPP < 0 {
				verb = "would dissolve"
			}
			fmt.Fprintf(b, "  CCPP %.1f mg/L as CaCO3: calcium carbonate that %s to reach equilibrium (Standard Methods 2330 sign)\n",
				math.Abs(ix.CCPP), verb)
		}
	}
	var ps []saturation.Precipitation
	for _, p := range a.Precipitation {
		if p.Alone > 0.005 || p.Together > 0.005 {
			ps = append(ps, p)
		}
	}
	if len(ps) == 0 {
		return
	}
	b.WriteString("  Scale that could form to reach equilibrium (closed system, mg of mineral per litre):\n")
	w := len("mineral")
	for _, p := range ps {
		w = max(w, len(mineralTitle(p.Mineral)))
	}
	for _, p := range ps {
		line := fmt.Sprintf("    %-*s  %9s alone  %9s with the others", w, mineralTitle(p.Mineral), mgText(p.Alone), mgText(p.Together))
		if a.Flow > 0 && !math.IsNaN(p.Together) {
			line += fmt.Sprintf("  (%.3g kg/day at %g m³/h)", saturation.KgPerDay(p.Together, a.Flow), a.Flow)
		}
		b.WriteString(line + "\n")
	}
}

func mgText(v float64) string {
	if math.IsNaN(v) {
		return "n/a"
	}
	return strconv.FormatFloat(sig(v, 3), 'f', -1, 64)
}

// wrap breaks text into lines of at most width characters at spaces.
func wrap(text string, width int) string {
	var lines []string
	line := ""
	for _, word := range strings.Fields(text) {
		if line != "" && len([]rune(line))+1+len([]rune(word)) > width {
			lines = append(lines, line)
			line = word
			continue
		}
		if line != "" {
			line += " "
		}
		line += word
	}
	if line != "" {
		lines = append(lines, line)
	}
	return strings.Join(lines, "\n")
}
