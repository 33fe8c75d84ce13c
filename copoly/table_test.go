package copoly

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"reflect"
	"strconv"
	"strings"
	"testing"
)

// The expected numbers below are the text of each case read as a decimal number, as the rules
// in ParseNumber's documentation say (the text is the source of the value).
var parseNumberTests = []struct {
	name string
	in   string
	want float64
}{
	{"point", "0.35", 0.35},
	{"decimal comma", "0,35", 0.35},
	{"decimal comma in a mass", "10,415", 10.415},
	{"spaces around", "  0.35 \t", 0.35},
	{"no-break space around", "\u00a00,35\u00a0", 0.35},
	{"percent", "35%", 0.35},
	{"percent with space", "35 %", 0.35},
	{"percent with decimal comma", "12,5 %", 0.125},
	{"percent with exponent", "5e1%", 0.5},
	{"exponent", "1e-3", 0.001},
	{"exponent upper case with comma", "1,5E-2", 0.015},
	{"plus sign", "+2", 2},
	{"minus sign", "-0.5", -0.5},
	{"unicode minus", "−0,5", -0.5},
	{"unicode minus in exponent", "2e−3", 0.002},
	{"leading point", ".5", 0.5},
	{"trailing point", "5.", 5},
	{"negative zero is zero", "-0", 0},
	{"integer", "100", 100},
}

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
			if !errors.Is(err, ErrNotNumber) || Field(err) != "number" {
				t.Errorf("ParseNumber(%q) error %v: want a FieldError naming number wrapping ErrNotNumber", c.in, err)
			}
			if !strings.Contains(err.Error(), c.reason) {
				t.Errorf("ParseNumber(%q) error %q does not say %q", c.in, err, c.reason)
			}
		})
	}
	if _, err := ParseCell("runs[3].f10", "0,3,5"); Field(err) != "runs[3].f10" || !strings.Contains(err.Error(), `"0,3,5"`) {
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
			var fe *FieldError
			if !errors.As(err, &fe) || fe.Field != "number" || !strings.HasPrefix(err.Error(), "number: ") {
				t.Fatalf("ParseNumber(%q) error %v is not a FieldError naming the field number", s, err)
			}
			if !strings.Contains(err.Error(), strconv.Quote(abbreviate(s))) {
				t.Fatalf("ParseNumber(%q) error %q does not quote the text", s, err)
			}
			if _, err := ParseCell("runs[7].F1", s); Field(err) != "runs[7].F1" {
				t.Fatalf("ParseCell(runs[7].F1, %q) error %v names field %q", s, err, Field(err))
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

// tableTests: the expected cells are the input's cells, split by the rules in ParseTable's
// documentation (RFC 4180 quoting; the text is the source).
var tableTests = []struct {
	name   string
	in     string
	header []string
	rows   [][]string
	sep    rune
}{
	{
		name:   "spreadsheet paste with decimal commas",
		in:     "f10\tX\tF1\r\n0,2\t0,05\t0,31\r\n0,5\t\t0,55\t\r\n",
		header: []string{"f10", "X", "F1"},
		rows:   [][]string{{"0,2", "0,05", "0,31"}, {"0,5", "", "0,55"}},
		sep:    '\t',
	},
	{
		name:   "semicolon CSV with byte order mark and blank lines",
		in:     "\uFEFFlabel;f10;F1\n\nS-1;0,2;0,31\n   \n S-2 ; 0,5 ;0,55\n;;\n",
		header: []string{"label", "f10", "F1"},
		rows:   [][]string{{"S-1", "0,2", "0,31"}, {"S-2", "0,5", "0,55"}},
		sep:    ';',
	},
	{
		name:   "comma CSV with quoted fields",
		in:     "label,f10,F1\n\"S-1, repeat\",0.2,0.31\n\"say \"\"hi\"\"\", 0.5 ,0.55\n \"S-3\",0.8,0.75",
		header: []string{"label", "f10", "F1"},
		rows:   [][]string{{"S-1, repeat", "0.2", "0.31"}, {`say "hi"`, "0.5", "0.55"}, {"S-3", "0.8", "0.75"}},
		sep:    ',',
	},
	{
		name: "no header",
		in:   "0.2,0.31\n0.5,0.55\n",
		rows: [][]string{{"0.2", "0.31"}, {"0.5", "0.55"}},
		sep:  ',',
	},
	{
		name:   "a column of decimal-comma numbers",
		in:     "F1\n0,35\n0,40\n",
		header: []string{"F1"},
		rows:   [][]string{{"0,35"}, {"0,40"}},
		sep:    0,
	},
	{
		name: "a column of numbers",
		in:   "0.35\n0.40",
		rows: [][]string{{"0.35"}, {"0.40"}},
		sep:  0,
	},
	{
		name:   "two integer columns with a header",
		in:     "n1,n2\n5,3\n",
		header: []string{"n1", "n2"},
		rows:   [][]string{{"5", "3"}},
		sep:    ',',
	},
	{
		name:   "ragged rows padded, empty right columns dropped",
		in:     "a;b;;\n1;2;;\n3;;;\n",
		header: []string{"a", "b"},
		rows:   [][]string{{"1", "2"}, {"3", ""}},
		sep:    ';',
	},
	{
		name: "semicolon in a label of a comma file",
		in:   "S-1; rep,0.2,0.3\nS-2,0.5,0.6\n",
		rows: [][]string{{"S-1; rep", "0.2", "0.3"}, {"S-2", "0.5", "0.6"}},
		sep:  ',',
	},
	{
		name:   "carriage-return line ends",
		in:     "a,b\r1,2\r",
		header: []string{"a", "b"},
		rows:   [][]string{{"1", "2"}},
		sep:    ',',
	},
	{
		name:   "quoted line break in a spreadsheet paste",
		in:     "label\tF1\n\"two\r\nlines\"\t0,5\n",
		header: []string{"label", "F1"},
		rows:   [][]string{{"two\nlines", "0,5"}},
		sep:    '\t',
	},
	{
		name:   "header only",
		in:     "label;f10;F1\n",
		header: []string{"label", "f10", "F1"},
		rows:   [][]string{},
		sep:    ';',
	},
	{
		name: "invalid UTF-8 replaced",
		in:   "S\xff1,0.5\n",
		rows: [][]string{{"S\uFFFD1", "0.5"}},
		sep:  ',',
	},
}

func sameCells(a, b [][]string) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if !reflect.DeepEqual(a[i], b[i]) {
			return false
		}
	}
	return true
}

