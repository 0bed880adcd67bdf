package saturation

import (
	"testing"
)

// BenchmarkSpeciateCold is one full speciation of a typical cooling-tower
// water (carbon fixed from pH and alkalinity at 25 °C, then evaluated closed
// at 30 °C) plus all saturation indices, with a fresh solver each time.
func BenchmarkSpeciateCold(b *testing.B) {
	a := coolingWater()
	m := DefaultModel()
	opt := Options{Model: m}
	for b.Loop() {
		if _, err := NewSpeciator(m).Speciate(a, opt); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSpeciateWarm is the same with one Speciator reused: each solve
// starts from the previous solution.
func BenchmarkSpeciateWarm(b *testing.B) {
	a := coolingWater()
	sp := NewSpeciator(nil)
	opt := Options{}
	for b.Loop() {
		if _, err := sp.Speciate(a, opt); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSweep100 speciates the cooling water at 100 temperatures from
// 5 to 95 °C, each warm-started from the previous point; the reported time
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
