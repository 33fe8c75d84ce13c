package copoly

import "testing"

var (
	sinkF []float64
	sinkD *Drift
	sinkS Sequence
	sinkX float64
	sinkH Histogram
)

func grid(n int, top float64) []float64 {
	xs := make([]float64, n)
	for i := range xs {
		xs[i] = top * float64(i) / float64(n-1)
	}
	return xs
}

// BenchmarkComposition evaluates the composition curve the page draws (101 feeds).
func BenchmarkComposition(b *testing.B) {
	m, f := Terminal{0.40, 0.04}, grid(101, 1)
	dst := make([]float64, len(f))
	b.ReportAllocs()
	for b.Loop() {
		sinkF, _ = m.InstantaneousTo(dst, f)
	}
}

// BenchmarkDrift evaluates the drift curve the page draws (101 conversions to 0.95) by each method.
func BenchmarkDrift(b *testing.B) {
	xs := grid(101, 0.95)
	for _, c := range []struct {
		name string
		m    Terminal
	}{{"meyer-lowry", Terminal{0.40, 0.04}}, {"skeist-ode", Terminal{1, 0.5}}} {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkD, _ = c.m.Drift(0.3, xs)
			}
		})
	}
}

// BenchmarkConversionLimit finds the conversion limit for a ±0.02 band.
func BenchmarkConversionLimit(b *testing.B) {
	m := Terminal{0.40, 0.04}
	b.ReportAllocs()
	for b.Loop() {
		bt, _ := NewBatch(m, 0.3)
		sinkX, _ = bt.ConversionLimit(0.02)
	}
}

// BenchmarkCompositionDistribution bins the product of a batch to X = 0.95 into 20 bins.
func BenchmarkCompositionDistribution(b *testing.B) {
	m := Terminal{0.40, 0.04}
	b.ReportAllocs()
	for b.Loop() {
		bt, _ := NewBatch(m, 0.3)
		sinkH, _ = bt.Distribution(0.95, 20, 104.152, 53.064)
	}
}

// BenchmarkSequence computes the statistics at one feed, the run-length table and the batch
// average, as the page does.
func BenchmarkSequence(b *testing.B) {
	m := Terminal{0.40, 0.04}
	b.Run("feed", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkS, _ = m.Sequence(0.3)
		}
	})
	b.Run("batch", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			bt, _ := NewBatch(m, 0.3)
			sinkS, _ = bt.Sequence(0.95)
		}
	})
}

var sinkC *ChainStats

// BenchmarkChains grows 10⁶ units by Monte Carlo: 10⁴ chains of 100 units at a constant feed,
// and 10⁴ chains of a most-probable distribution with DPn 100 over a batch drifting to X = 0.8.
func BenchmarkChains(b *testing.B) {
	m := Terminal{0.80, 0.15}
	b.Run("1e6-units", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkC, _ = SimulateChains(ChainOptions{Model: m, F10: 0.5, Length: 100, Count: 10000, Seed: 1, Functional: 2})
		}
	})
	b.Run("1e6-units-drift", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkC, _ = SimulateChains(ChainOptions{Model: m, F10: 0.5, Conversion: 0.8, DPn: 100, Count: 10000, Seed: 1, Functional: 2})
		}
	})
}
