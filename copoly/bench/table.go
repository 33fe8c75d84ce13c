package bench

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"copoly/copoly"
)

// Table is the bench-data grid as the chemist typed it: one entry form for the whole table
// (how the feed, the conversion and the composition are given) and, per row, the text of each
// cell. Keeping the text means nothing typed is lost, even a cell that is not (yet) a number;
// [Table.Runs] converts it.
type Table struct {
	// FeedKind, ConversionKind and CompositionKind select the forms of [RunInput]; empty selects
	// "fraction", "none" and "fraction".
	FeedKind, ConversionKind, CompositionKind string
	// Element, Carrier and ElementCount describe the element of an elemental analysis
	// (CompositionKind "element"), as in [RunInput].
	Element      string
	Carrier      int
	ElementCount float64
	Rows         []Row
}

// Row is one row of a [Table]: a label and the text of each cell, keyed by column
// (see [Table.Columns]).
type Row struct {
	Label string
	Cells map[string]string
}

// Column keys of a [Table], in display order within each group.
const (
	ColF10            = "f10"
	ColMass1          = "mass1"
	ColMass2          = "mass2"
	ColMoles1         = "moles1"
	ColMoles2         = "moles2"
	ColConversion     = "conversion"
	ColF1             = "F1"
	ColMassFraction1  = "massFraction1"
	ColIntegral1      = "integral1"
	ColProtons1       = "protons1"
	ColIntegral2      = "integral2"
	ColProtons2       = "protons2"
	ColElementPercent = "elementPercent"
	ColSF             = "sF"
	ColSX             = "sX"
	ColSf             = "sf"
)

// Columns returns the cell keys the table's forms use, in display order (the label comes before
// them and is not listed). Uncertainty columns come last; sX only with a conversion.
func (t Table) Columns() []string {
	var c []string
	switch t.FeedKind {
	case FeedMass:
		c = append(c, ColMass1, ColMass2)
	case FeedMoles:
		c = append(c, ColMoles1, ColMoles2)
	default:
		c = append(c, ColF10)
	}
	if t.ConversionKind == ConversionMolar || t.ConversionKind == ConversionMass {
		c = append(c, ColConversion)
	}
	switch t.CompositionKind {
	case CompositionMassFraction:
		c = append(c, ColMassFraction1)
	case CompositionNMR:
		c = append(c, ColIntegral1, ColProtons1, ColIntegral2, ColProtons2)
	case CompositionElement:
		c = append(c, ColElementPercent)
	default:
		c = append(c, ColF1)
	}
	c = append(c, ColSF)
	if t.ConversionKind == ConversionMolar || t.ConversionKind == ConversionMass {
		c = append(c, ColSX)
	}
	return append(c, ColSf)
}

// optionalColumns are the columns a row may leave empty.
var optionalColumns = map[string]bool{ColSF: true, ColSX: true, ColSf: true}

// Runs converts every row with [ConvertRuns]: each cell through [ParseCell] (decimal comma or
// point, percent sign), errors naming the cell as "runs[i].key". A row whose cells are all empty
// is skipped (ok[i] false, no error). It returns one Run, one ok flag and one error per row, and
// the data warnings of [copoly.CheckRuns] for the rows that converted, with their rows numbered as in
// the table.
func (t Table) Runs(molarMass1, molarMass2 float64) (runs []copoly.Run, ok []bool, errs []error, warnings []copoly.RunWarning) {
	n := len(t.Rows)
	runs, ok, errs = make([]copoly.Run, n), make([]bool, n), make([]error, n)
	if n > MaxRuns {
		for i := range errs {
			errs[i] = &copoly.InputError{Field: "runs", Value: float64(n), Reason: fmt.Sprintf("at most %d rows", MaxRuns), Err: copoly.ErrTooMany}
		}
		return runs, ok, errs, nil
	}
	cols := t.Columns()
	var good []copoly.Run
	var index []int
	for i, row := range t.Rows {
		in := RunInput{Label: row.Label, FeedKind: t.FeedKind, ConversionKind: t.ConversionKind, CompositionKind: t.CompositionKind,
			Element: t.Element, Carrier: t.Carrier, ElementCount: t.ElementCount}
		empty := strings.TrimSpace(row.Label) == ""
		for _, c := range cols {
			if strings.TrimSpace(row.Cells[c]) != "" {
				empty = false
			}
		}
		if empty {
			continue
		}
		var err error
		for _, c := range cols {
			text := row.Cells[c]
			if optionalColumns[c] && strings.TrimSpace(text) == "" {
				continue
			}
			v, e := ParseCell(fmt.Sprintf("runs[%d].%s", i, c), text)
			if e != nil {
				err = e
				break
			}
			in.set(c, v)
		}
		if err == nil {
			var r copoly.Run
			r, err = in.convert(i, molarMass1, molarMass2)
			if err == nil {
				runs[i], ok[i] = r, true
				good = append(good, r)
				index = append(index, i)
			}
		}
		errs[i] = err
	}
	for _, w := range copoly.CheckRuns(good) {
		if w.Row >= 0 && w.Row < len(index) {
			row := index[w.Row]
			w.Field = strings.Replace(w.Field, fmt.Sprintf("runs[%d]", w.Row), fmt.Sprintf("runs[%d]", row), 1)
			w.Message = strings.Replace(w.Message, fmt.Sprintf("row %d", w.Row+1), fmt.Sprintf("row %d", row+1), 1)
			w.Row = row
		}
		warnings = append(warnings, w)
	}
	return runs, ok, errs, warnings
}

