package reports

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"scalerisk/plan"
)

// TestChartLabelsEscaped: text that reaches a chart (a panel title, a heat
// map label, a mark) is encoded so that it cannot end the script element
// or become markup: go-echarts itself would write it as it is.
func TestChartLabelsEscaped(t *testing.T) {
	const evil = `</script><script>alert(1)</script>`
	pc := panelChart{ID: "t", XName: evil, XMin: math.NaN(), XMax: math.NaN(),
		Marks:  []xMark{{X: 1, Label: evil}},
		Panels: []panel{{Title: evil, Color: colBlue, SI: true, Limit: 1, Points: []xy{{0, 0.5}, {1, 0.7}}}}}
	option, err := pc.option()
	if err != nil {
		t.Fatal(err)
	}
	hc := windowChart{ID: "h", labels: map[string]string{"calcite": evil}, w: &plan.Window{
		Temperatures: []float64{20, 40}, Cycles: []float64{1, 2}, Margin: []float64{1, 0.5, 0.2, -0.1},
		Nearest: []string{evil, "calcite", "calcite", "calcite"}, Present: [2]float64{20, 1},
		Curves: []plan.Curve{{Mineral: "calcite", Limit: 1.8, Points: [][2]float64{{20, 1.5}, {40, 1.2}}}}}}
	cc := compositionChart{ID: "c", Ions: []ionBar{{Name: evil, Cation: true, MeqPerL: 2, Color: colBlue}}}
	for id, opt := range map[string]map[string]any{"t": option, "h": hc.option(), "c": cc.option()} {
		raw, err := chartJSON(id, opt)
		if err != nil {
			t.Fatal(err)
		}
		s := string(raw)
		if strings.ContainsAny(s, "<>") {
			t.Errorf("chart %s: option holds < or >: %.200s", id, s)
		}
		if !strings.Contains(s, `\u003c/script\u003e`) {
			t.Errorf("chart %s: the label is not in the option, escaped", id)
		}
	}
}

// TestChartRefusesNaN: a NaN that slips into an option is an error, never a
// silently empty chart.
func TestChartRefusesNaN(t *testing.T) {
	if _, err := chartJSON("x", map[string]any{"series": []any{map[string]any{"data": []float64{1, math.NaN()}}}}); err == nil {
		t.Error("chartJSON accepted NaN")
	}
	// Panels drop NaN points; a panel with no finite point is an error.
	p := panel{Title: "p", Points: []xy{{0, math.NaN()}}, Limit: math.NaN()}
	if _, _, _, err := p.yRange(); err == nil {
		t.Error("yRange of a panel without values: no error")
	}
	pc := panelChart{ID: "n", XMin: math.NaN(), XMax: math.NaN(),
		Panels: []panel{{Title: "p", Limit: math.NaN(), Points: []xy{{0, 1}, {1, math.NaN()}, {math.Inf(1), 2}}}}}
	option, err := pc.option()
	if err != nil {
		t.Fatal(err)
	}
	if _, err := chartJSON("n", option); err != nil {
		t.Errorf("NaN points reach the option: %v", err)
	}
}

// TestPanelChartDropsEmptyPanels: a panel with no finite point (a pH
// panel whose dose points all failed) is dropped, not an error, and the
// chart is drawn from the others; a chart left with no panel is an error
// its caller turns into a note.
func TestPanelChartDropsEmptyPanels(t *testing.T) {
	nan := math.NaN()
	pc := panelChart{ID: "s3-dose", XMin: 0, XMax: nan, Panels: []panel{
		{Title: "pH", Limit: nan},
		{Title: "empty too", Limit: nan, Points: []xy{{0, nan}, {nan, 1}}},
		{Title: "gypsum", SI: true, Limit: 0.36, Points: []xy{{0, -0.5}, {50, nan}, {100, -0.4}}},
		{Title: "anhydrite", SI: true, Limit: 0.36, Points: []xy{{0, -0.7}, {100, -0.6}}},
	}}
	drawn, dropped := pc.drawable()
	if !slices.Equal(dropped, []string{"pH", "empty too"}) {
		t.Errorf("dropped %q, want the pH panel and the other empty one", dropped)
	}
	if len(drawn.Panels) != 2 || len(drawn.Panels[0].Points) != 2 {
		t.Fatalf("drawable kept %+v, want gypsum with its two finite points and anhydrite", drawn.Panels)
	}
	if drawn.height() >= pc.height() {
		t.Errorf("height %d of the drawable chart, want less than %d", drawn.height(), pc.height())
	}
	option, err := pc.option()
	if err != nil {
		t.Fatalf("a chart with empty panels: %v", err)
	}
	raw, err := chartJSON(pc.ID, option)
	if err != nil {
		t.Fatal(err)
	}
	if s := string(raw); strings.Contains(s, `"pH"`) || !strings.Contains(s, `"gypsum"`) {
		t.Errorf("the option holds the pH panel or lacks gypsum: %.300s", s)
	}
	pc.Panels = pc.Panels[:2]
	if _, err := pc.option(); !errors.Is(err, errNoPanel) {
		t.Errorf("a chart with no finite point: err = %v, want errNoPanel", err)
	}
}

func TestTickStep(t *testing.T) {
	for _, c := range []struct{ x, want float64 }{{0.07, 0.1}, {0.3, 0.5}, {0.9, 1}, {1.2, 2}, {2.2, 2.5}, {7, 10}, {42, 50}} {
		if got := tickStep(c.x); got != c.want {
			t.Errorf("tickStep(%g) = %g, want %g", c.x, got, c.want)
		}
	}
}

func TestMineralLabel(t *testing.T) {
	for in, want := range map[string]string{"silica_amorphous": "amorphous silica", "tricalcium_phosphate": "tricalcium phosphate", "calcite": "calcite"} {
		if got := mineralLabel(in); got != want {
			t.Errorf("mineralLabel(%q) = %q, want %q", in, got, want)
		}
	}
}
