package reports

import (
	"cmp"
	"math"
	"slices"
	"strings"

	"scalerisk/saturation"
)

// The palette of the report: the Okabe–Ito colours (Okabe, M. and Ito, K.
// (2008) "Color Universal Design"), which stay distinct under the common
// forms of colour blindness.
const (
	colBlack     = "#000000"
	colOrange    = "#E69F00"
	colSky       = "#56B4E9"
	colGreen     = "#009E73"
	colYellow    = "#F0E442"
	colBlue      = "#0072B2"
	colVermilion = "#D55E00"
	colPurple    = "#CC79A7"
)

// palette is the series order of charts with several series.
var palette = []string{colBlue, colOrange, colGreen, colPurple, colSky, colVermilion, colYellow, colBlack}

// bandStyle is how a risk band is drawn: its fill, the text colour on that
// fill, and the CSS class of its chips.
type bandStyle struct {
	Fill, Text, Class string
}

// bandStyleOf maps each band to a colour of the palette, from blue (the
// water dissolves the mineral) to vermilion (beyond what an inhibitor
// holds). The text colours keep a contrast of at least 4.5:1.
func bandStyleOf(b saturation.Band) bandStyle {
	switch b {
	case saturation.Undersaturated:
		return bandStyle{colBlue, "#ffffff", "b-under"}
	case saturation.NearEquilibrium:
		return bandStyle{colSky, "#000000", "b-near"}
	case saturation.SlowToForm:
		return bandStyle{colGreen, "#000000", "b-slow"}
	case saturation.WithinReach:
		return bandStyle{colYellow, "#000000", "b-within"}
	case saturation.Supersaturated:
		return bandStyle{colOrange, "#000000", "b-super"}
	}
	return bandStyle{colVermilion, "#000000", "b-beyond"}
}

// allBands lists the risk bands from least to most risk.
var allBands = []saturation.Band{saturation.Undersaturated, saturation.NearEquilibrium, saturation.SlowToForm,
	saturation.WithinReach, saturation.Supersaturated, saturation.BeyondReach}

// bandMeaning says in words what each band means for a reader.
func bandMeaning(b saturation.Band) string {
	switch b {
	case saturation.Undersaturated:
		return "SI below −0.2: the water dissolves the mineral rather than depositing it."
	case saturation.NearEquilibrium:
		return "SI from −0.2 to +0.2: close to balance; small changes tip it either way."
	case saturation.SlowToForm:
		return "Supersaturated, but the mineral rarely forms as scale at these temperatures."
	case saturation.WithinReach:
		return "Supersaturated, within what an antiscalant programme usually holds in solution."
	case saturation.Supersaturated:
		return "Supersaturated; no common inhibitor figure exists for this mineral."
	}
	return "Supersaturated beyond what an antiscalant programme usually holds: expect deposits."
}

// mineralLabel is a mineral name as a reader writes it: words instead of
// underscores, with a trailing qualifier moved to the front
// ("silica_amorphous" → "amorphous silica").
func mineralLabel(name string) string {
	parts := strings.Split(name, "_")
	if len(parts) == 2 && (parts[1] == "amorphous" || parts[1] == "crystalline") {
		return parts[1] + " " + parts[0]
	}
	return strings.Join(parts, " ")
}

// scaleFormer reports whether mineral name at saturation index si takes
// part in the choice of the limiting mineral: minerals the inhibitor table
// marks slow to form never do; minerals the table lists do; others only
// when supersaturated (they have no inhibitor figure to compare with).
func scaleFormer(name string, si float64) bool {
	reach, listed := saturation.InhibitorReach(name)
	if listed {
		return !reach.Slow
	}
	return saturation.RiskBand(name, si) == saturation.Supersaturated
}

// risk is the rank of a mineral's saturation state: its band first, then,
// within a band, its distance past the inhibitor limit (for the bands that
// compare with it) or its saturation index.
type risk struct {
	band  saturation.Band
	score float64
}

func riskOf(name string, si float64) risk {
	b := saturation.RiskBand(name, si)
	score := si
	switch b {
	case saturation.BeyondReach:
		reach, _ := saturation.InhibitorReach(name)
		score = si - reach.MaxSI
	case saturation.Supersaturated:
		// Without an inhibitor figure a mineral ranks with those within
		// reach, by its saturation index: it does not outrank a more
		// supersaturated calcite only for lacking a figure.
		b = saturation.WithinReach
	}
	return risk{b, score}
}

