package molarmass

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

func TestAveragesByHand(t *testing.T) {
	// Equal masses of 10 000 and 30 000 g/mol chains (hand-checkable, from the definitions):
	// Mn = 2/(1/10⁴ + 1/3·10⁴) = 15 000, Mw = 20 000, Mz = (10⁸ + 9·10⁸)/(4·10⁴) = 25 000.
	a, err := BinAverages([]Bin{{Low: 10000, High: 10000, Weight: 0.5}, {Low: 30000, High: 30000, Weight: 0.5}})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range [][2]float64{{a.Mn, 15000}, {a.Mw, 20000}, {a.Mz, 25000}, {a.Dispersity, 4.0 / 3}} {
		if !scalar.EqualWithinAbsOrRel(c[0], c[1], 1e-12, 1e-12) {
			t.Errorf("equal masses: %+v", a)
		}
	}
	// Equal numbers of the same chains: Mn = 20 000, Mw = (10⁸ + 9·10⁸)/(4·10⁴) = 25 000.
	a, _ = BinAverages([]Bin{{Low: 9000, High: 11000, Number: 1}, {Low: 29000, High: 31000, Number: 1}})
	if !scalar.EqualWithinAbsOrRel(a.Mn, 20000, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(a.Mw, 25000, 1e-12, 1e-12) {
		t.Errorf("equal numbers: %+v", a)
	}
	// The most-probable distribution of DP with p = 0.99, summed as slices: DPn = 1/(1 − p) = 100,
	// DPw = (1 + p)/(1 − p) = 199, Đ → 2 (Flory 1953; from memory). The tail beyond n = 10 000
	// holds p^10000 ≈ 2e-44 of the mass.
	p := 0.99
	var mass, sig []float64
	for n := 1; n <= MaxAverageRows; n++ {
		mass = append(mass, float64(n))
		sig = append(sig, float64(n)*(1-p)*math.Pow(p, float64(n-1))) // weight ∝ n·number
	}
	a, err = SliceAverages(mass, sig)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(a.Mn, 100, 1e-9, 1e-9) || !scalar.EqualWithinAbsOrRel(a.Mw, 199, 1e-9, 1e-9) {
		t.Errorf("Flory: %+v", a)
	}
	c, _ := SizeOf(Averages{Mn: 11616, Mw: 20000}, 0.5, 104.152, 128.171)
	// M̄0 = (104.152 + 128.171)/2 = 116.1615 g/mol; DPn = 11616/116.1615 = 99.998 (by hand).
	if !scalar.EqualWithinAbsOrRel(c.UnitMass, 116.1615, 1e-12, 1e-12) || math.Abs(c.DPn-11616/116.1615) > 1e-9 || math.Abs(c.Units1-c.DPn/2) > 1e-9 {
		t.Errorf("size %+v", c)
	}
}

func TestAveragesValidate(t *testing.T) {
	for _, tc := range []struct {
		bins  []Bin
		field string
	}{
		{nil, "bins"},
		{[]Bin{{Low: 0, High: 10, Weight: 1}}, "bins[0].high"},
		{[]Bin{{Low: 10, High: 20, Weight: -1}}, "bins[0].weightFraction"},
		{[]Bin{{Low: 10, High: 20, Number: 1}, {Low: 20, High: 30, Weight: 1}}, "bins[1].numberFraction"},
		{[]Bin{{Low: 10, High: 20, Weight: 0}}, "bins"},
	} {
		if _, err := BinAverages(tc.bins); copoly.Field(err) != tc.field {
			t.Errorf("%+v: %v, want field %s", tc.bins, err, tc.field)
		}
	}
	if _, err := SliceAverages([]float64{1, 2}, []float64{1}); copoly.Field(err) != "signal" {
		t.Errorf("length mismatch: %v", err)
	}
}
