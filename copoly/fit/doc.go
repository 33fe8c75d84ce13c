// Package fit estimates the reactivity ratios r1 and r2 of the terminal model from bench runs
// ([copoly.Run]) and judges the estimate.
//
// [Estimate] runs every method at once: the linearised historical methods ([FinemanRoss],
// [InvertedFinemanRoss], [KelenTudos], [ExtendedKelenTudos]) and the Mayo–Lewis intersection
// ([MayoLewisIntersection]) for comparison; nonlinear least squares on the integrated model
// with its joint confidence region ([LeastSquares]), the recommended estimate; and
// error-in-variables ([ErrorsInVariables]) when every run states its uncertainties. It warns
// about data the methods cannot use and about trends in the residuals.
//
// [NextRuns] suggests where to run next to shrink the confidence region the most, and
// [Discriminate] compares the terminal and the explicit penultimate model on measured triad
// fractions (an F-test and AICc).
//
// The distribution functions the estimators need (F, χ², Student's t) are written on gonum's
// special functions rather than taken from gonum/stat/distuv, whose linear algebra would enlarge
// the WebAssembly module for nothing.
package fit
