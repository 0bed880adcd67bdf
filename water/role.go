package water

import (
	"fmt"
	"strings"
)

// Role is what a sample is to the plant: the water going in, the water in
// circulation, a stream leaving. It changes the questions asked of a
// sample (a makeup is asked how far it can be cycled, a recirculating
// water how far it is from its limits), never its chemistry.
type Role int

// The sample roles. RoleUnset is a sample whose file gives no role; it is
// asked the questions of a makeup, as before roles existed.
const (
	RoleUnset         Role = iota
	RoleMakeup             // water fed to a system: well, river, city, softened makeup
	RoleRecirculating      // water in circulation: a cooling-tower basin or riser
	RoleBlowdown           // water leaving a recirculating system (its composition is the tower's)
	RoleFeed               // the water entering a membrane plant (after any acid or antiscalant)
	RoleConcentrate        // the membrane reject (brine)
	RolePermeate           // the membrane product
	RoleOther              // anything else: a well survey, a process stream
)

var roleNames = [...]string{"", "makeup", "recirculating", "blowdown", "feed", "concentrate", "permeate", "other"}

func (r Role) String() string { return roleNames[r] }

// roleAliases maps the spellings a laboratory or plant file uses, folded
// by fieldKey, to a role.
var roleAliases = map[string]Role{
	"makeup": RoleMakeup, "mu": RoleMakeup, "supply": RoleMakeup, "raw": RoleMakeup,
	"recirculating": RoleRecirculating, "recirculation": RoleRecirculating, "recirc": RoleRecirculating,
	"circulating": RoleRecirculating, "tower": RoleRecirculating, "basin": RoleRecirculating,
	"coolingwater": RoleRecirculating, "cw": RoleRecirculating,
	"blowdown": RoleBlowdown, "bleed": RoleBlowdown, "bleedoff": RoleBlowdown,
	"feed": RoleFeed, "rofeed": RoleFeed,
	"concentrate": RoleConcentrate, "reject": RoleConcentrate, "brine": RoleConcentrate,
	"permeate": RolePermeate, "product": RolePermeate,
	"other": RoleOther,
}

// ParseRole reads a role: makeup, recirculating, blowdown, feed,
// concentrate, permeate or other, or a common spelling of one ("make-up",
// "tower", "basin", "bleed", "reject", "brine", "product"), without regard
// to case, spaces and hyphens. Blank is RoleUnset.
func ParseRole(s string) (Role, error) {
	k := fieldKey(strings.TrimSpace(s))
	if k == "" {
		return RoleUnset, nil
	}
	if r, ok := roleAliases[k]; ok {
		return r, nil
	}
	return RoleUnset, fmt.Errorf("unknown role %q (want makeup, recirculating, blowdown, feed, concentrate, permeate or other)", s)
}

// Circulating reports whether a sample of role r is water in a
// recirculating system (recirculating or blowdown).
func (r Role) Circulating() bool { return r == RoleRecirculating || r == RoleBlowdown }
