//go:build !js

// Package contract holds one test: that the JavaScript API's types in site/copoly.d.ts and the
// bridge's data transfer objects in wasm/ (the js:"…" tags of its structs) name the same fields,
// so that neither can drift from the other. The wasm/ files are built for js/wasm only; this test
// reads them as source with go/parser and runs natively, in make test-native.
package contract
