package copoly

import (
	"fmt"
	"math"
)

// Penultimate is the explicit penultimate model: the rate at which a chain adds a monomer depends
// on the last two units at its radical end. With kijk the rate coefficient of a chain ending in
// i j adding k, its monomer reactivity ratios are
//
//	r11 = k111/k112,  r21 = k211/k212,  r22 = k222/k221,  r12 = k122/k121
//
// It reduces to the terminal model when r11 = r21 (= r1) and r22 = r12 (= r2), which is also
// the composition and sequence of the implicit penultimate model (see [Implicit]).
//
// References:
//   - E. Merz, T. Alfrey, G. Goldfinger, J. Polym. Sci. 1946, 1, 75 (from memory).
//   - T. Fukuda, Y.-D. Ma, H. Inagaki, Macromolecules 1985, 18, 17 (effective ratios; from
//     memory).
type Penultimate struct {
	R11, R21, R22, R12 float64
}

// Validate returns an [*InputError] naming "r11", "r21", "r22" or "r12" for a ratio that is
// negative, not finite or above [MaxRatio].
func (m Penultimate) Validate() error {
	for _, c := range []struct {
		field string
		v     float64
	}{{"r11", m.R11}, {"r21", m.R21}, {"r22", m.R22}, {"r12", m.R12}} {
		if err := CheckRatio(c.field, c.v); err != nil {
			return err
		}
	}
	return nil
}

// Effective returns the effective terminal ratios at feed f1, with which the Mayo–Lewis
// equation gives the penultimate composition:
//
//	r̄1 = r21 (f1 r11 + f2)/(f1 r21 + f2),  r̄2 = r12 (f2 r22 + f1)/(f2 r12 + f1)
//
// References:
//   - T. Fukuda, Y.-D. Ma, H. Inagaki, Macromolecules 1985, 18, 17 (from memory).
func (m Penultimate) Effective(f1 float64) (r1, r2 float64) {
	f2 := 1 - f1
	if d := f1*m.R21 + f2; d > 0 {
		r1 = m.R21 * (f1*m.R11 + f2) / d
	} else { // f1 = 1 and r21 = 0
		r1 = m.R11
	}
	if d := f2*m.R12 + f1; d > 0 {
		r2 = m.R12 * (f2*m.R22 + f1) / d
	} else {
		r2 = m.R22
	}
	return r1, r2
}

// Instantaneous returns the copolymer composition F1 at feed f1 by the Merz–Alfrey–Goldfinger
// equation, written as the Mayo–Lewis equation with the effective ratios of
// [Penultimate.Effective].
func (m Penultimate) Instantaneous(f1 float64) float64 {
	r1, r2 := m.Effective(f1)
	return Terminal{r1, r2}.Instantaneous(f1)
}

// transitions returns the second-order Markov probabilities Pijk that a chain ending in i j adds
// k, at feed ratio x = f1/f2:
//
//	P111 = r11 x/(1 + r11 x),  P211 = r21 x/(1 + r21 x)
//	P222 = r22/(r22 + x),      P122 = r12/(r12 + x)
func (m Penultimate) transitions(f1 float64) (p111, p211, p222, p122 float64) {
	f2 := 1 - f1
	div := func(a, b float64) float64 {
		if b == 0 {
			return 0
		}
		return a / b
	}
	p111 = div(m.R11*f1, m.R11*f1+f2)
	p211 = div(m.R21*f1, m.R21*f1+f2)
	p222 = div(m.R22*f2, m.R22*f2+f1)
	p122 = div(m.R12*f2, m.R12*f2+f1)
	return
}

// Sequence returns the sequence statistics of the copolymer formed at feed f1 under the
// penultimate model, a second-order Markov chain. The stationary dyad states satisfy
// N11 = N21 P211/P112, N22 = N12 P122/P221 and N12 = N21; then F1 = N11 + N21 and
//
//	T111 = N11 P111,  T112+211 = N11 P112 + N21 P211,  T212 = N21 P212
//	T222 = N22 P222,  T221+122 = N22 P221 + N12 P122,  T121 = N12 P121
//
// divided by F1 and F2 for the monomer-centred triads of [Sequence]. n̄1 = F1/N21 and
// n̄2 = F2/N12; the P fields are the first-order probabilities of the averaged chain
// (P11 = N11/F1, P21 = N21/F2).
//
// References:
//   - J. L. Koenig, Chemical Microstructure of Polymer Chains, Wiley 1980 (from memory).
//   - D. J. T. Hill, J. H. O'Donnell, P. W. O'Sullivan, Macromolecules 1982, 15, 960 (from memory).
func (m Penultimate) Sequence(f1 float64) (Sequence, error) {
	if err := m.Validate(); err != nil {
		return Sequence{}, err
	}
	if err := CheckFraction("f1", f1); err != nil {
		return Sequence{}, err
	}
	if f1 == 0 || f1 == 1 {
		// A homopolymer (or the alternating limit): the terminal-model chain at the effective
		// ratios has the same limits.
		r1, r2 := m.Effective(f1)
		return Terminal{r1, r2}.sequence(f1), nil
	}
	p111, p211, p222, p122 := m.transitions(f1)
	p112, p212, p221, p121 := 1-p111, 1-p211, 1-p222, 1-p122
	// Unnormalised stationary states with N21 = N12 = 1.
	n21, n12 := 1.0, 1.0
	var n11, n22 float64
	if p112 > 0 {
		n11 = p211 / p112
	} else {
		n11 = math.Inf(1)
	}
	if p221 > 0 {
		n22 = p122 / p221
	} else {
		n22 = math.Inf(1)
	}
	if math.IsInf(n11, 0) || math.IsInf(n22, 0) {
		// A monomer that only adds to itself once started: blocks without end.
		r1, r2 := m.Effective(f1)
		return Terminal{r1, r2}.sequence(f1), nil
	}
	sum := n11 + n12 + n21 + n22
	n11, n12, n21, n22 = n11/sum, n12/sum, n21/sum, n22/sum
	s := Sequence{F1: n11 + n21, D11: n11, D12: n12 + n21, D22: n22}
	F2 := 1 - s.F1
	s.T111 = n11 * p111 / s.F1
	s.T112 = (n11*p112 + n21*p211) / s.F1
	s.T212 = n21 * p212 / s.F1
	s.T222 = n22 * p222 / F2
	s.T221 = (n22*p221 + n12*p122) / F2
	s.T121 = n12 * p121 / F2
	s.P11, s.P21 = n11/s.F1, n21/F2
	s.P12, s.P22 = 1-s.P11, 1-s.P21
	s.MeanLength1, s.MeanLength2 = s.F1/n21, F2/n12
	s.RunNumber = 100 * s.D12
	s.Randomness = s.P12 + s.P21
	return s, nil
}

