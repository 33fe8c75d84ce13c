package resin

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/multi"
)

// Molar masses from the formulas and the IUPAC abridged atomic weights (C 12.011, H 1.008,
// O 15.999; Pure Appl. Chem. 2022, 94, 573), worked by hand:
// 2-hydroxyethyl methacrylate C6H10O3 = 130.143, acrylic acid C3H4O2 = 72.063,
// methyl methacrylate C5H8O2 = 100.117, n-butyl acrylate C7H12O2 = 128.171.
const (
	mHEMA = 130.143
	mAA   = 72.063
	mMMA  = 100.117
	mBA   = 128.171
)

// TestMolarMassKOH checks M(KOH) = K 39.098 + O 15.999 + H 1.008 = 56.105 g/mol (IUPAC abridged
// standard atomic weights; K from memory) to 0.002.
func TestMolarMassKOH(t *testing.T) {
	if math.Abs(MolarMassKOH-56.105) > 0.002 {
		t.Errorf("MolarMassKOH = %v, want 56.105", MolarMassKOH)
	}
}

// TestFox checks the Fox equation (T. G. Fox, Bull. Am. Phys. Soc. 1956, 1, 123) against hand
// calculations. Inputs: homopolymer Tg of poly(methyl methacrylate) 378 K and poly(n-butyl
// acrylate) 219 K (typical handbook values, from memory; inputs only).
//
//	w = (0.6, 0.4): 1/Tg = 0.6/378 + 0.4/219 = 0.001587302 + 0.001826484 = 0.003413786,
//	Tg = 292.930 K
//	w = (1, 0): Tg = 378 K (a homopolymer)
//
// and the same copolymer from mole fractions: x = (0.6/100.117, 0.4/128.171) normalized gives
// back w = (0.6, 0.4).
func TestFox(t *testing.T) {
	tg := []float64{378, 219}
	got, err := Fox([]float64{0.6, 0.4}, tg)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(got, 292.930, 1e-3, 0) {
		t.Errorf("Fox(0.6, 0.4) = %v K, want 292.930 K", got)
	}
	if got, _ := Fox([]float64{1, 0}, tg); got != 378 {
		t.Errorf("Fox(1, 0) = %v, want 378", got)
	}
	a, b := 0.6/mMMA, 0.4/mBA
	x := []float64{a / (a + b), b / (a + b)}
	gotX, err := FoxMoles(x, []float64{mMMA, mBA}, tg)
	if err != nil || !scalar.EqualWithinAbsOrRel(gotX, got, 1e-12, 1e-12) {
		t.Errorf("FoxMoles(%v) = %v, %v; want %v", x, gotX, err, got)
	}
}

