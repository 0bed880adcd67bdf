package water

import (
	"fmt"
	"strings"
)

// Pair is a makeup sample and a circulating (recirculating or blowdown)
// sample of the same system: indices into the slice given to Pairs.
type Pair struct {
	Makeup, Tower int
	// SameDate is false when only the system column paired them.
	SameDate bool
}

// Pairs finds the makeup–tower pairs among waters by their roles, systems
// and dates. A circulating sample pairs with the makeup of its system on
// its date; where its system has no makeup that day but exactly one
// makeup in all, with that one (SameDate false: the system column pairs
// them). Samples with no system pair by date alone. Where a date (or a
// system) has more than one makeup the pair is ambiguous: it is left out
// and a note says so. Samples without a role take no part.
func Pairs(waters []Analysis) ([]Pair, []string) {
	type key struct{ system, date string }
	makeups := map[key][]int{}
	bySystem := map[string][]int{}
	for i, a := range waters {
		if a.Role == RoleMakeup {
			k := key{strings.ToLower(a.System), a.Date}
			makeups[k] = append(makeups[k], i)
			if a.System != "" {
				bySystem[strings.ToLower(a.System)] = append(bySystem[strings.ToLower(a.System)], i)
			}
		}
	}
	var pairs []Pair
	var notes []string
	for i, a := range waters {
		if !a.Role.Circulating() {
			continue
		}
		k := key{strings.ToLower(a.System), a.Date}
		ms, sameDate := makeups[k], true
		if len(ms) == 0 && a.System != "" {
			ms, sameDate = bySystem[k.system], false
		}
		switch len(ms) {
		case 0:
			notes = append(notes, fmt.Sprintf("%s: no makeup sample of %s to pair with", a.Name, where(a)))
		case 1:
			pairs = append(pairs, Pair{Makeup: ms[0], Tower: i, SameDate: sameDate})
		default:
			var names []string
			for _, m := range ms {
				names = append(names, waters[m].Name)
			}
			notes = append(notes, fmt.Sprintf("%s: %d makeup samples of %s (%s): give a system column to pair them",
				a.Name, len(ms), where(a), strings.Join(names, ", ")))
		}
	}
	return pairs, notes
}

// where names a sample's system and date for a note.
func where(a Analysis) string {
	switch {
	case a.System != "" && a.Date != "":
		return fmt.Sprintf("system %s on %s", a.System, a.Date)
	case a.System != "":
		return "system " + a.System
	case a.Date != "":
		return a.Date
	}
	return "an undated sample"
}
