package saturation

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"scalerisk/water"
)

// CarbonateMode says how pH and inorganic carbon are found at the
// temperature of evaluation.
type CarbonateMode int

// The carbonate modes.
const (
	// Closed conserves inorganic carbon and alkalinity and recomputes pH:
	// the water is sealed (a heat exchanger, a pipe, an RO concentrate).
	Closed CarbonateMode = iota
	// ChargeBalance finds pH from electroneutrality, conserving carbon.
	ChargeBalance
	// FixedPH holds pH at Options.PH, conserving carbon (alkalinity follows).
	FixedPH
	// FixedPCO2 holds the CO2 partial pressure at 10^Options.LogPCO2 atm and
	// conserves alkalinity (carbon follows): a water open to a gas phase.
	// LogPCO2 is taken as given (0 is 1 atm); for air use Air.
	FixedPCO2
	// FixedPHAlkalinity holds pH at Options.PH and conserves alkalinity;
	// inorganic carbon follows (CO2 exchanged with a gas phase): a tower
	// whose pH is known from a relation with its alkalinity.
	FixedPHAlkalinity
	// Air is FixedPCO2 at the CO2 partial pressure of air, LogPCO2Air
	// (Options.LogPCO2 is not used): a cooling tower open to air.
	Air
)

// holdsPCO2 reports whether mode m holds a CO2 partial pressure.
func (m CarbonateMode) holdsPCO2() bool { return m == FixedPCO2 || m == Air }

// LogPCO2Air is log10 of the CO2 partial pressure of air, atm, the pressure
// of the Air mode: 10^−3.4 atm (about 400 ppm).
const LogPCO2Air = -3.4

// Options configures a speciation. The zero value evaluates the sample at
// its own temperature, closed carbonate system, activity model chosen
// automatically, with the embedded thermodynamic table.
type Options struct {
	// Activity is the activity model; Auto is the Pitzer model set for
	// every water (Speciator.Speciate says how it falls back).
	Activity ActivityModel
	// AtTemperature, when true, evaluates at Temperature °C instead of the
	// sample's own temperature.
	AtTemperature bool
	Temperature   float64
	// Carbonate is the carbonate mode; PH serves FixedPH and
	// FixedPHAlkalinity, LogPCO2 serves FixedPCO2 only (Air uses LogPCO2Air).
	Carbonate CarbonateMode
	PH        float64
	LogPCO2   float64
	// Model is the reduced thermodynamic table; nil means DefaultModel.
	Model *Model
	// Skin is the hottest surface the water meets, °C (a heat-exchanger
	// tube wall). The decisions (MaxCycles, DoseToTarget, the limits) are
	// judged at the temperature of evaluation and, when Skin is above it,
	// at Skin too, with the bulk pH held (the classic skin-temperature
	// index; common practice); the stricter answer is the
	// decision. 0 judges at the temperature of evaluation only; a
	// speciation ignores it.
	Skin float64
}

// KgPerDay converts mg/L of a flow of m³/h to kg/day: mg/L × m³/h × 24 h/d
// × 1000 L/m³ / 10⁶ mg/kg.
func KgPerDay(mgPerL, flow float64) float64 { return mgPerL * flow * 0.024 }

// SpeciesResult is one aqueous species at equilibrium.
type SpeciesResult struct {
	Name     string  `json:"name"`
	Molality float64 `json:"molality"` // mol/kg of water
	Gamma    float64 `json:"gamma"`    // activity coefficient
	Activity float64 `json:"activity"`
}

// MineralResult is the saturation state of one mineral.
type MineralResult struct {
	Name    string
	Formula string
	// SI is the saturation index log10(IAP/Ksp): 0 at equilibrium, positive
	// where the water is supersaturated.
	SI     float64
	LogIAP float64
	LogK   float64 // log10 Ksp at the temperature of evaluation
	Source string
}

// Result is the equilibrium state of one water at one temperature.
type Result struct {
	Name          string
	Temperature   float64 // °C
	PH            float64 // −log10 a(H+), computed or fixed
	IonicStrength float64 // mol/kg
	Activity      ActivityModel
	WaterActivity float64
	// Alkalinity is the titration alkalinity, eq/kg of water; Carbon the
	// total inorganic carbon, mol/kg of water.
	Alkalinity float64
	Carbon     float64
	// LogPCO2 is log10 of the CO2 partial pressure, atm, in equilibrium with
	// the water; NaN when the water holds no carbon.
	LogPCO2 float64
	// ChargeBalance is 100·Σz·m/Σ|z|·m over all species, percent.
	ChargeBalance float64
	// Analysis is the water at the state evaluated, with inorganic carbon
	// fixed (Totals[C], CarbonKnown) and pH and alkalinity as computed.
	Analysis   water.Analysis
	Species    []SpeciesResult // live species in table order (masters first)
	Minerals   []MineralResult // table order; minerals with an absent component are left out
	Iterations int
	Warnings   []string
}

