package saturation

import (
	"fmt"
	"math"
	"strings"

	"scalerisk/water"
)

// BlendResult is the answer of JudgeBlend: a blend of two waters judged
// against a limit profile at the bulk and at the skin temperature, and the
// share of the first water that keeps every limit at both.
type BlendResult struct {
	Profile LimitProfile
	// Fraction is the share of the first water in the blend judged, 0–1
	// by volume; Water is that blend (see BlendWaters) and Point its
	// verdict: its result at the bulk and at the skin, the larger excess
	// over a limit and the temperature that governs it.
	Fraction float64
	Water    water.Analysis
	Point    BlendPoint
	// Limits are the blend's limits at Fraction, each measured at the bulk
	// and at the skin and its margin taken at the worse (as Margin does
	// for a recirculating water).
	Limits []LimitMargin
	// Share is the safe share of the first water (see SafeShare).
	Share SafeShare
}

// BlendPoint is a blend at one share of the first water, judged at the
// bulk temperature and, with a skin, at the skin temperature (bulk pH
// held, see Options.Skin).
type BlendPoint struct {
	Fraction float64 // share of the first water, 0–1 by volume
	// Result and Indices are the blend at its bulk temperature; Skin and
	// SkinIndices the blend heated to the skin (nil without a skin).
	Result      *Result
	Indices     Indices
	Skin        *Result
	SkinIndices Indices
	// Excess is the largest value − limit over the profile (in the limit's
	// own unit; above 0 a limit is passed) at the temperature that governs,
	// Governing that temperature, °C: the skin when its excess is the
	// larger, else the bulk; Limiting is its quantity when a limit is
	// passed ("" within every limit). Excess is −Inf when no limit of the
	// profile applies to the water.
	Excess    float64
	Limiting  string
	Governing float64
	Err       error
}

// Within reports whether every limit holds at the bulk and at the skin.
func (p BlendPoint) Within() bool { return p.Err == nil && !(p.Excess > 0) }

// SafeShare is how much of one water a blend of two can take with every
// limit of the profile held at the bulk and at the skin temperature.
type SafeShare struct {
	// Fraction bounds the share of the first water, 0–1 by volume: the
	// most of it the blend can take, or, with AtLeast, the least (when
	// the second water alone is past a limit and the first alone is not).
	// It is NaN when neither water alone holds every limit; Exceeded then
	// names what the second water alone passes.
	Fraction float64
	AtLeast  bool
	// Limiting is the quantity that reaches its limit at Fraction (empty
	// when no limit is reached over the whole range: Fraction is then 1,
	// or 0 with AtLeast).
	Limiting string
	Exceeded []string
	// Judged says at which temperatures the limits were judged and which
	// governs Fraction; its AtBulk and AtSkin are the bound (a share of
	// the first water) judged at each temperature alone, NaN with
	// Fraction. The bulk temperature is the blend's at Fraction (at the
	// water the search starts from when Fraction is NaN).
	Judged Judgement
	// Points are the blends of the search's grid, by share of the first
	// water from 0 to 1, each judged at both temperatures.
	Points   []BlendPoint
	Warnings []string
}

// blendStep is the grid step of the safe-share search, in share of the
// first water; the crossing is refined between grid points to 1e-4.
const blendStep = 0.05

