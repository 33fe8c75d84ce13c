package fit_test

// The printed outputs below are documentation produced by copoly itself; the checks against
// outside sources are in the other _test files.

import (
	"fmt"

	"copoly/copoly"
	"copoly/copoly/fit"
)

// Reactivity ratios from five low-conversion runs of styrene (M1) and methyl methacrylate (M2);
// the compositions are simulated from the pair 0.52/0.46 and rounded, for the example.
func ExampleEstimate() {
	runs := []copoly.Run{
		{F10: 0.1, F1: 0.171}, {F10: 0.3, F1: 0.371}, {F10: 0.5, F1: 0.51},
		{F10: 0.7, F1: 0.649}, {F10: 0.9, F1: 0.844},
	}
	e, err := fit.Estimate(runs, 0.95)
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
