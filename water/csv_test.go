package water_test

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"

	"scalerisk/water"
)

// csvReadFile reads a file of testdata with Read, naming it by its path.
func csvReadFile(t testing.TB, path string, opt water.ReadOptions) ([]water.Record, []error, error) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	return water.Read(path, f, opt)
}

// csvReadString reads text with Read as the file "in.csv".
func csvReadString(text string, opt water.ReadOptions) ([]water.Record, []error, error) {
	return water.Read("in.csv", strings.NewReader(text), opt)
}

// csvBadFiles says, for each file of testdata/bad, how many samples are
// still computed and how many records it has; total -1 means the whole file
// is refused (Read's error). The error lines are in the sibling .want file.
var csvBadFiles = map[string]struct{ good, total int }{
	"above_range.csv":                    {1, 2},
	"alkalinity_as_caco3_for_silica.csv": {1, 2},
	"bad_quote.csv":                      {2, 3},
	"blank_lines.csv":                    {0, -1},
	"density_impossible.csv":             {1, 2},
	"duplicate_column.csv":               {1, 3},
	"empty.csv":                          {0, -1},
	"header_only.csv":                    {0, -1},
	"inf_value.csv":                      {1, 2},
	"latin1.csv":                         {0, -1},
	"long_form_bad_qualifier.csv":        {1, 4},
	"long_form_bad_value.csv":            {1, 2},
	"long_form_duplicate_analyte.csv":    {2, 3},
	"long_form_missing_column.csv":       {0, -1},
	"long_form_no_unit.csv":              {1, 2},
	"long_form_ragged_row.csv":           {1, 3},
	"long_form_unknown_column.csv":       {1, 2},
	"long_form_unknown_unit.csv":         {1, 2},
	"nan_value.csv":                      {1, 2},
	"negative.csv":                       {2, 3},
	"no_unit.csv":                        {1, 3},
	"no_usable_header.csv":               {0, -1},
	"nonnumeric.csv":                     {2, 3},
	"not_csv.csv":                        {0, -1},
	"ph_impossible.csv":                  {2, 4},
	"ragged_row.csv":                     {2, 4},
	"semicolon.csv":                      {0, -1},
	"silica_meq.csv":                     {1, 2},
	"temperature_f_out_of_range.csv":     {1, 2},
	"thousands_separator.csv":            {1, 2},
	"too_salty.csv":                      {1, 2},
	"nacl_1000g.csv":                     {1, 2}, // issue 12: was accepted with range warnings only
	"chloride_1e8.csv":                   {1, 2}, // issue 12: printed a 300-digit density, named no column
	"unknown_unit.csv":                   {1, 2},
	"unterminated_quote.csv":             {1, 2},
	"utf16.csv":                          {0, -1},
	"value_without_header.csv":           {1, 2},
	"wrong_unit_kind.csv":                {1, 2},
}

// TestReadBadFiles reads every file of testdata/bad and compares the error
// lines (Read's error, or the problems then the error records in file
// order) with the file's .want, and counts the samples still computed.
func TestReadBadFiles(t *testing.T) {
	paths, err := filepath.Glob(filepath.Join("testdata", "bad", "*.csv"))
	if err != nil {
		t.Fatal(err)
	}
	if len(paths) < 22 {
		t.Fatalf("%d bad-input files, want at least 22", len(paths))
	}
	for _, path := range paths {
		path = filepath.ToSlash(path)
		name := filepath.Base(path)
		t.Run(strings.TrimSuffix(name, ".csv"), func(t *testing.T) {
			want, ok := csvBadFiles[name]
			if !ok {
				t.Fatalf("%s is not listed in csvBadFiles", name)
			}
			wantText, err := os.ReadFile(strings.TrimSuffix(path, ".csv") + ".want")
			if err != nil {
				t.Fatal(err)
			}
			records, problems, err := csvReadFile(t, path, water.ReadOptions{})
			var got []string
			var all []error
			if err != nil {
				all = append(all, err)
				if records != nil || problems != nil {
					t.Errorf("records and problems returned with the error %v", err)
				}
			}
			all = append(all, problems...)
			good := 0
			for _, r := range records {
				if r.Err != nil {
					all = append(all, r.Err)
				} else {
					good++
				}
				if r.Line < 1 || r.Name == "" {
					t.Errorf("record %+v has no line or no name", r)
				}
			}
			for _, e := range all {
				var ie *water.InputError
				if !errors.As(e, &ie) || ie.File != path {
					t.Errorf("error %v is not an *InputError naming %s", e, path)
				}
				got = append(got, e.Error())
			}
			wantLines := strings.Split(strings.TrimRight(string(wantText), "\n"), "\n")
			if g, w := strings.Join(got, "\n"), strings.Join(wantLines, "\n"); g != w {
				t.Errorf("errors:\n%s\nwant:\n%s", g, w)
			}
			for _, line := range got {
				if last, _ := utf8.DecodeLastRuneInString(line); unicode.IsPunct(last) && last != ')' && last != '"' {
					t.Errorf("message ends in punctuation: %s", line)
				}
			}
			if want.total < 0 {
				if err == nil {
					t.Errorf("file read with no error, want it refused")
				}
				return
			}
			if err != nil {
				t.Fatalf("file refused: %v", err)
			}
			if good != want.good || len(records) != want.total {
				t.Errorf("%d of %d samples computed, want %d of %d", good, len(records), want.good, want.total)
			}
		})
	}
}

