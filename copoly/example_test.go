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

// Reactivity ratios from five low-conversion runs of styrene (M1) and methyl methacrylate (M2);
// the compositions are simulated from the pair 0.52/0.46 and rounded, for the example.
func ExampleEstimate() {
	runs := []copoly.Run{
		{F10: 0.1, F1: 0.171}, {F10: 0.3, F1: 0.371}, {F10: 0.5, F1: 0.51},
		{F10: 0.7, F1: 0.649}, {F10: 0.9, F1: 0.844},
	}
	e, err := copoly.Estimate(runs, 0.95)
	if err != nil {
		fmt.Println(err)
		return
	}
	nl := e.Nonlinear
	fmt.Printf("recommended: %s r1 = %.2f, r2 = %.2f\n", e.Recommended, nl.R1, nl.R2)
	fmt.Printf("Kelen–Tüdős (linear): r1 = %.2f, r2 = %.2f\n", e.KelenTudos.R1, e.KelenTudos.R2)
	fmt.Printf("95 %% region: r1 %.3f–%.3f\n", nl.Region.R1Min, nl.Region.R1Max)
	// Output:
	// recommended: nonlinear r1 = 0.52, r2 = 0.46
	// Kelen–Tüdős (linear): r1 = 0.52, r2 = 0.46
	// 95 % region: r1 0.517–0.523
}

// A semi-batch plan for 1000 g of a 50/50 styrene/n-butyl acrylate copolymer: charge at the
// feed that gives the target, then meter styrene in proportion to the polymer formed.
func ExampleMakePlan() {
	p, err := copoly.MakePlan(copoly.PlanInput{
		Model: copoly.Terminal{R1: 0.80, R2: 0.15}, TargetF1: 0.5,
		MolarMass1: 104.152, MolarMass2: 128.171, PolymerMass: 1000, Mode: copoly.PlanSemibatch,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	last := p.Schedule[len(p.Schedule)-1]
	fmt.Printf("charge f1 = %.3f: %.0f g M1, %.0f g M2\n", p.StartF1, p.Charge1, p.Charge2)
	fmt.Printf("meter %.0f g of M1; product F1 = %.3f\n", last.Fed1, p.ProductF1)
	// Output:
	// charge f1 = 0.302: 208 g M1, 592 g M2
	// meter 254 g of M1; product F1 = 0.500
}
