package water_test

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"scalerisk/water"
)

// csvUnitCase is one conversion of a handbook: value in unit of analyte
// is want (mol, or eq for alkalinity) of the component per basis.
type csvUnitCase struct {
	analyte, unit string
	value         float64
	want          float64
	basis         water.Basis
	tol           float64 // relative
	source        string
}

// TestCSVUnitHandbook checks ParseUnit and Unit.Amount against the
// equivalences of water-analysis handbooks.
func TestCSVUnitHandbook(t *testing.T) {
	const exact = 1e-12
	cases := []csvUnitCase{
		{"alkalinity", "mg/L as CaCO3", 50.04, 1e-3, water.PerLitre, 1e-3, "Standard Methods 2320 B: 1 meq/L = 50.04 mg/L as CaCO3 (from memory)"},
		{"alkalinity", "mg/l as caco3", 100.086, 2e-3, water.PerLitre, exact, "CaCO3/2 = 50.043 g/eq, IUPAC 2021 abridged atomic weights (Prohaska et al. 2022)"},
		{"alkalinity", "meq/L", 1, 1e-3, water.PerLitre, exact, "definition"},
		{"Ca", "mg/L", 40.08, 1e-3, water.PerLitre, 1e-4, "Ca 40.078 g/mol, IUPAC 2021 abridged (from memory)"},
		{"Ca", "meq/L", 2, 1e-3, water.PerLitre, exact, "definition: Ca2+ carries 2 eq/mol"},
		{"Ca", "mmol/L", 1, 1e-3, water.PerLitre, exact, "definition"},
		{"Ca", "mM", 1, 1e-3, water.PerLitre, exact, "definition"},
		{"Ca", "mg/L as CaCO3", 100, 40.04e-3 / 40.078, water.PerLitre, 5e-4, "Standard Methods 2340 B: Ca as CaCO3 = 2.497 × Ca (from memory)"},
		{"Mg", "mg/L as CaCO3", 100, 24.28e-3 / 24.305, water.PerLitre, 5e-4, "Standard Methods 2340 B: Mg as CaCO3 = 4.118 × Mg (from memory)"},
		{"NO3", "mg/L as N", 14.007, 1e-3, water.PerLitre, exact, "N 14.007 g/mol, IUPAC 2021 abridged (from memory)"},
		{"NO3", "mg/L", 62.004, 1e-3, water.PerLitre, exact, "NO3 62.004 g/mol, IUPAC 2021 abridged (from memory)"},
		{"NO3-N", "mg/L", 14.007, 1e-3, water.PerLitre, exact, "N 14.007 g/mol"},
		{"SiO2", "mg/L", 60.08, 1e-3, water.PerLitre, 1e-4, "SiO2 60.083 g/mol, IUPAC 2021 abridged (from memory)"},
		{"Si", "mg/L as SiO2", 60.083, 1e-3, water.PerLitre, exact, "SiO2 60.083 g/mol"},
		{"PO4", "mg/L as P", 30.974, 1e-3, water.PerLitre, exact, "P 30.974 g/mol, IUPAC 2021 abridged (from memory)"},
		{"SO4", "mg/L", 96.06, 1e-3, water.PerLitre, exact, "SO4 96.06 g/mol, IUPAC 2021 abridged (from memory)"},
		{"SO4", "meq/L", 2, 1e-3, water.PerLitre, exact, "definition: SO4 2- carries 2 eq/mol"},
		{"HCO3", "mg/L", 61.016, 1e-3, water.PerLitre, exact, "HCO3 61.016 g/mol: 1 eq of alkalinity per mol"},
		{"CO3", "mg/L", 60.008, 2e-3, water.PerLitre, exact, "CO3 60.008 g/mol: 2 eq of alkalinity per mol"},
		{"Na", "µg/L", 22990, 1e-3, water.PerLitre, exact, "definition"},
		{"Na", "g/L", 22.990, 1, water.PerLitre, exact, "definition"},
		{"Na", "ppm", 22.990, 1e-3, water.PerKgSolution, exact, "common practice: ppm = mg/kg of solution"},
		{"Na", "mol/kg", 0.5, 0.5, water.PerKgWater, exact, "common practice: mol/kg is molality, per kg of water"},
		{"Na", "mmol/kgw", 0.5, 0.5e-3, water.PerKgWater, exact, "definition"},
		{"Ba", "mg/L", 137.33, 1e-3, water.PerLitre, exact, "Ba 137.33 g/mol, IUPAC 2021 abridged (from memory)"},
	}
	table := water.Analytes()
	for _, c := range cases {
		a, ok := table.Lookup(c.analyte)
		if !ok {
			t.Errorf("analyte %s not in the table", c.analyte)
			continue
		}
		u, err := water.ParseUnit(c.unit)
		if err != nil {
			t.Errorf("ParseUnit(%q): %v", c.unit, err)
			continue
		}
		got, err := u.Amount(a, c.value, table)
		if err != nil {
			t.Errorf("%g %s of %s: %v", c.value, c.unit, c.analyte, err)
			continue
		}
		if math.Abs(got-c.want) > c.tol*c.want || u.Basis != c.basis {
			t.Errorf("%g %s of %s = %.8g (basis %v), want %.8g (basis %v) ± %g (%s)",
				c.value, c.unit, c.analyte, got, u.Basis, c.want, c.basis, c.tol, c.source)
		}
	}
}

