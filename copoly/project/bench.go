package project

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strings"
	"unicode/utf8"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/plan"
)

// Limits on the bench-data grid of a project. MaxCells and MaxCellLength are design choices of
// copoly that keep a project file small; the row and label limits are copoly's own
// (bench.MaxRuns, bench.MaxLabelLength), so that every grid a project holds can be converted.
const (
	MaxRows        = bench.MaxRuns        // rows in the grid
	MaxCells       = 64                   // cells in one row
	MaxCellLength  = 200                  // characters in one cell, and in Bench.Element
	MaxLabelLength = bench.MaxLabelLength // characters in a row label
	MaxJCRPoints   = plan.MaxRegionPoints // points of Project.JCR
)

// ErrNotAllowed reports a word that is not among those a field accepts, such as an unknown
// entry form or cell key.
var ErrNotAllowed = copoly.NewSentinel(copoly.CodeNotAllowed, "project: value not among those allowed")

// Bench is the bench-data grid of a project: [bench.Table] with the keys of the project
// file and of the BenchTable of the JavaScript API. Cells are kept as typed, so a cell that is
// not (yet) a number is not an error here; [bench.Table.Runs] reports it when the runs are
// converted.
type Bench struct {
	// FeedKind is bench.FeedFraction, FeedMass, FeedMoles or "" (fraction).
	FeedKind string `json:"feedKind"`
	// ConversionKind is bench.ConversionNone, ConversionMolar, ConversionMass or "" (none).
	ConversionKind string `json:"conversionKind"`
	// CompositionKind is bench.CompositionFraction, CompositionMassFraction, CompositionNMR,
	// CompositionElement or "" (fraction).
	CompositionKind string `json:"compositionKind"`
	// Element, Carrier and ElementCount describe an elemental analysis as in bench.RunInput;
	// Carrier is 1 or 2, or 0 when not chosen, and ElementCount ≥ 0 (0 = not given).
	Element      string     `json:"element"`
	Carrier      int        `json:"carrier"`
	ElementCount float64    `json:"elementCount"`
	Rows         []BenchRow `json:"rows" project:"required"`
}

// BenchRow is one row of a Bench: a label and the text of each cell, keyed by column
// (bench.ColF10, bench.ColF1, …).
type BenchRow struct {
	Label string            `json:"label"`
	Cells map[string]string `json:"cells"`
}

// Table returns b as a bench.Table. The rows and cells are copied, so changing the table
// (bench.Table.Paste appends rows) leaves b as it was.
func (b Bench) Table() bench.Table {
	t := bench.Table{
		FeedKind: b.FeedKind, ConversionKind: b.ConversionKind, CompositionKind: b.CompositionKind,
		Element: b.Element, Carrier: b.Carrier, ElementCount: b.ElementCount,
	}
	if b.Rows != nil {
		t.Rows = make([]bench.Row, len(b.Rows))
		for i, r := range b.Rows {
			t.Rows[i] = bench.Row{Label: r.Label, Cells: maps.Clone(r.Cells)}
		}
	}
	return t
}

// BenchOf returns the bench.Table t as a Bench, copying its rows and cells.
func BenchOf(t bench.Table) Bench {
	b := Bench{
		FeedKind: t.FeedKind, ConversionKind: t.ConversionKind, CompositionKind: t.CompositionKind,
		Element: t.Element, Carrier: t.Carrier, ElementCount: t.ElementCount,
	}
	if t.Rows != nil {
		b.Rows = make([]BenchRow, len(t.Rows))
		for i, r := range t.Rows {
			b.Rows[i] = BenchRow{Label: r.Label, Cells: maps.Clone(r.Cells)}
		}
	}
	return b
}

// Words accepted by the kind fields of a Bench; "" selects the first form of each.
var (
	feedKinds        = []string{"", bench.FeedFraction, bench.FeedMass, bench.FeedMoles}
	conversionKinds  = []string{"", bench.ConversionNone, bench.ConversionMolar, bench.ConversionMass}
	compositionKinds = []string{"", bench.CompositionFraction, bench.CompositionMassFraction, bench.CompositionNMR, bench.CompositionElement}
)

