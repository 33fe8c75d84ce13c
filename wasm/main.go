//go:build js && wasm

// Command wasm is the WebAssembly module of copoly: a thin bridge that exposes the copoly
// package to JavaScript. Build it with
//
//	GOOS=js GOARCH=wasm go build -o dist/copoly.wasm ./wasm
//
// and load it with the wasm_exec.js of the same Go toolchain ($(go env GOROOT)/lib/wasm/).
//
// # JavaScript surface
//
// The module defines one global object, copoly, and then waits for calls. Its methods and types
// are declared in site/copoly.d.ts, the contract between this module, the page and lab
// scripts:
//
//	copoly.version                  string
//	copoly.composition({...model, f1: number[]})
//	copoly.feedFor({r1, r2, targetF1})
//	copoly.drift({...model, f10, conversion: number[], basis?, molarMass1?, molarMass2?, tolerance?, bins?})
//	copoly.sequence({...model, f1, conversion?, maxLength?})
//	copoly.chains({...model, f10, count?, length?, seed?, dpn?, conversion?, functional?, bins?})
//	copoly.discriminate({runs: TriadRow[]})
//	copoly.averages({bins? | slices?, F1?, molarMass1?, molarMass2?})
//	copoly.library()
//	copoly.demoProject()
//	copoly.exampleProject({name})
//	copoly.checkProject({project})
//	copoly.exportProject({project})  → {json, filename}
//	copoly.importProject({json})
//	copoly.benchRuns({bench, molarMass1?, molarMass2?})
//	copoly.pasteBench({bench, text}) → {bench}
//	copoly.fit({runs, level?})
//	copoly.nextRuns({r1, r2, runs?, conversions?})
//	copoly.plan({r1, r2, targetF1, molarMass1, molarMass2, polymerMass, mode, monomer1?, monomer2?,
//	             tolerance?, stopConversion?, finalConversion?, feed?, feedF1?, shots?, steps?,
//	             rateConstant?, halfLife?, timeTable?, heat1?, heat2?, batchMass?, heatCapacity?,
//	             riseLimit?, jcr?, samples?, seed?})
//	copoly.starvedFeed({r1, r2, targetF1, feedRate, rateConstant, molarMass1, molarMass2})
//	copoly.qe({monomer1, monomer2})
//	copoly.limits()                 every limit of the inputs, by name (project.Limits)
//	copoly.parseNumber({text, field?}) → {value}
//	copoly.loadProject({tab?, draft?})          → Promise
//	copoly.saveProject({project, basedOn?})     → Promise
//	copoly.saveDraft({tab, fields, basedOn?})   → Promise
//	copoly.dropDraft({tab})                     → Promise
//	copoly.keptCopy({name})                     → Promise
//	copoly.dropKept({name})                     → Promise
//
// where ...model is {r1, r2} (the terminal model, also with model: "terminal"),
// {model: "penultimate", r11, r21, r22, r12} or {model: "implicit", r1, r2, s1, s2}. Some
// results are worked out for the terminal model only and are null or absent for the others: the
// azeotrope and classification of composition, the runLengths and batch of sequence, and
// Stockmayer's distribution of chains (the limit and distribution of drift are any model's).
//
// Every method takes one plain object (optional for library, demoProject, limits and
// loadProject) and returns one plain object. Bad input never throws: the result is then
// {error, field, code, reason, value?, row?} (copoly.PartsOf), where field names the input at
// fault ("r1", "f1[3]", "runs[2].F1", "bench.rows[3].cells.f10", "timeTable[2]", "jcr[5][0]",
// "project.monomer1.molarMass", "project.plan.mode", "arguments") and code says what is wrong
// in a word (copoly.Codes). A Go panic inside a method is recovered and reported the same way
// with an "internal error" message and the code "internal", so the module keeps answering. The
// storage methods return Promises that always resolve, never reject.
//
// # Storage
//
// Projects are kept in the IndexedDB database "copoly" through hackpadfs (see project.Store
// for the files, the two-copy rule, revisions, kept copies and drafts). The database is opened
// on the first storage call, on a goroutine, never at start-up: a page without IndexedDB (Node,
// some private modes) loads at full speed and gets storage "unavailable".
//
// # Files
//
// main.go registers the object; export.go holds the wrapper (argument check, recover, error
// object, Promise); decode.go the reading of arguments into DTOs; dto.go the JS-facing types;
// jsontext.go the crossing of projects and bench grids as JSON text (read by project.Parse and
// project.ParseBench, the one schema of the project file, and written by project.Marshal);
// api.go the methods; storage.go the IndexedDB wiring. The science is all in copoly and its
// packages.
package main

import "syscall/js"

// version is the copoly version reported to JavaScript; a release build may set it with
// -ldflags "-X main.version=…".
var version = "0.1.0"

func main() {
	js.Global().Set("copoly", newAPI(newStorage()))
	select {}
}
