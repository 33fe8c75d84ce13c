package fit

import (
	"fmt"
	"math"
	"sort"

	"copoly/copoly"
)

// Linear is the result of a linearised (historical) estimation method: a straight line fitted by
// ordinary least squares to transformed data, and the reactivity ratios read from it. These
// methods distort the error structure and depend on which monomer is called M1; copoly shows them
// beside the nonlinear fit as starting values and for comparison, never as the recommended
// estimate.
type Linear struct {
	R1, R2 float64
	// X and Y are the transformed points the line is fitted to, in the method's own axes.
	X, Y []float64
	// Slope and Intercept of the fitted line Y = Slope·X + Intercept.
	Slope, Intercept float64
	// Alpha is the Kelen–Tüdős shift α (zero for other methods).
	Alpha float64
}

// lowConversionRatios returns the feed and copolymer mole ratios x = f1/f2 and y = F1/F2 of each
// run. Runs with a composition at 0 or 1 carry no ratio and give an error.
func lowConversionRatios(runs []copoly.Run) (x, y []float64, err error) {
	x = make([]float64, len(runs))
	y = make([]float64, len(runs))
	for i, r := range runs {
		if !(r.F10 > 0 && r.F10 < 1) {
			return nil, nil, &copoly.InputError{Field: fmt.Sprintf("runs[%d].f10", i), Value: r.F10, Reason: "linear methods need a feed strictly between 0 and 1", Err: copoly.ErrOutOfRange}
		}
		if !(r.F1 > 0 && r.F1 < 1) {
			return nil, nil, &copoly.InputError{Field: fmt.Sprintf("runs[%d].F1", i), Value: r.F1, Reason: "linear methods need a copolymer composition strictly between 0 and 1", Err: copoly.ErrOutOfRange}
		}
		x[i] = r.F10 / (1 - r.F10)
		y[i] = r.F1 / (1 - r.F1)
	}
	return x, y, nil
}

// ols fits y = a·x + b by ordinary least squares. It needs at least two distinct x.
func ols(x, y []float64) (slope, intercept float64, ok bool) {
	n := float64(len(x))
	if len(x) < 2 {
		return 0, 0, false
	}
	var mx, my float64
	for i := range x {
		mx += x[i]
		my += y[i]
	}
	mx /= n
	my /= n
	var sxx, sxy float64
	for i := range x {
		sxx += (x[i] - mx) * (x[i] - mx)
		sxy += (x[i] - mx) * (y[i] - my)
	}
	if !(sxx > 0) || math.IsInf(sxx, 0) {
		return 0, 0, false
	}
	slope = sxy / sxx
	return slope, my - slope*mx, true
}

// errLine reports a method whose straight line cannot be fitted.
func errLine(method string) error {
	return &copoly.FieldError{Field: "runs", Reason: method + " needs at least two runs with different feeds", Err: copoly.ErrOutOfRange}
}

// FinemanRoss estimates r1 and r2 by the Fineman–Ross linearisation of the Mayo–Lewis
// equation, fitted by ordinary least squares:
//
//	G = r1 H − r2,  G = x(y − 1)/y,  H = x²/y,  x = f1/f2,  y = F1/F2
//
// It treats every run as low conversion (Conversion is ignored).
//
// References:
//   - M. Fineman, S. D. Ross, J. Polym. Sci. 1950, 5, 259.
func FinemanRoss(runs []copoly.Run) (Linear, error) {
	x, y, err := lowConversionRatios(runs)
	if err != nil {
		return Linear{}, err
	}
	l := Linear{X: make([]float64, len(x)), Y: make([]float64, len(x))}
	for i := range x {
		l.Y[i] = x[i] * (y[i] - 1) / y[i] // G
		l.X[i] = x[i] * x[i] / y[i]       // H
	}
	var ok bool
	if l.Slope, l.Intercept, ok = ols(l.X, l.Y); !ok {
		return Linear{}, errLine("Fineman–Ross")
	}
	l.R1, l.R2 = l.Slope, -l.Intercept
	return l, nil
}