// JudgeBlend mixes water a with water b by volume, fraction being a's
// share (see BlendWaters: from totals, re-speciated under opt), and judges
// the blend against profile at its bulk temperature (the volume-weighted
// temperature of the two, or opt's) and, with opt.Skin above the warmer
// bulk, at the skin temperature, bulk pH held (see heat): the classic skin
// index, as MaxCycles and DoseToTarget judge. The stricter of the two
// governs. It also searches the share of a that keeps every limit at both
// temperatures (see SafeShare): on a grid of 0.05 from the water that
// holds the limits alone (b, else a), refined by Brent's method. Calcite
// solubility falls as temperature rises, so for a hard, alkaline water the
// skin usually governs and allows less of it in the blend.
//
// The error is non-nil when a water cannot be fixed or the blend at
// fraction cannot be computed; a failure along the search ends it and is
// named in Share.Warnings.
func JudgeBlend(a, b water.Analysis, fraction float64, profile LimitProfile, opt Options) (*BlendResult, error) {
	if !(fraction >= 0 && fraction <= 1) {
		return nil, fmt.Errorf("blend fraction %g: want a share from 0 to 1", fraction)
	}
	fixed, err := fixAll([]water.Analysis{a, b}, opt)
	if err != nil {
		return nil, err
	}
	bp := &blendProblem{sp: NewSpeciator(opt.Model), fixed: fixed, profile: profile, opt: opt}
	bp.skin = skinOf(math.Max(bp.bulkAt(0), bp.bulkAt(1)), opt)
	res := &BlendResult{Profile: profile, Fraction: fraction}
	// The requested blend first, under the options as given: the search
	// may pin the activity model for its grid (gridPoints).
	res.Point = bp.judged(bp.eval(fraction), fraction)
	if res.Point.Err != nil {
		return nil, res.Point.Err
	}
	res.Share = bp.search()
	res.Water = res.Point.Result.Analysis
	res.Limits = limitMargins(profile, res.Point.Result, res.Point.Indices, res.Point.Skin, res.Point.SkinIndices, bp.skin)
	return res, nil
}

// blendProblem is one JudgeBlend: the two fixed waters, the profile, the
// options (whose activity model the grid may pin, see gridPoints), the
// skin temperature (NaN when judged at the bulk only) and the direction
// of the search: swap when the axis is the share of the second water.
type blendProblem struct {
	sp      *Speciator
	fixed   []water.Analysis
	profile LimitProfile
	opt     Options
	skin    float64
	swap    bool
}

// bulkAt is the bulk temperature of the blend with share f of the first
// water, °C: opt's, or the volume-weighted one (as water.Blend mixes).
func (bp *blendProblem) bulkAt(f float64) float64 {
	if bp.opt.AtTemperature {
		return bp.opt.Temperature
	}
	return f*bp.fixed[0].Temperature + (1-f)*bp.fixed[1].Temperature
}

// fraction turns a value of the search axis into the share of the first
// water.
func (bp *blendProblem) fraction(axis float64) float64 {
	if bp.swap {
		return 1 - axis
	}
	return axis
}

// eval is the blend at share f of the first water, speciated at the bulk
// and, with a skin temperature, heated to it. The point's Cycles holds f;
// a failure is kept in its Err.
func (bp *blendProblem) eval(f float64) CyclePoint {
	pt := CyclePoint{Cycles: f}
	w, err := water.Blend(bp.fixed, []float64{f, 1 - f})
	if err != nil {
		pt.Err = err
		return pt
	}
	if pt.Result, pt.Err = bp.sp.Speciate(w, bp.opt); pt.Err != nil {
		return pt
	}
	pt.Indices, _ = bp.sp.ClassicIndicesNoCCPP(pt.Result)
	if !math.IsNaN(bp.skin) {
		pt.Skin, pt.SkinIndices, pt.Err = bp.sp.heat(pt.Result, bp.skin, bp.opt)
	}
	return pt
}

// evalAxis is eval at a value of the search axis, the point's Cycles
// holding that value (as judgeCycles walks it).
func (bp *blendProblem) evalAxis(axis float64) CyclePoint {
	pt := bp.eval(bp.fraction(axis))
	pt.Cycles = axis
	return pt
}