// TestCSVPhysicalUnits checks the temperature, conductivity and density
// units against their definitions.
func TestCSVPhysicalUnits(t *testing.T) {
	cases := []struct {
		unit      string
		value     float64
		want      float64
		convert   func(water.Unit, float64) float64
		source    string
		wantQuant water.Quantity
	}{
		{"F", 212, 100, water.Unit.ToCelsius, "definition of °F", water.Temperature},
		{"°F", 32, 0, water.Unit.ToCelsius, "definition of °F", water.Temperature},
		{"F", 95, 35, water.Unit.ToCelsius, "definition of °F", water.Temperature},
		{"K", 298.15, 25, water.Unit.ToCelsius, "definition of K", water.Temperature},
		{"°C", 25, 25, water.Unit.ToCelsius, "identity", water.Temperature},
		{"mS/cm", 1.5, 1500, water.Unit.ToMicroSiemens, "definition", water.Conductivity},
		{"dS/m", 1, 1000, water.Unit.ToMicroSiemens, "1 dS/m = 1 mS/cm (definition)", water.Conductivity},
		{"µmho/cm", 100, 100, water.Unit.ToMicroSiemens, "1 mho = 1 S (definition)", water.Conductivity},
		{"g/mL", 1.02, 1.02, water.Unit.ToKgPerLitre, "definition", water.Density},
		{"kg/m3", 1025, 1.025, water.Unit.ToKgPerLitre, "definition", water.Density},
	}
	for _, c := range cases {
		u, err := water.ParseUnit(c.unit)
		if err != nil || u.Quantity != c.wantQuant {
			t.Errorf("ParseUnit(%q) = %+v, %v", c.unit, u, err)
			continue
		}
		if got := c.convert(u, c.value); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("%g %s = %.10g, want %g (%s)", c.value, c.unit, got, c.want, c.source)
		}
	}
	for _, bad := range []string{"mg/dL", "furlongs", "mmol/L as CaCO3", "mg"} {
		var ue *water.UnitError
		if _, err := water.ParseUnit(bad); !errors.As(err, &ue) {
			t.Errorf("ParseUnit(%q) error = %v, want a *UnitError", bad, err)
		}
	}
}

// TestCSVBrineMolality converts an 18 % w/w NaCl brine (density 1.1319
// kg/L at 20 °C, CRC Handbook of Chemistry and Physics, concentrative
// properties of aqueous solutions, from memory): 203.7 g/L NaCl, molality
// 180/(58.443 × 0.820) = 3.756 mol/kg.
func TestCSVBrineMolality(t *testing.T) {
	const (
		massFraction = 0.18
		density      = 1.1319 // kg/L
		naclMass     = 58.44  // g/mol, Na 22.990 + Cl 35.45
		wantMolality = 3.756
	)
	naclPerLitre := massFraction * density * 1000 // g/L, 203.7
	table := water.Analytes()
	na, _ := table.Lookup("Na")
	cl, _ := table.Lookup("Cl")
	mgL, _ := water.ParseUnit("mg/L")
	ppm, _ := water.ParseUnit("ppm")
	sample := func(unit water.Unit, naclMg float64, rho float64) water.Sample {
		s := water.NewSample("brine")
		s.Temperature, s.Density = 20, rho
		s.Measurements = []water.Measurement{
			{Analyte: &na, Unit: unit, Value: naclMg * 22.990 / naclMass, Column: "Na"},
			{Analyte: &cl, Unit: unit, Value: naclMg * 35.45 / naclMass, Column: "Cl"},
		}
		return s
	}
	cases := []struct {
		what string
		s    water.Sample
		tol  float64
	}{
		{"mg/L, density given", sample(mgL, naclPerLitre*1000, density), 0.001},
		{"mg/L, density estimated", sample(mgL, naclPerLitre*1000, math.NaN()), 0.015},
		{"ppm, density given", sample(ppm, massFraction*1e6, density), 0.001},
		{"ppm, density estimated", sample(ppm, massFraction*1e6, math.NaN()), 0.015},
	}
	for _, c := range cases {
		a, err := c.s.Analysis(table)
		if err != nil {
			t.Errorf("%s: %v", c.what, err)
			continue
		}
		for _, comp := range []water.Component{water.Na, water.Cl} {
			if got := a.Total(comp); math.Abs(got-wantMolality) > c.tol*wantMolality {
				t.Errorf("18 %% NaCl (%s): %s = %.4f mol/kg, want %.3f ± %.1f %% (CRC Handbook, from memory)",
					c.what, comp, got, wantMolality, 100*c.tol)
			}
		}
	}
	// The same brine through Read.
	text := fmt.Sprintf("name,temperature [C],density [kg/L],Na [g/L],Cl [g/L]\nbrine,20,%g,%.6f,%.6f\n",
		density, naclPerLitre*22.990/naclMass, naclPerLitre*35.45/naclMass)
	records, _, err := csvReadString(text, water.ReadOptions{})
	if err != nil || records[0].Err != nil {
		t.Fatalf("%v %v", err, records[0].Err)
	}
	if got := records[0].Analysis.Total(water.Na); math.Abs(got-wantMolality) > 0.001*wantMolality {
		t.Errorf("18 %% NaCl read from csv: Na = %.4f mol/kg, want %.3f ± 0.1 %%", got, wantMolality)
	}
}

