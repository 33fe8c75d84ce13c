package plan

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"copoly/copoly"
)

// stBA is styrene (M1)/n-butyl acrylate (M2) with the handbook pair 0.80/0.15 (Polymer Handbook
// 4th ed., Greenley table) and molar masses from the formulas C8H8 and C7H12O2.
func stBA(mode string) Input {
	return Input{Model: copoly.Terminal{R1: 0.80, R2: 0.15}, TargetF1: 0.5, MolarMass1: 104.152, MolarMass2: 128.171,
		PolymerMass: 1000, Mode: mode}
}

// checkMassBalance checks, at every row, charged + fed = polymer + unreacted for each monomer
// (the monomer balance that defines the plan).
func checkMassBalance(t *testing.T, in Input, p *Recipe) {
	t.Helper()
	for i, r := range p.Schedule {
		unit := func(F float64) float64 { return F*in.MolarMass1 + (1-F)*in.MolarMass2 }
		poly := r.Polymer / unit(r.Cum)
		inv := r.Inventory / unit(r.Feed)
		in1 := p.Charge1 + r.Fed1
		out1 := (poly*r.Cum + inv*r.Feed) * in.MolarMass1
		in2 := p.Charge2 + r.Fed2
		out2 := (poly*(1-r.Cum) + inv*(1-r.Feed)) * in.MolarMass2
		if math.Abs(in1-out1) > 1e-9*in.PolymerMass || math.Abs(in2-out2) > 1e-9*in.PolymerMass {
			t.Fatalf("%s row %d: M1 in %v out %v; M2 in %v out %v", p.Mode, i, in1, out1, in2, out2)
		}
	}
	last := p.Schedule[len(p.Schedule)-1]
	if math.Abs(last.Polymer-in.PolymerMass) > 1e-6*in.PolymerMass {
		t.Errorf("%s: plan ends with %v g of polymer, want %v", p.Mode, last.Polymer, in.PolymerMass)
	}
}

func TestPlanSemibatchFasterMonomer(t *testing.T) {
	in := stBA(ModeSemibatch)
	in.RateConstant = 0.01
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	checkMassBalance(t, in, p)
	// Styrene enters faster (F1 > f1* at this target), so only styrene is metered, in a
	// constant ratio to the polymer formed: (F1* − f1*)/(1 − f1*) mol per mol (the balance
	// d(N1/N2) = 0, by hand).
	want := (0.5 - p.StartF1) / (1 - p.StartF1)
	if p.FeedF1 != 1 || math.Abs(p.FeedPerPolymer-want) > 1e-12 || p.Schedule[len(p.Schedule)-1].Fed2 != 0 {
		t.Errorf("stream %v, %v mol/mol; want pure M1 at %v", p.FeedF1, p.FeedPerPolymer, want)
	}
	// An independent integration of the reactor balances with the planned additions holds the
	// composition at the target.
	inst, cum := in.simulate(p, in.additions(p), in.Model, 4)
	for i := range inst {
		if math.Abs(inst[i]-0.5) > 1e-9 || math.Abs(cum[i]-0.5) > 1e-9 {
			t.Fatalf("row %d: simulated F1 %v, F̄1 %v", i, inst[i], cum[i])
		}
	}
	// Pump rates are positive and finite once the time axis exists.
	if r := p.Schedule[10]; !(r.Pump1 > 0) || r.Pump2 != 0 || !(r.Time > 0) {
		t.Errorf("row 10: time %v, pumps %v %v", r.Time, r.Pump1, r.Pump2)
	}
	if p.Shots != nil || !(p.Charge1 > 0 && p.Charge2 > 0) {
		t.Errorf("charge %v %v, shots %v", p.Charge1, p.Charge2, p.Shots)
	}
}

