//go:build js && wasm

package main

// The bad-input sweep. Every method of the copoly object is called with a table of bad inputs
// (wrong JS types, null and absent values, NaN and infinities, values out of range, huge arrays
// and counts, texts of ten million characters, deep and cyclic junk, arguments that are not an
// object) and must answer each with a plain {error, field, code, reason, value?, row?} object whose field is the input as
// the caller wrote it and whose message names that field and the bad value, without throwing.
// After the sweep the module must still answer a valid call correctly, and the Go heap must
// hold no more than before, give or take a generous margin. Nothing here is timed.

import (
	"fmt"
	"os"
	"reflect"
	"regexp"
	"runtime"
	"strings"
	"syscall/js"
	"testing"
	"time"

	"gonum.org/v1/gonum/floats/scalar"
)

// badValue is one bad value for a field: a JS expression evaluated afresh for each call
// ("<delete>" removes the key). The error must name the field's path followed by sub ("[1]",
// ".f10"; "" for the field itself), or field when it is set, and its message must contain
// text, which names the value (or the size of a value too large). in, when set, is where the
// error object is found in a result that is not itself an error (benchRuns reports a bad cell
// in its errors list).
type badValue struct {
	expr  string
	sub   string
	text  string
	field string
	in    string
}

// valueKind is the JS type a field takes; each kind has its own bad values (kindValues).
type valueKind int

const (
	kNumber  valueKind = iota // a number
	kCount                    // a whole number with a range ending below 10⁹
	kText                     // a text
	kBool                     // true or false
	kObject                   // an object
	kNumbers                  // a list of numbers
	kObjects                  // a list of objects
	kTexts                    // a list of texts
	kCells                    // an object whose values are texts
	kPairs                    // a list of pairs of numbers
)

// kindValues are the bad values of each kind, for any field of it.
var kindValues = map[valueKind][]badValue{
	kNumber: {
		{expr: `"0.5"`, text: `the text "0.5"`},
		{expr: `true`, text: "true"},
		{expr: `({})`, text: "an object"},
		{expr: `[0.5]`, text: "a list"},
		{expr: `1n`, text: "unsupported kind"},
		{expr: `Symbol("s")`, text: "a symbol"},
		{expr: `() => 0.5`, text: "a function"},
		{expr: `NaN`, text: "NaN"},
		{expr: `Infinity`, text: "+Inf"},
		{expr: `-Infinity`, text: "-Inf"},
	},
	kText: {
		{expr: `42`, text: "the number 42"},
		{expr: `false`, text: "false"},
		{expr: `({})`, text: "an object"},
		{expr: `["a"]`, text: "a list"},
		{expr: `"x".repeat(1e7)`, text: "10000000 characters"},
	},
	kBool: {
		{expr: `"yes"`, text: `the text "yes"`},
		{expr: `1`, text: "the number 1"},
		{expr: `({})`, text: "an object"},
	},
	kObject: {
		{expr: `5`, text: "the number 5"},
		{expr: `"x".repeat(1e7)`, text: `the text "xxxxx`},
		{expr: `[]`, text: "a list"},
		{expr: `true`, text: "true"},
	},
	kNumbers: {
		{expr: `"0.5"`, text: `the text "0.5"`},
		{expr: `5`, text: "the number 5"},
		{expr: `({length: 1e9})`, text: "an object"},
		{expr: `new DataView(new ArrayBuffer(8))`, text: "an object"},
		{expr: `[0.5, "a"]`, sub: "[1]", text: `the text "a"`},
		{expr: `[0.5, null]`, sub: "[1]", text: "null"},
		{expr: `new Array(3)`, sub: "[0]", text: "undefined"},
		{expr: `[[0.5]]`, sub: "[0]", text: "a list"},
		{expr: `[NaN]`, sub: "[0]", text: "NaN"},
		{expr: `[Infinity]`, sub: "[0]", text: "+Inf"},
		{expr: `new Float64Array(1e6)`, text: "1e+06"},
		{expr: `new Array(1e6).fill(0.5)`, text: "1e+06"},
		{expr: `new Array(2**32 - 1)`, text: "4.294967295e+09"},
	},
	kObjects: {
		{expr: `"x"`, text: `the text "x"`},
		{expr: `5`, text: "the number 5"},
		{expr: `({})`, text: "an object"},
		{expr: `[5]`, sub: "[0]", text: "the number 5"},
		{expr: `[null]`, sub: "[0]", text: "null"},
		{expr: `[[]]`, sub: "[0]", text: "a list"},
		{expr: `new Array(1e6).fill({})`, text: "1e+06"},
	},
	kTexts: {
		{expr: `"toxic"`, text: `the text "toxic"`},
		{expr: `[5]`, sub: "[0]", text: "the number 5"},
		{expr: `["x".repeat(1e7)]`, sub: "[0]", text: "10000000 characters"},
		{expr: `new Array(1e6).fill("a")`, text: "1e+06"},
	},
	kCells: {
		{expr: `5`, text: "the number 5"},
		{expr: `"x"`, text: `the text "x"`},
		{expr: `[]`, text: "a list"},
		{expr: `({f10: 5})`, sub: ".f10", text: "the number 5"},
		{expr: `({f10: null})`, sub: ".f10", text: "null"},
		{expr: `({f10: "x".repeat(1e7)})`, sub: ".f10", text: "10000000 characters"},
		{expr: `({["k".repeat(1e6)]: "1"})`, text: "1000000 characters"},
		{expr: `Object.fromEntries(Array.from({length: 1e5}, (_, i) => ["k" + i, "1"]))`, text: "100000"},
	},
	kPairs: {
		{expr: `"x"`, text: `the text "x"`},
		{expr: `5`, text: "the number 5"},
		{expr: `[5]`, sub: "[0]", text: "pair"},
		{expr: `[[1]]`, sub: "[0]", text: "pair"},
		{expr: `[[1, 2, 3]]`, sub: "[0]", text: "pair"},
		{expr: `[["a", 1]]`, sub: "[0][0]", text: `the text "a"`},
		{expr: `new Array(1e6).fill([0.5, 0.5])`, text: "1e+06"},
	},
}

// kCount takes the values of kNumber and these.
var countValues = []badValue{
	{expr: `2.5`, text: "2.5"},
	{expr: `-1`, text: "-1"},
	{expr: `1e9`, text: "1e+09"},
}

// Bad values of a value's range, shared by many fields.
var (
	badRatio     = []badValue{{expr: `-1`, text: "-1"}, {expr: `1e300`, text: "1e+300"}}
	badFraction  = []badValue{{expr: `-0.1`, text: "-0.1"}, {expr: `1.5`, text: "1.5"}}
	badFractions = []badValue{{expr: `[0.5, -0.1]`, sub: "[1]", text: "-0.1"}, {expr: `[1.5]`, sub: "[0]", text: "1.5"}}
	badMolarMass = []badValue{{expr: `-1`, text: "-1"}, {expr: `0`, text: "0"}, {expr: `1e7`, text: "1e+07"}}
	badNegative  = []badValue{{expr: `-1`, text: "-1"}}
)

