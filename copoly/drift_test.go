package copoly

import (
	"encoding/csv"
	"errors"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestDriftAgainstScipy compares the drift with testdata/skeist_scipy.csv: the Skeist equation
// integrated by scipy.integrate.solve_ivp (DOP853, rtol 1e-12), made by
// testdata/skeist_scipy.py (tool versions in the file's first line and in testdata/README.md).
func TestDriftAgainstScipy(t *testing.T) {
	const path = "../testdata/skeist_scipy.csv"
	fh, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	r := csv.NewReader(fh)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) < 100 {
		t.Fatalf("%s: %d rows, want the full table", path, len(rows))
	}
	const tol = 1e-9 // the fixture is accurate to about 1e-12 (its self-check); ours to ~1e-13
	for i, row := range rows[1:] {
		line := i + 3 // comment and header lines come first
		v := make([]float64, 7)
		for k := range v {
			if v[k], err = strconv.ParseFloat(row[k+1], 64); err != nil {
				t.Fatalf("%s:%d: %v", path, line, err)
			}
		}
		m, f10, x := Terminal{v[0], v[1]}, v[2], v[3]
		d, err := m.Drift(f10, []float64{x})
		if err != nil {
			t.Fatalf("%s:%d: Drift: %v", path, line, err)
		}
		for _, c := range []struct {
			name      string
			got, want float64
		}{{"f1", d.Feed[0], v[4]}, {"F1", d.Inst[0], v[5]}, {"F1cum", d.Cum[0], v[6]}} {
			if math.Abs(c.got-c.want) > tol {
				t.Errorf("%s:%d: %s %v f10=%g X=%g: %s = %.15g, scipy %.15g (method %s)", path, line, row[0], m, f10, x, c.name, c.got, c.want, d.Method)
			}
		}
	}
}

// TestMeyerLowryAgreesWithSkeist checks the closed form against the numerically integrated
// Skeist equation on the same batches, wherever both apply (an identity: Meyer & Lowry 1965
// integrated Skeist's equation analytically).
func TestMeyerLowryAgreesWithSkeist(t *testing.T) {
	xs := []float64{0, 0.01, 0.05, 0.1, 0.2, 0.3, 0.5, 0.7, 0.8, 0.9, 0.95, 0.99, 0.999}
	for _, m := range testPairs {
		for _, f10 := range []float64{0.05, 0.2, 0.5, 0.62, 0.8, 0.97} {
			b, err := newBatch(m, f10)
			if err != nil {
				t.Fatal(err)
			}
			if b.still || !b.closed {
				continue
			}
			n := 0
			for n < len(xs) && xs[n] < b.xmax {
				n++
			}
			ml, ode := make([]float64, n), make([]float64, n)
			b.feedAt(ml, xs[:n])
			b.odeFeed(ode, xs[:n])
			for i := range n {
				if math.Abs(ml[i]-ode[i]) > 1e-9 {
					t.Errorf("%v f10=%g X=%g: Meyer–Lowry f1 = %.15g, Skeist ODE %.15g", m, f10, xs[i], ml[i], ode[i])
				}
			}
			// And the explicit X(f1) returns the conversion.
			for i := 1; i < n; i++ {
				if ml[i] == b.end || math.Abs(ml[i]-b.end) < 1e-12 {
					continue
				}
				if got := m.MeyerLowry(f10, ml[i]); !scalar.EqualWithinAbsOrRel(got, xs[i], 1e-9, 1e-9) {
					t.Errorf("%v.MeyerLowry(%g, %g) = %v, want X = %v", m, f10, ml[i], got, xs[i])
				}
			}
		}
	}
}

func TestDriftProperties(t *testing.T) {
	xs := make([]float64, 101)
	for i := range xs {
		xs[i] = float64(i) / 100
	}
	for _, m := range testPairs {
		for _, f10 := range []float64{0, 0.1, 0.35, 0.5, 0.9, 1} {
			b, _ := newBatch(m, f10)
			n := len(xs)
			for n > 0 && xs[n-1] > b.xmax {
				n--
			}
			d, err := m.Drift(f10, xs[:n])
			if err != nil {
				t.Fatalf("%v.Drift(%g): %v", m, f10, err)
			}
			for i := range n {
				for _, v := range []float64{d.Feed[i], d.Inst[i], d.Cum[i]} {
					if !(v >= 0 && v <= 1) {
						t.Fatalf("%v f10=%g X=%g: fraction %v outside [0, 1]", m, f10, xs[i], v)
					}
				}
				// Monomer balance: X·F̄1 + (1 − X)·f1 = f10 (the definition of F̄1, checked on
				// the returned values, including the X = 1 limit).
				if got := xs[i]*d.Cum[i] + (1-xs[i])*d.Feed[i]; math.Abs(got-f10) > 1e-12 && xs[i] > 1e-7 {
					t.Errorf("%v f10=%g X=%g: mass balance X·F̄1 + (1−X)·f1 = %v, want %v", m, f10, xs[i], got, f10)
				}
				// The feed moves away from f10 monotonically (towards its end point).
				if i > 0 && (d.Feed[i]-d.Feed[i-1])*(b.end-f10) < -1e-15 {
					t.Errorf("%v f10=%g: f1 moves back at X=%g: %v after %v", m, f10, xs[i], d.Feed[i], d.Feed[i-1])
				}
			}
		}
	}
}

