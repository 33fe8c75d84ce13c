// @ts-check
// Step 8, feed plan for the reactor: the panel's inputs, the plan (copoly.plan) once the typing
// pauses, and the drawing of it (plandraw.js); the monomer data and the user's own monomers are
// monomers.js's.
//
// The panel's inputs are saved in the project's plan (the plan of a Project in copoly.d.ts): a
// box's value is saved when it reads as a number the plan accepts; a box whose text is not valid
// keeps its text on screen, is marked, and leaves the saved value as it was.

import { $, choice, field, input, select, setText } from "../dom.js";
import * as engine from "../engine.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { capital, fix, sentence, shortNum } from "../format.js";
import { planKey, planSavedKey, planText } from "../messages.js";
import { parseNumber, parseTimeTable } from "../numbers.js";
import { task } from "../schedule.js";
import { drawPlan, drawSchedule, drawStarved, scheduleCSV } from "./plandraw.js";
import { ownMonomers } from "../library.js";
import { drawMonomerData, loadMonomers, monomerOf, mountMonomers, startMonomers } from "./monomers.js";

/** @import { PlanResult, Project } from "../../copoly" */
/** @import { ArgOf, Job } from "../engine.js" */
/** @import { Problem } from "../fields.js" */
/** @import { Ctx, Step } from "../main.js" */

/** @typedef {NonNullable<Project["plan"]>} SavedPlan */
/** @typedef {ArgOf<"plan">} PlanArgs */
/** @typedef {PlanArgs & {tolerance: number}} PlanMade  the argument of copoly.plan as the panel makes it, the tolerance always given */

const PLAN_DELAY_MS = 250;

/** @typedef {"targetF1" | "polymerMass" | "tolerance" | "stopConversion" | "finalConversion" | "feedF1" | "shots" | "rateConstant" | "halfLife" | "batchMass" | "heatCapacity" | "riseLimit" | "heat1" | "heat2"} PlanNumber */

/** @type {[string, PlanNumber, string, boolean][]} PLAN_BOXES: [selector, key of copoly.plan's argument, label, saved in project.plan]. */
const PLAN_BOXES = [
  ["#plan-target", "targetF1", "wanted F1", true],
  ["#plan-mass", "polymerMass", "copolymer to make", true],
  ["#plan-tolerance", "tolerance", "tolerance", true],
  ["#plan-stop", "stopConversion", "stopping conversion", true],
  ["#plan-final", "finalConversion", "final conversion", true],
  ["#plan-feed-f1", "feedF1", "f1 of the mixture", true],
  ["#plan-shots", "shots", "number of shots", true],
  ["#plan-k", "rateConstant", "rate constant", true],
  ["#plan-half", "halfLife", "half-life", true],
  ["#plan-batch-mass", "batchMass", "reactor contents", true],
  ["#plan-cp", "heatCapacity", "heat capacity", true],
  ["#plan-rise-limit", "riseLimit", "limit on the rise", true],
  ["#plan-heat1", "heat1", "−ΔHp of M1", true],
  ["#plan-heat2", "heat2", "−ΔHp of M2", true],
];
/** @type {PlanArgs["mode"][]} */
const PLAN_MODES = ["batch", "semibatch", "shots"];
/** @type {NonNullable<PlanArgs["feed"]>[]} the options of #plan-feed */
const PLAN_FEEDS = ["faster", "mixture"];
/** @type {NonNullable<SavedPlan["rateLaw"]>[]} the options of #plan-rate, saved as project.plan.rateLaw */
const PLAN_RATES = ["none", "k", "half", "table"];

/** @type {PlanNumber[]} the boxes passed to copoly.plan when they read and take part */
const OPTIONAL_ARGS = ["stopConversion", "finalConversion", "feedF1", "shots", "rateConstant", "halfLife", "batchMass", "heatCapacity", "riseLimit", "heat1", "heat2"];

/** @param {string} key */
const labelOf = (key) => { const b = PLAN_BOXES.find((x) => x[1] === key); return b ? b[2] : undefined; };

/** @type {Ctx} */
let ctx;
const ui = {
  started: false,
  key: "",
  /** @type {PlanResult | null} */
  result: null,
  /** @type {PlanMade | null} */
  args: null,
  dirty: false,    // a box was edited since the inputs were last saved
  allRows: false,  // the schedule shows every row
};
const planTask = task(runPlan, PLAN_DELAY_MS, { beforeOutput: true });

/**
 * planField returns the box named by a field of copoly.plan ("timeTable[3][1]" is the table).
 * @param {string | undefined} f
 * @returns {HTMLElement | null}
 */
function planField(f) {
  const key = planKey(f);
  if (key === "timeTable") return $("#plan-table");
  if (key === "mode") return $("#plan-mode");
  if (key === "feed") return $("#plan-feed");
  const b = PLAN_BOXES.find((x) => x[1] === key);
  return b ? $(b[0]) : null;
}

