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
	if p.Bench == nil || len(p.Bench.Rows) == 0 {
		t.Fatal("Demo() has no bench data")
	}
	if !strings.Contains(p.Notes, "invented runs") {
		t.Errorf("Demo() notes do not say the bench runs are invented")
	}
	for i, r := range p.Bench.Rows {
		if !strings.Contains(r.Label, "invented") {
			t.Errorf("Demo() bench row %d label %q does not say it is invented", i, r.Label)
		}
	}
}

// Demo() must be a fresh value each time: the page edits what it gets.
func TestDemoIsFresh(t *testing.T) {
	a := Demo()
	a.Bench.Rows[0].Cells["F1"] = "edited"
	a.Bench.Rows = a.Bench.Rows[:1]
	b := Demo()
	if got := b.Bench.Rows[0].Cells["F1"]; got == "edited" || len(b.Bench.Rows) < 2 {
		t.Errorf("editing one Demo() changed the next: F1 = %q, %d rows", got, len(b.Bench.Rows))
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
		// RFC 3339 with nanoseconds and an offset, 35 characters (RFC 3339 section 5.6 grammar).
		{name: "saved at with nanoseconds", edit: func(p *Project) { p.SavedAt = "2026-01-02T03:04:05.123456789+14:00" }},

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
		{name: "saved at too long", edit: func(p *Project) { p.SavedAt = "2026-01-02T03:04:05." + strings.Repeat("1", 50) + "Z" }, field: "project.savedAt", err: ErrTooLong},

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

		// Bench grid: structure only; cells that are not numbers are kept as typed.
		{name: "no bench", edit: func(p *Project) { p.Bench = nil }},
		{name: "empty bench", edit: func(p *Project) { p.Bench = &Bench{} }},
		{name: "bench cell not a number", edit: func(p *Project) { p.Bench.Rows[2].Cells["F1"] = "about half" }},
		{name: "bench cell empty", edit: func(p *Project) { p.Bench.Rows[2].Cells["F1"] = "" }},
		{name: "bench cell of another form", edit: func(p *Project) { p.Bench.Rows[0].Cells["integral1"] = "3,2" }},
		{name: "bench every form", edit: func(p *Project) {
			p.Bench.FeedKind, p.Bench.ConversionKind, p.Bench.CompositionKind = "moles", "mass", "element"
			p.Bench.Element, p.Bench.Carrier, p.Bench.ElementCount = "N", 2, 1
		}},
		{name: "bench rows at limit", edit: func(p *Project) { p.Bench.Rows = make([]BenchRow, MaxRows) }},
		{name: "bench label at limit", edit: func(p *Project) { p.Bench.Rows[0].Label = strings.Repeat("é", MaxLabelLength) }},
		{name: "bench cell at limit", edit: func(p *Project) { p.Bench.Rows[0].Cells["f10"] = strings.Repeat("é", MaxCellLength) }},
		{name: "bench feed kind unknown", edit: func(p *Project) { p.Bench.FeedKind = "volume" }, field: "project.bench.feedKind", err: ErrNotAllowed},
		{name: "bench conversion kind unknown", edit: func(p *Project) { p.Bench.ConversionKind = "Molar" }, field: "project.bench.conversionKind", err: ErrNotAllowed},
		{name: "bench composition kind unknown", edit: func(p *Project) { p.Bench.CompositionKind = "ir" }, field: "project.bench.compositionKind", err: ErrNotAllowed},
		{name: "bench element too long", edit: func(p *Project) { p.Bench.Element = strings.Repeat("N", MaxCellLength+1) }, field: "project.bench.element", err: ErrTooLong},
		{name: "bench carrier 3", edit: func(p *Project) { p.Bench.Carrier = 3 }, field: "project.bench.carrier", err: copoly.ErrOutOfRange},
		{name: "bench carrier negative", edit: func(p *Project) { p.Bench.Carrier = -1 }, field: "project.bench.carrier", err: copoly.ErrOutOfRange},
		{name: "bench element count NaN", edit: func(p *Project) { p.Bench.ElementCount = math.NaN() }, field: "project.bench.elementCount", err: copoly.ErrNotFinite},
		{name: "bench element count negative", edit: func(p *Project) { p.Bench.ElementCount = -1 }, field: "project.bench.elementCount", err: copoly.ErrOutOfRange},
		{name: "bench too many rows", edit: func(p *Project) { p.Bench.Rows = make([]BenchRow, MaxRows+1) }, field: "project.bench.rows", err: copoly.ErrTooMany},
		{name: "bench label too long", edit: func(p *Project) { p.Bench.Rows[3].Label = strings.Repeat("x", MaxLabelLength+1) }, field: "project.bench.rows[3].label", err: ErrTooLong},
		{name: "bench cell too long", edit: func(p *Project) { p.Bench.Rows[3].Cells["f10"] = strings.Repeat("1", MaxCellLength+1) }, field: "project.bench.rows[3].cells.f10", err: ErrTooLong},
		{name: "bench cell key unknown", edit: func(p *Project) { p.Bench.Rows[1].Cells["density"] = "0.9" }, field: "project.bench.rows[1].cells", err: ErrNotAllowed},
		{name: "bench cell key label", edit: func(p *Project) { p.Bench.Rows[1].Cells["label"] = "x" }, field: "project.bench.rows[1].cells", err: ErrNotAllowed},
		{name: "bench too many cells", edit: func(p *Project) {
			for k := range MaxCells + 1 {
				p.Bench.Rows[0].Cells[strings.Repeat("k", k+1)] = ""
			}
		}, field: "project.bench.rows[0].cells", err: copoly.ErrTooMany},

		// Confidence level and region.
		{name: "level default", edit: func(p *Project) { p.Level = 0 }},
		{name: "level 0.99", edit: func(p *Project) { p.Level = 0.99 }},
		{name: "level one", edit: func(p *Project) { p.Level = 1 }, field: "project.level", err: copoly.ErrOutOfRange},
		{name: "level percent", edit: func(p *Project) { p.Level = 95 }, field: "project.level", err: copoly.ErrOutOfRange},
		{name: "level negative", edit: func(p *Project) { p.Level = -0.5 }, field: "project.level", err: copoly.ErrOutOfRange},
		{name: "level NaN", edit: func(p *Project) { p.Level = math.NaN() }, field: "project.level", err: copoly.ErrNotFinite},
		{name: "jcr", edit: func(p *Project) { p.JCR = [][2]float64{{0.7, 0.1}, {0.9, 0.1}, {0.8, 0.2}} }},
		{name: "jcr on an axis", edit: func(p *Project) { p.JCR = [][2]float64{{0, 0.1}, {0.9, 0}} }},
		{name: "jcr at limit", edit: func(p *Project) { p.JCR = make([][2]float64, MaxJCRPoints) }},
		{name: "jcr too many", edit: func(p *Project) { p.JCR = make([][2]float64, MaxJCRPoints+1) }, field: "project.jcr", err: copoly.ErrTooMany},
		{name: "jcr negative", edit: func(p *Project) { p.JCR = [][2]float64{{0.7, 0.1}, {0.9, -0.01}} }, field: "project.jcr[1][1]", err: copoly.ErrOutOfRange},
		{name: "jcr infinite", edit: func(p *Project) { p.JCR = [][2]float64{{math.Inf(1), 0.1}} }, field: "project.jcr[0][0]", err: copoly.ErrNotFinite},
		{name: "jcr NaN", edit: func(p *Project) { p.JCR = [][2]float64{{0.7, 0.1}, {0.8, 0.1}, {0.9, math.NaN()}} }, field: "project.jcr[2][1]", err: copoly.ErrNotFinite},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := Demo()
			tt.edit(&p)
			err := p.Validate()
			wantValidate(t, err, tt.field, tt.err)
			if tt.field == "" {
				return
			}
			if !strings.HasPrefix(err.Error(), tt.field) {
				t.Errorf("Validate() message %q does not start with the field %q", err, tt.field)
			}
		})
	}
}

// wantValidate checks err, what Validate returned for a case: nil when field is "", else an
// error for field that wraps want.
func wantValidate(t *testing.T, err error, field string, want error) {
	t.Helper()
	if field == "" {
		if err != nil {
			t.Fatalf("Validate() = %v, want nil", err)
		}
		return
	}
	if err == nil {
		t.Fatalf("Validate() = nil, want an error for field %q", field)
	}
	if got := copoly.Field(err); got != field {
		t.Errorf("copoly.Field(Validate()) = %q, want %q (error %q)", got, field, err)
	}
	if !errors.Is(err, want) {
		t.Errorf("Validate() = %v, want an error wrapping %v", err, want)
	}
}
