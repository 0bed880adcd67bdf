// Package reports presents the results of package saturation: text tables
// for a terminal, CSV for spreadsheets and JSON for other programs (whose
// key names are a stable contract). It knows nothing of chemistry beyond the
// result types.
package reports

// Caution is the advisory note every report and the command help carry.
const Caution = "Results are advisory. Saturation indices are guides, not absolutes: confirm them " +
	"with field and laboratory evidence (Standard Methods 2330), and note that they do not " +
	"predict lead or copper release. Water treatment, acid and caustic handling and discharge " +
	"are governed by local codes, permits, manufacturer data (SDS) and licensed practice."
