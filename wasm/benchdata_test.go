//go:build js && wasm

package main

import (
	"maps"
	"slices"
	"strings"
	"syscall/js"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/project"
)

// The bench-table methods: benchRuns returns an error object inside its result for each bad
// row, and pasteBench returns the table with the pasted rows; both read the table with the
// project file's reader (project.ParseBench).

// demoBenchArg returns {bench} holding the demo project's bench table as the page has it.
func demoBenchArg(t *testing.T, api js.Value) js.Value {
	t.Helper()
	b := demoArg(t, api).Get("project").Get("bench")
	if b.IsUndefined() {
		t.Fatal("the demo project has no bench")
	}
	return jsEval(`((b) => ({bench: structuredClone(b)}))`).Invoke(b)
}

func TestBenchRuns(t *testing.T) {
	api, _ := testAPI(t)
	arg := demoBenchArg(t, api)
	// want is project.Bench.Runs of the bench b (by the demo's bench JSON), as the d.ts has it.
	want := func(b project.Bench) map[string]any {
		r := must(b.Runs("bench", 0, 0))
		runs, errs, ws := make([]any, len(r.Runs)), make([]any, len(r.Runs)), make([]any, len(r.Warnings))
		for i, run := range r.Runs {
			if !r.OK[i] || r.Errors[i] != nil {
				t.Fatalf("row %d does not convert in copoly: %v", i, r.Errors[i])
			}
			runs[i] = map[string]any{"f10": run.F10, "conversion": run.Conversion, "F1": run.F1, "sF": run.SF, "sX": run.SX, "sf": run.Sf}
		}
		for i, w := range r.Warnings {
			ws[i] = map[string]any{"row": w.Row, "field": w.Field, "message": w.Message, "code": w.Code}
		}
		return map[string]any{"columns": r.Columns, "runs": runs, "errors": errs, "warnings": ws}
	}
	demo := project.Demo().Bench
	r := call(api, "benchRuns", arg)
	wantNoError(t, r)
	wantAt(t, r, want(*demo))
	// One feed in every row: a warning for the set.
	oneFeed := *demo
	oneFeed.Rows = slices.Clone(demo.Rows)
	for i := range oneFeed.Rows {
		oneFeed.Rows[i].Cells = maps.Clone(demo.Rows[i].Cells)
		oneFeed.Rows[i].Cells[bench.ColF10] = "0,25"
	}
	if w := want(oneFeed)["warnings"].([]any); len(w) == 0 {
		t.Fatal("copoly gives no warning for runs at one feed; pick another case")
	}
	r = call(api, "benchRuns", edited(arg, `a.bench.rows.forEach(r => r.cells.`+bench.ColF10+` = "0,25")`))
	wantNoError(t, r)
	wantAt(t, r, want(oneFeed))

	// A bad cell and a blank row: null runs, an error naming the cell for the first only.
	bad := edited(arg, `a.bench.rows[1].cells.F1 = "0,4x"; a.bench.rows[2] = {label: "", cells: {}}`)
	r = call(api, "benchRuns", bad)
	wantNoError(t, r)
	if !r.Get("runs").Index(1).IsNull() || !r.Get("runs").Index(2).IsNull() || r.Get("runs").Index(3).IsNull() {
		t.Errorf("runs = %s, want null at 1 and 2 only", stringify(r.Get("runs")))
	}
	wantError(t, r.Get("errors").Index(1), "runs[1].F1", "")
	// A cell's error names its row and says, in a code, that the text is not a number.
	if e := r.Get("errors").Index(1); e.Get("row").Int() != 1 || e.Get("code").String() != copoly.CodeNotANumber {
		t.Errorf("errors[1] = %s, want row 1 and code %s", stringify(e), copoly.CodeNotANumber)
	}
	if !r.Get("errors").Index(2).IsNull() {
		t.Errorf("errors[2] for a blank row = %s, want null", stringify(r.Get("errors").Index(2)))
	}

	// A feed by mass needs the molar masses: an error naming molarMass1 without them, the same
	// feed as bench.FeedFromMasses with them.
	mass := jsEval(`({bench: {feedKind: "mass", rows: [{label: "m", cells: {mass1: "10,4", mass2: "12.8", F1: "0.45"}}]}})`)
	r = call(api, "benchRuns", mass)
	wantNoError(t, r)
	wantError(t, r.Get("errors").Index(0), "molarMass1", "")
	mass.Set("molarMass1", 104.15)
	mass.Set("molarMass2", 128.17)
	r = call(api, "benchRuns", mass)
	wantNoError(t, r)
	if got, want := r.Get("runs").Index(0).Get("f10").Float(), bench.FeedFromMasses(10.4, 12.8, 104.15, 128.17); !scalar.EqualWithinAbsOrRel(got, want, 1e-15, 1e-15) {
		t.Errorf("f10 from masses = %v, want %v", got, want)
	}
	// Zero means "not given", as in a project.
	mass.Set("molarMass1", 0)
	wantError(t, call(api, "benchRuns", mass).Get("errors").Index(0), "molarMass1", "")
}

