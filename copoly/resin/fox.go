package resin

import (
	"fmt"
	"math"

	"copoly/copoly"
	"copoly/copoly/multi"
)

// MaxTg is the largest homopolymer glass transition accepted, in kelvin (no organic polymer's
// is near it; common practice, no source).
const MaxTg = 1000

// checkTg validates n homopolymer glass transitions named tg[i]: finite, above 0 K, at most
// MaxTg.
func checkTg(tg []float64, n int) error {
	if err := checkCount("tg", tg, n); err != nil {
		return err
	}
	for i, v := range tg {
		field := indexName("tg", i)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &copoly.InputError{Field: field, Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if v <= 0 {
			return &copoly.InputError{Field: field, Value: v, Reason: "a glass transition temperature in kelvin must be above 0 K (273.15 K = 0 °C)", Err: copoly.ErrOutOfRange}
		}
		if v > MaxTg {
			return &copoly.InputError{Field: field, Value: v, Reason: fmt.Sprintf("a glass transition above %d K is outside what resin handles", MaxTg), Err: copoly.ErrOutOfRange}
		}
	}
	return nil
}

// Fox returns the glass transition temperature in kelvin of a random copolymer with the mass
// fractions w of its monomer units and the glass transitions tg of their homopolymers (kelvin):
//
//	1/Tg = Σ_i w_i / Tg_i
//
// The equation ignores the sequence of the units, the molar mass (short chains have a lower Tg)
// and plasticizers; homopolymer Tg values differ by several kelvin between handbooks and
// methods. Errors name "w", "w[i]", "tg" or "tg[i]": the fractions must be finite, ≥ 0 and sum
// to 1 within SumTolerance; each Tg finite, above 0 K and at most MaxTg.
//
// References:
//   - T. G. Fox, Bull. Am. Phys. Soc. 1956, 1, 123.
func Fox(w, tg []float64) (float64, error) {
	if err := checkFractions("w", w, 0); err != nil {
		return 0, err
	}
	if err := checkTg(tg, len(w)); err != nil {
		return 0, err
	}
	return fox(w, tg), nil
}

// fox is Fox without validation.
func fox(w, tg []float64) float64 {
	var s float64
	for i, v := range w {
		s += v / tg[i]
	}
	return 1 / s
}

// MassFractions returns the mass fractions of units with mole fractions x and molar masses
// molarMass (g/mol): w_i = x_i M_i / Σ_j x_j M_j. Errors name "x", "x[i]", "molarMass" or
// "molarMass[i]".
func MassFractions(x, molarMass []float64) ([]float64, error) {
	if err := checkFractions("x", x, 0); err != nil {
		return nil, err
	}
	if err := checkMolarMasses(molarMass, len(x)); err != nil {
		return nil, err
	}
	w := make([]float64, len(x))
	massFractions(w, x, molarMass)
	return w, nil
}

// massFractions writes the mass fractions of x into w and returns the mass per mole of units.
func massFractions(w, x, molarMass []float64) float64 {
	var s float64
	for i, v := range x {
		w[i] = v * molarMass[i]
		s += w[i]
	}
	for i := range w {
		w[i] /= s
	}
	return s
}

// FoxMoles is [Fox] for mole fractions x of the units, converted with their molar masses
// (see [MassFractions]).
func FoxMoles(x, molarMass, tg []float64) (float64, error) {
	w, err := MassFractions(x, molarMass)
	if err != nil {
		return 0, err
	}
	if err := checkTg(tg, len(x)); err != nil {
		return 0, err
	}
	return fox(w, tg), nil
}

// TgDrift returns the Fox glass transition (kelvin) of the copolymer being formed (inst) and of
// all the copolymer made so far (cum) at each conversion of a batch drift, from their mole
// fractions (d.Inst, d.Cum), the monomers' molar masses and their homopolymers' Tg. Errors name
// "molarMass", "molarMass[i]", "tg" or "tg[i]".
func TgDrift(d *multi.Drift, molarMass, tg []float64) (inst, cum []float64, err error) {
	if len(d.Inst) == 0 {
		return []float64{}, []float64{}, nil
	}
	n := len(d.Inst[0])
	if err := checkMolarMasses(molarMass, n); err != nil {
		return nil, nil, err
	}
	if err := checkTg(tg, n); err != nil {
		return nil, nil, err
	}
	inst = make([]float64, len(d.Inst))
	cum = make([]float64, len(d.Cum))
	w := make([]float64, n)
	for k := range d.Inst {
		massFractions(w, d.Inst[k], molarMass)
		inst[k] = fox(w, tg)
		massFractions(w, d.Cum[k], molarMass)
		cum[k] = fox(w, tg)
	}
	return inst, cum, nil
}