// csvAtomicWeights are the IUPAC 2021 abridged standard atomic weights,
// g/mol (Prohaska et al. 2022, Pure Appl. Chem. 94:573, Table 2; typed from
// memory).
var csvAtomicWeights = map[string]float64{
	"H": 1.0080, "B": 10.81, "C": 12.011, "N": 14.007, "O": 15.999, "F": 18.998, "Na": 22.990,
	"Mg": 24.305, "Si": 28.085, "P": 30.974, "S": 32.06, "Cl": 35.45, "K": 39.098, "Ca": 40.078,
	"Mn": 54.938, "Fe": 55.845, "Sr": 87.62, "Ba": 137.33, "Li": 6.94, "Br": 79.904, "I": 126.90,
}

// csvFormulaMass returns the molar mass of a formula such as "HCO3".
func csvFormulaMass(t *testing.T, formula string) float64 {
	mass := 0.0
	for i := 0; i < len(formula); {
		j := i + 1
		for j < len(formula) && formula[j] >= 'a' && formula[j] <= 'z' {
			j++
		}
		w, ok := csvAtomicWeights[formula[i:j]]
		if !ok {
			t.Fatalf("formula %s: no atomic weight for %q", formula, formula[i:j])
		}
		n := 0
		for j < len(formula) && formula[j] >= '0' && formula[j] <= '9' {
			n = 10*n + int(formula[j]-'0')
			j++
		}
		if n == 0 {
			n = 1
		}
		mass += float64(n) * w
		i = j
	}
	return mass
}

// TestCSVAnalyteFormMass recomputes the form mass of every row of
// data/analytes.csv from the atomic weights.
func TestCSVAnalyteFormMass(t *testing.T) {
	forms := map[string]struct {
		formula string
		per     float64 // form mass = formula mass / per
	}{
		"Ca": {"Ca", 1}, "Mg": {"Mg", 1}, "Na": {"Na", 1}, "K": {"K", 1}, "Ba": {"Ba", 1},
		"Sr": {"Sr", 1}, "Fe": {"Fe", 1}, "Mn": {"Mn", 1}, "Cl": {"Cl", 1}, "F": {"F", 1}, "B": {"B", 1},
		"SO4": {"SO4", 1}, "SO4-S": {"S", 1}, "NO3": {"NO3", 1}, "NO3-N": {"N", 1},
		"SiO2": {"SiO2", 1}, "Si": {"Si", 1}, "PO4": {"PO4", 1}, "PO4-P": {"P", 1},
		"DIC": {"C", 1}, "CO2": {"CO2", 1}, "HCO3": {"HCO3", 1}, "CO3": {"CO3", 1}, "OH": {"OH", 1},
		"Br": {"Br", 1}, "I": {"I", 1}, "Li": {"Li", 1}, "NH4": {"NH4", 1}, "NH4-N": {"N", 1}, "NH3": {"NH3", 1},
		"alkalinity":  {"CaCO3", 2},                              // the equivalent weight of CaCO3
		"Ca-hardness": {"CaCO3", 1}, "Mg-hardness": {"CaCO3", 1}, // hardness as CaCO3
	}
	const tol = 0.01 // g/mol
	for _, a := range water.Analytes().All() {
		f, ok := forms[a.Name]
		if !ok {
			t.Errorf("analyte %s: no formula in this test", a.Name)
			continue
		}
		want := csvFormulaMass(t, f.formula) / f.per
		if math.Abs(a.FormMass-want) > tol {
			t.Errorf("form mass of %s = %.4f g/mol, want %.4f ± %g (%s from IUPAC 2021 abridged atomic weights)",
				a.Name, a.FormMass, want, tol, f.formula)
		}
	}
}
