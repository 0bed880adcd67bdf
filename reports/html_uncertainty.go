package reports

import (
	"fmt"
	"math"
	"strings"

	"github.com/go-echarts/go-echarts/v2/charts"
	"github.com/go-echarts/go-echarts/v2/opts"

	"scalerisk/plan"
	"scalerisk/uncertainty"
)

// uncertaintyView is the "How sure are these answers" part of a sample's
// section: the run in words, the decisions at their confidence, the
// measurement that would narrow them, and what the figures mean.
type uncertaintyView struct {
	Run       string
	Answers   []string
	Narrowing string
	Inputs    string
	Meaning   string
	Notes     []string
}

// inputWords are the client's words for the inputs of a run.
var inputWords = map[string]string{
	"Ca": "calcium", "Mg": "magnesium", "Na": "sodium", "K": "potassium", "Ba": "barium", "Sr": "strontium",
	"Fe": "iron", "Mn": "manganese", "Cl": "chloride", "SO4": "sulfate", "NO3": "nitrate", "F": "fluoride",
	"SiO2": "silica", "PO4": "phosphate", "B": "boron", "DIC": "inorganic carbon", "alkalinity": "alkalinity",
	"pH": "pH", "temperature": "temperature",
}

// inputWord names input in the client's words.
func inputWord(input string) string {
	if w, ok := inputWords[input]; ok {
		return w
	}
	return input
}

// uncertaintyOf fills the intervals of the saturation-index table of sv
// and returns the uncertainty part of the section, with the interval chart
// of the sample added to sv.Charts; nil when the plan has no draws.
func (b *builder) uncertaintyOf(sv *sampleView, id string, s *plan.Sample) *uncertaintyView {
	u := s.Uncertainty
	if u == nil {
		if err := s.PartErr("uncertainty"); err != nil {
			return &uncertaintyView{Run: "The spread of the answers could not be computed: " + err.Error() + "."}
		}
		return nil
	}
	v := &uncertaintyView{Meaning: "These figures cover the uncertainty of the laboratory analysis only. " +
		"A probability of supersaturation is the share of the waters the analysis could describe that are " +
		"supersaturated; it is not the chance that scale forms, which depends on kinetics, on the inhibitor and " +
		"on the surfaces. The uncertainty of the thermodynamic constants and changes to the sample before " +
		"analysis are not included."}
	if a := u.Assess; a != nil {
		b.fillIntervals(sv, a)
		v.Run = runWords(a.Run)
		v.Inputs = inputsWords(a.Run)
		if in, doubt := a.Narrowing(); in != "" {
			if len(doubt) > 0 {
				var names []string
				for _, m := range doubt {
					names = append(names, mineralLabel(m))
				}
				v.Narrowing = fmt.Sprintf("A more precise %s measurement would narrow most the verdicts still in doubt (%s).",
					inputWord(in), strings.Join(names, ", "))
			} else {
				v.Narrowing = fmt.Sprintf("No verdict on supersaturation or on a limit is in doubt; the %s measurement carries most of the spread.", inputWord(in))
			}
		}
		for _, w := range a.Warnings {
			// The draws left out by the ion balance are said in Run.
			if a.Rejected == 0 || !strings.Contains(w, "draws left out") {
				v.Notes = append(v.Notes, w)
			}
		}
		if cv, ok := b.intervalChart(id, s, a); ok {
			sv.Charts = append(sv.Charts, cv)
		}
	}
	if d := u.Dose; d != nil && s.DoseAnswer != nil {
		v.Answers = append(v.Answers, doseWords(d, s))
	}
	if c := u.Cycles; c != nil {
		v.Answers = append(v.Answers, cyclesWords(c))
	}
	if err := s.PartErr("uncertainty"); err != nil {
		v.Notes = append(v.Notes, "Part of the spread could not be computed: "+err.Error()+".")
	}
	return v
}

// fillIntervals adds the interval and the probability of supersaturation
// to the rows of the saturation-index table.
func (b *builder) fillIntervals(sv *sampleView, a *uncertainty.Summary) {
	sv.Intervals = true
	sv.IntervalHead = intervalHead(a.Confidence)
	for i := range sv.Minerals {
		row := &sv.Minerals[i]
		row.Interval, row.PAbove = "—", "—"
		if q, ok := a.Quantity(row.key); ok && q.N > 0 {
			row.Interval = signed(q.Low, 2) + " to " + signed(q.High, 2)
			row.PAbove = percentWords(q.PPositive)
		}
	}
}

// intervalHead is the header of the interval column: "5–95 % interval".
func intervalHead(conf float64) string {
	return strings.TrimSuffix(intervalWords(conf), " %") + " % range"
}

// percentWords writes a probability as a whole percentage, with "<1 %"
// and ">99 %" at the ends.
func percentWords(p float64) string {
	switch {
	case !finite(p):
		return "—"
	case p > 0 && p < 0.01:
		return "<1 %"
	case p < 1 && p > 0.99:
		return ">99 %"
	}
	return fmt.Sprintf("%.0f %%", 100*p)
}

func runWords(r uncertainty.Run) string {
	s := fmt.Sprintf("The analysis was recomputed %d times, each time with every measured value drawn within its "+
		"stated uncertainty (random seed %d)", r.Draws, r.Seed)
	if r.Rejected > 0 {
		s += fmt.Sprintf("; %d draws whose ion balance the measurement rules out were left out", r.Rejected)
	}
	return s + fmt.Sprintf(". Ranges hold the middle %.0f %% of the results.", 100*r.Confidence)
}

