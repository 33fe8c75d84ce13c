package copoly

import (
	"fmt"
	"math/rand/v2"
)

// Limits of [Terminal.Chains].
const (
	MaxChains      = 1000
	MaxChainLength = 10000
)

// Chains returns count sample chains of the given length grown at the constant feed f1, each as a
// string of '1' and '2' units. The first unit is M1 with probability F1 (the stationary start);
// each further unit follows the transition probabilities of [Sequence]. The generator is a PCG
// seeded with seed, so the same arguments always give the same chains.
//
// References:
//   - B. D. Coleman, T. G. Fox, J. Polym. Sci. A 1963, 1, 3183 (propagation as a Markov process).
func (m Terminal) Chains(f1 float64, count, length int, seed uint64) ([]string, error) {
	if err := m.Validate(); err != nil {
		return nil, err
	}
	if err := CheckFraction("f10", f1); err != nil {
		return nil, err
	}
	if count < 1 || count > MaxChains {
		return nil, &InputError{Field: "count", Value: float64(count), Reason: fmt.Sprintf("the number of chains must be between 1 and %d", MaxChains), Err: ErrOutOfRange}
	}
	if length < 1 || length > MaxChainLength {
		return nil, &InputError{Field: "length", Value: float64(length), Reason: fmt.Sprintf("the chain length must be between 1 and %d", MaxChainLength), Err: ErrOutOfRange}
	}
	rng := rand.New(rand.NewPCG(seed, 0x636f706f6c79)) // second word: "copoly" in ASCII
	p11, _, p21, _ := m.transitions(f1)
	F1 := m.Instantaneous(f1)
	out := make([]string, count)
	buf := make([]byte, length)
	for c := range out {
		one := rng.Float64() < F1
		for i := range buf {
			if i > 0 {
				if one {
					one = rng.Float64() < p11
				} else {
					one = rng.Float64() < p21
				}
			}
			if one {
				buf[i] = '1'
			} else {
				buf[i] = '2'
			}
		}
		out[c] = string(buf)
	}
	return out, nil
}
