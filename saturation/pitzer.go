package saturation

// The Pitzer model set: the specific-interaction activity model for brines
// and the species it is used with.
//
// References:
//
//	Pitzer, K.S. (1973) J. Phys. Chem. 77:268; Pitzer, K.S. (1991) Activity
//	  Coefficients in Electrolyte Solutions, 2nd ed., ch. 3 (equations).
//	Harvie, C.E., Møller, N. and Weare, J.H. (1984) GCA 48:723 ("HMW84": the
//	  form of the equations, the 25 °C parameter set and its species).
//	Pitzer, K.S. (1975) J. Solution Chem. 4:249 (the unsymmetrical mixing
//	  terms ^Eθ and the function J(x)).
//	Møller, N. (1988) GCA 52:821 (A_φ(T) and temperature functions);
//	  Greenberg, J.P. and Møller, N. (1989) GCA 53:2503.
//
// The parameters are in data/pitzer.csv; its header comments explain the
// choices (one 25 °C set, published temperature functions anchored to it,
// which ion pairs are left out and why).

import (
	"cmp"
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

// pitzerB is the b of the Debye–Hückel term of the Pitzer equations,
// kg^½ mol^−½ (HMW84).
const pitzerB = 1.2

// waterMolarMass is M_w of ln a_w = −φ·M_w·Σm, kg/mol.
const waterMolarMass = 0.0180153

// Pitzer α of B = β0 + β1 g(α1√I) + β2 g(α2√I), kg^½ mol^−½ (HMW84): α1 is
// 2 for any pair with a singly charged ion and 1.4 for 2-2 (and higher)
// pairs; α2 is 12.
const (
	pitzerAlpha1     = 2.0
	pitzerAlpha1High = 1.4
	pitzerAlpha2     = 12.0
)

// pitzerTolerance is the largest change of any ln γ (or of φ) between two
// iterations at which the lagged Pitzer coefficients count as converged.
const pitzerTolerance = 1e-11

// pitzerSignificant is the change of ln γ above which a parameter is taken
// to matter: a parameter known at 25 °C only, or held at the end of its
// range, is named in a warning when it moves some ln γ by more than this.
const pitzerSignificant = 0.01

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
}

