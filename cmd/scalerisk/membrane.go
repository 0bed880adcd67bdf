package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

func newMembraneCmd(stdin io.Reader) *cobra.Command {
	c := &commonFlags{}
	var limits, limitsProfile, reagent string
	var recovery, beta, target, strength float64
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
		RunE: func(cmd *cobra.Command, args []string) error {
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
						o := reports.MembraneOutcome{Name: rec.Name, Membrane: m}
						if o.Water, o.Err = saturation.ConcentrateAt(rec.Analysis, recovery, m, opt); o.Err != nil {
							return o, o.Err
						}
						if o.Max, o.Err = saturation.MaxRecovery(rec.Analysis, m, profile, opt); o.Err != nil {
							return o, o.Err
						}
						if target > 0 {
							o.Acid, o.AcidErr = saturation.AcidForRecovery(rec.Analysis, acid, strength, target, m, profile, opt)
						}
						return o, o.AcidErr
					}
				},
			})
		},
	}
	c.register(cmd)
	c.registerSkin(cmd, 0)
	f := cmd.Flags()
	registerLimitsProfile(cmd, &limitsProfile)
	f.Float64Var(&recovery, "recovery", 0.75, "recovery of the stage, 0–0.95 (permeate / feed)")
	f.Float64Var(&beta, "polarisation", saturation.DefaultPolarisation, "concentration-polarisation factor at the membrane surface, 1–2")
	f.StringVar(&limits, "limits", "membrane", "limit profile at the membrane surface: membrane, inhibitor, no-inhibitor, or a CSV file")
	f.Float64Var(&target, "target-recovery", 0, "recovery to reach with acid in the feed (0: none)")
	f.StringVar(&reagent, "reagent", "h2so4", "acid for --target-recovery: h2so4 or hcl (by formula or name)")
	f.Float64Var(&strength, "strength", 0, "product strength, percent (default: the reagent table's usual strength)")
	return cmd
}
