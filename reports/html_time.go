package reports

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"
	"time"

	"scalerisk/plan"
	"scalerisk/saturation"
)

// timeSeries keeps what the indices-over-time charts need of every
// computed sample with a date: its water, date, LSI and the saturation
// indices of its chart minerals (not the whole result, so that a long
// monitoring file costs little memory).
type timeSeries struct {
	series  map[string][]timePoint
	order   []string
	undated int
}

type timePoint struct {
	t        time.Time
	lsi      float64
	minerals []string           // the sample's chart minerals
	result   *saturation.Result // only those minerals
}

func newTimeSeries() *timeSeries { return &timeSeries{series: map[string][]timePoint{}} }

// add keeps the point of p, when it has a date.
func (ts *timeSeries) add(p *plan.Sample) {
	if p.Result == nil || p.Input.Date == "" {
		return
	}
	t, ok := parseDate(p.Input.Date)
	if !ok {
		ts.undated++
		return
	}
	tp := timePoint{t: t, lsi: math.NaN(), minerals: p.Minerals, result: &saturation.Result{}}
	if p.Indices != nil {
		tp.lsi = p.Indices.LSI
	}
	for _, m := range p.Result.Minerals {
		if slices.Contains(p.Minerals, m.Name) {
			tp.result.Minerals = append(tp.result.Minerals, m)
		}
	}
	if _, seen := ts.series[p.Name]; !seen {
		ts.order = append(ts.order, p.Name)
	}
	ts.series[p.Name] = append(ts.series[p.Name], tp)
}

// timeMinerals are the chart minerals of a water's samples, in the order of
// plan.ChartOrder(), then as they first appear.
func timeMinerals(pts []timePoint) []saturation.MineralResult {
	order := plan.ChartOrder()
	rank := func(name string) int {
		for i, c := range order {
			if c.Mineral == name {
				return i
			}
		}
		return len(order)
	}
	var out []saturation.MineralResult
	seen := map[string]bool{}
	for _, p := range pts {
		for _, m := range p.result.Minerals {
			if !seen[m.Name] {
				seen[m.Name] = true
				out = append(out, m)
			}
		}
	}
	slices.SortStableFunc(out, func(x, y saturation.MineralResult) int { return cmp.Compare(rank(x.Name), rank(y.Name)) })
	return out
}

// timeCharts builds the indices-over-time charts: one per water (sample
// name) with two or more computed samples whose dates read as calendar
// dates, at most maxTimeCharts, the waters with the most samples first.
func (b *builder) timeCharts(ts *timeSeries) ([]chartView, string) {
	var names []string
	for _, n := range ts.order {
		if len(ts.series[n]) >= 2 {
			names = append(names, n)
		}
	}
	slices.SortStableFunc(names, func(x, y string) int { return cmp.Compare(len(ts.series[y]), len(ts.series[x])) })
	note := ""
	if len(names) > maxTimeCharts {
		note = fmt.Sprintf("%s with dated samples %s not charted.", Plural(len(names)-maxTimeCharts, "further water", "further waters"),
			isAre(len(names)-maxTimeCharts))
		names = names[:maxTimeCharts]
	}
	if ts.undated > 0 {
		note = strings.TrimSpace(note + fmt.Sprintf(" %s could not be read as dates (year-month-day) and %s left out.",
			Plural(ts.undated, "sample date", "sample dates"), isAre(ts.undated)))
	}
	var views []chartView
	for i, name := range names {
		pts := slices.Clone(ts.series[name])
		slices.SortStableFunc(pts, func(x, y timePoint) int { return x.t.Compare(y.t) })
		var sweep []saturation.Point
		lsi := panel{Title: "Langelier index (LSI)", Color: colVermilion, SI: true, Limit: math.NaN()}
		for _, d := range pts {
			x := float64(d.t.UnixMilli())
			sweep = append(sweep, saturation.Point{X: x, Result: d.result})
			if finite(d.lsi) {
				lsi.Points = append(lsi.Points, xy{x, dec(d.lsi, 2)})
			}
		}
		panels := b.siPanels(sweep, timeMinerals(pts), 0)
		if len(lsi.Points) > 0 {
			panels = append([]panel{lsi}, panels...)
		}
		pc := panelChart{ID: fmt.Sprintf("time-%d", i+1), Time: true, XName: "sample date", XMin: math.NaN(), XMax: math.NaN(), Panels: panels}
		caption := fmt.Sprintf("%d samples from %s to %s, at the temperature of each sample.", len(pts),
			pts[0].t.Format("2 Jan 2006"), pts[len(pts)-1].t.Format("2 Jan 2006"))
		view, why, ok := b.addPanelChart(pc, name, caption, "", sweep)
		if why != "" {
			note = strings.TrimSpace(note + " " + why)
		}
		if ok {
			views = append(views, view)
		}
	}
	return views, note
}
