// @ts-check
// format.js: how the page writes numbers, times and sentences. Pure functions, no state.

/** @import { Project } from "../copoly" */

/** finite reports whether v is a finite number. @param {unknown} v @returns {v is number} */
export const finite = (v) => typeof v === "number" && Number.isFinite(v);

/** fix writes v with d decimals, or "–" when v is not a finite number.
 * @param {number | null | undefined} v @param {number} d */
export const fix = (v, d) => (finite(v) ? v.toFixed(d) : "–");

/** pct writes a fraction as a percentage with one decimal. @param {number | null | undefined} v */
export const pct = (v) => (finite(v) ? (v * 100).toFixed(1) + " %" : "–");

/** sig3 writes v to three significant digits. @param {number | null | undefined} v */
export const sig3 = (v) => (finite(v) ? v.toPrecision(3) : "–");

/** shortNum writes v to at most six significant digits without trailing zeros ("" when not finite).
 * @param {number | null | undefined} v */
export const shortNum = (v) => (finite(v) ? String(Number(v.toPrecision(6))) : "");

/** rat writes a reactivity ratio: three significant digits, whole numbers from 100.
 * @param {number | null | undefined} v */
export const rat = (v) => (finite(v) ? (Math.abs(v) >= 100 ? v.toFixed(0) : v.toPrecision(3)) : "–");

/** se writes a standard error to two significant digits. @param {number | null | undefined} v */
export const se = (v) => (finite(v) ? v.toPrecision(2) : "–");

/** span writes a range of ratios a–b. @param {number} a @param {number} b */
export const span = (a, b) => (Number.isFinite(a) && Number.isFinite(b) ? `${rat(a)}–${rat(b)}` : "–");

/** levelPct writes a confidence level such as 0.95 as "95 %". @param {number} level */
export const levelPct = (level) => `${Number((level * 100).toPrecision(4))} %`;

/** grouped writes a molar mass to 4 significant digits with thin spaces between thousands.
 * @param {number} v */
export const grouped = (v) => {
  const r = Number(v.toPrecision(4));
  return r >= 1000 ? String(Math.round(r)).replace(/\B(?=(\d{3})+(?!\d))/g, "\u202f") : String(r);
};

/** clockTime writes the local time of an RFC 3339 time (now when empty) as hh:mm:ss.
 * @param {string} [iso] */
export const clockTime = (iso) => {
  const d = iso ? new Date(iso) : new Date();
  if (Number.isNaN(d.getTime())) return "";
  return [d.getHours(), d.getMinutes(), d.getSeconds()].map((n) => String(n).padStart(2, "0")).join(":");
};

/** sentence ends s with a full stop unless it ends with one already. @param {string} s */
export const sentence = (s) => (/[.!?]$/.test(s) ? s : s + ".");

/** capital starts a message with a capital letter unless it starts with a symbol such as r1.
 * @param {string} t */
export const capital = (t) => (/^[a-z]{3,}\b/.test(t) ? t[0].toUpperCase() + t.slice(1) : t);

/** slug makes a file name part from a project name. @param {string | undefined} s */
export const slug = (s) => (s || "copoly").toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 40) || "copoly";

/** m1Name and m2Name are the monomers' names, or M1 and M2. @param {Project} p */
export const m1Name = (p) => (p.monomer1.name || "M1");
/** @param {Project} p */
export const m2Name = (p) => (p.monomer2.name || "M2");

/** linspace is n evenly spaced values from a to b, ending exactly at b.
 * @param {number} a @param {number} b @param {number} n @returns {number[]} */
export const linspace = (a, b, n) => Array.from({ length: n }, (_, i) => (i === n - 1 ? b : a + ((b - a) * i) / (n - 1)));
