package ode

import (
	"errors"
	"math"
)

// ErrStepLimit reports that a [Stepper] took more steps than its StepLimit without reaching
// the requested time.
var ErrStepLimit = errors.New("ode: step limit reached")

// Stepper integrates the autonomous system dy/dt = g(y), y ∈ ℝⁿ, one accepted step at a time,
// with the same Runge–Kutta pair and the same step-size controller as the scalar [Dopri5]: the
// explicit Dormand–Prince pair of order 5 with an embedded order-4 error estimate, local
// extrapolation, the first-same-as-last stage, and
//
//	h ← h·min(5, max(0.2, 0.9·err^(−1/5)))
//
// where err is the root-mean-square over the components of the error estimate measured against
// atol + rtol·max(|y_i|, |y_new,i|) (for n = 1 the ratio the scalar integrator uses). A step
// whose error is NaN (g left its domain inside the step) is retried five times shorter.
//
// Between the two ends of the last accepted step the solution is available from the continuous
// extension of order 4 (see [Stepper.Dense]); with it a caller can locate events (a component
// crossing a level) and fill in output times without shortening the steps.
//
// References:
//   - J. R. Dormand, P. J. Prince, "A family of embedded Runge–Kutta formulae",
//     J. Comput. Appl. Math. 1980, 6, 19–26 (the coefficients, Table 2).
//   - E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I,
//     2nd ed., Springer 1993, Sec. II.4 (step-size control, the norm of Eq. 4.11) and
//     Sec. II.6 (dense output; the coefficients d_i of the continuous extension of DOPRI5).
//   - L. F. Shampine, "Some practical Runge–Kutta formulas", Math. Comp. 1986, 46, 135–150
//     (the continuous extension).
type Stepper struct {
	g          func(dy, y []float64)
	rtol, atol float64
	// StepLimit bounds the number of step attempts (accepted or rejected) over the stepper's
	// life; Step returns ErrStepLimit beyond it. The default is 1 000 000, the scalar limit.
	StepLimit int

	t, h, told float64
	steps      int
	y, yold    []float64
	k1, k2, k3 []float64
	k4, k5, k6 []float64
	k7, yt, yn []float64
	// rcont holds the coefficients of the continuous extension of the last accepted step.
	rcont [5][]float64
}

// NewStepper returns a stepper at (t0, y0) for dy/dt = g(y). g writes the derivative at y into
// dy (both of length len(y0)) and must not keep either slice. y0 is copied.
func NewStepper(g func(dy, y []float64), t0 float64, y0 []float64, rtol, atol float64) *Stepper {
	n := len(y0)
	buf := make([]float64, 16*n)
	next := func() []float64 {
		s := buf[:n:n]
		buf = buf[n:]
		return s
	}
	s := &Stepper{g: g, rtol: rtol, atol: atol, StepLimit: 1_000_000, h: 1e-3}
	s.y, s.yold = next(), next()
	s.k1, s.k2, s.k3, s.k4, s.k5, s.k6, s.k7 = next(), next(), next(), next(), next(), next(), next()
	s.yt, s.yn = next(), next()
	for i := range s.rcont {
		s.rcont[i] = next()
	}
	s.Reset(t0, y0)
	return s
}

// Reset restarts the integration at (t, y), keeping the step size; y is copied. The last step
// becomes the single point t (Dense at t returns y).
func (s *Stepper) Reset(t float64, y []float64) {
	s.t, s.told = t, t
	copy(s.y, y)
	copy(s.yold, y)
	s.g(s.k1, s.y)
	for i := range s.y {
		s.rcont[0][i] = s.y[i]
		for j := 1; j < 5; j++ {
			s.rcont[j][i] = 0
		}
	}
}

// T returns the current time, the end of the last accepted step.
func (s *Stepper) T() float64 { return s.t }

// Prev returns the start of the last accepted step.
func (s *Stepper) Prev() float64 { return s.told }

// Y returns the current state. The slice belongs to the stepper: it changes with the next step.
func (s *Stepper) Y() []float64 { return s.y }

