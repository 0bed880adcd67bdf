package water

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// ErrCarbonNotFixed reports a water that has alkalinity but whose total
// inorganic carbon is not yet known, so that it cannot be concentrated,
// blended or dosed: package saturation fixes the carbon from alkalinity and
// pH (speciation) first.
var ErrCarbonNotFixed = errors.New("inorganic carbon not fixed: speciate the sample first")

// checkCarbonFixed returns ErrCarbonNotFixed, with the sample's name, for a
// water with positive alkalinity and unknown inorganic carbon.
func checkCarbonFixed(a Analysis) error {
	if !a.CarbonKnown && !math.IsNaN(a.Alkalinity) && a.Alkalinity > 0 {
		return fmt.Errorf("sample %q: %w", a.Name, ErrCarbonNotFixed)
	}
	return nil
}

// Molar masses used to weigh dissolved solids when a transformation
// re-estimates the density (IUPAC 2021 abridged atomic weights).
const (
	bicarbonateMass = 61.016 // HCO3, g/mol: alkalinity weighed as bicarbonate
	carbonDioxMass  = 44.009 // CO2, g/mol: inorganic carbon beyond the alkalinity
)

// solidsPerKgWater returns the dissolved solids of a, g per kg of water, for
// the density estimate: every component but carbon as its ion
// (Component.IonMass), the alkalinity as bicarbonate and the inorganic carbon
// beyond it as CO2.
func solidsPerKgWater(a Analysis) float64 {
	g := 0.0
	for _, c := range Components() {
		if c != C {
			g += a.Totals[c] * c.IonMass()
		}
	}
	alk := a.Alkalinity
	if math.IsNaN(alk) || alk < 0 {
		alk = 0
	}
	g += alk * bicarbonateMass
	if a.CarbonKnown {
		if free := a.Totals[C] - alk; free > 0 {
			g += free * carbonDioxMass
		}
	}
	return g
}

// reestimateDensity sets b.Density and b.WaterPerLitre after b's totals have
// changed from those of a at the same temperature. Per kg of water, the mass
// of solution grows by the change in dissolved solids, and the density by
// the slope of EstimateDensity times the change in TDS (g/L); the two are
// iterated. A measured density of a thus keeps its offset from the estimate,
// and an unchanged composition keeps a's density exactly.
func reestimateDensity(a Analysis, b *Analysis) {
	sOld, sNew := solidsPerKgWater(a), solidsPerKgWater(*b)
	if sNew == sOld {
		b.Density, b.WaterPerLitre = a.Density, a.WaterPerLitre
		return
	}
	massNew := a.Density/a.WaterPerLitre + (sNew-sOld)/1000 // kg of solution per kg of water
	tdsOld := sOld * a.WaterPerLitre                        // g/L
	wpl := a.WaterPerLitre
	var rho float64
	for range 50 {
		rho = a.Density + densitySlope*(sNew*wpl-tdsOld)
		next := rho / massNew
		done := math.Abs(next-wpl) < 1e-13
		wpl = next
		if done {
			break
		}
	}
	b.Density, b.WaterPerLitre, b.DensityEstimated = rho, wpl, true
}

// afterTransform marks the fields of b that a transformation invalidates:
// the pH (to be recomputed at b's temperature), the carbonate part of the
// alkalinity, the measured TDS and conductivity, and the laboratory's
// values the equilibrium does not use.
func afterTransform(b *Analysis) {
	b.Entered = nil
	b.Other = nil
	b.TotalHardness, b.PAlkalinity = math.NaN(), math.NaN()
	b.PH = math.NaN()
	b.PHTemperature = b.Temperature
	b.CarbonateAlkalinity = math.NaN()
	b.MeasuredTDS = math.NaN()
	b.MeasuredConductivity = math.NaN()
}

