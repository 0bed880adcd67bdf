package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"maps"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"scalerisk/reports"
)

// update rewrites the golden files: go test ./cmd/scalerisk -update
var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// Input files of package water, relative to this package's directory.
const (
	goodWide = "../../water/testdata/good/plant_wide.csv"
	goodLong = "../../water/testdata/good/plant_long.csv"
	badNeg   = "../../water/testdata/bad/negative.csv"
	badEmpty = "../../water/testdata/bad/empty.csv"
	demoCSV  = "../../data/demo.csv"
)

// The demo waters of data/demo.csv, in file order.
var demoSamples = []string{
	"Kestrel Fen makeup well 2",
	"Kestrel Fen tower 1 recirculating",
	"Kestrel Fen RO concentrate train A",
}

// result is one run of the command line.
type result struct {
	code           int
	stdout, stderr string
}

// runCLI runs the command line through run, as main does, with stdin as
// standard input.
func runCLI(t *testing.T, stdin string, args ...string) result {
	t.Helper()
	var out, errOut bytes.Buffer
	code := run(args, strings.NewReader(stdin), &out, &errOut)
	return result{code: code, stdout: out.String(), stderr: errOut.String()}
}

// mustRun runs the command line and fails the test unless it exits with want.
func mustRun(t *testing.T, want int, stdin string, args ...string) result {
	t.Helper()
	r := runCLI(t, stdin, args...)
	if r.code != want {
		t.Fatalf("scalerisk %s: exit %d, want %d\nstderr:\n%s", strings.Join(args, " "), r.code, want, r.stderr)
	}
	return r
}

// Typed view of the JSON of assess (only what the tests read).
type assessDoc struct {
	Samples []sampleDoc `json:"samples"`
	Caution string      `json:"caution"`
}

type sampleDoc struct {
	Name            string             `json:"name"`
	File            string             `json:"file"`
	Line            int                `json:"line"`
	TemperatureC    *float64           `json:"temperature_c"`
	PH              *float64           `json:"ph"`
	ActivityModel   string             `json:"activity_model"`
	SaturationIndex map[string]float64 `json:"saturation_index"`
	Totals          map[string]float64 `json:"totals"`
	Warnings        []string           `json:"warnings"`
	Error           *string            `json:"error"`
}

func decodeAssess(t *testing.T, out string) assessDoc {
	t.Helper()
	var doc assessDoc
	// Keys beyond these are welcome (README, "JSON output": later versions may add keys).
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("output is not the JSON of assess: %v\n%s", err, out)
	}
	return doc
}

func sampleByName(t *testing.T, doc assessDoc, name string) sampleDoc {
	t.Helper()
	for _, s := range doc.Samples {
		if s.Name == name {
			return s
		}
	}
	t.Fatalf("no sample %q in output", name)
	return sampleDoc{}
}

// nanInf matches NaN or Inf written as a number.
var nanInf = regexp.MustCompile(`(^|[^A-Za-z])[+-]?(NaN|Inf)([^A-Za-z]|$)`)

// oneLine folds runs of white space, so that wrapped text compares with the
// unwrapped original.
func oneLine(s string) string { return strings.Join(strings.Fields(s), " ") }

func TestAssessDemoText(t *testing.T) {
	r := mustRun(t, exitOK, "", "assess", "--demo")
	for _, name := range demoSamples {
		if !strings.Contains(r.stdout, name+"  (demo.csv, line ") {
			t.Errorf("text output lacks the heading of sample %q", name)
		}
	}
	if n := strings.Count(r.stdout, "  Data quality\n"); n != len(demoSamples) {
		t.Errorf("text output has %d data-quality blocks, want %d", n, len(demoSamples))
	}
	for _, row := range []string{"ion balance", "dissolved solids", "conductivity", "ionic strength"} {
		if n := strings.Count(r.stdout, "    "+row); n < len(demoSamples) {
			t.Errorf("data-quality row %q appears %d times, want %d", row, n, len(demoSamples))
		}
	}
	if n := strings.Count(r.stdout, "  Equilibrium at "); n != len(demoSamples) {
		t.Errorf("text output has %d equilibrium lines, want %d", n, len(demoSamples))
	}
	if !strings.Contains(oneLine(r.stdout), oneLine(reports.Caution)) {
		t.Errorf("text output lacks the caution %q", reports.Caution)
	}
	if r.stderr != "" {
		t.Errorf("stderr = %q, want nothing for the demo", r.stderr)
	}
}

// requiredMinerals are the minerals every demo water must report.
var requiredMinerals = []string{"calcite", "gypsum", "barite", "celestite", "silica_amorphous"}

