package fit

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// instantaneousRuns returns noise-free low-conversion data generated with the Mayo–Lewis
// equation at the given feeds.
func instantaneousRuns(m copoly.Terminal, feeds ...float64) []copoly.Run {
	runs := make([]copoly.Run, len(feeds))
	for i, f := range feeds {
		runs[i] = copoly.Run{F10: f, F1: m.Instantaneous(f)}
	}
	return runs
}

// cumulativeRuns returns noise-free data at finite conversion generated with the integrated
// model.
func cumulativeRuns(m copoly.Terminal, feeds []float64, conversions []float64) []copoly.Run {
	var runs []copoly.Run
	for _, f := range feeds {
		for _, x := range conversions {
			runs = append(runs, copoly.Run{F10: f, Conversion: x, F1: m.Cumulative(f, x)})
		}
	}
	return runs
}

var recoveryPairs = []copoly.Terminal{{R1: 0.40, R2: 0.04}, {R1: 0.52, R2: 0.46}, {R1: 1.88, R2: 0.43}, {R1: 0.43, R2: 1.88}, {R1: 2, R2: 1.5}, {R1: 26, R2: 0.03}}

// On exact instantaneous data every linearisation is an exact rearrangement of the Mayo–Lewis
// equation, so each returns the true ratios to round-off (Fineman & Ross 1950; Kelen & Tüdős
// 1975).
func TestLinearExactRecovery(t *testing.T) {
	for _, m := range recoveryPairs {
		runs := instantaneousRuns(m, 0.1, 0.25, 0.4, 0.55, 0.7, 0.85)
		for _, c := range []struct {
			name string
			f    func([]copoly.Run) (Linear, error)
		}{{"FR", FinemanRoss}, {"IFR", InvertedFinemanRoss}, {"KT", KelenTudos}, {"EKT", ExtendedKelenTudos}} {
			l, err := c.f(runs)
			if err != nil {
				t.Fatalf("%s %v: %v", c.name, m, err)
			}
			if !scalar.EqualWithinAbsOrRel(l.R1, m.R1, 1e-9, 1e-9) || !scalar.EqualWithinAbsOrRel(l.R2, m.R2, 1e-9, 1e-9) {
				t.Errorf("%s on exact data of %v = (%v, %v)", c.name, m, l.R1, l.R2)
			}
		}
	}
}

