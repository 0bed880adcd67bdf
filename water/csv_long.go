package water

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/gocarina/gocsv"
)

// The columns of a long-form file, in the order longDecoder hands them to
// gocsv.
const (
	longLine = iota // physical line, added by longDecoder
	longBad         // "1" when the row could not be split into fields
	longSample
	longAnalyte
	longValue
	longUnit
	longQualifier
	longDate
	longRole
	longSystem
	longWidth
)

// longTags are the gocsv keys of the long-form columns, in order.
var longTags = [longWidth]string{"line", "bad", "sample", "analyte", "value", "unit", "qualifier", "date", "role", "system"}

// longNames maps a long-form header, folded by fieldKey, to its column.
var longNames = map[string]int{
	"sample": longSample, "samplename": longSample, "sampleid": longSample, "name": longSample, "id": longSample,
	"analyte": longAnalyte, "parameter": longAnalyte, "determinand": longAnalyte,
	"value": longValue, "result": longValue,
	"unit": longUnit, "units": longUnit,
	"qualifier": longQualifier, "qual": longQualifier, "flag": longQualifier,
	"date": longDate, "sampledate": longDate, "samplingdate": longDate,
	"role": longRole, "samplerole": longRole,
	"system": longSystem, "circuit": longSystem,
}

// longRow is one row of a long-form file as gocsv decodes it.
type longRow struct {
	Line      int       `csv:"line"`
	Bad       string    `csv:"bad"`
	Sample    string    `csv:"sample"`
	Analyte   string    `csv:"analyte"`
	Value     cellValue `csv:"value"`
	Unit      string    `csv:"unit"`
	Qualifier string    `csv:"qualifier"`
	Date      string    `csv:"date"`
	Role      string    `csv:"role"`
	System    string    `csv:"system"`
}

// isLongHeader reports whether header has an analyte column.
func isLongHeader(header []string) bool {
	for _, h := range header {
		if k, ok := longNames[fieldKey(normalizeHeader(h))]; ok && k == longAnalyte {
			return true
		}
	}
	return false
}

// longLayout says where each long-form column is in the file.
type longLayout struct {
	pos     [longWidth]int    // 0-based index in the file's row, -1 when absent
	header  [longWidth]string // as written
	unknown map[int]*InputError
	width   int
}

func (rd *reader) longColumns(header []string, line int) (longLayout, []error, error) {
	l := longLayout{unknown: map[int]*InputError{}, width: len(header)}
	for i := range l.pos {
		l.pos[i] = -1
	}
	var problems []error
	for i, h := range header {
		h = normalizeHeader(h)
		k, ok := longNames[fieldKey(h)]
		if !ok {
			if fieldNames[fieldKey(h)] == fieldComment {
				continue
			}
			if h == "" {
				l.unknown[i] = nil // a value under a blank header is an error of its row
				continue
			}
		}
		var err error
		switch {
		case !ok:
			err = errors.New("unknown column: the long form has sample, analyte, value, unit, qualifier, date, role, system")
		case l.pos[k] >= 0:
			err = fmt.Errorf("duplicate column: %s is already in column %d (%q)", longTags[k], l.pos[k]+1, l.header[k])
		default:
			l.pos[k], l.header[k] = i, h
			continue
		}
		ie := &InputError{File: rd.file, Line: line, Column: i + 1, Header: clipText(h), Err: err}
		problems = append(problems, ie)
		l.unknown[i] = ie
	}
	var missing []string
	for _, k := range []int{longSample, longAnalyte, longValue, longUnit} {
		if l.pos[k] < 0 {
			missing = append(missing, longTags[k])
		}
	}
	if len(missing) > 0 {
		return l, nil, rd.fileError(line, fmt.Errorf("long form needs columns sample, analyte, value and unit: missing %s", strings.Join(missing, ", ")))
	}
	return l, problems, nil
}

// longDecoder is the gocsv.SimpleDecoder of a long-form file. It reads the
// file with our csv.Reader (physical lines from FieldPos, our line limit,
// ragged rows kept) and hands gocsv rows of the fixed columns longTags, the
// physical line first. It runs in gocsv's goroutine: what it finds wrong
// with a row goes to issues, read only after gocsv has returned.
type longDecoder struct {
	rd         *reader
	layout     longLayout
	sentHeader bool
	issues     map[int]*InputError // physical line -> what is wrong with the row
	fatal      *InputError
}

func (d *longDecoder) GetCSVRows() ([][]string, error) {
	return nil, errors.New("water: longDecoder reads row by row")
}

