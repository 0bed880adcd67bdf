package water

import (
	"fmt"
	"io"
	"slices"
	"strings"
	"sync"

	"scalerisk/data"
)

// Analyte is one form in which a laboratory reports a component: calcium as
// Ca, silica as SiO2 or Si, nitrate as NO3 or NO3-N, alkalinity as HCO3, CO3
// or "as CaCO3".
type Analyte struct {
	Name      string  // canonical name, e.g. "SiO2"
	Component string  // element symbol of the component, or "Alk" for alkalinity
	Charge    float64 // charge of the form as an ion; 0 for neutral forms
	FormMass  float64 // molar mass of the form, g/mol
	PerForm   float64 // moles (equivalents for alkalinity) of component per mole of form
	Aliases   []string
	Source    string
}

// IsAlkalinity reports whether a counts toward titration alkalinity rather
// than a component total.
func (a Analyte) IsAlkalinity() bool { return a.Component == "Alk" }

type analyteRow struct {
	Name      string  `csv:"analyte"`
	Component string  `csv:"component"`
	Charge    float64 `csv:"charge"`
	FormMass  float64 `csv:"form_mass"`
	PerForm   float64 `csv:"per_form"`
	Aliases   string  `csv:"aliases"`
	Source    string  `csv:"source"`
}

// AnalyteTable is the set of analyte forms the reader recognises.
type AnalyteTable struct {
	list   []Analyte
	byName map[string]int // lower-case name or alias -> index in list
}

var defaultAnalytes = sync.OnceValues(func() (*AnalyteTable, error) {
	var rows []analyteRow
	if err := data.Unmarshal("analytes.csv", &rows); err != nil {
		return nil, err
	}
	t := &AnalyteTable{byName: map[string]int{}}
	for _, row := range rows {
		a := Analyte{Name: row.Name, Component: row.Component, Charge: row.Charge,
			FormMass: row.FormMass, PerForm: row.PerForm, Source: row.Source}
		if row.Aliases != "" {
			a.Aliases = strings.Split(row.Aliases, ";")
		}
		if _, ok := ParseComponent(a.Component); !ok && !a.IsAlkalinity() {
			return nil, fmt.Errorf("data/analytes.csv: analyte %q: unknown component %q", a.Name, a.Component)
		}
		if a.FormMass <= 0 || a.PerForm <= 0 {
			return nil, fmt.Errorf("data/analytes.csv: analyte %q: molar mass and per_form must be positive", a.Name)
		}
		t.list = append(t.list, a)
		i := len(t.list) - 1
		for _, key := range append([]string{a.Name}, a.Aliases...) {
			key = normalizeName(key)
			if j, dup := t.byName[key]; dup && j != i {
				return nil, fmt.Errorf("data/analytes.csv: name %q used by %q and %q", key, t.list[j].Name, a.Name)
			}
			t.byName[key] = i
		}
	}
	return t, nil
})

// Analytes returns the embedded analyte table (data/analytes.csv).
func Analytes() *AnalyteTable {
	t, err := defaultAnalytes()
	if err != nil {
		panic("water: embedded analyte table is broken: " + err.Error())
	}
	return t
}

// Lookup returns the analyte whose name or alias is name, matched without
// regard to case, spaces, underscores and charge signs written as "2+".
func (t *AnalyteTable) Lookup(name string) (Analyte, bool) {
	i, ok := t.byName[normalizeName(name)]
	if !ok {
		return Analyte{}, false
	}
	return t.list[i].clone(), true
}

// All returns a copy of every analyte in table order.
func (t *AnalyteTable) All() []Analyte {
	out := make([]Analyte, len(t.list))
	for i, a := range t.list {
		out[i] = a.clone()
	}
	return out
}

// clone returns a with its own copy of the aliases, so that a caller
// editing them does not change the shared table.
func (a Analyte) clone() Analyte {
	a.Aliases = slices.Clone(a.Aliases)
	return a
}

// FormOf returns the analyte form of component comp named form: the "X" of
// a unit "mg/L as X". It matches a form's name ("SiO2", "Si"), the element
// suffix of a form ("N" for NO3-N, "P" for PO4-P, "S" for SO4-S) or, for
// inorganic carbon, the element itself ("C" for DIC).
func (t *AnalyteTable) FormOf(comp, form string) (Analyte, bool) {
	key := normalizeName(form)
	for _, a := range t.list {
		if a.Component != comp {
			continue
		}
		if normalizeName(a.Name) == key || strings.HasSuffix(strings.ToLower(a.Name), "-"+strings.ToLower(strings.TrimSpace(form))) {
			return a.clone(), true
		}
		if strings.EqualFold(comp, form) && a.PerForm == 1 && a.Charge == 0 && strings.EqualFold(comp, "C") && a.Name == "DIC" {
			return a.clone(), true
		}
	}
	return Analyte{}, false
}

// normalizeName folds case and drops spaces, underscores, hyphens and dots,
// so that "Total Alkalinity", "total_alkalinity", "NO3-N" and "no3_n" match
// their table names.
func normalizeName(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	var b strings.Builder
	for _, r := range s {
		switch r {
		case ' ', '_', '.', '-', '\t':
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}

// OpenDemo opens the embedded demo file (data/demo.csv): three invented
// waters of a fictional plant, for --demo.
func OpenDemo() (io.ReadCloser, error) { return data.Open("demo.csv") }
