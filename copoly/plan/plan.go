package plan

import (
	"fmt"
	"math"
	"sort"

	"copoly/copoly"
)

// Plan modes, for [Input.Mode].
const (
	ModeBatch     = "batch"
	ModeSemibatch = "semibatch"
	ModeShots     = "shots"
)

// Feeds of a semi-batch plan, for [Input.Feed].
const (
	FeedFaster  = "faster"  // meter only the monomer consumed faster
	FeedMixture = "mixture" // meter a mixture of both monomers
)

// Limits of a plan.
const (
	MaxSteps    = 2000
	MaxShots    = 500
	MaxTimeRows = 1000
)

// Input describes what the chemist wants to make and how.
type Input struct {
	Model copoly.Terminal
	// TargetF1 is the wanted mole fraction of M1 in the copolymer.
	TargetF1 float64
	// MolarMass1 and MolarMass2 are the monomer molar masses in g/mol.
	MolarMass1, MolarMass2 float64
	// PolymerMass is the mass of copolymer to make, in g.
	PolymerMass float64
	// Mode is ModeBatch, ModeSemibatch or ModeShots.
	Mode string
	// Tolerance is the allowed deviation of the copolymer composition from TargetF1 (mole
	// fraction); 0 means 0.02. It sets the batch's stopping conversion and the number of shots.
	Tolerance float64
	// StopConversion is the overall molar conversion at which a batch is stopped; 0 means the
	// largest conversion whose product stays within Tolerance ([copoly.Batch.ConversionLimit]).
	StopConversion float64
	// FinalConversion is the overall molar conversion of all the monomer charged and fed at the
	// end of a semi-batch or shot plan; it sets the size of the initial charge. 0 means 0.95.
	FinalConversion float64
	// Feed is FeedFaster (default) or FeedMixture for a semi-batch plan; FeedF1 is the mole
	// fraction of M1 in a metered mixture (0 means the copolymer composition TargetF1, the
	// starved-feed case).
	Feed   string
	FeedF1 float64
	// Shots is the number of shot additions; 0 means the fewest that keep the instantaneous
	// composition within Tolerance.
	Shots int
	// Steps is the number of schedule rows after the start; 0 means 200.
	Steps int
	// Time: RateConstant is an apparent first-order rate constant of polymerization in 1/min
	// (Rp = k·N, N the unreacted monomer), or HalfLife in min (k = ln 2/HalfLife), or TimeTable
	// a measured table of (time in min, overall molar conversion) rows, increasing. All zero:
	// no time axis.
	RateConstant, HalfLife float64
	TimeTable              [][2]float64
	// Safety: Heat1 and Heat2 are the heats of polymerization −ΔHp of M1 and M2 in kJ/mol, 0
	// when not known; nil takes the heat of the built-in monomer Monomer1 or Monomer2 names, if
	// any. BatchMass is the mass of the reactor contents in g for the adiabatic temperature rise
	// (0: the monomer and polymer of the plan alone, a bulk process); HeatCapacity in J/(g·K), 0
	// means 2.0; RiseLimit the adiabatic rise in K above which the plan is flagged, 0 means 50.
	Heat1, Heat2                       *float64
	BatchMass, HeatCapacity, RiseLimit float64
	// Density1 and Density2 are the liquid densities of the monomers in g/mL for the volumes of
	// the charge; 0 takes the density of the built-in monomer Monomer1 or Monomer2 names when it
	// is a liquid, and otherwise means not known (or not a liquid): no volume.
	Density1, Density2 float64
	// Monomer1 and Monomer2 name the monomers as the built-in list does ([copoly.Monomers]);
	// "" names none. A built-in monomer lends its process data ([copoly.PropertiesOf]): its heat
	// of polymerization when Heat1 or Heat2 is nil, its density when Density1 or Density2 is 0,
	// and its hazard classes ([Safety.Hazards]). A name not in the list adds a note saying that
	// nothing was taken for it.
	Monomer1, Monomer2 string
	// Region, when it has points, is the joint confidence region of the ratios, a closed polygon
	// of (r1, r2) points as [copoly/copoly/fit.LeastSquares] traces it: [Make] then adds the band
	// of the plan over it ([Recipe.Band], see [BandOf]) from Samples pairs (0 means 500) drawn
	// with the seed Seed.
	Region  [][2]float64
	Samples int
	Seed    uint64

	// heat1, heat2 are the heats used, set by Make from Heat1, Heat2 and the monomers named.
	heat1, heat2 float64
}

