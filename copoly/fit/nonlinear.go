package fit

import (
	"fmt"
	"math"

	"copoly/copoly"
	"copoly/copoly/internal/lm"
)

// problem is a least-squares problem in (r1, r2): residuals F1,obs − F̄1,model of each run,
// weighted by w (nil for unit weights).
type problem struct {
	runs []copoly.Run
	w    []float64
	// warm holds, per run, the Meyer–Lowry solution of the last evaluation (see Terminal.CumulativeFrom).
	warm []float64
}

// model returns F̄1 of run i under m, warm-started from the previous evaluation.
func (p *problem) model(m copoly.Terminal, i int) float64 {
	if p.warm == nil {
		p.warm = make([]float64, len(p.runs))
	}
	r := p.runs[i]
	return m.CumulativeFrom(r.F10, r.Conversion, &p.warm[i])
}

func (p *problem) residuals(dst []float64, r1, r2 float64) {
	m := copoly.Terminal{R1: r1, R2: r2}
	for i, r := range p.runs {
		dst[i] = r.F1 - p.model(m, i)
	}
}

// ssr returns Σ w_i e_i² (S, or χ² when the weights are 1/σ²).
func (p *problem) ssr(r1, r2 float64) float64 {
	m := copoly.Terminal{R1: r1, R2: r2}
	var s float64
	for i, r := range p.runs {
		e := r.F1 - p.model(m, i)
		if p.w != nil {
			s += p.w[i] * e * e
		} else {
			s += e * e
		}
	}
	return s
}

// jacobian returns ∂F̄1,model/∂(r1, r2) at each run by central differences (one-sided at r = 0).
func (p *problem) jacobian(r1, r2 float64) (j1, j2 []float64) {
	n := len(p.runs)
	j1, j2 = make([]float64, n), make([]float64, n)
	for k, r := range []float64{r1, r2} {
		h := 1e-6 * math.Max(r, 1e-3)
		lo, hi := r-h, r+h
		if lo < 0 {
			lo = r
		}
		a, b := copoly.Terminal{R1: r1, R2: r2}, copoly.Terminal{R1: r1, R2: r2}
		if k == 0 {
			a.R1, b.R1 = lo, hi
		} else {
			a.R2, b.R2 = lo, hi
		}
		dst := j1
		if k == 1 {
			dst = j2
		}
		for i := range p.runs {
			dst[i] = (p.model(b, i) - p.model(a, i)) / (hi - lo)
		}
	}
	return j1, j2
}

// normal returns JᵀWJ and JᵀWe at (r1, r2).
func (p *problem) normal(r1, r2 float64) (a11, a12, a22, g1, g2 float64) {
	j1, j2 := p.jacobian(r1, r2)
	e := make([]float64, len(p.runs))
	p.residuals(e, r1, r2)
	for i := range e {
		w := 1.0
		if p.w != nil {
			w = p.w[i]
		}
		a11 += w * j1[i] * j1[i]
		a12 += w * j1[i] * j2[i]
		a22 += w * j2[i] * j2[i]
		g1 += w * j1[i] * e[i]
		g2 += w * j2[i] * e[i]
	}
	return
}

// levenbergMarquardt minimises p.ssr from (r1, r2) (see lm.Minimize).
func (p *problem) levenbergMarquardt(r1, r2 float64) (float64, float64, float64) {
	x, s := lm.Minimize([]float64{r1, r2}, copoly.MaxRatio,
		func(x []float64) float64 { return p.ssr(x[0], x[1]) },
		func(x []float64) ([][]float64, []float64) {
			a11, a12, a22, g1, g2 := p.normal(x[0], x[1])
			return [][]float64{{a11, a12}, {a12, a22}}, []float64{g1, g2}
		})
	return x[0], x[1], s
}

