package bench

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
)

// Molar masses (g/mol) from the molecular formulas and the IUPAC 2021 standard atomic weights
// (C 12.011, H 1.008, N 14.007, O 15.999, Cl 35.45), computed by hand:
const (
	mStyrene = 104.152 // C8H8: 8·12.011 + 8·1.008 = 96.088 + 8.064
	mAN      = 53.064  // C3H3N: 3·12.011 + 3·1.008 + 14.007 = 36.033 + 3.024 + 14.007
	mMMA     = 100.117 // C5H8O2: 5·12.011 + 8·1.008 + 2·15.999 = 60.055 + 8.064 + 31.998
	aN       = 14.007  // N, IUPAC 2021 abridged standard atomic weight
)

func TestFormulaMasses(t *testing.T) {
	// The constants above must agree with MolarMassOf, which uses the same atomic weights.
	for _, c := range []struct {
		formula string
		want    float64
	}{{"C8H8", mStyrene}, {"C3H3N", mAN}, {"C5H8O2", mMMA}, {"N", aN}} {
		got, err := copoly.MolarMassOf(c.formula)
		if err != nil || !scalar.EqualWithinAbsOrRel(got, c.want, 1e-9, 1e-12) {
			t.Errorf("MolarMassOf(%q) = %v, %v, want %v", c.formula, got, err, c.want)
		}
	}
}

func TestFeedFromMasses(t *testing.T) {
	for _, c := range []struct {
		name           string
		m1, m2, M1, M2 float64
		want, tol      float64
	}{
		// n1 = 10.415/104.152 = 0.0999981, n2 = 5.306/53.064 = 0.0999925,
		// f10 = 0.0999981/(0.0999981 + 0.0999925) = 0.500014 (computed by hand).
		{"styrene/acrylonitrile by weight", 10.415, 5.306, mStyrene, mAN, 0.500014, 1e-6},
		// 0.1 mol of each: the masses are one tenth of the molar masses, f10 = 0.5.
		{"equimolar", 10.4152, 5.3064, mStyrene, mAN, 0.5, 1e-12},
		// No M2: f10 = n1/n1 = 1.
		{"M1 only", 5, 0, mStyrene, mAN, 1, 0},
		// Equal molar masses: the mole fraction is the mass fraction, 3/(3 + 1) = 0.75.
		{"equal molar masses", 3, 1, 100, 100, 0.75, 1e-15},
	} {
		t.Run(c.name, func(t *testing.T) {
			if got := FeedFromMasses(c.m1, c.m2, c.M1, c.M2); !scalar.EqualWithinAbsOrRel(got, c.want, c.tol, c.tol) {
				t.Errorf("FeedFromMasses(%v, %v, %v, %v) = %v, want %v", c.m1, c.m2, c.M1, c.M2, got, c.want)
			}
		})
	}
	// 0.06 mol and 0.04 mol: f10 = 0.06/0.10 = 0.6 (by hand).
	if got := FeedFromMoles(0.06, 0.04); !scalar.EqualWithinAbsOrRel(got, 0.6, 1e-15, 1e-15) {
		t.Errorf("FeedFromMoles(0.06, 0.04) = %v, want 0.6", got)
	}
}

func TestCompositionFromMassFraction(t *testing.T) {
	for _, c := range []struct {
		name       string
		w1, M1, M2 float64
		want       float64
	}{
		// Styrene/MMA with w1 = w2 = 0.5: F1 = (1/M1)/(1/M1 + 1/M2) = M2/(M1 + M2)
		// = 100.117/204.269 = 0.490123 (computed by hand).
		{"styrene/MMA half by mass", 0.5, mStyrene, mMMA, 0.490123},
		// Equal molar masses: F1 = w1.
		{"equal molar masses", 0.37, 86.09, 86.09, 0.37},
		// Limits: pure homopolymers.
		{"no M1", 0, mStyrene, mMMA, 0},
		{"only M1", 1, mStyrene, mMMA, 1},
	} {
		t.Run(c.name, func(t *testing.T) {
			if got := CompositionFromMassFraction(c.w1, c.M1, c.M2); !scalar.EqualWithinAbsOrRel(got, c.want, 1e-6, 1e-6) {
				t.Errorf("CompositionFromMassFraction(%v, %v, %v) = %v, want %v", c.w1, c.M1, c.M2, got, c.want)
			}
		})
	}
}

