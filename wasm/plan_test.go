//go:build js && wasm

package main

import (
	"math"
	"slices"
	"strings"
	"syscall/js"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/plan"
	"copoly/copoly/project"
)

// Tests of the feed-planning methods. As in api_test.go, results are compared with direct
// copoly calls on the same input; in addition every returned schedule is checked against the
// conservation of each monomer (charged + fed = in the polymer + unreacted), worked out here
// from the returned numbers alone. The ratios 0.80/0.15 and the molar masses of styrene (C8H8)
// and n-butyl acrylate (C7H12O2) are those of the demo project.

const (
	planMM1 = 104.15 // styrene, g/mol from standard atomic weights (as in project.Demo)
	planMM2 = 128.17 // n-butyl acrylate, g/mol from standard atomic weights (as in project.Demo)
)

// planArg returns a good plan argument of the given mode with more keys set (key, value, …).
func planArg(mode string, more ...any) map[string]any {
	a := map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.5, "molarMass1": planMM1, "molarMass2": planMM2,
		"polymerMass": 1000, "mode": mode}
	for i := 0; i+1 < len(more); i += 2 {
		a[more[i].(string)] = more[i+1]
	}
	return a
}

// planInputOf is the copoly input the bridge should build for planArg(mode) with no options.
func planInputOf(mode string) plan.Input {
	return plan.Input{Model: copoly.Terminal{R1: 0.8, R2: 0.15}, TargetF1: 0.5,
		MolarMass1: planMM1, MolarMass2: planMM2, PolymerMass: 1000, Mode: mode}
}

// numberOrNaN reads a number that may be null (NaN).
func numberOrNaN(t *testing.T, v js.Value, what string) float64 {
	t.Helper()
	switch v.Type() {
	case js.TypeNull:
		return math.NaN()
	case js.TypeNumber:
		return v.Float()
	}
	t.Fatalf("%s = %s, want a number or null", what, stringify(v))
	return 0
}

// column returns one key of every schedule row.
func column(t *testing.T, r js.Value, key string) []float64 {
	t.Helper()
	rows := r.Get("schedule")
	out := make([]float64, rows.Length())
	for i := range out {
		out[i] = numberOrNaN(t, rows.Index(i).Get(key), key)
	}
	return out
}

