package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestHostileNames: a sample name with a terminal escape reaches text
// output and standard error escaped, a name a spreadsheet would run as a
// formula is neutralised in CSV unless --raw-csv, and JSON keeps both
// exact. Before issue 12 both went through as they were.
func TestHostileNames(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "lab.csv")
	esc := "tower\x1b]0;owned\x07"
	formula := `=HYPERLINK("http://example.invalid","open")`
	lab := "name,temperature [C],pH,Ca [mg/L],Cl [mg/L],alkalinity [mg/L as CaCO3]\n" +
		`"` + esc + `",25,7.8,80,100,150` + "\n" +
		`"` + strings.ReplaceAll(formula, `"`, `""`) + `",25,7.8,80,100,150` + "\n" +
		`"` + esc + ` bad",25,12,80,100,0` + "\n" // inconsistent: its name goes to stderr
	if err := os.WriteFile(in, []byte(lab), 0o644); err != nil {
		t.Fatal(err)
	}
	text := mustRun(t, exitBadInput, "", "assess", in)
	if strings.Contains(text.stdout+text.stderr, "\x1b") {
		t.Error("an escape character reached the terminal")
	}
	if !strings.Contains(text.stdout, `tower\x1b]0;owned\a`) || !strings.Contains(text.stderr, `tower\x1b]0;owned\a bad`) {
		t.Errorf("the escaped name is not shown:\n%s\n%s", text.stdout, text.stderr)
	}
	csvOut := mustRun(t, exitBadInput, "", "assess", "--format", "csv", in).stdout
	if !strings.Contains(csvOut, `"'=HYPERLINK(""http://example.invalid"",""open"")"`) {
		t.Errorf("the formula is not neutralised:\n%s", csvOut)
	}
	raw := mustRun(t, exitBadInput, "", "assess", "--format", "csv", "--raw-csv", in).stdout
	if !strings.Contains(raw, `"=HYPERLINK(""http://example.invalid"",""open"")"`) || strings.Contains(raw, `'=`) {
		t.Errorf("--raw-csv changed the cell:\n%s", raw)
	}
	var doc assessDoc
	if err := json.Unmarshal([]byte(mustRun(t, exitBadInput, "", "assess", "--format", "json", in).stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Samples) < 2 || doc.Samples[0].Name != esc || doc.Samples[1].Name != formula {
		t.Errorf("JSON names are not exact: %+v", doc.Samples)
	}
}
