package multi

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// ConversionLimit returns the largest overall molar conversion X up to which the cumulative
// composition of a batch from f0 stays within ±tolerance of the first polymer's in every
// monomer: |F̄_i(X′) − F_i(f0)| ≤ tolerance for all i and all X′ ≤ X. It returns Stop (1, or
// where polymerization stops) when the batch never leaves the band. For three or more monomers
// F̄_i need not move monotonically, so the band is followed along the whole batch (at 8 points
// per integration step, then by bisection on the step's continuous extension to 1e-12).
//
// Errors name "f0", "f0[i]" or "tolerance" (0 < tolerance ≤ 0.5).
func (m *Model) ConversionLimit(f0 []float64, tolerance float64) (float64, error) {
	b, err := m.newBatch("f0", f0)
	if err != nil {
		return 0, err
	}
	if !(tolerance > 0 && tolerance <= 0.5) {
		if math.IsNaN(tolerance) || math.IsInf(tolerance, 0) {
			return 0, &copoly.InputError{Field: "tolerance", Value: tolerance, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		return 0, &copoly.InputError{Field: "tolerance", Value: tolerance, Reason: "a composition tolerance must be above 0 and at most 0.5 (mole fraction)", Err: copoly.ErrOutOfRange}
	}
	n := m.n
	var start [MaxMonomers]float64
	m.composition(start[:n], &b.f0, b.s0)
	off := func(seg *segment, t float64) bool {
		x := -math.Expm1(-t)
		if math.IsInf(t, 1) {
			x = 1
		}
		var f [MaxMonomers]float64
		var F, cum [MaxMonomers]float64
		seg.feed(&f, t)
		seg.composition(F[:n], &f)
		b.cumulative(cum[:n], x, &f, F[:n], &start)
		for i := range n {
			if math.Abs(cum[i]-start[i]) > tolerance {
				return true
			}
		}
		return false
	}
	limit := math.NaN()
	err = b.run(math.Inf(1), func(seg *segment) bool {
		if math.IsInf(seg.t1, 1) {
			if off(seg, seg.t1) {
				limit = -math.Expm1(-seg.t0)
			}
			return false
		}
		prev := seg.t0
		const sub = 8
		for q := 1; q <= sub; q++ {
			t := seg.t0 + (seg.t1-seg.t0)*float64(q)/sub
			if q == sub {
				t = seg.t1
			}
			if off(seg, t) {
				lo, hi := prev, t
				for range 200 {
					mid := 0.5 * (lo + hi)
					if mid <= lo || mid >= hi || hi-lo <= 1e-12*(1-math.Exp(-hi)+1e-300) {
						break
					}
					if off(seg, mid) {
						hi = mid
					} else {
						lo = mid
					}
				}
				limit = -math.Expm1(-lo)
				return false
			}
			prev = t
		}
		return true
	})
	if err != nil {
		return 0, err
	}
	if math.IsNaN(limit) {
		return b.stopConversion(), nil
	}
	return limit, nil
}

// Histogram is a distribution of the polymer of a batch over bins of one quantity.
type Histogram struct {
	// Edges holds len(Weights)+1 ascending bin edges.
	Edges []float64
	// Weights holds the fraction of the polymer in each bin; they sum to 1.
	Weights []float64
	// Basis is "mass" for mass fractions, "moles" for fractions of the monomer units.
	Basis string
}

// MaxBins is the largest number of bins of a [Histogram].
const MaxBins = 200

// Slices is the number of conversion slices a batch is cut into for
// [Model.CompositionDistribution]; each slice's polymer has the instantaneous composition at its
// midpoint (the midpoint rule, error O(1/Slices²)).
const Slices = 4000

// CompositionDistribution returns how the polymer made in a batch from f0 up to conversion is
// distributed over the instantaneous mole fraction F_monomer of one monomer: each conversion
// slice dX makes dX moles of units of composition F(f(X)), or a mass dX·Σ_i F_i M_i when
// molarMass gives the N molar masses in g/mol (nil or empty for the mole basis). The bins
// span the compositions made, widened to at least 0.01 (inside [0, 1]) when the batch hardly
// drifts. Chain-to-chain scatter about the instantaneous composition is not included (see
// [Model.SimulateChains]): the histogram shows drift only.
//
// Errors name "f0", "f0[i]", "conversion" (in (0, Stop]), "monomer" (0…N−1), "bins"
// (1…MaxBins) or "molarMass[i]".
func (m *Model) CompositionDistribution(f0 []float64, conversion float64, monomer, bins int, molarMass []float64) (Histogram, error) {
	n := m.n
	if monomer < 0 || monomer >= n {
		return Histogram{}, &copoly.InputError{Field: "monomer", Value: float64(monomer), Reason: fmt.Sprintf("a monomer index from 0 to %d", n-1), Err: copoly.ErrOutOfRange}
	}
	comp, w, basis, err := m.slices(f0, conversion, bins, molarMass)
	if err != nil {
		return Histogram{}, err
	}
	v := make([]float64, len(w))
	for k := range v {
		v[k] = comp[k*n+monomer]
	}
	return binned(v, w, bins, basis, 0.01, 0, 1), nil
}

// slices validates the inputs of a distribution over a batch and returns the instantaneous
// composition of each of the Slices conversion slices (N values per slice), the polymer in
// each (moles of units, or mass), and the basis.
func (m *Model) slices(f0 []float64, conversion float64, bins int, molarMass []float64) (comp, w []float64, basis string, err error) {
	if err := copoly.CheckConversion("conversion", conversion); err != nil {
		return nil, nil, "", err
	}
	if conversion == 0 {
		return nil, nil, "", &copoly.InputError{Field: "conversion", Value: 0, Reason: "no polymer is made at zero conversion", Err: copoly.ErrOutOfRange}
	}
	if bins < 1 || bins > MaxBins {
		return nil, nil, "", &copoly.InputError{Field: "bins", Value: float64(bins), Reason: fmt.Sprintf("the number of bins must be between 1 and %d", MaxBins), Err: copoly.ErrOutOfRange}
	}
	basis = "moles"
	if len(molarMass) > 0 {
		if len(molarMass) != m.n {
			return nil, nil, "", &copoly.InputError{Field: "molarMass", Value: float64(len(molarMass)), Reason: fmt.Sprintf("give one molar mass per monomer (%d), or none", m.n), Err: copoly.ErrOutOfRange}
		}
		for i, v := range molarMass {
			if err := copoly.CheckMolarMass(indexName("molarMass", i), v); err != nil {
				return nil, nil, "", err
			}
		}
		basis = "mass"
	}
	xs := make([]float64, Slices)
	for k := range xs {
		xs[k] = (float64(k) + 0.5) * conversion / Slices
	}
	b, err := m.newBatch("f0", f0)
	if err != nil {
		return nil, nil, "", err
	}
	d, past, err := b.drift(xs)
	if err != nil {
		return nil, nil, "", err
	}
	if past < len(xs) || conversion > d.Stop {
		return nil, nil, "", &copoly.InputError{Field: "conversion", Value: conversion, Reason: fmt.Sprintf("this batch stops at X = %.4g: %s", d.Stop, b.stopReason()), Err: copoly.ErrOutOfRange}
	}
	n := m.n
	comp = make([]float64, Slices*n)
	w = make([]float64, Slices)
	for k := range xs {
		copy(comp[k*n:], d.Inst[k])
		w[k] = 1
		if basis == "mass" {
			w[k] = 0
			for i, M := range molarMass {
				w[k] += d.Inst[k][i] * M
			}
		}
	}
	return comp, w, basis, nil
}

// binned returns the histogram of the values v with weights w over bins equal bins spanning
// their range, widened to at least minWidth around them (kept inside [lo0, hi0]) when they are
// nearly equal; the weights are normalised to sum 1.
func binned(v, w []float64, bins int, basis string, minWidth, lo0, hi0 float64) Histogram {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, x := range v {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	if hi-lo < minWidth {
		mid := 0.5 * (lo + hi)
		lo, hi = math.Max(lo0, mid-minWidth/2), math.Min(hi0, mid+minWidth/2)
		if hi-lo < minWidth { // against an end
			if lo == lo0 {
				hi = lo0 + minWidth
			} else {
				lo = hi0 - minWidth
			}
		}
	}
	h := Histogram{Edges: make([]float64, bins+1), Weights: make([]float64, bins), Basis: basis}
	for i := range h.Edges {
		h.Edges[i] = lo + (hi-lo)*float64(i)/float64(bins)
	}
	var total float64
	for i, x := range v {
		k := min(max(int((x-lo)/(hi-lo)*float64(bins)), 0), bins-1)
		h.Weights[k] += w[i]
		total += w[i]
	}
	for i := range h.Weights {
		h.Weights[i] /= total
	}
	return h
}
