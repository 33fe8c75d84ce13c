// @ts-check
// The project bar: the project file (export, import), the demo, the printed report's button
// (report.js) and the demo badge. The storage notices beside them are storage.js's.

import { $, input, setText } from "../dom.js";
import { download } from "../download.js";
import * as engine from "../engine.js";
import { showGeneralError } from "../fields.js";
import { sentence } from "../format.js";
import { onFileChosen } from "../importer.js";
import { IMPORT_MAX_BYTES } from "../limits.js";
import { flushBeforeOutput } from "../schedule.js";

/** @import { Project } from "../../copoly" */
/** @import { Ctx, Step } from "../main.js" */

/** @type {Ctx} */
let ctx;

/**
 * badge shows the demo badge for the invented demo and refreshes the print copies of the long
 * text fields, which a printed input box would cut off.
 * @param {Project} p
 */
function badge(p) {
  $("#demo-badge").hidden = !(p && p.invented);
  $("#print-demo").hidden = !(p && p.invented);
  setText("#project-name-print", p ? p.name : "");
  setText("#ratio-source-print", p ? p.ratioSource : "");
}

async function exportProject() {
  await flushBeforeOutput();
  const p = ctx.store.get("project");
  if (!p) return;
  const r = await engine.call("exportProject", { project: p });
  if (engine.isError(r)) return showGeneralError(`Not exported: ${r.error}`);
  download(new Blob([r.json], { type: "application/json" }), r.filename);
}

async function startDemo() {
  const r = await engine.call("demoProject", {});
  if (engine.isError(r)) return showGeneralError(r.error);
  await ctx.replaceProject(r.project, "The invented demo project is loaded.");
}

/** @type {Step} */
export const project = {
  id: "project-bar",
  title: "Project",
  mount(c) {
    ctx = c;
    $("#export-project").addEventListener("click", exportProject);
    $("#start-demo").addEventListener("click", startDemo);
    const box = $("#import-error");
    /** @param {File} file @param {string} msg */
    const fail = (file, msg) => { box.textContent = `${file.name} was not imported: ${sentence(msg)} Nothing was changed.`; box.hidden = false; };
    onFileChosen(input("#import-file"), IMPORT_MAX_BYTES, {
      start: () => { box.hidden = true; },
      fail: (file, why) => fail(file, why === "too-large" ? `it is ${file.size} bytes, far larger than a project file.` : "the file could not be read."),
      read: async (file, text) => {
        const r = await engine.call("importProject", { json: text });
        if (engine.isError(r)) return fail(file, r.error);
        await ctx.replaceProject(r.project, `Imported ${file.name}.`);
      },
    });
  },
  load: badge,
  update: badge,
};
