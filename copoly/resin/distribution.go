package resin

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"copoly/copoly"
	"copoly/copoly/multi"
)

// WideSpread is the spread of glass transitions within the polymer of one batch (between the
// 5th and the 95th percentile by mass, kelvin) above which [TgDistribution] flags a risk of two
// phases. A search of the literature found no published criterion for copolymers of drifting
// composition; 20 K is the usual rule of thumb for two glass transitions a calorimeter resolves
// (common practice, no source). Even a single Tg does not prove a single phase (IUPAC Gold
// Book, "homogeneous polymer blend", note 3).
const WideSpread = 20

// TgSpread is the distribution of glass transitions over the polymer a batch makes.
type TgSpread struct {
	// Edges (kelvin, len(Weights)+1 ascending) and Weights (mass fractions, summing to 1) of
	// the histogram.
	Edges, Weights []float64
	// Low and High are the Tg below which 5 % and 95 % of the polymer's mass lies.
	Low, High float64
	// Product is the Fox Tg of the whole product (its cumulative composition): the Tg of the
	// polymer if it mixed into one phase.
	Product float64
	// Wide is true when High − Low exceeds WideSpread; Note says so in words.
	Wide bool
	Note string
}

// TgDistribution returns how the polymer made in a batch of the model m from f0 up to
// conversion is distributed over glass transition temperature: each of multi.Slices conversion
// slices makes polymer of the instantaneous composition F(X), of mass dX·Σ F_i M_i and Fox Tg
// (see [Fox]). The histogram's bins (1…multi.MaxBins) span the Tg values made, widened to at
// least 1 K. It flags a spread wide enough to risk two phases (see WideSpread). Chain-to-chain
// scatter at one conversion is not included.
//
// Errors name "f0", "f0[i]", "conversion", "molarMass", "molarMass[i]", "tg", "tg[i]" or
// "bins".
func TgDistribution(m *multi.Model, f0 []float64, conversion float64, molarMass, tg []float64, bins int) (*TgSpread, error) {
	n := m.N()
	if err := copoly.CheckConversion("conversion", conversion); err != nil {
		return nil, err
	}
	if conversion == 0 {
		return nil, &copoly.InputError{Field: "conversion", Value: 0, Reason: "no polymer is made at zero conversion", Err: copoly.ErrOutOfRange}
	}
	if err := checkMolarMasses(molarMass, n); err != nil {
		return nil, err
	}
	if err := checkTg(tg, n); err != nil {
		return nil, err
	}
	if bins < 1 || bins > multi.MaxBins {
		return nil, &copoly.InputError{Field: "bins", Value: float64(bins), Reason: fmt.Sprintf("the number of bins must be between 1 and %d", multi.MaxBins), Err: copoly.ErrOutOfRange}
	}
	xs := make([]float64, multi.Slices)
	for k := range xs {
		xs[k] = (float64(k) + 0.5) * conversion / multi.Slices
	}
	d, err := m.Drift(f0, append(xs, conversion))
	if err != nil {
		// A slice past the end of polymerization: the conversion asked for is the culprit.
		var ie *copoly.InputError
		if errors.As(err, &ie) && strings.HasPrefix(ie.Field, "conversion[") {
			return nil, &copoly.InputError{Field: "conversion", Value: conversion, Reason: ie.Reason, Err: ie.Err}
		}
		return nil, err
	}
	type slice struct{ tg, mass float64 }
	sl := make([]slice, multi.Slices)
	w := make([]float64, n)
	var total float64
	for k := range sl {
		mass := massFractions(w, d.Inst[k], molarMass)
		sl[k] = slice{fox(w, tg), mass}
		total += mass
	}
	massFractions(w, d.Cum[multi.Slices], molarMass)
	out := &TgSpread{Product: fox(w, tg)}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, s := range sl {
		lo, hi = math.Min(lo, s.tg), math.Max(hi, s.tg)
	}
	if hi-lo < 1 {
		mid := 0.5 * (lo + hi)
		lo, hi = mid-0.5, mid+0.5
	}
	out.Edges = make([]float64, bins+1)
	out.Weights = make([]float64, bins)
	for i := range out.Edges {
		out.Edges[i] = lo + (hi-lo)*float64(i)/float64(bins)
	}
	for _, s := range sl {
		k := min(max(int((s.tg-lo)/(hi-lo)*float64(bins)), 0), bins-1)
		out.Weights[k] += s.mass / total
	}
	slices.SortFunc(sl, func(a, b slice) int {
		switch {
		case a.tg < b.tg:
			return -1
		case a.tg > b.tg:
			return 1
		}
		return 0
	})
	var acc float64
	out.Low, out.High = math.NaN(), math.NaN()
	for _, s := range sl {
		acc += s.mass / total
		if math.IsNaN(out.Low) && acc >= 0.05 {
			out.Low = s.tg
		}
		if math.IsNaN(out.High) && acc >= 0.95 {
			out.High = s.tg
		}
	}
	if math.IsNaN(out.High) {
		out.High = sl[len(sl)-1].tg
	}
	spread := out.High - out.Low
	out.Wide = spread > WideSpread
	if out.Wide {
		out.Note = fmt.Sprintf("The polymer made spans %.0f K in Tg (%.0f to %.0f K between 5 %% and 95 %% by mass): wide enough that the product may behave as a blend of different copolymers, with two glass transitions or two phases (more than %d K is a rule of thumb, common practice, no source). A semi-batch feed that holds the composition narrows it.",
			spread, out.Low, out.High, WideSpread)
	} else {
		out.Note = fmt.Sprintf("The polymer made spans %.1f K in Tg (5 %% to 95 %% by mass), within the %d K rule of thumb (common practice, no source) for a single glass transition.", spread, WideSpread)
	}
	return out, nil
}
