package fit

import (
	"fmt"
	"math"

	"copoly/copoly"
	"copoly/copoly/internal/lm"
)

// TriadRun is one low-conversion copolymer with its measured composition and monomer-centred
// triad fractions (¹³C NMR), in the convention of [copoly.Sequence]: A111 + A112 + A212 = 1 (A112
// counts 112 and 211) and A222 + A221 + A121 = 1 (A221 counts 221 and 122). A value below 0
// (or NaN) means not measured.
type TriadRun struct {
	F10              float64
	F1               float64
	A111, A112, A212 float64
	A222, A221, A121 float64
}

// triadValues returns the measured values of a run in a fixed order (F1, then the four
// independent triads A112, A212, A221, A121; A111 and A222 follow from the family sums and are
// left out, as Hauch et al. do).
func (r TriadRun) values() [5]float64 {
	return [5]float64{r.F1, r.A112, r.A212, r.A221, r.A121}
}

func predicted(s copoly.Sequence) [5]float64 {
	return [5]float64{s.F1, s.T112, s.T212, s.T221, s.T121}
}

// ModelFit is a least-squares fit of one model to composition and triad data.
type ModelFit struct {
	// Model is "terminal" (Params r1, r2) or "penultimate" (Params r11, r21, r22, r12).
	Model  string
	Params []float64
	// SE are linearised standard errors s²(JᵀJ)⁻¹ of the parameters (NaN when singular).
	SE []float64
	// SSR is the sum of squared residuals over the N measured values; K the number of
	// parameters; AIC = N ln(SSR/N) + 2K and AICc its small-sample form.
	SSR       float64
	N, K      int
	AIC, AICc float64
}

// Discrimination compares the terminal and the penultimate model on the same data.
type Discrimination struct {
	Terminal, Penultimate ModelFit
	// F is the extra-sum-of-squares statistic ((S_T − S_P)/2)/(S_P/(N − 4)) and PValue its
	// upper-tail probability under F(2, N − 4).
	F, PValue float64
	// DeltaAIC is AICc(terminal) − AICc(penultimate): positive favours the penultimate model.
	DeltaAIC float64
	// Supported reports that both tests favour the penultimate model (p < 0.05 and ΔAICc > 2);
	// Verdict says so in words.
	Supported bool
	Verdict   string
	// Terminal and Penultimate in Predicted hold each fitted model's composition and triads
	// ([copoly.Sequence]) at the feed of each run, in the order of the runs.
	Predicted struct{ Terminal, Penultimate []copoly.Sequence }
}

// MaxTriadRuns bounds [Discriminate].
const MaxTriadRuns = 1000

// Discriminate fits the terminal and the explicit penultimate model by least squares to
// low-conversion compositions and triad fractions (each measured value one residual, unweighted;
// A111 and A222 left out as they follow from their family sums) and compares them with the
// extra-sum-of-squares F-test and the corrected Akaike information criterion.
//
// References:
//   - M. A. Hauch, Y. Zhou, T. A. Duever, A. Penlidis, Macromol. Symp. 2008 (estimating
//     reactivity ratios from triad fractions; Eq. 1 and the dependent triads).
//   - D. M. Bates, D. G. Watts, Nonlinear Regression Analysis and Its Applications, Wiley 1988
//     (extra-sum-of-squares F-test).
//   - K. P. Burnham, D. R. Anderson, Model Selection and Multimodel Inference, Springer 2002
//     (AICc).
func Discriminate(runs []TriadRun) (*Discrimination, error) {
	if len(runs) == 0 || len(runs) > MaxTriadRuns {
		return nil, &copoly.InputError{Field: "runs", Value: float64(len(runs)), Reason: fmt.Sprintf("give between 1 and %d runs", MaxTriadRuns), Err: copoly.ErrOutOfRange}
	}
	n := 0
	for i, r := range runs {
		row := fmt.Sprintf("runs[%d].", i)
		if err := copoly.CheckFraction(row+"f10", r.F10); err != nil {
			return nil, err
		}
		if r.F10 == 0 || r.F10 == 1 {
			return nil, &copoly.InputError{Field: row + "f10", Value: r.F10, Reason: "a copolymer needs both monomers in the feed", Err: copoly.ErrOutOfRange}
		}
		names := [5]string{"F1", "A112", "A212", "A221", "A121"}
		for k, v := range r.values() {
			if v < 0 || math.IsNaN(v) {
				continue
			}
			if err := copoly.CheckFraction(row+names[k], v); err != nil {
				return nil, err
			}
			n++
		}
	}
	if n < 6 {
		return nil, &copoly.FieldError{Field: "runs", Reason: fmt.Sprintf("%d measured values: at least 6 are needed to compare a 2- and a 4-parameter model", n), Err: copoly.ErrOutOfRange}
	}
	resid := func(m copoly.Model, dst []float64) []float64 {
		dst = dst[:0]
		for _, r := range runs {
			var s copoly.Sequence
			switch mm := m.(type) {
			case copoly.Terminal:
				s, _ = mm.Sequence(r.F10)
			case copoly.Penultimate:
				s, _ = mm.Sequence(r.F10)
			}
			p := predicted(s)
			for k, v := range r.values() {
				if v < 0 || math.IsNaN(v) {
					continue
				}
				dst = append(dst, v-p[k])
			}
		}
		return dst
	}
	term := func(x []float64) copoly.Model { return copoly.Terminal{R1: x[0], R2: x[1]} }
	pen := func(x []float64) copoly.Model { return copoly.Penultimate{R11: x[0], R21: x[1], R22: x[2], R12: x[3]} }
	// Terminal: start from a small grid; penultimate: from the terminal estimate.
	bestT := fitLM(func(x []float64, dst []float64) []float64 { return resid(term(x), dst) }, gridStarts2())
	tp := bestT.x
	starts := [][]float64{{tp[0], tp[0], tp[1], tp[1]}}
	for _, f := range []float64{0.5, 2} {
		starts = append(starts, []float64{tp[0] * f, tp[0] / f, tp[1], tp[1]}, []float64{tp[0], tp[0], tp[1] * f, tp[1] / f})
	}
	bestP := fitLM(func(x []float64, dst []float64) []float64 { return resid(pen(x), dst) }, starts)
	d := &Discrimination{
		Terminal:    modelFit("terminal", bestT, n),
		Penultimate: modelFit("penultimate", bestP, n),
	}
	sT, sP := d.Terminal.SSR, d.Penultimate.SSR
	dof := float64(n - 4)
	if dof > 0 && sP > 0 {
		d.F = math.Max(0, (sT-sP)/2) / (sP / dof)
		d.PValue = fSurvival(d.F, 2, dof)
	} else {
		d.PValue = math.NaN()
	}
	d.DeltaAIC = d.Terminal.AICc - d.Penultimate.AICc
	d.Supported = d.PValue < 0.05 && d.DeltaAIC > 2
	switch {
	case d.Supported:
		d.Verdict = fmt.Sprintf("The data support a penultimate effect: the penultimate model fits significantly better (F-test p = %.2g) and is preferred by AICc (lower by %.1f).", d.PValue, d.DeltaAIC)
	case d.PValue < 0.05 || d.DeltaAIC > 2:
		d.Verdict = fmt.Sprintf("The evidence for a penultimate effect is mixed (F-test p = %.2g, AICc difference %.1f); more data, especially triads over a wide range of feeds, would settle it.", d.PValue, d.DeltaAIC)
	default:
		d.Verdict = fmt.Sprintf("The data do not support a penultimate effect: the terminal model describes them as well (F-test p = %.2g, AICc difference %.1f).", d.PValue, d.DeltaAIC)
	}
	d.Predicted.Terminal, d.Predicted.Penultimate = predictions(runs, term(bestT.x)), predictions(runs, pen(bestP.x))
	return d, nil
}

