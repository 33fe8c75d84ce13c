package project

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"copoly/copoly"
)

// Limits on the user's own monomers. They keep a project file small; they are design choices of
// copoly. Names share MaxNameLength with the project's monomers, notes MaxSourceLength.
const (
	MaxUserMonomers    = 100  // entries of Project.UserMonomers
	MaxHazards         = 20   // hazards of one user monomer
	MaxHazardLength    = 100  // characters in one hazard
	MaxUserDensity     = 25   // g/mL: the largest density plan.Make takes
	MaxUserHeat        = 1000 // kJ/mol: the largest heat of polymerization plan.Make takes
	MaxUserDensityTemp = 1000 // °C
)

// UserMonomer is a monomer the user added to the library, saved with the project. It holds the
// same process data as a built-in monomer (copoly.Monomers, copoly.PropertiesOf, copoly.QEOf),
// with the user as the source. Every number is optional: 0 means not given, except E, which
// counts only when Q is given (Q > 0) and may be negative.
type UserMonomer struct {
	// Name is required, at most MaxNameLength characters, and differs (ignoring case and
	// surrounding spaces) from the name of every other user monomer of the project.
	Name string `json:"name" project:"required"`
	// MolarMass in g/mol; when given it must pass copoly.CheckMolarMass.
	MolarMass float64 `json:"molarMass"`
	// Density in g/mL (at most MaxUserDensity) at DensityTemp °C (at most MaxUserDensityTemp).
	Density     float64 `json:"density"`
	DensityTemp float64 `json:"densityTemp"`
	// State is copoly.StateLiquid, StateGas, StateSolid or "" (not given).
	State string `json:"state"`
	// Heat is the heat of polymerization −ΔHp in kJ/mol, at most MaxUserHeat.
	Heat float64 `json:"heat"`
	// Q and E are the Alfrey–Price Q–e values.
	Q float64 `json:"q"`
	E float64 `json:"e"`
	// Hazards are copoly's hazard words (copoly.HazardFlammable, …) or the user's own, each at
	// most MaxHazardLength characters and not blank; at most MaxHazards of them.
	Hazards []string `json:"hazards"`
	// Note is free text (where the values come from), at most MaxSourceLength characters.
	Note string `json:"note"`
}

// userStates are the words UserMonomer.State accepts; "" means not given.
var userStates = []string{"", copoly.StateLiquid, copoly.StateGas, copoly.StateSolid}

// checkUserMonomers reports the first invalid entry of ms as an error whose field starts with
// field ("project.userMonomers[2].density"), or nil.
func checkUserMonomers(field string, ms []UserMonomer) error {
	if n := len(ms); n > MaxUserMonomers {
		return &copoly.InputError{Field: field, Value: float64(n), Reason: fmt.Sprintf("at most %d monomers of your own", MaxUserMonomers), Err: copoly.ErrTooMany}
	}
	seen := make(map[string]int, len(ms))
	for i, m := range ms {
		f := fmt.Sprintf("%s[%d]", field, i)
		key := strings.ToLower(strings.TrimSpace(m.Name))
		if key == "" {
			return &copoly.FieldError{Field: f + ".name", Reason: "is empty: a monomer of your own needs a name", Err: ErrMissing}
		}
		if err := checkText(f+".name", m.Name, MaxNameLength); err != nil {
			return err
		}
		if j, ok := seen[key]; ok {
			return &copoly.FieldError{Field: f + ".name", Reason: fmt.Sprintf("%q is already the name of %s[%d]; give each monomer its own name", m.Name, field, j), Err: ErrNotAllowed}
		}
		seen[key] = i
		if err := checkUserMonomer(f, m); err != nil {
			return err
		}
	}
	return nil
}

// checkUserMonomer checks every value of m but its name.
func checkUserMonomer(f string, m UserMonomer) error {
	if m.MolarMass != 0 {
		if err := copoly.CheckMolarMass(f+".molarMass", m.MolarMass); err != nil {
			return err
		}
	}
	for _, n := range []struct {
		name string
		v    float64
		max  float64 // 0: no upper limit
		unit string
	}{
		{"density", m.Density, MaxUserDensity, "g/mL"},
		{"densityTemp", m.DensityTemp, MaxUserDensityTemp, "°C"},
		{"heat", m.Heat, MaxUserHeat, "kJ/mol"},
		{"q", m.Q, 0, ""},
		{"e", m.E, 0, ""},
	} {
		field := f + "." + n.name
		if math.IsNaN(n.v) || math.IsInf(n.v, 0) {
			return &copoly.InputError{Field: field, Value: n.v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if n.v < 0 && n.name != "e" {
			return &copoly.InputError{Field: field, Value: n.v, Reason: "cannot be negative (0 = not given)", Err: copoly.ErrOutOfRange}
		}
		if n.max > 0 && n.v > n.max {
			return &copoly.InputError{Field: field, Value: n.v, Reason: fmt.Sprintf("is in %s, at most %g", n.unit, n.max), Err: copoly.ErrOutOfRange}
		}
	}
	if err := checkText(f+".state", m.State, MaxPlanWordLength); err != nil {
		return err
	}
	if !slices.Contains(userStates, m.State) {
		return &copoly.FieldError{Field: f + ".state", Reason: fmt.Sprintf("is %q; it must be one of %s, or empty", m.State, quoteAll(userStates[1:])), Err: ErrNotAllowed}
	}
	if n := len(m.Hazards); n > MaxHazards {
		return &copoly.InputError{Field: f + ".hazards", Value: float64(n), Reason: fmt.Sprintf("at most %d hazards per monomer", MaxHazards), Err: copoly.ErrTooMany}
	}
	for k, h := range m.Hazards {
		hf := fmt.Sprintf("%s.hazards[%d]", f, k)
		if strings.TrimSpace(h) == "" {
			return &copoly.FieldError{Field: hf, Reason: "is blank: name the hazard or leave it out", Err: ErrMissing}
		}
		if err := checkText(hf, h, MaxHazardLength); err != nil {
			return err
		}
	}
	return checkText(f+".note", m.Note, MaxSourceLength)
}
