package copoly

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestInstantaneous(t *testing.T) {
	for _, tc := range []struct {
		name       string
		r1, r2, f1 float64
		want, tol  float64
	}{
		// Closed-form limits of the Mayo–Lewis equation (Mayo & Lewis 1944): r1 = r2 = 1 gives
		// F1 = f1; r1 = r2 = 0 gives strict alternation, F1 = 1/2.
		{"ideal r=1 f=0.3", 1, 1, 0.3, 0.3, 1e-15},
		{"ideal r=1 f=0.9", 1, 1, 0.9, 0.9, 1e-15},
		{"alternating r=0 f=0.2", 0, 0, 0.2, 0.5, 1e-15},
		{"alternating r=0 f=0.95", 0, 0, 0.95, 0.5, 1e-15},
		// Ideal pair r1 r2 = 1: F1 = r1 f1/(r1 f1 + f2) (Mayo–Lewis with r2 = 1/r1, by hand):
		// r1 = 2, f1 = 0.5 gives 2/3.
		{"ideal r1 r2 = 1", 2, 0.5, 0.5, 2.0 / 3, 1e-15},
		// Edges are one-sided limits (documented convention).
		{"f1 = 0", 0.4, 0.04, 0, 0, 0},
		{"f1 = 1", 0.4, 0.04, 1, 1, 0},
		{"f1 = 0, r2 = 0", 0.4, 0, 0, 0.5, 0},
		{"f1 = 1, r1 = 0", 0, 0.4, 1, 0.5, 0},
		// Styrene/acrylonitrile 0.40/0.04 (Polymer Handbook 4th ed., Greenley table) at
		// f1 = 0.5: (0.4·0.25 + 0.25)/(0.4·0.25 + 0.5 + 0.04·0.25) = 0.35/0.61, by hand.
		{"St/AN f=0.5", 0.40, 0.04, 0.5, 0.35 / 0.61, 1e-15},
	} {
		got := Terminal{tc.r1, tc.r2}.Instantaneous(tc.f1)
		if !scalar.EqualWithinAbsOrRel(got, tc.want, tc.tol, tc.tol) {
			t.Errorf("%s: Terminal{%g, %g}.Instantaneous(%g) = %.17g, want %.17g", tc.name, tc.r1, tc.r2, tc.f1, got, tc.want)
		}
	}
}

// The stationary composition of the Markov chain, F1 = P21/(P12 + P21), is an independent route
// to the Mayo–Lewis F1 (Coleman & Fox 1963).
func TestInstantaneousMatchesMarkovStationary(t *testing.T) {
	for _, m := range testPairs {
		for f1 := 0.01; f1 < 1; f1 += 0.049 {
			_, p12, p21, _ := m.transitions(f1)
			want := p21 / (p12 + p21)
			if got := m.Instantaneous(f1); !scalar.EqualWithinAbsOrRel(got, want, 1e-14, 1e-14) {
				t.Errorf("%v.Instantaneous(%g) = %v, Markov stationary %v", m, f1, got, want)
			}
		}
	}
}

// testPairs spans alternating, ideal, blocky and singular cases for property tests.
var testPairs = []Terminal{
	{0.40, 0.04}, {0.52, 0.46}, {1.88, 0.43}, {0.43, 1.88}, {1, 1}, {1, 0.5}, {0.5, 1},
	{1.5, 0.5}, {2, 1.5}, {5, 0.05}, {26, 0.03}, {0, 0}, {0.3, 0}, {0, 0.3}, {2, 0.5}, {0.979, 0.292},
}

func TestInstantaneousProperties(t *testing.T) {
	for _, m := range testPairs {
		prev := -1.0
		for i := 0; i <= 1000; i++ {
			f1 := float64(i) / 1000
			got := m.Instantaneous(f1)
			if got < 0 || got > 1 || math.IsNaN(got) {
				t.Fatalf("%v.Instantaneous(%g) = %v, outside [0, 1]", m, f1, got)
			}
			if got < prev-1e-15 {
				t.Fatalf("%v.Instantaneous not monotone at f1 = %g: %v after %v", m, f1, got, prev)
			}
			prev = got
		}
	}
}

