package molarmass

import "copoly/copoly"

// ChainSize relates the molar-mass averages of a copolymer to its units.
type ChainSize struct {
	// UnitMass is the mean molar mass of a repeat unit, M̄0 = F̄1 M1 + (1 − F̄1) M2 (g/mol).
	UnitMass float64
	// DPn and DPw are the number- and weight-average degrees of polymerization Mn/M̄0, Mw/M̄0;
	// Units1 and Units2 the mean numbers of M1 and M2 units per chain, F̄1·DPn and F̄2·DPn.
	DPn, DPw, Units1, Units2 float64
}

// SizeOf returns the degrees of polymerization of a copolymer of cumulative composition F1 with
// the averages a, from the repeat-unit molar masses of the monomers (the monomer molar masses
// for addition polymers; end groups neglected).
func SizeOf(a Averages, F1, molarMass1, molarMass2 float64) (ChainSize, error) {
	if err := copoly.CheckFraction("F1", F1); err != nil {
		return ChainSize{}, err
	}
	if err := copoly.CheckMolarMass("molarMass1", molarMass1); err != nil {
		return ChainSize{}, err
	}
	if err := copoly.CheckMolarMass("molarMass2", molarMass2); err != nil {
		return ChainSize{}, err
	}
	c := ChainSize{UnitMass: F1*molarMass1 + (1-F1)*molarMass2}
	c.DPn, c.DPw = a.Mn/c.UnitMass, a.Mw/c.UnitMass
	c.Units1, c.Units2 = F1*c.DPn, (1-F1)*c.DPn
	return c, nil
}
