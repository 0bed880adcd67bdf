package water

import (
	"errors"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"time"
)

// DateFormat is how the date cells of a file are written: the zero value
// reads ISO 8601 dates only (YYYY-MM-DD, with or without a time), any other
// layout must be named (ParseDateFormat).
type DateFormat struct {
	spec   string // as the user wrote it, upper case; "" for ISO only
	layout string // Go layout of the date part; "" for spreadsheet serials
	serial bool
}

// dateFormats are the layouts ParseDateFormat knows: day, month and year
// in the usual orders, with /, . or - between them. A time may follow
// (hh:mm or hh:mm:ss, after a space or a T).
var dateFormats = map[string]string{
	"DD/MM/YYYY": "2/1/2006", "MM/DD/YYYY": "1/2/2006", "YYYY/MM/DD": "2006/1/2",
	"DD.MM.YYYY": "2.1.2006", "MM.DD.YYYY": "1.2.2006", "YYYY.MM.DD": "2006.1.2",
	"DD-MM-YYYY": "2-1-2006", "MM-DD-YYYY": "1-2-2006", "YYYY-MM-DD": "2006-1-2",
	"DD/MM/YY": "2/1/06", "MM/DD/YY": "1/2/06", "DD.MM.YY": "2.1.06",
}

// ParseDateFormat returns the date format named s: one of DD/MM/YYYY,
// MM/DD/YYYY, YYYY/MM/DD, DD.MM.YYYY, MM.DD.YYYY, YYYY.MM.DD, DD-MM-YYYY,
// MM-DD-YYYY, YYYY-MM-DD, DD/MM/YY, MM/DD/YY, DD.MM.YY (a one-digit day or
// month is read too, and a time may follow), or "serial" for spreadsheet
// serial day numbers. Case and surrounding spaces are ignored; "" is ISO
// only (the zero DateFormat).
func ParseDateFormat(s string) (DateFormat, error) {
	spec := strings.ToUpper(strings.TrimSpace(s))
	switch spec {
	case "", "ISO":
		return DateFormat{}, nil
	case "SERIAL":
		return DateFormat{spec: "serial", serial: true}, nil
	}
	layout, ok := dateFormats[spec]
	if !ok {
		return DateFormat{}, fmt.Errorf("unknown date format %q (want DD/MM/YYYY, MM/DD/YYYY, DD.MM.YYYY, YYYY-MM-DD, DD-MM-YYYY or serial)", s)
	}
	return DateFormat{spec: spec, layout: layout}, nil
}

// String returns the format as ParseDateFormat reads it; "ISO" for the zero
// value.
func (f DateFormat) String() string {
	if f.spec == "" {
		return "ISO"
	}
	return f.spec
}

// isoLayouts are the ISO 8601 forms read without a --date-format.
var isoLayouts = []string{"2006-01-02", "2006-01-02 15:04", "2006-01-02T15:04", "2006-01-02 15:04:05",
	"2006-01-02T15:04:05", time.RFC3339}

// timeSuffixes are the times a date may carry after its date part.
var timeSuffixes = []string{"", " 15:04", "T15:04", " 15:04:05", "T15:04:05"}

// ErrDateFormat marks a date cell that cannot be read as the file's date
// format says.
var ErrDateFormat = errors.New("date not read")

// NormalizeDate reads the date cell s in format f and returns it as ISO
// 8601: "2006-01-02", or "2006-01-02 15:04" when a time is given (seconds
// kept when not zero). An ISO date is kept as written whatever f. A blank
// cell is "". The error (wrapping ErrDateFormat; the caller names the
// cell) says what was expected: without a format, a date in another layout
// is refused with the format that would read it — "03/02/2026" names both
// DD/MM/YYYY and MM/DD/YYYY — and a number with "serial".
func NormalizeDate(s string, f DateFormat) (string, error) {
	s = cleanText(s)
	if s == "" {
		return "", nil
	}
	for _, l := range isoLayouts {
		if _, err := time.Parse(l, s); err == nil {
			return s, nil
		}
	}
	switch {
	case f.serial:
		return serialDate(s)
	case f.layout != "":
		for _, suffix := range timeSuffixes {
			if t, err := time.Parse(f.layout+suffix, s); err == nil {
				return isoDate(t, suffix != ""), nil
			}
		}
		return "", fmt.Errorf("%w: not a date in the --date-format %s", ErrDateFormat, f.spec)
	}
	return "", fmt.Errorf("%w: %s", ErrDateFormat, dateHint(s))
}

// isoDate writes t as ISO 8601, with its time when withTime.
func isoDate(t time.Time, withTime bool) string {
	switch {
	case !withTime:
		return t.Format("2006-01-02")
	case t.Second() != 0:
		return t.Format("2006-01-02 15:04:05")
	}
	return t.Format("2006-01-02 15:04")
}

// Spreadsheet serial dates (the 1900 date system of ECMA-376 Part 1,
// §18.17.4.1, from memory): day 1 is 1 January 1900 and day 60 the
// 29 February 1900 that never was, so from day 61 (1 March 1900) a serial
// counts days from 30 December 1899; a fraction is the time of day.
const (
	minSerial = 61
	maxSerial = 2958465 // 31 December 9999
)

// serialEpoch is day 0 of the serials from minSerial on.
var serialEpoch = time.Date(1899, 12, 30, 0, 0, 0, 0, time.UTC)

// serialDate reads a spreadsheet serial date.
func serialDate(s string) (string, error) {
	v, err := ParseNumber(s)
	if err != nil || v < minSerial || v > maxSerial {
		return "", fmt.Errorf("%w: not a spreadsheet serial date (a day number from %d, 1 March 1900)", ErrDateFormat, minSerial)
	}
	days := math.Floor(v)
	secs := math.Round((v - days) * 86400)
	t := serialEpoch.AddDate(0, 0, int(days)).Add(time.Duration(secs) * time.Second)
	return isoDate(t, secs != 0), nil
}

// dayMonth matches a date whose first two parts are day and month in some
// order: "14/02/2026", "2.14.26", "03-02-2026 08:30".
var dayMonth = regexp.MustCompile(`^(\d{1,2})([/.-])(\d{1,2})([/.-])(\d{2}|\d{4})([ T].*)?$`)

// dateHint says which --date-format would read s, for a date given without
// one.
func dateHint(s string) string {
	if m := dayMonth.FindStringSubmatch(s); m != nil && m[2] == m[4] {
		a, _ := strconv.Atoi(m[1])
		b, _ := strconv.Atoi(m[3])
		sep, year := m[2], "YYYY"
		if len(m[5]) == 2 {
			year = "YY"
		}
		dm, md := "DD"+sep+"MM"+sep+year, "MM"+sep+"DD"+sep+year
		switch {
		case a > 12 && b <= 12:
			return "not ISO (YYYY-MM-DD): give --date-format " + dm
		case b > 12 && a <= 12:
			return "not ISO (YYYY-MM-DD): give --date-format " + md
		case a <= 12 && b <= 12:
			return fmt.Sprintf("day and month ambiguous (%d %s or %d %s): give --date-format %s or %s",
				a, time.Month(b), b, time.Month(a), dm, md)
		}
	}
	if v, err := ParseNumber(s); err == nil && v >= minSerial && v <= maxSerial {
		return "a number, as a spreadsheet writes a date: give --date-format serial"
	}
	return "not a date: write YYYY-MM-DD, or give --date-format (DD/MM/YYYY, MM/DD/YYYY, DD.MM.YYYY, serial …)"
}
