// @ts-check
// model.js: the copolymerization model of a project (step 4), as the page names it and as it
// passes it to the module (ModelArgs of copoly.d.ts).

import { shortNum } from "./format.js";

/** @import { ModelArgs, Project } from "../copoly" */

/** @typedef {"terminal" | "penultimate" | "implicit"} ModelKind */
/** @typedef {"r11" | "r21" | "r22" | "r12" | "s1" | "s2"} ModelRatio */

/** @type {[ModelRatio, ModelKind][]} the ratios of the models beyond the terminal, each with its model */
export const MODEL_RATIOS = [["r11", "penultimate"], ["r21", "penultimate"], ["r22", "penultimate"], ["r12", "penultimate"], ["s1", "implicit"], ["s2", "implicit"]];

/** @type {Record<ModelKind, string>} */
export const MODEL_NAME = { terminal: "terminal model", penultimate: "explicit penultimate model", implicit: "implicit penultimate model" };

/** What the page shows where a result exists for the terminal model only. */
export const TERMINAL_ONLY = "terminal model only";

/**
 * isModelKind reports whether s names a model.
 * @param {unknown} s
 * @returns {s is ModelKind}
 */
export const isModelKind = (s) => s === "terminal" || s === "penultimate" || s === "implicit";

/**
 * modelKind is the project's model, terminal unless it names another.
 * @param {Project} p
 * @returns {ModelKind}
 */
export const modelKind = (p) => (p.model && isModelKind(p.model.kind) ? p.model.kind : "terminal");

/**
 * modelArgs is the ModelArgs for the project's model; the terminal model passes r1 and r2 alone,
 * as before there were other models.
 * @param {Project} p
 * @returns {ModelArgs}
 */
export function modelArgs(p) {
  const m = p.model || { kind: "terminal" }, kind = modelKind(p);
  // The project check (readForm, checkProject) makes sure the chosen model's ratios are there.
  /** @param {ModelRatio} k */
  const ratio = (k) => /** @type {number} */ (m[k]);
  if (kind === "penultimate") return { model: kind, r11: ratio("r11"), r21: ratio("r21"), r22: ratio("r22"), r12: ratio("r12") };
  if (kind === "implicit") return { model: kind, r1: p.r1, r2: p.r2, s1: ratio("s1"), s2: ratio("s2") };
  return { r1: p.r1, r2: p.r2 };
}

/**
 * modelRatios lists the ratios of the project's model beyond r1 and r2 (none for the terminal),
 * as modelArgs passes them.
 * @param {Project} p
 * @returns {[ModelRatio, number | undefined][]}
 */
export function modelRatios(p) {
  const kind = modelKind(p), m = p.model || { kind: "terminal" };
  return MODEL_RATIOS.filter((r) => r[1] === kind).map(([k]) => [k, m[k]]);
}

/**
 * modelNote says, beside a result of steps 2 and 3, which model other than the terminal it comes
 * from, with its ratios; "" for the terminal model.
 * @param {Project} p
 */
export function modelNote(p) {
  const kind = modelKind(p);
  if (kind === "terminal") return "";
  const list = modelRatios(p).map(([k, v]) => `${k} = ${shortNum(v)}`).join(", ");
  return `With the ${MODEL_NAME[kind]} of step 4: ${list}${kind === "implicit" ? `, r1 = ${shortNum(p.r1)}, r2 = ${shortNum(p.r2)}` : ""}.`;
}
