package reports_test

import (
	"bytes"
	"errors"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// labAssessments reads an invented lab file, named name in the report,
// whose only problem is the note on the columns passed through
// (water.ErrNotUsed), if any.
func labAssessments(t *testing.T, path, name string) []saturation.Assessment {
	t.Helper()
	content, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	records, problems, err := water.Read(name, bytes.NewReader(content), water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range problems {
		if !errors.Is(p, water.ErrNotUsed) {
			t.Fatalf("%s: %v", path, p)
		}
	}
	return saturation.AssessRecords(name, records, saturation.Options{})
}

// TestReportLabChecks: the data-quality part of a sample says each check
// of the lab's extra measurements that ran (what was compared, the result,
// the verdict) and lists what the lab reported that the calculation does
// not use, with values and units, in client words. The files are the
// invented Kestrel Fen export (water/testdata/lab) and sea intake.
// Hardness by calculation is 2.497 Ca + 4.118 Mg (Standard Methods 2340 B,
// from memory): 249.2 mg/L as CaCO3 for the makeup, 747.5 for the towers.
// Seawater of practical salinity 35 has a conductivity of about 53.1 mS/cm
// at 25 °C (UNESCO 1981 PSS-78, from memory).
func TestReportLabChecks(t *testing.T) {
	as := append(labAssessments(t, "../water/testdata/lab/kestrel_fen_lab.csv", "lab.csv"),
		labAssessments(t, "../cmd/scalerisk/testdata/kestrel_fen_seawater.csv", "sea.csv")...)
	page := render(t, reports.Report{Samples: reports.ReportSamples(as)})
	text := strings.Join(strings.Fields(visibleText(page)), " ")
	checkClientText(t, "lab checks", text)

	for _, c := range []struct{ line, verdict string }{
		{"Total hardness reported by the lab, 250 mg/L as CaCO3, against ", "ok"},
		{"Total hardness reported by the lab, 180 mg/L as CaCO3, against ", "check"},
		{"P-alkalinity reported by the lab, 20 mg/L as CaCO3, against the pH, 7.60;", "check"},
		{"P-alkalinity reported by the lab, 150 mg/L as CaCO3, against the total alkalinity, 120;", "check"},
		{"P-alkalinity reported by the lab, 0 mg/L as CaCO3, against the total alkalinity, 180;", "ok"},
		{"Salinity of a seawater-like water (mostly sodium and chloride)", "ok"},
	} {
		re := regexp.MustCompile(`<li>` + regexp.QuoteMeta(c.line) + `[^<]*<span class="chip v-[a-z]+">` + c.verdict + `</span></li>`)
		if !re.MatchString(page) {
			t.Errorf("no check line %q… with verdict %q", c.line, c.verdict)
		}
	}
	const tolCaCO3 = 0.5 // mg/L as CaCO3: the handbook factors are rounded to 4 figures
	for _, want := range []float64{249.2, 747.5} {
		m := regexp.MustCompile(`Total hardness reported by the lab, \d+ mg/L as CaCO3, against ([\d.]+) from the calcium and magnesium`).FindAllStringSubmatch(text, -1)
		found := false
		for _, g := range m {
			if v, _ := strconv.ParseFloat(g[1], 64); v >= want-tolCaCO3 && v <= want+tolCaCO3 {
				found = true
			}
		}
		if !found {
			t.Errorf("no hardness check against Ca + Mg = %g ± %g mg/L as CaCO3 (Standard Methods 2340 B); lines %q", want, tolCaCO3, m)
		}
	}
	m := regexp.MustCompile(`practical salinity (\d+\.\d+) from the measured conductivity \(PSS-78\) against (\d+\.\d+) from the composition`).FindStringSubmatch(text)
	const tolSalinity = 0.1
	if m == nil {
		t.Fatal("the salinity check does not say what it compared")
	}
	for _, s := range m[1:] {
		if v, _ := strconv.ParseFloat(s, 64); v < 35-tolSalinity || v > 35+tolSalinity {
			t.Errorf("practical salinity %s, want 35 ± %g (UNESCO 1981)", s, tolSalinity)
		}
	}

	// Total hardness and P-alkalinity are used in the checks above, so they
	// are not among the values the calculation does not use.
	const reported = "Also reported by the lab, not used in the calculation: " +
		"turbidity 0.8 NTU; TOC 2.1 mg/L; free chlorine 0.3 mg/L; colour 5 Hazen; Sampled by R. Alder."
	if !strings.Contains(text, reported) {
		t.Errorf("the makeup's unused lab values are not listed as\n%s", reported)
	}
	if n := strings.Count(text, "Also reported by the lab"); n != 3 {
		t.Errorf("%d lists of unused lab values, want 3 (the side stream, with only hardness and P-alkalinity, and the sea intake have none)", n)
	}
}

// TestReportLabUnchecked: a total hardness that no check can use (the
// analysis has no calcium or magnesium) is still shown with the lab
// checks, said not checked; it is not listed as not used. The water is an
// invented Kestrel Fen condensate.
func TestReportLabUnchecked(t *testing.T) {
	as := assessFile(t, "condensate.csv", []byte("name,temperature [C],pH,Na [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3],"+
		"total hardness [mg/L as CaCO3],P-alkalinity [mg/L as CaCO3]\nKestrel Fen condensate,40,8.6,12,5,20,1,4\n"))
	page := render(t, reports.Report{Samples: reports.ReportSamples(as)})
	text := strings.Join(strings.Fields(visibleText(page)), " ")
	checkClientText(t, "unchecked lab value", text)
	re := regexp.MustCompile(`<li>Total hardness reported by the lab, 1 mg/L as CaCO3: not checked, as the analysis gives neither calcium nor magnesium\.` +
		`[^<]*<span class="chip v-none">not checked</span></li>`)
	if !re.MatchString(page) {
		t.Error("the hardness no check could use is not shown as not checked")
	}
	if !strings.Contains(text, "P-alkalinity reported by the lab, 4 mg/L as CaCO3, against the total alkalinity, 20;") ||
		strings.Contains(text, "P-alkalinity reported by the lab, 4 mg/L as CaCO3: not checked") {
		t.Error("the P-alkalinity check that ran is missing, or said not checked")
	}
	if strings.Contains(text, "Also reported by the lab") {
		t.Error("total hardness or P-alkalinity listed as not used in the calculation")
	}
}
