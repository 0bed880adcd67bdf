package saturation

import (
	"errors"
	"fmt"
	"math"

	"scalerisk/water"
)

// DefaultPolarisation is the concentration-polarisation factor β of a
// reverse-osmosis element: the membrane-surface concentration over the
// bulk concentrate's. 1.2 is the cautious end of the 1.1–1.2 usual for
// spiral-wound elements (common practice, practice-2.md; ASTM D4582's
// worked problem uses 1.08, practice.md §4.2).
const DefaultPolarisation = 1.2

// MaxRecoverySearch is the highest recovery the searches try: 0.95.
const MaxRecoverySearch = 0.95

// Membrane is a reverse-osmosis stage as the trade reckons it: every ion
// rejected (the permeate taken as pure water), CO2 passing the membrane.
type Membrane struct {
	// Polarisation is β (DefaultPolarisation when 0).
	Polarisation float64
}

func (m Membrane) beta() float64 {
	if m.Polarisation == 0 {
		return DefaultPolarisation
	}
	return m.Polarisation
}

// ConcentrationFactor is 1/(1 − R), the concentrate's concentration over
// the feed's at recovery R (0 ≤ R < 1) with every ion rejected (ASTM D3739;
// practice.md §4.2).
func ConcentrationFactor(r float64) float64 { return 1 / (1 - r) }

// concentrate returns the water at the membrane surface of the last
// element at concentration factor f of the fixed feed base (see Fix), whose
// free CO2 (CO2⁰, mol/kg of water) is co2: every component and the
// alkalinity times β·f; inorganic carbon β·f·(C_T − CO2) + CO2, since CO2
// passes the membrane and stays at its feed level on both sides while
// bicarbonate and carbonate are rejected (common practice, practice-2.md:
// the concentrate's pH rises against the feed's). Polarisation is not
// applied to CO2, which does not accumulate at the surface.
func (m Membrane) concentrate(base water.Analysis, co2, f float64) (water.Analysis, error) {
	n := m.beta() * f
	w, err := base.Concentrate(n)
	if err != nil {
		return w, err
	}
	w.Totals[water.C] = n*(base.Totals[water.C]-co2) + co2
	w.Name = fmt.Sprintf("%s at the membrane surface, %.3g × feed", base.Name, n)
	return w, nil
}

// MembraneWater is a stage's concentrate at one recovery.
type MembraneWater struct {
	Recovery float64 // 0–1
	Factor   float64 // concentration factor 1/(1 − R) of the bulk concentrate
	// Bulk is the concentrate leaving the stage (factor Factor); Surface
	// the water at the membrane surface of the last element (β × Factor),
	// where scale forms and the limits are judged, at the skin too when
	// one is asked (Surface.Skin).
	Bulk    *Result
	Surface CyclePoint
}

// ConcentrateAt returns the concentrate of a reverse-osmosis stage fed
// with feed at recovery (0 ≤ R ≤ MaxRecoverySearch), in bulk and at the
// membrane surface (see Membrane), speciated closed at the feed
// temperature (or opt's).
func ConcentrateAt(feed water.Analysis, recovery float64, m Membrane, opt Options) (*MembraneWater, error) {
	if !(recovery >= 0 && recovery <= MaxRecoverySearch) {
		return nil, fmt.Errorf("recovery %g: want 0 to %g", recovery, MaxRecoverySearch)
	}
	s, _ := newMembraneSearch(feed, m, opt)
	base, co2, err := s.fixFeed(feed)
	if err != nil {
		return nil, err
	}
	f := ConcentrationFactor(recovery)
	out := &MembraneWater{Recovery: recovery, Factor: f, Surface: s.eval(base, co2, f)}
	if out.Surface.Err != nil {
		return nil, out.Surface.Err
	}
	bulk := membraneSearch{sp: s.sp, m: Membrane{Polarisation: 1}, opt: opt, skin: math.NaN()}.eval(base, co2, f)
	if bulk.Err != nil {
		return nil, bulk.Err
	}
	out.Bulk = bulk.Result
	return out, nil
}

