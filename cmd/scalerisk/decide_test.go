package main

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// decodeSamples parses the {"samples":[...]} document of a command into
// generic objects, failing the test on invalid JSON.
func decodeSamples(t *testing.T, out string) []map[string]any {
	t.Helper()
	var doc struct {
		Samples []map[string]any `json:"samples"`
		Caution string           `json:"caution"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("invalid JSON: %v\n%s", err, out)
	}
	if !strings.Contains(doc.Caution, "advisory") {
		t.Errorf("JSON caution %q lacks the advisory note", doc.Caution)
	}
	return doc.Samples
}

// TestDoseCommand: the design's dose contract — name, reagent,
// strength_percent, dose_mg_per_l, reached, after (an assess object),
// warnings — and the common-ion effect of sulfuric acid on gypsum.
func TestDoseCommand(t *testing.T) {
	r := mustRun(t, 0, "", "dose", "--demo", "--reagent", "h2so4", "--target", "ph=7.2", "--flow", "10", "--format", "json")
	samples := decodeSamples(t, r.stdout)
	if len(samples) != 3 {
		t.Fatalf("%d samples, want 3", len(samples))
	}
	for _, s := range samples {
		for _, k := range []string{"name", "reagent", "strength_percent", "dose_mg_per_l", "reached", "after", "warnings", "dose_kg_per_day"} {
			if _, ok := s[k]; !ok {
				t.Errorf("%v: key %q missing", s["name"], k)
			}
		}
		if s["reagent"] != "h2so4" || s["reached"] != true {
			t.Errorf("%v: reagent %v reached %v", s["name"], s["reagent"], s["reached"])
		}
		after := s["after"].(map[string]any)
		before := s["before"].(map[string]any)
		if ph := after["ph"].(float64); math.Abs(ph-7.2) > 0.001 {
			t.Errorf("%v: pH after %g, want 7.2", s["name"], ph)
		}
		gb := before["saturation_index"].(map[string]any)["gypsum"].(float64)
		ga := after["saturation_index"].(map[string]any)["gypsum"].(float64)
		if !(ga > gb) {
			t.Errorf("%v: gypsum SI %g → %g; sulfuric acid must raise it (common-ion effect)", s["name"], gb, ga)
		}
	}
	text := mustRun(t, 0, "", "dose", "--demo", "--reagent", "hcl", "--target", "lsi=0.5").stdout
	for _, want := range []string{"mg/L of hcl", "Larson–Skold", "SDS"} {
		if !strings.Contains(text, want) {
			t.Errorf("dose text lacks %q", want)
		}
	}
	mustRun(t, 2, "", "dose", "--demo", "--reagent", "vinegar", "--target", "ph=7")
	mustRun(t, 2, "", "dose", "--demo", "--reagent", "h2so4", "--target", "ph")
	mustRun(t, 2, "", "dose", "--demo", "--reagent", "h2so4", "--target", "ph=7", "--strength", "140")
}

// TestCyclesCommand: the design's cycles contract — name, max_cycles,
// limiting, points[{cycles, saturation_index}] — with the limit profiles
// and carbonate rules.
func TestCyclesCommand(t *testing.T) {
	r := mustRun(t, 0, "", "cycles", "--demo", "--limits", "inhibitor", "--carbonate", "natural", "--max", "6", "--format", "json")
	samples := decodeSamples(t, r.stdout)
	s := samples[0]
	for _, k := range []string{"name", "max_cycles", "limiting", "points"} {
		if _, ok := s[k]; !ok {
			t.Errorf("key %q missing", k)
		}
	}
	if mc := s["max_cycles"].(float64); !(mc > 1 && mc < 6) {
		t.Errorf("makeup: max_cycles %g, want between 1 and 6", mc)
	}
	if s["limiting"] != "si:calcite" {
		t.Errorf("makeup: limiting %v, want si:calcite (natural tower pH rises with cycles)", s["limiting"])
	}
	pts := s["points"].([]any)
	p0 := pts[0].(map[string]any)
	if p0["cycles"].(float64) != 1 {
		t.Errorf("first point at %v cycles, want 1", p0["cycles"])
	}
	if _, ok := p0["saturation_index"].(map[string]any)["calcite"]; !ok {
		t.Errorf("points lack saturation_index.calcite")
	}
	for _, mode := range []string{"closed", "air", "ph=7.8", "relation=1.465,4.54"} {
		mustRun(t, 0, "", "cycles", "--demo", "--carbonate", mode, "--max", "4", "--step", "1")
	}
	mustRun(t, 2, "", "cycles", "--demo", "--carbonate", "sealed")
	mustRun(t, 2, "", "cycles", "--demo", "--limits", "no-such-profile")
	text := mustRun(t, 0, "", "cycles", "--demo", "--evaporation", "20", "--max", "5").stdout
	if !strings.Contains(text, "cycles of concentration") || !strings.Contains(text, "blowdown") {
		t.Errorf("cycles text lacks the plain-word answer or make-up/blowdown:\n%s", text)
	}
}

// TestSweepCommand: one axis and a grid, JSON points carry the swept
// variables and every saturation index.
func TestSweepCommand(t *testing.T) {
	r := mustRun(t, 0, "", "sweep", "--demo", "--vary", "temperature=20:80:4", "--format", "json")
	s := decodeSamples(t, r.stdout)[0]
	pts := s["points"].([]any)
	if len(pts) != 4 {
		t.Fatalf("%d points, want 4", len(pts))
	}
	first, last := pts[0].(map[string]any), pts[3].(map[string]any)
	if first["temperature_c"].(float64) != 20 || last["temperature_c"].(float64) != 80 {
		t.Errorf("temperatures %v … %v", first["temperature_c"], last["temperature_c"])
	}
	c0 := first["saturation_index"].(map[string]any)["calcite"].(float64)
	c3 := last["saturation_index"].(map[string]any)["calcite"].(float64)
	if !(c3 > c0) {
		t.Errorf("calcite SI %g at 20 °C, %g at 80 °C: want a rise (retrograde solubility)", c0, c3)
	}
	g := mustRun(t, 0, "", "sweep", "--demo", "--vary", "temperature=30:60:2", "--vary", "cycles=1:3:3", "--format", "csv").stdout
	if lines := strings.Count(strings.TrimSpace(g), "\n"); lines != 3*2*3 {
		t.Errorf("grid CSV has %d data lines, want 18 (3 samples × 2 × 3)", lines)
	}
	mustRun(t, 0, "", "sweep", "--demo", "--vary", "dose=0:60:4", "--reagent", "h2so4")
	mustRun(t, 0, "", "sweep", "--demo", "--vary", "fraction=0:1:3", "--partner", demoCSV)
	mustRun(t, 2, "", "sweep", "--demo", "--vary", "dose=0:60:4")
	mustRun(t, 2, "", "sweep", "--demo", "--vary", "pressure=1:2:3")
	mustRun(t, 2, "", "sweep", "--demo")
}

// TestBlendCommand: a blend of a water with itself is that water; the
// blend JSON is the assess object.
func TestBlendCommand(t *testing.T) {
	r := mustRun(t, 0, "", "blend", demoCSV, demoCSV, "--fraction", "0.3", "--format", "json")
	blend := decodeSamples(t, r.stdout)[0]
	a := mustRun(t, 0, "", "assess", "--demo", "--format", "json")
	self := decodeSamples(t, a.stdout)[0]
	bt := blend["totals"].(map[string]any)
	for k, v := range self["totals"].(map[string]any) {
		if math.Abs(bt[k].(float64)/v.(float64)-1) > 1e-5 {
			t.Errorf("blend of the makeup with itself: %s %v, makeup %v", k, bt[k], v)
		}
	}
	for _, k := range []string{"name", "ph", "saturation_index", "indices", "totals", "warnings", "error"} {
		if _, ok := blend[k]; !ok {
			t.Errorf("blend JSON lacks %q", k)
		}
	}
	mustRun(t, 2, "", "blend", demoCSV, demoCSV, "--fraction", "1.5")
	mustRun(t, 2, "", "blend", demoCSV, demoCSV, demoCSV)
	mustRun(t, 2, "", "blend", demoCSV, demoCSV, "--sample", "nobody")
	// One input: its first two samples (the demo serves every command).
	one := decodeSamples(t, mustRun(t, 0, "", "blend", "--demo", "--fraction", "0.5", "--format", "json").stdout)[0]
	if !strings.Contains(one["name"].(string), "makeup") || !strings.Contains(one["name"].(string), "tower") {
		t.Errorf("blend --demo: name %v, want the makeup and the tower", one["name"])
	}
}

// TestDecisionInputErrors: impossible settings are bad input (exit 2), never
// a hang or an internal failure.
func TestDecisionInputErrors(t *testing.T) {
	mustRun(t, 2, "", "cycles", "--demo", "--step", "1e-300", "--max", "2")
	mustRun(t, 2, "", "cycles", "--demo", "--carbonate", "relation=1e308,1")
	mustRun(t, 2, "", "cycles", "--demo", "--carbonate", "ph=7.5", "--reagent", "naoh")
	mustRun(t, 2, "", "assess", "--demo", "--flow", "Inf")
	mustRun(t, 2, "", "sweep", "--demo", "--vary", "temperature=20:30:2", "--vary", "temperature=40:50:2")
	mustRun(t, 2, "", "dose", "--demo", "--reagent", "h2so4", "--target", "ph=7", "--carbonate", "natural")
	// pH and alkalinity that cannot fit (pH 11.5 with 5 mg/L alkalinity):
	// located on stderr, exit 2.
	bad := "name,temperature [C],pH,Ca [mg/L],Na [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\nstrange,25,11.5,10,20,30,5\n"
	r := mustRun(t, 2, bad, "assess", "-")
	if !strings.Contains(r.stderr, "do not fit") {
		t.Errorf("stderr %q lacks the reason", r.stderr)
	}
	if r := runCLI(t, "", "minerals", "--help"); !strings.Contains(r.stdout, "advisory") {
		t.Errorf("minerals --help lacks the caution")
	}
}

// TestAcidWater: a pH 3 water with no alkalinity is computed with carbon in
// equilibrium with air CO2, says so, and gives no classic indices (they need
// alkalinity) rather than absurd ones.
func TestAcidWater(t *testing.T) {
	acid := "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Fe [mg/L],SO4 [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"Invented pit water,20,3.0,200,80,20,200,1500,10,0\n"
	r := mustRun(t, 0, acid, "assess", "-", "--format", "json")
	s := decodeSamples(t, r.stdout)[0]
	w := strings.Join(func() []string {
		var out []string
		for _, x := range s["warnings"].([]any) {
			out = append(out, x.(string))
		}
		return out
	}(), " ")
	if !strings.Contains(w, "air CO2") {
		t.Errorf("warnings %q lack the air-CO2 note", w)
	}
	if lp := s["log_pco2"].(float64); math.Abs(lp+3.4) > 0.01 {
		t.Errorf("log pCO2 %g, want −3.4 (air)", lp)
	}
	if ix, ok := s["indices"].(map[string]any); ok && ix["larson_skold"] != nil {
		t.Errorf("Larson–Skold given for a water without alkalinity: %v", ix)
	}
}

// TestAssessCarbonateModes: the evaluation modes of the engine reach the
// command line — air (log pCO2 −3.4), a given pCO2, charge balance and a
// fixed pH.
func TestAssessCarbonateModes(t *testing.T) {
	get := func(mode, key string) float64 {
		s := decodeSamples(t, mustRun(t, 0, "", "assess", "--demo", "--carbonate", mode, "--format", "json").stdout)[0]
		return s[key].(float64)
	}
	if v := get("air", "log_pco2"); math.Abs(v+3.4) > 1e-3 {
		t.Errorf("air: log_pco2 %g, want −3.4", v)
	}
	if v := get("pco2=-2", "log_pco2"); math.Abs(v+2) > 1e-3 {
		t.Errorf("pco2=-2: log_pco2 %g, want −2", v)
	}
	if v := get("ph=7.5", "ph"); v != 7.5 {
		t.Errorf("ph=7.5: ph %g", v)
	}
	if v := get("charge", "charge_balance_percent"); math.Abs(v) > 5 {
		t.Errorf("charge: the lab ion balance %g %% is reported as read", v)
	}
	mustRun(t, 2, "", "assess", "--demo", "--carbonate", "sealed")
}

// TestSweepFollowsCyclesRule: a cycles sweep under a tower rule gives the
// same water as the cycles search at the same number of cycles.
func TestSweepFollowsCyclesRule(t *testing.T) {
	sw := decodeSamples(t, mustRun(t, 0, "", "sweep", "--demo", "--vary", "cycles=1:3:3", "--carbonate", "natural", "--format", "json").stdout)[0]
	cy := decodeSamples(t, mustRun(t, 0, "", "cycles", "--demo", "--carbonate", "natural", "--max", "3", "--step", "1", "--format", "json").stdout)[0]
	sp := sw["points"].([]any)[2].(map[string]any)
	cp := cy["points"].([]any)[2].(map[string]any)
	if sp["ph"] != cp["ph"] {
		t.Errorf("3 cycles, natural rule: sweep pH %v, cycles pH %v", sp["ph"], cp["ph"])
	}
	mustRun(t, 2, "", "sweep", "--demo", "--vary", "temperature=20:40:3", "--carbonate", "natural")
}
