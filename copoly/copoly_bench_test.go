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
		sinkX, _ = m.ConversionLimit(0.3, 0.02)
	}
}

// BenchmarkCompositionDistribution bins the product of a batch to X = 0.95 into 20 bins.
func BenchmarkCompositionDistribution(b *testing.B) {
	m := Terminal{0.40, 0.04}
	b.ReportAllocs()
	for b.Loop() {
		sinkH, _ = m.CompositionDistribution(0.3, 0.95, 20, 104.152, 53.064)
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
			sinkS, _ = m.BatchSequence(0.3, 0.95)
		}
	})
}

var sinkE *Estimates

// BenchmarkEstimate runs every estimation method with a 95 % region on 20 simulated runs (5 feeds
// × 4 conversions), without and with uncertainties (the latter adds error-in-variables).
func BenchmarkEstimate(b *testing.B) {
	runs := simulatedRuns(Terminal{0.52, 0.46}, 0.01, 21)
	b.Run("20-runs", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkE, _ = Estimate(runs, 0.95)
		}
	})
	weighted := append([]Run(nil), runs...)
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

var sinkP *Plan
var sinkB Band

// BenchmarkPlan makes a semi-batch plan of 200 steps and its 500-sample uncertainty band over a
// small region around the ratios.
func BenchmarkPlan(b *testing.B) {
	in := PlanInput{Model: Terminal{0.80, 0.15}, TargetF1: 0.5, MolarMass1: 104.152, MolarMass2: 128.171,
		PolymerMass: 1000, Mode: PlanSemibatch, RateConstant: 0.01}
	region := [][2]float64{{0.75, 0.13}, {0.85, 0.13}, {0.85, 0.17}, {0.75, 0.17}}
	b.Run("semibatch-200-steps", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkP, _ = MakePlan(in)
		}
	})
	p, _ := MakePlan(in)
	b.Run("band-500-samples", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkB, _ = PlanBand(in, p, region, 500, 1)
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

// BenchmarkRecompute is everything the page computes after one edit of a project with 20 bench
// runs: the composition curve (101 feeds), the drift to X = 0.95 (101 conversions) with its
// conversion limit and composition distribution, the sequence statistics at the feed and over
// the batch, 12 sample chains of 60 units, every estimation method with a 95 % JCR, the next
// runs, a 200-step semi-batch plan with its 500-sample band over that JCR, and 10⁴ simulated
// chains of DPn 100. The page's own work (drawing) is not included; wasm/BenchmarkRecompute
// adds the bridge's conversions.
func BenchmarkRecompute(b *testing.B) {
	runs := simulatedRuns(Terminal{0.52, 0.46}, 0.01, 21)
	feeds, xs := grid(101, 1), grid(101, 0.95)
	dst := make([]float64, len(feeds))
	b.Run("edit-20-runs", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			est, err := Estimate(runs, 0.95)
			if err != nil || est.Nonlinear == nil {
				b.Fatalf("Estimate: %v", err)
			}
			m := Terminal{est.Nonlinear.R1, est.Nonlinear.R2}
			const f10 = 0.3
			if _, err := m.InstantaneousTo(dst, feeds); err != nil {
				b.Fatal(err)
			}
			if _, err := m.Drift(f10, xs); err != nil {
				b.Fatal(err)
			}
			if _, err := m.ConversionLimit(f10, 0.02); err != nil {
				b.Fatal(err)
			}
			if _, err := m.CompositionDistribution(f10, 0.95, 20, 100.12, 86.09); err != nil {
				b.Fatal(err)
			}
			if _, err := m.Sequence(f10); err != nil {
				b.Fatal(err)
			}
			if _, err := m.BatchSequence(f10, 0.95); err != nil {
				b.Fatal(err)
			}
			if _, err := m.Chains(f10, 12, 60, 1); err != nil {
				b.Fatal(err)
			}
			if _, err := NextRuns(m.R1, m.R2, runs, nil); err != nil {
				b.Fatal(err)
			}
			in := PlanInput{Model: m, TargetF1: 0.5, MolarMass1: 100.12, MolarMass2: 86.09,
				PolymerMass: 1000, Mode: PlanSemibatch, RateConstant: 0.01}
			p, err := MakePlan(in)
			if err != nil {
				b.Fatal(err)
			}
			if _, err := PlanBand(in, p, est.Nonlinear.Region.Boundary, 500, 1); err != nil {
				b.Fatal(err)
			}
			sinkC, err = SimulateChains(ChainOptions{Model: m, F10: f10, DPn: 100, Count: 10000, Seed: 1})
			if err != nil {
				b.Fatal(err)
			}
		}
	})
}
