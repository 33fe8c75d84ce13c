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
