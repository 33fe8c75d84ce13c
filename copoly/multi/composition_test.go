package multi

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"

	"copoly/copoly"
)

// randomRatios returns an n×n ratio matrix with off-diagonal ratios log-uniform in
// [1e-3, 1e2] (the span of published ratios and somewhat beyond; common practice, no source).
func randomRatios(rng *rand.Rand, n int) [][]float64 {
	r := make([][]float64, n)
	for i := range r {
		r[i] = make([]float64, n)
		for j := range r[i] {
			if i == j {
				r[i][j] = 1
			} else {
				r[i][j] = math.Pow(10, -3+5*rng.Float64())
			}
		}
	}
	return r
}

// randomFeed returns n mole fractions drawn uniformly on the simplex (normalized exponentials).
func randomFeed(rng *rand.Rand, n int) []float64 {
	f := make([]float64, n)
	var s float64
	for i := range f {
		f[i] = rng.ExpFloat64()
		s += f[i]
	}
	for i := range f {
		f[i] /= s
	}
	return f
}

func mustNew(t testing.TB, r, cross [][]float64) *Model {
	t.Helper()
	m, err := New(r, cross)
	if err != nil {
		t.Fatalf("New(%v, %v): %v", r, cross, err)
	}
	return m
}

func mustComposition(t testing.TB, m *Model, f []float64) []float64 {
	t.Helper()
	F, err := m.Composition(nil, f)
	if err != nil {
		t.Fatalf("Composition(%v): %v", f, err)
	}
	return F
}

