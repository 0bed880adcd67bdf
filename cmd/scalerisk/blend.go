package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// blendOptions holds the flags of blend beyond the shared ones.
type blendOptions struct {
	common        commonFlags
	fraction      float64
	samples       []string
	limits        string
	limitsProfile string
}

func newBlendCmd(stdin io.Reader) *cobra.Command {
	o := &blendOptions{}
	cmd := &cobra.Command{
		Use:   "blend A.csv B.csv|--demo --fraction F [--sample NAME_A] [--sample NAME_B] [--limits PROFILE|FILE]",
		Short: "Mix two waters, assess the blend and find the safe share of the first (judged at the bulk and the skin)",
		Example: `  scalerisk blend --demo --fraction 0.3
  scalerisk blend well.csv river.csv --fraction 0.4 --sample "North well" --sample "River intake"
  scalerisk blend well.csv river.csv --fraction 0.2 --limits no-inhibitor --skin-temperature 65`,
		Long: "blend mixes the first sample of A.csv (or --sample NAME) with the first sample of B.csv\n" +
			"(or a second --sample NAME) by volume, F being the share of the first water, and assesses\n" +
			"the blend like assess. With one input (a file or --demo) the two waters are its first two\n" +
			"samples, or the two named by --sample. The blend is computed from the totals and\n" +
			"re-speciated, never by averaging indices.\n" +
			"The blend is judged against the limits of --limits (no-inhibitor, inhibitor or a CSV of your\n" +
			"own) at the bulk (the blend's own temperature, or --temperature) and at --skin-temperature\n" +
			"(default 60 °C, a common tube-wall temperature; the bulk pH held, as the classic skin\n" +
			"index); the stricter governs and the output says which. The safe share of the first water\n" +
			"is searched the same way: the most of it the blend can take (or the least, when the second\n" +
			"water alone is past a limit), judged at both temperatures.\n\n" + reports.Caution,
		RunE: func(cmd *cobra.Command, args []string) error { return o.run(cmd, args, stdin) },
	}
	o.common.register(cmd)
	f := cmd.Flags()
	f.Float64Var(&o.fraction, "fraction", 0.5, "share of the first water in the blend, 0–1 (by volume)")
	f.StringArrayVar(&o.samples, "sample", nil, "sample name in the first file, then in the second (default: the first sample of each)")
	f.StringVar(&o.limits, "limits", "inhibitor", "limit profile the blend is judged by: no-inhibitor, inhibitor, or a CSV file of your own")
	registerLimitsProfile(cmd, &o.limitsProfile)
	o.common.registerSkin(cmd, reports.DefaultSkinTemperature)
	return cmd
}

// run checks the flags, picks the two waters, and writes the blend's
// assessment with its judgement.
func (o *blendOptions) run(cmd *cobra.Command, args []string, stdin io.Reader) error {
	c := &o.common
	format, opt, ropt, err := c.setup(cmd)
	if err != nil {
		return err
	}
	fraction := o.fraction
	if !(fraction >= 0 && fraction <= 1) {
		return badInput(fmt.Errorf("--fraction %g: want a share from 0 to 1", fraction))
	}
	profile, err := loadProfile(o.limits, o.limitsProfile, opt.Model)
	if err != nil {
		return err
	}
	ws, err := o.waters(args, stdin, ropt, opt)
	if err != nil {
		return err
	}
	blend, err := saturation.BlendWaters(ws, []float64{fraction, 1 - fraction}, opt)
	if err != nil {
		return &exitError{code: exitInternal, err: err}
	}
	as := saturation.AssessAnalysis(blend, opt)
	as.Flow = c.flow
	out := reports.BlendOutcome{Assessment: as, First: ws[0].Name, Second: ws[1].Name, Fraction: fraction}
	out.Judged, out.Err = saturation.JudgeBlend(ws[0], ws[1], fraction, profile, opt)
	w := reports.NewBlendWriter(cmd.OutOrStdout(), format, mineralNames(opt.Model), c.writeOptions(cmd))
	if err := w.WriteAll(out); err != nil {
		return &exitError{code: exitInternal, err: err}
	}
	r := &runner{stderr: cmd.ErrOrStderr()}
	for i, e := range []error{as.Err, out.Err} {
		if e != nil && !(i == 1 && as.Err != nil) { // a blend that cannot be speciated fails both: say it once
			fmt.Fprintln(r.stderr, reports.SafeText(e.Error()))
			r.failures++
		}
	}
	return r.exit()
}

// waters picks the two waters of a blend: two inputs (the demo counts as
// one), or one input holding both.
func (o *blendOptions) waters(args []string, stdin io.Reader, ropt water.ReadOptions, opt saturation.Options) ([]water.Analysis, error) {
	if len(o.samples) > 2 {
		return nil, badInput(errors.New("--sample: at most two names, one per water"))
	}
	inputs := o.common.inputs(args)
	names := append(o.samples, "", "")[:2]
	choices := []sampleChoice{{name: names[0], nth: 1}, {name: names[1], nth: 1}}
	var ws []water.Analysis
	switch len(inputs) {
	case 1:
		// Both waters from one input, read once (standard input can be
		// read only once): the second sample when the second is not named.
		choices[1].nth = 2
		records, probs, err := readInput(inputs[0], stdin, ropt)
		if err != nil {
			return nil, badInput(err)
		}
		for _, choice := range choices {
			w, err := pickFrom(inputs[0], records, probs, choice, opt)
			if err != nil {
				return nil, err
			}
			ws = append(ws, w)
		}
	case 2:
		for i, in := range inputs {
			w, err := pickSample(in, choices[i], stdin, ropt, opt)
			if err != nil {
				return nil, err
			}
			ws = append(ws, w)
		}
	default:
		return nil, badInput(fmt.Errorf("blend takes two waters: two files, or one file (or --demo) with --sample twice; got %d inputs", len(inputs)))
	}
	return ws, nil
}
