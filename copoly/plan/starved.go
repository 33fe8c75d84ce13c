package plan

import (
	"copoly/copoly"
)

// StarvedFeed returns the unreacted monomer inventory (g) that a starved feed implies: a mixture
// at the copolymer composition targetF1 metered at feedRate g/min into a reactor polymerizing
// with apparent first-order rate constant k (1/min). At the quasi-steady state the rate of
// polymerization k·N equals the molar feed rate, so N = feed/k, at the composition f1* that
// gives targetF1 (see [copoly.Terminal.FeedFor]); the inventory is N times the mean molar mass at f1*.
// It also returns f1*.
//
// References:
//   - J. M. Asua, ed., Polymer Reaction Engineering, Blackwell 2007 (monomer-starved semi-batch
//     operation; from memory).
func StarvedFeed(m copoly.Terminal, targetF1, feedRate, k, molarMass1, molarMass2 float64) (inventory, fstar float64, err error) {
	sol, err := m.FeedFor(targetF1)
	if err != nil {
		return 0, 0, err
	}
	for _, c := range []struct {
		field string
		v     float64
	}{{"feedRate", feedRate}, {"rateConstant", k}} {
		if err := copoly.CheckFinite(c.field, c.v); err != nil {
			return 0, 0, err
		}
		if c.v <= 0 {
			return 0, 0, &copoly.InputError{Field: c.field, Value: c.v, Reason: "must be positive", Err: copoly.ErrOutOfRange}
		}
	}
	if err := copoly.CheckMolarMass("molarMass1", molarMass1); err != nil {
		return 0, 0, err
	}
	if err := copoly.CheckMolarMass("molarMass2", molarMass2); err != nil {
		return 0, 0, err
	}
	fstar = sol.Feeds[0]
	molFeed := feedRate / (targetF1*molarMass1 + (1-targetF1)*molarMass2)
	n := molFeed / k
	return n * (fstar*molarMass1 + (1-fstar)*molarMass2), fstar, nil
}
