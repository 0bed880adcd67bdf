package reports

import (
	"strconv"
	"strings"
	"unicode"
)

// SafeText returns s with every control character but line feed and tab
// shown as a Go escape (ESC as \x1b, CR as \r, NEL as \u0085), and the
// bidirectional overrides and isolates too (U+202A–U+202E, U+2066–U+2069),
// so that a name read from a file cannot move the cursor, retitle the
// terminal or reorder the text around it. Text output and messages on
// standard error go through it; JSON keeps names exact (its encoding
// escapes control characters itself).
func SafeText(s string) string {
	if !strings.ContainsFunc(s, unsafeRune) {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		if !unsafeRune(r) {
			b.WriteRune(r)
			continue
		}
		q := strconv.QuoteRuneToASCII(r) // '\x1b', '\r', '\u202e'
		b.WriteString(q[1 : len(q)-1])
	}
	return b.String()
}

func unsafeRune(r rune) bool {
	switch {
	case r == '\n' || r == '\t':
		return false
	case unicode.IsControl(r):
		return true
	}
	return r >= 0x202a && r <= 0x202e || r >= 0x2066 && r <= 0x2069
}

// SafeCSVCell returns a CSV cell that a spreadsheet will not run as a
// formula: a cell that begins with =, +, -, @, tab or carriage return gets
// a leading apostrophe (the usual rule, OWASP "CSV Injection"), unless it
// is a plain number (a negative saturation index such as -0.35 is data,
// not a formula) or a lone "-" (standard input as a file name; an operator
// with nothing to act on is not a formula). --raw-csv turns this off for
// pipelines.
func SafeCSVCell(s string) string {
	if s == "" || s == "-" || !strings.ContainsRune("=+-@\t\r", rune(s[0])) {
		return s
	}
	if _, err := strconv.ParseFloat(s, 64); err == nil {
		return s
	}
	return "'" + s
}

// safeCSVRows applies SafeCSVCell to every cell of rows, in place.
func safeCSVRows(rows [][]string) [][]string {
	for _, row := range rows {
		for i, c := range row {
			row[i] = SafeCSVCell(c)
		}
	}
	return rows
}
