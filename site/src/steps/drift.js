// @ts-check
// Step 3, composition drift in a batch: feed, instantaneous and cumulative copolymer against
// conversion, the conversion limit for the tolerance, the mass conversion, a monomer used up,
// and the composition distribution of the polymer made.

import { $, setText } from "../dom.js";
import * as engine from "../engine.js";
import { C, figNote, fileBase, mountFigure } from "../figures.js";
import { inputForField } from "../form.js";
import { fix, linspace, m1Name, m2Name, pct, shortNum } from "../format.js";
import { TERMINAL_ONLY, modelArgs, modelNote } from "../model.js";
import { chart, range } from "../plot.js";

/** @import { DriftResult, Project } from "../../copoly" */
/** @import { ArgOf } from "../engine.js" */
/** @import { Step } from "../main.js" */
/** @import { Layer } from "../plot.js" */

const DRIFT_POINTS = 101;

/** @type {Record<string, string>} */
const METHOD_TEXT = {
  "meyer-lowry": "Drift from the Meyer–Lowry integrated equation.",
  "skeist-ode": "Drift from numerical integration of the Skeist equation.",
  "no-drift": "No drift: the feed and the copolymer have the same composition throughout.",
};

/** @param {Project} p @param {DriftResult} d */
function drawDrift(p, d) {
  const lim = d.limit ? d.limit.conversion : 2;
  const final = d.conversion[d.conversion.length - 1];
  setText("#out-limit", d.limit ? pct(lim) : TERMINAL_ONLY);
  const F10 = d.F1[0];
  setText("#out-limit-note", !d.limit ? "" : lim >= 1
    ? `F1cum stays within ${fix(F10, 3)} ± ${shortNum(d.limit.tolerance)} all the way to full conversion.`
    : `F1cum stays within ${fix(F10, 3)} ± ${shortNum(d.limit.tolerance)} up to X = ${fix(lim, 3)}.` +
      (lim > final ? " That is beyond the final conversion chosen." : ""));
  setText("#out-method", METHOD_TEXT[d.method] || `Method: ${d.method}.`);
  if (d.conversionMass && d.conversionMass.length) {
    setText("#out-mass-conversion", `Mass conversion at X = ${fix(final, 3)}: ${fix(d.conversionMass[d.conversionMass.length - 1], 3)} (from the molar masses).`);
  } else {
    setText("#out-mass-conversion", "Give both molar masses to see the mass conversion and a by-mass distribution.");
  }
  const ex = $("#out-exhausted");
  if (d.exhausted) {
    const name = d.exhausted.monomer === 1 ? m1Name(p) : m2Name(p);
    const other = d.exhausted.monomer === 1 ? m2Name(p) : m1Name(p);
    ex.textContent = `M${d.exhausted.monomer} (${name}) is practically used up at X = ${fix(d.exhausted.conversion, 3)}: ` +
      `its mole fraction in the remaining monomer falls below 10⁻⁶. Polymer made after that point is almost pure ${other}.`;
    ex.hidden = false;
  } else {
    ex.hidden = true;
    ex.textContent = "";
  }

  const tol = d.limit ? d.limit.tolerance : p.tolerance;
  /** @type {Layer[]} */
  const layers = [
    { type: "band", y0: F10 - tol, y1: F10 + tol, color: C.band, opacity: 0.25 },
    { type: "line", x: d.conversion, y: d.f1, color: C.feed, width: 2.2, dash: "7 4" },
    { type: "line", x: d.conversion, y: d.F1, color: C.inst, width: 2.6 },
    { type: "line", x: d.conversion, y: d.F1cum, color: C.cum, width: 2.6 },
  ];
  if (lim < final) layers.push({ type: "vline", x: lim, color: C.limit, text: `limit X = ${fix(lim, 3)}` });
  if (d.exhausted && d.exhausted.conversion <= final) {
    layers.push({ type: "vline", x: d.exhausted.conversion, color: C.feed, dash: "2 3", text: `M${d.exhausted.monomer} used up` });
  }
  const yr = range([...d.f1, ...d.F1, ...d.F1cum, F10 - tol, F10 + tol], { floor: 0, ceil: 1, minSpan: 0.05 });
  const svg = chart({
    title: `Drift from f10 = ${fix(p.f10, 3)} to X = ${fix(final, 3)}`,
    width: 600, height: 430,
    x: { min: 0, max: final, label: "X, overall molar conversion" },
    y: { min: yr[0], max: yr[1], label: "mole fraction of M1" },
    layers,
    legend: [
      { label: "feed f1", color: C.feed, dash: "7 4" },
      { label: "copolymer F1 (now)", color: C.inst },
      { label: "copolymer F1cum (so far)", color: C.cum },
      { label: `F1(f10) ± ${shortNum(tol)}`, color: C.band, kind: "box", opacity: 0.35 },
      ...(lim < final ? [{ label: "conversion limit", color: C.limit, dash: "6 4" }] : []),
    ],
  });
  const mass = d.conversionMass;
  const rows = [["X", ...(mass ? ["mass conversion"] : []), "f1", "F1", "F1cum"],
    ...d.conversion.map((x, i) => [x, ...(mass ? [mass[i]] : []), d.f1[i], d.F1[i], d.F1cum[i]])];
  mountFigure("fig-drift", svg, fileBase(p, "drift"), rows);

  const h = d.distribution;
  if (!h) return figNote("fig-distribution", `Composition distribution: ${TERMINAL_ONLY}.`);
  const n = h.weights.length;
  const lo = h.edges[0], hi = h.edges[n];
  const basis = h.basis === "mass" ? "mass" : "moles";
  const hsvg = chart({
    title: `Composition distribution of the polymer up to X = ${fix(final, 3)}`,
    width: 600, height: 340,
    x: { min: lo, max: hi > lo ? hi : lo + 1e-3, label: "F1 of the polymer made", ticks: 6 },
    y: { min: 0, max: Math.max(...h.weights, 1e-9) * 1.1, label: `fraction of polymer (by ${basis})` },
    layers: [{ type: "bars", x0: h.edges.slice(0, n), x1: h.edges.slice(1), y: h.weights, color: C.inst }],
  });
  const hrows = [["F1 from", "F1 to", `fraction by ${basis}`], ...h.weights.map((w, i) => [h.edges[i], h.edges[i + 1], w])];
  mountFigure("fig-distribution", hsvg, fileBase(p, "distribution"), hrows);
}

/** @type {Step} */
export const drift = {
  id: "drift",
  title: "Composition drift in a batch",
  mount() {},
  async compute(p, job) {
    if (!(p.conversion > 0)) return { drift: null };
    /** @type {ArgOf<"drift">} */
    const args = { ...modelArgs(p), f10: p.f10, conversion: linspace(0, p.conversion, DRIFT_POINTS), tolerance: p.tolerance };
    if (p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0) {
      args.molarMass1 = p.monomer1.molarMass;
      args.molarMass2 = p.monomer2.molarMass;
    }
    return { drift: await job.call("drift", args) };
  },
  draw(p, computed, problems) {
    const note = $("#drift .model-note");
    note.textContent = modelNote(p);
    note.hidden = !note.textContent;
    const d = computed.drift;
    if (d === undefined) return;
    if (d === null) problems.push({ input: $("#conversion"), message: "final conversion = 0: enter a conversion above 0 to follow the drift." });
    else if (engine.isError(d)) problems.push({ input: inputForField(d.field), message: d.error });
    else drawDrift(p, d);
  },
};
