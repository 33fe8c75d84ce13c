package multi

import (
	"fmt"
	"math"
	"strings"

	"copoly/copoly"
)

// Kinds of origin of a ratio in [Origin.Kind], in order of precedence.
const (
	// OriginUser is a pair the user typed.
	OriginUser = "user"
	// OriginFit is a pair estimated from the user's data.
	OriginFit = "fit"
	// OriginLiterature is a built-in published pair (copoly.Pairs).
	OriginLiterature = "literature"
	// OriginScreening is an Alfrey–Price Q–e estimate: a screening value, often off by a
	// factor of two or more, to be replaced by measured ratios.
	OriginScreening = "screening"
	// OriginDiagonal is r_ii = 1.
	OriginDiagonal = "diagonal"
	// OriginMissing is a cell with no data at all (its ratio is NaN).
	OriginMissing = "missing"
)

// MaxPairs is the largest number of pairs [Assemble] accepts.
const MaxPairs = 100

// Pair is a pair of terminal-model ratios for two monomers named as in the monomer list:
// R1 = k11/k12 and R2 = k22/k21 with Monomer1 as M1 of the pair.
type Pair struct {
	Monomer1, Monomer2 string
	R1, R2             float64
	// Kind is OriginUser or OriginFit; empty means OriginUser.
	Kind string
	// Source says where the values come from (a reference, a fit's data set); optional.
	Source string
}

// Origin says where one cell of an assembled matrix comes from.
type Origin struct {
	// Kind is one of the Origin constants.
	Kind string
	// Source is the reference, the Q–e values used, or why the cell is missing.
	Source string
}

// Matrix is a ratio matrix assembled from several sources, each cell with its origin.
type Matrix struct {
	// Monomers are the names, in the order of the rows.
	Monomers []string
	// R is the N×N ratio matrix; a missing cell is NaN.
	R [][]float64
	// Origin[i][j] is the origin of R[i][j].
	Origin [][]Origin
	// Missing lists the pairs (i < j) with no data at all; the caller must fill them.
	Missing [][]int
}

