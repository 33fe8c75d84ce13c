package project

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
	"copoly/copoly/bench"
)

// minimal is a hand-written project file with every required key and nothing else; the keys
// are those of Project in site/copoly.d.ts.
const minimal = `{"format":"copoly-project","version":1,
 "monomer1":{"name":"A","molarMass":0},"monomer2":{"name":"B","molarMass":0},
 "r1":0.5,"r2":2,"f10":0.3,"conversion":0.8,"tolerance":0.05}`

func TestParseRoundTrip(t *testing.T) {
	saved := Demo()
	saved.SavedAt = "2026-03-04T05:06:07Z"
	noMasses := Demo()
	noMasses.Monomer1.MolarMass, noMasses.Monomer2.MolarMass = 0, 0
	noMasses.Invented = false
	noBench := Demo()
	noBench.Bench = nil
	fitted := Demo()
	fitted.Level = 0.9
	fitted.JCR = [][2]float64{{0.71, 0.15}, {0.8, 0.136}, {0.895, 0.16}, {0.8, 0.185}}
	fitted.Bench.Rows[1].Cells["F1"] = "0,418 (re-run?)"
	fitted.Bench.Rows[2].Cells = nil
	fitted.Bench.Rows = append(fitted.Bench.Rows, BenchRow{Label: `quote " and tab 	`, Cells: map[string]string{"sX": "", "integral1": "1e3"}})
	emptyBench := Demo()
	emptyBench.Bench = &Bench{}
	noPlan := Demo()
	noPlan.Plan = nil
	emptyPlan := Demo()
	emptyPlan.Plan = &Plan{}
	fullPlan := Demo()
	fullPlan.Plan = &Plan{Mode: "shots", TargetF1: 0.35, PolymerMass: 12.5, Tolerance: 0.01, StopConversion: 0.4,
		FinalConversion: 0.9, Feed: "mixture", FeedF1: 0.55, Shots: 9, RateLaw: RateTable, RateConstant: 0.004, HalfLife: 170,
		TimeTable: [][2]float64{{0, 0}, {12.5, 0.05}, {40, 0.3}}, Heat1: 69.9, Heat2: 77.4,
		BatchMass: 40, HeatCapacity: 1.9, RiseLimit: 20}
	tests := []struct {
		name string
		p    Project
	}{
		{"demo", Demo()},
		{"saved", saved},
		{"no molar masses", noMasses},
		{"no bench", noBench},
		{"fitted, odd cells", fitted},
		{"empty bench", emptyBench},
		{"no plan", noPlan},
		{"empty plan", emptyPlan},
		{"every plan key", fullPlan},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			data, err := Marshal(tt.p)
			if err != nil {
				t.Fatalf("Marshal() error %v", err)
			}
			got, err := Parse(data)
			if err != nil {
				t.Fatalf("Parse(Marshal(p)) error %v\n%s", err, data)
			}
			if !reflect.DeepEqual(got, tt.p) {
				t.Errorf("Parse(Marshal(p)) = %+v, want %+v", got, tt.p)
			}
		})
	}
}

func TestParseMinimal(t *testing.T) {
	p, err := Parse([]byte(minimal))
	if err != nil {
		t.Fatalf("Parse(minimal) error %v", err)
	}
	// Values as written in the minimal file above.
	want := Project{Format: Format, Version: 1, Monomer1: Monomer{Name: "A"}, Monomer2: Monomer{Name: "B"}, R1: 0.5, R2: 2, F10: 0.3, Conversion: 0.8, Tolerance: 0.05}
	if !reflect.DeepEqual(p, want) {
		t.Errorf("Parse(minimal) = %+v, want %+v", p, want)
	}
}

func TestMarshalRefusesInvalid(t *testing.T) {
	p := Demo()
	p.R1 = -1
	if data, err := Marshal(p); err == nil || copoly.Field(err) != "project.r1" {
		t.Errorf("Marshal(r1 = -1) = %q, %v, want an error for project.r1", data, err)
	}
}