// TestReadLongLine reads a file with a 50 MB line: Read refuses it at that
// line without holding the line in memory.
func TestReadLongLine(t *testing.T) {
	path := filepath.Join(t.TempDir(), "long_line.csv")
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	w := bufio.NewWriter(f)
	w.WriteString("name,Ca [mg/L]\nWell 1,40\nWell 2,")
	chunk := bytes.Repeat([]byte("1234567890"), 1000)
	for written := 0; written < 50<<20; written += len(chunk) {
		w.Write(chunk)
	}
	w.WriteString("\nWell 3,41\n")
	if err := w.Flush(); err != nil {
		t.Fatal(err)
	}
	if err := f.Close(); err != nil {
		t.Fatal(err)
	}

	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	records, _, err := csvReadFile(t, path, water.ReadOptions{})
	runtime.ReadMemStats(&after)

	want := path + ":3: line longer than 1 MiB"
	if err == nil || err.Error() != want {
		t.Fatalf("Read error = %v, want %s", err, want)
	}
	var ie *water.InputError
	if !errors.As(err, &ie) || ie.Line != 3 {
		t.Errorf("error %#v is not an *InputError at line 3", err)
	}
	if records != nil {
		t.Errorf("records returned with the error")
	}
	// A line limit of 1 MiB lets the csv reader grow its buffer to a few
	// MiB; the 50 MB line itself must never be allocated.
	if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 16<<20 {
		t.Errorf("Read allocated %d MiB for a file with a 50 MB line, want under 16 MiB", alloc>>20)
	}
}

// TestReadLineLimitBoundary checks that a line of exactly MaxLineBytes is
// read (its value is an error, quoted in 40 characters) and one byte more is
// refused.
func TestReadLineLimitBoundary(t *testing.T) {
	head := "name,Ca [mg/L]\n"
	prefix := "Well 1,"
	cell := strings.Repeat("x", water.MaxLineBytes-len(prefix))
	records, _, err := csvReadString(head+prefix+cell+"\nWell 2,40\n", water.ReadOptions{})
	if err != nil {
		t.Fatalf("line of MaxLineBytes refused: %v", err)
	}
	want := `in.csv:2:2: column "Ca [mg/L]": value "` + strings.Repeat("x", 40) + `…": not a number`
	if len(records) != 2 || records[0].Err == nil || records[0].Err.Error() != want || records[1].Err != nil {
		t.Fatalf("records = %+v, want an error %s and one good sample", records, want)
	}
	_, _, err = csvReadString(head+prefix+cell+"x\nWell 2,40\n", water.ReadOptions{})
	if err == nil || err.Error() != "in.csv:2: line longer than 1 MiB" {
		t.Errorf("line of MaxLineBytes+1: error %v, want in.csv:2: line longer than 1 MiB", err)
	}
}

// csvSame reports whether x and y agree to a relative 1e-12 (NaN equals
// NaN).
func csvSame(x, y float64) bool {
	if math.IsNaN(x) || math.IsNaN(y) {
		return math.IsNaN(x) && math.IsNaN(y)
	}
	return math.Abs(x-y) <= 1e-12*math.Max(math.Abs(x), math.Abs(y))
}