// elements are the keys allowed in totals (README, "JSON output": `totals` keyed by element; C
// for inorganic carbon, S for sulfate, N for nitrate).
var elements = []string{"Ca", "Mg", "Na", "K", "Ba", "Sr", "Fe", "Mn", "Cl", "S", "C", "Si", "P", "F", "N", "B"}

func TestAssessDemoJSONShape(t *testing.T) {
	r := mustRun(t, exitOK, "", "assess", "--demo", "--format", "json")
	if m := nanInf.FindString(r.stdout); m != "" {
		t.Errorf("JSON output contains %q", m)
	}
	var doc struct {
		Samples []map[string]json.RawMessage `json:"samples"`
		Caution string                       `json:"caution"`
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatalf("invalid JSON: %v", err)
	}
	if doc.Caution != reports.Caution {
		t.Errorf("caution = %q, want reports.Caution", doc.Caution)
	}
	if len(doc.Samples) != len(demoSamples) {
		t.Fatalf("%d samples, want %d", len(doc.Samples), len(demoSamples))
	}
	for i, s := range doc.Samples {
		var name string
		if err := json.Unmarshal(s["name"], &name); err != nil || name != demoSamples[i] {
			t.Errorf("sample %d: name %s, want %q", i, s["name"], demoSamples[i])
		}
		for _, key := range []string{"temperature_c", "ph", "ionic_strength", "charge_balance_percent"} {
			var v float64
			if err := json.Unmarshal(s[key], &v); err != nil {
				t.Errorf("%s: %s = %s, want a number", name, key, s[key])
			}
			if key == "ionic_strength" && !(v > 0 && v < 1) {
				t.Errorf("%s: ionic_strength = %g mol/kg, want 0 < I < 1 for the demo waters", name, v)
			}
		}
		var model string
		if err := json.Unmarshal(s["activity_model"], &model); err != nil || !slices.Contains([]string{"davies", "truesdell-jones", "bdot", "pitzer"}, model) {
			t.Errorf("%s: activity_model = %s, want davies, truesdell-jones, bdot or pitzer", name, s["activity_model"])
		}
		var si map[string]float64
		if err := json.Unmarshal(s["saturation_index"], &si); err != nil {
			t.Errorf("%s: saturation_index = %s: %v", name, s["saturation_index"], err)
		}
		for _, m := range requiredMinerals {
			if _, ok := si[m]; !ok {
				t.Errorf("%s: saturation_index lacks %s", name, m)
			}
		}
		var species []map[string]json.RawMessage
		if err := json.Unmarshal(s["species"], &species); err != nil || len(species) == 0 {
			t.Errorf("%s: species = %.80s…, want a non-empty array of objects", name, s["species"])
		}
		for _, sp := range species {
			var spName string
			if err := json.Unmarshal(sp["name"], &spName); err != nil || spName == "" {
				t.Errorf("%s: species without a name: %v", name, sp)
			}
			for _, key := range []string{"molality", "gamma", "activity"} {
				var v float64
				if err := json.Unmarshal(sp[key], &v); err != nil || !(v > 0) {
					t.Errorf("%s: species %s: %s = %s, want a positive number", name, spName, key, sp[key])
				}
			}
		}
		var totals map[string]float64
		if err := json.Unmarshal(s["totals"], &totals); err != nil {
			t.Errorf("%s: totals = %s: %v", name, s["totals"], err)
		}
		if !(totals["C"] > 0) {
			t.Errorf("%s: totals[C] = %g, want inorganic carbon > 0", name, totals["C"])
		}
		for k := range totals {
			if !slices.Contains(elements, k) {
				t.Errorf("%s: totals key %q is not an element symbol (README, JSON output)", name, k)
			}
		}
		var warnings []string
		if string(s["warnings"]) == "null" || json.Unmarshal(s["warnings"], &warnings) != nil {
			t.Errorf("%s: warnings = %s, want an array", name, s["warnings"])
		}
		if string(s["error"]) != "null" {
			t.Errorf("%s: error = %s, want null", name, s["error"])
		}
	}
}

