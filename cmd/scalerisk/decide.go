package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

func newDoseCmd(stdin io.Reader) *cobra.Command {
	c := &commonFlags{}
	u := &uncertaintyFlags{}
	var reagent, target, carbonate string
	var strength, price float64
	cmd := &cobra.Command{
		Use:   "dose [FILE...|-] --reagent NAME --target QUANTITY=VALUE",
		Short: "Dose of a reagent that brings each water to a target, and what it does to every mineral",
		Example: `  scalerisk dose --demo --reagent sulfuric --target lsi=0.5
  scalerisk dose makeup.csv --reagent hcl --strength 31 --target ph=7.2 --flow 40
  scalerisk dose makeup.csv --reagent caustic --target si:calcite=0 --format csv`,
		Long: "dose finds, for each sample, the dose of a reagent (mg/L of product) that brings a\n" +
			"quantity to a target — ph=7.0, lsi=0.5, rsi=6, psi=6 or si:calcite=0.8 — and shows what\n" +
			"the dose does to every other mineral and index: the sulfate of sulfuric acid raises gypsum,\n" +
			"barite and celestite (the common-ion effect); the chloride of hydrochloric acid raises the\n" +
			"Larson–Skold index. Reagents: " + reagentNames() + ".\n" +
			"An index or SI target is judged at the bulk and at --skin-temperature (default 60 °C, bulk pH\n" +
			"held): the dose leaves the water on the safe side of the target at both, and the output says\n" +
			"which temperature governs. A pH target is a bulk set point, judged at the bulk only.\n\n" +
			reports.DoseCaution,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, opt, ropt, err := c.setup(cmd)
			if err != nil {
				return err
			}
			r, err := reagentFlag(cmd, reagent, strength)
			if err != nil {
				return err
			}
			tgt, err := saturation.ParseTarget(target, opt.Model)
			if err != nil {
				return badInput(err)
			}
			rule, err := saturation.ParseCarbonateRule(carbonate)
			if err != nil {
				return badInput(err)
			}
			if rule.A != 0 || rule.SetPoint != 0 {
				return badInput(errors.New("--carbonate for dose: closed or air (natural, relation= and ph= are rules of cycles)"))
			}
			opt.Carbonate = rule.Mode
			if err := checkPrice(price, c.flow); err != nil {
				return err
			}
			mc, withDraws, err := u.settings()
			if err != nil {
				return err
			}
			run, src, err := c.runner(cmd, args, stdin, ropt)
			if err != nil {
				return err
			}
			if withDraws {
				return doseUncertain(cmd, c, run, src, format, doseQuestion{r, strength, tgt}, opt, mc)
			}
			w := reports.NewDoseWriter(run.out, format, c.writeOptions(cmd))
			return stream(run, src, w, batch[reports.DoseOutcome]{
				newWorker: func() func(string, water.Record) (reports.DoseOutcome, error) {
					return func(_ string, rec water.Record) (reports.DoseOutcome, error) {
						d, err := saturation.DoseToTarget(rec.Analysis, r, strength, tgt, opt)
						return reports.DoseOutcome{Name: rec.Name, Result: d, Flow: c.flow, Price: price, Err: err}, err
					}
				},
			})
		},
	}
	c.register(cmd)
	u.register(cmd)
	f := cmd.Flags()
	f.StringVar(&reagent, "reagent", "", "reagent by formula or name: "+reagentNames())
	f.Float64Var(&strength, "strength", 0, "product strength, percent (default: the reagent table's usual strength)")
	f.Float64Var(&price, "price", 0, "price per kg of product (any currency), with --flow, to give the cost per day")
	f.StringVar(&target, "target", "", "target: ph=VALUE, lsi=VALUE, rsi=VALUE, psi=VALUE or si:MINERAL=VALUE")
	f.StringVar(&carbonate, "carbonate", "closed", "carbonate system after dosing: closed (the CO2 an acid frees stays) or air")
	c.registerSkin(cmd, reports.DefaultSkinTemperature)
	cmd.MarkFlagRequired("reagent")
	cmd.MarkFlagRequired("target")
	return cmd
}

