package project

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
	"copoly/copoly/fit"
	"copoly/copoly/molarmass"
)

// Tests of the sequences and chain-size panels' sections of a project: model, triads and
// sizeBins. The expected field names are the keys of Project in site/copoly.d.ts with the
// "project." prefix of the package documentation; the limits are MaxTriadRows and MaxSizeBins.
// The numbers in the projects are invented for the tests.

func num(x float64) *float64 { return &x }

// panelsProject returns the demo with every new section filled in.
func panelsProject() Project {
	p := Demo()
	p.Model = &Model{Kind: ModelPenultimate, R11: num(0.9), R21: num(0.6), R22: num(0.2), R12: num(0), S1: num(1.5)}
	p.Triads = []TriadRow{
		{F10: 0.3, F1: num(0.41), A111: num(0.12), A112: num(0.45), A212: num(0.43)},
		{F10: 0.7, A222: num(0.05), A221: num(0.35), A121: num(0.6), F1: num(NotMeasured)},
		{F10: 0.5},
	}
	p.SizeBins = []SizeBin{{Low: 5000, High: 15000, WeightFraction: 0.5}, {Low: 25000, High: 35000, WeightFraction: 0.5}, {Low: 0, High: 0}}
	return p
}

func TestValidatePanels(t *testing.T) {
	tests := []struct {
		name  string
		edit  func(p *Project)
		field string // "" when valid
		err   error
	}{
		{name: "every section", edit: func(p *Project) {}},
		{name: "none", edit: func(p *Project) { p.Model, p.Triads, p.SizeBins = nil, nil, nil }},
		{name: "terminal without ratios", edit: func(p *Project) { p.Model = &Model{Kind: ModelTerminal} }},
		{name: "implicit keeps penultimate ratios", edit: func(p *Project) { p.Model.Kind = ModelImplicit }},
		{name: "large ratio kept as typed", edit: func(p *Project) { p.Model.R11 = num(1e6) }},
		{name: "triad at the bounds", edit: func(p *Project) { p.Triads[0].A111, p.Triads[0].F10 = num(0), 1 }},
		{name: "most triad rows", edit: func(p *Project) { p.Triads = make([]TriadRow, MaxTriadRows) }},
		{name: "most size bins", edit: func(p *Project) { p.SizeBins = make([]SizeBin, MaxSizeBins) }},

		{name: "kind empty", edit: func(p *Project) { p.Model.Kind = "" }, field: "project.model.kind", err: ErrNotAllowed},
		{name: "kind in capitals", edit: func(p *Project) { p.Model.Kind = "Terminal" }, field: "project.model.kind", err: ErrNotAllowed},
		{name: "kind too long", edit: func(p *Project) { p.Model.Kind = strings.Repeat("t", MaxPlanWordLength+1) }, field: "project.model.kind", err: ErrTooLong},
		{name: "r11 negative", edit: func(p *Project) { p.Model.R11 = num(-0.1) }, field: "project.model.r11", err: copoly.ErrOutOfRange},
		{name: "r12 NaN", edit: func(p *Project) { p.Model.R12 = num(math.NaN()) }, field: "project.model.r12", err: copoly.ErrNotFinite},
		{name: "s2 infinite", edit: func(p *Project) { p.Model.S2 = num(math.Inf(1)) }, field: "project.model.s2", err: copoly.ErrNotFinite},
		{name: "too many triad rows", edit: func(p *Project) { p.Triads = make([]TriadRow, MaxTriadRows+1) }, field: "project.triads", err: copoly.ErrTooMany},
		{name: "triad f10 above one", edit: func(p *Project) { p.Triads[1].F10 = 1.2 }, field: "project.triads[1].f10", err: copoly.ErrOutOfRange},
		{name: "triad f10 not measured", edit: func(p *Project) { p.Triads[1].F10 = NotMeasured }, field: "project.triads[1].f10", err: copoly.ErrOutOfRange},
		{name: "triad F1 above one", edit: func(p *Project) { p.Triads[0].F1 = num(41) }, field: "project.triads[0].F1", err: copoly.ErrOutOfRange},
		{name: "triad negative but not -1", edit: func(p *Project) { p.Triads[2].A121 = num(-0.5) }, field: "project.triads[2].A121", err: copoly.ErrOutOfRange},
		{name: "triad NaN", edit: func(p *Project) { p.Triads[0].A212 = num(math.NaN()) }, field: "project.triads[0].A212", err: copoly.ErrNotFinite},
		{name: "too many size bins", edit: func(p *Project) { p.SizeBins = make([]SizeBin, MaxSizeBins+1) }, field: "project.sizeBins", err: copoly.ErrTooMany},
		{name: "size bin low negative", edit: func(p *Project) { p.SizeBins[1].Low = -1 }, field: "project.sizeBins[1].low", err: copoly.ErrOutOfRange},
		{name: "size bin fraction infinite", edit: func(p *Project) { p.SizeBins[0].NumberFraction = math.Inf(1) }, field: "project.sizeBins[0].numberFraction", err: copoly.ErrNotFinite},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := panelsProject()
			tt.edit(&p)
			err := p.Validate()
			wantValidate(t, err, tt.field, tt.err)
		})
	}
}

