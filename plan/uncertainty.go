package plan

import (
	"errors"

	"scalerisk/uncertainty"
)

// Uncertainty is the Monte Carlo part of a plan: the spread of the
// saturation indices and classic indices over draws of the analysis, and
// the dose and highest cycles at the settings' confidence (nil where the
// plan has no dose or cycles answer).
type Uncertainty struct {
	Assess *uncertainty.Summary
	Dose   *uncertainty.DoseSummary
	Cycles *uncertainty.CyclesSummary
}

// uncertaintyStep runs the draws of s.Uncertainty (nothing with Draws 0):
// the assessment, then the dose and cycles searches of the plan's answers
// on every draw. It runs after those searches.
func uncertaintyStep(p *Sample, s Settings) error {
	mc := s.Uncertainty
	if mc.Draws == 0 {
		return nil
	}
	u := &Uncertainty{}
	var errs []error
	var err error
	if u.Assess, err = uncertainty.Assess(p.Assessment, s.Speciation, mc); err != nil {
		errs = append(errs, err)
	}
	if d := p.DoseAnswer; d != nil && (d.Reached || d.Beyond) {
		if u.Dose, err = uncertainty.Dose(p.Input, d, s.Speciation, mc); err != nil {
			errs = append(errs, err)
		}
	}
	if c := p.CyclesAnswer; c != nil {
		if u.Cycles, err = uncertainty.Cycles(p.Input, c, s.Cycles(), 0, s.Speciation, mc); err != nil {
			errs = append(errs, err)
		}
	}
	p.Uncertainty = u
	return errors.Join(errs...)
}
