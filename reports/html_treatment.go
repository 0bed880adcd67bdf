package reports

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

// treatmentView is the treatment part of a sample's section.
type treatmentView struct {
	Dose         []kv
	NoDose       string // the sentence when no dose is needed
	Effects      []effectRow
	DoseWarnings []string
	Caution      string
	Cycles       []kv
	CycleNotes   []string
	Blends       []blendView
	Notes        []string
}

type indexRow struct{ Name, Value, Reading string }

type effectRow struct {
	Mineral, Before, After string
	Band                   chip
}

type scaleRow struct{ Mineral, SI, Alone, Together, AloneKg, TogetherKg string }

type blendView struct {
	Title    string
	Minerals []mineralRow
	// Verdict says whether the blend holds the limits and at which
	// temperature it is judged stricter; Share how much of this water a
	// blend can take. Empty when the blend was not judged.
	Verdict, Share string
}

// indexRows lays out the classic indices of an assessment.
func indexRows(ix *saturation.Indices) []indexRow {
	if ix == nil {
		return nil
	}
	return []indexRow{
		{"Langelier (LSI, Standard Methods 2330)", signed(ix.LSI, 2), "above 0 CaCO₃ tends to deposit, below 0 to dissolve; pHs " + num(ix.PHs, 2)},
		{"Langelier, simplified form", signed(ix.LSISimplified, 2), "the common A + B − C − D tabulation"},
		{"Ryznar (RSI)", num(ix.RSI, 2), "below about 6 scale-forming, above about 7 corrosive tendency"},
		{"Puckorius (PSI)", num(ix.PSI, 2), "as Ryznar, with the equilibrium pH from the alkalinity"},
		{"Stiff–Davis", signed(ix.StiffDavis, 2), "Langelier's form for waters of high ionic strength"},
		{"Larson–Skold", larsonSkoldText(ix), "(Cl⁻ + SO₄²⁻)/alkalinity in equivalents: corrosivity to mild steel above about 0.8"},
		{"CaCO₃ precipitation potential", num(ix.CCPP, 1) + " mg/L", "positive: CaCO₃ that would precipitate (as CaCO₃)"},
	}
}

// larsonSkoldText is the Larson–Skold index to two decimals, or "not
// defined" below 5 mg/L alkalinity as CaCO3.
func larsonSkoldText(ix *saturation.Indices) string {
	if ix.LarsonSkoldUndefined {
		return notDefined
	}
	return num(ix.LarsonSkold, 2)
}

// scaleRows lays out the precipitation potential of an assessment; the
// kg/day columns are empty when no flow was given.
func scaleRows(ps []saturation.Precipitation, flow float64) []scaleRow {
	var out []scaleRow
	for _, p := range ps {
		row := scaleRow{Mineral: mineralLabel(p.Mineral), SI: signed(p.SI, 2), Alone: sigText(p.Alone, 3),
			Together: sigText(p.Together, 3)}
		if flow > 0 {
			row.AloneKg = sigText(saturation.KgPerDay(p.Alone, flow), 3)
			row.TogetherKg = sigText(saturation.KgPerDay(p.Together, flow), 3)
		}
		out = append(out, row)
	}
	return out
}

// quantityLabel words a limit quantity: "si:gypsum" → "gypsum (SI)",
// "lsi" → "Langelier index", "mg_per_l:SiO2" → "SiO2 (mg/L)".
func quantityLabel(q string) string {
	kind, arg, _ := strings.Cut(q, ":")
	switch kind {
	case "si":
		return mineralLabel(arg) + " (SI)"
	case "lsi":
		return "Langelier index"
	case "mg_per_l":
		return arg + " (mg/L)"
	case "product":
		var parts []string
		for _, f := range strings.Split(arg, "*") {
			parts = append(parts, strings.ReplaceAll(f, "_", " "))
		}
		if arg == "Mg_as_CaCO3*SiO2" {
			return "magnesium silicate (Mg as CaCO₃ × SiO₂)"
		}
		return "the product " + strings.Join(parts, " × ") + " (mg/L)"
	}
	return q
}

// treatment lays out the treatment answers of a sample; nil when it has
// none.
func (b *builder) treatment(s *plan.Sample) *treatmentView {
	tv := &treatmentView{}
	for _, part := range []string{"dose search", "highest-cycles search", "blend", "blend limits"} {
		if err := s.PartErr(part); err != nil {
			tv.Notes = append(tv.Notes, searchFailure(part, err))
		}
	}
	if d := s.DoseAnswer; d != nil {
		b.doseView(tv, s, d)
	}
	if c := s.CyclesAnswer; c != nil {
		b.cyclesView(tv, c)
	}
	for _, bl := range s.Blends {
		tv.Blends = append(tv.Blends, b.blendView(bl))
	}
	if tv.Dose == nil && tv.Cycles == nil && tv.Blends == nil && tv.Notes == nil {
		return nil
	}
	return tv
}

