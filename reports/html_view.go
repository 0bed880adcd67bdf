package reports

import (
	"encoding/json"
	"html/template"
	"strings"

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
