package water_test

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestReadLabExport reads an invented laboratory export of the Kestrel Fen
// plant with the columns a laboratory sends besides the speciated ones:
// every sample is computed, the other columns are kept as written and
// noted once, and total hardness and P-alkalinity are checked (read as
// numbers, so neither noted nor among the other values).
func TestReadLabExport(t *testing.T) {
	const path = "testdata/lab/kestrel_fen_lab.csv"
	records, problems, err := csvReadFile(t, path, water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(problems) != 1 || !errors.Is(problems[0], water.ErrNotUsed) {
		t.Fatalf("problems %v, want one note wrapping ErrNotUsed", problems)
	}
	wantNote := path + `:1: "Turbidity [NTU]", "TOC [mg/L]", ` +
		`"Free chlorine [mg/L]", "Colour [Hazen]" kept and passed through; "Sampled by" not recognised`
	if !strings.HasPrefix(problems[0].Error(), wantNote) || !strings.HasSuffix(problems[0].Error(), "(not used in the equilibrium)") {
		t.Errorf("note:\n%s\nwant it to start\n%s", problems[0], wantNote)
	}
	if len(records) != 4 {
		t.Fatalf("%d records, want 4", len(records))
	}
	for _, r := range records {
		if r.Err != nil {
			t.Fatalf("%s: %v", r.Name, r.Err)
		}
	}
	first := records[0].Analysis
	wantOther := []water.OtherValue{
		{Column: "Turbidity [NTU]", Name: "turbidity", Value: "0.8"},
		{Column: "TOC [mg/L]", Name: "TOC", Value: "2.1"},
		{Column: "Free chlorine [mg/L]", Name: "free chlorine", Value: "0.3"},
		{Column: "Colour [Hazen]", Name: "colour", Value: "5"},
		{Column: "Sampled by", Value: "R. Alder"},
	}
	if !reflect.DeepEqual(first.Other, wantOther) {
		t.Errorf("other values\n%+v\nwant\n%+v", first.Other, wantOther)
	}
	// Ammonia is an analyte (data/analytes.csv), not passed through.
	if !first.Measured[water.NH4] {
		t.Errorf("ammonia-N not read as the NH4 component")
	}
	if got := records[2].Analysis.Other; len(got) != 2 || got[1] != (water.OtherValue{Column: "TOC [mg/L]", Name: "TOC", Value: "n.d."}) {
		t.Errorf("tower B other values %+v, want turbidity and TOC as written", got)
	}
	const tol = 1e-9 // mg/L as CaCO3: read as written
	if th := first.TotalHardness; math.Abs(th-250) > tol || !math.IsNaN(records[2].Analysis.TotalHardness) {
		t.Errorf("total hardness %g and %g, want 250 and NaN (blank)", th, records[2].Analysis.TotalHardness)
	}
	// Expected flags: hardness by calculation 2.497 Ca + 4.118 Mg (Standard
	// Methods 2340 B, from memory): 249 mg/L for the makeup (agrees with
	// 250), 747.5 for the towers (tower A reports 180: flagged); P-alkalinity
	// above M (side stream) and at pH 7.6 (tower B) flagged.
	for i, want := range []string{"", "total hardness 180 mg/L as CaCO3 differs from Ca + Mg (748", "P-alkalinity 20 mg/L as CaCO3 at pH 7.60", "P-alkalinity 150 mg/L as CaCO3 exceeds the total (M-) alkalinity 120"} {
		var lab []string
		for _, f := range records[i].Analysis.Quality().Flags {
			if strings.Contains(f, "hardness") || strings.Contains(f, "P-alkalinity") {
				lab = append(lab, f)
			}
		}
		switch {
		case want == "" && len(lab) > 0:
			t.Errorf("%s: lab flags %q, want none", records[i].Name, lab)
		case want != "" && (len(lab) != 1 || !strings.HasPrefix(lab[0], want)):
			t.Errorf("%s: lab flags %q, want one starting %q", records[i].Name, lab, want)
		}
	}
}

// TestReadLabExportLong reads the long form of an invented Kestrel Fen
// export: an analyte the equilibrium does not use is kept with its
// qualifier, an unknown one too, and noted once; total hardness is read as
// a number for its check, and neither noted nor kept as an other value.
func TestReadLabExportLong(t *testing.T) {
	records, problems, err := csvReadFile(t, "testdata/lab/kestrel_fen_long.csv", water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(problems) != 1 || !errors.Is(problems[0], water.ErrNotUsed) ||
		!strings.Contains(problems[0].Error(), `: "turbidity", "TOC" kept and passed through; "Batch code" not recognised`) {
		t.Fatalf("problems %v, want one note naming the other analytes", problems)
	}
	if len(records) != 1 || records[0].Err != nil {
		t.Fatalf("records %+v, want one good sample", records)
	}
	a := records[0].Analysis
	a.Totals[water.C], a.CarbonKnown = a.Alkalinity, true // as if speciated; the carbon plays no part here
	want := []water.OtherValue{
		{Column: "turbidity [NTU]", Name: "turbidity", Value: "0.8"},
		{Column: "TOC [mg/L]", Name: "TOC", Value: "< 0.5"},
		{Column: "Batch code", Value: "K-17"},
	}
	if !reflect.DeepEqual(a.Other, want) {
		t.Errorf("other values\n%+v\nwant\n%+v", a.Other, want)
	}
	if math.Abs(a.TotalHardness-250) > 1e-9 {
		t.Errorf("total hardness %g, want 250", a.TotalHardness)
	}
}

// TestTransformDropsLabValues: a blend is not the sample, so its lab
// values (and the hardness check on them) go.
func TestTransformDropsLabValues(t *testing.T) {
	records, _, err := csvReadFile(t, "testdata/lab/kestrel_fen_lab.csv", water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	a := records[0].Analysis
	a.Totals[water.C], a.CarbonKnown = a.Alkalinity, true // as if speciated; the carbon plays no part here
	b, err := water.Blend([]water.Analysis{a, a}, []float64{0.5, 0.5})
	if err != nil {
		t.Fatal(err)
	}
	if b.Other != nil || !math.IsNaN(b.TotalHardness) || !math.IsNaN(b.PAlkalinity) {
		t.Errorf("blend keeps lab values: %+v %g %g", b.Other, b.TotalHardness, b.PAlkalinity)
	}
}

// TestQualityLabChecks: every lab check that ran is listed with what it
// compared and its outcome, on the invented Kestrel Fen export. Ca + Mg as
// CaCO3 is the hardness by calculation 2.497 Ca + 4.118 Mg (Standard
// Methods 2340 B, from memory): 80 and 12 mg/L give 249.2, 240 and 36 give
// 747.5.
func TestQualityLabChecks(t *testing.T) {
	records, _, err := csvReadFile(t, "testdata/lab/kestrel_fen_lab.csv", water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	const tolCaCO3 = 0.5 // mg/L as CaCO3: the handbook factors are rounded to 4 figures
	type want struct {
		kind           water.LabCheckKind
		value, against float64
		pass           bool
	}
	for i, wants := range [][]want{
		{{water.HardnessCheck, 250, 249.2, true}, {water.PAlkalinityCheck, 0, 180, true}, {water.PAlkalinityPHCheck, 0, 7.9, true}},
		{{water.HardnessCheck, 180, 747.5, false}, {water.PAlkalinityCheck, 0, 540, true}, {water.PAlkalinityPHCheck, 0, 8.1, true}},
		{{water.PAlkalinityCheck, 20, 540, true}, {water.PAlkalinityPHCheck, 20, 7.6, false}}, // no hardness reported
		{{water.HardnessCheck, 750, 747.5, true}, {water.PAlkalinityCheck, 150, 120, false}, {water.PAlkalinityPHCheck, 150, 8.6, true}},
	} {
		a := records[i].Analysis
		got := a.Quality().Lab
		if len(got) != len(wants) {
			t.Errorf("%s: %d lab checks %+v, want %d", a.Name, len(got), got, len(wants))
			continue
		}
		for j, w := range wants {
			g := got[j]
			if g.Kind != w.kind || math.Abs(g.Value-w.value) > tolCaCO3 || math.Abs(g.Against-w.against) > tolCaCO3 ||
				g.Pass != w.pass || g.Limit == "" {
				t.Errorf("%s: check %d = %+v, want kind %d, %g against %g ± %g, pass %v, with its limit in words",
					a.Name, j, g, w.kind, w.value, w.against, tolCaCO3, w.pass)
			}
		}
	}
}