// samePlan checks that the result r holds exactly the plan p.
func samePlan(t *testing.T, r js.Value, p *plan.Recipe) {
	t.Helper()
	if got := r.Get("mode").String(); got != p.Mode {
		t.Errorf("mode = %q, want %q", got, p.Mode)
	}
	for _, c := range []struct {
		path string
		want float64
	}{
		{"startF1", p.StartF1}, {"initial.m1", p.Charge1}, {"initial.m2", p.Charge2},
		{"initial.n1", p.Moles1}, {"initial.n2", p.Moles2}, {"total.m1", p.Total1}, {"total.m2", p.Total2},
		{"feedF1", p.FeedF1}, {"feedPerPolymer", p.FeedPerPolymer}, {"stopConversion", p.StopConversion},
		{"productF1", p.ProductF1}, {"maxDeviation", p.MaxDeviation}, {"inventoryMax", p.Safety.InventoryMax},
		{"safety.inventoryMax", p.Safety.InventoryMax}, {"safety.inventoryAt", p.Safety.InventoryAt},
		{"safety.heat", p.Safety.Heat}, {"safety.rise", p.Safety.Rise}, {"safety.riseLimit", p.Safety.RiseLimit},
		{"safety.batchMass", p.Safety.BatchMass}, {"safety.heatCapacity", p.Safety.HeatCapacity},
	} {
		v := r
		for _, k := range splitPath(c.path) {
			v = v.Get(k)
		}
		got := numberOrNaN(t, v, c.path)
		if got != c.want && !(math.IsNaN(got) && math.IsNaN(c.want)) {
			t.Errorf("%s = %v, want %v", c.path, got, c.want)
		}
	}
	if got := r.Get("safety").Get("flagged").Bool(); got != p.Safety.Flagged {
		t.Errorf("safety.flagged = %v, want %v", got, p.Safety.Flagged)
	}
	col := func(f func(plan.Row) float64) []float64 {
		out := make([]float64, len(p.Schedule))
		for i, row := range p.Schedule {
			out[i] = f(row)
		}
		return out
	}
	for _, c := range []struct {
		key  string
		want []float64
	}{
		{"conversion", col(func(r plan.Row) float64 { return r.Conversion })},
		{"polymer", col(func(r plan.Row) float64 { return r.Polymer })},
		{"fed1", col(func(r plan.Row) float64 { return r.Fed1 })},
		{"fed2", col(func(r plan.Row) float64 { return r.Fed2 })},
		{"f1", col(func(r plan.Row) float64 { return r.Feed })},
		{"F1", col(func(r plan.Row) float64 { return r.Inst })},
		{"F1cum", col(func(r plan.Row) float64 { return r.Cum })},
		{"inventory", col(func(r plan.Row) float64 { return r.Inventory })},
		{"time", col(func(r plan.Row) float64 { return r.Time })},
		{"pump1", col(func(r plan.Row) float64 { return r.Pump1 })},
		{"pump2", col(func(r plan.Row) float64 { return r.Pump2 })},
	} {
		sameFloats(t, "schedule."+c.key, column(t, r, c.key), c.want)
	}
	shots := r.Get("shots")
	if shots.Length() != len(p.Shots) {
		t.Fatalf("shots = %s, want %d", stringify(shots), len(p.Shots))
	}
	for i, s := range p.Shots {
		g := shots.Index(i)
		if g.Get("polymer").Float() != s.Polymer || g.Get("m1").Float() != s.Mass1 || g.Get("m2").Float() != s.Mass2 {
			t.Errorf("shots[%d] = %s, want %+v", i, stringify(g), s)
		}
		if tm := numberOrNaN(t, g.Get("time"), "shot time"); tm != s.Time && !(math.IsNaN(tm) && math.IsNaN(s.Time)) {
			t.Errorf("shots[%d].time = %v, want %v", i, tm, s.Time)
		}
	}
	dist := r.Get("distribution")
	sameFloats(t, "distribution.edges", floatsOf(t, dist.Get("edges")), p.Distribution.Edges)
	sameFloats(t, "distribution.weights", floatsOf(t, dist.Get("weights")), p.Distribution.Weights)
	if got := dist.Get("basis").String(); got != p.Distribution.Basis {
		t.Errorf("distribution.basis = %q, want %q", got, p.Distribution.Basis)
	}
	notes := r.Get("notes")
	if !isArray(notes) || notes.Length() < len(p.Notes) {
		t.Fatalf("notes = %s, want at least %q", stringify(notes), p.Notes)
	}
	for i, n := range p.Notes {
		if notes.Index(i).String() != n {
			t.Errorf("notes[%d] = %q, want %q", i, notes.Index(i).String(), n)
		}
	}
}

// checkBalance checks at every tenth row (and the last) that each monomer is conserved: the
// moles charged plus fed equal the moles in the polymer plus those unreacted,
//
//	n1 + fed1/M1 = P·F1cum + N·f1,  n2 + fed2/M2 = P·(1 − F1cum) + N·(1 − f1),
//
// with P = polymer/(F1cum·M1 + (1 − F1cum)·M2) the moles of units in the polymer and
// N = inventory/(f1·M1 + (1 − f1)·M2) the moles unreacted, all read from the result r. It also
// checks that the charge in g is the charge in mol times the molar mass and that the last row
// holds the polymer mass asked for.
func checkBalance(t *testing.T, r js.Value, polymerMass float64) {
	t.Helper()
	ini := r.Get("initial")
	n1, n2 := ini.Get("n1").Float(), ini.Get("n2").Float()
	if m := ini.Get("m1").Float(); !scalar.EqualWithinAbsOrRel(m, n1*planMM1, 1e-9, 1e-12) {
		t.Errorf("initial.m1 = %v, want n1·M1 = %v", m, n1*planMM1)
	}
	if m := ini.Get("m2").Float(); !scalar.EqualWithinAbsOrRel(m, n2*planMM2, 1e-9, 1e-12) {
		t.Errorf("initial.m2 = %v, want n2·M2 = %v", m, n2*planMM2)
	}
	rows := r.Get("schedule")
	last := rows.Length() - 1
	if last < 1 {
		t.Fatalf("schedule has %d rows", rows.Length())
	}
	for i := 0; i <= last; i++ {
		if i%10 != 0 && i != last {
			continue
		}
		row := rows.Index(i)
		f1, cum := row.Get("f1").Float(), row.Get("F1cum").Float()
		P := row.Get("polymer").Float() / (cum*planMM1 + (1-cum)*planMM2)
		N := row.Get("inventory").Float() / (f1*planMM1 + (1-f1)*planMM2)
		in1 := n1 + row.Get("fed1").Float()/planMM1
		in2 := n2 + row.Get("fed2").Float()/planMM2
		tol := 1e-9 * (in1 + in2)
		if out := P*cum + N*f1; math.Abs(in1-out) > tol {
			t.Errorf("row %d: M1 charged + fed = %v mol, in polymer + unreacted = %v mol", i, in1, out)
		}
		if out := P*(1-cum) + N*(1-f1); math.Abs(in2-out) > tol {
			t.Errorf("row %d: M2 charged + fed = %v mol, in polymer + unreacted = %v mol", i, in2, out)
		}
	}
	if got := rows.Index(last).Get("polymer").Float(); !scalar.EqualWithinAbsOrRel(got, polymerMass, 1e-9, 1e-9) {
		t.Errorf("last row polymer = %v g, want %v g", got, polymerMass)
	}
	tot := r.Get("total")
	lastRow := rows.Index(last)
	if got, want := tot.Get("m1").Float(), ini.Get("m1").Float()+lastRow.Get("fed1").Float(); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-12) {
		t.Errorf("total.m1 = %v, want charge + fed = %v", got, want)
	}
}

