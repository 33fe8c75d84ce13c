// @ts-check
// A grid of numbers kept as typed (the triads of step 9, the chain-size table of step 10): the
// grid of grid.js with its Add, Remove all (with "Bring them back"), Delete and paste, the
// reading of its cells as numbers, and the saving of what reads into the project.

import { field } from "../dom.js";
import * as engine from "../engine.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { capital, sentence } from "../format.js";
import { createGrid } from "../grid.js";
import { gridRowError } from "../messages.js";
import { numberOrPercent, splitCells } from "../numbers.js";

/** @import { CopolyError, Project } from "../../copoly" */
/** @import { GridColumn, GridRow } from "../grid.js" */
/** @import { Ctx } from "../main.js" */
/** @import { Undo } from "../undo.js" */

/**
 * @typedef {object} GridMessage  why a row cannot be used
 * @property {string} text
 * @property {string} key      the column at fault
 * @property {boolean} [pending]  a cell not filled in yet (not an error)
 */

/**
 * @typedef {object} GridRead  the numbers of a grid
 * @property {Record<string, number>[]} rows  the rows that read, a blank cell absent
 * @property {number[]} at                    the grid row of each
 * @property {(GridMessage | undefined)[]} msgs  by grid row: the message of a row that cannot be used
 */

/**
 * @typedef {object} NumberGrid
 * @property {() => GridRow[]} rows
 * @property {(rows: GridRow[], columns?: GridColumn[]) => void} show  replace the rows (and columns) and draw
 * @property {() => void} add      add an empty row and put the caret in it
 * @property {() => void} clear    remove every row, offering to bring them back
 * @property {(area: HTMLTextAreaElement | HTMLInputElement, headerKey?: (heading: string) => string | undefined) => void} paste
 *   add the rows of a pasted block: columns in the grid's order, or named by a header line (headerKey maps a heading to a key)
 * @property {(need: string[]) => GridRead} read  read the numbers; need lists the cells a row must have
 * @property {(read: GridRead, err: CopolyError, keyOf?: (key: string) => string) => boolean} rowError
 *   put an error of the module about "…[j].key" beside grid row read.at[j]; false when it names no row
 * @property {(msgs: (GridMessage | undefined)[]) => void} marks  show each row's message and mark the cell at fault
 */

/**
 * createNumberGrid makes the grid of table.
 * @param {{table: HTMLTableElement, columns: GridColumn[], max: number, undo: Undo, edited: () => void}} o
 * @returns {NumberGrid}
 */
