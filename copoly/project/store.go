package project

import (
	"errors"
	"fmt"
	"io/fs"
	"time"

	"github.com/hack-pad/hackpadfs"

	"copoly/copoly"
)

// Paths of the stored files inside Store.FS (unrooted, slash-separated, as io/fs wants).
const (
	Dir          = "projects"
	CurrentPath  = Dir + "/current.json"  // the project as last saved
	PreviousPath = Dir + "/previous.json" // the good copy saved before it
	DamagedPath  = Dir + "/damaged.json"  // a current copy that no longer parsed, kept rather than overwritten
)

// RestoredMessage is the message Store.Load returns when it falls back to the previous copy.
const RestoredMessage = "The stored project was damaged; the previous copy was restored."

// Store keeps the current project and the previous good copy in a file system: IndexedDB in
// the browser, an in-memory file system in tests. A save never overwrites the only good copy:
// the last good current file becomes the previous one before the new current file is written,
// so a save cut short still leaves a project to restore.
type Store struct {
	FS hackpadfs.FS
}

// Load returns the stored project.
//
// With nothing stored it returns nil, "", nil. When the current copy is missing or damaged and
// the previous copy is good, it returns the previous copy with a message for the user (the
// stored files are left as they are until the next save). When no good copy is left it returns
// an error with field "storage" wrapping ErrDamaged; an error of the file system itself is
// returned with field "storage" too.
func (s Store) Load() (p *Project, message string, err error) {
	cur, curErr := s.read(CurrentPath)
	if curErr == nil {
		return &cur, "", nil
	}
	if !isDamage(curErr) && !errors.Is(curErr, fs.ErrNotExist) {
		return nil, "", storageError("the stored project could not be read", curErr)
	}
	prev, prevErr := s.read(PreviousPath)
	switch {
	case prevErr == nil && errors.Is(curErr, fs.ErrNotExist):
		return &prev, "The latest stored project was missing; the previous copy was restored.", nil
	case prevErr == nil:
		return &prev, RestoredMessage, nil
	case errors.Is(curErr, fs.ErrNotExist) && errors.Is(prevErr, fs.ErrNotExist):
		return nil, "", nil
	case !isDamage(prevErr) && !errors.Is(prevErr, fs.ErrNotExist):
		return nil, "", storageError("the previous stored project could not be read", prevErr)
	default:
		detail := curErr
		if !isDamage(curErr) {
			detail = prevErr
		}
		return nil, "", &copoly.FieldError{
			Field:  "storage",
			Reason: fmt.Sprintf("the stored project is damaged and no good previous copy is left (%v)", detail),
			Err:    ErrDamaged,
		}
	}
}

// Save validates p, sets its SavedAt to now (UTC, RFC 3339, whole seconds), stores it as the
// current project and returns it as stored.
//
// An invalid p gives the validation error and nothing is written. Otherwise the current file,
// if it is a good project, is first copied to the previous file; a current file that no longer
// parses is kept in DamagedPath instead, and the previous file is left alone.
func (s Store) Save(p Project, now time.Time) (Project, error) {
	if err := p.Validate(); err != nil {
		return Project{}, err
	}
	p.SavedAt = now.UTC().Truncate(time.Second).Format(time.RFC3339)
	data, err := Marshal(p)
	if err != nil {
		return Project{}, err
	}
	if err := hackpadfs.MkdirAll(s.FS, Dir, 0o700); err != nil {
		return Project{}, storageError("could not create the project folder", err)
	}
	old, err := hackpadfs.ReadFile(s.FS, CurrentPath)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		// First save.
	case err != nil:
		return Project{}, storageError("could not read the stored project before replacing it", err)
	default:
		keep := PreviousPath
		if _, err := Parse(old); err != nil {
			keep = DamagedPath
		}
		if err := hackpadfs.WriteFullFile(s.FS, keep, old, 0o600); err != nil {
			return Project{}, storageError("could not keep the previous copy", err)
		}
	}
	if err := hackpadfs.WriteFullFile(s.FS, CurrentPath, data, 0o600); err != nil {
		return Project{}, storageError("could not write the project", err)
	}
	return p, nil
}

// read reads and parses one stored file. A parse error is wrapped in a damageError.
func (s Store) read(name string) (Project, error) {
	data, err := hackpadfs.ReadFile(s.FS, name)
	if err != nil {
		return Project{}, err
	}
	p, err := Parse(data)
	if err != nil {
		return Project{}, damageError{err}
	}
	return p, nil
}

// damageError marks a stored file that exists but does not parse as a project.
type damageError struct{ err error }

func (e damageError) Error() string { return e.err.Error() }
func (e damageError) Unwrap() error { return e.err }

func isDamage(err error) bool {
	var d damageError
	return errors.As(err, &d)
}

func storageError(what string, err error) error {
	return &copoly.FieldError{Field: "storage", Reason: what + ": " + err.Error(), Err: err}
}
