package water

import (
	"fmt"
	"math"
)

// Practical Salinity Scale 1978 (PSS-78) at atmospheric pressure: the
// practical salinity of seawater from its conductivity ratio to standard
// seawater (S = 35) at the same temperature, with the temperature
// correction ΔS. Coefficients of UNESCO (1981, Tech. Pap. Mar. Sci. 37) and
// Lewis (1980, IEEE J. Oceanic Eng. OE-5:3), as printed in UNESCO (1983,
// Tech. Pap. Mar. Sci. 44, eqs. 1–3).
var (
	pss78A = [6]float64{0.0080, -0.1692, 25.3851, 14.0941, -7.0261, 2.7081}
	pss78B = [6]float64{0.0005, -0.0056, -0.0066, -0.0375, 0.0636, -0.0144}
	// pss78C gives r_t = C(35, t, 0)/C(35, 15, 0), t in °C.
	pss78C = [5]float64{0.6766097, 2.00564e-2, 1.104259e-4, -6.9698e-7, 1.0031e-9}
)

const (
	pss78K = 0.0162
	// pss78C35 is the conductivity of standard seawater, S = 35, at 15 °C
	// and atmospheric pressure: 42.914 mS/cm (UNESCO 1983), in µS/cm.
	pss78C35 = 42914.0
)

// PracticalSalinity returns the practical salinity (PSS-78, dimensionless)
// of a seawater of conductivity ec µS/cm at t °C and atmospheric pressure:
// R = ec/C(35, 15, 0), R_t = R/r_t(t), S = Σ a_i R_t^(i/2) + ΔS(t, R_t).
// The scale is defined for 2 ≤ S ≤ 42 and −2 to 35 °C; outside it the
// value is an extrapolation. Pressure terms are left out (a laboratory
// measures at about 1 atm). NaN for a negative or NaN ec.
//
// References: UNESCO (1981) Tech. Pap. Mar. Sci. 37; Lewis, E.L. (1980)
// IEEE J. Oceanic Eng. OE-5:3; UNESCO (1983) Tech. Pap. Mar. Sci. 44,
// eqs. 1–3 (the same coefficients).
func PracticalSalinity(ec, t float64) float64 {
	if !(ec >= 0) {
		return math.NaN()
	}
	rt := pss78C[0] + t*(pss78C[1]+t*(pss78C[2]+t*(pss78C[3]+t*pss78C[4])))
	x := math.Sqrt(ec / pss78C35 / rt)
	var s, ds float64
	for i := 5; i >= 0; i-- {
		s = s*x + pss78A[i]
		ds = ds*x + pss78B[i]
	}
	return s + (t-15)/(1+pss78K*(t-15))*ds
}

// Constants of the seawater rule.
const (
	// seawaterTDS is the dissolved solids, mg/L, above which a water whose
	// cations are mostly sodium and anions mostly chloride is taken as
	// seawater-like (brackish and saline waters; our rule, between
	// brackish water and seawater's 35 g/kg).
	seawaterTDS = 10000
	// seawaterNaShare and seawaterClShare are the least shares of Na in
	// the cation sum and Cl in the anion sum of a seawater-like water
	// (seawater: about 0.78 and 0.90; Millero et al. 2008 reference
	// composition, from memory).
	seawaterNaShare = 0.5
	seawaterClShare = 0.7
	// referenceSalinityRatio is S_R/S_P = 35.16504/35: the mass of sea salt
	// in g/kg per unit of practical salinity (Millero et al. 2008, Deep-Sea
	// Res. I 55:50, from memory).
	referenceSalinityRatio = 35.16504 / 35
)

// salinityCriterion is the check of a seawater-like water: practical
// salinity from the measured conductivity against that from the
// composition. Limit common practice.
var salinityCriterion = QualityCriterion{Name: "salinity-ec",
	Check:   "practical salinity from measured EC (PSS-78) / from the composition",
	Applies: "seawater-like water (dissolved solids above 10 g/L, mostly Na and Cl) with EC measured",
	Limit:   "0.95–1.05", Min: 0.95, Max: 1.05,
	Source: "UNESCO 1981 / Lewis 1980 (PSS-78); salinity from composition by Millero et al. 2008 (S_R = 35.16504/35 · S_P); limit common practice"}

// SalinityCriterion returns the criterion Quality applies to a
// seawater-like water in place of the fresh-water conductivity checks.
func SalinityCriterion() QualityCriterion { return salinityCriterion }

// seawaterLike reports whether a, with its ion sums in q, is a
// seawater-like water: dissolved solids (measured, else calculated) above
// seawaterTDS with Na and Cl dominant.
func (q *Quality) seawaterLike(a Analysis) bool {
	tds := q.TDSCalculated
	if !math.IsNaN(q.TDSMeasured) {
		tds = q.TDSMeasured
	}
	if tds <= seawaterTDS || q.Cations <= 0 || q.Anions <= 0 {
		return false
	}
	return a.MeqPerLitre(Na)/q.Cations >= seawaterNaShare && a.MeqPerLitre(Cl)/q.Anions >= seawaterClShare
}

// checkSalinity runs the seawater check: the practical salinity from the
// measured conductivity (at 25 °C, where specific conductance is given)
// against the practical salinity from the calculated dissolved solids per
// kg of solution.
func (q *Quality) checkSalinity(a Analysis) {
	q.SalinityFromEC, q.SalinityFromComposition = math.NaN(), math.NaN()
	if a.Density > 0 {
		q.SalinityFromComposition = q.TDSCalculated / (1000 * a.Density) / referenceSalinityRatio
	}
	check := QualityCheck{Criterion: salinityCriterion, Value: math.NaN()}
	if !math.IsNaN(q.ConductivityMeasured) {
		q.SalinityFromEC = PracticalSalinity(q.ConductivityMeasured, 25)
		if q.SalinityFromComposition > 0 {
			check.Value, check.Done = q.SalinityFromEC/q.SalinityFromComposition, true
			check.Pass = salinityCriterion.Accepts(check.Value)
		}
	}
	q.Checks = append(q.Checks, check)
	if check.Done && !check.Pass {
		q.Flags = append(q.Flags, fmt.Sprintf(
			"practical salinity %.2f from the measured EC (PSS-78) against %.2f from the composition (ratio %.3f, outside %s): an ion or the EC may be in error",
			q.SalinityFromEC, q.SalinityFromComposition, check.Value, salinityCriterion.Limit))
	}
}
