//go:build js && wasm

package main

import (
	"math"
	"strings"
	"syscall/js"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/fit"
	"copoly/copoly/project"
)

// Tests of the bench-data and estimation methods. As in api_test.go, results are compared with
// direct copoly calls on the same input; the few literal values name their source.

// fitRuns returns eight runs made from the terminal model with r1 = 0.8, r2 = 0.15
// (copoly.Terminal.Cumulative at each feed and conversion) with a fixed offset of ±0.006 on F1
// and all three uncertainties, so that every estimation method runs, both as Go runs and as
// the JS objects of the d.ts.
func fitRuns() ([]copoly.Run, []any) {
	m := copoly.Terminal{R1: 0.8, R2: 0.15}
	feeds := []float64{0.10, 0.20, 0.30, 0.40, 0.50, 0.60, 0.70, 0.85}
	convs := []float64{0.04, 0.12, 0.06, 0.25, 0.05, 0.32, 0.18, 0.08}
	runs := make([]copoly.Run, len(feeds))
	objs := make([]any, len(feeds))
	for i, f := range feeds {
		off := 0.006
		if i%2 == 1 {
			off = -off
		}
		r := copoly.Run{F10: f, Conversion: convs[i], F1: m.Cumulative(f, convs[i]) + off, SF: 0.01, SX: 0.01, Sf: 0.005}
		runs[i] = r
		objs[i] = map[string]any{"f10": r.F10, "conversion": r.Conversion, "F1": r.F1, "sF": r.SF, "sX": r.SX, "sf": r.Sf}
	}
	return runs, objs
}

// demoBenchArg returns {bench} holding the demo project's bench table as the page has it.
func demoBenchArg(t *testing.T, api js.Value) js.Value {
	t.Helper()
	b := demoArg(t, api).Get("project").Get("bench")
	if b.IsUndefined() {
		t.Fatal("the demo project has no bench")
	}
	return jsEval(`((b) => ({bench: structuredClone(b)}))`).Invoke(b)
}

// edited returns a structured clone of arg changed by the JS statement edit, which sees the
// clone as a.
func edited(arg js.Value, edit string) js.Value {
	return jsEval(`((x) => { const a = structuredClone(x); ` + edit + `; return a; })`).Invoke(arg)
}

