package fit

import (
	"math"

	"gonum.org/v1/gonum/mathext"
)

// The few distribution functions the estimators need, written on gonum's special functions
// (mathext) rather than taken from gonum/stat/distuv, which would bring gonum's linear algebra
// into the WebAssembly module for nothing. dist_test.go checks them against distuv.
//
// References:
//   - M. Abramowitz, I. A. Stegun, Handbook of Mathematical Functions, 1964: 26.6.2 (F), 26.4.19
//     (χ²), 26.7.1 with 26.5.27 (Student's t), 26.5.2 (I_x(a, b) = 1 − I_{1−x}(b, a)).

// fQuantile returns the p-quantile of the F distribution with d1 and d2 degrees of freedom:
// with q = I⁻¹_p(d1/2, d2/2), F = d2 q / (d1 (1 − q)).
func fQuantile(p, d1, d2 float64) float64 {
	q := mathext.InvRegIncBeta(d1/2, d2/2, p)
	return d2 * q / (d1 * (1 - q))
}

// fSurvival returns the upper-tail probability of the F distribution with d1 and d2 degrees of
// freedom, from A&S 26.6.2 and the symmetry 26.5.2:
//
//	P(F > x) = I_{d2/(d2 + d1 x)}(d2/2, d1/2)
//
// 1 for x ≤ 0; NaN for NaN.
func fSurvival(x, d1, d2 float64) float64 {
	if x <= 0 {
		return 1
	}
	if math.IsInf(x, 1) {
		return 0
	}
	return mathext.RegIncBeta(d2/2, d1/2, d2/(d2+d1*x))
}

// chi2Quantile returns the p-quantile of χ² with k degrees of freedom: 2 P⁻¹(k/2, p).
func chi2Quantile(p, k float64) float64 {
	return 2 * mathext.GammaIncRegInv(k/2, p)
}

// chi2Survival returns P(χ²_k > x) = Q(k/2, x/2).
func chi2Survival(x, k float64) float64 {
	if x <= 0 {
		return 1
	}
	return mathext.GammaIncRegComp(k/2, x/2)
}

// studentTTwoSided returns P(|T_ν| > |t|) = I_{ν/(ν + t²)}(ν/2, 1/2).
func studentTTwoSided(t, nu float64) float64 {
	if math.IsInf(t, 0) {
		return 0
	}
	return mathext.RegIncBeta(nu/2, 0.5, nu/(nu+t*t))
}
