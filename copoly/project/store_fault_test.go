package project

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"reflect"
	"testing"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/mem"

	"copoly/copoly"
)

// errQuota stands for the error of a browser whose storage is full.
var errQuota = errors.New("quota exceeded")

// faultFS is an in-memory file system whose write operations can fail, like a browser
// storage that runs out of room or a tab closed in the middle of a save. Every operation that
// changes something counts: opening a file for writing (which may truncate it), each Write,
// Mkdir, MkdirAll, Remove, Rename, Chmod and Chtimes. Operation failAt (counting from 1) fails,
// and with sticky every later one too (a full disk stays full).
//
// A failing operation returns errQuota; a failing Write first writes half of its bytes, so a
// file can be left cut short. With silent, a failing operation instead does nothing and reports
// success, except that a Rename still removes its source: this is how the key-value file
// systems of hackpadfs behave when the browser refuses a write at once (a put that throws),
// because they report only the failure of a whole transaction.
type faultFS struct {
	*mem.FS
	ops    int
	failAt int // 0: nothing fails
	sticky bool
	silent bool
}

// fault counts one operation and reports whether it fails.
func (f *faultFS) fault() bool {
	f.ops++
	return f.failAt > 0 && (f.ops == f.failAt || f.sticky && f.ops > f.failAt)
}

func (f *faultFS) err(op, name string) error {
	if f.silent {
		return nil
	}
	return &fs.PathError{Op: op, Path: name, Err: errQuota}
}

func (f *faultFS) OpenFile(name string, flag int, perm hackpadfs.FileMode) (hackpadfs.File, error) {
	// Reading, and opening a directory read-write to list it (dirNames), change nothing.
	if flag&(hackpadfs.FlagWriteOnly|hackpadfs.FlagReadWrite|hackpadfs.FlagCreate|hackpadfs.FlagTruncate) == 0 || flag == hackpadfs.FlagReadWrite {
		return f.FS.OpenFile(name, flag, perm)
	}
	if f.fault() {
		if f.silent {
			return &faultFile{fs: f, name: name}, nil // writes go nowhere
		}
		return nil, f.err("open", name)
	}
	file, err := f.FS.OpenFile(name, flag, perm)
	if err != nil {
		return nil, err
	}
	return &faultFile{File: file, fs: f, name: name}, nil
}

func (f *faultFS) Mkdir(name string, perm hackpadfs.FileMode) error {
	if f.fault() {
		return f.err("mkdir", name)
	}
	return f.FS.Mkdir(name, perm)
}

func (f *faultFS) MkdirAll(name string, perm hackpadfs.FileMode) error {
	if f.fault() {
		return f.err("mkdirall", name)
	}
	return f.FS.MkdirAll(name, perm)
}

func (f *faultFS) Remove(name string) error {
	if f.fault() {
		return f.err("remove", name)
	}
	return f.FS.Remove(name)
}

func (f *faultFS) Rename(oldName, newName string) error {
	if f.fault() {
		if f.silent {
			return f.FS.Remove(oldName)
		}
		return f.err("rename", oldName)
	}
	return f.FS.Rename(oldName, newName)
}

func (f *faultFS) Chmod(name string, mode hackpadfs.FileMode) error {
	if f.fault() {
		return f.err("chmod", name)
	}
	return f.FS.Chmod(name, mode)
}

func (f *faultFS) Chtimes(name string, atime, mtime time.Time) error {
	if f.fault() {
		return f.err("chtimes", name)
	}
	return f.FS.Chtimes(name, atime, mtime)
}

// faultFile is a file opened for writing on a faultFS; with no File, one whose writes go nowhere.
type faultFile struct {
	hackpadfs.File
	fs   *faultFS
	name string
}

func (f *faultFile) Read(p []byte) (int, error) {
	if r, ok := f.File.(io.Reader); ok {
		return r.Read(p)
	}
	return 0, io.EOF
}

func (f *faultFile) Write(p []byte) (int, error) {
	if f.File == nil {
		return len(p), nil
	}
	w, ok := f.File.(io.Writer)
	if !ok {
		return 0, &fs.PathError{Op: "write", Path: f.name, Err: hackpadfs.ErrNotImplemented}
	}
	if f.fs.fault() {
		if f.fs.silent {
			return len(p), nil
		}
		n, _ := w.Write(p[:len(p)/2])
		return n, f.fs.err("write", f.name)
	}
	return w.Write(p)
}

func (f *faultFile) Close() error {
	if f.File == nil {
		return nil
	}
	return f.File.Close()
}

func (f *faultFile) Stat() (hackpadfs.FileInfo, error) {
	if f.File == nil {
		return nil, &fs.PathError{Op: "stat", Path: f.name, Err: fs.ErrNotExist}
	}
	return f.File.Stat()
}