// TestValidateRefusesInvalidUTF8 is the regression test of a FuzzProjectRoundTrip finding: a
// project built in Go with bytes that are not UTF-8 in a text field passed Validate, but
// Marshal writes U+FFFD in their place, so Parse(Marshal(p)) was not p.
func TestValidateRefusesInvalidUTF8(t *testing.T) {
	tests := []struct {
		name  string
		edit  func(p *Project)
		field string
	}{
		{"name", func(p *Project) { p.Name = "run \xff" }, "project.name"},
		{"monomer name", func(p *Project) { p.Monomer2.Name = "\xed\xa0\x80" }, "project.monomer2.name"},
		{"notes", func(p *Project) { p.Notes = "ok\xc1" }, "project.notes"},
		{"bench cell", func(p *Project) { p.Bench.Rows[0].Cells[bench.ColF1] = "\xc1" }, "project.bench.rows[0].cells.F1"},
		{"bench label", func(p *Project) { p.Bench.Rows[2].Label = "\x80" }, "project.bench.rows[2].label"},
		{"hazard", func(p *Project) { p.UserMonomers = []UserMonomer{{Name: "X", Hazards: []string{"\xfe"}}} }, "project.userMonomers[0].hazards[0]"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := Demo()
			tt.edit(&p)
			err := p.Validate()
			if copoly.Field(err) != tt.field || !errors.Is(err, ErrWrongType) || !strings.Contains(fmt.Sprint(err), "not valid UTF-8") {
				t.Errorf("Validate() = %v (field %q), want an ErrWrongType for %s", err, copoly.Field(err), tt.field)
			}
			if _, err := Marshal(p); copoly.Field(err) != tt.field {
				t.Errorf("Marshal() error %v, want one naming %s", err, tt.field)
			}
		})
	}
	// U+FFFD itself is ordinary text.
	p := Demo()
	p.Name = "\uFFFD"
	if err := p.Validate(); err != nil {
		t.Errorf("Validate(name U+FFFD) = %v", err)
	}
}

