//go:build js && wasm

package main

import (
	"context"
	"errors"
	"io"
	"io/fs"
	"strings"
	"syscall/js"
	"testing"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/mem"

	"copoly/copoly"
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
		// What JSON would lose or refuse is reported by field before the text is made.
		{"r1 infinite", "p.r1 = Infinity", "project.r1", "+Inf"},
		{"a cell NaN", "p.bench.rows[0].cells.F1 = NaN", "project.bench.rows[0].cells.F1", "NaN"},
		{"name a function", "p.name = () => 'x'", "project.name", "a function cannot be kept in a project file"},
		{"notes a symbol", "p.notes = Symbol('n')", "project.notes", "a symbol"},
		{"level a BigInt", "p.level = 1n", "project.level", "unsupported kind"},
		{"a model that refers to itself", "p.model.self = p.model", "project.model" + strings.Repeat(".self", 63), "nested more than 64 levels"},
		{"a getter that throws", "Object.defineProperty(p, 'notes', {get() { throw new Error('no notes') }, enumerable: true})", "project.notes", "no notes"},
		{"a text too long for any file", "p.ratioSource = 'x'.repeat(2 ** 21)", "project.ratioSource", "2097152 characters"},
		{"a grid too large for a file", "p.bench.rows = Array.from({length: 1000}, () => ({label: 'x'.repeat(200), cells: Object.fromEntries(['f10', 'F1', 'sF', 'sf', 'conversion'].map((k) => [k, '9'.repeat(200)]))}))", "project.bench.rows", "holds 1000 entries"},
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
	if want := `{"project":null,"storage":"indexeddb","revision":{"n":0,"writer":""},"kept":[]}`; stringify(r) != want {
		t.Errorf("loadProject() on empty storage = %s, want %s", stringify(r), want)
	}

	s := await(t, call(api, "saveProject", demo))
	wantNoError(t, s)
	// fixedNow above, RFC 3339; the first save is revision 1.
	if !s.Get("saved").Bool() || s.Get("storage").String() != "indexeddb" || s.Get("savedAt").String() != "2026-05-06T07:08:09Z" ||
		s.Get("revision").Get("n").Int() != 1 || s.Get("revision").Get("writer").String() == "" || !s.Get("conflict").IsUndefined() {
		t.Errorf("saveProject(demo) = %s", stringify(s))
	}
	rev1 := s.Get("revision")
	r = await(t, call(api, "loadProject", map[string]any{}))
	wantNoError(t, r)
	loaded := r.Get("project")
	if loaded.Get("savedAt").String() != "2026-05-06T07:08:09Z" || loaded.Get("name").String() != demo.Get("project").Get("name").String() || stringify(r.Get("revision")) != stringify(rev1) {
		t.Errorf("loadProject() after a save = %s", stringify(r))
	}

	// A refused save leaves the stored project alone.
	bad := jsEval(`((d) => { const p = structuredClone(d.project); p.r1 = -1; return {project: p}; })`).Invoke(demo)
	wantError(t, await(t, call(api, "saveProject", bad)), "project.r1", "negative")
	if got := await(t, call(api, "loadProject")); stringify(got) != stringify(r) {
		t.Errorf("after a refused save loadProject() = %s, want %s", stringify(got), stringify(r))
	}

	// A second save on the first keeps it as the previous copy; a damaged current copy then
	// falls back to it, says so, and keeps the damaged bytes for download.
	second := jsEval(`((d, rev) => { const p = structuredClone(d.project); p.r1 = 0.75; return {project: p, basedOn: rev}; })`).Invoke(demo, rev1)
	s2 := await(t, call(api, "saveProject", second))
	if wantNoError(t, s2); !s2.Get("saved").Bool() || s2.Get("revision").Get("n").Int() != 2 {
		t.Fatalf("second saveProject() = %s", stringify(s2))
	}
	const cut = `{"format":"copoly-pro`
	if err := hackpadfs.WriteFullFile(m, project.CurrentPath, []byte(cut), 0o600); err != nil {
		t.Fatal(err)
	}
	r = await(t, call(api, "loadProject"))
	wantNoError(t, r)
	if r.Get("project").Get("r1").Float() != 0.8 || r.Get("message").String() != project.RestoredMessage || !r.Get("damaged").Bool() ||
		stringify(r.Get("revision")) != stringify(rev1) || r.Get("kept").Length() != 1 {
		t.Errorf("loadProject() with a damaged current copy = %s, want the first save (r1 0.8), %q and one kept copy", stringify(r), project.RestoredMessage)
	}
	k := r.Get("kept").Index(0)
	if k.Get("kind").String() != project.KindDamaged || k.Get("size").Int() != len(cut) {
		t.Errorf("kept copy = %s", stringify(k))
	}
	c := await(t, call(api, "keptCopy", map[string]any{"name": k.Get("name")}))
	wantNoError(t, c)
	if got := js.Global().Get("TextDecoder").New().Call("decode", c.Get("bytes")).String(); got != cut || c.Get("filename").String() != "copoly-"+k.Get("name").String() || !c.Get("project").IsUndefined() {
		t.Errorf("keptCopy() = %s with bytes %q, want %q", stringify(c), got, cut)
	}

	// Both copies damaged: no project, a message, both kept; never an error or a crash.
	if err := hackpadfs.WriteFullFile(m, project.PreviousPath, []byte(`[]`), 0o600); err != nil {
		t.Fatal(err)
	}
	r = await(t, call(api, "loadProject"))
	wantNoError(t, r)
	if !r.Get("project").IsNull() || r.Get("message").String() != project.LostMessage || r.Get("kept").Length() != 2 || r.Get("revision").Get("n").Int() != 0 {
		t.Errorf("loadProject() with both copies damaged = %s", stringify(r))
	}
	// The page starts from the demo and saves it: both damaged copies stay kept.
	wantNoError(t, await(t, call(api, "saveProject", demo)))
	r = await(t, call(api, "loadProject"))
	if r.Get("project").Get("r1").Float() != 0.8 || r.Get("kept").Length() != 2 || !r.Get("message").IsUndefined() {
		t.Errorf("loadProject() after saving over damaged copies = %s", stringify(r))
	}
	for i := range r.Get("kept").Length() {
		name := r.Get("kept").Index(i).Get("name")
		wantNoError(t, await(t, call(api, "dropKept", map[string]any{"name": name})))
		wantError(t, await(t, call(api, "keptCopy", map[string]any{"name": name})), "name", "no kept copy")
	}
	wantError(t, await(t, call(api, "dropKept", map[string]any{"name": "../current.json"})), "name", "no kept copy")
	wantError(t, await(t, call(api, "keptCopy", map[string]any{"name": 3})), "name", "must be text")
}

