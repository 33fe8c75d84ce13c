package copoly

import (
	"errors"
	"math"
	"testing"
)

// TestCompositionOf: the curve of every model is its composition equation at each feed; the
// terminal model adds its azeotrope and classification, the others leave them out.
func TestCompositionOf(t *testing.T) {
	f1 := []float64{0, 0.1, 0.5, 0.9, 1}
	for _, m := range []Model{Terminal{0.40, 0.04}, Terminal{2, 0.5}, Penultimate{0.9, 0.6, 0.2, 0.1}, Implicit{0.8, 0.15, 0.5, 2}} {
		c, err := CompositionOf(m, f1)
		if err != nil {
			t.Fatalf("%v: %v", m, err)
		}
		for i, f := range f1 {
			if c.F1[i] != m.Instantaneous(f) {
				t.Errorf("%v: F1[%d] = %v, want Instantaneous(%v) = %v", m, i, c.F1[i], f, m.Instantaneous(f))
			}
		}
		tm, terminal := m.(Terminal)
		switch {
		case terminal:
			az, ok := tm.Azeotrope()
			if ok != !math.IsNaN(c.Azeotrope) || (ok && c.Azeotrope != az) {
				t.Errorf("%v: azeotrope %v, want %v (%v)", m, c.Azeotrope, az, ok)
			}
			if c.Classification == nil || *c.Classification != tm.Classify() {
				t.Errorf("%v: classification %+v, want %+v", m, c.Classification, tm.Classify())
			}
		case !math.IsNaN(c.Azeotrope) || c.Classification != nil:
			t.Errorf("%v: azeotrope %v and classification %+v, want NaN and nil for a model other than the terminal", m, c.Azeotrope, c.Classification)
		}
	}
	for _, tc := range []struct {
		m     Model
		f1    []float64
		field string
		err   error
	}{
		{Terminal{-1, 0.5}, f1, "r1", ErrOutOfRange},
		{Penultimate{0.9, 0.6, 0.2, math.NaN()}, f1, "r12", ErrNotFinite},
		{Penultimate{0.9, 0.6, 0.2, 0.1}, []float64{0.5, 1.5}, "f1[1]", ErrOutOfRange},
		{Implicit{0.8, 0.15, 0.5, 2}, make([]float64, MaxPoints+1), "f1", ErrTooMany},
		{Terminal{1, 1}, []float64{math.NaN()}, "f1[0]", ErrNotFinite},
	} {
		if _, err := CompositionOf(tc.m, tc.f1); Field(err) != tc.field || !errors.Is(err, tc.err) {
			t.Errorf("CompositionOf(%v, …) error %v, want %v naming %s", tc.m, err, tc.err, tc.field)
		}
	}
}
