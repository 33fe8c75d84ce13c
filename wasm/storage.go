//go:build js && wasm

package main

import (
	"context"
	"errors"
	"fmt"
	"sync"
	"syscall/js"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/indexeddb"

	"copoly/copoly"
	"copoly/copoly/project"
)

// The hackpadfs wiring: the project store lives in an IndexedDB database named "copoly",
// opened lazily on the first loadProject or saveProject, on the goroutine behind the Promise.
// Opening it in main or in a JS callback would block the page's start or the event loop.

// databaseName is the IndexedDB database that holds the stored projects.
const databaseName = "copoly"

// openTimeout bounds the wait for IndexedDB to open (it can hang when another tab holds an
// older version of the database open).
const openTimeout = 5 * time.Second

// unavailableMessage is shown when the browser offers no storage.
const unavailableMessage = "Browser storage is unavailable here (private browsing, a locked-down browser, or not a browser), so the project is kept only while this page is open. Export it to a file to keep it."

// errNoIndexedDB reports a JS environment without IndexedDB; it will not appear later.
var errNoIndexedDB = errors.New("this JavaScript environment has no IndexedDB")

// storage serialises loads and saves and opens the file system on first use.
type storage struct {
	// open opens the file system; openIndexedDB in the page, an in-memory one in tests.
	open func(ctx context.Context) (hackpadfs.FS, error)
	// now gives the time stamped on a save.
	now func() time.Time

	mu        sync.Mutex
	fs        hackpadfs.FS
	permanent error // set when storage can never open
}

func newStorage() *storage {
	return &storage{open: openIndexedDB, now: time.Now}
}

// openIndexedDB opens the "copoly" IndexedDB database as a hackpadfs file system.
func openIndexedDB(ctx context.Context) (fsys hackpadfs.FS, err error) {
	if !js.Global().Get("indexedDB").Truthy() {
		return nil, errNoIndexedDB
	}
	defer func() {
		// go-indexeddb panics when it cannot reach the indexedDB global.
		if r := recover(); r != nil {
			fsys, err = nil, fmt.Errorf("opening IndexedDB: %v", r)
		}
	}()
	return indexeddb.NewFS(ctx, databaseName, indexeddb.Options{})
}

// store returns the project store, opening the file system if needed. s.mu must be held.
func (s *storage) store() (project.Store, error) {
	if s.fs != nil {
		return project.Store{FS: s.fs}, nil
	}
	if s.permanent != nil {
		return project.Store{}, s.permanent
	}
	ctx, cancel := context.WithTimeout(context.Background(), openTimeout)
	defer cancel()
	fsys, err := s.open(ctx)
	if err != nil {
		if errors.Is(err, errNoIndexedDB) {
			s.permanent = err
		}
		return project.Store{}, err
	}
	s.fs = fsys
	return project.Store{FS: fsys}, nil
}

// load is the job of loadProject: a StorageLoad, or an error when the stored copies are all
// damaged or storage fails while reading.
func (s *storage) load() (any, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	out := object.New()
	st, err := s.store()
	if err != nil {
		out.Set("project", js.Null())
		out.Set("storage", "unavailable")
		out.Set("message", unavailableMessage+" ("+err.Error()+")")
		return out, nil
	}
	p, message, err := st.Load()
	if err != nil {
		return nil, err
	}
	if p == nil {
		out.Set("project", js.Null())
	} else {
		out.Set("project", projectValue(*p))
	}
	out.Set("storage", "indexeddb")
	if message != "" {
		out.Set("message", message)
	}
	return out, nil
}

// save is the job of saveProject for a project already read and validated.
func (s *storage) save(p project.Project) (any, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	st, err := s.store()
	if err != nil {
		return nil, &copoly.FieldError{Field: "storage", Reason: "browser storage unavailable, nothing was saved; export the project to a file to keep it (" + err.Error() + ")", Err: err}
	}
	saved, err := st.Save(p, s.now())
	if err != nil {
		return nil, err
	}
	out := object.New()
	out.Set("saved", true)
	out.Set("storage", "indexeddb")
	out.Set("savedAt", saved.SavedAt)
	return out, nil
}
