package reports

import (
	"io"
	"math"
	"slices"
	"strconv"
	"strings"

	"scalerisk/saturation"
	"scalerisk/water"
)

// SampleJSON is one sample of the JSON output of assess. The key names are
// a contract that other programs parse: extend, never rename.
type SampleJSON struct {
	Name                 string             `json:"name"`
	Date                 string             `json:"date,omitempty"` // ISO 8601 (see --date-format)
	Role                 string             `json:"role,omitempty"`
	File                 string             `json:"file,omitempty"`
	Line                 int                `json:"line,omitempty"`
	TemperatureC         *float64           `json:"temperature_c"`
	PH                   *float64           `json:"ph"`
	ActivityModel        *string            `json:"activity_model"`
	IonicStrength        *float64           `json:"ionic_strength"`
	ChargeBalancePercent *float64           `json:"charge_balance_percent"`
	AlkalinityMeqPerKg   *float64           `json:"alkalinity_meq_per_kg,omitempty"`
	LogPCO2              *float64           `json:"log_pco2,omitempty"`
	SaturationIndex      map[string]float64 `json:"saturation_index"`
	RiskBand             map[string]string  `json:"risk_band,omitempty"`
	// Limiting is the limiting mineral under the inhibitor profile (null
	// when none is at or above near equilibrium, or not computed); Ranking
	// lists the scale formers at or above near equilibrium, most at risk
	// first (saturation.Rank).
	Limiting       *RankedJSON         `json:"limiting"`
	Ranking        []RankedJSON        `json:"ranking,omitempty"`
	Indices        *IndicesJSON        `json:"indices"`
	Precipitation  []PrecipitationJSON `json:"precipitation,omitempty"`
	Species        []SpeciesJSON       `json:"species"`
	Totals         map[string]float64  `json:"totals"`
	Quality        *QualityJSON        `json:"quality,omitempty"`
	BelowDetection []string            `json:"below_detection,omitempty"`
	Warnings       []string            `json:"warnings"`
	Error          *string             `json:"error"`
	// OtherAnalytes are the laboratory's values the equilibrium does not
	// use (turbidity, TOC, free chlorine …), as written, in file order.
	// Total hardness and P-alkalinity, used in the data-quality checks, are
	// in Quality.
	OtherAnalytes []OtherAnalyteJSON `json:"other_analytes,omitempty"`
}

// OtherAnalyteJSON is one value of a column the equilibrium does not use:
// the column's header, the known measurement it names (left out when the
// column is not recognised) and the cell as written.
type OtherAnalyteJSON struct {
	Column string `json:"column"`
	Name   string `json:"name,omitempty"`
	Value  string `json:"value"`
}

// otherAnalytes returns the JSON form of a sample's other values.
func otherAnalytes(vs []water.OtherValue) []OtherAnalyteJSON {
	var out []OtherAnalyteJSON
	for _, v := range vs {
		out = append(out, OtherAnalyteJSON(v))
	}
	return out
}

// otherAnalytesCell is the CSV cell of a sample's other values:
// "column=value" joined by "; ".
func otherAnalytesCell(vs []OtherAnalyteJSON) string {
	cells := make([]string, len(vs))
	for i, v := range vs {
		cells[i] = v.Column + "=" + v.Value
	}
	return strings.Join(cells, "; ")
}

// IndicesJSON holds the classic indices; a key is left out where the
// water lacks what the index needs.
type IndicesJSON struct {
	LSI           *float64 `json:"lsi"`
	LSISimplified *float64 `json:"lsi_simplified"`
	RSI           *float64 `json:"rsi"`
	PSI           *float64 `json:"psi"`
	StiffDavis    *float64 `json:"stiff_davis"`
	LarsonSkold   *float64 `json:"larson_skold"`
	CCPP          *float64 `json:"ccpp_mg_per_l"`
	PHs           *float64 `json:"phs,omitempty"`
}

