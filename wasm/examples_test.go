//go:build js && wasm

package main

import (
	"strings"
	"testing"

	"copoly/copoly/project"
)

// TestExampleProject: exampleProject gives each published example (project.Example) as a
// Project whose citation names the paper and which is never marked invented; it survives
// checkProject and an export/import unchanged, the exported file carries the citation, and a
// bad name is an {error, field: "name"} that lists the examples.
func TestExampleProject(t *testing.T) {
	api, _ := testAPI(t)
	for _, name := range project.ExampleNames() {
		want, err := project.Example(name)
		if err != nil {
			t.Fatal(err)
		}
		r := call(api, "exampleProject", map[string]any{"name": name})
		wantNoError(t, r)
		p := r.Get("project")
		if got := p.Get("citation").String(); got != want.Citation || !strings.Contains(got, "Georgiev") || !strings.Contains(got, "Table 1") {
			t.Errorf("exampleProject(%q).citation = %q, want %q", name, got, want.Citation)
		}
		if !p.Get("invented").IsUndefined() || p.Get("name").String() != want.Name || p.Get("r1").Float() != want.R1 || p.Get("r2").Float() != want.R2 {
			t.Errorf("exampleProject(%q) = %.400s, want %+v without invented", name, stringify(p), want)
		}
		if got := p.Get("bench").Get("rows").Length(); got != len(want.Bench.Rows) || p.Get("bench").Get("conversionKind").String() != "mass" {
			t.Errorf("exampleProject(%q) bench %.300s, want %d rows of mass conversions", name, stringify(p.Get("bench")), len(want.Bench.Rows))
		}
		file := checkedExport(t, api, r)
		if !strings.Contains(file, `"citation": "`+want.Citation+`"`) {
			t.Errorf("exportProject(exampleProject(%q)) does not carry the citation:\n%s", name, file)
		}
		back := call(api, "importProject", map[string]any{"json": file})
		wantNoError(t, back)
		if got, w := stringify(back), stringify(r); got != w {
			t.Errorf("importProject(export) = %s, want %s", got, w)
		}
	}
	// A project without a citation has no citation key, like the file.
	if d := call(api, "demoProject").Get("project"); !d.Get("citation").IsUndefined() {
		t.Errorf("demoProject().citation = %s, want absent", stringify(d.Get("citation")))
	}

	for _, c := range []struct {
		arg         any
		field, text string
	}{
		{map[string]any{"name": "nope"}, "name", "georgiev1995-acetone"},
		{map[string]any{"name": ""}, "name", `""`},
		{map[string]any{"name": 7}, "name", "7"},
		{map[string]any{}, "name", "missing"},
		{map[string]any{"name": strings.Repeat("x", 401)}, "name", "401"},
	} {
		wantError(t, call(api, "exampleProject", c.arg), c.field, c.text)
	}
	wantError(t, call(api, "exampleProject"), "arguments", "")
	// A citation is checked like the other texts of a project.
	p := call(api, "exampleProject", map[string]any{"name": project.ExampleGeorgiev1995Acetone}).Get("project")
	p.Set("citation", strings.Repeat("x", project.MaxSourceLength+1))
	wantError(t, call(api, "checkProject", map[string]any{"project": p}), "project.citation", "1001")
}
