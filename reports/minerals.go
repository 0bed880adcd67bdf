package reports

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"text/tabwriter"

	"scalerisk/saturation"
)

// The headline minerals of the tabular outputs, in one place. They differ
// on purpose and are part of the output contract (README):
//
//   - cyclesMinerals: the si_ columns of the cycles CSV, the scales a
//     cooling tower is run against (calcium carbonate, calcium sulfate,
//     the sulfates of barium and strontium, silica);
//   - sweepMinerals: the columns of sweep's text table, which adds
//     anhydrite (the hot side of calcium sulfate) and fluorite, in the order
//     of the sweep table.
//
// The report charts its own list, plan.ChartOrder(). JSON outputs carry
// every mineral.
var (
	cyclesMinerals = []string{"calcite", "gypsum", "barite", "celestite", "silica_amorphous"}
	sweepMinerals  = []string{"calcite", "gypsum", "anhydrite", "barite", "celestite", "fluorite", "silica_amorphous"}
)

// MineralJSON is one mineral of the table in the JSON output of minerals.
type MineralJSON struct {
	Name                string  `json:"name"`
	Formula             string  `json:"formula"`
	Reaction            string  `json:"reaction"`
	LogK25              float64 `json:"log_k_25"`
	TemperatureFunction string  `json:"temperature_function"`
	TMinC               float64 `json:"t_min_c"`
	TMaxC               float64 `json:"t_max_c"`
	Source              string  `json:"source"`
}

// WriteMinerals lists the minerals of table t with formula, log K at 25 °C,
// temperature function, range and source.
func WriteMinerals(w io.Writer, f Format, t *saturation.Table) error {
	var ms []MineralJSON
	for _, e := range t.Minerals() {
		ms = append(ms, MineralJSON{Name: e.Name, Formula: e.Formula, Reaction: e.Equation,
			LogK25: dec(e.LogK(25), 3), TemperatureFunction: e.TemperatureFunction(),
			TMinC: e.TMin, TMaxC: e.TMax, Source: e.Source})
	}
	switch f {
	case JSON:
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		enc.SetEscapeHTML(false)
		return enc.Encode(struct {
			Minerals []MineralJSON `json:"minerals"`
		}{ms})
	case CSV:
		cw := csv.NewWriter(w)
		cw.Write([]string{"name", "formula", "reaction", "log_k_25", "temperature_function", "t_min_c", "t_max_c", "source"})
		for _, m := range ms {
			// The rows of a --thermo file are the user's: no cell runs
			// as a spreadsheet formula.
			cw.Write(safeCSVRows([][]string{{m.Name, m.Formula, m.Reaction, strconv.FormatFloat(m.LogK25, 'f', 3, 64),
				m.TemperatureFunction, strconv.FormatFloat(m.TMinC, 'g', -1, 64), strconv.FormatFloat(m.TMaxC, 'g', -1, 64), m.Source}})[0])
		}
		cw.Flush()
		return cw.Error()
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "mineral\tformula\tlog K 25 °C\tT function\trange °C\tsource")
	for _, m := range ms {
		fmt.Fprintf(tw, "%s\t%s\t%.3f\t%s\t%g–%g\t%s\n", SafeText(m.Name), SafeText(m.Formula), m.LogK25, m.TemperatureFunction, m.TMinC, m.TMaxC, SafeText(m.Source))
	}
	return tw.Flush()
}
