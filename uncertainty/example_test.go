package uncertainty_test

import (
	"fmt"
	"strings"

	"scalerisk/saturation"
	"scalerisk/uncertainty"
	"scalerisk/water"
)

// A cooling-tower water (invented) assessed with 500 draws of its analysis
// at the default uncertainties of data/uncertainty.csv.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleAssess() {
	csv := "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"tower,30,7.2,120,30,90,140,200,150\n"
	recs, _, err := water.Read("tower.csv", strings.NewReader(csv), water.ReadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	central := saturation.AssessAnalysis(recs[0].Analysis, saturation.Options{})
	s, err := uncertainty.Assess(central, saturation.Options{}, uncertainty.Settings{Draws: 500, Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	q, _ := s.Quantity("calcite")
	fmt.Printf("calcite SI %.2f, median %.2f, 5–95 %%: %.2f to %.2f\n", q.Central, q.Median, q.Low, q.High)
	fmt.Printf("P(SI > 0) = %.2f; most of the spread from %s\n", q.PPositive, q.Sensitivity.Top())
	// Output:
	// calcite SI 0.06, median 0.06, 5–95 %: -0.02 to 0.14
	// P(SI > 0) = 0.88; most of the spread from pH
}
