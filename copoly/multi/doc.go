// Package multi is the terminal model of radical copolymerization for N = 2…6 monomers: the
// composition of the copolymer formed from a feed, the drift of a batch, the feed that makes a
// wanted copolymer, azeotropes, sequences and simulated chains.
//
// # The model
//
// A radical ending in a unit of monomer i adds monomer j with the rate coefficient k_ij. The
// model is given by the reactivity ratios
//
//	r_ij = k_ii / k_ij   (i ≠ j),   r_ii = 1
//
// an N×N matrix r whose row i belongs to the radical ending in monomer i. A binary pair (i, j)
// gives the two cells r_ij and r_ji; the terminal model has no ratios beyond the pairs. Monomers
// are numbered 0…N−1 in every slice and error field ("r[1][2]", "f0[3]"); texts call monomer i
// "M(i+1)", so that r[0][1] is the r12 of M1 and M2.
//
// [New] validates r (and the optional cross ratios of a monomer that does not add to its own
// radical, see [New]) into a [Model]. Its methods:
//
//   - [Model.Composition], [Model.CompositionsTo]: the instantaneous copolymer composition, the
//     stationary distribution of the chain's transition matrix (Walling and Briggs).
//   - [Model.Drift], [Model.ConversionLimit], [Model.CompositionDistribution]: a batch (Skeist's
//     balance for N monomers), with the exhaustion of any monomer.
//   - [Model.FeedFor], [Model.Azeotropes]: the inverse problem and the feeds that do not drift.
//   - [Model.Sequence]: dyads, run lengths, isolated units.
//   - [Model.SimulateChains]: Monte Carlo chains at the drifting feed, functional groups per
//     chain.
//
// [Assemble] builds r from the monomers' names and the pairs at hand (typed, fitted, built-in
// literature pairs, Q–e screening estimates), recording the origin of every cell.
//
// # For the JavaScript bridge
//
// Each export is one call: [Compositions] for multiComposition({r, f}), [BatchDrift] for
// multiDrift({r, f0, conversion}), [FeedFor] for multiFeedFor({r, targetF}), [SimulateChains]
// for multiChains({r, f0, conversion, dpn, count, seed, functional}), [Assemble] for the
// matrix. Invalid input gives a [copoly.InputError] or [copoly.FieldError] whose Field is the
// JavaScript path of the bad value ("r[1][2]", "f[4][0]", "targetF[2]", "functional[1]"),
// wrapping one of copoly's sentinel errors; no input makes the package panic.
//
//	m, err := multi.New([][]float64{
//		{1, 0.52, 0.40},
//		{0.46, 1, 1.32},
//		{0.04, 0.14, 1},
//	}, nil)
//	F, err := m.Composition(nil, []float64{0.3, 0.3, 0.4})
//
// References:
//   - T. Alfrey, G. Goldfinger, J. Chem. Phys. 1944, 12, 322 (three and more components).
//   - C. Walling, E. R. Briggs, J. Am. Chem. Soc. 1945, 67, 1774 (systems of more than two
//     monomers).
//   - I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781 (the batch balance).
package multi
