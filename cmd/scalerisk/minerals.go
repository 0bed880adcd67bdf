package main

import (
	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
)

type mineralsOptions struct {
	format string
	thermo string
}

func newMineralsCmd() *cobra.Command {
	o := &mineralsOptions{}
	cmd := &cobra.Command{
		Use:   "minerals",
		Short: "List the minerals of the thermodynamic table with log K at 25 °C and sources",
		Example: `  scalerisk minerals
  scalerisk minerals --thermo site-constants.csv`,
		Long: "minerals lists every mineral of the thermodynamic table (data/thermo.csv, or with\n" +
			"--thermo your additions) with its formula, reaction, log K at 25 °C, temperature function,\n" +
			"valid range and published source.\n\n" + reports.Caution,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := reports.ParseFormat(o.format)
			if err != nil {
				return badInput(err)
			}
			table := saturation.DefaultTable()
			if o.thermo != "" {
				m, err := loadThermo(o.thermo)
				if err != nil {
					return err
				}
				table = m.Table()
			}
			if err := reports.WriteMinerals(cmd.OutOrStdout(), format, table); err != nil {
				return &exitError{code: exitInternal, err: err}
			}
			return nil
		},
	}
	cmd.Flags().StringVar(&o.format, "format", "text", "output format: text, csv or json")
	cmd.Flags().StringVar(&o.thermo, "thermo", "", "extra thermodynamic table (CSV) whose rows add to or replace the embedded ones")
	return cmd
}
