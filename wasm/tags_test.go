//go:build js && wasm

package main

import (
	"bufio"
	"os"
	"path/filepath"
	"testing"
)

// TestBuildTags checks that every file of the bridge starts with the js && wasm constraint, so
// that a native build of ./... never tries to compile syscall/js code.
func TestBuildTags(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil || len(files) == 0 {
		t.Fatalf("no Go files found: %v", err)
	}
	for _, name := range files {
		f, err := os.Open(name)
		if err != nil {
			t.Fatal(err)
		}
		s := bufio.NewScanner(f)
		s.Scan()
		if got := s.Text(); got != "//go:build js && wasm" {
			t.Errorf("%s starts with %q, want //go:build js && wasm", name, got)
		}
		f.Close()
	}
}
