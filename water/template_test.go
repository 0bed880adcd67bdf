package water

import (
	"encoding/csv"
	"errors"
	"math"
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
		if err != nil || len(problems) > 1 || len(problems) == 1 && !errors.Is(problems[0], ErrNotUsed) {
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

// TestTemplateCheckColumns: the starter file lists total hardness and
// P-alkalinity, and a filled row reads back to the same values (in mg/L as
// CaCO3, the template's unit), which the lab checks then use; every other
// name --list gives for them is read as the same measurement. The only
// problem of the read is the note on the columns passed through. The row
// is the invented Kestrel Fen makeup of testdata/lab/kestrel_fen_lab.csv:
// Ca 80 and Mg 12 mg/L are 249.2 mg/L as CaCO3 (2.497 Ca + 4.118 Mg,
// Standard Methods 2340 B, from memory), within 10 % of the 250 reported.
func TestTemplateCheckColumns(t *testing.T) {
	head := TemplateHeader()
	fill := map[string]string{"name": "Kestrel Fen makeup", "temperature [C]": "12", "pH": "7.9",
		"Ca [mg/L]": "80", "Mg [mg/L]": "12", "Na [mg/L]": "25", "K [mg/L]": "4", "Cl [mg/L]": "40",
		"SO4 [mg/L]": "60", "alkalinity [mg/L as CaCO3]": "180",
		"total hardness [mg/L as CaCO3]": "250", "P-alkalinity [mg/L as CaCO3]": "0"}
	for _, c := range CheckColumns() {
		if _, ok := fill[c.Header]; !ok {
			t.Fatalf("no value for check column %q", c.Header)
		}
	}
	read := func(head []string) Analysis {
		t.Helper()
		var b strings.Builder
		w := csv.NewWriter(&b)
		w.Write(head)
		row := make([]string, len(head))
		for i, h := range head {
			row[i] = fill[h]
		}
		w.Write(row)
		w.Flush()
		records, problems, err := Read("template.csv", strings.NewReader(b.String()), ReadOptions{})
		if err != nil || len(problems) != 1 || !errors.Is(problems[0], ErrNotUsed) {
			t.Fatalf("read: %v, problems %v; want only the note on the columns passed through", err, problems)
		}
		if len(records) != 1 || records[0].Err != nil {
			t.Fatalf("want one good sample, got %+v", records)
		}
		return records[0].Analysis
	}
	const tol = 1e-9 // mg/L as CaCO3: the template's unit, read as written
	a := read(head)
	if math.Abs(a.TotalHardness-250) > tol || math.Abs(a.PAlkalinity) > tol {
		t.Errorf("total hardness %g, P-alkalinity %g; want 250 and 0 mg/L as CaCO3", a.TotalHardness, a.PAlkalinity)
	}
	if lab := a.Quality().Lab; len(lab) != 3 || !lab[0].Pass || !lab[1].Pass || !lab[2].Pass {
		t.Errorf("lab checks %+v, want hardness and the two P-alkalinity checks, all passing", lab)
	}
	// Every other name of a check column reads as the same measurement.
	for _, c := range CheckColumns() {
		label, unit, _ := splitHeader(c.Header)
		for _, alias := range c.Aliases {
			h := append([]string(nil), head...)
			for i := range h {
				if h[i] == c.Header {
					h[i] = alias + " [" + unit + "]"
					fill[h[i]] = fill[c.Header]
				}
			}
			b := read(h)
			if math.Abs(b.TotalHardness-250) > tol || math.Abs(b.PAlkalinity) > tol {
				t.Errorf("%s as %q: total hardness %g, P-alkalinity %g; want 250 and 0", label, alias, b.TotalHardness, b.PAlkalinity)
			}
			if len(b.Other) != 2 || b.Other[0].Name != "total hardness" || b.Other[1].Name != "P-alkalinity" {
				t.Errorf("%s as %q: other values %+v, want total hardness and P-alkalinity by name", label, alias, b.Other)
			}
		}
	}
}
