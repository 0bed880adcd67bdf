package water

import (
	"fmt"
	"math"
	"strconv"
)

// sm1030E is the source string of the Standard Methods correctness checks.
// The criteria are quoted from memory, not checked against the current
// edition.
const sm1030E = "Standard Methods for the Examination of Water and Wastewater, 1030 E \"Checking analyses' correctness\" (from memory)"

// QualityCriterion is one acceptance criterion for the correctness of a
// laboratory analysis, with the range a checked value must fall in and where
// the criterion comes from, so that a report can print it.
type QualityCriterion struct {
	Name    string // short key, e.g. "ion-balance-3-10"
	Check   string // the quantity checked, in words
	Applies string // when it applies, in words; empty when always
	Limit   string // the acceptable range in words, e.g. "±2 %"
	// Min and Max bound the acceptable checked value, inclusive, in Unit.
	Min, Max float64
	Unit     string // "meq/L", "%", or "" for a ratio
	// AnionSumMin and AnionSumMax (meq/L) select the ion-balance criterion
	// by anion sum: it applies when the sum is in (AnionSumMin, AnionSumMax],
	// the first range including 0. Both are 0 for the other criteria.
	AnionSumMin, AnionSumMax float64
	Source                   string
}

// Accepts reports whether v lies in [c.Min, c.Max]. A relative slack of
// 1e-9 absorbs floating-point rounding of values on a boundary; NaN is never
// accepted.
func (c QualityCriterion) Accepts(v float64) bool {
	if math.IsNaN(v) {
		return false
	}
	slack := 1e-9 * math.Max(math.Abs(c.Min), math.Abs(c.Max))
	return v >= c.Min-slack && v <= c.Max+slack
}

// qualityCriteria is the table behind QualityCriteria. It is never modified.
var qualityCriteria = []QualityCriterion{
	{Name: "ion-balance-0-3", Check: "cation sum − anion sum", Applies: "anion sum 0–3.0 meq/L",
		Limit: "±0.2 meq/L", Min: -0.2, Max: 0.2, Unit: "meq/L", AnionSumMin: 0, AnionSumMax: 3, Source: sm1030E},
	{Name: "ion-balance-3-10", Check: "ion balance 100·(cations − anions)/(cations + anions)", Applies: "anion sum 3.0–10.0 meq/L",
		Limit: "±2 %", Min: -2, Max: 2, Unit: "%", AnionSumMin: 3, AnionSumMax: 10, Source: sm1030E},
	{Name: "ion-balance-10-800", Check: "ion balance 100·(cations − anions)/(cations + anions)", Applies: "anion sum 10–800 meq/L",
		Limit: "±5 %", Min: -5, Max: 5, Unit: "%", AnionSumMin: 10, AnionSumMax: 800, Source: sm1030E},
	{Name: "tds-ratio", Check: "measured TDS / calculated TDS", Applies: "TDS measured",
		Limit: "1.0–1.2", Min: 1.0, Max: 1.2, Source: sm1030E},
	{Name: "ec-ratio", Check: "measured EC / calculated EC", Applies: "EC measured",
		Limit: "0.9–1.1", Min: 0.9, Max: 1.1, Source: sm1030E},
	{Name: "cation-sum-ec", Check: "100 × cation sum (meq/L) / measured EC (µS/cm)", Applies: "EC measured",
		Limit: "0.9–1.1", Min: 0.9, Max: 1.1, Source: sm1030E},
	{Name: "anion-sum-ec", Check: "100 × anion sum (meq/L) / measured EC (µS/cm)", Applies: "EC measured",
		Limit: "0.9–1.1", Min: 0.9, Max: 1.1, Source: sm1030E},
	{Name: "tds-ec", Check: "measured TDS (mg/L) / measured EC (µS/cm)", Applies: "TDS and EC measured",
		Limit: "0.55–0.7", Min: 0.55, Max: 0.7, Source: sm1030E},
	{Name: "calculated-tds-ec", Check: "calculated TDS (mg/L) / measured EC (µS/cm)", Applies: "EC measured",
		Limit: "0.55–0.7", Min: 0.55, Max: 0.7, Source: sm1030E},
}

// QualityCriteria returns the acceptance criteria Quality applies, in a fixed
// order: the three ion-balance criteria by anion sum, then the TDS and
// conductivity ratios. The slice is a fresh copy.
//
// References: Standard Methods for the Examination of Water and Wastewater,
// 1030 E "Checking analyses' correctness" (APHA/AWWA/WEF), from memory.
func QualityCriteria() []QualityCriterion {
	return append([]QualityCriterion(nil), qualityCriteria...)
}

