package water

import (
	"errors"
	"strings"
	"testing"
)

// TestReadRoleSystem: the optional role and system columns of an invented
// Kestrel Fen file are read in the plant's own spellings; an unknown role
// is bad input naming its line and column, and the other rows are read.
func TestReadRoleSystem(t *testing.T) {
	const text = "name,date,role,system,Ca [mg/L],Cl [mg/L]\n" +
		"well 3,2026-04-02,Make-up,Tower 2,60,40\n" +
		"basin,2026-04-02,tower,Tower 2,180,200\n" +
		"odd,2026-04-02,sludge,Tower 2,1,1\n" +
		"reject,2026-04-03,Brine,RO-A,400,900\n" +
		"survey,2026-04-03,,,50,30\n"
	recs, probs, err := Read("kf.csv", strings.NewReader(text), ReadOptions{})
	if err != nil || len(probs) > 0 {
		t.Fatal(err, probs)
	}
	want := []struct {
		role   Role
		system string
		bad    bool
	}{{RoleMakeup, "Tower 2", false}, {RoleRecirculating, "Tower 2", false}, {bad: true},
		{RoleConcentrate, "RO-A", false}, {RoleUnset, "", false}}
	if len(recs) != len(want) {
		t.Fatalf("%d records, want %d", len(recs), len(want))
	}
	for i, w := range want {
		r := recs[i]
		if w.bad {
			var ie *InputError
			if !errors.As(r.Err, &ie) || ie.Line != 4 || ie.Header != "role" || !strings.Contains(ie.Error(), "unknown role") {
				t.Errorf("record %d: error %v, want an unknown role at line 4, column role", i, r.Err)
			}
			continue
		}
		if r.Err != nil {
			t.Fatalf("record %d: %v", i, r.Err)
		}
		if r.Analysis.Role != w.role || r.Analysis.System != w.system {
			t.Errorf("record %d: role %q system %q, want %q %q", i, r.Analysis.Role, r.Analysis.System, w.role, w.system)
		}
	}
}
