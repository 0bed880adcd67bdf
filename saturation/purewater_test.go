package saturation

import (
	"errors"
	"math"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestPureWaterMeasured: pure and near-pure waters with alkalinity 0 are accepted
// as holding no inorganic carbon when pH alone (hydroxide) gives at most
// alkResolution; before issue 12 pure water at pH 7 was "inconsistent".
// A water whose pH puts far more alkalinity in hydroxide than reported
// stays inconsistent.
func TestPureWaterMeasured(t *testing.T) {
	const header = "name,temperature [C],pH,Na [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n"
	cases := []struct {
		row    string
		ok     bool
		wantPH float64
	}{
		{"pure,25,7,0,0,0", true, 7},             // Kw = 1e-14 at 25 °C: [OH-] = [H+], no alkalinity (any textbook)
		{"near-pure,25,7.5,1,1.54,0", true, 7.5}, // [OH-] 3e-7 mol/kg, 0.0003 meq/kg, far below 0.02
		{"cold,5,7,0,0,0", true, 7},
		{"hot,80,6.3,0,0,0", true, 6.3},   // pKw 12.6 at 80 °C (Marshall & Franck 1981, from memory): neutral near 6.3
		{"caustic,25,10,1,0,0", false, 0}, // [OH-] 1e-4: 0.1 meq/kg, 5 mg/L as CaCO3 unreported
	}
	for _, tc := range cases {
		recs, probs, err := water.Read("pure.csv", strings.NewReader(header+tc.row+"\n"), water.ReadOptions{})
		if err != nil || len(probs) > 0 || len(recs) != 1 || recs[0].Err != nil {
			t.Fatalf("%s: read: %v %v %v", tc.row, err, probs, recs)
		}
		r, err := Speciate(recs[0].Analysis, Options{})
		if !tc.ok {
			if !errors.Is(err, ErrInconsistent) {
				t.Errorf("%s: err %v, want inconsistent", tc.row, err)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: %v", tc.row, err)
			continue
		}
		if math.Abs(r.PH-tc.wantPH) > 1e-9 {
			t.Errorf("%s: pH %g, want %g", tc.row, r.PH, tc.wantPH)
		}
	}
}
