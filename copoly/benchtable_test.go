package copoly

import (
	"errors"
	"math"
	"testing"
)

func TestBenchTablePasteWithHeader(t *testing.T) {
	var tab BenchTable
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
	want := []Run{{F10: 0.2, Conversion: 0.05, F1: 0.3, SF: 0.01}, {F10: 0.5, Conversion: 0.08, F1: 0.52, SF: 0.01}}
	for i := range want {
		if !ok[i] || errs[i] != nil || runs[i] != want[i] {
			t.Errorf("row %d: %+v, %v, %v; want %+v", i, runs[i], ok[i], errs[i], want[i])
		}
	}
}

func TestBenchTablePasteWithoutHeader(t *testing.T) {
	tab := BenchTable{ConversionKind: ConversionMolar}
	// Columns in the order of Columns(): f10, conversion, F1, sF, sX, sf; a leading text label.
	if err := tab.Paste("r1,0.1,0.05,0.2\nr2,0.9,0.05,0.85\n"); err != nil {
		t.Fatal(err)
	}
	runs, ok, errs, _ := tab.Runs(0, 0)
	if !ok[0] || !ok[1] || errs[0] != nil || runs[1].F10 != 0.9 || runs[1].F1 != 0.85 || tab.Rows[0].Label != "r1" {
		t.Errorf("runs %+v ok %v errs %v rows %+v", runs, ok, errs, tab.Rows)
	}
	if err := tab.Paste("label\tfoo\n1\t2\n"); err == nil || Field(err) != "paste" {
		t.Errorf("unknown header: error %v", err)
	}
	if len(tab.Rows) != 2 {
		t.Errorf("a failed paste changed the table: %d rows", len(tab.Rows))
	}
}

func TestBenchTableRunsNamesCells(t *testing.T) {
	tab := BenchTable{FeedKind: FeedMass, Rows: []BenchRow{
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
	if ok[1] || Field(errs[1]) != "runs[1].mass1" || !errors.Is(errs[1], ErrNotNumber) {
		t.Errorf("row 1 error %v (field %q)", errs[1], Field(errs[1]))
	}
	if ok[2] || errs[2] != nil {
		t.Errorf("blank row: %v %v", ok[2], errs[2])
	}
	if ok[3] || Field(errs[3]) != "runs[3].F1" {
		t.Errorf("row 3 error %v (field %q)", errs[3], Field(errs[3]))
	}
}

func TestBenchTableWarningsKeepRowNumbers(t *testing.T) {
	tab := BenchTable{ConversionKind: ConversionMolar, Rows: []BenchRow{
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
