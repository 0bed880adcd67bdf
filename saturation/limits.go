package saturation

import (
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"
	"sync"

	"scalerisk/data"
	"scalerisk/water"
)

// Limit is the highest value one quantity may reach under a treatment
// regime: a mineral's saturation index ("si:calcite"), the Langelier index
// ("lsi"), a concentration in mg/L of a reported form ("mg_per_l:SiO2",
// "mg_per_l:Mg_as_CaCO3"), or a product of such concentrations
// ("product:Mg_as_CaCO3*SiO2", the trade's magnesium-silicate rule).
type Limit struct {
	Quantity string // as written: "si:gypsum", "lsi", "mg_per_l:SiO2", "product:Mg_as_CaCO3*SiO2"
	Max      float64
	Source   string
}

// LimitProfile is a named set of limits.
type LimitProfile struct {
	Name   string
	Limits []Limit
}

// Lookup returns the limit on quantity and whether the profile has one.
func (p LimitProfile) Lookup(quantity string) (Limit, bool) {
	for _, l := range p.Limits {
		if l.Quantity == quantity {
			return l, true
		}
	}
	return Limit{}, false
}

// parseQuantity checks a limit quantity against the model and returns its
// kind and argument.
func parseQuantity(q string, m *Model) (kind, arg string, err error) {
	kind, arg, _ = strings.Cut(q, ":")
	switch kind {
	case "si":
		if _, ok := m.mineralIdx[arg]; !ok {
			return "", "", fmt.Errorf("unknown mineral %q", arg)
		}
	case "lsi":
		if arg != "" {
			return "", "", fmt.Errorf("lsi takes no argument")
		}
	case "mg_per_l":
		if _, err := parseForm(arg); err != nil {
			return "", "", err
		}
	case "product":
		if _, err := parseProduct(arg); err != nil {
			return "", "", err
		}
	default:
		return "", "", fmt.Errorf("unknown quantity %q (want si:MINERAL, lsi, mg_per_l:ANALYTE[_as_CaCO3] or product:FORM*FORM)", q)
	}
	return kind, arg, nil
}

// ReadLimits reads limit profiles in the layout of data/limits.csv
// (columns profile, quantity, max, source; # starts a comment). Rows with
// an empty profile belong to a profile named after the file. Errors are
// *water.InputError naming the file, line and column.
func ReadLimits(file string, r io.Reader, m *Model) ([]LimitProfile, error) {
	if m == nil {
		m = DefaultModel()
	}
	cr, col, err := openTableCSV(file, r, "limits file", []string{"quantity", "max"})
	if err != nil {
		return nil, err
	}
	var profiles []LimitProfile
	index := map[string]int{}
	for {
		rec, line, ok, err := nextRecord(cr, file, len(col), false)
		if err != nil {
			return nil, err
		}
		if !ok {
			break
		}
		cell := func(h string) string {
			if i, ok := col[h]; ok && i < len(rec) {
				return strings.TrimSpace(rec[i])
			}
			return ""
		}
		name := cell("profile")
		if name == "" {
			name = file
		}
		q := cell("quantity")
		if _, _, err := parseQuantity(q, m); err != nil {
			return nil, &water.InputError{File: file, Line: line, Column: col["quantity"] + 1, Header: "quantity", Value: q, Err: err}
		}
		v, err := water.ParseNumber(cell("max"))
		if err != nil {
			return nil, &water.InputError{File: file, Line: line, Column: col["max"] + 1, Header: "max", Value: cell("max"), Err: err}
		}
		i, ok := index[name]
		if !ok {
			profiles = append(profiles, LimitProfile{Name: name})
			i = len(profiles) - 1
			index[name] = i
		}
		if _, dup := profiles[i].Lookup(q); dup {
			return nil, &water.InputError{File: file, Line: line, Column: col["quantity"] + 1, Header: "quantity", Value: q,
				Err: fmt.Errorf("profile %q has this quantity twice", name)}
		}
		profiles[i].Limits = append(profiles[i].Limits, Limit{Quantity: q, Max: v, Source: cell("source")})
	}
	if len(profiles) == 0 {
		return nil, &water.InputError{File: file, Err: errors.New("no limits in the file")}
	}
	return profiles, nil
}

var embeddedLimits = sync.OnceValues(func() ([]LimitProfile, error) {
	f, err := data.Open("limits.csv")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return ReadLimits("data/limits.csv", f, DefaultModel())
})

// embedded returns the cached embedded profiles; callers must not modify
// them (Limits and LimitProfileNamed hand out copies).
func embedded() []LimitProfile {
	ps, err := embeddedLimits()
	if err != nil {
		panic("saturation: embedded limits table is broken: " + err.Error())
	}
	return ps
}

// Limits returns a copy of the embedded limit profiles (data/limits.csv):
// "no-inhibitor", "inhibitor" and "membrane". Changing the copy changes no later call.
func Limits() []LimitProfile {
	ps := embedded()
	out := make([]LimitProfile, len(ps))
	for i, p := range ps {
		out[i] = p.clone()
	}
	return out
}

// clone returns p with its own copy of the limits.
func (p LimitProfile) clone() LimitProfile {
	p.Limits = slices.Clone(p.Limits)
	return p
}

// LimitProfileNamed returns a copy of the embedded profile called name.
func LimitProfileNamed(name string) (LimitProfile, error) {
	var names []string
	for _, p := range embedded() {
		if p.Name == name {
			return p.clone(), nil
		}
		names = append(names, p.Name)
	}
	return LimitProfile{}, fmt.Errorf("unknown limit profile %q (want %s, or a file)", name, strings.Join(names, ", "))
}

// Value returns the value of a limit quantity for result r with its
// indices ix (only "lsi" uses them); ok is false when the water lacks what
// the quantity needs (the mineral's components, calcium or alkalinity, an
// analyte of a product).
func (l Limit) Value(r *Result, ix Indices) (v float64, ok bool) {
	kind, arg, _ := strings.Cut(l.Quantity, ":")
	switch kind {
	case "si":
		return r.SI(arg)
	case "lsi":
		return ix.LSI, !math.IsNaN(ix.LSI)
	case "mg_per_l":
		f, err := parseForm(arg)
		if err != nil {
			return 0, false
		}
		return f.mgPerL(r.Analysis)
	case "product":
		fs, err := parseProduct(arg)
		if err != nil {
			return 0, false
		}
		return productValue(fs, r.Analysis)
	}
	return 0, false
}
