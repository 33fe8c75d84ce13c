package project

import (
	"errors"
	"io/fs"
	"reflect"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/hack-pad/hackpadfs"
	"github.com/hack-pad/hackpadfs/mem"

	"copoly/copoly"
	"copoly/copoly/bench"
)

// Times used as "now" in the tests; any fixed instants would do.
var (
	monday  = time.Date(2026, 3, 2, 9, 30, 15, 500_000_000, time.UTC)
	tuesday = time.Date(2026, 3, 3, 10, 0, 0, 0, time.FixedZone("CET", 3600))
)

// Page names of the tests (any valid names would do).
const (
	pageA = "pageA"
	pageB = "pageB"
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

// storeHolding returns a store of page A whose current and previous files hold current and
// previous as they stand; "" leaves a file out.
func storeHolding(t *testing.T, current, previous string) Store {
	t.Helper()
	s := Store{FS: newFS(t), Writer: pageA}
	if current != "" {
		write(t, s.FS, CurrentPath, current)
	}
	if previous != "" {
		write(t, s.FS, PreviousPath, previous)
	}
	return s
}

// read returns the file's text, or "" when it does not exist.
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

// storedAs is the stored file of p with revision rev, as Save writes it.
func storedAs(t *testing.T, p Project, rev Revision) string {
	t.Helper()
	data, err := storedBytes(p, rev)
	if err != nil {
		t.Fatal(err)
	}
	return string(data)
}

// parsed returns the project and revision of a stored file, failing the test when it does not
// parse.
func parsed(t *testing.T, text string) (Project, Revision) {
	t.Helper()
	p, err := Parse([]byte(text))
	if err != nil {
		t.Fatalf("stored file does not parse: %v\n%s", err, text)
	}
	return p, revisionOf([]byte(text))
}

func load(t *testing.T, s Store) Loaded {
	t.Helper()
	l, err := s.Load(tuesday)
	if err != nil {
		t.Fatalf("Load() error %v", err)
	}
	return l
}

func save(t *testing.T, s Store, p Project, base Revision, now time.Time) Saved {
	t.Helper()
	sv, err := s.Save(p, base, now)
	if err != nil {
		t.Fatalf("Save(%q, base %v) error %v", p.Name, base, err)
	}
	return sv
}

// keptNames lists the names of the kept copies.
func keptNames(ks []Kept) []string {
	var names []string
	for _, k := range ks {
		names = append(names, k.Kind+":"+k.Name)
	}
	return names
}

func TestSaveLoad(t *testing.T) {
	s := Store{FS: newFS(t), Writer: pageA}

	if l := load(t, s); !reflect.DeepEqual(l, Loaded{}) {
		t.Fatalf("Load() on an empty store = %+v, want the zero Loaded", l)
	}

	first := save(t, s, Demo(), Revision{}, monday)
	// RFC 3339 in UTC, whole seconds, of monday above.
	if first.Project.SavedAt != "2026-03-02T09:30:15Z" {
		t.Errorf("Save(demo).Project.SavedAt = %q, want 2026-03-02T09:30:15Z", first.Project.SavedAt)
	}
	// The first save on an empty store is revision 1 of this page.
	if want := (Revision{N: 1, Writer: pageA}); first.Revision != want || first.Conflict != nil {
		t.Errorf("Save(demo) = revision %v, conflict %v; want %v, none", first.Revision, first.Conflict, want)
	}
	l := load(t, s)
	if l.Project == nil || !reflect.DeepEqual(*l.Project, first.Project) || l.Revision != first.Revision || l.Message != "" || l.Damaged {
		t.Fatalf("Load() after one save = %+v, want %+v at %v", l, first.Project, first.Revision)
	}
	if prev := read(t, s.FS, PreviousPath); prev != "" {
		t.Errorf("after the first save %s holds %q, want nothing", PreviousPath, prev)
	}

	next := first.Project
	next.R1, next.Notes = 0.75, "second save"
	second := save(t, s, next, first.Revision, tuesday)
	// tuesday above is 10:00 at UTC+1.
	if second.Project.SavedAt != "2026-03-03T09:00:00Z" || second.Revision != (Revision{N: 2, Writer: pageA}) {
		t.Errorf("second Save() = savedAt %q, revision %v; want 2026-03-03T09:00:00Z, {2 %s}", second.Project.SavedAt, second.Revision, pageA)
	}
	l = load(t, s)
	if l.Project == nil || !reflect.DeepEqual(*l.Project, second.Project) || l.Revision != second.Revision {
		t.Fatalf("Load() after two saves = %+v, want %+v", l, second.Project)
	}
	if prev := read(t, s.FS, PreviousPath); prev != storedAs(t, first.Project, first.Revision) {
		t.Errorf("after the second save %s = %q, want the first save", PreviousPath, prev)
	}
	// Only the two project files remain: no temporary file, nothing kept aside.
	entries, err := hackpadfs.ReadDir(s.FS, Dir)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	if want := []string{"current.json", "previous.json"}; !reflect.DeepEqual(names, want) {
		t.Errorf("%s holds %v, want %v", Dir, names, want)
	}
}

func TestStoredFileIsAProjectFile(t *testing.T) {
	// The stored file is the project file plus one key, so Parse (and an older copoly) reads it.
	s := Store{FS: newFS(t), Writer: pageA}
	sv := save(t, s, Demo(), Revision{}, monday)
	text := read(t, s.FS, CurrentPath)
	p, rev := parsed(t, text)
	if !reflect.DeepEqual(p, sv.Project) || rev != sv.Revision {
		t.Errorf("Parse(stored file) = %+v at %v, want %+v at %v", p, rev, sv.Project, sv.Revision)
	}
	if !strings.HasSuffix(text, "\"revision\": {\n    \"n\": 1,\n    \"writer\": \"pageA\"\n  }\n}\n") {
		t.Errorf("stored file ends %q, want the revision as its last key", text[max(0, len(text)-80):])
	}
}

func TestSaveInvalidWritesNothing(t *testing.T) {
	s := Store{FS: newFS(t), Writer: pageA}
	good := save(t, s, Demo(), Revision{}, monday)
	before := read(t, s.FS, CurrentPath)
	bad := good.Project
	bad.Monomer1.MolarMass = -3
	if _, err := s.Save(bad, good.Revision, tuesday); copoly.Field(err) != "project.monomer1.molarMass" {
		t.Fatalf("Save(bad molar mass) error %v, want one for project.monomer1.molarMass", err)
	}
	if cur := read(t, s.FS, CurrentPath); cur != before {
		t.Errorf("a refused save changed %s to %q", CurrentPath, cur)
	}
	if prev := read(t, s.FS, PreviousPath); prev != "" {
		t.Errorf("a refused save wrote %s: %q", PreviousPath, prev)
	}
}

func TestSaveRefusesBadArguments(t *testing.T) {
	tests := []struct {
		name   string
		writer string
		base   Revision
		field  string
	}{
		{name: "no writer", base: Revision{}, field: "writer"},
		{name: "writer with a slash", writer: "a/b", field: "writer"},
		{name: "writer too long", writer: strings.Repeat("w", 65), field: "writer"},
		{name: "negative base", writer: pageA, base: Revision{N: -1, Writer: pageB}, field: "basedOn.n"},
		{name: "base above 2^53 - 1", writer: pageA, base: Revision{N: MaxRevision + 1, Writer: pageB}, field: "basedOn.n"},
		{name: "base without writer", writer: pageA, base: Revision{N: 3}, field: "basedOn.writer"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := Store{FS: newFS(t), Writer: tt.writer}
			if _, err := s.Save(Demo(), tt.base, monday); copoly.Field(err) != tt.field {
				t.Errorf("Save() error %v, want one for %q", err, tt.field)
			}
			if cur := read(t, s.FS, CurrentPath); cur != "" {
				t.Errorf("a refused save wrote %q", cur)
			}
		})
	}
}

