package water

import "fmt"

// InputError reports a bad cell, row or file of a laboratory file: where it
// is and what is wrong, in the manner of csv.ParseError. Line and Column
// count from 1; Line 0 means the whole file, Column 0 the whole row.
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
		msg += fmt.Sprintf("column %q: ", e.Header)
	}
	if e.Value != "" {
		msg += fmt.Sprintf("value %q: ", e.Value)
	}
	return msg + e.Err.Error()
}

func (e *InputError) Unwrap() error { return e.Err }
