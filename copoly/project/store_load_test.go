package project

import (
	"testing"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/mem"
)

// openCountFS is an in-memory file system that records the names it is asked to open: in a
// browser each is a few IndexedDB transactions, on the page's path to its first results.
type openCountFS struct {
	*mem.FS
	opened []string
}

func (f *openCountFS) OpenFile(name string, flag int, perm hackpadfs.FileMode) (hackpadfs.File, error) {
	f.opened = append(f.opened, name)
	return f.FS.OpenFile(name, flag, perm)
}

func (f *openCountFS) Open(name string) (hackpadfs.File, error) {
	return f.OpenFile(name, hackpadfs.FlagReadOnly, 0)
}

// TestLoadLooksOnlyAtWhatExists checks that Load of a store where nothing was ever saved opens
// one directory and nothing else, and after a save lists that directory once and reads the
// current file but not the previous copy, the kept copies or the drafts, which do not exist.
func TestLoadLooksOnlyAtWhatExists(t *testing.T) {
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	f := &openCountFS{FS: m}
	s := Store{FS: f, Writer: pageA}
	l, err := s.Load(monday)
	if err != nil || l.Project != nil || len(l.Kept) != 0 {
		t.Fatalf("Load() of an empty store = %+v, %v", l, err)
	}
	if len(f.opened) != 1 || f.opened[0] != Dir {
		t.Errorf("Load() of an empty store opened %q, want only %q", f.opened, Dir)
	}

	save(t, s, Demo(), Revision{}, monday)
	f.opened = nil
	l, err = s.Load(monday)
	if err != nil || l.Project == nil || l.Project.Name != Demo().Name {
		t.Fatalf("Load() after a save = %+v, %v", l, err)
	}
	dirs := 0
	for _, name := range f.opened {
		switch name {
		case Dir:
			dirs++
		case PreviousPath, KeptDir, DraftDir, legacyDamagedPath:
			t.Errorf("Load() after one save opened %s, which does not exist (opened %q)", name, f.opened)
		}
	}
	if dirs != 1 {
		t.Errorf("Load() after one save listed %s %d times, want once (opened %q)", Dir, dirs, f.opened)
	}
}