func (d *longDecoder) GetCSVRow() ([]string, error) {
	if !d.sentHeader {
		d.sentHeader = true
		return longTags[:], nil
	}
	rd, l := d.rd, d.layout
	for {
		fields, err := rd.cr.Read()
		if err == io.EOF {
			return nil, io.EOF
		}
		var pe *csv.ParseError
		var issue *InputError
		line := 0
		switch {
		case errors.As(err, &pe):
			line = pe.StartLine
			issue = rd.parseError(pe)
			if k := len(fields); k < l.width {
				issue.Column = k + 1
			}
		case err != nil:
			d.fatal = rd.readError(err)
			return nil, io.EOF
		case blankRecord(fields):
			continue
		default:
			line, _ = rd.cr.FieldPos(0)
		}
		row := make([]string, longWidth)
		row[longLine] = strconv.Itoa(line)
		for k, p := range l.pos {
			if p >= 0 && p < len(fields) {
				row[k] = fields[p]
			}
		}
		if issue == nil && len(fields) != l.width {
			issue = &InputError{File: rd.file, Line: line,
				Err: fmt.Errorf("row has %d fields, the header has %d", len(fields), l.width)}
			if len(fields) > l.width {
				issue.Column, issue.Value = l.width+1, clipText(fields[l.width])
			}
		}
		if issue == nil {
			for i, f := range fields {
				bad, ok := l.unknown[i]
				if !ok || strings.TrimSpace(f) == "" {
					continue
				}
				fl, _ := rd.cr.FieldPos(i)
				issue = &InputError{File: rd.file, Line: fl, Column: i + 1, Value: clipText(f), Err: errNoHeaderName}
				if bad != nil {
					issue.Header = bad.Header
					issue.Err = fmt.Errorf("column unusable: see the error on line %d", bad.Line)
				}
				break
			}
		}
		if issue != nil {
			d.issues[line] = issue
			row[longBad] = "1"
		}
		return row, nil
	}
}

// longSampleGroup is one sample of a long-form file being assembled.
type longSampleGroup struct {
	line     int // first row
	b        sampleBuilder
	seen     map[string]int // column key -> line
	seenComp map[string]int // component -> line
	badLines []int
	err      *InputError // the first error, by line and column
	// roleLine and systemLine are the first rows that gave the sample's
	// role and system (0: none yet).
	roleLine, systemLine int
}

func (g *longSampleGroup) fail(e *InputError) {
	if g.err == nil || e.Line < g.err.Line || (e.Line == g.err.Line && e.Column < g.err.Column) {
		g.err = e
	}
}

// longReader assembles samples from the rows gocsv decodes.
type longReader struct {
	rd     *reader
	layout longLayout
	groups []*longSampleGroup
	byKey  map[[2]string]*longSampleGroup
	// known and unknown are the other analytes met (csv_other.go), quoted,
	// each once, for the file's note.
	known, unknown []string
	otherSeen      map[string]bool
}

// openLong reads a whole long-form file, whose rows are grouped into samples
// over the file, and returns the reader of its samples.
func (rd *reader) openLong(header []string, headerLine int) (func() (Record, error), []error, error) {
	layout, problems, err := rd.longColumns(header, headerLine)
	if err != nil {
		return nil, nil, err
	}
	dec := &longDecoder{rd: rd, layout: layout, issues: map[int]*InputError{}}
	lr := &longReader{rd: rd, layout: layout, byKey: map[[2]string]*longSampleGroup{}}
	// UnmarshalDecoderToCallback streams rows from our decoder and returns
	// only once gocsv's goroutine is done with it (our callback never fails,
	// so nothing is left blocked). UnmarshalToCallbackWithError would make
	// its own csv.Reader through gocsv's package-global setting, losing the
	// physical lines, the line limit and ragged rows.
	if err := gocsv.UnmarshalDecoderToCallback(dec, lr.add); err != nil {
		return nil, nil, rd.fileError(0, err)
	}
	if dec.fatal != nil {
		return nil, nil, dec.fatal
	}
	if note := rd.notUsedNote(headerLine, lr.known, lr.unknown); note != nil {
		problems = append(problems, note)
	}
	groups := lr.groups
	next := func() (Record, error) {
		if len(groups) == 0 {
			return Record{}, io.EOF
		}
		g := groups[0]
		groups[0], groups = nil, groups[1:]
		return rd.longRecord(g, dec.issues), nil
	}
	return next, problems, nil
}

