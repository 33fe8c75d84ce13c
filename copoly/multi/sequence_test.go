package multi

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// TestSequenceBinary checks N = 2 against copoly.Terminal.Sequence (B. D. Coleman, T. G. Fox,
// J. Polym. Sci. A 1963, 1, 3183): transition probabilities, dyads (the binary D12 counts 12
// and 21 together), mean run lengths and the Harwood–Ritchey run number, to 1e-12.
func TestSequenceBinary(t *testing.T) {
	for _, c := range []struct{ r1, r2, f1 float64 }{{0.40, 0.04, 0.3}, {1.88, 0.43, 0.6}, {0.52, 0.46, 0.1}, {1, 1, 0.5}} {
		want, err := copoly.Terminal{R1: c.r1, R2: c.r2}.Sequence(c.f1)
		if err != nil {
			t.Fatal(err)
		}
		q, err := mustNew(t, [][]float64{{1, c.r1}, {c.r2, 1}}, nil).Sequence([]float64{c.f1, 1 - c.f1})
		if err != nil {
			t.Fatal(err)
		}
		for _, v := range []struct {
			what      string
			got, want float64
		}{
			{"P11", q.P[0][0], want.P11}, {"P12", q.P[0][1], want.P12}, {"P21", q.P[1][0], want.P21}, {"P22", q.P[1][1], want.P22},
			{"D11", q.Dyads[0][0], want.D11}, {"D12+D21", q.Dyads[0][1] + q.Dyads[1][0], want.D12}, {"D22", q.Dyads[1][1], want.D22},
			{"n̄1", q.MeanRun[0], want.MeanLength1}, {"n̄2", q.MeanRun[1], want.MeanLength2}, {"runs", q.Runs, want.RunNumber},
		} {
			if !scalar.EqualWithinAbsOrRel(v.got, v.want, 1e-12, 1e-12) {
				t.Errorf("r = %g, %g, f1 = %g: %s = %.15g, binary %.15g", c.r1, c.r2, c.f1, v.what, v.got, v.want)
			}
		}
	}
}

// TestSequenceIdentities checks on random models: dyads sum to 1; each row of D sums to F_i
// and each column too (every unit is the first unit of one dyad and the second of one); and
// for all ratios 1 (a Bernoullian chain) n̄_i = 1/(1 − f_i), isolated fraction (1 − f_i)², and
// 100 (1 − Σ f_i²) runs per 100 units (worked by hand: P_ij = f_j).
func TestSequenceIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	for range 300 {
		n := 2 + rng.IntN(5)
		f := randomFeed(rng, n)
		q, err := mustNew(t, randomRatios(rng, n), nil).Sequence(f)
		if err != nil {
			t.Fatal(err)
		}
		var total float64
		for i := range n {
			var row, col float64
			for j := range n {
				row += q.Dyads[i][j]
				col += q.Dyads[j][i]
			}
			total += row
			if math.Abs(row-q.F[i]) > 1e-14 || math.Abs(col-q.F[i]) > 1e-13 {
				t.Fatalf("f = %v: dyads of monomer %d sum to %g (row) and %g (column), F = %g", f, i, row, col, q.F[i])
			}
		}
		if math.Abs(total-1) > 1e-14 {
			t.Fatalf("dyads sum to %g", total)
		}
		ones := make([][]float64, n)
		for i := range ones {
			ones[i] = make([]float64, n)
			for j := range ones[i] {
				ones[i][j] = 1
			}
		}
		b, _ := mustNew(t, ones, nil).Sequence(f)
		var sq float64
		for i := range n {
			sq += f[i] * f[i]
			if !scalar.EqualWithinAbsOrRel(b.MeanRun[i], 1/(1-f[i]), 1e-13, 1e-13) ||
				!scalar.EqualWithinAbsOrRel(b.Isolated[i], (1-f[i])*(1-f[i]), 1e-13, 1e-13) {
				t.Fatalf("Bernoullian f = %v: n̄ = %v, isolated = %v", f, b.MeanRun, b.Isolated)
			}
		}
		if !scalar.EqualWithinAbsOrRel(b.Runs, 100*(1-sq), 1e-12, 1e-12) {
			t.Fatalf("Bernoullian f = %v: %g runs per 100 units, want %g", f, b.Runs, 100*(1-sq))
		}
	}
}

// TestSequenceAbsent checks a monomer absent from the feed: no dyads, run length 0; and a feed
// where no polymer forms: NaN.
func TestSequenceAbsent(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0.5, 0.4}, {0.5, 1, 1.2}, {0.1, 0.2, 1}}, nil)
	q, err := m.Sequence([]float64{0.5, 0, 0.5})
	if err != nil {
		t.Fatal(err)
	}
	if q.MeanRun[1] != 0 || q.Isolated[1] != 0 || q.Dyads[0][1] != 0 || q.Dyads[1][0] != 0 {
		t.Errorf("M2 absent: %+v", q)
	}
	m3 := mustNew(t, [][]float64{{1, 0.5, 0.3}, {2, 1, 0.4}, {0, 0, 1}}, [][]float64{nil, nil, {1, 2, 0}})
	q, _ = m3.Sequence([]float64{0, 0, 1})
	if !math.IsNaN(q.Runs) || !math.IsNaN(q.F[2]) {
		t.Errorf("no polymer: %+v, want NaN", q)
	}
}
