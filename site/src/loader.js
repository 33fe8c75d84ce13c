// @ts-check
// loader.js: decodes, instantiates and runs the WebAssembly module embedded in the page (the
// data block #copoly-wasm, written by site/build), and waits until the module has defined
// globalThis.copoly. Only engine.js uses it.

/** @import { Copoly } from "../copoly" */

/** How long the module may take from running to defining globalThis.copoly. */
const ENGINE_WAIT_MS = 15000;

/** Unsupported is a start failure caused by a browser without the features the page needs. */
export class Unsupported extends Error {}

// text7Bytes decodes the module's text (site/build/text7.go): 7-bit groups, one per ASCII
// character, except the codes of NUL, CR and "<", which travel with the following group in one
// character U+0080 + (k << 7 | next), or as U+0200 + k at the very end.
const TEXT7_ILLEGAL = [0x00, 0x0d, 0x3c];

/**
 * @param {string} text
 * @param {number} n the number of bytes the text holds
 * @returns {Uint8Array<ArrayBuffer>}
 */
function text7Bytes(text, n) {
  // One loop with no closure: this runs once, cold, over 1.7 million characters, and a
  // per-group function call made it about 1.6 times slower (Node 20, copoly's module).
  const out = new Uint8Array(n);
  const len = text.length;
  let acc = 0, bits = 0, j = 0;
  for (let i = 0; i < len; i++) {
    let g = text.charCodeAt(i);
    if (g >= 0x80) {
      if (g < 0x200) {
        const v = g - 0x80;
        acc = (acc << 7) | TEXT7_ILLEGAL[v >> 7];
        bits += 7;
        if (bits >= 8) { bits -= 8; out[j++] = acc >> bits; acc &= (1 << bits) - 1; }
        g = v & 0x7f;
      } else {
        g = TEXT7_ILLEGAL[g - 0x200];
      }
    }
    acc = (acc << 7) | g;
    bits += 7;
    if (bits >= 8) { bits -= 8; out[j++] = acc >> bits; acc &= (1 << bits) - 1; }
  }
  // Padding never completes a byte, so a sound text gives exactly n bytes (a Uint8Array
  // ignores writes past its end, so a longer one shows as j > n).
  if (j !== n) throw new Error("the embedded module is damaged");
  return out;
}

/**
 * startModule decodes, instantiates and runs the embedded module; it resolves to the copoly
 * object once the module has registered it. onExit is called if the module stops (go.run
 * resolves or rejects), whenever that is.
 * @param {() => void} onExit
 * @returns {Promise<Copoly>}
 */
export async function startModule(onExit) {
  const block = document.getElementById("copoly-wasm");
  if (!block) throw new Error("this page holds no calculation module");
  if (typeof WebAssembly !== "object" || typeof DecompressionStream !== "function" || typeof Go !== "function") {
    throw new Unsupported("this browser lacks WebAssembly or DecompressionStream");
  }
  performance.mark("copoly:start");
  const gz = text7Bytes(block.textContent || "", Number(block.dataset.gzipBytes));
  block.textContent = ""; // the 1.7 MB of text is no longer needed
  const stream = new Blob([gz]).stream().pipeThrough(new DecompressionStream("gzip"));
  performance.mark("copoly:decoded");
  const go = new Go();
  let instance;
  if (typeof WebAssembly.instantiateStreaming === "function") {
    // Compile while the module is still being decompressed. A Response built from a stream
    // is not a network fetch; the content type is what instantiateStreaming requires.
    const res = new Response(stream, { headers: { "Content-Type": "application/wasm" } });
    ({ instance } = await WebAssembly.instantiateStreaming(res, go.importObject));
  } else {
    const bytes = await new Response(stream).arrayBuffer();
    ({ instance } = await WebAssembly.instantiate(bytes, go.importObject));
  }
  performance.mark("copoly:instantiated");
  let exited = false;
  const exit = () => {
    exited = true;
    onExit();
  };
  go.run(instance).then(exit, exit);
  // The module registers globalThis.copoly from main(); wait for it (it may first open storage).
  const t0 = performance.now();
  while (!(globalThis.copoly && typeof globalThis.copoly.composition === "function")) {
    if (exited) throw new Error("the calculation module stopped before it was ready");
    if (performance.now() - t0 > ENGINE_WAIT_MS) throw new Error("the calculation module did not start in time");
    await new Promise((r) => setTimeout(r, 5));
  }
  performance.mark("copoly:running");
  return globalThis.copoly;
}