func TestParseErrors(t *testing.T) {
	// replace returns minimal with one substring replaced; it fails the test if old is absent.
	replace := func(old, new string) string {
		if !strings.Contains(minimal, old) {
			t.Fatalf("minimal has no %q", old)
		}
		return strings.Replace(minimal, old, new, 1)
	}
	tests := []struct {
		name  string
		data  string
		field string
		err   error
		text  string // a phrase the message must contain
	}{
		// Not a project at all.
		{name: "empty", data: "", field: "project", err: ErrNotProject, text: "not a copoly project file"},
		{name: "white space", data: " \n\t", field: "project", err: ErrNotProject, text: "empty"},
		{name: "not JSON", data: "r1,r2\n0.5,2\n", field: "project", err: ErrNotProject, text: "not valid JSON"},
		{name: "array", data: `[1,2,3]`, field: "project", err: ErrNotProject, text: "array"},
		{name: "string", data: `"copoly-project"`, field: "project", err: ErrNotProject, text: "string"},
		{name: "null", data: `null`, field: "project", err: ErrNotProject, text: "null"},
		{name: "foreign object", data: `{"name":"package","dependencies":{}}`, field: "project", err: ErrNotProject, text: "not a copoly project file"},
		{name: "other format", data: replace(`"copoly-project"`, `"something-else"`), field: "project.format", err: ErrNotProject, text: "something-else"},
		{name: "format not text", data: replace(`"copoly-project"`, `7`), field: "project.format", err: ErrWrongType, text: "must be text, not the number 7"},
		{name: "format missing", data: replace(`"format":"copoly-project",`, ``), field: "project.format", err: ErrMissing, text: "missing"},
		{name: "trailing garbage", data: minimal + ` x`, field: "project", err: ErrNotProject, text: "after the end"},
		{name: "two objects", data: minimal + minimal, field: "project", err: ErrNotProject, text: "after the end"},
		{name: "truncated", data: minimal[:len(minimal)-10], field: "project", err: ErrNotProject, text: "not valid JSON"},
		{name: "too large", data: strings.Repeat(" ", MaxFileBytes+1), field: "project", err: ErrNotProject, text: "bytes"},

		// Versions.
		{name: "newer version", data: replace(`"version":1`, `"version":2`), field: "project.version", err: ErrNewerVersion, text: "made by a newer copoly"},
		{name: "newer version with new layout", data: `{"format":"copoly-project","version":3,"ratios":[0.5,2]}`, field: "project.version", err: ErrNewerVersion, text: "made by a newer copoly"},
		{name: "version zero", data: replace(`"version":1`, `"version":0`), field: "project.version", err: ErrNotProject},
		{name: "version text", data: replace(`"version":1`, `"version":"1"`), field: "project.version", err: ErrWrongType},
		{name: "version missing", data: replace(`"version":1,`, ``), field: "project.version", err: ErrMissing},

		// Missing required values.
		{name: "r1 missing", data: replace(`"r1":0.5,`, ``), field: "project.r1", err: ErrMissing, text: "missing"},
		{name: "r2 null", data: replace(`"r2":2`, `"r2":null`), field: "project.r2", err: ErrMissing},
		{name: "monomer1 missing", data: replace(`"monomer1":{"name":"A","molarMass":0},`, ``), field: "project.monomer1", err: ErrMissing},
		{name: "tolerance missing", data: replace(`,"tolerance":0.05`, ``), field: "project.tolerance", err: ErrMissing},
		{name: "keys are case sensitive", data: replace(`"f10":0.3`, `"F10":0.3`), field: "project.f10", err: ErrMissing},

		// Wrong JSON types.
		{name: "r1 text", data: replace(`"r1":0.5`, `"r1":"0.5"`), field: "project.r1", err: ErrWrongType, text: "must be a number"},
		{name: "molar mass text", data: replace(`"molarMass":0}`, `"molarMass":"104"}`), field: "project.monomer1.molarMass", err: ErrWrongType},
		{name: "monomer2 a number", data: replace(`{"name":"B","molarMass":0}`, `2`), field: "project.monomer2", err: ErrWrongType, text: "object"},
		{name: "notes a list", data: replace(`"r1":0.5`, `"notes":["a"],"r1":0.5`), field: "project.notes", err: ErrWrongType},
		{name: "invented text", data: replace(`"r1":0.5`, `"invented":"yes","r1":0.5`), field: "project.invented", err: ErrWrongType},

		// Valid JSON, invalid values (Validate).
		{name: "r1 negative", data: replace(`"r1":0.5`, `"r1":-0.2`), field: "project.r1", err: copoly.ErrOutOfRange},
		{name: "f10 zero", data: replace(`"f10":0.3`, `"f10":0`), field: "project.f10", err: copoly.ErrOutOfRange},
		{name: "molar mass negative", data: replace(`"molarMass":0}`, `"molarMass":-5}`), field: "project.monomer1.molarMass", err: copoly.ErrOutOfRange},
		{name: "conversion above one", data: replace(`"conversion":0.8`, `"conversion":80`), field: "project.conversion", err: copoly.ErrOutOfRange},

		// Optional keys: bench, level, jcr.
		{name: "bench a list", data: replace(`"r1":0.5`, `"bench":[],"r1":0.5`), field: "project.bench", err: ErrWrongType, text: "object"},
		{name: "bench carrier fractional", data: replace(`"r1":0.5`, `"bench":{"carrier":1.5,"rows":[]},"r1":0.5`), field: "project.bench.carrier", err: ErrWrongType, text: "whole number"},
		{name: "bench cell a number", data: replace(`"r1":0.5`, `"bench":{"rows":[{"label":"a","cells":{"f10":0.5}}]},"r1":0.5`), field: "project.bench.rows[0].cells.f10", err: ErrWrongType, text: "must be text, not the number 0.5"},
		{name: "bench kind unknown", data: replace(`"r1":0.5`, `"bench":{"feedKind":"litres","rows":[]},"r1":0.5`), field: "project.bench.feedKind", err: ErrNotAllowed, text: "litres"},
		{name: "bench cell key unknown", data: replace(`"r1":0.5`, `"bench":{"rows":[{"label":"a","cells":{"f10":"0.5"}},{"label":"b","cells":{"colour":"red"}}]},"r1":0.5`), field: "project.bench.rows[1].cells", err: ErrNotAllowed, text: "colour"},
		{name: "bench without rows", data: replace(`"r1":0.5`, `"bench":{"feedKind":"mass"},"r1":0.5`), field: "project.bench.rows", err: ErrMissing, text: "missing"},
		{name: "bench row null", data: replace(`"r1":0.5`, `"bench":{"rows":[null]},"r1":0.5`), field: "project.bench.rows[0]", err: ErrWrongType, text: "must be an object, not null"},
		{name: "bench cell key too long", data: replace(`"r1":0.5`, `"bench":{"rows":[{"cells":{"`+strings.Repeat("k", MaxCellLength+1)+`":"1"}}]},"r1":0.5`), field: "project.bench.rows[0].cells", err: ErrTooLong, text: fmt.Sprintf("%d characters", MaxCellLength+1)},
		{name: "bench carrier huge", data: replace(`"r1":0.5`, `"bench":{"carrier":1e300,"rows":[]},"r1":0.5`), field: "project.bench.carrier", err: ErrWrongType, text: "1e+300"},
		{name: "triad without feed", data: replace(`"r1":0.5`, `"triads":[{"F1":0.5}],"r1":0.5`), field: "project.triads[0].f10", err: ErrMissing, text: "missing"},
		{name: "size class without high", data: replace(`"r1":0.5`, `"sizeBins":[{"low":1e4}],"r1":0.5`), field: "project.sizeBins[0].high", err: ErrMissing, text: "missing"},
		{name: "level text", data: replace(`"r1":0.5`, `"level":"95%","r1":0.5`), field: "project.level", err: ErrWrongType},
		{name: "level percent", data: replace(`"r1":0.5`, `"level":95,"r1":0.5`), field: "project.level", err: copoly.ErrOutOfRange},
		{name: "jcr a number", data: replace(`"r1":0.5`, `"jcr":5,"r1":0.5`), field: "project.jcr", err: ErrWrongType, text: "a list"},
		{name: "jcr point short", data: replace(`"r1":0.5`, `"jcr":[[0.5,0.2],[0.5]],"r1":0.5`), field: "project.jcr[1]", err: ErrWrongType, text: "pair"},
		{name: "jcr point long", data: replace(`"r1":0.5`, `"jcr":[[0.5,0.2,0.1]],"r1":0.5`), field: "project.jcr[0]", err: ErrWrongType, text: "pair"},
		{name: "jcr point text", data: replace(`"r1":0.5`, `"jcr":[["0.5",0.2]],"r1":0.5`), field: "project.jcr[0][0]", err: ErrWrongType, text: `must be a number, not the text "0.5"`},
		{name: "jcr point negative", data: replace(`"r1":0.5`, `"jcr":[[0.5,0.2],[-0.1,0.2]],"r1":0.5`), field: "project.jcr[1][0]", err: copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := Parse([]byte(tt.data))
			if err == nil {
				t.Fatalf("Parse() = %+v, nil, want an error for %q", p, tt.field)
			}
			if !reflect.DeepEqual(p, Project{}) {
				t.Errorf("Parse() returned %+v with its error, want the zero Project", p)
			}
			if got := copoly.Field(err); got != tt.field {
				t.Errorf("copoly.Field(Parse()) = %q, want %q (error %q)", got, tt.field, err)
			}
			if !errors.Is(err, tt.err) {
				t.Errorf("Parse() = %v, want an error wrapping %v", err, tt.err)
			}
			if !strings.Contains(err.Error(), tt.text) {
				t.Errorf("Parse() = %q, want a message containing %q", err, tt.text)
			}
		})
	}
}