// cellKeys are the cell keys a row may hold: every column of every form of bench.Table.
// A row may keep cells of a form the table no longer uses (the chemist switched forms), so the
// keys are not checked against the table's current columns.
var cellKeys = map[string]bool{
	bench.ColF10: true, bench.ColMass1: true, bench.ColMass2: true, bench.ColMoles1: true, bench.ColMoles2: true,
	bench.ColConversion: true,
	bench.ColF1:         true, bench.ColMassFraction1: true, bench.ColIntegral1: true, bench.ColProtons1: true,
	bench.ColIntegral2: true, bench.ColProtons2: true, bench.ColElementPercent: true,
	bench.ColSF: true, bench.ColSX: true, bench.ColSf: true,
}

// CheckBench reports the first structural problem of b as a *copoly.InputError or
// *copoly.FieldError whose field starts with field ("project.bench.feedKind",
// "project.bench.rows[3].cells.f10"), or nil. It checks the kind words, the carrier (0, 1 or 2),
// a finite ElementCount ≥ 0, at most MaxRows rows, and in each row a label of at most
// MaxLabelLength characters and at most MaxCells cells, each keyed by a column of
// bench.Table and at most MaxCellLength characters long. What the cells say is not
// checked.
func CheckBench(field string, b Bench) error {
	for _, k := range []struct {
		name, v string
		allowed []string
	}{
		{"feedKind", b.FeedKind, feedKinds},
		{"conversionKind", b.ConversionKind, conversionKinds},
		{"compositionKind", b.CompositionKind, compositionKinds},
	} {
		if !slices.Contains(k.allowed, k.v) {
			return &copoly.FieldError{Field: field + "." + k.name, Reason: fmt.Sprintf("is %q; it must be one of %s", k.v, quoteAll(k.allowed[1:])), Err: ErrNotAllowed}
		}
	}
	if err := checkText(field+".element", b.Element, MaxCellLength); err != nil {
		return err
	}
	if b.Carrier < 0 || b.Carrier > 2 {
		return &copoly.InputError{Field: field + ".carrier", Value: float64(b.Carrier), Reason: "the monomer carrying the element must be 1 or 2 (0 = not chosen)", Err: copoly.ErrOutOfRange}
	}
	if math.IsNaN(b.ElementCount) || math.IsInf(b.ElementCount, 0) {
		return &copoly.InputError{Field: field + ".elementCount", Value: b.ElementCount, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
	}
	if b.ElementCount < 0 {
		return &copoly.InputError{Field: field + ".elementCount", Value: b.ElementCount, Reason: "the number of atoms cannot be negative (0 = not given)", Err: copoly.ErrOutOfRange}
	}
	if n := len(b.Rows); n > MaxRows {
		return &copoly.InputError{Field: field + ".rows", Value: float64(n), Reason: fmt.Sprintf("at most %d rows", MaxRows), Err: copoly.ErrTooMany}
	}
	for i, r := range b.Rows {
		row := fmt.Sprintf("%s.rows[%d]", field, i)
		if err := checkText(row+".label", r.Label, MaxLabelLength); err != nil {
			return err
		}
		if n := len(r.Cells); n > MaxCells {
			return &copoly.InputError{Field: row + ".cells", Value: float64(n), Reason: fmt.Sprintf("at most %d cells in a row", MaxCells), Err: copoly.ErrTooMany}
		}
		for _, key := range slices.Sorted(maps.Keys(r.Cells)) {
			if n := utf8.RuneCountInString(key); n > MaxCellLength {
				return &copoly.FieldError{Field: row + ".cells", Reason: fmt.Sprintf("has a key %d characters long (%q); the limit is %d", n, abbreviate(key), MaxCellLength), Err: ErrTooLong}
			}
			if !cellKeys[key] {
				return &copoly.FieldError{Field: row + ".cells", Reason: fmt.Sprintf("has a cell keyed %q, which is not a column of the bench table", key), Err: ErrNotAllowed}
			}
			if err := checkText(row+".cells."+key, r.Cells[key], MaxCellLength); err != nil {
				return err
			}
		}
	}
	return nil
}

// checkJCR reports the first ratio of a joint confidence region that is not finite and ≥ 0,
// naming it field[i][j] (as plan.BandOf and the plan's time table name theirs), or more than
// MaxJCRPoints points.
func checkJCR(field string, jcr [][2]float64) error {
	if n := len(jcr); n > MaxJCRPoints {
		return &copoly.InputError{Field: field, Value: float64(n), Reason: fmt.Sprintf("at most %d points", MaxJCRPoints), Err: copoly.ErrTooMany}
	}
	for i, p := range jcr {
		for j, v := range p {
			f := fmt.Sprintf("%s[%d][%d]", field, i, j)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &copoly.InputError{Field: f, Value: v, Reason: fmt.Sprintf("r%d of the point must be a finite number", j+1), Err: copoly.ErrNotFinite}
			}
			if v < 0 {
				return &copoly.InputError{Field: f, Value: v, Reason: fmt.Sprintf("r%d of the point cannot be negative", j+1), Err: copoly.ErrOutOfRange}
			}
		}
	}
	return nil
}