// Row is one row of a plan's schedule. Masses are in g, cumulative since the start.
type Row struct {
	// Conversion is the overall molar conversion of the monomer charged and fed so far.
	Conversion float64
	// Polymer is the mass of copolymer formed so far.
	Polymer float64
	// Fed1 and Fed2 are the masses of M1 and M2 added after the initial charge.
	Fed1, Fed2 float64
	// Feed, Inst and Cum are the unreacted feed f1, the instantaneous copolymer F1 and the
	// cumulative copolymer F̄1.
	Feed, Inst, Cum float64
	// Inventory is the mass of unreacted monomer in the reactor.
	Inventory float64
	// Time in min since the start, and the pump rates of M1 and M2 in g/min over the step that
	// ends at this row; NaN without a time axis.
	Time, Pump1, Pump2 float64
}

// Shot is one shot addition of a shot plan.
type Shot struct {
	// Polymer is the mass of copolymer formed when the shot is added (g); Mass1 and Mass2 the
	// masses added (g); Time the time (min, NaN without a time axis).
	Polymer, Mass1, Mass2, Time float64
}

// Safety holds a plan's safety figures.
type Safety struct {
	// InventoryMax is the largest mass of unreacted monomer over the plan (g), reached at
	// polymer mass InventoryAt (g).
	InventoryMax, InventoryAt float64
	// Heat is the heat the largest inventory would release on polymerizing (kJ), and Rise the
	// adiabatic temperature rise it would cause in the batch (K); NaN when a heat of
	// polymerization is not known.
	Heat, Rise float64
	// RiseLimit is the limit applied, and Flagged reports Rise above it.
	RiseLimit float64
	Flagged   bool
	// BatchMass and HeatCapacity are the values used.
	BatchMass, HeatCapacity float64
	// Hazards lists the hazard classes of the built-in monomers the input names, M1 first.
	Hazards []MonomerHazards
}

// MonomerHazards are the hazard classes of one monomer ([copoly.Properties.Hazards]).
type MonomerHazards struct {
	Monomer string
	Hazards []string
}

// Recipe is a recipe and schedule: the charge, the schedule of additions and the figures of one plan.
type Recipe struct {
	Mode string
	// StartF1 is the feed composition f1 of the initial charge (the feed giving TargetF1).
	StartF1 float64
	// Charge1 and Charge2 are the masses of M1 and M2 charged at the start (g); Moles1, Moles2
	// the same in mol; Volume1, Volume2 in mL at [Input.Density1] and Density2 (NaN when a
	// density is not given).
	Charge1, Charge2, Moles1, Moles2, Volume1, Volume2 float64
	// Total1 and Total2 are all the M1 and M2 used, charged plus fed (g).
	Total1, Total2 float64
	// FeedF1 is the composition of the metered stream (semi-batch), FeedPerPolymer the moles fed
	// per mole of polymer formed.
	FeedF1, FeedPerPolymer float64
	// StopConversion is the batch's final conversion; ProductF1 the composition of the whole
	// product; MaxDeviation the largest |F1 − TargetF1| of the polymer made.
	StopConversion, ProductF1, MaxDeviation float64
	Schedule                                []Row
	Shots                                   []Shot
	// Distribution is the composition distribution of the product (drift only).
	Distribution copoly.Histogram
	Safety       Safety
	// RateConstant is the rate constant used for the time axis (1/min), NaN without one.
	RateConstant float64
	// Band is the spread of the plan's outcome over the region of [Input.Region], or nil
	// without one.
	Band  *Band
	Notes []string
}

