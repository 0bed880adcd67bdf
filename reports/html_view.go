package reports

import (
	"cmp"
	"encoding/json"
	"fmt"
	"html/template"
	"math"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"time"

	"scalerisk/saturation"
	"scalerisk/water"
)

// The view of the page: every value the template shows, formatted as text.
// The template escapes all of it; only the chart options and the chart
// library are inserted as script, and those are encoded by chartJSON or
// embedded at build time.

type pageView struct {
	Title, Client, Date string
	Inputs              []string
	SampleCount         int
	ComputedCount       int
	Overview            []overviewRow
	Sections            []sampleView
	NotDetailed         int
	Failed              []failedRow
	Time                []chartView
	TimeNote            string
	Methods             methodsView
	Bands               []bandRow
	Caution             string
	Cautions            []string
	ChartCount          int
	ChartOptions        template.JS
	EChartsJS           template.JS
	EChartsVersion      string
	EChartsLicense      string
	EChartsNotice       string
}

type chip struct{ Text, Class string }

type bandRow struct {
	Chip    chip
	Meaning string
}

type overviewRow struct {
	Name, Anchor, Date, Temperature, PH, IonicStrength string
	Balance                                            chip
	Limiting, LimitingSI                               string
	Band                                               chip
}

// failedRow is a sample that was not computed; Anchor links its section
// (empty when it has none, as for a row the input could not give).
type failedRow struct{ Name, Where, Error, Anchor string }

type kv struct{ Key, Value string }

type fact struct {
	Label, Value string
	Chip         *chip
	Note         string
}

type mineralRow struct {
	Name, Formula, SI, Limit, LogK string
	Band                           chip
}

type chartView struct {
	ID, Title, Caption string
	Height             int
	Caution            string
}

type componentRow struct{ Name, MgPerL, MmolPerKg, MeqPerL string }

type qualityRow struct {
	Check, Applies, Value, Limit string
	Verdict                      chip
}

type sampleView struct {
	Number              int
	Anchor, Name, Where string
	Facts               []fact
	Findings            []string
	Equilibrium         []kv
	Minerals            []mineralRow
	Charts              []chartView
	ChartNotes          []string
	Indices             []indexRow
	IndicesAt           string
	Scale               []scaleRow
	ScaleKg             bool
	Treatment           *treatmentView
	Entered             []kv
	Components          []componentRow
	BelowDetection      []string
	DetectionNote       string
	Quality             []qualityRow
	QualitySums         []kv
	QualityFlags        []string
	Warnings            []string
	// SpeciationError is why the equilibrium of the sample could not be
	// computed, and SpeciationErrorDetail what that leaves out; both are
	// empty for a computed sample.
	SpeciationError       string
	SpeciationErrorDetail string
}

type methodsView struct {
	Activity, Thermo, Carbonate, Detection string
	Charts                                 []string
	UserTable                              string
	Criteria                               []kv
	CriteriaSource                         string
	Sources                                []sourceRow
	Reach                                  []reachRow
}

type sourceRow struct{ Name, Formula, LogK, Range, Source string }

type reachRow struct{ Name, Limit, Source string }

// builder collects the chart options while the view is built.
type builder struct {
	r        Report
	o        HTMLOptions
	reagent  water.Reagent
	options  map[string]json.RawMessage
	charted  map[string]bool // minerals that appear in a chart
	shown    map[string]saturation.MineralResult
	models   map[string]bool
	failures int
}

func buildView(r Report) (*pageView, error) {
	reagent, err := water.LookupReagent(r.Options.reagentName())
	if err != nil {
		return nil, err
	}
	b := &builder{r: r, o: r.Options, reagent: reagent, options: map[string]json.RawMessage{},
		charted: map[string]bool{}, shown: map[string]saturation.MineralResult{}, models: map[string]bool{}}
	v := &pageView{
		Title: r.Title, Client: r.Client, Date: r.Date, Inputs: r.Inputs,
		SampleCount: len(r.Samples), Caution: Caution, Cautions: b.cautions(),
		EChartsJS: template.JS(echartsJS), EChartsVersion: EChartsVersion,
		EChartsLicense: echartsLicense, EChartsNotice: strings.TrimSpace(echartsNotice),
	}
	if v.Title == "" {
		v.Title = DefaultReportTitle
	}
	for _, bd := range allBands {
		st := bandStyleOf(bd)
		v.Bands = append(v.Bands, bandRow{Chip: chip{bd.String(), st.Class}, Meaning: bandMeaning(bd)})
	}
	detailed := 0
	inBudget := func() bool { return r.Options.Detail == 0 || detailed < r.Options.Detail }
	for i, s := range r.Samples {
		if s.Result == nil {
			// A sample whose equilibrium could not be computed still gets
			// its section (the error, the analysis, the data quality);
			// a row the input could not give has no analysis to show.
			row := failedRow{Name: s.Name, Where: sampleWhere(s), Error: sampleError(s)}
			if !s.BadInput && inBudget() {
				detailed++
				sec := b.failedSection(i, detailed, s)
				row.Anchor = sec.Anchor
				v.Sections = append(v.Sections, sec)
			}
			v.Failed = append(v.Failed, row)
			continue
		}
		v.ComputedCount++
		b.models[s.Result.Activity.String()] = true
		for _, m := range s.Result.Minerals {
			if _, ok := b.shown[m.Name]; !ok {
				b.shown[m.Name] = m
			}
		}
		anchor := ""
		if inBudget() {
			detailed++
			sec := b.section(i, detailed, s)
			anchor = sec.Anchor
			v.Sections = append(v.Sections, sec)
		} else {
			v.NotDetailed++
		}
		v.Overview = append(v.Overview, overviewOf(s, anchor))
	}
	v.Time, v.TimeNote = b.timeCharts()
	v.Methods = b.methods()
	v.ChartCount = len(b.options)
	opt, err := json.Marshal(b.options) // keys sorted: deterministic
	if err != nil {
		return nil, err
	}
	v.ChartOptions = template.JS(opt)
	return v, nil
}

func overviewOf(s ReportSample, anchor string) overviewRow {
	r := s.Result
	row := overviewRow{Name: s.Name, Anchor: anchor, Date: s.Input.Date,
		Temperature: num(r.Temperature, 1), PH: num(r.PH, 2), IonicStrength: sigText(r.IonicStrength, 3)}
	row.Balance = balanceChip(s.Quality)
	if m, ok := limiting(r); ok {
		row.Limiting, row.LimitingSI = mineralLabel(m.Name), signed(m.SI, 2)
		row.Band = bandChip(saturation.RiskBand(m.Name, m.SI))
	} else {
		row.Limiting = "none supersaturated"
	}
	return row
}

