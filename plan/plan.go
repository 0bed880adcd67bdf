// Package plan computes everything a client report shows for one sample —
// the sweeps behind its charts, its operating window, the dose,
// highest-cycles and blend searches, the minerals that matter and the
// findings read from them — and keeps every error. A report only lays a
// plan out.
//
// Import position: cmd → reports → plan → saturation → water.
package plan

import (
	"errors"
	"fmt"
	"math"

	"scalerisk/saturation"
	"scalerisk/uncertainty"
	"scalerisk/water"
)

// Defaults of Settings.
const (
	// DefaultSkinTemperature is the end of the temperature axis, °C: a
	// common tube-wall temperature of a cooling-water heat exchanger
	// (common practice).
	DefaultSkinTemperature = 60.0
	// DefaultMaxCycles is the end of the cycles-of-concentration axis.
	DefaultMaxCycles = 8.0
	// DefaultReagent is the reagent of the dose sweep: sulfuric acid.
	DefaultReagent = "h2so4"
)

// Settings says what a plan computes for every sample. The zero value
// computes the sweeps with the defaults and no search.
type Settings struct {
	// Speciation is the options the assessments were computed with; every
	// sweep and search uses them too.
	Speciation saturation.Options
	// SkinTemperature is the end of the temperature axis, °C (0 means
	// DefaultSkinTemperature). When a sample is already within 5 °C of it,
	// its axis runs 20 °C above the sample temperature instead.
	SkinTemperature float64
	// MaxCycles is the end of the cycles axis and of the highest-cycles
	// search (0 means DefaultMaxCycles).
	MaxCycles float64
	// Reagent is the reagent of the dose sweep and search (the zero value
	// means DefaultReagent); Strength its product strength, percent (0: the
	// table's usual).
	Reagent  water.Reagent
	Strength float64
	// MaxDose is the end of the dose axis, mg/L of product; 0 chooses, per
	// sample, the dose that would remove 80 % of the alkalinity (100 mg/L
	// when that is not defined).
	MaxDose float64
	// Target is the target of the dose search; nil runs none.
	Target *saturation.Target
	// Profile is the limit profile of the highest-cycles search, of the
	// bands and of the operating window; nil runs no search and takes the
	// embedded inhibitor profile for the bands and the window.
	Profile *saturation.LimitProfile
	// CyclesRule is the carbonate rule of every cycles figure (the search,
	// the cycles sweep, the window); nil means the closed system.
	CyclesRule *saturation.CarbonateRule
	// Partner, when set, is blended with every sample at BlendFraction
	// (the sample's share, 0–1 by volume).
	Partner       *water.Analysis
	BlendFraction float64
	// Uncertainty configures the Monte Carlo draws of every sample's
	// analysis (see package uncertainty); Draws 0 computes none.
	Uncertainty uncertainty.Settings
	// Detailed, when set, tells whether a sample may still get a full
	// section of the report; the operating window, which only a section
	// shows, is not computed for a sample it rejects (Window stays nil,
	// with no error). It is called after the sample's Ranking is set, from
	// many workers at once, and must be safe for that; a sample it rejects
	// must never get a section. Nil computes every window.
	Detailed func(p *Sample) bool
}

// Check reports the first setting out of range: SkinTemperature outside
// saturation.MinTemperature–MaxTemperature (0–150 °C), MaxCycles outside 1–50, MaxDose outside 0–100 000 mg/L,
// Strength outside 0–100 %, BlendFraction outside 0–1 with a partner. NaN
// is out of range.
func (s Settings) Check() error {
	switch {
	case !(s.SkinTemperature >= saturation.MinTemperature && s.SkinTemperature <= saturation.MaxTemperature):
		return fmt.Errorf("skin temperature %g °C is outside %d–%d °C", s.SkinTemperature,
			saturation.MinTemperature, saturation.MaxTemperature)
	case s.MaxCycles != 0 && !(s.MaxCycles > 1 && s.MaxCycles <= 50):
		return fmt.Errorf("maximum cycles %g is outside 1–50", s.MaxCycles)
	case !(s.MaxDose >= 0 && s.MaxDose <= 1e5):
		return fmt.Errorf("maximum dose %g mg/L is outside 0–100000 mg/L", s.MaxDose)
	case !(s.Strength >= 0 && s.Strength <= 100):
		return fmt.Errorf("reagent strength %g %% is outside 0–100 %%", s.Strength)
	case s.Partner != nil && !(s.BlendFraction >= 0 && s.BlendFraction <= 1):
		return fmt.Errorf("blend fraction %g: want a share from 0 to 1", s.BlendFraction)
	case s.Uncertainty.Draws != 0:
		return s.Uncertainty.Check()
	}
	return nil
}