// longRecord computes one sample of a long-form file.
func (rd *reader) longRecord(g *longSampleGroup, issues map[int]*InputError) Record {
	for _, line := range g.badLines {
		g.fail(issues[line])
	}
	name := g.b.s.Name
	if name == "" {
		name = rowName(g.line)
	}
	rec := Record{Name: name, Line: g.line}
	if g.err != nil {
		rec.Err = g.err
	} else if a, err := g.b.analysis(rd.table); err != nil {
		rec.Err = &InputError{File: rd.file, Line: g.line, Err: err}
	} else {
		rec.Analysis = a
	}
	return rec
}

// group returns the sample of a row, made on its first row.
func (lr *longReader) group(sample, date string, line int) *longSampleGroup {
	key := [2]string{sample, date}
	if sample == "" {
		key[1] = "\x00" + strconv.Itoa(line) // a row with no sample name stands alone
	}
	if g, ok := lr.byKey[key]; ok {
		return g
	}
	g := &longSampleGroup{line: line, b: sampleBuilder{s: NewSample(sample), dates: lr.rd.dates},
		seen: map[string]int{}, seenComp: map[string]int{}}
	g.b.s.Date = date
	lr.byKey[key] = g
	lr.groups = append(lr.groups, g)
	return g
}

// cellError returns an error at long-form column k of row.
func (lr *longReader) cellError(row longRow, k int, value string, err error) *InputError {
	return &InputError{File: lr.rd.file, Line: row.Line, Column: lr.layout.pos[k] + 1,
		Header: clipText(lr.layout.header[k]), Value: clipText(value), Err: err}
}

// add takes one decoded row into its sample.
func (lr *longReader) add(row longRow) {
	rd := lr.rd
	sample, date := cleanText(row.Sample), cleanText(row.Date)
	iso, dateErr := NormalizeDate(date, rd.dates)
	if dateErr == nil {
		date = iso
	}
	g := lr.group(sample, date, row.Line)
	if dateErr != nil {
		g.fail(lr.cellError(row, longDate, row.Date, dateErr))
		return
	}
	if row.Bad != "" {
		g.badLines = append(g.badLines, row.Line)
		return
	}
	if sample != "" && !lr.addTags(g, row) {
		return
	}
	label := normalizeHeader(row.Analyte)
	unit := normalizeHeader(row.Unit)
	qual := strings.ToLower(normalizeHeader(row.Qualifier))
	if row.Value.kind == cellBlank && qual == "" {
		return // not measured
	}
	if sample == "" {
		g.fail(lr.cellError(row, longSample, row.Sample, errBlankSample))
		return
	}
	if label == "" {
		g.fail(lr.cellError(row, longAnalyte, row.Analyte, errBlankAnalyte))
		return
	}
	c, unitFault, err := rd.classifyCached(label, unit)
	switch {
	case err != nil && unitFault && unit == "":
		g.fail(lr.cellError(row, longUnit, row.Unit, fmt.Errorf("%s: no unit", label)))
		return
	case err != nil && unitFault:
		g.fail(lr.cellError(row, longUnit, row.Unit, fmt.Errorf("%s: %w", label, err)))
		return
	case err != nil && c.kind == fieldUnknown:
		g.fail(lr.cellError(row, longAnalyte, row.Analyte, errors.New("unknown analyte")))
		return
	case err != nil:
		g.fail(lr.cellError(row, longAnalyte, row.Analyte, err))
		return
	case c.kind == fieldName || c.kind == fieldDate || c.kind == fieldComment || c.kind == fieldRole || c.kind == fieldSystem || c.kind == fieldBlank:
		g.fail(lr.cellError(row, longAnalyte, row.Analyte, errNotAField))
		return
	}
	if !lr.firstReport(g, row, c) {
		return
	}
	v, err := applyQualifier(row.Value, qual)
	if err != nil {
		g.fail(lr.cellError(row, longQualifier, row.Qualifier, err))
		return
	}
	if c.kind == fieldOther {
		if qual != "" && qual != "=" && !strings.HasPrefix(strings.TrimSpace(v.raw), qual) {
			v.raw = strings.TrimSpace(qual + " " + v.raw)
		}
		lr.addOther(g, c, label, unit, v)
		return
	}
	if err := g.b.set(c, v, rd.policy); err != nil {
		g.fail(lr.cellError(row, longValue, row.Value.raw, fmt.Errorf("%s: %w", label, err)))
	}
}

