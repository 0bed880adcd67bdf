package main

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// kestrelBlendCSV are two invented Kestrel Fen waters: a hard, alkaline
// deep well and a soft, cool river intake (as saturation's
// TestBlendSkinGoverns).
const kestrelBlendCSV = "name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n" +
	"Kestrel Fen deep well 2,16,7.4,200,40,60,90,250,400,22\n" +
	"Kestrel Fen river intake,10,7.3,24,5,12,18,20,60,6\n"

// TestBlendCommandSkin: blend judges the blend and the safe share of the
// first water at the bulk and at --skin-temperature and says which
// governs, in new keys beside the assess object (whose keys stay). Calcite
// is less soluble hot (Plummer & Busenberg 1982: log Ksp falls with
// temperature; the bulk pH held at the skin, UFC 3-240-13FN Example B-1),
// so with a 60 °C tube wall the well water's safe share falls below the
// bulk answer and the skin governs; with --skin-temperature 0 the bulk
// answer is the decision. The text says the same in words.
func TestBlendCommandSkin(t *testing.T) {
	in := filepath.Join(t.TempDir(), "kestrel_blend.csv")
	if err := os.WriteFile(in, []byte(kestrelBlendCSV), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"blend", in, "--fraction", "0.3", "--limits", "no-inhibitor", "--format", "json"}
	hot := decodeSamples(t, mustRun(t, 0, "", args...).stdout)[0]
	cold := decodeSamples(t, mustRun(t, 0, "", append(args, "--skin-temperature", "0")...).stdout)[0]
	for _, k := range []string{"name", "ph", "saturation_index", "indices", "totals", "fraction", "blend_limits", "safe_fraction"} {
		if _, ok := hot[k]; !ok {
			t.Errorf("blend JSON lacks %q", k)
		}
	}
	hs, cs := hot["safe_fraction"].(map[string]any), cold["safe_fraction"].(map[string]any)
	if hs["governing"] != "skin" || hs["governing_temperature_c"] != 60.0 || hs["bound"] != "at_most" || hs["limiting"] != "si:calcite" {
		t.Errorf("safe_fraction with a 60 °C skin: governing %v at %v, bound %v, limiting %v; want the skin at 60 °C, at_most, si:calcite",
			hs["governing"], hs["governing_temperature_c"], hs["bound"], hs["limiting"])
	}
	f, ok1 := hs["fraction"].(float64)
	bulk, ok2 := hs["safe_fraction_bulk"].(float64)
	skin, ok3 := hs["safe_fraction_skin"].(float64)
	if !ok1 || !ok2 || !ok3 {
		t.Fatalf("safe_fraction: fraction %v, safe_fraction_bulk %v, safe_fraction_skin %v: want three numbers", hs["fraction"], hs["safe_fraction_bulk"], hs["safe_fraction_skin"])
	}
	if !(f < bulk) || math.Abs(f-skin) > 1e-4 {
		t.Errorf("safe share of the well %.4g (skin %.4g), want the skin answer, below the bulk answer %.4g (calcite less soluble hot)", f, skin, bulk)
	}
	if cf, ok := cs["fraction"].(float64); cs["governing"] != "bulk" || cs["skin_temperature_c"] != nil || !ok || math.Abs(cf-bulk) > 1e-4 {
		t.Errorf("safe_fraction judged at the bulk only: governing %v, skin %v, fraction %v; want the bulk, null, %.4g",
			cs["governing"], cs["skin_temperature_c"], cs["fraction"], bulk)
	}
	bl := hot["blend_limits"].(map[string]any)
	if bl["governing"] != "skin" || bl["within"] != false || bl["limiting"] != "si:calcite" {
		t.Errorf("blend at 30 %% well: %v", bl)
	}
	if n := len(hs["points"].([]any)); n != 21 {
		t.Errorf("%d points of the search, want 21 (0 to 1 by 0.05)", n)
	}
	// Both waters from standard input, read once (it once gave "-: empty
	// file", exit 2, reading it again for the second water).
	piped := decodeSamples(t, mustRun(t, 0, kestrelBlendCSV, "blend", "-", "--fraction", "0.3", "--limits", "no-inhibitor", "--format", "json").stdout)[0]
	if ps := piped["safe_fraction"].(map[string]any); ps["fraction"] != hs["fraction"] || piped["name"] != hot["name"] {
		t.Errorf("from standard input: %v, safe share %v; from the file: %v, %v", piped["name"], ps["fraction"], hot["name"], hs["fraction"])
	}
	text := mustRun(t, 0, "", "blend", in, "--fraction", "0.3", "--limits", "no-inhibitor").stdout
	for _, want := range []string{"past the limit for calcite (SI), at the 60 °C skin", "Safe share: at most", "Governed by the 60 °C skin"} {
		if !strings.Contains(text, want) {
			t.Errorf("blend text lacks %q:\n%s", want, text)
		}
	}
}
