package multi

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

var driftConversions = []float64{0, 1e-9, 1e-4, 0.05, 0.1, 0.3, 0.5, 0.7, 0.9, 0.95, 0.99, 0.999, 1}

// TestDriftBinary checks N = 2 against copoly.Terminal.Drift (the Meyer–Lowry closed form where
// it applies, the Skeist equation elsewhere: I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781;
// V. E. Meyer, G. G. Lowry, J. Polym. Sci. A 1965, 3, 2843) to 1e-9, X = 1 (the limit) included,
// and the conversions at which a monomer is reported used up to 1e-7.
func TestDriftBinary(t *testing.T) {
	cases := []struct {
		name   string
		r1, r2 float64
		f10    float64
	}{
		{"styrene/acrylonitrile below the azeotrope", 0.40, 0.04, 0.3},
		{"styrene/acrylonitrile above the azeotrope", 0.40, 0.04, 0.8},
		{"methyl methacrylate/n-butyl acrylate", 1.88, 0.43, 0.5},
		{"both above one", 2.0, 1.5, 0.2},
		{"r1 = 1", 1, 0.5, 0.5},
		{"exhaustion", 5, 0.05, 0.5},
		{"strong exhaustion", 20, 0.02, 0.3},
		{"ideal", 1, 1, 0.4},
	}
	for _, c := range cases {
		want, err := copoly.Terminal{R1: c.r1, R2: c.r2}.Drift(c.f10, driftConversions)
		if err != nil {
			t.Fatal(err)
		}
		m := mustNew(t, [][]float64{{1, c.r1}, {c.r2, 1}}, nil)
		got, err := m.Drift([]float64{c.f10, 1 - c.f10}, driftConversions)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		for k, x := range driftConversions {
			for _, q := range []struct {
				what      string
				got, want float64
			}{
				{"f1", got.Feed[k][0], want.Feed[k]},
				{"F1", got.Inst[k][0], want.Inst[k]},
				{"F̄1", got.Cum[k][0], want.Cum[k]},
				{"f2", got.Feed[k][1], 1 - want.Feed[k]},
			} {
				if !scalar.EqualWithinAbsOrRel(q.got, q.want, 1e-9, 1e-9) {
					t.Errorf("%s, X = %g: %s = %.12g, copoly.Terminal.Drift %.12g", c.name, x, q.what, q.got, q.want)
				}
			}
		}
		switch {
		case want.Exhausted == nil && len(got.Exhausted) > 0:
			t.Errorf("%s: Exhausted = %v, the binary drift reports none", c.name, got.Exhausted)
		case want.Exhausted != nil:
			if len(got.Exhausted) != 1 || got.Exhausted[0].Monomer != want.Exhausted.Monomer-1 ||
				!scalar.EqualWithinAbsOrRel(got.Exhausted[0].Conversion, want.Exhausted.Conversion, 1e-7, 1e-7) {
				t.Errorf("%s: Exhausted = %+v, the binary drift %+v (monomers numbered from 1)", c.name, got.Exhausted, *want.Exhausted)
			}
		}
	}
}

// TestDriftStops checks a monomer that does not add to its own radical (r2 = 0) once the other
// is used up: polymerization stops at the conversion the binary drift reports (its
// ConversionLimit with a band of 0.5, which the batch never leaves, is that conversion), and a
// conversion beyond gives an error naming it.
func TestDriftStops(t *testing.T) {
	bin, err := copoly.NewBatch(copoly.Terminal{R1: 2, R2: 0}, 0.5)
	if err != nil {
		t.Fatal(err)
	}
	xmax, err := bin.ConversionLimit(0.5)
	if err != nil {
		t.Fatal(err)
	}
	m := mustNew(t, [][]float64{{1, 2}, {0, 1}}, nil)
	d, err := m.Drift([]float64{0.5, 0.5}, []float64{0.1, 0.5, 0.7})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(d.Stop, xmax, 1e-9, 1e-9) {
		t.Errorf("Stop = %.12g, binary %.12g", d.Stop, xmax)
	}
	want, _ := bin.Drift([]float64{0.1, 0.5, 0.7})
	for k := range d.Conversion {
		if !scalar.EqualWithinAbsOrRel(d.Feed[k][0], want.Feed[k], 1e-9, 1e-9) {
			t.Errorf("X = %g: f1 = %.12g, binary %.12g", d.Conversion[k], d.Feed[k][0], want.Feed[k])
		}
	}
	_, err = m.Drift([]float64{0.5, 0.5}, []float64{0.1, xmax + 1e-6})
	if copoly.Field(err) != "conversion[1]" || !errors.Is(err, copoly.ErrOutOfRange) {
		t.Errorf("a conversion past the stop: %v, want an error naming conversion[1]", err)
	}
	// At the stop itself: the limit from below, f1 = 0 (to rounding of the conversion) and
	// F1 = ½ (strict alternation).
	d, err = m.Drift([]float64{0.5, 0.5}, []float64{d.Stop})
	if err != nil {
		t.Fatalf("at the stop: %v", err)
	}
	if math.Abs(d.Feed[0][0]) > 1e-15 || !scalar.EqualWithinAbsOrRel(d.Inst[0][0], 0.5, 1e-12, 1e-12) {
		t.Errorf("at the stop: f = %v, F = %v, want f1 = 0, F1 = 0.5", d.Feed[0], d.Inst[0])
	}
}