func bandChip(b saturation.Band) chip { return chip{b.String(), bandStyleOf(b).Class} }

func balanceChip(q water.Quality) chip {
	if !finite(q.BalancePercent) {
		return chip{"not checked", "v-none"}
	}
	text := signed(q.BalancePercent, 1) + " %"
	if q.BalanceAcceptable {
		return chip{text, "v-ok"}
	}
	return chip{text, "v-check"}
}

// sampleWhere is the place of a sample in its file ("lab.csv, line 3").
func sampleWhere(s ReportSample) string {
	if s.Line > 0 {
		return fmt.Sprintf("%s, line %d", s.File, s.Line)
	}
	return s.File
}

// sampleError is why a sample was not computed.
func sampleError(s ReportSample) string {
	if s.Err != nil {
		return s.Err.Error()
	}
	return "not computed"
}

// sectionHead starts the section of a sample: its number, anchor, name,
// and where it comes from.
func sectionHead(index, number int, s ReportSample) sampleView {
	sv := sampleView{Number: number, Anchor: fmt.Sprintf("sample-%d", index+1), Name: s.Name}
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
func (b *builder) sectionTail(sv *sampleView, s ReportSample, r *saturation.Result) {
	sv.Entered, sv.Components = entered(s.Input, r)
	sv.BelowDetection = s.Input.BelowDetection
	if len(sv.BelowDetection) > 0 {
		sv.DetectionNote = detectionWords(b.o.Detection)
	}
	sv.Quality, sv.QualitySums, sv.QualityFlags = qualityRows(s.Quality, r)
	sv.Warnings = append(sv.Warnings, s.Input.Warnings...)
	if r != nil {
		sv.Warnings = append(sv.Warnings, r.Warnings...)
	}
	sv.Warnings = append(sv.Warnings, s.Warnings...)
}

// failedSection builds the section of a sample whose equilibrium could not
// be computed: the error, the ion balance, the composition chart, the
// analysis as entered and as used, and the data quality, which may show
// why.
func (b *builder) failedSection(index, number int, s ReportSample) sampleView {
	sv := sectionHead(index, number, s)
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
func (b *builder) section(index, number int, s ReportSample) sampleView {
	r := s.Result
	sv := sectionHead(index, number, s)

	sv.Equilibrium = []kv{
		{"Evaluated at", num(r.Temperature, 1) + " °C"},
		{"pH at equilibrium", num(r.PH, 2)},
		{"Ionic strength", sigText(r.IonicStrength, 3) + " mol/kg"},
		{"Activity model", r.Activity.String()},
		{"Total alkalinity", sigText(1000*r.Alkalinity, 4) + " meq/kg"},
		{"Inorganic carbon", sigText(1000*r.Carbon, 4) + " mmol/kg"},
	}
	if finite(r.LogPCO2) {
		sv.Equilibrium = append(sv.Equilibrium, kv{"log pCO₂ (atm)", num(r.LogPCO2, 2)})
	}
	sv.Equilibrium = append(sv.Equilibrium, kv{"Charge balance of the speciation", num(r.ChargeBalance, 2) + " %"})

	ms := slices.Clone(r.Minerals)
	slices.SortStableFunc(ms, func(x, y saturation.MineralResult) int { return cmp.Compare(y.SI, x.SI) })
	for _, m := range ms {
		if !finite(m.SI) {
			continue
		}
		limit := "—"
		if reach, ok := saturation.InhibitorReach(m.Name); ok {
			switch {
			case reach.Slow:
				limit = "slow to form"
			case finite(reach.MaxSI):
				limit = signed(reach.MaxSI, 2)
			}
		}
		sv.Minerals = append(sv.Minerals, mineralRow{Name: mineralLabel(m.Name), Formula: m.Formula,
			SI: signed(m.SI, 2), Limit: limit, LogK: num(m.LogK, 3), Band: bandChip(saturation.RiskBand(m.Name, m.SI))})
	}

	sw := b.sweeps(index, s)
	sv.Facts = b.facts(s, sw)
	sv.Findings = b.findings(s, sw)
	sv.Charts, sv.ChartNotes = b.sampleCharts(index, s, sw)
	sv.Indices = indexRows(s.Indices)
	sv.IndicesAt = num(r.Temperature, 1) + " °C"
	sv.Scale, sv.ScaleKg = scaleRows(s.Precipitation, s.Flow), s.Flow > 0
	sv.Treatment = b.treatment(s)
	b.sectionTail(&sv, s, r)
	sv.Warnings = append(sv.Warnings, sweepNotes(sw, sv.Warnings)...)
	return sv
}

// digits matches the numbers of a note.
var digits = regexp.MustCompile(`[0-9.]+`)

// sweepNotes returns the warnings of the charts' points (a constant used
// beyond its fitted temperature range on the way to the skin temperature,
// say) that the sample's own warnings do not already say, once each.
func sweepNotes(sw *sweepSet, have []string) []string {
	seen := map[string]bool{}
	for _, w := range have {
		seen[w] = true
	}
	var out []string
	for _, pts := range [][]saturation.Point{sw.temp, sw.cycles, sw.dose} {
		for _, p := range pts {
			if p.Result == nil {
				continue
			}
			for _, w := range p.Result.Warnings {
				// The same note at the next point differs only in its
				// numbers: keep the first, where it starts to apply.
				key := digits.ReplaceAllString(w, "#")
				if !seen[w] && !seen[key] {
					seen[w], seen[key] = true, true
					out = append(out, "On the charts, from the first point it applies to: "+w)
				}
			}
		}
	}
	return out
}

// sweepSet is what the charts of one sample show: its saturation state
// over temperature, cycles of concentration, reagent dose, and the grid of
// temperature and cycles, as computed by saturation.Sweep.
type sweepSet struct {
	bulk, hot float64 // temperature axis, °C
	temp      []saturation.Point
	cycles    []saturation.Point
	maxCycles float64
	// fromSearch reports that cycles are the points of the treatment's
	// highest-cycles search rather than a sweep.
	fromSearch bool
	dose       []saturation.Point
	maxDose    float64
	gridT      []float64
	gridC      []float64
	grid       []saturation.Point
	minerals   []saturation.MineralResult // the minerals charted
	err        error                      // the water could not be swept
	failed     int                        // points that could not be computed
	total      int
	firstErr   error // of the first point that could not be computed
}

// Points of the sweeps.
const (
	tempPoints  = 15
	cyclePoints = 15
	dosePoints  = 13
	gridSide    = 8
)

func (b *builder) sweeps(index int, s ReportSample) *sweepSet {
	r := s.Result
	opt := b.o.Speciation
	sw := &sweepSet{bulk: r.Temperature, maxCycles: b.o.maxCycles()}
	sw.hot = b.o.skin()
	if sw.hot < sw.bulk+5 {
		sw.hot = sw.bulk + 20
	}
	temps := saturation.Range(sw.bulk, sw.hot, tempPoints)
	var err error
	if sw.temp, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryTemperature, Values: temps}, nil, opt); err != nil {
		sw.err = err
		return sw
	}
	if t := s.Treatment; t != nil && t.Cycles != nil && len(t.Cycles.Points) > 1 {
		// The points of the highest-cycles search, under its carbonate rule.
		sw.fromSearch = true
		sw.maxCycles = 1
		for _, p := range t.Cycles.Points {
			sw.cycles = append(sw.cycles, saturation.Point{X: p.Cycles, Y: math.NaN(), Result: p.Result, Err: p.Err})
			sw.maxCycles = math.Max(sw.maxCycles, p.Cycles)
		}
	} else {
		sw.cycles, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryCycles,
			Values: saturation.Range(1, sw.maxCycles, cyclePoints), Rule: b.o.CyclesRule}, nil, opt)
		if err != nil {
			sw.err = err
			return sw
		}
	}
	sw.maxDose = b.o.MaxDose
	if sw.maxDose == 0 {
		sw.maxDose = autoDose(r, b.reagent, b.o.Strength)
	}
	sw.dose, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryDose,
		Values: saturation.Range(0, sw.maxDose, dosePoints), Reagent: b.reagent, Strength: b.o.Strength}, nil, opt)
	if err != nil {
		sw.err = err
		return sw
	}
	sw.gridT = saturation.Range(sw.bulk, sw.hot, gridSide)
	sw.gridC = saturation.Range(1, sw.maxCycles, gridSide)
	sw.grid, err = saturation.Sweep(s.Input, saturation.Axis{Var: saturation.VaryTemperature, Values: sw.gridT},
		&saturation.Axis{Var: saturation.VaryCycles, Values: sw.gridC, Rule: b.o.CyclesRule}, opt)
	if err != nil {
		sw.err = err
		return sw
	}
	results := []*saturation.Result{r}
	for _, pts := range [][]saturation.Point{sw.temp, sw.cycles, sw.dose, sw.grid} {
		for _, p := range pts {
			sw.total++
			if p.Err != nil || p.Result == nil {
				sw.failed++
				if sw.firstErr == nil {
					sw.firstErr = p.Err
				}
				continue
			}
			results = append(results, p.Result)
		}
	}
	sw.minerals = chartMinerals(results)
	return sw
}

