package molarmass

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// averagesNumpyPath is the fixture made by testdata/averages_numpy.py: Mn, Mw, Mz and Đ computed
// by numpy 1.24.2 from the textbook definitions (Flory 1953) on made-up test distributions and a
// hand case, independent of copoly. Versions and the command are in the file's fields and in
// testdata/README.md.
const averagesNumpyPath = "../../testdata/averages_numpy.json"

// averagesNumpyTol is the relative tolerance of the comparison with numpy, as asked of this
// cross-check (common practice, no source): both sides add at most 121 positive terms in double
// precision, so they differ by a few ulps (numpy sums pairwise, copoly in order); the
// differences measured on the fixture are logged with -v.
const averagesNumpyTol = 1e-12

// averagesNumpyCases are the cases testdata/averages_numpy.py writes (its docstring describes
// them); a fixture without one of them fails instead of testing less.
var averagesNumpyCases = []string{"lognormal-weight", "lognormal-number", "two-equal-masses", "sec-gaussian"}

// averagesNumpyFixture mirrors testdata/averages_numpy.json. It is decoded with unknown fields
// disallowed, so a renamed key fails loudly instead of leaving an expected value at zero.
type averagesNumpyFixture struct {
	Comment   string  `json:"comment"`
	MadeBy    string  `json:"made_by"`
	Python    string  `json:"python"`
	Numpy     string  `json:"numpy"`
	Tolerance float64 `json:"tolerance"`
	Bins      []struct {
		Name   string `json:"name"`
		Source string `json:"source"`
		// Kind says what Fraction holds: "weight" or "number" fractions.
		Kind     string             `json:"kind"`
		Low      []float64          `json:"low"`
		High     []float64          `json:"high"`
		Fraction []float64          `json:"fraction"`
		Expected averagesNumpyValue `json:"expected"`
	} `json:"bins"`
	Slices []struct {
		Name   string `json:"name"`
		Source string `json:"source"`
		// Volume is the elution volume of each slice (mL); the averages use only Mass and Signal.
		Volume   []float64          `json:"volume"`
		Mass     []float64          `json:"mass"`
		Signal   []float64          `json:"signal"`
		Expected averagesNumpyValue `json:"expected"`
	} `json:"slices"`
}

type averagesNumpyValue struct {
	Mn         float64 `json:"Mn"`
	Mw         float64 `json:"Mw"`
	Mz         float64 `json:"Mz"`
	Dispersity float64 `json:"dispersity"`
}

func readAveragesNumpy(t *testing.T) averagesNumpyFixture {
	t.Helper()
	raw, err := os.ReadFile(averagesNumpyPath)
	if err != nil {
		t.Fatalf("%s: %v (made by /usr/bin/python3 testdata/averages_numpy.py)", averagesNumpyPath, err)
	}
	dec := json.NewDecoder(bytes.NewReader(raw))
	dec.DisallowUnknownFields()
	var fx averagesNumpyFixture
	if err := dec.Decode(&fx); err != nil {
		t.Fatalf("%s: %v", averagesNumpyPath, err)
	}
	if fx.Tolerance != averagesNumpyTol {
		t.Fatalf("%s: tolerance %g, the test uses %g: keep them equal", averagesNumpyPath, fx.Tolerance, averagesNumpyTol)
	}
	return fx
}

// TestAveragesAgainstNumpy compares BinAverages and SliceAverages with numpy's sums of the same
// definitions on the same classes and slices.
func TestAveragesAgainstNumpy(t *testing.T) {
	fx := readAveragesNumpy(t)
	t.Logf("%s: made by %s with python %s, numpy %s", averagesNumpyPath, fx.MadeBy, fx.Python, fx.Numpy)
	seen := map[string]bool{}
	worst := 0.0
	compare := func(name string, got Averages, want averagesNumpyValue) {
		t.Helper()
		for _, c := range []struct {
			what      string
			got, want float64
		}{
			{"Mn", got.Mn, want.Mn}, {"Mw", got.Mw, want.Mw}, {"Mz", got.Mz, want.Mz}, {"dispersity", got.Dispersity, want.Dispersity},
		} {
			if !(c.want > 0) {
				t.Errorf("%s, case %s: expected %s is %v: the fixture is broken", averagesNumpyPath, name, c.what, c.want)
				continue
			}
			d := math.Abs(c.got-c.want) / c.want
			worst = math.Max(worst, d)
			if !scalar.EqualWithinRel(c.got, c.want, averagesNumpyTol) {
				t.Errorf("%s, case %s: %s = %.17g, numpy %.17g (relative difference %.2g > %g)",
					averagesNumpyPath, name, c.what, c.got, c.want, d, averagesNumpyTol)
			}
		}
	}
	for _, c := range fx.Bins {
		seen[c.Name] = true
		if len(c.Low) == 0 || len(c.High) != len(c.Low) || len(c.Fraction) != len(c.Low) {
			t.Errorf("%s, case %s: %d low, %d high, %d fractions", averagesNumpyPath, c.Name, len(c.Low), len(c.High), len(c.Fraction))
			continue
		}
		bins := make([]Bin, len(c.Low))
		for i := range bins {
			bins[i] = Bin{Low: c.Low[i], High: c.High[i]}
			switch c.Kind {
			case "weight":
				bins[i].Weight = c.Fraction[i]
			case "number":
				bins[i].Number = c.Fraction[i]
			default:
				t.Fatalf("%s, case %s: kind %q, want weight or number", averagesNumpyPath, c.Name, c.Kind)
			}
		}
		got, err := BinAverages(bins)
		if err != nil {
			t.Errorf("%s, case %s: %v", averagesNumpyPath, c.Name, err)
			continue
		}
		compare(c.Name, got, c.Expected)
	}
	for _, c := range fx.Slices {
		seen[c.Name] = true
		got, err := SliceAverages(c.Mass, c.Signal)
		if err != nil {
			t.Errorf("%s, case %s: %v", averagesNumpyPath, c.Name, err)
			continue
		}
		compare(c.Name, got, c.Expected)
	}
	for _, name := range averagesNumpyCases {
		if !seen[name] {
			t.Errorf("%s: case %s is missing (testdata/averages_numpy.py writes it)", averagesNumpyPath, name)
		}
	}
	t.Logf("%d cases, largest relative difference from numpy %.2g", len(fx.Bins)+len(fx.Slices), worst)
}