func TestBenchRuns(t *testing.T) {
	api, _ := testAPI(t)
	arg := demoBenchArg(t, api)
	demo := project.Demo()
	runs, ok, errs, warnings := demo.Bench.Table().Runs(0, 0)

	r := call(api, "benchRuns", arg)
	wantNoError(t, r)
	if got, want := stringify(r.Get("columns")), stringify(toJS(demo.Bench.Table().Columns())); got != want {
		t.Errorf("columns = %s, want %s", got, want)
	}
	if r.Get("runs").Length() != len(runs) || r.Get("errors").Length() != len(runs) {
		t.Fatalf("benchRuns(demo) = %s, want %d runs and errors", stringify(r), len(runs))
	}
	for i, run := range runs {
		if !ok[i] || errs[i] != nil {
			t.Fatalf("demo row %d does not convert in copoly: %v", i, errs[i])
		}
		got := r.Get("runs").Index(i)
		for _, c := range []struct {
			key  string
			want float64
		}{{"f10", run.F10}, {"conversion", run.Conversion}, {"F1", run.F1}, {"sF", run.SF}, {"sX", run.SX}, {"sf", run.Sf}} {
			if got.Get(c.key).Float() != c.want {
				t.Errorf("runs[%d].%s = %s, want %v", i, c.key, stringify(got.Get(c.key)), c.want)
			}
		}
		if !r.Get("errors").Index(i).IsNull() {
			t.Errorf("errors[%d] = %s, want null", i, stringify(r.Get("errors").Index(i)))
		}
	}
	if got := r.Get("warnings").Length(); got != len(warnings) {
		t.Errorf("%d warnings, want %d", got, len(warnings))
	}
	for i, w := range warnings {
		if got := r.Get("warnings").Index(i).Get("code").String(); got != w.Code {
			t.Errorf("warnings[%d].code = %q, want %q", i, got, w.Code)
		}
	}

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

	for _, c := range []struct{ name, edit, field, text string }{
		{"bench missing", `delete a.bench`, "bench", "missing"},
		{"bench a list", `a.bench = []`, "bench", "an object"},
		{"rows missing", `delete a.bench.rows`, "bench.rows", "missing"},
		{"rows an object", `a.bench.rows = {0: {}}`, "bench.rows", "a list of objects"},
		{"row a number", `a.bench.rows[2] = 5`, "bench.rows[2]", "an object"},
		{"row null", `a.bench.rows[2] = null`, "bench.rows[2]", "an object"},
		{"rows too many", `a.bench.rows = new Array(1001).fill({cells: {}})`, "bench.rows", "at most 1000"},
		{"cells a list", `a.bench.rows[0].cells = ["0.5"]`, "bench.rows[0].cells", "an object of texts"},
		{"cell a number", `a.bench.rows[0].cells.f10 = 0.5`, "bench.rows[0].cells.f10", "must be text"},
		{"cell key unknown", `a.bench.rows[3].cells.density = "0.9"`, "bench.rows[3].cells", `"density"`},
		{"cell key __proto__", `Object.defineProperty(a.bench.rows[0].cells, "__proto__", {value: "x", enumerable: true})`, "bench.rows[0].cells", `"__proto__"`},
		{"cell too long", `a.bench.rows[4].cells.F1 = "1".repeat(201)`, "bench.rows[4].cells.F1", "the limit is 200"},
		{"cells too many", `for (let k = 0; k < 65; k++) a.bench.rows[0].cells["k" + k] = ""`, "bench.rows[0].cells", "at most 64"},
		{"label too long", `a.bench.rows[0].label = "x".repeat(201)`, "bench.rows[0].label", "the limit is 200"},
		{"label a number", `a.bench.rows[0].label = 7`, "bench.rows[0].label", "must be text"},
		{"feed kind unknown", `a.bench.feedKind = "volume"`, "bench.feedKind", `"volume"`},
		{"composition kind a number", `a.bench.compositionKind = 1`, "bench.compositionKind", "must be text"},
		{"carrier fractional", `a.bench.carrier = 1.5`, "bench.carrier", "must be a whole number, not the number 1.5"},
		{"carrier 3", `a.bench.carrier = 3`, "bench.carrier", "1 or 2"},
		{"element count NaN", `a.bench.elementCount = NaN`, "bench.elementCount", "finite"},
		{"molar mass negative", `a.molarMass1 = -5`, "molarMass1", "positive"},
		{"molar mass text", `a.molarMass2 = "128"`, "molarMass2", "must be a number"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "benchRuns", edited(arg, c.edit)), c.field, c.text)
		})
	}
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

// pairsOf reads a JS list of [r1, r2] pairs.
func pairsOf(t *testing.T, v js.Value) [][2]float64 {
	t.Helper()
	if v.Type() != js.TypeObject || !isArray(v) {
		t.Fatalf("got %s, want a list of pairs", stringify(v))
	}
	out := make([][2]float64, v.Length())
	for i := range out {
		p := v.Index(i)
		if p.Length() != 2 {
			t.Fatalf("point %d = %s, want a pair", i, stringify(p))
		}
		out[i] = [2]float64{p.Index(0).Float(), p.Index(1).Float()}
	}
	return out
}