// reagentNames lists the reagent table's names: each formula with its
// name in words.
func reagentNames() string {
	var names []string
	for _, r := range water.Reagents() {
		names = append(names, r.Name+" ("+r.Label+")")
	}
	return strings.Join(names, ", ")
}

// checkPrice checks --price: a finite positive price per kg of product,
// which needs --flow to become a cost per day.
func checkPrice(price, flow float64) error {
	switch {
	case price == 0:
		return nil
	case !(price > 0) || math.IsInf(price, 1):
		return badInput(fmt.Errorf("--price %g: want a positive price per kg of product", price))
	case !(flow > 0):
		return badInput(errors.New("--price needs --flow (m³/h) to give a cost per day"))
	}
	return nil
}

// reagentFlag looks up the reagent a user named (by formula or by name)
// and, when --strength was given, checks it: an explicit 0 or a value
// above 100 % is bad input, never a silent fallback to the usual strength.
func reagentFlag(cmd *cobra.Command, name string, strength float64) (water.Reagent, error) {
	r, err := water.LookupReagent(name)
	if err != nil {
		return r, badInput(fmt.Errorf("--reagent: %w", err))
	}
	if f := cmd.Flags().Lookup("strength"); f != nil && f.Changed {
		if err := r.CheckStrength(strength); err != nil {
			return r, badInput(fmt.Errorf("--strength: %w", err))
		}
	}
	return r, nil
}

// cyclesOptions holds the flags of cycles beyond the shared ones.
type cyclesOptions struct {
	common        commonFlags
	uncertainty   uncertaintyFlags
	limits        string
	limitsProfile string
	carbonate     string
	reagent       string
	maxN          float64
	step          float64
	evaporation   float64
}

func newCyclesCmd(stdin io.Reader) *cobra.Command {
	o := &cyclesOptions{}
	cmd := &cobra.Command{
		Use:   "cycles [FILE...|-] [--limits no-inhibitor|inhibitor|FILE] [--carbonate natural|relation=A,B|air|acid=V|closed]",
		Short: "Highest cycles of concentration of a makeup water under a limit profile, and the limiting mineral",
		Example: `  scalerisk cycles --demo
  scalerisk cycles makeup.csv --limits inhibitor --skin-temperature 65
  scalerisk cycles makeup.csv --carbonate ph=7.8 --reagent sulfuric --evaporation 12`,
		Long: "cycles concentrates each makeup water by 1 to --max cycles (conservative ions times N),\n" +
			"finds its carbonate state by --carbonate — natural (the default: pH = 1.465·log10(TA) + 4.54,\n" +
			"the relation of untreated towers, alkalinity conserved; common practice), relation=A,B (your\n" +
			"tower's own pH = A·log10(TA) + B), air (equilibrium with air CO2), acid=VALUE (acid control:\n" +
			"the dose of --reagent that holds the set point, open to air, with its sulfate or chloride)\n" +
			"or closed (CO2 stays: a sealed system) — and returns the highest cycles at which every limit of the profile\n" +
			"holds, naming the limiting mineral. Profiles: no-inhibitor and inhibitor (data/limits.csv,\n" +
			"each limit with its source), or a CSV of your own (columns quantity, max, source).\n" +
			"Temperature: the limits are judged at the bulk (the sample's, or --temperature) and at\n" +
			"--skin-temperature (default 60 °C, a common tube-wall temperature; the bulk pH held, as the\n" +
			"classic skin index); the stricter answer is given and the output says which governs.\n\n" + reports.Caution,
		RunE: func(cmd *cobra.Command, args []string) error { return o.run(cmd, args, stdin) },
	}
	o.register(cmd)
	return cmd
}

