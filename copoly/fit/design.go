package fit

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// Design suggests where to run the next copolymerizations to shrink the joint confidence region
// of (r1, r2) the most.
type Design struct {
	// TidwellMortimer holds the two feeds f1″ ≈ r2/(2 + r2) and f1′ ≈ 2/(2 + r1) (in that order,
	// ascending for any r1, r2 ≥ 0), the widely quoted approximation to the D-optimal design at
	// low conversion.
	TidwellMortimer [2]float64
	// DOptimal holds the exact D-optimal pair of low-conversion feeds: the two feeds that
	// maximise det(JᵀJ), J the sensitivities ∂F1/∂(r1, r2) of the Mayo–Lewis equation.
	DOptimal [2]float64
	// Middle is a feed between the two optimal ones, recommended in addition so that a misfit of
	// the model can show.
	Middle float64
	// Next holds the two runs (feed and conversion to stop at) that, added to the runs already
	// made, maximise the determinant of the information matrix of the integrated model.
	Next [2]Suggestion
	// Shrink is the factor by which the area of the (linearised) region shrinks when Next is
	// added: √(det before / det after); 0 when there were no runs before.
	Shrink float64
}

// Suggestion is one proposed run.
type Suggestion struct {
	F10, Conversion float64
}

// mayoLewisSensitivity returns ∂F1/∂r1 and ∂F1/∂r2 of the Mayo–Lewis equation at feed f1:
//
//	F1 = N/D,  N = r1 f1² + f1 f2,  D = N + f1 f2 + r2 f2²
//	∂F1/∂r1 = f1² (D − N)/D²,  ∂F1/∂r2 = −N f2²/D²
func mayoLewisSensitivity(m copoly.Terminal, f1 float64) (d1, d2 float64) {
	f2 := 1 - f1
	n := m.R1*f1*f1 + f1*f2
	d := n + f1*f2 + m.R2*f2*f2
	return f1 * f1 * (d - n) / (d * d), -n * f2 * f2 / (d * d)
}

// DesignConversions are the stopping conversions [NextRuns] considers by default: low
// conversion and moderate ones, where samples carry the most information (common practice,
// no source).
var DesignConversions = []float64{0.05, 0.15, 0.3, 0.45, 0.6}

// MaxDesignConversions is the most stopping conversions [NextRuns] takes.
const MaxDesignConversions = 20

