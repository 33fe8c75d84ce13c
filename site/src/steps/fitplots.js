// @ts-check
// The plots of step 6 (estimate.js): the measured compositions with the fitted curve, the joint
// confidence region with every method's estimate, the residuals, and the two linear plots; and
// the names and markers of the methods.

import * as engine from "../engine.js";
import { C, fileBase, mountFigure } from "../figures.js";
import { levelPct, linspace, rat, sig3 } from "../format.js";
import { chart, range } from "../plot.js";
import { labelsOf } from "./bench.js";
import { COMPOSITION_POINTS } from "./composition.js";

/** @import { EVMFit, FitResult, LinearFit, NonlinearFit, Project, Region } from "../../copoly" */
/** @import { Fitted } from "../state.js" */
/** @import { Layer, LegendEntry, Shape } from "../plot.js" */

export const DEFAULT_LEVEL = 0.95;

/** @type {Record<string, {name: string, short?: string}>} */
export const METHOD = {
  nonlinear: { name: "Nonlinear least squares, integrated model", short: "nonlinear least squares on the integrated model" },
  evm: { name: "Error-in-variables", short: "error-in-variables on the integrated model" },
  "fineman-ross": { name: "Fineman–Ross" },
  "inverted-fineman-ross": { name: "Inverted Fineman–Ross" },
  "kelen-tudos": { name: "Kelen–Tüdős" },
  "extended-kelen-tudos": { name: "Extended Kelen–Tüdős" },
  "mayo-lewis-integrated": { name: "Mayo–Lewis intersection" },
  swapped: { name: "Fineman–Ross, M1 and M2 swapped" },
  linear: { name: "Linear methods" },
};

/** @type {("fineman-ross" | "inverted-fineman-ross" | "kelen-tudos" | "extended-kelen-tudos" | "mayo-lewis-integrated")[]} */
export const LINEAR_METHODS = ["fineman-ross", "inverted-fineman-ross", "kelen-tudos", "extended-kelen-tudos", "mayo-lewis-integrated"];

/** @type {Record<string, [string, Shape]>} Marker of each method on the region plot: colour and shape. */
const MARK = {
  nonlinear: [C.cum, "circle"],
  evm: [C.limit, "circle"],
  "fineman-ross": ["#5c6b7a", "square"],
  "inverted-fineman-ross": ["#2f6fb0", "triangle"],
  "kelen-tudos": ["#c7891a", "square"],
  "extended-kelen-tudos": ["#6b7f1f", "triangle-down"],
  "mayo-lewis-integrated": ["#7a4b2a", "diamond"],
  swapped: ["#9aa5b1", "triangle"],
};

/**
 * recommendedFit returns the name and result of the method to report.
 * @param {FitResult} f
 * @returns {["nonlinear" | "evm", NonlinearFit | EVMFit | undefined]}
 */
export function recommendedFit(f) {
  const name = f.methods[f.recommended] ? f.recommended : "nonlinear";
  return [name, f.methods[name]];
}

/** the r1, r2 in use when the fit plots were drawn */
let drawnRatios = "";

/**
 * drawFitPlots draws the data with the fitted curve, the joint confidence region, the residuals
 * and the two linear plots; with onlyIfRatiosChanged, only when the ratios in use in step 1 (marked
 * on the region plot) changed since the last drawing.
 * @param {Project} p @param {Fitted} fitted @param {boolean} [onlyIfRatiosChanged]
 */