// firstReport records that row reports column c for its sample, or fails
// the sample when an earlier row reported c, or the same component in
// another form.
func (lr *longReader) firstReport(g *longSampleGroup, row longRow, c headerColumn) bool {
	if prev, dup := g.seen[c.key()]; dup {
		g.fail(lr.cellError(row, longAnalyte, row.Analyte,
			fmt.Errorf("%s is already reported for this sample on line %d", c.name(), prev)))
		return false
	}
	if prev, dup := g.seenComp[c.componentKey()]; dup && c.componentKey() != "" {
		g.fail(lr.cellError(row, longAnalyte, row.Analyte,
			fmt.Errorf("%s is already reported for this sample on line %d", c.componentKey(), prev)))
		return false
	}
	g.seen[c.key()] = row.Line
	if k := c.componentKey(); k != "" {
		g.seenComp[k] = row.Line
	}
	return true
}

// addTags takes the role and system a row gives into its sample, as the
// role and system columns of the wide form: a blank cell says nothing, and
// any row of the sample may carry them. A value that differs from the one
// an earlier row of the sample gave — a role by meaning ("tower" is
// "recirculating"), a system by name without regard to case, as Pairs
// matches systems — is an error at its line and column (the sample is not
// computed; the other samples are), as is an unknown role.
func (lr *longReader) addTags(g *longSampleGroup, row longRow) bool {
	if text := cleanText(row.Role); text != "" {
		r, err := ParseRole(text)
		switch {
		case err != nil:
			g.fail(lr.cellError(row, longRole, row.Role, err))
			return false
		case g.roleLine == 0:
			g.b.s.Role, g.roleLine = r, row.Line
		case r != g.b.s.Role:
			g.fail(lr.cellError(row, longRole, row.Role,
				fmt.Errorf("role %s differs from %s given for this sample on line %d", r, g.b.s.Role, g.roleLine)))
			return false
		}
	}
	if text := cleanText(row.System); text != "" {
		switch {
		case g.systemLine == 0:
			g.b.s.System, g.systemLine = text, row.Line
		case !strings.EqualFold(text, g.b.s.System):
			g.fail(lr.cellError(row, longSystem, row.System,
				fmt.Errorf("system %q differs from %q given for this sample on line %d", clipText(text), clipText(g.b.s.System), g.systemLine)))
			return false
		}
	}
	return true
}

// addOther keeps a row of an analyte the equilibrium does not use in its
// sample, its value written with the row's qualifier, and notes the analyte
// for the file's note (not a checked lab measurement: see setOther).
func (lr *longReader) addOther(g *longSampleGroup, c headerColumn, label, unit string, v cellValue) {
	c.header = label
	if unit != "" {
		c.header += " [" + unit + "]"
	}
	g.b.setOther(c, v, lr.rd.table)
	if c.checked() {
		return // used by the data-quality checks: not named in the note
	}
	if lr.otherSeen == nil {
		lr.otherSeen = map[string]bool{}
	}
	if lr.otherSeen[label] {
		return
	}
	lr.otherSeen[label] = true
	if c.other != "" {
		lr.known = append(lr.known, strconv.Quote(clipText(label)))
	} else {
		lr.unknown = append(lr.unknown, strconv.Quote(clipText(label)))
	}
}

// classified is a classify result, cached per long-form (analyte, unit).
type classified struct {
	c         headerColumn
	err       error
	unitFault bool
}

// classifyCached classifies a long-form analyte and unit, once per pair.
func (rd *reader) classifyCached(label, unit string) (c headerColumn, unitFault bool, err error) {
	key := [2]string{label, unit}
	r, ok := rd.units[key]
	if !ok {
		r.c, r.unitFault, r.err = rd.classify(label, unit, unit != "")
		rd.units[key] = r
	}
	return r.c, r.unitFault, r.err
}

// applyQualifier combines a long-form value with its qualifier column:
// "<" makes the value a detection limit, ">" an over-range value, "nd" a
// non-detect (with the value, if any, as its limit); "" and "=" leave it.
func applyQualifier(v cellValue, qual string) (cellValue, error) {
	switch {
	case qual == "" || qual == "=":
		return v, nil
	case qual == "<" || notDetected[qual]:
		switch v.kind {
		case cellNumber, cellBelow:
			if v.v < 0 {
				return v, errors.New("negative detection limit")
			}
			v.kind = cellBelow
		case cellBlank, cellNotDetected:
			if qual == "<" {
				return v, errors.New("qualifier < needs the detection limit in the value column")
			}
			v.kind = cellNotDetected
		}
		return v, nil
	case qual == ">":
		v.kind = cellAbove
		return v, nil
	}
	return v, errors.New("unknown qualifier (use <, >, ND or leave blank)")
}
