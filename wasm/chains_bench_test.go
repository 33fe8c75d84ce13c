//go:build js && wasm

package main

import (
	"testing"

	"copoly/copoly"
)

// sinkJS keeps the benchmarked results alive.
var sinkJS any

// BenchmarkChains times a simulation of 10 000 chains of DPn 100 (about 10⁶ units) under Node:
// the whole export (reading the argument, copoly.SimulateChains, the histogram, Stockmayer's
// distribution and the conversion of 10 000 compositions and lengths to JavaScript), and
// copoly alone for comparison. Run with
//
//	GOOS=js GOARCH=wasm go test -exec="$(go env GOROOT)/lib/wasm/go_js_wasm_exec" -run '^$' -bench Chains ./wasm/
func BenchmarkChains(b *testing.B) {
	api, _ := testAPI(&testing.T{})
	arg := map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "dpn": 100, "count": 10000}
	b.Run("export", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			r := call(api, "chains", arg)
			if !r.Get("error").IsUndefined() {
				b.Fatal(r.Get("error").String())
			}
			sinkJS = r
		}
	})
	b.Run("copoly", func(b *testing.B) {
		b.ReportAllocs()
		opt := copoly.ChainOptions{Model: copoly.Terminal{R1: 0.8, R2: 0.15}, F10: 0.5, DPn: 100, Count: 10000, Seed: 1, Samples: 12}
		for b.Loop() {
			st, err := copoly.SimulateChains(opt)
			if err != nil {
				b.Fatal(err)
			}
			sinkJS = st
		}
	})
}
