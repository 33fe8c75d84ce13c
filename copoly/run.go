package copoly

import (
	"fmt"
	"sort"
)

// Run is one bench copolymerization reduced to the quantities the estimators use: mole
// fractions and molar conversion (see [copoly/copoly/bench.RunInput] for the forms a chemist
// types them in). Package bench makes runs and package fit takes them; Run lives here so that
// neither imports the other.
type Run struct {
	// F10 is the initial mole fraction of M1 in the monomer feed.
	F10 float64
	// Conversion is the overall molar conversion X at which the copolymer was sampled. Zero means
	// low conversion (not given): the instantaneous Mayo–Lewis equation applies.
	Conversion float64
	// F1 is the measured mole fraction of M1 in the copolymer (cumulative when Conversion > 0).
	F1 float64
	// SF, SX and Sf are the standard uncertainties of F1, Conversion and F10; zero means not
	// given.
	SF, SX, Sf float64
}

// RunWarning is a problem with the data of a bench table that does not stop a fit but should be
// shown: Row is the 0-based row (−1 for the table as a whole), Field the cell or "runs", and
// Message says what is wrong for people, with the row counted from 1.
type RunWarning struct {
	Row     int
	Field   string
	Message string
	// Code says what is wrong in a word: CodeMassBalance, CodeDuplicate, CodeNoInformation or
	// CodeFewFeeds (see [Code]), or CodeHighConversion for [copoly/copoly/fit.LinearMethodWarnings].
	Code string
}

// massBalanceTolerance is the slack allowed in the mass-balance checks of [CheckRuns], for
// rounding in the converted values.
const massBalanceTolerance = 1e-9

// distinctFeedTolerance is how far apart two feeds must be to count as different in
// [CheckRuns]: about the precision of weighing out a feed (a choice made here; common practice,
// no source).
const distinctFeedTolerance = 1e-3

// MinFeeds is the fewest different initial feeds from which reactivity ratios can be estimated
// with a check of the fit.
//
// References:
//   - A. A. A. Autzen et al. (IUPAC), Polym. Chem. 2024, d4py00270a, abstract: three or more
//     copolymerizations from different initial monomer compositions.
const MinFeeds = 3

// CheckRuns returns warnings about the data of converted bench runs (in table order):
//   - mass balance: with a conversion, F1·X ≤ f10 and (1 − F1)·X ≤ 1 − f10 (within 1e-9), since
//     the copolymer cannot hold more of a monomer than was charged;
//   - a row equal to an earlier one in f10, X and F1 (a copied row counts twice in a fit);
//   - f10 or F1 at exactly 0 or 1, and X exactly 1, which carry no information about at least
//     one reactivity ratio;
//   - fewer than [MinFeeds] different feeds strictly between 0 and 1 (feeds within 0.001 count
//     as one), as a warning with Row −1.
//
// A zero Run, which [copoly/copoly/bench.ConvertRuns] returns for a row it could not convert,
// is skipped, so the runs from ConvertRuns can be passed as they are. For the linear methods,
// add [copoly/copoly/fit.LinearMethodWarnings].
func CheckRuns(runs []Run) []RunWarning {
	var w []RunWarning
	add := func(code string, i int, field, format string, args ...any) {
		f := fmt.Sprintf("runs[%d]", i)
		if field != "" {
			f += "." + field
		}
		w = append(w, RunWarning{Row: i, Field: f, Message: fmt.Sprintf("row %d: ", i+1) + fmt.Sprintf(format, args...), Code: code})
	}
	seen := map[[3]float64]int{}
	var feeds []float64
	for i, r := range runs {
		if r == (Run{}) {
			continue
		}
		x := r.Conversion
		if x > 0 {
			if r.F1*x > r.F10+massBalanceTolerance {
				add(CodeMassBalance, i, "F1", "F1·X = %.4g·%.4g = %.4g is more than f10 = %.4g: the copolymer would hold more M1 than was charged; check F1, X and the feed",
					r.F1, x, r.F1*x, r.F10)
			}
			if (1-r.F1)*x > 1-r.F10+massBalanceTolerance {
				add(CodeMassBalance, i, "F1", "(1 − F1)·X = %.4g·%.4g = %.4g is more than 1 − f10 = %.4g: the copolymer would hold more M2 than was charged; check F1, X and the feed",
					1-r.F1, x, (1-r.F1)*x, 1-r.F10)
			}
		}
		key := [3]float64{r.F10, r.Conversion, r.F1}
		if j, ok := seen[key]; ok {
			add(CodeDuplicate, i, "", "repeats row %d (same f10, X and F1): a copied row counts twice in a fit; a true replicate rarely matches to every digit", j+1)
		} else {
			seen[key] = i
		}
		switch {
		case r.F10 == 0 || r.F10 == 1:
			add(CodeNoInformation, i, "f10", "the feed holds only M%d (f10 = %g): a homopolymerization tells nothing about the reactivity ratios", 2-int(r.F10), r.F10)
		default:
			feeds = append(feeds, r.F10)
		}
		if r.F10 > 0 && r.F10 < 1 {
			switch r.F1 {
			case 0:
				add(CodeNoInformation, i, "F1", "F1 = 0: no M1 was found in the copolymer, which only r2 → ∞ would give; such a point bounds r2 but does not estimate it (M1 may be below the detection limit)")
			case 1:
				add(CodeNoInformation, i, "F1", "F1 = 1: no M2 was found in the copolymer, which only r1 → ∞ would give; such a point bounds r1 but does not estimate it (M2 may be below the detection limit)")
			}
		}
		if x == 1 {
			add(CodeNoInformation, i, "conversion", "X = 1: at full conversion the copolymer has the composition of the feed whatever the reactivity ratios")
		}
	}
	if d := distinctFeeds(feeds); d < MinFeeds {
		feeds := "different feeds"
		if d == 1 {
			feeds = "feed"
		}
		w = append(w, RunWarning{Row: -1, Field: "runs", Code: CodeFewFeeds, Message: fmt.Sprintf(
			"the table has %d %s of both monomers: at least %d copolymerizations from different initial feeds are needed to estimate r1 and r2 with a check of the fit (IUPAC recommendation, Autzen et al., Polym. Chem. 2024)",
			d, feeds, MinFeeds)})
	}
	return w
}

// distinctFeeds counts the feeds more than distinctFeedTolerance apart.
func distinctFeeds(f []float64) int {
	if len(f) == 0 {
		return 0
	}
	s := append([]float64(nil), f...)
	sort.Float64s(s)
	n, last := 1, s[0]
	for _, v := range s[1:] {
		if v-last > distinctFeedTolerance {
			n++
			last = v
		}
	}
	return n
}
