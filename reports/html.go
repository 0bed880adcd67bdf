package reports

import (
	_ "embed"
	"errors"
	"io"
	"math"

	"scalerisk/outfile"
	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

// The chart library the report inlines, with its licence and notice: Apache
// ECharts 5.6.0, dist/echarts.min.js of the npm package (Apache-2.0). See
// assets/README.md.
var (
	//go:embed assets/echarts.min.js
	echartsJS string
	//go:embed assets/LICENSE
	echartsLicense string
	//go:embed assets/NOTICE
	echartsNotice string
)

// EChartsVersion is the version of the inlined chart library.
const EChartsVersion = "5.6.0"

// Defaults of the report's settings (see plan.Settings).
const (
	// DefaultReportTitle is the title of a report that names none.
	DefaultReportTitle = "Scale-risk assessment"
	// DefaultSkinTemperature is the end of the temperature axis, °C: a
	// common tube-wall temperature of a cooling-water heat exchanger.
	DefaultSkinTemperature = plan.DefaultSkinTemperature
	// DefaultMaxCycles is the end of the cycles-of-concentration axis.
	DefaultMaxCycles = plan.DefaultMaxCycles
	// DefaultReagent is the reagent of the dose chart.
	DefaultReagent = plan.DefaultReagent
)

// Report is what WriteHTML presents: the assessed samples of one or more
// files and how to plan and lay them out. Text in it (titles, names,
// dates, warnings) is taken as untrusted and escaped.
type Report struct {
	// Title heads the report; empty means DefaultReportTitle.
	Title string
	// Client is who the report is prepared for; empty leaves it out.
	Client string
	// Date is the date of the report as it should read ("9 March 2026");
	// empty leaves it out, which keeps the output of a test reproducible.
	Date string
	// Inputs names the input files in order.
	Inputs []string
	// Samples are planned by WriteHTML; an HTMLWriter takes plans instead
	// and ignores them.
	Samples []ReportSample
	Options HTMLOptions
}

// ReportSample is one assessed sample of a report.
type ReportSample struct {
	saturation.Assessment
}

// ReportSamples wraps assessments.
func ReportSamples(as []saturation.Assessment) []ReportSample {
	out := make([]ReportSample, len(as))
	for i, a := range as {
		out[i] = ReportSample{Assessment: a}
	}
	return out
}

// HTMLOptions says how the samples are planned and which get a full
// section. The zero value uses the defaults.
type HTMLOptions struct {
	// Plan is what is computed for every sample: the sweeps, the searches
	// and their settings (see plan.Settings).
	Plan plan.Settings
	// Detection is the below-detection policy the files were read with,
	// named in the methods.
	Detection water.DetectionPolicy
	// Detail is how many samples get a full section with charts: those of
	// highest risk, worst first; every sample has a row in the summary.
	// Samples whose equilibrium could not be computed get a section (the
	// error, the analysis and the data quality) when the budget leaves
	// room. 0 means all; a negative value means none.
	Detail int
}

// Check reports the first option out of range (see plan.Settings.Check).
func (o HTMLOptions) Check() error { return o.Plan.Check() }

// WriteHTML writes r as one self-contained HTML page: the chart script
// (Apache ECharts) and the style are inlined and the page requests nothing
// from any network (its content-security policy forbids it). Each sample is
// planned by plan.Compute under r.Options.Plan and laid out by an
// HTMLWriter: a summary row for every sample, worst first; a section for
// the HTMLOptions.Detail samples of highest risk with their findings, the
// saturation indices against their limits, the charts (saturation index
// against temperature, cycles of concentration and reagent dose; the
// operating window over temperature and cycles; the composition in
// meq/L), the treatment answers, the analysis as entered and as used and
// the data quality. Waters sampled on two or more dates get their indices
// over time. The methods, data sources and cautions close the report. A
// sample whose equilibrium could not be computed is listed with its error
// and, within Detail, gets a section with the error, its analysis and its
// data quality.
//
// A sweep point that fails is left out of its chart and said so, a panel
// with no point left is dropped and a chart with no panel left is replaced
// by a note that says why; the report is still written. Chart values are
// rounded for display and NaN never reaches a chart. The output is
// deterministic: fixed chart IDs and a stable order. The error is non-nil
// when an option is out of range or writing fails.
func WriteHTML(w io.Writer, r Report) error {
	hw, err := NewHTMLWriter(r)
	if err != nil {
		return err
	}
	for _, s := range r.Samples {
		if err := hw.Add(plan.Compute(s.Assessment, r.Options.Plan)); err != nil {
			return err
		}
	}
	return hw.Finish(w)
}

// WriteHTMLFile writes the report to path whole or not at all, as
// outfile.Write does: a failure leaves any earlier file at path untouched
// and no partial file behind; a new file is readable by all (mode 0644),
// an existing one keeps its mode.
func WriteHTMLFile(path string, r Report) error {
	if err := r.Options.Check(); err != nil {
		return err
	}
	return outfile.Write(path, nil, func(w io.Writer) error { return WriteHTML(w, r) })
}

// errNoValue marks a number that is NaN or infinite where a chart needs one.
var errNoValue = errors.New("value is NaN or infinite")

// finite reports whether x is neither NaN nor infinite.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