func TestPasteBench(t *testing.T) {
	api, _ := testAPI(t)
	// A block copied from a spreadsheet in a decimal-comma locale: tabs between cells, a header.
	const block = "Sample\tf10\tX\tF1\tsF\nA-1\t0,25\t0,05\t0,41\t0,01\nA-2\t0,75\t0,10\t0,80\t0,01\n"
	empty := jsEval(`({bench: {feedKind: "", conversionKind: "", compositionKind: "", element: "", carrier: 0, elementCount: 0, rows: []}})`)
	empty.Set("text", block)
	before := stringify(empty)
	r := call(api, "pasteBench", empty)
	wantNoError(t, r)
	if stringify(empty) != before {
		t.Errorf("pasteBench changed its argument: %s, was %s", stringify(empty), before)
	}
	var want bench.Table
	if err := want.Paste(block); err != nil {
		t.Fatal(err)
	}
	got := r.Get("bench")
	if got.Get("conversionKind").String() != want.ConversionKind || got.Get("rows").Length() != len(want.Rows) {
		t.Fatalf("pasteBench() = %s, want %+v", stringify(got), want)
	}
	for i, row := range want.Rows {
		g := got.Get("rows").Index(i)
		if g.Get("label").String() != row.Label {
			t.Errorf("rows[%d].label = %q, want %q", i, g.Get("label").String(), row.Label)
		}
		for k, v := range row.Cells {
			if g.Get("cells").Get(k).String() != v {
				t.Errorf("rows[%d].cells.%s = %s, want %q (as typed)", i, k, stringify(g.Get("cells").Get(k)), v)
			}
		}
	}
	// The pasted table converts: 0,25 is the feed 0.25.
	runs := call(api, "benchRuns", map[string]any{"bench": got})
	wantNoError(t, runs)
	if f := runs.Get("runs").Index(0).Get("f10").Float(); f != 0.25 {
		t.Errorf("pasted f10 = %v, want 0.25", f)
	}

	// Pasting again appends.
	again := call(api, "pasteBench", map[string]any{"bench": got, "text": "B-1\t0,5\t0,2\t0,6"})
	wantNoError(t, again)
	if n := again.Get("bench").Get("rows").Length(); n != 3 {
		t.Errorf("a second paste gives %d rows, want 3", n)
	}

	with := func(text string) js.Value {
		a := edited(empty, "")
		a.Set("text", text)
		return a
	}
	for _, c := range []struct{ name, text, field, msg string }{
		{"unknown header", "label\tdensity\nA\t0,9", "paste", `"density"`},
		{"empty", " \n ", "paste", "no cells"},
		{"broken quotes", "\"0,5\t0,6\n", "paste", "line"},
		{"too wide a row", "0,1\t0,2\t0,3\t0,4\t0,5\t0,6\t0,7", "paste", "columns are expected"},
		{"cell too long to keep", "f10\tF1\n0,5\t" + strings.Repeat("9", 201), "paste", "cannot be kept"},
		{"label too long to keep", strings.Repeat("L", 201) + "\t0,5\t0,6", "paste", "cannot be kept"},
		{"text too long", strings.Repeat("0", bench.MaxBlockBytes+1), "text", "the limit is 1048576"},
	} {
		t.Run(c.name, func(t *testing.T) {
			a := with(c.text)
			wantError(t, call(api, "pasteBench", a), c.field, c.msg)
		})
	}
	wantError(t, call(api, "pasteBench", map[string]any{"bench": got}), "text", "missing")
	wantError(t, call(api, "pasteBench", map[string]any{"bench": got, "text": 5}), "text", "must be text")
	wantError(t, call(api, "pasteBench", map[string]any{"text": block}), "bench", "missing")
}
