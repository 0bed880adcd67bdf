package saturation

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"testing"

	"scalerisk/data"
	"scalerisk/water"
)

// addTableSeeds adds the embedded table name and the bad tables of the
// corpus (testdata/bad_tables) as seeds.
func addTableSeeds(f *testing.F, embedded, prefix string) {
	if r, err := data.Open(embedded); err == nil {
		var b bytes.Buffer
		b.ReadFrom(r)
		r.Close()
		f.Add(b.Bytes())
	}
	paths, _ := filepath.Glob(filepath.Join("..", "testdata", "bad_tables", prefix+"*.csv"))
	for _, p := range paths {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
}

// FuzzReadTable: a --thermo file of any bytes is read or refused with an
// *water.InputError; never a panic, and every row read passes the bounds
// of checkEntry (so log K is finite over each row's range).
func FuzzReadTable(f *testing.F) {
	addTableSeeds(f, "thermo.csv", "thermo_")
	f.Fuzz(func(t *testing.T, b []byte) {
		tab, err := DefaultTable().Extend("fuzz.csv", bytes.NewReader(b))
		if err != nil {
			var ie *water.InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %v is not an *InputError", err)
			}
			return
		}
		for _, e := range tab.Entries() {
			if h, err := checkEntry(&e); err != nil {
				t.Fatalf("%s accepted with %s: %v", e.Name, h, err)
			}
		}
	})
}

// FuzzReadLimits: a --limits file of any bytes is read or refused with an
// *water.InputError; never a panic; a profile read has a name and limits
// with finite maxima.
func FuzzReadLimits(f *testing.F) {
	addTableSeeds(f, "limits.csv", "limits_")
	f.Fuzz(func(t *testing.T, b []byte) {
		ps, err := ReadLimits("fuzz.csv", bytes.NewReader(b), nil)
		if err != nil {
			var ie *water.InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %v is not an *InputError", err)
			}
			return
		}
		for _, p := range ps {
			for _, l := range p.Limits {
				if math.IsNaN(l.Max) || math.IsInf(l.Max, 0) {
					t.Fatalf("profile %q: limit %+v", p.Name, l)
				}
			}
		}
	})
}

// FuzzReadPitzer: a Pitzer table of any bytes is read or refused; never a
// panic.
func FuzzReadPitzer(f *testing.F) {
	addTableSeeds(f, "pitzer.csv", "pitzer_")
	f.Fuzz(func(t *testing.T, b []byte) {
		readPitzerTable("fuzz.csv", bytes.NewReader(b))
	})
}

// FuzzSpeciate: a water of any finite composition (ionic strength, shares,
// pH, temperature, carbon, traces) converges with finite pH, ionic strength
// and saturation indices, or returns an error; never NaN, never a panic.
func FuzzSpeciate(f *testing.F) {
	f.Add(0.01, 0.5, 0.5, 7.5, 25.0, 2e-3, 1e-6)
	f.Add(5.0, 0.9, 0.1, 2.0, 100.0, 1e-5, 1e-4)
	f.Add(1e-4, 0.0, 1.0, 12.0, 0.0, 3e-2, 0.0)
	sp := NewSpeciator(nil)
	f.Fuzz(func(t *testing.T, I, share, sulfate, pH, temp, carbon, trace float64) {
		for _, v := range []float64{I, share, sulfate, pH, temp, carbon, trace} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return
			}
		}
		I = math.Min(math.Abs(I), 6)
		share, sulfate = math.Mod(math.Abs(share), 1), math.Mod(math.Abs(sulfate), 1)
		ca, na := I*share/3, I*(1-share)
		so4 := math.Min(ca*sulfate, 0.3)
		tr := math.Min(math.Abs(trace), 1e-3)
		a := newWater("fuzz", math.Mod(math.Abs(temp), 100), map[water.Component]float64{
			water.Na: na, water.Ca: ca, water.S: so4, water.Cl: na + 2*ca - 2*so4,
			water.C: math.Min(math.Abs(carbon), 0.1), water.Ba: tr / 100, water.Sr: tr, water.F: tr,
			water.Si: tr, water.P: tr / 10, water.Fe: tr / 100, water.Mn: tr / 100})
		a.PH, a.PHTemperature = 2+math.Mod(math.Abs(pH), 10), a.Temperature
		r, err := sp.Speciate(a, Options{})
		if err != nil {
			return
		}
		if !finite(r.PH) || !finite(r.IonicStrength) {
			t.Fatalf("pH %v, I %v", r.PH, r.IonicStrength)
		}
		for _, m := range r.Minerals {
			if !finite(m.SI) {
				t.Fatalf("SI(%s) = %v", m.Name, m.SI)
			}
		}
	})
}
