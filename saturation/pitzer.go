package saturation

// The Pitzer model set: the specific-interaction activity model for brines
// and the species it is used with.
//
// References:
//
//	Pitzer, K.S. (1973) J. Phys. Chem. 77:268; Pitzer, K.S. (1991) Activity
//	  Coefficients in Electrolyte Solutions, 2nd ed., ch. 3 (equations).
//	Harvie, C.E., Møller, N. and Weare, J.H. (1984) GCA 48:723 ("HMW84": the
//	  form of the equations, the 25 °C parameter set and its species).
//	Pitzer, K.S. (1975) J. Solution Chem. 4:249 (the unsymmetrical mixing
//	  terms ^Eθ and the function J(x)).
//	Møller, N. (1988) GCA 52:821 (A_φ(T) and temperature functions);
//	  Greenberg, J.P. and Møller, N. (1989) GCA 53:2503.
//
// The parameters are in data/pitzer.csv; its header comments explain the
// choices (one 25 °C set, published temperature functions anchored to it,
// which ion pairs are left out and why).

import (
	"math"
	"sync"
)

// pitzerB is the b of the Debye–Hückel term of the Pitzer equations,
// kg^½ mol^−½ (HMW84).
const pitzerB = 1.2

// waterMolarMass is M_w of ln a_w = −φ·M_w·Σm, kg/mol.
const waterMolarMass = 0.0180153

// Pitzer α of B = β0 + β1 g(α1√I) + β2 g(α2√I), kg^½ mol^−½ (HMW84): α1 is
// 2 for any pair with a singly charged ion and 1.4 for 2-2 (and higher)
// pairs; α2 is 12.
const (
	pitzerAlpha1     = 2.0
	pitzerAlpha1High = 1.4
	pitzerAlpha2     = 12.0
)

// pitzerTolerance is the largest change of any ln γ (or of φ) between two
// iterations at which the lagged Pitzer coefficients count as converged.
const pitzerTolerance = 1e-11

// pitzerSignificant is the change of ln γ above which a parameter is taken
// to matter: a parameter known at 25 °C only, or held at the end of its
// range, is named in a warning when its unknown change with temperature
// (pitzerTypicalDrift) may move some ln γ by more than this.
const pitzerSignificant = 0.01

// pitzerTypicalDrift is the relative change per kelvin assumed for a
// parameter known at 25 °C only (or used beyond its fitted range), when
// judging whether its unknown
// temperature dependence matters: about 1 %/K, within the 0.2–2 %/K of the
// β1 and β2 derivatives of Silvester & Pitzer (1979) (Pitzer 1991 ch. 3
// Tables 12–13; thermo.md §6.3 [READ]) — the binary β0 and Cφ, small
// themselves, change faster relatively but move ln γ little. So a term
// that moves ln γ by 0.2 is named 5 K away from 25 °C, one of 0.02 at
// 50 K. A judgement, not a published rule.
const pitzerTypicalDrift = 0.01

// pzBinVals are the binary parameters of one pair at one temperature.
type pzBinVals struct {
	b0, b1, b2, c float64
}

// pitzerState evaluates the Pitzer equations for one pitzerSet: parameter
// values at the current temperature and the work arrays of one evaluation.
// It also holds, for the solver, the lagged coefficients of the last
// refresh. Not safe for concurrent use.
type pitzerState struct {
	set    *pitzerSet
	t      float64
	tSet   bool
	aphi   float64
	bin    []pzBinVals
	theta  []float64 // per pair
	psi    []float64 // per triple
	lambda []float64 // per λ
	// per α: g(α√I), g'(α√I), exp(−α√I) of the current evaluation
	g, gp, ex []float64
	eth       [5][5]ethetaValue
	m         []float64 // molality per position
	lng       []float64 // ln γ per position
	// lag is, per position, ln γ − z²·f^γ(I) at the last refresh: the part of
	// ln γ held fixed during a Newton step; phi the osmotic coefficient.
	lag []float64
	phi float64
}

type ethetaValue struct {
	v, vp float64
	ok    bool
}

func newPitzerState(set *pitzerSet) *pitzerState {
	n := len(set.ionSpecies)
	na := len(set.alphas)
	return &pitzerState{set: set, bin: make([]pzBinVals, len(set.binaries)), theta: make([]float64, len(set.pairs)),
		psi: make([]float64, len(set.triples)), lambda: make([]float64, len(set.lambdas)),
		g: make([]float64, na), gp: make([]float64, na), ex: make([]float64, na),
		m: make([]float64, n), lng: make([]float64, n), lag: make([]float64, n), phi: 1}
}

