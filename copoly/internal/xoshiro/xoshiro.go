// Package xoshiro is the xoshiro256** pseudorandom generator that copoly's Monte Carlo chain
// growth draws from.
package xoshiro

import "math/bits"

// Source is the xoshiro256** generator of D. Blackman and S. Vigna, "Scrambled linear
// pseudorandom number generators", ACM Trans. Math. Softw. 2021, 47 (4), 36, seeded through
// SplitMix64 as its authors recommend. The Monte Carlo growth draws one number per monomer unit;
// this generator needs only 64-bit shifts, rotations and one multiplication per number, where the
// 128-bit multiplication of PCG costs several 32-bit ones in WebAssembly.
//
// It implements math/rand/v2's Source for the per-chain draws and gives 32-bit uniforms, two
// from each 64-bit output, for the per-unit ones (see [Source.Below32]).
type Source struct {
	s     [4]uint64
	spare uint64 // the unused high half of the last output, valid when haveSpare
	have  bool
}

// New returns a generator seeded from seed through SplitMix64.
func New(seed uint64) *Source {
	x := &Source{}
	for i := range x.s {
		// SplitMix64 (Steele, Lea and Flood, OOPSLA 2014).
		seed += 0x9e3779b97f4a7c15
		z := seed
		z = (z ^ z>>30) * 0xbf58476d1ce4e5b9
		z = (z ^ z>>27) * 0x94d049bb133111eb
		x.s[i] = z ^ z>>31
	}
	return x
}

// Uint64 returns the next 64-bit output.
func (x *Source) Uint64() uint64 {
	s := &x.s
	r := bits.RotateLeft64(s[1]*5, 7) * 9
	t := s[1] << 17
	s[2] ^= s[0]
	s[3] ^= s[1]
	s[1] ^= s[2]
	s[0] ^= s[3]
	s[2] ^= t
	s[3] = bits.RotateLeft64(s[3], 45)
	return r
}

// Below32 draws a uniform 32-bit integer u and reports u < threshold: an event of probability
// threshold/2³² (see [Threshold32]).
func (x *Source) Below32(threshold uint64) bool {
	if x.have {
		x.have = false
		return x.spare < threshold
	}
	v := x.Uint64()
	x.spare, x.have = v>>32, true
	return v&0xffffffff < threshold
}

// Threshold32 is the threshold for [Source.Below32] of an event of probability p in [0, 1]: the nearest
// multiple of 2⁻³², so the probability is off by at most 2⁻³³.
func Threshold32(p float64) uint64 {
	switch {
	case !(p > 0):
		return 0
	case p >= 1:
		return 1 << 32
	}
	return uint64(p*(1<<32) + 0.5)
}
