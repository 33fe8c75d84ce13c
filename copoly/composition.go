package copoly

import (
	"fmt"
	"math"
)

// Composition is the composition curve of a model: the copolymer composition F1 at each feed
// and, for the terminal model, its azeotrope and classification.
type Composition struct {
	// F1 holds the instantaneous copolymer composition at each feed asked for.
	F1 []float64
	// Azeotrope is the azeotropic feed of a [Terminal] model ([Terminal.Azeotrope]); NaN when
	// there is none in (0, 1), and for the other models.
	Azeotrope float64
	// Classification describes a [Terminal] model ([Terminal.Classify]); nil for the other
	// models.
	Classification *Classification
}

// CompositionOf returns the composition curve of model m at the feeds f1 (each in [0, 1], at
// most [MaxPoints] of them), by the model's composition equation ([Model.Instantaneous]). An
// invalid model gives the [*InputError] of its Validate method, an invalid feed one naming
// "f1[i]", too many feeds one naming "f1".
func CompositionOf(m Model, f1 []float64) (*Composition, error) {
	c := &Composition{Azeotrope: math.NaN()}
	if t, ok := m.(Terminal); ok {
		var err error
		if c.F1, err = t.InstantaneousTo(make([]float64, 0, len(f1)), f1); err != nil {
			return nil, err
		}
		if az, ok := t.Azeotrope(); ok {
			c.Azeotrope = az
		}
		k := t.Classify()
		c.Classification = &k
		return c, nil
	}
	if err := m.Validate(); err != nil {
		return nil, err
	}
	if len(f1) > MaxPoints {
		return nil, &InputError{Field: "f1", Value: float64(len(f1)), Reason: fmt.Sprintf("at most %d feeds per call", MaxPoints), Err: ErrTooMany}
	}
	c.F1 = make([]float64, len(f1))
	for i, f := range f1 {
		if !(f >= 0 && f <= 1) { // also catches NaN; the field name is built only on error
			return nil, CheckFraction(fmt.Sprintf("f1[%d]", i), f)
		}
		c.F1[i] = m.Instantaneous(f)
	}
	return c, nil
}
