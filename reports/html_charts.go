package reports

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"

	"github.com/go-echarts/go-echarts/v2/charts"
	"github.com/go-echarts/go-echarts/v2/opts"

	"scalerisk/saturation"
)

// The charts are built with go-echarts and written by this package rather
// than by go-echarts' page templates, for three reasons the style notes
// give: go-echarts writes labels into the script unescaped, so user text
// could end the script element; it writes floats at full precision; and
// its page loads the script from a remote host. chartJSON therefore takes
// the option object go-echarts builds, adds what go-echarts has no field
// for (several panel titles, rich-text tooltips, mark bands), and encodes
// it with encoding/json, which writes <, > and & as \u003c, \u003e and
// \u0026 (so no text can close the script) and refuses NaN and ±Inf (so
// no NaN can reach a chart, where it would silently empty it). All values
// are rounded before they go in.

// fontFamily is the chart font, the same stack as the page's.
const fontFamily = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif"

// chartJSON encodes a chart option object.
func chartJSON(id string, option map[string]any) (json.RawMessage, error) {
	b, err := json.Marshal(option)
	if err != nil {
		return nil, fmt.Errorf("chart %s: %w", id, err)
	}
	return b, nil
}

// xy is one point of a line: x in the axis unit (Unix milliseconds on a
// time axis), y rounded for display.
type xy struct{ X, Y float64 }

// panel is one small chart of a panel chart: a line with its own y axis.
type panel struct {
	Title  string
	Color  string
	Points []xy
	// SI draws the equilibrium line (SI = 0) and the near-equilibrium band
	// (±saturation.NearEquilibriumSI) and sizes the axis to show them.
	SI bool
	// Limit is the limit on the SI drawn as a dashed line; NaN for none.
	Limit float64
	// YName is the quantity of the y axis ("SI", "pH").
	YName string
}

// xMark is a vertical line across every panel, e.g. the highest cycles.
type xMark struct {
	X     float64
	Label string
}

// panelChart is a grid of small charts that share an x axis variable, each
// with its own y scale: a mineral with SI +12 does not flatten the line of
// a mineral near 0, and each panel can show its own inhibitor limit.
type panelChart struct {
	ID         string
	XName      string  // axis name, e.g. "°C"
	Time       bool    // x is Unix milliseconds, shown as dates (UTC)
	XMin, XMax float64 // axis range; NaN for automatic
	Marks      []xMark
	Panels     []panel
}

// Layout of panel charts, px.
const (
	panelRowHeight = 174
	panelTitleGap  = 30
	panelBottomGap = 44
)

func panelColumns(n int) int {
	switch {
	case n <= 2:
		return max(n, 1)
	case n == 4:
		return 2
	case n <= 6:
		return 3
	}
	return 4
}

// height is the chart height in px.
func (pc panelChart) height() int {
	cols := panelColumns(len(pc.Panels))
	rows := (len(pc.Panels) + cols - 1) / cols
	return rows*panelRowHeight + 6
}

// drawable returns pc with its points that are not finite left out and
// its panels with no point left dropped, and the titles of the panels it
// dropped. A sweep whose points failed thus loses a panel (or, when every
// panel is empty, the whole chart) rather than the report.
func (pc panelChart) drawable() (panelChart, []string) {
	out := pc
	out.Panels = nil
	var dropped []string
	for _, p := range pc.Panels {
		q := p
		q.Points = nil
		for _, pt := range p.Points {
			if finite(pt.X) && finite(pt.Y) {
				q.Points = append(q.Points, pt)
			}
		}
		if len(q.Points) == 0 {
			dropped = append(dropped, p.Title)
			continue
		}
		out.Panels = append(out.Panels, q)
	}
	return out, dropped
}

// errNoPanel marks a panel chart none of whose panels has a finite point.
var errNoPanel = errors.New("no panel has a value that could be computed")

