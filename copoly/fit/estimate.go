package fit

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// Method names used in [Estimates] and in the JavaScript API.
const (
	MethodFinemanRoss         = "fineman-ross"
	MethodInvertedFinemanRoss = "inverted-fineman-ross"
	MethodKelenTudos          = "kelen-tudos"
	MethodExtendedKelenTudos  = "extended-kelen-tudos"
	MethodMayoLewis           = "mayo-lewis-integrated"
	MethodNonlinear           = "nonlinear"
	MethodEVM                 = "evm"
	// MethodLinear labels warnings that concern all the low-conversion linear methods.
	MethodLinear = "linear"
)

// Warning is a note about the data or a method: a method that could not run and why, a run
// that breaks its monomer balance, a trend in the residuals.
type Warning struct {
	// Method is the method concerned, or "" for the data as a whole.
	Method string
	// Row is the 0-based run concerned, or −1.
	Row int
	// Field names the input at fault when there is one ("runs[2].F1").
	Field   string
	Message string
	// Code says what is wrong in a word (see [copoly.Code]): that of a run warning
	// ([copoly.RunWarning]), of the error of a method that could not run, or one of
	// CodeHighConversion, CodeOpenRegion, CodeAtBound, CodePartlyWeighted, CodeScatter,
	// CodeTrend and CodeNoUncertainties.
	Code string
}

// Trend is a straight-line fit of the residuals against one variable.
type Trend struct {
	Slope, PValue float64
	// Flagged reports a slope significant at the 5 % level with at least five runs.
	Flagged bool
}

// Estimates holds the results of every estimation method on one data set. A method that could
// not run is nil, with its reason among the warnings.
type Estimates struct {
	FinemanRoss, InvertedFinemanRoss, KelenTudos, ExtendedKelenTudos *Linear
	MayoLewis                                                        *Intersection
	Nonlinear                                                        *Nonlinear
	EVM                                                              *EVM
	// Recommended names the method to report: MethodEVM when every uncertainty was given,
	// otherwise MethodNonlinear.
	Recommended string
	// TrendFeed and TrendConversion fit the nonlinear residuals against f10 and X.
	TrendFeed, TrendConversion Trend
	// SwappedFinemanRoss is the Fineman–Ross estimate with the monomer labels swapped (and the
	// ratios swapped back); it differs from FinemanRoss, which shows how much the linear
	// methods depend on the labels.
	SwappedFinemanRoss *Linear
	Warnings           []Warning
}

// Intersection is the result of the Mayo–Lewis intersection method.
type Intersection struct {
	R1, R2 float64
	// Curves holds one curve of consistent (r1, r2) per run with a conversion: Curves[k][0] the
	// r1 values, Curves[k][1] the r2 values.
	Curves [][2][]float64
}

