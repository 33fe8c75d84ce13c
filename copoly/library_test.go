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
		"styrene":              104.15, // Merck Index monograph "Styrene"
		"methyl acrylate":      86.09,  // Merck Index monograph "Methyl Acrylate"
		"ethyl acrylate":       100.12, // Merck Index monograph "Ethyl Acrylate"
		"n-butyl acrylate":     128.17, // Merck Index monograph "n-Butyl Acrylate"
		"methacrylic acid":     86.09,  // Merck Index monograph "Methacrylic Acid"
		"acrylonitrile":        53.06,  // by hand: 3·12.011 + 3·1.0080 + 14.007 = 53.064
		"vinyl chloride":       62.50,  // by hand: 2·12.011 + 3·1.0080 + 35.45 = 62.496
		"1,3-butadiene":        54.09,  // by hand: 4·12.011 + 6·1.0080 = 54.092
		"maleic anhydride":     98.06,  // by hand: 4·12.011 + 2·1.0080 + 3·15.999 = 98.057
		"acrylamide":           71.08,  // by hand: 3·12.011 + 5·1.0080 + 14.007 + 15.999 = 71.079
		"n-butyl methacrylate": 142.20, // by hand: 8·12.011 + 14·1.0080 + 2·15.999 = 142.198
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

// TestEveryValueHasASource checks that every built-in value names a source that exists, that its
// per-value text is marked unchecked exactly when its source is, and that no text cites a book
// "-style".
func TestEveryValueHasASource(t *testing.T) {
	check := func(what, id, text string) {
		t.Helper()
		s, ok := SourceOf(id)
		if !ok {
			t.Errorf("%s: source id %q is not in Sources()", what, id)
			return
		}
		if got, want := strings.Contains(text, UncheckedTag), !s.Checked; got != want {
			t.Errorf("%s: text %q marked unchecked = %v, but source %q checked = %v", what, text, got, id, s.Checked)
		}
		if strings.Count(text, UncheckedMark) != 0 {
			t.Errorf("%s: the full unchecked mark belongs to the source entry, not to the value: %q", what, text)
		}
		if bookStyle(text) {
			t.Errorf("%s: %q cites a book \"-style\"", what, text)
		}
	}
	for _, s := range Sources() {
		if bookStyle(s.Short + s.Citation + s.Note) {
			t.Errorf("source %q cites a book \"-style\"", s.ID)
		}
	}
	for _, m := range Monomers() {
		check(m.Name+" molar mass", m.SourceID, m.Source)
		p, ok := PropertiesOf(m.Name)
		if !ok {
			t.Errorf("%s has no process data", m.Name)
			continue
		}
		check(m.Name+" density", p.DensitySourceID, p.DensitySource)
		check(m.Name+" heat", p.HeatSourceID, p.HeatSource)
		check(m.Name+" hazards", p.HazardSourceID, p.HazardSource)
		check(m.Name+" groups", p.GroupsSourceID, p.GroupsSource)
		if p.Tg > 0 {
			check(m.Name+" Tg", p.TgSourceID, p.TgSource)
		}
		if bookStyle(p.TgNote) {
			t.Errorf("%s Tg note cites a book \"-style\"", m.Name)
		}
		if q, ok := QEOf(m.Name); ok {
			check(m.Name+" Q–e", q.SourceID, q.Source)
		}
	}
	for _, p := range Pairs() {
		check(p.Monomer1+"/"+p.Monomer2, p.SourceID, p.Source)
	}
}

// TestTgAndGroups checks the glass transitions and functional groups every built-in monomer
// carries for the resin calculations.
func TestTgAndGroups(t *testing.T) {
	// Tg in K = °C + 273.15 with °C as printed in the sources read: Morita, Front. Chem. 2014, 2,
	// 10, Table 2 (PMMA 105, PBMA 20, PHEMA 80, PEA −24 °C); Koiry and Singha, Front. Chem. 2014,
	// 2, 91, Introduction (PS ≈ 100, P2EHA −60 °C).
	tg := map[string]float64{
		"methyl methacrylate":         378.15,
		"n-butyl methacrylate":        293.15,
		"2-hydroxyethyl methacrylate": 353.15,
		"ethyl acrylate":              249.15,
		"styrene":                     373.15,
		"2-ethylhexyl acrylate":       213.15,
	}
	// Groups per unit counted from the structural formulas; maleic anhydride as ASTM D3643-98,
	// section 3.1.1, states for an alcoholic titration (half the anhydride's two carboxyls) and
	// as ISO 2114 method B counts it after hydrolysis (both).
	type groups struct{ oh, acid, total float64 }
	want := map[string]groups{
		"2-hydroxyethyl methacrylate":  {1, 0, 0},
		"2-hydroxyethyl acrylate":      {1, 0, 0},
		"2-hydroxypropyl methacrylate": {1, 0, 0},
		"acrylic acid":                 {0, 1, 1},
		"methacrylic acid":             {0, 1, 1},
		"maleic anhydride":             {0, 1, 2},
	}
	for _, m := range Monomers() {
		p, ok := PropertiesOf(m.Name)
		if !ok {
			t.Errorf("%s has no process data", m.Name)
			continue
		}
		switch {
		case p.Tg == 0 && p.TgNote == "":
			t.Errorf("%s: no Tg and no note saying why", m.Name)
		case p.Tg != 0 && (p.Tg < 150 || p.Tg > 550):
			t.Errorf("%s: Tg = %v K, outside 150–550 K (a °C value in a K field?)", m.Name, p.Tg)
		}
		if w, ok := tg[m.Name]; ok && !scalar.EqualWithinAbsOrRel(p.Tg, w, 1e-9, 1e-12) {
			t.Errorf("%s: Tg = %v K, want %v K", m.Name, p.Tg, w)
		}
		g := groups{p.Hydroxyl, p.Acid, p.AcidTotal}
		if g != want[m.Name] { // the zero value for monomers without groups
			t.Errorf("%s: groups (OH, acid, total acid) = %v, want %v", m.Name, g, want[m.Name])
		}
	}
	// The tacticity of PMMA is stated where the value is chosen.
	if p, _ := PropertiesOf("methyl methacrylate"); !strings.Contains(p.TgNote, "tacticity") {
		t.Errorf("PMMA Tg note %q does not say which tacticity the value is for", p.TgNote)
	}
}
