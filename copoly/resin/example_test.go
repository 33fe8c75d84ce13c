package resin_test

import (
	"fmt"

	"copoly/copoly/resin"
)

// A hydroxy acrylic of 60 % methyl methacrylate, 20 % n-butyl acrylate and 20 %
// 2-hydroxyethyl methacrylate by mass. Homopolymer Tg 378, 219 and 328 K (typical handbook
// values, from memory: check them for your grades); molar masses from the formulas.
func ExampleFox() {
	w := []float64{0.6, 0.2, 0.2}
	tg, err := resin.Fox(w, []float64{378, 219, 328})
	if err != nil {
		fmt.Println(err)
		return
	}
	ohv, _ := resin.HydroxylValue(w, []float64{0, 0, 1}, []float64{100.117, 128.171, 130.143})
	fmt.Printf("Tg = %.1f K (%.1f °C), hydroxyl value %.1f mg KOH/g\n", tg, tg-273.15, ohv)

	_, err = resin.Fox(w, []float64{378, 219, -10})
	fmt.Println(err)
	// Output:
	// Tg = 321.5 K (48.4 °C), hydroxyl value 86.2 mg KOH/g
	// tg[2] = -10: a glass transition temperature in kelvin must be above 0 K (273.15 K = 0 °C)
}
