package saturation

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestCaSO4SpreadTable: the spread the hot-brine note quotes is, at each
// temperature, the largest difference over gypsum and anhydrite in
// testdata/caso4_hot_brine_spread.csv (our set against Møller 1988, both
// held to the same pure-water solubility [COMPUTED] by
// testdata/reference/caso4_hot_brine_spread.py).
func TestCaSO4SpreadTable(t *testing.T) {
	const tol = 0.001 // the table is rounded to 3 decimals
	rows := readTestCSV(t, "../testdata/caso4_hot_brine_spread.csv", []string{"mineral", "t_c", "nacl_mol_per_kg", "si_ours_at_set_b_saturation"})
	most := map[float64]float64{}
	for _, row := range rows {
		tc, err1 := strconv.ParseFloat(row.cells[1], 64)
		d, err2 := strconv.ParseFloat(row.cells[3], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("caso4_hot_brine_spread.csv:%d: malformed row %q", row.line, row.cells)
		}
		most[tc] = math.Max(most[tc], d)
	}
	if len(most) != len(caSO4Spread) {
		t.Fatalf("the CSV has %d temperatures, caSO4Spread %d", len(most), len(caSO4Spread))
	}
	for _, e := range caSO4Spread {
		want, ok := most[e.t]
		if !ok || math.Abs(e.si-want) > tol {
			t.Errorf("caSO4Spread at %g °C = %.3f, want %.3f from testdata/caso4_hot_brine_spread.csv", e.t, e.si, want)
		}
	}
}

// TestCaSO4HotBrineNote: a hot NaCl brine holding calcium and sulfate
// carries the note with the spread at its temperature; a cool brine and a
// hot fresh water do not (the thresholds caSO4NoteT and caSO4NoteI).
func TestCaSO4HotBrineNote(t *testing.T) {
	note := func(tc, nacl float64) string {
		a := newWater("CaSO4+NaCl", tc, map[water.Component]float64{water.Na: nacl, water.Cl: nacl, water.Ca: 0.02, water.S: 0.02})
		r, err := Speciate(a, Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range r.Warnings {
			if strings.HasPrefix(w, "gypsum and anhydrite in a hot salt water") {
				return w
			}
		}
		return ""
	}
	for _, tc := range []struct {
		tc, nacl float64
		want     string // "" = no note
	}{
		{90, 2, "about 0.17 high at 90 °C"},
		{60, 1, "about 0.15 high at 60 °C"},
		{25, 2, ""},
		{35, 4, ""},
		{90, 0.01, ""},
	} {
		got := note(tc.tc, tc.nacl)
		if (tc.want == "") != (got == "") || !strings.Contains(got, tc.want) {
			t.Errorf("%g °C, %g mol/kg NaCl: note %q, want one saying %q", tc.tc, tc.nacl, got, tc.want)
		}
	}
}

// TestCaSO4SpreadAnchors: the pure-water solubilities that
// testdata/reference/caso4_hot_brine_spread.py holds both Pitzer sets to
// (its PURE table, copied here) are still this model's; when they drift
// beyond tol the script and caSO4Spread must be rerun.
func TestCaSO4SpreadAnchors(t *testing.T) {
	const tol = 0.005 // relative; the script's values have 4 significant figures
	pure := map[string]map[float64]float64{
		"gypsum":    {25: 0.01527, 50: 0.01530, 75: 0.01370, 90: 0.01239},
		"anhydrite": {25: 0.02292, 50: 0.01660, 75: 0.01089, 90: 0.00817},
	}
	for mineral, byT := range pure {
		for tc, want := range byT {
			got := solubility(t, mineral, Options{}, func(x float64) water.Analysis {
				return newWater("CaSO4", tc, map[water.Component]float64{water.Ca: x, water.S: x})
			})
			if math.Abs(got/want-1) > tol {
				t.Errorf("%s in water at %g °C = %.5f mol/kg, the spread script assumes %.5f: rerun it", mineral, tc, got, want)
			}
		}
	}
}