// checkRegion checks a region object against copoly's and that its jcr is the same closed
// polygon around the estimate (r1, r2).
func checkRegion(t *testing.T, fit js.Value, want fit.Region, r1, r2 float64) {
	t.Helper()
	reg := fit.Get("region")
	if reg.Get("kind").String() != want.Kind || reg.Get("level").Float() != want.Level || reg.Get("critical").Float() != want.Critical || reg.Get("open").Bool() != want.Open {
		t.Errorf("region = %s, want %+v", stringify(reg), want)
	}
	for _, c := range []struct {
		key  string
		want float64
	}{{"r1Min", want.R1Min}, {"r1Max", want.R1Max}, {"r2Min", want.R2Min}, {"r2Max", want.R2Max}} {
		if reg.Get(c.key).Float() != c.want {
			t.Errorf("region.%s = %v, want %v", c.key, reg.Get(c.key).Float(), c.want)
		}
	}
	b := pairsOf(t, reg.Get("boundary"))
	if len(b) != len(want.Boundary) {
		t.Fatalf("boundary has %d points, want %d", len(b), len(want.Boundary))
	}
	for i := range b {
		if b[i] != want.Boundary[i] {
			t.Errorf("boundary[%d] = %v, want %v", i, b[i], want.Boundary[i])
		}
	}
	if stringify(fit.Get("jcr")) != stringify(reg.Get("boundary")) {
		t.Errorf("jcr = %s, want region.boundary %s", stringify(fit.Get("jcr")), stringify(reg.Get("boundary")))
	}
	// A closed polygon around the estimate: at least three points, the estimate inside, a
	// point far away (r1 = r2 = 100) outside.
	if len(b) < 3 || !inPolygon(r1, r2, b) || inPolygon(100, 100, b) {
		t.Errorf("jcr %v is not a closed polygon around (%v, %v)", b, r1, r2)
	}
}

