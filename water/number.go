package water

import (
	"errors"
	"math"
	"strconv"
	"strings"
)

// ErrNotNumber reports a cell that is not a plain decimal number.
var ErrNotNumber = errors.New("not a number")

// ParseNumber parses s as a plain decimal number: an optional sign, digits,
// an optional decimal point and an optional exponent ("7.9", "-0.2", "1e-3").
// Surrounding spaces are ignored. It rejects what strconv.ParseFloat accepts
// but a laboratory never means: NaN, Inf, hexadecimal, underscores, and
// thousands separators ("1,234" is an error, never 1.234). Values that
// overflow float64 are an error.
func ParseNumber(s string) (float64, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, ErrNotNumber
	}
	digits := 0
	for i, r := range s {
		switch {
		case r >= '0' && r <= '9':
			digits++
		case r == '.':
		case r == '+' || r == '-':
			if i != 0 && s[i-1] != 'e' && s[i-1] != 'E' {
				return 0, ErrNotNumber
			}
		case r == 'e' || r == 'E':
			if digits == 0 {
				return 0, ErrNotNumber
			}
		default:
			return 0, ErrNotNumber
		}
	}
	if digits == 0 {
		return 0, ErrNotNumber
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, ErrNotNumber
	}
	return v, nil
}
