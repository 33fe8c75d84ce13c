// @ts-check
// Step 7, where to run the next samples: the two runs that most shrink the joint confidence
// region given the runs made (copoly.nextRuns), the D-optimal and Tidwell–Mortimer feeds, and a
// button that adds the two runs to the grid of step 5.

import { $, setText } from "../dom.js";
import * as engine from "../engine.js";
import { fix, rat, sentence } from "../format.js";
import { addRows, feedKind } from "./bench.js";
import { METHOD, recommendedFit } from "./fitplots.js";

/** @import { NextRunsResult, Project } from "../../copoly" */
/** @import { Ctx, Step } from "../main.js" */

/** @type {Ctx} */
let ctx;
let started = false;
/** @type {NextRunsResult["next"] | null} */
let suggestion = null;

function drawNext() {
  return engine.newest("next", async (job) => {
    const p = ctx.store.get("project");
    if (!p) return;
    let r1, r2, basis;
    const fitted = ctx.store.get("fit");
    const rec = fitted ? recommendedFit(fitted.result) : null;
    const runs = fitted ? fitted.runs : ctx.store.get("runs").runs;
    if (rec && rec[1]) {
      const [name, m] = rec;
      r1 = m.r1; r2 = m.r2;
      basis = `Planned from the recommended estimate (r1 = ${rat(r1)}, r2 = ${rat(r2)}, ${METHOD[name].short}) and the ${runs.length} runs already in the table.`;
    } else {
      r1 = p.r1; r2 = p.r2;
      basis = `No estimate from bench data yet: planned from the ratios in step 1 (r1 = ${rat(r1)}, r2 = ${rat(r2)})${runs.length ? ` and the ${runs.length} usable run${runs.length === 1 ? "" : "s"} in the table` : ""}.`;
    }
    const d = await job.call("nextRuns", { r1, r2, runs });
    if (engine.isError(d)) {
      setText("#next-basis", `No suggestion: ${sentence(d.error)}`);
      $("#next-results").hidden = true;
      suggestion = null;
      return;
    }
    setText("#next-basis", basis);
    $("#next-results").hidden = false;
    suggestion = d.next || [];
    /** @param {{f10: number, conversion: number}} s */
    const runText = (s) => `f10 = ${fix(s.f10, 3)}, stop near X = ${fix(s.conversion, 2)}`;
    const [a, b] = suggestion;
    setText("#next-runs", !a ? "–" : b && runText(a) === runText(b) ? `${runText(a)}, twice (a replicate)` : suggestion.map(runText).join("; "));
    setText("#next-shrink", d.shrink > 0 ? `area × ${fix(d.shrink, 2)} (to about ${Math.round(d.shrink * 100)} % of today's)` : "– (no runs yet to compare with)");
    setText("#next-dopt", `f10 = ${fix(d.dOptimal[0], 3)} and ${fix(d.dOptimal[1], 3)}`);
    setText("#next-tm", `f10 = ${fix(d.tidwellMortimer[0], 3)} and ${fix(d.tidwellMortimer[1], 3)}, from r2/(2 + r2) and 2/(2 + r1)`);
    setText("#next-middle", `f10 = ${fix(d.middle, 3)}`);
    setText("#next-add-note", feedKind() === "fraction"
      ? "Adds two rows with the feed filled in; fill in the conversion and the composition once you have measured them."
      : "The table takes the feed as masses or amounts, so the two rows get the suggested feed in their label only.");
  });
}

function addNextRuns() {
  if (!ctx.store.get("project") || !suggestion || !suggestion.length) return;
  const fraction = feedKind() === "fraction";
  const n = addRows(suggestion.map((s, k) => {
    /** @type {Record<string, string>} */
    const cells = fraction ? { f10: fix(s.f10, 3) } : {};
    return { label: `next ${k + 1}: stop near X = ${fix(s.conversion, 2)}${fraction ? "" : `, f10 = ${fix(s.f10, 3)}`}`, cells };
  }));
  setText("#next-add-note", `Added as rows ${n - 1} and ${n} of the table in step 5.`);
}

/** @type {Step} */
export const next = {
  id: "next",
  title: "Where to run the next samples",
  mount(c) {
    ctx = c;
    $("#next-add").addEventListener("click", addNextRuns);
    // Each outcome of the fit (an estimate, none, an error) plans again.
    ctx.store.subscribe("fit", () => { drawNext(); });
  },
  start() {
    if (started || !ctx.store.get("project") || !engine.running()) return;
    started = true;
    drawNext();
  },
  update() {
    if (started && !ctx.store.get("fit")) drawNext();
  },
};