func TestFit(t *testing.T) {
	api, _ := testAPI(t)
	runs, objs := fitRuns()
	e, err := fit.Estimate(runs, 0)
	if err != nil {
		t.Fatal(err)
	}
	r := call(api, "fit", map[string]any{"runs": objs, "curves": true})
	wantNoError(t, r)
	methods := r.Get("methods")
	for _, name := range []string{"fineman-ross", "inverted-fineman-ross", "kelen-tudos", "extended-kelen-tudos", "mayo-lewis-integrated", "nonlinear", "evm"} {
		if methods.Get(name).IsUndefined() {
			t.Errorf("methods.%s is absent; warnings %s", name, stringify(r.Get("warnings")))
		}
	}
	if got := r.Get("recommended").String(); got != e.Recommended || got != "evm" {
		t.Errorf("recommended = %q, want %q (every uncertainty given)", got, e.Recommended)
	}

	// Linear methods.
	for _, c := range []struct {
		name  string
		l     *fit.Linear
		alpha bool
	}{
		{"fineman-ross", e.FinemanRoss, false},
		{"inverted-fineman-ross", e.InvertedFinemanRoss, false},
		{"kelen-tudos", e.KelenTudos, true},
		{"extended-kelen-tudos", e.ExtendedKelenTudos, true},
	} {
		m := methods.Get(c.name)
		if m.Get("r1").Float() != c.l.R1 || m.Get("r2").Float() != c.l.R2 || m.Get("slope").Float() != c.l.Slope || m.Get("intercept").Float() != c.l.Intercept {
			t.Errorf("%s = %s, want %+v", c.name, stringify(m), *c.l)
		}
		sameFloats(t, c.name+".x", floatsOf(t, m.Get("x")), c.l.X)
		sameFloats(t, c.name+".y", floatsOf(t, m.Get("y")), c.l.Y)
		if !m.Get("linear").Bool() {
			t.Errorf("%s.linear = %s, want true", c.name, stringify(m.Get("linear")))
		}
		if got := m.Get("alpha"); c.alpha && got.Float() != c.l.Alpha || !c.alpha && !got.IsUndefined() {
			t.Errorf("%s.alpha = %s (copoly %v), want it only for Kelen–Tüdős", c.name, stringify(got), c.l.Alpha)
		}
	}

	// Mayo–Lewis intersection.
	ml := methods.Get("mayo-lewis-integrated")
	if ml.Get("r1").Float() != e.MayoLewis.R1 || ml.Get("r2").Float() != e.MayoLewis.R2 || ml.Get("curves").Length() != len(e.MayoLewis.Curves) {
		t.Errorf("mayo-lewis-integrated = r1 %v, r2 %v, %d curves, want %v, %v, %d", ml.Get("r1").Float(), ml.Get("r2").Float(), ml.Get("curves").Length(), e.MayoLewis.R1, e.MayoLewis.R2, len(e.MayoLewis.Curves))
	}
	if def := call(api, "fit", map[string]any{"runs": objs}).Get("methods").Get("mayo-lewis-integrated"); !def.Get("curves").IsUndefined() || def.Get("r1").Float() != e.MayoLewis.R1 {
		t.Errorf("fit without curves: mayo-lewis-integrated = %.200s, want r1 %v and no curves", stringify(def), e.MayoLewis.R1)
	}
	c0 := ml.Get("curves").Index(0)
	sameFloats(t, "curves[0].r1", floatsOf(t, c0.Get("r1")), e.MayoLewis.Curves[0][0])
	sameFloats(t, "curves[0].r2", floatsOf(t, c0.Get("r2")), e.MayoLewis.Curves[0][1])

	// Nonlinear least squares.
	nl, want := methods.Get("nonlinear"), e.Nonlinear
	for _, c := range []struct {
		key  string
		want float64
	}{
		{"r1", want.R1}, {"r2", want.R2}, {"se1", want.SE1}, {"se2", want.SE2}, {"corr", want.Corr}, {"ssr", want.SSR},
		{"n", float64(want.N)}, {"dof", float64(want.DoF)}, {"reducedChi2", want.ReducedChi2}, {"pValue", want.PValue},
	} {
		if got := nl.Get(c.key); got.Type() != js.TypeNumber || got.Float() != c.want {
			t.Errorf("nonlinear.%s = %s, want %v", c.key, stringify(got), c.want)
		}
	}
	if !nl.Get("weighted").Bool() || nl.Get("atBound").String() != want.AtBound {
		t.Errorf("nonlinear weighted %s, atBound %s, want true, %q", stringify(nl.Get("weighted")), stringify(nl.Get("atBound")), want.AtBound)
	}
	sameFloats(t, "residuals", floatsOf(t, nl.Get("residuals")), want.Residuals)
	sameFloats(t, "sigma", floatsOf(t, nl.Get("sigma")), want.Sigma)
	checkRegion(t, nl, want.Region, want.R1, want.R2)

	// Error in variables.
	ev, wantEV := methods.Get("evm"), e.EVM
	for _, c := range []struct {
		key  string
		want float64
	}{{"r1", wantEV.R1}, {"r2", wantEV.R2}, {"se1", wantEV.SE1}, {"se2", wantEV.SE2}, {"corr", wantEV.Corr}, {"phi", wantEV.Phi}, {"reducedChi2", wantEV.ReducedChi2}, {"pValue", wantEV.PValue}} {
		if got := ev.Get(c.key); got.Type() != js.TypeNumber || got.Float() != c.want {
			t.Errorf("evm.%s = %s, want %v", c.key, stringify(got), c.want)
		}
	}
	sameFloats(t, "evm.feed", floatsOf(t, ev.Get("feed")), wantEV.Feed)
	sameFloats(t, "evm.conversion", floatsOf(t, ev.Get("conversion")), wantEV.Conversion)
	sameFloats(t, "evm.composition", floatsOf(t, ev.Get("composition")), wantEV.Composition)
	checkRegion(t, ev, wantEV.Region, wantEV.R1, wantEV.R2)

	// The rest of the result.
	sw := r.Get("swappedFinemanRoss")
	if sw.Get("r1").Float() != e.SwappedFinemanRoss.R1 || sw.Get("r2").Float() != e.SwappedFinemanRoss.R2 {
		t.Errorf("swappedFinemanRoss = %s, want %v, %v", stringify(sw), e.SwappedFinemanRoss.R1, e.SwappedFinemanRoss.R2)
	}
	for _, c := range []struct {
		key  string
		want fit.Trend
	}{{"feed", e.TrendFeed}, {"conversion", e.TrendConversion}} {
		g := r.Get("trends").Get(c.key)
		if g.Get("slope").Float() != c.want.Slope || g.Get("pValue").Float() != c.want.PValue || g.Get("flagged").Bool() != c.want.Flagged {
			t.Errorf("trends.%s = %s, want %+v", c.key, stringify(g), c.want)
		}
	}
	ws := r.Get("warnings")
	if ws.Length() != len(e.Warnings) {
		t.Fatalf("%d warnings, want %d: %s", ws.Length(), len(e.Warnings), stringify(ws))
	}
	for i, w := range e.Warnings {
		g := ws.Index(i)
		if g.Get("method").String() != w.Method || g.Get("row").Int() != w.Row || g.Get("field").String() != w.Field || g.Get("message").String() != w.Message || g.Get("code").String() != w.Code {
			t.Errorf("warnings[%d] = %s, want %+v", i, stringify(g), w)
		}
	}

	// A level other than the default reaches the region.
	r = call(api, "fit", map[string]any{"runs": objs, "level": 0.9})
	wantNoError(t, r)
	if got := r.Get("methods").Get("nonlinear").Get("region").Get("level").Float(); got != 0.9 {
		t.Errorf("region.level with level 0.9 = %v", got)
	}
}

