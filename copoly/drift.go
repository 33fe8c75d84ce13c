package copoly

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/integrate/quad"

	"copoly/copoly/internal/ode"
)

// Methods reported in [Drift.Method].
const (
	MethodMeyerLowry = "meyer-lowry"
	MethodSkeist     = "skeist-ode"
	MethodNoDrift    = "no-drift"
)

// Exhaustion reports a monomer practically used up during a batch.
type Exhaustion struct {
	// Monomer is 1 or 2.
	Monomer int
	// Conversion is the overall molar conversion at which the monomer's share of the unreacted
	// mixture falls below [ExhaustedFraction].
	Conversion float64
}

// ExhaustedFraction is the mole fraction below which a monomer counts as used up in
// [Drift.Exhausted]; past it the other monomer in effect homopolymerizes (common practice, no
// source).
const ExhaustedFraction = 1e-6

// Drift is the composition of a batch copolymerization against overall molar conversion X.
type Drift struct {
	// Conversion holds the molar conversions X the drift was evaluated at.
	Conversion []float64
	// Feed holds the mole fraction f1 of M1 in the unreacted monomer at each X.
	Feed []float64
	// Inst holds the instantaneous copolymer composition F1(f1) at each X.
	Inst []float64
	// Cum holds the cumulative copolymer composition F̄1 of all polymer made up to each X.
	Cum []float64
	// Method is MethodMeyerLowry, MethodSkeist or MethodNoDrift.
	Method string
	// Exhausted is non-nil when one monomer is practically used up at or before the last X.
	Exhausted *Exhaustion
}

// Batch is a batch copolymerization: a model and a starting feed f10, with what every batch
// calculation needs, the direction of drift and where it ends. [NewBatch] makes one; its methods
// give the drift ([Batch.Drift]), the conversion limit for a composition tolerance
// ([Batch.ConversionLimit]), the composition distribution of the product
// ([Batch.Distribution]), conversions by mass ([Batch.MolarConversions]) and the sequence
// statistics of all the polymer made ([Batch.Sequence]), for any [Model].
type Batch struct {
	m   Terminal
	f10 float64
	// end is the composition the unreacted mixture moves towards: 0, 1 or the azeotrope.
	end float64
	// still is true when the feed does not drift at all.
	still bool
	// closed is true when the Meyer–Lowry closed form is used; otherwise the Skeist ODE.
	closed bool
	// xmax is the largest reachable conversion: 1, or less when the monomer left over cannot
	// homopolymerize (r = 0).
	xmax float64
	// Meyer–Lowry exponents and the singular point δ.
	alpha, beta, gamma, delta float64
	// model, when not nil, is the model of a batch that is not terminal (m is then unused and
	// closed false).
	model Model
}

// inst returns the instantaneous composition of the batch's model at feed f.
func (b *Batch) inst(f float64) float64 {
	if b.model != nil {
		return b.model.Instantaneous(f)
	}
	return b.m.Instantaneous(f)
}

// NewBatch returns the batch of model started from feed f10, or an [*InputError] naming the
// model's parameters or "f10". For a [Terminal] model the drift follows the Meyer–Lowry closed
// form where it is well conditioned (see [Terminal.Drift]). For any other model the batch is
// integrated numerically; the end point of the drift is the nearest fixed point f = F1(f) in
// the direction of drift, found by scanning in steps of 0.001 and bisecting, or 0 or 1.
func NewBatch(model Model, f10 float64) (*Batch, error) {
	if t, ok := model.(Terminal); ok {
		return newBatch(t, f10)
	}
	if err := model.Validate(); err != nil {
		return nil, err
	}
	if err := CheckFraction("f10", f10); err != nil {
		return nil, err
	}
	b := &Batch{model: model, f10: f10, xmax: 1}
	g := func(f float64) float64 { return f - model.Instantaneous(f) }
	d := g(f10)
	if d == 0 {
		b.still, b.end = true, f10
		return b, nil
	}
	step := 1e-3
	edge := 1.0
	if d < 0 {
		step, edge = -step, 0
	}
	b.end = edge
	prev := f10
	for f := f10 + step; (step > 0 && f < 1) || (step < 0 && f > 0); f += step {
		if g(f)*d <= 0 {
			lo, hi := prev, f
			for range 60 {
				mid := 0.5 * (lo + hi)
				if g(mid)*d > 0 {
					lo = mid
				} else {
					hi = mid
				}
			}
			b.end = 0.5 * (lo + hi)
			break
		}
		prev = f
	}
	if (b.end == 0 || b.end == 1) && model.Instantaneous(b.end) != b.end {
		b.xmax = 1 - math.Exp(b.skeistLog(b.end))
	}
	return b, nil
}

