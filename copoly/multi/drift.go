package multi

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// Drift is the composition of a batch against overall molar conversion X: row k of each table
// holds the N mole fractions at Conversion[k].
type Drift struct {
	// Conversion holds the conversions X asked for.
	Conversion []float64
	// Feed holds the unreacted monomer f(X) (the JavaScript "f").
	Feed [][]float64
	// Inst holds the copolymer being formed, F(f(X)) (the JavaScript "F").
	Inst [][]float64
	// Cum holds the composition of all the copolymer made up to X, F̄(X) (the JavaScript
	// "Fcum").
	Cum [][]float64
	// Exhausted lists the monomers used up at or before the last conversion, in the order they
	// ran out.
	Exhausted []Exhaustion
	// Stop is the conversion at which polymerization stops: 1, or less when the one monomer
	// left does not add to its own radical (only possible with such a monomer in the feed; the
	// batch is then followed to its end whatever the conversions asked for).
	Stop float64
}

// Drift returns the composition of a batch started from the feed f0 at each conversion of
// conversion (each in [0, 1], not decreasing), from Skeist's balance for N monomers:
//
//	d f_i / dX = (f_i − F_i(f)) / (1 − X),    F̄_i(X) = (f_i0 − (1 − X) f_i(X)) / X
//
// integrated in t = −ln(1 − X), where it is autonomous (d f/dt = f − F(f)), by the
// Dormand–Prince 5(4) pair with tolerances 1e-12 (see batch for the variables). Below X = 1e-7
// the cumulative composition is the mean of F at the start and at X (exact to first order). At
// X = 1 exactly, f is the limit the unreacted monomer tends to (the least reactive monomer, or a
// stable azeotrope) and F̄ = f0.
//
// A monomer can run out: Exhausted says which and at what conversion, and the others carry on
// without it (the composition then follows the model of the monomers left). When the one
// monomer left does not add to its own radical polymerization stops at Stop < 1; a conversion
// above Stop gives an error naming "conversion[k]", and at Stop the result is the limit from
// below.
//
// Errors name "f0", "f0[i]", "conversion" (more than copoly.MaxPoints values) or
// "conversion[k]".
//
// References:
//   - I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781 (the balance, for two monomers).
//   - C. Walling, E. R. Briggs, J. Am. Chem. Soc. 1945, 67, 1774 (F for N monomers).
func (m *Model) Drift(f0, conversion []float64) (*Drift, error) {
	b, err := m.newBatch("f0", f0)
	if err != nil {
		return nil, err
	}
	if err := checkConversions("conversion", conversion); err != nil {
		return nil, err
	}
	d, past, err := b.drift(conversion)
	if err != nil {
		return nil, err
	}
	if past < len(conversion) {
		return nil, &copoly.InputError{Field: indexName("conversion", past), Value: conversion[past],
			Reason: fmt.Sprintf("this batch stops at X = %.4g: %s", d.Stop, b.stopReason()), Err: copoly.ErrOutOfRange}
	}
	return d, nil
}

// drift computes the drift at the validated conversions. past is the index of the first
// conversion beyond a stop of polymerization (len(conversion) when none is).
func (b *batch) drift(conversion []float64) (d *Drift, past int, err error) {
	m := b.m
	n, count := m.n, len(conversion)
	flat := make([]float64, 3*n*count)
	d = &Drift{Conversion: append([]float64(nil), conversion...),
		Feed: make([][]float64, count), Inst: make([][]float64, count), Cum: make([][]float64, count)}
	for k := range count {
		d.Feed[k] = flat[3*n*k : 3*n*k+n : 3*n*k+n]
		d.Inst[k] = flat[3*n*k+n : 3*n*k+2*n : 3*n*k+2*n]
		d.Cum[k] = flat[3*n*k+2*n : 3*n*(k+1) : 3*n*(k+1)]
	}
	var start [MaxMonomers]float64
	m.composition(start[:n], &b.f0, b.s0)
	ts := make([]float64, count)
	for k, x := range conversion {
		ts[k] = -math.Log1p(-x)
	}
	k := 0
	fill := func(seg *segment, t float64) {
		var f [MaxMonomers]float64
		seg.feed(&f, t)
		copy(d.Feed[k], f[:n])
		seg.composition(d.Inst[k], &f)
		b.cumulative(d.Cum[k], conversion[k], &f, d.Inst[k], &start)
		k++
	}
	tEnd := 0.0
	if count > 0 {
		tEnd = ts[count-1]
	}
	// Polymerization can stop only when a monomer that does not add to its own radical is in
	// the feed; then the batch is followed to its end to find where.
	canStop := false
	for i := range n {
		canStop = canStop || (m.noHomo[i] && b.s0&(1<<i) != 0)
	}
	if canStop {
		tEnd = math.Inf(1)
	}
	err = b.run(tEnd, func(seg *segment) bool {
		for k < count && ts[k] <= seg.t1 {
			fill(seg, math.Max(ts[k], seg.t0))
		}
		return k < count || canStop
	})
	if err != nil {
		return nil, 0, err
	}
	d.Stop = b.stopConversion()
	if k < count && b.stopped {
		// At the stop itself (up to rounding of t): the limit from below, the state at the stop.
		for k < count && conversion[k] <= d.Stop*(1+1e-12) {
			seg := b.fixed(b.stopT, b.stopT)
			seg.active = b.s0Before()
			fill(seg, b.stopT)
		}
		if k < count {
			return d, k, nil
		}
	}
	if k < count {
		return nil, 0, ErrNoConvergence
	}
	last := 0.0
	if count > 0 {
		last = conversion[count-1]
	}
	for _, e := range b.exh {
		if e.Conversion <= last {
			d.Exhausted = append(d.Exhausted, e)
		}
	}
	return d, count, nil
}

// s0Before returns the monomers not used up just before the stop: those left plus the last
// one to run out.
func (b *batch) s0Before() uint8 {
	s := b.active
	if len(b.exh) > 0 && b.stopT > 0 {
		s |= 1 << b.exh[len(b.exh)-1].Monomer
	}
	return s
}

// cumulative writes F̄ at conversion x with unreacted feed f and instantaneous composition inst
// into dst: the monomer balance, the starting feed at x = 1, and the mean of the first and
// current F below x = 1e-7.
func (b *batch) cumulative(dst []float64, x float64, f *[MaxMonomers]float64, inst []float64, start *[MaxMonomers]float64) {
	for i := range dst {
		switch {
		case x == 1:
			dst[i] = b.f0[i]
		case x < 1e-7:
			dst[i] = 0.5 * (start[i] + inst[i])
		default:
			dst[i] = math.Min(1, math.Max(0, (b.f0[i]-(1-x)*f[i])/x))
		}
	}
}

// BatchDrift is multiDrift({r, cross, f0, conversion}) of the JavaScript API: the model of r
// (and cross, usually nil; see [New]) and its [Model.Drift].
func BatchDrift(r, cross [][]float64, f0, conversion []float64) (*Drift, error) {
	m, err := New(r, cross)
	if err != nil {
		return nil, err
	}
	return m.Drift(f0, conversion)
}

func indexName(field string, k int) string { return fmt.Sprintf("%s[%d]", field, k) }