func TestCompositionFromNMR(t *testing.T) {
	for _, c := range []struct {
		name           string
		I1, n1, I2, n2 float64
		want           float64
	}{
		// Styrene aromatic signal (5 H) integral 10.0 against a methyl ester OCH3 signal (3 H)
		// integral 4.5: 10/5 = 2 and 4.5/3 = 1.5 units, F1 = 2/3.5 = 4/7 = 0.5714286 (by hand).
		{"styrene aromatic vs OCH3", 10.0, 5, 4.5, 3, 4.0 / 7},
		// The same proton count per unit on both signals: F1 = I1/(I1 + I2) = 1/4.
		{"equal proton counts", 1, 3, 3, 3, 0.25},
		// No M2 signal: F1 = 1.
		{"no M2 signal", 7.3, 5, 0, 3, 1},
	} {
		t.Run(c.name, func(t *testing.T) {
			if got := CompositionFromNMR(c.I1, c.n1, c.I2, c.n2); !scalar.EqualWithinAbsOrRel(got, c.want, 1e-7, 1e-7) {
				t.Errorf("CompositionFromNMR(%v, %v, %v, %v) = %v, want %v", c.I1, c.n1, c.I2, c.n2, got, c.want)
			}
		})
	}
}

func TestCompositionFromElement(t *testing.T) {
	for _, c := range []struct {
		name    string
		percent float64
		carrier int
		e       float64 // n·A_E, g/mol
		M1, M2  float64
		want    float64
		tol     float64
	}{
		// Styrene (M1)/acrylonitrile (M2) with 8.91 % N, one N per AN unit, p = 0.0891:
		// n·A − p·M2 = 14.007 − 4.7280 = 9.2790; n·A + p·(M1 − M2) = 14.007 + 4.5519 = 18.5589;
		// F1 = 9.2790/18.5589 = 0.499975 (computed by hand from the equation).
		{"SAN, N carried by M2", 8.91, 2, aN, mStyrene, mAN, 0.499975, 1e-6},
		// The same sample with the labels swapped (AN is M1): F1(AN) = p·M2/(n·A − p·(M1 − M2))
		// = 9.2799/18.5589 = 0.500025 = 1 − 0.499975 (by hand).
		{"SAN, N carried by M1", 8.91, 1, aN, mAN, mStyrene, 0.500025, 1e-6},
		// Polyacrylonitrile holds 100·14.007/53.064 = 26.3964 % N (from the formula): a copolymer
		// with that N content has no styrene.
		{"pure PAN", 100 * aN / mAN, 2, aN, mStyrene, mAN, 0, 1e-12},
		{"pure PAN as M1", 100 * aN / mAN, 1, aN, mAN, mStyrene, 1, 1e-12},
		// No N at all: no AN units.
		{"no N, carrier 2", 0, 2, aN, mStyrene, mAN, 1, 0},
		{"no N, carrier 1", 0, 1, aN, mAN, mStyrene, 0, 0},
	} {
		t.Run(c.name, func(t *testing.T) {
			if got := CompositionFromElement(c.percent, c.carrier, c.e, c.M1, c.M2); !scalar.EqualWithinAbsOrRel(got, c.want, c.tol, c.tol) {
				t.Errorf("CompositionFromElement(%v, %d, %v, %v, %v) = %v, want %v", c.percent, c.carrier, c.e, c.M1, c.M2, got, c.want)
			}
		})
	}
	if got := CompositionFromElement(5, 3, aN, mStyrene, mAN); !math.IsNaN(got) {
		t.Errorf("CompositionFromElement with carrier 3 = %v, want NaN", got)
	}
}

// TestCompositionFromElementRoundTrip computes the element content forward from a known
// composition by its definition (mass of E over mass of copolymer per mole of units) and checks
// that the inversion gives the composition back.
func TestCompositionFromElementRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for i := 0; i < 2000; i++ {
		F1 := rng.Float64()
		M1, M2 := 20+300*rng.Float64(), 20+300*rng.Float64()
		carrier := 1 + rng.IntN(2)
		mc := M1
		if carrier == 2 {
			mc = M2
		}
		e := mc * (0.05 + 0.9*rng.Float64()) // lighter than the carrier
		units := F1
		if carrier == 2 {
			units = 1 - F1
		}
		percent := 100 * units * e / (F1*M1 + (1-F1)*M2)
		got := CompositionFromElement(percent, carrier, e, M1, M2)
		if !scalar.EqualWithinAbsOrRel(got, F1, 1e-11, 1e-11) {
			t.Fatalf("F1 = %v, carrier %d, e = %v, M = %v/%v: %%E = %v inverts to %v", F1, carrier, e, M1, M2, percent, got)
		}
	}
}

