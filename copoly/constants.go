package copoly

// MaxRatio is the largest reactivity ratio accepted. Published ratios stay below about 100
// (styrene/vinyl acetate is near 55; common practice, no source); 10⁴ leaves room and keeps the
// arithmetic well away from overflow.
const MaxRatio = 1e4

// MaxPoints is the largest number of values accepted in one input array (feeds, conversions).
// It bounds the time and memory of one call from the page.
const MaxPoints = 100000
