package outfile

import (
	"errors"
	"io"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

func writeString(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

// leftovers lists the temporary files left in dir.
func leftovers(t *testing.T, dir string) []string {
	t.Helper()
	m, err := filepath.Glob(filepath.Join(dir, ".sr-*"))
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func TestWriteNewFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "r.html")
	if err := Write(path, nil, writeString("new")); err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	if fi.Mode().Perm() != NewFileMode {
		t.Errorf("mode %v, want %v", fi.Mode().Perm(), NewFileMode)
	}
	if got, _ := os.ReadFile(path); string(got) != "new" {
		t.Errorf("content %q", got)
	}
	if l := leftovers(t, dir); len(l) > 0 {
		t.Errorf("temporary files left: %v", l)
	}
}

// The case: a 0600 file became 0644.
func TestWriteKeepsMode(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "r.html")
	if err := os.WriteFile(path, []byte("old"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := Write(path, nil, writeString("new")); err != nil {
		t.Fatal(err)
	}
	fi, _ := os.Stat(path)
	if fi.Mode().Perm() != 0o600 {
		t.Errorf("mode %v, want 0600 kept", fi.Mode().Perm())
	}
}

// The case: a symlink was replaced by a plain file.
func TestWriteFollowsSymlink(t *testing.T) {
	dir := t.TempDir()
	sub := filepath.Join(dir, "reports")
	if err := os.Mkdir(sub, 0o755); err != nil {
		t.Fatal(err)
	}
	real := filepath.Join(sub, "real.html")
	link := filepath.Join(dir, "link.html")
	dangling := filepath.Join(dir, "dangling.html")
	if err := os.WriteFile(real, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink("reports/real.html", link); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink("reports/later.html", dangling); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ link, target string }{{link, real}, {dangling, filepath.Join(sub, "later.html")}} {
		if err := Write(tc.link, nil, writeString("new")); err != nil {
			t.Fatal(err)
		}
		fi, err := os.Lstat(tc.link)
		if err != nil || fi.Mode()&fs.ModeSymlink == 0 {
			t.Errorf("%s is no longer a symbolic link (%v)", tc.link, err)
		}
		if got, _ := os.ReadFile(tc.target); string(got) != "new" {
			t.Errorf("%s holds %q, want the new content", tc.target, got)
		}
	}
}

// The cases: -o /dev/null replaced the device as root, a directory
// or a named pipe as the target, and report in.csv -o in.csv (also under
// another name: a hard link and a symbolic link).
func TestWriteRefuses(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	if err := os.WriteFile(in, []byte("lab data"), 0o644); err != nil {
		t.Fatal(err)
	}
	hard := filepath.Join(dir, "hard.csv")
	if err := os.Link(in, hard); err != nil {
		t.Fatal(err)
	}
	soft := filepath.Join(dir, "soft.html")
	if err := os.Symlink("in.csv", soft); err != nil {
		t.Fatal(err)
	}
	fifo := filepath.Join(dir, "fifo")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		path string
		want error
		msg  string
	}{
		{dir, ErrNotRegular, "not a regular file (a directory)"},
		{fifo, ErrNotRegular, "not a regular file (a named pipe)"},
		{in, ErrIsInput, "is one of the inputs: refusing to overwrite it"},
		{dir + "/./in.csv", ErrIsInput, "is one of the inputs"},
		{hard, ErrIsInput, "is one of the inputs"},
		{soft, ErrIsInput, "is one of the inputs"},
		{filepath.Join(dir, "absent", "r.html"), fs.ErrNotExist, "no such file or directory"},
	}
	// A device is only checked, never written: a regression run as root
	// would replace /dev/null with a regular file.
	if err := Check(os.DevNull, nil); !errors.Is(err, ErrNotRegular) || err.Error() != "output /dev/null: not a regular file (a device)" {
		t.Errorf("Check(/dev/null) = %v", err)
	}
	for _, tc := range cases {
		err := Write(tc.path, []string{"-", in}, writeString("html"))
		var pe *PathError
		if !errors.As(err, &pe) || !errors.Is(err, tc.want) || !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("Write(%s) = %v, want a PathError %q", tc.path, err, tc.msg)
		}
	}
	if got, _ := os.ReadFile(in); string(got) != "lab data" {
		t.Errorf("the input was changed: %q", got)
	}
	if l := leftovers(t, dir); len(l) > 0 {
		t.Errorf("temporary files left: %v", l)
	}
}