func (in *Input) validate() error {
	if err := in.Model.Validate(); err != nil {
		return err
	}
	if err := copoly.CheckFraction("targetF1", in.TargetF1); err != nil {
		return err
	}
	if in.TargetF1 == 0 || in.TargetF1 == 1 {
		return &copoly.InputError{Field: "targetF1", Value: in.TargetF1, Reason: "a copolymer needs both monomers: choose a target strictly between 0 and 1", Err: copoly.ErrOutOfRange}
	}
	if err := copoly.CheckMolarMass("molarMass1", in.MolarMass1); err != nil {
		return err
	}
	if err := copoly.CheckMolarMass("molarMass2", in.MolarMass2); err != nil {
		return err
	}
	if err := copoly.CheckFinite("polymerMass", in.PolymerMass); err != nil {
		return err
	}
	if in.PolymerMass <= 0 || in.PolymerMass > 1e9 {
		return &copoly.InputError{Field: "polymerMass", Value: in.PolymerMass, Reason: "the amount of polymer must be positive, in g (at most 10⁹ g)", Err: copoly.ErrOutOfRange}
	}
	switch in.Mode {
	case ModeBatch, ModeSemibatch, ModeShots:
	default:
		return &copoly.FieldError{Field: "mode", Reason: fmt.Sprintf("%q is not a plan mode: use batch, semibatch or shots", in.Mode), Err: copoly.ErrOutOfRange}
	}
	type rng struct {
		field  string
		v      *float64
		def    float64
		lo, hi float64
		open   bool
		why    string
	}
	for _, r := range []rng{
		{"tolerance", &in.Tolerance, 0.02, 0, 0.5, true, "a composition tolerance must be above 0 and at most 0.5"},
		{"stopConversion", &in.StopConversion, 0, 0, 1, false, "a stopping conversion must lie between 0 and 1"},
		{"finalConversion", &in.FinalConversion, 0.95, 0, 1, true, "the final conversion must be above 0 and below 1"},
		{"heatCapacity", &in.HeatCapacity, 2.0, 0, 100, true, "a heat capacity must be positive, in J/(g·K)"},
		{"riseLimit", &in.RiseLimit, 50, 0, 1e4, true, "the limit on the adiabatic rise must be positive, in K"},
	} {
		if err := copoly.CheckFinite(r.field, *r.v); err != nil {
			return err
		}
		if *r.v == 0 {
			*r.v = r.def
			continue
		}
		if *r.v < r.lo || *r.v > r.hi || (r.open && *r.v <= r.lo) || (r.field == "finalConversion" && *r.v >= 1) {
			return &copoly.InputError{Field: r.field, Value: *r.v, Reason: r.why, Err: copoly.ErrOutOfRange}
		}
	}
	for _, r := range []struct {
		field string
		v     float64
	}{{"heat1", orZero(in.Heat1)}, {"heat2", orZero(in.Heat2)}, {"batchMass", in.BatchMass}, {"rateConstant", in.RateConstant}, {"halfLife", in.HalfLife}, {"feedF1", in.FeedF1}} {
		if err := copoly.CheckFinite(r.field, r.v); err != nil {
			return err
		}
		if r.v < 0 {
			return &copoly.InputError{Field: r.field, Value: r.v, Reason: "cannot be negative", Err: copoly.ErrOutOfRange}
		}
	}
	for _, h := range []struct {
		field string
		v     float64
	}{{"heat1", orZero(in.Heat1)}, {"heat2", orZero(in.Heat2)}} {
		if h.v > 1000 {
			return &copoly.InputError{Field: h.field, Value: h.v, Reason: "a heat of polymerization is in kJ/mol, below 1000", Err: copoly.ErrOutOfRange}
		}
	}
	for _, d := range []struct {
		field string
		v     float64
	}{{"density1", in.Density1}, {"density2", in.Density2}} {
		if err := copoly.CheckFinite(d.field, d.v); err != nil {
			return err
		}
		if d.v < 0 || d.v > 25 {
			return &copoly.InputError{Field: d.field, Value: d.v, Reason: "a density is in g/mL, between 0 and 25 (0 when not known)", Err: copoly.ErrOutOfRange}
		}
	}
	if in.FeedF1 > 1 {
		return &copoly.InputError{Field: "feedF1", Value: in.FeedF1, Reason: "a mole fraction must lie between 0 and 1", Err: copoly.ErrOutOfRange}
	}
	switch in.Feed {
	case "":
		in.Feed = FeedFaster
	case FeedFaster, FeedMixture:
	default:
		return &copoly.FieldError{Field: "feed", Reason: fmt.Sprintf("%q is not a feed: use faster or mixture", in.Feed), Err: copoly.ErrOutOfRange}
	}
	if in.Steps == 0 {
		in.Steps = 200
	}
	if in.Steps < 1 || in.Steps > MaxSteps {
		return &copoly.InputError{Field: "steps", Value: float64(in.Steps), Reason: fmt.Sprintf("between 1 and %d schedule rows", MaxSteps), Err: copoly.ErrOutOfRange}
	}
	if in.Shots < 0 || in.Shots > MaxShots {
		return &copoly.InputError{Field: "shots", Value: float64(in.Shots), Reason: fmt.Sprintf("between 1 and %d shots (0 for the fewest within the tolerance)", MaxShots), Err: copoly.ErrOutOfRange}
	}
	if len(in.TimeTable) > MaxTimeRows {
		return &copoly.InputError{Field: "timeTable", Value: float64(len(in.TimeTable)), Reason: fmt.Sprintf("at most %d rows", MaxTimeRows), Err: copoly.ErrTooMany}
	}
	for i, row := range in.TimeTable {
		for k, v := range row {
			if err := copoly.CheckFinite(fmt.Sprintf("timeTable[%d][%d]", i, k), v); err != nil {
				return err
			}
		}
		if row[0] < 0 || row[1] < 0 || row[1] > 1 || (i > 0 && (row[0] <= in.TimeTable[i-1][0] || row[1] < in.TimeTable[i-1][1])) {
			return &copoly.InputError{Field: fmt.Sprintf("timeTable[%d]", i), Value: row[0], Reason: "rows must be (time ≥ 0 in min, conversion 0–1) with time increasing and conversion not decreasing", Err: copoly.ErrOutOfRange}
		}
	}
	if in.TimeTable != nil && len(in.TimeTable) < 2 {
		return &copoly.InputError{Field: "timeTable", Value: float64(len(in.TimeTable)), Reason: "a conversion–time table needs at least two rows", Err: copoly.ErrOutOfRange}
	}
	return nil
}

