package multi

import (
	"fmt"
	"math"
	"math/bits"
	"strings"

	"copoly/copoly"
)

// MinMonomers and MaxMonomers bound the number N of monomers of a [Model].
const (
	MinMonomers = 2
	MaxMonomers = 6
)

// FractionSumTolerance is how far the mole fractions of a feed or a target may sum from 1.
const FractionSumTolerance = 1e-9

// minWeight is the smallest relative rate coefficient k_ij / max_j k_ij kept: a smaller one (only
// from ratios below about 1e-296) is raised to it, so that no transition probability of a monomer
// in the feed underflows to exactly zero (see stationary).
const minWeight = 1e-300

// Model is a validated N-monomer terminal model (see the package documentation). Its methods
// never change it; one Model may be used from several goroutines.
type Model struct {
	n int
	r [MaxMonomers][MaxMonomers]float64
	// a[i][j] = k_ij / k_i,max over the cells of row i with a positive ratio: the smallest
	// positive ratio of the row divided by r_ij, so every weight is at most 1 (no overflow from
	// a ratio of 1e-3 or less). For a row whose every cross ratio is 0, k_ii = 0 and a[i] is 0.
	a [MaxMonomers][MaxMonomers]float64
	// zero[i] is the set of j ≠ i with r_ij = 0 (bit j): the monomers that take every radical
	// i when one of them is present (k_ij infinitely larger than k_ii).
	zero [MaxMonomers]uint8
	// c[i][j] weighs the zero cells of row i among themselves: 1 for a single zero cell,
	// otherwise the cross ratios of row i scaled to a largest value of 1.
	c [MaxMonomers][MaxMonomers]float64
	// noHomo[i] is true when every cross ratio of row i is 0: monomer i does not add to its own
	// radical (k_ii = 0).
	noHomo [MaxMonomers]bool
	// linear is the set of monomers j that some radical takes at once (r_ij = 0 for some i);
	// such a monomer can run out at a finite conversion (see drift.go).
	linear uint8
	// closed[S] is the one closed class of the chain restricted to the monomers of the set S:
	// the monomers that enter the copolymer when exactly those of S are present. 0 when S holds
	// a single monomer that does not add to its own radical (no polymer forms).
	closed [1 << MaxMonomers]uint8
	cross  [][]float64
}

// N returns the number of monomers.
func (m *Model) N() int { return m.n }

// R returns the ratio r_ij.
func (m *Model) R(i, j int) float64 { return m.r[i][j] }

// Ratios returns a copy of the ratio matrix.
func (m *Model) Ratios() [][]float64 {
	out := make([][]float64, m.n)
	for i := range out {
		out[i] = append([]float64(nil), m.r[i][:m.n]...)
	}
	return out
}

