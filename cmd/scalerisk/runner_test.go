package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"strings"
	"testing"
	"time"
)

// mixedWaters returns a wide laboratory file of n invented waters of the
// fictional Kestrel Fen site, cooling-tower and brackish well waters at
// random (seeded), with a bad row every 37th row: a word for a number, a
// negative value, a pH outside 0–14 (an inconsistent analysis, found by
// the speciation), or a short row.
func mixedWaters(n int) string {
	rng := rand.New(rand.NewPCG(11, 7))
	u := func(a, b float64) float64 { return a + (b-a)*rng.Float64() }
	var b strings.Builder
	b.WriteString("name,temperature [C],pH,Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Ba [mg/L],Sr [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L],F [mg/L]\n")
	for i := 1; i <= n; i++ {
		kind, t, ph := "tower", u(15, 45), u(7.0, 8.8)
		ca, mg, na, cl, so4, alk := u(40, 400), u(10, 120), u(20, 400), u(30, 600), u(30, 1000), u(50, 300)
		if rng.IntN(2) == 0 {
			kind, t, ph = "brackish well", u(12, 30), u(6.8, 8.0)
			ca, mg, na, cl, so4, alk = u(100, 800), u(50, 500), u(500, 5000), u(800, 9000), u(200, 3000), u(100, 600)
		}
		phText := fmt.Sprintf("%.2f", ph)
		naText := fmt.Sprintf("%.1f", na)
		row := ""
		if i%37 == 0 {
			switch (i / 37) % 4 {
			case 0:
				naText = "about seven"
			case 1:
				naText = "-3"
			case 2:
				phText = "15.2"
			default:
				row = fmt.Sprintf("Kestrel Fen %s %d,%.1f\n", kind, i, t)
			}
		}
		if row == "" {
			row = fmt.Sprintf("Kestrel Fen %s %d,%.1f,%s,%.1f,%.1f,%s,%.1f,%.3f,%.2f,%.1f,%.1f,%.1f,%.1f,%.2f\n",
				kind, i, t, phText, ca, mg, naText, u(2, 30), u(0.01, 0.3), u(0.1, 12), cl, so4, alk, u(5, 100), u(0.1, 2))
		}
		b.WriteString(row)
	}
	return b.String()
}

// TestJobsSameOutput checks that any number of workers gives the bytes of
// one worker — standard output, standard error and exit status — on a
// file of a few hundred mixed waters with bad rows.
func TestJobsSameOutput(t *testing.T) {
	waters := mixedWaters(300)
	few := mixedWaters(40)
	cases := []struct {
		in   string
		args []string
	}{
		{waters, []string{"assess", "-", "--format", "json"}},
		{few, []string{"assess", "-", "--format", "csv"}},
		{few, []string{"assess", "-", "--format", "text", "--temperature", "60"}},
		{few, []string{"dose", "-", "--reagent", "h2so4", "--target", "lsi=0.5", "--format", "json"}},
		{few, []string{"cycles", "-", "--limits", "inhibitor", "--max", "4", "--format", "csv"}},
		{few, []string{"sweep", "-", "--vary", "temperature=20:80:3", "--format", "text"}},
		{mixedWaters(38), []string{"report", "-", "-o", "-", "--date", "none", "--detail", "2"}},
	}
	for _, c := range cases {
		name := strings.Join(c.args, " ")
		one := runCLI(t, c.in, append(c.args, "--jobs", "1")...)
		if one.code != exitBadInput || one.stderr == "" {
			t.Fatalf("%s --jobs 1: exit %d, want %d with the bad rows reported", name, one.code, exitBadInput)
		}
		for _, jobs := range []string{"4"} {
			many := runCLI(t, c.in, append(c.args, "--jobs", jobs)...)
			if many.code != one.code {
				t.Errorf("%s: exit %d with --jobs %s, %d with --jobs 1", name, many.code, jobs, one.code)
			}
			if many.stdout != one.stdout {
				t.Errorf("%s: --jobs %s output differs from --jobs 1:\n%s", name, jobs, byteDiff(one.stdout, many.stdout))
			}
			if many.stderr != one.stderr {
				t.Errorf("%s: --jobs %s messages differ from --jobs 1:\n%s", name, jobs, byteDiff(one.stderr, many.stderr))
			}
		}
	}
}

