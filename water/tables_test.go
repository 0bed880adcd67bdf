package water

import "testing"

// TestAnalytesAreCopies: editing an analyte handed out by the embedded
// table (its aliases) must not change what a later caller gets.
func TestAnalytesAreCopies(t *testing.T) {
	a, ok := Analytes().Lookup("SO4")
	if !ok || len(a.Aliases) == 0 {
		t.Fatalf("SO4 with aliases not in the table: %+v", a)
	}
	want := a.Aliases[0]
	a.Aliases[0] = "edited"
	for _, b := range Analytes().All() {
		if b.Name == a.Name && b.Aliases[0] != want {
			t.Errorf("All after editing Lookup's aliases: %q, want %q", b.Aliases[0], want)
		}
	}
	all := Analytes().All()
	for i := range all {
		for k := range all[i].Aliases {
			all[i].Aliases[k] = "edited"
		}
	}
	if b, _ := Analytes().Lookup("SO4"); b.Aliases[0] != want {
		t.Errorf("Lookup after editing All's aliases: %q, want %q", b.Aliases[0], want)
	}
	if b, ok := Analytes().FormOf(a.Component, "SO4"); ok && len(b.Aliases) > 0 {
		b.Aliases[0] = "edited"
		if c, _ := Analytes().Lookup("SO4"); c.Aliases[0] != want {
			t.Errorf("Lookup after editing FormOf's aliases: %q, want %q", c.Aliases[0], want)
		}
	}
}