// doseView lays out the dose to the target: the dose, or the sentence that
// none is needed, its effects and its notes.
func (b *builder) doseView(tv *treatmentView, s *plan.Sample, d *saturation.DoseResult) {
	tv.Dose = []kv{
		{"Reagent", d.Reagent.Label + " (" + d.Reagent.Formula + "), product of " + num(d.Strength, 0) + " %", ""},
		{"Target", targetLabel(d.Target), ""},
	}
	switch {
	case d.Reached && d.Dose > 0:
		tv.Dose = append(tv.Dose, kv{"Dose", num(d.Dose, 1), "mg/L of product"})
	case d.Reached || d.Beyond:
		tv.NoDose = noDoseSentence(d)
		tv.Dose = nil
	default:
		tv.Dose = append(tv.Dose, kv{"Dose", "not reached: see the note below", ""})
	}
	if tv.Dose != nil && s.Flow > 0 && d.Reached {
		tv.Dose = append(tv.Dose, kv{"At the flow given", sigText(saturation.KgPerDay(d.Dose, s.Flow), 3), "kg/day of product"})
	}
	if tv.Dose != nil && d.Before.Result != nil && d.After.Result != nil {
		tv.Dose = append(tv.Dose, kv{"pH", num(d.Before.Result.PH, 2) + " → " + num(d.After.Result.PH, 2), ""},
			kv{"Langelier index", signed(d.Before.Indices.LSI, 2) + " → " + signed(d.After.Indices.LSI, 2), ""})
		for _, m := range d.After.Result.Minerals {
			before, ok := d.Before.Result.SI(m.Name)
			if !ok || !finite(m.SI) || !finite(before) || m.SI <= before+0.005 || !b.scaleFormer(m.Name, m.SI) {
				continue
			}
			tv.Effects = append(tv.Effects, effectRow{Mineral: mineralLabel(m.Name), Before: signed(before, 2),
				After: signed(m.SI, 2), Band: b.band(m.Name, m.SI)})
		}
	}
	// The reagent's caution is shown in its own box below.
	for _, w := range d.Warnings {
		// The side effects are in the table above, in the report's bands.
		c := strings.TrimSpace(d.Reagent.Caution)
		if (c == "" || !strings.Contains(w, c)) && !strings.Contains(w, "the dose raises") && tv.NoDose == "" {
			tv.DoseWarnings = append(tv.DoseWarnings, sentence(upperFirst(clientText(w))))
		}
	}
	if tv.Dose != nil {
		tv.Caution = b.reagentCaution(d.Reagent)
	}
}

// cyclesView lays out the highest cycles of concentration.
func (b *builder) cyclesView(tv *treatmentView, c *saturation.CyclesResult) {
	highest, limiting := num(c.MaxCycles, 2), "none within the range searched"
	exceeded := exceededWords(c)
	switch {
	case len(exceeded) > 0:
		highest, limiting = "none: the water is already past a limit", strings.Join(exceeded, ", ")
	case c.Limiting != "":
		limiting = quantityLabel(c.Limiting)
	}
	tv.Cycles = []kv{
		{"Highest cycles of concentration (this water as makeup)", highest, ""},
		{"Limited by", limiting, ""},
		{"Limits used", profileWords(c.Profile.Name), ""},
		{"Carbonate system", ruleWords(b.o.Plan.Rule()), ""},
	}
	for _, l := range c.Profile.Limits {
		if l.Quantity == c.Limiting {
			tv.Cycles = append(tv.Cycles, kv{"Limit", fmt.Sprintf("%s at most %g", quantityLabel(l.Quantity), l.Max), ""},
				kv{"Basis of the limit", provenanceWords(l.Source), ""})
		}
	}
	if len(exceeded) > 0 {
		tv.CycleNotes = append(tv.CycleNotes, "Used as a makeup, this water is already past the limits for "+
			strings.Join(exceeded, ", ")+": it needs treatment before it is concentrated.")
	}
	for _, w := range c.Warnings {
		if len(exceeded) > 0 && strings.Contains(w, "already exceeds") {
			continue // said above in words
		}
		tv.CycleNotes = append(tv.CycleNotes, sentence(upperFirst(clientText(w))))
	}
}

