//go:build js && wasm

package main

import (
	"context"
	"errors"
	"strings"
	"syscall/js"
	"testing"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/mem"

	"copoly/copoly/project"
)

// fixedNow is the time stamped on saves in these tests; any instant would do.
var fixedNow = time.Date(2026, 5, 6, 7, 8, 9, 0, time.UTC)

func memOpener(m *mem.FS) func(context.Context) (hackpadfs.FS, error) {
	return func(context.Context) (hackpadfs.FS, error) { return m, nil }
}

func demoArg(t *testing.T, api js.Value) js.Value {
	t.Helper()
	d := call(api, "demoProject")
	wantNoError(t, d)
	return d
}

func TestProjects(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	p := demo.Get("project")
	// The demo is marked invented (project rules); it has never been saved.
	if !p.Get("invented").Bool() || !strings.Contains(p.Get("name").String(), "invented") {
		t.Errorf("demo project %s is not marked invented", stringify(p))
	}
	if !p.Get("savedAt").IsUndefined() {
		t.Errorf("demo savedAt = %s, want absent", stringify(p.Get("savedAt")))
	}

	checked := call(api, "checkProject", demo)
	wantNoError(t, checked)
	if stringify(checked) != stringify(demo) {
		t.Errorf("checkProject(demo) = %s, want %s", stringify(checked), stringify(demo))
	}

	exp := call(api, "exportProject", demo)
	wantNoError(t, exp)
	// Name rule of project.Filename.
	if got := exp.Get("filename").String(); got != project.Filename(project.Demo().Name) || !strings.HasSuffix(got, ".copoly.json") {
		t.Errorf("filename = %q", got)
	}
	imp := call(api, "importProject", map[string]any{"json": exp.Get("json").String()})
	wantNoError(t, imp)
	if stringify(imp) != stringify(demo) {
		t.Errorf("importProject(exportProject(demo)) = %s, want %s", stringify(imp), stringify(demo))
	}

	// Invalid projects name the field.
	for _, c := range []struct {
		name, edit, field, text string
	}{
		{"molar mass negative", "p.monomer1.molarMass = -1", "project.monomer1.molarMass", "positive"},
		{"molar mass text", "p.monomer2.molarMass = '128'", "project.monomer2.molarMass", "must be a number"},
		{"r1 missing", "delete p.r1", "project.r1", "missing"},
		{"r2 NaN", "p.r2 = NaN", "project.r2", "not a number"},
		{"f10 one", "p.f10 = 1", "project.f10", "both monomers"},
		{"version fractional", "p.version = 1.5", "project.version", "whole number"},
		{"version newer", "p.version = 2", "project.version", "made by a newer copoly"},
		{"format other", "p.format = 'x'", "project.format", "not a copoly project"},
		{"monomer1 missing", "delete p.monomer1", "project.monomer1", "missing"},
		{"name too long", "p.name = 'x'.repeat(201)", "project.name", "the limit is 200"},
		{"notes not text", "p.notes = 5", "project.notes", "must be text"},
		{"invented not boolean", "p.invented = 'yes'", "project.invented", "true or false"},
	} {
		t.Run(c.name, func(t *testing.T) {
			arg := jsEval(`((d) => { const p = structuredClone(d.project); ` + c.edit + `; return {project: p}; })`).Invoke(demo)
			for _, method := range []string{"checkProject", "exportProject"} {
				wantError(t, call(api, method, arg), c.field, c.text)
			}
			wantError(t, await(t, call(api, "saveProject", arg)), c.field, c.text)
		})
	}
}

