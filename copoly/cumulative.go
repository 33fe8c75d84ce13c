package copoly

import "math"

// Cumulative returns the cumulative copolymer composition F̄1 of a batch started from feed f10
// at overall molar conversion x, from the integrated terminal model (see [Terminal.Drift]); at
// x = 0 it is the instantaneous F1(f10). A conversion past the largest reachable one (r = 0, see
// [Terminal.Drift]) is clamped to it. Inputs are not validated: this is the model function of the
// estimators, called many times.
func (m Terminal) Cumulative(f10, x float64) float64 {
	var s float64
	return m.CumulativeFrom(f10, x, &s)
}

// CumulativeFrom is [Terminal.Cumulative] with a warm start for the Meyer–Lowry inversion: *s
// holds the solution of a nearby call (0 for none) and receives this call's. The estimators of
// copoly/fit call it many times at nearby ratios.
func (m Terminal) CumulativeFrom(f10, x float64, s *float64) float64 {
	if x <= 0 {
		return m.Instantaneous(f10)
	}
	b, err := newBatch(m, f10)
	if err != nil {
		return math.NaN()
	}
	if b.still {
		return m.Instantaneous(f10)
	}
	x = math.Min(x, b.xmax)
	if x >= 1 {
		return f10
	}
	if b.closed {
		f, sn := b.closedFeedFrom(x, *s)
		*s = sn
		return b.cumulative(x, f)
	}
	var f [1]float64
	b.feedAt(f[:], []float64{x})
	return b.cumulative(x, f[0])
}
