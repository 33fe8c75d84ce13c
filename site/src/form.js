// @ts-check
// form.js: the project's form, the inputs of steps 1 to 4 that make up a project (names, molar
// masses, r1 and r2 with their source, notes; the starting feed, final conversion and tolerance
// of step 3; the model of step 4). readForm turns what is typed into a project or the problems
// to mark; fillForm writes a project back. The steps draw from the project; only this module
// reads or writes these inputs.

import { $, field, select } from "./dom.js";
import { clearFieldError } from "./fields.js";
import { shortNum } from "./format.js";
import { fieldKey } from "./messages.js";
import { MODEL_RATIOS, isModelKind } from "./model.js";
import { parseNumber } from "./numbers.js";

/** @import { Project } from "../copoly" */
/** @import { Problem } from "./fields.js" */
/** @import { ModelRatio } from "./model.js" */

/** The inputs that make up the project; each recomputes on "input". */
export const PROJECT_INPUTS = ["#project-name", "#name1", "#name2", "#mass1", "#mass2", "#r1", "#r2",
  "#ratio-source", "#notes", "#f10", "#conversion", "#tolerance", ...MODEL_RATIOS.map(([k]) => "#m-" + k)];

/** The inputs whose text is kept as this tab's draft (see storage.js). */
export const DRAFT_INPUTS = [...PROJECT_INPUTS, "#model-kind"];

/** @type {Record<string, string>} FIELD_INPUT maps the API's field names (see fieldKey) to inputs. */
const FIELD_INPUT = {
  "name": "#project-name",
  "monomer1.name": "#name1", "monomer1.molarMass": "#mass1", "molarMass1": "#mass1", "monomer1": "#name1",
  "monomer2.name": "#name2", "monomer2.molarMass": "#mass2", "molarMass2": "#mass2", "monomer2": "#name2",
  "r1": "#r1", "r2": "#r2", "ratioSource": "#ratio-source", "notes": "#notes",
  "f10": "#f10", "f1": "#f10", "conversion": "#conversion", "tolerance": "#tolerance",
  "targetF1": "#target-F1", "model": "#model-kind", "model.kind": "#model-kind",
};
for (const [k] of MODEL_RATIOS) FIELD_INPUT[k] = FIELD_INPUT["model." + k] = "#m-" + k;

/**
 * inputForField is the input of the form an API field name is about, or null.
 * @param {string | undefined} field
 * @returns {HTMLElement | null}
 */
export function inputForField(field) {
  if (!field) return null;
  const sel = FIELD_INPUT[fieldKey(field)];
  return sel ? $(sel) : null;
}

/** @type {Record<string, string>} the words for a number input in a message */
const LABELS = {
  "#mass1": "molar mass of M1", "#mass2": "molar mass of M2", "#r1": "r1", "#r2": "r2",
  "#f10": "starting feed f1", "#conversion": "final conversion", "#tolerance": "tolerance",
};
for (const [k] of MODEL_RATIOS) LABELS["#m-" + k] = k;

/** clearErrors takes the messages beside the project's inputs away. */
export function clearErrors() {
  for (const sel of PROJECT_INPUTS) clearFieldError($(sel));
}

/**
 * readForm returns {project} or {errors} from what is typed now. base is the project in use,
 * whose other parts (bench data, plan…) the new project keeps; formJcr the region of the ratios
 * in the form, when they came from a fit.
 * @param {Project | null} base
 * @param {[number, number][] | null} formJcr
 * @returns {{project: Project, errors?: undefined} | {errors: Problem[], project?: undefined}}
 */
export function readForm(base, formJcr) {
  /** @type {Problem[]} */
  const errors = [];
  /** @param {string} sel @param {boolean} [blankIsZero] */
  const num = (sel, blankIsZero) => {
    const input = field(sel);
    const raw = input.value;
    if (raw.trim() === "") {
      if (blankIsZero) return 0;
      errors.push({ input, message: `Enter a value for ${LABELS[sel]}.` });
      return NaN;
    }
    const v = parseNumber(raw);
    if (Number.isNaN(v)) errors.push({ input, message: `${LABELS[sel]} = “${raw.trim()}” is not a number.` });
    return v;
  };
  /** @param {string} sel */
  const text = (sel) => field(sel).value.trim();
  /** @type {Project} */
  const project = {
    ...(base || {}),
    format: "copoly-project",
    version: 1,
    name: text("#project-name"),
    monomer1: { name: text("#name1"), molarMass: num("#mass1", true) },
    monomer2: { name: text("#name2"), molarMass: num("#mass2", true) },
    r1: num("#r1"),
    r2: num("#r2"),
    ratioSource: text("#ratio-source"),
    f10: num("#f10"),
    conversion: num("#conversion"),
    tolerance: num("#tolerance"),
    notes: field("#notes").value,
  };
  delete project.savedAt;
  // The model: the chosen kind's ratios must read; another kind's are kept when they read, or
  // as saved when their box holds text that does not.
  const kind = select("#model-kind").value;
  /** @type {NonNullable<Project["model"]>} */
  const model = { kind: isModelKind(kind) ? kind : "terminal" };
  for (const [k, kk] of MODEL_RATIOS) {
    const sel = "#m-" + k, raw = text(sel), v = parseNumber(raw);
    if (kk === kind) model[k] = num(sel);
    else if (!Number.isNaN(v)) model[k] = v;
    else if (raw && base && base.model && base.model[k] !== undefined) model[k] = base.model[k];
  }
  project.model = model;
  // The stored region belongs to the ratios it was fitted with; typed ratios have none.
  if (formJcr && formJcr.length) project.jcr = formJcr;
  else delete project.jcr;
  return errors.length ? { errors } : { project };
}

