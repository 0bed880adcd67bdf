package water

import (
	"fmt"
	"strconv"
	"unicode"
)

// atomicWeight holds IUPAC 2021 abridged standard atomic weights, g/mol
// (Prohaska et al. 2022, Pure Appl. Chem. 94:573, Table 2), of the elements
// in the minerals and species of the tables.
var atomicWeight = map[string]float64{
	"H": 1.008, "B": 10.81, "C": 12.011, "N": 14.007, "O": 15.999, "F": 18.998,
	"Na": 22.990, "Mg": 24.305, "Si": 28.085, "P": 30.974, "S": 32.06, "Cl": 35.45,
	"K": 39.098, "Ca": 40.078, "Mn": 54.938, "Fe": 55.845, "Sr": 87.62, "Ba": 137.33,
}

// FormulaMass returns the molar mass, g/mol, of a chemical formula such as
// "CaCO3", "Ca5(PO4)3OH", "CaSO4:2H2O" (a colon or "·" joins water of
// hydration with its count) or "Mg2Si3O7.5(OH):3H2O" (decimal counts are
// allowed). Atomic weights are IUPAC 2021 abridged values.
func FormulaMass(formula string) (float64, error) {
	p := formulaParser{s: []rune(formula)}
	m, err := p.sum()
	if err != nil {
		return 0, fmt.Errorf("formula %q: %w", formula, err)
	}
	if p.i != len(p.s) {
		return 0, fmt.Errorf("formula %q: unexpected %q", formula, string(p.s[p.i]))
	}
	return m, nil
}

type formulaParser struct {
	s []rune
	i int
}

// sum reads parts joined by ':' or '·' (hydrates): "CaSO4:2H2O".
func (p *formulaParser) sum() (float64, error) {
	total := 0.0
	for {
		coef := p.number(1)
		m, err := p.group()
		if err != nil {
			return 0, err
		}
		total += coef * m
		if p.i < len(p.s) && (p.s[p.i] == ':' || p.s[p.i] == '·') {
			p.i++
			continue
		}
		return total, nil
	}
}

// group reads elements and parenthesised groups, each with a count.
func (p *formulaParser) group() (float64, error) {
	total := 0.0
	n := 0
	for p.i < len(p.s) {
		r := p.s[p.i]
		switch {
		case r == '(':
			p.i++
			m, err := p.group()
			if err != nil {
				return 0, err
			}
			if p.i >= len(p.s) || p.s[p.i] != ')' {
				return 0, fmt.Errorf("unclosed parenthesis")
			}
			p.i++
			total += m * p.number(1)
		case unicode.IsUpper(r):
			j := p.i + 1
			if j < len(p.s) && unicode.IsLower(p.s[j]) {
				j++
			}
			el := string(p.s[p.i:j])
			w, ok := atomicWeight[el]
			if !ok {
				return 0, fmt.Errorf("unknown element %q", el)
			}
			p.i = j
			total += w * p.number(1)
		default:
			if n == 0 {
				return 0, fmt.Errorf("unexpected %q", string(r))
			}
			return total, nil
		}
		n++
	}
	if n == 0 {
		return 0, fmt.Errorf("empty formula")
	}
	return total, nil
}

// number reads an optional decimal count, returning def when there is none.
func (p *formulaParser) number(def float64) float64 {
	j := p.i
	for j < len(p.s) && (unicode.IsDigit(p.s[j]) || p.s[j] == '.') {
		j++
	}
	if j == p.i {
		return def
	}
	v, err := strconv.ParseFloat(string(p.s[p.i:j]), 64)
	if err != nil {
		return def
	}
	p.i = j
	return v
}
