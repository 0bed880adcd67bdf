package plan_test

import (
	"errors"
	"fmt"
	"slices"
	"testing"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

func demo(t testing.TB) []saturation.Assessment {
	t.Helper()
	f, err := water.OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	records, _, err := water.Read("demo.csv", f, water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return saturation.AssessRecords("demo.csv", records, saturation.Options{})
}

// TestComputeKeepsErrors: a blend that cannot be computed (a partner water
// with nothing in it) is kept as an error of its part; the other parts are
// still computed.
func TestComputeKeepsErrors(t *testing.T) {
	as := demo(t)
	empty := water.Analysis{Name: "nothing"}
	p := plan.Compute(as[0], plan.Settings{Partner: &empty, BlendFraction: 0.5})
	err := p.PartErr("blend")
	if err == nil {
		t.Fatalf("the blend with an empty water gave no error; blends %+v", p.Blends)
	}
	var pe plan.Error
	if !errors.As(err, &pe) || pe.Part != "blend" {
		t.Errorf("error %v is not a plan.Error of the blend", err)
	}
	if p.Temperature.Computed() == 0 || p.Window == nil || len(p.Minerals) == 0 {
		t.Error("a failed blend stopped the other parts")
	}
}

// TestMineralsFixedOrder: the minerals charted follow plan.ChartOrder() for
// every sample, then the minerals past a limit.
func TestMineralsFixedOrder(t *testing.T) {
	chart := plan.ChartOrder()
	order := func(name string) int {
		for i, c := range chart {
			if c.Mineral == name {
				return i
			}
		}
		return len(chart)
	}
	for _, a := range demo(t) {
		p := plan.Compute(a, plan.Settings{})
		if len(p.Minerals) == 0 || p.Minerals[0] != "calcite" {
			t.Errorf("%s: minerals %v, want calcite first", a.Name, p.Minerals)
		}
		if !slices.IsSortedFunc(p.Minerals, func(x, y string) int { return order(x) - order(y) }) {
			t.Errorf("%s: minerals %v not in the fixed order", a.Name, p.Minerals)
		}
	}
}

// ExampleCompute plans the first demo water: its sweeps, the operating
// window and the minerals its charts show.
func ExampleCompute() {
	f, _ := water.OpenDemo()
	defer f.Close()
	records, _, _ := water.Read("demo.csv", f, water.ReadOptions{})
	a := saturation.AssessRecords("demo.csv", records, saturation.Options{})[0]
	p := plan.Compute(a, plan.Settings{})
	fmt.Println(a.Name)
	fmt.Println("temperature points:", p.Temperature.Computed(), "from", p.Temperature.From, "to", p.Temperature.To, "°C")
	fmt.Println("window:", len(p.Window.Temperatures), "×", len(p.Window.Cycles))
	fmt.Println("charted:", p.Minerals)
	fmt.Println("errors:", len(p.Errors))
	// Output:
	// Kestrel Fen makeup well 2
	// temperature points: 15 from 18 to 60 °C
	// window: 12 × 12
	// charted: [calcite gypsum silica_amorphous barite celestite fluorite tricalcium_phosphate]
	// errors: 0
}
