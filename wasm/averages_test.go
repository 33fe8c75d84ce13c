//go:build js && wasm

package main

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly/molarmass"
)

// Hand case from the definitions of the averages (P. J. Flory, Principles of Polymer Chemistry,
// 1953; the formulas in the BinAverages doc comment): equal masses of chains of 10 000 and
// 30 000 g/mol give
//
//	Mn = Σw / Σ(w/M) = 2/(1/10 000 + 1/30 000) = 15 000
//	Mw = Σ wM / Σ w = (10 000 + 30 000)/2 = 20 000
//	Mz = Σ wM² / Σ wM = (10 000² + 30 000²)/40 000 = 25 000,  Đ = 20 000/15 000 = 4/3
//
// and with F1 = 0.4 of monomers of 100 and 200 g/mol (the SizeOf doc comment) a unit of
// 0.4·100 + 0.6·200 = 160 g/mol, DPn = 15 000/160 = 93.75, DPw = 20 000/160 = 125, and
// 0.4·93.75 = 37.5 and 0.6·93.75 = 56.25 units of each monomer per chain.
var handAverages = map[string]float64{"Mn": 15000, "Mw": 20000, "Mz": 25000, "dispersity": 4.0 / 3}

var handSize = map[string]float64{"unitMass": 160, "DPn": 93.75, "DPw": 125, "units1": 37.5, "units2": 56.25}

func TestAverages(t *testing.T) {
	api, _ := testAPI(t)
	for _, c := range []struct {
		name string
		arg  map[string]any
	}{
		{"weight fractions", map[string]any{"bins": []any{
			map[string]any{"low": 10000, "high": 10000, "weightFraction": 0.5},
			map[string]any{"low": 30000, "high": 30000, "weightFraction": 0.5}}}},
		// Equal masses are three chains of 10 000 g/mol for each of 30 000 g/mol.
		{"number fractions", map[string]any{"bins": []any{
			map[string]any{"low": 10000, "high": 10000, "numberFraction": 0.75},
			map[string]any{"low": 30000, "high": 30000, "numberFraction": 0.25}}}},
		{"slices", map[string]any{"slices": []any{
			map[string]any{"mass": 10000, "signal": 2.5}, map[string]any{"mass": 30000, "signal": 2.5}}}},
		{"empty bins with slices", map[string]any{"bins": []any{}, "slices": []any{
			map[string]any{"mass": 10000, "signal": 1}, map[string]any{"mass": 30000, "signal": 1}}}},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := call(api, "averages", c.arg)
			wantNoError(t, r)
			for k, want := range handAverages {
				if got := r.Get(k).Float(); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-12) {
					t.Errorf("%s = %v, want %v", k, got, want)
				}
			}
			if !r.Get("size").IsUndefined() {
				t.Errorf("size = %s without F1 and molar masses, want it absent", stringify(r.Get("size")))
			}
		})
	}

	t.Run("size", func(t *testing.T) {
		r := call(api, "averages", map[string]any{"slices": []any{
			map[string]any{"mass": 10000, "signal": 1}, map[string]any{"mass": 30000, "signal": 1}},
			"F1": 0.4, "molarMass1": 100, "molarMass2": 200})
		wantNoError(t, r)
		size := r.Get("size")
		for k, want := range handSize {
			if got := size.Get(k).Float(); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-12) {
				t.Errorf("size.%s = %v, want %v", k, got, want)
			}
		}
		// And exactly what copoly gives.
		a, err := molarmass.SliceAverages([]float64{10000, 30000}, []float64{1, 1})
		if err != nil {
			t.Fatal(err)
		}
		c, err := molarmass.SizeOf(a, 0.4, 100, 200)
		if err != nil {
			t.Fatal(err)
		}
		if size.Get("DPn").Float() != c.DPn || size.Get("units2").Float() != c.Units2 || r.Get("Mz").Float() != a.Mz {
			t.Errorf("size = %s, want %+v", stringify(size), c)
		}
	})

	t.Run("no size without both parts", func(t *testing.T) {
		for _, more := range []map[string]any{{"F1": 0.4}, {"molarMass1": 100, "molarMass2": 200}} {
			r := call(api, "averages", args(map[string]any{"slices": []any{map[string]any{"mass": 1e4, "signal": 1}}}, more))
			wantNoError(t, r)
			if !r.Get("size").IsUndefined() {
				t.Errorf("size = %s with only %v, want it absent", stringify(r.Get("size")), more)
			}
		}
	})
}