// Concentrate returns the water after n cycles of concentration (n ≥ 1):
// every component total, the alkalinity and the inorganic carbon times n, as
// when pure water evaporates (mol/kg of water scale exactly). The system is
// closed: no CO2 is lost (exchange with air is a scenario of package
// saturation). The pH becomes NaN, to be recomputed; the measured TDS and
// conductivity and the carbonate part of the alkalinity become NaN; the
// density is re-estimated (EstimateDensity's slope, keeping the offset of a
// measured density). n = 1 keeps the composition and density. The result is
// named "NAME ×n".
//
// It returns an error for n < 1, NaN or ±Inf, and ErrCarbonNotFixed for a
// water with alkalinity whose inorganic carbon is not known. a is not changed.
//
// References: cycles of concentration C = C_blowdown/C_makeup (UFC
// 3-240-13FN; practice.md §4.1).
func (a Analysis) Concentrate(n float64) (Analysis, error) {
	if math.IsNaN(n) || math.IsInf(n, 0) || n < 1 {
		return Analysis{}, fmt.Errorf("sample %q: cycles of concentration %g: want a finite number ≥ 1", a.Name, n)
	}
	if err := checkCarbonFixed(a); err != nil {
		return Analysis{}, err
	}
	b := a.Clone()
	for i := range b.Totals {
		b.Totals[i] *= n
	}
	b.Alkalinity *= n
	b.Name = fmt.Sprintf("%s ×%g", a.Name, n)
	afterTransform(&b)
	reestimateDensity(a, &b)
	return b, nil
}

// checkBlend checks the waters and fractions of Blend and returns the
// blend's name.
func checkBlend(waters []Analysis, fractions []float64) (string, error) {
	if len(waters) == 0 || len(waters) != len(fractions) {
		return "", fmt.Errorf("blend: %d waters and %d fractions: want the same number, at least one",
			len(waters), len(fractions))
	}
	sum := 0.0
	for i, f := range fractions {
		if math.IsNaN(f) || f < 0 || f > 1 {
			return "", fmt.Errorf("blend: fraction %g of %q: want a number in [0, 1]", f, waters[i].Name)
		}
		sum += f
	}
	if math.Abs(sum-1) > 1e-9 {
		return "", fmt.Errorf("blend: fractions sum to %.12g: want 1", sum)
	}
	var parts []string
	for i, w := range waters {
		parts = append(parts, fmt.Sprintf("%.4g %% %s", 100*fractions[i], w.Name))
		if fractions[i] == 0 {
			continue
		}
		if err := checkCarbonFixed(w); err != nil {
			return "", fmt.Errorf("blend: %w", err)
		}
		if !(w.WaterPerLitre > 0) || !(w.Density > 0) {
			return "", fmt.Errorf("blend: sample %q: water per litre %g and density %g: want positive values",
				w.Name, w.WaterPerLitre, w.Density)
		}
	}
	return "blend " + strings.Join(parts, " + "), nil
}

