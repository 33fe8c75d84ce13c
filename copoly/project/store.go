package project

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"path"
	"strconv"
	"strings"
	"time"

	"github.com/hack-pad/hackpadfs"

	"copoly/copoly"
)

// Paths of the stored files inside Store.FS (unrooted, slash-separated, as io/fs wants).
const (
	Dir          = "projects"
	CurrentPath  = Dir + "/current.json"  // the project as last saved
	PreviousPath = Dir + "/previous.json" // the good copy saved before it
	KeptDir      = Dir + "/kept"          // copies set aside (damaged files, conflict copies), never overwritten silently
	DraftDir     = Dir + "/drafts"        // the form of each page as typed (see Draft)

	// legacyDamagedPath is where earlier copoly versions kept a damaged current file; Load moves
	// it to KeptDir.
	legacyDamagedPath = Dir + "/damaged.json"
	// tmpSuffix ends the name of a file being written; it is renamed into place once complete.
	tmpSuffix = ".tmp"
	// staleTmp is the age after which Load removes a left-over temporary file: a write takes
	// milliseconds, so an older one was cut short (common practice, no source).
	staleTmp = time.Hour
)

// MaxRevision is the largest revision count, 2⁵³ − 1, the largest integer a JavaScript number
// holds exactly.
const MaxRevision = 1<<53 - 1

// MaxIDLength is the longest name of a page (Store.Writer, the tab of a draft), in ASCII
// characters.
const MaxIDLength = 64

// Revision identifies one save of the stored project: N counts the saves and Writer names the
// page that made it, so two pages that both saved on top of revision {4, A} make {5, B} and
// {5, C}, which differ. The zero Revision stands for "nothing stored", and for a stored file
// written by an earlier copoly, before revisions existed (it has no "revision" key).
//
// The revision is kept in the stored file as one more key beside those of the project file,
//
//	"revision": {"n": 5, "writer": "k3f9q2"}
//
// which Parse ignores; an exported project file has none.
type Revision struct {
	N      int64  `json:"n"`
	Writer string `json:"writer"`
}

// CheckRevision reports a revision whose count is negative or above MaxRevision, or whose writer
// is not a valid name (empty is allowed only in the zero Revision). field names it in the error.
func CheckRevision(field string, r Revision) error {
	if r.N < 0 || r.N > MaxRevision {
		return &copoly.InputError{Field: field + ".n", Value: float64(r.N), Reason: fmt.Sprintf("a revision counts saves from 0 to %d", int64(MaxRevision)), Err: copoly.ErrOutOfRange}
	}
	if r == (Revision{}) {
		return nil
	}
	return CheckID(field+".writer", r.Writer)
}

// CheckID reports a name of a page (a writer or a tab) that is empty, longer than 64 characters
// or holds anything but ASCII letters, digits, '-' and '_'; such names become file names.
func CheckID(field, id string) error {
	if id == "" || len(id) > MaxIDLength {
		return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("must be 1 to %d letters, digits, '-' or '_'", MaxIDLength), Err: ErrWrongType}
	}
	for _, r := range id {
		if !('a' <= r && r <= 'z' || 'A' <= r && r <= 'Z' || '0' <= r && r <= '9' || r == '-' || r == '_') {
			return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("%q holds %q; only letters, digits, '-' and '_' are allowed", id, r), Err: ErrWrongType}
		}
	}
	return nil
}

// Messages of Store.Load, in plain words for the user.
const (
	RestoredMessage = "The latest saved version of the project could not be read (it is damaged), so the previous saved version is shown. The damaged copy is kept in this browser; you can download it."
	MissingMessage  = "The latest saved version of the project was missing, so the previous saved version is shown."
	LostMessage     = "The saved project could not be read (it is damaged) and no good copy is left, so the page starts from the demo. The damaged copies are kept in this browser; you can download them."
)

