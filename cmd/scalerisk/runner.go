package main

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"iter"
	"sync"
	"time"

	"scalerisk/reports"
	"scalerisk/saturation"
	"scalerisk/water"
)

// runner holds what every command that reads waters shares: standard
// input and error, the number of workers, and one tally of bad input and
// of samples that could not be computed, which exit turns into the exit
// status.
type runner struct {
	out      *bufio.Writer // standard output, flushed whenever the writer waits
	stdin    io.Reader
	stderr   io.Writer
	jobs     int
	progress *progress // nil when standard error is not a terminal
	problems int       // bad input: file problems, bad rows, inconsistent analyses
	failures int       // samples that could not be computed
}

// problem reports a fault of the input on stderr and counts it; a note
// on columns not used in the equilibrium (water.ErrNotUsed) is reported
// and not counted.
func (r *runner) problem(err error) {
	r.flush() // the output of the samples before it first; an error resurfaces at the next flush
	r.progress.clear()
	fmt.Fprintln(r.stderr, reports.SafeText(err.Error()))
	if !errors.Is(err, water.ErrNotUsed) {
		r.problems++
	}
}

// sampleError reports the error of a sample computed from a good row,
// naming its file and line, and counts it: an inconsistent analysis as bad
// input, any other as a failure.
func (r *runner) sampleError(file string, line int, err error) {
	r.flush()
	r.progress.clear()
	fmt.Fprintln(r.stderr, reports.SafeText(fmt.Sprintf("%s:%d: %v", file, line, err)))
	if errors.Is(err, saturation.ErrInconsistent) {
		r.problems++
	} else {
		r.failures++
	}
}

// exit maps the tally to the command's error by the worst thing that
// happened: exit status 1 when a sample could not be computed (even when
// other rows were bad input: a failure the user cannot fix by correcting
// the file must not hide behind one they can), else 2 for bad input, else
// success (nil). The messages have been printed.
func (r *runner) exit() error {
	r.progress.clear()
	switch {
	case r.failures > 0:
		return &exitError{code: exitInternal, err: fmt.Errorf("%d sample(s) could not be computed", r.failures), quiet: true}
	case r.problems > 0:
		return &exitError{code: exitBadInput, err: fmt.Errorf("%d input problem(s)", r.problems), quiet: true}
	}
	return nil
}

// item is one thing read from the inputs, in input order: a record (a
// sample, or a bad row carrying its error) of file, or a problem of the
// file that is not a row.
type item struct {
	file    string
	rec     water.Record
	problem error
}

// items yields everything read from the inputs, one at a time, in order,
// counting the bytes read for the progress line.
func (r *runner) items(inputs []input, ropt water.ReadOptions) iter.Seq[item] {
	return func(yield func(item) bool) {
		for _, in := range inputs {
			for rec, err := range records(in, r.stdin, ropt, r.progress) {
				if !yield(item{file: in.name, rec: rec, problem: err}) {
					return
				}
			}
		}
	}
}

// batch is one command's work on every sample of its inputs.
type batch[T any] struct {
	// newWorker returns the function one worker computes good records
	// with (it owns its solver). The error is the sample's, reported and
	// tallied; the result is written all the same.
	newWorker func() func(file string, rec water.Record) (T, error)
	// bad, when not nil, turns a bad row into a result that is written
	// too (assess and report list bad rows); otherwise a bad row is only
	// reported.
	bad func(file string, rec water.Record) T
	// write writes one result; results come in input order. An error
	// stops the run.
	write func(T) error
}

// job is one item, numbered in input order, and what a worker made of it.
type job[T any] struct {
	seq int
	it  item
	out T
	err error
}

