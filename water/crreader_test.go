package water

import (
	"io"
	"strings"
	"testing"
	"testing/iotest"
)

// TestCROnlyLineEndings: a file with CR-only line ends (old Mac files,
// some instruments) reads like its LF twin, also one byte at a time (a CR
// at the end of every read); CR LF is unchanged. Before issue 12 a CR-only
// file was one line: a header and "no samples below the header".
func TestCROnlyLineEndings(t *testing.T) {
	const lf = "name,temperature [C],pH,Ca [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"Kestrel Fen makeup,25,7.5,50,100\n\"Kestrel Fen\nblowdown\",30,8.1,200,300\n"
	for _, tc := range []struct {
		name string
		text string
	}{
		{"CR", strings.ReplaceAll(lf, "\n", "\r")},
		{"CRLF", strings.ReplaceAll(lf, "\n", "\r\n")},
		{"mixed", strings.Replace(lf, "\n", "\r", 1)},
	} {
		for _, wrap := range []func(io.Reader) io.Reader{func(r io.Reader) io.Reader { return r }, iotest.OneByteReader} {
			got, probs, err := Read("f.csv", wrap(strings.NewReader(tc.text)), ReadOptions{})
			want, _, _ := Read("f.csv", strings.NewReader(lf), ReadOptions{})
			if err != nil || len(probs) > 0 || len(got) != 2 {
				t.Fatalf("%s: %d records, %v %v", tc.name, len(got), probs, err)
			}
			for i := range want {
				if got[i].Line != want[i].Line || got[i].Analysis.Name != want[i].Analysis.Name || got[i].Analysis.PH != want[i].Analysis.PH {
					t.Errorf("%s: record %d: line %d %q pH %g, want line %d %q pH %g", tc.name, i,
						got[i].Line, got[i].Analysis.Name, got[i].Analysis.PH, want[i].Line, want[i].Analysis.Name, want[i].Analysis.PH)
				}
			}
		}
	}
}
