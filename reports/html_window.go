package reports

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"scalerisk/plan"
)

// The operating window: over temperature and cycles of concentration, the
// margin to the nearest saturation-index limit as a filled field, the curve
// where each mineral reaches its limit, and the sample as it is marked.
// Every label is in the legend or on the axes, never on the field.

// marginBin is one colour class of the margin to the nearest limit.
type marginBin struct {
	min, max   float64 // SI units; ±Inf at the ends
	label      string
	fill, text string
}

// marginBins run from far past a limit to ample room (Okabe–Ito colours,
// as the risk bands).
var marginBins = []marginBin{
	{math.Inf(-1), -0.5, "past a limit by more than 0.5", colVermilion, "#000000"},
	{-0.5, 0, "past a limit by up to 0.5", colOrange, "#000000"},
	{0, 0.3, "within 0.3 of a limit", colYellow, "#000000"},
	{0.3, 1, "0.3 to 1 below every limit", colSky, "#000000"},
	{1, math.Inf(1), "more than 1 below every limit", colBlue, "#ffffff"},
}

func binOf(margin float64) int {
	for i, b := range marginBins {
		if margin < b.max {
			return i
		}
	}
	return len(marginBins) - 1
}

// windowChart is the option data of the operating window.
type windowChart struct {
	ID     string
	w      *plan.Window
	labels map[string]string // mineral → label for the legend
}

// curves are the limit curves of the charted minerals.
func (wc windowChart) curves() []plan.Curve {
	var out []plan.Curve
	for _, c := range wc.w.Curves {
		if _, ok := wc.labels[c.Mineral]; ok {
			out = append(out, c)
		}
	}
	return out
}

// windowLegendRows estimates the rows the legend takes at the top.
func (wc windowChart) legendRows() int {
	n := len(wc.curves()) + 1
	return (n + 4) / 5
}

func (wc windowChart) height() int { return 330 + 22*wc.legendRows() }

// edges returns the value-axis range that puts grid values at cell
// centres.
func edges(v []float64) (lo, hi float64) {
	if len(v) < 2 {
		return v[0] - 0.5, v[0] + 0.5
	}
	step := (v[len(v)-1] - v[0]) / float64(len(v)-1)
	return v[0] - step/2, v[len(v)-1] + step/2
}

// option builds the echarts option: a heat map on category axes (hidden)
// and, on value axes over the same grid, the limit curves and the present
// point.
func (wc windowChart) option() map[string]any {
	w := wc.w
	nt := len(w.Temperatures)
	var cells []any
	for k, m := range w.Margin {
		if !finite(m) {
			continue
		}
		name := fmt.Sprintf("%s °C, %s cycles: margin %s to the %s limit", num(w.Temperatures[k%nt], 0),
			num(w.Cycles[k/nt], 1), signed(m, 2), mineralLabel(w.Nearest[k]))
		cells = append(cells, map[string]any{"name": name, "value": []any{k % nt, k / nt, binOf(m)}})
	}
	top := 14 + 22*wc.legendRows()
	grid := map[string]any{"left": 64, "right": 24, "top": top, "bottom": 86}
	xLo, xHi := edges(w.Temperatures)
	yLo, yHi := edges(w.Cycles)
	hidden := map[string]any{"show": false}
	xAxes := []any{
		map[string]any{"type": "category", "data": seq(nt), "show": false, "gridIndex": 0},
		map[string]any{"type": "value", "min": dec(xLo, 3), "max": dec(xHi, 3), "gridIndex": 0, "position": "bottom",
			"name": "Temperature, °C", "nameLocation": "middle", "nameGap": 26,
			"axisLabel": map[string]any{"showMinLabel": false, "showMaxLabel": false}, "splitLine": hidden},
	}
	yAxes := []any{
		map[string]any{"type": "category", "data": seq(len(w.Cycles)), "show": false, "gridIndex": 0},
		map[string]any{"type": "value", "min": dec(yLo, 3), "max": dec(yHi, 3), "gridIndex": 0, "position": "left",
			"name": "Cycles of concentration", "nameLocation": "middle", "nameGap": 40,
			"axisLabel": map[string]any{"showMinLabel": false, "showMaxLabel": false}, "splitLine": hidden},
	}
	series := []any{map[string]any{"type": "heatmap", "name": "margin", "xAxisIndex": 0, "yAxisIndex": 0,
		"data": cells, "itemStyle": map[string]any{"borderColor": "#ffffff", "borderWidth": 0.5},
		"emphasis": map[string]any{"disabled": true}}}
	var legend []any
	for i, c := range wc.curves() {
		var pts []any
		for _, p := range c.Points {
			pts = append(pts, []float64{dec(p[0], 2), dec(p[1], 3)})
		}
		name := wc.labels[c.Mineral]
		color := curveColors[i%len(curveColors)]
		series = append(series, map[string]any{"type": "line", "name": name, "xAxisIndex": 1, "yAxisIndex": 1,
			"data": pts, "showSymbol": false, "lineStyle": map[string]any{"color": color, "width": 2.5,
				"type": curveDash[i%len(curveDash)]}, "itemStyle": map[string]any{"color": color}})
		legend = append(legend, name)
	}
	present := "the sample as it is"
	series = append(series, map[string]any{"type": "scatter", "name": present, "xAxisIndex": 1, "yAxisIndex": 1,
		"data": []any{[]float64{dec(w.Present[0], 2), 1}}, "symbol": "diamond", "symbolSize": 16,
		"itemStyle": map[string]any{"color": "#ffffff", "borderColor": colBlack, "borderWidth": 2}})
	legend = append(legend, present)
	var pieces []any
	for i, b := range marginBins {
		pieces = append(pieces, map[string]any{"value": i, "label": b.label, "color": b.fill})
	}
	return map[string]any{
		"animation": false,
		"textStyle": map[string]any{"fontFamily": fontFamily},
		"grid":      []any{grid},
		"xAxis":     xAxes,
		"yAxis":     yAxes,
		"series":    series,
		"legend": map[string]any{"data": legend, "top": 4, "left": 8, "right": 8, "itemGap": 14,
			"textStyle": map[string]any{"fontSize": 12}, "selectedMode": false},
		"visualMap": []any{map[string]any{"type": "piecewise", "dimension": 2, "seriesIndex": 0, "pieces": pieces,
			"orient": "horizontal", "left": "center", "bottom": 4, "itemWidth": 14, "itemHeight": 12,
			"selectedMode": false, "textStyle": map[string]any{"fontSize": 11}}},
		"tooltip": map[string]any{"show": true, "trigger": "item", "renderMode": "richText", "confine": true,
			"formatter": "{b}"},
	}
}