func TestPlanModes(t *testing.T) {
	api, _ := testAPI(t)
	styrene, ok1 := copoly.PropertiesOf("styrene")
	nba, ok2 := copoly.PropertiesOf("n-butyl acrylate")
	if !ok1 || !ok2 {
		t.Fatal("copoly has no process data for styrene or n-butyl acrylate")
	}

	t.Run("batch without names", func(t *testing.T) {
		r := call(api, "plan", planArg("batch"))
		wantNoError(t, r)
		p, err := plan.Make(planInputOf("batch"))
		if err != nil {
			t.Fatal(err)
		}
		samePlan(t, r, p)
		checkBalance(t, r, 1000)
		ini := r.Get("initial")
		if !ini.Get("v1").IsNull() || !ini.Get("v2").IsNull() {
			t.Errorf("initial = %s, want v1 and v2 null without monomer names", stringify(ini))
		}
		s := r.Get("safety")
		if !s.Get("heat").IsNull() || !s.Get("rise").IsNull() || s.Get("hazards").Length() != 0 {
			t.Errorf("safety = %s, want heat and rise null and no hazards without names", stringify(s))
		}
		if got := r.Get("schedule").Length(); got != 201 {
			t.Errorf("schedule has %d rows, want 201 (default 200 steps, site/copoly.d.ts)", got)
		}
		if !r.Get("band").IsUndefined() {
			t.Errorf("band = %s without jcr, want it absent", stringify(r.Get("band")))
		}
	})

	t.Run("semibatch with library monomers and a rate constant", func(t *testing.T) {
		r := call(api, "plan", planArg("semibatch", "monomer1", "styrene", "monomer2", "n-butyl acrylate",
			"rateConstant", 0.01, "batchMass", 2500, "steps", 50))
		wantNoError(t, r)
		in := planInputOf("semibatch")
		in.RateConstant, in.BatchMass, in.Steps = 0.01, 2500, 50
		in.Heat1, in.Heat2 = &styrene.HeatOfPolymerization, &nba.HeatOfPolymerization
		p, err := plan.Make(in)
		if err != nil {
			t.Fatal(err)
		}
		samePlan(t, r, p)
		checkBalance(t, r, 1000)
		// Volumes: mass over the library density (both are liquids).
		ini := r.Get("initial")
		if got, want := ini.Get("v1").Float(), p.Charge1/styrene.Density; got != want {
			t.Errorf("initial.v1 = %v mL, want %v g / %v g/mL = %v", got, p.Charge1, styrene.Density, want)
		}
		if got, want := ini.Get("v2").Float(), p.Charge2/nba.Density; got != want {
			t.Errorf("initial.v2 = %v mL, want %v", got, want)
		}
		hz := r.Get("safety").Get("hazards")
		if hz.Length() != 2 || hz.Index(0).Get("monomer").String() != "styrene" || hz.Index(1).Get("monomer").String() != "n-butyl acrylate" {
			t.Fatalf("safety.hazards = %s, want styrene and n-butyl acrylate", stringify(hz))
		}
		if got := stringify(hz.Index(0).Get("hazards")); got != stringify(toJS(styrene.Hazards)) {
			t.Errorf("styrene hazards = %s, want %q", got, styrene.Hazards)
		}
		if r.Get("safety").Get("heat").IsNull() || r.Get("schedule").Index(10).Get("time").IsNull() || r.Get("schedule").Index(10).Get("pump1").IsNull() {
			t.Errorf("semibatch with heats and a rate constant has a null heat, time or pump rate: %s", stringify(r.Get("schedule").Index(10)))
		}
	})

	t.Run("heats given override the library", func(t *testing.T) {
		r := call(api, "plan", planArg("semibatch", "monomer1", "styrene", "monomer2", "n-butyl acrylate", "heat1", 60, "heat2", 0))
		wantNoError(t, r)
		in := planInputOf("semibatch")
		heat1, heat2 := 60.0, 0.0
		in.Heat1, in.Heat2 = &heat1, &heat2
		p, err := plan.Make(in)
		if err != nil {
			t.Fatal(err)
		}
		samePlan(t, r, p)
		if !r.Get("safety").Get("heat").IsNull() {
			t.Errorf("safety.heat = %s with heat2 = 0 (not known), want null", stringify(r.Get("safety").Get("heat")))
		}
	})

	t.Run("semibatch mixture with a time table", func(t *testing.T) {
		table := []any{[]any{0, 0}, []any{30, 0.2}, []any{90, 0.6}, []any{240, 0.97}}
		r := call(api, "plan", planArg("semibatch", "feed", "mixture", "feedF1", 0.9, "finalConversion", 0.9, "timeTable", table))
		wantNoError(t, r)
		in := planInputOf("semibatch")
		in.Feed, in.FeedF1, in.FinalConversion = plan.FeedMixture, 0.9, 0.9
		in.TimeTable = [][2]float64{{0, 0}, {30, 0.2}, {90, 0.6}, {240, 0.97}}
		p, err := plan.Make(in)
		if err != nil {
			t.Fatal(err)
		}
		samePlan(t, r, p)
		checkBalance(t, r, 1000)
		if got := r.Get("feedF1").Float(); got != 0.9 {
			t.Errorf("feedF1 = %v, want the 0.9 asked for", got)
		}
	})

	t.Run("shots with a half-life and a gas", func(t *testing.T) {
		r := call(api, "plan", planArg("shots", "monomer1", "styrene", "monomer2", "1,3-butadiene", "halfLife", 120, "shots", 40))
		wantNoError(t, r)
		bd, ok := copoly.PropertiesOf("1,3-butadiene")
		if !ok || bd.State != copoly.StateGas {
			t.Fatal("copoly no longer lists 1,3-butadiene as a gas; pick another gas")
		}
		in := planInputOf("shots")
		in.HalfLife, in.Shots = 120, 40
		in.Heat1, in.Heat2 = &styrene.HeatOfPolymerization, &bd.HeatOfPolymerization
		p, err := plan.Make(in)
		if err != nil {
			t.Fatal(err)
		}
		samePlan(t, r, p)
		checkBalance(t, r, 1000)
		if got := r.Get("shots").Length(); got != 40 {
			t.Errorf("%d shots, want the 40 asked for", got)
		}
		ini := r.Get("initial")
		if ini.Get("v1").IsNull() || !ini.Get("v2").IsNull() {
			t.Errorf("initial = %s, want v1 (liquid styrene) and v2 null (a gas)", stringify(ini))
		}
	})

	// Too few shots for the final conversion: the reactor runs dry between shots. The plan must
	// be refused, not shown truncated (copoly marks it with an infinite deviation).
	t.Run("too few shots", func(t *testing.T) {
		r := call(api, "plan", planArg("shots", "shots", 6))
		if r.Get("error").Type() != js.TypeString {
			t.Errorf("plan with 6 shots = %s…, want an error", stringify(r)[:200])
		}
	})

	t.Run("fewest shots", func(t *testing.T) {
		r := call(api, "plan", planArg("shots", "tolerance", 0.03))
		wantNoError(t, r)
		in := planInputOf("shots")
		in.Tolerance = 0.03
		p, err := plan.Make(in)
		if err != nil {
			t.Fatal(err)
		}
		samePlan(t, r, p)
		checkBalance(t, r, 1000)
	})

	t.Run("monomer not built in", func(t *testing.T) {
		r := call(api, "plan", planArg("batch", "monomer1", "Styrene", "monomer2", ""))
		wantNoError(t, r)
		notes := stringify(r.Get("notes"))
		if !r.Get("initial").Get("v1").IsNull() || !strings.Contains(notes, `monomer1 \"Styrene\" is not in the built-in list`) {
			t.Errorf("plan with an unknown monomer1: v1 %s, notes %s; want null and a note", stringify(r.Get("initial").Get("v1")), notes)
		}
		if strings.Contains(notes, "monomer2") {
			t.Errorf("notes %s mention monomer2, which was left empty", notes)
		}
	})
}

