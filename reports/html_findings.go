package reports

import (
	"fmt"
	"strings"

	"scalerisk/plan"
	"scalerisk/saturation"
)

// facts are the key figures at the head of a sample's section.
func (b *builder) facts(s *plan.Sample, sw *sweepSet) []fact {
	r := s.Result
	var out []fact
	if m, ok := b.limiting(r); ok {
		c := b.bandChip(m.Band)
		out = append(out, fact{Label: "Limiting mineral at " + num(r.Temperature, 0) + " °C",
			Value: mineralLabel(m.Name) + "  SI " + signed(m.SI, 2), Chip: &c})
	} else {
		out = append(out, fact{Label: "Limiting mineral at " + num(r.Temperature, 0) + " °C", Value: "none supersaturated"})
	}
	if sw.err == nil && len(sw.temp) > 0 {
		last := sw.temp[len(sw.temp)-1]
		if last.Result != nil {
			if m, ok := b.limiting(last.Result); ok {
				c := b.bandChip(m.Band)
				out = append(out, fact{Label: "Heated to " + num(sw.hot, 0) + " °C",
					Value: mineralLabel(m.Name) + "  SI " + signed(m.SI, 2), Chip: &c})
			}
		}
	}
	out = append(out, balanceFact(s))
	out = append(out, fact{Label: "pH · ionic strength",
		Value: num(r.PH, 2) + " · " + sigText(r.IonicStrength, 3) + " mol/kg", Note: "activity coefficients: " + activityWords(r.Activity)})
	return out
}

// balanceFact is the ion balance of a sample and its verdict.
func balanceFact(s *plan.Sample) fact {
	bal := balanceChip(s.Quality)
	verdict := "meets " + s.Quality.BalanceLimit
	if bal.Class == "v-check" {
		verdict = "fails " + s.Quality.BalanceLimit
	}
	if bal.Class == "v-none" {
		verdict = "no ions to balance"
	}
	return fact{Label: "Ion balance", Value: bal.Text, Note: verdict}
}

// findings are the plain-word conclusions of a sample's section, read from
// its results and sweeps.
func (b *builder) findings(s *plan.Sample, sw *sweepSet) []string {
	r := s.Result
	var out []string
	if m, ok := b.limiting(r); ok {
		band := b.bandText(m.Band)
		fit := ""
		if note := saturation.FitNote(nil, m.Name, r.Temperature); note != "" {
			fit = " — " + note // never a headline without its caveat
		}
		out = append(out, fmt.Sprintf("At %s °C the limiting mineral is %s (%s), SI %s: %s%s.",
			num(r.Temperature, 1), mineralLabel(m.Name), m.Formula, signed(m.SI, 2), band, fit))
	} else {
		out = append(out, fmt.Sprintf("At %s °C no scale-forming mineral is supersaturated.", num(r.Temperature, 1)))
	}
	if sw.err != nil {
		return append(out, b.qualityFinding(s)...)
	}
	// Temperature: minerals that pass their limit on the way to the skin
	// temperature, with the first temperature computed where they do.
	out = append(out, b.passFindings(s, "temperature", s.Temperature, func(x float64) string { return num(x, 0) + " °C" },
		fmt.Sprintf("between %s and %s °C", num(sw.bulk, 0), num(sw.hot, 0)))...)
	if c := s.CyclesAnswer; c != nil {
		out = append(out, cyclesFinding(c, b.o.Plan.Rule()))
	} else if m := s.MarginAnswer; m != nil {
		out = append(out, marginFinding(m, b.o.Plan.Rule()))
	} else {
		out = append(out, b.passFindings(s, "cycles", s.Cycles, func(x float64) string { return num(x, 1) + " cycles" },
			fmt.Sprintf("when concentrated up to %s cycles", num(sw.maxCycles, 0)))...)
	}
	out = append(out, b.doseFinding(s, sw)...)
	return append(out, b.qualityFinding(s)...)
}