// RecoveryResult is the answer of MaxRecovery.
type RecoveryResult struct {
	Membrane Membrane
	Profile  LimitProfile
	// Recovery is the highest recovery (0–1) at which every limit of the
	// profile holds at the membrane surface; Limiting names the quantity
	// that reaches its limit there. When no limit is reached below
	// MaxRecoverySearch, Recovery is that and Limiting is empty; when the
	// feed at the surface (β × feed) already passes a limit, Recovery is 0
	// and Exceeded names it.
	Recovery float64
	Limiting string
	Exceeded []string
	Judged   Judgement
	// Points are the surface waters on the recovery grid: Cycles is the
	// concentration factor 1/(1 − R) of the bulk concentrate.
	Points   []CyclePoint
	Warnings []string
}

// membraneSearch is what the recovery and acid searches share: the fixed
// feed, its free CO2 and the evaluation of one concentration factor.
type membraneSearch struct {
	sp   *Speciator
	m    Membrane
	opt  Options
	skin float64
}

// fixFeed fixes the feed's carbon and returns it with its free CO2.
func (s membraneSearch) fixFeed(feed water.Analysis) (water.Analysis, float64, error) {
	base, r, err := s.sp.Fix(feed, s.opt)
	if err != nil {
		return base, 0, err
	}
	return base, r.Molality("CO2[0]"), nil
}

// eval returns the surface water at concentration factor f, speciated
// closed (a pressure vessel exchanges no gas) at the evaluation
// temperature, and at the skin when one is asked.
func (s membraneSearch) eval(base water.Analysis, co2, f float64) CyclePoint {
	pt := CyclePoint{Cycles: f}
	w, err := s.m.concentrate(base, co2, f)
	if err != nil {
		pt.Err = err
		return pt
	}
	o := s.opt
	o.Carbonate = Closed
	if pt.Result, pt.Err = s.sp.Speciate(w, o); pt.Err != nil {
		return pt
	}
	pt.Indices, _ = s.sp.ClassicIndicesNoCCPP(pt.Result)
	if !math.IsNaN(s.skin) {
		pt.Skin, pt.SkinIndices, pt.Err = s.sp.heat(pt.Result, s.skin, o)
	}
	return pt
}

// newMembraneSearch prepares the searches on feed.
func newMembraneSearch(feed water.Analysis, m Membrane, opt Options) (membraneSearch, float64) {
	bulkT := feed.Temperature
	if opt.AtTemperature {
		bulkT = opt.Temperature
	}
	return membraneSearch{sp: NewSpeciator(opt.Model), m: m, opt: opt, skin: skinOf(bulkT, opt)}, bulkT
}

