package main

import (
	"io"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
)

func newAssessCmd(stdin io.Reader) *cobra.Command {
	c := &commonFlags{}
	var carbonate string
	cmd := &cobra.Command{
		Use:   "assess [FILE...|-]",
		Short: "Data quality, speciation, saturation indices, classic indices and scale that could form",
		Long: "assess reads laboratory analyses (wide or long CSV; - for standard input; --demo for the\n" +
			"embedded demo waters) and prints, for each sample, the data-quality checks (ion balance,\n" +
			"TDS, conductivity, ionic strength), the equilibrium pH and ionic strength, the saturation\n" +
			"index of every mineral with a plain-word risk band, the classic indices (Langelier, Ryznar,\n" +
			"Puckorius, Stiff–Davis, Larson–Skold, CCPP) and how much scale could form.\n\n" +
			"pH and alkalinity at the pH measurement temperature fix inorganic carbon; at any other\n" +
			"temperature carbon and alkalinity are conserved and pH is recomputed (closed system),\n" +
			"unless --carbonate says air, pco2=LOG, charge or ph=VALUE.\n\n" +
			"Values below the detection limit (\"<0.1\") are taken as half the limit unless\n" +
			"--below-detection says zero or limit.\n\n" +
			"Exit status: 0 all samples computed; 2 bad input (the good samples are still\n" +
			"written); 1 a sample could not be computed.\n\n" + reports.Caution,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, opt, ropt, err := c.setup(cmd)
			if err != nil {
				return err
			}
			if opt.Carbonate, opt.PH, opt.LogPCO2, err = saturation.ParseCarbonateMode(carbonate); err != nil {
				return badInput(err)
			}
			stderr := cmd.ErrOrStderr()
			files, problems, err := c.read(cmd, args, stdin, ropt)
			if err != nil {
				return err
			}
			var all []saturation.Assessment
			failures := 0
			for _, f := range files {
				for _, a := range saturation.AssessRecords(f.name, f.records, opt) {
					tally(stderr, a, &problems, &failures)
					all = append(all, a)
				}
			}
			if err := reports.WriteAssessments(cmd.OutOrStdout(), format, all); err != nil {
				return &exitError{code: exitInternal, err: err}
			}
			return finish(problems, failures)
		},
	}
	c.register(cmd)
	cmd.Flags().StringVar(&carbonate, "carbonate", "closed",
		"carbonate system at the evaluation temperature: closed, air, pco2=LOG10(atm), charge (pH from charge balance) or ph=VALUE")
	return cmd
}
