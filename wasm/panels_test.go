//go:build js && wasm

package main

import (
	"testing"

	"copoly/copoly/project"
)

// TestProjectWithPanels round-trips a project with a model, triads and size classes (the
// sequences and chain-size panels; invented values) through checkProject, exportProject,
// importProject and storage, checks the file against project.Parse, and checks that every kind of
// bad entry is refused by name.
func TestProjectWithPanels(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	// The demo's panel starts on the terminal model (project.Demo) with no tables.
	if got := stringify(demo.Get("project").Get("model")); got != `{"kind":"terminal"}` {
		t.Errorf("demo model = %s, want {\"kind\":\"terminal\"}", got)
	}
	for _, k := range []string{"triads", "sizeBins"} {
		if v := demo.Get("project").Get(k); !v.IsUndefined() {
			t.Errorf("demo %s = %s, want it absent", k, stringify(v))
		}
	}

	// Keys in the order of the d.ts: model where the demo has it, then triads and sizeBins
	// before plan.
	arg := edited(demo, `const p = a.project;
		p.model = {kind: "penultimate", r11: 0.9, r21: 0, r22: 0.2, r12: 0.6, s1: 1.5};
		p.triads = [{f10: 0.3, F1: 0.41, A111: 0.12, A112: 0.45, A212: 0.43}, {f10: 0.6, F1: -1, A222: 0}, {f10: 0.5}];
		p.sizeBins = [{low: 5000, high: 15000, weightFraction: 0.5}, {low: 15000, high: 25000, numberFraction: 0.25}, {low: 0, high: 0}];
		const plan = p.plan; delete p.plan; p.plan = plan;`)
	exported := checkedExport(t, api, arg)
	p, err := project.Parse([]byte(exported))
	if err != nil {
		t.Fatalf("project.Parse(exported file) error %v", err)
	}
	// As written in arg above.
	if p.Model == nil || p.Model.Kind != "penultimate" || *p.Model.R21 != 0 || *p.Model.S1 != 1.5 || p.Model.S2 != nil {
		t.Errorf("exported model = %+v", p.Model)
	}
	if len(p.Triads) != 3 || *p.Triads[1].F1 != -1 || *p.Triads[1].A222 != 0 || p.Triads[2].F1 != nil || p.Triads[0].A112 == nil {
		t.Errorf("exported triads = %s", mustJSON(t, p.Triads))
	}
	if want := []project.SizeBin{{Low: 5000, High: 15000, WeightFraction: 0.5}, {Low: 15000, High: 25000, NumberFraction: 0.25}, {}}; mustJSON(t, p.SizeBins) != mustJSON(t, want) {
		t.Errorf("exported sizeBins = %s, want %s", mustJSON(t, p.SizeBins), mustJSON(t, want))
	}
	imp := call(api, "importProject", map[string]any{"json": exported})
	wantNoError(t, imp)
	if got, want := stringify(imp), stringify(arg); got != want {
		t.Errorf("importProject(exportProject(p)) = %s, want %s", got, want)
	}
	wantNoError(t, await(t, call(api, "saveProject", arg)))
	loaded := await(t, call(api, "loadProject"))
	wantNoError(t, loaded)
	for _, k := range []string{"model", "triads", "sizeBins"} {
		if got, want := stringify(loaded.Get("project").Get(k)), stringify(arg.Get("project").Get(k)); got != want {
			t.Errorf("loadProject() %s after a save = %s, want %s", k, got, want)
		}
	}

	// Empty tables and a null model are none.
	bare := call(api, "checkProject", edited(arg, `a.project.model = null; a.project.triads = []; a.project.sizeBins = null`))
	wantNoError(t, bare)
	for _, k := range []string{"model", "triads", "sizeBins"} {
		if v := bare.Get("project").Get(k); !v.IsUndefined() {
			t.Errorf("checkProject() with no %s gives %s, want it absent", k, stringify(v))
		}
	}

	for _, c := range []struct{ name, edit, field, text string }{
		{"model a list", `a.project.model = []`, "project.model", "an object"},
		{"model kind missing", `delete a.project.model.kind`, "project.model.kind", "missing"},
		{"model kind unknown", `a.project.model.kind = "ultimate"`, "project.model.kind", `"ultimate"`},
		{"model kind too long", `a.project.model.kind = "x".repeat(33)`, "project.model.kind", "the limit is 32"},
		{"model r11 negative", `a.project.model.r11 = -1`, "project.model.r11", "negative"},
		{"model s2 text", `a.project.model.s2 = "2"`, "project.model.s2", "must be a number"},
		{"model r12 NaN", `a.project.model.r12 = NaN`, "project.model.r12", "finite"},
		{"triads an object", `a.project.triads = {}`, "project.triads", "a list of objects"},
		{"too many triads", `a.project.triads = new Array(1001).fill({f10: 0.5})`, "project.triads", "at most 1000"},
		{"triad f10 missing", `delete a.project.triads[2].f10`, "project.triads[2].f10", "missing"},
		{"triad f10 above one", `a.project.triads[0].f10 = 30`, "project.triads[0].f10", "between 0 and 1"},
		{"triad above one", `a.project.triads[0].A112 = 45`, "project.triads[0].A112", "not measured"},
		{"triad NaN", `a.project.triads[1].A222 = NaN`, "project.triads[1].A222", "finite"},
		{"size bins too many", `a.project.sizeBins = new Array(10001).fill({low: 1, high: 2})`, "project.sizeBins", "at most 10000"},
		{"size bin low negative", `a.project.sizeBins[1].low = -5`, "project.sizeBins[1].low", "negative"},
		{"size bin high missing", `delete a.project.sizeBins[0].high`, "project.sizeBins[0].high", "missing"},
		{"size bin fraction text", `a.project.sizeBins[0].weightFraction = "50 %"`, "project.sizeBins[0].weightFraction", "must be a number"},
	} {
		t.Run(c.name, func(t *testing.T) {
			bad := edited(arg, c.edit)
			for _, method := range []string{"checkProject", "exportProject"} {
				wantError(t, call(api, method, bad), c.field, c.text)
			}
			wantError(t, await(t, call(api, "saveProject", bad)), c.field, c.text)
		})
	}
}
