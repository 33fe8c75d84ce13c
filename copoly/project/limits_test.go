package project

import (
	"regexp"
	"testing"
)

// TestLimits: every limit has a distinct camel-case name, a positive value, a known unit and a
// description; LimitOf finds each.
func TestLimits(t *testing.T) {
	name := regexp.MustCompile(`^[a-z][a-zA-Z]*$`)
	units := map[string]bool{UnitValues: true, UnitEntries: true, UnitCharacters: true, UnitASCII: true, UnitBytes: true, UnitCount: true, UnitFraction: true}
	seen := map[string]bool{}
	for _, l := range Limits() {
		if !name.MatchString(l.Name) || seen[l.Name] || !(l.Value > 0) || !units[l.Unit] || l.What == "" {
			t.Errorf("limit %+v: want a new camel-case name, a positive value, a unit and a description", l)
		}
		seen[l.Name] = true
		if got, ok := LimitOf(l.Name); !ok || got != l {
			t.Errorf("LimitOf(%q) = %+v, %v", l.Name, got, ok)
		}
	}
	if _, ok := LimitOf("no such limit"); ok {
		t.Error("LimitOf found a limit that does not exist")
	}
	// Spot checks against the constants the page used to copy (site/app.js before limits()).
	for n, want := range map[string]float64{"benchRows": 1000, "cellLength": 200, "pasteBytes": 1 << 20, "linearConversion": 0.10, "triadSumTolerance": 0.01} {
		if l, _ := LimitOf(n); l.Value != want {
			t.Errorf("%s = %v, want %v", n, l.Value, want)
		}
	}
}