func TestFitUnweighted(t *testing.T) {
	api, _ := testAPI(t)
	runs, objs := fitRuns()
	for i := range runs {
		runs[i].SF, runs[i].SX, runs[i].Sf = 0, 0, 0
		o := objs[i].(map[string]any)
		delete(o, "sF")
		delete(o, "sX")
		delete(o, "sf")
	}
	e, err := fit.Estimate(runs, 0)
	if err != nil {
		t.Fatal(err)
	}
	r := call(api, "fit", map[string]any{"runs": objs})
	wantNoError(t, r)
	nl := r.Get("methods").Get("nonlinear")
	if nl.Get("r1").Float() != e.Nonlinear.R1 || nl.Get("weighted").Bool() {
		t.Errorf("unweighted nonlinear = %s, want r1 %v, weighted false", stringify(nl), e.Nonlinear.R1)
	}
	for _, k := range []string{"reducedChi2", "pValue", "sigma"} {
		if !nl.Get(k).IsUndefined() {
			t.Errorf("unweighted nonlinear.%s = %s, want it absent", k, stringify(nl.Get(k)))
		}
	}
	checkRegion(t, nl, e.Nonlinear.Region, e.Nonlinear.R1, e.Nonlinear.R2)
	if !r.Get("methods").Get("evm").IsUndefined() || r.Get("recommended").String() != "nonlinear" {
		t.Errorf("without uncertainties: evm %s, recommended %s; want absent, nonlinear", stringify(r.Get("methods").Get("evm")), r.Get("recommended").String())
	}
	// The reason for the absent method is among the warnings.
	found := false
	ws := r.Get("warnings")
	for i := range ws.Length() {
		if ws.Index(i).Get("method").String() == "evm" {
			found = true
		}
	}
	if !found {
		t.Errorf("no warning for the absent evm method: %s", stringify(ws))
	}
}

func TestFitErrors(t *testing.T) {
	api, _ := testAPI(t)
	_, objs := fitRuns()
	arg := toJS(map[string]any{"runs": objs})
	for _, c := range []struct{ name, edit, field, text string }{
		{"runs missing", `delete a.runs`, "runs", "missing"},
		{"runs an object", `a.runs = {}`, "runs", "a list of objects"},
		{"runs numbers", `a.runs = [0.5, 0.6, 0.7]`, "runs[0]", "an object"},
		{"run null", `a.runs[2] = null`, "runs[2]", "an object"},
		{"F1 missing", `delete a.runs[1].F1`, "runs[1].F1", "missing"},
		{"f10 missing", `delete a.runs[4].f10`, "runs[4].f10", "missing"},
		{"f10 text", `a.runs[0].f10 = "0,1"`, "runs[0].f10", "must be a number"},
		{"F1 NaN", `a.runs[3].F1 = NaN`, "runs[3].F1", "finite"},
		{"sF infinite", `a.runs[5].sF = Infinity`, "runs[5].sF", "finite"},
		{"conversion BigInt", `a.runs[0].conversion = 1n`, "runs[0].conversion", "must be a number"},
		{"F1 above one", `a.runs[2].F1 = 1.2`, "runs[2].F1", "between 0 and 1"},
		{"conversion one", `a.runs[2].conversion = 1`, "runs[2].conversion", "full conversion"},
		{"two runs", `a.runs = a.runs.slice(0, 2)`, "runs", "at least three"},
		{"one feed", `a.runs.forEach(r => r.f10 = 0.5)`, "runs", "two different feeds"},
		{"too many runs", `a.runs = new Array(1001).fill(a.runs[0])`, "runs", "at most 1000"},
		{"level one", `a.level = 1`, "level", "between 0 and 1"},
		{"level percent", `a.level = 95`, "level", "between 0 and 1"},
		{"level text", `a.level = "0.95"`, "level", "must be a number"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "fit", edited(arg, c.edit)), c.field, c.text)
		})
	}
	wantNoError(t, call(api, "fit", arg))
}

