package reports_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// badRow is an assessment of a row that could not be read.
func badRow() saturation.Assessment {
	err := &water.InputError{File: "lab.csv", Line: 3, Column: 4, Header: "Ca [mg/L]", Value: "-12",
		Err: errors.New("negative concentration")}
	return saturation.Assessment{Name: "Tower 2", File: "lab.csv", Line: 3, Err: err, BadInput: true}
}

// computed is an assessment with a hand-made result (invented numbers):
// minerals in table order, not in order of SI, and no CO2 partial pressure.
func computed() saturation.Assessment {
	var a water.Analysis
	a.Name = "Tower 1"
	a.Totals[water.Ca] = 0.002
	a.Measured[water.Ca] = true
	a.Totals[water.S] = 0.001
	a.Measured[water.S] = true
	a.Totals[water.C] = 0.004
	a.CarbonKnown = true
	r := &saturation.Result{
		Name: "Tower 1", Temperature: 30, PH: 8.1, IonicStrength: 0.0123456, Activity: saturation.Davies,
		Alkalinity: 0.0038, LogPCO2: math.NaN(), Analysis: a,
		Species: []saturation.SpeciesResult{
			{Name: "HCO3[-]", Molality: 0.0035, Gamma: 0.9, Activity: 0.00315},
			{Name: "Ca[2+]", Molality: 0.0018, Gamma: 0.66, Activity: 0.001188},
		},
		Minerals: []saturation.MineralResult{
			{Name: "calcite", Formula: "CaCO3", SI: 0.8123},
			{Name: "gypsum", Formula: "CaSO4:2H2O", SI: -1.9},
			{Name: "barite", Formula: "BaSO4", SI: 1.2},
			{Name: "celestite", Formula: "SrSO4", SI: -0.31},
		},
	}
	return saturation.Assessment{Name: "Tower 1", File: "lab.csv", Line: 2, Input: a, Result: r}
}

func writeJSON(t *testing.T, as ...saturation.Assessment) []map[string]json.RawMessage {
	t.Helper()
	var buf bytes.Buffer
	if err := reports.WriteAssessments(&buf, reports.JSON, as); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Samples []map[string]json.RawMessage `json:"samples"`
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatalf("invalid JSON: %v\n%s", err, buf.String())
	}
	if len(doc.Samples) != len(as) {
		t.Fatalf("%d samples written, want %d", len(doc.Samples), len(as))
	}
	return doc.Samples
}

func TestJSONErrorOnly(t *testing.T) {
	as := badRow()
	s := writeJSON(t, as)[0]
	keys := slices.Sorted(func(yield func(string) bool) {
		for k := range s {
			if !yield(k) {
				return
			}
		}
	})
	// The design's keys are always there (a stable contract), null where
	// nothing was computed.
	if want := []string{"activity_model", "charge_balance_percent", "error", "file", "indices", "ionic_strength",
		"limiting", "line", "name", "ph", "saturation_index", "species", "temperature_c", "totals", "warnings"}; !slices.Equal(keys, want) {
		t.Errorf("keys of an error-only sample = %v, want %v", keys, want)
	}
	for _, k := range []string{"ph", "temperature_c", "activity_model", "saturation_index", "indices", "totals", "limiting"} {
		if string(s[k]) != "null" {
			t.Errorf("%s = %s for a sample not computed, want null", k, s[k])
		}
	}
	var msg string
	if err := json.Unmarshal(s["error"], &msg); err != nil || msg != as.Err.Error() {
		t.Errorf("error = %s, want %q", s["error"], as.Err.Error())
	}
	if string(s["warnings"]) != "[]" {
		t.Errorf("warnings = %s, want []", s["warnings"])
	}
	if got := reports.Sample(as); got.Warnings == nil {
		t.Error("Sample(bad row).Warnings is nil, want an empty slice")
	}
}

func TestJSONRounding(t *testing.T) {
	s := writeJSON(t, computed())[0]
	if _, ok := s["log_pco2"]; ok {
		t.Errorf("log_pco2 = %s written for a NaN log pCO2, want the key left out", s["log_pco2"])
	}
	if string(s["error"]) != "null" {
		t.Errorf("error = %s, want null", s["error"])
	}
	// Display rounding: SI to 0.001, ionic strength to 4 significant digits.
	var si map[string]float64
	if err := json.Unmarshal(s["saturation_index"], &si); err != nil {
		t.Fatal(err)
	}
	if si["calcite"] != 0.812 {
		t.Errorf("SI(calcite) = %v, want 0.812 (0.8123 rounded to 3 decimals)", si["calcite"])
	}
	if string(s["ionic_strength"]) != "0.01235" {
		t.Errorf("ionic_strength = %s, want 0.01235 (0.0123456 to 4 significant digits)", s["ionic_strength"])
	}
	var totals map[string]float64
	if err := json.Unmarshal(s["totals"], &totals); err != nil {
		t.Fatal(err)
	}
	if want := map[string]float64{"Ca": 0.002, "S": 0.001, "C": 0.004}; !mapsEqual(totals, want) {
		t.Errorf("totals = %v, want %v", totals, want)
	}
	if p := reports.Sample(computed()).LogPCO2; p != nil {
		t.Errorf("Sample(...).LogPCO2 = %v, want nil for NaN", *p)
	}
}

