// @ts-check
// The drawing of a feed plan (step 8, plan.js): the recipe, the facts, the schedule, the shots,
// the plots, the safety box with the hazards, and the starved-feed estimate.

import { $, factList, field, fillList, input, setText } from "../dom.js";
import { saveCSV } from "../download.js";
import * as engine from "../engine.js";
import { C, fileBase, mountFigure } from "../figures.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { fix, m1Name, m2Name, sentence, shortNum } from "../format.js";
import { planNote, starvedText } from "../messages.js";
import { parseNumber } from "../numbers.js";
import { chart, range } from "../plot.js";
import { READ_SDS, monomerOf } from "./monomers.js";

/** @import { PlanResult, PlanRow, Project } from "../../copoly" */
/** @import { Layer, LegendEntry } from "../plot.js" */

/** @import { PlanMade } from "./plan.js" */

const PLAN_EVERY = 10; // the schedule shows every 10th row (and the last) unless asked for all

/** @type {Record<PlanResult["mode"], string>} */
const MODE_TEXT = { batch: "batch", semibatch: "semi-batch", shots: "shot additions" };

/** @typedef {"conversion" | "polymer" | "fed1" | "fed2" | "f1" | "F1" | "F1cum" | "inventory" | "time" | "pump1" | "pump2"} ScheduleKey */

/** @type {[ScheduleKey, string, (v: number | null) => string][]} */
const SCHEDULE_COLS = [
  ["conversion", "X", (v) => fix(v, 4)],
  ["polymer", "Polymer, g", (v) => fix(v, 1)],
  ["fed1", "Fed M1, g", (v) => fix(v, 1)],
  ["fed2", "Fed M2, g", (v) => fix(v, 1)],
  ["f1", "Feed f1", (v) => fix(v, 3)],
  ["F1", "F1 now", (v) => fix(v, 3)],
  ["F1cum", "F1cum", (v) => fix(v, 3)],
  ["inventory", "Unreacted, g", (v) => fix(v, 1)],
  ["time", "Time, min", (v) => fix(v, 1)],
  ["pump1", "Pump M1, g/min", (v) => fix(v, 2)],
  ["pump2", "Pump M2, g/min", (v) => fix(v, 2)],
];

/**
 * volumeText is the mL cell of the recipe: the module's volume for a library liquid, the page's
 * for a liquid of your own with a density, or why there is none.
 * @param {string} name @param {number} g @param {number | null} v
 */
function volumeText(name, g, v) {
  if (typeof v === "number" && Number.isFinite(v)) return fix(v, 1);
  const e = monomerOf(name);
  const m = e ? e.m : null;
  if (e && e.own && e.m.state === "liquid" && e.m.density > 0) return fix(g / e.m.density, 1);
  if (m && m.state === "gas") return "gas: weigh it in";
  if (m && m.state === "solid") return "solid: weigh it";
  if (e && e.own && e.m.density > 0) return "give its state";
  return "no density";
}

/**
 * drawPlan draws a plan made from args.
 * @param {Project} p @param {PlanResult} r @param {PlanMade} args @param {boolean} allRows
 */
