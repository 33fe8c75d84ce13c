package fit

import (
	"math"
	"testing"

	"copoly/copoly"
	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
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

// TestNextRunsShrinkIsAreaRatio checks Shrink against the area of the linearised region, which
// for a two-parameter ellipse {d : dᵀ M d ≤ c} is π c/√det M: the area shrinks by
// √(det M_before/det M_after) (derived by hand). Two cases:
//   - closed form: when the runs made are the two suggested by NextRuns itself (so repeating
//     them is again the best pair), M_after = 2 M_before and det(2M) = 4 det M for a 2 × 2
//     matrix, so Shrink = √(1/4) = 1/2 exactly;
//   - runs at low conversion (X = 0), where the sensitivities are those of the Mayo–Lewis
//     equation, F1 = N/D, N = r1 f1² + f1 f2, D = N + f1 f2 + r2 f2², differentiated by hand:
//     ∂F1/∂r1 = f1²(D − N)/D², ∂F1/∂r2 = −N f2²/D²; the determinants by gonum's mat.Det.
func TestNextRunsShrinkIsAreaRatio(t *testing.T) {
	m := copoly.Terminal{R1: 0.52, R2: 0.46} // styrene/methyl methacrylate, Polymer Handbook table (an input only)
	first, err := NextRuns(m.R1, m.R2, nil, []float64{0.05})
	if err != nil {
		t.Fatal(err)
	}
	made := []copoly.Run{{F10: first.Next[0].F10, Conversion: 0.05}, {F10: first.Next[1].F10, Conversion: 0.05}}
	again, err := NextRuns(m.R1, m.R2, made, []float64{0.05})
	if err != nil {
		t.Fatal(err)
	}
	if again.Next != first.Next {
		t.Fatalf("NextRuns after its own pair suggests %v, not the pair %v again", again.Next, first.Next)
	}
	if math.Abs(again.Shrink-0.5) > 1e-9 {
		t.Errorf("Shrink after repeating the best pair = %v, want 1/2", again.Shrink)
	}

	info := func(feeds []float64) *mat.Dense {
		var a11, a12, a22 float64
		for _, f1 := range feeds {
			f2 := 1 - f1
			n := m.R1*f1*f1 + f1*f2
			d := n + f1*f2 + m.R2*f2*f2
			j1, j2 := f1*f1*(d-n)/(d*d), -n*f2*f2/(d*d)
			a11, a12, a22 = a11+j1*j1, a12+j1*j2, a22+j2*j2
		}
		return mat.NewDense(2, 2, []float64{a11, a12, a12, a22})
	}
	before := []float64{0.45, 0.5, 0.55} // clustered runs: a poor design
	var runs []copoly.Run
	for _, f := range before {
		runs = append(runs, copoly.Run{F10: f})
	}
	d, err := NextRuns(m.R1, m.R2, runs, []float64{0})
	if err != nil {
		t.Fatal(err)
	}
	after := append(before, d.Next[0].F10, d.Next[1].F10)
	want := math.Sqrt(mat.Det(info(before)) / mat.Det(info(after)))
	if !scalar.EqualWithinRel(d.Shrink, want, 1e-6) {
		t.Errorf("Shrink = %v after adding %v to feeds %v, want √(det before/det after) = %v", d.Shrink, d.Next, before, want)
	}
}
