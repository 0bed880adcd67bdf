package water

import "strings"

// Component is a chemical component whose total a water carries, keyed in
// output by its element symbol.
type Component int

// The components of a water. C is total inorganic carbon, S is sulfate
// sulfur, N is nitrate nitrogen, P is orthophosphate phosphorus, Fe and Mn are
// the divalent metals. Br, I and Li are bromide, iodide and lithium; NH4 is
// total ammonia nitrogen (NH4⁺ + NH3), counted as NH4⁺ in the balances.
const (
	Ca Component = iota
	Mg
	Na
	K
	Ba
	Sr
	Fe
	Mn
	Cl
	S
	C
	Si
	P
	F
	N
	B
	Br
	I
	Li
	NH4
	NumComponents
)

var componentSymbols = [NumComponents]string{
	Ca: "Ca", Mg: "Mg", Na: "Na", K: "K", Ba: "Ba", Sr: "Sr", Fe: "Fe", Mn: "Mn",
	Cl: "Cl", S: "S", C: "C", Si: "Si", P: "P", F: "F", N: "N", B: "B",
	Br: "Br", I: "I", Li: "Li", NH4: "NH4",
}

// componentCharge is the charge of the ion a component is usually counted as
// in an ion balance: the free cation, chloride, sulfate, nitrate, fluoride,
// bromide, iodide, ammonium (at the pH of natural waters NH4⁺ is over 90 %
// of total ammonia below pH 8.2).
// Carbon is counted through alkalinity, and Si, P and B carry no charge in the
// balance (at the pH of natural waters they are mostly neutral or reported as
// such by laboratories).
var componentCharge = [NumComponents]float64{
	Ca: 2, Mg: 2, Na: 1, K: 1, Ba: 2, Sr: 2, Fe: 2, Mn: 2,
	Cl: -1, S: -2, F: -1, N: -1,
	Br: -1, I: -1, Li: 1, NH4: 1,
}

// componentMass is the molar mass in g/mol of the ion each component is
// weighed as in a total of dissolved solids: the element for metals and
// halides, SO4, NO3, SiO2, PO4, B, NH4; inorganic carbon is weighed through
// alkalinity instead (see TDS). IUPAC 2021 abridged standard atomic weights
// (Prohaska et al. 2022, Pure Appl. Chem. 94:573).
var componentMass = [NumComponents]float64{
	Ca: 40.078, Mg: 24.305, Na: 22.990, K: 39.098, Ba: 137.33, Sr: 87.62, Fe: 55.845, Mn: 54.938,
	Cl: 35.45, S: 96.06, C: 12.011, Si: 60.083, P: 94.970, F: 18.998, N: 62.004, B: 10.81,
	Br: 79.904, I: 126.90, Li: 6.94, NH4: 18.039,
}

// String returns the element symbol of c, as used for JSON keys.
func (c Component) String() string {
	if c < 0 || c >= NumComponents {
		return "Component(?)"
	}
	return componentSymbols[c]
}

// Charge returns the charge of the ion c is counted as in an ion balance
// (0 for C, Si, P and B).
func (c Component) Charge() float64 { return componentCharge[c] }

// IonMass returns the molar mass in g/mol of the form c is weighed as in a
// sum of dissolved solids (SO4 for S, NO3 for N, SiO2 for Si, PO4 for P, NH4
// for NH4).
func (c Component) IonMass() float64 { return componentMass[c] }

// ParseComponent returns the component with element symbol sym, matched
// without regard to case.
func ParseComponent(sym string) (Component, bool) {
	for i, s := range componentSymbols {
		if strings.EqualFold(s, sym) {
			return Component(i), true
		}
	}
	return 0, false
}

// Components returns every component in a fixed order.
func Components() []Component {
	cs := make([]Component, NumComponents)
	for i := range cs {
		cs[i] = Component(i)
	}
	return cs
}