// at returns the parameter at t °C: the 25 °C value plus the change of the
// temperature function from 25 °C, P(T) − P(298.15 K). Outside tMin..tMax
// the function is held at the nearer end of its range.
func (p *pitzerParam) at(t float64) float64 {
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
			return nil, &water.InputError{File: file, Line: line, Err: fmt.Errorf("%s given twice (first on line %d)", key, prev)}
		}
		seen[key] = line
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
	var z [3]float64
	for i := 0; i < 3; i++ {
		h := "species_" + strconv.Itoa(i+1)
		name := cell(h)
		if i >= pitzerNames[p.kind] {
			if name != "" {
				return p, bad(h, fmt.Errorf("a %s row takes %d species", pitzerKindNames[p.kind], pitzerNames[p.kind]))
			}
			continue
		}
		if p.kind == pzLogK { // a row of the thermodynamic table: any name
			if name == "" {
				return p, bad(h, errors.New("empty name"))
			}
			p.names[i] = name
			continue
		}
		c, err := parseCharge(name)
		if err != nil {
			return p, bad(h, err)
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
		return p, bad("species_1", chargeErr)
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

// defaultPitzerTable is the embedded parameter table, read once.
var defaultPitzerTable = sync.OnceValues(func() (*pitzerTable, error) {
	f, err := data.Open("pitzer.csv")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readPitzerTable("data/pitzer.csv", f)
})

// pzBinary is the cation–anion pair of a binary parameter set.
type pzBinary struct {
	c, a           int // positions
	b0, b1, b2, cp *pitzerParam
	ia1, ia2       int     // indices of α1, α2 in pitzerSet.alphas
	cScale         float64 // C = Cφ/(2√|z_c z_a|)
}

// pzPair is two like-charged ions that interact through θ, through the
// unsymmetrical ^Eθ, or both.
type pzPair struct {
	i, j   int
	zi, zj int // |z|
	theta  *pitzerParam
	unsym  bool
}

// pzTriple is a ψ: two like-charged ions i, j and an ion k of the other sign.
type pzTriple struct {
	i, j, k int
	psi     *pitzerParam
}

// pzNeutral is a λ of neutral n with species i.
type pzNeutral struct {
	n, i int
	lam  *pitzerParam
}

// pzTerm is a parameter in use and the positions it joins (for warnings).
type pzTerm struct {
	p   *pitzerParam
	pos [3]int
}

// pitzerSet is the Pitzer model set derived from a Model: the reduced table
// without the excluded ion pairs, the positions of the Pitzer species, and
// the parameters compiled onto them. Read-only once built.
type pitzerSet struct {
	model    *Model
	excluded []string // names of the ion-association species left out
	// Positions: the Pitzer species in model order; ionSpecies maps a
	// position to its species index, posOf a species index to its position
	// (−1 for species that keep ion-association γ).
	ionSpecies []int
	z          []float64
	posOf      []int
	aphi       *pitzerParam
	alphas     []float64
	binaries   []pzBinary
	pairs      []pzPair
	triples    []pzTriple
	lambdas    []pzNeutral
	terms      []pzTerm
	// fallback lists the components whose master is outside the set.
	fallback []water.Component
}

// pitzerSet returns the Pitzer model set of m, built on first use.
func (m *Model) pitzerSet() (*pitzerSet, error) {
	if m.pitzer == nil { // a Model not made by NewModel
		return newPitzerSet(m)
	}
	return m.pitzer()
}

func newPitzerSet(m *Model) (*pitzerSet, error) {
	pitzerJTable() // build the J(x) table with the set, not in the first solve
	tab, err := defaultPitzerTable()
	if err != nil {
		return nil, fmt.Errorf("Pitzer parameter table: %w", err)
	}
	return buildPitzerSet(m, tab)
}

// buildPitzerSet derives the Pitzer model set of m under the parameters of
// tab: the table of m without the species tab excludes, reduced again, and
// the parameters compiled onto the Pitzer species present.
func buildPitzerSet(m *Model, tab *pitzerTable) (*pitzerSet, error) {
	role := map[string]pitzerKind{}
	logK := map[string]*pitzerParam{}
	for i, p := range tab.params {
		switch {
		case p.kind >= pzSpecies:
			role[p.names[0]] = p.kind
		case p.kind == pzLogK:
			logK[p.names[0]] = &tab.params[i]
		}
	}
	set := &pitzerSet{}
	t := &Table{index: map[string]int{}}
	for _, e := range m.table.entries {
		if k, ok := role[e.Name]; ok && k == pzExclude && e.Phase == Aqueous {
			set.excluded = append(set.excluded, e.Name)
			continue
		}
		if p, ok := logK[e.Name]; ok && e.Phase != Master {
			// The Pitzer set's own log K at 25 °C; the row's temperature
			// dependence is kept (shifted by the difference at 25 °C).
			shift := p.value - e.LogK(25)
			e.LogK25 = p.value
			if e.HasAnalytic {
				e.Analytic[0] += shift
			}
			e.Source = fmt.Sprintf("%s; Pitzer model set: log K(25 °C) = %g, %s", e.Source, p.value, p.source)
		}
		t.index[e.Name] = len(t.entries)
		t.entries = append(t.entries, e)
	}
	pm, err := NewModel(t)
	if err != nil {
		return nil, fmt.Errorf("Pitzer model set: %w (an excluded ion pair may be used by another row)", err)
	}
	// The minerals and gases must be those of m, in the same order, so that
	// mineral indices mean the same in both model sets.
	if len(pm.minerals) != len(m.minerals) || len(pm.gases) != len(m.gases) {
		return nil, errors.New("Pitzer model set: minerals or gases differ from the ion-association set")
	}
	for i := range pm.minerals {
		if pm.minerals[i].name != m.minerals[i].name {
			return nil, fmt.Errorf("Pitzer model set: mineral %d is %s, not %s", i, pm.minerals[i].name, m.minerals[i].name)
		}
	}
	set.model = pm
	set.posOf = make([]int, len(pm.species))
	for i := range set.posOf {
		set.posOf[i] = -1
	}
	pos := map[string]int{}
	for i := range pm.species {
		name := pm.species[i].name
		if k, ok := role[name]; ok && k == pzSpecies {
			set.posOf[i] = len(set.ionSpecies)
			pos[name] = len(set.ionSpecies)
			set.ionSpecies = append(set.ionSpecies, i)
			set.z = append(set.z, pm.species[i].act.z)
		}
	}
	for c := range water.NumComponents {
		if set.posOf[pm.compMaster[c]] < 0 {
			set.fallback = append(set.fallback, c)
		}
	}
	alpha := func(a float64) int {
		if k := slices.Index(set.alphas, a); k >= 0 {
			return k
		}
		set.alphas = append(set.alphas, a)
		return len(set.alphas) - 1
	}
	binIdx := map[[2]int]int{}
	thetaOf := map[[2]int]*pitzerParam{}
	for pi := range tab.params {
		p := &tab.params[pi]
		var ps [3]int
		ok := true
		for k := 0; k < pitzerNames[p.kind] && p.kind < pzLogK; k++ {
			q, found := pos[p.names[k]]
			ok = ok && found
			ps[k] = q
		}
		if !ok || p.kind >= pzLogK {
			continue // a species the table does not hold (a user table may lack some)
		}
		if p.kind != pzAphi {
			set.terms = append(set.terms, pzTerm{p: p, pos: ps})
		}
		switch p.kind {
		case pzAphi:
			set.aphi = p
		case pzBeta0, pzBeta1, pzBeta2, pzCphi:
			key := [2]int{ps[0], ps[1]}
			k, seen := binIdx[key]
			if !seen {
				zc, za := math.Abs(set.z[ps[0]]), math.Abs(set.z[ps[1]])
				a1 := pitzerAlpha1
				if zc >= 2 && za >= 2 {
					a1 = pitzerAlpha1High
				}
				k = len(set.binaries)
				binIdx[key] = k
				set.binaries = append(set.binaries, pzBinary{c: ps[0], a: ps[1], ia1: alpha(a1),
					ia2: alpha(pitzerAlpha2), cScale: 1 / (2 * math.Sqrt(zc*za))})
			}
			b := &set.binaries[k]
			switch p.kind {
			case pzBeta0:
				b.b0 = p
			case pzBeta1:
				b.b1 = p
			case pzBeta2:
				b.b2 = p
			case pzCphi:
				b.cp = p
			}
		case pzTheta:
			i, j := min(ps[0], ps[1]), max(ps[0], ps[1])
			thetaOf[[2]int{i, j}] = p
		case pzPsi:
			set.triples = append(set.triples, pzTriple{i: ps[0], j: ps[1], k: ps[2], psi: p})
		case pzLambda:
			set.lambdas = append(set.lambdas, pzNeutral{n: ps[0], i: ps[1], lam: p})
		}
	}
	if set.aphi == nil {
		return nil, errors.New("Pitzer parameter table: no aphi row")
	}
	// Every pair of like-charged ions with a θ or unequal charges.
	for i := range set.ionSpecies {
		for j := i + 1; j < len(set.ionSpecies); j++ {
			zi, zj := set.z[i], set.z[j]
			if zi*zj <= 0 {
				continue
			}
			th := thetaOf[[2]int{i, j}]
			unsym := zi != zj
			if th == nil && !unsym {
				continue
			}
			set.pairs = append(set.pairs, pzPair{i: i, j: j, zi: int(math.Abs(zi)), zj: int(math.Abs(zj)), theta: th, unsym: unsym})
		}
	}
	return set, nil
}

// pzBinVals are the binary parameters of one pair at one temperature.
type pzBinVals struct {
	b0, b1, b2, c float64
}

// pitzerState evaluates the Pitzer equations for one pitzerSet: parameter
// values at the current temperature and the work arrays of one evaluation.
// It also holds, for the solver, the lagged coefficients of the last
// refresh. Not safe for concurrent use.
type pitzerState struct {
	set    *pitzerSet
	t      float64
	tSet   bool
	aphi   float64
	bin    []pzBinVals
	theta  []float64 // per pair
	psi    []float64 // per triple
	lambda []float64 // per λ
	// per α: g(α√I), g'(α√I), exp(−α√I) of the current evaluation
	g, gp, ex []float64
	eth       [5][5]ethetaValue
	m         []float64 // molality per position
	lng       []float64 // ln γ per position
	// lag is, per position, ln γ − z²·f^γ(I) at the last refresh: the part of
	// ln γ held fixed during a Newton step; phi the osmotic coefficient.
	lag []float64
	phi float64
}

type ethetaValue struct {
	v, vp float64
	ok    bool
}

func newPitzerState(set *pitzerSet) *pitzerState {
	n := len(set.ionSpecies)
	na := len(set.alphas)
	return &pitzerState{set: set, bin: make([]pzBinVals, len(set.binaries)), theta: make([]float64, len(set.pairs)),
		psi: make([]float64, len(set.triples)), lambda: make([]float64, len(set.lambdas)),
		g: make([]float64, na), gp: make([]float64, na), ex: make([]float64, na),
		m: make([]float64, n), lng: make([]float64, n), lag: make([]float64, n), phi: 1}
}

// setTemperature evaluates every parameter at t °C.
func (ps *pitzerState) setTemperature(t float64) {
	if ps.tSet && ps.t == t {
		return
	}
	set := ps.set
	val := func(p *pitzerParam) float64 {
		if p == nil {
			return 0
		}
		return p.at(t)
	}
	ps.aphi = set.aphi.at(t)
	for k := range set.binaries {
		b := &set.binaries[k]
		ps.bin[k] = pzBinVals{b0: val(b.b0), b1: val(b.b1), b2: val(b.b2), c: val(b.cp) * b.cScale}
	}
	for k := range set.pairs {
		ps.theta[k] = val(set.pairs[k].theta)
	}
	for k := range set.triples {
		ps.psi[k] = val(set.triples[k].psi)
	}
	for k := range set.lambdas {
		ps.lambda[k] = val(set.lambdas[k].lam)
	}
	ps.t, ps.tSet = t, true
}

// reset forgets the lagged coefficients: ln γ starts at its Debye–Hückel
// term and φ at 1.
func (ps *pitzerState) reset() {
	for k := range ps.lag {
		ps.lag[k] = 0
	}
	ps.phi = 1
}

// debyeHuckel returns the Debye–Hückel term of the Pitzer equations,
// f^γ = −A_φ[√I/(1+b√I) + (2/b) ln(1+b√I)], and its derivative with respect
// to I, kg/mol.
func (ps *pitzerState) debyeHuckel(I float64) (f, df float64) {
	I = math.Max(I, 1e-20)
	s := math.Sqrt(I)
	d := 1 + pitzerB*s
	f = -ps.aphi * (s/d + 2/pitzerB*math.Log(d))
	df = -ps.aphi * (3 + 2*pitzerB*s) / (2 * s * d * d)
	return f, df
}

// pitzerG returns g(x) = 2[1 − (1+x)e^−x]/x² and g'(x) = −2[1 − (1+x+x²/2)e^−x]/x²
// (series below x = 0.01, where the closed forms lose digits).
func pitzerG(x float64) (g, gp float64) {
	if x < 0.01 {
		g = 1 - 2*x/3 + x*x/4 - x*x*x/15 + x*x*x*x/72
		gp = -x/3 + x*x/4 - x*x*x/10 + x*x*x*x/36
		return g, gp
	}
	e := math.Exp(-x)
	x2 := x * x
	g = 2 * (1 - (1+x)*e) / x2
	gp = -2 * (1 - (1+x+x2/2)*e) / x2
	return g, gp
}

// pitzerJ returns J(x) and J'(x) of the unsymmetrical mixing terms, x ≥ 0:
//
//	J(x) = (1/x) ∫₀^∞ [1 + q + q²/2 − e^q] y² dy,  q = −(x/y)·e^−y
//
// interpolated (cubic Hermite in ln x) in a table computed once from the
// integral itself (jTable). Below the table J falls as x², beyond it J is
// extended along its tangent (J' tends to ¼). J(0) = 0.
//
// References: Pitzer, K.S. (1975) J. Solution Chem. 4:249 (definition).
// HMW84 used Harvie's Chebyshev approximation; Pitzer's (1975) four-constant
// approximation is about 1 % off at x = 1–5 (see the tests), which moves
// ln γ of Ca²⁺ in 3–6 mol/kg NaCl by about 0.005, so the integral is used.
func pitzerJ(x float64) (J, Jp float64) {
	if x <= 0 {
		return 0, 0
	}
	tab := pitzerJTable()
	u := math.Log(x)
	last := len(tab.J) - 1
	switch {
	case u <= tab.u0:
		r := x / math.Exp(tab.u0)
		J = tab.J[0] * r * r
		return J, 2 * J / x
	case u >= tab.u0+float64(last)*tab.du:
		xm := math.Exp(tab.u0 + float64(last)*tab.du)
		Jp = tab.dJ[last] / xm
		return tab.J[last] + Jp*(x-xm), Jp
	}
	f := (u - tab.u0) / tab.du
	k := int(f)
	t := f - float64(k)
	t2, t3 := t*t, t*t*t
	h00, h10, h01, h11 := 2*t3-3*t2+1, t3-2*t2+t, -2*t3+3*t2, t3-t2
	J = h00*tab.J[k] + h10*tab.du*tab.dJ[k] + h01*tab.J[k+1] + h11*tab.du*tab.dJ[k+1]
	d00, d10, d01, d11 := 6*t2-6*t, 3*t2-4*t+1, -6*t2+6*t, 3*t2-2*t
	dJdu := (d00*tab.J[k]+d01*tab.J[k+1])/tab.du + d10*tab.dJ[k] + d11*tab.dJ[k+1]
	return J, dJdu / x
}

// jTable holds J and dJ/du (u = ln x) on an even grid of u.
type jTable struct {
	u0, du float64
	J, dJ  []float64
}

// pitzerJTable is J(x) for x from 1e−6 to 1e3 at steps of 0.1 in ln x,
// computed once (about 7 ms) from the defining integral by jIntegral.
var pitzerJTable = sync.OnceValue(func() *jTable {
	const lo, hi, du = 1e-6, 1e3, 0.1
	u0 := math.Log(lo)
	n := int(math.Ceil((math.Log(hi)-u0)/du)) + 1
	tab := &jTable{u0: u0, du: du, J: make([]float64, n), dJ: make([]float64, n)}
	for k := range n {
		tab.J[k], tab.dJ[k] = jIntegral(math.Exp(u0+float64(k)*du), 500)
	}
	return tab
})

// jIntegral returns J(x) and dJ/d ln x = x·J'(x) from the defining
// integral, by Simpson's rule on n intervals in s = ln y from y = 10⁻⁶·min(x,1)
// to 40 (below, the integrand is x²/2; beyond, negligible). With
// K(x) = x·J(x), K'(x) = ∫ [x e^−2y + y e^−y (e^q − 1)] dy and
// x·J' = K' − J. Converges to about 1e−12 relative at n = 500.
func jIntegral(x float64, n int) (J, dJdu float64) {
	ylo := 1e-6 * math.Min(x, 1)
	slo, shi := math.Log(ylo), math.Log(40.0)
	h := (shi - slo) / float64(n)
	var K, Kp float64
	for i := 0; i <= n; i++ {
		y := math.Exp(slo + float64(i)*h)
		w := 2.0
		switch {
		case i == 0 || i == n:
			w = 1
		case i%2 == 1:
			w = 4
		}
		ey := math.Exp(-y)
		q := -x * ey / y
		// 1 + q + q²/2 − e^q, by its series where it cancels.
		var hq float64
		if math.Abs(q) < 0.05 {
			hq = -q * q * q * (1.0/6 + q*(1.0/24+q*(1.0/120+q/720)))
		} else {
			hq = 1 + q + q*q/2 - math.Exp(q)
		}
		K += w * y * y * hq * y
		Kp += w * (x*ey*ey + y*ey*math.Expm1(q)) * y
	}
	K = K*h/3 + x*x*ylo/2
	Kp = Kp*h/3 + x*ylo
	J = K / x
	return J, Kp - J
}

// etheta returns ^Eθ and ^Eθ' of two like-charged ions of charges |zi|,
// |zj| at ionic strength I, cached for one evaluation.
//
//	^Eθ  = (zi zj/4I)[J(x_ij) − ½J(x_ii) − ½J(x_jj)],  x_ij = 6 zi zj A_φ √I
//	^Eθ' = −^Eθ/I + (zi zj/8I²)[x_ij J'(x_ij) − ½x_ii J'(x_ii) − ½x_jj J'(x_jj)]
func (ps *pitzerState) etheta(zi, zj int, I, sqrtI float64) (float64, float64) {
	if zi < len(ps.eth) && zj < len(ps.eth) && ps.eth[zi][zj].ok {
		c := ps.eth[zi][zj]
		return c.v, c.vp
	}
	fi, fj := float64(zi), float64(zj)
	base := 6 * ps.aphi * sqrtI
	xij, xii, xjj := base*fi*fj, base*fi*fi, base*fj*fj
	Jij, Jpij := pitzerJ(xij)
	Jii, Jpii := pitzerJ(xii)
	Jjj, Jpjj := pitzerJ(xjj)
	zz := fi * fj
	v := zz / (4 * I) * (Jij - Jii/2 - Jjj/2)
	vp := -v/I + zz/(8*I*I)*(xij*Jpij-xii*Jpii/2-xjj*Jpjj/2)
	if zi < len(ps.eth) && zj < len(ps.eth) {
		ps.eth[zi][zj] = ethetaValue{v: v, vp: vp, ok: true}
	}
	return v, vp
}

// gammas evaluates the Pitzer equations at the molalities ps.m of the
// positions, with ionic strength I, Z = Σ|z|m and S = Σm over all solute
// species (mol/kg), into ps.lng (ln γ per position); it returns the osmotic
// coefficient φ. Below I = 1e-30 every ln γ is 0 and φ is 1.
//
//	F      = f^γ + ΣcΣa m_c m_a B'_ca + Σ m_i m_j Φ'_ij (like-charged pairs)
//	ln γ_M = z²F + Σa m_a(2B_Ma + Z C_Ma) + Σc m_c(2Φ_Mc + Σa m_a ψ_Mca)
//	         + Σa<a' m_a m_a' ψ_Maa' + |z_M| ΣcΣa m_c m_a C_ca + 2Σn m_n λ_nM
//	ln γ_N = 2Σi m_i λ_Ni
//	φ − 1  = (2/S)[−A_φ I^{3/2}/(1+b√I) + ΣcΣa m_c m_a(B^φ_ca + Z C_ca)
//	         + Σ m_i m_j(Φ^φ_ij + Σk m_k ψ_ijk) + Σ m_n m_i λ_ni]
//
// with B = β0 + β1 g(α1√I) + β2 g(α2√I), B' = [β1 g'(α1√I) + β2 g'(α2√I)]/I,
// B^φ = β0 + β1 e^(−α1√I) + β2 e^(−α2√I), C = Cφ/(2√|z_M z_X|), Φ = θ + ^Eθ,
// Φ' = ^Eθ', Φ^φ = θ + ^Eθ + I·^Eθ'.
//
// References: Harvie, Møller & Weare (1984) GCA 48:723, eqs. 1–8; Pitzer
// (1991) ch. 3.
func (ps *pitzerState) gammas(I, Z, S float64) float64 {
	set := ps.set
	m, lng := ps.m, ps.lng
	for k := range lng {
		lng[k] = 0
	}
	if !(I > 1e-30) || !(S > 0) {
		return 1
	}
	sqrtI := math.Sqrt(I)
	for zi := range ps.eth {
		for zj := range ps.eth[zi] {
			ps.eth[zi][zj].ok = false
		}
	}
	for k, a := range set.alphas {
		x := a * sqrtI
		ps.g[k], ps.gp[k] = pitzerG(x)
		ps.ex[k] = math.Exp(-x)
	}
	d := 1 + pitzerB*sqrtI
	F := -ps.aphi * (sqrtI/d + 2/pitzerB*math.Log(d))
	phiSum := -ps.aphi * I * sqrtI / d
	var cSum float64
	for k := range set.binaries {
		b := &set.binaries[k]
		v := &ps.bin[k]
		mc, ma := m[b.c], m[b.a]
		B := v.b0 + v.b1*ps.g[b.ia1] + v.b2*ps.g[b.ia2]
		Bp := (v.b1*ps.gp[b.ia1] + v.b2*ps.gp[b.ia2]) / I
		Bphi := v.b0 + v.b1*ps.ex[b.ia1] + v.b2*ps.ex[b.ia2]
		w := 2*B + Z*v.c
		lng[b.c] += ma * w
		lng[b.a] += mc * w
		mm := mc * ma
		F += mm * Bp
		cSum += mm * v.c
		phiSum += mm * (Bphi + Z*v.c)
	}
	for k := range set.pairs {
		pr := &set.pairs[k]
		var eth, ethp float64
		if pr.unsym {
			eth, ethp = ps.etheta(pr.zi, pr.zj, I, sqrtI)
		}
		mi, mj := m[pr.i], m[pr.j]
		phi := ps.theta[k] + eth
		lng[pr.i] += 2 * mj * phi
		lng[pr.j] += 2 * mi * phi
		F += mi * mj * ethp
		phiSum += mi * mj * (phi + I*ethp)
	}
	for k := range set.triples {
		tr := &set.triples[k]
		psi := ps.psi[k]
		mi, mj, mk := m[tr.i], m[tr.j], m[tr.k]
		lng[tr.i] += mj * mk * psi
		lng[tr.j] += mi * mk * psi
		lng[tr.k] += mi * mj * psi
		phiSum += mi * mj * mk * psi
	}
	for k := range set.lambdas {
		l := &set.lambdas[k]
		lam := ps.lambda[k]
		lng[l.i] += 2 * m[l.n] * lam
		lng[l.n] += 2 * m[l.i] * lam
		phiSum += m[l.n] * m[l.i] * lam
	}
	for p, z := range set.z {
		if z != 0 {
			lng[p] += z*z*F + math.Abs(z)*cSum
		}
	}
	return 1 + 2*phiSum/S
}

// newPitzerSolver returns a solver for the Pitzer model set.
func newPitzerSolver(set *pitzerSet) *solver {
	s := newSolver(set.model)
	s.pz = newPitzerState(set)
	return s
}

// pitzerActive reports whether the solver runs the Pitzer equations.
func (s *solver) pitzerActive() bool {
	return s.pz != nil && s.p.model == Pitzer
}

// pitzerApply sets ln γ and d ln γ/dI of the Pitzer species from the lagged
// coefficients: the specific-interaction part is held at its last refresh,
// the Debye–Hückel term follows the current ionic strength, so that the
// Jacobian keeps the dominant dependence on I.
func (s *solver) pitzerApply(I float64) {
	ps := s.pz
	f, df := ps.debyeHuckel(I)
	for p, i := range ps.set.ionSpecies {
		if !s.live[i] {
			continue
		}
		z2 := ps.set.z[p] * ps.set.z[p]
		s.lng[i] = ps.lag[p] + z2*f
		s.dlng[i] = z2 * df
	}
}

// pitzerRefresh recomputes the Pitzer coefficients and φ from the molalities
// at the current unknowns and returns the largest change of any lagged
// ln γ or of φ (NaN when the coefficients are not finite).
func (s *solver) pitzerRefresh() float64 {
	ps := s.pz
	set := ps.set
	s.evaluate(false) // molalities at the current point
	var I2, Z, S float64
	for i := range s.m.species {
		if !s.live[i] {
			continue
		}
		mi := s.ms[i]
		z := s.m.species[i].act.z
		I2 += z * z * mi
		Z += math.Abs(z) * mi
		S += mi
	}
	I := I2 / 2
	for p, i := range set.ionSpecies {
		ps.m[p] = 0
		if s.live[i] {
			ps.m[p] = s.ms[i]
		}
	}
	phi := ps.gammas(I, Z, S)
	f, _ := ps.debyeHuckel(I)
	move := math.Abs(phi - ps.phi)
	for p, z := range set.z {
		lag := ps.lng[p] - z*z*f
		move = math.Max(move, math.Abs(lag-ps.lag[p]))
		ps.lag[p] = lag
	}
	ps.phi = phi
	if math.IsNaN(move) || math.IsInf(move, 0) {
		return math.NaN()
	}
	return move
}

// pitzerWarnings says which parameters of the solution just solved were
// used away from the temperatures they are known at, and which components
// keep ion-association activity coefficients.
func (s *solver) pitzerWarnings(t float64) []string {
	ps := s.pz
	set := ps.set
	var out []string
	sig := make([]bool, len(set.ionSpecies))
	for p, i := range set.ionSpecies {
		ps.m[p] = 0
		if s.live[i] {
			ps.m[p] = s.ms[i]
		}
		sig[p] = s.significantSpecies(i)
	}
	I := math.Exp(s.lnI)
	type flagged struct {
		label string
		size  float64
	}
	var only25, held []flagged
	for _, tm := range set.terms {
		p := tm.p
		constant := !p.hasT && math.Abs(t-25) > 5
		outside := p.hasT && (t < p.tMin-1e-9 || t > p.tMax+1e-9)
		if !constant && !outside {
			continue
		}
		size := ps.contribution(tm, I, sig)
		if size <= pitzerSignificant {
			continue
		}
		if constant {
			only25 = append(only25, flagged{p.label(), size})
		} else {
			held = append(held, flagged{fmt.Sprintf("%s (%g–%g °C)", p.label(), p.tMin, p.tMax), size})
		}
	}
	// The parameters that move ln γ most come first; the rest are counted.
	list := func(xs []flagged) string {
		slices.SortStableFunc(xs, func(a, b flagged) int {
			if a.size != b.size {
				return cmp.Compare(b.size, a.size)
			}
			return strings.Compare(a.label, b.label)
		})
		const most = 6
		var names []string
		for _, x := range xs[:min(most, len(xs))] {
			names = append(names, x.label)
		}
		if len(xs) > most {
			return strings.Join(names, ", ") + fmt.Sprintf(" and %d more", len(xs)-most)
		}
		return strings.Join(names, ", ")
	}
	if len(only25) > 0 {
		out = append(out, fmt.Sprintf("Pitzer parameters known at 25 °C only, used unchanged at %.4g °C (largest effect first): %s", t, list(only25)))
	}
	if len(held) > 0 {
		out = append(out, fmt.Sprintf("Pitzer parameters outside their fitted temperature range at %.4g °C, held at the range limit: %s", t, list(held)))
	}
	var outside []string
	for _, c := range set.fallback {
		if s.p.totals[set.model.compMaster[c]] > 0 || (c == water.C && s.p.cRow != rowAbsent) {
			outside = append(outside, c.String())
		}
	}
	if len(outside) > 0 {
		out = append(out, fmt.Sprintf("components outside the Pitzer parameter set (%s) keep ion-association (Truesdell–Jones) activity coefficients",
			strings.Join(outside, ", ")))
	}
	return out
}

// contribution estimates how much parameter term tm moves ln γ of the
// significant species it joins (sig, per position), at the molalities ps.m
// and ionic strength I.
func (ps *pitzerState) contribution(tm pzTerm, I float64, sig []bool) float64 {
	m := ps.m
	n := pitzerNames[tm.p.kind]
	v := math.Abs(tm.p.at(ps.t))
	switch tm.p.kind {
	case pzBeta2:
		g, _ := pitzerG(pitzerAlpha2 * math.Sqrt(I))
		v *= g
	case pzPsi:
		v /= 2 // ψ enters as m_j·m_k·ψ, not 2·m·ψ
	}
	var most float64
	for a := 0; a < n; a++ {
		if !sig[tm.pos[a]] {
			continue
		}
		// The others' molalities (their product for ψ) times 2|P|.
		w := 2 * v
		for b := 0; b < n; b++ {
			if b != a {
				w *= m[tm.pos[b]]
			}
		}
		most = math.Max(most, w)
	}
	return most
}

// significantSpecies reports whether species i of the current solution
// carries at least 1 % of the total of a component it contains (H[+] and
// OH[-]: above 1e-4 mol/kg), so that its activity coefficient matters to a
// saturation index or to a balance.
func (s *solver) significantSpecies(i int) bool {
	mi := s.ms[i]
	if !s.live[i] || mi <= 0 {
		return false
	}
	sp := &s.m.species[i]
	var other bool
	for _, nt := range sp.nu {
		if nt.j == 0 {
			continue
		}
		other = true
		total := s.p.totals[nt.j]
		if total <= 0 || math.Abs(nt.coef)*mi >= 0.01*total {
			return true
		}
	}
	return !other && mi > 1e-4
}