// TestReadWideLongAgree reads the same invented plant waters written in the
// wide and in the long form: every total and field must agree to 1e-12.
func TestReadWideLongAgree(t *testing.T) {
	wide, wp, err := csvReadFile(t, "testdata/good/plant_wide.csv", water.ReadOptions{})
	if err != nil || len(wp) > 0 {
		t.Fatalf("wide: %v %v", err, wp)
	}
	long, lp, err := csvReadFile(t, "testdata/good/plant_long.csv", water.ReadOptions{})
	if err != nil || len(lp) > 0 {
		t.Fatalf("long: %v %v", err, lp)
	}
	if len(wide) != 3 || len(long) != 3 {
		t.Fatalf("%d wide and %d long samples, want 3 and 3", len(wide), len(long))
	}
	for i := range wide {
		w, l := wide[i], long[i]
		if w.Err != nil || l.Err != nil {
			t.Fatalf("sample %d: %v / %v", i, w.Err, l.Err)
		}
		a, b := w.Analysis, l.Analysis
		if w.Name != l.Name || a.Name != b.Name || a.Date != b.Date {
			t.Errorf("sample %d: %q %q / %q %q", i, a.Name, a.Date, b.Name, b.Date)
		}
		for _, c := range water.Components() {
			if !csvSame(a.Total(c), b.Total(c)) || a.Measured[c] != b.Measured[c] {
				t.Errorf("%s: total %s wide %.15g (measured %v), long %.15g (measured %v)",
					a.Name, c, a.Total(c), a.Measured[c], b.Total(c), b.Measured[c])
			}
		}
		fields := []struct {
			name string
			w, l float64
		}{
			{"temperature", a.Temperature, b.Temperature},
			{"pH", a.PH, b.PH},
			{"pH temperature", a.PHTemperature, b.PHTemperature},
			{"pressure", a.Pressure, b.Pressure},
			{"alkalinity", a.Alkalinity, b.Alkalinity},
			{"carbonate alkalinity", a.CarbonateAlkalinity, b.CarbonateAlkalinity},
			{"density", a.Density, b.Density},
			{"water per litre", a.WaterPerLitre, b.WaterPerLitre},
			{"TDS", a.MeasuredTDS, b.MeasuredTDS},
			{"conductivity", a.MeasuredConductivity, b.MeasuredConductivity},
		}
		for _, f := range fields {
			if !csvSame(f.w, f.l) {
				t.Errorf("%s: %s wide %.15g, long %.15g", a.Name, f.name, f.w, f.l)
			}
		}
		if a.DensityEstimated != b.DensityEstimated || len(a.BelowDetection) != len(b.BelowDetection) ||
			len(a.Warnings) != len(b.Warnings) {
			t.Errorf("%s: notes differ: %q %q / %q %q", a.Name, a.BelowDetection, a.Warnings, b.BelowDetection, b.Warnings)
		}
	}
	// One value by hand: 720 mg/L as CaCO3 of Ca is 720/100.086 mmol/L
	// (CaCO3 100.086 g/mol from IUPAC 2021 abridged atomic weights).
	tower := wide[1].Analysis
	perLitre := tower.Total(water.Ca) * tower.WaterPerLitre
	if want := 0.720 / 100.086; math.Abs(perLitre-want) > 1e-6*want {
		t.Errorf("Tower B Ca = %.6g mol/L, want %.6g (720 mg/L as CaCO3)", perLitre, want)
	}
	// RO-1: Fe "<0.01" is taken as 0.005 under the default policy.
	if got := wide[2].Analysis.BelowDetection; len(got) != 2 || got[0] != "Fe <0.01 mg/L taken as 0.005" {
		t.Errorf("RO-1 below-detection notes = %q", got)
	}
}

// TestReadHeaderSpellings reads headers written the many ways laboratories
// write them.
func TestReadHeaderSpellings(t *testing.T) {
	nan := math.NaN()
	cases := []struct {
		header, cell string
		get          func(water.Analysis) float64
		want         float64
	}{
		{"temperature [C]", "30", func(a water.Analysis) float64 { return a.Temperature }, 30},
		{"temp (°C)", "30", func(a water.Analysis) float64 { return a.Temperature }, 30},
		{"T [°F]", "86", func(a water.Analysis) float64 { return a.Temperature }, 30},
		{"Temperature [K]", "303.15", func(a water.Analysis) float64 { return a.Temperature }, 30},
		{"pH_temperature [C]", "21", func(a water.Analysis) float64 { return a.PHTemperature }, 21},
		{"ph temp [C]", "21", func(a water.Analysis) float64 { return a.PHTemperature }, 21},
		{"temperature of pH (C)", "21", func(a water.Analysis) float64 { return a.PHTemperature }, 21},
		{"PH", "7.25", func(a water.Analysis) float64 { return a.PH }, 7.25},
		{"pH [su]", "7.25", func(a water.Analysis) float64 { return a.PH }, 7.25},
		{"EC [mS/cm]", "1.2", func(a water.Analysis) float64 { return a.MeasuredConductivity }, 1200},
		{"conductivity [µS/cm]", "1200", func(a water.Analysis) float64 { return a.MeasuredConductivity }, 1200},
		{"Specific Conductance (umho/cm)", "1200", func(a water.Analysis) float64 { return a.MeasuredConductivity }, 1200},
		{"tds [mg/L]", "800", func(a water.Analysis) float64 { return a.MeasuredTDS }, 800},
		{"Total Dissolved Solids (g/L)", "0.8", func(a water.Analysis) float64 { return a.MeasuredTDS }, 800},
		{"density [g/mL]", "1.02", func(a water.Analysis) float64 { return a.Density }, 1.02},
		{"pressure [kPa]", "202.65", func(a water.Analysis) float64 { return a.Pressure }, 2},
		{"pressure [psig]", "0", func(a water.Analysis) float64 { return a.Pressure }, 1},
		{"  Ca   [ mg/L ] ", "40.078", func(a water.Analysis) float64 { return a.Total(water.Ca) * a.WaterPerLitre }, 1e-3},
		{"calcium (mmol/L)", "1", func(a water.Analysis) float64 { return a.Total(water.Ca) * a.WaterPerLitre }, 1e-3},
		{"Fe(II) (mg/L)", "55.845", func(a water.Analysis) float64 { return a.Total(water.Fe) * a.WaterPerLitre }, 1e-3},
		{"nitrate-N [mg/L]", "14.007", func(a water.Analysis) float64 { return a.Total(water.N) * a.WaterPerLitre }, 1e-3},
		{"Total Alkalinity [mg/L as CaCO3]", "100.086", func(a water.Analysis) float64 { return a.Alkalinity * a.WaterPerLitre }, 2e-3},
		{"comment", "sampled after rain", func(a water.Analysis) float64 { return a.PH }, nan},
	}
	for _, c := range cases {
		records, problems, err := csvReadString("name,"+c.header+"\nW,"+c.cell+"\n", water.ReadOptions{})
		if err != nil || len(problems) > 0 || len(records) != 1 || records[0].Err != nil {
			t.Errorf("%q: %v %v %+v", c.header, err, problems, records)
			continue
		}
		got := c.get(records[0].Analysis)
		if math.IsNaN(c.want) && math.IsNaN(got) {
			continue
		}
		if math.Abs(got-c.want) > 1e-9*math.Abs(c.want) {
			t.Errorf("%q = %s: got %.10g, want %.10g", c.header, c.cell, got, c.want)
		}
	}

	names := []struct{ header, want string }{
		{"name", "W"}, {"Sample", "W"}, {"sample name", "W"}, {"Sample_ID", "W"}, {"ID", "W"},
	}
	for _, n := range names {
		records, _, err := csvReadString(n.header+",Ca [mg/L]\nW,40\n", water.ReadOptions{})
		if err != nil || records[0].Name != n.want || records[0].Analysis.Name != n.want {
			t.Errorf("name column %q: %v %+v", n.header, err, records)
		}
	}
	records, _, err := csvReadString("Ca [mg/L]\n40\n\n41\n", water.ReadOptions{})
	if err != nil || len(records) != 2 || records[0].Name != "row 2" || records[1].Name != "row 4" {
		t.Errorf("no name column: %v %+v, want rows named by line", err, records)
	}
}

