package reports_test

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"html"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"scalerisk/plan"
	"scalerisk/reports"
	"scalerisk/saturation"
)

// The browser test opens reports in headless Chromium from a file URL with
// the network shut off, and checks what a reader would see, on screen and
// laid out for print (checkPrinted): no console message (an error, or a
// blocked request), a drawn SVG in every chart container, and no chart
// text over another or cut off. It saves a screenshot of each report.
// Chromium comes from Debian's chromium package (.ci/run installs it);
// where it is absent the test skips, unless SCALERISK_REQUIRE_BROWSER=1
// (set by .ci/run) makes that a failure. SCALERISK_CHROMIUM names another binary;
// SCALERISK_SCREENSHOT_DIR keeps the screenshots (default: the test's
// temporary directory).

// chromiumNames are the binaries tried, in order.
var chromiumNames = []string{"chromium", "chromium-browser", "google-chrome", "chrome", "headless_shell"}

func findChromium(t *testing.T) string {
	t.Helper()
	if p := os.Getenv("SCALERISK_CHROMIUM"); p != "" {
		return p
	}
	for _, n := range chromiumNames {
		if p, err := exec.LookPath(n); err == nil {
			return p
		}
	}
	msg := "Chromium not found (tried " + strings.Join(chromiumNames, ", ") +
		"): install Debian's chromium package, or set SCALERISK_CHROMIUM, to run the browser test"
	if os.Getenv("SCALERISK_REQUIRE_BROWSER") == "1" {
		t.Fatal(msg + " (SCALERISK_REQUIRE_BROWSER=1 requires it)")
	}
	t.Skip(msg)
	return ""
}

// chromium runs the browser on url with the network disabled and a fresh
// profile, with extra flags; it returns standard output and error.
func chromium(t *testing.T, bin, url string, extra ...string) (stdout, stderr string) {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	args := []string{
		"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--disable-default-apps", "--disable-extensions", "--mute-audio",
		// No name resolves: any request the page made would fail, and
		// Chromium would log it to the console, which the test reads.
		"--host-resolver-rules=MAP * ~NOTFOUND",
		"--user-data-dir=" + t.TempDir(),
		"--enable-logging=stderr", "--v=0",
		"--virtual-time-budget=10000",
	}
	args = append(append(args, extra...), url)
	cmd := exec.CommandContext(ctx, bin, args...)
	var out, errOut bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errOut
	if err := cmd.Run(); err != nil {
		t.Fatalf("%s: %v\n%s", bin, err, tail(errOut.String(), 3000))
	}
	return out.String(), errOut.String()
}

func tail(s string, n int) string {
	if len(s) > n {
		return "…" + s[len(s)-n:]
	}
	return s
}

// consoleLine matches what Chromium logs for a console message or an
// uncaught error of the page: [pid:tid:time:LEVEL:CONSOLE:line] "text".
var consoleLine = regexp.MustCompile(`(?m)^\[[^\]]*CONSOLE[^\]]*\].*$`)

// chartContainer finds the chart containers of the rendered DOM.
var chartContainer = regexp.MustCompile(`<div class="chart" id="([^"]+)" data-chart="[^"]+"`)

