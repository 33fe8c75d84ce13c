package copoly

import (
	"encoding/json"
	"os"
	"os/exec"
	"strings"
	"testing"
)

// TestNoBrowserImports keeps copoly pure Go: no package under copoly/ may import syscall/js, nor
// depend on vert or the IndexedDB backend (those belong in wasm/). The standard library itself
// uses syscall/js on js/wasm, so only direct imports are checked for it.
func TestNoBrowserImports(t *testing.T) {
	// List for js/wasm so that files built only for the browser are included.
	cmd := exec.Command("go", "list", "-json=ImportPath,Imports,Deps", "./...")
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		t.Skipf("go list unavailable: %v", err)
	}
	dec := json.NewDecoder(strings.NewReader(string(out)))
	forbidden := []string{"github.com/norunners/vert", "github.com/hack-pad/hackpadfs/indexeddb", "github.com/hack-pad/go-indexeddb", "github.com/hack-pad/safejs"}
	n := 0
	for dec.More() {
		var p struct {
			ImportPath    string
			Imports, Deps []string
		}
		if err := dec.Decode(&p); err != nil {
			t.Fatal(err)
		}
		n++
		for _, imp := range p.Imports {
			if imp == "syscall/js" {
				t.Errorf("%s imports syscall/js", p.ImportPath)
			}
		}
		for _, d := range p.Deps {
			for _, f := range forbidden {
				if strings.HasPrefix(d, f) {
					t.Errorf("%s depends on %s", p.ImportPath, d)
				}
			}
		}
	}
	if n == 0 {
		t.Fatal("go list returned no packages")
	}
}
