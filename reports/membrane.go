package reports

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"scalerisk/saturation"
)

// MembraneOutcome is the reverse-osmosis answer for one feed water.
type MembraneOutcome struct {
	Name     string
	Membrane saturation.Membrane
	Water    *saturation.MembraneWater      // the concentrate at the recovery asked
	Max      *saturation.RecoveryResult     // the highest recovery under the profile
	Acid     *saturation.MembraneAcidResult // the feed acid for a target recovery (nil when none asked)
	AcidErr  error
	Err      error
}

// MembraneJSON is one feed of the JSON output of membrane. The key names
// are a contract: extend, never rename.
type MembraneJSON struct {
	Name                string          `json:"name"`
	Recovery            float64         `json:"recovery"`
	ConcentrationFactor float64         `json:"concentration_factor"`
	Polarisation        float64         `json:"polarisation"`
	SurfaceFactor       float64         `json:"surface_factor"`
	Feed                *WaterStateJSON `json:"feed"`
	Concentrate         *WaterStateJSON `json:"concentrate"`
	Surface             *WaterStateJSON `json:"surface"`
	Profile             string          `json:"profile"`
	MaxRecovery         *float64        `json:"max_recovery"`
	Limiting            string          `json:"limiting"`
	Exceeded            []string        `json:"exceeded"`
	JudgementJSON
	Acid     *MembraneAcidJSON `json:"acid"`
	Warnings []string          `json:"warnings"`
	Error    *string           `json:"error"`
}

// WaterStateJSON is the state of one water of a stage.
type WaterStateJSON struct {
	PH              float64            `json:"ph"`
	IonicStrength   float64            `json:"ionic_strength"`
	LSI             *float64           `json:"lsi"`
	StiffDavis      *float64           `json:"stiff_davis"`
	SaturationIndex map[string]float64 `json:"saturation_index"`
}

// MembraneAcidJSON is the feed acid that allows a target recovery.
type MembraneAcidJSON struct {
	Reagent         string   `json:"reagent"`
	StrengthPercent float64  `json:"strength_percent"`
	TargetRecovery  float64  `json:"target_recovery"`
	DoseMgPerL      *float64 `json:"dose_mg_per_l"`
	Reached         bool     `json:"reached"`
	FeedPH          *float64 `json:"feed_ph"`
	Limiting        string   `json:"limiting"`
	Warnings        []string `json:"warnings"`
	Error           *string  `json:"error,omitempty"`
}

// waterState is the JSON of a result and its indices.
func waterState(r *saturation.Result, ix saturation.Indices) *WaterStateJSON {
	if r == nil {
		return nil
	}
	j := &WaterStateJSON{PH: dec(r.PH, 3), IonicStrength: sig(r.IonicStrength, 4), SaturationIndex: map[string]float64{},
		LSI:        optional(ix.LSI, func(x float64) float64 { return dec(x, 2) }),
		StiffDavis: optional(ix.StiffDavis, func(x float64) float64 { return dec(x, 2) })}
	for _, m := range r.Minerals {
		j.SaturationIndex[m.Name] = dec(m.SI, 3)
	}
	return j
}

// NewMembraneWriter returns a writer of membrane answers, one feed at a
// time, in format f.
func NewMembraneWriter(w io.Writer, f Format, opt WriteOptions) *SampleWriter[MembraneOutcome] {
	return NewSampleWriter(w, f, Layout[MembraneOutcome]{
		JSON: func(m MembraneOutcome) any { return membraneJSON(m) },
		Header: []string{"name", "recovery", "concentration_factor", "polarisation", "feed_ph", "concentrate_ph", "surface_ph",
			"surface_lsi", "surface_si_calcite", "surface_si_gypsum", "surface_si_silica_amorphous", "profile", "max_recovery",
			"limiting", "governing_temperature_c", "acid_target_recovery", "acid_dose_mg_per_l", "acid_feed_ph", "error"},
		CSV:     func(m MembraneOutcome) [][]string { return [][]string{membraneRow(membraneJSON(m))} },
		Text:    writeMembraneText,
		Caution: DoseCaution,
	}, opt)
}

// membraneJSON is the JSON object of one feed.
func membraneJSON(m MembraneOutcome) MembraneJSON {
	j := MembraneJSON{Name: m.Name, Exceeded: []string{}, Warnings: []string{}}
	if m.Err != nil {
		msg := m.Err.Error()
		j.Error = &msg
		return j
	}
	beta := m.Membrane.Polarisation
	if beta == 0 {
		beta = saturation.DefaultPolarisation
	}
	w := m.Water
	j.Recovery, j.ConcentrationFactor, j.Polarisation = w.Recovery, sig(w.Factor, 5), beta
	j.SurfaceFactor = sig(beta*w.Factor, 5)
	j.Concentrate = waterState(w.Bulk, saturation.Indices{LSI: math.NaN(), StiffDavis: math.NaN()})
	j.Surface = waterState(w.Surface.Result, w.Surface.Indices)
	if mx := m.Max; mx != nil {
		j.Feed = waterState(mx.Points[0].Result, saturation.Indices{LSI: math.NaN(), StiffDavis: math.NaN()})
		j.Profile, j.Limiting = mx.Profile.Name, mx.Limiting
		j.MaxRecovery = optional(mx.Recovery, func(x float64) float64 { return dec(x, 3) })
		j.Exceeded = append(j.Exceeded, mx.Exceeded...)
		j.JudgementJSON = judgementJSON(mx.Judged, "")
		j.Warnings = append(j.Warnings, mx.Warnings...)
	}
	if m.AcidErr != nil {
		msg := m.AcidErr.Error()
		j.Acid = &MembraneAcidJSON{Error: &msg, Warnings: []string{}}
	} else if a := m.Acid; a != nil {
		j.Acid = &MembraneAcidJSON{Reagent: a.Reagent.Name, StrengthPercent: a.Strength, TargetRecovery: a.Recovery,
			Reached: a.Reached, Limiting: a.Limiting, Warnings: append([]string{}, a.Warnings...)}
		if a.Reached {
			j.Acid.DoseMgPerL = optional(a.Dose, func(x float64) float64 { return sig(x, 4) })
		}
		if a.Feed.Result != nil {
			j.Acid.FeedPH = optional(a.Feed.Result.PH, func(x float64) float64 { return dec(x, 2) })
		}
	}
	return j
}