func TestInstantaneousToValidates(t *testing.T) {
	for _, tc := range []struct {
		name  string
		m     Terminal
		f1    []float64
		field string
		err   error
	}{
		{"negative r1", Terminal{-0.1, 1}, []float64{0.5}, "r1", ErrOutOfRange},
		{"NaN r2", Terminal{1, math.NaN()}, []float64{0.5}, "r2", ErrNotFinite},
		{"Inf r2", Terminal{1, math.Inf(1)}, []float64{0.5}, "r2", ErrNotFinite},
		{"huge r1", Terminal{1e9, 1}, []float64{0.5}, "r1", ErrOutOfRange},
		{"f above 1", Terminal{1, 1}, []float64{0.5, 1.2}, "f1[1]", ErrOutOfRange},
		{"f negative", Terminal{1, 1}, []float64{-0.01}, "f1[0]", ErrOutOfRange},
		{"f NaN", Terminal{1, 1}, []float64{0.2, 0.3, math.NaN()}, "f1[2]", ErrNotFinite},
		{"too many", Terminal{1, 1}, make([]float64, MaxPoints+1), "f1", ErrTooMany},
	} {
		_, err := tc.m.InstantaneousTo(nil, tc.f1)
		if !errors.Is(err, tc.err) || Field(err) != tc.field {
			t.Errorf("%s: InstantaneousTo error = %v (field %q), want %v on field %q", tc.name, err, Field(err), tc.err, tc.field)
		}
	}
	dst := make([]float64, 1, 10)
	got, err := Terminal{1, 1}.InstantaneousTo(dst, []float64{0.25, 0.75})
	if err != nil || len(got) != 2 || got[0] != 0.25 || got[1] != 0.75 {
		t.Errorf("InstantaneousTo(dst, [0.25 0.75]) = %v, %v; want [0.25 0.75] (r1 = r2 = 1 gives F1 = f1)", got, err)
	}
}

func TestAzeotrope(t *testing.T) {
	for _, tc := range []struct {
		name   string
		m      Terminal
		want   float64
		ok     bool
		tol    float64
		source string
	}{
		{"St/AN", Terminal{0.40, 0.04}, 0.96 / 1.56, true, 1e-15,
			"ratios: Polymer Handbook 4th ed., Greenley table; f_az = (1 − r2)/(2 − r1 − r2), Mayo & Lewis 1944"},
		{"St/2-EHA published", Terminal{0.979, 0.292}, 0.972, true, 1e-3,
			"J. Appl. Polym. Sci. 2004, 92, 3368: reported azeotrope f(St) = 0.972"},
		{"both above 1", Terminal{2, 1.5}, 1.0 / 3, true, 1e-15, "(1 − 1.5)/(2 − 3.5), by hand"},
		{"St/MMA", Terminal{0.52, 0.46}, 0.54 / 1.02, true, 1e-15, "Polymer Handbook 4th ed., Greenley table; formula by hand"},
		{"no azeotrope r1 > 1 > r2", Terminal{1.88, 0.43}, math.NaN(), false, 0, "exists only when both r < 1 or both > 1"},
		{"ideal r = 1", Terminal{1, 1}, math.NaN(), false, 0, "every feed azeotropic: reported as none"},
	} {
		got, ok := tc.m.Azeotrope()
		if ok != tc.ok || (ok && !scalar.EqualWithinAbsOrRel(got, tc.want, tc.tol, tc.tol)) {
			t.Errorf("%s: %v.Azeotrope() = %v, %v; want %v, %v (%s)", tc.name, tc.m, got, ok, tc.want, tc.ok, tc.source)
		}
		if ok {
			if F := tc.m.Instantaneous(got); math.Abs(F-got) > 1e-14 {
				t.Errorf("%s: F1(azeotrope) = %v, want %v", tc.name, F, got)
			}
		}
	}
}

