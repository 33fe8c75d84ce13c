package project

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"copoly/copoly"
	"copoly/copoly/plan"
)

// The expected field names below are the keys of Project.plan in site/copoly.d.ts with the
// "project." prefix of the package documentation; the limits are those documented on CheckPlan.

func TestCheckPlan(t *testing.T) {
	tests := []struct {
		name  string
		edit  func(pl *Plan)
		field string // "" when valid
		err   error  // sentinel the error must wrap
	}{
		{name: "demo", edit: func(pl *Plan) {}},
		{name: "empty", edit: func(pl *Plan) { *pl = Plan{} }},
		{name: "batch", edit: func(pl *Plan) { pl.Mode, pl.StopConversion = plan.ModeBatch, 0.6 }},
		{name: "shots", edit: func(pl *Plan) { pl.Mode, pl.Shots = plan.ModeShots, 12 }},
		{name: "mixture", edit: func(pl *Plan) { pl.Feed, pl.FeedF1 = plan.FeedMixture, 0.7 }},
		{name: "faster", edit: func(pl *Plan) { pl.Feed = plan.FeedFaster }},
		{name: "half-life", edit: func(pl *Plan) { pl.RateConstant, pl.HalfLife = 0, 60 }},
		{name: "rate law half-life", edit: func(pl *Plan) { pl.RateLaw, pl.HalfLife = RateHalfLife, 60 }},
		{name: "rate law none", edit: func(pl *Plan) { pl.RateLaw = RateNone }},
		// A measured table in the form plan.Make takes; a flat stretch of conversion is allowed.
		{name: "time table", edit: func(pl *Plan) {
			pl.RateLaw, pl.TimeTable = RateTable, [][2]float64{{0, 0}, {30, 0.22}, {60, 0.22}, {90, 1}}
		}},
		{name: "table at the row limit", edit: func(pl *Plan) {
			pl.TimeTable = make([][2]float64, plan.MaxTimeRows)
			for i := range pl.TimeTable {
				pl.TimeTable[i] = [2]float64{float64(i), 0.5}
			}
		}},
		// 1000 kJ/mol is plan.Make's limit on a heat of polymerization.
		{name: "heats", edit: func(pl *Plan) { pl.Heat1, pl.Heat2 = 69.9, MaxPlanHeat }},
		// Stored as typed: out of a plan's range, but not negative.
		{name: "target above one kept", edit: func(pl *Plan) { pl.TargetF1 = 1.5 }},

		{name: "mode unknown", edit: func(pl *Plan) { pl.Mode = "continuous" }, field: "project.plan.mode", err: ErrNotAllowed},
		{name: "mode capitalised", edit: func(pl *Plan) { pl.Mode = "Batch" }, field: "project.plan.mode", err: ErrNotAllowed},
		{name: "mode too long", edit: func(pl *Plan) { pl.Mode = strings.Repeat("b", MaxPlanWordLength+1) }, field: "project.plan.mode", err: ErrTooLong},
		{name: "feed unknown", edit: func(pl *Plan) { pl.Feed = "both" }, field: "project.plan.feed", err: ErrNotAllowed},
		{name: "feed too long", edit: func(pl *Plan) { pl.Feed = strings.Repeat("é", MaxPlanWordLength+1) }, field: "project.plan.feed", err: ErrTooLong},
		{name: "target negative", edit: func(pl *Plan) { pl.TargetF1 = -0.5 }, field: "project.plan.targetF1", err: copoly.ErrOutOfRange},
		{name: "polymer mass NaN", edit: func(pl *Plan) { pl.PolymerMass = math.NaN() }, field: "project.plan.polymerMass", err: copoly.ErrNotFinite},
		{name: "tolerance infinite", edit: func(pl *Plan) { pl.Tolerance = math.Inf(1) }, field: "project.plan.tolerance", err: copoly.ErrNotFinite},
		{name: "stop conversion negative", edit: func(pl *Plan) { pl.StopConversion = -0.1 }, field: "project.plan.stopConversion", err: copoly.ErrOutOfRange},
		{name: "final conversion negative", edit: func(pl *Plan) { pl.FinalConversion = -1 }, field: "project.plan.finalConversion", err: copoly.ErrOutOfRange},
		{name: "feedF1 negative", edit: func(pl *Plan) { pl.FeedF1 = -0.2 }, field: "project.plan.feedF1", err: copoly.ErrOutOfRange},
		{name: "shots negative", edit: func(pl *Plan) { pl.Shots = -3 }, field: "project.plan.shots", err: copoly.ErrOutOfRange},
		{name: "rate constant negative", edit: func(pl *Plan) { pl.RateConstant = -0.01 }, field: "project.plan.rateConstant", err: copoly.ErrOutOfRange},
		{name: "half-life negative infinite", edit: func(pl *Plan) { pl.HalfLife = math.Inf(-1) }, field: "project.plan.halfLife", err: copoly.ErrNotFinite},
		{name: "batch mass negative", edit: func(pl *Plan) { pl.BatchMass = -2500 }, field: "project.plan.batchMass", err: copoly.ErrOutOfRange},
		{name: "heat capacity NaN", edit: func(pl *Plan) { pl.HeatCapacity = math.NaN() }, field: "project.plan.heatCapacity", err: copoly.ErrNotFinite},
		{name: "rise limit negative", edit: func(pl *Plan) { pl.RiseLimit = -50 }, field: "project.plan.riseLimit", err: copoly.ErrOutOfRange},
		{name: "rate law unknown", edit: func(pl *Plan) { pl.RateLaw = "halflife" }, field: "project.plan.rateLaw", err: ErrNotAllowed},
		{name: "rate law too long", edit: func(pl *Plan) { pl.RateLaw = strings.Repeat("k", MaxPlanWordLength+1) }, field: "project.plan.rateLaw", err: ErrTooLong},
		{name: "heat1 negative", edit: func(pl *Plan) { pl.Heat1 = -70 }, field: "project.plan.heat1", err: copoly.ErrOutOfRange},
		{name: "heat2 NaN", edit: func(pl *Plan) { pl.Heat2 = math.NaN() }, field: "project.plan.heat2", err: copoly.ErrNotFinite},
		{name: "heat2 above the limit", edit: func(pl *Plan) { pl.Heat2 = MaxPlanHeat + 1 }, field: "project.plan.heat2", err: copoly.ErrOutOfRange},
		{name: "table too long", edit: func(pl *Plan) {
			pl.TimeTable = make([][2]float64, plan.MaxTimeRows+1)
			for i := range pl.TimeTable {
				pl.TimeTable[i] = [2]float64{float64(i), 0.5}
			}
		}, field: "project.plan.timeTable", err: copoly.ErrTooMany},
		{name: "table time infinite", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{0, 0}, {math.Inf(1), 0.5}} }, field: "project.plan.timeTable[1][0]", err: copoly.ErrNotFinite},
		{name: "table conversion NaN", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{0, math.NaN()}} }, field: "project.plan.timeTable[0][1]", err: copoly.ErrNotFinite},
		{name: "table time negative", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{-5, 0}, {10, 0.1}} }, field: "project.plan.timeTable[0]", err: copoly.ErrOutOfRange},
		{name: "table conversion above one", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{0, 0}, {10, 35}} }, field: "project.plan.timeTable[1]", err: copoly.ErrOutOfRange},
		{name: "table conversion negative", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{0, -0.1}} }, field: "project.plan.timeTable[0]", err: copoly.ErrOutOfRange},
		{name: "table time repeated", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{0, 0}, {30, 0.2}, {60, 0.4}, {60, 0.5}} }, field: "project.plan.timeTable[3]", err: copoly.ErrOutOfRange},
		{name: "table conversion falls", edit: func(pl *Plan) { pl.TimeTable = [][2]float64{{0, 0}, {30, 0.4}, {60, 0.3}} }, field: "project.plan.timeTable[2]", err: copoly.ErrOutOfRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p := Demo()
			tt.edit(p.Plan)
			err := p.Validate()
			wantValidate(t, err, tt.field, tt.err)
		})
	}
}

