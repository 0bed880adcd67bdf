package main

import (
	"math"
	"regexp"
	"strings"
	"testing"
)

// TestReagentByName: a plant writes "sulfuric" or "caustic soda"; the dose
// is the same as by formula, and an explicit --strength 0 is refused rather
// than silently replaced by the usual strength.
func TestReagentByName(t *testing.T) {
	byFormula := mustRun(t, 0, "", "dose", "--demo", "--reagent", "h2so4", "--target", "lsi=0.5", "--format", "csv")
	byName := mustRun(t, 0, "", "dose", "--demo", "--reagent", "Sulfuric acid", "--target", "lsi=0.5", "--format", "csv")
	if byFormula.stdout != byName.stdout {
		t.Errorf("dose by name differs from dose by formula:\n%s\n%s", byName.stdout, byFormula.stdout)
	}
	mustRun(t, 0, "", "sweep", "--demo", "--vary", "dose=0:50:3", "--reagent", "caustic soda", "--format", "csv")
	for _, s := range []string{"0", "-3", "120"} {
		r := mustRun(t, 2, "", "dose", "--demo", "--reagent", "sulfuric", "--strength", s, "--target", "lsi=0.5")
		if !strings.Contains(r.stderr, "--strength") || !strings.Contains(r.stderr, "above 0 and at most 100") {
			t.Errorf("--strength %s: stderr %q does not say what is wrong", s, r.stderr)
		}
	}
	r := mustRun(t, 2, "", "dose", "--demo", "--reagent", "vinegar", "--target", "lsi=0.5")
	if !strings.Contains(r.stderr, "sulfuric acid") {
		t.Errorf("unknown reagent: stderr %q does not list the known ones", r.stderr)
	}
}

// TestVersionCompletionSuggestions: --version prints a version, cobra's
// completion command writes a shell script, and a mistyped flag gets the
// nearest one suggested (exit 2, bad input).
func TestVersionCompletionSuggestions(t *testing.T) {
	if r := mustRun(t, 0, "", "--version"); !strings.HasPrefix(r.stdout, "scalerisk version ") {
		t.Errorf("--version: %q", r.stdout)
	}
	if r := mustRun(t, 0, "", "completion", "bash"); !strings.Contains(r.stdout, "scalerisk") || !strings.Contains(r.stdout, "complete") {
		t.Errorf("completion bash: no script:\n%.200s", r.stdout)
	}
	r := mustRun(t, 2, "", "assess", "--demo", "--tempurature", "60")
	if !strings.Contains(r.stderr, "did you mean --temperature?") {
		t.Errorf("mistyped flag: stderr %q lacks the suggestion", r.stderr)
	}
	r = mustRun(t, 2, "", "asess", "--demo")
	if !strings.Contains(r.stderr, "assess") {
		t.Errorf("mistyped command: stderr %q lacks the suggestion", r.stderr)
	}
}

// TestExamples: every command's help carries an example, and every example
// names flags the command has (so an example cannot go stale silently).
func TestExamples(t *testing.T) {
	root := newRootCmd(strings.NewReader(""))
	for _, c := range root.Commands() {
		if c.Name() == "help" || c.Name() == "completion" {
			continue
		}
		if strings.TrimSpace(c.Example) == "" {
			t.Errorf("%s has no example in its help", c.Name())
			continue
		}
		for _, line := range strings.Split(c.Example, "\n") {
			args := exampleArgs(line)
			if len(args) == 0 || args[0] != "scalerisk" {
				t.Errorf("%s: example %q does not start with scalerisk", c.Name(), line)
				continue
			}
			fresh := newRootCmd(strings.NewReader(""))
			sub, rest, err := fresh.Find(args[1:])
			if err != nil || sub.Name() != c.Name() {
				t.Errorf("%s: example %q runs %v (%v)", c.Name(), line, sub.Name(), err)
				continue
			}
			if err := sub.ParseFlags(rest); err != nil {
				t.Errorf("%s: example %q: %v", c.Name(), line, err)
			}
		}
	}
}

// exampleArgs splits an example line as a shell would for these simple
// lines: words, "double-quoted" words, and nothing from a redirection or a
// comment on.
func exampleArgs(line string) []string {
	var args []string
	var cur strings.Builder
	quoted, inWord := false, false
	for _, r := range strings.TrimSpace(line) {
		switch {
		case r == '"':
			quoted, inWord = !quoted, true
		case !quoted && (r == ' ' || r == '\t'):
			if inWord {
				args = append(args, cur.String())
				cur.Reset()
				inWord = false
			}
		case !quoted && (r == '>' || r == '#'):
			if inWord {
				args = append(args, cur.String())
			}
			return args
		default:
			cur.WriteRune(r)
			inWord = true
		}
	}
	if inWord {
		args = append(args, cur.String())
	}
	return args
}

