package fit

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// fitScipyPath is the fixture made by testdata/fit_scipy.py: reactivity-ratio fits computed by
// scipy 1.10.1 (scipy.optimize.least_squares, brentq, SLSQP; numpy.polyfit) on the Meyer–Lowry
// integrated model, independent of copoly. Versions and the command are in the file's header
// fields and in testdata/README.md.
const fitScipyPath = "../../testdata/fit_scipy.json"

// Tolerances of the comparison with scipy, chosen for this cross-check (common practice, no
// source) with the reasons below; the differences measured on the fixture are logged with -v
// and are far smaller (estimates 4e-9, S_min 4e-14, SE 7e-9 relative; box inside by at most
// 5e-4 of the width, never outside).
const (
	// Estimates: two different optimisers stopping at their own tolerances.
	fitScipyEstimateTol = 1e-5
	// S_min and the critical level: S is flat at the minimum, so a 1e-5 shift of the estimate
	// changes S far less.
	fitScipySSRTol = 1e-8
	// Standard errors: both take (JᵀJ)⁻¹ from a finite-difference Jacobian (copoly central
	// differences with h = 1e-6·r, scipy "3-point").
	fitScipySETol = 1e-3
	// Region bounds: copoly traces 48 rays, whose polygon lies slightly inside the region; it may
	// be inside scipy's box by up to 2 % of the width, outside by at most 1e-4 of the width (a
	// ray's root finding stops within 1e-6 of its length), and within 2e-3 relative of each
	// bound.
	fitScipyBoxInside  = 0.02
	fitScipyBoxOutside = 1e-4
	fitScipyBoxRel     = 2e-3
	// The objective evaluated by copoly at scipy's estimate against scipy's S_min: both models are
	// good to about 1e-13 in F̄1 (see TestDriftAgainstScipy), which moves S by about 1e-11
	// relative; 1e-9 leaves room (common practice, no source).
	fitScipyModelTol = 1e-9
	// Fineman–Ross and Kelen–Tüdős are closed-form least-squares lines: copoly's centred sums
	// and numpy.polyfit's lstsq agree to rounding, far below 1e-9 (common practice, no source).
	fitScipyLinearTol = 1e-9
)

// fitScipyFixture mirrors testdata/fit_scipy.json.
// It is decoded with unknown fields disallowed, so a renamed key fails loudly instead of
// leaving an expected value at zero.
type fitScipyFixture struct {
	Comment      string         `json:"comment"`
	MadeBy       string         `json:"made_by"`
	Python       string         `json:"python"`
	Numpy        string         `json:"numpy"`
	Scipy        string         `json:"scipy"`
	Level        float64        `json:"level"`
	LeastSquares map[string]any `json:"least_squares"`
	Starts       [][2]float64   `json:"starts"`
	Sets         []fitScipySet  `json:"sets"`
}

type fitScipySet struct {
	Name     string `json:"name"`
	Source   string `json:"source"`
	Weighted bool   `json:"weighted"`
	// TrueR1 and TrueR2 are the ratios the simulated sets were generated with (absent for
	// measured data); the test does not use them.
	TrueR1 float64 `json:"true_r1"`
	TrueR2 float64 `json:"true_r2"`
	// Runs are [f10, X, F1, sF]; X = 0 means instantaneous, sF = 0 means none.
	Runs      [][4]float64 `json:"runs"`
	Nonlinear struct {
		R1       float64 `json:"r1"`
		R2       float64 `json:"r2"`
		SMin     float64 `json:"s_min"`
		N        int     `json:"n"`
		SE1      float64 `json:"se1"`
		SE2      float64 `json:"se2"`
		Corr     float64 `json:"corr"`
		Kind     string  `json:"kind"`
		Critical float64 `json:"critical"`
		R1Min    float64 `json:"r1_min"`
		R1Max    float64 `json:"r1_max"`
		R2Min    float64 `json:"r2_min"`
		R2Max    float64 `json:"r2_max"`
	} `json:"nonlinear"`
	FinemanRoss struct {
		R1 float64 `json:"r1"`
		R2 float64 `json:"r2"`
	} `json:"fineman_ross"`
	KelenTudos struct {
		R1    float64 `json:"r1"`
		R2    float64 `json:"r2"`
		Alpha float64 `json:"alpha"`
	} `json:"kelen_tudos"`
	// Published is the pair a paper published for these runs, the objective S there and the
	// level of the joint region through it (the georgiev1995-* sets only; nil otherwise).
	Published *struct {
		R1    float64 `json:"r1"`
		R2    float64 `json:"r2"`
		Table string  `json:"table"`
		S     float64 `json:"s"`
		Level float64 `json:"level"`
	} `json:"published"`
}

