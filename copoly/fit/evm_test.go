package fit

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

func TestErrorsInVariablesExactData(t *testing.T) {
	m := copoly.Terminal{R1: 0.52, R2: 0.46}
	runs := cumulativeRuns(m, []float64{0.15, 0.4, 0.6, 0.85}, []float64{0.05, 0.3})
	for i := range runs {
		runs[i].SF, runs[i].SX, runs[i].Sf = 0.01, 0.01, 0.005
	}
	res, err := ErrorsInVariables(runs, 0.6, 0.4, 0.95)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(res.R1, m.R1, 1e-6, 1e-6) || !scalar.EqualWithinAbsOrRel(res.R2, m.R2, 1e-6, 1e-6) || res.Phi > 1e-12 {
		t.Errorf("EVM on exact data = (%v, %v), Φ = %v", res.R1, res.R2, res.Phi)
	}
}

// To first order EVM is weighted least squares with the effective variance (Patino-Leal et al.
// 1980), so the two agree closely when the errors of f10 and X are small.
func TestErrorsInVariablesAgreesWithEffectiveVariance(t *testing.T) {
	m := copoly.Terminal{R1: 1.88, R2: 0.43}
	rng := rand.New(rand.NewPCG(11, 2))
	var runs []copoly.Run
	for _, f := range []float64{0.1, 0.3, 0.5, 0.7, 0.9} {
		for _, x := range []float64{0.1, 0.3} {
			runs = append(runs, copoly.Run{F10: f + 0.002*rng.NormFloat64(), Conversion: x + 0.005*rng.NormFloat64(),
				F1: m.Cumulative(f, x) + 0.01*rng.NormFloat64(), SF: 0.01, SX: 0.005, Sf: 0.002})
		}
	}
	nl, err := LeastSquares(runs, NonlinearOptions{})
	if err != nil {
		t.Fatal(err)
	}
	ev, err := ErrorsInVariables(runs, nl.R1, nl.R2, 0.95)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(ev.R1-nl.R1) > 0.2*nl.SE1 || math.Abs(ev.R2-nl.R2) > 0.2*nl.SE2 {
		t.Errorf("EVM (%v, %v) against effective-variance fit (%v ± %v, %v ± %v)", ev.R1, ev.R2, nl.R1, nl.SE1, nl.R2, nl.SE2)
	}
	if !scalar.EqualWithinAbsOrRel(ev.SE1, nl.SE1, 0.1, 0.1) {
		t.Errorf("EVM SE1 %v, effective-variance SE1 %v", ev.SE1, nl.SE1)
	}
	// Φ can only be below the effective-variance χ², since it also optimises the true values.
	if ev.Phi > nl.SSR*(1+1e-6) {
		t.Errorf("Φ = %v above χ² = %v", ev.Phi, nl.SSR)
	}
}

func TestErrorsInVariablesNeedsUncertainties(t *testing.T) {
	runs := cumulativeRuns(copoly.Terminal{R1: 1, R2: 2}, []float64{0.2, 0.5, 0.8}, []float64{0.1})
	if _, err := ErrorsInVariables(runs, 1, 2, 0.95); copoly.Field(err) != "runs" {
		t.Errorf("no uncertainties: error %v", err)
	}
}
