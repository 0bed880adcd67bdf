package main

import (
	"encoding/csv"
	"fmt"
	"runtime/debug"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"scalerisk/water"
)

// version is the module version and VCS revision the binary was built from,
// as the Go toolchain records them ("(devel)" for go run and go build in a
// checkout; the tag for go install of a release).
func version() string {
	info, ok := debug.ReadBuildInfo()
	if !ok {
		return "unknown"
	}
	v := info.Main.Version
	if v == "" {
		v = "(devel)"
	}
	var rev, modified string
	for _, s := range info.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			if s.Value == "true" {
				modified = ", modified"
			}
		}
	}
	if len(rev) > 12 {
		rev = rev[:12]
	}
	if rev != "" {
		v += " (" + rev + modified + ")"
	}
	return v + " " + info.GoVersion
}

// suggestFlag adds, to cobra's "unknown flag" error, the nearest flag the
// command has, the way cobra suggests a mistyped command. Every flag error
// is bad input (exit 2).
func suggestFlag(cmd *cobra.Command, err error) error {
	msg := err.Error()
	name, ok := strings.CutPrefix(msg, "unknown flag: --")
	if !ok {
		return badInput(err)
	}
	best, bestD := "", 3 // suggest within an edit distance of 2
	cmd.Flags().VisitAll(func(f *pflag.Flag) {
		if d := editDistance(name, f.Name); d < bestD || (d == bestD && f.Name < best) {
			best, bestD = f.Name, d
		}
	})
	if best == "" {
		return badInput(fmt.Errorf("%s (see %s --help)", msg, cmd.CommandPath()))
	}
	return badInput(fmt.Errorf("%s: did you mean --%s?", msg, best))
}

// editDistance is the Levenshtein distance between a and b, in bytes
// (flag names are ASCII).
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}

func newTemplateCmd() *cobra.Command {
	var list bool
	cmd := &cobra.Command{
		Use:   "template [--list]",
		Short: "Write a starter CSV with every column the reader knows, in the units labs usually report",
		Example: `  scalerisk template > kestrel-fen-march.csv
  scalerisk template --list`,
		Long: "template writes the header of a starter file in the wide form: one row per sample, the\n" +
			"sample fields (name, date, role, system, temperature, pH and the temperature it was measured\n" +
			"at), one column per analyte in its usual form and unit, and total hardness and P-alkalinity\n" +
			"(mg/L as CaCO3; used only to check the analysis). Fill one row per sample; leave a\n" +
			"cell blank when it was not measured and write <0.1 for below the detection limit. Units go in\n" +
			"brackets and may be changed (mg/L, µg/L, mmol/L, meq/L, mol/kg, ppm, mg/L as CaCO3, …).\n" +
			"--list prints every other form a column may take (SiO2 or Si, PO4 or PO4-P, alkalinity or\n" +
			"HCO3 and CO3, …) with the names the reader also accepts; give each component in one form.",
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if list {
				for _, f := range water.ColumnForms() {
					fmt.Fprintf(cmd.OutOrStdout(), "%-30s %s\n", f.Header, strings.Join(f.Aliases, ", "))
				}
				for _, c := range water.CheckColumns() {
					fmt.Fprintf(cmd.OutOrStdout(), "%-30s %s; %s\n", c.Header, strings.Join(c.Aliases, ", "), c.Note)
				}
				return nil
			}
			w := csv.NewWriter(cmd.OutOrStdout())
			w.Write(water.TemplateHeader())
			w.Flush()
			return w.Error()
		},
	}
	cmd.Flags().BoolVar(&list, "list", false, "list every analyte column form and its other accepted names instead")
	return cmd
}