// SI returns the saturation index of mineral name and whether it was
// computed.
func (r *Result) SI(name string) (float64, bool) {
	for _, m := range r.Minerals {
		if m.Name == name {
			return m.SI, true
		}
	}
	return 0, false
}

// Molality returns the molality of species name, mol/kg (0 when absent).
func (r *Result) Molality(name string) float64 {
	return r.species(name).Molality
}

// Gamma returns the activity coefficient of species name (0 when absent).
func (r *Result) Gamma(name string) float64 {
	return r.species(name).Gamma
}

// species returns the result for species name, or a zero result when the
// species is absent.
func (r *Result) species(name string) SpeciesResult {
	for _, s := range r.Species {
		if s.Name == name {
			return s
		}
	}
	return SpeciesResult{}
}

// Speciator speciates waters with one model, reusing its solver so that a
// series of related waters (a temperature sweep, a dose search) warm-starts
// from the previous solution. Not safe for concurrent use.
type Speciator struct {
	model  *Model
	solver *solver
	// pitzer is the solver of the Pitzer model set, made on first use.
	pitzer *solver
	// last carbon fix (step 1 of Speciate), reused while the same water is
	// evaluated at other temperatures or in other modes.
	fix       carbonFix
	fixCached bool
	// lastSearch is the last mineral-to-equilibrium answer (precipitate.go).
	lastSearch searchMemo
}

// fixKey identifies what a carbon fix depends on: the analysis (totals, pH,
// its temperature, alkalinity, reported carbon) and the activity model.
type fixKey struct {
	totals                        [water.NumComponents]uint64
	ph, pht, alk, carbon, freeCO2 uint64
	carbonKnown                   bool
	model                         ActivityModel
}

type carbonFix struct {
	key         fixKey
	carbon, alk float64
	warnings    []string
}

func newFixKey(a water.Analysis, model ActivityModel) fixKey {
	k := fixKey{ph: math.Float64bits(a.PH), pht: math.Float64bits(a.PHTemperature),
		alk: math.Float64bits(a.Alkalinity), carbon: math.Float64bits(a.Totals[water.C]),
		freeCO2: math.Float64bits(a.FreeCO2), carbonKnown: a.CarbonKnown, model: model}
	for c := range water.NumComponents {
		k.totals[c] = math.Float64bits(a.Totals[c])
	}
	return k
}

// NewSpeciator returns a Speciator for model m (nil means DefaultModel).
func NewSpeciator(m *Model) *Speciator {
	if m == nil {
		m = DefaultModel()
	}
	return &Speciator{model: m, solver: newSolver(m)}
}

// Speciate computes the equilibrium state of water a under opt. It is
// NewSpeciator(opt.Model).Speciate(a, opt).
func Speciate(a water.Analysis, opt Options) (*Result, error) {
	return NewSpeciator(opt.Model).Speciate(a, opt)
}

// Temperature limits of the tool, °C: data are fitted at 1 atm to 90–100 °C;
// to MaxTemperature results carry an extrapolation warning; outside
// MinTemperature–MaxTemperature no result. Every package checks its
// temperature options against these two.
const (
	MinTemperature = 0
	MaxTemperature = 150
)

const (
	warnTemperature  = 100
	lowestPHAccepted = 0
)

