package ode

import (
	"errors"
	"math"
	"testing"
)

// TestStepperMatchesScalar checks that the vector integrator is the scalar one for n = 1: the
// same tableau, the same controller (the root-mean-square of one ratio is its absolute value),
// so the same steps and bit-for-bit the same results.
func TestStepperMatchesScalar(t *testing.T) {
	cases := []struct {
		name string
		g    func(float64) float64
		y0   float64
	}{
		{"decay", func(y float64) float64 { return -3 * y }, 1},
		{"logistic", func(y float64) float64 { return y * (1 - y) }, 0.01},
		{"cubic", func(y float64) float64 { return -y * (1 + y*y) }, 2},
	}
	ts := []float64{0, 0.1, 0.5, 1, 2.5, 4.6, 10}
	for _, c := range cases {
		want := make([]float64, len(ts))
		Dopri5(want, c.g, 0, c.y0, ts, 1e-13, 1e-13)
		dst := make([][]float64, len(ts))
		for i := range dst {
			dst[i] = make([]float64, 1)
		}
		gv := func(dy, y []float64) { dy[0] = c.g(y[0]) }
		if err := Dopri5Vec(dst, gv, 0, []float64{c.y0}, ts, 1e-13, 1e-13); err != nil {
			t.Fatal(err)
		}
		for i := range ts {
			if dst[i][0] != want[i] {
				t.Errorf("%s: Dopri5Vec at t = %g is %.17g, scalar Dopri5 %.17g", c.name, ts[i], dst[i][0], want[i])
			}
		}
	}
}

// rotation is dy/dt = A y with A = [[−1, 2], [−2, −1]]; from y(0) = (1, 0) the solution is
// y(t) = e^(−t) (cos 2t, −sin 2t) (the matrix exponential of a scaled rotation, worked by hand).
func rotation(dy, y []float64) {
	dy[0] = -y[0] + 2*y[1]
	dy[1] = -2*y[0] - y[1]
}

func rotationExact(t float64) [2]float64 {
	e := math.Exp(-t)
	return [2]float64{e * math.Cos(2*t), -e * math.Sin(2*t)}
}

// TestStepperRotation checks the vector integrator and its continuous extension against the
// closed form of a linear system. Tolerances: with rtol = atol = 1e-12 the global error of the
// steps stays below 1e-10 (measured 6.7e-13); the order-4 continuous extension between steps
// below 1e-9 (measured 6.4e-13).
func TestStepperRotation(t *testing.T) {
	s := NewStepper(rotation, 0, []float64{1, 0}, 1e-12, 1e-12)
	worstStep, worstDense := 0.0, 0.0
	dense := make([]float64, 2)
	for s.T() < 5 {
		if err := s.Step(5); err != nil {
			t.Fatal(err)
		}
		want := rotationExact(s.T())
		for i := range 2 {
			worstStep = math.Max(worstStep, math.Abs(s.Y()[i]-want[i]))
		}
		for _, th := range []float64{0.1, 0.37, 0.5, 0.81} {
			tt := s.Prev() + th*(s.T()-s.Prev())
			s.Dense(dense, tt)
			w := rotationExact(tt)
			for i := range 2 {
				worstDense = math.Max(worstDense, math.Abs(dense[i]-w[i]))
			}
		}
	}
	if s.T() != 5 {
		t.Errorf("stepper ended at t = %v, want exactly 5", s.T())
	}
	if worstStep > 1e-10 {
		t.Errorf("largest error at the steps %.3g, want ≤ 1e-10", worstStep)
	}
	if worstDense > 1e-9 {
		t.Errorf("largest error of the continuous extension %.3g, want ≤ 1e-9", worstDense)
	}
	t.Logf("largest error: steps %.2g, continuous extension %.2g", worstStep, worstDense)
}

// TestStepperDenseEnds checks that the continuous extension returns the states at both ends of
// the step and the start after Reset.
func TestStepperDenseEnds(t *testing.T) {
	s := NewStepper(rotation, 0, []float64{1, 0}, 1e-10, 1e-10)
	start := []float64{0.3, -0.2}
	s.Reset(2, start)
	if got := s.DenseAt(0, 2); got != 0.3 {
		t.Errorf("after Reset, DenseAt(0, t0) = %v, want 0.3", got)
	}
	if err := s.Step(10); err != nil {
		t.Fatal(err)
	}
	for i := range 2 {
		if got := s.DenseAt(i, s.Prev()); got != start[i] {
			t.Errorf("DenseAt(%d, Prev) = %v, want the start %v", i, got, start[i])
		}
		if got := s.DenseAt(i, s.T()); got != s.Y()[i] {
			t.Errorf("DenseAt(%d, T) = %v, want Y = %v", i, got, s.Y()[i])
		}
	}
}

// TestStepperLimit checks that a stepper stops with ErrStepLimit instead of running on.
func TestStepperLimit(t *testing.T) {
	s := NewStepper(rotation, 0, []float64{1, 0}, 1e-12, 1e-12)
	s.StepLimit = 3
	var err error
	for range 10 {
		if err = s.Step(100); err != nil {
			break
		}
	}
	if !errors.Is(err, ErrStepLimit) {
		t.Errorf("after 3 steps to t = 100: err = %v, want ErrStepLimit", err)
	}
}
