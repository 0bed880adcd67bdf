package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"scalerisk/reports"
)

func TestReportDemo(t *testing.T) {
	out := filepath.Join(t.TempDir(), "report.html")
	r := mustRun(t, exitOK, "", "report", "--demo", "-o", out, "--date", "9 March 2026", "--client", "Kestrel Fen Energy Centre")
	if !strings.Contains(r.stdout, "wrote "+out+": 3 samples") {
		t.Errorf("stdout = %q, want the file and the sample count", r.stdout)
	}
	if r.stderr != "" {
		t.Errorf("stderr = %q, want nothing for the demo", r.stderr)
	}
	page, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	s := string(page)
	for _, want := range []string{"<!DOCTYPE html>", "9 March 2026", "Kestrel Fen Energy Centre", demoSamples[0],
		demoSamples[1], demoSamples[2], "Dose to target", "LSI +0.50", "Highest cycles of concentration</h4>",
		"Classic indices at", "Scale that could form", `data-chart="s2-dose"`, "</html>"} {
		if !strings.Contains(s, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	if !strings.Contains(oneLine(s), oneLine(reports.Caution)) {
		t.Error("report lacks the caution")
	}
}

func TestReportStdoutAndOptions(t *testing.T) {
	r := mustRun(t, exitOK, "", "report", "--demo", "-o", "-", "--date", "none", "--target", "none", "--limits", "none",
		"--detail", "1", "--skin-temperature", "45", "--max-cycles", "5", "--reagent", "hcl", "--max-dose", "80")
	s := r.stdout
	if !strings.HasPrefix(s, "<!DOCTYPE html>") {
		t.Fatalf("-o - did not write the page to standard output: %.80q", s)
	}
	if n := strings.Count(s, `<section class="sample"`); n != 1 {
		t.Errorf("%d sample sections with --detail 1, want 1", n)
	}
	for _, absent := range []string{"Dose to target", "Highest cycles of concentration</h4>", "<dt>Date</dt>"} {
		if strings.Contains(s, absent) {
			t.Errorf("page holds %q though the flags left it out", absent)
		}
	}
	for _, want := range []string{"hydrochloric acid", "to 45.0 °C", "1 to 5.0 times", "from 0 to 80 mg/L"} {
		if !strings.Contains(s, want) {
			t.Errorf("page lacks %q", want)
		}
	}
}

// TestReportEscapes: a sample named like a script comes out as text.
func TestReportEscapes(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "lab.csv")
	const evil = "<script>alert(1)</script>"
	lab := "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"\"" + evil + "\",30,8.0,120,30,90,140,180,200\n"
	if err := os.WriteFile(in, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "r.html")
	mustRun(t, exitOK, "", "report", in, "-o", out, "--title", evil, "--client", evil)
	page, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if strings.Contains(string(page), evil) {
		t.Error("the sample name reaches the page unescaped")
	}
	if !strings.Contains(string(page), "&lt;script&gt;alert(1)&lt;/script&gt;") {
		t.Error("the escaped sample name is missing")
	}
}

func TestReportBadInput(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "r.html")
	for _, args := range [][]string{
		{"report", "-o", out}, // no input
		{"report", "--demo", "-o", out, "--skin-temperature", "400"},   // out of range
		{"report", "--demo", "-o", out, "--max-cycles", "0.5"},         // out of range
		{"report", "--demo", "-o", out, "--reagent", "vinegar"},        // unknown reagent
		{"report", "--demo", "-o", out, "--target", "colour=blue"},     // bad target
		{"report", "--demo", "-o", out, "--detail", "-2"},              // negative
		{"report", "--demo", "-o", out, "--format", "json"},            // not for HTML
		{"report", "--demo", "-o", out, "--activity", "guess"},         // bad model
		{"report", filepath.Join(dir, "absent.csv"), "-o", out},        // missing file
		{"report", "--demo", "-o", out, "--limits", "no-such-profile"}, // bad profile
	} {
		mustRun(t, exitBadInput, "", args...)
		if _, err := os.Stat(out); err == nil {
			t.Errorf("%v: a report was written", args)
			os.Remove(out)
		}
	}
	// A bad row among good ones: the report is written, the exit is 2.
	in := filepath.Join(dir, "lab.csv")
	lab := "name,temperature [C],pH,Ca [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"good,25,7.8,80,100,150\n" +
		"bad,25,7.8,-3,100,150\n"
	if err := os.WriteFile(in, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	r := mustRun(t, exitBadInput, "", "report", in, "-o", out)
	if !strings.Contains(r.stderr, "lab.csv:3") {
		t.Errorf("stderr = %q, want the bad row located", r.stderr)
	}
	page, err := os.ReadFile(out)
	if err != nil {
		t.Fatal("no report written for a file with one bad row")
	}
	if !strings.Contains(string(page), "Samples not computed") {
		t.Error("the report does not list the bad row")
	}
	// Writing into a directory that does not exist is the user's mistake
	// (exit 2) and leaves nothing behind.
	mustRun(t, exitBadInput, "", "report", "--demo", "-o", filepath.Join(dir, "absent", "r.html"))
}

// TestReportFourWaters: a soft water, a seawater-like brine, an acid mine
// water and a high-silica water in one file. The sweeps of the acid mine
// water once failed to converge and took the whole report down ("chart
// s3-dose, panel "pH": value is NaN or infinite"); now every sample is
// reported, charts that cannot be drawn give way to a note, and a run
// whose samples were all computed exits 0.
func TestReportFourWaters(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "waters.csv")
	lab := "name,temperature [C],pH,pH_temperature [C],Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Fe [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n" +
		"soft water,15,7,15,10,2,5,0,0,8,10,25,0\n" +
		"seawater-like,25,8.1,25,412,1290,10770,399,0,19350,2710,117,0\n" +
		"acid mine water,20,3.0,20,200,80,20,0,200,10,1500,0,0\n" +
		"high-silica water,40,9.5,40,20,0,150,0,0,100,50,200,180\n"
	if err := os.WriteFile(in, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "w.html")
	r := mustRun(t, exitOK, "", "report", in, "-o", out, "--date", "none")
	if !strings.Contains(r.stdout, "wrote "+out+": 4 samples") {
		t.Errorf("stdout = %q, want the file and the sample count", r.stdout)
	}
	raw, err := os.ReadFile(out)
	if err != nil {
		t.Fatalf("no report written: %v", err)
	}
	page := string(raw)
	if !strings.HasSuffix(strings.TrimSpace(page), "</html>") {
		t.Fatal("the report is not a whole page")
	}
	if n := strings.Count(page, `<section class="sample"`); n != 4 {
		t.Errorf("%d sample sections, want 4", n)
	}
	for _, name := range []string{"soft water", "seawater-like", "acid mine water", "high-silica water"} {
		if !strings.Contains(page, "</span>"+name+"</h2>") {
			t.Errorf("no section for %q", name)
		}
	}
	// The inlined chart library mentions NaN in its code; the report
	// around it must not.
	own := page
	if i, j := strings.Index(page, "<script>"), strings.Index(page, "</script>"); i >= 0 && j > i {
		own = page[:i] + page[j:] // the first script is the library
	}
	if strings.Contains(own, "NaN") || strings.Contains(own, "Infinity") {
		t.Error("the report holds NaN or Infinity")
	}
}