// The case: a valid 250-character file name failed because of the
// temporary name built from it.
func TestWriteLongName(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, strings.Repeat("r", 245)+".html")
	if err := Write(path, nil, writeString("new")); err != nil {
		t.Fatal(err)
	}
}

func TestWriteFailureLeavesOld(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "r.html")
	if err := os.WriteFile(path, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("boom")
	err := Write(path, nil, func(w io.Writer) error {
		io.WriteString(w, "half")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("err %v, want boom", err)
	}
	var pe *PathError
	if errors.As(err, &pe) {
		t.Errorf("a failure while writing is not a path problem: %v", err)
	}
	if got, _ := os.ReadFile(path); string(got) != "old" {
		t.Errorf("content %q, want the old file", got)
	}
	if l := leftovers(t, dir); len(l) > 0 {
		t.Errorf("temporary files left: %v", l)
	}
}

// The case: a kill left a temporary file behind. SIGINT arrives
// while the file is being written: the temporary file is gone before the
// signal is raised again (here recorded instead of ending the test).
func TestWriteSignalRemovesTemp(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		dir := t.TempDir()
		path := filepath.Join(dir, "r.html")
		raised := make(chan os.Signal, 1)
		raise = func(s os.Signal) { raised <- s }
		t.Cleanup(func() { raise = defaultRaise })
		err := Write(path, nil, func(w io.Writer) error {
			io.WriteString(w, "half")
			if len(leftovers(t, dir)) != 1 {
				t.Error("no temporary file while writing")
			}
			syscall.Kill(os.Getpid(), sig)
			select {
			case s := <-raised:
				if s != sig {
					t.Errorf("raised %v, want %v", s, sig)
				}
			case <-time.After(10 * time.Second):
				t.Fatal("the signal was not handled")
			}
			_, err := io.WriteString(w, "more")
			return err
		})
		if err == nil {
			t.Errorf("%v: Write succeeded after the signal", sig)
		}
		if l := leftovers(t, dir); len(l) > 0 {
			t.Errorf("%v: temporary files left: %v", sig, l)
		}
		if _, err := os.Stat(path); !errors.Is(err, fs.ErrNotExist) {
			t.Errorf("%v: %s exists after the signal", sig, path)
		}
	}
}

// TestWriteKilledProcess: a real process writing a file gets SIGTERM
// while the temporary file exists: it ends by the signal (the default
// action, raised again after the clean-up) and leaves no temporary file
// and no target. The child is this test binary run with OUTFILE_CHILD.
func TestWriteKilledProcess(t *testing.T) {
	if dir := os.Getenv("OUTFILE_CHILD"); dir != "" {
		Write(filepath.Join(dir, "r.html"), nil, func(w io.Writer) error {
			io.WriteString(w, "half")
			os.WriteFile(filepath.Join(dir, "ready"), nil, 0o644)
			time.Sleep(time.Minute) // killed here
			return nil
		})
		os.Exit(0)
	}
	dir := t.TempDir()
	cmd := exec.Command(os.Args[0], "-test.run=^TestWriteKilledProcess$")
	cmd.Env = append(os.Environ(), "OUTFILE_CHILD="+dir)
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	deadline := time.Now().Add(30 * time.Second)
	for {
		if _, err := os.Stat(filepath.Join(dir, "ready")); err == nil {
			break
		}
		if time.Now().After(deadline) {
			cmd.Process.Kill()
			t.Fatal("the child did not start writing")
		}
		time.Sleep(10 * time.Millisecond)
	}
	if len(leftovers(t, dir)) != 1 {
		t.Error("no temporary file while the child writes")
	}
	cmd.Process.Signal(syscall.SIGTERM)
	err := cmd.Wait()
	var ee *exec.ExitError
	if !errors.As(err, &ee) {
		t.Fatalf("child: %v, want death by SIGTERM", err)
	}
	if ws, ok := ee.Sys().(syscall.WaitStatus); !ok || !ws.Signaled() || ws.Signal() != syscall.SIGTERM {
		t.Errorf("child ended with %v, want SIGTERM", err)
	}
	if l := leftovers(t, dir); len(l) > 0 {
		t.Errorf("temporary files left: %v", l)
	}
	if _, err := os.Stat(filepath.Join(dir, "r.html")); !errors.Is(err, fs.ErrNotExist) {
		t.Error("a target was written")
	}
}
