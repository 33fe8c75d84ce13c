//go:build !js

// This test starts the go command, which a js/wasm test cannot do (no process can be started
// there); it runs natively, under make test-native and make test-noasm.

package copoly_test

import (
	"encoding/json"
	"os"
	"os/exec"
	"slices"
	"strings"
	"testing"
)

// module is the path of the copoly packages; core is the core package.
const (
	module = "copoly/copoly"
	core   = module
)

// siblings lists, for each package under copoly/ other than the core and copoly/internal/..., the
// other copoly packages it may import besides the core and copoly/internal/..., with the reason.
// A science package not listed may import only those two. Keep it short: every entry is an
// exception to "bench, fit, plan and molarmass stand side by side".
var siblings = map[string][]string{
	// The project file holds the inputs of every panel, so its schema names the bench table,
	// the plan's words and limits, the triads of the model comparison and the molar-mass
	// classes of the chain-size panel.
	module + "/project": {module + "/bench", module + "/fit", module + "/plan", module + "/molarmass"},
	// The glass transition along a batch and its spread over the product follow the N-monomer
	// drift: resin reads a multi.Drift rather than integrating the batch a second time.
	module + "/resin": {module + "/multi"},
}

// pkg is one package as go list describes it.
type pkg struct {
	ImportPath    string
	Imports, Deps []string
}

// listPackages lists every package under copoly/ for js/wasm, so that files built only for the
// browser are included. It fails the test, rather than skipping it, when go list fails.
func listPackages(t *testing.T) []pkg {
	t.Helper()
	cmd := exec.Command("go", "list", "-json=ImportPath,Imports,Deps", "./...")
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		var detail string
		if ee, ok := err.(*exec.ExitError); ok {
			detail = string(ee.Stderr)
		}
		t.Fatalf("go list ./... failed: %v\n%s", err, detail)
	}
	dec := json.NewDecoder(strings.NewReader(string(out)))
	var ps []pkg
	for dec.More() {
		var p pkg
		if err := dec.Decode(&p); err != nil {
			t.Fatal(err)
		}
		ps = append(ps, p)
	}
	if len(ps) < 7 {
		t.Fatalf("go list returned %d packages under copoly/, want the core, bench, fit, plan, molarmass, project and internal ones", len(ps))
	}
	return ps
}

// TestNoBrowserImports keeps copoly pure Go: no package under copoly/ may import syscall/js, nor
// depend on vert or the IndexedDB backend (those belong in wasm/). The standard library itself
// uses syscall/js on js/wasm, so only direct imports are checked for it.
func TestNoBrowserImports(t *testing.T) {
	forbidden := []string{"github.com/norunners/vert", "github.com/hack-pad/hackpadfs/indexeddb", "github.com/hack-pad/go-indexeddb", "github.com/hack-pad/safejs"}
	for _, p := range listPackages(t) {
		if slices.Contains(p.Imports, "syscall/js") {
			t.Errorf("%s imports syscall/js", p.ImportPath)
		}
		for _, d := range p.Deps {
			for _, f := range forbidden {
				if strings.HasPrefix(d, f) {
					t.Errorf("%s depends on %s", p.ImportPath, d)
				}
			}
		}
	}
}

// TestImportDirection keeps the imports between copoly's packages one way: the core imports only
// copoly/internal/...; the packages under copoly/internal import nothing of copoly; every other
// package imports the core, copoly/internal/... and only the siblings listed for it.
func TestImportDirection(t *testing.T) {
	ps := listPackages(t)
	seen := map[string]bool{}
	for _, p := range ps {
		seen[p.ImportPath] = true
		internal := strings.HasPrefix(p.ImportPath, module+"/internal/")
		for _, imp := range p.Imports {
			if imp != module && !strings.HasPrefix(imp, module+"/") {
				continue // the standard library and other modules
			}
			impInternal := strings.HasPrefix(imp, module+"/internal/")
			switch {
			case internal:
				t.Errorf("%s imports %s: a package under copoly/internal imports nothing of copoly", p.ImportPath, imp)
			case p.ImportPath == core && !impInternal:
				t.Errorf("the core package %s imports %s: the core imports none of its sub-packages", p.ImportPath, imp)
			case imp == core || impInternal:
			case !slices.Contains(siblings[p.ImportPath], imp):
				t.Errorf("%s imports %s: a sub-package imports only the core, copoly/internal/... and the siblings listed in imports_test.go", p.ImportPath, imp)
			}
		}
	}
	for _, want := range []string{core, module + "/bench", module + "/fit", module + "/plan", module + "/molarmass", module + "/project", module + "/internal/lm"} {
		if !seen[want] {
			t.Errorf("go list did not list %s", want)
		}
	}
}