func mapsEqual(a, b map[string]float64) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if w, ok := b[k]; !ok || w != v {
			return false
		}
	}
	return true
}

func TestCSVColumns(t *testing.T) {
	failed := computed()
	failed.Name, failed.Line, failed.Result = "Tower 3", 4, nil
	failed.Err = errors.New("Tower 3: no convergence")
	var buf bytes.Buffer
	if err := reports.WriteAssessments(&buf, reports.CSV, []saturation.Assessment{computed(), badRow(), failed}); err != nil {
		t.Fatal(err)
	}
	cr := csv.NewReader(&buf)
	cr.FieldsPerRecord = -1
	rows, err := cr.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 4 {
		t.Fatalf("%d CSV rows, want a header and 3 samples", len(rows))
	}
	header := rows[0]
	want := 9 + 7 + len(water.Components()) + 4 + 3 + 3 + 4 + 2 // fixed, 7 indices, totals, 4 minerals, error, warnings, other analytes, date, role, quality flags, 4 bands, hardness and P-alkalinity
	if len(header) != want {
		t.Errorf("header has %d columns, want %d: %v", len(header), want, header)
	}
	for _, col := range []string{"name", "temperature_c", "ph", "ionic_strength", "activity_model",
		"charge_balance_percent", "lsi", "rsi", "ccpp_mg_per_l", "total_Ca_mol_per_kg", "total_C_mol_per_kg", "si_calcite", "si_celestite"} {
		if !slices.Contains(header, col) {
			t.Errorf("header lacks %q", col)
		}
	}
	if header[0] != "name" || !slices.Equal(header[len(header)-12:], []string{"error", "warnings", "other_analytes", "date", "role", "quality_flags",
		"band_calcite", "band_gypsum", "band_barite", "band_celestite", "total_hardness_mg_per_l_as_caco3", "p_alkalinity_mg_per_l_as_caco3"}) {
		t.Errorf("header = %v, want name first and error, warnings, other_analytes, date, role, quality_flags, bands, hardness and P-alkalinity last", header)
	}
	for i, row := range rows[1:] {
		if len(row) != len(header) {
			t.Errorf("row %d has %d columns, header %d", i+1, len(row), len(header))
		}
	}
	col := func(name string) int { return slices.Index(header, name) }
	if got := rows[1][col("si_calcite")]; got != "0.812" {
		t.Errorf("si_calcite = %q, want 0.812", got)
	}
	if got := rows[2][col("error")]; got != badRow().Err.Error() {
		t.Errorf("bad row: error = %q, want %q", got, badRow().Err.Error())
	}
	if got := rows[2][col("si_calcite")]; got != "" {
		t.Errorf("bad row: si_calcite = %q, want blank", got)
	}
	if got := rows[3][col("error")]; got != "Tower 3: no convergence" {
		t.Errorf("failed row: error = %q", got)
	}
}

func TestTextSortsBySI(t *testing.T) {
	var buf bytes.Buffer
	if err := reports.WriteAssessments(&buf, reports.Text, []saturation.Assessment{computed()}); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	var order []string
	for _, line := range strings.Split(out, "\n") {
		f := strings.Fields(line)
		if len(f) > 0 && slices.Contains([]string{"Calcite", "Gypsum", "Barite", "Celestite"}, f[0]) {
			order = append(order, f[0])
		}
	}
	// Mineral names in words, capitalised (mineralTitle).
	if want := []string{"Barite", "Calcite", "Celestite", "Gypsum"}; !slices.Equal(order, want) {
		t.Errorf("minerals listed as %v, want by SI descending %v\n%s", order, want, out)
	}
	for _, want := range []string{"Tower 1  (lab.csv, line 2)", "  Data quality", "+0.81", "-1.90", "Results are advisory."} {
		if !strings.Contains(out, want) {
			t.Errorf("text lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "log pCO2") {
		t.Errorf("text reports a log pCO2 that is NaN:\n%s", out)
	}
}
