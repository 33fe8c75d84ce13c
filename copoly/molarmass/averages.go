package molarmass

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// Bin is one class of a molar-mass distribution: the range Low–High in g/mol and its number
// fraction or its weight (mass) fraction (the fractions need not sum to 1; they are normalised).
// Exactly one of Number and Weight is given per table.
type Bin struct {
	Low, High      float64
	Number, Weight float64
}

// Averages are the molar-mass averages of a distribution.
type Averages struct {
	// Mn, Mw and Mz in g/mol, and the dispersity Đ = Mw/Mn.
	Mn, Mw, Mz, Dispersity float64
}

// MaxAverageRows bounds the tables of [BinAverages] and [SliceAverages].
const MaxAverageRows = 10000

// BinAverages returns the averages of a binned distribution, each class taken at the midpoint
// Mᵢ = (Low + High)/2 of its range:
//
//	Mn = Σ Nᵢ Mᵢ / Σ Nᵢ = Σ wᵢ / Σ (wᵢ/Mᵢ)
//	Mw = Σ wᵢ Mᵢ / Σ wᵢ = Σ Nᵢ Mᵢ² / Σ Nᵢ Mᵢ
//	Mz = Σ wᵢ Mᵢ² / Σ wᵢ Mᵢ,   Đ = Mw/Mn
//
// With number fractions given the weight fractions are wᵢ ∝ Nᵢ Mᵢ, and the reverse.
//
// References:
//   - P. J. Flory, Principles of Polymer Chemistry, Cornell 1953 (definitions of the averages).
//   - IUPAC, Pure Appl. Chem. 2009, 81, 351 (dispersity Đ; from memory).
func BinAverages(bins []Bin) (Averages, error) {
	if len(bins) == 0 || len(bins) > MaxAverageRows {
		return Averages{}, &copoly.InputError{Field: "bins", Value: float64(len(bins)), Reason: fmt.Sprintf("give between 1 and %d classes", MaxAverageRows), Err: copoly.ErrOutOfRange}
	}
	byNumber := bins[0].Number > 0
	M := make([]float64, len(bins))
	w := make([]float64, len(bins))
	for i, b := range bins {
		row := fmt.Sprintf("bins[%d].", i)
		for _, c := range []struct {
			f string
			v float64
		}{{"low", b.Low}, {"high", b.High}, {"numberFraction", b.Number}, {"weightFraction", b.Weight}} {
			if err := copoly.CheckFinite(row+c.f, c.v); err != nil {
				return Averages{}, err
			}
			if c.v < 0 {
				return Averages{}, &copoly.InputError{Field: row + c.f, Value: c.v, Reason: "cannot be negative", Err: copoly.ErrOutOfRange}
			}
		}
		if !(b.Low > 0 && b.High >= b.Low) {
			return Averages{}, &copoly.InputError{Field: row + "high", Value: b.High, Reason: "a class needs 0 < low ≤ high (g/mol)", Err: copoly.ErrOutOfRange}
		}
		if (b.Number > 0) != byNumber || (b.Number > 0 && b.Weight > 0) {
			return Averages{}, &copoly.FieldError{Field: row + "numberFraction", Reason: "give number fractions for every class or weight fractions for every class, not both", Err: copoly.ErrOutOfRange}
		}
		M[i] = 0.5 * (b.Low + b.High)
		if byNumber {
			w[i] = b.Number * M[i]
		} else {
			w[i] = b.Weight
		}
	}
	return averages(M, w, "bins")
}

// SliceAverages returns the averages of a size-exclusion chromatogram given as slices of molar
// mass mᵢ (g/mol, from the calibration) and detector signal hᵢ, taken as proportional to the mass
// of polymer in the slice (a concentration detector and slices of equal elution volume). Errors
// name "mass", "signal", "mass[i]" or "signal[i]".
func SliceAverages(mass, signal []float64) (Averages, error) {
	return sliceAverages(mass, signal, func(i int, key string) string {
		if i < 0 {
			return key
		}
		return fmt.Sprintf("%s[%d]", key, i)
	}, "bins")
}

// sliceAverages is SliceAverages with the fields named by name: name(-1, key) for the list of
// key ("mass" or "signal") as a whole, name(i, key) for its entry i; table names the table in an
// error about all of it.
func sliceAverages(mass, signal []float64, name func(i int, key string) string, table string) (Averages, error) {
	if len(mass) != len(signal) {
		return Averages{}, &copoly.InputError{Field: name(-1, "signal"), Value: float64(len(signal)), Reason: fmt.Sprintf("needs one signal per slice (%d molar masses)", len(mass)), Err: copoly.ErrOutOfRange}
	}
	if len(mass) == 0 || len(mass) > MaxAverageRows {
		return Averages{}, &copoly.InputError{Field: name(-1, "mass"), Value: float64(len(mass)), Reason: fmt.Sprintf("give between 1 and %d slices", MaxAverageRows), Err: copoly.ErrOutOfRange}
	}
	for i := range mass {
		if err := copoly.CheckFinite(name(i, "mass"), mass[i]); err != nil {
			return Averages{}, err
		}
		if err := copoly.CheckFinite(name(i, "signal"), signal[i]); err != nil {
			return Averages{}, err
		}
		if mass[i] <= 0 {
			return Averages{}, &copoly.InputError{Field: name(i, "mass"), Value: mass[i], Reason: "a molar mass must be positive", Err: copoly.ErrOutOfRange}
		}
		if signal[i] < 0 {
			return Averages{}, &copoly.InputError{Field: name(i, "signal"), Value: signal[i], Reason: "subtract the baseline: a signal cannot be negative", Err: copoly.ErrOutOfRange}
		}
	}
	return averages(mass, signal, table)
}

// averages returns the averages of molar masses M with weight fractions w (not normalised);
// table names the table in an error about all of it.
func averages(M, w []float64, table string) (Averages, error) {
	var sw, swOverM, swM, swM2 float64
	for i := range M {
		sw += w[i]
		swOverM += w[i] / M[i]
		swM += w[i] * M[i]
		swM2 += w[i] * M[i] * M[i]
	}
	if !(sw > 0) {
		return Averages{}, &copoly.FieldError{Field: table, Reason: "the fractions or signals are all zero", Err: copoly.ErrOutOfRange}
	}
	a := Averages{Mn: sw / swOverM, Mw: swM / sw, Mz: swM2 / swM}
	a.Dispersity = a.Mw / a.Mn
	if math.IsInf(a.Mz, 0) || math.IsNaN(a.Mz) {
		return Averages{}, &copoly.FieldError{Field: table, Reason: "the averages overflow: check the units (g/mol)", Err: copoly.ErrOutOfRange}
	}
	return a, nil
}
