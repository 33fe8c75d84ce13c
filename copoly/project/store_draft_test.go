package project

import (
	"errors"
	"fmt"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
)

func TestDraft(t *testing.T) {
	s := Store{FS: newFS(t), Writer: pageA}
	if d, err := s.LoadDraft("tab1"); d != nil || err != nil {
		t.Fatalf("LoadDraft() with none = %+v, %v, want nil, nil", d, err)
	}
	base := Revision{N: 3, Writer: pageB}
	// Invalid and half-typed text is kept exactly as typed.
	fields := map[string]string{"r1": "0,4", "r2": "-0.0x", "notes": "line 1\nline 2 “quoted”", "mass1": ""}
	d, err := s.SaveDraft("tab1", fields, base, monday)
	if err != nil {
		t.Fatal(err)
	}
	// monday above with its milliseconds.
	if d.SavedAt != "2026-03-02T09:30:15.500Z" {
		t.Errorf("SaveDraft().SavedAt = %q, want 2026-03-02T09:30:15.500Z", d.SavedAt)
	}
	if _, err := s.SaveDraft("tab2", map[string]string{"r1": "9"}, Revision{}, tuesday); err != nil {
		t.Fatal(err)
	}
	got, err := s.LoadDraft("tab1")
	if err != nil || got == nil || !reflect.DeepEqual(*got, d) || !reflect.DeepEqual(got.Fields, fields) {
		t.Fatalf("LoadDraft(tab1) = %+v, %v, want %+v", got, err, d)
	}
	// Each page has its own draft, and saving or loading drafts leaves the project alone.
	if other, _ := s.LoadDraft("tab2"); other == nil || other.Fields["r1"] != "9" {
		t.Errorf("LoadDraft(tab2) = %+v", other)
	}
	if l := load(t, s); l.Project != nil {
		t.Errorf("drafts made a project: %+v", l.Project)
	}
	if err := s.DropDraft("tab1"); err != nil {
		t.Fatal(err)
	}
	if d, _ := s.LoadDraft("tab1"); d != nil {
		t.Errorf("LoadDraft() after DropDraft() = %+v", d)
	}
	if err := s.DropDraft("tab1"); err != nil {
		t.Errorf("DropDraft() with none: %v", err)
	}
	if other, _ := s.LoadDraft("tab2"); other == nil {
		t.Error("DropDraft(tab1) removed tab2's draft")
	}

	// A damaged draft reads as none.
	for _, bad := range []string{`{"format":"copoly-dra`, `{"format":"other","version":1,"savedAt":"2026-03-02T09:30:15Z","fields":{}}`,
		`{"format":"copoly-draft","version":2,"savedAt":"2026-03-02T09:30:15Z","fields":{}}`,
		`{"format":"copoly-draft","version":1,"savedAt":"monday","fields":{}}`,
		`{"format":"copoly-draft","version":1,"savedAt":"2026-03-02T09:30:15Z"}`,
		`{"format":"copoly-draft","version":1,"savedAt":"2026-03-02T09:30:15Z","fields":{"a/b":"x"}}`} {
		write(t, s.FS, draftPath("tab3"), bad)
		if d, err := s.LoadDraft("tab3"); d != nil || err != nil {
			t.Errorf("LoadDraft() of %s = %+v, %v, want nil, nil", bad, d, err)
		}
	}
}

func TestDraftRefused(t *testing.T) {
	many := map[string]string{}
	for i := range MaxDraftFields + 1 {
		many[fmt.Sprintf("f%d", i)] = ""
	}
	tests := []struct {
		name   string
		tab    string
		fields map[string]string
		base   Revision
		field  string
		err    error
	}{
		{name: "no tab", tab: "", fields: map[string]string{}, field: "tab", err: ErrWrongType},
		{name: "tab with a dot", tab: "../x", fields: map[string]string{}, field: "tab", err: ErrWrongType},
		{name: "too many inputs", tab: "t", fields: many, field: "fields", err: copoly.ErrTooMany},
		{name: "input name with a space", tab: "t", fields: map[string]string{"r 1": "2"}, field: "fields.r 1", err: ErrWrongType},
		{name: "too long", tab: "t", fields: map[string]string{"notes": strings.Repeat("n", MaxDraftBytes)}, field: "fields", err: ErrTooLong},
		{name: "bad base", tab: "t", fields: map[string]string{}, base: Revision{N: -2, Writer: "x"}, field: "basedOn.n", err: copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := Store{FS: newFS(t), Writer: pageA}
			_, err := s.SaveDraft(tt.tab, tt.fields, tt.base, monday)
			if copoly.Field(err) != tt.field || !errors.Is(err, tt.err) {
				t.Errorf("SaveDraft() error %v, want one for %q wrapping %v", err, tt.field, tt.err)
			}
		})
	}
}

func TestDraftNewer(t *testing.T) {
	p := Demo()
	p.SavedAt = "2026-03-02T09:30:15Z"
	rev := Revision{N: 4, Writer: pageA}
	at := func(s string, base Revision) Draft {
		return Draft{Format: DraftFormat, Version: 1, SavedAt: s, BasedOn: base}
	}
	tests := []struct {
		name string
		d    Draft
		p    *Project
		rev  Revision
		want bool
	}{
		{name: "typed on this revision, earlier clock", d: at("2026-03-01T00:00:00.000Z", rev), p: &p, rev: rev, want: true},
		{name: "typed on an older revision, before the save", d: at("2026-03-02T09:30:14.999Z", Revision{N: 3, Writer: pageA}), p: &p, rev: rev, want: false},
		{name: "typed on an older revision, after the save", d: at("2026-03-02T09:30:16.000Z", Revision{N: 3, Writer: pageA}), p: &p, rev: rev, want: true},
		{name: "nothing stored", d: at("2026-03-01T00:00:00.000Z", rev), p: nil, rev: Revision{}, want: true},
		{name: "project never stamped", d: at("2026-03-01T00:00:00.000Z", Revision{N: 1, Writer: pageB}), p: &Project{}, rev: rev, want: true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.d.Newer(tt.p, tt.rev); got != tt.want {
				t.Errorf("Draft{savedAt %s, basedOn %v}.Newer(savedAt %v, %v) = %v, want %v", tt.d.SavedAt, tt.d.BasedOn, tt.p, tt.rev, got, tt.want)
			}
		})
	}
}

