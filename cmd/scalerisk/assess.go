package main

import (
	"io"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

func newAssessCmd(stdin io.Reader) *cobra.Command {
	c := &commonFlags{}
	u := &uncertaintyFlags{}
	var carbonate string
	var species bool
	cmd := &cobra.Command{
		Use:   "assess [FILE...|-]",
		Short: "Data quality, speciation, saturation indices, classic indices and scale that could form",
		Example: `  scalerisk assess --demo
  scalerisk assess lab-2026-03.csv --format json > assessed.json
  scalerisk assess lab-2026-03.csv --temperature 60 --activity pitzer
  scalerisk assess lab-export.csv --date-format DD/MM/YYYY --species`,
		Long: "assess reads laboratory analyses (wide or long CSV; - for standard input; --demo for the\n" +
			"embedded demo waters) and prints, for each sample, the data-quality checks (ion balance,\n" +
			"TDS, conductivity, ionic strength), the equilibrium pH and ionic strength, the saturation\n" +
			"index of every mineral with a plain-word risk band, the classic indices (Langelier, Ryznar,\n" +
			"Puckorius, Stiff–Davis, Larson–Skold, CCPP) and how much scale could form.\n\n" +
			"pH and alkalinity at the pH measurement temperature fix inorganic carbon; at any other\n" +
			"temperature carbon and alkalinity are conserved and pH is recomputed (closed system),\n" +
			"unless --carbonate says air, pco2=LOG, charge or fixed-ph=VALUE.\n\n" +
			"Values below the detection limit (\"<0.1\") are taken as half the limit unless\n" +
			"--below-detection says zero or limit.\n\n" +
			"Exit status: 0 all samples computed; 2 bad input (the good samples are still\n" +
			"written); 1 a sample could not be computed (1 wins over 2).\n\n" + reports.Caution,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, opt, ropt, err := c.setup(cmd)
			if err != nil {
				return err
			}
			if err := parseMode(cmd, carbonate, &opt); err != nil {
				return err
			}
			mc, withDraws, err := u.settings()
			if err != nil {
				return err
			}
			r, src, err := c.runner(cmd, args, stdin, ropt)
			if err != nil {
				return err
			}
			if withDraws {
				return assessUncertain(cmd, c, r, src, format, opt, mc)
			}
			wopt := c.writeOptions(cmd)
			wopt.Species = species
			w := reports.NewAssessWriter(r.out, format, mineralNames(opt.Model), wopt)
			return stream(r, src, w, batch[saturation.Assessment]{
				newWorker: func() func(string, water.Record) (saturation.Assessment, error) {
					sp := saturation.NewSpeciator(opt.Model)
					return func(file string, rec water.Record) (saturation.Assessment, error) {
						a := sp.AssessRecord(file, rec, opt)
						a.Flow = c.flow
						return a, a.Err
					}
				},
				bad: func(file string, rec water.Record) saturation.Assessment {
					return saturation.Assessment{Name: rec.Name, File: file, Line: rec.Line, Err: rec.Err, BadInput: true}
				},
			})
		},
	}
	c.register(cmd)
	u.register(cmd)
	cmd.Flags().BoolVar(&species, "species", false, "print the speciation table (molality, activity coefficient, activity of each species) in the text output")
	cmd.Flags().StringVar(&carbonate, "carbonate", "closed",
		"carbonate system at the evaluation temperature: closed, air, pco2=LOG10(atm), charge (pH from charge balance) or fixed-ph=VALUE (ph=VALUE is the old spelling)")
	return cmd
}