// NextRuns returns the experimental design for the current estimate (r1, r2) given the runs made
// so far (which may be empty): the Tidwell–Mortimer feeds, the exact D-optimal pair, a middle
// feed, and the two next runs over a grid of feeds (0.02 to 0.98) and the conversions given (nil
// for [DesignConversions]) that maximise det(M0 + J_aᵀJ_a + J_bᵀJ_b), M0 the information matrix
// of the runs made, all with a constant error in F1.
//
// References:
//   - P. W. Tidwell, G. A. Mortimer, J. Polym. Sci. A 1965, 3, 369 (the D-optimal criterion and
//     the approximate feeds).
//   - A. M. van Herk, Q. Liu, Macromol. Theory Simul. 2024, 33, 2400043.
func NextRuns(r1, r2 float64, made []copoly.Run, conversions []float64) (Design, error) {
	m := copoly.Terminal{R1: r1, R2: r2}
	if err := m.Validate(); err != nil {
		return Design{}, err
	}
	if len(made) > 1000 {
		return Design{}, &copoly.InputError{Field: "runs", Value: float64(len(made)), Reason: "at most 1000 runs", Err: copoly.ErrTooMany}
	}
	if conversions == nil {
		conversions = DesignConversions
	}
	if len(conversions) == 0 || len(conversions) > MaxDesignConversions {
		return Design{}, &copoly.InputError{Field: "conversions", Value: float64(len(conversions)), Reason: fmt.Sprintf("give between 1 and %d stopping conversions", MaxDesignConversions), Err: copoly.ErrOutOfRange}
	}
	for i, x := range conversions {
		if err := copoly.CheckConversion(fmt.Sprintf("conversions[%d]", i), x); err != nil {
			return Design{}, err
		}
		if x >= 1 {
			return Design{}, &copoly.InputError{Field: fmt.Sprintf("conversions[%d]", i), Value: x, Reason: "a run stopped at full conversion carries no information", Err: copoly.ErrOutOfRange}
		}
	}
	var d Design
	d.TidwellMortimer = [2]float64{r2 / (2 + r2), 2 / (2 + r1)} // ascending, like DOptimal
	d.DOptimal = dOptimalPair(m)
	d.Middle = 0.5 * (d.DOptimal[0] + d.DOptimal[1])

	// Information of the runs made.
	var m11, m12, m22 float64
	for i, r := range made {
		if err := copoly.CheckFraction(fmt.Sprintf("runs[%d].f10", i), r.F10); err != nil {
			return Design{}, err
		}
		if err := copoly.CheckConversion(fmt.Sprintf("runs[%d].conversion", i), r.Conversion); err != nil {
			return Design{}, err
		}
		j1, j2 := ratioGradient(m, r.F10, r.Conversion)
		m11 += j1 * j1
		m12 += j1 * j2
		m22 += j2 * j2
	}
	before := m11*m22 - m12*m12
	type cand struct{ f, x, j1, j2 float64 }
	var cs []cand
	for _, x := range conversions {
		for k := 1; k <= 49; k++ {
			f := 0.02 * float64(k)
			j1, j2 := ratioGradient(m, f, x)
			cs = append(cs, cand{f, x, j1, j2})
		}
	}
	best := -1.0
	for i, a := range cs {
		for _, b := range cs[i:] {
			t11 := m11 + a.j1*a.j1 + b.j1*b.j1
			t12 := m12 + a.j1*a.j2 + b.j1*b.j2
			t22 := m22 + a.j2*a.j2 + b.j2*b.j2
			if det := t11*t22 - t12*t12; det > best {
				best = det
				d.Next = [2]Suggestion{{a.f, a.x}, {b.f, b.x}}
			}
		}
	}
	if d.Next[0].F10 > d.Next[1].F10 {
		d.Next[0], d.Next[1] = d.Next[1], d.Next[0]
	}
	if before > 0 && best > 0 {
		d.Shrink = math.Sqrt(before / best)
	}
	return d, nil
}

// dOptimalPair returns the two low-conversion feeds maximising |det J| of the Mayo–Lewis
// sensitivities (see [Design.DOptimal]): a grid search in steps of 0.0025, then a local pattern
// search to 1e-9.
func dOptimalPair(m copoly.Terminal) [2]float64 {
	det := func(a, b float64) float64 {
		a1, a2 := mayoLewisSensitivity(m, a)
		b1, b2 := mayoLewisSensitivity(m, b)
		return math.Abs(a1*b2 - a2*b1)
	}
	const n = 400
	s := make([][2]float64, n-1)
	for i := range s {
		f := float64(i+1) / n
		s[i][0], s[i][1] = mayoLewisSensitivity(m, f)
	}
	bi, bj, best := 0, 1, -1.0
	for i := range s {
		for j := i + 1; j < len(s); j++ {
			if v := math.Abs(s[i][0]*s[j][1] - s[i][1]*s[j][0]); v > best {
				bi, bj, best = i, j, v
			}
		}
	}
	a, b := float64(bi+1)/n, float64(bj+1)/n
	for step := 1.0 / n; step > 1e-9; step /= 2 {
		for moved := true; moved; {
			moved = false
			for _, c := range [][2]float64{{step, 0}, {-step, 0}, {0, step}, {0, -step}} {
				na, nb := a+c[0], b+c[1]
				if na > 0 && nb < 1 && na < nb {
					if v := det(na, nb); v > best {
						a, b, best, moved = na, nb, v, true
					}
				}
			}
		}
	}
	return [2]float64{a, b}
}
