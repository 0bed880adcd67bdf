package water_test

import (
	"bufio"
	"bytes"
	"errors"
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