// TestParseBench: a grid read on its own names its keys under the field given and is checked as
// a project's is.
func TestParseBench(t *testing.T) {
	want := *Demo().Bench
	data, err := json.Marshal(want)
	if err != nil {
		t.Fatal(err)
	}
	got, err := ParseBench("bench", data)
	if err != nil || !reflect.DeepEqual(got, want) {
		t.Errorf("ParseBench(Marshal(demo grid)) = %+v, %v; want %+v", got, err, want)
	}
	for _, c := range []struct{ data, field, text string }{
		{`{"rows":[{"label":5}]}`, "bench.rows[0].label", "must be text, not the number 5"},
		{`{"feedKind":"litres","rows":[]}`, "bench.feedKind", `"litres"`},
		{`{}`, "bench.rows", "missing"},
		{`[]`, "bench", "must be an object, not a list"},
		{`{"rows":[]} x`, "bench", "not valid JSON"},
	} {
		if _, err := ParseBench("bench", []byte(c.data)); copoly.Field(err) != c.field || !strings.Contains(err.Error(), c.text) {
			t.Errorf("ParseBench(%s) error %v, want one naming %s and saying %q", c.data, err, c.field, c.text)
		}
	}
}

// TestParseKeysAreExact: keys are matched exactly, so "JCR" is an unknown key, ignored like any
// other, even when it holds what "jcr" could not.
func TestParseKeysAreExact(t *testing.T) {
	p, err := Parse([]byte(strings.Replace(minimal, `"r1":0.5`, `"JCR":[[0.5]],"r1":0.5`, 1)))
	if err != nil || p.JCR != nil {
		t.Errorf("Parse(minimal with \"JCR\") = jcr %v, %v; want no region and no error", p.JCR, err)
	}
}