// A file stored by an earlier copoly has no revision: it loads as revision zero, and a page that loaded it
// saves over it without a conflict.
func TestVersion1WithoutRevision(t *testing.T) {
	// A version-1 project file as an earlier copoly stored it: the project keys only.
	const old = `{
  "format": "copoly-project",
  "version": 1,
  "name": "old file",
  "monomer1": {"name": "styrene", "molarMass": 104.15},
  "monomer2": {"name": "methyl methacrylate", "molarMass": 100.12},
  "r1": 0.52, "r2": 0.46,
  "ratioSource": "", "f10": 0.5, "conversion": 0.9, "tolerance": 0.02, "notes": "",
  "savedAt": "2025-12-01T08:00:00Z"
}
`
	s := Store{FS: newFS(t), Writer: pageA}
	write(t, s.FS, CurrentPath, old)
	l := load(t, s)
	if l.Project == nil || l.Project.Name != "old file" || l.Project.R1 != 0.52 || l.Revision != (Revision{}) || l.Message != "" {
		t.Fatalf("Load() of a version-1 file without a revision = %+v, want it at revision zero", l)
	}
	next := *l.Project
	next.R2 = 0.5
	sv := save(t, s, next, l.Revision, monday)
	if sv.Conflict != nil || sv.Revision != (Revision{N: 1, Writer: pageA}) {
		t.Fatalf("Save() over a file without a revision = %+v, want revision 1 and no conflict", sv)
	}
	if prev := read(t, s.FS, PreviousPath); prev != old {
		t.Errorf("%s = %q, want the old file byte for byte", PreviousPath, prev)
	}

	// A revision of the wrong shape is no revision.
	for _, bad := range []string{`"r5"`, `{"n": -1, "writer": "x"}`, `{"n": 2, "writer": "a b"}`, `{"n": 1.5, "writer": "x"}`} {
		text := strings.Replace(old, `"version": 1,`, `"version": 1, "revision": `+bad+`,`, 1)
		if _, err := Parse([]byte(text)); err != nil {
			t.Fatalf("Parse() with revision %s: %v", bad, err)
		}
		if got := revisionOf([]byte(text)); got != (Revision{}) {
			t.Errorf("revisionOf(revision %s) = %v, want zero", bad, got)
		}
	}
}

