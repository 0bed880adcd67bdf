package water

import (
	"math"
	"testing"
)

// TestPracticalSalinity checks PSS-78 at its defining points: standard
// seawater (S = 35) has C(35, 15 °C, 0) = 42.914 mS/cm, and at 25 °C
// C(35, 25, 0) = 42.914 · r_t(25) = 53.065 mS/cm (UNESCO 1983; the
// conductivity of S = 35 seawater at 25 °C is about 53 mS/cm, from
// memory); a seawater diluted to half the conductivity ratio at 15 °C has
// S = 16.286 by the polynomial (R_t = 0.5: 0.0080 − 0.1692·0.7071 +
// 25.3851·0.5 + 14.0941·0.3536 − 7.0261·0.25 + 2.7081·0.1768, worked by
// hand: 0.0080 − 0.1196 + 12.6926 + 4.9830 − 1.7565 + 0.4787).
func TestPracticalSalinity(t *testing.T) {
	const tol = 0.002 // practical salinity
	for _, c := range []struct {
		ec, t, want float64
		source      string
	}{
		{42914, 15, 35, "PSS-78 definition: R = 1 at 15 °C (UNESCO 1983)"},
		{53065, 25, 35, "C(35, 25 °C, 0) = 42.914 · r_t(25) (UNESCO 1983 r_t polynomial)"},
		{42914 / 2, 15, 16.2861, "R_t = 0.5 at 15 °C, the a_i polynomial worked by hand"},
	} {
		if got := PracticalSalinity(c.ec, c.t); math.Abs(got-c.want) > tol {
			t.Errorf("PracticalSalinity(%g µS/cm, %g °C) = %.4f, want %.4f ± %g (%s)", c.ec, c.t, got, c.want, tol, c.source)
		}
	}
	if !math.IsNaN(PracticalSalinity(-1, 25)) {
		t.Errorf("negative conductivity gave a salinity")
	}
}

// seawaterS35 is standard seawater, S = 35 (the Reference Composition of
// Millero et al. 2008, Table 4, in mmol/kg of seawater times the density
// 1.02334 kg/L at 25 °C; from memory, as in TestConductivitySeawater), with
// a measured conductivity ec µS/cm.
func seawaterS35(t *testing.T, ec float64) Analysis {
	const density = 1.02334
	var vals []qtValue
	for _, v := range []struct {
		analyte string
		value   float64
	}{
		{"Na", 468.9674}, {"Mg", 52.8171}, {"Ca", 10.2821}, {"K", 10.2077}, {"Sr", 0.0907},
		{"Cl", 545.8696 + 0.8421}, {"SO4", 28.2352}, {"F", 0.0683}, {"alkalinity", 2.3045}, {"DIC", 1.9663},
	} {
		unit := "mmol/L"
		if v.analyte == "alkalinity" {
			unit = "meq/L"
		}
		vals = append(vals, qtValue{v.analyte, v.value * density, unit})
	}
	return qtWater(t, "seawater", math.NaN(), ec, vals...)
}

// TestSeawaterQuality: standard seawater with its conductivity (53.06
// mS/cm at 25 °C, PSS-78) is seawater-like, the fresh-water conductivity
// criteria are not applied to it, and its salinities from EC and from the
// composition agree; a conductivity a quarter low fails the salinity
// check; a fresh water keeps the fresh-water criteria.
func TestSeawaterQuality(t *testing.T) {
	q := seawaterS35(t, 53060).Quality()
	if !q.Seawater {
		t.Fatalf("standard seawater not taken as seawater-like")
	}
	for _, c := range q.Checks {
		if c.Criterion.Name != "tds-ratio" && c.Criterion.Name != "salinity-ec" && c.Criterion.AnionSumMax == 0 {
			t.Errorf("fresh-water criterion %s applied to seawater", c.Criterion.Name)
		}
	}
	const tolS = 0.5 // practical salinity: the composition leaves out B and weighs alkalinity as carbonate
	if math.Abs(q.SalinityFromEC-35) > 0.01 || math.Abs(q.SalinityFromComposition-35) > tolS {
		t.Errorf("salinity from EC %.3f (want 35 ± 0.01), from composition %.3f (want 35 ± %g)", q.SalinityFromEC, q.SalinityFromComposition, tolS)
	}
	if qtHasFlag(q.Flags, "EC") || qtHasFlag(q.Flags, "salinity") {
		t.Errorf("standard seawater flagged: %q", q.Flags)
	}
	low := seawaterS35(t, 40000).Quality()
	if !qtHasFlag(low.Flags, "practical salinity") {
		t.Errorf("seawater with EC 40 mS/cm (S ≈ 25.6) not flagged: %q", low.Flags)
	}
	fresh := qtConstructed(t, math.NaN(), 700).Quality()
	if fresh.Seawater || !math.IsNaN(fresh.SalinityFromEC) {
		t.Errorf("a fresh water taken as seawater-like")
	}
	if len(fresh.Checks) != len(QualityCriteria())-2 {
		t.Errorf("fresh water has %d checks, want %d (the balance that applies and the ratios)", len(fresh.Checks), len(QualityCriteria())-2)
	}
}
