package saturation

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"sync"

	"scalerisk/data"
	"scalerisk/water"
)

// Phase is the kind of a thermodynamic table entry.
type Phase int

// The phases of table entries.
const (
	Master  Phase = iota // a master species: the free form of a component (Ca[2+], CO3[2-]) or H[+]
	Aqueous              // an aqueous species formed from masters (HCO3[-], CaSO4[0])
	Mineral              // a solid, written as dissolution
	Gas                  // a gas, e.g. CO2(g)
)

func (p Phase) String() string {
	return [...]string{"master", "aqueous", "mineral", "gas"}[p]
}

func parsePhase(s string) (Phase, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "master":
		return Master, nil
	case "aqueous":
		return Aqueous, nil
	case "mineral":
		return Mineral, nil
	case "gas":
		return Gas, nil
	}
	return 0, fmt.Errorf("unknown phase %q (want master, aqueous, mineral or gas)", s)
}

// Entry is one row of the thermodynamic table: a species, mineral or gas, the
// reaction its log K refers to, the temperature function and its source.
type Entry struct {
	Name     string // Ca[2+], CaHCO3[+], calcite, CO2(g)
	Phase    Phase
	Formula  string
	Equation string  // as written, e.g. "Ca[2+] + HCO3[-] = CaHCO3[+]"
	LogK25   float64 // log10 K at 25 °C of Equation
	DeltaH   float64 // ΔH°r, kJ/mol; NaN when not given
	// Analytic holds a1..a6 of log K = a1 + a2·T + a3/T + a4·log10 T + a5/T² + a6·T²
	// (T in K); valid when HasAnalytic.
	Analytic    [6]float64
	HasAnalytic bool
	TMin, TMax  float64 // validity range of the temperature function, °C
	Charge      float64 // from the name: Ca[2+] → 2
	IonSize     float64 // Debye–Hückel ion size å, Å; NaN when not given
	TJB         float64 // Truesdell–Jones b, kg/mol; NaN when not given
	Source      string
	Line        int // line in the file it was read from
	File        string

	terms []term // parsed equation
}

type term struct {
	coef float64
	name string
}

// LogK returns log10 K of the entry's equation at t °C: the analytic
// expression when the table gives one, else the van 't Hoff equation with
// ΔH°r (constant ΔH), else the 25 °C value.
//
// References: van 't Hoff: log K(T) = log K(298.15) − ΔH°r/(R ln 10)·(1/T − 1/298.15),
// R = 8.314462618 J/(mol K) (CODATA 2018).
func (e *Entry) LogK(t float64) float64 {
	T := t + 273.15
	if e.HasAnalytic {
		a := e.Analytic
		return a[0] + a[1]*T + a[2]/T + a[3]*math.Log10(T) + a[4]/(T*T) + a[5]*T*T
	}
	if !math.IsNaN(e.DeltaH) {
		return e.LogK25 - e.DeltaH*1000/(gasConstant*math.Ln10)*(1/T-1/298.15)
	}
	return e.LogK25
}

// TemperatureFunction describes how LogK depends on temperature, in words.
func (e *Entry) TemperatureFunction() string {
	switch {
	case e.Phase == Master:
		return "none"
	case e.HasAnalytic:
		return "analytic"
	case !math.IsNaN(e.DeltaH):
		return "van 't Hoff"
	}
	return "constant"
}

// gasConstant is the molar gas constant, J/(mol K) (CODATA 2018, exact).
const gasConstant = 8.314462618

// Table is a thermodynamic table: entries in file order, later entries may
// refer to earlier ones in their equations. A Table is read-only once built.
type Table struct {
	entries []Entry
	index   map[string]int
}

// Entries returns the table's entries in order.
func (t *Table) Entries() []Entry { return append([]Entry(nil), t.entries...) }

// Entry returns the entry named name.
func (t *Table) Entry(name string) (Entry, bool) {
	i, ok := t.index[name]
	if !ok {
		return Entry{}, false
	}
	return t.entries[i], true
}

// Minerals returns the mineral entries in table order.
func (t *Table) Minerals() []Entry {
	var out []Entry
	for _, e := range t.entries {
		if e.Phase == Mineral {
			out = append(out, e)
		}
	}
	return out
}

// openTableCSV starts reading a CSV table of the project's own layout
// (lines starting with # are comments): it reads the header, maps each
// column name (case and a byte-order mark aside) to its index, and checks
// that the required columns are there. Errors are *water.InputError.
func openTableCSV(file string, r io.Reader, what string, required []string) (*csv.Reader, map[string]int, error) {
	cr := csv.NewReader(r)
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err != nil {
		if errors.Is(err, io.EOF) {
			return nil, nil, &water.InputError{File: file, Err: fmt.Errorf("empty %s", what)}
		}
		return nil, nil, &water.InputError{File: file, Line: 1, Err: err}
	}
	col := map[string]int{}
	for i, h := range header {
		key := strings.ToLower(strings.TrimSpace(strings.TrimPrefix(h, "\ufeff")))
		if _, dup := col[key]; dup {
			return nil, nil, &water.InputError{File: file, Line: 1, Column: i + 1, Header: h, Err: errors.New("duplicate column")}
		}
		col[key] = i
	}
	for _, h := range required {
		if _, ok := col[h]; !ok {
			return nil, nil, &water.InputError{File: file, Line: 1, Err: fmt.Errorf("missing column %q", h)}
		}
	}
	return cr, col, nil
}

