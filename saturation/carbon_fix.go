package saturation

// Step 1 and the problem of step 2 of Speciate: how a water's carbonate
// system is fixed from what the laboratory reports.

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"scalerisk/water"
)

// carbonStep is the carbonate state carried from step 1 of Speciate (at
// the pH measurement temperature) to step 2: alkalinity (eq/kg), inorganic
// carbon (mol/kg), whether carbon was fixed and by which problem, and the
// warnings so far.
type carbonStep struct {
	alk, carbon float64
	carbonKnown bool
	fixed       bool
	problem     problem
	warnings    []string
}

// fixCarbon is step 1 of Speciate: with a measured pH, it fixes inorganic
// carbon from alkalinity (or alkalinity from reported carbon) at the pH
// measurement temperature, on solver s, reusing the last fix of the same
// water (t is the evaluation temperature). totals are the masters' totals; the carbon total is set in it
// when carbon is given.
func (sp *Speciator) fixCarbon(s *solver, cs *carbonStep, a water.Analysis, opt Options, t float64, model ActivityModel, totals []float64) error {
	m := s.m
	cj := m.compMaster[water.C]
	hasAlk := !math.IsNaN(a.Alkalinity)
	if math.IsNaN(a.PH) {
		if hasAlk && !cs.carbonKnown && cs.alk != 0 && !opt.Carbonate.holdsPCO2() {
			return fmt.Errorf("%w: pH is needed to find inorganic carbon from alkalinity (or report DIC)", ErrInconsistent)
		}
		return nil
	}
	if a.PH < 0 || a.PH > 14 {
		return fmt.Errorf("%w: pH %.4g is outside 0–14", ErrInconsistent, a.PH)
	}
	if math.IsNaN(a.PHTemperature) || a.PHTemperature < MinTemperature || a.PHTemperature > MaxTemperature {
		return fmt.Errorf("%w: the pH was measured at %.4g °C, outside 0–%d °C", ErrInconsistent, a.PHTemperature, MaxTemperature)
	}
	if a.PHTemperature > warnTemperature {
		cs.warnings = append(cs.warnings, fmt.Sprintf("the pH was measured at %.4g °C, above 100 °C: constants are extrapolated", a.PHTemperature))
	}
	key := newFixKey(a, model)
	if sp.fixCached && sp.fix.key == key && !(opt.Carbonate == Closed && t == a.PHTemperature) {
		cs.carbon, cs.carbonKnown, cs.alk = sp.fix.carbon, true, sp.fix.alk
		cs.warnings = append(cs.warnings, sp.fix.warnings...)
		cs.fixed = true
		return nil
	}
	p := problem{t: a.PHTemperature, model: model, totals: totals, hRow: rowFixed,
		lnaH: -a.PH * math.Ln10, cRow: rowAbsent}
	switch {
	case hasAlk && (!cs.carbonKnown || cs.carbon == 0) && a.PH < acidPH:
		// Below the end point of the alkalinity titration the
		// alkalinity holds no carbonate: it cannot fix carbon.
		g, ok := m.gasIdx["CO2(g)"]
		if !ok {
			return fmt.Errorf("%w: pH %.4g is below %.1f and no inorganic carbon is reported", ErrInconsistent, a.PH, acidPH)
		}
		p.cRow, p.gas, p.logP = rowGas, g, LogPCO2Air
		cs.warnings = append(cs.warnings, fmt.Sprintf(
			"pH %.3g is below %.1f, where alkalinity holds no carbonate: inorganic carbon is taken in equilibrium with air CO2 (10^%.1f atm); report DIC for a better answer",
			a.PH, acidPH, LogPCO2Air))
	case hasAlk && (!cs.carbonKnown || cs.carbon == 0):
		p.cRow = rowAlk
		p.alk = cs.alk
	case cs.carbonKnown && cs.carbon > 0:
		totals[cj] = cs.carbon
		p.cRow = rowMass
	}
	if err := s.solve(p, true); err != nil {
		q, ok := noCarbon(s, p, cs.alk)
		if !ok {
			return fixFailure(s, p, a, cs.alk, err)
		}
		p = q
		cs.warnings = append(cs.warnings, fmt.Sprintf(
			"alkalinity %.4g mg/L as CaCO3 is within %.2g mg/L as CaCO3 (a titration's usual reporting limit) of what pH %.4g gives with no carbonate: the water is taken to hold no inorganic carbon",
			1000*cs.alk*water.EquivalentMassCaCO3, 1000*alkResolution*water.EquivalentMassCaCO3, a.PH))
	}
	c1, alk1, co2 := carbonState(s)
	cs.warnings = append(cs.warnings, fixWarnings(s, p, a, cs, c1, co2)...)
	cs.carbon, cs.carbonKnown = c1, true
	cs.alk = alk1
	cs.fixed, cs.problem = true, p
	sp.fix = carbonFix{key: key, carbon: cs.carbon, alk: cs.alk, warnings: slices.Clone(cs.warnings)}
	sp.fixCached = true
	return nil
}