// MaxRecovery finds the highest recovery of a reverse-osmosis stage fed
// with feed at which every limit of profile holds at the membrane surface
// of the last element (see Membrane: ions rejected, CO2 passing, β
// polarisation), on a grid of 0.05 in recovery refined by Brent's method.
// The water is judged at the feed temperature (or opt's) and, with opt.Skin
// above it, at the skin too (a concentrate meeting a heated surface).
func MaxRecovery(feed water.Analysis, m Membrane, profile LimitProfile, opt Options) (*RecoveryResult, error) {
	if !(m.beta() >= 1 && m.beta() <= 2) {
		return nil, fmt.Errorf("concentration polarisation %g: want 1 to 2", m.beta())
	}
	s, bulkT := newMembraneSearch(feed, m, opt)
	base, co2, err := s.fixFeed(feed)
	if err != nil {
		return nil, err
	}
	res := &RecoveryResult{Membrane: m, Profile: profile,
		Judged: Judgement{Bulk: bulkT, Skin: s.skin, AtSkin: math.NaN(), Governing: bulkT}}
	eval := func(f float64) CyclePoint { return s.eval(base, co2, f) }
	for k := 0; k <= 19; k++ {
		res.Points = append(res.Points, eval(ConcentrationFactor(float64(k)*0.05)))
	}
	if first := res.Points[0]; first.Err != nil {
		return nil, first.Err
	}
	bulk := judgeCycles(res.Points, profile, eval, func(p CyclePoint) (*Result, Indices) { return p.Result, p.Indices })
	pick := bulk
	toR := func(f float64) float64 { return 1 - 1/f }
	res.Judged.AtBulk = toR(bulk.max)
	if !math.IsNaN(s.skin) {
		hot := judgeCycles(res.Points, profile, eval, func(p CyclePoint) (*Result, Indices) { return p.Skin, p.SkinIndices })
		res.Judged.AtSkin = toR(hot.max)
		if hot.max < bulk.max {
			pick, res.Judged.Governing = hot, s.skin
		}
	}
	res.Recovery, res.Limiting, res.Exceeded = toR(pick.max), pick.limiting, pick.exceeded
	res.Warnings = append(res.Warnings, pick.warnings...)
	switch {
	case len(pick.exceeded) > 0:
		res.Recovery = 0
		res.Warnings = append(res.Warnings, fmt.Sprintf("the feed at the membrane surface (β = %g) already exceeds the %s profile: pretreat it (acid, softening or antiscalant) before any recovery",
			m.beta(), profile.Name))
	case pick.limiting == "" && pick.err == nil:
		res.Warnings = append(res.Warnings, fmt.Sprintf("no limit of the %s profile is reached up to %g %% recovery", profile.Name, 100*MaxRecoverySearch))
	}
	return res, nil
}

// MembraneAcidResult is the answer of AcidForRecovery.
type MembraneAcidResult struct {
	Reagent  water.Reagent
	Strength float64 // percent
	Recovery float64 // the target recovery, 0–1
	// Dose is the smallest dose of product in the feed, mg/L, at which
	// every limit holds at the target recovery; Reached is false when no
	// dose up to the search's end does (Limiting then names what still
	// fails, often a sulfate mineral raised by sulfuric acid).
	Dose     float64
	Reached  bool
	Limiting string
	// Feed is the dosed feed (its pH is the feed pH to control to), and
	// Surface the surface water at the target recovery after the dose.
	Feed     Outcome
	Surface  *Result
	Warnings []string
}

// minFeedPH is the lowest feed pH the acid search goes to: below about 5
// nearly all alkalinity is CO2 and more acid only adds its anion.
const minFeedPH = 5.0