// TestDriftIdentities checks, on random models of 3…6 monomers, that f, F and F̄ each sum to 1,
// that F̄ at X = 1 is the starting feed, and that the balance holds: F̄(X) from the monomer
// balance equals the mean of F over [0, X], (1/X) ∫ F dX, by Simpson's rule on 20001 points,
// to 1e-9 (measured: a few 1e-15; with 2001 points Simpson's own error reaches 2e-6 where a
// trace monomer is used up quickly).
func TestDriftIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(1946, 1781))
	const pts = 20001
	for range 20 {
		n := 3 + rng.IntN(4)
		r := randomRatios(rng, n)
		f0 := randomFeed(rng, n)
		top := 0.9
		xs := make([]float64, pts, pts+1)
		for k := range xs {
			xs[k] = top * float64(k) / (pts - 1)
		}
		xs = append(xs, 1)
		d, err := mustNew(t, r, nil).Drift(f0, xs)
		if err != nil {
			t.Fatalf("r = %v, f0 = %v: %v", r, f0, err)
		}
		for k := range xs {
			for _, row := range [][]float64{d.Feed[k], d.Inst[k], d.Cum[k]} {
				if s := sumOf(row); math.Abs(s-1) > 1e-9 {
					t.Fatalf("r = %v, f0 = %v, X = %g: a row sums to %.15g", r, f0, xs[k], s)
				}
			}
		}
		h := top / (pts - 1)
		for i := range n {
			sum := d.Inst[0][i] + d.Inst[pts-1][i]
			for k := 1; k < pts-1; k++ {
				w := 2.0
				if k%2 == 1 {
					w = 4
				}
				sum += w * d.Inst[k][i]
			}
			mean := sum * h / 3 / top
			if got := d.Cum[pts-1][i]; math.Abs(got-mean) > 1e-9 {
				t.Fatalf("r = %v, f0 = %v: F̄[%d](%g) = %.10g by the balance, %.10g as the mean of F", r, f0, i, top, got, mean)
			}
		}
		for i := range n {
			if d.Cum[pts][i] != f0[i]/sumOf(f0) {
				t.Fatalf("X = 1: F̄ = %v, want f0 = %v", d.Cum[pts], f0)
			}
		}
	}
}

func sumOf(v []float64) float64 {
	var s float64
	for _, x := range v {
		s += x
	}
	return s
}

// TestDriftNoDrift checks that all ratios 1 (every monomer enters in proportion to the feed)
// and a single monomer do not drift.
func TestDriftNoDrift(t *testing.T) {
	ones := [][]float64{{1, 1, 1}, {1, 1, 1}, {1, 1, 1}}
	f0 := []float64{0.2, 0.3, 0.5}
	d, err := mustNew(t, ones, nil).Drift(f0, []float64{0.5, 0.99, 1})
	if err != nil {
		t.Fatal(err)
	}
	for k := range d.Conversion {
		for i := range 3 {
			for _, v := range []float64{d.Feed[k][i], d.Inst[k][i], d.Cum[k][i]} {
				if !scalar.EqualWithinAbsOrRel(v, f0[i], 1e-12, 1e-12) {
					t.Fatalf("all r = 1, X = %g: f = %v, F = %v, F̄ = %v, want f0", d.Conversion[k], d.Feed[k], d.Inst[k], d.Cum[k])
				}
			}
		}
	}
	d, err = mustNew(t, [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}}, nil).Drift([]float64{0, 1, 0}, []float64{0.5, 1})
	if err != nil {
		t.Fatal(err)
	}
	if d.Feed[1][1] != 1 || d.Inst[1][1] != 1 {
		t.Errorf("one monomer: f = %v, F = %v at X = 1", d.Feed[1], d.Inst[1])
	}
}

