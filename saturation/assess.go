package saturation

import (
	"errors"

	"scalerisk/water"
)

// Assessment is everything computed for one sample of a file: the analysis
// as read, its data-quality checks, its equilibrium state with the classic
// indices and the scale that could form, or the error that stopped it.
type Assessment struct {
	Name    string
	File    string
	Line    int
	Input   water.Analysis // as read; valid when the input was good
	Quality water.Quality
	Result  *Result // nil when Err != nil
	// Indices are the classic indices at the result's state; nil when the
	// water lacks calcium or alkalinity, or the speciation failed.
	Indices *Indices
	// Precipitation lists the supersaturated minerals that form readily,
	// with the amount that could precipitate alone and together.
	Precipitation []Precipitation
	// Flow is the flow of the water, m³/h, from Options.Flow (0 when none).
	Flow float64
	// Warnings are notes of the indices and precipitation calculations
	// (the speciation's own are in Result.Warnings).
	Warnings []string
	Err      error
	// BadInput reports that Err is a fault of the input (a *water.InputError)
	// rather than a failure of the computation.
	BadInput bool
}

// AssessRecords speciates every good record of a file under opt, in file
// order, with one warm-started Speciator, and adds the classic indices and
// the precipitation potential. A bad record comes out as an Assessment
// carrying its error; the others are still computed.
func AssessRecords(file string, records []water.Record, opt Options) []Assessment {
	sp := NewSpeciator(opt.Model)
	out := make([]Assessment, 0, len(records))
	for _, rec := range records {
		as := Assessment{Name: rec.Name, File: file, Line: rec.Line, Err: rec.Err, Flow: opt.Flow}
		if rec.Err != nil {
			as.BadInput = true
			out = append(out, as)
			continue
		}
		sp.assess(&as, rec.Analysis, opt)
		out = append(out, as)
	}
	return out
}

// AssessAnalysis assesses one water as AssessRecords does a record.
func AssessAnalysis(a water.Analysis, opt Options) Assessment {
	as := Assessment{Name: a.Name, Flow: opt.Flow}
	NewSpeciator(opt.Model).assess(&as, a, opt)
	return as
}

// assess fills as with the quality, equilibrium, indices and precipitation
// of water a.
func (sp *Speciator) assess(as *Assessment, a water.Analysis, opt Options) {
	as.Input = a
	as.Quality = a.Quality()
	as.Result, as.Err = sp.Speciate(a, opt)
	if as.Err != nil {
		as.BadInput = errors.Is(as.Err, ErrInconsistent)
		return
	}
	ix, w := sp.ClassicIndices(as.Result, opt)
	if len(w) == 0 || !isNaNIndices(ix) {
		as.Indices = &ix
	}
	as.Warnings = append(as.Warnings, w...)
	ps, w2 := sp.PrecipitationPotential(as.Result, opt)
	as.Precipitation = ps
	as.Warnings = append(as.Warnings, w2...)
}

// BlendWaters fixes the carbonate system of each water (see Speciator.Fix)
// and mixes them by volume fractions (water.Blend): the blend is computed
// from totals, to be re-speciated, never by averaging indices.
func BlendWaters(waters []water.Analysis, fractions []float64, opt Options) (water.Analysis, error) {
	fixed := make([]water.Analysis, len(waters))
	for i, w := range waters {
		f, _, err := NewSpeciator(opt.Model).Fix(w, opt)
		if err != nil {
			return water.Analysis{}, err
		}
		fixed[i] = f
	}
	return water.Blend(fixed, fractions)
}

func isNaNIndices(ix Indices) bool {
	return ix.LSI != ix.LSI && ix.LarsonSkold != ix.LarsonSkold
}
