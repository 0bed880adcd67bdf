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
