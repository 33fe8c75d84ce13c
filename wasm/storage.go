//go:build js && wasm

package main

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"syscall/js"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/indexeddb"

	"copoly/copoly"
	"copoly/copoly/project"
)

// The hackpadfs wiring: the project store lives in an IndexedDB database named "copoly",
// opened lazily on the first storage call, on the goroutine behind its Promise. Opening it in
// main or in a JS callback would block the page's start or the event loop. The logic (two
// copies, revisions, kept copies, drafts) is all in project.Store; this file converts.

// databaseName is the IndexedDB database that holds the stored projects.
const databaseName = "copoly"

// Time limits of storage. openTimeout bounds the wait for IndexedDB to open (it can hang when
// another tab holds an older version of the database open); after a failed open the next
// attempt waits retryOpen, so that a page typing on without storage is not slowed down by a
// fresh attempt on every keystroke; busyTimeout bounds the wait for an earlier storage call of
// this page. All three are common practice, no source.
const (
	openTimeout = 5 * time.Second
	retryOpen   = 30 * time.Second
	busyTimeout = 30 * time.Second
)

// unavailableMessage is shown when the browser offers no storage.
const unavailableMessage = "Browser storage is unavailable here (private browsing, a locked-down browser, or not a browser), so the project is kept only while this page is open. Export it to a file to keep it."

// Plain reasons of failed writes, for the page (see plain).
const (
	fullMessage      = "the browser's storage for this page is full"
	notStoredMessage = "the browser did not keep what was written; its storage for this page may be full"
)

// Sentinels of the storage errors, with their codes (copoly.Code).
var (
	// errNoIndexedDB reports a JS environment without IndexedDB; it will not appear later.
	errNoIndexedDB = copoly.NewSentinel(copoly.CodeUnavailable, "this JavaScript environment has no IndexedDB")
	// errBusy reports that an earlier storage call of this page did not finish in time.
	errBusy = copoly.NewSentinel(copoly.CodeBusy, "storage busy")
	// errUnavailable is wrapped by the error of a call that needs storage when it cannot open.
	errUnavailable = copoly.NewSentinel(copoly.CodeUnavailable, "browser storage unavailable")
	// errStorageFull is wrapped by the error of a write the browser refused for lack of room.
	errStorageFull = copoly.NewSentinel(copoly.CodeStorageFull, "browser storage full")
)

// storage serialises the storage calls of one page and opens the file system on first use.
type storage struct {
	// open opens the file system; openIndexedDB in the page, an in-memory one in tests.
	open func(ctx context.Context) (hackpadfs.FS, error)
	// now gives the time stamped on a save.
	now func() time.Time
	// writer names this page in the revisions it writes (project.Store.Writer).
	writer string

	lock      chan struct{} // holds one token while a call runs
	fs        hackpadfs.FS
	permanent error     // set when storage can never open
	failed    error     // the last failed open, retried after retryOpen
	failedAt  time.Time // when it failed
}

func newStorage() *storage {
	return &storage{
		open: openIndexedDB,
		now:  time.Now,
		// math/rand/v2's generator is seeded at random when the module starts, so two tabs get
		// different names.
		writer: strconv.FormatUint(rand.Uint64(), 36),
		lock:   make(chan struct{}, 1),
	}
}

// openIndexedDB opens the "copoly" IndexedDB database as a hackpadfs file system. The global
// indexedDB is read with Reflect.get inside a call (get), because a page may define it as a
// getter that throws, and a throw during a plain syscall/js Get would break the Go stack.
func openIndexedDB(ctx context.Context) (fsys hackpadfs.FS, err error) {
	defer func() {
		// go-indexeddb panics when it cannot reach the indexedDB global.
		if r := recover(); r != nil {
			fsys, err = nil, fmt.Errorf("opening IndexedDB: %v", r)
		}
	}()
	v, err := get(js.Global(), "indexedDB", "indexedDB")
	if err != nil {
		return nil, fmt.Errorf("%w (%v)", errNoIndexedDB, err)
	}
	if t, ok := typeOf(v); !ok || t != js.TypeObject {
		return nil, errNoIndexedDB
	}
	return indexeddb.NewFS(ctx, databaseName, indexeddb.Options{})
}

