package bench

import (
	"fmt"
	"math"
	"strings"
	"unicode/utf8"

	"copoly/copoly"
)

// MaxRuns is the largest number of bench rows [ConvertRuns] accepts in one call.
const MaxRuns = 1000

// MaxLabelLength is the longest run label, in characters.
const MaxLabelLength = 200

// Forms of the feed accepted in [RunInput.FeedKind].
const (
	FeedFraction = "fraction" // mole fraction f10 of M1
	FeedMass     = "mass"     // charged masses of M1 and M2, in g
	FeedMoles    = "moles"    // charged amounts of M1 and M2, in mol
)

// Forms of the conversion accepted in [RunInput.ConversionKind].
const (
	ConversionNone  = "none"  // not measured: a low-conversion sample
	ConversionMolar = "molar" // overall molar conversion X, a fraction
	ConversionMass  = "mass"  // gravimetric (mass) conversion w, a fraction
)

// Forms of the copolymer composition accepted in [RunInput.CompositionKind].
const (
	CompositionFraction     = "fraction"     // mole fraction F1 of M1 units
	CompositionMassFraction = "massFraction" // mass fraction of M1 units
	CompositionNMR          = "nmr"          // ¹H NMR integrals and proton counts
	CompositionElement      = "element"      // mass % of an element carried by one monomer
)

// RunInput is one row of a bench table as the chemist typed it: the feed, the conversion and
// the copolymer composition, each in one of several forms. [RunInput.Convert] turns it into a
// [copoly.Run] of mole fractions and molar conversion.
//
// Each Kind field selects a form; the fields of the forms not selected are ignored. An empty Kind
// selects the first form listed ("fraction", "none", "fraction"), so the zero value with F10 and
// F1 set is a low-conversion run given in mole fractions. Fractions (F10, Conversion,
// MassFraction1, the uncertainties) are plain fractions from 0 to 1, not percentages;
// ElementPercent is a percentage.
type RunInput struct {
	// Label names the sample for people ("S-4", "batch 12, 30 min"); it is optional and at most
	// MaxLabelLength characters long.
	Label string

	// FeedKind is "fraction", "mass" or "moles".
	FeedKind string
	// F10 is the initial mole fraction of M1 in the feed (FeedKind "fraction").
	F10 float64
	// Mass1 and Mass2 are the charged masses of M1 and M2 in g (FeedKind "mass").
	Mass1, Mass2 float64
	// Moles1 and Moles2 are the charged amounts of M1 and M2 in mol (FeedKind "moles").
	Moles1, Moles2 float64

	// ConversionKind is "none", "molar" or "mass".
	ConversionKind string
	// Conversion is the overall molar conversion X (ConversionKind "molar") or the gravimetric
	// mass conversion w, the mass of copolymer over the mass of monomer charged (ConversionKind
	// "mass"), as a fraction above 0 and at most 1.
	Conversion float64

	// CompositionKind is "fraction", "massFraction", "nmr" or "element".
	CompositionKind string
	// F1 is the mole fraction of M1 units in the copolymer (CompositionKind "fraction").
	F1 float64
	// MassFraction1 is the mass fraction of M1 units in the copolymer (CompositionKind
	// "massFraction").
	MassFraction1 float64
	// Integral1 is the ¹H NMR integral of a signal of M1 units, from Protons1 protons per unit;
	// Integral2 and Protons2 are the same for a signal of M2 units (CompositionKind "nmr"). The
	// integrals share any scale; the proton counts are whole numbers.
	Integral1, Protons1, Integral2, Protons2 float64
	// Element is the symbol of an element found in one monomer only ("N", "Cl"; CompositionKind
	// "element"), Carrier is that monomer (1 or 2), ElementCount the number of atoms of the
	// element in one unit of it (1 for N in acrylonitrile) and ElementPercent the element's
	// mass percentage in the copolymer from elemental analysis.
	Element        string
	Carrier        int
	ElementCount   float64
	ElementPercent float64

	// SF, SX and Sf are optional standard uncertainties (0 = not given) of the copolymer
	// composition, the conversion and the feed. They are given in the units of the converted
	// values, whatever form the measurement was typed in: SF and Sf as mole fractions, SX as a
	// molar conversion (a fraction). They are copied to the [copoly.Run] unchanged, not propagated.
	SF, SX, Sf float64
}

