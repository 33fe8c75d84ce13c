package copoly

import (
	"fmt"
	"math"
)

// Sequence holds the sequence statistics of a copolymer.
//
// The terminal model makes the chain a first-order Markov chain in which Pij is the probability
// that a chain ending in Mi adds Mj:
//
//	P11 = r1 f1 / (r1 f1 + f2),  P12 = 1 − P11
//	P22 = r2 f2 / (r2 f2 + f1),  P21 = 1 − P22
//
// Its stationary composition F1 = P21/(P12 + P21) equals the Mayo–Lewis F1.
//
// Dyads are normalised over all neighbouring pairs, with 12 and 21 counted together:
//
//	D11 = F1 P11,  D12 = 2 F1 P12 (= F1 P12 + F2 P21),  D22 = F2 P22
//
// Triads are centred on a monomer, each family summing to 1 (the convention of
// Hauch, Zhou, Duever, Penlidis, Macromol. Symp. 2008, Eq. 1, after Koenig 1980):
//
//	T111 = P11²,  T112 = 2 P11 P12 (112 + 211),  T212 = P12²
//	T222 = P22²,  T221 = 2 P22 P21 (221 + 122),  T121 = P21²
//
// Runs: the number-average run lengths are n̄1 = 1/P12 and n̄2 = 1/P21; the Harwood–Ritchey run
// number R = 200/(n̄1 + n̄2) counts runs per 100 units (100 for strict alternation, 200 F1 F2 for a
// Bernoullian chain, → 0 for blocks); the randomness index B = P12 + P21 (1 Bernoullian,
// 2 alternating, → 0 blocky).
//
// References:
//   - B. D. Coleman, T. G. Fox, J. Polym. Sci. A 1963, 1, 3183 (Markov description of
//     propagation).
//   - J. L. Koenig, Chemical Microstructure of Polymer Chains, Wiley 1980.
//   - H. J. Harwood, W. M. Ritchey, J. Polym. Sci. B 1964, 2, 601 (run number).
//   - R. Yamadera, M. Murano, J. Polym. Sci. A-1 1967, 5, 2259 (randomness index).
type Sequence struct {
	F1                       float64
	P11, P12, P21, P22       float64
	D11, D12, D22            float64
	T111, T112, T212         float64
	T222, T221, T121         float64
	MeanLength1, MeanLength2 float64
	RunNumber, Randomness    float64
}

// transitions returns P11, P12, P21, P22 at feed f1 (see [Sequence]). At f1 = 0 and f1 = 1 the
// probabilities are the limits from inside the interval.
func (m Terminal) transitions(f1 float64) (p11, p12, p21, p22 float64) {
	f2 := 1 - f1
	if d := m.R1*f1 + f2; d > 0 {
		p11 = m.R1 * f1 / d
	} else { // f1 = 1 and r1 = 0: M1 radicals can only add M2, had there been any
		p11 = 0
	}
	if d := m.R2*f2 + f1; d > 0 {
		p22 = m.R2 * f2 / d
	} else {
		p22 = 0
	}
	return p11, 1 - p11, 1 - p22, p22
}

// Sequence returns the sequence statistics of the copolymer formed at feed f1 (low conversion).
// f1 must lie in [0, 1]. At f1 = 0 or 1 with a non-zero ratio the chain is a homopolymer: its
// mean run length is +Inf and its run number 0.
func (m Terminal) Sequence(f1 float64) (Sequence, error) {
	if err := m.Validate(); err != nil {
		return Sequence{}, err
	}
	if err := CheckFraction("f1", f1); err != nil {
		return Sequence{}, err
	}
	return m.sequence(f1), nil
}

func (m Terminal) sequence(f1 float64) Sequence {
	p11, p12, p21, p22 := m.transitions(f1)
	s := Sequence{P11: p11, P12: p12, P21: p21, P22: p22}
	// The stationary composition of the chain; equal to the Mayo–Lewis F1 (tested), and
	// cheaper. The edge f1 = 0 or 1 with a zero ratio (both P12 and P21 of the missing monomer
	// undefined) falls back to the one-sided limit.
	if d := p12 + p21; d > 0 {
		s.F1 = p21 / d
	} else {
		s.F1 = m.Instantaneous(f1)
	}
	F2 := 1 - s.F1
	s.D11 = s.F1 * p11
	s.D22 = F2 * p22
	s.D12 = 1 - s.D11 - s.D22
	s.T111, s.T112, s.T212 = p11*p11, 2*p11*p12, p12*p12
	s.T222, s.T221, s.T121 = p22*p22, 2*p22*p21, p21*p21
	s.MeanLength1, s.MeanLength2 = 1/p12, 1/p21
	s.RunNumber = 100 * s.D12
	s.Randomness = p12 + p21
	return s
}

// batchSteps is the number of conversion slices over which [Batch.Sequence] averages (the
// midpoint rule; the averaged fractions change by less than 1e-6 on doubling it for the cases in
// sequence_test.go).
const batchSteps = 2000