// Store keeps the current project and the previous good copy in a file system: IndexedDB in
// the browser, an in-memory file system in tests. It never loses a good copy and never
// overwrites stored data silently:
//
//   - A save writes the new file completely under a temporary name first, copies the current
//     file to the previous one, then renames the new file to the current one; every write is
//     read back. A rename is a single transaction, so a save cut short at any point (a full
//     disk, a closed tab, a write the browser refused) leaves the last good project as the
//     current file, and a save never reports success for bytes that are not stored.
//   - A stored file that no longer parses is copied into KeptDir before anything replaces it,
//     and Load copies it there as soon as it finds it, so that the user can download it.
//   - Every save says which revision it was based on. When another page saved since, the save
//     is kept in KeptDir as a conflict copy and the stored project is left as it is (Conflict).
//
// A Store is a small value. Its file system must be one of the key-value file systems of
// hackpadfs (indexeddb in the page, mem in tests; see dirNames), safe for concurrent use when
// several pages share it (IndexedDB is).
type Store struct {
	FS hackpadfs.FS
	// Writer names the page that saves through this Store (see CheckID), stamped on each
	// revision it writes; every page makes its own, at random, when it starts.
	Writer string
}

// Loaded is what Store.Load found.
type Loaded struct {
	// Project is the project to show: the current file, or the previous one when the current is
	// missing or damaged; nil when nothing is stored or no stored copy can be read.
	Project *Project
	// Revision is Project's revision, the base of the page's next Save (zero when Project is nil
	// or was stored without one).
	Revision Revision
	// Message tells the user when Project is not simply the last save (RestoredMessage,
	// MissingMessage, LostMessage); "" otherwise.
	Message string
	// Damaged reports that a stored copy could not be read; it is in Kept (unless setting it
	// aside failed too, and then it stays where it is until a save manages to).
	Damaged bool
	// Kept lists the copies set aside, oldest first.
	Kept []Kept
}

// Load returns the stored project (see Loaded). It writes only to set damaged files aside and
// to tidy up (left-over temporary files, drafts older than DraftMaxAge); the current and the
// previous files are left as they are. now names the copies it sets aside. An error of the file
// system comes back with field "storage".
func (s Store) Load(now time.Time) (Loaded, error) {
	// One listing first: in a browser every file looked up is a few IndexedDB transactions, and
	// most loads find only some of the files, or (a first visit) nothing at all.
	names, err := dirNames(s.FS, Dir)
	if errors.Is(err, fs.ErrNotExist) {
		return Loaded{}, nil
	}
	top := listing{names: names}
	if err == nil {
		top.present = make(map[string]bool, len(names))
		for _, n := range names {
			top.present[n] = true
		}
	}
	has := top.has
	var cur, prev stored
	if has(CurrentPath) {
		if cur, err = s.readStored(CurrentPath); err != nil {
			return Loaded{}, storageError("the saved project could not be read", err)
		}
	}
	if has(PreviousPath) {
		if prev, err = s.readStored(PreviousPath); err != nil && cur.project == nil {
			return Loaded{}, storageError("the saved project could not be read", err)
		}
	}
	var out Loaded
	for _, c := range []stored{cur, prev} {
		if c.damaged {
			out.Damaged = true
			_, _ = s.keep(KindDamaged, c.data, now) // best effort: Save insists before replacing it
		}
	}
	s.tidy(now, top)
	switch {
	case cur.project != nil:
		out.Project, out.Revision = cur.project, cur.rev
	case prev.project != nil:
		out.Project, out.Revision, out.Message = prev.project, prev.rev, MissingMessage
		if cur.damaged {
			out.Message = RestoredMessage
		}
	case cur.damaged || prev.damaged:
		out.Message = LostMessage
	}
	if has(KeptDir) || out.Damaged || has(legacyDamagedPath) {
		out.Kept, _ = s.Kept() // a listing that fails leaves the list empty; the project still loads
	}
	return out, nil
}

// Saved is the outcome of a Store.Save that did not fail.
type Saved struct {
	// Project is the project as written, with SavedAt set.
	Project Project
	// Revision is the revision written: of the new current project, or of the conflict copy.
	Revision Revision
	// Conflict is non-nil when the stored project had changed since base: the project was then
	// kept as a conflict copy and the stored project left as it was.
	Conflict *Conflict
}