// judged is the verdict of point pt, the blend at share f of the first
// water: the larger excess of the bulk and the skin, and which governs.
func (bp *blendProblem) judged(pt CyclePoint, f float64) BlendPoint {
	p := BlendPoint{Fraction: f, Result: pt.Result, Indices: pt.Indices, Skin: pt.Skin, SkinIndices: pt.SkinIndices,
		Excess: math.Inf(-1), Err: pt.Err}
	if pt.Err != nil {
		return p
	}
	p.Excess, p.Limiting, _ = excessOf(bp.profile, pt.Result, pt.Indices)
	p.Governing = pt.Result.Temperature
	if pt.Skin != nil {
		if e, which, _ := excessOf(bp.profile, pt.Skin, pt.SkinIndices); e > p.Excess {
			p.Excess, p.Limiting, p.Governing = e, which, bp.skin
		}
	}
	if !(p.Excess > 0) {
		p.Limiting = ""
	}
	return p
}

// Judgement is the judgement of one blend point: its bulk and skin
// temperatures and the one that governs (no per-limit values).
func (p BlendPoint) Judgement() Judgement {
	j := Judgement{Bulk: p.Result.Temperature, Skin: math.NaN(), AtBulk: math.NaN(), AtSkin: math.NaN(), Governing: p.Governing}
	if p.Skin != nil {
		j.Skin = p.Skin.Temperature
	}
	return j
}

// search finds the safe share of the first water. The axis runs from the
// water that holds every limit alone at both temperatures: the share of
// the first water from the second alone, or (swap) the share of the
// second from the first alone. judgeAtBoth walks it at the bulk and at
// the skin; the lower bound on the axis governs.
func (bp *blendProblem) search() SafeShare {
	ends := [2]BlendPoint{bp.judged(bp.eval(0), 0), bp.judged(bp.eval(1), 1)}
	bp.swap = !ends[0].Within() && ends[1].Within()
	var values []float64
	for k := 0; k <= int(math.Round(1/blendStep)); k++ {
		values = append(values, float64(k)*blendStep)
	}
	axis := gridPoints(values, bp.evalAxis, &bp.opt)
	share := SafeShare{AtLeast: bp.swap, Judged: Judgement{Skin: bp.skin, AtSkin: math.NaN()}}
	if first := axis[0]; first.Err != nil {
		share.Fraction = math.NaN()
		share.Warnings = append(share.Warnings, fmt.Sprintf("the %s alone could not be computed: %v", bp.startWords(), first.Err))
		return share
	}
	pick := judgeAtBoth(axis, bp.profile, bp.evalAxis, bp.skin, &share.Judged)
	share.Fraction, share.Limiting, share.Exceeded = bp.fraction(pick.max), pick.limiting, pick.exceeded
	share.Judged.AtBulk = bp.fraction(share.Judged.AtBulk)
	if !math.IsNaN(share.Judged.AtSkin) {
		share.Judged.AtSkin = bp.fraction(share.Judged.AtSkin)
	}
	share.Judged.Bulk = bp.bulkAt(bp.fraction(pick.max))
	if !share.Judged.SkinGoverns() {
		share.Judged.Governing = share.Judged.Bulk
	}
	share.Warnings = append(share.Warnings, pick.warnings...)
	if len(pick.exceeded) > 0 {
		share.Fraction, share.Judged.AtBulk, share.Judged.AtSkin = math.NaN(), math.NaN(), math.NaN()
		share.Warnings = append(share.Warnings, fmt.Sprintf("neither water alone holds every limit of the %s profile (the %s alone passes %s): no safe share was searched",
			bp.profile.Name, bp.startWords(), strings.Join(pick.exceeded, ", ")))
	}
	for _, pt := range axis {
		share.Points = append(share.Points, bp.judged(pt, bp.fraction(pt.Cycles)))
	}
	if bp.swap {
		for i, j := 0, len(share.Points)-1; i < j; i, j = i+1, j-1 {
			share.Points[i], share.Points[j] = share.Points[j], share.Points[i]
		}
	}
	return share
}

// startWords names the water the search starts from.
func (bp *blendProblem) startWords() string {
	if bp.swap {
		return "first water"
	}
	return "second water"
}
