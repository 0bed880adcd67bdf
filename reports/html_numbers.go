package reports

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

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

// Plural words a count with its noun: "1 sample", "3 samples".
func Plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

// isAre is the verb that agrees with a count.
func isAre(n int) string {
	if n == 1 {
		return "is"
	}
	return "are"
}
