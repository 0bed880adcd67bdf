package water

import (
	"math"
	"testing"
)

// TestFormulaMass checks molar masses against values computed by hand from
// the IUPAC 2021 abridged standard atomic weights (Prohaska et al. 2022),
// and against the CRC Handbook molar masses (from memory) to 0.01 g/mol.
func TestFormulaMass(t *testing.T) {
	tests := []struct {
		formula string
		want    float64
		source  string
	}{
		{"CaCO3", 100.086, "CRC Handbook 100.09 (from memory)"},
		{"CaSO4:2H2O", 172.164, "CRC Handbook 172.17 (from memory)"},
		{"CaSO4", 136.134, "CRC Handbook 136.14 (from memory)"},
		{"BaSO4", 233.386, "CRC Handbook 233.39 (from memory)"},
		{"SrSO4", 183.676, "CRC Handbook 183.68 (from memory)"},
		{"Ca5(PO4)3OH", 502.297, "hand computation, IUPAC 2021"},
		{"Mg(OH)2", 58.319, "CRC Handbook 58.32 (from memory)"},
		{"SiO2", 60.083, "CRC Handbook 60.08 (from memory)"},
		{"Mg2Si3O7.5(OH):3H2O", 2*24.305 + 3*28.085 + 7.5*15.999 + 15.999 + 1.008 + 3*(2*1.008+15.999), "hand computation, IUPAC 2021"},
	}
	for _, tc := range tests {
		got, err := FormulaMass(tc.formula)
		if err != nil {
			t.Errorf("%s: %v", tc.formula, err)
			continue
		}
		if math.Abs(got-tc.want) > 0.01 {
			t.Errorf("FormulaMass(%s) = %.3f, want %.3f ± 0.01 (%s)", tc.formula, got, tc.want, tc.source)
		}
	}
	for _, bad := range []string{"", "Xx2", "Ca(CO3", "ca"} {
		if _, err := FormulaMass(bad); err == nil {
			t.Errorf("FormulaMass(%q): want an error", bad)
		}
	}
}
