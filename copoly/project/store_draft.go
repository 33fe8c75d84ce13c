package project

import (
	"cmp"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"maps"
	"slices"
	"time"

	"github.com/hack-pad/hackpadfs"

	"copoly/copoly"
)

// DraftFormat is the value of the "format" key of a draft file.
const DraftFormat = "copoly-draft"

// Limits of a draft. They are design choices of copoly: far above the form of the page.
const (
	MaxDraftFields = 200                 // inputs in one draft
	MaxDraftBytes  = MaxFileBytes        // bytes of all names and texts together
	DraftMaxAge    = 30 * 24 * time.Hour // Load removes drafts not written for this long
)

// draftTime is the layout of Draft.SavedAt: RFC 3339 in UTC with milliseconds, fine enough to
// order keystrokes and saves.
const draftTime = "2006-01-02T15:04:05.000Z07:00"

// Draft is the form of one page exactly as typed, valid or not, kept so that a reload in the
// middle of editing loses nothing. The page saves it a moment after each keystroke and when it
// is hidden or closed; each page (browser tab) has its own, in DraftDir/<tab>.json:
//
//	{"format": "copoly-draft", "version": 1, "savedAt": "2026-03-02T09:30:15.250Z",
//	 "basedOn": {"n": 4, "writer": "k3f9q2"}, "fields": {"r1": "0,4", "notes": "…"}}
type Draft struct {
	Format  string            `json:"format"`  // always DraftFormat
	Version int               `json:"version"` // always 1
	SavedAt string            `json:"savedAt"` // when it was saved, RFC 3339 UTC with milliseconds
	BasedOn Revision          `json:"basedOn"` // the revision of the stored project being edited
	Fields  map[string]string `json:"fields"`  // each input's name and text
}

// Newer reports whether d holds typing that came after the stored project p of revision rev:
// it was typed on top of rev itself, or saved after p was (p nil means nothing is stored).
// A page restores such a draft into its form, unless the texts are those of p anyway.
func (d Draft) Newer(p *Project, rev Revision) bool {
	if d.BasedOn == rev || p == nil {
		return true
	}
	dt, err1 := time.Parse(time.RFC3339, d.SavedAt)
	pt, err2 := time.Parse(time.RFC3339, p.SavedAt)
	return err1 == nil && (err2 != nil || dt.After(pt))
}

// CheckDraftFields reports a draft with more than MaxDraftFields inputs or MaxDraftBytes bytes,
// or an input name that is not 1 to 64 letters, digits, '-' or '_' (see CheckID).
func CheckDraftFields(field string, fields map[string]string) error {
	if len(fields) > MaxDraftFields {
		return &copoly.InputError{Field: field, Value: float64(len(fields)), Reason: fmt.Sprintf("a draft holds at most %d inputs", MaxDraftFields), Err: copoly.ErrTooMany}
	}
	n := 0
	for _, k := range slices.Sorted(maps.Keys(fields)) {
		if err := CheckID(field+"."+k, k); err != nil {
			return err
		}
		n += len(k) + len(fields[k])
	}
	if n > MaxDraftBytes {
		return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("the draft takes %d bytes; the limit is %d", n, MaxDraftBytes), Err: ErrTooLong}
	}
	return nil
}

// CheckDraft reports a draft that LoadDraft would not return: another format or version, a
// SavedAt that is not RFC 3339, an invalid BasedOn, or fields that fail CheckDraftFields (nil
// fields included). field names it in the error.
func CheckDraft(field string, d Draft) error {
	if d.Format != DraftFormat || d.Version != 1 {
		return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("is not a version-1 %q", DraftFormat), Err: ErrWrongType}
	}
	if _, err := time.Parse(time.RFC3339, d.SavedAt); err != nil {
		return &copoly.FieldError{Field: field + ".savedAt", Reason: fmt.Sprintf("%q is not a date and time in RFC 3339 form", d.SavedAt), Err: ErrWrongType}
	}
	if d.Fields == nil {
		return &copoly.FieldError{Field: field + ".fields", Reason: "is missing", Err: ErrMissing}
	}
	if err := CheckRevision(field+".basedOn", d.BasedOn); err != nil {
		return err
	}
	return CheckDraftFields(field+".fields", d.Fields)
}

// LatestDraft returns the later of two drafts of one page by SavedAt (a when they were saved
// at the same instant), or the one that is not nil. The page keeps a copy of its draft of its
// own, written at once when the page is closed, which the stored draft may lack.
func LatestDraft(a, b *Draft) *Draft {
	if a == nil || b == nil {
		return cmp.Or(a, b)
	}
	ta, _ := time.Parse(time.RFC3339, a.SavedAt)
	tb, _ := time.Parse(time.RFC3339, b.SavedAt)
	if tb.After(ta) {
		return b
	}
	return a
}

// SaveDraft stores fields as the draft of the page tab (see CheckID), typed on top of the
// stored revision base, at now; it replaces that page's earlier draft and nothing else.
func (s Store) SaveDraft(tab string, fields map[string]string, base Revision, now time.Time) (Draft, error) {
	if err := CheckID("tab", tab); err != nil {
		return Draft{}, err
	}
	if err := CheckRevision("basedOn", base); err != nil {
		return Draft{}, err
	}
	if err := CheckDraftFields("fields", fields); err != nil {
		return Draft{}, err
	}
	d := Draft{Format: DraftFormat, Version: 1, SavedAt: now.UTC().Format(draftTime), BasedOn: base, Fields: fields}
	data, err := json.Marshal(d)
	if err != nil {
		return Draft{}, err
	}
	if err := hackpadfs.MkdirAll(s.FS, DraftDir, 0o700); err != nil {
		return Draft{}, storageError("the typing could not be saved", err)
	}
	if err := s.writeFile(draftPath(tab), data); err != nil {
		return Draft{}, storageError("the typing could not be saved", err)
	}
	return d, nil
}

// LoadDraft returns the draft of the page tab, or nil when it has none. A draft that does not
// read is treated as none: it only ever repeats what the page had on screen.
func (s Store) LoadDraft(tab string) (*Draft, error) {
	if err := CheckID("tab", tab); err != nil {
		return nil, err
	}
	data, err := hackpadfs.ReadFile(s.FS, draftPath(tab))
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, storageError("the typing of this page could not be read", err)
	}
	var d Draft
	if json.Unmarshal(data, &d) != nil || CheckDraft("draft", d) != nil {
		return nil, nil
	}
	return &d, nil
}

// DropDraft removes the draft of the page tab; having none is not an error.
func (s Store) DropDraft(tab string) error {
	if err := CheckID("tab", tab); err != nil {
		return err
	}
	if err := hackpadfs.Remove(s.FS, draftPath(tab)); err != nil && !errors.Is(err, fs.ErrNotExist) {
		return storageError("the typing of this page could not be removed", err)
	}
	return nil
}

func draftPath(tab string) string { return DraftDir + "/" + tab + ".json" }
