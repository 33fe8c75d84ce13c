// @ts-check
// Step 4, chain sequence: the sequence statistics at the starting feed and over the batch, the
// run-length distributions and a few sample chains. The model box of step 4 is part of the
// project's form (form.js).

import { $, button, setText } from "../dom.js";
import { saveCSV } from "../download.js";
import * as engine from "../engine.js";
import { C, figNote, figureActions, fileBase, mountFigure } from "../figures.js";
import { inputForField } from "../form.js";
import { fix, m1Name, m2Name } from "../format.js";
import { MODEL_NAME, TERMINAL_ONLY, modelArgs, modelKind } from "../model.js";
import { chart, strips } from "../plot.js";

/** @import { ChainsResult, Project, SequenceResult, SequenceStats } from "../../copoly" */
/** @import { CSVValue } from "../download.js" */
/** @import { ArgOf } from "../engine.js" */
/** @import { Ctx, Step } from "../main.js" */

const RUN_LENGTH_MAX = 12;
const CHAIN_COUNT = 12;
const CHAIN_LENGTH = 60;

/** @type {Ctx} */
let ctx;

/** @type {[string, string, (s: SequenceStats) => number][]} SEQ_ROWS: [data-stat, label, getter]. The data-stat names are stable (the browser test uses them). */
const SEQ_ROWS = [
  ["F1", "copolymer F1", (s) => s.F1],
  ["p11", "p11: M1 end adds M1", (s) => s.p11],
  ["p12", "p12: M1 end adds M2", (s) => s.p12],
  ["p21", "p21: M2 end adds M1", (s) => s.p21],
  ["p22", "p22: M2 end adds M2", (s) => s.p22],
  ["dyad11", "dyad 11", (s) => s.dyads["11"]],
  ["dyad12", "dyad 12 (+21)", (s) => s.dyads["12"]],
  ["dyad22", "dyad 22", (s) => s.dyads["22"]],
  ["triad111", "triad 111", (s) => s.triads["111"]],
  ["triad112", "triad 112 (+211)", (s) => s.triads["112"]],
  ["triad212", "triad 212", (s) => s.triads["212"]],
  ["triad222", "triad 222", (s) => s.triads["222"]],
  ["triad221", "triad 221 (+122)", (s) => s.triads["221"]],
  ["triad121", "triad 121", (s) => s.triads["121"]],
  ["meanLength1", "mean M1 run length", (s) => s.meanLength1],
  ["meanLength2", "mean M2 run length", (s) => s.meanLength2],
  ["runNumber", "run number (per 100 units)", (s) => s.runNumber],
  ["randomness", "randomness p12 + p21", (s) => s.randomness],
];
/** @type {Record<string, string>} */
const SEQ_GROUPS = { p11: "Addition probabilities", dyad11: "Dyads (sum 1)", triad111: "Triads centred on M1 (sum 1)",
  triad222: "Triads centred on M2 (sum 1)", meanLength1: "Runs" };