func TestFeedFor(t *testing.T) {
	// For a target of 1/2 the feed ratio is x = √(r2/r1) (Mayo–Lewis rearranged; by hand).
	for _, m := range []Terminal{{0.40, 0.04}, {1.88, 0.43}, {26, 0.03}, {0.52, 0.46}} {
		s, err := m.FeedFor(0.5)
		if err != nil || len(s.Feeds) != 1 {
			t.Fatalf("%v.FeedFor(0.5) = %+v, %v", m, s, err)
		}
		x := math.Sqrt(m.R2 / m.R1)
		if want := x / (1 + x); !scalar.EqualWithinAbsOrRel(s.Feeds[0], want, 1e-14, 1e-14) {
			t.Errorf("%v.FeedFor(0.5) = %v, want √(r2/r1) form %v", m, s.Feeds[0], want)
		}
	}
	// Round trip: FeedFor(F1(f)) = f for every pair whose F1 is strictly increasing.
	for _, m := range testPairs {
		if m.R1 == 0 && m.R2 == 0 {
			continue
		}
		for f := 0.02; f < 1; f += 0.07 {
			s, err := m.FeedFor(m.Instantaneous(f))
			if err != nil || len(s.Feeds) != 1 || !scalar.EqualWithinAbsOrRel(s.Feeds[0], f, 1e-9, 1e-9) {
				t.Errorf("%v.FeedFor(F1(%g)) = %+v, %v; want %g", m, f, s, err, f)
			}
		}
	}
	// r1 = 0 caps F1 at 1/2: a richer target is unreachable and the error says so.
	if _, err := (Terminal{0, 0.4}).FeedFor(0.7); !errors.Is(err, ErrUnreachable) || Field(err) != "targetF1" {
		t.Errorf("Terminal{0, 0.4}.FeedFor(0.7) error = %v, want ErrUnreachable on targetF1", err)
	}
	// r1 = r2 = 0: every feed gives 1/2.
	if s, err := (Terminal{0, 0}).FeedFor(0.5); err != nil || len(s.Feeds) != 1 {
		t.Errorf("Terminal{0, 0}.FeedFor(0.5) = %+v, %v", s, err)
	}
	if _, err := (Terminal{0, 0}).FeedFor(0.6); !errors.Is(err, ErrUnreachable) {
		t.Errorf("Terminal{0, 0}.FeedFor(0.6) error = %v, want ErrUnreachable", err)
	}
	if _, err := (Terminal{1, 1}).FeedFor(1.5); Field(err) != "targetF1" {
		t.Errorf("FeedFor(1.5) error = %v, want field targetF1", err)
	}
}

func TestClassify(t *testing.T) {
	// Bands on r1·r2 as documented on Terminal.Classify (their edges are copoly's choice;
	// TestClassifyBands checks each edge).
	for _, tc := range []struct {
		m    Terminal
		kind string
	}{
		{Terminal{0.04, 0.02}, KindStronglyAlternating}, // St/MAH, Polymer Handbook table
		{Terminal{0.40, 0.04}, KindStronglyAlternating}, // St/AN, product 0.016
		{Terminal{0.52, 0.46}, KindAlternating},         // St/MMA, product 0.24
		{Terminal{1, 1}, KindIdeal},
		{Terminal{2, 0.5}, KindIdeal},
		{Terminal{0.58, 1.35}, KindIdeal}, // St/Bd (Polymer Handbook table), product 0.783: close to ideal (random)
		{Terminal{2, 1.5}, KindBlock},
		{Terminal{200, 2}, KindHomopolymerMixture},
	} {
		c := tc.m.Classify()
		if c.Kind != tc.kind || c.Product != tc.m.R1*tc.m.R2 || c.Text == "" {
			t.Errorf("%v.Classify() = %+v, want kind %s", tc.m, c, tc.kind)
		}
	}
}