// TestReadGoodSpellingsFile reads testdata/good/header_spellings.csv: a BOM,
// padded headers, parentheses, CRLF line ends and aliases.
func TestReadGoodSpellingsFile(t *testing.T) {
	records, problems, err := csvReadFile(t, "testdata/good/header_spellings.csv", water.ReadOptions{})
	if err != nil || len(problems) > 0 || len(records) != 1 || records[0].Err != nil {
		t.Fatalf("%v %v %+v", err, problems, records)
	}
	a := records[0].Analysis
	checks := []struct {
		what      string
		got, want float64
	}{
		{"temperature, °C", a.Temperature, 18.5},
		{"pH temperature, °C", a.PHTemperature, 21},
		{"pH", a.PH, 7.4},
		{"conductivity, µS/cm", a.MeasuredConductivity, 510},
		{"TDS, mg/L", a.MeasuredTDS, 380},
		{"pressure, atm (0 barg)", a.Pressure, 1},
		{"density, kg/L", a.Density, 1.000},
		{"Ca, mol/L", a.Total(water.Ca) * a.WaterPerLitre, 40.08e-3 / 40.078},
		{"Fe, mol/L", a.Total(water.Fe) * a.WaterPerLitre, 0.05e-3 / 55.845},
		{"free CO2, mol/L (a check, not the carbon total)", a.FreeCO2 * a.WaterPerLitre, 4.4e-3 / 44.009},
		{"alkalinity (HCO3), eq/L", a.Alkalinity * a.WaterPerLitre, 183.05e-3 / 61.016},
	}
	if a.Name != "North pond" {
		t.Errorf("name %q, want North pond", a.Name)
	}
	for _, c := range checks {
		if math.Abs(c.got-c.want) > 1e-9*c.want {
			t.Errorf("%s = %.10g, want %.10g", c.what, c.got, c.want)
		}
	}
}

// TestReadDetectionPolicy reads "<0.1" under each policy.
func TestReadDetectionPolicy(t *testing.T) {
	const text = "name,density [kg/L],Ba [mg/L],Na [mg/L]\nW,1.0,<0.1,n.d.\n"
	var totals [3]float64
	for i, p := range []water.DetectionPolicy{water.DetectionHalf, water.DetectionZero, water.DetectionLimit} {
		records, _, err := csvReadString(text, water.ReadOptions{Detection: p})
		if err != nil || records[0].Err != nil {
			t.Fatalf("%v: %v %v", p, err, records[0].Err)
		}
		a := records[0].Analysis
		totals[i] = a.Total(water.Ba) * a.WaterPerLitre * 137.33 * 1000 // mg/L
		wantNote := map[water.DetectionPolicy]string{
			water.DetectionHalf:  "Ba <0.1 mg/L taken as 0.05",
			water.DetectionZero:  "Ba <0.1 mg/L taken as 0",
			water.DetectionLimit: "Ba <0.1 mg/L taken as 0.1",
		}[p]
		if len(a.BelowDetection) != 1 || a.BelowDetection[0] != wantNote {
			t.Errorf("%v: notes %q, want %q", p, a.BelowDetection, wantNote)
		}
		if !a.Measured[water.Ba] || !a.Measured[water.Na] || a.Total(water.Na) != 0 {
			t.Errorf("%v: Ba and Na must be measured, Na 0: %v %v %g", p, a.Measured[water.Ba], a.Measured[water.Na], a.Total(water.Na))
		}
		found := false
		for _, w := range a.Warnings {
			found = found || w == "Na: not detected and no detection limit given: taken as 0"
		}
		if !found {
			t.Errorf("%v: no warning on n.d. Na in %q", p, a.Warnings)
		}
	}
	for i, want := range []float64{0.05, 0, 0.1} {
		if math.Abs(totals[i]-want) > 1e-9 {
			t.Errorf("Ba under policy %d = %.12g mg/L, want %g", i, totals[i], want)
		}
	}
}