func TestPanelsRoundTrip(t *testing.T) {
	onlyModel := Demo()
	onlyModel.Model = &Model{Kind: ModelImplicit, S1: num(0.5), S2: num(2)}
	zeros := Demo()
	zeros.Model = &Model{Kind: ModelPenultimate, R11: num(0), R21: num(0), R22: num(0), R12: num(0)}
	zeros.Triads = []TriadRow{{F10: 0, F1: num(0), A111: num(0)}}
	for _, c := range []struct {
		name string
		p    Project
	}{
		{"every section", panelsProject()},
		{"implicit", onlyModel},
		{"zeros are kept", zeros},
	} {
		t.Run(c.name, func(t *testing.T) {
			data, err := Marshal(c.p)
			if err != nil {
				t.Fatalf("Marshal() error %v", err)
			}
			got, err := Parse(data)
			if err != nil {
				t.Fatalf("Parse(Marshal(p)) error %v\n%s", err, data)
			}
			if !reflect.DeepEqual(got, c.p) {
				t.Errorf("Parse(Marshal(p)) = %+v, want %+v", got, c.p)
			}
		})
	}
}

func TestParsePanels(t *testing.T) {
	with := func(keys string) string {
		return strings.Replace(minimal, `"tolerance":0.05`, `"tolerance":0.05,`+keys, 1)
	}
	t.Run("keys of the d.ts", func(t *testing.T) {
		p, err := Parse([]byte(with(`"model":{"kind":"penultimate","r11":0.9,"r21":0.6,"r22":0.2,"r12":0.1},
			"triads":[{"f10":0.3,"F1":0.41,"A111":0.12,"A112":0.45,"A212":0.43},{"f10":0.6,"A222":-1}],
			"sizeBins":[{"low":10000,"high":20000,"numberFraction":0.25},{"low":20000,"high":40000}]`)))
		if err != nil {
			t.Fatalf("Parse() error %v", err)
		}
		// Values as written just above.
		want := Project{Model: &Model{Kind: "penultimate", R11: num(0.9), R21: num(0.6), R22: num(0.2), R12: num(0.1)},
			Triads:   []TriadRow{{F10: 0.3, F1: num(0.41), A111: num(0.12), A112: num(0.45), A212: num(0.43)}, {F10: 0.6, A222: num(-1)}},
			SizeBins: []SizeBin{{Low: 10000, High: 20000, NumberFraction: 0.25}, {Low: 20000, High: 40000}}}
		if !reflect.DeepEqual(p.Model, want.Model) || !reflect.DeepEqual(p.Triads, want.Triads) || !reflect.DeepEqual(p.SizeBins, want.SizeBins) {
			t.Errorf("Parse() = model %+v, triads %+v, sizeBins %+v, want %+v, %+v, %+v", p.Model, p.Triads, p.SizeBins, want.Model, want.Triads, want.SizeBins)
		}
	})
	for _, keys := range []string{`"model":null,"triads":null,"sizeBins":null`, `"triads":[],"sizeBins":[]`} {
		t.Run(keys+" is none", func(t *testing.T) {
			p, err := Parse([]byte(with(keys)))
			if err != nil || p.Model != nil || p.Triads != nil || p.SizeBins != nil {
				t.Errorf("Parse(%s) = %+v, %+v, %+v, %v, want none", keys, p.Model, p.Triads, p.SizeBins, err)
			}
		})
	}
	for _, c := range []struct {
		name, keys, field string
		err               error
		text              string
	}{
		{"model a list", `"model":[]`, "project.model", ErrWrongType, "an object"},
		{"model kind unknown", `"model":{"kind":"ultimate"}`, "project.model.kind", ErrNotAllowed, `"ultimate"`},
		{"model without kind", `"model":{"r11":1}`, "project.model.kind", ErrMissing, "is missing"},
		{"model ratio text", `"model":{"kind":"implicit","s1":"1.2"}`, "project.model.s1", ErrWrongType, "a number"},
		{"triads an object", `"triads":{"f10":0.5}`, "project.triads", ErrWrongType, "a list"},
		{"triad value text", `"triads":[{"f10":0.5,"A112":"0,4"}]`, "project.triads[0].A112", ErrWrongType, `must be a number, not the text "0,4"`},
		{"triad value out of range", `"triads":[{"f10":0.5},{"f10":0.5,"A112":1.4}]`, "project.triads[1].A112", copoly.ErrOutOfRange, "not measured"},
		{"size bin negative", `"sizeBins":[{"low":-5,"high":10}]`, "project.sizeBins[0].low", copoly.ErrOutOfRange, "negative"},
		{"size bins a number", `"sizeBins":3`, "project.sizeBins", ErrWrongType, "a list"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse([]byte(with(c.keys)))
			if got := copoly.Field(err); got != c.field {
				t.Errorf("Parse(%s) field = %q, want %q (error %v)", c.keys, got, c.field, err)
			}
			if !errors.Is(err, c.err) {
				t.Errorf("Parse(%s) = %v, want an error wrapping %v", c.keys, err, c.err)
			}
			if err != nil && !strings.Contains(err.Error(), c.text) {
				t.Errorf("Parse(%s) = %q, want it to contain %q", c.keys, err, c.text)
			}
		})
	}
}