// set stores the value of column c.
func (in *RunInput) set(c string, v float64) {
	switch c {
	case ColF10:
		in.F10 = v
	case ColMass1:
		in.Mass1 = v
	case ColMass2:
		in.Mass2 = v
	case ColMoles1:
		in.Moles1 = v
	case ColMoles2:
		in.Moles2 = v
	case ColConversion:
		in.Conversion = v
	case ColF1:
		in.F1 = v
	case ColMassFraction1:
		in.MassFraction1 = v
	case ColIntegral1:
		in.Integral1 = v
	case ColProtons1:
		in.Protons1 = v
	case ColIntegral2:
		in.Integral2 = v
	case ColProtons2:
		in.Protons2 = v
	case ColElementPercent:
		in.ElementPercent = v
	case ColSF:
		in.SF = v
	case ColSX:
		in.SX = v
	case ColSf:
		in.Sf = v
	}
}

// columnAliases maps header words of pasted tables (lower case, spaces and punctuation removed)
// to column keys.
var columnAliases = map[string]string{
	"f10": ColF10, "f0": ColF10, "f1,0": ColF10, "feed": ColF10, "f1feed": ColF10,
	"mass1": ColMass1, "m1": ColMass1, "mass2": ColMass2, "m2": ColMass2,
	"moles1": ColMoles1, "n1": ColMoles1, "moles2": ColMoles2, "n2": ColMoles2,
	"conversion": ColConversion, "x": ColConversion, "w": ColConversion,
	"f1": ColF1, "f1copolymer": ColF1, "copolymer": ColF1, "fbar": ColF1, "f1cum": ColF1,
	"massfraction1": ColMassFraction1, "w1": ColMassFraction1,
	"integral1": ColIntegral1, "i1": ColIntegral1, "protons1": ColProtons1, "h1": ColProtons1,
	"integral2": ColIntegral2, "i2": ColIntegral2, "protons2": ColProtons2, "h2": ColProtons2,
	"elementpercent": ColElementPercent, "element%": ColElementPercent, "%n": ColElementPercent, "%cl": ColElementPercent, "n%": ColElementPercent, "cl%": ColElementPercent,
	"sf": ColSF, "sx": ColSX, "sf0": ColSf, "sf10": ColSf,
	"label": "label", "sample": "label", "run": "label", "name": "label",
}

func headerKey(h string) string {
	var b strings.Builder
	for _, r := range h {
		switch {
		case r == ' ' || r == '_' || r == '-' || r == '(' || r == ')' || r == '[' || r == ']':
		default:
			b.WriteRune(r)
		}
	}
	s := b.String()
	// F1 (copolymer) and f1/f10 (feed) differ only in case: keep the case of a leading F.
	if strings.HasPrefix(s, "F1") || s == "F" || s == "Fbar" {
		return ColF1
	}
	if s == "sF" || s == "σF" {
		return ColSF
	}
	if s == "sf" || s == "σf" {
		return ColSf
	}
	return columnAliases[strings.ToLower(s)]
}