// curveColors and curveDash tell the limit curves apart on any fill:
// dark colours with different dashes.
var (
	curveColors = []string{colBlack, "#5b2a86", "#00563f", "#7a3b00", "#1f3b73", "#6b6b6b", "#8a1c4a"}
	curveDash   = []string{"solid", "dashed", "dotted", "solid", "dashed", "dotted", "solid"}
)

func seq(n int) []string {
	out := make([]string, n)
	for i := range out {
		out[i] = fmt.Sprint(i)
	}
	return out
}

// windowView adds the operating window of a sample; ok is false when the
// window has no margin to show.
func (b *builder) windowView(id string, s *plan.Sample) (chartView, string, bool) {
	const title = "Operating window: margin to the nearest limit"
	w := s.Window
	if w == nil {
		return chartView{}, "", false
	}
	shown := 0
	for _, m := range w.Margin {
		if finite(m) {
			shown++
		}
	}
	if shown == 0 {
		return chartView{}, fmt.Sprintf("%s: not computed, none of its %d points gave a margin.", title, len(w.Margin)), false
	}
	labels := map[string]string{}
	var names []string
	for _, c := range w.Curves {
		if slices.Contains(s.Minerals, c.Mineral) {
			labels[c.Mineral] = mineralLabel(c.Mineral)
			names = append(names, labels[c.Mineral]+" (SI "+signed(c.Limit, 2)+")")
		}
	}
	wc := windowChart{ID: id, w: w, labels: labels}
	if err := b.addChart(id, wc.option()); err != nil {
		return chartView{}, fmt.Sprintf("%s: not drawn (%v).", title, err), false
	}
	caption := fmt.Sprintf("Each cell is coloured by how far the water is, at that temperature and concentration, "+
		"from the nearest saturation-index limit of %s (limit minus SI; past a limit where negative). ", profileWords(b.profile.Name))
	if len(names) > 0 {
		caption += "Each line marks where a mineral reaches its limit: " + joinWords(names) + ". "
	} else {
		caption += "No mineral reaches its limit inside this window. "
	}
	caption += fmt.Sprintf("The diamond is the sample as it is (%s °C, 1 cycle). Carbonate system of the cycles: %s.",
		num(w.Present[0], 1), ruleWords(b.o.Plan.Rule()))
	note := ""
	if w.Failed > 0 {
		note = fmt.Sprintf("%s: %s of %d could not be computed and %s left blank.", title,
			Plural(w.Failed, "point", "points"), len(w.Margin), isAre(w.Failed))
	}
	return chartView{ID: id, Title: title, Caption: caption, Height: wc.height()}, note, true
}

// joinWords joins names as a sentence does: "a", "a and b", "a, b and c".
func joinWords(names []string) string {
	switch len(names) {
	case 0:
		return ""
	case 1:
		return names[0]
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
}
