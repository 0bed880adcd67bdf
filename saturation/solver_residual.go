package saturation

// The solver's residuals and analytic Jacobian.

import (
	"math"
)

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