// minimize finds the global minimum of p.ssr over r1, r2 ≥ 0: a log-spaced grid over 10⁻³ to
// 10² in each ratio plus the given starting points, then Levenberg–Marquardt from the best few.
func (p *problem) minimize(starts [][2]float64) (r1, r2, s float64) {
	type cand struct{ r1, r2, s float64 }
	var cs []cand
	const n = 11
	for i := range n {
		for j := range n {
			// Cell centres of a log grid over [10⁻³, 10²]: r = 1 itself (where the
			// closed form is singular and the slower ODE is needed) is not a node.
			a := math.Pow(10, -3+5*(float64(i)+0.5)/n)
			b := math.Pow(10, -3+5*(float64(j)+0.5)/n)
			cs = append(cs, cand{a, b, p.ssr(a, b)})
		}
	}
	for _, st := range starts {
		a, b := st[0], st[1]
		if a >= 0 && b >= 0 && a <= copoly.MaxRatio && b <= copoly.MaxRatio && !math.IsNaN(a+b) {
			cs = append(cs, cand{a, b, p.ssr(a, b)})
		}
	}
	// Refine the two best candidates.
	best := cand{s: math.Inf(1)}
	used := make([]bool, len(cs))
	for range 2 {
		k := -1
		for i, c := range cs {
			if !used[i] && (k < 0 || c.s < cs[k].s) {
				k = i
			}
		}
		if k < 0 {
			break
		}
		used[k] = true
		a, b, v := p.levenbergMarquardt(cs[k].r1, cs[k].r2)
		if v < best.s {
			best = cand{a, b, v}
		}
	}
	return best.r1, best.r2, best.s
}

// Nonlinear is the result of the nonlinear least-squares fit of the integrated terminal model.
type Nonlinear struct {
	R1, R2 float64
	// SE1, SE2 are the linearised standard errors and Corr the correlation of the estimates.
	SE1, SE2, Corr float64
	// SSR is the minimised objective: Σ e² unweighted, or χ² = Σ (e/σ)² when Weighted.
	SSR float64
	// Weighted reports that every run had an uncertainty and the fit used weights 1/σ_eff².
	Weighted bool
	// N is the number of runs and DoF = N − 2.
	N, DoF int
	// Residuals are F1,obs − F̄1,model per run, in the order given.
	Residuals []float64
	// Sigma holds the effective standard uncertainty of each run when Weighted.
	Sigma []float64
	// ReducedChi2 = χ²/DoF and its upper-tail probability PValue under χ²(DoF), when Weighted.
	ReducedChi2, PValue float64
	// AtBound names a ratio that sits on its bound r = 0 ("r1", "r2" or "").
	AtBound string
	// Region is the joint confidence region.
	Region Region
}

// Region is a joint confidence region for (r1, r2).
type Region struct {
	// Level is the confidence level, e.g. 0.95.
	Level float64
	// Kind is "F" (errors unknown: S ≤ S_min(1 + p/(n − p) F(p, n − p))) or "chi2" (errors
	// known: χ² ≤ χ²_min + χ²_p).
	Kind string
	// Critical is the objective's value on the boundary.
	Critical float64
	// Boundary is a closed polygon of (r1, r2) points traced around the estimate.
	Boundary [][2]float64
	// Open reports that the region is not bounded within 0 ≤ r ≤ MaxRatio in some direction:
	// the data do not pin the ratios down.
	Open bool
	// R1Min … R2Max bound the polygon (conservative, not individual intervals).
	R1Min, R1Max, R2Min, R2Max float64
}

// NonlinearOptions sets the fit. The zero value is the default: 95 % region, 48 directions.
type NonlinearOptions struct {
	// Level is the confidence level of the region, in (0, 1); 0 means 0.95.
	Level float64
	// Directions is the number of rays traced for the region's boundary; 0 means 48.
	Directions int
	// Starts are extra starting points for the search, e.g. the linear estimates.
	Starts [][2]float64
}