// blendView lays out a blend with its six scale formers most supersaturated.
func (b *builder) blendView(bl plan.Blend) blendView {
	bv := blendView{Title: fmt.Sprintf("%s %% of this water with %s %% of %s", num(100*bl.Fraction, 0),
		num(100*(1-bl.Fraction), 0), bl.Partner)}
	if bl.Result != nil {
		ms := slices.Clone(bl.Result.Minerals)
		slices.SortStableFunc(ms, func(x, y saturation.MineralResult) int { return cmp.Compare(y.SI, x.SI) })
		for _, m := range ms {
			if !finite(m.SI) || !b.scaleFormer(m.Name, m.SI) || len(bv.Minerals) >= 6 {
				continue
			}
			bv.Minerals = append(bv.Minerals, mineralRow{Name: mineralLabel(m.Name), Formula: m.Formula,
				SI: signed(m.SI, 2), Band: b.band(m.Name, m.SI)})
		}
	}
	if j := bl.Judged; j != nil {
		bv.Verdict, bv.Share = blendVerdict(j), blendShare(j, bl.Partner)
	}
	return bv
}

// blendVerdict says in words whether a blend holds every limit of its
// profile, judged at its own temperature and at the tube wall, and which
// of the two is the stricter.
func blendVerdict(j *saturation.BlendResult) string {
	p := j.Point
	where := fmt.Sprintf("at the water's own temperature (%s °C)", num(p.Result.Temperature, 0))
	if p.Judgement().SkinGoverns() {
		where = fmt.Sprintf("at the %s °C tube wall", num(p.Skin.Temperature, 0))
	}
	judged := "Judged under " + profileWords(j.Profile.Name)
	if p.Skin != nil {
		judged += fmt.Sprintf(", at the water's own temperature and at the %s °C tube wall", num(p.Skin.Temperature, 0))
	}
	if note := saturation.FitNote(nil, p.Limiting, p.Governing); note != "" && !p.Within() {
		where += " — " + note
	}
	switch {
	case math.IsInf(p.Excess, -1):
		return judged + ": none of the limits applies to this blend."
	case p.Within():
		return judged + ": this blend stays within every limit."
	}
	return fmt.Sprintf("%s: this blend is past the limit for %s %s.", judged, quantityLabel(p.Limiting), where)
}

// blendShare says how much of this water (the first of the blend) a blend
// with partner can take, and which temperature sets it.
func blendShare(j *saturation.BlendResult, partner string) string {
	s := j.Share
	switch {
	case math.IsNaN(s.Fraction):
		return fmt.Sprintf("Neither this water nor %s alone stays within the limits, so no safe share of the two was sought.", partner)
	case s.Limiting == "":
		return fmt.Sprintf("Every share of this water and %s stays within the limits.", partner)
	}
	at := ""
	if s.Judged.SkinGoverns() {
		at = fmt.Sprintf(" at the %s °C tube wall (judged at the water's own temperature alone it would be %s %%)",
			num(s.Judged.Skin, 0), num(100*s.Judged.AtBulk, 0))
	}
	if note := saturation.FitNote(nil, s.Limiting, s.Judged.Governing); note != "" {
		at += " — " + note
	}
	if s.AtLeast {
		return fmt.Sprintf("The blend needs at least %s %% of this water: with less, %s passes its limit%s.",
			num(100*s.Fraction, 0), quantityLabel(s.Limiting), at)
	}
	return fmt.Sprintf("The blend can take at most %s %% of this water: with more, %s passes its limit%s.",
		num(100*s.Fraction, 0), quantityLabel(s.Limiting), at)
}

// searchFailure words a treatment search that could not be computed.
func searchFailure(part string, err error) string {
	var pe plan.Error
	if errors.As(err, &pe) {
		err = pe.Err
	}
	switch part {
	case "dose search":
		return "The dose to the target could not be computed: " + sentence(err.Error())
	case "highest-cycles search":
		return "The highest cycles of concentration could not be computed: " + sentence(err.Error())
	case "blend limits":
		return "The blend could not be judged against the limits: " + sentence(err.Error())
	}
	return "The blend could not be computed: " + sentence(err.Error())
}

// sentence returns s with a full stop at the end.
func sentence(s string) string {
	s = strings.TrimSpace(s)
	if s == "" || strings.HasSuffix(s, ".") {
		return s
	}
	return s + "."
}

// targetLabel words a dose target: "pH 7", "LSI +0.5", "SI of calcite +0.8".
func targetLabel(t saturation.Target) string {
	switch t.Kind {
	case "ph":
		return "pH " + strings.TrimSuffix(strings.TrimRight(fmt.Sprintf("%.2f", t.Value), "0"), ".")
	case "si":
		return "SI of " + mineralLabel(t.Mineral) + " " + signed(t.Value, 2)
	case "":
		return "—"
	}
	return strings.ToUpper(t.Kind) + " " + signed(t.Value, 2)
}

// reagentLabel words a reagent with its strength.
func reagentLabel(r water.Reagent, strength float64) string {
	if strength == 0 {
		strength = r.Strength
	}
	return fmt.Sprintf("%s %% %s (%s)", num(strength, 0), r.Label, r.Formula)
}
