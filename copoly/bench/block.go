package bench

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode"
	"unicode/utf8"

	"copoly/copoly"
)

// Sentinel errors of the table reader.
var (
	// ErrNotTable reports text that cannot be read as a table (empty, or broken CSV quoting).
	ErrNotTable = copoly.NewSentinel(copoly.CodeNotATable, "copoly: not a readable table")
	// ErrNotNumber reports a cell that is not a number [ParseNumber] accepts.
	ErrNotNumber = copoly.NewSentinel(copoly.CodeNotANumber, "copoly: not a number")
)

// Limits of [ParseBlock].
const (
	// MaxBlockBytes is the largest text ParseBlock reads (1 MiB).
	MaxBlockBytes = 1 << 20
	// MaxBlockRows is the largest number of data rows, the same as [MaxRuns].
	MaxBlockRows = MaxRuns
	// MaxBlockColumns is the largest number of columns.
	MaxBlockColumns = 64
)

// Block is a block of cells pasted from a spreadsheet or read from a CSV file.
type Block struct {
	// Header holds the column names, or is nil when the first row holds data.
	Header []string
	// Rows holds the data rows. ParseBlock makes every row, and the header, as wide as the widest
	// row.
	Rows [][]string
	// Separator is the separator ParseBlock found: '\t', ';' or ',', or 0 for a single column.
	// WriteBlock ignores it and always writes commas.
	Separator rune
}

// ParseBlock reads a block of text copied from a spreadsheet or a CSV file.
//
// The text is read as CSV (RFC 4180 quoting, by encoding/csv, lenient about ragged rows) with a
// separator found from the text: a tab when the text holds tabs (a spreadsheet copy), else a
// semicolon (the CSV of spreadsheets in locales that write a decimal comma), else a comma.
// Separators inside quotes do not count, and when the text holds both semicolons and commas,
// commas are chosen only if they are found the same number of times in every line and
// semicolons are not. A column of decimal-comma numbers with no other separator ("0,35"
// on every line, at most one comma per line, always between two digits, and no point
// anywhere) is read as one column, not two.
//
// A leading byte order mark is removed, invalid UTF-8 is replaced by U+FFFD, line ends may be
// \n, \r\n or \r, spaces around each cell are removed, and lines with no text are skipped, as
// are columns empty in every row at the right. The first row is the header when none of its
// cells is a number by [ParseNumber].
//
// Errors name the field "table" and wrap [ErrNotTable] (no cells, or a quoting error, with its
// line and column) or [copoly.ErrTooMany] (above [MaxBlockBytes], [MaxBlockRows] data rows or
// [MaxBlockColumns] columns).
func ParseBlock(text string) (Block, error) {
	if len(text) > MaxBlockBytes {
		return Block{}, &copoly.InputError{Field: "table", Value: float64(len(text)), Reason: fmt.Sprintf("the text holds %d bytes; the limit is %d", len(text), MaxBlockBytes), Err: copoly.ErrTooMany}
	}
	text = strings.TrimPrefix(text, "\uFEFF")
	text = strings.ToValidUTF8(text, "\uFFFD")
	text = strings.ReplaceAll(text, "\r\n", "\n")
	text = strings.ReplaceAll(text, "\r", "\n")

	sep := detectSeparator(text)
	r := csv.NewReader(strings.NewReader(text))
	r.Comma = sep
	if sep == 0 {
		r.Comma = '\t' // no tab in the text: everything is one column
	}
	r.LazyQuotes = false
	r.FieldsPerRecord = -1
	r.TrimLeadingSpace = sep == ',' || sep == ';' // not for tabs: it would eat empty cells
	r.ReuseRecord = false

	var rows [][]string
	width := 0
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return Block{}, &copoly.FieldError{Field: "table", Reason: fmt.Sprintf("line %d, column %d: %v", pe.Line, pe.Column, pe.Err), Err: ErrNotTable}
			}
			return Block{}, &copoly.FieldError{Field: "table", Reason: err.Error(), Err: ErrNotTable}
		}
		blank := true
		for i, c := range rec {
			rec[i] = trimCell(c)
			if rec[i] != "" {
				blank = false
			}
		}
		if blank {
			continue
		}
		// Drop empty cells at the right; the width is restored below.
		n := len(rec)
		for n > 0 && rec[n-1] == "" {
			n--
		}
		rec = rec[:n]
		if n > MaxBlockColumns {
			line, _ := r.FieldPos(0)
			return Block{}, &copoly.InputError{Field: "table", Value: float64(n), Reason: fmt.Sprintf("line %d has %d columns; the limit is %d", line, n, MaxBlockColumns), Err: copoly.ErrTooMany}
		}
		if len(rows) > MaxBlockRows { // the header plus MaxTableRows rows are read
			return Block{}, &copoly.InputError{Field: "table", Value: float64(len(rows) + 1), Reason: fmt.Sprintf("more than %d rows of data", MaxBlockRows), Err: copoly.ErrTooMany}
		}
		width = max(width, n)
		rows = append(rows, rec)
	}
	if len(rows) == 0 {
		return Block{}, &copoly.FieldError{Field: "table", Reason: "no cells found: paste rows of cells separated by tabs, semicolons or commas", Err: ErrNotTable}
	}
	for i, rec := range rows {
		if len(rec) < width {
			rows[i] = append(rec, make([]string, width-len(rec))...)
		}
	}
	t := Block{Rows: rows, Separator: sep}
	if isHeader(rows[0]) {
		t.Header, t.Rows = rows[0], rows[1:]
	}
	if len(t.Rows) > MaxBlockRows {
		return Block{}, &copoly.InputError{Field: "table", Value: float64(len(t.Rows)), Reason: fmt.Sprintf("more than %d rows of data", MaxBlockRows), Err: copoly.ErrTooMany}
	}
	return t, nil
}