func TestLoadDamaged(t *testing.T) {
	older := Demo()
	older.SavedAt = "2026-01-01T00:00:00Z"
	newer := Demo()
	newer.R2 = 0.2
	newer.SavedAt = "2026-01-02T00:00:00Z"
	olderRev := Revision{N: 4, Writer: pageB}
	newerRev := Revision{N: 5, Writer: pageA}
	const garbage = `{"format":"copoly-project","version":1,"r1":0.8,"r2` // a save cut short
	const other = "[]"

	tests := []struct {
		name     string
		current  string // "" = no file
		previous string
		want     *Project
		rev      Revision
		message  string
		kept     []string // the damaged copies Load keeps aside
	}{
		{name: "nothing stored"},
		{name: "current good", current: storedAs(t, newer, newerRev), previous: storedAs(t, older, olderRev), want: &newer, rev: newerRev},
		{name: "current good, previous damaged", current: storedAs(t, newer, newerRev), previous: garbage, want: &newer, rev: newerRev, kept: []string{garbage}},
		{name: "current damaged", current: garbage, previous: storedAs(t, older, olderRev), want: &older, rev: olderRev, message: RestoredMessage, kept: []string{garbage}},
		{name: "current invalid", current: `{"format":"copoly-project","version":1}`, previous: storedAs(t, older, olderRev), want: &older, rev: olderRev, message: RestoredMessage, kept: []string{`{"format":"copoly-project","version":1}`}},
		{name: "current from a newer copoly", current: `{"format":"copoly-project","version":9}`, previous: marshal(t, older), want: &older, message: RestoredMessage, kept: []string{`{"format":"copoly-project","version":9}`}},
		{name: "current missing", previous: storedAs(t, older, olderRev), want: &older, rev: olderRev, message: MissingMessage},
		{name: "both damaged", current: garbage, previous: other, message: LostMessage, kept: []string{garbage, other}},
		{name: "both damaged alike", current: garbage, previous: garbage, message: LostMessage, kept: []string{garbage}},
		{name: "current damaged, no previous", current: garbage, message: LostMessage, kept: []string{garbage}},
		{name: "current missing, previous damaged", previous: garbage, message: LostMessage, kept: []string{garbage}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := storeHolding(t, tt.current, tt.previous)
			l := load(t, s)
			if !reflect.DeepEqual(l.Project, tt.want) || l.Revision != tt.rev || l.Message != tt.message || l.Damaged != (len(tt.kept) > 0) {
				t.Errorf("Load() = %+v at %v, %q, damaged %v; want %+v at %v, %q, damaged %v", l.Project, l.Revision, l.Message, l.Damaged, tt.want, tt.rev, tt.message, len(tt.kept) > 0)
			}
			// Every damaged file is kept aside byte for byte, once, and listed.
			var got []string
			for _, k := range l.Kept {
				_, data, err := s.ReadKept(k.Name)
				if err != nil || k.Kind != KindDamaged || k.Size != int64(len(data)) {
					t.Errorf("kept copy %+v: read error %v, size %d", k, err, len(data))
				}
				got = append(got, string(data))
			}
			if !reflect.DeepEqual(got, tt.kept) {
				t.Errorf("kept copies %q, want %q", got, tt.kept)
			}
			// Loading never rewrites the stored files, and loading again keeps nothing twice.
			if cur := read(t, s.FS, CurrentPath); cur != tt.current {
				t.Errorf("Load() changed %s to %q", CurrentPath, cur)
			}
			if prev := read(t, s.FS, PreviousPath); prev != tt.previous {
				t.Errorf("Load() changed %s to %q", PreviousPath, prev)
			}
			if again := load(t, s); len(again.Kept) != len(tt.kept) {
				t.Errorf("a second Load() lists %v, want %d copies", keptNames(again.Kept), len(tt.kept))
			}
		})
	}
}