// BalanceCriterion returns the ion-balance criterion of Standard Methods
// 1030 E that applies to an anion sum of anionSum meq/L: the absolute
// criterion (±0.2 meq/L) for 0–3.0 meq/L, ±2 % for more than 3.0 up to 10,
// ±5 % for more than 10 up to 800 (a sum on a boundary takes the lower range).
// Above 800 meq/L, or for a negative or NaN sum, no criterion applies and ok
// is false; the ±5 % criterion is then returned as the nearest one.
func BalanceCriterion(anionSum float64) (c QualityCriterion, ok bool) {
	for _, c := range qualityCriteria[:3] {
		if anionSum >= c.AnionSumMin && anionSum <= c.AnionSumMax &&
			(anionSum > c.AnionSumMin || c.AnionSumMin == 0) {
			return c, true
		}
	}
	return qualityCriteria[2], false
}

// QualityCheck is the outcome of one criterion for one analysis.
type QualityCheck struct {
	Criterion QualityCriterion
	Value     float64 // the checked value in Criterion.Unit; NaN when not computed
	Done      bool    // false when the data the check needs are missing
	Pass      bool    // false when not Done
}

// Quality holds the data-quality checks of one analysis. Sums and TDS are per
// litre of solution (the analysis' WaterPerLitre converts from mol/kg of
// water); conductivities are at 25 °C.
type Quality struct {
	// Cations and Anions are the equivalent sums, meq/L. Cations count Ca,
	// Mg, Na, K, Ba, Sr, Fe(II) and Mn(II); anions count Cl, SO4, NO3, F
	// and the total alkalinity as anion equivalents (a negative alkalinity,
	// mineral acidity, counts as H+ among the cations). Si, P and B carry no
	// charge in the balance (Component.Charge).
	Cations, Anions float64
	// BalancePercent is 100·(Cations − Anions)/(Cations + Anions); NaN when
	// both sums are zero.
	BalancePercent float64
	// BalanceLimit states the Standard Methods 1030 E criterion that applies,
	// in words, e.g. "±2 % (anion sum 3.0–10.0 meq/L)".
	BalanceLimit      string
	BalanceAcceptable bool
	// TDSCalculated is the sum of the dissolved constituents, mg/L, as they
	// would weigh after evaporation: metals and halides as the element,
	// sulfate as SO4, nitrate as NO3, silica as SiO2, phosphate as PO4, boron
	// as B, and the alkalinity as carbonate, 30.0 mg per meq (bicarbonate ×
	// 0.4917). Inorganic carbon without measured alkalinity is not counted.
	TDSCalculated float64
	// TDSMeasured is the laboratory's TDS, mg/L; NaN when not given.
	TDSMeasured float64
	// TDSRatio is TDSMeasured/TDSCalculated; NaN when TDS was not measured.
	TDSRatio float64
	// ConductivityCalculated is the specific conductance, µS/cm at 25 °C,
	// calculated from the composition (see Analysis.Quality for the method);
	// 0 when no ions are reported.
	ConductivityCalculated float64
	// ConductivityMeasured is the laboratory's EC, µS/cm at 25 °C; NaN when
	// not given.
	ConductivityMeasured float64
	// ConductivityRatio is ConductivityMeasured/ConductivityCalculated; NaN
	// when EC was not measured.
	ConductivityRatio float64
	// IonicStrength is ½Σ z²m, mol/kg, over the components as free ions and
	// the alkalinity as HCO3- (the part reported as carbonate as CO3 2-, a
	// negative alkalinity as H+). Ion pairs are not formed here.
	IonicStrength float64
	// IonicStrengthFromTDS is 2.5e-5 × TDS (mg/L) (Langelier 1936), using
	// the measured TDS when given, else the calculated TDS.
	IonicStrengthFromTDS float64
	// IonicStrengthFromConductivity is 1.6e-5 × EC (µS/cm) (Russell 1976)
	// from the measured EC only; NaN when EC was not measured (the
	// calculated EC would only restate IonicStrength).
	IonicStrengthFromConductivity float64
	// Seawater reports a seawater-like water (dissolved solids above
	// 10 g/L, mostly Na and Cl): the fresh-water conductivity criteria do
	// not apply to it, and SalinityCriterion does instead, comparing
	// SalinityFromEC (PSS-78, from the measured EC; NaN when not measured)
	// with SalinityFromComposition (from the calculated TDS). Both are NaN
	// for other waters.
	Seawater                                bool
	SalinityFromEC, SalinityFromComposition float64
	// Checks lists every criterion of QualityCriteria that applies, in that
	// order, with its outcome; checks lacking data have Done false.
	Checks []QualityCheck
	// Lab lists the checks of the lab measurements the equilibrium does
	// not use (total hardness, P-alkalinity) that ran, in the order of
	// LabCheckKind; none when the lab reported neither.
	Lab []LabCheck
	// Flags are plain-language notes where a check fails, data are missing,
	// the ionic-strength estimates disagree by more than 30 %, or the ionic
	// strength is beyond the range of the conductivity calculation.
	Flags []string
}

