// Package outfile writes the files a command produces whole or not at all,
// and refuses targets that would destroy something else: a device, a
// directory or a named pipe given as the output, or one of the command's
// own inputs.
//
// It sits directly under cmd and beside reports in the import chain
// (cmd → reports → outfile; it imports only the standard library).
package outfile

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"os/signal"
	"path/filepath"
	"sync"
	"syscall"
)

// PathError is a target that cannot be used as an output: it is not a
// regular file, it is one of the inputs, or its directory does not exist
// or cannot be written. Nothing was written. Commands treat it as bad
// input (the user named the wrong path); any other error of Write is a
// failure while writing.
type PathError struct {
	Path string
	Err  error
}

func (e *PathError) Error() string { return fmt.Sprintf("output %s: %v", e.Path, e.Err) }
func (e *PathError) Unwrap() error { return e.Err }

// Errors a PathError may wrap, beside those of the file system.
var (
	ErrNotRegular = errors.New("not a regular file")
	ErrIsInput    = errors.New("is one of the inputs: refusing to overwrite it")
)

// NewFileMode is the mode of a file Write creates (an existing file keeps
// its own).
const NewFileMode fs.FileMode = 0o644

// maxLinks bounds the symbolic links followed to the target (the limit of
// Linux's path resolution).
const maxLinks = 40

// Write writes what fill writes to path whole or not at all.
//
// A symbolic link is followed to its target, which is written (the link
// stays a link). The target must be a regular file or not exist yet, and
// must not be the same file (by identity, os.SameFile, not by name) as
// any of inputs; otherwise Write returns a *PathError before anything is
// written. The content goes to a temporary file with a short name in the
// target's directory, is synced and renamed over the target, which keeps
// an existing file's permission bits (a new file gets NewFileMode). When
// fill or a step fails, or the process gets SIGINT or SIGTERM while the
// temporary file exists, the temporary file is removed and any earlier
// file at path is untouched; a signal is then delivered again with its
// default action.
func Write(path string, inputs []string, fill func(io.Writer) error) error {
	target, mode, err := check(path, inputs)
	if err != nil {
		return err
	}
	f, err := os.CreateTemp(filepath.Dir(target), ".sr-*")
	if err != nil {
		return &PathError{Path: path, Err: unwrapPath(err)}
	}
	t := &temp{f: f}
	stop := t.watch()
	defer stop()
	if err := t.fill(fill, mode); err != nil {
		t.remove()
		return err
	}
	return t.rename(target)
}

// Check returns the *PathError Write would return for path and inputs
// before anything is written, so that a command can refuse a bad target
// before its work.
func Check(path string, inputs []string) error {
	_, _, err := check(path, inputs)
	return err
}

// check resolves path to the file to write and returns it with the mode
// that file should have.
func check(path string, inputs []string) (string, fs.FileMode, error) {
	target, err := resolve(path)
	if err != nil {
		return "", 0, &PathError{Path: path, Err: err}
	}
	fi, err := os.Stat(target)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return target, NewFileMode, nil
	case err != nil:
		return "", 0, &PathError{Path: path, Err: unwrapPath(err)}
	case !fi.Mode().IsRegular():
		return "", 0, &PathError{Path: path, Err: fmt.Errorf("%w (%s)", ErrNotRegular, kind(fi.Mode()))}
	}
	for _, in := range inputs {
		if ii, err := os.Stat(in); err == nil && os.SameFile(fi, ii) {
			return "", 0, &PathError{Path: path, Err: ErrIsInput}
		}
	}
	return target, fi.Mode().Perm(), nil
}

// resolve follows symbolic links from path to the name of the file they
// lead to, which need not exist yet (a dangling link names the file to
// create).
func resolve(path string) (string, error) {
	for range maxLinks {
		fi, err := os.Lstat(path)
		if err != nil || fi.Mode()&fs.ModeSymlink == 0 {
			return path, nil
		}
		link, err := os.Readlink(path)
		if err != nil {
			return "", unwrapPath(err)
		}
		if !filepath.IsAbs(link) {
			link = filepath.Join(filepath.Dir(path), link)
		}
		path = link
	}
	return "", fmt.Errorf("more than %d symbolic links", maxLinks)
}

// kind names the type of a file that is not regular.
func kind(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a directory"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeDevice != 0:
		return "a device"
	}
	return "a special file"
}

// unwrapPath drops the operation and name of an *fs.PathError, which the
// caller names itself.
func unwrapPath(err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}

// temp is the temporary file of one Write; its mutex orders the signal
// watcher against the rename, so that a signal either removes the file or
// comes after it is in place.
type temp struct {
	mu   sync.Mutex
	f    *os.File
	done bool // renamed or removed
}

// fill writes, syncs and closes the temporary file and gives it mode.
func (t *temp) fill(fill func(io.Writer) error, mode fs.FileMode) error {
	if err := fill(t.f); err != nil {
		return err
	}
	if err := t.f.Sync(); err != nil {
		return err
	}
	if err := t.f.Close(); err != nil {
		return err
	}
	return os.Chmod(t.f.Name(), mode)
}

// rename moves the temporary file to target, or removes it on failure.
func (t *temp) rename(target string) error {
	t.mu.Lock()
	defer t.mu.Unlock()
	if t.done {
		return errInterrupted
	}
	t.done = true
	if err := os.Rename(t.f.Name(), target); err != nil {
		os.Remove(t.f.Name())
		return err
	}
	return nil
}

// remove closes and removes the temporary file once.
func (t *temp) remove() {
	t.mu.Lock()
	defer t.mu.Unlock()
	if t.done {
		return
	}
	t.done = true
	t.f.Close()
	os.Remove(t.f.Name())
}

var errInterrupted = errors.New("interrupted")

// raise delivers sig again once the temporary file is removed; with the
// handler stopped, its default action ends the process. Tests replace it.
var raise = defaultRaise

func defaultRaise(sig os.Signal) {
	if s, ok := sig.(syscall.Signal); ok {
		syscall.Kill(os.Getpid(), s)
	}
}

// watch removes the temporary file if SIGINT or SIGTERM arrives before
// stop is called, then raises the signal again.
func (t *temp) watch() (stop func()) {
	sigs := make(chan os.Signal, 1)
	quit := make(chan struct{})
	finished := make(chan struct{})
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	go func() {
		defer close(finished)
		select {
		case sig := <-sigs:
			t.remove()
			signal.Stop(sigs)
			raise(sig)
		case <-quit:
		}
	}()
	return func() {
		close(quit)
		<-finished
		signal.Stop(sigs)
	}
}
