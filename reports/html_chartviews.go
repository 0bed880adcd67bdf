package reports

import (
	"fmt"
	"math"
	"strings"
	"time"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

// maxPanelTitle is the longest panel title, in characters, that fits a
// third of the chart width.
const maxPanelTitle = 30

// siPanels turns sweep points into one SI panel per mineral; x is rounded
// to xDecimals. A panel whose points all failed is kept, empty, for
// panelChart.drawable to drop.
func (b *builder) siPanels(pts []saturation.Point, minerals []saturation.MineralResult, xDecimals int) []panel {
	var out []panel
	for _, m := range minerals {
		p := panel{Title: mineralLabel(m.Name) + " · " + m.Formula, Color: colBlue, SI: true, Limit: math.NaN(), YName: "SI"}
		if m.Formula == "" || len([]rune(p.Title)) > maxPanelTitle {
			p.Title = mineralLabel(m.Name) // the formula is in the table of saturation indices
		}
		if limit, _, ok := b.limitOf(m.Name); ok {
			p.Limit = limit
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
	p := panel{Title: "pH", Color: colPurple, Limit: math.NaN(), YName: "pH"}
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

// compositionView adds the composition chart of a sample; ok is false
// when it has no ions to show or the chart cannot be encoded.
func (b *builder) compositionView(id string, s *plan.Sample) (chartView, bool) {
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
func (b *builder) sampleCharts(index int, s *plan.Sample, sw *sweepSet) ([]chartView, []string) {
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
		views, notes = b.sweepCharts(id, s, sw)
	}
	if cv, ok := b.compositionView(id("composition"), s); ok {
		views = append(views, cv)
	}
	return views, notes
}

// sweepCharts builds the temperature, cycles and dose charts and the
// limiting-mineral map of a sample whose sweeps gave points, and the notes
// on what could not be drawn; id names a chart of the sample by its kind.
func (b *builder) sweepCharts(id func(string) string, s *plan.Sample, sw *sweepSet) ([]chartView, []string) {
	var views []chartView
	var notes []string
	if sw.failed > 0 {
		notes = append(notes, fmt.Sprintf("%d of %d points of the charts could not be computed and are left out.",
			sw.failed, sw.total))
	}
	forced := ""
	if b.o.Plan.Speciation.AtTemperature {
		forced = fmt.Sprintf(" (evaluated at %s °C, as asked)", num(b.o.Plan.Speciation.Temperature, 1))
	}

	tStep := tickStep((sw.hot - sw.bulk) / 6)
	temp := panelChart{ID: id("temperature"), XName: "Temperature, °C", XMin: math.Floor(sw.bulk/tStep) * tStep,
		XMax:   math.Ceil(sw.hot/tStep) * tStep,
		Panels: b.siPanels(sw.temp, sw.minerals, 1)}
	cyc := panelChart{ID: id("cycles"), XName: "Cycles of concentration", XMin: 1, XMax: dec(sw.maxCycles, 2),
		Panels: b.siPanels(sw.cycles, sw.minerals, 2)}
	cycKey := ""
	if c := s.CyclesAnswer; c != nil && finite(c.MaxCycles) && c.Limiting != "" && sw.fromSearch {
		cyc.Marks = append(cyc.Marks, xMark{dec(c.MaxCycles, 2), "highest cycles " + num(c.MaxCycles, 1)})
		cycKey = fmt.Sprintf(" Dotted vertical line: the highest cycles under %s, %s, set by %s.",
			profileWords(c.Profile.Name), num(c.MaxCycles, 1), quantityLabel(c.Limiting))
	}
	dose := panelChart{ID: id("dose"), XName: "Dose of " + b.reagent.Formula + ", mg/L of product", XMin: 0, XMax: dec(sw.maxDose, 1),
		Panels: append([]panel{phPanel(sw.dose, 1)}, b.siPanels(sw.dose, sw.minerals, 1)...)}
	doseKey := ""
	if d := s.DoseAnswer; d != nil && d.Reached && d.Dose > 0 &&
		d.Reagent.Name == b.reagent.Name && d.Dose <= sw.maxDose {
		dose.Marks = append(dose.Marks, xMark{dec(d.Dose, 1), "to " + targetLabel(d.Target)})
		doseKey = fmt.Sprintf(" Dotted vertical line: the dose to %s, %s mg/L.", targetLabel(d.Target), num(d.Dose, 1))
	}
	strength := b.o.Plan.Strength
	if strength == 0 {
		strength = b.reagent.Strength
	}
	caution := ""
	if d := s.DoseAnswer; d == nil || !(d.Reached && d.Dose > 0) {
		caution = b.reagentCaution(b.reagent) // else said once, at the dose answer
	}
	specs := []struct {
		pc                   panelChart
		title, caption, tail string // the key of the lines goes between caption and tail
		caution              string
		pts                  []saturation.Point
	}{
		{temp, "Saturation index against temperature",
			fmt.Sprintf("The water heated in a closed system from the sample temperature (%s °C) to %s °C, "+
				"the tube-wall (skin) temperature of a heat exchanger.", num(sw.bulk, 1), num(sw.hot, 1)),
			"", "", sw.temp},
		{cyc, "Saturation index against cycles of concentration", b.cyclesCaption(s, sw, forced), cycKey, "", sw.cycles},
		{dose, fmt.Sprintf("pH and saturation index against the dose of %s", b.reagent.Label),
			fmt.Sprintf("Dose of %s %% %s (%s) from 0 to %s mg/L of product%s. %s",
				num(strength, 0), b.reagent.Label, b.reagent.Formula, num(sw.maxDose, 0), forced,
				addsWords(b.reagent)),
			doseKey, caution, sw.dose},
	}
	// The key of the lines is said once, under the first chart drawn; the
	// later charts point back to it (shorter printed pages).
	key := " " + b.siKey()
	for _, sp := range specs {
		view, note, ok := b.addPanelChart(sp.pc, sp.title, sp.caption+key+sp.tail, sp.caution, sp.pts)
		if note != "" {
			notes = append(notes, note)
		}
		if ok {
			views = append(views, view)
			key = " Lines and band as in the chart above."
		}
	}
	if view, note, ok := b.windowView(id("window"), s); ok {
		views = append(views, view)
		if note != "" {
			notes = append(notes, note)
		}
	} else if note != "" {
		notes = append(notes, note)
	}
	return views, notes
}

// siKey explains the lines of the SI panels.
func (b *builder) siKey() string {
	limit := "the limit with an antiscalant"
	if !b.inhibitorWords() {
		limit = "the limit of " + profileWords(b.profile.Name)
	}
	return fmt.Sprintf("Solid line: equilibrium (SI = 0); blue band: near equilibrium (±%s); dashed line: %s.",
		num(saturation.NearEquilibriumSI, 1), limit)
}

// addsWords says what a reagent adds to the water besides changing its pH
// and alkalinity, from its stoichiometry (water.Reagent.Adds).
func addsWords(r water.Reagent) string {
	var parts []string
	for _, c := range []struct {
		comp  water.Component
		words string
	}{
		{water.S, "sulfate, which raises gypsum, anhydrite, barite and celestite"},
		{water.Cl, "chloride, which makes the water more corrosive"},
		{water.P, "phosphate, which raises the calcium phosphates"},
		{water.Ca, "calcium, which raises the calcium minerals"},
		{water.Na, "sodium"},
		{water.C, "inorganic carbon"},
	} {
		if r.Adds[c.comp] > 0 {
			parts = append(parts, c.words)
		}
	}
	if len(parts) == 0 {
		return fmt.Sprintf("%s adds nothing that forms scale of its own.", upperFirst(r.Label))
	}
	return fmt.Sprintf("%s also adds %s; a rising line is such a side effect.", upperFirst(r.Label), joinWords(parts))
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
	{name: "Li, NH₄", cation: true, color: "#DDDDDD", text: "#000000", components: []water.Component{water.Li, water.NH4}},
	{name: "alkalinity", color: colVermilion, text: "#000000", alkalinity: true},
	{name: "SO₄", color: colYellow, text: "#000000", components: []water.Component{water.S}},
	{name: "Cl", color: "#8A8A8A", text: "#000000", components: []water.Component{water.Cl}},
	{name: "NO₃, F", color: "#C9C9C9", text: "#000000", components: []water.Component{water.N, water.F}},
	{name: "Br, I", color: "#5E5E5E", text: "#ffffff", components: []water.Component{water.Br, water.I}},
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