// nextRecord reads the next record of a table opened by openTableCSV: ok
// is false at the end. With strict, a record must have ncol fields. Errors
// are *water.InputError naming the file and line.
func nextRecord(cr *csv.Reader, file string, ncol int, strict bool) (rec []string, line int, ok bool, err error) {
	rec, err = cr.Read()
	if errors.Is(err, io.EOF) {
		return nil, 0, false, nil
	}
	if err != nil {
		// FieldPos panics after a failed Read: the line is the error's.
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			line = pe.StartLine
		}
		return nil, line, false, &water.InputError{File: file, Line: line, Err: err}
	}
	line, _ = cr.FieldPos(0)
	if strict && len(rec) != ncol {
		return nil, line, false, &water.InputError{File: file, Line: line, Err: fmt.Errorf("%d fields, want %d", len(rec), ncol)}
	}
	return rec, line, true, nil
}

var tableHeader = []string{"name", "phase", "formula", "equation", "log_k_25", "delta_h_kj",
	"a1", "a2", "a3", "a4", "a5", "a6", "t_min_c", "t_max_c", "ion_size", "b_tj", "source"}

// ReadTable reads a thermodynamic table in the layout of data/thermo.csv
// (header: name, phase, formula, equation, log_k_25, delta_h_kj, a1…a6,
// t_min_c, t_max_c, ion_size, b_tj, source; lines starting with # are
// comments). Errors are *water.InputError naming the file, line and column.
// Equations are checked: each names its entry once with coefficient 1 and
// otherwise only masters, H2O and entries defined earlier in the same table
// (or in base, when base is not nil).
func ReadTable(file string, r io.Reader, base *Table) (*Table, error) {
	cr, col, err := openTableCSV(file, r, "thermodynamic table", tableHeader)
	if err != nil {
		return nil, err
	}
	ncol := len(col) // openTableCSV refuses duplicate names
	t := &Table{index: map[string]int{}}
	if base != nil {
		t.entries = append(t.entries, base.entries...)
		for k, v := range base.index {
			t.index[k] = v
		}
	}
	seen := map[string]int{} // line of each name in this file
	for {
		rec, line, ok, err := nextRecord(cr, file, ncol, true)
		if err != nil {
			return nil, err
		}
		if !ok {
			break
		}
		e, err := parseEntry(rec, col, file, line)
		if err != nil {
			return nil, err
		}
		if first, dup := seen[e.Name]; dup {
			return nil, &water.InputError{File: file, Line: line, Column: col["name"] + 1, Header: "name", Value: e.Name,
				Err: fmt.Errorf("duplicate name (first on line %d)", first)}
		}
		seen[e.Name] = line
		if err := t.add(e); err != nil {
			return nil, &water.InputError{File: file, Line: line, Column: col["equation"] + 1, Header: "equation", Err: err}
		}
	}
	return t, nil
}

func parseEntry(rec []string, col map[string]int, file string, line int) (Entry, error) {
	cell := func(h string) string { return strings.TrimSpace(rec[col[h]]) }
	bad := func(h string, err error) error {
		return &water.InputError{File: file, Line: line, Column: col[h] + 1, Header: h, Value: cell(h), Err: err}
	}
	num := func(h string, blank float64) (float64, error) {
		s := cell(h)
		if s == "" {
			return blank, nil
		}
		v, err := water.ParseNumber(s)
		if err != nil {
			return 0, bad(h, err)
		}
		return v, nil
	}
	e := Entry{Name: cell("name"), Formula: cell("formula"), Equation: cell("equation"),
		Source: cell("source"), Line: line, File: file}
	if e.Name == "" {
		return e, bad("name", errors.New("empty name"))
	}
	var err error
	if e.Phase, err = parsePhase(cell("phase")); err != nil {
		return e, bad("phase", err)
	}
	if e.Phase == Master || e.Phase == Aqueous {
		if e.Charge, err = parseCharge(e.Name); err != nil {
			return e, bad("name", err)
		}
	}
	if e.LogK25, err = num("log_k_25", math.NaN()); err != nil {
		return e, err
	}
	if e.Phase != Master && math.IsNaN(e.LogK25) {
		return e, bad("log_k_25", errors.New("log K at 25 °C is required"))
	}
	if e.Phase == Master {
		e.LogK25 = 0
	}
	if e.DeltaH, err = num("delta_h_kj", math.NaN()); err != nil {
		return e, err
	}
	for i := range e.Analytic {
		h := "a" + strconv.Itoa(i+1)
		if cell(h) != "" {
			e.HasAnalytic = true
		}
		if e.Analytic[i], err = num(h, 0); err != nil {
			return e, err
		}
	}
	if e.TMin, err = num("t_min_c", 0); err != nil {
		return e, err
	}
	if e.TMax, err = num("t_max_c", 100); err != nil {
		return e, err
	}
	if e.IonSize, err = num("ion_size", math.NaN()); err != nil {
		return e, err
	}
	if e.TJB, err = num("b_tj", math.NaN()); err != nil {
		return e, err
	}
	if h, err := checkEntry(&e); err != nil {
		return e, bad(h, err)
	}
	if e.Phase != Master {
		if e.terms, err = parseEquation(e.Equation); err != nil {
			return e, bad("equation", err)
		}
	}
	return e, nil
}