// option builds the echarts option of a panel chart from its drawable
// panels (see drawable); call height on the drawable chart too. The error
// is errNoPanel when no panel is left.
func (pc panelChart) option() (map[string]any, error) {
	pc, _ = pc.drawable()
	if len(pc.Panels) == 0 {
		return nil, fmt.Errorf("chart %s: %w", pc.ID, errNoPanel)
	}
	n := len(pc.Panels)
	cols := panelColumns(n)
	colWidth := 100.0 / float64(cols)
	line := charts.NewLine()
	var grids []opts.Grid
	var titles []map[string]any
	var xAxes []opts.XAxis
	var yAxes []opts.YAxis
	for i, p := range pc.Panels {
		col, row := i%cols, i/cols
		top := row*panelRowHeight + panelTitleGap
		grids = append(grids, opts.Grid{
			Left:   pct(float64(col)*colWidth + 8.5),
			Width:  pct(colWidth - 11.5),
			Top:    fmt.Sprintf("%dpx", top),
			Height: fmt.Sprintf("%dpx", panelRowHeight-panelTitleGap-panelBottomGap),
		})
		titles = append(titles, panelTitle(p.Title, pct(float64(col)*colWidth+1.5), row*panelRowHeight+6))
		xAxes = append(xAxes, pc.xAxis(i))
		lo, hi, step, err := p.yRange()
		if err != nil {
			return nil, fmt.Errorf("chart %s, panel %q: %w", pc.ID, p.Title, err)
		}
		yAxes = append(yAxes, opts.YAxis{
			Type: "value", GridIndex: i, Min: lo, Max: hi, MinInterval: step, MaxInterval: step,
			Name: p.YName, NameLocation: "middle", NameGap: 44,
			AxisLabel: &opts.AxisLabel{Show: opts.Bool(true)},
			SplitLine: &opts.SplitLine{Show: opts.Bool(true), LineStyle: &opts.LineStyle{Color: "#e6e9ee"}},
		})
	}
	line.SetGlobalOptions(staticSVG(pc.ID, pc.height())...)
	line.SetGlobalOptions(
		charts.WithColorsOpts(opts.Colors(palette)),
		charts.WithLegendOpts(opts.Legend{Show: opts.Bool(false)}),
		charts.WithGridOpts(grids...),
	)
	line.XAxisList, line.YAxisList = xAxes, yAxes
	for i, p := range pc.Panels {
		data := make([]opts.LineData, 0, len(p.Points))
		for _, pt := range p.Points {
			if !finite(pt.X) || !finite(pt.Y) {
				continue
			}
			data = append(data, opts.LineData{Value: []float64{pt.X, pt.Y}})
		}
		marks := pc.markLines(p)
		line.AddSeries(p.Title, data, charts.WithSeriesOpts(func(s *charts.SingleSeries) {
			s.XAxisIndex, s.YAxisIndex = i, i
			s.Symbol, s.SymbolSize, s.ShowSymbol = "circle", 5, opts.Bool(true)
			s.LineStyle = &opts.LineStyle{Width: 2, Color: p.Color}
			s.ItemStyle = &opts.ItemStyle{Color: p.Color}
			if len(marks) > 0 {
				s.MarkLines = &opts.MarkLines{Data: marks,
					MarkLineStyle: opts.MarkLineStyle{Symbol: []string{"none", "none"}}}
			}
			if p.SI {
				// The near-equilibrium band as a [from, to] pair, which
				// go-echarts' mark-area helpers do not write.
				s.MarkAreas = &opts.MarkAreas{
					Data:          []any{[]any{map[string]any{"yAxis": -saturation.NearEquilibriumSI}, map[string]any{"yAxis": saturation.NearEquilibriumSI}}},
					MarkAreaStyle: opts.MarkAreaStyle{ItemStyle: &opts.ItemStyle{Color: "rgba(86,180,233,0.16)"}},
				}
			}
		}))
	}
	line.Validate()
	option := line.JSON()
	option["title"] = titles
	option["tooltip"] = richTooltip("axis")
	option["textStyle"] = map[string]any{"fontFamily": fontFamily}
	if pc.Time {
		option["useUTC"] = true
	}
	return option, nil
}