// FeedFromMasses returns the mole fraction of M1 in a feed of mass1 g of M1 (molar mass
// molarMass1 g/mol) and mass2 g of M2:
//
//	nᵢ = mᵢ/Mᵢ,  f10 = n1/(n1 + n2)
//
// The inputs are not validated ([RunInput.Convert] validates); both masses zero give NaN.
//
// References:
//   - Definitions of amount of substance, n = m/M, and amount fraction: IUPAC, Quantities,
//     Units and Symbols in Physical Chemistry (Green Book), 3rd ed., RSC 2007.
func FeedFromMasses(mass1, mass2, molarMass1, molarMass2 float64) float64 {
	return FeedFromMoles(mass1/molarMass1, mass2/molarMass2)
}

// FeedFromMoles returns the mole fraction of M1 in a feed of moles1 mol of M1 and moles2 mol of
// M2:
//
//	f10 = n1/(n1 + n2)
//
// The inputs are not validated; both amounts zero give NaN.
//
// References:
//   - Definition of amount fraction: IUPAC Green Book, 3rd ed., RSC 2007.
func FeedFromMoles(moles1, moles2 float64) float64 {
	return moles1 / (moles1 + moles2)
}

// CompositionFromMassFraction returns the mole fraction F1 of M1 units in a copolymer whose mass
// fraction of M1 units is w1 (w2 = 1 − w1), from the monomer molar masses in g/mol (a unit of
// the chain has the molar mass of its monomer):
//
//	F1 = (w1/M1) / (w1/M1 + w2/M2)
//
// The inputs are not validated ([RunInput.Convert] validates).
//
// References:
//   - Definitions of mass fraction and amount fraction: IUPAC Green Book, 3rd ed., RSC 2007.
func CompositionFromMassFraction(w1, molarMass1, molarMass2 float64) float64 {
	a, b := w1/molarMass1, (1-w1)/molarMass2
	return a / (a + b)
}

// CompositionFromNMR returns the mole fraction F1 of M1 units in a copolymer from the ¹H NMR
// integral I1 of a signal of M1 units carrying n1 protons per unit and the integral I2 of a
// signal of M2 units carrying n2 protons per unit. The area of a signal is proportional to the
// number of protons it comes from, so Iᵢ/nᵢ is proportional to the amount of units i:
//
//	F1 = (I1/n1) / (I1/n1 + I2/n2)
//
// For a styrene copolymer, for example, the aromatic signal has n1 = 5 and a methyl ester OCH₃
// signal n2 = 3. The inputs are not validated; both integrals zero give NaN.
//
// References:
//   - Quantitative ¹H NMR (signal area proportional to the number of nuclei): F. Malz,
//     H. Jancke, J. Pharm. Biomed. Anal. 2005, 38, 813 (from memory).
func CompositionFromNMR(integral1, protons1, integral2, protons2 float64) float64 {
	a, b := integral1/protons1, integral2/protons2
	return a / (a + b)
}

// CompositionFromElement returns the mole fraction F1 of M1 units in a copolymer from the mass
// percentage of an element E found in one monomer only (the carrier, 1 or 2), as measured by
// elemental analysis. elementMass = n·A_E is the mass of E in one mole of carrier units (n atoms
// of atomic weight A_E), and the molar masses are in g/mol.
//
// With p = %E/100 the mass fraction of E, a mole of units holds F1·M1 + (1 − F1)·M2 grams of
// copolymer. When M1 carries E it holds F1·n·A_E grams of E, so p = F1·n·A_E/(F1·M1 +
// (1 − F1)·M2), and solving for F1:
//
//	carrier 1:  F1 = p·M2 / (n·A_E − p·(M1 − M2))
//
// When M2 carries E, p = (1 − F1)·n·A_E/(F1·M1 + (1 − F1)·M2); the same algebra with the labels
// swapped gives F2 = p·M1/(n·A_E − p·(M2 − M1)), and F1 = 1 − F2:
//
//	carrier 2:  F1 = (n·A_E − p·M2) / (n·A_E + p·(M1 − M2))
//
// F1 lies in [0, 1] exactly when 0 ≤ p ≤ n·A_E/M_carrier, the element content of the carrier's
// homopolymer; then both denominators are positive. The inputs are not validated
// ([RunInput.Convert] validates); a carrier other than 1 or 2 gives NaN.
//
// References:
//   - The element mass balance above. Nitrogen and chlorine analyses were used this way for
//     acrylonitrile and vinylidene chloride copolymers by F. M. Lewis, F. R. Mayo, W. F. Hulse,
//     J. Am. Chem. Soc. 1945, 67, 1701 (from memory).
func CompositionFromElement(percent float64, carrier int, elementMass, molarMass1, molarMass2 float64) float64 {
	p := percent / 100
	switch carrier {
	case 1:
		return p * molarMass2 / (elementMass - p*(molarMass1-molarMass2))
	case 2:
		return (elementMass - p*molarMass2) / (elementMass + p*(molarMass1-molarMass2))
	}
	return math.NaN()
}

