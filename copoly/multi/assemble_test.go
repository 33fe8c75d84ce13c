package multi

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// TestAssembleLiterature checks a matrix made wholly of built-in pairs (copoly.Pairs:
// St/MMA 0.52/0.46, St/AN 0.40/0.04, MMA/AN 1.322/0.138), the monomers listed in an order that
// reverses two of the pairs, and names given in another case.
func TestAssembleLiterature(t *testing.T) {
	mx, err := Assemble([]string{"Methyl methacrylate", "acrylonitrile", " styrene "}, nil)
	if err != nil {
		t.Fatal(err)
	}
	want := [][]float64{{1, 1.322, 0.46}, {0.138, 1, 0.04}, {0.52, 0.40, 1}}
	for i := range 3 {
		for j := range 3 {
			if mx.R[i][j] != want[i][j] {
				t.Errorf("r[%d][%d] = %v, want %v (%s)", i, j, mx.R[i][j], want[i][j], mx.Origin[i][j].Source)
			}
			kind := OriginLiterature
			if i == j {
				kind = OriginDiagonal
			}
			if mx.Origin[i][j].Kind != kind {
				t.Errorf("origin of r[%d][%d] = %+v, want %s", i, j, mx.Origin[i][j], kind)
			}
		}
	}
	if !strings.Contains(mx.Origin[0][2].Source, "listed as styrene/methyl methacrylate") {
		t.Errorf("a reversed pair's source does not say so: %q", mx.Origin[0][2].Source)
	}
	if mx.Err() != nil || len(mx.Missing) != 0 {
		t.Errorf("Err = %v, Missing = %v", mx.Err(), mx.Missing)
	}
	if _, err := mx.Model(); err != nil {
		t.Error(err)
	}
}

// TestAssemblePrecedence checks the order user > fit > literature > screening, and the Q–e
// estimate written out from the Alfrey–Price scheme (T. Alfrey, C. C. Price, J. Polym. Sci.
// 1947, 2, 101): r12 = (Q1/Q2) exp(−e1(e1 − e2)), r21 = (Q2/Q1) exp(−e2(e2 − e1)), with the
// built-in Q–e values of methyl methacrylate and 2-hydroxyethyl methacrylate (no built-in
// literature pair).
func TestAssemblePrecedence(t *testing.T) {
	names := []string{"styrene", "methyl methacrylate", "2-hydroxyethyl methacrylate"}
	mx, err := Assemble(names, []Pair{
		{Monomer1: "methyl methacrylate", Monomer2: "styrene", R1: 0.5, R2: 0.55, Kind: OriginFit, Source: "fit of runs 1–12"},
		{Monomer1: "styrene", Monomer2: "methyl methacrylate", R1: 0.49, R2: 0.44, Kind: OriginUser},
		{Monomer1: "styrene", Monomer2: "2-hydroxyethyl methacrylate", R1: 0.4, R2: 0.6, Kind: OriginFit},
	})
	if err != nil {
		t.Fatal(err)
	}
	if mx.R[0][1] != 0.49 || mx.R[1][0] != 0.44 || mx.Origin[0][1].Kind != OriginUser {
		t.Errorf("St/MMA: %v/%v from %+v, want the user's 0.49/0.44", mx.R[0][1], mx.R[1][0], mx.Origin[0][1])
	}
	if mx.R[0][2] != 0.4 || mx.R[2][0] != 0.6 || mx.Origin[2][0].Kind != OriginFit {
		t.Errorf("St/HEMA: %v/%v from %+v, want the fit's 0.4/0.6", mx.R[0][2], mx.R[2][0], mx.Origin[2][0])
	}
	q1, _ := copoly.QEOf("methyl methacrylate")
	q2, _ := copoly.QEOf("2-hydroxyethyl methacrylate")
	r12 := q1.Q / q2.Q * math.Exp(-q1.E*(q1.E-q2.E))
	r21 := q2.Q / q1.Q * math.Exp(-q2.E*(q2.E-q1.E))
	if !scalar.EqualWithinAbsOrRel(mx.R[1][2], r12, 1e-15, 1e-15) || !scalar.EqualWithinAbsOrRel(mx.R[2][1], r21, 1e-15, 1e-15) || mx.Origin[1][2].Kind != OriginScreening {
		t.Errorf("MMA/HEMA: %v/%v from %+v, want the Q–e estimate %v/%v", mx.R[1][2], mx.R[2][1], mx.Origin[1][2], r12, r21)
	}
	if !strings.Contains(mx.Origin[1][2].Source, "screening") {
		t.Errorf("a Q–e cell's source does not say it is a screening value: %q", mx.Origin[1][2].Source)
	}
}