// alkResolution is the alkalinity a titration cannot tell from zero,
// eq/kg: 0.02 meq/kg, 1 mg/L as CaCO3, the usual reporting limit of a
// titrated alkalinity (common practice).
const alkResolution = 0.02e-3

// noCarbon solves problem p (carbon from alkalinity alk, which failed)
// with no inorganic carbon instead, and reports whether that fits: the
// species other than carbonate at the measured pH (hydroxide, silicate,
// borate, phosphate) give at least alk and at most alk plus
// alkResolution. Pure water at pH 7 with alkalinity 0 is such a water.
// On success s holds the solution.
func noCarbon(s *solver, p problem, alk float64) (problem, bool) {
	if p.cRow != rowAlk {
		return p, false
	}
	q := p
	q.cRow = rowAbsent
	if s.solve(q, false) != nil {
		return p, false
	}
	_, other, _ := carbonState(s)
	return q, other >= alk && other-alk <= alkResolution
}

// fixFailure explains a failed carbon fix (problem p, error err): is the
// alkalinity already exceeded by the species other than carbonate at this
// pH (hydroxide, silicate, borate, phosphate)? Then no positive carbon fits.
func fixFailure(s *solver, p problem, a water.Analysis, alk float64, err error) error {
	if p.cRow == rowAlk {
		q := p
		q.cRow = rowAbsent
		if s.solve(q, false) == nil {
			if _, other, _ := carbonState(s); other >= alk {
				return fmt.Errorf("%w: pH %.4g and alkalinity %.4g meq/kg do not fit: the non-carbonate species alone give %.4g meq/kg",
					ErrInconsistent, a.PH, 1000*alk, 1000*other)
			}
		}
	}
	return fmt.Errorf("fixing inorganic carbon at pH %.4g: %w", a.PH, err)
}

// fixWarnings checks the carbon fix of problem p (carbon c1 and CO2 co2,
// mol/kg) against what the analysis reports.
func fixWarnings(s *solver, p problem, a water.Analysis, cs *carbonStep, c1, co2 float64) []string {
	var warnings []string
	if lp := logPCO2(s); p.cRow == rowAlk && lp > implausibleLogPCO2 {
		warnings = append(warnings, fmt.Sprintf(
			"pH and alkalinity put the water's CO2 at 10^%.2f atm, more than %.0f atm: check the pH and the alkalinity (or report DIC)",
			lp, math.Pow(10, implausibleLogPCO2)))
	}
	if p.cRow == rowAlk && cs.carbonKnown && cs.carbon > 0 && math.Abs(c1-cs.carbon) > 0.1*cs.carbon {
		warnings = append(warnings, fmt.Sprintf(
			"reported inorganic carbon (%.4g mmol/kg) and the value from pH and alkalinity (%.4g mmol/kg) differ by more than 10 %%; pH and alkalinity used",
			1000*cs.carbon, 1000*c1))
	}
	if !math.IsNaN(a.FreeCO2) && a.FreeCO2 > 0 && (co2 > 2*a.FreeCO2 || co2 < a.FreeCO2/2) {
		warnings = append(warnings, fmt.Sprintf(
			"reported free CO2 (%.3g mmol/kg) and the value from pH and alkalinity (%.3g mmol/kg) differ by more than a factor of 2: check the pH (free CO2 is often lost before analysis)",
			1000*a.FreeCO2, 1000*co2))
	}
	return warnings
}

