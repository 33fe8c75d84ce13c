package copoly

import "fmt"

// Limits of [Terminal.Chains].
const (
	MaxChains      = 1000
	MaxChainLength = 10000
)

// Chains returns count sample chains of the given length grown at the constant feed f1, each as a
// string of '1' and '2' units: the samples of [SimulateChains] with fixed lengths (each chain
// starts in the stationary state of the chain and follows the transition probabilities of
// [Sequence]). The generator is seeded with seed, so the same arguments always give the same
// chains.
func (m Terminal) Chains(f1 float64, count, length int, seed uint64) ([]string, error) {
	if count < 1 || count > MaxChains {
		return nil, &InputError{Field: "count", Value: float64(count), Reason: fmt.Sprintf("the number of chains must be between 1 and %d", MaxChains), Err: ErrOutOfRange}
	}
	st, err := SimulateChains(ChainOptions{Model: m, F10: f1, Length: length, Count: count, Seed: seed,
		Samples: count, SampleUnits: length})
	if err != nil {
		return nil, err
	}
	return st.Samples, nil
}
