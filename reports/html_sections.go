package reports

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

// sampleWhere is the place of a sample in its file ("lab.csv, line 3").
func sampleWhere(s *plan.Sample) string {
	if s.Line > 0 {
		return fmt.Sprintf("%s, line %d", s.File, s.Line)
	}
	return s.File
}

// sampleError is why a sample was not computed.
func sampleError(s *plan.Sample) string {
	if s.Err != nil {
		return s.Err.Error()
	}
	return "not computed"
}

// sectionHead starts the section of a sample: its number, anchor, name,
// and where it comes from.
func sectionHead(index int, s *plan.Sample) sampleView {
	sv := sampleView{Anchor: fmt.Sprintf("sample-%d", index+1), Name: s.Name, Date: s.Input.Date}
	var where []string
	if w := sampleWhere(s); w != "" {
		where = append(where, w)
	}
	if s.Input.Date != "" {
		where = append(where, "sampled "+s.Input.Date)
	}
	sv.Where = strings.Join(where, " · ")
	return sv
}

// sectionTail adds the analysis as entered and as used, the data quality
// and the warnings of a sample to its section; r is nil when the
// equilibrium was not computed.
func (b *builder) sectionTail(sv *sampleView, s *plan.Sample, r *saturation.Result) {
	sv.Entered, sv.Components = entered(s.Input, r)
	sv.BelowDetection = s.Input.BelowDetection
	if len(sv.BelowDetection) > 0 {
		sv.DetectionNote = detectionWords(b.o.Detection)
	}
	sv.Quality, sv.QualitySums, sv.QualityFlags = qualityRows(s.Quality, r)
	sv.LabChecks, sv.LabReported = labCheckLines(s.Quality, s.Input), labReported(s.Input.Other)
	sv.Warnings = append(sv.Warnings, s.Input.Warnings...)
	if r != nil {
		sv.Warnings = append(sv.Warnings, r.Warnings...)
	}
	sv.Warnings = append(sv.Warnings, s.Warnings...)
	for i, w := range sv.Warnings {
		sv.Warnings[i] = sentence(upperFirst(clientText(w)))
	}
}

// failedSection builds the section of a sample whose equilibrium could not
// be computed: the error, the ion balance, the composition chart, the
// analysis as entered and as used, and the data quality, which may show
// why.
func (b *builder) failedSection(index int, s *plan.Sample) sampleView {
	sv := sectionHead(index, s)
	sv.SpeciationError = sampleError(s)
	sv.SpeciationErrorDetail = "No saturation index, chart of the saturation state or treatment answer is " +
		"given for this sample. The analysis and its data quality below may show why: a poor ion balance, " +
		"a missing analyte or a value in the wrong unit are common causes."
	sv.Facts = []fact{{Label: "Equilibrium", Value: "not computed"}, balanceFact(s)}
	sv.Findings = b.qualityFinding(s)
	if cv, ok := b.compositionView(fmt.Sprintf("s%d-composition", index+1), s); ok {
		sv.Charts = append(sv.Charts, cv)
	}
	b.sectionTail(&sv, s, nil)
	return sv
}

// section builds the full section of one computed sample. A chart that
// cannot be drawn is left out with a note; it never fails the section.
func (b *builder) section(index int, s *plan.Sample) sampleView {
	r := s.Result
	sv := sectionHead(index, s)

	sv.Equilibrium = []kv{
		{"Evaluated at", num(r.Temperature, 1), "°C"},
		{"pH at equilibrium", num(r.PH, 2), ""},
		{"Ionic strength", sigText(r.IonicStrength, 3), "mol/kg"},
		{"Activity coefficients", activityWords(r.Activity), ""},
		{"Total alkalinity", sigText(1000*r.Alkalinity, 4), "meq/kg"},
		{"Inorganic carbon", sigText(1000*r.Carbon, 4), "mmol/kg"},
	}
	if finite(r.LogPCO2) {
		sv.Equilibrium = append(sv.Equilibrium, kv{"log pCO₂", num(r.LogPCO2, 2), "log atm"})
	}
	sv.Equilibrium = append(sv.Equilibrium, kv{"Charge balance of the speciation", num(r.ChargeBalance, 2), "%"})

	sv.Minerals, sv.MineralsOmitted = b.mineralRows(s)
	sv.OmittedNote = fmt.Sprintf("The other %s of the thermodynamic table %s undersaturated or slow to form; "+
		"all are listed in the methods.", Plural(sv.MineralsOmitted, "mineral", "minerals"), isAre(sv.MineralsOmitted))

	sw := b.sweeps(s)
	sv.Facts = b.facts(s, sw)
	sv.Findings = b.findings(s, sw)
	sv.Charts, sv.ChartNotes = b.sampleCharts(index, s, sw)
	sv.Uncertainty = b.uncertaintyOf(&sv, fmt.Sprintf("s%d-ranges", index+1), s)
	sv.Indices = indexRows(s.Indices)
	sv.IndicesAt = num(r.Temperature, 1) + " °C"
	sv.Scale, sv.ScaleKg = scaleRows(s.Precipitation, s.Flow), s.Flow > 0
	sv.Treatment = b.treatment(s)
	b.sectionTail(&sv, s, r)
	sv.Warnings = append(sv.Warnings, sweepNotes(sw, sv.Warnings)...)
	return sv
}