func TestParseDetectionPolicy(t *testing.T) {
	for _, p := range []water.DetectionPolicy{water.DetectionHalf, water.DetectionZero, water.DetectionLimit} {
		got, err := water.ParseDetectionPolicy(" " + strings.ToUpper(p.String()) + " ")
		if err != nil || got != p {
			t.Errorf("ParseDetectionPolicy(%q) = %v, %v", p.String(), got, err)
		}
	}
	if _, err := water.ParseDetectionPolicy("third"); err == nil || err.Error() != `unknown detection policy "third" (want half, zero or limit)` {
		t.Errorf("ParseDetectionPolicy(third): %v", err)
	}
	if water.DetectionPolicy(0) != water.DetectionHalf {
		t.Errorf("the zero policy is not half")
	}
}

// TestReadLongFormGrouping checks that long-form rows are grouped by sample
// and date in order of first appearance.
func TestReadLongFormGrouping(t *testing.T) {
	const text = "Sample,Date,Parameter,Result,Units,Flag\n" +
		"B,2024-01-02,Ca,40,mg/L,\n" +
		"A,2024-01-02,Ca,41,mg/L,\n" +
		"B,2024-01-02,pH,7.7,,\n" +
		"B,2024-02-06,Ca,42,mg/L,\n" +
		"A,2024-01-02,Ba,0.2,mg/L,U\n"
	records, problems, err := csvReadString(text, water.ReadOptions{})
	if err == nil && len(problems) == 0 && len(records) == 3 && records[2].Err == nil && records[1].Err != nil {
		// U is not a qualifier we accept: A fails at line 6, B computes.
		if got := records[1].Err.Error(); got != `in.csv:6:6: column "Flag": value "U": unknown qualifier (use <, >, ND or leave blank)` {
			t.Errorf("A: %s", got)
		}
	} else {
		t.Fatalf("%v %v %+v", err, problems, records)
	}
	want := []struct {
		name, date string
		line       int
	}{{"B", "2024-01-02", 2}, {"A", "2024-01-02", 3}, {"B", "2024-02-06", 5}}
	for i, w := range want {
		r := records[i]
		if r.Name != w.name || r.Line != w.line || (r.Err == nil && r.Analysis.Date != w.date) {
			t.Errorf("record %d = %s line %d date %s, want %s line %d date %s", i, r.Name, r.Line, r.Analysis.Date, w.name, w.line, w.date)
		}
	}
	if ph := records[0].Analysis.PH; ph != 7.7 {
		t.Errorf("B pH = %g, want 7.7", ph)
	}
}