// setTemperature evaluates every parameter at t °C.
func (ps *pitzerState) setTemperature(t float64) {
	if ps.tSet && ps.t == t {
		return
	}
	set := ps.set
	val := func(p *pitzerParam) float64 {
		if p == nil {
			return 0
		}
		return p.at(t)
	}
	ps.aphi = set.aphi.at(t)
	for k := range set.binaries {
		b := &set.binaries[k]
		ps.bin[k] = pzBinVals{b0: val(b.b0), b1: val(b.b1), b2: val(b.b2), c: val(b.cp) * b.cScale}
	}
	for k := range set.pairs {
		ps.theta[k] = val(set.pairs[k].theta)
	}
	for k := range set.triples {
		ps.psi[k] = val(set.triples[k].psi)
	}
	for k := range set.lambdas {
		ps.lambda[k] = val(set.lambdas[k].lam)
	}
	ps.t, ps.tSet = t, true
}

// reset forgets the lagged coefficients: ln γ starts at its Debye–Hückel
// term and φ at 1.
func (ps *pitzerState) reset() {
	for k := range ps.lag {
		ps.lag[k] = 0
	}
	ps.phi = 1
}

// debyeHuckel returns the Debye–Hückel term of the Pitzer equations,
// f^γ = −A_φ[√I/(1+b√I) + (2/b) ln(1+b√I)], and its derivative with respect
// to I, kg/mol.
func (ps *pitzerState) debyeHuckel(I float64) (f, df float64) {
	I = math.Max(I, 1e-20)
	s := math.Sqrt(I)
	d := 1 + pitzerB*s
	f = -ps.aphi * (s/d + 2/pitzerB*math.Log(d))
	df = -ps.aphi * (3 + 2*pitzerB*s) / (2 * s * d * d)
	return f, df
}

// pitzerG returns g(x) = 2[1 − (1+x)e^−x]/x² and g'(x) = −2[1 − (1+x+x²/2)e^−x]/x²
// (series below x = 0.01, where the closed forms lose digits).
func pitzerG(x float64) (g, gp float64) {
	if x < 0.01 {
		g = 1 - 2*x/3 + x*x/4 - x*x*x/15 + x*x*x*x/72
		gp = -x/3 + x*x/4 - x*x*x/10 + x*x*x*x/36
		return g, gp
	}
	e := math.Exp(-x)
	x2 := x * x
	g = 2 * (1 - (1+x)*e) / x2
	gp = -2 * (1 - (1+x+x2/2)*e) / x2
	return g, gp
}

// pitzerJ returns J(x) and J'(x) of the unsymmetrical mixing terms, x ≥ 0:
//
//	J(x) = (1/x) ∫₀^∞ [1 + q + q²/2 − e^q] y² dy,  q = −(x/y)·e^−y
//
// interpolated (cubic Hermite in ln x) in a table computed once from the
// integral itself (jTable). Below the table J falls as x², beyond it J is
// extended along its tangent (J' tends to ¼). J(0) = 0.
//
// References: Pitzer, K.S. (1975) J. Solution Chem. 4:249 (definition).
// HMW84 used Harvie's Chebyshev approximation; Pitzer's (1975) four-constant
// approximation is about 1 % off at x = 1–5 (see the tests), which moves
// ln γ of Ca²⁺ in 3–6 mol/kg NaCl by about 0.005, so the integral is used.
func pitzerJ(x float64) (J, Jp float64) {
	if x <= 0 {
		return 0, 0
	}
	tab := pitzerJTable()
	u := math.Log(x)
	last := len(tab.J) - 1
	switch {
	case u <= tab.u0:
		r := x / math.Exp(tab.u0)
		J = tab.J[0] * r * r
		return J, 2 * J / x
	case u >= tab.u0+float64(last)*tab.du:
		xm := math.Exp(tab.u0 + float64(last)*tab.du)
		Jp = tab.dJ[last] / xm
		return tab.J[last] + Jp*(x-xm), Jp
	}
	f := (u - tab.u0) / tab.du
	k := int(f)
	t := f - float64(k)
	t2, t3 := t*t, t*t*t
	h00, h10, h01, h11 := 2*t3-3*t2+1, t3-2*t2+t, -2*t3+3*t2, t3-t2
	J = h00*tab.J[k] + h10*tab.du*tab.dJ[k] + h01*tab.J[k+1] + h11*tab.du*tab.dJ[k+1]
	d00, d10, d01, d11 := 6*t2-6*t, 3*t2-4*t+1, -6*t2+6*t, 3*t2-2*t
	dJdu := (d00*tab.J[k]+d01*tab.J[k+1])/tab.du + d10*tab.dJ[k] + d11*tab.dJ[k+1]
	return J, dJdu / x
}

