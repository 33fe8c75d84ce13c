// @ts-check
// Step 9, measured triads: the grid of triad fractions (saved in the project when every row that
// is not blank reads, so that a cell being corrected never costs the last good copy), and the
// comparison of the terminal and penultimate models fitted to them (copoly.discriminate), with
// "Use the penultimate ratios", which puts them into the model of step 4.

import { $, $as, setText } from "../dom.js";
import * as engine from "../engine.js";
import { C, fileBase, mountFigure } from "../figures.js";
import { setModel } from "../form.js";
import { fix, linspace, rat, se, sentence, sig3 } from "../format.js";
import { TRIAD_ROWS } from "../limits.js";
import { runsText } from "../messages.js";
import { MODEL_NAME } from "../model.js";
import { chart } from "../plot.js";
import { task } from "../schedule.js";
import { SUM_TOLERANCE } from "../thresholds.js";
import { createUndo } from "../undo.js";
import { createNumberGrid, pasteBox, saveList } from "./numgrid.js";

/** @import { DiscriminationResult, ModelArgs, Project, TriadRow } from "../../copoly" */
/** @import { CSVValue } from "../download.js" */
/** @import { GridColumn } from "../grid.js" */
/** @import { Ctx, Step } from "../main.js" */
/** @import { Layer, LegendEntry, Shape } from "../plot.js" */
/** @import { GridRead, NumberGrid } from "./numgrid.js" */
/** @import { Undo } from "../undo.js" */

const DISC_DELAY_MS = 250;

/** @typedef {"f10" | "F1" | "A111" | "A112" | "A212" | "A222" | "A221" | "A121"} TriadKey */

/** @type {(GridColumn & {key: TriadKey})[]} */
const TRIAD_COLS = [{ key: "f10", heading: "f10", unit: "feed" }, { key: "F1", heading: "F1", unit: "copolymer, optional" },
  { key: "A111", heading: "A111" }, { key: "A112", heading: "A112+211" }, { key: "A212", heading: "A212" },
  { key: "A222", heading: "A222" }, { key: "A221", heading: "A221+122" }, { key: "A121", heading: "A121" }];
/** @type {[TriadKey, "111" | "112" | "212" | "222" | "221" | "121"][][]} the two families: [column, triad] */
const FAMILIES = [[["A111", "111"], ["A112", "112"], ["A212", "212"]], [["A222", "222"], ["A221", "221"], ["A121", "121"]]];

/** @type {Ctx} */
let ctx;
/** @type {NumberGrid} */
let grid;
/** @type {Undo} */
let undo;
let started = false;
/** @type {DiscriminationResult | null} the last comparison */
let disc = null;
/** @type {GridRead | null} the rows the next comparison is of */
let toCompare = null;
const discTask = task(() => (toCompare ? runDisc(toCompare) : undefined), DISC_DELAY_MS);

/**
 * triadRow is a row of the grid as read (f10 is always there: the grid needs it) as a TriadRow.
 * @param {Record<string, number>} v
 * @returns {TriadRow}
 */
const triadRow = (v) => ({ ...v, f10: v.f10 });

/**
 * triadHeader maps a heading such as "f10", "F1", "A112" or "211" to a column of the triads.
 * @param {string} c
 */
function triadHeader(c) {
  const t = c.replace(/\s/g, "");
  if (/^f(10?)?$/.test(t)) return "f10";
  if (/^F1?$/.test(t)) return "F1";
  const m = /^A?(\d{3})/i.exec(t);
  /** @type {Record<string, string>} */
  const same = { 211: "112", 122: "221" };
  const k = m && "A" + (same[m[1]] || m[1]);
  return k && TRIAD_COLS.some((col) => col.key === k) ? k : undefined;
}