// unitMass returns the mean molar mass of copolymer units of composition F1.
func (in *Input) unitMass(F1 float64) float64 {
	return F1*in.MolarMass1 + (1-F1)*in.MolarMass2
}

// Make turns a target copolymer composition into a recipe and schedule (see [Input]):
//
//   - batch: the charge at the feed f1* that gives TargetF1 (Mayo–Lewis solved for the feed),
//     run to StopConversion or to the conversion limit for Tolerance, with its drift and product
//     composition distribution;
//   - semibatch: the same start, then metered monomer that holds the unreacted mixture at f1*,
//     so every increment of polymer has the composition TargetF1. With a stream of composition
//     y the moles fed per mole of polymer formed are a = (F1* − f1*)/(y − f1*): for the faster
//     monomer alone (y = 1 or 0) this is Hanna's policy, proportional to the polymer formed and
//     so needing no kinetics; for a mixture at the copolymer composition (y = F1*) a = 1, the
//     starved feed that keeps the inventory constant;
//   - shots: the same start, with the faster monomer added in shots at equal increments of
//     polymer, restoring f1* each time; the composition saw-tooths between shots.
//
// The time axis, when a rate law is given, takes Rp = k·N. The safety figures use the largest
// unreacted inventory. All the plan's mass balances close: charged + fed = polymer + unreacted
// for each monomer (tested).
//
// References:
//   - R. J. Hanna, Ind. Eng. Chem. 1957, 49, 208 (feeding the more reactive monomer to make a
//     uniform copolymer; from memory).
//   - G. Arzamendi, J. M. Asua, J. Appl. Polym. Sci. 1989, 38, 2019 (optimal monomer addition
//     policies; from memory).
//   - F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66, 1594.
func Make(in Input) (*Recipe, error) {
	if err := in.validate(); err != nil {
		return nil, err
	}
	hazards, notes := in.processData()
	sol, err := in.Model.FeedFor(in.TargetF1)
	if err != nil {
		return nil, err
	}
	p := &Recipe{Mode: in.Mode, StartF1: sol.Feeds[0], RateConstant: math.NaN()}
	if len(sol.Feeds) > 1 || (in.Model.R1 == 0 && in.Model.R2 == 0) {
		p.Notes = append(p.Notes, sol.Note)
	}
	switch {
	case in.RateConstant > 0:
		p.RateConstant = in.RateConstant
	case in.HalfLife > 0:
		p.RateConstant = math.Ln2 / in.HalfLife
	}
	switch in.Mode {
	case ModeBatch:
		err = in.batchPlan(p)
	case ModeSemibatch:
		err = in.semibatchPlan(p)
	default:
		err = in.shotPlan(p)
	}
	if err != nil {
		return nil, err
	}
	in.finish(p)
	p.Safety.Hazards = hazards
	p.Notes = append(p.Notes, notes...)
	if len(in.Region) > 0 {
		samples := in.Samples
		if samples == 0 {
			samples = DefaultBandSamples
		}
		b, err := BandOf(in, p, in.Region, samples, in.Seed)
		if err != nil {
			return nil, err
		}
		p.Band = &b
	}
	return p, nil
}

// DefaultBandSamples is the number of (r1, r2) pairs of a band when [Input.Samples] is 0.
const DefaultBandSamples = 500

// orZero returns *v, or 0 for nil.
func orZero(v *float64) float64 {
	if v == nil {
		return 0
	}
	return *v
}

