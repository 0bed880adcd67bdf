package saturation_test

import (
	"fmt"
	"math"

	"scalerisk/saturation"
	"scalerisk/water"
)

// towerWater is an invented cooling-tower water: totals in mol/kg of
// water, pH 8.2 measured at 25 °C, alkalinity 4.2 meq/kg.
func towerWater() water.Analysis {
	a := water.Analysis{Name: "tower", Temperature: 30, PH: 8.2, PHTemperature: 25, Pressure: 1,
		Alkalinity: 4.2e-3, CarbonateAlkalinity: math.NaN(), FreeCO2: math.NaN(),
		WaterPerLitre: 0.996, Density: 0.9985}
	for c, v := range map[water.Component]float64{water.Ca: 4e-3, water.Mg: 2e-3, water.Na: 8e-3,
		water.Cl: 8e-3, water.S: 4e-3, water.Si: 1.2e-3} {
		a.Totals[c], a.Measured[c] = v, true
	}
	return a
}

// ExampleSpeciate prints results for an invented water.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleSpeciate() {
	r, err := saturation.Speciate(towerWater(), saturation.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	si, _ := r.SI("calcite")
	fmt.Printf("at %.0f °C: pH %.2f, I %.4f mol/kg (%s)\n", r.Temperature, r.PH, r.IonicStrength, r.Activity)
	fmt.Printf("calcite SI %+.2f: %s\n", si, saturation.RiskBand("calcite", si))
	// Output:
	// at 30 °C: pH 8.14, I 0.0298 mol/kg (pitzer)
	// calcite SI +1.14: supersaturated – within inhibitor reach
}

// ExampleSweep prints results for an invented water.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleSweep() {
	pts, err := saturation.Sweep(towerWater(), saturation.Axis{Var: saturation.VaryTemperature,
		Values: []float64{20, 50, 80}}, nil, saturation.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range pts {
		si, _ := p.Result.SI("calcite")
		fmt.Printf("%2.0f °C: calcite SI %+.2f\n", p.X, si)
	}
	// Output:
	// 20 °C: calcite SI +1.13
	// 50 °C: calcite SI +1.17
	// 80 °C: calcite SI +1.26
}

// ExampleDoseToTarget prints results for an invented water.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleDoseToTarget() {
	acid, _ := water.LookupReagent("h2so4")
	target, _ := saturation.ParseTarget("ph=7.2", nil)
	d, err := saturation.DoseToTarget(towerWater(), acid, 0, target, saturation.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	before, _ := d.Before.Result.SI("gypsum")
	after, _ := d.After.Result.SI("gypsum")
	fmt.Printf("%.1f mg/L of %g %% sulfuric acid; gypsum SI %+.3f → %+.3f\n", d.Dose, d.Strength, before, after)
	// Output:
	// 28.5 mg/L of 93 % sulfuric acid; gypsum SI -0.912 → -0.883
}

// ExampleMaxCycles prints results for an invented water.
//
// The printed values are a regression pin of the program's own output, not an
// outside reference: a change in them must be explained by a change in data or
// method. The published checks are in the package's tests.
func ExampleMaxCycles() {
	makeup := towerWater()
	for c := range makeup.Totals {
		makeup.Totals[c] /= 4 // the tower water at 4 cycles came from this makeup
	}
	makeup.Alkalinity /= 4
	makeup.PH = 7.8
	profile, _ := saturation.LimitProfileNamed("inhibitor")
	rule, _ := saturation.ParseCarbonateRule("natural")
	r, err := saturation.MaxCycles(makeup, profile, rule, 10, 0.5, saturation.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("at most %.1f cycles; limiting: %s\n", r.MaxCycles, r.Limiting)
	// Output:
	// at most 6.3 cycles; limiting: product:Mg_as_CaCO3*SiO2
}
