// @ts-check
// report.js: the printed report. style.css (@media print) turns the page into the report; this
// module writes the date and the engine's version into its print-only head, once the page is
// ready and again just before printing, so that the date is the date of printing. Work waiting
// for the typing to pause (the fit, the plan) runs first, so that an edit made just before is
// in the report.

import { $, $as, setText } from "./dom.js";
import * as engine from "./engine.js";
import { flushBeforeOutput, outputReady } from "./schedule.js";

function stampReport() {
  const d = new Date();
  /** @param {number} n */
  const pad = (n) => String(n).padStart(2, "0");
  const off = -d.getTimezoneOffset();
  const zone = `UTC${off < 0 ? "−" : "+"}${pad(Math.floor(Math.abs(off) / 60))}:${pad(Math.abs(off) % 60)}`;
  const t = $as("#print-date", HTMLTimeElement);
  t.dateTime = d.toISOString();
  t.textContent = `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())} (${zone})`;
  if (engine.version()) setText("#print-version", `version ${engine.version()}`);
}

/**
 * wireReport wires the print button and the browser's own Print.
 * @param {Promise<void>} ready resolves once the first results are drawn
 */
export function wireReport(ready) {
  // The button prints at once when nothing waits; otherwise once the waiting work is drawn.
  $("#print-report").addEventListener("click", async () => {
    if (!outputReady()) await flushBeforeOutput();
    stampReport();
    window.print();
  });
  // The browser's own Print cannot wait: the waiting work is started here and, as long as the
  // module answers at once (engine.js), drawn before the browser lays out the printed page.
  window.addEventListener("beforeprint", () => { flushBeforeOutput(); stampReport(); });
  window.matchMedia("print").addEventListener("change", (e) => { if (e.matches) stampReport(); });
  ready.then(stampReport, () => {});
}
