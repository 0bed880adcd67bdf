package uncertainty

import (
	"testing"

	"scalerisk/saturation"
)

// benchDemo is the demo water the benchmarks use: the tower's recirculating
// water (index 1 of data/demo.csv), a typical cooling water.
const benchDemo = 1

// BenchmarkCentral is one central assessment of the demo tower water, as
// assess computes it per sample: speciation, classic indices with the
// CCPP, and the scale that could form. The unit of the cost ratio that
// scripts/bench-uncertainty.sh prints.
func BenchmarkCentral(b *testing.B) {
	a := demoWater(b, benchDemo)
	for b.Loop() {
		if as := saturation.AssessAnalysis(a, saturation.Options{}); as.Err != nil {
			b.Fatal(as.Err)
		}
	}
}

// BenchmarkDraws1000 is a Monte Carlo assessment of the demo tower water
// with 1000 draws on one worker, summaries and sensitivities included.
func BenchmarkDraws1000(b *testing.B) {
	a := demoWater(b, benchDemo)
	central := saturation.AssessAnalysis(a, saturation.Options{})
	s := Settings{Draws: 1000, Seed: 1, Workers: 1}
	for b.Loop() {
		if _, err := Assess(central, saturation.Options{}, s); err != nil {
			b.Fatal(err)
		}
	}
}
