package water

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"iter"
	"strconv"
	"strings"
	"unicode/utf8"
)

// ReadOptions configures one read; the zero value is usable.
type ReadOptions struct {
	Detection DetectionPolicy // one of the Detection constants (Read panics on any other)
	Analytes  *AnalyteTable   // nil means Analytes()
	// Dates is how the date cells are written; the zero value reads ISO
	// 8601 only and refuses any other layout (NormalizeDate).
	Dates DateFormat
}

// Record is one sample of a file: its analysis, or the error that stopped it.
type Record struct {
	Name     string   // sample name (or "row N", N the physical line, when the file gives none)
	Line     int      // physical line of the row (wide) or of the sample's first row (long)
	Analysis Analysis // valid when Err == nil
	Err      error    // an *InputError naming file, line, column; nil for a good row
}

// MaxLineBytes is the longest physical line Read accepts, in bytes (1 MiB).
const MaxLineBytes = 1 << 20

// Read reads a laboratory file in the wide or the long form (detected from
// the header) and returns one Record per sample, in file order. file names
// the input in messages ("-" for standard input).
//
// The wide form has one row per sample and a column per analyte, with the
// unit in brackets or parentheses in the header: "Ca [mg/L]",
// "alkalinity [mg/L as CaCO3]", "NO3 (mg/L as N)"; other columns are name,
// date, temperature [C|F|K], pH (no unit), pH_temperature [C], density
// [kg/L], TDS [mg/L], conductivity [µS/cm], pressure [atm|bar|kPa|psia|psig]
// and comment. The long form, recognised by an analyte column, has columns
// sample, analyte, value, unit and optionally qualifier ("<", ">", "ND"),
// date, role and system, one row per sample and analyte; its rows are
// grouped into samples by name and date in order of first appearance, and
// temperature, pH and the other fields appear as analyte rows
// ("temperature","25","C"). A role or system may be given on any row of a
// sample; rows of one sample that give different ones are an error of it.
//
// A blank cell is not measured. "<x" is below the detection limit x and
// becomes x/2, 0 or x by opt.Detection (Analysis.BelowDetection says so);
// "n.d." or "not detected" without a limit is taken as 0 with a warning; ">x"
// is an error (above range). Numbers are strict (ParseNumber).
//
// The error is non-nil only when nothing can be read (an empty or binary
// file, no usable header, a header with no samples, a missing long-form
// column, a line over MaxLineBytes); it is then an *InputError and records
// and problems are nil. Header problems that affect one column (unknown
// unit, header with no unit, duplicate column, unknown column) are returned
// as problems, each an *InputError, while the other columns and rows are
// still computed: a row with a value in such a column becomes an error
// Record. A bad cell or row makes its sample an error Record carrying the
// first error found; every other sample is computed. (A quoted value that is
// never closed runs, as CSV says, to the end of the file: the rows it
// swallows are part of its error.)
func Read(file string, r io.Reader, opt ReadOptions) (records []Record, problems []error, err error) {
	rr, err := newRecordReader(file, r, opt)
	if err != nil {
		return nil, nil, err
	}
	for {
		rec, err := rr.next()
		if err == io.EOF {
			return records, rr.problems, nil
		}
		if err != nil {
			return nil, nil, err
		}
		records = append(records, rec)
	}
}

// Records reads a laboratory file as Read does and yields its samples one at
// a time, in file order, as it reads them: a wide file holds one row at a
// time; a long file, whose rows are grouped into samples over the whole
// file, is read whole on the first step and its samples then yielded.
//
// It yields, in this order:
//   - (Record{}, problem) for each header problem (an *InputError), as Read
//     returns them; iteration goes on;
//   - (rec, nil) for each sample, rec.Err non-nil for a bad row, exactly the
//     Records of Read;
//   - (Record{}, fatal) when the file cannot be read on (an empty or binary
//     file, no usable header, no samples, a line over MaxLineBytes): always
//     the last thing yielded. Samples yielded before a fatal error were read
//     well (Read, by contrast, returns none of them).
//
// A yielded Record shares no mutable memory with the reader (it refers only
// to the read-only analyte table). Stopping early releases the reader.
func Records(file string, r io.Reader, opt ReadOptions) iter.Seq2[Record, error] {
	return func(yield func(Record, error) bool) {
		rr, err := newRecordReader(file, r, opt)
		if err != nil {
			yield(Record{}, err)
			return
		}
		for _, p := range rr.problems {
			if !yield(Record{}, p) {
				return
			}
		}
		for {
			rec, err := rr.next()
			if err == io.EOF {
				return
			}
			if err != nil {
				yield(Record{}, err)
				return
			}
			if !yield(rec, nil) {
				return
			}
		}
	}
}