// Constants of the quality checks.
const (
	// carbonateMassPerEq is the mass of CO3 per equivalent, g/eq
	// (60.008/2, IUPAC 2021 abridged atomic weights): alkalinity weighed as
	// carbonate in a TDS by summation, which is the same as bicarbonate
	// (61.016 g/eq) × 0.4917.
	carbonateMassPerEq = 60.008 / 2
	// tdsToIonicStrength is Langelier's (1936) I ≈ 2.5e-5 × TDS (mg/L).
	tdsToIonicStrength = 2.5e-5
	// ecToIonicStrength is Russell's (1976) I ≈ 1.6e-5 × EC (µS/cm).
	ecToIonicStrength = 1.6e-5
	// conductivityMaxIonicStrength is the molar ionic strength, mol/L, above
	// which the calculated conductivity is outside the range it was checked
	// over (to seawater, I ≈ 0.71 mol/L) and Quality adds a flag.
	conductivityMaxIonicStrength = 0.75
	// estimateDisagreement is the relative difference between ionic-strength
	// estimates above which Quality adds a flag.
	estimateDisagreement = 0.30
)

// Quality runs the data-quality checks of Standard Methods 1030 E on a: the
// ion balance with the criterion chosen by anion sum, measured against
// calculated TDS and conductivity, the ion sums and TDS against the measured
// conductivity, and three estimates of ionic strength. A check whose data are
// missing (TDS or EC not measured) is listed with Done false and does not
// fail; a missing alkalinity is flagged, because the anion sum then lacks the
// carbonate species.
//
// The conductivity is calculated from the limiting equivalent conductivities
// of data/conductivity.csv with the Debye–Hückel–Onsager correction for ions
// of finite size, the free ions taken as one binary electrolyte (see
// onsagerConductivity). Ion pairs are not formed, so waters rich in sulfate
// and divalent cations read somewhat high. Against handbook values, KCl and
// NaCl to 0.1 mol/L agree within 2 %, CaCl2 within 1 % at 0.01 mol/L and 7 %
// at 0.05 mol/L, and seawater (I ≈ 0.71 mol/L) within 9 %.
// Above a molar ionic strength of 0.75 mol/L a flag says the EC ratio is
// indicative only.
//
// References: Standard Methods for the Examination of Water and Wastewater,
// 1030 E (APHA/AWWA/WEF; criteria from memory); Langelier, W.F. (1936)
// J. AWWA 28:1500 (I ≈ 2.5e-5·TDS); Russell, L.L. (1976) thesis, Colorado
// School of Mines (I ≈ 1.6e-5·EC, from memory); for the conductivity, see
// onsagerConductivity.
func (a Analysis) Quality() Quality {
	nan := math.NaN()
	q := Quality{TDSMeasured: a.MeasuredTDS, ConductivityMeasured: a.MeasuredConductivity,
		TDSRatio: nan, ConductivityRatio: nan, IonicStrengthFromConductivity: nan,
		SalinityFromEC: nan, SalinityFromComposition: nan}
	cationIons, anionIons := q.addComposition(a, conductivities())
	q.Seawater = q.seawaterLike(a)
	q.checkBalance()
	q.ConductivityCalculated = onsagerConductivity(cationIons, anionIons)
	if ionicMolar := q.IonicStrength * a.WaterPerLitre; ionicMolar > conductivityMaxIonicStrength {
		q.Flags = append(q.Flags, fmt.Sprintf(
			"ionic strength %.3g mol/L is above %g, the range the calculated conductivity was checked over: the EC ratio is indicative only",
			ionicMolar, conductivityMaxIonicStrength))
	}
	q.addEstimates()
	q.checkRatios()
	if q.Seawater {
		q.checkSalinity(a)
	}
	q.checkIonicStrengthEstimates()
	q.checkLab(a)
	return q
}

