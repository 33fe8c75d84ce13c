// @ts-check
// Step 1, monomers and reactivity ratios: the pickers that fill the form from the library (a
// literature pair, a monomer), and the notes beside the values (the library's entry for the
// names typed, the joint confidence region kept with fitted ratios). The inputs themselves are
// read and written by form.js.

import { $, select, setText } from "../dom.js";
import { setMonomer, setPair } from "../form.js";
import { rat, shortNum } from "../format.js";
import { findMonomer, monomerEntry, ownMonomers, sameName } from "../library.js";

/** @import { Project } from "../../copoly" */
/** @import { Ctx, Step } from "../main.js" */

/** @type {Ctx} */
let ctx;

/**
 * option makes an <option>.
 * @param {string} value @param {string} text
 */
function option(value, text) {
  const o = document.createElement("option");
  o.value = value;
  o.textContent = text;
  return o;
}

// fillPickers offers the library's pairs, and its monomers.
function fillPickers() {
  const pairPick = $("#pair-pick");
  ctx.store.get("library").pairs.forEach((pr, i) => {
    pairPick.append(option(String(i), `${pr.monomer1} / ${pr.monomer2}: r1 ${pr.r1}, r2 ${pr.r2}${pr.temperature ? ", " + pr.temperature : ""}`));
  });
  fillMonomerPickers();
}

// fillMonomerPickers offers the library's monomers ("b3") and the user's own ("u0"), these
// marked "(yours)".
function fillMonomerPickers() {
  /** @param {string} label @param {HTMLOptionElement[]} options */
  const group = (label, options) => {
    const g = document.createElement("optgroup");
    g.label = label;
    g.append(...options);
    return g;
  };
  const lib = ctx.store.get("library");
  for (const sel of ["#pick1", "#pick2"]) {
    const items = [option("", "Choose a monomer…"),
      group("Library", lib.monomers.map((m, i) => option(`b${i}`, `${m.name} (${shortNum(m.molarMass)} g/mol)`)))];
    const mine = ownMonomers(ctx.store.get("project"));
    if (mine.length) {
      items.push(group("Yours", mine.map((m, i) => option(`u${i}`, `${m.name} (yours${m.molarMass > 0 ? `, ${shortNum(m.molarMass)} g/mol` : ""})`))));
    }
    $(sel).replaceChildren(...items);
  }
}

function pickPair() {
  const pick = select("#pair-pick");
  const lib = ctx.store.get("library");
  const pr = lib.pairs[Number(pick.value)];
  pick.value = "";
  if (!pr) return;
  const a = findMonomer(lib, pr.monomer1), b = findMonomer(lib, pr.monomer2);
  setPair({
    name1: pr.monomer1, name2: pr.monomer2,
    mass1: a ? shortNum(a.molarMass) : "", mass2: b ? shortNum(b.molarMass) : "",
    r1: shortNum(pr.r1), r2: shortNum(pr.r2),
    source: pr.source + (pr.temperature ? ` (${pr.temperature})` : ""),
  });
  ctx.store.set("formJcr", null);
  ctx.recompute();
}

/** @param {1 | 2} which */
function pickMonomer(which) {
  const sel = select(`#pick${which}`);
  const v = sel.value;
  sel.value = "";
  const m = v[0] === "u" ? ownMonomers(ctx.store.get("project"))[Number(v.slice(1))] : ctx.store.get("library").monomers[Number(v.slice(1))];
  if (!m) return;
  setMonomer(which, m.name, m.molarMass > 0 ? shortNum(m.molarMass) : "");
  ctx.recompute();
}

/**
 * drawLibraryNotes shows, beside each value, the library entry that matches the names typed.
 * @param {Project} p
 */
function drawLibraryNotes(p) {
  const lib = ctx.store.get("library");
  for (const [which, mono] of /** @type {const} */ ([[1, p.monomer1], [2, p.monomer2]])) {
    const e = monomerEntry(lib, p, mono.name);
    const m = e ? e.m : null;
    const differs = m && m.molarMass > 0 && Math.abs(m.molarMass - mono.molarMass) > 1e-9 ? " (differs from the value above)" : "";
    setText(`#mass${which}-source`, !e ? ""
      : e.own ? `Yours: ${e.m.name}${e.m.molarMass > 0 ? `, ${shortNum(e.m.molarMass)} g/mol` : ""}${differs}.${e.m.note ? ` Note: ${e.m.note}` : ""}`
        : `Library: ${e.m.name}, ${shortNum(e.m.molarMass)} g/mol${differs}. Source: ${e.m.source}`);
  }
  const n1 = p.monomer1.name, n2 = p.monomer2.name;
  const matches = lib.pairs.filter((pr) =>
    (sameName(pr.monomer1, n1) && sameName(pr.monomer2, n2)) || (sameName(pr.monomer1, n2) && sameName(pr.monomer2, n1)));
  const texts = matches.map((pr) => {
    const flipped = !sameName(pr.monomer1, n1);
    const r1 = flipped ? pr.r2 : pr.r1, r2 = flipped ? pr.r1 : pr.r2;
    return `r1 = ${r1}, r2 = ${r2}${pr.temperature ? " at " + pr.temperature : ""}. Source: ${pr.source}`;
  });
  setText("#ratio-library", texts.length ? "Library: " + texts.join(" · ") : "");
}

/**
 * drawJcrNote says that the ratios in use carry a stored region.
 * @param {Project} p
 */
function drawJcrNote(p) {
  const jcr = p.jcr;
  const box = $("#ratio-jcr");
  if (!jcr || jcr.length < 3) { box.hidden = true; box.textContent = ""; return; }
  const r1 = jcr.map((q) => q[0]), r2 = jcr.map((q) => q[1]);
  box.textContent = `Joint confidence region kept with these ratios: r1 ${rat(Math.min(...r1))} to ${rat(Math.max(...r1))}, r2 ${rat(Math.min(...r2))} to ${rat(Math.max(...r2))} (step 6).`;
  box.hidden = false;
}

/** @type {Step} */
export const pair = {
  id: "pair",
  title: "Monomers and reactivity ratios",
  mount(c) {
    ctx = c;
    $("#pair-pick").addEventListener("change", pickPair);
    $("#pick1").addEventListener("change", () => pickMonomer(1));
    $("#pick2").addEventListener("change", () => pickMonomer(2));
    ctx.store.subscribe("library", fillPickers);
    // The user's own monomers are offered in the pickers and named beside the molar masses.
    ctx.store.subscribe("project", (p, why) => {
      if (why === "userMonomers" || why === "load") fillMonomerPickers();
      if (why === "userMonomers" && p) drawLibraryNotes(p);
    });
  },
  draw(p) {
    drawLibraryNotes(p);
    drawJcrNote(p);
  },
  update: drawJcrNote,
};
