// Package data holds the embedded tables of scalerisk: analytes and their
// reported forms, reagents, the thermodynamic table and the demo waters.
// Every constant in these files carries its source on its row.
package data

import "embed"

// FS holds the embedded tables, read by packages water and saturation.
//
//go:embed *.csv
var FS embed.FS
