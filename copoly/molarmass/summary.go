package molarmass

import (
	"fmt"

	"copoly/copoly"
)

// Slice is one slice of a size-exclusion chromatogram: the molar mass of the slice in g/mol
// (from the calibration) and the detector signal (see [SliceAverages]).
type Slice struct {
	Mass, Signal float64
}

// Input asks for the averages of a distribution (see [Summarize]).
type Input struct {
	// Bins or Slices hold the distribution: molar-mass classes, or chromatogram slices; exactly
	// one of them is given (an empty list counts as not given).
	Bins   []Bin
	Slices []Slice
	// F1 is the cumulative copolymer composition and MolarMass1, MolarMass2 the monomer molar
	// masses in g/mol, each nil when not given. With F1 and both molar masses the summary holds
	// the chain size; the molar masses come both or neither.
	F1, MolarMass1, MolarMass2 *float64
}

// Summary holds the averages of a distribution and, when asked for, the chain size they imply.
type Summary struct {
	Averages
	// Size is the chain size of the copolymer ([SizeOf]), nil when F1 or the molar masses are
	// not given.
	Size *ChainSize
}

// Summarize returns the averages of the classes ([BinAverages]) or of the slices (as
// [SliceAverages], with errors naming "slices[i].mass", "slices[i].signal" or "slices") and,
// with F1 and both molar masses, the chain size ([SizeOf]). Neither list gives an error naming
// "bins", both one naming "slices", one molar mass without the other one naming the other.
func Summarize(in Input) (*Summary, error) {
	var mm [2]float64
	switch {
	case in.MolarMass1 != nil && in.MolarMass2 != nil:
		mm = [2]float64{*in.MolarMass1, *in.MolarMass2}
		for i, m := range mm {
			if err := copoly.CheckMolarMass(fmt.Sprintf("molarMass%d", i+1), m); err != nil {
				return nil, err
			}
		}
	case in.MolarMass1 != nil:
		return nil, &copoly.FieldError{Field: "molarMass2", Reason: "is missing: give both molar masses or neither", Err: copoly.ErrOutOfRange}
	case in.MolarMass2 != nil:
		return nil, &copoly.FieldError{Field: "molarMass1", Reason: "is missing: give both molar masses or neither", Err: copoly.ErrOutOfRange}
	}
	var s Summary
	var err error
	switch {
	case len(in.Bins) > 0 && len(in.Slices) > 0:
		return nil, &copoly.FieldError{Field: "slices", Reason: "give bins or slices, not both", Err: copoly.ErrOutOfRange}
	case len(in.Bins) > 0:
		s.Averages, err = BinAverages(in.Bins)
	case len(in.Slices) > 0:
		mass, signal := make([]float64, len(in.Slices)), make([]float64, len(in.Slices))
		for i, sl := range in.Slices {
			mass[i], signal[i] = sl.Mass, sl.Signal
		}
		s.Averages, err = sliceAverages(mass, signal, func(i int, key string) string {
			if i < 0 {
				return "slices"
			}
			return fmt.Sprintf("slices[%d].%s", i, key)
		}, "slices")
	default:
		return nil, &copoly.FieldError{Field: "bins", Reason: "is missing: give the molar-mass classes (bins) or the chromatogram slices (slices)", Err: copoly.ErrOutOfRange}
	}
	if err != nil {
		return nil, err
	}
	if in.F1 != nil && in.MolarMass1 != nil {
		c, err := SizeOf(s.Averages, *in.F1, mm[0], mm[1])
		if err != nil {
			return nil, err
		}
		s.Size = &c
	}
	return &s, nil
}