// Two pages (tabs) with their own storage on one file system: the later save on an old
// revision is kept aside as a conflict copy, and the page can then replace or keep.
func TestConflict(t *testing.T) {
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	page := func(writer string) js.Value {
		st := newStorage()
		st.open, st.now, st.writer = memOpener(m), func() time.Time { return fixedNow }, writer
		return newAPI(st)
	}
	a, b := page("tabA"), page("tabB")
	demo := demoArg(t, a)
	edit := func(js string, base js.Value) js.Value {
		return jsEval(`((d, base) => { const p = structuredClone(d.project); `+js+`; return {project: p, basedOn: base}; })`).Invoke(demo, base)
	}
	baseA := await(t, call(a, "loadProject")).Get("revision")
	baseB := await(t, call(b, "loadProject")).Get("revision")

	sa := await(t, call(a, "saveProject", edit("p.r1 = 0.61", baseA)))
	wantNoError(t, sa)
	sb := await(t, call(b, "saveProject", edit("p.r2 = 0.33", baseB)))
	wantNoError(t, sb)
	if sb.Get("saved").Bool() || sb.Get("conflict").IsUndefined() {
		t.Fatalf("second tab's saveProject() on an old base = %s, want a conflict", stringify(sb))
	}
	other := sb.Get("conflict")
	if other.Get("project").Get("r1").Float() != 0.61 || stringify(other.Get("revision")) != stringify(sa.Get("revision")) {
		t.Errorf("conflict = %s, want the first tab's project and revision %s", stringify(other), stringify(sa.Get("revision")))
	}
	kept := sb.Get("kept")
	if kept.Get("kind").String() != project.KindConflict || kept.Get("name").String() != "conflict-tabB.json" {
		t.Errorf("kept = %s", stringify(kept))
	}
	// The stored project is the first tab's; the second tab's is in the kept copy, whole.
	if r := await(t, call(b, "loadProject")); r.Get("project").Get("r1").Float() != 0.61 || r.Get("project").Get("r2").Float() != 0.15 || r.Get("kept").Length() != 1 {
		t.Errorf("loadProject() after the conflict = %s", stringify(r))
	}
	c := await(t, call(b, "keptCopy", map[string]any{"name": kept.Get("name")}))
	wantNoError(t, c)
	if c.Get("project").Get("r2").Float() != 0.33 || c.Get("copy").Get("kind").String() != project.KindConflict {
		t.Errorf("keptCopy(conflict) = %s", stringify(c))
	}

	// "Keep this tab's version": a save on the other revision replaces it.
	keep := await(t, call(b, "saveProject", edit("p.r2 = 0.33", other.Get("revision"))))
	wantNoError(t, keep)
	if !keep.Get("saved").Bool() || keep.Get("revision").Get("writer").String() != "tabB" || keep.Get("revision").Get("n").Int() != 2 {
		t.Fatalf("saveProject() on the other revision = %s", stringify(keep))
	}
	wantNoError(t, await(t, call(b, "dropKept", map[string]any{"name": kept.Get("name")})))
	// The first tab's next save, on its own old revision, conflicts in turn.
	sa2 := await(t, call(a, "saveProject", edit("p.r1 = 0.62", sa.Get("revision"))))
	if sa2.Get("saved").Bool() || sa2.Get("conflict").Get("project").Get("r2").Float() != 0.33 {
		t.Errorf("first tab's save after the second replaced it = %s, want a conflict", stringify(sa2))
	}

	for _, tt := range []struct{ name, base, field, text string }{
		{"count fractional", `{n: 1.5, writer: "x"}`, "basedOn.n", "whole number"},
		{"count negative", `{n: -1, writer: "x"}`, "basedOn.n", "whole number"},
		{"count text", `{n: "1", writer: "x"}`, "basedOn.n", "must be a number"},
		{"writer missing", `{n: 1}`, "basedOn.writer", "letters, digits"},
		{"writer a path", `{n: 1, writer: "../x"}`, "basedOn.writer", "only letters"},
		{"not an object", `7`, "basedOn", "an object"},
	} {
		t.Run(tt.name, func(t *testing.T) {
			arg := jsEval(`((d) => ({project: d.project, basedOn: ` + tt.base + `}))`).Invoke(demo)
			wantError(t, await(t, call(a, "saveProject", arg)), tt.field, tt.text)
		})
	}
}

