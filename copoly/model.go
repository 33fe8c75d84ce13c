package copoly

// Model is a copolymerization model: it gives the instantaneous copolymer composition of a
// feed. [Terminal], [Penultimate] and [Implicit] implement it.
type Model interface {
	// Validate reports invalid parameters as an [*InputError] naming them.
	Validate() error
	// Instantaneous returns F1 at feed f1 (0 ≤ f1 ≤ 1).
	Instantaneous(f1 float64) float64
	// Sequence returns the sequence statistics of the copolymer formed at feed f1 (low
	// conversion): the model's Markov chain (first order for [Terminal], second order for
	// [Penultimate] and [Implicit]).
	Sequence(f1 float64) (Sequence, error)
}