// begin waits for the page's earlier storage call to end and returns the store, opening the
// file system if needed. When it returns no error the caller must call end.
func (s *storage) begin() (project.Store, error) {
	select {
	case s.lock <- struct{}{}:
	case <-time.After(busyTimeout):
		return project.Store{}, errBusy
	}
	st, err := s.store()
	if err != nil {
		s.end()
		return project.Store{}, err
	}
	return st, nil
}

func (s *storage) end() { <-s.lock }

// with runs job on the project store under the storage lock; storage that cannot open gives
// the unavailable error.
func (s *storage) with(job func(st project.Store) (any, error)) (any, error) {
	st, err := s.begin()
	if err != nil {
		return nil, unavailable(err)
	}
	defer s.end()
	return job(st)
}

// store returns the project store, opening the file system if needed; s.lock must be held.
func (s *storage) store() (project.Store, error) {
	switch {
	case s.fs != nil:
		return project.Store{FS: s.fs, Writer: s.writer}, nil
	case s.permanent != nil:
		return project.Store{}, s.permanent
	case s.failed != nil && s.now().Sub(s.failedAt) < retryOpen:
		return project.Store{}, s.failed
	}
	ctx, cancel := context.WithTimeout(context.Background(), openTimeout)
	defer cancel()
	fsys, err := s.open(ctx)
	if err != nil {
		if errors.Is(err, errNoIndexedDB) {
			s.permanent = err
		}
		s.failed, s.failedAt = err, s.now()
		return project.Store{}, err
	}
	s.fs, s.failed = fsys, nil
	return project.Store{FS: fsys, Writer: s.writer}, nil
}

// unavailable is the error of a call that needs storage when there is none.
func unavailable(err error) error {
	return &copoly.FieldError{Field: "storage", Reason: "browser storage is unavailable, nothing was stored; export the project to a file to keep it (" + err.Error() + ")", Err: errors.Join(err, errUnavailable)}
}

// plain returns err with a reason a chemist can read when the browser refused a write for lack
// of room (a QuotaExceededError) or did not keep it (project.ErrNotStored); other errors pass
// unchanged. The technical detail follows in parentheses.
func plain(err error) error {
	if err == nil || copoly.Field(err) != "storage" {
		return err
	}
	reason, wrapped := fullMessage, errors.Join(errStorageFull, err)
	switch {
	case strings.Contains(strings.ToLower(err.Error()), "quota"):
	case errors.Is(err, project.ErrNotStored):
		reason, wrapped = notStoredMessage, err
	default:
		return err
	}
	return &copoly.FieldError{Field: "storage", Reason: reason + " (" + strings.TrimPrefix(err.Error(), "storage: ") + ")", Err: wrapped}
}

// load is the job of loadProject: a StorageLoad, or an error when storage fails while reading.
// With tab it adds that page's draft, the later of the stored one and the page's own copy
// (given), when it is newer than the project.
func (s *storage) load(tab string, given *project.Draft) (any, error) {
	out := object.New()
	st, err := s.begin()
	if err != nil {
		out.Set("project", js.Null())
		out.Set("storage", "unavailable")
		out.Set("revision", revisionValue(project.Revision{}))
		out.Set("kept", array.New())
		out.Set("message", unavailableMessage+" ("+err.Error()+")")
		if given != nil {
			out.Set("draft", draftValue(*given))
		}
		return out, nil
	}
	defer s.end()
	l, err := st.Load(s.now())
	if err != nil {
		return nil, plain(err)
	}
	if l.Project == nil {
		out.Set("project", js.Null())
	} else {
		v, err := projectValue(*l.Project)
		if err != nil {
			return nil, err
		}
		out.Set("project", v)
	}
	out.Set("storage", "indexeddb")
	out.Set("revision", revisionValue(l.Revision))
	if l.Message != "" {
		out.Set("message", l.Message)
	}
	if l.Damaged {
		out.Set("damaged", true)
	}
	kept := array.New()
	for i, k := range l.Kept {
		kept.SetIndex(i, keptValue(k))
	}
	out.Set("kept", kept)
	if tab != "" {
		// A stored draft that cannot be read is no reason to fail the load: it only repeats typing.
		stored, _ := st.LoadDraft(tab)
		if d := project.LatestDraft(given, stored); d != nil && d.Newer(l.Project, l.Revision) {
			out.Set("draft", draftValue(*d))
		}
	}
	return out, nil
}

