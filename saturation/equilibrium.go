package saturation

// The solver's equilibrium solve: a speciation with some minerals held at
// saturation, the amounts removed being unknowns of the same Newton
// iteration. The searches of precipitation and the CCPP use it instead of a
// root search over whole speciations.

import (
	"errors"
	"fmt"
	"math"

	"scalerisk/water"
)

// eqMineral is one mineral an equilibrium solve holds at saturation.
type eqMineral struct {
	i    int     // index in the solver's model
	dAlk float64 // change of alkalinity, eq per mol of mineral removed
}

// eqTolerance is the largest scaled residual of a converged equilibrium
// solve: mass balances to 1e-9 of each total and saturation indices to
// 1e-9, which puts the amounts to about 1e-8 of themselves, far inside the
// four significant figures (and 0.1 mg/L of the CCPP) that are printed.
const eqTolerance = 1e-9

// eqPitzerTolerance is the largest change of the Pitzer activity
// coefficients' specific-interaction part (ln γ) between the last two
// refreshes of a converged equilibrium solve: 1e-9, in step with
// eqTolerance.
const eqPitzerTolerance = 1e-9

// errEquilibriumTooMany reports an equilibrium solve over more minerals than
// the solver holds room for.
var errEquilibriumTooMany = errors.New("too many minerals for one equilibrium solve")

// solveEquilibrium speciates problem p with minerals (indices in the
// solver's model) held at saturation, warm started from the last solution,
// and returns in x the amounts of them, mol/kg of water, that leave p's
// totals and alkalinity (x > 0 precipitates, x < 0 dissolves). Each mole
// removed lowers the total of every master of the mineral by its
// coefficient and the alkalinity by the mineral's alkalinity (2 for CaCO3,
// 0 for CaSO4); the saturation index of each mineral is one more equation,
//
//	SI_k = (ν_W,k·ln a_w + Σ_j ν_jk·ln a_j)/ln 10 − log K_k = 0,
//
// solved to eqTolerance with the speciation by one Newton iteration on the
// joint unknowns. The water is closed: p must fix H⁺ by alkalinity or charge
// balance. Afterwards the solver holds the water with x removed, so that
// the next solve starts from it.
func (s *solver) solveEquilibrium(p problem, minerals []int, x []float64) error {
	if len(minerals) > maxEquilibria {
		return errEquilibriumTooMany
	}
	s.growForEquilibria()
	s.eq = s.eq[:0]
	for _, i := range minerals {
		e := eqMineral{i: i}
		for _, nt := range s.m.minerals[i].nu {
			e.dAlk -= nt.coef * s.m.species[nt.j].alk
		}
		s.eq = append(s.eq, e)
	}
	s.tol = eqTolerance
	err := s.solve(p, true)
	copy(x, s.eqX[:len(s.eq)])
	if err == nil {
		// What the solution now holds, for the rescaling of the next start.
		for q, e := range s.eq {
			for _, nt := range s.m.minerals[e.i].nu {
				if nt.j != 0 {
					s.prevTotals[nt.j] -= x[q] * nt.coef
				}
			}
			s.prevAlk += x[q] * e.dAlk
		}
	}
	s.eq, s.tol = s.eq[:0], tolerance
	return err
}

// growForEquilibria makes the work arrays room for the amounts of an
// equilibrium solve, once per solver (an ordinary speciation never needs
// them).
func (s *solver) growForEquilibria() {
	n := s.nm + 2 + maxEquilibria
	if len(s.resid) >= n {
		return
	}
	s.scale, s.jacobian = make([]float64, n), make([]float64, n*n)
	s.resid, s.dx, s.save = make([]float64, n), make([]float64, n), make([]float64, n)
	s.ipiv = make([]int, n)
	s.eq, s.eqX = make([]eqMineral, 0, maxEquilibria), make([]float64, maxEquilibria)
}

// equilibriumRows adds to R (and J) what the amounts s.eqX of the minerals
// s.eq change in the mass-balance and alkalinity rows, and sets the row of
// each mineral's saturation index (unknown columns after ln a_w).
func (s *solver) equilibriumRows(R, J []float64, col []int, I float64) {
	n := len(R)
	cI, cW := len(s.vars), len(s.vars)+1
	base := len(s.vars) + 2
	hFixed := s.p.hRow == rowFixed
	for q, e := range s.eq {
		c := base + q
		x := s.eqX[q]
		mn := &s.m.minerals[e.i]
		for _, nt := range mn.nu {
			if r := s.rowOf[nt.j]; r >= 0 {
				R[r] += x * nt.coef
				if J != nil {
					J[r*n+c] += nt.coef
				}
			}
		}
		if s.alkRow >= 0 {
			R[s.alkRow] -= x * e.dAlk
			if J != nil {
				J[s.alkRow*n+c] -= e.dAlk
			}
		}
		v := mn.nuW * s.lnaw
		var dv float64
		for _, nt := range mn.nu {
			v += nt.coef * (s.lnm[nt.j] + s.lng[nt.j])
			if !(nt.j == 0 && hFixed) {
				dv += nt.coef * s.dlng[nt.j]
			}
			if J != nil {
				if l := col[nt.j]; l >= 0 {
					J[c*n+l] += nt.coef / math.Ln10
				}
			}
		}
		R[c] = v/math.Ln10 - s.mineralLogK[e.i]
		if J != nil {
			J[c*n+cI] += dv * I / math.Ln10
			J[c*n+cW] += mn.nuW / math.Ln10
		}
		s.scale[c] = 1
	}
}

// equilibriumStep returns the largest fraction of the step lambda·dx of
// the amounts that leaves every master's total above a tenth of what it is
// now: a Newton step cannot then take out more of a component than the
// water holds.
func (s *solver) equilibriumStep(dx []float64, lambda0 float64) float64 {
	lambda := 1.0
	for _, e := range s.eq {
		for _, nt := range s.m.minerals[e.i].nu {
			j := nt.j
			if s.rowOf[j] < 0 {
				continue
			}
			rem, drop := s.p.totals[j], 0.0
			for q, f := range s.eq {
				for _, mt := range s.m.minerals[f.i].nu {
					if mt.j == j {
						rem -= s.eqX[q] * mt.coef
						drop += lambda0 * dx[q] * mt.coef
					}
				}
			}
			if drop > 0.9*rem {
				lambda = math.Min(lambda, 0.9*math.Max(rem, 0)/drop)
			}
		}
	}
	return lambda
}

// mineralSI returns the saturation index of mineral i of the solver's model
// at the current solution, computed as collectMinerals does; false when one
// of its components is absent (or it is not finite).
func (s *solver) mineralSI(i int) (float64, bool) {
	m := s.m
	cj := m.compMaster[water.C]
	mn := &m.minerals[i]
	logaw := s.lnaw / math.Ln10
	iap := mn.nuW * logaw
	for _, nt := range mn.nu {
		if !s.live[nt.j] || (nt.j == cj && !(s.p.totals[cj] > 0)) {
			return 0, false
		}
		iap += nt.coef * ((s.lnm[nt.j] + s.lng[nt.j]) / math.Ln10)
	}
	si := iap - s.mineralLogK[i]
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return 0, false
	}
	return si, true
}

// errVanished is the error of a search whose mineral lost a component.
func errVanished(name string) error { return fmt.Errorf("%s vanished from the water", name) }
