package multi

import (
	"fmt"
	"math"
	"strings"

	"copoly/copoly"
)

// FeedTolerance is the largest |F_i(f) − targetF_i| [Model.FeedFor] accepts.
const FeedTolerance = 1e-9

// face is the composition map restricted to the monomers of a set s: f on the simplex of s
// (zero elsewhere) to F(f). Points are parameterized by u ∈ ℝ^(k−1) through
// f_i = e^(u_i) / Σ e^(u_j) with the last member's u fixed at 0, so every iterate stays inside
// the face.
type face struct {
	m   *Model
	s   uint8
	idx []int // members of s
}

func (m *Model) face(s uint8) *face {
	fc := &face{m: m, s: s}
	for i := range m.n {
		if s&(1<<i) != 0 {
			fc.idx = append(fc.idx, i)
		}
	}
	return fc
}

// feed writes the feed of parameters u into f.
func (fc *face) feed(f *[MaxMonomers]float64, u []float64) {
	k := len(fc.idx)
	top := 0.0
	for _, v := range u {
		top = math.Max(top, v)
	}
	var sum float64
	*f = [MaxMonomers]float64{}
	for a, i := range fc.idx {
		v := 0.0
		if a < k-1 {
			v = u[a]
		}
		f[i] = math.Exp(v - top)
		sum += f[i]
	}
	for _, i := range fc.idx {
		f[i] /= sum
	}
}

// params returns the parameters of a feed with every member positive.
func (fc *face) params(f *[MaxMonomers]float64) []float64 {
	k := len(fc.idx)
	u := make([]float64, k-1)
	last := math.Log(f[fc.idx[k-1]])
	for a := range k - 1 {
		u[a] = math.Log(f[fc.idx[a]]) - last
	}
	return u
}

// newton solves res(u) = 0 (k−1 equations in k−1 unknowns) by Newton's method with a
// forward-difference Jacobian and step halving, from u. It returns the best u found and the
// largest |res| there.
func newton(u []float64, res func(dst, u []float64), iters int, tol float64) ([]float64, float64) {
	n := len(u)
	r := make([]float64, n)
	rt := make([]float64, n)
	ut := make([]float64, n)
	norm := func(v []float64) float64 {
		var w float64
		for _, x := range v {
			w = math.Max(w, math.Abs(x))
		}
		return w
	}
	res(r, u)
	best := norm(r)
	for range iters {
		if best <= tol {
			break
		}
		var a [MaxMonomers][MaxMonomers]float64
		var b [MaxMonomers]float64
		for k := range n {
			h := 1e-7 * math.Max(1, math.Abs(u[k]))
			copy(ut, u)
			ut[k] += h
			res(rt, ut)
			for i := range n {
				a[i][k] = (rt[i] - r[i]) / h
			}
		}
		for i := range n {
			b[i] = -r[i]
		}
		step, ok := solve(&a, &b, n)
		if !ok {
			break
		}
		improved := false
		for lam := 1.0; lam > 1e-6; lam /= 2 {
			for i := range n {
				ut[i] = u[i] + lam*step[i]
			}
			res(rt, ut)
			if w := norm(rt); w < best {
				copy(u, ut)
				copy(r, rt)
				best = w
				improved = true
				break
			}
		}
		if !improved {
			break
		}
	}
	return u, best
}

