package saturation

import (
	"testing"

	"scalerisk/water"
)

// benchWaters are eight typical cooling-tower waters: the test case with
// its totals scaled by 0.8–1.2 and pH 7.8–8.5.
func benchWaters() []water.Analysis {
	var ws []water.Analysis
	for i := 0; i < 8; i++ {
		a := coolingWater()
		f := 0.8 + 0.4*float64(i)/7
		for c := range a.Totals {
			a.Totals[c] *= f
		}
		a.Alkalinity *= f
		a.PH = 7.8 + 0.1*float64(i)
		ws = append(ws, a)
	}
	return ws
}

// BenchmarkSpeciateCold is one full speciation of a typical cooling-tower
// water (carbon fixed from pH and alkalinity at 25 °C, then evaluated closed
// at 30 °C) with all saturation indices, by a fresh Speciator each time.
func BenchmarkSpeciateCold(b *testing.B) {
	ws := benchWaters()
	m := DefaultModel()
	opt := Options{Model: m}
	i := 0
	for b.Loop() {
		if _, err := NewSpeciator(m).Speciate(ws[i%len(ws)], opt); err != nil {
			b.Fatal(err)
		}
		i++
	}
}

// BenchmarkSpeciateWarm is the same with one Speciator reused over the
// eight waters in turn: each solve starts from the previous water's
// solution.
func BenchmarkSpeciateWarm(b *testing.B) {
	ws := benchWaters()
	sp := NewSpeciator(nil)
	i := 0
	for b.Loop() {
		if _, err := sp.Speciate(ws[i%len(ws)], Options{}); err != nil {
			b.Fatal(err)
		}
		i++
	}
}

// BenchmarkSweep100 speciates one cooling water at 100 temperatures from
// 5 to 95 °C, each warm-started from the previous point; the time reported
// is for the whole sweep.
func BenchmarkSweep100(b *testing.B) {
	a := coolingWater()
	sp := NewSpeciator(nil)
	for b.Loop() {
		for i := 0; i < 100; i++ {
			if _, err := sp.Speciate(a, Options{AtTemperature: true, Temperature: 5 + 0.9*float64(i)}); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// demoBenchWaters returns the demo's tower water (dilute cooling water,
// I ≈ 0.04 mol/kg, Davies) and RO concentrate (brackish, I ≈ 0.12 mol/kg,
// Truesdell–Jones), the invented waters of data/demo.csv.
func demoBenchWaters(b *testing.B) map[string]water.Analysis {
	f, err := water.OpenDemo()
	if err != nil {
		b.Fatal(err)
	}
	defer f.Close()
	recs, _, err := water.Read("demo.csv", f, water.ReadOptions{})
	if err != nil || len(recs) < 3 {
		b.Fatalf("demo: %v", err)
	}
	ws := map[string]water.Analysis{"cooling": recs[1].Analysis, "brackish": recs[2].Analysis}
	// The embedded model and its Pitzer set are built once per process, on
	// first use: not part of any one speciation.
	for _, a := range ws {
		if _, err := NewSpeciator(nil).Speciate(a, Options{}); err != nil {
			b.Fatal(err)
		}
	}
	return ws
}

// BenchmarkDemoSpeciateCold is one cold speciation (a fresh Speciator) of
// each demo water, with every saturation index: the unit of the assessment
// ratio.
func BenchmarkDemoSpeciateCold(b *testing.B) {
	for _, name := range []string{"cooling", "brackish"} {
		a := demoBenchWaters(b)[name]
		b.Run(name, func(b *testing.B) {
			for b.Loop() {
				if _, err := NewSpeciator(nil).Speciate(a, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkAssess is the full assessment of one demo water by a fresh
// Speciator, as assess does: speciation, classic indices with the CCPP,
// and the precipitation potential of every readily forming mineral alone
// and together.
func BenchmarkAssess(b *testing.B) {
	for _, name := range []string{"cooling", "brackish"} {
		a := demoBenchWaters(b)[name]
		b.Run(name, func(b *testing.B) {
			for b.Loop() {
				if as := AssessAnalysis(a, Options{}); as.Err != nil || len(as.Warnings) > 0 && as.Indices == nil {
					b.Fatal(as.Err, as.Warnings)
				}
			}
		})
	}
}

// BenchmarkSweepPoint is one point of a temperature sweep of the demo
// cooling water, warm-started from the previous point (5–95 °C in turn).
func BenchmarkSweepPoint(b *testing.B) {
	a := demoBenchWaters(b)["cooling"]
	sp := NewSpeciator(nil)
	i := 0
	for b.Loop() {
		t := 5 + 0.9*float64(i%100)
		if _, err := sp.Speciate(a, Options{AtTemperature: true, Temperature: t}); err != nil {
			b.Fatal(err)
		}
		i++
	}
}