// InvertedFinemanRoss estimates r1 and r2 from the Fineman–Ross equation divided by H,
//
//	G/H = r1 − r2 (1/H)
//
// fitted by ordinary least squares. It equals [FinemanRoss] with the monomer labels swapped.
//
// References:
//   - M. Fineman, S. D. Ross, J. Polym. Sci. 1950, 5, 259.
func InvertedFinemanRoss(runs []copoly.Run) (Linear, error) {
	x, y, err := lowConversionRatios(runs)
	if err != nil {
		return Linear{}, err
	}
	l := Linear{X: make([]float64, len(x)), Y: make([]float64, len(x))}
	for i := range x {
		G := x[i] * (y[i] - 1) / y[i]
		H := x[i] * x[i] / y[i]
		l.X[i] = 1 / H
		l.Y[i] = G / H
	}
	var ok bool
	if l.Slope, l.Intercept, ok = ols(l.X, l.Y); !ok {
		return Linear{}, errLine("inverted Fineman–Ross")
	}
	l.R1, l.R2 = l.Intercept, -l.Slope
	return l, nil
}

// kelenTudos fits the Kelen–Tüdős line to G and H:
//
//	η = G/(α + H),  ξ = H/(α + H),  α = √(H_min H_max)
//	η = (r1 + r2/α) ξ − r2/α
//
// so r2 = −α·intercept and r1 = slope + intercept.
func kelenTudos(G, H []float64, method string) (Linear, error) {
	hmin, hmax := math.Inf(1), math.Inf(-1)
	for _, h := range H {
		hmin, hmax = math.Min(hmin, h), math.Max(hmax, h)
	}
	l := Linear{Alpha: math.Sqrt(hmin * hmax), X: make([]float64, len(H)), Y: make([]float64, len(H))}
	if !(l.Alpha > 0) || math.IsInf(l.Alpha, 0) {
		return Linear{}, &copoly.FieldError{Field: "runs", Reason: method + ": the data give no positive α", Err: copoly.ErrOutOfRange}
	}
	for i := range H {
		l.X[i] = H[i] / (l.Alpha + H[i])
		l.Y[i] = G[i] / (l.Alpha + H[i])
	}
	var ok bool
	if l.Slope, l.Intercept, ok = ols(l.X, l.Y); !ok {
		return Linear{}, errLine(method)
	}
	l.R2 = -l.Alpha * l.Intercept
	l.R1 = l.Slope + l.Intercept
	return l, nil
}

// KelenTudos estimates r1 and r2 by the Kelen–Tüdős method (see kelenTudos) with the
// low-conversion G = x(y − 1)/y and H = x²/y of [FinemanRoss], α from the extreme H of the data.
//
// References:
//   - T. Kelen, F. Tüdős, J. Macromol. Sci. Chem. 1975, A9, 1.
func KelenTudos(runs []copoly.Run) (Linear, error) {
	x, y, err := lowConversionRatios(runs)
	if err != nil {
		return Linear{}, err
	}
	G, H := make([]float64, len(x)), make([]float64, len(x))
	for i := range x {
		G[i] = x[i] * (y[i] - 1) / y[i]
		H[i] = x[i] * x[i] / y[i]
	}
	return kelenTudos(G, H, "Kelen–Tüdős")
}

// ExtendedKelenTudos estimates r1 and r2 by the Kelen–Tüdős method extended to moderate
// conversion, which replaces the feed ratio by a conversion-averaged one:
//
//	ζ2 = X (1 + x)/(1 + y)   (fraction of M2 converted),  ζ1 = ζ2 y/x
//	z = ln(1 − ζ1)/ln(1 − ζ2),  G = (y − 1)/z,  H = y/z²
//
// The published form uses the mass conversion w and the molar-mass ratio μ = M2/M1,
// ζ2 = w (μ + x)/(μ + y); with w converted to the molar conversion X it reduces to the form
// above, so no molar masses are needed here. Runs without a conversion are taken at the
// low-conversion limit z = y/x. It needs ζ1, ζ2 < 1; a run that breaks its monomer balance
// gives an error naming it.
//
// References:
//   - F. Tüdős, T. Kelen, T. Földes-Berezsnich, B. Turcsányi, J. Macromol. Sci. Chem. 1976,
//     A10, 1513.
//   - T. Kelen, F. Tüdős, B. Turcsányi, J. P. Kennedy, J. Polym. Sci. Polym. Chem. Ed. 1977,
//     15, 3047.
func ExtendedKelenTudos(runs []copoly.Run) (Linear, error) {
	x, y, err := lowConversionRatios(runs)
	if err != nil {
		return Linear{}, err
	}
	G, H := make([]float64, len(x)), make([]float64, len(x))
	for i, r := range runs {
		z := y[i] / x[i]
		if r.Conversion > 0 {
			z2 := r.Conversion * (1 + x[i]) / (1 + y[i])
			z1 := z2 * y[i] / x[i]
			if !(z1 < 1 && z2 < 1) {
				return Linear{}, &copoly.InputError{Field: fmt.Sprintf("runs[%d].conversion", i), Value: r.Conversion,
					Reason: fmt.Sprintf("row %d: more monomer in the copolymer than was charged (converted fractions %.3g of M1, %.3g of M2)", i+1, z1, z2), Err: copoly.ErrOutOfRange}
			}
			z = math.Log1p(-z1) / math.Log1p(-z2)
		}
		G[i] = (y[i] - 1) / z
		H[i] = y[i] / (z * z)
	}
	return kelenTudos(G, H, "extended Kelen–Tüdős")
}