// MolarConversionFromMass returns the overall molar conversion X of a sample from its gravimetric
// (mass) conversion w, the feed f10 and the measured cumulative copolymer composition F̄1
// (molar masses in g/mol). The copolymer mass is w times the monomer mass charged, and dividing
// it by the mean molar mass of a unit gives the moles of monomer converted:
//
//	X = w·(f10·M1 + (1 − f10)·M2) / (F̄1·M1 + (1 − F̄1)·M2)
//
// It inverts [copoly.MassConversion] when F̄1 is measured rather than computed from a model, so it
// needs no reactivity ratios. The inputs are not validated ([RunInput.Convert] validates); the
// result can exceed 1 when w and F̄1 are inconsistent.
//
// References:
//   - Mass balance on the polymer; the definitions of X and w are those of the Meyer–Lowry
//     integrated equation: V. E. Meyer, G. G. Lowry, J. Polym. Sci. A 1965, 3, 2843.
func MolarConversionFromMass(w, f10, F1cum, molarMass1, molarMass2 float64) float64 {
	return w * (f10*molarMass1 + (1-f10)*molarMass2) / (F1cum*molarMass1 + (1-F1cum)*molarMass2)
}

// rowNamer names the fields of one bench row in errors: "runs[3].f10" with "row 4" in the
// message when the row comes from a table (row ≥ 0), the bare field otherwise.
type rowNamer struct {
	prefix string
	intro  string
}

func newRowNamer(row int, label string) rowNamer {
	var n rowNamer
	if row >= 0 {
		n.prefix = fmt.Sprintf("runs[%d].", row)
		n.intro = fmt.Sprintf("row %d", row+1)
	}
	if label != "" && utf8.RuneCountInString(label) <= MaxLabelLength {
		if n.intro == "" {
			n.intro = fmt.Sprintf("%q", label)
		} else {
			n.intro += fmt.Sprintf(" (%q)", label)
		}
	}
	return n
}

func (n rowNamer) reason(format string, args ...any) string {
	r := fmt.Sprintf(format, args...)
	if n.intro != "" {
		r = n.intro + ": " + r
	}
	return r
}

// value returns an *InputError for field (without its row prefix) holding v.
func (n rowNamer) value(field string, v float64, sentinel error, format string, args ...any) error {
	return &copoly.InputError{Field: n.prefix + field, Value: v, Reason: n.reason(format, args...), Err: sentinel}
}

// text returns a *FieldError for field (without its row prefix).
func (n rowNamer) text(field string, format string, args ...any) error {
	return &copoly.FieldError{Field: n.prefix + field, Reason: n.reason(format, args...), Err: copoly.ErrOutOfRange}
}

// finite checks v is a finite number.
func (n rowNamer) finite(field string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return n.value(field, v, copoly.ErrNotFinite, "must be a finite number")
	}
	return nil
}

// fraction checks 0 ≤ v ≤ 1; what names the quantity for the message.
func (n rowNamer) fraction(field string, v float64, what string) error {
	if err := n.finite(field, v); err != nil {
		return err
	}
	if v < 0 || v > 1 {
		return n.value(field, v, copoly.ErrOutOfRange, "%s must lie between 0 and 1 (enter fractions, not percentages)", what)
	}
	return nil
}

// maxAmount bounds masses, amounts and NMR integrals, far above any real value, so that their
// sums and ratios cannot overflow.
const maxAmount = 1e100

// amount checks 0 ≤ v ≤ maxAmount.
func (n rowNamer) amount(field string, v float64, what string) error {
	if err := n.finite(field, v); err != nil {
		return err
	}
	if v < 0 {
		return n.value(field, v, copoly.ErrOutOfRange, "%s cannot be negative", what)
	}
	if v > maxAmount {
		return n.value(field, v, copoly.ErrOutOfRange, "%s above %g is not a bench value", what, maxAmount)
	}
	return nil
}