/**
 * fieldUsed reports whether a box of the panel takes part in the plan for the chosen options.
 * @param {Element | null} f the box's .field
 */
function fieldUsed(f) {
  if (!(f instanceof HTMLElement)) return true;
  const mode = select("#plan-mode").value, feed = select("#plan-feed").value, rate = select("#plan-rate").value;
  const d = f.dataset;
  return (!d.modes || d.modes.split(" ").includes(mode)) && (!d.feed || d.feed === feed) && (!d.rate || d.rate === rate);
}

function showPlanFields() {
  document.querySelectorAll("#plan .plan-inputs .field").forEach((f) => { if (f instanceof HTMLElement) f.hidden = !fieldUsed(f); });
}

/** @param {Project} p */
function fillPlanForm(p) {
  /** @type {SavedPlan} */
  const pl = p.plan || {};
  for (const [sel, key, , saved] of PLAN_BOXES) {
    const input = field(sel);
    const v = pl[key];
    input.value = saved && typeof v === "number" && v > 0 ? shortNum(v) : "";
    clearFieldError(input);
  }
  select("#plan-mode").value = PLAN_MODES.find((m) => m === pl.mode) || "semibatch";
  select("#plan-feed").value = pl.feed === "mixture" ? "mixture" : "faster";
  select("#plan-rate").value = pl.rateLaw && PLAN_RATES.includes(pl.rateLaw) ? pl.rateLaw
    : (pl.rateConstant || 0) > 0 ? "k" : (pl.halfLife || 0) > 0 ? "half" : "none";
  // The typed text of the table is not saved: the saved numbers are written back, tab-separated.
  field("#plan-table").value = Array.isArray(pl.timeTable) ? pl.timeTable.map((row) => row.join("\t")).join("\n") : "";
  clearFieldError($("#plan-table"));
  showPlanFields();
}

/**
 * currentF1 is the instantaneous copolymer composition at the feed of step 3, the default target.
 * @param {Project} p @param {Job} job
 */
async function currentF1(p, job) {
  const r = await job.call("composition", { r1: p.r1, r2: p.r2, f1: [p.f10] });
  return engine.isError(r) ? NaN : r.F1[0];
}

/**
 * planProjectChanged brings the panel up to date with a new valid project or monomer list.
 * @param {Project} p
 */
function planProjectChanged(p) {
  drawMonomerData(p);
  return engine.newest("plan-defaults", async (job) => {
    const F = await currentF1(p, job);
    input("#plan-target").placeholder = Number.isFinite(F) ? fix(F, 3) : "";
    setText("#plan-target-unit", Number.isFinite(F) ? `blank = ${fix(F, 3)}, step 3's` : "copolymer");
    input("#plan-tolerance").placeholder = shortNum(p.tolerance);
    for (const [which, mono] of /** @type {const} */ ([[1, p.monomer1], [2, p.monomer2]])) {
      const e = monomerOf(mono.name);
      const heat = e && e.m.heat > 0 ? e.m.heat : NaN;
      input(`#plan-heat${which}`).placeholder = Number.isFinite(heat) ? shortNum(heat) : "";
      setText(`#plan-heat${which}-source`, !e || !Number.isFinite(heat)
        ? "Not known here: enter a value to estimate the temperature rise."
        : `Blank = ${shortNum(heat)}, ${e.own ? "your entry" : "the library's value"} (see Monomer data).`);
    }
    planTask.schedule();
  });
}

/** @param {Event} [ev] */
function onPlanInput(ev) {
  if (ev && ev.target instanceof Element) clearFieldError(ev.target);
  ui.dirty = true;
  planTask.schedule();
}

/**
 * @typedef {object} PlanRead  the panel as read
 * @property {Partial<Record<PlanNumber, number>>} values  the boxes that read as numbers
 * @property {Problem[]} errors  beside boxes
 * @property {PlanArgs["mode"]} mode
 * @property {[number, number][] | null} table  the time–conversion table, when it reads
 * @property {string} [blocked]  why there can be no plan, in words
 * @property {PlanMade} [args]   the argument of copoly.plan
 */

/**
 * readPlan reads the panel.
 * @param {Project} p @param {Job} job
 * @returns {Promise<PlanRead>}
 */