// Conflict describes a save that found the stored project changed since the page loaded it.
type Conflict struct {
	Stored   Project  // the stored project now, left untouched
	Revision Revision // its revision: the base of a save that replaces it on purpose
	Copy     Kept     // the copy in KeptDir holding the project of the refused save
}

// Save validates p, sets its SavedAt to now (UTC, RFC 3339, whole seconds) and stores it as the
// current project on top of base, the revision the page loaded or last saved.
//
// An invalid p gives the validation error and nothing is written. When a readable stored
// project exists and its revision is neither base nor one this Store's Writer wrote, another
// page saved since: p is kept as the conflict copy of this Store's Writer
// ("conflict-<writer>.json" in KeptDir, replacing that page's earlier conflict copy) and
// Saved.Conflict describes the stored project, which is not touched. Otherwise p becomes the
// current project with revision N one above the highest stored, the current file is copied to
// the previous one, and any stored file that did not parse is first kept in KeptDir (if that
// fails, nothing is replaced). A file-system error, or a write that does not read back
// (ErrNotStored), comes back with field "storage"; the current file is then still the last
// good project.
func (s Store) Save(p Project, base Revision, now time.Time) (Saved, error) {
	if err := CheckID("writer", s.Writer); err != nil {
		return Saved{}, err
	}
	if err := CheckRevision("basedOn", base); err != nil {
		return Saved{}, err
	}
	if err := p.Validate(); err != nil {
		return Saved{}, err
	}
	p.SavedAt = now.UTC().Truncate(time.Second).Format(time.RFC3339)
	if err := hackpadfs.MkdirAll(s.FS, Dir, 0o700); err != nil {
		return Saved{}, storageError("the project could not be saved", err)
	}
	cur, err := s.readStored(CurrentPath)
	if err != nil {
		return Saved{}, storageError("the saved project could not be read before replacing it", err)
	}
	prev, err := s.readStored(PreviousPath)
	if err != nil {
		return Saved{}, storageError("the saved project could not be read before replacing it", err)
	}
	inUse := cur
	if cur.project == nil {
		inUse = prev
	}
	top := max(cur.rev.N, prev.rev.N, base.N)
	if top >= MaxRevision {
		return Saved{}, &copoly.FieldError{Field: "storage", Reason: "the saved project has reached the largest revision number", Err: copoly.ErrOutOfRange}
	}
	rev := Revision{N: top + 1, Writer: s.Writer}
	data, err := storedBytes(p, rev)
	if err != nil {
		return Saved{}, err
	}

	// A stored revision that this page wrote itself is no conflict even when it is not base (the
	// page missed the answer to a save that did go through): no other page's work is at stake.
	if inUse.project != nil && inUse.rev != base && inUse.rev.Writer != s.Writer {
		k, err := s.put(KindConflict, conflictName(s.Writer), data)
		if err != nil {
			return Saved{}, storageError("another tab or window saved this project since this page opened it, and this page's version could not be kept as a separate copy", err)
		}
		return Saved{Project: p, Revision: rev, Conflict: &Conflict{Stored: *inUse.project, Revision: inUse.rev, Copy: k}}, nil
	}

	// Damaged bytes about to be replaced are kept first: the current file when it is damaged,
	// the previous file when the good current file is about to replace it.
	if cur.damaged {
		if _, err := s.keep(KindDamaged, cur.data, now); err != nil {
			return Saved{}, storageError("a damaged saved copy could not be kept aside, so nothing was replaced", err)
		}
	}
	if cur.project != nil && prev.damaged {
		if _, err := s.keep(KindDamaged, prev.data, now); err != nil {
			return Saved{}, storageError("a damaged saved copy could not be kept aside, so nothing was replaced", err)
		}
	}
	// The new file is written in full first. Then the current file is copied, never renamed, to
	// the previous one: a rename whose write fails unseen (see writeFile) would still remove its
	// source. Last the new file is renamed over the current one and read back.
	tmp := Dir + "/saving-" + s.Writer + tmpSuffix
	if err := s.writeChecked(tmp, data); err != nil {
		_ = hackpadfs.Remove(s.FS, tmp)
		return Saved{}, storageError("the project could not be saved", err)
	}
	if cur.project != nil {
		if err := s.writeFile(PreviousPath, cur.data); err != nil {
			_ = hackpadfs.Remove(s.FS, tmp)
			return Saved{}, storageError("the project could not be saved", err)
		}
	}
	if err := hackpadfs.Rename(s.FS, tmp, CurrentPath); err != nil {
		_ = hackpadfs.Remove(s.FS, tmp)
		return Saved{}, storageError("the project could not be saved", err)
	}
	if err := s.check(CurrentPath, data); err != nil {
		return Saved{}, storageError("the project could not be saved", err)
	}
	return Saved{Project: p, Revision: rev}, nil
}

