package copoly

import (
	"math"
	"testing"
)

func TestMonomerMolarMasses(t *testing.T) {
	// Molar masses as printed in Merck-Index-style monomer entries (from memory of those
	// entries; the formulas are unambiguous), to the 0.01 g/mol they are quoted to.
	want := map[string]float64{
		"styrene":             104.15,
		"methyl methacrylate": 100.12,
		"methyl acrylate":     86.09,
		"n-butyl acrylate":    128.17,
		"acrylonitrile":       53.06,
		"vinyl chloride":      62.50,
		"1,3-butadiene":       54.09,
		"acrylic acid":        72.06,
		"maleic anhydride":    98.06,
		"acrylamide":          71.08,
	}
	seen := 0
	for _, m := range Monomers() {
		if w, ok := want[m.Name]; ok {
			seen++
			if math.Abs(m.MolarMass-w) > 0.006 {
				t.Errorf("%s (%s): molar mass %.3f, want %.2f", m.Name, m.Formula, m.MolarMass, w)
			}
		}
		if m.Source == "" {
			t.Errorf("%s has no source", m.Name)
		}
	}
	if seen != len(want) {
		t.Errorf("found %d of %d monomers", seen, len(want))
	}
	for _, bad := range []string{"", "c8h8", "C8Xx2", "(CH2)2"} {
		if _, err := MolarMassOf(bad); err == nil {
			t.Errorf("MolarMassOf(%q) gave no error", bad)
		}
	}
}

func TestPairsAreValid(t *testing.T) {
	names := map[string]bool{}
	for _, m := range Monomers() {
		names[m.Name] = true
	}
	for _, p := range Pairs() {
		if err := (Terminal{p.R1, p.R2}).Validate(); err != nil {
			t.Errorf("%s/%s: %v", p.Monomer1, p.Monomer2, err)
		}
		if !names[p.Monomer1] || !names[p.Monomer2] || p.Source == "" {
			t.Errorf("pair %+v: unknown monomer or no source", p)
		}
	}
}

func TestPairsSayTheirConditions(t *testing.T) {
	for _, p := range Pairs() {
		if p.Temperature == "" {
			t.Errorf("%s/%s: no temperature or conditions, not even that the source gives none", p.Monomer1, p.Monomer2)
		}
	}
}
