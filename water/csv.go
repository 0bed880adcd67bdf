package water

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/gocarina/gocsv"
)

// DetectionPolicy says what a "<x" (below the detection limit x) value
// becomes.
type DetectionPolicy int

// The detection policies.
const (
	DetectionHalf  DetectionPolicy = iota // x/2 (the default; common practice)
	DetectionZero                         // 0
	DetectionLimit                        // x
)

// ParseDetectionPolicy returns the policy named s: "half", "zero" or "limit"
// (case and surrounding spaces are ignored).
func ParseDetectionPolicy(s string) (DetectionPolicy, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "half":
		return DetectionHalf, nil
	case "zero":
		return DetectionZero, nil
	case "limit":
		return DetectionLimit, nil
	}
	return 0, fmt.Errorf("unknown detection policy %q (want half, zero or limit)", s)
}

// String returns "half", "zero" or "limit".
func (p DetectionPolicy) String() string {
	switch p {
	case DetectionHalf:
		return "half"
	case DetectionZero:
		return "zero"
	case DetectionLimit:
		return "limit"
	}
	return "DetectionPolicy(" + strconv.Itoa(int(p)) + ")"
}

// substitute returns the value a "<limit" cell is taken as.
func (p DetectionPolicy) substitute(limit float64) float64 {
	switch p {
	case DetectionHalf:
		return limit / 2
	case DetectionZero:
		return 0
	case DetectionLimit:
		return limit
	}
	panic("water: invalid " + p.String())
}

// ReadOptions configures one read; the zero value is usable.
type ReadOptions struct {
	Detection DetectionPolicy // one of the Detection constants (Read panics on any other)
	Analytes  *AnalyteTable   // nil means Analytes()
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
	errUnknownColumn  = errors.New("unknown column: not a known analyte or field")
	errNoHeaderName   = errors.New("value in a column with no header")
	errBlankSample    = errors.New("sample name is blank")
	errBlankAnalyte   = errors.New("analyte is blank")
	errNotAField      = errors.New("not an analyte or a field of a sample")
	errNotNumberComma = errors.New("not a number: no thousands separators or decimal commas (write 1234 or 12.5)")
)

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
// sample, analyte, value, unit and optionally qualifier ("<", ">", "ND") and
// date, one row per sample and analyte; its rows are grouped into samples by
// name and date in order of first appearance, and temperature, pH and the
// other fields appear as analyte rows ("temperature","25","C").
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
	table := opt.Analytes
	if table == nil {
		table = Analytes()
	}
	opt.Detection.substitute(1) // an invalid policy is a programmer's mistake
	limiter := &lineLimiter{r: r}
	cr := csv.NewReader(limiter)
	cr.FieldsPerRecord = -1
	rd := &reader{file: file, cr: cr, table: table, policy: opt.Detection, units: map[[2]string]classified{}}
	header, line, err := rd.readHeader()
	if err != nil {
		return nil, nil, err
	}
	if isLongHeader(header) {
		return rd.readLong(header, line)
	}
	return rd.readWide(header, line)
}

