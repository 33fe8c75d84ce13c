package plan_test

// The printed outputs below are documentation produced by copoly itself; the checks against
// outside sources are in the other _test files.

import (
	"fmt"

	"copoly/copoly"
	"copoly/copoly/plan"
)

// A semi-batch plan for 1000 g of a 50/50 styrene/n-butyl acrylate copolymer: charge at the
// feed that gives the target, then meter styrene in proportion to the polymer formed.
func ExampleMake() {
	p, err := plan.Make(plan.Input{
		Model: copoly.Terminal{R1: 0.80, R2: 0.15}, TargetF1: 0.5,
		MolarMass1: 104.152, MolarMass2: 128.171, PolymerMass: 1000, Mode: plan.ModeSemibatch,
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
