package reports_test

import (
	"bytes"
	"html"
	"regexp"
	"strings"
	"testing"

	"scalerisk/plan"
	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/uncertainty"
	"scalerisk/water"
)

// visibleText is the text a reader sees in a page: without the style, the
// scripts (the chart library and the chart options) and the markup, with
// the entities decoded. The chart options are checked separately.
func visibleText(page string) string {
	for _, block := range []string{"style", "script"} {
		re := regexp.MustCompile(`(?s)<` + block + `[^>]*>.*?</` + block + `>`)
		page = re.ReplaceAllString(page, " ")
	}
	page = regexp.MustCompile(`(?s)<details>.*?</details>`).ReplaceAllString(page, " ") // the licence
	page = regexp.MustCompile(`<[^>]+>`).ReplaceAllString(page, " ")
	return html.UnescapeString(page)
}

// clientWordChecks are what client text must never hold (issue 13; the
// "client text is a product" rule of the style notes): a command-line flag,
// a raw key of the tables (a snake_case mineral or quantity key, a
// target or rule written as the command line takes it), a bracketed
// provenance tag of the data files, and a plural after the count 1.
var clientWordChecks = []struct {
	what string
	re   *regexp.Regexp
}{
	{"a command-line flag", regexp.MustCompile(`(^|[\s(])--[a-z]`)},
	{"a snake_case key", regexp.MustCompile(`\b[a-z][a-z0-9]*_[a-z0-9_]+\b`)},
	{"a target or rule as typed", regexp.MustCompile(`\b(lsi|rsi|psi|ph|si:[a-z]+)=`)},
	{"a reagent key", regexp.MustCompile(`\b(h2so4|hcl|naoh|caoh2|na2co3|nahco3|h3po4|cacl2)\b`)},
	{"a provenance tag", regexp.MustCompile(`\[(READ|FROM MEMORY|COMPUTED)`)},
	{"a plural after 1", regexp.MustCompile(`\b1 (samples|charts|points|minerals|waters|cycles of|dates)\b`)},
}

// clientText fails t when text holds any of clientWordChecks.
func checkClientText(t *testing.T, name, text string) {
	t.Helper()
	for _, c := range clientWordChecks {
		for _, loc := range c.re.FindAllStringIndex(text, 5) {
			t.Errorf("%s: %s in client text: …%s…", name, c.what, strings.TrimSpace(text[max(0, loc[0]-60):min(len(text), loc[1]+40)]))
		}
	}
}

// TestClientText writes the demo report with every part a report can have
// (dose to a target, highest cycles, a blend with its safe share, all judged
// at a 60 °C tube wall too, a failed blend) under each
// profile, and checks its visible text and chart labels for the tool's own
// words.
func TestClientText(t *testing.T) {
	as := demoAssessments(t)
	target, err := saturation.ParseTarget("lsi=0.5", nil)
	if err != nil {
		t.Fatal(err)
	}
	caustic, err := water.LookupReagent("naoh")
	if err != nil {
		t.Fatal(err)
	}
	for _, profileName := range []string{"inhibitor", "no-inhibitor"} {
		profile, err := saturation.LimitProfileNamed(profileName)
		if err != nil {
			t.Fatal(err)
		}
		rule, _ := saturation.ParseCarbonateRule("ph=7.8")
		for _, settings := range []plan.Settings{
			{Target: &target, Profile: &profile, CyclesRule: &rule, Partner: &as[0].Input, BlendFraction: 0.4,
				Speciation: saturation.Options{Skin: 60}},
			{Reagent: caustic, Target: &target, Profile: &profile},
			{Target: &target, Profile: &profile, Uncertainty: uncertainty.Settings{Draws: 30, Seed: 1}},
		} {
			var buf bytes.Buffer
			hw, err := reports.NewHTMLWriter(reports.Report{Client: "Kestrel Fen Energy Centre",
				Options: reports.HTMLOptions{Plan: settings}})
			if err != nil {
				t.Fatal(err)
			}
			for _, a := range as {
				if err := hw.Add(plan.Compute(a, settings)); err != nil {
					t.Fatal(err)
				}
			}
			if err := hw.Finish(&buf); err != nil {
				t.Fatal(err)
			}
			page := buf.String()
			name := profileName + ", " + settings.ReagentOrDefault().Label
			checkClientText(t, name, visibleText(page))
			// Chart labels: panel titles, axis names, legends.
			for id, opt := range chartOptions(t, page) {
				labels := regexp.MustCompile(`"(?:text|name|label)":"([^"]*)"`).FindAllStringSubmatch(string(opt), -1)
				var all []string
				for _, l := range labels {
					all = append(all, l[1])
				}
				checkClientText(t, name+", chart "+id, strings.Join(all, " · "))
			}
			if i := strings.Index(visibleText(page), "inhibitor reach"); profileName == "no-inhibitor" && i >= 0 {
				text := visibleText(page)
				t.Errorf("%s: band words speak of inhibitors under the no-inhibitor limits: …%s…", name, text[max(0, i-200):i+20])
			}
		}
	}
}

// TestClientTextCatches: the checks find what they look for (an invented
// sentence with each fault).
func TestClientTextCatches(t *testing.T) {
	for _, bad := range []string{"give --flow to see kg/day", "tricalcium_phosphate is past", "the dose to lsi=0.5",
		"add h2so4", "Nordstrom 1990 [FROM MEMORY]", "1 samples"} {
		found := false
		for _, c := range clientWordChecks {
			found = found || c.re.MatchString(bad)
		}
		if !found {
			t.Errorf("no check catches %q", bad)
		}
	}
}
