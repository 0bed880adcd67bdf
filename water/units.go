package water

import (
	"fmt"
	"math"
	"strings"
)

// Quantity is what a column measures.
type Quantity int

// The quantities a column may hold.
const (
	Concentration Quantity = iota // an analyte, per litre, per kg of solution or per kg of water
	Temperature                   // °C, °F or K
	Conductivity                  // µS/cm, mS/cm, dS/m
	Density                       // kg/L, g/mL, g/cm3, kg/m3
	Dimensionless                 // pH
)

// Basis is what a concentration is counted per.
type Basis int

// The bases of concentration units.
const (
	PerLitre      Basis = iota // per litre of solution (mg/L, mmol/L, meq/L)
	PerKgSolution              // per kg of solution (ppm = mg/kg, ppb)
	PerKgWater                 // per kg of water (molality: mol/kg, mmol/kg)
)

type amountKind int

const (
	byMass amountKind = iota
	byMole
	byEquivalent
)

// Unit is a parsed unit of the trade, as written in a column header
// ("mg/L", "mg/L as CaCO3", "mmol/kg", "µS/cm", "°F").
type Unit struct {
	Text     string   // the unit as written
	Quantity Quantity // what it measures
	Basis    Basis    // for concentrations
	As       string   // the form in "mg/L as X" ("CaCO3", "N", "SiO2"); empty when none
	amount   amountKind
	scale    float64 // to g, mol or eq (concentrations), µS/cm or kg/L
	tempUnit byte    // 'C', 'F' or 'K' for temperatures
	// form caches, for a reader's column, the form of As resolved in one
	// table for one component (see withForm): Amount then skips the lookup.
	form resolvedForm
}

// resolvedForm is a form of "mg/L as X" looked up once (table nil when
// none was).
type resolvedForm struct {
	table             *AnalyteTable
	component         string
	formMass, perForm float64
}

// withForm returns u with the form of u.As for component comp looked up in
// forms, so that Amount with the same table and component does not search
// it again (a reader's column converts every row with one unit).
func (u Unit) withForm(comp string, forms *AnalyteTable) Unit {
	if u.As == "" || u.amount != byMass {
		return u
	}
	if form, ok := forms.FormOf(comp, u.As); ok {
		u.form = resolvedForm{table: forms, component: comp, formMass: form.FormMass, perForm: form.PerForm}
	}
	return u
}

// UnitError reports a unit that is not recognised.
type UnitError struct{ Unit string }

func (e *UnitError) Error() string {
	return fmt.Sprintf("unknown unit %q (try mg/L, µg/L, g/L, ppm, mmol/L, meq/L, mol/kg, mg/L as CaCO3, °C, °F, µS/cm)", e.Unit)
}

var massScale = map[string]float64{"g": 1, "mg": 1e-3, "ug": 1e-6, "µg": 1e-6, "μg": 1e-6, "ng": 1e-9, "kg": 1e3}
var moleScale = map[string]float64{"mol": 1, "mmol": 1e-3, "umol": 1e-6, "µmol": 1e-6, "μmol": 1e-6}
var equivScale = map[string]float64{"eq": 1, "meq": 1e-3, "ueq": 1e-6, "µeq": 1e-6, "μeq": 1e-6}

// ParseUnit parses a unit as written in a header bracket. Case, spaces and
// the degree sign are forgiven; "ppm" is mg/kg of solution, "ppb" µg/kg;
// "M" and "mM" are mol/L and mmol/L.
func ParseUnit(text string) (Unit, error) {
	s := strings.TrimSpace(text)
	low := strings.ToLower(s)
	low = strings.ReplaceAll(low, "°", "")
	low = strings.ReplaceAll(low, "º", "")
	if u, ok := namedUnit(text, strings.ReplaceAll(low, " ", "")); ok {
		return u, nil
	}
	return ratioUnit(text, s, low)
}

// namedUnit returns the unit of a name without a fraction bar (temperature,
// density, pH) or with a fixed meaning (ppm, M); compact is the name in
// lower case without spaces or degree signs.
func namedUnit(text, compact string) (Unit, bool) {
	u := Unit{Text: text}
	switch compact {
	case "c", "degc", "celsius":
		u.Quantity, u.tempUnit = Temperature, 'C'
		return u, true
	case "f", "degf", "fahrenheit":
		u.Quantity, u.tempUnit = Temperature, 'F'
		return u, true
	case "k", "kelvin":
		u.Quantity, u.tempUnit = Temperature, 'K'
		return u, true
	case "us/cm", "µs/cm", "μs/cm", "umho/cm", "µmho/cm", "μmho/cm":
		u.Quantity, u.scale = Conductivity, 1
		return u, true
	case "ms/cm", "mmho/cm", "ds/m":
		u.Quantity, u.scale = Conductivity, 1000
		return u, true
	case "ms/m":
		u.Quantity, u.scale = Conductivity, 10
		return u, true
	case "kg/l", "g/ml", "g/cm3", "g/cc", "kg/dm3":
		u.Quantity, u.scale = Density, 1
		return u, true
	case "kg/m3", "g/l(density)":
		u.Quantity, u.scale = Density, 1e-3
		return u, true
	case "", "-", "su", "ph", "phunits", "stdunits":
		u.Quantity, u.scale = Dimensionless, 1
		return u, true
	case "m":
		u.Quantity, u.amount, u.scale, u.Basis = Concentration, byMole, 1, PerLitre
		return u, true
	case "mm":
		u.Quantity, u.amount, u.scale, u.Basis = Concentration, byMole, 1e-3, PerLitre
		return u, true
	case "ppm":
		u.Quantity, u.amount, u.scale, u.Basis = Concentration, byMass, 1e-3, PerKgSolution
		return u, true
	case "ppb":
		u.Quantity, u.amount, u.scale, u.Basis = Concentration, byMass, 1e-6, PerKgSolution
		return u, true
	}
	return Unit{}, false
}