// Speciate computes the equilibrium state of water a under opt, in two
// steps the way a practitioner measures a water:
//
//  1. At the pH measurement temperature, the measured pH with the measured
//     alkalinity fixes total inorganic carbon (the titration alkalinity is
//     corrected for hydroxide, silicate, phosphate and borate species through
//     the full speciation); with carbon reported directly, pH fixes
//     alkalinity instead.
//  2. At the evaluation temperature the water is speciated under
//     opt.Carbonate: closed (carbon and alkalinity conserved, pH recomputed),
//     charge balance, fixed pH or fixed CO2 partial pressure.
//
// A water with no pH but known carbon is solved by alkalinity (or charge
// balance without alkalinity). Errors say which sample and why.
func (sp *Speciator) Speciate(a water.Analysis, opt Options) (*Result, error) {
	if opt.Model != nil && opt.Model != sp.model {
		sp.model, sp.solver, sp.fixCached = opt.Model, newSolver(opt.Model), false
		sp.pitzer = nil
	}
	t := a.Temperature
	if opt.AtTemperature {
		t = opt.Temperature
	}
	if math.IsNaN(t) || t < MinTemperature || t > MaxTemperature {
		return nil, fmt.Errorf("%s: temperature %.4g °C is outside 0–%d °C", a.Name, t, MaxTemperature)
	}
	var warnings []string
	if t > warnTemperature {
		warnings = append(warnings, fmt.Sprintf("%.4g °C is above 100 °C: constants are extrapolated beyond their fitted range at 1 atm", t))
	}
	var res *Result
	var err error
	if opt.Activity == Auto {
		res, err = sp.speciateAuto(a, opt, t)
	} else {
		res, err = sp.speciateModel(a, opt, t, opt.Activity)
	}
	if err != nil {
		return nil, fmt.Errorf("%s: %w", a.Name, err)
	}
	res.Warnings = append(warnings, res.Warnings...)
	return res, nil
}

// speciateAuto is the automatic activity treatment: the Pitzer model set
// for every water, from fresh water to saturated NaCl. Its parameters cover
// the major ions of natural and process waters (Na, K, Ca, Mg, Ba, Sr, Cl,
// SO4 and the carbonate system); the minor components outside it (Fe, Mn,
// Si, P, F, NO3, B) keep ion-association activity coefficients inside it,
// and a water whose ionic strength they carry in large part says so
// (pitzerCoverage). There is no switch between models, so a cycles
// or blend curve has no step. Only where the Pitzer set does not solve does
// the ion-association set take over (Truesdell–Jones, then Davies), with a
// warning; the result names the model used.
func (sp *Speciator) speciateAuto(a water.Analysis, opt Options, t float64) (*Result, error) {
	res, err := sp.speciateModel(a, opt, t, Pitzer)
	if err == nil {
		return res, nil
	}
	for _, m := range []ActivityModel{TruesdellJones, Davies} {
		if r, e := sp.speciateModel(a, opt, t, m); e == nil {
			r.Warnings = append(r.Warnings, fmt.Sprintf("the Pitzer model set did not solve this water (%v): ion association (%s) used instead", err, m))
			return r, nil
		}
	}
	return nil, err
}

func (sp *Speciator) speciateModel(a water.Analysis, opt Options, t float64, model ActivityModel) (*Result, error) {
	if model == Auto {
		model = Davies
	}
	s, err := sp.engine(model)
	if err != nil {
		return nil, err
	}
	m := s.m
	totals := make([]float64, len(m.masters))
	for c := range water.NumComponents {
		if c == water.C {
			continue
		}
		totals[m.compMaster[c]] = a.Totals[c]
	}
	cs := carbonStep{alk: a.Alkalinity, carbon: a.Totals[water.C], carbonKnown: a.CarbonKnown}
	if math.IsNaN(a.Alkalinity) && !cs.carbonKnown && a.Totals[water.Ca]+a.Totals[water.Mg] > 0 {
		cs.warnings = append(cs.warnings, "no alkalinity or inorganic carbon reported: calcium carbonate and the other carbonate minerals are not assessed")
	}
	if err := sp.fixCarbon(s, &cs, a, opt, t, model, totals); err != nil {
		return nil, err
	}
	p, err := evaluationProblem(m, &cs, a, opt, t, model, totals)
	if err != nil {
		return nil, err
	}
	if opt.Carbonate == Closed && cs.fixed && t == a.PHTemperature {
		// The solver still holds the solution at the measured pH.
		r := collect(s, a, cs.problem)
		r.Warnings = append(cs.warnings, r.Warnings...)
		return sp.finish(r, a, t), nil
	}
	if err := s.solve(p, true); err != nil {
		return nil, err
	}
	r := collect(s, a, p)
	r.Warnings = append(cs.warnings, r.Warnings...)
	return sp.finish(r, a, t), nil
}

// engine returns the solver for activity model model: the Pitzer model
// set's for Pitzer (built on first use), the ion-association set's
// otherwise.
func (sp *Speciator) engine(model ActivityModel) (*solver, error) {
	if model != Pitzer {
		return sp.solver, nil
	}
	if sp.pitzer == nil {
		set, err := sp.model.pitzerSet()
		if err != nil {
			return nil, err
		}
		sp.pitzer = newPitzerSolver(set)
	}
	return sp.pitzer, nil
}