// autoDoseShare is the share of the alkalinity the automatic dose axis
// reaches: most of it, but short of the steep fall of pH near the end
// point.
const autoDoseShare = 0.8

// autoDose is the end of the dose axis, mg/L of product: the dose that
// would change the alkalinity of r by autoDoseShare, rounded up to a
// round number; 100 mg/L when the reagent does not change alkalinity or
// the water has none.
func autoDose(r *saturation.Result, reagent water.Reagent, strength float64) float64 {
	alk := r.Analysis.AlkalinityAsCaCO3()
	factor := math.Abs(reagent.AlkalinityFactor(strength))
	if !finite(alk) || alk <= 0 || !(factor > 0) {
		return 100
	}
	return roundUp(autoDoseShare * alk / factor)
}

// roundUp rounds x > 0 up to a multiple of a twentieth of its power of
// ten (153 → 155, 1234 → 1250, 7.12 → 7.15).
func roundUp(x float64) float64 {
	if !(x > 0) || !finite(x) {
		return 1
	}
	step := math.Pow(10, math.Floor(math.Log10(x))) / 20
	return dec(math.Ceil(x/step*(1-1e-12))*step, 6)
}

// maxPanelTitle is the longest panel title, in characters, that fits a
// third of the chart width.
const maxPanelTitle = 30

// siPanels turns sweep points into one SI panel per mineral; x is rounded
// to xDecimals. A panel whose points all failed is kept, empty, for
// panelChart.drawable to drop.
func siPanels(pts []saturation.Point, minerals []saturation.MineralResult, xDecimals int) []panel {
	var out []panel
	for _, m := range minerals {
		p := panel{Title: mineralLabel(m.Name) + " · " + m.Formula, Color: colBlue, SI: true, Limit: math.NaN()}
		if m.Formula == "" || len([]rune(p.Title)) > maxPanelTitle {
			p.Title = mineralLabel(m.Name) // the formula is in the table of saturation indices
		}
		if reach, ok := saturation.InhibitorReach(m.Name); ok && !reach.Slow {
			p.Limit = reach.MaxSI
		}
		for _, pt := range pts {
			if pt.Result == nil {
				continue
			}
			if si, ok := pt.Result.SI(m.Name); ok && finite(si) {
				p.Points = append(p.Points, xy{dec(pt.X, xDecimals), dec(si, 2)})
			}
		}
		out = append(out, p) // even empty: drawable drops it and says why
	}
	return out
}

func phPanel(pts []saturation.Point, xDecimals int) panel {
	p := panel{Title: "pH", Color: colPurple, Limit: math.NaN()}
	for _, pt := range pts {
		if pt.Result != nil && finite(pt.Result.PH) {
			p.Points = append(p.Points, xy{dec(pt.X, xDecimals), dec(pt.Result.PH, 2)})
		}
	}
	return p
}

// addChart encodes a chart option under id.
func (b *builder) addChart(id string, option map[string]any) error {
	raw, err := chartJSON(id, option)
	if err != nil {
		return err
	}
	b.options[id] = raw
	return nil
}