export function drawFitPlots(p, fitted, onlyIfRatiosChanged) {
  if (onlyIfRatiosChanged && drawnRatios === `${p.r1}/${p.r2}`) return;
  drawnRatios = `${p.r1}/${p.r2}`;
  return engine.newest("fit-plots", async (job) => {
    const f = fitted.result;
    const [recName, rec] = recommendedFit(f);
    if (!rec) return;
    const runs = fitted.runs;
    const labels = labelsOf(fitted.rowOf).map((l, k) => l || `row ${fitted.rowOf[k] + 1}`);
    const nl = f.methods.nonlinear;

    // (a) Data and the composition curve.
    const grid = linspace(0, 1, COMPOSITION_POINTS);
    const comp = await job.call("composition", { r1: rec.r1, r2: rec.r2, f1: grid });
    const low = runs.filter((r) => !((r.conversion || 0) > 0));
    const high = runs.filter((r) => (r.conversion || 0) > 0);
    const model = runs.map((r, i) => (nl && Number.isFinite(nl.residuals[i]) ? r.F1 - nl.residuals[i] : NaN));
    const withX = runs.map((r, i) => i).filter((i) => (runs[i].conversion || 0) > 0);
    /** @type {Layer[]} */
    const layers = [{ type: "line", x: [0, 1], y: [0, 1], color: C.diag, width: 1.5, dash: "5 5" }];
    if (!engine.isError(comp)) layers.push({ type: "line", x: grid, y: comp.F1, color: C.inst, width: 2.6 });
    if (withX.length && nl) {
      layers.push({ type: "segments", x0: withX.map((i) => runs[i].f10), y0: withX.map((i) => runs[i].F1),
        x1: withX.map((i) => runs[i].f10), y1: withX.map((i) => model[i]), color: C.feed, width: 1 });
      layers.push({ type: "points", x: withX.map((i) => runs[i].f10), y: withX.map((i) => model[i]), color: C.cum, shape: "circle", r: 3.5, hollow: true });
    }
    if (low.length) layers.push({ type: "points", x: low.map((r) => r.f10), y: low.map((r) => r.F1), color: C.feed, shape: "circle", r: 5.5 });
    if (high.length) layers.push({ type: "points", x: high.map((r) => r.f10), y: high.map((r) => r.F1), color: C.cum, shape: "square", r: 5 });
    /** @type {LegendEntry[]} */
    const legend = [{ label: `F1 at r1 = ${rat(rec.r1)}, r2 = ${rat(rec.r2)}`, color: C.inst }];
    if (low.length) legend.push({ label: "measured, low conversion", color: C.feed, kind: "point" });
    if (high.length) legend.push({ label: "measured, with conversion", color: C.cum, kind: "point", shape: "square" });
    if (withX.length && nl) legend.push({ label: "model F1cum at that conversion", color: C.cum, kind: "point", hollow: true });
    const dataSvg = chart({
      title: `Measured composition and the fitted curve (${runs.length} runs)`,
      width: 600, height: 470,
      x: { min: 0, max: 1, label: "f10, mole fraction of M1 in the starting feed", ticks: 10 },
      y: { min: 0, max: 1, label: "F1, mole fraction of M1 in the copolymer", ticks: 10 },
      layers, legend,
    });
    mountFigure("fig-fit-data", dataSvg, fileBase(p, "bench-fit"), [["label", "f10", "X", "F1 measured", "F1 model (nonlinear fit)", "residual"],
      ...runs.map((r, i) => [labels[i], r.f10, r.conversion || 0, r.F1, model[i], nl ? nl.residuals[i] : ""])]);

    drawRegion(p, f, recName, rec);

    // (d) Residuals against the feed and against conversion.
    if (nl) {
      const res = nl.residuals;
      const yr = range([...res, 0], { minSpan: 0.01, pad: 0.15 });
      /** @param {number[]} x @param {string} xLabel @param {number} xMax @param {string} title */
      const resChart = (x, xLabel, xMax, title) => chart({
        title, width: 600, height: 330,
        x: { min: 0, max: xMax, label: xLabel },
        y: { min: yr[0], max: yr[1], label: "F1 measured − fitted" },
        layers: [{ type: "hline", y: 0, color: C.diag, dash: "5 5" },
          { type: "points", x, y: res, color: C.cum, shape: "circle", r: 5 }],
      });
      const fsvg = resChart(runs.map((r) => r.f10), "f10, starting feed", 1, "Residuals against the feed");
      mountFigure("fig-res-feed", fsvg, fileBase(p, "residuals-feed"), [["label", "f10", "residual"], ...runs.map((r, i) => [labels[i], r.f10, res[i]])]);
      const xs = runs.map((r) => r.conversion || 0);
      const figX = document.getElementById("fig-res-conv");
      if (figX) figX.hidden = !withX.length;
      if (withX.length) {
        const xsvg = resChart(xs, "X, molar conversion", Math.min(1, Math.max(...xs) * 1.15 || 1), "Residuals against conversion");
        mountFigure("fig-res-conv", xsvg, fileBase(p, "residuals-conversion"), [["label", "X", "residual"], ...runs.map((r, i) => [labels[i], xs[i], res[i]])]);
      }
    }

    // (b) Fineman–Ross and (c) Kelen–Tüdős.
    linearPlot(p, "fig-fr", f.methods["fineman-ross"], "fineman-ross", labels, {
      title: (m) => `Fineman–Ross: G = r1·H − r2, r1 = ${rat(m.r1)}, r2 = ${rat(m.r2)} (linear)`,
      x: "H = x²/y", y: "G = x(y − 1)/y",
    });
    linearPlot(p, "fig-kt", f.methods["kelen-tudos"], "kelen-tudos", labels, {
      title: (m) => `Kelen–Tüdős, α = ${sig3(m.alpha)}: r1 = ${rat(m.r1)}, r2 = ${rat(m.r2)} (linear)`,
      x: "ξ = H/(α + H)", y: "η = G/(α + H)", xmin: 0, xmax: 1,
    });
  });
}

/**
 * @param {Project} p @param {string} id @param {LinearFit | undefined} m @param {string} name @param {string[]} labels
 * @param {{title: (m: LinearFit) => string, x: string, y: string, xmin?: number, xmax?: number}} o
 */
