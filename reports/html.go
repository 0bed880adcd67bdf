package reports

import (
	"bufio"
	_ "embed"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"

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

// Defaults of HTMLOptions.
const (
	// DefaultReportTitle is the title of a report that names none.
	DefaultReportTitle = "Scale-risk assessment"
	// DefaultSkinTemperature is the end of the temperature axis, °C: a
	// common tube-wall temperature of a cooling-water heat exchanger.
	DefaultSkinTemperature = 60.0
	// DefaultMaxCycles is the end of the cycles-of-concentration axis.
	DefaultMaxCycles = 8.0
	// DefaultReagent is the reagent of the dose chart.
	DefaultReagent = "h2so4"
)

// Report is what WriteHTML presents: the assessed samples of one or more
// files, what the treatment searches found for them, and how to draw the
// charts. Text in it (titles, names, dates, warnings) is taken as untrusted
// and escaped.
type Report struct {
	// Title heads the report; empty means DefaultReportTitle.
	Title string
	// Client is who the report is prepared for; empty leaves it out.
	Client string
	// Date is the date of the report as it should read ("9 March 2026");
	// empty leaves it out, which keeps the output of a test reproducible.
	Date string
	// Inputs names the input files in order.
	Inputs  []string
	Samples []ReportSample
	Options HTMLOptions
}

// ReportSample is one sample of a report: its assessment and, when the
// treatment searches ran, their answers (nil when they did not).
type ReportSample struct {
	saturation.Assessment
	Treatment *Treatment
}

// ReportSamples wraps assessments without treatment answers.
func ReportSamples(as []saturation.Assessment) []ReportSample {
	out := make([]ReportSample, len(as))
	for i, a := range as {
		out[i] = ReportSample{Assessment: a}
	}
	return out
}

// HTMLOptions says how the charts of a report are computed and which
// samples get a full section. The zero value uses the defaults.
type HTMLOptions struct {
	// Speciation is the options the assessments were computed with; the
	// sweeps behind the charts use them too (activity model, table,
	// carbonate mode, and the evaluation temperature when one was forced).
	Speciation saturation.Options
	// Detection is the below-detection policy the files were read with,
	// named in the methods.
	Detection water.DetectionPolicy
	// SkinTemperature is the end of the temperature axis, °C (0 means
	// DefaultSkinTemperature). When a sample is already within 5 °C of it,
	// its axis runs 20 °C above the sample temperature instead.
	SkinTemperature float64
	// MaxCycles is the end of the cycles axis (0 means DefaultMaxCycles).
	MaxCycles float64
	// Reagent names the reagent of the dose chart by formula, as in
	// data/reagents.csv ("" means DefaultReagent, sulfuric acid); Strength
	// is the product strength in percent (0 means the table's usual).
	Reagent  string
	Strength float64
	// MaxDose is the end of the dose axis, mg/L of product. 0 chooses, per
	// sample, the dose that would remove 80 % of the alkalinity (or
	// 100 mg/L when that is not defined, as for CO2 or a water without
	// alkalinity).
	MaxDose float64
	// CyclesRule, when set, is the carbonate rule of the cycles chart and of
	// the temperature × cycles map (as of the highest-cycles search), so
	// that every cycles figure of a sample follows one rule; nil means the
	// closed system.
	CyclesRule *saturation.CarbonateRule
	// Detail is how many samples, in input order, get a full section with
	// charts; the others appear in the summary tables only. A sample whose
	// equilibrium could not be computed counts too: its section gives the
	// error, the analysis and the data quality. (A row the input could not
	// give has no section.) 0 means all; a negative value means none.
	Detail int
}

// Check reports the first option out of range: SkinTemperature outside
// saturation.MinTemperature–MaxTemperature (0–150 °C), MaxCycles outside 1–50, a negative MaxDose, an
// unknown reagent or a strength outside 0–100 %. NaN is out of range.
func (o HTMLOptions) Check() error {
	if !(o.SkinTemperature >= saturation.MinTemperature && o.SkinTemperature <= saturation.MaxTemperature) {
		return fmt.Errorf("skin temperature %g °C is outside %d–%d °C", o.SkinTemperature, saturation.MinTemperature, saturation.MaxTemperature)
	}
	if o.MaxCycles != 0 && !(o.MaxCycles > 1 && o.MaxCycles <= 50) {
		return fmt.Errorf("maximum cycles %g is outside 1–50", o.MaxCycles)
	}
	if !(o.MaxDose >= 0 && o.MaxDose <= 1e5) {
		return fmt.Errorf("maximum dose %g mg/L is outside 0–100000 mg/L", o.MaxDose)
	}
	if !(o.Strength >= 0 && o.Strength <= 100) {
		return fmt.Errorf("reagent strength %g %% is outside 0–100 %%", o.Strength)
	}
	if _, err := water.LookupReagent(o.reagentName()); err != nil {
		return err
	}
	return nil
}

func (o HTMLOptions) reagentName() string {
	if o.Reagent == "" {
		return DefaultReagent
	}
	return o.Reagent
}

func (o HTMLOptions) skin() float64 {
	if o.SkinTemperature == 0 {
		return DefaultSkinTemperature
	}
	return o.SkinTemperature
}

func (o HTMLOptions) maxCycles() float64 {
	if o.MaxCycles == 0 {
		return DefaultMaxCycles
	}
	return o.MaxCycles
}

// WriteHTML writes r as one self-contained HTML page: the chart script
// (Apache ECharts) and the style are inlined and the page requests nothing
// from any network (its content-security policy forbids it). Every sample
// gets a row in the summary; the first HTMLOptions.Detail samples get a
// section with their findings, saturation indices with risk bands,
// charts (saturation index against temperature, cycles of concentration
// and reagent dose; a temperature × cycles map of the limiting mineral;
// the composition in meq/L), the analysis as entered and as used, the data
// quality and the treatment answers of r's Treatment parts. Waters sampled
// on two or more dates get their indices over time. The methods, data
// sources and cautions close the report. A sample whose equilibrium could
// not be computed is listed with its error and, within Detail, gets a
// section with the error, its analysis and its data quality.
//
// The sweeps behind the charts are computed by saturation.Sweep; a sweep
// point that fails is left out of its chart and said so, a panel with no
// point left is dropped and a chart with no panel left is replaced by a
// note that says why, and the report is still written. Chart values are
// rounded for display and NaN never reaches a chart. The output is deterministic: fixed chart IDs and a
// stable order. The error is non-nil when an option is out of range or
// writing fails.
func WriteHTML(w io.Writer, r Report) error {
	if err := r.Options.Check(); err != nil {
		return err
	}
	v, err := buildView(r)
	if err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	if err := pageTemplate().Execute(bw, v); err != nil {
		return err
	}
	return bw.Flush()
}

// WriteHTMLFile writes the report to path whole or not at all: it is
// rendered into a temporary file in the same directory, synced and renamed
// over path, so that a failure leaves any earlier file at path untouched
// and no partial file behind. The file is readable by all (mode 0644).
func WriteHTMLFile(path string, r Report) error {
	if err := r.Options.Check(); err != nil {
		return err
	}
	return writeAtomic(path, func(w io.Writer) error { return WriteHTML(w, r) })
}

// writeAtomic writes what fill writes to path through a temporary file in
// the same directory and a rename.
func writeAtomic(path string, fill func(io.Writer) error) (err error) {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	f, err := os.CreateTemp(dir, "."+base+".tmp-*")
	if err != nil {
		return err
	}
	tmp := f.Name()
	defer func() {
		if err != nil {
			f.Close()
			os.Remove(tmp)
		}
	}()
	if err = fill(f); err != nil {
		return err
	}
	if err = f.Sync(); err != nil {
		return err
	}
	if err = f.Close(); err != nil {
		return err
	}
	if err = os.Chmod(tmp, 0o644); err != nil {
		return err
	}
	return os.Rename(tmp, path)
}

// errNoValue marks a number that is NaN or infinite where a chart needs one.
var errNoValue = errors.New("value is NaN or infinite")

// finite reports whether x is neither NaN nor infinite.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
