package project

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"path"
	"strings"
	"time"

	"github.com/hack-pad/hackpadfs"

	"copoly/copoly"
)

// Kinds of the copies kept in KeptDir.
const (
	KindDamaged  = "damaged"  // a stored file that did not parse as a project, byte for byte
	KindConflict = "conflict" // the project of a save refused because another page saved first
)

// ErrNoKept reports a kept copy that does not exist (or a name no kept copy can have).
var ErrNoKept = copoly.NewSentinel(copoly.CodeNoCopy, "project: no such kept copy")

// Kept is one copy set aside in KeptDir. Damaged copies are never replaced; a page's conflict
// copy is replaced by that page's next refused save. Only DropKept removes either.
type Kept struct {
	// Name is the file name in KeptDir: "damaged-<UTC time>[-n].json" or
	// "conflict-<writer>.json".
	Name string
	// Kind is KindDamaged or KindConflict.
	Kind string
	// Size is the length of the copy in bytes.
	Size int64
	// Time is when the copy was written.
	Time time.Time
}

// Kept lists the copies in KeptDir, oldest first (by name when written in the same instant).
func (s Store) Kept() ([]Kept, error) {
	names, err := dirNames(s.FS, KeptDir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, storageError("the kept copies could not be listed", err)
	}
	var out []Kept
	for _, name := range names {
		kind, ok := keptKind(name)
		if !ok {
			continue
		}
		info, err := hackpadfs.Stat(s.FS, path.Join(KeptDir, name))
		if err != nil || info.IsDir() {
			continue
		}
		out = append(out, Kept{Name: name, Kind: kind, Size: info.Size(), Time: info.ModTime()})
	}
	// Oldest first, by name within one instant: an insertion sort, as the list is short.
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && keptBefore(out[j], out[j-1]); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out, nil
}

func keptBefore(a, b Kept) bool {
	if !a.Time.Equal(b.Time) {
		return a.Time.Before(b.Time)
	}
	return a.Name < b.Name
}

// MaxKeptNameLength bounds the name of a kept copy a caller may give: longer than any the store
// makes (a kind, "-", a name of at most MaxIDLength characters and ".json" take at most 79).
const MaxKeptNameLength = 100

// ReadKept returns the kept copy called name and its bytes. A name that is not a kept copy
// gives an error wrapping ErrNoKept, with field "name".
func (s Store) ReadKept(name string) (Kept, []byte, error) {
	kind, ok := keptKind(name)
	if !ok {
		return Kept{}, nil, noKept(name)
	}
	p := path.Join(KeptDir, name)
	data, err := hackpadfs.ReadFile(s.FS, p)
	if errors.Is(err, fs.ErrNotExist) {
		return Kept{}, nil, noKept(name)
	}
	if err != nil {
		return Kept{}, nil, storageError("the kept copy could not be read", err)
	}
	k := Kept{Name: name, Kind: kind, Size: int64(len(data))}
	if info, err := hackpadfs.Stat(s.FS, p); err == nil {
		k.Time = info.ModTime()
	}
	return k, data, nil
}

// DropKept removes the kept copy called name, once the user has no more use for it. A name that
// is not a kept copy gives an error wrapping ErrNoKept, with field "name".
func (s Store) DropKept(name string) error {
	if _, ok := keptKind(name); !ok {
		return noKept(name)
	}
	err := hackpadfs.Remove(s.FS, path.Join(KeptDir, name))
	if errors.Is(err, fs.ErrNotExist) {
		return noKept(name)
	}
	if err != nil {
		return storageError("the kept copy could not be removed", err)
	}
	return nil
}

// keep sets the damaged bytes data aside as a new copy of the kind, named after now, unless a
// copy of that kind with the same bytes is already kept; it returns the copy either way.
func (s Store) keep(kind string, data []byte, now time.Time) (Kept, error) {
	kept, err := s.Kept()
	if err != nil {
		return Kept{}, err
	}
	taken := map[string]bool{}
	for _, k := range kept {
		taken[k.Name] = true
		if k.Kind != kind || k.Size != int64(len(data)) {
			continue
		}
		if old, err := hackpadfs.ReadFile(s.FS, path.Join(KeptDir, k.Name)); err == nil && bytes.Equal(old, data) {
			return k, nil
		}
	}
	stem := kind + "-" + now.UTC().Format("20060102T150405Z")
	name := stem + ".json"
	for n := 2; taken[name]; n++ {
		if n > 1000 {
			return Kept{}, errors.New("too many kept copies made in one second")
		}
		name = fmt.Sprintf("%s-%d.json", stem, n)
	}
	return s.put(kind, name, data)
}

// put writes data as the kept copy name, replacing any copy of that name.
func (s Store) put(kind, name string, data []byte) (Kept, error) {
	if err := hackpadfs.MkdirAll(s.FS, KeptDir, 0o700); err != nil {
		return Kept{}, err
	}
	p := path.Join(KeptDir, name)
	if err := s.writeFile(p, data); err != nil {
		return Kept{}, err
	}
	k := Kept{Name: name, Kind: kind, Size: int64(len(data))}
	if info, err := hackpadfs.Stat(s.FS, p); err == nil {
		k.Time = info.ModTime()
	}
	return k, nil
}

// conflictName is the name of the conflict copy of the page writer.
func conflictName(writer string) string { return KindConflict + "-" + writer + ".json" }

// keptKind returns the kind of a kept copy's file name, or false for any other name.
func keptKind(name string) (string, bool) {
	stem, ok := strings.CutSuffix(name, ".json")
	if !ok {
		return "", false
	}
	for _, kind := range []string{KindDamaged, KindConflict} {
		if id, ok := strings.CutPrefix(stem, kind+"-"); ok && CheckID("name", id) == nil {
			return kind, true
		}
	}
	return "", false
}

func noKept(name string) error {
	return &copoly.FieldError{Field: "name", Reason: fmt.Sprintf("there is no kept copy called %q", name), Err: ErrNoKept}
}
