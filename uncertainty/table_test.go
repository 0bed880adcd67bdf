package uncertainty

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat"

	"scalerisk/water"
)

// TestDefaults: the embedded table loads, gives every component, the
// alkalinity, pH and temperature a figure with a source, and rejects rows
// that break its rules.
func TestDefaults(t *testing.T) {
	tab := Defaults()
	for c := range water.NumComponents {
		if in, ok := tab.component(c); !ok || in.Source == "" {
			t.Errorf("component %s has no row in data/uncertainty.csv", c)
		}
	}
	for _, i := range []int{tab.alk, tab.ph, tab.temp} {
		if in, ok := tab.row(i); !ok || !(in.U > 0) {
			t.Errorf("alkalinity, pH or temperature lacks a row")
		}
	}
	bad := []tableRow{
		{Input: "Ca", U: 3, Unit: "pH", Source: "x"},         // wrong unit
		{Input: "pH", U: 0.05, Unit: "%", Source: "x"},       // wrong unit
		{Input: "Ca", U: 0, Unit: "%", Source: "x"},          // no uncertainty
		{Input: "Ca", U: 3, Unit: "%"},                       // no source
		{Input: "unobtainium", U: 3, Unit: "%", Source: "x"}, // unknown
	}
	for _, r := range bad {
		if _, err := newTable([]tableRow{r}); err == nil {
			t.Errorf("row %+v accepted", r)
		}
	}
	if _, err := newTable([]tableRow{{Input: "Ca", U: 3, Unit: "%", Source: "x"}, {Input: "Ca-hardness", U: 3, Unit: "%", Source: "x"}}); err == nil {
		t.Errorf("two rows for calcium accepted")
	}
}

// TestBelowDetectionUniform: a value reported below its detection limit is
// drawn evenly between 0 and the limit (JCGM 101:2008, 6.4.2), and no
// concentration is ever negative. The demo makeup water reports Mn <0.01
// mg/L; the mean of 4000 uniform draws lies within three standard errors
// (L/√12/√N) of L/2.
func TestBelowDetectionUniform(t *testing.T) {
	const n = 4000
	a := demoWater(t, 0)
	p, err := newPlan(a, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	draws := p.draws(n, 3)
	found := false
	for j, in := range p.inputs {
		col := make([]float64, n)
		for i := range draws {
			col[i] = draws[i][j]
			if col[i] < 0 {
				t.Fatalf("%s drawn negative: %g", in.Name, col[i])
			}
		}
		if in.Distribution != Uniform {
			continue
		}
		found = true
		lim := in.Value
		mean := stat.Mean(col, nil)
		se := lim / math.Sqrt(12) / math.Sqrt(n)
		if math.Abs(mean-lim/2) > 3*se || floatsMax(col) > lim {
			t.Errorf("%s below detection: mean %.4g, max %.4g; want mean %.4g ± %.2g, max ≤ %.4g", in.Name, mean, floatsMax(col), lim/2, 3*se, lim)
		}
	}
	if !found {
		t.Fatal("the demo makeup water has no below-detection input")
	}
}

func floatsMax(xs []float64) float64 {
	m := math.Inf(-1)
	for _, x := range xs {
		m = math.Max(m, x)
	}
	return m
}

// TestBalanceRule: the kept draws all lie within the bound the rule states
// (Standard Methods 1030 E criterion or the measured balance, whichever is
// wider), some draws of the demo makeup water fall outside it, and KeepAll
// keeps every draw.
func TestBalanceRule(t *testing.T) {
	a := demoWater(t, 0)
	p, err := newPlan(a, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	all := p.draws(500, 5)
	kept, rejected, _ := balanceRule(p, all)
	if rejected == 0 || len(kept)+rejected != len(all) {
		t.Fatalf("kept %d, rejected %d of %d", len(kept), rejected, len(all))
	}
	q0 := a.Quality()
	for _, v := range kept {
		q := p.apply(v).Quality()
		crit, _ := water.BalanceCriterion(q.Anions)
		if crit.Unit != "%" {
			t.Fatalf("the test expects the percent criterion, got %s", crit.Unit)
		}
		if bound := math.Max(math.Abs(q0.BalancePercent), crit.Max); math.Abs(q.BalancePercent) > bound {
			t.Errorf("kept a draw with balance %.2f %%, bound %.2f %%", q.BalancePercent, bound)
		}
	}
}

// TestSampleFigures: a sample's own figure wins over the whole-run one,
// which wins over the table; pH and temperature take the sample's figure
// too.
func TestSampleFigures(t *testing.T) {
	a := readOne(t, "name,temperature [C],pH,pH ±,Ca [mg/L],Ca ± [%],Mg [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n"+
		"w,25,7.5,0.2,100,8,20,150,100\n")
	p, err := newPlan(a, Settings{Relative: 0.07})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]struct {
		u      float64
		origin Origin
	}{
		"Ca": {0.08, FromSample}, "Mg": {0.07, FromRun}, "Cl": {0.07, FromRun}, "alkalinity": {0.07, FromRun},
		"pH": {0.2, FromSample}, "temperature": {0.5, FromTable},
	}
	for _, in := range p.inputs {
		w, ok := want[in.Name]
		if !ok || math.Abs(in.U-w.u) > 1e-12 || in.Origin != w.origin {
			t.Errorf("%s: u %g from %s, want %g from %s", in.Name, in.U, in.Origin, w.u, w.origin)
		}
	}
	if len(p.inputs) != len(want) {
		t.Errorf("%d inputs, want %d", len(p.inputs), len(want))
	}
}
