// @ts-check
// figures.js: the colours of the page's charts, and a chart put into its <figure> with the
// buttons that save it.

import { button } from "./dom.js";
import { saveCSV, savePNG, saveSVG } from "./download.js";
import { showGeneralError } from "./fields.js";
import { slug } from "./format.js";

/** @import { CSVValue } from "./download.js" */

// Colours: M1 a deep teal, M2 a warm sand; far apart in hue and lightness, so they also hold in
// grey print and for the common colour-vision deficiencies.
export const C = {
  m1: "#0f6e68",
  m2: "#e3a72f",
  feed: "#5c6b7a",
  inst: "#0f6e68",
  cum: "#b4441c",
  band: "#e3a72f",
  limit: "#8a2a8e",
  diag: "#9aa5b1",
  azeo: "#b4441c",
};

/**
 * fileBase is the start of the name of a file saved from the project: "my-project-drift".
 * @param {{name?: string} | null} p
 * @param {string} name
 */
export const fileBase = (p, name) => `${slug(p ? p.name : "")}-${name}`;

/** @param {string} id */
function figure(id) {
  const fig = document.getElementById(id);
  if (!fig) throw new Error(`copoly: the page has no figure #${id}`);
  const part = (/** @type {string} */ sel) => {
    const e = fig.querySelector(sel);
    if (!(e instanceof HTMLElement)) throw new Error(`copoly: #${id} has no ${sel}`);
    return e;
  };
  return { fig, area: part(".plot-area"), caption: part("figcaption"), actions: part(".plot-actions") };
}

/**
 * mountFigure puts a chart into the figure with the id, with its buttons: Save SVG, Save PNG
 * and, when csvRows are given, Save data (CSV); base names the files.
 * @param {string} id
 * @param {SVGSVGElement} svg
 * @param {string} base
 * @param {CSVValue[][]} [csvRows]
 */
export function mountFigure(id, svg, base, csvRows) {
  const { area, caption, actions } = figure(id);
  area.replaceChildren(svg);
  caption.hidden = false;
  // Every figure has the same three buttons: their names say which chart they save.
  const chartName = svg.getAttribute("aria-label") || base;
  /** @param {HTMLButtonElement} b */
  const named = (b) => { b.setAttribute("aria-label", `${b.textContent}: ${chartName}`); return b; };
  actions.replaceChildren(
    named(button("Save SVG", () => saveSVG(svg, base + ".svg"))),
    named(button("Save PNG", () => savePNG(svg, base + ".png").catch((e) => showGeneralError(`PNG not saved: ${e.message}`)))),
    ...(csvRows ? [named(button("Save data (CSV)", () => saveCSV(csvRows, base + ".csv")))] : []),
  );
}

/**
 * figNote puts a note in place of a figure's chart.
 * @param {string} id
 * @param {string} text
 */
export function figNote(id, text) {
  const { area, caption, actions } = figure(id);
  const note = document.createElement("p");
  note.className = "hint";
  note.textContent = text;
  area.replaceChildren(note);
  actions.replaceChildren();
  caption.hidden = true;
}

/**
 * figureActions is the buttons box of the figure with the id.
 * @param {string} id
 */
export const figureActions = (id) => figure(id).actions;
