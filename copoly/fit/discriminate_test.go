package fit

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

func triadRunsFrom(m copoly.Model, seq func(float64) copoly.Sequence, feeds []float64) []TriadRun {
	var runs []TriadRun
	for _, f := range feeds {
		s := seq(f)
		runs = append(runs, TriadRun{F10: f, F1: s.F1, A111: s.T111, A112: s.T112, A212: s.T212, A222: s.T222, A221: s.T221, A121: s.T121})
	}
	return runs
}

func TestDiscriminateRecoversPenultimate(t *testing.T) {
	pm := copoly.Penultimate{R11: 0.3, R21: 0.9, R22: 0.04, R12: 0.2} // a strong penultimate effect (invented for the test)
	feeds := []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9}
	runs := triadRunsFrom(pm, func(f float64) copoly.Sequence { s, _ := pm.Sequence(f); return s }, feeds)
	d, err := Discriminate(runs)
	if err != nil {
		t.Fatal(err)
	}
	// Each fitted model's values at the runs' feeds are its own sequence statistics there.
	pt := copoly.Terminal{R1: d.Terminal.Params[0], R2: d.Terminal.Params[1]}
	pp := copoly.Penultimate{R11: d.Penultimate.Params[0], R21: d.Penultimate.Params[1], R22: d.Penultimate.Params[2], R12: d.Penultimate.Params[3]}
	if len(d.Predicted.Terminal) != len(runs) || len(d.Predicted.Penultimate) != len(runs) {
		t.Fatalf("predicted %d and %d runs, want %d", len(d.Predicted.Terminal), len(d.Predicted.Penultimate), len(runs))
	}
	for i, r := range runs {
		st, _ := pt.Sequence(r.F10)
		sp, _ := pp.Sequence(r.F10)
		if d.Predicted.Terminal[i] != st || d.Predicted.Penultimate[i] != sp {
			t.Errorf("predicted at f10 = %v: %+v, %+v; want %+v, %+v", r.F10, d.Predicted.Terminal[i], d.Predicted.Penultimate[i], st, sp)
		}
	}
	want := []float64{pm.R11, pm.R21, pm.R22, pm.R12}
	for i, v := range d.Penultimate.Params {
		if !scalar.EqualWithinAbsOrRel(v, want[i], 1e-4, 1e-4) {
			t.Errorf("penultimate fit %v, want %v", d.Penultimate.Params, want)
			break
		}
	}
	if !d.Supported || d.Penultimate.SSR > 1e-12 {
		t.Errorf("exact penultimate data: %+v", d)
	}
}

func TestDiscriminateTerminalData(t *testing.T) {
	tm := copoly.Terminal{R1: 0.52, R2: 0.46}
	feeds := []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9}
	runs := triadRunsFrom(tm, func(f float64) copoly.Sequence { s, _ := tm.Sequence(f); return s }, feeds)
	// A fixed, deterministic scatter of ±0.005 (no trend).
	for i := range runs {
		sign := float64(1 - 2*(i%2))
		runs[i].F1 += 0.005 * sign
		runs[i].A112 -= 0.005 * sign
		runs[i].A221 += 0.004 * sign
	}
	d, err := Discriminate(runs)
	if err != nil {
		t.Fatal(err)
	}
	if d.Supported || math.Abs(d.Terminal.Params[0]-0.52) > 0.05 || math.Abs(d.Terminal.Params[1]-0.46) > 0.05 {
		t.Errorf("terminal data: %+v", d)
	}
}

// TestDiscriminatePublishedTriads runs the comparison on the acrylonitrile/acrylic acid triads of
// Brar & Dutta (1998) as tabulated by Hauch et al. (2008, Table 2): testdata/an_aa_triads.csv.
func TestDiscriminatePublishedTriads(t *testing.T) {
	const path = "../../testdata/an_aa_triads.csv"
	fh, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	r := csv.NewReader(fh)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var runs []TriadRun
	for i, row := range rows[1:] {
		v := make([]float64, len(row))
		for k := range row {
			if v[k], err = strconv.ParseFloat(row[k], 64); err != nil {
				t.Fatalf("%s:%d: %v", path, i+8, err)
			}
		}
		// The families sum to 1 within the table's rounding (±0.002).
		if s1, s2 := v[2]+v[3]+v[4], v[5]+v[6]+v[7]; math.Abs(s1-1) > 0.002 || math.Abs(s2-1) > 0.002 {
			t.Errorf("%s:%d: families sum to %v and %v", path, i+8, s1, s2)
		}
		tr := TriadRun{F10: v[0], F1: v[1], A111: v[2], A112: v[3], A212: v[4], A121: v[5], A221: v[6], A222: v[7]}
		if v[0] == 0.50 {
			tr.F1 = -1 // inconsistent with its own triads (see the file's header)
		}
		runs = append(runs, tr)
	}
	d, err := Discriminate(runs)
	if err != nil {
		t.Fatal(err)
	}
	// Acrylonitrile enters faster than acrylic acid at these feeds in this table (F1 < f1), so the
	// terminal fit must give r1 < r2; the fit residual must be of the size of the table's
	// scatter (a few hundredths per value).
	tp := d.Terminal.Params
	if !(tp[0] < tp[1]) || math.Sqrt(d.Terminal.SSR/float64(d.Terminal.N)) > 0.06 || d.Penultimate.SSR > d.Terminal.SSR {
		t.Errorf("AN/AA: %+v", d)
	}
	t.Logf("AN/AA triads: terminal r = %.3g, %.3g; penultimate %v; %s", tp[0], tp[1], d.Penultimate.Params, d.Verdict)
}
