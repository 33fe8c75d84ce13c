package multi

import (
	"errors"
	"math"

	"copoly/copoly"
	"copoly/copoly/internal/ode"
)

// The integration of a batch (see [Model.Drift]).
const (
	// driftRTol and driftATol are the tolerances of the Dormand–Prince steps on the state
	// (ln f_i, or f_i for a monomer that can run out at a finite conversion).
	driftRTol = 1e-12
	driftATol = 1e-13
	// limitT is the largest t = −ln(1 − X) integrated when the limit X → 1 is asked for
	// (1 − X = e^(−100) ≈ 4e-44), unless the unreacted monomer stops changing before.
	limitT = 100
	// limitChange is the largest |f_i − F_i| (the rate of change of f in t) at which the
	// unreacted monomer counts as settled for the limit X → 1.
	limitChange = 1e-14
	// stepLimit bounds the steps of one batch (about 50 ms in the browser at N = 6).
	stepLimit = 200_000
)

// ExhaustedFraction is the mole fraction below which a monomer counts as used up in
// [Drift.Exhausted] (the binary drift's threshold; common practice, no source).
const ExhaustedFraction = 1e-6

// ErrNoConvergence reports an integration that did not reach the requested conversion within
// its step limit. It should not happen for valid input; the result is withheld rather than
// shown inaccurate.
var ErrNoConvergence = errors.New("multi: the batch could not be integrated to the requested conversion")

// Exhaustion reports a monomer used up during a batch.
type Exhaustion struct {
	// Monomer is the index of the monomer (0 for M1).
	Monomer int
	// Conversion is the overall molar conversion at which the monomer's share of the unreacted
	// mixture falls below ExhaustedFraction.
	Conversion float64
}

// batch integrates Skeist's balance for N monomers from one feed. The state holds ln f_i for a
// monomer whose consumption is proportional to its fraction (it decays exponentially in t and
// never reaches 0, so its logarithm moves at a bounded rate and keeps every digit however small
// it gets), and f_i itself for a monomer that some radical takes at once (a zero ratio): that
// one is consumed at a finite rate down to its last molecule and reaches 0 at a finite t, where
// it leaves the state (an event) and the others carry on.
type batch struct {
	m      *Model
	n      int
	f0     [MaxMonomers]float64
	s0     uint8 // monomers in the starting feed
	active uint8 // monomers not used up
	st     *ode.Stepper
	z      []float64
	// stopped is true when polymerization has stopped: the one monomer left does not add to its
	// own radical. stopT is the t at which it stopped.
	stopped  bool
	stopT    float64
	exh      []Exhaustion
	reported uint8
}

// newBatch validates the starting feed (named field) and sets up the integration.
func (m *Model) newBatch(field string, f0 []float64) (*batch, error) {
	sum, err := m.checkFeed(field, f0)
	if err != nil {
		return nil, err
	}
	b := &batch{m: m, n: m.n}
	b.s0 = load(&b.f0, f0, sum)
	b.active = b.s0
	b.z = make([]float64, m.n)
	for i := range m.n {
		switch {
		case b.active&(1<<i) == 0:
			b.z[i] = 0
		case m.linear&(1<<i) != 0:
			b.z[i] = b.f0[i]
		default:
			b.z[i] = math.Log(b.f0[i])
		}
	}
	if m.closed[b.active] == 0 {
		b.stopped = true
	}
	// A monomer that starts below the threshold and is consumed faster than the others is used
	// up from the start.
	var F [MaxMonomers]float64
	m.composition(F[:m.n], &b.f0, b.active)
	for i := range m.n {
		if b.active&(1<<i) != 0 && b.f0[i] < ExhaustedFraction && F[i] > b.f0[i] {
			b.exh = append(b.exh, Exhaustion{Monomer: i, Conversion: 0})
			b.reported |= 1 << i
		}
	}
	return b, nil
}

// feedOf writes the normalized unreacted feed of the state z (monomers of active) into f; with
// clamp, a value rounded below 0 is set to 0 first. It returns the sum of the unnormalized
// fractions.
func (b *batch) feedOf(f *[MaxMonomers]float64, z []float64, active uint8, clamp bool) float64 {
	var s float64
	for i := range b.n {
		v := 0.0
		if active&(1<<i) != 0 {
			if b.m.linear&(1<<i) != 0 {
				v = z[i]
				if clamp && v < 0 {
					v = 0
				}
			} else {
				v = math.Exp(z[i])
			}
		}
		f[i] = v
		s += v
	}
	for i := range b.n {
		f[i] /= s
	}
	return s
}