async function readPlan(p, job) {
  /** @type {PlanRead["values"]} */
  const values = {};
  /** @type {Problem[]} */
  const errors = [];
  for (const [sel, key, label] of PLAN_BOXES) {
    const input = field(sel);
    const raw = input.value.trim();
    if (raw === "") continue;
    const v = parseNumber(raw);
    if (Number.isNaN(v)) {
      if (fieldUsed(input.closest(".field"))) errors.push({ input, message: `${label} = “${raw}” is not a number.` });
      continue;
    }
    values[key] = v;
  }
  const mode = choice("#plan-mode", PLAN_MODES);
  /** @type {PlanRead} */
  const out = { values, errors, mode, table: null };
  const rate = select("#plan-rate").value;
  if (rate === "k" && field("#plan-k").value.trim() === "") errors.push({ input: $("#plan-k"), message: "Enter the rate constant, or choose no rate law." });
  if (rate === "half" && field("#plan-half").value.trim() === "") errors.push({ input: $("#plan-half"), message: "Enter the half-life, or choose no rate law." });
  /** @type {[number, number][] | null} */
  let table = null;
  if (rate === "table") {
    const t = parseTimeTable(field("#plan-table").value);
    if (t.error !== undefined) errors.push({ input: $("#plan-table"), message: capital(t.error) });
    else out.table = table = t.rows;
  }
  const missing = /** @type {const} */ ([[1, p.monomer1], [2, p.monomer2]]).filter(([, m]) => !(m.molarMass > 0)).map(([w]) => `M${w}`);
  if (missing.length) out.blocked = `the plan weighs the monomers, so give the molar mass of ${missing.join(" and ")} in step 1.`;
  else if (field("#plan-mass").value.trim() === "") out.blocked = "enter how much copolymer to make.";
  if (errors.length || out.blocked) return out;

  const F = await currentF1(p, job);
  const polymerMass = values.polymerMass;
  if (polymerMass === undefined) return out; // not reached: a box that does not read is an error above
  /** @type {PlanMade} */
  const args = {
    r1: p.r1, r2: p.r2, mode,
    targetF1: values.targetF1 !== undefined ? values.targetF1 : F,
    molarMass1: p.monomer1.molarMass, molarMass2: p.monomer2.molarMass,
    polymerMass,
    tolerance: values.tolerance !== undefined ? values.tolerance : p.tolerance,
  };
  /** @param {PlanNumber} key */
  const use = (key) => {
    const b = PLAN_BOXES.find((x) => x[1] === key);
    const v = values[key];
    if (b && v !== undefined && fieldUsed($(b[0]).closest(".field"))) args[key] = v;
  };
  OPTIONAL_ARGS.forEach(use);
  if (mode === "semibatch") args.feed = choice("#plan-feed", PLAN_FEEDS);
  if (table) args.timeTable = table;
  // Library monomers lend the module their densities, heats and hazards by name; for the user's
  // own, the page passes the heat and works out the volume itself (plandraw.js).
  for (const [which, mono] of /** @type {const} */ ([[1, p.monomer1], [2, p.monomer2]])) {
    const e = monomerOf(mono.name);
    if (e && e.own) {
      if (args[`heat${which}`] === undefined && e.m.heat > 0) args[`heat${which}`] = e.m.heat;
    } else if (mono.name) {
      args[`monomer${which}`] = e ? e.m.name : mono.name;
    }
  }
  if (Array.isArray(p.jcr) && p.jcr.length >= 3) args.jcr = p.jcr;
  out.args = args;
  return out;
}

/**
 * savePlanInputs keeps the panel's valid values in the project (see the head of this file);
 * refused names the box the plan refused, if any.
 * @param {PlanRead} read @param {string | null} refused
 */
async function savePlanInputs(read, refused) {
  const p = ctx.store.get("project");
  if (!ui.dirty || !p) return;
  ui.dirty = false;
  /** @type {SavedPlan} */
  const prev = p.plan || {};
  /** @type {SavedPlan} */
  const next = { ...prev, mode: read.mode };
  if (read.mode === "semibatch" || prev.feed) next.feed = select("#plan-feed").value;
  for (const [sel, key, , saved] of PLAN_BOXES) {
    if (!saved) continue;
    const raw = field(sel).value.trim();
    const v = read.values[key];
    if (raw === "") delete next[key];
    else if (v !== undefined && Number.isFinite(v) && v >= 0 && key !== refused && (key !== "shots" || Number.isInteger(v))) next[key] = v;
  }
  const rate = choice("#plan-rate", PLAN_RATES);
  next.rateLaw = rate;
  if (rate !== "k") delete next.rateConstant;
  if (rate !== "half") delete next.halfLife;
  if (rate !== "table" || field("#plan-table").value.trim() === "") delete next.timeTable;
  else if (read.table && refused !== "timeTable") next.timeTable = read.table;
  // A value the project check refuses (a heat above its limit, a table the plan was not yet
  // asked about) keeps its saved value; anything else refused leaves the project as it was.
  // The check names the key as text: both plans are looked at as records of it.
  /** @type {Record<string, unknown>} */
  const old = prev;
  /** @type {Record<string, unknown>} */
  const now = next;
  const ended = await engine.newest("plan-save", async (job) => {
    for (let tries = 0; tries < 4; tries++) {
      if (JSON.stringify(next) === JSON.stringify(prev)) return true;
      const cur = ctx.store.get("project");
      if (!cur) return true;
      const checked = await job.call("checkProject", { project: { ...cur, plan: next } });
      if (!engine.isError(checked)) {
        ctx.setPart("plan", checked.project.plan || {});
        return true;
      }
      const key = planSavedKey(checked.field);
      if (!key || JSON.stringify(now[key]) === JSON.stringify(old[key])) return true;
      if (old[key] === undefined) delete now[key];
      else now[key] = old[key];
    }
    return true;
  });
  // A newer save took over before this one ended: the panel is still to be saved.
  if (!ended) ui.dirty = true;
}