/** @param {Project} p @param {SequenceResult} s */
function drawSequence(p, s) {
  const batch = s.batch || null;
  setText("#seq-col-feed", `At feed f1 = ${fix(p.f10, 3)}`);
  setText("#seq-col-batch", batch ? `Batch to X = ${fix(batch.conversion, 3)}` : `Batch: ${TERMINAL_ONLY}`);
  const body = document.createElement("tbody");
  /** @type {CSVValue[][]} */
  const csv = [["statistic", `at feed f1 = ${p.f10}`, batch ? `batch average to X = ${batch.conversion}` : "batch average"]];
  for (const [key, label, get] of SEQ_ROWS) {
    if (SEQ_GROUPS[key]) {
      const tr = document.createElement("tr");
      tr.className = "group";
      const th = document.createElement("th");
      th.colSpan = 3;
      th.scope = "colgroup";
      th.textContent = SEQ_GROUPS[key];
      tr.append(th);
      body.append(tr);
    }
    const tr = document.createElement("tr");
    const th = document.createElement("th");
    th.scope = "row";
    th.textContent = label;
    tr.append(th);
    const feedVal = get(s);
    const batchVal = batch ? get(batch) : NaN;
    for (const [v, col] of /** @type {const} */ ([[feedVal, "feed"], [batchVal, "batch"]])) {
      const td = document.createElement("td");
      if (col === "feed" || batch) {
        td.dataset.stat = key;
        td.dataset.col = col;
      }
      td.textContent = fix(v, 4);
      tr.append(td);
    }
    body.append(tr);
    csv.push([label, feedVal, batch ? batchVal : ""]);
  }
  $("#seq-table tbody").replaceWith(body);
  const base = fileBase(p, "sequence");
  $("#seq-actions").replaceChildren(button("Save table (CSV)", () => saveCSV(csv, base + ".csv")));

  const rl = s.runLengths;
  if (!rl) return figNote("fig-runs", `Run-length distributions: ${TERMINAL_ONLY}.`);
  const w = 0.38;
  const top = Math.max(...rl.number1, ...rl.number2, 1e-9);
  const svg = chart({
    title: `Run lengths at f1 = ${fix(p.f10, 3)}`,
    width: 600, height: 340,
    x: { min: 0.4, max: rl.length.length + 0.6, label: "run length n (units)", integer: true },
    y: { min: 0, max: Math.min(1, top * 1.12), label: "number fraction of runs" },
    layers: [
      { type: "bars", x0: rl.length.map((n) => n - w), x1: rl.length.map((n) => n), y: rl.number1, color: C.m1 },
      { type: "bars", x0: rl.length.map((n) => n), x1: rl.length.map((n) => n + w), y: rl.number2, color: C.m2 },
    ],
    legend: [
      { label: `M1 runs (${m1Name(p)})`, color: C.m1, kind: "box" },
      { label: `M2 runs (${m2Name(p)})`, color: C.m2, kind: "box" },
    ],
  });
  const rows = [["run length", "M1 number fraction", "M1 weight fraction", "M2 number fraction", "M2 weight fraction"],
    ...rl.length.map((n, i) => [n, rl.number1[i], rl.weight1[i], rl.number2[i], rl.weight2[i]])];
  mountFigure("fig-runs", svg, fileBase(p, "run-lengths"), rows);
}

/** @param {Project} p @param {ChainsResult} c */
function drawChains(p, c) {
  const svg = strips({
    title: `${c.samples.length} sample chains of ${CHAIN_LENGTH} units at f1 = ${fix(p.f10, 3)}`,
    width: 600,
    chains: c.samples,
    colors: [C.m1, C.m2],
    xLabel: "unit along the chain",
    legend: [
      { label: `M1 (${m1Name(p)})`, color: C.m1, kind: "box" },
      { label: `M2 (${m2Name(p)})`, color: C.m2, kind: "box" },
    ],
  });
  const rows = [["chain", "sequence (1 = M1, 2 = M2)"], ...c.samples.map((s, i) => [i + 1, s])];
  mountFigure("fig-chains", svg, fileBase(p, "chains"), rows);
  figureActions("fig-chains").append(button("Draw other chains", () => {
    ctx.store.set("seed", ctx.store.get("seed") + 1);
    ctx.recompute();
  }));
}

/** @type {Step} */
export const sequence = {
  id: "sequence",
  title: "Chain sequence",
  mount(c) {
    ctx = c;
  },
  async compute(p, job) {
    const ratios = modelArgs(p);
    /** @type {ArgOf<"sequence">} */
    const seqArgs = { ...ratios, f1: p.f10, maxLength: RUN_LENGTH_MAX };
    if (p.conversion > 0) seqArgs.conversion = p.conversion;
    const seq = await job.call("sequence", seqArgs);
    const chains = await job.call("chains", { ...ratios, f10: p.f10, count: CHAIN_COUNT, length: CHAIN_LENGTH, seed: ctx.store.get("seed") });
    return { sequence: { seq, chains } };
  },
  draw(p, computed, problems) {
    const kind = modelKind(p);
    setText("#seq-caption", `Sequence statistics (${MODEL_NAME[kind]})`);
    setText("#fig-chains-caption", `Sample chains drawn at random with the ${MODEL_NAME[kind]} at the starting feed; a picture of typical sequences, not of a real sample.`);
    if (!computed.sequence) return;
    const { seq, chains } = computed.sequence;
    if (engine.isError(seq)) problems.push({ input: inputForField(seq.field), message: seq.error });
    else drawSequence(p, seq);
    if (engine.isError(chains)) problems.push({ input: inputForField(chains.field), message: chains.error });
    else drawChains(p, chains);
  },
};
