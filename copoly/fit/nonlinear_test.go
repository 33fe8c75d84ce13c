package fit

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat/distuv"

	"copoly/copoly"
)

// simulatedRuns returns runs generated with the integrated model at a 5×4 design of feeds and
// conversions, with seeded Gaussian noise of standard deviation sd on F1 (simulated data for
// the statistical tests, not measurements).
func simulatedRuns(m copoly.Terminal, sd float64, seed uint64) []copoly.Run {
	rng := rand.New(rand.NewPCG(seed, 1))
	var runs []copoly.Run
	for _, f := range []float64{0.1, 0.3, 0.5, 0.7, 0.9} {
		for _, x := range []float64{0.05, 0.15, 0.25, 0.35} {
			runs = append(runs, copoly.Run{F10: f, Conversion: x, F1: m.Cumulative(f, x) + sd*rng.NormFloat64()})
		}
	}
	return runs
}

func TestLeastSquaresExactRecovery(t *testing.T) {
	for _, m := range recoveryPairs {
		runs := cumulativeRuns(m, []float64{0.15, 0.4, 0.6, 0.85}, []float64{0.05, 0.3, 0.6})
		res, err := LeastSquares(runs, NonlinearOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(res.R1, m.R1, 1e-6, 1e-6) || !scalar.EqualWithinAbsOrRel(res.R2, m.R2, 1e-6, 1e-6) || res.SSR > 1e-18 {
			t.Errorf("%v: fit of exact data = (%v, %v), S = %v", m, res.R1, res.R2, res.SSR)
		}
	}
}

// Residuals in F2 = 1 − F1 are the residuals in F1 with the sign changed, so the fit is
// symmetric in the labels: swapping M1 and M2 returns (r2, r1).
func TestLeastSquaresLabelSymmetry(t *testing.T) {
	runs := simulatedRuns(copoly.Terminal{R1: 0.52, R2: 0.46}, 0.01, 3)
	a, err := LeastSquares(runs, NonlinearOptions{})
	if err != nil {
		t.Fatal(err)
	}
	sw := make([]copoly.Run, len(runs))
	for i, r := range runs {
		sw[i] = copoly.Run{F10: 1 - r.F10, Conversion: r.Conversion, F1: 1 - r.F1}
	}
	b, err := LeastSquares(sw, NonlinearOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(a.R1, b.R2, 1e-6, 1e-6) || !scalar.EqualWithinAbsOrRel(a.R2, b.R1, 1e-6, 1e-6) || !scalar.EqualWithinAbsOrRel(a.SSR, b.SSR, 1e-9, 1e-9) {
		t.Errorf("fit (%v, %v) S=%v; swapped fit (%v, %v) S=%v", a.R1, a.R2, a.SSR, b.R2, b.R1, b.SSR)
	}
}

func TestJointConfidenceRegion(t *testing.T) {
	runs := simulatedRuns(copoly.Terminal{R1: 0.52, R2: 0.46}, 0.01, 5)
	res, err := LeastSquares(runs, NonlinearOptions{})
	if err != nil {
		t.Fatal(err)
	}
	reg := res.Region
	// F(2, ν) has the closed-form quantile (ν/2)(α^(−2/ν) − 1), so the critical level is
	// S_min·α^(−2/ν) (from the CDF 1 − (1 + 2x/ν)^(−ν/2) of the F distribution with 2 and ν
	// degrees of freedom).
	nu := float64(res.DoF)
	if want := res.SSR * math.Pow(0.05, -2/nu); !scalar.EqualWithinAbsOrRel(reg.Critical, want, 1e-9, 1e-9) || reg.Kind != "F" {
		t.Errorf("critical S = %v (%s), want S_min·0.05^(−2/ν) = %v", reg.Critical, reg.Kind, want)
	}
	if reg.Open || len(reg.Boundary) != 48 {
		t.Fatalf("region open %v with %d points", reg.Open, len(reg.Boundary))
	}
	// Every boundary point lies on the critical contour, and the estimate lies inside the box.
	p := &problem{runs: runs}
	for _, b := range reg.Boundary {
		if s := p.ssr(b[0], b[1]); math.Abs(s-reg.Critical) > 1e-4*reg.Critical {
			t.Errorf("boundary point %v: S = %v, critical %v", b, s, reg.Critical)
		}
	}
	if !(reg.R1Min < res.R1 && res.R1 < reg.R1Max && reg.R2Min < res.R2 && res.R2 < reg.R2Max) {
		t.Errorf("estimate (%v, %v) outside the region's box %+v", res.R1, res.R2, reg)
	}
	// The linearised standard errors are of the size of the region: the box half-width is
	// about √(2F)·SE for an elliptical region.
	half := 0.5 * (reg.R1Max - reg.R1Min)
	k := math.Sqrt(2 * distuv.F{D1: 2, D2: nu}.Quantile(0.95))
	if ratio := half / (k * res.SE1); ratio < 0.8 || ratio > 1.25 {
		t.Errorf("region half-width %v against √(2F)·SE1 = %v", half, k*res.SE1)
	}
}

func TestLeastSquaresWeighted(t *testing.T) {
	runs := simulatedRuns(copoly.Terminal{R1: 1.88, R2: 0.43}, 0.01, 9)
	for i := range runs {
		runs[i].SF = 0.01
	}
	res, err := LeastSquares(runs, NonlinearOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !res.Weighted || res.Region.Kind != "chi2" {
		t.Fatalf("weighted %v kind %s", res.Weighted, res.Region.Kind)
	}
	// χ²_0.95(2) = −2 ln 0.05 = 5.9915 (closed form of the χ² distribution with two degrees of
	// freedom, an exponential).
	if d := res.Region.Critical - res.SSR; !scalar.EqualWithinAbsOrRel(d, -2*math.Log(0.05), 1e-9, 1e-9) {
		t.Errorf("χ² region: critical − χ²_min = %v, want %v", d, -2*math.Log(0.05))
	}
	// With σ = the true noise, χ²/ν should be near 1: within the 99.9 % band of χ²(18)/18.
	lo := distuv.ChiSquared{K: 18}.Quantile(0.0005) / 18
	hi := distuv.ChiSquared{K: 18}.Quantile(0.9995) / 18
	if res.ReducedChi2 < lo || res.ReducedChi2 > hi {
		t.Errorf("reduced χ² = %v outside [%v, %v]", res.ReducedChi2, lo, hi)
	}
	if math.Abs(res.R1-1.88) > 5*res.SE1 || math.Abs(res.R2-0.43) > 5*res.SE2 {
		t.Errorf("estimate (%v ± %v, %v ± %v) far from the truth (1.88, 0.43)", res.R1, res.SE1, res.R2, res.SE2)
	}
}

func TestLeastSquaresValidates(t *testing.T) {
	all := simulatedRuns(copoly.Terminal{R1: 1, R2: 2}, 0, 1)
	good := []copoly.Run{all[0], all[4], all[8]} // three feeds
	for _, tc := range []struct {
		name  string
		runs  []copoly.Run
		field string
	}{
		{"two runs", good[:2], "runs"},
		{"bad F1", append([]copoly.Run{{F10: 0.5, F1: 1.2}}, good...), "runs[0].F1"},
		{"full conversion", append([]copoly.Run{{F10: 0.5, F1: 0.5, Conversion: 1}}, good...), "runs[0].conversion"},
		{"negative sigma", append([]copoly.Run{{F10: 0.5, F1: 0.5, SF: -0.1}}, good...), "runs[0].sF"},
		{"one feed", []copoly.Run{{F10: 0.5, F1: 0.5}, {F10: 0.5, F1: 0.6}, {F10: 0.5, F1: 0.55}}, "runs"},
	} {
		if _, err := LeastSquares(tc.runs, NonlinearOptions{}); copoly.Field(err) != tc.field {
			t.Errorf("%s: error %v, want field %s", tc.name, err, tc.field)
		}
	}
	if _, err := LeastSquares(good, NonlinearOptions{Level: 1.5}); copoly.Field(err) != "level" {
		t.Errorf("level 1.5: error %v", err)
	}
}
