package saturation

import (
	"fmt"
	"math"

	"scalerisk/water"
)

// Indices holds the trade's classic calcium carbonate indices of one water
// at one temperature.
type Indices struct {
	// LSI is the Langelier index pH − pHs with pHs in the activity-based
	// form of Standard Methods 2330 (see LangelierPHs).
	LSI float64
	// PHs is the saturation pH of that form.
	PHs float64
	// LSISimplified is pH − pHs with pHs = (9.3 + A + B) − (C + D), the
	// common trade form (see SimplifiedPHs).
	LSISimplified float64
	// RSI is the Ryznar index 2·pHs − pH (Ryznar 1944).
	RSI float64
	// PSI is the Puckorius index 2·pHs − pHeq, pHeq = 1.465·log10(TA) + 4.54
	// with TA the total alkalinity in mg/L as CaCO3 (Puckorius & Brooke 1991).
	PSI float64
	// StiffDavis is pH − (pCa + pAlk + K), with K derived from this
	// engine's constants and activity coefficients at the water's ionic
	// strength and temperature (the published K chart of Stiff & Davis 1952
	// was not available): K = pK2 − pKs − log γ(Ca2+) − log γ(HCO3−).
	StiffDavis float64
	// LarsonSkold is (Cl⁻ + SO4²⁻)/(HCO3⁻ + CO3²⁻) in equivalents, with the
	// denominator taken as the total alkalinity (Larson & Skold 1958). NaN
	// when neither chloride nor sulfate was measured, or when it is not
	// defined (LarsonSkoldUndefined).
	LarsonSkold float64
	// LarsonSkoldUndefined reports that the water's alkalinity is below 5
	// mg/L as CaCO3 (minLarsonSkoldAlkalinity), where the ratio is not
	// defined: writers say "not defined" rather than leave it blank.
	LarsonSkoldUndefined bool
	// CCPP is the calcium carbonate precipitation potential, mg/L as
	// CaCO3: positive where calcite would precipitate to reach equilibrium,
	// negative where the water would dissolve it (closed system; Standard
	// Methods 2330 sign convention). NaN when it could not be computed.
	CCPP float64
}

// ClassicIndices computes the classic indices of the water of r (a result of
// this Speciator) at r's temperature and pH. The CCPP re-speciates the
// water; its failure leaves CCPP NaN with a note in the returned warnings.
// Indices need calcium and alkalinity; without them every field is NaN.
func (sp *Speciator) ClassicIndices(r *Result, opt Options) (Indices, []string) {
	return sp.classicIndices(r, opt, true)
}