func quoteAll(words []string) string {
	q := make([]string, len(words))
	for i, w := range words {
		q[i] = fmt.Sprintf("%q", w)
	}
	return strings.Join(q, ", ") + ` or ""`
}

// BenchRuns is a bench grid converted to runs ([Bench.Runs]).
type BenchRuns struct {
	// Columns holds the cell keys the grid's forms use, in display order ([bench.Table.Columns]).
	Columns []string
	// Runs, OK and Errors hold, per row, the run, whether the row gave one (a blank row gives
	// none and no error) and the error of a bad row ([bench.Table.Runs]).
	Runs   []copoly.Run
	OK     []bool
	Errors []error
	// Warnings are the data warnings of the rows that converted ([copoly.CheckRuns]).
	Warnings []copoly.RunWarning
}

// Runs checks the grid's structure ([CheckBench], errors named under field) and converts its
// rows ([bench.Table.Runs]) with the monomer molar masses in g/mol, 0 when not given (a form
// that weighs then reports the molar mass it needs); a molar mass given must pass
// [copoly.CheckMolarMass] (errors naming "molarMass1", "molarMass2").
func (b Bench) Runs(field string, molarMass1, molarMass2 float64) (*BenchRuns, error) {
	if err := CheckBench(field, b); err != nil {
		return nil, err
	}
	for i, m := range []float64{molarMass1, molarMass2} {
		if m != 0 {
			if err := copoly.CheckMolarMass(fmt.Sprintf("molarMass%d", i+1), m); err != nil {
				return nil, err
			}
		}
	}
	t := b.Table()
	r := &BenchRuns{Columns: t.Columns()}
	r.Runs, r.OK, r.Errors, r.Warnings = t.Runs(molarMass1, molarMass2)
	return r, nil
}

// Paste checks the grid's structure ([CheckBench], errors named under field) and returns it with
// the rows of a pasted block appended ([bench.Table.Paste]). The grid b is not changed, and a
// block that cannot be read, or whose rows a project could not keep (a cell or label too long),
// gives an error naming "paste".
func (b Bench) Paste(field, text string) (Bench, error) {
	if err := CheckBench(field, b); err != nil {
		return Bench{}, err
	}
	t := b.Table()
	if err := t.Paste(text); err != nil {
		return Bench{}, err
	}
	pasted := BenchOf(t)
	if err := CheckBench(field, pasted); err != nil {
		return Bench{}, &copoly.FieldError{Field: "paste", Reason: "the pasted rows cannot be kept: " + err.Error(), Err: err}
	}
	return pasted, nil
}
