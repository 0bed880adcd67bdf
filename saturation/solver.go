package saturation

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"

	"scalerisk/water"
)

// rowKind is the equation that determines one unknown of the solver.
type rowKind int

const (
	rowMass   rowKind = iota // Σ ν_sj m_s = T_j
	rowAlk                   // Σ alk_s m_s = Alk
	rowCharge                // Σ z_s m_s = 0
	rowGas                   // log a(gas reaction) = log p
	rowFixed                 // the master's activity is given (pH)
	rowAbsent                // the component is absent
)

// problem states one speciation: temperature, model, totals per master and
// how H[+] and carbon are determined.
type problem struct {
	t      float64
	model  ActivityModel
	totals []float64 // mol/kg per master index; H unused
	hRow   rowKind   // rowFixed, rowAlk or rowCharge
	lnaH   float64   // ln a(H+) when hRow == rowFixed
	cRow   rowKind   // rowMass, rowAlk, rowGas or rowAbsent
	alk    float64   // eq/kg, for rowAlk
	gas    int       // gas index for rowGas
	logP   float64   // log10 partial pressure, atm, for rowGas
}

// Solver speciates waters with one Model, reusing its work arrays; the last
// solution is the warm start of the next. A Solver is not safe for
// concurrent use.
type Solver struct {
	m      *Model
	nm, ns int

	// temperature cache
	t      float64
	tSet   bool
	lnK    []float64 // per species, natural log
	dh     dhConstants
	hasSol bool

	p    problem
	lnm  []float64 // ln free molality per master
	lng  []float64 // ln γ per species
	ms   []float64 // molality per species
	live []bool
	I    float64
	lnaw float64

	vars  []int // master index of each unknown
	rows  []rowKind
	scale []float64
	J     []float64
	R     []float64
	dx    []float64
	save  []float64
	ipiv  []int
	prevV []int

	iterations int
}

// maxIterations bounds the Newton–Raphson iterations of one solve.
const maxIterations = 300

// tolerance is the largest relative residual of a converged solve: mass
// balances close to 1e-12 of each total.
const tolerance = 1e-12

// NewSolver returns a Solver for m.
func NewSolver(m *Model) *Solver {
	nm, ns := len(m.masters), len(m.species)
	return &Solver{m: m, nm: nm, ns: ns,
		lnK: make([]float64, ns), lnm: make([]float64, nm), lng: make([]float64, ns),
		ms: make([]float64, ns), live: make([]bool, ns),
		vars: make([]int, 0, nm), rows: make([]rowKind, 0, nm), scale: make([]float64, nm),
		J: make([]float64, nm*nm), R: make([]float64, nm), dx: make([]float64, nm),
		save: make([]float64, nm), ipiv: make([]int, nm), prevV: make([]int, 0, nm)}
}

func (s *Solver) setTemperature(t float64) {
	if s.tSet && s.t == t {
		return
	}
	for i := range s.m.species {
		s.lnK[i] = math.Ln10 * evalLogK(s.m.species[i].logK, t)
	}
	s.dh = newDHConstants(t)
	s.t, s.tSet = t, true
}

// ErrNoConvergence reports a speciation that did not converge.
var ErrNoConvergence = errors.New("speciation did not converge")

// solve speciates problem p. With warm, the previous solution is the
// starting point when the unknowns are the same.
func (s *Solver) solve(p problem, warm bool) error {
	s.p = p
	s.setTemperature(p.t)
	m := s.m
	// Unknowns and live species.
	s.vars, s.rows = s.vars[:0], s.rows[:0]
	present := func(j int) bool {
		switch {
		case j == 0:
			return true
		case j == m.compMaster[water.C]:
			return p.cRow != rowAbsent
		}
		return p.totals[j] > 0
	}
	for j := 0; j < s.nm; j++ {
		if !present(j) {
			continue
		}
		switch {
		case j == 0:
			if p.hRow == rowFixed {
				continue
			}
			s.vars = append(s.vars, 0)
			s.rows = append(s.rows, p.hRow)
		case j == m.compMaster[water.C]:
			s.vars = append(s.vars, j)
			s.rows = append(s.rows, p.cRow)
		default:
			s.vars = append(s.vars, j)
			s.rows = append(s.rows, rowMass)
		}
	}
	for i := range m.species {
		ok := true
		for _, nt := range m.species[i].nu {
			if !present(nt.j) {
				ok = false
				break
			}
		}
		s.live[i] = ok
		if !ok {
			s.ms[i] = 0
			s.lng[i] = 0
		}
	}
	same := warm && s.hasSol && len(s.prevV) == len(s.vars)
	if same {
		for i, v := range s.vars {
			if s.prevV[i] != v {
				same = false
				break
			}
		}
	}
	if !same {
		s.initialGuess()
	}
	s.prevV = append(s.prevV[:0], s.vars...)
	s.hasSol = false
	err := s.newton()
	if err == nil {
		s.hasSol = true
	}
	return err
}

