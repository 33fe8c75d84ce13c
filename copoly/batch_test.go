package copoly

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
)

// conversionLimit, distribution, molarConversion and molarConversions call the methods of the
// batch of m from f10, as the tests below use them.
func conversionLimit(m Model, f10, tolerance float64) (float64, error) {
	b, err := NewBatch(m, f10)
	if err != nil {
		return 0, err
	}
	return b.ConversionLimit(tolerance)
}

func distribution(m Model, f10, x float64, bins int, mm1, mm2 float64) (Histogram, error) {
	b, err := NewBatch(m, f10)
	if err != nil {
		return Histogram{}, err
	}
	return b.Distribution(x, bins, mm1, mm2)
}

func molarConversions(m Model, w []float64, f10, mm1, mm2 float64) ([]float64, error) {
	b, err := NewBatch(m, f10)
	if err != nil {
		return nil, err
	}
	return b.MolarConversions(w, mm1, mm2)
}

func molarConversion(m Model, w, f10, mm1, mm2 float64) (float64, error) {
	x, err := molarConversions(m, []float64{w}, f10, mm1, mm2)
	if err != nil {
		return 0, err
	}
	return x[0], nil
}

func TestConversionLimit(t *testing.T) {
	for _, tc := range []struct {
		m        Terminal
		f10, tol float64
	}{
		{Terminal{0.40, 0.04}, 0.3, 0.02}, // St/AN, Polymer Handbook table
		{Terminal{0.40, 0.04}, 0.8, 0.01},
		{Terminal{1.88, 0.43}, 0.5, 0.02}, // MMA/n-BA, Polymer Handbook table
		{Terminal{26, 0.03}, 0.5, 0.05},   // MMA/VAc, Polymer Handbook table
		{Terminal{1, 0.5}, 0.5, 0.01},     // singular for Meyer–Lowry: Skeist ODE
	} {
		lim, err := conversionLimit(tc.m, tc.f10, tc.tol)
		if err != nil {
			t.Fatal(err)
		}
		// Defining property: at the limit F̄1 sits on the edge of the band, inside just below it
		// and outside just above it (F̄1 is monotone in X).
		start := tc.m.Instantaneous(tc.f10)
		d, err := tc.m.Drift(tc.f10, []float64{lim - 1e-6, lim, math.Min(1, lim+1e-6)})
		if err != nil {
			t.Fatal(err)
		}
		if lim >= 1 {
			t.Fatalf("%v f10=%g: limit %v, want a drift that leaves the band", tc.m, tc.f10, lim)
		}
		in, at, out := math.Abs(d.Cum[0]-start), math.Abs(d.Cum[1]-start), math.Abs(d.Cum[2]-start)
		if in > tc.tol || out <= tc.tol || math.Abs(at-tc.tol) > 1e-6 {
			t.Errorf("%v f10=%g tol=%g: limit X = %v, but |F̄1 − F1(f10)| = %v, %v, %v around it", tc.m, tc.f10, tc.tol, lim, in, at, out)
		}
	}
	// No drift: the band is never left.
	if lim, err := conversionLimit(Terminal{1, 1}, 0.3, 0.01); err != nil || lim != 1 {
		t.Errorf("ideal r = 1: limit %v, %v; want 1", lim, err)
	}
	// A wide band that is never left also gives 1.
	if lim, err := conversionLimit(Terminal{0.52, 0.46}, 0.5, 0.3); err != nil || lim != 1 {
		t.Errorf("wide band: limit %v, %v; want 1", lim, err)
	}
	for _, bad := range []float64{0, -0.1, 0.6, math.NaN()} {
		if _, err := conversionLimit(Terminal{1, 2}, 0.5, bad); Field(err) != "tolerance" {
			t.Errorf("ConversionLimit(tolerance %v) error %v, want field tolerance", bad, err)
		}
	}
}