// Step takes one accepted step, shortened so as not to pass tEnd (it then ends exactly at tEnd).
// It returns ErrStepLimit when StepLimit attempts have been made. At or past tEnd it does
// nothing.
func (s *Stepper) Step(tEnd float64) error {
	const (
		a21                        = 1.0 / 5
		a31, a32                   = 3.0 / 40, 9.0 / 40
		a41, a42, a43              = 44.0 / 45, -56.0 / 15, 32.0 / 9
		a51, a52, a53, a54         = 19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729
		a61, a62, a63, a64, a65    = 9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656
		b1, b3, b4, b5, b6         = 35.0 / 384, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84
		e1, e3, e4, e5, e6, e7     = 71.0 / 57600, -71.0 / 16695, 71.0 / 1920, -17253.0 / 339200, 22.0 / 525, -1.0 / 40
		safety, minScale, maxScale = 0.9, 0.2, 5.0
	)
	if s.t >= tEnd {
		return nil
	}
	y, yt, yn := s.y, s.yt, s.yn
	k1, k2, k3, k4, k5, k6, k7 := s.k1, s.k2, s.k3, s.k4, s.k5, s.k6, s.k7
	n := float64(len(y))
	for {
		if s.steps >= s.StepLimit {
			return ErrStepLimit
		}
		s.steps++
		h := s.h
		last := false
		if s.t+h >= tEnd {
			h = tEnd - s.t
			last = true
		}
		for i := range y {
			yt[i] = y[i] + h*a21*k1[i]
		}
		s.g(k2, yt)
		for i := range y {
			yt[i] = y[i] + h*(a31*k1[i]+a32*k2[i])
		}
		s.g(k3, yt)
		for i := range y {
			yt[i] = y[i] + h*(a41*k1[i]+a42*k2[i]+a43*k3[i])
		}
		s.g(k4, yt)
		for i := range y {
			yt[i] = y[i] + h*(a51*k1[i]+a52*k2[i]+a53*k3[i]+a54*k4[i])
		}
		s.g(k5, yt)
		for i := range y {
			yt[i] = y[i] + h*(a61*k1[i]+a62*k2[i]+a63*k3[i]+a64*k4[i]+a65*k5[i])
		}
		s.g(k6, yt)
		for i := range y {
			yn[i] = y[i] + h*(b1*k1[i]+b3*k3[i]+b4*k4[i]+b5*k5[i]+b6*k6[i])
		}
		s.g(k7, yn)
		var sum float64
		for i := range y {
			errEst := h * (e1*k1[i] + e3*k3[i] + e4*k4[i] + e5*k5[i] + e6*k6[i] + e7*k7[i])
			sc := s.atol + s.rtol*math.Max(math.Abs(y[i]), math.Abs(yn[i]))
			q := errEst / sc
			sum += q * q
		}
		r := math.Sqrt(sum / n)
		if math.IsNaN(r) {
			// g left its domain inside the step: retry with a smaller one.
			s.h = h * minScale
			continue
		}
		accepted := r <= 1
		if accepted {
			s.accept(h)
			if last {
				s.t = tEnd
			}
		}
		scale := maxScale
		if r > 0 {
			scale = math.Min(maxScale, math.Max(minScale, safety*math.Pow(r, -0.2)))
		}
		s.h = h * scale
		if accepted {
			return nil
		}
	}
}

// accept moves the stepper to the end of a step of size h whose stages are in k1…k7 and whose
// new state is in yn, and stores the continuous extension.
func (s *Stepper) accept(h float64) {
	const (
		d1 = -12715105075.0 / 11282082432
		d3 = 87487479700.0 / 32700410799
		d4 = -10690763975.0 / 1880347072
		d5 = 701980252875.0 / 199316789632
		d6 = -1453857185.0 / 822651844
		d7 = 69997945.0 / 29380423
	)
	r := &s.rcont
	for i := range s.y {
		diff := s.yn[i] - s.y[i]
		bspl := h*s.k1[i] - diff
		r[0][i] = s.y[i]
		r[1][i] = diff
		r[2][i] = bspl
		r[3][i] = diff - h*s.k7[i] - bspl
		r[4][i] = h * (d1*s.k1[i] + d3*s.k3[i] + d4*s.k4[i] + d5*s.k5[i] + d6*s.k6[i] + d7*s.k7[i])
	}
	s.told = s.t
	s.t += h
	copy(s.yold, s.y)
	copy(s.y, s.yn)
	s.k1, s.k7 = s.k7, s.k1 // first same as last
}

// Dense writes into dst the solution at t, Prev() ≤ t ≤ T(), from the continuous extension of
// order 4 of the last accepted step:
//
//	y(t_old + θh) = r1 + θ(r2 + (1 − θ)(r3 + θ(r4 + (1 − θ) r5)))
//
// It returns the state exactly at both ends (θ = 0 and θ = 1 up to rounding). t outside the
// step extrapolates the polynomial.
func (s *Stepper) Dense(dst []float64, t float64) {
	for i := range dst {
		dst[i] = s.DenseAt(i, t)
	}
}

// DenseAt is [Stepper.Dense] for component i alone.
func (s *Stepper) DenseAt(i int, t float64) float64 {
	h := s.t - s.told
	if h == 0 {
		return s.rcont[0][i]
	}
	if t == s.t {
		return s.y[i]
	}
	th := (t - s.told) / h
	th1 := 1 - th
	r := &s.rcont
	return r[0][i] + th*(r[1][i]+th1*(r[2][i]+th*(r[3][i]+th1*r[4][i])))
}

// Dopri5Vec integrates dy/dt = g(y) from (t0, y0) to each time in ts (ascending, all ≥ t0),
// writing the state at ts[k] into dst[k] (each of length len(y0)). Like the scalar [Dopri5] it
// shortens steps to land on each requested time. It returns ErrStepLimit (with the remaining
// rows left as they were) when the integration needs more than a million step attempts.
func Dopri5Vec(dst [][]float64, g func(dy, y []float64), t0 float64, y0 []float64, ts []float64, rtol, atol float64) error {
	s := NewStepper(g, t0, y0, rtol, atol)
	for k, target := range ts {
		for s.T() < target {
			if err := s.Step(target); err != nil {
				return err
			}
		}
		copy(dst[k], s.Y())
	}
	return nil
}
