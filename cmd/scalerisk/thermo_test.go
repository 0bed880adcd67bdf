package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"
)

func TestActivityModel(t *testing.T) {
	doc := decodeAssess(t, mustRun(t, exitOK, "", "assess", "--demo", "--format", "json", "--activity", "bdot").stdout)
	for _, s := range doc.Samples {
		if s.ActivityModel != "bdot" {
			t.Errorf("%s: activity_model = %q, want bdot", s.Name, s.ActivityModel)
		}
	}

	// Pitzer runs on request for every sample and is reported.
	doc = decodeAssess(t, mustRun(t, exitOK, "", "assess", "--demo", "--format", "json", "--activity", "pitzer").stdout)
	if len(doc.Samples) != len(demoSamples) {
		t.Fatalf("pitzer: %d samples, want %d", len(doc.Samples), len(demoSamples))
	}
	for _, s := range doc.Samples {
		if s.Error != nil || s.ActivityModel != "pitzer" {
			t.Errorf("pitzer: %s: activity_model = %q, error %v; want pitzer and no error", s.Name, s.ActivityModel, s.Error)
		}
	}

	// A brine (an invented produced water, I ≈ 2.5 mol/kg) goes to Pitzer
	// automatically.
	brine := "name,temperature [C],pH,pH_temperature [C],Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"Invented produced water,60,6.8,25,6000,800,42000,400,80000,300,250\n"
	doc = decodeAssess(t, runCLI(t, brine, "assess", "-", "--format", "json").stdout)
	if len(doc.Samples) != 1 || doc.Samples[0].ActivityModel != "pitzer" {
		t.Errorf("brine: samples %+v, want one with activity_model pitzer", doc.Samples)
	}
}

func TestMinerals(t *testing.T) {
	// A fresh command tree per test: no state carried between runs.
	root := newRootCmd(strings.NewReader(""))
	var out, errOut bytes.Buffer
	root.SetArgs([]string{"minerals"})
	root.SetOut(&out)
	root.SetErr(&errOut)
	cmd, err := root.ExecuteC()
	if err != nil {
		t.Fatalf("minerals: %v", err)
	}
	if cmd.Name() != "minerals" {
		t.Errorf("ran %q, want minerals", cmd.Name())
	}
	lines := strings.Split(out.String(), "\n")
	for _, m := range requiredMinerals {
		i := slices.IndexFunc(lines, func(l string) bool { return strings.HasPrefix(l, m+" ") })
		if i < 0 {
			t.Errorf("minerals does not list %s", m)
			continue
		}
		if !regexp.MustCompile(`[A-Z][a-z]+.* (19|20)\d\d`).MatchString(lines[i]) {
			t.Errorf("minerals: %s has no source (author and year): %q", m, lines[i])
		}
	}

	r := mustRun(t, exitOK, "", "minerals", "--format", "json")
	var doc struct {
		Minerals []map[string]json.RawMessage `json:"minerals"`
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatalf("minerals --format json: %v", err)
	}
	found := map[string]bool{}
	for _, m := range doc.Minerals {
		var name, source string
		var logK float64
		if err := json.Unmarshal(m["name"], &name); err != nil {
			t.Errorf("mineral without a name: %v", m)
		}
		if err := json.Unmarshal(m["log_k_25"], &logK); err != nil {
			t.Errorf("%s: log_k_25 = %s, want a number", name, m["log_k_25"])
		}
		if err := json.Unmarshal(m["source"], &source); err != nil || strings.TrimSpace(source) == "" {
			t.Errorf("%s: source = %s, want a citation", name, m["source"])
		}
		found[name] = true
		// Plummer, L.N. and Busenberg, E. (1982) GCA 46:1011: calcite
		// log Ksp(25 °C) = −8.48 [READ].
		if name == "calcite" && logK != -8.48 {
			t.Errorf("log K(calcite, 25 °C) = %.3f, want -8.480 (Plummer & Busenberg 1982)", logK)
		}
	}
	for _, m := range requiredMinerals {
		if !found[m] {
			t.Errorf("minerals --format json lacks %s", m)
		}
	}
}