func TestMolarConversionFromMass(t *testing.T) {
	for _, c := range []struct {
		name               string
		w, f10, F1, M1, M2 float64
		want               float64
	}{
		// X = 0.30·(0.5·104.15 + 0.5·100.12)/(0.52·104.15 + 0.48·100.12)
		//   = 0.30·102.135/102.2156 = 0.299763 (computed by hand from the equation).
		{"styrene/MMA", 0.30, 0.5, 0.52, 104.15, 100.12, 0.299763},
		// Copolymer of the feed's composition, or equal molar masses: X = w.
		{"composition equals feed", 0.4, 0.3, 0.3, mStyrene, mAN, 0.4},
		{"equal molar masses", 0.25, 0.3, 0.8, 100, 100, 0.25},
	} {
		t.Run(c.name, func(t *testing.T) {
			if got := MolarConversionFromMass(c.w, c.f10, c.F1, c.M1, c.M2); !scalar.EqualWithinAbsOrRel(got, c.want, 1e-6, 1e-6) {
				t.Errorf("MolarConversionFromMass(%v, %v, %v, %v, %v) = %v, want %v", c.w, c.f10, c.F1, c.M1, c.M2, got, c.want)
			}
		})
	}
}

// TestMolarConversionInvertsMassConversion checks the conversion against MassConversion, which
// computes w from the monomer balance with the unreacted feed f1 instead of the copolymer
// composition: with F̄1 = (f10 − (1 − X)·f1)/X both must describe the same sample.
func TestMolarConversionInvertsMassConversion(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for n := 0; n < 2000; {
		f10, x, f1 := rng.Float64(), 0.01+0.98*rng.Float64(), rng.Float64()
		F1 := (f10 - (1-x)*f1) / x
		if F1 < 0 || F1 > 1 {
			continue
		}
		n++
		M1, M2 := 20+300*rng.Float64(), 20+300*rng.Float64()
		w := copoly.MassConversion(x, f10, f1, M1, M2)
		if got := MolarConversionFromMass(w, f10, F1, M1, M2); !scalar.EqualWithinAbsOrRel(got, x, 1e-12, 1e-12) {
			t.Fatalf("f10 = %v, X = %v, f1 = %v: w = %v converts back to X = %v", f10, x, f1, w, got)
		}
	}
}

