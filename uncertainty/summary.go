package uncertainty

import (
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"
)

// Interval is the spread of one result over the draws.
type Interval struct {
	// Median is the 50 % quantile; Low and High bound the central interval
	// holding the run's confidence (5 % and 95 % at 90 %), the
	// probabilistically symmetric coverage interval of JCGM 101:2008, 7.7.
	Median, Low, High float64
	// SD is the standard deviation over the draws: the standard
	// uncertainty of the result (JCGM 101:2008, 7.6).
	SD float64
	// N is the number of draws behind the figures.
	N int
}

// Share is the part of a result's variance one input's uncertainty
// explains.
type Share struct {
	Input string
	// Share is the fraction of the explained variance, 0–1.
	Share float64
}

// Sensitivity ranks the inputs by the share of a result's variance each
// explains, from a linear regression of the result on the standardised
// inputs (log concentrations, pH, temperature) over the draws: the
// standardised regression coefficients β, share = β²/Σβ² (Saltelli et al.
// 2008, Global Sensitivity Analysis: The Primer, Wiley, 1.2.5). For inputs
// drawn independently, β² is the fraction of the result's variance the
// input explains.
type Sensitivity struct {
	Shares []Share // largest first; shares below 0.5 % are left out
	// Explained is R² of the fit: the fraction of the variance a linear
	// model in the inputs explains (near 1 for saturation indices).
	Explained float64
}

// Top returns the input that explains most of the variance, or "" when
// none does.
func (s Sensitivity) Top() string {
	if len(s.Shares) == 0 {
		return ""
	}
	return s.Shares[0].Input
}

// minShare is the smallest share a Sensitivity lists.
const minShare = 0.005

// interval summarises the finite values of xs at confidence conf; sorted is
// a scratch copy that is sorted in place and returned.
func interval(xs []float64, conf float64) (Interval, []float64) {
	sorted := make([]float64, 0, len(xs))
	for _, x := range xs {
		if !math.IsNaN(x) {
			sorted = append(sorted, x)
		}
	}
	nan := math.NaN()
	if len(sorted) == 0 {
		return Interval{Median: nan, Low: nan, High: nan, SD: nan}, sorted
	}
	slices.Sort(sorted)
	tail := (1 - conf) / 2
	return Interval{
		Median: stat.Quantile(0.5, stat.LinInterp, sorted, nil),
		Low:    stat.Quantile(tail, stat.LinInterp, sorted, nil),
		High:   stat.Quantile(1-tail, stat.LinInterp, sorted, nil),
		SD:     stat.StdDev(sorted, nil),
		N:      len(sorted),
	}, sorted
}

// above returns the fraction of the finite values of xs above limit.
func above(xs []float64, limit float64) float64 {
	n, k := 0, 0
	for _, x := range xs {
		if math.IsNaN(x) {
			continue
		}
		n++
		if x > limit {
			k++
		}
	}
	if n == 0 {
		return math.NaN()
	}
	return float64(k) / float64(n)
}

// sensitivities fits every output column of s on the standardised inputs.
// Rows where an output is NaN or infinite are left out of that output's
// fit. The outputs defined on every draw (the usual case) share one QR
// factorisation of the design matrix.
func sensitivities(s sample) []Sensitivity {
	nOut := 0
	if len(s.out) > 0 {
		nOut = len(s.out[0])
	}
	res := make([]Sensitivity, nOut)
	var shared *fitter
	for o := range nOut {
		var rows []int
		for i := range s.out {
			if y := s.out[i][o]; !math.IsNaN(y) && !math.IsInf(y, 0) {
				rows = append(rows, i)
			}
		}
		if len(rows) < len(s.out) {
			res[o] = newFitter(s, rows).fit(s, o)
			continue
		}
		if shared == nil {
			shared = newFitter(s, rows)
		}
		res[o] = shared.fit(s, o)
	}
	return res
}

// fitter is the least-squares fit of outputs on the standardised inputs
// over a set of draws: the design matrix (one column per input that
// varies) and its QR factorisation.
type fitter struct {
	rows   []int
	cols   []int // the inputs of the design's columns
	design *mat.Dense
	qr     mat.QR
	ok     bool
}

// newFitter builds the design over rows; it is not ok when there are too
// few rows or no input varies.
func newFitter(s sample, rows []int) *fitter {
	f := &fitter{rows: rows}
	k := len(s.plan.inputs)
	if len(rows) <= k+2 {
		return f
	}
	var data [][]float64
	col := make([]float64, len(rows))
	for j := range k {
		for r, i := range rows {
			col[r] = s.plan.regressor(j, s.draws[i][j])
		}
		mx, sx := stat.MeanStdDev(col, nil)
		if !(sx > 0) {
			continue
		}
		z := make([]float64, len(rows))
		for r := range col {
			z[r] = (col[r] - mx) / sx
		}
		f.cols, data = append(f.cols, j), append(data, z)
	}
	if len(f.cols) == 0 {
		return f
	}
	f.design = mat.NewDense(len(rows), len(f.cols), nil)
	for c, z := range data {
		f.design.SetCol(c, z)
	}
	f.qr.Factorize(f.design)
	f.ok = true
	return f
}

// fit regresses output o on the design.
func (f *fitter) fit(s sample, o int) Sensitivity {
	none := Sensitivity{Explained: math.NaN()}
	if !f.ok {
		return none
	}
	y := make([]float64, len(f.rows))
	for r, i := range f.rows {
		y[r] = s.out[i][o]
	}
	my, sy := stat.MeanStdDev(y, nil)
	if !(sy > 0) {
		return none
	}
	for r := range y {
		y[r] = (y[r] - my) / sy
	}
	var beta, fitted mat.VecDense
	if err := f.qr.SolveVecTo(&beta, false, mat.NewVecDense(len(y), y)); err != nil {
		return none
	}
	fitted.MulVec(f.design, &beta)
	ssRes := 0.0
	for r := range y {
		d := y[r] - fitted.AtVec(r)
		ssRes += d * d
	}
	out := Sensitivity{Explained: 1 - ssRes/float64(len(y)-1)}
	total := 0.0
	for c := range f.cols {
		total += beta.AtVec(c) * beta.AtVec(c)
	}
	for c, j := range f.cols {
		if sh := beta.AtVec(c) * beta.AtVec(c) / total; sh >= minShare {
			out.Shares = append(out.Shares, Share{Input: s.plan.inputs[j].Name, Share: sh})
		}
	}
	slices.SortStableFunc(out.Shares, func(a, b Share) int {
		switch {
		case a.Share > b.Share:
			return -1
		case a.Share < b.Share:
			return 1
		}
		return 0
	})
	return out
}
