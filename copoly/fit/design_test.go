package fit

import (
	"math"
	"testing"

	"copoly/copoly"
)

func TestDOptimalPair(t *testing.T) {
	// For r1 = r2 = 1, det J ∝ fa(1 − fa) fb(1 − fb)(fb − fa); with fb = 1 − fa its maximum solves
	// 5f² − 5f + 1 = 0, so f = (5 ± √5)/10 (derived by hand from the Mayo–Lewis sensitivities).
	d, err := NextRuns(1, 1, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	want := [2]float64{(5 - math.Sqrt(5)) / 10, (5 + math.Sqrt(5)) / 10}
	if math.Abs(d.DOptimal[0]-want[0]) > 1e-6 || math.Abs(d.DOptimal[1]-want[1]) > 1e-6 {
		t.Errorf("D-optimal pair for r = 1: %v, want %v", d.DOptimal, want)
	}
	// Tidwell–Mortimer feeds r2/(2 + r2) and 2/(2 + r1): 1/3 and 2/3 here (Tidwell & Mortimer
	// 1965, as the formulas are widely quoted; from memory).
	if math.Abs(d.TidwellMortimer[0]-1.0/3) > 1e-15 || math.Abs(d.TidwellMortimer[1]-2.0/3) > 1e-15 {
		t.Errorf("Tidwell–Mortimer feeds %v", d.TidwellMortimer)
	}
	// For small ratios the approximation is close to the exact optimum (St/MAH-like pair).
	d, _ = NextRuns(0.04, 0.02, nil, nil)
	lo, hi := math.Min(d.TidwellMortimer[0], d.TidwellMortimer[1]), math.Max(d.TidwellMortimer[0], d.TidwellMortimer[1])
	if math.Abs(d.DOptimal[0]-lo) > 0.02 || math.Abs(d.DOptimal[1]-hi) > 0.02 {
		t.Errorf("small ratios: exact %v, Tidwell–Mortimer %v", d.DOptimal, d.TidwellMortimer)
	}
}

func TestNextRunsShrinksRegion(t *testing.T) {
	m := copoly.Terminal{R1: 0.52, R2: 0.46}
	// Runs clustered mid-range: poor design; the suggestion should add information.
	made := cumulativeRuns(m, []float64{0.45, 0.5, 0.55}, []float64{0.05})
	d, err := NextRuns(m.R1, m.R2, made, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !(d.Shrink > 0 && d.Shrink < 0.5) {
		t.Errorf("shrink factor %v, want a large improvement over the clustered runs", d.Shrink)
	}
	if !(d.Next[0].F10 < 0.45 && d.Next[1].F10 > 0.55) {
		t.Errorf("suggested %v, want feeds outside the clustered range", d.Next)
	}
	if _, err := NextRuns(-1, 1, nil, nil); copoly.Field(err) != "r1" {
		t.Errorf("bad r1: %v", err)
	}
	if _, err := NextRuns(1, 1, nil, []float64{1}); copoly.Field(err) != "conversions[0]" {
		t.Errorf("conversion 1: %v", err)
	}
}
