package multi

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// TestFeedForProperty checks on random models of 2…6 monomers and random targets (some with
// monomers left out) that the feed found gives the target to FeedTolerance: the definition of
// the inverse.
func TestFeedForProperty(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	worst := 0.0
	for range 1000 {
		n := 2 + rng.IntN(5)
		m := mustNew(t, randomRatios(rng, n), nil)
		target := randomFeed(rng, n)
		if n > 2 && rng.IntN(4) == 0 {
			k := rng.IntN(n)
			target[k] = 0
			s := sumOf(target)
			for i := range target {
				target[i] /= s
			}
		}
		f, err := m.FeedFor(target)
		if err != nil {
			t.Fatalf("r = %v, targetF = %v: %v", m.Ratios(), target, err)
		}
		F := mustComposition(t, m, f)
		for i := range n {
			d := math.Abs(F[i] - target[i])
			worst = math.Max(worst, d)
			if d > FeedTolerance {
				t.Fatalf("r = %v, targetF = %v: FeedFor = %v gives F = %v", m.Ratios(), target, f, F)
			}
			if target[i] == 0 && f[i] != 0 {
				t.Fatalf("targetF[%d] = 0 but f[%d] = %v", i, i, f[i])
			}
		}
	}
	t.Logf("largest |F(f) − targetF|: %.2g", worst)
}

// TestFeedForBinary checks N = 2 against copoly.Terminal.FeedFor (the root of the Mayo–Lewis
// equation) to 1e-9, and an unreachable target on both sides: with r2 = 0, M2 makes at most
// half of the chain (binary reachable range [F1(0), F1(1)] = [½, 1]).
func TestFeedForBinary(t *testing.T) {
	for _, c := range []struct{ r1, r2, F1 float64 }{
		{0.40, 0.04, 0.55}, {0.40, 0.04, 0.2}, {1.88, 0.43, 0.5}, {26, 0.03, 0.9}, {0.52, 0.46, 0.5294},
	} {
		want, err := copoly.Terminal{R1: c.r1, R2: c.r2}.FeedFor(c.F1)
		if err != nil {
			t.Fatal(err)
		}
		f, err := mustNew(t, [][]float64{{1, c.r1}, {c.r2, 1}}, nil).FeedFor([]float64{c.F1, 1 - c.F1})
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(f[0], want.Feeds[0], 1e-9, 1e-9) {
			t.Errorf("r = %g, %g, F1 = %g: f1 = %.12g, binary %.12g", c.r1, c.r2, c.F1, f[0], want.Feeds[0])
		}
	}
	m := mustNew(t, [][]float64{{1, 2}, {0, 1}}, nil)
	if _, err := (copoly.Terminal{R1: 2, R2: 0}).FeedFor(0.3); !errors.Is(err, copoly.ErrUnreachable) {
		t.Fatalf("the binary FeedFor reaches F1 = 0.3 with r2 = 0: %v", err)
	}
	_, err := m.FeedFor([]float64{0.3, 0.7})
	if !errors.Is(err, copoly.ErrUnreachable) || copoly.Field(err) != "targetF[1]" && copoly.Field(err) != "targetF[0]" {
		t.Errorf("F2 = 0.7 with r2 = 0: %v, want ErrUnreachable naming targetF", err)
	}
}

// TestFeedForUnreachable checks targets no feed makes: more than half of the chain of a monomer
// that does not add to its own radical (N = 3, with cross ratios), a homopolymer of it, and a
// monomer the zero ratios hold out of the copolymer.
func TestFeedForUnreachable(t *testing.T) {
	m := mustNew(t, [][]float64{{1, 0.5, 0.3}, {2, 1, 0.4}, {0, 0, 1}}, [][]float64{nil, nil, {1, 2, 0}})
	for _, tt := range []struct {
		target []float64
		field  string
	}{
		{[]float64{0.2, 0.2, 0.6}, "targetF[2]"},
		{[]float64{0, 0, 1}, "targetF[2]"},
	} {
		_, err := m.FeedFor(tt.target)
		if !errors.Is(err, copoly.ErrUnreachable) || copoly.Field(err) != tt.field {
			t.Errorf("FeedFor(%v) = %v, want ErrUnreachable naming %s", tt.target, err, tt.field)
		}
	}
	// F3 = 0.45 < ½ is reachable.
	f, err := m.FeedFor([]float64{0.3, 0.25, 0.45})
	if err != nil {
		t.Fatalf("F3 = 0.45: %v", err)
	}
	F := mustComposition(t, m, f)
	if math.Abs(F[2]-0.45) > FeedTolerance {
		t.Errorf("F3 = 0.45: feed %v gives %v", f, F)
	}
	// r[0][1] = r[1][0] = 0: M1 and M2 add only each other, so with all three present M3 never
	// enters the chain.
	held := mustNew(t, [][]float64{{1, 0, 1}, {0, 1, 1}, {1, 1, 1}}, nil)
	if _, err := held.FeedFor([]float64{0.4, 0.4, 0.2}); !errors.Is(err, copoly.ErrUnreachable) || copoly.Field(err) != "targetF[2]" {
		t.Errorf("a monomer held out: %v, want ErrUnreachable naming targetF[2]", err)
	}
	if _, err := held.FeedFor([]float64{0.4, 0.4}); copoly.Field(err) != "targetF" {
		t.Errorf("a target of two values for three monomers: %v, want an error naming targetF", err)
	}
}

