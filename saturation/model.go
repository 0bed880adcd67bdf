package saturation

import (
	"fmt"
	"math"
	"slices"
	"sync"

	"scalerisk/water"
)

// masterNames gives the master species of each water component.
var masterNames = [water.NumComponents]string{
	water.Ca: "Ca[2+]", water.Mg: "Mg[2+]", water.Na: "Na[+]", water.K: "K[+]",
	water.Ba: "Ba[2+]", water.Sr: "Sr[2+]", water.Fe: "Fe[2+]", water.Mn: "Mn[2+]",
	water.Cl: "Cl[-]", water.S: "SO4[2-]", water.C: "CO3[2-]", water.Si: "H4SiO4[0]",
	water.P: "PO4[3-]", water.F: "F[-]", water.N: "NO3[-]", water.B: "B(OH)3[0]",
	water.Br: "Br[-]", water.I: "I[-]", water.Li: "Li[+]", water.NH4: "NH4[+]",
}

const hydrogen = "H[+]"

// masterAlkalinity is the titration alkalinity, eq/mol, of each master
// species relative to the zero level H2CO3, H4SiO4, H2PO4−, B(OH)3, NH4⁺,
// HSO4−'s SO4, HF's F: CO3[2-] +2, PO4[3-] +2, H[+] −1, others 0. Species
// inherit the sum over their composition, so OH− counts +1, HCO3− +1, HSO4−
// −1, HF −1, H3SiO4− +1, B(OH)4− +1, HPO4²⁻ +1, H3PO4 −1, NH3 +1.
//
// References: Dickson, A.G. (1981) Deep-Sea Res. 28A:609 (definition of total
// alkalinity by proton condition, from memory).
var masterAlkalinity = map[string]float64{hydrogen: -1, "CO3[2-]": 2, "PO4[3-]": 2}

// lkTerm is one contribution to a reduced log K: coef × log K of an entry.
type lkTerm struct {
	coef  float64
	entry *Entry
}

// nuTerm is one nonzero stoichiometric coefficient over the masters.
type nuTerm struct {
	j    int
	coef float64
}

// species is an aqueous species reduced to the masters: log a_s =
// logK_s(T) + Σ ν_sj log a_j + ν_sW log a_w.
type species struct {
	name   string
	nu     []nuTerm
	nuW    float64
	logK   []lkTerm
	alk    float64
	act    activityParams
	class  int // index into Model.classes: species with equal activity parameters
	entry  *Entry
	master int // master index for a master species, −1 otherwise
}

// phase is a mineral or gas reduced to the masters: SI = Σ ν_j log a_j +
// ν_W log a_w − logK(T).
type phase struct {
	name    string
	formula string
	nu      []nuTerm
	nuW     float64
	logK    []lkTerm
	entry   *Entry
}

// Model is a thermodynamic table reduced to the master species of the
// water components: what the speciation solver works on. Build one with
// NewModel; a Model is read-only and safe for concurrent use.
type Model struct {
	table      *Table
	masters    []string // index 0 is H[+]
	compMaster [water.NumComponents]int
	species    []species // the first len(masters) are the masters themselves
	minerals   []phase
	gases      []phase
	// classes holds each distinct set of activity parameters once, so that
	// the solver computes γ per class rather than per species.
	classes    []activityParams
	speciesIdx map[string]int
	mineralIdx map[string]int
	gasIdx     map[string]int
	// pitzer builds, on first use, the Pitzer model set derived from this
	// model's table (pitzer.go).
	pitzer func() (*pitzerSet, error)
}

