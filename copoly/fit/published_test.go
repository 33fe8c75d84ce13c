package fit

import (
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/bench"
)

// Estimation checked against a published estimate: the runs of G. S. Georgiev, I. G. Dakova,
// S. J. Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995, A32(3), 497–514 (Table 1:
// 3-methylstyrene M1 / methacrylic acid M2 at 70 °C in acetone and in isopropanol) and the
// Kelen–Tüdős pairs the paper published for them (Table 2). The data and their caveats are
// described in testdata/README.md.
//
// The file is read with os.ReadFile rather than embedded: //go:embed cannot name a file outside
// the package's directory, and the project keeps every reference file in the top-level
// testdata/ with its README. Failures name the file and line of the reference row, like the
// standard library's testdata tests.
const georgievPath = "../../testdata/georgiev1995_table1.csv"

// georgievPublished holds the Kelen–Tüdős pairs of Table 2 of the paper (also printed in the
// caption of Fig. 3), r1 for 3-methylstyrene and r2 for methacrylic acid.
var georgievPublished = map[string][2]float64{
	"acetone":     {0.42, 0.51},
	"isopropanol": {0.33, 0.18},
}

// georgievRow is one run of Table 1, with the line of the file it was read from.
type georgievRow struct {
	line          int
	f1, F1, wtPct string // as printed
}

// readGeorgiev returns the rows of testdata/georgiev1995_table1.csv by solvent, in file order.
func readGeorgiev(t *testing.T) map[string][]georgievRow {
	t.Helper()
	b, err := os.ReadFile(georgievPath)
	if err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(strings.NewReader(string(b)))
	r.Comment = '#'
	header, err := r.Read()
	if err != nil {
		t.Fatalf("%s: %v", georgievPath, err)
	}
	if strings.Join(header, ",") != "solvent,f1,F1,conversion_wt_pct" {
		line, _ := r.FieldPos(0)
		t.Fatalf("%s:%d: header %q, want solvent,f1,F1,conversion_wt_pct", georgievPath, line, header)
	}
	out := map[string][]georgievRow{}
	for {
		rec, err := r.Read()
		if err != nil {
			break
		}
		line, _ := r.FieldPos(0)
		for _, v := range rec[1:] {
			if _, err := strconv.ParseFloat(v, 64); err != nil {
				t.Fatalf("%s:%d: %q is not a number", georgievPath, line, v)
			}
		}
		out[rec[0]] = append(out[rec[0]], georgievRow{line: line, f1: rec[1], F1: rec[2], wtPct: rec[3]})
	}
	// Table 1 has seven runs in each solvent; fewer means a truncated file.
	for s := range georgievPublished {
		if len(out[s]) != 7 {
			t.Fatalf("%s: %d runs in %s, want the 7 of Table 1", georgievPath, len(out[s]), s)
		}
	}
	return out
}

// georgievTable returns one solvent's runs as the page's bench grid holds them when a chemist
// types Table 1: feed and copolymer as mole fractions, the conversion as a mass conversion with
// a percent sign, exactly as printed.
func georgievTable(rows []georgievRow) bench.Table {
	t := bench.Table{FeedKind: bench.FeedFraction, ConversionKind: bench.ConversionMass, CompositionKind: bench.CompositionFraction}
	for _, r := range rows {
		t.Rows = append(t.Rows, bench.Row{Label: fmt.Sprintf("line %d", r.line), Cells: map[string]string{
			bench.ColF10: r.f1, bench.ColF1: r.F1, bench.ColConversion: r.wtPct + " %",
		}})
	}
	return t
}

// georgievRuns converts a solvent's runs as the page does: the mass conversion w becomes the
// molar conversion with the measured F1 (MolarConversionFromMass), with the molar masses of
// 3-methylstyrene (C9H10) and methacrylic acid (C4H6O2) from MolarMassOf.
func georgievRuns(t *testing.T, rows []georgievRow) []copoly.Run {
	t.Helper()
	m1, err1 := copoly.MolarMassOf("C9H10")
	m2, err2 := copoly.MolarMassOf("C4H6O2")
	if err1 != nil || err2 != nil {
		t.Fatal(err1, err2)
	}
	runs, ok, errs, _ := georgievTable(rows).Runs(m1, m2)
	for i := range runs {
		if !ok[i] {
			t.Fatalf("%s:%d: the bench row does not convert: %v", georgievPath, rows[i].line, errs[i])
		}
	}
	return runs
}