func join(lists ...[]badValue) []badValue {
	var out []badValue
	for _, l := range lists {
		out = append(out, l...)
	}
	return out
}

// sweepField is one field of a method's argument, by its path as a caller writes it ("r1",
// "runs[0].F1", "project.monomer1.molarMass").
type sweepField struct {
	path     string
	kind     valueKind
	optional bool       // null or absent is allowed: the answer may be a result or an error naming the field
	absent   string     // the field an error names when this optional field is absent, if not itself
	extra    []badValue // bad values of this field's range, besides those of its kind
}

// sweepBase is a valid argument of a method and the fields the sweep changes in it.
type sweepBase struct {
	name   string
	arg    string // a JS expression; "project" in it is the base project (sweepProject)
	fields []sweepField
}

// sweepMethod is one method of the copoly object.
type sweepMethod struct {
	name     string
	async    bool
	optional bool   // the argument may be left out
	first    string // the field an empty argument is refused for
	bases    []sweepBase
}

// projectFields are the fields of a Project, under prefix ("project.").
func projectFields(prefix string) []sweepField {
	f := func(path string, kind valueKind, optional bool, extra ...badValue) sweepField {
		return sweepField{path: strings.TrimSuffix(prefix+path, "."), kind: kind, optional: optional, extra: extra}
	}
	return []sweepField{
		f("", kObject, false),
		f("format", kText, false, badValue{expr: `"other-format"`, text: `"other-format"`}),
		f("version", kNumber, false, badValue{expr: `2`, text: "newer"}, badValue{expr: `1.5`, text: "1.5"}, badValue{expr: `0`, text: "0"}),
		f("name", kText, true),
		f("monomer1", kObject, false),
		f("monomer1.name", kText, true),
		f("monomer1.molarMass", kNumber, true, badValue{expr: `-1`, text: "-1"}, badValue{expr: `1e7`, text: "1e+07"}),
		f("r1", kNumber, false, badRatio...),
		f("r2", kNumber, false, badRatio...),
		f("ratioSource", kText, true),
		f("f10", kNumber, false, join(badFraction, []badValue{{expr: `0`, text: "= 0"}, {expr: `1`, text: "= 1"}})...),
		f("conversion", kNumber, false, badValue{expr: `0`, text: "= 0"}, badValue{expr: `1.5`, text: "1.5"}, badValue{expr: `-0.1`, text: "-0.1"}),
		f("tolerance", kNumber, false, badValue{expr: `0`, text: "= 0"}, badValue{expr: `0.6`, text: "0.6"}, badValue{expr: `-0.1`, text: "-0.1"}),
		f("notes", kText, true, badValue{expr: `"x".repeat(100001)`, text: "100001"}),
		f("invented", kBool, true),
		f("citation", kText, true, badValue{expr: `"x".repeat(1001)`, text: "1001"}),
		f("savedAt", kText, true, badValue{expr: `"yesterday"`, text: `"yesterday"`}, badValue{expr: `"2026-01-02T03:04:05." + "1".repeat(50) + "Z"`, text: "71 characters"}),
		f("bench", kObject, true),
		f("bench.rows", kObjects, false, badValue{expr: `Array.from({length: 1001}, () => ({cells: {}}))`, text: "1001"}),
		f("bench.rows[0].label", kText, true, badValue{expr: `"x".repeat(201)`, text: "201"}),
		f("bench.rows[0].cells", kCells, true, badValue{expr: `({bogus: "1"})`, text: `"bogus"`}),
		f("bench.rows[0].cells.F1", kText, true, badValue{expr: `"9".repeat(201)`, text: "201"}),
		f("bench.feedKind", kText, true, badValue{expr: `"litres"`, text: `"litres"`}),
		f("bench.carrier", kNumber, true, badValue{expr: `2.5`, text: "2.5"}, badValue{expr: `3`, text: "3"}, badValue{expr: `-1`, text: "-1"}, badValue{expr: `1e300`, text: "1e+300"}),
		f("bench.elementCount", kNumber, true, badNegative...),
		f("bench.element", kText, true),
		f("level", kNumber, true, badValue{expr: `1.5`, text: "1.5"}, badValue{expr: `-0.5`, text: "-0.5"}),
		f("jcr", kPairs, true, badValue{expr: `[[NaN, 1]]`, sub: "[0][0]", text: "NaN"}, badValue{expr: `[[-1, 1]]`, sub: "[0][0]", text: "-1"},
			badValue{expr: `new Array(4097).fill([1, 1])`, text: "4097"}),
		f("model", kObject, true),
		f("model.kind", kText, false, badValue{expr: `"quadratic"`, text: `"quadratic"`}),
		f("model.r11", kNumber, true, badNegative...),
		f("triads", kObjects, true),
		f("triads[0].f10", kNumber, false, badFraction...),
		f("triads[0].F1", kNumber, true, badValue{expr: `1.5`, text: "1.5"}, badValue{expr: `-0.5`, text: "-0.5"}),
		f("sizeBins", kObjects, true),
		f("sizeBins[0].low", kNumber, false, badNegative...),
		f("sizeBins[0].weightFraction", kNumber, true, badValue{expr: `-0.5`, text: "-0.5"}),
		f("plan", kObject, true),
		f("plan.mode", kText, true, badValue{expr: `"continuous"`, text: `"continuous"`}),
		f("plan.targetF1", kNumber, true, badNegative...),
		f("plan.shots", kNumber, true, badValue{expr: `2.5`, text: "2.5"}, badValue{expr: `-1`, text: "-1"}, badValue{expr: `1e12`, text: "1e+12"}),
		f("plan.timeTable", kPairs, true, badValue{expr: `[[10, 0.1], [5, 0.2]]`, sub: "[1]", text: "5"}),
		f("plan.heat1", kNumber, true, badValue{expr: `-1`, text: "-1"}, badValue{expr: `1001`, text: "1001"}),
		f("userMonomers", kObjects, true, badValue{expr: `Array.from({length: 101}, (_, i) => ({name: "m" + i}))`, text: "101"}),
		f("userMonomers[0].name", kText, false, badValue{expr: `""`, text: "empty"}),
		f("userMonomers[0].density", kNumber, true, badValue{expr: `-1`, text: "-1"}, badValue{expr: `26`, text: "26"}),
		f("userMonomers[0].state", kText, true, badValue{expr: `"plasma"`, text: `"plasma"`}),
		f("userMonomers[0].hazards", kTexts, true),
	}
}

