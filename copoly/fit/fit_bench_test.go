package fit

import (
	"testing"

	"copoly/copoly"
	"copoly/copoly/plan"
)

var sinkE *Estimates

// BenchmarkEstimate runs every estimation method with a 95 % region on 20 simulated runs (5 feeds
// × 4 conversions), without and with uncertainties (the latter adds error-in-variables).
func BenchmarkEstimate(b *testing.B) {
	runs := simulatedRuns(copoly.Terminal{R1: 0.52, R2: 0.46}, 0.01, 21)
	b.Run("20-runs", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkE, _ = Estimate(runs, 0.95)
		}
	})
	weighted := append([]copoly.Run(nil), runs...)
	for i := range weighted {
		weighted[i].SF, weighted[i].SX, weighted[i].Sf = 0.01, 0.005, 0.002
	}
	b.Run("20-runs-evm", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkE, _ = Estimate(weighted, 0.95)
		}
	})
}

// copolyGrid returns n values evenly spaced from 0 to top, as the page's curves take them.
func copolyGrid(n int, top float64) []float64 {
	xs := make([]float64, n)
	for i := range xs {
		xs[i] = top * float64(i) / float64(n-1)
	}
	return xs
}

// BenchmarkRecompute is everything the page computes after one edit of a project with 20 bench
// runs: the composition curve (101 feeds), the drift to X = 0.95 (101 conversions) with its
// conversion limit and composition distribution, the sequence statistics at the feed and over
// the batch, 12 sample chains of 60 units, every estimation method with a 95 % JCR, the next
// runs, a 200-step semi-batch plan with its 500-sample band over that JCR, and 10⁴ simulated
// chains of DPn 100. The page's own work (drawing) is not included; wasm/BenchmarkRecompute
// adds the bridge's conversions.
func BenchmarkRecompute(b *testing.B) {
	runs := simulatedRuns(copoly.Terminal{R1: 0.52, R2: 0.46}, 0.01, 21)
	feeds, xs := copolyGrid(101, 1), copolyGrid(101, 0.95)
	b.Run("edit-20-runs", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			est, err := Estimate(runs, 0.95)
			if err != nil || est.Nonlinear == nil {
				b.Fatalf("Estimate: %v", err)
			}
			m := copoly.Terminal{R1: est.Nonlinear.R1, R2: est.Nonlinear.R2}
			const f10 = 0.3
			if _, err := copoly.CompositionOf(m, feeds); err != nil {
				b.Fatal(err)
			}
			mm1, mm2 := 100.12, 86.09
			if _, err := copoly.ProfileOf(copoly.ProfileInput{Model: m, F10: f10, Conversion: xs,
				MolarMass1: &mm1, MolarMass2: &mm2, Tolerance: 0.02, Bins: 20}); err != nil {
				b.Fatal(err)
			}
			if _, err := copoly.MicrostructureOf(copoly.MicrostructureInput{Model: m, F1: f10, MaxLength: 20, Batch: true, Conversion: 0.95}); err != nil {
				b.Fatal(err)
			}
			if _, err := m.Chains(f10, 12, 60, 1); err != nil {
				b.Fatal(err)
			}
			if _, err := NextRuns(m.R1, m.R2, runs, nil); err != nil {
				b.Fatal(err)
			}
			if _, err := plan.Make(plan.Input{Model: m, TargetF1: 0.5, MolarMass1: mm1, MolarMass2: mm2,
				PolymerMass: 1000, Mode: plan.ModeSemibatch, RateConstant: 0.01,
				Region: est.Nonlinear.Region.Boundary, Samples: 500, Seed: 1}); err != nil {
				b.Fatal(err)
			}
			if _, err := copoly.SimulateChains(copoly.ChainOptions{Model: m, F10: f10, DPn: 100, Count: 10000, Seed: 1, Bins: 30}); err != nil {
				b.Fatal(err)
			}
		}
	})
}