// TestBadRowsKept checks the good-rows-kept rule through the runner: every
// row of the file comes out of assess in file order, a bad one with its
// error, and each bad row is reported once on stderr with its file and line.
func TestBadRowsKept(t *testing.T) {
	const n = 150
	r := mustRun(t, exitBadInput, mixedWaters(n), "assess", "-", "--format", "json", "--jobs", "3")
	var doc struct {
		Samples []struct {
			Name  string  `json:"name"`
			Line  int     `json:"line"`
			Error *string `json:"error"`
		} `json:"samples"`
	}
	if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Samples) != n {
		t.Fatalf("%d samples written, want %d (one per row)", len(doc.Samples), n)
	}
	bad := 0
	for i, s := range doc.Samples {
		if s.Line != i+2 {
			t.Fatalf("sample %d comes from line %d, want %d (file order)", i, s.Line, i+2)
		}
		if (s.Line-1)%37 == 0 {
			bad++
			if s.Error == nil {
				t.Errorf("line %d is a bad row but has no error", s.Line)
			}
			if want := fmt.Sprintf("-:%d", s.Line); !strings.Contains(r.stderr, want) {
				t.Errorf("stderr does not report %s", want)
			}
		}
	}
	if got := strings.Count(r.stderr, "\n"); got != bad {
		t.Errorf("stderr has %d lines, want one per bad row (%d):\n%s", got, bad, r.stderr)
	}
}

// TestCompactJSON checks that the default compact JSON is the indented
// document (--indent) with the white space taken out, for every command.
func TestCompactJSON(t *testing.T) {
	for _, args := range [][]string{
		{"assess", "--demo"},
		{"dose", "--demo", "--reagent", "naoh", "--target", "ph=8.5"},
		{"cycles", "--demo", "--max", "3"},
		{"sweep", "--demo", "--vary", "temperature=20:60:2"},
		{"blend", "--demo"},
	} {
		args = append(args, "--format", "json")
		compact := mustRun(t, exitOK, "", args...).stdout
		indented := mustRun(t, exitOK, "", append(args, "--indent")...).stdout
		if strings.Count(compact, "\n") != 1 || !strings.HasPrefix(compact, `{"samples":[{`) {
			t.Errorf("%s: want one compact line starting {\"samples\":[{, got %.60q…", args[0], compact)
		}
		var want bytes.Buffer
		if err := json.Compact(&want, []byte(indented)); err != nil {
			t.Fatalf("%s --indent: %v", args[0], err)
		}
		if compact != want.String()+"\n" {
			t.Errorf("%s: compact JSON is not the indented document compacted:\n%s", args[0], byteDiff(want.String(), compact))
		}
	}
}

// TestNoSamplesJSON checks the document shape when every row is bad.
func TestNoSamplesJSON(t *testing.T) {
	in := "name,pH,Ca [mg/L]\nA,7,-1\n"
	for _, cmd := range []string{"dose", "cycles"} {
		args := []string{cmd, "-", "--format", "json"}
		if cmd == "dose" {
			args = append(args, "--reagent", "h2so4", "--target", "ph=7")
		}
		r := mustRun(t, exitBadInput, in, args...)
		var doc struct {
			Samples []json.RawMessage `json:"samples"`
			Caution string            `json:"caution"`
		}
		if err := json.Unmarshal([]byte(r.stdout), &doc); err != nil || doc.Samples == nil || len(doc.Samples) != 0 || doc.Caution == "" {
			t.Errorf("%s with no good row: %q (%v), want an empty samples array and the caution", cmd, r.stdout, err)
		}
	}
}

// slowInput gives the header and the first rows at once, then blocks until
// release is closed before giving the rest.
type slowInput struct {
	first   io.Reader
	release chan struct{}
	rest    io.Reader
}

func (s *slowInput) Read(p []byte) (int, error) {
	if n, err := s.first.Read(p); err != io.EOF {
		return n, err
	}
	<-s.release
	return s.rest.Read(p)
}

// signalWriter closes got at its first write.
type signalWriter struct {
	bytes.Buffer
	got  chan struct{}
	once bool
}

