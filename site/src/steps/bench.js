// @ts-check
// Step 5, bench data: the grid of runs as typed (BenchTable in copoly.d.ts, kept in the project
// and saved after every edit), the forms the quantities were measured in, and what each row
// converts to (copoly.benchRuns). A cell that cannot be read is marked in its row and never stops
// the other rows, or the saving, from going on. Rows come from typing, a pasted block or a table
// file; removing rows or adding a block can be undone.

import { $, $as, choice, field, fillList, input, select, setText } from "../dom.js";
import { saveCSV } from "../download.js";
import * as engine from "../engine.js";
import { fileBase } from "../figures.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { fix, sentence, shortNum } from "../format.js";
import { createGrid } from "../grid.js";
import { onFileChosen } from "../importer.js";
import { MAX_ROWS, MIN_FIT_RUNS, TABLE_MAX_BYTES } from "../limits.js";
import { benchCell, benchFieldText, benchRowText, pasteText, projectText } from "../messages.js";
import { parseNumber } from "../numbers.js";
import { LINEAR_LIMIT } from "../thresholds.js";
import { createUndo } from "../undo.js";

/** @import { BenchResult, BenchTable, Project, Run } from "../../copoly" */
/** @import { ArgOf } from "../engine.js" */
/** @import { Grid, GridColumn, GridRow } from "../grid.js" */
/** @import { Ctx, Step } from "../main.js" */
/** @import { Undo } from "../undo.js" */

/** @typedef {BenchTable["rows"][number]} BenchRow */

/** @type {Ctx} */
let ctx;
/** @type {Grid} */
let grid;
/** @type {Undo} */
let undo;
let started = false;         // the grid has been drawn once (after the first results)
/** @type {string[]} */
let columns = [];            // cell keys of the current entry forms, from the last conversion
/** @type {string[] | null} */
let drawn = null;            // cell keys the grid shows
let massKey = "";            // the molar masses the last conversion used

/** @returns {BenchTable} */
const emptyBench = () => ({ feedKind: "fraction", conversionKind: "none", compositionKind: "fraction",
  element: "", carrier: 1, elementCount: 0, rows: [] });

/**
 * theBench is the project's grid: rows as a list, each with its cells (an empty grid when the
 * project has none).
 * @param {Project} p
 * @returns {BenchTable}
 */
function theBench(p) {
  const b = p.bench || emptyBench();
  const rows = Array.isArray(b.rows) ? b.rows : [];
  return { ...b, rows: rows.map((r) => (r.cells ? r : { ...r, cells: {} })) };
}

/** current is the grid of the project in use, and the project. */
function current() {
  const p = ctx.store.get("project");
  return p ? { p, b: theBench(p) } : null;
}

/**
 * columnInfo is the heading and unit of a cell key.
 * @param {string} key @param {BenchTable} b
 * @returns {[string, string]}
 */
function columnInfo(key, b) {
  const el = b.element || "element";
  switch (key) {
    case "f10": return ["f10", "mole fraction of M1"];
    case "mass1": return ["M1", "g charged"];
    case "mass2": return ["M2", "g charged"];
    case "moles1": return ["M1", "mol charged"];
    case "moles2": return ["M2", "mol charged"];
    case "conversion": return b.conversionKind === "mass" ? ["w", "polymer/monomer mass"] : ["X", "molar conversion"];
    case "F1": return ["F1", "mole fraction of M1"];
    case "massFraction1": return ["w1", "mass fraction of M1"];
    case "integral1": return ["I1", "M1 signal integral"];
    case "protons1": return ["H1", "protons per M1 unit"];
    case "integral2": return ["I2", "M2 signal integral"];
    case "protons2": return ["H2", "protons per M2 unit"];
    case "elementPercent": return [`${el} %`, "mass %"];
    case "sF": return ["sF", "optional"];
    case "sX": return ["sX", "optional"];
    case "sf": return ["sf", "optional"];
  }
  return [key, ""];
}