// LeastSquares estimates r1 and r2 by nonlinear least squares on the integrated terminal model:
// every run's measured F1 is compared with the cumulative F̄1 at its own conversion (the
// instantaneous Mayo–Lewis equation where no conversion is given),
//
//	S(r1, r2) = Σ w_i (F1,i − F̄1(f10,i, X_i; r1, r2))²
//
// minimised over r1, r2 ≥ 0 by a grid search followed by Levenberg–Marquardt. Without
// uncertainties w_i = 1. When every run has an uncertainty of F1 (SF > 0), w_i = 1/σ_eff,i² with
// the errors of X and f10 carried in by effective variance,
//
//	σ_eff² = σ_F² + (∂F̄1/∂X)² σ_X² + (∂F̄1/∂f10)² σ_f²
//
// re-evaluated at the estimate until it settles. The joint confidence region is traced on the
// objective surface (see [Region]); the standard errors come from the linearised covariance
// s²(JᵀJ)⁻¹ (unweighted, s² = S/(n − 2)) or (JᵀWJ)⁻¹ (weighted).
//
// It needs at least three runs, two of them at different feeds.
//
// References:
//   - P. W. Tidwell, G. A. Mortimer, J. Polym. Sci. A 1965, 3, 369 (nonlinear least squares for
//     reactivity ratios).
//   - A. L. German, D. Heikens, J. Polym. Sci. 1971 (fits to whole conversion trajectories).
//   - A. M. van Herk, Q. Liu, Macromol. Theory Simul. 2024, 33, 2400043 (errors as weights, χ²
//     regions).
//   - D. M. Bates, D. G. Watts, Nonlinear Regression Analysis and Its Applications, Wiley 1988
//     (the F-based likelihood region).
func LeastSquares(runs []copoly.Run, opt NonlinearOptions) (*Nonlinear, error) {
	if err := checkRunsForFit(runs); err != nil {
		return nil, err
	}
	level := opt.Level
	if level == 0 {
		level = 0.95
	}
	if !(level > 0 && level < 1) {
		return nil, &copoly.InputError{Field: "level", Value: level, Reason: "the confidence level must lie between 0 and 1 (e.g. 0.95)", Err: copoly.ErrOutOfRange}
	}
	dirs := opt.Directions
	if dirs == 0 {
		dirs = 48
	}
	if dirs < 8 || dirs > 1024 {
		return nil, &copoly.InputError{Field: "directions", Value: float64(dirs), Reason: "between 8 and 1024 rays", Err: copoly.ErrOutOfRange}
	}
	n := len(runs)
	p := &problem{runs: runs}
	res := &Nonlinear{N: n, DoF: n - 2}
	weighted := true
	for _, r := range runs {
		if !(r.SF > 0) {
			weighted = false
		}
	}
	r1, r2, s := p.minimize(opt.Starts)
	if weighted {
		res.Weighted = true
		res.Sigma = make([]float64, n)
		for it := range 4 {
			p.w = effectiveWeights(runs, r1, r2, res.Sigma)
			if it == 0 {
				// The weights can move the minimum: search globally once.
				r1, r2, s = p.minimize(append(opt.Starts, [2]float64{r1, r2}))
			}
			n1, n2, ns := p.levenbergMarquardt(r1, r2)
			done := math.Abs(n1-r1) <= 1e-9*math.Max(1e-3, r1) && math.Abs(n2-r2) <= 1e-9*math.Max(1e-3, r2)
			r1, r2, s = n1, n2, ns
			if done {
				break
			}
		}
	}
	res.R1, res.R2, res.SSR = r1, r2, s
	res.Residuals = make([]float64, n)
	p.residuals(res.Residuals, r1, r2)
	switch {
	case r1 == 0:
		res.AtBound = "r1"
	case r2 == 0:
		res.AtBound = "r2"
	}
	// Linearised covariance.
	a11, a12, a22, _, _ := p.normal(r1, r2)
	scale := 1.0
	if !weighted {
		scale = s / float64(res.DoF)
	}
	det := a11*a22 - a12*a12
	var c11, c12, c22 float64
	if det > 0 {
		c11, c12, c22 = scale*a22/det, -scale*a12/det, scale*a11/det
		res.SE1, res.SE2 = math.Sqrt(c11), math.Sqrt(c22)
		if res.SE1 > 0 && res.SE2 > 0 {
			res.Corr = c12 / (res.SE1 * res.SE2)
		}
	} else {
		res.SE1, res.SE2, res.Corr = math.Inf(1), math.Inf(1), math.NaN()
	}
	if weighted && res.DoF > 0 {
		res.ReducedChi2 = s / float64(res.DoF)
		res.PValue = chi2Survival(s, float64(res.DoF))
	}
	// Joint confidence region.
	reg := Region{Level: level}
	if weighted {
		reg.Kind = "chi2"
		reg.Critical = s + chi2Quantile(level, 2)
	} else {
		reg.Kind = "F"
		fq := fQuantile(level, 2, float64(res.DoF))
		reg.Critical = s * (1 + 2/float64(res.DoF)*fq)
	}
	res.Region = traceRegion(p.ssr, r1, r2, s, reg, c11, c12, c22, dirs)
	return res, nil
}

