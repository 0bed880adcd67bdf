package water_test

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestMinorAnalyteColumns: the column names laboratories use for bromide,
// iodide, lithium and ammonia all read, to the right component and amount:
// 1 mmol/L of each (ammonia as NH4, as N and as NH3; "mg/L as N" on an NH4
// column). Molar masses: IUPAC 2021 abridged atomic weights.
func TestMinorAnalyteColumns(t *testing.T) {
	const tolAmount = 1e-4 // relative; the masses below are the table's to 5 digits
	tests := []struct {
		header string
		value  float64 // mg/L giving 1 mmol/L
		comp   water.Component
	}{
		{"Br [mg/L]", 79.904, water.Br},
		{"bromide [mg/L]", 79.904, water.Br},
		{"I [mg/L]", 126.90, water.I},
		{"iodide [mg/L]", 126.90, water.I},
		{"Li [mg/L]", 6.94, water.Li},
		{"lithium [mg/L]", 6.94, water.Li},
		{"NH4 [mg/L]", 18.039, water.NH4},
		{"ammonium [mg/L]", 18.039, water.NH4},
		{"NH4-N [mg/L]", 14.007, water.NH4},
		{"NH3-N [mg/L]", 14.007, water.NH4},
		{"ammonia as N [mg/L]", 14.007, water.NH4},
		{"NH4 [mg/L as N]", 14.007, water.NH4},
		{"NH3 [mg/L]", 17.031, water.NH4},
	}
	for _, tt := range tests {
		lab := "name,temperature [C],Na [mg/L]," + tt.header + "\nx,25,23," + strconv.FormatFloat(tt.value, 'f', -1, 64) + "\n"
		records, problems, err := water.Read("lab.csv", strings.NewReader(lab), water.ReadOptions{})
		if err != nil || len(problems) > 0 || len(records) != 1 || records[0].Err != nil {
			t.Errorf("%s: %v %v %v", tt.header, err, problems, records)
			continue
		}
		a := records[0].Analysis
		got := a.Total(tt.comp) * a.WaterPerLitre
		if math.Abs(got/1e-3-1) > tolAmount {
			t.Errorf("%s = %g mg/L reads as %.6g mol/L of %s, want 1e-3", tt.header, tt.value, got, tt.comp)
		}
	}
}
