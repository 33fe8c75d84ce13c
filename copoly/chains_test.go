package copoly

import (
	"math"
	"strings"
	"testing"
)

// TestChainsMatchMarkovStatistics counts units, dyads and triads in seeded Monte Carlo chains and
// compares them with the analytic Markov results of Sequence, within 5 standard errors (the
// counts are sums of many weakly correlated indicators; 5σ keeps a false alarm below 1e-6 per
// check).
func TestChainsMatchMarkovStatistics(t *testing.T) {
	for _, tc := range []struct {
		m  Terminal
		f1 float64
	}{
		{Terminal{0.40, 0.04}, 0.5}, // St/AN, Polymer Handbook table
		{Terminal{1.88, 0.43}, 0.3}, // MMA/n-BA, Polymer Handbook table
		{Terminal{1, 1}, 0.3},
		{Terminal{2, 1.5}, 0.5},
	} {
		const count, length = 400, 500
		chains, err := tc.m.Chains(tc.f1, count, length, 7)
		if err != nil {
			t.Fatal(err)
		}
		s, _ := tc.m.Sequence(tc.f1)
		var units1, pairs, pairs12, centre1, t111 float64
		for _, c := range chains {
			if len(c) != length || strings.Trim(c, "12") != "" {
				t.Fatalf("chain %q is not %d units of 1 and 2", c[:10], length)
			}
			units1 += float64(strings.Count(c, "1"))
			for i := 1; i < len(c); i++ {
				pairs++
				if c[i] != c[i-1] {
					pairs12++
				}
				if i+1 < len(c) && c[i] == '1' {
					centre1++
					if c[i-1] == '1' && c[i+1] == '1' {
						t111++
					}
				}
			}
		}
		n := float64(count * length)
		// Standard errors inflated by the chain's correlation, (1 + λ)/(1 − λ) with
		// λ = 1 − P12 − P21 (the asymptotic variance factor of a two-state Markov chain).
		lambda := 1 - s.P12 - s.P21
		inflate := (1 + math.Abs(lambda)) / (1 - math.Abs(lambda))
		for _, c := range []struct {
			name      string
			got, want float64
			trials    float64
		}{
			{"F1", units1 / n, s.F1, n},
			{"D12", pairs12 / pairs, s.D12, pairs},
			{"T111", t111 / centre1, s.T111, centre1},
		} {
			se := math.Sqrt(c.want*(1-c.want)/c.trials*inflate) + 1e-12
			if math.Abs(c.got-c.want) > 5*se {
				t.Errorf("%v f1=%g: Monte Carlo %s = %.5f, Markov %.5f (5σ = %.5f)", tc.m, tc.f1, c.name, c.got, c.want, 5*se)
			}
		}
	}
}

func TestChainsReproducibleAndValidated(t *testing.T) {
	m := Terminal{0.52, 0.46}
	a, _ := m.Chains(0.5, 3, 40, 42)
	b, _ := m.Chains(0.5, 3, 40, 42)
	c, _ := m.Chains(0.5, 3, 40, 43)
	if strings.Join(a, "") != strings.Join(b, "") {
		t.Error("same seed gave different chains")
	}
	if strings.Join(a, "") == strings.Join(c, "") {
		t.Error("different seeds gave the same chains")
	}
	for _, tc := range []struct {
		count, length int
		field         string
	}{{0, 10, "count"}, {MaxChains + 1, 10, "count"}, {3, 0, "length"}, {3, MaxChainLength + 1, "length"}} {
		if _, err := m.Chains(0.5, tc.count, tc.length, 1); Field(err) != tc.field {
			t.Errorf("Chains(count %d, length %d) error %v, want field %s", tc.count, tc.length, err, tc.field)
		}
	}
}
