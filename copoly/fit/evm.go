package fit

import (
	"math"
	"strconv"

	"copoly/copoly"
)

// EVM is the result of the error-in-variables fit.
type EVM struct {
	R1, R2         float64
	SE1, SE2, Corr float64
	// Phi is the minimised Φ = Σ_i [(f10 − f̂10)²/σf² + (X − X̂)²/σX² + (F1 − F̄1(f̂10, X̂))²/σF²].
	Phi float64
	// Feed, Conversion and Composition are the fitted true values of each run.
	Feed, Conversion, Composition []float64
	// ReducedChi2 = Φ/(N − 2) and its upper-tail probability under χ²(N − 2).
	ReducedChi2, PValue float64
	// Region is the linearised (elliptical) joint confidence region Δrᵀ C⁻¹ Δr ≤ χ²_2(level).
	Region Region
	// Iterations of the outer loop.
	Iterations int
}

// ErrorsInVariables estimates r1 and r2 by the error-in-variables method: the measured feed, conversion and
// copolymer composition of every run all carry error, and the fit finds the true values of each
// run together with the ratios,
//
//	Φ = Σ_i [(f10,i − f̂10,i)²/σf,i² + (X_i − X̂_i)²/σX,i² + (F1,i − F̄1(f̂10,i, X̂_i; r1, r2))²/σF,i²]
//
// minimised over r1, r2 and every (f̂10,i, X̂_i). It alternates, as Patino-Leal et al. do, between
// the true values of each run (Gauss–Newton on its two unknowns at fixed ratios) and a
// Gauss–Newton step in the ratios at fixed true values, until the ratios settle. Runs without a
// conversion keep X̂ = 0. Every run needs σF, σf > 0 and, when it has a conversion, σX > 0.
// The region returned is the linearised ellipse with the covariance from the effective variance
// σ_eff² = σF² + (∂F̄1/∂f10)² σf² + (∂F̄1/∂X)² σX² at the estimate.
//
// References:
//   - H. Patino-Leal, P. M. Reilly, K. F. O'Driscoll, J. Polym. Sci. Polym. Lett. Ed. 1980, 18, 219.
//   - R. van der Meer, H. N. Linssen, A. L. German, J. Polym. Sci. Polym. Chem. Ed. 1978, 16, 2915.
//   - N. Kazemi, T. A. Duever, A. Penlidis, Macromol. React. Eng. 2011, 5, 385 (cumulative data).
func ErrorsInVariables(runs []copoly.Run, r1, r2, level float64) (*EVM, error) {
	if err := checkRunsForFit(runs); err != nil {
		return nil, err
	}
	for i, r := range runs {
		if !(r.SF > 0) || !(r.Sf > 0) || (r.Conversion > 0 && !(r.SX > 0)) {
			return nil, &copoly.FieldError{Field: "runs", Reason: "error-in-variables needs the uncertainties of the feed, the conversion and the copolymer composition of every run (row " + strconv.Itoa(i+1) + " lacks one)", Err: copoly.ErrOutOfRange}
		}
	}
	if level == 0 {
		level = 0.95
	}
	if !(level > 0 && level < 1) {
		return nil, &copoly.InputError{Field: "level", Value: level, Reason: "the confidence level must lie between 0 and 1 (e.g. 0.95)", Err: copoly.ErrOutOfRange}
	}
	if err := (copoly.Terminal{R1: r1, R2: r2}).Validate(); err != nil {
		return nil, err
	}
	n := len(runs)
	a := make([]float64, n) // true feeds
	b := make([]float64, n) // true conversions
	for i, r := range runs {
		a[i], b[i] = r.F10, r.Conversion
	}
	res := &EVM{}
	phi := evmInner(runs, r1, r2, a, b)
	for it := 1; it <= 100; it++ {
		res.Iterations = it
		// Gauss–Newton in (r1, r2) at fixed true values, with step halving.
		m := copoly.Terminal{R1: r1, R2: r2}
		var a11, a12, a22, g1, g2 float64
		for i, r := range runs {
			j1, j2 := ratioGradient(m, a[i], b[i])
			w := 1 / (r.SF * r.SF)
			e := r.F1 - m.Cumulative(a[i], b[i])
			a11 += w * j1 * j1
			a12 += w * j1 * j2
			a22 += w * j2 * j2
			g1 += w * j1 * e
			g2 += w * j2 * e
		}
		det := a11*a22 - a12*a12
		if !(det > 0) {
			break
		}
		d1, d2 := (a22*g1-a12*g2)/det, (a11*g2-a12*g1)/det
		moved := false
		for step := 1.0; step > 1e-4; step /= 2 {
			n1 := math.Min(copoly.MaxRatio, math.Max(0, r1+step*d1))
			n2 := math.Min(copoly.MaxRatio, math.Max(0, r2+step*d2))
			na, nb := append([]float64(nil), a...), append([]float64(nil), b...)
			np := evmInner(runs, n1, n2, na, nb)
			if np < phi {
				done := math.Abs(n1-r1) <= 1e-9*math.Max(1e-3, r1) && math.Abs(n2-r2) <= 1e-9*math.Max(1e-3, r2)
				r1, r2, phi, a, b = n1, n2, np, na, nb
				moved = !done
				break
			}
		}
		if !moved {
			break
		}
	}
	res.R1, res.R2, res.Phi = r1, r2, phi
	res.Feed, res.Conversion = a, b
	res.Composition = make([]float64, n)
	m := copoly.Terminal{R1: r1, R2: r2}
	var c11, c12, c22 float64 // information matrix with effective variances
	for i, r := range runs {
		res.Composition[i] = m.Cumulative(a[i], b[i])
		j1, j2 := ratioGradient(m, r.F10, r.Conversion)
		fa, fb := runGradient(m, r.F10, r.Conversion)
		v := r.SF*r.SF + fa*fa*r.Sf*r.Sf + fb*fb*r.SX*r.SX
		c11 += j1 * j1 / v
		c12 += j1 * j2 / v
		c22 += j2 * j2 / v
	}
	dof := n - 2
	res.ReducedChi2 = phi / float64(dof)
	res.PValue = chi2Survival(phi, float64(dof))
	det := c11*c22 - c12*c12
	reg := Region{Level: level, Kind: "ellipse"}
	if det > 0 {
		v11, v12, v22 := c22/det, -c12/det, c11/det
		res.SE1, res.SE2 = math.Sqrt(v11), math.Sqrt(v22)
		res.Corr = v12 / (res.SE1 * res.SE2)
		q := chi2Quantile(level, 2)
		reg.Critical = q
		// Ellipse Δrᵀ V⁻¹ Δr = q: Δr = √q L u with L Lᵀ = V.
		l11 := math.Sqrt(v11)
		l21 := v12 / l11
		l22 := math.Sqrt(math.Max(0, v22-l21*l21))
		reg.R1Min, reg.R2Min = math.Inf(1), math.Inf(1)
		reg.R1Max, reg.R2Max = math.Inf(-1), math.Inf(-1)
		const k = 48
		for i := range k {
			th := 2 * math.Pi * float64(i) / k
			u1, u2 := math.Sqrt(q)*math.Cos(th), math.Sqrt(q)*math.Sin(th)
			p := [2]float64{math.Max(0, r1+l11*u1), math.Max(0, r2+l21*u1+l22*u2)}
			reg.Boundary = append(reg.Boundary, p)
			reg.R1Min, reg.R1Max = math.Min(reg.R1Min, p[0]), math.Max(reg.R1Max, p[0])
			reg.R2Min, reg.R2Max = math.Min(reg.R2Min, p[1]), math.Max(reg.R2Max, p[1])
		}
	} else {
		res.SE1, res.SE2, res.Corr = math.Inf(1), math.Inf(1), math.NaN()
		reg.Open = true
	}
	res.Region = reg
	return res, nil
}

