package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// commonFlags are the flags every command that reads waters shares.
type commonFlags struct {
	format         string
	temperature    float64
	activity       string
	thermo         string
	belowDetection string
	demo           bool
	flow           float64
}

// register adds the shared flags to cmd.
func (c *commonFlags) register(cmd *cobra.Command) {
	f := cmd.Flags()
	f.StringVar(&c.format, "format", "text", "output format: text, csv or json")
	f.Float64Var(&c.temperature, "temperature", 0, "evaluate each sample at this temperature, °C (closed carbonate system)")
	f.StringVar(&c.activity, "activity", "auto", "activity model: auto, davies, truesdell-jones, bdot or pitzer")
	f.StringVar(&c.thermo, "thermo", "", "extra thermodynamic table (CSV) whose rows add to or replace the embedded ones")
	f.StringVar(&c.belowDetection, "below-detection", "half", "value for \"<x\" results: half (x/2), zero or limit (x)")
	f.BoolVar(&c.demo, "demo", false, "use the embedded demo waters of a fictional plant")
	f.Float64Var(&c.flow, "flow", 0, "flow of the water, m³/h, to give scale and doses in kg/day")
}

// setup turns the shared flags into a format, speciation options and read
// options; a bad value is a bad-input error.
func (c *commonFlags) setup(cmd *cobra.Command) (reports.Format, saturation.Options, water.ReadOptions, error) {
	format, err := reports.ParseFormat(c.format)
	if err != nil {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(err)
	}
	activity, err := saturation.ParseActivityModel(c.activity)
	if err != nil {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(err)
	}
	policy, err := water.ParseDetectionPolicy(c.belowDetection)
	if err != nil {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(err)
	}
	if !(c.flow >= 0) || math.IsInf(c.flow, 0) {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(fmt.Errorf("--flow %g: want a flow of 0 or more m³/h", c.flow))
	}
	opt := saturation.Options{Activity: activity, Flow: c.flow}
	if cmd.Flags().Changed("temperature") {
		if !(c.temperature >= saturation.MinTemperature && c.temperature <= saturation.MaxTemperature) { // also rejects NaN
			return 0, saturation.Options{}, water.ReadOptions{}, badInput(fmt.Errorf("--temperature %g is outside %d–%d °C",
				c.temperature, saturation.MinTemperature, saturation.MaxTemperature))
		}
		opt.AtTemperature, opt.Temperature = true, c.temperature
	}
	if c.thermo != "" {
		model, err := loadThermo(c.thermo)
		if err != nil {
			return 0, saturation.Options{}, water.ReadOptions{}, err
		}
		opt.Model = model
	}
	return format, opt, water.ReadOptions{Detection: policy}, nil
}

// inputs lists the inputs named by args, the demo file first with --demo.
func (c *commonFlags) inputs(args []string) []input {
	var in []input
	if c.demo {
		in = append(in, input{name: demoName, embedded: true})
	}
	for _, a := range args {
		in = append(in, input{name: a})
	}
	return in
}

// read reads the inputs named by args (and the demo with --demo); no input
// at all is a bad-input error.
func (c *commonFlags) read(cmd *cobra.Command, args []string, stdin io.Reader, ropt water.ReadOptions) ([]fileRecords, int, error) {
	inputs := c.inputs(args)
	if len(inputs) == 0 {
		return nil, 0, badInput(errors.New("no input: give CSV files, - for standard input, or --demo"))
	}
	files, problems := readAll(inputs, stdin, ropt, cmd.ErrOrStderr())
	return files, problems, nil
}

// fileRecords is what one input held.
type fileRecords struct {
	name    string
	records []water.Record
}

// readAll reads every input, printing file problems and bad rows to
// stderr; it returns the records of each readable file and the number of
// problems printed.
func readAll(inputs []input, stdin io.Reader, ropt water.ReadOptions, stderr io.Writer) ([]fileRecords, int) {
	var out []fileRecords
	problems := 0
	for _, in := range inputs {
		records, probs, err := readInput(in, stdin, ropt)
		if err != nil {
			fmt.Fprintln(stderr, err)
			problems++
			continue
		}
		for _, p := range probs {
			fmt.Fprintln(stderr, p)
			problems++
		}
		for _, r := range records {
			if r.Err != nil {
				fmt.Fprintln(stderr, r.Err)
				problems++
			}
		}
		out = append(out, fileRecords{name: in.name, records: records})
	}
	return out, problems
}

// tally reports the error of an assessment on stderr, if it has one not
// already reported by the reader, and counts it: an inconsistent analysis
// as bad input, any other as a failure.
func tally(stderr io.Writer, a saturation.Assessment, problems, failures *int) {
	switch {
	case a.Err == nil:
	case errors.Is(a.Err, saturation.ErrInconsistent):
		fmt.Fprintf(stderr, "%s:%d: %v\n", a.File, a.Line, a.Err)
		*problems++
	case !a.BadInput:
		fmt.Fprintf(stderr, "%s:%d: %v\n", a.File, a.Line, a.Err)
		*failures++
	}
}

// finish maps the counts of bad input and of failed samples to the exit
// status: 2 for bad input, else 1 for failures, else success.
func finish(problems, failures int) error {
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
		f, err := water.OpenDemo()
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