// PrecipitationJSON is the scale one supersaturated mineral could form:
// mg of mineral per litre alone and together with the others, and kg/day
// where a flow was given.
type PrecipitationJSON struct {
	Mineral          string   `json:"mineral"`
	SaturationIndex  float64  `json:"saturation_index"`
	AloneMgPerL      *float64 `json:"alone_mg_per_l,omitempty"`
	TogetherMgPerL   *float64 `json:"together_mg_per_l,omitempty"`
	AloneKgPerDay    *float64 `json:"alone_kg_per_day,omitempty"`
	TogetherKgPerDay *float64 `json:"together_kg_per_day,omitempty"`
}

func indicesJSON(ix *saturation.Indices) *IndicesJSON {
	if ix == nil {
		return nil
	}
	d2 := func(x float64) float64 { return dec(x, 2) }
	return &IndicesJSON{LSI: optional(ix.LSI, d2), LSISimplified: optional(ix.LSISimplified, d2),
		RSI: optional(ix.RSI, d2), PSI: optional(ix.PSI, d2), StiffDavis: optional(ix.StiffDavis, d2),
		LarsonSkold: optional(ix.LarsonSkold, d2), CCPP: optional(ix.CCPP, func(x float64) float64 { return dec(x, 1) }),
		PHs: optional(ix.PHs, d2)}
}

func precipitationJSON(ps []saturation.Precipitation, flow float64) []PrecipitationJSON {
	var out []PrecipitationJSON
	mg := func(x float64) float64 { return sig(x, 4) }
	for _, p := range ps {
		j := PrecipitationJSON{Mineral: p.Mineral, SaturationIndex: dec(p.SI, 3),
			AloneMgPerL: optional(p.Alone, mg), TogetherMgPerL: optional(p.Together, mg)}
		if flow > 0 {
			j.AloneKgPerDay = optional(saturation.KgPerDay(p.Alone, flow), mg)
			j.TogetherKgPerDay = optional(saturation.KgPerDay(p.Together, flow), mg)
		}
		out = append(out, j)
	}
	return out
}

// SpeciesJSON is one aqueous species: molality in mol/kg of water.
type SpeciesJSON struct {
	Name     string  `json:"name"`
	Molality float64 `json:"molality"`
	Gamma    float64 `json:"gamma"`
	Activity float64 `json:"activity"`
}

// QualityJSON holds the data-quality checks of one sample.
type QualityJSON struct {
	CationsMeqPerL                *float64 `json:"cations_meq_per_l,omitempty"`
	AnionsMeqPerL                 *float64 `json:"anions_meq_per_l,omitempty"`
	BalancePercent                *float64 `json:"balance_percent,omitempty"`
	BalanceLimit                  string   `json:"balance_limit"`
	BalanceAcceptable             bool     `json:"balance_acceptable"`
	TDSCalculatedMgPerL           *float64 `json:"tds_calculated_mg_per_l,omitempty"`
	TDSMeasuredMgPerL             *float64 `json:"tds_measured_mg_per_l,omitempty"`
	ConductivityCalculated        *float64 `json:"conductivity_calculated_us_per_cm,omitempty"`
	ConductivityMeasured          *float64 `json:"conductivity_measured_us_per_cm,omitempty"`
	IonicStrength                 *float64 `json:"ionic_strength_composition,omitempty"`
	IonicStrengthFromTDS          *float64 `json:"ionic_strength_from_tds,omitempty"`
	IonicStrengthFromConductivity *float64 `json:"ionic_strength_from_conductivity,omitempty"`
	// Seawater marks a seawater-like water, checked by its practical
	// salinity (PSS-78) instead of the fresh-water conductivity criteria.
	Seawater                *bool    `json:"seawater,omitempty"`
	SalinityFromEC          *float64 `json:"practical_salinity_from_ec,omitempty"`
	SalinityFromComposition *float64 `json:"practical_salinity_from_composition,omitempty"`
	Flags                   []string `json:"flags"`
	// TotalHardness and PAlkalinity are the lab's total hardness and
	// P-alkalinity, mg/L as CaCO3, which the equilibrium does not use but
	// the analysis is checked against (a failed check is among Flags);
	// left out when the lab gave none.
	TotalHardness *float64 `json:"total_hardness_mg_per_l_as_caco3,omitempty"`
	PAlkalinity   *float64 `json:"p_alkalinity_mg_per_l_as_caco3,omitempty"`
}

