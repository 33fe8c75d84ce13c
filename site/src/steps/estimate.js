// @ts-check
// Step 6, reactivity ratios from the bench data: every method on the converted runs of step 5
// (copoly.fit), the recommended estimate with its joint confidence region, the notes and trends
// of the fit, the plots (fitplots.js), the Q–e screening estimate, and "Use these ratios", which
// copies the estimate into step 1.

import { $, field, fillList, setText } from "../dom.js";
import * as engine from "../engine.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { setRatios } from "../form.js";
import { levelPct, rat, se, sentence, shortNum, sig3, span } from "../format.js";
import { findMonomer } from "../library.js";
import { MIN_FIT_RUNS } from "../limits.js";
import { fitText, runRows } from "../messages.js";
import { parseNumber } from "../numbers.js";
import { task } from "../schedule.js";
import { labelsOf } from "./bench.js";
import { DEFAULT_LEVEL, LINEAR_METHODS, METHOD, drawFitPlots, recommendedFit } from "./fitplots.js";

/** @import { FitResult, LinearFit, NonlinearFit, EVMFit, Project } from "../../copoly" */
/** @import { Ctx, Step } from "../main.js" */
/** @import { Fitted } from "../state.js" */

const FIT_DELAY_MS = 250;

/** @type {Record<string, string>} */
const REGION_KIND = { F: "F-based, errors unknown", chi2: "χ², errors known", ellipse: "linearised ellipse" };

/** @type {Ctx} */
let ctx;
let started = false;
let fitKey = "";
const fitTask = task(runFit, FIT_DELAY_MS, { beforeOutput: true });

/** currentLevel reads the confidence level box; NaN (with the error shown) when it is not valid. */
function currentLevel() {
  const input = field("#fit-level");
  clearFieldError(input);
  const raw = input.value.trim();
  if (raw === "") return DEFAULT_LEVEL;
  const v = parseNumber(raw);
  if (Number.isNaN(v)) { setFieldError(input, `confidence level = “${raw}” is not a number.`); return NaN; }
  if (!(v > 0 && v < 1)) { setFieldError(input, `confidence level = ${raw}: enter a fraction between 0 and 1, such as 0.95.`); return NaN; }
  return v;
}

function onLevelInput() {
  if (!ctx.store.get("project")) return;
  const v = currentLevel();
  if (Number.isNaN(v)) return;
  ctx.setPart("level", v);
  fitTask.schedule();
}

/** @param {Project} p */
function showLevel(p) {
  field("#fit-level").value = shortNum(p.level && p.level > 0 ? p.level : DEFAULT_LEVEL);
  clearFieldError($("#fit-level"));
}

/** @param {Fitted | null} f */
const setFit = (f) => ctx.store.set("fit", f);

function runFit() {
  return engine.newest("fit", async (job) => {
    if (!engine.running() || !ctx.store.get("project")) return;
    const level = currentLevel();
    if (Number.isNaN(level)) return;
    const { runs, rowOf } = ctx.store.get("runs");
    if (runs.length < MIN_FIT_RUNS) {
      fitKey = "";
      $("#fit-results").hidden = true;
      setText("#fit-status", `No estimate yet: step 5 has ${runs.length} usable run${runs.length === 1 ? "" : "s"}; at least ${MIN_FIT_RUNS}, at different feeds, are needed.`);
      setFit(null);
      return;
    }
    // The labels are part of the key: the plots and their saved data name the runs by them.
    const key = JSON.stringify([runs, level, labelsOf(rowOf)]);
    if (key === fitKey && ctx.store.get("fit")) return;
    const f = await job.call("fit", { runs, level });
    fitKey = key;
    if (engine.isError(f)) {
      $("#fit-results").hidden = true;
      setText("#fit-status", `No estimate: ${sentence(runRows(f.error, rowOf))}`);
      setFit(null);
      return;
    }
    const fitted = { result: f, runs, rowOf: rowOf.slice() };
    drawFit(fitted);
    setFit(fitted);
  });
}