// jTable holds J and dJ/du (u = ln x) on an even grid of u.
type jTable struct {
	u0, du float64
	J, dJ  []float64
}

// pitzerJTable is J(x) for x from 1e−6 to 1e3 at steps of 0.1 in ln x,
// computed once (about 7 ms) from the defining integral by jIntegral.
var pitzerJTable = sync.OnceValue(func() *jTable {
	const lo, hi, du = 1e-6, 1e3, 0.1
	u0 := math.Log(lo)
	n := int(math.Ceil((math.Log(hi)-u0)/du)) + 1
	tab := &jTable{u0: u0, du: du, J: make([]float64, n), dJ: make([]float64, n)}
	for k := range n {
		tab.J[k], tab.dJ[k] = jIntegral(math.Exp(u0+float64(k)*du), 500)
	}
	return tab
})

// jIntegral returns J(x) and dJ/d ln x = x·J'(x) from the defining
// integral, by Simpson's rule on n intervals in s = ln y from y = 10⁻⁶·min(x,1)
// to 40 (below, the integrand is x²/2; beyond, negligible). With
// K(x) = x·J(x), K'(x) = ∫ [x e^−2y + y e^−y (e^q − 1)] dy and
// x·J' = K' − J. Converges to about 1e−12 relative at n = 500.
func jIntegral(x float64, n int) (J, dJdu float64) {
	ylo := 1e-6 * math.Min(x, 1)
	slo, shi := math.Log(ylo), math.Log(40.0)
	h := (shi - slo) / float64(n)
	var K, Kp float64
	for i := 0; i <= n; i++ {
		y := math.Exp(slo + float64(i)*h)
		w := 2.0
		switch {
		case i == 0 || i == n:
			w = 1
		case i%2 == 1:
			w = 4
		}
		ey := math.Exp(-y)
		q := -x * ey / y
		// 1 + q + q²/2 − e^q, by its series where it cancels.
		var hq float64
		if math.Abs(q) < 0.05 {
			hq = -q * q * q * (1.0/6 + q*(1.0/24+q*(1.0/120+q/720)))
		} else {
			hq = 1 + q + q*q/2 - math.Exp(q)
		}
		K += w * y * y * hq * y
		Kp += w * (x*ey*ey + y*ey*math.Expm1(q)) * y
	}
	K = K*h/3 + x*x*ylo/2
	Kp = Kp*h/3 + x*ylo
	J = K / x
	return J, Kp - J
}

// etheta returns ^Eθ and ^Eθ' of two like-charged ions of charges |zi|,
// |zj| at ionic strength I, cached for one evaluation.
//
//	^Eθ  = (zi zj/4I)[J(x_ij) − ½J(x_ii) − ½J(x_jj)],  x_ij = 6 zi zj A_φ √I
//	^Eθ' = −^Eθ/I + (zi zj/8I²)[x_ij J'(x_ij) − ½x_ii J'(x_ii) − ½x_jj J'(x_jj)]
func (ps *pitzerState) etheta(zi, zj int, I, sqrtI float64) (float64, float64) {
	if zi < len(ps.eth) && zj < len(ps.eth) && ps.eth[zi][zj].ok {
		c := ps.eth[zi][zj]
		return c.v, c.vp
	}
	fi, fj := float64(zi), float64(zj)
	base := 6 * ps.aphi * sqrtI
	xij, xii, xjj := base*fi*fj, base*fi*fi, base*fj*fj
	Jij, Jpij := pitzerJ(xij)
	Jii, Jpii := pitzerJ(xii)
	Jjj, Jpjj := pitzerJ(xjj)
	zz := fi * fj
	v := zz / (4 * I) * (Jij - Jii/2 - Jjj/2)
	vp := -v/I + zz/(8*I*I)*(xij*Jpij-xii*Jpii/2-xjj*Jpjj/2)
	if zi < len(ps.eth) && zj < len(ps.eth) {
		ps.eth[zi][zj] = ethetaValue{v: v, vp: vp, ok: true}
	}
	return v, vp
}