// AssessJSON is the whole JSON document of assess.
type AssessJSON struct {
	Samples []SampleJSON `json:"samples"`
	Caution string       `json:"caution"`
}

// Sample turns one assessment into its JSON form: values rounded for
// display, NaN never written (the key is left out instead).
func Sample(as saturation.Assessment) SampleJSON { return sample(as, true) }

// sample is Sample; without full it leaves out what the CSV row does not
// show (risk bands, ranking, species), which is most of the cost of a row.
func sample(as saturation.Assessment, full bool) SampleJSON {
	s := SampleJSON{Name: as.Name, File: as.File, Line: as.Line, Warnings: []string{}}
	if as.Err != nil {
		msg := as.Err.Error()
		s.Error = &msg
	}
	if as.BadInput {
		return s
	}
	s.Date = as.Input.Date
	if as.Input.Role != water.RoleUnset {
		s.Role = as.Input.Role.String()
	}
	q := as.Quality
	s.ChargeBalancePercent = optional(q.BalancePercent, func(x float64) float64 { return dec(x, 2) })
	s.Quality = qualityJSON(q)
	s.Quality.TotalHardness = optional(as.Input.TotalHardness, func(x float64) float64 { return sig(x, 4) })
	s.Quality.PAlkalinity = optional(as.Input.PAlkalinity, func(x float64) float64 { return sig(x, 4) })
	s.BelowDetection = as.Input.BelowDetection
	s.OtherAnalytes = otherAnalytes(as.Input.Other)
	s.Warnings = append(s.Warnings, as.Input.Warnings...)
	s.Totals = totals(as.Input)
	r := as.Result
	if r == nil {
		return s
	}
	s.Totals = totals(r.Analysis)
	s.TemperatureC = optional(r.Temperature, func(x float64) float64 { return dec(x, 2) })
	s.PH = optional(r.PH, func(x float64) float64 { return dec(x, 3) })
	model := r.Activity.String()
	s.ActivityModel = &model
	s.IonicStrength = optional(r.IonicStrength, func(x float64) float64 { return sig(x, 4) })
	s.AlkalinityMeqPerKg = optional(1000*r.Alkalinity, func(x float64) float64 { return sig(x, 5) })
	s.LogPCO2 = optional(r.LogPCO2, func(x float64) float64 { return dec(x, 3) })
	s.SaturationIndex = map[string]float64{}
	for _, m := range r.Minerals {
		s.SaturationIndex[m.Name] = dec(m.SI, 3)
	}
	s.Warnings = append(s.Warnings, r.Warnings...)
	s.Indices = indicesJSON(as.Indices)
	s.Precipitation = precipitationJSON(as.Precipitation, as.Flow)
	s.Warnings = append(s.Warnings, as.Warnings...)
	if full {
		addRisk(&s, r)
	}
	return s
}

// addRisk adds the risk band of each mineral, the ranking, the limiting
// mineral and the species of r to s.
func addRisk(s *SampleJSON, r *saturation.Result) {
	s.RiskBand = map[string]string{}
	for _, m := range r.Minerals {
		s.RiskBand[m.Name] = saturation.RiskBand(m.Name, m.SI).String()
	}
	for _, rk := range saturation.Rank(r, nil) {
		s.Ranking = append(s.Ranking, rankedJSON(rk))
	}
	if len(s.Ranking) > 0 {
		s.Limiting = &s.Ranking[0]
	}
	for _, sp := range r.Species {
		if sp.Molality <= 0 || math.IsNaN(sp.Molality) {
			continue
		}
		s.Species = append(s.Species, SpeciesJSON{Name: sp.Name, Molality: sig(sp.Molality, 5),
			Gamma: sig(sp.Gamma, 5), Activity: sig(sp.Activity, 5)})
	}
}