// TestCompositionMayoLewis checks N = 2 against copoly.Terminal.Instantaneous (the Mayo–Lewis
// equation: F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594) to 1e-12, on random
// ratios and feeds and on zero ratios inside the interval.
func TestCompositionMayoLewis(t *testing.T) {
	rng := rand.New(rand.NewPCG(1944, 1594))
	type pair struct{ r1, r2, f1 float64 }
	var cases []pair
	for range 2000 {
		r := randomRatios(rng, 2)
		cases = append(cases, pair{r[0][1], r[1][0], rng.Float64()})
	}
	// Zero ratios: the limits where a radical always adds the other monomer.
	for _, f1 := range []float64{0.01, 0.3, 0.5, 0.9, 0.999} {
		cases = append(cases, pair{0, 0.5, f1}, pair{2, 0, f1}, pair{0, 0, f1}, pair{1e-3, 1e-3, f1})
	}
	for _, c := range cases {
		m := mustNew(t, [][]float64{{1, c.r1}, {c.r2, 1}}, nil)
		F := mustComposition(t, m, []float64{c.f1, 1 - c.f1})
		want := copoly.Terminal{R1: c.r1, R2: c.r2}.Instantaneous(c.f1)
		if !scalar.EqualWithinAbsOrRel(F[0], want, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(F[1], 1-want, 1e-12, 1e-12) {
			t.Errorf("r1 = %g, r2 = %g: Composition(%g) = %v, Mayo–Lewis F1 = %.16g", c.r1, c.r2, c.f1, F, want)
		}
	}
}

// alfreyGoldfinger is the ternary composition equation of T. Alfrey, G. Goldfinger, J. Chem.
// Phys. 1944, 12, 322, written out from the paper's form with r_ij = k_ii/k_ij (monomers 1, 2, 3
// at indices 0, 1, 2), independently of the package's solver:
//
//	F1 : F2 : F3 = f1 (f1/(r31 r21) + f2/(r21 r32) + f3/(r31 r23)) (f1 + f2/r12 + f3/r13)
//	             : f2 (f1/(r12 r31) + f2/(r12 r32) + f3/(r32 r13)) (f2 + f1/r21 + f3/r23)
//	             : f3 (f1/(r13 r21) + f2/(r23 r12) + f3/(r13 r23)) (f3 + f1/r31 + f2/r32)
func alfreyGoldfinger(r [][]float64, f []float64) [3]float64 {
	r12, r13, r21, r23, r31, r32 := r[0][1], r[0][2], r[1][0], r[1][2], r[2][0], r[2][1]
	f1, f2, f3 := f[0], f[1], f[2]
	a := f1 * (f1/(r31*r21) + f2/(r21*r32) + f3/(r31*r23)) * (f1 + f2/r12 + f3/r13)
	b := f2 * (f1/(r12*r31) + f2/(r12*r32) + f3/(r32*r13)) * (f2 + f1/r21 + f3/r23)
	c := f3 * (f1/(r13*r21) + f2/(r23*r12) + f3/(r13*r23)) * (f3 + f1/r31 + f2/r32)
	s := a + b + c
	return [3]float64{a / s, b / s, c / s}
}

// TestCompositionAlfreyGoldfinger checks N = 3 against the Alfrey–Goldfinger equation on 5000
// random ratio sets and feeds, to 1e-11 relative (measured: 3.3e-16 at most).
func TestCompositionAlfreyGoldfinger(t *testing.T) {
	rng := rand.New(rand.NewPCG(1944, 322))
	worst := 0.0
	for range 5000 {
		r := randomRatios(rng, 3)
		f := randomFeed(rng, 3)
		F := mustComposition(t, mustNew(t, r, nil), f)
		want := alfreyGoldfinger(r, f)
		for i := range 3 {
			d := math.Abs(F[i] - want[i])
			worst = math.Max(worst, d)
			if !scalar.EqualWithinAbsOrRel(F[i], want[i], 1e-11, 1e-11) {
				t.Fatalf("r = %v, f = %v: F = %v, Alfrey–Goldfinger %v", r, f, F, want)
			}
		}
	}
	t.Logf("largest difference from Alfrey–Goldfinger: %.2g", worst)
}

// TestCompositionMissingMonomer checks that a feed without monomer k gives the composition of
// the model of the other N − 1 monomers, and F_k = 0 (identity of the model: a monomer absent
// from the feed cannot enter the chain).
func TestCompositionMissingMonomer(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for range 500 {
		n := 3 + rng.IntN(4)
		r := randomRatios(rng, n)
		k := rng.IntN(n)
		f := randomFeed(rng, n)
		f[k] = 0
		var s float64
		for _, v := range f {
			s += v
		}
		var sub [][]float64
		var fs []float64
		for i := range n {
			if i == k {
				continue
			}
			var row []float64
			for j := range n {
				if j != k {
					row = append(row, r[i][j])
				}
			}
			sub = append(sub, row)
			fs = append(fs, f[i]/s)
		}
		for i := range f {
			f[i] /= s
		}
		F := mustComposition(t, mustNew(t, r, nil), f)
		Fs := mustComposition(t, mustNew(t, sub, nil), fs)
		if F[k] != 0 {
			t.Fatalf("r = %v, f = %v: F[%d] = %v, want 0", r, f, k, F[k])
		}
		for i, j := 0, 0; i < n; i++ {
			if i == k {
				continue
			}
			if !scalar.EqualWithinAbsOrRel(F[i], Fs[j], 1e-13, 1e-12) {
				t.Fatalf("r = %v, f = %v: F = %v, the %d-monomer model gives %v", r, f, F, n-1, Fs)
			}
			j++
		}
	}
}

// TestCompositionIdentities checks, on random models of 2…6 monomers, that ΣF = 1 and
// F ≥ 0, that all ratios 1 give F = f (every radical adds monomers in proportion to the feed),
// and that the solver agrees with an independent dense solve of (Pᵀ − I) F = 0, ΣF = 1 by
// gonum's LU with partial pivoting, to 1e-12 relative.
func TestCompositionIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for range 2000 {
		n := 2 + rng.IntN(5)
		r := randomRatios(rng, n)
		f := randomFeed(rng, n)
		F := mustComposition(t, mustNew(t, r, nil), f)
		var s float64
		for _, v := range F {
			if !(v >= 0) {
				t.Fatalf("r = %v, f = %v: F = %v has a negative or NaN value", r, f, F)
			}
			s += v
		}
		if math.Abs(s-1) > 1e-14 {
			t.Fatalf("r = %v, f = %v: ΣF = %.17g", r, f, s)
		}
		want := denseStationary(r, f)
		for i := range n {
			if !scalar.EqualWithinAbsOrRel(F[i], want[i], 1e-15, 1e-10) {
				t.Fatalf("r = %v, f = %v: F = %v, gonum LU %v", r, f, F, want)
			}
		}
		ones := make([][]float64, n)
		for i := range ones {
			ones[i] = make([]float64, n)
			for j := range ones[i] {
				ones[i][j] = 1
			}
		}
		F1 := mustComposition(t, mustNew(t, ones, nil), f)
		for i := range n {
			if !scalar.EqualWithinAbsOrRel(F1[i], f[i], 1e-15, 1e-14) {
				t.Fatalf("all r = 1, f = %v: F = %v, want f", f, F1)
			}
		}
	}
}

