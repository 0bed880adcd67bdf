package main

import (
	"regexp"
	"strings"
	"testing"
	"unicode"
)

// TestHelpSentences checks the long help of every command for text pasted
// twice: a help built from concatenated strings once carried a repeated,
// lower-case half-sentence ("… named by --sample. the blend like assess.").
// Every sentence after the first must start with a capital letter, a digit
// or a symbol (or is "pH"), and no sentence may appear twice.
func TestHelpSentences(t *testing.T) {
	end := regexp.MustCompile(`[.!?]\s+`)
	root := newRootCmd(strings.NewReader(""))
	for _, c := range append(root.Commands(), root) {
		seen := map[string]bool{}
		for i, s := range end.Split(strings.Join(strings.Fields(c.Long), " "), -1) {
			if s == "" {
				continue
			}
			if first := []rune(s)[0]; i > 0 && unicode.IsLower(first) && !strings.HasPrefix(s, "pH") {
				t.Errorf("%s --help: sentence %q starts in lower case (pasted fragment?)", c.Name(), s)
			}
			if seen[s] {
				t.Errorf("%s --help repeats %q", c.Name(), s)
			}
			seen[s] = true
		}
	}
}
