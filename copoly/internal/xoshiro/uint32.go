package xoshiro

// Uint32 returns a uniform 32-bit number: one half of a 64-bit output, the other half kept for
// the next call, as [Source.Below32] does (the two share the spare half). A choice among several
// outcomes compares it with cumulative thresholds made by [Threshold32].
func (x *Source) Uint32() uint32 {
	if x.have {
		x.have = false
		return uint32(x.spare)
	}
	v := x.Uint64()
	x.spare, x.have = v>>32, true
	return uint32(v)
}