// nearSingular is the distance from r1 = 1, r2 = 1 and r1 + r2 = 2 below which the Meyer–Lowry
// exponents are too large for full precision and the Skeist ODE is used instead. At 1e-3 the
// closed form still agrees with the ODE to better than 1e-10 (see drift_test.go).
const nearSingular = 1e-3

// newBatch is NewBatch for the terminal model.
func newBatch(m Terminal, f10 float64) (*Batch, error) {
	if err := m.Validate(); err != nil {
		return nil, err
	}
	if err := CheckFraction("f10", f10); err != nil {
		return nil, err
	}
	b := &Batch{m: m, f10: f10, xmax: 1}
	d := f10 - m.Instantaneous(f10)
	switch {
	case d == 0:
		b.still, b.end = true, f10
		return b, nil
	case d < 0: // M1 is consumed faster: f1 falls towards the next fixed point below.
		b.end = 0
		if az, ok := m.Azeotrope(); ok && az < f10 && az > 0 {
			b.end = az
		}
	default:
		b.end = 1
		if az, ok := m.Azeotrope(); ok && az > f10 && az < 1 {
			b.end = az
		}
	}
	b.closed = math.Abs(1-m.R1) >= nearSingular && math.Abs(1-m.R2) >= nearSingular &&
		math.Abs(2-m.R1-m.R2) >= nearSingular
	if b.closed {
		b.setMeyerLowry()
	}
	// When the end is 0 or 1 but is not a fixed point of F1 (r2 = 0 or r1 = 0), the monomer that
	// is left cannot add to its own radical and polymerization stops short of full conversion.
	if (b.end == 0 || b.end == 1) && m.Instantaneous(b.end) != b.end {
		b.xmax = 1 - math.Exp(b.skeistLog(b.end))
	}
	return b, nil
}

// setMeyerLowry sets the exponents α, β, γ and the singular point δ of the Meyer–Lowry form
// (see meyerLowryLog).
func (b *Batch) setMeyerLowry() {
	r1, r2 := b.m.R1, b.m.R2
	b.alpha = r2 / (1 - r2)
	b.beta = r1 / (1 - r1)
	b.gamma = (1 - r1*r2) / ((1 - r1) * (1 - r2))
	b.delta = (1 - r2) / (2 - r1 - r2)
}

// skeistLog returns ln(1 − X) at which the unreacted mixture reaches f, by Gauss–Legendre
// quadrature of the integral Skeist equation
//
//	ln(M/M0) = ∫ from f10 to f of df′ / (F1(f′) − f′)
//
// taken in u = ln|f′ − end|, in which the integrand (f′ − end)/(F1 − f′) stays bounded up to the
// end point.
//
// References:
//   - I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781.
func (b *Batch) skeistLog(f float64) float64 {
	s := 1.0
	if b.f10 < b.end {
		s = -1
	}
	u0 := math.Log(s * (b.f10 - b.end))
	var u1 float64
	if f == b.end {
		// Only reached when F1(end) ≠ end: the integrand then falls off as e^u, and e^(−60) of
		// the range is below double precision.
		u1 = u0 - 60
	} else {
		u1 = math.Log(s * (f - b.end))
	}
	g := func(u float64) float64 {
		dv := s * math.Exp(u)
		fv := b.end + dv
		return dv / (b.inst(fv) - fv)
	}
	// The integrand is smooth; split the range so each panel stays short.
	const panel = 4.0
	n := int(math.Ceil(math.Abs(u1-u0)/panel)) + 1
	var sum float64
	for i := 0; i < n; i++ {
		a := u0 + (u1-u0)*float64(i)/float64(n)
		c := u0 + (u1-u0)*float64(i+1)/float64(n)
		if a > c {
			sum -= quad.Fixed(g, c, a, 64, quad.Legendre{}, 1)
		} else {
			sum += quad.Fixed(g, a, c, 64, quad.Legendre{}, 1)
		}
	}
	return sum
}