// evmInner finds, at fixed ratios, the true feed a[i] and conversion b[i] of every run that
// minimise its term of Φ (Gauss–Newton from the current values, a few steps), updating a and b,
// and returns Φ.
func evmInner(runs []copoly.Run, r1, r2 float64, a, b []float64) float64 {
	m := copoly.Terminal{R1: r1, R2: r2}
	var phi float64
	for i, r := range runs {
		term := func(ai, bi float64) float64 {
			e := r.F1 - m.Cumulative(ai, bi)
			t := (r.F10-ai)*(r.F10-ai)/(r.Sf*r.Sf) + e*e/(r.SF*r.SF)
			if r.Conversion > 0 {
				t += (r.Conversion - bi) * (r.Conversion - bi) / (r.SX * r.SX)
			}
			return t
		}
		cur := term(a[i], b[i])
		for range 6 {
			fa, fb := runGradient(m, a[i], b[i])
			if r.Conversion == 0 {
				fb = 0
			}
			e := r.F1 - m.Cumulative(a[i], b[i])
			// Residuals ρ = [(f10 − a)/σf, (X − b)/σX, e/σF]; minimise |ρ|² over (a, b).
			wf, wx, wF := 1/(r.Sf*r.Sf), 0.0, 1/(r.SF*r.SF)
			if r.Conversion > 0 {
				wx = 1 / (r.SX * r.SX)
			}
			h11 := wf + wF*fa*fa
			h12 := wF * fa * fb
			h22 := wx + wF*fb*fb
			g1 := wf*(r.F10-a[i]) + wF*fa*e
			g2 := wx*(r.Conversion-b[i]) + wF*fb*e
			var da, db float64
			if r.Conversion > 0 {
				det := h11*h22 - h12*h12
				if !(det > 0) {
					break
				}
				da, db = (h22*g1-h12*g2)/det, (h11*g2-h12*g1)/det
			} else {
				da = g1 / h11
			}
			na := math.Min(1-1e-12, math.Max(1e-12, a[i]+da))
			nb := math.Min(1-1e-9, math.Max(0, b[i]+db))
			nt := term(na, nb)
			if !(nt < cur) {
				break
			}
			small := cur-nt <= 1e-12*cur
			a[i], b[i], cur = na, nb, nt
			if small {
				break
			}
		}
		phi += cur
	}
	return phi
}

