package reports_test

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"html"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"scalerisk/plan"
	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// demoFile is the embedded demo of package data, read from disk so that the
// tests of reports do not import data.
const demoFile = "../data/demo.csv"

// assessFile reads and assesses a laboratory file.
func assessFile(t testing.TB, name string, content []byte) []saturation.Assessment {
	t.Helper()
	records, problems, err := water.Read(name, bytes.NewReader(content), water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range problems {
		t.Fatalf("%s: %v", name, p)
	}
	return saturation.AssessRecords(name, records, saturation.Options{})
}

func demoAssessments(t testing.TB) []saturation.Assessment {
	t.Helper()
	content, err := os.ReadFile(demoFile)
	if err != nil {
		t.Fatal(err)
	}
	return assessFile(t, "demo.csv", content)
}

// render writes a report of the assessments and returns the page.
func render(t testing.TB, r reports.Report) string {
	t.Helper()
	var buf bytes.Buffer
	if err := reports.WriteHTML(&buf, r); err != nil {
		t.Fatal(err)
	}
	return buf.String()
}

// chartOptions parses the chart options object of a page, keyed by chart ID.
func chartOptions(t *testing.T, page string) map[string]json.RawMessage {
	t.Helper()
	const start = "var options = "
	i := strings.Index(page, start)
	if i < 0 {
		t.Fatal("page has no chart options")
	}
	rest := page[i+len(start):]
	j := strings.Index(rest, ";\n")
	if j < 0 {
		t.Fatal("chart options are not terminated")
	}
	var opts map[string]json.RawMessage
	if err := json.Unmarshal([]byte(rest[:j]), &opts); err != nil {
		t.Fatalf("chart options are not JSON: %v", err)
	}
	return opts
}

// chartIDs are the IDs of the chart containers of a page, in page order.
var chartDiv = regexp.MustCompile(`<div class="chart" id="([^"]+)" data-chart="([^"]+)"`)

func chartIDs(page string) []string {
	var ids []string
	for _, m := range chartDiv.FindAllStringSubmatch(page, -1) {
		ids = append(ids, m[2])
	}
	return ids
}

func TestHTMLDemo(t *testing.T) {
	as := demoAssessments(t)
	r := reports.Report{Client: "Kestrel Fen Energy Centre", Inputs: []string{"demo.csv"},
		Samples: reports.ReportSamples(as)}
	page := render(t, r)

	// One self-contained page: nothing is fetched, and the policy forbids it.
	// (The inlined library mentions url( and <img in its code; the page
	// around it must not.)
	lib, err := os.ReadFile("assets/echarts.min.js")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(page, string(lib)) {
		t.Fatal("page does not inline assets/echarts.min.js unchanged")
	}
	own := strings.Replace(page, string(lib), "", 1)
	for _, bad := range []string{"<script src", "src=", "<link", "@import", "url(", "<iframe", "<img", `href="http`, `href="//`} {
		if strings.Contains(own, bad) {
			t.Errorf("page contains %q: it must not load anything", bad)
		}
	}
	if !strings.Contains(page, `content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:"`) {
		t.Error("page lacks the content-security policy that forbids network requests")
	}
	if !strings.Contains(page, "Licensed to the Apache Software Foundation") || !strings.Contains(page, "echarts") {
		t.Error("page does not inline the chart library with its licence header")
	}
	if !strings.Contains(page, "Apache License") || !strings.Contains(page, "Apache ECharts") {
		t.Error("page lacks the chart library's licence and notice")
	}
	if !strings.Contains(page, "@media print") {
		t.Error("page has no print style")
	}

	// Cautions: the advisory note, SM 2330, acid handling, Legionella.
	for _, want := range []string{html.EscapeString(reports.Caution), "guides, not absolutes (Standard Methods 2330)",
		"always add acid to water", "hypochlorite", "Legionella", "ASHRAE 188", "licensed practice"} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks the caution text %q", want)
		}
	}
	// Every sample has a section with its tables.
	for _, a := range as {
		if !strings.Contains(page, ">"+html.EscapeString(a.Name)+"</h2>") {
			t.Errorf("no section for %q", a.Name)
		}
	}
	for _, want := range []string{"What to act on", "Margin to the limit", "The analysis as entered and as used",
		"Data quality", "Methods and data sources", "Plummer &amp; Busenberg (1982)", "Nordstrom et al. (1990)",
		"Classic indices at", "half the limit", "Mn &lt;0.01 mg/L taken as 0.005", "beyond inhibitor reach",
		"Operating window: margin to the nearest limit", "Composition, meq/L", "anion sum 3.0–10.0 meq/L"} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks %q", want)
		}
	}
	// No treatment was given: its tables are left out, not faked.
	for _, absent := range []string{"Dose to target", "Highest cycles of concentration</h4>"} {
		if strings.Contains(page, absent) {
			t.Errorf("page shows %q though no treatment answers were given", absent)
		}
	}

	// Every chart container has its option, the IDs are fixed and unique,
	// and no NaN or full-precision float reaches a chart.
	ids := chartIDs(page)
	opts := chartOptions(t, page)
	if len(ids) != 5*len(as) {
		t.Errorf("%d chart containers, want 5 per sample (%d): %v", len(ids), 5*len(as), ids)
	}
	for _, kind := range []string{"temperature", "cycles", "dose", "window", "composition"} {
		if !slices.Contains(ids, "s1-"+kind) {
			t.Errorf("no chart s1-%s", kind)
		}
	}
	seen := map[string]bool{}
	for _, id := range ids {
		if seen[id] {
			t.Errorf("chart ID %s used twice", id)
		}
		seen[id] = true
		opt, ok := opts[id]
		if !ok {
			t.Errorf("chart %s has no option", id)
			continue
		}
		s := string(opt)
		if strings.Contains(s, "NaN") || strings.Contains(s, "Infinity") {
			t.Errorf("chart %s option holds NaN or Infinity", id)
		}
		if m := regexp.MustCompile(`\d\.\d{7,}`).FindString(s); m != "" {
			t.Errorf("chart %s holds an unrounded value %s", id, m)
		}
	}
	if len(opts) != len(ids) {
		t.Errorf("%d chart options for %d containers", len(opts), len(ids))
	}

	// Deterministic: the same input gives the same bytes.
	if again := render(t, r); again != page {
		t.Error("two renderings of the same report differ")
	}
}

