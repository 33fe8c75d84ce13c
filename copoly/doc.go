// Package copoly computes copolymer composition, composition drift and monomer sequences for
// binary radical copolymerization. It is the science behind the copoly page; the page reaches it
// through the thin bridge in wasm/, and lab scripts can call it directly from Go.
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
//   - Instantaneous composition F1(f1) by the Mayo–Lewis equation: [Terminal.Instantaneous],
//     the azeotrope [Terminal.Azeotrope], the feed for a target copolymer [Terminal.FeedFor] and
//     a classification in words [Terminal.Classify].
//   - Batch drift f1(X), F1(X), F̄1(X): [Terminal.Drift], by the Meyer–Lowry closed form where it
//     is well conditioned and the Skeist equation integrated numerically elsewhere; the
//     conversion limit for a composition tolerance [Terminal.ConversionLimit]; the composition
//     distribution of the product [Terminal.CompositionDistribution]; mass and molar
//     conversion [MassConversion], [Terminal.MolarConversion].
//   - Sequences of the chain as a first-order Markov chain: [Terminal.Sequence] (dyads, triads,
//     run lengths, run number, randomness), averaged over a batch [Terminal.BatchSequence],
//     run-length distributions [Terminal.RunLengths] and seeded sample chains [Terminal.Chains].
//   - Bench data in the forms measured, converted and checked: [RunInput], [ConvertRuns],
//     [BenchTable], [ParseTable], [CheckRuns].
//   - Reactivity ratios from the data: every method at once with [Estimate] — the linear ones
//     ([FinemanRoss], [InvertedFinemanRoss], [KelenTudos], [ExtendedKelenTudos],
//     [MayoLewisIntersection]) for comparison, nonlinear least squares on the integrated model
//     with its joint confidence region ([FitNonlinear]) and error-in-variables ([FitEVM]); where
//     to run next ([NextRuns]); a Q–e screening estimate ([RatiosFromQE]).
//   - Feed plans: [MakePlan] (batch, semi-batch at constant composition, shots, with time, pump
//     rates and safety figures), their spread over the confidence region ([PlanBand]) and the
//     inventory of a starved feed ([Terminal.StarvedFeed]).
//   - Beyond the terminal model: [Penultimate] and [Implicit] for composition, drift
//     ([DriftOf]) and sequences; [Discriminate] between the models on measured triads;
//     Monte Carlo chains ([SimulateChains]) against Stockmayer's distribution
//     ([Terminal.Stockmayer]); molar-mass averages and chain size ([BinAverages],
//     [SliceAverages], [SizeOf]).
//   - A built-in list of common monomers with their process data, and literature reactivity
//     ratios, each value with its source: [Monomers], [PropertiesOf], [QEOf], [Pairs], and the
//     table of sources they cite, [Sources].
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
