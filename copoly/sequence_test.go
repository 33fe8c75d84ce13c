package copoly

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestSequenceIdentities checks the identities of the first-order Markov description
// (Coleman & Fox 1963; Koenig 1980; Harwood & Ritchey 1964): each checked against a second,
// independently written form.
func TestSequenceIdentities(t *testing.T) {
	const tol = 1e-12
	for _, m := range testPairs {
		for _, f1 := range []float64{0.05, 0.3, 0.5, 0.7, 0.95} {
			s, err := m.Sequence(f1)
			if err != nil {
				t.Fatal(err)
			}
			x := f1 / (1 - f1)
			check := func(name string, got, want float64) {
				t.Helper()
				if !scalar.EqualWithinAbsOrRel(got, want, tol, tol) {
					t.Errorf("%v f1=%g: %s = %.15g, want %.15g", m, f1, name, got, want)
				}
			}
			check("F1 (Mayo–Lewis)", s.F1, m.Instantaneous(f1))
			check("P11 = r1 x/(1 + r1 x)", s.P11, m.R1*x/(1+m.R1*x))
			check("P22 = r2/(r2 + x)", s.P22, m.R2/(m.R2+x))
			check("dyads sum", s.D11+s.D12+s.D22, 1)
			check("D12 = 2 F2 P21", s.D12, 2*(1-s.F1)*s.P21)
			check("M1-centred triads sum", s.T111+s.T112+s.T212, 1)
			check("M2-centred triads sum", s.T222+s.T221+s.T121, 1)
			check("n̄1 = 1 + r1 x", s.MeanLength1, 1+m.R1*x)
			check("n̄2 = 1 + r2/x", s.MeanLength2, 1+m.R2/x)
			check("n̄1 from triads", s.MeanLength1, 1/(s.T212+0.5*s.T112))
			check("R = 200 F1 P12", s.RunNumber, 200*s.F1*s.P12)
			check("R = 200/(2 + r1 x + r2/x)", s.RunNumber, 200/(2+m.R1*x+m.R2/x))
			check("B = D12/(2 F1 F2)", s.Randomness, s.D12/(2*s.F1*(1-s.F1)))
			for _, v := range []float64{s.P11, s.P12, s.P21, s.P22, s.D11, s.D12, s.D22, s.T111, s.T112, s.T212, s.T222, s.T221, s.T121} {
				if v < 0 || v > 1 {
					t.Fatalf("%v f1=%g: probability %v outside [0, 1]: %+v", m, f1, v, s)
				}
			}
		}
	}
}

func TestSequenceLimits(t *testing.T) {
	// r1 = r2 = 1: a Bernoullian chain, P11 = P21 = f1 and B = 1, R = 200 F1 F2
	// (Harwood & Ritchey 1964).
	s, _ := Terminal{1, 1}.Sequence(0.3)
	if !scalar.EqualWithinAbs(s.P11, 0.3, 1e-15) || !scalar.EqualWithinAbs(s.P21, 0.3, 1e-15) ||
		!scalar.EqualWithinAbs(s.Randomness, 1, 1e-15) || !scalar.EqualWithinAbs(s.RunNumber, 200*0.3*0.7, 1e-12) {
		t.Errorf("Bernoullian: %+v", s)
	}
	// r1 = r2 = 0: strict alternation, R = 100, B = 2, run lengths 1, T212 = T121 = 1.
	s, _ = Terminal{0, 0}.Sequence(0.4)
	if s.RunNumber != 100 || s.Randomness != 2 || s.MeanLength1 != 1 || s.MeanLength2 != 1 || s.T212 != 1 || s.T121 != 1 {
		t.Errorf("alternating: %+v", s)
	}
}

// drift and batchSequence call the methods of the batch of m from f10, as the tests use them.
func drift(m Model, f10 float64, xs []float64) (*Drift, error) {
	b, err := NewBatch(m, f10)
	if err != nil {
		return nil, err
	}
	return b.Drift(xs)
}

func batchSequence(m Model, f10, x float64) (Sequence, error) {
	b, err := NewBatch(m, f10)
	if err != nil {
		return Sequence{}, err
	}
	return b.Sequence(x)
}

func TestBatchSequence(t *testing.T) {
	for _, tc := range []struct {
		m      Terminal
		f10, x float64
	}{
		{Terminal{0.40, 0.04}, 0.3, 0.7}, // St/AN, Polymer Handbook table
		{Terminal{1.88, 0.43}, 0.5, 0.9}, // MMA/n-BA, Polymer Handbook table
		{Terminal{1, 0.5}, 0.4, 0.5},     // Skeist ODE path
	} {
		s, err := batchSequence(tc.m, tc.f10, tc.x)
		if err != nil {
			t.Fatal(err)
		}
		// The averaged F1 is the cumulative composition from the monomer balance: two routes
		// (∫F1 dX/X against (f10 − (1 − X) f1)/X).
		d, _ := tc.m.Drift(tc.f10, []float64{tc.x})
		if math.Abs(s.F1-d.Cum[0]) > 1e-6 {
			t.Errorf("%v f10=%g X=%g: batch F1 %v, drift F̄1 %v", tc.m, tc.f10, tc.x, s.F1, d.Cum[0])
		}
		if sum := s.D11 + s.D12 + s.D22; math.Abs(sum-1) > 1e-12 {
			t.Errorf("dyads sum %v", sum)
		}
		if sum := s.T111 + s.T112 + s.T212; math.Abs(sum-1) > 1e-12 {
			t.Errorf("M1 triads sum %v", sum)
		}
		if sum := s.T222 + s.T221 + s.T121; math.Abs(sum-1) > 1e-12 {
			t.Errorf("M2 triads sum %v", sum)
		}
		// Runs per unit of M1 and M2 are equal in long chains: F̄1/n̄1 = F̄2/n̄2 = D12/2.
		if a, b := s.F1/s.MeanLength1, (1-s.F1)/s.MeanLength2; math.Abs(a-b) > 1e-9 || math.Abs(a-s.D12/2) > 1e-9 {
			t.Errorf("runs of M1 %v, of M2 %v, D12/2 %v", a, b, s.D12/2)
		}
		// Conversion → 0 gives the statistics at the feed.
		s0, _ := batchSequence(tc.m, tc.f10, 0)
		s1, _ := tc.m.Sequence(tc.f10)
		if s0 != s1 {
			t.Errorf("Batch.Sequence(X = 0) = %+v, want Sequence(f10) = %+v", s0, s1)
		}
	}
}

