package resin

import (
	"fmt"
	"math"

	"copoly/copoly"
)

// MolarMassKOH is the molar mass of potassium hydroxide in g/mol, from the IUPAC standard atomic
// weights through copoly.MolarMassOf("KOH"). While copoly's table lacks potassium, it is the sum
// of the abridged standard atomic weights K 39.098 (from memory), O 15.999 and H 1.008 (IUPAC,
// Pure Appl. Chem. 2022, 94, 573, Table 2): 56.105.
var MolarMassKOH = func() float64 {
	if m, err := copoly.MolarMassOf("KOH"); err == nil {
		return m
	}
	return 39.098 + 15.999 + 1.008
}()

// MaxGroups is the largest number of functional groups per monomer unit accepted.
const MaxGroups = 100

// checkGroups validates the groups per unit (finite, 0…MaxGroups), named groups[i].
func checkGroups(groups []float64, n int) error {
	if err := checkCount("groups", groups, n); err != nil {
		return err
	}
	for i, v := range groups {
		field := indexName("groups", i)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &copoly.InputError{Field: field, Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if v < 0 || v > MaxGroups {
			return &copoly.InputError{Field: field, Value: v, Reason: fmt.Sprintf("groups per monomer unit must lie between 0 and %d", MaxGroups), Err: copoly.ErrOutOfRange}
		}
	}
	return nil
}

// equivalents returns Σ n_i w_i / M_i, the moles of groups per gram of polymer, after
// validating w (mass fractions of the units), groups (n_i per unit) and molarMass (M_i, g/mol).
func equivalents(w, groups, molarMass []float64) (float64, error) {
	if err := checkFractions("w", w, 0); err != nil {
		return 0, err
	}
	if err := checkGroups(groups, len(w)); err != nil {
		return 0, err
	}
	if err := checkMolarMasses(molarMass, len(w)); err != nil {
		return 0, err
	}
	var s float64
	for i, v := range w {
		s += groups[i] * v / molarMass[i]
	}
	return s, nil
}

// HydroxylValue returns the hydroxyl value of a copolymer in mg KOH per g: the mass of KOH
// equivalent to its hydroxyl groups per gram,
//
//	OHV = 1000 · M(KOH) · Σ_i n_i w_i / M_i
//
// with w_i the mass fraction of monomer i's units, n_i its OH groups per unit and M_i its molar
// mass (g/mol); M(KOH) is MolarMassKOH. It is the value of the polymer as made, all groups
// free; a titration measures it (ISO 4629-1:2016, Binders for paints and varnishes —
// Determination of hydroxyl value — Part 1: Titrimetric method without using a catalyst; Part 2
// (ISO 4629-2:2016) with a catalyst). Errors name "w", "w[i]", "groups", "groups[i]",
// "molarMass" or "molarMass[i]".
func HydroxylValue(w, groups, molarMass []float64) (float64, error) {
	s, err := equivalents(w, groups, molarMass)
	return 1000 * MolarMassKOH * s, err
}

// AcidValue returns the acid value of a copolymer in mg KOH per g, from the carboxylic acid
// groups per unit n_i (1 for acrylic or methacrylic acid):
//
//	AV = 1000 · M(KOH) · Σ_i n_i w_i / M_i
//
// as for [HydroxylValue]; a titration measures it (ISO 2114:2000, Plastics (polyester resins)
// and paints and varnishes (binders) — Determination of partial acid value and total acid
// value). An anhydride unit titrates as two acid groups in the total acid value and as one in
// the partial acid value; give n_i accordingly. Errors as for HydroxylValue.
func AcidValue(w, groups, molarMass []float64) (float64, error) {
	return HydroxylValue(w, groups, molarMass)
}

// EquivalentWeight returns the mass of copolymer per mole of functional groups, g/mol:
//
//	EW = 1 / Σ_i n_i w_i / M_i
//
// (56 105 / OHV for hydroxyl groups). A copolymer without groups gives an error naming
// "groups". Other errors as for [HydroxylValue].
func EquivalentWeight(w, groups, molarMass []float64) (float64, error) {
	s, err := equivalents(w, groups, molarMass)
	if err != nil {
		return 0, err
	}
	if s == 0 {
		return 0, &copoly.FieldError{Field: "groups", Reason: "the copolymer has no functional groups: its equivalent weight is infinite", Err: copoly.ErrOutOfRange}
	}
	return 1 / s, nil
}