export function drawPlan(p, r, args, allRows) {
  const n1 = m1Name(p), n2 = m2Name(p);
  const rows = r.schedule;
  const last = rows[rows.length - 1];
  const tol = args.tolerance;
  $("#plan-results").hidden = false;
  $("#plan-more").hidden = false;
  setText("#plan-status", `Plan: ${shortNum(args.polymerMass)} g of copolymer at F1 = ${fix(args.targetF1, 3)} ± ${shortNum(tol)}, by ${MODE_TEXT[r.mode]}` +
    (r.mode === "semibatch" ? `, metering ${r.feedF1 === 1 ? n1 : r.feedF1 === 0 ? n2 : "a mixture"}.` : "."));

  // Recipe.
  const body = document.createElement("tbody");
  for (const [which, name, g, mol, v, total] of /** @type {const} */ ([[1, n1, r.initial.m1, r.initial.n1, r.initial.v1, r.total.m1], [2, n2, r.initial.m2, r.initial.n2, r.initial.v2, r.total.m2]])) {
    const tr = document.createElement("tr");
    const th = document.createElement("th");
    th.scope = "row";
    th.textContent = `M${which}: ${name}`;
    tr.append(th);
    for (const [col, text] of [["m", fix(g, 1)], ["n", fix(mol, 3)], ["v", volumeText(name, g, v)], ["later", fix(total - g, 1)], ["total", fix(total, 1)]]) {
      const td = document.createElement("td");
      td.dataset.col = col;
      td.textContent = text;
      tr.append(td);
    }
    body.append(tr);
  }
  $("#plan-recipe tbody").replaceWith(body);

  // Facts.
  /** @type {[string, string][]} */
  const facts = [["Charge the reactor at feed f1", fix(r.startF1, 3)]];
  if (r.mode === "batch") {
    facts.push(["Stop at conversion X", fix(r.stopConversion, 3) + (args.stopConversion ? "" : ` (where F1cum leaves ± ${shortNum(tol)})`)]);
  } else {
    facts.push(["Conversion at the end", fix(r.stopConversion, 3)]);
  }
  if (r.mode === "semibatch") {
    const stream = r.feedF1 === 1 ? `${n1} alone` : r.feedF1 === 0 ? `${n2} alone` : `mixture at f1 = ${fix(r.feedF1, 3)}`;
    facts.push(["Metered stream", stream]);
    const fed = last.fed1 + last.fed2;
    facts.push(["Stream per polymer formed", `${fix(r.feedPerPolymer, 3)} mol per mol of units; ${fix(fed / last.polymer, 3)} g per g`]);
  }
  if (r.mode === "shots") facts.push(["Shots", `${r.shots.length}, listed below`]);
  let product = fix(r.productF1, 3);
  if (r.band) product += ` (${fix(r.band.productLow, 3)} to ${fix(r.band.productHigh, 3)} over the ratios' region)`;
  facts.push(["Product F1", product]);
  facts.push(["Largest deviation of F1 from the target", fix(r.maxDeviation, 3) + (r.maxDeviation > tol + 1e-9 ? " — outside the tolerance" : "")]);
  if (last.time !== null && Number.isFinite(last.time)) facts.push(["Time to the end", `${fix(last.time, 0)} min (${fix(last.time / 60, 1)} h)`]);
  factList($("#plan-facts"), facts);
  fillList($("#plan-notes"), (r.notes || []).map(planNote));

  drawSchedule(p, r, allRows);
  drawShots(r);
  drawPlanPlots(p, r, args);
  drawSafety(p, r);
  $("#starved-box").hidden = r.mode !== "semibatch";
  const k = args.rateConstant || 0, half = args.halfLife || 0;
  input("#sf-k").placeholder = k > 0 ? shortNum(k) : half > 0 ? shortNum(Math.LN2 / half) : "";
  drawStarved(r, args);
}

/**
 * drawSchedule draws the schedule table: every PLAN_EVERY-th row and the last, or all of them.
 * @param {Project} p @param {PlanResult} r @param {boolean} allRows
 */
export function drawSchedule(p, r, allRows) {
  const rows = r.schedule;
  const timed = rows.some((row) => row.time !== null && Number.isFinite(row.time));
  // Only a semi-batch has pumps; the time column needs a rate law.
  const cols = SCHEDULE_COLS.filter(([key]) => (key !== "time" || timed) && (!key.startsWith("pump") || (timed && r.mode === "semibatch")));
  const head = document.createElement("tr");
  for (const [key, label] of cols) {
    const th = document.createElement("th");
    th.scope = "col";
    th.dataset.col = key;
    th.textContent = label;
    head.append(th);
  }
  const thead = document.createElement("thead");
  thead.append(head);
  const tbody = document.createElement("tbody");
  const lastIndex = rows.length - 1;
  rows.forEach((row, i) => {
    if (!allRows && i % PLAN_EVERY !== 0 && i !== lastIndex) return;
    const tr = document.createElement("tr");
    tr.dataset.i = String(i);
    for (const [key, , fmt] of cols) {
      const td = document.createElement("td");
      td.dataset.col = key;
      td.textContent = fmt(row[key]);
      tr.append(td);
    }
    tbody.append(tr);
  });
  $("#plan-schedule thead").replaceWith(thead);
  $("#plan-schedule tbody").replaceWith(tbody);
  const caption = $("#plan-schedule caption");
  caption.textContent = `Schedule (M1 = ${m1Name(p)}, M2 = ${m2Name(p)}; fed amounts are cumulative${timed && r.mode === "semibatch" ? "; pump rates over the step ending at the row" : ""})` +
    (allRows ? "" : `: every ${PLAN_EVERY}th of ${rows.length} rows`);
  if (!timed) caption.textContent += ". Choose a rate law above to see times and pump rates.";
  setText("#plan-all-rows", allRows ? `Show every ${PLAN_EVERY}th row` : `Show all ${rows.length} rows`);
}

