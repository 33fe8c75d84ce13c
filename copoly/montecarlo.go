package copoly

import (
	"fmt"
	"math"
	"math/rand/v2"

	"copoly/copoly/internal/xoshiro"
)

// ChainOptions sets a Monte Carlo simulation of chains (see [SimulateChains]).
type ChainOptions struct {
	// Model is a [Terminal], [Penultimate] or [Implicit] model.
	Model Model
	// F10 is the feed at the start; Conversion the overall molar conversion the batch is taken
	// to (0: chains grown at the constant feed F10).
	F10, Conversion float64
	// DPn is the number-average degree of polymerization of a most-probable (Flory)
	// distribution of chain lengths; 0 selects the fixed Length.
	DPn    float64
	Length int
	// Count is the number of chains; Seed seeds the generator (the same options always give the
	// same chains).
	Count int
	Seed  uint64
	// Functional is the functional monomer whose units per chain are counted: 1, 2, or 0 for
	// none.
	Functional int
	// Samples is the number of chains returned as strings (default 12), each cut at
	// SampleUnits units (default 200).
	Samples, SampleUnits int
	// Bins, when above 0, asks for the histogram of the chain compositions on that many bins
	// ([ChainStats.Histogram]) and, for a [Terminal] model at a constant feed with a DPn,
	// Stockmayer's distribution on the same bins ([Terminal.Stockmayer]).
	Bins int
}

// Limits of [SimulateChains]: chains, units grown in all (which bounds the time of a call), and
// the number-average degree of polymerization of a most-probable distribution (also of
// [Terminal.Stockmayer]).
const (
	MaxSimChains = 100000
	MaxSimUnits  = 20_000_000
	MaxDPn       = 100000
)

// ChainStats are the results of [SimulateChains].
type ChainStats struct {
	// Compositions holds the mole fraction of M1 of each chain, Lengths its number of units.
	Compositions []float64
	Lengths      []int
	// FunctionalCounts[k] is the number of chains with k units of the functional monomer (empty
	// without one); NonFunctional is the fraction of chains with none.
	FunctionalCounts []int
	NonFunctional    float64
	// Samples are the first chains as strings of '1' and '2'.
	Samples []string
	// Units is the number of units grown.
	Units int
	// Mean and Variance are the number-average chain composition and its variance over chains;
	// WeightMean the mass-free weight (unit-count) average.
	Mean, Variance, WeightMean float64
	// StockmayerVariance is the variance of chain composition the terminal model predicts at a
	// constant feed for chains of the lengths drawn: F1 F2 κ ⟨1/n⟩ with
	// κ = √(1 − 4 F1 F2 (1 − r1 r2)) (Stockmayer 1945). NaN with drift or another model.
	StockmayerVariance float64
	// ExpectedNonFunctional is the analytic fraction of chains without a functional unit at a
	// constant feed, terminal model: F P^(n−1) for fixed n, F(1 − p)/(1 − p P) over a Flory
	// distribution with p = 1 − 1/DPn, where F and P are the composition and the
	// self-propagation probability of the other monomer. NaN with drift or another model.
	ExpectedNonFunctional float64
	// Composition is the histogram of the chain compositions, each chain weighted by its units,
	// on [ChainOptions.Bins] bins; its Edges are nil when no bins were asked for.
	Composition Histogram
	// Stockmayer holds Stockmayer's weight fractions on the bins of Composition for a terminal
	// model at a constant feed with a DPn; nil otherwise.
	Stockmayer []float64
}

// chainStep holds the growth probabilities at one feed: the stationary dyad states (11, 12, 21,
// 22), F1, and the probabilities of adding M1 after each pair of last units.
type chainStep struct {
	pi       [4]float64
	F1       float64
	add1     [4]float64 // after 11, 12, 21, 22
	add1Once [2]float64 // after a single unit 1 or 2 (chains of length 2 start from F1 then this)
	// add1Below are add1 as thresholds for xoshiro.Source.Below32.
	add1Below [4]uint64
}

func newChainStep(p Penultimate, f float64) chainStep {
	var c chainStep
	p111, p211, p222, p122 := p.transitions(f)
	c.add1 = [4]float64{p111, 1 - p122, p211, 1 - p222}
	for i, p := range c.add1 {
		c.add1Below[i] = xoshiro.Threshold32(p)
	}
	s, err := p.Sequence(f)
	if err != nil {
		return c
	}
	c.F1 = s.F1
	// Stationary states of the last two units: 11 = D11, 12 = 21 = D12/2, 22 = D22.
	c.pi = [4]float64{s.D11, s.D12 / 2, s.D12 / 2, s.D22}
	c.add1Once = [2]float64{s.P11, s.P21}
	return c
}