// addPanelChart adds a panel chart titled title, drawn from the points of
// pts: its panels with no finite point are left out (the note says so
// when points of pts failed), and when none is left (or the option cannot
// be encoded) the chart is, and the note says why. A chart with no panels
// to begin with (nothing worth charting) is left out without a note.
func (b *builder) addPanelChart(pc panelChart, title, caption, caution string, pts []saturation.Point) (chartView, string, bool) {
	if len(pc.Panels) == 0 {
		return chartView{}, "", false
	}
	drawn, dropped := pc.drawable()
	if len(drawn.Panels) == 0 {
		return chartView{}, fmt.Sprintf("%s: not computed, %s.", title, sweepWhy(pts)), false
	}
	option, err := drawn.option()
	if err == nil {
		err = b.addChart(drawn.ID, option)
	}
	if err != nil {
		return chartView{}, fmt.Sprintf("%s: not drawn (%v).", title, err), false
	}
	note := ""
	// A panel can be empty because its sweep failed (say so) or because
	// its mineral is not in these results (nothing to say).
	if len(dropped) > 0 && sweepFailed(pts) {
		note = fmt.Sprintf("%s: the panel %s is left out, %s.", title, strings.Join(dropped, ", "), sweepWhy(pts))
		if len(dropped) > 1 {
			note = fmt.Sprintf("%s: the panels %s are left out, %s.", title, strings.Join(dropped, ", "), sweepWhy(pts))
		}
	}
	return chartView{ID: drawn.ID, Title: title, Caption: caption, Height: drawn.height(), Caution: caution}, note, true
}

// sweepFailed reports whether any point of a sweep failed.
func sweepFailed(pts []saturation.Point) bool {
	for _, p := range pts {
		if p.Err != nil || p.Result == nil {
			return true
		}
	}
	return false
}

// sweepWhy says why a sweep gave nothing to draw: how many of its points
// could not be computed and the first error, or that its values were not
// finite.
func sweepWhy(pts []saturation.Point) string {
	failed := 0
	var first error
	for _, p := range pts {
		if p.Err != nil || p.Result == nil {
			failed++
			if first == nil {
				first = p.Err
			}
		}
	}
	switch {
	case failed == 0:
		return "no finite value came out of its points"
	case first == nil:
		return fmt.Sprintf("%d of its %d points could not be computed", failed, len(pts))
	}
	return fmt.Sprintf("%d of its %d points could not be computed (%v)", failed, len(pts), first)
}

// compositionView adds the composition chart of a sample; ok is false
// when it has no ions to show or the chart cannot be encoded.
func (b *builder) compositionView(id string, s ReportSample) (chartView, bool) {
	cc := compositionOf(id, s.Input)
	if len(cc.Ions) == 0 {
		return chartView{}, false
	}
	if err := b.addChart(cc.ID, cc.option()); err != nil {
		return chartView{}, false
	}
	return chartView{ID: cc.ID, Title: "Composition, meq/L",
		Caption: fmt.Sprintf("Cations and anions as entered, milliequivalents per litre; the bars are equally "+
			"long when the ions balance (here %s).", balanceChip(s.Quality).Text), Height: cc.height()}, true
}

// sampleCharts builds the five charts of a sample and the notes on those
// that could not be drawn. The chart IDs are "s<N>-<kind>", N the
// sample's position in the input.
func (b *builder) sampleCharts(index int, s ReportSample, sw *sweepSet) ([]chartView, []string) {
	var views []chartView
	var notes []string
	id := func(kind string) string { return fmt.Sprintf("s%d-%s", index+1, kind) }
	switch {
	case sw.err != nil:
		notes = append(notes, "The temperature, cycles and dose charts could not be computed: "+sw.err.Error())
	case sw.total > 0 && sw.failed == sw.total:
		why := ""
		if sw.firstErr != nil {
			why = " (" + sw.firstErr.Error() + ")"
		}
		notes = append(notes, fmt.Sprintf("The temperature, cycles and dose charts and the limiting-mineral map "+
			"are not computed: none of the %d points of their sweeps could be computed%s.", sw.total, why))
	default:
		if sw.failed > 0 {
			notes = append(notes, fmt.Sprintf("%d of %d points of the charts could not be computed and are left out.",
				sw.failed, sw.total))
		}
		for _, m := range sw.minerals {
			b.charted[m.Name] = true
		}
		forced := ""
		if b.o.Speciation.AtTemperature {
			forced = fmt.Sprintf(" (evaluated at %s °C, as asked)", num(b.o.Speciation.Temperature, 1))
		}

		tStep := tickStep((sw.hot - sw.bulk) / 6)
		temp := panelChart{ID: id("temperature"), XName: "°C", XMin: math.Floor(sw.bulk/tStep) * tStep,
			XMax:   math.Ceil(sw.hot/tStep) * tStep,
			Panels: siPanels(sw.temp, sw.minerals, 1)}
		cyc := panelChart{ID: id("cycles"), XName: "cycles of concentration", XMin: 1, XMax: dec(sw.maxCycles, 2),
			Panels: siPanels(sw.cycles, sw.minerals, 2)}
		if t := s.Treatment; t != nil && t.Cycles != nil && finite(t.Cycles.MaxCycles) && t.Cycles.Limiting != "" {
			cyc.Marks = append(cyc.Marks, xMark{dec(t.Cycles.MaxCycles, 2), "highest cycles " + num(t.Cycles.MaxCycles, 1)})
		}
		dose := panelChart{ID: id("dose"), XName: "mg/L " + b.reagent.Formula, XMin: 0, XMax: math.NaN(),
			Panels: append([]panel{phPanel(sw.dose, 1)}, siPanels(sw.dose, sw.minerals, 1)...)}
		if t := s.Treatment; t != nil && t.Dose != nil && t.Dose.Reached && t.Dose.Dose > 0 &&
			t.Dose.Reagent.Name == b.reagent.Name && t.Dose.Dose <= sw.maxDose {
			dose.Marks = append(dose.Marks, xMark{dec(t.Dose.Dose, 1), "to " + targetLabel(t.Dose.Target)})
		}
		strength := b.o.Strength
		if strength == 0 {
			strength = b.reagent.Strength
		}
		specs := []struct {
			pc             panelChart
			title, caption string
			caution        string
			pts            []saturation.Point
		}{
			{temp, "Saturation index against temperature",
				fmt.Sprintf("The water heated in a closed system from the sample temperature (%s °C) to %s °C, "+
					"the tube-wall (skin) temperature of a heat exchanger. Solid line: equilibrium (SI = 0); "+
					"blue band: near equilibrium (±0.2); dashed line: the SI an inhibitor usually holds.",
					num(sw.bulk, 1), num(sw.hot, 1)), "", sw.temp},
			{cyc, "Saturation index against cycles of concentration", b.cyclesCaption(s, sw, forced), "", sw.cycles},
			{dose, fmt.Sprintf("pH and saturation index against %s dose", b.reagent.Label),
				fmt.Sprintf("Dose of %s %% %s (%s) from 0 to %s mg/L of product%s. Rising lines are side effects "+
					"of what the reagent adds (sulfate from sulfuric acid raises the sulfate minerals).",
					num(strength, 0), b.reagent.Label, b.reagent.Formula, num(sw.maxDose, 0), forced),
				sentence(b.reagent.Caution), sw.dose},
		}
		for _, sp := range specs {
			view, note, ok := b.addPanelChart(sp.pc, sp.title, sp.caption, sp.caution, sp.pts)
			if note != "" {
				notes = append(notes, note)
			}
			if ok {
				views = append(views, view)
			}
		}
		const mapTitle = "Limiting mineral by temperature and cycles"
		if hc, caption, ok := heatOf(id("map"), sw); ok {
			if err := b.addChart(hc.ID, hc.option()); err != nil {
				notes = append(notes, fmt.Sprintf("%s: not drawn (%v).", mapTitle, err))
			} else {
				views = append(views, chartView{ID: hc.ID, Title: mapTitle, Caption: caption, Height: hc.height()})
			}
		}
	}
	if cv, ok := b.compositionView(id("composition"), s); ok {
		views = append(views, cv)
	}
	return views, notes
}