// mayoLewisP holds the values of p = (1 − r1)/(1 − r2) at which the curves of
// [MayoLewisCurve] are evaluated: −100 to 100 with p = sinh(t), denser near 0.
var mayoLewisP = func() []float64 {
	const n = 200
	p := make([]float64, 0, n+1)
	for k := 0; k <= n; k++ {
		if v := math.Sinh(-5.3 + 10.6*float64(k)/n); v != 0 {
			p = append(p, v)
		}
	}
	return p
}()

// mayoLewisR2 returns, for each p in mayoLewisP, the r2 of the integrated Mayo–Lewis equation
// (see [MayoLewisCurve]), NaN where it has no solution with r1, r2 ≥ 0.
func mayoLewisR2(run copoly.Run) ([]float64, error) {
	m10, m20 := run.F10, 1-run.F10
	m1 := m10 - run.F1*run.Conversion
	m2 := m20 - (1-run.F1)*run.Conversion
	if !(run.Conversion > 0) || !(m1 > 0 && m2 > 0 && m10 > 0 && m20 > 0) || m1 >= m10 || m2 >= m20 {
		return nil, &copoly.FieldError{Field: "runs", Reason: "the integrated Mayo–Lewis curve needs a run with a conversion, a feed and a copolymer strictly between 0 and 1, and a monomer balance that closes", Err: copoly.ErrOutOfRange}
	}
	q0, q := m10/m20, m1/m2
	out := make([]float64, len(mayoLewisP))
	for k, p := range mayoLewisP {
		out[k] = math.NaN()
		a, b := 1-p*q, 1-p*q0
		if a <= 0 || b <= 0 {
			continue
		}
		l := math.Log(a / b)
		v2 := (math.Log(m20/m2) - l/p) / (math.Log(m10/m1) + l)
		v1 := 1 - p*(1-v2)
		if v1 >= 0 && v2 >= 0 && v1 <= copoly.MaxRatio && v2 <= copoly.MaxRatio {
			out[k] = v2
		}
	}
	return out, nil
}

// MayoLewisCurve returns points (r1, r2) consistent with one run taken to a finite conversion,
// from the integrated Mayo–Lewis equation solved for r2 at chosen p = (1 − r1)/(1 − r2):
//
//	r2 = [ln(M2⁰/M2) − (1/p) ln((1 − p M1/M2)/(1 − p M1⁰/M2⁰))]
//	     / [ln(M1⁰/M1) + ln((1 − p M1/M2)/(1 − p M1⁰/M2⁰))],   r1 = 1 − p(1 − r2)
//
// with the moles left M1 = f10 − F̄1 X and M2 = (1 − f10) − (1 − F̄1) X per mole charged. Only
// points with r1, r2 ≥ 0 are returned, in order of p. The curves of several runs cross near the
// reactivity ratios (the intersection method; see [MayoLewisIntersection]).
//
// References:
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594.
func MayoLewisCurve(run copoly.Run) (r1, r2 []float64, err error) {
	v, err := mayoLewisR2(run)
	if err != nil {
		return nil, nil, err
	}
	for k, p := range mayoLewisP {
		if !math.IsNaN(v[k]) {
			r1 = append(r1, 1-p*(1-v[k]))
			r2 = append(r2, v[k])
		}
	}
	return r1, r2, nil
}

