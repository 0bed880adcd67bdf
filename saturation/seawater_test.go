package saturation

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"scalerisk/water"
)

// The stoichiometric seawater constants of the carbonate system, S = 35,
// concentrations in mol per kg of seawater, total pH scale. Outside checks
// of the full model: they are fitted to measurements in seawater itself.
//
// References:
//
//	Lueker, T.J., Dickson, A.G. and Keeling, C.D. (2000) Mar. Chem. 70:105:
//	  pK1* = 3633.86/T − 61.2172 + 9.67770 ln T − 0.011555 S + 0.0001152 S²,
//	  pK2* = 471.78/T + 25.9290 − 3.16967 ln T − 0.01781 S + 0.0001122 S²
//	  (from memory; the same coefficients are listed in the OceanBioME.jl
//	  CarbonChemistry documentation [READ]).
//	Dickson, A.G. (1990) Deep-Sea Res. 37:755, K*B (as listed there [READ]).
//	Millero, F.J. (1995) GCA 59:661, K*w (as listed there [READ]).
//	Mucci, A. (1983) Am. J. Sci. 283:780, calcite K*sp: log K*sp =
//	  −171.9065 − 0.077993 T + 2839.319/T + 71.595 log T + (−0.77712 +
//	  0.0028426 T + 178.34/T) √S − 0.07711 S + 0.0041249 S^1.5; aragonite
//	  −171.945 − 0.077993 T + 2903.293/T + 71.595 log T + (−0.068393 +
//	  0.0017276 T + 88.135/T) √S − 0.10018 S + 0.0059415 S^1.5 (from memory).
//	Uppström, L.R. (1974) Deep-Sea Res. 21:161: total boron 0.000416 mol/kg
//	  at S = 35 (from memory).
type seawaterConstants struct{ k1, k2, kb, kw, kspCalcite, kspAragonite float64 }

func stoichiometricConstants(tc, S float64) seawaterConstants {
	T := tc + 273.15
	lnT, sqS := math.Log(T), math.Sqrt(S)
	pk1 := 3633.86/T - 61.2172 + 9.67770*lnT - 0.011555*S + 0.0001152*S*S
	pk2 := 471.78/T + 25.9290 - 3.16967*lnT - 0.01781*S + 0.0001122*S*S
	lnkb := (-8966.90-2890.53*sqS-77.942*S+1.728*S*sqS-0.0996*S*S)/T + 148.0248 + 137.1942*sqS + 1.62142*S -
		(24.4344+25.085*sqS+0.2474*S)*lnT + 0.053105*sqS*T
	lnkw := 148.9652 - 13847.26/T - 23.6521*lnT + (-5.977+118.67/T+1.0495*lnT)*sqS - 0.01615*S
	logCal := -171.9065 - 0.077993*T + 2839.319/T + 71.595*math.Log10(T) +
		(-0.77712+0.0028426*T+178.34/T)*sqS - 0.07711*S + 0.0041249*S*sqS
	logArag := -171.945 - 0.077993*T + 2903.293/T + 71.595*math.Log10(T) +
		(-0.068393+0.0017276*T+88.135/T)*sqS - 0.10018*S + 0.0059415*S*sqS
	return seawaterConstants{k1: math.Pow(10, -pk1), k2: math.Pow(10, -pk2), kb: math.Exp(lnkb),
		kw: math.Exp(lnkw), kspCalcite: math.Pow(10, logCal), kspAragonite: math.Pow(10, logArag)}
}

// stoichiometricOmega returns log10 of the calcite and aragonite
// saturation states Ω = [Ca][CO3²⁻]/K*sp of seawater of total alkalinity ta and inorganic
// carbon dic (mol/kg of seawater) at tc °C, S = 35, solving the alkalinity
// balance TA = HCO3⁻ + 2CO3²⁻ + B(OH)4⁻ + OH⁻ − H⁺ for [H⁺] by bisection in
// pH.
func stoichiometricOmega(tc, ta, dic, ca, bt float64) (calcite, aragonite float64) {
	return stoichiometricOmegaAt(tc, 35, ta, dic, ca, bt)
}

