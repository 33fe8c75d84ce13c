// Package lm minimises small weighted sums of squares by the Levenberg–Marquardt method
// within bounds 0 ≤ xᵢ ≤ upper, and solves the small linear systems it needs. It serves the
// estimators of copoly/fit and, like every package under copoly/internal, imports nothing of
// copoly.
package lm

import "math"

// Minimize minimises a weighted sum of squares s(x) = Σ w (observed − model(x))² over
// 0 ≤ xᵢ ≤ upper from x0. normal(x) returns the normal equations at x, A = JᵀWJ and g = JᵀWe,
// with J = ∂model/∂x and e the residuals observed − model. Each step solves
// (A + λ diag A) d = g and is kept when it lowers s; λ falls tenfold after a kept step and rises
// tenfold after a refused one. It stops when a step moves every xᵢ by less than 1e-10 of
// max(xᵢ, 10⁻³) or lowers s by less than 1e-15 of it, or when no λ helps.
//
// References:
//   - D. W. Marquardt, J. Soc. Ind. Appl. Math. 1963, 11, 431.
func Minimize(x0 []float64, upper float64, ssr func(x []float64) float64, normal func(x []float64) (A [][]float64, g []float64)) ([]float64, float64) {
	x := append([]float64(nil), x0...)
	k := len(x)
	s := ssr(x)
	lambda := 1e-3
	M := make([][]float64, k)
	for i := range M {
		M[i] = make([]float64, k)
	}
	nx := make([]float64, k)
	for range 200 {
		A, g := normal(x)
		improved := false
		for range 30 {
			for i := range k {
				copy(M[i], A[i])
				M[i][i] *= 1 + lambda
			}
			d, ok := Solve(M, g)
			if !ok {
				lambda *= 10
				continue
			}
			conv := true
			for i := range k {
				nx[i] = math.Min(upper, math.Max(0, x[i]+d[i]))
				if math.Abs(nx[i]-x[i]) > 1e-10*math.Max(1e-3, x[i]) {
					conv = false
				}
			}
			if ns := ssr(nx); ns < s {
				small := s-ns <= 1e-15*s
				copy(x, nx)
				s = ns
				lambda = math.Max(lambda/10, 1e-12)
				improved = true
				if conv || small {
					return x, s
				}
				break
			}
			lambda *= 10
		}
		if !improved {
			break
		}
	}
	return x, s
}

// Solve solves the small system M d = g by Gaussian elimination with partial pivoting; ok is
// false for a singular (or NaN) system. M and g are not changed.
func Solve(M [][]float64, g []float64) (d []float64, ok bool) {
	k := len(g)
	A := make([][]float64, k)
	for i := range k {
		A[i] = append(append(make([]float64, 0, k+1), M[i]...), g[i])
	}
	for c := range k {
		p := c
		for r := c + 1; r < k; r++ {
			if math.Abs(A[r][c]) > math.Abs(A[p][c]) {
				p = r
			}
		}
		if A[p][c] == 0 || math.IsNaN(A[p][c]) {
			return nil, false
		}
		A[c], A[p] = A[p], A[c]
		for r := c + 1; r < k; r++ {
			f := A[r][c] / A[c][c]
			for j := c; j <= k; j++ {
				A[r][j] -= f * A[c][j]
			}
		}
	}
	d = make([]float64, k)
	for r := k - 1; r >= 0; r-- {
		s := A[r][k]
		for j := r + 1; j < k; j++ {
			s -= A[r][j] * d[j]
		}
		d[r] = s / A[r][r]
	}
	return d, true
}
