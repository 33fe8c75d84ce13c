package bench

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
)

func TestTablePasteWithHeader(t *testing.T) {
	var tab Table
	// A block copied from a spreadsheet in a decimal-comma locale: tab-separated, with a header.
	text := "sample\tf0\tX\tF1\tsF\nA-1\t0,20\t0,05\t0,30\t0,01\nA-2\t0,50\t0,08\t0,52\t0,01\n"
	if err := tab.Paste(text); err != nil {
		t.Fatal(err)
	}
	if tab.ConversionKind != ConversionMolar || len(tab.Rows) != 2 || tab.Rows[1].Label != "A-2" || tab.Rows[1].Cells[ColF1] != "0,52" {
		t.Fatalf("pasted table %+v", tab)
	}
	runs, ok, errs, _ := tab.Runs(0, 0)
	// Decimal commas read as points: 0,20 → 0.20 (the cells as typed).
	want := []copoly.Run{{F10: 0.2, Conversion: 0.05, F1: 0.3, SF: 0.01}, {F10: 0.5, Conversion: 0.08, F1: 0.52, SF: 0.01}}
	for i := range want {
		if !ok[i] || errs[i] != nil || runs[i] != want[i] {
			t.Errorf("row %d: %+v, %v, %v; want %+v", i, runs[i], ok[i], errs[i], want[i])
		}
	}
}

func TestTablePasteWithoutHeader(t *testing.T) {
	tab := Table{ConversionKind: ConversionMolar}
	// Columns in the order of Columns(): f10, conversion, F1, sF, sX, sf; a leading text label.
	if err := tab.Paste("r1,0.1,0.05,0.2\nr2,0.9,0.05,0.85\n"); err != nil {
		t.Fatal(err)
	}
	runs, ok, errs, _ := tab.Runs(0, 0)
	if !ok[0] || !ok[1] || errs[0] != nil || runs[1].F10 != 0.9 || runs[1].F1 != 0.85 || tab.Rows[0].Label != "r1" {
		t.Errorf("runs %+v ok %v errs %v rows %+v", runs, ok, errs, tab.Rows)
	}
	if err := tab.Paste("label\tfoo\n1\t2\n"); err == nil || copoly.Field(err) != "paste" {
		t.Errorf("unknown header: error %v", err)
	}
	if len(tab.Rows) != 2 {
		t.Errorf("a failed paste changed the table: %d rows", len(tab.Rows))
	}
}

// TestTablePasteFailureChangesNothing holds the regression cases of FuzzBenchPaste: a
// block with only a header row was accepted and added nothing, silently; a header naming one
// column twice kept the last of the two cells, even an empty one; and a header naming the
// columns of another form switched the table's form even when the paste then failed.
func TestTablePasteFailureChangesNothing(t *testing.T) {
	tooMany := "X\tF1\tf10\n" + strings.Repeat("0.1\t0.2\t0.3\n", MaxRuns) // with the row kept, one too many
	tests := []struct {
		name, text, field, reason string
		sentinel                  error
	}{
		{"header only", "sample", "paste", "only a header row (sample)", ErrNotTable},
		{"header of another form only", "mass1\tmass2\tX\tw1", "paste", "no rows of data", ErrNotTable},
		{"row wider than the header", "X\tF1\tf10\n0.1\t0.2\t0.3\t0.4\n", "paste", "column 4 has no name in the header row (X, F1, f10, )", ErrNotTable},
		{"row wider than the columns", "0.1\t0.2\t0.3\t0.4\t0.5\n", "paste", "a row has 5 cells but only 4 columns", ErrNotTable},
		// A header naming a column twice: the second, empty, cell overwrote the first.
		{"a column named twice", "n1,n1,I1,H1,I1,H1\n000", "paste", `columns 1 ("n1") and 2 ("n1") are both moles1`, ErrNotTable},
		{"a column named twice in other words", "X\tF\tF1\n0.1\t0.2\t0.3\n", "paste", `columns 2 ("F") and 3 ("F1") are both F1`, ErrNotTable},
		{"too many rows", tooMany, "paste", fmt.Sprintf("at most %d rows", MaxRuns), copoly.ErrTooMany},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			before := Table{Rows: []Row{{Label: "kept", Cells: map[string]string{ColF10: "0.5", ColF1: "0.5"}}}}
			tab := before
			tab.Rows = append([]Row(nil), before.Rows...)
			err := tab.Paste(tt.text)
			if copoly.Field(err) != tt.field || !errors.Is(err, tt.sentinel) || !strings.Contains(fmt.Sprint(err), tt.reason) {
				t.Errorf("Paste(%.40q) error %v, want a %v naming %s and saying %q", tt.text, err, tt.sentinel, tt.field, tt.reason)
			}
			if !reflect.DeepEqual(tab, before) {
				t.Errorf("Paste(%.40q) failed but changed the table: %+v", tt.text, tab)
			}
		})
	}
}

