package reports

import (
	"bufio"
	"cmp"
	"encoding/json"
	"errors"
	"fmt"
	"html/template"
	"io"
	"maps"
	"slices"
	"strings"
	"sync"

	"scalerisk/plan"
	"scalerisk/saturation"
)

// HTMLWriter lays out a report from plans given one at a time, in input
// order: it keeps the summary row of every sample and the laid-out section
// only of the samples that will be shown in full (HTMLOptions.Detail of
// them, those of highest risk), so that its memory is bounded by Detail and
// not by the number of samples. Finish writes the page.
type HTMLWriter struct {
	b      *builder
	head   Report
	count  int
	rows   []summaryEntry
	kept   []keptSection // computed samples, worst first, at most Detail
	failed []keptSection // not computed, in input order, at most Detail
	fails  []failedRow
	times  *timeSeries
	// balances keeps the makeup and circulating waters; their pairs are
	// balanced in Finish.
	balances plan.Balances
	// listInputs collects head.Inputs from the samples added.
	listInputs bool
	closed     bool
	// mu guards full and cut, which MayDetail reads from other
	// goroutines: once Detail sections are kept, cut is the risk of the
	// last of them, and it only rises.
	mu   sync.Mutex
	full bool
	cut  riskKey
}

// summaryEntry is the summary row of a computed sample and its rank.
type summaryEntry struct {
	row   overviewRow
	risk  riskKey
	index int
}

// keptSection is a laid-out section with the options of its charts.
type keptSection struct {
	view    sampleView
	options map[string]json.RawMessage
	risk    riskKey
	index   int
}

// NewHTMLWriter returns a writer of the report headed by r (its Samples are
// ignored; when r.Inputs is empty, the files of the samples added are
// listed); the error is non-nil when an option is out of range.
func NewHTMLWriter(r Report) (*HTMLWriter, error) {
	if err := r.Options.Check(); err != nil {
		return nil, err
	}
	return &HTMLWriter{b: newBuilder(r), head: r, listInputs: len(r.Inputs) == 0, times: newTimeSeries()}, nil
}

// budget is how many sections the report shows; -1 for all.
func (hw *HTMLWriter) budget() int {
	switch d := hw.head.Options.Detail; {
	case d == 0:
		return -1
	case d < 0:
		return 0
	default:
		return d
	}
}

// Add lays out the plan of the next sample.
func (hw *HTMLWriter) Add(p *plan.Sample) error {
	if hw.closed {
		return errors.New("report: Add after Finish")
	}
	index := hw.count
	hw.count++
	if hw.listInputs && p.File != "" && !slices.Contains(hw.head.Inputs, p.File) {
		hw.head.Inputs = append(hw.head.Inputs, p.File)
	}
	b := hw.b
	if !p.BadInput {
		hw.balances.Keep(p.Input, p.Flow)
	}
	if p.Result == nil {
		row := failedRow{Name: p.Name, Where: sampleWhere(p), Error: sampleError(p), index: index}
		if !p.BadInput && hw.budget() != 0 && (hw.budget() < 0 || len(hw.failed) < hw.budget()) {
			b.options = map[string]json.RawMessage{}
			hw.failed = append(hw.failed, keptSection{view: b.failedSection(index, p), options: b.options, index: index})
		}
		hw.fails = append(hw.fails, row)
		return nil
	}
	b.models[activityWords(p.Result.Activity)] = true
	for _, m := range p.Result.Minerals {
		if _, ok := b.shown[m.Name]; !ok {
			b.shown[m.Name] = m
		}
	}
	hw.times.add(p)
	risk := riskOf(p)
	hw.rows = append(hw.rows, summaryEntry{row: b.overviewOf(p), risk: risk, index: index})
	n := hw.budget()
	if n == 0 || (n > 0 && len(hw.kept) == n && risk.compare(hw.kept[n-1].risk) <= 0) {
		return nil // not among the sections shown
	}
	b.options = map[string]json.RawMessage{}
	ks := keptSection{view: b.section(index, p), options: b.options, risk: risk, index: index}
	// Worst first; of equal risk, input order.
	at, _ := slices.BinarySearchFunc(hw.kept, ks, func(x, y keptSection) int {
		if c := y.risk.compare(x.risk); c != 0 {
			return c
		}
		return cmp.Compare(x.index, y.index)
	})
	hw.kept = slices.Insert(hw.kept, at, ks)
	if n > 0 && len(hw.kept) > n {
		hw.kept = hw.kept[:n]
	}
	if n > 0 && len(hw.kept) == n {
		hw.mu.Lock()
		hw.full, hw.cut = true, hw.kept[n-1].risk
		hw.mu.Unlock()
	}
	return nil
}