// Implicit is the implicit penultimate model: monomer reactivity ratios r1, r2 as in the
// terminal model (r11 = r21 = r1, r22 = r12 = r2), so composition and sequence are terminal, but
// radical reactivity ratios s1 = k211/k111 and s2 = k122/k222 that change the mean propagation
// rate coefficient (see [Implicit.MeanPropagation]).
//
// References:
//   - T. Fukuda, Y.-D. Ma, H. Inagaki, Macromolecules 1985, 18, 17 (from memory).
//   - Radical reactivity ratios s1 = k211/k111, s2 = k122/k222: Macromolecules 2002, 35, 8209
//     (abstract).
type Implicit struct {
	R1, R2, S1, S2 float64
}

// Validate returns an [*InputError] naming "r1", "r2", "s1" or "s2".
func (m Implicit) Validate() error {
	if err := (Terminal{m.R1, m.R2}).Validate(); err != nil {
		return err
	}
	for _, c := range []struct {
		field string
		v     float64
	}{{"s1", m.S1}, {"s2", m.S2}} {
		if err := CheckRatio(c.field, c.v); err != nil {
			return err
		}
		if c.v == 0 {
			return &InputError{Field: c.field, Value: 0, Reason: "a radical reactivity ratio must be positive", Err: ErrOutOfRange}
		}
	}
	return nil
}

// Penultimate returns the equivalent explicit model (r11 = r21 = r1, r22 = r12 = r2).
func (m Implicit) Penultimate() Penultimate { return Penultimate{m.R1, m.R1, m.R2, m.R2} }

// Instantaneous returns F1 at feed f1: the terminal Mayo–Lewis composition.
func (m Implicit) Instantaneous(f1 float64) float64 { return Terminal{m.R1, m.R2}.Instantaneous(f1) }

// Sequence returns the sequence statistics of the copolymer formed at feed f1: those of the
// equivalent explicit model ([Implicit.Penultimate]), which are the terminal model's (the radical
// reactivity ratios change the rate, not the chain).
func (m Implicit) Sequence(f1 float64) (Sequence, error) {
	if err := m.Validate(); err != nil {
		return Sequence{}, err
	}
	return m.Penultimate().Sequence(f1)
}

// MeanPropagation returns the mean propagation rate coefficient k̄p at feed f1, in the units of
// the homopropagation coefficients k111 and k222:
//
//	k̄p = (r1 f1² + 2 f1 f2 + r2 f2²) / (r1 f1/k̄11 + r2 f2/k̄22)
//	k̄11 = k111 (r1 f1 + f2)/(r1 f1 + f2/s1),  k̄22 = k222 (r2 f2 + f1)/(r2 f2 + f1/s2)
//
// With s1 = s2 = 1 it is the terminal-model mean.
//
// References:
//   - T. Fukuda, Y.-D. Ma, H. Inagaki, Macromolecules 1985, 18, 17 (from memory).
func (m Implicit) MeanPropagation(f1, k111, k222 float64) (float64, error) {
	if err := m.Validate(); err != nil {
		return 0, err
	}
	if err := CheckFraction("f1", f1); err != nil {
		return 0, err
	}
	for _, c := range []struct {
		field string
		v     float64
	}{{"k111", k111}, {"k222", k222}} {
		if err := CheckFinite(c.field, c.v); err != nil {
			return 0, err
		}
		if c.v <= 0 {
			return 0, &InputError{Field: c.field, Value: c.v, Reason: "a rate coefficient must be positive", Err: ErrOutOfRange}
		}
	}
	f2 := 1 - f1
	k11 := k111 * (m.R1*f1 + f2) / (m.R1*f1 + f2/m.S1)
	k22 := k222 * (m.R2*f2 + f1) / (m.R2*f2 + f1/m.S2)
	num := m.R1*f1*f1 + 2*f1*f2 + m.R2*f2*f2
	den := m.R1*f1/k11 + m.R2*f2/k22
	if den == 0 {
		return 0, &FieldError{Field: "f1", Reason: fmt.Sprintf("no propagation at f1 = %g with these ratios", f1), Err: ErrOutOfRange}
	}
	return num / den, nil
}