// batchPlan fills p for a batch: charge at f1* and run to the stopping conversion.
func (in *Input) batchPlan(p *Recipe) error {
	m := in.Model
	b, err := copoly.NewBatch(m, p.StartF1)
	if err != nil {
		return err
	}
	x := in.StopConversion
	if x == 0 {
		lim, err := b.ConversionLimit(in.Tolerance)
		if err != nil {
			return err
		}
		x = lim
		if x >= 1 {
			x = 0.99
			p.Notes = append(p.Notes, "The product stays within the tolerance to full conversion; the plan stops at 99 %.")
		}
	}
	if x <= 0 {
		return &copoly.InputError{Field: "stopConversion", Value: x, Reason: "the batch must run to some conversion", Err: copoly.ErrOutOfRange}
	}
	if x > b.MaxConversion() {
		return &copoly.InputError{Field: "stopConversion", Value: x, Reason: fmt.Sprintf("this batch stops at X = %.4g (a monomer that cannot add to its own radical is left)", b.MaxConversion()), Err: copoly.ErrOutOfRange}
	}
	p.StopConversion = x
	xs := make([]float64, in.Steps+1)
	for i := range xs {
		xs[i] = x * float64(i) / float64(in.Steps)
	}
	d, err := b.Drift(xs)
	if err != nil {
		return err
	}
	cum := d.Cum[len(xs)-1]
	n0 := in.PolymerMass / in.unitMass(cum) / x // moles charged
	p.Moles1, p.Moles2 = n0*p.StartF1, n0*(1-p.StartF1)
	p.Schedule = make([]Row, len(xs))
	for i, xi := range xs {
		left := n0 * (1 - xi)
		poly1 := p.Moles1 - left*d.Feed[i]
		poly2 := p.Moles2 - left*(1-d.Feed[i])
		p.Schedule[i] = Row{Conversion: xi, Polymer: poly1*in.MolarMass1 + poly2*in.MolarMass2,
			Feed: d.Feed[i], Inst: d.Inst[i], Cum: d.Cum[i],
			Inventory: left * (d.Feed[i]*in.MolarMass1 + (1-d.Feed[i])*in.MolarMass2)}
		if dev := math.Abs(d.Inst[i] - in.TargetF1); dev > p.MaxDeviation && i > 0 {
			p.MaxDeviation = dev
		}
	}
	p.MaxDeviation = math.Max(p.MaxDeviation, math.Abs(d.Inst[0]-in.TargetF1))
	p.ProductF1 = cum
	h, err := b.Distribution(x, 20, in.MolarMass1, in.MolarMass2)
	if err != nil {
		return err
	}
	p.Distribution = h
	if !math.IsNaN(p.RateConstant) {
		for i := range p.Schedule {
			p.Schedule[i].Time = -math.Log1p(-xs[i]) / p.RateConstant
		}
	}
	return nil
}

// feedStream returns the composition y of the metered stream and the moles a fed per mole of
// polymer that hold the unreacted mixture at f1* (see [Make]).
func (in *Input) feedStream(fstar float64) (y, a float64, err error) {
	F := in.TargetF1
	switch {
	case math.Abs(F-fstar) < 1e-12:
		// Azeotropic target (or r1 = r2 = 1): the feed does not drift and nothing needs adding.
		return F, 0, nil
	case in.Feed == FeedMixture:
		y = in.FeedF1
		if y == 0 {
			y = F
		}
	default:
		y, a = fasterFeed(F, fstar)
		return y, a, nil
	}
	a = (F - fstar) / (y - fstar)
	if !(a >= 0) || math.IsInf(a, 0) {
		return 0, 0, &copoly.InputError{Field: "feedF1", Value: y, Reason: fmt.Sprintf("a metered mixture must be richer in the faster monomer than the reactor feed f1* = %.4g, on the side of the target %.4g", fstar, F), Err: copoly.ErrOutOfRange}
	}
	return y, a, nil
}