// Assemble builds the ratio matrix of the named monomers (2…MaxMonomers, distinct names) from,
// for each pair, in order of precedence:
//
//  1. the pairs given (a user's typed pair before a fitted one; either orientation);
//  2. the built-in literature pairs of copoly.Pairs, either orientation, names compared without
//     regard to case or surrounding spaces;
//  3. the Alfrey–Price Q–e scheme from the built-in Q–e values of both monomers
//     (copoly.QEOf, copoly.RatiosFromQE), marked as a screening value.
//
// A pair with none of these is listed in Missing, its cells NaN with the origin "missing"; the
// matrix is then not usable until the caller fills them ([Matrix.Err] says which). Both cells
// of a pair always come from the same source.
//
// Errors (*copoly.InputError or *copoly.FieldError) name "monomers", "monomers[i]", "pairs",
// "pairs[k]", "pairs[k].monomer1", "pairs[k].monomer2", "pairs[k].r1", "pairs[k].r2" or
// "pairs[k].kind".
//
// References:
//   - T. Alfrey, C. C. Price, J. Polym. Sci. 1947, 2, 101 (the Q–e scheme).
func Assemble(monomers []string, pairs []Pair) (*Matrix, error) {
	n := len(monomers)
	switch {
	case n > MaxMonomers:
		return nil, &copoly.InputError{Field: "monomers", Value: float64(n), Reason: fmt.Sprintf("at most %d monomers", MaxMonomers), Err: copoly.ErrTooMany}
	case n < MinMonomers:
		return nil, &copoly.InputError{Field: "monomers", Value: float64(n), Reason: fmt.Sprintf("name at least %d monomers", MinMonomers), Err: copoly.ErrOutOfRange}
	}
	if len(pairs) > MaxPairs {
		return nil, &copoly.InputError{Field: "pairs", Value: float64(len(pairs)), Reason: fmt.Sprintf("at most %d pairs", MaxPairs), Err: copoly.ErrTooMany}
	}
	key := func(s string) string { return strings.ToLower(strings.TrimSpace(s)) }
	index := map[string]int{}
	for i, name := range monomers {
		k := key(name)
		if k == "" {
			return nil, &copoly.FieldError{Field: indexName("monomers", i), Reason: "a monomer needs a name", Err: copoly.ErrOutOfRange}
		}
		if len(name) > 200 {
			return nil, &copoly.FieldError{Field: indexName("monomers", i), Reason: "a name of at most 200 bytes", Err: copoly.ErrTooMany}
		}
		if j, dup := index[k]; dup {
			return nil, &copoly.FieldError{Field: indexName("monomers", i), Reason: fmt.Sprintf("the same monomer as monomers[%d]", j), Err: copoly.ErrOutOfRange}
		}
		index[k] = i
	}
	mx := &Matrix{Monomers: append([]string(nil), monomers...), R: make([][]float64, n), Origin: make([][]Origin, n)}
	for i := range n {
		mx.R[i] = make([]float64, n)
		mx.Origin[i] = make([]Origin, n)
		mx.R[i][i] = 1
		mx.Origin[i][i] = Origin{Kind: OriginDiagonal, Source: "r_ii = k_ii/k_ii = 1"}
	}
	// rank orders the sources of a pair: the lower the better; 0 = not set.
	rank := make([][]int, n)
	for i := range rank {
		rank[i] = make([]int, n)
	}
	set := func(i, j int, rij, rji float64, r int, o Origin) {
		mx.R[i][j], mx.R[j][i] = rij, rji
		mx.Origin[i][j], mx.Origin[j][i] = o, o
		rank[i][j], rank[j][i] = r, r
	}
	for k, p := range pairs {
		field := fmt.Sprintf("pairs[%d]", k)
		i, ok1 := index[key(p.Monomer1)]
		if !ok1 {
			return nil, &copoly.FieldError{Field: field + ".monomer1", Reason: fmt.Sprintf("%q is not one of the monomers", p.Monomer1), Err: copoly.ErrOutOfRange}
		}
		j, ok2 := index[key(p.Monomer2)]
		if !ok2 {
			return nil, &copoly.FieldError{Field: field + ".monomer2", Reason: fmt.Sprintf("%q is not one of the monomers", p.Monomer2), Err: copoly.ErrOutOfRange}
		}
		if i == j {
			return nil, &copoly.FieldError{Field: field + ".monomer2", Reason: "a pair needs two different monomers", Err: copoly.ErrOutOfRange}
		}
		if err := copoly.CheckRatio(field+".r1", p.R1); err != nil {
			return nil, err
		}
		if err := copoly.CheckRatio(field+".r2", p.R2); err != nil {
			return nil, err
		}
		r := 0
		if p.Kind == "" {
			p.Kind = OriginUser
		}
		switch p.Kind {
		case OriginUser:
			r = 1
		case OriginFit:
			r = 2
		default:
			return nil, &copoly.FieldError{Field: field + ".kind", Reason: fmt.Sprintf("%q: the kind of a pair is %q or %q", p.Kind, OriginUser, OriginFit), Err: copoly.ErrOutOfRange}
		}
		if rank[i][j] == r {
			return nil, &copoly.FieldError{Field: field, Reason: fmt.Sprintf("%s/%s is given twice as a %s pair", monomers[i], monomers[j], p.Kind), Err: copoly.ErrOutOfRange}
		}
		if rank[i][j] != 0 && rank[i][j] < r {
			continue
		}
		src := p.Source
		if src == "" {
			src = map[string]string{OriginUser: "typed by the user", OriginFit: "estimated from the user's data"}[p.Kind]
		}
		set(i, j, p.R1, p.R2, r, Origin{Kind: p.Kind, Source: src})
	}
	lit := copoly.Pairs()
	canon := map[string]string{} // built-in names by key, for the Q–e values
	for _, mo := range copoly.Monomers() {
		canon[key(mo.Name)] = mo.Name
	}
	for i := range n {
		for j := i + 1; j < n; j++ {
			if rank[i][j] != 0 {
				continue
			}
			for _, p := range lit {
				a, b := key(p.Monomer1), key(p.Monomer2)
				src := p.Source + "; temperature: " + p.Temperature
				switch {
				case a == key(monomers[i]) && b == key(monomers[j]):
					set(i, j, p.R1, p.R2, 3, Origin{Kind: OriginLiterature, Source: src})
				case a == key(monomers[j]) && b == key(monomers[i]):
					set(i, j, p.R2, p.R1, 3, Origin{Kind: OriginLiterature, Source: src + " (listed as " + p.Monomer1 + "/" + p.Monomer2 + ")"})
				default:
					continue
				}
				break
			}
			if rank[i][j] != 0 {
				continue
			}
			qi, oki := copoly.QEOf(canon[key(monomers[i])])
			qj, okj := copoly.QEOf(canon[key(monomers[j])])
			why := ""
			if oki && okj {
				rij, rji, err := copoly.RatiosFromQE(qi, qj)
				if err == nil && copoly.CheckRatio("r", rij) == nil && copoly.CheckRatio("r", rji) == nil {
					set(i, j, rij, rji, 4, Origin{Kind: OriginScreening, Source: fmt.Sprintf(
						"Alfrey–Price Q–e screening estimate (T. Alfrey, C. C. Price, J. Polym. Sci. 1947, 2, 101) from %s Q = %g, e = %g (%s) and %s Q = %g, e = %g (%s); often off by a factor of two or more: replace it by measured ratios",
						monomers[i], qi.Q, qi.E, qi.Source, monomers[j], qj.Q, qj.E, qj.Source)})
					continue
				}
				why = "the Q–e estimate is outside the accepted range of ratios"
			} else {
				var none []string
				if !oki {
					none = append(none, monomers[i])
				}
				if !okj {
					none = append(none, monomers[j])
				}
				why = "no built-in Q–e values for " + strings.Join(none, " and ")
			}
			o := Origin{Kind: OriginMissing, Source: fmt.Sprintf("no ratios for %s/%s: no pair given, no built-in literature pair, and %s; type the pair", monomers[i], monomers[j], why)}
			mx.R[i][j], mx.R[j][i] = math.NaN(), math.NaN()
			mx.Origin[i][j], mx.Origin[j][i] = o, o
			mx.Missing = append(mx.Missing, []int{i, j})
		}
	}
	return mx, nil
}

// Err returns nil when every cell of the matrix has a value, and otherwise an error naming the
// first missing cell ("r[0][2]"), wrapping copoly.ErrOutOfRange, whose text names the pair.
func (mx *Matrix) Err() error {
	if len(mx.Missing) == 0 {
		return nil
	}
	i, j := mx.Missing[0][0], mx.Missing[0][1]
	reason := mx.Origin[i][j].Source
	if len(mx.Missing) > 1 {
		reason += fmt.Sprintf(" (%d pairs in all are missing)", len(mx.Missing))
	}
	return &copoly.FieldError{Field: cellName(i, j), Reason: reason, Err: copoly.ErrOutOfRange}
}

// Model returns the model of the assembled matrix, or the error of [Matrix.Err] when a pair is
// missing.
func (mx *Matrix) Model() (*Model, error) {
	if err := mx.Err(); err != nil {
		return nil, err
	}
	return New(mx.R, nil)
}
