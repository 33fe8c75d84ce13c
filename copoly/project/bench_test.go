package project

import (
	"errors"
	"reflect"
	"slices"
	"strings"
	"testing"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/fit"
)

func TestBenchTableRoundTrip(t *testing.T) {
	tests := []struct {
		name string
		b    Bench
	}{
		{"demo", *Demo().Bench},
		{"empty", Bench{}},
		{"element form", Bench{FeedKind: "mass", ConversionKind: "mass", CompositionKind: "element", Element: "N", Carrier: 2, ElementCount: 1,
			Rows: []BenchRow{{Label: "A", Cells: map[string]string{"mass1": "5,2", "mass2": "4.8", "conversion": "12 %", "elementPercent": "n/a"}}, {}}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			tab := tt.b.Table()
			if got := BenchOf(tab); !reflect.DeepEqual(got, tt.b) {
				t.Errorf("BenchOf(b.Table()) = %+v, want %+v", got, tt.b)
			}
			// The copy is deep: pasting into the table or editing its cells leaves b alone.
			before := BenchOf(tab)
			if len(tab.Rows) > 0 && tab.Rows[0].Cells != nil {
				tab.Rows[0].Cells["F1"] = "changed"
			}
			if err := tab.Paste("0.5\t0.6"); err != nil {
				t.Fatalf("Paste() = %v", err)
			}
			if !reflect.DeepEqual(tt.b, before) {
				t.Errorf("changing b.Table() changed b: %+v, was %+v", tt.b, before)
			}
		})
	}
}

// TestDemoBenchFits checks the invented demo runs against what demoBench documents: every row
// converts without error, and the weighted nonlinear fit (fit.Estimate) places r1 = 0.80,
// r2 = 0.15, the values the runs were generated from, inside its 95 % joint confidence region.
func TestDemoBenchFits(t *testing.T) {
	p := Demo()
	runs, ok, errs, _ := p.Bench.Table().Runs(p.Monomer1.MolarMass, p.Monomer2.MolarMass)
	for i := range runs {
		if errs[i] != nil || !ok[i] {
			t.Fatalf("demo bench row %d: ok %v, error %v", i, ok[i], errs[i])
		}
		if runs[i].SF != 0.01 || runs[i].Conversion <= 0 {
			t.Errorf("demo bench row %d = %+v, want sF 0.01 and a conversion", i, runs[i])
		}
	}
	e, err := fit.Estimate(runs, 0)
	if err != nil {
		t.Fatalf("Estimate(demo runs) = %v", err)
	}
	nl := e.Nonlinear
	if !nl.Weighted {
		t.Errorf("the demo fit is unweighted; every run states sF")
	}
	// The helper can say no: a point far outside (r1 = 5, r2 = 5).
	if inPolygon(5, 5, nl.Region.Boundary) {
		t.Errorf("inPolygon(5, 5) = true for the region %v", nl.Region.Boundary)
	}
	if !inPolygon(0.80, 0.15, nl.Region.Boundary) {
		t.Errorf("the demo fit r1 = %.3f, r2 = %.3f has a region %v that leaves out (0.80, 0.15)", nl.R1, nl.R2, nl.Region.Boundary)
	}
}

// inPolygon reports whether (x, y) lies inside the closed polygon pts (even–odd rule).
func inPolygon(x, y float64, pts [][2]float64) bool {
	in := false
	for i, j := 0, len(pts)-1; i < len(pts); j, i = i, i+1 {
		a, b := pts[i], pts[j]
		if (a[1] > y) != (b[1] > y) && x < (b[0]-a[0])*(y-a[1])/(b[1]-a[1])+a[0] {
			in = !in
		}
	}
	return in
}

// TestBenchRuns: Runs checks the grid and converts it as bench.Table.Runs does; a molar mass
// given must be one.
func TestBenchRuns(t *testing.T) {
	b := Demo().Bench
	r, err := b.Runs("bench", 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	runs, ok, errs, warnings := b.Table().Runs(0, 0)
	if !slices.Equal(r.Columns, b.Table().Columns()) || !slices.Equal(r.Runs, runs) || !slices.Equal(r.OK, ok) ||
		len(r.Errors) != len(errs) || !slices.Equal(r.Warnings, warnings) {
		t.Errorf("Runs = %+v, want %v %v %v %v", r, runs, ok, errs, warnings)
	}
	bad := *b
	bad.FeedKind = "litres"
	if _, err := bad.Runs("bench", 0, 0); copoly.Field(err) != "bench.feedKind" || !errors.Is(err, ErrNotAllowed) {
		t.Errorf("feed kind litres: error %v, want one naming bench.feedKind", err)
	}
	if _, err := b.Runs("bench", 104.152, -1); copoly.Field(err) != "molarMass2" {
		t.Errorf("molar mass -1: error %v, want one naming molarMass2", err)
	}
}

// TestBenchPaste: Paste appends the rows of a block to a copy and leaves the grid as it was; a
// block that cannot be read, or whose rows a project could not keep, gives an error naming
// "paste".
func TestBenchPaste(t *testing.T) {
	b := *Demo().Bench
	n := len(b.Rows)
	got, err := b.Paste("bench", "f10\tX\tF1\n0,25\t0,1\t0,4\n")
	if err != nil {
		t.Fatal(err)
	}
	if len(got.Rows) != n+1 || got.Rows[n].Cells[bench.ColF10] != "0,25" || len(b.Rows) != n {
		t.Errorf("pasted %d rows (last %+v), grid now %d rows; want %d, %d", len(got.Rows), got.Rows[len(got.Rows)-1], len(b.Rows), n+1, n)
	}
	for _, text := range []string{`"unclosed`, "foo\tbar\n1\t2", "label\tF1\n" + strings.Repeat("x", MaxLabelLength+1) + "\t0.5\n"} {
		if _, err := b.Paste("bench", text); copoly.Field(err) != "paste" {
			t.Errorf("Paste(%.30q) error %v, want one naming paste", text, err)
		}
	}
}
