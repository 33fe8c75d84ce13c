//go:build js && wasm

package main

import (
	"math"
	"strings"
	"testing"

	"copoly/copoly/fit"
	"copoly/copoly/plan"
)

// The conversion of results holding numbers that are not finite, which no valid input produces
// today: the results are built by hand.

func TestNonFiniteLists(t *testing.T) {
	inf, one := math.Inf(1), 1.0
	for _, c := range []struct {
		name string
		v    any
		want string
	}{
		{"finite", chainStatsOut{Compositions: []float64{0.5, 1}, Lengths: []int{2, 3}}, ""},
		{"NaN in a list of numbers", chainStatsOut{Compositions: []float64{0.5, 1, math.NaN()}}, "compositions[2]"},
		{"Inf in the histogram", chainStatsOut{Histogram: chainHistogramOut{Weights: []float64{0, inf}}}, "histogram.weights[1]"},
		{"null standard error", modelFitOut{SE: []*float64{&one, nil}}, ""},
		{"infinite standard error", modelFitOut{SE: []*float64{&one, &inf}}, "se[1]"},
		{"in a list of rows", predictedOut{Penultimate: []triadRowOut{{}, {A212: math.NaN()}}}, "penultimate[1].A212"},
	} {
		if got := nonFinite(c.v); got != c.want {
			t.Errorf("%s: nonFinite() = %q, want %q", c.name, got, c.want)
		}
	}
}

// TestPlanNotFinite checks that a plan holding a number that is not finite where the d.ts
// promises one is refused rather than handed to the page.
func TestPlanNotFinite(t *testing.T) {
	p, err := plan.Make(plan.Input{Model: term, TargetF1: 0.5, MolarMass1: mmSt, MolarMass2: mmNBA, PolymerMass: 1000, Mode: plan.ModeBatch})
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

// TestFitValueNotFinite checks the conversion of results holding numbers that are not finite:
// copoly reports a singular covariance as +Inf standard errors and a NaN correlation (they
// become null), and any other such number leaves its method out with a warning. The estimates
// are built by hand; no fit produces the second kind today.
func TestFitValueNotFinite(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	region := fit.Region{Level: 0.95, Kind: "F", Critical: 1, Boundary: [][2]float64{{0.5, 0.1}, {1, 0.1}, {0.7, 0.3}}, R1Min: 0.5, R1Max: 1, R2Min: 0.1, R2Max: 0.3}
	e := &fit.Estimates{
		FinemanRoss:        &fit.Linear{R1: 0.8, R2: 0.15, X: []float64{1, 2}, Y: []float64{1, nan}, Slope: 0.8, Intercept: -0.15},
		KelenTudos:         &fit.Linear{R1: 0.8, R2: 0.15, X: []float64{0.1, 0.9}, Y: []float64{0.1, 0.5}, Slope: 1, Intercept: 0, Alpha: 0.3},
		Nonlinear:          &fit.Nonlinear{R1: 0.8, R2: 0.15, SE1: inf, SE2: inf, Corr: nan, N: 3, DoF: 1, Residuals: []float64{0, 0, 0}, Region: region},
		EVM:                &fit.EVM{R1: 0.8, R2: 0.15, SE1: 0.1, SE2: 0.1, Phi: inf, Region: fit.Region{Kind: "ellipse", Open: true}},
		Recommended:        fit.MethodEVM,
		TrendFeed:          fit.Trend{Slope: nan, PValue: nan},
		SwappedFinemanRoss: &fit.Linear{R1: inf, R2: 0.1},
	}
	v := fitValue(e, true)
	m := v.Get("methods")
	if !m.Get("fineman-ross").IsUndefined() || m.Get("kelen-tudos").IsUndefined() {
		t.Errorf("methods = %s, want fineman-ross (NaN in y) left out and kelen-tudos kept", stringify(m))
	}
	nl := m.Get("nonlinear")
	if nl.IsUndefined() || !nl.Get("se1").IsNull() || !nl.Get("se2").IsNull() || !nl.Get("corr").IsNull() {
		t.Errorf("nonlinear = %s, want se1, se2, corr null", stringify(nl))
	}
	if !m.Get("evm").IsUndefined() || v.Get("recommended").String() != "nonlinear" {
		t.Errorf("evm %s with Φ = +Inf, recommended %s; want evm left out and nonlinear recommended", stringify(m.Get("evm")), v.Get("recommended").String())
	}
	if f := v.Get("trends").Get("feed"); f.Get("slope").Float() != 0 || f.Get("pValue").Float() != 1 || f.Get("flagged").Bool() {
		t.Errorf("trends.feed from NaN = %s, want slope 0, pValue 1, not flagged", stringify(f))
	}
	if !v.Get("swappedFinemanRoss").IsUndefined() {
		t.Errorf("swappedFinemanRoss = %s with r1 = +Inf, want it absent", stringify(v.Get("swappedFinemanRoss")))
	}
	text := stringify(v.Get("warnings"))
	for _, want := range []string{`"method":"fineman-ross"`, "y[1]", `"method":"evm"`, "phi", "with the feed"} {
		if !strings.Contains(text, want) {
			t.Errorf("warnings %s do not mention %s", text, want)
		}
	}
	// An EVM region without a boundary (singular) still gives lists, not null.
	if b := toJS(evmDTO(&fit.EVM{Region: fit.Region{Open: true}})).Get("jcr"); !isArray(b) || b.Length() != 0 {
		t.Errorf("jcr of an empty region = %s, want []", stringify(b))
	}
}