// benchFields are the fields of a BenchTable named bench.
func benchFields() []sweepField {
	return []sweepField{
		{path: "bench", kind: kObject},
		{path: "bench.rows", kind: kObjects, extra: []badValue{{expr: `Array.from({length: 1001}, () => ({cells: {}}))`, text: "1001"}}},
		{path: "bench.rows[0].label", kind: kText, optional: true},
		{path: "bench.rows[0].cells", kind: kCells, optional: true},
		{path: "bench.feedKind", kind: kText, optional: true, extra: []badValue{{expr: `"litres"`, text: `"litres"`}}},
		{path: "bench.carrier", kind: kNumber, optional: true, extra: []badValue{{expr: `2.5`, text: "2.5"}, {expr: `3`, text: "3"}, {expr: `-1`, text: "-1"}}},
		{path: "bench.elementCount", kind: kNumber, optional: true, extra: badNegative},
		{path: "bench.element", kind: kText, optional: true},
	}
}

// modelFields are the fields of the terminal model.
var modelFields = []sweepField{
	{path: "r1", kind: kNumber, extra: badRatio},
	{path: "r2", kind: kNumber, extra: badRatio},
	{path: "model", kind: kText, optional: true, extra: []badValue{{expr: `"quadratic"`, text: `"quadratic"`}}},
}

// otherModels are the bases of a method that takes any model for the penultimate and the
// implicit model, whose own ratios are swept; rest holds the method's other fields.
func otherModels(rest string) []sweepBase {
	return []sweepBase{
		{name: "penultimate", arg: `{model: "penultimate", r11: 0.9, r21: 0.6, r22: 0.2, r12: 0.1, ` + rest + `}`, fields: []sweepField{
			{path: "r11", kind: kNumber, extra: badRatio}, {path: "r21", kind: kNumber, extra: badRatio},
			{path: "r22", kind: kNumber, extra: badRatio}, {path: "r12", kind: kNumber, extra: badRatio},
		}},
		{name: "implicit", arg: `{model: "implicit", r1: 0.8, r2: 0.15, s1: 0.5, s2: 2, ` + rest + `}`, fields: []sweepField{
			{path: "r1", kind: kNumber, extra: badRatio}, {path: "s1", kind: kNumber, extra: badRatio}, {path: "s2", kind: kNumber, extra: badRatio},
		}},
	}
}

