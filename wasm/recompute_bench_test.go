//go:build js && wasm

package main

import (
	"syscall/js"
	"testing"

	"copoly/copoly"
)

// BenchmarkRecompute times, under Node, every call the page makes after one edit of a project
// with 20 bench runs, through the exported copoly object (argument conversion, copoly, result
// conversion): the fit by every method with its 95 % JCR, the next runs, the composition curve
// (101 feeds), the drift to X = 0.95 (101 conversions, with conversion limit and composition
// distribution), the sequence statistics over the batch, 12 sample chains, a 200-step semi-batch
// plan with its 500-sample band over the JCR, and 10⁴ simulated chains of DPn 100. Drawing is
// the page's own work and is not included. copoly/BenchmarkRecompute is the same work without
// the bridge, natively and in js/wasm. Run with
//
//	GOOS=js GOARCH=wasm go test -exec="$(go env GOROOT)/lib/wasm/go_js_wasm_exec" -run '^$' -bench Recompute ./wasm/
func BenchmarkRecompute(b *testing.B) {
	api, _ := testAPI(&testing.T{})
	// 20 runs: 5 feeds × 4 conversions of the terminal model r1 = 0.52, r2 = 0.46 with a
	// deterministic ±0.005 offset on F1.
	m := copoly.Terminal{R1: 0.52, R2: 0.46}
	var runs []any
	for i, f := range []float64{0.1, 0.3, 0.5, 0.7, 0.9} {
		for j, x := range []float64{0.05, 0.1, 0.2, 0.3} {
			off := 0.005
			if (i+j)%2 == 1 {
				off = -off
			}
			runs = append(runs, map[string]any{"f10": f, "conversion": x, "F1": m.Cumulative(f, x) + off})
		}
	}
	feeds, xs := make([]any, 101), make([]any, 101)
	for i := range feeds {
		feeds[i] = float64(i) / 100
		xs[i] = 0.95 * float64(i) / 100
	}
	check := func(b *testing.B, r js.Value, method string) js.Value {
		if e := r.Get("error"); !e.IsUndefined() {
			b.Fatalf("%s: %s", method, e.String())
		}
		return r
	}
	b.Run("edit-20-runs", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			fit := check(b, call(api, "fit", map[string]any{"runs": runs, "level": 0.95}), "fit")
			nl := fit.Get("methods").Get("nonlinear")
			r1, r2, jcr := nl.Get("r1").Float(), nl.Get("r2").Float(), nl.Get("jcr")
			ratios := func(more map[string]any) map[string]any {
				more["r1"], more["r2"] = r1, r2
				return more
			}
			check(b, call(api, "nextRuns", ratios(map[string]any{"runs": runs})), "nextRuns")
			check(b, call(api, "composition", ratios(map[string]any{"f1": feeds})), "composition")
			check(b, call(api, "drift", ratios(map[string]any{"f10": 0.3, "conversion": xs, "tolerance": 0.02,
				"molarMass1": 100.12, "molarMass2": 86.09})), "drift")
			check(b, call(api, "sequence", ratios(map[string]any{"f1": 0.3, "conversion": 0.95, "maxLength": 12})), "sequence")
			check(b, call(api, "chains", ratios(map[string]any{"f10": 0.3, "count": 12, "length": 60, "seed": 1})), "chains")
			check(b, call(api, "plan", ratios(map[string]any{"targetF1": 0.5, "molarMass1": 100.12, "molarMass2": 86.09,
				"polymerMass": 1000, "mode": "semibatch", "rateConstant": 0.01, "jcr": jcr})), "plan")
			sinkJS = check(b, call(api, "chains", ratios(map[string]any{"f10": 0.3, "dpn": 100, "count": 10000, "seed": 1})), "chains")
		}
	})
}