// A save never replaces damaged bytes that are not kept aside, even when Load never ran.
func TestSaveKeepsDamagedBytes(t *testing.T) {
	const cut = `{"format":"copoly-proj`
	const junk = "\x00\x01 not json"
	good := Demo()
	good.SavedAt = "2026-01-01T00:00:00Z"
	tests := []struct {
		name              string
		current, previous string
		want              []string // the kept copies after two saves
	}{
		{name: "current damaged", current: cut, previous: storedAs(t, good, Revision{N: 7, Writer: pageB}), want: []string{cut}},
		{name: "previous damaged", current: storedAs(t, good, Revision{N: 7, Writer: pageB}), previous: junk, want: []string{junk}},
		{name: "both damaged", current: cut, previous: junk, want: []string{cut, junk}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := Store{FS: newFS(t), Writer: pageA}
			write(t, s.FS, CurrentPath, tt.current)
			write(t, s.FS, PreviousPath, tt.previous)
			base := revisionOf([]byte(tt.current))
			if base == (Revision{}) {
				base = revisionOf([]byte(tt.previous))
			}
			first := save(t, s, Demo(), base, monday)
			if first.Conflict != nil {
				t.Fatalf("first Save() on base %v: conflict %+v", base, first.Conflict)
			}
			next := first.Project
			next.Notes = "second"
			second := save(t, s, next, first.Revision, tuesday)
			if second.Conflict != nil {
				t.Fatalf("second Save(): conflict %+v", second.Conflict)
			}
			kept, err := s.Kept()
			if err != nil {
				t.Fatal(err)
			}
			var got []string
			for _, k := range kept {
				_, data, err := s.ReadKept(k.Name)
				if err != nil {
					t.Fatal(err)
				}
				got = append(got, string(data))
			}
			if !sameSet(got, tt.want) {
				t.Errorf("kept copies %q, want %q", got, tt.want)
			}
			if p, _ := parsed(t, read(t, s.FS, CurrentPath)); p.Notes != "second" {
				t.Errorf("current notes %q, want the second save", p.Notes)
			}
		})
	}
}

// sameSet reports whether a and b hold the same texts, each as many times, in any order.
func sameSet(a, b []string) bool {
	a, b = slices.Clone(a), slices.Clone(b)
	slices.Sort(a)
	slices.Sort(b)
	return slices.Equal(a, b)
}

