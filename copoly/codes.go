package copoly

import (
	"errors"
	"math"
	"regexp"
	"strconv"
)

// Codes of errors and warnings: a short word for what went wrong, stable across releases and
// wording, for a program to act on (the page words its messages from them). Every sentinel error
// of copoly and its packages carries one ([NewSentinel]); [Code] finds it in any error that
// wraps the sentinel, and warnings carry theirs in a Code field. This is the whole set.
const (
	// Errors about an input value.
	CodeNotANumber  = "not-a-number" // NaN or ±Infinity, or text that is not a number
	CodeOutOfRange  = "out-of-range" // a number outside its valid domain
	CodeTooMany     = "too-many"     // a list, table or count above its limit
	CodeTooLong     = "too-long"     // a text above its length limit
	CodeUnreachable = "unreachable"  // a target no input can give
	CodeMissing     = "missing"      // a required input absent or null
	CodeWrongType   = "wrong-type"   // a value of the wrong kind (text for a number, …)
	CodeNotAllowed  = "not-allowed"  // a word not among those a field accepts
	CodeNotATable   = "not-a-table"  // pasted text that cannot be read as a table
	// Errors about a project file and its storage.
	CodeNotAProject  = "not-a-project" // a file or object that is not a copoly project
	CodeNewerVersion = "newer-version" // a project made by a newer copoly
	CodeDamaged      = "damaged"       // stored projects that can no longer be read
	CodeNoCopy       = "no-copy"       // no kept copy of that name
	CodeStorage      = "storage"       // browser storage failed to read or write
	CodeNotStored    = "not-stored"    // the browser did not keep what was written
	CodeStorageFull  = "storage-full"  // the browser's storage for the page is full
	CodeUnavailable  = "unavailable"   // no browser storage here
	CodeBusy         = "busy"          // an earlier storage call did not finish in time
	CodeInternal     = "internal"      // a fault of copoly itself, not of the input
	// Warnings about bench data (copoly.CheckRuns).
	CodeMassBalance   = "mass-balance"   // the copolymer holds more of a monomer than was charged
	CodeDuplicate     = "duplicate"      // a row repeats an earlier one
	CodeNoInformation = "no-information" // a row that says nothing about a ratio (f10, F1 at 0 or 1, X = 1)
	CodeFewFeeds      = "few-feeds"      // fewer different feeds than an estimate needs
	// Warnings of the estimators (copoly/fit); a method that could not run has its error's code.
	CodeHighConversion  = "high-conversion"  // a run too far converted for the linear methods
	CodeOpenRegion      = "open-region"      // the joint confidence region is not bounded
	CodeAtBound         = "at-bound"         // a ratio of the best fit sits at 0
	CodePartlyWeighted  = "partly-weighted"  // uncertainties given for some runs only
	CodeScatter         = "scatter"          // the scatter does not match the uncertainties given
	CodeTrend           = "trend"            // the residuals trend with the feed or the conversion
	CodeNoUncertainties = "no-uncertainties" // error-in-variables needs every uncertainty
	CodeNotShown        = "not-shown"        // a result that is not a finite number, left out
)

// Codes returns every code, in the order of their declaration.
func Codes() []string {
	return []string{CodeNotANumber, CodeOutOfRange, CodeTooMany, CodeTooLong, CodeUnreachable,
		CodeMissing, CodeWrongType, CodeNotAllowed, CodeNotATable,
		CodeNotAProject, CodeNewerVersion, CodeDamaged, CodeNoCopy, CodeStorage, CodeNotStored,
		CodeStorageFull, CodeUnavailable, CodeBusy, CodeInternal,
		CodeMassBalance, CodeDuplicate, CodeNoInformation, CodeFewFeeds,
		CodeHighConversion, CodeOpenRegion, CodeAtBound, CodePartlyWeighted, CodeScatter, CodeTrend,
		CodeNoUncertainties, CodeNotShown}
}

// sentinel is an error value with a code.
type sentinel struct{ code, text string }

func (s *sentinel) Error() string { return s.text }

// Code returns the code of the sentinel.
func (s *sentinel) Code() string { return s.code }

// NewSentinel returns a sentinel error with the message text and the code (one of the Code
// constants), for the sentinels of copoly's packages; test for it with errors.Is as usual.
func NewSentinel(code, text string) error { return &sentinel{code: code, text: text} }

// Code returns the code of err: that of the first sentinel it wraps ([NewSentinel]), or
// [CodeInternal] for an error that wraps none (a fault of copoly, not of the input).
func Code(err error) string {
	var c interface{ Code() string }
	if errors.As(err, &c) {
		return c.Code()
	}
	return CodeInternal
}

// Parts are the parts of an error, as [encoding/csv.ParseError] has them, for a program that
// words its own message or highlights a field.
type Parts struct {
	// Message is the whole message, err.Error(): a sentence for people and scripts.
	Message string
	// Field names the input at fault as the page names it ([Field]); "" when none.
	Field string
	// Code is the error's code ([Code]).
	Code string
	// Reason is the message without the field and value: the Reason of an [InputError] or a
	// [FieldError], or the whole message of another error.
	Reason string
	// Value is the offending number of an [InputError] (HasValue true), which may be NaN or
	// infinite.
	Value    float64
	HasValue bool
	// Row is the 0-based row of the table the field lies in, for the rows of a bench table and
	// the runs of a fit ("runs[3].f10", "bench.rows[3].label"); HasRow is false for other fields.
	Row    int
	HasRow bool
}

// rowField finds the row in a field: the index of the first "runs[i]" or "rows[i]".
var rowField = regexp.MustCompile(`(?:^|\.)(?:runs|rows)\[(\d+)\]`)

// PartsOf returns the parts of err.
func PartsOf(err error) Parts {
	p := Parts{Message: err.Error(), Field: Field(err), Code: Code(err), Reason: err.Error()}
	var ie *InputError
	var fe *FieldError
	switch {
	case errors.As(err, &ie):
		p.Reason, p.Value, p.HasValue = ie.Reason, ie.Value, true
	case errors.As(err, &fe):
		p.Reason = fe.Reason
	}
	if m := rowField.FindStringSubmatch(p.Field); m != nil {
		if r, err := strconv.Atoi(m[1]); err == nil && r < math.MaxInt32 {
			p.Row, p.HasRow = r, true
		}
	}
	return p
}