// TestGolden pins the text, CSV and JSON output of assess --demo. The golden
// files are a regression pin of the program's own output, not an outside
// reference: they catch unintended changes, they do not show the numbers are
// right (the published checks are in the saturation and water tests). Run
// "go test ./cmd/scalerisk -update" after an intended change and review the
// diff. (Floating-point results are rounded for display; a platform that
// fuses multiply-add may still differ in a last digit.)
func TestGolden(t *testing.T) {
	for _, format := range []string{"text", "csv", "json"} {
		t.Run(format, func(t *testing.T) {
			args := []string{"assess", "--demo", "--format", format}
			if format == "json" {
				args = append(args, "--indent") // one key per line: readable diffs
			}
			first := mustRun(t, exitOK, "", args...).stdout
			second := mustRun(t, exitOK, "", args...).stdout
			if first != second {
				t.Fatalf("two runs differ (output is not deterministic):\n%s", firstDiff(first, second))
			}
			if m := nanInf.FindString(first); m != "" {
				t.Errorf("%s output contains %q", format, m)
			}
			path := filepath.Join("testdata", "assess_demo."+format+".golden")
			if *update {
				if err := os.MkdirAll("testdata", 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(path, []byte(first), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./cmd/scalerisk -update to create it)", err)
			}
			if first != string(want) {
				t.Errorf("output differs from %s (run with -update if intended):\n%s", path, firstDiff(string(want), first))
			}
		})
	}
}

// firstDiff describes the first line where want and got differ.
func firstDiff(want, got string) string {
	wl, gl := strings.Split(want, "\n"), strings.Split(got, "\n")
	for i := range max(len(wl), len(gl)) {
		var w, g string
		if i < len(wl) {
			w = wl[i]
		}
		if i < len(gl) {
			g = gl[i]
		}
		if w != g {
			return "line " + strconv.Itoa(i+1) + ":\n  want " + w + "\n  got  " + g
		}
	}
	return "(no line differs)"
}

func TestWideAndLongAgree(t *testing.T) {
	wide := decodeAssess(t, mustRun(t, exitOK, "", "assess", "--format", "json", goodWide).stdout)
	long := decodeAssess(t, mustRun(t, exitOK, "", "assess", "--format", "json", goodLong).stdout)
	if len(wide.Samples) != 3 || len(long.Samples) != len(wide.Samples) {
		t.Fatalf("wide form gives %d samples, long form %d; want 3 each", len(wide.Samples), len(long.Samples))
	}
	for i, w := range wide.Samples {
		l := long.Samples[i]
		if w.Name != l.Name {
			t.Errorf("sample %d: wide %q, long %q", i, w.Name, l.Name)
			continue
		}
		if len(w.Totals) == 0 {
			t.Errorf("%s: no totals", w.Name)
		}
		if !maps.Equal(w.Totals, l.Totals) {
			t.Errorf("%s: totals differ\n  wide %v\n  long %v", w.Name, w.Totals, l.Totals)
		}
		if len(w.SaturationIndex) == 0 {
			t.Errorf("%s: no saturation indices", w.Name)
		}
		if !maps.Equal(w.SaturationIndex, l.SaturationIndex) {
			t.Errorf("%s: saturation indices differ\n  wide %v\n  long %v", w.Name, w.SaturationIndex, l.SaturationIndex)
		}
	}
}

func TestBadRowKeepsGoodRows(t *testing.T) {
	r := mustRun(t, exitBadInput, "", "assess", "--format", "json", badNeg)
	if want := badNeg + ":3:4:"; !strings.Contains(r.stderr, want) {
		t.Errorf("stderr = %q, want it to name %s", r.stderr, want)
	}
	doc := decodeAssess(t, r.stdout)
	if len(doc.Samples) != 3 {
		t.Fatalf("%d samples, want 3 (two good, one bad)", len(doc.Samples))
	}
	for _, name := range []string{"Tower 1", "Tower 3"} {
		s := sampleByName(t, doc, name)
		if s.Error != nil {
			t.Errorf("%s: error = %q, want null", name, *s.Error)
		}
		if s.TemperatureC == nil || s.PH == nil {
			t.Errorf("%s: temperature_c or ph missing from a good sample", name)
		}
	}
	bad := sampleByName(t, doc, "Tower 2")
	if bad.Error == nil {
		t.Fatal("Tower 2: error = null, want the negative concentration")
	}
	if !strings.Contains(*bad.Error, "negative.csv:3:4") || !strings.Contains(*bad.Error, "negative concentration") {
		t.Errorf("Tower 2: error = %q, want file:3:4 and the cause", *bad.Error)
	}
	if bad.TemperatureC != nil || bad.SaturationIndex != nil {
		t.Errorf("Tower 2: a bad row carries computed values: %+v", bad)
	}

	// The text form says so too.
	r = mustRun(t, exitBadInput, "", "assess", badNeg)
	for _, want := range []string{"Tower 1", "Tower 3", "Tower 2", "not computed"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("text output lacks %q", want)
		}
	}
}