func TestAveragesErrors(t *testing.T) {
	api, _ := testAPI(t)
	bins := func(rows ...map[string]any) map[string]any {
		list := make([]any, len(rows))
		for i, r := range rows {
			list[i] = r
		}
		return map[string]any{"bins": list}
	}
	slices := func(rows ...map[string]any) map[string]any {
		list := make([]any, len(rows))
		for i, r := range rows {
			list[i] = r
		}
		return map[string]any{"slices": list}
	}
	good := map[string]any{"low": 1e4, "high": 2e4, "weightFraction": 1}
	slice := map[string]any{"mass": 1e4, "signal": 1}
	for _, c := range []struct {
		name        string
		arg         map[string]any
		field, text string
	}{
		{"neither", map[string]any{}, "bins", "bins"},
		{"both empty", map[string]any{"bins": []any{}, "slices": []any{}}, "bins", "slices"},
		{"both", args(bins(good), slices(slice)), "slices", "not both"},
		{"bins a number", map[string]any{"bins": 5}, "bins", "a list of objects"},
		{"too many bins", map[string]any{"bins": jsEval(`new Array(10001).fill({low: 1, high: 2, weightFraction: 1})`)}, "bins", "at most 10000"},
		{"bin high missing", bins(map[string]any{"low": 1e4}), "bins[0].high", "missing"},
		{"bin low text", bins(good, map[string]any{"low": "1e4", "high": 2e4}), "bins[1].low", "must be a number"},
		{"bin low negative", bins(good, map[string]any{"low": -1, "high": 2e4, "weightFraction": 1}), "bins[1].low", "negative"},
		{"bin high below low", bins(map[string]any{"low": 3e4, "high": 2e4, "weightFraction": 1}), "bins[0].high", "low ≤ high"},
		{"bin fractions mixed", bins(good, map[string]any{"low": 2e4, "high": 3e4, "numberFraction": 0.5}), "bins[1].numberFraction", "not both"},
		{"bin fraction NaN", bins(map[string]any{"low": 1e4, "high": 2e4, "weightFraction": math.NaN()}), "bins[0].weightFraction", "finite"},
		{"bins all zero", bins(map[string]any{"low": 1e4, "high": 2e4}), "bins", "all zero"},
		{"slice mass zero", slices(slice, map[string]any{"mass": 0, "signal": 1}), "slices[1].mass", "positive"},
		{"slice signal negative", slices(map[string]any{"mass": 1e4, "signal": -0.1}), "slices[0].signal", "baseline"},
		{"slice signal infinite", slices(slice, slice, map[string]any{"mass": 1e4, "signal": math.Inf(1)}), "slices[2].signal", "finite"},
		{"slice signal missing", slices(map[string]any{"mass": 1e4}), "slices[0].signal", "missing"},
		{"slices all zero", slices(map[string]any{"mass": 1e4, "signal": 0}), "slices", "all zero"},
		{"F1 above one", args(slices(slice), map[string]any{"F1": 1.5, "molarMass1": 100, "molarMass2": 200}), "F1", "between 0 and 1"},
		{"one molar mass", args(slices(slice), map[string]any{"F1": 0.5, "molarMass1": 100}), "molarMass2", "both molar masses or neither"},
		{"molar mass zero", args(slices(slice), map[string]any{"molarMass1": 0, "molarMass2": 100}), "molarMass1", "positive"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "averages", c.arg), c.field, c.text)
		})
	}
}