// triadsEdited reads the triads grid, saves it when every row reads, checks the family sums
// and schedules the comparison of the models.
function triadsEdited() {
  return engine.newest("triads", async () => {
    if (!ctx.store.get("project")) return;
    const read = grid.read(["f10"]);
    const blocked = read.msgs.some(Boolean);
    const err = blocked ? null : await saveList(ctx, "triads", read.rows.map(triadRow));
    const unsaved = err && !grid.rowError(read, err) ? ` Not saved: ${sentence(err.error)}` : "";
    read.rows.forEach((v, j) => {
      const i = read.at[j];
      for (const fam of FAMILIES) {
        const keys = fam.map((f) => f[0]);
        const sum = keys.reduce((a, k) => a + v[k], 0);
        if (!read.msgs[i] && Math.abs(sum - 1) > SUM_TOLERANCE) {
          read.msgs[i] = { text: `Row ${i + 1}: ${keys.join(" + ")} = ${fix(sum, 3)}; each family sums to 1 (within ${SUM_TOLERANCE}).`, key: keys[0] };
        }
      }
    });
    grid.marks(read.msgs);
    const bad = read.msgs.some(Boolean);
    const n = grid.rows().length;
    setText("#triad-status", (!n ? "The table is empty." : `${read.at.filter((i) => !read.msgs[i]).length} of ${n} rows usable.` +
      (blocked || err ? " The table is not saved until the marked rows are corrected or completed." : bad ? " Correct the marked rows to compare the models." : "")) + unsaved);
    discTask.cancel();
    if (bad) return setText("#disc-status", disc ? "Comparison not updated: correct the marked rows." : "");
    toCompare = read;
    discTask.schedule();
  });
}

/**
 * runDisc fits both models to the rows read and shows the comparison.
 * @param {GridRead} read
 */
function runDisc(read) {
  return engine.newest("disc", async (job) => {
    if (!read.rows.length) {
      disc = null;
      $("#disc-results").hidden = true;
      return setText("#disc-status", "Enter measured triads to compare the terminal and the penultimate model.");
    }
    const d = await job.call("discriminate", { runs: read.rows.map(triadRow) });
    if (engine.isError(d)) {
      if (grid.rowError(read, d)) grid.marks(read.msgs);
      return setText("#disc-status", `${disc ? "Comparison not updated" : "No comparison yet"}: ${sentence(read.msgs.some(Boolean) ? "correct the marked row" : runsText(d.error))}`);
    }
    disc = d;
    // Curves of each fitted model over the feed, from copoly.sequence.
    const f = linspace(0.01, 0.99, 50);
    const tp = d.terminal.params, pp = d.penultimate.params;
    /** @param {ModelArgs} args */
    const curve = async (args) => {
      const out = [];
      for (const x of f) {
        const s = await job.call("sequence", { ...args, f1: x, maxLength: 1 });
        out.push(engine.isError(s) ? null : s.triads);
      }
      return out;
    };
    const ct = await curve({ r1: tp[0], r2: tp[1] });
    const cp = await curve({ model: "penultimate", r11: pp[0], r21: pp[1], r22: pp[2], r12: pp[3] });
    const p = ctx.store.get("project");
    drawDisc(p, d, read, f, ct, cp);
  });
}

/**
 * @param {Project | null} p @param {DiscriminationResult} d @param {GridRead} read
 * @param {number[]} f the feeds of the curves
 * @param {(Record<string, number> | null)[]} ct @param {(Record<string, number> | null)[]} cp the triads of each model along f
 */
