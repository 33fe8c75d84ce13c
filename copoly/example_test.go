package copoly_test

// The printed outputs below are documentation produced by copoly itself (F1(0.2) = 0.176/0.3616
// and D11 = F1·P11 = 0.5101·0.3421 were also worked by hand); the checks against outside sources
// are in the other _test files.

import (
	"fmt"

	"copoly/copoly"
)

// Styrene (M1) and acrylonitrile (M2) with the handbook ratios 0.40/0.04.
func ExampleTerminal_Instantaneous() {
	m := copoly.Terminal{R1: 0.40, R2: 0.04}
	for _, f1 := range []float64{0.2, 0.5, 0.8} {
		fmt.Printf("f1 = %.1f  F1 = %.4f\n", f1, m.Instantaneous(f1))
	}
	az, ok := m.Azeotrope()
	fmt.Printf("azeotrope at f1 = %.4f (%v)\n", az, ok)
	// Output:
	// f1 = 0.2  F1 = 0.4867
	// f1 = 0.5  F1 = 0.5738
	// f1 = 0.8  F1 = 0.7202
	// azeotrope at f1 = 0.6154 (true)
}

func ExampleTerminal_Drift() {
	m := copoly.Terminal{R1: 0.40, R2: 0.04}
	d, err := m.Drift(0.3, []float64{0, 0.5, 0.9})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, x := range d.Conversion {
		fmt.Printf("X = %.1f  f1 = %.4f  F1 = %.4f  F1cum = %.4f\n", x, d.Feed[i], d.Inst[i], d.Cum[i])
	}
	fmt.Println(d.Method)
	// Output:
	// X = 0.0  f1 = 0.3000  F1 = 0.5172  F1cum = 0.5172
	// X = 0.5  f1 = 0.1080  F1 = 0.4408  F1cum = 0.4920
	// X = 0.9  f1 = 0.0000  F1 = 0.0000  F1cum = 0.3333
	// meyer-lowry
}

func ExampleTerminal_Sequence() {
	s, _ := copoly.Terminal{R1: 0.52, R2: 0.46}.Sequence(0.5)
	fmt.Printf("dyads 11 %.4f  12 %.4f  22 %.4f\n", s.D11, s.D12, s.D22)
	fmt.Printf("mean runs %.3f %.3f  run number %.2f\n", s.MeanLength1, s.MeanLength2, s.RunNumber)
	// Output:
	// dyads 11 0.1745  12 0.6711  22 0.1544
	// mean runs 1.520 1.460  run number 67.11
}

func ExampleTerminal_Drift_badInput() {
	_, err := copoly.Terminal{R1: 0.40, R2: -0.04}.Drift(0.3, []float64{0.5})
	fmt.Println(copoly.Field(err))
	fmt.Println(err)
	// Output:
	// r2
	// r2 = -0.04: a reactivity ratio cannot be negative
}
