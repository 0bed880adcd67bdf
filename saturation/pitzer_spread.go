package saturation

import (
	"fmt"
	"math"

	"scalerisk/water"
)

// caSO4Spread is how far above Møller's (1988) Pitzer set our calcium
// sulfate saturation indices read in NaCl brines, by temperature: the
// largest difference over gypsum and anhydrite in 0.5–4 mol/kg NaCl when
// both sets are held to the same solubility in pure water. Computed by
// testdata/reference/caso4_hot_brine_spread.py (values in
// testdata/caso4_hot_brine_spread.csv) [COMPUTED]. The Ca–SO4 parameters
// here change with temperature only to 50 °C (Silvester & Pitzer 1979);
// Møller's set was fitted to calcium sulfate solubilities in hot NaCl
// solutions (Møller 1988, GCA 52:821).
var caSO4Spread = []struct{ t, si float64 }{{25, 0.070}, {50, 0.136}, {75, 0.159}, {90, 0.172}}

// caSO4SpreadAt interpolates caSO4Spread linearly in temperature, held
// at its ends.
func caSO4SpreadAt(t float64) float64 {
	tab := caSO4Spread
	if t <= tab[0].t {
		return tab[0].si
	}
	for k := 1; k < len(tab); k++ {
		if t <= tab[k].t {
			f := (t - tab[k-1].t) / (tab[k].t - tab[k-1].t)
			return tab[k-1].si + f*(tab[k].si-tab[k-1].si)
		}
	}
	return tab[len(tab)-1].si
}

// Thresholds of the hot-brine calcium sulfate note: above caSO4NoteT °C
// the spread passes 0.1; below caSO4NoteI mol/kg the brine terms that
// carry it are small.
const (
	caSO4NoteT = 40
	caSO4NoteI = 0.5
)

// caSO4HotBrineNote says, for a hot salt water that holds calcium and
// sulfate, how high the calcium sulfate saturation indices may read; ""
// otherwise.
func (s *solver) caSO4HotBrineNote(t float64) string {
	set := s.pz.set
	total := func(c water.Component) float64 { return s.p.totals[set.model.compMaster[c]] }
	if t <= caSO4NoteT || math.Exp(s.lnI) < caSO4NoteI || !(total(water.Ca) > 0) || !(total(water.S) > 0) {
		return ""
	}
	return fmt.Sprintf("gypsum and anhydrite in a hot salt water: their saturation indices may read about %.2f high at %.4g °C. "+
		"Between 50 and 90 °C in 0.5–4 mol/kg NaCl they lie %.2f–%.2f above those of Møller's (1988) Pitzer set, which was fitted to calcium sulfate solubilities in hot NaCl solutions "+
		"(%.2f at 25 °C), because the calcium–sulfate parameters here change with temperature only to 50 °C; read a margin smaller than that as uncertain",
		caSO4SpreadAt(t), t, caSO4Spread[1].si, caSO4Spread[len(caSO4Spread)-1].si, caSO4Spread[0].si)
}
