package multi_test

import (
	"fmt"

	"copoly/copoly/multi"
)

// stanMatrix is styrene (M1), methyl methacrylate (M2) and acrylonitrile (M3) with the
// built-in literature pairs (copoly.Pairs: Polymer Handbook, 4th ed., Greenley's table):
// St/MMA 0.52/0.46, St/AN 0.40/0.04, MMA/AN 1.322/0.138.
var stanMatrix = [][]float64{
	{1, 0.52, 0.40},
	{0.46, 1, 1.322},
	{0.04, 0.138, 1},
}

// The composition of the copolymer formed at the start of a batch from an equimolar feed of
// three monomers (the Alfrey–Goldfinger equation gives the same to 16 digits).
func ExampleModel_Composition() {
	m, err := multi.New(stanMatrix, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	F, err := m.Composition(nil, []float64{1.0 / 3, 1.0 / 3, 1.0 / 3})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("F = %.4f\n", F)

	// A feed that does not sum to 1 is refused, naming the feed.
	_, err = m.Composition(nil, []float64{0.5, 0.3, 0.1})
	fmt.Println(err)
	// Output:
	// F = [0.4430 0.2890 0.2679]
	// f = 0.9: the mole fractions must sum to 1 (within 1e-09); they sum to 0.9
}