// TestParseOptionalKeys checks that the keys added to version 1 after its first files stay
// optional: a file without them reads with none set, and null counts as absent.
func TestParseOptionalKeys(t *testing.T) {
	for _, data := range []string{minimal, strings.Replace(minimal, `"r1":0.5`, `"bench":null,"level":null,"jcr":null,"r1":0.5`, 1)} {
		p, err := Parse([]byte(data))
		if err != nil {
			t.Fatalf("Parse(%s) error %v", data, err)
		}
		if p.Bench != nil || p.Level != 0 || p.JCR != nil {
			t.Errorf("Parse(%s) = bench %v, level %v, jcr %v, want none", data, p.Bench, p.Level, p.JCR)
		}
		out, err := Marshal(p)
		if err != nil {
			t.Fatal(err)
		}
		for _, key := range []string{`"bench"`, `"level"`, `"jcr"`} {
			if bytes.Contains(out, []byte(key)) {
				t.Errorf("Marshal() of a project without %s writes it:\n%s", key, out)
			}
		}
	}
}

func TestMarshalRefusesOversizedFile(t *testing.T) {
	// Every limit at its maximum gives a file above MaxFileBytes; Marshal must refuse it rather
	// than write a file Parse would refuse.
	p := Demo()
	p.Notes = strings.Repeat("n", MaxNotesBytes)
	p.Bench = &Bench{Rows: make([]BenchRow, MaxRows)}
	for i := range p.Bench.Rows {
		p.Bench.Rows[i] = BenchRow{Label: strings.Repeat("l", MaxLabelLength), Cells: map[string]string{}}
		for key := range cellKeys {
			p.Bench.Rows[i].Cells[key] = strings.Repeat("1", MaxCellLength)
		}
	}
	if err := p.Validate(); err != nil {
		t.Fatalf("Validate() = %v; the test needs a valid project", err)
	}
	data, err := Marshal(p)
	if err == nil || copoly.Field(err) != "project" || !errors.Is(err, ErrTooLong) {
		t.Errorf("Marshal(oversized) = %d bytes, %v, want an error for project wrapping ErrTooLong", len(data), err)
	}
}

func TestParseIgnoresUnknownKeys(t *testing.T) {
	data := strings.Replace(minimal, `"r1":0.5`, `"colour":"blue","r1":0.5`, 1)
	if _, err := Parse([]byte(data)); err != nil {
		t.Errorf("Parse(with an unknown key) = %v, want nil", err)
	}
}

func TestFilename(t *testing.T) {
	// Expected names follow the rule in the Filename doc comment.
	tests := []struct{ name, want string }{
		{Demo().Name, "demo-invented-harbour-lane-pilot-lab-styrene-n-butyl-acrylate-binder-trial.copoly.json"},
		{"", "copoly-project.copoly.json"},
		{"  ***  ", "copoly-project.copoly.json"},
		{"../../etc/passwd", "etc-passwd.copoly.json"},
		{`Run 7: MMA/BA <50 °C> "final"`, "run-7-mma-ba-50-c-final.copoly.json"},
		{"Poly(ε-caprolactone)", "poly-caprolactone.copoly.json"},
		{strings.Repeat("ab ", 60), strings.TrimSuffix(strings.Repeat("ab-", 27), "-") + ".copoly.json"},
	}
	for _, tt := range tests {
		if got := Filename(tt.name); got != tt.want {
			t.Errorf("Filename(%q) = %q, want %q", tt.name, got, tt.want)
		}
	}
}

