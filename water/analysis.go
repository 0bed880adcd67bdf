package water

import (
	"fmt"
	"math"
)

// Analysis is a water sample on the basis the chemistry needs: totals per
// component in mol/kg of water, with the physical state it was sampled and
// measured at. The zero value is not useful; build one with Sample.Analysis
// or the transformations. Methods never modify the receiver.
type Analysis struct {
	Name string
	Date string
	// Role is what the sample is to the plant (RoleUnset when not given)
	// and System the tower or train it belongs to ("" when not given):
	// a makeup and a recirculating sample of one system and date form a
	// pair (see package saturation's Balance).
	Role   Role
	System string

	// Temperature is the temperature of the water, °C (25 when not given).
	Temperature float64
	// PH is the measured pH, or NaN when it is unknown (not measured, or the
	// water has been transformed and its pH must be recomputed).
	PH float64
	// PHTemperature is the temperature, °C, at which PH was measured.
	PHTemperature float64
	// Pressure is the total pressure, atm (1 when not given).
	Pressure float64

	// Totals holds mol/kg of water per component; 0 means absent or not
	// measured (see Measured). Totals[C] is meaningful only when CarbonKnown.
	Totals [NumComponents]float64
	// Measured marks the components the laboratory reported.
	Measured [NumComponents]bool
	// CarbonKnown reports whether Totals[C] holds total inorganic carbon
	// (reported directly, or fixed by speciation from alkalinity and pH).
	CarbonKnown bool
	// Alkalinity is the total (titration) alkalinity, eq/kg of water; NaN
	// when not measured.
	Alkalinity float64
	// CarbonateAlkalinity is the alkalinity reported as carbonate (CO3), eq/kg
	// of water; NaN when not given.
	CarbonateAlkalinity float64

	// FreeCO2 is the free (dissolved) CO2 the laboratory reported, mol/kg of
	// water; NaN when not reported. It is a check on the carbonate system,
	// not a total.
	FreeCO2 float64

	// Density is the solution density, kg/L, given or estimated (see
	// DensityEstimated).
	Density          float64
	DensityEstimated bool
	// WaterPerLitre is the mass of water in one litre of solution, kg: the
	// factor from per-litre to per-kg-of-water units.
	WaterPerLitre float64

	// MeasuredTDS is the laboratory's total dissolved solids, mg/L; NaN when
	// not given. MeasuredConductivity is the specific conductance, µS/cm at
	// 25 °C; NaN when not given.
	MeasuredTDS          float64
	MeasuredConductivity float64

	// Other holds the laboratory's values that the equilibrium does not use
	// (turbidity, TOC, free chlorine …), as written, in file order; nil when
	// there are none. Read only. Total hardness and P-alkalinity are not
	// among them unless a cell is not a number: they are read as numbers.
	Other []OtherValue
	// TotalHardness and PAlkalinity are the reported total hardness and
	// P-alkalinity, mg/L as CaCO3, used only in data-quality checks; NaN
	// when not given (or for a transformed water).
	TotalHardness, PAlkalinity float64

	// Entered holds the analyte values as the laboratory reported them, in
	// their own units, in file order (nil for a transformed water).
	Entered []Measurement
	// Uncertainty holds the sample's own standard uncertainties as read
	// (see Sample.Uncertainty); nil when the file gives none. Read only.
	Uncertainty map[string]float64

	// BelowDetection lists the analytes reported below their detection limit
	// with the substitute value used, e.g. "Ba <0.01 mg/L taken as 0.005".
	BelowDetection []string
	// Warnings collects notes on the input that a reader should see.
	Warnings []string
}

// Clone returns a deep copy of a.
func (a Analysis) Clone() Analysis {
	b := a
	b.BelowDetection = append([]string(nil), a.BelowDetection...)
	b.Entered = append([]Measurement(nil), a.Entered...)
	b.Warnings = append([]string(nil), a.Warnings...)
	b.Other = append([]OtherValue(nil), a.Other...)
	return b
}

// Total returns the total of component c, mol/kg of water.
func (a Analysis) Total(c Component) float64 { return a.Totals[c] }

