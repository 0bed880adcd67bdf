package reports_test

import (
	"path/filepath"
	"testing"

	"scalerisk/reports"
	"scalerisk/uncertainty"
)

// TestBrowserRendersRanges: the demo report with draws of the analysis
// draws its range charts in headless Chromium, with no overlapping labels
// and no text outside the charts, on screen and in print (the checks of
// TestBrowserRendersReports).
func TestBrowserRendersRanges(t *testing.T) {
	bin := findChromium(t)
	r := demoReport(t, demoAssessments(t))
	r.Options.Plan.Uncertainty = uncertainty.Settings{Draws: 40, Seed: 1}
	path := filepath.Join(t.TempDir(), "ranges.html")
	if err := reports.WriteHTMLFile(path, r); err != nil {
		t.Fatal(err)
	}
	want := []string{"s1-ranges", "s2-ranges", "s3-ranges"}
	checkRendered(t, bin, path, want)
	checkPrinted(t, bin, path, want)
}
