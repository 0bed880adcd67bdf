package saturation

// The Pitzer parameter table: its rows, their temperature functions and the
// reader of data/pitzer.csv.

import (
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"
	"sync"

	"scalerisk/data"
	"scalerisk/water"
)

// pitzerKind is the kind of a row of the Pitzer parameter table.
type pitzerKind int

const (
	pzAphi pitzerKind = iota
	pzBeta0
	pzBeta1
	pzBeta2
	pzCphi
	pzTheta
	pzPsi
	pzLambda
	pzLogK    // the log K at 25 °C of a thermo.csv row in the Pitzer model set
	pzSpecies // an HMW84 species: Pitzer γ
	pzExclude // an ion-association pair the Pitzer set leaves out
	pzKeep    // an ion-association pair the Pitzer set keeps as it is
)

var pitzerKindNames = [...]string{"aphi", "beta0", "beta1", "beta2", "cphi", "theta", "psi",
	"lambda", "logk", "species", "exclude", "keep"}

// pitzerKindLabel is how a kind is written in warnings.
var pitzerKindLabel = [...]string{"A_φ", "β0", "β1", "β2", "Cφ", "θ", "ψ", "λ", "log K", "", "", ""}

// pitzerNames is the number of species names each kind takes.
var pitzerNames = [...]int{0, 2, 2, 2, 2, 2, 3, 2, 1, 1, 1, 1}

// pitzerParam is one row of the Pitzer parameter table.
type pitzerParam struct {
	kind   pitzerKind
	names  [3]string
	value  float64    // at 25 °C
	coef   [8]float64 // Møller (1988) eq. 13 coefficients a1..a8
	hasT   bool
	tMin   float64 // °C
	tMax   float64
	source string
	line   int
	// below, if set, is a second row of the same parameter whose function
	// covers tMin..25 °C where this row's starts at 25 °C (a published
	// function that does not reach below 25 °C, continued by another).
	below *pitzerParam
}

// at returns the parameter at t °C: the 25 °C value plus the change of the
// temperature function from 25 °C, P(T) − P(298.15 K). Below 25 °C a
// parameter given in two rows uses its lower row. Outside tMin..tMax the
// function is held at the nearer end of its range.
func (p *pitzerParam) at(t float64) float64 {
	if p.below != nil && t < 25 {
		return p.below.at(t)
	}
	if !p.hasT {
		return p.value
	}
	tc := math.Min(math.Max(t, p.tMin), p.tMax)
	return p.value + mollerFunction(&p.coef, tc+273.15) - mollerFunction(&p.coef, 298.15)
}

// label names the parameter in a warning, e.g. "β1(Ca,SO4)".
func (p *pitzerParam) label() string {
	var parts []string
	for _, n := range p.names[:pitzerNames[p.kind]] {
		if i := strings.IndexByte(n, '['); i > 0 {
			n = n[:i]
		}
		parts = append(parts, n)
	}
	return pitzerKindLabel[p.kind] + "(" + strings.Join(parts, ",") + ")"
}

// mollerFunction evaluates P(T) = a1 + a2·T + a3/T + a4·ln T + a5/(T−263) +
// a6·T² + a7/(680−T) + a8/(T−227), T in K.
//
// References: Møller, N. (1988) GCA 52:821, eq. 13.
func mollerFunction(a *[8]float64, T float64) float64 {
	return a[0] + a[1]*T + a[2]/T + a[3]*math.Log(T) + a[4]/(T-263) + a[5]*T*T + a[6]/(680-T) + a[7]/(T-227)
}

// pitzerTable is the parsed parameter table.
type pitzerTable struct {
	params []pitzerParam
}

var pitzerHeader = []string{"kind", "species_1", "species_2", "species_3", "value_25",
	"a1", "a2", "a3", "a4", "a5", "a6", "a7", "a8", "t_min_c", "t_max_c", "source"}

