package bench

import (
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
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

// tableTests: the expected cells are the input's cells, split by the rules in ParseBlock's
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
			got, err := ParseBlock(c.in)
			if err != nil {
				t.Fatalf("ParseBlock(%q) error: %v", c.in, err)
			}
			if !reflect.DeepEqual(got.Header, c.header) || !sameCells(got.Rows, c.rows) || got.Separator != c.sep {
				t.Errorf("ParseBlock(%q) = %q %q sep %q, want %q %q sep %q", c.in, got.Header, got.Rows, got.Separator, c.header, c.rows, c.sep)
			}
		})
	}
}

// TestParseTablePython reads testdata/table_python.csv, written by Python's csv module, and
// compares the cells with Python's own reading of it (testdata/table_python.json; both made
// by testdata/table_python.py, see testdata/README.md).
func TestParseTablePython(t *testing.T) {
	data, err := os.ReadFile("../../testdata/table_python.csv")
	if err != nil {
		t.Fatal(err)
	}
	js, err := os.ReadFile("../../testdata/table_python.json")
	if err != nil {
		t.Fatal(err)
	}
	var want [][]string
	if err := json.Unmarshal(js, &want); err != nil {
		t.Fatal(err)
	}
	got, err := ParseBlock(string(data))
	if err != nil {
		t.Fatal(err)
	}
	all := append([][]string{got.Header}, got.Rows...)
	if got.Separator != ';' || !sameCells(all, want) {
		t.Errorf("testdata/table_python.csv: got %q (separator %q), Python's csv module read %q", all, got.Separator, want)
	}
}

func TestParseTableErrors(t *testing.T) {
	wide := strings.Repeat("1,", MaxBlockColumns) + "1\n"
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
		{"too many columns", wide, copoly.ErrTooMany, "columns"},
		{"too many rows", rows(MaxBlockRows + 1), copoly.ErrTooMany, "rows"},
		{"too many bytes", strings.Repeat("1\n", MaxBlockBytes/2+1), copoly.ErrTooMany, "bytes"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParseBlock(c.in)
			if !errors.Is(err, c.err) || copoly.Field(err) != "table" || !strings.Contains(err.Error(), c.reason) {
				t.Errorf("ParseBlock(%.40q…) error %v, want %v naming table and saying %q", c.in, err, c.err, c.reason)
			}
		})
	}
	if tb, err := ParseBlock(rows(MaxBlockRows)); err != nil || len(tb.Rows) != MaxBlockRows {
		t.Errorf("ParseBlock with %d rows: %d rows, %v", MaxBlockRows, len(tb.Rows), err)
	}
}

func TestWriteTable(t *testing.T) {
	for _, c := range []struct {
		name string
		t    Block
		want string
	}{
		// RFC 4180 section 2: CRLF line ends; fields holding a separator, a quote or a line
		// break are quoted, quotes doubled. Semicolons and tabs are quoted as well, and a
		// decimal comma becomes a point.
		{"quoting and decimal points",
			Block{Header: []string{"label", "f10", "note"}, Rows: [][]string{
				{"S-1, rep", "0,25", `say "hi"`},
				{"S-2", "12,5 %", "a;b\tc\nd"},
				{"1,2,3", "", "text"},
			}},
			"label,f10,note\r\n\"S-1, rep\",0.25,\"say \"\"hi\"\"\"\r\nS-2,12.5 %,\"a;b\tc\nd\"\r\n\"1,2,3\",,text\r\n"},
		// Unquoted, "1,2" and "3,4" would read as a column of decimal-comma numbers.
		{"integer pairs all quoted",
			Block{Rows: [][]string{{"1", "2"}, {"3", "4"}}},
			"\"1\",\"2\"\r\n\"3\",\"4\"\r\n"},
		{"single column",
			Block{Header: []string{"F1"}, Rows: [][]string{{"0,35"}, {"0.4"}}},
			"F1\r\n0.35\r\n0.4\r\n"},
	} {
		t.Run(c.name, func(t *testing.T) {
			var b strings.Builder
			if err := WriteBlock(&b, c.t); err != nil {
				t.Fatal(err)
			}
			if b.String() != c.want {
				t.Errorf("WriteBlock(%q) =\n%q\nwant\n%q", c.t, b.String(), c.want)
			}
			back, err := ParseBlock(b.String())
			if err != nil {
				t.Fatalf("ParseBlock(WriteBlock(...)) error: %v", err)
			}
			if back.Separator != ',' && len(c.t.Rows[0]) > 1 {
				t.Errorf("written table read with separator %q, want ','", back.Separator)
			}
		})
	}
	if err := WriteBlock(failWriter{}, Block{Rows: [][]string{{"1"}}}); err == nil {
		t.Error("WriteBlock to a failing writer gave no error")
	}
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, errors.New("disk full") }

// checkRoundTrip checks the properties of a table ParseBlock returned: rectangular, trimmed,
// no empty rows, a header with no number; and that WriteBlock then ParseBlock gives the same
// cells, decimal commas written as points, and that a second round trip changes nothing.
func checkRoundTrip(t *testing.T, in string, t1 Block) {
	t.Helper()
	width := len(t1.Header)
	if len(t1.Rows) > 0 {
		width = len(t1.Rows[0])
	}
	if t1.Header != nil && (len(t1.Header) != width || !isHeader(t1.Header)) {
		t.Fatalf("ParseBlock(%q): header %q", in, t1.Header)
	}
	for _, r := range append([][]string{t1.Header}, t1.Rows...) {
		if r == nil {
			continue
		}
		blank := true
		for _, c := range r {
			if c != trimCell(c) || strings.Contains(c, "\r") {
				t.Fatalf("ParseBlock(%q): untrimmed cell %q", in, c)
			}
			blank = blank && c == ""
		}
		if len(r) != width || blank {
			t.Fatalf("ParseBlock(%q): row %q (width %d)", in, r, width)
		}
	}
	write := func(tb Block) string {
		var b strings.Builder
		if err := WriteBlock(&b, tb); err != nil {
			t.Fatal(err)
		}
		return b.String()
	}
	out := write(t1)
	t2, err := ParseBlock(out)
	if err != nil {
		t.Fatalf("ParseBlock(%q) = %q; its CSV %q does not read: %v", in, t1, out, err)
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
			t1, err := ParseBlock(c.in)
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
		t1, err := ParseBlock(in)
		if err != nil {
			if copoly.Field(err) != "table" || !(errors.Is(err, ErrNotTable) || errors.Is(err, copoly.ErrTooMany)) {
				t.Fatalf("ParseBlock(%q) error %v: want one naming table", in, err)
			}
			return
		}
		checkRoundTrip(t, in, t1)
	})
}

func ExampleParseBlock() {
	// A block copied from a spreadsheet in a decimal-comma locale.
	t, err := ParseBlock("f10\tF1\n0,25\t0,31\n0,5\t0,55\n")
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
