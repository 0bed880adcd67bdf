package main

import (
	"fmt"
	"io"
	"math"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// balanceOptions holds the flags of balance beyond the shared ones.
type balanceOptions struct {
	common        commonFlags
	limits        string
	limitsProfile string
	carbonate     string
	evaporation   float64
	maxN          float64
}

func newBalanceCmd(stdin io.Reader) *cobra.Command {
	o := &balanceOptions{}
	cmd := &cobra.Command{
		Use:   "balance [FILE...|-] [--flow BLOWDOWN_M3_PER_H | --evaporation M3_PER_H]",
		Short: "Cycles of a tower from its makeup, the ions it is losing to deposits, and its margin to the limits",
		Long: "balance pairs each recirculating (or blowdown) sample with the makeup of its system on its date\n" +
			"(the role, system and date columns; a system with one makeup pairs across dates) and gives the\n" +
			"tower's cycles of concentration from each conservative ion (Cl, Mg, Na, SiO2, conductivity:\n" +
			"cycles = tower / makeup, their median taken; common practice). An ion whose cycles fall more\n" +
			"than 10 % below is missing from the tower: its deficit (makeup × cycles − tower) is given in\n" +
			"mg/L, and in kg/day with --flow (the blowdown, m³/h) or --evaporation (blowdown = E/(N − 1)),\n" +
			"and the likely deposit is named (calcium and alkalinity: calcium carbonate; calcium and sulfate:\n" +
			"calcium sulfate; calcium and phosphate: calcium phosphate; magnesium and silica: magnesium\n" +
			"silicate). The tower water is then asked how far it is from the limits of --limits: the margin\n" +
			"of each limit at the bulk and at --skin-temperature, and how many more cycles the system can run.\n\n" +
			reports.Caution,
		Example: `  scalerisk balance --demo
  scalerisk balance plant.csv --flow 4 --format json`,
		RunE: func(cmd *cobra.Command, args []string) error { return o.run(cmd, args, stdin) },
	}
	o.register(cmd)
	return cmd
}

// register adds the flags of balance to cmd.
func (o *balanceOptions) register(cmd *cobra.Command) {
	o.common.register(cmd)
	o.common.registerSkin(cmd, reports.DefaultSkinTemperature)
	f := cmd.Flags()
	registerLimitsProfile(cmd, &o.limitsProfile)
	f.StringVar(&o.limits, "limits", "inhibitor", "limit profile of the tower's margin: no-inhibitor, inhibitor, or a CSV file of your own")
	f.StringVar(&o.carbonate, "carbonate", "natural", "carbonate rule of further concentration: natural, relation=A,B, air, acid=VALUE or closed")
	f.Float64Var(&o.evaporation, "evaporation", 0, "evaporation of the tower, m³/h: blowdown = evaporation/(cycles − 1) for kg/day")
	f.Float64Var(&o.maxN, "max", 15, "highest further concentration factor to search")
}

// run checks the flags, pairs each tower sample with its makeup and
// writes the balance of every pair.
func (o *balanceOptions) run(cmd *cobra.Command, args []string, stdin io.Reader) error {
	c := &o.common
	limits, limitsProfile, carbonate, evaporation, maxN := o.limits, o.limitsProfile, o.carbonate, o.evaporation, o.maxN
	format, opt, ropt, err := c.setup(cmd)
	if err != nil {
		return err
	}
	profile, err := loadProfile(limits, limitsProfile, opt.Model)
	if err != nil {
		return err
	}
	rule, err := parseRule(cmd, carbonate)
	if err != nil {
		return err
	}
	if !(evaporation >= 0) || math.IsInf(evaporation, 0) || (evaporation > 0 && c.flow > 0) {
		return badInput(fmt.Errorf("--evaporation %g: want a finite 0 or more, and not together with --flow", evaporation))
	}
	run, src, err := c.runner(cmd, args, stdin, ropt)
	if err != nil {
		return err
	}
	var waters []water.Analysis
	for it := range src {
		switch {
		case it.problem != nil:
			run.problem(it.problem)
		case it.rec.Err != nil:
			run.problem(it.rec.Err)
		default:
			waters = append(waters, it.rec.Analysis)
		}
	}
	pairs, notes := water.Pairs(waters)
	for _, n := range notes {
		fmt.Fprintln(cmd.ErrOrStderr(), "balance:", n)
	}
	w := reports.NewBalanceWriter(cmd.OutOrStdout(), format, c.writeOptions(cmd))
	for _, p := range pairs {
		out := balancePair(waters[p.Makeup], waters[p.Tower], p.SameDate, c.flow, evaporation, profile, rule, maxN, opt)
		if out.Err != nil {
			run.sampleError("balance", 0, out.Err)
		}
		if err := w.Write(out); err != nil {
			return &exitError{code: exitInternal, err: err}
		}
	}
	if err := w.Close(); err != nil {
		return &exitError{code: exitInternal, err: err}
	}
	if len(pairs) == 0 {
		fmt.Fprintln(cmd.ErrOrStderr(), "balance: no makeup–tower pair: give a role column (makeup, recirculating) and a date or system column")
	}
	return run.exit()
}

// balancePair balances one pair and measures the tower's margin; the
// blowdown is flow, or evaporation/(cycles − 1).
func balancePair(makeup, tower water.Analysis, sameDate bool, flow, evaporation float64, profile saturation.LimitProfile,
	rule saturation.CarbonateRule, maxN float64, opt saturation.Options) reports.BalanceOutcome {
	o := reports.BalanceOutcome{Name: tower.Name, SameDate: sameDate, Blowdown: flow}
	bal, err := saturation.BalanceOf(makeup, tower, 0)
	if err != nil {
		o.Err = err
		return o
	}
	if evaporation > 0 && bal.Cycles > 1 {
		_, o.Blowdown = water.MakeupAndBlowdown(evaporation, bal.Cycles)
	}
	if o.Blowdown > 0 {
		bal, _ = saturation.BalanceOf(makeup, tower, o.Blowdown)
	}
	o.Balance = bal
	o.Margin, o.MarginErr = saturation.Margin(tower, profile, rule, maxN, bal.Cycles, opt)
	return o
}
