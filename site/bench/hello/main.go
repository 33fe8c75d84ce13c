//go:build js && wasm

// Command hello is the smallest Go WebAssembly module that behaves like copoly's at start-up:
// it records when its main function began, registers one function, and stays alive, as copoly's
// module does. make bench builds it, wraps it in the very same page as copoly (go run
// ./site/build) and compares the two pages' load times (site/bench/loadtime).
//
// The start time is performance.now(), milliseconds since the navigation began, stored in
// window.copolyHelloReadyAt: the ready signal of this page. It never defines window.copoly.
package main

import "syscall/js"

func main() {
	g := js.Global()
	g.Set("copolyHelloReadyAt", g.Get("performance").Call("now"))
	// A registered function keeps the module alive, as copoly's exports do; without one the Go
	// runtime reports a deadlock when main blocks.
	g.Set("copolyHello", js.FuncOf(func(js.Value, []js.Value) any { return "hello" }))
	select {}
}
