package copoly

import (
	"strings"
	"testing"
)

// TestLibrary: every built-in monomer comes with its own process data and Q–e values, and the
// pairs are Pairs() and the sources Sources().
func TestLibrary(t *testing.T) {
	es, ps, ss := Library()
	ms := Monomers()
	if len(es) != len(ms) || len(ps) != len(Pairs()) || len(ss) != len(Sources()) {
		t.Fatalf("Library() = %d monomers, %d pairs, %d sources; want %d, %d, %d", len(es), len(ps), len(ss), len(ms), len(Pairs()), len(Sources()))
	}
	for i, e := range es {
		p, okP := PropertiesOf(ms[i].Name)
		q, okQ := QEOf(ms[i].Name)
		if e.Monomer != ms[i] || (e.Properties != nil) != okP || (e.QE != nil) != okQ ||
			(okP && e.Properties.Density != p.Density) || (okQ && *e.QE != q) {
			t.Errorf("entry %d = %+v, want %+v with %+v, %+v", i, e, ms[i], p, q)
		}
	}
}

// TestQEPairOf: the estimate is RatiosFromQE of the built-in values; a name without values is
// named by its field, and the message lists the names that have them.
func TestQEPairOf(t *testing.T) {
	q, err := QEPairOf("styrene", "methyl methacrylate")
	if err != nil {
		t.Fatal(err)
	}
	a, _ := QEOf("styrene")
	b, _ := QEOf("methyl methacrylate")
	r1, r2, _ := RatiosFromQE(a, b)
	if q.R1 != r1 || q.R2 != r2 || q.Monomer1 != a || q.Monomer2 != b {
		t.Errorf("QEPairOf = %+v, want r1 %v, r2 %v from %+v, %+v", q, r1, r2, a, b)
	}
	for i, names := range [][2]string{{"unobtainium", "styrene"}, {"styrene", ""}} {
		_, err := QEPairOf(names[0], names[1])
		if want := []string{"monomer1", "monomer2"}[i]; Field(err) != want || !strings.Contains(err.Error(), `"styrene"`) {
			t.Errorf("QEPairOf(%q) error %v, want one naming %s and listing the names with values", names, err, want)
		}
	}
}
