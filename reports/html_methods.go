package reports

import (
	"cmp"
	"fmt"
	"slices"
	"strings"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

func detectionWords(p water.DetectionPolicy) string {
	switch p {
	case water.DetectionZero:
		return "Results below the detection limit were taken as zero (--below-detection zero)."
	case water.DetectionLimit:
		return "Results below the detection limit were taken at the limit itself (--below-detection limit)."
	}
	return "Results below the detection limit were taken as half the limit (--below-detection half, the default)."
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
				" (--thermo); their sources are in the table below."
		}
	}
	mv.Carbonate = "The measured pH at its measurement temperature and the alkalinity fix the inorganic carbon. " +
		"At any other temperature, concentration or dose the system is closed: carbon and alkalinity are conserved " +
		"(changed only by what a reagent adds) and pH is recomputed; the highest-cycles search follows its own " +
		"carbonate rule (--carbonate, natural by default: pH = 1.465·log10(TA) + 4.54 with alkalinity conserved)."
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
		mv.Criteria = append(mv.Criteria, kv{what, c.Limit})
		mv.CriteriaSource = c.Source
	}
	mv.Sources, mv.Reach = b.methodsSources(table)
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
		fmt.Sprintf("Temperature: %d points from the sample temperature to %s °C (the skin temperature; --skin-temperature).",
			plan.TemperaturePoints, num(o.Plan.Skin(), 0)),
		fmt.Sprintf("Cycles of concentration: %d points from 1 to %s (--max-cycles); every constituent concentrated alike.",
			plan.CyclePoints, num(o.Plan.Cycles(), 1)),
		fmt.Sprintf("Dose: %d points of %s at %s %% (%s), with the stoichiometry of the reagent table; "+
			"the range ends where 80 %% of the alkalinity would be neutralised unless --max-dose sets it.",
			plan.DosePoints, b.reagent.Label, num(strength, 0), b.reagent.Source),
		fmt.Sprintf("Map: %d × %d grid of temperature and cycles; the limiting mineral is the scale former in the "+
			"highest risk band, and within a band the one furthest past its inhibitor limit (or with the highest SI).",
			plan.WindowSide, plan.WindowSide),
		"Minerals charted: scale formers within 1 SI unit of saturation somewhere on the charts, one per formula, " +
			"at most six, by risk.",
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
		src := e.Source
		if e.File != "" && e.File != "data/thermo.csv" {
			src += " (from " + e.File + ")"
		}
		sources = append(sources, sourceRow{Name: mineralLabel(e.Name), Formula: e.Formula,
			LogK: num(e.LogK(25), 3), Range: num(e.TMin, 0) + "–" + num(e.TMax, 0) + " °C", Source: src})
		if r, ok := saturation.InhibitorReach(n); ok {
			limit := signed(r.MaxSI, 2)
			if r.Slow {
				limit = "slow to form"
			} else if !finite(r.MaxSI) {
				limit = "—"
			}
			reach = append(reach, reachRow{Name: mineralLabel(n), Limit: limit, Source: r.Source})
		}
	}
	return sources, reach
}

// cautions are the report's closing cautions (practice: advisory results,
// kinetics, acid and caustic handling, discharge, Legionella).
func (b *builder) cautions() []string {
	out := []string{
		"Saturation indices are guides, not absolutes (Standard Methods 2330). A positive index does not " +
			"guarantee scale: kinetics and inhibitors decide whether and how fast it forms, and some minerals " +
			"(calcium phosphates among them) can stay in solution far above saturation. A negative index does " +
			"not guarantee a clean surface. Confirm predictions with coupons, deposit analysis and inspection.",
		"The indices do not predict lead or copper release, corrosion rates or biological fouling.",
		"Results rest on the analysis as given. pH must be measured on site at a known temperature; a poor " +
			"ion balance makes every index less certain.",
		"Acid feed: an overfeed gives very low pH and corrosion, and low-pH blowdown may breach sewer limits. " +
			"Always add acid to water, slowly; diluting concentrated sulfuric acid releases much heat. Wear " +
			"goggles and a face shield, acid-resistant gloves and apron; keep eyewash and spill kits where acid " +
			"is stored. Never let acid meet hypochlorite (bleach) feeds: chlorine gas forms. Read the SDS.",
		"Sulfuric acid adds sulfate: re-check gypsum, anhydrite, barite and celestite after any acid dose " +
			"(the dose chart shows the change).",
		"Caustic (sodium hydroxide) causes severe burns and heats when water is added to it; flush skin or " +
			"eyes for at least 15 minutes and wear close-fitting goggles, rubber gloves and apron.",
		"Cooling towers carry a Legionella risk: operate them under a water-management plan as local rules " +
			"require (for example ASHRAE 188). This report does not address microbiological control.",
		"Discharge of blowdown or concentrate is governed by permits and local codes.",
		"Water treatment, acid and caustic handling and discharge are governed by local codes, permits, the " +
			"manufacturers' data (SDS and product literature) and licensed practice. Consult qualified " +
			"water-treatment professionals before acting on any result.",
	}
	if c := strings.TrimSpace(b.reagent.Caution); c != "" {
		out = append(out, "For "+b.reagent.Label+" ("+b.reagent.Formula+"), the reagent table adds: "+sentence(c))
	}
	return out
}