// TestGroupValues checks the hydroxyl value, acid value and equivalent weight (mg KOH per g:
// 1000 · M(KOH) · Σ n_i w_i / M_i, the quantity ISO 4629 and ISO 2114 titrate) by hand, with
// M(KOH) = 56.105:
//
//	20 % HEMA (one OH per unit), 80 % MMA:  OHV = 1000 · 56.105 · 0.2 / 130.143 = 86.2205
//	5 % acrylic acid (one COOH), 95 % MMA:  AV = 1000 · 56.105 · 0.05 / 72.063 = 38.9277
//	equivalent weight of the first:         130.143 / 0.2 = 650.715 g/mol
//	both, 20 % HEMA and 5 % AA, 75 % MMA, counting every group:
//	                                        1 / (0.2/130.143 + 0.05/72.063) = 448.308 g/mol
func TestGroupValues(t *testing.T) {
	ohv, err := HydroxylValue([]float64{0.2, 0.8}, []float64{1, 0}, []float64{mHEMA, mMMA})
	if err != nil || !scalar.EqualWithinAbsOrRel(ohv, 86.2205, 1e-4, 0) {
		t.Errorf("hydroxyl value = %v, %v; want 86.2205", ohv, err)
	}
	av, err := AcidValue([]float64{0.05, 0.95}, []float64{1, 0}, []float64{mAA, mMMA})
	if err != nil || !scalar.EqualWithinAbsOrRel(av, 38.9277, 1e-4, 0) {
		t.Errorf("acid value = %v, %v; want 38.9277", av, err)
	}
	ew, err := EquivalentWeight([]float64{0.2, 0.8}, []float64{1, 0}, []float64{mHEMA, mMMA})
	if err != nil || !scalar.EqualWithinAbsOrRel(ew, 650.715, 1e-3, 0) {
		t.Errorf("equivalent weight = %v, %v; want 650.715", ew, err)
	}
	ew, err = EquivalentWeight([]float64{0.2, 0.05, 0.75}, []float64{1, 1, 0}, []float64{mHEMA, mAA, mMMA})
	if err != nil || !scalar.EqualWithinAbsOrRel(ew, 448.308, 1e-3, 0) {
		t.Errorf("equivalent weight of both groups = %v, %v; want 448.308", ew, err)
	}
	if !scalar.EqualWithinAbsOrRel(ohv*650.715, 1000*MolarMassKOH, 1e-6, 1e-9) {
		t.Errorf("OHV · EW = %v, want 1000 M(KOH)", ohv*650.715)
	}
}