func TestDriftNoDrift(t *testing.T) {
	az, _ := Terminal{0.40, 0.04}.Azeotrope()
	for _, tc := range []struct {
		name string
		m    Terminal
		f10  float64
	}{
		{"azeotrope St/AN", Terminal{0.40, 0.04}, az}, // Polymer Handbook table ratios
		{"r1 = r2 = 1", Terminal{1, 1}, 0.3},
		{"homopolymer f10 = 1", Terminal{0.4, 0.04}, 1},
	} {
		d, err := tc.m.Drift(tc.f10, []float64{0.2, 0.9})
		if err != nil {
			t.Fatal(err)
		}
		if d.Method != MethodNoDrift && tc.name != "azeotrope St/AN" {
			t.Errorf("%s: method %s, want %s", tc.name, d.Method, MethodNoDrift)
		}
		for i := range d.Feed {
			if math.Abs(d.Feed[i]-tc.f10) > 1e-12 || math.Abs(d.Cum[i]-tc.m.Instantaneous(tc.f10)) > 1e-12 {
				t.Errorf("%s: X=%g f1 = %v F̄1 = %v, want no drift from %v", tc.name, d.Conversion[i], d.Feed[i], d.Cum[i], tc.f10)
			}
		}
	}
}

func TestDriftExhaustion(t *testing.T) {
	// St/AN 0.40/0.04 (Polymer Handbook table) from f10 = 0.3 < f_az: styrene is used up first.
	// Past exhaustion acrylonitrile homopolymerizes, so F̄1 = f10/X exactly (monomer balance
	// with f1 = 0).
	m := Terminal{0.40, 0.04}
	d, err := m.Drift(0.3, []float64{0.5, 0.8, 0.9, 0.99, 1})
	if err != nil {
		t.Fatal(err)
	}
	if d.Exhausted == nil || d.Exhausted.Monomer != 1 || d.Exhausted.Conversion > 0.8 || d.Exhausted.Conversion < 0.5 {
		t.Fatalf("Exhausted = %+v, want monomer 1 between X = 0.5 and 0.8", d.Exhausted)
	}
	for i := 2; i < len(d.Conversion); i++ { // X = 0.9 on: f1 is below 1e-12
		x := d.Conversion[i]
		if want := 0.3 / x; math.Abs(d.Cum[i]-want) > 1e-12 || d.Feed[i] > 1e-12 {
			t.Errorf("X=%g: f1 = %v, F̄1 = %v, want f1 ≈ 0 and F̄1 = f10/X = %v", x, d.Feed[i], d.Cum[i], want)
		}
	}
	if d.Feed[4] != 0 || d.Cum[4] != 0.3 {
		t.Errorf("X = 1: f1 = %v F̄1 = %v, want 0 and f10", d.Feed[4], d.Cum[4])
	}
}

func TestDriftStopsWhenLeftoverCannotHomopolymerize(t *testing.T) {
	// r1 = r2 = 0: strict alternation consumes equal amounts, so from f10 = 0.3 the batch stops
	// when M1 is gone, at X = 2·0.3 = 0.6 (monomer balance, by hand).
	m := Terminal{0, 0}
	b, _ := newBatch(m, 0.3)
	if math.Abs(b.xmax-0.6) > 1e-12 {
		t.Errorf("largest conversion = %v, want 0.6", b.xmax)
	}
	_, err := m.Drift(0.3, []float64{0.5, 0.7})
	if !errors.Is(err, ErrOutOfRange) || Field(err) != "conversion[1]" {
		t.Errorf("Drift past the stop: error %v, want ErrOutOfRange on conversion[1]", err)
	}
	d, err := m.Drift(0.3, []float64{0.3, 0.6})
	if err != nil || math.Abs(d.Cum[0]-0.5) > 1e-12 || math.Abs(d.Cum[1]-0.5) > 1e-9 {
		t.Errorf("alternating batch: %+v, %v; want F̄1 = 0.5 throughout", d, err)
	}
}

func TestDriftValidates(t *testing.T) {
	for _, tc := range []struct {
		name  string
		m     Terminal
		f10   float64
		xs    []float64
		field string
	}{
		{"bad r1", Terminal{-1, 1}, 0.5, []float64{0.1}, "r1"},
		{"bad f10", Terminal{1, 2}, 1.5, []float64{0.1}, "f10"},
		{"NaN f10", Terminal{1, 2}, math.NaN(), []float64{0.1}, "f10"},
		{"X above 1", Terminal{0.5, 2}, 0.5, []float64{0.1, 1.01}, "conversion[1]"},
		{"X negative", Terminal{0.5, 2}, 0.5, []float64{-0.1}, "conversion[0]"},
		{"X decreasing", Terminal{0.5, 2}, 0.5, []float64{0.5, 0.4}, "conversion[1]"},
		{"too many", Terminal{0.5, 2}, 0.5, make([]float64, MaxPoints+1), "conversion"},
	} {
		if _, err := tc.m.Drift(tc.f10, tc.xs); Field(err) != tc.field {
			t.Errorf("%s: Drift error %v (field %q), want field %q", tc.name, err, Field(err), tc.field)
		}
	}
}
