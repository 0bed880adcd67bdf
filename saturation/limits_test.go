package saturation

import "testing"

// TestLimitsAreCopies checks that the embedded limit profiles are handed
// out as copies: editing what Limits or LimitProfileNamed returned must not
// change the risk bands of a later caller.
func TestLimitsAreCopies(t *testing.T) {
	first := Limits()
	if len(first) == 0 || len(first[0].Limits) == 0 {
		t.Fatal("no embedded limit profiles")
	}
	want := first[0].Limits[0]
	first[0].Limits[0].Max += 100
	first[0].Limits = first[0].Limits[:0]
	first[0].Name = "edited"
	if got := Limits()[0]; got.Name == "edited" || len(got.Limits) == 0 || got.Limits[0] != want {
		t.Errorf("editing the slice Limits returned changed a later call: got %+v, want first limit %+v", got, want)
	}

	named, err := LimitProfileNamed(want.Quantity) // not a profile name
	if err == nil {
		t.Fatalf("LimitProfileNamed(%q) = %+v, want an error", want.Quantity, named)
	}
	p, err := LimitProfileNamed("inhibitor")
	if err != nil {
		t.Fatal(err)
	}
	max0 := p.Limits[0].Max
	p.Limits[0].Max = -1
	again, _ := LimitProfileNamed("inhibitor")
	if again.Limits[0].Max != max0 {
		t.Errorf("editing the profile LimitProfileNamed returned changed a later call: max %g, want %g", again.Limits[0].Max, max0)
	}
}
