package reports_test

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"scalerisk/reports"
)

// The browser test opens reports in headless Chromium from a file URL with
// the network shut off, and checks what a reader would see: no console
// message (an error, or a blocked request), and a drawn SVG in every chart
// container. It saves a screenshot of each report. Chromium comes from
// Debian's chromium package (.ci/run installs it); where it is absent the
// test skips, unless SCALERISK_REQUIRE_BROWSER=1 (set by .ci/run) makes
// that a failure. SCALERISK_CHROMIUM names another binary;
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
	shots := os.Getenv("SCALERISK_SCREENSHOT_DIR")
	if shots == "" {
		shots = dir
	}

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
		{"demo", reports.Report{Client: "Kestrel Fen Energy Centre", Date: "9 March 2026",
			Inputs: []string{"demo.csv"}, Samples: reports.ReportSamples(as)},
			[]string{"s1-temperature", "s1-cycles", "s1-dose", "s1-map", "s1-composition", "s3-map"}},
		{"monitoring", reports.Report{Inputs: []string{"tower3.csv"}, Samples: reports.ReportSamples(series),
			Options: reports.HTMLOptions{Detail: 1}},
			[]string{"time-1"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(dir, tc.name+".html")
			if err := reports.WriteHTMLFile(path, tc.report); err != nil {
				t.Fatal(err)
			}
			url := "file://" + filepath.ToSlash(path)
			dom, logs := chromium(t, bin, url, "--dump-dom")
			if lines := consoleLine.FindAllString(logs, -1); len(lines) > 0 {
				t.Errorf("the page logged to the console (an error or a blocked request):\n%s", strings.Join(lines, "\n"))
			}
			// Every chart container holds a drawn SVG: the container's
			// content up to the next container (or the caption) has an
			// <svg> element with paths in it.
			locs := chartContainer.FindAllStringSubmatchIndex(dom, -1)
			if len(locs) == 0 {
				t.Fatalf("no chart container in the rendered page (%d bytes of DOM)", len(dom))
			}
			drawn := map[string]bool{}
			for i, loc := range locs {
				id := dom[loc[2]:loc[3]]
				end := len(dom)
				if i+1 < len(locs) {
					end = locs[i+1][0]
				}
				body := dom[loc[1]:end]
				if c := strings.Index(body, "<figcaption"); c >= 0 {
					body = body[:c]
				}
				if !strings.Contains(body, "<svg") || !strings.Contains(body, "<path") {
					t.Errorf("chart %s is not drawn (no SVG with paths in its container)", id)
					continue
				}
				drawn[id] = true
			}
			for _, id := range tc.want {
				if !drawn[id] {
					t.Errorf("chart %s missing or not drawn", id)
				}
			}
			t.Logf("%s: %d charts drawn", tc.name, len(drawn))

			shot := filepath.Join(shots, "report-"+tc.name+".png")
			chromium(t, bin, url, "--hide-scrollbars", "--window-size=1280,2400", "--screenshot="+shot)
			fi, err := os.Stat(shot)
			if err != nil {
				t.Fatalf("no screenshot: %v", err)
			}
			if fi.Size() < 20_000 {
				t.Errorf("screenshot %s is only %d bytes: is the page blank?", shot, fi.Size())
			}
			t.Logf("screenshot: %s", shot)
		})
	}
}