// ratioUnit parses "<amount>/<basis>[ as <form>]"; s is text trimmed and
// low its lower-case form without degree signs.
func ratioUnit(text, s, low string) (Unit, error) {
	u := Unit{Text: text}
	main, as, _ := strings.Cut(low, " as ")
	if as != "" {
		u.As = strings.TrimSpace(s[len(s)-len(as):])
		if u.As == "" {
			return Unit{}, &UnitError{text}
		}
	}
	main = strings.ReplaceAll(main, " ", "")
	num, den, ok := strings.Cut(main, "/")
	if !ok {
		return Unit{}, &UnitError{text}
	}
	u.Quantity = Concentration
	switch {
	case massScale[num] != 0:
		u.amount, u.scale = byMass, massScale[num]
	case moleScale[num] != 0:
		u.amount, u.scale = byMole, moleScale[num]
	case equivScale[num] != 0:
		u.amount, u.scale = byEquivalent, equivScale[num]
	default:
		return Unit{}, &UnitError{text}
	}
	switch den {
	case "l":
	case "ml":
		u.scale *= 1e3
	case "kg", "kgsolution", "kgsoln":
		u.Basis = PerKgSolution
	case "kgw", "kgh2o", "kgwater":
		u.Basis = PerKgWater
	default:
		return Unit{}, &UnitError{text}
	}
	// Molal units are per kg of water by convention; mass per kg is ppm-like
	// (per kg of solution).
	if den == "kg" && u.amount != byMass {
		u.Basis = PerKgWater
	}
	if u.As != "" && u.amount != byMass {
		return Unit{}, &UnitError{text}
	}
	return u, nil
}

// ToCelsius converts a temperature v in unit u to °C.
func (u Unit) ToCelsius(v float64) float64 {
	switch u.tempUnit {
	case 'F':
		return (v - 32) * 5 / 9
	case 'K':
		return v - 273.15
	}
	return v
}

// ToMicroSiemens converts a conductivity v in unit u to µS/cm.
func (u Unit) ToMicroSiemens(v float64) float64 { return v * u.scale }

// ToKgPerLitre converts a density v in unit u to kg/L.
func (u Unit) ToKgPerLitre(v float64) float64 { return v * u.scale }

// EquivalentMassCaCO3 is the mass of CaCO3 per equivalent, g/eq (mg per
// meq): the factor of the trade's "mg/L as CaCO3";
// 100.086/2 from IUPAC 2021 abridged atomic weights.
const EquivalentMassCaCO3 = 50.043

// AsCaCO3 converts eq equivalents per litre (of alkalinity, hardness or
// any charge) into the trade's mg/L as CaCO3: eq × 1000 × EquivalentMassCaCO3.
// Every "as CaCO3" figure of the program goes through it.
func AsCaCO3(eq float64) float64 { return eq * 1000 * EquivalentMassCaCO3 }

// Amount converts a concentration v of analyte a in unit u into moles of
// a's component (equivalents for alkalinity) per u.Basis. "as CaCO3" counts
// equivalents (v / 50.043 g/eq) divided by the form's charge; "as X" with X a
// form of the same component ("N", "SiO2") weighs v as that form.
func (u Unit) Amount(a Analyte, v float64, forms *AnalyteTable) (float64, error) {
	if u.Quantity != Concentration {
		return 0, fmt.Errorf("unit %q is not a concentration", u.Text)
	}
	x := v * u.scale
	switch u.amount {
	case byMole:
		return x * a.PerForm, nil
	case byEquivalent:
		if a.IsAlkalinity() {
			return x, nil
		}
		if a.Charge == 0 {
			return 0, fmt.Errorf("unit %q needs a charged form; %s is reported neutral", u.Text, a.Name)
		}
		return x / math.Abs(a.Charge) * a.PerForm, nil
	}
	// by mass
	if u.As == "" {
		return x / a.FormMass * a.PerForm, nil
	}
	if strings.EqualFold(strings.ReplaceAll(u.As, " ", ""), "CaCO3") {
		eq := x / EquivalentMassCaCO3
		if a.IsAlkalinity() {
			return eq, nil
		}
		if a.Charge == 0 {
			return 0, fmt.Errorf("unit %q needs a charged form; %s is reported neutral", u.Text, a.Name)
		}
		return eq / math.Abs(a.Charge) * a.PerForm, nil
	}
	if f := &u.form; f.table == forms && f.table != nil && f.component == a.Component {
		return x / f.formMass * f.perForm, nil
	}
	form, ok := forms.FormOf(a.Component, u.As)
	if !ok {
		return 0, fmt.Errorf("unit %q: %s cannot be reported as %s", u.Text, a.Name, u.As)
	}
	return x / form.FormMass * form.PerForm, nil
}