// Blend returns the mix of waters by volume fractions, each in [0, 1] and
// summing to 1 within 1e-9. Volumes are taken as additive, so one litre of
// the mix holds Σ fᵢ·WaterPerLitreᵢ kg of water and weighs Σ fᵢ·Densityᵢ kg;
// each total (and the alkalinity) mixes per litre, Σ fᵢ·mᵢ·WaterPerLitreᵢ
// mol/L, and is divided by the mix's water per litre. Temperature and
// pressure are volume-weighted; the pH becomes NaN, to be recomputed; the
// measured TDS and conductivity become NaN. Waters with fraction 0 take no
// part. A component measured in one water but not in another counts as 0 in
// the latter, with a warning; a water with no alkalinity value makes the
// mix's alkalinity NaN. A water with alkalinity ≤ 0 and unknown inorganic
// carbon is taken as carbon-free, with a warning. The result is named
// "blend 30 % A + 70 % B", keeps the date the waters share (empty when they
// differ) and carries the waters' warnings prefixed by their names.
//
// It returns an error when the slices differ in length or are empty, for a
// fraction outside [0, 1] or a sum off 1, and ErrCarbonNotFixed for a water
// with alkalinity whose inorganic carbon is not known. The inputs are not
// changed.
func Blend(waters []Analysis, fractions []float64) (Analysis, error) {
	name, err := checkBlend(waters, fractions)
	if err != nil {
		return Analysis{}, err
	}
	b := Analysis{Name: name, CarbonKnown: true}
	var perLitre [NumComponents]float64
	var alkPerLitre float64
	alkKnown := true
	for i, w := range waters {
		f := fractions[i]
		if f == 0 {
			continue
		}
		b.Temperature += f * w.Temperature
		b.Pressure += f * w.Pressure
		b.Density += f * w.Density
		b.WaterPerLitre += f * w.WaterPerLitre
		b.DensityEstimated = b.DensityEstimated || w.DensityEstimated
		for c := range perLitre {
			perLitre[c] += f * w.Totals[c] * w.WaterPerLitre
			b.Measured[c] = b.Measured[c] || w.Measured[c]
		}
		if math.IsNaN(w.Alkalinity) {
			alkKnown = false
			b.Warnings = append(b.Warnings, fmt.Sprintf("alkalinity of %s not known: the blend's alkalinity is unknown", w.Name))
		} else {
			alkPerLitre += f * w.Alkalinity * w.WaterPerLitre
		}
		if !w.CarbonKnown {
			if math.IsNaN(w.Alkalinity) {
				b.CarbonKnown = false
				b.Warnings = append(b.Warnings, fmt.Sprintf("inorganic carbon of %s not known: the blend's carbon is not fixed", w.Name))
			} else {
				b.Warnings = append(b.Warnings, fmt.Sprintf("inorganic carbon of %s not known: taken as 0 (its alkalinity is %g meq/kg)",
					w.Name, 1000*w.Alkalinity))
			}
		}
		for _, s := range w.BelowDetection {
			b.BelowDetection = append(b.BelowDetection, w.Name+": "+s)
		}
		for _, s := range w.Warnings {
			b.Warnings = append(b.Warnings, w.Name+": "+s)
		}
	}
	b.Date = sharedDate(waters, fractions)
	b.Warnings = append(b.Warnings, unmeasuredInBlend(b.Measured, waters, fractions)...)
	for c := range b.Totals {
		b.Totals[c] = perLitre[c] / b.WaterPerLitre
	}
	b.Alkalinity = math.NaN()
	if alkKnown {
		b.Alkalinity = alkPerLitre / b.WaterPerLitre
	}
	afterTransform(&b)
	return b, nil
}

// sharedDate returns the date the waters of nonzero fraction share, empty
// when they differ.
func sharedDate(waters []Analysis, fractions []float64) string {
	date, first := "", true
	for i, w := range waters {
		if fractions[i] == 0 {
			continue
		}
		if first {
			date, first = w.Date, false
		} else if w.Date != date {
			return ""
		}
	}
	return date
}

// unmeasuredInBlend returns a warning for each component measured in some
// waters of the blend (measured) but not in another water of nonzero
// fraction, which counts it as 0.
func unmeasuredInBlend(measured [NumComponents]bool, waters []Analysis, fractions []float64) []string {
	var out []string
	for _, c := range Components() {
		if !measured[c] || c == C {
			continue
		}
		for i, w := range waters {
			if fractions[i] > 0 && !w.Measured[c] {
				out = append(out, fmt.Sprintf("%s not measured in %s: counted as 0 in the blend", c, w.Name))
			}
		}
	}
	return out
}

