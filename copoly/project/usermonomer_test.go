package project

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
)

// The expected field names below are the keys of UserMonomer in site/copoly.d.ts with the
// "project.userMonomers[i]." prefix of the package documentation; the limits are the Max*
// constants documented on UserMonomer.

// ownMonomer is an invented entry of the kind a user adds: the molar mass of isobornyl acrylate
// (C13H20O2) from standard atomic weights, the other values made up for the test.
func ownMonomer() UserMonomer {
	return UserMonomer{Name: "isobornyl acrylate (our lot)", MolarMass: 208.30, Density: 0.986, DensityTemp: 25,
		State: copoly.StateLiquid, Heat: 60, Q: 0.4, E: 0.2,
		Hazards: []string{copoly.HazardIrritant, "harmful to aquatic life"}, Note: "invented test entry"}
}

func TestValidateUserMonomers(t *testing.T) {
	tests := []struct {
		name  string
		edit  func(ms []UserMonomer) []UserMonomer
		field string // "" when valid
		err   error  // sentinel the error must wrap
	}{
		{name: "one", edit: func(ms []UserMonomer) []UserMonomer { return ms }},
		{name: "none", edit: func(ms []UserMonomer) []UserMonomer { return nil }},
		{name: "name only", edit: func(ms []UserMonomer) []UserMonomer { return []UserMonomer{{Name: "x"}} }},
		{name: "e negative", edit: func(ms []UserMonomer) []UserMonomer { ms[0].E = -1.5; return ms }},
		{name: "every state", edit: func(ms []UserMonomer) []UserMonomer {
			return append(ms, UserMonomer{Name: "g", State: copoly.StateGas}, UserMonomer{Name: "s", State: copoly.StateSolid}, UserMonomer{Name: "n"})
		}},
		{name: "at the limits", edit: func(ms []UserMonomer) []UserMonomer {
			ms[0].Name = strings.Repeat("é", MaxNameLength)
			ms[0].Density, ms[0].DensityTemp, ms[0].Heat = MaxUserDensity, MaxUserDensityTemp, MaxUserHeat
			ms[0].Hazards = make([]string, MaxHazards)
			for i := range ms[0].Hazards {
				ms[0].Hazards[i] = strings.Repeat("h", MaxHazardLength)
			}
			ms[0].Note = strings.Repeat("n", MaxSourceLength)
			return ms
		}},
		{name: "most monomers", edit: func(ms []UserMonomer) []UserMonomer { return manyMonomers(MaxUserMonomers) }},
		{name: "names differ by more than case", edit: func(ms []UserMonomer) []UserMonomer {
			return append(ms, UserMonomer{Name: ms[0].Name + " 2"})
		}},

		{name: "too many", edit: func(ms []UserMonomer) []UserMonomer { return manyMonomers(MaxUserMonomers + 1) }, field: "project.userMonomers", err: copoly.ErrTooMany},
		{name: "name empty", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Name = ""; return ms }, field: "project.userMonomers[0].name", err: ErrMissing},
		{name: "name blank", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Name = "  "; return ms }, field: "project.userMonomers[0].name", err: ErrMissing},
		{name: "name too long", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Name = strings.Repeat("x", MaxNameLength+1); return ms }, field: "project.userMonomers[0].name", err: ErrTooLong},
		{name: "name repeated", edit: func(ms []UserMonomer) []UserMonomer {
			return append(ms, UserMonomer{Name: "b"}, UserMonomer{Name: " ISOBORNYL acrylate (our lot) "})
		}, field: "project.userMonomers[2].name", err: ErrNotAllowed},
		{name: "molar mass negative", edit: func(ms []UserMonomer) []UserMonomer { ms[0].MolarMass = -1; return ms }, field: "project.userMonomers[0].molarMass", err: copoly.ErrOutOfRange},
		{name: "molar mass NaN", edit: func(ms []UserMonomer) []UserMonomer { ms[0].MolarMass = math.NaN(); return ms }, field: "project.userMonomers[0].molarMass", err: copoly.ErrNotFinite},
		{name: "density negative", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Density = -0.9; return ms }, field: "project.userMonomers[0].density", err: copoly.ErrOutOfRange},
		{name: "density above limit", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Density = 900; return ms }, field: "project.userMonomers[0].density", err: copoly.ErrOutOfRange},
		{name: "density temperature negative", edit: func(ms []UserMonomer) []UserMonomer { ms[0].DensityTemp = -10; return ms }, field: "project.userMonomers[0].densityTemp", err: copoly.ErrOutOfRange},
		{name: "heat infinite", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Heat = math.Inf(1); return ms }, field: "project.userMonomers[0].heat", err: copoly.ErrNotFinite},
		{name: "heat in J/mol", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Heat = 70000; return ms }, field: "project.userMonomers[0].heat", err: copoly.ErrOutOfRange},
		{name: "q negative", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Q = -0.1; return ms }, field: "project.userMonomers[0].q", err: copoly.ErrOutOfRange},
		{name: "e NaN", edit: func(ms []UserMonomer) []UserMonomer { ms[0].E = math.NaN(); return ms }, field: "project.userMonomers[0].e", err: copoly.ErrNotFinite},
		{name: "state unknown", edit: func(ms []UserMonomer) []UserMonomer { ms[0].State = "Liquid"; return ms }, field: "project.userMonomers[0].state", err: ErrNotAllowed},
		{name: "state too long", edit: func(ms []UserMonomer) []UserMonomer {
			ms[0].State = strings.Repeat("l", MaxPlanWordLength+1)
			return ms
		}, field: "project.userMonomers[0].state", err: ErrTooLong},
		{name: "too many hazards", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Hazards = make([]string, MaxHazards+1); return ms }, field: "project.userMonomers[0].hazards", err: copoly.ErrTooMany},
		{name: "hazard blank", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Hazards[1] = " "; return ms }, field: "project.userMonomers[0].hazards[1]", err: ErrMissing},
		{name: "hazard too long", edit: func(ms []UserMonomer) []UserMonomer {
			ms[0].Hazards[0] = strings.Repeat("h", MaxHazardLength+1)
			return ms
		}, field: "project.userMonomers[0].hazards[0]", err: ErrTooLong},
		{name: "note too long", edit: func(ms []UserMonomer) []UserMonomer { ms[0].Note = strings.Repeat("n", MaxSourceLength+1); return ms }, field: "project.userMonomers[0].note", err: ErrTooLong},
		{name: "second entry checked", edit: func(ms []UserMonomer) []UserMonomer {
			return append(ms, UserMonomer{Name: "b", Density: math.Inf(-1)})
		}, field: "project.userMonomers[1].density", err: copoly.ErrNotFinite},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := Demo()
			p.UserMonomers = tt.edit([]UserMonomer{ownMonomer()})
			err := p.Validate()
			wantValidate(t, err, tt.field, tt.err)
		})
	}
}

