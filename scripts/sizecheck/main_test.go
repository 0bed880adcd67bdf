package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestCheck: a function of 81 lines (func line to closing brace) is listed
// at the 80-line limit, one of 80 lines is not, a test file's functions are
// never listed, and a file over the file limit is.
func TestCheck(t *testing.T) {
	dir := t.TempDir()
	fn := func(name string, lines int) string {
		return "func " + name + "() {\n" + strings.Repeat("\t_ = 0\n", lines-2) + "}\n"
	}
	src := "package p\n\n" + fn("long", 81) + fn("fits", 80) + "func (r *recv) method() {}\n"
	path := filepath.Join(dir, "p.go")
	if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	funcs, files, err := check(path, 80, 600)
	if err != nil {
		t.Fatal(err)
	}
	if len(funcs) != 1 || funcs[0].name != "long" || funcs[0].lines != 81 || funcs[0].line != 3 {
		t.Errorf("funcs = %+v, want only long, 81 lines at line 3", funcs)
	}
	if len(files) != 0 {
		t.Errorf("files = %+v, want none under 600 lines", files)
	}
	if _, files, _ := check(path, 80, 100); len(files) != 1 || files[0].lines != 164 {
		t.Errorf("files at a 100-line limit = %+v, want p.go with 164 lines", files)
	}
	test := filepath.Join(dir, "p_test.go")
	if err := os.WriteFile(test, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	if funcs, _, _ := check(test, 80, 600); len(funcs) != 0 {
		t.Errorf("test file: funcs = %+v, want none", funcs)
	}
}
