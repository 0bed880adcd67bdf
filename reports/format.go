package reports

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// Format is an output format.
type Format int

// The output formats.
const (
	Text Format = iota
	CSV
	JSON
)

// ParseFormat parses "text", "csv" or "json".
func ParseFormat(s string) (Format, error) {
	switch s {
	case "text", "":
		return Text, nil
	case "csv":
		return CSV, nil
	case "json":
		return JSON, nil
	}
	return Text, fmt.Errorf("unknown format %q (want text, csv or json)", s)
}

func (f Format) String() string { return [...]string{"text", "csv", "json"}[f] }

// sig rounds x to n significant digits; NaN and ±Inf become 0 (callers
// leave such values out before they reach output).
func sig(x float64, n int) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) || x == 0 {
		return 0
	}
	v, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'g', n, 64), 64)
	return v
}

// dec rounds x to n decimals.
func dec(x float64, n int) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	p := math.Pow(10, float64(n))
	v := math.Round(x*p) / p
	if v == 0 {
		return 0 // no negative zero
	}
	return v
}

// optional returns a pointer to x rounded by round, or nil when x is NaN or
// infinite, so that JSON leaves the key out.
func optional(x float64, round func(float64) float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	v := round(x)
	return &v
}

// Layout says how one command writes one sample in each format; a
// SampleWriter runs it for every sample.
type Layout[T any] struct {
	// JSON returns the JSON object of a sample, an element of the
	// document's "samples" array.
	JSON func(T) any
	// Header is the CSV header; CSV returns the rows of a sample (none, one
	// or several).
	Header []string
	CSV    func(T) [][]string
	// Text writes the text block of a sample.
	Text func(*strings.Builder, T)
	// Caution ends every document: the "caution" key of JSON, the last
	// paragraph of text.
	Caution string
}

// WriteOptions configures a SampleWriter.
type WriteOptions struct {
	// Indent writes JSON indented by two spaces, one key per line; the
	// default is compact JSON.
	Indent bool
	// RawCSV writes CSV cells as they are; by default a cell a spreadsheet
	// would run as a formula is neutralised (SafeCSVCell).
	RawCSV bool
	// Species adds the speciation table to assess's text (it is always in
	// the JSON).
	Species bool
}

// SampleWriter writes the samples of one command one at a time, as each is
// computed, so that output begins with the first sample and memory does
// not grow with their number: JSON as one document
// {"samples":[…],"caution":"…"} whose array is streamed, CSV as one header
// and the rows of each sample, text as one block per sample (blank lines
// between) and the caution at the end. Close ends the document.
//
// Write encodes and writes a sample. A batch can split the two: Encode is
// safe to call from many goroutines at once (workers encode the samples
// they computed), and WriteEncoded writes them in order.
type SampleWriter[T any] struct {
	w      io.Writer
	f      Format
	layout Layout[T]
	opt    WriteOptions
	header []byte // the CSV header line
	n      int
	buf    []byte
	err    error
}

// NewSampleWriter returns a writer of samples laid out by layout in format
// f to w.
func NewSampleWriter[T any](w io.Writer, f Format, layout Layout[T], opt WriteOptions) *SampleWriter[T] {
	sw := &SampleWriter[T]{w: w, f: f, layout: layout, opt: opt}
	if f == CSV {
		header := [][]string{append([]string(nil), layout.Header...)}
		if !opt.RawCSV {
			header = safeCSVRows(header)
		}
		sw.header, sw.err = csvBytes(header)
	}
	return sw
}

// csvBytes is rows as CSV.
func csvBytes(rows [][]string) ([]byte, error) {
	var b bytes.Buffer
	cw := csv.NewWriter(&b)
	if err := cw.WriteAll(rows); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// Encode returns the bytes of one sample in the document: its JSON object,
// its CSV rows or its text block. It shares nothing mutable with the
// writer or other calls.
func (sw *SampleWriter[T]) Encode(v T) ([]byte, error) {
	switch sw.f {
	case JSON:
		var b bytes.Buffer
		enc := json.NewEncoder(&b)
		enc.SetEscapeHTML(false)
		if sw.opt.Indent {
			enc.SetIndent("    ", "  ") // elements sit two levels deep in the document
		}
		if err := enc.Encode(sw.layout.JSON(v)); err != nil {
			return nil, err
		}
		return bytes.TrimSuffix(b.Bytes(), []byte("\n")), nil
	case CSV:
		rows := sw.layout.CSV(v)
		if !sw.opt.RawCSV {
			rows = safeCSVRows(rows)
		}
		return csvBytes(rows)
	}
	var b strings.Builder
	sw.layout.Text(&b, v)
	return []byte(SafeText(b.String())), nil
}

// Write writes one sample; after the first error every call returns it.
func (sw *SampleWriter[T]) Write(v T) error {
	if sw.err != nil {
		return sw.err
	}
	b, err := sw.Encode(v)
	if err != nil {
		sw.err = err
		return err
	}
	return sw.WriteEncoded(b)
}

// WriteEncoded writes one sample encoded by Encode, after what goes
// before it in the document (the start of the document, the CSV header, a
// comma or a blank line), in one write.
func (sw *SampleWriter[T]) WriteEncoded(b []byte) error {
	if sw.err != nil {
		return sw.err
	}
	first := sw.n == 0
	sw.n++
	sw.buf = sw.buf[:0]
	switch sw.f {
	case JSON:
		sw.buf = append(sw.buf, sw.jsonLead(first)...)
	case CSV:
		if first {
			sw.buf = append(sw.buf, sw.header...)
		}
	default:
		if !first {
			sw.buf = append(sw.buf, '\n')
		}
	}
	sw.buf = append(sw.buf, b...)
	_, sw.err = sw.w.Write(sw.buf)
	return sw.err
}

// jsonLead is what goes before a sample in the JSON document: the start of
// the document before the first, a comma before the others.
func (sw *SampleWriter[T]) jsonLead(first bool) string {
	switch {
	case first && sw.opt.Indent:
		return "{\n  \"samples\": [\n    "
	case first:
		return `{"samples":[`
	case sw.opt.Indent:
		return ",\n    "
	}
	return ","
}

// Close ends the document: the end of the JSON array and the caution, the
// CSV header when there was no sample, the caution of text.
func (sw *SampleWriter[T]) Close() error {
	if sw.err != nil {
		return sw.err
	}
	var tail string
	switch sw.f {
	case JSON:
		caution := jsonString(sw.layout.Caution)
		switch {
		case sw.n == 0 && sw.opt.Indent:
			tail = "{\n  \"samples\": [],\n  \"caution\": " + caution + "\n}\n"
		case sw.n == 0:
			tail = `{"samples":[],"caution":` + caution + "}\n"
		case sw.opt.Indent:
			tail = "\n  ],\n  \"caution\": " + caution + "\n}\n"
		default:
			tail = `],"caution":` + caution + "}\n"
		}
	case CSV:
		if sw.n == 0 {
			tail = string(sw.header)
		}
	default:
		tail = "\n" + wrap(sw.layout.Caution, 78) + "\n"
	}
	_, sw.err = io.WriteString(sw.w, tail)
	return sw.err
}

// jsonString is s as a JSON string, without HTML escaping.
func jsonString(s string) string {
	var b strings.Builder
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	enc.Encode(s) // a string always encodes
	return strings.TrimSuffix(b.String(), "\n")
}

// WriteAll writes the samples vs and ends the document.
func (sw *SampleWriter[T]) WriteAll(vs ...T) error {
	for _, v := range vs {
		if err := sw.Write(v); err != nil {
			return err
		}
	}
	return sw.Close()
}
