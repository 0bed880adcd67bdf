package saturation

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"scalerisk/water"
)

// ActivityModel names a model of single-ion activity coefficients.
type ActivityModel int

// The activity models. Auto is the Pitzer model set for every water, with
// the ion-association set only where it does not solve (see
// Speciator.Speciate).
const (
	Auto           ActivityModel = iota
	Davies                       // Davies (1962), 0.3 I
	TruesdellJones               // Truesdell & Jones (1974) extended Debye–Hückel with ion-specific b
	BDot                         // Helgeson (1969) B-dot
	Pitzer                       // Pitzer specific-interaction model for brines, HMW84 form (pitzer.go)
)

var modelNames = [...]string{"auto", "davies", "truesdell-jones", "bdot", "pitzer"}

func (m ActivityModel) String() string { return modelNames[m] }

// ParseActivityModel parses "auto", "davies", "truesdell-jones" (or
// "tj"), "bdot" (or "b-dot") and "pitzer".
func ParseActivityModel(s string) (ActivityModel, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "auto":
		return Auto, nil
	case "davies":
		return Davies, nil
	case "truesdell-jones", "tj", "truesdelljones":
		return TruesdellJones, nil
	case "bdot", "b-dot":
		return BDot, nil
	case "pitzer":
		return Pitzer, nil
	}
	return Auto, fmt.Errorf("unknown activity model %q (want davies, truesdell-jones, bdot or pitzer)", s)
}

// Validity limits of the models, ionic strength in mol/kg. Beyond them a
// result carries a warning.
//
// References: Davies: about 0.5 mol/kg at most (Stumm & Morgan 1996, from
// memory); Truesdell–Jones: to about 2 mol/kg in NaCl-dominated waters
// (Truesdell & Jones 1974, from memory); B-dot: to about 1 mol/kg
// (Helgeson 1969, from memory); Pitzer (the HMW84 set of data/pitzer.csv):
// checked against single-salt tables to 6 mol/kg (pitzer_test.go), so up
// to NaCl saturation (6.1 mol/kg) without a warning.
var modelLimit = map[ActivityModel]float64{Davies: 0.5, TruesdellJones: 2, BDot: 1, Pitzer: 6.2}

// pitzerCoverage is the share of a water's stoichiometric ionic strength
// that components outside the Pitzer parameter set may carry before a
// result under the automatic model says so: beyond a quarter their
// ion-association activity coefficients, and the missing interactions
// between them and the major ions, move the others' coefficients noticeably
// (a judgement, not a published limit).
const pitzerCoverage = 0.25

// outsideShare returns the share of the stoichiometric ionic strength
// ½Σz²m of component totals tot (mol/kg) carried by the components in
// outside. Each component counts as the ion of an ion balance
// (water.Component.Charge), inorganic carbon as hydrogencarbonate (charge
// 1): the ionic strength before ion pairing, a property of the water
// independent of any activity model.
func outsideShare(tot func(water.Component) float64, outside []water.Component) float64 {
	var all, out float64
	for c := range water.NumComponents {
		z := c.Charge()
		if c == water.C {
			z = 1
		}
		v := tot(c) * z * z / 2
		if math.IsNaN(v) || v <= 0 {
			continue
		}
		all += v
		if slices.Contains(outside, c) {
			out += v
		}
	}
	if all <= 0 {
		return 0
	}
	return out / all
}

// Permittivity returns the relative permittivity of water at 1 atm and
// t °C (0–100 °C).
//
// References: Malmberg, C.G. and Maryott, A.A. (1956) J. Res. NBS 56:1,
// ε = 87.740 − 0.40008 t + 9.398e−4 t² − 1.410e−6 t³ (from memory).
func Permittivity(t float64) float64 {
	return 87.740 - 0.40008*t + 9.398e-4*t*t - 1.410e-6*t*t*t
}

// DebyeHuckel returns the Debye–Hückel constants A (kg^½ mol^−½, log10
// basis) and B (kg^½ mol^−½ Å⁻¹) at t °C, from the density
// (water.WaterDensity, Kell 1975) and permittivity (Permittivity, Malmberg &
// Maryott 1956) of water: A = 1.82483e6 ρ^½ (εT)^−3/2, B = 50.2916 ρ^½ (εT)^−½.
// A(25 °C) = 0.5108, B(25 °C) = 0.3287.
//
// References: the constants 1.82483e6 and 50.2916 follow from the CODATA
// fundamental constants (e.g. Helgeson & Kirkham 1974, Am. J. Sci. 274:1089).
func DebyeHuckel(t float64) (A, B float64) {
	rho := water.WaterDensity(t)
	eT := Permittivity(t) * (t + 273.15)
	A = 1.82483e6 * math.Sqrt(rho) / math.Pow(eT, 1.5)
	B = 50.2916 * math.Sqrt(rho) / math.Sqrt(eT)
	return A, B
}