// TestSaveFaults makes every write operation of a save fail in turn, once or for good, and
// checks that the stored project is then still the last good one, that the failure is
// reported, and that the next save (the page retries on the next change) stores the new one.
func TestSaveFaults(t *testing.T) {
	// setup stores two good saves, so that a current and a previous file exist, and returns
	// the revision and project of the last.
	setup := func(t *testing.T, m *mem.FS) (Project, Revision) {
		s := Store{FS: m, Writer: pageA}
		first := save(t, s, Demo(), Revision{}, monday)
		p := first.Project
		p.Notes = "last good"
		second := save(t, s, p, first.Revision, monday)
		return second.Project, second.Revision
	}
	next := func(p Project) Project {
		p.R1, p.Notes = 0.42, "new"
		return p
	}

	// Count the write operations of a save without faults.
	clean := &faultFS{FS: newFS(t)}
	good, base := setup(t, clean.FS)
	if _, err := (Store{FS: clean, Writer: pageA}).Save(next(good), base, tuesday); err != nil {
		t.Fatal(err)
	}
	total := clean.ops
	// At least: the new file's open and write, the copy's open, write and rename, the rename.
	if total < 6 {
		t.Fatalf("a save made %d write operations; the test expects six at least", total)
	}

	for _, mode := range []struct {
		name           string
		sticky, silent bool
		want           error
	}{
		{"once", false, false, errQuota},
		{"full", true, false, errQuota},
		{"unseen once", false, true, ErrNotStored},
		{"unseen full", true, true, ErrNotStored},
	} {
		for k := 1; k <= total; k++ {
			t.Run(fmt.Sprintf("%s/op%d", mode.name, k), func(t *testing.T) {
				f := &faultFS{FS: newFS(t)}
				good, base := setup(t, f.FS)
				f.failAt, f.sticky, f.silent = k, mode.sticky, mode.silent
				s := Store{FS: f, Writer: pageA}
				_, err := s.Save(next(good), base, tuesday)
				// An unseen failure of a removal (of a temporary file after the save) is no
				// failure of the save.
				if mode.silent && err == nil {
					if l := load(t, Store{FS: f.FS}); l.Project == nil || l.Project.Notes != "new" {
						t.Fatalf("Save() reported success with write %d failing unseen, but Load() = %+v", k, l.Project)
					}
					return
				}
				if !errors.Is(err, mode.want) || copoly.Field(err) != "storage" {
					t.Fatalf("Save() with write %d of %d failing: error %v, want one wrapping %v for field storage", k, total, err, mode.want)
				}
				f.failAt = 0 // the disk has room again

				// The current file is still the last good project: nothing to fall back on.
				l := load(t, Store{FS: f.FS, Writer: pageB})
				if l.Project == nil || !reflect.DeepEqual(*l.Project, good) || l.Revision != base || l.Damaged || l.Message != "" {
					t.Fatalf("Load() after the failed save = %+v at %v (message %q, damaged %v), want the last good project at %v", l.Project, l.Revision, l.Message, l.Damaged, base)
				}

				// The page still holds the new project and its base, and retries.
				sv, err := s.Save(next(good), base, tuesday)
				if err != nil || sv.Conflict != nil {
					t.Fatalf("retried Save() = %+v, %v", sv, err)
				}
				l = load(t, Store{FS: f.FS, Writer: pageB})
				if l.Project == nil || l.Project.Notes != "new" || l.Revision != sv.Revision || l.Message != "" {
					t.Fatalf("Load() after the retry = %+v at %v, %q; want the new project at %v", l.Project, l.Revision, l.Message, sv.Revision)
				}
				if prev, _ := parsed(t, read(t, f.FS, PreviousPath)); !reflect.DeepEqual(prev, good) {
					t.Errorf("after the retry %s holds %+v, want the last good project", PreviousPath, prev)
				}
			})
		}
	}
}

// A damaged current file that cannot be kept aside (storage full) is not replaced.
func TestSaveFaultKeepingDamaged(t *testing.T) {
	const garbage = `{"format":"copoly-proj`
	f := &faultFS{FS: newFS(t)}
	write(t, f.FS, CurrentPath, garbage)
	f.failAt, f.sticky = 1, true
	s := Store{FS: f, Writer: pageA}
	// Load cannot keep it aside either, and says so by Damaged.
	l, err := s.Load(monday)
	if err != nil || l.Project != nil || !l.Damaged || l.Message != LostMessage || len(l.Kept) != 0 {
		t.Fatalf("Load() on a full disk with a damaged file = %+v, %v", l, err)
	}
	if _, err := s.Save(Demo(), Revision{}, monday); !errors.Is(err, errQuota) || copoly.Field(err) != "storage" {
		t.Fatalf("Save() error %v, want one wrapping %v for field storage", err, errQuota)
	}
	if cur := read(t, f.FS, CurrentPath); cur != garbage {
		t.Errorf("%s = %q after a failed save, want the damaged bytes untouched", CurrentPath, cur)
	}
}

// A conflict copy that cannot be written is an error, and the stored project stays as it is.
func TestSaveFaultConflictCopy(t *testing.T) {
	f := &faultFS{FS: newFS(t)}
	other := save(t, Store{FS: f.FS, Writer: pageB}, Demo(), Revision{}, monday)
	before := read(t, f.FS, CurrentPath)
	f.failAt, f.sticky = 1, true
	if _, err := (Store{FS: f, Writer: pageA}).Save(Demo(), Revision{}, tuesday); !errors.Is(err, errQuota) || copoly.Field(err) != "storage" {
		t.Fatalf("conflicting Save() on a full disk: error %v, want one wrapping %v", err, errQuota)
	}
	if cur := read(t, f.FS, CurrentPath); cur != before {
		t.Errorf("a failed conflicting save changed %s", CurrentPath)
	}
	if l := load(t, Store{FS: f.FS}); l.Revision != other.Revision {
		t.Errorf("Load() revision %v, want %v", l.Revision, other.Revision)
	}
}
