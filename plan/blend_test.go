package plan_test

import (
	"strings"
	"testing"

	"scalerisk/plan"
	"scalerisk/saturation"
	"scalerisk/water"
)

// TestBlendLimitsStep: the report's blend of an invented hard Kestrel Fen
// well with a cool river intake is judged against the profile at the bulk
// and at the skin temperature of the settings, as the blend command
// judges it (saturation.JudgeBlend). Calcite is less soluble hot
// (Plummer & Busenberg 1982: log Ksp falls with temperature; bulk pH held
// at the skin, UFC 3-240-13FN Example B-1): with a 60 °C tube wall the
// skin governs and the well's safe share is lower than at the bulk.
func TestBlendLimitsStep(t *testing.T) {
	recs, _, err := water.Read("kestrel.csv", strings.NewReader(
		"name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L]\n"+
			"Kestrel Fen deep well 2,16,7.4,200,40,60,90,250,400,22\n"+
			"Kestrel Fen river intake,10,7.3,24,5,12,18,20,60,6\n"), water.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	as := saturation.AssessRecords("kestrel.csv", recs, saturation.Options{})
	profile, _ := saturation.LimitProfileNamed("no-inhibitor")
	river := recs[1].Analysis
	s := plan.Settings{Speciation: saturation.Options{Skin: 60}, Profile: &profile, Partner: &river, BlendFraction: 0.3}
	p := plan.Compute(as[0], s)
	if err := p.PartErr("blend limits"); err != nil || len(p.Blends) != 1 || p.Blends[0].Judged == nil {
		t.Fatalf("blend limits: %v, blends %+v", err, p.Blends)
	}
	share := p.Blends[0].Judged.Share
	if !share.Judged.SkinGoverns() || !(share.Fraction < share.Judged.AtBulk) || share.AtLeast {
		t.Errorf("safe share of the well %.4f, bulk alone %.4f, judged %+v: want at most a share below the bulk answer, the 60 °C skin governing",
			share.Fraction, share.Judged.AtBulk, share.Judged)
	}
	want, err := saturation.JudgeBlend(as[0].Input, river, 0.3, profile, s.Speciation)
	if err != nil {
		t.Fatal(err)
	}
	if share.Fraction != want.Share.Fraction {
		t.Errorf("report's safe share %.6f, the blend command's %.6f: want one answer", share.Fraction, want.Share.Fraction)
	}
}