// register adds the flags of cycles to cmd.
func (o *cyclesOptions) register(cmd *cobra.Command) {
	o.common.register(cmd)
	o.uncertainty.register(cmd)
	f := cmd.Flags()
	f.StringVar(&o.limits, "limits", "inhibitor", "limit profile: no-inhibitor, inhibitor, or a CSV file of your own")
	registerLimitsProfile(cmd, &o.limitsProfile)
	f.StringVar(&o.carbonate, "carbonate", "natural", "carbonate rule: natural, relation=A,B, air, acid=VALUE (acid control; ph=VALUE is the old spelling) or closed")
	f.StringVar(&o.reagent, "reagent", "h2so4", "acid that holds a ph= set point: h2so4 or hcl")
	f.Float64Var(&o.maxN, "max", 15, "highest cycles to search")
	f.Float64Var(&o.step, "step", 0.5, "step of the cycles table")
	f.Float64Var(&o.evaporation, "evaporation", 0, "evaporation of the tower, m³/h, to give make-up and blowdown")
	o.common.registerSkin(cmd, reports.DefaultSkinTemperature)
}

// rule parses --carbonate and, for an acid set point, the acid of
// --reagent that holds it.
func (o *cyclesOptions) rule(cmd *cobra.Command) (saturation.CarbonateRule, error) {
	rule, err := parseRule(cmd, o.carbonate)
	if err != nil {
		return rule, err
	}
	if rule.SetPoint != 0 {
		r, err := water.LookupReagent(o.reagent)
		if err != nil {
			return rule, badInput(err)
		}
		if !(r.AlkalinityPerMol < 0) {
			return rule, badInput(fmt.Errorf("--reagent %s cannot hold a pH set point: it is not an acid", r.Name))
		}
		rule = rule.WithReagent(r)
	}
	return rule, nil
}

// run checks the flags and streams the highest cycles (or a tower
// water's margin) of every sample.
func (o *cyclesOptions) run(cmd *cobra.Command, args []string, stdin io.Reader) error {
	c := &o.common
	format, opt, ropt, err := c.setup(cmd)
	if err != nil {
		return err
	}
	profile, err := loadProfile(o.limits, o.limitsProfile, opt.Model)
	if err != nil {
		return err
	}
	rule, err := o.rule(cmd)
	if err != nil {
		return err
	}
	maxN, step, evaporation, carbonate := o.maxN, o.step, o.evaporation, o.carbonate
	if !(maxN > 1 && maxN <= 100) {
		return badInput(fmt.Errorf("--max %g: want more than 1 and at most 100 cycles", maxN))
	}
	if !(step >= (maxN-1)/1000) || math.IsInf(step, 0) || !(evaporation >= 0) || math.IsInf(evaporation, 0) {
		return badInput(fmt.Errorf("--step must be at least (max−1)/1000 = %g and --evaporation a finite 0 or more", (maxN-1)/1000))
	}
	mc, withDraws, err := o.uncertainty.settings()
	if err != nil {
		return err
	}
	run, src, err := c.runner(cmd, args, stdin, ropt)
	if err != nil {
		return err
	}
	if withDraws {
		return cyclesUncertain(cmd, c, run, src, format, cyclesQuestion{profile, rule, carbonate, maxN, step, evaporation}, opt, mc)
	}
	w := reports.NewCyclesWriter(run.out, format, c.writeOptions(cmd))
	return stream(run, src, w, batch[reports.CyclesOutcome]{
		newWorker: func() func(string, water.Record) (reports.CyclesOutcome, error) {
			return func(_ string, rec water.Record) (reports.CyclesOutcome, error) {
				a := rec.Analysis
				if a.Role.Circulating() {
					// A tower water is asked its margin to the limits.
					m, err := saturation.Margin(a, profile, rule, maxN, math.NaN(), opt)
					out := reports.CyclesOutcome{Name: rec.Name, Carbonate: carbonate, Role: a.Role.String(), Margin: m, Err: err}
					if m != nil {
						out.Result = m.Further
					}
					return out, err
				}
				r, err := saturation.MaxCycles(a, profile, rule, maxN, step, opt)
				return reports.CyclesOutcome{Name: rec.Name, Carbonate: carbonate, Role: a.Role.String(), Result: r, Evaporation: evaporation, Err: err}, err
			}
		},
	})
}

