package copoly

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// penultimateSets are explicit penultimate parameter sets for the identities (invented for the
// tests, spanning weak and strong penultimate effects).
var penultimateSets = []Penultimate{{0.3, 0.6, 0.05, 0.1}, {1.2, 0.5, 0.4, 0.9}, {0.8, 0.8, 0.2, 0.2}, {5, 2, 0.1, 0.03}}

// The Merz–Alfrey–Goldfinger equation in ratio form (Merz, Alfrey & Goldfinger 1946):
// d[M1]/d[M2] = [1 + r21 x (1 + r11 x)/(1 + r21 x)] / [1 + r12 (r22 + x)/(x (r12 + x))].
func magF1(m Penultimate, f1 float64) float64 {
	x := f1 / (1 - f1)
	y := (1 + m.R21*x*(1+m.R11*x)/(1+m.R21*x)) / (1 + m.R12*(m.R22+x)/(x*(m.R12+x)))
	return y / (1 + y)
}

// stationary returns, by power iteration, the stationary distribution of the explicit
// second-order chain over the states 11, 12, 21, 22 (the last two units), and the triads
// normalised over all triads — an independent route to Penultimate.Sequence.
func stationary(m Penultimate, f1 float64) (pi [4]float64, t [6]float64) {
	p111, p211, p222, p122 := m.transitions(f1)
	// next[state][k] = probability of adding k (0 for M1, 1 for M2).
	next := [4][2]float64{{p111, 1 - p111}, {1 - p122, p122}, {p211, 1 - p211}, {1 - p222, p222}}
	to := [4][2]int{{0, 1}, {2, 3}, {0, 1}, {2, 3}} // state ij adding k goes to state jk
	pi = [4]float64{0.25, 0.25, 0.25, 0.25}
	for range 20000 {
		var nw [4]float64
		for s := range 4 {
			for k := range 2 {
				nw[to[s][k]] += pi[s] * next[s][k]
			}
		}
		pi = nw
	}
	// Triads centred on the middle unit: state ij then k gives triad ijk.
	t[0] = pi[0] * next[0][0]                  // 111
	t[1] = pi[0]*next[0][1] + pi[2]*next[2][0] // 112 + 211
	t[2] = pi[2] * next[2][1]                  // 212
	t[3] = pi[3] * next[3][1]                  // 222
	t[4] = pi[3]*next[3][0] + pi[1]*next[1][1] // 221 + 122
	t[5] = pi[1] * next[1][0]                  // 121
	return pi, t
}

func TestPenultimateComposition(t *testing.T) {
	for _, m := range penultimateSets {
		for _, f1 := range []float64{0.05, 0.3, 0.5, 0.7, 0.95} {
			got := m.Instantaneous(f1)
			if want := magF1(m, f1); !scalar.EqualWithinAbsOrRel(got, want, 1e-13, 1e-13) {
				t.Errorf("%v f1=%g: F1 %v, MAG %v", m, f1, got, want)
			}
			pi, _ := stationary(m, f1)
			if want := pi[0] + pi[2]; !scalar.EqualWithinAbsOrRel(got, want, 1e-10, 1e-10) {
				t.Errorf("%v f1=%g: F1 %v, Markov chain %v", m, f1, got, want)
			}
		}
	}
}

func TestPenultimateSequenceAgainstMarkovChain(t *testing.T) {
	for _, m := range penultimateSets {
		for _, f1 := range []float64{0.2, 0.5, 0.8} {
			s, err := m.Sequence(f1)
			if err != nil {
				t.Fatal(err)
			}
			pi, tr := stationary(m, f1)
			F1, F2 := pi[0]+pi[2], pi[1]+pi[3]
			for _, c := range []struct {
				name      string
				got, want float64
			}{
				{"D11", s.D11, pi[0]}, {"D12", s.D12, pi[1] + pi[2]}, {"D22", s.D22, pi[3]},
				{"T111", s.T111, tr[0] / F1}, {"T112", s.T112, tr[1] / F1}, {"T212", s.T212, tr[2] / F1},
				{"T222", s.T222, tr[3] / F2}, {"T221", s.T221, tr[4] / F2}, {"T121", s.T121, tr[5] / F2},
				{"n̄1", s.MeanLength1, F1 / pi[2]}, {"n̄2", s.MeanLength2, F2 / pi[1]},
			} {
				if !scalar.EqualWithinAbsOrRel(c.got, c.want, 1e-9, 1e-9) {
					t.Errorf("%v f1=%g: %s = %v, Markov chain %v", m, f1, c.name, c.got, c.want)
				}
			}
		}
	}
}