// manyMonomers returns n user monomers with distinct names.
func manyMonomers(n int) []UserMonomer {
	ms := make([]UserMonomer, n)
	for i := range ms {
		ms[i] = UserMonomer{Name: "m" + strings.Repeat("x", i)}
	}
	return ms
}

func TestUserMonomersRoundTrip(t *testing.T) {
	bare := UserMonomer{Name: "only a name"}
	for _, c := range []struct {
		name string
		ms   []UserMonomer
	}{
		{"one", []UserMonomer{ownMonomer()}},
		{"name only", []UserMonomer{bare}},
		{"two", []UserMonomer{ownMonomer(), {Name: "vinyl ether X", E: -1.5, Q: 0.03, State: copoly.StateGas, Note: `quote " and tab 	`}}},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := Demo()
			p.UserMonomers = c.ms
			data, err := Marshal(p)
			if err != nil {
				t.Fatalf("Marshal() error %v", err)
			}
			got, err := Parse(data)
			if err != nil {
				t.Fatalf("Parse(Marshal(p)) error %v", err)
			}
			if !reflect.DeepEqual(got, p) {
				t.Errorf("Parse(Marshal(p)).UserMonomers = %+v, want %+v", got.UserMonomers, p.UserMonomers)
			}
		})
	}
	t.Run("left out when none", func(t *testing.T) {
		data, err := Marshal(Demo())
		if err != nil {
			t.Fatal(err)
		}
		if strings.Contains(string(data), "userMonomers") {
			t.Errorf("Marshal(Demo()) writes userMonomers though it has none:\n%s", data)
		}
	})
}

