package plan

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// sortedQuantile is the type-7 quantile of Hyndman and Fan (Am. Stat. 1996, 50, 361), the
// default of R and numpy, computed from a full sort: the independent reference for quantiles.
func sortedQuantile(v []float64, p float64) float64 {
	s := slices.Clone(v)
	slices.Sort(s)
	x := p * float64(len(s)-1)
	i := int(x)
	if i+1 >= len(s) {
		return s[len(s)-1]
	}
	return s[i] + (x-float64(i))*(s[i+1]-s[i])
}

// TestQuantilesMatchSort checks the selection-based quantiles against a full sort on random
// samples of every size up to 600, with ties, and with NaN mixed in (NaN is ignored).
func TestQuantilesMatchSort(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	for n := 1; n <= 600; n += 1 + n/20 {
		for _, kind := range []string{"uniform", "ties", "sorted", "reversed", "nan"} {
			v := make([]float64, n)
			for i := range v {
				switch kind {
				case "ties":
					v[i] = float64(r.IntN(4))
				case "sorted":
					v[i] = float64(i)
				case "reversed":
					v[i] = float64(n - i)
				default:
					v[i] = r.NormFloat64()
				}
			}
			clean := slices.Clone(v)
			if kind == "nan" {
				v = append(v, math.NaN(), math.NaN())
				r.Shuffle(len(v), func(i, j int) { v[i], v[j] = v[j], v[i] })
			}
			lo, hi := quantiles(v)
			wantLo, wantHi := sortedQuantile(clean, 0.025), sortedQuantile(clean, 0.975)
			if lo != wantLo || hi != wantHi {
				t.Fatalf("n=%d %s: quantiles = %v, %v; full sort gives %v, %v", n, kind, lo, hi, wantLo, wantHi)
			}
		}
	}
	if lo, hi := quantiles([]float64{math.NaN()}); !math.IsNaN(lo) || !math.IsNaN(hi) {
		t.Errorf("quantiles of NaN only = %v, %v; want NaN", lo, hi)
	}
}