// TestReadQuotesLongValues checks that an error quotes at most 40
// characters of a raw value.
func TestReadQuotesLongValues(t *testing.T) {
	value := strings.Repeat("é", 100)
	records, _, err := csvReadString("name,Ca [mg/L]\nW,"+value+"\n", water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want := `in.csv:2:2: column "Ca [mg/L]": value "` + strings.Repeat("é", 40) + `…": not a number`
	if got := records[0].Err.Error(); got != want {
		t.Errorf("got  %s\nwant %s", got, want)
	}
}

// csvUnitCase is one conversion of a handbook: value in unit of analyte
// is want (mol, or eq for alkalinity) of the component per basis.
type csvUnitCase struct {
	analyte, unit string
	value         float64
	want          float64
	basis         water.Basis
	tol           float64 // relative
	source        string
}

// TestCSVUnitHandbook checks ParseUnit and Unit.Amount against the
// equivalences of water-analysis handbooks.
func TestCSVUnitHandbook(t *testing.T) {
	const exact = 1e-12
	cases := []csvUnitCase{
		{"alkalinity", "mg/L as CaCO3", 50.04, 1e-3, water.PerLitre, 1e-3, "Standard Methods 2320 B: 1 meq/L = 50.04 mg/L as CaCO3 (from memory)"},
		{"alkalinity", "mg/l as caco3", 100.086, 2e-3, water.PerLitre, exact, "CaCO3/2 = 50.043 g/eq, IUPAC 2021 abridged atomic weights (Prohaska et al. 2022)"},
		{"alkalinity", "meq/L", 1, 1e-3, water.PerLitre, exact, "definition"},
		{"Ca", "mg/L", 40.08, 1e-3, water.PerLitre, 1e-4, "Ca 40.078 g/mol, IUPAC 2021 abridged (from memory)"},
		{"Ca", "meq/L", 2, 1e-3, water.PerLitre, exact, "definition: Ca2+ carries 2 eq/mol"},
		{"Ca", "mmol/L", 1, 1e-3, water.PerLitre, exact, "definition"},
		{"Ca", "mM", 1, 1e-3, water.PerLitre, exact, "definition"},
		{"Ca", "mg/L as CaCO3", 100, 40.04e-3 / 40.078, water.PerLitre, 5e-4, "Standard Methods 2340 B: Ca as CaCO3 = 2.497 × Ca (from memory)"},
		{"Mg", "mg/L as CaCO3", 100, 24.28e-3 / 24.305, water.PerLitre, 5e-4, "Standard Methods 2340 B: Mg as CaCO3 = 4.118 × Mg (from memory)"},
		{"NO3", "mg/L as N", 14.007, 1e-3, water.PerLitre, exact, "N 14.007 g/mol, IUPAC 2021 abridged (from memory)"},
		{"NO3", "mg/L", 62.004, 1e-3, water.PerLitre, exact, "NO3 62.004 g/mol, IUPAC 2021 abridged (from memory)"},
		{"NO3-N", "mg/L", 14.007, 1e-3, water.PerLitre, exact, "N 14.007 g/mol"},
		{"SiO2", "mg/L", 60.08, 1e-3, water.PerLitre, 1e-4, "SiO2 60.083 g/mol, IUPAC 2021 abridged (from memory)"},
		{"Si", "mg/L as SiO2", 60.083, 1e-3, water.PerLitre, exact, "SiO2 60.083 g/mol"},
		{"PO4", "mg/L as P", 30.974, 1e-3, water.PerLitre, exact, "P 30.974 g/mol, IUPAC 2021 abridged (from memory)"},
		{"SO4", "mg/L", 96.06, 1e-3, water.PerLitre, exact, "SO4 96.06 g/mol, IUPAC 2021 abridged (from memory)"},
		{"SO4", "meq/L", 2, 1e-3, water.PerLitre, exact, "definition: SO4 2- carries 2 eq/mol"},
		{"HCO3", "mg/L", 61.016, 1e-3, water.PerLitre, exact, "HCO3 61.016 g/mol: 1 eq of alkalinity per mol"},
		{"CO3", "mg/L", 60.008, 2e-3, water.PerLitre, exact, "CO3 60.008 g/mol: 2 eq of alkalinity per mol"},
		{"Na", "µg/L", 22990, 1e-3, water.PerLitre, exact, "definition"},
		{"Na", "g/L", 22.990, 1, water.PerLitre, exact, "definition"},
		{"Na", "ppm", 22.990, 1e-3, water.PerKgSolution, exact, "common practice: ppm = mg/kg of solution"},
		{"Na", "mol/kg", 0.5, 0.5, water.PerKgWater, exact, "common practice: mol/kg is molality, per kg of water"},
		{"Na", "mmol/kgw", 0.5, 0.5e-3, water.PerKgWater, exact, "definition"},
		{"Ba", "mg/L", 137.33, 1e-3, water.PerLitre, exact, "Ba 137.33 g/mol, IUPAC 2021 abridged (from memory)"},
	}
	table := water.Analytes()
	for _, c := range cases {
		a, ok := table.Lookup(c.analyte)
		if !ok {
			t.Errorf("analyte %s not in the table", c.analyte)
			continue
		}
		u, err := water.ParseUnit(c.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", c.unit, err)
			continue
		}
		got, err := u.Amount(a, c.value, table)
		if err != nil {
			t.Errorf("%g %s of %s: %v", c.value, c.unit, c.analyte, err)
			continue
		}
		if math.Abs(got-c.want) > c.tol*c.want || u.Basis != c.basis {
			t.Errorf("%g %s of %s = %.8g (basis %v), want %.8g (basis %v) ± %g (%s)",
				c.value, c.unit, c.analyte, got, u.Basis, c.want, c.basis, c.tol, c.source)
		}
	}
}

// TestCSVPhysicalUnits checks the temperature, conductivity and density
// units against their definitions.
func TestCSVPhysicalUnits(t *testing.T) {
	cases := []struct {
		unit      string
		value     float64
		want      float64
		convert   func(water.Unit, float64) float64
		source    string
		wantQuant water.Quantity
	}{
		{"F", 212, 100, water.Unit.ToCelsius, "definition of °F", water.Temperature},
		{"°F", 32, 0, water.Unit.ToCelsius, "definition of °F", water.Temperature},
		{"F", 95, 35, water.Unit.ToCelsius, "definition of °F", water.Temperature},
		{"K", 298.15, 25, water.Unit.ToCelsius, "definition of K", water.Temperature},
		{"°C", 25, 25, water.Unit.ToCelsius, "identity", water.Temperature},
		{"mS/cm", 1.5, 1500, water.Unit.ToMicroSiemens, "definition", water.Conductivity},
		{"dS/m", 1, 1000, water.Unit.ToMicroSiemens, "1 dS/m = 1 mS/cm (definition)", water.Conductivity},
		{"µmho/cm", 100, 100, water.Unit.ToMicroSiemens, "1 mho = 1 S (definition)", water.Conductivity},
		{"g/mL", 1.02, 1.02, water.Unit.ToKgPerLitre, "definition", water.Density},
		{"kg/m3", 1025, 1.025, water.Unit.ToKgPerLitre, "definition", water.Density},
	}
	for _, c := range cases {
		u, err := water.ParseUnit(c.unit)
		if err != nil || u.Quantity != c.wantQuant {
			t.Errorf("ParseUnit(%q) = %+v, %v", c.unit, u, err)
			continue
		}
		if got := c.convert(u, c.value); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("%g %s = %.10g, want %g (%s)", c.value, c.unit, got, c.want, c.source)
		}
	}
	for _, bad := range []string{"mg/dL", "furlongs", "mmol/L as CaCO3", "mg"} {
		var ue *water.UnitError
		if _, err := water.ParseUnit(bad); !errors.As(err, &ue) {
			t.Errorf("ParseUnit(%q) error = %v, want a *UnitError", bad, err)
		}
	}
}