// TestHTMLEscapesUserText: a sample name, a file name, a client and a date
// that carry markup come out as text, in the page and in the charts.
func TestHTMLEscapesUserText(t *testing.T) {
	const evil = `<script>alert(1)</script>`
	lab := "name,date,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3]\n" +
		`"` + evil + `",2026-01-05,30,8.0,120,30,90,140,180,200` + "\n" +
		`"` + evil + `",2026-02-05,30,8.1,125,31,92,150,185,205` + "\n" +
		`"` + evil + `",2026-03-05,30,8.2,130,32,95,160,190,210` + "\n"
	as := assessFile(t, evil+".csv", []byte(lab))
	page := render(t, reports.Report{Title: evil, Client: evil, Date: evil, Inputs: []string{evil + ".csv"},
		Samples: reports.ReportSamples(as)})
	if strings.Contains(page, evil) {
		i := strings.Index(page, evil)
		t.Fatalf("the name comes out unescaped: …%s…", page[max(0, i-80):min(len(page), i+80)])
	}
	if strings.Contains(page, "alert(1)</script>") {
		t.Error("a script end tag from user text reaches the page")
	}
	escaped := html.EscapeString(evil)
	if n := strings.Count(page, escaped); n < 5 {
		t.Errorf("the escaped name appears %d times, want it in the title, client, date, sections and summary", n)
	}
	// The dated samples of one water give a chart over time, named in text.
	if !slices.Contains(chartIDs(page), "time-1") {
		t.Errorf("no chart over time for three dated samples: %v", chartIDs(page))
	}
}