func TestRunLengths(t *testing.T) {
	m := Terminal{0.52, 0.46} // St/MMA, Polymer Handbook table
	s, _ := m.Sequence(0.5)
	r, err := m.RunLengths(0.5, MaxRunLength)
	if err != nil {
		t.Fatal(err)
	}
	var n1, w1, mean1, n2 float64
	for i, l := range r.Length {
		n1 += r.Number1[i]
		n2 += r.Number2[i]
		w1 += r.Weight1[i]
		mean1 += float64(l) * r.Number1[i]
	}
	// Geometric distributions: number and weight fractions sum to 1 and the number average is
	// 1/P12 (standard results for a first-order Markov chain).
	if math.Abs(n1-1) > 1e-12 || math.Abs(n2-1) > 1e-12 || math.Abs(w1-1) > 1e-12 || math.Abs(mean1-s.MeanLength1) > 1e-12 {
		t.Errorf("sums %v %v %v, mean %v want %v", n1, n2, w1, mean1, s.MeanLength1)
	}
	if _, err := m.RunLengths(0.5, 0); Field(err) != "maxLength" {
		t.Errorf("maxLength 0: error %v", err)
	}
}

// TestBatchSequenceIdealClosedForm checks the batch-averaged run number and randomness index
// against a closed form derived by hand for an ideal pair, r1 r2 = 1 (here r1 = 2, r2 = 1/2).
//
// Derivation. With r2 = 1/r1 the Mayo–Lewis equation becomes dM1/dM2 = r1 M1/M2 (Mayo & Lewis
// 1944), so M1/M10 = (M2/M20)^r1. Per mole charged, with v = M2/M20 and r1 = 2: M1 = a v²,
// M2 = b v (a = f10, b = 1 − f10), X = 1 − a v² − b v, and dX = −(2a v + b) dv. The copolymer
// formed at v has F1 = dM1/(dM1 + dM2) = 2a v/(2a v + b), and for an ideal pair P12 = F2 and
// P21 = F1 (P12 = f2/(r1 f1 + f2) = F2 when r1 r2 = 1). Integrating over the batch from v = 1
// down to v_e, with c = 2a:
//
//	I1  = ∫F1 dX  = a (1 − v_e²)
//	I2  = ∫F1² dX = [c v²/2 − b v + (b²/c) ln(c v + b)] from v_e to 1
//	I12 = ∫F1 F2 dX = I1 − I2
//
// The batch chain (Batch.Sequence's definitions) has P12 = ∫F1 P12 dX/∫F1 dX = I12/I1 and
// P21 = I12/(X − I1), so the randomness index B = P12 + P21 = I12 (1/I1 + 1/(X − I1)), and the
// run number, 100 times the averaged 12-dyad fraction D12 = 2 F1 P12 = 2 F1 F2, is
// R = 200 I12/X (Harwood & Ritchey 1964). Each instant is Bernoullian (B = 1); the drift of the
// composition makes the whole batch slightly blockier than that.
func TestBatchSequenceIdealClosedForm(t *testing.T) {
	const f10, ve = 0.5, 0.5
	a, b := f10, 1-f10
	c := 2 * a
	x := 1 - a*ve*ve - b*ve // 0.625
	prim := func(v float64) float64 { return c*v*v/2 - b*v + b*b/c*math.Log(c*v+b) }
	i1 := a * (1 - ve*ve)
	i12 := i1 - (prim(1) - prim(ve))
	wantB := i12 * (1/i1 + 1/(x-i1))
	wantR := 200 * i12 / x

	bt, err := NewBatch(Terminal{R1: 2, R2: 0.5}, f10)
	if err != nil {
		t.Fatal(err)
	}
	s, err := bt.Sequence(x)
	if err != nil {
		t.Fatal(err)
	}
	// The midpoint rule over batchSteps slices is good to about 1e-8 here; 1e-6 leaves room
	// (common practice, no source).
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"F1 = I1/X", s.F1, i1 / x},
		{"Randomness", s.Randomness, wantB},
		{"RunNumber", s.RunNumber, wantR},
	} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 1e-6, 1e-6) {
			t.Errorf("NewBatch(Terminal{2, 0.5}, %v).Sequence(%v) %s = %.10g, closed form %.10g", f10, x, c.name, c.got, c.want)
		}
	}
	if !(wantB < 1-5e-3) {
		t.Fatalf("closed-form B = %v: the case no longer tells the batch average from an instant's B = 1", wantB)
	}
}
