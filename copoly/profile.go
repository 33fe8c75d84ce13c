package copoly

import "fmt"

// Bases of the conversions of a [ProfileInput].
const (
	BasisMolar = "molar" // overall molar conversion X
	BasisMass  = "mass"  // mass (gravimetric) conversion
)

// ProfileInput asks for the profile of a batch (see [ProfileOf]).
type ProfileInput struct {
	// Model is the copolymerization model and F10 the feed the batch starts from.
	Model Model
	F10   float64
	// Conversion holds the conversions at which the drift is wanted, non-decreasing: overall
	// molar conversions, or mass conversions when Basis is BasisMass.
	Conversion []float64
	// Basis is BasisMolar (or "", the same) or BasisMass.
	Basis string
	// MolarMass1 and MolarMass2 are the monomer molar masses in g/mol, both or neither (nil: not
	// given). With them the profile has mass conversions and a distribution by mass; a basis
	// BasisMass needs them.
	MolarMass1, MolarMass2 *float64
	// Tolerance is the ± tolerance on the cumulative composition (mole fraction) of the
	// conversion limit, above 0 and at most 0.5.
	Tolerance float64
	// Bins is the number of bins of the composition distribution, 1 to [MaxBins].
	Bins int
}

// Profile is a batch followed to a list of conversions, as the drift panel of the page shows it.
type Profile struct {
	// Drift holds the molar conversions (converted from mass when the basis is mass), the
	// unreacted feed, the instantaneous and cumulative composition, the method and the exhaustion
	// of a monomer ([Batch.Drift]).
	*Drift
	// ConversionMass holds the mass conversion at each point ([MassConversion]), or is nil
	// without molar masses.
	ConversionMass []float64
	// Tolerance is the tolerance asked for and Limit the conversion limit for it
	// ([Batch.ConversionLimit]).
	Tolerance, Limit float64
	// Distribution is the composition distribution of all the polymer made up to the last
	// conversion ([Batch.Distribution]): by mass with molar masses, else by moles.
	Distribution Histogram
}

// ProfileOf returns the profile of a batch: its drift at each conversion, the conversion limit
// for a composition tolerance, the composition distribution of the product, and the conversions
// on the other basis when the molar masses are given. It works for any [Model].
//
// Errors name the input as the page does: the model's parameters, "f10", "conversion" (none
// given, or more than [MaxMassConversions] mass conversions), "conversion[i]" (out of range,
// decreasing, past the end of the batch, or a mass conversion the batch does not reach),
// "basis", "molarMass1" or "molarMass2" (one without the other, out of range, or missing for a
// basis by mass), "tolerance" and "bins".
func ProfileOf(in ProfileInput) (*Profile, error) {
	b, err := NewBatch(in.Model, in.F10)
	if err != nil {
		return nil, err
	}
	if len(in.Conversion) == 0 {
		return nil, &FieldError{Field: "conversion", Reason: "give at least one conversion", Err: ErrOutOfRange}
	}
	switch in.Basis {
	case "", BasisMolar, BasisMass:
	default:
		return nil, &FieldError{Field: "basis", Reason: fmt.Sprintf("is %q; it must be %q or %q", in.Basis, BasisMolar, BasisMass), Err: ErrOutOfRange}
	}
	masses, err := molarMassPair(in.MolarMass1, in.MolarMass2)
	if err != nil {
		return nil, err
	}
	if in.Basis == BasisMass && masses == nil {
		return nil, &FieldError{Field: "molarMass1", Reason: "is missing: a conversion by mass needs both molar masses", Err: ErrOutOfRange}
	}
	var mm1, mm2 float64 // 0, 0: the mole basis of the distribution
	if masses != nil {
		mm1, mm2 = masses[0], masses[1]
	}
	p := &Profile{Tolerance: in.Tolerance}
	conversion := in.Conversion
	if in.Basis == BasisMass {
		p.ConversionMass = in.Conversion
		if conversion, err = b.molarConversions("conversion", in.Conversion, mm1, mm2); err != nil {
			return nil, err
		}
	}
	if p.Drift, err = b.Drift(conversion); err != nil {
		return nil, err
	}
	if p.Limit, err = b.ConversionLimit(in.Tolerance); err != nil {
		return nil, err
	}
	last := len(conversion) - 1
	if p.Distribution, err = b.distribution(fmt.Sprintf("conversion[%d]", last), conversion[last], in.Bins, mm1, mm2); err != nil {
		return nil, err
	}
	if in.Basis != BasisMass && masses != nil {
		p.ConversionMass = make([]float64, len(conversion))
		for i, x := range conversion {
			p.ConversionMass[i] = MassConversion(x, in.F10, p.Feed[i], mm1, mm2)
		}
	}
	return p, nil
}

// molarMassPair checks an optional pair of molar masses: both (checked by [CheckMolarMass]) or
// neither (nil).
func molarMassPair(m1, m2 *float64) (*[2]float64, error) {
	switch {
	case m1 != nil && m2 != nil:
		if err := CheckMolarMass("molarMass1", *m1); err != nil {
			return nil, err
		}
		if err := CheckMolarMass("molarMass2", *m2); err != nil {
			return nil, err
		}
		return &[2]float64{*m1, *m2}, nil
	case m1 != nil:
		return nil, &FieldError{Field: "molarMass2", Reason: "is missing: give both molar masses or neither", Err: ErrOutOfRange}
	case m2 != nil:
		return nil, &FieldError{Field: "molarMass1", Reason: "is missing: give both molar masses or neither", Err: ErrOutOfRange}
	}
	return nil, nil
}
