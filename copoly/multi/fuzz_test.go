package multi

import (
	"math"
	"math/rand/v2"
	"testing"

	"copoly/copoly"
)

// special are the values the decoders below draw from: the edges of every range checked, tiny
// and huge numbers, and non-numbers.
var special = []float64{0, 1, 0.5, 2, 1e-3, 1e-4, 1e-12, 1e-300, 5e-324, copoly.MaxRatio, copoly.MaxRatio + 1,
	math.NaN(), math.Inf(1), math.Inf(-1), -1, -0.0, 0.999999999, 1.000000001, 0.25, 0.75, 3, 50}

// decoder turns fuzz bytes into inputs.
type decoder struct {
	b []byte
	k int
}

func (d *decoder) byte() byte {
	if d.k >= len(d.b) {
		return 0
	}
	d.k++
	return d.b[d.k-1]
}

func (d *decoder) float() float64 {
	c := d.byte()
	if int(c) < len(special) {
		return special[c]
	}
	return float64(c) / 64 // 0.34 … 3.98
}

// matrix returns an n×n matrix with r_ii = 1 most of the time.
func (d *decoder) matrix(n int) [][]float64 {
	r := make([][]float64, n)
	for i := range r {
		r[i] = make([]float64, n)
		for j := range r[i] {
			if i == j && d.byte()%8 != 0 {
				r[i][j] = 1
				continue
			}
			r[i][j] = d.float()
		}
	}
	return r
}

// feed returns n fractions, normalized most of the time.
func (d *decoder) feed(n int) []float64 {
	f := make([]float64, n)
	var s float64
	for i := range f {
		f[i] = d.float()
		s += f[i]
	}
	if d.byte()%4 != 0 && s > 0 && !math.IsInf(s, 0) {
		for i := range f {
			f[i] /= s
		}
	}
	return f
}

// exercise runs every entry point on the decoded inputs. None may panic; every valid result
// must be finite where the documentation says so.
func exercise(t *testing.T, data []byte) {
	d := &decoder{b: data}
	n := 1 + int(d.byte()%7)
	r := d.matrix(n)
	var cross [][]float64
	if d.byte()%3 == 0 {
		cross = make([][]float64, n)
		for i := range cross {
			if d.byte()%2 == 0 {
				cross[i] = d.feed(n)
			}
		}
	}
	m, err := New(r, cross)
	if err != nil {
		if copoly.Field(err) == "" {
			t.Fatalf("New(%v, %v): error %v names no field", r, cross, err)
		}
		return
	}
	f := d.feed(n)
	F, err := m.Composition(nil, f)
	if err == nil {
		checkComposition(t, "Composition", f, F)
	} else if copoly.Field(err) == "" {
		t.Fatalf("Composition(%v): %v names no field", f, err)
	}
	if _, err := m.Sequence(f); err != nil && copoly.Field(err) == "" {
		t.Fatalf("Sequence: %v names no field", err)
	}
	target := d.feed(n)
	if g, err := m.FeedFor(target); err == nil {
		G, _ := m.Composition(nil, g)
		for i := range G {
			if math.Abs(G[i]-target[i]/sumOf(target)) > FeedTolerance {
				t.Fatalf("r = %v: FeedFor(%v) = %v gives %v", r, target, g, G)
			}
		}
	}
	x := d.float()
	dr, err := m.Drift(f, []float64{0, x / 2, x})
	if err == nil {
		for k := range dr.Conversion {
			checkComposition(t, "Drift f", f, dr.Feed[k])
			checkComposition(t, "Drift F̄", f, dr.Cum[k])
		}
	}
	if _, err := m.ConversionLimit(f, d.float()); err != nil && copoly.Field(err) == "" && err != ErrNoConvergence {
		t.Fatalf("ConversionLimit: %v", err)
	}
	fun := []int{int(d.byte() % 8), int(d.byte() % 8)}
	if _, err := m.SimulateChains(ChainOptions{F0: f, Conversion: x, DPn: 1 + 100*d.float(), Count: 1 + int(d.byte()), Seed: 1, Functional: fun}); err != nil && copoly.Field(err) == "" && err != ErrNoConvergence {
		t.Fatalf("SimulateChains: %v", err)
	}
}

// checkComposition fails unless F is N finite fractions summing to 1, or all NaN (no polymer).
func checkComposition(t *testing.T, what string, f, F []float64) {
	t.Helper()
	nan := 0
	var s float64
	for _, v := range F {
		if math.IsNaN(v) {
			nan++
			continue
		}
		if v < 0 || v > 1 || math.IsInf(v, 0) {
			t.Fatalf("%s(%v) = %v: a value outside [0, 1]", what, f, F)
		}
		s += v
	}
	if nan == len(F) {
		return
	}
	if nan > 0 || math.Abs(s-1) > 1e-9 {
		t.Fatalf("%s(%v) = %v: sums to %v", what, f, F, s)
	}
}

// FuzzModel feeds decoded matrices, cross ratios, feeds and options to every entry point (see
// exercise): none may panic, every error names a field, every result is finite fractions.
func FuzzModel(f *testing.F) {
	f.Add([]byte{2, 0, 1, 1, 0, 1, 2, 3})
	f.Add([]byte{3, 1, 8, 1, 1, 0, 0, 0, 1, 4, 5, 1, 2, 3, 22, 3, 9})
	f.Add([]byte{5, 1, 7, 8, 9, 200, 1, 3, 4, 250, 1, 1, 2, 9, 1, 3, 2, 8, 1, 2})
	f.Add([]byte{6, 1, 0, 0, 0, 0, 0, 1, 9, 9, 9, 9, 9, 1, 100, 100, 100, 100, 100})
	f.Add([]byte{3, 1, 3, 3, 3, 1, 3, 0, 0, 1, 0, 0, 2, 0, 1, 2, 1, 1, 7})
	f.Fuzz(func(t *testing.T, data []byte) { exercise(t, data) })
}

// TestValidationProperty runs 4000 seeded random byte strings through exercise (a property
// test: no input panics, every error names its field), so the check runs without -fuzz. Half
// draw a special value for one byte in 3, half for one in 15 (more inputs get past validation
// to the computations).
func TestValidationProperty(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	for k := range 4000 {
		odds := 3
		if k%2 == 1 {
			odds = 15
		}
		b := make([]byte, 80)
		for i := range b {
			if rng.IntN(odds) == 0 {
				b[i] = byte(rng.IntN(len(special)))
			} else {
				b[i] = byte(rng.IntN(256))
			}
		}
		b[0] = byte(1 + rng.IntN(6))
		exercise(t, b)
	}
}
