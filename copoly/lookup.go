package copoly

import (
	"fmt"
	"strings"
)

// Entry is one monomer of the built-in list with everything copoly knows of it.
type Entry struct {
	Monomer
	// Properties holds its process data ([PropertiesOf]), nil when there are none.
	Properties *Properties
	// QE holds its Q–e values ([QEOf]), nil when there are none.
	QE *QE
}

// Library returns the built-in monomers ([Monomers]) with their process data and Q–e values,
// the literature ratio pairs ([Pairs]) and the table of sources their values cite ([Sources]).
func Library() ([]Entry, []RatioPair, []Source) {
	ms := Monomers()
	out := make([]Entry, len(ms))
	for i, m := range ms {
		out[i] = Entry{Monomer: m}
		if p, ok := PropertiesOf(m.Name); ok {
			out[i].Properties = &p
		}
		if q, ok := QEOf(m.Name); ok {
			out[i].QE = &q
		}
	}
	return out, Pairs(), Sources()
}

// QEPair is the Q–e screening estimate of a pair of built-in monomers.
type QEPair struct {
	// R1 and R2 are the ratios [RatiosFromQE] predicts.
	R1, R2 float64
	// Monomer1 and Monomer2 are the Q–e values used, with their sources.
	Monomer1, Monomer2 QE
}

// QEPairOf returns the Q–e screening estimate of the ratios of two monomers of the built-in
// list, by name. A name without built-in Q–e values gives a [*FieldError] naming "monomer1" or
// "monomer2" that lists the names with values.
func QEPairOf(monomer1, monomer2 string) (QEPair, error) {
	var q [2]QE
	for i, name := range []string{monomer1, monomer2} {
		v, ok := QEOf(name)
		if !ok {
			return QEPair{}, &FieldError{Field: fmt.Sprintf("monomer%d", i+1), Reason: fmt.Sprintf("%q has no built-in Q–e values; those with values are %s", name, qeNames()), Err: ErrOutOfRange}
		}
		q[i] = v
	}
	r1, r2, err := RatiosFromQE(q[0], q[1])
	if err != nil {
		return QEPair{}, err
	}
	return QEPair{R1: r1, R2: r2, Monomer1: q[0], Monomer2: q[1]}, nil
}

// qeNames lists the built-in monomers that have Q–e values, for an error message.
func qeNames() string {
	var names []string
	for _, m := range Monomers() {
		if _, ok := QEOf(m.Name); ok {
			names = append(names, fmt.Sprintf("%q", m.Name))
		}
	}
	if len(names) == 0 {
		return "none"
	}
	return strings.Join(names, ", ")
}
