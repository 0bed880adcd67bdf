package main

import (
	"fmt"
	"iter"
	"math"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/uncertainty"
	"scalerisk/water"
)

// uncertaintyFlags are the flags of the Monte Carlo uncertainty, shared by
// assess, cycles, dose and report. --draws 0 (the default) leaves every
// output as it is without them.
type uncertaintyFlags struct {
	draws      int
	seed       uint64
	confidence float64
	percent    float64
}

// register adds the flags to cmd.
func (u *uncertaintyFlags) register(cmd *cobra.Command) {
	f := cmd.Flags()
	f.IntVar(&u.draws, "draws", 0, "Monte Carlo draws of each analysis for intervals and probabilities (0: none; 1000 is usual)")
	f.Uint64Var(&u.seed, "seed", 1, "seed of the random draws (the same seed gives the same numbers)")
	f.Float64Var(&u.confidence, "confidence", 90, "confidence of the intervals and decisions, percent")
	f.Float64Var(&u.percent, "uncertainty", 0, "relative standard uncertainty of every concentration and the alkalinity, percent (0: the defaults of data/uncertainty.csv)")
}

// settings returns the Monte Carlo settings, ok false with --draws 0; a
// bad value is a bad-input error.
func (u *uncertaintyFlags) settings() (s uncertainty.Settings, ok bool, err error) {
	if u.draws == 0 {
		return uncertainty.Settings{}, false, nil
	}
	if !(u.confidence > 0 && u.confidence < 100) {
		return s, false, badInput(fmt.Errorf("--confidence %g: want a percentage between 0 and 100", u.confidence))
	}
	if !(u.percent >= 0 && u.percent < 100) || math.IsInf(u.percent, 0) {
		return s, false, badInput(fmt.Errorf("--uncertainty %g: want a percentage from 0 to below 100", u.percent))
	}
	// One worker per sample; the commands set --jobs (the numbers are the
	// same for any number).
	s = uncertainty.Settings{Draws: u.draws, Seed: u.seed, Confidence: u.confidence / 100, Relative: u.percent / 100, Workers: 1}
	if err := s.Check(); err != nil {
		return s, false, badInput(fmt.Errorf("--draws: %w", err))
	}
	return s, true, nil
}

// assessUncertain is assess with --draws: each sample's assessment and its
// Monte Carlo summary.
func assessUncertain(cmd *cobra.Command, c *commonFlags, r *runner, src iter.Seq[item], format reports.Format, opt saturation.Options, mc uncertainty.Settings) error {
	mc.Workers = c.jobs // draws of one sample share the workers too
	w := reports.NewUncertainAssessWriter(r.out, format, mineralNames(opt.Model), c.writeOptions(cmd))
	return stream(r, src, w, batch[reports.UncertainAssessment]{
		newWorker: func() func(string, water.Record) (reports.UncertainAssessment, error) {
			sp := saturation.NewSpeciator(opt.Model)
			return func(file string, rec water.Record) (reports.UncertainAssessment, error) {
				a := sp.AssessRecord(file, rec, opt)
				a.Flow = c.flow
				out := reports.UncertainAssessment{Assessment: a}
				if a.Err == nil {
					out.Uncertainty, out.UncertaintyErr = uncertainty.Assess(a, opt, mc)
				}
				return out, a.Err
			}
		},
		bad: func(file string, rec water.Record) reports.UncertainAssessment {
			return reports.UncertainAssessment{Assessment: saturation.Assessment{Name: rec.Name, File: file, Line: rec.Line, Err: rec.Err, BadInput: true}}
		},
	})
}

// doseQuestion is what dose asks of every sample.
type doseQuestion struct {
	reagent  water.Reagent
	strength float64
	target   saturation.Target
}

// doseUncertain is dose with --draws: each sample's dose and the dose that
// reaches the target with the run's confidence.
func doseUncertain(cmd *cobra.Command, c *commonFlags, r *runner, src iter.Seq[item], format reports.Format, q doseQuestion, opt saturation.Options, mc uncertainty.Settings) error {
	mc.Workers = c.jobs // draws of one sample share the workers too
	w := reports.NewUncertainDoseWriter(r.out, format, c.writeOptions(cmd))
	return stream(r, src, w, batch[reports.UncertainDose]{
		newWorker: func() func(string, water.Record) (reports.UncertainDose, error) {
			return func(_ string, rec water.Record) (reports.UncertainDose, error) {
				d, err := saturation.DoseToTarget(rec.Analysis, q.reagent, q.strength, q.target, opt)
				out := reports.UncertainDose{DoseOutcome: reports.DoseOutcome{Name: rec.Name, Result: d, Flow: c.flow, Err: err}}
				if err == nil {
					out.Uncertainty, out.UncertaintyErr = uncertainty.Dose(rec.Analysis, d, opt, mc)
				}
				return out, err
			}
		},
	})
}

// cyclesQuestion is what cycles asks of every sample.
type cyclesQuestion struct {
	profile     saturation.LimitProfile
	rule        saturation.CarbonateRule
	carbonate   string
	maxN, step  float64
	evaporation float64
}

// cyclesUncertain is cycles with --draws: each sample's highest cycles and
// the highest cycles that hold with the run's confidence.
func cyclesUncertain(cmd *cobra.Command, c *commonFlags, r *runner, src iter.Seq[item], format reports.Format, q cyclesQuestion, opt saturation.Options, mc uncertainty.Settings) error {
	mc.Workers = c.jobs // draws of one sample share the workers too
	w := reports.NewUncertainCyclesWriter(r.out, format, c.writeOptions(cmd))
	return stream(r, src, w, batch[reports.UncertainCycles]{
		newWorker: func() func(string, water.Record) (reports.UncertainCycles, error) {
			return func(_ string, rec water.Record) (reports.UncertainCycles, error) {
				res, err := saturation.MaxCycles(rec.Analysis, q.profile, q.rule, q.maxN, q.step, opt)
				out := reports.UncertainCycles{CyclesOutcome: reports.CyclesOutcome{Name: rec.Name, Carbonate: q.carbonate,
					Result: res, Evaporation: q.evaporation, Err: err}}
				if err == nil {
					out.Uncertainty, out.UncertaintyErr = uncertainty.Cycles(rec.Analysis, res, q.maxN, q.step, opt, mc)
				}
				return out, err
			}
		},
	})
}