// passFindings says which minerals go past their limit along a sweep of
// the plan and from which point, or that none does; nothing when no point
// of the sweep was computed.
func (b *builder) passFindings(s *plan.Sample, sweep string, sw plan.Sweep, at func(float64) string, span string) []string {
	if sw.Computed() == 0 {
		return nil // nothing was computed to say it of
	}
	past := "beyond inhibitor reach"
	if !b.inhibitorWords() {
		past = "past its limit"
	}
	var parts []string
	formulas := map[string]bool{}
	for _, p := range s.Passes {
		if p.Sweep != sweep {
			continue
		}
		if e, ok := saturation.DefaultTable().Entry(p.Mineral); ok {
			if formulas[e.Formula] {
				continue // a polymorph of a mineral named already (aragonite after calcite)
			}
			formulas[e.Formula] = true
		}
		if p.AtStart {
			parts = append(parts, mineralLabel(p.Mineral)+" (already at the start)")
		} else {
			parts = append(parts, fmt.Sprintf("%s (from %s)", mineralLabel(p.Mineral), at(p.X)))
		}
	}
	if len(parts) == 0 {
		return []string{fmt.Sprintf("No mineral goes %s %s.", past, span)}
	}
	return []string{fmt.Sprintf("%s %s: %s.", upperFirst(past), span, strings.Join(parts, ", "))}
}

// upperFirst capitalises the first letter of s.
func upperFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

func cyclesFinding(c *saturation.CyclesResult, rule saturation.CarbonateRule) string {
	where := profileWords(c.Profile.Name) + ", at " + ruleWords(rule)
	switch {
	case len(c.Exceeded) > 0:
		return fmt.Sprintf("Used as a cooling-tower makeup, this water would already be past the limit for %s: it needs "+
			"treatment before it is concentrated. (Judged under %s, at %s.)", joinWords(exceededWords(c)),
			profileWords(c.Profile.Name), ruleWords(rule))
	case c.Limiting == "":
		return fmt.Sprintf("Used as a cooling-tower makeup: no limit is reached up to %s cycles of concentration. "+
			"(Judged under %s.)", num(c.MaxCycles, 1), where)
	}
	at := ""
	if c.Judged.SkinGoverns() {
		at = fmt.Sprintf(" at the %s °C tube wall (at the water's own temperature it would be %s)", num(c.Judged.Skin, 0), num(c.Judged.AtBulk, 2))
	}
	if note := saturation.FitNote(nil, c.Limiting, c.Judged.Governing); note != "" {
		at += " — " + note
	}
	return fmt.Sprintf("Used as a cooling-tower makeup: at most %s cycles of concentration, set by %s%s. (Judged under %s.)",
		num(c.MaxCycles, 2), quantityLabel(c.Limiting), at, where)
}

// marginFinding says how far a recirculating water is from its limits,
// the question its role asks (not how many cycles it could run as a
// makeup).
func marginFinding(m *saturation.MarginResult, rule saturation.CarbonateRule) string {
	f := m.Further
	where := profileWords(m.Profile.Name) + ", at " + ruleWords(rule)
	at := ""
	if f.Judged.SkinGoverns() {
		at = fmt.Sprintf(" at the %s °C tube wall", num(f.Judged.Skin, 0))
	}
	switch {
	case len(f.Exceeded) > 0:
		fit := ""
		for _, q := range f.Exceeded {
			if note := saturation.FitNote(nil, q, f.Judged.Governing); note != "" {
				fit += " — " + note
			}
		}
		return fmt.Sprintf("As a recirculating water it is already past the limit for %s%s%s: there is no margin. (Judged under %s.)",
			joinWords(exceededWords(f)), at, fit, where)
	case f.Limiting == "":
		return fmt.Sprintf("As a recirculating water it is within every limit, even concentrated %s times further. (Judged under %s.)",
			num(f.MaxCycles, 1), where)
	}
	fit := ""
	if note := saturation.FitNote(nil, f.Limiting, f.Judged.Governing); note != "" {
		fit = " — " + note
	}
	return fmt.Sprintf("As a recirculating water it can be concentrated %s times further before %s reaches its limit%s%s. (Judged under %s.)",
		num(f.MaxCycles, 2), quantityLabel(f.Limiting), at, fit, where)
}