// predictions returns the sequence statistics of m at the feed of each run.
func predictions(runs []TriadRun, m copoly.Model) []copoly.Sequence {
	out := make([]copoly.Sequence, len(runs))
	for i, r := range runs {
		out[i], _ = m.Sequence(r.F10) // the feeds and fitted ratios are checked
	}
	return out
}

type lmResult struct {
	x   []float64
	ssr float64
	jtj [][]float64
}

// gridStarts2 is a log grid of (r1, r2) starting points.
func gridStarts2() [][]float64 {
	var s [][]float64
	for _, a := range []float64{0.02, 0.1, 0.4, 1.5, 6} {
		for _, b := range []float64{0.02, 0.1, 0.4, 1.5, 6} {
			s = append(s, []float64{a, b})
		}
	}
	return s
}

// fitLM minimises Σ r(x)² over x ≥ 0 from each start (see lm.Minimize; J by forward
// differences of the residuals r = observed − model) and keeps the best, with JᵀJ at it.
func fitLM(r func(x, dst []float64) []float64, starts [][]float64) lmResult {
	var buf, buf2 []float64
	ssr := func(x []float64) float64 {
		buf = r(x, buf)
		var s float64
		for _, v := range buf {
			s += v * v
		}
		return s
	}
	// normal returns JᵀJ and Jᵀe with J = ∂model/∂x = −∂r/∂x.
	normal := func(x []float64) ([][]float64, []float64) {
		e := append([]float64(nil), r(x, buf)...)
		J := make([][]float64, len(x))
		for k := range x {
			h := 1e-7 * math.Max(x[k], 1e-3)
			xh := append([]float64(nil), x...)
			xh[k] += h
			buf2 = r(xh, buf2)
			J[k] = make([]float64, len(e))
			for i := range e {
				J[k][i] = -(buf2[i] - e[i]) / h
			}
		}
		A := make([][]float64, len(x))
		g := make([]float64, len(x))
		for a := range x {
			A[a] = make([]float64, len(x))
			for b := range x {
				for i := range e {
					A[a][b] += J[a][i] * J[b][i]
				}
			}
			for i := range e {
				g[a] += J[a][i] * e[i]
			}
		}
		return A, g
	}
	best := lmResult{ssr: math.Inf(1)}
	for _, st := range starts {
		x, s := lm.Minimize(st, copoly.MaxRatio, ssr, normal)
		if s < best.ssr {
			jtj, _ := normal(x)
			best = lmResult{x: x, ssr: s, jtj: jtj}
		}
	}
	return best
}

func modelFit(name string, r lmResult, n int) ModelFit {
	k := len(r.x)
	f := ModelFit{Model: name, Params: r.x, SSR: r.ssr, N: n, K: k, SE: make([]float64, k)}
	f.AIC = float64(n)*math.Log(math.Max(r.ssr, 1e-300)/float64(n)) + 2*float64(k)
	f.AICc = f.AIC
	if n-k-1 > 0 {
		f.AICc += 2 * float64(k*(k+1)) / float64(n-k-1)
	}
	// Covariance s²(JᵀJ)⁻¹ by inverting column by column.
	s2 := r.ssr / math.Max(1, float64(n-k))
	for a := range k {
		e := make([]float64, k)
		e[a] = 1
		col, ok := lm.Solve(r.jtj, e)
		if !ok || col[a] < 0 {
			f.SE[a] = math.NaN()
			continue
		}
		f.SE[a] = math.Sqrt(s2 * col[a])
	}
	return f
}
