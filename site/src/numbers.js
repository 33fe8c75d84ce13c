// @ts-check
// numbers.js: the page's copy of the reading of numbers as typed, and of pasted rows of them.
//
// The module reads numbers the same way (copoly.ParseNumber in Go); a later change asks it
// (copoly.parseNumber) instead, and only this file changes. Until then the two must agree: a
// decimal point, or a single comma as the decimal mark; an exponent; "35 %" for 0.35 where a
// percentage is allowed.

/**
 * parseNumber reads a decimal number as typed; a single comma is taken as the decimal mark. It
 * returns NaN for anything else (blank included).
 * @param {string} text
 * @returns {number}
 */
export function parseNumber(text) {
  let s = text.trim();
  if (/^[+-]?\d*,\d+$/.test(s)) s = s.replace(",", ".");
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return NaN;
  return Number(s);
}

/**
 * numberOrPercent reads a cell: a number with a decimal comma or point, or a percentage.
 * @param {string} text
 * @returns {number}
 */
export function numberOrPercent(text) {
  const m = /^(.*?)\s*%$/.exec(text);
  return m ? parseNumber(m[1]) / 100 : parseNumber(text);
}

/**
 * splitCells splits a pasted line at tabs or semicolons, else at spaces, else at commas.
 * @param {string} line
 * @returns {string[]}
 */
export function splitCells(line) {
  let cells = line.split(/\t|;/);
  if (cells.length < 2) cells = line.trim().split(/\s+/);
  if (cells.length < 2) cells = line.split(",");
  return cells.map((c) => c.trim());
}

/**
 * parseTimeTable reads two pasted columns, time in min and conversion (a fraction or "35 %"), a
 * header line allowed.
 * @param {string} text
 * @returns {{rows: [number, number][], error?: undefined} | {error: string, rows?: undefined}}
 */
export function parseTimeTable(text) {
  /** @type {[number, number][]} */
  const rows = [];
  const lines = text.split(/\r\n|\r|\n/);
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (!line) continue;
    const cells = splitCells(line).filter(Boolean);
    const v = cells.map(numberOrPercent);
    if (!rows.length && v.some(Number.isNaN)) continue; // a header line
    if (cells.length !== 2) return { error: `line ${i + 1}: give two columns, time in min and conversion; found ${cells.length}.` };
    const k = v.findIndex(Number.isNaN);
    if (k >= 0) return { error: `line ${i + 1}: “${cells[k]}” is not a number.` };
    rows.push([v[0], v[1]]);
  }
  if (rows.length < 2) return { error: "give at least two rows of time and conversion." };
  return { rows };
}
