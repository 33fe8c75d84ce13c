package project

import (
	"fmt"
	"math"
	"slices"

	"copoly/copoly"
	"copoly/copoly/plan"
)

// MaxPlanWordLength is the longest text a Plan's Mode or Feed may hold, in characters; every
// allowed word is shorter. It keeps an error message from quoting a long paste back.
const MaxPlanWordLength = 32

// Plan is the state of the feed-planning panel as the user left it: the inputs of a plan as
// in plan.Input, with the keys of the plan of the JavaScript API (site/copoly.d.ts). Every
// field is optional: 0 and "" mean "not given" (as in plan.Input, where 0 selects the
// default) and are left out of the file. The values are stored as typed, within the loose
// limits of CheckPlan; whether they make a plan is for plan.Make to say.
type Plan struct {
	// Mode is plan.ModeBatch, PlanSemibatch, PlanShots or "".
	Mode string `json:"mode,omitempty"`
	// TargetF1 is the wanted mole fraction of M1 in the copolymer.
	TargetF1 float64 `json:"targetF1,omitempty"`
	// PolymerMass is the mass of copolymer to make, in g.
	PolymerMass float64 `json:"polymerMass,omitempty"`
	// Tolerance is the ± tolerance on F1 (mole fraction).
	Tolerance float64 `json:"tolerance,omitempty"`
	// StopConversion is the batch's stopping conversion, FinalConversion the overall conversion
	// at the end of a semi-batch or shot plan.
	StopConversion  float64 `json:"stopConversion,omitempty"`
	FinalConversion float64 `json:"finalConversion,omitempty"`
	// Feed is plan.FeedFaster, FeedMixture or ""; FeedF1 the mole fraction of M1 in a metered
	// mixture.
	Feed   string  `json:"feed,omitempty"`
	FeedF1 float64 `json:"feedF1,omitempty"`
	// Shots is the number of shot additions (0: the fewest within the tolerance).
	Shots int `json:"shots,omitempty"`
	// RateLaw is the panel's choice of time axis: RateNone, RateConstant, RateHalfLife,
	// RateTable or "" (not chosen: the panel infers it from the numbers given).
	RateLaw string `json:"rateLaw,omitempty"`
	// RateConstant in 1/min or HalfLife in min set the time axis.
	RateConstant float64 `json:"rateConstant,omitempty"`
	HalfLife     float64 `json:"halfLife,omitempty"`
	// TimeTable is a measured conversion–time table, rows [time in min, conversion], as in
	// plan.Input; nil when none.
	TimeTable [][2]float64 `json:"timeTable,omitempty" pair:"time, conversion"`
	// Heat1 and Heat2 are the user's heats of polymerization −ΔHp of M1 and M2 in kJ/mol,
	// in place of the library's (0: not given).
	Heat1 float64 `json:"heat1,omitempty"`
	Heat2 float64 `json:"heat2,omitempty"`
	// BatchMass in g, HeatCapacity in J/(g·K) and RiseLimit in K set the safety check.
	BatchMass    float64 `json:"batchMass,omitempty"`
	HeatCapacity float64 `json:"heatCapacity,omitempty"`
	RiseLimit    float64 `json:"riseLimit,omitempty"`
}

// The rate laws of Plan.RateLaw, with the words the page's rate-law choice uses.
const (
	RateNone     = "none"  // no time axis: the schedule is by polymer made
	RateConstant = "k"     // first order, Plan.RateConstant
	RateHalfLife = "half"  // first order, Plan.HalfLife
	RateTable    = "table" // measured, Plan.TimeTable
)

// MaxPlanHeat is the largest heat of polymerization a Plan holds, in kJ/mol: the limit of
// plan.Make.
const MaxPlanHeat = 1000

// Words accepted by the text fields of a Plan; "" means not given.
var (
	planModes    = []string{"", plan.ModeBatch, plan.ModeSemibatch, plan.ModeShots}
	planFeeds    = []string{"", plan.FeedFaster, plan.FeedMixture}
	planRateLaws = []string{"", RateNone, RateConstant, RateHalfLife, RateTable}
)