// Skin is the end of the temperature axis, °C.
func (s Settings) Skin() float64 {
	if s.SkinTemperature == 0 {
		return DefaultSkinTemperature
	}
	return s.SkinTemperature
}

// Cycles is the end of the cycles axis.
func (s Settings) Cycles() float64 {
	if s.MaxCycles == 0 {
		return DefaultMaxCycles
	}
	return s.MaxCycles
}

// ReagentOrDefault is the reagent of the dose sweep.
func (s Settings) ReagentOrDefault() water.Reagent {
	if s.Reagent.Name != "" {
		return s.Reagent
	}
	r, err := water.LookupReagent(DefaultReagent)
	if err != nil {
		panic("plan: the reagent table has no " + DefaultReagent + ": " + err.Error())
	}
	return r
}

// StrengthOrUsual is the product strength of the dose, percent.
func (s Settings) StrengthOrUsual() float64 {
	if s.Strength == 0 {
		return s.ReagentOrDefault().Strength
	}
	return s.Strength
}

// Rule is the carbonate rule of the cycles figures: CyclesRule, or the
// closed system.
func (s Settings) Rule() saturation.CarbonateRule {
	if s.CyclesRule != nil {
		return *s.CyclesRule
	}
	r, _ := saturation.ParseCarbonateRule("closed")
	return r
}

// LimitProfile is the profile of the bands and the window: Profile, or the
// embedded inhibitor profile.
func (s Settings) LimitProfile() saturation.LimitProfile {
	if s.Profile != nil {
		return *s.Profile
	}
	p, _ := saturation.LimitProfileNamed("inhibitor")
	return p
}

// Sample is the plan of one sample: its assessment and everything computed
// from it. A part that could not be computed is empty (nil or zero) and
// its error is in Errors.
type Sample struct {
	saturation.Assessment
	// Ranking lists the scale formers of the sample at or above near
	// equilibrium, the most at risk first, under the settings' profile
	// (saturation.Rank); the first is the limiting mineral.
	Ranking []saturation.Ranked
	// Minerals are the minerals the charts show, in the fixed order of
	// ChartOrder (see Minerals).
	Minerals []string
	// Temperature, Cycles and Dose are the sweeps behind the charts.
	Temperature, Cycles, Dose Sweep
	// Window is the operating window over temperature and cycles.
	Window *Window
	// DoseAnswer is the dose to the settings' target; CyclesAnswer the
	// highest cycles under the profile; Blends the blends with the partner.
	DoseAnswer   *saturation.DoseResult
	CyclesAnswer *saturation.CyclesResult
	// MarginAnswer replaces CyclesAnswer for a recirculating or blowdown
	// sample: how far it is from its limits (its role changes the
	// question, not the chemistry).
	MarginAnswer *saturation.MarginResult
	Blends       []Blend
	// Passes are the minerals that go past their limit along the
	// temperature, cycles and dose sweeps, and where.
	Passes []Pass
	// Uncertainty is the Monte Carlo part (nil without draws).
	Uncertainty *Uncertainty
	// Errors are the parts that could not be computed, in the order of the
	// steps.
	Errors []Error
}

// Error is a part of a plan that could not be computed.
type Error struct {
	Part string // the step: "temperature sweep", "dose search", "blend", …
	Err  error
}

func (e Error) Error() string { return e.Part + ": " + e.Err.Error() }
func (e Error) Unwrap() error { return e.Err }

// PartErr returns the error of part, or nil.
func (p *Sample) PartErr(part string) error {
	for _, e := range p.Errors {
		if e.Part == part {
			return e
		}
	}
	return nil
}

