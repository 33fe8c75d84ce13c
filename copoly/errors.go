package copoly

import (
	"errors"
	"fmt"
	"math"
)

// Sentinel errors wrapped by [InputError] and [FieldError]; test for them with errors.Is. Each
// carries its code ([Code]).
var (
	// ErrNotFinite reports a NaN or infinite input.
	ErrNotFinite = NewSentinel(CodeNotANumber, "copoly: value is not a finite number")
	// ErrOutOfRange reports a finite input outside its valid domain.
	ErrOutOfRange = NewSentinel(CodeOutOfRange, "copoly: value out of range")
	// ErrTooMany reports an input array or count above the documented limit.
	ErrTooMany = NewSentinel(CodeTooMany, "copoly: too many values")
	// ErrUnreachable reports a target that no input can produce (for example a copolymer
	// composition outside the range a pair of reactivity ratios can give).
	ErrUnreachable = NewSentinel(CodeUnreachable, "copoly: target cannot be reached")
	// ErrMissing reports a required input that is absent (or null).
	ErrMissing = NewSentinel(CodeMissing, "copoly: value missing")
	// ErrWrongType reports a value of the wrong type, such as text where a number belongs, or
	// one that cannot be read.
	ErrWrongType = NewSentinel(CodeWrongType, "copoly: value has the wrong type")
	// ErrTooLong reports a text above its length limit.
	ErrTooLong = NewSentinel(CodeTooLong, "copoly: text too long")
)

// InputError reports an invalid input value. Field names the input as the JavaScript API and
// the page name it ("r1", "f1[3]", "conversion[0]", "project.monomer1.molarMass"), so the page
// can highlight it. Err is one of the sentinel errors above.
type InputError struct {
	Field  string
	Value  float64
	Reason string
	Err    error
}

func (e *InputError) Error() string {
	if math.IsNaN(e.Value) {
		return fmt.Sprintf("%s = NaN (not a number): %s", e.Field, e.Reason)
	}
	return fmt.Sprintf("%s = %g: %s", e.Field, e.Value, e.Reason)
}

func (e *InputError) Unwrap() error { return e.Err }

// FieldError is an [InputError] for a value that is not a number, such as text in a name field.
// It reports Reason with no value.
type FieldError struct {
	Field  string
	Reason string
	Err    error
}

func (e *FieldError) Error() string { return e.Field + ": " + e.Reason }

func (e *FieldError) Unwrap() error { return e.Err }

// Field returns the input field named by err when err is or wraps an [InputError] or a
// [FieldError], and "" otherwise.
func Field(err error) string {
	var ie *InputError
	if errors.As(err, &ie) {
		return ie.Field
	}
	var fe *FieldError
	if errors.As(err, &fe) {
		return fe.Field
	}
	return ""
}

// checkFinite is [CheckFinite], under the name the files written before it was exported use.
func checkFinite(field string, v float64) error { return CheckFinite(field, v) }

// CheckFinite returns an *InputError when v is NaN or infinite.
func CheckFinite(field string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &InputError{Field: field, Value: v, Reason: "must be a finite number", Err: ErrNotFinite}
	}
	return nil
}

// CheckFraction returns an *InputError unless 0 ≤ v ≤ 1.
func CheckFraction(field string, v float64) error {
	if v >= 0 && v <= 1 { // false for NaN: the common case stays small enough to inline
		return nil
	}
	return checkFractionError(field, v)
}

// checkFractionError is the error of CheckFraction for a v outside its range.
func checkFractionError(field string, v float64) error {
	if err := CheckFinite(field, v); err != nil {
		return err
	}
	if v < 0 || v > 1 {
		return &InputError{Field: field, Value: v, Reason: "a mole fraction must lie between 0 and 1", Err: ErrOutOfRange}
	}
	return nil
}

// CheckConversion returns an *InputError unless 0 ≤ v ≤ 1.
func CheckConversion(field string, v float64) error {
	if v >= 0 && v <= 1 { // false for NaN: the common case stays small enough to inline
		return nil
	}
	return checkConversionError(field, v)
}

// checkConversionError is the error of CheckConversion for a v outside its range.
func checkConversionError(field string, v float64) error {
	if err := CheckFinite(field, v); err != nil {
		return err
	}
	if v < 0 || v > 1 {
		return &InputError{Field: field, Value: v, Reason: "a conversion must lie between 0 and 1 (0 % to 100 %)", Err: ErrOutOfRange}
	}
	return nil
}

// CheckRatio returns an *InputError unless v is a finite reactivity ratio ≥ 0 and not absurdly
// large (above [MaxRatio]).
func CheckRatio(field string, v float64) error {
	if v >= 0 && v <= MaxRatio { // false for NaN: the common case stays small enough to inline
		return nil
	}
	return checkRatioError(field, v)
}

// checkRatioError is the error of CheckRatio for a v outside its range.
func checkRatioError(field string, v float64) error {
	if err := CheckFinite(field, v); err != nil {
		return err
	}
	if v < 0 {
		return &InputError{Field: field, Value: v, Reason: "a reactivity ratio cannot be negative", Err: ErrOutOfRange}
	}
	if v > MaxRatio {
		return &InputError{Field: field, Value: v, Reason: fmt.Sprintf("a reactivity ratio above %g is outside what copoly handles", float64(MaxRatio)), Err: ErrOutOfRange}
	}
	return nil
}

// CheckMolarMass returns an *InputError unless v is a positive molar mass in g/mol below 10⁶.
func CheckMolarMass(field string, v float64) error {
	if err := CheckFinite(field, v); err != nil {
		return err
	}
	if v <= 0 || v >= 1e6 {
		return &InputError{Field: field, Value: v, Reason: "a molar mass must be positive, in g/mol", Err: ErrOutOfRange}
	}
	return nil
}