func TestDraft(t *testing.T) {
	api, _ := testAPI(t)
	fields := map[string]any{"r1": "0,4", "r2": "-0.0x", "notes": "half a sentence"}
	d := await(t, call(api, "saveDraft", map[string]any{"tab": "t1", "fields": fields}))
	wantNoError(t, d)
	// fixedNow above with milliseconds.
	if !d.Get("saved").Bool() || d.Get("savedAt").String() != "2026-05-06T07:08:09.000Z" {
		t.Errorf("saveDraft() = %s", stringify(d))
	}
	r := await(t, call(api, "loadProject", map[string]any{"tab": "t1"}))
	wantNoError(t, r)
	if got := r.Get("draft"); got.IsUndefined() || got.Get("fields").Get("r2").String() != "-0.0x" || got.Get("fields").Get("notes").String() != "half a sentence" {
		t.Errorf("loadProject({tab}) = %s, want the draft as typed", stringify(r))
	}
	for _, arg := range []map[string]any{{}, {"tab": "t2"}} {
		if r := await(t, call(api, "loadProject", arg)); !r.Get("draft").IsUndefined() {
			t.Errorf("loadProject(%v) = %s, want no draft", arg, stringify(r))
		}
	}
	// The page's own copy of its draft (written at once when the page is left) wins when it is
	// later than the stored one, and is ignored when it does not read.
	later := map[string]any{"savedAt": "2026-05-06T07:08:09.500Z", "basedOn": map[string]any{"n": 0, "writer": ""}, "fields": map[string]any{"r2": "-0.04"}}
	earlier := map[string]any{"savedAt": "2026-05-06T07:08:08.500Z", "fields": map[string]any{"r2": "0.0"}}
	for _, tt := range []struct {
		name  string
		draft any
		want  string
	}{
		{"later copy", later, "-0.04"},
		{"earlier copy", earlier, "-0.0x"},
		{"copy without fields key", map[string]any{"savedAt": "2026-05-06T07:08:09.500Z"}, "-0.0x"},
		{"copy with a bad time", map[string]any{"savedAt": "now", "fields": map[string]any{}}, "-0.0x"},
		{"copy not an object", "typed", "-0.0x"},
	} {
		r := await(t, call(api, "loadProject", map[string]any{"tab": "t1", "draft": tt.draft}))
		wantNoError(t, r)
		if got := r.Get("draft").Get("fields").Get("r2").String(); got != tt.want {
			t.Errorf("%s: loadProject({tab, draft}) = %s, want r2 %q", tt.name, stringify(r), tt.want)
		}
	}
	// A later copy with no fields (the page dropped its draft) outranks the stored draft.
	r = await(t, call(api, "loadProject", map[string]any{"tab": "t1", "draft": map[string]any{"savedAt": "2026-05-06T07:08:09.500Z", "fields": map[string]any{}}}))
	if d := r.Get("draft"); d.IsUndefined() || stringify(d.Get("fields")) != "{}" {
		t.Errorf("loadProject() with a later empty copy = %s, want a draft with no fields", stringify(r))
	}
	wantNoError(t, await(t, call(api, "dropDraft", map[string]any{"tab": "t1"})))
	if r := await(t, call(api, "loadProject", map[string]any{"tab": "t1"})); !r.Get("draft").IsUndefined() {
		t.Errorf("loadProject() after dropDraft() = %s", stringify(r))
	}

	for _, tt := range []struct{ name, arg, field, text string }{
		{"tab missing", `{fields: {}}`, "tab", "missing"},
		{"tab a path", `{tab: "a/b", fields: {}}`, "tab", "only letters"},
		{"fields missing", `{tab: "t"}`, "fields", "missing"},
		{"field not text", `{tab: "t", fields: {r1: 0.4}}`, "fields.r1", "must be text"},
		{"field name with a space", `{tab: "t", fields: {"r 1": "x"}}`, "fields.r 1", "only letters"},
		{"too many fields", `{tab: "t", fields: Object.fromEntries(Array.from({length: 201}, (_, i) => ["f" + i, ""]))}`, "fields", "at most 200"},
		{"base fractional", `{tab: "t", fields: {}, basedOn: {n: 0.5, writer: "w"}}`, "basedOn.n", "whole number"},
	} {
		t.Run(tt.name, func(t *testing.T) {
			wantError(t, await(t, call(api, "saveDraft", jsEval(tt.arg))), tt.field, tt.text)
		})
	}
	wantError(t, await(t, call(api, "loadProject", map[string]any{"tab": "a b"})), "tab", "only letters")
	wantError(t, await(t, call(api, "dropDraft", map[string]any{})), "tab", "missing")
}