func (s fitScipySet) runs() []copoly.Run {
	runs := make([]copoly.Run, len(s.Runs))
	for i, r := range s.Runs {
		runs[i] = copoly.Run{F10: r[0], Conversion: r[1], F1: r[2], SF: r[3]}
	}
	return runs
}

func readFitScipy(t *testing.T) fitScipyFixture {
	t.Helper()
	b, err := os.ReadFile(fitScipyPath)
	if err != nil {
		t.Fatal(err)
	}
	var fx fitScipyFixture
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&fx); err != nil {
		t.Fatalf("%s: %v", fitScipyPath, err)
	}
	// The fixture holds seven sets (testdata/README.md); fewer means a truncated or wrong file,
	// and a test over no sets would assert nothing.
	if len(fx.Sets) != 7 || fx.Level != 0.95 {
		t.Fatalf("%s: %d sets at level %v, want the 7 sets at 0.95 listed in testdata/README.md", fitScipyPath, len(fx.Sets), fx.Level)
	}
	for _, s := range fx.Sets {
		if len(s.Runs) < 3 || s.Nonlinear.N != len(s.Runs) {
			t.Fatalf("%s: set %s has %d runs, n = %d", fitScipyPath, s.Name, len(s.Runs), s.Nonlinear.N)
		}
	}
	t.Logf("%s: made by %s with python %s, numpy %s, scipy %s", fitScipyPath, fx.MadeBy, fx.Python, fx.Numpy, fx.Scipy)
	return fx
}

// relDiff returns |got − want|/|want| (|got − want| when want is 0).
func relDiff(got, want float64) float64 {
	d := math.Abs(got - want)
	if want != 0 {
		d /= math.Abs(want)
	}
	return d
}

