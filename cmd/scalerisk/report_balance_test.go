package main

import (
	"encoding/json"
	"html"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// balanceTableRow is one ion row of the report's water-balance table.
var balanceTableRow = regexp.MustCompile(`<tr><td>([^<]+)</td><td>([^<]+)</td><td class="n">([^<]+)</td><td class="n">([^<]+)</td><td class="n">([^<]+)</td><td class="n">([^<]+)</td>(?:<td class="n">([^<]+)</td>)?<td>([^<]+)</td></tr>`)

// reportNumber parses a number as the report writes it ("−" for minus;
// "—" for none, NaN).
func reportNumber(t *testing.T, s string) float64 {
	t.Helper()
	s = strings.ReplaceAll(html.UnescapeString(s), "−", "-")
	if s == "—" {
		return math.NaN()
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("report number %q: %v", s, err)
	}
	return v
}

// TestReportWaterBalance: the demo report (invented Kestrel Fen waters)
// has a "Makeup and tower water balance" section for tower 1 against makeup
// well 2, and its numbers are those of the balance command on the same
// data with the same flow taken as the blowdown: the median cycles, every
// ion's makeup, tower, cycles, deficit and kg/day, in the balance's order,
// the ions missing (calcium and alkalinity: 175/61 = 2.87 and 188/182 =
// 1.03 cycles against 91/18.5 = 4.92 by magnesium, by hand) and calcium
// carbonate named as the likely deposit (common practice). Without a flow
// the kg/day column is left out.
func TestReportWaterBalance(t *testing.T) {
	r := mustRun(t, 0, "", "balance", "--demo", "--flow", "4", "--format", "json")
	var doc struct {
		Samples []struct {
			Tower, Makeup string
			Cycles        float64
			Ions          []struct {
				Ion             string
				Makeup, Tower   float64
				Cycles, Deficit float64
				DeficitKgPerDay *float64 `json:"deficit_kg_per_day"`
				Missing, Gained bool
			}
			Deposits []struct{ Name string }
		}
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Samples) != 1 {
		t.Fatalf("balance --demo: %d pairs, want 1", len(doc.Samples))
	}
	want := doc.Samples[0]
	dir := t.TempDir()
	for _, flow := range []string{"4", ""} {
		out := filepath.Join(dir, "r"+flow+".html")
		args := []string{"report", "--demo", "-o", out}
		if flow != "" {
			args = append(args, "--flow", flow)
		}
		mustRun(t, 0, "", args...)
		b, err := os.ReadFile(out)
		if err != nil {
			t.Fatal(err)
		}
		page := string(b)
		i, j := strings.Index(page, `<section id="water-balance"`), strings.Index(page, `<section id="methods"`)
		if i < 0 || j < i {
			t.Fatalf("flow %q: no water-balance section before the methods", flow)
		}
		sec := page[i:j]
		for _, s := range []string{"Makeup and tower water balance", html.EscapeString(want.Tower + " against " + want.Makeup),
			"Cycles of concentration: <strong>" + strconv.FormatFloat(want.Cycles, 'f', 2, 64) + "</strong>",
			"The likely deposit is calcium carbonate (CaCO3).", "Missing from the tower", "calcium and alkalinity",
			"chlorination", "acid feed"} {
			if !strings.Contains(sec, s) {
				t.Errorf("flow %q: the section lacks %q", flow, s)
			}
		}
		rows := balanceTableRow.FindAllStringSubmatch(sec, -1)
		if len(rows) != len(want.Ions) {
			t.Fatalf("flow %q: %d table rows, want %d (the balance's ions)", flow, len(rows), len(want.Ions))
		}
		const tol = 1e-9 // both sides round alike: 4 significant digits, cycles to 0.01, kg/day to 3 digits
		for k, row := range rows {
			ic := want.Ions[k]
			got := []float64{reportNumber(t, row[3]), reportNumber(t, row[4]), reportNumber(t, row[5]), reportNumber(t, row[6])}
			for n, w := range []float64{ic.Makeup, ic.Tower, ic.Cycles, ic.Deficit} {
				if math.Abs(got[n]-w) > tol*math.Max(1, math.Abs(w)) {
					t.Errorf("flow %q, %s (%s): column %d is %g, balance gives %g", flow, ic.Ion, row[1], n+3, got[n], w)
				}
			}
			switch {
			case flow == "" && row[7] != "":
				t.Errorf("flow %q, %s: a kg/day cell %q without a flow", flow, ic.Ion, row[7])
			case flow != "" && ic.DeficitKgPerDay != nil:
				if kg := reportNumber(t, row[7]); math.Abs(kg-*ic.DeficitKgPerDay) > tol*math.Max(1, math.Abs(kg)) {
					t.Errorf("flow %q, %s: %g kg/day, balance gives %g", flow, ic.Ion, kg, *ic.DeficitKgPerDay)
				}
			}
			if missing := row[8] == "missing from the tower"; missing != ic.Missing {
				t.Errorf("flow %q, %s: reading %q, balance says missing %v", flow, ic.Ion, row[8], ic.Missing)
			}
		}
		if len(want.Deposits) != 1 || want.Deposits[0].Name != "calcium carbonate" {
			t.Errorf("balance --demo deposits %v, want calcium carbonate", want.Deposits)
		}
	}
}