func TestParseTable(t *testing.T) {
	for _, c := range tableTests {
		t.Run(c.name, func(t *testing.T) {
			got, err := ParseTable(c.in)
			if err != nil {
				t.Fatalf("ParseTable(%q) error: %v", c.in, err)
			}
			if !reflect.DeepEqual(got.Header, c.header) || !sameCells(got.Rows, c.rows) || got.Separator != c.sep {
				t.Errorf("ParseTable(%q) = %q %q sep %q, want %q %q sep %q", c.in, got.Header, got.Rows, got.Separator, c.header, c.rows, c.sep)
			}
		})
	}
}

// TestParseTablePython reads testdata/table_python.csv, written by Python's csv module, and
// compares the cells with Python's own reading of it (testdata/table_python.json; both made
// by testdata/table_python.py, see testdata/README.md).
func TestParseTablePython(t *testing.T) {
	data, err := os.ReadFile("../testdata/table_python.csv")
	if err != nil {
		t.Fatal(err)
	}
	js, err := os.ReadFile("../testdata/table_python.json")
	if err != nil {
		t.Fatal(err)
	}
	var want [][]string
	if err := json.Unmarshal(js, &want); err != nil {
		t.Fatal(err)
	}
	got, err := ParseTable(string(data))
	if err != nil {
		t.Fatal(err)
	}
	all := append([][]string{got.Header}, got.Rows...)
	if got.Separator != ';' || !sameCells(all, want) {
		t.Errorf("testdata/table_python.csv: got %q (separator %q), Python's csv module read %q", all, got.Separator, want)
	}
}

