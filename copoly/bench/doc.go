// Package bench reads bench data as the chemist types it and turns it into runs for the
// estimators of copoly/fit.
//
// A bench copolymerization is one row: the feed (a mole fraction, or the charged masses or
// amounts), the conversion (none, molar, or gravimetric by mass) and the copolymer composition
// (a mole or mass fraction, ¹H NMR integrals, or an element's mass percentage from elemental
// analysis). [RunInput.Convert] and [ConvertRuns] convert rows to [copoly.Run] values of mole
// fractions and molar conversion with the conversions [FeedFromMasses], [FeedFromMoles],
// [CompositionFromMassFraction], [CompositionFromNMR], [CompositionFromElement] and
// [MolarConversionFromMass], each with its equation and source.
//
// The page keeps the grid as text ([Table]: one entry form, the text of every cell) so that
// nothing typed is lost; [Table.Runs] converts it, naming a bad cell "runs[3].f10", and
// [Table.Paste] appends a block pasted from a spreadsheet or read from CSV ([ParseBlock],
// [WriteBlock]). Numbers are read as people type them ([ParseNumber]: a decimal comma, a
// Unicode minus, "35 %").
//
// Errors are [*copoly.InputError] or [*copoly.FieldError] values naming the cell; the checks of a
// whole data set (mass balance, duplicates, too few feeds) are [copoly.CheckRuns].
package bench
