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
	// Flow is the flow of the water, m³/h, that reports use to give scale
	// in kg/day; 0 when none is given. The assessment itself leaves it 0:
	// the caller sets it.
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
// order, with one Speciator (see AssessRecord), and adds the classic
// indices and the precipitation potential. A bad record comes out as an
// Assessment carrying its error; the others are still computed.
func AssessRecords(file string, records []water.Record, opt Options) []Assessment {
	sp := NewSpeciator(opt.Model)
	out := make([]Assessment, 0, len(records))
	for _, rec := range records {
		out = append(out, sp.AssessRecord(file, rec, opt))
	}
	return out
}

// AssessRecord assesses one record of file: the quality checks, the
// speciation, the classic indices and the precipitation potential; a bad
// record comes out carrying its error (BadInput set). Each record starts
// cold: the answer does not depend on the waters this Speciator solved
// before, so any number of Speciators sharing out the records of a file
// give the same answers as one.
func (sp *Speciator) AssessRecord(file string, rec water.Record, opt Options) Assessment {
	as := Assessment{Name: rec.Name, File: file, Line: rec.Line, Err: rec.Err}
	if rec.Err != nil {
		as.BadInput = true
		return as
	}
	sp.coldStart()
	sp.assess(&as, rec.Analysis, opt)
	return as
}

// coldStart forgets the previous solution and carbon fix, so that the next
// speciation starts from the cold guess.
func (sp *Speciator) coldStart() {
	sp.fixCached = false
	if sp.solver != nil {
		sp.solver.hasSol = false
	}
	if sp.pitzer != nil {
		sp.pitzer.hasSol = false
	}
}

// AssessAnalysis assesses one water as AssessRecords does a record.
func AssessAnalysis(a water.Analysis, opt Options) Assessment {
	as := Assessment{Name: a.Name}
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
	fixed, err := fixAll(waters, opt)
	if err != nil {
		return water.Analysis{}, err
	}
	return water.Blend(fixed, fractions)
}

// fixAll fixes the carbonate system of each water (see Speciator.Fix),
// each cold, and returns the fixed waters in order.
func fixAll(waters []water.Analysis, opt Options) ([]water.Analysis, error) {
	fixed := make([]water.Analysis, len(waters))
	for i, w := range waters {
		f, _, err := NewSpeciator(opt.Model).Fix(w, opt)
		if err != nil {
			return nil, err
		}
		fixed[i] = f
	}
	return fixed, nil
}

func isNaNIndices(ix Indices) bool {
	return ix.LSI != ix.LSI && ix.LarsonSkold != ix.LarsonSkold
}
