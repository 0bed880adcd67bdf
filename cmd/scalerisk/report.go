package main

import (
	"errors"
	"fmt"
	"io"
	"time"

	"github.com/spf13/cobra"

	"scalerisk/outfile"
	"scalerisk/plan"
	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// reportOptions holds the flags of report beyond the shared ones.
type reportOptions struct {
	common        commonFlags
	output        string
	title         string
	client        string
	date          string
	maxCycles     float64
	reagent       string
	strength      float64
	maxDose       float64
	target        string
	limits        string
	limitsProfile string
	carbonate     string
	detail        int
	blendWith     string
	blendFraction float64
	uncertainty   uncertaintyFlags
}

func newReportCmd(stdin io.Reader) *cobra.Command {
	o := &reportOptions{}
	cmd := &cobra.Command{
		Use:   "report [FILE...|-] [--demo] -o report.html",
		Short: "Write a self-contained HTML report with charts for a client",
		Example: `  scalerisk report --demo -o demo-report.html
  scalerisk report lab-2026-03.csv --skin-temperature 70 --limits inhibitor -o march.html`,
		Long: "report reads laboratory analyses (wide or long CSV; - for standard input; --demo for the\n" +
			"embedded demo waters), assesses every sample as assess does, and writes one HTML file that\n" +
			"opens in any browser with no network: a summary of every sample, worst first, and for the\n" +
			"--detail samples of highest risk a section with its findings, the saturation indices\n" +
			"against their limits (SI, limit, margin, risk band), the dose of --reagent to --target and\n" +
			"the highest cycles under --limits, charts of the saturation index against temperature\n" +
			"(sample to --skin-temperature), cycles of concentration and reagent dose, the operating\n" +
			"window (the margin to the nearest limit over temperature × cycles with each mineral's\n" +
			"limit curve), the composition, the classic indices, the scale that could form, the\n" +
			"analysis as entered and as used and the data quality; then the methods and data sources\n" +
			"and the cautions. Waters sampled on two or more dates get their indices over time.\n\n" +
			"The file is written whole or not at all (a temporary file, then a rename); -o - writes to\n" +
			"standard output.\n\n" +
			"Exit status: 0 all samples computed; 2 bad input (the report is still written with the\n" +
			"good samples and lists the bad ones; also an -o that is not a regular file or is an input);\n" +
			"1 a sample could not be computed or writing failed (1 wins over 2).\n\n" +
			reports.Caution,
		Args: cobra.ArbitraryArgs,
		RunE: func(cmd *cobra.Command, args []string) error { return o.run(cmd, args, stdin) },
	}
	o.common.register(cmd)
	o.uncertainty.register(cmd)
	// The report is HTML; the shared --format and --indent flags do not
	// apply.
	for _, name := range []string{"format", "indent"} {
		if err := cmd.Flags().MarkHidden(name); err != nil {
			panic(err)
		}
	}
	f := cmd.Flags()
	f.StringVarP(&o.output, "output", "o", "report.html", "the HTML file to write (- for standard output)")
	f.StringVar(&o.title, "title", "", "title of the report (default \""+reports.DefaultReportTitle+"\")")
	f.StringVar(&o.client, "client", "", "who the report is prepared for, shown under the title")
	f.StringVar(&o.date, "date", "", "date shown on the report (default today; --date none leaves it out)")
	o.common.registerSkin(cmd, reports.DefaultSkinTemperature) // also the end of the temperature axis
	f.Float64Var(&o.maxCycles, "max-cycles", reports.DefaultMaxCycles, "end of the cycles axis and of the highest-cycles search")
	f.StringVar(&o.reagent, "reagent", reports.DefaultReagent, "reagent of the dose chart and the dose to target, by formula or name: "+reagentNames())
	f.Float64Var(&o.strength, "strength", 0, "strength of the reagent product, percent (default: the reagent table's usual strength)")
	f.Float64Var(&o.maxDose, "max-dose", 0, "end of the dose axis, mg/L of product (default: 80 % of the alkalinity neutralised)")
	f.StringVar(&o.target, "target", "lsi=0.5", "target of the dose: ph=VALUE, lsi=VALUE, rsi=VALUE, psi=VALUE, si:MINERAL=VALUE, or none")
	f.StringVar(&o.limits, "limits", "inhibitor", "limit profile of the highest-cycles search: no-inhibitor, inhibitor, a CSV file, or none")
	registerLimitsProfile(cmd, &o.limitsProfile)
	f.StringVar(&o.carbonate, "carbonate", "natural", "carbonate rule of the highest-cycles search: natural, relation=A,B, air, acid=VALUE (acid control) or closed")
	f.IntVar(&o.detail, "detail", 20, "how many samples get a full section with charts, those of highest risk first (0: all); every sample is in the summary")
	f.StringVar(&o.blendWith, "blend-with", "", "CSV file whose first sample is blended with each water (shown in the report)")
	f.Float64Var(&o.blendFraction, "blend-fraction", 0.5, "share of each sample in the blend with --blend-with, 0–1 by volume")
	return cmd
}

func (o *reportOptions) run(cmd *cobra.Command, args []string, stdin io.Reader) error {
	if cmd.Flags().Changed("format") {
		return badInput(errors.New("report writes HTML: --format does not apply"))
	}
	_, opt, ropt, err := o.common.setup(cmd)
	if err != nil {
		return err
	}
	if o.detail < 0 {
		return badInput(fmt.Errorf("--detail %d is negative", o.detail))
	}
	if o.output == "" {
		return badInput(errors.New("no output file: give -o report.html (or -o - for standard output)"))
	}
	if o.output != "-" {
		if err := outfile.Check(o.output, o.inputFiles(args)); err != nil {
			return badInput(err)
		}
	}
	settings, err := o.settings(cmd, opt, ropt, stdin)
	if err != nil {
		return err
	}
	hopt := reports.HTMLOptions{Plan: settings, Detection: ropt.Detection, Detail: o.detail}
	if err := hopt.Check(); err != nil {
		return badInput(err)
	}

	r, src, err := o.common.runner(cmd, args, stdin, ropt)
	if err != nil {
		return err
	}
	rep := reports.Report{Title: o.title, Client: o.client, Date: reportDate(o.date), Options: hopt}
	hw, err := reports.NewHTMLWriter(rep)
	if err != nil {
		return badInput(err)
	}
	settings.Detailed = hw.MayDetail // no operating window for a summary row
	// Each worker assesses a sample and computes its plan (sweeps,
	// searches, blend); the writer lays the plans out in input order.
	samples := 0
	err = runBatch(r, src, batch[*plan.Sample]{
		newWorker: func() func(string, water.Record) (*plan.Sample, error) {
			sp := saturation.NewSpeciator(opt.Model)
			return func(file string, rec water.Record) (*plan.Sample, error) {
				a := sp.AssessRecord(file, rec, opt)
				a.Flow = o.common.flow
				return plan.Compute(a, settings), a.Err
			}
		},
		bad: func(file string, rec water.Record) *plan.Sample {
			return &plan.Sample{Assessment: saturation.Assessment{Name: rec.Name, File: file, Line: rec.Line, Err: rec.Err, BadInput: true}}
		},
		write: func(p *plan.Sample) error {
			samples++
			return hw.Add(p)
		},
	})
	if err != nil {
		return &exitError{code: exitInternal, err: err}
	}
	if samples == 0 {
		return &exitError{code: exitBadInput, err: errors.New("no samples to report"), quiet: r.problems > 0}
	}
	if o.output == "-" {
		err = hw.Finish(cmd.OutOrStdout())
	} else {
		err = outfile.Write(o.output, o.inputFiles(args), hw.Finish)
	}
	if err != nil {
		return outputError(err)
	}
	if o.output != "-" {
		fmt.Fprintf(cmd.OutOrStdout(), "wrote %s: %s\n", o.output, reports.Plural(samples, "sample", "samples"))
	}
	return r.exit()
}

// inputFiles lists the files report reads: its arguments and the files of
// --thermo, --limits and --blend-with (names that are not files are
// skipped by outfile).
func (o *reportOptions) inputFiles(args []string) []string {
	return append([]string{o.common.thermo, o.limits, o.blendWith}, args...)
}

// reportDate is the date shown on the report for --date d: today when d
// is empty, none for "none", else d as given.
func reportDate(d string) string {
	switch d {
	case "":
		return time.Now().Format("2 January 2006")
	case "none":
		return ""
	}
	return d
}

// settings turns the flags of report into what the plan of every sample
// computes.
func (o *reportOptions) settings(cmd *cobra.Command, opt saturation.Options, ropt water.ReadOptions, stdin io.Reader) (plan.Settings, error) {
	s := plan.Settings{Speciation: opt, SkinTemperature: o.common.skin, MaxCycles: o.maxCycles,
		Strength: o.strength, MaxDose: o.maxDose}
	mc, _, err := o.uncertainty.settings()
	if err != nil {
		return s, err
	}
	mc.Workers = o.common.jobs
	s.Uncertainty = mc
	reagent, err := reagentFlag(cmd, o.reagent, o.strength)
	if err != nil {
		return s, err
	}
	s.Reagent = reagent
	if o.target != "none" {
		t, err := saturation.ParseTarget(o.target, opt.Model)
		if err != nil {
			return s, badInput(err)
		}
		s.Target = &t
	}
	rule, err := parseRule(cmd, o.carbonate)
	if err != nil {
		return s, err
	}
	s.CyclesRule = &rule
	if o.limits != "none" {
		p, err := loadProfile(o.limits, o.limitsProfile, opt.Model)
		if err != nil {
			return s, err
		}
		s.Profile = &p
	}
	if o.blendWith != "" {
		if !(o.blendFraction >= 0 && o.blendFraction <= 1) {
			return s, badInput(fmt.Errorf("--blend-fraction %g: want a share from 0 to 1", o.blendFraction))
		}
		p, err := firstSample(o.blendWith, stdin, ropt, opt)
		if err != nil {
			return s, err
		}
		s.Partner, s.BlendFraction = &p, o.blendFraction
	}
	return s, nil
}
