package reports

import (
	"encoding/json"
	"html/template"

	"scalerisk/plan"
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
	Balances            []balanceView
	// Section numbers of the parts after the samples' sections.
	TimeNum, BalanceNum, MethodsNum, CautionsNum int
	TimeNote                                     string
	Methods                                      methodsView
	Bands                                        []bandRow
	Caution                                      string
	Cautions                                     []string
	ChartCount                                   int
	ChartCountText                               string
	DetailNote                                   string
	LimitingNote                                 string
	LimitsNote                                   string
	TimeKey                                      string
	ChartOptions                                 template.JS
	EChartsJS                                    template.JS
	EChartsVersion                               string
	EChartsLicense                               string
	EChartsNotice                                string
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
type failedRow struct {
	Name, Where, Error, Anchor string
	index                      int
}

type kv struct{ Key, Value, Unit string }

type fact struct {
	Label, Value string
	Chip         *chip
	Note         string
}

type mineralRow struct {
	Name, Formula, SI, Limit, Margin string
	Band                             chip
	// Interval and PAbove are the range of the SI over the draws of the
	// analysis and the probability of SI > 0 (html_uncertainty.go); empty
	// without draws. key is the mineral's name in the results.
	Interval, PAbove string
	key              string
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
	Date                string
	Facts               []fact
	Findings            []string
	Equilibrium         []kv
	Minerals            []mineralRow
	MineralsOmitted     int
	OmittedNote         string
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
	// LabChecks are the checks beyond the quality table (the salinity of a
	// seawater-like water, total hardness, P-alkalinity) in sentences;
	// LabReported lists what the lab reported that the calculation does
	// not use, with values and units.
	LabChecks   []checkLine
	LabReported string
	Warnings    []string
	// SpeciationError is why the equilibrium of the sample could not be
	// computed, and SpeciationErrorDetail what that leaves out; both are
	// empty for a computed sample.
	SpeciationError       string
	SpeciationErrorDetail string
	// Intervals says the SI table has the range columns (IntervalHead
	// heads the first); Uncertainty is the part on how sure the answers
	// are. Both only with draws of the analysis.
	Intervals    bool
	IntervalHead string
	Uncertainty  *uncertaintyView
}

type methodsView struct {
	Activity, Thermo, Carbonate, Detection string
	Charts                                 []string
	UserTable                              string
	Criteria                               []kv
	CriteriaSource                         string
	Sources                                []sourceRow
	Reach                                  []reachRow
	ReachNote                              string
}

type sourceRow struct{ Name, Formula, LogK, Range, Source string }

type reachRow struct{ Name, Limit, Source string }

// builder lays out the view of plans and collects the options of their
// charts.
type builder struct {
	r       Report
	o       HTMLOptions
	reagent water.Reagent
	profile saturation.LimitProfile // of the bands and limits
	options map[string]json.RawMessage
	shown   map[string]saturation.MineralResult
	models  map[string]bool
}

func newBuilder(r Report) *builder {
	return &builder{r: r, o: r.Options, reagent: r.Options.Plan.ReagentOrDefault(),
		profile: r.Options.Plan.LimitProfile(), options: map[string]json.RawMessage{},
		shown: map[string]saturation.MineralResult{}, models: map[string]bool{}}
}

// ruleName words the carbonate rule of the cycles figures.
func (b *builder) ruleName() string { return b.o.Plan.Rule().Name }

func (b *builder) overviewOf(s *plan.Sample) overviewRow {
	r := s.Result
	row := overviewRow{Name: s.Name, Date: s.Input.Date,
		Temperature: num(r.Temperature, 1), PH: num(r.PH, 2), IonicStrength: sigText(r.IonicStrength, 3)}
	row.Balance = balanceChip(s.Quality)
	if len(s.Ranking) > 0 {
		m := s.Ranking[0]
		row.Limiting, row.LimitingSI = mineralLabel(m.Name), signed(m.SI, 2)
		row.Band = b.bandChip(m.Band)
	} else {
		row.Limiting = "none supersaturated"
	}
	return row
}

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

// numberParts numbers the parts that follow the samples' sections: the
// summary is 1, the n sections 2 to n+1, then the indices over time and
// the water balance when the page has them, the methods and the cautions.
func (v *pageView) numberParts(n int) {
	next := n + 2
	if len(v.Time) > 0 {
		v.TimeNum, next = next, next+1
	}
	if len(v.Balances) > 0 {
		v.BalanceNum, next = next, next+1
	}
	v.MethodsNum, v.CautionsNum = next, next+1
}