// planJCR is a small quadrilateral around (0.80, 0.15), the kind of region a fit returns.
var planJCR = [][2]float64{{0.70, 0.15}, {0.80, 0.12}, {0.90, 0.15}, {0.80, 0.18}}

func jcrArg(region [][2]float64) []any {
	out := make([]any, len(region))
	for i, p := range region {
		out[i] = []any{p[0], p[1]}
	}
	return out
}

func TestPlanBand(t *testing.T) {
	api, _ := testAPI(t)
	for _, c := range []struct {
		name    string
		mode    string
		extra   []any
		samples int
		seed    uint64
	}{
		{"semibatch, defaults", "semibatch", nil, 500, 1}, // defaults of site/copoly.d.ts: 500 samples, seed 1
		{"batch, 40 samples, seed 7", "batch", []any{"samples", 40, "seed", 7}, 40, 7},
		{"shots", "shots", []any{"shots", 40, "samples", 30}, 30, 1},
	} {
		t.Run(c.name, func(t *testing.T) {
			arg := planArg(c.mode, append([]any{"jcr", jcrArg(planJCR), "steps", 40}, c.extra...)...)
			r := call(api, "plan", arg)
			wantNoError(t, r)
			in := planInputOf(c.mode)
			in.Steps = 40
			if c.mode == "shots" {
				in.Shots = 40
			}
			p, err := plan.Make(in)
			if err != nil {
				t.Fatal(err)
			}
			samePlan(t, r, p)
			want, err := plan.BandOf(in, p, planJCR, c.samples, c.seed)
			if err != nil {
				t.Fatal(err)
			}
			b := r.Get("band")
			if b.Type() != js.TypeObject {
				t.Fatalf("band = %s, want an object", stringify(b))
			}
			if got := b.Get("samples").Int(); got != want.Samples || got != c.samples {
				t.Errorf("band.samples = %d, want %d", got, c.samples)
			}
			sameFloats(t, "F1Low", floatsOf(t, b.Get("F1Low")), want.InstLow)
			sameFloats(t, "F1High", floatsOf(t, b.Get("F1High")), want.InstHigh)
			sameFloats(t, "F1cumLow", floatsOf(t, b.Get("F1cumLow")), want.CumLow)
			sameFloats(t, "F1cumHigh", floatsOf(t, b.Get("F1cumHigh")), want.CumHigh)
			if b.Get("productLow").Float() != want.ProductLow || b.Get("productHigh").Float() != want.ProductHigh {
				t.Errorf("product band = [%v, %v], want [%v, %v]", b.Get("productLow").Float(), b.Get("productHigh").Float(), want.ProductLow, want.ProductHigh)
			}
			// The band is one entry per schedule row, low ≤ high.
			lo, hi := floatsOf(t, b.Get("F1cumLow")), floatsOf(t, b.Get("F1cumHigh"))
			if len(lo) != r.Get("schedule").Length() {
				t.Errorf("band has %d rows, schedule %d", len(lo), r.Get("schedule").Length())
			}
			for i := range lo {
				if lo[i] > hi[i] {
					t.Errorf("F1cumLow[%d] = %v > F1cumHigh = %v", i, lo[i], hi[i])
				}
			}
		})
	}
	// An empty region counts as none.
	r := call(api, "plan", planArg("batch", "jcr", []any{}))
	wantNoError(t, r)
	if !r.Get("band").IsUndefined() {
		t.Errorf("band with jcr [] = %s, want it absent", stringify(r.Get("band")))
	}
}