// denseStationary solves (Pᵀ − I) π = 0 with the last equation replaced by Σπ = 1, with
// P_ij = (f_j/r_ij)/Σ_k(f_k/r_ik) built directly, by gonum's LU (partial pivoting).
func denseStationary(r [][]float64, f []float64) []float64 {
	n := len(r)
	a := mat.NewDense(n, n, nil)
	b := mat.NewVecDense(n, nil)
	for i := range n {
		var s float64
		for k := range n {
			s += f[k] / r[i][k]
		}
		for j := range n {
			p := f[j] / r[i][j] / s
			// row j of Pᵀ − I gets P_ij in column i
			v := a.At(j, i) + p
			if i == j {
				v -= 1
			}
			a.Set(j, i, v)
		}
	}
	for j := range n {
		a.Set(n-1, j, 1)
	}
	b.SetVec(n-1, 1)
	var x mat.VecDense
	if err := x.SolveVec(a, b); err != nil {
		panic(err)
	}
	return x.RawVector().Data
}

// TestCompositionTinyRatios checks ratios of 1e-4 and a nearly pure feed: no overflow, and full
// relative precision of the minor components, against the gonum solve (whose 1 − P_kk loses
// digits, hence 1e-6) and against the first-order expansion F_k ≈ f_k·(Σ_j π_j P_jk/f_k) for a
// trace monomer, worked by hand: with f = (1 − 2ε, ε, ε) and every r_ij = 1e-4, a radical i ≠ 1
// adds M1 with probability → 1, and M1 radicals add M2 or M3 with probability ε/(1e-4 (1 − 2ε) +
// 2ε) each, so F2 = F3 → ε/(1e-4 + 2ε)·F1 to first order.
func TestCompositionTinyRatios(t *testing.T) {
	const eps = 1e-12
	r := [][]float64{{1, 1e-4, 1e-4}, {1e-4, 1, 1e-4}, {1e-4, 1e-4, 1}}
	f := []float64{1 - 2*eps, eps, eps}
	F := mustComposition(t, mustNew(t, r, nil), f)
	p := eps / (1e-4*(1-2*eps) + 2*eps)
	// π1 = 1/(1 + 2p) with π2 = π3 = p π1: M2 and M3 radicals go back to M1 (to first order).
	want := p / (1 + 2*p)
	if !scalar.EqualWithinAbsOrRel(F[1], want, 0, 1e-6) || F[1] != F[2] {
		t.Errorf("f = %v: F = %v, want F2 = F3 ≈ %.6g", f, F, want)
	}
	for _, v := range F {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("F = %v is not finite", F)
		}
	}
}

