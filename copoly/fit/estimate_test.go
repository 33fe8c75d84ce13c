package fit

import (
	"slices"
	"testing"

	"copoly/copoly"
)

func TestEstimateRunsEveryMethod(t *testing.T) {
	runs := simulatedRuns(copoly.Terminal{R1: 0.52, R2: 0.46}, 0.01, 21)
	e, err := Estimate(runs, 0.95)
	if err != nil {
		t.Fatal(err)
	}
	if e.FinemanRoss == nil || e.InvertedFinemanRoss == nil || e.KelenTudos == nil || e.ExtendedKelenTudos == nil || e.MayoLewis == nil || e.Nonlinear == nil || e.SwappedFinemanRoss == nil {
		t.Fatalf("missing a method: %+v", e)
	}
	if e.EVM != nil || e.Recommended != MethodNonlinear {
		t.Errorf("no uncertainties given, yet EVM %v, recommended %s", e.EVM != nil, e.Recommended)
	}
	var linearFlag, evmNote bool
	for _, w := range e.Warnings {
		linearFlag = linearFlag || (w.Method == MethodLinear && w.Row == -1 && w.Code == copoly.CodeHighConversion)
		evmNote = evmNote || (w.Method == MethodEVM && w.Code == copoly.CodeNoUncertainties)
		if !slices.Contains(copoly.Codes(), w.Code) {
			t.Errorf("warning %+v has a code not in copoly.Codes()", w)
		}
	}
	if !linearFlag || !evmNote {
		t.Errorf("warnings %v: want the high-conversion flag of the linear methods and why EVM did not run", e.Warnings)
	}
	for i := range runs {
		runs[i].SF, runs[i].SX, runs[i].Sf = 0.01, 0.005, 0.002
	}
	e, err = Estimate(runs, 0.9)
	if err != nil {
		t.Fatal(err)
	}
	if e.EVM == nil || e.Recommended != MethodEVM || e.Nonlinear.Region.Level != 0.9 {
		t.Errorf("with all uncertainties: EVM %v, recommended %s, level %v", e.EVM != nil, e.Recommended, e.Nonlinear.Region.Level)
	}
}

func TestEstimateFlagsResidualTrend(t *testing.T) {
	// A systematic error growing with conversion (for example residual monomer counted as
	// polymer) cannot be absorbed by the ratios and shows as a residual trend with X.
	m := copoly.Terminal{R1: 0.52, R2: 0.46}
	var runs []copoly.Run
	for _, f := range []float64{0.2, 0.4, 0.6, 0.8} {
		for _, x := range []float64{0.05, 0.2, 0.4, 0.6} {
			runs = append(runs, copoly.Run{F10: f, Conversion: x, F1: m.Cumulative(f, x) + 0.05*(x-0.3)})
		}
	}
	e, err := Estimate(runs, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !e.TrendConversion.Flagged || e.TrendConversion.Slope <= 0 {
		t.Errorf("trend with X = %+v, want a flagged positive slope", e.TrendConversion)
	}
	// Clean data show no trend.
	e, _ = Estimate(simulatedRuns(m, 0.01, 4), 0)
	if e.TrendConversion.Flagged && e.TrendConversion.PValue < 0.001 {
		t.Errorf("clean data flagged: %+v", e.TrendConversion)
	}
}