// TestCSVBrineMolality converts an 18 % w/w NaCl brine (density 1.1319
// kg/L at 20 °C, CRC Handbook of Chemistry and Physics, concentrative
// properties of aqueous solutions, from memory): 203.7 g/L NaCl, molality
// 180/(58.443 × 0.820) = 3.756 mol/kg.
func TestCSVBrineMolality(t *testing.T) {
	const (
		massFraction = 0.18
		density      = 1.1319 // kg/L
		naclMass     = 58.44  // g/mol, Na 22.990 + Cl 35.45
		wantMolality = 3.756
	)
	naclPerLitre := massFraction * density * 1000 // g/L, 203.7
	table := water.Analytes()
	na, _ := table.Lookup("Na")
	cl, _ := table.Lookup("Cl")
	mgL, _ := water.ParseUnit("mg/L")
	ppm, _ := water.ParseUnit("ppm")
	sample := func(unit water.Unit, naclMg float64, rho float64) water.Sample {
		s := water.NewSample("brine")
		s.Temperature, s.Density = 20, rho
		s.Measurements = []water.Measurement{
			{Analyte: &na, Unit: unit, Value: naclMg * 22.990 / naclMass, Column: "Na"},
			{Analyte: &cl, Unit: unit, Value: naclMg * 35.45 / naclMass, Column: "Cl"},
		}
		return s
	}
	cases := []struct {
		what string
		s    water.Sample
		tol  float64
	}{
		{"mg/L, density given", sample(mgL, naclPerLitre*1000, density), 0.001},
		{"mg/L, density estimated", sample(mgL, naclPerLitre*1000, math.NaN()), 0.015},
		{"ppm, density given", sample(ppm, massFraction*1e6, density), 0.001},
		{"ppm, density estimated", sample(ppm, massFraction*1e6, math.NaN()), 0.015},
	}
	for _, c := range cases {
		a, err := c.s.Analysis(table)
		if err != nil {
			t.Errorf("%s: %v", c.what, err)
			continue
		}
		for _, comp := range []water.Component{water.Na, water.Cl} {
			if got := a.Total(comp); math.Abs(got-wantMolality) > c.tol*wantMolality {
				t.Errorf("18 %% NaCl (%s): %s = %.4f mol/kg, want %.3f ± %.1f %% (CRC Handbook, from memory)",
					c.what, comp, got, wantMolality, 100*c.tol)
			}
		}
	}
	// The same brine through Read.
	text := fmt.Sprintf("name,temperature [C],density [kg/L],Na [g/L],Cl [g/L]\nbrine,20,%g,%.6f,%.6f\n",
		density, naclPerLitre*22.990/naclMass, naclPerLitre*35.45/naclMass)
	records, _, err := csvReadString(text, water.ReadOptions{})
	if err != nil || records[0].Err != nil {
		t.Fatalf("%v %v", err, records[0].Err)
	}
	if got := records[0].Analysis.Total(water.Na); math.Abs(got-wantMolality) > 0.001*wantMolality {
		t.Errorf("18 %% NaCl read from csv: Na = %.4f mol/kg, want %.3f ± 0.1 %%", got, wantMolality)
	}
}

// csvAtomicWeights are the IUPAC 2021 abridged standard atomic weights,
// g/mol (Prohaska et al. 2022, Pure Appl. Chem. 94:573, Table 2; typed from
// memory).
var csvAtomicWeights = map[string]float64{
	"H": 1.0080, "B": 10.81, "C": 12.011, "N": 14.007, "O": 15.999, "F": 18.998, "Na": 22.990,
	"Mg": 24.305, "Si": 28.085, "P": 30.974, "S": 32.06, "Cl": 35.45, "K": 39.098, "Ca": 40.078,
	"Mn": 54.938, "Fe": 55.845, "Sr": 87.62, "Ba": 137.33, "Li": 6.94, "Br": 79.904, "I": 126.90,
}