// meyerLowryLog returns ln(1 − X) at which the unreacted mixture has the composition
// f = end + (f10 − end)·e^(−s), from the Meyer–Lowry integrated equation
//
//	1 − X = (f1/f10)^α ((1 − f1)/(1 − f10))^β ((f10 − δ)/(f1 − δ))^γ
//	α = r2/(1 − r2),  β = r1/(1 − r1),  γ = (1 − r1 r2)/((1 − r1)(1 − r2)),  δ = (1 − r2)/(2 − r1 − r2)
//
// The factor that vanishes at the end point is taken from s exactly, so the form keeps full
// precision when one monomer is nearly used up.
//
// References:
//   - V. E. Meyer, G. G. Lowry, J. Polym. Sci. A 1965, 3, 2843.
func (b *Batch) meyerLowryLog(s float64) float64 {
	f := b.end + (b.f10-b.end)*math.Exp(-s)
	l1 := math.Log(f / b.f10)
	l2 := math.Log((1 - f) / (1 - b.f10))
	l3 := -math.Log((f - b.delta) / (b.f10 - b.delta))
	switch b.end {
	case 0:
		l1 = -s
	case 1:
		l2 = -s
	default: // the azeotrope δ
		l3 = s
	}
	var sum float64
	// A zero exponent multiplies a log that may be −∞ at the end point: skip it.
	if b.alpha != 0 {
		sum += b.alpha * l1
	}
	if b.beta != 0 {
		sum += b.beta * l2
	}
	return sum + b.gamma*l3
}

// Model returns the model of the batch.
func (b *Batch) Model() Model {
	if b.model != nil {
		return b.model
	}
	return b.m
}

// MaxConversion returns the largest overall molar conversion the batch can reach: 1, or less when
// the monomer left over cannot add to its own radical (r = 0; see [Terminal.Drift]).
func (b *Batch) MaxConversion() float64 { return b.xmax }

// FeedAt writes the unreacted feed f1 at each overall molar conversion of xs (ascending, each at
// most [Batch.MaxConversion]) into dst, which must be as long as xs, and returns dst. The
// conversions are not validated; [Batch.Drift] validates.
func (b *Batch) FeedAt(dst, xs []float64) []float64 {
	b.feedAt(dst, xs)
	return dst
}

// feedAt returns f1 at each conversion in xs (ascending, each ≤ b.xmax) into dst.
func (b *Batch) feedAt(dst, xs []float64) {
	if b.still {
		for i := range xs {
			dst[i] = b.f10
		}
		return
	}
	if b.closed {
		for i, x := range xs {
			dst[i] = b.closedFeed(x)
		}
		return
	}
	b.odeFeed(dst, xs)
}

// closedFeed inverts the Meyer–Lowry form for f1 at conversion x (see closedFeedFrom).
func (b *Batch) closedFeed(x float64) float64 {
	f, _ := b.closedFeedFrom(x, 0)
	return f
}

// closedFeedFrom inverts the Meyer–Lowry form for f1 at conversion x: Newton's method on s, in
// which ln(1 − X) decreases monotonically. A positive guess s0 (from a nearby solution) starts
// the iteration; when a step misbehaves (leaves s ≥ 0 or fails to shrink the residual) the
// search falls back to a bracket with bisection. It also returns the solution s, to seed the next
// call.
func (b *Batch) closedFeedFrom(x, s0 float64) (f, s float64) {
	if x == 0 {
		return b.f10, 0
	}
	if x >= b.xmax {
		return b.end, math.Inf(1)
	}
	target := math.Log1p(-x)
	if s0 > 0 && !math.IsInf(s0, 0) {
		s = s0
		v, d := b.meyerLowryNewton(s, target)
		for range 30 {
			next := s - v/d
			if !(next >= 0) || math.IsInf(next, 0) {
				break
			}
			nv, nd := b.meyerLowryNewton(next, target)
			if !(math.Abs(nv) < math.Abs(v)) {
				if math.Abs(nv) <= 1e-15*math.Max(1, math.Abs(target)) {
					return b.end + (b.f10-b.end)*math.Exp(-next), next
				}
				break
			}
			s, v, d = next, nv, nd
			if math.Abs(v) <= 1e-15*math.Max(1, math.Abs(target)) {
				return b.end + (b.f10-b.end)*math.Exp(-s), s
			}
		}
	}
	h := func(s float64) float64 { return b.meyerLowryLog(s) - target }
	lo, hi := 0.0, 1.0
	for h(hi) > 0 {
		lo, hi = hi, 2*hi
		if hi > 1e4 {
			return b.end, math.Inf(1)
		}
	}
	s = 0.5 * (lo + hi)
	for range 100 {
		v, d := b.meyerLowryNewton(s, target)
		if v == 0 {
			break
		}
		if v > 0 {
			lo = s
		} else {
			hi = s
		}
		next := s - v/d
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-s) <= 1e-15*math.Max(1, s) || hi-lo <= 1e-15*math.Max(1, hi) {
			s = next
			break
		}
		s = next
	}
	return b.end + (b.f10-b.end)*math.Exp(-s), s
}