// TestClassifyBands checks each edge of the bands of r1·r2 on both sides, and the words of
// each band: those of the sources cited on Terminal.Classify ("ideal", "between ideal and
// alternating", "alternating", "blocks"). The mean run at 50:50 is checked against the
// identity (n̄1 − 1)(n̄2 − 1) = r1·r2 of the terminal model, with n̄1 = 1 + r1 x and
// n̄2 = 1 + r2/x (derived by hand in Classify's comment): both runs are 1 + √(r1·r2).
func TestClassifyBands(t *testing.T) {
	for _, tc := range []struct {
		m     Terminal
		kind  string
		words string
	}{
		{Terminal{0, 0}, KindStronglyAlternating, "alternate strictly"},
		{Terminal{0, 3}, KindStronglyAlternating, "close to alternating"},
		{Terminal{0.0999, 1}, KindStronglyAlternating, "strong tendency to alternate"},
		{Terminal{0.1, 1}, KindAlternating, "between ideal and alternating"}, // edge 0.1
		{Terminal{0.52, 0.46}, KindAlternating, "tendency to alternate"},     // St/MMA, Polymer Handbook table, 0.239
		{Terminal{0.6399, 1}, KindAlternating, "between ideal and alternating"},
		{Terminal{0.64, 1}, KindIdeal, "close to ideal (random)"}, // edge 0.64
		{Terminal{0.7, 1}, KindIdeal, "leaning slightly towards alternation"},
		{Terminal{2, 0.5}, KindIdeal, "ideal copolymerization: the monomers enter independently"}, // r1 r2 = 1 (IUPAC 2008)
		{Terminal{0.3, 1 / 0.3}, KindIdeal, "ideal copolymerization: the monomers enter independently"},
		{Terminal{1.2, 1}, KindIdeal, "leaning slightly towards blocks"},
		{Terminal{1.44, 1}, KindIdeal, "close to ideal (random)"}, // edge 1.44
		{Terminal{1.4401, 1}, KindBlock, "tendency to form blocks"},
		{Terminal{2, 1.5}, KindBlock, "tendency to form blocks"},
		{Terminal{100, 1}, KindBlock, "tendency to form blocks"}, // edge 100
		{Terminal{100.01, 1}, KindHomopolymerMixture, "mixture of the two homopolymers"},
	} {
		c := tc.m.Classify()
		if c.Kind != tc.kind || c.Product != tc.m.R1*tc.m.R2 || !strings.Contains(c.Text, tc.words) {
			t.Errorf("%v.Classify() = %+v, want kind %s with %q", tc.m, c, tc.kind, tc.words)
		}
		if tc.m.R1 > 0 && tc.m.R2 > 0 {
			// The feed x = √(r2/r1) gives equal mean runs, so a 50:50 copolymer.
			s, _ := tc.m.Sequence(1 / (1 + math.Sqrt(tc.m.R1/tc.m.R2)))
			run := fmt.Sprintf("mean run of each monomer is %.3g units", s.MeanLength1)
			if !scalar.EqualWithinAbs(s.F1, 0.5, 1e-12) || !scalar.EqualWithinRel(s.MeanLength1, 1+math.Sqrt(c.Product), 1e-12) || !strings.Contains(c.Text, run) {
				t.Errorf("%v: F1 = %v, mean runs %v, %v, want 1 + √(r1 r2) = %v; text %q lacks %q", tc.m, s.F1, s.MeanLength1, s.MeanLength2, 1+math.Sqrt(c.Product), c.Text, run)
			}
		}
		// The old wording called any product below 0.8 an "alternating tendency".
		if c.Kind == KindIdeal && strings.Contains(c.Text, "tendency to alternate") {
			t.Errorf("%v.Classify().Text = %q: a pair close to ideal described as alternating", tc.m, c.Text)
		}
	}
}