// TestAzeotropesBinary checks N = 2 against copoly.Terminal.Azeotrope (Mayo–Lewis: f1 =
// (1 − r2)/(2 − r1 − r2)) and the direction of drift the binary classification states: away
// from it for r1, r2 < 1, towards it for r1, r2 > 1.
func TestAzeotropesBinary(t *testing.T) {
	for _, c := range []struct {
		r1, r2 float64
		drift  string
	}{{0.40, 0.04, DriftRepelling}, {2, 1.5, DriftAttracting}, {1.88, 0.43, ""}} {
		az, _ := mustNew(t, [][]float64{{1, c.r1}, {c.r2, 1}}, nil).Azeotropes()
		want, ok := copoly.Terminal{R1: c.r1, R2: c.r2}.Azeotrope()
		if !ok {
			if len(az) != 0 {
				t.Errorf("r = %g, %g: azeotropes %+v, the binary model has none", c.r1, c.r2, az)
			}
			continue
		}
		if len(az) != 1 || !scalar.EqualWithinAbsOrRel(az[0].F[0], want, 1e-12, 1e-12) || az[0].Drift != c.drift {
			t.Errorf("r = %g, %g: azeotropes %+v, want f1 = %.12g (%s)", c.r1, c.r2, az, want, c.drift)
		}
	}
	az, non := mustNew(t, [][]float64{{1, 1}, {1, 1}}, nil).Azeotropes()
	if len(az) != 0 || !non {
		t.Errorf("all r = 1: %+v, nonIsolated %v; want none listed and nonIsolated", az, non)
	}
}

// TestAzeotropesTernary checks a symmetric ternary model (every r_ij = 0.5): by symmetry the
// centre (⅓, ⅓, ⅓) is an azeotrope and each pair has one at ½ (the binary closed form), seven
// in all; every one found satisfies F(f) = f to 1e-12. For the built-in styrene / methyl
// methacrylate / acrylonitrile pairs, the two binary azeotropes (St/MMA at 0.5294, St/AN at
// 0.6154, Mayo–Lewis) are among those found.
func TestAzeotropesTernary(t *testing.T) {
	half := [][]float64{{1, 0.5, 0.5}, {0.5, 1, 0.5}, {0.5, 0.5, 1}}
	m := mustNew(t, half, nil)
	az, non := m.Azeotropes()
	if non || len(az) != 4 {
		t.Fatalf("r_ij = 0.5: %d azeotropes %+v (nonIsolated %v), want the centre and three pairs", len(az), az, non)
	}
	foundCentre := false
	for _, a := range az {
		F := mustComposition(t, m, a.F)
		for i := range 3 {
			if math.Abs(F[i]-a.F[i]) > 1e-12 {
				t.Errorf("azeotrope %v: F = %v", a.F, F)
			}
		}
		if len(a.Monomers) == 3 && math.Abs(a.F[0]-1.0/3) < 1e-10 && math.Abs(a.F[1]-1.0/3) < 1e-10 {
			foundCentre = true
		}
	}
	if !foundCentre {
		t.Errorf("r_ij = 0.5: the centre is not among %+v", az)
	}
	st := mustNew(t, [][]float64{{1, 0.52, 0.40}, {0.46, 1, 1.322}, {0.04, 0.138, 1}}, nil)
	az, _ = st.Azeotropes()
	for _, want := range []struct {
		i, j int
		fi   float64
	}{{0, 1, (1 - 0.46) / (2 - 0.52 - 0.46)}, {0, 2, (1 - 0.04) / (2 - 0.40 - 0.04)}} {
		ok := false
		for _, a := range az {
			ok = ok || (len(a.Monomers) == 2 && a.Monomers[0] == want.i && a.Monomers[1] == want.j && math.Abs(a.F[want.i]-want.fi) < 1e-12)
		}
		if !ok {
			t.Errorf("St/MMA/AN: no azeotrope of M%d/M%d at %.4f among %+v", want.i+1, want.j+1, want.fi, az)
		}
	}
}
