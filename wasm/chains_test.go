//go:build js && wasm

package main

import (
	"math"
	"syscall/js"
	"testing"

	"copoly/copoly"
)

// Tests of chains with the simulation options (ChainsResult in site/copoly.d.ts). Results are
// compared with a direct copoly.SimulateChains call with the defaults of the d.ts: 1000 chains,
// length 100 without a dpn, seed 1, 12 sample chains, 30 bins.

func intsOf(t *testing.T, v js.Value) []int {
	t.Helper()
	fs := floatsOf(t, v)
	out := make([]int, len(fs))
	for i, f := range fs {
		out[i] = int(f)
		if float64(out[i]) != f {
			t.Fatalf("[%d] = %v, want a whole number", i, f)
		}
	}
	return out
}

func simulate(t *testing.T, opt copoly.ChainOptions) *copoly.ChainStats {
	t.Helper()
	if opt.Count == 0 {
		opt.Count = 1000
	}
	if opt.Length == 0 && opt.DPn == 0 {
		opt.Length = 100
	}
	if opt.Seed == 0 {
		opt.Seed = 1
	}
	opt.Samples = 12
	st, err := copoly.SimulateChains(opt)
	if err != nil {
		t.Fatal(err)
	}
	return st
}

// sameStats checks a simulation's result against st and its histogram over bins.
func sameStats(t *testing.T, r js.Value, st *copoly.ChainStats, bins int) {
	t.Helper()
	sameFloats(t, "compositions", floatsOf(t, r.Get("compositions")), st.Compositions)
	lengths := intsOf(t, r.Get("lengths"))
	if len(lengths) != len(st.Lengths) {
		t.Fatalf("%d lengths, want %d", len(lengths), len(st.Lengths))
	}
	units := 0
	comps := floatsOf(t, r.Get("compositions"))
	for i, n := range lengths {
		if n != st.Lengths[i] {
			t.Errorf("lengths[%d] = %d, want %d", i, n, st.Lengths[i])
		}
		units += n
		// Each composition is a count of M1 units over the chain's length.
		if ones := comps[i] * float64(n); math.Abs(ones-math.Round(ones)) > 1e-9 {
			t.Errorf("compositions[%d] × lengths[%d] = %v, not a whole number of units", i, i, ones)
		}
	}
	if got := r.Get("units").Int(); got != units || got != st.Units {
		t.Errorf("units = %d, want Σ lengths = %d (copoly %d)", got, units, st.Units)
	}
	for _, c := range []struct {
		key  string
		want float64
	}{{"mean", st.Mean}, {"variance", st.Variance}, {"weightMean", st.WeightMean}} {
		if got := r.Get(c.key).Float(); got != c.want {
			t.Errorf("%s = %v, want %v", c.key, got, c.want)
		}
	}
	samples := r.Get("samples")
	if samples.Length() != len(st.Samples) {
		t.Fatalf("%d samples, want %d", samples.Length(), len(st.Samples))
	}
	for i, s := range st.Samples {
		if samples.Index(i).String() != s {
			t.Errorf("samples[%d] = %q, want %q", i, samples.Index(i).String(), s)
		}
	}
	h, err := st.Histogram(bins)
	if err != nil {
		t.Fatal(err)
	}
	sameFloats(t, "histogram.edges", floatsOf(t, r.Get("histogram").Get("edges")), h.Edges)
	sameFloats(t, "histogram.weights", floatsOf(t, r.Get("histogram").Get("weights")), h.Weights)
}

