package water_test

import (
	"fmt"
	"strings"

	"scalerisk/water"
)

// ExampleRead reads a small laboratory file in the wide form (invented
// waters): one sample is computed, the other names its bad cell.
//
// The numbers can be checked by hand (300 mg/L as CaCO3 is 2.998 mmol/L of Ca, 250 is 4.996 meq/L, over the water per litre); they are still a regression pin of
// the program's output.
func ExampleRead() {
	const lab = `name,temperature [C],pH,Ca [mg/L as CaCO3],alkalinity [mg/L as CaCO3],Ba [mg/L]
Tower basin,32,8.3,300,250,<0.02
Makeup,15,7.6,forty,120,
`
	records, problems, err := water.Read("lab.csv", strings.NewReader(lab), water.ReadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range problems {
		fmt.Println(p)
	}
	for _, r := range records {
		if r.Err != nil {
			fmt.Println(r.Err)
			continue
		}
		a := r.Analysis
		fmt.Printf("%s: %.0f °C, pH %.1f, Ca %.3f mmol/kg, alkalinity %.3f meq/kg\n",
			a.Name, a.Temperature, a.PH, 1000*a.Total(water.Ca), 1000*a.Alkalinity)
		for _, note := range a.BelowDetection {
			fmt.Println("  " + note)
		}
	}
	// Output:
	// Tower basin: 32 °C, pH 8.3, Ca 3.013 mmol/kg, alkalinity 5.021 meq/kg
	//   Ba <0.02 mg/L taken as 0.01
	// lab.csv:3:4: column "Ca [mg/L as CaCO3]": value "forty": not a number
}