// fullFS is an in-memory file system whose writes fail, while full is set, with the error a
// browser gives when its storage quota is used up; while unseen is set, a new file opened for
// writing takes the bytes written and keeps nothing (as hackpadfs does when a put throws).
type fullFS struct {
	*mem.FS
	full, unseen bool
}

var errFull = errors.New("QuotaExceededError: the quota has been exceeded")

func (f *fullFS) OpenFile(name string, flag int, perm hackpadfs.FileMode) (hackpadfs.File, error) {
	if f.full && flag&(hackpadfs.FlagWriteOnly|hackpadfs.FlagCreate) != 0 {
		return nil, &fs.PathError{Op: "open", Path: name, Err: errFull}
	}
	if f.unseen && flag&hackpadfs.FlagCreate != 0 {
		return nowhere{}, nil
	}
	return f.FS.OpenFile(name, flag, perm)
}

// nowhere is a file that takes every write and keeps nothing.
type nowhere struct{ hackpadfs.File }

func (nowhere) Read([]byte) (int, error)    { return 0, io.EOF }
func (nowhere) Write(p []byte) (int, error) { return len(p), nil }
func (nowhere) Close() error                { return nil }

func (f *fullFS) Rename(oldName, newName string) error {
	if f.full {
		return &fs.PathError{Op: "rename", Path: oldName, Err: errFull}
	}
	return f.FS.Rename(oldName, newName)
}

