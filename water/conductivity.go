package water

import (
	"fmt"
	"math"
	"strings"
	"sync"

	"scalerisk/data"
)

// The conductivity calculated from the composition for the quality checks
// (Analysis.Quality): the limiting equivalent conductivities of
// data/conductivity.csv with the Debye–Hückel–Onsager correction.

// onsagerA and onsagerB are the coefficients of the Onsager limiting law
// Λ = Λ° − (A + B·Λ°)·√c for a 1:1 electrolyte in water at 25 °C: A, the
// electrophoretic term, in S·cm²·eq⁻¹·(mol/L)^-½; B, the relaxation term,
// in (mol/L)^-½. Values as quoted in physical-chemistry texts (Robinson and
// Stokes 1959, ch. 7; from memory).
const (
	onsagerA = 60.20
	onsagerB = 0.2289
)

// ionSums accumulates the ions of one sign for onsagerConductivity.
type ionSums struct {
	eq       float64 // Σ|z|·c, meq/L
	eqCharge float64 // Σz²·c, meq/L: the equivalents weighted by |z|
	kappa0   float64 // Σλ°·|z|·c, µS/cm: the conductivity at infinite dilution
}

// add counts an ion of charge z, limiting equivalent conductivity lambda0
// (S·cm²/eq) and eq meq/L.
func (s *ionSums) add(lambda0, z, eq float64) {
	s.eq += eq
	s.eqCharge += math.Abs(z) * eq
	s.kappa0 += lambda0 * eq
}

// onsagerConductivity returns the specific conductance, µS/cm at 25 °C, of
// a solution of the free ions in cations and anions (no ion pairs). The
// method:
//
//	κ = κ° − (A/2)·f·Σ|zᵢ|²cᵢ − R·κ°,   f = √I/(1 + √I),
//	R = B·z₊z₋·[g(q)/g(½)]·f,           g(q) = q/(1 + √q),
//	q = z₊z₋/(z₊ + z₋) · (λ₊ + λ₋)/(z₋λ₊ + z₊λ₋),
//
// with cᵢ in mmol/L (so that κ is in µS/cm), κ° = Σλ°ᵢ·|zᵢ|·cᵢ,
// I = ½Σzᵢ²cᵢ/1000 in mol/L, and A = 60.20, B = 0.2289 the 1:1 coefficients
// of the Onsager limiting law at 25 °C (onsagerA, onsagerB).
// The second term is the electrophoretic effect: each ion loses
// |zᵢ|·(A/2)·f of its equivalent conductivity. The third is the relaxation
// effect: every ion loses the same fraction R. For a single salt of charges
// z₊, z₋ and limiting conductivities λ₊, λ₋ this is the Onsager equation for
// a binary electrolyte with its q factor (Robinson and Stokes 1959, ch. 7),
// written in √I, and reduces to Λ = Λ° − (A + B·Λ°)·f for a 1:1 salt. The
// factor 1/(1 + κa) of the Debye–Hückel–Onsager theory for ions of finite
// size is taken with κa = √I (a ≈ 3 Å, the choice of the Güntelberg and
// Davies activity equations). A mixture is treated as one binary electrolyte
// whose z₊, z₋, λ₊, λ₋ are the equivalent-weighted means of its cations and
// of its anions: that reduction is ours, not a published mixing rule. When
// one side has no ions it takes the other side's means. The result is
// floored at 0, which only far beyond the method's range is reached.
//
// References: Onsager, L. (1927) Phys. Z. 28:277 (from memory); Robinson, R.A. and Stokes,
// R.H. (1959) Electrolyte Solutions, 2nd ed., Butterworths, ch. 7 (the
// binary-electrolyte equation, q, and the 1:1 coefficients at 25 °C; from
// memory).
func onsagerConductivity(cations, anions ionSums) float64 {
	kappa0 := cations.kappa0 + anions.kappa0
	if cations.eq+anions.eq == 0 {
		return 0
	}
	ionicMolar := (cations.eqCharge + anions.eqCharge) / 2000
	sqrtI := math.Sqrt(ionicMolar)
	f := sqrtI / (1 + sqrtI)
	electrophoretic := onsagerA / 2 * f * (cations.eqCharge + anions.eqCharge)

	if cations.eq == 0 {
		cations = anions
	}
	if anions.eq == 0 {
		anions = cations
	}
	zPlus, zMinus := cations.eqCharge/cations.eq, anions.eqCharge/anions.eq
	lambdaPlus, lambdaMinus := cations.kappa0/cations.eq, anions.kappa0/anions.eq
	q := zPlus * zMinus / (zPlus + zMinus) * (lambdaPlus + lambdaMinus) / (zMinus*lambdaPlus + zPlus*lambdaMinus)
	g := func(q float64) float64 { return q / (1 + math.Sqrt(q)) }
	relaxation := onsagerB * zPlus * zMinus * g(q) / g(0.5) * f * kappa0

	return math.Max(kappa0-electrophoretic-relaxation, 0)
}