func TestReportHelp(t *testing.T) {
	r := mustRun(t, exitOK, "", "report", "--help")
	if !strings.Contains(oneLine(r.stdout), oneLine(reports.Caution)) {
		t.Error("report --help lacks the caution")
	}
	for _, want := range []string{"--skin-temperature", "--max-cycles", "--reagent", "--target", "-o, --output"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("report --help lacks %q", want)
		}
	}
	if strings.Contains(r.stdout, "--format") {
		t.Error("report --help offers --format, which does not apply to HTML")
	}
}

// TestReportBlend: --blend-with adds a blend table to each sample's
// treatment part, computed from totals, with the blend judged at the
// water's own temperature and at the 60 °C tube wall (the default skin)
// and the safe share of the sample in words.
func TestReportBlend(t *testing.T) {
	out := filepath.Join(t.TempDir(), "blend.html")
	mustRun(t, 0, "", "report", "--demo", "--blend-with", demoCSV, "--blend-fraction", "0.7", "-o", out)
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if n := strings.Count(string(b), "Blend: 70 % of this water with 30 % of Kestrel Fen makeup well 2"); n != len(demoSamples) {
		t.Errorf("%d blend tables, want one per sample (%d)", n, len(demoSamples))
	}
	judged := "at the water&#39;s own temperature and at the 60 °C tube wall"
	if n := strings.Count(string(b), judged); n != len(demoSamples) {
		t.Errorf("%d blends judged %q, want one per sample (%d)", n, judged, len(demoSamples))
	}
	shares := strings.Count(string(b), "The blend can take at most") + strings.Count(string(b), "The blend needs at least") +
		strings.Count(string(b), "stays within the limits.") + strings.Count(string(b), "no safe share of the two was sought")
	if shares != len(demoSamples) {
		t.Errorf("%d safe-share sentences, want one per sample (%d)", shares, len(demoSamples))
	}
	mustRun(t, 2, "", "report", "--demo", "--blend-with", demoCSV, "--blend-fraction", "2", "-o", out)
}

// TestReportOneSample: the line naming the written file counts one sample
// in the singular.
func TestReportOneSample(t *testing.T) {
	out := filepath.Join(t.TempDir(), "report.html")
	r := mustRun(t, exitOK, "", "report", "testdata/kestrel_fen_seawater.csv", "-o", out, "--date", "none")
	if !strings.Contains(r.stdout, "wrote "+out+": 1 sample\n") {
		t.Errorf("stdout = %q, want the file and \"1 sample\"", r.stdout)
	}
}
