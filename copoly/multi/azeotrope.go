package multi

import (
	"math"
	"math/bits"

	"gonum.org/v1/gonum/mat"
)

// Kinds of azeotrope in [Azeotrope.Drift]: how the unreacted monomer of a batch near it moves.
const (
	// DriftAttracting: batches started nearby drift towards it (it can end a batch).
	DriftAttracting = "attracting"
	// DriftRepelling: batches started nearby drift away from it.
	DriftRepelling = "repelling"
	// DriftSaddle: towards it in some directions, away in others.
	DriftSaddle = "saddle"
	// DriftNeutral: some direction neither attracts nor repels to first order.
	DriftNeutral = "neutral"
)

// Azeotrope is a feed that makes copolymer of its own composition, F(f) = f, so a batch started
// there does not drift.
type Azeotrope struct {
	// F is the composition (feed and copolymer alike), N values; zero outside Monomers.
	F []float64
	// Monomers lists the monomers present (all N for an azeotrope inside the simplex, fewer on
	// a face: an azeotrope of a sub-mixture).
	Monomers []int
	// Drift is one of the Drift constants, from the eigenvalues of the Jacobian of
	// df/dt = f − F(f) on the whole simplex (directions that add an absent monomer included).
	Drift string
}

// Azeotropes returns every azeotrope of the model with two or more monomers present: inside the
// simplex and on each of its faces (the sub-mixtures), from Newton's method started at a grid
// of points of each face (all interior points with denominator k + 3 for k monomers; for a
// pair the closed form (1 − r_ji)/(2 − r_ij − r_ji)), the solutions within 1e-7 of each other
// counted once. Pure monomers (F = f trivially) are not listed.
//
// Where the feeds that do not drift are not isolated — a line or a surface of them, as with all
// ratios 1 — none of them is listed and nonIsolated is true.
//
// References:
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594 (the binary azeotrope).
//   - C. Walling, E. R. Briggs, J. Am. Chem. Soc. 1945, 67, 1774 (F for N monomers).
func (m *Model) Azeotropes() (azeotropes []Azeotrope, nonIsolated bool) {
	n := m.n
	for s := uint8(3); s < 1<<n; s++ {
		k := bits.OnesCount8(s)
		if k < 2 || m.closed[s] != s {
			continue
		}
		fc := m.face(s)
		if k == 2 {
			i, j := fc.idx[0], fc.idx[1]
			rij, rji := m.r[i][j], m.r[j][i]
			switch {
			case rij == 1 && rji == 1:
				nonIsolated = true
			case (rij < 1 && rji < 1) || (rij > 1 && rji > 1):
				var f [MaxMonomers]float64
				f[i] = (1 - rji) / (2 - rij - rji)
				f[j] = 1 - f[i]
				azeotropes = m.addAzeotrope(azeotropes, s, &f)
			}
			continue
		}
		q := k + 3
		lattice(k, q, func(a []int) {
			var f [MaxMonomers]float64
			for p, i := range fc.idx {
				f[i] = float64(a[p]) / float64(q)
			}
			u, w := newton(fc.params(&f), func(dst, u []float64) {
				var g, G [MaxMonomers]float64
				fc.feed(&g, u)
				m.composition(G[:n], &g, s)
				for p := range dst {
					dst[p] = G[fc.idx[p]] - g[fc.idx[p]]
				}
			}, 50, 1e-14)
			if !(w <= 1e-13) {
				return
			}
			fc.feed(&f, u)
			for _, i := range fc.idx {
				if !(f[i] > 1e-9) {
					return // on a smaller face, found there
				}
			}
			if m.singular(fc, u) {
				nonIsolated = true
				return
			}
			azeotropes = m.addAzeotrope(azeotropes, s, &f)
		})
	}
	return azeotropes, nonIsolated
}

// lattice calls visit with every k-tuple of integers ≥ 1 summing to q.
func lattice(k, q int, visit func([]int)) {
	a := make([]int, k)
	var rec func(p, left int)
	rec = func(p, left int) {
		if p == k-1 {
			a[p] = left
			visit(a)
			return
		}
		for v := 1; v <= left-(k-1-p); v++ {
			a[p] = v
			rec(p+1, left-v)
		}
	}
	rec(0, q)
}