/** @type {Record<string, string>} */
const FORM_HINTS = {
  mass: "Masses charged are converted with the molar masses of step 1.",
  moles: "",
  massConversion: "A gravimetric conversion is turned into a molar one with the molar masses of step 1.",
  massFraction: "A mass fraction is converted with the molar masses of step 1.",
  nmr: "For each monomer give the integral of one signal of its units and the number of protons behind that signal (for example 5 for the aromatic protons of styrene, 3 for an OCH3).",
  element: "Give the element's mass percentage in the copolymer; the molar masses of step 1 convert it.",
};

/** fillBenchForms shows the grid's entry forms in the selects above it. @param {BenchTable} b */
function fillBenchForms(b) {
  select("#bench-feed-kind").value = b.feedKind || "fraction";
  select("#bench-conversion-kind").value = b.conversionKind || "none";
  select("#bench-composition-kind").value = b.compositionKind || "fraction";
  input("#bench-element").value = b.element || "";
  select("#bench-carrier").value = b.carrier === 2 ? "2" : "1";
  input("#bench-element-count").value = b.elementCount > 0 ? shortNum(b.elementCount) : "";
  clearFieldError($("#bench-element-count"));
  $("#bench-element-row").hidden = b.compositionKind !== "element";
  const hints = [];
  if (b.feedKind === "mass") hints.push(FORM_HINTS.mass);
  if (b.conversionKind === "mass") hints.push(FORM_HINTS.massConversion);
  if (FORM_HINTS[b.compositionKind]) hints.push(FORM_HINTS[b.compositionKind]);
  setText("#bench-forms-hint", hints.join(" "));
}

/**
 * drawGrid draws the rows of b with the typed cells of keys.
 * @param {BenchTable} b @param {string[]} keys
 */
function drawGrid(b, keys) {
  /** @type {GridColumn[]} */
  const cols = [{ key: "label", heading: "Sample", unit: "label", label: "sample label", text: true },
    ...keys.map((k) => { const [heading, unit] = columnInfo(k, b); return { key: k, heading, unit, label: [heading, unit].join(", ") }; })];
  grid.show(b.rows.map((r) => ({ ...r.cells, label: r.label || "" })), cols);
  drawn = keys;
  $as("#bench-add-row", HTMLButtonElement).disabled = b.rows.length >= MAX_ROWS;
}

/** loadBench puts the project's grid on screen from scratch (a new project, a paste, an undo). */
function loadBench() {
  const c = current();
  if (!started || !c) return;
  // The project gets its grid as the page shows it (an empty one when it had none), without a save of its own.
  if (!c.p.bench || JSON.stringify(c.p.bench) !== JSON.stringify(c.b)) ctx.setPart("bench", c.b, "quiet");
  fillBenchForms(c.b);
  return refreshBench(true);
}

/**
 * refreshBench converts the grid and shows the outcome; rebuild redraws the grid's inputs too
 * (after a change of rows or of entry forms), otherwise only what they convert to.
 * @param {boolean} rebuild
 */
function refreshBench(rebuild) {
  const c = current();
  if (!c) return;
  const { p, b } = c;
  /** @type {ArgOf<"benchRuns">} */
  const args = { bench: b };
  if (p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0) {
    args.molarMass1 = p.monomer1.molarMass;
    args.molarMass2 = p.monomer2.molarMass;
  }
  massKey = `${args.molarMass1 || 0}/${args.molarMass2 || 0}`;
  // Rows added or removed are drawn at once, with the columns in use; the conversion may bring others.
  if (rebuild) drawGrid(b, drawn || (columns.length ? columns : ["f10", "F1"]));
  return engine.newest("bench", async (job) => {
    const r = await job.call("benchRuns", args);
    const box = $("#bench-error");
    if (engine.isError(r)) {
      box.textContent = `The table cannot be converted: ${sentence(r.error)}`;
      box.hidden = false;
      if (!drawn) drawGrid(b, columns.length ? columns : ["f10", "F1"]);
      showBenchStatus(b, null, 0);
      ctx.store.set("runs", { runs: [], rowOf: [] });
      return;
    }
    box.hidden = true;
    columns = r.columns || [];
    if (!drawn || drawn.join() !== columns.join()) drawGrid(b, columns);
    /** @type {Run[]} */
    const good = [];
    /** @type {number[]} */
    const rowOf = [];
    (r.runs || []).forEach((run, i) => {
      if (run) { good.push(run); rowOf.push(i); }
    });
    applyBenchResult(b, r, good);
    showBenchStatus(b, r, good.length);
    ctx.store.set("runs", { runs: good, rowOf });
  });
}

