package saturation

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"scalerisk/water"
)

// TestJacobianFD checks the analytic Jacobian of the solver (including the
// dependence of every activity coefficient on ionic strength) against
// forward finite differences, away from the solution, for two activity
// models and two ways of fixing H[+].
func TestJacobianFD(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	var a water.Analysis
	for i := 0; i <= 8; i++ {
		a = randomWater(rng)
	}
	sp := NewSpeciator(nil)
	s := sp.solver
	m := sp.model
	totals := make([]float64, len(m.masters))
	for c := range water.NumComponents {
		totals[m.compMaster[c]] = a.Totals[c]
	}
	for _, model := range []ActivityModel{Davies, TruesdellJones} {
		for _, hrow := range []rowKind{rowAlk, rowCharge} {
			p := problem{t: a.Temperature, model: model, totals: totals, hRow: hrow, cRow: rowMass, alk: 1e-3}
			s.p = p
			_ = s.solve(p, false)
			checkJacobianFD(t, s, fmt.Sprintf("%v %v", model, hrow))
		}
	}
}

// checkJacobianFD moves s away from its solution, then compares the analytic
// Jacobian of s.evaluate with forward finite differences in every unknown
// (the log molalities, ln I and ln a_w), to a relative 1e-4.
func checkJacobianFD(t *testing.T, s *solver, label string) {
	t.Helper()
	s.lnm[0] += 0.3
	s.lnI += 0.1
	s.lnaw -= 0.01
	n := len(s.vars) + 2
	s.evaluate(true)
	J := slices.Clone(s.jacobian[:n*n])
	R0 := slices.Clone(s.resid[:n])
	sc0 := slices.Clone(s.scale[:n])
	x := func(k int) *float64 {
		switch k {
		case n - 2:
			return &s.lnI
		case n - 1:
			return &s.lnaw
		}
		return &s.lnm[s.vars[k]]
	}
	for l := 0; l < n; l++ {
		h := 1e-7
		*x(l) += h
		s.evaluate(false)
		for k := 0; k < n; k++ {
			fd := (s.resid[k]*s.scale[k]/sc0[k] - R0[k]) / h
			if math.Abs(fd-J[k*n+l]) > 1e-4*(1+math.Abs(fd)) {
				t.Errorf("%s: J[%d][%d] = %g, fd %g (rows %v vars %v)", label, k, l, J[k*n+l], fd, s.rows, s.vars)
			}
		}
		*x(l) -= h
	}
}