// panelTitle is the title of a panel at left, top.
func panelTitle(text, left string, top int) map[string]any {
	return map[string]any{"text": text, "left": left, "top": top,
		"textStyle": map[string]any{"fontSize": 13, "fontWeight": 600, "color": "#1b2733", "fontFamily": fontFamily}}
}

// xAxis is the x axis of panel i.
func (pc panelChart) xAxis(i int) opts.XAxis {
	xa := opts.XAxis{
		Type: "value", GridIndex: i, Name: pc.XName, NameLocation: "middle", NameGap: 26, SplitNumber: 4,
		AxisLabel: &opts.AxisLabel{Show: opts.Bool(true), HideOverlap: opts.Bool(true)},
		SplitLine: &opts.SplitLine{Show: opts.Bool(false)},
	}
	if pc.Time {
		// The first date is a data point, not a round date: its label
		// would crowd the first month.
		xa.Type = "time"
		xa.AxisLabel.ShowMinLabel = opts.Bool(false)
	}
	if finite(pc.XMin) {
		xa.Min = pc.XMin
	}
	if finite(pc.XMax) {
		xa.Max = pc.XMax
	}
	return xa
}

// markLines are the equilibrium and inhibitor-limit lines of a panel and
// the vertical marks of the chart.
func (pc panelChart) markLines(p panel) []any {
	var out []any
	if p.SI {
		out = append(out, map[string]any{
			"yAxis": 0, "name": "equilibrium",
			"lineStyle": map[string]any{"color": "#3b4a5a", "type": "solid", "width": 1},
			"label":     map[string]any{"show": false},
		})
		if finite(p.Limit) {
			out = append(out, map[string]any{
				"yAxis": dec(p.Limit, 2), "name": "limit " + signed(p.Limit, 2),
				"lineStyle": map[string]any{"color": colVermilion, "type": "dashed", "width": 1.5},
				"label":     map[string]any{"show": false},
			})
		}
	}
	for _, m := range pc.Marks {
		if !finite(m.X) {
			continue
		}
		out = append(out, map[string]any{
			"xAxis": m.X, "name": m.Label,
			"lineStyle": map[string]any{"color": "#3b4a5a", "type": "dotted", "width": 1.5},
			"label":     map[string]any{"show": false},
		})
	}
	return out
}

// yRange is the y axis range of a panel and its tick interval: the data
// with a margin, widened for SI panels to show the near-equilibrium band
// and the inhibitor limit, and rounded outwards to a tick interval of 1, 2,
// 2.5 or 5 times a power of ten that gives at most five intervals.
func (p panel) yRange() (lo, hi, step float64, err error) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, pt := range p.Points {
		if finite(pt.Y) {
			lo, hi = math.Min(lo, pt.Y), math.Max(hi, pt.Y)
		}
	}
	if lo > hi {
		return 0, 0, 0, errNoValue
	}
	if p.SI {
		lo, hi = math.Min(lo, -saturation.NearEquilibriumSI-0.1), math.Max(hi, saturation.NearEquilibriumSI+0.1)
		if finite(p.Limit) {
			lo, hi = math.Min(lo, p.Limit), math.Max(hi, p.Limit+0.1)
		}
	}
	pad := 0.04 * math.Max(hi-lo, 0.1)
	lo, hi = lo-pad, hi+pad
	step = tickStep((hi - lo) / 5)
	lo, hi = math.Floor(lo/step)*step, math.Ceil(hi/step)*step
	if hi-lo < 2*step {
		lo, hi = lo-step, hi+step
	}
	return dec(lo, 6), dec(hi, 6), step, nil
}

