package saturation

import (
	"errors"
	"fmt"
	"math"

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
	rowIonic                 // ½ Σ z_s² m_s = I
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

// solver speciates waters with one Model, reusing its work arrays; the last
// solution is the warm start of the next. A solver is not safe for
// concurrent use.
//
// The unknowns are the natural logarithms of the free molalities of the
// master species that a mass balance, alkalinity, charge balance or gas
// equilibrium determines, plus ln I: ionic strength is an unknown with its
// own equation, I = ½ Σ z² m, so that the analytic Jacobian includes the
// dependence of every activity coefficient on I and Newton–Raphson
// converges quadratically. Water activity is updated between iterations.
type solver struct {
	m      *Model
	nm, ns int

	// temperature cache
	t     float64
	tSet  bool
	lnK   []float64 // per species, natural log
	dh    dhConstants
	other tempCache // the previous temperature's constants
	// mineralLogK is log10 K of each mineral reduced to the masters, and
	// mineralOwnLogK log10 K of its own reaction as written.
	mineralLogK, mineralOwnLogK []float64

	p      problem
	hasSol bool
	lnm    []float64 // ln free molality per master
	lnI    float64
	lng    []float64 // ln γ per species
	clg    []float64 // ln γ per activity class (Model.classes)
	cdlg   []float64 // d ln γ / dI per activity class
	dlng   []float64 // d ln γ / dI per species
	ms     []float64 // molality per species
	live   []bool
	lnaw   float64

	vars     []int // master index of each unknown except the last (ln I)
	rows     []rowKind
	rowOf    []int // unknown index of each master's row, −1 if none
	alkRow   int
	chgRow   int
	gasRow   int
	scale    []float64
	jacobian []float64
	resid    []float64
	dx       []float64
	save     []float64
	ipiv     []int
	prevV    []int
	// totals and alkalinity of the previous solve, for rescale
	prevTotals []float64
	prevAlk    float64

	// acid–base forms of each unknown master (see acidBase)
	abStart   []int
	abSpecies []int
	abNuH     []float64
	abVars    []int // the unknowns the lists were built for
	abValid   bool

	// fixedScale scales the alkalinity and charge rows: the equivalents of
	// the totals, fixed for one solve so the residuals stay smooth.
	fixedScale float64

	iterations int

	// pz holds the Pitzer coefficients when the solver works on the Pitzer
	// model set (pitzer.go); nil for the ion-association set.
	pz *pitzerState

	// eq lists the minerals an equilibrium solve holds at saturation, eqX
	// the amounts of them removed (unknowns after ln a_w); empty in an
	// ordinary solve (see solveEquilibrium).
	eq  []eqMineral
	eqX []float64
	// tol is the convergence tolerance of the solve under way.
	tol float64
	// solves counts the solves, so that a search can tell whether the
	// solution it left is still the solver's state.
	solves int
}

// maxEquilibria bounds the minerals of one equilibrium solve.
const maxEquilibria = 12

// maxUnknowns bounds the unknowns of one solve: the masters, ln I, ln a_w
// and the amounts of an equilibrium solve (newSolver panics beyond it).
const maxUnknowns = 64

// maxIterations bounds the Newton–Raphson iterations of one solve;
// maxEquilibriumIterations those of an equilibrium solve, whose callers
// then fall back on a search over ordinary solves.
const (
	maxIterations            = 200
	maxEquilibriumIterations = 40
)

// chordThreshold is the largest scaled residual at which the solver
// reuses the previous Jacobian's factors (see newton).
const chordThreshold = 1e-5

// tolerance is the largest relative residual of a converged solve: mass
// balances close to 1e-12 of each total.
const tolerance = 1e-12

// newSolver returns a solver for m.
func newSolver(m *Model) *solver {
	nm, ns := len(m.masters), len(m.species)
	n := nm + 2 // grown for the amounts of an equilibrium solve on its first use
	if n+maxEquilibria > maxUnknowns {
		panic(fmt.Sprintf("saturation: %d masters are more than the solver holds", nm))
	}
	other := tempCache{lnK: make([]float64, ns), mineralLogK: make([]float64, len(m.minerals)),
		mineralOwnLogK: make([]float64, len(m.minerals))}
	return &solver{other: other, m: m, nm: nm, ns: ns,
		lnK: make([]float64, ns), mineralLogK: make([]float64, len(m.minerals)),
		mineralOwnLogK: make([]float64, len(m.minerals)),
		clg:            make([]float64, len(m.classes)), cdlg: make([]float64, len(m.classes)), lnm: make([]float64, nm), lng: make([]float64, ns),
		dlng: make([]float64, ns), ms: make([]float64, ns), live: make([]bool, ns),
		vars: make([]int, 0, n), rows: make([]rowKind, 0, n), rowOf: make([]int, nm),
		scale: make([]float64, n), jacobian: make([]float64, n*n), resid: make([]float64, n),
		dx: make([]float64, n), save: make([]float64, n), ipiv: make([]int, n), prevV: make([]int, 0, n),
		tol: tolerance}
}

func (s *solver) setTemperature(t float64) {
	if s.tSet && s.t == t {
		return
	}
	// Two temperatures are kept: a water is usually evaluated at its pH
	// temperature and then at another, alternately.
	if s.other.set && s.other.t == t {
		s.swapTemperature()
		return
	}
	if s.tSet {
		s.swapTemperature()
	}
	for i := range s.m.species {
		s.lnK[i] = math.Ln10 * evalLogK(s.m.species[i].logK, t)
	}
	for i := range s.m.minerals {
		s.mineralLogK[i] = evalLogK(s.m.minerals[i].logK, t)
		s.mineralOwnLogK[i] = s.m.minerals[i].entry.LogK(t)
	}
	s.dh = newDHConstants(t)
	s.t, s.tSet = t, true
}

// tempCache holds the temperature-dependent constants of one temperature.
type tempCache struct {
	t                           float64
	set                         bool
	lnK                         []float64
	mineralLogK, mineralOwnLogK []float64
	dh                          dhConstants
}

// swapTemperature exchanges the current temperature's constants with the
// other cached ones.
func (s *solver) swapTemperature() {
	cur := tempCache{t: s.t, set: s.tSet, lnK: s.lnK, mineralLogK: s.mineralLogK,
		mineralOwnLogK: s.mineralOwnLogK, dh: s.dh}
	o := s.other
	s.t, s.tSet, s.lnK, s.mineralLogK, s.mineralOwnLogK, s.dh = o.t, o.set, o.lnK, o.mineralLogK, o.mineralOwnLogK, o.dh
	s.other = cur
}

// ErrNoConvergence reports a speciation that did not converge.
var ErrNoConvergence = errors.New("speciation did not converge")

// solve speciates problem p. With warm, the previous solution is the
// starting point when the unknowns are the same.
func (s *solver) solve(p problem, warm bool) error {
	s.solves++
	s.p = p
	s.setTemperature(p.t)
	if s.pz != nil {
		s.pz.setTemperature(p.t) // Pitzer model set
	}
	s.setUnknowns(p)
	m := s.m
	s.fixedScale = math.Abs(p.alk) + 1e-7
	for j := 1; j < s.nm; j++ {
		if s.rowOf[j] >= 0 {
			sp := &m.species[j]
			s.fixedScale += (math.Abs(sp.act.z) + math.Abs(sp.alk)) * p.totals[j]
		}
	}
	same := warm && s.hasSol && sameMasters(s.prevV, s.vars)
	if same {
		s.rescale()
	} else {
		s.initialGuess()
	}
	s.prevV = append(s.prevV[:0], s.vars...)
	s.prevTotals = append(s.prevTotals[:0], p.totals...)
	s.prevAlk = p.alk
	s.hasSol = false
	err := s.newton()
	if err != nil && same {
		// A warm start from a very different water can mislead Newton:
		// start again from the cold guess.
		s.initialGuess()
		err = s.newton()
	}
	if err == nil {
		s.hasSol = true
	}
	return err
}

// newton runs Newton–Raphson with a step limit and a non-monotone
// backtracking line search until the scaled residuals have converged.
func (s *solver) newton() error {
	nb := len(s.vars) + 2 // unknowns of the speciation; then the amounts of eq
	n := nb + len(s.eq)
	s.iterations = 0
	for q := range s.eq {
		s.eqX[q] = 0
	}
	// Once the residuals are small, the factorised Jacobian of the previous
	// iteration is reused (a chord step): the last iterations then cost a
	// residual and a back-substitution instead of a Jacobian and an LU.
	factored, prevMax := false, math.Inf(1)
	// Under Pitzer the activity coefficients are refreshed from the
	// molalities at the top of every iteration and held during the step;
	// the solve has converged when the residuals and the refresh both are.
	pitzer := s.pitzerActive()
	limit, lagTol := maxIterations, pitzerTolerance
	if len(s.eq) > 0 {
		limit, lagTol = maxEquilibriumIterations, eqPitzerTolerance
	}
	for it := 0; it < limit; it++ {
		s.iterations = it + 1
		var lagMove float64
		if pitzer {
			if lagMove = s.pitzerRefresh(); math.IsNaN(lagMove) {
				return fmt.Errorf("%w: Pitzer activity coefficients became NaN", ErrNoConvergence)
			}
		}
		chord := factored && prevMax < chordThreshold
		maxAbs, sumSq := s.evaluate(!chord)
		if math.IsNaN(sumSq) || math.IsInf(sumSq, 0) {
			return fmt.Errorf("%w: residual became NaN", ErrNoConvergence)
		}
		if maxAbs < s.tol && lagMove < lagTol {
			return nil
		}
		if chord && maxAbs > 0.1*prevMax {
			// The chord step did not contract well: refresh the Jacobian.
			maxAbs, sumSq = s.evaluate(true)
			chord = false
		}
		prevMax = maxAbs
		for k := 0; k < n; k++ {
			s.dx[k] = -s.resid[k]
		}
		if chord {
			solveFactored(s.jacobian[:n*n], s.dx[:n], s.ipiv[:n], n)
		} else {
			if ok := solveLinear(s.jacobian[:n*n], s.dx[:n], s.ipiv[:n], n); !ok {
				return fmt.Errorf("%w: singular Jacobian (a component may be fixed twice)", ErrNoConvergence)
			}
			factored = true
		}
		if err := s.step(nb, n, maxAbs, sumSq); err != nil {
			return err
		}
	}
	maxAbs, _ := s.evaluate(false)
	return fmt.Errorf("%w after %d iterations (largest relative residual %.2g)", ErrNoConvergence, limit, maxAbs)
}

// step takes the Newton step s.dx from the current unknowns (nb of the
// speciation, n in all), limited to a factor of 10 in any molality, in I or
// in a_w (and short of taking out what the water holds, for the amounts of
// an equilibrium solve), and halved while it makes the residuals (max
// maxAbs, sum of squares sumSq now) much worse.
func (s *solver) step(nb, n int, maxAbs, sumSq float64) error {
	cI, cW := nb-2, nb-1
	// Limit the step to a factor of 10 in any molality, in I or in a_w.
	var big float64
	for k := 0; k < nb; k++ {
		big = math.Max(big, math.Abs(s.dx[k]))
	}
	if math.IsNaN(big) {
		return fmt.Errorf("%w: Newton step became NaN", ErrNoConvergence)
	}
	lambda := 1.0
	if big > math.Ln10 {
		lambda = math.Ln10 / big
	}
	if len(s.eq) > 0 {
		// The amounts' part of the step stops short of taking out
		// what the water holds (the speciation's part is kept).
		dxEq := s.dx[nb:n]
		f := s.equilibriumStep(dxEq, lambda)
		for q := range dxEq {
			dxEq[q] *= f
		}
	}
	for k, j := range s.vars {
		s.save[k] = s.lnm[j]
	}
	s.save[cI], s.save[cW] = s.lnI, s.lnaw
	copy(s.save[nb:n], s.eqX[:len(s.eq)])
	for try := 0; try < 12; try++ {
		for k, j := range s.vars {
			s.lnm[j] = s.save[k] + lambda*s.dx[k]
		}
		s.lnI = s.save[cI] + lambda*s.dx[cI]
		s.lnaw = math.Min(s.save[cW]+lambda*s.dx[cW], 0)
		for q := range s.eq {
			s.eqX[q] = s.save[nb+q] + lambda*s.dx[nb+q]
		}
		if try == 11 || maxAbs < 1e-6 || lambda*big < 0.5 {
			break // a small step near the solution is taken as it is
		}
		// A non-monotone test: the residuals of a speciation may rise
		// for a step or two on the way (a component's minor species
		// swing), so only a step that makes them much worse is cut.
		_, trial := s.evaluate(false)
		if trial < 100*sumSq+1e-20 {
			break
		}
		lambda /= 2
	}
	return nil
}

// setUnknowns chooses the unknowns and equations of problem p: a row for
// each master present (mass balance, or the H[+] and carbon rows p asks
// for), the ionic-strength row, and which species are live.
func (s *solver) setUnknowns(p problem) {
	m := s.m
	cj := m.compMaster[water.C]
	present := func(j int) bool {
		switch j {
		case 0:
			return true
		case cj:
			return p.cRow != rowAbsent
		}
		return p.totals[j] > 0
	}
	s.vars, s.rows = s.vars[:0], s.rows[:0]
	s.alkRow, s.chgRow, s.gasRow = -1, -1, -1
	for j := 0; j < s.nm; j++ {
		s.rowOf[j] = -1
		if !present(j) {
			continue
		}
		kind := rowMass
		switch j {
		case 0:
			if p.hRow == rowFixed {
				continue
			}
			kind = p.hRow
		case cj:
			kind = p.cRow
		}
		k := len(s.vars)
		s.vars = append(s.vars, j)
		s.rows = append(s.rows, kind)
		switch kind {
		case rowMass:
			s.rowOf[j] = k
		case rowAlk:
			s.alkRow = k
		case rowCharge:
			s.chgRow = k
		case rowGas:
			s.gasRow = k
		}
	}
	s.rows = append(s.rows, rowIonic)
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
			s.ms[i], s.lng[i], s.dlng[i] = 0, 0, 0
		}
	}
}