func TestRunInputConvert(t *testing.T) {
	for _, c := range []struct {
		name   string
		in     RunInput
		M1, M2 float64
		want   copoly.Run
		tol    float64
	}{
		// The zero kinds are mole fractions and no conversion.
		{"fractions, low conversion", RunInput{F10: 0.3, F1: 0.45}, 0, 0, copoly.Run{F10: 0.3, F1: 0.45}, 0},
		{"fractions with uncertainties", RunInput{FeedKind: "fraction", F10: 0.3, ConversionKind: "molar", Conversion: 0.25,
			CompositionKind: "fraction", F1: 0.5, SF: 0.01, SX: 0.02, Sf: 0.001},
			0, 0, copoly.Run{F10: 0.3, Conversion: 0.25, F1: 0.5, SF: 0.01, SX: 0.02, Sf: 0.001}, 0},
		// Fields of the forms not selected are ignored (Mass1 would be an error).
		{"unselected forms ignored", RunInput{F10: 0.3, F1: 0.45, Mass1: -5, Integral1: math.NaN(), Conversion: 7},
			0, 0, copoly.Run{F10: 0.3, F1: 0.45}, 0},
		// f10 = 0.500014 (TestFeedFromMasses).
		{"feed as masses", RunInput{FeedKind: "mass", Mass1: 10.415, Mass2: 5.306, F1: 0.6}, mStyrene, mAN,
			copoly.Run{F10: 0.500014, F1: 0.6}, 1e-6},
		// 0.06/(0.06 + 0.04) = 0.6.
		{"feed as moles", RunInput{FeedKind: "moles", Moles1: 0.06, Moles2: 0.04, F1: 0.6}, 0, 0, copoly.Run{F10: 0.6, F1: 0.6}, 1e-15},
		// X = 0.299763 (TestMolarConversionFromMass).
		{"mass conversion", RunInput{F10: 0.5, ConversionKind: "mass", Conversion: 0.30, F1: 0.52}, 104.15, 100.12,
			copoly.Run{F10: 0.5, Conversion: 0.299763, F1: 0.52}, 1e-6},
		// F1 = 0.490123 (TestCompositionFromMassFraction).
		{"composition as mass fraction", RunInput{F10: 0.5, CompositionKind: "massFraction", MassFraction1: 0.5}, mStyrene, mMMA,
			copoly.Run{F10: 0.5, F1: 0.490123}, 1e-6},
		// F1 = 4/7 (TestCompositionFromNMR).
		{"composition by NMR", RunInput{F10: 0.5, CompositionKind: "nmr", Integral1: 10, Protons1: 5, Integral2: 4.5, Protons2: 3}, 0, 0,
			copoly.Run{F10: 0.5, F1: 4.0 / 7}, 1e-15},
		// F1 = 0.499975 (TestCompositionFromElement); the symbol is trimmed.
		{"composition by N analysis", RunInput{F10: 0.5, CompositionKind: "element", Element: " N ", Carrier: 2, ElementCount: 1, ElementPercent: 8.91},
			mStyrene, mAN, copoly.Run{F10: 0.5, F1: 0.499975}, 1e-6},
		// All weighed forms together: f10 = 0.500014, F1 = 0.499975, and
		// X = 0.2·(0.500014·104.152 + 0.499986·53.064)/(0.499975·104.152 + 0.500025·53.064)
		//   = 0.2·78.6087/78.6067 = 0.200005 (computed by hand from the equation).
		{"masses, N analysis, mass conversion", RunInput{FeedKind: "mass", Mass1: 10.415, Mass2: 5.306,
			ConversionKind: "mass", Conversion: 0.2,
			CompositionKind: "element", Element: "N", Carrier: 2, ElementCount: 1, ElementPercent: 8.91},
			mStyrene, mAN, copoly.Run{F10: 0.500014, Conversion: 0.200005, F1: 0.499975}, 1e-6},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, err := c.in.Convert(c.M1, c.M2)
			if err != nil {
				t.Fatalf("Convert(%v, %v) error: %v", c.M1, c.M2, err)
			}
			for _, v := range []struct {
				name      string
				got, want float64
			}{{"F10", got.F10, c.want.F10}, {"Conversion", got.Conversion, c.want.Conversion}, {"F1", got.F1, c.want.F1},
				{"SF", got.SF, c.want.SF}, {"SX", got.SX, c.want.SX}, {"Sf", got.Sf, c.want.Sf}} {
				if !scalar.EqualWithinAbsOrRel(v.got, v.want, c.tol, c.tol) {
					t.Errorf("Convert(%v, %v).%s = %v, want %v", c.M1, c.M2, v.name, v.got, v.want)
				}
			}
		})
	}
}