// NewModel reduces table t to the master species of the water components.
func NewModel(t *Table) (*Model, error) {
	m := &Model{table: t, speciesIdx: map[string]int{}, mineralIdx: map[string]int{}, gasIdx: map[string]int{}}
	m.masters = append(m.masters, hydrogen)
	for c := range water.NumComponents {
		m.masters = append(m.masters, masterNames[c])
		m.compMaster[c] = len(m.masters) - 1
	}
	rd := &reducer{t: t, nm: len(m.masters), masters: map[string]int{}, memo: map[string]*reduced{}, visiting: map[string]bool{}}
	for i, n := range m.masters {
		e, ok := t.Entry(n)
		if !ok || e.Phase != Master {
			return nil, fmt.Errorf("thermodynamic table: master species %s missing", n)
		}
		rd.masters[n] = i
	}
	for j, n := range m.masters {
		e := &t.entries[t.index[n]]
		m.species = append(m.species, species{name: n, nu: []nuTerm{{j, 1}},
			alk: masterAlkalinity[n], act: entryActivityParams(e), entry: e, master: j})
		m.speciesIdx[n] = j
	}
	for i := range t.entries {
		e := &t.entries[i]
		if e.Phase == Master {
			continue
		}
		r, err := rd.reduce(e.Name)
		if err != nil {
			return nil, err
		}
		if err := m.add(e, r); err != nil {
			return nil, err
		}
	}
	for i := range m.species {
		p := m.species[i].act
		k := slices.Index(m.classes, p)
		if k < 0 {
			m.classes = append(m.classes, p)
			k = len(m.classes) - 1
		}
		m.species[i].class = k
	}
	m.pitzer = sync.OnceValues(func() (*pitzerSet, error) { return newPitzerSet(m) })
	return m, nil
}

// reduced is an entry written over the masters: its composition, its
// water and the log K terms of its reduced reaction.
type reduced struct {
	comp []float64 // over masters
	w    float64
	logK []lkTerm
}

// reducer reduces the entries of a table to the masters, memoised, by
// recursion over equation terms.
type reducer struct {
	t        *Table
	nm       int            // number of masters
	masters  map[string]int // master index by name
	memo     map[string]*reduced
	visiting map[string]bool
}

// reduce returns entry name written over the masters.
func (rd *reducer) reduce(name string) (*reduced, error) {
	if r, ok := rd.memo[name]; ok {
		return r, nil
	}
	if j, ok := rd.masters[name]; ok {
		r := &reduced{comp: make([]float64, rd.nm)}
		r.comp[j] = 1
		rd.memo[name] = r
		return r, nil
	}
	if rd.visiting[name] {
		return nil, fmt.Errorf("thermodynamic table: %s is defined in terms of itself", name)
	}
	rd.visiting[name] = true
	defer delete(rd.visiting, name)
	i, ok := rd.t.index[name]
	if !ok {
		return nil, fmt.Errorf("thermodynamic table: %s not defined", name)
	}
	e := &rd.t.entries[i]
	var self float64
	for _, tm := range e.terms {
		if tm.name == e.Name {
			self = tm.coef
		}
	}
	// For aqueous species solve Σν log a = log K for the species; for
	// minerals and gases write dissolution (self coefficient −1).
	r := &reduced{comp: make([]float64, rd.nm)}
	scale := -1 / self // aqueous: log a_s = (logK − Σ_{i≠s} ν_i log a_i)/ν_s
	kcoef := 1 / self
	if e.Phase == Mineral || e.Phase == Gas {
		scale = 1 / -self // exponents e_i = ν_i/(−ν_m)
		kcoef = 1 / -self // log Ksp = log K/(−ν_m)
	}
	r.logK = append(r.logK, lkTerm{kcoef, e})
	for _, tm := range e.terms {
		if tm.name == e.Name {
			continue
		}
		if tm.name == "H2O" {
			r.w += scale * tm.coef
			continue
		}
		sub, err := rd.reduce(tm.name)
		if err != nil {
			return nil, err
		}
		f := scale * tm.coef
		for j, v := range sub.comp {
			r.comp[j] += f * v
		}
		r.w += f * sub.w
		// Aqueous: log a_s gains f·(log K terms of the sub-species).
		// Minerals: log K_eff = log Ksp − Σ e_i·(log K terms of species i).
		sign := 1.0
		if e.Phase == Mineral || e.Phase == Gas {
			sign = -1
		}
		for _, lt := range sub.logK {
			r.logK = append(r.logK, lkTerm{sign * f * lt.coef, lt.entry})
		}
	}
	rd.memo[name] = r
	return r, nil
}