func TestTableRunsNamesCells(t *testing.T) {
	tab := Table{FeedKind: FeedMass, Rows: []Row{
		{Label: "ok", Cells: map[string]string{ColMass1: "10.415", ColMass2: "5.306", ColF1: "0.55"}},
		{Label: "bad text", Cells: map[string]string{ColMass1: "ten", ColMass2: "5", ColF1: "0.5"}},
		{Label: "", Cells: map[string]string{}}, // blank row: skipped
		{Label: "bad value", Cells: map[string]string{ColMass1: "1", ColMass2: "1", ColF1: "1.5"}},
	}}
	runs, ok, errs, _ := tab.Runs(104.152, 53.064)
	// 10.415 g / 104.152 g/mol = 0.1000 mol; 5.306 g / 53.064 g/mol = 0.1000 mol → f10 ≈ 0.5
	// (molar masses from C8H8 and C3H3N with IUPAC 2021 atomic weights; by hand).
	if !ok[0] || math.Abs(runs[0].F10-0.5) > 1e-4 {
		t.Errorf("row 0: %+v %v", runs[0], errs[0])
	}
	if ok[1] || copoly.Field(errs[1]) != "runs[1].mass1" || !errors.Is(errs[1], ErrNotNumber) {
		t.Errorf("row 1 error %v (field %q)", errs[1], copoly.Field(errs[1]))
	}
	if ok[2] || errs[2] != nil {
		t.Errorf("blank row: %v %v", ok[2], errs[2])
	}
	if ok[3] || copoly.Field(errs[3]) != "runs[3].F1" {
		t.Errorf("row 3 error %v (field %q)", errs[3], copoly.Field(errs[3]))
	}
}

func TestTableWarningsKeepRowNumbers(t *testing.T) {
	tab := Table{ConversionKind: ConversionMolar, Rows: []Row{
		{Cells: map[string]string{ColF10: "x", ColConversion: "0.1", ColF1: "0.5"}},   // bad: not converted
		{Cells: map[string]string{ColF10: "0.2", ColConversion: "0.7", ColF1: "0.3"}}, // 0.3·0.7 = 0.21 > 0.2: more M1 than charged
		{Cells: map[string]string{ColF10: "0.5", ColConversion: "0.1", ColF1: "0.5"}},
	}}
	_, _, _, warnings := tab.Runs(0, 0)
	found := false
	for _, w := range warnings {
		if w.Row == 1 && w.Field == "runs[1].F1" {
			found = true
		}
	}
	if !found {
		t.Errorf("warnings %+v: want the mass balance of table row 1 (F1·X = 0.21 > f10 = 0.2)", warnings)
	}
}