// New validates the ratio matrix r (N×N, N = 2…6, r[i][i] = 1, every other cell a finite
// ratio ≥ 0 and at most [copoly.MaxRatio]) and returns the model.
//
// # Zero ratios
//
// A zero is the limit of a very small ratio: r_ij = 0 means that a radical ending in i adds j
// whenever j is present, in preference to every monomer whose ratio in row i is positive. A
// single zero in a row needs nothing more. When a row has two or more zeros, the ratios say
// nothing about the choice among those monomers: the row needs their cross-propagation ratios.
// In particular a monomer that does not add to its own radical (every cross ratio of its row is
// 0, like maleic anhydride) is fine for N = 2 (its radical must add the other monomer), but for
// N ≥ 3 its radical's choice among the others needs them.
//
// cross gives them: nil (or empty) when no row has two zeros; otherwise one row per monomer,
// cross[i] empty for a row with fewer than two zeros and, for a row with two or more, N values
// with cross[i][j] > 0 proportional to k_ij for each j with r_ij = 0 (any common scale: only
// their ratios matter) and cross[i][j] = 0 for every other j. A row with two or more zeros and
// no cross[i] gives an error naming "r[i]" that says so.
//
// New also refuses zeros that leave the composition undetermined: monomers split into groups
// that add only within their group (for example r_01 = r_10 = 0 and r_23 = r_32 = 0) for some
// set of monomers present together. The error names one of the zero cells.
//
// Every error is a *copoly.InputError naming the cell ("r[1][2]", "cross[2][0]") and wrapping
// copoly.ErrNotFinite, copoly.ErrOutOfRange or copoly.ErrTooMany.
func New(r, cross [][]float64) (*Model, error) {
	n := len(r)
	switch {
	case n > MaxMonomers:
		return nil, &copoly.InputError{Field: "r", Value: float64(n), Reason: fmt.Sprintf("at most %d monomers", MaxMonomers), Err: copoly.ErrTooMany}
	case n < MinMonomers:
		return nil, &copoly.InputError{Field: "r", Value: float64(n), Reason: fmt.Sprintf("give the ratios of at least %d monomers (an N×N matrix)", MinMonomers), Err: copoly.ErrOutOfRange}
	}
	m := &Model{n: n}
	for i, row := range r {
		if len(row) != n {
			return nil, &copoly.InputError{Field: fmt.Sprintf("r[%d]", i), Value: float64(len(row)), Reason: fmt.Sprintf("each row of r needs %d ratios (one per monomer, 1 on the diagonal)", n), Err: copoly.ErrOutOfRange}
		}
		for j, v := range row {
			if i == j {
				if v != 1 {
					return nil, diagonalError(i, v)
				}
			} else if err := copoly.CheckRatio(cellName(i, j), v); err != nil {
				return nil, err
			}
			m.r[i][j] = v
		}
	}
	all := uint8(1)<<n - 1
	for i := range n {
		for j := range n {
			if j != i && m.r[i][j] == 0 {
				m.zero[i] |= 1 << j
				m.linear |= 1 << j
			}
		}
		m.noHomo[i] = m.zero[i] == all&^(1<<i)
		if !m.noHomo[i] {
			low := 1.0 // the diagonal
			for j := range n {
				if v := m.r[i][j]; v > 0 {
					low = math.Min(low, v)
				}
			}
			for j := range n {
				if v := m.r[i][j]; v > 0 {
					m.a[i][j] = math.Max(low/v, minWeight)
				}
			}
		}
		if bits.OnesCount8(m.zero[i]) == 1 {
			m.c[i][bits.TrailingZeros8(m.zero[i])] = 1
		}
	}
	if err := m.setCross(cross); err != nil {
		return nil, err
	}
	if err := m.setClasses(); err != nil {
		return nil, err
	}
	return m, nil
}

func diagonalError(i int, v float64) error {
	field := cellName(i, i)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &copoly.InputError{Field: field, Value: v, Reason: "must be 1 (r_ii = k_ii/k_ii)", Err: copoly.ErrNotFinite}
	}
	return &copoly.InputError{Field: field, Value: v, Reason: "a diagonal ratio is 1 by definition (r_ii = k_ii/k_ii)", Err: copoly.ErrOutOfRange}
}

func cellName(i, j int) string { return fmt.Sprintf("r[%d][%d]", i, j) }

// monomerName is monomer i in texts: M1…M6.
func monomerName(i int) string { return fmt.Sprintf("M%d", i+1) }