// sparseNu returns the nonzero coefficients of comp.
func sparseNu(comp []float64) []nuTerm {
	var out []nuTerm
	for j, v := range comp {
		if math.Abs(v) > 1e-12 {
			out = append(out, nuTerm{j, v})
		}
	}
	return out
}

// entryActivityParams returns what the activity models need of entry e.
func entryActivityParams(e *Entry) activityParams {
	p := activityParams{z: e.Charge, z2: e.Charge * e.Charge, neutral: e.Charge == 0, size: defaultIonSize}
	if !math.IsNaN(e.IonSize) {
		p.size = e.IonSize
	}
	if !math.IsNaN(e.IonSize) && !math.IsNaN(e.TJB) {
		p.hasTJ, p.tjB = true, e.TJB
	}
	return p
}

// add appends entry e, reduced to r, to the species, minerals or gases of
// m, checking that its charge balances over the masters.
func (m *Model) add(e *Entry, r *reduced) error {
	switch e.Phase {
	case Aqueous:
		s := species{name: e.Name, nu: sparseNu(r.comp), nuW: r.w, logK: r.logK,
			act: entryActivityParams(e), entry: e, master: -1}
		var z float64
		for _, nt := range s.nu {
			s.alk += nt.coef * masterAlkalinity[m.masters[nt.j]]
			z += nt.coef * m.species[nt.j].act.z
		}
		if math.Abs(z-e.Charge) > 1e-9 {
			return fmt.Errorf("thermodynamic table line %d: %s: charge %g does not match its reaction (%g)", e.Line, e.Name, e.Charge, z)
		}
		m.speciesIdx[e.Name] = len(m.species)
		m.species = append(m.species, s)
	case Mineral, Gas:
		p := phase{name: e.Name, formula: e.Formula, nu: sparseNu(r.comp), nuW: r.w, logK: r.logK, entry: e}
		var z float64
		for _, nt := range p.nu {
			z += nt.coef * m.species[nt.j].act.z
		}
		if math.Abs(z) > 1e-9 {
			return fmt.Errorf("thermodynamic table line %d: %s: dissolution reaction is not charge balanced", e.Line, e.Name)
		}
		if e.Phase == Mineral {
			m.mineralIdx[e.Name] = len(m.minerals)
			m.minerals = append(m.minerals, p)
		} else {
			m.gasIdx[e.Name] = len(m.gases)
			m.gases = append(m.gases, p)
		}
	}
	return nil
}

// DefaultModel returns the model of DefaultTable.
func DefaultModel() *Model {
	m, err := defaultModel()
	if err != nil {
		panic("saturation: embedded thermodynamic table does not reduce: " + err.Error())
	}
	return m
}

var defaultModel = sync.OnceValues(func() (*Model, error) { return NewModel(DefaultTable()) })

// Table returns the table m was built from.
func (m *Model) Table() *Table { return m.table }

// evalLogK returns Σ coef·log K(t) of the terms.
func evalLogK(terms []lkTerm, t float64) float64 {
	var s float64
	for _, lt := range terms {
		s += lt.coef * lt.entry.LogK(t)
	}
	return s
}

// outOfRange reports whether any entry behind terms is evaluated outside
// its validity range at t °C, and returns the first such entry.
func outOfRange(terms []lkTerm, t float64) (*Entry, bool) {
	for _, lt := range terms {
		e := lt.entry
		if e.TemperatureFunction() == "constant" {
			continue // reported separately
		}
		if t < e.TMin-1e-9 || t > e.TMax+1e-9 {
			return e, true
		}
	}
	return nil, false
}
