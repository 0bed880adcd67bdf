package saturation

// The solver's starting points: a warm start rescaled to a new water, or a
// cold guess from the totals.

import (
	"math"
	"slices"
)

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
