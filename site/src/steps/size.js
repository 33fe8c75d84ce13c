// @ts-check
// Step 10, chain size: molar-mass averages (copoly.averages) from classes of molar mass (saved in
// the project when every row that is not blank reads) or from chromatogram slices (kept in the
// tab), and what they mean in units per chain with the cumulative copolymer of step 3.

import { $, $as, choice, factList, select, setText } from "../dom.js";
import * as engine from "../engine.js";
import { fix, grouped, m1Name, m2Name, sentence, shortNum } from "../format.js";
import { SIZE_ROWS } from "../limits.js";
import { MODEL_NAME, modelArgs, modelKind } from "../model.js";
import { createUndo } from "../undo.js";
import { createNumberGrid, pasteBox, saveList } from "./numgrid.js";

/** @import { AveragesResult, Project } from "../../copoly" */
/** @import { ArgOf, Job } from "../engine.js" */
/** @import { GridColumn, GridRow } from "../grid.js" */
/** @import { Ctx, Step } from "../main.js" */
/** @import { NumberGrid } from "./numgrid.js" */
/** @import { Undo } from "../undo.js" */

/** @type {GridColumn[]} */
const BIN_COLS = [{ key: "low", heading: "Low", unit: "g/mol" }, { key: "high", heading: "High", unit: "g/mol" }, { key: "fraction", heading: "Fraction", unit: "" }];
/** @type {GridColumn[]} */
const SLICE_COLS = [{ key: "mass", heading: "Molar mass", unit: "g/mol" }, { key: "signal", heading: "Signal", unit: "above baseline" }];

/** @type {Ctx} */
let ctx;
/** @type {NumberGrid} */
let grid;
/** @type {Undo} */
let undo;
let started = false;
let bins = true;           // the table shows classes (else slices)
/** @type {Record<"bins" | "slices", GridRow[]>} the rows of each form as typed */
const typed = { bins: [], slices: [] };

const basis = () => choice("#size-basis", ["weightFraction", "numberFraction"]);

// switchForm keeps the rows of the form shown and shows the chosen one.
function switchForm() {
  typed[bins ? "bins" : "slices"] = grid.rows();
  showForm();
}

// showForm shows the table of the chosen form and reads it.
function showForm() {
  bins = select("#size-kind").value === "bins";
  const fieldBox = $("#size-basis").closest(".field");
  if (fieldBox instanceof HTMLElement) fieldBox.hidden = !bins;
  setText("#size-caption", bins ? "Classes of molar mass, each counted at the middle of its range; saved with the project"
    : "Chromatogram slices: molar mass from the calibration, detector signal proportional to the polymer's mass; these stay in this tab and are not saved with the project");
  grid.show(typed[bins ? "bins" : "slices"], bins ? BIN_COLS : SLICE_COLS);
  sizeEdited();
}

/** @param {Project} p */
function loadSize(p) {
  if (!started) return;
  undo.drop();
  const saved = p.sizeBins || [];
  const b = saved.some((x) => (x.numberFraction || 0) > 0) ? "numberFraction" : "weightFraction";
  select("#size-basis").value = b;
  typed.bins = saved.map((x) => ({ low: String(x.low), high: String(x.high), fraction: String(x[b] || 0) }));
  if (!bins) typed.slices = grid.rows();
  showForm();
}

/**
 * sizeF1 is the cumulative copolymer of step 3 at its final conversion.
 * @param {Project} p @param {Job} job
 */
async function sizeF1(p, job) {
  const d = await job.call("drift", { ...modelArgs(p), f10: p.f10, conversion: [0, p.conversion] });
  return engine.isError(d) ? NaN : d.F1cum[d.F1cum.length - 1];
}

