package saturation

// Checks of the Pitzer parameter table (data/pitzer.csv): provenance,
// reconciliation with the ion-association table, errors, and tables
// extended at run time.

import (
	"errors"
	"regexp"
	"strings"
	"testing"

	"scalerisk/water"
)

// TestPitzerTable checks the rows of data/pitzer.csv: every parameter has a
// provenance tag, and the reconciliation with the ion-association table is
// complete — every aqueous species of data/thermo.csv made only of the
// Pitzer set's masters is declared a Pitzer species, excluded (its
// interaction already in the binary parameters) or kept, exactly once.
func TestPitzerTable(t *testing.T) {
	tab, err := defaultPitzerTable()
	if err != nil {
		t.Fatal(err)
	}
	tag := regexp.MustCompile(`\[(READ|FROM MEMORY|COMPUTED)[^\]]*\]`)
	declared := map[string]pitzerKind{}
	for _, p := range tab.params {
		if p.kind >= pzSpecies {
			declared[p.names[0]] = p.kind
			continue
		}
		for q := &p; q != nil; q = q.below {
			if !tag.MatchString(q.source) {
				t.Errorf("data/pitzer.csv line %d (%s): source %q has no provenance tag", q.line, q.label(), q.source)
			}
		}
	}
	m := DefaultModel()
	pitzerMaster := map[int]bool{}
	for j, n := range m.masters {
		pitzerMaster[j] = declared[n] == pzSpecies
	}
	for i := len(m.masters); i < len(m.species); i++ {
		sp := &m.species[i]
		all := true
		for _, nt := range sp.nu {
			all = all && pitzerMaster[nt.j]
		}
		_, ok := declared[sp.name]
		if all && !ok {
			t.Errorf("%s is made of Pitzer-set ions but data/pitzer.csv neither declares, excludes nor keeps it", sp.name)
		}
	}
	for name, k := range declared {
		if _, ok := m.speciesIdx[name]; !ok {
			t.Errorf("data/pitzer.csv %s row names %s, which data/thermo.csv lacks", pitzerKindNames[k], name)
		}
	}
	set := pitzerSetT(t)
	if len(set.fallback) != 7 {
		t.Errorf("components outside the Pitzer set: %v, want Fe, Mn, Si, P, F, N, B", set.fallback)
	}
}

// TestPitzerTableErrors: bad rows are located errors.
func TestPitzerTableErrors(t *testing.T) {
	head := strings.Join(pitzerHeader, ",") + "\n"
	species := "species,Na[+],,,,,,,,,,,,,,x\nspecies,Cl[-],,,,,,,,,,,,,,x\nspecies,Ca[2+],,,,,,,,,,,,,,x\n"
	for _, tc := range []struct {
		name, body, want string
	}{
		{"anion first", "beta0,Cl[-],Na[+],,0.1,,,,,,,,,25,25,x [READ]\n", "cation, then an anion"},
		{"no value", "beta0,Na[+],Cl[-],,,,,,,,,,,25,25,x [READ]\n", "required"},
		{"range", "beta0,Na[+],Cl[-],,0.1,,,,,,,,,0,50,x [READ]\n", "25 °C only"},
		{"twice", "theta,Na[+],Ca[2+],,0.1,,,,,,,,,25,25,x\ntheta,Ca[2+],Na[+],,0.1,,,,,,,,,25,25,x\n", "twice"},
		{"undeclared", "beta0,K[+],Cl[-],,0.1,,,,,,,,,25,25,x\n", "no species row"},
		{"kind", "gamma,Na[+],Cl[-],,0.1,,,,,,,,,25,25,x\n", "unknown kind"},
		{"NaN", "beta0,Na[+],Cl[-],,NaN,,,,,,,,,25,25,x\n", "value_25"},
		{"two rows on one side", "beta0,Na[+],Cl[-],,0.1,,1e-3,,,,,,,0,50,x\nbeta0,Na[+],Cl[-],,0.1,,2e-3,,,,,,,0,25,x\n", "end at 25 °C"},
		{"two rows, two values", "beta0,Na[+],Cl[-],,0.1,,1e-3,,,,,,,25,50,x\nbeta0,Na[+],Cl[-],,0.2,,2e-3,,,,,,,0,25,x\n", "same 25 °C value"},
		{"two rows at 25 only", "beta0,Na[+],Cl[-],,0.1,,,,,,,,,25,25,x\nbeta0,Na[+],Cl[-],,0.1,,2e-3,,,,,,,0,25,x\n", "below 25 °C"},
	} {
		_, err := readPitzerTable("p.csv", strings.NewReader(head+species+tc.body))
		var ie *water.InputError
		if !errors.As(err, &ie) || ie.Line < 5 || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want a located error containing %q", tc.name, err, tc.want)
		}
	}
}

// TestPitzerCustomTable: a table extended at run time (--thermo) gets its
// own Pitzer model set; a new species of Pitzer-set ions that
// data/pitzer.csv does not classify is kept with ion-association γ.
func TestPitzerCustomTable(t *testing.T) {
	extra := strings.Join(tableHeader, ",") + "\n" +
		"NaCl[0],aqueous,NaCl,Na[+] + Cl[-] = NaCl[0],-0.5,,,,,,,,25,25,,,invented for a test\n"
	tab, err := DefaultTable().Extend("extra.csv", strings.NewReader(extra))
	if err != nil {
		t.Fatal(err)
	}
	m, err := NewModel(tab)
	if err != nil {
		t.Fatal(err)
	}
	a := newWater("brine", 25, map[water.Component]float64{water.Na: 3, water.Cl: 3, water.Ca: 0.01, water.S: 0.01})
	r, err := Speciate(a, Options{Model: m, Activity: Pitzer})
	if err != nil {
		t.Fatal(err)
	}
	if r.Molality("NaCl[0]") <= 0 {
		t.Error("the added NaCl[0] is missing from the Pitzer result")
	}
	set, err := m.pitzerSet()
	if err != nil || set.posOf[set.model.speciesIdx["NaCl[0]"]] >= 0 {
		t.Errorf("NaCl[0] in the Pitzer set of the extended table: %v; want it kept with ion-association γ", err)
	}
}
