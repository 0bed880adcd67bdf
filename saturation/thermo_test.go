package saturation

import (
	"encoding/csv"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestLogKReference compares the table's log K(T) with published values
// gathered in testdata/logk_reference.csv, each row naming its source and
// tag (READ, FROM MEMORY, COMPUTED regression, SAME SOURCE: see the file's
// header). A row that does not parse fails the test. Every entry of the
// table other than the masters needs a reference row or a line in
// testdata/logk_gaps.csv saying why it has none.
func TestLogKReference(t *testing.T) {
	rows := readTestCSV(t, "../testdata/logk_reference.csv", []string{"name", "t_c", "log_k", "tolerance", "source"})
	table := DefaultTable()
	checked := map[string]bool{}
	for _, row := range rows {
		name, source := row.cells[0], row.cells[4]
		var v [3]float64
		for k := range v {
			x, err := strconv.ParseFloat(row.cells[k+1], 64)
			if err != nil {
				t.Fatalf("logk_reference.csv:%d: column %d: %v", row.line, k+2, err)
			}
			v[k] = x
		}
		tc, want, tol := v[0], v[1], v[2]
		if !(tol > 0) || strings.TrimSpace(source) == "" {
			t.Errorf("logk_reference.csv:%d: %s needs a positive tolerance and a source", row.line, name)
		}
		e, ok := table.Entry(name)
		if !ok {
			t.Errorf("logk_reference.csv:%d: %s is not in the table", row.line, name)
			continue
		}
		if got := e.LogK(tc); !(math.Abs(got-want) <= tol) {
			t.Errorf("log K(%s, %g °C) = %.4f, want %.4f ± %g (%s)", name, tc, got, want, tol, source)
		}
		checked[name] = true
	}
	gaps := map[string]bool{}
	for _, row := range readTestCSV(t, "../testdata/logk_gaps.csv", []string{"name", "reason"}) {
		name := row.cells[0]
		if _, ok := table.Entry(name); !ok {
			t.Errorf("logk_gaps.csv:%d: %s is not in the table", row.line, name)
		}
		if checked[name] {
			t.Errorf("logk_gaps.csv:%d: %s has a reference row now; remove it from the gaps", row.line, name)
		}
		if strings.TrimSpace(row.cells[1]) == "" {
			t.Errorf("logk_gaps.csv:%d: %s needs a reason", row.line, name)
		}
		gaps[name] = true
	}
	for _, e := range table.Entries() {
		if e.Phase != Master && !checked[e.Name] && !gaps[e.Name] {
			t.Errorf("%s (data/thermo.csv line %d) has no row in testdata/logk_reference.csv and is not listed in testdata/logk_gaps.csv", e.Name, e.Line)
		}
	}
	if len(checked) < 60 {
		t.Errorf("only %d entries checked against a reference, want at least 60", len(checked))
	}
}

// csvRow is one data row of a test CSV file with its line number.
type csvRow struct {
	line  int
	cells []string
}

// readTestCSV reads a CSV test file (lines starting with # are comments)
// whose header must be header; a malformed file fails the test.
func readTestCSV(t *testing.T, path string, header []string) []csvRow {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	r.FieldsPerRecord = len(header)
	first, err := r.Read()
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	if strings.Join(first, ",") != strings.Join(header, ",") {
		t.Fatalf("%s: header %q, want %q", path, first, header)
	}
	var rows []csvRow
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		line, _ := r.FieldPos(0)
		rows = append(rows, csvRow{line: line, cells: rec})
	}
	return rows
}

// TestAnalyticMatches25 checks every row with a temperature function against
// its own 25 °C log K: a typo in a coefficient shows up here.
func TestAnalyticMatches25(t *testing.T) {
	for _, e := range DefaultTable().Entries() {
		if !e.HasAnalytic {
			continue
		}
		if got := e.LogK(25); math.Abs(got-e.LogK25) > 0.02 {
			t.Errorf("%s (line %d): analytic log K(25 °C) = %.4f, table says %.4f ± 0.02", e.Name, e.Line, got, e.LogK25)
		}
	}
}

// TestTableScope checks that every mineral the design names is in the
// table with a source.
func TestTableScope(t *testing.T) {
	want := []string{"calcite", "aragonite", "dolomite", "magnesite", "gypsum", "anhydrite", "barite",
		"celestite", "strontianite", "witherite", "fluorite", "silica_amorphous", "quartz", "brucite",
		"siderite", "rhodochrosite", "hydroxyapatite", "tricalcium_phosphate", "sepiolite"}
	table := DefaultTable()
	for _, name := range want {
		e, ok := table.Entry(name)
		switch {
		case !ok:
			t.Errorf("mineral %s missing from data/thermo.csv", name)
		case e.Phase != Mineral:
			t.Errorf("%s is a %s, want mineral", name, e.Phase)
		case strings.TrimSpace(e.Source) == "":
			t.Errorf("%s has no source", name)
		}
	}
	for _, e := range table.Entries() {
		if strings.TrimSpace(e.Source) == "" {
			t.Errorf("%s (line %d) has no source", e.Name, e.Line)
		}
	}
	if _, err := NewModel(table); err != nil {
		t.Fatal(err)
	}
}

func TestReadTableErrors(t *testing.T) {
	header := strings.Join(tableHeader, ",") + "\n"
	tests := []struct {
		name, body, want string
	}{
		{"unknown species", "XY[+],aqueous,XY,Na[+] + QQ[0] = XY[+],1,,,,,,,,0,100,,,test\n",
			`extra.csv:2:4: column "equation": "QQ[0]" is not defined before XY[+]`},
		{"bad number", "calcite,mineral,CaCO3,calcite = Ca[2+] + CO3[2-],1;2,,,,,,,,0,100,,,test\n",
			`extra.csv:2:5: column "log_k_25": value "1;2": not a number`},
		{"no self", "calcite2,mineral,CaCO3,calcite = Ca[2+] + CO3[2-],-8,,,,,,,,0,100,,,test\n",
			`extra.csv:2:4: column "equation": "calcite" is a mineral; equations may use only masters, aqueous species and H2O`},
		{"bad phase", "calcite,solid,CaCO3,calcite = Ca[2+] + CO3[2-],-8,,,,,,,,0,100,,,test\n",
			`extra.csv:2:2: column "phase": value "solid": unknown phase "solid" (want master, aqueous, mineral or gas)`},
	}
	for _, tc := range tests {
		_, err := DefaultTable().Extend("extra.csv", strings.NewReader(header+tc.body))
		if err == nil || err.Error() != tc.want {
			t.Errorf("%s: error %v, want %s", tc.name, err, tc.want)
		}
	}
}

func TestExtendOverrides(t *testing.T) {
	header := strings.Join(tableHeader, ",") + "\n"
	body := "calcite,mineral,CaCO3,calcite = Ca[2+] + CO3[2-],-8.52,,,,,,,,0,100,,,Christ Hostetler & Siebert 1974 (test override)\n"
	tb, err := DefaultTable().Extend("extra.csv", strings.NewReader(header+body))
	if err != nil {
		t.Fatal(err)
	}
	e, _ := tb.Entry("calcite")
	if e.LogK(25) != -8.52 || e.TemperatureFunction() != "constant" {
		t.Errorf("override not applied: %+v", e)
	}
	if orig, _ := DefaultTable().Entry("calcite"); orig.LogK25 != -8.480 {
		t.Errorf("Extend modified the default table")
	}
	if len(tb.Minerals()) != len(DefaultTable().Minerals()) {
		t.Errorf("override added a mineral instead of replacing it")
	}
}