// readPitzerTable reads a Pitzer parameter table in the layout of
// data/pitzer.csv (lines starting with # are comments). It checks each
// row's kind, the charges of its species (a β of a cation and an anion, a
// θ of two ions of one sign, …), that every parameter names only species
// declared by a species row, and that no parameter appears twice. Errors are
// *water.InputError naming the file, line and column.
func readPitzerTable(file string, r io.Reader) (*pitzerTable, error) {
	cr, col, err := openTableCSV(file, r, "Pitzer parameter table", pitzerHeader)
	if err != nil {
		return nil, err
	}
	ncol := len(col)
	tab := &pitzerTable{}
	seen := map[string]int{}
	declared := map[string]pitzerKind{}
	for {
		rec, line, ok, err := nextRecord(cr, file, ncol, true)
		if err != nil {
			return nil, err
		}
		if !ok {
			break
		}
		p, err := parsePitzerRow(rec, col, file, line)
		if err != nil {
			return nil, err
		}
		key := p.key()
		if prev, dup := seen[key]; dup {
			if err := tab.params[prev].join(p); err != nil {
				return nil, &water.InputError{File: file, Line: line, Err: fmt.Errorf("%s given twice (first on line %d): %w", key, tab.params[prev].line, err)}
			}
			continue
		}
		seen[key] = len(tab.params)
		if p.kind >= pzSpecies {
			if k, ok := declared[p.names[0]]; ok {
				return nil, &water.InputError{File: file, Line: line, Err: fmt.Errorf("%s is both %s and %s", p.names[0], pitzerKindNames[k], pitzerKindNames[p.kind])}
			}
			declared[p.names[0]] = p.kind
		}
		tab.params = append(tab.params, p)
	}
	for _, p := range tab.params {
		if p.kind >= pzLogK {
			continue
		}
		for _, n := range p.names[:pitzerNames[p.kind]] {
			if declared[n] != pzSpecies {
				return nil, &water.InputError{File: file, Line: p.line, Err: fmt.Errorf("%s names %s, which no species row declares", p.label(), n)}
			}
		}
	}
	return tab, nil
}

// join takes q, a second row of parameter p, as its continuation below
// 25 °C. The two rows must have temperature functions that meet at 25 °C,
// one on each side, with the same 25 °C value: so a published function that
// starts at 25 °C (Møller 1988's CaCl2) is continued below by another source
// without a step. p becomes the row at or above 25 °C.
func (p *pitzerParam) join(q pitzerParam) error {
	if p.kind >= pzLogK || p.below != nil || !p.hasT || !q.hasT {
		return errors.New("a second row is allowed only as the part below 25 °C of a temperature function")
	}
	if p.value != q.value {
		return fmt.Errorf("the two rows must have the same 25 °C value (%g and %g)", p.value, q.value)
	}
	switch {
	case p.tMin == 25 && q.tMax == 25:
	case q.tMin == 25 && p.tMax == 25:
		*p, q = q, *p
	default:
		return errors.New("one row must end at 25 °C and the other start there")
	}
	low := q
	p.below = &low
	p.tMin = low.tMin
	return nil
}

// key identifies a parameter for the duplicate check: θ and ψ do not depend
// on the order of their like-charged pair.
func (p *pitzerParam) key() string {
	n := p.names
	switch p.kind {
	case pzTheta, pzPsi:
		if n[1] < n[0] {
			n[0], n[1] = n[1], n[0]
		}
	case pzSpecies, pzExclude, pzKeep:
		return "species row " + n[0]
	}
	return pitzerKindNames[p.kind] + "(" + strings.Join(n[:pitzerNames[p.kind]], ",") + ")"
}

