package plan

import "testing"

// TestRoundUp: the end of the dose axis is rounded up to a twentieth of its
// power of ten (the rule of AutoDose; no outside source: a layout rule).
func TestRoundUp(t *testing.T) {
	for _, c := range []struct{ x, want float64 }{{153, 155}, {1234, 1250}, {7.12, 7.15}, {100, 100}} {
		if got := roundUp(c.x); got != c.want {
			t.Errorf("roundUp(%g) = %g, want %g", c.x, got, c.want)
		}
	}
}