// ErrInconsistent reports an analysis that cannot be speciated as given
// (pH and alkalinity that do not fit together, a pH outside 0–14, a pH
// temperature out of range): a fault of the input, not of the computation.
var ErrInconsistent = errors.New("inconsistent analysis")

// collect turns the state of solver s into a Result.
func collect(s *solver, a water.Analysis, p problem) *Result {
	m := s.m
	r := &Result{Name: a.Name, Temperature: p.t, IonicStrength: math.Exp(s.lnI), Activity: p.model,
		WaterActivity: math.Exp(s.lnaw), Iterations: s.iterations, LogPCO2: math.NaN()}
	r.PH = -(s.lnm[0] + s.lng[0]) / math.Ln10
	cj := m.compMaster[water.C]
	var zsum, zabs float64
	nlive := 0
	for _, l := range s.live {
		if l {
			nlive++
		}
	}
	r.Species = make([]SpeciesResult, 0, nlive)
	r.Minerals = make([]MineralResult, 0, len(m.minerals))
	for i := range m.species {
		if !s.live[i] {
			continue
		}
		spc := &m.species[i]
		mi := s.ms[i]
		r.Alkalinity += spc.alk * mi
		for _, nt := range spc.nu {
			if nt.j == cj {
				r.Carbon += nt.coef * mi
			}
		}
		zsum += spc.act.z * mi
		zabs += math.Abs(spc.act.z) * mi
		g := math.Exp(s.lng[i])
		r.Species = append(r.Species, SpeciesResult{Name: spc.name, Molality: mi, Gamma: g, Activity: mi * g})
	}
	if zabs > 0 {
		r.ChargeBalance = 100 * zsum / zabs
	}
	// log a of each master.
	loga := make([]float64, len(m.masters))
	present := make([]bool, len(m.masters))
	for j := range m.masters {
		if s.live[j] {
			loga[j] = (s.lnm[j] + s.lng[j]) / math.Ln10
			present[j] = true
		}
	}
	logaw := s.lnaw / math.Ln10
	if g, ok := m.gasIdx["CO2(g)"]; ok && present[cj] && r.Carbon > 0 {
		gp := &m.gases[g]
		v := gp.nuW*logaw - evalLogK(gp.logK, p.t)
		for _, nt := range gp.nu {
			v += nt.coef * loga[nt.j]
		}
		r.LogPCO2 = v
	}
	extrapolated := collectMinerals(s, r, loga, present, logaw, p.t)
	var constant []string
	if math.Abs(p.t-25) > 5 {
		significant := 1e-2 * maxTotal(p.totals)
		for i := len(m.masters); i < len(m.species); i++ {
			if s.live[i] && m.species[i].entry.TemperatureFunction() == "constant" && s.ms[i] > significant {
				constant = append(constant, m.species[i].name)
			}
		}
	}
	if len(extrapolated) > 0 {
		r.Warnings = append(r.Warnings, fmt.Sprintf("log K outside its fitted temperature range at %.4g °C for: %s",
			p.t, strings.Join(extrapolated, ", ")))
	}
	if len(constant) > 0 {
		r.Warnings = append(r.Warnings, fmt.Sprintf("log K known at 25 °C only, used unchanged at %.4g °C, for significant species: %s",
			p.t, strings.Join(constant, ", ")))
	}
	if s.pitzerActive() {
		r.Warnings = append(r.Warnings, s.pitzerWarnings(p.t)...)
	}
	return r
}

