// Package uncertainty propagates the analytical uncertainty of a water
// analysis to its saturation indices, classic indices and treatment
// decisions by Monte Carlo: draws of the analysis → the same assessment per
// draw, warm-started from the central solution → medians, intervals,
// probabilities and a sensitivity ranking.
//
// It sits between reports and saturation in the import chain
// (cmd → reports → uncertainty → saturation → water) and reads its default
// uncertainties from data/uncertainty.csv.
//
// References: JCGM 101:2008, Evaluation of measurement data — Supplement 1
// to the "Guide to the expression of uncertainty in measurement" —
// Propagation of distributions using a Monte Carlo method (the method, the
// choice of distributions in its 6.4, the coverage interval in its 7.7);
// JCGM 100:2008 (GUM), 5.1.2, the law of propagation of uncertainty that the
// tests check the draws against.
package uncertainty

import (
	"fmt"
	"math"
	"sync"

	"scalerisk/data"
	"scalerisk/water"
)

// Unit says how an Input's standard uncertainty is expressed.
type Unit int

// The units of a standard uncertainty.
const (
	// Relative is a fraction of the reported value (a concentration or the
	// alkalinity).
	Relative Unit = iota
	// PHUnits is an absolute uncertainty in pH units.
	PHUnits
	// Celsius is an absolute uncertainty in °C.
	Celsius
)

// Input is the default uncertainty of one input of an analysis, as
// data/uncertainty.csv gives it.
type Input struct {
	// Name is an analyte name of data/analytes.csv ("Ca", "SO4", "SiO2"),
	// "alkalinity", "pH" or "temperature".
	Name string
	// U is the standard uncertainty (one standard deviation): a fraction of
	// the value for Relative (0.03 for 3 %), pH units or °C otherwise.
	U      float64
	Unit   Unit
	Source string
}

type tableRow struct {
	Input  string  `csv:"input"`
	U      float64 `csv:"u"`
	Unit   string  `csv:"unit"`
	Source string  `csv:"source"`
}

// Table is the set of default uncertainties, by input name. The zero value
// is empty; Defaults returns the embedded table.
type Table struct {
	inputs []Input
	// byComponent maps a component to its row; alk, ph and temp are the
	// rows of alkalinity, pH and temperature (-1 when absent).
	byComponent    [water.NumComponents]int
	alk, ph, temp  int
	componentNames [water.NumComponents]string
}

// Inputs returns the rows of t in table order.
func (t *Table) Inputs() []Input { return append([]Input(nil), t.inputs...) }

var defaultTable = sync.OnceValues(func() (*Table, error) {
	var rows []tableRow
	if err := data.Unmarshal("uncertainty.csv", &rows); err != nil {
		return nil, err
	}
	return newTable(rows)
})

// Defaults returns the embedded table of default uncertainties
// (data/uncertainty.csv).
func Defaults() *Table {
	t, err := defaultTable()
	if err != nil {
		panic("uncertainty: embedded table is broken: " + err.Error())
	}
	return t
}

// newTable checks the rows (a known input, a positive finite uncertainty,
// a unit that fits the input, a source) and indexes them.
func newTable(rows []tableRow) (*Table, error) {
	t := &Table{alk: -1, ph: -1, temp: -1}
	for c := range t.byComponent {
		t.byComponent[c] = -1
	}
	forms := water.Analytes()
	for i, r := range rows {
		in := Input{Name: r.Input, U: r.U, Source: r.Source}
		where := fmt.Sprintf("data/uncertainty.csv row %d (%s)", i+1, r.Input)
		if !(r.U > 0) || math.IsInf(r.U, 0) || r.Source == "" {
			return nil, fmt.Errorf("%s: want a positive uncertainty and a source", where)
		}
		want := "%"
		switch r.Input {
		case "pH":
			want, in.Unit, t.ph = "pH", PHUnits, i
		case "temperature":
			want, in.Unit, t.temp = "C", Celsius, i
		case "alkalinity":
			t.alk = i
		default:
			an, ok := forms.Lookup(r.Input)
			c, isComp := water.ParseComponent(an.Component)
			if !ok || !isComp {
				return nil, fmt.Errorf("%s: not an analyte with a component total", where)
			}
			if t.byComponent[c] >= 0 {
				return nil, fmt.Errorf("%s: component %s already has a row", where, c)
			}
			t.byComponent[c], t.componentNames[c] = i, r.Input
		}
		if r.Unit != want {
			return nil, fmt.Errorf("%s: unit %q, want %q", where, r.Unit, want)
		}
		if in.Unit == Relative {
			in.U /= 100
		}
		t.inputs = append(t.inputs, in)
	}
	return t, nil
}

// component returns the row of component c and whether there is one.
func (t *Table) component(c water.Component) (Input, bool) {
	if i := t.byComponent[c]; i >= 0 {
		return t.inputs[i], true
	}
	return Input{}, false
}

// row returns row i, or false when i < 0.
func (t *Table) row(i int) (Input, bool) {
	if i < 0 {
		return Input{}, false
	}
	return t.inputs[i], true
}