function linearPlot(p, id, m, name, labels, o) {
  const fig = document.getElementById(id);
  if (fig) fig.hidden = !m;
  if (!m) return;
  const xr = o.xmin !== undefined && o.xmax !== undefined ? [o.xmin, o.xmax] : range([...m.x, 0], { pad: 0.08 });
  const lineX = [xr[0], xr[1]];
  const lineY = lineX.map((x) => m.slope * x + m.intercept);
  const yr = range([...m.y, ...lineY], { pad: 0.1 });
  const svg = chart({
    title: o.title(m), width: 600, height: 380,
    x: { min: xr[0], max: xr[1], label: o.x },
    y: { min: yr[0], max: yr[1], label: o.y },
    layers: [{ type: "line", x: lineX, y: lineY, color: C.feed, width: 2, dash: "7 4" },
      { type: "points", x: m.x, y: m.y, color: C.cum, shape: "circle", r: 5 }],
    legend: [{ label: "runs", color: C.cum, kind: "point" }, { label: "least-squares line", color: C.feed, dash: "7 4", width: 2 }],
  });
  mountFigure(id, svg, fileBase(p, name), [["label", o.x, o.y], ...m.x.map((x, i) => [labels[i] || "", x, m.y[i]])]);
}

/**
 * drawRegion draws (e): the joint confidence region of the recommended method, every method's
 * estimate and the ratios in use in step 1.
 * @param {Project} p @param {FitResult} f @param {string} recName @param {NonlinearFit | EVMFit} rec
 */
function drawRegion(p, f, recName, rec) {
  /** @type {Pick<Region, "level" | "open" | "boundary">} */
  const reg = rec.region || { level: DEFAULT_LEVEL, open: false, boundary: rec.jcr || [] };
  const poly = (reg && reg.boundary) || rec.jcr || [];
  /** @type {{key: string, label: string, r1: number, r2: number}[]} */
  const pts = [];
  /** @param {string} key @param {string} label @param {{r1: number, r2: number} | undefined} m */
  const add = (key, label, m) => { if (m && Number.isFinite(m.r1) && Number.isFinite(m.r2)) pts.push({ key, label, r1: m.r1, r2: m.r2 }); };
  add(recName, `${recName === "evm" ? "error-in-variables" : "nonlinear fit"} (recommended)`, rec);
  const other = recName === "evm" ? "nonlinear" : "evm";
  add(other, other === "evm" ? "error-in-variables" : "nonlinear fit", f.methods[other]);
  for (const key of LINEAR_METHODS) add(key, METHOD[key].name, f.methods[key]);
  add("swapped", "Fineman–Ross, labels swapped", f.swappedFinemanRoss);
  add("inuse", "in use in step 1", { r1: p.r1, r2: p.r2 });

  // The plot shows the region with room around it; estimates far outside are listed as off the plot.
  const r1s = poly.map((q) => q[0]), r2s = poly.map((q) => q[1]);
  /** @param {number[]} vals @param {number} centre @returns {[number, number]} */
  const box = (vals, centre) => {
    let lo = Math.min(...vals, centre), hi = Math.max(...vals, centre);
    const w = Math.max(hi - lo, Math.abs(centre) * 0.1, 0.02);
    return [lo - 1.5 * w, hi + 1.5 * w];
  };
  const win1 = box(r1s, rec.r1), win2 = box(r2s, rec.r2);
  const shown = pts.filter((q) => q.r1 >= win1[0] && q.r1 <= win1[1] && q.r2 >= win2[0] && q.r2 <= win2[1]);
  const all1 = [...r1s, ...shown.map((q) => q.r1)], all2 = [...r2s, ...shown.map((q) => q.r2)];
  const x = range(all1, { pad: 0.1, minSpan: 0.02, floor: Math.min(0, ...all1) });
  const y = range(all2, { pad: 0.1, minSpan: 0.02, floor: Math.min(0, ...all2) });
  /** @type {Layer[]} */
  const layers = [];
  if (poly.length >= 3) layers.push({ type: "polygon", points: poly, color: C.inst, opacity: 0.16, stroke: C.inst, role: "jcr" });
  /** @type {LegendEntry[]} */
  const legend = [{ label: `${levelPct(reg.level)} region${reg.open ? " (open)" : ""}`, color: C.inst, kind: "box", opacity: 0.35 }];
  /** @param {{key: string}} q @returns {[string, Shape]} */
  const mark = (q) => (q.key === "inuse" ? ["#1f2933", "cross"] : q.key === recName ? ["#1f2933", "diamond"] : MARK[q.key]);
  for (const q of pts.slice().reverse()) {
    const [color, shape] = mark(q);
    if (shown.includes(q)) layers.push({ type: "point", x: q.r1, y: q.r2, color, shape, r: q.key === recName ? 7 : 5.5 });
  }
  for (const q of pts) {
    const [color, shape] = mark(q);
    legend.push({ label: q.label + (shown.includes(q) ? "" : " — off the plot"), color, kind: "point", shape });
  }
  const svg = chart({
    title: `Joint confidence region of r1 and r2, ${levelPct(reg.level)}${reg.open ? " — open: the data do not bound it" : ""}`,
    width: 600, height: 560,
    x: { min: x[0], max: x[1], label: "r1" },
    y: { min: y[0], max: y[1], label: "r2" },
    layers, legend,
  });
  mountFigure("fig-jcr", svg, fileBase(p, "joint-confidence-region"), [["r1", "r2"], ...poly.map((q) => [q[0], q[1]])]);
}