// count checks that v is a whole number from 1 to 1000.
func (n rowNamer) count(field string, v float64, what string) error {
	if err := n.finite(field, v); err != nil {
		return err
	}
	if v < 1 || v > 1000 || v != math.Trunc(v) {
		return n.value(field, v, copoly.ErrOutOfRange, "%s must be a whole number from 1 to 1000", what)
	}
	return nil
}

// molarMasses checks both molar masses, which the form named by why needs.
func (n rowNamer) molarMasses(molarMass1, molarMass2 float64, why string) error {
	for i, m := range [2]float64{molarMass1, molarMass2} {
		if math.IsNaN(m) || math.IsInf(m, 0) || m < 1 || m >= 1e6 {
			field := fmt.Sprintf("molarMass%d", i+1)
			sentinel := copoly.ErrOutOfRange
			if math.IsNaN(m) || math.IsInf(m, 0) {
				sentinel = copoly.ErrNotFinite
			}
			return &copoly.InputError{Field: field, Value: m, Reason: n.reason("%s needs the molar mass of M%d in g/mol (at least 1, below 10⁶)", why, i+1), Err: sentinel}
		}
	}
	return nil
}

// Convert validates the row and returns it as a [copoly.Run] of mole fractions and molar conversion,
// using the conversions [FeedFromMasses], [FeedFromMoles], [CompositionFromMassFraction],
// [CompositionFromNMR], [CompositionFromElement] and [MolarConversionFromMass]. The molar masses
// of M1 and M2 (g/mol) are needed only by the forms that weigh: feed as masses, composition as a
// mass fraction or by elemental analysis, and mass conversion; otherwise they may be 0.
//
// An invalid value gives an [*copoly.InputError] or [*copoly.FieldError] naming the field as in "f10",
// "mass1", "conversion", "integral2", "element" or "sF" (see [ConvertRuns] for the names with
// their row), or "molarMass1"/"molarMass2" when a form needs a molar mass that is missing. The
// checks are:
//   - fractions (f10, F1, massFraction1) between 0 and 1; masses, amounts and NMR integrals
//     ≥ 0 (at most 1e100) and not both 0; proton and element counts whole numbers from 1 to
//     1000; molar masses, where needed, at least 1 and below 10⁶ g/mol;
//   - a given conversion above 0 and at most 1, and a molar conversion computed from a mass
//     conversion at most 1;
//   - an element with a known atomic weight, carried by M1 or M2, not heavier in total than the
//     carrier monomer, and an element percentage no higher than in the carrier's homopolymer;
//   - uncertainties ≥ 0 and at most 1, and sX only with a conversion.
//
// Mass balance, duplicates and the number of feeds are data-level checks: see [copoly.CheckRuns].
func (in RunInput) Convert(molarMass1, molarMass2 float64) (copoly.Run, error) {
	return in.convert(-1, molarMass1, molarMass2)
}

