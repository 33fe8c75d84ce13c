package multi

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// chain is the transition matrix of the copolymer chain at one feed, restricted to the monomers
// that enter the copolymer, with its stationary distribution.
type chain struct {
	// n monomers of the closed class, in the order idx (largest mole fraction first).
	n   int
	idx [MaxMonomers]int
	// p[a][b] is the probability that unit idx[b] follows unit idx[a].
	p [MaxMonomers][MaxMonomers]float64
	// pi[i] is the stationary probability of monomer i (0 outside the class): the copolymer
	// composition F.
	pi [MaxMonomers]float64
	// sum[i] is Σ_j a_ij f_j for a radical i that is not held by a zero ratio (weights of the
	// rate coefficients relative to the row's largest); 0 for one that is.
	sum [MaxMonomers]float64
}

// build fills the transition matrix at the feed f for the monomers of s:
//
//	P_ij = (f_j / r_ij) / Σ_k (f_k / r_ik)
//
// computed with the row-scaled weights a_ij = min_k r_ik / r_ij ≤ 1 (and, for a radical held by
// zero ratios, over those monomers only). It returns false when no polymer forms (s holds a
// single monomer that does not add to its own radical).
func (m *Model) build(c *chain, f *[MaxMonomers]float64, s uint8) bool {
	cl := m.closed[s]
	if cl == 0 {
		return false
	}
	// Members of the class, largest f first: the state eliminated last in GTH is then one
	// every unheld radical adds with a probability of at least minWeight/N, so no pivot is 0.
	n := 0
	for i := range m.n {
		if cl&(1<<i) == 0 {
			continue
		}
		k := n
		for k > 0 && f[c.idx[k-1]] < f[i] {
			c.idx[k] = c.idx[k-1]
			k--
		}
		c.idx[k] = i
		n++
	}
	c.n = n
	for a := range n {
		i := c.idx[a]
		var w [MaxMonomers]float64
		var total float64
		if z := m.zero[i] & s; z != 0 {
			// Held by zero ratios: the radical adds only the monomers of z. One of them takes
			// every radical whatever its fraction; several share by k_ij f_j (by k_ij alone if
			// their fractions vanish together, which only the drift's last step can reach).
			single := z&(z-1) == 0
			for pass := 0; pass < 2 && !(total > 0); pass++ {
				total = 0
				for b := range n {
					if j := c.idx[b]; z&(1<<j) != 0 {
						switch {
						case single:
							w[b] = 1
						case pass == 0:
							w[b] = m.c[i][j] * f[j]
						default:
							w[b] = m.c[i][j]
						}
						total += w[b]
					}
				}
			}
			c.sum[i] = 0
		} else {
			// An unheld radical in the class means the class is all of s.
			for b := range n {
				j := c.idx[b]
				w[b] = m.a[i][j] * f[j]
				total += w[b]
			}
			c.sum[i] = total
		}
		inv := 1 / total
		for b := range n {
			c.p[a][b] = w[b] * inv
		}
	}
	return true
}

// stationary computes the stationary distribution π of the chain (π P = π, Σ π = 1) by the
// state-reduction (GTH) variant of Gaussian elimination: eliminating the last state k of the
// chain censored to 0…k replaces
//
//	P_ij ← P_ij + P_ik P_kj / s_k,   s_k = Σ_{j<k} P_kj  (= 1 − P_kk of the censored chain)
//
// and back substitution gives π_k = Σ_{i<k} π_i P_ik / s_k. The diagonal 1 − P_kk is the sum of
// off-diagonal terms, so no step subtracts and every π_i keeps full relative precision even when
// a monomer is nearly absent (P_kk → 1) or a ratio is 1e-3 — the reason it is preferred here to
// elimination with partial pivoting of (Pᵀ − I) with one row replaced by Σ π = 1, which loses
// the digits of 1 − P_kk; that solve is kept as a fallback for a pivot s_k that underflows to 0
// (only possible with ratios and fractions near 1e-300). The result is written into c.pi.
//
// References:
//   - W. K. Grassmann, M. I. Taksar, D. P. Heyman, Oper. Res. 1985, 33, 1107 (from memory).
//   - C. A. O'Cinneide, Numer. Math. 1993, 65, 109 (entrywise relative accuracy; from memory).
func (c *chain) stationary() {
	n := c.n
	if n == 1 {
		c.pi[c.idx[0]] = 1
		return
	}
	p := c.p // a copy: the elimination overwrites it
	var x [MaxMonomers]float64
	for k := n - 1; k > 0; k-- {
		var s float64
		for j := range k {
			s += p[k][j]
		}
		if !(s > 0) || math.IsInf(s, 0) {
			c.stationaryLU()
			return
		}
		inv := 1 / s
		for i := range k {
			p[i][k] *= inv
			pik := p[i][k]
			if pik == 0 {
				continue
			}
			for j := range k {
				p[i][j] += pik * p[k][j]
			}
		}
	}
	x[0] = 1
	total := 1.0
	for k := 1; k < n; k++ {
		var v float64
		for i := range k {
			v += x[i] * p[i][k]
		}
		x[k] = v
		total += v
	}
	for a := range n {
		c.pi[c.idx[a]] = x[a] / total
	}
}