func TestChainsSimulation(t *testing.T) {
	api, _ := testAPI(t)
	term := copoly.Terminal{R1: 0.8, R2: 0.15}

	t.Run("terminal, dpn, constant feed", func(t *testing.T) {
		r := call(api, "chains", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "dpn": 50})
		wantNoError(t, r)
		st := simulate(t, copoly.ChainOptions{Model: term, F10: 0.5, DPn: 50})
		sameStats(t, r, st, 30)
		if got := r.Get("compositions").Length(); got != 1000 {
			t.Errorf("%d chains, want the default 1000", got)
		}
		if got := r.Get("histogram").Get("edges").Length(); got != 31 {
			t.Errorf("%d histogram edges, want the default 30 bins + 1", got)
		}
		stock := floatsOf(t, r.Get("stockmayer"))
		if len(stock) != r.Get("histogram").Get("weights").Length() {
			t.Fatalf("stockmayer has %d values, want one per histogram bin (%d)", len(stock), r.Get("histogram").Get("weights").Length())
		}
		want, err := term.Stockmayer(0.5, 50, floatsOf(t, r.Get("histogram").Get("edges")))
		if err != nil {
			t.Fatal(err)
		}
		sameFloats(t, "stockmayer", stock, want)
		if got := r.Get("stockmayerVariance").Float(); got != st.StockmayerVariance {
			t.Errorf("stockmayerVariance = %v, want %v", got, st.StockmayerVariance)
		}
		for _, k := range []string{"functionalCounts", "nonFunctional", "expectedNonFunctional"} {
			if !r.Get(k).IsUndefined() {
				t.Errorf("%s = %s without a functional monomer, want it absent", k, stringify(r.Get(k)))
			}
		}
	})

	t.Run("terminal, fixed length, functional, bins", func(t *testing.T) {
		r := call(api, "chains", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.2, "functional": 2, "count": 500, "length": 40, "seed": 7, "bins": 12})
		wantNoError(t, r)
		st := simulate(t, copoly.ChainOptions{Model: term, F10: 0.2, Functional: 2, Count: 500, Length: 40, Seed: 7})
		sameStats(t, r, st, 12)
		counts := intsOf(t, r.Get("functionalCounts"))
		sum := 0
		for i, n := range counts {
			sum += n
			if n != st.FunctionalCounts[i] {
				t.Errorf("functionalCounts[%d] = %d, want %d", i, n, st.FunctionalCounts[i])
			}
		}
		if sum != 500 {
			t.Errorf("Σ functionalCounts = %d, want every chain (500)", sum)
		}
		if got := r.Get("nonFunctional").Float(); got != float64(counts[0])/500 {
			t.Errorf("nonFunctional = %v, want functionalCounts[0]/count = %v", got, float64(counts[0])/500)
		}
		if got := r.Get("expectedNonFunctional").Float(); got != st.ExpectedNonFunctional {
			t.Errorf("expectedNonFunctional = %v, want %v", got, st.ExpectedNonFunctional)
		}
		for _, n := range intsOf(t, r.Get("lengths")) {
			if n != 40 {
				t.Fatalf("a chain of %d units, want the fixed 40", n)
			}
		}
		// A fixed length without dpn: no Stockmayer distribution (it is for a most-probable one).
		if !r.Get("stockmayer").IsNull() {
			t.Errorf("stockmayer = %s without a dpn, want null", stringify(r.Get("stockmayer")))
		}
	})

	t.Run("terminal with drift", func(t *testing.T) {
		r := call(api, "chains", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "dpn": 30, "conversion": 0.9, "count": 300})
		wantNoError(t, r)
		sameStats(t, r, simulate(t, copoly.ChainOptions{Model: term, F10: 0.5, DPn: 30, Conversion: 0.9, Count: 300}), 30)
		for _, k := range []string{"stockmayer", "stockmayerVariance"} {
			if !r.Get(k).IsNull() {
				t.Errorf("%s = %s with drift, want null", k, stringify(r.Get(k)))
			}
		}
	})

	t.Run("penultimate", func(t *testing.T) {
		r := call(api, "chains", args(penArg, map[string]any{"f10": 0.4, "dpn": 80, "functional": 1, "count": 200}))
		wantNoError(t, r)
		sameStats(t, r, simulate(t, copoly.ChainOptions{Model: pen, F10: 0.4, DPn: 80, Functional: 1, Count: 200}), 30)
		for _, k := range []string{"stockmayer", "stockmayerVariance", "expectedNonFunctional"} {
			if !r.Get(k).IsNull() {
				t.Errorf("%s = %s for the penultimate model, want null", k, stringify(r.Get(k)))
			}
		}
	})

	t.Run("model terminal alone selects the simulation", func(t *testing.T) {
		r := call(api, "chains", args(termArg, map[string]any{"f10": 0.5}))
		wantNoError(t, r)
		sameStats(t, r, simulate(t, copoly.ChainOptions{Model: term, F10: 0.5}), 30)
	})

	t.Run("sample chains unchanged without options", func(t *testing.T) {
		// Even with bins, which only a simulation uses: the result is {samples} alone.
		r := call(api, "chains", map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "bins": 10})
		wantNoError(t, r)
		if keys := js.Global().Get("Object").Call("keys", r); keys.Length() != 1 || keys.Index(0).String() != "samples" {
			t.Errorf("keys = %s, want [\"samples\"]", stringify(keys))
		}
	})
}

