package resin

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// MaxComponents is the largest number of monomers (components) accepted.
const MaxComponents = 20

// SumTolerance is how far mass fractions may sum from 1.
const SumTolerance = 1e-9

func indexName(field string, i int) string { return fmt.Sprintf("%s[%d]", field, i) }

// checkCount validates the number of values of a field against n (n = 0: the first field).
func checkCount(field string, v []float64, n int) error {
	if n == 0 {
		if len(v) == 0 {
			return &copoly.InputError{Field: field, Value: 0, Reason: "give at least one component", Err: copoly.ErrOutOfRange}
		}
		if len(v) > MaxComponents {
			return &copoly.InputError{Field: field, Value: float64(len(v)), Reason: fmt.Sprintf("at most %d components", MaxComponents), Err: copoly.ErrTooMany}
		}
		return nil
	}
	if len(v) != n {
		return &copoly.InputError{Field: field, Value: float64(len(v)), Reason: fmt.Sprintf("give one value per component (%d)", n), Err: copoly.ErrOutOfRange}
	}
	return nil
}

// checkFractions validates fractions named field[i]: finite, ≥ 0, summing to 1 within
// SumTolerance.
func checkFractions(field string, w []float64, n int) error {
	if err := checkCount(field, w, n); err != nil {
		return err
	}
	var sum float64
	for i, v := range w {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &copoly.InputError{Field: indexName(field, i), Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if v < 0 || v > 1 {
			return &copoly.InputError{Field: indexName(field, i), Value: v, Reason: "a fraction must lie between 0 and 1", Err: copoly.ErrOutOfRange}
		}
		sum += v
	}
	if !(math.Abs(sum-1) <= SumTolerance) {
		return &copoly.InputError{Field: field, Value: sum, Reason: fmt.Sprintf("the fractions must sum to 1 (within %g); they sum to %.12g", SumTolerance, sum), Err: copoly.ErrOutOfRange}
	}
	return nil
}

// checkMolarMasses validates n molar masses named molarMass[i].
func checkMolarMasses(molarMass []float64, n int) error {
	if err := checkCount("molarMass", molarMass, n); err != nil {
		return err
	}
	for i, v := range molarMass {
		if err := copoly.CheckMolarMass(indexName("molarMass", i), v); err != nil {
			return err
		}
	}
	return nil
}
