package saturation

import (
	"fmt"
	"strings"
)

// FitNote returns the clause a finding headed by a mineral must carry when
// the mineral's constants are used outside the temperature range they were
// fitted over, e.g. "its constants are fitted to 5–37 °C, so this is an
// extrapolation"; "" inside the range. mineral is a mineral name or a
// limit quantity ("si:tricalcium_phosphate"); other quantities give "".
// m nil means DefaultModel.
func FitNote(m *Model, mineral string, t float64) string {
	if m == nil {
		m = DefaultModel()
	}
	name, isSI := strings.CutPrefix(mineral, "si:")
	if !isSI && strings.Contains(mineral, ":") {
		return ""
	}
	for _, e := range m.Table().Minerals() {
		if e.Name != name {
			continue
		}
		if t < e.TMin-1e-9 || t > e.TMax+1e-9 {
			return fmt.Sprintf("its constants are fitted to %g–%g °C, so at %.3g °C this is an extrapolation", e.TMin, e.TMax, t)
		}
		return ""
	}
	return ""
}
