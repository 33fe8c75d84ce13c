package multi

import (
	"fmt"
	"math"
	"math/rand/v2"

	"copoly/copoly"
	"copoly/copoly/internal/xoshiro"
)

// Limits of [Model.SimulateChains], checked before any work: the number of chains, and the
// expected number of units grown in all (count × dpn), which bounds the time of a call (10⁶
// units take well under 100 ms in the browser).
const (
	MaxChains = 100_000
	MaxUnits  = 20_000_000
	// MaxDPn is the largest number-average degree of polymerization.
	MaxDPn = 100_000
	// MaxSamples and MaxSampleUnits bound the chains returned as strings.
	MaxSamples     = 1000
	MaxSampleUnits = 10_000
)

// chainGrid is the number of conversions at which the growth probabilities of a drifting batch
// are tabulated (a chain born between two of them grows at the nearer one's feed).
const chainGrid = 512

// ChainOptions sets a Monte Carlo simulation of chains (see [Model.SimulateChains]). The
// JavaScript names are in brackets.
type ChainOptions struct {
	// F0 is the starting feed, N mole fractions [f0].
	F0 []float64
	// Conversion is the overall molar conversion the batch is taken to [conversion]; 0 grows
	// every chain at the starting feed.
	Conversion float64
	// DPn is the number-average degree of polymerization of the most-probable (Flory)
	// distribution of chain lengths, 1…MaxDPn [dpn].
	DPn float64
	// Count is the number of chains, 1…MaxChains [count].
	Count int
	// Seed seeds the generator: the same options always give the same chains [seed].
	Seed uint64
	// Functional lists the monomers (indices 0…N−1, each once) whose units are counted per
	// chain [functional]; empty for none.
	Functional []int
	// Samples is the number of chains returned as strings (default 12, at most MaxSamples),
	// each cut at SampleUnits units (default 200, at most MaxSampleUnits).
	Samples, SampleUnits int
}

// ChainStats are the results of [Model.SimulateChains].
type ChainStats struct {
	// Count is the number of chains, Units the number of units grown.
	Count, Units int
	// FunctionalCounts[k] is the number of chains with k functional units (nil without
	// functional monomers).
	FunctionalCounts []int
	// NoneNumber and OneNumber are the number fractions of chains with no functional unit and
	// with exactly one; NoneWeight and OneWeight their weight fractions, weighting each chain
	// by its number of units. Such chains cannot join a crosslinked network (common practice,
	// no source).
	NoneNumber, OneNumber, NoneWeight, OneWeight float64
	// ExpectedNoneNumber, ExpectedOneNumber, ExpectedNoneWeight and ExpectedOneWeight are the
	// same fractions from the chain's transition matrices (see expectedFunctional), averaged
	// over the feeds the chains grew at: what the simulation converges to as Count grows.
	ExpectedNoneNumber, ExpectedOneNumber, ExpectedNoneWeight, ExpectedOneWeight float64
	// Mean and SD are the mean and the standard deviation over chains of each monomer's mole
	// fraction in a chain (the chain-to-chain composition spread; SD is 0 for one chain).
	Mean, SD []float64
	// Dyads is the N×N matrix of ordered dyads counted in the chains (fractions of all
	// neighbouring pairs), and ExpectedDyads the dyads of the model, F_i P_ij, averaged over
	// the feeds the chains grew at.
	Dyads, ExpectedDyads [][]float64
	// Samples are the first chains as strings, one character per unit: '1' for M1 … '6' for M6.
	Samples []string
}

// chainStep holds the growth probabilities at one feed as 32-bit thresholds: start[j] and
// next[i][j] are the cumulative probabilities of the first unit and of the unit after an i unit
// (each row ends at 2³², so a draw below it always picks a unit).
type chainStep struct {
	start [MaxMonomers]uint64
	next  [MaxMonomers][MaxMonomers]uint64
}

func newChainStep(q *Sequence, n int) chainStep {
	var c chainStep
	cum := func(dst *[MaxMonomers]uint64, p []float64) {
		var s float64
		last := 0
		for j := range n {
			s += p[j]
			dst[j] = xoshiro.Threshold32(s)
			if p[j] > 0 {
				last = j
			}
		}
		for j := last; j < MaxMonomers; j++ {
			dst[j] = 1 << 32
		}
	}
	cum(&c.start, q.F)
	for i := range n {
		if q.F[i] > 0 {
			cum(&c.next[i], q.P[i])
		}
	}
	return c
}

