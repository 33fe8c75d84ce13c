// Using copoly from a lab pipeline: load the WebAssembly module under Node 20 and call the same
// JavaScript API the page uses (declared in site/copoly.d.ts).
//
//   make wasm                      # builds dist/copoly.wasm and copies the matching dist/wasm_exec.js
//   node site/node-example.mjs     # prints composition and drift results for the invented demo
//
// wasm_exec.js must come from the Go toolchain that built copoly.wasm; `make wasm` copies it
// from $(go env GOROOT)/lib/wasm/. The numbers below are for the built-in demo project, an
// invented scenario: replace r1, r2 and the feed with your own checked values.
//
// Every method returns a plain object; bad input returns {error, field} instead of throwing,
// so check for `error` before using a result. Storage (loadProject, saveProject) needs a
// browser's IndexedDB and reports storage "unavailable" under Node: keep project files with
// exportProject / importProject instead.

import { readFile } from "node:fs/promises";

const dist = new URL("../dist/", import.meta.url);

// wasm_exec.js defines globalThis.Go.
await import(new URL("wasm_exec.js", dist));
const go = new Go();
const { instance } = await WebAssembly.instantiate(await readFile(new URL("copoly.wasm", dist)), go.importObject);
go.run(instance).then(() => {
  // The module never exits on its own; if it does, later calls would fail.
  console.error("copoly: the WebAssembly module stopped");
  process.exitCode = 1;
});
const copoly = globalThis.copoly;

// check returns a result, or stops the script with the error and the field at fault.
function check(result) {
  if (result.error !== undefined) {
    console.error(`copoly error in field "${result.field}": ${result.error}`);
    process.exit(1);
  }
  return result;
}

const { project } = copoly.demoProject();
const { r1, r2, f10, tolerance } = project;
console.log(`copoly ${copoly.version}: ${project.name}`);
console.log(`${project.monomer1.name} (M1) / ${project.monomer2.name} (M2), r1 = ${r1}, r2 = ${r2}`);

// Instantaneous copolymer composition F1 over a range of feeds (Mayo–Lewis).
const feeds = [0.1, 0.3, 0.5, 0.7, 0.9];
const comp = check(copoly.composition({ r1, r2, f1: feeds }));
console.log("\nfeed f1   copolymer F1");
feeds.forEach((f, i) => console.log(`${f.toFixed(2).padStart(7)}   ${comp.F1[i].toFixed(4)}`));
console.log(comp.azeotrope === null ? "no azeotrope" : `azeotrope at f1 = ${comp.azeotrope.toFixed(4)}`);
console.log(comp.classification.text);

// Composition drift of a batch started at f10, with conversions given by mass (as weighed).
const drift = check(copoly.drift({
  r1, r2, f10,
  conversion: [0.1, 0.3, 0.5, 0.7, 0.9],
  basis: "mass",
  molarMass1: project.monomer1.molarMass,
  molarMass2: project.monomer2.molarMass,
  tolerance,
}));
console.log(`\nbatch from f10 = ${f10} (${drift.method})`);
console.log("mass conv.  molar conv.  feed f1   F1      F1cum");
drift.conversion.forEach((x, i) => console.log(
  `${drift.conversionMass[i].toFixed(3).padStart(10)}  ${x.toFixed(4).padStart(11)}  ${drift.f1[i].toFixed(4)}   ${drift.F1[i].toFixed(4)}  ${drift.F1cum[i].toFixed(4)}`));
console.log(`F1cum stays within ±${drift.limit.tolerance} of the first polymer up to X = ${drift.limit.conversion.toFixed(4)} (molar)`);
if (drift.exhausted) {
  console.log(`M${drift.exhausted.monomer} is practically used up at X = ${drift.exhausted.conversion.toFixed(4)}`);
}

// Bad input gives an error object naming the field; it never throws.
const bad = copoly.composition({ r1: -0.2, r2, f1: feeds });
console.log(`\nexample of an input error: field "${bad.field}": ${bad.error}`);