func TestPlanStarvedMixture(t *testing.T) {
	in := stBA(ModeSemibatch)
	in.Feed = FeedMixture
	in.RateConstant = 0.02
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	checkMassBalance(t, in, p)
	// A mixture at the copolymer composition is fed mole for mole with the polymer formed, so
	// the inventory stays at the initial charge and time is linear: t = n/(k N0).
	if p.FeedPerPolymer != 1 || math.Abs(p.Schedule[0].Inventory-p.Schedule[len(p.Schedule)-1].Inventory) > 1e-9 {
		t.Errorf("a = %v, inventory %v → %v", p.FeedPerPolymer, p.Schedule[0].Inventory, p.Schedule[len(p.Schedule)-1].Inventory)
	}
	// Final conversion 0.95 by default: heel N0 = nP(1/0.95 − 1).
	if last := p.Schedule[len(p.Schedule)-1]; math.Abs(last.Conversion-0.95) > 1e-12 {
		t.Errorf("final conversion %v, want 0.95", last.Conversion)
	}
	inv, fstar, err := StarvedFeed(in.Model, 0.5, 10, 0.02, in.MolarMass1, in.MolarMass2)
	// 10 g/min of a 50/50 mixture (116.16 g/mol) is 0.08609 mol/min; at k = 0.02/min the
	// inventory is 4.304 mol at f1* (by hand from the quasi-steady state k·N = feed).
	wantN := 10 / (0.5*104.152 + 0.5*128.171) / 0.02
	if err != nil || math.Abs(inv-wantN*(fstar*104.152+(1-fstar)*128.171)) > 1e-9 {
		t.Errorf("StarvedFeed = %v, %v, %v", inv, fstar, err)
	}
}

func TestPlanNoCorrectionNeeded(t *testing.T) {
	// r1 = r2 = 1: the feed equals the copolymer, nothing needs adding (closed form).
	in := stBA(ModeSemibatch)
	in.Model = copoly.Terminal{R1: 1, R2: 1}
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	if last := p.Schedule[len(p.Schedule)-1]; last.Fed1 != 0 || last.Fed2 != 0 || p.StartF1 != 0.5 {
		t.Errorf("r = 1: fed %v %v, start %v", last.Fed1, last.Fed2, p.StartF1)
	}
	// A target at the azeotrope: the batch does not drift (St/AN 0.40/0.04, Polymer Handbook
	// table; azeotrope (1 − r2)/(2 − r1 − r2)).
	in = stBA(ModeBatch)
	in.Model = copoly.Terminal{R1: 0.40, R2: 0.04}
	in.TargetF1, _ = in.Model.Azeotrope()
	p, err = Make(in)
	if err != nil {
		t.Fatal(err)
	}
	if p.MaxDeviation > 1e-9 || math.Abs(p.ProductF1-in.TargetF1) > 1e-9 {
		t.Errorf("azeotropic batch: deviation %v, product %v", p.MaxDeviation, p.ProductF1)
	}
	checkMassBalance(t, in, p)
}

func TestPlanBatch(t *testing.T) {
	in := stBA(ModeBatch)
	in.HalfLife = 60
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	checkMassBalance(t, in, p)
	b, _ := copoly.NewBatch(in.Model, p.StartF1)
	lim, _ := b.ConversionLimit(0.02)
	if math.Abs(p.StopConversion-lim) > 1e-12 || math.Abs(p.ProductF1-0.5) > 0.02+1e-9 {
		t.Errorf("stop %v (limit %v), product %v", p.StopConversion, lim, p.ProductF1)
	}
	// First order: t = −ln(1 − X)/k with k = ln 2/60 min.
	last := p.Schedule[len(p.Schedule)-1]
	if want := -math.Log1p(-last.Conversion) * 60 / math.Ln2; math.Abs(last.Time-want) > 1e-9 {
		t.Errorf("time %v, want %v", last.Time, want)
	}
}

func TestPlanShots(t *testing.T) {
	in := stBA(ModeShots)
	in.Tolerance = 0.01
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	checkMassBalance(t, in, p)
	if p.MaxDeviation > 0.01 || len(p.Shots) == 0 {
		t.Fatalf("%d shots, deviation %v", len(p.Shots), p.MaxDeviation)
	}
	// The fewest: one shot fewer breaks the tolerance.
	in2 := in
	in2.Shots = len(p.Shots) - 1
	if in2.Shots > 0 {
		q, err := Make(in2)
		if err != nil {
			t.Fatal(err)
		}
		if q.MaxDeviation <= 0.01 {
			t.Errorf("%d shots already hold ±0.01 (deviation %v)", in2.Shots, q.MaxDeviation)
		}
	}
	// Shots replay through the independent reactor integration.
	inst, _ := in.simulate(p, in.additions(p), in.Model, 8)
	for i := range inst {
		if math.Abs(inst[i]-p.Schedule[i].Inst) > 1e-6 {
			t.Fatalf("row %d: simulated F1 %v, plan %v", i, inst[i], p.Schedule[i].Inst)
		}
	}
}

