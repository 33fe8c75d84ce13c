package bench

import (
	"copoly/copoly"
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"
)

func TestParseNumber(t *testing.T) {
	for _, c := range parseNumberTests {
		t.Run(c.name, func(t *testing.T) {
			got, err := ParseNumber(c.in)
			if err != nil || got != c.want || math.Signbit(got) != math.Signbit(c.want) {
				t.Errorf("ParseNumber(%q) = %v, %v, want %v", c.in, got, err, c.want)
			}
		})
	}
	// A percentage is divided by 100 in its decimal text, so it is the float64 nearest the
	// decimal value, exactly as strconv reads "0.123"; 12.3/100 in floating point is not.
	if got, _ := ParseNumber("12.3%"); got != 0.123 {
		t.Errorf(`ParseNumber("12.3%%") = %v, want 0.123 exactly`, got)
	}
}

func TestParseNumberErrors(t *testing.T) {
	for _, c := range []struct {
		name, in, reason string
	}{
		{"empty", "", "empty"},
		{"blank", "  ", "empty"},
		{"comma and point", "1,234.5", "both a comma and a point"},
		{"point and comma", "1.234,5", "both a comma and a point"},
		{"two commas", "1,234,567", "more than one comma"},
		{"two points", "1.234.567", "more than one point"},
		{"space as thousands separator", "1 234", "space"},
		{"apostrophe as thousands separator", "1'234", "apostrophe"},
		{"NaN", "NaN", "unexpected character"},
		{"Inf", "Inf", "unexpected character"},
		{"infinity", "-infinity", "unexpected character"},
		{"hexadecimal", "0x1p-2", "unexpected character"},
		{"underscore", "1_000", "unexpected character"},
		{"too large", "1e999", "too large"},
		{"percent alone", "%", "before %"},
		{"two percent signs", "5%%", "before %"},
		{"sign alone", "-", "no digits"},
		{"exponent alone", "e5", "expected digits"},
		{"dangling exponent", "1e", "expected digits"},
		{"two signs", "+-1", "expected digits"},
		{"letters", "abc", "unexpected character"},
		{"unit", "12 g", "space"},
	} {
		t.Run(c.name, func(t *testing.T) {
			v, err := ParseNumber(c.in)
			if err == nil {
				t.Fatalf("ParseNumber(%q) = %v, want an error", c.in, v)
			}
			if !errors.Is(err, ErrNotNumber) || copoly.Field(err) != "number" {
				t.Errorf("ParseNumber(%q) error %v: want a FieldError naming number wrapping ErrNotNumber", c.in, err)
			}
			if !strings.Contains(err.Error(), c.reason) {
				t.Errorf("ParseNumber(%q) error %q does not say %q", c.in, err, c.reason)
			}
		})
	}
	if _, err := ParseCell("runs[3].f10", "0,3,5"); copoly.Field(err) != "runs[3].f10" || !strings.Contains(err.Error(), `"0,3,5"`) {
		t.Errorf("ParseCell error %v does not name the cell and its text", err)
	}
}

func FuzzParseNumber(f *testing.F) {
	for _, c := range parseNumberTests {
		f.Add(c.in)
	}
	for _, s := range []string{"1,234.5", "NaN", "1e999", "1e-999", "%", "−", "0x10", "1_0", "٣", "1e+", ",5", "5,"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := ParseNumber(s)
		if err != nil {
			if !errors.Is(err, ErrNotNumber) {
				t.Fatalf("ParseNumber(%q) error %v does not wrap ErrNotNumber", s, err)
			}
			// Typed, naming its field and quoting the text (shortened when long).
			var fe *copoly.FieldError
			if !errors.As(err, &fe) || fe.Field != "number" || !strings.HasPrefix(err.Error(), "number: ") {
				t.Fatalf("ParseNumber(%q) error %v is not a FieldError naming the field number", s, err)
			}
			if !strings.Contains(err.Error(), strconv.Quote(abbreviate(s))) {
				t.Fatalf("ParseNumber(%q) error %q does not quote the text", s, err)
			}
			if _, err := ParseCell("runs[7].F1", s); copoly.Field(err) != "runs[7].F1" {
				t.Fatalf("ParseCell(runs[7].F1, %q) error %v names field %q", s, err, copoly.Field(err))
			}
			return
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("ParseNumber(%q) = %v", s, v)
		}
		// The shortest decimal text of v reads back to v.
		if back, err := ParseNumber(strconv.FormatFloat(v, 'g', -1, 64)); err != nil || back != v {
			t.Fatalf("ParseNumber(%q) = %v, which reads back as %v, %v", s, v, back, err)
		}
		// Without a percent sign or a comma, the value is strconv's reading of the text.
		t2 := strings.ReplaceAll(trimCell(s), "−", "-")
		if !strings.ContainsAny(t2, "%,") {
			if want, err := strconv.ParseFloat(t2, 64); err != nil || want != v {
				t.Fatalf("ParseNumber(%q) = %v, strconv.ParseFloat = %v, %v", s, v, want, err)
			}
		}
		// A decimal comma means the same as a point.
		if strings.Contains(s, ",") {
			if p, err := ParseNumber(strings.Replace(s, ",", ".", 1)); err != nil || p != v {
				t.Fatalf("ParseNumber(%q) = %v but with a point %v, %v", s, v, p, err)
			}
		}
	})
}
