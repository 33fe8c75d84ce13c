package project

import (
	"fmt"
	"math"
	"slices"

	"copoly/copoly"
)

// MaxPlanWordLength is the longest text a Plan's Mode or Feed may hold, in characters; every
// allowed word is shorter. It keeps an error message from quoting a long paste back.
const MaxPlanWordLength = 32

// Plan is the state of the feed-planning panel as the user left it: the inputs of a plan as
// in copoly.PlanInput, with the keys of the plan of the JavaScript API (site/copoly.d.ts). Every
// field is optional: 0 and "" mean "not given" (as in copoly.PlanInput, where 0 selects the
// default) and are left out of the file. The values are stored as typed, within the loose
// limits of CheckPlan; whether they make a plan is for copoly.MakePlan to say.
type Plan struct {
	// Mode is copoly.PlanBatch, PlanSemibatch, PlanShots or "".
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
	// Feed is copoly.FeedFaster, FeedMixture or ""; FeedF1 the mole fraction of M1 in a metered
	// mixture.
	Feed   string  `json:"feed,omitempty"`
	FeedF1 float64 `json:"feedF1,omitempty"`
	// Shots is the number of shot additions (0: the fewest within the tolerance).
	Shots int `json:"shots,omitempty"`
	// RateConstant in 1/min or HalfLife in min set the time axis.
	RateConstant float64 `json:"rateConstant,omitempty"`
	HalfLife     float64 `json:"halfLife,omitempty"`
	// BatchMass in g, HeatCapacity in J/(g·K) and RiseLimit in K set the safety check.
	BatchMass    float64 `json:"batchMass,omitempty"`
	HeatCapacity float64 `json:"heatCapacity,omitempty"`
	RiseLimit    float64 `json:"riseLimit,omitempty"`
}

// Words accepted by the text fields of a Plan; "" means not given.
var (
	planModes = []string{"", copoly.PlanBatch, copoly.PlanSemibatch, copoly.PlanShots}
	planFeeds = []string{"", copoly.FeedFaster, copoly.FeedMixture}
)

// CheckPlan reports the first invalid value of pl as a *copoly.InputError or *copoly.FieldError
// whose field starts with field ("project.plan.mode"), or nil. Mode and Feed must be at most
// MaxPlanWordLength characters and among the allowed words or empty; every number must be
// finite and ≥ 0, and Shots ≥ 0. Nothing else is checked: a panel may be saved half filled in.
func CheckPlan(field string, pl Plan) error {
	for _, w := range []struct {
		name, v string
		allowed []string
	}{
		{"mode", pl.Mode, planModes},
		{"feed", pl.Feed, planFeeds},
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
	} {
		f := field + "." + n.name
		if math.IsNaN(n.v) || math.IsInf(n.v, 0) {
			return &copoly.InputError{Field: f, Value: n.v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		if n.v < 0 {
			return &copoly.InputError{Field: f, Value: n.v, Reason: "cannot be negative (0 or absent = not given)", Err: copoly.ErrOutOfRange}
		}
	}
	return nil
}
