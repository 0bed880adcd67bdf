package water_test

import (
	"errors"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestNormalizeDate reads the date layouts laboratories write. Serial day
// numbers: 45292 is 1 January 2024 and 25569 is 1 January 1970 in the
// spreadsheet 1900 date system (ECMA-376 Part 1 §18.17.4.1; both from
// memory).
func TestNormalizeDate(t *testing.T) {
	for _, c := range []struct{ format, in, want string }{
		{"", "2026-02-14", "2026-02-14"}, // ISO kept as written
		{"", "2026-02-14T08:30:00Z", "2026-02-14T08:30:00Z"},
		{"DD/MM/YYYY", "2026-02-14", "2026-02-14"}, // ISO read whatever the format
		{"DD/MM/YYYY", "14/02/2026", "2026-02-14"},
		{"DD/MM/YYYY", "3/2/2026", "2026-02-03"}, // one-digit day and month
		{"DD/MM/YYYY", "14/02/2026 08:30", "2026-02-14 08:30"},
		{"MM/DD/YYYY", "2/14/2026", "2026-02-14"},
		{"MM/DD/YYYY", "02/03/2026", "2026-02-03"},
		{"dd.mm.yyyy", "14.02.2026", "2026-02-14"}, // case ignored
		{"DD.MM.YYYY", "14.02.2026 08:30:15", "2026-02-14 08:30:15"},
		{"DD-MM-YYYY", "14-02-2026", "2026-02-14"},
		{"DD/MM/YY", "14/02/26", "2026-02-14"},
		{"serial", "45292", "2024-01-01"},
		{"serial", "25569", "1970-01-01"},
		{"serial", "46067.5", "2026-02-14 12:00"},
		{"serial", " ", ""},
	} {
		f, err := water.ParseDateFormat(c.format)
		if err != nil {
			t.Fatal(err)
		}
		got, err := water.NormalizeDate(c.in, f)
		if err != nil || got != c.want {
			t.Errorf("NormalizeDate(%q, %s) = %q, %v; want %q", c.in, f, got, err, c.want)
		}
	}
}

// TestNormalizeDateRefused: without --date-format a date in another layout
// is refused, naming the format that reads it (both for an ambiguous day
// and month); with one, a cell that does not match is refused.
func TestNormalizeDateRefused(t *testing.T) {
	for _, c := range []struct{ format, in, want string }{
		{"", "14/02/2026", "give --date-format DD/MM/YYYY"},
		{"", "2/14/2026", "give --date-format MM/DD/YYYY"},
		{"", "03/02/2026", "day and month ambiguous (3 February or 2 March): give --date-format DD/MM/YYYY or MM/DD/YYYY"},
		{"", "03.02.2026", "give --date-format DD.MM.YYYY or MM.DD.YYYY"},
		{"", "46067", "give --date-format serial"},
		{"", "Feb 2026", "not a date: write YYYY-MM-DD"},
		{"DD/MM/YYYY", "2/14/2026", "not a date in the --date-format DD/MM/YYYY"},
		{"MM/DD/YYYY", "31/12/2026", "not a date in the --date-format MM/DD/YYYY"},
		{"serial", "14/02/2026", "not a spreadsheet serial date"},
		{"serial", "60", "not a spreadsheet serial date"}, // the 1900 leap-day bug is before the first serial read
	} {
		f, err := water.ParseDateFormat(c.format)
		if err != nil {
			t.Fatal(err)
		}
		got, err := water.NormalizeDate(c.in, f)
		if !errors.Is(err, water.ErrDateFormat) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("NormalizeDate(%q, %s) = %q, %v; want an error saying %q", c.in, f, got, err, c.want)
		}
	}
	if _, err := water.ParseDateFormat("DD/MM"); err == nil {
		t.Errorf("ParseDateFormat(DD/MM) accepted")
	}
}

// TestReadDates reads invented Kestrel Fen files with day-first dates:
// without --date-format the rows are refused naming file, line and column
// (and the other rows computed); with it, every row is read and its date
// written as ISO.
func TestReadDates(t *testing.T) {
	const path = "testdata/lab/kestrel_fen_dates.csv"
	records, _, err := csvReadFile(t, path, water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want := []string{
		"",
		path + `:3:2: column "Date": value "03/02/2026": date not read: day and month ambiguous (3 February or 2 March): give --date-format DD/MM/YYYY or MM/DD/YYYY`,
		path + `:4:2: column "Date": value "14/02/2026 08:30": date not read: not ISO (YYYY-MM-DD): give --date-format DD/MM/YYYY`,
	}
	for i, r := range records {
		got := ""
		if r.Err != nil {
			got = r.Err.Error()
		}
		if got != want[i] {
			t.Errorf("row %d: error %q, want %q", i+1, got, want[i])
		}
	}
	f, _ := water.ParseDateFormat("DD/MM/YYYY")
	records, _, err = csvReadFile(t, path, water.ReadOptions{Dates: f})
	if err != nil {
		t.Fatal(err)
	}
	for i, w := range []string{"2026-02-14", "2026-02-03", "2026-02-14 08:30"} {
		if r := records[i]; r.Err != nil || r.Analysis.Date != w {
			t.Errorf("row %d: date %q, error %v; want %q", i+1, r.Analysis.Date, r.Err, w)
		}
	}
	long, _ := water.ParseDateFormat("serial")
	records, _, err = csvReadFile(t, "testdata/lab/kestrel_fen_serial_long.csv", water.ReadOptions{Dates: long})
	if err != nil {
		t.Fatal(err)
	}
	if len(records) != 2 || records[0].Analysis.Date != "2026-02-14" || records[1].Analysis.Date != "2026-02-15" {
		t.Errorf("long form with serial dates: %+v", records)
	}
}