// tickStep returns the smallest of 1, 2, 2.5 and 5 times a power of ten
// that is at least x > 0.
func tickStep(x float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, m := range []float64{1, 2, 2.5, 5} {
		if m*p >= x*(1-1e-9) {
			return dec(m*p, 9)
		}
	}
	return dec(10*p, 9)
}

// richTooltip is a tooltip drawn as chart text rather than HTML, so that
// no label can become markup.
func richTooltip(trigger string) map[string]any {
	return map[string]any{"show": true, "trigger": trigger, "renderMode": "richText", "confine": true}
}

func pct(x float64) string { return fmt.Sprintf("%.1f%%", x) }

// staticSVG returns the options every chart of the report shares: drawn as SVG
// (sharp in print), full width at the given height in pixels, no animation.
func staticSVG(id string, height int) []charts.GlobalOpts {
	return []charts.GlobalOpts{
		charts.WithInitializationOpts(opts.Initialization{ChartID: id, Renderer: "svg", Width: "100%",
			Height: fmt.Sprintf("%dpx", height)}),
		charts.WithAnimation(false),
	}
}

// ionBar is one series of the composition chart: an ion (or group) and
// its meq/L among the cations or the anions.
type ionBar struct {
	Name      string
	Cation    bool
	MeqPerL   float64
	Color     string
	TextColor string // of the label on the bar
}

// compositionChart is a horizontal stacked bar of cations and anions,
// meq/L: the two bars are equally long when the ions balance.
type compositionChart struct {
	ID   string
	Ions []ionBar
}

func (cc compositionChart) height() int { return 230 }

func (cc compositionChart) option() map[string]any {
	bar := charts.NewBar()
	bar.SetGlobalOptions(staticSVG(cc.ID, cc.height())...)
	bar.SetGlobalOptions(
		charts.WithLegendOpts(opts.Legend{Show: opts.Bool(true), Bottom: "0", ItemWidth: 14, ItemHeight: 10}),
		charts.WithGridOpts(opts.Grid{Left: "80px", Right: "32px", Top: "12px", Bottom: "84px"}),
		// Horizontal bars: the categories go on the y axis (XYReversal).
		charts.WithXAxisOpts(opts.XAxis{Type: "value", Name: "meq/L", NameLocation: "middle", NameGap: 26}),
		charts.WithYAxisOpts(opts.YAxis{Type: "category", AxisLabel: &opts.AxisLabel{Show: opts.Bool(true)}}),
	)
	categories := []string{"anions", "cations"}
	bar.SetXAxis(categories)
	var cationSum, anionSum float64
	for _, ion := range cc.Ions {
		if ion.Cation {
			cationSum += ion.MeqPerL
		} else {
			anionSum += ion.MeqPerL
		}
	}
	longest := math.Max(cationSum, anionSum)
	for _, ion := range cc.Ions {
		v := sig(ion.MeqPerL, 3)
		cell := map[string]any{"value": v, "label": map[string]any{"show": v >= 0.07*longest}}
		empty := map[string]any{"value": "-"}
		data := []map[string]any{cell, empty}
		if ion.Cation {
			data = []map[string]any{empty, cell}
		}
		bar.AddSeries(ion.Name, nil, charts.WithSeriesOpts(func(s *charts.SingleSeries) {
			s.Data = data
			s.Stack = "meq"
			s.BarWidth = "46%"
			s.ItemStyle = &opts.ItemStyle{Color: ion.Color, BorderColor: "#ffffff", BorderWidth: 1}
			s.Label = &opts.Label{Show: opts.Bool(true), Formatter: "{a}", FontSize: 11, Color: ion.TextColor}
		}))
	}
	bar.XYReversal()
	bar.Validate()
	option := bar.JSON()
	option["tooltip"] = map[string]any{"show": true, "trigger": "item", "renderMode": "richText",
		"confine": true, "formatter": "{a}: {c} meq/L"}
	option["textStyle"] = map[string]any{"fontFamily": fontFamily}
	return option
}