// renderBench writes the rows of t as the CSV a person would paste back: a header of "label"
// and every cell key the rows use (in a fixed order), then one line per row, through
// WriteBlock.
func renderBench(t *testing.T, b Table) string {
	t.Helper()
	var keys []string
	seen := map[string]bool{}
	for _, r := range b.Rows {
		for k := range r.Cells {
			seen[k] = true
		}
	}
	for _, k := range []string{ColF10, ColMass1, ColMass2, ColMoles1, ColMoles2, ColConversion, ColF1, ColMassFraction1,
		ColIntegral1, ColProtons1, ColIntegral2, ColProtons2, ColElementPercent, ColSF, ColSX, ColSf} {
		if seen[k] {
			keys = append(keys, k)
			delete(seen, k)
		}
	}
	if len(seen) > 0 {
		t.Fatalf("Paste made cells keyed %v, which are not columns", seen)
	}
	tab := Block{Header: append([]string{"label"}, keys...)}
	for _, r := range b.Rows {
		row := []string{r.Label}
		for _, k := range keys {
			row = append(row, r.Cells[k])
		}
		tab.Rows = append(tab.Rows, row)
	}
	var s strings.Builder
	if err := WriteBlock(&s, tab); err != nil {
		t.Fatal(err)
	}
	return s.String()
}

// sameCell reports whether two cells hold the same text, or the same number (WriteBlock writes
// a decimal comma as a point).
func sameCell(a, b string) bool {
	if a == b {
		return true
	}
	x, errX := ParseNumber(a)
	y, errY := ParseNumber(b)
	return errX == nil && errY == nil && x == y
}

// checkRunsResult checks the outcome of Table.Runs on a table of n rows: one entry per
// row; every error typed, naming a cell of its own row (or a molar mass) and wrapping a
// sentinel; every run converted a set of finite fractions; every warning naming the runs.
func checkRunsResult(t *testing.T, in string, n int, runs []copoly.Run, ok []bool, errs []error, warnings []copoly.RunWarning) {
	t.Helper()
	if len(runs) != n || len(ok) != n || len(errs) != n {
		t.Fatalf("Paste(%q): Runs gave %d runs, %d flags, %d errors for %d rows", in, len(runs), len(ok), len(errs), n)
	}
	for i := range n {
		if errs[i] != nil {
			f := copoly.Field(errs[i])
			if ok[i] || !(strings.HasPrefix(f, fmt.Sprintf("runs[%d].", i)) || f == "molarMass1" || f == "molarMass2") {
				t.Fatalf("Paste(%q): row %d error %v names field %q", in, i, errs[i], f)
			}
			if !(errors.Is(errs[i], ErrNotNumber) || errors.Is(errs[i], copoly.ErrOutOfRange) || errors.Is(errs[i], copoly.ErrNotFinite)) {
				t.Fatalf("Paste(%q): row %d error %v wraps no sentinel", in, i, errs[i])
			}
			continue
		}
		if !ok[i] {
			if runs[i] != (copoly.Run{}) {
				t.Fatalf("Paste(%q): skipped row %d has a run %+v", in, i, runs[i])
			}
			continue
		}
		r := runs[i]
		for _, v := range []float64{r.F10, r.F1, r.Conversion, r.SF, r.SX, r.Sf} {
			if !(v >= 0 && v <= 1) {
				t.Fatalf("Paste(%q): row %d converted to %+v, a value outside [0, 1] or not finite", in, i, r)
			}
		}
	}
	for _, w := range warnings {
		if !strings.HasPrefix(w.Field, "runs") || w.Message == "" || w.Row < -1 || w.Row >= n || (w.Row >= 0 && !ok[w.Row]) {
			t.Fatalf("Paste(%q): warning %+v", in, w)
		}
	}
}