func TestBrowserRendersReports(t *testing.T) {
	bin := findChromium(t)
	as := demoAssessments(t)
	dir := t.TempDir()
	shots := screenshotDir(t, dir)

	// An invented monitoring series of one tower, for the chart over time.
	var lab strings.Builder
	lab.WriteString("name,date,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n")
	for i := range 8 {
		f := 1 + 0.08*float64(i)
		fmt.Fprintf(&lab, "Invented tower 3,2026-%02d-15,31,%.2f,%.0f,%.0f,%.0f,%.0f,%.0f,%.0f,%.0f\n",
			1+i, 8.0+0.03*float64(i), 150*f, 40*f, 100*f, 240*f, 240*f, 170*f, 50*f)
	}
	series := assessFile(t, "tower3.csv", []byte(lab.String()))

	for _, tc := range []struct {
		name   string
		report reports.Report
		want   []string // chart IDs that must be drawn
	}{
		{"demo", demoReport(t, as),
			[]string{"s1-temperature", "s1-cycles", "s1-dose", "s1-window", "s1-composition", "s3-window"}},
		{"monitoring", reports.Report{Inputs: []string{"tower3.csv"}, Samples: reports.ReportSamples(series),
			Options: reports.HTMLOptions{Detail: 1}},
			[]string{"time-1"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(dir, tc.name+".html")
			if err := reports.WriteHTMLFile(path, tc.report); err != nil {
				t.Fatal(err)
			}
			checkRendered(t, bin, path, tc.want)
			checkPrinted(t, bin, path, tc.want)
			shot := filepath.Join(shots, "report-"+tc.name+".png")
			chromium(t, bin, "file://"+filepath.ToSlash(path), "--hide-scrollbars", "--window-size=1280,2400", "--screenshot="+shot)
			checkShot(t, shot)
		})
	}
}

// screenshotDir is where the screenshots go: SCALERISK_SCREENSHOT_DIR, or
// the test's temporary directory.
func screenshotDir(t *testing.T, dir string) string {
	shots := os.Getenv("SCALERISK_SCREENSHOT_DIR")
	if shots == "" {
		return dir
	}
	if err := os.MkdirAll(shots, 0o755); err != nil {
		t.Fatal(err)
	}
	return shots
}

// demoReport is the demo report with every part: a dose to LSI +0.5 and the
// highest cycles under the inhibitor limits (the defaults of the report
// command).
func demoReport(t *testing.T, as []saturation.Assessment) reports.Report {
	target, err := saturation.ParseTarget("lsi=0.5", nil)
	if err != nil {
		t.Fatal(err)
	}
	profile, err := saturation.LimitProfileNamed("inhibitor")
	if err != nil {
		t.Fatal(err)
	}
	rule, err := saturation.ParseCarbonateRule("natural")
	if err != nil {
		t.Fatal(err)
	}
	return reports.Report{Client: "Kestrel Fen Energy Centre", Date: "9 March 2026", Inputs: []string{"demo.csv"},
		Samples: reports.ReportSamples(as),
		Options: reports.HTMLOptions{Plan: plan.Settings{Target: &target, Profile: &profile, CyclesRule: &rule}}}
}

func checkShot(t *testing.T, shot string) {
	t.Helper()
	fi, err := os.Stat(shot)
	if err != nil {
		t.Fatalf("no screenshot: %v", err)
	}
	if fi.Size() < 20_000 {
		t.Errorf("screenshot %s is only %d bytes: is the page blank?", shot, fi.Size())
	}
	t.Logf("screenshot: %s", shot)
}

