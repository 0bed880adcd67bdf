package water

import (
	"bytes"
	"io"
	"testing"
)

// cycleReader reads head once, then body over and over: an endless wide
// file.
type cycleReader struct {
	head, body []byte
	pos        int // bytes of head+body read so far in the current pass
}

func (c *cycleReader) Read(p []byte) (int, error) {
	if len(c.head) > 0 {
		n := copy(p, c.head)
		c.head = c.head[n:]
		return n, nil
	}
	n := copy(p, c.body[c.pos:])
	c.pos = (c.pos + n) % len(c.body)
	return n, nil
}

// BenchmarkParseRow reads one row of a wide file per op: the demo's three
// invented plant waters (22 columns, a "<" value, an "as CaCO3" and an
// "as N" unit) repeated without end, through the reader Records and Read
// use. ns/op, B/op and allocs/op are per row.
func BenchmarkParseRow(b *testing.B) {
	f, err := OpenDemo()
	if err != nil {
		b.Fatal(err)
	}
	demo, err := io.ReadAll(f)
	f.Close()
	if err != nil {
		b.Fatal(err)
	}
	i := bytes.IndexByte(demo, '\n') + 1
	rr, err := newRecordReader("bench.csv", &cycleReader{head: demo[:i], body: demo[i:]}, ReadOptions{})
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		rec, err := rr.next()
		if err != nil || rec.Err != nil {
			b.Fatal(err, rec.Err)
		}
	}
}
