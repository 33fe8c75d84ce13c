package copoly

import (
	"fmt"
	"math"
)

// Terminal is the terminal model of binary radical copolymerization: the rate at which a chain
// adds a monomer depends only on the monomer unit at its radical end. Its parameters are the
// reactivity ratios
//
//	r1 = k11/k12,  r2 = k22/k21
//
// where kij is the rate coefficient of a chain ending in Mi adding Mj. Both are dimensionless and
// must be finite and ≥ 0; [Terminal.Validate] checks this.
//
// References:
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594.
//   - T. Alfrey, G. Goldfinger, J. Chem. Phys. 1944, 12, 205.
type Terminal struct {
	R1, R2 float64
}

// Validate returns an [*InputError] naming "r1" or "r2" when a ratio is negative, not finite or
// above [MaxRatio].
func (m Terminal) Validate() error {
	if m.R1 >= 0 && m.R2 >= 0 && max(m.R1, m.R2) <= MaxRatio { // false for NaN
		return nil
	}
	return m.invalid()
}

// invalid is the error of Validate, naming the first bad ratio.
func (m Terminal) invalid() error {
	if err := checkRatioError("r1", m.R1); err != nil {
		return err
	}
	return checkRatioError("r2", m.R2)
}

// Instantaneous returns the mole fraction F1 of M1 units in the copolymer formed from a monomer
// mixture with mole fraction f1 of M1 (the Mayo–Lewis equation in mole-fraction form):
//
//	F1 = (r1 f1² + f1 f2) / (r1 f1² + 2 f1 f2 + r2 f2²),  f2 = 1 − f1
//
// At f1 = 0 and f1 = 1 the value is the limit from inside the interval: 0 and 1, except that
// F1(0) = ½ when r2 = 0 and F1(1) = ½ when r1 = 0 (a monomer that cannot add to its own radical
// alternates). F1 is continuous and non-decreasing in f1. The result for f1 outside [0, 1] is
// meaningless; [Terminal.InstantaneousTo] validates.
//
// References:
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594.
//   - IUPAC Gold Book, "copolymerisation composition equation", Pure Appl. Chem. 2008, 80, 2163.
func (m Terminal) Instantaneous(f1 float64) float64 {
	f2 := 1 - f1
	num := m.R1*f1*f1 + f1*f2
	den := num + f1*f2 + m.R2*f2*f2
	if den == 0 {
		// f1 = 0 with r2 = 0, or f1 = 1 with r1 = 0: the one-sided limit is ½.
		return 0.5
	}
	return num / den
}

// InstantaneousTo writes F1 for each feed in f1 into dst and returns it. dst is grown when it is
// too short; it may be nil. An invalid ratio or feed gives an [*InputError] naming "r1", "r2" or
// "f1[i]".
func (m Terminal) InstantaneousTo(dst, f1 []float64) ([]float64, error) {
	if err := m.Validate(); err != nil {
		return nil, err
	}
	if len(f1) > MaxPoints {
		return nil, &InputError{Field: "f1", Value: float64(len(f1)), Reason: fmt.Sprintf("at most %d feeds per call", MaxPoints), Err: ErrTooMany}
	}
	for i, v := range f1 {
		if !(v >= 0 && v <= 1) { // also catches NaN; the field name is built only on error
			return nil, CheckFraction(fmt.Sprintf("f1[%d]", i), v)
		}
	}
	if cap(dst) < len(f1) {
		dst = make([]float64, len(f1))
	}
	dst = dst[:len(f1)]
	for i, v := range f1 {
		dst[i] = m.Instantaneous(v)
	}
	return dst, nil
}

// Azeotrope returns the feed composition at which the copolymer has the composition of the feed
// (F1 = f1), and whether it lies strictly inside (0, 1):
//
//	f1,az = (1 − r2) / (2 − r1 − r2)
//
// It exists only when r1 < 1 and r2 < 1, or r1 > 1 and r2 > 1. When r1 = r2 = 1 every feed is
// azeotropic and ok is false.
//
// References:
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594.
func (m Terminal) Azeotrope() (f1 float64, ok bool) {
	if (m.R1 < 1 && m.R2 < 1) || (m.R1 > 1 && m.R2 > 1) {
		return (1 - m.R2) / (2 - m.R1 - m.R2), true
	}
	return math.NaN(), false
}

// Kinds of copolymerization returned in [Classification.Kind] (bands of r1·r2, see
// [Terminal.Classify]).
const (
	KindIdeal               = "ideal"                // close to ideal (random)
	KindAlternating         = "alternating"          // between ideal and alternating
	KindStronglyAlternating = "strongly-alternating" // close to alternating
	KindBlock               = "block"                // a tendency to blocks
	KindHomopolymerMixture  = "homopolymer-mixture"  // nearly a mixture of homopolymers
)

