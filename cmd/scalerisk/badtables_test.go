package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestBadTables runs every table of testdata/bad_tables (see its README)
// and compares the exit status and the whole of standard error with the
// file's .want. Before issue 12 the thermo rows but the unknown species
// were accepted silently (exit 0), and a limits file of two profiles used
// the first.
func TestBadTables(t *testing.T) {
	files, err := filepath.Glob("../../testdata/bad_tables/*.csv")
	if err != nil || len(files) == 0 {
		t.Fatalf("no bad tables (%v)", err)
	}
	for _, f := range files {
		want, err := os.ReadFile(strings.TrimSuffix(f, ".csv") + ".want")
		if err != nil {
			t.Fatal(err)
		}
		status, stderr, _ := strings.Cut(string(want), "\n")
		stderr = strings.ReplaceAll(stderr, "FILE", f)
		var args []string
		switch base := filepath.Base(f); {
		case strings.HasPrefix(base, "thermo_"):
			args = []string{"assess", "--demo", "--thermo", f}
		case strings.HasPrefix(base, "limits_"):
			args = []string{"cycles", "--demo", "--limits", f}
		default:
			t.Fatalf("%s: no command for this kind of table", f)
		}
		r := runCLI(t, "", args...)
		if got := "exit " + string(rune('0'+r.code)); got != status || r.stderr != stderr {
			t.Errorf("%s: %s\n%s\nwant %s\n%s", filepath.Base(f), got, r.stderr, status, stderr)
		}
	}
}

// TestLimitsProfileChosen: --limits-profile picks a profile of a file of
// several (the corpus file limits_two_profiles.csv), and is refused where
// it cannot apply.
func TestLimitsProfileChosen(t *testing.T) {
	const f = "../../testdata/bad_tables/limits_two_profiles.csv"
	for _, p := range []string{"summer", "winter"} {
		r := mustRun(t, exitOK, "", "cycles", "--demo", "--limits", f, "--limits-profile", p)
		if !strings.Contains(r.stdout, "under the "+p+" profile") {
			t.Errorf("--limits-profile %s: not used:\n%.300s", p, r.stdout)
		}
	}
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"--limits", f, "--limits-profile", "autumn"}, "scalerisk: " + f + ": no profile \"autumn\" (it holds summer, winter)\n"},
		{[]string{"--limits", "inhibitor", "--limits-profile", "summer"}, "scalerisk: --limits-profile \"summer\": --limits inhibitor is a built-in profile, not a file\n"},
	} {
		r := mustRun(t, exitBadInput, "", append([]string{"cycles", "--demo"}, tc.args...)...)
		if r.stderr != tc.want {
			t.Errorf("%v: stderr %q, want %q", tc.args, r.stderr, tc.want)
		}
	}
}
