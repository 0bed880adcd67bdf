package reports

import (
	"testing"

	"scalerisk/saturation"
)

// TestTextWords: the text outputs name minerals and sweep variables in
// words and write each quantity in its one format.
func TestTextWords(t *testing.T) {
	for _, c := range []struct{ got, want string }{
		{mineralTitle("silica_amorphous"), "Amorphous silica"},
		{mineralTitle("calcite"), "Calcite"},
		{mineralTitle("tricalcium_phosphate"), "Tricalcium phosphate"},
		{variableTitle(saturation.VaryTemperature), "Temperature (°C)"},
		{variableTitle(saturation.VaryDose), "Dose (mg/L)"},
		{variableText(saturation.VaryTemperature, 2.5), "2.5"},
		{variableText(saturation.VaryTemperature, 40), "40.0"},
		{variableText(saturation.VaryCycles, 2.5), "2.50"},
		{variableText(saturation.VaryFraction, 0.14), "0.14"},
		{siText(0.3), "+0.30"},
		{siText(-1.234), "-1.23"},
		{padLeft("°C", 4), "  °C"},
	} {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
}
