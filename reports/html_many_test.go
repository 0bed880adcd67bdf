package reports_test

import (
	"bytes"
	"fmt"
	"html"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"scalerisk/plan"
	"scalerisk/reports"
	"scalerisk/saturation"
)

// TestHTMLManySamples: a 200-sample report stays readable: every sample has
// a summary row (worst first, with its date), only the Detail samples of
// highest risk get a section, and the page says so. The plans carry their
// ranking only (no sweeps), which is all the summary needs.
func TestHTMLManySamples(t *testing.T) {
	as := demoAssessments(t)
	hw, err := reports.NewHTMLWriter(reports.Report{Options: reports.HTMLOptions{Detail: 5}})
	if err != nil {
		t.Fatal(err)
	}
	for i := range 200 {
		a := as[i%len(as)]
		a.Name = fmt.Sprintf("invented water %03d", i+1)
		a.Input.Date = fmt.Sprintf("2026-%02d-%02d", 1+i%12, 1+i%28)
		p := &plan.Sample{Assessment: a, Ranking: saturation.Rank(a.Result, nil)}
		if err := hw.Add(p); err != nil {
			t.Fatal(err)
		}
	}
	var buf bytes.Buffer
	if err := hw.Finish(&buf); err != nil {
		t.Fatal(err)
	}
	page := buf.String()
	if n := strings.Count(page, `<section class="sample"`); n != 5 {
		t.Errorf("%d sections, want 5", n)
	}
	rows := regexp.MustCompile(`(?s)<table class="overview">.*?</table>`).FindString(page)
	if n := strings.Count(rows, "<tr>") - 1; n != 200 {
		t.Errorf("%d summary rows, want 200", n)
	}
	if !strings.Contains(page, "Full sections follow for the 5 samples of highest risk; the other 195 samples are in this table only.") {
		t.Error("the page does not say which samples have a section")
	}
	// Worst first: past an inhibitor's reach, then supersaturated by SI,
	// then the rest; the tower water (past a limit) heads the table.
	class := map[string]int{"b-beyond": 3, "b-within": 2, "b-super": 2, "b-slow": 1, "b-near": 1, "b-under": 1}
	cells := regexp.MustCompile(`(?s)<td class="n">([^<]*)</td><td><span class="chip (b-[a-z]+)">`).FindAllStringSubmatch(rows, -1)
	if len(cells) != 200 || cells[0][2] != "b-beyond" {
		t.Fatalf("%d summary rows with a band, the first %v; want 200 headed by one beyond an inhibitor's reach", len(cells), cells[:min(1, len(cells))])
	}
	for i := 1; i < len(cells); i++ {
		a, b := class[cells[i-1][2]], class[cells[i][2]]
		siA, _ := strconv.ParseFloat(strings.Replace(html.UnescapeString(cells[i-1][1]), "−", "-", 1), 64)
		siB, _ := strconv.ParseFloat(strings.Replace(html.UnescapeString(cells[i][1]), "−", "-", 1), 64)
		if b > a || (a == 2 && b == 2 && siB > siA) {
			t.Fatalf("the summary is not worst first: row %d (%s, SI %s) after row %d (%s, SI %s)", i+1, cells[i][2], cells[i][1], i, cells[i-1][2], cells[i-1][1])
		}
	}
	// The contents name each section with its date.
	toc := regexp.MustCompile(`(?s)<nav class="toc".*?</nav>`).FindString(page)
	if n := len(regexp.MustCompile(`invented water \d+</a> <span class="muted">· 2026-\d\d-\d\d</span>`).FindAllString(toc, -1)); n != 5 {
		t.Errorf("%d contents entries with a date, want 5", n)
	}
}

// TestHTMLNoDose: a water already beyond its target in the direction the
// reagent moves it (the demo tower water, LSI +1.4, against LSI +2 with
// sulfuric acid) gets a sentence that no dose is needed, not a dose table
// that says "not reached".
func TestHTMLNoDose(t *testing.T) {
	target, err := saturation.ParseTarget("lsi=2", nil)
	if err != nil {
		t.Fatal(err)
	}
	page := render(t, reports.Report{Samples: reports.ReportSamples(demoAssessments(t)),
		Options: reports.HTMLOptions{Plan: plan.Settings{Target: &target}}})
	if !strings.Contains(page, "No sulfuric acid is needed: the water is already at or beyond LSI &#43;2.00") {
		t.Error("no sentence that no dose is needed")
	}
	if strings.Contains(page, "not reached") {
		t.Error("the page says the dose was not reached")
	}
}

// TestMayDetailSameReport: plans computed with HTMLWriter.MayDetail as
// plan.Settings.Detailed (no operating window for a sample that can no
// longer get a section) give the same page, byte for byte, as plans with
// every window, and some windows were skipped.
func TestMayDetailSameReport(t *testing.T) {
	as := demoAssessments(t)
	page := func(lazy bool) (string, int) {
		hw, err := reports.NewHTMLWriter(reports.Report{Options: reports.HTMLOptions{Detail: 2}})
		if err != nil {
			t.Fatal(err)
		}
		var s plan.Settings
		if lazy {
			s.Detailed = hw.MayDetail
		}
		skipped := 0
		for i := range 4 * len(as) {
			a := as[i%len(as)]
			a.Name = fmt.Sprintf("invented water %02d", i+1)
			p := plan.Compute(a, s)
			if p.Window == nil {
				skipped++
			}
			if err := hw.Add(p); err != nil {
				t.Fatal(err)
			}
		}
		var buf bytes.Buffer
		if err := hw.Finish(&buf); err != nil {
			t.Fatal(err)
		}
		return buf.String(), skipped
	}
	all, none := page(false)
	lazy, skipped := page(true)
	if none != 0 {
		t.Fatalf("%d windows missing without MayDetail", none)
	}
	if skipped == 0 {
		t.Error("MayDetail skipped no window (every later sample has the risk of an earlier one)")
	}
	if lazy != all {
		t.Error("the page differs when the summary-only samples have no operating window")
	}
	if n := strings.Count(lazy, `-window" data-chart=`); n != 2 {
		t.Errorf("%d operating windows drawn, want 2 (one per section)", n)
	}
	t.Logf("%d of %d windows skipped", skipped, 4*len(as))
}
