package water

import (
	"strings"
	"testing"
)

// TestPairs: invented Kestrel Fen samples. Tower 3 pairs with well 5 (same
// system and date); tower 6 with well 6 through its system though the
// dates differ; the undated-system tower 7 finds two makeups on its date
// and is left out with a note; a sample with no role takes no part.
func TestPairs(t *testing.T) {
	const text = "name,date,role,system,Cl [mg/L]\n" +
		"well 5,2026-05-04,makeup,T3,40\n" +
		"tower 3,2026-05-04,recirculating,T3,200\n" +
		"well 6,2026-05-01,makeup,T6,30\n" +
		"tower 6,2026-05-04,blowdown,t6,150\n" +
		"well 7a,2026-05-05,makeup,,30\n" +
		"well 7b,2026-05-05,makeup,,35\n" +
		"tower 7,2026-05-05,recirculating,,150\n" +
		"survey,2026-05-04,,T3,12\n"
	recs, _, err := Read("kf.csv", strings.NewReader(text), ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var as []Analysis
	for _, r := range recs {
		if r.Err != nil {
			t.Fatal(r.Err)
		}
		as = append(as, r.Analysis)
	}
	pairs, notes := Pairs(as)
	want := []Pair{{Makeup: 0, Tower: 1, SameDate: true}, {Makeup: 2, Tower: 3, SameDate: false}}
	if len(pairs) != len(want) {
		t.Fatalf("pairs %+v, want %+v", pairs, want)
	}
	for i := range want {
		if pairs[i] != want[i] {
			t.Errorf("pair %d = %+v, want %+v", i, pairs[i], want[i])
		}
	}
	if len(notes) != 1 || !strings.Contains(notes[0], "tower 7: 2 makeup samples") {
		t.Errorf("notes %q, want one on tower 7's two makeups", notes)
	}
}