// With r11 = r21 and r22 = r12 the penultimate model is the terminal model (Merz, Alfrey &
// Goldfinger 1946): composition, sequences and drift must agree.
func TestPenultimateReducesToTerminal(t *testing.T) {
	for _, tm := range []Terminal{{0.40, 0.04}, {1.88, 0.43}, {0.52, 0.46}} {
		pm := Penultimate{tm.R1, tm.R1, tm.R2, tm.R2}
		for _, f1 := range []float64{0, 0.1, 0.5, 0.9, 1} {
			if a, b := pm.Instantaneous(f1), tm.Instantaneous(f1); math.Abs(a-b) > 1e-15 {
				t.Errorf("%v f1=%g: %v vs %v", tm, f1, a, b)
			}
		}
		for _, f1 := range []float64{0.1, 0.5, 0.9} {
			a, _ := pm.Sequence(f1)
			b, _ := tm.Sequence(f1)
			for _, c := range [][2]float64{{a.F1, b.F1}, {a.D12, b.D12}, {a.T111, b.T111}, {a.T112, b.T112}, {a.T221, b.T221}, {a.MeanLength1, b.MeanLength1}, {a.RunNumber, b.RunNumber}, {a.P11, b.P11}} {
				if !scalar.EqualWithinAbsOrRel(c[0], c[1], 1e-12, 1e-12) {
					t.Errorf("%v f1=%g: penultimate %+v\nterminal %+v", tm, f1, a, b)
					break
				}
			}
		}
		xs := []float64{0.1, 0.5, 0.9}
		da, err := drift(pm, 0.3, xs)
		if err != nil {
			t.Fatal(err)
		}
		db, _ := tm.Drift(0.3, xs)
		for i := range xs {
			if math.Abs(da.Feed[i]-db.Feed[i]) > 1e-9 || math.Abs(da.Cum[i]-db.Cum[i]) > 1e-9 {
				t.Errorf("%v X=%g: penultimate drift f1 %v F̄1 %v, terminal %v %v", tm, xs[i], da.Feed[i], da.Cum[i], db.Feed[i], db.Cum[i])
			}
		}
	}
}

func TestImplicitMeanPropagation(t *testing.T) {
	// With s1 = s2 = 1 the implicit model's k̄p is the terminal mean
	// (r1 f1² + 2 f1 f2 + r2 f2²)/(r1 f1/k11 + r2 f2/k22) (Fukuda, Ma & Inagaki 1985).
	m := Implicit{0.523, 0.460, 1, 1} // St/MMA at 40 °C, Fukuda et al. 1985 (from memory)
	f1 := 0.4
	got, err := m.MeanPropagation(f1, 200, 500)
	if err != nil {
		t.Fatal(err)
	}
	f2 := 1 - f1
	want := (0.523*f1*f1 + 2*f1*f2 + 0.460*f2*f2) / (0.523*f1/200 + 0.460*f2/500)
	if !scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-12) {
		t.Errorf("k̄p = %v, terminal %v", got, want)
	}
	// Against the explicit radical balance: k̄p = 1/Σ π(ij)/R(ij), π the per-addition
	// stationary state of the chain and R(ij) = k_ij1 f1 + k_ij2 f2 the rate of radical ij.
	m = Implicit{0.523, 0.460, 0.30, 0.53} // s values of the same study (from memory)
	got, _ = m.MeanPropagation(f1, 200, 500)
	k111, k222 := 200.0, 500.0
	k112, k211 := k111/m.R1, m.S1*k111
	k212, k221 := k211/m.R1, k222/m.R2
	k122 := m.S2 * k222
	k121 := k122 / m.R2
	rate := [4]float64{k111*f1 + k112*f2, k121*f1 + k122*f2, k211*f1 + k212*f2, k221*f1 + k222*f2}
	pi, _ := stationary(m.Penultimate(), f1)
	var inv float64
	for i := range 4 {
		inv += pi[i] / rate[i]
	}
	if want := 1 / inv; !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-9) {
		t.Errorf("k̄p = %v, radical balance %v", got, want)
	}
	if _, err := (Implicit{1, 1, 0, 1}).MeanPropagation(0.5, 1, 1); Field(err) != "s1" {
		t.Errorf("s1 = 0: %v", err)
	}
}

// The batch routines for any model reduce to the terminal ones for a penultimate model with
// r11 = r21 and r22 = r12 (the terminal model itself).
func TestBatchRoutinesOfAnyModel(t *testing.T) {
	tm := Terminal{0.40, 0.04}
	pm := Penultimate{0.40, 0.40, 0.04, 0.04}
	a, _ := conversionLimit(tm, 0.3, 0.02)
	b, err := conversionLimit(pm, 0.3, 0.02)
	if err != nil || math.Abs(a-b) > 1e-8 {
		t.Errorf("limit %v, %v (%v)", a, b, err)
	}
	h1, _ := distribution(tm, 0.3, 0.6, 20, 0, 0)
	h2, err := distribution(pm, 0.3, 0.6, 20, 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	for i := range h1.Weights {
		if math.Abs(h1.Weights[i]-h2.Weights[i]) > 1e-6 {
			t.Fatalf("distribution bin %d: %v vs %v", i, h1.Weights[i], h2.Weights[i])
		}
	}
	x1, _ := molarConversion(tm, 0.4, 0.3, 104.152, 53.064)
	x2, err := molarConversion(pm, 0.4, 0.3, 104.152, 53.064)
	if err != nil || math.Abs(x1-x2) > 1e-9 {
		t.Errorf("molar conversion %v, %v (%v)", x1, x2, err)
	}
	s1, _ := batchSequence(tm, 0.3, 0.6)
	s2, err := batchSequence(pm, 0.3, 0.6)
	if err != nil || math.Abs(s1.T112-s2.T112) > 1e-9 || math.Abs(s1.MeanLength1-s2.MeanLength1) > 1e-6 || math.Abs(s1.F1-s2.F1) > 1e-9 {
		t.Errorf("batch sequence %+v,\n%+v (%v)", s1, s2, err)
	}
}