// TestFitValueNotFinite checks the conversion of results holding numbers that are not finite:
// copoly reports a singular covariance as +Inf standard errors and a NaN correlation (they
// become null), and any other such number leaves its method out with a warning. The estimates
// are built by hand; no fit produces the second kind today.
func TestFitValueNotFinite(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	region := fit.Region{Level: 0.95, Kind: "F", Critical: 1, Boundary: [][2]float64{{0.5, 0.1}, {1, 0.1}, {0.7, 0.3}}, R1Min: 0.5, R1Max: 1, R2Min: 0.1, R2Max: 0.3}
	e := &fit.Estimates{
		FinemanRoss:        &fit.Linear{R1: 0.8, R2: 0.15, X: []float64{1, 2}, Y: []float64{1, nan}, Slope: 0.8, Intercept: -0.15},
		KelenTudos:         &fit.Linear{R1: 0.8, R2: 0.15, X: []float64{0.1, 0.9}, Y: []float64{0.1, 0.5}, Slope: 1, Intercept: 0, Alpha: 0.3},
		Nonlinear:          &fit.Nonlinear{R1: 0.8, R2: 0.15, SE1: inf, SE2: inf, Corr: nan, N: 3, DoF: 1, Residuals: []float64{0, 0, 0}, Region: region},
		EVM:                &fit.EVM{R1: 0.8, R2: 0.15, SE1: 0.1, SE2: 0.1, Phi: inf, Region: fit.Region{Kind: "ellipse", Open: true}},
		Recommended:        fit.MethodEVM,
		TrendFeed:          fit.Trend{Slope: nan, PValue: nan},
		SwappedFinemanRoss: &fit.Linear{R1: inf, R2: 0.1},
	}
	v := fitValue(e, true)
	m := v.Get("methods")
	if !m.Get("fineman-ross").IsUndefined() || m.Get("kelen-tudos").IsUndefined() {
		t.Errorf("methods = %s, want fineman-ross (NaN in y) left out and kelen-tudos kept", stringify(m))
	}
	nl := m.Get("nonlinear")
	if nl.IsUndefined() || !nl.Get("se1").IsNull() || !nl.Get("se2").IsNull() || !nl.Get("corr").IsNull() {
		t.Errorf("nonlinear = %s, want se1, se2, corr null", stringify(nl))
	}
	if !m.Get("evm").IsUndefined() || v.Get("recommended").String() != "nonlinear" {
		t.Errorf("evm %s with Φ = +Inf, recommended %s; want evm left out and nonlinear recommended", stringify(m.Get("evm")), v.Get("recommended").String())
	}
	if f := v.Get("trends").Get("feed"); f.Get("slope").Float() != 0 || f.Get("pValue").Float() != 1 || f.Get("flagged").Bool() {
		t.Errorf("trends.feed from NaN = %s, want slope 0, pValue 1, not flagged", stringify(f))
	}
	if !v.Get("swappedFinemanRoss").IsUndefined() {
		t.Errorf("swappedFinemanRoss = %s with r1 = +Inf, want it absent", stringify(v.Get("swappedFinemanRoss")))
	}
	text := stringify(v.Get("warnings"))
	for _, want := range []string{`"method":"fineman-ross"`, "y[1]", `"method":"evm"`, "phi", "with the feed"} {
		if !strings.Contains(text, want) {
			t.Errorf("warnings %s do not mention %s", text, want)
		}
	}
	// An EVM region without a boundary (singular) still gives lists, not null.
	if b := toJS(evmDTO(&fit.EVM{Region: fit.Region{Open: true}})).Get("jcr"); !isArray(b) || b.Length() != 0 {
		t.Errorf("jcr of an empty region = %s, want []", stringify(b))
	}
}