// sweepMethods are the 28 methods of site/copoly.d.ts with valid arguments and their fields.
// The fit and triad arguments are made by fitRuns and triadSet (results_test.go); "project" is the demo project with every optional part filled in.
func sweepMethods(fitRunsJSON, triadsJSON string) []sweepMethod {
	projectArg := `{project: project}`
	return []sweepMethod{
		{name: "composition", first: "r1", bases: append([]sweepBase{{name: "terminal", arg: `{r1: 0.8, r2: 0.15, f1: [0.1, 0.5, 0.9]}`,
			fields: append([]sweepField{{path: "f1", kind: kNumbers, extra: badFractions}}, modelFields...)}},
			otherModels(`f1: [0.5]`)...)},
		{name: "feedFor", first: "r1", bases: []sweepBase{{arg: `{r1: 0.8, r2: 0.15, targetF1: 0.55}`, fields: []sweepField{
			{path: "r1", kind: kNumber, extra: badRatio}, {path: "r2", kind: kNumber, extra: badRatio},
			{path: "targetF1", kind: kNumber, extra: badFraction},
		}}}},
		{name: "drift", first: "r1", bases: append([]sweepBase{{name: "terminal",
			arg: `{r1: 0.8, r2: 0.15, f10: 0.5, conversion: [0, 0.3, 0.6], basis: "molar", molarMass1: 104.15, molarMass2: 128.17, tolerance: 0.02, bins: 20}`,
			fields: append([]sweepField{
				{path: "f10", kind: kNumber, extra: badFraction},
				{path: "conversion", kind: kNumbers, extra: append(badFractions, badValue{expr: `[0.6, 0.3]`, sub: "[1]", text: "0.3"}, badValue{expr: `[]`, text: "at least one"})},
				{path: "basis", kind: kText, optional: true, extra: []badValue{{expr: `"volume"`, text: `"volume"`}}},
				{path: "molarMass1", kind: kNumber, optional: true, extra: badMolarMass},
				{path: "molarMass2", kind: kNumber, optional: true, extra: badMolarMass},
				{path: "tolerance", kind: kNumber, optional: true, extra: []badValue{{expr: `-0.1`, text: "-0.1"}, {expr: `0.9`, text: "0.9"}}},
				{path: "bins", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `201`, text: "201"}}},
			}, modelFields...)},
			{name: "by mass", arg: `{r1: 0.8, r2: 0.15, f10: 0.5, conversion: [0, 0.1, 0.2], basis: "mass", molarMass1: 104.15, molarMass2: 128.17}`,
				fields: []sweepField{{path: "conversion", kind: kNumbers, extra: []badValue{
					{expr: `[0.1, 1.5]`, sub: "[1]", text: "1.5"},
					{expr: `new Array(1001).fill(0.1)`, text: "1001"},
				}}}},
		},
			otherModels(`f10: 0.5, conversion: [0, 0.5]`)...)},
		{name: "sequence", first: "r1", bases: append([]sweepBase{{name: "terminal", arg: `{r1: 0.8, r2: 0.15, f1: 0.5, conversion: 0.5, maxLength: 20}`,
			fields: append([]sweepField{
				{path: "f1", kind: kNumber, extra: badFraction},
				{path: "conversion", kind: kNumber, optional: true, extra: badFraction},
				{path: "maxLength", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `1001`, text: "1001"}}},
			}, modelFields...)}},
			otherModels(`f1: 0.5, conversion: 0.5`)...)},
		{name: "chains", first: "r1", bases: append([]sweepBase{
			{name: "samples", arg: `{r1: 0.8, r2: 0.15, f10: 0.5, count: 5, length: 20, seed: 3}`, fields: append([]sweepField{
				{path: "f10", kind: kNumber, extra: badFraction},
				{path: "count", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `1001`, text: "1001"}}},
				{path: "length", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `10001`, text: "10001"}}},
				{path: "seed", kind: kNumber, optional: true, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `2.5`, text: "2.5"}, {expr: `2**53`, text: "9.007199254740992e+15"}}},
			}, modelFields...)},
			{name: "simulation", arg: `{r1: 0.8, r2: 0.15, f10: 0.5, dpn: 30, conversion: 0.5, functional: 1, count: 50, length: 40, bins: 10, seed: 2}`, fields: []sweepField{
				{path: "dpn", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `-5`, text: "-5"}, {expr: `1e9`, text: "1e+09"}}},
				{path: "conversion", kind: kNumber, optional: true, extra: badFraction},
				{path: "functional", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `3`, text: "3"}}},
				{path: "bins", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `201`, text: "201"}}},
				{path: "count", kind: kCount, optional: true, extra: []badValue{{expr: `100001`, text: "100001"}}},
				{path: "length", kind: kCount, optional: true, extra: []badValue{{expr: `10001`, text: "10001"}}},
			}},
			{name: "simulation, too many units", arg: `{r1: 0.8, r2: 0.15, f10: 0.5, conversion: 0.5, count: 50, length: 1000}`, fields: []sweepField{
				{path: "count", kind: kCount, optional: true, extra: []badValue{{expr: `100000`, text: "below 20000000 units"}}},
			}},
		}, otherModels(`f10: 0.5, count: 20, length: 20`)...)},
		{name: "discriminate", first: "runs", bases: []sweepBase{{arg: `{runs: ` + triadsJSON + `}`, fields: []sweepField{
			{path: "runs", kind: kObjects, extra: []badValue{{expr: `new Array(1001).fill({f10: 0.5})`, text: "1001"}}},
			{path: "runs[0].f10", kind: kNumber, extra: badFraction},
			{path: "runs[0].F1", kind: kNumber, optional: true, extra: []badValue{{expr: `1.5`, text: "1.5"}, {expr: `-0.5`, text: "-0.5"}}},
			{path: "runs[0].A111", kind: kNumber, optional: true, extra: []badValue{{expr: `2`, text: "2"}}},
		}}}},
		{name: "averages", first: "bins", bases: []sweepBase{
			{name: "bins", arg: `{bins: [{low: 1e4, high: 2e4, weightFraction: 0.5}, {low: 2e4, high: 4e4, weightFraction: 0.5}], F1: 0.5, molarMass1: 104.15, molarMass2: 128.17}`,
				fields: []sweepField{
					{path: "bins", kind: kObjects, optional: true, extra: []badValue{{expr: `new Array(10001).fill({low: 1, high: 2})`, text: "10001"}}},
					{path: "bins[0].low", kind: kNumber, extra: badNegative},
					{path: "bins[0].high", kind: kNumber, extra: badNegative},
					{path: "bins[0].weightFraction", kind: kNumber, optional: true, extra: []badValue{{expr: `-0.5`, text: "-0.5"}}},
					{path: "F1", kind: kNumber, optional: true, extra: badFraction},
					{path: "molarMass1", kind: kNumber, optional: true, extra: badMolarMass},
				}},
			{name: "slices", arg: `{slices: [{mass: 1e4, signal: 1}, {mass: 2e4, signal: 2}, {mass: 4e4, signal: 1}]}`, fields: []sweepField{
				{path: "slices", kind: kObjects, optional: true, absent: "bins"}, // bins or slices
				{path: "slices[0].mass", kind: kNumber, extra: badNegative},
				{path: "slices[0].signal", kind: kNumber, extra: badNegative},
			}},
		}},
		{name: "library", optional: true},
		{name: "demoProject", optional: true},
		{name: "exampleProject", first: "name", bases: []sweepBase{{arg: `{name: "georgiev1995-isopropanol"}`, fields: []sweepField{
			{path: "name", kind: kText, extra: []badValue{{expr: `"georgiev1995"`, text: `"georgiev1995"`}}},
		}}}},
		{name: "checkProject", first: "project", bases: []sweepBase{{arg: projectArg, fields: projectFields("project.")}}},
		{name: "exportProject", first: "project", bases: []sweepBase{{arg: projectArg, fields: projectFields("project.")}}},
		{name: "importProject", first: "json", bases: []sweepBase{{arg: `{json: JSON.stringify(project)}`, fields: []sweepField{
			{path: "json", kind: kText, extra: []badValue{
				{expr: `"not json"`, field: "project", text: "not valid JSON"},
				{expr: `"[]"`, field: "project", text: "not an object"},
				{expr: `"{}"`, field: "project", text: `"format"`},
				{expr: `JSON.stringify({...project, r1: "a"})`, field: "project.r1", text: "a number"},
				{expr: `JSON.stringify({...project, f10: 2})`, field: "project.f10", text: "2"},
				{expr: `JSON.stringify({...project, version: 99})`, field: "project.version", text: "newer"},
				{expr: `"[".repeat(1e5)`, field: "project", text: "not valid JSON"},
				{expr: `'{"format": "copoly-project", "version": 1, "junk": ' + "[".repeat(1e5)`, field: "project", text: "not valid JSON"},
				{expr: `"x".repeat(2**20 + 1)`, text: "1048577"},
			}},
		}}}},
		{name: "benchRuns", first: "bench", bases: []sweepBase{{
			arg: `{bench: {feedKind: "fraction", conversionKind: "molar", compositionKind: "fraction", element: "", carrier: 0, elementCount: 0,
				rows: [{label: "S1", cells: {f10: "0.2", conversion: "0.05", F1: "0.3"}}, {label: "S2", cells: {f10: "0,5", conversion: "0,05", F1: "0,55"}}]},
				molarMass1: 104.15, molarMass2: 128.17}`,
			fields: append(benchFields(),
				sweepField{path: "molarMass1", kind: kNumber, optional: true, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `1e7`, text: "1e+07"}}}, // 0: not given
				sweepField{path: "bench.rows[0].cells.f10", kind: kText, optional: true, extra: []badValue{
					{expr: `"abc"`, in: "errors[0]", field: "runs[0].f10", text: `"abc"`},
					{expr: `"0,3,5"`, in: "errors[0]", field: "runs[0].f10", text: `"0,3,5"`},
					{expr: `"NaN"`, in: "errors[0]", field: "runs[0].f10", text: `"NaN"`},
					{expr: `"1e999"`, in: "errors[0]", field: "runs[0].f10", text: "too large"},
					{expr: `"-0,5"`, in: "errors[0]", field: "runs[0].f10", text: "-0.5"},
					{expr: `"150 %"`, in: "errors[0]", field: "runs[0].f10", text: "1.5"},
				}}),
		}}},
		{name: "pasteBench", first: "bench", bases: []sweepBase{{arg: `{bench: {rows: [{label: "S0", cells: {f10: "0.1", F1: "0.2"}}]}, text: "f10\tF1\n0,2\t0,3\n0,5\t0,55\n"}`,
			fields: append(benchFields(), sweepField{path: "text", kind: kText, extra: []badValue{
				{expr: `'"unclosed'`, field: "paste", text: "line 1"},
				{expr: `"sample"`, field: "paste", text: "only a header row"},
				{expr: `"foo\tbar\n1\t2"`, field: "paste", text: `"foo"`},
				{expr: `"0.5\t0.5\n".repeat(1001)`, field: "paste", text: "1001"},
				{expr: `"1\t".repeat(70) + "\n"`, field: "paste", text: "70 columns; the limit is 64"},
				{expr: `"x".repeat(2**20 + 1)`, text: "1048577"},
			}}),
		}}},
		{name: "fit", first: "runs", bases: []sweepBase{{arg: `{runs: ` + fitRunsJSON + `, level: 0.95, curves: true}`, fields: []sweepField{
			{path: "runs", kind: kObjects, extra: []badValue{{expr: `new Array(1001).fill({f10: 0.5, F1: 0.5})`, text: "1001"}}},
			{path: "runs[0].f10", kind: kNumber, extra: badFraction},
			{path: "runs[0].F1", kind: kNumber, extra: badFraction},
			{path: "runs[0].conversion", kind: kNumber, optional: true, extra: badFraction},
			{path: "runs[0].sF", kind: kNumber, optional: true, extra: badFraction},
			{path: "level", kind: kNumber, optional: true, extra: []badValue{{expr: `1.5`, text: "1.5"}, {expr: `-0.5`, text: "-0.5"}, {expr: `1`, text: "= 1"}}},
			{path: "curves", kind: kBool, optional: true},
		}}}},
		{name: "nextRuns", first: "r1", bases: []sweepBase{{arg: `{r1: 0.8, r2: 0.15, runs: ` + fitRunsJSON + `, conversions: [0.1, 0.3]}`, fields: []sweepField{
			{path: "r1", kind: kNumber, extra: badRatio},
			{path: "r2", kind: kNumber, extra: badRatio},
			{path: "runs", kind: kObjects, optional: true},
			{path: "runs[0].f10", kind: kNumber, extra: badFraction},
			{path: "conversions", kind: kNumbers, optional: true, extra: badFractions},
		}}}},
		{name: "plan", first: "r1", bases: []sweepBase{{
			arg: `{r1: 0.8, r2: 0.15, targetF1: 0.5, molarMass1: 104.15, molarMass2: 128.17, polymerMass: 1000, mode: "semibatch",
				monomer1: "styrene", monomer2: "n-butyl acrylate", tolerance: 0.02, stopConversion: 0.5, finalConversion: 0.95, feed: "mixture",
				feedF1: 0.5, shots: 4, steps: 40, rateConstant: 0.01, halfLife: 60, timeTable: [[0, 0], [100, 0.9]], heat1: 70, heat2: 78,
				batchMass: 2500, heatCapacity: 2, riseLimit: 50, jcr: [[0.7, 0.1], [0.9, 0.1], [0.9, 0.2], [0.7, 0.2]], samples: 20, seed: 1}`,
			fields: []sweepField{
				{path: "r1", kind: kNumber, extra: badRatio},
				{path: "r2", kind: kNumber, extra: badRatio},
				{path: "targetF1", kind: kNumber, extra: join(badFraction, []badValue{{expr: `0`, text: "= 0"}, {expr: `1`, text: "= 1"}})},
				{path: "molarMass1", kind: kNumber, extra: badMolarMass},
				{path: "molarMass2", kind: kNumber, extra: badMolarMass},
				{path: "polymerMass", kind: kNumber, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `-1`, text: "-1"}, {expr: `1e10`, text: "1e+10"}}},
				{path: "mode", kind: kText, extra: []badValue{{expr: `"continuous"`, text: `"continuous"`}}},
				{path: "monomer1", kind: kText, optional: true},
				{path: "monomer2", kind: kText, optional: true},
				{path: "tolerance", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `-0.1`, text: "-0.1"}, {expr: `0.6`, text: "0.6"}}},
				{path: "stopConversion", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `1.5`, text: "1.5"}}},
				{path: "finalConversion", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `1`, text: "= 1"}}},
				{path: "feed", kind: kText, optional: true, extra: []badValue{{expr: `"sideways"`, text: `"sideways"`}}},
				{path: "feedF1", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `1.5`, text: "1.5"}, {expr: `-0.1`, text: "-0.1"}}},
				{path: "shots", kind: kCount, optional: true, extra: []badValue{{expr: `501`, text: "501"}}},
				{path: "steps", kind: kCount, optional: true, extra: []badValue{{expr: `0`, text: "0"}, {expr: `2001`, text: "2001"}}},
				{path: "rateConstant", kind: kNumber, optional: true, extra: badNegative},
				{path: "halfLife", kind: kNumber, optional: true, extra: badNegative},
				{path: "timeTable", kind: kPairs, optional: true, extra: []badValue{
					{expr: `[[0, 0]]`, text: "at least two"},
					{expr: `[[10, 0.1], [5, 0.2]]`, sub: "[1]", text: "= 5"},
					{expr: `[[NaN, 0], [1, 1]]`, sub: "[0][0]", text: "NaN"},
					{expr: `new Array(1001).fill([1, 0.5])`, text: "1001"},
				}},
				{path: "heat1", kind: kNumber, optional: true, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `1001`, text: "1001"}}},
				{path: "heat2", kind: kNumber, optional: true, extra: badNegative},
				{path: "batchMass", kind: kNumber, optional: true, extra: badNegative},
				{path: "heatCapacity", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `-1`, text: "-1"}, {expr: `101`, text: "101"}}},
				{path: "riseLimit", kind: kNumber, optional: true, extra: []badValue{{expr: `0`, text: "= 0"}, {expr: `-1`, text: "-1"}}},
				{path: "jcr", kind: kPairs, optional: true, extra: []badValue{
					{expr: `[[NaN, 0.1], [0.9, 0.1], [0.8, 0.2]]`, sub: "[0][0]", text: "NaN"},
					{expr: `[[-1, 0.1], [0.9, 0.1], [0.8, 0.2]]`, sub: "[0][0]", text: "-1"},
					{expr: `[[0.7, 0.1], [0.8, 0.1], [0.9, 0.1]]`, text: "no area"},
					{expr: `Array.from({length: 4096}, (_, i) => [0.5 + i * 1e-4, 0.1 + i * 1e-4])`, text: "no area"},
					{expr: `[[0.7, 0.1], [0.9, 0.1]]`, text: "2"},
					{expr: `new Array(4097).fill([1, 1])`, text: "4097"},
				}},
				{path: "samples", kind: kCount, optional: true, extra: []badValue{{expr: `9`, text: "9"}, {expr: `5001`, text: "5001"}}},
				{path: "seed", kind: kNumber, optional: true, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `2.5`, text: "2.5"}}},
			},
		}, {
			name: "long schedule",
			arg: `{r1: 0.8, r2: 0.15, targetF1: 0.5, molarMass1: 104.15, molarMass2: 128.17, polymerMass: 1000, mode: "batch", steps: 2000,
				jcr: [[0.7, 0.1], [0.9, 0.1], [0.9, 0.2], [0.7, 0.2]], samples: 10}`,
			fields: []sweepField{{path: "samples", kind: kCount, optional: true, extra: []badValue{{expr: `5000`, text: "2000000 sample rows"}}}},
		}}},
		{name: "starvedFeed", first: "r1", bases: []sweepBase{{
			arg: `{r1: 0.8, r2: 0.15, targetF1: 0.5, feedRate: 1, rateConstant: 0.05, molarMass1: 104.15, molarMass2: 128.17}`,
			fields: []sweepField{
				{path: "r1", kind: kNumber, extra: badRatio},
				{path: "r2", kind: kNumber, extra: badRatio},
				{path: "targetF1", kind: kNumber, extra: badFraction},
				{path: "feedRate", kind: kNumber, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `0`, text: "= 0"}}},
				{path: "rateConstant", kind: kNumber, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `0`, text: "= 0"}}},
				{path: "molarMass1", kind: kNumber, extra: badMolarMass},
				{path: "molarMass2", kind: kNumber, extra: badMolarMass},
			},
		}}},
		{name: "qe", first: "monomer1", bases: []sweepBase{{arg: `{monomer1: "styrene", monomer2: "methyl methacrylate"}`, fields: []sweepField{
			{path: "monomer1", kind: kText, extra: []badValue{{expr: `"unobtainium"`, text: `"unobtainium"`}}},
			{path: "monomer2", kind: kText, extra: []badValue{{expr: `""`, text: `""`}}},
		}}}},
		{name: "limits", optional: true},
		{name: "parseNumber", first: "text", bases: []sweepBase{{arg: `{text: "0,35", field: "runs[0].f10"}`, fields: []sweepField{
			{path: "text", kind: kText, extra: []badValue{
				{expr: `"abc"`, field: "runs[0].f10", text: `"abc"`},
				{expr: `"1,234.5"`, field: "runs[0].f10", text: "both a comma and a point"},
				{expr: `"x".repeat(401)`, text: "401"},
			}},
			{path: "field", kind: kText, optional: true},
		}}}},
		{name: "loadProject", async: true, optional: true, bases: []sweepBase{{arg: `{tab: "sweep-tab"}`, fields: []sweepField{
			{path: "tab", kind: kText, optional: true},
		}}}},
		{name: "saveProject", async: true, first: "project", bases: []sweepBase{{arg: projectArg, fields: projectFields("project.")}, {
			name: "based on a revision",
			arg:  `{project, basedOn: {n: 0, writer: "sweep-tab"}}`,
			fields: []sweepField{
				{path: "basedOn", kind: kObject, optional: true},
				{path: "basedOn.n", kind: kNumber, extra: []badValue{{expr: `-1`, text: "-1"}, {expr: `2.5`, text: "2.5"}}},
				{path: "basedOn.writer", kind: kText, optional: true},
			},
		}}},
		{name: "saveDraft", async: true, first: "tab", bases: []sweepBase{{arg: `{tab: "sweep-tab", fields: {r1: "0,4", notes: "typed"}}`, fields: []sweepField{
			{path: "tab", kind: kText},
			{path: "fields", kind: kCells},
			{path: "fields.r1", kind: kText, optional: true},
		}}}},
		{name: "dropDraft", async: true, first: "tab", bases: []sweepBase{{arg: `{tab: "sweep-tab"}`, fields: []sweepField{
			{path: "tab", kind: kText},
		}}}},
		{name: "keptCopy", async: true, first: "name", bases: []sweepBase{{arg: `{name: "no-such-copy.json"}`, fields: []sweepField{
			{path: "name", kind: kText},
		}}}},
		{name: "dropKept", async: true, first: "name", bases: []sweepBase{{arg: `{name: "no-such-copy.json"}`, fields: []sweepField{
			{path: "name", kind: kText},
		}}}},
	}
}

