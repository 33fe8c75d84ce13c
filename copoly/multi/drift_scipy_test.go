package multi

import (
	"encoding/json"
	"math"
	"os"
	"testing"
)

// multiScipyPath is the reference drift made by testdata/multi_scipy.py (scipy solve_ivp,
// DOP853, rtol 1e-12, in t = −ln(1 − X) and ln f; versions in the file and in
// testdata/README.md).
const multiScipyPath = "../../testdata/multi_scipy.json"

type scipyDriftCase struct {
	Name       string      `json:"name"`
	R          [][]float64 `json:"r"`
	F0         []float64   `json:"f0"`
	Conversion []float64   `json:"conversion"`
	F          [][]float64 `json:"f"`
	Inst       [][]float64 `json:"F"`
	Cum        [][]float64 `json:"Fcum"`
	Exhausted  [][]float64 `json:"exhausted"` // [monomer, conversion]
}

// closeToScipy is the agreement asked of the drift: 1e-9 absolute, and for values below 1e-3
// (a monomer being used up) also 1e-6 relative or 1e-15 absolute. The fixture is accurate to
// about 1e-10 relative (its self-check reruns at rtol 1e-13).
func closeToScipy(got, want float64) bool {
	d := math.Abs(got - want)
	if d > 1e-9 {
		return false
	}
	return math.Abs(want) >= 1e-3 || d <= 1e-6*math.Abs(want) || d <= 1e-15
}

// TestDriftAgainstScipy compares the drift of three- and four-monomer batches, including
// monomers used up before the end, with testdata/multi_scipy.json: f, F and F̄ at every
// conversion, and the conversions at which a monomer's share falls below 1e-6 (to 1e-8).
func TestDriftAgainstScipy(t *testing.T) {
	raw, err := os.ReadFile(multiScipyPath)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Exhausted float64          `json:"exhausted_fraction"`
		Cases     []scipyDriftCase `json:"cases"`
	}
	if err := json.Unmarshal(raw, &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Cases) < 4 || doc.Exhausted != ExhaustedFraction {
		t.Fatalf("%s: %d cases, threshold %g; want the four cases and %g", multiScipyPath, len(doc.Cases), doc.Exhausted, ExhaustedFraction)
	}
	worst := 0.0
	for ci, c := range doc.Cases {
		d, err := mustNew(t, c.R, nil).Drift(c.F0, c.Conversion)
		if err != nil {
			t.Fatalf("%s: cases[%d] %s: %v", multiScipyPath, ci, c.Name, err)
		}
		for k, x := range c.Conversion {
			for _, tab := range []struct {
				what      string
				got, want []float64
			}{{"f", d.Feed[k], c.F[k]}, {"F", d.Inst[k], c.Inst[k]}, {"Fcum", d.Cum[k], c.Cum[k]}} {
				for i := range tab.want {
					worst = math.Max(worst, math.Abs(tab.got[i]-tab.want[i]))
					if !closeToScipy(tab.got[i], tab.want[i]) {
						t.Errorf("%s: cases[%d] %s, X = %g: %s[%d] = %.15g, scipy %.15g", multiScipyPath, ci, c.Name, x, tab.what, i, tab.got[i], tab.want[i])
					}
				}
			}
		}
		if len(d.Exhausted) != len(c.Exhausted) {
			t.Errorf("%s: cases[%d] %s: Exhausted = %+v, scipy %v", multiScipyPath, ci, c.Name, d.Exhausted, c.Exhausted)
			continue
		}
		for k, e := range c.Exhausted {
			if got := d.Exhausted[k]; got.Monomer != int(e[0]) || math.Abs(got.Conversion-e[1]) > 1e-8 {
				t.Errorf("%s: cases[%d] %s: exhaustion %d = %+v, scipy monomer %g at X = %.12g", multiScipyPath, ci, c.Name, k, got, e[0], e[1])
			}
		}
	}
	t.Logf("largest absolute difference from scipy: %.2g", worst)
}