// TestAssembleMissing checks a pair with no data: listed, NaN, and Err naming its cell.
func TestAssembleMissing(t *testing.T) {
	mx, err := Assemble([]string{"styrene", "glycidyl methacrylate", "methyl methacrylate"}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(mx.Missing) != 2 || !math.IsNaN(mx.R[0][1]) || mx.Origin[1][2].Kind != OriginMissing {
		t.Fatalf("Missing = %v, r = %v", mx.Missing, mx.R)
	}
	err = mx.Err()
	if copoly.Field(err) != "r[0][1]" || !errors.Is(err, copoly.ErrOutOfRange) || !strings.Contains(err.Error(), "glycidyl methacrylate") {
		t.Errorf("Err() = %v, want an error naming r[0][1] and the monomer", err)
	}
	if _, err := mx.Model(); err == nil {
		t.Error("Model() of a matrix with a missing pair: no error")
	}
	mx, err = Assemble([]string{"styrene", "glycidyl methacrylate"}, []Pair{{Monomer1: "Glycidyl methacrylate", Monomer2: "styrene", R1: 0.56, R2: 0.44, Kind: OriginUser}})
	if err != nil || mx.Err() != nil || mx.R[0][1] != 0.44 {
		t.Errorf("with the pair typed: %v, %v, r = %v", err, mx.Err(), mx.R)
	}
}

// TestAssembleErrors checks the validation of the monomers and pairs.
func TestAssembleErrors(t *testing.T) {
	two := []string{"styrene", "methyl methacrylate"}
	tests := []struct {
		name     string
		monomers []string
		pairs    []Pair
		field    string
		err      error
	}{
		{"one monomer", []string{"styrene"}, nil, "monomers", copoly.ErrOutOfRange},
		{"seven monomers", []string{"a", "b", "c", "d", "e", "f", "g"}, nil, "monomers", copoly.ErrTooMany},
		{"empty name", []string{"styrene", " "}, nil, "monomers[1]", copoly.ErrOutOfRange},
		{"twice", []string{"styrene", "Styrene"}, nil, "monomers[1]", copoly.ErrOutOfRange},
		{"unknown monomer", two, []Pair{{Monomer1: "styrene", Monomer2: "butadiene", R1: 1, R2: 1, Kind: OriginUser}}, "pairs[0].monomer2", copoly.ErrOutOfRange},
		{"same monomer", two, []Pair{{Monomer1: "styrene", Monomer2: "styrene", R1: 1, R2: 1, Kind: OriginUser}}, "pairs[0].monomer2", copoly.ErrOutOfRange},
		{"bad ratio", two, []Pair{{Monomer1: "styrene", Monomer2: "methyl methacrylate", R1: -1, R2: 1, Kind: OriginUser}}, "pairs[0].r1", copoly.ErrOutOfRange},
		{"NaN ratio", two, []Pair{{Monomer1: "styrene", Monomer2: "methyl methacrylate", R1: 1, R2: math.NaN(), Kind: OriginUser}}, "pairs[0].r2", copoly.ErrNotFinite},
		{"bad kind", two, []Pair{{Monomer1: "styrene", Monomer2: "methyl methacrylate", R1: 1, R2: 1, Kind: "literature"}}, "pairs[0].kind", copoly.ErrOutOfRange},
		{"given twice, kind left empty", two, []Pair{
			{Monomer1: "styrene", Monomer2: "methyl methacrylate", R1: 1, R2: 1},
			{Monomer1: "methyl methacrylate", Monomer2: "styrene", R1: 1, R2: 1, Kind: OriginUser},
		}, "pairs[1]", copoly.ErrOutOfRange},
		{"given twice", two, []Pair{
			{Monomer1: "styrene", Monomer2: "methyl methacrylate", R1: 1, R2: 1, Kind: OriginUser},
			{Monomer1: "methyl methacrylate", Monomer2: "styrene", R1: 1, R2: 1, Kind: OriginUser},
		}, "pairs[1]", copoly.ErrOutOfRange},
		{"too many pairs", two, make([]Pair, MaxPairs+1), "pairs", copoly.ErrTooMany},
	}
	for _, tt := range tests {
		_, err := Assemble(tt.monomers, tt.pairs)
		if copoly.Field(err) != tt.field || !errors.Is(err, tt.err) {
			t.Errorf("%s: %v, want field %q wrapping %v", tt.name, err, tt.field, tt.err)
		}
	}
}