// stored is one stored project file as read.
type stored struct {
	data    []byte   // nil when the file is missing
	project *Project // nil unless the file parses
	rev     Revision // the file's revision, zero when it has none
	damaged bool     // the file exists but does not parse
}

// readStored reads and parses one stored file; only a file-system error other than a missing
// file is an error.
func (s Store) readStored(name string) (stored, error) {
	data, err := hackpadfs.ReadFile(s.FS, name)
	if errors.Is(err, fs.ErrNotExist) {
		return stored{}, nil
	}
	if err != nil {
		return stored{}, err
	}
	p, err := Parse(data)
	if err != nil {
		return stored{data: data, damaged: true}, nil
	}
	return stored{data: data, project: &p, rev: revisionOf(data)}, nil
}

// storedBytes is the stored form of p: its project file with "revision" added as the last key.
// It is refused, with field "project", when it would exceed MaxFileBytes.
func storedBytes(p Project, rev Revision) ([]byte, error) {
	data, err := Marshal(p)
	if err != nil {
		return nil, err
	}
	body, ok := bytes.CutSuffix(data, []byte("\n}\n"))
	if !ok {
		panic("project: Marshal did not end its object with a closing brace")
	}
	// The writer is letters, digits, '-' and '_' (CheckID): a JSON string as it stands.
	out := make([]byte, 0, len(data)+100)
	out = append(out, body...)
	out = append(out, ",\n  \"revision\": {\n    \"n\": "...)
	out = strconv.AppendInt(out, rev.N, 10)
	out = append(out, ",\n    \"writer\": \""...)
	out = append(out, rev.Writer...)
	out = append(out, "\"\n  }\n}\n"...)
	if len(out) > MaxFileBytes {
		return nil, &copoly.FieldError{Field: "project", Reason: fmt.Sprintf("the project file would take %d bytes, more than the %d a project can have; shorten the notes or the bench data", len(out), MaxFileBytes), Err: ErrTooLong}
	}
	return out, nil
}

// revisionOf returns the revision of a stored file that parses as a project, or the zero
// Revision when it has none or an invalid one.
func revisionOf(data []byte) Revision {
	var f struct {
		Revision *Revision `json:"revision"`
	}
	if json.Unmarshal(data, &f) != nil || f.Revision == nil || CheckRevision("revision", *f.Revision) != nil {
		return Revision{}
	}
	return *f.Revision
}

// listing is the listing of Dir that Load takes first.
type listing struct {
	names   []string        // the entries directly inside Dir
	present map[string]bool // the same as a set; nil when Dir could not be listed
}

// has reports whether path, directly inside Dir, or Dir itself was listed; every path counts as
// present when the listing failed, so that it is looked up.
func (l listing) has(p string) bool {
	return l.present == nil || p == Dir || l.present[path.Base(p)]
}