/** @param {Fitted} fitted */
function drawFit(fitted) {
  const f = fitted.result;
  const [recName, rec] = recommendedFit(f);
  if (!rec) {
    $("#fit-results").hidden = true;
    setText("#fit-status", "No estimate: the fit gave no result.");
    return;
  }
  const n = fitted.runs.length;
  $("#fit-results").hidden = false;
  const reg = rec.region || {};
  setText("#fit-status", `Estimated from ${n} runs: r1 = ${rat(rec.r1)}, r2 = ${rat(rec.r2)} (${METHOD[recName].short}` +
    (reg.level ? `, ${levelPct(reg.level)} joint confidence region${reg.open ? ", open" : ""}).` : ")."));
  drawFitTable(f, recName, fitted.rowOf);
  setText("#fit-use", `Use these ratios (r1 = ${rat(rec.r1)}, r2 = ${rat(rec.r2)})`);
  setText("#fit-use-note", "Copies the recommended r1 and r2 into step 1, with a note of where they come from, and keeps the joint confidence region with the project. Steps 2 to 4 then use them.");

  const items = (f.warnings || []).map((w) => {
    const text = fitText(w.message, fitted.rowOf);
    const name = w.method && METHOD[w.method] ? METHOD[w.method].name : "";
    return name && !text.toLowerCase().includes(name.toLowerCase()) ? `${name}: ${text}` : text;
  });
  fillList($("#fit-warnings"), items);
  $("#fit-warnings-box").hidden = !items.length;

  const hasX = fitted.runs.some((r) => (r.conversion || 0) > 0);
  /** @param {{slope: number, pValue: number, flagged: boolean} | undefined} t @param {string} what @param {string} unit */
  const trendText = (t, what, unit) => {
    if (!t || !Number.isFinite(t.pValue)) return `Against ${what}: not enough runs to tell.`;
    const base = `Against ${what}: slope ${sig3(t.slope)} per unit ${unit}, p = ${sig3(t.pValue)}`;
    return t.flagged ? `${base}. A trend: the residuals are not random; see the notes above.` : `${base}. No clear trend.`;
  };
  const trends = [trendText(f.trends && f.trends.feed, "the feed", "f10")];
  trends.push(hasX ? trendText(f.trends && f.trends.conversion, "conversion", "X") : "Against conversion: no run has a conversion.");
  fillList($("#fit-trends"), trends);

  const fr = f.methods["fineman-ross"], sw = f.swappedFinemanRoss;
  setText("#fit-swap-note", fr && sw
    ? `They depend on which monomer you call M1. From these same runs Fineman–Ross gives r1 = ${rat(fr.r1)}, r2 = ${rat(fr.r2)}; with the labels swapped it gives r1 = ${rat(sw.r1)}, r2 = ${rat(sw.r2)}. The recommended fit gives the same answer either way.`
    : "They also depend on which monomer you call M1: swapping the labels changes their answer.");
  const p = ctx.store.get("project");
  if (p) drawFitPlots(p, fitted);
}

/**
 * @typedef {object} RowOpts
 * @property {boolean} [recommended]
 * @property {boolean} [linear]
 * @property {string} [tag]
 * @property {string} [why]  why a method gave no result
 */

/** @param {FitResult} f @param {string} recName @param {number[]} rowOf */
function drawFitTable(f, recName, rowOf) {
  const body = document.createElement("tbody");
  /**
   * @param {string} key @param {string} label
   * @param {Partial<NonlinearFit & EVMFit & LinearFit> | {r1: number, r2: number} | undefined} m
   * @param {RowOpts} opts
   */
  const row = (key, label, m, opts) => {
    const tr = document.createElement("tr");
    tr.dataset.method = key;
    if (opts.recommended) { tr.className = "recommended"; tr.dataset.recommended = "true"; }
    if (opts.linear) tr.classList.add("linear");
    const th = document.createElement("th");
    th.scope = "row";
    th.append(label);
    if (opts.tag) {
      const t = document.createElement("span");
      t.className = opts.recommended ? "tag tag-rec" : "tag";
      t.textContent = opts.tag;
      th.append(" ", t);
    }
    tr.append(th);
    if (!m) {
      const td = document.createElement("td");
      td.colSpan = 10;
      td.className = "why-not";
      td.textContent = opts.why || "Not computed for these runs.";
      tr.append(td);
      return tr;
    }
    /** @type {Partial<NonlinearFit & EVMFit>} */
    const x = m;
    const reg = x.region;
    const weighted = key === "evm" || (key === "nonlinear" && x.weighted);
    const cells = [
      ["r1", rat(m.r1)], ["r2", rat(m.r2)],
      ["se1", se(x.se1)], ["se2", se(x.se2)],
      ["corr", typeof x.corr === "number" && Number.isFinite(x.corr) ? x.corr.toFixed(2) : "–"],
      ["region1", reg ? span(reg.r1Min, reg.r1Max) : "–"],
      ["region2", reg ? span(reg.r2Min, reg.r2Max) : "–"],
      ["kind", reg ? (REGION_KIND[reg.kind] || reg.kind) + (reg.open ? " (open)" : "") : "–"],
      ["chi2", weighted && typeof x.reducedChi2 === "number" && Number.isFinite(x.reducedChi2) ? x.reducedChi2.toPrecision(3) : "–"],
      ["p", weighted && Number.isFinite(x.pValue) ? sig3(x.pValue) : "–"],
    ];
    for (const [col, text] of cells) {
      const td = document.createElement("td");
      td.dataset.col = col;
      td.textContent = text;
      tr.append(td);
    }
    return tr;
  };
  /** @param {string} method */
  const whyNot = (method) => {
    const w = (f.warnings || []).find((x) => x.method === method && x.row < 0);
    return w ? `Not computed: ${sentence(fitText(w.message, rowOf))}` : "Not computed for these runs.";
  };
  // The table reads every method's result through the fields they share by name; a field one
  // method lacks reads as undefined and shows "–".
  const methods = /** @type {Record<string, Partial<NonlinearFit & EVMFit & LinearFit> | undefined>} */ (f.methods);
  const recLabel = recName === "evm" ? "Error-in-variables, integrated model" : METHOD.nonlinear.name;
  body.append(row(recName, recLabel, methods[recName], { recommended: true, tag: "recommended" }));
  const other = recName === "evm" ? "nonlinear" : "evm";
  if (methods[other]) body.append(row(other, METHOD[other].name, methods[other], {}));
  else if (other === "evm") body.append(row("evm", METHOD.evm.name, undefined, { why: "Needs the uncertainties sF, sf and (with a conversion) sX of every run." }));
  const group = document.createElement("tr");
  group.className = "group";
  const gth = document.createElement("th");
  gth.colSpan = 11;
  gth.scope = "colgroup";
  gth.textContent = "Linear — for comparison only";
  group.append(gth);
  body.append(group);
  for (const key of LINEAR_METHODS) {
    const m = methods[key];
    let label = METHOD[key].name;
    if (key === "kelen-tudos" && m && Number.isFinite(m.alpha)) label += ` (α = ${sig3(m.alpha)})`;
    if (key === "extended-kelen-tudos" && m && Number.isFinite(m.alpha)) label += ` (α = ${sig3(m.alpha)})`;
    body.append(row(key, label, m, { linear: true, tag: "linear", why: whyNot(key) }));
  }
  if (f.swappedFinemanRoss) body.append(row("swapped", METHOD.swapped.name, f.swappedFinemanRoss, { linear: true, tag: "linear" }));
  $("#fit-table tbody").replaceWith(body);
}

