package multi

import (
	"math/rand/v2"
	"testing"
)

var (
	sinkRows  [][]float64
	sinkFlat  []float64
	sinkDrift *Drift
	sinkStats *ChainStats
	sinkAz    []Azeotrope
)

// benchRatios6 is a six-monomer matrix of the built-in pairs where there are some (styrene,
// methyl methacrylate, acrylonitrile, n-butyl acrylate) and values of the same span elsewhere:
// inputs for timing only.
var benchRatios6 = [][]float64{
	{1, 0.52, 0.40, 0.80, 0.75, 0.35},
	{0.46, 1, 1.322, 1.88, 2.0, 1.1},
	{0.04, 0.138, 1, 1.52, 1.2, 0.9},
	{0.15, 0.43, 0.75, 1, 0.9, 0.6},
	{0.18, 0.4, 0.8, 1.1, 1, 0.7},
	{0.25, 0.9, 1.1, 1.4, 1.3, 1},
}

// benchRatios4 is styrene, methyl methacrylate, acrylonitrile and n-butyl acrylate
// (copoly.Pairs).
var benchRatios4 = [][]float64{
	{1, 0.52, 0.40, 0.80},
	{0.46, 1, 1.322, 1.88},
	{0.04, 0.138, 1, 1.52},
	{0.15, 0.43, 0.75, 1},
}

// BenchmarkMultiComposition computes the composition of 10⁴ random feeds of six monomers: the
// export multiComposition as the bridge calls it (model, validation, result rows), and the
// batch form into a reused slice.
func BenchmarkMultiComposition(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 1))
	feeds := make([][]float64, 10000)
	for k := range feeds {
		feeds[k] = randomFeed(rng, 6)
	}
	b.Run("10000-feeds-6-monomers", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkRows, _ = Compositions(benchRatios6, nil, feeds)
		}
	})
	m, _ := New(benchRatios6, nil)
	dst := make([]float64, 6*len(feeds))
	b.Run("10000-feeds-6-monomers-into", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkFlat, _ = m.CompositionsTo(dst, feeds)
		}
	})
}

// BenchmarkMultiDrift follows a batch of four monomers to X = 0.99 with 200 output points (the
// export multiDrift), and the same batch to X = 1 (the limit).
func BenchmarkMultiDrift(b *testing.B) {
	xs := make([]float64, 200)
	for k := range xs {
		xs[k] = 0.99 * float64(k) / 199
	}
	f0 := []float64{0.25, 0.25, 0.25, 0.25}
	b.Run("4-monomers-200-points", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkDrift, _ = BatchDrift(benchRatios4, nil, f0, xs)
		}
	})
	b.Run("4-monomers-to-the-limit", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkDrift, _ = BatchDrift(benchRatios4, nil, f0, []float64{0.5, 1})
		}
	})
}

// BenchmarkMultiChains grows 10⁶ units of four monomers by Monte Carlo, 10⁴ chains of DPn 100,
// counting one functional monomer: at a constant feed (the export multiChains' budget), and
// over a batch drifting to X = 0.8.
func BenchmarkMultiChains(b *testing.B) {
	m, _ := New(benchRatios4, nil)
	f0 := []float64{0.3, 0.3, 0.3, 0.1}
	b.Run("1e6-units", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkStats, _ = m.SimulateChains(ChainOptions{F0: f0, DPn: 100, Count: 10000, Seed: 1, Functional: []int{3}})
		}
	})
	b.Run("1e6-units-drift", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkStats, _ = m.SimulateChains(ChainOptions{F0: f0, Conversion: 0.8, DPn: 100, Count: 10000, Seed: 1, Functional: []int{3}})
		}
	})
}

// BenchmarkMultiAzeotropes searches the six-monomer model and its faces for azeotropes.
func BenchmarkMultiAzeotropes(b *testing.B) {
	m, _ := New(benchRatios6, nil)
	b.ReportAllocs()
	for b.Loop() {
		sinkAz, _ = m.Azeotropes()
	}
}

// BenchmarkMultiFeedFor finds the feed for a four-monomer target.
func BenchmarkMultiFeedFor(b *testing.B) {
	m, _ := New(benchRatios4, nil)
	b.ReportAllocs()
	for b.Loop() {
		sinkFlat, _ = m.FeedFor([]float64{0.4, 0.3, 0.2, 0.1})
	}
}
