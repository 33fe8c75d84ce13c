// @ts-check
// grid.js: the one editable grid of the page (the bench data of step 5, the triads of step 9,
// the chain-size table of step 10). Each row has its number, a text box per column that keeps
// exactly what is typed, optional read-only columns the owner fills in (the bench's converted
// values), a Delete button, and under it a line for the row's message.
//
// The grid holds the rows as typed (a record of text per column key) and draws them; its owner
// decides what an edit, a deletion or a paste means (conversion, saving, an Undo offer).

import { button } from "./dom.js";
import { CELL_MAX } from "./limits.js";

/** @typedef {Record<string, string>} GridRow  the text of each cell, by column key */

/**
 * @typedef {object} GridColumn
 * @property {string} key
 * @property {string} heading
 * @property {string} [unit]   under the heading
 * @property {string} [label]  the cell's name after "row N, " (default the heading)
 * @property {boolean} [text]  free text (a sample label): no decimal keyboard
 */

/**
 * @typedef {object} GridMark  the message of a row
 * @property {"bad" | "pending" | "warn"} kind  cannot be used, not filled in yet, or usable with a warning
 * @property {string} text
 * @property {string} [key]  the column of the cell at fault
 */

/**
 * @typedef {object} GridOptions
 * @property {HTMLTableElement} table
 * @property {string} prefix  cell ids are prefix-rI-KEY, message ids prefix-msg-I
 * @property {GridColumn[]} columns
 * @property {GridColumn[]} [computed]  read-only columns after the typed ones
 * @property {{typed: string, computed: string}} [groups]  a first header row naming the typed and the computed columns
 * @property {string} empty  what a grid with no rows says
 * @property {(row: number, key: string, text: string) => void} onInput  after the text of a cell changed
 * @property {(row: number) => void} onDelete  the Delete button of a row
 */

/**
 * @typedef {object} Grid
 * @property {() => readonly GridRow[]} rows   the rows as typed (the grid's own: do not change them)
 * @property {(rows: GridRow[], columns?: GridColumn[]) => void} show  replace the rows (and the columns) and draw
 * @property {(row: number, key?: string) => void} focus  put the caret into a cell (default the first column's)
 * @property {(row: number, mark: GridMark | null) => void} mark  show a row's message and mark the cell at fault
 * @property {(row: number, values: Record<string, string>) => void} fill  write the read-only cells of a row
 * @property {(row: number, key: string) => HTMLInputElement | null} cell  the text box of a cell
 */

/**
 * emptyGridRow is the one row of a grid with no rows: text across its width.
 * @param {number} width @param {string} text
 */
function emptyGridRow(width, text) {
  const tr = document.createElement("tr");
  const td = document.createElement("td");
  td.colSpan = width;
  td.className = "empty-grid";
  td.textContent = text;
  tr.append(td);
  return tr;
}

/**
 * th is a column heading with its unit.
 * @param {string} text @param {string} [unit] @param {Partial<HTMLTableCellElement>} [attrs]
 */
function th(text, unit, attrs) {
  const e = document.createElement("th");
  e.scope = "col";
  e.append(text);
  if (unit) {
    const u = document.createElement("span");
    u.className = "col-unit";
    u.textContent = unit;
    e.append(u);
  }
  Object.assign(e, attrs || {});
  return e;
}

/**
 * createGrid makes a grid in o.table; it is empty until show.
 * @param {GridOptions} o
 * @returns {Grid}
 */