// TestKelenTudosGeorgiev1995 checks that copoly's Kelen–Tüdős estimate (α = √(H_min·H_max),
// every run taken as low conversion) reproduces the pair Georgiev, Dakova and Simpson published
// for the same runs (1995, Table 2) to the two decimals printed. The tolerance ±0.0075 allows
// the ±0.005 of the printed rounding plus the rounding of the printed f1 and F1 (two decimals)
// that the transcribed runs carry (common practice, no source). Measured: acetone
// r1 = 0.4247, r2 = 0.5091; isopropanol r1 = 0.3277, r2 = 0.1766: all four round to the
// printed values.
func TestKelenTudosGeorgiev1995(t *testing.T) {
	const tol = 0.0075
	for solvent, rows := range readGeorgiev(t) {
		runs := georgievRuns(t, rows)
		e, err := Estimate(runs, 0)
		if err != nil || e.KelenTudos == nil {
			t.Fatalf("%s:%d: %s: Estimate: %v (Kelen–Tüdős %v)", georgievPath, rows[0].line, solvent, err, e)
		}
		kt, pub := e.KelenTudos, georgievPublished[solvent]
		if math.Abs(kt.R1-pub[0]) > tol || math.Abs(kt.R2-pub[1]) > tol {
			t.Errorf("%s:%d: %s: KelenTudos = (%.4f, %.4f), published (Table 2) (%.2f, %.2f) ± %g",
				georgievPath, rows[0].line, solvent, kt.R1, kt.R2, pub[0], pub[1], tol)
		}
	}
}

