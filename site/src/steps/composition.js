// @ts-check
// Step 2, copolymer composition at low conversion: the composition curve with its azeotrope and
// the classification of the pair, and the feed that gives a wanted copolymer.

import { $, field, setText } from "../dom.js";
import * as engine from "../engine.js";
import { C, fileBase, mountFigure } from "../figures.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { inputForField } from "../form.js";
import { fix, linspace, m1Name, m2Name, sig3 } from "../format.js";
import { MODEL_NAME, TERMINAL_ONLY, modelArgs, modelKind, modelNote } from "../model.js";
import { parseNumber } from "../numbers.js";
import { chart } from "../plot.js";

/** @import { CompositionResult, DriftResult, Project } from "../../copoly" */
/** @import { Ctx, Step } from "../main.js" */
/** @import { Layer, LegendEntry } from "../plot.js" */

export const COMPOSITION_POINTS = 101;

/** @type {Ctx} */
let ctx;

/**
 * drawComposition draws the curve; drift, when it was computed, gives the starting feed's point.
 * @param {Project} p @param {CompositionResult} comp @param {DriftResult | null} drift
 */
function drawComposition(p, comp, drift) {
  const f1 = linspace(0, 1, COMPOSITION_POINTS);
  const cl = comp.classification;
  setText("#out-azeotrope", !cl ? TERMINAL_ONLY : comp.azeotrope === null || comp.azeotrope === undefined ? "none" : fix(comp.azeotrope, 3));
  setText("#out-product", cl ? sig3(cl.product) : TERMINAL_ONLY);
  setText("#out-class", cl ? cl.text : "The crossings of the curve with the diagonal are the azeotropes of this model.");
  /** @type {Layer[]} */
  const layers = [
    { type: "line", x: [0, 1], y: [0, 1], color: C.diag, width: 1.5, dash: "5 5", role: "diagonal" },
    { type: "line", x: f1, y: comp.F1, color: C.inst, width: 3, role: "F1" },
  ];
  /** @type {LegendEntry[]} */
  const legend = [
    { label: cl ? "F1 (Mayo–Lewis)" : `F1 (${MODEL_NAME[modelKind(p)]})`, color: C.inst },
    { label: "F1 = f1", color: C.diag, dash: "5 5", width: 1.5 },
  ];
  if (drift) {
    layers.push({ type: "point", x: p.f10, y: drift.F1[0], color: C.feed, shape: "circle", r: 5 });
    legend.push({ label: `starting feed f1 = ${fix(p.f10, 3)}`, color: C.feed, kind: "point" });
  }
  if (comp.azeotrope !== null && comp.azeotrope !== undefined) {
    layers.push({ type: "point", x: comp.azeotrope, y: comp.azeotrope, color: C.azeo, shape: "diamond",
      text: `azeotrope ${fix(comp.azeotrope, 3)}`, anchor: comp.azeotrope < 0.6 ? "start" : "end" });
    legend.push({ label: "azeotrope", color: C.azeo, kind: "point", shape: "diamond" });
  }
  const svg = chart({
    title: `Copolymer composition: ${m1Name(p)} (M1) with ${m2Name(p)} (M2)`,
    width: 600, height: 470,
    x: { min: 0, max: 1, label: "f1, mole fraction of M1 in the feed", ticks: 10 },
    y: { min: 0, max: 1, label: "F1, mole fraction of M1 in the copolymer", ticks: 10 },
    layers, legend,
  });
  mountFigure("fig-composition", svg, fileBase(p, "composition"), [["f1", "F1"], ...f1.map((v, i) => [v, comp.F1[i]])]);
}

/**
 * drawFeedFor answers the feed for the wanted F1 (terminal model only). A newer question
 * (another keystroke, another project) drops the answer to an older one.
 * @param {Project} p
 */
function drawFeedFor(p) {
  return engine.newest("feedFor", async (job) => {
    const input = field("#target-F1");
    clearFieldError(input);
    const raw = input.value;
    const target = parseNumber(raw);
    if (modelKind(p) !== "terminal") {
      setText("#out-feed", `Feed for a target: ${TERMINAL_ONLY}.`);
      return setText("#out-feed-note", "Choose the terminal model in step 4 to work out the feed from r1 and r2.");
    }
    if (raw.trim() === "" || Number.isNaN(target)) {
      setFieldError(input, raw.trim() === "" ? "Enter the wanted F1." : `wanted F1 = “${raw.trim()}” is not a number.`);
      return;
    }
    const r = await job.call("feedFor", { r1: p.r1, r2: p.r2, targetF1: target });
    if (engine.isError(r)) {
      setFieldError(inputForField(r.field) || input, r.error);
      return;
    }
    let answer;
    if (!r.feeds.length) answer = "No feed gives this copolymer.";
    else if (r.feeds.length === 1) answer = `Feed f1 = ${fix(r.feeds[0], 3)}`;
    else answer = `Feeds f1 = ${r.feeds.map((v) => fix(v, 3)).join(" or ")}`;
    setText("#out-feed", answer);
    const rangeText = r.range ? ` Reachable F1 with this pair: ${fix(r.range[0], 3)} to ${fix(r.range[1], 3)}.` : "";
    setText("#out-feed-note", (r.note || "") + rangeText);
  });
}

/** @type {Step} */
export const composition = {
  id: "composition",
  title: "Copolymer composition at low conversion",
  mount(c) {
    ctx = c;
    $("#target-F1").addEventListener("input", () => {
      const p = ctx.store.get("project");
      if (p && !ctx.store.get("invalid")) drawFeedFor(p);
    });
  },
  async compute(p, job) {
    return { composition: await job.call("composition", { ...modelArgs(p), f1: linspace(0, 1, COMPOSITION_POINTS) }) };
  },
  draw(p, computed, problems) {
    const note = $("#composition .model-note");
    note.textContent = modelNote(p);
    note.hidden = !note.textContent;
    const comp = computed.composition, drift = computed.drift;
    if (!comp) return;
    if (engine.isError(comp)) problems.push({ input: inputForField(comp.field), message: comp.error });
    else drawComposition(p, comp, drift && !engine.isError(drift) ? drift : null);
  },
  async settle(p) {
    await drawFeedFor(p);
  },
};