// collectMinerals appends to r the saturation state of every mineral whose
// components are present (loga: log a of each master; logaw: log a_w) and
// returns those whose log K is used outside its range at t °C.
func collectMinerals(s *solver, r *Result, loga []float64, present []bool, logaw, t float64) []string {
	m := s.m
	cj := m.compMaster[water.C]
	var extrapolated []string
	for i := range m.minerals {
		mn := &m.minerals[i]
		ok := true
		for _, nt := range mn.nu {
			if !present[nt.j] || (nt.j == cj && r.Carbon <= 0) {
				ok = false
				break
			}
		}
		if !ok {
			continue
		}
		logK := s.mineralLogK[i]
		iap := mn.nuW * logaw
		for _, nt := range mn.nu {
			iap += nt.coef * loga[nt.j]
		}
		if math.IsNaN(iap) || math.IsInf(iap, 0) || math.IsNaN(logK) || math.IsInf(logK, 0) {
			r.Warnings = append(r.Warnings, fmt.Sprintf("saturation index of %s could not be computed (not finite)", mn.name))
			continue
		}
		// Report log IAP and log Ksp of the mineral's own reaction.
		own := s.mineralOwnLogK[i]
		r.Minerals = append(r.Minerals, MineralResult{Name: mn.name, Formula: mn.formula,
			SI: iap - logK, LogIAP: iap - logK + own, LogK: own, Source: mn.entry.Source})
		if e, bad := outOfRange(mn.logK, t); bad {
			extrapolated = append(extrapolated, fmt.Sprintf("%s (via %s, %g–%g °C)", mn.name, e.Name, e.TMin, e.TMax))
		}
	}
	return extrapolated
}

func maxTotal(t []float64) float64 {
	var m float64
	for _, v := range t {
		m = math.Max(m, v)
	}
	return m
}

// finish adds the analysis at the evaluated state and model-validity
// warnings.
func (sp *Speciator) finish(r *Result, a water.Analysis, t float64) *Result {
	b := a.Clone()
	b.Temperature = t
	b.PH = r.PH
	b.PHTemperature = t
	b.Alkalinity = r.Alkalinity
	b.Totals[water.C] = r.Carbon
	b.CarbonKnown = true
	if r.Carbon > 0 {
		b.Measured[water.C] = true
	}
	r.Analysis = b
	r.Temperature = t
	if r.LogPCO2 > implausibleLogPCO2 && !strings.Contains(strings.Join(r.Warnings, " "), "CO2") {
		r.Warnings = append(r.Warnings, fmt.Sprintf(
			"the water's CO2 partial pressure is 10^%.2f atm at %.4g °C, above %.0f atm: a sealed system holds it only under pressure; open to air the CO2 would escape (try the air carbonate mode)",
			r.LogPCO2, t, math.Pow(10, implausibleLogPCO2)))
	}
	if lim, ok := modelLimit[r.Activity]; ok && r.IonicStrength > lim {
		advice := "a Pitzer model suits brines"
		if r.Activity == Pitzer {
			advice = "the parameter set is checked to about 6 mol/kg"
		}
		r.Warnings = append(r.Warnings, fmt.Sprintf(
			"ionic strength %.3g mol/kg is beyond the %s model's range (about %g mol/kg): activity coefficients are uncertain; %s",
			r.IonicStrength, r.Activity, lim, advice))
	}
	return r
}

// ParseCarbonateMode parses how a water is evaluated: "closed" (carbon and
// alkalinity conserved), "air" (equilibrium with air CO2), "pco2=LOG" (with
// CO2 at 10^LOG atm), "charge" (pH from the charge balance) or "fixed-ph=VALUE"
// (pH held, carbon conserved). It returns the options' carbonate fields:
// the mode, the pH of FixedPH and the log pCO2 of FixedPCO2 (LogPCO2Air for
// Air, for the record).
func ParseCarbonateMode(s string) (mode CarbonateMode, pH, logPCO2 float64, err error) {
	s = strings.ToLower(strings.TrimSpace(s))
	switch {
	case s == "" || s == "closed":
		return Closed, 0, 0, nil
	case s == "air":
		return Air, 0, LogPCO2Air, nil
	case s == "charge":
		return ChargeBalance, 0, 0, nil
	case strings.HasPrefix(s, "pco2="):
		v, err := water.ParseNumber(strings.TrimPrefix(s, "pco2="))
		if err != nil || v < -8 || v > 2 {
			return 0, 0, 0, fmt.Errorf("carbonate mode %q: want pco2=LOG10(atm), e.g. pco2=-3.4, from −8 to 2", s)
		}
		return FixedPCO2, 0, v, nil
	case strings.HasPrefix(s, "fixed-ph=") || strings.HasPrefix(s, "ph="):
		_, num, _ := strings.Cut(s, "=")
		v, err := water.ParseNumber(num)
		if err != nil || v < 0 || v > 14 {
			return 0, 0, 0, fmt.Errorf("carbonate mode %q: want fixed-ph= a pH from 0 to 14", s)
		}
		return FixedPH, v, 0, nil
	}
	return 0, 0, 0, fmt.Errorf("unknown carbonate mode %q (want closed, air, pco2=LOG, charge or fixed-ph=VALUE)", s)
}