// reader holds the state of one Read.
type reader struct {
	file   string
	cr     *csv.Reader
	table  *AnalyteTable
	policy DetectionPolicy
	units  map[[2]string]classified // long form: classified (analyte, unit) pairs
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

// ---------------------------------------------------------------------------
// Columns

// fieldKind is what a column (wide) or an analyte row (long) holds.
type fieldKind int

const (
	fieldUnknown fieldKind = iota
	fieldBlank             // a header cell with nothing in it
	fieldName
	fieldDate
	fieldComment
	fieldTemperature
	fieldPH
	fieldPHTemperature
	fieldDensity
	fieldTDS
	fieldConductivity
	fieldPressure
	fieldAnalyte
)

var fieldLabels = [...]string{
	fieldName: "name", fieldDate: "date", fieldComment: "comment", fieldTemperature: "temperature",
	fieldPH: "pH", fieldPHTemperature: "pH_temperature", fieldDensity: "density", fieldTDS: "TDS",
	fieldConductivity: "conductivity", fieldPressure: "pressure",
}

// fieldNames maps a header label, folded by fieldKey, to the field it names.
var fieldNames = map[string]fieldKind{
	"name": fieldName, "sample": fieldName, "samplename": fieldName, "sampleid": fieldName, "id": fieldName,
	"date": fieldDate, "sampledate": fieldDate, "samplingdate": fieldDate,
	"comment": fieldComment, "comments": fieldComment, "note": fieldComment, "notes": fieldComment,
	"remark": fieldComment, "remarks": fieldComment,
	"temperature": fieldTemperature, "temp": fieldTemperature, "t": fieldTemperature,
	"watertemperature": fieldTemperature, "sampletemperature": fieldTemperature,
	"ph":            fieldPH,
	"phtemperature": fieldPHTemperature, "phtemp": fieldPHTemperature, "temperatureofph": fieldPHTemperature,
	"density": fieldDensity,
	"tds":     fieldTDS, "totaldissolvedsolids": fieldTDS,
	"conductivity": fieldConductivity, "ec": fieldConductivity, "specificconductance": fieldConductivity,
	"electricalconductivity": fieldConductivity, "cond": fieldConductivity,
	"pressure": fieldPressure,
}

// fieldKey folds case and drops spaces, underscores, hyphens and dots:
// "pH_temperature", "pH temperature" and "PH-Temperature" meet.
func fieldKey(s string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(s) {
		switch r {
		case ' ', '_', '-', '.', '\t', '\u00a0':
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}

// pressureUnit converts a pressure to atm: v·scale + offset (offset 1 atm
// for gauge units).
type pressureUnit struct{ scale, offset float64 }

// pressureUnits are the pressure units a header may carry. 1 atm =
// 101.325 kPa = 1.01325 bar (definition); 1 psi = 6.894757 kPa.
var pressureUnits = map[string]pressureUnit{
	"atm": {1, 0}, "bar": {1 / 1.01325, 0}, "bara": {1 / 1.01325, 0}, "barg": {1 / 1.01325, 1},
	"kpa": {1 / 101.325, 0}, "mpa": {1000 / 101.325, 0},
	"psia": {6.894757 / 101.325, 0}, "psig": {6.894757 / 101.325, 1},
}

// headerColumn is one column of a wide header, or the analyte and unit of a
// long-form row.
type headerColumn struct {
	index   int    // 1-based column number
	header  string // as written, trimmed
	label   string // the header without its unit
	kind    fieldKind
	analyte Analyte
	unit    Unit
	press   pressureUnit
	problem *InputError // non-nil when the column cannot be used
}

// key returns what two columns of one sample may not share.
func (c headerColumn) key() string {
	if c.kind == fieldAnalyte {
		return "analyte " + c.analyte.Name
	}
	return "field " + strconv.Itoa(int(c.kind))
}

// componentKey returns the component a concentration column adds to, or ""
// for alkalinity forms (which Sample.Analysis reconciles) and fields.
func (c headerColumn) componentKey() string {
	if c.kind != fieldAnalyte || c.analyte.IsAlkalinity() {
		return ""
	}
	return c.analyte.Component
}

func (c headerColumn) name() string {
	if c.kind == fieldAnalyte {
		return c.analyte.Name
	}
	return fieldLabels[c.kind]
}

// splitHeader splits "Ca [mg/L]" or "Ca (mg/L)" into label and unit.
// A header with no bracket at its end has no unit.
func splitHeader(h string) (label, unit string, hasUnit bool) {
	switch {
	case strings.HasSuffix(h, "]"):
		if i := strings.LastIndex(h, "["); i >= 0 {
			return strings.TrimSpace(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1]), true
		}
	case strings.HasSuffix(h, ")"):
		depth := 0
		for i := len(h) - 1; i >= 0; i-- {
			switch h[i] {
			case ')':
				depth++
			case '(':
				depth--
				if depth == 0 {
					return strings.TrimSpace(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1]), true
				}
			}
		}
	}
	return h, "", false
}

// normalizeHeader trims a header, makes non-breaking spaces plain and
// collapses runs of spaces.
func normalizeHeader(h string) string {
	h = strings.ReplaceAll(h, "\u00a0", " ")
	return strings.Join(strings.Fields(h), " ")
}

// knownLabel reports whether label names a field or an analyte.
func (rd *reader) knownLabel(label string) bool {
	if _, ok := fieldNames[fieldKey(label)]; ok {
		return true
	}
	_, ok := rd.table.Lookup(label)
	return ok
}

// classify decides what label with unit text unit (hasUnit false when none
// is written) holds. It returns the column with kind fieldUnknown when label
// is not known; a non-nil error says why the column cannot be used, and
// unitFault whether its unit (rather than its label) is at fault.
func (rd *reader) classify(label, unit string, hasUnit bool) (c headerColumn, unitFault bool, err error) {
	c.label = label
	if label == "" && !hasUnit {
		c.kind = fieldBlank
		return c, false, nil
	}
	if k, ok := fieldNames[fieldKey(label)]; ok {
		c.kind = k
	} else if a, ok := rd.table.Lookup(label); ok {
		c.kind, c.analyte = fieldAnalyte, a
	} else {
		return c, false, errUnknownColumn
	}
	switch c.kind {
	case fieldName, fieldDate, fieldComment:
		return c, false, nil // a bracket on a text column is a format hint
	case fieldPH:
		if hasUnit {
			u, err := ParseUnit(unit)
			if err != nil || u.Quantity != Dimensionless {
				return c, true, fmt.Errorf("pH takes no unit, not %q", unit)
			}
		}
		return c, false, nil
	case fieldPressure:
		if !hasUnit {
			return c, true, errors.New("no unit: write pressure [atm], [bar], [kPa], [psia] or [psig]")
		}
		p, ok := pressureUnits[strings.ToLower(strings.ReplaceAll(unit, " ", ""))]
		if !ok {
			return c, true, fmt.Errorf("unknown pressure unit %q (try atm, bar, barg, kPa, MPa, psia, psig)", unit)
		}
		c.press = p
		return c, false, nil
	}
	if !hasUnit {
		return c, true, fmt.Errorf("no unit: write it in brackets, as in %q", exampleHeader(c))
	}
	u, err := ParseUnit(unit)
	if err != nil {
		return c, true, err
	}
	c.unit = u
	switch c.kind {
	case fieldTemperature, fieldPHTemperature:
		if u.Quantity != Temperature {
			return c, true, fmt.Errorf("%s needs a temperature unit (C, F or K), not %q", c.name(), unit)
		}
	case fieldDensity:
		if u.Quantity != Density {
			return c, true, fmt.Errorf("density needs a density unit (kg/L, g/mL, kg/m3), not %q", unit)
		}
	case fieldConductivity:
		if u.Quantity != Conductivity {
			return c, true, fmt.Errorf("conductivity needs a conductivity unit (µS/cm, mS/cm), not %q", unit)
		}
	case fieldTDS:
		if u.Quantity != Concentration || u.amount != byMass || u.Basis != PerLitre || u.As != "" {
			return c, true, fmt.Errorf("TDS needs a mass per litre (mg/L or g/L), not %q", unit)
		}
	case fieldAnalyte:
		if u.Quantity != Concentration {
			return c, true, fmt.Errorf("unit %q is not a concentration", unit)
		}
		if _, err := u.Amount(c.analyte, 1, rd.table); err != nil {
			return c, true, err
		}
	}
	return c, false, nil
}

// exampleHeader returns a well-formed header for the kind of c, for messages.
func exampleHeader(c headerColumn) string {
	switch c.kind {
	case fieldTemperature:
		return c.label + " [C]"
	case fieldPHTemperature:
		return c.label + " [C]"
	case fieldDensity:
		return c.label + " [kg/L]"
	case fieldConductivity:
		return c.label + " [µS/cm]"
	case fieldAnalyte:
		if c.analyte.IsAlkalinity() && c.analyte.Name == "alkalinity" {
			return c.label + " [mg/L as CaCO3]"
		}
	}
	return c.label + " [mg/L]"
}

// ---------------------------------------------------------------------------
// Cells

type cellKind int

const (
	cellBlank       cellKind = iota
	cellNumber               // a plain number
	cellBelow                // "<x": below the detection limit x
	cellAbove                // ">x": above the measuring range
	cellNotDetected          // "n.d." with no limit
	cellBad                  // not a value; err says why
)

// cellValue is one value cell as written; it implements gocsv's
// TypeUnmarshaller for the long form and never fails there, so that a bad
// cell stops its sample and not the file.
type cellValue struct {
	raw  string
	kind cellKind
	v    float64 // the number, or the detection limit
	err  error   // for cellBad
}

// UnmarshalCSV parses s into c; the error is always nil (see cellValue).
func (c *cellValue) UnmarshalCSV(s string) error {
	*c = parseCell(s)
	return nil
}

// notDetected are the spellings of "not detected, no limit given", folded
// to lower case with spaces collapsed.
var notDetected = map[string]bool{
	"nd": true, "n.d.": true, "n.d": true, "n/d": true, "not detected": true, "bdl": true,
	"<dl": true, "< dl": true, "<lod": true, "< lod": true, "below detection limit": true,
}

func parseCell(raw string) cellValue {
	c := cellValue{raw: raw}
	s := strings.Join(strings.Fields(strings.ReplaceAll(raw, "\u00a0", " ")), " ")
	switch {
	case s == "":
		c.kind = cellBlank
	case notDetected[strings.ToLower(s)]:
		c.kind = cellNotDetected
	case s[0] == '<':
		v, err := ParseNumber(s[1:])
		switch {
		case err != nil:
			c.kind, c.err = cellBad, errors.New("a detection limit needs a number after <")
		case v < 0:
			c.kind, c.err = cellBad, errors.New("negative detection limit")
		default:
			c.kind, c.v = cellBelow, v
		}
	case s[0] == '>':
		c.kind = cellAbove
	default:
		v, err := ParseNumber(s)
		switch {
		case err == nil:
			c.kind, c.v = cellNumber, v
		case strings.Contains(s, ","):
			c.kind, c.err = cellBad, errNotNumberComma
		default:
			c.kind, c.err = cellBad, ErrNotNumber
		}
	}
	return c
}

// number returns the plain number of c, or why it is not one.
func (c cellValue) number() (float64, error) {
	switch c.kind {
	case cellNumber:
		return c.v, nil
	case cellBad:
		return 0, c.err
	case cellAbove:
		return 0, errAboveRange
	}
	return 0, ErrNotNumber
}

// ---------------------------------------------------------------------------
// Building a sample

// sampleBuilder collects the cells of one sample.
type sampleBuilder struct {
	s     Sample
	notes []string // warnings on not-detected values
}

// set stores cell v of column c in the sample, or says why it cannot.
func (b *sampleBuilder) set(c headerColumn, v cellValue, policy DetectionPolicy) error {
	if c.kind == fieldAnalyte {
		return b.setConcentration(c, v, policy)
	}
	switch c.kind {
	case fieldName:
		b.s.Name = cleanText(v.raw)
		return nil
	case fieldDate:
		if b.s.Date == "" {
			b.s.Date = cleanText(v.raw)
		}
		return nil
	case fieldComment:
		return nil
	}
	x, err := v.number()
	if err != nil {
		return err
	}
	switch c.kind {
	case fieldTemperature, fieldPHTemperature:
		t := c.unit.ToCelsius(x)
		if t < -2 || t > 300 {
			return fmt.Errorf("%.4g °C is outside -2 to 300 °C", t)
		}
		if c.kind == fieldTemperature {
			b.s.Temperature = t
		} else {
			b.s.PHTemperature = t
		}
	case fieldPH:
		if x < 0 || x > 14 {
			return errors.New("impossible pH: outside 0 to 14")
		}
		b.s.PH = x
	case fieldDensity:
		d := c.unit.ToKgPerLitre(x)
		if d < 0.5 || d > 2.5 {
			return fmt.Errorf("density %.4g kg/L is outside 0.5 to 2.5 kg/L", d)
		}
		b.s.Density = d
	case fieldTDS:
		if x < 0 {
			return errors.New("negative dissolved solids")
		}
		b.s.TDS = x * c.unit.scale * 1000
	case fieldConductivity:
		if x < 0 {
			return errors.New("negative conductivity")
		}
		b.s.Conductivity = c.unit.ToMicroSiemens(x)
	case fieldPressure:
		p := x*c.press.scale + c.press.offset
		if p <= 0 || p > 1000 {
			return fmt.Errorf("pressure %.4g atm is outside 0 to 1000 atm", p)
		}
		b.s.Pressure = p
	default:
		return errNotAField
	}
	return nil
}

func (b *sampleBuilder) setConcentration(c headerColumn, v cellValue, policy DetectionPolicy) error {
	m := Measurement{Analyte: c.analyte, Unit: c.unit, Column: c.label}
	switch v.kind {
	case cellNumber:
		if v.v < 0 {
			return errNegative
		}
		m.Value = v.v
	case cellBelow:
		m.Value, m.BelowDetection, m.Limit = policy.substitute(v.v), true, v.v
	case cellNotDetected:
		b.notes = append(b.notes, c.label+": not detected and no detection limit given: taken as 0")
	case cellAbove:
		return errAboveRange
	case cellBad:
		return v.err
	default:
		return nil
	}
	b.s.Measurements = append(b.s.Measurements, m)
	return nil
}

// analysis converts the sample; notes on not-detected values join the
// warnings.
func (b *sampleBuilder) analysis(table *AnalyteTable) (Analysis, error) {
	a, err := b.s.Analysis(table)
	if err != nil {
		return Analysis{}, err
	}
	a.Warnings = append(a.Warnings, b.notes...)
	return a, nil
}

// ---------------------------------------------------------------------------
// Wide form

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
		if c.kind != fieldUnknown && c.kind != fieldBlank {
			recognised = true
		}
		if err == nil && c.kind != fieldBlank && c.kind != fieldComment && c.kind != fieldName && c.kind != fieldDate {
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

func (rd *reader) readWide(header []string, headerLine int) ([]Record, []error, error) {
	cols, problems, ok := rd.wideColumns(header, headerLine)
	if !ok {
		return nil, nil, rd.fileError(headerLine, errNoHeader)
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
	var records []Record
	for {
		fields, err := rd.cr.Read()
		if err == io.EOF {
			break
		}
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			ie := rd.parseError(pe)
			if k := len(fields); k < len(cols) {
				ie.Column, ie.Header = k+1, clipText(cols[k].header)
			}
			records = append(records, Record{Name: name(fields, pe.StartLine), Line: pe.StartLine, Err: ie})
			continue
		}
		if err != nil {
			return nil, nil, rd.readError(err)
		}
		if blankRecord(fields) {
			continue
		}
		records = append(records, rd.wideRecord(cols, fields, name))
	}
	if len(records) == 0 {
		return nil, nil, rd.fileError(0, errNoSamples)
	}
	return records, problems, nil
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
	b := sampleBuilder{s: NewSample(rec.Name)}
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

// ---------------------------------------------------------------------------
// Long form

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
	longWidth
)

// longTags are the gocsv keys of the long-form columns, in order.
var longTags = [longWidth]string{"line", "bad", "sample", "analyte", "value", "unit", "qualifier", "date"}

// longNames maps a long-form header, folded by fieldKey, to its column.
var longNames = map[string]int{
	"sample": longSample, "samplename": longSample, "sampleid": longSample, "name": longSample, "id": longSample,
	"analyte": longAnalyte, "parameter": longAnalyte, "determinand": longAnalyte,
	"value": longValue, "result": longValue,
	"unit": longUnit, "units": longUnit,
	"qualifier": longQualifier, "qual": longQualifier, "flag": longQualifier,
	"date": longDate, "sampledate": longDate, "samplingdate": longDate,
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
			err = errors.New("unknown column: the long form has sample, analyte, value, unit, qualifier, date")
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
}

func (rd *reader) readLong(header []string, headerLine int) ([]Record, []error, error) {
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
	if len(lr.groups) == 0 {
		return nil, nil, rd.fileError(0, errNoSamples)
	}
	records := make([]Record, 0, len(lr.groups))
	for _, g := range lr.groups {
		for _, line := range g.badLines {
			g.fail(dec.issues[line])
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
		records = append(records, rec)
	}
	return records, problems, nil
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
	g := &longSampleGroup{line: line, b: sampleBuilder{s: NewSample(sample)},
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
	g := lr.group(sample, date, row.Line)
	if row.Bad != "" {
		g.badLines = append(g.badLines, row.Line)
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
	case c.kind == fieldName || c.kind == fieldDate || c.kind == fieldComment || c.kind == fieldBlank:
		g.fail(lr.cellError(row, longAnalyte, row.Analyte, errNotAField))
		return
	}
	if prev, dup := g.seen[c.key()]; dup {
		g.fail(lr.cellError(row, longAnalyte, row.Analyte,
			fmt.Errorf("%s is already reported for this sample on line %d", c.name(), prev)))
		return
	}
	if prev, dup := g.seenComp[c.componentKey()]; dup && c.componentKey() != "" {
		g.fail(lr.cellError(row, longAnalyte, row.Analyte,
			fmt.Errorf("%s is already reported for this sample on line %d", c.componentKey(), prev)))
		return
	}
	g.seen[c.key()] = row.Line
	if k := c.componentKey(); k != "" {
		g.seenComp[k] = row.Line
	}
	v, err := applyQualifier(row.Value, qual)
	if err != nil {
		g.fail(lr.cellError(row, longQualifier, row.Qualifier, err))
		return
	}
	if err := g.b.set(c, v, rd.policy); err != nil {
		g.fail(lr.cellError(row, longValue, row.Value.raw, fmt.Errorf("%s: %w", label, err)))
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

// ---------------------------------------------------------------------------
// Line limit

// lineTooLongError is returned by lineLimiter for a line over MaxLineBytes.
type lineTooLongError struct{ line int }

func (e *lineTooLongError) Error() string { return errLineTooLong.Error() }

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
	chunk := p[:n]
	for {
		i := bytes.IndexByte(chunk, '\n')
		if i < 0 {
			l.n += len(chunk)
			break
		}
		l.n += i
		if l.n > MaxLineBytes {
			break
		}
		l.line++
		l.n = 0
		chunk = chunk[i+1:]
	}
	if l.n > MaxLineBytes {
		l.err = &lineTooLongError{line: l.line + 1}
		return n, l.err
	}
	return n, err
}