// Classification describes a pair of reactivity ratios in words.
type Classification struct {
	// Kind is one of the Kind constants.
	Kind string
	// Product is r1·r2, the usual index of the monomer sequence: 1 ideal (random), towards 0
	// alternating, above 1 blocky.
	Product float64
	// Text states the kind with the numbers behind it.
	Text string
}

// Edges of the bands of r1·r2 used by [Terminal.Classify]. The sources name the limiting cases
// and the direction (see Classify) but give no numbers between them; these edges are copoly's
// choice (common practice, no source), stated through the mean run length of a 50:50
// copolymer, 1 + √(r1·r2) units against 2 in a random chain and 1 in strict alternation.
const (
	// strongAlternation: runs of less than 1.32 units at 50:50.
	strongAlternation = 0.1
	// idealLow and idealHigh: runs within 10 % of the random chain's 2 units at 50:50
	// (1.8 to 2.2 units).
	idealLow  = 0.64
	idealHigh = 1.44
	// homopolymerProduct: runs of more than 11 units at 50:50.
	homopolymerProduct = 100
)

// Classify describes the pair from r1, r2 and r1·r2: how the monomers are arranged along the
// chain, which monomer enters the chain faster, and the azeotrope when there is one.
//
// The arrangement follows the product r1·r2, in the bands and words of the sources: r1·r2 = 1
// is ideal copolymerization, the monomers entering independently of the chain end (a random,
// Bernoullian chain); r1·r2 between 0 and 1 lies between ideal and alternating copolymerization,
// the tendency to alternate growing as r1·r2 falls towards 0 (strict alternation at
// r1 = r2 = 0); r1·r2 above 1 (both ratios above 1 in the usual case) gives a tendency to form
// blocks, and a very large product nearly a mixture of the two homopolymers. The product has
// an exact meaning in the terminal model: with the mean run lengths n̄1 = 1 + r1 x and
// n̄2 = 1 + r2/x of [Sequence] (x = f1/f2),
//
//	(n̄1 − 1)(n̄2 − 1) = r1·r2   at every feed,
//
// and a random chain of the same composition has (n̄1 − 1)(n̄2 − 1) = 1, so r1·r2 < 1 means
// runs shorter than random and r1·r2 > 1 longer; at the feed giving a 50:50 copolymer both mean
// runs are 1 + √(r1·r2). Classify bands the product as
//
//	r1·r2 < 0.1            close to alternating     [KindStronglyAlternating]
//	0.1 ≤ r1·r2 < 0.64     between ideal and alternating, a tendency to alternate [KindAlternating]
//	0.64 ≤ r1·r2 ≤ 1.44    close to ideal (random); exactly ideal at 1 [KindIdeal]
//	1.44 < r1·r2 ≤ 100     a tendency to form blocks [KindBlock]
//	r1·r2 > 100            nearly a mixture of homopolymers [KindHomopolymerMixture]
//
// with the edges explained at the constants above (copoly's choice).
//
// References:
//   - IUPAC, Glossary of terms related to kinetics, thermodynamics, and mechanisms of
//     polymerization, Pure Appl. Chem. 2008, 80, 2163, p. 2176 ("ideal binary
//     copolymerization": r12 r21 = 1, incorporation independent of the chain end).
//   - G. Odian, Principles of Polymerization, 4th ed., Wiley 2004, Sec. 6-2b (ideal,
//     alternating and block copolymerization; most pairs lie between ideal and alternating,
//     the tendency to alternate increasing as r1 r2 decreases towards 0) (from memory).
//   - J. L. Koenig, Chemical Microstructure of Polymer Chains, Wiley 1980 (run lengths of the
//     first-order Markov chain; the identity above is derived from them).
func (m Terminal) Classify() Classification {
	p := m.R1 * m.R2
	c := Classification{Product: p}
	var kind string
	switch {
	case m.R1 == 0 && m.R2 == 0:
		c.Kind, kind = KindStronglyAlternating, "alternating copolymerization (r1 = r2 = 0): the units alternate strictly"
	case p < strongAlternation:
		c.Kind, kind = KindStronglyAlternating, "close to alternating copolymerization: a strong tendency to alternate"
	case p < idealLow:
		c.Kind, kind = KindAlternating, "between ideal and alternating copolymerization, with a tendency to alternate"
	case math.Abs(p-1) <= 1e-12: // r1 = 1/r2 up to rounding
		c.Kind, kind = KindIdeal, "ideal copolymerization: the monomers enter independently of the chain end, as in a random (Bernoullian) chain"
	case p < 1:
		c.Kind, kind = KindIdeal, "close to ideal (random) copolymerization, leaning slightly towards alternation"
	case p <= idealHigh:
		c.Kind, kind = KindIdeal, "close to ideal (random) copolymerization, leaning slightly towards blocks"
	case p <= homopolymerProduct:
		c.Kind, kind = KindBlock, "a tendency to form blocks: runs longer than in a random chain"
	default:
		c.Kind, kind = KindHomopolymerMixture, "so blocky that the product is nearly a mixture of the two homopolymers"
	}
	text := fmt.Sprintf("r1·r2 = %.3g: %s.", p, kind)
	if p > 0 { // with a ratio of 0, a 50:50 copolymer is only approached as a limit
		text += fmt.Sprintf(" At the feed giving a 50:50 copolymer the mean run of each monomer is %.3g units, against 2 in a random chain and 1 in strict alternation.", 1+math.Sqrt(p))
	}
	switch {
	case m.R1 > 1 && m.R2 < 1:
		text += fmt.Sprintf(" M1 enters the chain faster than M2 at every feed (r1 = %.3g > 1 > r2 = %.3g), so the copolymer is richer in M1 than the feed and the feed drifts towards M2 in a batch.", m.R1, m.R2)
	case m.R1 < 1 && m.R2 > 1:
		text += fmt.Sprintf(" M2 enters the chain faster than M1 at every feed (r2 = %.3g > 1 > r1 = %.3g), so the copolymer is richer in M2 than the feed and the feed drifts towards M1 in a batch.", m.R2, m.R1)
	case m.R1 == 1 && m.R2 == 1:
		text += " Both monomers enter in proportion to the feed: no drift."
	}
	if az, ok := m.Azeotrope(); ok {
		text += fmt.Sprintf(" Azeotrope at f1 = %.3f: that feed gives copolymer of its own composition and does not drift.", az)
		if m.R1 < 1 {
			text += " Other feeds drift away from it."
		} else {
			text += " Other feeds drift towards it."
		}
	}
	c.Text = text
	return c
}