// TestPlanErrors checks that bad plan input gives an error object naming the input as in
// site/copoly.d.ts. The limits are copoly's constants (MaxPlanSteps, MaxShots, MaxTimeRows,
// MaxBandSamples) and project.MaxJCRPoints.
func TestPlanErrors(t *testing.T) {
	api, _ := testAPI(t)
	good := toJS(planArg("semibatch", "monomer1", "styrene", "timeTable", []any{[]any{0, 0}, []any{60, 0.5}, []any{120, 0.9}},
		"jcr", jcrArg(planJCR), "samples", 20))
	wantNoError(t, call(api, "plan", good))
	for _, c := range []struct{ name, edit, field, text string }{
		{"r1 negative", `a.r1 = -0.1`, "r1", "negative"},
		{"targetF1 missing", `delete a.targetF1`, "targetF1", "missing"},
		{"targetF1 text", `a.targetF1 = "0.5"`, "targetF1", "must be a number"},
		{"targetF1 NaN", `a.targetF1 = NaN`, "targetF1", "not a number"},
		{"targetF1 one", `a.targetF1 = 1`, "targetF1", "both monomers"},
		{"molarMass2 zero", `a.molarMass2 = 0`, "molarMass2", "positive"},
		{"polymerMass negative", `a.polymerMass = -5`, "polymerMass", "positive"},
		{"polymerMass infinite", `a.polymerMass = Infinity`, "polymerMass", "finite"},
		{"polymerMass a list", `a.polymerMass = [1000]`, "polymerMass", "must be a number"},
		{"mode unknown", `a.mode = "continuous"`, "mode", "not a plan mode"},
		{"mode missing", `delete a.mode`, "mode", "missing"},
		{"mode a number", `a.mode = 2`, "mode", "must be text"},
		{"monomer1 a number", `a.monomer1 = 7`, "monomer1", "must be text"},
		{"tolerance NaN", `a.tolerance = NaN`, "tolerance", "finite"},
		{"tolerance zero", `a.tolerance = 0`, "tolerance", "above 0"},
		{"tolerance too wide", `a.tolerance = 0.6`, "tolerance", "at most 0.5"},
		{"finalConversion one", `a.finalConversion = 1`, "finalConversion", "below 1"},
		{"finalConversion zero", `a.finalConversion = 0`, "finalConversion", "above 0"},
		{"stopConversion zero", `a.mode = "batch"; a.stopConversion = 0`, "stopConversion", "above 0"},
		{"feed unknown", `a.feed = "both"`, "feed", "not a feed"},
		{"feedF1 above one", `a.feed = "mixture"; a.feedF1 = 1.5`, "feedF1", "between 0 and 1"},
		{"feedF1 zero", `a.feed = "mixture"; a.feedF1 = 0`, "feedF1", "above 0"},
		{"feedF1 on the wrong side", `a.feed = "mixture"; a.feedF1 = 0.1`, "feedF1", "richer in the faster monomer"},
		{"shots fractional", `a.mode = "shots"; a.shots = 2.5`, "shots", "whole number"},
		{"shots too many", `a.mode = "shots"; a.shots = 501`, "shots", "between 0 and 500"},
		{"steps zero", `a.steps = 0`, "steps", "between 1 and 2000"},
		{"steps too many", `a.steps = 2001`, "steps", "between 1 and 2000"},
		{"rateConstant negative", `a.rateConstant = -0.01`, "rateConstant", "negative"},
		{"halfLife text", `a.halfLife = "1 h"`, "halfLife", "must be a number"},
		{"timeTable not a list", `a.timeTable = 5`, "timeTable", "a list of [time, conversion] pairs"},
		{"timeTable row a triple", `a.timeTable[1] = [1, 0.1, 3]`, "timeTable[1]", "pair [time, conversion]"},
		{"timeTable cell text", `a.timeTable[1] = [60, "50%"]`, "timeTable[1][1]", "must be a number"},
		{"timeTable cell NaN", `a.timeTable[2] = [NaN, 0.9]`, "timeTable[2][0]", "finite"},
		{"timeTable not increasing", `a.timeTable[2] = [60, 0.9]`, "timeTable[2]", "time increasing"},
		{"timeTable conversion falling", `a.timeTable[2] = [150, 0.4]`, "timeTable[2]", "not decreasing"},
		{"timeTable one row", `a.timeTable = [[0, 0]]`, "timeTable", "at least two rows"},
		{"timeTable too long", `a.timeTable = new Array(1001).fill([1, 0.5])`, "timeTable", "at most 1000"},
		{"heat2 negative", `a.heat2 = -70`, "heat2", "negative"},
		{"batchMass negative", `a.batchMass = -1`, "batchMass", "negative"},
		{"heatCapacity zero", `a.heatCapacity = 0`, "heatCapacity", "above 0"},
		{"riseLimit zero", `a.riseLimit = 0`, "riseLimit", "above 0"},
		{"jcr two points", `a.jcr = [[0.7, 0.1], [0.9, 0.2]]`, "jcr", "between 3 and 4096"},
		{"jcr point negative", `a.jcr[3] = [-0.1, 0.2]`, "jcr[3][0]", "negative"},
		{"jcr point text", `a.jcr[0] = [0.7, "0.1"]`, "jcr[0][1]", "must be a number"},
		{"jcr point single", `a.jcr[1] = [0.7]`, "jcr[1]", "pair [r1, r2]"},
		{"jcr too many", `a.jcr = new Array(4097).fill([0.5, 0.5])`, "jcr", "at most 4096"},
		{"jcr no area", `a.jcr = [[0.7, 0.1], [0.8, 0.1], [0.9, 0.1]]`, "jcr", "no area"},
		{"samples too few", `a.samples = 5`, "samples", "between 10 and 5000"},
		{"samples too many", `a.samples = 5001`, "samples", "between 1 and 5000"},
		{"seed negative", `a.seed = -1`, "seed", "between 0 and"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "plan", edited(good, c.edit)), c.field, c.text)
		})
	}
}

