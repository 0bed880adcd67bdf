package saturation

import (
	"math"
	"slices"
	"strings"
	"testing"
)

// kestrelPairs are invented Kestrel Fen waters: well 5 feeds towers 3, 4
// and 5. Tower 3 is at five cycles by Cl, Mg, Na, SiO2 and conductivity
// but holds calcium and alkalinity at about three: it is laying down
// calcium carbonate. Tower 4 is short of magnesium and silica; tower 5 of
// calcium and sulfate.
const kestrelPairs = "name,date,role,system,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L],conductivity [µS/cm]\n" +
	"well 5,2026-05-04,makeup,T3,15,7.7,60,18,30,40,45,180,16,560\n" +
	"tower 3,2026-05-04,recirculating,T3,31,8.6,180,90,150,205,225,560,80,2750\n" +
	"tower 4,2026-05-04,recirculating,T3,31,8.7,300,61,150,200,225,880,44,2800\n" +
	"tower 5,2026-05-04,blowdown,T3,31,7.4,170,90,150,200,140,880,80,2700\n"

// TestBalanceDeposits: cycles from the conservative ions are their median
// (cycles = tower / makeup; common practice, practice-2.md), and the ions
// missing beyond 10 % name the deposit the trade reads from them (Ca and
// alkalinity: calcium carbonate; Mg and SiO2: magnesium silicate; Ca and
// SO4: calcium sulfate). The deficit is makeup × cycles − tower, and with
// a blowdown of 2 m³/h it is deficit × 2 × 24 / 1000 kg/day.
func TestBalanceDeposits(t *testing.T) {
	const tol = 1e-9
	ws := plantWaters(t, kestrelPairs)
	for _, c := range []struct {
		tower   string
		cycles  float64
		deposit string
		ion     string
		deficit float64 // mg/L, by hand
	}{
		{"tower 3", 5, "calcium carbonate", "Ca", 60*5 - 180},
		{"tower 4", 5, "magnesium silicate", "SiO2", 16*5 - 44},
		{"tower 5", 5, "calcium sulfate", "SO4", 45*5 - 140},
	} {
		b, err := BalanceOf(ws["well 5"], ws[c.tower], 2)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(b.Cycles-c.cycles) > 0.05 {
			t.Errorf("%s: cycles %.3f by %v, want %g (median of the conservative ions)", c.tower, b.Cycles, b.Basis, c.cycles)
		}
		var names []string
		for _, d := range b.Deposits {
			names = append(names, d.Name)
		}
		if len(b.Deposits) == 0 || b.Deposits[0].Name != c.deposit {
			t.Errorf("%s: deposits %v, want %s first", c.tower, names, c.deposit)
		}
		ic, ok := b.ion(c.ion)
		wantDeficit := c.deficit + (b.Cycles-c.cycles)*ic.Makeup
		if !ok || !ic.Missing || math.Abs(ic.Deficit-wantDeficit) > 1e-6 || math.Abs(ic.DeficitKgPerDay-wantDeficit*2*0.024) > tol*1e3 {
			t.Errorf("%s: %s %+v, want missing %.4g mg/L, %.4g kg/day", c.tower, c.ion, ic, wantDeficit, wantDeficit*0.048)
		}
	}
	b, _ := BalanceOf(ws["well 5"], ws["tower 3"], 0)
	if !strings.Contains(b.Deposits[0].Evidence, "1:1") || !math.IsNaN(b.Ions[0].DeficitKgPerDay) {
		t.Errorf("tower 3 without a flow: evidence %q, kg/day %g; want the 1:1 check and no kg/day", b.Deposits[0].Evidence, b.Ions[0].DeficitKgPerDay)
	}
	if _, err := BalanceOf(ws["well 5"], plantWaters(t, "name,Ca [mg/L]\nx,10\n")["x"], 0); err == nil {
		t.Error("a pair with no conservative ion gave cycles")
	}
}

// TestMarginOfTower: a recirculating water is asked how far it is from its
// limits, not how many cycles it could run as a makeup. Invented Kestrel
// Fen tower 3 (five cycles of well 5): every margin is the limit minus the
// worse of the bulk and the 60 °C skin value; the further concentration
// factor under the same profile times its five cycles is the cycles the
// system could run. The tower is past its calcite limit (it is depositing
// calcium carbonate), so its further factor is 1 and calcite is named.
func TestMarginOfTower(t *testing.T) {
	ws := plantWaters(t, kestrelPairs)
	profile, _ := LimitProfileNamed("inhibitor")
	rule, _ := ParseCarbonateRule("natural")
	opt := Options{Skin: 60}
	m, err := Margin(ws["tower 3"], profile, rule, 10, 5, opt)
	if err != nil {
		t.Fatal(err)
	}
	if len(m.Limits) == 0 {
		t.Fatal("no margins")
	}
	for _, l := range m.Limits {
		worst := math.Max(l.Value, l.SkinValue)
		if math.Abs(l.Margin-(l.Max-worst)) > 1e-12 {
			t.Errorf("%s: margin %g, want %g − %g", l.Quantity, l.Margin, l.Max, worst)
		}
	}
	f := m.Further
	if math.Abs(m.MaxCycles-5*f.MaxCycles) > 1e-12 || math.Abs(m.CyclesMargin-(m.MaxCycles-5)) > 1e-12 {
		t.Errorf("cycles %g × further %g = %g (margin %g)", m.Cycles, f.MaxCycles, m.MaxCycles, m.CyclesMargin)
	}
	calcite := -1.0
	for _, l := range m.Limits {
		if l.Quantity == "si:calcite" {
			calcite = l.Margin
		}
	}
	t.Logf("tower 3: further ×%.2f (%s), system %.2f cycles; calcite margin %.2f SI", f.MaxCycles, f.Limiting, m.MaxCycles, calcite)
	if !(calcite < 0) || f.MaxCycles != 1 || !slices.Contains(f.Exceeded, "si:calcite") {
		t.Errorf("calcite margin %.2f, further factor %.2f, exceeded %v: want a negative margin, 1 and calcite named", calcite, f.MaxCycles, f.Exceeded)
	}
}