// TestCompositionZeroRatios checks the limits of zero ratios (worked by hand from the chain):
//   - r[0][1] = 0 with N = 3: every M1 is followed by M2, so the dyad M1M2 has the frequency of
//     M1: F1 P12 = F1 with P12 = 1.
//   - a monomer that does not add to its own radical, N = 2: the binary Mayo–Lewis limit.
//   - the same monomer for N = 3 with cross ratios k31 : k32 = 1 : 3 and all other ratios 1:
//     radical M3 adds M1 or M2 as 1·f1 : 3·f2.
func TestCompositionZeroRatios(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0, 0.5}, {0.3, 1, 2}, {0.7, 1.5, 1}}, nil)
	var c chain
	var fa [MaxMonomers]float64
	copy(fa[:], []float64{0.2, 0.3, 0.5})
	if !m.build(&c, &fa, 7) {
		t.Fatal("build failed")
	}
	c.stationary()
	for a := range c.n {
		if c.idx[a] != 0 {
			continue
		}
		for b := range c.n {
			want := 0.0
			if c.idx[b] == 1 {
				want = 1
			}
			if c.p[a][b] != want {
				t.Errorf("r[0][1] = 0: P[0][%d] = %v, want %v", c.idx[b], c.p[a][b], want)
			}
		}
	}

	// N = 3, M3 does not add to itself; cross 1 : 3; other ratios 1.
	r := [][]float64{{1, 1, 1}, {1, 1, 1}, {0, 0, 1}}
	m3 := mustNew(t, r, [][]float64{nil, nil, {1, 3, 0}})
	f := []float64{0.2, 0.3, 0.5}
	F := mustComposition(t, m3, f)
	// Radicals M1, M2 add each monomer in proportion to f; M3 adds M1 : M2 = 0.2 : 0.9.
	// π solves π = π P with P rows (0.2, 0.3, 0.5), (0.2, 0.3, 0.5), (0.2/1.1, 0.9/1.1, 0).
	// By hand: π3 = 0.5 (π1 + π2) = 0.5 (1 − π3) → π3 = 1/3; π1 = 0.2 (2/3) + (0.2/1.1)(1/3).
	want1 := 0.2*2.0/3 + 0.2/1.1/3
	if !scalar.EqualWithinAbsOrRel(F[2], 1.0/3, 1e-15, 1e-14) || !scalar.EqualWithinAbsOrRel(F[0], want1, 1e-15, 1e-14) {
		t.Errorf("M3 without homopolymerization, cross 1:3: F = %v, want (%.15g, …, 1/3)", F, want1)
	}

	// A feed of the non-homopolymerizing monomer alone forms no polymer: NaN.
	F = mustComposition(t, m3, []float64{0, 0, 1})
	for _, v := range F {
		if !math.IsNaN(v) {
			t.Errorf("M3 alone: F = %v, want NaN (no polymer)", F)
			break
		}
	}
}

// TestNewErrors checks that each invalid model is refused with the field of the bad cell and
// the right sentinel.
func TestNewErrors(t *testing.T) {
	ok3 := func() [][]float64 { return [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}} }
	with := func(i, j int, v float64) [][]float64 { r := ok3(); r[i][j] = v; return r }
	seven := make([][]float64, 7)
	for i := range seven {
		seven[i] = make([]float64, 7)
		seven[i][i] = 1
	}
	tests := []struct {
		name  string
		r     [][]float64
		cross [][]float64
		field string
		err   error
		text  string
	}{
		// shape
		{"one monomer", [][]float64{{1}}, nil, "r", copoly.ErrOutOfRange, ""},
		{"seven monomers", seven, nil, "r", copoly.ErrTooMany, ""},
		{"ragged", [][]float64{{1, 0.5, 0.4}, {0.5, 1}, {0.1, 0.2, 1}}, nil, "r[1]", copoly.ErrOutOfRange, ""},
		// cells
		{"diagonal", with(2, 2, 0.9), nil, "r[2][2]", copoly.ErrOutOfRange, "diagonal"},
		{"diagonal NaN", with(1, 1, math.NaN()), nil, "r[1][1]", copoly.ErrNotFinite, ""},
		{"negative", with(1, 2, -0.1), nil, "r[1][2]", copoly.ErrOutOfRange, ""},
		{"NaN", with(0, 2, math.NaN()), nil, "r[0][2]", copoly.ErrNotFinite, ""},
		{"infinite", with(2, 0, math.Inf(1)), nil, "r[2][0]", copoly.ErrNotFinite, ""},
		{"above MaxRatio", with(2, 1, 2e4), nil, "r[2][1]", copoly.ErrOutOfRange, ""},
		// zero ratios
		{"no homopolymer without cross", [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0, 0, 1}}, nil, "r[2]", copoly.ErrOutOfRange, "cross[2]"},
		{"cross for a normal row", ok3(), [][]float64{{1, 1, 0}, nil, nil}, "cross[0]", copoly.ErrOutOfRange, ""},
		{"cross zero in a zero cell", [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0, 0, 1}}, [][]float64{nil, nil, {1, 0, 0}}, "cross[2][1]", copoly.ErrOutOfRange, ""},
		{"cross in a used cell", [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0, 0, 1}}, [][]float64{nil, nil, {1, 1, 1}}, "cross[2][2]", copoly.ErrOutOfRange, "not used"},
		{"cross NaN", [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0, 0, 1}}, [][]float64{nil, nil, {math.NaN(), 1, 0}}, "cross[2][0]", copoly.ErrNotFinite, ""},
		{"cross rows", [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0, 0, 1}}, [][]float64{{1, 3, 0}}, "cross", copoly.ErrOutOfRange, ""},
		{"two alternating pairs", [][]float64{{1, 0, 1, 1}, {0, 1, 1, 1}, {1, 1, 1, 0}, {1, 1, 0, 1}}, nil, "r[2][3]", copoly.ErrOutOfRange, "small positive"},
	}
	for _, tt := range tests {
		_, err := New(tt.r, tt.cross)
		if err == nil {
			t.Errorf("%s: New(%v, %v) = nil error, want %s", tt.name, tt.r, tt.cross, tt.field)
			continue
		}
		if got := copoly.Field(err); got != tt.field {
			t.Errorf("%s: error field %q, want %q (%v)", tt.name, got, tt.field, err)
		}
		if !errors.Is(err, tt.err) {
			t.Errorf("%s: error %v does not wrap %v", tt.name, err, tt.err)
		}
		if tt.text != "" && !strings.Contains(err.Error(), tt.text) {
			t.Errorf("%s: error %q does not mention %q", tt.name, err, tt.text)
		}
	}
}