// MgPerLitre returns the total of c as mg/L of its ion form (Component.IonMass)
// in the solution.
func (a Analysis) MgPerLitre(c Component) float64 {
	return a.Totals[c] * a.WaterPerLitre * c.IonMass() * 1000
}

// WaterDensity returns the density of pure air-free water at 1 atm, kg/L, at
// t °C (0–100 °C).
//
// References: Kell, G.S. (1975) J. Chem. Eng. Data 20:97, eq. 16 (from memory;
// 0.99705 kg/L at 25 °C).
func WaterDensity(t float64) float64 {
	num := 999.83952 + 16.945176*t - 7.9870401e-3*t*t - 46.170461e-6*t*t*t +
		105.56302e-9*t*t*t*t - 280.54253e-12*t*t*t*t*t
	return num / (1 + 16.879850e-3*t) / 1000
}

// densitySlope is the rise of solution density with dissolved solids, kg/L
// per g/L. A single slope fitted to seawater (S = 35, 25 °C: 1.02334 kg/L,
// Millero & Poisson 1981, from memory) and 18 % w/w NaCl at 20 °C (1.1319
// kg/L, CRC Handbook, from memory) reproduces both within 0.5 %.
const densitySlope = 0.00068

// EstimateDensity returns the density, kg/L, of a water with tds g/L of
// dissolved solids at t °C: WaterDensity(t) + 0.00068·tds.
func EstimateDensity(tds, t float64) float64 { return WaterDensity(t) + densitySlope*tds }

// Measurement is one analyte value of a sample as read, before conversion.
type Measurement struct {
	Analyte *Analyte // shared by the measurements of one column of a file; read only
	Value   float64  // in Unit; for a below-detection value, the substitute
	Unit    Unit
	Column  string // the header or analyte name it came from
	// BelowDetection reports a "<x" value; Limit holds x.
	BelowDetection bool
	Limit          float64
}

// Sample is one row of a laboratory file: the raw measurements with their
// units and the physical fields, before conversion to mol/kg of water.
// Fields that were not given are NaN.
type Sample struct {
	Name          string
	Date          string
	Role          Role    // RoleUnset when the file gives none
	System        string  // the system (tower, RO train) the sample belongs to; "" when not given
	Temperature   float64 // °C
	PH            float64
	PHTemperature float64 // °C
	Density       float64 // kg/L
	TDS           float64 // mg/L
	Conductivity  float64 // µS/cm
	Pressure      float64 // atm
	Measurements  []Measurement
	// Other holds the cells of the columns the equilibrium does not use, in
	// file order; TotalHardness and PAlkalinity (mg/L as CaCO3; NaN when not
	// given) are read as numbers for data-quality checks instead.
	Other                      []OtherValue
	TotalHardness, PAlkalinity float64
	// Uncertainty holds the sample's own standard uncertainties, keyed by
	// UncertaintyKey ("Ca", "S", "alkalinity") or "pH" and "temperature":
	// a fraction of the value, pH units or °C; nil when none are given.
	Uncertainty map[string]float64
}

// NewSample returns a Sample with every physical field unset (NaN).
func NewSample(name string) Sample {
	nan := math.NaN()
	return Sample{Name: name, Temperature: nan, PH: nan, PHTemperature: nan,
		Density: nan, TDS: nan, Conductivity: nan, Pressure: nan, TotalHardness: nan, PAlkalinity: nan}
}

// Analysis converts the sample to mol/kg of water. Per-litre values are
// divided by the mass of water in a litre of solution, ρ − TDS/1000 (kg),
// where ρ is the given density or EstimateDensity; per-kg-of-solution values
// (ppm) by 1 − TDS/(1000ρ); molal values are kept. Because TDS itself depends
// on the conversion when units are mixed, the two are iterated to a fixed
// point. Alkalinity comes from a total-alkalinity analyte when one is given,
// else from the sum of HCO3, CO3 and OH.
func (s Sample) Analysis(forms *AnalyteTable) (Analysis, error) {
	return s.analysis(forms, append([]Measurement(nil), s.Measurements...))
}