/**
 * scheduleCSV saves every row of the schedule.
 * @param {Project} p @param {PlanResult} r
 */
export function scheduleCSV(p, r) {
  /** @type {Record<ScheduleKey, string>} */
  const units = { conversion: "X (overall molar conversion)", polymer: "polymer g", fed1: `fed ${m1Name(p)} g`, fed2: `fed ${m2Name(p)} g`,
    f1: "feed f1", F1: "F1", F1cum: "F1cum", inventory: "unreacted monomer g", time: "time min", pump1: `pump ${m1Name(p)} g/min`, pump2: `pump ${m2Name(p)} g/min` };
  const keys = SCHEDULE_COLS.map(([key]) => key);
  /** @param {PlanRow} row @param {ScheduleKey} k */
  const value = (row, k) => { const v = row[k]; return v === null ? "" : v; };
  const rows = [keys.map((k) => units[k]), ...r.schedule.map((row) => keys.map((k) => value(row, k)))];
  saveCSV(rows, `${fileBase(p, "plan-schedule")}.csv`);
}

/** @param {PlanResult} r */
function drawShots(r) {
  const box = $("#plan-shots-box");
  box.hidden = r.mode !== "shots" || !r.shots.length;
  if (box.hidden) return;
  const tbody = document.createElement("tbody");
  r.shots.forEach((s, i) => {
    const tr = document.createElement("tr");
    for (const text of [String(i + 1), fix(s.polymer, 1), fix(s.m1, 2), fix(s.m2, 2), s.time !== null && Number.isFinite(s.time) ? fix(s.time, 1) : "–"]) {
      const td = document.createElement("td");
      td.textContent = text;
      tr.append(td);
    }
    tbody.append(tr);
  });
  $("#plan-shot-table tbody").replaceWith(tbody);
}

/**
 * drawPlanPlots draws the copolymer composition on an axis close around the target (so that the
 * saw-tooth of shots shows), the feed in the reactor, and the product's composition distribution.
 * @param {Project} p @param {PlanResult} r @param {PlanMade} args
 */
