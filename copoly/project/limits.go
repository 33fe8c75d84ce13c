package project

import (
	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/fit"
	"copoly/copoly/molarmass"
	"copoly/copoly/plan"
)

// MaxSeed is the largest seed of the chains and the band the JavaScript API takes: the largest
// whole number a JavaScript number holds exactly, 2⁵³ − 1.
const MaxSeed = 1<<53 - 1

// Units of [Limit.Unit].
const (
	UnitValues     = "values"     // numbers in a list
	UnitEntries    = "entries"    // rows, points or objects in a list, keys of an object
	UnitCharacters = "characters" // Unicode characters of a text
	UnitASCII      = "ASCII"      // characters of a text whose every valid value is ASCII
	UnitBytes      = "bytes"      // UTF-8 bytes of a text or a file
	UnitCount      = "count"      // a whole number given as an input
	UnitFraction   = "fraction"   // a mole fraction or a conversion
)

// Limit is one limit of the inputs of the page and of the JavaScript API (copoly.limits()).
// Each is one of copoly's own constants, so that the page, the bridge and the science read the
// same number.
type Limit struct {
	// Name is the key of the limit in copoly.limits() ("runs", "cellLength").
	Name string
	// Value is the limit: the most (or, for a name starting with "min", the fewest) of Unit.
	Value float64
	// Unit says what Value counts.
	Unit string
	// What says what the limit bounds.
	What string
}

// limits is the table of [Limits], in the order of site/copoly.d.ts.
var limits = []Limit{
	{"points", copoly.MaxPoints, UnitValues, "a list of numbers (f1, conversion, …)"},
	{"massConversions", copoly.MaxMassConversions, UnitValues, "the conversions of drift with basis \"mass\""},
	{"designConversions", fit.MaxDesignConversions, UnitValues, "the conversions of nextRuns"},
	{"runs", bench.MaxRuns, UnitEntries, "the runs of fit and nextRuns, and the rows of a bench table"},
	{"minRuns", fit.MinRuns, UnitEntries, "the fewest runs a fit takes"},
	{"intersectionRuns", fit.MaxIntersectionRuns, UnitEntries, "runs with a conversion the Mayo–Lewis intersection takes (fit skips it above)"},
	{"benchRows", MaxRows, UnitEntries, "the rows of the bench grid"},
	{"cells", MaxCells, UnitEntries, "the cells of a row of the bench grid"},
	{"cellLength", MaxCellLength, UnitCharacters, "a cell of the bench grid, its element, and a triad cell"},
	{"labelLength", MaxLabelLength, UnitCharacters, "the label of a row of the bench grid"},
	{"pasteBytes", bench.MaxBlockBytes, UnitBytes, "the text pasted into the bench grid (pasteBench), and a table file read"},
	{"pasteRows", bench.MaxBlockRows, UnitEntries, "the rows of data of a pasted block"},
	{"pasteColumns", bench.MaxBlockColumns, UnitEntries, "the columns of a pasted block"},
	{"triads", fit.MaxTriadRuns, UnitEntries, "the runs of discriminate and the triads of a project"},
	{"sizeBins", molarmass.MaxAverageRows, UnitEntries, "the bins or slices of averages and the size classes of a project"},
	{"jcr", plan.MaxRegionPoints, UnitEntries, "the points of a joint confidence region (plan, a project)"},
	{"timeTable", plan.MaxTimeRows, UnitEntries, "the rows of a conversion–time table"},
	{"bins", copoly.MaxBins, UnitCount, "the bins of a composition histogram (drift, chains)"},
	{"runLength", copoly.MaxRunLength, UnitCount, "the longest run of sequence's run lengths (maxLength)"},
	{"seed", MaxSeed, UnitCount, "the seed of chains and of the band of plan"},
	{"sampleChains", copoly.MaxChains, UnitCount, "the sample chains of chains without simulation options"},
	{"chainLength", copoly.MaxChainLength, UnitCount, "the units of a chain of fixed length"},
	{"simChains", copoly.MaxSimChains, UnitCount, "the chains of a simulation"},
	{"simUnits", copoly.MaxSimUnits, UnitCount, "count × chain length (or dpn) of a simulation"},
	{"dpn", copoly.MaxDPn, UnitCount, "the number-average degree of polymerization of a simulation"},
	{"planSteps", plan.MaxSteps, UnitCount, "the rows of a plan's schedule (steps)"},
	{"shots", plan.MaxShots, UnitCount, "the shots of a plan"},
	{"bandSamples", plan.MaxBandSamples, UnitCount, "the samples of a plan's band"},
	{"bandWork", plan.MaxBandWork, UnitCount, "samples × schedule rows of a plan's band"},
	{"fileBytes", MaxFileBytes, UnitBytes, "a project file (importProject) and a project"},
	{"nameLength", MaxNameLength, UnitCharacters, "the name of a project and of a monomer"},
	{"sourceLength", MaxSourceLength, UnitCharacters, "the source of the ratios and the note of a monomer of the user's own"},
	{"notesBytes", MaxNotesBytes, UnitBytes, "the notes of a project"},
	{"savedAtLength", MaxSavedAtLength, UnitASCII, "the time of a save"},
	{"wordLength", MaxPlanWordLength, UnitASCII, "a one-word option (model, mode, basis, feed, kinds)"},
	{"userMonomers", MaxUserMonomers, UnitEntries, "the monomers of the user's own in a project"},
	{"hazards", MaxHazards, UnitEntries, "the hazards of a monomer of the user's own"},
	{"hazardLength", MaxHazardLength, UnitCharacters, "a hazard of a monomer of the user's own"},
	{"draftFields", MaxDraftFields, UnitEntries, "the inputs of a draft"},
	{"draftBytes", MaxDraftBytes, UnitBytes, "the names and texts of a draft together"},
	{"idLength", MaxIDLength, UnitASCII, "the name of a tab or a page (tab, writer)"},
	{"keptNameLength", MaxKeptNameLength, UnitASCII, "the name of a kept copy"},
	{"linearConversion", fit.LinearConversionLimit, UnitFraction, "the conversion above which fit warns that the linear methods are biased"},
	{"triadSumTolerance", TriadSumTolerance, UnitFraction, "how far from 1 a family of measured triads may sum"},
}

// Limits returns every limit of the inputs of the page and of the JavaScript API, a fresh copy.
func Limits() []Limit { return append([]Limit(nil), limits...) }

// LimitOf returns the limit named name ([Limit.Name]) and whether there is one.
func LimitOf(name string) (Limit, bool) {
	for _, l := range limits {
		if l.Name == name {
			return l, true
		}
	}
	return Limit{}, false
}