// Estimate runs every estimation method on the runs: the linear methods (labelled as such), the
// Mayo–Lewis intersection, nonlinear least squares on the integrated model with its joint
// confidence region at the given level (0 for 95 %), and error-in-variables when every run has
// all three uncertainties. It returns an error only when the runs themselves are unusable (see
// [LeastSquares]); a method that cannot run on them is left nil and explained in the warnings.
func Estimate(runs []copoly.Run, level float64) (*Estimates, error) {
	if err := checkRunsForFit(runs); err != nil {
		return nil, err
	}
	e := &Estimates{Recommended: MethodNonlinear}
	warn := func(code, method string, row int, field, msg string) {
		e.Warnings = append(e.Warnings, Warning{Method: method, Row: row, Field: field, Message: msg, Code: code})
	}
	for _, w := range copoly.CheckRuns(runs) {
		warn(w.Code, "", w.Row, w.Field, w.Message)
	}
	var starts [][2]float64
	linear := func(name string, f func([]copoly.Run) (Linear, error)) *Linear {
		l, err := f(runs)
		if err != nil {
			warn(copoly.Code(err), name, -1, copoly.Field(err), err.Error())
			return nil
		}
		starts = append(starts, [2]float64{math.Max(l.R1, 1e-3), math.Max(l.R2, 1e-3)})
		return &l
	}
	e.FinemanRoss = linear(MethodFinemanRoss, FinemanRoss)
	e.InvertedFinemanRoss = linear(MethodInvertedFinemanRoss, InvertedFinemanRoss)
	e.KelenTudos = linear(MethodKelenTudos, KelenTudos)
	e.ExtendedKelenTudos = linear(MethodExtendedKelenTudos, ExtendedKelenTudos)
	if high := LinearMethodWarnings(runs); len(high) > 0 {
		warn(copoly.CodeHighConversion, MethodLinear, -1, "", fmt.Sprintf("%d of %d runs are above %.0f %% conversion, where the low-conversion methods (Fineman–Ross, inverted Fineman–Ross, Kelen–Tüdős) are biased by composition drift; rely on the integrated fit", len(high), len(runs), 100*LinearConversionLimit))
		for _, w := range high {
			warn(w.Code, MethodLinear, w.Row, w.Field, w.Message)
		}
	}
	if e.FinemanRoss != nil {
		swapped := make([]copoly.Run, len(runs))
		for i, r := range runs {
			swapped[i] = copoly.Run{F10: 1 - r.F10, Conversion: r.Conversion, F1: 1 - r.F1}
		}
		if s, err := FinemanRoss(swapped); err == nil {
			s.R1, s.R2 = s.R2, s.R1
			e.SwappedFinemanRoss = &s
		}
	}
	if r1, r2, curves, err := MayoLewisIntersection(runs); err == nil {
		e.MayoLewis = &Intersection{R1: r1, R2: r2, Curves: curves}
	} else {
		warn(copoly.Code(err), MethodMayoLewis, -1, copoly.Field(err), err.Error())
	}

	nl, err := LeastSquares(runs, NonlinearOptions{Level: level, Starts: starts})
	if err != nil {
		return nil, err
	}
	e.Nonlinear = nl
	if nl.Region.Open {
		warn(copoly.CodeOpenRegion, MethodNonlinear, -1, "", "the joint confidence region is open: the data do not bound the ratios in every direction; add runs at the suggested feeds")
	}
	if nl.AtBound != "" {
		warn(copoly.CodeAtBound, MethodNonlinear, -1, "", nl.AtBound+" sits at its bound 0: the best fit wants a negative ratio, which is not physical; check the data")
	}
	someSigma := false
	for _, r := range runs {
		if r.SF > 0 {
			someSigma = true
		}
	}
	if someSigma && !nl.Weighted {
		warn(copoly.CodePartlyWeighted, MethodNonlinear, -1, "", "uncertainties of F1 are given for some runs only: the fit is unweighted")
	}
	if nl.Weighted && nl.DoF > 0 {
		switch {
		case nl.PValue < 0.05:
			warn(copoly.CodeScatter, MethodNonlinear, -1, "", fmt.Sprintf("χ²/dof = %.2f (p = %.3g): the scatter is larger than the stated uncertainties; the model or the uncertainties are in doubt", nl.ReducedChi2, nl.PValue))
		case nl.PValue > 0.95:
			warn(copoly.CodeScatter, MethodNonlinear, -1, "", fmt.Sprintf("χ²/dof = %.2f (p = %.3g): the scatter is smaller than the stated uncertainties; they may be overestimated", nl.ReducedChi2, nl.PValue))
		}
	}
	feeds, convs := make([]float64, len(runs)), make([]float64, len(runs))
	for i, r := range runs {
		feeds[i], convs[i] = r.F10, r.Conversion
	}
	e.TrendFeed = trend(feeds, nl.Residuals)
	e.TrendConversion = trend(convs, nl.Residuals)
	if e.TrendFeed.Flagged {
		warn(copoly.CodeTrend, MethodNonlinear, -1, "", fmt.Sprintf("the residuals trend with the feed (p = %.3g): a calibration error in F1 or a deviation from the terminal model", e.TrendFeed.PValue))
	}
	if e.TrendConversion.Flagged {
		warn(copoly.CodeTrend, MethodNonlinear, -1, "", fmt.Sprintf("the residuals trend with conversion (p = %.3g): a systematic error in the conversion (for example residual monomer in the weighed polymer)", e.TrendConversion.PValue))
	}

	all := true
	for _, r := range runs {
		if !(r.SF > 0 && r.Sf > 0 && (r.Conversion == 0 || r.SX > 0)) {
			all = false
		}
	}
	if all {
		ev, err := ErrorsInVariables(runs, nl.R1, nl.R2, level)
		if err != nil {
			warn(copoly.Code(err), MethodEVM, -1, copoly.Field(err), err.Error())
		} else {
			e.EVM = ev
			e.Recommended = MethodEVM
		}
	} else {
		warn(copoly.CodeNoUncertainties, MethodEVM, -1, "", "error-in-variables needs the uncertainties of f10, X and F1 for every run")
	}
	return e, nil
}

// trend fits residuals = a·v + b by least squares and tests a ≠ 0 with Student's t.
func trend(v, res []float64) Trend {
	n := len(v)
	slope, icpt, ok := ols(v, res)
	if !ok || n < 3 {
		// No spread in the variable (e.g. no conversions given): no evidence of a trend.
		return Trend{PValue: 1}
	}
	var mv, sxx, sse float64
	for _, x := range v {
		mv += x
	}
	mv /= float64(n)
	for i, x := range v {
		sxx += (x - mv) * (x - mv)
		d := res[i] - (slope*x + icpt)
		sse += d * d
	}
	dof := float64(n - 2)
	se := math.Sqrt(sse / dof / sxx)
	t := Trend{Slope: slope, PValue: 1}
	if se > 0 {
		t.PValue = studentTTwoSided(slope/se, dof)
	} else if slope != 0 {
		t.PValue = 0
	}
	t.Flagged = n >= 5 && t.PValue < 0.05
	return t
}
