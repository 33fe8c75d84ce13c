//go:build js && wasm

package main

import (
	"syscall/js"
	"testing"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/project"
)

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