func TestRunInputErrors(t *testing.T) {
	ok := RunInput{F10: 0.5, F1: 0.5}
	with := func(f func(*RunInput)) RunInput { in := ok; f(&in); return in }
	nmr := with(func(in *RunInput) {
		in.CompositionKind, in.Integral1, in.Protons1, in.Integral2, in.Protons2 = "nmr", 10, 5, 4.5, 3
	})
	el := with(func(in *RunInput) {
		in.CompositionKind, in.Element, in.Carrier, in.ElementCount, in.ElementPercent = "element", "N", 2, 1, 8.91
	})
	mod := func(base RunInput, f func(*RunInput)) RunInput { f(&base); return base }
	for _, c := range []struct {
		name   string
		in     RunInput
		M1, M2 float64
		field  string
		err    error
	}{
		{"f10 above 1", with(func(in *RunInput) { in.F10 = 1.2 }), 0, 0, "f10", copoly.ErrOutOfRange},
		{"f10 as a percentage", with(func(in *RunInput) { in.F10 = 35 }), 0, 0, "f10", copoly.ErrOutOfRange},
		{"f10 NaN", with(func(in *RunInput) { in.F10 = math.NaN() }), 0, 0, "f10", copoly.ErrNotFinite},
		{"unknown feed kind", with(func(in *RunInput) { in.FeedKind = "volume" }), 0, 0, "feedKind", copoly.ErrOutOfRange},
		{"negative mass", with(func(in *RunInput) { in.FeedKind, in.Mass1, in.Mass2 = "mass", -1, 5 }), mStyrene, mAN, "mass1", copoly.ErrOutOfRange},
		{"infinite mass", with(func(in *RunInput) { in.FeedKind, in.Mass1, in.Mass2 = "mass", 1, math.Inf(1) }), mStyrene, mAN, "mass2", copoly.ErrNotFinite},
		{"absurd mass", with(func(in *RunInput) { in.FeedKind, in.Mass1, in.Mass2 = "mass", 1e300, 1 }), mStyrene, mAN, "mass1", copoly.ErrOutOfRange},
		{"no monomer", with(func(in *RunInput) { in.FeedKind = "mass" }), mStyrene, mAN, "mass1", copoly.ErrOutOfRange},
		{"masses without molar mass", with(func(in *RunInput) { in.FeedKind, in.Mass1, in.Mass2 = "mass", 1, 1 }), 0, mAN, "molarMass1", copoly.ErrOutOfRange},
		{"masses with NaN molar mass", with(func(in *RunInput) { in.FeedKind, in.Mass1, in.Mass2 = "mass", 1, 1 }), mStyrene, math.NaN(), "molarMass2", copoly.ErrNotFinite},
		{"negative moles", with(func(in *RunInput) { in.FeedKind, in.Moles1, in.Moles2 = "moles", 1, -0.1 }), 0, 0, "moles2", copoly.ErrOutOfRange},
		{"zero molar conversion", with(func(in *RunInput) { in.ConversionKind = "molar" }), 0, 0, "conversion", copoly.ErrOutOfRange},
		{"conversion as a percentage", with(func(in *RunInput) { in.ConversionKind, in.Conversion = "molar", 35 }), 0, 0, "conversion", copoly.ErrOutOfRange},
		{"unknown conversion kind", with(func(in *RunInput) { in.ConversionKind = "volume" }), 0, 0, "conversionKind", copoly.ErrOutOfRange},
		{"mass conversion without molar masses", with(func(in *RunInput) { in.ConversionKind, in.Conversion = "mass", 0.3 }), 0, 0, "molarMass1", copoly.ErrOutOfRange},
		// X = 0.99·(0.9·200 + 0.1·50)/(0.1·200 + 0.9·50) = 0.99·185/65 = 2.82 > 1 (by hand).
		{"mass conversion above all monomer", with(func(in *RunInput) {
			in.F10, in.F1, in.ConversionKind, in.Conversion = 0.9, 0.1, "mass", 0.99
		}), 200, 50, "conversion", copoly.ErrOutOfRange},
		{"F1 negative", with(func(in *RunInput) { in.F1 = -0.1 }), 0, 0, "F1", copoly.ErrOutOfRange},
		{"unknown composition kind", with(func(in *RunInput) { in.CompositionKind = "ir" }), 0, 0, "compositionKind", copoly.ErrOutOfRange},
		{"mass fraction above 1", with(func(in *RunInput) { in.CompositionKind, in.MassFraction1 = "massFraction", 1.5 }), mStyrene, mMMA, "massFraction1", copoly.ErrOutOfRange},
		{"mass fraction without molar mass", with(func(in *RunInput) { in.CompositionKind, in.MassFraction1 = "massFraction", 0.5 }), mStyrene, 0, "molarMass2", copoly.ErrOutOfRange},
		{"negative integral", mod(nmr, func(in *RunInput) { in.Integral2 = -3 }), 0, 0, "integral2", copoly.ErrOutOfRange},
		{"zero protons", mod(nmr, func(in *RunInput) { in.Protons1 = 0 }), 0, 0, "protons1", copoly.ErrOutOfRange},
		{"fractional protons", mod(nmr, func(in *RunInput) { in.Protons2 = 2.5 }), 0, 0, "protons2", copoly.ErrOutOfRange},
		{"both integrals zero", mod(nmr, func(in *RunInput) { in.Integral1, in.Integral2 = 0, 0 }), 0, 0, "integral1", copoly.ErrOutOfRange},
		{"unknown element", mod(el, func(in *RunInput) { in.Element = "Xx" }), mStyrene, mAN, "element", copoly.ErrOutOfRange},
		{"no element", mod(el, func(in *RunInput) { in.Element = "" }), mStyrene, mAN, "element", copoly.ErrOutOfRange},
		{"lower-case symbol", mod(el, func(in *RunInput) { in.Element = "n" }), mStyrene, mAN, "element", copoly.ErrOutOfRange},
		{"carrier 3", mod(el, func(in *RunInput) { in.Carrier = 3 }), mStyrene, mAN, "carrier", copoly.ErrOutOfRange},
		{"no carrier", mod(el, func(in *RunInput) { in.Carrier = 0 }), mStyrene, mAN, "carrier", copoly.ErrOutOfRange},
		{"zero element count", mod(el, func(in *RunInput) { in.ElementCount = 0 }), mStyrene, mAN, "elementCount", copoly.ErrOutOfRange},
		// Four N atoms weigh 56.03 g/mol, more than acrylonitrile's 53.06 g/mol.
		{"element heavier than monomer", mod(el, func(in *RunInput) { in.ElementCount = 4 }), mStyrene, mAN, "elementCount", copoly.ErrOutOfRange},
		// Above the 26.40 % N of polyacrylonitrile (TestCompositionFromElement).
		{"more N than PAN", mod(el, func(in *RunInput) { in.ElementPercent = 30 }), mStyrene, mAN, "elementPercent", copoly.ErrOutOfRange},
		{"negative percent", mod(el, func(in *RunInput) { in.ElementPercent = -1 }), mStyrene, mAN, "elementPercent", copoly.ErrOutOfRange},
		{"NaN percent", mod(el, func(in *RunInput) { in.ElementPercent = math.NaN() }), mStyrene, mAN, "elementPercent", copoly.ErrNotFinite},
		{"element without molar masses", el, 0, 0, "molarMass1", copoly.ErrOutOfRange},
		{"negative sF", with(func(in *RunInput) { in.SF = -0.01 }), 0, 0, "sF", copoly.ErrOutOfRange},
		{"sf above 1", with(func(in *RunInput) { in.Sf = 2 }), 0, 0, "sf", copoly.ErrOutOfRange},
		{"sX without conversion", with(func(in *RunInput) { in.SX = 0.01 }), 0, 0, "sX", copoly.ErrOutOfRange},
		{"label too long", with(func(in *RunInput) { in.Label = strings.Repeat("é", MaxLabelLength+1) }), 0, 0, "label", copoly.ErrOutOfRange},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := c.in.Convert(c.M1, c.M2)
			if err == nil {
				t.Fatalf("Convert(%v, %v) gave no error, want one naming %q", c.M1, c.M2, c.field)
			}
			if got := copoly.Field(err); got != c.field {
				t.Errorf("Convert(%v, %v) error names %q, want %q (%v)", c.M1, c.M2, got, c.field, err)
			}
			if !errors.Is(err, c.err) {
				t.Errorf("Convert(%v, %v) error %v does not wrap %v", c.M1, c.M2, err, c.err)
			}
			// In a table, the field gets the row, and the message counts rows from 1 and names
			// the label.
			in := c.in
			if in.Label == "" {
				in.Label = "S-4"
			}
			_, errs := ConvertRuns([]RunInput{ok, ok, ok, in}, c.M1, c.M2)
			want := "runs[3]." + c.field
			if strings.HasPrefix(c.field, "molarMass") {
				want = c.field
			}
			if got := copoly.Field(errs[3]); got != want {
				t.Errorf("ConvertRuns: row 4 error names %q, want %q (%v)", got, want, errs[3])
			}
			if msg := errs[3].Error(); !strings.Contains(msg, "row 4") {
				t.Errorf("ConvertRuns: message %q does not say row 4", msg)
			}
			if in.Label == "S-4" && !strings.Contains(errs[3].Error(), `"S-4"`) {
				t.Errorf("ConvertRuns: message %q does not name the label", errs[3])
			}
		})
	}
}

