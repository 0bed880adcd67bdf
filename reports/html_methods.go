package reports

import (
	"cmp"
	"fmt"
	"regexp"
	"slices"
	"strings"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

func detectionWords(p water.DetectionPolicy) string {
	switch p {
	case water.DetectionZero:
		return "Results below the detection limit were taken as zero."
	case water.DetectionLimit:
		return "Results below the detection limit were taken at the limit itself."
	}
	return "Results below the detection limit were taken as half the limit (the usual convention)."
}

// methods describes how the results were computed and on which data.
func (b *builder) methods() methodsView {
	o := b.o
	mv := methodsView{}
	var models []string
	for m := range b.models {
		models = append(models, m)
	}
	slices.Sort(models)
	if o.Plan.Speciation.Activity == saturation.Auto {
		mv.Activity = "The Pitzer specific-interaction model (Harvie, Møller & Weare 1984 parameters) for every water, fresh to saturated brine; minor components outside its parameter set keep ion-association coefficients. " +
			"Used in this report: " + strings.Join(models, ", ") + "."
	} else {
		mv.Activity = "As asked: " + o.Plan.Speciation.Activity.String() + "."
	}
	mv.Thermo = "One self-consistent ion-association set: Plummer & Busenberg (1982) for the carbonate system, " +
		"calcite, aragonite and vaterite and the CaHCO₃⁺ and CaCO₃⁰ pairs; the Nordstrom et al. (1990) compilation " +
		"for most other ion pairs and minerals; a few additions named on their rows. Equilibrium constants vary " +
		"with temperature by their published functions; a constant used outside its range carries a warning."
	table := saturation.DefaultTable()
	if o.Plan.Speciation.Model != nil {
		table = o.Plan.Speciation.Model.Table()
		var files []string
		for _, e := range table.Entries() {
			if e.File != "" && e.File != "data/thermo.csv" && !slices.Contains(files, e.File) {
				files = append(files, e.File)
			}
		}
		if len(files) > 0 {
			mv.UserTable = "Rows added or replaced from " + strings.Join(files, ", ") +
				" at the user's request; their sources are in the table below."
		}
	}
	mv.Carbonate = "The measured pH at its measurement temperature and the alkalinity fix the inorganic carbon. " +
		"At any other temperature, concentration or dose the system is closed: carbon and alkalinity are conserved " +
		"(changed only by what a reagent adds) and pH is recomputed. The cycles figures follow the carbonate rule " +
		"chosen for the report: " + ruleWords(b.o.Plan.Rule()) + naturalRelation(b.o.Plan.Rule()) + "."
	if o.Plan.Speciation.AtTemperature {
		mv.Carbonate += fmt.Sprintf(" Every sample was evaluated at %s °C, as asked.", num(o.Plan.Speciation.Temperature, 1))
	}
	mv.Detection = detectionWords(o.Detection)
	mv.Charts = b.methodsCharts()
	for _, c := range water.QualityCriteria() {
		what := c.Check
		if c.Applies != "" {
			what += " (" + c.Applies + ")"
		}
		mv.Criteria = append(mv.Criteria, kv{Key: what, Value: c.Limit})
		mv.CriteriaSource = provenanceWords(c.Source)
	}
	mv.Sources, mv.Reach = b.methodsSources(table)
	mv.ReachNote = "The limits of " + profileWords(b.profile.Name) + " are rules of thumb of the trade; the limits " +
		"of the product actually used, and the history of the system, govern."
	return mv
}

// methodsCharts says how the charts were computed: their points and ranges.
func (b *builder) methodsCharts() []string {
	o := b.o
	strength := o.Plan.Strength
	if strength == 0 {
		strength = b.reagent.Strength
	}
	return []string{
		fmt.Sprintf("Temperature: %d points from the sample temperature to %s °C, the tube-wall (skin) temperature "+
			"chosen for the report.", plan.TemperaturePoints, num(o.Plan.Skin(), 0)),
		fmt.Sprintf("Cycles of concentration: %d points from 1 to %s; every dissolved constituent concentrated alike.",
			plan.CyclePoints, num(o.Plan.Cycles(), 1)),
		fmt.Sprintf("Dose: %d points of %s at %s %% (%s), with the stoichiometry of the reagent table; unless a "+
			"range was set, the range ends where 80 %% of the alkalinity would be neutralised.",
			plan.DosePoints, b.reagent.Label, num(strength, 0), provenanceWords(b.reagent.Source)),
		fmt.Sprintf("Operating window: a %d × %d grid of temperature and cycles; at each point the margin to the "+
			"nearest saturation-index limit (limit minus SI) of the scale formers, and for each mineral the curve "+
			"where its SI reaches its limit, found by linear interpolation between grid points.",
			plan.WindowSide, plan.WindowSide),
		"Minerals charted: calcite, gypsum and amorphous silica, and barite, celestite, fluorite and tricalcium " +
			"phosphate where the laboratory reported their ions, in that order for every sample; then any other " +
			"mineral that passes its limit in the sample or on its charts.",
	}
}

// methodsSources lists the minerals of the report in table order with the
// source of their constants and of their inhibitor limits.
func (b *builder) methodsSources(table *saturation.Table) (sources []sourceRow, reach []reachRow) {
	var names []string
	for n := range b.shown {
		names = append(names, n)
	}
	// Table order, so that the list reads like the thermodynamic table.
	index := map[string]int{}
	for i, e := range table.Minerals() {
		index[e.Name] = i
	}
	slices.SortFunc(names, func(x, y string) int { return cmp.Compare(index[x], index[y]) })
	for _, n := range names {
		e, ok := table.Entry(n)
		if !ok {
			continue
		}
		src := provenanceWords(e.Source)
		if e.File != "" && e.File != "data/thermo.csv" {
			src += " (from " + e.File + ")"
		}
		sources = append(sources, sourceRow{Name: mineralLabel(e.Name), Formula: e.Formula,
			LogK: num(e.LogK(25), 3), Range: num(e.TMin, 0) + "–" + num(e.TMax, 0) + " °C", Source: src})
		if l, ok := b.profile.Lookup("si:" + n); ok && !slices.Contains(slowNames(), n) {
			reach = append(reach, reachRow{Name: mineralLabel(n), Limit: signed(l.Max, 2), Source: provenanceWords(l.Source)})
		} else if r, _ := saturation.InhibitorReach(n); r.Slow {
			reach = append(reach, reachRow{Name: mineralLabel(n), Limit: "slow to form", Source: provenanceWords(r.Source)})
		}
	}
	return sources, reach
}

// cautions are the report's closing cautions (practice: advisory results,
// kinetics, the handling of the reagents the report doses, discharge,
// Legionella), each once.
func (b *builder) cautions() []string {
	out := []string{
		"Saturation indices are guides, not absolutes (Standard Methods 2330). A positive index does not " +
			"guarantee scale: kinetics and inhibitors decide whether and how fast it forms, and some minerals " +
			"(calcium phosphates among them) can stay in solution far above saturation. A negative index does " +
			"not guarantee a clean surface. Confirm predictions with coupons, deposit analysis and inspection.",
		"The indices do not predict lead or copper release, corrosion rates or biological fouling.",
		"Results rest on the analysis as given. pH must be measured on site at a known temperature; a poor " +
			"ion balance makes every index less certain.",
	}
	for _, r := range b.reagents() {
		out = append(out, fmt.Sprintf("Handling %s (%s): %s", r.Label, r.Formula, b.reagentCaution(r)))
	}
	return append(out,
		"Cooling towers carry a Legionella risk: operate them under a water-management plan as local rules "+
			"require (for example ASHRAE 188). This report does not address microbiological control.",
		"Discharge of blowdown or concentrate is governed by permits and local codes.",
		"Water treatment, chemical handling and discharge are governed by local codes, permits, the "+
			"manufacturers' data (safety data sheets and product literature) and licensed practice. Consult "+
			"qualified water-treatment professionals before acting on any result.")
}

// reagents are the reagents the report doses: that of the dose chart and
// search, and the acid of an acid-controlled cycles rule.
func (b *builder) reagents() []water.Reagent {
	out := []water.Reagent{b.reagent}
	if r := b.o.Plan.Rule(); r.SetPoint > 0 && r.Reagent.Name != "" && r.Reagent.Name != b.reagent.Name {
		out = append(out, r.Reagent)
	}
	return out
}

// reagentCaution is the handling caution of reagent r, from the reagent
// table (the general dosing caution when the table gives none).
func (b *builder) reagentCaution(r water.Reagent) string {
	if c := strings.TrimSpace(r.Caution); c != "" {
		return sentence(upperFirst(c)) + " Read the safety data sheet."
	}
	return DoseCaution
}

// provenanceTag matches the bracketed provenance tags of the data tables:
// [READ], [READ: abstract], [FROM MEMORY; …], [COMPUTED: …].
var provenanceTag = regexp.MustCompile(`\[(READ|FROM MEMORY|COMPUTED)(?:[:;]\s*([^\[\]]*))?\]`)

// provenanceWords rewrites the provenance tags of a source in words for a
// reader: "[READ]" → "(read in the source)", "[FROM MEMORY]" → "(recalled,
// not re-read)", "[COMPUTED: x]" → "(computed: x)"; raw keys such as
// tricalcium_phosphate become mineral names.
func provenanceWords(src string) string {
	out, prev := src, ""
	for out != prev { // innermost tags first: a tag may hold another
		prev = out
		out = provenanceTag.ReplaceAllStringFunc(out, tagWords)
	}
	return clientText(out)
}

// tagWords words one provenance tag.
func tagWords(tag string) string {
	m := provenanceTag.FindStringSubmatch(tag)
	words := map[string]string{"READ": "read in the source", "FROM MEMORY": "recalled, not re-read",
		"COMPUTED": "computed"}[m[1]]
	if m[2] != "" {
		sep := "; "
		if m[1] == "COMPUTED" {
			sep = ": "
		}
		words += sep + m[2]
	}
	return "(" + words + ")"
}

// slowNames lists the minerals the slow-to-form table names.
func slowNames() []string {
	var out []string
	for _, e := range saturation.DefaultTable().Minerals() {
		if r, _ := saturation.InhibitorReach(e.Name); r.Slow {
			out = append(out, e.Name)
		}
	}
	return out
}

// naturalRelation gives the relation of the natural tower rule, for the
// methods.
func naturalRelation(r saturation.CarbonateRule) string {
	if r.Name != "natural" {
		return ""
	}
	return ", pH = 1.465·log₁₀(alkalinity, mg/L as CaCO₃) + 4.54 with the alkalinity conserved (Puckorius & Brooke 1991)"
}