// MaxIntersectionRuns is the most runs [MayoLewisIntersection] takes: the crossings of every
// pair of curves grow as the square of the runs (a thousand runs took seconds and megabytes),
// and a graphical method is read from a handful of curves. [Estimate] skips the method, with a
// warning, above it.
const MaxIntersectionRuns = 200

// MayoLewisIntersection estimates r1 and r2 from runs taken to finite conversion by the
// intersection method: each run gives a curve of consistent (r1, r2) ([MayoLewisCurve]); the
// estimate is the median of the pairwise crossing points. Two curves cross where they share both
// r2 and p = (1 − r1)/(1 − r2), so the crossings are found along p. It needs at least two runs
// with a conversion whose curves cross, and at most [MaxIntersectionRuns] of them. Curves
// returns the curves for plotting, one per usable run.
func MayoLewisIntersection(runs []copoly.Run) (r1, r2 float64, curves [][2][]float64, err error) {
	var vs [][]float64
	for _, r := range runs {
		v, err := mayoLewisR2(r)
		if err != nil {
			continue
		}
		c1, c2, _ := MayoLewisCurve(r)
		if len(c1) > 1 {
			vs = append(vs, v)
			curves = append(curves, [2][]float64{c1, c2})
		}
	}
	if len(vs) < 2 {
		return 0, 0, curves, &copoly.FieldError{Field: "runs", Reason: "the Mayo–Lewis intersection method needs at least two runs with a conversion", Err: copoly.ErrOutOfRange}
	}
	if len(vs) > MaxIntersectionRuns {
		return 0, 0, nil, &copoly.InputError{Field: "runs", Value: float64(len(vs)), Reason: fmt.Sprintf("the Mayo–Lewis intersection method, a graphical method, takes at most %d runs with a conversion (it crosses every pair of curves)", MaxIntersectionRuns), Err: copoly.ErrTooMany}
	}
	var xs, ys []float64
	for i := range vs {
		for j := i + 1; j < len(vs); j++ {
			a, b := vs[i], vs[j]
			for k := 0; k+1 < len(mayoLewisP); k++ {
				d0, d1 := a[k]-b[k], a[k+1]-b[k+1]
				if math.IsNaN(d0+d1) || d0*d1 > 0 || d0 == d1 || mayoLewisP[k]*mayoLewisP[k+1] < 0 {
					continue
				}
				t := d0 / (d0 - d1)
				p := mayoLewisP[k] + t*(mayoLewisP[k+1]-mayoLewisP[k])
				v2 := a[k] + t*(a[k+1]-a[k])
				xs = append(xs, 1-p*(1-v2))
				ys = append(ys, v2)
			}
		}
	}
	if len(xs) == 0 {
		return 0, 0, curves, &copoly.FieldError{Field: "runs", Reason: "the Mayo–Lewis curves of these runs do not cross", Err: copoly.ErrOutOfRange}
	}
	return median(xs), median(ys), curves, nil
}

func median(v []float64) float64 {
	s := append([]float64(nil), v...)
	sort.Float64s(s)
	n := len(s)
	if n%2 == 1 {
		return s[n/2]
	}
	return 0.5 * (s[n/2-1] + s[n/2])
}

// LinearConversionLimit is the highest conversion at which the linear low-conversion methods
// (Fineman–Ross, Kelen–Tüdős) are usually applied: 10 % (common practice, no source).
const LinearConversionLimit = 0.10

// LinearMethodWarnings returns a warning for each run whose conversion is above
// [LinearConversionLimit]: the linear methods treat the copolymer as made from the initial feed,
// which drift makes less true as conversion rises. Runs without a conversion are taken as low
// conversion.
func LinearMethodWarnings(runs []copoly.Run) []copoly.RunWarning {
	var w []copoly.RunWarning
	for i, r := range runs {
		if r.Conversion > LinearConversionLimit {
			w = append(w, copoly.RunWarning{Row: i, Field: fmt.Sprintf("runs[%d].conversion", i), Code: copoly.CodeHighConversion, Message: fmt.Sprintf(
				"row %d: X = %.3g is above %g (%g %%): the linear methods assume the feed did not drift; use the integrated model for this row",
				i+1, r.Conversion, LinearConversionLimit, 100*LinearConversionLimit)})
		}
	}
	return w
}