// SimulateChains grows chains by Monte Carlo from the model's Markov chain: each chain's first
// unit is drawn from the composition F, each next unit from the row of the transition matrix
// of the unit before (see [Sequence]), one 32-bit uniform per unit compared with cumulative
// thresholds. Lengths are drawn from the most-probable distribution
//
//	P(n) = (1 − q) q^(n−1),   q = 1 − 1/DPn
//
// With a conversion, each chain is born at a conversion drawn uniformly up to it (the number of
// chains formed per unit of conversion is constant when DPn is) and grows at the unreacted feed
// of the batch's drift there (tabulated at 512 conversions). The generator is xoshiro256**
// seeded with Seed, as in copoly's binary simulation.
//
// Errors name "f0", "f0[i]", "conversion" (beyond where polymerization stops, too), "dpn",
// "count" (also when count × dpn exceeds MaxUnits, wrapping copoly.ErrTooMany),
// "functional[k]", "samples" or "sampleUnits"; all are checked before any work.
//
// References:
//   - B. D. Coleman, T. G. Fox, J. Polym. Sci. A 1963, 1, 3183 (propagation as a Markov chain).
//   - P. J. Flory, Principles of Polymer Chemistry, Cornell 1953 (most-probable distribution).
//   - D. Blackman, S. Vigna, ACM Trans. Math. Softw. 2021, 47 (4), 36 (xoshiro256**).
func (m *Model) SimulateChains(opt ChainOptions) (*ChainStats, error) {
	n := m.n
	b, err := m.newBatch("f0", opt.F0)
	if err != nil {
		return nil, err
	}
	if err := copoly.CheckConversion("conversion", opt.Conversion); err != nil {
		return nil, err
	}
	if !(opt.DPn >= 1 && opt.DPn <= MaxDPn) {
		e := &copoly.InputError{Field: "dpn", Value: opt.DPn, Reason: fmt.Sprintf("a number-average degree of polymerization must lie between 1 and %d", MaxDPn), Err: copoly.ErrOutOfRange}
		if math.IsNaN(opt.DPn) || math.IsInf(opt.DPn, 0) {
			e.Reason, e.Err = "must be a finite number", copoly.ErrNotFinite
		}
		return nil, e
	}
	if opt.Count < 1 || opt.Count > MaxChains {
		return nil, &copoly.InputError{Field: "count", Value: float64(opt.Count), Reason: fmt.Sprintf("the number of chains must be between 1 and %d", MaxChains), Err: copoly.ErrOutOfRange}
	}
	if float64(opt.Count)*opt.DPn > MaxUnits {
		return nil, &copoly.InputError{Field: "count", Value: float64(opt.Count), Reason: fmt.Sprintf("count × dpn must stay below %d units", MaxUnits), Err: copoly.ErrTooMany}
	}
	var isFunc [MaxMonomers]int
	if len(opt.Functional) > n {
		return nil, &copoly.InputError{Field: "functional", Value: float64(len(opt.Functional)), Reason: fmt.Sprintf("at most %d monomers", n), Err: copoly.ErrTooMany}
	}
	for k, i := range opt.Functional {
		if i < 0 || i >= n {
			return nil, &copoly.InputError{Field: indexName("functional", k), Value: float64(i), Reason: fmt.Sprintf("a monomer index from 0 to %d", n-1), Err: copoly.ErrOutOfRange}
		}
		if isFunc[i] != 0 {
			return nil, &copoly.InputError{Field: indexName("functional", k), Value: float64(i), Reason: "this monomer is listed twice", Err: copoly.ErrOutOfRange}
		}
		isFunc[i] = 1
	}
	if opt.Samples == 0 {
		opt.Samples = 12
	}
	if opt.SampleUnits == 0 {
		opt.SampleUnits = 200
	}
	if opt.Samples < 0 || opt.Samples > MaxSamples {
		return nil, &copoly.InputError{Field: "samples", Value: float64(opt.Samples), Reason: fmt.Sprintf("between 1 and %d sample chains", MaxSamples), Err: copoly.ErrOutOfRange}
	}
	if opt.SampleUnits < 0 || opt.SampleUnits > MaxSampleUnits {
		return nil, &copoly.InputError{Field: "sampleUnits", Value: float64(opt.SampleUnits), Reason: fmt.Sprintf("between 1 and %d units per sample chain", MaxSampleUnits), Err: copoly.ErrOutOfRange}
	}

	// The feeds the chains grow at.
	var seqs []*Sequence
	if opt.Conversion == 0 {
		if m.closed[b.s0] == 0 {
			return nil, &copoly.InputError{Field: "f0", Value: 1, Reason: b.stopReason(), Err: copoly.ErrOutOfRange}
		}
		seqs = []*Sequence{m.sequence(&b.f0, b.s0)}
	} else {
		xs := make([]float64, chainGrid)
		for k := range xs {
			xs[k] = opt.Conversion * (float64(k) + 0.5) / chainGrid
		}
		d, past, err := b.drift(xs)
		if err != nil {
			return nil, err
		}
		if past < len(xs) || opt.Conversion > d.Stop {
			return nil, &copoly.InputError{Field: "conversion", Value: opt.Conversion, Reason: fmt.Sprintf("this batch stops at X = %.4g: %s", d.Stop, b.stopReason()), Err: copoly.ErrOutOfRange}
		}
		seqs = make([]*Sequence, chainGrid)
		for k := range xs {
			var f [MaxMonomers]float64
			var s uint8
			for i := range n {
				f[i] = d.Feed[k][i]
				if f[i] > 0 {
					s |= 1 << i
				}
			}
			seqs[k] = m.sequence(&f, s)
		}
	}
	steps := make([]chainStep, len(seqs))
	for k, q := range seqs {
		steps[k] = newChainStep(q, n)
	}

	st := &ChainStats{Count: opt.Count, Mean: make([]float64, n), SD: make([]float64, n)}
	m.expectations(st, seqs, opt.DPn, &isFunc, len(opt.Functional) > 0)
	src := xoshiro.New(opt.Seed)
	rng := rand.New(src) // per-chain draws; per-unit ones use src.Uint32
	logq := 0.0
	if opt.DPn > 1 {
		logq = math.Log1p(-1 / opt.DPn)
	}
	var dyads [MaxMonomers * MaxMonomers]int64
	var m2 [MaxMonomers]float64 // Welford sums of squared deviations
	var funCounts []int
	var none, one, noneUnits, oneUnits int
	buf := make([]byte, 0, opt.SampleUnits)
	for c := range opt.Count {
		s := &steps[0]
		if len(steps) > 1 {
			s = &steps[rng.IntN(len(steps))]
		}
		length := 1
		if logq < 0 {
			length = 1 + int(math.Log(1-rng.Float64())/logq)
		}
		var cnt [MaxMonomers]int
		u := uint64(src.Uint32())
		cur := 0
		for u >= s.start[cur] {
			cur++
		}
		cnt[cur]++
		fun := isFunc[cur]
		if c < opt.Samples {
			buf = append(buf[:0], byte('1'+cur))
			for i := 1; i < length; i++ {
				u := uint64(src.Uint32())
				row := &s.next[cur]
				j := 0
				for u >= row[j] {
					j++
				}
				dyads[cur*MaxMonomers+j]++
				cnt[j]++
				fun += isFunc[j]
				cur = j
				if len(buf) < opt.SampleUnits {
					buf = append(buf, byte('1'+j))
				}
			}
			st.Samples = append(st.Samples, string(buf))
		} else {
			for i := 1; i < length; i++ {
				u := uint64(src.Uint32())
				row := &s.next[cur]
				j := 0
				for u >= row[j] {
					j++
				}
				dyads[cur*MaxMonomers+j]++
				cnt[j]++
				fun += isFunc[j]
				cur = j
			}
		}
		st.Units += length
		inv := 1 / float64(length)
		k := float64(c + 1)
		for i := range n {
			x := float64(cnt[i]) * inv
			delta := x - st.Mean[i]
			st.Mean[i] += delta / k
			m2[i] += delta * (x - st.Mean[i])
		}
		if len(opt.Functional) > 0 {
			for len(funCounts) <= fun {
				funCounts = append(funCounts, 0)
			}
			funCounts[fun]++
			switch fun {
			case 0:
				none++
				noneUnits += length
			case 1:
				one++
				oneUnits += length
			}
		}
	}
	if opt.Count > 1 {
		for i := range n {
			st.SD[i] = math.Sqrt(m2[i] / float64(opt.Count-1))
		}
	}
	if len(opt.Functional) > 0 {
		st.FunctionalCounts = funCounts
		st.NoneNumber = float64(none) / float64(opt.Count)
		st.OneNumber = float64(one) / float64(opt.Count)
		st.NoneWeight = float64(noneUnits) / float64(st.Units)
		st.OneWeight = float64(oneUnits) / float64(st.Units)
	}
	var total int64
	for _, v := range dyads {
		total += v
	}
	st.Dyads = make([][]float64, n)
	for i := range n {
		st.Dyads[i] = make([]float64, n)
		for j := range n {
			if total > 0 {
				st.Dyads[i][j] = float64(dyads[i*MaxMonomers+j]) / float64(total)
			}
		}
	}
	return st, nil
}

