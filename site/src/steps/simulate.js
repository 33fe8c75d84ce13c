// @ts-check
// Step 9, simulated chains: chains grown one unit at a time with the model of step 4 from the
// starting feed of step 3 (copoly.chains with the simulation options), their spread in
// composition against Stockmayer's distribution, and the chains without a functional unit. The
// panel's inputs stay in the tab.

import { $, field, select, setText } from "../dom.js";
import * as engine from "../engine.js";
import { C, figNote, fileBase, mountFigure } from "../figures.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { fix, m1Name, m2Name, pct, sentence, shortNum, sig3 } from "../format.js";
import { chainsText } from "../messages.js";
import { MODEL_NAME, modelArgs, modelKind } from "../model.js";
import { parseNumber } from "../numbers.js";
import { chart, strips } from "../plot.js";

/** @import { ChainsResult, Project } from "../../copoly" */
/** @import { ArgOf } from "../engine.js" */
/** @import { Ctx, Step } from "../main.js" */
/** @import { Layer, LegendEntry } from "../plot.js" */

/** @type {Ctx} */
let ctx;
let started = false;
let simKey = "";     // the model and starting feed the chains on screen were grown with ("" none)

/** @param {Project} p */
const keyOf = (p) => JSON.stringify([modelArgs(p), p.f10]);

// runSim grows the chains of the simulation with the panel's inputs.
function runSim() {
  return engine.newest("sim", async (job) => {
    const p = ctx.store.get("project");
    if (!p || !engine.running()) return;
    let bad = false;
    /** @param {string} sel @param {string} label */
    const get = (sel, label) => {
      const input = field(sel), raw = input.value.trim(), v = parseNumber(raw);
      clearFieldError(input);
      if (Number.isNaN(v)) {
        setFieldError(input, raw ? `${label} = “${raw}” is not a number.` : `Enter the ${label}.`);
        bad = true;
      }
      return v;
    };
    const byDpn = select("#sim-kind").value === "dpn";
    /** @type {ArgOf<"chains">} */
    const a = { ...modelArgs(p), f10: p.f10, count: get("#sim-count", "number of chains"), conversion: get("#sim-conversion", "conversion"), seed: get("#sim-seed", "seed") };
    a[byDpn ? "dpn" : "length"] = get("#sim-n", byDpn ? "DPn" : "chain length");
    const functional = select("#sim-functional").value;
    if (functional) a.functional = functional === "1" ? 1 : 2;
    const not = simKey ? "Not updated" : "No chains yet";
    if (bad) return setText("#sim-status", `${not}: correct the marked field.`);
    const c = await job.call("chains", a);
    if (engine.isError(c)) {
      /** @type {Record<string, string>} */
      const boxes = { dpn: "#sim-n", length: "#sim-n", count: "#sim-count", conversion: "#sim-conversion", seed: "#sim-seed" };
      const sel = boxes[c.field || ""];
      if (sel) setFieldError($(sel), chainsText(c.error));
      return setText("#sim-status", `${not}: ${sel ? "correct the marked field." : sentence(c.error) + " See steps 1, 3 and 4."}`);
    }
    simKey = keyOf(p);
    drawSim(p, c, a);
  });
}