// membraneRow is the CSV row of one feed.
func membraneRow(j MembraneJSON) []string {
	if j.Error != nil {
		row := make([]string, 19)
		row[0], row[18] = j.Name, *j.Error
		return row
	}
	si := func(s *WaterStateJSON, m string) string {
		if s == nil {
			return ""
		}
		if v, ok := s.SaturationIndex[m]; ok {
			return fmtF(v)
		}
		return ""
	}
	ph := func(s *WaterStateJSON) string {
		if s == nil {
			return ""
		}
		return fmtF(s.PH)
	}
	row := []string{j.Name, fmtF(j.Recovery), fmtF(j.ConcentrationFactor), fmtF(j.Polarisation), ph(j.Feed), ph(j.Concentrate),
		ph(j.Surface), fmtG(j.Surface.LSI), si(j.Surface, "calcite"), si(j.Surface, "gypsum"), si(j.Surface, "silica_amorphous"),
		j.Profile, fmtG(j.MaxRecovery), j.Limiting, fmtF(j.GoverningTemperatureC)}
	if a := j.Acid; a != nil && a.Error == nil {
		row = append(row, fmtF(a.TargetRecovery), fmtG(a.DoseMgPerL), fmtG(a.FeedPH))
	} else {
		row = append(row, "", "", "")
	}
	return append(row, "")
}

// writeMembraneText writes the text block of one feed.
func writeMembraneText(b *strings.Builder, m MembraneOutcome) {
	if m.Err != nil {
		fmt.Fprintf(b, "%s: not computed: %v\n", m.Name, m.Err)
		return
	}
	j := membraneJSON(m)
	fmt.Fprintf(b, "%s at %.0f %% recovery: the concentrate is %.3g × the feed, %.3g × at the membrane surface (polarisation %g).\n",
		m.Name, 100*j.Recovery, j.ConcentrationFactor, j.SurfaceFactor, j.Polarisation)
	if j.Feed != nil {
		fmt.Fprintf(b, "  pH: feed %.2f, concentrate %.2f (CO2 passes the membrane, bicarbonate does not).\n", j.Feed.PH, j.Concentrate.PH)
	}
	writeSurfaceTable(b, j.Surface)
	if mx := m.Max; mx != nil {
		switch {
		case len(mx.Exceeded) > 0:
			fmt.Fprintf(b, "  Highest recovery under the %s profile: none — the feed at the membrane surface already passes %s.\n",
				mx.Profile.Name, strings.Join(mx.Exceeded, ", "))
		case mx.Limiting == "":
			fmt.Fprintf(b, "  Highest recovery under the %s profile: no limit is reached up to %.0f %%.\n", mx.Profile.Name, 100*mx.Recovery)
		default:
			fmt.Fprintf(b, "  Highest recovery under the %s profile: %.1f %%, set by %s (at %.3g °C).\n",
				mx.Profile.Name, 100*mx.Recovery, mx.Limiting, mx.Judged.Governing)
		}
		writeJudgement(b, mx.Judged, func(v float64) string { return fmt.Sprintf("%.1f %% recovery", 100*v) })
	}
	switch a := m.Acid; {
	case m.AcidErr != nil:
		fmt.Fprintf(b, "  Acid for the target recovery not computed: %v\n", m.AcidErr)
	case a != nil && a.Reached && a.Dose == 0:
		fmt.Fprintf(b, "  At %.0f %% recovery the limits hold without acid.\n", 100*a.Recovery)
	case a != nil && a.Reached:
		fmt.Fprintf(b, "  For %.0f %% recovery: %.4g mg/L of %s (%g %%) in the feed, feed pH %.2f.\n",
			100*a.Recovery, a.Dose, a.Reagent.Name, a.Strength, a.Feed.Result.PH)
	}
	var notes []string
	notes = append(notes, j.Warnings...)
	if j.Acid != nil {
		notes = append(notes, j.Acid.Warnings...)
	}
	writeNotes(b, notes)
}

// writeSurfaceTable lists the minerals at the membrane surface from the
// near-equilibrium band up (SI above −saturation.NearEquilibriumSI),
// highest first.
func writeSurfaceTable(b *strings.Builder, s *WaterStateJSON) {
	type row struct {
		name string
		si   float64
	}
	var rows []row
	for n, v := range s.SaturationIndex {
		if v > -saturation.NearEquilibriumSI {
			rows = append(rows, row{n, v})
		}
	}
	sort.Slice(rows, func(i, k int) bool {
		if rows[i].si != rows[k].si {
			return rows[i].si > rows[k].si
		}
		return rows[i].name < rows[k].name
	})
	fmt.Fprintf(b, "  At the membrane surface: pH %.2f", s.PH)
	if s.LSI != nil {
		fmt.Fprintf(b, ", LSI %+.2f", *s.LSI)
	}
	if s.StiffDavis != nil {
		fmt.Fprintf(b, ", Stiff–Davis %+.2f", *s.StiffDavis)
	}
	b.WriteString("\n")
	for _, r := range rows {
		fmt.Fprintf(b, "    %-22s %+6.2f  %s\n", r.name, r.si, saturation.RiskBand(r.name, r.si))
	}
}