// stoichiometricOmegaAt is stoichiometricOmega at salinity S.
func stoichiometricOmegaAt(tc, S, ta, dic, ca, bt float64) (calcite, aragonite float64) {
	k := stoichiometricConstants(tc, S)
	alk := func(h float64) float64 {
		d := h*h + k.k1*h + k.k1*k.k2
		return dic*(k.k1*h+2*k.k1*k.k2)/d + bt*k.kb/(k.kb+h) + k.kw/h - h
	}
	lo, hi := 6.0, 10.0 // pH
	for range 100 {
		mid := (lo + hi) / 2
		if alk(math.Pow(10, -mid)) > ta {
			hi = mid
		} else {
			lo = mid
		}
	}
	h := math.Pow(10, -(lo+hi)/2)
	co3 := dic * k.k1 * k.k2 / (h*h + k.k1*h + k.k1*k.k2)
	return math.Log10(ca * co3 / k.kspCalcite), math.Log10(ca * co3 / k.kspAragonite)
}

// Seawater of S = 35 for the carbonate check: the reference composition
// (Millero et al. 2008, from memory) in mol per kg of seawater, TA 2300 and
// DIC 2000 µmol/kg (a typical surface water), converted to the model's mol
// per kg of water by the water content 1 − 0.001005·S kg per kg (Millero et
// al. 2008, from memory).
const (
	swWater = 1 - 0.001005*35
	swTA    = 2300e-6
	swDIC   = 2000e-6
	swCa    = 0.01028
	swB     = 0.000416
)

func seawaterForCarbonate(tc float64) water.Analysis { return seawaterAtSalinity(tc, 35) }

// seawaterAtSalinity is seawaterForCarbonate diluted or concentrated to
// salinity S: every constituent, the alkalinity and the inorganic carbon
// scaled by S/35 (per kg of seawater), the water content 1 − 0.001005·S.
func seawaterAtSalinity(tc, S float64) water.Analysis {
	perKgSW := map[water.Component]float64{water.Na: 0.46906, water.Mg: 0.05282, water.Ca: swCa, water.K: 0.01021,
		water.Sr: 0.0000907, water.Cl: 0.54586, water.S: 0.02824, water.F: 0.0000683, water.B: swB, water.C: swDIC}
	f, w := S/35, 1-0.001005*S
	m := map[water.Component]float64{}
	for c, v := range perKgSW {
		m[c] = f * v / w
	}
	a := newWater(fmt.Sprintf("seawater S=%g", S), tc, m)
	a.Alkalinity = f * swTA / w
	return a
}

// tolOmega is the allowed difference between the model's calcite SI and
// log Ω from the stoichiometric constants (issue 10: ±0.05 log units).
const tolOmega = 0.05

// TestSeawaterCalciteSaturation: under the automatic model the calcite and
// aragonite SI of S = 35 seawater of fixed alkalinity and inorganic carbon
// follow log Ω of the stoichiometric constants (Lueker et al. 2000, Mucci
// 1983) within tolOmega at 5–35 °C, and heating from 5 to 35 °C raises the
// calcite SI (the stoichiometric constants give +0.04; the model +0.008,
// so in effect this checks the direction). The set's MgCO3(0) constant is
// fitted to these constants at 25 °C (data/pitzer.csv), so 25 °C is not
// an independent point: the other temperatures and aragonite are.
func TestSeawaterCalciteSaturation(t *testing.T) {
	sp := NewSpeciator(nil)
	var first, last, firstRef, lastRef float64
	for i, tc := range []float64{5, 10, 15, 20, 25, 30, 35} {
		r, err := sp.Speciate(seawaterForCarbonate(tc), Options{})
		if err != nil {
			t.Fatal(err)
		}
		si, _ := r.SI("calcite")
		ar, _ := r.SI("aragonite")
		ref, refAr := stoichiometricOmega(tc, swTA, swDIC, swCa, swB)
		t.Logf("%2.0f °C (%s, pH %.3f): calcite SI %.3f, log Ω %.3f; aragonite SI %.3f, log Ω %.3f", tc, r.Activity, r.PH, si, ref, ar, refAr)
		if math.Abs(si-ref) > tolOmega {
			t.Errorf("seawater at %g °C: calcite SI %.3f, want log Ω %.3f ± %g (Lueker et al. 2000 K1*, K2*; Mucci 1983 K*sp)", tc, si, ref, tolOmega)
		}
		if math.Abs(ar-refAr) > tolOmega {
			t.Errorf("seawater at %g °C: aragonite SI %.3f, want log Ω %.3f ± %g (Lueker et al. 2000 K1*, K2*; Mucci 1983 K*sp)", tc, ar, refAr, tolOmega)
		}
		if i == 0 {
			first, firstRef = si, ref
		}
		last, lastRef = si, ref
	}
	if rise, want := last-first, lastRef-firstRef; rise <= 0 || math.Abs(rise-want) > tolOmega {
		t.Errorf("seawater 5 → 35 °C: calcite SI changes by %+.3f, want a rise of %+.3f ± %g (stoichiometric constants)", rise, want, tolOmega)
	}
}