// SimulateChains grows chains by Monte Carlo from a terminal or penultimate model: each chain
// starts in the stationary state of the chain at its feed and adds units with the model's
// probabilities (a first- or second-order Markov chain). Lengths are fixed or drawn from the
// most-probable distribution P(n) = (1 − p) p^(n−1), p = 1 − 1/DPn. With a conversion, each
// chain is born at a conversion drawn uniformly up to it (the number of chains formed per unit of
// conversion is constant when DPn is) and grows at the feed of the batch's drift there.
//
// References:
//   - B. D. Coleman, T. G. Fox, J. Polym. Sci. A 1963, 1, 3183 (propagation as a Markov chain).
//   - P. J. Flory, Principles of Polymer Chemistry, Cornell 1953 (most-probable distribution).
//   - W. H. Stockmayer, J. Chem. Phys. 1945, 13, 199 (chain-to-chain composition; from memory).
func SimulateChains(opt ChainOptions) (*ChainStats, error) {
	if opt.Model == nil {
		return nil, &FieldError{Field: "model", Reason: "no model given", Err: ErrOutOfRange}
	}
	if err := opt.Model.Validate(); err != nil {
		return nil, err
	}
	if err := CheckFraction("f10", opt.F10); err != nil {
		return nil, err
	}
	if err := CheckConversion("conversion", opt.Conversion); err != nil {
		return nil, err
	}
	if err := CheckFinite("dpn", opt.DPn); err != nil {
		return nil, err
	}
	if opt.DPn != 0 && (opt.DPn < 1 || opt.DPn > MaxDPn) {
		return nil, &InputError{Field: "dpn", Value: opt.DPn, Reason: fmt.Sprintf("a number-average degree of polymerization must lie between 1 and %d", MaxDPn), Err: ErrOutOfRange}
	}
	if opt.DPn == 0 && (opt.Length < 1 || opt.Length > MaxChainLength) {
		return nil, &InputError{Field: "length", Value: float64(opt.Length), Reason: fmt.Sprintf("give a chain length between 1 and %d, or a dpn", MaxChainLength), Err: ErrOutOfRange}
	}
	if opt.Count < 1 || opt.Count > MaxSimChains {
		return nil, &InputError{Field: "count", Value: float64(opt.Count), Reason: fmt.Sprintf("the number of chains must be between 1 and %d", MaxSimChains), Err: ErrOutOfRange}
	}
	mean := opt.DPn
	if mean == 0 {
		mean = float64(opt.Length)
	}
	if float64(opt.Count)*mean > MaxSimUnits {
		return nil, &InputError{Field: "count", Value: float64(opt.Count), Reason: fmt.Sprintf("count × chain length must stay below %d units", MaxSimUnits), Err: ErrTooMany}
	}
	if opt.Functional < 0 || opt.Functional > 2 {
		return nil, &InputError{Field: "functional", Value: float64(opt.Functional), Reason: "the functional monomer is 1 or 2 (0 for none)", Err: ErrOutOfRange}
	}
	if opt.Samples == 0 {
		opt.Samples = 12
	}
	if opt.SampleUnits == 0 {
		opt.SampleUnits = 200
	}
	if opt.Samples < 0 || opt.Samples > 1000 || opt.SampleUnits < 1 || opt.SampleUnits > 10000 {
		return nil, &InputError{Field: "samples", Value: float64(opt.Samples), Reason: "at most 1000 sample chains of at most 10000 units", Err: ErrOutOfRange}
	}
	if opt.Bins < 0 || opt.Bins > MaxBins {
		return nil, &InputError{Field: "bins", Value: float64(opt.Bins), Reason: fmt.Sprintf("the number of bins must be between 1 and %d", MaxBins), Err: ErrOutOfRange}
	}
	var pm Penultimate
	switch m := opt.Model.(type) {
	case Terminal:
		pm = Penultimate{m.R1, m.R1, m.R2, m.R2}
	case Penultimate:
		pm = m
	case Implicit:
		pm = m.Penultimate()
	default:
		return nil, &FieldError{Field: "model", Reason: "unknown model", Err: ErrOutOfRange}
	}
	// Growth probabilities along the drift, on a grid of conversions.
	const grid = 512
	steps := make([]chainStep, 1)
	steps[0] = newChainStep(pm, opt.F10)
	if opt.Conversion > 0 {
		xs := make([]float64, grid)
		for i := range xs {
			xs[i] = opt.Conversion * (float64(i) + 0.5) / grid
		}
		b, err := NewBatch(opt.Model, opt.F10)
		if err != nil {
			return nil, err
		}
		if opt.Conversion > b.xmax {
			return nil, &InputError{Field: "conversion", Value: opt.Conversion, Reason: fmt.Sprintf("polymerization stops at X = %.4g: a monomer is used up and the other cannot add to its own radical", b.xmax), Err: ErrOutOfRange}
		}
		feeds := make([]float64, grid)
		b.feedAt(feeds, xs)
		steps = make([]chainStep, grid)
		for i, f := range feeds {
			steps[i] = newChainStep(pm, math.Min(1, math.Max(0, f)))
		}
	}
	src := xoshiro.New(opt.Seed)
	rng := rand.New(src) // per-chain draws; per-unit ones use src.Below32
	st := &ChainStats{Compositions: make([]float64, opt.Count), Lengths: make([]int, opt.Count),
		StockmayerVariance: math.NaN(), ExpectedNonFunctional: math.NaN()}
	logp := 0.0
	if opt.DPn > 1 {
		logp = math.Log(1 - 1/opt.DPn)
	}
	counts := map[int]int{}
	maxCount := 0
	buf := make([]byte, 0, opt.SampleUnits)
	var invLen, units1 float64
	for c := range opt.Count {
		s := &steps[0]
		if len(steps) > 1 {
			s = &steps[rng.IntN(len(steps))]
		}
		n := opt.Length
		if opt.DPn > 0 {
			n = 1
			if logp < 0 {
				n = 1 + int(math.Log(1-rng.Float64())/logp)
			}
		}
		sample := c < opt.Samples
		if sample {
			buf = buf[:0]
		}
		// First unit from F1; second from the first-order probability after it; then the
		// second-order chain. (For n ≥ 2 the first pair is drawn from the stationary dyads.)
		var ones, fun int
		var last2 int // state index 0..3 for 11, 12, 21, 22
		var prev byte
		for i := range n {
			var one bool
			switch i {
			case 0:
				if n >= 2 {
					u := rng.Float64()
					switch {
					case u < s.pi[0]:
						last2 = 0
					case u < s.pi[0]+s.pi[1]:
						last2 = 1
					case u < s.pi[0]+s.pi[1]+s.pi[2]:
						last2 = 2
					default:
						last2 = 3
					}
					one = last2 < 2 // first unit of the pair
				} else {
					one = rng.Float64() < s.F1
				}
			case 1:
				one = last2 == 0 || last2 == 2 // second unit of the pair
			default:
				one = src.Below32(s.add1Below[last2])
				j := 1
				if one {
					j = 0
				}
				// new state: (previous unit, this unit)
				if prev == '1' {
					last2 = j
				} else {
					last2 = 2 + j
				}
			}
			u := byte('2')
			if one {
				u = '1'
				ones++
			}
			if (opt.Functional == 1 && one) || (opt.Functional == 2 && !one) {
				fun++
			}
			prev = u
			if sample && i < opt.SampleUnits {
				buf = append(buf, u)
			}
		}
		if sample {
			st.Samples = append(st.Samples, string(buf))
		}
		st.Lengths[c] = n
		st.Compositions[c] = float64(ones) / float64(n)
		st.Units += n
		units1 += float64(ones)
		invLen += 1 / float64(n)
		if opt.Functional != 0 {
			counts[fun]++
			maxCount = max(maxCount, fun)
		}
	}
	var sum, sq float64
	for _, v := range st.Compositions {
		sum += v
	}
	st.Mean = sum / float64(opt.Count)
	for _, v := range st.Compositions {
		sq += (v - st.Mean) * (v - st.Mean)
	}
	if opt.Count > 1 {
		st.Variance = sq / float64(opt.Count-1)
	}
	st.WeightMean = units1 / float64(st.Units)
	if opt.Functional != 0 {
		st.FunctionalCounts = make([]int, maxCount+1)
		for k, v := range counts {
			st.FunctionalCounts[k] = v
		}
		st.NonFunctional = float64(st.FunctionalCounts[0]) / float64(opt.Count)
	}
	if t, ok := opt.Model.(Terminal); ok && opt.Conversion == 0 {
		F1 := t.Instantaneous(opt.F10)
		kappa := math.Sqrt(1 - 4*F1*(1-F1)*(1-t.R1*t.R2))
		st.StockmayerVariance = F1 * (1 - F1) * kappa * invLen / float64(opt.Count)
		if opt.Functional != 0 {
			p11, _, _, p22 := t.transitions(opt.F10)
			F, P := F1, p11 // the other monomer is M1 when M2 is functional
			if opt.Functional == 1 {
				F, P = 1-F1, p22
			}
			if opt.DPn > 0 {
				p := 1 - 1/opt.DPn
				st.ExpectedNonFunctional = F * (1 - p) / (1 - p*P)
			} else {
				st.ExpectedNonFunctional = F * math.Pow(P, float64(opt.Length-1))
			}
		}
	}
	if opt.Bins > 0 {
		h, err := st.Histogram(opt.Bins)
		if err != nil {
			return nil, err
		}
		st.Composition = h
		if t, ok := opt.Model.(Terminal); ok && opt.DPn > 0 && opt.Conversion == 0 {
			if st.Stockmayer, err = t.Stockmayer(opt.F10, opt.DPn, h.Edges); err != nil {
				return nil, err
			}
		}
	}
	return st, nil
}