// sweepJS holds the JS side of the sweep: building each argument and calling the method so
// that a throw is caught and reported rather than ending the test.
var sweepJS = jsEval(`{
	edit(base, path, expr) {
		const arg = structuredClone(base);
		const keys = path.match(/[^.[\]]+/g);
		let o = arg;
		for (const k of keys.slice(0, -1)) o = o[k];
		const last = keys[keys.length - 1];
		if (expr === "<delete>") delete o[last];
		else o[last] = Function("project", "return (" + expr + ");")(this.project);
		return arg;
	},
	value(expr) { return Function("project", "return (" + expr + ");")(this.project); },
	call(api, method, args) {
		try {
			return {value: api[method](...args)};
		} catch (e) {
			return {thrown: String(e && e.stack || e)};
		}
	},
	isError(v) {
		return v !== null && typeof v === "object" && Object.getPrototypeOf(v) === Object.prototype &&
			["code,error,field,reason", "code,error,field,reason,value", "code,error,field,reason,row", "code,error,field,reason,row,value"]
				.includes(Object.keys(v).sort().join()) && typeof v.error === "string" && typeof v.field === "string";
	},
	at(v, path) {
		for (const k of path.match(/[^.[\]]+/g)) v = v == null ? undefined : v[k];
		return v;
	},
	deepJunk() {
		let o = {};
		for (let i = 0; i < 1e5; i++) o = {a: o, b: [o], c: "junk"};
		o.self = o;
		return o;
	},
}`)