// entered lists the sample as read and the totals as used.
func entered(a water.Analysis, r *saturation.Result) ([]kv, []componentRow) {
	fields := []kv{}
	if a.Date != "" {
		fields = append(fields, kv{"Date", a.Date, ""})
	}
	fields = append(fields,
		kv{"Temperature", num(a.Temperature, 1), "°C"},
		kv{"pH (as measured)", num(a.PH, 2), ""},
		kv{"pH measured at", num(a.PHTemperature, 1), "°C"},
	)
	if finite(a.MeasuredTDS) {
		fields = append(fields, kv{"TDS (measured)", num(a.MeasuredTDS, 0), "mg/L"})
	}
	if finite(a.MeasuredConductivity) {
		fields = append(fields, kv{"Conductivity (measured)", num(a.MeasuredConductivity, 0), "µS/cm at 25 °C"})
	}
	density := "Density"
	if a.DensityEstimated {
		density += " (estimated from TDS)"
	}
	fields = append(fields, kv{density, num(a.Density, 4), "kg/L"}, kv{"Water per litre", num(a.WaterPerLitre, 4), "kg"})
	if finite(a.Pressure) && a.Pressure != 1 {
		fields = append(fields, kv{"Pressure", num(a.Pressure, 2), "atm"})
	}
	for _, m := range a.Entered {
		raw := strconv.FormatFloat(m.Value, 'g', -1, 64)
		if m.BelowDetection {
			raw = "<" + strconv.FormatFloat(m.Limit, 'g', -1, 64) + " (used: " + raw + ")"
		}
		fields = append(fields, kv{m.Column, raw, m.Unit.Text})
	}
	var rows []componentRow
	for _, c := range water.Components() {
		if c == water.C || !(a.Measured[c] || a.Totals[c] > 0) {
			continue
		}
		meq := "—"
		if z := c.Charge(); z != 0 {
			meq = sigText(a.MeqPerLitre(c), 3)
		}
		rows = append(rows, componentRow{Name: componentLabel(c), MgPerL: sigText(a.MgPerLitre(c), 4),
			MmolPerKg: sigText(1000*a.Totals[c], 4), MeqPerL: meq})
	}
	if finite(a.Alkalinity) {
		rows = append(rows, componentRow{Name: "alkalinity (as CaCO₃)",
			MgPerL:    sigText(a.AlkalinityAsCaCO3(), 4),
			MmolPerKg: sigText(1000*a.Alkalinity, 4) + " meq", MeqPerL: sigText(a.Alkalinity*a.WaterPerLitre*1000, 3)})
	}
	if r != nil && finite(r.Carbon) && r.Carbon > 0 {
		rows = append(rows, componentRow{Name: "inorganic carbon (as C, from pH and alkalinity)",
			MgPerL: sigText(r.Carbon*a.WaterPerLitre*12.011*1000, 4), MmolPerKg: sigText(1000*r.Carbon, 4), MeqPerL: "—"})
	}
	return fields, rows
}

// componentLabel names a component by the form it is weighed as.
func componentLabel(c water.Component) string {
	switch c {
	case water.Ca:
		return "calcium (Ca)"
	case water.Mg:
		return "magnesium (Mg)"
	case water.Na:
		return "sodium (Na)"
	case water.K:
		return "potassium (K)"
	case water.Ba:
		return "barium (Ba)"
	case water.Sr:
		return "strontium (Sr)"
	case water.Cl:
		return "chloride (Cl)"
	case water.F:
		return "fluoride (F)"
	case water.S:
		return "sulfate (SO₄)"
	case water.N:
		return "nitrate (NO₃)"
	case water.Si:
		return "silica (SiO₂)"
	case water.P:
		return "phosphate (PO₄)"
	case water.Fe:
		return "iron (Fe²⁺)"
	case water.Mn:
		return "manganese (Mn²⁺)"
	case water.B:
		return "boron (B)"
	case water.Br:
		return "bromide (Br)"
	case water.I:
		return "iodide (I)"
	case water.Li:
		return "lithium (Li)"
	case water.NH4:
		return "ammonia (as NH₄)"
	}
	return c.String()
}