// rhs is the balance in t = −ln(1 − X) (autonomous, since dX/dt = 1 − X):
//
//	d f_i / dt = f_i − S F_i(f/S),        S = Σ f_i (1 in exact arithmetic)
//	d ln f_i / dt = 1 − F_i(f/S) / (f_i/S)
//
// The ratio F_i/f̂_i is computed without dividing by f̂_i: F_i = Σ_j π_j P_ji with P_ji =
// a_ji f̂_i / Σ_k a_jk f̂_k, so F_i/f̂_i = Σ_j π_j a_ji / Σ_k a_jk f̂_k over the radicals not held by
// a zero ratio (a held radical never adds a monomer integrated in ln f).
func (b *batch) rhs(dz, z []float64) {
	var f [MaxMonomers]float64
	s := b.feedOf(&f, z, b.active, false)
	var c chain
	if !b.m.build(&c, &f, b.active) {
		for i := range dz {
			dz[i] = math.NaN()
		}
		return
	}
	c.stationary()
	for i := range b.n {
		bit := uint8(1) << i
		switch {
		case b.active&bit == 0:
			dz[i] = 0
		case b.m.linear&bit != 0:
			dz[i] = z[i] - s*c.pi[i]
		default:
			var lam float64
			for a := range c.n {
				j := c.idx[a]
				if c.sum[j] > 0 {
					lam += c.pi[j] * b.m.a[j][i] / c.sum[j]
				}
			}
			dz[i] = 1 - lam
		}
	}
}

// segment is a stretch [t0, t1] of the solution with one set of monomers not used up.
type segment struct {
	b      *batch
	t0, t1 float64
	active uint8
	// dense is true when the stretch is the last step of the stepper; otherwise the state is
	// constant and held in z.
	dense bool
	z     [MaxMonomers]float64
	// out is the monomer (bit) that runs out at t1, where its fraction is set to exactly 0.
	out uint8
}

// feed writes the normalized unreacted feed at t (t0 ≤ t ≤ t1) into f.
func (s *segment) feed(f *[MaxMonomers]float64, t float64) {
	var z [MaxMonomers]float64
	if s.dense {
		for i := range s.b.n {
			z[i] = s.b.st.DenseAt(i, t)
		}
	} else {
		z = s.z
	}
	if s.out != 0 && t >= s.t1 {
		for i := range s.b.n {
			if s.out&(1<<i) != 0 {
				z[i] = 0
			}
		}
	}
	s.b.feedOf(f, z[:s.b.n], s.active, true)
}

// composition writes F at the feed f of this stretch into dst.
func (s *segment) composition(dst []float64, f *[MaxMonomers]float64) {
	s.b.m.composition(dst, f, s.active)
}

// fixed returns a constant stretch [t0, t1] at the current state.
func (b *batch) fixed(t0, t1 float64) *segment {
	s := &segment{b: b, t0: t0, t1: t1, active: b.active}
	copy(s.z[:], b.z)
	return s
}

