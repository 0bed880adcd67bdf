package reports_test

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strings"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// ExampleWriteAssessments reads a one-sample laboratory file of an invented
// cooling-tower water, assesses it and writes the JSON of assess; a program
// reading the JSON finds the sample by name and the risk band of each
// mineral.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleWriteAssessments() {
	const lab = `name,temperature [C],pH,Ca [mg/L as CaCO3],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3]
Invented tower basin,35,7.9,400,30,100,150,250,250
`
	records, _, err := water.Read("lab.csv", strings.NewReader(lab), water.ReadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	as := saturation.AssessRecords("lab.csv", records, saturation.Options{})
	var buf bytes.Buffer
	if err := reports.WriteAssessments(&buf, reports.JSON, as); err != nil {
		fmt.Println(err)
		return
	}
	var doc struct {
		Samples []struct {
			Name          string            `json:"name"`
			TemperatureC  float64           `json:"temperature_c"`
			ActivityModel string            `json:"activity_model"`
			RiskBand      map[string]string `json:"risk_band"`
			Error         *string           `json:"error"`
		} `json:"samples"`
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range doc.Samples {
		fmt.Printf("%s at %g °C (%s), error %v\n", s.Name, s.TemperatureC, s.ActivityModel, s.Error)
		fmt.Println("calcite:", s.RiskBand["calcite"])
		fmt.Println("gypsum:", s.RiskBand["gypsum"])
	}
	// Output:
	// Invented tower basin at 35 °C (pitzer), error <nil>
	// calcite: supersaturated – within inhibitor reach
	// gypsum: undersaturated
}

// ExampleWriteMinerals lists the embedded thermodynamic table as CSV.
//
// The printed values are a regression pin of the program's own output and of
// the embedded table, not an outside reference.
func ExampleWriteMinerals() {
	var buf bytes.Buffer
	if err := reports.WriteMinerals(&buf, reports.CSV, saturation.DefaultTable()); err != nil {
		fmt.Println(err)
		return
	}
	lines := strings.Split(buf.String(), "\n")
	fmt.Println(lines[0])
	fmt.Println(strings.Join(strings.Split(lines[1], ",")[:4], ","))
	// Output:
	// name,formula,reaction,log_k_25,temperature_function,t_min_c,t_max_c,source
	// calcite,CaCO3,calcite = Ca[2+] + CO3[2-],-8.480
}