// TestPlanNotFinite checks that a plan holding a number that is not finite where the d.ts
// promises one is refused rather than handed to the page.
func TestPlanNotFinite(t *testing.T) {
	p, err := plan.Make(planInputOf("batch"))
	if err != nil {
		t.Fatal(err)
	}
	p.Schedule[3].Inventory = math.Inf(1)
	if path := nonFinite(planDTO(p)); path != "schedule[3].inventory" {
		t.Errorf("nonFinite(plan with an infinite inventory) = %q, want schedule[3].inventory", path)
	}
	p.Schedule[3].Inventory = 1
	if path := nonFinite(planDTO(p)); path != "" {
		t.Errorf("nonFinite(batch plan) = %q, want \"\" (NaN times and pump rates become null)", path)
	}
}

func TestStarvedFeed(t *testing.T) {
	api, _ := testAPI(t)
	arg := map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.5, "feedRate": 5, "rateConstant": 0.01, "molarMass1": planMM1, "molarMass2": planMM2}
	r := call(api, "starvedFeed", arg)
	wantNoError(t, r)
	m := copoly.Terminal{R1: 0.8, R2: 0.15}
	inv, f1, err := plan.StarvedFeed(m, 0.5, 5, 0.01, planMM1, planMM2)
	if err != nil {
		t.Fatal(err)
	}
	if r.Get("inventory").Float() != inv || r.Get("f1").Float() != f1 {
		t.Errorf("starvedFeed = %s, want inventory %v, f1 %v", stringify(r), inv, f1)
	}
	// Quasi-steady state (Asua, Polymer Reaction Engineering, 2007): k·N = molar feed rate, so
	// the inventory is feedRate/(k·M̄(F1)) · M̄(f1*), f1* the feed giving F1 (Mayo–Lewis).
	s, err := m.FeedFor(0.5)
	if err != nil {
		t.Fatal(err)
	}
	fs := s.Feeds[0]
	want := 5 / (0.01 * (0.5*planMM1 + 0.5*planMM2)) * (fs*planMM1 + (1-fs)*planMM2)
	if got := r.Get("inventory").Float(); !scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-12) {
		t.Errorf("inventory = %v g, want %v g", got, want)
	}
	if got := r.Get("f1").Float(); got != fs {
		t.Errorf("f1 = %v, want the feed %v giving F1 = 0.5", got, fs)
	}
	good := toJS(arg)
	for _, c := range []struct{ name, edit, field, text string }{
		{"feedRate zero", `a.feedRate = 0`, "feedRate", "positive"},
		{"feedRate text", `a.feedRate = "5 g/min"`, "feedRate", "must be a number"},
		{"rateConstant missing", `delete a.rateConstant`, "rateConstant", "missing"},
		{"rateConstant NaN", `a.rateConstant = NaN`, "rateConstant", "finite"},
		{"targetF1 above one", `a.targetF1 = 1.2`, "targetF1", "between 0 and 1"},
		{"molarMass1 negative", `a.molarMass1 = -1`, "molarMass1", "positive"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "starvedFeed", edited(good, c.edit)), c.field, c.text)
		})
	}
}

