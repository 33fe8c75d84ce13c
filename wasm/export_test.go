//go:build js && wasm

package main

// Run with
//
//	GOOS=js GOARCH=wasm go test -exec="$(go env GOROOT)/lib/wasm/go_js_wasm_exec" ./wasm/...
//
// The tests call the methods through syscall/js, as a page does.

import (
	"encoding/json"
	"fmt"
	"maps"
	"reflect"
	"slices"
	"strings"
	"syscall/js"
	"testing"
	"time"

	"github.com/hack-pad/hackpadfs/mem"
	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// testAPI returns a copoly object whose storage is a fresh in-memory file system.
func testAPI(t *testing.T) (js.Value, *mem.FS) {
	t.Helper()
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	st := newStorage()
	st.open = memOpener(m)
	st.now = func() time.Time { return fixedNow }
	return newAPI(st), m
}

// call calls method of api with the JS form of the Go arguments.
func call(api js.Value, method string, args ...any) js.Value {
	return api.Call(method, args...)
}

// checkedExport checks that checkProject gives arg ({project}) back unchanged and returns the
// file exportProject writes of it.
func checkedExport(t *testing.T, api, arg js.Value) string {
	t.Helper()
	checked := call(api, "checkProject", arg)
	wantNoError(t, checked)
	if got, want := stringify(checked), stringify(arg); got != want {
		t.Errorf("checkProject() = %s, want %s", got, want)
	}
	exp := call(api, "exportProject", arg)
	wantNoError(t, exp)
	return exp.Get("json").String()
}

// jsEval evaluates a JS expression; the tests use it to build values Go cannot (getters, sparse
// arrays, BigInt, typed arrays).
func jsEval(expr string) js.Value {
	return js.Global().Get("Function").New("return (" + expr + ");").Invoke()
}

func stringify(v js.Value) string {
	if v.IsUndefined() {
		return "undefined"
	}
	return js.Global().Get("JSON").Call("stringify", v).String()
}

// wantError checks that v is a CopolyError for field whose message contains text.
func wantError(t *testing.T, v js.Value, field, text string) {
	t.Helper()
	if v.Type() != js.TypeObject || v.Get("error").Type() != js.TypeString {
		t.Fatalf("got %s, want {error, field: %q}", stringify(v), field)
	}
	if got := v.Get("field").String(); got != field {
		t.Errorf("field = %q, want %q (error %q)", got, field, v.Get("error").String())
	}
	if msg := v.Get("error").String(); !strings.Contains(msg, text) {
		t.Errorf("error = %q, want it to contain %q", msg, text)
	}
	wantParts(t, v)
}

// wantParts checks the parts of a CopolyError beside its message: a code of copoly.Codes(),
// "internal" only for an error naming no field (a panic recovered), the reason that ends the
// message, the value (when there is one) that the
// message names, and the row (when there is one) that the field names.
func wantParts(t *testing.T, v js.Value) {
	t.Helper()
	msg, field := v.Get("error").String(), v.Get("field").String()
	if code := v.Get("code"); code.Type() != js.TypeString || (code.String() == copoly.CodeInternal && field != "") || !slices.Contains(copoly.Codes(), code.String()) {
		t.Errorf("code = %s, want a code of copoly.Codes() (error %q)", stringify(code), msg)
	}
	if r := v.Get("reason"); r.Type() != js.TypeString || r.String() == "" || !strings.HasSuffix(msg, r.String()) {
		t.Errorf("reason = %s, want the end of the message %q", stringify(r), msg)
	}
	if x := v.Get("value"); !x.IsUndefined() && (x.Type() != js.TypeNumber || !strings.HasPrefix(msg, field+" = ")) {
		t.Errorf("value = %s, want a number the message %q names after %q", stringify(x), msg, field)
	}
	if r := v.Get("row"); !r.IsUndefined() && (r.Type() != js.TypeNumber || !strings.Contains(field, fmt.Sprintf("[%d]", r.Int()))) {
		t.Errorf("row = %s, want the row the field %q names", stringify(r), field)
	}
}

// wantNoError fails the test if v is a CopolyError.
func wantNoError(t *testing.T, v js.Value) {
	t.Helper()
	if v.Type() != js.TypeObject {
		t.Fatalf("got %s, want an object", stringify(v))
	}
	if e := v.Get("error"); !e.IsUndefined() {
		t.Fatalf("got error %s (field %q)", e.String(), v.Get("field").String())
	}
}

// await waits for a Promise and returns what it resolved to; a rejection or a Promise that has
// not settled after 20 s fails the test (the guard only stops a hang; it measures nothing).
func await(t *testing.T, p js.Value) js.Value {
	t.Helper()
	if !p.InstanceOf(js.Global().Get("Promise")) {
		t.Fatalf("got %s, want a Promise", stringify(p))
	}
	resolved, rejected := make(chan js.Value, 1), make(chan js.Value, 1)
	onResolve := js.FuncOf(func(_ js.Value, a []js.Value) any { resolved <- a[0]; return nil })
	onReject := js.FuncOf(func(_ js.Value, a []js.Value) any { rejected <- a[0]; return nil })
	defer onResolve.Release()
	defer onReject.Release()
	p.Call("then", onResolve, onReject)
	select {
	case v := <-resolved:
		return v
	case v := <-rejected:
		t.Fatalf("Promise rejected with %s; the API promises never reject", stringify(v))
	case <-time.After(20 * time.Second):
		t.Fatal("Promise did not settle")
	}
	return js.Value{}
}

func TestArguments(t *testing.T) {
	api, _ := testAPI(t)
	bad := []struct {
		name string
		args []any
		text string
	}{
		{"nothing", nil, "got nothing"},
		{"undefined", []any{js.Undefined()}, "got nothing"},
		{"null", []any{js.Null()}, "null"},
		{"number", []any{3}, "the number 3"},
		{"text", []any{"r1=0.5"}, "text"},
		{"list", []any{[]any{0.5, 0.5}}, "a list"},
		{"function", []any{jsEval("() => 1")}, "a function"},
		{"two objects", []any{map[string]any{}, map[string]any{}}, "2 arguments"},
	}
	required := []string{"composition", "feedFor", "drift", "sequence", "chains", "checkProject", "exportProject", "importProject",
		"benchRuns", "pasteBench", "fit", "nextRuns", "qe"}
	for _, method := range required {
		for _, tt := range bad {
			t.Run(method+"/"+tt.name, func(t *testing.T) {
				wantError(t, call(api, method, tt.args...), "arguments", tt.text)
			})
		}
	}
	for _, tt := range bad {
		t.Run("saveProject/"+tt.name, func(t *testing.T) {
			wantError(t, await(t, call(api, "saveProject", tt.args...)), "arguments", tt.text)
		})
	}
	// Methods whose argument is optional accept nothing, undefined and an empty object.
	for _, method := range []string{"library", "demoProject"} {
		for _, args := range [][]any{nil, {js.Undefined()}, {map[string]any{}}} {
			wantNoError(t, call(api, method, args...))
		}
		wantError(t, call(api, method, 7), "arguments", "the number 7")
	}
	wantNoError(t, await(t, call(api, "loadProject")))
}

func TestPanicIsRecovered(t *testing.T) {
	api, _ := testAPI(t)

	// Getters and Proxy traps that throw are read inside JS calls and reported by field; a
	// throw during a plain syscall/js Get would break the Go stack beyond any recover.
	trap := jsEval(`{get r1() { throw new Error("trap") }, r2: 1, f1: [0.5]}`)
	wantError(t, call(api, "composition", trap), "r1", "cannot be read: JavaScript error: trap")
	trapList := jsEval(`{r1: 1, r2: 1, f1: new Proxy([0.5], {get(t, k) { if (k === "0") throw new Error("index trap"); return Reflect.get(t, k) }})}`)
	wantError(t, call(api, "composition", trapList), "f1", "index trap")
	trapProject := jsEval(`{project: {format: "copoly-project", version: 1, get monomer1() { throw new Error("nested trap") }}}`)
	wantError(t, call(api, "checkProject", trapProject), "project.monomer1", "nested trap")
	wantError(t, call(api, "composition", jsEval(`new Proxy({}, {get() { throw new Error("proxy trap") }})`)), "r1", "proxy trap")

	// A method that panics outright, through the same adapter.
	boom := wrap("boom", argOptional, func(js.Value) (any, error) { panic("boom") })
	defer boom.Release()
	wantError(t, boom.Invoke(), "", "internal error in copoly.boom: boom")

	// An asynchronous job that panics resolves its Promise with the error.
	boomAsync := wrapAsync("boomAsync", argOptional, func(js.Value) (asyncJob, error) {
		return func() (any, error) { panic("async boom") }, nil
	})
	defer boomAsync.Release()
	wantError(t, await(t, boomAsync.Invoke()), "", "internal error in copoly.boomAsync: async boom")

	// The module still answers.
	r := call(api, "composition", map[string]any{"r1": 1, "r2": 1, "f1": []any{0.25}})
	wantNoError(t, r)
	// r1 = r2 = 1: F1 = f1 (Mayo–Lewis 1944 equation with r1 = r2 = 1).
	if got := r.Get("F1").Index(0).Float(); got != 0.25 {
		t.Errorf("composition after a panic: F1 = %v, want 0.25", got)
	}
}

func TestUnsupportedJSValues(t *testing.T) {
	api, _ := testAPI(t)
	// A BigInt is a kind of value syscall/js cannot classify; it must give an error, not a panic.
	wantError(t, call(api, "composition", jsEval(`{r1: 1n, r2: 1, f1: [0.5]}`)), "r1", "must be a number")
	wantError(t, call(api, "composition", jsEval(`{r1: 1, r2: 1, f1: [0.5, 2n]}`)), "f1[1]", "must be a number")
	wantError(t, call(api, "composition", jsEval(`{r1: Symbol("r"), r2: 1, f1: [0.5]}`)), "r1", "a symbol")
}

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

// edited returns a structured clone of arg changed by the JS statement edit, which sees the
// clone as a.
func edited(arg js.Value, edit string) js.Value {
	return jsEval(`((x) => { const a = structuredClone(x); ` + edit + `; return a; })`).Invoke(arg)
}

// args returns the union of the maps, later ones winning; a nil value removes the key.
func args(ms ...map[string]any) map[string]any {
	a := map[string]any{}
	for _, m := range ms {
		for k, v := range m {
			if v == nil {
				delete(a, k)
				continue
			}
			a[k] = v
		}
	}
	return a
}

// jsOf converts a Go value of a test to JS: maps, slices and arrays of any values (nested
// js.Values kept, nil slices and maps null, as vert converts them), the rest by toJS.
func jsOf(v any) js.Value {
	switch x := v.(type) {
	case nil:
		return js.Null()
	case js.Value:
		return x
	case map[string]any:
		o := object.New()
		for k, e := range x {
			o.Set(k, jsOf(e))
		}
		return o
	}
	rv := reflect.ValueOf(v)
	switch rv.Kind() {
	case reflect.Slice:
		if rv.IsNil() {
			return js.Null()
		}
		fallthrough
	case reflect.Array:
		a := array.New()
		for i := range rv.Len() {
			a.SetIndex(i, jsOf(rv.Index(i).Interface()))
		}
		return a
	}
	return toJS(v)
}

var (
	null   = js.Null()      // a key that must hold null
	absent = js.Undefined() // a key that must be absent
)

// near is a number worked by hand, compared within 1e-12 (relative) rather than exactly.
type near float64

// at returns the value at path in v: keys (or indices) separated by dots, "" for v itself. A
// note after '#' is ignored, so that one key can be checked against two values.
func at(v js.Value, path string) js.Value {
	path, _, _ = strings.Cut(path, "#")
	if path == "" {
		return v
	}
	for _, k := range strings.Split(path, ".") {
		if t := v.Type(); t != js.TypeObject && t != js.TypeFunction {
			return js.Undefined()
		}
		v = v.Get(k)
	}
	return v
}

// canonical is the JSON text of a JS value with the keys of every object sorted, "undefined"
// for undefined (NaN and ±Infinity are null, as in JSON).
var canonical = jsEval(`(v) => v === undefined ? "undefined" : JSON.stringify(v, (k, x) =>
	x && typeof x === "object" && !Array.isArray(x) ? Object.fromEntries(Object.entries(x).sort(([a], [b]) => a < b ? -1 : a > b ? 1 : 0)) : x)`)

// wantAt checks the value at each path of v (at) against want: a near within 1e-12, anything
// else exactly, as the canonical JSON text of jsOf(want).
func wantAt(t *testing.T, v js.Value, want map[string]any) {
	t.Helper()
	for _, path := range slices.Sorted(maps.Keys(want)) {
		got := at(v, path)
		if w, ok := want[path].(near); ok {
			if got.Type() != js.TypeNumber || !scalar.EqualWithinAbsOrRel(got.Float(), float64(w), 1e-12, 1e-12) {
				t.Errorf("%s = %s, want %v", path, stringify(got), float64(w))
			}
			continue
		}
		if g, w := canonical.Invoke(got).String(), canonical.Invoke(jsOf(want[path])).String(); g != w {
			t.Errorf("%s = %.400s, want %.400s", path, g, w)
		}
	}
}

// must returns v, or panics with err: for the direct copoly calls that make the expected
// values, which cannot fail on the tests' input.
func must[T any](v T, err error) T {
	if err != nil {
		panic(err)
	}
	return v
}

func must2[T, U any](v T, w U, err error) (T, U) {
	if err != nil {
		panic(err)
	}
	return v, w
}

// fmtPath joins the parts of a path with dots.
func fmtPath(parts ...any) string {
	s := make([]string, len(parts))
	for i, p := range parts {
		s[i] = fmt.Sprint(p)
	}
	return strings.Join(s, ".")
}

// mustJSON returns v as JSON text, as encoding/json writes it.
func mustJSON(t *testing.T, v any) string {
	t.Helper()
	b, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}