// Blend is a blend of the sample with the partner water.
type Blend struct {
	Partner  string  // name of the other water
	Fraction float64 // share of the sample, 0–1 by volume
	Result   *saturation.Result
	// Judged is the blend judged against the settings' limit profile at
	// the bulk and at the skin, with the safe share of the sample
	// (saturation.JudgeBlend); nil when the step "blend limits" failed.
	Judged *saturation.BlendResult
}

// A step computes one part of a plan into p and returns its error; an
// error is kept under the step's name and never stops the other steps.
type step struct {
	name string
	run  func(p *Sample, s Settings) error
}

// steps are the parts of a plan in the order they are computed. A new part
// is one field of Sample and one entry here (see /work/notes/plan-api.md).
var steps = []step{
	{"dose search", doseStep},
	{"highest-cycles search", cyclesStep},
	{"uncertainty", uncertaintyStep},
	{"blend", blendStep},
	{"blend limits", blendLimitsStep},
	{"temperature sweep", temperatureStep},
	{"cycles sweep", cyclesSweepStep},
	{"dose sweep", doseSweepStep},
	{"operating window", windowStep},
	{"minerals", mineralsStep},
	{"findings", passesStep},
}

// ErrNotComputed marks a sample whose equilibrium was not computed: its
// plan has the assessment only.
var ErrNotComputed = errors.New("the equilibrium of the sample was not computed")

// Compute computes the plan of one assessed sample under s. It is safe for
// concurrent use on different samples. A sample without a result gets a
// plan with its assessment only (and ErrNotComputed in Errors when its
// input was good).
func Compute(a saturation.Assessment, s Settings) *Sample {
	p := &Sample{Assessment: a}
	if a.Result == nil {
		if !a.BadInput {
			p.Errors = append(p.Errors, Error{"equilibrium", ErrNotComputed})
		}
		return p
	}
	prof := s.LimitProfile()
	p.Ranking = saturation.Rank(a.Result, &prof)
	for _, st := range steps {
		if err := st.run(p, s); err != nil {
			p.Errors = append(p.Errors, Error{st.name, err})
		}
	}
	return p
}

func doseStep(p *Sample, s Settings) error {
	if s.Target == nil {
		return nil
	}
	d, err := saturation.DoseToTarget(p.Input, s.ReagentOrDefault(), s.Strength, *s.Target, s.Speciation)
	p.DoseAnswer = d
	return err
}

func cyclesStep(p *Sample, s Settings) error {
	if s.Profile == nil {
		return nil
	}
	if p.Input.Role.Circulating() {
		m, err := saturation.Margin(p.Input, *s.Profile, s.Rule(), s.Cycles(), math.NaN(), s.Speciation)
		p.MarginAnswer = m
		return err
	}
	c, err := saturation.MaxCycles(p.Input, *s.Profile, s.Rule(), s.Cycles(), 0, s.Speciation)
	p.CyclesAnswer = c
	return err
}

func blendStep(p *Sample, s Settings) error {
	if s.Partner == nil {
		return nil
	}
	b := Blend{Partner: s.Partner.Name, Fraction: s.BlendFraction}
	w, err := saturation.BlendWaters([]water.Analysis{p.Input, *s.Partner}, []float64{s.BlendFraction, 1 - s.BlendFraction}, s.Speciation)
	if err == nil {
		b.Result, err = saturation.Speciate(w, s.Speciation)
	}
	if err != nil {
		return fmt.Errorf("with %s at %g %%: %w", s.Partner.Name, 100*s.BlendFraction, err)
	}
	p.Blends = append(p.Blends, b)
	return nil
}

// blendLimitsStep judges each blend against the limit profile at the bulk
// and at the skin temperature (Speciation.Skin), the stricter governing,
// and searches the safe share of the sample.
func blendLimitsStep(p *Sample, s Settings) error {
	for i := range p.Blends {
		b := &p.Blends[i]
		j, err := saturation.JudgeBlend(p.Input, *s.Partner, b.Fraction, s.LimitProfile(), s.Speciation)
		if err != nil {
			return fmt.Errorf("with %s at %g %%: %w", b.Partner, 100*b.Fraction, err)
		}
		b.Judged = j
	}
	return nil
}

// finite reports whether x is neither NaN nor infinite.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