// TestFeedErrors checks the validation of feeds.
func TestFeedErrors(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}}, nil)
	tests := []struct {
		f     [][]float64
		field string
		err   error
	}{
		{[][]float64{{0.2, 0.3, 0.5}, {0.5, 0.5}}, "f[1]", copoly.ErrOutOfRange},
		{[][]float64{{0.2, -0.1, 0.9}}, "f[0][1]", copoly.ErrOutOfRange},
		{[][]float64{{0.2, 0.3, 0.5}, {math.NaN(), 0.5, 0.5}}, "f[1][0]", copoly.ErrNotFinite},
		{[][]float64{{0.2, 0.3, 0.4}}, "f[0]", copoly.ErrOutOfRange},
		{[][]float64{{0.2, 0.3, 0.5 + 2e-9}}, "f[0]", copoly.ErrOutOfRange},
		{[][]float64{{0.2, 1.3, -0.5}}, "f[0][1]", copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		_, err := m.CompositionsTo(nil, tt.f)
		if got := copoly.Field(err); got != tt.field || !errors.Is(err, tt.err) {
			t.Errorf("CompositionsTo(%v): error %v (field %q), want field %q wrapping %v", tt.f, err, got, tt.field, tt.err)
		}
	}
	// within the tolerance: accepted and normalized
	if _, err := m.CompositionsTo(nil, [][]float64{{0.2, 0.3, 0.5 + 5e-10}}); err != nil {
		t.Errorf("a sum 5e-10 above 1 was refused: %v", err)
	}
	if _, err := Compositions([][]float64{{1, 2}, {3, 1}}, nil, make([][]float64, copoly.MaxPoints+1)); !errors.Is(err, copoly.ErrTooMany) {
		t.Errorf("too many feeds: %v, want ErrTooMany", err)
	}
}

// TestCompositionsRows checks that Compositions returns one row per feed equal to Composition.
func TestCompositionsRows(t *testing.T) {
	r := [][]float64{{1, 0.52, 0.40}, {0.46, 1, 1.32}, {0.04, 0.14, 1}}
	feeds := [][]float64{{0.3, 0.3, 0.4}, {1, 0, 0}, {0, 0.5, 0.5}}
	got, err := Compositions(r, nil, feeds)
	if err != nil {
		t.Fatal(err)
	}
	m := mustNew(t, r, nil)
	for k, f := range feeds {
		want := mustComposition(t, m, f)
		for i := range want {
			if got[k][i] != want[i] {
				t.Errorf("Compositions row %d = %v, Composition %v", k, got[k], want)
				break
			}
		}
	}
}
