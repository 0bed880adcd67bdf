package water

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
	"sync"
	"unicode"

	"scalerisk/data"
)

// Reagent is a treatment chemical a plant doses: an acid, a base, a
// carbonate source or a calcium salt, as listed in data/reagents.csv.
//
// Caution: acids and caustic are dangerous. The stoichiometry here is
// advisory; acid and caustic handling, feed control and discharge are
// governed by the product's SDS, local codes and licensed practice.
type Reagent struct {
	Name string // by formula, lower case: "h2so4", "hcl", "naoh", …
	// Aliases are other names a plant writes for it ("sulfuric",
	// "caustic soda", "soda ash"), lower case.
	Aliases []string
	Label   string // in words, e.g. "sulfuric acid"
	Formula string // e.g. "H2SO4"
	// MolarMass is g/mol of the pure substance (IUPAC 2021 abridged
	// standard atomic weights).
	MolarMass float64
	// Strength is the usual strength of the commercial product, % w/w of the
	// pure substance; StrengthMin and StrengthMax bound the usual grades.
	Strength, StrengthMin, StrengthMax float64
	// Adds maps each component the reagent adds to mol per mol of reagent.
	Adds map[Component]float64
	// AlkalinityPerMol is the change in total alkalinity, eq per mol of
	// reagent (H2SO4 −2, NaOH +1, CO2 0, H3PO4 −1: the zero level of total
	// alkalinity is H2CO3*, H2PO4−, H4SiO4 and B(OH)3).
	AlkalinityPerMol float64
	// CarbonPerMol is the inorganic carbon added, mol per mol (equal to
	// Adds[C]).
	CarbonPerMol float64
	// Caution is the handling caution a dose carries, in words.
	Caution string
	// Source names where the row's values come from.
	Source string
}

type reagentRow struct {
	Name        string  `csv:"name"`
	Aliases     string  `csv:"aliases"`
	Label       string  `csv:"label"`
	Formula     string  `csv:"formula"`
	MolarMass   float64 `csv:"molar_mass"`
	Strength    float64 `csv:"strength_percent"`
	StrengthMin float64 `csv:"strength_min"`
	StrengthMax float64 `csv:"strength_max"`
	Adds        string  `csv:"adds"`
	Alkalinity  float64 `csv:"alkalinity_eq_per_mol"`
	Carbon      float64 `csv:"carbon_per_mol"`
	Caution     string  `csv:"caution"`
	Source      string  `csv:"source"`
}

var defaultReagents = sync.OnceValues(func() ([]Reagent, error) {
	var rows []reagentRow
	if err := data.Unmarshal("reagents.csv", &rows); err != nil {
		return nil, err
	}
	var list []Reagent
	seen := map[string]bool{}
	for _, row := range rows {
		rg, err := reagentFromRow(row)
		if err != nil {
			return nil, fmt.Errorf("data/reagents.csv: reagent %q: %w", row.Name, err)
		}
		for _, key := range append([]string{rg.Name}, rg.Aliases...) {
			if seen[key] {
				return nil, fmt.Errorf("data/reagents.csv: reagent name %q listed twice", key)
			}
			seen[key] = true
		}
		list = append(list, rg)
	}
	return list, nil
})

// reagentFromRow checks one table row and converts it.
func reagentFromRow(row reagentRow) (Reagent, error) {
	rg := Reagent{Name: strings.ToLower(strings.TrimSpace(row.Name)), Label: row.Label, Formula: row.Formula,
		MolarMass: row.MolarMass, Strength: row.Strength, StrengthMin: row.StrengthMin, StrengthMax: row.StrengthMax,
		Adds: map[Component]float64{}, AlkalinityPerMol: row.Alkalinity, CarbonPerMol: row.Carbon,
		Caution: row.Caution, Source: row.Source}
	for _, a := range strings.Split(row.Aliases, ";") {
		if a = reagentKey(a); a != "" {
			rg.Aliases = append(rg.Aliases, a)
		}
	}
	switch {
	case rg.Name == "":
		return Reagent{}, fmt.Errorf("empty name")
	case !(rg.MolarMass > 0):
		return Reagent{}, fmt.Errorf("molar mass must be positive")
	case !(rg.StrengthMin > 0 && rg.StrengthMin <= rg.Strength && rg.Strength <= rg.StrengthMax && rg.StrengthMax <= 100):
		return Reagent{}, fmt.Errorf("strengths must satisfy 0 < min %g ≤ usual %g ≤ max %g ≤ 100",
			rg.StrengthMin, rg.Strength, rg.StrengthMax)
	case strings.TrimSpace(rg.Source) == "":
		return Reagent{}, fmt.Errorf("no source")
	}
	for _, part := range strings.Split(row.Adds, ";") {
		part = strings.TrimSpace(part)
		if part == "" {
			continue
		}
		sym, num, ok := strings.Cut(part, ":")
		c, known := ParseComponent(strings.TrimSpace(sym))
		if !ok || !known {
			return Reagent{}, fmt.Errorf("adds %q: want Component:mol", part)
		}
		v, err := ParseNumber(num)
		if err != nil || v <= 0 {
			return Reagent{}, fmt.Errorf("adds %q: mol per mol must be a positive number", part)
		}
		rg.Adds[c] += v
	}
	if rg.Adds[C] != rg.CarbonPerMol {
		return Reagent{}, fmt.Errorf("carbon_per_mol %g differs from the C of adds %g", rg.CarbonPerMol, rg.Adds[C])
	}
	return rg, nil
}

