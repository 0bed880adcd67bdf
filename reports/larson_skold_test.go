package reports_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"strings"
	"testing"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// TestLarsonSkoldNotDefined: a water with almost no alkalinity (invented:
// seawater-strength chloride, 3 mg/L alkalinity as CaCO3) gets no
// Larson–Skold number in any format, and says so: null in JSON, "not
// defined" in the CSV cell and in the text's classic indices.
func TestLarsonSkoldNotDefined(t *testing.T) {
	const lab = "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"soft brine,25,6.2,120,40,9000,300,14500,2000,3\n"
	records, problems, err := water.Read("lab.csv", strings.NewReader(lab), water.ReadOptions{})
	if err != nil || len(problems) > 0 {
		t.Fatalf("reading: %v %v", err, problems)
	}
	as := saturation.AssessRecords("lab.csv", records, saturation.Options{})
	if as[0].Indices == nil || !as[0].Indices.LarsonSkoldUndefined {
		t.Fatalf("indices %+v: want the Larson–Skold index marked not defined", as[0].Indices)
	}
	s := writeJSON(t, as...)[0]
	var ix map[string]json.RawMessage
	if err := json.Unmarshal(s["indices"], &ix); err != nil || string(ix["larson_skold"]) != "null" {
		t.Errorf("JSON larson_skold = %s (%v), want null", ix["larson_skold"], err)
	}
	var buf bytes.Buffer
	if err := reports.WriteAssessments(&buf, reports.CSV, as); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil || len(rows) != 2 {
		t.Fatalf("CSV: %v, %d rows", err, len(rows))
	}
	for i, h := range rows[0] {
		if h == "larson_skold" && rows[1][i] != "not defined" {
			t.Errorf("CSV larson_skold = %q, want \"not defined\"", rows[1][i])
		}
	}
	buf.Reset()
	if err := reports.WriteAssessments(&buf, reports.Text, as); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(buf.String(), "Larson–Skold not defined") {
		t.Errorf("text lacks \"Larson–Skold not defined\":\n%s", buf.String())
	}
}