function drawPlanPlots(p, r, args) {
  const rows = r.schedule;
  const batch = r.mode === "batch";
  const x = rows.map((row) => (batch ? row.conversion : row.polymer));
  const f1 = rows.map((row) => row.f1), F1 = rows.map((row) => row.F1), F1cum = rows.map((row) => row.F1cum);
  const target = args.targetF1, tol = args.tolerance;
  const xAxis = { min: 0, max: x[x.length - 1] > 0 ? x[x.length - 1] : 1, label: batch ? "X, overall molar conversion" : "polymer made so far, g" };
  const mode = MODE_TEXT[r.mode][0].toUpperCase() + MODE_TEXT[r.mode].slice(1);

  /** @type {Layer[]} */
  const layers = [{ type: "band", y0: target - tol, y1: target + tol, color: C.band, opacity: 0.25 }];
  /** @type {number[]} */
  const spread = [];
  const band = r.band;
  if (band) {
    /** @param {number[]} lo @param {number[]} hi */
    const poly = (lo, hi) => [...x.map((v, i) => [v, lo[i]]), ...x.map((v, i) => [v, hi[i]]).reverse()];
    layers.push({ type: "polygon", points: poly(band.F1cumLow, band.F1cumHigh), color: C.cum, opacity: 0.16, stroke: "none", role: "band-cum" });
    layers.push({ type: "polygon", points: poly(band.F1Low, band.F1High), color: C.inst, opacity: 0.16, stroke: "none", role: "band-inst" });
    spread.push(...band.F1Low, ...band.F1High, ...band.F1cumLow, ...band.F1cumHigh);
  }
  layers.push({ type: "line", x, y: F1, color: C.inst, width: 2 }, { type: "line", x, y: F1cum, color: C.cum, width: 2.4 });
  /** @type {LegendEntry[]} */
  const legend = [{ label: "F1 (now)", color: C.inst }, { label: "F1cum (so far)", color: C.cum },
    { label: `wanted F1 ± ${shortNum(tol)}`, color: C.band, kind: "box", opacity: 0.35 }];
  if (band) legend.push({ label: "95 % of outcomes over the ratios' region", color: C.inst, kind: "box", opacity: 0.3 });
  const yr = range([...F1, ...F1cum, ...spread, target - 1.5 * tol, target + 1.5 * tol], { floor: 0, ceil: 1, minSpan: 0.01 });
  const svg = chart({
    title: `${mode}: copolymer composition on the way to ${shortNum(args.polymerMass)} g`,
    width: 600, height: 420, x: xAxis,
    y: { min: yr[0], max: yr[1], label: "F1, mole fraction of M1" },
    layers, legend,
  });
  const csv = [[batch ? "X" : "polymer g", "f1", "F1", "F1cum", ...(band ? ["F1 low", "F1 high", "F1cum low", "F1cum high"] : [])],
    ...x.map((v, i) => [v, f1[i], F1[i], F1cum[i], ...(band ? [band.F1Low[i], band.F1High[i], band.F1cumLow[i], band.F1cumHigh[i]] : [])])];
  mountFigure("fig-plan", svg, fileBase(p, "plan-composition"), csv);
  const why = {
    batch: "Instantaneous F1 and cumulative F1cum as the batch converts; it stops where F1cum would leave the shaded band (the wanted F1 ± the tolerance).",
    semibatch: "Instantaneous F1 and cumulative F1cum against the polymer made: the metered monomer holds the feed steady, so every increment of polymer has the wanted composition. (The overall conversion of a fed reactor is no clock: it rises and falls as monomer is added.)",
    shots: "Instantaneous F1 and cumulative F1cum against the polymer made. Between shots F1 falls away from the target; each shot brings it back, hence the saw-tooth.",
  }[r.mode];
  setText("#fig-plan-caption", why + (band ? ` The lighter bands hold 95 % of the outcomes when r1 and r2 are drawn from their joint confidence region (${band.samples} pairs): the same recipe, run with ratios the data cannot rule out.` : ""));

  const fr = range(f1, { floor: 0, ceil: 1, minSpan: 0.01 });
  const fsvg = chart({
    title: `Feed f1 in the reactor (charged at ${fix(r.startF1, 3)})`,
    width: 600, height: 360, x: xAxis,
    y: { min: fr[0], max: fr[1], label: "f1 of the unreacted monomer" },
    layers: [{ type: "line", x, y: f1, color: C.feed, width: 2 }],
  });
  mountFigure("fig-plan-feed", fsvg, fileBase(p, "plan-feed"), [[batch ? "X" : "polymer g", "f1"], ...x.map((v, i) => [v, f1[i]])]);
  setText("#fig-plan-feed-caption", {
    batch: "The unreacted monomer drifts as the faster monomer is used up; that drift is what moves F1.",
    semibatch: "The metering keeps the unreacted monomer at the charged composition.",
    shots: "The feed drifts between shots; each shot of monomer restores the charged composition.",
  }[r.mode]);

  const h = r.distribution;
  const n = h.weights.length;
  const lo = h.edges[0], hi = h.edges[n];
  const basis = h.basis === "mass" ? "mass" : "moles";
  const hsvg = chart({
    title: "Composition distribution of the product",
    width: 600, height: 340,
    x: { min: lo, max: hi > lo ? hi : lo + 1e-3, label: "F1 of the polymer made", ticks: 5 },
    y: { min: 0, max: Math.max(...h.weights, 1e-9) * 1.1, label: `fraction of polymer (by ${basis})` },
    layers: [{ type: "bars", x0: h.edges.slice(0, n), x1: h.edges.slice(1), y: h.weights, color: C.inst }],
  });
  mountFigure("fig-plan-dist", hsvg, fileBase(p, "plan-distribution"), [["F1 from", "F1 to", `fraction by ${basis}`], ...h.weights.map((w, i) => [h.edges[i], h.edges[i + 1], w])]);
}

