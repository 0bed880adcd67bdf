package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"scalerisk/saturation"
)

// parseRule reads a --carbonate rule of a tower (cycles, balance, report,
// sweep --vary cycles), printing the deprecation note of an old spelling
// on stderr.
func parseRule(cmd *cobra.Command, s string) (saturation.CarbonateRule, error) {
	if note := saturation.CarbonateDeprecation(s, true); note != "" {
		fmt.Fprintln(cmd.ErrOrStderr(), "note:", note)
	}
	rule, err := saturation.ParseCarbonateRule(s)
	if err != nil {
		return rule, badInput(err)
	}
	return rule, nil
}

// parseMode reads the --carbonate mode of assess, printing the
// deprecation note of an old spelling on stderr.
func parseMode(cmd *cobra.Command, s string, opt *saturation.Options) error {
	if note := saturation.CarbonateDeprecation(s, false); note != "" {
		fmt.Fprintln(cmd.ErrOrStderr(), "note:", note)
	}
	var err error
	if opt.Carbonate, opt.PH, opt.LogPCO2, err = saturation.ParseCarbonateMode(s); err != nil {
		return badInput(err)
	}
	return nil
}
