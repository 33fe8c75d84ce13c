package copoly

import (
	"errors"
	"fmt"
	"go/ast"
	"go/parser"
	"go/token"
	"math"
	"regexp"
	"slices"
	"strings"
	"testing"
)

// TestCodes: Codes lists every Code constant of codes.go once, each a short lower-case word
// (kebab case: common practice, no source).
func TestCodes(t *testing.T) {
	f, err := parser.ParseFile(token.NewFileSet(), "codes.go", nil, 0)
	if err != nil {
		t.Fatal(err)
	}
	var declared []string
	for _, d := range f.Decls {
		if g, ok := d.(*ast.GenDecl); ok && g.Tok == token.CONST {
			for _, s := range g.Specs {
				for _, n := range s.(*ast.ValueSpec).Names {
					declared = append(declared, n.Name)
				}
			}
		}
	}
	codes := Codes()
	if len(declared) != len(codes) {
		t.Errorf("codes.go declares %d codes %v, Codes() lists %d", len(declared), declared, len(codes))
	}
	word := regexp.MustCompile(`^[a-z]+(-[a-z]+)*$`)
	seen := map[string]bool{}
	for _, c := range codes {
		if !word.MatchString(c) || seen[c] {
			t.Errorf("code %q is repeated or not a kebab-case word", c)
		}
		seen[c] = true
	}
}

// TestCodeOfSentinels: each sentinel carries its code, found through the errors that wrap it;
// an error wrapping none is internal.
func TestCodeOfSentinels(t *testing.T) {
	for _, c := range []struct {
		err  error
		code string
	}{
		{ErrNotFinite, CodeNotANumber}, {ErrOutOfRange, CodeOutOfRange}, {ErrTooMany, CodeTooMany},
		{ErrUnreachable, CodeUnreachable}, {ErrMissing, CodeMissing}, {ErrWrongType, CodeWrongType},
		{ErrTooLong, CodeTooLong},
	} {
		wrapped := fmt.Errorf("context: %w", &InputError{Field: "r1", Value: 1, Reason: "why", Err: c.err})
		if got := Code(wrapped); got != c.code || !errors.Is(wrapped, c.err) {
			t.Errorf("Code(%v) = %q, want %q", wrapped, got, c.code)
		}
	}
	if got := Code(errors.New("boom")); got != CodeInternal {
		t.Errorf("Code(a plain error) = %q, want %q", got, CodeInternal)
	}
}

// TestPartsOf: the parts of an InputError, a FieldError and a plain error, with the row of a
// table found in the field.
func TestPartsOf(t *testing.T) {
	_, err := Terminal{R1: math.NaN(), R2: 1}.FeedFor(0.5)
	p := PartsOf(err)
	if p.Field != "r1" || p.Code != CodeNotANumber || p.Reason != "must be a finite number" || !p.HasValue || !math.IsNaN(p.Value) ||
		p.HasRow || p.Message != err.Error() || !strings.HasSuffix(p.Message, ": "+p.Reason) {
		t.Errorf("PartsOf(%v) = %+v", err, p)
	}
	fe := &FieldError{Field: "bench.rows[12].cells", Reason: "has a cell keyed \"x\"", Err: ErrWrongType}
	if p := PartsOf(fe); p.Reason != fe.Reason || p.HasValue || !p.HasRow || p.Row != 12 || p.Code != CodeWrongType {
		t.Errorf("PartsOf(%v) = %+v", fe, p)
	}
	ie := &InputError{Field: "runs[3].f10", Value: 1.5, Reason: "out", Err: ErrOutOfRange}
	if p := PartsOf(ie); p.Row != 3 || !p.HasRow || p.Value != 1.5 {
		t.Errorf("PartsOf(%v) = %+v", ie, p)
	}
	for _, field := range []string{"f1[3]", "conversion[2]", "myruns[1]", "project.jcr[0][1]"} {
		if p := PartsOf(&FieldError{Field: field, Reason: "r", Err: ErrOutOfRange}); p.HasRow {
			t.Errorf("PartsOf(field %s) has row %d, want none", field, p.Row)
		}
	}
	plain := errors.New("boom")
	if p := PartsOf(plain); p.Reason != "boom" || p.Field != "" || p.Code != CodeInternal {
		t.Errorf("PartsOf(plain) = %+v", p)
	}
}

// TestCheckRunsCodes: each kind of run warning has its code.
func TestCheckRunsCodes(t *testing.T) {
	runs := []Run{
		{F10: 0.2, Conversion: 0.5, F1: 0.9},     // F1·X = 0.45 > f10: mass balance
		{F10: 0.5, F1: 0.5}, {F10: 0.5, F1: 0.5}, // a copied row
		{F10: 1, F1: 1}, // M1 alone
	}
	var codes []string
	for _, w := range CheckRuns(runs) {
		codes = append(codes, w.Code)
	}
	for _, want := range []string{CodeMassBalance, CodeDuplicate, CodeNoInformation, CodeFewFeeds} {
		if !slices.Contains(codes, want) {
			t.Errorf("CheckRuns codes %v lack %s", codes, want)
		}
	}
}