func inputsWords(r uncertainty.Run) string {
	var parts []string
	for _, in := range r.Inputs {
		switch {
		case in.Distribution == uncertainty.Uniform:
			parts = append(parts, inputWord(in.Name)+" between zero and its detection limit")
		case in.Unit == uncertainty.Relative:
			parts = append(parts, fmt.Sprintf("%s ±%s %%", inputWord(in.Name), trimNum(100*in.U)))
		case in.Unit == uncertainty.PHUnits:
			parts = append(parts, fmt.Sprintf("pH ±%s", trimNum(in.U)))
		default:
			parts = append(parts, fmt.Sprintf("temperature ±%s °C", trimNum(in.U)))
		}
	}
	return "Standard uncertainties used: " + strings.Join(parts, ", ") + "."
}

func trimNum(x float64) string { return fmtF(sig(x, 3)) }

func doseWords(d *uncertainty.DoseSummary, s *plan.Sample) string {
	r := s.DoseAnswer
	if math.IsInf(d.AtConfidence, 1) {
		return fmt.Sprintf("Dose: no dose below 10 g/L reaches the target in %.0f %% of the waters the analysis could describe.",
			100*d.Confidence)
	}
	return fmt.Sprintf("Dose: with %.0f %% confidence, %s mg/L of %s brings %s to %s; the %s mg/L found for the analysis as reported reaches it in %s of the draws. A more precise %s measurement would narrow this most.",
		100*d.Confidence, sigText(d.AtConfidence, 3), r.Reagent.Label, targetWords(r.Target), fmtF(r.Target.Value), sigText(d.Central, 3),
		percentWords(d.PCentral), inputWord(d.Sensitivity.Top()))
}

func cyclesWords(c *uncertainty.CyclesSummary) string {
	if c.AtConfidence <= 1 {
		return fmt.Sprintf("Cycles of concentration: with %.0f %% confidence no concentration keeps every limit; the makeup needs treatment first.",
			100*c.Confidence)
	}
	return fmt.Sprintf("Cycles of concentration: with %.0f %% confidence every limit holds up to %s cycles; the %s cycles found for the analysis as reported hold in %s of the draws. A more precise %s measurement would narrow this most.",
		100*c.Confidence, num(c.AtConfidence, 2), num(c.Central, 2), percentWords(c.PCentral), inputWord(c.Sensitivity.Top()))
}

// intervalChart draws the saturation index of each charted mineral with
// its interval: a box from the low to the high end with the median, and
// the value of the analysis as reported as a dot.
func (b *builder) intervalChart(id string, s *plan.Sample, a *uncertainty.Summary) (chartView, bool) {
	var names []string
	var boxes [][]float64
	var dots []float64
	for _, m := range s.Minerals {
		q, ok := a.Quantity(m)
		if !ok || q.N == 0 || !finite(q.Low) || !finite(q.High) || !finite(q.Median) || !finite(q.Central) {
			continue
		}
		names = append(names, mineralLabel(m))
		boxes = append(boxes, []float64{dec(q.Low, 3), dec(q.Low, 3), dec(q.Median, 3), dec(q.High, 3), dec(q.High, 3)})
		dots = append(dots, dec(q.Central, 3))
	}
	if len(names) == 0 {
		return chartView{}, false
	}
	height := 70 + 30*len(names)
	box := charts.NewBoxPlot()
	box.SetGlobalOptions(staticSVG(id, height)...)
	box.SetGlobalOptions(
		charts.WithGridOpts(opts.Grid{Left: "150px", Right: "32px", Top: "12px", Bottom: "58px"}),
		charts.WithXAxisOpts(opts.XAxis{Type: "value", Name: "saturation index", NameLocation: "middle", NameGap: 28}),
	)
	box.Validate()
	option := box.JSON()
	// Horizontal boxes: the minerals on the category (y) axis. The axis and
	// the series are written here: go-echarts' box plot has no field for
	// the dots and the equilibrium line beside it.
	option["yAxis"] = []any{map[string]any{"type": "category", "data": names, "inverse": true, "axisLine": map[string]any{"onZero": false},
		"axisLabel": map[string]any{"interval": 0}}}
	option["series"] = []any{
		map[string]any{"type": "boxplot", "name": "range", "data": boxes, "boxWidth": []any{6, 14},
			"itemStyle": map[string]any{"color": "#e9f2f9", "borderColor": "#0072B2"}},
		map[string]any{"type": "scatter", "name": "as reported", "data": dotsData(dots),
			"itemStyle": map[string]any{"color": "#D55E00"}, "symbolSize": 8},
		map[string]any{"type": "line", "name": "equilibrium", "data": []any{}, "markLine": map[string]any{
			"silent": true, "symbol": "none", "label": map[string]any{"show": false},
			"lineStyle": map[string]any{"color": "#555555", "type": "dashed"}, "data": []any{map[string]any{"xAxis": 0}}}},
	}
	option["legend"] = map[string]any{"show": true, "bottom": 0, "itemWidth": 14, "itemHeight": 10}
	option["tooltip"] = map[string]any{"show": false}
	option["textStyle"] = map[string]any{"fontFamily": fontFamily}
	if err := b.addChart(id, option); err != nil {
		return chartView{}, false
	}
	return chartView{ID: id, Title: "Saturation index with its range", Height: height,
		Caption: fmt.Sprintf("Each box spans the middle %.0f %% of the saturation indices over the draws of the analysis, "+
			"with the median as its line; the dot is the value of the analysis as reported; the dashed line is equilibrium.", 100*a.Confidence)}, true
}

// dotsData places the dots on the category axis: [SI, row].
func dotsData(dots []float64) [][]any {
	out := make([][]any, len(dots))
	for i, d := range dots {
		out[i] = []any{d, i}
	}
	return out
}