func TestInputErrors(t *testing.T) {
	missing := filepath.Join(t.TempDir(), "no_such_file.csv")
	tests := []struct {
		name       string
		args       []string
		wantStderr string
	}{
		{"missing file", []string{"assess", missing}, missing},
		{"empty file", []string{"assess", badEmpty}, badEmpty + ": empty file"},
		{"unknown flag", []string{"assess", "--demo", "--colour"}, "unknown flag"},
		{"bad format", []string{"assess", "--demo", "--format", "xml"}, `"xml"`},
		{"bad activity model", []string{"assess", "--demo", "--activity", "foo"}, `"foo"`},
		{"bad detection policy", []string{"assess", "--demo", "--below-detection", "third"}, `"third"`},
		{"no input", []string{"assess"}, "no input"},
		{"unknown command", []string{"asses", "--demo"}, "unknown command"},
		{"minerals with an argument", []string{"minerals", "calcite"}, "calcite"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r := mustRun(t, exitBadInput, "", tc.args...)
			if !strings.Contains(r.stderr, tc.wantStderr) {
				t.Errorf("stderr = %q, want it to contain %q", r.stderr, tc.wantStderr)
			}
		})
	}
}

func TestStandardInput(t *testing.T) {
	text, err := os.ReadFile(demoCSV)
	if err != nil {
		t.Fatal(err)
	}
	fromStdin := decodeAssess(t, mustRun(t, exitOK, string(text), "assess", "--format", "json", "-").stdout)
	demo := decodeAssess(t, mustRun(t, exitOK, "", "assess", "--demo", "--format", "json").stdout)
	if len(fromStdin.Samples) != len(demo.Samples) {
		t.Fatalf("standard input gives %d samples, --demo %d", len(fromStdin.Samples), len(demo.Samples))
	}
	for i, s := range fromStdin.Samples {
		d := demo.Samples[i]
		if s.File != "-" {
			t.Errorf("%s: file = %q, want \"-\"", s.Name, s.File)
		}
		if s.Name != d.Name || !maps.Equal(s.Totals, d.Totals) || !maps.Equal(s.SaturationIndex, d.SaturationIndex) {
			t.Errorf("sample %d from standard input (%s) differs from --demo (%s)", i, s.Name, d.Name)
		}
	}
}

// TestTemperature checks --temperature and the retrograde solubility of
// calcite: log Ksp falls as the water warms (Plummer & Busenberg 1982), so
// a closed water heated above its sample temperature is more supersaturated.
// For the tower water the rise is small (about +0.02 from 32 to 60 °C) since
// CaCO3[0] holds much of its carbonate; the strict inequality is the check.
func TestTemperature(t *testing.T) {
	base := decodeAssess(t, mustRun(t, exitOK, "", "assess", "--demo", "--format", "json").stdout)
	hot := decodeAssess(t, mustRun(t, exitOK, "", "assess", "--demo", "--format", "json", "--temperature", "60").stdout)
	if len(hot.Samples) != len(base.Samples) {
		t.Fatalf("%d samples at 60 °C, %d at sample temperature", len(hot.Samples), len(base.Samples))
	}
	for i, h := range hot.Samples {
		b := base.Samples[i]
		if h.TemperatureC == nil || *h.TemperatureC != 60 {
			t.Errorf("%s: temperature_c = %v, want 60", h.Name, h.TemperatureC)
		}
		if b.TemperatureC == nil || *b.TemperatureC >= 60 {
			t.Fatalf("%s: sample temperature %v, want below 60 °C for this check", b.Name, b.TemperatureC)
		}
		if !(h.SaturationIndex["calcite"] > b.SaturationIndex["calcite"]) {
			t.Errorf("%s: SI(calcite, 60 °C) = %.3f, want above SI(calcite, %g °C) = %.3f (retrograde solubility, Plummer & Busenberg 1982)",
				h.Name, h.SaturationIndex["calcite"], *b.TemperatureC, b.SaturationIndex["calcite"])
		}
	}
	tower := sampleByName(t, hot, "Kestrel Fen tower 1 recirculating")
	if tower.SaturationIndex["calcite"] <= sampleByName(t, base, tower.Name).SaturationIndex["calcite"] {
		t.Errorf("tower water: calcite SI does not rise at 60 °C")
	}
}

func TestHelp(t *testing.T) {
	tests := []struct {
		args []string
		want []string
	}{
		// Every --help carries the caution (README, "Caution").
		{[]string{"--help"}, []string{"advisory"}},
		{[]string{"assess", "--help"}, []string{"advisory", "half"}},
		{[]string{"minerals", "--help"}, []string{"--thermo"}},
	}
	for _, tc := range tests {
		root := newRootCmd(strings.NewReader(""))
		var out bytes.Buffer
		root.SetArgs(tc.args)
		root.SetOut(&out)
		root.SetErr(&out)
		if _, err := root.ExecuteC(); err != nil {
			t.Errorf("%v: %v", tc.args, err)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(out.String(), w) {
				t.Errorf("%v: help lacks %q:\n%s", tc.args, w, out.String())
			}
		}
	}
	// The caution is there in full, not only the word.
	r := mustRun(t, exitOK, "", "assess", "--help")
	if !strings.Contains(oneLine(r.stdout), oneLine(reports.Caution)) {
		t.Errorf("assess --help lacks the full caution")
	}
}
