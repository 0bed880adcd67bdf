package saturation

import (
	"math"
	"testing"

	"scalerisk/water"
)

func siAt(t *testing.T, pts []Point, i int, mineral string) float64 {
	t.Helper()
	if pts[i].Err != nil {
		t.Fatalf("point %d: %v", i, pts[i].Err)
	}
	v, ok := pts[i].Result.SI(mineral)
	if !ok {
		t.Fatalf("point %d: no SI for %s", i, mineral)
	}
	return v
}

// TestSweepDirections checks the directions every practitioner knows:
// calcite SI rises with temperature (retrograde solubility, Plummer &
// Busenberg 1982) and with cycles of concentration; sulfuric acid lowers
// calcite SI and raises gypsum SI (the common-ion effect of its sulfate).
func TestSweepDirections(t *testing.T) {
	a := coolingWater()
	temp, err := Sweep(a, Axis{Var: VaryTemperature, Values: Range(10, 80, 8)}, nil, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for i := 1; i < len(temp); i++ {
		if siAt(t, temp, i, "calcite") <= siAt(t, temp, i-1, "calcite") {
			t.Errorf("calcite SI does not rise from %g to %g °C", temp[i-1].X, temp[i].X)
		}
	}
	cyc, err := Sweep(a, Axis{Var: VaryCycles, Values: []float64{1, 2, 3, 5}}, nil, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for i := 1; i < len(cyc); i++ {
		for _, m := range []string{"calcite", "gypsum", "barite", "silica_amorphous"} {
			if siAt(t, cyc, i, m) <= siAt(t, cyc, i-1, m) {
				t.Errorf("SI(%s) does not rise from %g to %g cycles", m, cyc[i-1].X, cyc[i].X)
			}
		}
	}
	h2so4, err := water.LookupReagent("h2so4")
	if err != nil {
		t.Fatal(err)
	}
	dose, err := Sweep(a, Axis{Var: VaryDose, Values: []float64{0, 50, 100, 150}, Reagent: h2so4}, nil, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for i := 1; i < len(dose); i++ {
		if siAt(t, dose, i, "calcite") >= siAt(t, dose, i-1, "calcite") {
			t.Errorf("calcite SI does not fall from %g to %g mg/L H2SO4", dose[i-1].X, dose[i].X)
		}
		if siAt(t, dose, i, "gypsum") <= siAt(t, dose, i-1, "gypsum") {
			t.Errorf("gypsum SI does not rise from %g to %g mg/L H2SO4", dose[i-1].X, dose[i].X)
		}
		if dose[i].Result.PH >= dose[i-1].Result.PH {
			t.Errorf("pH does not fall with acid dose")
		}
	}
}

// TestSweepGridAndConservation: a two-axis grid has every point, and a
// dose of zero and one cycle return the water itself.
func TestSweepGridAndConservation(t *testing.T) {
	a := coolingWater()
	pts, err := Sweep(a, Axis{Var: VaryTemperature, Values: []float64{30, 60}},
		&Axis{Var: VaryCycles, Values: []float64{1, 4}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(pts) != 4 || pts[1].X != 60 || pts[1].Y != 1 || pts[2].X != 30 || pts[2].Y != 4 {
		t.Fatalf("grid order: %+v", pts)
	}
	plain, err := Speciate(a, Options{})
	if err != nil {
		t.Fatal(err)
	}
	got := siAt(t, pts, 0, "calcite")
	want, _ := plain.SI("calcite")
	if math.Abs(got-want) > 1e-8 {
		t.Errorf("1 cycle at the sample temperature: calcite SI %.10f, want %.10f (the water itself)", got, want)
	}
	// Blend with itself at any fraction is the water itself.
	bl, err := Sweep(a, Axis{Var: VaryFraction, Values: []float64{0.25, 0.75}, Partner: a}, nil, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for i := range bl {
		if math.Abs(siAt(t, bl, i, "calcite")-want) > 1e-8 {
			t.Errorf("blend of a water with itself: calcite SI %.10f, want %.10f", siAt(t, bl, i, "calcite"), want)
		}
	}
}