// tidy removes temporary files older than staleTmp, drafts older than DraftMaxAge, and moves a
// damaged file kept by an earlier copoly into KeptDir. It is best effort: a failure leaves things as they are.
//
// top is Load's listing of Dir; tidy looks only at what it names.
func (s Store) tidy(now time.Time, top listing) {
	if top.has(legacyDamagedPath) {
		if data, err := hackpadfs.ReadFile(s.FS, legacyDamagedPath); err == nil {
			if _, err := s.keep(KindDamaged, data, now); err == nil {
				_ = hackpadfs.Remove(s.FS, legacyDamagedPath)
			}
		}
	}
	for _, dir := range []string{Dir, KeptDir, DraftDir} {
		if !top.has(dir) {
			continue
		}
		names := top.names
		if dir != Dir || top.present == nil {
			var err error
			if names, err = dirNames(s.FS, dir); err != nil {
				continue
			}
		}
		for _, name := range names {
			age := staleTmp
			switch {
			case strings.HasSuffix(name, tmpSuffix):
			case dir == DraftDir:
				age = DraftMaxAge
			default:
				continue
			}
			p := path.Join(dir, name)
			if info, err := hackpadfs.Stat(s.FS, p); err == nil && !info.IsDir() && now.Sub(info.ModTime()) > age {
				_ = hackpadfs.Remove(s.FS, p)
			}
		}
	}
}

// ErrNotStored reports a write that the file system reported done but that did not read back
// (see writeFile); in a browser the likely cause is a full storage.
var ErrNotStored = copoly.NewSentinel(copoly.CodeNotStored, "project: what was written did not read back")

// ErrStorage is wrapped, with the error of the file system, by every error of a failed read or
// write of the store.
var ErrStorage = copoly.NewSentinel(copoly.CodeStorage, "project: storage failed")

// writeFile writes data to name through a temporary file renamed into place, so that name holds
// either its old content or data, never a part of data, and reads it back.
//
// Reading back matters: the key-value file systems of hackpadfs (IndexedDB, mem) run each write
// as a transaction and report only the transaction's own failure, not that of a step inside it,
// so a write the browser refuses at once (a put that throws) is reported done. A rename is a
// write of the new name and a removal of the old one in one transaction: when its write fails
// that way, the old name is gone and the new one unchanged.
func (s Store) writeFile(name string, data []byte) error {
	tmp := name + "-" + s.Writer + tmpSuffix
	if err := s.writeChecked(tmp, data); err != nil {
		_ = hackpadfs.Remove(s.FS, tmp)
		return err
	}
	if err := hackpadfs.Rename(s.FS, tmp, name); err != nil {
		_ = hackpadfs.Remove(s.FS, tmp)
		return err
	}
	return s.check(name, data)
}

// writeChecked writes data to name in place and reads it back.
func (s Store) writeChecked(name string, data []byte) error {
	if err := hackpadfs.WriteFullFile(s.FS, name, data, 0o600); err != nil {
		return err
	}
	return s.check(name, data)
}

// check reports whether name holds data, with ErrNotStored when it holds anything else or nothing.
func (s Store) check(name string, data []byte) error {
	got, err := hackpadfs.ReadFile(s.FS, name)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return &fs.PathError{Op: "write", Path: name, Err: ErrNotStored}
	case err != nil:
		return err
	case !bytes.Equal(got, data):
		return &fs.PathError{Op: "write", Path: name, Err: ErrNotStored}
	}
	return nil
}

// dirNames lists the names in the directory dir of fsys, unsorted.
//
// It asks the directory for its names alone (ReadDirNames), which the key-value file systems of
// hackpadfs (IndexedDB, mem) offer on a directory opened for reading and writing; opening it so
// writes nothing. The usual ReadDir method would, through the linker keeping every ReadDir
// method of the program, bring the operating system's directory reading of package os into the
// page's module (about 25 kB) for nothing. Other file systems give an error wrapping
// hackpadfs.ErrNotImplemented.
func dirNames(fsys hackpadfs.FS, dir string) ([]string, error) {
	f, err := hackpadfs.OpenFile(fsys, dir, hackpadfs.FlagReadWrite, 0)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	d, ok := f.(interface{ ReadDirNames() ([]string, error) })
	if !ok {
		return nil, &fs.PathError{Op: "readdir", Path: dir, Err: hackpadfs.ErrNotImplemented}
	}
	return d.ReadDirNames()
}

func storageError(what string, err error) error {
	return &copoly.FieldError{Field: "storage", Reason: what + " (" + err.Error() + ")", Err: errors.Join(err, ErrStorage)}
}