// save is the job of saveProject for a project and base already read and validated.
func (s *storage) save(p project.Project, base project.Revision) (any, error) {
	return s.with(func(st project.Store) (any, error) {
		sv, err := st.Save(p, base, s.now())
		if err != nil {
			return nil, plain(err)
		}
		out := object.New()
		out.Set("saved", sv.Conflict == nil)
		out.Set("storage", "indexeddb")
		out.Set("savedAt", sv.Project.SavedAt)
		out.Set("revision", revisionValue(sv.Revision))
		if c := sv.Conflict; c != nil {
			stored, err := projectValue(c.Stored)
			if err != nil {
				return nil, err
			}
			other := object.New()
			other.Set("project", stored)
			other.Set("revision", revisionValue(c.Revision))
			out.Set("conflict", other)
			out.Set("kept", keptValue(c.Copy))
		}
		return out, nil
	})
}

// saveDraft is the job of saveDraft.
func (s *storage) saveDraft(tab string, fields map[string]string, base project.Revision) (any, error) {
	return s.with(func(st project.Store) (any, error) {
		d, err := st.SaveDraft(tab, fields, base, s.now())
		if err != nil {
			return nil, plain(err)
		}
		out := object.New()
		out.Set("saved", true)
		out.Set("savedAt", d.SavedAt)
		return out, nil
	})
}

// dropDraft is the job of dropDraft.
func (s *storage) dropDraft(tab string) (any, error) {
	return s.with(func(st project.Store) (any, error) {
		if err := st.DropDraft(tab); err != nil {
			return nil, err
		}
		return dropped(), nil
	})
}

// keptCopy is the job of keptCopy: the copy, its bytes, a file name to download it under, and
// the project it holds when it reads as one.
func (s *storage) keptCopy(name string) (any, error) {
	return s.with(func(st project.Store) (any, error) {
		k, data, err := st.ReadKept(name)
		if err != nil {
			return nil, err
		}
		out := object.New()
		out.Set("copy", keptValue(k))
		out.Set("filename", "copoly-"+k.Name)
		bytes := js.Global().Get("Uint8Array").New(len(data))
		js.CopyBytesToJS(bytes, data)
		out.Set("bytes", bytes)
		if p, err := project.Parse(data); err == nil {
			if v, err := projectValue(p); err == nil {
				out.Set("project", v)
			}
		}
		return out, nil
	})
}

// dropKept is the job of dropKept.
func (s *storage) dropKept(name string) (any, error) {
	return s.with(func(st project.Store) (any, error) {
		if err := st.DropKept(name); err != nil {
			return nil, err
		}
		return dropped(), nil
	})
}

func dropped() js.Value {
	out := object.New()
	out.Set("dropped", true)
	return out
}

// registerStorage adds the storage methods of the d.ts to api, bound to st. Each reads its
// argument at the call and does its work on a goroutine behind the Promise. (One wrapAsync call
// site for all of them keeps the module small.)
func registerStorage(api js.Value, st *storage) {
	for _, m := range []struct {
		name   string
		policy argPolicy
		fn     asyncExport
	}{
		{"loadProject", argOptional, st.loadArg},
		{"saveProject", argRequired, st.saveArg},
		{"saveDraft", argRequired, st.saveDraftArg},
		{"dropDraft", argRequired, st.dropDraftArg},
		{"keptCopy", argRequired, func(arg js.Value) (asyncJob, error) { return keptArg(arg, st.keptCopy) }},
		{"dropKept", argRequired, func(arg js.Value) (asyncJob, error) { return keptArg(arg, st.dropKept) }},
	} {
		api.Set(m.name, wrapAsync(m.name, m.policy, m.fn))
	}
}

func (st *storage) loadArg(arg js.Value) (asyncJob, error) {
	var in tabIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	tab := ""
	if in.Tab != nil {
		if err := project.CheckID("tab", *in.Tab); err != nil {
			return nil, err
		}
		tab = *in.Tab
	}
	// The page's own copy of its draft is only a cache of typing: one that does not read is
	// ignored rather than failing the load.
	var given *project.Draft
	var cp draftCopyIn
	if tab != "" && decode(arg, &cp, "") == nil && cp.Draft != nil {
		// No fields is the page's mark of a draft it dropped, newer than any stored one.
		d := project.Draft{Format: project.DraftFormat, Version: 1, SavedAt: cp.Draft.SavedAt, Fields: cp.Draft.Fields}
		if d.Fields == nil {
			d.Fields = map[string]string{}
		}
		if b := cp.Draft.BasedOn; b != nil && b.N == math.Trunc(b.N) && b.N >= 0 && b.N <= project.MaxRevision {
			d.BasedOn = project.Revision{N: int64(b.N), Writer: b.Writer}
		}
		if project.CheckDraft("draft", d) == nil {
			given = &d
		}
	}
	return func() (any, error) { return st.load(tab, given) }, nil
}