// stationaryLU solves (Pᵀ − I) π = 0 with the last equation replaced by Σ π = 1, by Gaussian
// elimination with partial pivoting, and clamps rounding below 0. It is the fallback of
// stationary.
func (c *chain) stationaryLU() {
	n := c.n
	var a [MaxMonomers][MaxMonomers]float64
	var b [MaxMonomers]float64
	for i := range n - 1 {
		for j := range n {
			a[i][j] = c.p[j][i]
		}
		// The diagonal as minus the sum of the off-diagonal terms of row i of P.
		var out float64
		for j := range n {
			if j != i {
				out += c.p[i][j]
			}
		}
		a[i][i] = -out
	}
	for j := range n {
		a[n-1][j] = 1
	}
	b[n-1] = 1
	x, ok := solve(&a, &b, n)
	var total float64
	for i := range n {
		if !ok || !(x[i] > 0) {
			x[i] = 0
		}
		total += x[i]
	}
	for i := range n {
		v := math.NaN()
		if total > 0 {
			v = x[i] / total
		}
		c.pi[c.idx[i]] = v
	}
}

// composition writes F(f) for the monomers of s into dst (N values); NaN when no polymer forms.
func (m *Model) composition(dst []float64, f *[MaxMonomers]float64, s uint8) {
	var c chain
	if !m.build(&c, f, s) {
		for i := range dst {
			dst[i] = math.NaN()
		}
		return
	}
	c.stationary()
	copy(dst, c.pi[:m.n])
}

// Composition returns the mole fractions F of the monomers in the copolymer formed from the feed
// f (mole fractions of the unreacted monomers), the stationary distribution of the chain's
// transition matrix
//
//	P_ij = (f_j / r_ij) / Σ_k (f_k / r_ik),   F P = F,   Σ F_i = 1
//
// (Walling and Briggs' result for N monomers; for N = 3 the Alfrey–Goldfinger equation, for
// N = 2 the Mayo–Lewis equation). A monomer absent from the feed is absent from the copolymer
// (F_i = 0 for f_i = 0), and the others follow the model of the monomers present. When no
// polymer forms (the only monomer present does not add to its own radical) every F_i is NaN.
//
// dst is grown when shorter than N and may be nil. An invalid feed gives a *copoly.InputError
// naming "f" or "f[j]".
//
// References:
//   - C. Walling, E. R. Briggs, J. Am. Chem. Soc. 1945, 67, 1774.
//   - T. Alfrey, G. Goldfinger, J. Chem. Phys. 1944, 12, 322.
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594.
func (m *Model) Composition(dst, f []float64) ([]float64, error) {
	sum, err := m.checkFeed("f", f)
	if err != nil {
		return nil, err
	}
	if cap(dst) < m.n {
		dst = make([]float64, m.n)
	}
	dst = dst[:m.n]
	var fa [MaxMonomers]float64
	s := load(&fa, f, sum)
	m.composition(dst, &fa, s)
	return dst, nil
}

// CompositionsTo writes the composition of each feed of f (see [Model.Composition]) into dst,
// N values per feed in the order of the feeds, and returns it. dst is grown when shorter than
// N·len(f) and may be nil; no memory is allocated per feed. At most [copoly.MaxPoints] feeds;
// an invalid feed gives an error naming "f[k]" or "f[k][j]".
func (m *Model) CompositionsTo(dst []float64, f [][]float64) ([]float64, error) {
	if len(f) > copoly.MaxPoints {
		return nil, &copoly.InputError{Field: "f", Value: float64(len(f)), Reason: fmt.Sprintf("at most %d feeds per call", copoly.MaxPoints), Err: copoly.ErrTooMany}
	}
	n := m.n
	if cap(dst) < n*len(f) {
		dst = make([]float64, n*len(f))
	}
	dst = dst[:n*len(f)]
	var fa [MaxMonomers]float64
	for k, feed := range f {
		sum, err := checkFractions("f", feed, n)
		if err != nil {
			return nil, renameFeed(err, k)
		}
		s := load(&fa, feed, sum)
		m.composition(dst[k*n:(k+1)*n], &fa, s)
	}
	return dst, nil
}

// renameFeed turns an error about "f" or "f[j]" into one about feed k: "f[k]", "f[k][j]".
func renameFeed(err error, k int) error {
	ie, ok := err.(*copoly.InputError)
	if !ok {
		return err
	}
	e := *ie
	e.Field = fmt.Sprintf("f[%d]%s", k, ie.Field[1:])
	return &e
}

// Compositions is multiComposition({r, cross, f}) of the JavaScript API: the model of the
// ratios r (and cross ratios, usually nil) and the composition of each feed of f, one row of N
// mole fractions per feed (see [New] and [Model.CompositionsTo]).
func Compositions(r, cross, f [][]float64) ([][]float64, error) {
	m, err := New(r, cross)
	if err != nil {
		return nil, err
	}
	flat, err := m.CompositionsTo(nil, f)
	if err != nil {
		return nil, err
	}
	out := make([][]float64, len(f))
	for k := range out {
		out[k] = flat[k*m.n : (k+1)*m.n : (k+1)*m.n]
	}
	return out, nil
}