// recordReader reads a file one sample at a time.
type recordReader struct {
	rd       *reader
	problems []error                // header problems, each an *InputError
	form     func() (Record, error) // the next sample of the file's form; io.EOF at its end
	read     int                    // samples returned so far
	err      error                  // sticky: io.EOF or the fatal error
}

// newRecordReader reads the header of a file; the error is Read's fatal
// error.
func newRecordReader(file string, r io.Reader, opt ReadOptions) (*recordReader, error) {
	table := opt.Analytes
	if table == nil {
		table = Analytes()
	}
	opt.Detection.substitute(1) // an invalid policy is a programmer's mistake
	limiter := &lineLimiter{r: newCRReader(r)}
	cr := csv.NewReader(limiter)
	cr.FieldsPerRecord = -1
	rd := &reader{file: file, cr: cr, table: table, policy: opt.Detection, dates: opt.Dates, units: map[[2]string]classified{}}
	header, line, err := rd.readHeader()
	if err != nil {
		return nil, err
	}
	rr := &recordReader{rd: rd}
	if isLongHeader(header) {
		rr.form, rr.problems, err = rd.openLong(header, line)
	} else {
		rr.form, rr.problems, err = rd.openWide(header, line)
	}
	if err != nil {
		return nil, err
	}
	return rr, nil
}

// next returns the next sample; io.EOF after the last, or the fatal error
// (no samples at all is one).
func (rr *recordReader) next() (Record, error) {
	if rr.err != nil {
		return Record{}, rr.err
	}
	rec, err := rr.form()
	if err == io.EOF && rr.read == 0 {
		err = rr.rd.fileError(0, errNoSamples)
	}
	if err != nil {
		rr.err = err
		return Record{}, err
	}
	rr.read++
	return rec, nil
}

// reader holds the state of one Read.
type reader struct {
	analyteColumns int // wide form: the columns of analytes, for the capacity of a row's measurements
	file           string
	cr             *csv.Reader
	table          *AnalyteTable
	policy         DetectionPolicy
	dates          DateFormat
	units          map[[2]string]classified // long form: classified (analyte, unit) pairs
}

func (rd *reader) fileError(line int, err error) *InputError {
	return &InputError{File: rd.file, Line: line, Err: err}
}

// readError turns an error of csv.Reader.Read that is not a csv.ParseError
// into the fatal error of Read.
func (rd *reader) readError(err error) *InputError {
	var long *lineTooLongError
	if errors.As(err, &long) {
		return rd.fileError(long.line, errLineTooLong)
	}
	return rd.fileError(0, err)
}

// parseError turns a csv.ParseError of a record into an *InputError at the
// record's first line; a quoted value that runs on over lines says where it
// ends.
func (rd *reader) parseError(pe *csv.ParseError) *InputError {
	err := pe.Err
	if pe.Line != pe.StartLine {
		err = fmt.Errorf("%w (the quoted value runs on to line %d)", pe.Err, pe.Line)
	}
	return &InputError{File: rd.file, Line: pe.StartLine, Err: err}
}

