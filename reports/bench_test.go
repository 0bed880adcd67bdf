package reports_test

import (
	"io"
	"testing"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// BenchmarkWriteSample is the writing of one assessed sample of the demo
// cooling-tower water in each format, as assess writes a row: the serial
// part of a batch that the ordered writer does while the workers compute
// (scripts/bench.sh sets it against one assessment).
func BenchmarkWriteSample(b *testing.B) {
	f, err := water.OpenDemo()
	if err != nil {
		b.Fatal(err)
	}
	defer f.Close()
	recs, _, err := water.Read("demo.csv", f, water.ReadOptions{})
	if err != nil || len(recs) < 2 {
		b.Fatalf("demo: %v", err)
	}
	a := saturation.AssessAnalysis(recs[1].Analysis, saturation.Options{})
	if a.Err != nil {
		b.Fatal(a.Err)
	}
	var minerals []string
	for _, e := range saturation.DefaultTable().Minerals() {
		minerals = append(minerals, e.Name)
	}
	for _, format := range []reports.Format{reports.CSV, reports.JSON, reports.Text} {
		b.Run(format.String(), func(b *testing.B) {
			w := reports.NewAssessWriter(io.Discard, format, minerals, reports.WriteOptions{})
			for b.Loop() {
				if err := w.Write(a); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