func TestHTMLTreatment(t *testing.T) {
	as := demoAssessments(t)
	h2so4, err := water.LookupReagent("h2so4")
	if err != nil {
		t.Fatal(err)
	}
	target, err := saturation.ParseTarget("lsi=0.5", nil)
	if err != nil {
		t.Fatal(err)
	}
	tower := as[1] // the recirculating water: LSI well above 0.5
	// Under the plan's treatment (Davies, below), as the page shows it.
	dose, err := saturation.DoseToTarget(tower.Input, h2so4, 0, target, saturation.Options{Activity: saturation.Davies})
	if err != nil {
		t.Fatal(err)
	}
	profile, err := saturation.LimitProfileNamed("no-inhibitor")
	if err != nil {
		t.Fatal(err)
	}
	makeup := as[0]
	cycles, err := saturation.MaxCycles(makeup.Input, profile, saturation.CarbonateRule{}, 8, 0.5, saturation.Options{})
	if err != nil {
		t.Fatal(err)
	}
	// The makeup's calcite SI sits at the no-inhibitor limit (0.18 under
	// Davies, 0.20 under the automatic Pitzer treatment); Davies keeps it
	// just below so that a highest-cycles mark is drawn.
	settings := plan.Settings{Target: &target, Profile: &profile, CyclesRule: &saturation.CarbonateRule{Name: "closed"},
		Speciation: saturation.Options{Activity: saturation.Davies}}
	var buf bytes.Buffer
	hw, err := reports.NewHTMLWriter(reports.Report{Options: reports.HTMLOptions{Plan: settings}})
	if err != nil {
		t.Fatal(err)
	}
	for i, a := range as {
		p := plan.Compute(a, settings)
		if i == 1 {
			p.Errors = append(p.Errors, plan.Error{Part: "blend", Err: errors.New("an invented failure")})
		}
		if err := hw.Add(p); err != nil {
			t.Fatal(err)
		}
	}
	if err := hw.Finish(&buf); err != nil {
		t.Fatal(err)
	}
	page := buf.String()
	_ = cycles
	for _, want := range []string{"Dose to target", "LSI +0.50", "sulfuric acid (H2SO4), product of 93 %",
		"side effects", "Highest cycles of concentration</h4>", "the usual limits without an antiscalant", "The blend could not be computed: an invented failure.",
		`"name":"to LSI +0.50"`, "highest cycles"} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks %q", want)
		}
	}
	if !dose.Reached {
		t.Fatalf("dose to LSI 0.5 not reached for the tower water: %v", dose.Warnings)
	}
	if want := fmt.Sprintf(`%.1f</td><td class="u">mg/L of product`, dose.Dose); !strings.Contains(page, want) {
		t.Errorf("page lacks the dose %q", want)
	}
}

// writePlans writes the report of plans to path through an HTMLWriter.
func writePlans(path string, r reports.Report, plans []*plan.Sample) error {
	var buf bytes.Buffer
	hw, err := reports.NewHTMLWriter(r)
	if err != nil {
		return err
	}
	for _, p := range plans {
		if err := hw.Add(p); err != nil {
			return err
		}
	}
	if err := hw.Finish(&buf); err != nil {
		return err
	}
	return os.WriteFile(path, buf.Bytes(), 0o644)
}