// loadProfile returns an embedded profile by name or the first profile of
// a CSV file.
func loadProfile(name, profile string, m *saturation.Model) (saturation.LimitProfile, error) {
	if p, err := saturation.LimitProfileNamed(name); err == nil {
		if profile != "" {
			return saturation.LimitProfile{}, badInput(fmt.Errorf("--limits-profile %q: --limits %s is a built-in profile, not a file", profile, name))
		}
		return p, nil
	}
	f, err := os.Open(name)
	if err != nil {
		_, nerr := saturation.LimitProfileNamed(name)
		return saturation.LimitProfile{}, badInput(fmt.Errorf("%v; and no file %q", nerr, name))
	}
	defer f.Close()
	ps, err := saturation.ReadLimits(name, f, m)
	if err != nil {
		return saturation.LimitProfile{}, badInput(err)
	}
	return chooseProfile(name, profile, ps)
}

// chooseProfile picks the profile of a limits file: the only one, or the
// one --limits-profile names. A file of several profiles needs the flag
// (it once took the first silently).
func chooseProfile(file, profile string, ps []saturation.LimitProfile) (saturation.LimitProfile, error) {
	var names []string
	for _, p := range ps {
		if p.Name == profile || profile == "" && len(ps) == 1 {
			return p, nil
		}
		names = append(names, p.Name)
	}
	if profile == "" {
		return saturation.LimitProfile{}, badInput(fmt.Errorf("%s holds %d profiles (%s): choose one with --limits-profile NAME",
			file, len(ps), strings.Join(names, ", ")))
	}
	return saturation.LimitProfile{}, badInput(fmt.Errorf("%s: no profile %q (it holds %s)", file, profile, strings.Join(names, ", ")))
}

// registerLimitsProfile adds --limits-profile, the profile of a --limits
// file that holds several.
func registerLimitsProfile(cmd *cobra.Command, profile *string) {
	cmd.Flags().StringVar(profile, "limits-profile", "", "the profile to use of a --limits file that holds several (required then)")
}

// sweepFlags are the flags of sweep beyond the shared ones.
type sweepFlags struct {
	vary                        []string
	reagent, partner, carbonate string
	strength                    float64
}

func newSweepCmd(stdin io.Reader) *cobra.Command {
	c := &commonFlags{}
	sf := &sweepFlags{}
	cmd := &cobra.Command{
		Use:   "sweep [FILE...|-] --vary NAME=FROM:TO:N [--vary NAME=FROM:TO:N]",
		Short: "Every saturation index and index of each water over a range of temperature, cycles, dose or blend",
		Example: `  scalerisk sweep --demo --vary temperature=10:80:8
  scalerisk sweep makeup.csv --vary cycles=1:6:11 --format csv
  scalerisk sweep makeup.csv --vary dose=0:200:9 --reagent sulfuric --vary temperature=20:70:6`,
		Long: "sweep varies one or two of temperature (°C; the water re-speciated at each, closed carbonate\n" +
			"system), cycles (concentration), dose (mg/L of --reagent) and fraction (share of the water in\n" +
			"a blend with the first sample of --partner FILE), each as NAME=FROM:TO:N (N values), and\n" +
			"gives every saturation index and classic index at each point; with two --vary it is a grid.\n\n" +
			reports.Caution,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, opt, ropt, err := c.setup(cmd)
			if err != nil {
				return err
			}
			x, y, err := sf.axes(cmd, stdin, ropt, &opt)
			if err != nil {
				return err
			}
			run, src, err := c.runner(cmd, args, stdin, ropt)
			if err != nil {
				return err
			}
			w := reports.NewSweepWriter(run.out, format, c.writeOptions(cmd))
			return stream(run, src, w, batch[reports.SweepOutcome]{
				newWorker: func() func(string, water.Record) (reports.SweepOutcome, error) {
					return func(_ string, rec water.Record) (reports.SweepOutcome, error) {
						pts, err := saturation.Sweep(rec.Analysis, x, y, opt)
						return reports.SweepOutcome{Name: rec.Name, X: x, Y: y, Points: pts, Err: err}, err
					}
				},
			})
		},
	}
	c.register(cmd)
	f := cmd.Flags()
	f.StringArrayVar(&sf.vary, "vary", nil, "variable and range: temperature|cycles|dose|fraction=FROM:TO:N (once or twice)")
	f.StringVar(&sf.reagent, "reagent", "", "reagent for --vary dose, by formula or name: "+reagentNames())
	f.Float64Var(&sf.strength, "strength", 0, "product strength, percent (default: the reagent table's usual strength)")
	f.StringVar(&sf.partner, "partner", "", "CSV file whose first sample is blended with each water for --vary fraction")
	f.StringVar(&sf.carbonate, "carbonate", "", "carbonate system: closed or air; for --vary cycles also natural, relation=A,B or acid=VALUE (acid control), as in cycles (default: natural with --vary cycles, as cycles does; closed otherwise)")
	return cmd
}

