//go:build js && wasm

package main

import (
	"encoding/json"
	"strings"
	"testing"

	"copoly/copoly/project"
)

// TestProjectWithUserMonomers round-trips a project with user monomers through checkProject,
// exportProject, importProject and storage, checks that the exported file holds the same list
// as project.Parse reads it, that missing keys read as not given, and that every kind of bad
// entry is refused by name. The entries are invented for the test.
func TestProjectWithUserMonomers(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	if v := demo.Get("project").Get("userMonomers"); !v.IsUndefined() {
		t.Errorf("demo project userMonomers = %s, want it absent", stringify(v))
	}

	arg := edited(demo, `a.project.userMonomers = [
		{name: "isobornyl acrylate (our lot)", molarMass: 208.3, density: 0.986, densityTemp: 25, state: "liquid",
			heat: 60, q: 0.4, e: 0.2, hazards: ["irritant", "harmful to aquatic life"], note: "invented test entry"},
		{name: "vinyl ether X", molarMass: 0, density: 0, densityTemp: 0, state: "gas", heat: 0, q: 0.03, e: -1.5,
			hazards: [], note: ""}]`)
	exported := checkedExport(t, api, arg)
	p, err := project.Parse([]byte(exported))
	if err != nil {
		t.Fatalf("project.Parse(exported file) error %v", err)
	}
	// As written in arg above; [] hazards are none in the file.
	want := []project.UserMonomer{
		{Name: "isobornyl acrylate (our lot)", MolarMass: 208.3, Density: 0.986, DensityTemp: 25, State: "liquid",
			Heat: 60, Q: 0.4, E: 0.2, Hazards: []string{"irritant", "harmful to aquatic life"}, Note: "invented test entry"},
		{Name: "vinyl ether X", State: "gas", Q: 0.03, E: -1.5},
	}
	if g, w := mustJSON(t, p.UserMonomers), mustJSON(t, want); g != w {
		t.Errorf("exported userMonomers = %s, want %s", g, w)
	}
	imp := call(api, "importProject", map[string]any{"json": exported})
	wantNoError(t, imp)
	if got, want := stringify(imp), stringify(arg); got != want {
		t.Errorf("importProject(exportProject(p)) = %s, want %s", got, want)
	}
	wantNoError(t, await(t, call(api, "saveProject", arg)))
	loaded := await(t, call(api, "loadProject"))
	wantNoError(t, loaded)
	if got, want := stringify(loaded.Get("project").Get("userMonomers")), stringify(arg.Get("project").Get("userMonomers")); got != want {
		t.Errorf("loadProject() userMonomers after a save = %s, want %s", got, want)
	}

	// Only the name is required: the other keys read as not given and come back filled in.
	r := call(api, "checkProject", edited(arg, `a.project.userMonomers = [{name: "bare"}]`))
	wantNoError(t, r)
	const bare = `[{"name":"bare","molarMass":0,"density":0,"densityTemp":0,"state":"","heat":0,"q":0,"e":0,"hazards":[],"note":""}]`
	if got := stringify(r.Get("project").Get("userMonomers")); got != bare {
		t.Errorf("user monomer with a name only = %s, want %s", got, bare)
	}
	for _, edit := range []string{`a.project.userMonomers = []`, `a.project.userMonomers = null`, `delete a.project.userMonomers`} {
		r := call(api, "checkProject", edited(arg, edit))
		wantNoError(t, r)
		if v := r.Get("project").Get("userMonomers"); !v.IsUndefined() {
			t.Errorf("%s: userMonomers = %s, want it absent", edit, stringify(v))
		}
	}

	for _, c := range []struct{ name, edit, field, text string }{
		{"not a list", `a.project.userMonomers = {name: "x"}`, "project.userMonomers", "a list of objects"},
		{"entry not an object", `a.project.userMonomers[1] = "styrene"`, "project.userMonomers[1]", "an object"},
		{"name missing", `delete a.project.userMonomers[0].name`, "project.userMonomers[0].name", "missing"},
		{"name blank", `a.project.userMonomers[1].name = " "`, "project.userMonomers[1].name", "needs a name"},
		{"name repeated", `a.project.userMonomers[1].name = "Isobornyl acrylate (our lot)"`, "project.userMonomers[1].name", "already"},
		{"name too long", `a.project.userMonomers[0].name = "n".repeat(201)`, "project.userMonomers[0].name", "the limit is 200"},
		{"density text", `a.project.userMonomers[0].density = "0,986"`, "project.userMonomers[0].density", "must be a number"},
		{"density negative", `a.project.userMonomers[0].density = -1`, "project.userMonomers[0].density", "negative"},
		{"heat NaN", `a.project.userMonomers[0].heat = NaN`, "project.userMonomers[0].heat", "finite"},
		{"molar mass negative", `a.project.userMonomers[0].molarMass = -5`, "project.userMonomers[0].molarMass", "positive"},
		{"state unknown", `a.project.userMonomers[0].state = "paste"`, "project.userMonomers[0].state", `"paste"`},
		{"hazards text", `a.project.userMonomers[0].hazards = "toxic"`, "project.userMonomers[0].hazards", "a list of texts"},
		{"hazard a number", `a.project.userMonomers[0].hazards = ["toxic", 3]`, "project.userMonomers[0].hazards[1]", "must be text"},
		{"hazard too long", `a.project.userMonomers[0].hazards = ["h".repeat(101)]`, "project.userMonomers[0].hazards[0]", "the limit is 100"},
		{"too many hazards", `a.project.userMonomers[0].hazards = Array(21).fill("toxic")`, "project.userMonomers[0].hazards", "at most 20"},
		{"too many monomers", `a.project.userMonomers = Array.from({length: 101}, (_, i) => ({name: "m" + i}))`, "project.userMonomers", "at most 100"},
		{"note too long", `a.project.userMonomers[1].note = "n".repeat(1001)`, "project.userMonomers[1].note", "the limit is 1000"},
	} {
		t.Run(c.name, func(t *testing.T) {
			bad := edited(arg, c.edit)
			for _, method := range []string{"checkProject", "exportProject"} {
				wantError(t, call(api, method, bad), c.field, c.text)
			}
			wantError(t, await(t, call(api, "saveProject", bad)), c.field, c.text)
		})
	}

	// A refused save keeps the last good copy.
	loaded = await(t, call(api, "loadProject"))
	if got := loaded.Get("project").Get("userMonomers").Length(); got != 2 {
		t.Errorf("after refused saves the stored project has %d user monomers, want the 2 saved before", got)
	}
	if !strings.Contains(stringify(loaded), "isobornyl acrylate (our lot)") {
		t.Errorf("stored project lost the saved user monomer: %s", stringify(loaded))
	}
}

func mustJSON(t *testing.T, v any) string {
	t.Helper()
	b, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}