// heatOf builds the limiting-mineral map of a sample.
func heatOf(id string, sw *sweepSet) (heatChart, string, bool) {
	hc := heatChart{ID: id, XName: "°C", YName: "cycles"}
	for _, t := range sw.gridT {
		hc.XLabels = append(hc.XLabels, num(t, 0))
	}
	for _, c := range sw.gridC {
		hc.YLabels = append(hc.YLabels, strconv.FormatFloat(sig(c, 2), 'f', -1, 64))
	}
	type cell struct {
		m    saturation.MineralResult
		band saturation.Band
	}
	cells := make([]*cell, len(sw.grid))
	names := map[string]bool{}
	for i, p := range sw.grid {
		if p.Result == nil {
			continue
		}
		if m, ok := limiting(p.Result); ok {
			cells[i] = &cell{m, saturation.RiskBand(m.Name, m.SI)}
			names[m.Name] = true
		}
	}
	if len(names) == 0 {
		return hc, "", false
	}
	one := len(names) == 1
	var only string
	for i, c := range cells {
		if c == nil {
			continue
		}
		label := signed(c.m.SI, 2)
		if !one {
			label = mineralLabel(c.m.Name) + "\n" + label
		} else {
			only = mineralLabel(c.m.Name)
		}
		hc.Cells = append(hc.Cells, heatCell{X: i % len(sw.gridT), Y: i / len(sw.gridT), Band: c.band, Label: label})
	}
	caption := "Each cell names the mineral with the highest risk at that temperature and concentration, " +
		"with its saturation index, coloured by risk band."
	if one {
		caption = fmt.Sprintf("The limiting mineral is %s everywhere on this grid; each cell gives its saturation "+
			"index, coloured by risk band.", only)
	}
	return hc, caption, true
}

// ionGroup is one bar segment of the composition chart.
type ionGroup struct {
	name       string
	cation     bool
	color      string
	text       string // label colour on the bar
	components []water.Component
	alkalinity bool
}

var ionGroups = []ionGroup{
	{name: "Ca", cation: true, color: colBlue, text: "#ffffff", components: []water.Component{water.Ca}},
	{name: "Mg", cation: true, color: colOrange, text: "#000000", components: []water.Component{water.Mg}},
	{name: "Na", cation: true, color: colGreen, text: "#000000", components: []water.Component{water.Na}},
	{name: "K", cation: true, color: colPurple, text: "#000000", components: []water.Component{water.K}},
	{name: "Ba, Sr, Fe, Mn", cation: true, color: colSky, text: "#000000", components: []water.Component{water.Ba, water.Sr, water.Fe, water.Mn}},
	{name: "alkalinity", color: colVermilion, text: "#000000", alkalinity: true},
	{name: "SO₄", color: colYellow, text: "#000000", components: []water.Component{water.S}},
	{name: "Cl", color: "#8A8A8A", text: "#000000", components: []water.Component{water.Cl}},
	{name: "NO₃, F", color: "#C9C9C9", text: "#000000", components: []water.Component{water.N, water.F}},
}

// compositionOf sums the cations and anions of a as meq/L (the charge of
// each component as water.Component.Charge counts it, alkalinity as
// anion equivalents), the same sums as the ion balance.
func compositionOf(id string, a water.Analysis) compositionChart {
	cc := compositionChart{ID: id}
	for _, g := range ionGroups {
		var meq float64
		if g.alkalinity {
			if finite(a.Alkalinity) && a.Alkalinity > 0 {
				meq = a.Alkalinity * a.WaterPerLitre * 1000
			}
		} else {
			for _, c := range g.components {
				meq += a.MeqPerLitre(c)
			}
		}
		if finite(meq) && meq > 0 {
			cc.Ions = append(cc.Ions, ionBar{Name: g.name, Cation: g.cation, MeqPerL: meq, Color: g.color, TextColor: g.text})
		}
	}
	return cc
}

// facts are the key figures at the head of a sample's section.
func (b *builder) facts(s ReportSample, sw *sweepSet) []fact {
	r := s.Result
	var out []fact
	if m, ok := limiting(r); ok {
		c := bandChip(saturation.RiskBand(m.Name, m.SI))
		out = append(out, fact{Label: "Limiting mineral at " + num(r.Temperature, 0) + " °C",
			Value: mineralLabel(m.Name) + "  SI " + signed(m.SI, 2), Chip: &c})
	} else {
		out = append(out, fact{Label: "Limiting mineral at " + num(r.Temperature, 0) + " °C", Value: "none supersaturated"})
	}
	if sw.err == nil && len(sw.temp) > 0 {
		last := sw.temp[len(sw.temp)-1]
		if last.Result != nil {
			if m, ok := limiting(last.Result); ok {
				c := bandChip(saturation.RiskBand(m.Name, m.SI))
				out = append(out, fact{Label: "Heated to " + num(sw.hot, 0) + " °C",
					Value: mineralLabel(m.Name) + "  SI " + signed(m.SI, 2), Chip: &c})
			}
		}
	}
	out = append(out, balanceFact(s))
	out = append(out, fact{Label: "pH · ionic strength",
		Value: num(r.PH, 2) + " · " + sigText(r.IonicStrength, 3) + " mol/kg", Note: r.Activity.String() + " activities"})
	return out
}