// TestResinErrors checks the validation of every input.
func TestResinErrors(t *testing.T) {
	tests := []struct {
		name  string
		call  func() error
		field string
		err   error
	}{
		{"Tg zero", func() error { _, err := Fox([]float64{0.5, 0.5}, []float64{378, 0}); return err }, "tg[1]", copoly.ErrOutOfRange},
		{"Tg negative", func() error { _, err := Fox([]float64{0.5, 0.5}, []float64{-5, 300}); return err }, "tg[0]", copoly.ErrOutOfRange},
		{"Tg NaN", func() error { _, err := Fox([]float64{0.5, 0.5}, []float64{378, math.NaN()}); return err }, "tg[1]", copoly.ErrNotFinite},
		{"Tg infinite", func() error { _, err := Fox([]float64{0.5, 0.5}, []float64{math.Inf(1), 300}); return err }, "tg[0]", copoly.ErrNotFinite},
		{"Tg count", func() error { _, err := Fox([]float64{0.5, 0.5}, []float64{378}); return err }, "tg", copoly.ErrOutOfRange},
		{"w negative", func() error { _, err := Fox([]float64{1.2, -0.2}, []float64{378, 300}); return err }, "w[0]", copoly.ErrOutOfRange},
		{"w sum", func() error { _, err := Fox([]float64{0.5, 0.4}, []float64{378, 300}); return err }, "w", copoly.ErrOutOfRange},
		{"w empty", func() error { _, err := Fox(nil, nil); return err }, "w", copoly.ErrOutOfRange},
		{"w NaN", func() error { _, err := Fox([]float64{math.NaN(), 1}, []float64{378, 300}); return err }, "w[0]", copoly.ErrNotFinite},
		{"groups", func() error {
			_, err := HydroxylValue([]float64{0.2, 0.8}, []float64{1, -1}, []float64{mHEMA, mMMA})
			return err
		}, "groups[1]", copoly.ErrOutOfRange},
		{"molar mass", func() error {
			_, err := AcidValue([]float64{0.2, 0.8}, []float64{1, 0}, []float64{mAA, 0})
			return err
		}, "molarMass[1]", copoly.ErrOutOfRange},
		{"no groups", func() error {
			_, err := EquivalentWeight([]float64{0.2, 0.8}, []float64{0, 0}, []float64{mHEMA, mMMA})
			return err
		}, "groups", copoly.ErrOutOfRange},
		{"x sum", func() error { _, err := MassFractions([]float64{0.2, 0.2}, []float64{100, 100}); return err }, "x", copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		err := tt.call()
		if copoly.Field(err) != tt.field || !errors.Is(err, tt.err) {
			t.Errorf("%s: %v, want field %q wrapping %v", tt.name, err, tt.field, tt.err)
		}
	}
}

// TestTgAlongDrift checks TgDrift against Fox applied by hand to the drift's compositions.
func TestTgAlongDrift(t *testing.T) {
	m, err := multi.New([][]float64{{1, 1.88}, {0.43, 1}}, nil) // MMA/nBA, copoly.Pairs
	if err != nil {
		t.Fatal(err)
	}
	d, err := m.Drift([]float64{0.5, 0.5}, []float64{0, 0.5, 0.9})
	if err != nil {
		t.Fatal(err)
	}
	mm, tg := []float64{mMMA, mBA}, []float64{378, 219}
	inst, cum, err := TgDrift(d, mm, tg)
	if err != nil {
		t.Fatal(err)
	}
	for k := range d.Conversion {
		w, _ := MassFractions(d.Inst[k], mm)
		want, _ := Fox(w, tg)
		wc, _ := MassFractions(d.Cum[k], mm)
		wantC, _ := Fox(wc, tg)
		if !scalar.EqualWithinAbsOrRel(inst[k], want, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(cum[k], wantC, 1e-12, 1e-12) {
			t.Errorf("X = %g: Tg %v and %v, want %v and %v", d.Conversion[k], inst[k], cum[k], want, wantC)
		}
	}
	// MMA enters faster (r1 = 1.88 > 1 > r2): the Tg of the polymer being made falls.
	if !(inst[0] > inst[1] && inst[1] > inst[2]) {
		t.Errorf("instantaneous Tg %v does not fall along the batch", inst)
	}
}

// TestTgDistribution checks the distribution of Tg over a batch's polymer: weights sum to 1;
// the Fox Tg of the whole product equals the mass-weighted harmonic mean of the slices' Tg (Fox
// is linear in 1/Tg and w, so the product's 1/Tg is the mass average of the slices'; midpoint
// rule over 4000 slices, 1e-6 relative); a batch at the azeotrope is one narrow peak; and a
// strongly drifting one (methyl methacrylate / vinyl acetate 26/0.03, copoly.Pairs; Tg 378 and
// 305 K, from memory, inputs only) is flagged wide.
func TestTgDistribution(t *testing.T) {
	mVAc := 86.090 // C4H6O2 by hand
	mm, tg := []float64{mMMA, mVAc}, []float64{378, 305}
	drifty, _ := multi.New([][]float64{{1, 26}, {0.03, 1}}, nil)
	sp, err := TgDistribution(drifty, []float64{0.5, 0.5}, 0.95, mm, tg, 40)
	if err != nil {
		t.Fatal(err)
	}
	var sum, inv float64
	for i, w := range sp.Weights {
		sum += w
		inv += w / (0.5 * (sp.Edges[i] + sp.Edges[i+1]))
	}
	if math.Abs(sum-1) > 1e-12 {
		t.Errorf("weights sum to %v", sum)
	}
	if !sp.Wide || sp.High-sp.Low <= WideSpread {
		t.Errorf("MMA/VAc to 95 %%: spread %v–%v K, Wide %v; want wide", sp.Low, sp.High, sp.Wide)
	}
	// The histogram's harmonic mean (bin midpoints) is coarse; the identity is checked on the
	// slices themselves, recomputed here.
	if math.Abs(1/inv-sp.Product) > 5 {
		t.Errorf("product Tg %v K, harmonic mean of the histogram %v K", sp.Product, 1/inv)
	}
	xs := make([]float64, multi.Slices)
	for k := range xs {
		xs[k] = (float64(k) + 0.5) * 0.95 / multi.Slices
	}
	d, err := drifty.Drift([]float64{0.5, 0.5}, xs)
	if err != nil {
		t.Fatal(err)
	}
	var mass, massOverTg float64
	for k := range xs {
		w, _ := MassFractions(d.Inst[k], mm)
		g, _ := Fox(w, tg)
		mk := d.Inst[k][0]*mm[0] + d.Inst[k][1]*mm[1]
		mass += mk
		massOverTg += mk / g
	}
	if h := mass / massOverTg; !scalar.EqualWithinAbsOrRel(h, sp.Product, 0, 1e-6) {
		t.Errorf("product Tg %.9g K, mass-weighted harmonic mean of the slices %.9g K", sp.Product, h)
	}
	az, _ := multi.New([][]float64{{1, 0.52}, {0.46, 1}}, nil) // St/MMA, azeotrope at 0.5294
	f1 := (1 - 0.46) / (2 - 0.52 - 0.46)
	sp, err = TgDistribution(az, []float64{f1, 1 - f1}, 0.9, []float64{104.152, mMMA}, []float64{373, 378}, 10)
	if err != nil {
		t.Fatal(err)
	}
	if sp.Wide || sp.High-sp.Low > 1e-6 {
		t.Errorf("at the azeotrope: spread %v–%v K, Wide %v; want a single Tg", sp.Low, sp.High, sp.Wide)
	}
	if _, err := TgDistribution(az, []float64{0.5, 0.5}, 0, []float64{104.152, mMMA}, []float64{373, 378}, 10); copoly.Field(err) != "conversion" {
		t.Errorf("zero conversion: %v", err)
	}
	stops, _ := multi.New([][]float64{{1, 2}, {0, 1}}, nil)
	if _, err := TgDistribution(stops, []float64{0.5, 0.5}, 0.9, []float64{100, 98}, []float64{378, 400}, 10); copoly.Field(err) != "conversion" || !errors.Is(err, copoly.ErrOutOfRange) {
		t.Errorf("past the stop: %v, want an error naming conversion", err)
	}
}

// TestResinValidationProperty feeds 5000 seeded random inputs, edges and non-numbers included,
// to every function: none may panic, every error names a field, every result is finite and
// positive.
func TestResinValidationProperty(t *testing.T) {
	special := []float64{0, 1, 0.5, -1, math.NaN(), math.Inf(1), math.Inf(-1), 1e-300, 1e6, 1e-9, MaxTg, MaxTg + 1, 300}
	rng := rand.New(rand.NewPCG(41, 42))
	vec := func(n int, norm bool) []float64 {
		v := make([]float64, n)
		var s float64
		for i := range v {
			if rng.IntN(4) == 0 {
				v[i] = special[rng.IntN(len(special))]
			} else {
				v[i] = 500 * rng.Float64()
			}
			s += v[i]
		}
		if norm && rng.IntN(3) != 0 {
			for i := range v {
				v[i] /= s
			}
		}
		return v
	}
	for range 5000 {
		n := rng.IntN(5)
		w, tg, g, mm := vec(n, true), vec(n+rng.IntN(2), false), vec(n, false), vec(n, false)
		type result struct {
			v   float64
			err error
		}
		var results []result
		v, err := Fox(w, tg)
		results = append(results, result{v, err})
		v, err = HydroxylValue(w, g, mm)
		results = append(results, result{v, err})
		v, err = EquivalentWeight(w, g, mm)
		results = append(results, result{v, err})
		v, err = FoxMoles(w, mm, tg)
		results = append(results, result{v, err})
		for _, r := range results {
			if r.err != nil {
				if copoly.Field(r.err) == "" {
					t.Fatalf("w = %v, tg = %v, groups = %v, molarMass = %v: %v names no field", w, tg, g, mm, r.err)
				}
				continue
			}
			if !(r.v >= 0) || math.IsInf(r.v, 0) {
				t.Fatalf("w = %v, tg = %v, groups = %v, molarMass = %v: result %v", w, tg, g, mm, r.v)
			}
		}
	}
}