func TestChainsSimulationErrors(t *testing.T) {
	api, _ := testAPI(t)
	base := map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "dpn": 50}
	for _, c := range []struct {
		name        string
		arg         map[string]any
		field, text string
	}{
		{"count above the simulation limit", args(base, map[string]any{"count": 100001}), "count", "between 1 and 100000"},
		{"too many units", args(base, map[string]any{"dpn": nil, "functional": 1, "count": 100000, "length": 1000}), "count", "20000000 units"},
		{"too many units by dpn", args(base, map[string]any{"count": 100000, "dpn": 1000}), "count", "20000000 units"},
		{"dpn zero", args(base, map[string]any{"dpn": 0}), "dpn", "at least 1"},
		{"dpn below one", args(base, map[string]any{"dpn": 0.5}), "dpn", "between 1 and 100000"},
		{"dpn text", args(base, map[string]any{"dpn": "50"}), "dpn", "must be a number"},
		{"dpn NaN", args(base, map[string]any{"dpn": math.NaN()}), "dpn", "finite"},
		{"functional three", args(base, map[string]any{"functional": 3}), "functional", "between 1 and 2"},
		{"functional zero", args(base, map[string]any{"functional": 0}), "functional", "between 1 and 2"},
		{"functional fractional", args(base, map[string]any{"functional": 1.5}), "functional", "whole number"},
		{"conversion above one", args(base, map[string]any{"conversion": 1.5}), "conversion", "between 0 and 1"},
		{"conversion past the end", map[string]any{"r1": 0.5, "r2": 0, "f10": 0.3, "conversion": 0.99}, "conversion", "stops"},
		{"bins zero", args(base, map[string]any{"bins": 0}), "bins", "between 1 and 200"},
		{"bins too many", args(base, map[string]any{"bins": 201}), "bins", "between 1 and 200"},
		{"length too long", args(base, map[string]any{"dpn": nil, "conversion": 0, "length": 10001}), "length", "between 1 and 10000"},
		{"seed fractional", args(base, map[string]any{"seed": 1.5}), "seed", "whole number"},
		{"f10 above one", args(base, map[string]any{"f10": 1.1}), "f10", "between 0 and 1"},
		{"penultimate r12 missing", map[string]any{"model": "penultimate", "r11": 1, "r21": 1, "r22": 1, "f10": 0.5}, "r12", "missing"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "chains", c.arg), c.field, c.text)
		})
	}
	wantNoError(t, call(api, "chains", base))
}

func TestNonFiniteLists(t *testing.T) {
	inf, one := math.Inf(1), 1.0
	for _, c := range []struct {
		name string
		v    any
		want string
	}{
		{"finite", chainStatsOut{Compositions: []float64{0.5, 1}, Lengths: []int{2, 3}}, ""},
		{"NaN in a list of numbers", chainStatsOut{Compositions: []float64{0.5, 1, math.NaN()}}, "compositions[2]"},
		{"Inf in the histogram", chainStatsOut{Histogram: chainHistogramOut{Weights: []float64{0, inf}}}, "histogram.weights[1]"},
		{"null standard error", modelFitOut{SE: []*float64{&one, nil}}, ""},
		{"infinite standard error", modelFitOut{SE: []*float64{&one, &inf}}, "se[1]"},
		{"in a list of rows", predictedOut{Penultimate: []triadRowOut{{}, {A212: math.NaN()}}}, "penultimate[1].A212"},
	} {
		if got := nonFinite(c.v); got != c.want {
			t.Errorf("%s: nonFinite() = %q, want %q", c.name, got, c.want)
		}
	}
}