// gammas evaluates the Pitzer equations at the molalities ps.m of the
// positions, with ionic strength I, Z = Σ|z|m and S = Σm over all solute
// species (mol/kg), into ps.lng (ln γ per position); it returns the osmotic
// coefficient φ. Below I = 1e-30 every ln γ is 0 and φ is 1.
//
//	F      = f^γ + ΣcΣa m_c m_a B'_ca + Σ m_i m_j Φ'_ij (like-charged pairs)
//	ln γ_M = z²F + Σa m_a(2B_Ma + Z C_Ma) + Σc m_c(2Φ_Mc + Σa m_a ψ_Mca)
//	         + Σa<a' m_a m_a' ψ_Maa' + |z_M| ΣcΣa m_c m_a C_ca + 2Σn m_n λ_nM
//	ln γ_N = 2Σi m_i λ_Ni
//	φ − 1  = (2/S)[−A_φ I^{3/2}/(1+b√I) + ΣcΣa m_c m_a(B^φ_ca + Z C_ca)
//	         + Σ m_i m_j(Φ^φ_ij + Σk m_k ψ_ijk) + Σ m_n m_i λ_ni]
//
// with B = β0 + β1 g(α1√I) + β2 g(α2√I), B' = [β1 g'(α1√I) + β2 g'(α2√I)]/I,
// B^φ = β0 + β1 e^(−α1√I) + β2 e^(−α2√I), C = Cφ/(2√|z_M z_X|), Φ = θ + ^Eθ,
// Φ' = ^Eθ', Φ^φ = θ + ^Eθ + I·^Eθ'.
//
// References: Harvie, Møller & Weare (1984) GCA 48:723, eqs. 1–8; Pitzer
// (1991) ch. 3.
func (ps *pitzerState) gammas(I, Z, S float64) float64 {
	set := ps.set
	m, lng := ps.m, ps.lng
	for k := range lng {
		lng[k] = 0
	}
	if !(I > 1e-30) || !(S > 0) {
		return 1
	}
	sqrtI := math.Sqrt(I)
	for zi := range ps.eth {
		for zj := range ps.eth[zi] {
			ps.eth[zi][zj].ok = false
		}
	}
	for k, a := range set.alphas {
		x := a * sqrtI
		ps.g[k], ps.gp[k] = pitzerG(x)
		ps.ex[k] = math.Exp(-x)
	}
	d := 1 + pitzerB*sqrtI
	F := -ps.aphi * (sqrtI/d + 2/pitzerB*math.Log(d))
	phiSum := -ps.aphi * I * sqrtI / d
	var cSum float64
	for k := range set.binaries {
		b := &set.binaries[k]
		v := &ps.bin[k]
		mc, ma := m[b.c], m[b.a]
		B := v.b0 + v.b1*ps.g[b.ia1] + v.b2*ps.g[b.ia2]
		Bp := (v.b1*ps.gp[b.ia1] + v.b2*ps.gp[b.ia2]) / I
		Bphi := v.b0 + v.b1*ps.ex[b.ia1] + v.b2*ps.ex[b.ia2]
		w := 2*B + Z*v.c
		lng[b.c] += ma * w
		lng[b.a] += mc * w
		mm := mc * ma
		F += mm * Bp
		cSum += mm * v.c
		phiSum += mm * (Bphi + Z*v.c)
	}
	for k := range set.pairs {
		pr := &set.pairs[k]
		var eth, ethp float64
		if pr.unsym {
			eth, ethp = ps.etheta(pr.zi, pr.zj, I, sqrtI)
		}
		mi, mj := m[pr.i], m[pr.j]
		phi := ps.theta[k] + eth
		lng[pr.i] += 2 * mj * phi
		lng[pr.j] += 2 * mi * phi
		F += mi * mj * ethp
		phiSum += mi * mj * (phi + I*ethp)
	}
	for k := range set.triples {
		tr := &set.triples[k]
		psi := ps.psi[k]
		mi, mj, mk := m[tr.i], m[tr.j], m[tr.k]
		lng[tr.i] += mj * mk * psi
		lng[tr.j] += mi * mk * psi
		lng[tr.k] += mi * mj * psi
		phiSum += mi * mj * mk * psi
	}
	for k := range set.lambdas {
		l := &set.lambdas[k]
		lam := ps.lambda[k]
		lng[l.i] += 2 * m[l.n] * lam
		lng[l.n] += 2 * m[l.i] * lam
		phiSum += m[l.n] * m[l.i] * lam
	}
	for p, z := range set.z {
		if z != 0 {
			lng[p] += z*z*F + math.Abs(z)*cSum
		}
	}
	return 1 + 2*phiSum/S
}
