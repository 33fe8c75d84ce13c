package project

import (
	"errors"
	"math"
	"strings"
	"testing"

	"copoly/copoly"
)

// The expected field names below are the keys of the Project of site/copoly.d.ts with the
// "project." prefix of the package documentation; the limits are those documented on
// Project, Validate and the Max* constants.

func TestDemoIsValidAndMarkedInvented(t *testing.T) {
	p := Demo()
	if err := p.Validate(); err != nil {
		t.Fatalf("Demo().Validate() = %v, want nil", err)
	}
	if !p.Invented {
		t.Errorf("Demo().Invented = false, want true")
	}
	if !strings.Contains(p.Name, "invented") || !strings.Contains(p.Notes, "Invented") {
		t.Errorf("Demo() name %q or notes do not say the scenario is invented", p.Name)
	}
	if p.SavedAt != "" {
		t.Errorf("Demo().SavedAt = %q, want empty (never saved)", p.SavedAt)
	}
}

func TestValidate(t *testing.T) {
	tests := []struct {
		name  string
		edit  func(p *Project)
		field string // "" when valid
		err   error  // sentinel the error must wrap
	}{
		{name: "demo", edit: func(p *Project) {}},
		{name: "molar masses not given", edit: func(p *Project) { p.Monomer1.MolarMass, p.Monomer2.MolarMass = 0, 0 }},
		{name: "ratios zero", edit: func(p *Project) { p.R1, p.R2 = 0, 0 }},
		{name: "conversion one", edit: func(p *Project) { p.Conversion = 1 }},
		{name: "tolerance half", edit: func(p *Project) { p.Tolerance = 0.5 }},
		{name: "name at limit", edit: func(p *Project) { p.Name = strings.Repeat("é", MaxNameLength) }},
		{name: "notes at limit", edit: func(p *Project) { p.Notes = strings.Repeat("n", MaxNotesBytes) }},
		{name: "saved at", edit: func(p *Project) { p.SavedAt = "2026-01-02T03:04:05Z" }},

		// Identity of the file.
		{name: "format empty", edit: func(p *Project) { p.Format = "" }, field: "project.format", err: ErrNotProject},
		{name: "version newer", edit: func(p *Project) { p.Version = 2 }, field: "project.version", err: ErrNewerVersion},
		{name: "version zero", edit: func(p *Project) { p.Version = 0 }, field: "project.version", err: ErrNotProject},

		// Text.
		{name: "name too long", edit: func(p *Project) { p.Name = strings.Repeat("x", MaxNameLength+1) }, field: "project.name", err: ErrTooLong},
		{name: "monomer2 name too long", edit: func(p *Project) { p.Monomer2.Name = strings.Repeat("x", MaxNameLength+1) }, field: "project.monomer2.name", err: ErrTooLong},
		{name: "ratio source too long", edit: func(p *Project) { p.RatioSource = strings.Repeat("x", MaxSourceLength+1) }, field: "project.ratioSource", err: ErrTooLong},
		{name: "notes too long", edit: func(p *Project) { p.Notes = strings.Repeat("n", MaxNotesBytes+1) }, field: "project.notes", err: ErrTooLong},
		{name: "saved at not a date", edit: func(p *Project) { p.SavedAt = "yesterday" }, field: "project.savedAt", err: ErrWrongType},

		// Molar masses.
		{name: "molar mass 1 negative", edit: func(p *Project) { p.Monomer1.MolarMass = -104.15 }, field: "project.monomer1.molarMass", err: copoly.ErrOutOfRange},
		{name: "molar mass 2 NaN", edit: func(p *Project) { p.Monomer2.MolarMass = math.NaN() }, field: "project.monomer2.molarMass", err: copoly.ErrNotFinite},

		// Reactivity ratios.
		{name: "r1 negative", edit: func(p *Project) { p.R1 = -0.2 }, field: "project.r1", err: copoly.ErrOutOfRange},
		{name: "r2 infinite", edit: func(p *Project) { p.R2 = math.Inf(1) }, field: "project.r2", err: copoly.ErrNotFinite},
		{name: "r2 above MaxRatio", edit: func(p *Project) { p.R2 = 2 * copoly.MaxRatio }, field: "project.r2", err: copoly.ErrOutOfRange},

		// Feed, conversion, tolerance.
		{name: "f10 zero", edit: func(p *Project) { p.F10 = 0 }, field: "project.f10", err: copoly.ErrOutOfRange},
		{name: "f10 one", edit: func(p *Project) { p.F10 = 1 }, field: "project.f10", err: copoly.ErrOutOfRange},
		{name: "f10 above one", edit: func(p *Project) { p.F10 = 1.5 }, field: "project.f10", err: copoly.ErrOutOfRange},
		{name: "f10 NaN", edit: func(p *Project) { p.F10 = math.NaN() }, field: "project.f10", err: copoly.ErrNotFinite},
		{name: "conversion zero", edit: func(p *Project) { p.Conversion = 0 }, field: "project.conversion", err: copoly.ErrOutOfRange},
		{name: "conversion above one", edit: func(p *Project) { p.Conversion = 1.01 }, field: "project.conversion", err: copoly.ErrOutOfRange},
		{name: "tolerance zero", edit: func(p *Project) { p.Tolerance = 0 }, field: "project.tolerance", err: copoly.ErrOutOfRange},
		{name: "tolerance above half", edit: func(p *Project) { p.Tolerance = 0.51 }, field: "project.tolerance", err: copoly.ErrOutOfRange},
		{name: "tolerance NaN", edit: func(p *Project) { p.Tolerance = math.NaN() }, field: "project.tolerance", err: copoly.ErrNotFinite},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := Demo()
			tt.edit(&p)
			err := p.Validate()
			if tt.field == "" {
				if err != nil {
					t.Fatalf("Validate() = %v, want nil", err)
				}
				return
			}
			if err == nil {
				t.Fatalf("Validate() = nil, want an error for field %q", tt.field)
			}
			if got := copoly.Field(err); got != tt.field {
				t.Errorf("copoly.Field(Validate()) = %q, want %q (error %q)", got, tt.field, err)
			}
			if !errors.Is(err, tt.err) {
				t.Errorf("Validate() = %v, want an error wrapping %v", err, tt.err)
			}
			if !strings.HasPrefix(err.Error(), tt.field) {
				t.Errorf("Validate() message %q does not start with the field %q", err, tt.field)
			}
		})
	}
}