// The demo's plan settings must make a plan: the page offers them on first use.
func TestDemoPlanRuns(t *testing.T) {
	p := Demo()
	pl := p.Plan
	if pl == nil {
		t.Fatal("Demo() has no plan section")
	}
	in := plan.Input{
		Model: copoly.Terminal{R1: p.R1, R2: p.R2}, TargetF1: pl.TargetF1,
		MolarMass1: p.Monomer1.MolarMass, MolarMass2: p.Monomer2.MolarMass,
		PolymerMass: pl.PolymerMass, Mode: pl.Mode, Tolerance: pl.Tolerance,
		RateConstant: pl.RateConstant, BatchMass: pl.BatchMass, HeatCapacity: pl.HeatCapacity, RiseLimit: pl.RiseLimit,
	}
	plan, err := plan.Make(in)
	if err != nil {
		t.Fatalf("plan.Make(demo plan) error %v", err)
	}
	if last := plan.Schedule[len(plan.Schedule)-1]; !(math.Abs(last.Polymer-pl.PolymerMass) <= 1e-9*pl.PolymerMass) {
		t.Errorf("demo plan ends with %v g of polymer, want %v", last.Polymer, pl.PolymerMass)
	}
}

func TestParsePlan(t *testing.T) {
	withPlan := func(plan string) string {
		return strings.Replace(minimal, `"tolerance":0.05`, `"tolerance":0.05,"plan":`+plan, 1)
	}
	t.Run("keys of the d.ts", func(t *testing.T) {
		p, err := Parse([]byte(withPlan(`{"mode":"shots","targetF1":0.4,"polymerMass":250,"tolerance":0.01,
			"stopConversion":0.3,"finalConversion":0.9,"feed":"mixture","feedF1":0.6,"shots":7,
			"rateLaw":"table","rateConstant":0.02,"halfLife":40,"timeTable":[[0,0],[15,0.1],[45,0.35]],
			"heat1":70,"heat2":78,"batchMass":900,"heatCapacity":1.8,"riseLimit":30}`)))
		if err != nil {
			t.Fatalf("Parse() error %v", err)
		}
		// Values as written just above.
		want := &Plan{Mode: "shots", TargetF1: 0.4, PolymerMass: 250, Tolerance: 0.01, StopConversion: 0.3,
			FinalConversion: 0.9, Feed: "mixture", FeedF1: 0.6, Shots: 7, RateLaw: RateTable, RateConstant: 0.02, HalfLife: 40,
			TimeTable: [][2]float64{{0, 0}, {15, 0.1}, {45, 0.35}}, Heat1: 70, Heat2: 78,
			BatchMass: 900, HeatCapacity: 1.8, RiseLimit: 30}
		if !reflect.DeepEqual(p.Plan, want) {
			t.Errorf("Parse().Plan = %+v, want %+v", p.Plan, want)
		}
	})
	t.Run("null is no plan", func(t *testing.T) {
		p, err := Parse([]byte(withPlan(`null`)))
		if err != nil || p.Plan != nil {
			t.Errorf("Parse(plan null) = %+v, %v, want no plan", p.Plan, err)
		}
	})
	t.Run("empty table is none", func(t *testing.T) {
		p, err := Parse([]byte(withPlan(`{"timeTable":[]}`)))
		if err != nil || p.Plan == nil || p.Plan.TimeTable != nil {
			t.Errorf("Parse(plan timeTable []) = %+v, %v, want an empty plan with no table", p.Plan, err)
		}
	})
	t.Run("empty object kept", func(t *testing.T) {
		p, err := Parse([]byte(withPlan(`{}`)))
		if err != nil || p.Plan == nil || !reflect.DeepEqual(*p.Plan, Plan{}) {
			t.Errorf("Parse(plan {}) = %+v, %v, want an empty plan", p.Plan, err)
		}
	})
	for _, c := range []struct {
		name, plan, field string
		err               error
		text              string
	}{
		{"not an object", `[1]`, "project.plan", ErrWrongType, "an object"},
		{"mode a number", `{"mode":1}`, "project.plan.mode", ErrWrongType, "must be text, not the number 1"},
		{"mode unknown", `{"mode":"fast"}`, "project.plan.mode", ErrNotAllowed, `"fast"`},
		{"shots fractional", `{"shots":2.5}`, "project.plan.shots", ErrWrongType, "whole number"},
		{"shots negative", `{"shots":-1}`, "project.plan.shots", copoly.ErrOutOfRange, "negative"},
		{"target text", `{"targetF1":"0.5"}`, "project.plan.targetF1", ErrWrongType, "a number"},
		{"polymer mass negative", `{"polymerMass":-5}`, "project.plan.polymerMass", copoly.ErrOutOfRange, "negative"},
		{"rate law unknown", `{"rateLaw":"halflife"}`, "project.plan.rateLaw", ErrNotAllowed, `"halflife"`},
		{"heat text", `{"heat1":"70 kJ/mol"}`, "project.plan.heat1", ErrWrongType, "a number"},
		{"table not a list", `{"timeTable":{"0":0}}`, "project.plan.timeTable", ErrWrongType, "list"},
		{"table row short", `{"timeTable":[[0,0],[30]]}`, "project.plan.timeTable[1]", ErrWrongType, "pair [time, conversion]"},
		{"table row long", `{"timeTable":[[0,0,1]]}`, "project.plan.timeTable[0]", ErrWrongType, "list of 3 values"},
		{"table conversion falls", `{"timeTable":[[0,0],[30,0.4],[60,0.3]]}`, "project.plan.timeTable[2]", copoly.ErrOutOfRange, "cannot decrease"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse([]byte(withPlan(c.plan)))
			if got := copoly.Field(err); got != c.field {
				t.Errorf("Parse(plan %s) field = %q, want %q (error %v)", c.plan, got, c.field, err)
			}
			if !errors.Is(err, c.err) {
				t.Errorf("Parse(plan %s) = %v, want an error wrapping %v", c.plan, err, c.err)
			}
			if err != nil && !strings.Contains(err.Error(), c.text) {
				t.Errorf("Parse(plan %s) = %q, want it to contain %q", c.plan, err, c.text)
			}
		})
	}
}