// measureJS goes into a copy of the page. It defines measureCharts, which
// measures the charts as they are laid out now and returns JSON: for every
// chart, how many SVG shapes it drew, the pairs of its visible texts whose
// boxes overlap (by more than 1 px each way), and the texts whose boxes
// leave the chart's box (cut off, or over the rest of the page). Once the
// page has loaded and the charts are drawn it writes the measurements into
// <pre id="measured">.
const measureJS = `<script>
window.measureCharts = function () {
  var out = [];
  var nodes = document.querySelectorAll("div.chart[data-chart]");
  for (var i = 0; i < nodes.length; i++) {
    var n = nodes[i], box = n.getBoundingClientRect();
    var rec = {id: n.getAttribute("data-chart"), shapes: n.querySelectorAll("svg path, svg rect, svg circle").length,
      overlaps: [], outside: []};
    var texts = [], els = n.querySelectorAll("svg text");
    for (var j = 0; j < els.length; j++) {
      var e = els[j], s = (e.textContent || "").trim();
      if (!s || getComputedStyle(e).visibility === "hidden" || e.getAttribute("opacity") === "0") { continue; }
      var r = e.getBoundingClientRect();
      if (r.width === 0 || r.height === 0) { continue; }
      texts.push({s: s, r: r});
      if (r.left < box.left - 1 || r.right > box.right + 1 || r.top < box.top - 1 || r.bottom > box.bottom + 1) {
        rec.outside.push(s);
      }
    }
    for (var a = 0; a < texts.length; a++) {
      for (var b = a + 1; b < texts.length; b++) {
        var p = texts[a].r, q = texts[b].r;
        var w = Math.min(p.right, q.right) - Math.max(p.left, q.left);
        var h = Math.min(p.bottom, q.bottom) - Math.max(p.top, q.top);
        if (w > 1 && h > 1) { rec.overlaps.push(texts[a].s + " / " + texts[b].s); }
      }
    }
    out.push(rec);
  }
  return JSON.stringify(out);
};
window.addEventListener("load", function () { setTimeout(function () {
  var pre = document.createElement("pre");
  pre.id = "measured";
  pre.textContent = window.measureCharts();
  document.body.appendChild(pre);
}, 300); });
</script>`

// measured is what measureJS reports of one chart.
type measured struct {
	ID       string   `json:"id"`
	Shapes   int      `json:"shapes"`
	Overlaps []string `json:"overlaps"`
	Outside  []string `json:"outside"`
}

// measuredRe finds the measurements in the dumped DOM.
var measuredRe = regexp.MustCompile(`<pre id="measured">([^<]*)</pre>`)

// checkRendered opens a copy of the page at path with measureJS in it and
// checks what a reader would see: no console message (an error, or a
// blocked request), every chart drawn, the wanted ones among them, no chart
// text over another and none outside its chart.
func checkRendered(t *testing.T, bin, path string, want []string) {
	t.Helper()
	probe := writeProbe(t, path)
	dom, logs := chromium(t, bin, "file://"+filepath.ToSlash(probe), "--window-size=1280,2000", "--dump-dom")
	checkConsole(t, logs)
	m := measuredRe.FindStringSubmatch(dom)
	if m == nil {
		t.Fatalf("the page did not report its measurements (%d bytes of DOM)", len(dom))
	}
	checkCharts(t, filepath.Base(path), html.UnescapeString(m[1]), want)
}

// writeProbe writes a copy of the page at path with measureJS at the end of
// its body and returns the copy's path.
func writeProbe(t *testing.T, path string) string {
	t.Helper()
	raw, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	page := string(raw)
	at := strings.LastIndex(page, "</body>")
	probe := filepath.Join(filepath.Dir(path), "probe-"+filepath.Base(path))
	if err := os.WriteFile(probe, []byte(page[:at]+measureJS+page[at:]), 0o644); err != nil {
		t.Fatal(err)
	}
	return probe
}

// checkConsole fails on any console message in Chromium's log.
func checkConsole(t *testing.T, logs string) {
	t.Helper()
	if lines := consoleLine.FindAllString(logs, -1); len(lines) > 0 {
		t.Errorf("the page logged to the console (an error or a blocked request):\n%s", strings.Join(lines, "\n"))
	}
}

// checkCharts checks the measurements of measureCharts (JSON) of the page
// named name: every chart drawn, the wanted ones among them, no chart text
// over another and none outside its chart.
func checkCharts(t *testing.T, name, js string, want []string) {
	t.Helper()
	var charts []measured
	if err := json.Unmarshal([]byte(js), &charts); err != nil {
		t.Fatal(err)
	}
	if len(charts) == 0 {
		t.Fatal("no chart container in the rendered page")
	}
	drawn := map[string]bool{}
	for _, c := range charts {
		if c.Shapes == 0 {
			t.Errorf("chart %s is not drawn (no SVG shape in its container)", c.ID)
			continue
		}
		drawn[c.ID] = true
		for _, o := range c.Overlaps {
			t.Errorf("chart %s: labels overlap: %s", c.ID, o)
		}
		for _, o := range c.Outside {
			t.Errorf("chart %s: text outside the chart: %q", c.ID, o)
		}
	}
	for _, id := range want {
		if !drawn[id] {
			t.Errorf("chart %s missing or not drawn", id)
		}
	}
	t.Logf("%s: %d charts drawn and measured", name, len(drawn))
}

