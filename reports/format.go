package reports

import (
	"fmt"
	"math"
	"strconv"
)

// Format is an output format.
type Format int

// The output formats.
const (
	Text Format = iota
	CSV
	JSON
)

// ParseFormat parses "text", "csv" or "json".
func ParseFormat(s string) (Format, error) {
	switch s {
	case "text", "":
		return Text, nil
	case "csv":
		return CSV, nil
	case "json":
		return JSON, nil
	}
	return Text, fmt.Errorf("unknown format %q (want text, csv or json)", s)
}

func (f Format) String() string { return [...]string{"text", "csv", "json"}[f] }

// sig rounds x to n significant digits; NaN and ±Inf become 0 (callers
// leave such values out before they reach output).
func sig(x float64, n int) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) || x == 0 {
		return 0
	}
	v, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'g', n, 64), 64)
	return v
}

// dec rounds x to n decimals.
func dec(x float64, n int) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	p := math.Pow(10, float64(n))
	v := math.Round(x*p) / p
	if v == 0 {
		return 0 // no negative zero
	}
	return v
}

// optional returns a pointer to x rounded by round, or nil when x is NaN or
// infinite, so that JSON leaves the key out.
func optional(x float64, round func(float64) float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	v := round(x)
	return &v
}
