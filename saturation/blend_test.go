package saturation

import (
	"math"
	"testing"
)

// kestrelBlend are two invented Kestrel Fen waters a plant might blend: a
// hard, alkaline deep well and a soft, cool river intake.
const kestrelBlend = "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n" +
	"Kestrel Fen deep well 2,16,7.4,200,40,60,90,250,400,22\n" +
	"Kestrel Fen river intake,10,7.3,24,5,12,18,20,60,6\n"

// TestBlendSkinGoverns: the share of the hard well water a blend with the
// cool river intake can take under the no-inhibitor profile (calcite SI at
// most 0.2, common practice). Calcite is less soluble hot — its log Ksp
// falls with temperature (Plummer & Busenberg 1982) while the bulk pH is
// held at the skin (the classic skin index, UFC 3-240-13FN Example B-1) —
// so every blend is more supersaturated at a 60 °C tube wall than at its
// 10–16 °C bulk: judged at the skin the blend takes less well water, the
// skin governs, and the bulk answer is kept beside it. Checks that do not
// lean on the program's own numbers: the bound is where the limiting
// quantity meets its limit at the governing temperature (the definition
// of the search), and naming the waters the other way round gives the
// same blend as a least share of the river water (f and 1 − f).
func TestBlendSkinGoverns(t *testing.T) {
	const (
		tolLimit = 2e-3 // SI units: the crossing is refined to 1e-4 in share
		tolShare = 1e-3 // share: the two orders refine the same crossing
	)
	ws := plantWaters(t, kestrelBlend)
	well, river := ws["Kestrel Fen deep well 2"], ws["Kestrel Fen river intake"]
	profile, _ := LimitProfileNamed("no-inhibitor")
	bulk, err := JudgeBlend(well, river, 0.3, profile, Options{})
	if err != nil {
		t.Fatal(err)
	}
	hot, err := JudgeBlend(well, river, 0.3, profile, Options{Skin: 60})
	if err != nil {
		t.Fatal(err)
	}
	b, h := bulk.Share, hot.Share
	t.Logf("safe share of the well: bulk %.4f (%s), with a 60 °C skin %.4f (%s), judged %+v", b.Fraction, b.Limiting, h.Fraction, h.Limiting, h.Judged)
	if b.AtLeast || h.AtLeast || !(b.Fraction > 0 && b.Fraction < 1) {
		t.Fatalf("bulk share %+v: the river alone holds the limits and the well alone does not, want an upper bound inside (0, 1)", b)
	}
	// Calcite solubility falls with temperature: the skin allows less well water.
	if !(h.Fraction < b.Fraction) {
		t.Errorf("share of the well with a 60 °C skin %.4f, want below the bulk answer %.4f (calcite less soluble hot)", h.Fraction, b.Fraction)
	}
	if !h.Judged.SkinGoverns() || h.Judged.Governing != 60 || h.Judged.Skin != 60 {
		t.Errorf("judged %+v: want the 60 °C skin governing", h.Judged)
	}
	if math.Abs(h.Judged.AtBulk-b.Fraction) > 1e-9 || math.Abs(h.Judged.AtSkin-h.Fraction) > 1e-9 {
		t.Errorf("judged %+v: the answers at each temperature should be %.4f (bulk) and %.4f (skin)", h.Judged, b.Fraction, h.Fraction)
	}
	if want := h.Fraction*16 + (1-h.Fraction)*10; math.Abs(h.Judged.Bulk-want) > 1e-9 {
		t.Errorf("bulk temperature at the bound %.3f °C, want the volume-weighted %.3f °C", h.Judged.Bulk, want)
	}
	if b.Judged.SkinGoverns() || !math.IsNaN(b.Judged.Skin) {
		t.Errorf("without a skin the bulk governs: %+v", b.Judged)
	}
	// At the bound the limiting quantity sits on its limit at the governing temperature.
	for _, c := range []struct {
		name  string
		share SafeShare
		skin  float64
	}{{"bulk", b, 0}, {"skin", h, 60}} {
		at, err := JudgeBlend(well, river, c.share.Fraction, profile, Options{Skin: c.skin})
		if err != nil {
			t.Fatal(err)
		}
		l, ok := profile.Lookup(c.share.Limiting)
		if !ok {
			t.Fatalf("%s: limiting %q is not in the profile", c.name, c.share.Limiting)
		}
		r, ix := at.Point.Result, at.Point.Indices
		if c.skin > 0 {
			r, ix = at.Point.Skin, at.Point.SkinIndices
		}
		if v, _ := l.Value(r, ix); math.Abs(v-l.Max) > tolLimit {
			t.Errorf("%s: at share %.4f %s = %.4f, want its limit %g ± %g (the bound's definition)", c.name, c.share.Fraction, l.Quantity, v, l.Max, tolLimit)
		}
	}
	// The blend judged at 30 % well: the skin is the worse side.
	if p := hot.Point; p.Governing != 60 || p.Skin == nil || !(p.Excess > 0) {
		t.Errorf("blend at 30 %% well: governing %.3g °C, excess %.3g, want the 60 °C skin past the limit", p.Governing, p.Excess)
	}
	// The other order: the least share of the river water is 1 − the most of the well.
	swapped, err := JudgeBlend(river, well, 0.7, profile, Options{Skin: 60})
	if err != nil {
		t.Fatal(err)
	}
	s := swapped.Share
	if !s.AtLeast || math.Abs(s.Fraction-(1-h.Fraction)) > tolShare || !s.Judged.SkinGoverns() {
		t.Errorf("river first: share %+v, want at least %.4f of the river, the skin governing", s, 1-h.Fraction)
	}
	if n := len(s.Points); n != 21 || s.Points[0].Fraction != 0 || s.Points[n-1].Fraction != 1 {
		t.Errorf("river first: %d points from %g, want 21 from 0 to 1 in share of the first water", n, s.Points[0].Fraction)
	}
}
