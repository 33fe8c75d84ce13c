// @ts-check
// messages.js: every place where the page rewrites a message or a field name of the module
// (a CopolyError's `error` and `field`) into the words of the page. They read the text of today's
// messages with regular expressions; a later change builds the words from the error's `code`,
// `reason`, `value` and `row` instead, and only this file changes.

import { capital, sentence } from "./format.js";

/**
 * fieldText drops a leading "project." or "model." from a message shown beside its field: the
 * box the message sits beside names the field.
 * @param {string} message
 */
export const fieldText = (message) => message.replace(/^project\./, "").replace(/^model\./, "");

/**
 * fieldKey is the key of an API field name in the page's map of project inputs, without
 * "project." and any "[i]": "project.monomer1.molarMass" → "monomer1.molarMass", "f1[3]" → "f1".
 * @param {string} field
 */
export const fieldKey = (field) => String(field).replace(/^project\./, "").replace(/\[\d+\]/g, "");

/** projectText drops a leading "project." from a message of the project check. @param {string} message */
export const projectText = (message) => message.replace(/^project\./, "");

/**
 * storageReason is a storage error without its "storage: " prefix; short is the same without the
 * technical detail in brackets at its end.
 * @param {string} error
 */
export function storageReason(error) {
  const reason = String(error).replace(/^storage: /, "");
  return { reason, short: reason.replace(/ \(.*$/s, "") };
}

/**
 * benchCell names the row and cell key of a bench conversion field such as "runs[3].f10".
 * @param {string | undefined} field
 * @returns {{row: number, key: string} | null}
 */
export function benchCell(field) {
  const m = /^runs\[(\d+)\]\.([A-Za-z0-9]+)$/.exec(field || "");
  return m ? { row: Number(m[1]), key: m[2] } : null;
}

/**
 * benchRowText is a message of the bench conversion about row i (0-based) in the page's words:
 * without the field name, and naming the row unless it does so already.
 * @param {string} error
 * @param {number} i
 */
export function benchRowText(error, i) {
  const said = error.replace(/^runs\[\d+\]\.?/, "").replace(/^:\s*/, "");
  return sentence(/\brow \d+/i.test(said) ? said : `Row ${i + 1}: ${said}`);
}

/**
 * benchFieldText turns a project field such as "project.bench.rows[3].cells.f10" into words
 * ("row 4, f10: "), or "" for a field elsewhere.
 * @param {string | undefined} field
 */
export function benchFieldText(field) {
  const m = /bench\.rows\[(\d+)\](?:\.cells\.([A-Za-z0-9]+)|\.(label))?/.exec(field || "");
  if (!m) return "";
  return `row ${Number(m[1]) + 1}${m[2] || m[3] ? ", " + (m[3] ? "label" : m[2]) : ""}: `;
}

/** pasteText is a message of the table reader without its "paste:" or "table:" prefix, as a sentence.
 * @param {string} error */
export const pasteText = (error) => capital(sentence(error.replace(/^(paste|table):\s*/, "")));

/**
 * runRows maps "row N" in a message about the fitted runs (N counting those runs from 1) to the
 * row of the grid.
 * @param {string} text
 * @param {number[]} rowOf the grid row (0-based) of each run
 */
export function runRows(text, rowOf) {
  return String(text).replace(/\brow (\d+)/g, (all, n) => {
    const i = Number(n) - 1;
    return i >= 0 && i < rowOf.length ? `row ${rowOf[i] + 1}` : all;
  });
}

/** fitText is a message of the fit in the grid's row numbers, without a leading field name.
 * @param {string} text @param {number[]} rowOf */
export const fitText = (text, rowOf) => runRows(String(text).replace(/^runs:\s*/, ""), rowOf);

/** runsText is a message about a list of runs without its "runs:" prefix. @param {string} error */
export const runsText = (error) => error.replace(/^runs:\s*/, "");

/**
 * ownMonomerError places an error of the project check about the user's monomers: the index of
 * the monomer and the key of the field it names, and the message with the field name replaced
 * by label (the box's words).
 * @param {{error: string, field?: string}} err
 * @param {(key: string) => string | undefined} labelOf
 * @returns {{index?: number, key?: string, text: string}}
 */
export function ownMonomerError(err, labelOf) {
  const f = /^project\.userMonomers(?:\[(\d+)\])?(?:\.(\w+))?/.exec(err.field || "");
  const key = f && f[2] ? f[2] : undefined;
  const label = key ? labelOf(key) : undefined;
  const text = err.error.replace(/^project\.userMonomers\[\d+\]\.\w+(\[\d+\])?/, label || "value").replace(/^project\./, "");
  return { index: f && f[1] !== undefined ? Number(f[1]) : undefined, key, text };
}

/** planKey is the argument of copoly.plan a field names ("timeTable[3][1]" → "timeTable").
 * @param {string | undefined} field */
export const planKey = (field) => String(field || "").replace(/\[.*$/, "");

/**
 * planText puts the panel's words in place of the API's field name at the start of a message of
 * copoly.plan; labelOf gives a box's label for an argument.
 * @param {string} text
 * @param {(key: string) => string | undefined} labelOf
 */
export function planText(text, labelOf) {
  return capital(String(text)
    .replace(/^timeTable\[(\d+)\] = [^:]*:/, (a, i) => `row ${Number(i) + 1} of the table:`)
    .replace(/^timeTable\[(\d+)\]\[0\]/, (a, i) => `time in row ${Number(i) + 1} of the table`)
    .replace(/^timeTable\[(\d+)\]\[1\]/, (a, i) => `conversion in row ${Number(i) + 1} of the table`)
    .replace(/^timeTable\[(\d+)\]/, (a, i) => `row ${Number(i) + 1} of the table`)
    .replace(/^timeTable/, "the table")
    .replace(/^([A-Za-z0-9]+)(?= =|:)/, (a, k) => labelOf(k) || a));
}

/** planSavedKey is the key of project.plan a project-check field names, or undefined.
 * @param {string | undefined} field */
export const planSavedKey = (field) => (/^project\.plan\.([A-Za-z0-9]+)/.exec(field || "") || [])[1];

/** planNote writes "M1"/"M2" for "monomer1"/"monomer2" at the start of a note of the plan.
 * @param {string} t */
export const planNote = (t) => t.replace(/^monomer([12]) /, "M$1 ");

/**
 * gridRowError reads an error about "…[j].key" of a list the page sent (triads, size classes):
 * j, the key, and the message with the field replaced by the key alone; null when it names no row.
 * @param {{error: string, field?: string}} err
 * @returns {{j: number, key: string, text: string} | null}
 */
export function gridRowError(err) {
  const m = /\[(\d+)\]\.(\w+)/.exec(err.field || "");
  if (!m) return null;
  return { j: Number(m[1]), key: m[2], text: sentence(err.error.replace(/^[\w.]*\[\d+\]\.\w+\s*/, m[2] + " ")) };
}

/** chainsText is a message of the chain simulation in the panel's words. @param {string} error */
export const chainsText = (error) => capital(sentence(error.replace(/^dpn\b/, "DPn").replace(/^count\b/, "number of chains")));

/** starvedText is a message of copoly.starvedFeed in the panel's words. @param {string} error */
export const starvedText = (error) => capital(String(error).replace(/^feedRate/, "feed rate").replace(/^rateConstant/, "rate constant"));
