package reports_test

import (
	"fmt"
	"html"
	"math"
	"os"
	"os/exec"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"
)

// The printed pages are read back with pdftotext (poppler-utils): every
// word with its page and box. A heading must stand on the same page and in
// the same column as the start of what follows it (for a table its first
// row, not only its head): a heading at the foot of a page or column with
// its text on the next is an orphan.

// pdfWord is a word of the printed report: its page (from 1) and its box
// in points from the top left of the page.
type pdfWord struct {
	page           int
	text           string
	x0, y0, x1, y1 float64
}

var (
	pdfPageTag = regexp.MustCompile(`<page width="([0-9.]+)"`)
	pdfWordTag = regexp.MustCompile(`<word xMin="([0-9.]+)" yMin="([0-9.]+)" xMax="([0-9.]+)" yMax="([0-9.]+)">([^<]*)</word>`)
)

// pdfWords reads the words of a PDF in the order pdftotext gives them, and
// the width of its first page in points. Without pdftotext it returns no
// words (and logs that), or fails when SCALERISK_REQUIRE_BROWSER=1.
func pdfWords(t *testing.T, pdf string) (words []pdfWord, width float64) {
	t.Helper()
	bin, err := exec.LookPath("pdftotext")
	if err != nil {
		msg := "pdftotext not found: install Debian's poppler-utils package to check the printed headings"
		if os.Getenv("SCALERISK_REQUIRE_BROWSER") == "1" {
			t.Fatal(msg + " (SCALERISK_REQUIRE_BROWSER=1 requires it)")
		}
		t.Log(msg)
		return nil, 0
	}
	out, err := exec.Command(bin, "-bbox", pdf, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext %s: %v", pdf, err)
	}
	page := 0
	for _, line := range strings.Split(string(out), "\n") {
		if m := pdfPageTag.FindStringSubmatch(line); m != nil {
			page++
			if width == 0 {
				width, _ = strconv.ParseFloat(m[1], 64)
			}
			continue
		}
		m := pdfWordTag.FindStringSubmatch(line)
		if m == nil {
			continue
		}
		w := pdfWord{page: page, text: html.UnescapeString(m[5])}
		for i, f := range []*float64{&w.x0, &w.y0, &w.x1, &w.y1} {
			*f, _ = strconv.ParseFloat(m[i+1], 64)
		}
		words = append(words, w)
	}
	if page == 0 || width == 0 {
		t.Fatalf("pdftotext found no page in %s", pdf)
	}
	return words, width
}

// headed is a heading of the page and the first words of what follows it.
type headed struct {
	heading []string
	next    []string
}

var (
	dropForPrint = regexp.MustCompile(`(?s)<nav\b.*?</nav>|<figure>.*?</figure>|<thead>.*?</thead>|<script>.*?</script>|<style>.*?</style>|<details>.*?</details>`)
	headingTag   = regexp.MustCompile(`(?s)<h[34]>(.*?)</h[34]>`)
	anyTag       = regexp.MustCompile(`<[^>]*>`)
)

// headings lists the h3 and h4 headings of the page (those of the charts'
// figures, which never break, left out) with the first word that follows
// each in print: the heads of tables and the contents, which is not
// printed, are skipped.
func headings(page string) []headed {
	body := page[strings.Index(page, "<main>"):]
	body = dropForPrint.ReplaceAllString(body, " ")
	text := func(s string) []string { return strings.Fields(html.UnescapeString(anyTag.ReplaceAllString(s, " "))) }
	var out []headed
	locs := headingTag.FindAllStringSubmatchIndex(body, -1)
	for i, l := range locs {
		end := len(body)
		if i+1 < len(locs) {
			end = locs[i+1][0]
		}
		next := text(body[l[1]:end])
		if len(next) == 0 {
			continue // a heading straight before another: checked with that one
		}
		out = append(out, headed{heading: text(body[l[2]:l[3]]), next: next[:1]})
	}
	return out
}

// occurrences returns where the run of words want starts in words as a
// line of its own (not the start or end of a longer line), in the order of
// the page: by page, column (left or right half) and height on it.
// (pdftotext gives a page's words roughly in the order they were painted,
// not as they are read.)
func occurrences(words []pdfWord, want []string, width float64) []pdfWord {
	var out []pdfWord
	for i := 0; i+len(want) <= len(words); i++ {
		ok := true
		for j, w := range want {
			if words[i+j].text != w {
				ok = false
				break
			}
		}
		if ok && !sameLine(words, i-1, i) && !sameLine(words, i+len(want)-1, i+len(want)) {
			out = append(out, words[i])
		}
	}
	sort.SliceStable(out, func(a, b int) bool {
		p, q := out[a], out[b]
		if p.page != q.page {
			return p.page < q.page
		}
		if pr, qr := p.x0 > width/2, q.x0 > width/2; pr != qr {
			return qr
		}
		return p.y0 < q.y0
	})
	return out
}

// sameLine says whether words a and b (indices; false when out of range)
// follow each other on one line of a page.
func sameLine(words []pdfWord, a, b int) bool {
	if a < 0 || b >= len(words) {
		return false
	}
	p, q := words[a], words[b]
	return p.page == q.page && math.Abs(p.y0-q.y0) < 1 && q.x0 > p.x0 && q.x0-p.x1 < 8
}

// followGap is how far below a heading, in points, the first word of what
// follows it may start: the heading's margin, a table's head and a line or
// two (the reports' tables start 30–35 pt below their heading).
const followGap = 60

// orphans returns the headings of the page that the PDF prints apart from
// what follows them: the first word that follows is not within followGap
// below the heading in its column (within a quarter of the page's width
// left or right) on its page. A heading not found in the PDF is an error
// too.
func orphans(words []pdfWord, width float64, page string) []string {
	var bad []string
	seen := map[string]int{}
	for _, h := range headings(page) {
		name := strings.Join(h.heading, " ")
		k := seen[name]
		seen[name]++
		at := occurrences(words, h.heading, width)
		if k >= len(at) {
			bad = append(bad, fmt.Sprintf("heading %q (number %d of that name) not found in the PDF", name, k+1))
			continue
		}
		hw, found := at[k], false
		for _, w := range words {
			if w.page == hw.page && w.text == h.next[0] && w.y0 > hw.y0 && w.y0 < hw.y1+followGap &&
				w.x0 > hw.x0-width/4 && w.x0 < hw.x0+width/4 {
				found = true
				break
			}
		}
		if !found {
			bad = append(bad, fmt.Sprintf("heading %q is at the foot of a page or column (page %d): %q, which follows it, is not within %d pt below it",
				name, hw.page, h.next[0], followGap))
		}
	}
	return bad
}
