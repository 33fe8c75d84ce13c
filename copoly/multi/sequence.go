package multi

import "math"

// Sequence holds the sequence statistics of the copolymer formed from one feed. The terminal
// model makes the chain a first-order Markov chain: P[i][j] is the probability that the unit
// after an i unit is a j unit (see [Model.Composition]), and F its stationary distribution.
//
// Dyads are ordered pairs of neighbouring units, normalized over all pairs:
//
//	D_ij = F_i P_ij,   Σ_ij D_ij = 1   (D_ij + D_ji is the unordered dyad ij)
//
// A run of i is a maximal stretch of i units. Its length is geometric, with a run continuing
// with probability P_ii, so the number-average run length is
//
//	n̄_i = 1 / (1 − P_ii)
//
// An i unit stands alone when neither neighbour is an i unit. The unit after it is not i with
// probability 1 − P_ii. The unit before it is not i with probability Σ_{j≠i} D_ji / F_i =
// (F_i − D_ii)/F_i = 1 − P_ii as well, since in the stationary chain Σ_j D_ji = F_i (each i unit
// is the second unit of one dyad). Given the unit itself, what precedes and what follows are
// independent (the Markov property), so
//
//	isolated fraction of i = (1 − P_ii)²
//
// The number of runs per 100 units counts the places where the next unit differs from the
// current one:
//
//	R = 100 Σ_i F_i (1 − P_ii) = 100 (1 − Σ_i D_ii)
//
// which for two monomers is the Harwood–Ritchey run number 200/(n̄1 + n̄2).
//
// References:
//   - B. D. Coleman, T. G. Fox, J. Polym. Sci. A 1963, 1, 3183 (propagation as a Markov chain).
//   - H. J. Harwood, W. M. Ritchey, J. Polym. Sci. B 1964, 2, 601 (run number).
type Sequence struct {
	// F is the composition of the copolymer, N mole fractions.
	F []float64
	// P is the N×N matrix of transition probabilities; the row of a monomer that does not
	// enter the copolymer is 0.
	P [][]float64
	// Dyads is the N×N matrix of ordered dyad fractions D_ij.
	Dyads [][]float64
	// MeanRun is the number-average run length of each monomer: 0 for a monomer that does not
	// enter the copolymer, +Inf for a homopolymer.
	MeanRun []float64
	// Isolated is the fraction of each monomer's units that stand alone (0 for a monomer that
	// does not enter the copolymer).
	Isolated []float64
	// Runs is the number of runs per 100 units.
	Runs float64
}

// Sequence returns the sequence statistics of the copolymer formed from the feed f (see
// [Sequence]). When no polymer forms every value is NaN. An invalid feed gives an error naming
// "f" or "f[i]".
func (m *Model) Sequence(f []float64) (*Sequence, error) {
	sum, err := m.checkFeed("f", f)
	if err != nil {
		return nil, err
	}
	var fa [MaxMonomers]float64
	s := load(&fa, f, sum)
	return m.sequence(&fa, s), nil
}

func (m *Model) sequence(f *[MaxMonomers]float64, s uint8) *Sequence {
	n := m.n
	flat := make([]float64, 2*n*n+3*n)
	q := &Sequence{F: flat[:n:n], MeanRun: flat[n : 2*n : 2*n], Isolated: flat[2*n : 3*n : 3*n],
		P: make([][]float64, n), Dyads: make([][]float64, n)}
	rest := flat[3*n:]
	for i := range n {
		q.P[i] = rest[i*n : (i+1)*n : (i+1)*n]
		q.Dyads[i] = rest[n*n+i*n : n*n+(i+1)*n : n*n+(i+1)*n]
	}
	var c chain
	if !m.build(&c, f, s) {
		for i := range flat {
			flat[i] = math.NaN()
		}
		q.Runs = math.NaN()
		return q
	}
	c.stationary()
	copy(q.F, c.pi[:n])
	for a := range c.n {
		for b := range c.n {
			q.P[c.idx[a]][c.idx[b]] = c.p[a][b]
		}
	}
	var same float64
	for i := range n {
		for j := range n {
			q.Dyads[i][j] = q.F[i] * q.P[i][j]
		}
		same += q.Dyads[i][i]
		if q.F[i] == 0 {
			continue
		}
		// 1 − P_ii as the sum of the other transitions (no cancellation).
		var out float64
		for j := range n {
			if j != i {
				out += q.P[i][j]
			}
		}
		q.MeanRun[i] = 1 / out
		q.Isolated[i] = out * out
	}
	q.Runs = 100 * (1 - same)
	return q
}
