package saturation

import "scalerisk/water"

// Assessment is everything computed for one sample of a file: the analysis
// as read, its data-quality checks and its equilibrium state, or the error
// that stopped it.
type Assessment struct {
	Name    string
	File    string
	Line    int
	Input   water.Analysis // as read; valid when the input was good
	Quality water.Quality
	Result  *Result // nil when Err != nil
	Err     error
	// BadInput reports that Err is a fault of the input (a *water.InputError)
	// rather than a failure of the computation.
	BadInput bool
}

// AssessRecords speciates every good record of a file under opt, in file
// order, with one warm-started Speciator. A bad record comes out as an
// Assessment carrying its error; the others are still computed.
func AssessRecords(file string, records []water.Record, opt Options) []Assessment {
	sp := NewSpeciator(opt.Model)
	out := make([]Assessment, 0, len(records))
	for _, rec := range records {
		as := Assessment{Name: rec.Name, File: file, Line: rec.Line, Err: rec.Err}
		if rec.Err != nil {
			as.BadInput = true
			out = append(out, as)
			continue
		}
		as.Input = rec.Analysis
		as.Quality = rec.Analysis.Quality()
		as.Result, as.Err = sp.Speciate(rec.Analysis, opt)
		out = append(out, as)
	}
	return out
}