// sizeEdited reads the size table, saves the classes and shows the averages.
function sizeEdited() {
  return engine.newest("size", async (job) => {
    const p = ctx.store.get("project");
    if (!p) return;
    const b = basis();
    const read = grid.read((bins ? BIN_COLS : SLICE_COLS).map((c) => c.key));
    const blocked = read.msgs.some(Boolean);
    /** @param {string} k */
    const keyOf = (k) => (/Fraction$/.test(k) ? "fraction" : k);
    const classes = read.rows.map((v) => ({ low: v.low, high: v.high, [b]: v.fraction }));
    const slices = read.rows.map((v) => ({ mass: v.mass, signal: v.signal }));
    let err = bins && !blocked ? await saveList(ctx, "sizeBins", classes) : null;
    const not = $("#size-out").hidden ? "No averages yet" : "Averages not updated";
    let status = "";
    if (blocked) status = `${not}: ${bins ? "the table is not saved until " : ""}the marked rows are corrected or completed.`;
    else if (!read.rows.length) status = "Enter the distribution to see its averages.";
    else if (!err) {
      /** @type {ArgOf<"averages">} */
      const a = bins ? { bins: classes } : { slices };
      const F1 = await sizeF1(p, job);
      if (Number.isFinite(F1) && p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0) Object.assign(a, { F1, molarMass1: p.monomer1.molarMass, molarMass2: p.monomer2.molarMass });
      const r = await job.call("averages", a);
      if (engine.isError(r)) err = r; else drawSize(p, r, a);
    }
    if (err) status = grid.rowError(read, err, keyOf) ? `${not}: correct the marked row.` : `${not}: ${sentence(err.error)}`;
    grid.marks(read.msgs);
    setText("#size-status", status);
  });
}

/** @param {Project} p @param {AveragesResult} r @param {ArgOf<"averages">} a */
function drawSize(p, r, a) {
  /** @type {[string, string, string][]} */
  const rows = [["Mn, number average", grouped(r.Mn) + " g/mol", "Mn"], ["Mw, weight average", grouped(r.Mw) + " g/mol", "Mw"],
    ["Mz", grouped(r.Mz) + " g/mol", "Mz"], ["Dispersity Đ = Mw/Mn", fix(r.dispersity, 3), "D"]];
  const s = r.size;
  if (s) {
    rows.push(["DPn, units per chain (number average)", grouped(s.DPn), "DPn"], ["DPw (weight average)", grouped(s.DPw), "DPw"],
      [`M1 (${m1Name(p)}) units per chain, number average`, grouped(s.units1), "units1"],
      [`M2 (${m2Name(p)}) units per chain, number average`, grouped(s.units2), "units2"]);
  }
  factList($("#size-out"), rows);
  $("#size-out").hidden = false;
  setText("#size-note", s ? `Units per chain with F1 = ${fix(a.F1, 3)}, the cumulative copolymer of step 3 at X = ${shortNum(p.conversion)} (${MODEL_NAME[modelKind(p)]}), and the molar masses of step 1: a mean unit of ${fix(s.unitMass, 2)} g/mol. End groups are neglected.`
    : "Give both molar masses in step 1 to turn the averages into units per chain.");
}

/** @type {Step} */
export const size = {
  id: "size",
  title: "Chain size",
  mount(c) {
    ctx = c;
    undo = createUndo({ shown: $("#size-undo"), button: $("#size-undo") });
    grid = createNumberGrid({ table: $as("#size-table", HTMLTableElement), columns: BIN_COLS, max: SIZE_ROWS, undo, edited: sizeEdited });
    $("#size-kind").addEventListener("change", switchForm);
    $("#size-basis").addEventListener("change", sizeEdited);
    $("#size-add").addEventListener("click", () => { if (ctx.store.get("project")) grid.add(); });
    $("#size-clear").addEventListener("click", () => grid.clear());
    $("#size-paste-add").addEventListener("click", () => grid.paste(pasteBox("#size-paste")));
  },
  start() {
    const p = ctx.store.get("project");
    if (started || !p || !engine.running()) return;
    started = true;
    loadSize(p);
  },
  load: loadSize,
  update() {
    if (started) sizeEdited();
  },
};