// maxDemoPages bounds the printed demo report on A4: a cover and summary
// page, at most three pages per sample (three samples; each printed on four
// before the print style was tightened, 16 pages in all) and four of the
// water balance, methods and cautions.
const maxDemoPages = 1 + 3*3 + 4

// TestBrowserPrintsDemo prints the demo report to PDF as a reader's browser
// would, counts its pages, checks that no heading is printed apart from
// what follows it (orphans), and writes screenshots of the first sample's
// charts for a person to look at.
func TestBrowserPrintsDemo(t *testing.T) {
	bin := findChromium(t)
	dir := t.TempDir()
	shots := screenshotDir(t, dir)
	path := filepath.Join(dir, "demo.html")
	if err := reports.WriteHTMLFile(path, demoReport(t, demoAssessments(t))); err != nil {
		t.Fatal(err)
	}
	pdf := filepath.Join(shots, "report-demo.pdf")
	chromium(t, bin, "file://"+filepath.ToSlash(path), "--no-pdf-header-footer", "--print-to-pdf="+pdf)
	raw, err := os.ReadFile(pdf)
	if err != nil {
		t.Fatal(err)
	}
	pages := len(pdfPage.FindAll(raw, -1))
	t.Logf("printed demo report: %d pages (%s)", pages, pdf)
	if pages == 0 || pages > maxDemoPages {
		t.Errorf("the printed demo report has %d pages, want 1 to %d", pages, maxDemoPages)
	}
	raw, err = os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if words, width := pdfWords(t, pdf); words != nil {
		for _, o := range orphans(words, width, string(raw)) {
			t.Errorf("printed demo report: %s", o)
		}
		t.Logf("printed demo report: %d headings kept with what follows them", len(headings(string(raw))))
	}
	for _, id := range chartIDs(string(raw)) {
		if !strings.HasPrefix(id, "s1-") {
			continue
		}
		one := filepath.Join(dir, "one-"+id+".html")
		if err := os.WriteFile(one, []byte(onlyFigure(t, string(raw), id)), 0o644); err != nil {
			t.Fatal(err)
		}
		shot := filepath.Join(shots, "demo-"+id+".png")
		chromium(t, bin, "file://"+filepath.ToSlash(one), "--hide-scrollbars", "--window-size=1150,900", "--screenshot="+shot)
		checkShot(t, shot)
	}
}

// pdfPage matches a page object of a PDF ("/Type /Page", not "/Pages").
var pdfPage = regexp.MustCompile(`/Type\s*/Page[^s]`)

// onlyFigure is the page with only the figure of chart id in its body (the
// style, the chart library and the chart script kept), for a screenshot.
func onlyFigure(t *testing.T, page, id string) string {
	t.Helper()
	fig := regexp.MustCompile(`(?s)<figure>\s*<h4>[^<]*</h4>\s*<div class="chart" id="` + regexp.QuoteMeta(id) + `".*?</figure>`).FindString(page)
	body := strings.Index(page, "<body>") + len("<body>")
	scripts := strings.Index(page, "<script>")
	end := strings.LastIndex(page, "</body>")
	if fig == "" || body < len("<body>") || scripts < 0 || end < scripts {
		t.Fatalf("figure %s not found in the page", id)
	}
	return page[:body] + `<div class="sheet"><main>` + fig + `</main></div>` + page[scripts:end] + "</body></html>"
}