// meyerLowryNewton returns meyerLowryLog(s) − target and its slope in s, sharing the work.
func (b *Batch) meyerLowryNewton(s, target float64) (v, d float64) {
	e := math.Exp(-s)
	dv := (b.f10 - b.end) * e // f − end
	f := b.end + dv
	var l1, l2, l3, t1, t2, t3 float64
	switch b.end {
	case 0:
		l1, l2, l3 = -s, math.Log((1-f)/(1-b.f10)), -math.Log((f-b.delta)/(b.f10-b.delta))
		t1, t2, t3 = -1, dv/(1-f), dv/(f-b.delta)
	case 1:
		l1, l2, l3 = math.Log(f/b.f10), -s, -math.Log((f-b.delta)/(b.f10-b.delta))
		t1, t2, t3 = -dv/f, -1, dv/(f-b.delta)
	default:
		l1, l2, l3 = math.Log(f/b.f10), math.Log((1-f)/(1-b.f10)), s
		t1, t2, t3 = -dv/f, dv/(1-f), 1
	}
	if b.alpha != 0 {
		v += b.alpha * l1
		d += b.alpha * t1
	}
	if b.beta != 0 {
		v += b.beta * l2
		d += b.beta * t2
	}
	return v + b.gamma*l3 - target, d + b.gamma*t3
}

// odeFeed integrates the Skeist equation in differential form,
//
//	df1/dX = (f1 − F1(f1)) / (1 − X)
//
// in the variables t = −ln(1 − X) and y = ln|f1 − end|, where it reads dy/dt = (f1 − F1)/(f1 − end):
// bounded near the end point, so the exhaustion of a monomer is not stiff.
//
// References:
//   - I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781.
func (b *Batch) odeFeed(dst, xs []float64) {
	s := 1.0
	if b.f10 < b.end {
		s = -1
	}
	g := func(y float64) float64 {
		dv := s * math.Exp(y)
		f := b.end + dv
		return (f - b.inst(f)) / dv
	}
	ts := make([]float64, len(xs))
	for i, x := range xs {
		ts[i] = -math.Log1p(-math.Min(x, b.xmax))
	}
	// Conversions at (or rounding to) the limit map to t = +Inf: integrate to the last finite one.
	n := len(ts)
	for n > 0 && (math.IsInf(ts[n-1], 1) || xs[n-1] >= b.xmax) {
		n--
	}
	ys := make([]float64, n)
	ode.Dopri5(ys, g, 0, math.Log(s*(b.f10-b.end)), ts[:n], 1e-13, 1e-13)
	for i := range n {
		dst[i] = b.end + s*math.Exp(ys[i])
	}
	for i := n; i < len(xs); i++ {
		dst[i] = b.end
	}
}

// cumulative returns F̄1 from the monomer balance
//
//	F̄1 = (f10 − (1 − X) f1) / X
//
// clamped to [0, 1]. Below X = 1e-7 the balance loses precision and the mean of the first and
// current instantaneous compositions is returned instead (exact to first order in X).
func (b *Batch) cumulative(x, f1 float64) float64 {
	if x < 1e-7 {
		return 0.5 * (b.inst(b.f10) + b.inst(f1))
	}
	c := (b.f10 - (1-x)*f1) / x
	return math.Min(1, math.Max(0, c))
}

func (b *Batch) checkConversions(xs []float64) error {
	if len(xs) > MaxPoints {
		return &InputError{Field: "conversion", Value: float64(len(xs)), Reason: fmt.Sprintf("at most %d conversions per call", MaxPoints), Err: ErrTooMany}
	}
	for i, x := range xs {
		if x >= 0 && x <= 1 && (i == 0 || x >= xs[i-1]) && x <= b.xmax {
			continue // valid; the field name is built only on error
		}
		field := fmt.Sprintf("conversion[%d]", i)
		if err := CheckConversion(field, x); err != nil {
			return err
		}
		if i > 0 && x < xs[i-1] {
			return &InputError{Field: field, Value: x, Reason: fmt.Sprintf("conversions must not decrease (the one before is %g)", xs[i-1]), Err: ErrOutOfRange}
		}
		if err := b.checkConversion(field, x); err != nil {
			return err
		}
	}
	return nil
}

// checkConversion reports a conversion x (already in [0, 1]) past the end of the batch, naming
// field.
func (b *Batch) checkConversion(field string, x float64) error {
	if x > b.xmax {
		return &InputError{Field: field, Value: x, Reason: fmt.Sprintf("polymerization stops at X = %.4g: M%d is used up and the other monomer cannot add to its own radical (r = 0)", b.xmax, 1+int(b.end)), Err: ErrOutOfRange}
	}
	return nil
}

