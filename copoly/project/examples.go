package project

import (
	"fmt"
	"slices"
	"strings"

	"copoly/copoly"
	"copoly/copoly/bench"
)

// Names of the published example projects ([Example]).
const (
	ExampleGeorgiev1995Acetone     = "georgiev1995-acetone"
	ExampleGeorgiev1995Isopropanol = "georgiev1995-isopropanol"
)

// georgiev1995Citation is the citation of both Georgiev examples.
const georgiev1995Citation = "G. S. Georgiev, I. G. Dakova, S. J. Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995, " +
	"A32(3), 497–514, doi 10.1080/10601329508013679. Runs: Table 1; reactivity ratios: Table 2."

// georgiev1995 holds what differs between the two solvents of Georgiev, Dakova, Simpson 1995:
// the runs of Table 1 as printed (f1, F1, conversion by weight in percent) and the Kelen–Tüdős
// pair of Table 2. The same numbers are in testdata/georgiev1995_table1.csv, the reference the
// tests compare these with.
var georgiev1995 = map[string]struct {
	solvent string
	r1, r2  float64
	runs    [][3]string
}{
	ExampleGeorgiev1995Acetone: {"acetone", 0.42, 0.51, [][3]string{
		{"0.20", "0.27", "9.8"}, {"0.30", "0.35", "9.2"}, {"0.40", "0.42", "9.7"}, {"0.50", "0.49", "8.5"},
		{"0.60", "0.54", "8.9"}, {"0.80", "0.71", "9.1"}, {"0.90", "0.82", "9.0"},
	}},
	ExampleGeorgiev1995Isopropanol: {"isopropanol", 0.33, 0.18, [][3]string{
		{"0.10", "0.28", "8.3"}, {"0.20", "0.37", "8.4"}, {"0.30", "0.46", "9.2"}, {"0.40", "0.50", "8.9"},
		{"0.50", "0.53", "8.5"}, {"0.80", "0.70", "9.3"}, {"0.90", "0.78", "9.3"},
	}},
}

// ExampleNames returns the names of the published example projects, in the order a page offers
// them.
func ExampleNames() []string {
	return []string{ExampleGeorgiev1995Acetone, ExampleGeorgiev1995Isopropanol}
}

// Example returns the published example project called name (one of [ExampleNames]): measured
// runs from the literature with the estimate their authors published, so that a chemist can
// compare copoly's fits with a published result. Unlike [Demo] nothing in it is invented:
// Invented is false and Citation names the paper and its tables. Each call returns a fresh
// value. An unknown name gives a *copoly.FieldError for "name" wrapping ErrNotAllowed that
// lists the names.
//
// The examples are the copolymerizations of 3-methylstyrene (M1) with methacrylic acid (M2) at
// 70 °C in acetone and in isopropanol, one project per solvent because each solvent has its
// own reactivity ratios. The bench grid holds Table 1 as printed; the conversions are by weight
// and are entered as such ("9.8 %", conversion kind "mass"), so the page turns each into a molar
// conversion with the run's copolymer composition and the molar masses of C9H10 and C4H6O2
// from the standard atomic weights. The ratios in use are the published Kelen–Tüdős pair.
//
// References:
//   - G. S. Georgiev, I. G. Dakova, S. J. Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995,
//     A32(3), 497–514 (runs: Table 1; Kelen–Tüdős ratios: Table 2).
func Example(name string) (Project, error) {
	g, ok := georgiev1995[name]
	if !ok {
		return Project{}, &copoly.FieldError{Field: "name", Reason: fmt.Sprintf("%q is not a published example; the examples are %s", name, strings.Join(quoted(ExampleNames()), " and ")), Err: ErrNotAllowed}
	}
	tab := Bench{
		FeedKind:        bench.FeedFraction,
		ConversionKind:  bench.ConversionMass,
		CompositionKind: bench.CompositionFraction,
		Rows:            make([]BenchRow, len(g.runs)),
	}
	for i, r := range g.runs {
		tab.Rows[i] = BenchRow{Label: fmt.Sprintf("Table 1, %s, run %d", g.solvent, i+1), Cells: map[string]string{
			bench.ColF10: r[0], bench.ColF1: r[1], bench.ColConversion: r[2] + " %",
		}}
	}
	return Project{
		Format:  Format,
		Version: Version,
		Name:    fmt.Sprintf("Published example: 3-methylstyrene/methacrylic acid in %s, 70 °C (Georgiev, Dakova, Simpson 1995)", g.solvent),
		// Molar masses of C9H10 and C4H6O2 from the standard atomic weights (copoly.MolarMassOf;
		// checked in examples_test.go).
		Monomer1:    Monomer{Name: "3-methylstyrene", MolarMass: 118.179},
		Monomer2:    Monomer{Name: "methacrylic acid", MolarMass: 86.09},
		R1:          g.r1,
		R2:          g.r2,
		RatioSource: fmt.Sprintf("Kelen–Tüdős estimate published for these runs (%s, 70 °C): Georgiev, Dakova, Simpson 1995, Table 2", g.solvent),
		F10:         0.5,
		Conversion:  0.1,
		Tolerance:   0.02,
		Notes: fmt.Sprintf("Published data, not invented: the runs of Table 1 of the paper cited below, "+
			"3-methylstyrene (M1) with methacrylic acid (M2) in %s at 70 °C, initiated by AIBN (1 wt %%), "+
			"stopped below 10 %% conversion by weight; copolymer composition by titration of the acid. "+
			"f1 and F1 are mole fractions of 3-methylstyrene, as printed.\n\n"+
			"The conversions are by weight, in percent, as printed; copoly turns each into a molar "+
			"conversion with the run's copolymer composition and the molar masses above. Table 1 prints "+
			"them in a separate column, read here in run order: they are the least certain numbers of "+
			"this example.\n\n"+
			"The reactivity ratios in use are the authors' Kelen–Tüdős estimate (Table 2: r1 = %.2f, r2 = %.2f). "+
			"Fit the bench data to compare it with the integrated nonlinear fit and its joint confidence region.\n\n"+
			"Safety: both monomers are hazardous and radical copolymerizations can run away. Follow your "+
			"safety data sheets, local codes and licensed practice.\n\n"+
			"Source: %s", g.solvent, g.r1, g.r2, georgiev1995Citation),
		Citation: georgiev1995Citation,
		Bench:    &tab,
		Model:    &Model{Kind: ModelTerminal},
	}, nil
}

func quoted(words []string) []string {
	q := slices.Clone(words)
	for i, w := range q {
		q[i] = fmt.Sprintf("%q", w)
	}
	return q
}