// TestLeastSquaresAgainstScipy compares LeastSquares with the scipy fits of
// testdata/fit_scipy.json: estimates, S_min (or χ²_min), linearised standard errors, the joint
// region's critical level and its bounding box.
func TestLeastSquaresAgainstScipy(t *testing.T) {
	fx := readFitScipy(t)
	for _, set := range fx.Sets {
		t.Run(set.Name, func(t *testing.T) {
			want := set.Nonlinear
			runs := set.runs()
			res, err := LeastSquares(runs, NonlinearOptions{Level: fx.Level})
			if err != nil {
				t.Fatalf("%s: set %s: LeastSquares: %v", fitScipyPath, set.Name, err)
			}
			if res.Weighted != set.Weighted || res.Region.Kind != want.Kind || res.N != want.N {
				t.Errorf("%s: set %s: weighted %v, region %q, n %d; scipy weighted %v, region %q, n %d",
					fitScipyPath, set.Name, res.Weighted, res.Region.Kind, res.N, set.Weighted, want.Kind, want.N)
			}
			for _, c := range []struct {
				name      string
				got, want float64
				tol       float64
			}{
				{"r1", res.R1, want.R1, fitScipyEstimateTol},
				{"r2", res.R2, want.R2, fitScipyEstimateTol},
				{"S_min", res.SSR, want.SMin, fitScipySSRTol},
				{"SE(r1)", res.SE1, want.SE1, fitScipySETol},
				{"SE(r2)", res.SE2, want.SE2, fitScipySETol},
				{"corr(r1, r2)", res.Corr, want.Corr, fitScipySETol},
				{"critical level", res.Region.Critical, want.Critical, fitScipySSRTol},
			} {
				d := relDiff(c.got, c.want)
				t.Logf("%s = %.12g, scipy %.12g (relative difference %.2g)", c.name, c.got, c.want, d)
				if !scalar.EqualWithinRel(c.got, c.want, c.tol) {
					t.Errorf("%s: set %s: LeastSquares %s = %.12g, scipy %.12g (relative difference %.2g > %g)",
						fitScipyPath, set.Name, c.name, c.got, c.want, d, c.tol)
				}
			}

			// The two objectives at one point: copoly's S at scipy's estimate is scipy's S_min
			// (the models agree), and copoly's own minimum is no higher (its optimiser did its job).
			p := &problem{runs: runs}
			if set.Weighted {
				p.w = make([]float64, len(runs))
				for i, r := range runs {
					p.w[i] = 1 / (r.SF * r.SF) // χ² weights 1/σ² (van Herk & Liu 2024, cited in LeastSquares)
				}
			}
			at := p.ssr(want.R1, want.R2)
			t.Logf("copoly S at scipy's estimate = %.15g, scipy S_min %.15g (relative %.2g)", at, want.SMin, relDiff(at, want.SMin))
			if !scalar.EqualWithinRel(at, want.SMin, fitScipyModelTol) {
				t.Errorf("%s: set %s: copoly's objective at scipy's estimate (%v, %v) = %.15g, scipy's S_min %.15g: the models differ",
					fitScipyPath, set.Name, want.R1, want.R2, at, want.SMin)
			}
			if res.SSR > at*(1+fitScipyModelTol) {
				t.Errorf("%s: set %s: LeastSquares stopped at S = %.15g, above its own S = %.15g at scipy's estimate",
					fitScipyPath, set.Name, res.SSR, at)
			}

			reg := res.Region
			if reg.Open || len(reg.Boundary) != 48 {
				t.Fatalf("%s: set %s: region open %v with %d points, want a closed 48-point boundary (the default of NonlinearOptions)",
					fitScipyPath, set.Name, reg.Open, len(reg.Boundary))
			}
			w1, w2 := want.R1Max-want.R1Min, want.R2Max-want.R2Min
			for _, b := range []struct {
				name      string
				got, want float64
				width     float64
				up        bool // an upper bound: copoly's lies at or below scipy's
			}{
				{"r1Min", reg.R1Min, want.R1Min, w1, false},
				{"r1Max", reg.R1Max, want.R1Max, w1, true},
				{"r2Min", reg.R2Min, want.R2Min, w2, false},
				{"r2Max", reg.R2Max, want.R2Max, w2, true},
			} {
				inside := b.got - b.want // how far copoly's bound lies inside scipy's box
				if b.up {
					inside = -inside
				}
				t.Logf("region %s = %.10g, scipy %.10g: inside by %.3g of the width (relative difference %.2g)",
					b.name, b.got, b.want, inside/b.width, relDiff(b.got, b.want))
				if inside > fitScipyBoxInside*b.width || inside < -fitScipyBoxOutside*b.width {
					t.Errorf("%s: set %s: region %s = %.10g, scipy %.10g: inside scipy's box by %.3g of the width, want between %g and %g",
						fitScipyPath, set.Name, b.name, b.got, b.want, inside/b.width, -fitScipyBoxOutside, fitScipyBoxInside)
				}
				if !scalar.EqualWithinAbsOrRel(b.got, b.want, 0, fitScipyBoxRel) {
					t.Errorf("%s: set %s: region %s = %.10g, scipy %.10g (relative difference %.2g > %g)",
						fitScipyPath, set.Name, b.name, b.got, b.want, relDiff(b.got, b.want), fitScipyBoxRel)
				}
			}
		})
	}
}

// TestLinearAgainstScipy compares FinemanRoss and KelenTudos with numpy.polyfit on the same
// transforms (testdata/fit_scipy.json).
func TestLinearAgainstScipy(t *testing.T) {
	fx := readFitScipy(t)
	for _, set := range fx.Sets {
		runs := set.runs()
		fr, err := FinemanRoss(runs)
		if err != nil {
			t.Fatalf("%s: set %s: FinemanRoss: %v", fitScipyPath, set.Name, err)
		}
		kt, err := KelenTudos(runs)
		if err != nil {
			t.Fatalf("%s: set %s: KelenTudos: %v", fitScipyPath, set.Name, err)
		}
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"FinemanRoss r1", fr.R1, set.FinemanRoss.R1},
			{"FinemanRoss r2", fr.R2, set.FinemanRoss.R2},
			{"KelenTudos r1", kt.R1, set.KelenTudos.R1},
			{"KelenTudos r2", kt.R2, set.KelenTudos.R2},
			{"KelenTudos α", kt.Alpha, set.KelenTudos.Alpha},
		} {
			t.Logf("set %s: %s = %.15g, numpy.polyfit %.15g (relative difference %.2g)", set.Name, c.name, c.got, c.want, relDiff(c.got, c.want))
			if !scalar.EqualWithinRel(c.got, c.want, fitScipyLinearTol) {
				t.Errorf("%s: set %s: %s = %.15g, numpy.polyfit %.15g (relative difference %.2g > %g)",
					fitScipyPath, set.Name, c.name, c.got, c.want, relDiff(c.got, c.want), fitScipyLinearTol)
			}
		}
	}
}