func parsePitzerRow(rec []string, col map[string]int, file string, line int) (pitzerParam, error) {
	cell := func(h string) string { return strings.TrimSpace(rec[col[h]]) }
	bad := func(h string, err error) error {
		return &water.InputError{File: file, Line: line, Column: col[h] + 1, Header: h, Value: cell(h), Err: err}
	}
	num := func(h string) (float64, bool, error) {
		s := cell(h)
		if s == "" {
			return 0, false, nil
		}
		v, err := water.ParseNumber(s)
		if err != nil {
			return 0, false, bad(h, err)
		}
		return v, true, nil
	}
	p := pitzerParam{source: cell("source"), line: line}
	k := slices.Index(pitzerKindNames[:], strings.ToLower(cell("kind")))
	if k < 0 {
		return p, bad("kind", fmt.Errorf("unknown kind (want one of %s)", strings.Join(pitzerKindNames[:], ", ")))
	}
	p.kind = pitzerKind(k)
	if err := p.parseSpecies(cell, bad); err != nil {
		return p, err
	}
	v, has, err := num("value_25")
	if err != nil {
		return p, err
	}
	if p.kind >= pzSpecies {
		if has {
			return p, bad("value_25", errors.New("a species row takes no value"))
		}
		if p.source == "" {
			return p, bad("source", errors.New("every row needs its source"))
		}
		return p, nil
	}
	if !has {
		return p, bad("value_25", errors.New("the value at 25 °C is required"))
	}
	p.value = v
	for i := range p.coef {
		c, has, err := num("a" + strconv.Itoa(i+1))
		if err != nil {
			return p, err
		}
		p.coef[i] = c
		p.hasT = p.hasT || has
	}
	var hasMin, hasMax bool
	if p.tMin, hasMin, err = num("t_min_c"); err != nil {
		return p, err
	}
	if p.tMax, hasMax, err = num("t_max_c"); err != nil {
		return p, err
	}
	if !hasMin || !hasMax || p.tMin > 25 || p.tMax < 25 {
		return p, bad("t_min_c", errors.New("the validity range must be given and include 25 °C"))
	}
	if !p.hasT && (p.tMin != 25 || p.tMax != 25) {
		return p, bad("t_min_c", errors.New("a value without a temperature function is known at 25 °C only: give 25..25"))
	}
	if p.kind == pzLogK && p.hasT {
		return p, bad("a1", errors.New("a logk row takes no temperature function: the thermodynamic table row's is kept"))
	}
	if p.source == "" {
		return p, bad("source", errors.New("every row needs its source"))
	}
	return p, nil
}

// parseSpecies reads the species names of row p (cell gives a column's
// text, bad makes the error of a column) and checks their charges against
// the kind: a β of a cation and an anion, a θ of two ions of one sign, ….
func (p *pitzerParam) parseSpecies(cell func(string) string, bad func(string, error) error) error {
	var z [3]float64
	for i := 0; i < 3; i++ {
		h := "species_" + strconv.Itoa(i+1)
		name := cell(h)
		if i >= pitzerNames[p.kind] {
			if name != "" {
				return bad(h, fmt.Errorf("a %s row takes %d species", pitzerKindNames[p.kind], pitzerNames[p.kind]))
			}
			continue
		}
		if p.kind == pzLogK { // a row of the thermodynamic table: any name
			if name == "" {
				return bad(h, errors.New("empty name"))
			}
			p.names[i] = name
			continue
		}
		c, err := parseCharge(name)
		if err != nil {
			return bad(h, err)
		}
		p.names[i], z[i] = name, c
	}
	var chargeErr error
	switch p.kind {
	case pzBeta0, pzBeta1, pzBeta2, pzCphi:
		if !(z[0] > 0 && z[1] < 0) {
			chargeErr = errors.New("a binary parameter names a cation, then an anion")
		}
	case pzTheta:
		if z[0]*z[1] <= 0 || p.names[0] == p.names[1] {
			chargeErr = errors.New("θ names two different ions of the same sign")
		}
	case pzPsi:
		if z[0]*z[1] <= 0 || z[0]*z[2] >= 0 || p.names[0] == p.names[1] {
			chargeErr = errors.New("ψ names two different ions of one sign, then an ion of the other")
		}
	case pzLambda:
		if z[0] != 0 || p.names[0] == p.names[1] {
			chargeErr = errors.New("λ names a neutral species, then another species")
		}
	}
	if chargeErr != nil {
		return bad("species_1", chargeErr)
	}
	return nil
}

// defaultPitzerTable is the embedded parameter table, read once.
var defaultPitzerTable = sync.OnceValues(func() (*pitzerTable, error) {
	f, err := data.Open("pitzer.csv")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readPitzerTable("data/pitzer.csv", f)
})
