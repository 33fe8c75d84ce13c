package multi_test

import (
	"errors"
	"fmt"

	"copoly/copoly"
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

// A batch of methyl methacrylate (M1), vinyl acetate (M2) and acrylonitrile (M3) (pairs from
// copoly.Pairs: MMA/VAc 26/0.03, MMA/AN 1.322/0.138, AN/VAc 4.05/0.04): vinyl acetate hardly
// enters the chain until the other two are used up. The same numbers are in
// testdata/multi_scipy.json (case mma-vac-an), computed by scipy.
func ExampleModel_Drift() {
	m, err := multi.New([][]float64{
		{1, 26, 1.322},
		{0.03, 1, 0.04},
		{0.138, 4.05, 1},
	}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	d, err := m.Drift([]float64{0.2, 0.5, 0.3}, []float64{0.3, 0.6, 0.9})
	if err != nil {
		fmt.Println(err)
		return
	}
	for k, x := range d.Conversion {
		fmt.Printf("X = %.1f: f = %.4f, F = %.4f, F̄ = %.4f\n", x, d.Feed[k], d.Inst[k], d.Cum[k])
	}
	for _, e := range d.Exhausted {
		fmt.Printf("M%d used up at X = %.4f\n", e.Monomer+1, e.Conversion)
	}
	// Output:
	// X = 0.3: f = [0.0710 0.6800 0.2490], F = [0.3938 0.1313 0.4749], F̄ = [0.5010 0.0800 0.4190]
	// X = 0.6: f = [0.0001 0.9500 0.0498], F = [0.0028 0.5905 0.4067], F̄ = [0.3332 0.2000 0.4668]
	// X = 0.9: f = [0.0000 1.0000 0.0000], F = [0.0000 1.0000 0.0000], F̄ = [0.2222 0.4444 0.3333]
	// M1 used up at X = 0.6756
	// M3 used up at X = 0.7688
}

// The feed that makes a terpolymer of 40 % styrene, 30 % methyl methacrylate and 30 %
// acrylonitrile (mole fractions) at low conversion, and a target no feed can make: a monomer
// that does not add to its own radical (M3 here, every cross ratio of its row 0, with cross
// ratios k31 : k32 = 1 : 2) can make at most half of the chain.
func ExampleModel_FeedFor() {
	m, _ := multi.New(stanMatrix, nil)
	f, err := m.FeedFor([]float64{0.4, 0.3, 0.3})
	if err != nil {
		fmt.Println(err)
		return
	}
	F, _ := m.Composition(nil, f)
	fmt.Printf("feed f = %.4f gives F = %.4f\n", f, F)

	alt, _ := multi.New([][]float64{{1, 0.5, 0.3}, {2, 1, 0.4}, {0, 0, 1}}, [][]float64{nil, nil, {1, 2, 0}})
	_, err = alt.FeedFor([]float64{0.2, 0.2, 0.6})
	fmt.Println(copoly.Field(err), errors.Is(err, copoly.ErrUnreachable))
	// Output:
	// feed f = [0.2565 0.3392 0.4043] gives F = [0.4000 0.3000 0.3000]
	// targetF[2] true
}

// Chains of the styrene / methyl methacrylate / acrylonitrile terpolymer grown along a batch to
// 95 % conversion, with most-probable lengths of number-average 20 units, counting the
// acrylonitrile units (M3) per chain. The simulated fractions of chains with none and with one
// such unit converge to the model's (the Expected fields) as the count grows.
func ExampleModel_SimulateChains() {
	m, _ := multi.New(stanMatrix, nil)
	st, err := m.SimulateChains(multi.ChainOptions{
		F0: []float64{0.45, 0.45, 0.10}, Conversion: 0.95, DPn: 20,
		Count: 20000, Seed: 1, Functional: []int{2},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d chains, %d units\n", st.Count, st.Units)
	fmt.Printf("without M3: %.3f of the chains (model %.3f), %.3f by weight (model %.3f)\n",
		st.NoneNumber, st.ExpectedNoneNumber, st.NoneWeight, st.ExpectedNoneWeight)
	fmt.Printf("with one M3: %.3f (model %.3f)\n", st.OneNumber, st.ExpectedOneNumber)

	// Limits are checked before any work.
	_, err = m.SimulateChains(multi.ChainOptions{F0: []float64{0.45, 0.45, 0.10}, DPn: 1000, Count: 50000})
	fmt.Println(err)
	// Output:
	// 20000 chains, 399438 units
	// without M3: 0.298 of the chains (model 0.298), 0.100 by weight (model 0.099)
	// with one M3: 0.253 (model 0.250)
	// count = 50000: count × dpn must stay below 20000000 units
}

// The ratio matrix of a hydroxy-functional acrylic: styrene / n-butyl acrylate from the
// built-in literature pairs, 2-hydroxyethyl methacrylate with each of them from the Q–e scheme
// (screening values, flagged as such). A pair the user typed or fitted would take precedence
// over both. Each cell says where it comes from.
func ExampleAssemble() {
	mx, err := multi.Assemble([]string{"styrene", "n-butyl acrylate", "2-hydroxyethyl methacrylate"}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, row := range mx.R {
		fmt.Printf("%-28s %.3f  %s, %s\n", mx.Monomers[i], row, mx.Origin[i][(i+1)%3].Kind, mx.Origin[i][(i+2)%3].Kind)
	}
	fmt.Println(mx.Err())
	// Output:
	// styrene                      [1.000 0.800 0.425]  literature, screening
	// n-butyl acrylate             [0.150 1.000 0.288]  screening, literature
	// 2-hydroxyethyl methacrylate  [0.557 2.836 1.000]  screening, screening
	// <nil>
}
