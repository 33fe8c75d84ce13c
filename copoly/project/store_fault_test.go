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
// and with sticky every later one too (a full disk stays full). A failing Write first writes
// half of its bytes, so a file can be left cut short.
type faultFS struct {
	*mem.FS
	ops    int
	failAt int // 0: nothing fails
	sticky bool
}

func (f *faultFS) fault(op, name string) error {
	f.ops++
	if f.failAt > 0 && (f.ops == f.failAt || f.sticky && f.ops > f.failAt) {
		return &fs.PathError{Op: op, Path: name, Err: errQuota}
	}
	return nil
}

func (f *faultFS) OpenFile(name string, flag int, perm hackpadfs.FileMode) (hackpadfs.File, error) {
	if flag&(hackpadfs.FlagWriteOnly|hackpadfs.FlagReadWrite|hackpadfs.FlagCreate|hackpadfs.FlagTruncate) == 0 {
		return f.FS.OpenFile(name, flag, perm)
	}
	if err := f.fault("open", name); err != nil {
		return nil, err
	}
	file, err := f.FS.OpenFile(name, flag, perm)
	if err != nil {
		return nil, err
	}
	return &faultFile{File: file, fs: f, name: name}, nil
}

func (f *faultFS) Mkdir(name string, perm hackpadfs.FileMode) error {
	if err := f.fault("mkdir", name); err != nil {
		return err
	}
	return f.FS.Mkdir(name, perm)
}

func (f *faultFS) MkdirAll(name string, perm hackpadfs.FileMode) error {
	if err := f.fault("mkdirall", name); err != nil {
		return err
	}
	return f.FS.MkdirAll(name, perm)
}

func (f *faultFS) Remove(name string) error {
	if err := f.fault("remove", name); err != nil {
		return err
	}
	return f.FS.Remove(name)
}

func (f *faultFS) Rename(oldName, newName string) error {
	if err := f.fault("rename", oldName); err != nil {
		return err
	}
	return f.FS.Rename(oldName, newName)
}

func (f *faultFS) Chmod(name string, mode hackpadfs.FileMode) error {
	if err := f.fault("chmod", name); err != nil {
		return err
	}
	return f.FS.Chmod(name, mode)
}

func (f *faultFS) Chtimes(name string, atime, mtime time.Time) error {
	if err := f.fault("chtimes", name); err != nil {
		return err
	}
	return f.FS.Chtimes(name, atime, mtime)
}

// faultFile is a file opened for writing on a faultFS.
type faultFile struct {
	hackpadfs.File
	fs   *faultFS
	name string
}

func (f *faultFile) Read(p []byte) (int, error) {
	if r, ok := f.File.(io.Reader); ok {
		return r.Read(p)
	}
	return 0, &fs.PathError{Op: "read", Path: f.name, Err: hackpadfs.ErrNotImplemented}
}

func (f *faultFile) Write(p []byte) (int, error) {
	w, ok := f.File.(io.Writer)
	if !ok {
		return 0, &fs.PathError{Op: "write", Path: f.name, Err: hackpadfs.ErrNotImplemented}
	}
	if err := f.fs.fault("write", f.name); err != nil {
		n, _ := w.Write(p[:len(p)/2])
		return n, err
	}
	return w.Write(p)
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
	if total < 4 {
		t.Fatalf("a save made %d write operations; the test expects a write and two renames at least", total)
	}

	for _, sticky := range []bool{false, true} {
		for k := 1; k <= total; k++ {
			t.Run(fmt.Sprintf("sticky=%v/op%d", sticky, k), func(t *testing.T) {
				f := &faultFS{FS: newFS(t)}
				good, base := setup(t, f.FS)
				f.failAt, f.sticky = k, sticky
				s := Store{FS: f, Writer: pageA}
				_, err := s.Save(next(good), base, tuesday)
				if !errors.Is(err, errQuota) || copoly.Field(err) != "storage" {
					t.Fatalf("Save() with write %d of %d failing: error %v, want one wrapping %v for field storage", k, total, err, errQuota)
				}
				f.failAt = 0 // the disk has room again

				l := load(t, Store{FS: f.FS, Writer: pageB})
				if l.Project == nil || !reflect.DeepEqual(*l.Project, good) || l.Revision != base || l.Damaged {
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
