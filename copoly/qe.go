package copoly

import (
	"fmt"
	"math"
)

// QE is a monomer's pair of Alfrey–Price parameters: Q, its resonance stabilisation, and e, its
// polarity, on the scale fixed by styrene (Q = 1.00, e = −0.80).
type QE struct {
	Q, E float64
	// Source is the per-value source text; SourceID names its entry in [Sources] ("" for values
	// derived by QEFromRatios).
	Source   string
	SourceID string
}

// RatiosFromQE returns the reactivity ratios the Alfrey–Price scheme predicts for a pair:
//
//	r1 = (Q1/Q2) exp[−e1 (e1 − e2)],  r2 = (Q2/Q1) exp[−e2 (e2 − e1)]
//
// The scheme ignores steric effects and uses one e for monomer and radical; its predictions are
// screening estimates, often off by a factor of two or more, never a substitute for measured
// ratios. Q must be positive and e finite.
//
// References:
//   - T. Alfrey, C. C. Price, J. Polym. Sci. 1947, 2, 101.
//   - IUPAC Gold Book, "Q-e scheme", Pure Appl. Chem. 2008, 80, 2163.
func RatiosFromQE(m1, m2 QE) (r1, r2 float64, err error) {
	for _, c := range []struct {
		name string
		v    QE
	}{{"monomer1", m1}, {"monomer2", m2}} {
		if err := checkFinite(c.name+".Q", c.v.Q); err != nil {
			return 0, 0, err
		}
		if c.v.Q <= 0 {
			return 0, 0, &InputError{Field: c.name + ".Q", Value: c.v.Q, Reason: "Q must be positive", Err: ErrOutOfRange}
		}
		if err := checkFinite(c.name+".e", c.v.E); err != nil {
			return 0, 0, err
		}
	}
	r1 = m1.Q / m2.Q * math.Exp(-m1.E*(m1.E-m2.E))
	r2 = m2.Q / m1.Q * math.Exp(-m2.E*(m2.E-m1.E))
	return r1, r2, nil
}

// QEFromRatios returns the Q and e of a monomer M2 from its ratios measured against M1 of known
// Q and e (the inverse of [RatiosFromQE]):
//
//	e2 = e1 ± √(−ln(r1 r2)),  Q2 = (Q1/r1) exp[−e1 (e1 − e2)]
//
// acceptor selects the sign: true for "+" (a comonomer more electron-poor than M1, such as an
// acrylate or acrylonitrile with styrene), false for "−". It fails when r1·r2 ≥ 1, where the
// scheme has no solution, or when r1 = 0.
func QEFromRatios(m1 QE, r1, r2 float64, acceptor bool) (QE, error) {
	if err := (Terminal{r1, r2}).Validate(); err != nil {
		return QE{}, err
	}
	if r1 == 0 || r1*r2 >= 1 {
		return QE{}, &InputError{Field: "r1", Value: r1, Reason: fmt.Sprintf("the Q–e scheme needs 0 < r1·r2 < 1 (here %.3g)", r1*r2), Err: ErrOutOfRange}
	}
	d := math.Sqrt(-math.Log(r1 * r2))
	e2 := m1.E - d
	if acceptor {
		e2 = m1.E + d
	}
	return QE{Q: m1.Q / r1 * math.Exp(-m1.E*(m1.E-e2)), E: e2, Source: "derived from r1, r2 by the inverse Q–e relations"}, nil
}

// builtinQE holds Q–e values of the built-in monomers. Styrene is the reference of the scale
// (SrcQEReference); the others are recalled values (SrcQERecalled). n-Butyl methacrylate,
// 2-hydroxyethyl acrylate, 2-hydroxypropyl methacrylate and 2-ethylhexyl acrylate have none: no
// value was recalled with enough confidence, and none was found in a source that could be read.
var builtinQE = map[string]QE{
	"styrene":                     {1.00, -0.80, cite(SrcQEReference, "Q = 1, e = −0.8 by definition"), SrcQEReference},
	"methyl methacrylate":         qeRecalled(0.78, 0.40, ""),
	"methyl acrylate":             qeRecalled(0.45, 0.64, ""),
	"ethyl acrylate":              qeRecalled(0.41, 0.55, ""),
	"n-butyl acrylate":            qeRecalled(0.38, 0.85, ""),
	"acrylonitrile":               qeRecalled(0.48, 1.23, ""),
	"vinyl acetate":               qeRecalled(0.026, -0.88, "older tables give e ≈ −0.22"),
	"vinyl chloride":              qeRecalled(0.056, 0.16, ""),
	"1,3-butadiene":               qeRecalled(1.70, -0.50, ""),
	"acrylic acid":                qeRecalled(0.83, 0.88, ""),
	"methacrylic acid":            qeRecalled(0.98, 0.62, ""),
	"maleic anhydride":            qeRecalled(0.86, 3.69, ""),
	"N-vinylpyrrolidone":          qeRecalled(0.088, -1.62, ""),
	"2-hydroxyethyl methacrylate": qeRecalled(0.9, 0.4, "values scatter widely"),
	"acrylamide":                  qeRecalled(0.23, 0.54, "strongly solvent- and pH-dependent"),
}

// qeRecalled is a built-in Q–e pair recalled from the Greenley compilation (SrcQERecalled).
func qeRecalled(q, e float64, detail string) QE {
	return QE{Q: q, E: e, Source: cite(SrcQERecalled, detail), SourceID: SrcQERecalled}
}

// QEOf returns the built-in Q–e values of a monomer of the built-in list, and whether there are
// any.
func QEOf(name string) (QE, bool) {
	q, ok := builtinQE[name]
	return q, ok
}