func TestPlanSafety(t *testing.T) {
	in := stBA(ModeBatch)
	in.Heat1, in.Heat2 = ptr(70), ptr(78) // kJ/mol, styrene and n-butyl acrylate (from memory of handbook tables)
	in.BatchMass, in.HeatCapacity, in.RiseLimit = 5000, 2, 50
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	s := p.Safety
	// The largest inventory of a batch is the charge: ΔT = Σ n_i ΔH_i / (m c_p), by hand.
	want := (p.Moles1*70 + p.Moles2*78) * 1000 / (5000 * 2)
	if math.Abs(s.InventoryMax-(p.Charge1+p.Charge2)) > 1e-9 || math.Abs(s.Rise-want) > 1e-9 || s.Flagged != (want > 50) {
		t.Errorf("safety %+v, want rise %v", s, want)
	}
	in.Heat1 = ptr(0)
	p, _ = Make(in)
	if !math.IsNaN(p.Safety.Rise) {
		t.Errorf("no heat given, yet rise %v", p.Safety.Rise)
	}
}

// TestPlanBandDegenerateRegion: a region with no or next to no area is an error naming jcr,
// reached after a bounded number of tries, and too many samples of too long a schedule one
// naming samples. Before the area check and the work budget, 4096
// points on a line with 5000 samples made BandOf try 5 million points against a
// 4096-edge polygon (minutes in the browser) before giving up.
func TestPlanBandDegenerateRegion(t *testing.T) {
	in := stBA(ModeSemibatch)
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	line := make([][2]float64, 4096)
	for i := range line {
		line[i] = [2]float64{0.5 + float64(i)*1e-4, 0.1 + float64(i)*1e-4}
	}
	// A sliver: a triangle whose area is a millionth of its bounding box, inside the budget's
	// reach for a few samples but not for MaxBandSamples.
	sliver := [][2]float64{{0.7, 0.1}, {0.9, 0.3}, {0.9, 0.3 - 2e-7}}
	for _, c := range []struct {
		name   string
		region [][2]float64
		text   string
	}{
		{"points on a line", line, "no area"},
		{"one point repeated", [][2]float64{{0.8, 0.15}, {0.8, 0.15}, {0.8, 0.15}}, "no area"},
		{"a sliver", sliver, "too thin"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := BandOf(in, p, c.region, MaxBandSamples, 1)
			if copoly.Field(err) != "jcr" || !errors.Is(err, copoly.ErrOutOfRange) || !strings.Contains(fmt.Sprint(err), c.text) {
				t.Errorf("BandOf(%s) error %v, want one naming jcr saying %q", c.name, err, c.text)
			}
		})
	}
	// Samples times schedule rows is bounded: the most samples with the most steps is refused
	// by name, and the most samples with the default steps, or the default samples with the most
	// steps, are allowed.
	in.Steps = MaxSteps
	long, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	sq := [][2]float64{{0.79, 0.149}, {0.81, 0.149}, {0.81, 0.151}, {0.79, 0.151}}
	if _, err := BandOf(in, long, sq, MaxBandSamples, 1); copoly.Field(err) != "samples" || !errors.Is(err, copoly.ErrTooMany) {
		t.Errorf("BandOf(%d samples, %d rows) error %v, want ErrTooMany naming samples", MaxBandSamples, len(long.Schedule), err)
	}
	if _, err := BandOf(in, long, sq, 500, 1); err != nil {
		t.Errorf("BandOf(500 samples, %d rows) error %v", len(long.Schedule), err)
	}
	in.Steps = 0
	if _, err := BandOf(in, p, sq, MaxBandSamples, 1); err != nil {
		t.Errorf("BandOf(%d samples, %d rows) error %v", MaxBandSamples, len(p.Schedule), err)
	}

	// polygonArea of the unit square, and of the square traced in the other direction
	// (shoelace formula, by hand).
	unit := [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}}
	if a, b := polygonArea(unit), polygonArea([][2]float64{{0, 1}, {1, 1}, {1, 0}, {0, 0}}); a != 1 || b != 1 {
		t.Errorf("polygonArea(unit square) = %v and %v reversed, want 1", a, b)
	}
}