// expectations sets the Expected… fields of st: the dyads and, with functional monomers, the
// fractions of chains without and with one functional unit, each averaged over the feeds the
// chains grow at (every chain is equally likely to be born at each, and the mean length is the
// same at each).
//
// At one feed let s be the composition (the distribution of the first unit), split into s_N
// over the monomers that are not functional and s_F over those that are, and Q, B, C the blocks
// N→N, N→F, F→N of the transition matrix. A chain of n units has n − 1 transitions and
// probability (1 − q) q^(n−1) (q = 1 − 1/DPn), so summing the geometric series of matrix powers
// with G = (I − qQ)⁻¹:
//
//	none:  N0 = (1 − q) s_N G 1                          W0 = (1 − q)² s_N G² 1
//	one:   N1 = (1 − q) A·b,  A = s_F + q s_N G B,  b = 1 + q C G 1
//	       W1 = (1 − q)² [A·b + q (s_N G² B·b + A·C G² 1)]
//
// where the weight fractions W (chains weighted by their number of units n) come from
// Σ n x^(n−1) = d/dx Σ x^n, and d G/dq = G Q G, so that d(qG)/dq = G². For a Bernoullian chain
// (Q = (1 − φ) in every row, one functional fraction φ) N0 reduces to
// (1 − q)(1 − φ)/(1 − q(1 − φ)).
func (m *Model) expectations(st *ChainStats, seqs []*Sequence, dpn float64, isFunc *[MaxMonomers]int, functional bool) {
	n := m.n
	q := 1 - 1/dpn
	st.ExpectedDyads = make([][]float64, n)
	for i := range n {
		st.ExpectedDyads[i] = make([]float64, n)
	}
	var n0, n1, w0, w1 float64
	for _, sq := range seqs {
		for i := range n {
			for j := range n {
				st.ExpectedDyads[i][j] += sq.Dyads[i][j] / float64(len(seqs))
			}
		}
		if !functional {
			continue
		}
		var nf, fu []int
		for i := range n {
			if isFunc[i] != 0 {
				fu = append(fu, i)
			} else {
				nf = append(nf, i)
			}
		}
		k := len(nf)
		// (I − qQ) over the non-functional monomers, and its transpose.
		var a, at [MaxMonomers][MaxMonomers]float64
		for r, i := range nf {
			for c, j := range nf {
				v := -q * sq.P[i][j]
				if r == c {
					v += 1
				}
				a[r][c], at[c][r] = v, v
			}
		}
		solveVec := func(mat *[MaxMonomers][MaxMonomers]float64, rhs [MaxMonomers]float64) [MaxMonomers]float64 {
			cp := *mat
			x, _ := solve(&cp, &rhs, k)
			return x
		}
		var ones, sN [MaxMonomers]float64
		for r, i := range nf {
			ones[r] = 1
			sN[r] = sq.F[i]
		}
		g1 := solveVec(&a, ones) // G 1
		g2 := solveVec(&a, g1)   // G² 1
		sG := solveVec(&at, sN)  // (s_N G)ᵀ
		sG2 := solveVec(&at, sG) // (s_N G²)ᵀ
		var e0, f0 float64
		for r := range k {
			e0 += sN[r] * g1[r]
			f0 += sN[r] * g2[r]
		}
		n0 += (1 - q) * e0
		w0 += (1 - q) * (1 - q) * f0
		var e1, f1 float64
		for _, fi := range fu {
			A, dA := sq.F[fi], 0.0
			bv, dB := 1.0, 0.0
			for r, j := range nf {
				A += q * sG[r] * sq.P[j][fi]
				dA += sG2[r] * sq.P[j][fi]
				bv += q * sq.P[fi][j] * g1[r]
				dB += sq.P[fi][j] * g2[r]
			}
			e1 += A * bv
			f1 += A*bv + q*(dA*bv+A*dB)
		}
		n1 += (1 - q) * e1
		w1 += (1 - q) * (1 - q) * f1
	}
	if functional {
		c := float64(len(seqs))
		st.ExpectedNoneNumber, st.ExpectedOneNumber = n0/c, n1/c
		st.ExpectedNoneWeight, st.ExpectedOneWeight = w0/c, w1/c
	}
}

// SimulateChains is multiChains({r, cross, f0, conversion, dpn, count, seed, functional}) of
// the JavaScript API: the model of r (and cross, usually nil; see [New]) and its
// [Model.SimulateChains].
func SimulateChains(r, cross [][]float64, opt ChainOptions) (*ChainStats, error) {
	m, err := New(r, cross)
	if err != nil {
		return nil, err
	}
	return m.SimulateChains(opt)
}