// conductivityTable holds the limiting equivalent conductivities of
// data/conductivity.csv, S·cm²/eq at 25 °C.
type conductivityTable struct {
	component                                   [NumComponents]float64
	bicarbonate, carbonate, hydroxide, hydrogen float64
}

type conductivityRow struct {
	Ion       string  `csv:"ion"`
	Component string  `csv:"component"`
	Charge    float64 `csv:"charge"`
	Lambda    float64 `csv:"lambda_25"`
	Source    string  `csv:"source"`
}

var defaultConductivities = sync.OnceValues(func() (*conductivityTable, error) {
	var rows []conductivityRow
	if err := data.Unmarshal("conductivity.csv", &rows); err != nil {
		return nil, err
	}
	t := &conductivityTable{}
	var seen [NumComponents]bool
	for _, row := range rows {
		if row.Lambda <= 0 || strings.TrimSpace(row.Source) == "" {
			return nil, fmt.Errorf("data/conductivity.csv: ion %q: conductivity must be positive and sourced", row.Ion)
		}
		if row.Component != "" {
			c, ok := ParseComponent(row.Component)
			if !ok {
				return nil, fmt.Errorf("data/conductivity.csv: ion %q: unknown component %q", row.Ion, row.Component)
			}
			if row.Charge != c.Charge() {
				return nil, fmt.Errorf("data/conductivity.csv: ion %q: charge %g, component %s counts %g", row.Ion, row.Charge, c, c.Charge())
			}
			t.component[c], seen[c] = row.Lambda, true
			continue
		}
		switch row.Ion {
		case "HCO3[-]":
			t.bicarbonate = row.Lambda
		case "CO3[2-]":
			t.carbonate = row.Lambda
		case "OH[-]":
			t.hydroxide = row.Lambda
		case "H[+]":
			t.hydrogen = row.Lambda
		default:
			return nil, fmt.Errorf("data/conductivity.csv: ion %q has no component", row.Ion)
		}
	}
	for _, c := range Components() {
		if c.Charge() != 0 && !seen[c] {
			return nil, fmt.Errorf("data/conductivity.csv: no conductivity for component %s", c)
		}
	}
	if t.bicarbonate == 0 || t.carbonate == 0 || t.hydroxide == 0 || t.hydrogen == 0 {
		return nil, fmt.Errorf("data/conductivity.csv: HCO3[-], CO3[2-], OH[-] and H[+] are required")
	}
	return t, nil
})

// conductivities returns the embedded conductivity table; a broken table is
// a programmer's mistake.
func conductivities() *conductivityTable {
	t, err := defaultConductivities()
	if err != nil {
		panic("water: embedded conductivity table is broken: " + err.Error())
	}
	return t
}

// LimitingConductivity returns λ°, the limiting equivalent conductivity at
// 25 °C in S·cm²/eq, of the ion named as in data/conductivity.csv ("Na[+]",
// "Ca[2+]" for ½Ca²⁺, "HCO3[-]"), and false when the table has no such ion.
//
// References: CRC Handbook of Chemistry and Physics, "Equivalent conductivity
// of ions at infinite dilution"; Robinson, R.A. and Stokes, R.H. (1959)
// Electrolyte Solutions, App. 6.2 (both from memory).
func LimitingConductivity(ion string) (float64, bool) {
	t := conductivities()
	switch ion {
	case "HCO3[-]":
		return t.bicarbonate, true
	case "CO3[2-]":
		return t.carbonate, true
	case "OH[-]":
		return t.hydroxide, true
	case "H[+]":
		return t.hydrogen, true
	}
	for _, c := range Components() {
		if c.Charge() == 0 {
			continue
		}
		if ion == conductivityIonName(c) {
			return t.component[c], true
		}
	}
	return 0, false
}

// conductivityIonName is the species name of component c's ion.
func conductivityIonName(c Component) string {
	name := c.String()
	switch c {
	case S:
		name = "SO4"
	case N:
		name = "NO3"
	}
	z := c.Charge()
	sign := "+"
	if z < 0 {
		sign = "-"
	}
	if math.Abs(z) == 1 {
		return name + "[" + sign + "]"
	}
	return fmt.Sprintf("%s[%g%s]", name, math.Abs(z), sign)
}