func TestParseTableErrors(t *testing.T) {
	wide := strings.Repeat("1,", MaxTableColumns) + "1\n"
	rows := func(n int) string { return "f10,F1\n" + strings.Repeat("0.5,0.5\n", n) }
	for _, c := range []struct {
		name, in string
		err      error
		reason   string
	}{
		{"empty", "", ErrNotTable, "no cells"},
		{"blank lines only", " \n\t\n\t \t\n", ErrNotTable, "no cells"},
		{"separators only", ";;\n;\n", ErrNotTable, "no cells"},
		{"bare quote", "a,b\"c\n", ErrNotTable, "line 1"},
		{"unterminated quote", "a,b\n1,\"2\n", ErrNotTable, "line 2"},
		{"too many columns", wide, ErrTooMany, "columns"},
		{"too many rows", rows(MaxTableRows + 1), ErrTooMany, "rows"},
		{"too many bytes", strings.Repeat("1\n", MaxTableBytes/2+1), ErrTooMany, "bytes"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseTable(c.in)
			if !errors.Is(err, c.err) || Field(err) != "table" || !strings.Contains(err.Error(), c.reason) {
				t.Errorf("ParseTable(%.40q…) error %v, want %v naming table and saying %q", c.in, err, c.err, c.reason)
			}
		})
	}
	if tb, err := ParseTable(rows(MaxTableRows)); err != nil || len(tb.Rows) != MaxTableRows {
		t.Errorf("ParseTable with %d rows: %d rows, %v", MaxTableRows, len(tb.Rows), err)
	}
}

func TestWriteTable(t *testing.T) {
	for _, c := range []struct {
		name string
		t    Table
		want string
	}{
		// RFC 4180 section 2: CRLF line ends; fields holding a separator, a quote or a line
		// break are quoted, quotes doubled. Semicolons and tabs are quoted as well, and a
		// decimal comma becomes a point.
		{"quoting and decimal points",
			Table{Header: []string{"label", "f10", "note"}, Rows: [][]string{
				{"S-1, rep", "0,25", `say "hi"`},
				{"S-2", "12,5 %", "a;b\tc\nd"},
				{"1,2,3", "", "text"},
			}},
			"label,f10,note\r\n\"S-1, rep\",0.25,\"say \"\"hi\"\"\"\r\nS-2,12.5 %,\"a;b\tc\nd\"\r\n\"1,2,3\",,text\r\n"},
		// Unquoted, "1,2" and "3,4" would read as a column of decimal-comma numbers.
		{"integer pairs all quoted",
			Table{Rows: [][]string{{"1", "2"}, {"3", "4"}}},
			"\"1\",\"2\"\r\n\"3\",\"4\"\r\n"},
		{"single column",
			Table{Header: []string{"F1"}, Rows: [][]string{{"0,35"}, {"0.4"}}},
			"F1\r\n0.35\r\n0.4\r\n"},
	} {
		t.Run(c.name, func(t *testing.T) {
			var b strings.Builder
			if err := WriteTable(&b, c.t); err != nil {
				t.Fatal(err)
			}
			if b.String() != c.want {
				t.Errorf("WriteTable(%q) =\n%q\nwant\n%q", c.t, b.String(), c.want)
			}
			back, err := ParseTable(b.String())
			if err != nil {
				t.Fatalf("ParseTable(WriteTable(...)) error: %v", err)
			}
			if back.Separator != ',' && len(c.t.Rows[0]) > 1 {
				t.Errorf("written table read with separator %q, want ','", back.Separator)
			}
		})
	}
	if err := WriteTable(failWriter{}, Table{Rows: [][]string{{"1"}}}); err == nil {
		t.Error("WriteTable to a failing writer gave no error")
	}
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, errors.New("disk full") }