func (r risk) compare(o risk) int {
	if c := cmp.Compare(r.band, o.band); c != 0 {
		return c
	}
	return cmp.Compare(r.score, o.score)
}

// limiting returns the limiting mineral of a result: among the scale
// formers (see scaleFormer) that are not undersaturated, the one in the
// highest risk band — beyond inhibitor reach first, ranked by the distance
// past the limit; then supersaturated minerals with or without an
// inhibitor figure together, ranked by saturation index. ok is false when
// no mineral qualifies (the water is undersaturated in all of them).
func limiting(r *saturation.Result) (m saturation.MineralResult, ok bool) {
	if r == nil {
		return m, false
	}
	var best risk
	for _, x := range r.Minerals {
		if !finite(x.SI) || !scaleFormer(x.Name, x.SI) || saturation.RiskBand(x.Name, x.SI) == saturation.Undersaturated {
			continue
		}
		rk := riskOf(x.Name, x.SI)
		if !ok || rk.compare(best) > 0 {
			m, best, ok = x, rk, true
		}
	}
	return m, ok
}

// maxChartPanels caps the minerals charted for one water.
const maxChartPanels = 6

// chartMinerals picks the minerals to chart for a water from its results
// (the sample itself and the points of a sweep): the scale formers listed
// in the inhibitor table that come within 1 SI unit of saturation
// anywhere, and other minerals that are supersaturated anywhere. Of
// minerals sharing a formula (calcite, aragonite and vaterite) only the
// one with the highest saturation index is kept. The maxChartPanels with
// the highest risk anywhere (see limiting) are chosen, and shown in order
// of their risk in the first result (the sample itself). When none
// qualifies, the two listed scale formers closest to saturation are taken,
// so that a chart shows how far the water is from scaling.
func chartMinerals(results []*saturation.Result) []saturation.MineralResult {
	type agg struct {
		m     saturation.MineralResult
		maxSI float64
		first risk // in results[0]
		worst risk
		order int
	}
	byName := map[string]*agg{}
	var names []string
	for ri, r := range results {
		if r == nil {
			continue
		}
		for _, m := range r.Minerals {
			if !finite(m.SI) {
				continue
			}
			a, seen := byName[m.Name]
			if !seen {
				a = &agg{m: m, maxSI: math.Inf(-1), first: risk{band: -1, score: math.Inf(-1)},
					worst: risk{band: -1}, order: len(names)}
				byName[m.Name] = a
				names = append(names, m.Name)
			}
			if ri == 0 {
				a.first = riskOf(m.Name, m.SI)
			}
			a.maxSI = math.Max(a.maxSI, m.SI)
			if rk := riskOf(m.Name, m.SI); rk.compare(a.worst) > 0 {
				a.worst = rk
			}
		}
	}
	qualifies := func(a *agg) bool {
		reach, listed := saturation.InhibitorReach(a.m.Name)
		if listed {
			return !reach.Slow && a.maxSI >= -1
		}
		return saturation.RiskBand(a.m.Name, a.maxSI) == saturation.Supersaturated
	}
	listedFormer := func(a *agg) bool {
		reach, listed := saturation.InhibitorReach(a.m.Name)
		return listed && !reach.Slow
	}
	pick := func(keep func(*agg) bool) []*agg {
		best := map[string]*agg{} // by formula
		for _, n := range names {
			a := byName[n]
			if !keep(a) {
				continue
			}
			key := a.m.Formula
			if key == "" {
				key = a.m.Name
			}
			if b, ok := best[key]; !ok || a.maxSI > b.maxSI {
				best[key] = a
			}
		}
		var out []*agg
		for _, a := range best {
			out = append(out, a)
		}
		slices.SortFunc(out, func(x, y *agg) int {
			if c := y.worst.compare(x.worst); c != 0 {
				return c
			}
			return cmp.Compare(x.order, y.order)
		})
		return out
	}
	chosen := pick(qualifies)
	if len(chosen) == 0 {
		chosen = pick(listedFormer)
		slices.SortFunc(chosen, func(x, y *agg) int {
			if c := cmp.Compare(y.maxSI, x.maxSI); c != 0 {
				return c
			}
			return cmp.Compare(x.order, y.order)
		})
		chosen = chosen[:min(2, len(chosen))]
	}
	chosen = chosen[:min(maxChartPanels, len(chosen))]
	slices.SortStableFunc(chosen, func(x, y *agg) int { return y.first.compare(x.first) })
	out := make([]saturation.MineralResult, len(chosen))
	for i, a := range chosen {
		out[i] = a.m
	}
	return out
}
