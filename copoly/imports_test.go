package copoly

import (
	"encoding/json"
	"os"
	"os/exec"
	"strings"
	"testing"
)

// TestNoBrowserImports keeps copoly pure Go: no package under copoly/ may depend on syscall/js,
// vert or the IndexedDB backend (those belong in wasm/).
func TestNoBrowserImports(t *testing.T) {
	// List for js/wasm so that files built only for the browser are included.
	cmd := exec.Command("go", "list", "-deps", "-json=ImportPath", "./...")
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		t.Skipf("go list unavailable: %v", err)
	}
	dec := json.NewDecoder(strings.NewReader(string(out)))
	forbidden := []string{"syscall/js", "github.com/norunners/vert", "github.com/hack-pad/hackpadfs/indexeddb", "github.com/hack-pad/go-indexeddb"}
	n := 0
	for dec.More() {
		var p struct{ ImportPath string }
		if err := dec.Decode(&p); err != nil {
			t.Fatal(err)
		}
		n++
		for _, f := range forbidden {
			if strings.HasPrefix(p.ImportPath, f) {
				t.Errorf("copoly depends on %s", p.ImportPath)
			}
		}
	}
	if n == 0 {
		t.Fatal("go list returned no packages")
	}
}
