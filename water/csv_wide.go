package water

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
)

// wideColumns classifies the header; problems are the columns that cannot
// be used.
func (rd *reader) wideColumns(header []string, line int) ([]headerColumn, []error, bool) {
	cols := make([]headerColumn, len(header))
	var problems []error
	recognised := false
	seen := map[string]int{}     // column key -> index in cols
	seenComp := map[string]int{} // component -> index in cols
	for i, h := range header {
		h = normalizeHeader(h)
		label, unit, hasUnit := splitHeader(h)
		if hasUnit && rd.knownLabel(h) {
			label, unit, hasUnit = h, "", false // "Fe(II)" is a name, not Fe in unit "II"
		}
		c, _, err := rd.classify(label, unit, hasUnit)
		c.index, c.header = i+1, h
		if c.kind != fieldUnknown && c.kind != fieldBlank && c.kind != fieldOther {
			recognised = true
		}
		if err == nil && c.kind != fieldBlank && c.kind != fieldComment && c.kind != fieldName && c.kind != fieldDate && c.kind != fieldRole && c.kind != fieldSystem {
			if j, dup := seen[c.key()]; dup {
				err = fmt.Errorf("duplicate column: %s is already in column %d (%q)", c.name(), j+1, cols[j].header)
			} else if j, dup := seenComp[c.componentKey()]; dup && c.componentKey() != "" {
				err = fmt.Errorf("duplicate column: %s is already given by column %d (%q)", c.componentKey(), j+1, cols[j].header)
			} else {
				seen[c.key()] = i
				if k := c.componentKey(); k != "" {
					seenComp[k] = i
				}
			}
		}
		if err != nil {
			c.problem = &InputError{File: rd.file, Line: line, Column: i + 1, Header: clipText(h), Err: err}
			problems = append(problems, c.problem)
		}
		cols[i] = c
	}
	return cols, problems, recognised
}

// openWide classifies a wide header and returns the reader of its rows.
func (rd *reader) openWide(header []string, headerLine int) (func() (Record, error), []error, error) {
	cols, problems, ok := rd.wideColumns(header, headerLine)
	if !ok {
		return nil, nil, rd.fileError(headerLine, errNoHeader)
	}
	if note := rd.otherNote(cols, headerLine); note != nil {
		problems = append(problems, note)
	}
	nameCol := -1
	for i, c := range cols {
		if c.kind == fieldName && c.problem == nil {
			nameCol = i
			break
		}
	}
	name := func(fields []string, line int) string {
		if nameCol >= 0 && nameCol < len(fields) {
			if n := cleanText(fields[nameCol]); n != "" {
				return n
			}
		}
		return rowName(line)
	}
	for _, c := range cols {
		if c.kind == fieldAnalyte {
			rd.analyteColumns++
		}
	}
	// From here no record outlives the next read: the reader may reuse
	// its slice of fields (each record's text is still its own).
	rd.cr.ReuseRecord = true
	next := func() (Record, error) { return rd.nextWide(cols, name) }
	return next, problems, nil
}

// nextWide reads the next row of a wide file that is not blank; io.EOF at
// the end of the file.
func (rd *reader) nextWide(cols []headerColumn, name func([]string, int) string) (Record, error) {
	for {
		fields, err := rd.cr.Read()
		if err == io.EOF {
			return Record{}, io.EOF
		}
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			ie := rd.parseError(pe)
			if k := len(fields); k < len(cols) {
				ie.Column, ie.Header = k+1, clipText(cols[k].header)
			}
			return Record{Name: name(fields, pe.StartLine), Line: pe.StartLine, Err: ie}, nil
		}
		if err != nil {
			return Record{}, rd.readError(err)
		}
		if blankRecord(fields) {
			continue
		}
		return rd.wideRecord(cols, fields, name), nil
	}
}

// wideRecord computes one row of a wide file.
func (rd *reader) wideRecord(cols []headerColumn, fields []string, name func([]string, int) string) Record {
	line, _ := rd.cr.FieldPos(0)
	rec := Record{Name: name(fields, line), Line: line}
	if len(fields) != len(cols) {
		ie := &InputError{File: rd.file, Line: line,
			Err: fmt.Errorf("row has %d fields, the header has %d", len(fields), len(cols))}
		if len(fields) > len(cols) {
			ie.Column, ie.Value = len(cols)+1, clipText(fields[len(cols)])
		}
		rec.Err = ie
		return rec
	}
	b := sampleBuilder{s: NewSample(rec.Name), dates: rd.dates}
	b.s.Measurements = make([]Measurement, 0, rd.analyteColumns)
	for i, c := range cols {
		v := parseCell(fields[i])
		if v.kind == cellBlank {
			continue
		}
		var err error
		switch {
		case c.problem != nil:
			err = fmt.Errorf("column unusable: see the error on line %d", c.problem.Line)
		case c.kind == fieldBlank:
			err = errNoHeaderName
		case c.kind == fieldName:
			continue
		case c.kind == fieldOther:
			b.setOther(c, v, rd.table)
			continue
		default:
			err = b.set(c, v, rd.policy)
		}
		if err != nil {
			fl, _ := rd.cr.FieldPos(i)
			rec.Err = &InputError{File: rd.file, Line: fl, Column: i + 1, Header: clipText(c.header),
				Value: clipText(fields[i]), Err: err}
			return rec
		}
	}
	a, err := b.analysis(rd.table)
	if err != nil {
		rec.Err = &InputError{File: rd.file, Line: line, Err: err}
		return rec
	}
	rec.Analysis = a
	return rec
}
