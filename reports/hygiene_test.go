package reports

import "testing"

func TestSafeText(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"Kestrel Fen tower 1", "Kestrel Fen tower 1"},
		{"line one\nline two\tcol", "line one\nline two\tcol"}, // line feed and tab stay
		{"\x1b]0;owned\x07tower", `\x1b]0;owned\atower`},       // retitles an xterm (OSC 0)
		{"tower\r1", `tower\r1`},
		{"a\u0085b\u202eevil", `a\u0085b\u202eevil`}, // NEL, right-to-left override
		{"Dôle ±5 %", "Dôle ±5 %"},
	} {
		if got := SafeText(tc.in); got != tc.want {
			t.Errorf("SafeText(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

// The leading-quote rule of OWASP "CSV Injection": cells a spreadsheet
// would evaluate get an apostrophe; numbers stay numbers.
func TestSafeCSVCell(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{`=HYPERLINK("http://x","y")`, `'=HYPERLINK("http://x","y")`},
		{"+1+cmd|' /C calc'!A0", "'+1+cmd|' /C calc'!A0"},
		{"-2+3", "'-2+3"},
		{"@SUM(A1)", "'@SUM(A1)"},
		{"\t=1", "'\t=1"},
		{"\r=1", "'\r=1"},
		{"-0.35", "-0.35"}, // a negative saturation index
		{"+1e-3", "+1e-3"},
		{"", ""},
		{"-", "-"}, // standard input named as the file
		{"--1", "'--1"},
		{"tower = 1", "tower = 1"},
	} {
		if got := SafeCSVCell(tc.in); got != tc.want {
			t.Errorf("SafeCSVCell(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}
