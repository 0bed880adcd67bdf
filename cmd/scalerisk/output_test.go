package main

import (
	"os"
	"path/filepath"
	"syscall"
	"testing"
)

// TestReportOutputTargets: the output cases of issue 12, each with its
// exact message and exit status (README "Exit status": a target that
// cannot be used is bad input, exit 2, and nothing is written).
func TestReportOutputTargets(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	lab := "name,temperature [C],pH,Ca [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\ngood,25,7.8,80,100,150\n"
	if err := os.WriteFile(in, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "in-link.html")
	if err := os.Symlink("in.csv", link); err != nil {
		t.Fatal(err)
	}
	fifo := filepath.Join(dir, "fifo.html")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args []string
		want string
	}{
		// Before: as root /dev/null was replaced by a regular file. A
		// named pipe stands in for the device here, so that a regression
		// run as root cannot break the machine (outfile's test checks
		// /dev/null itself without writing).
		// Before: the lab's input was overwritten with HTML.
		{[]string{"report", in, "-o", in}, "scalerisk: output " + in + ": is one of the inputs: refusing to overwrite it\n"},
		{[]string{"report", in, "-o", link}, "scalerisk: output " + link + ": is one of the inputs: refusing to overwrite it\n"},
		{[]string{"report", "--demo", "--blend-with", in, "-o", in}, "scalerisk: output " + in + ": is one of the inputs: refusing to overwrite it\n"},
		{[]string{"report", in, "-o", dir}, "scalerisk: output " + dir + ": not a regular file (a directory)\n"},
		{[]string{"report", in, "-o", fifo}, "scalerisk: output " + fifo + ": not a regular file (a named pipe)\n"},
		{[]string{"report", in, "-o", filepath.Join(dir, "absent", "r.html")},
			"scalerisk: output " + filepath.Join(dir, "absent", "r.html") + ": no such file or directory\n"},
	}
	for _, tc := range cases {
		r := mustRun(t, exitBadInput, "", tc.args...)
		if r.stderr != tc.want {
			t.Errorf("%v: stderr %q, want %q", tc.args, r.stderr, tc.want)
		}
	}
	if got, _ := os.ReadFile(in); string(got) != lab {
		t.Errorf("the input was changed: %.80q", got)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 3 {
		t.Errorf("%d entries in the directory, want 3 (nothing written)", len(entries))
	}
}

// TestReportOutputKeepsFile: an existing 0600 report keeps its mode and a
// report reached through a symbolic link is written through it (before:
// 0644 and a plain file in place of the link).
func TestReportOutputKeepsFile(t *testing.T) {
	dir := t.TempDir()
	real := filepath.Join(dir, "real.html")
	if err := os.WriteFile(real, []byte("old"), 0o600); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.html")
	if err := os.Symlink("real.html", link); err != nil {
		t.Fatal(err)
	}
	mustRun(t, exitOK, "", "report", "--demo", "--detail", "1", "-o", link)
	fi, err := os.Lstat(link)
	if err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Fatalf("the link was replaced (%v)", err)
	}
	fi, _ = os.Stat(real)
	if fi.Mode().Perm() != 0o600 || fi.Size() < 1000 {
		t.Errorf("real.html: mode %v, %d bytes; want 0600 and the report", fi.Mode().Perm(), fi.Size())
	}
}

// TestWorstExitWins: a sample that could not be computed (exit 1) is not
// hidden by a bad row elsewhere (exit 2); before issue 12 bad input won.
func TestWorstExitWins(t *testing.T) {
	for _, tc := range []struct {
		problems, failures, want int
	}{{0, 0, exitOK}, {3, 0, exitBadInput}, {0, 1, exitInternal}, {3, 1, exitInternal}} {
		r := &runner{problems: tc.problems, failures: tc.failures}
		code := exitOK
		if err := r.exit(); err != nil {
			code = err.(*exitError).code
		}
		if code != tc.want {
			t.Errorf("%d problems, %d failures: exit %d, want %d", tc.problems, tc.failures, code, tc.want)
		}
	}
}

// TestPartnerBadFirstRow: a partner file whose first row is bad is an
// error at that row for blend and report --blend-with (before: skipped
// silently, the second row blended, exit 0).
func TestPartnerBadFirstRow(t *testing.T) {
	dir := t.TempDir()
	partner := filepath.Join(dir, "partner.csv")
	lab := "name,temperature [C],pH,Ca [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n" +
		"bad,25,7.8,-3,100,150\ngood,25,7.8,80,100,150\n"
	if err := os.WriteFile(partner, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	want := "scalerisk: " + partner + `:2:4: column "Ca [mg/L]": value "-3": negative concentration` + "\n"
	for _, args := range [][]string{
		{"blend", "--demo", partner, "--fraction", "0.5"},
		{"report", "--demo", "--blend-with", partner, "-o", filepath.Join(dir, "r.html")},
	} {
		r := mustRun(t, exitBadInput, "", args...)
		if r.stderr != want {
			t.Errorf("%v: stderr %q, want %q", args[0], r.stderr, want)
		}
	}
}

// TestPartnerNotComputable: a partner water that cannot be computed (pH 12
// with alkalinity 0: inconsistent) is bad input at its file and line for
// blend, report --blend-with and sweep --partner (before: blend exit 1
// naming no file or line; report exit 0 with the blend failed in every
// section).
func TestPartnerNotComputable(t *testing.T) {
	dir := t.TempDir()
	partner := filepath.Join(dir, "caustic.csv")
	lab := "name,temperature [C],pH,Na [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\ncaustic,25,12,100,100,0\n"
	if err := os.WriteFile(partner, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	want := "scalerisk: " + partner + ":2: caustic: inconsistent analysis: pH 12 and alkalinity 0 meq/kg do not fit: the non-carbonate species alone give 11.09 meq/kg\n"
	for _, args := range [][]string{
		{"blend", "--demo", partner, "--fraction", "0.5"},
		{"report", "--demo", "--blend-with", partner, "-o", filepath.Join(dir, "r.html")},
		{"sweep", "--demo", "--vary", "fraction=0:1:3", "--partner", partner},
	} {
		r := mustRun(t, exitBadInput, "", args...)
		if r.stderr != want {
			t.Errorf("%v: stderr %q, want %q", args[0], r.stderr, want)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "r.html")); err == nil {
		t.Error("a report was written")
	}
}
