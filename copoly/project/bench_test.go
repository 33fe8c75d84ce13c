package project

import (
	"copoly/copoly/fit"
)

import (
	"reflect"
	"testing"
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