// effectiveWeights returns 1/σ_eff² per run at (r1, r2) and stores σ_eff in sigma.
func effectiveWeights(runs []copoly.Run, r1, r2 float64, sigma []float64) []float64 {
	m := copoly.Terminal{R1: r1, R2: r2}
	w := make([]float64, len(runs))
	for i, r := range runs {
		v := r.SF * r.SF
		if r.SX > 0 && r.Conversion > 0 {
			h := 1e-6
			lo, hi := math.Max(0, r.Conversion-h), math.Min(1, r.Conversion+h)
			d := (m.Cumulative(r.F10, hi) - m.Cumulative(r.F10, lo)) / (hi - lo)
			v += d * d * r.SX * r.SX
		}
		if r.Sf > 0 {
			h := 1e-6
			lo, hi := math.Max(0, r.F10-h), math.Min(1, r.F10+h)
			d := (m.Cumulative(hi, r.Conversion) - m.Cumulative(lo, r.Conversion)) / (hi - lo)
			v += d * d * r.Sf * r.Sf
		}
		sigma[i] = math.Sqrt(v)
		w[i] = 1 / v
	}
	return w
}

// MinRuns is the fewest runs [LeastSquares], [ErrorsInVariables] and [Estimate] take: two
// ratios and a degree of freedom to check the fit.
const MinRuns = 3

// checkRunsForFit validates runs for the integrated-model estimators.
func checkRunsForFit(runs []copoly.Run) error {
	if len(runs) > 1000 {
		return &copoly.InputError{Field: "runs", Value: float64(len(runs)), Reason: "at most 1000 runs", Err: copoly.ErrTooMany}
	}
	if len(runs) < MinRuns {
		return &copoly.InputError{Field: "runs", Value: float64(len(runs)), Reason: "at least three runs are needed to estimate two ratios with any check of fit", Err: copoly.ErrOutOfRange}
	}
	feeds := map[float64]bool{}
	for i, r := range runs {
		row := fmt.Sprintf("runs[%d].", i)
		if err := copoly.CheckFraction(row+"f10", r.F10); err != nil {
			return err
		}
		if err := copoly.CheckConversion(row+"conversion", r.Conversion); err != nil {
			return err
		}
		if r.Conversion == 1 {
			return &copoly.InputError{Field: row + "conversion", Value: 1, Reason: "at full conversion the copolymer has the composition of the feed and says nothing about the ratios", Err: copoly.ErrOutOfRange}
		}
		if err := copoly.CheckFraction(row+"F1", r.F1); err != nil {
			return err
		}
		for _, u := range []struct {
			name string
			v    float64
		}{{"sF", r.SF}, {"sX", r.SX}, {"sf", r.Sf}} {
			if err := copoly.CheckFinite(row+u.name, u.v); err != nil {
				return err
			}
			if u.v < 0 || u.v >= 0.5 {
				return &copoly.InputError{Field: row + u.name, Value: u.v, Reason: "a standard uncertainty must be ≥ 0 and below 0.5 (mole fraction)", Err: copoly.ErrOutOfRange}
			}
		}
		feeds[r.F10] = true
	}
	if len(feeds) < 2 {
		return &copoly.FieldError{Field: "runs", Reason: "the runs must span at least two different feeds", Err: copoly.ErrOutOfRange}
	}
	return nil
}

