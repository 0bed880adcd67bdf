// Command sizecheck lists the non-test Go functions longer than a limit
// (default 80 lines, counted from the func line to the closing brace) and
// the Go files longer than a limit (default 600 lines) under the given
// directories (default "."). It exits 1 when it lists anything, so a script
// or CI step can fail on it; scripts/size.sh runs it on the module.
//
// Usage: go run ./scripts/sizecheck [-func N] [-file N] [dir ...]
package main

import (
	"flag"
	"fmt"
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
)

// finding is one unit over its limit.
type finding struct {
	path  string
	line  int
	name  string // function name; empty for a whole file
	lines int
}

func main() {
	maxFunc := flag.Int("func", 80, "longest allowed non-test function, lines")
	maxFile := flag.Int("file", 600, "longest allowed Go file, lines")
	flag.Parse()
	dirs := flag.Args()
	if len(dirs) == 0 {
		dirs = []string{"."}
	}
	var funcs, files []finding
	for _, dir := range dirs {
		err := filepath.WalkDir(dir, func(path string, d fs.DirEntry, err error) error {
			if err != nil {
				return err
			}
			if d.IsDir() {
				if name := d.Name(); path != dir && (strings.HasPrefix(name, ".") || name == "testdata" || name == "vendor") {
					return filepath.SkipDir
				}
				return nil
			}
			if !strings.HasSuffix(path, ".go") {
				return nil
			}
			fn, fl, err := check(path, *maxFunc, *maxFile)
			funcs, files = append(funcs, fn...), append(files, fl...)
			return err
		})
		if err != nil {
			fmt.Fprintln(os.Stderr, "sizecheck:", err)
			os.Exit(2)
		}
	}
	sort.Slice(funcs, func(i, j int) bool { return funcs[i].lines > funcs[j].lines })
	sort.Slice(files, func(i, j int) bool { return files[i].lines > files[j].lines })
	for _, f := range funcs {
		fmt.Printf("func %4d lines  %s:%d %s\n", f.lines, f.path, f.line, f.name)
	}
	for _, f := range files {
		fmt.Printf("file %4d lines  %s\n", f.lines, f.path)
	}
	if len(funcs)+len(files) > 0 {
		os.Exit(1)
	}
}

// check parses one file and returns its functions over maxFunc lines (test
// files excluded) and the file itself when it is over maxFile lines.
func check(path string, maxFunc, maxFile int) (funcs, files []finding, err error) {
	fset := token.NewFileSet()
	f, err := parser.ParseFile(fset, path, nil, parser.SkipObjectResolution)
	if err != nil {
		return nil, nil, err
	}
	if n := fset.File(f.Pos()).LineCount(); n > maxFile {
		files = append(files, finding{path: path, lines: n})
	}
	if strings.HasSuffix(path, "_test.go") {
		return nil, files, nil
	}
	for _, decl := range f.Decls {
		fd, ok := decl.(*ast.FuncDecl)
		if !ok || fd.Body == nil {
			continue
		}
		start, end := fset.Position(fd.Pos()).Line, fset.Position(fd.End()).Line
		if n := end - start + 1; n > maxFunc {
			funcs = append(funcs, finding{path: path, line: start, name: funcName(fd), lines: n})
		}
	}
	return funcs, files, nil
}

// funcName returns "Name" or "Recv.Name" for a method.
func funcName(fd *ast.FuncDecl) string {
	if fd.Recv == nil || len(fd.Recv.List) == 0 {
		return fd.Name.Name
	}
	t := fd.Recv.List[0].Type
	if s, ok := t.(*ast.StarExpr); ok {
		t = s.X
	}
	if ix, ok := t.(*ast.IndexExpr); ok {
		t = ix.X
	}
	if id, ok := t.(*ast.Ident); ok {
		return id.Name + "." + fd.Name.Name
	}
	return fd.Name.Name
}