/**
 * showModelFields shows the ratio boxes of the chosen model; with prefill, a penultimate model
 * chosen with empty boxes starts from the terminal ratios, which it then reproduces.
 * @param {boolean} [prefill]
 */
export function showModelFields(prefill) {
  const kind = select("#model-kind").value;
  document.querySelectorAll(".model-box [data-kind]").forEach((f) => {
    if (f instanceof HTMLElement) f.hidden = f.dataset.kind !== kind;
  });
  /** @type {Record<string, string>} */
  const start = { r11: "#r1", r21: "#r1", r22: "#r2", r12: "#r2" };
  for (const [k, kk] of MODEL_RATIOS) {
    const input = field("#m-" + k);
    if (prefill && kk === kind && !input.value.trim()) input.value = kk === "implicit" ? "1" : field(start[k]).value.trim();
  }
}

/**
 * fillForm writes project p into the form and takes every message beside it away.
 * @param {Project} p
 */
export function fillForm(p) {
  field("#project-name").value = p.name || "";
  field("#name1").value = p.monomer1.name || "";
  field("#name2").value = p.monomer2.name || "";
  field("#mass1").value = p.monomer1.molarMass > 0 ? shortNum(p.monomer1.molarMass) : "";
  field("#mass2").value = p.monomer2.molarMass > 0 ? shortNum(p.monomer2.molarMass) : "";
  field("#r1").value = shortNum(p.r1);
  field("#r2").value = shortNum(p.r2);
  field("#ratio-source").value = p.ratioSource || "";
  field("#notes").value = p.notes || "";
  field("#f10").value = shortNum(p.f10);
  field("#conversion").value = shortNum(p.conversion);
  field("#tolerance").value = shortNum(p.tolerance);
  const m = p.model || { kind: "terminal" };
  select("#model-kind").value = isModelKind(m.kind) ? m.kind : "terminal";
  for (const [k] of MODEL_RATIOS) field("#m-" + k).value = Number.isFinite(m[k]) ? shortNum(m[k]) : "";
  showModelFields();
  clearFieldError($("#model-kind"));
  clearErrors();
}

/**
 * setRatios writes r1, r2 and their source into step 1 (a fit's result).
 * @param {string} r1 @param {string} r2 @param {string} source
 */
export function setRatios(r1, r2, source) {
  field("#r1").value = r1;
  field("#r2").value = r2;
  field("#ratio-source").value = source;
}

/**
 * setModel chooses a model in step 4 and writes its ratios.
 * @param {"penultimate" | "implicit"} kind
 * @param {Partial<Record<ModelRatio, string>>} values
 */
export function setModel(kind, values) {
  select("#model-kind").value = kind;
  for (const [k, v] of Object.entries(values)) field("#m-" + k).value = v;
  showModelFields();
}

/**
 * setPair writes a literature pair into step 1: names, molar masses (blank when not known),
 * ratios and source.
 * @param {{name1: string, name2: string, mass1: string, mass2: string, r1: string, r2: string, source: string}} v
 */
export function setPair(v) {
  field("#name1").value = v.name1;
  field("#name2").value = v.name2;
  field("#mass1").value = v.mass1;
  field("#mass2").value = v.mass2;
  setRatios(v.r1, v.r2, v.source);
}

/**
 * setMonomer writes the name and molar mass of monomer which (1 or 2).
 * @param {1 | 2} which @param {string} name @param {string} mass
 */
export function setMonomer(which, name, mass) {
  field(`#name${which}`).value = name;
  field(`#mass${which}`).value = mass;
}

/**
 * formText is the text of every draft input, by id; restoreText writes such texts back and
 * reports which inputs changed.
 * @returns {Record<string, string>}
 */
export function formText() {
  /** @type {Record<string, string>} */
  const fields = {};
  for (const sel of DRAFT_INPUTS) fields[sel.slice(1)] = field(sel).value;
  return fields;
}

/**
 * restoreText writes the texts of a draft into the form (a model name it does not know is left
 * out) and returns the ids of the inputs whose text changed.
 * @param {Record<string, unknown>} texts
 * @returns {string[]}
 */
export function restoreText(texts) {
  const changed = [];
  for (const sel of DRAFT_INPUTS) {
    const text = texts[sel.slice(1)];
    const input = field(sel);
    if (typeof text !== "string" || input.value === text) continue;
    if (sel === "#model-kind" && !isModelKind(text)) continue;
    input.value = text;
    changed.push(sel.slice(1));
  }
  if (changed.length) showModelFields();
  return changed;
}