func (w *signalWriter) Write(p []byte) (int, error) {
	if !w.once {
		w.once = true
		close(w.got)
	}
	return w.Buffer.Write(p)
}

// TestStreams checks that output begins before the input ends: the first
// sample is written while the reader still waits for the rest of the file.
func TestStreams(t *testing.T) {
	file := mixedWaters(40)
	cut := strings.Index(file, "\n") + 1
	cut += strings.Index(file[cut:], "\n") + 1 // header and one row
	for _, format := range []string{"text", "csv", "json"} {
		in := &slowInput{first: strings.NewReader(file[:cut]), release: make(chan struct{}), rest: strings.NewReader(file[cut:])}
		out := &signalWriter{got: make(chan struct{})}
		code := make(chan int)
		go func() { code <- run([]string{"assess", "-", "--format", format, "--jobs", "2"}, in, out, io.Discard) }()
		select {
		case <-out.got:
		case <-time.After(20 * time.Second):
			t.Fatalf("%s: nothing written while the input is open (not streaming)", format)
		}
		close(in.release)
		if c := <-code; c != exitBadInput {
			t.Errorf("%s: exit %d, want %d (the file has a bad row)", format, c, exitBadInput)
		}
	}
}

// failingWriter fails every write after the first n bytes.
type failingWriter struct{ n int }

var errDiskFull = errors.New("no space left on device")

func (w *failingWriter) Write(p []byte) (int, error) {
	if len(p) > w.n {
		return 0, errDiskFull
	}
	w.n -= len(p)
	return len(p), nil
}

// TestWriteErrorStops checks that a failing output stops the run cleanly:
// exit 1, the cause on stderr, no goroutine left blocking the return.
func TestWriteErrorStops(t *testing.T) {
	var stderr bytes.Buffer
	done := make(chan int)
	go func() {
		done <- run([]string{"assess", "-", "--format", "csv", "--jobs", "4"}, strings.NewReader(mixedWaters(200)), &failingWriter{n: 5000}, &stderr)
	}()
	select {
	case code := <-done:
		if code != exitInternal || !strings.Contains(stderr.String(), errDiskFull.Error()) {
			t.Errorf("exit %d, stderr %q; want %d naming %q", code, stderr.String(), exitInternal, errDiskFull)
		}
	case <-time.After(60 * time.Second):
		t.Fatal("the run did not stop after the output failed")
	}
}

// TestProgressLine checks the progress line's content and timing with a
// fake clock: nothing in the first second, then samples, rate and time left
// from the share of the input read; cleared before a message.
func TestProgressLine(t *testing.T) {
	var buf bytes.Buffer
	start := time.Date(2026, 4, 1, 8, 0, 0, 0, time.UTC)
	clock := start
	p := &progress{w: &buf, start: start, total: 1000, now: func() time.Time { return clock }}
	p.read.Store(250)
	for range 10 {
		clock = clock.Add(50 * time.Millisecond)
		p.done()
	}
	if buf.Len() != 0 {
		t.Fatalf("progress shown before a second: %q", buf.String())
	}
	clock = start.Add(2 * time.Second)
	p.done()
	// 11 samples in 2 s; a quarter read in 2 s leaves about 6 s.
	if want := "\r11 samples, 6/s, 25 % read, about 6s left\033[K"; buf.String() != want {
		t.Errorf("progress line %q, want %q", buf.String(), want)
	}
	buf.Reset()
	p.done() // within progressEvery: not redrawn
	if buf.Len() != 0 {
		t.Errorf("redrawn too soon: %q", buf.String())
	}
	p.clear()
	if buf.String() != "\r\033[K" {
		t.Errorf("clear wrote %q", buf.String())
	}
	var silent *progress // not a terminal
	silent.done()
	silent.clear()
	if newProgress(&buf, 0) != nil {
		t.Error("progress made for a writer that is not a terminal")
	}
}

// byteDiff shows where want and got first differ, with a little context
// (compact JSON is one long line).
func byteDiff(want, got string) string {
	i := 0
	for i < len(want) && i < len(got) && want[i] == got[i] {
		i++
	}
	from := max(i-40, 0)
	return fmt.Sprintf("at byte %d:\n  want …%q…\n  got  …%q…", i, want[from:min(i+40, len(want))], got[from:min(i+40, len(got))])
}
