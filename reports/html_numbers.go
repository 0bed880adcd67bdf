package reports

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// roundUp rounds x > 0 up to a multiple of a twentieth of its power of
// ten (153 → 155, 1234 → 1250, 7.12 → 7.15).
func roundUp(x float64) float64 {
	if !(x > 0) || !finite(x) {
		return 1
	}
	step := math.Pow(10, math.Floor(math.Log10(x))) / 20
	return dec(math.Ceil(x/step*(1-1e-12))*step, 6)
}

func valueWithUnit(v float64, unit string) string {
	s := sigText(v, 3)
	if unit == "%" {
		return signed(v, 2) + " %"
	}
	if unit != "" {
		return s + " " + unit
	}
	return s
}

// num formats x with n decimals; "—" for NaN or ±Inf.
func num(x float64, n int) string {
	if !finite(x) {
		return "—"
	}
	s := strconv.FormatFloat(dec(x, n), 'f', n, 64)
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}

// sigText formats x with n significant digits, in plain decimal notation
// between 1e-6 and 1e6; "—" for NaN or ±Inf.
func sigText(x float64, n int) string {
	if !finite(x) {
		return "—"
	}
	v := sig(x, n)
	var s string
	if a := math.Abs(v); v != 0 && (a < 1e-6 || a >= 1e6) {
		s = strconv.FormatFloat(v, 'g', n, 64)
	} else {
		s = strconv.FormatFloat(v, 'f', -1, 64)
	}
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}

// signed formats x with a sign and n decimals ("+1.26", "−0.40").
func signed(x float64, n int) string {
	if !finite(x) {
		return "—"
	}
	s := fmt.Sprintf("%+.*f", n, dec(x, n))
	if s[0] == '-' {
		return "−" + s[1:]
	}
	return s
}