// CheckPlan reports the first invalid value of pl as a *copoly.InputError or *copoly.FieldError
// whose field starts with field ("project.plan.mode"), or nil. Mode, Feed and RateLaw must be
// at most MaxPlanWordLength characters and among the allowed words or empty; every number must
// be finite and ≥ 0, Shots ≥ 0, Heat1 and Heat2 at most MaxPlanHeat. TimeTable holds at most
// plan.MaxTimeRows rows of finite numbers, as plan.Make takes them: time ≥ 0 and
// increasing, conversion in [0, 1] and not decreasing. Nothing else is checked: a panel may be
// saved half filled in.
func CheckPlan(field string, pl Plan) error {
	for _, w := range []struct {
		name, v string
		allowed []string
	}{
		{"mode", pl.Mode, planModes},
		{"feed", pl.Feed, planFeeds},
		{"rateLaw", pl.RateLaw, planRateLaws},
	} {
		f := field + "." + w.name
		if err := checkText(f, w.v, MaxPlanWordLength); err != nil {
			return err
		}
		if !slices.Contains(w.allowed, w.v) {
			return &copoly.FieldError{Field: f, Reason: fmt.Sprintf("is %q; it must be one of %s", w.v, quoteAll(w.allowed[1:])), Err: ErrNotAllowed}
		}
	}
	for _, n := range []struct {
		name string
		v    float64
	}{
		{"targetF1", pl.TargetF1}, {"polymerMass", pl.PolymerMass}, {"tolerance", pl.Tolerance},
		{"stopConversion", pl.StopConversion}, {"finalConversion", pl.FinalConversion},
		{"feedF1", pl.FeedF1}, {"shots", float64(pl.Shots)},
		{"rateConstant", pl.RateConstant}, {"halfLife", pl.HalfLife},
		{"batchMass", pl.BatchMass}, {"heatCapacity", pl.HeatCapacity}, {"riseLimit", pl.RiseLimit},
		{"heat1", pl.Heat1}, {"heat2", pl.Heat2},
	} {
		f := field + "." + n.name
		if math.IsNaN(n.v) || math.IsInf(n.v, 0) {
			return &copoly.InputError{Field: f, Value: n.v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if n.v < 0 {
			return &copoly.InputError{Field: f, Value: n.v, Reason: "cannot be negative (0 or absent = not given)", Err: copoly.ErrOutOfRange}
		}
		if (n.name == "heat1" || n.name == "heat2") && n.v > MaxPlanHeat {
			return &copoly.InputError{Field: f, Value: n.v, Reason: fmt.Sprintf("a heat of polymerization is in kJ/mol, at most %d", MaxPlanHeat), Err: copoly.ErrOutOfRange}
		}
	}
	return checkTimeTable(field+".timeTable", pl.TimeTable)
}

// checkTimeTable checks a conversion–time table as CheckPlan documents.
func checkTimeTable(field string, rows [][2]float64) error {
	if len(rows) > plan.MaxTimeRows {
		return &copoly.InputError{Field: field, Value: float64(len(rows)), Reason: fmt.Sprintf("at most %d rows", plan.MaxTimeRows), Err: copoly.ErrTooMany}
	}
	for i, row := range rows {
		f := fmt.Sprintf("%s[%d]", field, i)
		for k, v := range row {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &copoly.InputError{Field: fmt.Sprintf("%s[%d]", f, k), Value: v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
			}
		}
		switch {
		case row[0] < 0:
			return &copoly.InputError{Field: f, Value: row[0], Reason: "the time (min) cannot be negative", Err: copoly.ErrOutOfRange}
		case row[1] < 0 || row[1] > 1:
			return &copoly.InputError{Field: f, Value: row[1], Reason: "the conversion must lie between 0 and 1", Err: copoly.ErrOutOfRange}
		case i > 0 && row[0] <= rows[i-1][0]:
			return &copoly.InputError{Field: f, Value: row[0], Reason: fmt.Sprintf("the times must increase; the row before has %v min", rows[i-1][0]), Err: copoly.ErrOutOfRange}
		case i > 0 && row[1] < rows[i-1][1]:
			return &copoly.InputError{Field: f, Value: row[1], Reason: fmt.Sprintf("the conversion cannot decrease; the row before has %v", rows[i-1][1]), Err: copoly.ErrOutOfRange}
		}
	}
	return nil
}