// Dose returns the water after adding mg milligrams of product per litre of
// water of reagent r at strength percent w/w (0 means r.Strength). The dose
// brings mg·strength/100/MolarMass mmol of reagent per litre, converted to
// mol/kg of water with a.WaterPerLitre; each component of r.Adds and the
// alkalinity change by their stoichiometry. The water the product brings and
// the water neutralisation forms are neglected (a relative dilution of
// mg·(1 − strength/100)·1e-6, below 1e-3 at usual doses). The pH, measured
// TDS and conductivity and the carbonate part of the alkalinity become NaN;
// the density is re-estimated. The result is named "NAME + 50 mg/L h2so4
// (93 %)".
//
// Warnings record the reagent's caution, a strength outside the usual
// grades, an acid dose that exceeds the alkalinity (the water turns
// mineral-acidic, pH below about 4.5, and corrosive), an unknown alkalinity
// and a component the laboratory did not measure.
//
// Caution: acid and caustic dosing can hurt people and plant. These figures
// are advisory; acid handling, feed control and discharge are governed by
// the SDS, local codes and licensed practice.
//
// It returns an error for a negative or non-finite dose, a strength outside
// (0, 100], a reagent without molar mass, and ErrCarbonNotFixed for a water
// with alkalinity whose inorganic carbon is not known. a is not changed.
//
// References: reagent stoichiometry from molar masses (IUPAC 2021 abridged
// atomic weights), cross-checked with "Power Plant Engineering" Table 15-3.
func (a Analysis) Dose(r Reagent, mg, strength float64) (Analysis, error) {
	if math.IsNaN(mg) || math.IsInf(mg, 0) || mg < 0 {
		return Analysis{}, fmt.Errorf("sample %q: dose %g mg/L of %s: want a finite number ≥ 0", a.Name, mg, r.Name)
	}
	s := r.strengthOrUsual(strength)
	if math.IsNaN(s) || s <= 0 || s > 100 {
		return Analysis{}, fmt.Errorf("sample %q: strength %g %% of %s: want more than 0 and at most 100", a.Name, strength, r.Name)
	}
	if !(r.MolarMass > 0) {
		return Analysis{}, fmt.Errorf("sample %q: reagent %q has no molar mass", a.Name, r.Name)
	}
	if !(a.WaterPerLitre > 0) {
		return Analysis{}, fmt.Errorf("sample %q: water per litre %g: want a positive value", a.Name, a.WaterPerLitre)
	}
	if err := checkCarbonFixed(a); err != nil {
		return Analysis{}, err
	}
	b := a.Clone()
	molal := mg * r.MolPerMg(s) / a.WaterPerLitre // mol of reagent per kg of water
	for _, c := range Components() {
		n := r.Adds[c]
		if n == 0 {
			continue
		}
		b.Totals[c] += n * molal
		if c != C && !a.Measured[c] && mg > 0 {
			b.Warnings = append(b.Warnings, fmt.Sprintf("%s was not measured: its total holds only the dose of %s", c, r.Name))
		}
	}
	if math.IsNaN(a.Alkalinity) {
		if r.AlkalinityPerMol != 0 && mg > 0 {
			b.Warnings = append(b.Warnings, fmt.Sprintf("alkalinity not known: the change of %g meq/kg from %s is not applied",
				1000*r.AlkalinityPerMol*molal, r.Name))
		}
	} else {
		b.Alkalinity += r.AlkalinityPerMol * molal
		if r.AlkalinityPerMol < 0 && b.Alkalinity < 0 {
			b.Warnings = append(b.Warnings, fmt.Sprintf(
				"the dose exceeds the alkalinity by %.3g meq/kg: the water turns mineral-acidic (pH below about 4.5) and corrosive",
				-1000*b.Alkalinity))
		}
	}
	if strength != 0 && (s < r.StrengthMin || s > r.StrengthMax) {
		b.Warnings = append(b.Warnings, fmt.Sprintf("strength %g %% of %s is outside the usual grades %g–%g %%: check it",
			s, r.Name, r.StrengthMin, r.StrengthMax))
	}
	if r.Caution != "" && mg > 0 {
		b.Warnings = append(b.Warnings, fmt.Sprintf(
			"caution (%s): %s. Advisory only: handling, feed control and discharge are governed by the SDS, local codes and licensed practice",
			r.Label, r.Caution))
	}
	b.Name = fmt.Sprintf("%s + %g mg/L %s (%g %%)", a.Name, mg, r.Name, s)
	afterTransform(&b)
	reestimateDensity(a, &b)
	return b, nil
}

// MakeupAndBlowdown returns the make-up and blowdown flows of a cooling tower
// that evaporates evaporation (any flow unit) at cycles of concentration
// cycles, with drift and leaks neglected: makeup = E·C/(C − 1), blowdown =
// E/(C − 1), so that makeup = evaporation + blowdown. Both are NaN for
// cycles ≤ 1 (no steady state), a negative evaporation, or NaN input.
//
// References: cooling-tower water balance M = E + B, C = M/B (common
// practice; UFC 3-240-13FN; EPA WaterSense at Work, 2012, p. 199).
func MakeupAndBlowdown(evaporation, cycles float64) (makeup, blowdown float64) {
	if math.IsNaN(evaporation) || math.IsNaN(cycles) || evaporation < 0 || cycles <= 1 {
		return math.NaN(), math.NaN()
	}
	blowdown = evaporation / (cycles - 1)
	return evaporation + blowdown, blowdown
}
