package main

import (
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/spf13/cobra"

	"scalerisk/data"
	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// assessOptions holds the flags of assess.
type assessOptions struct {
	format         string
	temperature    float64
	activity       string
	thermo         string
	belowDetection string
	demo           bool
}

func newAssessCmd(stdin io.Reader) *cobra.Command {
	o := &assessOptions{}
	cmd := &cobra.Command{
		Use:   "assess [FILE...|-]",
		Short: "Data quality, speciation and saturation indices of each sample",
		Long: "assess reads laboratory analyses (wide or long CSV; - for standard input; --demo for the\n" +
			"embedded demo waters) and prints, for each sample, the data-quality checks (ion balance,\n" +
			"TDS, conductivity, ionic strength), the equilibrium pH and ionic strength, and the\n" +
			"saturation index of every mineral with a plain-word risk band.\n\n" +
			"pH and alkalinity at the pH measurement temperature fix inorganic carbon; at any other\n" +
			"temperature carbon and alkalinity are conserved and pH is recomputed (closed system).\n\n" +
			"Values below the detection limit (\"<0.1\") are taken as half the limit unless\n" +
			"--below-detection says zero or limit.\n\n" +
			"Exit status: 0 all samples computed; 2 bad input (the good samples are still\n" +
			"written); 1 a sample could not be computed.\n\n" + reports.Caution,
		RunE: func(cmd *cobra.Command, args []string) error { return o.run(cmd, args, stdin) },
	}
	f := cmd.Flags()
	f.StringVar(&o.format, "format", "text", "output format: text, csv or json")
	f.Float64Var(&o.temperature, "temperature", 0, "evaluate each sample at this temperature, °C (closed carbonate system)")
	f.StringVar(&o.activity, "activity", "auto", "activity model: auto, davies, truesdell-jones or bdot (pitzer: a later release)")
	f.StringVar(&o.thermo, "thermo", "", "extra thermodynamic table (CSV) whose rows add to or replace the embedded ones")
	f.StringVar(&o.belowDetection, "below-detection", "half", "value for \"<x\" results: half (x/2), zero or limit (x)")
	f.BoolVar(&o.demo, "demo", false, "assess the embedded demo waters of a fictional plant")
	return cmd
}

func (o *assessOptions) run(cmd *cobra.Command, args []string, stdin io.Reader) error {
	format, err := reports.ParseFormat(o.format)
	if err != nil {
		return badInput(err)
	}
	activity, err := saturation.ParseActivityModel(o.activity)
	if err != nil {
		return badInput(err)
	}
	policy, err := water.ParseDetectionPolicy(o.belowDetection)
	if err != nil {
		return badInput(err)
	}
	opt := saturation.Options{Activity: activity}
	if cmd.Flags().Changed("temperature") {
		if !(o.temperature >= 0 && o.temperature <= 150) { // also rejects NaN
			return badInput(fmt.Errorf("--temperature %g is outside 0–150 °C", o.temperature))
		}
		opt.AtTemperature, opt.Temperature = true, o.temperature
	}
	if o.thermo != "" {
		model, err := loadThermo(o.thermo)
		if err != nil {
			return err
		}
		opt.Model = model
	}
	var inputs []input
	if o.demo {
		inputs = append(inputs, input{name: demoName, embedded: true})
	}
	for _, a := range args {
		inputs = append(inputs, input{name: a})
	}
	if len(inputs) == 0 {
		return badInput(errors.New("no input: give CSV files, - for standard input, or --demo"))
	}
	stderr := cmd.ErrOrStderr()
	var all []saturation.Assessment
	problems, failures := 0, 0
	for _, in := range inputs {
		name := in.name
		records, probs, err := readInput(in, stdin, water.ReadOptions{Detection: policy})
		if err != nil {
			fmt.Fprintln(stderr, err)
			problems++
			continue
		}
		for _, p := range probs {
			fmt.Fprintln(stderr, p)
			problems++
		}
		as := saturation.AssessRecords(name, records, opt)
		for _, a := range as {
			switch {
			case a.BadInput:
				fmt.Fprintln(stderr, a.Err)
				problems++
			case a.Err != nil:
				fmt.Fprintf(stderr, "%s:%d: %v\n", name, a.Line, a.Err)
				failures++
			}
		}
		all = append(all, as...)
	}
	if err := reports.WriteAssessments(cmd.OutOrStdout(), format, all); err != nil {
		return &exitError{code: exitInternal, err: err}
	}
	switch {
	case problems > 0:
		return &exitError{code: exitBadInput, err: fmt.Errorf("%d input problem(s)", problems), quiet: true}
	case failures > 0:
		return &exitError{code: exitInternal, err: fmt.Errorf("%d sample(s) could not be computed", failures), quiet: true}
	}
	return nil
}

// demoName is the file name the embedded demo waters carry in output.
const demoName = "demo.csv"

// input is one input of a command: a file name, "-" for standard input,
// or the embedded demo file.
type input struct {
	name     string
	embedded bool
}

// readInput reads one input.
func readInput(in input, stdin io.Reader, opt water.ReadOptions) ([]water.Record, []error, error) {
	name := in.name
	var r io.Reader
	switch {
	case in.embedded:
		f, err := data.FS.Open("demo.csv")
		if err != nil {
			return nil, nil, err
		}
		defer f.Close()
		r = f
	case name == "-":
		r = stdin
	default:
		f, err := os.Open(name)
		if err != nil {
			return nil, nil, &water.InputError{File: name, Err: errors.Unwrap(err)}
		}
		defer f.Close()
		r = f
	}
	return water.Read(name, r, opt)
}

// loadThermo reads an extra thermodynamic table over the embedded one.
func loadThermo(name string) (*saturation.Model, error) {
	f, err := os.Open(name)
	if err != nil {
		return nil, badInput(&water.InputError{File: name, Err: errors.Unwrap(err)})
	}
	defer f.Close()
	table, err := saturation.DefaultTable().Extend(name, f)
	if err != nil {
		return nil, badInput(err)
	}
	model, err := saturation.NewModel(table)
	if err != nil {
		return nil, badInput(fmt.Errorf("%s: %w", name, err))
	}
	return model, nil
}
