package saturation

import (
	"errors"
	"fmt"
	"math"
	"slices"

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

// rescale adapts a warm start to the new totals: each mass-balance master
// moves by the ratio of its new to its old total, carbon fixed by
// alkalinity by the ratio of the alkalinities, and ionic strength by the
// ratio of its estimates from the totals; a new fixed pH shifts each master
// by the change of its acid–base forms. A water concentrated by cycles, or
// the next sample of a similar series, then starts close to its solution.
func (s *solver) rescale() {
	p := &s.p
	// A new fixed pH shifts each master by the change of its acid–base
	// forms (activity coefficients held at the previous solution's).
	oldLnaH := s.lnm[0] + s.lng[0]
	if p.hRow == rowFixed && math.Abs(p.lnaH-oldLnaH) > 1e-9 {
		s.acidBase()
		for k, j := range s.vars {
			if j == 0 {
				continue
			}
			denOld, denNew := 1.0, 1.0
			alkOld, alkNew := s.m.species[j].alk, s.m.species[j].alk
			for q := s.abStart[k]; q < s.abStart[k+1]; q++ {
				i := s.abSpecies[q]
				xo := math.Exp(math.Min(s.lnK[i]+s.abNuH[q]*oldLnaH, 300))
				xn := math.Exp(math.Min(s.lnK[i]+s.abNuH[q]*p.lnaH, 300))
				denOld += xo
				denNew += xn
				alkOld += s.m.species[i].alk * xo
				alkNew += s.m.species[i].alk * xn
			}
			switch s.rows[k] {
			case rowMass:
				s.lnm[j] += math.Log(denOld / denNew)
			case rowAlk:
				if alkOld > 0 && alkNew > 0 {
					s.lnm[j] += math.Log(alkOld / alkNew)
				}
			}
		}
	}
	var iOld, iNew float64
	for k, j := range s.vars {
		var ratio float64
		switch s.rows[k] {
		case rowMass:
			if s.prevTotals[j] > 0 && p.totals[j] > 0 {
				ratio = p.totals[j] / s.prevTotals[j]
			}
			z := s.m.species[j].act.z
			iOld += z * z * s.prevTotals[j]
			iNew += z * z * p.totals[j]
		case rowAlk:
			if j != 0 && s.prevAlk > 0 && p.alk > 0 {
				ratio = p.alk / s.prevAlk
			}
		}
		if ratio > 0 && ratio != 1 {
			s.lnm[j] += math.Log(ratio)
		}
	}
	if iOld > 0 && iNew > 0 {
		s.lnI += math.Log(iNew / iOld)
	}
}

// sameMasters reports whether two lists of unknown masters agree but for
// H[+] (index 0, which is first when present): a water solved at its
// measured pH is a good start for the same water at another temperature.
func sameMasters(a, b []int) bool {
	if len(a) > 0 && a[0] == 0 {
		a = a[1:]
	}
	if len(b) > 0 && b[0] == 0 {
		b = b[1:]
	}
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// initialGuess starts from free molalities equal to the totals divided by
// their acid–base forms (the species made of one master, H[+] and H2O) at a
// starting pH: the given one, or where the H[+] equation (charge balance or
// alkalinity) changes sign, found by bisection. A few ratio iterations
// (m_j ← m_j·T_j/Σν_sj m_s) then tame strong complexation before
// Newton–Raphson.
func (s *solver) initialGuess() {
	m, p := s.m, &s.p
	for i := range s.lng {
		s.lng[i], s.dlng[i] = 0, 0
	}
	s.lnaw = 0
	if s.pz != nil {
		s.pz.reset() // Pitzer: start from the Debye–Hückel term
	}
	var I2 float64
	for _, j := range s.vars {
		if j != 0 {
			z := m.species[j].act.z
			I2 += z * z * p.totals[j]
		}
	}
	s.lnI = math.Log(math.Max(I2/2, 1e-7))
	s.acidBase()
	lnaH := p.lnaH
	if p.hRow != rowFixed {
		lnaH = s.guessPH()
	}
	s.mastersAt(lnaH)
	for pass := 0; pass < 2; pass++ {
		s.evaluate(false)
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
		var I2 float64
		for i := range m.species {
			if s.live[i] {
				z := m.species[i].act.z
				I2 += z * z * s.ms[i]
			}
		}
		s.lnI = math.Log(math.Max(I2/2, 1e-12))
		if s.pitzerActive() {
			s.pitzerRefresh() // Pitzer: coefficients of the improved start
		}
		s.updateWater()
	}
}

// acidBase lists, for each unknown master, the live species made of that
// master (coefficient 1), H[+] and H2O: its acid–base forms.
func (s *solver) acidBase() {
	if s.abValid && slices.Equal(s.abVars, s.vars) {
		return // the same unknowns, so the same live species
	}
	s.abVars = append(s.abVars[:0], s.vars...)
	s.abValid = true
	m := s.m
	s.abStart = s.abStart[:0]
	s.abSpecies = s.abSpecies[:0]
	s.abNuH = s.abNuH[:0]
	for _, j := range s.vars {
		s.abStart = append(s.abStart, len(s.abSpecies))
		if j == 0 {
			continue
		}
		for i := s.nm; i < s.ns; i++ {
			if !s.live[i] {
				continue
			}
			var coefJ, nuH float64
			only := true
			for _, nt := range m.species[i].nu {
				switch nt.j {
				case j:
					coefJ = nt.coef
				case 0:
					nuH = nt.coef
				default:
					only = false
				}
			}
			if only && coefJ == 1 {
				s.abSpecies = append(s.abSpecies, i)
				s.abNuH = append(s.abNuH, nuH)
			}
		}
	}
	s.abStart = append(s.abStart, len(s.abSpecies))
}

// mastersAt sets ln m(H[+]) = lnaH and every other unknown master from its
// equation with only acid–base forms present (activity coefficients 1).
func (s *solver) mastersAt(lnaH float64) {
	m, p := s.m, &s.p
	s.lnm[0] = lnaH
	for k, j := range s.vars {
		if j == 0 {
			continue
		}
		denom, alkPer := 1.0, m.species[j].alk
		for q := s.abStart[k]; q < s.abStart[k+1]; q++ {
			i := s.abSpecies[q]
			x := math.Exp(math.Min(s.lnK[i]+s.abNuH[q]*lnaH, 300))
			denom += x
			alkPer += m.species[i].alk * x
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
}

// guessPH returns the ln a(H+) where the H[+] equation (charge balance or
// alkalinity) changes sign with every master at its acid–base guess,
// found by bisection over pH −1 to 15.
func (s *solver) guessPH() float64 {
	f := func(lnaH float64) float64 {
		s.mastersAt(lnaH)
		s.evaluate(false)
		if s.rows[0] == rowAlk {
			return -s.resid[0] // alkalinity falls as H+ rises
		}
		return s.resid[0]
	}
	lo, hi := -15*math.Ln10, 1*math.Ln10 // f rises from lo to hi
	flo, fhi := f(lo), f(hi)
	switch {
	case flo >= 0:
		return lo
	case fhi <= 0:
		return hi
	}
	for i := 0; i < 16; i++ {
		mid := (lo + hi) / 2
		if f(mid) > 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	return (lo + hi) / 2
}

// lnMax caps ln m of any species, so that a wild Newton step cannot
// overflow.
const lnMax = 30

// updateWater sets ln a_w from the current species.
func (s *solver) updateWater() {
	var sum float64
	for i := range s.m.species {
		if s.live[i] {
			sum += s.ms[i]
		}
	}
	if s.pitzerActive() {
		s.lnaw = -s.pz.phi * waterMolarMass * sum // Pitzer: ln a_w = −φ·M_w·Σm
		return
	}
	s.lnaw = math.Log(waterActivity(sum))
}

// evaluate computes activity coefficients at I = exp(lnI), the molality of
// every live species, and the scaled residuals in s.resid; with jac it also
// fills the Jacobian s.jacobian (row-major, n×n; unknowns ln m of s.vars, then
// ln I, then ln a_w). It returns the largest absolute scaled residual and
// the sum of squares.
func (s *solver) evaluate(jac bool) (maxAbs, sumSq float64) {
	n := len(s.vars) + 2 + len(s.eq)
	I := math.Exp(s.lnI)
	pitzer := s.setActivity(I)
	R := s.resid[:n]
	for k := range R {
		R[k] = 0
	}
	var J []float64
	if jac {
		J = s.jacobian[:n*n]
		for k := range J {
			J[k] = 0
		}
	}
	// Column of each master's unknown, −1 if none.
	var colBuf [maxUnknowns]int
	col := colBuf[:s.nm]
	for j := range col {
		col[j] = -1
	}
	for l, j := range s.vars {
		col[j] = l
	}
	var sums speciesSums
	s.speciesRows(R, J, col, I, &sums)
	if len(s.eq) > 0 {
		s.equilibriumRows(R, J, col, I)
	}
	s.componentRows(R, J, col, I)
	s.closureRows(R, J, I, pitzer, &sums)
	return s.scaleRows(R, J)
}

// setActivity sets ln γ and d ln γ/dI of every live species at ionic
// strength I (and ln m of H+ when pH is fixed); it reports whether the
// Pitzer model set is active.
func (s *solver) setActivity(I float64) (pitzer bool) {
	m, p := s.m, &s.p
	sqrtI := math.Sqrt(I)
	clg, cdlg := s.clg, s.cdlg
	classModel := p.model
	pitzer = s.pitzerActive()
	if pitzer {
		// Species outside the Pitzer parameter set keep ion-association γ.
		classModel = TruesdellJones
	}
	for k := range m.classes {
		lg, dlg := logGammaDeriv(classModel, &m.classes[k], s.dh, I, sqrtI)
		clg[k], cdlg[k] = math.Ln10*lg, math.Ln10*dlg
	}
	for i := range m.species {
		if s.live[i] {
			c := m.species[i].class
			s.lng[i], s.dlng[i] = clg[c], cdlg[c]
		}
	}
	if pitzer {
		s.pitzerApply(I)
	}
	if p.hRow == rowFixed {
		s.lnm[0] = p.lnaH - s.lng[0]
	}
	return pitzer
}

// speciesSums are the sums over species for the ionic-strength and water
// rows, I2 = Σz²m and S = Σm, and their derivatives by each unknown.
type speciesSums struct {
	I2, S   float64
	dI2, dS [maxUnknowns]float64
}

// speciesRows computes the molality of every live species and adds it to
// the mass-balance, alkalinity and charge rows of R and to sums; with J
// non-nil, their derivatives too.
func (s *solver) speciesRows(R, J []float64, col []int, I float64, sums *speciesSums) {
	m := s.m
	hFixed := s.p.hRow == rowFixed
	n := len(R)
	cI, cW := len(s.vars), len(s.vars)+1
	for i := range m.species {
		if !s.live[i] {
			continue
		}
		sp := &m.species[i]
		// ln m_s and D = d ln m_s / dI.
		var lnms, D float64
		if sp.master >= 0 {
			lnms = s.lnm[sp.master]
			if sp.master == 0 && hFixed {
				D = -s.dlng[0]
			}
		} else {
			lnms = s.lnK[i] + sp.nuW*s.lnaw - s.lng[i]
			D = -s.dlng[i]
			for _, nt := range sp.nu {
				lnms += nt.coef * (s.lnm[nt.j] + s.lng[nt.j])
				if !(nt.j == 0 && hFixed) {
					D += nt.coef * s.dlng[nt.j]
				}
			}
		}
		ms := math.Exp(math.Min(lnms, lnMax))
		s.ms[i] = ms
		z := sp.act.z
		for _, nt := range sp.nu {
			if r := s.rowOf[nt.j]; r >= 0 {
				R[r] += nt.coef * ms
			}
		}
		if s.alkRow >= 0 {
			R[s.alkRow] += sp.alk * ms
		}
		if s.chgRow >= 0 {
			R[s.chgRow] += z * ms
		}
		sums.I2 += z * z * ms
		sums.S += ms
		if J == nil {
			continue
		}
		// ∂m_s/∂ln m_l = m_s·ν_sl, ∂m_s/∂ln I = m_s·D·I, ∂m_s/∂ln a_w = m_s·ν_sW.
		dmI, dmW := ms*D*I, ms*sp.nuW
		add := func(row []float64, w float64) {
			for _, nt := range sp.nu {
				if l := col[nt.j]; l >= 0 {
					row[l] += w * ms * nt.coef
				}
			}
			row[cI] += w * dmI
			row[cW] += w * dmW
		}
		for _, nt := range sp.nu {
			if r := s.rowOf[nt.j]; r >= 0 {
				add(J[r*n:(r+1)*n], nt.coef)
			}
		}
		if s.alkRow >= 0 && sp.alk != 0 {
			add(J[s.alkRow*n:(s.alkRow+1)*n], sp.alk)
		}
		if s.chgRow >= 0 && z != 0 {
			add(J[s.chgRow*n:(s.chgRow+1)*n], z)
		}
		if z != 0 {
			add(sums.dI2[:n], z*z)
		}
		add(sums.dS[:n], 1)
	}
}

// componentRows finishes the rows of the components: subtracts the totals
// and alkalinity, computes the gas row, and sets each row's scale.
func (s *solver) componentRows(R, J []float64, col []int, I float64) {
	m, p := s.m, &s.p
	hFixed := p.hRow == rowFixed
	n := len(R)
	cI, cW := len(s.vars), len(s.vars)+1
	for k, j := range s.vars {
		var sc float64
		switch s.rows[k] {
		case rowMass:
			R[k] -= p.totals[j]
			sc = p.totals[j]
		case rowAlk:
			R[k] -= p.alk
			sc = s.fixedScale
		case rowCharge:
			sc = s.fixedScale
		case rowGas:
			g := &m.gases[p.gas]
			v := g.nuW*s.lnaw - math.Ln10*(evalLogK(g.logK, p.t)+p.logP)
			var dv float64
			for _, nt := range g.nu {
				v += nt.coef * (s.lnm[nt.j] + s.lng[nt.j])
				if !(nt.j == 0 && hFixed) {
					dv += nt.coef * s.dlng[nt.j]
				}
				if J != nil {
					if l := col[nt.j]; l >= 0 {
						J[k*n+l] += nt.coef
					}
				}
			}
			if J != nil {
				J[k*n+cI] += dv * I
				J[k*n+cW] += g.nuW
			}
			R[k] = v
			sc = 1
		}
		if sc == 0 {
			sc = 1
		}
		s.scale[k] = sc
	}
}

// closureRows sets the ionic-strength row, ln(½Σz²m) − ln I = 0, and the
// water row, ln a_w − ln(1 − 0.017 Σm) = 0 (see waterActivity); under
// Pitzer ln a_w + φ·M_w·Σm = 0 with φ of the last refresh.
func (s *solver) closureRows(R, J []float64, I float64, pitzer bool, sums *speciesSums) {
	n := len(R)
	cI, cW := len(s.vars), len(s.vars)+1
	R[cI] = math.Log(sums.I2/2) - s.lnI
	s.scale[cI] = 1
	awCalc := waterActivity(sums.S)
	R[cW] = s.lnaw - math.Log(awCalc)
	if pitzer {
		R[cW] = s.lnaw + s.pz.phi*waterMolarMass*sums.S
	}
	s.scale[cW] = 1
	if J == nil {
		return
	}
	row := J[cI*n : (cI+1)*n]
	for l := 0; l < n; l++ {
		row[l] = sums.dI2[l] / sums.I2
	}
	row[cI]--
	row = J[cW*n : (cW+1)*n]
	c := 0.0
	if awCalc > waterActivityFloor {
		c = waterActivitySlope / awCalc
	}
	if pitzer {
		c = s.pz.phi * waterMolarMass
	}
	for l := 0; l < n; l++ {
		row[l] = c * sums.dS[l]
	}
	row[cW]++
}

// scaleRows divides each row of R (and J) by its scale and returns the
// largest absolute scaled residual and the sum of squares.
func (s *solver) scaleRows(R, J []float64) (maxAbs, sumSq float64) {
	n := len(R)
	for k := 0; k < n; k++ {
		inv := 1 / s.scale[k]
		R[k] *= inv
		if J != nil {
			row := J[k*n : (k+1)*n]
			for l := range row {
				row[l] *= inv
			}
		}
		maxAbs = math.Max(maxAbs, math.Abs(R[k]))
		sumSq += R[k] * R[k]
	}
	return maxAbs, sumSq
}

// newton runs Newton–Raphson with a step limit and a non-monotone
// backtracking line search until the scaled residuals have converged.
func (s *solver) newton() error {
	nb := len(s.vars) + 2 // unknowns of the speciation; then the amounts of eq
	n := nb + len(s.eq)
	cI, cW := nb-2, nb-1
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
	}
	maxAbs, _ := s.evaluate(false)
	return fmt.Errorf("%w after %d iterations (largest relative residual %.2g)", ErrNoConvergence, limit, maxAbs)
}
