package reports

import (
	"math"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestCompositionChartSums: the composition chart of a water that carries
// every charged component (bromide, iodide, lithium and ammonium included)
// sums to the ion balance's cation and anion totals, so that no analyte
// is left out of the bars.
func TestCompositionChartSums(t *testing.T) {
	const tol = 1e-9 // meq/L: the same sums
	lab := "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Ba [mg/L],Sr [mg/L],Fe [mg/L],Mn [mg/L],Li [mg/L],NH4-N [mg/L]," +
		"Cl [mg/L],SO4 [mg/L],NO3 [mg/L],F [mg/L],Br [mg/L],I [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"every ion,25,7.5,40,12,46,4,0.1,0.5,0.2,0.1,0.3,5,70,48,6,0.5,2,0.1,100\n"
	records, problems, err := water.Read("all.csv", strings.NewReader(lab), water.ReadOptions{})
	if err != nil || len(problems) > 0 || records[0].Err != nil {
		t.Fatalf("reading: %v %v %v", err, problems, records)
	}
	a := records[0].Analysis
	q := a.Quality()
	var cations, anions float64
	for _, bar := range compositionOf("c", a).Ions {
		if bar.Cation {
			cations += bar.MeqPerL
		} else {
			anions += bar.MeqPerL
		}
	}
	if math.Abs(cations-q.Cations) > tol || math.Abs(anions-q.Anions) > tol {
		t.Errorf("composition chart sums %.6f / %.6f meq/L, ion balance %.6f / %.6f", cations, anions, q.Cations, q.Anions)
	}
}