// trimCell removes white space and byte order marks (U+FEFF) around a cell.
func trimCell(s string) string {
	return strings.TrimFunc(s, func(r rune) bool { return unicode.IsSpace(r) || r == '\uFEFF' })
}

// isHeader reports whether none of the cells of a row is a number.
func isHeader(row []string) bool {
	for _, c := range row {
		if _, err := ParseNumber(c); err == nil {
			return false
		}
	}
	return true
}

// detectSeparator returns the separator of text ('\t', ';' or ',') or 0 for one column; see
// ParseBlock. text has \n line ends.
func detectSeparator(text string) rune {
	type line struct{ tabs, semis, commas int }
	var lines []line
	var cur, all line // all counts every line, blank ones too
	inQuote, nonBlank := false, false
	digitCommas, points := true, false
	prev := rune(0)
	rs := []rune(text)
	for i, c := range rs {
		switch {
		case c == '"':
			inQuote = !inQuote
		case inQuote:
		case c == '\n':
			if nonBlank {
				lines = append(lines, cur)
			}
			cur, nonBlank = line{}, false
		case c == '\t':
			cur.tabs++
			all.tabs++
		case c == ';':
			cur.semis++
			all.semis++
		case c == ',':
			cur.commas++
			all.commas++
			if !isDigit(prev) || i+1 >= len(rs) || !isDigit(rs[i+1]) {
				digitCommas = false
			}
		case c == '.':
			points = true
		}
		if !unicode.IsSpace(c) && !strings.ContainsRune("\uFEFF\";,", c) {
			nonBlank = true
		}
		prev = c
	}
	if nonBlank {
		lines = append(lines, cur)
	}
	tabs, semis, commas := all.tabs > 0, all.semis > 0, all.commas > 0
	semisSame, commasSame := true, true
	for i, l := range lines {
		if i > 0 {
			semisSame = semisSame && l.semis == lines[0].semis
			commasSame = commasSame && l.commas == lines[0].commas
		}
	}
	switch {
	case tabs:
		return '\t'
	case semis && (semisSame || !commas || !commasSame):
		return ';'
	case commas:
		if !semis && digitCommas && !points {
			oneEach := true
			for _, l := range lines {
				oneEach = oneEach && l.commas <= 1
			}
			if oneEach {
				return 0 // a column of decimal-comma numbers
			}
		}
		return ','
	}
	return 0
}

func isDigit(r rune) bool { return '0' <= r && r <= '9' }

// abbreviate shortens long cell text for messages.
func abbreviate(s string) string {
	const n = 40
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	return string([]rune(s)[:n]) + "…"
}

// WriteBlock writes t as CSV (RFC 4180: comma separators, \r\n line ends, fields quoted when
// they hold a comma, quote, semicolon, tab or line break, quotes doubled), header first when
// there is one. A data cell that [ParseNumber] reads as a decimal-comma number is written with a
// decimal point ("0,35" as "0.35", "35,5 %" as "35.5 %"), so that any program reads it as a
// number; other cells are written as they are. [ParseBlock] reads the output back to the same
// cells (with decimal points). Fields are all quoted in the one case where the output would
// otherwise look like a column of decimal-comma numbers to ParseBlock.
func WriteBlock(w io.Writer, t Block) error {
	rows := make([][]string, 0, len(t.Rows)+1)
	if len(t.Header) > 0 {
		rows = append(rows, t.Header)
	}
	for _, r := range t.Rows {
		out := make([]string, len(r))
		for i, c := range r {
			out[i] = c
			if strings.Contains(c, ",") {
				if _, err := ParseNumber(c); err == nil {
					out[i] = strings.Replace(c, ",", ".", 1)
				}
			}
		}
		rows = append(rows, out)
	}
	var b strings.Builder
	writeCSV(&b, rows, false)
	if detectSeparator(b.String()) == 0 && hasMultipleColumns(rows) {
		b.Reset()
		writeCSV(&b, rows, true)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func hasMultipleColumns(rows [][]string) bool {
	for _, r := range rows {
		if len(r) > 1 {
			return true
		}
	}
	return false
}

// writeCSV writes rows as RFC 4180 CSV, quoting every field when all is set.
func writeCSV(b *strings.Builder, rows [][]string, all bool) {
	for _, r := range rows {
		for i, c := range r {
			if i > 0 {
				b.WriteByte(',')
			}
			if all || strings.ContainsAny(c, ",;\"\t\r\n") || (len(r) == 1 && c == "") {
				b.WriteByte('"')
				b.WriteString(strings.ReplaceAll(c, `"`, `""`))
				b.WriteByte('"')
			} else {
				b.WriteString(c)
			}
		}
		b.WriteString("\r\n")
	}
}