func TestConvertRunsKeepsGoodRows(t *testing.T) {
	in := []RunInput{
		{F10: 0.2, F1: 0.3},
		{F10: 2, F1: 0.3}, // typed 2 for 0.2
		{FeedKind: "mass", Mass1: 10.415, Mass2: 5.306, F1: 0.6},
		{F10: 0.8, F1: 0.7, ConversionKind: "molar", Conversion: 0.05},
	}
	runs, errs := ConvertRuns(in, mStyrene, mAN)
	if len(runs) != len(in) || len(errs) != len(in) {
		t.Fatalf("ConvertRuns returned %d runs and %d errors for %d rows", len(runs), len(errs), len(in))
	}
	for i, e := range errs {
		if (e != nil) != (i == 1) {
			t.Errorf("row %d: error %v", i+1, e)
		}
	}
	if runs[1] != (copoly.Run{}) {
		t.Errorf("bad row gave %+v, want the zero Run", runs[1])
	}
	// Good rows come through unchanged or converted (f10 = 0.500014, TestFeedFromMasses).
	if runs[0] != (copoly.Run{F10: 0.2, F1: 0.3}) || runs[3] != (copoly.Run{F10: 0.8, Conversion: 0.05, F1: 0.7}) ||
		!scalar.EqualWithinAbsOrRel(runs[2].F10, 0.500014, 1e-6, 1e-6) {
		t.Errorf("good rows: %+v", runs)
	}
	if got := copoly.Field(errs[1]); got != "runs[1].f10" {
		t.Errorf("bad row names %q, want runs[1].f10", got)
	}

	// The row limit.
	runs, errs = ConvertRuns(make([]RunInput, MaxRuns+1), 0, 0)
	if runs != nil || len(errs) != 1 || !errors.Is(errs[0], copoly.ErrTooMany) || copoly.Field(errs[0]) != "runs" {
		t.Errorf("ConvertRuns(%d rows) = %v, %v, want nil and one ErrTooMany naming runs", MaxRuns+1, runs, errs)
	}
	if _, errs = ConvertRuns(make([]RunInput, MaxRuns), 0, 0); len(errs) != MaxRuns {
		t.Errorf("ConvertRuns(%d rows) gave %d errors, want one per row", MaxRuns, len(errs))
	}
}

