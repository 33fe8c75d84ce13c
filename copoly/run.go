package copoly

// Run is one bench copolymerization reduced to the quantities the estimators use: mole
// fractions and molar conversion (see [RunInput] for the forms a chemist types them in).
type Run struct {
	// F10 is the initial mole fraction of M1 in the monomer feed.
	F10 float64
	// Conversion is the overall molar conversion X at which the copolymer was sampled. Zero means
	// low conversion (not given): the instantaneous Mayo–Lewis equation applies.
	Conversion float64
	// F1 is the measured mole fraction of M1 in the copolymer (cumulative when Conversion > 0).
	F1 float64
	// SF, SX and Sf are the standard uncertainties of F1, Conversion and F10; zero means not
	// given.
	SF, SX, Sf float64
}
