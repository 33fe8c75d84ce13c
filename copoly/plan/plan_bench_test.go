package plan

import (
	"copoly/copoly"
	"testing"
)

var sinkP *Recipe

var sinkB Band

// BenchmarkPlan makes a semi-batch plan of 200 steps and its 500-sample uncertainty band over a
// small region around the ratios.
func BenchmarkPlan(b *testing.B) {
	in := Input{Model: copoly.Terminal{R1: 0.80, R2: 0.15}, TargetF1: 0.5, MolarMass1: 104.152, MolarMass2: 128.171,
		PolymerMass: 1000, Mode: ModeSemibatch, RateConstant: 0.01}
	region := [][2]float64{{0.75, 0.13}, {0.85, 0.13}, {0.85, 0.17}, {0.75, 0.17}}
	b.Run("semibatch-200-steps", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkP, _ = Make(in)
		}
	})
	p, _ := Make(in)
	b.Run("band-500-samples", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkB, _ = BandOf(in, p, region, 500, 1)
		}
	})
}
