// @ts-check
// Step 8's monomer data: the data of the two monomers of step 1, each value with its source, and
// the user's own monomers (UserMonomer in copoly.d.ts, saved with the project), which the
// pickers of step 1 and the plan use like the library's.

import { $, $as, button, choice, field, select, setText } from "../dom.js";
import * as engine from "../engine.js";
import { clearFieldError, setFieldError } from "../fields.js";
import { capital, sentence, shortNum } from "../format.js";
import { findMonomer, monomerEntry, ownMonomers, sameName } from "../library.js";
import { ownMonomerError } from "../messages.js";
import { parseNumber } from "../numbers.js";
import { createUndo } from "../undo.js";

/** @import { CopolyError, Project, UserMonomer } from "../../copoly" */
/** @import { MonomerEntry } from "../library.js" */
/** @import { Ctx } from "../main.js" */
/** @import { Undo } from "../undo.js" */

/** @type {Record<string, string>} */
const STATE_TEXT = { liquid: "liquid", gas: "gas (handled under pressure)", solid: "solid" };
export const READ_SDS = "Read the supplier's safety data sheet.";

/** withSDS ends a hazard source with the advice to read the data sheet, unless it says so already.
 * @param {string} source */
const withSDS = (source) => (/data sheet|SDS/.test(source) ? source : (source ? sentence(source) + " " : "") + READ_SDS);

/** @typedef {"molarMass" | "density" | "densityTemp" | "heat" | "q" | "e"} OwnNumber */

/** @type {[string, OwnNumber, string][]} The form of a monomer of your own: [selector, key of UserMonomer, label]. */
const OWN_NUMBERS = [
  ["#um-mass", "molarMass", "molar mass"],
  ["#um-density", "density", "density"],
  ["#um-density-temp", "densityTemp", "density temperature"],
  ["#um-heat", "heat", "heat of polymerization"],
  ["#um-q", "q", "Q"],
  ["#um-e", "e", "e"],
];
const OWN_INPUTS = ["#um-name", ...OWN_NUMBERS.map((n) => n[0]), "#um-hazards-other", "#um-note"];
/** @type {Record<string, [string, string]>} the box and the words of each field of a UserMonomer */
const OWN_FIELD = { name: ["#um-name", "name"], state: ["#um-name", "state"], hazards: ["#um-hazards-other", "hazards"],
  note: ["#um-note", "note"], ...Object.fromEntries(OWN_NUMBERS.map(([sel, key, label]) => [key, [sel, label]])) };

/** @type {Ctx} */
let ctx;
/** @type {Undo} */
let undo;
let editing = -1;
/** @type {string[]} */
let hazardWords = [];

/** @param {string} name */
const entry = (name) => monomerEntry(ctx.store.get("library"), ctx.store.get("project"), name);
const own = () => ownMonomers(ctx.store.get("project"));

/**
 * monomerFacts lists [label, value, source] for one entry.
 * @param {MonomerEntry} e
 * @returns {[string, string, string][]}
 */
function monomerFacts(e) {
  /** @param {number | null | undefined} v @returns {v is number} */
  const given = (v) => typeof v === "number" && Number.isFinite(v) && v > 0;
  const m = e.m;
  const yours = `Your entry${e.own && e.m.note ? `: ${e.m.note}` : ""}`;
  /** @param {string | undefined} libSource */
  const src = (libSource) => (e.own ? yours : libSource || "");
  const lib = e.own ? null : e.m;
  const hasQE = e.own ? given(e.m.q) : e.m.q !== null && e.m.q !== undefined;
  return [
    ["Molar mass", given(m.molarMass) ? `${shortNum(m.molarMass)} g/mol${lib && lib.formula ? ` (${lib.formula})` : ""}` : "not given", src(lib ? lib.source : "")],
    ["State at room temperature", STATE_TEXT[m.state] || "not given", ""],
    ["Density", given(m.density) ? `${shortNum(m.density)} g/mL at ${shortNum(m.densityTemp)} °C` : "not given", given(m.density) ? src(lib ? lib.densitySource : "") : ""],
    ["Heat of polymerization, −ΔHp", given(m.heat) ? `${shortNum(m.heat)} kJ/mol` : "not given", given(m.heat) ? src(lib ? lib.heatSource : "") : ""],
    ["Q, e", hasQE ? `Q = ${shortNum(m.q)}, e = ${shortNum(m.e)}` : "not given", hasQE ? src(lib ? lib.qeSource : "") : ""],
    ["Hazards", m.hazards && m.hazards.length ? m.hazards.join(", ") : "none listed here", withSDS(src(lib ? lib.hazardSource : ""))],
  ];
}

