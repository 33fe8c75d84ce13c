package copoly

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestQE(t *testing.T) {
	st, _ := QEOf("styrene")
	mma, _ := QEOf("methyl methacrylate")
	r1, r2, err := RatiosFromQE(st, mma)
	if err != nil {
		t.Fatal(err)
	}
	// Alfrey–Price identity r1·r2 = exp(−(e1 − e2)²) (IUPAC Gold Book, Q-e scheme).
	if !scalar.EqualWithinAbsOrRel(r1*r2, math.Exp(-math.Pow(st.E-mma.E, 2)), 1e-14, 1e-14) {
		t.Errorf("r1·r2 = %v", r1*r2)
	}
	// By hand: r1 = (1/0.78)·exp(0.8·(−1.2)) = 0.4906, r2 = 0.78·exp(−0.4·1.2) = 0.4826 with the
	// Q–e values of the built-in list (from memory); the measured St/MMA pair is about 0.52/0.46
	// (Polymer Handbook table), which the scheme roughly matches.
	if math.Abs(r1-0.4906) > 1e-3 || math.Abs(r2-0.4826) > 1e-3 {
		t.Errorf("St/MMA from Q–e = (%v, %v)", r1, r2)
	}
	// A monomer with itself gives r1 = r2 = 1.
	if a, b, _ := RatiosFromQE(mma, mma); a != 1 || b != 1 {
		t.Errorf("self pair (%v, %v)", a, b)
	}
	// Round trip through the inverse with the acceptor sign.
	q, err := QEFromRatios(st, r1, r2, true)
	if err != nil || !scalar.EqualWithinAbsOrRel(q.Q, mma.Q, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(q.E, mma.E, 1e-12, 1e-12) {
		t.Errorf("inverse = %+v, %v; want %+v", q, err, mma)
	}
	if _, err := QEFromRatios(st, 2, 1, true); err == nil {
		t.Error("r1·r2 > 1: no error")
	}
	if _, _, err := RatiosFromQE(QE{Q: 0, E: 1}, st); Field(err) != "monomer1.Q" {
		t.Errorf("Q = 0: %v", err)
	}
	// Monomers without built-in Q–e values (qe.go says why).
	without := map[string]bool{"2-ethylhexyl acrylate": true, "n-butyl methacrylate": true,
		"2-hydroxyethyl acrylate": true, "2-hydroxypropyl methacrylate": true}
	for _, m := range Monomers() {
		if _, ok := QEOf(m.Name); ok == without[m.Name] {
			t.Errorf("%s: has Q–e values = %v, want %v", m.Name, ok, !without[m.Name])
		}
	}
}
