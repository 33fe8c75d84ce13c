//go:build js && wasm

package main

import (
	"syscall/js"
	"testing"
)

// TestErrors checks that bad input gives an error object naming the input as in
// site/copoly.d.ts (the JS path) with a message that says why. Each case edits a good
// argument of its method with a JS statement on a. The checks are copoly's (and their limits
// copoly's constants: MaxPoints, MaxBins, MaxRunLength, MaxChains, MaxChainLength,
// MaxSimChains, plan.MaxSteps, plan.MaxShots, …) except the JS types, presence and whole
// numbers, which are the bridge's; the science behind each range is tested in copoly.
// (badinput_test.go sweeps bad values of every kind through every field.)
func TestErrors(t *testing.T) {
	api, _ := testAPI(t)
	_, fitObjs := fitRuns()
	_, triads := triadSet(t)
	good := map[string]any{
		"composition":  map[string]any{"r1": 0.8, "r2": 0.15, "f1": []any{0.5}},
		"feedFor":      map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.5},
		"drift":        map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "conversion": []any{0.5}},
		"sequence":     map[string]any{"r1": 0.8, "r2": 0.15, "f1": 0.5},
		"chains":       map[string]any{"r1": 0.8, "r2": 0.15, "f10": 0.5, "dpn": 50},
		"discriminate": map[string]any{"runs": triads},
		"averages":     map[string]any{"slices": []any{map[string]any{"mass": 1e4, "signal": 1}}},
		"fit":          map[string]any{"runs": fitObjs},
		"nextRuns":     map[string]any{"r1": 0.8, "r2": 0.15, "runs": fitObjs},
		"plan": planArg("semibatch", "monomer1", "styrene", "timeTable", []any{[]any{0, 0}, []any{60, 0.5}, []any{120, 0.9}},
			"jcr", planJCR, "samples", 20),
		"starvedFeed":   map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.5, "feedRate": 5, "rateConstant": 0.01, "molarMass1": mmSt, "molarMass2": mmNBA},
		"qe":            map[string]any{"monomer1": "styrene", "monomer2": "n-butyl acrylate"},
		"checkProject":  demoArg(t, api),
		"importProject": call(api, "exportProject", demoArg(t, api)),
		"benchRuns":     demoBenchArg(t, api),
	}
	goodJS := map[string]js.Value{}
	for method, a := range good {
		goodJS[method] = jsOf(a)
		// The good arguments really are good, so each case below fails for its own reason.
		wantNoError(t, call(api, method, goodJS[method]))
	}
	goodJS["exportProject"] = goodJS["checkProject"]

	// The model options (ModelArgs in site/copoly.d.ts), for each method that takes them.
	const models = `const PEN = {model: "penultimate", r11: 0.9, r21: 0.4, r22: 0.2, r12: 0.6}, IMPL = {model: "implicit", r1: 0.8, r2: 0.15, s1: 0.5, s2: 2}; `
	type errorCase struct{ method, edit, field, text string }
	var cases []errorCase
	for _, method := range []string{"composition", "drift", "sequence", "chains"} {
		for _, c := range []errorCase{
			{"", `a.model = "ultimate"`, "model", `"ultimate"`},
			{"", `a.model = 2`, "model", "must be text"},
			{"", `a.model = "penultimate-penultimate-penultimate"`, "model", "the limit is 32"},
			{"", `a.model = "terminal"; delete a.r2`, "r2", "missing: the terminal model takes r1, r2"},
			{"", `Object.assign(a, PEN); delete a.r12`, "r12", "missing: the penultimate model takes r11, r21, r22, r12"},
			{"", `a.model = "penultimate"`, "r11", "missing"},
			{"", `Object.assign(a, PEN, {r22: -0.1})`, "r22", "negative"},
			{"", `Object.assign(a, PEN, {r21: "0.4"})`, "r21", "must be a number"},
			{"", `Object.assign(a, PEN, {r11: NaN})`, "r11", "finite"},
			{"", `Object.assign(a, IMPL); delete a.s2`, "s2", "missing: the implicit model takes r1, r2, s1, s2"},
			{"", `Object.assign(a, IMPL, {s1: 0})`, "s1", "positive"},
			{"", `Object.assign(a, IMPL, {r2: 1e5})`, "r2", "outside"},
		} {
			c.method = method
			cases = append(cases, c)
		}
	}
	cases = append(cases, []errorCase{
		// Missing and wrong JS types, with the ratios every method shares.
		{"composition", `delete a.r1`, "r1", "missing"},
		{"composition", `a.r1 = null`, "r1", "missing"},
		{"composition", `a.r1 = "0.8"`, "r1", `the text "0.8"`},
		{"composition", `a.r2 = true`, "r2", "true"},
		{"composition", `a.r1 = NaN`, "r1", "not a number"},
		{"composition", `a.r1 = -0.2`, "r1", "negative"},
		{"composition", `a.r2 = Infinity`, "r2", "finite"},
		{"composition", `delete a.f1`, "f1", "missing"},
		{"composition", `a.f1 = 0.5`, "f1", "a list of numbers"},
		{"composition", `a.f1 = {0: 0.5}`, "f1", "a list of numbers"},
		{"composition", `a.f1 = [0.5, "0.6"]`, "f1[1]", "must be a number"},
		{"composition", `a.f1 = [0.5, 0.6, null]`, "f1[2]", "null"},
		{"composition", `a.f1 = [0.5, 1.5]`, "f1[1]", "between 0 and 1"},
		{"composition", `a.f1 = [NaN]`, "f1[0]", "not a number"},
		{"composition", `a.f1 = new Array(100001).fill(0.5)`, "f1", "at most 100000"},
		{"composition", `a.f1 = new Array(1e9)`, "f1", "at most 100000"},
		{"composition", `Object.assign(a, IMPL, {f1: [NaN]})`, "f1[0]", "finite"},
		{"feedFor", `delete a.targetF1`, "targetF1", "missing"},
		{"feedFor", `a.r1 = 0; a.r2 = 0; a.targetF1 = 0.3`, "targetF1", "alternates"},
		{"feedFor", `a.targetF1 = 1.2`, "targetF1", "between 0 and 1"},

		{"drift", `a.f10 = "half"`, "f10", "must be a number"},
		{"drift", `a.f10 = 1.2`, "f10", "between 0 and 1"},
		{"drift", `a.conversion = []`, "conversion", "at least one"},
		{"drift", `a.conversion = [0.5, 0.4]`, "conversion[1]", "must not decrease"},
		{"drift", `Object.assign(a, PEN, {conversion: [0.5, 0.4]})`, "conversion[1]", "must not decrease"},
		{"drift", `a.conversion = [-0.1]`, "conversion[0]", "between 0 and 1"},
		{"drift", `a.conversion = [0, 0]`, "conversion[1]", "zero conversion"},
		{"drift", `a.conversion = new Array(100001).fill(0.5)`, "conversion", "at most 100000"},
		{"drift", `a.basis = "volume"`, "basis", `"molar" or "mass"`},
		{"drift", `a.basis = 1`, "basis", "must be text"},
		{"drift", `a.basis = "mass"`, "molarMass1", "needs both molar masses"},
		{"drift", `Object.assign(a, PEN, {basis: "mass"})`, "molarMass1", "both molar masses"},
		{"drift", `a.molarMass1 = 104.15`, "molarMass2", "both molar masses or neither"},
		{"drift", `a.molarMass1 = -1; a.molarMass2 = 128.17`, "molarMass1", "positive"},
		{"drift", `a.molarMass1 = 104.15; a.molarMass2 = "128"`, "molarMass2", "must be a number"},
		{"drift", `Object.assign(a, {r1: 0.5, r2: 0, f10: 0.3, conversion: [0.1, 0.99], basis: "mass", molarMass1: 100, molarMass2: 100})`, "conversion[1]", "stops at a mass conversion"},
		{"drift", `a.tolerance = 0`, "tolerance", "above 0"},
		{"drift", `a.tolerance = "2%"`, "tolerance", "must be a number"},
		{"drift", `a.bins = 2.5`, "bins", "whole number"},
		{"drift", `a.bins = 0`, "bins", "between 1 and 200"},
		{"drift", `a.bins = 201`, "bins", "between 1 and 200"},
		{"drift", `a.bins = NaN`, "bins", "finite"},

		{"sequence", `a.f1 = 2`, "f1", "between 0 and 1"},
		{"sequence", `a.f1 = [0.5]`, "f1", "must be a number"},
		{"sequence", `a.maxLength = 0`, "maxLength", "between 1 and 1000"},
		{"sequence", `Object.assign(a, IMPL, {maxLength: 0})`, "maxLength", "between 1 and 1000"},
		{"sequence", `a.maxLength = 3.5`, "maxLength", "whole number"},
		{"sequence", `a.conversion = 1.5`, "conversion", "between 0 and 1"},
		{"sequence", `Object.assign(a, PEN, {conversion: 2})`, "conversion", "between 0 and 1"},
		{"sequence", `a.conversion = "90%"`, "conversion", "must be a number"},

		// chains: sample chains without a simulation option, else a simulation.
		{"chains", `delete a.dpn; a.count = 1001`, "count", "between 1 and 1000"},
		{"chains", `delete a.dpn; a.count = 0`, "count", "between 1 and 1000"},
		{"chains", `delete a.dpn; a.length = 10001`, "length", "between 1 and 10000"},
		{"chains", `delete a.dpn; a.length = 60.5`, "length", "whole number"},
		{"chains", `delete a.dpn; a.seed = -1`, "seed", "between 0 and"},
		{"chains", `delete a.dpn; a.seed = 1e300`, "seed", "between 0 and"},
		{"chains", `delete a.dpn; a.f10 = -0.5`, "f10", "between 0 and 1"},
		{"chains", `a.count = 100001`, "count", "between 1 and 100000"},
		{"chains", `delete a.dpn; a.functional = 1; a.count = 100000; a.length = 1000`, "count", "20000000 units"},
		{"chains", `a.count = 100000; a.dpn = 1000`, "count", "20000000 units"},
		{"chains", `a.dpn = 0`, "dpn", "at least 1"},
		{"chains", `a.dpn = 0.5`, "dpn", "between 1 and 100000"},
		{"chains", `a.dpn = "50"`, "dpn", "must be a number"},
		{"chains", `a.dpn = NaN`, "dpn", "finite"},
		{"chains", `a.functional = 3`, "functional", "between 1 and 2"},
		{"chains", `a.functional = 0`, "functional", "between 1 and 2"},
		{"chains", `a.functional = 1.5`, "functional", "whole number"},
		{"chains", `a.conversion = 1.5`, "conversion", "between 0 and 1"},
		{"chains", `Object.assign(a, {r1: 0.5, r2: 0, f10: 0.3, conversion: 0.99}); delete a.dpn`, "conversion", "stops"},
		{"chains", `a.bins = 0`, "bins", "between 1 and 200"},
		{"chains", `a.bins = 201`, "bins", "between 1 and 200"},
		{"chains", `delete a.dpn; a.conversion = 0; a.length = 10001`, "length", "between 1 and 10000"},
		{"chains", `a.seed = 1.5`, "seed", "whole number"},
		{"chains", `a.f10 = 1.1`, "f10", "between 0 and 1"},

		{"discriminate", `delete a.runs`, "runs", "missing"},
		{"discriminate", `a.runs = {f10: 0.5}`, "runs", "a list of objects"},
		{"discriminate", `a.runs = []`, "runs", "between 1 and 1000"},
		{"discriminate", `a.runs = new Array(1001).fill({f10: 0.5, F1: 0.5})`, "runs", "at most 1000"},
		{"discriminate", `a.runs = [0.5]`, "runs[0]", "an object"},
		{"discriminate", `delete a.runs[2].f10`, "runs[2].f10", "missing"},
		{"discriminate", `a.runs[2].f10 = 1`, "runs[2].f10", "both monomers"},
		{"discriminate", `a.runs[0].f10 = 1.5`, "runs[0].f10", "between 0 and 1"},
		{"discriminate", `a.runs[1].A112 = 1.4`, "runs[1].A112", "not measured"},
		{"discriminate", `a.runs[3].A221 = -0.2`, "runs[3].A221", "not measured"},
		{"discriminate", `a.runs[4].A121 = NaN`, "runs[4].A121", "finite"},
		{"discriminate", `a.runs[0].F1 = "0.4"`, "runs[0].F1", "must be a number"},
		{"discriminate", `a.runs = [{f10: 0.5, F1: 0.5, A112: 0.5}, {f10: 0.3, F1: 0.3}]`, "runs", "at least 6"},

		{"averages", `delete a.slices`, "bins", "bins"},
		{"averages", `a.bins = []; a.slices = []`, "bins", "slices"},
		{"averages", `a.bins = [{low: 1e4, high: 2e4, weightFraction: 1}]`, "slices", "not both"},
		{"averages", `delete a.slices; a.bins = 5`, "bins", "a list of objects"},
		{"averages", `delete a.slices; a.bins = new Array(10001).fill({low: 1, high: 2, weightFraction: 1})`, "bins", "at most 10000"},
		{"averages", `delete a.slices; a.bins = [{low: 1e4}]`, "bins[0].high", "missing"},
		{"averages", `delete a.slices; a.bins = [{low: 1e4, high: 2e4, weightFraction: 1}, {low: "1e4", high: 2e4}]`, "bins[1].low", "must be a number"},
		{"averages", `delete a.slices; a.bins = [{low: 1e4, high: 2e4, weightFraction: 1}, {low: -1, high: 2e4, weightFraction: 1}]`, "bins[1].low", "negative"},
		{"averages", `delete a.slices; a.bins = [{low: 3e4, high: 2e4, weightFraction: 1}]`, "bins[0].high", "low ≤ high"},
		{"averages", `delete a.slices; a.bins = [{low: 1e4, high: 2e4, weightFraction: 1}, {low: 2e4, high: 3e4, numberFraction: 0.5}]`, "bins[1].numberFraction", "not both"},
		{"averages", `delete a.slices; a.bins = [{low: 1e4, high: 2e4, weightFraction: NaN}]`, "bins[0].weightFraction", "finite"},
		{"averages", `delete a.slices; a.bins = [{low: 1e4, high: 2e4}]`, "bins", "all zero"},
		{"averages", `a.slices.push({mass: 0, signal: 1})`, "slices[1].mass", "positive"},
		{"averages", `a.slices[0].signal = -0.1`, "slices[0].signal", "baseline"},
		{"averages", `a.slices.push({mass: 1e4, signal: 1}, {mass: 1e4, signal: Infinity})`, "slices[2].signal", "finite"},
		{"averages", `delete a.slices[0].signal`, "slices[0].signal", "missing"},
		{"averages", `a.slices[0].signal = 0`, "slices", "all zero"},
		{"averages", `Object.assign(a, {F1: 1.5, molarMass1: 100, molarMass2: 200})`, "F1", "between 0 and 1"},
		{"averages", `Object.assign(a, {F1: 0.5, molarMass1: 100})`, "molarMass2", "both molar masses or neither"},
		{"averages", `Object.assign(a, {molarMass1: 0, molarMass2: 100})`, "molarMass1", "positive"},

		{"fit", `delete a.runs`, "runs", "missing"},
		{"fit", `a.runs = {}`, "runs", "a list of objects"},
		{"fit", `a.runs = [0.5, 0.6, 0.7]`, "runs[0]", "an object"},
		{"fit", `a.runs[2] = null`, "runs[2]", "an object"},
		{"fit", `delete a.runs[1].F1`, "runs[1].F1", "missing"},
		{"fit", `delete a.runs[4].f10`, "runs[4].f10", "missing"},
		{"fit", `a.runs[0].f10 = "0,1"`, "runs[0].f10", "must be a number"},
		{"fit", `a.runs[3].F1 = NaN`, "runs[3].F1", "finite"},
		{"fit", `a.runs[5].sF = Infinity`, "runs[5].sF", "finite"},
		{"fit", `a.runs[0].conversion = 1n`, "runs[0].conversion", "must be a number"},
		{"fit", `a.runs[2].F1 = 1.2`, "runs[2].F1", "between 0 and 1"},
		{"fit", `a.runs[2].conversion = 1`, "runs[2].conversion", "full conversion"},
		{"fit", `a.runs = a.runs.slice(0, 2)`, "runs", "at least three"},
		{"fit", `a.runs.forEach(r => r.f10 = 0.5)`, "runs", "two different feeds"},
		{"fit", `a.runs = new Array(1001).fill(a.runs[0])`, "runs", "at most 1000"},
		{"fit", `a.level = 1`, "level", "between 0 and 1"},
		{"fit", `a.level = 95`, "level", "between 0 and 1"},
		{"fit", `a.level = "0.95"`, "level", "must be a number"},

		{"nextRuns", `delete a.r1`, "r1", "missing"},
		{"nextRuns", `a.r2 = -1`, "r2", "negative"},
		{"nextRuns", `a.runs = 3`, "runs", "a list of objects"},
		{"nextRuns", `a.runs[1].f10 = 1.5`, "runs[1].f10", "between 0 and 1"},
		{"nextRuns", `delete a.runs[0].F1`, "runs[0].F1", "missing"},
		{"nextRuns", `a.runs[0].conversion = NaN`, "runs[0].conversion", "finite"},
		{"nextRuns", `a.conversions = []`, "conversions", "between 1 and 20"},
		{"nextRuns", `a.conversions = [0.2, 1]`, "conversions[1]", "full conversion"},
		{"nextRuns", `a.conversions = ["0.2"]`, "conversions[0]", "must be a number"},

		{"qe", `a.monomer1 = "unobtainium"; a.monomer2 = "styrene"`, "monomer1", `"styrene"`},
		{"qe", `a.monomer2 = "Styrene"`, "monomer2", "no built-in Q–e values"},
		{"qe", `delete a.monomer1`, "monomer1", "missing"},
		{"qe", `a.monomer2 = 2`, "monomer2", "must be text"},

		{"plan", `a.r1 = -0.1`, "r1", "negative"},
		{"plan", `delete a.targetF1`, "targetF1", "missing"},
		{"plan", `a.targetF1 = "0.5"`, "targetF1", "must be a number"},
		{"plan", `a.targetF1 = NaN`, "targetF1", "not a number"},
		{"plan", `a.targetF1 = 1`, "targetF1", "both monomers"},
		{"plan", `a.molarMass2 = 0`, "molarMass2", "positive"},
		{"plan", `a.polymerMass = -5`, "polymerMass", "positive"},
		{"plan", `a.polymerMass = Infinity`, "polymerMass", "finite"},
		{"plan", `a.polymerMass = [1000]`, "polymerMass", "must be a number"},
		{"plan", `a.mode = "continuous"`, "mode", "not a plan mode"},
		{"plan", `delete a.mode`, "mode", "missing"},
		{"plan", `a.mode = 2`, "mode", "must be text"},
		{"plan", `a.monomer1 = 7`, "monomer1", "must be text"},
		{"plan", `a.tolerance = NaN`, "tolerance", "finite"},
		{"plan", `a.tolerance = 0`, "tolerance", "above 0"},
		{"plan", `a.tolerance = 0.6`, "tolerance", "at most 0.5"},
		{"plan", `a.finalConversion = 1`, "finalConversion", "below 1"},
		{"plan", `a.finalConversion = 0`, "finalConversion", "above 0"},
		{"plan", `a.mode = "batch"; a.stopConversion = 0`, "stopConversion", "above 0"},
		{"plan", `a.feed = "both"`, "feed", "not a feed"},
		{"plan", `a.feed = "mixture"; a.feedF1 = 1.5`, "feedF1", "between 0 and 1"},
		{"plan", `a.feed = "mixture"; a.feedF1 = 0`, "feedF1", "above 0"},
		{"plan", `a.feed = "mixture"; a.feedF1 = 0.1`, "feedF1", "richer in the faster monomer"},
		{"plan", `a.mode = "shots"; a.shots = 2.5`, "shots", "whole number"},
		{"plan", `a.mode = "shots"; a.shots = 501`, "shots", "between 0 and 500"},
		// Too few shots for the final conversion: the reactor runs dry between shots; the plan is
		// refused, not shown truncated.
		{"plan", `a.mode = "shots"; a.shots = 6; delete a.timeTable; delete a.jcr`, "shots", ""},
		{"plan", `a.steps = 0`, "steps", "between 1 and 2000"},
		{"plan", `a.steps = 2001`, "steps", "between 1 and 2000"},
		{"plan", `a.rateConstant = -0.01`, "rateConstant", "negative"},
		{"plan", `a.halfLife = "1 h"`, "halfLife", "must be a number"},
		{"plan", `a.timeTable = 5`, "timeTable", "a list of [time, conversion] pairs"},
		{"plan", `a.timeTable[1] = [1, 0.1, 3]`, "timeTable[1]", "pair [time, conversion]"},
		{"plan", `a.timeTable[1] = [60, "50%"]`, "timeTable[1][1]", "must be a number"},
		{"plan", `a.timeTable[2] = [NaN, 0.9]`, "timeTable[2][0]", "finite"},
		{"plan", `a.timeTable[2] = [60, 0.9]`, "timeTable[2]", "time increasing"},
		{"plan", `a.timeTable[2] = [150, 0.4]`, "timeTable[2]", "not decreasing"},
		{"plan", `a.timeTable = [[0, 0]]`, "timeTable", "at least two rows"},
		{"plan", `a.timeTable = new Array(1001).fill([1, 0.5])`, "timeTable", "at most 1000"},
		{"plan", `a.heat2 = -70`, "heat2", "negative"},
		{"plan", `a.batchMass = -1`, "batchMass", "negative"},
		{"plan", `a.heatCapacity = 0`, "heatCapacity", "above 0"},
		{"plan", `a.riseLimit = 0`, "riseLimit", "above 0"},
		{"plan", `a.jcr = [[0.7, 0.1], [0.9, 0.2]]`, "jcr", "between 3 and 4096"},
		{"plan", `a.jcr[3] = [-0.1, 0.2]`, "jcr[3][0]", "negative"},
		{"plan", `a.jcr[0] = [0.7, "0.1"]`, "jcr[0][1]", "must be a number"},
		{"plan", `a.jcr[1] = [0.7]`, "jcr[1]", "pair [r1, r2]"},
		{"plan", `a.jcr = new Array(4097).fill([0.5, 0.5])`, "jcr", "at most 4096"},
		{"plan", `a.jcr = [[0.7, 0.1], [0.8, 0.1], [0.9, 0.1]]`, "jcr", "no area"},
		{"plan", `a.samples = 5`, "samples", "between 10 and 5000"},
		{"plan", `a.samples = 5001`, "samples", "between 1 and 5000"},
		{"plan", `a.seed = -1`, "seed", "between 0 and"},

		{"starvedFeed", `a.feedRate = 0`, "feedRate", "positive"},
		{"starvedFeed", `a.feedRate = "5 g/min"`, "feedRate", "must be a number"},
		{"starvedFeed", `delete a.rateConstant`, "rateConstant", "missing"},
		{"starvedFeed", `a.rateConstant = NaN`, "rateConstant", "finite"},
		{"starvedFeed", `a.targetF1 = 1.2`, "targetF1", "between 0 and 1"},
		{"starvedFeed", `a.molarMass1 = -1`, "molarMass1", "positive"},

		// The bench table, read by the project file's reader (its errors are project.Parse's,
		// tested in copoly/project); the JS path names the field.
		{"benchRuns", `delete a.bench`, "bench", "missing"},
		{"benchRuns", `a.bench = []`, "bench", "an object"},
		{"benchRuns", `delete a.bench.rows`, "bench.rows", "missing"},
		{"benchRuns", `a.bench.rows = {0: {}}`, "bench.rows", "a list of objects"},
		{"benchRuns", `a.bench.rows[2] = 5`, "bench.rows[2]", "an object"},
		{"benchRuns", `a.bench.rows[2] = null`, "bench.rows[2]", "an object"},
		{"benchRuns", `a.bench.rows = new Array(1001).fill({cells: {}})`, "bench.rows", "at most 1000"},
		{"benchRuns", `a.bench.rows[0].cells = ["0.5"]`, "bench.rows[0].cells", "an object of texts"},
		{"benchRuns", `a.bench.rows[0].cells.f10 = 0.5`, "bench.rows[0].cells.f10", "must be text"},
		{"benchRuns", `a.bench.rows[3].cells.density = "0.9"`, "bench.rows[3].cells", `"density"`},
		{"benchRuns", `Object.defineProperty(a.bench.rows[0].cells, "__proto__", {value: "x", enumerable: true})`, "bench.rows[0].cells", `"__proto__"`},
		{"benchRuns", `a.bench.rows[4].cells.F1 = "1".repeat(201)`, "bench.rows[4].cells.F1", "the limit is 200"},
		{"benchRuns", `for (let k = 0; k < 65; k++) a.bench.rows[0].cells["k" + k] = ""`, "bench.rows[0].cells", "at most 64"},
		{"benchRuns", `a.bench.rows[0].label = "x".repeat(201)`, "bench.rows[0].label", "the limit is 200"},
		{"benchRuns", `a.bench.rows[0].label = 7`, "bench.rows[0].label", "must be text"},
		{"benchRuns", `a.bench.feedKind = "volume"`, "bench.feedKind", `"volume"`},
		{"benchRuns", `a.bench.compositionKind = 1`, "bench.compositionKind", "must be text"},
		{"benchRuns", `a.bench.carrier = 1.5`, "bench.carrier", "must be a whole number, not the number 1.5"},
		{"benchRuns", `a.bench.carrier = 3`, "bench.carrier", "1 or 2"},
		{"benchRuns", `a.bench.elementCount = NaN`, "bench.elementCount", "finite"},
		{"benchRuns", `a.molarMass1 = -5`, "molarMass1", "positive"},
		{"benchRuns", `a.molarMass2 = "128"`, "molarMass2", "must be a number"},

		// Projects (the schema's errors are project.Parse's, tested in copoly/project).
		{"checkProject", `delete a.project`, "project", "missing"},
		{"checkProject", `a.project = []`, "project", "an object"},
		{"exportProject", `a.project = "{}"`, "project", "an object"},
		{"importProject", `delete a.json`, "json", "missing"},
		{"importProject", `a.json = {}`, "json", "must be text"},
		{"importProject", `a.json = '{"format":"copoly-project","version":1,'`, "project", "not valid JSON"},
		{"importProject", `a.json = '{"name":"x"}'`, "project", "not a copoly project file"},
		{"importProject", `a.json = '{"format":"copoly-project","version":2}'`, "project.version", "made by a newer copoly"},
	}...)
	for _, c := range cases {
		t.Run(c.method+" "+c.edit, func(t *testing.T) {
			wantError(t, call(api, c.method, edited(goodJS[c.method], models+c.edit)), c.field, c.text)
		})
	}
}