// csvFormulaMass returns the molar mass of a formula such as "HCO3".
func csvFormulaMass(t *testing.T, formula string) float64 {
	mass := 0.0
	for i := 0; i < len(formula); {
		j := i + 1
		for j < len(formula) && formula[j] >= 'a' && formula[j] <= 'z' {
			j++
		}
		w, ok := csvAtomicWeights[formula[i:j]]
		if !ok {
			t.Fatalf("formula %s: no atomic weight for %q", formula, formula[i:j])
		}
		n := 0
		for j < len(formula) && formula[j] >= '0' && formula[j] <= '9' {
			n = 10*n + int(formula[j]-'0')
			j++
		}
		if n == 0 {
			n = 1
		}
		mass += float64(n) * w
		i = j
	}
	return mass
}

// TestCSVAnalyteFormMass recomputes the form mass of every row of
// data/analytes.csv from the atomic weights.
func TestCSVAnalyteFormMass(t *testing.T) {
	forms := map[string]struct {
		formula string
		per     float64 // form mass = formula mass / per
	}{
		"Ca": {"Ca", 1}, "Mg": {"Mg", 1}, "Na": {"Na", 1}, "K": {"K", 1}, "Ba": {"Ba", 1},
		"Sr": {"Sr", 1}, "Fe": {"Fe", 1}, "Mn": {"Mn", 1}, "Cl": {"Cl", 1}, "F": {"F", 1}, "B": {"B", 1},
		"SO4": {"SO4", 1}, "SO4-S": {"S", 1}, "NO3": {"NO3", 1}, "NO3-N": {"N", 1},
		"SiO2": {"SiO2", 1}, "Si": {"Si", 1}, "PO4": {"PO4", 1}, "PO4-P": {"P", 1},
		"DIC": {"C", 1}, "CO2": {"CO2", 1}, "HCO3": {"HCO3", 1}, "CO3": {"CO3", 1}, "OH": {"OH", 1},
		"Br": {"Br", 1}, "I": {"I", 1}, "Li": {"Li", 1}, "NH4": {"NH4", 1}, "NH4-N": {"N", 1}, "NH3": {"NH3", 1},
		"alkalinity":  {"CaCO3", 2},                              // the equivalent weight of CaCO3
		"Ca-hardness": {"CaCO3", 1}, "Mg-hardness": {"CaCO3", 1}, // hardness as CaCO3
	}
	const tol = 0.01 // g/mol
	for _, a := range water.Analytes().All() {
		f, ok := forms[a.Name]
		if !ok {
			t.Errorf("analyte %s: no formula in this test", a.Name)
			continue
		}
		want := csvFormulaMass(t, f.formula) / f.per
		if math.Abs(a.FormMass-want) > tol {
			t.Errorf("form mass of %s = %.4f g/mol, want %.4f ± %g (%s from IUPAC 2021 abridged atomic weights)",
				a.Name, a.FormMass, want, tol, f.formula)
		}
	}
}

// FuzzRead feeds Read arbitrary bytes: it must not panic, and what it
// returns must keep its contract.
func FuzzRead(f *testing.F) {
	for _, dir := range []string{"testdata/good", "testdata/bad"} {
		paths, _ := filepath.Glob(filepath.Join(dir, "*.csv"))
		for _, p := range paths {
			b, err := os.ReadFile(p)
			if err == nil {
				f.Add(b)
			}
		}
	}
	f.Add([]byte("name,Ca [mg/L],pH\nA,<0.1,7\nB,1e308,14\n"))
	f.Add([]byte("sample,analyte,value,unit,qualifier\nA,Na,1e300,mol/kg,\nA,Cl,<5,mg/L,<\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		records, problems, err := water.Read("fuzz.csv", bytes.NewReader(data), water.ReadOptions{})
		var ie *water.InputError
		if err != nil {
			if !errors.As(err, &ie) || ie.File != "fuzz.csv" {
				t.Fatalf("error %v is not an *InputError", err)
			}
			if records != nil || problems != nil {
				t.Fatalf("records or problems with error %v", err)
			}
			return
		}
		if len(records) == 0 {
			t.Fatalf("no records and no error")
		}
		for _, p := range problems {
			if !errors.As(p, &ie) || ie.Line < 1 {
				t.Fatalf("problem %v is not an *InputError with a line", p)
			}
		}
		for _, r := range records {
			if r.Line < 1 || r.Name == "" || !utf8.ValidString(r.Name) {
				t.Fatalf("record %+v has no line or a bad name", r)
			}
			if r.Err != nil {
				if !errors.As(r.Err, &ie) || ie.Line < 1 {
					t.Fatalf("record error %v is not an *InputError with a line", r.Err)
				}
				continue
			}
			a := r.Analysis
			for _, c := range water.Components() {
				if x := a.Total(c); math.IsNaN(x) || math.IsInf(x, 0) || x < 0 {
					t.Fatalf("%s: total %s = %g", r.Name, c, x)
				}
			}
			if math.IsNaN(a.Temperature) || !(a.Density > 0) || !(a.WaterPerLitre > 0) {
				t.Fatalf("%s: temperature %g, density %g, water %g", r.Name, a.Temperature, a.Density, a.WaterPerLitre)
			}
		}
	})
}
