package xoshiro

import (
	"math"
	"testing"
)

// TestUint32Halves checks that Uint32 gives the low and then the high half of each output, the
// same numbers Below32 compares.
func TestUint32Halves(t *testing.T) {
	a, b := New(7), New(7)
	for range 100 {
		v := b.Uint64()
		if lo := a.Uint32(); lo != uint32(v) {
			t.Fatalf("Uint32 = %d, want the low half %d", lo, uint32(v))
		}
		if hi := a.Uint32(); hi != uint32(v>>32) {
			t.Fatalf("Uint32 = %d, want the high half %d", hi, uint32(v>>32))
		}
	}
}

// TestUint32Cumulative draws 10⁶ three-way choices by cumulative thresholds and checks each
// frequency within 5 binomial standard deviations (common practice, no source).
func TestUint32Cumulative(t *testing.T) {
	const n = 1_000_000
	p := []float64{0.2, 0.5, 0.3}
	cum := []uint64{Threshold32(0.2), Threshold32(0.7), 1 << 32}
	x := New(3)
	var k [3]int
	for range n {
		u := uint64(x.Uint32())
		j := 0
		for u >= cum[j] {
			j++
		}
		k[j]++
	}
	for j, pj := range p {
		freq := float64(k[j]) / n
		if sd := math.Sqrt(pj * (1 - pj) / n); math.Abs(freq-pj) > 5*sd {
			t.Errorf("outcome %d: frequency %v, want %v within 5σ (σ = %.2g)", j, freq, pj, sd)
		}
	}
}