// FuzzParse checks that Parse never panics, and that whatever it accepts is valid and survives
// Marshal and Parse unchanged. The seed corpus runs as a normal test.
func FuzzParse(f *testing.F) {
	demo, err := Marshal(Demo())
	if err != nil {
		f.Fatal(err)
	}
	for _, seed := range []string{
		string(demo), minimal, "", "{}", "[]", "null", `"x"`, "1e999",
		`{"format":"copoly-project","version":2}`,
		`{"format":"copoly-project","version":1e400}`,
		strings.Replace(minimal, `"r1":0.5`, `"r1":"a"`, 1),
		strings.Replace(minimal, `"name":"A"`, `"name":"\ud800"`, 1),
		minimal + "}",
		strings.Replace(minimal, `"r1":0.5`, `"level":0.9,"jcr":[[0.1,0.2],[0.3,0.4],[0.2,0.6]],"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"jcr":[[0.1],[0.3,0.4,0.5]],"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"bench":{"feedKind":"mass","conversionKind":"none","compositionKind":"nmr","element":"","carrier":0,"elementCount":0,"rows":[{"label":"S1","cells":{"mass1":"5,0","mass2":"x","integral1":"1e3","protons1":"5"}}]},"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"bench":{"rows":[{"cells":{"__proto__":"1","f10":"0.5"}}]},"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"bench":{"carrier":2.5,"rows":null},"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"userMonomers":[{"name":"X","molarMass":100.1,"density":1.1,"densityTemp":20,"state":"liquid","heat":55,"q":0.5,"e":-0.3,"hazards":["toxic","stains"],"note":"n"}],"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"userMonomers":[{"name":"X","hazards":[]},{"name":"x"}],"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"userMonomers":[null,{"name":"Y","state":"gas","hazards":[" "]}],"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"model":{"kind":"penultimate","r11":0.9,"r21":0,"r22":0.2},"triads":[{"f10":0.3,"F1":0.41,"A112":-1},{"f10":0.5}],"sizeBins":[{"low":1e4,"high":2e4,"weightFraction":0.5}],"r1":0.5`, 1),
		strings.Replace(minimal, `"r1":0.5`, `"model":{"kind":"implicit","s1":-1},"triads":[null,{"F10":0.5,"f1":2}],"sizeBins":[],"r1":0.5`, 1),
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Parse(data)
		if err != nil {
			// Typed (copoly.Field finds an InputError or FieldError), naming a field of the
			// project, which the message starts with.
			f := copoly.Field(err)
			if f != "project" && !strings.HasPrefix(f, "project.") || !strings.HasPrefix(err.Error(), f) {
				t.Errorf("Parse(%q) error %q names field %q, want project or project.…", data, err, f)
			}
			return
		}
		if err := p.Validate(); err != nil {
			t.Fatalf("Parse(%q) accepted a project that fails Validate: %v", data, err)
		}
		out, err := Marshal(p)
		if err != nil {
			t.Fatalf("Marshal(Parse(%q)) error %v", data, err)
		}
		again, err := Parse(out)
		if err != nil {
			t.Fatalf("Parse(Marshal(Parse(%q))) error %v", data, err)
		}
		if !reflect.DeepEqual(again, p) {
			t.Fatalf("round trip changed the project:\n%+v\n%+v", p, again)
		}
		if out2, _ := Marshal(again); !bytes.Equal(out, out2) {
			t.Fatalf("Marshal is not stable:\n%s\n%s", out, out2)
		}
	})
}