// Sequence returns the sequence statistics of all the polymer made in the batch up to the overall
// molar conversion given, averaging over the composition drift (see [Batch.Drift]) the statistics
// of the model's chain ([Model.Sequence]). Each conversion slice dX contributes dX monomer units
// with the statistics of its instantaneous feed. Dyads, run number and F1 are averages per unit; monomer-centred triads
// are averaged per centre unit of their family (weights F1 dX and F2 dX); the mean run lengths
// are total units over total runs, n̄1 = ∫F1 dX / ∫F1 P12 dX; P11… are the probabilities of the
// averaged chain, P12 = 1/n̄1 and P21 = 1/n̄2; B = P12 + P21. Junctions between chains made at
// different conversions are ignored (long chains). A conversion outside [0, 1], or past
// [Batch.MaxConversion], gives an [*InputError] naming "conversion".
func (b *Batch) Sequence(conversion float64) (Sequence, error) {
	if err := CheckConversion("conversion", conversion); err != nil {
		return Sequence{}, err
	}
	if err := b.checkConversion("conversion", conversion); err != nil {
		return Sequence{}, err
	}
	if conversion == 0 || b.still {
		return b.sequenceAt(b.f10), nil
	}
	xs := make([]float64, batchSteps)
	for i := range xs {
		xs[i] = (float64(i) + 0.5) * conversion / batchSteps
	}
	feeds := make([]float64, batchSteps)
	b.feedAt(feeds, xs)
	var sum Sequence
	var runs1, runs2 float64
	for _, f := range feeds {
		s := b.sequenceAt(f)
		F2 := 1 - s.F1
		sum.F1 += s.F1
		sum.D11 += s.D11
		sum.D12 += s.D12
		sum.D22 += s.D22
		sum.T111 += s.F1 * s.T111
		sum.T112 += s.F1 * s.T112
		sum.T212 += s.F1 * s.T212
		sum.T222 += F2 * s.T222
		sum.T221 += F2 * s.T221
		sum.T121 += F2 * s.T121
		runs1 += s.F1 * s.P12
		runs2 += F2 * s.P21
	}
	n := float64(batchSteps)
	out := Sequence{F1: sum.F1 / n, D11: sum.D11 / n, D12: sum.D12 / n, D22: sum.D22 / n}
	F1sum, F2sum := sum.F1, n-sum.F1
	out.T111, out.T112, out.T212 = sum.T111/F1sum, sum.T112/F1sum, sum.T212/F1sum
	out.T222, out.T221, out.T121 = sum.T222/F2sum, sum.T221/F2sum, sum.T121/F2sum
	out.MeanLength1, out.MeanLength2 = F1sum/runs1, F2sum/runs2
	out.P12, out.P21 = runs1/F1sum, runs2/F2sum
	out.P11, out.P22 = 1-out.P12, 1-out.P21
	out.RunNumber = 100 * out.D12
	out.Randomness = out.P12 + out.P21
	return out, nil
}

// sequenceAt returns the statistics of the chain the batch's model makes at feed f (validated
// with the batch; f is clamped into [0, 1] against rounding).
func (b *Batch) sequenceAt(f float64) Sequence {
	f = math.Min(1, math.Max(0, f))
	if b.model == nil {
		return b.m.sequence(f)
	}
	s, _ := b.model.Sequence(f)
	return s
}

// RunLengths holds run-length (sequence-length) distributions.
type RunLengths struct {
	// Length holds 1, 2, … n.
	Length []int
	// Number1[i] is the number fraction of M1 runs of length Length[i], P11^(n−1) P12; Weight1[i]
	// is the fraction of M1 units in such runs, n P11^(n−1) P12². Likewise for M2.
	Number1, Weight1, Number2, Weight2 []float64
}

// MaxRunLength is the largest run length [Terminal.RunLengths] tabulates.
const MaxRunLength = 1000

// RunLengths returns the number and weight distributions of run lengths 1…maxLength of each
// monomer at feed f1, the geometric distributions of the first-order Markov chain (see
// [Sequence]).
//
// References:
//   - J. L. Koenig, Chemical Microstructure of Polymer Chains, Wiley 1980.
func (m Terminal) RunLengths(f1 float64, maxLength int) (RunLengths, error) {
	if err := m.Validate(); err != nil {
		return RunLengths{}, err
	}
	if err := CheckFraction("f1", f1); err != nil {
		return RunLengths{}, err
	}
	if maxLength < 1 || maxLength > MaxRunLength {
		return RunLengths{}, &InputError{Field: "maxLength", Value: float64(maxLength), Reason: fmt.Sprintf("the longest run tabulated must be between 1 and %d", MaxRunLength), Err: ErrOutOfRange}
	}
	p11, p12, p21, p22 := m.transitions(f1)
	r := RunLengths{
		Length:  make([]int, maxLength),
		Number1: make([]float64, maxLength), Weight1: make([]float64, maxLength),
		Number2: make([]float64, maxLength), Weight2: make([]float64, maxLength),
	}
	for i := range maxLength {
		n := float64(i + 1)
		r.Length[i] = i + 1
		r.Number1[i] = math.Pow(p11, n-1) * p12
		r.Weight1[i] = n * math.Pow(p11, n-1) * p12 * p12
		r.Number2[i] = math.Pow(p22, n-1) * p21
		r.Weight2[i] = n * math.Pow(p22, n-1) * p21 * p21
	}
	return r, nil
}