// TestNonlinearGeorgiev1995 compares the recommended estimate, nonlinear least squares on the
// integrated terminal model (LeastSquares through Estimate, as the page runs it), and its 95 %
// joint confidence region with the published Kelen–Tüdős pair.
//
// Conversion. Table 1 gives the conversion by weight, in percent. The runs are entered as the
// page's bench grid holds them (conversion kind "mass", "9.8 %"), and the page's conversion
// turns each into the overall molar conversion with the run's measured copolymer composition,
// X = w (f10 M1 + f20 M2)/(F̄1 M1 + F̄2 M2) (MolarConversionFromMass), M1 = 118.179 and
// M2 = 86.090 g/mol from the formulas. The molar conversions come out 7.8–9.6 %; the test
// checks them against the same formula evaluated by testdata/fit_scipy.py.
//
// What holds (expected values from scipy 1.10.1, testdata/fit_scipy.json, sets
// georgiev1995-*): the integrated fit gives acetone r1 = 0.4054, r2 = 0.4928 and isopropanol
// r1 = 0.3136, r2 = 0.1679, a little below the published pairs in every ratio. The published
// pair lies INSIDE the 95 % joint confidence region in both solvents: S there is 1.36 (acetone)
// and 1.17 (isopropanol) times S_min, against 3.31 times S_min on the 95 % boundary
// (n = 7, F_0.95(2, 5) = 5.786), so the region through the published pair is the 54 % region
// in acetone and the 32 % region in isopropanol. The difference between the two estimates is
// of the size expected from the methods: Kelen–Tüdős compares each copolymer with the initial
// feed as if it had formed at zero conversion, the integrated model with the feed averaged over
// 8–10 % conversion, and both fits are unweighted with seven runs printed to two decimals.
func TestNonlinearGeorgiev1995(t *testing.T) {
	fx := readFitScipy(t)
	sets := map[string]fitScipySet{}
	for _, s := range fx.Sets {
		sets[s.Name] = s
	}
	for solvent, rows := range readGeorgiev(t) {
		want, ok := sets["georgiev1995-"+solvent]
		if !ok || want.Published == nil {
			t.Fatalf("%s: no set georgiev1995-%s with a published pair", fitScipyPath, solvent)
		}
		at := fmt.Sprintf("%s:%d: %s", georgievPath, rows[0].line, solvent)
		runs := georgievRuns(t, rows)

		// The page's molar conversion against scipy's evaluation of the same mass balance.
		for i, r := range runs {
			if x := want.Runs[i][1]; !scalar.EqualWithinRel(r.Conversion, x, 1e-12) || r.F10 != want.Runs[i][0] || r.F1 != want.Runs[i][2] {
				t.Errorf("%s:%d: run (f10 %v, X %.15g, F1 %v), fit_scipy.py (%v, %.15g, %v)",
					georgievPath, rows[i].line, r.F10, r.Conversion, r.F1, want.Runs[i][0], x, want.Runs[i][2])
			}
		}

		e, err := Estimate(runs, 0)
		if err != nil || e.Nonlinear == nil || e.Recommended != MethodNonlinear {
			t.Fatalf("%s: Estimate: %v (recommended %q)", at, err, e.Recommended)
		}
		nl := e.Nonlinear
		if !scalar.EqualWithinRel(nl.R1, want.Nonlinear.R1, fitScipyEstimateTol) || !scalar.EqualWithinRel(nl.R2, want.Nonlinear.R2, fitScipyEstimateTol) {
			t.Errorf("%s: nonlinear estimate (%.6f, %.6f), scipy (%.6f, %.6f)", at, nl.R1, nl.R2, want.Nonlinear.R1, want.Nonlinear.R2)
		}

		// The published pair against the region: the objective there (scipy's value), inside
		// the 95 % level, and the level of the region whose boundary passes through it. For
		// two parameters the F(2, ν) distribution function is 1 − (1 + 2x/ν)^(−ν/2), so the
		// level through a point with objective S is 1 − (S/S_min)^(−ν/2) (closed form; scipy
		// computed it with stats.f.cdf).
		pub := georgievPublished[solvent]
		if want.Published.R1 != pub[0] || want.Published.R2 != pub[1] {
			t.Fatalf("%s: fit_scipy.json's published pair (%v, %v), Table 2 (%v, %v)", at, want.Published.R1, want.Published.R2, pub[0], pub[1])
		}
		s := (&problem{runs: runs}).ssr(pub[0], pub[1])
		if !scalar.EqualWithinRel(s, want.Published.S, fitScipyModelTol) {
			t.Errorf("%s: S at the published pair = %.12g, scipy %.12g", at, s, want.Published.S)
		}
		if !(s < nl.Region.Critical) || !inRegionPolygon(pub, nl.Region.Boundary) {
			t.Errorf("%s: the published pair %v lies outside the 95 %% region: S = %.6g, boundary at %.6g", at, pub, s, nl.Region.Critical)
		}
		nu := float64(nl.DoF)
		level := 1 - math.Pow(s/nl.SSR, -nu/2)
		if !scalar.EqualWithinAbs(level, want.Published.Level, 1e-6) || !(level < 0.95) {
			t.Errorf("%s: the region through the published pair is at level %.6f, scipy %.6f (inside the 95 %% region: below 0.95)", at, level, want.Published.Level)
		}
		// And both estimates: the nonlinear one lies below the published one in each ratio
		// (see the doc comment), by less than the region's half-widths.
		if !(nl.R1 < pub[0] && nl.R2 < pub[1]) || pub[0]-nl.R1 > (nl.Region.R1Max-nl.Region.R1Min)/2 || pub[1]-nl.R2 > (nl.Region.R2Max-nl.Region.R2Min)/2 {
			t.Errorf("%s: nonlinear (%.4f, %.4f) against published (%.2f, %.2f), region r1 %.4f–%.4f, r2 %.4f–%.4f",
				at, nl.R1, nl.R2, pub[0], pub[1], nl.Region.R1Min, nl.Region.R1Max, nl.Region.R2Min, nl.Region.R2Max)
		}
	}
}

// inRegionPolygon reports whether p lies inside the closed polygon b, by the even–odd rule
// (a ray cast towards +r1 crosses the boundary an odd number of times).
func inRegionPolygon(p [2]float64, b [][2]float64) bool {
	in := false
	for i := range b {
		a, c := b[i], b[(i+1)%len(b)]
		if (a[1] > p[1]) != (c[1] > p[1]) && p[0] < a[0]+(p[1]-a[1])*(c[0]-a[0])/(c[1]-a[1]) {
			in = !in
		}
	}
	return in
}
