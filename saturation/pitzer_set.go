package saturation

// The Pitzer model set: the ion-association table reduced for the Pitzer
// equations and the parameters compiled onto its species.

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"scalerisk/water"
)

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
	pm, err := set.reduceTable(m, role, logK)
	if err != nil {
		return nil, err
	}
	set.model = pm
	pos := set.placeSpecies(role)
	thetaOf := set.compileParams(tab, pos)
	if set.aphi == nil {
		return nil, errors.New("Pitzer parameter table: no aphi row")
	}
	set.likePairs(thetaOf)
	return set, nil
}

// reduceTable returns the model of m's table without the ion pairs the
// Pitzer set excludes (recorded in set.excluded) and with its own log K at
// 25 °C where logK gives one. Its minerals and gases are checked to be
// those of m, in the same order.
func (set *pitzerSet) reduceTable(m *Model, role map[string]pitzerKind, logK map[string]*pitzerParam) (*Model, error) {
	t := &Table{index: map[string]int{}}
	for _, e := range m.table.entries {
		if k, ok := role[e.Name]; ok && k == pzExclude && e.Phase == Aqueous {
			set.excluded = append(set.excluded, e.Name)
			continue
		}
		if p, ok := logK[e.Name]; ok && e.Phase != Master && (e.File == "" || e.File == "data/thermo.csv") {
			// The Pitzer set's own log K at 25 °C; the row's temperature
			// dependence is kept (shifted by the difference at 25 °C). A
			// row the user replaced (--thermo) is the user's choice and is
			// kept as given.
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
	return pm, nil
}

// placeSpecies gives each Pitzer species of set.model a position and lists
// the components whose master has none; it returns the position by name.
func (set *pitzerSet) placeSpecies(role map[string]pitzerKind) map[string]int {
	pm := set.model
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
	return pos
}

// alpha returns the index of α = a in set.alphas, adding it if new.
func (set *pitzerSet) alpha(a float64) int {
	if k := slices.Index(set.alphas, a); k >= 0 {
		return k
	}
	set.alphas = append(set.alphas, a)
	return len(set.alphas) - 1
}

// compileParams puts every parameter of tab whose species all have a
// position (pos) onto the set; it returns the θ of each like-charged pair.
func (set *pitzerSet) compileParams(tab *pitzerTable, pos map[string]int) map[[2]int]*pitzerParam {
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
			set.addBinary(p, ps, binIdx)
		case pzTheta:
			i, j := min(ps[0], ps[1]), max(ps[0], ps[1])
			thetaOf[[2]int{i, j}] = p
		case pzPsi:
			set.triples = append(set.triples, pzTriple{i: ps[0], j: ps[1], k: ps[2], psi: p})
		case pzLambda:
			set.lambdas = append(set.lambdas, pzNeutral{n: ps[0], i: ps[1], lam: p})
		}
	}
	return thetaOf
}

// addBinary puts binary parameter p of the pair at positions ps onto the
// pair's entry in set.binaries (binIdx: entry by pair), made on first use.
func (set *pitzerSet) addBinary(p *pitzerParam, ps [3]int, binIdx map[[2]int]int) {
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
		set.binaries = append(set.binaries, pzBinary{c: ps[0], a: ps[1], ia1: set.alpha(a1),
			ia2: set.alpha(pitzerAlpha2), cScale: 1 / (2 * math.Sqrt(zc*za))})
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
}

// likePairs lists every pair of like-charged ions with a θ (thetaOf) or
// unequal charges.
func (set *pitzerSet) likePairs(thetaOf map[[2]int]*pitzerParam) {
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
}