// TestSeawaterSalinityCalcite: the calcite SI of seawater diluted or
// concentrated to S = 20–43 (the range of Lueker et al. 2000; Mucci 1983
// covers 5–44) against log Ω from the stoichiometric constants at that
// salinity. From S = 27 to 43 at 5–25 °C within tolOmega. S = 20 is a
// listed gap, held to tolBrackish: the set's calcite SI falls too little
// with dilution (its K*sp rises 0.33 from S = 20 to 43 where Mucci's rises
// 0.42), so brackish seawater reads 0.03–0.07 low at 5–25 °C (0.10 at 35 °C)
// (DEVELOPERS.md, known limits).
func TestSeawaterSalinityCalcite(t *testing.T) {
	const tolBrackish = 0.12 // the gap measured when it was listed (0.10 at 35 °C) and 0.02 more, to catch it widening
	sp := NewSpeciator(nil)
	for _, S := range []float64{20, 27, 35, 43} {
		for _, tc := range []float64{5, 15, 25} {
			r, err := sp.Speciate(seawaterAtSalinity(tc, S), Options{})
			if err != nil {
				t.Fatal(err)
			}
			si, _ := r.SI("calcite")
			f := S / 35
			ref, _ := stoichiometricOmegaAt(tc, S, f*swTA, f*swDIC, f*swCa, f*swB)
			tol := tolOmega
			if S < 27 {
				tol = tolBrackish
				t.Logf("gap: S = %g, %g °C: calcite SI %.3f against log Ω %.3f (%+.3f)", S, tc, si, ref, si-ref)
			}
			if math.Abs(si-ref) > tol {
				t.Errorf("seawater S = %g at %g °C: calcite SI %.3f, want log Ω %.3f ± %g (Lueker et al. 2000 K1*, K2*; Mucci 1983 K*sp)", S, tc, si, ref, tol)
			}
		}
	}
}

// TestHeatedSeawaterCalcite: a seawater-cooled exchanger heats seawater at
// fixed alkalinity and inorganic carbon; from 10 to 70 °C the calcite SI
// must rise a little (issue 10: the stoichiometric constants give about
// +0.05 from 10 to 50 °C; Lueker et al. 2000 are fitted only to 35 °C, so
// beyond it only the sign is checked). The ion-association model gave a
// fall of about 0.2 here, making the hot side look safer than the cold.
func TestHeatedSeawaterCalcite(t *testing.T) {
	sp := NewSpeciator(nil)
	si := map[float64]float64{}
	for _, tc := range []float64{10, 50, 70} {
		r, err := sp.Speciate(seawaterForCarbonate(tc), Options{})
		if err != nil {
			t.Fatal(err)
		}
		si[tc], _ = r.SI("calcite")
	}
	t.Logf("calcite SI of S=35 seawater: 10 °C %.3f, 50 °C %.3f, 70 °C %.3f", si[10], si[50], si[70])
	if !(si[50] > si[10]) || !(si[70] > si[10]) {
		t.Errorf("heating seawater at fixed carbon and alkalinity: calcite SI %.3f (10 °C), %.3f (50 °C), %.3f (70 °C); want a rise (Lueker et al. 2000, Mucci 1983)",
			si[10], si[50], si[70])
	}
}

// TestColdSeawaterInRange: cold seawater (0–25 °C) uses no Pitzer parameter
// outside its fitted temperature range. Møller (1988)'s CaCl2 function starts
// at 25 °C; below it the CaCl2 rows continue with the Silvester & Pitzer
// (1979) slopes (Pitzer 1991 Table 13 [READ]), so no parameter is held at
// its range limit and no such warning is given. Parameters known at 25 °C
// only keep their own warning.
func TestColdSeawaterInRange(t *testing.T) {
	sp := NewSpeciator(nil)
	for _, tc := range []float64{0, 2, 5, 10, 15, 20} {
		r, err := sp.Speciate(seawaterForCarbonate(tc), Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range r.Warnings {
			if strings.Contains(w, "held at the range limit") {
				t.Errorf("seawater at %g °C: %s", tc, w)
			}
		}
	}
}