func TestHTMLFailedSamples(t *testing.T) {
	lab := "name,temperature [C],pH,Ca [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"good,25,7.8,80,100,150\n" +
		"bad,25,7.8,-3,100,150\n"
	records, _, err := water.Read("lab.csv", strings.NewReader(lab), water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	as := saturation.AssessRecords("lab.csv", records, saturation.Options{})
	page := render(t, reports.Report{Samples: reports.ReportSamples(as)})
	if !strings.Contains(page, "Samples not computed") || !strings.Contains(page, "lab.csv, line 3") {
		t.Error("the bad row is not listed with its place")
	}
	if !strings.Contains(page, "2 read, 1 computed, 1 not computed") {
		t.Error("the header does not count the samples")
	}
}

// fourWaters are four waters far apart: a soft water, a seawater-like
// brine, an acid mine water (pH 3, no alkalinity, much iron and sulfate)
// and a high-silica water at pH 9.5. The sweeps of the acid mine water
// once failed to converge and took the whole report down.
const fourWaters = `name,temperature [C],pH,pH_temperature [C],Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Fe [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]
soft water,15,7,15,10,2,5,0,0,8,10,25,0
seawater-like,25,8.1,25,412,1290,10770,399,0,19350,2710,117,0
acid mine water,20,3.0,20,200,80,20,0,200,10,1500,0,0
high-silica water,40,9.5,40,20,0,150,0,0,100,50,200,180
`

// withoutLibrary is a page without the inlined chart library, whose code
// mentions NaN and Infinity.
func withoutLibrary(t *testing.T, page string) string {
	t.Helper()
	lib, err := os.ReadFile("assets/echarts.min.js")
	if err != nil {
		t.Fatal(err)
	}
	return strings.Replace(page, string(lib), "", 1)
}

// TestHTMLSweepFailures: one sample whose sweep points fail, or whose
// equilibrium failed, does not cost the others their report. The four
// waters are reported with two more: one whose cycles points all failed
// (its cycles chart gives way to a note) and one whose equilibrium could
// not be computed (its section gives the error, the analysis and the
// data quality).
func TestHTMLSweepFailures(t *testing.T) {
	as := assessFile(t, "waters.csv", []byte(fourWaters))
	if len(as) != 4 {
		t.Fatalf("%d samples read, want 4", len(as))
	}
	samples := reports.ReportSamples(as)

	invented := errors.New("invented failure of a cycles point")
	failed := samples[0]
	failed.Name = "soft water, not computed"
	failed.Line = 7
	failed.Result, failed.Indices, failed.Precipitation = nil, nil, nil
	failed.Err = errors.New("speciation did not converge (an invented failure)")

	path := filepath.Join(t.TempDir(), "waters.html")
	var plans []*plan.Sample
	for _, s := range samples {
		plans = append(plans, plan.Compute(s.Assessment, plan.Settings{}))
	}
	swept := plan.Compute(samples[0].Assessment, plan.Settings{})
	swept.Name = "soft water, cycles not computed"
	swept.Cycles = plan.Sweep{From: 1, To: 3, Failed: 3, FirstErr: invented, FromSearch: true,
		Points: []saturation.Point{{X: 1, Err: invented}, {X: 2, Err: invented}, {X: 3, Err: invented}}}
	plans = append(plans, swept, plan.Compute(failed.Assessment, plan.Settings{}))
	samples = append(samples, reports.ReportSample{Assessment: swept.Assessment}, failed)
	if err := writePlans(path, reports.Report{Inputs: []string{"waters.csv"}}, plans); err != nil {
		t.Fatalf("the report was not written: %v", err)
	}
	raw, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	page := string(raw)
	if !strings.HasSuffix(strings.TrimSpace(page), "</html>") {
		t.Fatal("the file is not a whole page")
	}
	own := withoutLibrary(t, page)
	for _, bad := range []string{"NaN", "Infinity"} {
		if i := strings.Index(own, bad); i >= 0 {
			t.Errorf("the page holds %q: …%s…", bad, own[max(0, i-120):min(len(own), i+40)])
		}
	}

	// A section per sample (worst first), its anchor naming its place in
	// the input.
	sections := regexp.MustCompile(`<section class="sample" id="sample-(\d+)">\s*<h2><span class="num">\d+</span>([^<]*)</h2>`).
		FindAllStringSubmatch(page, -1)
	if len(sections) != len(samples) {
		t.Fatalf("%d sample sections, want %d", len(sections), len(samples))
	}
	for _, sec := range sections {
		i, _ := strconv.Atoi(sec[1])
		if got, want := sec[2], html.EscapeString(samples[i-1].Name); got != want {
			t.Errorf("section sample-%d is %q, want %q", i, got, want)
		}
	}
	section := func(i int) string {
		start := strings.Index(page, fmt.Sprintf(`id="sample-%d"`, i+1))
		end := strings.Index(page[start:], "</section>")
		return page[start : start+end]
	}

	// Every chart container has its option, and no option holds NaN.
	ids := chartIDs(page)
	opts := chartOptions(t, page)
	for _, id := range ids {
		if _, ok := opts[id]; !ok {
			t.Errorf("chart %s has no option", id)
		}
	}
	if len(opts) != len(ids) {
		t.Errorf("%d chart options for %d containers", len(opts), len(ids))
	}
	for _, id := range []string{"s1-temperature", "s2-dose", "s4-window", "s3-composition"} {
		if !slices.Contains(ids, id) {
			t.Errorf("no chart %s", id)
		}
	}
	// The acid mine water: a chart is drawn, or a note says why not.
	acid := section(2)
	for _, kind := range []string{"temperature", "cycles", "dose"} {
		if !strings.Contains(acid, `data-chart="s3-`+kind+`"`) && !strings.Contains(acid, "not computed") {
			t.Errorf("the acid mine water has no %s chart and no note why", kind)
		}
	}

	// All cycles points failed: no cycles chart, a note with the reason,
	// and the other charts of the sample.
	sw := section(4)
	if strings.Contains(sw, `data-chart="s5-cycles"`) {
		t.Error("a cycles chart is drawn though none of its points was computed")
	}
	if want := "Saturation index against cycles of concentration: not computed, 3 of its 3 points could not be " +
		"computed (invented failure of a cycles point)."; !strings.Contains(sw, want) {
		t.Errorf("the section lacks the note %q", want)
	}
	if !strings.Contains(sw, `data-chart="s5-temperature"`) {
		t.Error("the temperature chart of the sample with failed cycles points is missing")
	}

	// The sample not computed: its section gives the error, the analysis
	// and the data quality, and the summary links it.
	nc := section(5)
	for _, want := range []string{"<strong>Not computed.</strong>", "speciation did not converge (an invented failure)",
		"The analysis as entered and as used", "<h3>Data quality</h3>", "ion balance", `data-chart="s6-composition"`} {
		if !strings.Contains(nc, want) {
			t.Errorf("the section of the sample not computed lacks %q", want)
		}
	}
	if strings.Contains(nc, "Saturation indices at equilibrium") {
		t.Error("the section of the sample not computed shows saturation indices")
	}
	if !strings.Contains(page, `<a href="#sample-6">soft water, not computed</a></td><td>waters.csv, line 7</td>`) {
		t.Error("the summary does not list the sample not computed with a link to its section")
	}
	if !strings.Contains(page, "6 read, 5 computed, 1 not computed") {
		t.Error("the header does not count the samples")
	}
}

func TestHTMLDetailLimit(t *testing.T) {
	as := demoAssessments(t)
	page := render(t, reports.Report{Samples: reports.ReportSamples(as), Options: reports.HTMLOptions{Detail: 1}})
	if n := len(chartIDs(page)); n != 5 {
		t.Errorf("%d charts with Detail 1, want the 5 of the sample of highest risk", n)
	}
	if !strings.Contains(page, "A full section follows for the sample of highest risk; the other 2 samples are in this table only.") {
		t.Error("the summary does not say that two samples are not detailed")
	}
	page = render(t, reports.Report{Samples: reports.ReportSamples(as), Options: reports.HTMLOptions{Detail: -1}})
	if n := len(chartIDs(page)); n != 0 {
		t.Errorf("%d charts with Detail −1, want none", n)
	}
}

func TestHTMLOptionsCheck(t *testing.T) {
	for _, s := range []plan.Settings{
		{SkinTemperature: -1}, {SkinTemperature: 200}, {MaxCycles: 0.5}, {MaxCycles: 80},
		{MaxDose: -5}, {Strength: 120}, {Partner: &water.Analysis{}, BlendFraction: 1.5},
	} {
		o := reports.HTMLOptions{Plan: s}
		if err := o.Check(); err == nil {
			t.Errorf("Check(%+v) = nil, want an error", o)
		}
		if err := reports.WriteHTML(&bytes.Buffer{}, reports.Report{Options: o}); err == nil {
			t.Errorf("WriteHTML with %+v: no error", o)
		}
	}
	if err := (reports.HTMLOptions{}).Check(); err != nil {
		t.Errorf("zero options: %v", err)
	}
}

func TestWriteHTMLFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "report.html")
	r := reports.Report{Samples: reports.ReportSamples(demoAssessments(t))}
	if err := reports.WriteHTMLFile(path, r); err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	if fi.Mode().Perm() != 0o644 {
		t.Errorf("mode %v, want 0644", fi.Mode().Perm())
	}
	first, _ := os.ReadFile(path)
	if !bytes.HasSuffix(bytes.TrimSpace(first), []byte("</html>")) {
		t.Error("the file is not a whole page")
	}
	// A failure (an option out of range) leaves the earlier file as it was
	// and no temporary file behind.
	bad := r
	bad.Options.Plan.MaxCycles = -3
	if err := reports.WriteHTMLFile(path, bad); err == nil {
		t.Fatal("no error for bad options")
	}
	again, _ := os.ReadFile(path)
	if !bytes.Equal(first, again) {
		t.Error("a failed write changed the earlier file")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("directory holds %v, want only report.html", names)
	}
	// A directory that does not exist: an error, no file.
	if err := reports.WriteHTMLFile(filepath.Join(dir, "absent", "r.html"), r); err == nil {
		t.Error("no error writing into a missing directory")
	}
}

