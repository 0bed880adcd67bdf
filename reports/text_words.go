package reports

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"scalerisk/saturation"
)

// Text output for people: the words and the one number format of each
// quantity the text writers print (JSON and CSV keep their keys and full
// digits).

// mineralTitle is a mineral name as a heading or table cell writes it:
// mineralLabel with a capital ("silica_amorphous" → "Amorphous silica",
// "calcite" → "Calcite").
func mineralTitle(name string) string {
	l := mineralLabel(name)
	r, n := utf8.DecodeRuneInString(l)
	return string(unicode.ToUpper(r)) + l[n:]
}

// variableTitle is a sweep variable as a column heading: its name in words
// with its unit.
func variableTitle(v saturation.Variable) string {
	switch v {
	case saturation.VaryTemperature:
		return "Temperature (°C)"
	case saturation.VaryCycles:
		return "Cycles"
	case saturation.VaryDose:
		return "Dose (mg/L)"
	case saturation.VaryFraction:
		return "Fraction"
	}
	return v.String()
}

// variableText is the one text format of a sweep variable's value:
// temperature and dose to 0.1, cycles and a blend fraction to 0.01.
func variableText(v saturation.Variable, x float64) string {
	prec := 2
	if v == saturation.VaryTemperature || v == saturation.VaryDose {
		prec = 1
	}
	return strconv.FormatFloat(x, 'f', prec, 64)
}

// siText is the one text format of a saturation index or a classic index
// (LSI, RSI …): signed, two decimals; blank for NaN.
func siText(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return ""
	}
	return fmt.Sprintf("%+.2f", x)
}

// titleWidth is the width of a column headed by title, at least min runes.
func titleWidth(title string, min int) int { return max(min, utf8.RuneCountInString(title)) }

// padLeft right-aligns s in width runes (fmt pads by bytes, which
// mis-aligns "°").
func padLeft(s string, width int) string {
	if n := utf8.RuneCountInString(s); n < width {
		return strings.Repeat(" ", width-n) + s
	}
	return s
}
