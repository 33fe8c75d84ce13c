package molarmass

import (
	"errors"
	"testing"

	"copoly/copoly"
)

// TestSummarize: the summary is BinAverages or SliceAverages, and SizeOf with F1 and both molar
// masses; the slices' errors name their entries as the page does.
func TestSummarize(t *testing.T) {
	bins := []Bin{{Low: 1e4, High: 2e4, Weight: 0.5}, {Low: 2e4, High: 4e4, Weight: 0.5}}
	slices := []Slice{{1e4, 1}, {2e4, 2}, {4e4, 1}}
	f1, mm1, mm2 := 0.5, 104.152, 128.171 // styrene, n-butyl acrylate (IUPAC 2021 atomic weights)
	a, _ := BinAverages(bins)
	s, err := Summarize(Input{Bins: bins})
	if err != nil || s.Averages != a || s.Size != nil {
		t.Errorf("bins: %+v, %v; want %+v without a size", s, err, a)
	}
	c, _ := SizeOf(a, f1, mm1, mm2)
	s, err = Summarize(Input{Bins: bins, F1: &f1, MolarMass1: &mm1, MolarMass2: &mm2})
	if err != nil || s.Size == nil || *s.Size != c {
		t.Errorf("bins with a size: %+v, %v; want size %+v", s, err, c)
	}
	if s, _ = Summarize(Input{Bins: bins, MolarMass1: &mm1, MolarMass2: &mm2}); s.Size != nil {
		t.Errorf("no F1: size %+v, want none", s.Size)
	}
	a, _ = SliceAverages([]float64{1e4, 2e4, 4e4}, []float64{1, 2, 1})
	if s, err = Summarize(Input{Slices: slices}); err != nil || s.Averages != a {
		t.Errorf("slices: %+v, %v; want %+v", s, err, a)
	}
	bad := -1.0
	for _, tc := range []struct {
		in    Input
		field string
		err   error
	}{
		{Input{}, "bins", copoly.ErrOutOfRange},
		{Input{Bins: bins, Slices: slices}, "slices", copoly.ErrOutOfRange},
		{Input{Slices: []Slice{{1e4, 1}, {-2e4, 1}}}, "slices[1].mass", copoly.ErrOutOfRange},
		{Input{Slices: []Slice{{1e4, -1}}}, "slices[0].signal", copoly.ErrOutOfRange},
		{Input{Slices: []Slice{{1e4, 0}, {2e4, 0}}}, "slices", copoly.ErrOutOfRange},
		{Input{Slices: make([]Slice, MaxAverageRows+1)}, "slices", copoly.ErrOutOfRange},
		{Input{Bins: bins, MolarMass1: &mm1}, "molarMass2", copoly.ErrOutOfRange},
		{Input{Bins: bins, MolarMass1: &mm1, MolarMass2: &bad}, "molarMass2", copoly.ErrOutOfRange},
		{Input{Bins: bins, F1: &bad, MolarMass1: &mm1, MolarMass2: &mm2}, "F1", copoly.ErrOutOfRange},
	} {
		if _, err := Summarize(tc.in); copoly.Field(err) != tc.field || !errors.Is(err, tc.err) {
			t.Errorf("Summarize(%+v) error %v, want one naming %s", tc.in, err, tc.field)
		}
	}
}