// ratioGradient returns ∂F̄1/∂r1 and ∂F̄1/∂r2 at feed f10 and conversion x, by central differences.
func ratioGradient(m copoly.Terminal, f10, x float64) (d1, d2 float64) {
	h1 := 1e-6 * math.Max(m.R1, 1e-3)
	h2 := 1e-6 * math.Max(m.R2, 1e-3)
	lo1, lo2 := math.Max(0, m.R1-h1), math.Max(0, m.R2-h2)
	d1 = (copoly.Terminal{R1: m.R1 + h1, R2: m.R2}.Cumulative(f10, x) - copoly.Terminal{R1: lo1, R2: m.R2}.Cumulative(f10, x)) / (m.R1 + h1 - lo1)
	d2 = (copoly.Terminal{R1: m.R1, R2: m.R2 + h2}.Cumulative(f10, x) - copoly.Terminal{R1: m.R1, R2: lo2}.Cumulative(f10, x)) / (m.R2 + h2 - lo2)
	return d1, d2
}

// runGradient returns ∂F̄1/∂f10 and ∂F̄1/∂X at (f10, x), by central differences kept inside
// [0, 1].
func runGradient(m copoly.Terminal, f10, x float64) (df, dx float64) {
	const h = 1e-6
	fl, fh := math.Max(0, f10-h), math.Min(1, f10+h)
	df = (m.Cumulative(fh, x) - m.Cumulative(fl, x)) / (fh - fl)
	if x > 0 {
		xl, xh := math.Max(0, x-h), math.Min(1, x+h)
		dx = (m.Cumulative(f10, xh) - m.Cumulative(f10, xl)) / (xh - xl)
	}
	return df, dx
}