// MayDetail reports whether the plan p, not yet added, may still get a
// full section: false when no section is shown (Detail < 0) or when Detail
// sections are kept and p's risk is not above the last of them (of equal
// risk the earlier sample wins, and p comes later). The kept risks only
// rise, so a plan rejected once stays rejected. A plan without a result
// may always get one. MayDetail is safe to call from many goroutines while
// Add runs; it is plan.Settings.Detailed for the plans of this report.
func (hw *HTMLWriter) MayDetail(p *plan.Sample) bool {
	n := hw.budget()
	switch {
	case p.Result == nil || n < 0:
		return true
	case n == 0:
		return false
	}
	hw.mu.Lock()
	defer hw.mu.Unlock()
	return !hw.full || riskOf(p).compare(hw.cut) > 0
}

// Finish writes the page to w; no sample can be added after it.
func (hw *HTMLWriter) Finish(w io.Writer) error {
	if hw.closed {
		return errors.New("report: Finish called twice")
	}
	hw.closed = true
	v, err := hw.view()
	if err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	if err := pageTemplate().Execute(bw, v); err != nil {
		return err
	}
	return bw.Flush()
}

// view assembles the page from the rows and sections kept.
func (hw *HTMLWriter) view() (*pageView, error) {
	b, r := hw.b, hw.head
	v := &pageView{
		Title: r.Title, Client: r.Client, Date: r.Date, Inputs: r.Inputs,
		SampleCount: hw.count, ComputedCount: len(hw.rows), Caution: Caution, Cautions: b.cautions(),
		EChartsJS: template.JS(echartsJS), EChartsVersion: EChartsVersion,
		EChartsLicense: echartsLicense, EChartsNotice: strings.TrimSpace(echartsNotice),
	}
	if v.Title == "" {
		v.Title = DefaultReportTitle
	}
	v.Bands = b.bandRows()
	options := map[string]json.RawMessage{}
	anchors := map[int]string{}
	sections := slices.Clone(hw.kept)
	if n := hw.budget(); n < 0 {
		sections = append(sections, hw.failed...)
	} else {
		sections = append(sections, hw.failed[:min(len(hw.failed), n-len(sections))]...)
	}
	for i, ks := range sections {
		ks.view.Number = i + 1
		v.Sections = append(v.Sections, ks.view)
		anchors[ks.index] = ks.view.Anchor
		maps.Copy(options, ks.options)
	}
	rows := slices.Clone(hw.rows)
	slices.SortStableFunc(rows, func(x, y summaryEntry) int { return y.risk.compare(x.risk) })
	for _, e := range rows {
		e.row.Anchor = anchors[e.index]
		if e.row.Anchor == "" {
			v.NotDetailed++
		}
		v.Overview = append(v.Overview, e.row)
	}
	for _, f := range hw.fails {
		f.Anchor = anchors[f.index]
		v.Failed = append(v.Failed, f)
	}
	b.options = options
	v.Time, v.TimeNote = b.timeCharts(hw.times)
	pairs, _ := hw.balances.Pairs()
	v.Balances = balanceViews(pairs)
	v.numberParts(len(v.Sections))
	v.Methods = b.methods()
	v.ChartCount = len(options)
	v.ChartCountText = Plural(len(options), "chart", "charts")
	v.DetailNote = detailNote(len(v.Overview), len(v.Overview)-v.NotDetailed)
	v.LimitingNote = b.limitingNote()
	v.LimitsNote = b.limitsNote()
	v.TimeKey = b.siKey()
	opt, err := json.Marshal(options) // keys sorted: deterministic
	if err != nil {
		return nil, err
	}
	v.ChartOptions = template.JS(opt)
	return v, nil
}

// riskKey ranks a sample by its limiting mineral: its band class (past a
// limit, supersaturated, near equilibrium, none) and, within the class, how
// far past its limit or its saturation index.
type riskKey struct {
	class int
	score float64
}

func riskOf(p *plan.Sample) riskKey {
	if len(p.Ranking) == 0 {
		return riskKey{0, 0}
	}
	m := p.Ranking[0]
	switch m.Band {
	case saturation.BeyondReach:
		return riskKey{3, -m.Margin}
	case saturation.WithinReach, saturation.Supersaturated:
		return riskKey{2, m.SI}
	}
	return riskKey{1, m.SI}
}

func (r riskKey) compare(o riskKey) int {
	if c := cmp.Compare(r.class, o.class); c != 0 {
		return c
	}
	return cmp.Compare(r.score, o.score)
}

// detailNote says which samples have a full section: all of them, or the
// shown of highest risk.
func detailNote(computed, shown int) string {
	switch {
	case computed == 0:
		return "No sample could be computed."
	case shown == computed:
		return "The table lists the samples worst first; each has a full section below."
	case shown == 0:
		return "The table lists the samples worst first; no sample has a full section in this report."
	}
	if shown == 1 {
		return fmt.Sprintf("The table lists the samples worst first. A full section follows for the sample of highest risk; "+
			"the other %s %s in this table only.", Plural(computed-shown, "sample", "samples"), isAre(computed-shown))
	}
	return fmt.Sprintf("The table lists the samples worst first. Full sections follow for the %s of highest risk; "+
		"the other %s %s in this table only.", Plural(shown, "sample", "samples"), Plural(computed-shown, "sample", "samples"),
		isAre(computed-shown))
}
