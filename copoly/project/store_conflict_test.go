package project

import (
	"reflect"
	"testing"
)

// Two pages (browser tabs) share one file system. Each loads, edits and saves; the later save
// must not silently replace the other's.
func TestConflict(t *testing.T) {
	m := newFS(t)
	a := Store{FS: m, Writer: pageA}
	b := Store{FS: m, Writer: pageB}

	// Both pages open an empty store.
	la, lb := load(t, a), load(t, b)

	pa := Demo()
	pa.R1 = 0.61
	sa := save(t, a, pa, la.Revision, monday)
	if sa.Conflict != nil {
		t.Fatalf("first page's save: conflict %+v", sa.Conflict)
	}
	stored := read(t, m, CurrentPath)

	pb := Demo()
	pb.R2 = 0.33
	sb := save(t, b, pb, lb.Revision, tuesday)
	if sb.Conflict == nil {
		t.Fatalf("second page's save on an old base = %+v, want a conflict", sb)
	}
	c := sb.Conflict
	if !reflect.DeepEqual(c.Stored, sa.Project) || c.Revision != sa.Revision {
		t.Errorf("conflict names %+v at %v, want the first page's %+v at %v", c.Stored, c.Revision, sa.Project, sa.Revision)
	}
	if want := conflictName(pageB); c.Copy.Name != want || c.Copy.Kind != KindConflict {
		t.Errorf("conflict copy %+v, want %s of kind %s", c.Copy, want, KindConflict)
	}
	// The other page's version is untouched; this page's is kept whole in the conflict copy.
	if cur := read(t, m, CurrentPath); cur != stored {
		t.Errorf("a conflicting save changed %s", CurrentPath)
	}
	if prev := read(t, m, PreviousPath); prev != "" {
		t.Errorf("a conflicting save wrote %s", PreviousPath)
	}
	_, data, err := b.ReadKept(c.Copy.Name)
	if err != nil {
		t.Fatal(err)
	}
	if p, _ := parsed(t, string(data)); !reflect.DeepEqual(p, sb.Project) || p.R2 != 0.33 {
		t.Errorf("conflict copy holds %+v, want %+v", p, sb.Project)
	}

	// Editing on, the second page keeps refreshing its own conflict copy, never a second one.
	pb.Notes = "typed after the conflict"
	sb2 := save(t, b, pb, lb.Revision, tuesday)
	if sb2.Conflict == nil || sb2.Conflict.Copy.Name != c.Copy.Name {
		t.Fatalf("second conflicting save = %+v, want the same conflict copy", sb2)
	}
	if k, _ := b.Kept(); len(k) != 1 {
		t.Errorf("kept copies %v, want one", keptNames(k))
	}
	_, data, _ = b.ReadKept(c.Copy.Name)
	if p, _ := parsed(t, string(data)); p.Notes != "typed after the conflict" {
		t.Errorf("conflict copy notes %q, want the latest", p.Notes)
	}

	// The user keeps the second page's version: a save on the stored revision replaces it, and
	// the first page's version becomes the previous copy.
	keep := save(t, b, pb, c.Revision, tuesday)
	if keep.Conflict != nil || keep.Revision != (Revision{N: 2, Writer: pageB}) {
		t.Fatalf("save on the stored revision = %+v, want revision {2 %s}", keep, pageB)
	}
	if err := b.DropKept(c.Copy.Name); err != nil {
		t.Fatal(err)
	}
	if prev := read(t, m, PreviousPath); prev != stored {
		t.Errorf("%s is not the first page's version after the second page replaced it", PreviousPath)
	}

	// Now the first page's next save conflicts in turn.
	pa.Notes = "first page again"
	sa2 := save(t, a, pa, sa.Revision, tuesday)
	if sa2.Conflict == nil || sa2.Conflict.Revision != keep.Revision || sa2.Conflict.Stored.R2 != 0.33 {
		t.Fatalf("first page's save on its old revision = %+v, want a conflict with the second page's", sa2)
	}
}

func TestConflictCases(t *testing.T) {
	good := Demo()
	good.SavedAt = "2026-01-01T00:00:00Z"
	rev4 := Revision{N: 4, Writer: pageB}
	rev5 := Revision{N: 5, Writer: pageB}
	const garbage = `{"format":"copoly-pr`
	tests := []struct {
		name              string
		current, previous string
		base              Revision
		conflict          bool
		rev               Revision // of the save, when it is no conflict
	}{
		{name: "nothing stored", base: Revision{}, rev: Revision{N: 1, Writer: pageA}},
		{name: "base is the stored revision", current: storedAs(t, good, rev5), base: rev5, rev: Revision{N: 6, Writer: pageA}},
		{name: "same count, other writer", current: storedAs(t, good, rev5), base: Revision{N: 5, Writer: pageA}, conflict: true},
		{name: "stored moved on", current: storedAs(t, good, rev5), base: rev4, conflict: true},
		{name: "stored without revision, page loaded one", current: marshal(t, good), base: rev4, conflict: true},
		{name: "page loaded nothing, something stored since", current: storedAs(t, good, rev5), base: Revision{}, conflict: true},
		{name: "base is an older revision than the page's own", current: storedAs(t, good, rev4), base: rev5, conflict: true},
		// The page's own save went through but the page missed the answer: no other page's work.
		{name: "stored by this page after its base", current: storedAs(t, good, Revision{N: 6, Writer: pageA}), base: Revision{N: 5, Writer: pageA}, rev: Revision{N: 7, Writer: pageA}},
		// With the current file damaged, the previous copy is the stored project.
		{name: "current damaged, base is previous", current: garbage, previous: storedAs(t, good, rev4), base: rev4, rev: Revision{N: 5, Writer: pageA}},
		{name: "current damaged, previous moved on", current: garbage, previous: storedAs(t, good, rev5), base: rev4, conflict: true},
		// Nothing readable is stored: there is nothing to overwrite (the damaged bytes are kept).
		{name: "both damaged", current: garbage, previous: garbage, base: rev5, rev: Revision{N: 6, Writer: pageA}},
		{name: "current missing, previous damaged", previous: garbage, base: rev4, rev: Revision{N: 5, Writer: pageA}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := storeHolding(t, tt.current, tt.previous)
			p := Demo()
			p.Notes = "mine"
			sv := save(t, s, p, tt.base, monday)
			if got := sv.Conflict != nil; got != tt.conflict {
				t.Fatalf("Save(base %v) conflict = %+v, want conflict %v", tt.base, sv.Conflict, tt.conflict)
			}
			if tt.conflict {
				if cur := read(t, s.FS, CurrentPath); cur != tt.current {
					t.Errorf("a conflicting save changed %s", CurrentPath)
				}
				return
			}
			l := load(t, s)
			if sv.Revision != tt.rev || l.Revision != tt.rev || l.Project == nil || l.Project.Notes != "mine" {
				t.Errorf("Save(base %v) = revision %v; Load() = %+v at %v; want revision %v", tt.base, sv.Revision, l.Project, l.Revision, tt.rev)
			}
		})
	}
}