// runBatch reads the items of src, computes the good records in r.jobs
// workers and hands each result to b.write in input order as soon as it
// and every earlier one are done, reporting problems and sample errors on
// stderr in the same order. At most a few times r.jobs items are in flight,
// so memory does not grow with the input. A write error cancels the run and
// is returned.
func runBatch[T any](r *runner, src iter.Seq[item], b batch[T]) error {
	jobs := max(r.jobs, 1)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()                        // a write error leaves the reader and the workers: they stop
	window := make(chan struct{}, 4*jobs) // a token per item in flight
	todo := make(chan job[T], jobs)
	done := make(chan job[T], jobs)
	go func() {
		defer close(todo)
		seq := 0
		for it := range src {
			select {
			case window <- struct{}{}:
			case <-ctx.Done():
				return
			}
			select {
			case todo <- job[T]{seq: seq, it: it}:
			case <-ctx.Done():
				return
			}
			seq++
		}
	}()
	var wg sync.WaitGroup
	for range jobs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			work := b.newWorker()
			for res := range todo {
				if res.it.problem == nil && res.it.rec.Err == nil {
					res.out, res.err = work(res.it.file, res.it.rec)
				}
				select {
				case done <- res:
				case <-ctx.Done():
					return
				}
			}
		}()
	}
	go func() {
		wg.Wait()
		close(done)
	}()
	pending := make(map[int]job[T], cap(window))
	next := 0
	var flushed time.Time
	for res := range done {
		pending[res.seq] = res
		for p, ok := pending[next]; ok; p, ok = pending[next] {
			delete(pending, next)
			next++
			<-window
			if err := emit(r, p, b); err != nil {
				return err
			}
			r.progress.done()
		}
		if len(done) == 0 && time.Since(flushed) >= flushEvery {
			// Nothing more is ready: let out what was written (one
			// write for many samples, never held back for long).
			if err := r.flush(); err != nil {
				return err
			}
			flushed = time.Now()
		}
	}
	return r.flush()
}

// flushEvery is how long the output may wait in its buffer while samples
// are still being computed.
const flushEvery = 100 * time.Millisecond

// flush writes out what is buffered for standard output.
func (r *runner) flush() error {
	if r.out == nil {
		return nil
	}
	return r.out.Flush()
}

// emit reports and writes one result.
func emit[T any](r *runner, res job[T], b batch[T]) error {
	it := res.it
	switch {
	case it.problem != nil:
		r.problem(it.problem)
		return nil
	case it.rec.Err != nil:
		r.problem(it.rec.Err)
		if b.bad == nil {
			return nil
		}
		return b.write(b.bad(it.file, it.rec))
	case res.err != nil:
		r.sampleError(it.file, it.rec.Line, res.err)
	}
	return b.write(res.out)
}

// stream runs b over src with r, each worker encoding the samples it
// computed with w (so formatting is parallel too), and writes them in input
// order as soon as each is ready; then it ends the document and maps the
// tally to the exit status. A write error (a closed pipe, a full disk) is
// a failure.
func stream[T any](r *runner, src iter.Seq[item], w *reports.SampleWriter[T], b batch[T]) error {
	encode := func(v T) encoded {
		data, err := w.Encode(v)
		return encoded{data, err}
	}
	eb := batch[encoded]{
		newWorker: func() func(string, water.Record) (encoded, error) {
			work := b.newWorker()
			return func(file string, rec water.Record) (encoded, error) {
				v, err := work(file, rec)
				return encode(v), err
			}
		},
		write: func(e encoded) error {
			if e.err != nil {
				return e.err
			}
			return w.WriteEncoded(e.data)
		},
	}
	if b.bad != nil {
		eb.bad = func(file string, rec water.Record) encoded { return encode(b.bad(file, rec)) }
	}
	err := runBatch(r, src, eb)
	if err == nil {
		err = w.Close()
	}
	if err == nil {
		err = r.flush()
	}
	if err != nil {
		return &exitError{code: exitInternal, err: err}
	}
	return r.exit()
}

// encoded is one sample as it goes into the document, or why it cannot.
type encoded struct {
	data []byte
	err  error
}
