package water_test

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"scalerisk/water"
)

// streamed is what Records yields, sorted into Read's three results.
func streamed(t *testing.T, path string) (records []water.Record, problems []error, fatal error) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var errs []error
	lastErr := false
	for rec, err := range water.Records(path, f, water.ReadOptions{}) {
		lastErr = err != nil
		if err != nil {
			errs = append(errs, err)
			continue
		}
		records = append(records, rec)
	}
	if lastErr {
		fatal, errs = errs[len(errs)-1], errs[:len(errs)-1]
	}
	return records, errs, fatal
}

// TestRecordsAgreesWithRead reads every test file with Read and with Records:
// the same samples, problems and fatal error, in the same order (Records
// keeps the samples read before a fatal error, which Read drops).
func TestRecordsAgreesWithRead(t *testing.T) {
	var paths []string
	for _, dir := range []string{"testdata/good", "testdata/bad"} {
		m, err := filepath.Glob(filepath.Join(dir, "*.csv"))
		if err != nil {
			t.Fatal(err)
		}
		paths = append(paths, m...)
	}
	if len(paths) < 10 {
		t.Fatalf("only %d test files found", len(paths))
	}
	for _, path := range paths {
		t.Run(filepath.Base(path), func(t *testing.T) {
			want, wantProblems, wantErr := csvReadFile(t, path, water.ReadOptions{})
			got, problems, fatal := streamed(t, path)
			if (wantErr == nil) != (fatal == nil) || (wantErr != nil && wantErr.Error() != fatal.Error()) {
				t.Fatalf("Records fatal error %v, Read %v", fatal, wantErr)
			}
			if wantErr != nil {
				return
			}
			if !reflect.DeepEqual(errText(problems), errText(wantProblems)) {
				t.Errorf("Records problems %q, Read %q", errText(problems), errText(wantProblems))
			}
			if len(got) != len(want) {
				t.Fatalf("Records yields %d samples, Read returns %d", len(got), len(want))
			}
			for i := range got {
				if recordText(got[i]) != recordText(want[i]) {
					t.Errorf("sample %d: Records %+v, Read %+v", i, got[i], want[i])
				}
			}
		})
	}
}

func errText(errs []error) []string {
	var s []string
	for _, e := range errs {
		s = append(s, e.Error())
	}
	return s
}

// TestRecordsFatalAfterRows: a line over MaxLineBytes after two good rows
// stops the stream there, with the two rows already yielded and the error
// last, naming its line.
func TestRecordsFatalAfterRows(t *testing.T) {
	text := "name,Ca [mg/L]\nWell 1,40\nWell 2,41\nWell 3," + strings.Repeat("9", water.MaxLineBytes) + "\nWell 4,42\n"
	var names []string
	var fatal error
	for rec, err := range water.Records("in.csv", strings.NewReader(text), water.ReadOptions{}) {
		if fatal != nil {
			t.Fatalf("yield after the fatal error: %+v, %v", rec, err)
		}
		if err != nil {
			fatal = err
			continue
		}
		names = append(names, rec.Name)
	}
	if !reflect.DeepEqual(names, []string{"Well 1", "Well 2"}) {
		t.Errorf("samples before the error %q, want Well 1, Well 2", names)
	}
	var ie *water.InputError
	if !errors.As(fatal, &ie) || fatal.Error() != "in.csv:4: line longer than 1 MiB" {
		t.Errorf("fatal error %v, want in.csv:4: line longer than 1 MiB", fatal)
	}
}

// TestRecordsStopEarly: the consumer may stop after the first sample.
func TestRecordsStopEarly(t *testing.T) {
	text := "name,Ca [mg/L]\nWell 1,40\nWell 2,41\n"
	n := 0
	for rec, err := range water.Records("in.csv", strings.NewReader(text), water.ReadOptions{}) {
		if err != nil || rec.Name != "Well 1" {
			t.Fatalf("first yield %+v, %v; want Well 1", rec, err)
		}
		n++
		break
	}
	if n != 1 {
		t.Errorf("%d yields, want 1", n)
	}
}

// recordText prints rec in full, each measurement's analyte by value (the
// pointers of two reads differ).
func recordText(rec water.Record) string {
	entered := rec.Analysis.Entered
	rec.Analysis.Entered = nil
	text := fmt.Sprintf("%+v", rec)
	for _, m := range entered {
		a := *m.Analyte
		m.Analyte = nil
		text += fmt.Sprintf(" %+v %+v", a, m)
	}
	return text
}
