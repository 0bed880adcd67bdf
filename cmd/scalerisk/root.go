package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"scalerisk/outfile"
	"scalerisk/reports"
)

// Exit codes: 0 success, 1 internal failure, 2 bad input.
const (
	exitOK       = 0
	exitInternal = 1
	exitBadInput = 2
)

// exitError carries the exit code of a failed command; the message has
// already been printed when quiet is true.
type exitError struct {
	code  int
	err   error
	quiet bool
}

func (e *exitError) Error() string { return e.err.Error() }
func (e *exitError) Unwrap() error { return e.err }

func badInput(err error) error { return &exitError{code: exitBadInput, err: err} }

// outputError maps an error writing an output file to its exit status by
// the one rule of output problems: a target that cannot be used (not a
// regular file, one of the inputs, a directory that does not exist or
// cannot be written) is bad input, exit 2, and nothing was written; a
// failure while writing (a full disk, an I/O error) is exit 1, and any
// earlier file is untouched.
func outputError(err error) error {
	var pe *outfile.PathError
	if errors.As(err, &pe) {
		return badInput(err)
	}
	return &exitError{code: exitInternal, err: fmt.Errorf("writing the output: %w", err)}
}

// newRootCmd builds the command tree; stdin serves "-" file arguments.
func newRootCmd(stdin io.Reader) *cobra.Command {
	root := &cobra.Command{
		Use:   "scalerisk",
		Short: "Mineral-scale risk of waters from laboratory analyses",
		Long: "scalerisk reads laboratory analyses of waters (CSV, in the units of the trade), checks\n" +
			"their quality, computes ionic strength, activity coefficients, the aqueous speciation and\n" +
			"the saturation index of calcite, gypsum, barite, celestite, silica and other minerals, then\n" +
			"answers the treatment questions: how risk moves with temperature, cycles, dosing and blending\n" +
			"(sweep), the dose that reaches a target (dose), the highest cycles under a limit profile\n" +
			"(cycles), what a blend does (blend), and a self-contained HTML report for a client (report).\n\n" +
			reports.Caution,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.Version = version()
	root.SuggestionsMinimumDistance = 2
	root.SetFlagErrorFunc(suggestFlag)
	root.AddCommand(newAssessCmd(stdin), newMineralsCmd(), newReportCmd(stdin), newTemplateCmd())
	root.AddCommand(newSweepCmd(stdin), newDoseCmd(stdin), newCyclesCmd(stdin), newBlendCmd(stdin),
		newBalanceCmd(stdin), newMembraneCmd(stdin))
	return root
}

// run executes the command line and maps errors to exit codes: 2 for bad
// input (including flag errors), 1 for anything else.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	root := newRootCmd(stdin)
	root.SetArgs(args)
	root.SetOut(stdout)
	root.SetErr(stderr)
	_, err := root.ExecuteC()
	if err == nil {
		return exitOK
	}
	var ee *exitError
	if errors.As(err, &ee) {
		if !ee.quiet {
			fmt.Fprintln(stderr, "scalerisk:", reports.SafeText(ee.err.Error()))
		}
		return ee.code
	}
	fmt.Fprintln(stderr, "scalerisk:", reports.SafeText(err.Error()))
	// Cobra's own errors (unknown flag or command, bad flag value) are
	// mistakes of the input.
	return exitBadInput
}
