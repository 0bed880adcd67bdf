package water

import (
	"errors"
	"os"
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

// TestReadLongRoleSystem: a long-form file (invented Kestrel Fen waters,
// testdata/lab/kestrel_fen_long_roles.csv) carries role and system per
// sample as the wide form's columns do: given on any of the sample's rows,
// in the plant's spellings, blank elsewhere. A role or system that
// contradicts an earlier row of the same sample is an error naming file,
// line and column; the other samples are computed, and the long-form
// makeup and tower of Tower 2 pair as a wide file's would.
func TestReadLongRoleSystem(t *testing.T) {
	const path = "testdata/lab/kestrel_fen_long_roles.csv"
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, probs, err := Read(path, f, ReadOptions{})
	if err != nil || len(probs) > 0 {
		t.Fatal(err, probs)
	}
	want := []struct {
		name   string
		role   Role
		system string
		// a bad sample: the line and header of its error and words in it
		line, column int
		header       string
		words        string
	}{
		{name: "Well 3 makeup", role: RoleMakeup, system: "Tower 2"},
		{name: "Tower 2 basin", role: RoleRecirculating, system: "Tower 2"},
		{name: "Tower 3 basin", line: 11, column: 3, header: "role", words: "role blowdown differs from recirculating given for this sample on line 10"},
		{name: "Tower 4 basin", line: 13, column: 4, header: "system", words: `system "Tower 5" differs from "Tower 4" given for this sample on line 12`},
		{name: "Survey well", role: RoleUnset, system: ""},
	}
	if len(recs) != len(want) {
		t.Fatalf("%d records, want %d", len(recs), len(want))
	}
	var good []Analysis
	for i, w := range want {
		r := recs[i]
		if r.Name != w.name {
			t.Fatalf("record %d is %q, want %q", i, r.Name, w.name)
		}
		if w.line != 0 {
			var ie *InputError
			if !errors.As(r.Err, &ie) || ie.File != path || ie.Line != w.line || ie.Column != w.column ||
				ie.Header != w.header || !strings.Contains(ie.Error(), w.words) {
				t.Errorf("%s: error %v, want %s:%d:%d, column %s: %s", w.name, r.Err, path, w.line, w.column, w.header, w.words)
			}
			continue
		}
		if r.Err != nil {
			t.Fatalf("%s: %v", w.name, r.Err)
		}
		if r.Analysis.Role != w.role || r.Analysis.System != w.system {
			t.Errorf("%s: role %q system %q, want %q %q", w.name, r.Analysis.Role, r.Analysis.System, w.role, w.system)
		}
		good = append(good, r.Analysis)
	}
	pairs, notes := Pairs(good)
	if len(pairs) != 1 || good[pairs[0].Makeup].Name != "Well 3 makeup" || good[pairs[0].Tower].Name != "Tower 2 basin" || !pairs[0].SameDate {
		t.Errorf("pairs %+v (notes %q), want Well 3 makeup with Tower 2 basin on the same date", pairs, notes)
	}
}
