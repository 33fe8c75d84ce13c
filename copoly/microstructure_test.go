package copoly

import (
	"errors"
	"testing"
)

// TestMicrostructureOf: the statistics at the feed are the model's own; the terminal model adds
// its run lengths and, when asked, the batch average; the other models add neither.
func TestMicrostructureOf(t *testing.T) {
	tm := Terminal{0.80, 0.15}
	ms, err := MicrostructureOf(MicrostructureInput{Model: tm, F1: 0.4, MaxLength: 7, Batch: true, Conversion: 0.8})
	if err != nil {
		t.Fatal(err)
	}
	s, _ := tm.Sequence(0.4)
	rl, _ := tm.RunLengths(0.4, 7)
	b, _ := NewBatch(tm, 0.4)
	bs, _ := b.Sequence(0.8)
	if ms.Sequence != s || ms.RunLengths == nil || !sameFloats(ms.RunLengths.Weight2, rl.Weight2) || ms.Batch == nil || *ms.Batch != bs {
		t.Errorf("terminal: %+v\nwant %+v, run lengths %+v, batch %+v", ms, s, rl, bs)
	}
	ms, _ = MicrostructureOf(MicrostructureInput{Model: tm, F1: 0.4, MaxLength: 7})
	if ms.Batch != nil {
		t.Errorf("terminal without a batch: batch %+v, want nil", ms.Batch)
	}
	for _, m := range []Model{Penultimate{0.9, 0.6, 0.2, 0.1}, Implicit{0.8, 0.15, 0.5, 2}} {
		ms, err := MicrostructureOf(MicrostructureInput{Model: m, F1: 0.4, MaxLength: 7, Batch: true, Conversion: 0.8})
		if err != nil {
			t.Fatal(err)
		}
		s, _ := m.Sequence(0.4)
		if ms.Sequence != s || ms.RunLengths != nil || ms.Batch != nil {
			t.Errorf("%v: %+v, want the sequence %+v alone", m, ms, s)
		}
	}
	for _, tc := range []struct {
		in    MicrostructureInput
		field string
	}{
		{MicrostructureInput{Model: Terminal{-1, 1}, F1: 0.4, MaxLength: 7}, "r1"},
		{MicrostructureInput{Model: tm, F1: 1.4, MaxLength: 7}, "f1"},
		{MicrostructureInput{Model: tm, F1: 0.4, MaxLength: MaxRunLength + 1}, "maxLength"},
		{MicrostructureInput{Model: tm, F1: 0.4, MaxLength: 7, Batch: true, Conversion: 1.5}, "conversion"},
		{MicrostructureInput{Model: Implicit{0.8, 0.15, 0.5, 2}, F1: 0.4, Batch: true, Conversion: -1}, "conversion"},
		// r2 = 0 with M2 in excess: the batch stops when M1 runs out (Terminal.Drift).
		{MicrostructureInput{Model: Terminal{0.5, 0}, F1: 0.3, MaxLength: 7, Batch: true, Conversion: 0.99}, "conversion"},
	} {
		if _, err := MicrostructureOf(tc.in); Field(err) != tc.field || !errors.Is(err, ErrOutOfRange) {
			t.Errorf("MicrostructureOf(%+v) error %v, want one naming %s", tc.in, err, tc.field)
		}
	}
}
