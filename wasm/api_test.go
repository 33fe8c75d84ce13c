//go:build js && wasm

package main

import (
	"math"
	"syscall/js"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/project"
)

// The bridge adds no science: its results must be exactly what package copoly returns for the
// same input, so most checks below compare with a direct copoly call. The few literal values
// name their source.

// floatsOf reads a JS array of numbers.
func floatsOf(t *testing.T, v js.Value) []float64 {
	t.Helper()
	if v.Type() != js.TypeObject || !isArray(v) {
		t.Fatalf("got %s, want an array", stringify(v))
	}
	out := make([]float64, v.Length())
	for i := range out {
		out[i] = v.Index(i).Float()
	}
	return out
}

func sameFloats(t *testing.T, what string, got, want []float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s has %d values, want %d", what, len(got), len(want))
	}
	for i := range got {
		if got[i] != want[i] && !(math.IsNaN(got[i]) && math.IsNaN(want[i])) {
			t.Errorf("%s[%d] = %v, want %v", what, i, got[i], want[i])
		}
	}
}

func TestComposition(t *testing.T) {
	api, _ := testAPI(t)
	r := call(api, "composition", map[string]any{"r1": 0.8, "r2": 0.15, "f1": []any{0, 0.25, 0.5, 1}})
	wantNoError(t, r)
	m := copoly.Terminal{R1: 0.8, R2: 0.15}
	want := []float64{m.Instantaneous(0), m.Instantaneous(0.25), m.Instantaneous(0.5), m.Instantaneous(1)}
	sameFloats(t, "F1", floatsOf(t, r.Get("F1")), want)
	// Mayo–Lewis 1944 equation by hand at f1 = 0.5: (0.8·0.25 + 0.25)/(0.8·0.25 + 0.5 + 0.15·0.25) = 0.45/0.7375.
	if got := r.Get("F1").Index(2).Float(); !scalar.EqualWithinAbsOrRel(got, 0.45/0.7375, 1e-15, 1e-15) {
		t.Errorf("F1(0.5) = %v, want 0.45/0.7375", got)
	}
	az, _ := m.Azeotrope()
	if got := r.Get("azeotrope").Float(); got != az {
		t.Errorf("azeotrope = %v, want %v", got, az)
	}
	c := m.Classify()
	cls := r.Get("classification")
	if cls.Get("kind").String() != c.Kind || cls.Get("product").Float() != c.Product || cls.Get("text").String() != c.Text {
		t.Errorf("classification = %s, want %+v", stringify(cls), c)
	}

	// No azeotrope (r1 > 1 > r2; Mayo–Lewis 1944): null, not absent.
	r = call(api, "composition", map[string]any{"r1": 2, "r2": 0.5, "f1": []any{}})
	wantNoError(t, r)
	if !r.Get("azeotrope").IsNull() {
		t.Errorf("azeotrope for r1 = 2, r2 = 0.5 is %s, want null", stringify(r.Get("azeotrope")))
	}
	if got := r.Get("F1"); !isArray(got) || got.Length() != 0 {
		t.Errorf("F1 for no feeds = %s, want []", stringify(got))
	}

	// A Float64Array is accepted like an array.
	r = call(api, "composition", jsEval(`{r1: 0.8, r2: 0.15, f1: new Float64Array([0.25, 0.5])}`))
	wantNoError(t, r)
	sameFloats(t, "F1 from a Float64Array", floatsOf(t, r.Get("F1")), want[1:3])
}

func TestFeedFor(t *testing.T) {
	api, _ := testAPI(t)
	r := call(api, "feedFor", map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.55})
	wantNoError(t, r)
	s, err := copoly.Terminal{R1: 0.8, R2: 0.15}.FeedFor(0.55)
	if err != nil {
		t.Fatal(err)
	}
	sameFloats(t, "feeds", floatsOf(t, r.Get("feeds")), s.Feeds)
	sameFloats(t, "range", floatsOf(t, r.Get("range")), []float64{s.Min, s.Max})
	if r.Get("note").String() != s.Note {
		t.Errorf("note = %q, want %q", r.Get("note").String(), s.Note)
	}
}