// sweep is one run of the sweep over an api object.
type sweep struct {
	api      js.Value
	calls    int
	maxAlloc uint64 // the most Go memory one call allocated, in bytes
	maxCase  string
}

// call calls method with args and returns its answer (awaited for an asynchronous method),
// failing the test if the call threw.
func (s *sweep) call(t *testing.T, m sweepMethod, name string, args ...any) js.Value {
	t.Helper()
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	r := sweepJS.Call("call", s.api, m.name, js.ValueOf(args))
	s.calls++
	if th := r.Get("thrown"); !th.IsUndefined() {
		t.Fatalf("copoly.%s threw: %s", m.name, th.String())
	}
	v := r.Get("value")
	if m.async {
		v = await(t, v)
	}
	runtime.ReadMemStats(&after)
	if a := after.TotalAlloc - before.TotalAlloc; a > s.maxAlloc {
		s.maxAlloc, s.maxCase = a, m.name+"/"+name
	}
	return v
}

// wantBad checks that v is a plain {error, field, code, reason, value?, row?} for field whose
// message names the field and holds text, with its parts (wantParts).
func wantBad(t *testing.T, v js.Value, field, text string) {
	t.Helper()
	if !sweepJS.Call("isError", v).Bool() {
		t.Fatalf("got %.300s, want a plain {error, field, code, reason, value?, row?} object for %s", stringify(v), field)
	}
	msg, got := v.Get("error").String(), v.Get("field").String()
	if got != field {
		t.Errorf("field = %q, want %q (error %.200q)", got, field, msg)
	}
	if msg == "" || !strings.Contains(msg, field) || !strings.Contains(msg, text) {
		t.Errorf("error %.300q does not name the field %q and the value (%q)", msg, field, text)
	}
	wantParts(t, v)
}

