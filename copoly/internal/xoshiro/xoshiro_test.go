package xoshiro

import (
	"math"
	"testing"
)

// TestXoshiroReference checks the generator against the first outputs of xoshiro256** from the
// state {1, 2, 3, 4}: 11520, 0, 1509978240, 1215971899390074240 (from memory; the first two
// follow by hand from the recurrence in Blackman and Vigna, ACM Trans. Math. Softw. 2021, 47, 36:
// rotl(2·5, 7)·9 = 11520, and s[1] becomes 0 after one step).
func TestXoshiroReference(t *testing.T) {
	x := &Source{s: [4]uint64{1, 2, 3, 4}}
	want := []uint64{11520, 0, 1509978240, 1215971899390074240}
	for i, w := range want {
		if got := x.Uint64(); got != w {
			t.Fatalf("output %d = %d, want %d", i, got, w)
		}
	}
}

// TestBelow32Frequencies draws 10⁶ events of each probability and checks the frequency lies
// within 5 binomial standard deviations (common practice, no source), and the exact ends 0 and 1.
func TestBelow32Frequencies(t *testing.T) {
	const n = 1_000_000
	for _, p := range []float64{0, 1e-3, 0.25, 0.5, 0.9, 1} {
		x := New(42)
		thr := Threshold32(p)
		k := 0
		for range n {
			if x.Below32(thr) {
				k++
			}
		}
		freq := float64(k) / n
		sd := math.Sqrt(p * (1 - p) / n)
		if p == 0 || p == 1 {
			if freq != p {
				t.Errorf("p = %v: frequency %v, want exactly %v", p, freq, p)
			}
			continue
		}
		if math.Abs(freq-p) > 5*sd {
			t.Errorf("p = %v: frequency %v, more than 5σ (σ = %.2g) away", p, freq, sd)
		}
	}
	if got := Threshold32(math.NaN()); got != 0 {
		t.Errorf("Threshold32(NaN) = %d, want 0", got)
	}
}
