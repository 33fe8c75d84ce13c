package project

import (
	"go/parser"
	"go/token"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestImports keeps package project pure Go: it runs natively, so it must not import
// syscall/js, vert or the IndexedDB backend of hackpadfs (those belong to the wasm bridge).
func TestImports(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil || len(files) == 0 {
		t.Fatalf("no Go files found: %v", err)
	}
	banned := []string{"syscall/js", "github.com/norunners/vert", "github.com/hack-pad/hackpadfs/indexeddb", "github.com/hack-pad/go-indexeddb", "github.com/hack-pad/safejs"}
	for _, name := range files {
		f, err := parser.ParseFile(token.NewFileSet(), name, nil, parser.ImportsOnly)
		if err != nil {
			t.Fatal(err)
		}
		for _, imp := range f.Imports {
			path, _ := strconv.Unquote(imp.Path.Value)
			for _, b := range banned {
				if path == b || strings.HasPrefix(path, b+"/") {
					t.Errorf("%s imports %s", name, path)
				}
			}
		}
	}
}
