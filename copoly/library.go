package copoly

import (
	"fmt"
	"unicode"
)

// Standard atomic weights (g/mol) of the elements in common monomers: the IUPAC abridged values
// (five significant figures), T. Prohaska et al., "Standard atomic weights of the elements 2021
// (IUPAC Technical Report)", Pure Appl. Chem. 2022, 94, 573 (source SrcAtomicWeights, read from
// a public transcription of the report's table). K is here for M(KOH) = 56.105 g/mol in hydroxyl
// and acid values.
var atomicWeight = map[string]float64{
	"H":  1.0080,
	"C":  12.011,
	"N":  14.007,
	"O":  15.999,
	"S":  32.06,
	"Cl": 35.45,
	"F":  18.998,
	"Br": 79.904,
	"Si": 28.085,
	"P":  30.974,
	"K":  39.098,
}

// MolarMassOf returns the molar mass in g/mol of a simple formula such as "C8H8" or "C3H3N"
// (element symbols with optional counts; no brackets), from the standard atomic weights above.
func MolarMassOf(formula string) (float64, error) {
	var sum float64
	r := []rune(formula)
	if len(r) == 0 {
		return 0, &FieldError{Field: "formula", Reason: "empty formula", Err: ErrOutOfRange}
	}
	for i := 0; i < len(r); {
		if !unicode.IsUpper(r[i]) {
			return 0, &FieldError{Field: "formula", Reason: fmt.Sprintf("%q: expected an element symbol at position %d", formula, i+1), Err: ErrOutOfRange}
		}
		j := i + 1
		for j < len(r) && unicode.IsLower(r[j]) {
			j++
		}
		sym := string(r[i:j])
		w, ok := atomicWeight[sym]
		if !ok {
			return 0, &FieldError{Field: "formula", Reason: fmt.Sprintf("%q: no atomic weight for element %q", formula, sym), Err: ErrOutOfRange}
		}
		n := 0
		for j < len(r) && unicode.IsDigit(r[j]) {
			n = 10*n + int(r[j]-'0')
			j++
			if n > 100000 {
				return 0, &FieldError{Field: "formula", Reason: fmt.Sprintf("%q: count too large", formula), Err: ErrOutOfRange}
			}
		}
		if n == 0 {
			n = 1
		}
		sum += float64(n) * w
		i = j
	}
	return sum, nil
}

// Monomer is an entry of the built-in monomer list.
type Monomer struct {
	Name    string
	Formula string
	// MolarMass in g/mol, computed from Formula with the standard atomic weights.
	MolarMass float64
	// Source says how the molar mass was obtained; SourceID names its entry in [Sources].
	Source   string
	SourceID string
}

// monomerFormulas is the built-in list: common monomers of acrylic, styrenic, vinyl and
// functional copolymers with their molecular formulas.
var monomerFormulas = []struct{ name, formula string }{
	{"styrene", "C8H8"},
	{"methyl methacrylate", "C5H8O2"},
	{"methyl acrylate", "C4H6O2"},
	{"ethyl acrylate", "C5H8O2"},
	{"n-butyl acrylate", "C7H12O2"},
	{"2-ethylhexyl acrylate", "C11H20O2"},
	{"acrylonitrile", "C3H3N"},
	{"vinyl acetate", "C4H6O2"},
	{"vinyl chloride", "C2H3Cl"},
	{"1,3-butadiene", "C4H6"},
	{"acrylic acid", "C3H4O2"},
	{"methacrylic acid", "C4H6O2"},
	{"maleic anhydride", "C4H2O3"},
	{"N-vinylpyrrolidone", "C6H9NO"},
	{"2-hydroxyethyl methacrylate", "C6H10O3"},
	{"acrylamide", "C3H5NO"},
	{"n-butyl methacrylate", "C8H14O2"},
	{"2-hydroxyethyl acrylate", "C5H8O3"},
	{"2-hydroxypropyl methacrylate", "C7H12O3"},
}

// Monomers returns the built-in monomer list with molar masses computed from the formulas.
func Monomers() []Monomer {
	out := make([]Monomer, len(monomerFormulas))
	for i, e := range monomerFormulas {
		mm, err := MolarMassOf(e.formula)
		if err != nil {
			panic("copoly: bad built-in formula " + e.formula)
		}
		out[i] = Monomer{Name: e.name, Formula: e.formula, MolarMass: mm, SourceID: SrcAtomicWeights,
			Source: "molar mass from the formula " + e.formula + " and the " + cite(SrcAtomicWeights, "")}
	}
	return out
}