func (sp *Speciator) classicIndices(r *Result, opt Options, withCCPP bool) (Indices, []string) {
	nan := math.NaN()
	ix := Indices{LSI: nan, PHs: nan, LSISimplified: nan, RSI: nan, PSI: nan, StiffDavis: nan, LarsonSkold: nan, CCPP: nan}
	a := r.Analysis
	wpl := a.WaterPerLitre
	ca := a.Totals[water.Ca] * wpl // mol/L
	alk := a.Alkalinity * wpl      // eq/L
	if !(alk > minIndexAlkalinity) {
		return ix, []string{fmt.Sprintf("the classic indices need an alkalinity above %.1f mg/L as CaCO3", water.AsCaCO3(minIndexAlkalinity))}
	}
	var warnings []string
	ix.LarsonSkold, warnings = larsonSkold(a, alk)
	ix.LarsonSkoldUndefined = len(warnings) > 0
	if !(ca > 0) {
		return ix, []string{"the calcium carbonate indices need calcium"}
	}
	table := sp.model.table
	if r.IonicStrength <= maxLangelierIonicStrength {
		ix.PHs = LangelierPHs(table, r.Temperature, r.PH, r.IonicStrength, ca, alk)
		ix.LSI = r.PH - ix.PHs
		ix.RSI = 2*ix.PHs - r.PH
	} else {
		warnings = append(warnings, fmt.Sprintf(
			"ionic strength %.3g mol/kg is beyond the Davies correction of the Langelier form (about %g): LSI, RSI and PSI are left out; the Stiff–Davis index and the calcite SI hold",
			r.IonicStrength, maxLangelierIonicStrength))
	}
	taCaCO3 := water.AsCaCO3(alk)
	pHeq := 1.465*math.Log10(taCaCO3) + 4.54
	ix.PSI = 2*ix.PHs - pHeq
	tds := a.Quality().TDSCalculated
	if !math.IsNaN(a.MeasuredTDS) && a.MeasuredTDS > 0 {
		tds = a.MeasuredTDS
	}
	if r.IonicStrength <= maxLangelierIonicStrength {
		ix.LSISimplified = r.PH - SimplifiedPHs(tds, r.Temperature, water.AsCaCO3(2*ca), taCaCO3)
	}
	// Stiff–Davis with this engine's γ.
	gCa, gHCO3 := r.Gamma("Ca[2+]"), r.Gamma("HCO3[-]")
	if gCa > 0 && gHCO3 > 0 {
		pK2, pKs := carbonateConstants(table, r.Temperature)
		K := pK2 - pKs - math.Log10(gCa) - math.Log10(gHCO3)
		ix.StiffDavis = r.PH - (-math.Log10(ca) - math.Log10(alk) + K)
	}
	if !withCCPP {
		return ix, warnings
	}
	ccpp, err := sp.calciteToEquilibrium(r, opt)
	if err != nil {
		warnings = append(warnings, fmt.Sprintf("CCPP not computed: %v", err))
	} else {
		ix.CCPP = water.AsCaCO3(2 * ccpp * wpl)
	}
	return ix, warnings
}

// minIndexAlkalinity is the alkalinity, eq/L, below which the classic
// indices are not computed (0.5 mg/L as CaCO3): they divide by it or take
// its logarithm, and below the titration's detection they mean nothing.
const minIndexAlkalinity = 1e-5

// minLarsonSkoldAlkalinity is the alkalinity, eq/L, below which the
// Larson–Skold index is not defined: 5 mg/L as CaCO3 (0.1 meq/L). The index
// divides by the alkalinity, so its uncertainty is at least the relative
// uncertainty of the titration. The interlaboratory standard deviation of
// the titration to pH 4.5 is about 1.2–1.3 mg/L as CaCO3 at 8–9 mg/L (EPA
// Method 310.1 / Standard Methods 2320 B precision statement, from memory),
// so below 5 mg/L the denominator is uncertain by a quarter or more and the
// ratio moves across the whole 0.8–1.2 band on the titration's error alone.
// Larson & Skold's (1958) correlation comes from Great Lakes waters of
// moderate alkalinity; "extrapolation to low alkalinity goes beyond the
// range of the original data" (as summarised in a corrosion reference,
// read). A water this soft is corrosive to mild steel on its low alkalinity
// and buffer capacity anyway; the index adds nothing there.
const minLarsonSkoldAlkalinity = 1e-4

// larsonSkold returns the Larson–Skold index (Cl⁻ + SO4²⁻)/alkalinity in
// equivalents of water a with alkalinity alk (eq/L), NaN when neither
// chloride nor sulfate was measured, and NaN with a note saying the index is
// not defined when alk is below minLarsonSkoldAlkalinity.
//
// References: Larson, T.E. and Skold, R.V. (1958) Corrosion 14(6):285t
// (from memory).
func larsonSkold(a water.Analysis, alk float64) (float64, []string) {
	if !(a.Totals[water.Cl] > 0 || a.Totals[water.S] > 0) {
		return math.NaN(), nil
	}
	if !(alk >= minLarsonSkoldAlkalinity) {
		return math.NaN(), []string{fmt.Sprintf(
			"Larson–Skold index not defined: alkalinity %.2g mg/L as CaCO3 is below %.0f mg/L as CaCO3, where the ratio would measure the titration's error rather than the water",
			water.AsCaCO3(alk), water.AsCaCO3(minLarsonSkoldAlkalinity))}
	}
	return (a.Totals[water.Cl] + 2*a.Totals[water.S]) * a.WaterPerLitre / alk, nil
}