function drawDisc(p, d, read, f, ct, cp) {
  $("#disc-results").hidden = false;
  setText("#disc-status", d.verdict);
  const names = { terminal: ["r1", "r2"], penultimate: ["r11", "r21", "r22", "r12"] };
  const body = document.createElement("tbody");
  for (const m of [d.terminal, d.penultimate]) {
    const tr = document.createElement("tr");
    tr.dataset.model = m.model;
    const cells = [MODEL_NAME[m.model], names[m.model].map((k, i) => `${k} = ${rat(m.params[i])} ± ${se(m.se[i])}`).join(", "),
      sig3(m.ssr), `${m.n}, ${m.k} ratios`, fix(m.aicc, 1)];
    cells.forEach((text, i) => {
      const c = document.createElement(i ? "td" : "th");
      c.textContent = text;
      tr.append(c);
    });
    body.append(tr);
  }
  $("#disc-table tbody").replaceWith(body);
  const dof = d.terminal.n - 4;
  setText("#disc-test", `Extra-sum-of-squares F-test: F = ${sig3(d.F)} on 2 and ${dof} degrees of freedom, p = ${sig3(d.pValue)} (below 0.05 favours the penultimate model). ` +
    `AICc is lower for the ${d.deltaAIC > 0 ? "penultimate" : "terminal"} model by ${fix(Math.abs(d.deltaAIC), 1)} (a difference above 2 counts).`);
  const pp = d.penultimate.params;
  setText("#disc-use", `Use the penultimate ratios in step 4 (${names.penultimate.map((k, i) => `${k} = ${rat(pp[i])}`).join(", ")})`);

  const colors = [C.m1, C.cum, C.limit];
  /** @type {Shape[]} */
  const shapes = ["circle", "square", "diamond"];
  FAMILIES.forEach((fam, k) => {
    /** @type {Layer[]} */
    const layers = [];
    /** @type {LegendEntry[]} */
    const legend = [];
    /** @type {CSVValue[][]} */
    const csv = [["f1", ...fam.flatMap(([, t]) => [`${t} terminal`, `${t} penultimate`])]];
    fam.forEach(([key, t], i) => {
      for (const [c, dash] of /** @type {const} */ ([[ct, "7 4"], [cp, null]])) layers.push({ type: "line", x: f, y: c.map((s) => (s ? s[t] : NaN)), color: colors[i], width: 2, dash });
      const rows = read.rows.filter((r) => r[key] !== undefined);
      layers.push({ type: "points", x: rows.map((r) => r.f10), y: rows.map((r) => r[key]), color: colors[i], shape: shapes[i] });
      const col = TRIAD_COLS.find((c) => c.key === key);
      legend.push({ label: col ? col.heading : key, color: colors[i], kind: "point", shape: shapes[i] });
    });
    f.forEach((x, j) => {
      const a = ct[j], b = cp[j];
      csv.push([x, ...fam.flatMap(([, t]) => [a ? a[t] : "", b ? b[t] : ""])]);
    });
    legend.push({ label: "terminal fit", color: C.feed, dash: "7 4", width: 2 }, { label: "penultimate fit", color: C.feed, width: 2 });
    mountFigure(`fig-triads${k + 1}`, chart({
      title: `Triads centred on M${k + 1}: measured and fitted`, width: 600, height: 420,
      x: { min: 0, max: 1, label: "f10, mole fraction of M1 in the feed" }, y: { min: 0, max: 1, label: "triad fraction" }, layers, legend,
    }), fileBase(p, `triads-m${k + 1}`), csv);
  });

  const pred = document.createElement("tbody");
  read.rows.forEach((r, j) => {
    for (const { key, heading } of TRIAD_COLS.slice(1)) {
      if (r[key] === undefined) continue;
      const tr = document.createElement("tr");
      const t = d.predicted.terminal[j], q = d.predicted.penultimate[j];
      for (const text of [String(read.at[j] + 1), fix(r.f10, 3), heading, fix(r[key], 3), fix(t[key], 3), fix(q[key], 3)]) {
        const td = document.createElement("td");
        td.textContent = text;
        tr.append(td);
      }
      pred.append(tr);
    }
  });
  $("#disc-pred tbody").replaceWith(pred);
}

// useDisc puts the fitted penultimate ratios into the model of step 4.
async function useDisc() {
  const d = disc;
  if (!d || !ctx.store.get("project")) return;
  /** @param {number} v */
  const round = (v) => String(Number(v.toPrecision(4)));
  const pp = d.penultimate.params;
  setModel("penultimate", { r11: round(pp[0]), r21: round(pp[1]), r22: round(pp[2]), r12: round(pp[3]) });
  await ctx.recompute();
  setText("#disc-use-note", ctx.store.get("invalid") ? "The ratios are in step 4, but a field of steps 1 to 4 is not valid; correct it to use them."
    : "Steps 2, 3 and 4 and the simulated chains now use the explicit penultimate model with these ratios.");
}

/** @param {Project} p */
function loadTriads(p) {
  if (!started) return;
  const keys = TRIAD_COLS.map((c) => c.key);
  undo.drop();
  disc = null;
  $("#disc-results").hidden = true;
  grid.show((p.triads || []).map((r) => Object.fromEntries(keys.map((k) => {
    const v = r[k];
    return [k, typeof v === "number" && v >= 0 ? String(v) : ""];
  }))));
  triadsEdited();
}

/** @type {Step} */
export const triads = {
  id: "triads",
  title: "Triads",
  mount(c) {
    ctx = c;
    undo = createUndo({ shown: $("#triad-undo"), button: $("#triad-undo") });
    grid = createNumberGrid({ table: $as("#triad-table", HTMLTableElement), columns: TRIAD_COLS, max: TRIAD_ROWS, undo, edited: triadsEdited });
    $("#triad-add").addEventListener("click", () => { if (ctx.store.get("project")) grid.add(); });
    $("#triad-clear").addEventListener("click", () => grid.clear());
    $("#triad-paste-add").addEventListener("click", () => grid.paste(pasteBox("#triad-paste"), triadHeader));
    $("#disc-use").addEventListener("click", useDisc);
  },
  start() {
    const p = ctx.store.get("project");
    if (started || !p || !engine.running()) return;
    started = true;
    loadTriads(p);
  },
  load: loadTriads,
};
