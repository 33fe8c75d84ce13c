package multi

import "math"

// solve solves a x = b for the n×n leading block of a by Gaussian elimination with partial
// pivoting (a and b are overwritten). ok is false when a pivot is zero or the result is not
// finite.
func solve(a *[MaxMonomers][MaxMonomers]float64, b *[MaxMonomers]float64, n int) (x [MaxMonomers]float64, ok bool) {
	for k := range n {
		p := k
		for i := k + 1; i < n; i++ {
			if math.Abs(a[i][k]) > math.Abs(a[p][k]) {
				p = i
			}
		}
		if a[p][k] == 0 || math.IsNaN(a[p][k]) {
			return x, false
		}
		a[k], a[p] = a[p], a[k]
		b[k], b[p] = b[p], b[k]
		for i := k + 1; i < n; i++ {
			l := a[i][k] / a[k][k]
			if l == 0 {
				continue
			}
			for j := k; j < n; j++ {
				a[i][j] -= l * a[k][j]
			}
			b[i] -= l * b[k]
		}
	}
	for i := n - 1; i >= 0; i-- {
		v := b[i]
		for j := i + 1; j < n; j++ {
			v -= a[i][j] * x[j]
		}
		x[i] = v / a[i][i]
		if math.IsNaN(x[i]) || math.IsInf(x[i], 0) {
			return x, false
		}
	}
	return x, true
}
