package saturation

import (
	"errors"
	"fmt"
	"math"
)

// Bounds of a row of a thermodynamic table (ReadTable refuses a row
// outside them, naming its file, line and column). They are wide: they
// catch a typing slip (a log K of 400, a negative ion size) and leave every
// constant of aqueous geochemistry inside.
const (
	// MaxAbsLogK bounds |log K| at 25 °C and at the ends of an entry's
	// temperature range. The embedded table spans −58.5 (hydroxyapatite)
	// to +31.5 (sepiolite); the most extreme reactions of aqueous
	// geochemistry, redox half-reactions such as 2 H2O = O2(g) + 4 H+ +
	// 4 e− near −86 at 25 °C, stay inside (from memory).
	MaxAbsLogK = 100
	// MaxAbsDeltaH bounds |ΔH°r|, kJ/mol. The embedded table spans −194
	// (talc) to +67 kJ/mol; reaction enthalpies of dissolution and
	// complexation stay within a few hundred kJ/mol (from memory).
	MaxAbsDeltaH = 1000
	// MaxIonSize bounds the ion-size parameter å, Å (it must also be
	// above 0). The embedded sizes run from 2.5 to 10.65 Å; Kielland's
	// 1937 table stops at 11 Å (from memory).
	MaxIonSize = 20
	// MaxAbsTJB bounds the Truesdell–Jones b parameter, kg/mol (embedded
	// −0.04 to 0.24).
	MaxAbsTJB = 1
	// MinTableTemperature and MaxTableTemperature bound t_min_c and
	// t_max_c, °C: liquid water from its freezing point to its critical
	// point (374 °C).
	MinTableTemperature = 0
	MaxTableTemperature = 374
)

// checkEntry checks the numbers of a parsed row against the bounds above;
// the error names the column (header) at fault.
func checkEntry(e *Entry) (header string, err error) {
	num := []struct {
		h string
		v float64
	}{{"log_k_25", e.LogK25}, {"delta_h_kj", e.DeltaH}, {"t_min_c", e.TMin}, {"t_max_c", e.TMax},
		{"ion_size", e.IonSize}, {"b_tj", e.TJB}}
	for i, a := range e.Analytic {
		num = append(num, struct {
			h string
			v float64
		}{fmt.Sprintf("a%d", i+1), a})
	}
	for _, n := range num {
		if math.IsInf(n.v, 0) {
			return n.h, errors.New("not a finite number")
		}
	}
	switch {
	case math.Abs(e.LogK25) > MaxAbsLogK:
		return "log_k_25", fmt.Errorf("log K %.4g is beyond ±%d", e.LogK25, MaxAbsLogK)
	case math.Abs(e.DeltaH) > MaxAbsDeltaH:
		return "delta_h_kj", fmt.Errorf("ΔH %.4g kJ/mol is beyond ±%d kJ/mol", e.DeltaH, MaxAbsDeltaH)
	case !math.IsNaN(e.IonSize) && !(e.IonSize > 0 && e.IonSize <= MaxIonSize):
		return "ion_size", fmt.Errorf("ion size %.4g Å is outside (0, %d] Å", e.IonSize, MaxIonSize)
	case math.Abs(e.TJB) > MaxAbsTJB:
		return "b_tj", fmt.Errorf("b %.4g kg/mol is beyond ±%d", e.TJB, MaxAbsTJB)
	case e.TMin < MinTableTemperature || e.TMin > MaxTableTemperature:
		return "t_min_c", fmt.Errorf("%.4g °C is outside %d–%d °C", e.TMin, MinTableTemperature, MaxTableTemperature)
	case e.TMax < MinTableTemperature || e.TMax > MaxTableTemperature:
		return "t_max_c", fmt.Errorf("%.4g °C is outside %d–%d °C", e.TMax, MinTableTemperature, MaxTableTemperature)
	case e.TMin > e.TMax:
		return "t_min_c", fmt.Errorf("t_min_c %.4g °C is above t_max_c %.4g °C", e.TMin, e.TMax)
	}
	if e.Phase == Master {
		return "", nil
	}
	for _, t := range []float64{e.TMin, 25, e.TMax} {
		if k := e.LogK(t); !(math.Abs(k) <= MaxAbsLogK) {
			h := "delta_h_kj"
			if e.HasAnalytic {
				h = "a1"
			}
			return h, fmt.Errorf("log K at %.4g °C is %.4g, beyond ±%d", t, k, MaxAbsLogK)
		}
	}
	return "", nil
}