// Stockmayer returns the weight fraction of chains whose composition falls in each bin of edges
// for a terminal copolymer made at the constant feed f1 with a most-probable distribution of
// number-average degree of polymerization dpn (Stockmayer's bivariate distribution):
//
//	W(n, y) = n (1 − p)² p^(n−1) · N(y; 0, F1 F2 κ/n),  y = F − F1,  κ = √(1 − 4 F1 F2 (1 − r1 r2))
//
// summed over n (Gaussian in y for each length; the composition's continuous approximation).
//
// References:
//   - W. H. Stockmayer, J. Chem. Phys. 1945, 13, 199 (from memory).
func (m Terminal) Stockmayer(f1, dpn float64, edges []float64) ([]float64, error) {
	if err := m.Validate(); err != nil {
		return nil, err
	}
	if err := CheckFraction("f1", f1); err != nil {
		return nil, err
	}
	if !(dpn >= 1 && dpn <= MaxDPn) {
		return nil, &InputError{Field: "dpn", Value: dpn, Reason: fmt.Sprintf("between 1 and %d", MaxDPn), Err: ErrOutOfRange}
	}
	if len(edges) < 2 || len(edges) > MaxBins+1 {
		return nil, &InputError{Field: "edges", Value: float64(len(edges)), Reason: fmt.Sprintf("between 2 and %d bin edges", MaxBins+1), Err: ErrOutOfRange}
	}
	for i := 1; i < len(edges); i++ {
		if !(edges[i] > edges[i-1]) {
			return nil, &InputError{Field: fmt.Sprintf("edges[%d]", i), Value: edges[i], Reason: "bin edges must increase", Err: ErrOutOfRange}
		}
	}
	F1 := m.Instantaneous(f1)
	v := F1 * (1 - F1) * math.Sqrt(1-4*F1*(1-F1)*(1-m.R1*m.R2))
	p := 1 - 1/dpn
	out := make([]float64, len(edges)-1)
	nmax := int(math.Max(50, 40*dpn))
	w := (1 - p) * (1 - p) // n (1 − p)² p^(n−1), n = 1
	for n := 1; n <= nmax; n++ {
		wn := float64(n) * w
		w *= p
		if wn < 1e-14 && n > int(dpn) {
			break
		}
		sd := math.Sqrt(v / float64(n))
		for i := range out {
			if sd == 0 {
				if F1 >= edges[i] && F1 < edges[i+1] {
					out[i] += wn
				}
				continue
			}
			a := (edges[i] - F1) / (sd * math.Sqrt2)
			b := (edges[i+1] - F1) / (sd * math.Sqrt2)
			out[i] += wn * 0.5 * (math.Erf(b) - math.Erf(a))
		}
		if dpn == 1 {
			break
		}
	}
	return out, nil
}

// Histogram returns the chain-composition distribution of the simulated chains, each chain
// weighted by its number of units (a weight distribution, comparable with [Terminal.Stockmayer]),
// over bins equal bins spanning the compositions found (at least 0.01 wide).
func (st *ChainStats) Histogram(bins int) (Histogram, error) {
	if bins < 1 || bins > MaxBins {
		return Histogram{}, &InputError{Field: "bins", Value: float64(bins), Reason: fmt.Sprintf("the number of bins must be between 1 and %d", MaxBins), Err: ErrOutOfRange}
	}
	if len(st.Compositions) == 0 {
		return Histogram{}, &FieldError{Field: "count", Reason: "no chains", Err: ErrOutOfRange}
	}
	w := make([]float64, len(st.Lengths))
	for i, n := range st.Lengths {
		w[i] = float64(n)
	}
	return binned(st.Compositions, w, bins, "units"), nil
}
