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

// TestDetailedSkipsWindow: a sample that Settings.Detailed rejects gets no
// operating window and no error for it; its other parts are computed, and
// one it accepts gets its window.
func TestDetailedSkipsWindow(t *testing.T) {
	a := demo(t)[0]
	asked := 0
	skip := plan.Compute(a, plan.Settings{Detailed: func(p *plan.Sample) bool {
		asked++
		if len(p.Ranking) == 0 {
			t.Error("Detailed was called before the ranking was set")
		}
		return false
	}})
	if asked != 1 {
		t.Errorf("Detailed was called %d times, want once", asked)
	}
	if skip.Window != nil || skip.PartErr("operating window") != nil {
		t.Errorf("a rejected sample has window %v, error %v; want neither", skip.Window, skip.PartErr("operating window"))
	}
	if skip.Temperature.Computed() == 0 || len(skip.Minerals) == 0 {
		t.Error("skipping the window stopped the other parts")
	}
	keep := plan.Compute(a, plan.Settings{Detailed: func(*plan.Sample) bool { return true }})
	if keep.Window == nil || len(keep.Window.Margin) != plan.WindowSide*plan.WindowSide {
		t.Errorf("an accepted sample has window %v, want a %d×%d grid", keep.Window, plan.WindowSide, plan.WindowSide)
	}
}