// TestTemplateCommand: the starter file the template command writes is read
// by assess once a row is filled in (the header alone holds no sample),
// with no note: its total hardness and P-alkalinity are used (data-quality
// checks), not passed through; a turbidity column added is noted.
func TestTemplateCommand(t *testing.T) {
	head := strings.TrimSpace(mustRun(t, 0, "", "template").stdout)
	cols := strings.Split(head, ",")
	row := make([]string, len(cols))
	fill := map[string]string{"name": "Kestrel Fen trial bore", "temperature [C]": "18", "pH": "7.5",
		"Ca [mg/L]": "55", "Na [mg/L]": "25", "Cl [mg/L]": "38", "SO4 [mg/L]": "40", "alkalinity [mg/L as CaCO3]": "150",
		"total hardness [mg/L as CaCO3]": "140", "P-alkalinity [mg/L as CaCO3]": "0"}
	for i, c := range cols {
		row[i] = fill[c]
	}
	r := mustRun(t, 0, head+"\n"+strings.Join(row, ",")+"\n", "assess", "-", "--format", "json")
	if !strings.Contains(r.stdout, "Kestrel Fen trial bore") || r.stderr != "" || strings.Contains(r.stdout, "other_analytes") ||
		!strings.Contains(r.stdout, `"total_hardness_mg_per_l_as_caco3":140`) {
		t.Errorf("template row not assessed cleanly (no note, no other analytes, the hardness with the quality):\nstdout %.300s\nstderr %s", r.stdout, r.stderr)
	}
	// A column the reader does not use is still named, once.
	r = mustRun(t, 0, head+",Turbidity [NTU]\n"+strings.Join(row, ",")+",0.8\n", "assess", "-", "--format", "json")
	if n := strings.Count(r.stderr, "kept and passed through"); n != 1 || !strings.Contains(r.stderr, `"Turbidity [NTU]" kept and passed through`) ||
		strings.Contains(r.stderr, "hardness") {
		t.Errorf("template row with turbidity: stderr %q, want one note naming turbidity alone", r.stderr)
	}
	if l := mustRun(t, 0, "", "template", "--list").stdout; !strings.Contains(l, "PO4-P [mg/L]") ||
		!regexp.MustCompile(`(?m)^total hardness \[mg/L as CaCO3\] .*used only for data-quality checks`).MatchString(l) ||
		!regexp.MustCompile(`(?m)^P-alkalinity \[mg/L as CaCO3\] .*used only for data-quality checks`).MatchString(l) {
		t.Errorf("template --list lacks the other forms or the checked lab columns with their note:\n%s", l)
	}
}

// TestDosePrice: --price with --flow gives the cost per day of product,
// kg/day × price (arithmetic: mg/L × m³/h × 0.024 = kg/day).
func TestDosePrice(t *testing.T) {
	r := mustRun(t, 0, "", "dose", "--demo", "--reagent", "sulfuric", "--target", "lsi=0.5", "--flow", "40", "--price", "0.25", "--format", "json")
	for _, s := range decodeSamples(t, r.stdout) {
		mg, _ := s["dose_mg_per_l"].(float64)
		if mg == 0 {
			if _, ok := s["cost_per_day"]; ok {
				t.Errorf("%v: a cost for no dose", s["name"])
			}
			continue
		}
		kg, _ := s["dose_kg_per_day"].(float64)
		cost, ok := s["cost_per_day"].(float64)
		if !ok || math.Abs(kg-mg*40*0.024) > 1e-3*kg || math.Abs(cost-kg*0.25) > 1e-3*cost {
			t.Errorf("%v: %g mg/L → %g kg/day, cost %v; want %g kg/day and %g a day", s["name"], mg, kg, s["cost_per_day"], mg*40*0.024, mg*40*0.024*0.25)
		}
	}
	mustRun(t, 2, "", "dose", "--demo", "--reagent", "sulfuric", "--target", "lsi=0.5", "--price", "0.25")
	mustRun(t, 2, "", "dose", "--demo", "--reagent", "sulfuric", "--target", "lsi=0.5", "--flow", "40", "--price", "-1")
}