// reagentTable returns the embedded reagent table; a broken table is a
// programmer's mistake.
func reagentTable() []Reagent {
	list, err := defaultReagents()
	if err != nil {
		panic("water: embedded reagent table is broken: " + err.Error())
	}
	return list
}

// clone returns a copy of r that shares no map with it.
func (r Reagent) clone() Reagent {
	c := r
	c.Aliases = append([]string(nil), r.Aliases...)
	c.Adds = make(map[Component]float64, len(r.Adds))
	for k, v := range r.Adds {
		c.Adds[k] = v
	}
	return c
}

// Reagents returns the reagents of the embedded table data/reagents.csv in
// file order: h2so4, hcl, naoh, caoh2, na2co3, nahco3, co2, h3po4, cacl2.
// The result is a fresh copy the caller may change.
//
// References: molar masses from the IUPAC 2021 abridged standard atomic
// weights (Prohaska et al. 2022, Pure Appl. Chem. 94:573); alkalinity factors
// cross-checked with "Power Plant Engineering" Table 15-3.
func Reagents() []Reagent {
	list := reagentTable()
	out := make([]Reagent, len(list))
	for i, r := range list {
		out[i] = r.clone()
	}
	return out
}

// LookupReagent returns the reagent named name, by formula ("h2so4",
// "HCl", "Ca(OH)2") or by a name a plant writes ("sulfuric", "Caustic soda",
// "soda ash", "lime"), matched without regard to case, spaces, hyphens or
// underscores. The error for an unknown name lists the known ones.
func LookupReagent(name string) (Reagent, error) {
	key := reagentKey(name)
	var names []string
	for _, r := range reagentTable() {
		if r.Name == key || reagentKey(r.Formula) == key || slices.Contains(r.Aliases, key) {
			return r.clone(), nil
		}
		names = append(names, r.Name+" ("+r.Label+")")
	}
	return Reagent{}, fmt.Errorf("unknown reagent %q (known: %s)", name, strings.Join(names, ", "))
}

// reagentKey is name in the form reagent names are compared in: lower
// case, without spaces, hyphens or underscores.
func reagentKey(name string) string {
	return strings.Map(func(r rune) rune {
		switch r {
		case ' ', '\t', '-', '_':
			return -1
		}
		return unicode.ToLower(r)
	}, strings.TrimSpace(name))
}

// CheckStrength reports whether strength, a product strength in percent
// w/w as a user gave it, can be used: it must be above 0 and at most 100.
// A strength outside the usual commercial grades (StrengthMin to
// StrengthMax) is accepted; callers warn about it.
func (r Reagent) CheckStrength(strength float64) error {
	if !(strength > 0 && strength <= 100) {
		return fmt.Errorf("strength %s %% of %s: want a percentage above 0 and at most 100", strconv.FormatFloat(strength, 'g', 4, 64), r.Label)
	}
	return nil
}

// strengthOrUsual returns strength, or r.Strength when strength is 0.
func (r Reagent) strengthOrUsual(strength float64) float64 {
	if strength == 0 {
		return r.Strength
	}
	return strength
}

// MolPerMg returns the mol of pure reagent in one mg of product at strength
// percent (0 means r.Strength): strength/100 / (1000·MolarMass). A dose of
// d mg/L of product thus brings d·MolPerMg mol/L.
func (r Reagent) MolPerMg(strength float64) float64 {
	return r.strengthOrUsual(strength) / 100 / (1000 * r.MolarMass)
}

// AlkalinityFactor returns the change in total alkalinity, mg/L as CaCO3, per
// mg/L of product at strength percent (0 means r.Strength): negative for
// acids. For 93 % H2SO4 it is −0.949; for pure NaOH +1.251.
//
// References: "Power Plant Engineering" Table 15-3 (factors for the pure
// reagents); equivalent mass of CaCO3 50.043 g/eq.
func (r Reagent) AlkalinityFactor(strength float64) float64 {
	return r.AlkalinityPerMol * EquivalentMassCaCO3 * 1000 * r.MolPerMg(strength)
}

// IonFactor returns the mg/L of component c, weighed as its ion
// (Component.IonMass: SO4 for S, Cl, Na, Ca, PO4 for P, C as carbon), added
// per mg/L of product at strength percent (0 means r.Strength); 0 when the
// reagent does not add c. For 93 % H2SO4 and S it is 0.911 (mg/L SO4).
func (r Reagent) IonFactor(c Component, strength float64) float64 {
	return r.Adds[c] * c.IonMass() * 1000 * r.MolPerMg(strength)
}
