// Package ode integrates the ordinary differential equations of copoly's drift models.
package ode

import "math"

// Dopri5 integrates the scalar ODE dy/dt = g(y) from (t0, y0) to each time in ts (ascending,
// all ≥ t0) with the adaptive explicit Runge–Kutta pair of Dormand and Prince, order 5 with an
// embedded order-4 error estimate and local extrapolation. The ODE is autonomous, so the
// nodes c_i of the tableau are not needed. The step size follows the standard
// controller h ← h·min(5, max(0.2, 0.9·err^(−1/5))) on the error measured against
// atol + rtol·|y|. Results are written to dst, which must have len(ts) elements.
//
// References:
//   - J. R. Dormand, P. J. Prince, "A family of embedded Runge–Kutta formulae",
//     J. Comput. Appl. Math. 1980, 6, 19–26 (the coefficients below, Table 2).
//   - E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I,
//     2nd ed., Springer 1993, Sec. II.4 (step-size control).
func Dopri5(dst []float64, g func(float64) float64, t0, y0 float64, ts []float64, rtol, atol float64) {
	const (
		a21                        = 1.0 / 5
		a31, a32                   = 3.0 / 40, 9.0 / 40
		a41, a42, a43              = 44.0 / 45, -56.0 / 15, 32.0 / 9
		a51, a52, a53, a54         = 19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729
		a61, a62, a63, a64, a65    = 9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656
		b1, b3, b4, b5, b6         = 35.0 / 384, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84
		e1, e3, e4, e5, e6, e7     = 71.0 / 57600, -71.0 / 16695, 71.0 / 1920, -17253.0 / 339200, 22.0 / 525, -1.0 / 40
		maxSteps                   = 1_000_000
		safety, minScale, maxScale = 0.9, 0.2, 5.0
	)
	t, y := t0, y0
	h := 1e-3
	k1 := g(y)
	steps := 0
	for i, target := range ts {
		for t < target && steps < maxSteps {
			steps++
			last := false
			if t+h >= target {
				h = target - t
				last = true
			}
			k2 := g(y + h*a21*k1)
			k3 := g(y + h*(a31*k1+a32*k2))
			k4 := g(y + h*(a41*k1+a42*k2+a43*k3))
			k5 := g(y + h*(a51*k1+a52*k2+a53*k3+a54*k4))
			k6 := g(y + h*(a61*k1+a62*k2+a63*k3+a64*k4+a65*k5))
			yn := y + h*(b1*k1+b3*k3+b4*k4+b5*k5+b6*k6)
			k7 := g(yn)
			errEst := h * (e1*k1 + e3*k3 + e4*k4 + e5*k5 + e6*k6 + e7*k7)
			sc := atol + rtol*math.Max(math.Abs(y), math.Abs(yn))
			r := math.Abs(errEst) / sc
			if math.IsNaN(r) {
				// g left its domain inside the step: retry with a smaller one.
				h *= minScale
				continue
			}
			if r <= 1 {
				t, y, k1 = t+h, yn, k7
				if last {
					t = target
				}
			}
			scale := maxScale
			if r > 0 {
				scale = math.Min(maxScale, math.Max(minScale, safety*math.Pow(r, -0.2)))
			}
			h *= scale
		}
		dst[i] = y
	}
}
