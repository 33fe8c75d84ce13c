package plan

import (
	"math"
	"slices"
	"strings"
	"testing"

	"copoly/copoly"
)

// TestMakeProcessData: monomers named as in the built-in list lend their heats (unless given),
// their densities (liquids only) and their hazard classes; a name not in the list is noted. The
// plan is otherwise the one made with those values written in.
func TestMakeProcessData(t *testing.T) {
	sty, _ := copoly.PropertiesOf("styrene")
	nba, _ := copoly.PropertiesOf("n-butyl acrylate")
	bd, _ := copoly.PropertiesOf("1,3-butadiene")
	if bd.State != copoly.StateGas || sty.State != copoly.StateLiquid || nba.State != copoly.StateLiquid {
		t.Fatal("the built-in list no longer has styrene and n-butyl acrylate as liquids and 1,3-butadiene as a gas; pick others")
	}
	in := stBA(ModeSemibatch)
	in.RateConstant, in.BatchMass = 0.01, 2500
	named := in
	named.Monomer1, named.Monomer2 = "styrene", "n-butyl acrylate"
	p, err := Make(named)
	if err != nil {
		t.Fatal(err)
	}
	written := in
	written.Heat1, written.Heat2 = &sty.HeatOfPolymerization, &nba.HeatOfPolymerization
	written.Density1, written.Density2 = sty.Density, nba.Density
	want, _ := Make(written)
	if p.Safety.Heat != want.Safety.Heat || p.Safety.Rise != want.Safety.Rise || p.Volume1 != want.Volume1 || p.Volume2 != want.Volume2 {
		t.Errorf("named: heat %v, rise %v, volumes %v, %v; written in: %v, %v, %v, %v",
			p.Safety.Heat, p.Safety.Rise, p.Volume1, p.Volume2, want.Safety.Heat, want.Safety.Rise, want.Volume1, want.Volume2)
	}
	if math.Abs(p.Volume1-p.Charge1/sty.Density) > 1e-12 || math.IsNaN(p.Safety.Heat) {
		t.Errorf("volume1 %v, want charge / density = %v; heat %v", p.Volume1, p.Charge1/sty.Density, p.Safety.Heat)
	}
	if h := p.Safety.Hazards; len(h) != 2 || h[0].Monomer != "styrene" || !slices.Equal(h[0].Hazards, sty.Hazards) || h[1].Monomer != "n-butyl acrylate" {
		t.Errorf("hazards %+v, want styrene's then n-butyl acrylate's", h)
	}
	// A heat given, even 0 (not known), overrides the library's.
	zero := 0.0
	named.Heat2 = &zero
	if p, _ = Make(named); !math.IsNaN(p.Safety.Heat) {
		t.Errorf("heat2 given as 0: heat %v, want NaN (not known)", p.Safety.Heat)
	}
	// A gas has no volume; a name not in the list is noted and lends nothing.
	named = in
	named.Monomer1, named.Monomer2 = "1,3-butadiene", "no such monomer"
	p, err = Make(named)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(p.Volume1) || !math.IsNaN(p.Volume2) || len(p.Safety.Hazards) != 1 || len(p.Notes) == 0 ||
		!strings.Contains(p.Notes[len(p.Notes)-1], `monomer2 "no such monomer" is not in the built-in list`) {
		t.Errorf("gas and unknown name: volumes %v, %v, hazards %+v, notes %q", p.Volume1, p.Volume2, p.Safety.Hazards, p.Notes)
	}
}

// TestMakeBand: with a region, Make adds BandOf's band over it, 500 samples by default.
func TestMakeBand(t *testing.T) {
	region := [][2]float64{{0.75, 0.13}, {0.85, 0.13}, {0.85, 0.17}, {0.75, 0.17}}
	in := stBA(ModeBatch)
	in.Steps = 40
	p, err := Make(in)
	if err != nil || p.Band != nil {
		t.Fatalf("no region: band %+v, %v", p.Band, err)
	}
	want, err := BandOf(in, p, region, DefaultBandSamples, 7)
	if err != nil {
		t.Fatal(err)
	}
	in.Region, in.Seed = region, 7
	if p, err = Make(in); err != nil || p.Band == nil || p.Band.Samples != 500 || !slices.Equal(p.Band.CumHigh, want.CumHigh) {
		t.Errorf("band %+v, %v; want %+v", p.Band, err, want)
	}
	in.Samples = 9
	if _, err := Make(in); copoly.Field(err) != "samples" {
		t.Errorf("9 samples: error %v, want one naming samples", err)
	}
}
