package copoly

import (
	"fmt"
	"strings"
	"testing"
)

func TestCheckRuns(t *testing.T) {
	good := []Run{{F10: 0.2, F1: 0.3}, {F10: 0.5, F1: 0.55}, {F10: 0.8, F1: 0.75}}
	plus := func(extra ...Run) []Run { return append(append([]Run(nil), good...), extra...) }
	for _, c := range []struct {
		name   string
		runs   []Run
		fields []string // the warnings' fields, in order
		text   string   // in the first warning's message
	}{
		{"good data", good, nil, ""},
		// F̄1·X = 0.287316·0.7 = 0.2011212 > f10 = 0.2 (by hand).
		{"more M1 than charged", plus(Run{F10: 0.2, Conversion: 0.7, F1: 0.287316}), []string{"runs[3].F1"}, "more M1"},
		// (1 − 0.7)·0.7 = 0.21 > 1 − 0.8 = 0.2 (by hand).
		{"more M2 than charged", plus(Run{F10: 0.8, Conversion: 0.7, F1: 0.7}), []string{"runs[3].F1"}, "more M2"},
		// 0.4·0.5 = 0.2 = f10 exactly: on the limit, no warning.
		{"at the mass-balance limit", plus(Run{F10: 0.2, Conversion: 0.5, F1: 0.4}), nil, ""},
		{"duplicated row", plus(Run{F10: 0.5, F1: 0.55}), []string{"runs[3]"}, "repeats row 2"},
		// (With no conversion this row would be the zero Run, which is skipped: see below.)
		{"pure M2 feed", plus(Run{F10: 0, Conversion: 0.05, F1: 0}), []string{"runs[3].f10"}, "only M2"},
		{"pure M1 feed", plus(Run{F10: 1, F1: 1}), []string{"runs[3].f10"}, "only M1"},
		{"no M1 found", plus(Run{F10: 0.4, F1: 0}), []string{"runs[3].F1"}, "r2"},
		{"no M2 found", plus(Run{F10: 0.4, F1: 1}), []string{"runs[3].F1"}, "r1"},
		// X = 1 with F1 = f10 (mass balance met): only the full-conversion warning.
		{"full conversion", plus(Run{F10: 0.4, Conversion: 1, F1: 0.4}), []string{"runs[3].conversion"}, "full conversion"},
		// Three IUPAC-minimum feeds (Autzen et al. 2024): 0.5 and 0.5004 count as one (within
		// 0.001), and the pure feed does not count.
		{"two feeds", []Run{{F10: 0.5, F1: 0.55}, {F10: 0.5004, F1: 0.551}, {F10: 0.8, F1: 0.75}, {F10: 1, F1: 1}},
			[]string{"runs[3].f10", "runs"}, "only M1"},
		{"no runs", nil, []string{"runs"}, "0 different feeds"},
		// Zero Runs (rows ConvertRuns could not convert) are skipped.
		{"bad rows skipped", plus(Run{}, Run{}), nil, ""},
	} {
		t.Run(c.name, func(t *testing.T) {
			w := CheckRuns(c.runs)
			var fields []string
			for _, x := range w {
				fields = append(fields, x.Field)
				// Row and Field agree: −1 with "runs", else the field's index.
				if (x.Row == -1) != (x.Field == "runs") || (x.Row >= 0 && !strings.HasPrefix(x.Field, fmt.Sprintf("runs[%d]", x.Row))) {
					t.Errorf("warning %+v: row and field disagree", x)
				}
			}
			if strings.Join(fields, " ") != strings.Join(c.fields, " ") {
				t.Fatalf("CheckRuns(%v) warned about %q, want %q: %+v", c.runs, fields, c.fields, w)
			}
			if c.text != "" && !strings.Contains(w[0].Message, c.text) {
				t.Errorf("CheckRuns(%v) message %q does not contain %q", c.runs, w[0].Message, c.text)
			}
			if len(w) > 0 && w[0].Row >= 0 && !strings.HasPrefix(w[0].Message, "row 4: ") {
				t.Errorf("message %q does not start with the row counted from 1", w[0].Message)
			}
		})
	}
}
