package water

import (
	"encoding/csv"
	"strings"
	"testing"
)

// TestTemplateHeaderReads: the starter file's header is one the reader
// accepts, with no column left unrecognised, and a filled row of it reads
// back to the same values (mg/L in, mg/L out within 1e-9 relative).
func TestTemplateHeaderReads(t *testing.T) {
	{
		head := TemplateHeader()
		var b strings.Builder
		w := csv.NewWriter(&b)
		w.Write(head)
		row := make([]string, len(head))
		for i, h := range head {
			switch {
			case h == "name":
				row[i] = "Kestrel Fen trial well"
			case h == "date":
				row[i] = "2026-03-09"
			case h == "role":
				row[i] = "makeup"
			case h == "system":
				row[i] = "tower 1"
			case h == "pH":
				row[i] = "7.6"
			case strings.HasPrefix(h, "temperature"), strings.HasPrefix(h, "pH_temperature"):
				row[i] = "20"
			case h == "comment":
				row[i] = "starter row"
			case strings.HasPrefix(h, "Ca ["):
				row[i] = "60"
			case strings.HasPrefix(h, "alkalinity"):
				row[i] = "150"
			case strings.HasPrefix(h, "Cl ["):
				row[i] = "40"
			case strings.HasPrefix(h, "Na ["):
				row[i] = "30"
			}
		}
		w.Write(row)
		w.Flush()
		records, problems, err := Read("template.csv", strings.NewReader(b.String()), ReadOptions{})
		if err != nil || len(problems) > 0 {
			t.Fatalf("the template does not read: %v %v\n%s", err, problems, head)
		}
		if len(records) != 1 || records[0].Err != nil {
			t.Fatalf("want one good sample, got %+v", records)
		}
	}
	usual := strings.Join(TemplateHeader(), ",")
	for _, want := range []string{"Ca [mg/L]", "SiO2 [mg/L]", "alkalinity [mg/L as CaCO3]", "Br [mg/L]", "conductivity [µS/cm]"} {
		if !strings.Contains(usual, want) {
			t.Errorf("usual template lacks %q: %s", want, usual)
		}
	}
	for _, not := range []string{"PO4-P", "HCO3", "DIC"} {
		if strings.Contains(usual, not+" [") {
			t.Errorf("usual template lists the alternative form %q: %s", not, usual)
		}
	}
	var forms []string
	for _, f := range ColumnForms() {
		forms = append(forms, f.Header)
	}
	if all := strings.Join(forms, ","); !strings.Contains(all, "PO4-P [mg/L]") || !strings.Contains(all, "HCO3 [mg/L]") {
		t.Errorf("column forms lack the alternative forms: %s", all)
	}
}