func (in RunInput) convert(row int, molarMass1, molarMass2 float64) (copoly.Run, error) {
	n := newRowNamer(row, in.Label)
	var r copoly.Run
	if c := utf8.RuneCountInString(in.Label); c > MaxLabelLength {
		return copoly.Run{}, n.text("label", "the label has %d characters; the limit is %d", c, MaxLabelLength)
	}

	// Feed.
	switch in.FeedKind {
	case "", FeedFraction:
		if err := n.fraction("f10", in.F10, "the feed mole fraction f10"); err != nil {
			return copoly.Run{}, err
		}
		r.F10 = in.F10
	case FeedMass, FeedMoles:
		field, what := "mass", "a charged mass"
		a, b := in.Mass1, in.Mass2
		if in.FeedKind == FeedMoles {
			field, what = "moles", "a charged amount"
			a, b = in.Moles1, in.Moles2
		}
		if err := n.amount(field+"1", a, what); err != nil {
			return copoly.Run{}, err
		}
		if err := n.amount(field+"2", b, what); err != nil {
			return copoly.Run{}, err
		}
		if a == 0 && b == 0 {
			return copoly.Run{}, n.value(field+"1", a, copoly.ErrOutOfRange, "no monomer charged: M1 and M2 are both 0")
		}
		if in.FeedKind == FeedMass {
			if err := n.molarMasses(molarMass1, molarMass2, "a feed given as masses"); err != nil {
				return copoly.Run{}, err
			}
			r.F10 = FeedFromMasses(a, b, molarMass1, molarMass2)
		} else {
			r.F10 = FeedFromMoles(a, b)
		}
	default:
		return copoly.Run{}, n.text("feedKind", "%q is not a form of the feed; use %q, %q or %q", in.FeedKind, FeedFraction, FeedMass, FeedMoles)
	}

	// Copolymer composition.
	switch in.CompositionKind {
	case "", CompositionFraction:
		if err := n.fraction("F1", in.F1, "the copolymer mole fraction F1"); err != nil {
			return copoly.Run{}, err
		}
		r.F1 = in.F1
	case CompositionMassFraction:
		if err := n.fraction("massFraction1", in.MassFraction1, "the mass fraction of M1 in the copolymer"); err != nil {
			return copoly.Run{}, err
		}
		if err := n.molarMasses(molarMass1, molarMass2, "a composition given as a mass fraction"); err != nil {
			return copoly.Run{}, err
		}
		r.F1 = CompositionFromMassFraction(in.MassFraction1, molarMass1, molarMass2)
	case CompositionNMR:
		f, err := in.fromNMR(n)
		if err != nil {
			return copoly.Run{}, err
		}
		r.F1 = f
	case CompositionElement:
		f, err := in.fromElement(n, molarMass1, molarMass2)
		if err != nil {
			return copoly.Run{}, err
		}
		r.F1 = f
	default:
		return copoly.Run{}, n.text("compositionKind", "%q is not a form of the copolymer composition; use %q, %q, %q or %q",
			in.CompositionKind, CompositionFraction, CompositionMassFraction, CompositionNMR, CompositionElement)
	}
	r.F1 = clamp01(r.F1)

	// Conversion.
	switch in.ConversionKind {
	case "", ConversionNone:
	case ConversionMolar, ConversionMass:
		what := "the molar conversion X"
		if in.ConversionKind == ConversionMass {
			what = "the mass conversion w"
		}
		if err := n.fraction("conversion", in.Conversion, what); err != nil {
			return copoly.Run{}, err
		}
		if in.Conversion == 0 {
			return copoly.Run{}, n.value("conversion", 0, copoly.ErrOutOfRange, "%s is 0, which gives no polymer; choose %q for a low-conversion sample", what, ConversionNone)
		}
		r.Conversion = in.Conversion
		if in.ConversionKind == ConversionMass {
			if err := n.molarMasses(molarMass1, molarMass2, "a mass conversion"); err != nil {
				return copoly.Run{}, err
			}
			x := MolarConversionFromMass(in.Conversion, r.F10, r.F1, molarMass1, molarMass2)
			if x > 1+1e-12 {
				return copoly.Run{}, n.value("conversion", in.Conversion, copoly.ErrOutOfRange,
					"with f10 = %.4g and F1 = %.4g this mass conversion is a molar conversion of %.4g, more than all the monomer; check the conversion and the composition", r.F10, r.F1, x)
			}
			r.Conversion = math.Min(x, 1)
		}
	default:
		return copoly.Run{}, n.text("conversionKind", "%q is not a form of the conversion; use %q, %q or %q", in.ConversionKind, ConversionNone, ConversionMolar, ConversionMass)
	}

	// Standard uncertainties.
	for _, u := range []struct {
		field string
		v     float64
		dst   *float64
	}{{"sF", in.SF, &r.SF}, {"sX", in.SX, &r.SX}, {"sf", in.Sf, &r.Sf}} {
		if err := n.fraction(u.field, u.v, "a standard uncertainty (in mole fraction or molar conversion)"); err != nil {
			return copoly.Run{}, err
		}
		*u.dst = u.v
	}
	if r.SX > 0 && r.Conversion == 0 {
		return copoly.Run{}, n.value("sX", r.SX, copoly.ErrOutOfRange, "an uncertainty of the conversion is given, but no conversion")
	}
	return r, nil
}