// traceRegion traces the boundary {S = crit} of a region around the minimum (r1, r2) along rays
// spread evenly in the space whitened by the linearised covariance, so that an elliptical region
// gets evenly spaced points. Each ray is searched outwards, then bisected by regula falsi
// (Illinois). Rays that reach r = 0 before the boundary stop on the axis (the region is cut by the
// constraint); rays that pass MaxRatio, or a ratio 10⁴ times the estimate, mark the region open.
// The region is assumed star-shaped about the minimum.
func traceRegion(f func(r1, r2 float64) float64, r1, r2, smin float64, reg Region, c11, c12, c22 float64, dirs int) Region {
	// Whitening: d = L u with L Lᵀ = C (Cholesky), falling back to a diagonal scale.
	l11, l21, l22 := math.Sqrt(c11), 0.0, 0.0
	if l11 > 0 && !math.IsInf(l11, 0) {
		l21 = c12 / l11
		l22 = math.Sqrt(math.Max(0, c22-l21*l21))
	}
	if !(l11 > 0) || !(l22 > 0) || math.IsInf(l11+l22, 0) || math.IsNaN(l11+l21+l22) {
		l11, l21, l22 = 0.1*math.Max(r1, 0.1), 0, 0.1*math.Max(r2, 0.1)
	}
	limit1 := math.Min(copoly.MaxRatio, 1e4*math.Max(r1, 1e-2))
	limit2 := math.Min(copoly.MaxRatio, 1e4*math.Max(r2, 1e-2))
	reg.R1Min, reg.R2Min = math.Inf(1), math.Inf(1)
	reg.R1Max, reg.R2Max = math.Inf(-1), math.Inf(-1)
	rho := 1.0
	for k := range dirs {
		th := 2 * math.Pi * float64(k) / float64(dirs)
		u1, u2 := math.Cos(th), math.Sin(th)
		d1, d2 := l11*u1, l21*u1+l22*u2
		g := func(t float64) float64 { return f(r1+t*d1, r2+t*d2) - reg.Critical }
		// Largest t keeping both ratios in [0, limit].
		tmax := math.Inf(1)
		cut := false
		for _, c := range []struct{ r, d, lim float64 }{{r1, d1, limit1}, {r2, d2, limit2}} {
			if c.d < 0 {
				if t := c.r / -c.d; t < tmax {
					tmax, cut = t, true
				}
			} else if c.d > 0 {
				if t := (c.lim - c.r) / c.d; t < tmax {
					tmax, cut = t, false
				}
			}
		}
		lo, hi := 0.0, math.Min(rho, tmax)
		glo, ghi := smin-reg.Critical, g(hi)
		for ghi < 0 && hi < tmax {
			lo, glo = hi, ghi
			hi = math.Min(2*hi, tmax)
			ghi = g(hi)
		}
		var t float64
		switch {
		case ghi < 0: // reached the edge of the domain inside the region
			t = tmax
			if !cut {
				reg.Open = true
			}
		case math.IsNaN(ghi):
			t = lo
		default:
			// Illinois regula falsi.
			side := 0
			for range 40 {
				t = (lo*ghi - hi*glo) / (ghi - glo)
				gt := g(t)
				if math.Abs(hi-lo) <= 1e-6*hi || math.Abs(gt) <= 1e-9*reg.Critical {
					break
				}
				if gt > 0 {
					hi, ghi = t, gt
					if side == -1 {
						glo /= 2
					}
					side = -1
				} else {
					lo, glo = t, gt
					if side == 1 {
						ghi /= 2
					}
					side = 1
				}
			}
		}
		rho = math.Max(t, 1e-6)
		p := [2]float64{math.Max(0, r1+t*d1), math.Max(0, r2+t*d2)}
		reg.Boundary = append(reg.Boundary, p)
		reg.R1Min, reg.R1Max = math.Min(reg.R1Min, p[0]), math.Max(reg.R1Max, p[0])
		reg.R2Min, reg.R2Max = math.Min(reg.R2Min, p[1]), math.Max(reg.R2Max, p[1])
	}
	return reg
}