// TestLibraryMonomerData checks the MonomerData fields of library().monomers against copoly.
func TestLibraryMonomerData(t *testing.T) {
	api, _ := testAPI(t)
	r := call(api, "library")
	wantNoError(t, r)
	ms := r.Get("monomers")
	for i, m := range copoly.Monomers() {
		g := ms.Index(i)
		pr, ok := copoly.PropertiesOf(m.Name)
		if !ok {
			t.Errorf("%s has no process data in copoly; MonomerData needs it", m.Name)
			continue
		}
		if g.Get("name").String() != m.Name || g.Get("formula").String() != m.Formula {
			t.Errorf("monomers[%d] = %s, want %s", i, stringify(g), m.Name)
		}
		for _, c := range []struct {
			key  string
			want any
		}{
			{"state", pr.State}, {"density", pr.Density}, {"densityTemp", pr.DensityTemp},
			{"densitySource", pr.DensitySource}, {"heat", pr.HeatOfPolymerization}, {"heatSource", pr.HeatSource},
			{"hazardSource", pr.HazardSource},
		} {
			if got, want := stringify(g.Get(c.key)), stringify(toJS(c.want)); got != want {
				t.Errorf("%s.%s = %s, want %s", m.Name, c.key, got, want)
			}
		}
		if !slices.Contains([]string{"liquid", "gas", "solid"}, pr.State) {
			t.Errorf("%s.state = %q, not a state of the d.ts", m.Name, pr.State)
		}
		if got, want := stringify(g.Get("hazards")), stringify(toJS(orNoTexts(pr.Hazards))); got != want {
			t.Errorf("%s.hazards = %s, want %s", m.Name, got, want)
		}
		q, hasQE := copoly.QEOf(m.Name)
		switch {
		case hasQE && (g.Get("q").Float() != q.Q || g.Get("e").Float() != q.E || g.Get("qeSource").String() != q.Source):
			t.Errorf("%s q, e = %s, %s, want %v, %v", m.Name, stringify(g.Get("q")), stringify(g.Get("e")), q.Q, q.E)
		case !hasQE && (!g.Get("q").IsNull() || !g.Get("e").IsNull() || g.Get("qeSource").String() != ""):
			t.Errorf("%s has no Q–e values in copoly; q, e = %s, %s, want null", m.Name, stringify(g.Get("q")), stringify(g.Get("e")))
		}
	}
}