func TestBadInputSweep(t *testing.T) {
	api, memFS := testAPI(t)
	s := &sweep{api: api}

	project := fullProject(api)
	sweepJS.Set("project", project)
	_, fitObjs := fitRuns()
	_, triadObjs := triadSet(t)
	toJSON := func(v []any) string { return js.Global().Get("JSON").Call("stringify", js.ValueOf(v)).String() }
	methods := sweepMethods(toJSON(fitObjs), toJSON(triadObjs))

	// keptCopy and dropKept need a kept copy: a save based on a revision the store has moved
	// past is kept aside as a conflict copy.
	// another tab: a second module instance on the same storage
	other := newStorage()
	other.open = memOpener(memFS)
	other.now = func() time.Time { return fixedNow }
	wantNoError(t, await(t, call(newAPI(other), "saveProject", map[string]any{"project": project})))
	conflict := await(t, call(api, "saveProject", map[string]any{"project": project}))
	keptName := js.Undefined()
	if kept := conflict.Get("kept"); kept.Type() == js.TypeObject {
		keptName = kept.Get("name")
	}
	if keptName.Type() != js.TypeString {
		t.Fatalf("a save on an old revision gave %.300s, want a conflict with its kept copy", stringify(conflict))
	}
	for i := range methods {
		if n := methods[i].name; n == "keptCopy" || n == "dropKept" {
			methods[i].bases[0].arg = fmt.Sprintf("{name: %q}", keptName.String())
		}
	}

	// Every method of the copoly object is swept, and no other.
	var names []string
	for _, m := range methods {
		names = append(names, m.name)
	}
	keys := js.Global().Get("Object").Call("keys", api)
	var got []string
	for i := range keys.Length() {
		if k := keys.Index(i).String(); k != "version" {
			got = append(got, k)
		}
	}
	if len(names) != 28 || !reflect.DeepEqual(got, names) {
		t.Fatalf("the sweep covers %d methods %v; the copoly object has %v", len(names), names, got)
	}

	runtime.GC()
	var start runtime.MemStats
	runtime.ReadMemStats(&start)

	for _, m := range methods {
		t.Run(m.name, func(t *testing.T) {
			s.sweepArguments(t, m)
			for _, b := range m.bases {
				base := sweepJS.Call("value", b.arg)
				t.Run(b.name, func(t *testing.T) {
					// The base itself is valid, so each error below comes from its bad value.
					v := s.call(t, m, "base", base)
					if sweepJS.Call("isError", v).Bool() {
						t.Fatalf("the valid argument %s gave %s", b.arg, stringify(v))
					}
					for _, f := range b.fields {
						s.sweepField(t, m, base, f)
					}
				})
			}
		})
	}

	// The module still answers a valid call correctly: with r1 = r2 = 1 the Mayo–Lewis equation
	// reduces to F1 = f1 for every feed (Mayo and Lewis, J. Am. Chem. Soc. 1944, 66, 1594: the
	// "ideal azeotropic" case), an identity.
	f1 := []float64{0, 0.125, 0.3, 0.5, 0.875, 1}
	r := call(api, "composition", map[string]any{"r1": 1, "r2": 1, "f1": js.ValueOf([]any{0.0, 0.125, 0.3, 0.5, 0.875, 1.0})})
	wantNoError(t, r)
	for i, f := range floatsOf(t, r.Get("F1")) {
		if !scalar.EqualWithinAbsOrRel(f, f1[i], 1e-15, 1e-15) {
			t.Errorf("after the sweep, composition(r1 = r2 = 1) F1[%d] = %v, want f1 = %v", i, f, f1[i])
		}
	}
	// And saves and loads a project.
	wantNoError(t, await(t, call(api, "saveProject", map[string]any{"project": project})))
	if p := await(t, call(api, "loadProject")).Get("project"); p.Get("name").String() != project.Get("name").String() {
		t.Errorf("after the sweep, loadProject gave %.200s", stringify(p))
	}

	// The Go heap holds no more than before the sweep, give or take 16 MiB (a generous bound:
	// the sweep's inputs add up to gigabytes, and none may stay behind; the heap measured under
	// Node 20 grew by under 1 MiB). Each call allocated at most 8 MiB of Go memory: the largest
	// inputs must be refused before they are copied into Go, and copying one text of ten
	// million characters alone takes 10 MB (the largest call measured allocated under 2 MiB).
	runtime.GC()
	var end runtime.MemStats
	runtime.ReadMemStats(&end)
	grown := int64(end.HeapAlloc) - int64(start.HeapAlloc)
	t.Logf("%d calls; Go heap %d KiB before, %d KiB after; the largest call (%s) allocated %d KiB",
		s.calls, start.HeapAlloc>>10, end.HeapAlloc>>10, s.maxCase, s.maxAlloc>>10)
	if grown > 16<<20 {
		t.Errorf("the Go heap grew by %d MiB over the sweep, want at most 16 MiB", grown>>20)
	}
	if s.maxAlloc > 8<<20 {
		t.Errorf("one call (%s) allocated %d MiB of Go memory, want at most 8 MiB", s.maxCase, s.maxAlloc>>20)
	}
}

// fullProject returns the demo project with every optional part filled in.
func fullProject(api js.Value) js.Value {
	return jsEval(`((p) => {
		p = structuredClone(p);
		p.savedAt = "2026-01-02T03:04:05.123456789+14:00"; // the longest RFC 3339 time: 35 characters
		p.level = 0.95;
		p.jcr = [[0.7, 0.1], [0.9, 0.1], [0.8, 0.2]];
		p.model = {kind: "penultimate", r11: 0.9, r21: 0.6, r22: 0.2, r12: 0.1};
		p.triads = [{f10: 0.3, F1: 0.4, A111: 0.1}];
		p.sizeBins = [{low: 1e4, high: 2e4, weightFraction: 1}];
		p.plan.timeTable = [[0, 0], [10, 0.1]];
		p.userMonomers = [{name: "X-1", molarMass: 100, hazards: ["toxic"]}];
		return p;
	})`).Invoke(call(api, "demoProject").Get("project"))
}

// TestExportImportRoundTrip: a project with every optional part, exported and imported, comes
// back as checkProject gives it, and so again after each further round trip, with the same file.
func TestExportImportRoundTrip(t *testing.T) {
	api, _ := testAPI(t)
	want := call(api, "checkProject", map[string]any{"project": fullProject(api)})
	wantNoError(t, want)
	p, file := want.Get("project"), ""
	for round := 1; round <= 3; round++ {
		exp := call(api, "exportProject", map[string]any{"project": p})
		wantNoError(t, exp)
		if round > 1 && exp.Get("json").String() != file {
			t.Errorf("round %d exported another file", round)
		}
		file = exp.Get("json").String()
		imp := call(api, "importProject", map[string]any{"json": file})
		wantNoError(t, imp)
		if stringify(imp.Get("project")) != stringify(want.Get("project")) {
			t.Fatalf("round %d: importProject(exportProject(p)) = %.300s, want %.300s", round, stringify(imp.Get("project")), stringify(want.Get("project")))
		}
		p = imp.Get("project")
	}
}