const thermoHeader = "name,phase,formula,equation,log_k_25,delta_h_kj,a1,a2,a3,a4,a5,a6,t_min_c,t_max_c,ion_size,b_tj,source\n"

func TestThermoFile(t *testing.T) {
	dir := t.TempDir()
	// Christ, C.L., Hostetler, P.B. and Siebert, R.M. (1974): calcite
	// log Ksp(25 °C) = −8.52 (as quoted in data/thermo.csv [READ]); a
	// constant log K, evaluated at 25 °C only.
	older := filepath.Join(dir, "christ1974.csv")
	if err := os.WriteFile(older, []byte(thermoHeader+
		"calcite,mineral,CaCO3,calcite = Ca[2+] + CO3[2-],-8.52,,,,,,,,0,100,,,Christ Hostetler & Siebert 1974\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	// SI = log IAP − log K: at 25 °C log K goes from −8.48 (Plummer &
	// Busenberg 1982, used by the ion-association set, --activity davies,
	// and by the Pitzer set of the automatic treatment) to −8.52, so SI
	// rises by 0.04 under either; each SI is rounded to 0.001.
	for _, tc := range []struct {
		activity  string
		wantShift float64
	}{{"davies", 0.04}, {"auto", 0.04}} {
		args := []string{"assess", "--demo", "--format", "json", "--temperature", "25", "--activity", tc.activity}
		def := decodeAssess(t, mustRun(t, exitOK, "", args...).stdout)
		alt := decodeAssess(t, mustRun(t, exitOK, "", append(args, "--thermo", older)...).stdout)
		checkCalciteShift(t, def, alt, tc.wantShift)
	}

	m := mustRun(t, exitOK, "", "minerals", "--format", "csv", "--thermo", older)
	rows, err := csv.NewReader(strings.NewReader(m.stdout)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	i := slices.IndexFunc(rows, func(r []string) bool { return r[0] == "calcite" })
	if i < 0 || rows[i][3] != "-8.520" || !strings.Contains(rows[i][7], "Christ") {
		t.Errorf("minerals --thermo: calcite row = %v, want log K -8.520 from Christ et al.", rows[max(i, 0)])
	}

	broken := filepath.Join(dir, "broken.csv")
	if err := os.WriteFile(broken, []byte(thermoHeader+
		"calcite,mineral,CaCO3,calcite = Ca[2+] + CO3[2-],-8.5x2,,,,,,,,0,100,,,typo\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, cmd := range [][]string{{"assess", "--demo"}, {"minerals"}} {
		r := mustRun(t, exitBadInput, "", append(cmd, "--thermo", broken)...)
		if want := broken + ":2:5:"; !strings.Contains(r.stderr, want) || !strings.Contains(r.stderr, "-8.5x2") {
			t.Errorf("%s --thermo broken: stderr = %q, want %s and the bad value", cmd[0], r.stderr, want)
		}
	}
	r := mustRun(t, exitBadInput, "", "assess", "--demo", "--thermo", filepath.Join(dir, "absent.csv"))
	if !strings.Contains(r.stderr, "absent.csv") {
		t.Errorf("missing thermo file: stderr = %q, want the file named", r.stderr)
	}
}

// checkCalciteShift checks that replacing calcite's constant moved its SI
// by wantShift and left aragonite alone.
func checkCalciteShift(t *testing.T, def, alt assessDoc, wantShift float64) {
	t.Helper()
	const tol = 0.0015
	for i, a := range alt.Samples {
		d := def.Samples[i]
		shift := a.SaturationIndex["calcite"] - d.SaturationIndex["calcite"]
		if math.Abs(shift-wantShift) > tol {
			t.Errorf("%s: SI(calcite, 25 °C) shift with log K −8.52 = %+.3f, want %+.3f ± %.4f (Christ et al. 1974 vs the set's own constant)",
				a.Name, shift, wantShift, tol)
		}
		if a.SaturationIndex["aragonite"] != d.SaturationIndex["aragonite"] {
			t.Errorf("%s: aragonite SI changed (%.3f → %.3f) though only calcite was replaced",
				a.Name, d.SaturationIndex["aragonite"], a.SaturationIndex["aragonite"])
		}
	}

}
