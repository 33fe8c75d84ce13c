//go:build js && wasm

package main

import (
	"math"
	"syscall/js"
	"testing"

	"copoly/copoly/project"
)

// TestProjectWithBench round-trips a project with an edited bench table, a level and a region
// through checkProject, exportProject, importProject and storage. (The schema's errors are
// project.Parse's, tested in copoly/project and swept in badinput_test.go.)
func TestProjectWithBench(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	arg := jsEval(`((d) => { const p = structuredClone(d.project);
		p.bench.rows[1].cells.F1 = "0,418 (re-run?)";
		p.bench.rows.push({label: "HL-09 (invented) \"quoted\"", cells: {f10: "35 %", integral1: "1e3"}});
		p.level = 0.9;
		p.jcr = [[0.71, 0.15], [0.8, 0.136], [0.895, 0.16], [0.8, 0.185]];
		const model = p.model; delete p.model; p.model = model;   // keys in the order of the d.ts
		const plan = p.plan; delete p.plan; p.plan = plan;
		return {project: p}; })`).Invoke(demo)

	exported := checkedExport(t, api, arg)
	imp := call(api, "importProject", map[string]any{"json": exported})
	wantNoError(t, imp)
	if stringify(imp) != stringify(arg) {
		t.Errorf("importProject(exportProject(p)) = %s, want %s", stringify(imp), stringify(arg))
	}
	// The same through storage.
	wantNoError(t, await(t, call(api, "saveProject", arg)))
	loaded := await(t, call(api, "loadProject"))
	wantNoError(t, loaded)
	if got := loaded.Get("project"); stringify(got.Get("bench")) != stringify(arg.Get("project").Get("bench")) || stringify(got.Get("jcr")) != stringify(arg.Get("project").Get("jcr")) {
		t.Errorf("loadProject() after a save = %s", stringify(got))
	}

	// Empty optional keys are normalised away, as in the file.
	bare := edited(arg, `delete a.project.bench; a.project.level = 0; a.project.jcr = []`)
	r := call(api, "checkProject", bare)
	wantNoError(t, r)
	for _, k := range []string{"bench", "level", "jcr"} {
		if !r.Get("project").Get(k).IsUndefined() {
			t.Errorf("checkProject() with an empty %s gives %s, want it absent", k, stringify(r.Get("project").Get(k)))
		}
	}
}

// TestProjectWithPlan round-trips a project with a plan section through checkProject,
// exportProject, importProject and storage, and runs the demo project's plan settings through
// plan as the page does.
func TestProjectWithPlan(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	dp := project.Demo().Plan
	pl := demo.Get("project").Get("plan")
	if pl.Type() != js.TypeObject {
		t.Fatalf("demo project plan = %s, want an object", stringify(pl))
	}
	if got, want := stringify(pl), mustJSON(t, *dp); got != want {
		t.Errorf("demo plan = %s, want %s", got, want)
	}
	// The demo plan through plan, as the page calls it.
	r := call(api, "plan", jsEval(`((d) => { const p = d.project;
		return Object.assign({r1: p.r1, r2: p.r2, monomer1: p.monomer1.name, monomer2: p.monomer2.name,
			molarMass1: p.monomer1.molarMass, molarMass2: p.monomer2.molarMass}, p.plan); })`).Invoke(demo))
	wantNoError(t, r)
	if got := r.Get("schedule").Index(r.Get("schedule").Length() - 1).Get("polymer").Float(); math.Abs(got-dp.PolymerMass) > 1e-6*dp.PolymerMass {
		t.Errorf("demo plan ends with %v g of polymer, want the %v g asked for", got, dp.PolymerMass)
	}
	if r.Get("safety").Get("rise").IsNull() {
		t.Errorf("demo plan safety = %s, want a rise from the library heats", stringify(r.Get("safety")))
	}

	arg := jsEval(`((d) => { const p = structuredClone(d.project);
		p.plan = {mode: "shots", targetF1: 0.35, polymerMass: 12.5, tolerance: 0.01, stopConversion: 0.4,
			finalConversion: 0.9, feed: "mixture", feedF1: 0.55, shots: 9, rateLaw: "table", rateConstant: 0.004,
			halfLife: 170, timeTable: [[0, 0], [12.5, 0.05], [40, 0.3]], heat1: 69.9, heat2: 1000,
			batchMass: 40, heatCapacity: 1.9, riseLimit: 20};
		return {project: p}; })`).Invoke(demo)
	exported := checkedExport(t, api, arg)
	imp := call(api, "importProject", map[string]any{"json": exported})
	wantNoError(t, imp)
	if stringify(imp) != stringify(arg) {
		t.Errorf("importProject(exportProject(p)) = %s, want %s", stringify(imp), stringify(arg))
	}
	wantNoError(t, await(t, call(api, "saveProject", arg)))
	loaded := await(t, call(api, "loadProject"))
	wantNoError(t, loaded)
	if got, want := stringify(loaded.Get("project").Get("plan")), stringify(arg.Get("project").Get("plan")); got != want {
		t.Errorf("loadProject() plan after a save = %s, want %s", got, want)
	}

	// Keys not given (0 or "") are left out, as in the file; no plan stays no plan.
	r = call(api, "checkProject", edited(arg, `a.project.plan = {mode: "", targetF1: 0.4, shots: 0, feed: "", rateLaw: "", timeTable: [], heat1: 0}`))
	wantNoError(t, r)
	if got := stringify(r.Get("project").Get("plan")); got != `{"targetF1":0.4}` {
		t.Errorf("plan with empty keys = %s, want {\"targetF1\":0.4}", got)
	}
	r = call(api, "checkProject", edited(arg, `delete a.project.plan`))
	wantNoError(t, r)
	if !r.Get("project").Get("plan").IsUndefined() {
		t.Errorf("project without a plan gives plan %s, want it absent", stringify(r.Get("project").Get("plan")))
	}
}