export function createNumberGrid(o) {
  let columns = o.columns;
  /** @type {GridRow[]} */
  let rows = [];
  const grid = createGrid({
    table: o.table,
    prefix: o.table.id,
    columns,
    empty: "No rows yet. Add a row, or paste rows from a spreadsheet below.",
    onInput: () => o.edited(),
    onDelete: (i) => remove(i),
  });
  /** @param {GridRow[]} next */
  const show = (next) => { rows = next; grid.show(rows, columns); };

  // remove deletes row i, or every row (i < 0), offering to bring them back.
  /** @param {number} i */
  function remove(i) {
    if (!rows.length) return;
    const before = rows.map((r) => ({ ...r }));
    const cols = columns;
    show(i < 0 ? [] : rows.filter((_, k) => k !== i));
    // Brought back only into the same form of the table (another may be shown by then).
    o.undo.offer("", () => {
      if (columns !== cols) return;
      show(before);
      o.edited();
    });
    o.edited();
  }

  return {
    rows: () => rows,
    show(next, cols) {
      if (cols) columns = cols;
      show(next);
    },
    add() {
      if (rows.length >= o.max) return;
      show([...rows, {}]);
      o.edited();
      grid.focus(rows.length - 1);
    },
    clear: () => remove(-1),
    paste(area, headerKey) {
      clearFieldError(area);
      /** @param {string} msg */
      const fail = (msg) => setFieldError(area, capital(sentence(msg)) + " Nothing was added.");
      if (!area.value.trim()) return setFieldError(area, "Paste the cells from your spreadsheet into the box first.");
      /** @type {(string | undefined)[]} */
      let order = columns.map((c) => c.key);
      /** @type {GridRow[]} */
      const added = [];
      const lines = area.value.split(/\r\n|\r|\n/);
      for (let n = 0; n < lines.length; n++) {
        if (!lines[n].trim()) continue;
        const cells = splitCells(lines[n]).map((c) => (/^[-–]$/.test(c) ? "" : c));
        if (!added.length && cells.every((c) => !c || Number.isNaN(numberOrPercent(c)))) {
          const named = cells.map((c) => (headerKey ? headerKey(c) : undefined));
          if (named.some(Boolean)) order = named;
          continue;
        }
        // Columns a header does not name are left out.
        const bad = cells.findIndex((c, k) => order[k] && c && Number.isNaN(numberOrPercent(c)));
        if (bad >= 0) return fail(`line ${n + 1}: “${cells[bad]}” is not a number`);
        if (cells.length > order.length && cells.slice(order.length).some(Boolean)) return fail(`line ${n + 1} has ${cells.length} columns; the table takes ${order.length}`);
        /** @type {GridRow} */
        const row = {};
        cells.forEach((c, k) => { const key = order[k]; if (key && c) row[key] = c; });
        added.push(row);
      }
      if (!added.length) return fail("no rows of numbers were found");
      if (rows.length + added.length > o.max) return fail(`the table holds at most ${o.max} rows`);
      area.value = "";
      show([...rows, ...added]);
      o.edited();
    },
    read(need) {
      /** @type {GridRead} */
      const out = { rows: [], at: [], msgs: [] };
      rows.forEach((row, i) => {
        if (columns.every(({ key }) => !(row[key] || "").trim())) return;
        /** @type {Record<string, number>} */
        const v = {};
        for (const { key, heading } of columns) {
          const raw = (row[key] || "").trim();
          const x = numberOrPercent(raw);
          if (raw === "") {
            if (need.includes(key) && !out.msgs[i]) out.msgs[i] = { text: `Not used yet: fill in ${heading}.`, key, pending: true };
          } else if (Number.isNaN(x)) {
            out.msgs[i] = { text: `Row ${i + 1}: ${heading} = “${raw}” is not a number.`, key };
            break;
          } else v[key] = x;
        }
        if (!out.msgs[i]) { out.rows.push(v); out.at.push(i); }
      });
      return out;
    },
    rowError(read, err, keyOf) {
      const e = gridRowError(err);
      const i = e ? read.at[e.j] : undefined;
      if (!e || i === undefined) return false;
      read.msgs[i] = { text: `Row ${i + 1}: ${e.text}`, key: keyOf ? keyOf(e.key) : e.key };
      return true;
    },
    marks(msgs) {
      rows.forEach((_, i) => {
        const m = msgs[i];
        grid.mark(i, m ? { kind: m.pending ? "pending" : "bad", text: m.text, key: m.key } : null);
      });
    },
  };
}

/**
 * saveList stores list as the project's key (triads, sizeBins) after the project check; it
 * returns the check's error, or null.
 * @template {"triads" | "sizeBins"} K
 * @param {Ctx} ctx @param {K} key @param {NonNullable<Project[K]>} list
 * @returns {Promise<CopolyError | null>}
 */
export async function saveList(ctx, key, list) {
  const p = ctx.store.get("project");
  if (!p || JSON.stringify(list) === JSON.stringify(p[key] || [])) return null;
  const next = { ...p, [key]: list };
  if (!list.length) delete next[key];
  const checked = await engine.call("checkProject", { project: next });
  if (engine.isError(checked)) return checked;
  ctx.setPart(key, list.length ? checked.project[key] : undefined);
  return null;
}

/** @param {string} sel the paste box of a grid */
export const pasteBox = (sel) => {
  const e = field(sel);
  if (e instanceof HTMLSelectElement) throw new Error(`copoly: ${sel} is not a text box`);
  return e;
};
