package saturation

import (
	"math"
	"testing"

	"scalerisk/water"
)

// kestrelFeed is an invented brackish well feeding the Kestrel Fen RO
// train B.
const kestrelFeed = "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n" +
	"RO feed B,20,7.6,120,40,200,8,300,250,250,25\n"

// TestMembraneConcentrate: at 75 % recovery the concentrate is 1/(1 − 0.75)
// = 4 times the feed (ASTM D3739, practice.md §4.2) and the membrane
// surface β = 1.2 times that; CO2 passes the membrane, so the concentrate
// carbon is 4·(C_T − CO2) + CO2 and its pH rises above the feed's (common
// practice, practice-2.md) — by clearly more than rounding (0.1) though
// well below log10 4, since the CaCO3(0) and MgCO3(0) pairs of the
// concentrate take part of the added carbonate alkalinity.
func TestMembraneConcentrate(t *testing.T) {
	const tol = 1e-9
	feed := plantWaters(t, kestrelFeed)["RO feed B"]
	c, err := ConcentrateAt(feed, 0.75, Membrane{}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	fr, err := Speciate(feed, Options{})
	if err != nil {
		t.Fatal(err)
	}
	ratio := func(r *Result, comp water.Component) float64 {
		return r.Analysis.Totals[comp] / fr.Analysis.Totals[comp]
	}
	if got := ratio(c.Bulk, water.Cl); math.Abs(got-4) > tol {
		t.Errorf("bulk concentrate Cl = %.6g × feed, want 4 (ASTM D3739)", got)
	}
	if got := ratio(c.Surface.Result, water.Cl); math.Abs(got-4*DefaultPolarisation) > tol {
		t.Errorf("surface Cl = %.6g × feed, want 4 × %g", got, DefaultPolarisation)
	}
	co2 := fr.Molality("CO2[0]")
	wantC := 4*(fr.Carbon-co2) + co2
	if got := c.Bulk.Carbon; math.Abs(got/wantC-1) > 1e-9 {
		t.Errorf("concentrate carbon %.6g mol/kg, want 4·(C_T − CO2) + CO2 = %.6g", got, wantC)
	}
	if !(c.Bulk.PH > fr.PH+0.1) {
		t.Errorf("concentrate pH %.2f, want above the feed's %.2f (CO2 passes the membrane)", c.Bulk.PH, fr.PH)
	}
}

// TestMaxRecoveryAndAcid: the highest recovery of the invented feed under
// the membrane profile puts its limiting quantity at the limit (the
// search's own check); polarisation makes it lower; sulfuric acid in the
// feed lets a higher recovery hold the limits, and the dosed feed's own
// highest recovery is then at least the target.
func TestMaxRecoveryAndAcid(t *testing.T) {
	feed := plantWaters(t, kestrelFeed)["RO feed B"]
	profile, _ := LimitProfileNamed("membrane")
	r, err := MaxRecovery(feed, Membrane{}, profile, Options{})
	if err != nil {
		t.Fatal(err)
	}
	flat, err := MaxRecovery(feed, Membrane{Polarisation: 1}, profile, Options{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("highest recovery %.3f (%s) with β 1.2, %.3f (%s) with β 1", r.Recovery, r.Limiting, flat.Recovery, flat.Limiting)
	if r.Limiting == "" || !(r.Recovery > 0.3 && r.Recovery < flat.Recovery) {
		t.Fatalf("recovery %.3f (%s), %.3f without polarisation: want a limited answer below the unpolarised one", r.Recovery, r.Limiting, flat.Recovery)
	}
	at, err := ConcentrateAt(feed, r.Recovery, Membrane{}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	l, _ := profile.Lookup(r.Limiting)
	if v, _ := l.Value(at.Surface.Result, at.Surface.Indices); math.Abs(v-l.Max) > 0.01*math.Max(1, math.Abs(l.Max)) {
		t.Errorf("%s at %.3f recovery = %.4g, want its limit %g", r.Limiting, r.Recovery, v, l.Max)
	}
	// Acid moves the carbonate limits only: judge it on a profile without
	// silica, which this feed reaches a few percent above the calcite edge.
	noSilica := LimitProfile{Name: "membrane without silica"}
	for _, l := range profile.Limits {
		if l.Quantity != "si:silica_amorphous" {
			noSilica.Limits = append(noSilica.Limits, l)
		}
	}
	profile = noSilica
	target := r.Recovery + 0.05
	acid, err := AcidForRecovery(feed, mustReagent(t, "h2so4"), 0, target, Membrane{}, profile, Options{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%.0f %% recovery: %.1f mg/L H2SO4, feed pH %.2f (reached %v, %v)", 100*target, acid.Dose, acid.Feed.Result.PH, acid.Reached, acid.Warnings)
	if r.Limiting == "si:calcite" && (!acid.Reached || !(acid.Dose > 0)) {
		t.Fatalf("calcite-limited feed: acid for %.2f recovery not found (%v)", target, acid.Warnings)
	}
	if acid.Reached {
		dosed, err := MaxRecovery(acid.Feed.Water, Membrane{}, profile, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if dosed.Recovery < target-1e-3 {
			t.Errorf("the dosed feed allows %.3f recovery, want at least the target %.3f", dosed.Recovery, target)
		}
	}
}