func TestSaveOversizedRefused(t *testing.T) {
	// A project whose file is a few bytes under MaxFileBytes passes Marshal, but with the
	// revision it would not: the store refuses it rather than write a file Load could not read.
	p := Demo()
	p.Notes = ""
	p.Bench = &Bench{FeedKind: bench.FeedFraction, ConversionKind: bench.ConversionMolar, CompositionKind: bench.CompositionFraction}
	size := func() int {
		data, err := Marshal(p)
		if err != nil {
			t.Fatal(err)
		}
		return len(data)
	}
	// Full rows until less than the notes can fill is left, then notes up to 20 bytes short.
	row := BenchRow{Label: strings.Repeat("l", MaxLabelLength), Cells: map[string]string{}}
	for key := range cellKeys {
		row.Cells[key] = strings.Repeat("1", MaxCellLength)
	}
	empty := size()
	p.Bench.Rows = []BenchRow{row}
	perRow := size() - empty
	for range (MaxFileBytes - empty - MaxNotesBytes/2) / perRow {
		p.Bench.Rows = append(p.Bench.Rows, row)
	}
	p.Notes = strings.Repeat("n", MaxFileBytes-size()-20)
	if n := size(); n > MaxFileBytes || n < MaxFileBytes-20 {
		t.Fatalf("the test project takes %d bytes, want just under %d", n, MaxFileBytes)
	}
	s := Store{FS: newFS(t), Writer: pageA}
	if _, err := s.Save(p, Revision{}, monday); !errors.Is(err, ErrTooLong) || copoly.Field(err) != "project" {
		t.Fatalf("Save(near the limit) error %v, want one wrapping ErrTooLong for field project", err)
	}
	if cur := read(t, s.FS, CurrentPath); cur != "" {
		t.Errorf("a refused save wrote %d bytes", len(cur))
	}
}

func TestTidy(t *testing.T) {
	s := Store{FS: newFS(t), Writer: pageA}
	save(t, s, Demo(), Revision{}, monday)
	write(t, s.FS, Dir+"/saving-gone"+tmpSuffix, "half a fi")
	if _, err := s.SaveDraft("tab1", map[string]string{"r1": "0.4"}, Revision{}, monday); err != nil {
		t.Fatal(err)
	}
	// An earlier copoly kept a damaged current file here.
	write(t, s.FS, legacyDamagedPath, "{broken")

	// A moment later the temporary file may belong to a save in progress: it stays.
	if _, err := s.Load(time.Now()); err != nil {
		t.Fatal(err)
	}
	if read(t, s.FS, Dir+"/saving-gone"+tmpSuffix) == "" {
		t.Error("Load() removed a fresh temporary file")
	}
	if read(t, s.FS, legacyDamagedPath) != "" {
		t.Errorf("Load() left %s in place", legacyDamagedPath)
	}
	if k, _ := s.Kept(); len(k) != 1 || k[0].Kind != KindDamaged {
		t.Errorf("after Load() the kept copies are %v, want the old damaged file", keptNames(k))
	}

	// Two hours on (past staleTmp) it is removed; 31 days on (past DraftMaxAge) the draft too.
	l, err := s.Load(time.Now().Add(2 * time.Hour))
	if err != nil || l.Project == nil {
		t.Fatalf("Load() = %+v, %v", l, err)
	}
	if read(t, s.FS, Dir+"/saving-gone"+tmpSuffix) != "" {
		t.Error("Load() kept a temporary file two hours old")
	}
	if d, _ := s.LoadDraft("tab1"); d == nil {
		t.Error("Load() removed a draft two hours old")
	}
	if _, err := s.Load(time.Now().Add(31 * 24 * time.Hour)); err != nil {
		t.Fatal(err)
	}
	if d, _ := s.LoadDraft("tab1"); d != nil {
		t.Error("Load() kept a draft 31 days old")
	}
	if l := load(t, s); l.Project == nil || l.Project.Name != Demo().Name {
		t.Errorf("tidying touched the project: %+v", l.Project)
	}
}