// maxLangelierIonicStrength is the ionic strength, mol/kg, above which the
// Davies-based Langelier form of Standard Methods 2330 is not applied
// (about the upper limit of the Davies equation).
const maxLangelierIonicStrength = 0.5

// carbonateConstants returns pK2 of carbonic acid and pKs of calcite at
// t °C from the table (−log K of HCO3⁻ = H⁺ + CO3²⁻ and of calcite
// dissolution).
func carbonateConstants(t *Table, tc float64) (pK2, pKs float64) {
	hco3, _ := t.Entry("HCO3[-]")
	cal, _ := t.Entry("calcite")
	return -hco3.LogK(tc), -cal.LogK(tc)
}

// LangelierPHs returns the saturation pH of calcite in the activity-based
// form of Standard Methods 2330:
//
//	pHs = pK2 − pKs + p[Ca²⁺] + p[HCO3⁻] + 5·pfm
//
// with [Ca²⁺] the total calcium (mol/L), [HCO3⁻] from the total alkalinity
// alk (eq/L) corrected for carbonate, hydroxide and H⁺ at the measured pH,
// fm the Davies activity coefficient of a monovalent ion at ionic strength
// I (divalent ions taking fm⁴), and K2, Ks and Kw from table t at tc °C.
//
// References: Standard Methods for the Examination of Water and
// Wastewater, 2330 B (form from memory); Langelier, W.F. (1936) J. AWWA
// 28:1500; Plummer & Busenberg (1982) for K2 and Ks.
func LangelierPHs(t *Table, tc, pH, I, ca, alk float64) float64 {
	pK2, pKs := carbonateConstants(t, tc)
	oh, _ := t.Entry("OH[-]")
	kw := math.Pow(10, oh.LogK(tc))
	A, _ := DebyeHuckel(tc)
	sqrtI := math.Sqrt(I)
	logFm := -A * (sqrtI/(1+sqrtI) - 0.3*I)
	fm := math.Pow(10, logFm)
	fd := math.Pow(fm, 4)
	aH := math.Pow(10, -pH)
	h := aH / fm
	ohConc := kw / aH / fm
	ratio := math.Pow(10, -pK2) * fm / (aH * fd) // [CO3]/[HCO3]
	hco3 := (alk - ohConc + h) / (1 + 2*ratio)
	if hco3 <= 0 {
		return math.NaN()
	}
	return pK2 - pKs - math.Log10(ca) - math.Log10(hco3) - 5*logFm
}

// SimplifiedPHs returns the saturation pH of the common trade form,
// pHs = (9.3 + A + B) − (C + D), with A = (log10 TDS − 1)/10,
// B = −13.12·log10(t + 273) + 34.55, C = log10(Ca hardness, mg/L as CaCO3)
// − 0.4, D = log10(alkalinity, mg/L as CaCO3); TDS in mg/L, t in °C.
//
// References: common practice (trade literature); the structure with
// tabulated factors is in UFC 3-240-13FN (2005) Appendix B.
func SimplifiedPHs(tds, t, caCaCO3, alkCaCO3 float64) float64 {
	A := (math.Log10(tds) - 1) / 10
	B := -13.12*math.Log10(t+273) + 34.55
	C := math.Log10(caCaCO3) - 0.4
	D := math.Log10(alkCaCO3)
	return (9.3 + A + B) - (C + D)
}

// calciteToEquilibrium returns x, mol/kg of water, of CaCO3 that must
// precipitate (x > 0) or dissolve (x < 0) for the water of r to reach
// calcite saturation in a closed system: each mole removes one of Ca, one of
// inorganic carbon and two equivalents of alkalinity.
func (sp *Speciator) calciteToEquilibrium(r *Result, opt Options) (float64, error) {
	return sp.mineralToEquilibrium(r, "calcite")
}