func TestParseUserMonomers(t *testing.T) {
	with := func(list string) string {
		return strings.Replace(minimal, `"tolerance":0.05`, `"tolerance":0.05,"userMonomers":`+list, 1)
	}
	t.Run("keys of the d.ts", func(t *testing.T) {
		p, err := Parse([]byte(with(`[{"name":"X","molarMass":100.1,"density":1.1,"densityTemp":20,"state":"solid",
			"heat":55,"q":0.5,"e":-0.3,"hazards":["toxic","stains"],"note":"from our data sheet"}]`)))
		if err != nil {
			t.Fatalf("Parse() error %v", err)
		}
		// Values as written just above.
		want := []UserMonomer{{Name: "X", MolarMass: 100.1, Density: 1.1, DensityTemp: 20, State: "solid", Heat: 55,
			Q: 0.5, E: -0.3, Hazards: []string{"toxic", "stains"}, Note: "from our data sheet"}}
		if !reflect.DeepEqual(p.UserMonomers, want) {
			t.Errorf("Parse().UserMonomers = %+v, want %+v", p.UserMonomers, want)
		}
	})
	for _, c := range []struct{ name, list string }{
		{"null", `null`},
		{"empty", `[]`},
	} {
		t.Run(c.name+" is none", func(t *testing.T) {
			p, err := Parse([]byte(with(c.list)))
			if err != nil || p.UserMonomers != nil {
				t.Errorf("Parse(userMonomers %s) = %+v, %v, want none", c.list, p.UserMonomers, err)
			}
		})
	}
	t.Run("empty hazards are none", func(t *testing.T) {
		p, err := Parse([]byte(with(`[{"name":"X","hazards":[]}]`)))
		if err != nil || len(p.UserMonomers) != 1 || p.UserMonomers[0].Hazards != nil {
			t.Errorf("Parse(hazards []) = %+v, %v, want one monomer without hazards", p.UserMonomers, err)
		}
	})
	for _, c := range []struct {
		name, list, field string
		err               error
		text              string
	}{
		{"not a list", `{"name":"X"}`, "project.userMonomers", ErrWrongType, "a list"},
		{"name a number", `[{"name":5}]`, "project.userMonomers[0].name", ErrWrongType, "must be text, not the number 5"},
		{"no name", `[{"molarMass":100}]`, "project.userMonomers[0].name", ErrMissing, "is missing"},
		{"density text", `[{"name":"X","density":"0,9"}]`, "project.userMonomers[0].density", ErrWrongType, "a number"},
		{"hazards text", `[{"name":"X","hazards":"toxic"}]`, "project.userMonomers[0].hazards", ErrWrongType, "a list"},
		{"state unknown", `[{"name":"X","state":"plasma"}]`, "project.userMonomers[0].state", ErrNotAllowed, `"plasma"`},
		{"names repeated", `[{"name":"X"},{"name":"x"}]`, "project.userMonomers[1].name", ErrNotAllowed, "already"},
		{"heat negative", `[{"name":"X","heat":-70}]`, "project.userMonomers[0].heat", copoly.ErrOutOfRange, "negative"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse([]byte(with(c.list)))
			if got := copoly.Field(err); got != c.field {
				t.Errorf("Parse(userMonomers %s) field = %q, want %q (error %v)", c.list, got, c.field, err)
			}
			if !errors.Is(err, c.err) {
				t.Errorf("Parse(userMonomers %s) = %v, want an error wrapping %v", c.list, err, c.err)
			}
			if err != nil && !strings.Contains(err.Error(), c.text) {
				t.Errorf("Parse(userMonomers %s) = %q, want it to contain %q", c.list, err, c.text)
			}
		})
	}
}