// AcidForRecovery finds the smallest dose of acid r (mg/L of product at
// strength percent; 0 means the table's usual strength) in the feed that
// lets a reverse-osmosis stage run at recovery (0–1) with every limit of
// profile held at the membrane surface. The acid turns bicarbonate into
// CO2, which passes the membrane (see Membrane): the concentrate keeps less
// carbon and its calcium carbonate falls, while the acid's sulfate or
// chloride is concentrated with the rest. The dose bracket grows from
// 1 mg/L by doubling until the limits hold, the feed pH falls below 5 or
// the dose passes 10 g/L; Brent's method then finds the edge.
func AcidForRecovery(feed water.Analysis, r water.Reagent, strength, recovery float64, m Membrane, profile LimitProfile, opt Options) (*MembraneAcidResult, error) {
	if !(recovery >= 0 && recovery <= MaxRecoverySearch) {
		return nil, fmt.Errorf("target recovery %g: want 0 to %g", recovery, MaxRecoverySearch)
	}
	if !(r.AlkalinityPerMol < 0) {
		return nil, fmt.Errorf("%s is not an acid: it cannot lower the feed's carbonate", r.Name)
	}
	if strength == 0 {
		strength = r.Strength
	}
	s, _ := newMembraneSearch(feed, m, opt)
	base0, _, err := s.sp.Fix(feed, opt)
	if err != nil {
		return nil, err
	}
	res := &MembraneAcidResult{Reagent: r, Strength: strength, Recovery: recovery}
	ap := acidProblem{s: s, base: base0, r: r, strength: strength, f: ConcentrationFactor(recovery), profile: profile, opt: opt}
	st, err := ap.at(0)
	if err != nil {
		return nil, err
	}
	res.Limiting = st.which
	if st.excess <= 0 {
		res.Reached, res.Feed, res.Surface = true, st.feed, st.surface.Result
		return res, nil
	}
	lo, hi, stuck, err := ap.bracket()
	if err != nil {
		return nil, err
	}
	if stuck != nil {
		res.Feed, res.Surface, res.Limiting = stuck.feed, stuck.surface.Result, stuck.which
		res.Warnings = append(res.Warnings, fmt.Sprintf("no dose of %s lets %.0f %% recovery hold the %s limits: at %.4g mg/L (feed pH %.2f) %s still fails; use an antiscalant or a lower recovery",
			r.Name, 100*recovery, profile.Name, hi, stuck.feed.Result.PH, stuck.which))
		return res, nil
	}
	d, err := findRoot(func(d float64) (float64, error) {
		sd, err := ap.at(d)
		return sd.excess, err
	}, lo, hi, 1e-4)
	if err != nil {
		return nil, errors.Join(errors.New("the acid dose was not refined"), err)
	}
	d *= 1 + 1e-6 // on the safe side of the edge
	final, err := ap.at(d)
	if err != nil {
		return nil, err
	}
	res.Dose, res.Reached, res.Feed, res.Surface = d, true, final.feed, final.surface.Result
	res.Warnings = append(res.Warnings, final.feed.Water.Warnings...)
	return res, nil
}

// acidProblem is one AcidForRecovery search: the fixed feed, the acid at
// its strength, the concentration factor f of the target recovery and the
// limit profile judged at the membrane surface.
type acidProblem struct {
	s        membraneSearch
	base     water.Analysis
	r        water.Reagent
	strength float64
	f        float64
	profile  LimitProfile
	opt      Options
}

// acidState is the feed after one acid dose and its membrane surface, with
// the largest excess over the profile (bulk or skin) and the limit it is.
type acidState struct {
	feed    Outcome
	surface CyclePoint
	excess  float64
	which   string
}

// at is the state after dose d (mg/L of product): the dosed feed fixed
// (its CO2 passes the membrane), concentrated by f at the surface and
// judged against the profile at the bulk and, when heated, at the skin.
func (ap acidProblem) at(d float64) (acidState, error) {
	w, err := ap.base.Dose(ap.r, d, ap.strength)
	if err != nil {
		return acidState{}, err
	}
	fix, fr, err := ap.s.sp.Fix(w, ap.opt)
	if err != nil {
		return acidState{}, err
	}
	pt := ap.s.eval(fix, fr.Molality("CO2[0]"), ap.f)
	if pt.Err != nil {
		return acidState{}, pt.Err
	}
	e, which, _ := excessOf(ap.profile, pt.Result, pt.Indices)
	if pt.Skin != nil {
		if he, hw, _ := excessOf(ap.profile, pt.Skin, pt.SkinIndices); he > e {
			e, which = he, hw
		}
	}
	return acidState{feed: Outcome{Water: w, Result: fr}, surface: pt, excess: e, which: which}, nil
}

// bracket grows the dose from 1 mg/L by doubling until the limits hold and
// returns the bracket [lo, hi] of the edge. When the feed pH falls below
// minFeedPH or the dose passes maxDose first, it returns the last state
// (at hi) as stuck: no dose reaches the limits.
func (ap acidProblem) bracket() (lo, hi float64, stuck *acidState, err error) {
	lo, hi = 0.0, 1.0
	for {
		sh, err := ap.at(hi)
		if err != nil {
			return 0, 0, nil, err
		}
		if sh.excess <= 0 {
			return lo, hi, nil, nil
		}
		if sh.feed.Result.PH < minFeedPH || hi > maxDose {
			return lo, hi, &sh, nil
		}
		lo, hi = hi, hi*2
	}
}