/**
 * applyBenchResult shows, row by row, the converted values and the row's problem.
 * @param {BenchTable} b @param {BenchResult} r @param {Run[]} good
 */
function applyBenchResult(b, r, good) {
  /** @type {Map<number, string[]>} */
  const warnRows = new Map();
  for (const w of r.warnings || []) {
    if (w.row >= 0) warnRows.set(w.row, (warnRows.get(w.row) || []).concat(w.message));
  }
  b.rows.forEach((row, i) => {
    const run = r.runs ? r.runs[i] : null;
    const err = r.errors ? r.errors[i] : null;
    grid.fill(i, { f10: run ? fix(run.f10, 4) : "", X: run ? ((run.conversion || 0) > 0 ? fix(run.conversion, 4) : "low") : "", F1: run ? fix(run.F1, 4) : "" });
    const w = warnRows.get(i);
    if (err) {
      const at = benchCell(err.field);
      const cell = at ? grid.cell(at.row, at.key) : null;
      const pending = !!cell && cell.value.trim() === "";
      grid.mark(i, {
        kind: pending ? "pending" : "bad",
        text: pending && at ? `Not used yet: fill in ${columnInfo(at.key, b)[0]}.` : benchRowText(err.error, i),
        key: cell && at ? at.key : undefined,
      });
    } else if (w) {
      grid.mark(i, { kind: "warn", text: w.map(sentence).join(" ") });
    } else {
      grid.mark(i, null);
    }
  });
  const items = (r.warnings || []).map((w) => w.message);
  const high = good.filter((run) => (run.conversion || 0) > LINEAR_LIMIT).length;
  if (high) {
    items.push(`${high} of ${good.length} runs are above ${LINEAR_LIMIT * 100} % conversion. The linear methods (Fineman–Ross, Kelen–Tüdős) ignore the drift of the feed and are biased for them; the recommended fit in step 6 takes each run's conversion into account.`);
  }
  fillList($("#bench-warnings"), items);
  $("#bench-warnings-box").hidden = !items.length || !b.rows.length;
}

/** @param {BenchTable} b @param {BenchResult | null} r @param {number} good */
function showBenchStatus(b, r, good) {
  const n = b.rows.length;
  if (!n) return setText("#bench-status", "The table is empty.");
  if (!r) return setText("#bench-status", `${n} row${n === 1 ? "" : "s"}; none converted.`);
  const bad = (r.errors || []).filter(Boolean).length;
  let text = `${n} row${n === 1 ? "" : "s"}: ${good} converted`;
  if (bad) text += `, ${bad} not yet usable (see the marked cells)`;
  text += good >= MIN_FIT_RUNS ? ". These go into the estimate in step 6." : `. The estimate needs at least ${MIN_FIT_RUNS} converted runs.`;
  setText("#bench-status", text);
}

/**
 * benchChanged keeps the grid b in the project (saved) and converts it again.
 * @param {BenchTable} b @param {boolean} rebuild
 */
function benchChanged(b, rebuild) {
  ctx.setPart("bench", b);
  return refreshBench(rebuild);
}

/** @param {number} i @param {string} key @param {string} text */
function onCellInput(i, key, text) {
  const c = current();
  if (!engine.running() || !c) return;
  const row = c.b.rows[i];
  if (!row) return;
  /** @type {BenchRow} */
  const next = { ...row, cells: { ...row.cells } };
  if (key === "label") next.label = text;
  else if (text === "") delete next.cells[key];
  else next.cells[key] = text;
  const rows = c.b.rows.slice();
  rows[i] = next;
  benchChanged({ ...c.b, rows }, false);
}