func TestPlanBand(t *testing.T) {
	in := stBA(ModeSemibatch)
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	// A small square region around the plan's own ratios: the band holds the target.
	sq := [][2]float64{{0.79, 0.149}, {0.81, 0.149}, {0.81, 0.151}, {0.79, 0.151}}
	b, err := BandOf(in, p, sq, 100, 1)
	if err != nil {
		t.Fatal(err)
	}
	last := len(p.Schedule) - 1
	if !(b.CumLow[last] <= 0.5 && b.CumHigh[last] >= 0.5) || b.CumHigh[last]-b.CumLow[last] > 0.02 {
		t.Errorf("product band [%v, %v]", b.CumLow[last], b.CumHigh[last])
	}
	// A region away from the plan's ratios moves the product off target.
	far := [][2]float64{{1.5, 0.1}, {1.6, 0.1}, {1.6, 0.11}, {1.5, 0.11}}
	b, _ = BandOf(in, p, far, 50, 1)
	if b.ProductLow <= 0.5 {
		t.Errorf("far ratios: product band [%v, %v], want above the target", b.ProductLow, b.ProductHigh)
	}
	if _, err := BandOf(in, p, sq[:2], 100, 1); copoly.Field(err) != "jcr" {
		t.Errorf("two points: %v", err)
	}
}

func TestPlanValidates(t *testing.T) {
	for _, tc := range []struct {
		name  string
		edit  func(*Input)
		field string
	}{
		{"mode", func(in *Input) { in.Mode = "fed" }, "mode"},
		{"target 1", func(in *Input) { in.TargetF1 = 1 }, "targetF1"},
		{"polymer mass", func(in *Input) { in.PolymerMass = -5 }, "polymerMass"},
		{"molar mass", func(in *Input) { in.MolarMass2 = 0 }, "molarMass2"},
		{"tolerance", func(in *Input) { in.Tolerance = 0.7 }, "tolerance"},
		{"final conversion", func(in *Input) { in.FinalConversion = 1 }, "finalConversion"},
		{"feed", func(in *Input) { in.Feed = "drip" }, "feed"},
		{"steps", func(in *Input) { in.Steps = MaxSteps + 1 }, "steps"},
		{"time table order", func(in *Input) { in.TimeTable = [][2]float64{{0, 0}, {10, 0.3}, {5, 0.4}} }, "timeTable[2]"},
		{"heat", func(in *Input) { in.Heat1 = ptr(-1) }, "heat1"},
		{"unreachable", func(in *Input) { in.Model = copoly.Terminal{R1: 0, R2: 0.5}; in.TargetF1 = 0.8 }, "targetF1"},
	} {
		in := stBA(ModeSemibatch)
		tc.edit(&in)
		if _, err := Make(in); copoly.Field(err) != tc.field {
			t.Errorf("%s: error %v (field %q), want %q", tc.name, err, copoly.Field(err), tc.field)
		}
	}
	in := stBA(ModeSemibatch)
	in.Model = copoly.Terminal{R1: 0, R2: 0.5}
	in.TargetF1 = 0.8
	if _, err := Make(in); !errors.Is(err, copoly.ErrUnreachable) {
		t.Errorf("unreachable target: %v", err)
	}
}

func TestPlanShotsTooFewAndVolumes(t *testing.T) {
	in := stBA(ModeShots)
	in.FinalConversion = 0.99
	in.Shots = 1
	if _, err := Make(in); copoly.Field(err) != "shots" {
		t.Errorf("one shot to 99 %%: error %v, want field shots", err)
	}
	in = stBA(ModeSemibatch)
	in.Density1, in.Density2 = 0.9059, 0.8986 // g/mL at 20 °C, Merck-Index-style entries
	p, err := Make(in)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(p.Volume1-p.Charge1/0.9059) > 1e-12 || math.Abs(p.Volume2-p.Charge2/0.8986) > 1e-12 {
		t.Errorf("volumes %v %v", p.Volume1, p.Volume2)
	}
	in.Heat2 = ptr(2000)
	if _, err := Make(in); copoly.Field(err) != "heat2" {
		t.Errorf("heat2 2000: %v", err)
	}
}

// ptr returns a pointer to v, for the optional inputs of a plan.
func ptr(v float64) *float64 { return &v }