/**
 * drawMonomerData lists the data of the two monomers of step 1, each value with its source.
 * @param {Project} p
 */
export function drawMonomerData(p) {
  for (const [which, mono] of /** @type {const} */ ([[1, p.monomer1], [2, p.monomer2]])) {
    const box = $(`#md-${which}`);
    const h = document.createElement("h4");
    const e = entry(mono.name);
    h.textContent = `M${which}: ${mono.name || "no name yet"}${e && e.own ? " (yours)" : ""}`;
    if (!e) {
      const note = document.createElement("p");
      note.className = "hint";
      note.textContent = mono.name
        ? "Not in the library. Add it below as a monomer of your own to give the plan its density, heat of polymerization and hazards."
        : "Name the monomer in step 1.";
      box.replaceChildren(h, note);
      continue;
    }
    const dl = document.createElement("dl");
    for (const [label, value, source] of monomerFacts(e)) {
      const row = document.createElement("div");
      const dt = document.createElement("dt");
      dt.textContent = label;
      const dd = document.createElement("dd");
      dd.textContent = value;
      if (source) {
        const s = document.createElement("span");
        s.className = "source";
        s.textContent = source;
        dd.append(s);
      }
      row.append(dt, dd);
      dl.append(row);
    }
    box.replaceChildren(h, dl);
  }
}

// buildHazardBoxes offers the hazard words of the built-in monomers as check boxes.
function buildHazardBoxes() {
  /** @type {string[]} */
  const words = [];
  for (const m of ctx.store.get("library").monomers) for (const h of m.hazards || []) if (!words.includes(h)) words.push(h);
  hazardWords = words;
  $("#um-hazard-boxes").replaceChildren(...words.map((w, i) => {
    const label = document.createElement("label");
    label.className = "check";
    const box = document.createElement("input");
    box.type = "checkbox";
    box.id = `um-haz-${i}`;
    box.value = w;
    label.append(box, " ", w);
    return label;
  }));
}

function clearOwnForm() {
  for (const sel of OWN_INPUTS) { field(sel).value = ""; clearFieldError($(sel)); }
  select("#um-state").value = "";
  document.querySelectorAll("#um-hazard-boxes input").forEach((b) => { if (b instanceof HTMLInputElement) b.checked = false; });
  editing = -1;
  setText("#um-save", "Save this monomer");
}

/** @param {number} i */
function editOwn(i) {
  const m = own()[i];
  if (!m) return;
  clearOwnForm();
  editing = i;
  field("#um-name").value = m.name;
  for (const [sel, key] of OWN_NUMBERS) field(sel).value = m[key] !== 0 && Number.isFinite(m[key]) ? shortNum(m[key]) : "";
  select("#um-state").value = m.state || "";
  const other = [];
  for (const h of m.hazards || []) {
    const k = hazardWords.indexOf(h);
    const box = document.getElementById(`um-haz-${k}`);
    if (k >= 0 && box instanceof HTMLInputElement) box.checked = true; else other.push(h);
  }
  field("#um-hazards-other").value = other.join("; ");
  field("#um-note").value = m.note || "";
  setText("#um-save", `Save the changes to ${m.name}`);
  $as("#own-box", HTMLDetailsElement).open = true;
  $("#um-name").focus();
}

/**
 * setOwn replaces the list of the user's monomers after checking the project with it; it
 * returns the check's error, or null.
 * @param {UserMonomer[]} list
 * @returns {Promise<CopolyError | null>}
 */
async function setOwn(list) {
  const p = ctx.store.get("project");
  if (!p) return null;
  const checked = await engine.call("checkProject", { project: { ...p, userMonomers: list } });
  if (engine.isError(checked)) return checked;
  ctx.setPart("userMonomers", checked.project.userMonomers || undefined);
  drawOwnList();
  return null;
}