// run integrates from X = 0 towards t = tEnd (+Inf for the limit X → 1), calling visit with
// each stretch of the solution in order until visit returns false or the end is reached. It
// records exhaustions and a stop of polymerization on the way.
func (b *batch) run(tEnd float64, visit func(*segment) bool) error {
	if b.stopped {
		visit(b.fixed(0, 0))
		return nil
	}
	if b.active&(b.active-1) == 0 {
		// One monomer: nothing drifts.
		visit(b.fixed(0, math.Inf(1)))
		return nil
	}
	b.st = ode.NewStepper(b.rhs, 0, b.z, driftRTol, driftATol)
	b.st.StepLimit = stepLimit
	target := math.Min(tEnd, limitT)
	var f, F [MaxMonomers]float64
	for {
		if b.st.T() >= target {
			if math.IsInf(tEnd, 1) {
				copy(b.z, b.st.Y())
				visit(b.fixed(b.st.T(), math.Inf(1)))
			}
			return nil
		}
		if err := b.st.Step(target); err != nil {
			return ErrNoConvergence
		}
		seg := &segment{b: b, t0: b.st.Prev(), t1: b.st.T(), active: b.active, dense: true}
		// A monomer integrated in f that reached 0 leaves the state at the first such time.
		ev, te := -1, seg.t1
		for i := range b.n {
			bit := uint8(1) << i
			if b.active&bit == 0 || b.m.linear&bit == 0 || b.st.Y()[i] > 0 {
				continue
			}
			if t := b.root(i, seg.t0, seg.t1, 0); t < te || ev < 0 {
				ev, te = i, t
			}
		}
		seg.t1 = te
		if ev >= 0 {
			seg.out = 1 << ev
		}
		b.report(seg)
		more := visit(seg)
		if ev >= 0 {
			for i := range b.n {
				b.z[i] = b.st.DenseAt(i, te)
			}
			b.z[ev] = 0
			b.active &^= 1 << ev
			if b.reported&(1<<ev) == 0 {
				b.exh = append(b.exh, Exhaustion{Monomer: ev, Conversion: -math.Expm1(-te)})
				b.reported |= 1 << ev
			}
			if b.m.closed[b.active] == 0 {
				b.stopped, b.stopT = true, te
				return nil
			}
			b.st.Reset(te, b.z)
		}
		if !more {
			return nil
		}
		if math.IsInf(tEnd, 1) && ev < 0 {
			// Settled: the unreacted monomer no longer changes.
			seg.feed(&f, seg.t1)
			seg.composition(F[:b.n], &f)
			settled := true
			for i := range b.n {
				if math.Abs(f[i]-F[i]) > limitChange {
					settled = false
					break
				}
			}
			if settled {
				copy(b.z, b.st.Y())
				visit(b.fixed(seg.t1, math.Inf(1)))
				return nil
			}
		}
	}
}

// root returns the t in [t0, t1] at which component i of the dense solution crosses level, by
// bisection (the component is above level at t0 and not above at t1).
func (b *batch) root(i int, t0, t1, level float64) float64 {
	lo, hi := t0, t1
	for range 200 {
		mid := 0.5 * (lo + hi)
		if mid <= lo || mid >= hi {
			break
		}
		if b.st.DenseAt(i, mid) > level {
			lo = mid
		} else {
			hi = mid
		}
	}
	return hi
}

// report records the monomers whose share falls below ExhaustedFraction within the stretch.
func (b *batch) report(seg *segment) {
	var f0, f1 [MaxMonomers]float64
	seg.feed(&f0, seg.t0)
	seg.feed(&f1, seg.t1)
	for i := range b.n {
		bit := uint8(1) << i
		if seg.active&bit == 0 || b.reported&bit != 0 || f1[i] >= ExhaustedFraction || f0[i] < ExhaustedFraction {
			continue
		}
		lo, hi := seg.t0, seg.t1
		var f [MaxMonomers]float64
		for range 200 {
			mid := 0.5 * (lo + hi)
			if mid <= lo || mid >= hi {
				break
			}
			seg.feed(&f, mid)
			if f[i] >= ExhaustedFraction {
				lo = mid
			} else {
				hi = mid
			}
		}
		b.exh = append(b.exh, Exhaustion{Monomer: i, Conversion: -math.Expm1(-hi)})
		b.reported |= bit
	}
}

// stopConversion returns the conversion at which polymerization stopped, or 1.
func (b *batch) stopConversion() float64 {
	if !b.stopped {
		return 1
	}
	return -math.Expm1(-b.stopT)
}

// stopReason says why polymerization stops.
func (b *batch) stopReason() string {
	var left int
	for i := range b.n {
		if b.active&(1<<i) != 0 {
			left = i
		}
	}
	if b.stopT == 0 {
		return monomerName(left) + " alone does not polymerize: it does not add to its own radical (every cross ratio of its row is 0)"
	}
	return "polymerization stops there: the other monomers are used up and " + monomerName(left) + ", the only one left, does not add to its own radical"
}

// checkConversions validates conversions named field[k]: at most copoly.MaxPoints, each in
// [0, 1], not decreasing.
func checkConversions(field string, xs []float64) error {
	if len(xs) > copoly.MaxPoints {
		return &copoly.InputError{Field: field, Value: float64(len(xs)), Reason: "too many conversions in one call", Err: copoly.ErrTooMany}
	}
	for k, x := range xs {
		if x >= 0 && x <= 1 && (k == 0 || x >= xs[k-1]) {
			continue
		}
		name := indexName(field, k)
		if err := copoly.CheckConversion(name, x); err != nil {
			return err
		}
		return &copoly.InputError{Field: name, Value: x, Reason: "conversions must not decrease", Err: copoly.ErrOutOfRange}
	}
	return nil
}