// FuzzBenchPaste pastes any text into an empty bench table of each form. A paste that fails
// must name the field "paste", wrap a sentinel and leave the table as it was; one
// that succeeds must convert (Runs) with errors naming the cells, and the rows written back as
// CSV (label and cell columns, WriteBlock) must paste again into the same grid.
func FuzzBenchPaste(f *testing.F) {
	for _, s := range []string{
		"sample\tf0\tX\tF1\tsF\nA-1\t0,20\t0,05\t0,30\t0,01\nA-2\t0,50\t0,08\t0,52\t0,01\n",
		"r1,0.1,0.05,0.2\nr2,0.9,0.05,0.85\n",
		"label;m1;m2;w1\nS1;10,4;5,3;0,6\n",
		"n1,n2,I1,H1,I2,H2\n0.1,0.1,500,5,300,3\n",
		"label\tN%\nA\t5,2 %\n",
		"f10\tF1\n0.5\t1e999\n0,5\tNaN\n-0.1\t0.3\n",
		"label\tfoo\n1\t2\n",
		"\"a\nb\",0.5,0.5\n",
		"0,35\n0,40\n",
		"F\tf\nx\ty\n",
		"label,f10,F1\n,,\n \t \n",
	} {
		for form := range 4 {
			f.Add(s, uint8(form))
		}
	}
	forms := []Table{
		{},
		{ConversionKind: ConversionMolar},
		{FeedKind: FeedMass, ConversionKind: ConversionMass, CompositionKind: CompositionMassFraction},
		{FeedKind: FeedMoles, CompositionKind: CompositionElement, Element: "N", Carrier: 2, ElementCount: 1},
		{CompositionKind: CompositionNMR},
	}
	f.Fuzz(func(t *testing.T, in string, form uint8) {
		b := forms[int(form)%len(forms)]
		before := b.Columns()
		if err := b.Paste(in); err != nil {
			f := copoly.Field(err)
			if f != "paste" {
				t.Fatalf("Paste(%q) error %v names field %q, want paste", in, err, f)
			}
			if !(errors.Is(err, ErrNotTable) || errors.Is(err, copoly.ErrTooMany)) {
				t.Fatalf("Paste(%q) error %v wraps neither ErrNotTable nor ErrTooMany", in, err)
			}
			if !reflect.DeepEqual(b, forms[int(form)%len(forms)]) {
				t.Fatalf("Paste(%q) failed (%v) but changed the table to %+v", in, err, b)
			}
			if !strings.HasPrefix(err.Error(), "paste:") && !strings.HasPrefix(err.Error(), "paste = ") {
				t.Fatalf("Paste(%q) error %q does not start with its field", in, err)
			}
			return
		}
		if len(b.Rows) == 0 {
			t.Fatalf("Paste(%q) succeeded but added no rows", in)
		}
		// The molar masses of styrene and acrylonitrile (the constants above), so that every
		// form that weighs can convert.
		runs, ok, errs, warnings := b.Runs(mStyrene, mAN)
		checkRunsResult(t, in, len(b.Rows), runs, ok, errs, warnings)

		// Round trip: the rows rendered as CSV paste back into the same grid.
		out := renderBench(t, b)
		again := forms[int(form)%len(forms)]
		if err := again.Paste(out); err != nil {
			t.Fatalf("Paste(%q) gave rows %+v; their CSV %q does not paste again: %v", in, b.Rows, out, err)
		}
		if len(again.Rows) != len(b.Rows) {
			t.Fatalf("Paste(%q): %d rows, written and pasted again %d (CSV %q)", in, len(b.Rows), len(again.Rows), out)
		}
		for i, r := range b.Rows {
			r2 := again.Rows[i]
			if !sameCell(r.Label, r2.Label) {
				t.Fatalf("Paste(%q): row %d label %q became %q (CSV %q)", in, i, r.Label, r2.Label, out)
			}
			for _, k := range append(before, b.Columns()...) {
				if !sameCell(r.Cells[k], r2.Cells[k]) {
					t.Fatalf("Paste(%q): row %d cell %s %q became %q (CSV %q)", in, i, k, r.Cells[k], r2.Cells[k], out)
				}
			}
			for k, c := range r2.Cells {
				if !sameCell(r.Cells[k], c) {
					t.Fatalf("Paste(%q): row %d cell %s %q became %q (CSV %q)", in, i, k, r.Cells[k], c, out)
				}
			}
		}
	})
}