// TestDriftErrors checks the validation of a drift's inputs.
func TestDriftErrors(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}}, nil)
	tests := []struct {
		f0, xs []float64
		field  string
		err    error
	}{
		{[]float64{0.5, 0.5}, []float64{0.5}, "f0", copoly.ErrOutOfRange},
		{[]float64{0.5, 0.6, -0.1}, []float64{0.5}, "f0[2]", copoly.ErrOutOfRange},
		{[]float64{0.2, 0.3, 0.5}, []float64{0.5, 0.4}, "conversion[1]", copoly.ErrOutOfRange},
		{[]float64{0.2, 0.3, 0.5}, []float64{0.5, math.NaN()}, "conversion[1]", copoly.ErrNotFinite},
		{[]float64{0.2, 0.3, 0.5}, []float64{1.5}, "conversion[0]", copoly.ErrOutOfRange},
		{[]float64{0.2, 0.3, 0.5}, make([]float64, copoly.MaxPoints+1), "conversion", copoly.ErrTooMany},
	}
	for _, tt := range tests {
		_, err := m.Drift(tt.f0, tt.xs)
		if copoly.Field(err) != tt.field || !errors.Is(err, tt.err) {
			t.Errorf("Drift(%v, …%d conversions): %v, want field %q wrapping %v", tt.f0, len(tt.xs), err, tt.field, tt.err)
		}
	}
	// A monomer that does not add to its own radical, alone.
	m2 := mustNew(t, [][]float64{{1, 2}, {0, 1}}, nil)
	if _, err := m2.Drift([]float64{0, 1}, []float64{0.1}); copoly.Field(err) != "conversion[0]" {
		t.Errorf("M2 alone without homopolymerization: %v, want an error naming conversion[0]", err)
	}
}

// TestDriftZeroRatioLimit checks that a zero ratio behaves as the limit of small ones: a batch
// with r[2][0] = 0 (a radical M3 always adds M1, which is then used up at a finite conversion
// and leaves the integration) against the same batch with r[2][0] = 1e-8, integrated like any
// other; they agree to 1e-6 away from where M1 runs out (an identity of the model: the
// composition is continuous in the ratios).
func TestDriftZeroRatioLimit(t *testing.T) {
	r := [][]float64{{1, 0.8, 1.5}, {0.6, 1, 0.9}, {0, 1.2, 1}}
	small := [][]float64{{1, 0.8, 1.5}, {0.6, 1, 0.9}, {1e-8, 1.2, 1}}
	f0 := []float64{0.2, 0.4, 0.4}
	xs := []float64{0.05, 0.1, 0.2, 0.3, 0.5, 0.7, 0.9, 0.99}
	d, err := mustNew(t, r, nil).Drift(f0, xs)
	if err != nil {
		t.Fatal(err)
	}
	e, err := mustNew(t, small, nil).Drift(f0, xs)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Exhausted) == 0 || d.Exhausted[0].Monomer != 0 {
		t.Fatalf("r[2][0] = 0: Exhausted = %+v, want M1 used up", d.Exhausted)
	}
	xOut := d.Exhausted[0].Conversion
	for k, x := range xs {
		if math.Abs(x-xOut) < 0.02 {
			continue
		}
		for i := range 3 {
			for _, q := range [][2]float64{{d.Feed[k][i], e.Feed[k][i]}, {d.Inst[k][i], e.Inst[k][i]}, {d.Cum[k][i], e.Cum[k][i]}} {
				if math.Abs(q[0]-q[1]) > 1e-6 {
					t.Errorf("X = %g: r[2][0] = 0 gives f = %v, F = %v, F̄ = %v; 1e-8 gives %v, %v, %v", x, d.Feed[k], d.Inst[k], d.Cum[k], e.Feed[k], e.Inst[k], e.Cum[k])
				}
			}
		}
	}
	if len(e.Exhausted) == 0 || math.Abs(e.Exhausted[0].Conversion-xOut) > 1e-4 {
		t.Errorf("M1 used up at X = %g with r[2][0] = 0, at %+v with 1e-8", xOut, e.Exhausted)
	}
}