/**
 * offerUndo offers to bring the grid back as it was before a removal or a paste.
 * @param {BenchTable} before @param {string} text
 */
function offerUndo(before, text) {
  undo.offer(text, () => {
    if (!ctx.store.get("project")) return;
    ctx.setPart("bench", before);
    loadBench();
  });
}

/** @param {number} i */
function deleteRow(i) {
  const c = current();
  if (!c) return;
  const row = c.b.rows[i];
  if (!row) return;
  offerUndo(c.b, `Row ${i + 1}${row.label ? ` (${row.label})` : ""} deleted.`);
  benchChanged({ ...c.b, rows: c.b.rows.filter((_, k) => k !== i) }, true);
}

function clearRows() {
  const c = current();
  if (!c || !c.b.rows.length) return;
  offerUndo(c.b, `All ${c.b.rows.length} rows removed.`);
  benchChanged({ ...c.b, rows: [] }, true);
}

function addRow() {
  const c = current();
  if (!c || c.b.rows.length >= MAX_ROWS) return;
  const rows = [...c.b.rows, { label: "", cells: {} }];
  benchChanged({ ...c.b, rows }, true);
  grid.focus(rows.length - 1, "label");
}

/**
 * addRows adds rows at the end of the grid (as many as it has room for), for step 7's
 * suggestions; it returns the number of rows the grid then has.
 * @param {BenchRow[]} more
 */
export function addRows(more) {
  const c = current();
  if (!c) return 0;
  const rows = [...c.b.rows, ...more.slice(0, Math.max(0, MAX_ROWS - c.b.rows.length))];
  benchChanged({ ...c.b, rows }, true);
  return rows.length;
}

/** feedKind is the grid's form of the feed ("fraction" when not chosen). */
export function feedKind() {
  const c = current();
  return (c && c.b.feedKind) || "fraction";
}

/**
 * labelsOf gives the label of each grid row (0-based) named.
 * @param {number[]} rowOf
 */
export function labelsOf(rowOf) {
  const c = current();
  return rowOf.map((i) => (c && c.b.rows[i] && c.b.rows[i].label) || "");
}

/**
 * setBenchForm changes one entry form of the grid; the cells typed in other forms are kept.
 * @template {"feedKind" | "conversionKind" | "compositionKind" | "carrier"} K
 * @param {K} key @param {BenchTable[K]} value
 */
function setBenchForm(key, value) {
  const c = current();
  if (!c) return;
  const b = { ...c.b, [key]: value };
  fillBenchForms(b);
  benchChanged(b, true);
}

function setElementCount() {
  const box = input("#bench-element-count");
  clearFieldError(box);
  const raw = box.value.trim();
  const v = raw === "" ? 0 : parseNumber(raw);
  if (Number.isNaN(v) || v < 0) {
    setFieldError(box, `atoms per unit = “${raw}”: enter a whole number such as 1 or 2.`);
    return;
  }
  const c = current();
  if (!c) return;
  benchChanged({ ...c.b, elementCount: v }, false);
}

/**
 * addTable reads a pasted block or a file's text into new rows. Nothing changes when any part
 * of it cannot be read, or when the grid would no longer fit in a project.
 * @param {string} text @param {string} where @param {(msg: string) => void} fail
 * @returns {Promise<boolean>} whether rows were added
 */
async function addTable(text, where, fail) {
  const c = current();
  if (!c) return false;
  const before = c.b;
  const r = await engine.call("pasteBench", { bench: before, text });
  if (engine.isError(r)) { fail(`${pasteText(r.error)} Nothing was added.`); return false; }
  const next = r.bench;
  const added = next.rows.length - before.rows.length;
  if (added <= 0) { fail("No rows were found. Nothing was added."); return false; }
  const p = ctx.store.get("project");
  if (!p) return false;
  const checked = await engine.call("checkProject", { project: { ...p, bench: next } });
  if (engine.isError(checked)) {
    fail(`${benchFieldText(checked.field)}${sentence(projectText(checked.error))} Nothing was added.`);
    return false;
  }
  offerUndo(before, `${added} row${added === 1 ? "" : "s"} added from ${where}.`);
  ctx.setPart("bench", next);
  loadBench();
  return true;
}