// analysis is Analysis with entered as the analysis's Entered (a copy of
// s.Measurements, or the reader's own slice, which it hands over).
func (s Sample) analysis(forms *AnalyteTable, entered []Measurement) (Analysis, error) {
	a := Analysis{Name: s.Name, Date: s.Date, Uncertainty: s.Uncertainty, Role: s.Role, System: s.System, Temperature: s.Temperature, PH: s.PH,
		PHTemperature: s.PHTemperature, Pressure: s.Pressure,
		Alkalinity: math.NaN(), CarbonateAlkalinity: math.NaN(), FreeCO2: math.NaN(),
		MeasuredTDS: s.TDS, MeasuredConductivity: s.Conductivity,
		Other: s.Other, TotalHardness: s.TotalHardness, PAlkalinity: s.PAlkalinity,
		Entered: entered}
	if math.IsNaN(a.Temperature) {
		a.Temperature = 25
		a.Warnings = append(a.Warnings, "temperature not given: 25 °C assumed")
	}
	if math.IsNaN(a.PHTemperature) {
		a.PHTemperature = a.Temperature
	}
	if math.IsNaN(a.Pressure) {
		a.Pressure = 1
	}
	amounts, err := s.amounts(forms, &a)
	if err != nil {
		return Analysis{}, err
	}
	a.DensityEstimated = math.IsNaN(s.Density)
	a.Density, a.WaterPerLitre, err = waterPerLitre(amounts, s.Density, a.Temperature)
	if err != nil {
		return Analysis{}, err
	}
	a.addAmounts(amounts)
	return a, nil
}

// sampleAmount is one measurement of a sample as an amount of its component.
type sampleAmount struct {
	comp   string
	mol    float64 // component mol (eq for alkalinity) per basis
	basis  Basis
	mass   float64 // g of dissolved solid per mol of component, for TDS
	name   string
	column string // the header it came from
}

// amounts converts the measurements of s to amounts of their components
// and notes the values below detection in a.
func (s Sample) amounts(forms *AnalyteTable, a *Analysis) ([]sampleAmount, error) {
	amounts := make([]sampleAmount, 0, len(s.Measurements))
	for _, m := range s.Measurements {
		if m.Value < 0 {
			return nil, fmt.Errorf("%s: negative concentration %g", m.Column, m.Value)
		}
		mol, err := m.Unit.Amount(*m.Analyte, m.Value, forms)
		if err != nil {
			return nil, fmt.Errorf("%s: %w", m.Column, err)
		}
		mass := m.Analyte.FormMass / m.Analyte.PerForm
		if m.Analyte.IsAlkalinity() {
			// Weighed as HCO3 per equivalent for the density estimate.
			mass = 61.016
		}
		amounts = append(amounts, sampleAmount{m.Analyte.Component, mol, m.Unit.Basis, mass, m.Analyte.Name, m.Column})
		if m.BelowDetection {
			a.BelowDetection = append(a.BelowDetection,
				fmt.Sprintf("%s <%g %s taken as %g", m.Column, m.Limit, m.Unit.Text, m.Value))
		}
	}
	return amounts, nil
}

// MaxDissolvedSolids bounds the dissolved solids of a water, g/L: a
// water above it is bad input. Calcium chloride, the most soluble salt of
// natural brines, saturates at about 81 g per 100 g of water at 25 °C,
// some 650 g/L of solution; sodium chloride at 36 g per 100 g, about
// 320 g/L (CRC Handbook solubility tables, from memory). A water past 700
// g/L is beyond any of them by a wide margin: a unit or a decimal point is
// wrong.
const MaxDissolvedSolids = 700

