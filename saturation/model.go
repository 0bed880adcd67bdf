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
}

const hydrogen = "H[+]"

// masterAlkalinity is the titration alkalinity, eq/mol, of each master
// species relative to the zero level H2CO3, H4SiO4, H2PO4−, B(OH)3, HSO4−'s
// SO4, HF's F: CO3[2-] +2, PO4[3-] +2, H[+] −1, others 0. Species inherit the
// sum over their composition, so OH− counts +1, HCO3− +1, HSO4− −1, HF −1,
// H3SiO4− +1, B(OH)4− +1, HPO4²⁻ +1, H3PO4 −1.
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
	nm := len(m.masters)
	mIdx := map[string]int{}
	for i, n := range m.masters {
		e, ok := t.Entry(n)
		if !ok || e.Phase != Master {
			return nil, fmt.Errorf("thermodynamic table: master species %s missing", n)
		}
		mIdx[n] = i
	}
	// Reduce every entry, memoised, by recursion over equation terms.
	type reduced struct {
		comp []float64 // over masters
		w    float64
		logK []lkTerm
	}
	memo := map[string]*reduced{}
	visiting := map[string]bool{}
	var reduce func(name string) (*reduced, error)
	reduce = func(name string) (*reduced, error) {
		if r, ok := memo[name]; ok {
			return r, nil
		}
		if j, ok := mIdx[name]; ok {
			r := &reduced{comp: make([]float64, nm)}
			r.comp[j] = 1
			memo[name] = r
			return r, nil
		}
		if visiting[name] {
			return nil, fmt.Errorf("thermodynamic table: %s is defined in terms of itself", name)
		}
		visiting[name] = true
		defer delete(visiting, name)
		i, ok := t.index[name]
		if !ok {
			return nil, fmt.Errorf("thermodynamic table: %s not defined", name)
		}
		e := &t.entries[i]
		var self float64
		for _, tm := range e.terms {
			if tm.name == e.Name {
				self = tm.coef
			}
		}
		// For aqueous species solve Σν log a = log K for the species; for
		// minerals and gases write dissolution (self coefficient −1).
		r := &reduced{comp: make([]float64, nm)}
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
			sub, err := reduce(tm.name)
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
		memo[name] = r
		return r, nil
	}
	sparse := func(comp []float64) []nuTerm {
		var out []nuTerm
		for j, v := range comp {
			if math.Abs(v) > 1e-12 {
				out = append(out, nuTerm{j, v})
			}
		}
		return out
	}
	params := func(e *Entry) activityParams {
		p := activityParams{z: e.Charge, z2: e.Charge * e.Charge, neutral: e.Charge == 0, size: defaultIonSize}
		if !math.IsNaN(e.IonSize) {
			p.size = e.IonSize
		}
		if !math.IsNaN(e.IonSize) && !math.IsNaN(e.TJB) {
			p.hasTJ, p.tjB = true, e.TJB
		}
		return p
	}
	for j, n := range m.masters {
		e := &t.entries[t.index[n]]
		m.species = append(m.species, species{name: n, nu: []nuTerm{{j, 1}},
			alk: masterAlkalinity[n], act: params(e), entry: e, master: j})
		m.speciesIdx[n] = j
	}
	for i := range t.entries {
		e := &t.entries[i]
		if e.Phase == Master {
			continue
		}
		r, err := reduce(e.Name)
		if err != nil {
			return nil, err
		}
		switch e.Phase {
		case Aqueous:
			s := species{name: e.Name, nu: sparse(r.comp), nuW: r.w, logK: r.logK,
				act: params(e), entry: e, master: -1}
			var z float64
			for _, nt := range s.nu {
				s.alk += nt.coef * masterAlkalinity[m.masters[nt.j]]
				z += nt.coef * m.species[nt.j].act.z
			}
			if math.Abs(z-e.Charge) > 1e-9 {
				return nil, fmt.Errorf("thermodynamic table line %d: %s: charge %g does not match its reaction (%g)", e.Line, e.Name, e.Charge, z)
			}
			m.speciesIdx[e.Name] = len(m.species)
			m.species = append(m.species, s)
		case Mineral, Gas:
			p := phase{name: e.Name, formula: e.Formula, nu: sparse(r.comp), nuW: r.w, logK: r.logK, entry: e}
			var z float64
			for _, nt := range p.nu {
				z += nt.coef * m.species[nt.j].act.z
			}
			if math.Abs(z) > 1e-9 {
				return nil, fmt.Errorf("thermodynamic table line %d: %s: dissolution reaction is not charge balanced", e.Line, e.Name)
			}
			if e.Phase == Mineral {
				m.mineralIdx[e.Name] = len(m.minerals)
				m.minerals = append(m.minerals, p)
			} else {
				m.gasIdx[e.Name] = len(m.gases)
				m.gases = append(m.gases, p)
			}
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