async function pasteRows() {
  const area = field("#bench-paste");
  clearFieldError(area);
  if (!area.value.trim()) return setFieldError(area, "Paste the cells from your spreadsheet into the box first.");
  if (await addTable(area.value, "the pasted block", (msg) => setFieldError(area, msg))) area.value = "";
}

// exportTable saves the grid as typed, with column names the paste box reads back.
function exportTable() {
  const c = current();
  if (!c) return;
  const rows = [["label", ...columns], ...c.b.rows.map((r) => [r.label || "", ...columns.map((k) => r.cells[k] || "")])];
  saveCSV(rows, `${fileBase(c.p, "bench-data")}.csv`);
}

/** @type {Step} */
export const bench = {
  id: "bench",
  title: "Bench data",
  mount(c) {
    ctx = c;
    grid = createGrid({
      table: $as("#bench-table", HTMLTableElement),
      prefix: "bench",
      columns: [],
      computed: [{ key: "f10", heading: "f10", unit: "feed" }, { key: "X", heading: "X", unit: "molar" }, { key: "F1", heading: "F1", unit: "copolymer" }],
      groups: { typed: "As typed", computed: "Converted" },
      empty: "No runs yet. Add a row, or paste rows from a spreadsheet below.",
      onInput: onCellInput,
      onDelete: deleteRow,
    });
    undo = createUndo({ shown: $("#bench-undo-bar"), text: $("#bench-undo-text"), button: $("#bench-undo") });
    $("#bench-feed-kind").addEventListener("change", () => setBenchForm("feedKind", choice("#bench-feed-kind", ["fraction", "mass", "moles"])));
    $("#bench-conversion-kind").addEventListener("change", () => setBenchForm("conversionKind", choice("#bench-conversion-kind", ["none", "molar", "mass"])));
    $("#bench-composition-kind").addEventListener("change", () => setBenchForm("compositionKind", choice("#bench-composition-kind", ["fraction", "massFraction", "nmr", "element"])));
    $("#bench-element").addEventListener("input", () => {
      const cur = current();
      if (!cur) return;
      benchChanged({ ...cur.b, element: input("#bench-element").value.trim() }, true);
    });
    $("#bench-carrier").addEventListener("change", () => setBenchForm("carrier", Number(select("#bench-carrier").value)));
    $("#bench-element-count").addEventListener("input", setElementCount);
    $("#bench-add-row").addEventListener("click", addRow);
    $("#bench-clear").addEventListener("click", clearRows);
    $("#bench-export").addEventListener("click", exportTable);
    const box = $("#bench-error");
    /** @param {File} file @param {string} msg */
    const fail = (file, msg) => { box.textContent = `${file.name} was not read: ${msg}`; box.hidden = false; };
    onFileChosen(input("#bench-import"), TABLE_MAX_BYTES, {
      start: () => { box.hidden = true; },
      fail: (file, why) => fail(file, why === "too-large"
        ? `it is ${file.size} bytes, more than the ${TABLE_MAX_BYTES} a table may have. Nothing was added.`
        : "the file could not be read. Nothing was added."),
      read: (file, text) => addTable(text, file.name, (msg) => fail(file, msg)),
    });
    $("#bench-paste-add").addEventListener("click", pasteRows);
    $("#bench-paste").addEventListener("input", () => clearFieldError($("#bench-paste")));
  },
  start() {
    if (started || !ctx.store.get("project") || !engine.running()) return;
    started = true;
    loadBench();
  },
  load() {
    undo.drop();
    loadBench();
  },
  update(p) {
    if (!started) return;
    const masses = p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0 ? `${p.monomer1.molarMass}/${p.monomer2.molarMass}` : "0/0";
    if (masses !== massKey) refreshBench(false);
  },
};
