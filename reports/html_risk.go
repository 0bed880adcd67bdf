package reports

import (
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

// inhibitorWords reports whether the bands speak of inhibitors: under the
// embedded inhibitor profile they do; under any other profile they speak
// of "its limit".
func (b *builder) inhibitorWords() bool { return b.profile.Name == "inhibitor" }

// bandText names band b in the words of the report's profile.
func (b *builder) bandText(bd saturation.Band) string {
	if b.inhibitorWords() {
		return bd.String()
	}
	switch bd {
	case saturation.WithinReach:
		return "supersaturated – within its limit"
	case saturation.BeyondReach:
		return "past its limit"
	}
	return bd.String()
}

// bandMeaning says in words what each band means for a reader.
func (b *builder) bandMeaning(bd saturation.Band) string {
	switch bd {
	case saturation.Undersaturated:
		return "SI below " + signed(-saturation.NearEquilibriumSI, 1) + ": the water dissolves the mineral rather than depositing it."
	case saturation.NearEquilibrium:
		return "SI from " + signed(-saturation.NearEquilibriumSI, 1) + " to " + signed(saturation.NearEquilibriumSI, 1) +
			": close to balance; small changes tip it either way."
	case saturation.SlowToForm:
		return "Supersaturated, but the mineral rarely forms as scale at these temperatures."
	case saturation.Supersaturated:
		return "Supersaturated; the limits used give no figure for this mineral."
	}
	if !b.inhibitorWords() {
		if bd == saturation.WithinReach {
			return "Supersaturated, but within its limit (" + profileWords(b.profile.Name) + ")."
		}
		return "Past its limit (" + profileWords(b.profile.Name) + "): expect deposits."
	}
	if bd == saturation.WithinReach {
		return "Supersaturated, within what an antiscalant programme usually holds in solution."
	}
	return "Supersaturated beyond what an antiscalant programme usually holds: expect deposits."
}

// bandRows are the legend of the risk bands.
func (b *builder) bandRows() []bandRow {
	var out []bandRow
	for _, bd := range allBands {
		out = append(out, bandRow{Chip: b.bandChip(bd), Meaning: b.bandMeaning(bd)})
	}
	return out
}

// bandChip is the chip of band bd.
func (b *builder) bandChip(bd saturation.Band) chip {
	return chip{b.bandText(bd), bandStyleOf(bd).Class}
}

// band is the chip of mineral at saturation index si under the profile.
func (b *builder) band(mineral string, si float64) chip {
	return b.bandChip(saturation.BandUnder(b.profile, mineral, si))
}

// limitOf is the SI limit the profile sets on mineral; ok is false when it
// sets none or the mineral is slow to form.
func (b *builder) limitOf(mineral string) (limit float64, slow, ok bool) {
	if r, _ := saturation.InhibitorReach(mineral); r.Slow {
		return 0, true, false
	}
	l, ok := b.profile.Lookup("si:" + mineral)
	if !ok || !finite(l.Max) {
		return 0, false, false
	}
	return l.Max, false, true
}

// limiting is the limiting mineral of r under the profile.
func (b *builder) limiting(r *saturation.Result) (saturation.Ranked, bool) {
	return saturation.Limiting(r, &b.profile)
}

// scaleFormer reports whether mineral name at saturation index si is one a
// reader must watch: not slow to form, and given a limit by the profile or
// supersaturated.
func (b *builder) scaleFormer(name string, si float64) bool {
	if _, slow, ok := b.limitOf(name); ok || slow {
		return ok
	}
	return saturation.BandUnder(b.profile, name, si) == saturation.Supersaturated
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

// limitingNote says how the limiting mineral is chosen.
func (b *builder) limitingNote() string {
	return "The limiting mineral is the scale former most at risk under " + profileWords(b.profile.Name) +
		": a mineral past its limit first (the furthest past), then the supersaturated ones by saturation index."
}

// limitsNote says where the limits of the tables come from.
func (b *builder) limitsNote() string {
	if b.inhibitorWords() {
		return "Limits: the saturation index an antiscalant programme usually holds (common practice); the limits " +
			"of the product actually used govern."
	}
	return "Limits: " + profileWords(b.profile.Name) + "; the methods give their basis."
}