// evaluationProblem is step 2 of Speciate: the problem at t °C under
// opt.Carbonate, from the carbonate state cs of step 1.
func evaluationProblem(m *Model, cs *carbonStep, a water.Analysis, opt Options, t float64, model ActivityModel, totals []float64) (problem, error) {
	p := problem{t: t, model: model, totals: totals, cRow: rowAbsent}
	if cs.carbonKnown && cs.carbon > 0 {
		totals[m.compMaster[water.C]] = cs.carbon
		p.cRow = rowMass
	}
	alkKnown := !math.IsNaN(a.Alkalinity) || cs.fixed
	switch opt.Carbonate {
	case Closed:
		if alkKnown {
			p.hRow, p.alk = rowAlk, cs.alk
		} else {
			p.hRow = rowCharge
			cs.warnings = append(cs.warnings, "pH and alkalinity unknown: pH from charge balance")
		}
	case ChargeBalance:
		p.hRow = rowCharge
	case FixedPH:
		if opt.PH < 0 || opt.PH > 14 {
			return p, fmt.Errorf("fixed pH %.4g is outside 0–14", opt.PH)
		}
		p.hRow, p.lnaH = rowFixed, -opt.PH*math.Ln10
	case FixedPHAlkalinity:
		if opt.PH < 0 || opt.PH > 14 {
			return p, fmt.Errorf("fixed pH %.4g is outside 0–14", opt.PH)
		}
		if !alkKnown {
			return p, errors.New("alkalinity is needed to hold pH and alkalinity together")
		}
		p.hRow, p.lnaH = rowFixed, -opt.PH*math.Ln10
		p.cRow, p.alk = rowAlk, cs.alk
	case FixedPCO2, Air:
		g, ok := m.gasIdx["CO2(g)"]
		if !ok {
			return p, errors.New("thermodynamic table has no CO2(g)")
		}
		if !alkKnown {
			return p, errors.New("alkalinity is needed for equilibrium with a CO2 partial pressure")
		}
		logP := opt.LogPCO2
		if opt.Carbonate == Air {
			logP = LogPCO2Air
		}
		p.hRow, p.alk = rowAlk, cs.alk
		p.cRow, p.gas, p.logP = rowGas, g, logP
	}
	return p, nil
}

// acidPH is the pH below which alkalinity cannot fix inorganic carbon: the
// end point of the total-alkalinity titration (about 4.5; Standard Methods
// 2320, from memory).
const acidPH = 4.5

// implausibleLogPCO2 is log10 of a CO2 partial pressure, atm, above which
// a water's carbonate system (fixed from pH and alkalinity) is flagged:
// 3 atm, beyond any open water at 1 atm total pressure.
const implausibleLogPCO2 = 0.5

// logPCO2 returns log10 of the CO2 partial pressure, atm, in equilibrium
// with the solver's current solution (NaN without carbon or CO2(g)).
func logPCO2(s *solver) float64 {
	m := s.m
	g, ok := m.gasIdx["CO2(g)"]
	if !ok {
		return math.NaN()
	}
	gp := &m.gases[g]
	v := gp.nuW*s.lnaw/math.Ln10 - evalLogK(gp.logK, s.p.t)
	for _, nt := range gp.nu {
		if !s.live[nt.j] {
			return math.NaN()
		}
		v += nt.coef * (s.lnm[nt.j] + s.lng[nt.j]) / math.Ln10
	}
	return v
}

// carbonState returns total inorganic carbon (mol/kg), alkalinity (eq/kg)
// and the molality of CO2[0] of the current solution of solver s.
func carbonState(s *solver) (carbon, alk, co2 float64) {
	m := s.m
	cj := m.compMaster[water.C]
	co2i, hasCO2 := m.speciesIdx["CO2[0]"]
	for i := range m.species {
		if !s.live[i] {
			continue
		}
		mi := s.ms[i]
		alk += m.species[i].alk * mi
		for _, nt := range m.species[i].nu {
			if nt.j == cj {
				carbon += nt.coef * mi
			}
		}
	}
	if hasCO2 && s.live[co2i] {
		co2 = s.ms[co2i]
	}
	return carbon, alk, co2
}
