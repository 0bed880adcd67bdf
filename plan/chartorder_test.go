package plan_test

import (
	"slices"
	"testing"

	"scalerisk/plan"
	"scalerisk/water"
)

// TestChartOrderIsCopy edits what ChartOrder returns (a mineral's name,
// its needed components, the slice's length) and checks that a later call
// and the charts of the demo are unchanged.
func TestChartOrderIsCopy(t *testing.T) {
	first := plan.ChartOrder()
	if len(first) == 0 || first[0].Mineral != "calcite" || len(first[0].Needs) == 0 {
		t.Fatalf("ChartOrder() = %+v, want calcite first with its components", first)
	}
	wantNeeds := slices.Clone(first[0].Needs)
	n := len(first)
	first[0].Mineral = "edited"
	first[0].Needs[0] = water.Ba
	_ = append(first[:1], plan.ChartMineral{Mineral: "appended"})
	again := plan.ChartOrder()
	if len(again) != n || again[0].Mineral != "calcite" || !slices.Equal(again[0].Needs, wantNeeds) || again[1].Mineral == "appended" {
		t.Errorf("editing the slice ChartOrder returned changed a later call: %+v", again)
	}
	for _, a := range demo(t) {
		if p := plan.Compute(a, plan.Settings{}); len(p.Minerals) == 0 || p.Minerals[0] != "calcite" {
			t.Errorf("%s: after editing a copy of ChartOrder, minerals %v, want calcite first", a.Name, p.Minerals)
		}
	}
}