// axes turns the flags into the swept axes, x and y (nil for one --vary),
// and sets the carbonate mode of opt; a bad flag is a bad-input error.
func (sf *sweepFlags) axes(cmd *cobra.Command, stdin io.Reader, ropt water.ReadOptions, opt *saturation.Options) (saturation.Axis, *saturation.Axis, error) {
	if len(sf.vary) == 0 || len(sf.vary) > 2 {
		return saturation.Axis{}, nil, badInput(errors.New("give one or two --vary NAME=FROM:TO:N"))
	}
	carbonate := sf.carbonate
	if carbonate == "" {
		// One default for one question: cycles of an open tower follow the
		// tower rule, as in cycles; anything else is closed.
		carbonate = "closed"
		for _, v := range sf.vary {
			if name, _, _ := strings.Cut(v, "="); strings.TrimSpace(name) == "cycles" {
				carbonate = "natural"
			}
		}
	}
	rule, err := parseRule(cmd, carbonate)
	if err != nil {
		return saturation.Axis{}, nil, err
	}
	towerRule := rule.A != 0 || rule.SetPoint != 0
	if !towerRule {
		opt.Carbonate = rule.Mode
	}
	axes := make([]saturation.Axis, len(sf.vary))
	for i, v := range sf.vary {
		if axes[i], err = parseAxis(v); err != nil {
			return saturation.Axis{}, nil, badInput(err)
		}
		switch axes[i].Var {
		case saturation.VaryDose:
			if sf.reagent == "" {
				return saturation.Axis{}, nil, badInput(errors.New("--vary dose needs --reagent"))
			}
			r, err := reagentFlag(cmd, sf.reagent, sf.strength)
			if err != nil {
				return saturation.Axis{}, nil, err
			}
			axes[i].Reagent, axes[i].Strength = r, sf.strength
		case saturation.VaryFraction:
			pw, err := firstSample(sf.partner, stdin, ropt, *opt)
			if err != nil {
				return saturation.Axis{}, nil, err
			}
			axes[i].Partner = pw
		}
	}
	if towerRule {
		found := false
		for i := range axes {
			if axes[i].Var == saturation.VaryCycles {
				axes[i].Rule, found = &rule, true
			}
		}
		if !found {
			return saturation.Axis{}, nil, badInput(fmt.Errorf("--carbonate %s is a rule for cycles: give --vary cycles=…, or use closed or air", sf.carbonate))
		}
	}
	if len(axes) == 1 {
		return axes[0], nil, nil
	}
	if axes[0].Var == axes[1].Var {
		return saturation.Axis{}, nil, badInput(fmt.Errorf("--vary %s is given twice", axes[0].Var))
	}
	return axes[0], &axes[1], nil
}