func TestTriadRowRun(t *testing.T) {
	// Absent and NotMeasured both become a value below 0, which fit.TriadRun reads as not
	// measured (its doc comment).
	r := TriadRow{F10: 0.4, F1: num(0.5), A121: num(NotMeasured)}.Run()
	want := fit.TriadRun{F10: 0.4, F1: 0.5, A111: -1, A112: -1, A212: -1, A222: -1, A221: -1, A121: -1}
	if r != want {
		t.Errorf("Run() = %+v, want %+v", r, want)
	}
	b := SizeBin{Low: 1, High: 2, NumberFraction: 3, WeightFraction: 4}.Bin()
	if b != (molarmass.Bin{Low: 1, High: 2, Number: 3, Weight: 4}) {
		t.Errorf("Bin() = %+v, want the same four numbers", b)
	}
}

func TestDemoModel(t *testing.T) {
	// The demo's sequences panel starts on the terminal model, with no triads or size classes
	// (the demo invents no measurements for them).
	p := Demo()
	if p.Model == nil || p.Model.Kind != ModelTerminal || p.Triads != nil || p.SizeBins != nil {
		t.Errorf("Demo() = model %+v, triads %v, sizeBins %v, want a terminal model and no tables", p.Model, p.Triads, p.SizeBins)
	}
}