func TestCompositionDistribution(t *testing.T) {
	for _, tc := range []struct {
		m        Terminal
		f10, x   float64
		mm1, mm2 float64
	}{
		{Terminal{0.40, 0.04}, 0.3, 0.95, 104.152, 53.064}, // St/AN (Polymer Handbook table), exhaustion
		{Terminal{1.88, 0.43}, 0.5, 0.6, 0, 0},
		{Terminal{1, 0.5}, 0.5, 0.8, 0, 0},
		{Terminal{0.40, 0.04}, 0.6153846153846154, 0.5, 0, 0}, // azeotrope: one narrow peak
	} {
		h, err := distribution(tc.m, tc.f10, tc.x, MaxBins, tc.mm1, tc.mm2)
		if err != nil {
			t.Fatal(err)
		}
		if len(h.Edges) != MaxBins+1 || len(h.Weights) != MaxBins {
			t.Fatalf("shape %d edges, %d weights", len(h.Edges), len(h.Weights))
		}
		if s := floats.Sum(h.Weights); math.Abs(s-1) > 1e-12 {
			t.Errorf("%v: weights sum to %v, want 1", tc.m, s)
		}
		for _, w := range h.Weights {
			if w < 0 {
				t.Fatalf("negative weight %v", w)
			}
		}
		// On the mole basis the mean composition of the distribution is the cumulative F̄1 from
		// the monomer balance (an independent route), up to half a bin width.
		if h.Basis == "moles" {
			var mean float64
			for i, w := range h.Weights {
				mean += w * 0.5 * (h.Edges[i] + h.Edges[i+1])
			}
			d, _ := tc.m.Drift(tc.f10, []float64{tc.x})
			half := 0.5 * (h.Edges[1] - h.Edges[0])
			if math.Abs(mean-d.Cum[0]) > half {
				t.Errorf("%v f10=%g X=%g: mean of distribution %v, F̄1 %v (half bin %v)", tc.m, tc.f10, tc.x, mean, d.Cum[0], half)
			}
		} else if h.Basis != "mass" {
			t.Errorf("basis %q", h.Basis)
		}
	}
	if _, err := distribution(Terminal{1, 2}, 0.5, 0.5, 0, 0, 0); Field(err) != "bins" {
		t.Errorf("bins 0: error %v, want field bins", err)
	}
	if _, err := distribution(Terminal{1, 2}, 0.5, 0.5, 10, 100, -3); Field(err) != "molarMass2" {
		t.Errorf("negative molar mass: error %v, want field molarMass2", err)
	}
}

func TestMassConversion(t *testing.T) {
	// Equal molar masses: mass and molar conversion coincide (definition).
	if got := MassConversion(0.4, 0.3, 0.25, 100, 100); !scalar.EqualWithinAbsOrRel(got, 0.4, 1e-15, 1e-15) {
		t.Errorf("MassConversion equal masses = %v, want 0.4", got)
	}
	// Hand check: f10 = 0.5, X = 0.5, f1 = 0.4 → polymer holds 0.5 − 0.2 = 0.3 mol M1 and
	// 0.5 − 0.3 = 0.2 mol M2 per mol charged; with M1 = 100, M2 = 50: 30 + 10 = 40 g of 75 g charged.
	if got := MassConversion(0.5, 0.5, 0.4, 100, 50); !scalar.EqualWithinAbsOrRel(got, 40.0/75, 1e-15, 1e-15) {
		t.Errorf("MassConversion hand case = %v, want %v", got, 40.0/75)
	}
	// Round trip through the drift.
	for _, m := range []Terminal{{0.40, 0.04}, {1.88, 0.43}, {1, 0.5}} {
		for _, x := range []float64{0.01, 0.2, 0.5, 0.9} {
			d, _ := m.Drift(0.4, []float64{x})
			w := MassConversion(x, 0.4, d.Feed[0], 104.152, 53.064)
			got, err := molarConversion(m, w, 0.4, 104.152, 53.064)
			if err != nil || math.Abs(got-x) > 1e-10 {
				t.Errorf("%v: MolarConversion(MassConversion(%g)) = %v, %v", m, x, got, err)
			}
		}
	}
	if _, err := molarConversion(Terminal{1, 2}, 0.5, 0.5, 0, 50); Field(err) != "molarMass1" {
		t.Errorf("missing molar mass: error %v, want field molarMass1", err)
	}
}

// TestMolarConversions: the list form gives what one value at a time gives, for
// the terminal and the penultimate model, names a bad value by its index, and refuses more than
// MaxMassConversions values before any work.
func TestMolarConversions(t *testing.T) {
	w := []float64{0, 0.05, 0.3, 0.6}
	for _, m := range []Model{Terminal{0.40, 0.04}, Penultimate{R11: 0.9, R21: 0.6, R22: 0.2, R12: 0.1}} {
		got, err := molarConversions(m, w, 0.4, 104.152, 53.064)
		if err != nil {
			t.Fatalf("%v: MolarConversions error %v", m, err)
		}
		for i, wi := range w {
			want, err := molarConversion(m, wi, 0.4, 104.152, 53.064)
			if err != nil || got[i] != want {
				t.Errorf("%v: MolarConversions[%d] = %v, one value (%v) = %v, %v", m, i, got[i], wi, want, err)
			}
		}
	}
	m := Terminal{0.40, 0.04}
	if _, err := molarConversions(m, []float64{0.1, 1.5}, 0.4, 104.152, 53.064); Field(err) != "massConversion[1]" || !errors.Is(err, ErrOutOfRange) {
		t.Errorf("MolarConversions(w[1] = 1.5) error %v, want one naming massConversion[1]", err)
	}
	if _, err := molarConversions(m, []float64{math.NaN()}, 0.4, 104.152, 53.064); Field(err) != "massConversion[0]" || !errors.Is(err, ErrNotFinite) {
		t.Errorf("MolarConversions(NaN) error %v, want one naming massConversion[0]", err)
	}
	if _, err := molarConversions(m, make([]float64, MaxMassConversions+1), 0.4, 104.152, 53.064); Field(err) != "massConversion" || !errors.Is(err, ErrTooMany) {
		t.Errorf("MolarConversions(%d values) error %v, want ErrTooMany naming massConversion", MaxMassConversions+1, err)
	}
}