// Drift returns the composition of a batch started from feed f10 at each overall molar
// conversion in conversion (non-decreasing, each in [0, 1]).
//
// The unreacted feed f1(X) comes from the Meyer–Lowry closed form (see [Terminal.MeyerLowry])
// where it is well conditioned, and otherwise from the Skeist equation integrated numerically:
// for r1 or r2 within 1e-3 of 1 and for r1 + r2 within 1e-3 of 2. A feed at the azeotrope, at 0
// or at 1, or with r1 = r2 = 1, does not drift. At X = 1 the feed is reported at its limit (the
// end point of the drift) and F̄1 = f10.
//
// When r2 = 0 (or r1 = 0) and the other monomer runs out first, polymerization stops below full
// conversion; a conversion past that point gives an [*InputError].
//
// References:
//   - I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781.
//   - V. E. Meyer, G. G. Lowry, J. Polym. Sci. A 1965, 3, 2843.
//
// It is the shorthand for NewBatch(m, f10) and [Batch.Drift], which take any [Model].
func (m Terminal) Drift(f10 float64, conversion []float64) (*Drift, error) {
	b, err := newBatch(m, f10)
	if err != nil {
		return nil, err
	}
	return b.Drift(conversion)
}

// Drift returns the composition of the batch at each overall molar conversion in conversion
// (non-decreasing, each in [0, 1] and at most [Batch.MaxConversion]); see [Terminal.Drift].
func (b *Batch) Drift(conversion []float64) (*Drift, error) {
	if err := b.checkConversions(conversion); err != nil {
		return nil, err
	}
	n := len(conversion)
	d := &Drift{
		Conversion: append([]float64(nil), conversion...),
		Feed:       make([]float64, n),
		Inst:       make([]float64, n),
		Cum:        make([]float64, n),
	}
	switch {
	case b.still:
		d.Method = MethodNoDrift
	case b.closed:
		d.Method = MethodMeyerLowry
	default:
		d.Method = MethodSkeist
	}
	b.feedAt(d.Feed, conversion)
	for i, x := range conversion {
		d.Inst[i] = b.inst(d.Feed[i])
		if x >= b.xmax && b.xmax == 1 {
			d.Cum[i] = b.f10
		} else {
			d.Cum[i] = b.cumulative(x, d.Feed[i])
		}
	}
	if n > 0 {
		d.Exhausted = b.exhaustion(conversion[n-1])
	}
	return d, nil
}

// exhaustion reports the conversion at which the monomer being used up falls below
// ExhaustedFraction, when that happens at or before last.
func (b *Batch) exhaustion(last float64) *Exhaustion {
	if b.still || (b.end != 0 && b.end != 1) {
		return nil
	}
	monomer, f := 1, ExhaustedFraction
	if b.end == 1 {
		monomer, f = 2, 1-ExhaustedFraction
	}
	if (b.end == 0 && b.f10 <= f) || (b.end == 1 && b.f10 >= f) {
		return &Exhaustion{Monomer: monomer, Conversion: 0}
	}
	var l float64
	if b.closed {
		l = b.meyerLowryLog(math.Log((b.f10 - b.end) / (f - b.end)))
	} else {
		l = b.skeistLog(f)
	}
	x := -math.Expm1(l)
	if x > last {
		return nil
	}
	return &Exhaustion{Monomer: monomer, Conversion: x}
}

// MeyerLowry returns the overall molar conversion X at which a batch started from feed f10 has an
// unreacted mixture of composition f1 (the Meyer–Lowry integrated equation, see
// [Terminal.Drift]). It is NaN when f1 is not on the path from f10 (the wrong side, or past the
// end point), and when the closed form is singular: r1 = 1, r2 = 1 or r1 + r2 = 2.
func (m Terminal) MeyerLowry(f10, f1 float64) float64 {
	if m.Validate() != nil || CheckFraction("f10", f10) != nil || CheckFraction("f1", f1) != nil ||
		m.R1 == 1 || m.R2 == 1 || m.R1+m.R2 == 2 {
		return math.NaN()
	}
	b, _ := newBatch(m, f10)
	if b.still {
		if f1 == f10 {
			return 0
		}
		return math.NaN()
	}
	if (f1-b.end)*(f10-b.end) <= 0 || math.Abs(f1-b.end) > math.Abs(f10-b.end) {
		return math.NaN()
	}
	b.setMeyerLowry()
	return -math.Expm1(b.meyerLowryLog(math.Log((f10 - b.end) / (f1 - b.end))))
}
