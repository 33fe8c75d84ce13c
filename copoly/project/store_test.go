package project

import (
	"errors"
	"io/fs"
	"reflect"
	"testing"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/mem"

	"copoly/copoly"
)

// Times used as "now" in the tests; any fixed instants would do.
var (
	monday  = time.Date(2026, 3, 2, 9, 30, 15, 500_000_000, time.UTC)
	tuesday = time.Date(2026, 3, 3, 10, 0, 0, 0, time.FixedZone("CET", 3600))
)

func newFS(t *testing.T) *mem.FS {
	t.Helper()
	m, err := mem.NewFS()
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func write(t *testing.T, fsys hackpadfs.FS, name, data string) {
	t.Helper()
	if err := hackpadfs.MkdirAll(fsys, Dir, 0o700); err != nil {
		t.Fatal(err)
	}
	if err := hackpadfs.WriteFullFile(fsys, name, []byte(data), 0o600); err != nil {
		t.Fatal(err)
	}
}

func read(t *testing.T, fsys hackpadfs.FS, name string) string {
	t.Helper()
	data, err := hackpadfs.ReadFile(fsys, name)
	if errors.Is(err, fs.ErrNotExist) {
		return ""
	}
	if err != nil {
		t.Fatal(err)
	}
	return string(data)
}

func marshal(t *testing.T, p Project) string {
	t.Helper()
	data, err := Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	return string(data)
}

func TestSaveLoad(t *testing.T) {
	s := Store{FS: newFS(t)}

	p, msg, err := s.Load()
	if p != nil || msg != "" || err != nil {
		t.Fatalf("Load() on an empty store = %v, %q, %v, want nil, \"\", nil", p, msg, err)
	}

	first := Demo()
	saved, err := s.Save(first, monday)
	if err != nil {
		t.Fatalf("Save(demo) error %v", err)
	}
	// RFC 3339 in UTC, whole seconds, of monday above.
	if saved.SavedAt != "2026-03-02T09:30:15Z" {
		t.Errorf("Save(demo).SavedAt = %q, want 2026-03-02T09:30:15Z", saved.SavedAt)
	}
	got, msg, err := s.Load()
	if err != nil || msg != "" || got == nil || !reflect.DeepEqual(*got, saved) {
		t.Fatalf("Load() after one save = %+v, %q, %v, want %+v", got, msg, err, saved)
	}
	if prev := read(t, s.FS, PreviousPath); prev != "" {
		t.Errorf("after the first save %s holds %q, want nothing", PreviousPath, prev)
	}

	second := saved
	second.R1, second.Notes = 0.75, "second save"
	saved2, err := s.Save(second, tuesday)
	if err != nil {
		t.Fatalf("Save(second) error %v", err)
	}
	// tuesday above is 10:00 at UTC+1.
	if saved2.SavedAt != "2026-03-03T09:00:00Z" {
		t.Errorf("Save(second).SavedAt = %q, want 2026-03-03T09:00:00Z", saved2.SavedAt)
	}
	got, _, err = s.Load()
	if err != nil || !reflect.DeepEqual(*got, saved2) {
		t.Fatalf("Load() after two saves = %+v, %v, want %+v", got, err, saved2)
	}
	if prev := read(t, s.FS, PreviousPath); prev != marshal(t, saved) {
		t.Errorf("after the second save %s = %q, want the first save", PreviousPath, prev)
	}
}

func TestSaveInvalidWritesNothing(t *testing.T) {
	s := Store{FS: newFS(t)}
	good, err := s.Save(Demo(), monday)
	if err != nil {
		t.Fatal(err)
	}
	bad := good
	bad.Monomer1.MolarMass = -3
	if _, err := s.Save(bad, tuesday); copoly.Field(err) != "project.monomer1.molarMass" {
		t.Fatalf("Save(bad molar mass) error %v, want one for project.monomer1.molarMass", err)
	}
	if cur := read(t, s.FS, CurrentPath); cur != marshal(t, good) {
		t.Errorf("a refused save changed %s to %q", CurrentPath, cur)
	}
	if prev := read(t, s.FS, PreviousPath); prev != "" {
		t.Errorf("a refused save wrote %s: %q", PreviousPath, prev)
	}
}

func TestLoadDamaged(t *testing.T) {
	older := Demo()
	older.SavedAt = "2026-01-01T00:00:00Z"
	newer := Demo()
	newer.R2 = 0.2
	newer.SavedAt = "2026-01-02T00:00:00Z"
	const garbage = `{"format":"copoly-project","version":1,"r1":0.8,"r2` // a save cut short

	tests := []struct {
		name      string
		current   string // "" = no file
		previous  string
		want      *Project
		message   string
		errField  string
		errTarget error
	}{
		{name: "nothing stored"},
		{name: "current good", current: marshal(t, newer), previous: marshal(t, older), want: &newer},
		{name: "current damaged", current: garbage, previous: marshal(t, older), want: &older, message: RestoredMessage},
		{name: "current invalid", current: `{"format":"copoly-project","version":1}`, previous: marshal(t, older), want: &older, message: RestoredMessage},
		{name: "current from a newer copoly", current: `{"format":"copoly-project","version":9}`, previous: marshal(t, older), want: &older, message: RestoredMessage},
		{name: "current missing", previous: marshal(t, older), want: &older, message: "The latest stored project was missing; the previous copy was restored."},
		{name: "both damaged", current: garbage, previous: "[]", errField: "storage", errTarget: ErrDamaged},
		{name: "current damaged, no previous", current: garbage, errField: "storage", errTarget: ErrDamaged},
		{name: "current missing, previous damaged", previous: garbage, errField: "storage", errTarget: ErrDamaged},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := Store{FS: newFS(t)}
			if tt.current != "" {
				write(t, s.FS, CurrentPath, tt.current)
			}
			if tt.previous != "" {
				write(t, s.FS, PreviousPath, tt.previous)
			}
			got, msg, err := s.Load()
			if tt.errTarget != nil {
				if !errors.Is(err, tt.errTarget) || copoly.Field(err) != tt.errField {
					t.Fatalf("Load() error %v (field %q), want one wrapping %v for %q", err, copoly.Field(err), tt.errTarget, tt.errField)
				}
				if got != nil {
					t.Errorf("Load() = %+v with an error, want nil", got)
				}
				return
			}
			if err != nil {
				t.Fatalf("Load() error %v", err)
			}
			if !reflect.DeepEqual(got, tt.want) || msg != tt.message {
				t.Errorf("Load() = %+v, %q, want %+v, %q", got, msg, tt.want, tt.message)
			}
			// Loading never rewrites the stored files.
			if cur := read(t, s.FS, CurrentPath); cur != tt.current {
				t.Errorf("Load() changed %s to %q", CurrentPath, cur)
			}
		})
	}
}