// initialGuess sets free molalities from the totals, dividing each by its
// acid–base forms at the starting pH, then refines mass-balance masters by
// a few ratio iterations (m_j ← m_j·T_j/Σν_sj m_s), which tames strong
// complexation before Newton–Raphson.
func (s *Solver) initialGuess() {
	m, p := s.m, &s.p
	for i := range s.lng {
		s.lng[i] = 0
	}
	s.lnaw = 0
	lnaH := p.lnaH
	if p.hRow != rowFixed {
		lnaH = -8 * math.Ln10
	}
	s.lnm[0] = lnaH
	// Denominators from species made of one master plus H and H2O.
	for k, j := range s.vars {
		if j == 0 {
			continue
		}
		denom, alkPer := 1.0, m.species[j].alk
		for i := s.nm; i < s.ns; i++ {
			sp := &m.species[i]
			if !s.live[i] {
				continue
			}
			var coefJ float64
			only := true
			var lnH float64
			for _, nt := range sp.nu {
				switch nt.j {
				case j:
					coefJ = nt.coef
				case 0:
					lnH = nt.coef * lnaH
				default:
					only = false
				}
			}
			if !only || coefJ != 1 {
				continue
			}
			x := math.Exp(math.Min(s.lnK[i]+lnH, 300))
			denom += x
			alkPer += sp.alk * x
		}
		switch s.rows[k] {
		case rowMass:
			s.lnm[j] = math.Log(p.totals[j]) - math.Log(denom)
		case rowAlk:
			if p.alk > 0 && alkPer > 0 {
				s.lnm[j] = math.Log(p.alk / alkPer)
			} else {
				s.lnm[j] = math.Log(1e-9)
			}
		case rowGas:
			g := &m.gases[p.gas]
			v := math.Ln10 * (evalLogK(g.logK, p.t) + p.logP)
			var cj float64
			for _, nt := range g.nu {
				if nt.j == j {
					cj = nt.coef
				} else {
					v -= nt.coef * s.lnm[nt.j]
				}
			}
			s.lnm[j] = v / cj
		}
	}
	for pass := 0; pass < 6; pass++ {
		s.species()
		for k, j := range s.vars {
			if s.rows[k] != rowMass {
				continue
			}
			var sum float64
			for i := range m.species {
				if !s.live[i] {
					continue
				}
				for _, nt := range m.species[i].nu {
					if nt.j == j {
						sum += nt.coef * s.ms[i]
					}
				}
			}
			if sum > 0 {
				s.lnm[j] += math.Log(p.totals[j] / sum)
			}
		}
	}
}

// updateActivity sets γ of every live species and a_w from the current
// molalities, and pins ln m(H+) when the pH is fixed.
func (s *Solver) updateActivity() {
	m := s.m
	var I2, sum float64
	for i := range m.species {
		if s.live[i] {
			z := m.species[i].act.z
			I2 += z * z * s.ms[i]
			sum += s.ms[i]
		}
	}
	s.I = I2 / 2
	sqrtI := math.Sqrt(s.I)
	for i := range m.species {
		if s.live[i] {
			s.lng[i] = math.Ln10 * logGamma(s.p.model, &m.species[i].act, s.dh, s.I, sqrtI)
		}
	}
	s.lnaw = math.Log(waterActivity(sum))
	if s.p.hRow == rowFixed {
		s.lnm[0] = s.p.lnaH - s.lng[0]
	}
}

// lnMax caps ln m of any species, so that a wild Newton step cannot
// overflow.
const lnMax = 30

// species computes the molality of every live species from lnm and the
// current activity coefficients.
func (s *Solver) species() {
	m := s.m
	for i := range m.species {
		if !s.live[i] {
			continue
		}
		sp := &m.species[i]
		if sp.master >= 0 {
			s.ms[i] = math.Exp(math.Min(s.lnm[sp.master], lnMax))
			continue
		}
		v := s.lnK[i] + sp.nuW*s.lnaw - s.lng[i]
		for _, nt := range sp.nu {
			v += nt.coef * (s.lnm[nt.j] + s.lng[nt.j])
		}
		s.ms[i] = math.Exp(math.Min(v, lnMax))
	}
}