// TestProjectWithPlan round-trips a project with a plan section through checkProject,
// exportProject, importProject and storage, and runs the demo project's plan settings through
// plan as the page does.
func TestProjectWithPlan(t *testing.T) {
	api, _ := testAPI(t)
	demo := demoArg(t, api)
	dp := project.Demo().Plan
	pl := demo.Get("project").Get("plan")
	if pl.Type() != js.TypeObject {
		t.Fatalf("demo project plan = %s, want an object", stringify(pl))
	}
	if got, want := stringify(pl), mustJSON(t, *dp); got != want {
		t.Errorf("demo plan = %s, want %s", got, want)
	}
	// The demo plan through plan, as the page calls it.
	r := call(api, "plan", jsEval(`((d) => { const p = d.project;
		return Object.assign({r1: p.r1, r2: p.r2, monomer1: p.monomer1.name, monomer2: p.monomer2.name,
			molarMass1: p.monomer1.molarMass, molarMass2: p.monomer2.molarMass}, p.plan); })`).Invoke(demo))
	wantNoError(t, r)
	checkBalance(t, r, dp.PolymerMass)
	if r.Get("safety").Get("rise").IsNull() {
		t.Errorf("demo plan safety = %s, want a rise from the library heats", stringify(r.Get("safety")))
	}

	arg := jsEval(`((d) => { const p = structuredClone(d.project);
		p.plan = {mode: "shots", targetF1: 0.35, polymerMass: 12.5, tolerance: 0.01, stopConversion: 0.4,
			finalConversion: 0.9, feed: "mixture", feedF1: 0.55, shots: 9, rateLaw: "table", rateConstant: 0.004,
			halfLife: 170, timeTable: [[0, 0], [12.5, 0.05], [40, 0.3]], heat1: 69.9, heat2: 1000,
			batchMass: 40, heatCapacity: 1.9, riseLimit: 20};
		return {project: p}; })`).Invoke(demo)
	exported := checkedExport(t, api, arg)
	imp := call(api, "importProject", map[string]any{"json": exported})
	wantNoError(t, imp)
	if stringify(imp) != stringify(arg) {
		t.Errorf("importProject(exportProject(p)) = %s, want %s", stringify(imp), stringify(arg))
	}
	wantNoError(t, await(t, call(api, "saveProject", arg)))
	loaded := await(t, call(api, "loadProject"))
	wantNoError(t, loaded)
	if got, want := stringify(loaded.Get("project").Get("plan")), stringify(arg.Get("project").Get("plan")); got != want {
		t.Errorf("loadProject() plan after a save = %s, want %s", got, want)
	}

	// Keys not given (0 or "") are left out, as in the file; no plan stays no plan.
	r = call(api, "checkProject", edited(arg, `a.project.plan = {mode: "", targetF1: 0.4, shots: 0, feed: "", rateLaw: "", timeTable: [], heat1: 0}`))
	wantNoError(t, r)
	if got := stringify(r.Get("project").Get("plan")); got != `{"targetF1":0.4}` {
		t.Errorf("plan with empty keys = %s, want {\"targetF1\":0.4}", got)
	}
	r = call(api, "checkProject", edited(arg, `delete a.project.plan`))
	wantNoError(t, r)
	if !r.Get("project").Get("plan").IsUndefined() {
		t.Errorf("project without a plan gives plan %s, want it absent", stringify(r.Get("project").Get("plan")))
	}
}
