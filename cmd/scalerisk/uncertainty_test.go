package main

import (
	"encoding/json"
	"strings"
	"testing"
)

// TestAssessDraws: assess --draws gives every demo water an "uncertainty"
// object whose calcite interval brackets the central SI, with the seed
// reported; the same seed gives the same bytes with any --jobs; without
// --draws there is no such key.
func TestAssessDraws(t *testing.T) {
	args := []string{"assess", "--demo", "--format", "json", "--draws", "60", "--seed", "7"}
	r := mustRun(t, 0, "", append(args, "--jobs", "1")...)
	var doc struct {
		Samples []struct {
			Name            string             `json:"name"`
			SaturationIndex map[string]float64 `json:"saturation_index"`
			Uncertainty     *struct {
				Draws           int    `json:"draws"`
				Seed            uint64 `json:"seed"`
				SaturationIndex map[string]struct {
					Median, Low, High float64
					PPositive         *float64 `json:"p_positive"`
				} `json:"saturation_index"`
				Narrowing string `json:"narrowing_input"`
			} `json:"uncertainty"`
		} `json:"samples"`
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	for _, s := range doc.Samples {
		u := s.Uncertainty
		if u == nil || u.Draws != 60 || u.Seed != 7 {
			t.Fatalf("%s: uncertainty %+v", s.Name, u)
		}
		c, si := u.SaturationIndex["calcite"], s.SaturationIndex["calcite"]
		if !(c.Low <= si && si <= c.High) || c.PPositive == nil || u.Narrowing == "" {
			t.Errorf("%s: calcite SI %.3f, interval [%.3f, %.3f], P %v, narrowing %q", s.Name, si, c.Low, c.High, c.PPositive, u.Narrowing)
		}
	}
	if again := mustRun(t, 0, "", append(args, "--jobs", "2")...); again.stdout != r.stdout {
		t.Errorf("--seed 7 gives other bytes with --jobs 2 than with --jobs 1")
	}
	if plain := mustRun(t, 0, "", "assess", "--demo", "--format", "json"); strings.Contains(plain.stdout, `"uncertainty"`) {
		t.Errorf("assess without --draws writes an uncertainty key")
	}
	for _, bad := range [][]string{{"--draws", "5"}, {"--draws", "50", "--confidence", "100"}, {"--draws", "50", "--uncertainty", "-1"}} {
		mustRun(t, 2, "", append([]string{"assess", "--demo"}, bad...)...)
	}
}

// TestDecisionDraws: dose and cycles --draws state the answer at the
// confidence in text, JSON and CSV.
func TestDecisionDraws(t *testing.T) {
	r := mustRun(t, 0, "", "dose", "--demo", "--reagent", "h2so4", "--target", "lsi=0.5", "--draws", "30", "--skin-temperature", "0")
	if !strings.Contains(r.stdout, "With 90 % confidence,") {
		t.Errorf("dose text lacks the answer at 90 %% confidence:\n%s", r.stdout)
	}
	r = mustRun(t, 0, "", "cycles", "--demo", "--draws", "30", "--confidence", "80", "--format", "json", "--skin-temperature", "0")
	if !strings.Contains(r.stdout, `"max_cycles_at_confidence"`) || !strings.Contains(r.stdout, `"confidence":0.8`) {
		t.Errorf("cycles JSON lacks the answer at 80 %% confidence:\n%.400s", r.stdout)
	}
	r = mustRun(t, 0, "", "cycles", "--demo", "--draws", "30", "--format", "csv", "--skin-temperature", "0")
	if !strings.Contains(strings.SplitN(r.stdout, "\n", 2)[0], "max_cycles_at_confidence") {
		t.Errorf("cycles CSV header lacks max_cycles_at_confidence")
	}
}

// TestReportDraws: report --draws shows the range columns of the SI table,
// the range chart and the part on how sure the answers are; without
// --draws none of them.
func TestReportDraws(t *testing.T) {
	r := mustRun(t, 0, "", "report", "--demo", "--draws", "30", "-o", "-")
	for _, want := range []string{"5–95 % range", `id="s1-ranges"`, "How sure are these answers", "with 90 % confidence"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("report --draws lacks %q", want)
		}
	}
	plain := mustRun(t, 0, "", "report", "--demo", "-o", "-")
	for _, absent := range []string{"% range", "-ranges", "How sure are these answers"} {
		if strings.Contains(plain.stdout, absent) {
			t.Errorf("report without --draws shows %q", absent)
		}
	}
}