// parseAxis reads NAME=FROM:TO:N.
func parseAxis(s string) (saturation.Axis, error) {
	name, rng, ok := strings.Cut(s, "=")
	if !ok {
		return saturation.Axis{}, fmt.Errorf("--vary %q: want NAME=FROM:TO:N", s)
	}
	v, err := saturation.ParseVariable(strings.TrimSpace(name))
	if err != nil {
		return saturation.Axis{}, err
	}
	parts := strings.Split(rng, ":")
	if len(parts) != 3 {
		return saturation.Axis{}, fmt.Errorf("--vary %q: want FROM:TO:N", s)
	}
	from, err1 := water.ParseNumber(parts[0])
	to, err2 := water.ParseNumber(parts[1])
	n, err3 := water.ParseNumber(parts[2])
	if err1 != nil || err2 != nil || err3 != nil || n < 1 || n > 1000 || n != float64(int(n)) {
		return saturation.Axis{}, fmt.Errorf("--vary %q: FROM and TO are numbers, N a whole number from 1 to 1000", s)
	}
	return saturation.Axis{Var: v, Values: saturation.Range(from, to, int(n))}, nil
}

// firstSample returns the first good sample of a file, for --partner.
func firstSample(file string, stdin io.Reader, ropt water.ReadOptions, opt saturation.Options) (water.Analysis, error) {
	if file == "" {
		return water.Analysis{}, badInput(errors.New("a blend needs a second water (--partner FILE)"))
	}
	return pickSample(input{name: file}, sampleChoice{nth: 1}, stdin, ropt, opt)
}

// checkComputable speciates the picked water alone, so that a water a
// blend cannot use is named with its file and line before any work (it
// once gave an empty blend table with exit 0, or exit 1 naming neither):
// an inconsistent analysis is bad input, exit 2; any other failure exit 1.
func checkComputable(file string, r water.Record, opt saturation.Options) error {
	_, err := saturation.NewSpeciator(opt.Model).Speciate(r.Analysis, opt)
	switch {
	case err == nil:
		return nil
	case errors.Is(err, saturation.ErrInconsistent):
		return badInput(fmt.Errorf("%s:%d: %w", file, r.Line, err))
	}
	return &exitError{code: exitInternal, err: fmt.Errorf("%s:%d: %w", file, r.Line, err)}
}

// sampleChoice picks a good sample of an input: by name, or else the nth
// (counting from 1).
type sampleChoice struct {
	name string
	nth  int
}

// pickSample returns the good sample of an input that choice picks.
func pickSample(in input, choice sampleChoice, stdin io.Reader, ropt water.ReadOptions, opt saturation.Options) (water.Analysis, error) {
	records, probs, err := readInput(in, stdin, ropt)
	if err != nil {
		return water.Analysis{}, badInput(err)
	}
	return pickFrom(in, records, probs, choice, opt)
}

// pickFrom returns the good sample that choice picks among the records
// (and file problems) read from input in.
func pickFrom(in input, records []water.Record, probs []error, choice sampleChoice, opt saturation.Options) (water.Analysis, error) {
	for _, p := range probs {
		if !errors.Is(p, water.ErrNotUsed) {
			return water.Analysis{}, badInput(p)
		}
	}
	// By position every row counts and a bad row picked is an error at
	// its line and column (it is not skipped for the next good one); by
	// name, a bad row of that name is.
	seen := 0
	for _, r := range records {
		seen++
		if (choice.name == "" && seen == choice.nth) || (choice.name != "" && r.Name == choice.name) {
			if r.Err != nil {
				return water.Analysis{}, badInput(r.Err)
			}
			return r.Analysis, checkComputable(in.name, r, opt)
		}
	}
	if choice.name == "" {
		return water.Analysis{}, badInput(fmt.Errorf("%s: fewer than %d samples", in.name, choice.nth))
	}
	return water.Analysis{}, badInput(fmt.Errorf("%s: no good sample named %q", in.name, choice.name))
}