// checkRoundTrip checks the properties of a table ParseTable returned: rectangular, trimmed,
// no empty rows, a header with no number; and that WriteTable then ParseTable gives the same
// cells, decimal commas written as points, and that a second round trip changes nothing.
func checkRoundTrip(t *testing.T, in string, t1 Table) {
	t.Helper()
	width := len(t1.Header)
	if len(t1.Rows) > 0 {
		width = len(t1.Rows[0])
	}
	if t1.Header != nil && (len(t1.Header) != width || !isHeader(t1.Header)) {
		t.Fatalf("ParseTable(%q): header %q", in, t1.Header)
	}
	for _, r := range append([][]string{t1.Header}, t1.Rows...) {
		if r == nil {
			continue
		}
		blank := true
		for _, c := range r {
			if c != trimCell(c) || strings.Contains(c, "\r") {
				t.Fatalf("ParseTable(%q): untrimmed cell %q", in, c)
			}
			blank = blank && c == ""
		}
		if len(r) != width || blank {
			t.Fatalf("ParseTable(%q): row %q (width %d)", in, r, width)
		}
	}
	write := func(tb Table) string {
		var b strings.Builder
		if err := WriteTable(&b, tb); err != nil {
			t.Fatal(err)
		}
		return b.String()
	}
	out := write(t1)
	t2, err := ParseTable(out)
	if err != nil {
		t.Fatalf("ParseTable(%q) = %q; its CSV %q does not read: %v", in, t1, out, err)
	}
	if !reflect.DeepEqual(t2.Header, t1.Header) || len(t2.Rows) != len(t1.Rows) {
		t.Fatalf("round trip of %q: %q %q, then %q %q", in, t1.Header, t1.Rows, t2.Header, t2.Rows)
	}
	for i, r := range t1.Rows {
		if len(t2.Rows[i]) != len(r) {
			t.Fatalf("round trip of %q: row %d %q became %q", in, i, r, t2.Rows[i])
		}
		for j, c := range r {
			d := t2.Rows[i][j]
			if d == c {
				continue
			}
			v1, err1 := ParseNumber(c)
			v2, err2 := ParseNumber(d)
			if err1 != nil || err2 != nil || v1 != v2 || strings.Contains(d, ",") {
				t.Fatalf("round trip of %q: cell %q became %q", in, c, d)
			}
		}
	}
	if out2 := write(t2); out2 != out {
		t.Fatalf("second round trip of %q changed the CSV: %q then %q", in, out, out2)
	}
}

func TestTableRoundTrip(t *testing.T) {
	for _, c := range tableTests {
		t.Run(c.name, func(t *testing.T) {
			t1, err := ParseTable(c.in)
			if err != nil {
				t.Fatal(err)
			}
			checkRoundTrip(t, c.in, t1)
		})
	}
}

func FuzzParseTable(f *testing.F) {
	for _, c := range tableTests {
		f.Add(c.in)
	}
	for _, s := range []string{"", "\"", "a\"b", "\"a\"\"b\"", "\uFEFF\uFEFFx", "\"\uFEFFx\"", "1\t2\n3", "1;2,3\n4,5",
		"1,2\n3,4", "x\n\"1,2\"", " \" a\" , b", "a\r\r\nb", "\"a\nb\";1", "1,5\n2", "\t\t\n1"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, in string) {
		t1, err := ParseTable(in)
		if err != nil {
			if Field(err) != "table" || !(errors.Is(err, ErrNotTable) || errors.Is(err, ErrTooMany)) {
				t.Fatalf("ParseTable(%q) error %v: want one naming table", in, err)
			}
			return
		}
		checkRoundTrip(t, in, t1)
	})
}

func ExampleParseTable() {
	// A block copied from a spreadsheet in a decimal-comma locale.
	t, err := ParseTable("f10\tF1\n0,25\t0,31\n0,5\t0,55\n")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(t.Header)
	for _, r := range t.Rows {
		f10, _ := ParseNumber(r[0])
		F1, _ := ParseNumber(r[1])
		fmt.Println(f10, F1)
	}
	// Output:
	// [f10 F1]
	// 0.25 0.31
	// 0.5 0.55
}