// cyclesCaption describes the cycles chart.
func (b *builder) cyclesCaption(s *plan.Sample, sw *sweepSet, forced string) string {
	rule := ruleWords(b.o.Plan.Rule())
	text := fmt.Sprintf("Every dissolved constituent concentrated 1 to %s times%s; carbonate system: %s.",
		num(sw.maxCycles, 1), forced, rule)
	if c := s.CyclesAnswer; sw.fromSearch && c != nil {
		if len(c.Exceeded) > 0 {
			text += fmt.Sprintf(" Already at 1 cycle the water is past the limit for %s.", joinWords(exceededWords(c)))
		} else if c.Limiting == "" {
			text += fmt.Sprintf(" No limit of %s is reached in this range.", profileWords(c.Profile.Name))
		}
	}
	return text
}

// doseFinding reads the dose sweep: pH from start to end, and the
// minerals whose SI rises with the dose.
func (b *builder) doseFinding(s *plan.Sample, sw *sweepSet) []string {
	var out []string
	// The answer first: the dose to the target, when it was asked for.
	if d := s.DoseAnswer; d != nil {
		switch {
		case d.Reached && d.Dose > 0:
			out = append(out, fmt.Sprintf("To bring the water to %s takes %s mg/L of %s %% %s: pH %s → %s.",
				targetLabel(d.Target), num(d.Dose, 1), num(d.Strength, 0), d.Reagent.Label,
				num(d.Before.Result.PH, 2), num(d.After.Result.PH, 2)))
		case d.Reached || d.Beyond:
			out = append(out, noDoseSentence(d))
		case len(d.Warnings) > 0:
			out = append(out, "Dose to "+targetLabel(d.Target)+": "+sentence(clientText(d.Warnings[0])))
		default:
			out = append(out, fmt.Sprintf("No dose of %s reaches %s.", d.Reagent.Label, targetLabel(d.Target)))
		}
	}
	// Then what the dose chart shows across its range, said as a range.
	var first, last *saturation.Result
	var lastX float64
	for _, p := range sw.dose {
		if p.Result == nil {
			continue
		}
		if first == nil {
			first = p.Result
		}
		last, lastX = p.Result, p.X
	}
	if first == nil || last == first {
		return out
	}
	var falls, rises []string
	for _, m := range sw.minerals {
		a, ok1 := first.SI(m.Name)
		z, ok2 := last.SI(m.Name)
		if !ok1 || !ok2 {
			continue
		}
		change := fmt.Sprintf("%s %s → %s", mineralLabel(m.Name), signed(a, 2), signed(z, 2))
		switch {
		case z < a-0.005:
			falls = append(falls, change)
		case z > a+0.005:
			rises = append(rises, change)
		}
	}
	line := fmt.Sprintf("Across the dose chart (0 to %s mg/L of %s; the end of the chart, not a recommendation) pH goes from %s to %s",
		num(lastX, 0), b.reagent.Label, num(first.PH, 2), num(last.PH, 2))
	if len(falls) > 0 {
		line += "; SI falls for " + strings.Join(falls, ", ")
	}
	if len(rises) > 0 {
		line += "; SI rises for " + strings.Join(rises, ", ") + " (a side effect to watch)"
	}
	return append(out, line+".")
}

func (b *builder) qualityFinding(s *plan.Sample) []string {
	q := s.Quality
	if !finite(q.BalancePercent) {
		return []string{"The ion balance cannot be checked: no ions were reported."}
	}
	if q.BalanceAcceptable {
		return []string{fmt.Sprintf("The ion balance (%s %%) meets the usual criterion: %s.", signed(q.BalancePercent, 2), q.BalanceLimit)}
	}
	return []string{fmt.Sprintf("The ion balance (%s %%) fails the usual criterion, %s: an analyte may be missing or in "+
		"error, and every index above is less certain.", signed(q.BalancePercent, 2), q.BalanceLimit)}
}

// noDoseSentence says that a water needs no dose to reach its target.
func noDoseSentence(d *saturation.DoseResult) string {
	if d.Beyond {
		return fmt.Sprintf("No %s is needed: the water is already at or beyond %s (%s would only move it further away).",
			d.Reagent.Label, targetLabel(d.Target), d.Reagent.Label)
	}
	return fmt.Sprintf("No %s is needed: the water is already at %s.", d.Reagent.Label, targetLabel(d.Target))
}