// TestDriftNoHomopolymer follows a three-monomer batch with a monomer that does not add to its
// own radical (M3, cross ratios k31 : k32 = 1 : 2): the other two are used up, in finite
// conversion, and polymerization stops with M3 left. Checks: the last of M1, M2 falls below
// ExhaustedFraction just before Stop (its fraction falls linearly to 0 there); F3 never exceeds ½ (no two M3 in a row, by construction of the
// chain); and the balance: F̄ at the stop equals the mean of F (Simpson, 20001 points, 1e-8).
func TestDriftNoHomopolymer(t *testing.T) {
	r := [][]float64{{1, 0.5, 0.3}, {2, 1, 0.4}, {0, 0, 1}}
	m := mustNew(t, r, [][]float64{nil, nil, {1, 2, 0}})
	f0 := []float64{0.25, 0.25, 0.5}
	d, err := m.Drift(f0, []float64{0.1})
	if err != nil {
		t.Fatal(err)
	}
	if !(d.Stop < 1) || len(d.Exhausted) != 0 {
		t.Fatalf("Stop = %v, Exhausted by X = 0.1 = %+v; want a stop below 1 and none yet", d.Stop, d.Exhausted)
	}
	const pts = 20001
	xs := make([]float64, pts)
	for k := range xs {
		xs[k] = d.Stop * float64(k) / (pts - 1)
	}
	d, err = m.Drift(f0, xs)
	if err != nil {
		t.Fatal(err)
	}
	// Both run out (their share below 1e-6), the last just before the stop.
	if len(d.Exhausted) != 2 || d.Exhausted[1].Conversion > d.Stop || d.Stop-d.Exhausted[1].Conversion > 1e-5 {
		t.Errorf("Exhausted = %+v, want M1 and M2, the last just before Stop = %v", d.Exhausted, d.Stop)
	}
	h := d.Stop / (pts - 1)
	for i := range 3 {
		sum := d.Inst[0][i] + d.Inst[pts-1][i]
		for k := 1; k < pts-1; k++ {
			if d.Inst[k][2] > 0.5+1e-12 {
				t.Fatalf("X = %g: F3 = %v > ½", xs[k], d.Inst[k][2])
			}
			w := 2.0
			if k%2 == 1 {
				w = 4
			}
			sum += w * d.Inst[k][i]
		}
		mean := sum * h / 3 / d.Stop
		if got := d.Cum[pts-1][i]; math.Abs(got-mean) > 1e-8 {
			t.Errorf("F̄[%d] at the stop = %.10g by the balance, %.10g as the mean of F", i, got, mean)
		}
	}
}

// TestDriftLimit checks X = 1 for three monomers of which vinyl acetate is by far the least
// reactive (methyl methacrylate / vinyl acetate / acrylonitrile, copoly.Pairs: MMA/VAc 26/0.03,
// MMA/AN 1.322/0.138, AN/VAc 4.05/0.04): the last unreacted monomer is vinyl acetate, so the
// limit of f and of F is (0, 1, 0), and F̄ is the starting feed.
func TestDriftLimit(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 26, 1.322}, {0.03, 1, 0.04}, {0.138, 4.05, 1}}, nil)
	f0 := []float64{0.2, 0.5, 0.3}
	d, err := m.Drift(f0, []float64{0.99, 1})
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []float64{0, 1, 0} {
		if math.Abs(d.Feed[1][i]-want) > 1e-12 || math.Abs(d.Inst[1][i]-want) > 1e-12 || d.Cum[1][i] != f0[i] {
			t.Fatalf("X = 1: f = %v, F = %v, F̄ = %v; want f = F = (0, 1, 0), F̄ = f0", d.Feed[1], d.Inst[1], d.Cum[1])
		}
	}
}
