package saturation

import (
	"math"
	"slices"
	"testing"
)

// TestRank orders invented saturation states by the rule of Rank, with the
// SI limits of the embedded profiles (data/limits.csv: common practice,
// calcite +1.8 and gypsum +0.36 with an inhibitor, calcite +0.2 and gypsum
// 0 without) and the slow-to-form list (data/slow_minerals.csv:
// hydroxyapatite).
func TestRank(t *testing.T) {
	const tol = 1e-9 // the margins are differences of table values
	r := &Result{Minerals: []MineralResult{
		{Name: "siderite", SI: 0.5},        // no limit, supersaturated
		{Name: "barite", SI: 1.0},          // within 1.78
		{Name: "gypsum", SI: 0.5},          // 0.14 past 0.36
		{Name: "calcite", SI: 2.0},         // 0.2 past 1.8
		{Name: "hydroxyapatite", SI: 5},    // slow to form: left out
		{Name: "quartz", SI: -1},           // undersaturated: left out
		{Name: "fluorite", SI: math.NaN()}, // not computed: left out
	}}
	inhibitor, err := LimitProfileNamed("inhibitor")
	if err != nil {
		t.Fatal(err)
	}
	none, err := LimitProfileNamed("no-inhibitor")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		profile *LimitProfile
		order   []string
		margin0 float64 // of the first
		band0   Band
	}{
		{nil, []string{"calcite", "gypsum", "barite", "siderite"}, -0.2, BeyondReach},
		{&inhibitor, []string{"calcite", "gypsum", "barite", "siderite"}, -0.2, BeyondReach},
		// Without an inhibitor calcite is 1.8 past +0.2, barite 1.0 past 0.
		{&none, []string{"calcite", "barite", "gypsum", "siderite"}, -1.8, BeyondReach},
	} {
		got := Rank(r, c.profile)
		var names []string
		for _, m := range got {
			names = append(names, m.Name)
		}
		if !slices.Equal(names, c.order) {
			t.Errorf("Rank under %v = %v, want %v", c.profile, names, c.order)
			continue
		}
		if math.Abs(got[0].Margin-c.margin0) > tol || got[0].Band != c.band0 {
			t.Errorf("Rank under %v: first margin %g band %v, want %g ± %g, %v", c.profile, got[0].Margin, got[0].Band, c.margin0, tol, c.band0)
		}
		if sd := got[len(got)-1]; !math.IsNaN(sd.Limit) || !math.IsNaN(sd.Margin) || sd.Band != Supersaturated {
			t.Errorf("siderite: limit %g margin %g band %v, want NaN, NaN, supersaturated", sd.Limit, sd.Margin, sd.Band)
		}
	}
	if _, ok := Limiting(&Result{Minerals: []MineralResult{{Name: "calcite", SI: -1}}}, nil); ok {
		t.Error("Limiting of an undersaturated water: ok, want none")
	}
}