// waterPerLitre returns the density rho (kg/L; the given density, or
// EstimateDensity when it is NaN) and the mass of water per litre of
// solution wpl = rho − TDS/1000 (kg), iterated with the TDS of amounts to
// a fixed point, at t °C.
func waterPerLitre(amounts []sampleAmount, density, t float64) (rho, wpl float64, err error) {
	rho = density
	estimated := math.IsNaN(rho)
	if estimated {
		rho = WaterDensity(t)
	}
	wpl = rho
	for iter := 0; iter < 50; iter++ {
		tds, most, largest := 0.0, 0.0, "" // g/L; the largest share and its column
		for _, am := range amounts {
			g := am.mol * am.mass * perLitre(am.basis, wpl, rho)
			tds += g
			if g > most {
				most, largest = g, am.column
			}
		}
		if estimated {
			rho = EstimateDensity(tds, t)
		}
		next := rho - tds/1000
		switch {
		case tds > MaxDissolvedSolids:
			return 0, 0, fmt.Errorf("column %q: dissolved solids of %.4g g/L (%.4g g/L from this column) are beyond any salt's solubility (at most %d g/L)",
				largest, tds, most, MaxDissolvedSolids)
		case next <= 0.05:
			return 0, 0, fmt.Errorf("column %q: dissolved solids of %.4g g/L (%.4g g/L from this column) leave no water in a litre of density %.4g kg/L",
				largest, tds, most, rho)
		}
		done := math.Abs(next-wpl) < 1e-12
		wpl = next
		if done {
			break
		}
	}
	return rho, wpl, nil
}

// addAmounts adds amounts to the totals of a (mol/kg of water, with a's
// density and water per litre), keeps free CO2 apart, and sets the
// alkalinity: the total-alkalinity analyte when given (with a warning when
// HCO3 + CO3 + OH disagree by more than 10 %), else their sum.
func (a *Analysis) addAmounts(amounts []sampleAmount) {
	var totalAlk, sumAlk, carbAlk float64
	haveTotalAlk, haveSumAlk, haveCarb := false, false, false
	wpl, rho := a.WaterPerLitre, a.Density
	for _, am := range amounts {
		molal := am.mol * perLitre(am.basis, wpl, rho) / wpl
		if am.comp == "Alk" {
			switch am.name {
			case "alkalinity":
				totalAlk += molal
				haveTotalAlk = true
			case "CO3":
				carbAlk += molal
				haveCarb = true
				sumAlk += molal
				haveSumAlk = true
			default:
				sumAlk += molal
				haveSumAlk = true
			}
			continue
		}
		if am.name == "CO2" {
			// Free CO2 is a part of inorganic carbon, not its total:
			// kept for a consistency check once pH fixes the carbon.
			a.FreeCO2 = molal
			continue
		}
		c, _ := ParseComponent(am.comp)
		a.Totals[c] += molal
		a.Measured[c] = true
		if c == C {
			a.CarbonKnown = true
		}
	}
	switch {
	case haveTotalAlk:
		a.Alkalinity = totalAlk
		if haveSumAlk && math.Abs(sumAlk-totalAlk) > 0.1*totalAlk+1e-5 {
			a.Warnings = append(a.Warnings, fmt.Sprintf(
				"total alkalinity (%.3g meq/kg) and HCO3+CO3+OH (%.3g meq/kg) disagree by more than 10 %%; total alkalinity used",
				1000*totalAlk, 1000*sumAlk))
		}
	case haveSumAlk:
		a.Alkalinity = sumAlk
	}
	if haveCarb {
		a.CarbonateAlkalinity = carbAlk
	}
}

// perLitre returns the factor from an amount per basis to the amount per
// litre of solution, given the water mass per litre wpl (kg) and density rho
// (kg/L).
func perLitre(b Basis, wpl, rho float64) float64 {
	switch b {
	case PerKgSolution:
		return rho
	case PerKgWater:
		return wpl
	}
	return 1
}

// MeqPerLitre returns the equivalents of component c per litre of
// solution, meq/L, counting c as the ion of Component.Charge (0 for C, Si,
// P and B).
func (a Analysis) MeqPerLitre(c Component) float64 {
	return math.Abs(c.Charge()) * a.Totals[c] * a.WaterPerLitre * 1000
}

// AlkalinityAsCaCO3 returns the total alkalinity in mg/L as CaCO3; NaN
// when it is not known.
func (a Analysis) AlkalinityAsCaCO3() float64 {
	return AsCaCO3(a.Alkalinity * a.WaterPerLitre)
}
