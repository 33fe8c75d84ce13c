// Package resin computes the properties resin chemists design a copolymer by, from its
// composition: the glass transition temperature by the Fox equation (for one composition, along
// a batch, and as a distribution over the polymer a batch makes), and the hydroxyl value, acid
// value and equivalent weight per functional group.
//
// Compositions are mass fractions w of the monomer units in the polymer unless a function says
// otherwise ([MassFractions] converts mole fractions); temperatures are in kelvin; molar masses
// in g/mol. Inputs are validated and errors are *copoly.InputError values naming the field as
// the JavaScript API does ("w[1]", "tg[0]", "molarMass[2]", "groups[1]"), wrapping copoly's
// sentinel errors.
package resin