// FuzzProjectRoundTrip builds projects from the demo with fuzzed text and numbers in every kind
// of field. A project Validate refuses must be refused by Marshal with the same error, typed and
// naming a field under "project"; a project Validate accepts must come back from Marshal and
// Parse deeply equal, round trip after round trip, with the same file each time.
func FuzzProjectRoundTrip(f *testing.F) {
	d := Demo()
	f.Add(d.Name, d.Notes, d.RatioSource, "HL-09", "0,35", uint8(0), d.R1, d.R2, d.F10, d.Conversion, d.Tolerance,
		d.Monomer1.MolarMass, 0.95, 0.7, 0.12, 0.9, 70.0, 30.0, 0.4, "semibatch", "flammable", "2026-01-02T03:04:05Z")
	f.Add("", "", "", "", "", uint8(3), 0.0, 1e4, 1e-300, 1.0, 0.5, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, "", "x", "")
	f.Add("\xff", "a\x00b", "\xed\xa0\x80", "\u2028", "\"", uint8(7), -0.0, 1e4+1, 1.0, 0.0, 0.0, -1.0, 1.0, -0.0, math.NaN(), math.Inf(1), 1001.0, -1.0, 1.5, "Batch", " ", "2026-13-01")
	f.Add(strings.Repeat("é", MaxNameLength), strings.Repeat("\u00e9", MaxNotesBytes/2), "s", strings.Repeat("x", MaxLabelLength+1), strings.Repeat("9", MaxCellLength),
		uint8(15), 5e-324, math.MaxFloat64, 0.999999999, 1e-300, 0.49999, 999999.9, 1e-10, 1e308, 1e-308, 1e-7, 999.999, 1e15, 1.0, "shots", strings.Repeat("h", MaxHazardLength+1), "2026-01-02T03:04:05.123456789+14:00")
	keys := []string{bench.ColF10, bench.ColMass1, bench.ColMass2, bench.ColMoles1, bench.ColMoles2, bench.ColConversion, bench.ColF1,
		bench.ColMassFraction1, bench.ColIntegral1, bench.ColProtons1, bench.ColIntegral2, bench.ColProtons2,
		bench.ColElementPercent, bench.ColSF, bench.ColSX, bench.ColSf, "label", "F", ""}
	f.Fuzz(func(t *testing.T, name, notes, source, label, cell string, key uint8, r1, r2, f10, conv, tol, mm, level, j1, j2, r11, heat, tt0, tt1 float64,
		mode, hazard, savedAt string) {
		p := Demo()
		p.Name, p.Notes, p.RatioSource, p.SavedAt = name, notes, source, savedAt
		p.R1, p.R2, p.F10, p.Conversion, p.Tolerance, p.Level = r1, r2, f10, conv, tol, level
		p.Monomer1.MolarMass = mm
		p.Monomer2.Name = hazard
		p.Bench.Rows = append(p.Bench.Rows, BenchRow{Label: label, Cells: map[string]string{keys[int(key)%len(keys)]: cell}})
		p.JCR = [][2]float64{{j1, j2}, {j2, j1}, {r1, r2}}
		p.Model = &Model{Kind: ModelPenultimate, R11: &r11, R22: &j2}
		p.Triads = []TriadRow{{F10: f10, F1: &j1, A112: &level}}
		p.SizeBins = []SizeBin{{Low: j1, High: j2, WeightFraction: level}}
		p.Plan.Mode, p.Plan.Heat1, p.Plan.TimeTable = mode, heat, [][2]float64{{0, 0}, {tt0, tt1}}
		p.UserMonomers = []UserMonomer{{Name: name, MolarMass: mm, Heat: heat, Q: j1, E: -j2, Hazards: []string{hazard}, Note: source}}

		verr := p.Validate()
		data, merr := Marshal(p)
		if verr != nil {
			if merr == nil || merr.Error() != verr.Error() {
				t.Fatalf("Validate error %v, but Marshal error %v", verr, merr)
			}
			field := copoly.Field(verr)
			if field != "project" && !strings.HasPrefix(field, "project.") {
				t.Fatalf("Validate error %v names field %q", verr, field)
			}
			if !strings.HasPrefix(verr.Error(), field) {
				t.Fatalf("Validate error %q does not start with its field %q", verr, field)
			}
			return
		}
		if merr != nil {
			if errors.Is(merr, ErrTooLong) && copoly.Field(merr) == "project" {
				return // a valid project whose file would pass MaxFileBytes
			}
			t.Fatalf("Validate accepted the project but Marshal error %v", merr)
		}
		for round := 1; round <= 3; round++ {
			next, err := Parse(data)
			if err != nil {
				t.Fatalf("round %d: Parse(Marshal(p)) error %v\n%s", round, err, data)
			}
			if !reflect.DeepEqual(next, p) {
				t.Fatalf("round %d changed the project:\n%+v\n%+v", round, p, next)
			}
			again, err := Marshal(next)
			if err != nil || !bytes.Equal(again, data) {
				t.Fatalf("round %d: Marshal gave another file (%v):\n%s\n%s", round, err, data, again)
			}
			data = again
		}
	})
}

// TestExport: the file is Marshal's and the name Filename's; an invalid project gives
// Marshal's error.
func TestExport(t *testing.T) {
	p := Demo()
	data, name, err := Export(p)
	want, _ := Marshal(p)
	if err != nil || string(data) != string(want) || name != Filename(p.Name) {
		t.Errorf("Export = %d bytes, %q, %v; want Marshal's %d bytes and %q", len(data), name, err, len(want), Filename(p.Name))
	}
	p.R1 = -1
	if _, _, err := Export(p); copoly.Field(err) != "project.r1" {
		t.Errorf("r1 = -1: error %v, want one naming project.r1", err)
	}
}