// parseCharge reads the charge from a species name: "Ca[2+]" → 2,
// "HCO3[-]" → −1, "CaCO3[0]" → 0.
func parseCharge(name string) (float64, error) {
	i := strings.LastIndexByte(name, '[')
	if i < 0 || !strings.HasSuffix(name, "]") {
		return 0, fmt.Errorf("species name %q has no charge in brackets, e.g. Ca[2+]", name)
	}
	c := name[i+1 : len(name)-1]
	switch c {
	case "0":
		return 0, nil
	case "+":
		return 1, nil
	case "-":
		return -1, nil
	}
	if len(c) >= 2 {
		n, err := strconv.Atoi(c[:len(c)-1])
		if err == nil && n > 0 {
			switch c[len(c)-1] {
			case '+':
				return float64(n), nil
			case '-':
				return -float64(n), nil
			}
		}
	}
	return 0, fmt.Errorf("species name %q: charge %q not understood", name, c)
}

// parseEquation reads "a A + b B = c C + d D" into terms with products
// positive and reactants negative.
func parseEquation(eq string) ([]term, error) {
	left, right, ok := strings.Cut(eq, " = ")
	if !ok || strings.Contains(right, " = ") {
		return nil, errors.New("equation needs exactly one ' = '")
	}
	var terms []term
	for side, text := range []string{left, right} {
		sign := -1.0
		if side == 1 {
			sign = 1
		}
		for _, part := range strings.Split(text, " + ") {
			f := strings.Fields(part)
			coef := 1.0
			switch len(f) {
			case 1:
			case 2:
				v, err := water.ParseNumber(f[0])
				if err != nil || v <= 0 {
					return nil, fmt.Errorf("bad coefficient %q", f[0])
				}
				coef = v
			default:
				return nil, fmt.Errorf("cannot read term %q", strings.TrimSpace(part))
			}
			terms = append(terms, term{sign * coef, f[len(f)-1]})
		}
	}
	return terms, nil
}

// add appends e (or replaces an entry of the same name, keeping its place)
// after checking that its equation refers only to known names.
func (t *Table) add(e Entry) error {
	if e.Phase != Master {
		self := 0
		for _, tm := range e.terms {
			if tm.name == e.Name {
				self++
				if math.Abs(tm.coef) != 1 {
					return fmt.Errorf("%s must appear with coefficient 1", e.Name)
				}
				continue
			}
			if tm.name == "H2O" {
				continue
			}
			j, ok := t.index[tm.name]
			if !ok {
				return fmt.Errorf("%q is not defined before %s", tm.name, e.Name)
			}
			if p := t.entries[j].Phase; p != Master && p != Aqueous {
				return fmt.Errorf("%q is a %s; equations may use only masters, aqueous species and H2O", tm.name, p)
			}
		}
		if self != 1 {
			return fmt.Errorf("equation must name %s exactly once", e.Name)
		}
	}
	if i, ok := t.index[e.Name]; ok {
		if (t.entries[i].Phase == Master) != (e.Phase == Master) {
			return fmt.Errorf("%s cannot change between master and non-master", e.Name)
		}
		t.entries[i] = e
		return nil
	}
	t.entries = append(t.entries, e)
	t.index[e.Name] = len(t.entries) - 1
	return nil
}

var defaultTable = sync.OnceValues(func() (*Table, error) {
	f, err := data.Open("thermo.csv")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return ReadTable("data/thermo.csv", f, nil)
})

// DefaultTable returns the embedded thermodynamic table (data/thermo.csv).
// It panics if the embedded table is broken, which the tests rule out.
func DefaultTable() *Table {
	t, err := defaultTable()
	if err != nil {
		panic("saturation: embedded thermodynamic table is broken: " + err.Error())
	}
	return t
}

// Extend returns a table with the rows of r (in the layout of ReadTable)
// added to t, or replacing rows of t of the same name. t is unchanged.
func (t *Table) Extend(file string, r io.Reader) (*Table, error) {
	return ReadTable(file, r, t)
}
