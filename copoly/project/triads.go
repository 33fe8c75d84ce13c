package project

import (
	"fmt"
	"math"

	"copoly/copoly"
	"copoly/copoly/fit"
)

// MaxTriadRows is the largest number of rows of Project.Triads: copoly's own limit
// (fit.MaxTriadRuns), so that every table a project holds can be compared.
const MaxTriadRows = fit.MaxTriadRuns

// TriadSumTolerance is how far from 1 a family of measured triad fractions (A111 + A112 +
// A212, or A222 + A221 + A121) may sum before the page points it out: 0.01 (common practice, no
// source).
const TriadSumTolerance = 0.01

// NotMeasured is the value that marks a measurement of a TriadRow as not made, as an
// alternative to leaving it out (fit.TriadRun reads any value below 0 so).
const NotMeasured = -1

// TriadRow is one row of the measured-triads table as entered: a low-conversion copolymer
// made from feed F10, with its composition F1 and its monomer-centred triad fractions (¹³C NMR)
// in the convention of fit.TriadRun (A112 counts 112 and 211, A221 counts 221 and 122). It is
// the TriadRow of the JavaScript API. A measurement left out (nil) or equal to NotMeasured was
// not made; the values are kept as typed, so the family sums are not checked here.
type TriadRow struct {
	// F10 is the mole fraction of M1 in the feed, in [0, 1].
	F10 float64 `json:"f10" project:"required"`
	// F1 is the mole fraction of M1 in the copolymer; A… are the triad fractions. Each is in
	// [0, 1], NotMeasured, or nil.
	F1   *float64 `json:"F1,omitempty"`
	A111 *float64 `json:"A111,omitempty"`
	A112 *float64 `json:"A112,omitempty"`
	A212 *float64 `json:"A212,omitempty"`
	A222 *float64 `json:"A222,omitempty"`
	A221 *float64 `json:"A221,omitempty"`
	A121 *float64 `json:"A121,omitempty"`
}

// Run returns the row as a fit.TriadRun, with NotMeasured for each measurement left out.
func (r TriadRow) Run() fit.TriadRun {
	v := func(p *float64) float64 {
		if p == nil {
			return NotMeasured
		}
		return *p
	}
	return fit.TriadRun{F10: r.F10, F1: v(r.F1),
		A111: v(r.A111), A112: v(r.A112), A212: v(r.A212),
		A222: v(r.A222), A221: v(r.A221), A121: v(r.A121)}
}

// CheckTriads reports the first invalid row of rows as an error whose field starts with field
// ("project.triads[2].A112", "runs[2].A112"), or nil: more than MaxTriadRows rows, an F10
// outside [0, 1], or a measurement that is neither in [0, 1] nor NotMeasured (NaN included).
func CheckTriads(field string, rows []TriadRow) error {
	if n := len(rows); n > MaxTriadRows {
		return &copoly.InputError{Field: field, Value: float64(n), Reason: fmt.Sprintf("at most %d rows of triads", MaxTriadRows), Err: copoly.ErrTooMany}
	}
	for i, r := range rows {
		f := fmt.Sprintf("%s[%d].", field, i)
		if err := copoly.CheckFraction(f+"f10", r.F10); err != nil {
			return err
		}
		for _, m := range []struct {
			name string
			v    *float64
		}{{"F1", r.F1}, {"A111", r.A111}, {"A112", r.A112}, {"A212", r.A212}, {"A222", r.A222}, {"A221", r.A221}, {"A121", r.A121}} {
			if m.v == nil || *m.v == NotMeasured {
				continue
			}
			if x := *m.v; math.IsNaN(x) || math.IsInf(x, 0) {
				return &copoly.InputError{Field: f + m.name, Value: x, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
			}
			if x := *m.v; x < 0 || x > 1 {
				return &copoly.InputError{Field: f + m.name, Value: x, Reason: fmt.Sprintf("a fraction must lie between 0 and 1 (%d or absent = not measured)", NotMeasured), Err: copoly.ErrOutOfRange}
			}
		}
	}
	return nil
}

// Discriminate checks the rows ([CheckTriads], errors named under field) and compares the
// terminal and the penultimate model on them ([fit.Discriminate]).
func Discriminate(field string, rows []TriadRow) (*fit.Discrimination, error) {
	if err := CheckTriads(field, rows); err != nil {
		return nil, err
	}
	runs := make([]fit.TriadRun, len(rows))
	for i, r := range rows {
		runs[i] = r.Run()
	}
	return fit.Discriminate(runs)
}
