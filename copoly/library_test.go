package copoly

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestMonomerMolarMasses(t *testing.T) {
	// Molecular weights printed in the Merck Index monographs as read in public transcriptions
	// (styrene 104.15, methyl acrylate 86.09, ethyl acrylate 100.12, n-butyl acrylate 128.17,
	// methacrylic acid 86.09), and the others worked by hand from the formula with the IUPAC 2021
	// abridged atomic weights (C 12.011, H 1.0080, N 14.007, O 15.999, Cl 35.45), to 0.01 g/mol.
	want := map[string]float64{
		"styrene":          104.15, // Merck Index monograph "Styrene"
		"methyl acrylate":  86.09,  // Merck Index monograph "Methyl Acrylate"
		"ethyl acrylate":   100.12, // Merck Index monograph "Ethyl Acrylate"
		"n-butyl acrylate": 128.17, // Merck Index monograph "n-Butyl Acrylate"
		"methacrylic acid": 86.09,  // Merck Index monograph "Methacrylic Acid"
		"acrylonitrile":    53.06,  // by hand: 3·12.011 + 3·1.0080 + 14.007 = 53.064
		"vinyl chloride":   62.50,  // by hand: 2·12.011 + 3·1.0080 + 35.45 = 62.496
		"1,3-butadiene":    54.09,  // by hand: 4·12.011 + 6·1.0080 = 54.092
		"maleic anhydride": 98.06,  // by hand: 4·12.011 + 2·1.0080 + 3·15.999 = 98.057
		"acrylamide":       71.08,  // by hand: 3·12.011 + 5·1.0080 + 14.007 + 15.999 = 71.079
	}
	seen := 0
	for _, m := range Monomers() {
		if w, ok := want[m.Name]; ok {
			seen++
			if math.Abs(m.MolarMass-w) > 0.006 {
				t.Errorf("%s (%s): molar mass %.3f, want %.2f", m.Name, m.Formula, m.MolarMass, w)
			}
		}
		// Every molar mass follows from its formula (identity).
		if mm, err := MolarMassOf(m.Formula); err != nil || mm != m.MolarMass {
			t.Errorf("%s: molar mass %v, MolarMassOf(%q) = %v, %v", m.Name, m.MolarMass, m.Formula, mm, err)
		}
	}
	if seen != len(want) {
		t.Errorf("found %d of %d monomers", seen, len(want))
	}
	// M(KOH) for hydroxyl and acid values: 39.098 + 15.999 + 1.0080 = 56.105 g/mol by hand
	// (IUPAC 2021 abridged values).
	if koh, err := MolarMassOf("KOH"); err != nil || !scalar.EqualWithinAbsOrRel(koh, 56.105, 1e-9, 1e-12) {
		t.Errorf("MolarMassOf(KOH) = %v, %v, want 56.105", koh, err)
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
		if !names[p.Monomer1] || !names[p.Monomer2] || p.Monomer1 == p.Monomer2 {
			t.Errorf("pair %+v: unknown monomer, or a monomer with itself", p)
		}
	}
}

// TestPairsSayTheirConditions: a pair states its conditions, or its source's note says once that
// the source gives none.
func TestPairsSayTheirConditions(t *testing.T) {
	for _, p := range Pairs() {
		s, ok := SourceOf(p.SourceID)
		if !ok {
			t.Errorf("%s/%s: unknown source %q", p.Monomer1, p.Monomer2, p.SourceID)
			continue
		}
		if p.Temperature == "" && !strings.Contains(s.Note, "conditions") {
			t.Errorf("%s/%s: no conditions, and the note of source %q does not say that it gives none", p.Monomer1, p.Monomer2, s.ID)
		}
		if strings.Contains(p.Source, "not given in the table") {
			t.Errorf("%s/%s: the conditions note belongs to the source entry, not to every pair: %q", p.Monomer1, p.Monomer2, p.Source)
		}
	}
}

// TestSourcesTable checks the table of sources: unique IDs, a citation each, and the
// chemist-worded mark exactly once in every unchecked source and nowhere in a checked one.
func TestSourcesTable(t *testing.T) {
	seen := map[string]bool{}
	for _, s := range Sources() {
		if s.ID == "" || seen[s.ID] {
			t.Errorf("source %q: empty or repeated ID", s.ID)
		}
		seen[s.ID] = true
		if s.Short == "" || s.Citation == "" {
			t.Errorf("source %q: no label or no citation", s.ID)
		}
		all := s.Short + " " + s.Citation + " " + s.Note
		n := strings.Count(all, UncheckedMark)
		switch {
		case !s.Checked && n != 1:
			t.Errorf("unchecked source %q carries the mark %d times, want once", s.ID, n)
		case s.Checked && n != 0:
			t.Errorf("checked source %q carries the unchecked mark", s.ID)
		}
		if got, ok := SourceOf(s.ID); !ok || got.Citation != s.Citation {
			t.Errorf("SourceOf(%q) = %+v, %v", s.ID, got, ok)
		}
	}
	if _, ok := SourceOf("no such source"); ok {
		t.Error("SourceOf found a source that does not exist")
	}
}

// bookStyle reports whether text names a reference work by a "<name>-style" phrase, which is
// not a citation.
func bookStyle(text string) bool {
	return strings.Contains(strings.ToLower(text), "-style")
}
