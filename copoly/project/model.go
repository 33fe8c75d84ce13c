package project

import (
	"fmt"
	"math"
	"slices"

	"copoly/copoly"
)

// Model kinds: the values of Model.Kind and of the "model" option of the JavaScript API
// (site/copoly.d.ts, ModelArgs).
const (
	ModelTerminal    = "terminal"    // copoly.Terminal: r1, r2 (the project's R1 and R2)
	ModelPenultimate = "penultimate" // copoly.Penultimate: r11, r21, r22, r12
	ModelImplicit    = "implicit"    // copoly.Implicit: r1, r2 and s1, s2
)

// ModelKinds lists the model kinds in the order the page offers them.
var ModelKinds = []string{ModelTerminal, ModelPenultimate, ModelImplicit}

// Model is the copolymerization model the sequences panel uses, as the user left it. The
// terminal and implicit models take r1 and r2 from the project (Project.R1, Project.R2); the
// other ratios are kept here. Every ratio is optional (nil = not typed), and each is kept
// whatever the kind, so switching kinds on the page loses nothing. CheckModel accepts any finite
// number ≥ 0; whether the ratios make a model is for copoly to say when it is used.
type Model struct {
	// Kind is ModelTerminal, ModelPenultimate or ModelImplicit.
	Kind string `json:"kind" project:"required"`
	// R11, R21, R22 and R12 are the monomer reactivity ratios of the explicit penultimate model,
	// r11 = k111/k112, r21 = k211/k212, r22 = k222/k221, r12 = k122/k121 (copoly.Penultimate).
	R11 *float64 `json:"r11,omitempty"`
	R21 *float64 `json:"r21,omitempty"`
	R22 *float64 `json:"r22,omitempty"`
	R12 *float64 `json:"r12,omitempty"`
	// S1 and S2 are the radical reactivity ratios of the implicit penultimate model,
	// s1 = k211/k111 and s2 = k122/k222 (copoly.Implicit).
	S1 *float64 `json:"s1,omitempty"`
	S2 *float64 `json:"s2,omitempty"`
}

// CheckModel reports the first invalid value of m as an error whose field starts with field
// ("project.model.kind", "project.model.r11"), or nil.
func CheckModel(field string, m Model) error {
	if err := checkText(field+".kind", m.Kind, MaxPlanWordLength); err != nil {
		return err
	}
	if !slices.Contains(ModelKinds, m.Kind) {
		return &copoly.FieldError{Field: field + ".kind", Reason: fmt.Sprintf("is %q; it must be %q, %q or %q", m.Kind, ModelTerminal, ModelPenultimate, ModelImplicit), Err: ErrNotAllowed}
	}
	for _, r := range []struct {
		name string
		v    *float64
	}{{"r11", m.R11}, {"r21", m.R21}, {"r22", m.R22}, {"r12", m.R12}, {"s1", m.S1}, {"s2", m.S2}} {
		if r.v == nil {
			continue
		}
		if err := checkNonNegative(field+"."+r.name, *r.v, "a reactivity ratio cannot be negative"); err != nil {
			return err
		}
	}
	return nil
}

// checkNonNegative reports a v that is not finite, or negative (with why).
func checkNonNegative(field string, v float64, why string) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &copoly.InputError{Field: field, Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
	}
	if v < 0 {
		return &copoly.InputError{Field: field, Value: v, Reason: why, Err: copoly.ErrOutOfRange}
	}
	return nil
}