// qualityRows lays out the checks of Standard Methods 1030 E.
func qualityRows(q water.Quality, r *saturation.Result) ([]qualityRow, []kv, []string) {
	var rows []qualityRow
	for _, c := range q.Checks {
		row := qualityRow{Check: c.Criterion.Check, Applies: c.Criterion.Applies, Limit: c.Criterion.Limit}
		switch {
		case !c.Done:
			row.Value, row.Verdict = "—", chip{"not measured", "v-none"}
		case c.Pass:
			row.Value, row.Verdict = valueWithUnit(c.Value, c.Criterion.Unit), chip{"ok", "v-ok"}
		default:
			row.Value, row.Verdict = valueWithUnit(c.Value, c.Criterion.Unit), chip{"check", "v-check"}
		}
		rows = append(rows, row)
	}
	sums := []kv{
		{"Cation sum", sigText(q.Cations, 4), "meq/L"},
		{"Anion sum", sigText(q.Anions, 4), "meq/L"},
		{"TDS calculated", num(q.TDSCalculated, 0), "mg/L"},
	}
	if finite(q.TDSMeasured) {
		sums = append(sums, kv{"TDS measured", num(q.TDSMeasured, 0), "mg/L"})
	}
	sums = append(sums, kv{"Conductivity calculated", num(q.ConductivityCalculated, 0), "µS/cm"})
	if finite(q.ConductivityMeasured) {
		sums = append(sums, kv{"Conductivity measured", num(q.ConductivityMeasured, 0), "µS/cm"})
	}
	sums = append(sums, kv{"Ionic strength, from the composition", sigText(q.IonicStrength, 3), "mol/kg"},
		kv{"Ionic strength, 2.5×10⁻⁵ × TDS (Langelier)", sigText(q.IonicStrengthFromTDS, 3), "mol/kg"})
	if finite(q.IonicStrengthFromConductivity) {
		sums = append(sums, kv{"Ionic strength, 1.6×10⁻⁵ × EC (Russell)", sigText(q.IonicStrengthFromConductivity, 3), "mol/kg"})
	}
	if r != nil {
		sums = append(sums, kv{"Ionic strength, from the speciation (ion pairs formed)", sigText(r.IonicStrength, 3), "mol/kg"})
	}
	return rows, sums, q.Flags
}

// mineralRows is the table a client acts on: the minerals the charts show
// (in their fixed order) and any other scale former at or above near
// equilibrium, with the SI, the limit, the margin left to it and the band;
// omitted counts the other minerals of the table (in the JSON output and
// the methods).
func (b *builder) mineralRows(s *plan.Sample) (rows []mineralRow, omitted int) {
	names := slices.Clone(s.Minerals)
	formulas := map[string]bool{}
	for _, n := range names {
		if m, ok := mineralOf(s.Result, n); ok {
			formulas[m.Formula] = true
		}
	}
	for _, rk := range s.Ranking {
		// A polymorph of a mineral in the table (aragonite beside
		// calcite) has the same limit and a lower SI: left to the methods.
		if !slices.Contains(names, rk.Name) && !formulas[rk.Formula] {
			names = append(names, rk.Name)
			formulas[rk.Formula] = true
		}
	}
	for _, name := range names {
		m, ok := mineralOf(s.Result, name)
		if !ok || !finite(m.SI) {
			continue
		}
		row := mineralRow{Name: mineralLabel(m.Name), Formula: m.Formula, SI: signed(m.SI, 2), Limit: "—", key: m.Name,
			Margin: "—", Band: b.band(m.Name, m.SI)}
		if limit, slow, ok := b.limitOf(m.Name); ok {
			row.Limit, row.Margin = signed(limit, 2), signed(limit-m.SI, 2)
		} else if slow {
			row.Limit = "slow to form"
		}
		rows = append(rows, row)
	}
	for _, m := range s.Result.Minerals {
		if finite(m.SI) && !slices.Contains(names, m.Name) {
			omitted++
		}
	}
	return rows, omitted
}
