package water

import (
	"errors"
	"fmt"
	"strings"
	"unicode/utf8"
)

// InputError reports a bad cell, row or file of a laboratory file: where it
// is and what is wrong, in the manner of csv.ParseError. Line and Column
// count from 1; Line 0 means the whole file, Column 0 the whole row.
//
// Error prints "file:line:column: column "header": value "raw": cause",
// leaving out the parts that are not known; the header and the raw value are
// quoted and cut to 40 characters ("…" marks a cut).
type InputError struct {
	File   string // file name as given, "-" for standard input
	Line   int    // physical line in the file
	Column int    // 1-based column number
	Header string // the column's header, when known
	Value  string // the raw value, when one is at fault
	Err    error
}

func (e *InputError) Error() string {
	where := e.File
	if e.Line > 0 {
		where = fmt.Sprintf("%s:%d", where, e.Line)
		if e.Column > 0 {
			where = fmt.Sprintf("%s:%d", where, e.Column)
		}
	}
	msg := where + ": "
	if e.Header != "" {
		msg += fmt.Sprintf("column %q: ", clipText(e.Header))
	}
	if e.Value != "" {
		msg += fmt.Sprintf("value %q: ", clipText(e.Value))
	}
	if e.Err == nil {
		return msg + "bad input"
	}
	return msg + e.Err.Error()
}

func (e *InputError) Unwrap() error { return e.Err }

// maxQuotedRunes is the most characters of a raw value or header an error
// message quotes.
const maxQuotedRunes = 40

// clipText returns s cut to maxQuotedRunes characters, with "…" appended
// when it was cut. Clipping a clipped text returns it unchanged.
func clipText(s string) string {
	if utf8.RuneCountInString(s) <= maxQuotedRunes {
		return s
	}
	var b strings.Builder
	n := 0
	for _, r := range s {
		if n == maxQuotedRunes {
			break
		}
		b.WriteRune(r)
		n++
	}
	b.WriteString("…")
	return b.String()
}

// Messages of the errors Read reports; the cause of an *InputError.
var (
	errLineTooLong    = errors.New("line longer than 1 MiB")
	errEmptyFile      = errors.New("empty file")
	errNoSamples      = errors.New("no samples below the header")
	errNoHeader       = errors.New("no usable header: none of the columns is a known analyte or field")
	errBinary         = errors.New("not a csv text file (binary data)")
	errNotUTF8        = errors.New("header is not utf-8 text: save the file as csv utf-8")
	errUTF16          = errors.New("file is utf-16 text: save it as csv utf-8")
	errNegative       = errors.New("negative concentration")
	errAboveRange     = errors.New("above range: dilute and re-measure")
	errNoHeaderName   = errors.New("value in a column with no header")
	errBlankSample    = errors.New("sample name is blank")
	errBlankAnalyte   = errors.New("analyte is blank")
	errNotAField      = errors.New("not an analyte or a field of a sample")
	errNotNumberComma = errors.New("not a number: no thousands separators or decimal commas (write 1234 or 12.5)")
)