// addComposition sums the ions of a into q: the cation and anion sums
// (meq/L), the calculated TDS (mg/L) and the ionic strength (mol/kg), the
// alkalinity counted as bicarbonate and carbonate (a negative alkalinity as
// H+), and flags a missing alkalinity. It returns the ions grouped for the
// conductivity, with their limiting conductivities lambda.
func (q *Quality) addComposition(a Analysis, lambda *conductivityTable) (cationIons, anionIons ionSums) {
	wpl := a.WaterPerLitre
	for _, c := range Components() {
		m := a.Totals[c]
		if m == 0 || (c == C) {
			continue
		}
		q.TDSCalculated += a.MgPerLitre(c)
		z := c.Charge()
		if z == 0 {
			continue
		}
		eq := math.Abs(z) * m * wpl * 1000 // meq/L
		if z > 0 {
			q.Cations += eq
			cationIons.add(lambda.component[c], z, eq)
		} else {
			q.Anions += eq
			anionIons.add(lambda.component[c], z, eq)
		}
		q.IonicStrength += 0.5 * z * z * m
	}
	switch alk := a.Alkalinity; {
	case math.IsNaN(alk):
		if q.Cations+q.Anions > 0 {
			q.Flags = append(q.Flags, "alkalinity not measured: the anion sum, TDS and conductivity lack the carbonate species")
		}
	case alk >= 0:
		carb := a.CarbonateAlkalinity
		if math.IsNaN(carb) || carb < 0 {
			carb = 0
		}
		carb = math.Min(carb, alk)
		bicarb := alk - carb
		q.Anions += alk * wpl * 1000
		q.TDSCalculated += alk * wpl * carbonateMassPerEq * 1000
		q.IonicStrength += 0.5*bicarb + carb // HCO3-: ½·1²·m; CO3 2-: ½·2²·(eq/2)
		anionIons.add(lambda.bicarbonate, -1, bicarb*wpl*1000)
		anionIons.add(lambda.carbonate, -2, carb*wpl*1000)
	default: // mineral acidity: H+
		h := -alk
		q.Cations += h * wpl * 1000
		q.IonicStrength += 0.5 * h
		cationIons.add(lambda.hydrogen, 1, h*wpl*1000)
	}
	return cationIons, anionIons
}

// checkBalance computes the ion balance from q's ion sums, checks it
// against the 1030 E criterion chosen by anion sum, and flags a failure or
// a water without ions.
func (q *Quality) checkBalance() {
	sum := q.Cations + q.Anions
	q.BalancePercent = math.NaN()
	if sum > 0 {
		q.BalancePercent = 100 * (q.Cations - q.Anions) / sum
	}
	bal, inTable := BalanceCriterion(q.Anions)
	q.BalanceLimit = fmt.Sprintf("%s (%s)", bal.Limit, bal.Applies)
	if !inTable {
		q.BalanceLimit = fmt.Sprintf("%s (anion sum above 800 meq/L: beyond the 1030 E table, nearest criterion used)", bal.Limit)
	}
	balValue := q.BalancePercent
	if bal.Unit == "meq/L" {
		balValue = q.Cations - q.Anions
	}
	if sum > 0 {
		q.BalanceAcceptable = bal.Accepts(balValue)
	}
	q.Checks = append(q.Checks, QualityCheck{Criterion: bal, Value: balValue, Done: sum > 0, Pass: q.BalanceAcceptable})
	switch {
	case sum == 0:
		q.Flags = append(q.Flags, "no ions reported: the ion balance cannot be checked")
	case !q.BalanceAcceptable:
		q.Flags = append(q.Flags, fmt.Sprintf(
			"ion balance %+.1f %% (cations %.3g, anions %.3g meq/L) fails %s: an analyte may be missing or in error",
			q.BalancePercent, q.Cations, q.Anions, q.BalanceLimit))
	}
}

// addEstimates sets the TDS and conductivity ratios (when measured) and the
// ionic strength estimated from TDS and from the measured conductivity.
func (q *Quality) addEstimates() {
	haveTDS := !math.IsNaN(q.TDSMeasured)
	haveEC := !math.IsNaN(q.ConductivityMeasured)
	if haveTDS && q.TDSCalculated > 0 {
		q.TDSRatio = q.TDSMeasured / q.TDSCalculated
	}
	if haveEC && q.ConductivityCalculated > 0 {
		q.ConductivityRatio = q.ConductivityMeasured / q.ConductivityCalculated
	}
	tdsForI := q.TDSCalculated
	if haveTDS {
		tdsForI = q.TDSMeasured
	}
	q.IonicStrengthFromTDS = tdsToIonicStrength * tdsForI
	if haveEC {
		q.IonicStrengthFromConductivity = ecToIonicStrength * q.ConductivityMeasured
	}
}

