//go:build !js

package browsertest

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// The pair of the planning test: styrene (M1) / n-butyl acrylate (M2), r1 = 0.80, r2 = 0.15,
// from Polymer Handbook, 4th ed. (Wiley 1999), section II, Greenley's reactivity-ratio table,
// ref. 549 (the entry copoly's library quotes). Molar masses from the formulas C8H8 and C7H12O2
// with the IUPAC standard atomic weights (Pure Appl. Chem. 2022, 94, 573).
const (
	planR1  = 0.80
	planR2  = 0.15
	planMM1 = 104.15
	planMM2 = 128.17

	planTarget = 0.5  // the copolymer the test asks for (input)
	planMass   = 1000 // g of copolymer the test asks for (input)
)

// feedForTarget solves the Mayo–Lewis equation (F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 66,
// 1594 (1944)) for the feed f1 in (0, 1) that gives the copolymer F1 = target, by bisection: F1
// rises with f1 for these ratios (both below 1, no azeotrope crossing the target's side).
func feedForTarget(r1, r2, target float64) float64 {
	lo, hi := 1e-12, 1-1e-12
	for range 200 {
		mid := (lo + hi) / 2
		if mayoLewis(r1, r2, mid) < target {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

// TestBrowserPlanning uses the feed-planning panel as a chemist would: it asks for a semi-batch
// making 1000 g of a 50:50 (mol) styrene/n-butyl acrylate copolymer, reads the schedule and the
// recipe and checks them against the Mayo–Lewis feed and the mass balance of styrene, checks the
// safety box, types a bad amount to see it refused and never saved, reloads to see the panel's
// inputs come back, and adds a monomer of its own to see it offered in the pickers.
func TestBrowserPlanning(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	waitPlan(t, ctx, "the first plan", "Plan:")
	w.check(t, "loading the page")

	setInput(t, ctx, "r1", strconv.FormatFloat(planR1, 'f', -1, 64))
	setInput(t, ctx, "r2", strconv.FormatFloat(planR2, 'f', -1, 64))
	setInput(t, ctx, "mass1", strconv.FormatFloat(planMM1, 'f', -1, 64))
	setInput(t, ctx, "mass2", strconv.FormatFloat(planMM2, 'f', -1, 64))
	// Leave the settings the page starts with, so that the reload below shows what was typed.
	setSelect(t, ctx, "plan-mode", "batch")
	setInput(t, ctx, "plan-mass", "250")
	waitPlan(t, ctx, "a batch plan for 250 g", "Plan: 250 g", "by batch")

	setSelect(t, ctx, "plan-mode", "semibatch")
	setSelect(t, ctx, "plan-feed", "faster")
	setInput(t, ctx, "plan-target", "0.5")
	setInput(t, ctx, "plan-mass", "1000")
	setInput(t, ctx, "plan-tolerance", "0.015")
	setSelect(t, ctx, "plan-rate", "k")
	setInput(t, ctx, "plan-k", "0,02")
	waitPlan(t, ctx, "the semi-batch plan", "Plan: 1000 g", "F1 = 0.500 ± 0.015", "by semi-batch", "metering styrene")
	checkSchedule(t, ctx, "after planning")
	w.check(t, "planning a semi-batch")

	// The schedule shows every 10th row; the toggle shows all 201 (200 steps and the start, the
	// default of copoly.plan in copoly.d.ts).
	if n := evalJS[int](t, ctx, `document.querySelectorAll("#plan-schedule tbody tr").length`); n != 21 {
		t.Errorf("#plan-schedule shows %d rows, want 21 (every 10th of 201)", n)
	}
	click(t, ctx, "plan-all-rows")
	waitUntil(t, ctx, "all 201 schedule rows", `
		const n = document.querySelectorAll("#plan-schedule tbody tr").length;
		return n === 201 ? "" : n + " rows";`, stepTimeout)
	click(t, ctx, "plan-all-rows")

	// The charge is made at the Mayo–Lewis feed for the target, and styrene balances: all that
	// goes in ends up in the polymer (F1 of it by moles) or unreacted at the feed composition.
	fstar := feedForTarget(planR1, planR2, planTarget)
	got := evalJS[map[string]string](t, ctx, `(() => {
		const facts = {};
		for (const d of document.querySelectorAll("#plan-facts > div")) facts[d.querySelector("dt").textContent] = d.querySelector("dd").textContent;
		const rows = document.querySelectorAll("#plan-schedule tbody tr");
		const last = rows[rows.length - 1];
		return {
			start: facts["Charge the reactor at feed f1"] || "",
			total1: document.querySelector('#plan-recipe tbody tr:first-child td[data-col="total"]').textContent,
			inventory: last.querySelector('td[data-col="inventory"]').textContent,
			time: last.querySelector('td[data-col="time"]') ? last.querySelector('td[data-col="time"]').textContent : "(no time column)",
			pump: last.querySelector('td[data-col="pump1"]') ? last.querySelector('td[data-col="pump1"]').textContent : "(no pump column)",
		};
	})()`)
	if v, err := strconv.ParseFloat(got["start"], 64); err != nil || math.Abs(v-fstar) > 6e-4 {
		t.Errorf("charge feed f1 = %q, want %.4f (Mayo–Lewis solved for F1 = %v)", got["start"], fstar, planTarget)
	}
	total1, err1 := strconv.ParseFloat(got["total1"], 64)
	inv, err2 := strconv.ParseFloat(got["inventory"], 64)
	if err1 != nil || err2 != nil {
		t.Fatalf("recipe total of M1 %q or last inventory %q is not a number", got["total1"], got["inventory"])
	}
	inPolymer := planMass * planTarget * planMM1 / (planTarget*planMM1 + (1-planTarget)*planMM2)
	unreacted := inv * fstar * planMM1 / (fstar*planMM1 + (1-fstar)*planMM2)
	// Each printed mass is rounded to 0.1 g.
	if want := inPolymer + unreacted; math.Abs(total1-want) > 0.2 {
		t.Errorf("styrene in all = %v g; the polymer holds %.2f g and the unreacted %.1f g hold %.2f g, so want %.2f g", total1, inPolymer, inv, unreacted, want)
	}
	if _, err := strconv.ParseFloat(got["time"], 64); err != nil {
		t.Errorf("last schedule row time = %q, want minutes (a rate constant was given)", got["time"])
	}
	if _, err := strconv.ParseFloat(got["pump"], 64); err != nil {
		t.Errorf("last schedule row styrene pump rate = %q, want g/min", got["pump"])
	}

	// The safety box stands beside the plan with the adiabatic rise in K and the data-sheet advice.
	waitUntil(t, ctx, "the safety box with a rise in K", `
		const box = document.getElementById("plan-safety");
		if (!box || !box.checkVisibility()) return "#plan-safety is not shown";
		const v = document.getElementById("plan-rise-value");
		if (!v) return "#plan-rise: " + JSON.stringify(document.getElementById("plan-rise").textContent);
		if (!/^\d+(\.\d)? K$/.test(v.textContent)) return "#plan-rise-value: " + JSON.stringify(v.textContent);
		if (!/\d+(\.\d)? g/.test(document.getElementById("plan-inventory").textContent)) return "#plan-inventory: " + document.getElementById("plan-inventory").textContent;
		return /safety data sheet/.test(box.textContent) && /licensed professionals/.test(box.textContent) ? "" : "the cautions are missing";`, stepTimeout)
	storedProject(t, ctx, "the plan settings to be saved", planStored)
	w.check(t, "checking the plan")

	// A bad amount is marked beside its box, kept as typed, the last plan stays, nothing is saved.
	setInput(t, ctx, "plan-mass", "lots")
	waitUntil(t, ctx, "#plan-mass to be marked", `
		const m = document.getElementById("plan-mass");
		if (m.getAttribute("aria-invalid") !== "true") return "aria-invalid=" + m.getAttribute("aria-invalid");
		const e = document.getElementById("plan-mass-error");
		return e.checkVisibility() && e.textContent.includes("lots") ? "" : "message: " + JSON.stringify(e.textContent);`, stepTimeout)
	checkSchedule(t, ctx, "after typing a bad amount (the last plan stays)")
	if v := evalJS[string](t, ctx, `document.getElementById("plan-mass").value`); v != "lots" {
		t.Errorf("#plan-mass = %q after typing, want the typed text kept", v)
	}
	run(t, ctx, "wait for a save that must not happen", chromedp.Sleep(saveSettle))
	storedProject(t, ctx, "the stored plan to keep 1000 g", planStored)
	w.check(t, "typing a bad amount")

	// Reload: the inputs come back from the stored project, and the plan with them.
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	waitPlan(t, ctx, "the plan after a reload", "Plan: 1000 g", "by semi-batch")
	for id, want := range map[string]string{"plan-mode": "semibatch", "plan-target": "0.5", "plan-mass": "1000",
		"plan-tolerance": "0.015", "plan-rate": "k", "plan-k": "0.02", "plan-feed": "faster"} {
		if v := evalJS[string](t, ctx, fmt.Sprintf(`document.getElementById(%s).value`, jsString(id))); v != want {
			t.Errorf("after a reload #%s = %q, want %q", id, v, want)
		}
	}
	checkSchedule(t, ctx, "after a reload")
	checkNoFatalBanner(t, ctx)
	w.check(t, "reloading the page")

	// A measured conversion–time table (pasted with decimal commas and a header) and a heat of
	// your own for M1 are saved with the project and come back after a reload, the table as the
	// saved numbers. The values are test inputs, invented.
	setSelect(t, ctx, "plan-rate", "table")
	setInput(t, ctx, "plan-table", "min\tX\n0\t0\n30\t0,2\n60\t0,4\n120\t0,7\n240\t0,99\n")
	setInput(t, ctx, "plan-heat1", "75,5")
	waitPlan(t, ctx, "the plan with a measured table", "Plan: 1000 g", "by semi-batch")
	storedProject(t, ctx, "the table and the heat to be saved", planTableStored)
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	waitPlan(t, ctx, "the table plan after a reload", "Plan: 1000 g", "by semi-batch")
	for id, want := range map[string]string{"plan-rate": "table", "plan-heat1": "75.5", "plan-heat2": "",
		"plan-table": "0\t0\n30\t0.2\n60\t0.4\n120\t0.7\n240\t0.99"} {
		if v := evalJS[string](t, ctx, fmt.Sprintf(`document.getElementById(%s).value`, jsString(id))); v != want {
			t.Errorf("after a reload #%s = %q, want %q", id, v, want)
		}
	}
	// The table gives the schedule a time axis, within the table's 240 min.
	last := evalJS[string](t, ctx, `(() => { const c = document.querySelector('#plan-schedule tbody tr:last-child td[data-col="time"]'); return c ? c.textContent : "(no time column)"; })()`)
	if v, err := strconv.ParseFloat(last, 64); err != nil || v <= 0 || v > 240 {
		t.Errorf("after a reload the last schedule row time = %q, want minutes within the table's 0–240", last)
	}
	storedProject(t, ctx, "the table and the heat to stay saved", planTableStored)
	w.check(t, "saving a measured table and a heat")

	// A monomer of your own is saved with the project and offered in the pickers as (yours).
	evalJS[bool](t, ctx, `document.getElementById("own-box").open = true`)
	setInput(t, ctx, "um-name", "invented acrylate (test)")
	setInput(t, ctx, "um-mass", "200,5")
	setSelect(t, ctx, "um-state", "liquid")
	setInput(t, ctx, "um-density", "1.02")
	click(t, ctx, "um-save")
	waitUntil(t, ctx, "the monomer of your own in the pickers", `
		const o = [...document.querySelectorAll("#pick1 option, #pick2 option")].map(o => o.textContent);
		return o.filter(t => t === "invented acrylate (test) (yours, 200.5 g/mol)").length === 2 ? "" : "options: " + JSON.stringify(o.filter(t => /yours/.test(t)));`, stepTimeout)
	storedProject(t, ctx, "the monomer of your own to be saved", `
		const m = (p.userMonomers || [])[0];
		return m && m.name === "invented acrylate (test)" && m.molarMass === 200.5 && m.density === 1.02 && m.state === "liquid" ? "" : "userMonomers: " + JSON.stringify(p.userMonomers || null);`)
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	waitUntil(t, ctx, "the monomer of your own after a reload", `
		return [...document.querySelectorAll("#pick2 option")].some(o => o.textContent.startsWith("invented acrylate (test) (yours")) ? "" : "not in #pick2";`, stepTimeout)
	w.check(t, "adding a monomer of your own")
}

// planStored is the body of a storedProject check: the plan settings the test typed.
const planStored = `
	const pl = p.plan || {};
	const want = {mode: "semibatch", targetF1: 0.5, polymerMass: 1000, tolerance: 0.015, rateConstant: 0.02};
	for (const k in want) if (pl[k] !== want[k]) return "plan." + k + " = " + JSON.stringify(pl[k]) + ", want " + want[k];
	return "";`

// planTableStored is the body of a storedProject check: the rate law, table and heat the test
// typed, the table's conversions as fractions of the decimal-comma text.
const planTableStored = `
	const pl = p.plan || {};
	const table = JSON.stringify([[0, 0], [30, 0.2], [60, 0.4], [120, 0.7], [240, 0.99]]);
	if (pl.rateLaw !== "table") return "plan.rateLaw = " + JSON.stringify(pl.rateLaw);
	if (JSON.stringify(pl.timeTable) !== table) return "plan.timeTable = " + JSON.stringify(pl.timeTable);
	if (pl.heat1 !== 75.5 || pl.heat2 !== undefined) return "plan.heat1, heat2 = " + pl.heat1 + ", " + pl.heat2;
	if (pl.rateConstant !== undefined) return "plan.rateConstant = " + pl.rateConstant + ", want none with a table";
	return "";`

// waitPlan waits until #plan-status holds every one of texts.
func waitPlan(t *testing.T, ctx context.Context, what string, texts ...string) {
	t.Helper()
	want, _ := json.Marshal(texts)
	waitUntil(t, ctx, what, fmt.Sprintf(`
		const s = document.getElementById("plan-status").textContent;
		return %s.every(x => s.includes(x)) ? "" : "#plan-status: " + JSON.stringify(s);`, string(want)), stepTimeout)
}

// checkSchedule checks the schedule on screen: rows shown, the last one at the copolymer mass
// asked for (to 0.1 g: copoly.d.ts, PlanRow.polymer reaches polymerMass at the end), the fed
// styrene increasing from row to row (the metered monomer), and F1 at the target throughout (the
// semi-batch holds the feed, so Mayo–Lewis gives the target F1 at every step).
func checkSchedule(t *testing.T, ctx context.Context, when string) {
	t.Helper()
	waitUntil(t, ctx, "schedule rows "+when, `
		const rows = document.querySelectorAll("#plan-schedule tbody tr");
		return rows.length > 2 && document.getElementById("plan-schedule").checkVisibility() ? "" : rows.length + " rows shown";`, stepTimeout)
	cols := evalJS[map[string][]string](t, ctx, `(() => {
		const out = {};
		for (const k of ["polymer", "fed1", "F1"]) out[k] = [...document.querySelectorAll('#plan-schedule tbody td[data-col="' + k + '"]')].map(td => td.textContent);
		return out;
	})()`)
	polymer, fed1, f1 := cols["polymer"], cols["fed1"], cols["F1"]
	if len(polymer) < 3 || len(fed1) != len(polymer) || len(f1) != len(polymer) {
		t.Fatalf("%s: schedule columns polymer %d, fed1 %d, F1 %d cells", when, len(polymer), len(fed1), len(f1))
	}
	if v, err := strconv.ParseFloat(polymer[len(polymer)-1], 64); err != nil || math.Abs(v-planMass) > 0.1 {
		t.Errorf("%s: last row polymer = %q g, want %v ± 0.1", when, polymer[len(polymer)-1], planMass)
	}
	prev := math.Inf(-1)
	for i, s := range fed1 {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || !(v > prev) {
			t.Errorf("%s: fed M1 in shown row %d = %q after %v; want it to increase row by row (all %v)", when, i+1, s, prev, fed1)
			break
		}
		prev = v
	}
	for i, s := range f1 {
		if strings.TrimSpace(s) != "0.500" {
			t.Errorf("%s: F1 in shown row %d = %q, want 0.500 throughout (all %v)", when, i+1, s, f1)
			break
		}
	}
}
