package multi

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// TestConversionLimitBinary checks N = 2 against copoly.Batch.ConversionLimit (the binary
// batch's band on F̄1, bisected to 1e-10) to 1e-9.
func TestConversionLimitBinary(t *testing.T) {
	cases := []struct{ r1, r2, f10, tol float64 }{
		{0.40, 0.04, 0.3, 0.02}, // styrene/acrylonitrile (copoly.Pairs)
		{0.40, 0.04, 0.8, 0.05},
		{1.88, 0.43, 0.5, 0.01}, // methyl methacrylate/n-butyl acrylate (copoly.Pairs)
		{1, 0.5, 0.5, 0.03},
		{0.52, 0.46, 0.5294, 0.02}, // styrene/MMA near the azeotrope: never leaves the band
	}
	for _, c := range cases {
		bin, err := copoly.NewBatch(copoly.Terminal{R1: c.r1, R2: c.r2}, c.f10)
		if err != nil {
			t.Fatal(err)
		}
		want, err := bin.ConversionLimit(c.tol)
		if err != nil {
			t.Fatal(err)
		}
		got, err := mustNew(t, [][]float64{{1, c.r1}, {c.r2, 1}}, nil).ConversionLimit([]float64{c.f10, 1 - c.f10}, c.tol)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 0) {
			t.Errorf("r = %g, %g, f10 = %g, ±%g: ConversionLimit = %.12g, binary %.12g", c.r1, c.r2, c.f10, c.tol, got, want)
		}
	}
}

// TestConversionLimitBand checks on random three- and four-monomer batches that at the limit
// the largest |F̄_i − F_i(f0)| is the tolerance (to 1e-9) and that it stays below it before
// (sampled at 200 conversions): the definition of the limit.
func TestConversionLimitBand(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for range 30 {
		n := 3 + rng.IntN(2)
		r := randomRatios(rng, n)
		f0 := randomFeed(rng, n)
		m := mustNew(t, r, nil)
		const tol = 0.02
		x, err := m.ConversionLimit(f0, tol)
		if err != nil {
			t.Fatal(err)
		}
		start := mustComposition(t, m, f0)
		dev := func(d *Drift, k int) float64 {
			var w float64
			for i := range n {
				w = math.Max(w, math.Abs(d.Cum[k][i]-start[i]))
			}
			return w
		}
		if x < 1 {
			d, err := m.Drift(f0, []float64{x})
			if err != nil {
				t.Fatal(err)
			}
			if w := dev(d, 0); math.Abs(w-tol) > 1e-9 {
				t.Errorf("r = %v, f0 = %v: at the limit X = %.10g the largest deviation is %.12g, want %g", r, f0, x, w, tol)
			}
		}
		xs := make([]float64, 200)
		for k := range xs {
			xs[k] = x * float64(k) / 200
		}
		d, err := m.Drift(f0, xs)
		if err != nil {
			t.Fatal(err)
		}
		for k := range xs {
			if w := dev(d, k); w > tol+1e-12 {
				t.Errorf("r = %v, f0 = %v: at X = %g < limit %g the deviation is %g > %g", r, f0, xs[k], x, w, tol)
				break
			}
		}
	}
}

// TestCompositionDistributionBinary checks N = 2 against copoly.Batch.Distribution
// (same slices, same binning): the edges to 1e-12, and the weights to 1e-9 but for at most one
// slice moving across a bin edge (1/4000 of the polymer; the two drifts differ by ~1e-12).
func TestCompositionDistributionBinary(t *testing.T) {
	bin, err := copoly.NewBatch(copoly.Terminal{R1: 0.40, R2: 0.04}, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	m := mustNew(t, [][]float64{{1, 0.40}, {0.04, 1}}, nil)
	for _, masses := range [][2]float64{{0, 0}, {104.152, 53.064}} {
		want, err := bin.Distribution(0.95, 20, masses[0], masses[1])
		if err != nil {
			t.Fatal(err)
		}
		var mm []float64
		if masses[0] != 0 {
			mm = masses[:]
		}
		got, err := m.CompositionDistribution([]float64{0.3, 0.7}, 0.95, 0, 20, mm)
		if err != nil {
			t.Fatal(err)
		}
		if got.Basis != want.Basis {
			t.Errorf("basis %q, binary %q", got.Basis, want.Basis)
		}
		for i := range want.Edges {
			if !scalar.EqualWithinAbsOrRel(got.Edges[i], want.Edges[i], 1e-12, 1e-12) {
				t.Errorf("%s: edge %d = %.15g, binary %.15g", got.Basis, i, got.Edges[i], want.Edges[i])
			}
		}
		for i := range want.Weights {
			if d := math.Abs(got.Weights[i] - want.Weights[i]); d > 1e-9 && d > 1.0/3000 {
				t.Errorf("%s: weight %d = %.12g, binary %.12g", got.Basis, i, got.Weights[i], want.Weights[i])
			}
		}
	}
}

// TestDistributionErrors checks the validation of the distribution's inputs.
func TestDistributionErrors(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}}, nil)
	f0 := []float64{0.2, 0.3, 0.5}
	tests := []struct {
		name  string
		call  func() error
		field string
		err   error
	}{
		{"zero conversion", func() error { _, err := m.CompositionDistribution(f0, 0, 0, 10, nil); return err }, "conversion", copoly.ErrOutOfRange},
		{"monomer", func() error { _, err := m.CompositionDistribution(f0, 0.5, 3, 10, nil); return err }, "monomer", copoly.ErrOutOfRange},
		{"bins", func() error { _, err := m.CompositionDistribution(f0, 0.5, 0, 0, nil); return err }, "bins", copoly.ErrOutOfRange},
		{"molar masses", func() error { _, err := m.CompositionDistribution(f0, 0.5, 0, 10, []float64{100, 50}); return err }, "molarMass", copoly.ErrOutOfRange},
		{"molar mass", func() error { _, err := m.CompositionDistribution(f0, 0.5, 0, 10, []float64{100, -50, 60}); return err }, "molarMass[1]", copoly.ErrOutOfRange},
		{"tolerance", func() error { _, err := m.ConversionLimit(f0, 0); return err }, "tolerance", copoly.ErrOutOfRange},
		{"tolerance NaN", func() error { _, err := m.ConversionLimit(f0, math.NaN()); return err }, "tolerance", copoly.ErrNotFinite},
		{"past the stop", func() error {
			_, err := mustNew(t, [][]float64{{1, 2}, {0, 1}}, nil).CompositionDistribution([]float64{0.5, 0.5}, 0.9, 0, 10, nil)
			return err
		}, "conversion", copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		err := tt.call()
		if copoly.Field(err) != tt.field || !errors.Is(err, tt.err) {
			t.Errorf("%s: %v, want field %q wrapping %v", tt.name, err, tt.field, tt.err)
		}
	}
}
