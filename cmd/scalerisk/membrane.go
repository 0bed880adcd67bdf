package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// membraneOptions holds the flags of membrane beyond the shared ones.
type membraneOptions struct {
	common        commonFlags
	limits        string
	limitsProfile string
	reagent       string
	recovery      float64
	beta          float64
	target        float64
	strength      float64
}

func newMembraneCmd(stdin io.Reader) *cobra.Command {
	o := &membraneOptions{}
	cmd := &cobra.Command{
		Use:   "membrane [FILE...|-] [--recovery R] [--limits membrane|FILE] [--target-recovery R --reagent ACID]",
		Short: "Reverse osmosis: the concentrate at a recovery, the highest recovery under limits, the acid for a target recovery",
		Long: "membrane takes each sample as the feed of a reverse-osmosis stage and gives the concentrate at\n" +
			"--recovery (concentration factor 1/(1 − R), every ion rejected) and at the membrane surface of the\n" +
			"last element (times --polarisation, default 1.2: the cautious end of the 1.1–1.2 usual for\n" +
			"spiral-wound elements; common practice). CO2 passes the membrane: the concentrate keeps the\n" +
			"feed's CO2 while bicarbonate and carbonate are concentrated, so its pH rises (common practice).\n" +
			"It then finds the highest recovery at which every limit of --limits holds at the membrane\n" +
			"surface (default membrane: the inhibitor profile's mineral limits without the cooling-tower\n" +
			"rules), and with --target-recovery the smallest dose of --reagent in the feed that lets that\n" +
			"recovery hold them (the acid turns bicarbonate into CO2, which passes). The stage is judged at\n" +
			"the feed temperature; give --skin-temperature when the concentrate meets a heated surface.\n\n" +
			reports.DoseCaution,
		Example: `  scalerisk membrane --demo --recovery 0.75
  scalerisk membrane feed.csv --target-recovery 0.8 --reagent sulfuric --format json`,
		RunE: func(cmd *cobra.Command, args []string) error { return o.run(cmd, args, stdin) },
	}
	o.register(cmd)
	return cmd
}

// register adds the flags of membrane to cmd.
func (o *membraneOptions) register(cmd *cobra.Command) {
	o.common.register(cmd)
	o.common.registerSkin(cmd, 0)
	f := cmd.Flags()
	registerLimitsProfile(cmd, &o.limitsProfile)
	f.Float64Var(&o.recovery, "recovery", 0.75, "recovery of the stage, 0–0.95 (permeate / feed)")
	f.Float64Var(&o.beta, "polarisation", saturation.DefaultPolarisation, "concentration-polarisation factor at the membrane surface, 1–2")
	f.StringVar(&o.limits, "limits", "membrane", "limit profile at the membrane surface: membrane, inhibitor, no-inhibitor, or a CSV file")
	f.Float64Var(&o.target, "target-recovery", 0, "recovery to reach with acid in the feed (0: none)")
	f.StringVar(&o.reagent, "reagent", "h2so4", "acid for --target-recovery: h2so4 or hcl (by formula or name)")
	f.Float64Var(&o.strength, "strength", 0, "product strength, percent (default: the reagent table's usual strength)")
}

// run checks the flags and streams each feed's concentrate, highest
// recovery and, with --target-recovery, the acid that reaches it.
func (o *membraneOptions) run(cmd *cobra.Command, args []string, stdin io.Reader) error {
	c := &o.common
	limits, limitsProfile, reagent := o.limits, o.limitsProfile, o.reagent
	recovery, beta, target, strength := o.recovery, o.beta, o.target, o.strength
	format, opt, ropt, err := c.setup(cmd)
	if err != nil {
		return err
	}
	if !(recovery >= 0 && recovery <= saturation.MaxRecoverySearch) {
		return badInput(fmt.Errorf("--recovery %g: want 0 to %g", recovery, saturation.MaxRecoverySearch))
	}
	if !(target >= 0 && target <= saturation.MaxRecoverySearch) {
		return badInput(fmt.Errorf("--target-recovery %g: want 0 (none) to %g", target, saturation.MaxRecoverySearch))
	}
	if !(beta >= 1 && beta <= 2) {
		return badInput(fmt.Errorf("--polarisation %g: want 1 to 2", beta))
	}
	profile, err := loadProfile(limits, limitsProfile, opt.Model)
	if err != nil {
		return err
	}
	acid, err := reagentFlag(cmd, reagent, strength)
	if err != nil {
		return err
	}
	if !(acid.AlkalinityPerMol < 0) {
		return badInput(fmt.Errorf("--reagent %s is not an acid", acid.Name))
	}
	m := saturation.Membrane{Polarisation: beta}
	run, src, err := c.runner(cmd, args, stdin, ropt)
	if err != nil {
		return err
	}
	w := reports.NewMembraneWriter(cmd.OutOrStdout(), format, c.writeOptions(cmd))
	return stream(run, src, w, batch[reports.MembraneOutcome]{
		newWorker: func() func(string, water.Record) (reports.MembraneOutcome, error) {
			return func(_ string, rec water.Record) (reports.MembraneOutcome, error) {
				out := reports.MembraneOutcome{Name: rec.Name, Membrane: m}
				if out.Water, out.Err = saturation.ConcentrateAt(rec.Analysis, recovery, m, opt); out.Err != nil {
					return out, out.Err
				}
				if out.Max, out.Err = saturation.MaxRecovery(rec.Analysis, m, profile, opt); out.Err != nil {
					return out, out.Err
				}
				if target > 0 {
					out.Acid, out.AcidErr = saturation.AcidForRecovery(rec.Analysis, acid, strength, target, m, profile, opt)
				}
				return out, out.AcidErr
			}
		},
	})
}
