package reports

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"text/tabwriter"

	"scalerisk/saturation"
	"scalerisk/water"
)

// assessExtraHeader are the CSV columns of assess after other_analytes:
// the sample's date (ISO) and role, its data-quality flags, the risk band
// of each mineral, and the lab's total hardness and P-alkalinity (mg/L as
// CaCO3, used only in the data-quality checks).
func assessExtraHeader(minerals []string) []string {
	h := []string{"date", "role", "quality_flags"}
	for _, m := range minerals {
		h = append(h, "band_"+m)
	}
	return append(h, "total_hardness_mg_per_l_as_caco3", "p_alkalinity_mg_per_l_as_caco3")
}

// assessExtraRow is the row part of assessExtraHeader for one assessment.
func assessExtraRow(a saturation.Assessment, s SampleJSON, minerals []string) []string {
	role := ""
	if a.Input.Role != water.RoleUnset {
		role = a.Input.Role.String()
	}
	flags := ""
	if s.Quality != nil {
		flags = strings.Join(s.Quality.Flags, "; ")
	}
	row := []string{s.Date, role, flags}
	bands := make([]string, len(minerals))
	if a.Result != nil {
		for _, m := range a.Result.Minerals {
			if i := slices.Index(minerals, m.Name); i >= 0 && !math.IsNaN(m.SI) {
				bands[i] = saturation.RiskBand(m.Name, m.SI).String()
			}
		}
	}
	row = append(row, bands...)
	if s.Quality == nil {
		return append(row, "", "")
	}
	return append(row, fmtG(s.Quality.TotalHardness), fmtG(s.Quality.PAlkalinity))
}

// writeSpeciesText writes the speciation table of an assessment (assess
// --species): each species of positive molality, in the order of the
// result, with molality, activity coefficient and activity; nothing when
// the sample was not speciated.
func writeSpeciesText(b *strings.Builder, a saturation.Assessment) {
	if a.Result == nil {
		return
	}
	b.WriteString("  Species\n")
	tw := tabwriter.NewWriter(b, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "    species\tmolality (mol/kg)\tactivity coefficient\tactivity\t")
	for _, sp := range a.Result.Species {
		if sp.Molality <= 0 || math.IsNaN(sp.Molality) {
			continue
		}
		fmt.Fprintf(tw, "    %s\t%s\t%s\t%s\t\n", sp.Name, molalityText(sp.Molality), gammaText(sp.Gamma), molalityText(sp.Activity))
	}
	tw.Flush()
}

// molalityText is the one text format of a molality or an activity: four
// significant digits in exponent form (1.234e-03).
func molalityText(x float64) string { return fmt.Sprintf("%.3e", x) }

// gammaText is the one text format of an activity coefficient: three
// decimals.
func gammaText(x float64) string { return fmt.Sprintf("%.3f", x) }