export function createGrid(o) {
  /** @type {GridRow[]} */
  let rows = [];
  let columns = o.columns;
  const computed = o.computed || [];
  /** @type {HTMLTableRowElement[]} */
  let trs = [];
  /** @type {HTMLTableCellElement[]} */
  let msgs = [];
  /** @type {HTMLTableRowElement[]} */
  let msgRows = [];
  /** @param {number} i @param {string} key */
  const cellId = (i, key) => `${o.prefix}-r${i}-${key}`;

  function draw() {
    const heads = [];
    if (o.groups) {
      const lead = columns.filter((c) => c.text).length;
      const typed = columns.length - lead;
      const g = document.createElement("tr");
      g.append(th("", "", { colSpan: lead + 1 }), th(o.groups.typed, "", { colSpan: typed, scope: "colgroup", className: "group-typed" }),
        th(o.groups.computed, "", { colSpan: computed.length, scope: "colgroup", className: "group-conv" }), th(""));
      heads.push(g);
    }
    const head = document.createElement("tr");
    head.append(th("Row"), ...columns.map((c) => th(c.heading, c.unit)), ...computed.map((c) => th(c.heading, c.unit, { className: "conv" })), th(""));
    heads.push(head);
    const thead = o.table.tHead || o.table.createTHead();
    thead.replaceChildren(...heads);

    const body = document.createElement("tbody");
    const width = columns.length + computed.length + 2;
    if (!rows.length) body.append(emptyGridRow(width, o.empty));
    trs = [];
    msgs = [];
    msgRows = [];
    rows.forEach((row, i) => {
      const tr = document.createElement("tr");
      tr.dataset.row = String(i);
      const num = document.createElement("th");
      num.scope = "row";
      num.className = "row-num";
      num.textContent = String(i + 1);
      tr.append(num);
      for (const c of columns) {
        const td = document.createElement("td");
        const input = document.createElement("input");
        Object.assign(input, { type: "text", id: cellId(i, c.key), value: row[c.key] || "", maxLength: CELL_MAX,
          autocomplete: "off", spellcheck: false, className: c.text ? "cell label-cell" : "cell" });
        if (!c.text) input.inputMode = "decimal";
        input.dataset.row = String(i);
        input.dataset.key = c.key;
        input.setAttribute("aria-label", `row ${i + 1}, ${c.label || c.heading}`);
        input.addEventListener("input", () => {
          row[c.key] = input.value;
          o.onInput(i, c.key, input.value);
        });
        td.append(input);
        tr.append(td);
      }
      for (const c of computed) {
        const td = document.createElement("td");
        td.className = "conv";
        td.dataset.conv = c.key;
        tr.append(td);
      }
      const act = document.createElement("td");
      const del = button("Delete", () => o.onDelete(i));
      del.className = "row-delete";
      del.setAttribute("aria-label", `Delete row ${i + 1}`);
      act.append(del);
      tr.append(act);
      const msgRow = document.createElement("tr");
      msgRow.className = "row-msg";
      msgRow.hidden = true;
      const msg = document.createElement("td");
      msg.colSpan = width;
      msg.id = `${o.prefix}-msg-${i}`;
      msgRow.append(msg);
      body.append(tr, msgRow);
      trs.push(tr);
      msgs.push(msg);
      msgRows.push(msgRow);
    });
    const old = o.table.tBodies[0];
    if (old) old.replaceWith(body); else o.table.append(body);
  }

  /** @param {number} i @param {string} key */
  const cell = (i, key) => {
    const e = document.getElementById(cellId(i, key));
    return e instanceof HTMLInputElement ? e : null;
  };

  return {
    rows: () => rows,
    show(next, cols) {
      rows = next;
      if (cols) columns = cols;
      draw();
    },
    focus(i, key) {
      const c = cell(i, key || columns[0].key);
      if (c) c.focus();
    },
    cell,
    mark(i, m) {
      const tr = trs[i], msg = msgs[i], msgRow = msgRows[i];
      if (!tr || !msg || !msgRow) return;
      tr.querySelectorAll("input").forEach((inp) => { inp.removeAttribute("aria-invalid"); inp.removeAttribute("aria-describedby"); });
      tr.classList.remove("row-bad", "row-warn", "row-pending");
      if (m) tr.classList.add("row-" + m.kind);
      msgRow.className = m ? "row-msg " + m.kind : "row-msg";
      msg.textContent = m ? m.text : "";
      msgRow.hidden = !(m && m.text);
      const input = m && m.key ? cell(i, m.key) : null;
      if (input) {
        input.setAttribute("aria-invalid", "true");
        input.setAttribute("aria-describedby", msg.id);
      }
    },
    fill(i, values) {
      const tr = trs[i];
      if (!tr) return;
      tr.querySelectorAll("td.conv").forEach((td) => {
        if (td instanceof HTMLElement) td.textContent = values[td.dataset.conv || ""] ?? "";
      });
    },
  };
}