func (in RunInput) fromNMR(n rowNamer) (float64, error) {
	if err := n.amount("integral1", in.Integral1, "an NMR integral"); err != nil {
		return 0, err
	}
	if err := n.count("protons1", in.Protons1, "the number of protons behind the M1 signal, per unit,"); err != nil {
		return 0, err
	}
	if err := n.amount("integral2", in.Integral2, "an NMR integral"); err != nil {
		return 0, err
	}
	if err := n.count("protons2", in.Protons2, "the number of protons behind the M2 signal, per unit,"); err != nil {
		return 0, err
	}
	if in.Integral1 == 0 && in.Integral2 == 0 {
		return 0, n.value("integral1", 0, copoly.ErrOutOfRange, "both NMR integrals are 0")
	}
	return CompositionFromNMR(in.Integral1, in.Protons1, in.Integral2, in.Protons2), nil
}

// elementSymbols lists the symbols of the elements copoly knows, sorted, for messages.
func elementSymbols() string { return strings.Join(copoly.Elements(), ", ") }

func (in RunInput) fromElement(n rowNamer, molarMass1, molarMass2 float64) (float64, error) {
	sym := strings.TrimSpace(in.Element)
	a, ok := copoly.AtomicWeight(sym)
	if !ok {
		if sym == "" {
			return 0, n.text("element", "no element given; use one of %s", elementSymbols())
		}
		return 0, n.text("element", "%q is not an element copoly knows the atomic weight of; use one of %s", sym, elementSymbols())
	}
	if in.Carrier != 1 && in.Carrier != 2 {
		return 0, n.value("carrier", float64(in.Carrier), copoly.ErrOutOfRange, "the monomer carrying %s must be 1 or 2", sym)
	}
	cnt := in.ElementCount
	if err := n.count("elementCount", cnt, fmt.Sprintf("the number of %s atoms in one unit of M%d", sym, in.Carrier)); err != nil {
		return 0, err
	}
	if err := n.finite("elementPercent", in.ElementPercent); err != nil {
		return 0, err
	}
	if in.ElementPercent < 0 || in.ElementPercent > 100 {
		return 0, n.value("elementPercent", in.ElementPercent, copoly.ErrOutOfRange, "a mass percentage must lie between 0 and 100")
	}
	if err := n.molarMasses(molarMass1, molarMass2, "a composition from elemental analysis"); err != nil {
		return 0, err
	}
	mc := molarMass1
	if in.Carrier == 2 {
		mc = molarMass2
	}
	e := cnt * a
	if e >= mc {
		return 0, n.value("elementCount", cnt, copoly.ErrOutOfRange, "%g %s atoms weigh %.4g g/mol, not less than the molar mass of M%d (%.4g g/mol)", cnt, sym, e, in.Carrier, mc)
	}
	if top := 100 * e / mc; in.ElementPercent > top*(1+1e-12) {
		return 0, n.value("elementPercent", in.ElementPercent, copoly.ErrOutOfRange,
			"%s = %.4g %% is more than the %.4g %% of the pure homopolymer of M%d; check the value, the element count and the carrier", sym, in.ElementPercent, top, in.Carrier)
	}
	return CompositionFromElement(in.ElementPercent, in.Carrier, e, molarMass1, molarMass2), nil
}

// clamp01 removes rounding excursions just outside [0, 1] from a converted fraction.
func clamp01(v float64) float64 {
	return math.Max(0, math.Min(1, v))
}

// ConvertRuns converts each row of a bench table with [RunInput.Convert]. It returns one Run per
// row (the zero Run where the row is invalid) and one error per row (nil where the row is
// valid), so that a bad cell never loses the rest of the table. The errors name their cell as
// the page does: "runs[3].f10", "runs[3].mass1", "runs[3].conversion", "runs[3].integral2",
// "runs[3].element" (the index counts from 0), and their message says "row 4" (counting from
// 1) and the row's label. A missing molar mass is named "molarMass1" or "molarMass2".
//
// More than [MaxRuns] rows give runs == nil and a single error naming "runs" and wrapping
// [copoly.ErrTooMany].
func ConvertRuns(in []RunInput, molarMass1, molarMass2 float64) ([]copoly.Run, []error) {
	if len(in) > MaxRuns {
		return nil, []error{&copoly.InputError{Field: "runs", Value: float64(len(in)), Reason: fmt.Sprintf("at most %d rows can be entered", MaxRuns), Err: copoly.ErrTooMany}}
	}
	runs := make([]copoly.Run, len(in))
	errs := make([]error, len(in))
	for i, r := range in {
		runs[i], errs[i] = r.convert(i, molarMass1, molarMass2)
	}
	return runs, errs
}