// useFitted copies the recommended ratios into step 1 with a note of where they come from,
// and keeps the region with them.
async function useFitted() {
  const fitted = ctx.store.get("fit");
  if (!fitted || !ctx.store.get("project")) return;
  const [recName, rec] = recommendedFit(fitted.result);
  if (!rec) return;
  /** @param {number} v */
  const round = (v) => String(Number(v.toPrecision(4)));
  const date = new Date().toISOString().slice(0, 10);
  const reg = rec.region || { level: DEFAULT_LEVEL, boundary: rec.jcr || [] };
  setRatios(round(rec.r1), round(rec.r2), `fitted to ${fitted.runs.length} runs on ${date}, ${METHOD[recName].short}, ${levelPct(reg.level)} JCR`);
  ctx.store.set("formJcr", (reg.boundary || []).map((q) => [q[0], q[1]]));
  await ctx.recompute();
  setText("#fit-use-note", ctx.store.get("invalid")
    ? "The ratios are in step 1, but another field there is not valid; correct it to use them."
    : `r1 and r2 in step 1 are now ${round(rec.r1)} and ${round(rec.r2)}; steps 2 to 4 use them.`);
}

/**
 * drawScreening shows the Q–e estimate of the pair when both monomers are in the library.
 * @param {Project} p
 */
function drawScreening(p) {
  return engine.newest("qe", async (job) => {
    const box = $("#qe-box");
    const lib = ctx.store.get("library");
    const a = p.monomer1.name ? findMonomer(lib, p.monomer1.name) : undefined;
    const b = p.monomer2.name ? findMonomer(lib, p.monomer2.name) : undefined;
    const r = a && b ? await job.call("qe", { monomer1: a.name, monomer2: b.name }) : null;
    if (!r || !a || !b || engine.isError(r)) { box.hidden = true; return; }
    setText("#qe-text", `Q–e scheme: r1 ≈ ${rat(r.r1)}, r2 ≈ ${rat(r.r2)} for ${a.name} (Q = ${shortNum(r.q1)}, e = ${shortNum(r.e1)}) with ${b.name} (Q = ${shortNum(r.q2)}, e = ${shortNum(r.e2)}). ` +
      "A rough starting point for planning the first runs when there is no data yet. The scheme ignores steric effects and often misses by a factor of two or more; it is not a measured value.");
    setText("#qe-source", `Values: ${a.name}: ${r.source1}. ${b.name}: ${r.source2}.`);
    box.hidden = false;
  });
}

/** @type {Step} */
export const estimate = {
  id: "estimate",
  title: "Reactivity ratios from the bench data",
  mount(c) {
    ctx = c;
    $("#fit-level").addEventListener("input", onLevelInput);
    $("#fit-use").addEventListener("click", useFitted);
    // New converted runs are fitted once the typing pauses.
    ctx.store.subscribe("runs", () => fitTask.schedule());
  },
  fill: showLevel,
  start() {
    const p = ctx.store.get("project");
    if (started || !p || !engine.running()) return;
    started = true;
    showLevel(p);
    drawScreening(p);
    fitTask.schedule(true);
  },
  update(p) {
    if (!started) return;
    drawScreening(p);
    const fitted = ctx.store.get("fit");
    if (fitted) drawFitPlots(p, fitted, true);
  },
};
