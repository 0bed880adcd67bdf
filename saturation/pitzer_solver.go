package saturation

// The Pitzer model set in the speciation solver: lagged coefficients and
// the warnings of a solution.

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"scalerisk/water"
)

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
	var out []string
	only25, held := s.pitzerFlagged(t)
	if len(only25) > 0 {
		out = append(out, fmt.Sprintf("Pitzer parameters known at 25 °C only, used unchanged at %.4g °C (largest effect first): %s", t, listFlagged(only25)))
	}
	if len(held) > 0 {
		out = append(out, fmt.Sprintf("Pitzer parameters outside their fitted temperature range at %.4g °C, held at the range limit: %s", t, listFlagged(held)))
	}
	if w := s.pitzerCoverageWarning(); w != "" {
		out = append(out, w)
	}
	if w := s.caSO4HotBrineNote(t); w != "" {
		out = append(out, w)
	}
	return out
}

// pzFlagged is a Pitzer parameter used away from the temperatures it is
// known at, with its estimated effect on ln γ.
type pzFlagged struct {
	label string
	size  float64
}

// pitzerFlagged lists the parameters of the solution just solved whose
// unknown temperature change moves ln γ of a significant species by more
// than pitzerSignificant at t (°C): only25 are known at 25 °C only and used
// more than 5 K away; held have a fitted range that t is outside of.
func (s *solver) pitzerFlagged(t float64) (only25, held []pzFlagged) {
	ps := s.pz
	set := ps.set
	sig := make([]bool, len(set.ionSpecies))
	for p, i := range set.ionSpecies {
		ps.m[p] = 0
		if s.live[i] {
			ps.m[p] = s.ms[i]
		}
		sig[p] = s.significantSpecies(i)
	}
	I := math.Exp(s.lnI)
	for _, tm := range set.terms {
		p := tm.p
		constant := !p.hasT && math.Abs(t-25) > 5
		outside := p.hasT && (t < p.tMin-1e-9 || t > p.tMax+1e-9)
		if !constant && !outside {
			continue
		}
		// What matters is the unknown change since 25 °C (or beyond the
		// fitted range), not the whole term: a typical share per kelvin.
		away := math.Abs(t - 25)
		if outside {
			away = math.Max(p.tMin-t, t-p.tMax)
		}
		size := ps.contribution(tm, I, sig) * math.Min(1, pitzerTypicalDrift*away)
		if size <= pitzerSignificant {
			continue
		}
		if constant {
			only25 = append(only25, pzFlagged{p.label(), size})
		} else {
			held = append(held, pzFlagged{fmt.Sprintf("%s (%g–%g °C)", p.label(), p.tMin, p.tMax), size})
		}
	}
	return only25, held
}

// listFlagged names the parameters that move ln γ most first (ties by
// label), at most six, and counts the rest. It sorts xs in place.
func listFlagged(xs []pzFlagged) string {
	slices.SortStableFunc(xs, func(a, b pzFlagged) int {
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

// pitzerCoverageWarning warns when more than pitzerCoverage of the ionic
// strength is carried by components outside the Pitzer parameter set
// (they keep ion-association activity coefficients); "" otherwise.
func (s *solver) pitzerCoverageWarning() string {
	set := s.pz.set
	share := outsideShare(func(c water.Component) float64 {
		if c == water.C && s.p.cRow == rowAbsent {
			return 0
		}
		return s.p.totals[set.model.compMaster[c]]
	}, set.fallback)
	if !(share > pitzerCoverage) {
		return ""
	}
	var outside []string
	for _, c := range set.fallback {
		if s.p.totals[set.model.compMaster[c]] > 0 || (c == water.C && s.p.cRow != rowAbsent) {
			outside = append(outside, c.String())
		}
	}
	return fmt.Sprintf("%.0f %% of the ionic strength is carried by components outside the Pitzer parameter set (%s), which keep ion-association (Truesdell–Jones) activity coefficients: saturation indices are less certain than for a water of the major ions",
		100*share, strings.Join(outside, ", "))
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
