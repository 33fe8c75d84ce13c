package copoly

import (
	"fmt"
	"math"
)

// ConversionLimit returns the largest overall molar conversion X up to which the cumulative
// copolymer composition F̄1 of the batch stays within ±tolerance of the composition of the
// first polymer, F1(f10). It returns 1 (or [Batch.MaxConversion]) when the batch never leaves
// the band. F̄1 moves monotonically with X, so the limit is found by bisection to 1e-10. A
// tolerance that is not above 0 and at most 0.5 gives an [*InputError] naming "tolerance".
func (b *Batch) ConversionLimit(tolerance float64) (float64, error) {
	f10 := b.f10
	if err := CheckFinite("tolerance", tolerance); err != nil {
		return 0, err
	}
	if tolerance <= 0 || tolerance > 0.5 {
		return 0, &InputError{Field: "tolerance", Value: tolerance, Reason: "a composition tolerance must be above 0 and at most 0.5 (mole fraction)", Err: ErrOutOfRange}
	}
	if b.still {
		return 1, nil
	}
	start := b.inst(f10)
	off := func(x float64) bool {
		var f [1]float64
		b.feedAt(f[:], []float64{x})
		var c float64
		if x >= b.xmax && b.xmax == 1 {
			c = f10
		} else {
			c = b.cumulative(x, f[0])
		}
		return math.Abs(c-start) > tolerance
	}
	if !off(b.xmax) {
		return b.xmax, nil
	}
	lo, hi := 0.0, b.xmax
	for hi-lo > 1e-10 {
		mid := 0.5 * (lo + hi)
		if off(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return lo, nil
}

// Histogram is a distribution over bins of copolymer composition.
type Histogram struct {
	// Edges holds len(Weights)+1 ascending bin edges in F1.
	Edges []float64
	// Weights holds the fraction of the polymer in each bin; they sum to 1.
	Weights []float64
	// Basis is "mass" when the weights are mass fractions, "moles" when they are fractions of
	// the monomer units, and "units" for chains weighted by their number of units
	// ([ChainStats.Histogram]).
	Basis string
}

// MaxBins is the largest number of bins [Batch.Distribution] accepts.
const MaxBins = 200

// distributionSteps is the number of conversion slices the batch is cut into for
// [Batch.Distribution]; each slice is assigned the instantaneous composition at its
// midpoint (the midpoint rule, error O(1/n²)).
const distributionSteps = 4000

// Distribution returns the composition distribution of all the polymer made in the batch up to
// conversion: each conversion slice dX makes polymer of the instantaneous composition
// F1(f1(X)), in an amount dX (moles of units), or dX·(F1·M1 + (1 − F1)·M2) by mass when both
// molar masses are given (molarMass1 = molarMass2 = 0 selects the mole basis). The bins span the
// compositions made, widened to at least 0.01 around them when the batch does not drift.
// Chain-to-chain scatter about the instantaneous composition (Stockmayer) is not included: the
// histogram shows drift only. Errors name "conversion", "bins", "molarMass1" or "molarMass2".
func (b *Batch) Distribution(conversion float64, bins int, molarMass1, molarMass2 float64) (Histogram, error) {
	return b.distribution("conversion", conversion, bins, molarMass1, molarMass2)
}

// distribution is Distribution with errors about the conversion naming field.
func (b *Batch) distribution(field string, conversion float64, bins int, molarMass1, molarMass2 float64) (Histogram, error) {
	if err := CheckConversion(field, conversion); err != nil {
		return Histogram{}, err
	}
	if conversion == 0 {
		return Histogram{}, &InputError{Field: field, Value: 0, Reason: "no polymer is made at zero conversion", Err: ErrOutOfRange}
	}
	if err := b.checkConversion(field, conversion); err != nil {
		return Histogram{}, err
	}
	if bins < 1 || bins > MaxBins {
		return Histogram{}, &InputError{Field: "bins", Value: float64(bins), Reason: fmt.Sprintf("the number of bins must be between 1 and %d", MaxBins), Err: ErrOutOfRange}
	}
	basis := "moles"
	if molarMass1 != 0 || molarMass2 != 0 {
		if err := CheckMolarMass("molarMass1", molarMass1); err != nil {
			return Histogram{}, err
		}
		if err := CheckMolarMass("molarMass2", molarMass2); err != nil {
			return Histogram{}, err
		}
		basis = "mass"
	}
	xs := make([]float64, distributionSteps)
	dx := conversion / distributionSteps
	for i := range xs {
		xs[i] = (float64(i) + 0.5) * dx
	}
	feeds := make([]float64, len(xs))
	b.feedAt(feeds, xs)
	comp := feeds // reuse: instantaneous composition per slice
	w := make([]float64, len(feeds))
	for i, f := range feeds {
		comp[i] = b.inst(f)
		w[i] = 1
		if basis == "mass" {
			w[i] = comp[i]*molarMass1 + (1-comp[i])*molarMass2
		}
	}
	return binned(comp, w, bins, basis), nil
}

// HistogramOf returns the histogram of the values v with weights w over bins equal bins spanning
// their range (see binned); basis names what the weights count, as in [Histogram]. v and w must
// have the same length, at least one value and a positive total weight; bins must be at least 1.
func HistogramOf(v, w []float64, bins int, basis string) Histogram { return binned(v, w, bins, basis) }

// binned returns the histogram of the values v with weights w over bins equal bins spanning
// their range, widened to at least 0.01 around them (and kept inside [0, 1]) when they are
// nearly equal; the weights are normalised to sum 1.
func binned(v, w []float64, bins int, basis string) Histogram {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, x := range v {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	if hi-lo < 0.01 {
		mid := 0.5 * (lo + hi)
		lo, hi = math.Max(0, mid-0.005), math.Min(1, mid+0.005)
		if hi-lo < 0.01 { // against an edge
			if lo == 0 {
				hi = 0.01
			} else {
				lo = 0.99
			}
		}
	}
	h := Histogram{Edges: make([]float64, bins+1), Weights: make([]float64, bins), Basis: basis}
	for i := range h.Edges {
		h.Edges[i] = lo + (hi-lo)*float64(i)/float64(bins)
	}
	var total float64
	for i, x := range v {
		k := min(max(int((x-lo)/(hi-lo)*float64(bins)), 0), bins-1)
		h.Weights[k] += w[i]
		total += w[i]
	}
	for i := range h.Weights {
		h.Weights[i] /= total
	}
	return h
}

// MassConversion returns the mass (gravimetric) conversion of a batch from its overall molar
// conversion X, the starting feed f10, the unreacted feed f1 at X and the monomer molar masses:
//
//	Xw = [M1 (f10 − (1 − X) f1) + M2 (f20 − (1 − X) f2)] / (M1 f10 + M2 f20)
//
// The numerator is the mass of polymer per mole of monomer charged, from the monomer balance of
// each monomer. The inputs are not validated; see [Batch.MolarConversions] for the inverse.
func MassConversion(conversion, f10, f1, molarMass1, molarMass2 float64) float64 {
	x := conversion
	poly := molarMass1*(f10-(1-x)*f1) + molarMass2*((1-f10)-(1-x)*(1-f1))
	return poly / (molarMass1*f10 + molarMass2*(1-f10))
}

// MaxMassConversions is the most mass conversions [Batch.MolarConversions] converts in one call.
// Each takes a bisection over the drift (about 40 evaluations of the unreacted feed), so the
// limit keeps a call well under a second in the browser; a plotted curve needs a few hundred.
const MaxMassConversions = 1000

// MolarConversions returns the overall molar conversion X of the batch at which the mass
// conversion (see [MassConversion]) equals each value of massConversion. The mass conversion
// rises monotonically with X, so each X is found by bisection to 1e-12 over the drift. An invalid
// value gives an [*InputError] naming "massConversion[i]", more than [MaxMassConversions] values
// one naming "massConversion" wrapping [ErrTooMany], and a missing or invalid molar mass one
// naming "molarMass1" or "molarMass2".
func (b *Batch) MolarConversions(massConversion []float64, molarMass1, molarMass2 float64) ([]float64, error) {
	return b.molarConversions("massConversion", massConversion, molarMass1, molarMass2)
}

// molarConversions is MolarConversions with errors naming field[i] and field.
func (b *Batch) molarConversions(field string, massConversions []float64, molarMass1, molarMass2 float64) ([]float64, error) {
	if n := len(massConversions); n > MaxMassConversions {
		return nil, &InputError{Field: field, Value: float64(n), Reason: fmt.Sprintf("at most %d mass conversions per call", MaxMassConversions), Err: ErrTooMany}
	}
	if err := CheckMolarMass("molarMass1", molarMass1); err != nil {
		return nil, err
	}
	if err := CheckMolarMass("molarMass2", molarMass2); err != nil {
		return nil, err
	}
	out := make([]float64, len(massConversions))
	for i, w := range massConversions {
		var err error
		if out[i], err = b.molarConversion(fmt.Sprintf("%s[%d]", field, i), w, molarMass1, molarMass2); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// molarConversion converts one mass conversion, with errors naming field.
func (b *Batch) molarConversion(field string, massConversion, molarMass1, molarMass2 float64) (float64, error) {
	if err := CheckConversion(field, massConversion); err != nil {
		return 0, err
	}
	f10 := b.f10
	mass := func(x float64) float64 {
		var f [1]float64
		b.feedAt(f[:], []float64{x})
		return MassConversion(x, f10, f[0], molarMass1, molarMass2)
	}
	if top := mass(b.xmax); massConversion > top+1e-12 {
		return 0, &InputError{Field: field, Value: massConversion, Reason: fmt.Sprintf("this batch stops at a mass conversion of %.4g", top), Err: ErrOutOfRange}
	}
	lo, hi := 0.0, b.xmax
	for hi-lo > 1e-12 {
		mid := 0.5 * (lo + hi)
		if mass(mid) < massConversion {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi), nil
}