// FeedFor returns the unreacted feed f whose copolymer (at low conversion) has the composition
// targetF: the solution of F(f) = targetF on the simplex, with f_i = 0 wherever targetF_i = 0.
// It iterates
//
//	f_i ← f_i · targetF_i / F_i(f),   then normalizes f
//
// from f = targetF (a fixed point is a solution, and every iterate stays on the simplex), and
// finishes with Newton's method when that stalls. The answer is checked: F(f) matches targetF
// to FeedTolerance in every monomer.
//
// For ratios that are all positive every target is reachable (the map f ↦ F sends each face of
// the simplex onto itself). Zero ratios bound it: a monomer that does not add to its own radical
// makes at most half of the chain, and a zero ratio can hold a monomer out of the copolymer.
// A target that cannot be made gives an error naming "targetF[i]" for the monomer whose share
// cannot be reached, wrapping copoly.ErrUnreachable, with the closest composition found. Other
// errors name "targetF" or "targetF[i]" (not mole fractions summing to 1).
func (m *Model) FeedFor(targetF []float64) ([]float64, error) {
	sum, err := m.checkFeed("targetF", targetF)
	if err != nil {
		return nil, err
	}
	var t [MaxMonomers]float64
	s := load(&t, targetF, sum)
	f := make([]float64, m.n)
	if s&(s-1) == 0 {
		i := 0
		for s&(1<<i) == 0 {
			i++
		}
		if m.closed[s] == 0 {
			return nil, &copoly.InputError{Field: indexName("targetF", i), Value: targetF[i], Err: copoly.ErrUnreachable,
				Reason: fmt.Sprintf("%s does not add to its own radical, so no feed makes a homopolymer of it", monomerName(i))}
		}
		f[i] = 1
		return f, nil
	}
	if cl := m.closed[s]; cl != s {
		i := 0
		for (s&^cl)&(1<<i) == 0 {
			i++
		}
		return nil, &copoly.InputError{Field: indexName("targetF", i), Value: targetF[i], Err: copoly.ErrUnreachable,
			Reason: fmt.Sprintf("with %s in the feed, the zero ratios make the radicals of %s add only among themselves, so %s never enters the copolymer", setNames(s), setNames(cl), monomerName(i))}
	}
	var fa, F [MaxMonomers]float64
	fa = t
	n := m.n
	residual := func(fa *[MaxMonomers]float64) float64 {
		m.composition(F[:n], fa, s)
		var w float64
		for i := range n {
			w = math.Max(w, math.Abs(F[i]-t[i]))
		}
		return w
	}
	w := residual(&fa)
	for it := 0; it < 300 && w > 1e-15; it++ {
		var next [MaxMonomers]float64
		var total float64
		for i := range n {
			if s&(1<<i) != 0 {
				next[i] = fa[i] * t[i] / F[i]
				total += next[i]
			}
		}
		if !(total > 0) || math.IsInf(total, 0) {
			break
		}
		var change float64
		for i := range n {
			next[i] /= total
			change = math.Max(change, math.Abs(next[i]-fa[i]))
		}
		fa = next
		w = residual(&fa)
		if change < 1e-16 {
			break
		}
	}
	if w > 1e-14 && !math.IsNaN(w) {
		fc := m.face(s)
		ok := true
		for _, i := range fc.idx {
			ok = ok && fa[i] > 0
		}
		if ok {
			u, _ := newton(fc.params(&fa), func(dst, u []float64) {
				var g, G [MaxMonomers]float64
				fc.feed(&g, u)
				m.composition(G[:n], &g, s)
				for a := range dst {
					dst[a] = G[fc.idx[a]] - t[fc.idx[a]]
				}
			}, 60, 1e-15)
			var g [MaxMonomers]float64
			fc.feed(&g, u)
			if wg := residual(&g); wg < w {
				fa, w = g, wg
			}
		}
	}
	w = residual(&fa)
	if !(w <= FeedTolerance) {
		return nil, m.unreachable(targetF, &t, &fa, &F)
	}
	copy(f, fa[:n])
	return f, nil
}

// unreachable is the error for a target the iteration could not make, naming the monomer
// furthest from its target at the closest feed found.
func (m *Model) unreachable(targetF []float64, t, fa, F *[MaxMonomers]float64) error {
	worst, w := 0, -1.0
	for i := range m.n {
		if d := math.Abs(F[i] - t[i]); d > w {
			worst, w = i, d
		}
	}
	dir := "above"
	if F[worst] > t[worst] {
		dir = "below"
	}
	format := func(v *[MaxMonomers]float64) string {
		parts := make([]string, m.n)
		for i := range parts {
			parts[i] = fmt.Sprintf("%.4g", v[i])
		}
		return "[" + strings.Join(parts, ", ") + "]"
	}
	reason := fmt.Sprintf("no feed makes this copolymer: the share of %s cannot go %s about %.4g with these ratios (the closest found: feed %s gives F = %s)",
		monomerName(worst), dir, F[worst], format(fa), format(F))
	if math.IsNaN(w) {
		reason = "no feed makes this copolymer with these ratios"
	}
	return &copoly.InputError{Field: indexName("targetF", worst), Value: targetF[worst], Reason: reason, Err: copoly.ErrUnreachable}
}

// FeedFor is multiFeedFor({r, cross, targetF}) of the JavaScript API: the model of r (and
// cross, usually nil; see [New]) and its [Model.FeedFor].
func FeedFor(r, cross [][]float64, targetF []float64) ([]float64, error) {
	m, err := New(r, cross)
	if err != nil {
		return nil, err
	}
	return m.FeedFor(targetF)
}