/** @param {Project} p @param {ChainsResult} c @param {ArgOf<"chains">} a */
function drawSim(p, c, a) {
  $("#sim-results").hidden = false;
  const comps = c.compositions || [], n = comps.length;
  setText("#sim-status", `${n} chains, ${c.units} units in all, grown with the ${MODEL_NAME[modelKind(p)]} from f10 = ${fix(p.f10, 3)}` +
    ((a.conversion || 0) > 0 ? ` along a batch to X = ${shortNum(a.conversion)}.` : " at a constant feed."));
  const sv = c.stockmayerVariance;
  const variance = c.variance || 0;
  setText("#sim-summary", `Chain composition F1: mean ${fix(c.mean, 4)} over chains, ${fix(c.weightMean, 4)} over units; variance between chains ${sig3(variance)} (standard deviation ${fix(Math.sqrt(variance), 3)}). ` +
    (typeof sv === "number" && Number.isFinite(sv) ? `Stockmayer's distribution predicts ${sig3(sv)} for chains of these lengths (F1·F2·κ·⟨1/n⟩, terminal model at a constant feed).`
      : "Stockmayer's variance holds for the terminal model at a constant feed only."));

  const h = c.histogram || { edges: [0, 1], weights: [0] }, nb = h.weights.length, mid = h.edges.slice(0, nb).map((e, i) => (e + h.edges[i + 1]) / 2);
  const sm = c.stockmayer || null;
  /** @type {Layer[]} */
  const layers = [{ type: "bars", x0: h.edges.slice(0, nb), x1: h.edges.slice(1), y: h.weights, color: C.inst }];
  /** @type {LegendEntry[]} */
  const legend = [{ label: "simulated chains", color: C.inst, kind: "box" }];
  if (sm) {
    layers.push({ type: "line", x: mid, y: sm, color: C.cum, width: 2.4 });
    legend.push({ label: "Stockmayer's distribution", color: C.cum });
  }
  const top = Math.max(...h.weights, ...(sm || []), 1e-9);
  // The axis spans the bins that hold anything.
  const used = h.weights.map((w, i) => w > 0 || (sm !== null && sm[i] > top * 1e-3));
  const i0 = Math.max(0, used.indexOf(true) - 1), i1 = Math.min(nb, used.lastIndexOf(true) + 2);
  mountFigure("fig-sim-hist", chart({
    title: `Composition of ${n} chains`, width: 600, height: 380,
    x: { min: h.edges[i0], max: h.edges[i1] > h.edges[i0] ? h.edges[i1] : h.edges[i0] + 1e-3, label: "F1 of the chain", ticks: 6 },
    y: { min: 0, max: top * 1.1, label: "fraction of units" }, layers, legend,
  }), fileBase(p, "chain-compositions"), [["F1 from", "F1 to", "fraction of units", ...(sm ? ["Stockmayer"] : [])],
    ...h.weights.map((w, i) => [h.edges[i], h.edges[i + 1], w, ...(sm ? [sm[i]] : [])])]);

  const fc = c.functionalCounts;
  const name = a.functional === 1 ? m1Name(p) : m2Name(p);
  if (fc && fc.length) {
    const k = fc.map((_, i) => i), frac = fc.map((v) => v / n);
    let sum = 0;
    const last = Math.max(1, frac.findIndex((v) => (sum += v) >= 0.995));
    mountFigure("fig-sim-func", chart({
      title: `Units of M${a.functional} (${name}) per chain`, width: 600, height: 340,
      x: { min: -0.6, max: last + 0.6, label: "functional units in the chain", integer: true },
      y: { min: 0, max: Math.max(...frac, 1e-9) * 1.1, label: "fraction of chains" },
      layers: [{ type: "bars", x0: k.map((v) => v - 0.4), x1: k.map((v) => v + 0.4), y: frac, color: a.functional === 1 ? C.m1 : C.m2 }],
    }), fileBase(p, "functional-units"), [["units", "chains", "fraction"], ...fc.map((v, i) => [i, v, frac[i]])]);
    const expected = c.expectedNonFunctional;
    setText("#sim-func", `${pct(c.nonFunctional)} of the chains carry no ${name} unit: chains that cannot crosslink.` +
      (typeof expected === "number" && Number.isFinite(expected) ? ` The terminal model gives ${pct(expected)} analytically for these lengths at a constant feed.` : ""));
  } else {
    figNote("fig-sim-func", "Choose a functional monomer to count its units per chain.");
    setText("#sim-func", "");
  }
  mountFigure("fig-sim-strips", strips({
    title: `The first ${c.samples.length} of ${n} chains`, width: 600, chains: c.samples, colors: [C.m1, C.m2],
    legend: [{ label: `M1 (${m1Name(p)})`, color: C.m1, kind: "box" }, { label: `M2 (${m2Name(p)})`, color: C.m2, kind: "box" }],
  }), fileBase(p, "simulated-chains"), [["chain", "sequence (1 = M1, 2 = M2)"], ...c.samples.map((s, i) => [i + 1, s])]);
}

/** @type {Step} */
export const simulate = {
  id: "sim-part",
  title: "Simulated chains",
  mount(c) {
    ctx = c;
    $("#sim-run").addEventListener("click", runSim);
    $("#sim-kind").addEventListener("change", () => {
      const unit = document.createElement("span");
      unit.className = "unit";
      unit.textContent = "units";
      $("#sim-n-label").replaceChildren(select("#sim-kind").value === "dpn" ? "DPn " : "Length ", unit);
    });
  },
  start() {
    started = true;
  },
  update(p) {
    if (started && simKey && simKey !== keyOf(p)) setText("#sim-status", "The model or the starting feed has changed since these chains were grown: press Simulate to grow them again.");
  },
};
