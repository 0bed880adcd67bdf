package water

// TemplateHeader returns the header of a starter wide-form CSV: one column
// for each sample field the reader knows (name, date, role, system,
// temperature, pH and the temperature it was measured at, dissolved solids,
// conductivity, comment), one for each analyte of the table and one for
// each lab measurement of CheckColumns (total hardness, P-alkalinity),
// each with the unit a laboratory usually reports it in (mg/L; mg/L as
// CaCO3 for alkalinity and hardness).
//
// Each component appears once, in its usual form (SiO2 for silica, PO4 for
// phosphate, SO4 for sulfate, NO3 for nitrate, NH4 for ammonium, alkalinity
// as CaCO3 for the carbonate system); ColumnForms lists the other forms a
// column may take instead. The list follows data/analytes.csv, so a new
// analyte row appears here by itself.
func TemplateHeader() []string {
	head := []string{"name", "date", "role", "system", "temperature [C]", "pH", "pH_temperature [C]"}
	seen := map[string]bool{}
	for _, a := range Analytes().All() {
		if usualForm(a, seen) {
			head = append(head, a.Name+" ["+templateUnit(a)+"]")
		}
	}
	for _, c := range CheckColumns() {
		head = append(head, c.Header)
	}
	return append(head, "TDS [mg/L]", "conductivity [µS/cm]", "comment")
}

// CheckColumn is a column of a laboratory measurement that the equilibrium
// does not use but that the analysis is checked against (Quality.Lab).
type CheckColumn struct {
	Header  string   // with its usual unit, e.g. "total hardness [mg/L as CaCO3]"
	Aliases []string // other names the reader accepts for it
	Note    string   // what it is used for, in words
}

// CheckColumns returns the columns of the lab measurements the reader
// reads as numbers for the data-quality checks only: total hardness and
// P-alkalinity, both in mg/L as CaCO3 as labs report them (Standard
// Methods 2340 and 2320, from memory). Another concentration unit in the
// header is read by the unit rules of the Ca-hardness and alkalinity rows
// of data/analytes.csv. They are used, so a file with them gets no note
// on columns passed through for them (Analysis.Other lists only a cell of
// theirs that is not a number).
func CheckColumns() []CheckColumn {
	return []CheckColumn{
		{Header: "total hardness [mg/L as CaCO3]", Aliases: []string{"hardness", "TH", "hardness total"},
			Note: "used only for data-quality checks (against Ca + Mg)"},
		{Header: "P-alkalinity [mg/L as CaCO3]", Aliases: []string{"P-alk", "phenolphthalein alkalinity"},
			Note: "used only for data-quality checks (against the total alkalinity and the pH)"},
	}
}

// ColumnForm is one analyte column the reader accepts: its header with the
// usual unit, the component it adds to, and the other names the header may
// use.
type ColumnForm struct {
	Header    string   // e.g. "PO4-P [mg/L]"
	Component string   // element symbol, or "Alk" for alkalinity
	Aliases   []string // other spellings of the name
}

// ColumnForms returns every analyte column the reader accepts, in the order
// of data/analytes.csv. A sample gives each component in one form only.
func ColumnForms() []ColumnForm {
	var out []ColumnForm
	for _, a := range Analytes().All() {
		out = append(out, ColumnForm{Header: a.Name + " [" + templateUnit(a) + "]", Component: a.Component, Aliases: a.Aliases})
	}
	return out
}

// usualForm reports whether a is the form a laboratory usually reports its
// component in: the first row of the component in the table, except that
// the carbonate system is entered as alkalinity (with pH it fixes inorganic
// carbon) and hardness is entered as calcium and magnesium.
func usualForm(a Analyte, seen map[string]bool) bool {
	switch {
	case a.Component == "C", a.Name == "Ca-hardness", a.Name == "Mg-hardness":
		return false
	case a.IsAlkalinity():
		return a.Name == "alkalinity"
	case seen[a.Component]:
		return false
	}
	seen[a.Component] = true
	return true
}

// templateUnit is the unit a laboratory usually reports a in.
func templateUnit(a Analyte) string {
	if a.Name == "alkalinity" || a.Name == "Ca-hardness" || a.Name == "Mg-hardness" {
		return "mg/L as CaCO3"
	}
	return "mg/L"
}