// TestConvertProperties converts seeded random rows in every form and checks that the results
// are fractions and that a feed weighed out from a mole fraction converts back to it.
func TestConvertProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 5000; i++ {
		M1, M2 := 15+300*rng.Float64(), 15+300*rng.Float64()
		f10 := rng.Float64()
		scale := math.Pow(10, -3+6*rng.Float64()) // from mg to kg scale
		in := RunInput{
			FeedKind: []string{"fraction", "mass", "moles"}[rng.IntN(3)],
			F10:      f10,
			Mass1:    scale * f10 * M1, Mass2: scale * (1 - f10) * M2,
			Moles1: scale * f10, Moles2: scale * (1 - f10),
			CompositionKind: []string{"fraction", "massFraction", "nmr", "element"}[rng.IntN(4)],
			F1:              rng.Float64(),
			MassFraction1:   rng.Float64(),
			Integral1:       100 * rng.Float64(), Protons1: float64(1 + rng.IntN(9)),
			Integral2: 100 * rng.Float64(), Protons2: float64(1 + rng.IntN(9)),
			Element: "N", Carrier: 1 + rng.IntN(2), ElementCount: 1,
		}
		mc := M1
		if in.Carrier == 2 {
			mc = M2
		}
		in.ElementPercent = 100 * aN / mc * rng.Float64()
		if rng.IntN(2) == 0 {
			in.ConversionKind, in.Conversion = "molar", 0.001+0.999*rng.Float64()
		}
		r, err := in.Convert(M1, M2)
		if err != nil {
			if in.Integral1 == 0 && in.Integral2 == 0 {
				continue
			}
			t.Fatalf("%+v: %v", in, err)
		}
		for _, v := range []float64{r.F10, r.F1, r.Conversion} {
			if !(v >= 0 && v <= 1) {
				t.Fatalf("%+v converted to %+v: a value outside [0, 1]", in, r)
			}
		}
		if !scalar.EqualWithinAbsOrRel(r.F10, f10, 1e-13, 1e-13) {
			t.Fatalf("feed %s: f10 = %v came back as %v", in.FeedKind, f10, r.F10)
		}
		// Mass conversion: the copolymer mass fraction computed from F1 must give back the
		// same molar conversion through the mass conversion it implies.
		w := r.Conversion * (r.F1*M1 + (1-r.F1)*M2) / (r.F10*M1 + (1-r.F10)*M2)
		if w > 0 && w <= 1 {
			in2 := in
			in2.FeedKind, in2.F10 = "fraction", r.F10
			in2.CompositionKind, in2.F1 = "fraction", r.F1
			in2.ConversionKind, in2.Conversion = "mass", w
			r2, err := in2.Convert(M1, M2)
			if err != nil || !scalar.EqualWithinAbsOrRel(r2.Conversion, r.Conversion, 1e-12, 1e-12) {
				t.Fatalf("w = %v: X = %v, %v, want %v", w, r2.Conversion, err, r.Conversion)
			}
		}
	}
}