// residual fills s.R with the scaled residuals and returns the largest
// absolute scaled residual and the sum of squares.
func (s *Solver) residual() (maxAbs, sumSq float64) {
	m, p := s.m, &s.p
	for k, j := range s.vars {
		var r, sc float64
		switch s.rows[k] {
		case rowMass:
			for i := range m.species {
				if !s.live[i] {
					continue
				}
				for _, nt := range m.species[i].nu {
					if nt.j == j {
						r += nt.coef * s.ms[i]
					}
				}
			}
			r -= p.totals[j]
			sc = p.totals[j]
		case rowAlk:
			for i := range m.species {
				if s.live[i] {
					a := m.species[i].alk
					r += a * s.ms[i]
					sc += math.Abs(a) * s.ms[i]
				}
			}
			r -= p.alk
			sc += math.Abs(p.alk)
		case rowCharge:
			for i := range m.species {
				if s.live[i] {
					z := m.species[i].act.z
					r += z * s.ms[i]
					sc += math.Abs(z) * s.ms[i]
				}
			}
		case rowGas:
			g := &m.gases[p.gas]
			r = g.nuW*s.lnaw - math.Ln10*(evalLogK(g.logK, p.t)+p.logP)
			for _, nt := range g.nu {
				r += nt.coef * (s.lnm[nt.j] + s.lng[nt.j])
			}
			sc = 1
		}
		if sc == 0 {
			sc = 1
		}
		s.scale[k] = sc
		s.R[k] = r / sc
		maxAbs = math.Max(maxAbs, math.Abs(s.R[k]))
		sumSq += s.R[k] * s.R[k]
	}
	return maxAbs, sumSq
}

// jacobian fills s.J (row-major, n×n) with ∂R_k/∂ln m_l of the scaled
// residuals, activity coefficients held constant.
func (s *Solver) jacobian() {
	m, p := s.m, &s.p
	n := len(s.vars)
	J := s.J[:n*n]
	for i := range J {
		J[i] = 0
	}
	// col[j] = unknown index of master j, or −1.
	var colBuf [64]int
	col := colBuf[:s.nm]
	for j := range col {
		col[j] = -1
	}
	for l, j := range s.vars {
		col[j] = l
	}
	for k, j := range s.vars {
		row := J[k*n : (k+1)*n]
		inv := 1 / s.scale[k]
		switch s.rows[k] {
		case rowGas:
			g := &m.gases[p.gas]
			for _, nt := range g.nu {
				if l := col[nt.j]; l >= 0 {
					row[l] += nt.coef * inv
				}
			}
			continue
		}
		for i := range m.species {
			if !s.live[i] {
				continue
			}
			sp := &m.species[i]
			var w float64
			switch s.rows[k] {
			case rowMass:
				for _, nt := range sp.nu {
					if nt.j == j {
						w = nt.coef
					}
				}
			case rowAlk:
				w = sp.alk
			case rowCharge:
				w = sp.act.z
			}
			if w == 0 {
				continue
			}
			f := w * s.ms[i] * inv
			for _, nt := range sp.nu {
				if l := col[nt.j]; l >= 0 {
					row[l] += f * nt.coef
				}
			}
		}
	}
}

// newton runs damped Newton–Raphson with a backtracking line search,
// updating activity coefficients and ionic strength every iteration until
// both the residuals and the ionic strength have converged.
func (s *Solver) newton() error {
	n := len(s.vars)
	s.iterations = 0
	prevI := -1.0
	for it := 0; it < maxIterations; it++ {
		s.iterations = it + 1
		s.species()
		s.updateActivity()
		s.species()
		maxAbs, sumSq := s.residual()
		if math.IsNaN(sumSq) {
			return fmt.Errorf("%w: residual became NaN", ErrNoConvergence)
		}
		if maxAbs < tolerance && math.Abs(s.I-prevI) <= 1e-12*math.Max(s.I, 1e-12) {
			return nil
		}
		prevI = s.I
		if n == 0 {
			continue
		}
		s.jacobian()
		for k := 0; k < n; k++ {
			s.dx[k] = -s.R[k]
		}
		a := blas64.General{Rows: n, Cols: n, Stride: n, Data: s.J[:n*n]}
		if ok := lapack64.Getrf(a, s.ipiv[:n]); !ok {
			return fmt.Errorf("%w: singular Jacobian (a component may be fixed twice)", ErrNoConvergence)
		}
		b := blas64.General{Rows: n, Cols: 1, Stride: 1, Data: s.dx[:n]}
		lapack64.Getrs(blas.NoTrans, a, b, s.ipiv[:n])
		// Limit the step to a factor of 10 in any molality.
		var big float64
		for k := 0; k < n; k++ {
			big = math.Max(big, math.Abs(s.dx[k]))
		}
		if math.IsNaN(big) {
			return fmt.Errorf("%w: Newton step became NaN", ErrNoConvergence)
		}
		lambda := 1.0
		if big > math.Ln10 {
			lambda = math.Ln10 / big
		}
		for k, j := range s.vars {
			s.save[k] = s.lnm[j]
		}
		for try := 0; try < 12; try++ {
			for k, j := range s.vars {
				s.lnm[j] = s.save[k] + lambda*s.dx[k]
			}
			s.species()
			_, trial := s.residual()
			if trial < sumSq || try == 11 {
				break
			}
			lambda /= 2
		}
	}
	maxAbs, _ := s.residual()
	return fmt.Errorf("%w after %d iterations (largest relative residual %.2g)", ErrNoConvergence, maxIterations, maxAbs)
}
