package main

import (
	"encoding/csv"
	"encoding/json"
	"slices"
	"strings"
	"testing"
)

// TestLabExport: an invented Kestrel Fen lab export with turbidity, TOC,
// free chlorine, colour, total hardness, P- and M-alkalinity and a column
// the reader does not know is assessed without editing: every sample is
// computed (exit 0), the columns are named once on stderr as not used in
// the equilibrium, and the values come through in JSON and CSV. Total
// hardness and P-alkalinity are used (in the data-quality checks): they
// are not named on stderr nor among other_analytes, and come through with
// the quality.
func TestLabExport(t *testing.T) {
	const file = "testdata/kestrel_fen_lab.csv"
	r := mustRun(t, 0, "", "assess", file, "--format", "json")
	if n := strings.Count(r.stderr, "not used in the equilibrium"); n != 1 || !strings.Contains(r.stderr, `"Turbidity [NTU]"`) ||
		strings.Contains(r.stderr, "hardness") || strings.Contains(r.stderr, "P-alkalinity") {
		t.Errorf("stderr names the other columns %d times, want once, without the checked hardness and P-alkalinity:\n%s", n, r.stderr)
	}
	var doc struct {
		Samples []struct {
			Name          string
			Error         *string
			OtherAnalytes []struct{ Column, Name, Value string } `json:"other_analytes"`
			Quality       struct {
				Flags         []string
				TotalHardness *float64 `json:"total_hardness_mg_per_l_as_caco3"`
				PAlkalinity   *float64 `json:"p_alkalinity_mg_per_l_as_caco3"`
			}
		}
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Samples) != 4 {
		t.Fatalf("%d samples, want 4", len(doc.Samples))
	}
	first := doc.Samples[0]
	if first.Error != nil || len(first.OtherAnalytes) != 5 || first.OtherAnalytes[0].Column != "Turbidity [NTU]" ||
		first.OtherAnalytes[0].Name != "turbidity" || first.OtherAnalytes[0].Value != "0.8" {
		t.Errorf("first sample: error %v, other_analytes %+v", first.Error, first.OtherAnalytes)
	}
	if q := first.Quality; q.TotalHardness == nil || *q.TotalHardness != 250 || q.PAlkalinity == nil || *q.PAlkalinity != 0 {
		t.Errorf("first sample: quality total hardness %v, P-alkalinity %v; want 250 and 0 as in the file", q.TotalHardness, q.PAlkalinity)
	}
	if flags := strings.Join(doc.Samples[1].Quality.Flags, "\n"); !strings.Contains(flags, "total hardness 180 mg/L as CaCO3 differs from Ca + Mg") {
		t.Errorf("tower A: no hardness flag in\n%s", flags)
	}
	csvOut := mustRun(t, 0, "", "assess", file, "--format", "csv").stdout
	if !strings.Contains(csvOut, "Turbidity [NTU]=0.8; TOC [mg/L]=2.1") || strings.Contains(csvOut, "hardness [mg/L as CaCO3]=") {
		t.Errorf("CSV lacks the other analytes, or lists the checked hardness among them:\n%s", csvOut)
	}
	rows, err := csv.NewReader(strings.NewReader(csvOut)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	th, pa := slices.Index(rows[0], "total_hardness_mg_per_l_as_caco3"), slices.Index(rows[0], "p_alkalinity_mg_per_l_as_caco3")
	if th < 0 || pa < 0 || rows[1][th] != "250" || rows[1][pa] != "0" || rows[3][th] != "" || rows[3][pa] != "20" {
		t.Errorf("CSV hardness and P-alkalinity columns at %d and %d, want 250, 0 (makeup) and blank, 20 (tower B):\n%s", th, pa, csvOut)
	}
}

// TestDateFormat: day-first dates of an invented Kestrel Fen file are
// refused without --date-format (file, line and column named; the ISO row
// still computed; exit 2) and read with it (exit 0); an unknown format is
// bad input.
func TestDateFormat(t *testing.T) {
	const file = "testdata/kestrel_fen_dates.csv"
	r := mustRun(t, 2, "", "assess", file, "--format", "csv")
	if !strings.Contains(r.stderr, file+":3:2: column \"Date\"") || !strings.Contains(r.stderr, "--date-format DD/MM/YYYY or MM/DD/YYYY") {
		t.Errorf("stderr does not name the cell and the formats:\n%s", r.stderr)
	}
	if !strings.Contains(r.stdout, "Kestrel Fen makeup,"+file+",2,") {
		t.Errorf("the ISO row was not computed:\n%s", r.stdout)
	}
	mustRun(t, 0, "", "assess", file, "--date-format", "DD/MM/YYYY")
	if r := mustRun(t, 2, "", "assess", file, "--date-format", "DD/MM"); !strings.Contains(r.stderr, "--date-format") {
		t.Errorf("unknown format: %q", r.stderr)
	}
}

// TestSeawaterSample: an invented Kestrel Fen sea intake of standard
// seawater composition (Millero et al. 2008 reference composition scaled to
// mg/L; from memory) with its conductivity, 53.1 mS/cm at 25 °C (PSS-78,
// S = 35), passes: it is checked by practical salinity, not by the
// fresh-water conductivity criteria, and carries no data-quality flag.
func TestSeawaterSample(t *testing.T) {
	r := mustRun(t, 0, "", "assess", "testdata/kestrel_fen_seawater.csv", "--format", "json")
	var doc struct {
		Samples []struct {
			Quality struct {
				Seawater       bool     `json:"seawater"`
				SalinityFromEC float64  `json:"practical_salinity_from_ec"`
				Flags          []string `json:"flags"`
			}
		}
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	const tolS = 0.1 // practical salinity; 53.1 vs 53.065 mS/cm reads S = 35.03
	q := doc.Samples[0].Quality
	if !q.Seawater || len(q.Flags) != 0 || q.SalinityFromEC < 35-tolS || q.SalinityFromEC > 35+tolS {
		t.Errorf("sea intake: seawater %v, S from EC %g (want 35 ± %g), flags %q", q.Seawater, q.SalinityFromEC, tolS, q.Flags)
	}
	text := mustRun(t, 0, "", "assess", "testdata/kestrel_fen_seawater.csv").stdout
	if !strings.Contains(oneLine(text), "practical salinity from composition 34.99, from EC 35.03 (PSS-78) 0.95–1.05 ok") {
		t.Errorf("text lacks the salinity check:\n%s", text)
	}
}

// TestAssessPeopleOutputs: --species prints the speciation table in the
// text; the CSV carries the date (as ISO, from a day-first file read with
// --date-format), the data-quality flags and each mineral's risk band.
func TestAssessPeopleOutputs(t *testing.T) {
	text := mustRun(t, 0, "", "assess", "testdata/kestrel_fen_seawater.csv", "--species").stdout
	if !strings.Contains(text, "  Species\n") || !strings.Contains(oneLine(text), "species molality (mol/kg) activity coefficient activity") ||
		!strings.Contains(text, "Na[+]") {
		t.Errorf("--species: no speciation table in\n%s", text)
	}
	if plain := mustRun(t, 0, "", "assess", "testdata/kestrel_fen_seawater.csv").stdout; strings.Contains(plain, "  Species\n") {
		t.Errorf("species table printed without --species")
	}
	out := mustRun(t, 0, "", "assess", "testdata/kestrel_fen_dates.csv", "--date-format", "DD/MM/YYYY", "--format", "csv").stdout
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := func(name string) int { return slices.Index(rows[0], name) }
	for _, c := range []string{"date", "role", "quality_flags", "band_calcite"} {
		if col(c) < 0 {
			t.Fatalf("CSV lacks column %q: %v", c, rows[0])
		}
	}
	if got := rows[3][col("date")]; got != "2026-02-14 08:30" {
		t.Errorf("date of row 3 %q, want 2026-02-14 08:30", got)
	}
	if got := rows[3][col("band_calcite")]; got == "" || rows[1][col("quality_flags")] == "" {
		t.Errorf("calcite band %q, first quality flags %q: want both written", got, rows[1][col("quality_flags")])
	}
}

// TestLabExportWhole is the "done when": one invented Kestrel Fen
// export with the extra columns, day-first dates (one with a time) and a
// seawater sample is read without editing: exit 0 with --date-format, the
// dates as ISO, the extra columns passed through, and the seawater held to
// PSS-78 (no flag; its total hardness, 6400 mg/L as CaCO3 against Ca + Mg
// 6463 by Standard Methods 2340 B, within 10 %).
func TestLabExportWhole(t *testing.T) {
	const file = "testdata/kestrel_fen_export.csv"
	mustRun(t, 2, "", "assess", file) // the dates need --date-format
	r := mustRun(t, 0, "", "assess", file, "--date-format", "DD/MM/YYYY", "--format", "json")
	var doc struct {
		Samples []struct {
			Name          string
			Date          string
			OtherAnalytes []struct{ Column, Value string } `json:"other_analytes"`
			Quality       struct {
				Seawater bool
				Flags    []string
			}
		}
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Samples) != 2 {
		t.Fatalf("%d samples, want 2", len(doc.Samples))
	}
	makeup, sea := doc.Samples[0], doc.Samples[1]
	if makeup.Date != "2026-02-03 09:15" || sea.Date != "2026-02-14" {
		t.Errorf("dates %q and %q, want 2026-02-03 09:15 and 2026-02-14", makeup.Date, sea.Date)
	}
	if len(makeup.OtherAnalytes) != 5 || len(sea.OtherAnalytes) != 3 {
		t.Errorf("other analytes %+v and %+v, want 5 and 3 (total hardness and P-alkalinity are checked, not passed through)",
			makeup.OtherAnalytes, sea.OtherAnalytes)
	}
	if !sea.Quality.Seawater || len(sea.Quality.Flags) != 0 {
		t.Errorf("sea intake: seawater %v, flags %q; want seawater-like and no flag", sea.Quality.Seawater, sea.Quality.Flags)
	}
	if makeup.Quality.Seawater {
		t.Errorf("makeup taken as seawater-like")
	}
}