// semibatchPlan fills p for a semi-batch at constant composition.
func (in *Input) semibatchPlan(p *Recipe) error {
	fstar, F := p.StartF1, in.TargetF1
	y, a, err := in.feedStream(fstar)
	if err != nil {
		return err
	}
	p.FeedF1, p.FeedPerPolymer = y, a
	nP := in.PolymerMass / in.unitMass(F) // moles of polymer units at the end
	xEnd := in.FinalConversion
	if 1/xEnd-a <= 0 {
		return &copoly.InputError{Field: "finalConversion", Value: xEnd, Reason: fmt.Sprintf("with %.3g mol fed per mol of polymer the final conversion cannot exceed %.4g", a, 1/a), Err: copoly.ErrOutOfRange}
	}
	n0 := nP * (1/xEnd - a) // initial charge, mol
	p.Moles1, p.Moles2 = n0*fstar, n0*(1-fstar)
	p.Schedule = make([]Row, in.Steps+1)
	for i := range p.Schedule {
		n := nP * float64(i) / float64(in.Steps) // polymer formed, mol
		inv := n0 + (a-1)*n                      // unreacted, mol
		fed := a * n
		p.Schedule[i] = Row{Conversion: n / (n0 + fed), Polymer: n * in.unitMass(F),
			Fed1: fed * y * in.MolarMass1, Fed2: fed * (1 - y) * in.MolarMass2,
			Feed: fstar, Inst: F, Cum: F, Inventory: inv * (fstar*in.MolarMass1 + (1-fstar)*in.MolarMass2)}
		if !math.IsNaN(p.RateConstant) {
			k := p.RateConstant
			switch {
			case i == 0:
				p.Schedule[i].Time = 0
			case math.Abs(a-1) < 1e-12:
				p.Schedule[i].Time = n / (k * n0)
			default:
				p.Schedule[i].Time = math.Log(inv/n0) / (k * (a - 1))
			}
		}
	}
	p.ProductF1 = F
	p.MaxDeviation = math.Abs(in.Model.Instantaneous(fstar) - F)
	p.Distribution = copoly.HistogramOf([]float64{F}, []float64{1}, 1, "mass") // one composition: no drift
	p.StopConversion = xEnd
	return nil
}

// fasterFeed returns the stream of the faster monomer alone (y = 1 for M1, 0 for M2) and the
// moles a of it fed per mole of polymer that hold f1* (see [Make]).
func fasterFeed(F, fstar float64) (y, a float64) {
	if F > fstar {
		y = 1
	}
	return y, (F - fstar) / (y - fstar)
}

// runShots simulates a shot plan of the given number of shots and returns the schedule (rowsPer
// rows per interval between shots), the shots and the largest deviation of F1 from the target.
// Between shots the reactor is a batch: each row advances it by an equal amount of polymer with
// the Meyer–Lowry (or Skeist) solution from the row before, which is exact since the batch
// solution does not depend on where it is restarted.
func (in *Input) runShots(p *Recipe, shots, rowsPer int) ([]Row, []Shot, float64) {
	m, fstar, F := in.Model, p.StartF1, in.TargetF1
	nP := in.PolymerMass / in.unitMass(F)
	// The initial charge is that of the semi-batch plan metering the faster monomer, so the two
	// plans end with the same conversion.
	y, a := fasterFeed(F, fstar)
	n0 := nP * (1/in.FinalConversion - a)
	n1, n2 := n0*fstar, n0*(1-fstar)
	var poly1, poly2, fed1, fed2, dev float64
	row := func(feed float64) Row {
		n := poly1 + poly2
		r := Row{Conversion: n / (n + n1 + n2), Polymer: poly1*in.MolarMass1 + poly2*in.MolarMass2,
			Fed1: fed1 * in.MolarMass1, Fed2: fed2 * in.MolarMass2, Feed: feed, Inst: m.Instantaneous(feed),
			Inventory: n1*in.MolarMass1 + n2*in.MolarMass2, Time: math.NaN()}
		r.Cum = r.Inst
		if n > 0 {
			r.Cum = poly1 / n
		}
		return r
	}
	rows := []Row{row(fstar)}
	var out []Shot
	dn := nP / float64((shots+1)*rowsPer) // polymer per row: equal increments, shots between intervals
	for k := 0; k <= shots; k++ {
		for range rowsPer {
			total := n1 + n2
			b, err := copoly.NewBatch(m, math.Min(1, math.Max(0, n1/total)))
			if err != nil || dn/total >= 0.999*b.MaxConversion() {
				// The reactor cannot make this increment of polymer from what it holds: too
				// few shots for the final conversion asked.
				return rows, out, math.Inf(1)
			}
			var f [1]float64
			b.FeedAt(f[:], []float64{dn / total})
			left := total * (1 - dn/total)
			poly1 += n1 - left*f[0]
			poly2 += n2 - left*(1-f[0])
			n1, n2 = left*f[0], left*(1-f[0])
			r := row(f[0])
			dev = math.Max(dev, math.Abs(r.Inst-F))
			rows = append(rows, r)
		}
		if k == shots {
			break
		}
		// The shot restores n1/n2 = f1*/(1 − f1*) with the faster monomer.
		s := Shot{Time: math.NaN()}
		if y == 1 {
			add := fstar/(1-fstar)*n2 - n1
			n1 += add
			fed1 += add
			s.Mass1 = add * in.MolarMass1
		} else {
			add := (1-fstar)/fstar*n1 - n2
			n2 += add
			fed2 += add
			s.Mass2 = add * in.MolarMass2
		}
		s.Polymer = poly1*in.MolarMass1 + poly2*in.MolarMass2
		out = append(out, s)
		rows = append(rows, row(fstar))
	}
	return rows, out, dev
}