// singular reports whether F(f) − f on the face has a (nearly) singular Jacobian at u: the
// solution is then not isolated.
func (m *Model) singular(fc *face, u []float64) bool {
	n := len(u)
	jac := mat.NewDense(n, n, nil)
	g0 := make([]float64, n)
	res := func(dst, u []float64) {
		var g, G [MaxMonomers]float64
		fc.feed(&g, u)
		m.composition(G[:m.n], &g, fc.s)
		for p := range dst {
			dst[p] = G[fc.idx[p]] - g[fc.idx[p]]
		}
	}
	res(g0, u)
	ut := make([]float64, n)
	gt := make([]float64, n)
	for k := range n {
		h := 1e-6 * math.Max(1, math.Abs(u[k]))
		copy(ut, u)
		ut[k] += h
		res(gt, ut)
		for i := range n {
			jac.Set(i, k, (gt[i]-g0[i])/h)
		}
	}
	var svd mat.SVD
	if !svd.Factorize(jac, mat.SVDNone) {
		return true
	}
	v := svd.Values(nil)
	return v[len(v)-1] < 1e-6*math.Max(1e-3, v[0])
}

// addAzeotrope adds the azeotrope at f (monomers of s) unless one within 1e-7 is listed, with
// the kind of drift around it.
func (m *Model) addAzeotrope(list []Azeotrope, s uint8, f *[MaxMonomers]float64) []Azeotrope {
	for _, a := range list {
		same := true
		for i := range m.n {
			same = same && math.Abs(a.F[i]-f[i]) < 1e-7
		}
		if same {
			return list
		}
	}
	az := Azeotrope{F: append([]float64(nil), f[:m.n]...), Drift: m.driftKind(f)}
	for i := range m.n {
		if s&(1<<i) != 0 {
			az.Monomers = append(az.Monomers, i)
		}
	}
	return append(list, az)
}

// driftKind classifies the drift df/dt = g(f) = f − F(f) near the azeotrope f by the eigenvalues
// of its Jacobian on the whole simplex, in the coordinates f_j (j ≠ p, p the most abundant
// monomer; f_p = 1 − Σ f_j), by one-sided differences of step 1e-6 towards the inside (a
// monomer absent at f is added in a trace).
func (m *Model) driftKind(f *[MaxMonomers]float64) string {
	n := m.n
	p := 0
	for i := range n {
		if f[i] > f[p] {
			p = i
		}
	}
	all := uint8(1)<<n - 1
	g := func(x *[MaxMonomers]float64, out *[MaxMonomers]float64) {
		var F [MaxMonomers]float64
		s := uint8(0)
		for i := range n {
			if x[i] > 0 {
				s |= 1 << i
			}
		}
		m.composition(F[:n], x, s&all)
		for i := range n {
			out[i] = x[i] - F[i]
		}
	}
	var g0 [MaxMonomers]float64
	g(f, &g0)
	var cols []int
	for j := range n {
		if j != p {
			cols = append(cols, j)
		}
	}
	k := len(cols)
	jac := mat.NewDense(k, k, nil)
	const h = 1e-6
	for c, j := range cols {
		x := *f
		x[j] += h
		x[p] -= h
		var gx [MaxMonomers]float64
		g(&x, &gx)
		for r, i := range cols {
			jac.Set(r, c, (gx[i]-g0[i])/h)
		}
	}
	var eig mat.Eigen
	if !eig.Factorize(jac, mat.EigenNone) {
		return DriftNeutral
	}
	neg, pos := 0, 0
	for _, v := range eig.Values(nil) {
		switch {
		case real(v) < -1e-5:
			neg++
		case real(v) > 1e-5:
			pos++
		}
	}
	switch {
	case neg == k:
		return DriftAttracting
	case pos == k:
		return DriftRepelling
	case neg+pos == k:
		return DriftSaddle
	}
	return DriftNeutral
}
