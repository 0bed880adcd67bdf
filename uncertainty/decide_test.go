package uncertainty

import (
	"math"
	"testing"

	"scalerisk/saturation"
	"scalerisk/water"
)

// TestCyclesConfidence: on the demo makeup water under the inhibitor
// profile, the highest cycles at 90 % confidence lies below the median, at
// least 90 % of the draws hold their limits there (the definition, checked
// by re-running the draws' searches), and the central answer holds in about
// half the draws (the limiting SI is nearly linear in the inputs, so the
// central answer is near the median).
func TestCyclesConfidence(t *testing.T) {
	a := demoWater(t, 0) // the makeup water
	prof, err := saturation.LimitProfileNamed("inhibitor")
	if err != nil {
		t.Fatal(err)
	}
	rule, _ := saturation.ParseCarbonateRule("natural")
	central, err := saturation.MaxCycles(a, prof, rule, 10, 0.5, saturation.Options{})
	if err != nil {
		t.Fatal(err)
	}
	s, err := Cycles(a, central, 10, 0.5, saturation.Options{}, Settings{Draws: 200, Seed: 9, Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("cycles: central %.3f, median %.3f, 5–95 %% %.3f–%.3f, at 90 %% %.3f, P(central holds) %.2f, limiting %v, sensitivity %v",
		s.Central, s.Median, s.Low, s.High, s.AtConfidence, s.PCentral, s.Limiting, s.Sensitivity.Shares)
	if !(s.AtConfidence <= s.Median && s.Median <= s.High) {
		t.Errorf("at 90 %% %.3f, median %.3f, high %.3f: want at-confidence ≤ median ≤ high", s.AtConfidence, s.Median, s.High)
	}
	if s.PCentral < 0.2 || s.PCentral > 0.8 {
		t.Errorf("the central answer holds in %.2f of the draws, want about half (0.2–0.8)", s.PCentral)
	}
	if len(s.Limiting) == 0 || s.Sensitivity.Top() == "" {
		t.Errorf("no limiting quantity or sensitivity: %+v", s)
	}
	// The definition: the limits hold at AtConfidence in ≥ 90 % of the
	// kept draws. Re-run their searches.
	held := 0
	p, _ := newPlan(a, Settings{})
	kept, _, _ := balanceRule(p, p.draws(200, 9))
	for _, v := range kept {
		r, err := saturation.MaxCycles(p.apply(v), prof, rule, 10, 0.5, saturation.Options{})
		if err == nil && r.MaxCycles >= s.AtConfidence-cyclesTolerance {
			held++
		}
	}
	if frac := float64(held) / float64(len(kept)); frac < 0.9-1e-9 {
		t.Errorf("limits hold at %.3f cycles in %.3f of the draws, want ≥ 0.90", s.AtConfidence, frac)
	}
}

// TestDoseConfidence: the dose of sulfuric acid that brings the tower water
// to LSI 0.5 with 90 % confidence is above the central dose (it must cover
// the draws that need more), and the central dose suffices in about half
// the draws.
func TestDoseConfidence(t *testing.T) {
	a := demoWater(t, 1)
	acid, err := water.LookupReagent("h2so4")
	if err != nil {
		t.Fatal(err)
	}
	target, _ := saturation.ParseTarget("lsi=0.5", nil)
	central, err := saturation.DoseToTarget(a, acid, 0, target, saturation.Options{})
	if err != nil || !central.Reached {
		t.Fatalf("central dose: %v %+v", err, central)
	}
	s, err := Dose(a, central, saturation.Options{}, Settings{Draws: 200, Seed: 4, Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("dose: central %.2f mg/L, median %.2f, 5–95 %% %.2f–%.2f, at 90 %% %.2f, P(central suffices) %.2f, unreachable %.2f, sensitivity %v",
		s.Central, s.Median, s.Low, s.High, s.AtConfidence, s.PCentral, s.PUnreachable, s.Sensitivity.Shares)
	if !(s.AtConfidence > s.Central && s.AtConfidence >= s.Median) || math.IsInf(s.AtConfidence, 0) {
		t.Errorf("dose at 90 %% %.2f mg/L, central %.2f, median %.2f: want above both", s.AtConfidence, s.Central, s.Median)
	}
	if s.PCentral < 0.2 || s.PCentral > 0.8 {
		t.Errorf("the central dose suffices in %.2f of the draws, want about half", s.PCentral)
	}
}

// TestDrawCyclesEquivalent: the short first search of a draw gives the
// answer of the full search (saturation.MaxCycles to the end) within the
// search's tolerance, on draws of the demo makeup water, including one
// whose answer lies beyond the short search (a looser profile).
func TestDrawCyclesEquivalent(t *testing.T) {
	a := demoWater(t, 0)
	rule, _ := saturation.ParseCarbonateRule("natural")
	for _, name := range []string{"inhibitor", "no-inhibitor"} {
		prof, err := saturation.LimitProfileNamed(name)
		if err != nil {
			t.Fatal(err)
		}
		central, err := saturation.MaxCycles(a, prof, rule, 10, 0.5, saturation.Options{})
		if err != nil {
			t.Fatal(err)
		}
		p, _ := newPlan(a, Settings{})
		for i, v := range p.draws(12, 21) {
			w := p.apply(v)
			if i == 0 {
				// A draw with a tenth of the calcium: its limit lies beyond the short search.
				w.Totals[water.Ca] /= 10
			}
			short, err1 := drawCycles(w, central, 10, 0.5, saturation.Options{})
			full, err2 := saturation.MaxCycles(w, prof, rule, 10, 0.5, saturation.Options{})
			if err1 != nil || err2 != nil {
				t.Fatalf("%s draw %d: %v %v", name, i, err1, err2)
			}
			if i == 0 {
				t.Logf("%s: central %.3f; draw with a tenth of the calcium: %.3f cycles (%s)", name, central.MaxCycles, full.MaxCycles, full.Limiting)
			}
			if math.Abs(short.MaxCycles-full.MaxCycles) > cyclesTolerance || short.Limiting != full.Limiting {
				t.Errorf("%s draw %d: short search %.4f (%s), full %.4f (%s)", name, i, short.MaxCycles, short.Limiting, full.MaxCycles, full.Limiting)
			}
		}
	}
}