// sweepArguments calls m without an argument, with arguments that are not one object, with an
// empty object and with deep, cyclic junk.
func (s *sweep) sweepArguments(t *testing.T, m sweepMethod) {
	for _, c := range []struct {
		name string
		args []any
		text string
	}{
		{"no argument", nil, "got nothing"},
		{"undefined", []any{js.Undefined()}, "got nothing"},
		{"null", []any{js.Null()}, "null"},
		{"number", []any{5}, "the number 5"},
		{"NaN", []any{jsEval("NaN")}, "the number NaN"},
		{"text", []any{"r1=0.5"}, `the text "r1=0.5"`},
		{"long text", []any{jsEval(`"x".repeat(1e7)`)}, `the text "xxxx`},
		{"true", []any{true}, "true"},
		{"list", []any{jsEval(`[{r1: 0.5}]`)}, "a list"},
		{"function", []any{jsEval(`() => ({})`)}, "a function"},
		{"BigInt", []any{jsEval(`1n`)}, "unsupported kind"},
		{"two objects", []any{map[string]any{}, map[string]any{}}, "2 arguments"},
	} {
		t.Run("arguments/"+c.name, func(t *testing.T) {
			v := s.call(t, m, "arguments/"+c.name, c.args...)
			if m.optional && (len(c.args) == 0 || c.name == "undefined") {
				if sweepJS.Call("isError", v).Bool() {
					t.Errorf("copoly.%s() = %s, want a result", m.name, stringify(v))
				}
				return
			}
			wantBad(t, v, "arguments", c.text)
		})
	}
	for _, c := range []struct{ name, expr string }{{"empty object", "({})"}, {"deep junk", "this.deepJunk()"}} {
		t.Run("arguments/"+c.name, func(t *testing.T) {
			arg := js.Global().Get("Function").New("return ("+c.expr+");").Call("call", sweepJS)
			v := s.call(t, m, "arguments/"+c.name, arg)
			if m.optional {
				if sweepJS.Call("isError", v).Bool() {
					t.Errorf("copoly.%s(%s) = %s, want a result (its argument holds nothing it reads)", m.name, c.name, stringify(v))
				}
				return
			}
			wantBad(t, v, m.first, "missing")
		})
	}
}

// sweepField calls m with base changed at f.path to each bad value of f.
func (s *sweep) sweepField(t *testing.T, m sweepMethod, base js.Value, f sweepField) {
	values := join(kindValues[f.kind], f.extra)
	if f.kind == kCount {
		values = join(kindValues[kNumber], countValues, f.extra)
	}
	for _, missing := range []badValue{{expr: "null", text: "missing"}, {expr: "<delete>", text: "missing"}} {
		if !f.optional {
			values = append(values, missing)
			continue
		}
		// An optional field left out or null means "not given": a result, or an error naming
		// the field (a molar mass without its partner).
		name := fmt.Sprintf("%s=%s", f.path, missing.expr)
		t.Run(name, func(t *testing.T) {
			v := s.call(t, m, name, sweepJS.Call("edit", base, f.path, missing.expr))
			if sweepJS.Call("isError", v).Bool() {
				want := f.path
				if f.absent != "" {
					want = f.absent
				}
				wantBad(t, v, want, "")
			}
		})
	}
	for _, bv := range values {
		name := fmt.Sprintf("%s=%.40s", f.path, bv.expr)
		t.Run(name, func(t *testing.T) {
			v := s.call(t, m, name, sweepJS.Call("edit", base, f.path, bv.expr))
			if bv.in != "" {
				if sweepJS.Call("isError", v).Bool() {
					t.Fatalf("got %s, want a result holding an error at %s", stringify(v), bv.in)
				}
				v = sweepJS.Call("at", v, bv.in)
			}
			field := f.path + bv.sub
			if bv.field != "" {
				field = bv.field
			}
			wantBad(t, v, field, bv.text)
		})
	}
}

// TestDecodeLimits checks, without calling anything, that every text, list and map of every
// argument type decode reads has its size limits (limit:"…" and, for texts in a list or map,
// each:"…" tags naming entries of limits), so that no input of any size is copied into Go
// before its size is checked. A list of numbers needs no tag: it takes copoly.MaxPoints. The
// argument types are found in the source, as the types of the variables passed to decode.
func TestDecodeLimits(t *testing.T) {
	types := map[string]reflect.Type{}
	for _, v := range []any{modelIn{}, compositionIn{}, feedIn{}, driftIn{}, sequenceIn{}, chainsIn{}, discriminateIn{},
		averagesIn{}, importIn{}, benchRunsIn{}, pasteBenchIn{}, fitIn{}, nextRunsIn{}, planIn{}, starvedFeedIn{}, qeIn{}, parseNumberIn{}, exampleIn{}} {
		types[reflect.TypeOf(v).Name()] = reflect.TypeOf(v)
	}
	decoded := regexp.MustCompile(`var in (\w+)\n\s*if err := decode\(`)
	found := 0
	for _, name := range []string{"api.go", "dto.go"} {
		src, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		for _, m := range decoded.FindAllStringSubmatch(string(src), -1) {
			found++
			if types[m[1]] == nil {
				t.Errorf("%s decodes a %s, which this test does not check", name, m[1])
			}
		}
	}
	if found != len(types) {
		t.Errorf("found %d calls of decode in the source, want %d (one per argument type)", found, len(types))
	}
	for name, typ := range types {
		checkLimitTags(t, typ, name)
	}
}

func checkLimitTags(t *testing.T, typ reflect.Type, path string) {
	t.Helper()
	for i := range typ.NumField() {
		sf := typ.Field(i)
		ft := sf.Type
		if ft.Kind() == reflect.Pointer {
			ft = ft.Elem()
		}
		field := path + "." + sf.Tag.Get("js")
		has := func(key string) bool {
			name := sf.Tag.Get(key)
			if name != "" && limits[name] == 0 {
				t.Errorf("%s: %s:%q names no limit", field, key, name)
			}
			return name != ""
		}
		switch ft.Kind() {
		case reflect.Float64, reflect.Bool:
		case reflect.String:
			if !has("limit") {
				t.Errorf("%s: a text without a limit tag", field)
			}
		case reflect.Struct:
			checkLimitTags(t, ft, field)
		case reflect.Slice:
			switch et := ft.Elem(); et.Kind() {
			case reflect.Float64:
			case reflect.Slice:
				if !has("limit") {
					t.Errorf("%s: a list of pairs without a limit tag", field)
				}
			case reflect.Struct:
				if !has("limit") {
					t.Errorf("%s: a list of objects without a limit tag", field)
				}
				checkLimitTags(t, et, field+"[i]")
			case reflect.String:
				if !has("limit") || !has("each") {
					t.Errorf("%s: a list of texts without limit and each tags", field)
				}
			default:
				t.Errorf("%s: decode cannot read a %s", field, ft)
			}
		case reflect.Map:
			if !has("limit") || !has("each") {
				t.Errorf("%s: an object of texts without limit and each tags", field)
			}
		default:
			t.Errorf("%s: decode cannot read a %s", field, ft)
		}
	}
}