func TestNextRuns(t *testing.T) {
	api, _ := testAPI(t)
	runs, objs := fitRuns()
	check := func(t *testing.T, r js.Value, d fit.Design) {
		t.Helper()
		wantNoError(t, r)
		sameFloats(t, "tidwellMortimer", floatsOf(t, r.Get("tidwellMortimer")), d.TidwellMortimer[:])
		sameFloats(t, "dOptimal", floatsOf(t, r.Get("dOptimal")), d.DOptimal[:])
		if r.Get("middle").Float() != d.Middle || r.Get("shrink").Float() != d.Shrink {
			t.Errorf("middle %v, shrink %v, want %v, %v", r.Get("middle").Float(), r.Get("shrink").Float(), d.Middle, d.Shrink)
		}
		if r.Get("next").Length() != len(d.Next) {
			t.Fatalf("next = %s, want %+v", stringify(r.Get("next")), d.Next)
		}
		for i, s := range d.Next {
			g := r.Get("next").Index(i)
			if g.Get("f10").Float() != s.F10 || g.Get("conversion").Float() != s.Conversion {
				t.Errorf("next[%d] = %s, want %+v", i, stringify(g), s)
			}
		}
	}
	t.Run("no runs", func(t *testing.T) {
		d, err := fit.NextRuns(0.8, 0.15, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		r := call(api, "nextRuns", map[string]any{"r1": 0.8, "r2": 0.15})
		check(t, r, d)
		// Tidwell–Mortimer 1965 approximate feeds, ascending: r2/(2 + r2) and 2/(2 + r1).
		if tm := floatsOf(t, r.Get("tidwellMortimer")); !scalar.EqualWithinAbsOrRel(tm[0], 0.15/2.15, 1e-15, 1e-15) || !scalar.EqualWithinAbsOrRel(tm[1], 2/2.8, 1e-15, 1e-15) {
			t.Errorf("tidwellMortimer = %v, want [0.15/2.15, 2/2.8]", tm)
		}
		if r.Get("shrink").Float() != 0 {
			t.Errorf("shrink with no runs = %v, want 0 (fit.Design)", r.Get("shrink").Float())
		}
	})
	t.Run("runs and conversions", func(t *testing.T) {
		d, err := fit.NextRuns(0.8, 0.15, runs, []float64{0.1, 0.3})
		if err != nil {
			t.Fatal(err)
		}
		check(t, call(api, "nextRuns", map[string]any{"r1": 0.8, "r2": 0.15, "runs": objs, "conversions": []any{0.1, 0.3}}), d)
	})
	arg := toJS(map[string]any{"r1": 0.8, "r2": 0.15, "runs": objs})
	for _, c := range []struct{ name, edit, field, text string }{
		{"r1 missing", `delete a.r1`, "r1", "missing"},
		{"r2 negative", `a.r2 = -1`, "r2", "negative"},
		{"runs a number", `a.runs = 3`, "runs", "a list of objects"},
		{"run f10 above one", `a.runs[1].f10 = 1.5`, "runs[1].f10", "between 0 and 1"},
		{"run F1 missing", `delete a.runs[0].F1`, "runs[0].F1", "missing"},
		{"run conversion NaN", `a.runs[0].conversion = NaN`, "runs[0].conversion", "finite"},
		{"conversions empty", `a.conversions = []`, "conversions", "between 1 and 20"},
		{"conversion full", `a.conversions = [0.2, 1]`, "conversions[1]", "full conversion"},
		{"conversion text", `a.conversions = ["0.2"]`, "conversions[0]", "must be a number"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "nextRuns", edited(arg, c.edit)), c.field, c.text)
		})
	}
}