/** @param {boolean} stale */
function planStale(stale) {
  $("#plan .plan-stale").hidden = !stale || !ui.result;
}

function runPlan() {
  return engine.newest("plan", async (job) => {
    const p = ctx.store.get("project");
    if (!ui.started || !p || !engine.running()) return;
    PLAN_BOXES.forEach(([sel]) => clearFieldError($(sel)));
    clearFieldError($("#plan-table"));
    const read = await readPlan(p, job);
    if (read.errors.length || read.blocked || !read.args) {
      for (const { input, message } of read.errors) if (input) setFieldError(input, message);
      const why = read.blocked || "correct the marked field.";
      setText("#plan-status", `${ui.result ? "Plan not updated" : "No plan yet"}: ${why}`);
      planStale(true);
      await savePlanInputs(read, null);
      return;
    }
    const key = JSON.stringify([read.args, p.monomer1.name, p.monomer2.name, ownMonomers(p)]);
    if (key === ui.key && ui.result) {
      planStale(false);
      await savePlanInputs(read, null);
      return;
    }
    const r = await job.call("plan", read.args);
    if (engine.isError(r)) {
      const input = planField(r.field);
      const boxed = input && input.tagName !== "SELECT";
      if (input && boxed) setFieldError(input, planText(r.error, labelOf));
      setText("#plan-status", boxed ? `${ui.result ? "Plan not updated" : "No plan yet"}: correct the marked field.`
        : `No plan: ${sentence(planText(r.error, labelOf))}`);
      ui.key = "";
      planStale(true);
      await savePlanInputs(read, planKey(r.field));
      return;
    }
    ui.key = key;
    ui.result = r;
    ui.args = read.args;
    planStale(false);
    drawPlan(p, r, read.args, ui.allRows);
    await savePlanInputs(read, null);
  });
}

/** @param {Project} p */
function loadPlanPanel(p) {
  if (!ui.started) return;
  loadMonomers();
  fillPlanForm(p);
  // The last plan belongs to the project replaced: take it off the screen.
  ui.key = "";
  ui.result = null;
  ui.args = null;
  ui.dirty = false;
  $("#plan-results").hidden = true;
  $("#plan-more").hidden = true;
  planStale(false);
  planProjectChanged(p);
}

/** the planned result and its argument, for the starved feed */
export const planned = () => ({ result: ui.result, args: ui.args });

/** @type {Step} */
export const plan = {
  id: "plan",
  title: "Feed plan for the reactor",
  mount(c) {
    ctx = c;
    mountMonomers(c);
    for (const [sel] of PLAN_BOXES) $(sel).addEventListener("input", onPlanInput);
    $("#plan-table").addEventListener("input", onPlanInput);
    for (const sel of ["#plan-mode", "#plan-feed", "#plan-rate"]) {
      $(sel).addEventListener("change", () => { showPlanFields(); onPlanInput(); });
    }
    $("#plan-all-rows").addEventListener("click", () => {
      ui.allRows = !ui.allRows;
      const p = ctx.store.get("project");
      if (ui.result && p) drawSchedule(p, ui.result, ui.allRows);
    });
    $("#plan-csv").addEventListener("click", () => {
      const p = ctx.store.get("project");
      if (ui.result && p) scheduleCSV(p, ui.result);
    });
    $("#sf-rate").addEventListener("input", () => drawStarved(ui.result, ui.args));
    $("#sf-k").addEventListener("input", () => drawStarved(ui.result, ui.args));
    ctx.store.subscribe("invalid", (bad) => { if (bad && ui.started) planStale(true); });
    // The user's own monomers lend the plan their heats and hazards.
    ctx.store.subscribe("project", (p, why) => { if (why === "userMonomers" && p && ui.started) planProjectChanged(p); });
  },
  start() {
    const p = ctx.store.get("project");
    if (ui.started || !p || !engine.running()) return;
    ui.started = true;
    startMonomers();
    fillPlanForm(p);
    planProjectChanged(p);
    planTask.schedule(true);
  },
  load: loadPlanPanel,
  update(p) {
    if (ui.started) planProjectChanged(p);
  },
};