// balanceFact is the ion balance of a sample and its verdict.
func balanceFact(s ReportSample) fact {
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
func (b *builder) findings(s ReportSample, sw *sweepSet) []string {
	r := s.Result
	var out []string
	if m, ok := limiting(r); ok {
		band := saturation.RiskBand(m.Name, m.SI)
		out = append(out, fmt.Sprintf("At %s °C the limiting mineral is %s (%s), SI %s: %s.",
			num(r.Temperature, 1), mineralLabel(m.Name), m.Formula, signed(m.SI, 2), band))
	} else {
		out = append(out, fmt.Sprintf("At %s °C no scale-forming mineral is supersaturated.", num(r.Temperature, 1)))
	}
	if sw.err != nil {
		return append(out, b.qualityFinding(s)...)
	}
	// Temperature: minerals that pass their inhibitor limit on the way to
	// the skin temperature, with the first temperature computed where they
	// do.
	out = append(out, passFindings(sw.temp, func(x float64) string { return num(x, 0) + " °C" },
		fmt.Sprintf("between %s and %s °C", num(sw.bulk, 0), num(sw.hot, 0)))...)
	if t := s.Treatment; t != nil && t.Cycles != nil {
		out = append(out, cyclesFinding(t.Cycles, t.CyclesRule))
	} else {
		out = append(out, passFindings(sw.cycles, func(x float64) string { return num(x, 1) + " cycles" },
			fmt.Sprintf("when concentrated up to %s cycles", num(sw.maxCycles, 0)))...)
	}
	out = append(out, b.doseFinding(s, sw)...)
	return append(out, b.qualityFinding(s)...)
}

// passFindings says which minerals go beyond inhibitor reach over a sweep
// and from which point, or that none does; nothing when no point of the
// sweep was computed.
func passFindings(pts []saturation.Point, at func(float64) string, span string) []string {
	type first struct {
		name string
		x    float64
	}
	var firsts []first
	seen := map[string]bool{}
	computed := 0
	for _, p := range pts {
		if p.Result == nil {
			continue
		}
		computed++
		for _, m := range p.Result.Minerals {
			if seen[m.Name] || !scaleFormer(m.Name, m.SI) {
				continue
			}
			if saturation.RiskBand(m.Name, m.SI) == saturation.BeyondReach {
				seen[m.Name] = true
				firsts = append(firsts, first{m.Name, p.X})
			}
		}
	}
	if computed == 0 {
		return nil // nothing was computed to say it of
	}
	if len(firsts) == 0 {
		return []string{fmt.Sprintf("No mineral goes beyond inhibitor reach %s.", span)}
	}
	var parts []string
	for _, f := range firsts {
		if f.x == pts[0].X {
			parts = append(parts, mineralLabel(f.name)+" (already at the start)")
		} else {
			parts = append(parts, fmt.Sprintf("%s (from %s)", mineralLabel(f.name), at(f.x)))
		}
	}
	return []string{fmt.Sprintf("Beyond inhibitor reach %s: %s.", span, strings.Join(parts, ", "))}
}

func cyclesFinding(c *saturation.CyclesResult, rule string) string {
	where := "limits of the " + c.Profile.Name + " profile"
	if rule != "" {
		where += ", carbonate " + rule
	}
	switch {
	case len(c.Exceeded) > 0:
		var names []string
		for _, q := range c.Exceeded {
			names = append(names, quantityLabel(q))
		}
		return fmt.Sprintf("Used as a cooling-tower makeup, this water would already be past the %s for %s: it needs treatment before it is concentrated.",
			where, strings.Join(names, ", "))
	case c.Limiting == "":
		return fmt.Sprintf("Used as a cooling-tower makeup: no limit is reached up to %s cycles of concentration (%s).", num(c.MaxCycles, 1), where)
	}
	return fmt.Sprintf("Used as a cooling-tower makeup: at most %s cycles of concentration, set by %s (%s).", num(c.MaxCycles, 2), quantityLabel(c.Limiting), where)
}

// cyclesCaption describes the cycles chart.
func (b *builder) cyclesCaption(s ReportSample, sw *sweepSet, forced string) string {
	if sw.fromSearch {
		rule := s.Treatment.CyclesRule
		if rule == "" {
			rule = "as searched"
		}
		c := s.Treatment.Cycles
		mark := fmt.Sprintf(" No limit of the %s profile is reached in this range.", c.Profile.Name)
		if c.Limiting != "" {
			mark = fmt.Sprintf(" The dotted line marks the highest cycles under the %s limits, set by %s.",
				c.Profile.Name, quantityLabel(c.Limiting))
		}
		return fmt.Sprintf("The points of the highest-cycles search: every dissolved constituent concentrated 1 to %s "+
			"times%s, carbonate system %s.%s", num(sw.maxCycles, 1), forced, rule, mark)
	}
	if r := b.o.CyclesRule; r != nil && r.Name != "closed" {
		return fmt.Sprintf("Every dissolved constituent concentrated 1 to %s times%s, carbonate rule %s.",
			num(sw.maxCycles, 1), forced, r.Name)
	}
	return fmt.Sprintf("Every dissolved constituent concentrated 1 to %s times%s, carbonate system closed "+
		"(no CO₂ exchanged with air; a tower open to air loses CO₂ and runs at a higher pH).", num(sw.maxCycles, 1), forced)
}

// doseFinding reads the dose sweep: pH from start to end, and the
// minerals whose SI rises with the dose.
func (b *builder) doseFinding(s ReportSample, sw *sweepSet) []string {
	var out []string
	// The answer first: the dose to the target, when it was asked for.
	if s.Treatment != nil && s.Treatment.Dose != nil {
		d := s.Treatment.Dose
		switch {
		case d.Reached && d.Dose > 0:
			out = append(out, fmt.Sprintf("The dose to %s is %s mg/L of %s (%s %%): pH %s → %s.",
				d.Target, num(d.Dose, 1), d.Reagent.Label, num(d.Strength, 0), num(d.Before.Result.PH, 2), num(d.After.Result.PH, 2)))
		case d.Reached:
			out = append(out, fmt.Sprintf("No %s is needed for %s: the water is already there.", d.Reagent.Label, d.Target))
		case len(d.Warnings) > 0:
			w := d.Warnings[0]
			out = append(out, "Dose to "+d.Target.String()+": "+sentence(w))
		default:
			out = append(out, fmt.Sprintf("%s does not reach %s.", d.Reagent.Label, d.Target))
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
	line := fmt.Sprintf("Across the dose chart (0 to %s mg/L of %s, the end of the chart, not a recommendation) pH goes from %s to %s",
		num(lastX, 0), b.reagent.Label, num(first.PH, 2), num(last.PH, 2))
	if len(falls) > 0 {
		line += "; SI falls for " + strings.Join(falls, ", ")
	}
	if len(rises) > 0 {
		line += "; SI rises for " + strings.Join(rises, ", ") + " (a side effect to watch)"
	}
	return append(out, line+".")
}

func (b *builder) qualityFinding(s ReportSample) []string {
	q := s.Quality
	if !finite(q.BalancePercent) {
		return []string{"The ion balance cannot be checked: no ions were reported."}
	}
	if q.BalanceAcceptable {
		return []string{fmt.Sprintf("The ion balance (%s %%) meets the criterion %s.", signed(q.BalancePercent, 2), q.BalanceLimit)}
	}
	return []string{fmt.Sprintf("The ion balance (%s %%) fails the criterion %s: an analyte may be missing or in "+
		"error, and every index above is less certain.", signed(q.BalancePercent, 2), q.BalanceLimit)}
}

// entered lists the sample as read and the totals as used.
func entered(a water.Analysis, r *saturation.Result) ([]kv, []componentRow) {
	fields := []kv{}
	if a.Date != "" {
		fields = append(fields, kv{"Date", a.Date})
	}
	fields = append(fields,
		kv{"Temperature", num(a.Temperature, 1) + " °C"},
		kv{"pH (as measured)", num(a.PH, 2)},
		kv{"pH measured at", num(a.PHTemperature, 1) + " °C"},
	)
	if finite(a.MeasuredTDS) {
		fields = append(fields, kv{"TDS (measured)", num(a.MeasuredTDS, 0) + " mg/L"})
	}
	if finite(a.MeasuredConductivity) {
		fields = append(fields, kv{"Conductivity (measured)", num(a.MeasuredConductivity, 0) + " µS/cm at 25 °C"})
	}
	density := num(a.Density, 4) + " kg/L"
	if a.DensityEstimated {
		density += " (estimated from TDS)"
	}
	fields = append(fields, kv{"Density", density}, kv{"Water per litre", num(a.WaterPerLitre, 4) + " kg"})
	if finite(a.Pressure) && a.Pressure != 1 {
		fields = append(fields, kv{"Pressure", num(a.Pressure, 2) + " atm"})
	}
	for _, m := range a.Entered {
		raw := strconv.FormatFloat(m.Value, 'g', -1, 64)
		if m.BelowDetection {
			raw = "<" + strconv.FormatFloat(m.Limit, 'g', -1, 64) + " (used: " + raw + ")"
		}
		fields = append(fields, kv{m.Column, raw + " " + m.Unit.Text})
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
	}
	return c.String()
}

func detectionWords(p water.DetectionPolicy) string {
	switch p {
	case water.DetectionZero:
		return "Results below the detection limit were taken as zero (--below-detection zero)."
	case water.DetectionLimit:
		return "Results below the detection limit were taken at the limit itself (--below-detection limit)."
	}
	return "Results below the detection limit were taken as half the limit (--below-detection half, the default)."
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
		{"Cation sum", sigText(q.Cations, 4) + " meq/L"},
		{"Anion sum", sigText(q.Anions, 4) + " meq/L"},
		{"TDS calculated", num(q.TDSCalculated, 0) + " mg/L"},
	}
	if finite(q.TDSMeasured) {
		sums = append(sums, kv{"TDS measured", num(q.TDSMeasured, 0) + " mg/L"})
	}
	sums = append(sums, kv{"Conductivity calculated", num(q.ConductivityCalculated, 0) + " µS/cm"})
	if finite(q.ConductivityMeasured) {
		sums = append(sums, kv{"Conductivity measured", num(q.ConductivityMeasured, 0) + " µS/cm"})
	}
	sums = append(sums, kv{"Ionic strength, from the composition", sigText(q.IonicStrength, 3) + " mol/kg"},
		kv{"Ionic strength, 2.5×10⁻⁵ × TDS (Langelier)", sigText(q.IonicStrengthFromTDS, 3) + " mol/kg"})
	if finite(q.IonicStrengthFromConductivity) {
		sums = append(sums, kv{"Ionic strength, 1.6×10⁻⁵ × EC (Russell)", sigText(q.IonicStrengthFromConductivity, 3) + " mol/kg"})
	}
	if r != nil {
		sums = append(sums, kv{"Ionic strength, from the speciation (ion pairs formed)", sigText(r.IonicStrength, 3) + " mol/kg"})
	}
	return rows, sums, q.Flags
}

func valueWithUnit(v float64, unit string) string {
	s := sigText(v, 3)
	if unit == "%" {
		return signed(v, 2) + " %"
	}
	if unit != "" {
		return s + " " + unit
	}
	return s
}

// timeCharts builds the indices-over-time charts: one per water (sample
// name) with two or more computed samples whose dates read as calendar
// dates, at most maxTimeCharts, the waters with the most samples first.
func (b *builder) timeCharts() ([]chartView, string) {
	type dated struct {
		t time.Time
		s ReportSample
	}
	series := map[string][]dated{}
	var order []string
	undated := 0
	for _, s := range b.r.Samples {
		if s.Result == nil || s.Input.Date == "" {
			continue
		}
		t, ok := parseDate(s.Input.Date)
		if !ok {
			undated++
			continue
		}
		if _, seen := series[s.Name]; !seen {
			order = append(order, s.Name)
		}
		series[s.Name] = append(series[s.Name], dated{t, s})
	}
	var names []string
	for _, n := range order {
		if len(series[n]) >= 2 {
			names = append(names, n)
		}
	}
	slices.SortStableFunc(names, func(x, y string) int { return cmp.Compare(len(series[y]), len(series[x])) })
	note := ""
	if len(names) > maxTimeCharts {
		note = fmt.Sprintf("%d further waters with dated samples are not charted.", len(names)-maxTimeCharts)
		names = names[:maxTimeCharts]
	}
	if undated > 0 {
		note = strings.TrimSpace(note + fmt.Sprintf(" %d sample dates could not be read as dates (YYYY-MM-DD) and are left out.", undated))
	}
	var views []chartView
	for i, name := range names {
		pts := series[name]
		slices.SortStableFunc(pts, func(x, y dated) int { return x.t.Compare(y.t) })
		var results []*saturation.Result
		var sweep []saturation.Point
		for _, d := range pts {
			results = append(results, d.s.Result)
			sweep = append(sweep, saturation.Point{X: float64(d.t.UnixMilli()), Result: d.s.Result})
		}
		minerals := chartMinerals(results)
		for _, m := range minerals {
			b.charted[m.Name] = true
		}
		panels := siPanels(sweep, minerals, 0)
		lsi := panel{Title: "Langelier index (LSI)", Color: colVermilion, SI: true, Limit: math.NaN()}
		for _, d := range pts {
			if ix := d.s.Indices; ix != nil && finite(ix.LSI) {
				lsi.Points = append(lsi.Points, xy{float64(d.t.UnixMilli()), dec(ix.LSI, 2)})
			}
		}
		if len(lsi.Points) > 0 {
			panels = append([]panel{lsi}, panels...)
		}
		pc := panelChart{ID: fmt.Sprintf("time-%d", i+1), Time: true, XMin: math.NaN(), XMax: math.NaN(), Panels: panels}
		caption := fmt.Sprintf("%d samples from %s to %s, at the temperature of each sample.", len(pts),
			pts[0].t.Format("2 Jan 2006"), pts[len(pts)-1].t.Format("2 Jan 2006"))
		view, why, ok := b.addPanelChart(pc, name, caption, "", sweep)
		if why != "" {
			note = strings.TrimSpace(note + " " + why)
		}
		if ok {
			views = append(views, view)
		}
	}
	return views, note
}

// maxTimeCharts caps the indices-over-time charts.
const maxTimeCharts = 12

// parseDate reads a sample date: YYYY-MM-DD, optionally with a time.
func parseDate(s string) (time.Time, bool) {
	for _, layout := range []string{"2006-01-02", "2006-01-02 15:04", "2006-01-02T15:04", "2006-01-02 15:04:05",
		"2006-01-02T15:04:05", time.RFC3339} {
		if t, err := time.Parse(layout, strings.TrimSpace(s)); err == nil {
			return t.UTC(), true
		}
	}
	return time.Time{}, false
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
	if o.Speciation.Activity == saturation.Auto {
		mv.Activity = "Chosen by ionic strength: Davies up to 0.1 mol/kg, Truesdell–Jones (extended Debye–Hückel) above. " +
			"Used in this report: " + strings.Join(models, ", ") + "."
	} else {
		mv.Activity = "As asked: " + o.Speciation.Activity.String() + "."
	}
	mv.Thermo = "One self-consistent ion-association set: Plummer & Busenberg (1982) for the carbonate system, " +
		"calcite, aragonite and vaterite and the CaHCO₃⁺ and CaCO₃⁰ pairs; the Nordstrom et al. (1990) compilation " +
		"for most other ion pairs and minerals; a few additions named on their rows. Equilibrium constants vary " +
		"with temperature by their published functions; a constant used outside its range carries a warning."
	table := saturation.DefaultTable()
	if o.Speciation.Model != nil {
		table = o.Speciation.Model.Table()
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
	if o.Speciation.AtTemperature {
		mv.Carbonate += fmt.Sprintf(" Every sample was evaluated at %s °C, as asked.", num(o.Speciation.Temperature, 1))
	}
	mv.Detection = detectionWords(o.Detection)
	strength := o.Strength
	if strength == 0 {
		strength = b.reagent.Strength
	}
	mv.Charts = []string{
		fmt.Sprintf("Temperature: %d points from the sample temperature to %s °C (the skin temperature; --skin-temperature).",
			tempPoints, num(o.skin(), 0)),
		fmt.Sprintf("Cycles of concentration: %d points from 1 to %s (--max-cycles); every constituent concentrated alike.",
			cyclePoints, num(o.maxCycles(), 1)),
		fmt.Sprintf("Dose: %d points of %s at %s %% (%s), with the stoichiometry of the reagent table; "+
			"the range ends where 80 %% of the alkalinity would be neutralised unless --max-dose sets it.",
			dosePoints, b.reagent.Label, num(strength, 0), b.reagent.Source),
		fmt.Sprintf("Map: %d × %d grid of temperature and cycles; the limiting mineral is the scale former in the "+
			"highest risk band, and within a band the one furthest past its inhibitor limit (or with the highest SI).",
			gridSide, gridSide),
		"Minerals charted: scale formers within 1 SI unit of saturation somewhere on the charts, one per formula, " +
			"at most six, by risk.",
	}
	for _, c := range water.QualityCriteria() {
		what := c.Check
		if c.Applies != "" {
			what += " (" + c.Applies + ")"
		}
		mv.Criteria = append(mv.Criteria, kv{what, c.Limit})
		mv.CriteriaSource = c.Source
	}
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
		mv.Sources = append(mv.Sources, sourceRow{Name: mineralLabel(e.Name), Formula: e.Formula,
			LogK: num(e.LogK(25), 3), Range: num(e.TMin, 0) + "–" + num(e.TMax, 0) + " °C", Source: src})
		if reach, ok := saturation.InhibitorReach(n); ok {
			limit := signed(reach.MaxSI, 2)
			if reach.Slow {
				limit = "slow to form"
			} else if !finite(reach.MaxSI) {
				limit = "—"
			}
			mv.Reach = append(mv.Reach, reachRow{Name: mineralLabel(n), Limit: limit, Source: reach.Source})
		}
	}
	return mv
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

// num formats x with n decimals; "—" for NaN or ±Inf.
func num(x float64, n int) string {
	if !finite(x) {
		return "—"
	}
	s := strconv.FormatFloat(dec(x, n), 'f', n, 64)
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}

// sigText formats x with n significant digits, in plain decimal notation
// between 1e-6 and 1e6; "—" for NaN or ±Inf.
func sigText(x float64, n int) string {
	if !finite(x) {
		return "—"
	}
	v := sig(x, n)
	var s string
	if a := math.Abs(v); v != 0 && (a < 1e-6 || a >= 1e6) {
		s = strconv.FormatFloat(v, 'g', n, 64)
	} else {
		s = strconv.FormatFloat(v, 'f', -1, 64)
	}
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}