// FuzzRunInput converts rows of any numbers in every form. A row that converts gives finite
// fractions (f10, F1, the uncertainties in [0, 1], a conversion in (0, 1] or 0); a row that
// does not gives a typed error naming one of the row's fields and wrapping a sentinel.
func FuzzRunInput(f *testing.F) {
	// Seeds: the rows of TestRunInputConvert's first cases and edge values.
	f.Add(uint8(0), uint8(0), uint8(0), 0.5, 0.0, 0.0, 0.3, 0.0, 0.0, 0.0, 0.0, 0.0, uint8(1), 1.0, 0.01, 0.0, 0.0, mStyrene, mAN)
	f.Add(uint8(1), uint8(2), uint8(1), 0.0, 10.415, 5.306, 0.0, 0.6, 0.0, 0.0, 0.0, 0.1, uint8(2), 1.0, 0.0, 0.0, 0.0, mStyrene, mAN)
	f.Add(uint8(2), uint8(1), uint8(2), 0.0, 0.1, 0.1, 0.0, 0.0, 500.0, 5.0, 300.0, 0.2, uint8(0), 3.0, 0.0, 0.01, 0.0, 0.0, 0.0)
	f.Add(uint8(0), uint8(2), uint8(3), 0.5, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.5, uint8(2), 1.0, 0.0, 0.0, 0.0, mStyrene, mAN)
	f.Add(uint8(1), uint8(3), uint8(4), math.NaN(), math.Inf(1), -1.0, 2.0, -0.0, 1e308, 2.5, 1e-320, 1.0, uint8(3), 0.5, -1.0, 2.0, math.NaN(), 0.0, 1e6)
	forms := [3][]string{
		{FeedFraction, FeedMass, FeedMoles, "", "grams"},
		{ConversionNone, ConversionMolar, ConversionMass, "", "percent"},
		{CompositionFraction, CompositionMassFraction, CompositionNMR, CompositionElement, "", "ir"},
	}
	elements := []string{"N", "Cl", "", "Xx", " S "}
	fields := map[string]bool{"f10": true, "mass1": true, "mass2": true, "moles1": true, "moles2": true, "conversion": true, "F1": true,
		"massFraction1": true, "integral1": true, "protons1": true, "integral2": true, "protons2": true, "element": true, "carrier": true,
		"elementCount": true, "elementPercent": true, "sF": true, "sX": true, "sf": true, "feedKind": true, "conversionKind": true,
		"compositionKind": true, "molarMass1": true, "molarMass2": true}
	f.Fuzz(func(t *testing.T, feed, conv, comp uint8, f10, a, b, F1, w1, i1, h1, i2, x float64, el uint8, count, sF, sX, sf, M1, M2 float64) {
		in := RunInput{
			FeedKind: forms[0][int(feed)%len(forms[0])], ConversionKind: forms[1][int(conv)%len(forms[1])],
			CompositionKind: forms[2][int(comp)%len(forms[2])],
			F10:             f10, Mass1: a, Mass2: b, Moles1: a, Moles2: b, Conversion: x,
			F1: F1, MassFraction1: w1, Integral1: i1, Protons1: h1, Integral2: i2, Protons2: count,
			Element: elements[int(el)%len(elements)], Carrier: int(el) % 4, ElementCount: count, ElementPercent: 100 * w1,
			SF: sF, SX: sX, Sf: sf,
		}
		r, err := in.Convert(M1, M2)
		if err != nil {
			if !fields[copoly.Field(err)] {
				t.Fatalf("%+v.Convert(%v, %v) error %v names field %q", in, M1, M2, err, copoly.Field(err))
			}
			if !(errors.Is(err, copoly.ErrOutOfRange) || errors.Is(err, copoly.ErrNotFinite)) {
				t.Fatalf("%+v.Convert error %v wraps no sentinel", in, err)
			}
			if !strings.HasPrefix(err.Error(), copoly.Field(err)) {
				t.Fatalf("%+v.Convert error %q does not start with its field %q", in, err, copoly.Field(err))
			}
			return
		}
		for _, v := range []float64{r.F10, r.F1, r.Conversion, r.SF, r.SX, r.Sf} {
			if !(v >= 0 && v <= 1) {
				t.Fatalf("%+v.Convert(%v, %v) = %+v: a value outside [0, 1] or not finite", in, M1, M2, r)
			}
		}
		if (in.ConversionKind == ConversionMolar || in.ConversionKind == ConversionMass) != (r.Conversion > 0) {
			t.Fatalf("%+v.Convert = %+v: conversion given and converted disagree", in, r)
		}
	})
}