func TestStorageFull(t *testing.T) {
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	f := &fullFS{FS: m}
	st := newStorage()
	st.open, st.now = func(context.Context) (hackpadfs.FS, error) { return f, nil }, func() time.Time { return fixedNow }
	api := newAPI(st)
	demo := demoArg(t, api)
	first := await(t, call(api, "saveProject", demo))
	wantNoError(t, first)

	f.full = true
	next := jsEval(`((d, base) => { const p = structuredClone(d.project); p.r1 = 0.5; return {project: p, basedOn: base}; })`).Invoke(demo, first.Get("revision"))
	full := await(t, call(api, "saveProject", next))
	wantError(t, full, "storage", fullMessage)
	wantCode(t, full, copoly.CodeStorageFull)
	wantError(t, await(t, call(api, "saveDraft", map[string]any{"tab": "t", "fields": map[string]any{"r1": "0.5"}})), "storage", fullMessage)
	// The last good project is still stored.
	if r := await(t, call(api, "loadProject")); r.Get("project").Get("r1").Float() != 0.8 || !r.Get("message").IsUndefined() {
		t.Errorf("loadProject() after a failed save = %s, want the first save (r1 0.8)", stringify(r))
	}
	// A write the file system reports done but that does not read back is named too.
	f.full, f.unseen = false, true
	unseen := await(t, call(api, "saveProject", next))
	wantError(t, unseen, "storage", notStoredMessage)
	wantCode(t, unseen, copoly.CodeNotStored)
	if r := await(t, call(api, "loadProject")); r.Get("project").Get("r1").Float() != 0.8 {
		t.Errorf("loadProject() after an unseen failed save = %s, want the first save (r1 0.8)", stringify(r))
	}
	// Room again: the same save (the page's retry on the next change) goes through.
	f.unseen = false
	f.full = false
	if s := await(t, call(api, "saveProject", next)); !s.Get("saved").Bool() || s.Get("revision").Get("n").Int() != 2 {
		t.Errorf("saveProject() once there is room = %s", stringify(s))
	}
	if r := await(t, call(api, "loadProject")); r.Get("project").Get("r1").Float() != 0.5 {
		t.Errorf("loadProject() after the retry = %s", stringify(r))
	}
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
	none := await(t, call(api, "saveProject", demoArg(t, api)))
	wantError(t, none, "storage", "browser storage is unavailable")
	wantCode(t, none, copoly.CodeUnavailable)
	wantError(t, await(t, call(api, "saveDraft", map[string]any{"tab": "t", "fields": map[string]any{}})), "storage", "browser storage is unavailable")
	// Without storage the page's own copy of its draft still comes back.
	r = await(t, call(api, "loadProject", map[string]any{"tab": "t", "draft": map[string]any{"savedAt": "2026-05-06T07:08:09.500Z", "fields": map[string]any{"r1": "0.4x"}}}))
	if r.Get("draft").Get("fields").Get("r1").String() != "0.4x" {
		t.Errorf("loadProject({tab, draft}) without storage = %s, want the draft back", stringify(r))
	}
	// Asked again, the answer is the same (the failure is remembered, not retried).
	if r2 := await(t, call(api, "loadProject")); r2.Get("storage").String() != "unavailable" {
		t.Errorf("second loadProject() = %s", stringify(r2))
	}

	// A page where reading indexedDB throws (a browser that denies storage): unavailable, and
	// the module keeps answering.
	js.Global().Get("Object").Call("defineProperty", js.Global(), "indexedDB", jsEval(`{configurable: true, get() { throw new DOMException("denied by the test", "SecurityError"); }}`))
	defer js.Global().Call("eval", "delete globalThis.indexedDB")
	api = newAPI(newStorage())
	r = await(t, call(api, "loadProject"))
	wantNoError(t, r)
	if r.Get("storage").String() != "unavailable" || !strings.Contains(r.Get("message").String(), "denied by the test") {
		t.Errorf("loadProject() with a throwing indexedDB = %s", stringify(r))
	}
	wantNoError(t, call(api, "demoProject"))
}

func TestStorageOpenFailure(t *testing.T) {
	// An opener that fails (a blocked database, a timeout) gives "unavailable" too, and is
	// tried again once retryOpen has passed.
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	fail, opens := true, 0
	now := fixedNow
	st := newStorage()
	st.now = func() time.Time { return now }
	st.open = func(ctx context.Context) (hackpadfs.FS, error) {
		opens++
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
	// Within retryOpen the failure stands without a new attempt.
	now = now.Add(retryOpen / 2)
	if r := await(t, call(api, "loadProject")); r.Get("storage").String() != "unavailable" || opens != 1 {
		t.Errorf("loadProject() soon after a failed open = %s after %d opens, want unavailable after 1", stringify(r), opens)
	}
	now = now.Add(retryOpen)
	if r := await(t, call(api, "loadProject")); r.Get("storage").String() != "indexeddb" || opens != 2 {
		t.Errorf("loadProject() once the open works = %s after %d opens", stringify(r), opens)
	}
}

// wantCode checks the code of a CopolyError.
func wantCode(t *testing.T, v js.Value, code string) {
	t.Helper()
	if got := v.Get("code").String(); got != code {
		t.Errorf("code = %q, want %q (error %q)", got, code, v.Get("error").String())
	}
}
