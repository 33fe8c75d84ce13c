// Package molarmass computes the molar-mass averages of a polymer from its measured molar-mass
// distribution, given as classes ([BinAverages]) or as the slices of a size-exclusion
// chromatogram ([SliceAverages]), and the degrees of polymerization they imply for a copolymer
// of known composition ([SizeOf]).
//
// It is a package of its own because it is a concept of its own: a distribution measured on the
// product, not one the copolymerization model predicts.
package molarmass
