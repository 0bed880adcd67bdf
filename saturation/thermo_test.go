package saturation

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestLogKReference compares the table's log K(T) with published values
// gathered in testdata/logk_reference.csv, each row naming its source.
func TestLogKReference(t *testing.T) {
	f, err := os.Open("../testdata/logk_reference.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	table := DefaultTable()
	n := 0
	for _, row := range rows[1:] {
		name, source := row[0], row[4]
		tc, _ := strconv.ParseFloat(row[1], 64)
		want, _ := strconv.ParseFloat(row[2], 64)
		tol, _ := strconv.ParseFloat(row[3], 64)
		e, ok := table.Entry(name)
		if !ok {
			t.Errorf("reference row for %s: not in the table", name)
			continue
		}
		got := e.LogK(tc)
		if math.Abs(got-want) > tol {
			t.Errorf("log K(%s, %g °C) = %.4f, want %.4f ± %g (%s)", name, tc, got, want, tol, source)
		}
		n++
	}
	if n < 40 {
		t.Errorf("only %d reference values checked, want at least 40", n)
	}
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