async function saveOwn() {
  if (!ctx.store.get("project")) return;
  for (const sel of OWN_INPUTS) clearFieldError($(sel));
  undo.drop();
  /** @type {[HTMLElement, string][]} */
  const errors = [];
  const name = field("#um-name").value.trim();
  if (!name) errors.push([$("#um-name"), "Give the monomer a name."]);
  else if (findMonomer(ctx.store.get("library"), name)) errors.push([$("#um-name"), `“${name}” is already in the library; give yours another name, such as “${name} (our lot)”.`]);
  /** @type {UserMonomer} */
  const m = { name, state: choice("#um-state", ["", "liquid", "gas", "solid"]), note: field("#um-note").value.trim(),
    molarMass: 0, density: 0, densityTemp: 0, heat: 0, q: 0, e: 0, hazards: [] };
  for (const [sel, key, label] of OWN_NUMBERS) {
    const raw = field(sel).value.trim();
    const v = raw === "" ? 0 : parseNumber(raw);
    if (Number.isNaN(v)) errors.push([$(sel), `${label} = “${raw}” is not a number.`]);
    m[key] = v;
  }
  m.hazards = [...document.querySelectorAll("#um-hazard-boxes input:checked")].map((b) => (b instanceof HTMLInputElement ? b.value : ""));
  for (const h of field("#um-hazards-other").value.split(";").map((t) => t.trim()).filter(Boolean)) {
    if (!m.hazards.includes(h)) m.hazards.push(h);
  }
  if (errors.length) {
    for (const [input, message] of errors) setFieldError(input, message);
    return;
  }
  const list = own().slice();
  let at = editing >= 0 && editing < list.length ? editing : list.findIndex((x) => sameName(x.name, name));
  const replaced = at >= 0;
  if (replaced) list[at] = m; else { at = list.length; list.push(m); }
  const err = await setOwn(list);
  if (err) {
    const e = ownMonomerError(err, (key) => (OWN_FIELD[key] || [])[1]);
    const sel = e.key && OWN_FIELD[e.key] ? OWN_FIELD[e.key][0] : undefined;
    if (sel && (e.index === undefined || e.index === at)) setFieldError($(sel), capital(e.text));
    else setText("#um-status", `Not saved: ${sentence(e.text)}`);
    return;
  }
  clearOwnForm();
  setText("#um-status", `${name} is ${replaced ? "updated" : "saved"} with the project.`);
}

/** @param {number} i */
async function removeOwn(i) {
  const before = own().slice();
  const gone = before[i];
  if (!gone) return;
  const list = before.slice();
  list.splice(i, 1);
  const err = await setOwn(list);
  if (err) return setText("#um-status", `Not removed: ${sentence(err.error)}`);
  if (editing >= 0) clearOwnForm();
  setText("#um-status", `${gone.name} is removed.`);
  undo.offer("", async () => {
    if (!ctx.store.get("project")) return;
    const e = await setOwn(before);
    setText("#um-status", e ? `Not brought back: ${sentence(e.error)}` : "Brought back.");
  });
}

function drawOwnList() {
  const list = own();
  setText("#own-count", list.length ? `(${list.length})` : "");
  $("#own-list").replaceChildren(...list.map((m, i) => {
    const li = document.createElement("li");
    const name = document.createElement("span");
    name.className = "own-name";
    name.textContent = `${m.name}${m.molarMass > 0 ? `, ${shortNum(m.molarMass)} g/mol` : ""}`;
    const edit = button("Edit", () => editOwn(i));
    edit.setAttribute("aria-label", `Edit ${m.name}`);
    const del = button("Remove", () => removeOwn(i));
    del.setAttribute("aria-label", `Remove ${m.name}`);
    del.className = "row-delete";
    li.append(name, edit, del);
    return li;
  }));
}

/**
 * mountMonomers wires the form of the user's own monomers.
 * @param {Ctx} c
 */
export function mountMonomers(c) {
  ctx = c;
  undo = createUndo({ shown: $("#um-undo"), button: $("#um-undo") });
  $("#um-save").addEventListener("click", saveOwn);
  $("#um-clear").addEventListener("click", () => { clearOwnForm(); setText("#um-status", ""); });
}

/** startMonomers draws the hazard boxes and the list for the first time. */
export function startMonomers() {
  buildHazardBoxes();
  drawOwnList();
}

/** loadMonomers puts a replaced project's monomers on screen. */
export function loadMonomers() {
  clearOwnForm();
  undo.drop();
  setText("#um-status", "");
  drawOwnList();
}

/**
 * monomerOf is the entry of the monomer called name (the user's own first), for the plan.
 * @param {string} name
 */
export const monomerOf = entry;