// BDotParameter returns Helgeson's ion-independent Ḃ, kg/mol, at t °C,
// interpolated linearly in the table 0 °C 0.038, 25 °C 0.041, 50 °C 0.043,
// 100 °C 0.046, 150 °C 0.047 and held constant outside it.
//
// References: Helgeson, H.C. (1969) Am. J. Sci. 267:729 (from memory; the
// 0 °C value is uncertain).
func BDotParameter(t float64) float64 {
	ts := [...]float64{0, 25, 50, 100, 150}
	bs := [...]float64{0.038, 0.041, 0.043, 0.046, 0.047}
	if t <= ts[0] {
		return bs[0]
	}
	for i := 1; i < len(ts); i++ {
		if t <= ts[i] {
			f := (t - ts[i-1]) / (ts[i] - ts[i-1])
			return bs[i-1] + f*(bs[i]-bs[i-1])
		}
	}
	return bs[len(bs)-1]
}

// neutralSaltingOut is the Setchénow coefficient k of log γ = k·I for
// neutral aqueous species (a common simple choice, from memory).
const neutralSaltingOut = 0.1

// defaultIonSize is the ion size, Å, used for an ion the table gives none
// for (most ion pairs): 4 Å, the commonest Kielland (1937) class.
const defaultIonSize = 4.0

// activityParams holds what a model needs of one species.
type activityParams struct {
	z, z2   float64
	size    float64 // å, Å
	tjB     float64
	hasTJ   bool
	neutral bool
}

// dhConstants holds the temperature-dependent constants of one evaluation.
type dhConstants struct {
	A, B, Bdot float64
}

func newDHConstants(t float64) dhConstants {
	A, B := DebyeHuckel(t)
	return dhConstants{A: A, B: B, Bdot: BDotParameter(t)}
}

// logGamma returns log10 γ of a species under model m at ionic strength I:
// the value of logGammaDeriv, the one definition of the equations.
func logGamma(m ActivityModel, p *activityParams, c dhConstants, I, sqrtI float64) float64 {
	lg, _ := logGammaDeriv(m, p, c, I, sqrtI)
	return lg
}

// logGammaDeriv returns log10 γ of a species under model m at ionic strength
// I and its derivative with respect to I, kg/mol (the solver's Jacobian uses
// it). Below √I = 1e-10 both are taken at √I = 1e-10, where the derivative
// of the √I terms is finite.
//
// References:
//
//	Davies (1962): log γ = −A z² (√I/(1+√I) − 0.3 I)
//	Truesdell & Jones (1974): log γ = −A z² √I/(1 + B a √I) + b I
//	Helgeson (1969) B-dot: log γ = −A z² √I/(1 + B å √I) + Ḃ I
//
// Neutral species: log γ = 0.1 I in every model. Under Truesdell–Jones an
// ion without published a and b takes the B-dot form with its Kielland
// size (or 4 Å).
func logGammaDeriv(m ActivityModel, p *activityParams, c dhConstants, I, sqrtI float64) (lg, dlg float64) {
	if p.neutral {
		return neutralSaltingOut * I, neutralSaltingOut
	}
	if sqrtI < 1e-10 {
		sqrtI = 1e-10
	}
	switch m {
	case Davies:
		d := 1 + sqrtI
		return -c.A * p.z2 * (sqrtI/d - 0.3*I), -c.A * p.z2 * (1/(2*sqrtI*d*d) - 0.3)
	case TruesdellJones:
		if p.hasTJ {
			d := 1 + c.B*p.size*sqrtI
			return -c.A*p.z2*sqrtI/d + p.tjB*I, -c.A*p.z2/(2*sqrtI*d*d) + p.tjB
		}
	}
	d := 1 + c.B*p.size*sqrtI
	return -c.A*p.z2*sqrtI/d + c.Bdot*I, -c.A*p.z2/(2*sqrtI*d*d) + c.Bdot
}

// waterActivity returns the activity of water from the sum of molalities of
// solute species, mol/kg: a_w = 1 − 0.017 Σm.
//
// References: Garrels, R.M. and Christ, C.L. (1965) Solutions, Minerals and
// Equilibria (from memory).
func waterActivity(sumM float64) float64 {
	return math.Max(1-waterActivitySlope*sumM, waterActivityFloor)
}

// waterActivitySlope is the 0.017 of a_w = 1 − 0.017 Σm; waterActivityFloor
// keeps a_w positive far beyond the range of the ion-association models.
const (
	waterActivitySlope = 0.017
	waterActivityFloor = 0.05
)
