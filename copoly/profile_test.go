package copoly

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestProfileOf: the profile is the batch's own routines put together (drift, conversion limit,
// distribution at the last conversion, mass conversions), for the terminal and the penultimate
// model, on either basis.
func TestProfileOf(t *testing.T) {
	mm1, mm2 := 104.152, 128.171 // styrene C8H8, n-butyl acrylate C7H12O2 (IUPAC 2021 atomic weights)
	xs := []float64{0, 0.2, 0.5, 0.8}
	for _, m := range []Model{Terminal{0.80, 0.15}, Penultimate{0.9, 0.6, 0.2, 0.1}} {
		b, err := NewBatch(m, 0.3)
		if err != nil {
			t.Fatal(err)
		}
		d, _ := b.Drift(xs)
		lim, _ := b.ConversionLimit(0.03)
		h, _ := b.Distribution(0.8, 7, 0, 0)
		p, err := ProfileOf(ProfileInput{Model: m, F10: 0.3, Conversion: xs, Tolerance: 0.03, Bins: 7})
		if err != nil {
			t.Fatalf("%v: %v", m, err)
		}
		if !sameFloats(p.Cum, d.Cum) || !sameFloats(p.Feed, d.Feed) || p.Method != d.Method || p.Limit != lim || p.Tolerance != 0.03 ||
			!sameFloats(p.Distribution.Weights, h.Weights) || p.Distribution.Basis != "moles" || p.ConversionMass != nil {
			t.Errorf("%v: profile %+v\nwant drift %+v, limit %v, distribution %+v", m, p, d, lim, h)
		}
		// With molar masses: mass conversions and a distribution by mass.
		p, err = ProfileOf(ProfileInput{Model: m, F10: 0.3, Conversion: xs, MolarMass1: &mm1, MolarMass2: &mm2, Tolerance: 0.03, Bins: 7})
		if err != nil {
			t.Fatal(err)
		}
		hm, _ := b.Distribution(0.8, 7, mm1, mm2)
		for i, x := range xs {
			if want := MassConversion(x, 0.3, d.Feed[i], mm1, mm2); p.ConversionMass[i] != want {
				t.Errorf("%v: conversionMass[%d] = %v, want %v", m, i, p.ConversionMass[i], want)
			}
		}
		if !sameFloats(p.Distribution.Weights, hm.Weights) || p.Distribution.Basis != "mass" {
			t.Errorf("%v: distribution by mass %+v, want %+v", m, p.Distribution, hm)
		}
		// On the mass basis the molar conversions found give back the mass conversions asked for
		// (the definition of MassConversion, an identity).
		ws := []float64{0.1, 0.4, 0.7}
		p, err = ProfileOf(ProfileInput{Model: m, F10: 0.3, Conversion: ws, Basis: BasisMass, MolarMass1: &mm1, MolarMass2: &mm2, Tolerance: 0.03, Bins: 7})
		if err != nil {
			t.Fatal(err)
		}
		for i, w := range ws {
			if got := MassConversion(p.Conversion[i], 0.3, p.Feed[i], mm1, mm2); !scalar.EqualWithinAbsOrRel(got, w, 1e-9, 1e-9) || p.ConversionMass[i] != w {
				t.Errorf("%v: mass conversion %v back from X = %v is %v (conversionMass %v)", m, w, p.Conversion[i], got, p.ConversionMass[i])
			}
		}
	}
}

func TestProfileOfErrors(t *testing.T) {
	mm1, mm2, bad := 104.152, 128.171, -1.0
	in := func(edit func(*ProfileInput)) ProfileInput {
		p := ProfileInput{Model: Terminal{0.80, 0.15}, F10: 0.3, Conversion: []float64{0.2, 0.5}, Tolerance: 0.02, Bins: 20}
		edit(&p)
		return p
	}
	for _, tc := range []struct {
		name  string
		in    ProfileInput
		field string
		err   error
	}{
		{"model", in(func(p *ProfileInput) { p.Model = Penultimate{-1, 1, 1, 1} }), "r11", ErrOutOfRange},
		{"f10", in(func(p *ProfileInput) { p.F10 = 1.2 }), "f10", ErrOutOfRange},
		{"no conversions", in(func(p *ProfileInput) { p.Conversion = nil }), "conversion", ErrOutOfRange},
		{"decreasing", in(func(p *ProfileInput) { p.Conversion = []float64{0.5, 0.2} }), "conversion[1]", ErrOutOfRange},
		{"basis", in(func(p *ProfileInput) { p.Basis = "volume" }), "basis", ErrOutOfRange},
		{"one molar mass", in(func(p *ProfileInput) { p.MolarMass1 = &mm1 }), "molarMass2", ErrOutOfRange},
		{"other molar mass", in(func(p *ProfileInput) { p.MolarMass2 = &mm2 }), "molarMass1", ErrOutOfRange},
		{"bad molar mass", in(func(p *ProfileInput) { p.MolarMass1, p.MolarMass2 = &mm1, &bad }), "molarMass2", ErrOutOfRange},
		{"mass basis without masses", in(func(p *ProfileInput) { p.Basis = BasisMass }), "molarMass1", ErrOutOfRange},
		{"too many mass conversions", in(func(p *ProfileInput) {
			p.Basis, p.MolarMass1, p.MolarMass2, p.Conversion = BasisMass, &mm1, &mm2, make([]float64, MaxMassConversions+1)
		}), "conversion", ErrTooMany},
		{"mass conversion NaN", in(func(p *ProfileInput) {
			p.Basis, p.MolarMass1, p.MolarMass2, p.Conversion = BasisMass, &mm1, &mm2, []float64{0.1, math.NaN()}
		}), "conversion[1]", ErrNotFinite},
		// r2 = 0 with M2 in excess: polymerization stops when M1 runs out (Terminal.Drift).
		{"beyond the end", in(func(p *ProfileInput) { p.Model, p.Conversion = Terminal{0.5, 0}, []float64{0.1, 0.99} }), "conversion[1]", ErrOutOfRange},
		{"tolerance", in(func(p *ProfileInput) { p.Tolerance = 0 }), "tolerance", ErrOutOfRange},
		{"bins", in(func(p *ProfileInput) { p.Bins = MaxBins + 1 }), "bins", ErrOutOfRange},
		{"nothing made", in(func(p *ProfileInput) { p.Conversion = []float64{0, 0} }), "conversion[1]", ErrOutOfRange},
	} {
		if _, err := ProfileOf(tc.in); Field(err) != tc.field || !errors.Is(err, tc.err) {
			t.Errorf("%s: error %v, want %v naming %s", tc.name, err, tc.err, tc.field)
		}
	}
}

func sameFloats(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
