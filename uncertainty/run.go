package uncertainty

import (
	"fmt"
	"math"
	"sync"

	"scalerisk/saturation"
	"scalerisk/water"
)

// chunkSize is the number of draws one Speciator takes in turn. Each chunk
// starts from a fresh Speciator warm-started by the central water, so a
// draw's numbers depend on its chunk alone, never on the number of workers.
const chunkSize = 64

// evalFunc computes the outputs of one drawn water into out (NaN where an
// output is not defined for the draw) and a label (the limiting quantity of
// a cycles search; empty otherwise).
type evalFunc func(sp *saturation.Speciator, a water.Analysis, out []float64) (string, error)

// sample is the outcome of a run's draws.
type sample struct {
	plan   plan
	draws  [][]float64 // values drawn, kept draws only
	out    [][]float64 // outputs per kept draw that was computed
	labels []string
	// rejected counts the draws left out by the ion-balance rule, failed
	// those whose computation failed.
	rejected, failed int
	warnings         []string
}

// run draws s.Draws analyses of p, keeps those the ion-balance rule allows
// (see balanceRule), and evaluates each kept draw with eval into nOut
// outputs, on s.Workers goroutines, with Speciators of model (nil: the
// default). warm, when not nil, is evaluated first
// by every chunk's Speciator (the central water: the draws warm-start from
// its solution).
func run(p plan, s Settings, model *saturation.Model, nOut int, warm func(sp *saturation.Speciator), eval evalFunc) sample {
	all := p.draws(s.Draws, s.Seed)
	res := sample{plan: p}
	kept := all
	if !s.KeepAll {
		kept, res.rejected, res.warnings = balanceRule(p, all)
	}
	n := len(kept)
	out := make([][]float64, n)
	flat := make([]float64, n*nOut)
	for i := range out {
		out[i] = flat[i*nOut : (i+1)*nOut : (i+1)*nOut]
	}
	labels := make([]string, n)
	errs := make([]error, n)
	chunks := make(chan int)
	workers := max(1, s.Workers)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for c := range chunks {
				sp := saturation.NewSpeciator(model)
				if warm != nil {
					warm(sp)
				}
				for i := c; i < min(c+chunkSize, n); i++ {
					labels[i], errs[i] = eval(sp, p.apply(kept[i]), out[i])
				}
			}
		}()
	}
	for c := 0; c < n; c += chunkSize {
		chunks <- c
	}
	close(chunks)
	wg.Wait()
	var firstErr error
	for i := range kept {
		if errs[i] != nil {
			res.failed++
			if firstErr == nil {
				firstErr = errs[i]
			}
			continue
		}
		res.draws = append(res.draws, kept[i])
		res.out = append(res.out, out[i])
		res.labels = append(res.labels, labels[i])
	}
	if res.failed > 0 {
		res.warnings = append(res.warnings, fmt.Sprintf("%d of %d draws could not be computed and are left out (the first: %v)",
			res.failed, n, firstErr))
	}
	return res
}

// balanceRule keeps the draws whose ion balance lies within what the
// measured analysis and the Standard Methods 1030 E criterion allow: |draw's
// balance| ≤ max(|measured balance|, the criterion for the draw's anion
// sum), each in the criterion's unit (meq/L below an anion sum of 3 meq/L,
// percent above).
//
// Rejection, not weighting, and why: a draw stands for a water the sample
// might truly be, and a true water is electroneutral — its measured
// imbalance is analytical error and unmeasured ions. A draw further from
// balance than both the measured analysis and the laboratory's own
// acceptance criterion is a water the measurement has already ruled out;
// keeping it would widen the intervals with impossible waters. Rejecting
// keeps every kept draw equally weighted, so the quantiles (gonum
// stat.Quantile) and the sensitivity fit stay unweighted and the number of
// draws behind each figure is simply the number kept, which is reported.
// When the rule would reject more than half the draws it is not applied
// (every draw is kept) and a warning says so: the intervals would
// otherwise rest on the balance more than on the stated uncertainties.
func balanceRule(p plan, all [][]float64) (kept [][]float64, rejected int, warnings []string) {
	q0 := p.central.Quality()
	if math.IsNaN(q0.BalancePercent) {
		return all, 0, nil
	}
	for _, v := range all {
		q := p.apply(v).Quality()
		crit, _ := water.BalanceCriterion(q.Anions)
		value, measured := q.BalancePercent, q0.BalancePercent
		if crit.Unit == "meq/L" {
			value, measured = q.Cations-q.Anions, q0.Cations-q0.Anions
		}
		bound := math.Max(math.Abs(measured), math.Max(math.Abs(crit.Min), math.Abs(crit.Max)))
		if math.Abs(value) <= bound {
			kept = append(kept, v)
		}
	}
	rejected = len(all) - len(kept)
	if rejected > len(all)/2 {
		return all, 0, []string{fmt.Sprintf(
			"the ion-balance rule would leave out %d of %d draws: it is not applied, and the intervals may be wider than the balance allows",
			rejected, len(all))}
	}
	if rejected > 0 {
		warnings = []string{fmt.Sprintf("%d of %d draws left out: their ion balance is beyond both the measured one and the Standard Methods 1030 E criterion",
			rejected, len(all))}
	}
	return kept, rejected, warnings
}
