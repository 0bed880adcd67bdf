package water

import (
	"math/rand/v2"
	"strings"
	"testing"
)

// TestCollapseSpaces: the fast path of collapseSpaces gives what trimming
// and collapsing every run of white space (non-breaking spaces included)
// gives, on random cells built from digits, signs, letters and the white
// space a spreadsheet leaves.
func TestCollapseSpaces(t *testing.T) {
	pieces := []string{"1", "2.5", "<", ">", "e", "n.d.", " ", "  ", "\t", "\u00a0", "\u2003", "\n", "µ", ",", "-"}
	rng := rand.New(rand.NewPCG(3, 4))
	for n := 0; n < 20000; n++ {
		var b strings.Builder
		for k := rng.IntN(6); k >= 0; k-- {
			b.WriteString(pieces[rng.IntN(len(pieces))])
		}
		s := b.String()
		want := strings.Join(strings.Fields(strings.ReplaceAll(s, "\u00a0", " ")), " ")
		if got := collapseSpaces(s); got != want {
			t.Fatalf("collapseSpaces(%q) = %q, want %q", s, got, want)
		}
	}
}
