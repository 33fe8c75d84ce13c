package fit

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat/distuv"
)

// The distribution functions of dist.go against gonum's distuv (an independent implementation)
// and closed forms.
func TestDistributions(t *testing.T) {
	for _, nu := range []float64{1, 2, 3, 5, 8, 18, 100} {
		for _, p := range []float64{0.5, 0.9, 0.95, 0.99} {
			if got, want := fQuantile(p, 2, nu), (distuv.F{D1: 2, D2: nu}).Quantile(p); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-9) {
				t.Errorf("fQuantile(%g, 2, %g) = %v, distuv %v", p, nu, got, want)
			}
			// Closed form for two numerator degrees of freedom: (ν/2)((1 − p)^(−2/ν) − 1), from
			// the CDF 1 − (1 + 2x/ν)^(−ν/2).
			if got, want := fQuantile(p, 2, nu), nu/2*(math.Pow(1-p, -2/nu)-1); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-9) {
				t.Errorf("fQuantile(%g, 2, %g) = %v, closed form %v", p, nu, got, want)
			}
			if got, want := chi2Quantile(p, nu), (distuv.ChiSquared{K: nu}).Quantile(p); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-9) {
				t.Errorf("chi2Quantile(%g, %g) = %v, distuv %v", p, nu, got, want)
			}
		}
		for _, x := range []float64{0.1, 1, 5, 30} {
			if got, want := chi2Survival(x, nu), 1-(distuv.ChiSquared{K: nu}).CDF(x); !scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-9) {
				t.Errorf("chi2Survival(%g, %g) = %v, distuv %v", x, nu, got, want)
			}
			if got, want := studentTTwoSided(x, nu), 2*(1-(distuv.StudentsT{Mu: 0, Sigma: 1, Nu: nu}).CDF(x)); !scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-9) {
				t.Errorf("studentTTwoSided(%g, %g) = %v, distuv %v", x, nu, got, want)
			}
		}
	}
	// χ²_0.95(2) = −2 ln 0.05 (the χ² with two degrees of freedom is exponential).
	if got := chi2Quantile(0.95, 2); !scalar.EqualWithinAbsOrRel(got, -2*math.Log(0.05), 1e-12, 1e-12) {
		t.Errorf("chi2Quantile(0.95, 2) = %v", got)
	}
}

// TestFSurvival checks the F distribution's upper tail against gonum's distuv (an independent
// implementation), scipy and the closed form for two numerator degrees of freedom.
func TestFSurvival(t *testing.T) {
	for _, d1 := range []float64{1, 2, 3, 5} {
		for _, d2 := range []float64{1, 2, 4, 7, 30} {
			for _, x := range []float64{0.01, 0.5, 1, 3.5, 19, 250} {
				if got, want := fSurvival(x, d1, d2), (distuv.F{D1: d1, D2: d2}).Survival(x); !scalar.EqualWithinAbsOrRel(got, want, 1e-14, 1e-9) {
					t.Errorf("fSurvival(%g, %g, %g) = %v, distuv %v", x, d1, d2, got, want)
				}
				// Two numerator degrees of freedom: P(F > x) = (1 + 2x/ν)^(−ν/2), the complement
				// of the CDF in TestDistributions.
				if d1 == 2 {
					if got, want := fSurvival(x, 2, d2), math.Pow(1+2*x/d2, -d2/2); !scalar.EqualWithinAbsOrRel(got, want, 1e-14, 1e-9) {
						t.Errorf("fSurvival(%g, 2, %g) = %v, closed form %v", x, d2, got, want)
					}
				}
			}
		}
	}
	// scipy.stats.f.sf(x, d1, d2), scipy 1.10.1 (Debian 12 python3-scipy).
	for _, c := range []struct{ x, d1, d2, want float64 }{
		{3.5, 2, 10, 0.07042962777237427},
		{19, 2, 2, 0.05},
		{0.75, 3, 7, 0.5560876708478534},
		{2.2, 5, 40, 0.0732822498721639},
	} {
		if got := fSurvival(c.x, c.d1, c.d2); !scalar.EqualWithinRel(got, c.want, 1e-12) {
			t.Errorf("fSurvival(%g, %g, %g) = %.16g, scipy %.16g", c.x, c.d1, c.d2, got, c.want)
		}
	}
	if fSurvival(0, 2, 5) != 1 || fSurvival(-1, 2, 5) != 1 || fSurvival(math.Inf(1), 2, 5) != 0 || !math.IsNaN(fSurvival(math.NaN(), 2, 5)) {
		t.Errorf("fSurvival at 0, −1, +Inf, NaN = %v, %v, %v, %v; want 1, 1, 0, NaN",
			fSurvival(0, 2, 5), fSurvival(-1, 2, 5), fSurvival(math.Inf(1), 2, 5), fSurvival(math.NaN(), 2, 5))
	}
}
