// Package copoly holds the models of binary radical copolymerization and what follows from a
// model alone: the copolymer composition a feed makes, how a batch drifts with conversion, and
// the sequence of units along the chain. It is the core of the copoly page's science; the page
// reaches it through the thin bridge in wasm/, and lab scripts can call it directly from Go.
//
// # Conventions
//
// Monomer 1 is M1 and monomer 2 is M2. In the terminal model ([Terminal]) the reactivity ratios
// are r1 = k11/k12 and r2 = k22/k21. Mole fractions of M1: f1 in the unreacted monomer mixture
// (the feed), F1 in the copolymer being formed (instantaneous), F̄1 in all the copolymer made so
// far (cumulative). X is the overall molar conversion of monomer, from 0 to 1.
//
// # What it computes
//
//   - The models: [Terminal], the explicit [Penultimate] and the [Implicit] penultimate model,
//     each a [Model].
//   - Instantaneous composition F1(f1) by the Mayo–Lewis equation: [Terminal.Instantaneous],
//     the azeotrope [Terminal.Azeotrope], the feed for a target copolymer [Terminal.FeedFor] and
//     a classification in words [Terminal.Classify].
//   - Batch drift f1(X), F1(X), F̄1(X) of any model: a [Batch] from [NewBatch], by the
//     Meyer–Lowry closed form where it is well conditioned and the Skeist equation integrated
//     numerically elsewhere ([Terminal.Drift] is the shorthand for the terminal model); the
//     conversion limit for a composition tolerance, the composition distribution of the product,
//     mass and molar conversion ([MassConversion]), and the cumulative composition the
//     estimators fit ([Terminal.Cumulative]).
//   - Sequences of the chain as a Markov chain: [Terminal.Sequence] (dyads, triads, run lengths,
//     run number, randomness), run-length distributions [Terminal.RunLengths], seeded sample
//     chains [Terminal.Chains], Monte Carlo chains of any model ([SimulateChains]) and
//     Stockmayer's chain-to-chain composition distribution ([Terminal.Stockmayer]). The Monte
//     Carlo chains live here, beside the sequences, because they are the same concept: the
//     chain the model's Markov chain grows, drawn rather than averaged.
//   - A bench run reduced to what the estimators use ([Run]) and the checks of a set of runs
//     ([CheckRuns]): the one type the bench-data reader makes and the estimators take, so that
//     neither of those packages imports the other.
//   - A built-in list of common monomers with their process data, and literature reactivity
//     ratios, each value with its source: [Monomers], [PropertiesOf], [QEOf], [Pairs],
//     [MolarMassOf], and the table of sources they cite, [Sources]; Q–e screening estimates ([RatiosFromQE]).
//
// Every [Model] gives its composition ([Model.Instantaneous]) and its sequence statistics
// ([Model.Sequence]), so that a caller needs no type switch.
//
// # One call per panel
//
// Each view of the page is one call, so that the bridge in wasm/ only converts: the
// composition curve ([CompositionOf]), a batch followed to a list of conversions with its
// conversion limit and composition distribution ([ProfileOf]), the sequences at a feed and over a
// batch ([MicrostructureOf]), simulated chains with their histogram and Stockmayer's
// distribution ([SimulateChains]), the built-in list ([Library]) and a Q–e estimate
// ([QEPairOf]). The other packages do the same for their panels.
//
// # Packages
//
// Each concept beyond the models has its own package, which imports this one and
// copoly/internal/... only:
//
//   - copoly/bench: bench data as typed (masses, NMR integrals, elemental analysis, mass
//     conversion) converted to runs, the bench table and its paste/CSV reader, numbers as typed;
//   - copoly/fit: reactivity ratios from runs (linear methods, nonlinear least squares,
//     error-in-variables, the joint confidence region), where to run next, and the comparison
//     of the terminal and the penultimate model on triads;
//   - copoly/plan: feed plans (batch, semi-batch, shots) with their safety figures, their band
//     over the confidence region of the ratios, and the inventory of a starved feed;
//   - copoly/multi: the terminal model of 2 to 6 monomers (composition, drift, the feed for a
//     target, azeotropes, sequences, simulated chains, the ratio matrix and each cell's origin);
//   - copoly/resin: the properties resin chemists design by (Fox glass transition, hydroxyl and
//     acid values, equivalent weight);
//   - copoly/molarmass: molar-mass averages of a distribution and the chain size they imply,
//     a concept of their own (a measured molar-mass distribution, not a model's composition);
//   - copoly/project: the project file, its schema, validation and storage.
//
// # Errors
//
// Inputs come from a web form, so invalid values are reported as errors, never panics: an
// [*InputError] names the field as the page names it ("r1", "f1[3]", "conversion[0]") and wraps
// one of [ErrNotFinite], [ErrOutOfRange], [ErrTooMany] or [ErrUnreachable]. [Field] extracts the
// field name.
//
//	d, err := copoly.Terminal{R1: 0.40, R2: 0.04}.Drift(0.3, []float64{0.1, 0.5, 0.9})
//	if err != nil {
//		fmt.Println(copoly.Field(err), err)
//	}
package copoly
