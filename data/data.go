// Package data holds the embedded tables of scalerisk: analytes and their
// reported forms, reagents, the thermodynamic table, limit profiles and the
// demo waters. Every constant in these files carries its source on its row.
package data

import (
	"embed"
	"encoding/csv"
	"fmt"
	"io/fs"

	"github.com/gocarina/gocsv"
)

// tables holds the embedded tables, read by packages water and saturation
// through Open and Unmarshal.
//
//go:embed *.csv
var tables embed.FS

// Open opens the embedded table name (for example "thermo.csv") for
// reading. The tables are read-only.
func Open(name string) (fs.File, error) { return tables.Open(name) }

// Unmarshal reads the embedded table name (lines starting with # are
// comments) into out, a pointer to a slice of structs with csv tags, as
// gocsv.UnmarshalCSV does. Errors name the file.
func Unmarshal(name string, out any) error {
	f, err := tables.Open(name)
	if err != nil {
		return err
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	if err := gocsv.UnmarshalCSV(r, out); err != nil {
		return fmt.Errorf("data/%s: %w", name, err)
	}
	return nil
}
