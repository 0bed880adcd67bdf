package saturation

import (
	"fmt"
	"math"
	"strings"
	"testing"
)

// TestJointLargeTable: a user's table of 420 invented minerals, every one
// supersaturated in a cooling water, nine compositions among them
// (reciprocal pairs such as CaCO3 + SrSO4 = SrCO3 + CaSO4 and the
// dependent CaMg(CO3)2 = CaCO3 + MgCO3 included). The joint
// precipitation must finish with amounts ≥ 0 and hold at most as many
// minerals at saturation as the reactions have independent directions (the
// phase rule: no more than the number of master species), so its cost is
// bounded however long the table is.
func TestJointLargeTable(t *testing.T) {
	// Each invented mineral copies a real one (reaction, formula, ΔH) with
	// its log K lowered so that it is supersaturated by 0.5 to 1.7 units in
	// the cooling water.
	base := []struct {
		name, formula, reaction string
		logK, dH                float64
	}{
		{"calcite", "CaCO3", "Ca[2+] + CO3[2-]", -8.480, -9.61},
		{"dolomite", "CaMg(CO3)2", "Ca[2+] + Mg[2+] + 2 CO3[2-]", -17.09, -39.48},
		{"magnesite", "MgCO3", "Mg[2+] + CO3[2-]", -8.029, -25.811},
		{"strontianite", "SrCO3", "Sr[2+] + CO3[2-]", -9.271, -1.674},
		{"witherite", "BaCO3", "Ba[2+] + CO3[2-]", -8.562, 2.94},
		{"anhydrite", "CaSO4", "Ca[2+] + SO4[2-]", -4.36, -13.31},
		{"barite", "BaSO4", "Ba[2+] + SO4[2-]", -9.97, 26.568},
		{"celestite", "SrSO4", "Sr[2+] + SO4[2-]", -6.637, -1.668},
		{"fluorite", "CaF2", "Ca[2+] + 2 F[-]", -10.60, 19.623},
	}
	plain, err := Speciate(coolingWater(), Options{})
	if err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	b.WriteString("name,phase,formula,equation,log_k_25,delta_h_kj,a1,a2,a3,a4,a5,a6,t_min_c,t_max_c,ion_size,b_tj,source\n")
	for i := 0; i < 420; i++ {
		m := base[i%len(base)]
		si, _ := plain.SI(m.name)
		target := 0.5 + 0.1*float64(i%13)
		fmt.Fprintf(&b, "invented%d,mineral,%s,invented%d = %s,%.4f,%g,,,,,,,0,100,,,invented test row\n",
			i, m.formula, i, m.reaction, m.logK-(target-si), m.dH)
	}
	table, err := ReadTable("invented.csv", strings.NewReader(b.String()), DefaultTable())
	if err != nil {
		t.Fatal(err)
	}
	m, err := NewModel(table)
	if err != nil {
		t.Fatal(err)
	}
	sp := NewSpeciator(m)
	opt := Options{Model: m}
	r, err := sp.Speciate(coolingWater(), opt)
	if err != nil {
		t.Fatal(err)
	}
	ps, warnings := sp.PrecipitationPotential(r, opt)
	held := 0
	for _, p := range ps {
		if math.IsNaN(p.Together) {
			t.Fatalf("joint precipitation not computed: %v", warnings)
		}
		if p.Together < 0 || p.Alone < 0 {
			t.Errorf("%s: negative amount (alone %g, together %g mg/L)", p.Mineral, p.Alone, p.Together)
		}
		if p.Together > 0 {
			held++
		}
	}
	if len(ps) < 400 {
		t.Errorf("%d minerals precipitate alone, want the 420 invented ones among them", len(ps))
	}
	if held == 0 || held > len(m.masters) {
		t.Errorf("%d minerals held at saturation together, want 1 to %d (the master species)", held, len(m.masters))
	}
}