func qualityJSON(q water.Quality) *QualityJSON {
	mgl := func(x float64) float64 { return sig(x, 4) }
	var seawater *bool
	if q.Seawater {
		seawater = &q.Seawater
	}
	d3 := func(x float64) float64 { return dec(x, 3) }
	return &QualityJSON{
		Seawater:                      seawater,
		SalinityFromEC:                optional(q.SalinityFromEC, d3),
		SalinityFromComposition:       optional(q.SalinityFromComposition, d3),
		CationsMeqPerL:                optional(q.Cations, func(x float64) float64 { return sig(x, 4) }),
		AnionsMeqPerL:                 optional(q.Anions, func(x float64) float64 { return sig(x, 4) }),
		BalancePercent:                optional(q.BalancePercent, func(x float64) float64 { return dec(x, 2) }),
		BalanceLimit:                  q.BalanceLimit,
		BalanceAcceptable:             q.BalanceAcceptable,
		TDSCalculatedMgPerL:           optional(q.TDSCalculated, mgl),
		TDSMeasuredMgPerL:             optional(q.TDSMeasured, mgl),
		ConductivityCalculated:        optional(q.ConductivityCalculated, mgl),
		ConductivityMeasured:          optional(q.ConductivityMeasured, mgl),
		IonicStrength:                 optional(q.IonicStrength, mgl),
		IonicStrengthFromTDS:          optional(q.IonicStrengthFromTDS, mgl),
		IonicStrengthFromConductivity: optional(q.IonicStrengthFromConductivity, mgl),
		Flags:                         append([]string{}, q.Flags...),
	}
}

// totals returns mol/kg of water by element symbol for the measured
// components, and C when inorganic carbon is known.
func totals(a water.Analysis) map[string]float64 {
	out := map[string]float64{}
	for c := range water.NumComponents {
		if c == water.C {
			if a.CarbonKnown && a.Totals[c] > 0 {
				out[c.String()] = sig(a.Totals[c], 6)
			}
			continue
		}
		if a.Measured[c] || a.Totals[c] > 0 {
			out[c.String()] = sig(a.Totals[c], 6)
		}
	}
	return out
}

// WriteAssessments writes assessments in format f (JSON indented), with a
// CSV column for every mineral computed in any of them.
func WriteAssessments(w io.Writer, f Format, as []saturation.Assessment) error {
	return NewAssessWriter(w, f, mineralOrder(as), WriteOptions{Indent: true}).WriteAll(as...)
}

// NewAssessWriter returns a writer of assessments, one at a time, in format
// f. minerals are the "si_" columns of CSV, in order (a mineral a sample
// lacks is a blank cell; give every mineral of the model, as
// Table.Minerals lists them, to fix the columns before any sample is
// computed).
func NewAssessWriter(w io.Writer, f Format, minerals []string, opt WriteOptions) *SampleWriter[saturation.Assessment] {
	return NewSampleWriter(w, f, Layout[saturation.Assessment]{
		JSON:   func(a saturation.Assessment) any { return Sample(a) },
		Header: assessHeader(minerals),
		CSV:    func(a saturation.Assessment) [][]string { return [][]string{assessRow(a, minerals)} },
		Text: func(b *strings.Builder, a saturation.Assessment) {
			writeAssessText(b, a)
			if opt.Species {
				writeSpeciesText(b, a)
			}
		},
		Caution: Caution,
	}, opt)
}

// mineralOrder returns the minerals computed in any assessment, in the
// order of first appearance (the table's order).
func mineralOrder(as []saturation.Assessment) []string {
	var names []string
	seen := map[string]bool{}
	for _, a := range as {
		if a.Result == nil {
			continue
		}
		for _, m := range a.Result.Minerals {
			if !seen[m.Name] {
				seen[m.Name] = true
				names = append(names, m.Name)
			}
		}
	}
	return names
}