// shotPlan fills p for shot additions.
func (in *Input) shotPlan(p *Recipe) error {
	fstar := p.StartF1
	if math.Abs(in.TargetF1-fstar) < 1e-12 {
		return &copoly.FieldError{Field: "mode", Reason: "the target is azeotropic (or r1 = r2 = 1): a batch holds it without additions", Err: copoly.ErrOutOfRange}
	}
	if _, a := fasterFeed(in.TargetF1, fstar); 1/in.FinalConversion-a <= 0 {
		return &copoly.InputError{Field: "finalConversion", Value: in.FinalConversion, Reason: fmt.Sprintf("with %.3g mol added per mol of polymer the final conversion cannot exceed %.4g", a, 1/a), Err: copoly.ErrOutOfRange}
	}
	n := in.Shots
	// Rows per interval: about Steps rows in all, at least two per interval (the largest
	// deviation is at the end of an interval, which every choice includes).
	rowsFor := func(k int) int { return max(2, (in.Steps+k)/(k+1)) }
	if n == 0 {
		// The fewest shots that keep F1 within the tolerance: the deviation falls as shots are
		// added, so double, then bisect.
		ok := func(k int) bool { _, _, d := in.runShots(p, k, rowsFor(k)); return d <= in.Tolerance }
		hi := 1
		for !ok(hi) {
			if hi >= MaxShots {
				return &copoly.InputError{Field: "tolerance", Value: in.Tolerance, Reason: fmt.Sprintf("even %d shots cannot hold the composition within ±%g; use a metered feed", MaxShots, in.Tolerance), Err: copoly.ErrUnreachable}
			}
			hi = min(2*hi, MaxShots)
		}
		lo := hi / 2
		for hi-lo > 1 {
			mid := (lo + hi) / 2
			if ok(mid) {
				hi = mid
			} else {
				lo = mid
			}
		}
		if ok(lo) && lo > 0 {
			hi = lo
		}
		n = hi
		p.Notes = append(p.Notes, fmt.Sprintf("%d shots keep the instantaneous composition within ±%g.", n, in.Tolerance))
	}
	rows, shots, dev := in.runShots(p, n, rowsFor(n))
	if math.IsInf(dev, 1) {
		// Fewer shots than the reactor needs: find the fewest that can make the polymer.
		least := n + 1
		for least < MaxShots {
			if _, _, d := in.runShots(p, least, rowsFor(least)); !math.IsInf(d, 1) {
				break
			}
			least++
		}
		return &copoly.InputError{Field: "shots", Value: float64(n), Reason: fmt.Sprintf("too few shots: between shots the reactor runs out of the slower monomer before the polymer is made; use at least %d, or a lower final conversion", least), Err: copoly.ErrOutOfRange}
	}
	// The run made polymer of a slightly different mean unit mass than the target's; every
	// amount scales with the charge, so scale the plan to the polymer mass asked.
	k := in.PolymerMass / rows[len(rows)-1].Polymer
	for i := range rows {
		rows[i].Polymer *= k
		rows[i].Fed1 *= k
		rows[i].Fed2 *= k
		rows[i].Inventory *= k
	}
	for i := range shots {
		shots[i].Polymer *= k
		shots[i].Mass1 *= k
		shots[i].Mass2 *= k
	}
	p.Schedule, p.Shots, p.MaxDeviation = rows, shots, dev
	last := rows[len(rows)-1]
	p.ProductF1 = last.Cum
	p.StopConversion = last.Conversion
	// Composition distribution of the product: the polymer of each row at its instantaneous F1.
	var comp, w []float64
	for i := 1; i < len(rows); i++ {
		dp := rows[i].Polymer - rows[i-1].Polymer
		if dp > 0 {
			comp = append(comp, 0.5*(rows[i].Inst+rows[i-1].Inst))
			w = append(w, dp)
		}
	}
	p.Distribution = copoly.HistogramOf(comp, w, 20, "mass")
	return nil
}