func TestSaveOverDamagedKeepsPrevious(t *testing.T) {
	s := Store{FS: newFS(t)}
	older := Demo()
	older.SavedAt = "2026-01-01T00:00:00Z"
	const garbage = `{"format":"copoly-proj`
	write(t, s.FS, PreviousPath, marshal(t, older))
	write(t, s.FS, CurrentPath, garbage)

	saved, err := s.Save(Demo(), monday)
	if err != nil {
		t.Fatal(err)
	}
	if prev := read(t, s.FS, PreviousPath); prev != marshal(t, older) {
		t.Errorf("saving over a damaged current file replaced the good previous copy with %q", prev)
	}
	if dam := read(t, s.FS, DamagedPath); dam != garbage {
		t.Errorf("%s = %q, want the damaged bytes %q kept", DamagedPath, dam, garbage)
	}
	got, _, err := s.Load()
	if err != nil || !reflect.DeepEqual(*got, saved) {
		t.Errorf("Load() = %+v, %v, want %+v", got, err, saved)
	}
}

// failingFS is a mem.FS whose writes to one path fail, like a storage quota running out.
type failingFS struct {
	*mem.FS
	path string
}

var errQuota = errors.New("quota exceeded")

func (f failingFS) OpenFile(name string, flag int, perm hackpadfs.FileMode) (hackpadfs.File, error) {
	if name == f.path && flag&(hackpadfs.FlagWriteOnly|hackpadfs.FlagReadWrite) != 0 {
		return nil, &fs.PathError{Op: "open", Path: name, Err: errQuota}
	}
	return f.FS.OpenFile(name, flag, perm)
}

func TestSaveWriteFailureKeepsLastGood(t *testing.T) {
	m := newFS(t)
	good, err := Store{FS: m}.Save(Demo(), monday)
	if err != nil {
		t.Fatal(err)
	}
	s := Store{FS: failingFS{FS: m, path: CurrentPath}}
	next := good
	next.Notes = "will not be written"
	if _, err := s.Save(next, tuesday); !errors.Is(err, errQuota) || copoly.Field(err) != "storage" {
		t.Fatalf("Save() with a failing write error %v, want one wrapping %v for field storage", err, errQuota)
	}
	got, _, err := Store{FS: m}.Load()
	if err != nil || !reflect.DeepEqual(*got, good) {
		t.Errorf("Load() after a failed save = %+v, %v, want the last good %+v", got, err, good)
	}
}