func (st *storage) saveArg(arg js.Value) (asyncJob, error) {
	p, err := readProject(arg)
	if err != nil {
		return nil, err
	}
	base, err := readBase(arg)
	if err != nil {
		return nil, err
	}
	return func() (any, error) { return st.save(p, base) }, nil
}

func (st *storage) saveDraftArg(arg js.Value) (asyncJob, error) {
	var in draftIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	if err := project.CheckID("tab", in.Tab); err != nil {
		return nil, err
	}
	if err := project.CheckDraftFields("fields", in.Fields); err != nil {
		return nil, err
	}
	base, err := readBase(arg)
	if err != nil {
		return nil, err
	}
	return func() (any, error) { return st.saveDraft(in.Tab, in.Fields, base) }, nil
}

func (st *storage) dropDraftArg(arg js.Value) (asyncJob, error) {
	var in draftTabIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	if err := project.CheckID("tab", in.Tab); err != nil {
		return nil, err
	}
	return func() (any, error) { return st.dropDraft(in.Tab) }, nil
}

func keptArg(arg js.Value, job func(name string) (any, error)) (asyncJob, error) {
	var in keptIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	return func() (any, error) { return job(in.Name) }, nil
}

// Arguments of the storage methods (see decode).
type (
	revisionDTO struct {
		N      float64 `js:"n"`
		Writer string  `js:"writer" copoly:"optional" limit:"idLength"`
	}
	baseIn struct {
		BasedOn *revisionDTO `js:"basedOn"`
	}
	tabIn struct {
		Tab *string `js:"tab" limit:"idLength"`
	}
	draftCopyIn struct {
		Draft *struct {
			SavedAt string            `js:"savedAt" limit:"idLength"`
			BasedOn *revisionDTO      `js:"basedOn"`
			Fields  map[string]string `js:"fields" limit:"draftFields" each:"notesBytes"`
		} `js:"draft"`
	}
	draftTabIn struct {
		Tab string `js:"tab" limit:"idLength"`
	}
	draftIn struct {
		Tab    string            `js:"tab" limit:"idLength"`
		Fields map[string]string `js:"fields" limit:"draftFields" each:"notesBytes"`
	}
	keptIn struct {
		Name string `js:"name" limit:"keptNameLength"`
	}
)

// readBase reads the optional basedOn of arg; absent or null means the zero revision (nothing
// stored, or a file stored without one).
func readBase(arg js.Value) (project.Revision, error) {
	var in baseIn
	if err := decode(arg, &in, ""); err != nil {
		return project.Revision{}, err
	}
	if in.BasedOn == nil {
		return project.Revision{}, nil
	}
	n := in.BasedOn.N
	if n != math.Trunc(n) || n < 0 || n > project.MaxRevision {
		return project.Revision{}, &copoly.InputError{Field: "basedOn.n", Value: n, Reason: fmt.Sprintf("a revision counts saves, a whole number from 0 to %d", int64(project.MaxRevision)), Err: copoly.ErrOutOfRange}
	}
	r := project.Revision{N: int64(n), Writer: in.BasedOn.Writer}
	return r, project.CheckRevision("basedOn", r)
}

// revisionValue is the Revision of the d.ts.
func revisionValue(r project.Revision) js.Value {
	v := object.New()
	v.Set("n", float64(r.N))
	v.Set("writer", r.Writer)
	return v
}

// keptValue is the KeptCopy of the d.ts.
func keptValue(k project.Kept) js.Value {
	v := object.New()
	v.Set("name", k.Name)
	v.Set("kind", k.Kind)
	v.Set("size", float64(k.Size))
	if !k.Time.IsZero() {
		v.Set("time", k.Time.UTC().Format(time.RFC3339))
	}
	return v
}

// draftValue is the Draft of the d.ts.
func draftValue(d project.Draft) js.Value {
	v := object.New()
	v.Set("savedAt", d.SavedAt)
	v.Set("basedOn", revisionValue(d.BasedOn))
	fields := object.New()
	for k, text := range d.Fields {
		fields.Set(k, text)
	}
	v.Set("fields", fields)
	return v
}
