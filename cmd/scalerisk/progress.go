package main

import (
	"fmt"
	"io"
	"os"
	"sync/atomic"
	"time"

	"golang.org/x/term"

	"scalerisk/reports"
)

// isTerminal reports whether w is a terminal (a person is watching).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(int(f.Fd()))
}

// progress shows a line on a terminal's standard error during a long run:
// samples done, their rate and, when the size of the inputs is known, the
// time left (estimated from the bytes read so far). It stays silent for
// the first second, and always when standard error is not a terminal.
type progress struct {
	w       io.Writer
	start   time.Time
	shown   time.Time // when the line was last drawn; zero when not shown
	total   int64     // bytes of the inputs; 0 when unknown (standard input)
	read    atomic.Int64
	samples int
	now     func() time.Time
}

// progressDelay is how long a run goes before the line appears;
// progressEvery is how often it is redrawn.
const (
	progressDelay = time.Second
	progressEvery = 250 * time.Millisecond
)

// newProgress returns the progress of a run over inputs of total bytes
// (0 when unknown) reported on w, or nil when w is not a terminal.
func newProgress(w io.Writer, total int64) *progress {
	if !isTerminal(w) {
		return nil
	}
	return &progress{w: w, start: time.Now(), total: total, now: time.Now}
}

// countingReader counts the bytes read through it into n.
type countingReader struct {
	r io.Reader
	n *atomic.Int64
}

func (c countingReader) Read(p []byte) (int, error) {
	k, err := c.r.Read(p)
	c.n.Add(int64(k))
	return k, err
}

// reader returns r, counting its bytes when p is not nil.
func (p *progress) reader(r io.Reader) io.Reader {
	if p == nil {
		return r
	}
	return countingReader{r: r, n: &p.read}
}

// done counts one more sample written and redraws the line when it is due.
func (p *progress) done() {
	if p == nil {
		return
	}
	p.samples++
	now := p.now()
	elapsed := now.Sub(p.start)
	if elapsed < progressDelay || now.Sub(p.shown) < progressEvery {
		return
	}
	p.shown = now
	rate := float64(p.samples) / elapsed.Seconds()
	line := fmt.Sprintf("%s, %.0f/s", reports.Plural(p.samples, "sample", "samples"), rate)
	if read := p.read.Load(); p.total > 0 && read > 0 {
		f := min(float64(read)/float64(p.total), 1)
		left := time.Duration(float64(elapsed) * (1 - f) / f).Round(time.Second)
		line += fmt.Sprintf(", %.0f %% read, about %s left", 100*f, left)
	}
	fmt.Fprintf(p.w, "\r%s\033[K", line)
}

// clear removes the line, before a message or at the end of the run.
func (p *progress) clear() {
	if p == nil || p.shown.IsZero() {
		return
	}
	fmt.Fprint(p.w, "\r\033[K")
	p.shown = time.Time{}
}

// inputSize is the total size in bytes of inputs, 0 when one of them is
// standard input or cannot be measured.
func inputSize(inputs []input) int64 {
	var total int64
	for _, in := range inputs {
		if in.name == "-" {
			return 0
		}
		if in.embedded {
			continue // small
		}
		fi, err := os.Stat(in.name)
		if err != nil {
			return 0
		}
		total += fi.Size()
	}
	return total
}
