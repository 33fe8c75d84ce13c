package project

import (
	"fmt"

	"copoly/copoly"
	"copoly/copoly/molarmass"
)

// MaxSizeBins is the largest number of rows of Project.SizeBins: copoly's own limit
// (molarmass.MaxAverageRows), so that every table a project holds can be averaged.
const MaxSizeBins = molarmass.MaxAverageRows

// SizeBin is one row of the chain-size panel as entered: a class Low–High of molar mass in
// g/mol with its number fraction or its weight fraction (0 = not given), as molarmass.Bin. It is
// one entry of the sizeBins of the JavaScript API. Every number must be finite and ≥ 0; whether
// the table makes a distribution is for molarmass.BinAverages to say.
type SizeBin struct {
	Low            float64 `json:"low" project:"required"`
	High           float64 `json:"high" project:"required"`
	NumberFraction float64 `json:"numberFraction,omitempty"`
	WeightFraction float64 `json:"weightFraction,omitempty"`
}

// Bin returns the row as a molarmass.Bin.
func (b SizeBin) Bin() molarmass.Bin {
	return molarmass.Bin{Low: b.Low, High: b.High, Number: b.NumberFraction, Weight: b.WeightFraction}
}

// checkSizeBins reports the first invalid row of bins as an error whose field starts with field
// ("project.sizeBins[3].low"), or nil.
func checkSizeBins(field string, bins []SizeBin) error {
	if n := len(bins); n > MaxSizeBins {
		return &copoly.InputError{Field: field, Value: float64(n), Reason: fmt.Sprintf("at most %d rows of molar-mass classes", MaxSizeBins), Err: copoly.ErrTooMany}
	}
	for i, b := range bins {
		f := fmt.Sprintf("%s[%d].", field, i)
		for _, c := range []struct {
			name, why string
			v         float64
		}{
			{"low", "a molar mass cannot be negative (g/mol)", b.Low},
			{"high", "a molar mass cannot be negative (g/mol)", b.High},
			{"numberFraction", "a fraction cannot be negative (0 = not given)", b.NumberFraction},
			{"weightFraction", "a fraction cannot be negative (0 = not given)", b.WeightFraction},
		} {
			if err := checkNonNegative(f+c.name, c.v, c.why); err != nil {
				return err
			}
		}
	}
	return nil
}
