package copoly

import "sort"

// AtomicWeight returns the standard atomic weight in g/mol of the element with the symbol given
// ("N", "Cl"), from the table [MolarMassOf] uses, and whether copoly knows it.
func AtomicWeight(symbol string) (float64, bool) {
	w, ok := atomicWeight[symbol]
	return w, ok
}

// Elements returns the symbols of the elements [AtomicWeight] knows, sorted.
func Elements() []string {
	s := make([]string, 0, len(atomicWeight))
	for k := range atomicWeight {
		s = append(s, k)
	}
	sort.Strings(s)
	return s
}