// finish fills what every plan has: the charge in g and mL, totals, the time axis from a table,
// the pump rates and the safety figures.
func (in *Input) finish(p *Recipe) {
	if p.Mode == ModeShots {
		first := p.Schedule[0]
		n0 := first.Inventory / (p.StartF1*in.MolarMass1 + (1-p.StartF1)*in.MolarMass2)
		p.Moles1, p.Moles2 = n0*p.StartF1, n0*(1-p.StartF1)
	}
	p.Charge1, p.Charge2 = p.Moles1*in.MolarMass1, p.Moles2*in.MolarMass2
	last := p.Schedule[len(p.Schedule)-1]
	p.Total1, p.Total2 = p.Charge1+last.Fed1, p.Charge2+last.Fed2
	p.Volume1, p.Volume2 = math.NaN(), math.NaN()
	if in.Density1 > 0 {
		p.Volume1 = p.Charge1 / in.Density1
	}
	if in.Density2 > 0 {
		p.Volume2 = p.Charge2 / in.Density2
	}
	// Time from a measured table, by interpolation in conversion.
	if len(in.TimeTable) >= 2 && math.IsNaN(p.RateConstant) {
		for i := range p.Schedule {
			p.Schedule[i].Time = interpolateTime(in.TimeTable, p.Schedule[i].Conversion)
		}
		p.Notes = append(p.Notes, "Times are interpolated in the measured conversion–time table; rows beyond the table have no time.")
	} else if math.IsNaN(p.RateConstant) {
		for i := range p.Schedule {
			p.Schedule[i].Time = math.NaN()
		}
	} else if p.Mode == ModeShots {
		// Between shots nothing is added and Rp = −dN/dt = k·N, so the unreacted amount decays
		// exponentially: each row takes ln(N_a/N_b)/k exactly.
		t := 0.0
		for i := 1; i < len(p.Schedule); i++ {
			a, b := p.Schedule[i-1], p.Schedule[i]
			na := a.Inventory / in.unitMass(a.Feed)
			nb := b.Inventory / in.unitMass(b.Feed)
			if b.Polymer > a.Polymer && na > 0 && nb > 0 {
				t += math.Log(na/nb) / p.RateConstant
			}
			p.Schedule[i].Time = t
		}
		p.Schedule[0].Time = 0
	}
	for i := range p.Schedule {
		r := &p.Schedule[i]
		r.Pump1, r.Pump2 = math.NaN(), math.NaN()
		if i > 0 {
			prev := p.Schedule[i-1]
			if dt := r.Time - prev.Time; dt > 0 {
				r.Pump1 = (r.Fed1 - prev.Fed1) / dt
				r.Pump2 = (r.Fed2 - prev.Fed2) / dt
			}
		}
	}
	for i, s := range p.Shots {
		for _, r := range p.Schedule {
			if r.Polymer >= s.Polymer-1e-9*in.PolymerMass {
				p.Shots[i].Time = r.Time
				break
			}
		}
	}
	// Safety: the largest inventory and its adiabatic temperature rise.
	s := Safety{Heat: math.NaN(), Rise: math.NaN(), RiseLimit: in.RiseLimit, HeatCapacity: in.HeatCapacity}
	var at Row
	for _, r := range p.Schedule {
		if r.Inventory >= s.InventoryMax {
			s.InventoryMax, s.InventoryAt, at = r.Inventory, r.Polymer, r
		}
	}
	s.BatchMass = in.BatchMass
	if s.BatchMass == 0 {
		s.BatchMass = at.Inventory + at.Polymer
	}
	if in.heat1 > 0 && in.heat2 > 0 {
		n := at.Inventory / in.unitMass(at.Feed)
		s.Heat = n * (at.Feed*in.heat1 + (1-at.Feed)*in.heat2) // kJ
		s.Rise = s.Heat * 1000 / (s.BatchMass * s.HeatCapacity)
		s.Flagged = s.Rise > s.RiseLimit
	}
	p.Safety = s
}

// interpolateTime returns the time at conversion x from a (time, conversion) table, NaN
// outside it.
func interpolateTime(tab [][2]float64, x float64) float64 {
	i := sort.Search(len(tab), func(i int) bool { return tab[i][1] >= x })
	switch {
	case i == len(tab):
		return math.NaN()
	case tab[i][1] == x:
		return tab[i][0]
	case i == 0:
		return math.NaN()
	}
	a, b := tab[i-1], tab[i]
	return a[0] + (b[0]-a[0])*(x-a[1])/(b[1]-a[1])
}
