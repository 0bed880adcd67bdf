package plan

import (
	"math"

	"scalerisk/saturation"
)

// Window is the operating window of a sample over temperature and cycles
// of concentration: at every point of a grid, the margin to the nearest SI
// limit of the profile, and for every limited mineral the curve where it
// reaches its limit.
type Window struct {
	Temperatures []float64 // °C, the columns
	Cycles       []float64 // the rows, from 1
	// Margin is the margin to the nearest limit (limit − SI, SI units) at
	// row i, column j in Margin[i*len(Temperatures)+j]: positive inside
	// every limit, negative past one; NaN where the point failed or no
	// mineral has a limit. Nearest names the mineral of that limit.
	Margin  []float64
	Nearest []string
	// Points are the grid's points, temperature running fastest.
	Points []saturation.Point
	// Curves are where each limited mineral reaches its limit inside the
	// grid, in table order.
	Curves []Curve
	// Present is the sample as it is: its temperature at 1 cycle.
	Present [2]float64
	Failed  int
	// FirstErr is the error of the first point that failed.
	FirstErr error
}

// Curve is the line where a mineral reaches its limit: for each
// temperature column whose margin changes sign along the cycles, the
// cycles (interpolated linearly) where it does.
type Curve struct {
	Mineral string
	Limit   float64 // SI
	Points  [][2]float64
}

// WindowSide is the number of temperatures and of cycles of the window's
// grid.
const WindowSide = 12

func windowStep(p *Sample, s Settings) error {
	if s.Detailed != nil && !s.Detailed(p) {
		return nil // a summary row only: no section shows the window
	}
	bulk := p.Result.Temperature
	w := &Window{Temperatures: saturation.Range(bulk, s.HotEnd(bulk), WindowSide),
		Cycles: saturation.Range(1, s.Cycles(), WindowSide), Present: [2]float64{bulk, 1}}
	pts, err := saturation.Sweep(p.Input, saturation.Axis{Var: saturation.VaryTemperature, Values: w.Temperatures},
		&saturation.Axis{Var: saturation.VaryCycles, Values: w.Cycles, Rule: s.CyclesRule}, s.Speciation)
	if err != nil {
		return err
	}
	w.Points = pts
	prof := s.LimitProfile()
	limits := map[string]float64{}
	var order []string
	w.Margin = make([]float64, len(pts))
	w.Nearest = make([]string, len(pts))
	for k, pt := range pts {
		w.Margin[k] = math.NaN()
		if pt.Result == nil {
			w.Failed++
			if w.FirstErr == nil {
				w.FirstErr = pt.Err
			}
			continue
		}
		for _, m := range pt.Result.Minerals {
			l, ok := siLimit(prof, m.Name)
			if !ok || !finite(m.SI) {
				continue
			}
			if _, seen := limits[m.Name]; !seen {
				limits[m.Name] = l
				order = append(order, m.Name)
			}
			if margin := l - m.SI; math.IsNaN(w.Margin[k]) || margin < w.Margin[k] {
				w.Margin[k], w.Nearest[k] = margin, m.Name
			}
		}
	}
	for _, name := range order {
		if c := w.curve(pts, name, limits[name]); len(c.Points) > 0 {
			w.Curves = append(w.Curves, c)
		}
	}
	p.Window = w
	return nil
}

// siLimit is the SI limit profile p sets on mineral, unless the mineral is
// slow to form.
func siLimit(p saturation.LimitProfile, mineral string) (float64, bool) {
	if r, _ := saturation.InhibitorReach(mineral); r.Slow {
		return 0, false
	}
	l, ok := p.Lookup("si:" + mineral)
	if !ok || !finite(l.Max) {
		return 0, false
	}
	return l.Max, true
}

// curve finds, column by column, the first cycles where mineral's SI
// reaches limit.
func (w *Window) curve(pts []saturation.Point, mineral string, limit float64) Curve {
	c := Curve{Mineral: mineral, Limit: limit}
	nt := len(w.Temperatures)
	for j, t := range w.Temperatures {
		for i := 1; i < len(w.Cycles); i++ {
			a, okA := siAt(pts[(i-1)*nt+j], mineral)
			b, okB := siAt(pts[i*nt+j], mineral)
			if !okA || !okB || (a-limit)*(b-limit) > 0 || a == b {
				continue
			}
			f := (limit - a) / (b - a)
			c.Points = append(c.Points, [2]float64{t, w.Cycles[i-1] + f*(w.Cycles[i]-w.Cycles[i-1])})
			break
		}
	}
	return c
}

func siAt(p saturation.Point, mineral string) (float64, bool) {
	if p.Result == nil {
		return 0, false
	}
	si, ok := p.Result.SI(mineral)
	return si, ok && finite(si)
}