func TestDrift(t *testing.T) {
	api, _ := testAPI(t)
	m := copoly.Terminal{R1: 0.8, R2: 0.15}
	xs := []float64{0, 0.3, 0.6, 0.9}
	d, err := m.Drift(0.5, xs)
	if err != nil {
		t.Fatal(err)
	}
	batch, err := copoly.NewBatch(m, 0.5)
	if err != nil {
		t.Fatal(err)
	}
	limit, err := batch.ConversionLimit(0.05)
	if err != nil {
		t.Fatal(err)
	}

	t.Run("molar, no molar masses", func(t *testing.T) {
		r := call(api, "drift", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": []any{0, 0.3, 0.6, 0.9}, "tolerance": 0.05, "bins": 5})
		wantNoError(t, r)
		sameFloats(t, "conversion", floatsOf(t, r.Get("conversion")), d.Conversion)
		sameFloats(t, "f1", floatsOf(t, r.Get("f1")), d.Feed)
		sameFloats(t, "F1", floatsOf(t, r.Get("F1")), d.Inst)
		sameFloats(t, "F1cum", floatsOf(t, r.Get("F1cum")), d.Cum)
		if r.Get("method").String() != d.Method {
			t.Errorf("method = %q, want %q", r.Get("method").String(), d.Method)
		}
		if got := r.Get("limit"); got.Get("tolerance").Float() != 0.05 || got.Get("conversion").Float() != limit {
			t.Errorf("limit = %s, want tolerance 0.05, conversion %v", stringify(got), limit)
		}
		h, err := batch.Distribution(0.9, 5, 0, 0)
		if err != nil {
			t.Fatal(err)
		}
		dist := r.Get("distribution")
		sameFloats(t, "edges", floatsOf(t, dist.Get("edges")), h.Edges)
		sameFloats(t, "weights", floatsOf(t, dist.Get("weights")), h.Weights)
		if dist.Get("basis").String() != "moles" {
			t.Errorf("basis = %q, want moles", dist.Get("basis").String())
		}
		if !r.Get("conversionMass").IsUndefined() {
			t.Errorf("conversionMass = %s without molar masses, want it absent", stringify(r.Get("conversionMass")))
		}
		if !r.Get("exhausted").IsNull() {
			t.Errorf("exhausted = %s, want null", stringify(r.Get("exhausted")))
		}
	})

	t.Run("defaults", func(t *testing.T) {
		r := call(api, "drift", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": []any{0.5}})
		wantNoError(t, r)
		// Defaults of site/copoly.d.ts: tolerance 0.02, 20 bins.
		if got := r.Get("limit").Get("tolerance").Float(); got != 0.02 {
			t.Errorf("default tolerance = %v, want 0.02", got)
		}
		if got := r.Get("distribution").Get("weights").Length(); got != 20 {
			t.Errorf("default bins = %d, want 20", got)
		}
	})

	t.Run("molar with molar masses", func(t *testing.T) {
		r := call(api, "drift", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": []any{0, 0.3, 0.6, 0.9}, "molarMass1": 104.15, "molarMass2": 128.17})
		wantNoError(t, r)
		want := make([]float64, len(xs))
		for i, x := range xs {
			want[i] = copoly.MassConversion(x, 0.5, d.Feed[i], 104.15, 128.17)
		}
		sameFloats(t, "conversionMass", floatsOf(t, r.Get("conversionMass")), want)
		if got := r.Get("distribution").Get("basis").String(); got != "mass" {
			t.Errorf("basis = %q, want mass", got)
		}
	})

	t.Run("mass basis", func(t *testing.T) {
		mass := []any{0.1, 0.5, 0.9}
		r := call(api, "drift", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": mass, "basis": "mass", "molarMass1": 104.15, "molarMass2": 128.17})
		wantNoError(t, r)
		sameFloats(t, "conversionMass", floatsOf(t, r.Get("conversionMass")), []float64{0.1, 0.5, 0.9})
		// Identity: the molar conversions reported give back the mass conversions asked for.
		x, f1 := floatsOf(t, r.Get("conversion")), floatsOf(t, r.Get("f1"))
		for i, w := range []float64{0.1, 0.5, 0.9} {
			if got := copoly.MassConversion(x[i], 0.5, f1[i], 104.15, 128.17); !scalar.EqualWithinAbsOrRel(got, w, 1e-9, 1e-9) {
				t.Errorf("MassConversion(conversion[%d] = %v) = %v, want %v", i, x[i], got, w)
			}
		}
	})

	t.Run("exhausted", func(t *testing.T) {
		de, err := m.Drift(0.5, []float64{0.5, 1})
		if err != nil {
			t.Fatal(err)
		}
		if de.Exhausted == nil {
			t.Fatal("copoly reports no exhaustion at X = 1; pick another case")
		}
		r := call(api, "drift", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": []any{0.5, 1}})
		wantNoError(t, r)
		e := r.Get("exhausted")
		if e.Get("monomer").Int() != de.Exhausted.Monomer || e.Get("conversion").Float() != de.Exhausted.Conversion {
			t.Errorf("exhausted = %s, want %+v", stringify(e), *de.Exhausted)
		}
	})
}

func TestSequence(t *testing.T) {
	api, _ := testAPI(t)
	m := copoly.Terminal{R1: 0.8, R2: 0.15}
	s, err := m.Sequence(0.4)
	if err != nil {
		t.Fatal(err)
	}
	r := call(api, "sequence", map[string]any{"r1": 0.8, "r2": 0.15, "f1": 0.4, "maxLength": 5})
	wantNoError(t, r)
	sameSequence(t, r, s)
	rl, err := m.RunLengths(0.4, 5)
	if err != nil {
		t.Fatal(err)
	}
	runs := r.Get("runLengths")
	sameFloats(t, "number1", floatsOf(t, runs.Get("number1")), rl.Number1)
	sameFloats(t, "weight2", floatsOf(t, runs.Get("weight2")), rl.Weight2)
	if got := runs.Get("length").Length(); got != 5 {
		t.Errorf("runLengths.length has %d entries, want 5", got)
	}
	if !r.Get("batch").IsUndefined() {
		t.Errorf("batch = %s without a conversion, want it absent", stringify(r.Get("batch")))
	}

	// Default maxLength (site/copoly.d.ts): 20; with a conversion, the batch average.
	r = call(api, "sequence", map[string]any{"r1": 0.8, "r2": 0.15, "f1": 0.4, "conversion": 0.8})
	wantNoError(t, r)
	if got := r.Get("runLengths").Get("length").Length(); got != 20 {
		t.Errorf("default maxLength gives %d run lengths, want 20", got)
	}
	batch, err := copoly.NewBatch(m, 0.4)
	if err != nil {
		t.Fatal(err)
	}
	b, err := batch.Sequence(0.8)
	if err != nil {
		t.Fatal(err)
	}
	sameSequence(t, r.Get("batch"), b)
	if got := r.Get("batch").Get("conversion").Float(); got != 0.8 {
		t.Errorf("batch.conversion = %v, want 0.8", got)
	}
}

func splitPath(p string) []string {
	var out []string
	start := 0
	for i := range len(p) {
		if p[i] == '.' {
			out = append(out, p[start:i])
			start = i + 1
		}
	}
	return append(out, p[start:])
}

func TestChains(t *testing.T) {
	api, _ := testAPI(t)
	// Defaults of site/copoly.d.ts: 12 chains of 60 units, seed 1.
	r := call(api, "chains", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5})
	wantNoError(t, r)
	want, err := copoly.Terminal{R1: 0.8, R2: 0.15}.Chains(0.5, 12, 60, 1)
	if err != nil {
		t.Fatal(err)
	}
	got := r.Get("samples")
	if got.Length() != len(want) {
		t.Fatalf("%d samples, want %d", got.Length(), len(want))
	}
	for i := range want {
		if got.Index(i).String() != want[i] {
			t.Errorf("samples[%d] = %q, want %q", i, got.Index(i).String(), want[i])
		}
	}
	r = call(api, "chains", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "count": 3, "length": 7, "seed": 42})
	wantNoError(t, r)
	want, _ = copoly.Terminal{R1: 0.8, R2: 0.15}.Chains(0.5, 3, 7, 42)
	if got := r.Get("samples"); got.Length() != 3 || got.Index(2).String() != want[2] {
		t.Errorf("samples = %s, want %q", stringify(got), want)
	}
}

func TestLibrary(t *testing.T) {
	api, _ := testAPI(t)
	r := call(api, "library")
	wantNoError(t, r)
	ms, ps := copoly.Monomers(), copoly.Pairs()
	if r.Get("monomers").Length() != len(ms) || r.Get("pairs").Length() != len(ps) {
		t.Fatalf("library has %d monomers and %d pairs, want %d and %d", r.Get("monomers").Length(), r.Get("pairs").Length(), len(ms), len(ps))
	}
	m0, p0 := r.Get("monomers").Index(0), r.Get("pairs").Index(0)
	if m0.Get("name").String() != ms[0].Name || m0.Get("molarMass").Float() != ms[0].MolarMass || m0.Get("source").String() != ms[0].Source {
		t.Errorf("monomers[0] = %s, want %+v", stringify(m0), ms[0])
	}
	if p0.Get("monomer2").String() != ps[0].Monomer2 || p0.Get("r1").Float() != ps[0].R1 || p0.Get("r2").Float() != ps[0].R2 || p0.Get("source").String() != ps[0].Source {
		t.Errorf("pairs[0] = %s, want %+v", stringify(p0), ps[0])
	}
}

// TestInputErrors checks that bad input gives an error object with the field named as in
// site/copoly.d.ts. The limits in the expected messages are copoly's constants (MaxPoints,
// MaxBins, MaxRunLength, MaxChains, MaxChainLength) and the bridge's whole-number seed range.
func TestInputErrors(t *testing.T) {
	api, _ := testAPI(t)
	ok := map[string]map[string]any{
		"composition": {"r1": 0.8, "r2": 0.15, "f1": []any{0.5}},
		"feedFor":     {"r1": 0.8, "r2": 0.15, "targetF1": 0.5},
		"drift":       {"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": []any{0.5}},
		"sequence":    {"r1": 0.8, "r2": 0.15, "f1": 0.5},
		"chains":      {"r1": 0.8, "r2": 0.15, "f10": 0.5},
	}
	// with returns the good argument of method with key set to v (or removed when v is nil).
	with := func(method, key string, v any, more ...any) map[string]any {
		a := map[string]any{}
		for k, x := range ok[method] {
			a[k] = x
		}
		a[key] = v
		if v == nil {
			delete(a, key)
		}
		for i := 0; i+1 < len(more); i += 2 {
			a[more[i].(string)] = more[i+1]
		}
		return a
	}
	tests := []struct {
		name   string
		method string
		arg    any
		field  string
		text   string
	}{
		// Missing and wrong JS types, for every method with the same ratio inputs.
		{"composition r1 missing", "composition", with("composition", "r1", nil), "r1", "missing"},
		{"composition r1 null", "composition", with("composition", "r1", js.Null()), "r1", "missing"},
		{"composition r1 text", "composition", with("composition", "r1", "0.8"), "r1", `the text "0.8"`},
		{"composition r2 boolean", "composition", with("composition", "r2", true), "r2", "true"},
		{"composition r1 NaN", "composition", with("composition", "r1", math.NaN()), "r1", "not a number"},
		{"composition r1 negative", "composition", with("composition", "r1", -0.2), "r1", "negative"},
		{"composition r2 infinite", "composition", with("composition", "r2", math.Inf(1)), "r2", "finite"},
		{"composition f1 missing", "composition", with("composition", "f1", nil), "f1", "missing"},
		{"composition f1 a number", "composition", with("composition", "f1", 0.5), "f1", "a list of numbers"},
		{"composition f1 an object", "composition", with("composition", "f1", map[string]any{"0": 0.5}), "f1", "a list of numbers"},
		{"composition f1 element text", "composition", with("composition", "f1", []any{0.5, "0.6"}), "f1[1]", "must be a number"},
		{"composition f1 element null", "composition", with("composition", "f1", []any{0.5, 0.6, nil}), "f1[2]", "null"},
		{"composition f1 element out of range", "composition", with("composition", "f1", []any{0.5, 1.5}), "f1[1]", "between 0 and 1"},
		{"composition f1 element NaN", "composition", with("composition", "f1", []any{math.NaN()}), "f1[0]", "not a number"},
		{"composition f1 too many", "composition", with("composition", "f1", jsEval("new Array(100001).fill(0.5)")), "f1", "at most 100000"},
		{"composition f1 sparse and huge", "composition", with("composition", "f1", jsEval("new Array(1e9)")), "f1", "at most 100000"},
		{"feedFor target missing", "feedFor", with("feedFor", "targetF1", nil), "targetF1", "missing"},
		{"feedFor target unreachable", "feedFor", map[string]any{"r1": 0, "r2": 0, "targetF1": 0.3}, "targetF1", "alternates"},
		{"feedFor target above one", "feedFor", with("feedFor", "targetF1", 1.2), "targetF1", "between 0 and 1"},

		// drift.
		{"drift f10 text", "drift", with("drift", "f10", "half"), "f10", "must be a number"},
		{"drift f10 above one", "drift", with("drift", "f10", 1.2), "f10", "between 0 and 1"},
		{"drift conversion empty", "drift", with("drift", "conversion", []any{}), "conversion", "at least one"},
		{"drift conversion decreasing", "drift", with("drift", "conversion", []any{0.5, 0.4}), "conversion[1]", "must not decrease"},
		{"drift conversion negative", "drift", with("drift", "conversion", []any{-0.1}), "conversion[0]", "between 0 and 1"},
		{"drift conversion too many", "drift", with("drift", "conversion", jsEval("new Array(100001).fill(0.5)")), "conversion", "at most 100000"},
		{"drift basis unknown", "drift", with("drift", "basis", "volume"), "basis", `"molar" or "mass"`},
		{"drift basis a number", "drift", with("drift", "basis", 1), "basis", "must be text"},
		{"drift mass without molar masses", "drift", with("drift", "basis", "mass"), "molarMass1", "needs both molar masses"},
		{"drift one molar mass", "drift", with("drift", "molarMass1", 104.15), "molarMass2", "both molar masses or neither"},
		{"drift molar mass negative", "drift", with("drift", "molarMass1", -1, "molarMass2", 128.17), "molarMass1", "positive"},
		{"drift molar mass text", "drift", with("drift", "molarMass2", "128", "molarMass1", 104.15), "molarMass2", "must be a number"},
		{"drift mass conversion beyond the end", "drift", map[string]any{"r1": 0.5, "r2": 0, "f10": 0.3, "conversion": []any{0.1, 0.99}, "basis": "mass", "molarMass1": 100, "molarMass2": 100}, "conversion[1]", "stops at a mass conversion"},
		{"drift tolerance zero", "drift", with("drift", "tolerance", 0), "tolerance", "above 0"},
		{"drift tolerance text", "drift", with("drift", "tolerance", "2%"), "tolerance", "must be a number"},
		{"drift bins fractional", "drift", with("drift", "bins", 2.5), "bins", "whole number"},
		{"drift bins zero", "drift", with("drift", "bins", 0), "bins", "between 1 and 200"},
		{"drift bins too many", "drift", with("drift", "bins", 201), "bins", "between 1 and 200"},
		{"drift bins NaN", "drift", with("drift", "bins", math.NaN()), "bins", "finite"},
		{"drift last conversion zero", "drift", with("drift", "conversion", []any{0, 0}), "conversion[1]", "zero conversion"},

		// sequence.
		{"sequence f1 above one", "sequence", with("sequence", "f1", 2), "f1", "between 0 and 1"},
		{"sequence f1 a list", "sequence", with("sequence", "f1", []any{0.5}), "f1", "must be a number"},
		{"sequence maxLength zero", "sequence", with("sequence", "maxLength", 0), "maxLength", "between 1 and 1000"},
		{"sequence maxLength fractional", "sequence", with("sequence", "maxLength", 3.5), "maxLength", "whole number"},
		{"sequence conversion above one", "sequence", with("sequence", "conversion", 1.5), "conversion", "between 0 and 1"},
		{"sequence conversion text", "sequence", with("sequence", "conversion", "90%"), "conversion", "must be a number"},

		// chains.
		{"chains count too many", "chains", with("chains", "count", 1001), "count", "between 1 and 1000"},
		{"chains count zero", "chains", with("chains", "count", 0), "count", "between 1 and 1000"},
		{"chains length too long", "chains", with("chains", "length", 10001), "length", "between 1 and 10000"},
		{"chains length fractional", "chains", with("chains", "length", 60.5), "length", "whole number"},
		{"chains seed negative", "chains", with("chains", "seed", -1), "seed", "between 0 and"},
		{"chains seed huge", "chains", with("chains", "seed", 1e300), "seed", "between 0 and"},
		{"chains f10 negative", "chains", with("chains", "f10", -0.5), "f10", "between 0 and 1"},

		// projects.
		{"checkProject project missing", "checkProject", map[string]any{}, "project", "missing"},
		{"checkProject project a list", "checkProject", map[string]any{"project": []any{}}, "project", "an object"},
		{"exportProject project text", "exportProject", map[string]any{"project": "{}"}, "project", "an object"},
		{"importProject json missing", "importProject", map[string]any{}, "json", "missing"},
		{"importProject json an object", "importProject", map[string]any{"json": map[string]any{}}, "json", "must be text"},
		{"importProject broken", "importProject", map[string]any{"json": `{"format":"copoly-project","version":1,`}, "project", "not valid JSON"},
		{"importProject foreign", "importProject", map[string]any{"json": `{"name":"x"}`}, "project", "not a copoly project file"},
		{"importProject newer", "importProject", map[string]any{"json": `{"format":"copoly-project","version":2}`}, "project.version", "made by a newer copoly"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			wantError(t, call(api, tt.method, tt.arg), tt.field, tt.text)
		})
	}
	// The good arguments really are good, so each case above fails for its own reason.
	for method, a := range ok {
		wantNoError(t, call(api, method, a))
	}
}

// TestLimits: limits() is project.Limits by name, every limit the page sizes its inputs from.
func TestLimits(t *testing.T) {
	api, _ := testAPI(t)
	r := call(api, "limits")
	wantNoError(t, r)
	all := project.Limits()
	if n := js.Global().Get("Object").Call("keys", r).Length(); n != len(all) {
		t.Errorf("limits() has %d keys, want %d", n, len(all))
	}
	for _, l := range all {
		if got := r.Get(l.Name); got.Type() != js.TypeNumber || got.Float() != l.Value {
			t.Errorf("limits().%s = %s, want %v", l.Name, stringify(got), l.Value)
		}
	}
	// The page's former copies (site/app.js): 1000 grid rows, 200 characters a cell, the 10 %
	// linear-method threshold (fit.LinearConversionLimit, common practice, no source).
	if r.Get("benchRows").Int() != 1000 || r.Get("cellLength").Int() != 200 || r.Get("linearConversion").Float() != 0.10 {
		t.Errorf("limits() = %s", stringify(r))
	}
}

// TestParseNumber: parseNumber is bench.ParseCell, numbers as people type them, with errors
// naming the field given and their parts.
func TestParseNumber(t *testing.T) {
	api, _ := testAPI(t)
	for _, c := range []struct {
		text string
		want float64
	}{
		// Worked by hand from the rules of bench.ParseNumber.
		{"−0.5", -0.5}, {"1,5e3", 1500}, {"35 %", 0.35}, {" 0,35 ", 0.35}, {"2.5E-4", 2.5e-4}, {"+12", 12},
	} {
		r := call(api, "parseNumber", map[string]any{"text": c.text})
		wantNoError(t, r)
		want, _ := bench.ParseNumber(c.text)
		if got := r.Get("value").Float(); got != c.want || got != want {
			t.Errorf("parseNumber(%q) = %v, want %v (bench.ParseNumber %v)", c.text, got, c.want, want)
		}
	}
	r := call(api, "parseNumber", map[string]any{"text": "1,234.5"})
	wantError(t, r, "number", "both a comma and a point")
	wantCode(t, r, copoly.CodeNotANumber)
	r = call(api, "parseNumber", map[string]any{"text": "abc", "field": "runs[3].f10"})
	wantError(t, r, "runs[3].f10", `"abc"`)
	if r.Get("row").Int() != 3 {
		t.Errorf("parseNumber(abc, runs[3].f10) row = %s, want 3", stringify(r.Get("row")))
	}
}
