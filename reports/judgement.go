package reports

import (
	"fmt"
	"math"
	"strings"

	"scalerisk/saturation"
)

// JudgementJSON says at which temperatures a decision (cycles, dose) was
// judged and which one governs it. It is part of the JSON of cycles and
// dose; the key names are a contract.
type JudgementJSON struct {
	// GoverningTemperatureC is the temperature whose answer is the
	// decision, °C: the bulk's or the skin's, the stricter.
	GoverningTemperatureC float64 `json:"governing_temperature_c"`
	// Governing is "bulk" or "skin".
	Governing string `json:"governing"`
	// BulkTemperatureC is the temperature of evaluation, °C.
	BulkTemperatureC float64 `json:"bulk_temperature_c"`
	// SkinTemperatureC is the skin temperature, °C; null when the decision
	// was judged at the bulk only (no skin, or one not above the bulk).
	SkinTemperatureC *float64 `json:"skin_temperature_c"`
	// The answers judged at each temperature alone (cycles keys for
	// cycles, dose keys for dose); the skin's are null without a skin.
	MaxCyclesBulk *float64 `json:"max_cycles_bulk,omitempty"`
	MaxCyclesSkin *float64 `json:"max_cycles_skin,omitempty"`
	DoseBulk      *float64 `json:"dose_bulk_mg_per_l,omitempty"`
	DoseSkin      *float64 `json:"dose_skin_mg_per_l,omitempty"`
	// SafeFractionBulk and SafeFractionSkin are the safe share of the
	// first water of a blend judged at each temperature alone.
	SafeFractionBulk *float64 `json:"safe_fraction_bulk,omitempty"`
	SafeFractionSkin *float64 `json:"safe_fraction_skin,omitempty"`
}

// judgementJSON is the JSON of a judgement of a decision of kind "cycles",
// "dose" or "blend" (the safe share of a blend); any other kind gives the
// temperatures only.
func judgementJSON(j saturation.Judgement, kind string) JudgementJSON {
	out := JudgementJSON{GoverningTemperatureC: dec(j.Governing, 2), Governing: "bulk", BulkTemperatureC: dec(j.Bulk, 2)}
	if j.SkinGoverns() {
		out.Governing = "skin"
	}
	round := func(x float64) float64 { return sig(x, 5) }
	if !math.IsNaN(j.Skin) {
		out.SkinTemperatureC = optional(j.Skin, round)
	}
	bulk, skin := optional(j.AtBulk, round), optional(j.AtSkin, round)
	switch kind {
	case "cycles":
		out.MaxCyclesBulk, out.MaxCyclesSkin = bulk, skin
	case "dose":
		out.DoseBulk, out.DoseSkin = bulk, skin
	case "blend":
		out.SafeFractionBulk, out.SafeFractionSkin = bulk, skin
	}
	return out
}

// writeJudgement writes the line that says which temperature governs a
// decision and what the other one alone would give; nothing when the
// decision was judged at the bulk only. answer formats an answer.
func writeJudgement(b *strings.Builder, j saturation.Judgement, answer func(float64) string) {
	if math.IsNaN(j.Skin) {
		return
	}
	if j.SkinGoverns() {
		fmt.Fprintf(b, "  Governed by the %g °C skin (the hottest surface, bulk pH held): %s there; the %.3g °C bulk alone would give %s.\n",
			j.Skin, answer(j.AtSkin), j.Bulk, answer(j.AtBulk))
		return
	}
	fmt.Fprintf(b, "  Governed by the %.3g °C bulk: %s; the %g °C skin alone would give %s.\n", j.Bulk, answer(j.AtBulk), j.Skin, answer(j.AtSkin))
}