// ExampleWriteHTML writes the report of an invented cooling-tower water
// and counts its charts.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleWriteHTML() {
	const lab = `name,date,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]
Invented tower basin,2026-04-01,35,8.1,160,40,120,180,250,220,60
`
	records, _, err := water.Read("lab.csv", strings.NewReader(lab), water.ReadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	as := saturation.AssessRecords("lab.csv", records, saturation.Options{})
	var page bytes.Buffer
	if err := reports.WriteHTML(&page, reports.Report{Title: "Tower survey", Samples: reports.ReportSamples(as)}); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("charts:", strings.Count(page.String(), `<div class="chart"`))
	fmt.Println("advisory:", strings.Contains(page.String(), "Results are advisory."))
	// Output:
	// charts: 5
	// advisory: true
}

// BenchmarkWriteHTML200 writes a report of 200 samples, every one with its
// full section and charts (Detail 0); the assessments are computed once
// outside the loop. ns/sample is the time per sample: its sweeps (about
// 120 speciations), charts and tables.
func BenchmarkWriteHTML200(b *testing.B) {
	const n = 200
	var lab strings.Builder
	lab.WriteString("name,date,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n")
	for i := range n {
		f := 0.6 + 0.8*float64(i%20)/19 // invented: a tower sampled daily at 0.6–1.4 × a base water
		fmt.Fprintf(&lab, "Invented tower %d,2026-%02d-%02d,%.1f,%.2f,%.0f,%.0f,%.0f,%.1f,%.0f,%.0f,%.0f,%.0f\n",
			i%4, 1+i/28, 1+i%28, 28+float64(i%7), 7.8+0.02*float64(i%15),
			180*f, 45*f, 110*f, 12*f, 160*f, 260*f, 190*f, 55*f)
	}
	as := assessFile(b, "tower.csv", []byte(lab.String()))
	r := reports.Report{Samples: reports.ReportSamples(as)}
	var size int
	for b.Loop() {
		var buf bytes.Buffer
		if err := reports.WriteHTML(&buf, r); err != nil {
			b.Fatal(err)
		}
		size = buf.Len()
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/n, "ns/sample")
	b.ReportMetric(float64(size)/1e6, "MB")
}