// FeedSolution is the answer of [Terminal.FeedFor].
type FeedSolution struct {
	// Feeds holds the feeds f1 that give the target; empty when none does, nil-free otherwise.
	Feeds []float64
	// Note says why there are zero, one or several feeds.
	Note string
	// Min and Max bound the copolymer compositions the pair can give: F1(0) and F1(1).
	Min, Max float64
}

// FeedFor returns the monomer feed f1 that gives copolymer of mole fraction targetF1 at low
// conversion: the root in x = f1/f2 of the Mayo–Lewis equation rearranged with n = F1/(1 − F1),
//
//	r1 x² + (1 − n) x − n r2 = 0
//
// Since F1(f1) is non-decreasing (dF1/dx ∝ r1 x² + 2 r1 r2 x + r2 ≥ 0), at most one feed qualifies
// except when r1 = r2 = 0: then every feed gives F1 = ½ and the solution says so. A target outside
// [F1(0), F1(1)] gives an error wrapping [ErrUnreachable] that states the reachable range.
//
// References:
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594 (the composition equation).
func (m Terminal) FeedFor(targetF1 float64) (FeedSolution, error) {
	if err := m.Validate(); err != nil {
		return FeedSolution{}, err
	}
	if err := CheckFraction("targetF1", targetF1); err != nil {
		return FeedSolution{}, err
	}
	s := FeedSolution{Min: m.Instantaneous(0), Max: m.Instantaneous(1)}
	if m.R1 == 0 && m.R2 == 0 {
		if targetF1 != 0.5 {
			return s, &InputError{Field: "targetF1", Value: targetF1, Reason: "with r1 = r2 = 0 the copolymer alternates strictly: every feed gives F1 = 0.5", Err: ErrUnreachable}
		}
		s.Feeds = []float64{0.5}
		s.Note = "With r1 = r2 = 0 every feed gives F1 = 0.5 (strict alternation); 0.5 is shown as one choice."
		return s, nil
	}
	if targetF1 < s.Min || targetF1 > s.Max {
		return s, &InputError{Field: "targetF1", Value: targetF1, Reason: fmt.Sprintf("this pair can only make copolymer with F1 between %.4g and %.4g", s.Min, s.Max), Err: ErrUnreachable}
	}
	var f1 float64
	switch {
	case targetF1 == s.Min:
		f1 = 0
	case targetF1 == s.Max:
		f1 = 1
	default:
		n := targetF1 / (1 - targetF1)
		x := positiveRoot(m.R1, 1-n, -n*m.R2)
		f1 = x / (1 + x)
	}
	s.Feeds = []float64{f1}
	s.Note = "One feed gives this composition: the copolymer composition rises steadily with the feed."
	if az, ok := m.Azeotrope(); ok && math.Abs(az-f1) < 1e-9 {
		s.Note += " It is the azeotrope, so a batch does not drift."
	}
	return s, nil
}

// positiveRoot returns the non-negative root of a x² + b x + c = 0 with a ≥ 0 and c ≤ 0, computed
// without cancellation.
func positiveRoot(a, b, c float64) float64 {
	if a == 0 {
		return -c / b
	}
	d := math.Sqrt(b*b - 4*a*c)
	if b >= 0 {
		// Stable form: x = −2c / (b + √d).
		if b+d == 0 {
			return 0
		}
		return -2 * c / (b + d)
	}
	return (-b + d) / (2 * a)
}
