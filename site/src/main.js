// @ts-check
// main.js: the copoly page. It starts the calculation module (engine.js), loads the stored
// project (storage.js), and walks the list of steps, the sections of the page, each a module of
// steps/ with the interface Step below.
//
// Rules kept here:
//   - every user or file text reaches the page through textContent, never innerHTML;
//   - an invalid input is marked beside its field and never replaces the last valid project, its
//     results stay on screen and it is never saved;
//   - the project is saved (debounced) after every valid change, based on the stored revision this
//     tab loaded, so that a save never silently replaces another tab's; the form as typed is saved
//     as a draft after every keystroke and restored after a reload;
//   - the module exiting (go.run resolving) is a crash: #fatal-banner says so.
//
// State: the page's shared state is the store of state.js (the project in use, whether the form
// is valid, the converted bench runs, the last fit…), read with get, replaced with set, followed
// with subscribe. A step keeps whatever else it needs to itself.
//
// A change of the form (steps 1 to 4) is drawn in four phases, each walking the steps in order:
// compute (the module's calls for the project as typed), draw (the drawing, at once, and the
// problems found), settle (more calls once the form is valid), then, with the project in use,
// update. A whole project put on screen (the stored one, an import, the demo, a version brought
// back or kept) is filled into the form (fill), given to every step (load), and then drawn as a
// change of the form. Steps 5 to 10 are drawn for the first time (start) just after the first
// results, each in its own turn of the event loop.

import { $, setText } from "./dom.js";
import * as engine from "./engine.js";
import { setFieldError, showGeneralError } from "./fields.js";
import * as form from "./form.js";
import { wireReport } from "./report.js";
import { createState } from "./state.js";
import { createStorage } from "./storage.js";
import { createUndo } from "./undo.js";
import { project } from "./steps/project.js";
import { pair } from "./steps/pair.js";
import { composition } from "./steps/composition.js";
import { drift } from "./steps/drift.js";
import { sequence } from "./steps/sequence.js";
import { bench } from "./steps/bench.js";
import { estimate } from "./steps/estimate.js";
import { next } from "./steps/next.js";
import { plan } from "./steps/plan.js";
import { triads } from "./steps/triads.js";
import { simulate } from "./steps/simulate.js";
import { size } from "./steps/size.js";

/** @import { ChainsResult, CompositionResult, CopolyError, DriftResult, Project, SequenceResult } from "../copoly" */
/** @import { Job } from "./engine.js" */
/** @import { Problem } from "./fields.js" */
/** @import { PageStore, ProjectPart } from "./state.js" */

/**
 * @typedef {object} Computed  what the steps' compute found for a project, by step
 * @property {CompositionResult | CopolyError} [composition]
 * @property {DriftResult | CopolyError | null} [drift]  null: no conversion to follow
 * @property {{seq: SequenceResult | CopolyError, chains: ChainsResult | CopolyError}} [sequence]
 */

/**
 * @typedef {object} Ctx  what a step is given when it is mounted
 * @property {PageStore} store  the page's named state
 * @property {() => Promise<void>} recompute  read the form of steps 1 to 4 and, when it is valid, draw it and put it in use
 * @property {(p: Project, why: string) => Promise<void>} replaceProject  put a whole project on screen, offering to bring back the one it replaces
 * @property {<K extends ProjectPart>(key: K, value: Project[K] | undefined, why?: "quiet") => void} setPart
 *   change one part of the project in use (undefined removes it); it is saved unless why is "quiet"
 */

/**
 * @typedef {object} Step  one section of the page (or a panel of one), a module of steps/
 * @property {string} id     the id of its element
 * @property {string} title  its heading
 * @property {(ctx: Ctx) => void} mount  once, before the module runs: wire the step's controls and subscriptions
 * @property {(p: Project, job: Job) => Promise<Computed>} [compute]  the module's calls for a project as typed (steps 2 to 4)
 * @property {(p: Project, computed: Computed, problems: Problem[]) => void} [draw]  draw what compute found; add the problems that make the form invalid
 * @property {(p: Project, job: Job) => Promise<void>} [settle]  after a draw without problems: calls that do not decide the form's validity
 * @property {(p: Project) => void} [fill]    write the project's inputs into the step's boxes, with the form
 * @property {(p: Project) => void} [load]    a whole project replaced the one on screen
 * @property {(p: Project) => void} [update]  a valid change of the form is in use
 * @property {() => void} [start]             draw for the first time, after the first results (steps 5 to 10)
 */

/** @type {Step[]} the steps, in the order of the page */
const STEPS = [project, pair, composition, drift, sequence, bench, estimate, next, plan, triads, simulate, size];

// window.copolyReady resolves once the module runs and the first results are drawn.
/** @type {() => void} */
let readyResolve = () => {};
/** @type {(e: Error) => void} */
let readyReject = () => {};
window.copolyReady = new Promise((resolve, reject) => { readyResolve = resolve; readyReject = reject; });
window.copolyReady.catch(() => {}); // a failed start is shown in #load-banner

const store = createState();

/**
 * setPart changes one part of the project in use.
 * @type {Ctx["setPart"]}
 */
function setPart(key, value, why) {
  const p = store.get("project");
  if (!p) return;
  const next = { ...p };
  if (value === undefined) delete next[key];
  else next[key] = value;
  store.set("project", next, why || key);
}

/** @type {Ctx} */
const ctx = { store, recompute, replaceProject, setPart };

/**
 * drawAll computes and draws steps 1 to 4 for project p; it returns the problems met. A section
 * whose call fails keeps its previous drawing.
 * @param {Project} p @param {Job} job
 * @returns {Promise<Problem[]>}
 */
