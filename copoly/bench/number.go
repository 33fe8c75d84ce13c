package bench

import (
	"copoly/copoly"
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// ParseNumber reads a number typed by a person or copied from a spreadsheet:
//   - a decimal point or a decimal comma: "0.35" and "0,35" are both 0.35, and "10,415" is
//     10.415 (a comma is always a decimal comma, never a thousands separator);
//   - a percentage: "35 %" and "35%" are 0.35 (the number divided by 100);
//   - an exponent: "1e-3", "2.5E4";
//   - a sign: "+", "-" or the minus sign "−" (U+2212); spaces around the number.
//
// Thousands separators are rejected, as they cannot be told from a decimal mark: "1,234.5"
// (a comma and a point), "1.234.567", "1,234,567", "1 234" and "1'234" are errors; so are "NaN",
// "Inf", hexadecimal, underscores, and numbers too large for a float64. The error is a
// [*copoly.FieldError] with Field "number" wrapping [ErrNotNumber]; [ParseCell] names the cell instead.
func ParseNumber(s string) (float64, error) {
	return ParseCell("number", s)
}

// ParseCell is [ParseNumber] with errors naming field, so the page can highlight the cell
// ("runs[3].f10").
func ParseCell(field, s string) (float64, error) {
	bad := func(why string) error {
		return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("%q is not a number: %s", abbreviate(s), why), Err: ErrNotNumber}
	}
	t := trimCell(s)
	if t == "" {
		return 0, bad("the cell is empty")
	}
	percent := false
	if rest, ok := strings.CutSuffix(t, "%"); ok {
		percent = true
		t = trimCell(rest)
		if t == "" || strings.HasSuffix(t, "%") {
			return 0, bad("expected a number before %")
		}
	}
	t = strings.ReplaceAll(t, "−", "-")
	commas, points, exp := 0, 0, false
	for _, c := range t {
		switch {
		case isDigit(c):
		case c == ',':
			commas++
		case c == '.':
			points++
		case c == 'e' || c == 'E':
			exp = true
		case c == '+' || c == '-':
			// ParseFloat checks the sign is at the start or after the exponent.
		case unicode.IsSpace(c):
			return 0, bad("it contains a space; remove thousands separators")
		case c == '\'':
			return 0, bad("it contains an apostrophe; remove thousands separators")
		default:
			return 0, bad(fmt.Sprintf("unexpected character %q", c))
		}
	}
	switch {
	case commas > 0 && points > 0:
		return 0, bad("it has both a comma and a point; write it without a thousands separator, as 1234.5 or 1234,5")
	case commas > 1:
		return 0, bad("it has more than one comma; write it without thousands separators")
	case points > 1:
		return 0, bad("it has more than one point; write it without thousands separators")
	}
	t = strings.Replace(t, ",", ".", 1)
	if !strings.ContainsFunc(t, isDigit) {
		return 0, bad("it has no digits")
	}
	if percent && !exp {
		t += "e-2" // divide by 100 in the decimal text: "12.3%" gives exactly ParseFloat("0.123")
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil {
		if errors.Is(err, strconv.ErrRange) {
			return 0, bad("too large")
		}
		return 0, bad("expected digits with one decimal point or comma, and an optional exponent such as e-3")
	}
	if percent && exp {
		v /= 100
	}
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, bad("too large")
	}
	if v == 0 {
		v = 0 // no negative zero
	}
	return v, nil
}