// Paste reads a pasted spreadsheet block or CSV text ([ParseBlock]) into new rows appended to
// the table. With a header row, columns are matched by name (f10 or f0 for the feed, X for the
// conversion, F1 or F for the copolymer, sF, sX, sf, label or sample…; case matters only between
// F and f); without one, the columns are taken in the order of [Table.Columns], after a
// first text column taken as the label. A header naming the columns of another form (X, mass1,
// integral1…) switches the table to that form. A block with a header row but no data rows is
// an error, and so is a header naming one column twice ("F1" and "F"). A paste that fails
// (unknown header names, a row wider than the columns, too many rows) returns an error naming
// "paste" (also for the errors of ParseBlock, which name "table") and changes nothing, not even
// the form.
func (t *Table) Paste(text string) error {
	tab, err := ParseBlock(text)
	if err != nil {
		return asPaste(err)
	}
	if len(tab.Rows) == 0 {
		return &copoly.FieldError{Field: "paste", Reason: fmt.Sprintf("the block holds only a header row (%s) and no rows of data", abbreviate(strings.Join(tab.Header, ", "))), Err: ErrNotTable}
	}
	next := *t // the form switches below apply only if the paste succeeds
	cols := t.Columns()
	var keys []string
	if len(tab.Header) > 0 {
		for _, h := range tab.Header {
			k := headerKey(strings.TrimSpace(h))
			if h == "" {
				return &copoly.FieldError{Field: "paste", Reason: fmt.Sprintf("column %d has no name in the header row (%s)", len(keys)+1, abbreviate(strings.Join(tab.Header, ", "))), Err: ErrNotTable}
			}
			if k == "" {
				return &copoly.FieldError{Field: "paste", Reason: fmt.Sprintf("unknown column %q; use names such as label, f10, X, F1, sF, sX, sf (or paste without a header in the order %s)", h, strings.Join(cols, ", ")), Err: ErrNotTable}
			}
			if j := slices.Index(keys, k); j >= 0 {
				return &copoly.FieldError{Field: "paste", Reason: fmt.Sprintf("columns %d (%q) and %d (%q) are both %s; keep one of them", j+1, tab.Header[j], len(keys)+1, h, k), Err: ErrNotTable}
			}
			keys = append(keys, k)
		}
		// A header naming columns of another form switches the table to it.
		for _, k := range keys {
			switch k {
			case ColConversion, ColSX:
				if next.ConversionKind != ConversionMass {
					next.ConversionKind = ConversionMolar
				}
			case ColMass1, ColMass2:
				next.FeedKind = FeedMass
			case ColMoles1, ColMoles2:
				next.FeedKind = FeedMoles
			case ColMassFraction1:
				next.CompositionKind = CompositionMassFraction
			case ColIntegral1, ColIntegral2, ColProtons1, ColProtons2:
				next.CompositionKind = CompositionNMR
			case ColElementPercent:
				next.CompositionKind = CompositionElement
			}
		}
	}
	if len(t.Rows)+len(tab.Rows) > MaxRuns {
		return &copoly.InputError{Field: "paste", Value: float64(len(t.Rows) + len(tab.Rows)), Reason: fmt.Sprintf("at most %d rows", MaxRuns), Err: copoly.ErrTooMany}
	}
	var rows []Row
	for _, r := range tab.Rows {
		row := Row{Cells: map[string]string{}}
		ks := keys
		if ks == nil {
			ks = cols
			if len(r) > 0 {
				if _, err := ParseNumber(r[0]); err != nil {
					ks = append([]string{"label"}, cols...)
				}
			}
		}
		if len(r) > len(ks) {
			return &copoly.FieldError{Field: "paste", Reason: fmt.Sprintf("a row has %d cells but only %d columns are expected (%s)", len(r), len(ks), strings.Join(ks, ", ")), Err: ErrNotTable}
		}
		for j, cell := range r {
			if ks[j] == "label" {
				row.Label = cell
			} else {
				row.Cells[ks[j]] = cell
			}
		}
		rows = append(rows, row)
	}
	next.Rows = append(t.Rows[:len(t.Rows):len(t.Rows)], rows...)
	*t = next
	return nil
}

// asPaste returns an error of ParseBlock, which names the field "table", naming "paste".
func asPaste(err error) error {
	var ie *copoly.InputError
	if errors.As(err, &ie) && ie.Field == "table" {
		c := *ie
		c.Field = "paste"
		return &c
	}
	var fe *copoly.FieldError
	if errors.As(err, &fe) && fe.Field == "table" {
		c := *fe
		c.Field = "paste"
		return &c
	}
	return err
}
