// The global the Go toolchain's wasm_exec.js defines, as the page's loader (site/src/loader.js)
// uses it. wasm_exec.js itself is inlined into the page as the toolchain wrote it and is not
// checked.
declare class Go {
  importObject: WebAssembly.Imports;
  run(instance: WebAssembly.Instance): Promise<void>;
}