func TestSaveLoad(t *testing.T) {
	api, m := testAPI(t)
	demo := demoArg(t, api)

	r := await(t, call(api, "loadProject"))
	wantNoError(t, r)
	if !r.Get("project").IsNull() || r.Get("storage").String() != "indexeddb" || !r.Get("message").IsUndefined() {
		t.Errorf("loadProject() on empty storage = %s, want {project: null, storage: \"indexeddb\"}", stringify(r))
	}

	s := await(t, call(api, "saveProject", demo))
	wantNoError(t, s)
	// fixedNow above, RFC 3339.
	if !s.Get("saved").Bool() || s.Get("storage").String() != "indexeddb" || s.Get("savedAt").String() != "2026-05-06T07:08:09Z" {
		t.Errorf("saveProject(demo) = %s", stringify(s))
	}
	r = await(t, call(api, "loadProject", map[string]any{}))
	wantNoError(t, r)
	loaded := r.Get("project")
	if loaded.Get("savedAt").String() != "2026-05-06T07:08:09Z" || loaded.Get("name").String() != demo.Get("project").Get("name").String() {
		t.Errorf("loadProject() after a save = %s", stringify(r))
	}

	// A refused save leaves the stored project alone.
	bad := jsEval(`((d) => { const p = structuredClone(d.project); p.r1 = -1; return {project: p}; })`).Invoke(demo)
	wantError(t, await(t, call(api, "saveProject", bad)), "project.r1", "negative")
	if got := await(t, call(api, "loadProject")); stringify(got) != stringify(r) {
		t.Errorf("after a refused save loadProject() = %s, want %s", stringify(got), stringify(r))
	}

	// A second save keeps the first as the previous copy; a damaged current copy then falls back.
	second := jsEval(`((d) => { const p = structuredClone(d.project); p.r1 = 0.75; return {project: p}; })`).Invoke(demo)
	wantNoError(t, await(t, call(api, "saveProject", second)))
	if err := hackpadfs.WriteFullFile(m, project.CurrentPath, []byte(`{"format":"copoly-pro`), 0o600); err != nil {
		t.Fatal(err)
	}
	r = await(t, call(api, "loadProject"))
	wantNoError(t, r)
	if r.Get("project").Get("r1").Float() != 0.8 || r.Get("message").String() != project.RestoredMessage {
		t.Errorf("loadProject() with a damaged current copy = %s, want the first save (r1 0.8) and %q", stringify(r), project.RestoredMessage)
	}

	// Both copies damaged: an error naming storage, never a crash.
	if err := hackpadfs.WriteFullFile(m, project.PreviousPath, []byte(`[]`), 0o600); err != nil {
		t.Fatal(err)
	}
	wantError(t, await(t, call(api, "loadProject")), "storage", "damaged")
}

func TestStorageUnavailable(t *testing.T) {
	// Node has no IndexedDB: the real opener must report that at once, without hanging.
	if js.Global().Get("indexedDB").Truthy() {
		t.Skip("this JS environment has IndexedDB")
	}
	api := newAPI(newStorage())
	r := await(t, call(api, "loadProject"))
	wantNoError(t, r)
	if !r.Get("project").IsNull() || r.Get("storage").String() != "unavailable" || !strings.Contains(r.Get("message").String(), "unavailable") {
		t.Errorf("loadProject() without IndexedDB = %s, want {project: null, storage: \"unavailable\", message}", stringify(r))
	}
	wantError(t, await(t, call(api, "saveProject", demoArg(t, api))), "storage", "browser storage unavailable")
	// Asked again, the answer is the same (the failure is remembered, not retried).
	if r2 := await(t, call(api, "loadProject")); r2.Get("storage").String() != "unavailable" {
		t.Errorf("second loadProject() = %s", stringify(r2))
	}
}

func TestStorageOpenFailure(t *testing.T) {
	// An opener that fails (a blocked database, a timeout) gives "unavailable" too, and is
	// tried again on the next call.
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	fail := true
	st := newStorage()
	st.open = func(ctx context.Context) (hackpadfs.FS, error) {
		if _, ok := ctx.Deadline(); !ok {
			t.Error("storage opened without a deadline")
		}
		if fail {
			return nil, errors.New("blocked")
		}
		return m, nil
	}
	api := newAPI(st)
	if r := await(t, call(api, "loadProject")); r.Get("storage").String() != "unavailable" || !strings.Contains(r.Get("message").String(), "blocked") {
		t.Errorf("loadProject() with a failing open = %s", stringify(r))
	}
	fail = false
	if r := await(t, call(api, "loadProject")); r.Get("storage").String() != "indexeddb" {
		t.Errorf("loadProject() once the open works = %s", stringify(r))
	}
}