async function drawAll(p, job) {
  /** @type {Computed} */
  const computed = {};
  for (const s of STEPS) if (s.compute) Object.assign(computed, await s.compute(p, job));
  /** @type {Problem[]} */
  const problems = [];
  for (const s of STEPS) if (s.draw) s.draw(p, computed, problems);
  if (!problems.length) for (const s of STEPS) if (s.settle) await s.settle(p, job);
  return problems;
}

/**
 * markInvalid shows the problems beside their fields; the project in use stays, and is not saved.
 * @param {Problem[]} problems
 */
function markInvalid(problems) {
  store.set("invalid", true);
  for (const { input, message } of problems) {
    if (input) setFieldError(input, message);
    else showGeneralError(message);
  }
  document.querySelectorAll(".stale-note").forEach((n) => { if (n instanceof HTMLElement) n.hidden = false; });
}

/**
 * recompute validates the form and, if valid, draws everything and puts the project in use
 * (saved a moment later). A newer recompute drops an older one's results.
 */
async function recompute() {
  await engine.newest("recompute", async (job) => {
    if (!engine.running()) return;
    form.clearErrors();
    const read = form.readForm(store.get("project"), store.get("formJcr"));
    if (read.errors) return markInvalid(read.errors);
    const checked = await job.call("checkProject", { project: read.project });
    if (engine.isError(checked)) return markInvalid([{ input: form.inputForField(checked.field), message: checked.error }]);
    const p = { ...read.project, ...checked.project };
    const problems = await drawAll(p, job);
    if (problems.length) return markInvalid(problems);
    store.set("invalid", false);
    document.querySelectorAll(".stale-note").forEach((n) => { if (n instanceof HTMLElement) n.hidden = true; });
    store.set("project", p, "form");
    for (const s of STEPS) if (s.update) s.update(p);
  });
}

/**
 * fill writes a project into the form of steps 1 to 4 and the boxes steps fill from it.
 * @param {Project} p
 */
function fill(p) {
  form.fillForm(p);
  store.set("formJcr", Array.isArray(p.jcr) && p.jcr.length ? p.jcr : null);
  for (const s of STEPS) if (s.fill) s.fill(p);
}

/**
 * loadProject puts p on screen in place of the project in use, and draws it.
 * @param {Project} p
 */
async function loadProject(p) {
  store.set("project", p, "load");
  fill(p);
  for (const s of STEPS) if (s.load) s.load(p);
  await recompute();
}

const replaced = createUndo({ shown: $("#undo-bar"), text: $("#undo-text"), button: $("#undo-replace") });

/**
 * replaceProject puts p on screen (after the caller validated it), offering to bring the old
 * project back.
 * @param {Project} p @param {string} why
 */
async function replaceProject(p, why) {
  const prev = store.get("project");
  if (prev) replaced.offer(`${why} Your previous project “${prev.name || "untitled"}” was replaced.`, () => { loadProject(prev); });
  await loadProject(p);
}

/** @param {unknown} err */
function failStart(err) {
  const box = $("#load-banner");
  const old = err instanceof engine.Unsupported ? " This page needs a browser from 2023 or later with WebAssembly enabled." : " Reload the page to try again.";
  box.textContent = `The calculation engine could not start: ${err instanceof Error ? err.message : err}.${old} Nothing you saved is lost.`;
  box.hidden = false;
  $("#engine-status").hidden = true;
  document.body.classList.add("engine-stopped");
  readyReject(err instanceof Error ? err : new Error(String(err)));
}

function wireForm() {
  // Ratios typed by hand no longer match the region of a fit: drop it (before recompute runs).
  for (const sel of ["#r1", "#r2"]) $(sel).addEventListener("input", () => store.set("formJcr", null));
  for (const sel of form.PROJECT_INPUTS) $(sel).addEventListener("input", recompute);
  $("#model-kind").addEventListener("change", () => { form.showModelFields(true); recompute(); });
}

async function start() {
  wireReport(window.copolyReady);
  wireForm();
  for (const s of STEPS) s.mount(ctx);
  const storage = createStorage({ store, replaceProject, fill, recompute });
  engine.onStop(() => {
    $("#fatal-banner").hidden = false;
    document.body.classList.add("engine-stopped");
  });
  await engine.start();
  // Storage opens on a goroutine: ask for the project first and fill the pickers meanwhile.
  const loading = storage.load();
  setText("#engine-version", engine.version() ? `version ${engine.version()}` : "");
  const lib = await engine.call("library", {});
  store.set("library", engine.isError(lib) ? { monomers: [], pairs: [] } : { monomers: lib.monomers || [], pairs: lib.pairs || [] });

  const loaded = await loading;
  let p = loaded.project;
  if (!p) {
    const demo = await engine.call("demoProject", {});
    if (engine.isError(demo)) throw new Error(demo.error);
    p = demo.project;
  }
  store.set("project", p, "load");
  fill(p);
  for (const s of STEPS) if (s.load) s.load(p);
  storage.showStatus();
  // The first draw must not count as a change: draw without putting it in use again or saving.
  const first = p;
  await engine.newest("recompute", async (job) => {
    const read = form.readForm(first, store.get("formJcr"));
    const problems = read.errors || await drawAll(first, job);
    if (problems.length) markInvalid(problems);
  });
  // Typing restored from this tab's draft is a change: checked, drawn and saved like one.
  if (storage.restoreDraft(loaded.draft)) await recompute();
  $("#engine-status").hidden = true;
  performance.mark("copoly:ready");
  readyResolve();
  // Steps 5 to 10 (conversion of the bench grid, the fit, the plan…) come after the first results.
  for (const s of STEPS) {
    const begin = s.start;
    if (begin) setTimeout(() => begin(), 0);
  }
}

start().catch(failStart);