/** @param {Project} p @param {PlanResult} r */
function drawSafety(p, r) {
  const s = r.safety;
  setText("#plan-inventory", `Most unreacted monomer in the reactor: ${fix(s.inventoryMax, 1)} g, ` +
    (s.inventoryAt > 0 ? `when ${fix(s.inventoryAt, 0)} g of polymer has formed.` : "at the start, right after charging."));
  const rise = $("#plan-rise");
  rise.classList.remove("flag", "ok");
  if (s.rise === null || s.heat === null) {
    rise.textContent = "The adiabatic temperature rise is not estimated: a heat of polymerization is not known for M1 or M2. Enter −ΔHp under Safety check.";
    return drawHazards(p);
  }
  const value = document.createElement("strong");
  value.id = "plan-rise-value";
  value.textContent = `${s.rise < 10 ? fix(s.rise, 1) : fix(s.rise, 0)} K`;
  const where = s.batchMass > 0 ? `${fix(s.batchMass, 0)} g of reactor contents` : "the reactor contents";
  /** @type {(string | Node)[]} */
  const parts = [`If that monomer polymerized all at once with no cooling, it would give ${fix(s.heat, 0)} kJ and heat ${where} (at ${shortNum(s.heatCapacity)} J/(g·K)) by about `, value, `, against your limit of ${shortNum(s.riseLimit)} K. `];
  const verdict = document.createElement("span");
  verdict.className = "verdict";
  verdict.textContent = s.flagged
    ? "Above the limit. Hold less unreacted monomer (meter it instead of charging it, charge less, dilute), or make sure cooling and relief can take it, then check again."
    : "Within the limit.";
  parts.push(verdict);
  const charged = r.initial.m1 + r.initial.m2;
  if (s.batchMass > 0 && s.batchMass < charged) {
    parts.push(` Check the reactor contents: ${fix(s.batchMass, 0)} g is less than the ${fix(charged, 0)} g of monomer charged.`);
  }
  rise.replaceChildren(...parts);
  rise.classList.add(s.flagged ? "flag" : "ok");
  drawHazards(p);
}

/** @param {Project} p */
function drawHazards(p) {
  const out = [];
  for (const [which, mono] of /** @type {const} */ ([[1, p.monomer1], [2, p.monomer2]])) {
    const e = monomerOf(mono.name);
    const para = document.createElement("p");
    const b = document.createElement("strong");
    b.textContent = `${mono.name || `M${which}`}: `;
    let text;
    if (!e) text = "no hazard data here.";
    else if (!e.m.hazards || !e.m.hazards.length) text = e.own ? "no hazards in your entry." : "no hazards listed here.";
    else text = `${e.m.hazards.join(", ")} (${e.own ? "your entry" : "library"}).`;
    para.append(b, text);
    out.push(para);
  }
  const sds = document.createElement("p");
  sds.textContent = `${READ_SDS} These lists are reminders, not the data sheet.`;
  out.push(sds);
  $("#plan-hazards").replaceChildren(...out);
}

/**
 * drawStarved works out the steady unreacted inventory of a starved feed (copoly.starvedFeed)
 * for the semi-batch plan r made from args.
 * @param {PlanResult | null} r @param {PlanMade | null} a
 */
export function drawStarved(r, a) {
  return engine.newest("starved", async (job) => {
    const rateIn = field("#sf-rate"), kIn = field("#sf-k");
    clearFieldError(rateIn);
    clearFieldError(kIn);
    delete $("#sf-out").dataset.result; // marks an answer, which the printed report keeps
    if (!r || !a || r.mode !== "semibatch") return;
    /** @param {HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement} input @param {string} label @param {number | undefined} fallback */
    const read = (input, label, fallback) => {
      const raw = input.value.trim();
      if (raw === "") return fallback;
      const v = parseNumber(raw);
      if (Number.isNaN(v)) setFieldError(input, `${label} = “${raw}” is not a number.`);
      return v;
    };
    const feedRate = read(rateIn, "feed rate", undefined);
    const given = a.rateConstant || 0, half = a.halfLife || 0;
    const k = read(kIn, "rate constant", given > 0 ? given : half > 0 ? Math.LN2 / half : undefined);
    if (feedRate === undefined || k === undefined) {
      return setText("#sf-out", `Give the ${[feedRate === undefined ? "feed rate" : "", k === undefined ? "rate constant" : ""].filter(Boolean).join(" and the ")}.`);
    }
    if (Number.isNaN(feedRate) || Number.isNaN(k)) return setText("#sf-out", "");
    const s = await job.call("starvedFeed", { r1: a.r1, r2: a.r2, targetF1: a.targetF1, feedRate, rateConstant: k, molarMass1: a.molarMass1, molarMass2: a.molarMass2 });
    if (engine.isError(s)) {
      const input = s.field === "feedRate" ? rateIn : s.field === "rateConstant" ? kIn : null;
      const msg = starvedText(s.error);
      if (input) setFieldError(input, msg);
      return setText("#sf-out", input ? "" : sentence(msg));
    }
    $("#sf-out").dataset.result = "";
    setText("#sf-out", `About ${fix(s.inventory, 1)} g of unreacted monomer sits in the reactor, at f1 = ${fix(s.f1, 3)}. Metering faster, or a slower reaction, raises it.`);
  });
}