func TestKept(t *testing.T) {
	s := Store{FS: newFS(t), Writer: pageA}
	if k, err := s.Kept(); k != nil || err != nil {
		t.Fatalf("Kept() with none = %v, %v", k, err)
	}
	a, err := s.keep(KindDamaged, []byte("first"), monday)
	if err != nil {
		t.Fatal(err)
	}
	// monday above in the name's layout.
	if a.Name != "damaged-20260302T093015Z.json" {
		t.Errorf("kept name %q, want damaged-20260302T093015Z.json", a.Name)
	}
	// The same bytes are not kept twice; other bytes in the same second get a new name.
	if again, _ := s.keep(KindDamaged, []byte("first"), tuesday); again.Name != a.Name {
		t.Errorf("keeping the same bytes again made %q, want %q", again.Name, a.Name)
	}
	b, err := s.keep(KindDamaged, []byte("other"), monday)
	if err != nil || b.Name != "damaged-20260302T093015Z-2.json" {
		t.Errorf("second copy in the same second = %+v, %v, want damaged-20260302T093015Z-2.json", b, err)
	}
	kept, err := s.Kept()
	if err != nil || len(kept) != 2 {
		t.Fatalf("Kept() = %v, %v, want two", keptNames(kept), err)
	}
	k, data, err := s.ReadKept(b.Name)
	if err != nil || string(data) != "other" || k.Size != 5 || k.Kind != KindDamaged {
		t.Errorf("ReadKept(%s) = %+v, %q, %v", b.Name, k, data, err)
	}

	// Names that are not kept copies are refused before any file is touched.
	write(t, s.FS, CurrentPath, "{}")
	for _, name := range []string{"", "current.json", "../current.json", "damaged-../../current.json", "damaged-.json", "conflict-a b.json", "damaged-x.json.tmp", "damaged-nothere.json"} {
		if _, _, err := s.ReadKept(name); !errors.Is(err, ErrNoKept) || copoly.Field(err) != "name" {
			t.Errorf("ReadKept(%q) error %v, want one wrapping ErrNoKept", name, err)
		}
		if err := s.DropKept(name); !errors.Is(err, ErrNoKept) {
			t.Errorf("DropKept(%q) error %v, want one wrapping ErrNoKept", name, err)
		}
	}
	if read(t, s.FS, CurrentPath) != "{}" {
		t.Error("a refused name touched the current file")
	}

	if err := s.DropKept(a.Name); err != nil {
		t.Fatal(err)
	}
	if kept, _ := s.Kept(); len(kept) != 1 || kept[0].Name != b.Name {
		t.Errorf("after DropKept(%s): %v", a.Name, keptNames(kept))
	}
}

func TestLatestDraft(t *testing.T) {
	at := func(s string) *Draft { return &Draft{SavedAt: s} }
	early, late := at("2026-03-02T09:30:15.250Z"), at("2026-03-02T09:30:15.251Z")
	tie := at("2026-03-02T10:30:15.251+01:00") // the instant of late, in another zone
	tests := []struct {
		name string
		a, b *Draft
		want *Draft
	}{
		{"both nil", nil, nil, nil},
		{"a only", early, nil, early},
		{"b only", nil, late, late},
		{"b later", early, late, late},
		{"a later", late, early, late},
		{"same instant", late, tie, late},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := LatestDraft(tt.a, tt.b); got != tt.want {
				t.Errorf("LatestDraft(%v, %v) = %v, want %v", tt.a, tt.b, got, tt.want)
			}
		})
	}
}

func TestCheckDraft(t *testing.T) {
	good := Draft{Format: DraftFormat, Version: 1, SavedAt: "2026-03-02T09:30:15.250Z", BasedOn: Revision{N: 2, Writer: pageA}, Fields: map[string]string{"r1": "0,4"}}
	if err := CheckDraft("draft", good); err != nil {
		t.Fatalf("CheckDraft(good) = %v", err)
	}
	tests := []struct {
		name  string
		edit  func(d *Draft)
		field string
	}{
		{"other format", func(d *Draft) { d.Format = "copoly-project" }, "draft"},
		{"version 2", func(d *Draft) { d.Version = 2 }, "draft"},
		{"time not RFC 3339", func(d *Draft) { d.SavedAt = "2.3.2026" }, "draft.savedAt"},
		{"no fields", func(d *Draft) { d.Fields = nil }, "draft.fields"},
		{"bad base", func(d *Draft) { d.BasedOn = Revision{N: 1} }, "draft.basedOn.writer"},
		{"bad input name", func(d *Draft) { d.Fields = map[string]string{"a.b": ""} }, "draft.fields.a.b"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d := good
			tt.edit(&d)
			if err := CheckDraft("draft", d); copoly.Field(err) != tt.field {
				t.Errorf("CheckDraft() = %v, want an error for %q", err, tt.field)
			}
		})
	}
}