// setNames lists the monomers of the set s: "M1, M2 and M4".
func setNames(s uint8) string {
	var names []string
	for i := range MaxMonomers {
		if s&(1<<i) != 0 {
			names = append(names, monomerName(i))
		}
	}
	switch len(names) {
	case 0:
		return "none"
	case 1:
		return names[0]
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
}

// setCross validates the cross ratios and sets c for the rows with two or more zeros.
func (m *Model) setCross(cross [][]float64) error {
	n := m.n
	if len(cross) != 0 && len(cross) != n {
		return &copoly.InputError{Field: "cross", Value: float64(len(cross)), Reason: fmt.Sprintf("give one row per monomer (%d), empty for a row that needs none", n), Err: copoly.ErrOutOfRange}
	}
	for i := range n {
		var row []float64
		if len(cross) > 0 {
			row = cross[i]
		}
		zeros := bits.OnesCount8(m.zero[i])
		if zeros < 2 {
			if len(row) != 0 {
				return &copoly.InputError{Field: fmt.Sprintf("cross[%d]", i), Value: float64(len(row)), Reason: fmt.Sprintf("row r[%d] has fewer than two zero ratios, so the ratios of its cross-propagation constants follow from r: leave cross[%d] empty", i, i), Err: copoly.ErrOutOfRange}
			}
			continue
		}
		if len(row) == 0 {
			return &copoly.FieldError{Field: fmt.Sprintf("r[%d]", i), Reason: m.crossNeeded(i), Err: copoly.ErrOutOfRange}
		}
		if len(row) != n {
			return &copoly.InputError{Field: fmt.Sprintf("cross[%d]", i), Value: float64(len(row)), Reason: fmt.Sprintf("give %d values, one per monomer (0 where r[%d][j] is not zero)", n, i), Err: copoly.ErrOutOfRange}
		}
		top := 0.0
		for j, v := range row {
			field := fmt.Sprintf("cross[%d][%d]", i, j)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &copoly.InputError{Field: field, Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
			}
			if m.zero[i]&(1<<j) == 0 {
				if v != 0 {
					return &copoly.InputError{Field: field, Value: v, Reason: fmt.Sprintf("not used: r[%d][%d] is not zero, so this ratio follows from r; write 0", i, j), Err: copoly.ErrOutOfRange}
				}
				continue
			}
			if !(v > 0) {
				return &copoly.InputError{Field: field, Value: v, Reason: fmt.Sprintf("a relative rate coefficient k_%d%d must be positive", i+1, j+1), Err: copoly.ErrOutOfRange}
			}
			top = math.Max(top, v)
		}
		for j, v := range row {
			if m.zero[i]&(1<<j) != 0 {
				m.c[i][j] = math.Max(v/top, minWeight)
			}
		}
	}
	if len(cross) > 0 {
		m.cross = make([][]float64, n)
		for i := range cross {
			m.cross[i] = append([]float64(nil), cross[i]...)
		}
	}
	return nil
}

// crossNeeded is the text of the error for a row with two or more zeros and no cross ratios.
func (m *Model) crossNeeded(i int) string {
	z := m.zero[i]
	var ks []string
	for j := range m.n {
		if z&(1<<j) != 0 {
			ks = append(ks, fmt.Sprintf("k%d%d", i+1, j+1))
		}
	}
	what := fmt.Sprintf("row r[%d] has %d zero ratios (%s): a radical ending in %s adds those monomers in preference to any other", i, len(ks), setNames(z), monomerName(i))
	if m.noHomo[i] {
		what = fmt.Sprintf("every cross ratio of row r[%d] is 0: %s does not add to its own radical (like maleic anhydride)", i, monomerName(i))
	}
	return fmt.Sprintf("%s, and with %d monomers its radical's choice among %s needs the ratios of its cross-propagation constants %s, which the binary pairs do not give: give cross[%d] (values proportional to %s on any common scale, 0 in the other cells), or make the ratios small but positive",
		what, m.n, setNames(z), strings.Join(ks, " : "), i, strings.Join(ks, ", "))
}

// targets returns the monomers a radical i can add when the monomers of s are present.
func (m *Model) targets(i int, s uint8) uint8 {
	if z := m.zero[i] & s; z != 0 {
		return z
	}
	if m.noHomo[i] {
		return 0 // only i itself is present, and it cannot add to its own radical
	}
	return s
}

// classes returns the closed classes of the chain restricted to the monomers of s (the sets of
// monomers that, once entered, the chain never leaves).
func (m *Model) classes(s uint8) []uint8 {
	var reach [MaxMonomers]uint8
	for i := range m.n {
		if s&(1<<i) != 0 {
			reach[i] = m.targets(i, s)
		}
	}
	for range m.n {
		for i := range m.n {
			r := reach[i]
			for j := range m.n {
				if r&(1<<j) != 0 {
					r |= reach[j]
				}
			}
			reach[i] = r
		}
	}
	var out []uint8
	for i := range m.n {
		if s&(1<<i) == 0 || reach[i]&(1<<i) == 0 {
			continue
		}
		recurrent := true
		for j := range m.n {
			if reach[i]&(1<<j) != 0 && reach[j]&(1<<i) == 0 {
				recurrent = false
				break
			}
		}
		if !recurrent {
			continue
		}
		seen := false
		for _, c := range out {
			seen = seen || c == reach[i]
		}
		if !seen {
			out = append(out, reach[i])
		}
	}
	return out
}

// setClasses fills closed for every set of monomers and refuses a model whose zeros split some
// set into groups that add only among themselves.
func (m *Model) setClasses() error {
	for s := uint8(1); s < 1<<m.n; s++ {
		cs := m.classes(s)
		switch len(cs) {
		case 0:
			m.closed[s] = 0
		case 1:
			m.closed[s] = cs[0]
		default:
			var groups []string
			var cells []string
			for _, c := range cs {
				groups = append(groups, setNames(c))
				for i := range m.n {
					if c&(1<<i) == 0 {
						continue
					}
					for j := range m.n {
						if m.zero[i]&c&(1<<j) != 0 {
							cells = append(cells, cellName(i, j))
						}
					}
				}
			}
			i := bits.TrailingZeros8(cs[1])
			j := bits.TrailingZeros8(m.zero[i] & cs[1])
			return &copoly.InputError{Field: cellName(i, j), Value: 0,
				Reason: fmt.Sprintf("with %s present together, the zero ratios (%s) split the monomers into groups that add only within themselves (%s), so the ratios do not determine how much of each group enters the copolymer; give these ratios small positive values",
					setNames(s), strings.Join(cells, ", "), strings.Join(groups, " | ")),
				Err: copoly.ErrOutOfRange}
		}
	}
	return nil
}

// checkFeed validates one feed (or target) of the model's N mole fractions, naming its values
// field[j] and the feed itself field: finite, ≥ 0, summing to 1 within FractionSumTolerance. It
// returns the sum.
func (m *Model) checkFeed(field string, f []float64) (float64, error) {
	return checkFractions(field, f, m.n)
}

// checkFractions validates n mole fractions named field[j], summing to 1; it returns the sum.
func checkFractions(field string, f []float64, n int) (float64, error) {
	if len(f) != n {
		return 0, &copoly.InputError{Field: field, Value: float64(len(f)), Reason: fmt.Sprintf("give one mole fraction per monomer (%d)", n), Err: copoly.ErrOutOfRange}
	}
	var sum float64
	for _, v := range f {
		if !(v >= 0 && v <= 1) { // also NaN; the field name is built only on error
			return 0, fractionError(field, f)
		}
		sum += v
	}
	if !(math.Abs(sum-1) <= FractionSumTolerance) {
		return 0, &copoly.InputError{Field: field, Value: sum, Reason: fmt.Sprintf("the mole fractions must sum to 1 (within %g); they sum to %.12g", FractionSumTolerance, sum), Err: copoly.ErrOutOfRange}
	}
	return sum, nil
}

// fractionError names the first bad value of f.
func fractionError(field string, f []float64) error {
	for j, v := range f {
		name := fmt.Sprintf("%s[%d]", field, j)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &copoly.InputError{Field: name, Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if v < 0 {
			return &copoly.InputError{Field: name, Value: v, Reason: "a mole fraction cannot be negative", Err: copoly.ErrOutOfRange}
		}
		if v > 1 {
			return &copoly.InputError{Field: name, Value: v, Reason: "a mole fraction cannot exceed 1", Err: copoly.ErrOutOfRange}
		}
	}
	return nil
}

// load copies a validated feed into an array, divided by its sum, and returns the set of
// monomers present (f_i > 0).
func load(dst *[MaxMonomers]float64, f []float64, sum float64) uint8 {
	var s uint8
	for i, v := range f {
		dst[i] = v / sum
		if v > 0 {
			s |= 1 << i
		}
	}
	return s
}
