package project

import (
	"errors"
	"testing"

	"copoly/copoly"
	"copoly/copoly/fit"
)

// TestDiscriminate: the rows are checked as CheckTriads checks them (−0.5 is not "not measured",
// unlike in fit.TriadRun) and then compared as fit.Discriminate compares them.
func TestDiscriminate(t *testing.T) {
	pm := copoly.Penultimate{R11: 0.3, R21: 0.9, R22: 0.04, R12: 0.2} // invented for the test
	var rows []TriadRow
	var runs []fit.TriadRun
	for _, f := range []float64{0.2, 0.4, 0.6, 0.8} {
		s, _ := pm.Sequence(f)
		F1, a112, a221 := s.F1, s.T112, s.T221
		rows = append(rows, TriadRow{F10: f, F1: &F1, A112: &a112, A221: &a221})
		runs = append(runs, rows[len(rows)-1].Run())
	}
	got, err := Discriminate("runs", rows)
	if err != nil {
		t.Fatal(err)
	}
	want, _ := fit.Discriminate(runs)
	if got.F != want.F || got.Verdict != want.Verdict || got.Penultimate.SSR != want.Penultimate.SSR {
		t.Errorf("Discriminate = %+v, want %+v", got, want)
	}
	minus := -0.5
	rows[1].A112 = &minus
	if _, err := Discriminate("runs", rows); copoly.Field(err) != "runs[1].A112" || !errors.Is(err, copoly.ErrOutOfRange) {
		t.Errorf("A112 = -0.5: error %v, want one naming runs[1].A112", err)
	}
}
