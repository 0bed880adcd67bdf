package main

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"iter"
	"math"
	"os"
	"runtime"

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
	dateFormat     string
	demo           bool
	flow           float64
	jobs           int
	indent         bool
	rawCSV         bool
	skin           float64 // --skin-temperature of the commands that decide
}

// register adds the shared flags to cmd.
func (c *commonFlags) register(cmd *cobra.Command) {
	f := cmd.Flags()
	f.StringVar(&c.format, "format", "text", "output format: text, csv or json")
	f.Float64Var(&c.temperature, "temperature", 0, "evaluate each sample at this temperature, °C (closed carbonate system)")
	f.StringVar(&c.activity, "activity", "auto", "activity model: auto, davies, truesdell-jones, bdot or pitzer")
	f.StringVar(&c.thermo, "thermo", "", "extra thermodynamic table (CSV) whose rows add to or replace the embedded ones")
	f.StringVar(&c.belowDetection, "below-detection", "half", "value for \"<x\" results: half (x/2), zero or limit (x)")
	f.StringVar(&c.dateFormat, "date-format", "", "how the files write dates when not YYYY-MM-DD: DD/MM/YYYY, MM/DD/YYYY, DD.MM.YYYY, DD-MM-YYYY, YYYY/MM/DD, DD/MM/YY or serial (spreadsheet day numbers); a time may follow")
	f.BoolVar(&c.demo, "demo", false, "use the embedded demo waters of a fictional plant")
	f.Float64Var(&c.flow, "flow", 0, "flow of the water, m³/h, to give scale and doses in kg/day")
	f.BoolVar(&c.rawCSV, "raw-csv", false, "write CSV cells as they are, for pipelines (by default a cell beginning with =, +, -, @, tab or CR that is not a number gets a leading ' so that a spreadsheet does not run it as a formula)")
	f.BoolVar(&c.indent, "indent", false, "indent JSON, one key per line (the default when writing to a terminal; compact otherwise)")
	f.IntVar(&c.jobs, "jobs", runtime.NumCPU(), "samples computed at once (workers); the output is the same for any number")
}

// registerSkin adds --skin-temperature, the flag every command that decides
// shares (cycles, dose, report, balance, membrane).
func (c *commonFlags) registerSkin(cmd *cobra.Command, def float64) {
	cmd.Flags().Float64Var(&c.skin, "skin-temperature", def,
		"hottest surface the water meets (a heat-exchanger tube wall), °C: each decision is judged at the bulk and at this temperature (bulk pH held) and the stricter governs; 0 judges at the bulk only")
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
	dates, err := water.ParseDateFormat(c.dateFormat)
	if err != nil {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(fmt.Errorf("--date-format: %w", err))
	}
	if !(c.flow >= 0) || math.IsInf(c.flow, 0) {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(fmt.Errorf("--flow %g: want a flow of 0 or more m³/h", c.flow))
	}
	if c.jobs < 1 {
		return 0, saturation.Options{}, water.ReadOptions{}, badInput(fmt.Errorf("--jobs %d: want 1 or more workers", c.jobs))
	}
	opt := saturation.Options{Activity: activity}
	if cmd.Flags().Lookup("skin-temperature") != nil {
		if !(c.skin == 0 || c.skin >= saturation.MinTemperature && c.skin <= saturation.MaxTemperature) {
			return 0, saturation.Options{}, water.ReadOptions{}, badInput(fmt.Errorf("--skin-temperature %g is outside %d–%d °C",
				c.skin, saturation.MinTemperature, saturation.MaxTemperature))
		}
		opt.Skin = c.skin
	}
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
	return format, opt, water.ReadOptions{Detection: policy, Dates: dates}, nil
}

// writeOptions are the options of the sample writers: JSON indented with
// --indent or when written to a terminal, compact otherwise.
func (c *commonFlags) writeOptions(cmd *cobra.Command) reports.WriteOptions {
	return reports.WriteOptions{Indent: c.indent || isTerminal(cmd.OutOrStdout()), RawCSV: c.rawCSV}
}

// mineralNames lists the minerals of model (nil: the default) in table
// order: the "si_" columns of assess CSV, fixed before any sample is
// computed.
func mineralNames(model *saturation.Model) []string {
	table := saturation.DefaultTable()
	if model != nil {
		table = model.Table()
	}
	var names []string
	for _, e := range table.Minerals() {
		names = append(names, e.Name)
	}
	return names
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

// runner checks that there is some input and returns the runner of the
// command, and the items of its inputs (the demo file first with --demo).
func (c *commonFlags) runner(cmd *cobra.Command, args []string, stdin io.Reader, ropt water.ReadOptions) (*runner, iter.Seq[item], error) {
	inputs := c.inputs(args)
	if len(inputs) == 0 {
		return nil, nil, badInput(errors.New("no input: give CSV files, - for standard input, or --demo"))
	}
	r := &runner{out: bufio.NewWriterSize(cmd.OutOrStdout(), 64<<10), stdin: stdin, stderr: cmd.ErrOrStderr(), jobs: c.jobs}
	r.progress = newProgress(r.stderr, inputSize(inputs))
	return r, r.items(inputs, ropt), nil
}

// demoName is the file name the embedded demo waters carry in output.
const demoName = "demo.csv"

// input is one input of a command: a file name, "-" for standard input,
// or the embedded demo file.
type input struct {
	name     string
	embedded bool
}

// open opens one input; the caller closes it.
func open(in input, stdin io.Reader) (io.ReadCloser, error) {
	switch {
	case in.embedded:
		return water.OpenDemo()
	case in.name == "-":
		return io.NopCloser(stdin), nil
	}
	f, err := os.Open(in.name)
	if err != nil {
		return nil, &water.InputError{File: in.name, Err: errors.Unwrap(err)}
	}
	// Large reads: a few system calls for many rows.
	return struct {
		io.Reader
		io.Closer
	}{bufio.NewReaderSize(f, 64<<10), f}, nil
}

// readInput reads the whole of one input.
func readInput(in input, stdin io.Reader, opt water.ReadOptions) ([]water.Record, []error, error) {
	r, err := open(in, stdin)
	if err != nil {
		return nil, nil, err
	}
	defer r.Close()
	return water.Read(in.name, r, opt)
}

// records yields the records of one input one at a time as they are read,
// and its file problems (a fatal one last).
func records(in input, stdin io.Reader, opt water.ReadOptions, p *progress) iter.Seq2[water.Record, error] {
	return func(yield func(water.Record, error) bool) {
		r, err := open(in, stdin)
		if err != nil {
			yield(water.Record{}, err)
			return
		}
		defer r.Close()
		for rec, err := range water.Records(in.name, p.reader(r), opt) {
			if !yield(rec, err) {
				return
			}
		}
	}
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