// checkRatios runs the ratio criteria of QualityCriteria (those after the
// three ion-balance ones) and flags each that fails; a ratio lacking its
// data is listed with Done false.
func (q *Quality) checkRatios() {
	haveTDS := !math.IsNaN(q.TDSMeasured)
	haveEC := !math.IsNaN(q.ConductivityMeasured)
	haveIons := q.Cations+q.Anions > 0
	ratio := func(num, den float64, ok bool) (float64, bool) {
		if !ok || den <= 0 || math.IsNaN(num) || math.IsNaN(den) {
			return math.NaN(), false
		}
		return num / den, true
	}
	for _, c := range qualityCriteria[3:] {
		if q.Seawater && c.Name != "tds-ratio" {
			continue // the conductivity criteria suit fresh water only
		}
		var v float64
		var done bool
		switch c.Name {
		case "tds-ratio":
			v, done = ratio(q.TDSMeasured, q.TDSCalculated, haveTDS)
		case "ec-ratio":
			v, done = ratio(q.ConductivityMeasured, q.ConductivityCalculated, haveEC)
		case "cation-sum-ec":
			v, done = ratio(100*q.Cations, q.ConductivityMeasured, haveEC && haveIons)
		case "anion-sum-ec":
			v, done = ratio(100*q.Anions, q.ConductivityMeasured, haveEC && haveIons)
		case "tds-ec":
			v, done = ratio(q.TDSMeasured, q.ConductivityMeasured, haveTDS && haveEC)
		case "calculated-tds-ec":
			v, done = ratio(q.TDSCalculated, q.ConductivityMeasured, haveEC && haveIons)
		}
		check := QualityCheck{Criterion: c, Value: v, Done: done, Pass: done && c.Accepts(v)}
		q.Checks = append(q.Checks, check)
		if done && !check.Pass {
			q.Flags = append(q.Flags, qualityFlag(c, v))
		}
	}
}

// checkIonicStrengthEstimates flags an estimate of ionic strength (from TDS
// or from the measured conductivity) that differs from the one calculated
// from the composition by more than estimateDisagreement.
func (q *Quality) checkIonicStrengthEstimates() {
	if !(q.IonicStrength > 0) {
		return
	}
	source := "calculated TDS"
	if !math.IsNaN(q.TDSMeasured) {
		source = "measured TDS"
	}
	for _, est := range []struct {
		name  string
		value float64
	}{
		{"2.5e-5 × " + source + " (Langelier)", q.IonicStrengthFromTDS},
		{"1.6e-5 × measured EC (Russell)", q.IonicStrengthFromConductivity},
	} {
		if math.IsNaN(est.value) {
			continue
		}
		diff := est.value/q.IonicStrength - 1
		if math.Abs(diff) > estimateDisagreement {
			q.Flags = append(q.Flags, fmt.Sprintf(
				"ionic strength %.3g mol/kg from %s differs from %.3g mol/kg from the composition by %+.0f %%",
				est.value, est.name, q.IonicStrength, 100*diff))
		}
	}
}

// qualityFlag words a failed ratio check with the usual reading of Standard
// Methods 1030 E (from memory).
func qualityFlag(c QualityCriterion, v float64) string {
	low := v < c.Min
	var hint string
	switch c.Name {
	case "tds-ratio":
		if low {
			hint = "the measured TDS is below the sum of constituents: a constituent may be overstated, or the TDS low"
		} else {
			hint = "the measured TDS exceeds the sum of constituents: an analyte may be missing"
		}
	case "ec-ratio":
		hint = "an ion may be missing or in error, or the EC reading off"
	case "cation-sum-ec", "anion-sum-ec":
		hint = "the ion sum and the EC disagree: reanalyse the ions or the EC"
	case "tds-ec":
		hint = "measured TDS and EC disagree"
	case "calculated-tds-ec":
		if low {
			hint = "the lower ion sum is suspect"
		} else {
			hint = "the higher ion sum is suspect"
		}
	}
	return fmt.Sprintf("%s = %s, outside %s: %s", c.Check, strconv.FormatFloat(v, 'f', 3, 64), c.Limit, hint)
}