// RatioPair is a published pair of terminal-model reactivity ratios.
type RatioPair struct {
	Monomer1, Monomer2 string
	R1, R2             float64
	// Temperature and conditions as published; "" when the source gives none (its note in
	// [Sources] says so once for all its pairs).
	Temperature string
	// Source is the per-value source text; SourceID names its entry in [Sources].
	Source   string
	SourceID string
}

// Pairs returns the built-in literature pairs. Values from the handbook table vary between
// studies by ±20 % or more; each pair names its source, and the page shows it beside the values.
//
// Among the acrylic binder monomers (methyl methacrylate, n-butyl acrylate, n-butyl
// methacrylate, 2-hydroxyethyl methacrylate, 2-hydroxyethyl acrylate, acrylic acid, methacrylic
// acid, styrene) the list has styrene/n-butyl acrylate (the handbook table, and a study at
// 120 °C), styrene/methyl methacrylate, methyl methacrylate/n-butyl acrylate and styrene/acrylic
// acid (the handbook table, transcription not checked) and 2-hydroxyethyl methacrylate/n-butyl
// methacrylate (bulk, 50 °C). The other pairs of that set wait for a published value that could
// be read.
func Pairs() []RatioPair {
	h := func(m1, m2 string, r1, r2 float64, refs string) RatioPair {
		return RatioPair{Monomer1: m1, Monomer2: m2, R1: r1, R2: r2,
			Source: cite(SrcHandbookRatios, "ref. "+refs), SourceID: SrcHandbookRatios}
	}
	p := func(m1, m2 string, r1, r2 float64, cond, id, detail string) RatioPair {
		return RatioPair{Monomer1: m1, Monomer2: m2, R1: r1, R2: r2, Temperature: cond,
			Source: cite(id, detail), SourceID: id}
	}
	return []RatioPair{
		h("styrene", "methyl methacrylate", 0.52, 0.46, "139, 179"),
		h("styrene", "acrylonitrile", 0.40, 0.04, "60"),
		h("styrene", "n-butyl acrylate", 0.80, 0.15, "549"),
		p("styrene", "n-butyl acrylate", 0.74, 0.29, "nitroxide-mediated (DEPN with AIBN), 120 °C", SrcStBANMP2004, ""),
		p("styrene", "2-ethylhexyl acrylate", 0.979, 0.292, "bulk, 80 °C", SrcStEHA2004, "¹H NMR, error-in-variables estimate"),
		h("styrene", "methyl acrylate", 0.75, 0.18, "393, 397"),
		h("styrene", "ethyl acrylate", 0.787, 0.152, "673, 677"),
		h("styrene", "maleic anhydride", 0.04, 0.02, "483"),
		h("styrene", "1,3-butadiene", 0.58, 1.35, "418"),
		h("styrene", "acrylic acid", 0.15, 0.25, "490 (listed there as acrylic acid/styrene 0.25/0.15)"),
		h("methyl methacrylate", "n-butyl acrylate", 1.88, 0.43, "87"),
		h("methyl methacrylate", "acrylonitrile", 1.322, 0.138, "216"),
		h("methyl methacrylate", "vinyl acetate", 26, 0.03, "272"),
		h("vinyl acetate", "vinyl chloride", 0.24, 1.84, "158"),
		h("acrylonitrile", "vinyl acetate", 4.05, 0.04, "158"),
		p("acrylonitrile", "n-butyl acrylate", 1.52, 0.75, "not given in the abstract", SrcJordan1960, ""),
		p("acrylamide", "vinyl acetate", 9.28, 0.09, "solution, benzoyl peroxide initiator (temperature not given in the abstract)",
			SrcMukherjee1998, "Kelen–Tüdős and error-in-variables"),
		p("2-hydroxyethyl methacrylate", "n-butyl methacrylate", 2.27, 0.66, "bulk, 50 °C", SrcIdowu2019, "section 3.1"),
		p("acrylic acid", "ethyl acrylate", 0.91, 1.02, "dioxane, 50 °C", SrcAAEA, ""),
	}
}