// readHeader returns the first record that is not blank, with the BOM of a
// UTF-8 file removed, and its line.
func (rd *reader) readHeader() ([]string, int, error) {
	for {
		fields, err := rd.cr.Read()
		if err == io.EOF {
			return nil, 0, rd.fileError(0, errEmptyFile)
		}
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			if binaryText(fields) {
				return nil, 0, rd.fileError(0, errBinary)
			}
			return nil, 0, rd.fileError(pe.Line, fmt.Errorf("no usable header: %w", pe.Err))
		}
		if err != nil {
			return nil, 0, rd.readError(err)
		}
		if len(fields) > 0 && (strings.HasPrefix(fields[0], "\xff\xfe") || strings.HasPrefix(fields[0], "\xfe\xff")) {
			return nil, 0, rd.fileError(0, errUTF16)
		}
		if binaryText(fields) {
			return nil, 0, rd.fileError(0, errBinary)
		}
		if blankRecord(fields) {
			continue
		}
		line, _ := rd.cr.FieldPos(0)
		for _, f := range fields {
			if !utf8.ValidString(f) {
				return nil, 0, rd.fileError(line, errNotUTF8)
			}
		}
		fields[0] = strings.TrimPrefix(fields[0], "\ufeff")
		if len(fields) == 1 {
			for _, sep := range []string{";", "\t"} {
				if strings.Contains(fields[0], sep) {
					return nil, 0, rd.fileError(line, fmt.Errorf("fields are separated by %q: save the file as comma-separated csv", sep))
				}
			}
		}
		return fields, line, nil
	}
}

// binaryText reports whether fields hold bytes no text file has: NUL, or a
// PNG, ZIP (xlsx) or PDF signature.
func binaryText(fields []string) bool {
	for i, f := range fields {
		if strings.ContainsRune(f, 0) {
			return true
		}
		if i == 0 && (strings.HasPrefix(f, "\x89PNG") || strings.HasPrefix(f, "PK\x03\x04") || strings.HasPrefix(f, "%PDF")) {
			return true
		}
	}
	return false
}

func blankRecord(fields []string) bool {
	for _, f := range fields {
		if strings.TrimSpace(f) != "" {
			return false
		}
	}
	return true
}

// cleanText returns a name or date cell as text fit for a report: trimmed,
// non-breaking spaces made plain, invalid UTF-8 replaced.
func cleanText(s string) string {
	s = strings.ToValidUTF8(s, "\uFFFD")
	return strings.TrimSpace(strings.ReplaceAll(s, "\u00a0", " "))
}

// rowName returns the name of a sample that the file gives none for.
func rowName(line int) string { return "row " + strconv.Itoa(line) }

// lineTooLongError is returned by lineLimiter for a line over MaxLineBytes.
type lineTooLongError struct{ line int }

func (e *lineTooLongError) Error() string { return errLineTooLong.Error() }

// crReader passes a reader through with each lone carriage return (the
// line end of old Mac files and some instruments) turned into a line feed;
// CR LF is kept, which encoding/csv reads as one line end. Without it a
// CR-only file is one long line and reads as a header with no samples.
type crReader struct {
	br *bufio.Reader
}

func newCRReader(r io.Reader) *crReader { return &crReader{br: bufio.NewReader(r)} }

func (c *crReader) Read(p []byte) (int, error) {
	n, err := c.br.Read(p)
	for i := 0; i < n; i++ {
		j := bytes.IndexByte(p[i:n], '\r')
		if j < 0 {
			break
		}
		i += j
		if i+1 < n {
			if p[i+1] != '\n' {
				p[i] = '\n'
			}
			continue
		}
		// The chunk ends in CR: the next byte decides.
		if next, perr := c.br.Peek(1); perr != nil || next[0] != '\n' {
			p[i] = '\n'
		}
	}
	return n, err
}

// lineLimiter passes a reader through and fails at the first physical line
// longer than MaxLineBytes, so that no reader downstream holds much more
// than that of one line.
type lineLimiter struct {
	r    io.Reader
	line int // lines completed
	n    int // bytes of the current line so far
	err  error
}

func (l *lineLimiter) Read(p []byte) (int, error) {
	if l.err != nil {
		return 0, l.err
	}
	n, err := l.r.Read(p)
	rest := p[:n]
	for len(rest) > 0 {
		i := bytes.IndexByte(rest, '\n')
		end := i
		if i < 0 {
			end = len(rest)
		}
		if l.n+end > MaxLineBytes {
			// Nothing from the long line on is passed on, so that no row
			// after it is read before the error.
			l.err = &lineTooLongError{line: l.line + 1}
			return n - len(rest), l.err
		}
		if i < 0 {
			l.n += end
			break
		}
		l.line++
		l.n = 0
		rest = rest[i+1:]
	}
	return n, err
}