func formatOpt(p *float64, prec int) string {
	if p == nil {
		return ""
	}
	return strconv.FormatFloat(*p, 'f', prec, 64)
}

// assessHeader is the CSV header of assess.
func assessHeader(minerals []string) []string {
	header := []string{"name", "file", "line", "temperature_c", "ph", "ionic_strength", "activity_model",
		"charge_balance_percent", "alkalinity_meq_per_kg",
		"lsi", "lsi_simplified", "rsi", "psi", "stiff_davis", "larson_skold", "ccpp_mg_per_l"}
	for _, c := range water.Components() {
		header = append(header, "total_"+c.String()+"_mol_per_kg")
	}
	for _, m := range minerals {
		header = append(header, "si_"+m)
	}
	header = append(header, "error", "warnings", "other_analytes")
	return append(header, assessExtraHeader(minerals)...)
}

// notDefined is what the text and CSV writers say for an index that is not
// defined for the water (JSON writes null).
const notDefined = "not defined"

// assessRow is the CSV row of one assessment.
func assessRow(a saturation.Assessment, minerals []string) []string {
	s := sample(a, false)
	row := []string{s.Name, s.File, strconv.Itoa(s.Line), formatOpt(s.TemperatureC, 2), formatOpt(s.PH, 3),
		fmtG(s.IonicStrength), strOrBlank(s.ActivityModel), formatOpt(s.ChargeBalancePercent, 2), fmtG(s.AlkalinityMeqPerKg)}
	ix := s.Indices
	if ix == nil {
		ix = &IndicesJSON{}
	}
	ls := fmtG(ix.LarsonSkold)
	if a.Indices != nil && a.Indices.LarsonSkoldUndefined {
		ls = notDefined
	}
	row = append(row, fmtG(ix.LSI), fmtG(ix.LSISimplified), fmtG(ix.RSI), fmtG(ix.PSI), fmtG(ix.StiffDavis),
		ls, fmtG(ix.CCPP))
	for _, c := range water.Components() {
		if v, ok := s.Totals[c.String()]; ok {
			row = append(row, strconv.FormatFloat(v, 'g', -1, 64))
		} else {
			row = append(row, "")
		}
	}
	for _, m := range minerals {
		if v, ok := s.SaturationIndex[m]; ok {
			row = append(row, strconv.FormatFloat(v, 'f', 3, 64))
		} else {
			row = append(row, "")
		}
	}
	errText := ""
	if s.Error != nil {
		errText = *s.Error
	}
	row = append(row, errText, strings.Join(append(slices.Clone(s.BelowDetection), s.Warnings...), "; "),
		otherAnalytesCell(s.OtherAnalytes))
	return append(row, assessExtraRow(a, s, minerals)...)
}

func strOrBlank(p *string) string {
	if p == nil {
		return ""
	}
	return *p
}

func fmtG(p *float64) string {
	if p == nil {
		return ""
	}
	return strconv.FormatFloat(*p, 'g', -1, 64)
}

// RankedJSON is a mineral of the ranking: its saturation index, the limit
// of the inhibitor profile (null without one), the margin left to it
// (limit − SI) and its risk band.
type RankedJSON struct {
	Mineral         string   `json:"mineral"`
	Formula         string   `json:"formula"`
	SaturationIndex float64  `json:"saturation_index"`
	Limit           *float64 `json:"limit"`
	Margin          *float64 `json:"margin"`
	RiskBand        string   `json:"risk_band"`
}

func rankedJSON(rk saturation.Ranked) RankedJSON {
	return RankedJSON{Mineral: rk.Name, Formula: rk.Formula, SaturationIndex: dec(rk.SI, 3),
		Limit:  optional(rk.Limit, func(x float64) float64 { return dec(x, 3) }),
		Margin: optional(rk.Margin, func(x float64) float64 { return dec(x, 3) }), RiskBand: rk.Band.String()}
}