func TestQE(t *testing.T) {
	api, _ := testAPI(t)
	r := call(api, "qe", map[string]any{"monomer1": "styrene", "monomer2": "n-butyl acrylate"})
	wantNoError(t, r)
	q1, _ := copoly.QEOf("styrene")
	q2, _ := copoly.QEOf("n-butyl acrylate")
	r1, r2, err := copoly.RatiosFromQE(q1, q2)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		key  string
		want float64
	}{{"r1", r1}, {"r2", r2}, {"q1", q1.Q}, {"e1", q1.E}, {"q2", q2.Q}, {"e2", q2.E}} {
		if got := r.Get(c.key).Float(); got != c.want {
			t.Errorf("%s = %v, want %v", c.key, got, c.want)
		}
	}
	if r.Get("source1").String() != q1.Source || r.Get("source2").String() != q2.Source {
		t.Errorf("sources = %q, %q, want %q, %q", r.Get("source1").String(), r.Get("source2").String(), q1.Source, q2.Source)
	}
	// Alfrey–Price 1947 from the returned Q and e: r1 = (Q1/Q2) exp[−e1 (e1 − e2)].
	got := r.Get("q1").Float() / r.Get("q2").Float() * math.Exp(-r.Get("e1").Float()*(r.Get("e1").Float()-r.Get("e2").Float()))
	if !scalar.EqualWithinAbsOrRel(r.Get("r1").Float(), got, 1e-14, 1e-14) {
		t.Errorf("r1 = %v, want (Q1/Q2) exp[−e1(e1 − e2)] = %v", r.Get("r1").Float(), got)
	}

	for _, c := range []struct {
		name  string
		arg   map[string]any
		field string
		text  string
	}{
		{"monomer1 unknown", map[string]any{"monomer1": "unobtainium", "monomer2": "styrene"}, "monomer1", `"styrene"`},
		{"monomer2 unknown", map[string]any{"monomer1": "styrene", "monomer2": "Styrene"}, "monomer2", "no built-in Q–e values"},
		{"monomer1 missing", map[string]any{"monomer2": "styrene"}, "monomer1", "missing"},
		{"monomer2 a number", map[string]any{"monomer1": "styrene", "monomer2": 2}, "monomer2", "must be text"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "qe", c.arg), c.field, c.text)
		})
	}
}

// TestProjectWithBench round-trips a project with an edited bench table, a level and a region
// through checkProject, exportProject, importProject and storage. (The schema's errors are
// project.Parse's, tested in copoly/project and swept in badinput_test.go.)
func TestProjectWithBench(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	arg := jsEval(`((d) => { const p = structuredClone(d.project);
		p.bench.rows[1].cells.F1 = "0,418 (re-run?)";
		p.bench.rows.push({label: "HL-09 (invented) \"quoted\"", cells: {f10: "35 %", integral1: "1e3"}});
		p.level = 0.9;
		p.jcr = [[0.71, 0.15], [0.8, 0.136], [0.895, 0.16], [0.8, 0.185]];
		const model = p.model; delete p.model; p.model = model;   // keys in the order of the d.ts
		const plan = p.plan; delete p.plan; p.plan = plan;
		return {project: p}; })`).Invoke(demo)

	exported := checkedExport(t, api, arg)
	imp := call(api, "importProject", map[string]any{"json": exported})
	wantNoError(t, imp)
	if stringify(imp) != stringify(arg) {
		t.Errorf("importProject(exportProject(p)) = %s, want %s", stringify(imp), stringify(arg))
	}
	// The same through storage.
	wantNoError(t, await(t, call(api, "saveProject", arg)))
	loaded := await(t, call(api, "loadProject"))
	wantNoError(t, loaded)
	if got := loaded.Get("project"); stringify(got.Get("bench")) != stringify(arg.Get("project").Get("bench")) || stringify(got.Get("jcr")) != stringify(arg.Get("project").Get("jcr")) {
		t.Errorf("loadProject() after a save = %s", stringify(got))
	}

	// Empty optional keys are normalised away, as in the file.
	bare := edited(arg, `delete a.project.bench; a.project.level = 0; a.project.jcr = []`)
	r := call(api, "checkProject", bare)
	wantNoError(t, r)
	for _, k := range []string{"bench", "level", "jcr"} {
		if !r.Get("project").Get(k).IsUndefined() {
			t.Errorf("checkProject() with an empty %s gives %s, want it absent", k, stringify(r.Get("project").Get(k)))
		}
	}
}