// Fineman–Ross with the labels swapped (f → 1 − f, F → 1 − F, outputs swapped back) is
// algebraically the inverted Fineman–Ross method; Kelen–Tüdős with α = √(H_min H_max) is
// unchanged by the swap (Kelen & Tüdős 1975). Checked on scattered data.
func TestLinearLabelSwap(t *testing.T) {
	runs := []copoly.Run{{F10: 0.1, F1: 0.21}, {F10: 0.3, F1: 0.38}, {F10: 0.5, F1: 0.55}, {F10: 0.7, F1: 0.64}, {F10: 0.9, F1: 0.83}}
	swapped := make([]copoly.Run, len(runs))
	for i, r := range runs {
		swapped[i] = copoly.Run{F10: 1 - r.F10, F1: 1 - r.F1}
	}
	fr, _ := FinemanRoss(swapped)
	ifr, _ := InvertedFinemanRoss(runs)
	if !scalar.EqualWithinAbsOrRel(fr.R2, ifr.R1, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(fr.R1, ifr.R2, 1e-12, 1e-12) {
		t.Errorf("swapped FR = (%v, %v), inverted FR = (%v, %v)", fr.R2, fr.R1, ifr.R1, ifr.R2)
	}
	kt, _ := KelenTudos(runs)
	kts, _ := KelenTudos(swapped)
	if !scalar.EqualWithinAbsOrRel(kt.R1, kts.R2, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(kt.R2, kts.R1, 1e-12, 1e-12) {
		t.Errorf("KT = (%v, %v), swapped (%v, %v)", kt.R1, kt.R2, kts.R2, kts.R1)
	}
	// And the plain Fineman–Ross estimate does depend on the labels with scattered data.
	plain, _ := FinemanRoss(runs)
	if math.Abs(plain.R1-ifr.R1) < 1e-6 {
		t.Errorf("FR and inverted FR agree on scattered data (%v): the label dependence should show", plain.R1)
	}
}

// The extended Kelen–Tüdős method is exact for ideal pairs (r1 r2 = 1) at any conversion
// (Tüdős et al. 1976: the integrated equation then separates exactly).
func TestExtendedKelenTudosExactForIdealPairs(t *testing.T) {
	m := copoly.Terminal{R1: 2, R2: 0.5}
	runs := cumulativeRuns(m, []float64{0.2, 0.4, 0.6, 0.8}, []float64{0.3, 0.6})
	l, err := ExtendedKelenTudos(runs)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(l.R1, 2, 1e-7, 1e-7) || !scalar.EqualWithinAbsOrRel(l.R2, 0.5, 1e-7, 1e-7) {
		t.Errorf("EKT on ideal high-conversion data = (%v, %v), want (2, 0.5)", l.R1, l.R2)
	}
}

// Each integrated Mayo–Lewis curve of model-generated data passes through the true ratios, so
// the intersection method recovers them (Mayo & Lewis 1944; the integrated equation is exact).
func TestMayoLewisIntersection(t *testing.T) {
	for _, m := range []copoly.Terminal{{R1: 0.3, R2: 1.5}, {R1: 0.52, R2: 0.46}, {R1: 1.88, R2: 0.43}} {
		runs := cumulativeRuns(m, []float64{0.2, 0.5, 0.8}, []float64{0.4})
		r1, r2, curves, err := MayoLewisIntersection(runs)
		if err != nil {
			t.Fatal(err)
		}
		if len(curves) != 3 {
			t.Errorf("%d curves, want 3", len(curves))
		}
		// The curves are sampled at fixed p and crossings are interpolated linearly.
		if !scalar.EqualWithinAbsOrRel(r1, m.R1, 2e-3, 2e-3) || !scalar.EqualWithinAbsOrRel(r2, m.R2, 2e-3, 2e-3) {
			t.Errorf("%v: intersection (%v, %v)", m, r1, r2)
		}
		// The closed form itself returns r2 exactly at the true p.
		run := runs[1]
		p := (1 - m.R1) / (1 - m.R2)
		m10, m20 := run.F10, 1-run.F10
		m1, m2 := m10-run.F1*run.Conversion, m20-(1-run.F1)*run.Conversion
		l := math.Log((1 - p*m1/m2) / (1 - p*m10/m20))
		got := (math.Log(m20/m2) - l/p) / (math.Log(m10/m1) + l)
		if !scalar.EqualWithinAbsOrRel(got, m.R2, 1e-9, 1e-9) {
			t.Errorf("%v: integrated Mayo–Lewis r2 at the true p = %v", m, got)
		}
	}
	if _, _, _, err := MayoLewisIntersection(instantaneousRuns(copoly.Terminal{R1: 1, R2: 2}, 0.2, 0.5)); err == nil {
		t.Error("intersection without conversions gave no error")
	}
}

// TestMayoLewisIntersectionLimit: the pairwise method takes at most MaxIntersectionRuns runs
// with a conversion (MaxIntersectionRuns+1 gives an error naming runs), and Estimate then fits
// by the other methods with a warning about this one.
func TestMayoLewisIntersectionLimit(t *testing.T) {
	m := copoly.Terminal{R1: 0.52, R2: 0.46}
	feeds := make([]float64, MaxIntersectionRuns+1)
	for i := range feeds {
		feeds[i] = 0.05 + 0.9*float64(i)/float64(len(feeds))
	}
	if _, _, _, err := MayoLewisIntersection(cumulativeRuns(m, feeds[:MaxIntersectionRuns], []float64{0.3})); err != nil {
		t.Errorf("MayoLewisIntersection(%d runs) error %v", MaxIntersectionRuns, err)
	}
	runs := cumulativeRuns(m, feeds, []float64{0.3})
	if _, _, _, err := MayoLewisIntersection(runs); copoly.Field(err) != "runs" || !errors.Is(err, copoly.ErrTooMany) {
		t.Errorf("MayoLewisIntersection(%d runs) error %v, want ErrTooMany naming runs", len(runs), err)
	}
	e, err := Estimate(runs, 0)
	if err != nil {
		t.Fatal(err)
	}
	warned := false
	for _, w := range e.Warnings {
		warned = warned || (w.Method == MethodMayoLewis && strings.Contains(w.Message, "at most"))
	}
	if e.MayoLewis != nil || !warned || e.Nonlinear == nil {
		t.Errorf("Estimate(%d runs): intersection %v, warnings %v, nonlinear %v", len(runs), e.MayoLewis, e.Warnings, e.Nonlinear)
	}
}

func TestLinearValidates(t *testing.T) {
	if _, err := FinemanRoss([]copoly.Run{{F10: 0.5, F1: 0.5}}); err == nil {
		t.Error("one run: no error")
	}
	if _, err := FinemanRoss([]copoly.Run{{F10: 0.5, F1: 0.6}, {F10: 0.5, F1: 0.6}}); err == nil {
		t.Error("two identical runs: no error")
	}
	if _, err := KelenTudos([]copoly.Run{{F10: 0.5, F1: 1}, {F10: 0.3, F1: 0.4}}); copoly.Field(err) != "runs[0].F1" {
		t.Errorf("F1 = 1: error %v, want field runs[0].F1", err)
	}
	// A run whose copolymer holds more M1 than was charged breaks the extended method.
	if _, err := ExtendedKelenTudos([]copoly.Run{{F10: 0.2, Conversion: 0.7, F1: 0.3}, {F10: 0.5, Conversion: 0.1, F1: 0.5}}); copoly.Field(err) != "runs[0].conversion" {
		t.Errorf("broken balance: error %v, want field runs[0].conversion", err)
	}
}

func TestLinearMethodWarnings(t *testing.T) {
	runs := []copoly.Run{
		{F10: 0.2, F1: 0.3},                   // no conversion given
		{F10: 0.5, F1: 0.55, Conversion: 0.1}, // at the 10 % limit (common practice, no source)
		{F10: 0.8, F1: 0.75, Conversion: 0.12},
	}
	w := LinearMethodWarnings(runs)
	if len(w) != 1 || w[0].Row != 2 || w[0].Field != "runs[2].conversion" || !strings.Contains(w[0].Message, "row 3") {
		t.Errorf("LinearMethodWarnings = %+v, want one warning for row 3", w)
	}
}
