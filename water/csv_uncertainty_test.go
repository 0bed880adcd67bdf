package water

import (
	"strings"
	"testing"
)

// TestUncertaintyColumns: a sample's own uncertainties are read from
// "NAME ±" columns into Analysis.Uncertainty (percent as a fraction, pH
// units, °C), a blank cell gives none, and a wrong unit, an unknown name
// or an impossible value is bad input at its line and column.
func TestUncertaintyColumns(t *testing.T) {
	const good = "name,temperature [C],temperature ± [C],pH,pH ±,Ca [mg/L],Ca ± [%],SO4 [mg/L],SO4 +/- [%],alkalinity [mg/L as CaCO3],alkalinity ± [%]\n" +
		"a,25,1,7.5,0.1,100,4,50,,120,2.5\n"
	recs, problems, err := Read("u.csv", strings.NewReader(good), ReadOptions{})
	if err != nil || len(problems) > 0 || recs[0].Err != nil {
		t.Fatalf("read: %v %v %v", err, problems, recs[0].Err)
	}
	want := map[string]float64{"temperature": 1, "pH": 0.1, "Ca": 0.04, "alkalinity": 0.025}
	got := recs[0].Analysis.Uncertainty
	if len(got) != len(want) {
		t.Errorf("uncertainties %v, want %v", got, want)
	}
	for k, v := range want {
		if g, ok := got[k]; !ok || g < v-1e-12 || g > v+1e-12 {
			t.Errorf("uncertainty of %s = %v, want %v", k, g, v)
		}
	}
	bad := []struct{ csv, column string }{
		{"name,Ca [mg/L],Ca ± [mg/L]\na,100,4\n", "Ca ± [mg/L]"},
		{"name,Ca [mg/L],Xq ± [%]\na,100,4\n", "Xq ± [%]"},
		{"name,temperature [C],temperature ±\na,25,1\n", "temperature ±"},
		{"name,Ca [mg/L],Ca ± [%]\na,100,0\n", "Ca ± [%]"},
		{"name,pH,pH ±\na,7,3\n", "pH ±"},
	}
	for _, b := range bad {
		recs, problems, err := Read("u.csv", strings.NewReader(b.csv), ReadOptions{})
		if err != nil {
			t.Fatalf("%q: %v", b.csv, err)
		}
		var found *InputError
		for _, p := range problems {
			if ie, ok := p.(*InputError); ok {
				found = ie
			}
		}
		if found == nil && len(recs) > 0 {
			found, _ = recs[0].Err.(*InputError)
		}
		if found == nil || found.Header != b.column {
			t.Errorf("%q: error %v, want one naming column %q", b.csv, found, b.column)
		}
	}
}
