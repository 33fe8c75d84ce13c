package multi

import (
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

func mustChains(t testing.TB, m *Model, opt ChainOptions) *ChainStats {
	t.Helper()
	st, err := m.SimulateChains(opt)
	if err != nil {
		t.Fatalf("SimulateChains(%+v): %v", opt, err)
	}
	return st
}

// TestChainsBernoullian checks chains with every ratio 1 (a Bernoullian chain: each unit is
// drawn independently with the feed's mole fractions) and no drift against the closed forms
// for most-probable lengths, P(n) = (1 − q) q^(n−1), q = 1 − 1/DPn, and a functional fraction
// φ (here monomers 1 and 3 of four, φ = f1 + f3):
//
//	chains without a functional unit, by number:
//	  Σ_n (1 − q) q^(n−1) (1 − φ)^n = (1 − q)(1 − φ) Σ_{m≥0} (q(1 − φ))^m
//	                                = (1 − q)(1 − φ) / (1 − q(1 − φ))
//	by weight (each chain weighted by n, divided by the mean length 1/(1 − q)), with
//	Σ_n n y^(n−1) = 1/(1 − y)², y = q(1 − φ):
//	  (1 − q)² (1 − φ) / (1 − q(1 − φ))²
//
// The analytic expectations of the package must equal them to 1e-12, and the simulated
// fractions of 10⁵ chains must lie within 5σ: σ² = p(1 − p)/count by number (independent
// chains), and by weight the ratio estimator's σ² = E[n²(I − W)²]/(count E[n]²) with
// E[n² I] = (1 − q)(1 − φ)(1 + y)/(1 − y)³ and E[n²] = (1 + q)/(1 − q)² (the second moment of
// the geometric series, Σ n² y^(n−1) = (1 + y)/(1 − y)³). 5σ is common practice, no source.
func TestChainsBernoullian(t *testing.T) {
	ones := [][]float64{{1, 1, 1, 1}, {1, 1, 1, 1}, {1, 1, 1, 1}, {1, 1, 1, 1}}
	f := []float64{0.05, 0.5, 0.1, 0.35}
	const dpn, count = 20.0, 100_000
	m := mustNew(t, ones, nil)
	st := mustChains(t, m, ChainOptions{F0: f, DPn: dpn, Count: count, Seed: 1, Functional: []int{0, 2}})
	q := 1 - 1/dpn
	phi := f[0] + f[2]
	y := q * (1 - phi)
	n0 := (1 - q) * (1 - phi) / (1 - y)
	w0 := (1 - q) * (1 - q) * (1 - phi) / ((1 - y) * (1 - y))
	if !scalar.EqualWithinAbsOrRel(st.ExpectedNoneNumber, n0, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(st.ExpectedNoneWeight, w0, 1e-12, 1e-12) {
		t.Errorf("expected none: number %.15g, weight %.15g; closed forms %.15g, %.15g", st.ExpectedNoneNumber, st.ExpectedNoneWeight, n0, w0)
	}
	sdN := math.Sqrt(n0 * (1 - n0) / count)
	if math.Abs(st.NoneNumber-n0) > 5*sdN {
		t.Errorf("chains without a functional unit: %.5f of %d, closed form %.5f (5σ = %.2g)", st.NoneNumber, count, n0, 5*sdN)
	}
	en := 1 / (1 - q)
	en2I := (1 - q) * (1 - phi) * (1 + y) / math.Pow(1-y, 3)
	en2 := (1 + q) / ((1 - q) * (1 - q))
	sdW := math.Sqrt((en2I*(1-2*w0) + w0*w0*en2) / (count * en * en))
	if math.Abs(st.NoneWeight-w0) > 5*sdW {
		t.Errorf("weight fraction without a functional unit: %.5f, closed form %.5f (5σ = %.2g)", st.NoneWeight, w0, 5*sdW)
	}
	var sum int
	for _, c := range st.FunctionalCounts {
		sum += c
	}
	if sum != count || float64(st.FunctionalCounts[0])/count != st.NoneNumber {
		t.Errorf("FunctionalCounts %v do not add up to %d chains", st.FunctionalCounts, count)
	}
	t.Logf("none: %.5f (closed form %.5f, σ %.1g), by weight %.5f (%.5f, σ %.1g)", st.NoneNumber, n0, sdN, st.NoneWeight, w0, sdW)
}

// TestChainsExpectations checks the package's matrix expressions for the fractions of chains
// with none and one functional unit against a brute-force sum over chain lengths of the
// probabilities propagated unit by unit (state: last unit and functional units so far, 0 or 1),
// on random four-monomer chains, to 1e-12.
func TestChainsExpectations(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for range 20 {
		n := 4
		m := mustNew(t, randomRatios(rng, n), nil)
		f := randomFeed(rng, n)
		dpn := 2 + 30*rng.Float64()
		fun := []int{rng.IntN(n)}
		if rng.IntN(2) == 0 {
			fun = append(fun, (fun[0]+1)%n)
		}
		var isF [MaxMonomers]bool
		for _, i := range fun {
			isF[i] = true
		}
		q, _ := m.Sequence(f)
		st := mustChains(t, m, ChainOptions{F0: f, DPn: dpn, Count: 1, Seed: 1, Functional: fun})
		p := 1 - 1/dpn
		var v0, v1 [MaxMonomers]float64
		for i := range n {
			if isF[i] {
				v1[i] = q.F[i]
			} else {
				v0[i] = q.F[i]
			}
		}
		var n0, n1, w0, w1 float64
		weight := 1 - p // P(n) for n = 1
		for length := 1; length < 20000 && weight > 1e-300; length++ {
			var s0, s1 float64
			for i := range n {
				s0 += v0[i]
				s1 += v1[i]
			}
			n0 += weight * s0
			n1 += weight * s1
			w0 += weight * float64(length) * s0 * (1 - p)
			w1 += weight * float64(length) * s1 * (1 - p)
			var u0, u1 [MaxMonomers]float64
			for i := range n {
				for j := range n {
					if isF[j] {
						u1[j] += v0[i] * q.P[i][j]
					} else {
						u0[j] += v0[i] * q.P[i][j]
						u1[j] += v1[i] * q.P[i][j]
					}
				}
			}
			v0, v1 = u0, u1
			weight *= p
		}
		for _, c := range []struct {
			what      string
			got, want float64
		}{{"none by number", st.ExpectedNoneNumber, n0}, {"one by number", st.ExpectedOneNumber, n1},
			{"none by weight", st.ExpectedNoneWeight, w0}, {"one by weight", st.ExpectedOneWeight, w1}} {
			if !scalar.EqualWithinAbsOrRel(c.got, c.want, 1e-12, 1e-10) {
				t.Errorf("r = %v, f = %v, dpn = %g, functional %v: %s = %.15g, by brute force %.15g", m.Ratios(), f, dpn, fun, c.what, c.got, c.want)
			}
		}
	}
}

// TestChainsAgainstExpectations simulates a drifting four-monomer batch (the built-in styrene,
// methyl methacrylate, acrylonitrile and n-butyl acrylate pairs, to X = 0.9) and checks the
// fractions of chains with none and with one functional unit against the model's expectation
// within 5σ (independent chains: σ² = p(1 − p)/count).
func TestChainsAgainstExpectations(t *testing.T) {
	r := [][]float64{{1, 0.52, 0.40, 0.80}, {0.46, 1, 1.322, 1.88}, {0.04, 0.138, 1, 1.52}, {0.15, 0.43, 0.75, 1}}
	const count = 50_000
	st := mustChains(t, mustNew(t, r, nil), ChainOptions{F0: []float64{0.3, 0.3, 0.3, 0.1}, Conversion: 0.9, DPn: 15, Count: count, Seed: 7, Functional: []int{3}})
	for _, c := range []struct {
		what      string
		got, want float64
	}{{"none", st.NoneNumber, st.ExpectedNoneNumber}, {"one", st.OneNumber, st.ExpectedOneNumber}} {
		sd := math.Sqrt(c.want * (1 - c.want) / count)
		if math.Abs(c.got-c.want) > 5*sd {
			t.Errorf("chains with %s functional unit: %.5f, expected %.5f (5σ = %.2g)", c.what, c.got, c.want, 5*sd)
		}
	}
}

// TestChainsDyads checks the dyads counted in simulated chains, and the fraction of isolated
// units counted in the sample chains, against the model ((1 − P_ii)², see Sequence), on a
// three-monomer chain at a constant feed. Neighbouring dyads are correlated, so σ is measured:
// 20 simulations with different seeds, σ of their mean = their standard deviation / √20; each
// quantity within 5σ of the model (common practice, no source).
func TestChainsDyads(t *testing.T) {
	r := [][]float64{{1, 0.52, 0.40}, {0.46, 1, 1.322}, {0.04, 0.138, 1}}
	f := []float64{0.3, 0.3, 0.4}
	m := mustNew(t, r, nil)
	q, _ := m.Sequence(f)
	const runs = 20
	var dy [runs][9]float64
	var iso [runs][3]float64
	for k := range runs {
		st := mustChains(t, m, ChainOptions{F0: f, DPn: 200, Count: 500, Seed: uint64(100 + k), Samples: 500, SampleUnits: 10000})
		for i := range 3 {
			for j := range 3 {
				dy[k][3*i+j] = st.Dyads[i][j]
			}
		}
		var alone, all [3]float64
		for _, s := range st.Samples {
			for p := 1; p+1 < len(s); p++ {
				i := s[p] - '1'
				all[i]++
				if s[p-1] != s[p] && s[p+1] != s[p] {
					alone[i]++
				}
			}
		}
		for i := range 3 {
			iso[k][i] = alone[i] / all[i]
		}
	}
	check := func(what string, vals []float64, want float64) {
		var mean, ss float64
		for _, v := range vals {
			mean += v / runs
		}
		for _, v := range vals {
			ss += (v - mean) * (v - mean)
		}
		sd := math.Sqrt(ss/(runs-1)) / math.Sqrt(runs)
		if math.Abs(mean-want) > 5*sd || sd == 0 {
			t.Errorf("%s: simulated %.6f ± %.2g, model %.6f", what, mean, sd, want)
		}
	}
	for i := range 3 {
		for j := range 3 {
			var v []float64
			for k := range runs {
				v = append(v, dy[k][3*i+j])
			}
			check("dyad M"+string(rune('1'+i))+"M"+string(rune('1'+j)), v, q.Dyads[i][j])
		}
		var v []float64
		for k := range runs {
			v = append(v, iso[k][i])
		}
		check("isolated M"+string(rune('1'+i)), v, q.Isolated[i])
	}
}

// TestChainsComposition checks the mean chain composition against F (no drift) within 5σ
// (σ = SD/√count, the chains being independent; every unit of a chain started from the
// stationary distribution has the marginal distribution F, so the mean is unbiased whatever
// the lengths), determinism of the seed, and the sample strings.
func TestChainsComposition(t *testing.T) {
	r := [][]float64{{1, 0.52, 0.40}, {0.46, 1, 1.322}, {0.04, 0.138, 1}}
	f := []float64{0.3, 0.3, 0.4}
	m := mustNew(t, r, nil)
	F := mustComposition(t, m, f)
	opt := ChainOptions{F0: f, DPn: 50, Count: 20000, Seed: 3, Samples: 5, SampleUnits: 30}
	st := mustChains(t, m, opt)
	for i := range 3 {
		if sd := st.SD[i] / math.Sqrt(20000); math.Abs(st.Mean[i]-F[i]) > 5*sd {
			t.Errorf("mean fraction of M%d in a chain %.5f, F = %.5f (σ %.2g)", i+1, st.Mean[i], F[i], sd)
		}
	}
	again := mustChains(t, m, opt)
	if !reflect.DeepEqual(st, again) {
		t.Error("the same seed gave different chains")
	}
	opt.Seed = 4
	if other := mustChains(t, m, opt); reflect.DeepEqual(st.Samples, other.Samples) {
		t.Error("seeds 3 and 4 gave the same sample chains")
	}
	if len(st.Samples) != 5 {
		t.Fatalf("%d samples, want 5", len(st.Samples))
	}
	for _, s := range st.Samples {
		if len(s) > 30 {
			t.Errorf("a sample of %d units, want at most 30", len(s))
		}
		for _, c := range s {
			if c < '1' || c > '3' {
				t.Errorf("sample %q has a unit %q", s, c)
			}
		}
	}
}

// TestChainsErrors checks that the limits are enforced before any work and every bad option
// names its field.
func TestChainsErrors(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}}, nil)
	f0 := []float64{0.2, 0.3, 0.5}
	tests := []struct {
		name  string
		opt   ChainOptions
		field string
		err   error
	}{
		{"feed", ChainOptions{F0: []float64{0.2, 0.3}, DPn: 10, Count: 10}, "f0", copoly.ErrOutOfRange},
		{"conversion", ChainOptions{F0: f0, Conversion: 1.2, DPn: 10, Count: 10}, "conversion", copoly.ErrOutOfRange},
		{"dpn zero", ChainOptions{F0: f0, Count: 10}, "dpn", copoly.ErrOutOfRange},
		{"dpn NaN", ChainOptions{F0: f0, DPn: math.NaN(), Count: 10}, "dpn", copoly.ErrNotFinite},
		{"dpn huge", ChainOptions{F0: f0, DPn: 2e5, Count: 10}, "dpn", copoly.ErrOutOfRange},
		{"count zero", ChainOptions{F0: f0, DPn: 10}, "count", copoly.ErrOutOfRange},
		{"count huge", ChainOptions{F0: f0, DPn: 10, Count: MaxChains + 1}, "count", copoly.ErrOutOfRange},
		{"too many units", ChainOptions{F0: f0, DPn: 1000, Count: 50_000}, "count", copoly.ErrTooMany},
		{"functional index", ChainOptions{F0: f0, DPn: 10, Count: 10, Functional: []int{0, 3}}, "functional[1]", copoly.ErrOutOfRange},
		{"functional twice", ChainOptions{F0: f0, DPn: 10, Count: 10, Functional: []int{2, 2}}, "functional[1]", copoly.ErrOutOfRange},
		{"functional list", ChainOptions{F0: f0, DPn: 10, Count: 10, Functional: []int{0, 1, 2, 0}}, "functional", copoly.ErrTooMany},
		{"samples", ChainOptions{F0: f0, DPn: 10, Count: 10, Samples: -1}, "samples", copoly.ErrOutOfRange},
		{"sample units", ChainOptions{F0: f0, DPn: 10, Count: 10, SampleUnits: MaxSampleUnits + 1}, "sampleUnits", copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		_, err := m.SimulateChains(tt.opt)
		if copoly.Field(err) != tt.field || !errors.Is(err, tt.err) {
			t.Errorf("%s: %v, want field %q wrapping %v", tt.name, err, tt.field, tt.err)
		}
	}
	stops := mustNew(t, [][]float64{{1, 2}, {0, 1}}, nil)
	if _, err := stops.SimulateChains(ChainOptions{F0: []float64{0.5, 0.5}, Conversion: 0.9, DPn: 10, Count: 10}); copoly.Field(err) != "conversion" {
		t.Errorf("past the stop: %v, want an error naming conversion", err)
	}
	if _, err := stops.SimulateChains(ChainOptions{F0: []float64{0, 1}, DPn: 10, Count: 10}); copoly.Field(err) != "f0" {
		t.Errorf("no polymer at the feed: %v, want an error naming f0", err)
	}
}
