// app.js: the copoly page. Loads the embedded WebAssembly module, reads the form, calls the
// `copoly` object (contract: site/copoly.d.ts) and draws the results.
//
// Rules kept here:
//   - every user or file text reaches the page through textContent, never innerHTML;
//   - an invalid input is marked beside its field and never replaces the last valid project, its
//     results stay on screen and it is never saved;
//   - the project is saved (debounced) after every valid change, based on the stored revision this
//     tab loaded, so that a save never silently replaces another tab's; the form as typed is saved
//     as a draft after every keystroke and restored after a reload;
//   - the module exiting (go.run resolving) is a crash: #fatal-banner says so.
import { Plot } from "./plot.js";

(() => {
  // window.copolyReady resolves once the module runs and the first results are drawn.
  let readyResolve, readyReject;
  window.copolyReady = new Promise((resolve, reject) => { readyResolve = resolve; readyReject = reject; });
  window.copolyReady.catch(() => {}); // a failed start is shown in #load-banner

  const $ = (sel) => document.querySelector(sel);
  const SAVE_DELAY_MS = 300;
  const COMPOSITION_POINTS = 101;
  const DRIFT_POINTS = 101;
  const RUN_LENGTH_MAX = 12;
  const CHAIN_COUNT = 12;
  const CHAIN_LENGTH = 60;
  const ENGINE_WAIT_MS = 15000;
  const IMPORT_MAX_BYTES = 2 * 1024 * 1024;
  // Colours: M1 a deep teal, M2 a warm sand; far apart in hue and lightness, so they also hold in
  // grey print and for the common colour-vision deficiencies.
  const C = {
    m1: "#0f6e68",
    m2: "#e3a72f",
    feed: "#5c6b7a",
    inst: "#0f6e68",
    cum: "#b4441c",
    band: "#e3a72f",
    limit: "#8a2a8e",
    diag: "#9aa5b1",
    azeo: "#b4441c",
  };

  // ---- Loading the module -------------------------------------------------------------------

  let engine = null; // the copoly object once running
  let engineStopped = false;

  // Unsupported is a start failure caused by a browser without the features the page needs.
  class Unsupported extends Error {}

  // text7Bytes decodes the module's text (site/build/text7.go): 7-bit groups, one per ASCII
  // character, except the codes of NUL, CR and "<", which travel with the following group in one
  // character U+0080 + (k << 7 | next), or as U+0200 + k at the very end.
  const TEXT7_ILLEGAL = [0x00, 0x0d, 0x3c];
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

  // startModule decodes, instantiates and runs the embedded module; it resolves to the copoly
  // object once the module has registered it.
  async function startModule() {
    const block = document.getElementById("copoly-wasm");
    if (!block) throw new Error("this page holds no calculation module");
    if (typeof WebAssembly !== "object" || typeof DecompressionStream !== "function" || typeof Go !== "function") {
      throw new Unsupported("this browser lacks WebAssembly or DecompressionStream");
    }
    performance.mark("copoly:start");
    const gz = text7Bytes(block.textContent, Number(block.dataset.gzipBytes));
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
    go.run(instance).then(onExit, onExit);
    function onExit() {
      exited = true;
      if (engine) showFatal();
    }
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

  function showFatal() {
    engineStopped = true;
    clearTimeout(saveTimer);
    $("#fatal-banner").hidden = false;
    document.body.classList.add("engine-stopped");
  }

  // call runs one method of the copoly object; a thrown exception (the module has exited)
  // becomes a CopolyError and shows the banner.
  function call(method, arg) {
    if (!engine || engineStopped) return { error: "The calculation engine is not running." };
    try {
      const r = engine[method](arg || {});
      return r === undefined || r === null ? { error: `No answer from ${method}.` } : r;
    } catch (e) {
      showFatal();
      return { error: "The calculation engine stopped." };
    }
  }

  async function callAsync(method, arg) {
    const r = call(method, arg);
    if (!r || typeof r.then !== "function") return r;
    try {
      const v = await r;
      return v === undefined || v === null ? { error: `No answer from ${method}.` } : v;
    } catch (e) {
      return { error: String((e && e.message) || e) };
    }
  }

  const isError = (r) => r && typeof r.error === "string";

  // ---- Formatting ---------------------------------------------------------------------------

  const fix = (v, d) => (Number.isFinite(v) ? v.toFixed(d) : "–");
  const pct = (v) => (Number.isFinite(v) ? (v * 100).toFixed(1) + " %" : "–");
  const sig3 = (v) => (Number.isFinite(v) ? v.toPrecision(3) : "–");
  const clockTime = (iso) => {
    const d = iso ? new Date(iso) : new Date();
    if (Number.isNaN(d.getTime())) return "";
    return [d.getHours(), d.getMinutes(), d.getSeconds()].map((n) => String(n).padStart(2, "0")).join(":");
  };
  const sentence = (s) => (/[.!?]$/.test(s) ? s : s + ".");
  const shortNum = (v) => (Number.isFinite(v) ? String(Number(v.toPrecision(6))) : "");
  const m1Name = (p) => (p.monomer1.name || "M1");
  const m2Name = (p) => (p.monomer2.name || "M2");
  const slug = (s) => (s || "copoly").toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 40) || "copoly";

  function setText(sel, text) {
    const e = typeof sel === "string" ? $(sel) : sel;
    e.textContent = text;
  }

  // ---- Fields and errors --------------------------------------------------------------------

  // Inputs that make up the project; each recomputes on "input".
  const PROJECT_INPUTS = ["#project-name", "#name1", "#name2", "#mass1", "#mass2", "#r1", "#r2",
    "#ratio-source", "#notes", "#f10", "#conversion", "#tolerance"];
  // The model of step 4: each ratio with the kind that takes it.
  const MODEL_RATIOS = [["r11", "penultimate"], ["r21", "penultimate"], ["r22", "penultimate"], ["r12", "penultimate"], ["s1", "implicit"], ["s2", "implicit"]];
  for (const [k] of MODEL_RATIOS) PROJECT_INPUTS.push("#m-" + k);
  const MODEL_NAME = { terminal: "terminal model", penultimate: "explicit penultimate model", implicit: "implicit penultimate model" };
  const TERMINAL_ONLY = "terminal model only";

  // FIELD_INPUT maps the API's field names (after dropping "project." and any "[i]") to inputs.
  const FIELD_INPUT = {
    "name": "#project-name",
    "monomer1.name": "#name1", "monomer1.molarMass": "#mass1", "molarMass1": "#mass1", "monomer1": "#name1",
    "monomer2.name": "#name2", "monomer2.molarMass": "#mass2", "molarMass2": "#mass2", "monomer2": "#name2",
    "r1": "#r1", "r2": "#r2", "ratioSource": "#ratio-source", "notes": "#notes",
    "f10": "#f10", "f1": "#f10", "conversion": "#conversion", "tolerance": "#tolerance",
    "targetF1": "#target-F1", "model": "#model-kind", "model.kind": "#model-kind",
  };
  for (const [k] of MODEL_RATIOS) FIELD_INPUT[k] = FIELD_INPUT["model." + k] = "#m-" + k;

  function inputForField(field) {
    if (!field) return null;
    const key = String(field).replace(/^project\./, "").replace(/\[\d+\]/g, "");
    const sel = FIELD_INPUT[key];
    return sel ? $(sel) : null;
  }

  function errorBox(input) {
    return document.getElementById(input.id + "-error");
  }

  // setFieldError shows message beside input. The field is named by the box the message sits
  // beside, so a leading "project." from the project check is dropped.
  function setFieldError(input, message) {
    message = message.replace(/^project\./, "").replace(/^model\./, "");
    input.setAttribute("aria-invalid", "true");
    const box = errorBox(input);
    if (box) { box.textContent = message; box.hidden = false; }
  }

  function clearFieldError(input) {
    input.removeAttribute("aria-invalid");
    const box = errorBox(input);
    if (box) { box.textContent = ""; box.hidden = true; }
  }

  // parseNumber reads a decimal number as typed; a single comma is taken as the decimal mark.
  function parseNumber(text) {
    let s = text.trim();
    if (/^[+-]?\d*,\d+$/.test(s)) s = s.replace(",", ".");
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return NaN;
    return Number(s);
  }

  const LABELS = {
    "#mass1": "molar mass of M1", "#mass2": "molar mass of M2", "#r1": "r1", "#r2": "r2",
    "#f10": "starting feed f1", "#conversion": "final conversion", "#tolerance": "tolerance", "#target-F1": "wanted F1",
  };
  for (const [k] of MODEL_RATIOS) LABELS["#m-" + k] = k;

  // readForm returns {project} or {errors: [{input, message}]} from what is typed now.
  function readForm() {
    const errors = [];
    const num = (sel, blankIsZero) => {
      const input = $(sel);
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
    const base = state.project || {};
    const project = {
      ...base,
      format: "copoly-project",
      version: 1,
      name: $("#project-name").value.trim(),
      monomer1: { name: $("#name1").value.trim(), molarMass: num("#mass1", true) },
      monomer2: { name: $("#name2").value.trim(), molarMass: num("#mass2", true) },
      r1: num("#r1"),
      r2: num("#r2"),
      ratioSource: $("#ratio-source").value.trim(),
      f10: num("#f10"),
      conversion: num("#conversion"),
      tolerance: num("#tolerance"),
      notes: $("#notes").value,
    };
    delete project.savedAt;
    // The model: the chosen kind's ratios must read; another kind's are kept when they read, or
    // as saved when their box holds text that does not.
    const kind = $("#model-kind").value;
    const model = { kind };
    for (const [k, kk] of MODEL_RATIOS) {
      const sel = "#m-" + k, raw = $(sel).value.trim(), v = parseNumber(raw);
      if (kk === kind) model[k] = num(sel);
      else if (!Number.isNaN(v)) model[k] = v;
      else if (raw && base.model && base.model[k] !== undefined) model[k] = base.model[k];
    }
    project.model = model;
    // The stored region belongs to the ratios it was fitted with; typed ratios have none.
    if (state.formJcr && state.formJcr.length) project.jcr = state.formJcr;
    else delete project.jcr;
    return errors.length ? { errors } : { project };
  }

  const modelKind = (p) => (p.model && MODEL_NAME[p.model.kind] ? p.model.kind : "terminal");

  // modelArgs is the ModelArgs of copoly.d.ts for the project's model; the terminal model passes
  // r1 and r2 alone, as before there were other models.
  function modelArgs(p) {
    const m = p.model || {}, kind = modelKind(p);
    if (kind === "terminal") return { r1: p.r1, r2: p.r2 };
    const a = { model: kind };
    if (kind === "implicit") Object.assign(a, { r1: p.r1, r2: p.r2 });
    for (const [k, kk] of MODEL_RATIOS) if (kk === kind) a[k] = m[k];
    return a;
  }

  // showModelFields shows the ratio boxes of the chosen model; a penultimate model chosen with
  // empty boxes starts from the terminal ratios, which it then reproduces.
  function showModelFields(prefill) {
    const kind = $("#model-kind").value;
    document.querySelectorAll(".model-box [data-kind]").forEach((f) => { f.hidden = f.dataset.kind !== kind; });
    const start = { r11: "#r1", r21: "#r1", r22: "#r2", r12: "#r2" };
    for (const [k, kk] of MODEL_RATIOS) {
      const input = $("#m-" + k);
      if (prefill && kk === kind && !input.value.trim()) input.value = kk === "implicit" ? "1" : $(start[k]).value.trim();
    }
  }

  function fillForm(p) {
    $("#project-name").value = p.name || "";
    $("#name1").value = p.monomer1.name || "";
    $("#name2").value = p.monomer2.name || "";
    $("#mass1").value = p.monomer1.molarMass > 0 ? shortNum(p.monomer1.molarMass) : "";
    $("#mass2").value = p.monomer2.molarMass > 0 ? shortNum(p.monomer2.molarMass) : "";
    $("#r1").value = shortNum(p.r1);
    $("#r2").value = shortNum(p.r2);
    $("#ratio-source").value = p.ratioSource || "";
    $("#notes").value = p.notes || "";
    $("#f10").value = shortNum(p.f10);
    $("#conversion").value = shortNum(p.conversion);
    $("#tolerance").value = shortNum(p.tolerance);
    const m = p.model || {};
    $("#model-kind").value = MODEL_NAME[m.kind] ? m.kind : "terminal";
    for (const [k] of MODEL_RATIOS) $("#m-" + k).value = Number.isFinite(m[k]) ? shortNum(m[k]) : "";
    showModelFields();
    clearFieldError($("#model-kind"));
    for (const sel of PROJECT_INPUTS) clearFieldError($(sel));
    state.formJcr = Array.isArray(p.jcr) && p.jcr.length ? p.jcr : null;
    $("#fit-level").value = shortNum(p.level > 0 ? p.level : DEFAULT_LEVEL);
    clearFieldError($("#fit-level"));
  }

  // ---- State, recompute and save ------------------------------------------------------------

  const state = {
    project: null, // the last valid project: on screen, saved, exported
    library: { monomers: [], pairs: [] },
    storage: "unknown",
    savedAt: "",
    invalid: false,
    seed: 1,
    previous: null, // the project replaced by the demo or an import, for "Bring it back"
    formJcr: null, // the joint confidence region of the ratios in the form, when they came from a fit
  };
  let saveTimer = 0;

  // recompute validates the form and, if valid, redraws everything and schedules a save.
  function recompute() {
    if (!engine || engineStopped) return;
    for (const sel of PROJECT_INPUTS) clearFieldError($(sel));
    const form = readForm();
    if (form.errors) return markInvalid(form.errors);
    const checked = call("checkProject", { project: form.project });
    if (isError(checked)) return markInvalid([{ input: inputForField(checked.field), message: checked.error }]);
    const p = { ...form.project, ...checked.project };
    const errs = drawAll(p);
    if (errs.length) return markInvalid(errs);
    state.invalid = false;
    document.querySelectorAll(".stale-note").forEach((n) => { n.hidden = true; });
    state.project = p;
    updateBadge();
    afterProjectChange(p);
    scheduleSave();
  }

  function markInvalid(errors) {
    state.invalid = true;
    for (const { input, message } of errors) {
      if (input) setFieldError(input, message);
      else showGeneralError(message);
    }
    document.querySelectorAll(".stale-note").forEach((n) => { n.hidden = false; });
    if (planUI.started) planStale(true);
    clearTimeout(saveTimer);
    showStorageStatus();
  }

  function showGeneralError(message) {
    const box = $("#import-error");
    box.textContent = message;
    box.hidden = false;
  }

  function scheduleSave() {
    clearTimeout(saveTimer);
    saveTimer = setTimeout(save, SAVE_DELAY_MS);
  }

  // ---- Storage: saves, conflicts, kept copies, drafts ------------------------------------------
  //
  // Each save is based on the stored revision this tab loaded or last saved (store.revision); when
  // another tab saved since, copoly keeps this tab's version as a conflict copy, leaves the other
  // untouched, and #conflict-bar asks which to keep. A failed save (storage full) keeps the project
  // on the page and in memory and is tried again with the next change. Copies set aside (stored
  // files that could not be read, conflict copies) are offered in #kept-bar. The form as typed,
  // valid or not, is saved as this tab's draft a moment after each keystroke and when the tab is
  // hidden or left; after a reload #draft-bar says it was restored.
  const DRAFT_DELAY_MS = 150;
  const DRAFT_COPY = "copoly-draft"; // sessionStorage key of this tab's copy of its draft
  const DRAFT_INPUTS = [...PROJECT_INPUTS, "#model-kind"];
  const store = {
    revision: { n: 0, writer: "" }, // the stored revision the next save is based on
    storedKey: "",            // projectKey of what this tab last stored or loaded
    failed: "",               // why the last save failed; "" once one succeeds
    failedDetail: "",
    conflict: null,           // {other: {project, revision}, kept} while the user has not chosen
    tab: "",                  // this tab's name for its draft
    draftTimer: 0,
    draftDirty: false,
    edits: 0,                 // typed changes so far, to tell whether the draft is still needed
    loaded: null,             // the project as loaded, for "Discard the restored typing"
    chain: Promise.resolve(), // this tab's storage calls, one after another
  };

  const projectKey = (p) => JSON.stringify({ ...p, savedAt: undefined });

  // queued runs fn after this tab's earlier storage calls, and under a lock shared by the tabs of
  // this browser where there is one, so that two tabs never save at the same instant.
  function queued(fn) {
    const locks = navigator.locks;
    const run = () => (locks && typeof locks.request === "function" ? locks.request("copoly-storage", fn) : fn());
    const p = store.chain.then(run, run);
    store.chain = p.catch(() => {});
    return p;
  }

  function save() {
    if (!state.project || engineStopped) return Promise.resolve();
    return queued(storeProject);
  }

  async function storeProject() {
    const project = state.project;
    if (!project || engineStopped) return;
    const key = projectKey(project);
    if (key === store.storedKey) { // nothing new to store
      if (store.failed) { store.failed = ""; showStorageStatus(); }
      return;
    }
    const edits = store.edits;
    const r = await callAsync("saveProject", { project, basedOn: store.revision });
    if (isError(r)) {
      // The project stays in state.project and on screen; the next change tries again.
      const reason = String(r.error).replace(/^storage: /, "");
      store.failed = state.storage === "unavailable" ? "" : reason.replace(/ \(.*$/s, "");
      store.failedDetail = reason;
      return showStorageStatus();
    }
    state.storage = r.storage || "indexeddb";
    store.failed = store.failedDetail = "";
    if (!r.saved) return showConflict(r);
    store.revision = r.revision;
    store.storedKey = key;
    project.savedAt = r.savedAt;
    state.savedAt = r.savedAt;
    showStorageStatus();
    // The stored project now holds all that was typed: the draft is no longer needed.
    if (edits === store.edits && !state.invalid && !store.draftDirty && store.tab) dropDraft();
  }

  function showStorageStatus() {
    let text;
    if (state.storage === "unavailable") {
      text = "Browser storage unavailable — your work is kept only in this tab; export the project to keep it";
    } else if (store.conflict) {
      text = "Not saved over the version another tab saved: choose above which one to keep";
    } else if (store.failed) {
      text = `Not saved: ${store.failed}. Your changes are still here and are saved with your next change; the last saved version is kept. Export the project to keep a copy now`;
    } else if (state.savedAt) {
      text = `Saved ${clockTime(state.savedAt)}`;
    } else {
      text = "Not saved yet; every valid change is saved in this browser";
    }
    if (state.invalid) text += " · the marked field is not valid, so that change is not saved";
    setText("#storage-status", text);
    if (store.failed) $("#storage-status").title = store.failedDetail;
    else if (state.storage !== "unavailable") $("#storage-status").title = "";
  }

  function showConflict(r) {
    store.conflict = { other: r.conflict, kept: r.kept };
    const at = r.conflict.project.savedAt ? ` at ${clockTime(r.conflict.project.savedAt)}` : "";
    setText("#conflict-text", `Another tab or window saved this project${at}, after this tab opened it. Nothing was overwritten: ` +
      "that version stays saved, and this tab's version is kept as a separate copy. Which one do you want to keep? You can export either first.");
    $("#conflict-bar").hidden = false;
    showStorageStatus();
  }

  function closeConflict() {
    const c = store.conflict;
    store.conflict = null;
    $("#conflict-bar").hidden = true;
    return c;
  }

  // keepMine saves this tab's project over the other tab's (which becomes the previous copy).
  async function keepMine() {
    const c = closeConflict();
    if (!c) return;
    store.revision = c.other.revision;
    store.storedKey = "";
    await save();
    if (!store.conflict && !store.failed) queued(() => callAsync("dropKept", { name: c.kept.name }));
    showStorageStatus();
  }

  // keepOther puts the other tab's project on screen; "Bring it back" still offers this tab's.
  function keepOther() {
    const c = closeConflict();
    if (!c) return;
    store.revision = c.other.revision;
    replaceProject(c.other.project, "You kept the version saved in the other tab.");
    store.storedKey = projectKey(state.project);
    state.savedAt = c.other.project.savedAt || "";
    queued(() => callAsync("dropKept", { name: c.kept.name }));
    dropDraft(); // this tab's typing is not to come back over the version the user kept
    showStorageStatus();
  }

  function exportThis(p) {
    const r = call("exportProject", { project: p });
    if (isError(r)) return showGeneralError(`Not exported: ${r.error}`);
    Plot.download(new Blob([r.json], { type: "application/json" }), r.filename);
  }

  // showKept lists the copies set aside, each to download or delete; a conflict copy can also be
  // opened in place of the project on screen.
  function showKept(list) {
    const items = list.map((k) => {
      const li = document.createElement("li");
      const when = k.time ? ` on ${new Date(k.time).toLocaleDateString()} at ${clockTime(k.time)}` : "";
      const text = k.kind === "conflict"
        ? `A version kept aside when two tabs saved this project (a conflict copy)${when}.`
        : `A saved copy that could not be read (damaged), set aside${when}, ${k.size} bytes.`;
      const fetchCopy = async (then) => {
        const r = await queued(() => callAsync("keptCopy", { name: k.name }));
        if (isError(r)) return showGeneralError(`The kept copy could not be read: ${r.error}`);
        then(r);
      };
      li.append(document.createTextNode(text + " "));
      if (k.kind === "conflict") {
        li.append(button("Open it", () => fetchCopy((r) => {
          if (r.project) replaceProject(r.project, "The kept version is open.");
        })), " ");
      }
      li.append(button("Download", () => fetchCopy((r) => Plot.download(new Blob([r.bytes], { type: "application/octet-stream" }), r.filename))), " ");
      li.append(button("Delete", async () => {
        const r = await queued(() => callAsync("dropKept", { name: k.name }));
        if (isError(r)) return showGeneralError(`The kept copy was not deleted: ${r.error}`);
        li.remove();
        $("#kept-bar").hidden = !$("#kept-list").children.length;
      }));
      li.dataset.kept = k.name;
      return li;
    });
    $("#kept-list").replaceChildren(...items);
    $("#kept-bar").hidden = items.length === 0;
  }

  // tabName is this tab's name for its draft, kept in sessionStorage so that it survives a reload.
  function tabName() {
    let id = "";
    try { id = sessionStorage.getItem("copoly-tab") || ""; } catch (e) { /* no sessionStorage: a name per load */ }
    if (!/^[A-Za-z0-9_-]{1,64}$/.test(id)) {
      const a = crypto.getRandomValues(new Uint32Array(2));
      id = "t" + a[0].toString(36) + a[1].toString(36);
      try { sessionStorage.setItem("copoly-tab", id); } catch (e) { /* as above */ }
    }
    return id;
  }

  function draftTyped() {
    $("#draft-bar").hidden = true; // typing on accepts the restored text
    store.edits++;
    store.draftDirty = true;
    clearTimeout(store.draftTimer);
    store.draftTimer = setTimeout(flushDraft, DRAFT_DELAY_MS);
  }

  // flushDraft saves the form as typed, if it changed since the last draft: into browser storage
  // through copoly, and at once into sessionStorage. The second copy matters when the tab is
  // reloaded or closed: the page then stops before an IndexedDB write started in "pagehide" can
  // finish, while sessionStorage is written before the handler returns and survives a reload.
  function flushDraft() {
    clearTimeout(store.draftTimer);
    if (!store.draftDirty || !engine || engineStopped || !store.tab) return;
    store.draftDirty = false;
    const fields = {};
    for (const sel of DRAFT_INPUTS) fields[sel.slice(1)] = $(sel).value;
    const basedOn = store.revision;
    try {
      sessionStorage.setItem(DRAFT_COPY, JSON.stringify({ savedAt: new Date().toISOString(), basedOn, fields }));
    } catch (e) { /* no sessionStorage: the stored draft alone */ }
    queued(() => callAsync("saveDraft", { tab: store.tab, fields, basedOn }));
  }

  // dropDraft removes this tab's draft once the stored project holds it all. The sessionStorage
  // copy becomes an empty draft of now, which outranks the stored draft should the page be
  // reloaded before copoly has removed that one.
  function dropDraft() {
    clearTimeout(store.draftTimer);
    store.draftDirty = false;
    try {
      sessionStorage.setItem(DRAFT_COPY, JSON.stringify({ savedAt: new Date().toISOString(), basedOn: store.revision, fields: {} }));
    } catch (e) { /* no sessionStorage: the stored draft alone */ }
    queued(() => callAsync("dropDraft", { tab: store.tab }));
  }

  // draftCopy is the sessionStorage copy of this tab's draft, or undefined.
  function draftCopy() {
    try {
      const d = JSON.parse(sessionStorage.getItem(DRAFT_COPY) || "null");
      return d && typeof d === "object" ? d : undefined;
    } catch (e) {
      return undefined;
    }
  }

  // restoreDraft puts a draft newer than the stored project back into the form; it reports
  // whether any text differed from what the project fills in.
  function restoreDraft(draft) {
    if (!draft || !draft.fields) return false;
    let changed = false;
    for (const sel of DRAFT_INPUTS) {
      const text = draft.fields[sel.slice(1)];
      if (typeof text !== "string" || $(sel).value === text) continue;
      if (sel === "#model-kind" && !MODEL_NAME[text]) continue;
      $(sel).value = text;
      if (sel === "#r1" || sel === "#r2") state.formJcr = null;
      changed = true;
    }
    if (!changed) return false;
    showModelFields();
    setText("#draft-text", `What you were typing at ${clockTime(draft.savedAt)} is back in the form: the page was closed or reloaded before all of it was saved.`);
    $("#draft-bar").hidden = false;
    return true;
  }

  function discardDraft() {
    $("#draft-bar").hidden = true;
    if (store.loaded) {
      fillForm(store.loaded);
      recompute();
    }
    dropDraft();
  }

  function wireStorage() {
    for (const sel of DRAFT_INPUTS) $(sel).addEventListener("input", draftTyped);
    $("#model-kind").addEventListener("change", draftTyped);
    document.addEventListener("visibilitychange", () => { if (document.visibilityState === "hidden") flushDraft(); });
    window.addEventListener("pagehide", flushDraft);
    $("#conflict-keep-mine").addEventListener("click", keepMine);
    $("#conflict-keep-other").addEventListener("click", keepOther);
    $("#conflict-export-mine").addEventListener("click", () => { if (state.project) exportThis(state.project); });
    $("#conflict-export-other").addEventListener("click", () => { if (store.conflict) exportThis(store.conflict.other.project); });
    $("#draft-discard").addEventListener("click", discardDraft);
  }

  // updateBadge shows the demo badge for the invented demo and refreshes the print copies of
  // the long text fields, which a printed input box would cut off.
  function updateBadge() {
    const p = state.project;
    $("#demo-badge").hidden = !(p && p.invented);
    $("#print-demo").hidden = !(p && p.invented);
    setText("#project-name-print", p ? p.name : "");
    setText("#ratio-source-print", p ? p.ratioSource : "");
  }

  // replaceProject puts p on screen (after the caller validated it), keeping the old project for
  // "Bring it back".
  function replaceProject(p, why) {
    if (state.project) {
      state.previous = state.project;
      setText("#undo-text", `${why} Your previous project “${state.previous.name || "untitled"}” was replaced.`);
      $("#undo-bar").hidden = false;
    }
    state.project = p;
    fillForm(p);
    updateBadge();
    recompute();
    dropBenchUndo();
    loadBench();
    loadPlanPanel(p);
    loadExtra(p);
  }

  // ---- Drawing ------------------------------------------------------------------------------

  function mountFigure(id, svg, name, csvRows) {
    const fig = document.getElementById(id);
    const area = fig.querySelector(".plot-area");
    area.replaceChildren(svg);
    fig.querySelector("figcaption").hidden = false;
    const actions = fig.querySelector(".plot-actions");
    const base = `${slug(state.project ? state.project.name : "")}-${name}`;
    // Every figure has the same three buttons: their names say which chart they save.
    const chartName = svg.getAttribute("aria-label") || name;
    const named = (b) => { b.setAttribute("aria-label", `${b.textContent}: ${chartName}`); return b; };
    actions.replaceChildren(
      named(button("Save SVG", () => Plot.saveSVG(svg, base + ".svg"))),
      named(button("Save PNG", () => Plot.savePNG(svg, base + ".png").catch((e) => showGeneralError(`PNG not saved: ${e.message}`)))),
      ...(csvRows ? [named(button("Save data (CSV)", () => Plot.saveCSV(csvRows, base + ".csv")))] : []),
    );
  }

  function button(text, onClick) {
    const b = document.createElement("button");
    b.type = "button";
    b.textContent = text;
    b.addEventListener("click", onClick);
    return b;
  }

  const linspace = (a, b, n) => Array.from({ length: n }, (_, i) => (i === n - 1 ? b : a + ((b - a) * i) / (n - 1)));

  // drawAll computes and draws every section for project p; it returns the input errors met.
  // A section whose call fails keeps its previous drawing.
  function drawAll(p) {
    const errors = [];
    const fail = (r) => errors.push({ input: inputForField(r.field), message: r.error });
    const ratios = modelArgs(p);

    const comp = call("composition", { ...ratios, f1: linspace(0, 1, COMPOSITION_POINTS) });
    const X = linspace(0, p.conversion, DRIFT_POINTS);
    const driftArgs = { ...ratios, f10: p.f10, conversion: X, tolerance: p.tolerance };
    if (p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0) {
      driftArgs.molarMass1 = p.monomer1.molarMass;
      driftArgs.molarMass2 = p.monomer2.molarMass;
    }
    let drift = null;
    if (p.conversion > 0) {
      drift = call("drift", driftArgs);
      if (isError(drift)) { fail(drift); drift = null; }
    } else {
      errors.push({ input: $("#conversion"), message: "final conversion = 0: enter a conversion above 0 to follow the drift." });
    }
    const seqArgs = { ...ratios, f1: p.f10, maxLength: RUN_LENGTH_MAX };
    if (p.conversion > 0) seqArgs.conversion = p.conversion;
    const seq = call("sequence", seqArgs);
    const chains = call("chains", { ...ratios, f10: p.f10, count: CHAIN_COUNT, length: CHAIN_LENGTH, seed: state.seed });
    const kind = modelKind(p);
    document.querySelectorAll(".model-note").forEach((n) => {
      n.hidden = kind === "terminal";
      n.textContent = n.hidden ? "" : `With the ${MODEL_NAME[kind]} of step 4: ${MODEL_RATIOS.filter((r) => r[1] === kind).map(([k]) => `${k} = ${shortNum(ratios[k])}`).join(", ")}${kind === "implicit" ? `, r1 = ${shortNum(p.r1)}, r2 = ${shortNum(p.r2)}` : ""}.`;
    });
    setText("#seq-caption", `Sequence statistics (${MODEL_NAME[kind]})`);
    setText("#fig-chains-caption", `Sample chains drawn at random with the ${MODEL_NAME[kind]} at the starting feed; a picture of typical sequences, not of a real sample.`);

    if (isError(comp)) fail(comp); else drawComposition(p, comp, drift);
    if (drift) drawDrift(p, drift);
    if (isError(seq)) fail(seq); else drawSequence(p, seq);
    if (isError(chains)) fail(chains); else drawChains(p, chains);
    drawLibraryNotes(p);
    drawJcrNote(p);
    if (!errors.length) drawFeedFor(p);
    return errors;
  }

  function drawComposition(p, comp, drift) {
    const f1 = linspace(0, 1, COMPOSITION_POINTS);
    const cl = comp.classification;
    setText("#out-azeotrope", !cl ? TERMINAL_ONLY : comp.azeotrope === null || comp.azeotrope === undefined ? "none" : fix(comp.azeotrope, 3));
    setText("#out-product", cl ? sig3(cl.product) : TERMINAL_ONLY);
    setText("#out-class", cl ? cl.text : "The crossings of the curve with the diagonal are the azeotropes of this model.");
    const layers = [
      { type: "line", x: [0, 1], y: [0, 1], color: C.diag, width: 1.5, dash: "5 5", role: "diagonal" },
      { type: "line", x: f1, y: comp.F1, color: C.inst, width: 3, role: "F1" },
    ];
    const legend = [
      { label: cl ? "F1 (Mayo–Lewis)" : `F1 (${MODEL_NAME[modelKind(p)]})`, color: C.inst },
      { label: "F1 = f1", color: C.diag, dash: "5 5", width: 1.5 },
    ];
    if (drift) {
      layers.push({ type: "point", x: p.f10, y: drift.F1[0], color: C.feed, shape: "circle", r: 5 });
      legend.push({ label: `starting feed f1 = ${fix(p.f10, 3)}`, color: C.feed, kind: "point" });
    }
    if (comp.azeotrope !== null && comp.azeotrope !== undefined) {
      layers.push({ type: "point", x: comp.azeotrope, y: comp.azeotrope, color: C.azeo, shape: "diamond",
        text: `azeotrope ${fix(comp.azeotrope, 3)}`, anchor: comp.azeotrope < 0.6 ? "start" : "end" });
      legend.push({ label: "azeotrope", color: C.azeo, kind: "point", shape: "diamond" });
    }
    const svg = Plot.chart({
      title: `Copolymer composition: ${m1Name(p)} (M1) with ${m2Name(p)} (M2)`,
      width: 600, height: 470,
      x: { min: 0, max: 1, label: "f1, mole fraction of M1 in the feed", ticks: 10 },
      y: { min: 0, max: 1, label: "F1, mole fraction of M1 in the copolymer", ticks: 10 },
      layers, legend,
    });
    const rows = [["f1", "F1"], ...f1.map((v, i) => [v, comp.F1[i]])];
    mountFigure("fig-composition", svg, "composition", rows);
  }

  function drawFeedFor(p) {
    const input = $("#target-F1");
    clearFieldError(input);
    const raw = input.value;
    const target = parseNumber(raw);
    if (modelKind(p) !== "terminal") {
      setText("#out-feed", `Feed for a target: ${TERMINAL_ONLY}.`);
      return setText("#out-feed-note", "Choose the terminal model in step 4 to work out the feed from r1 and r2.");
    }
    if (raw.trim() === "" || Number.isNaN(target)) {
      setFieldError(input, raw.trim() === "" ? "Enter the wanted F1." : `wanted F1 = “${raw.trim()}” is not a number.`);
      return;
    }
    const r = call("feedFor", { r1: p.r1, r2: p.r2, targetF1: target });
    if (isError(r)) {
      setFieldError(inputForField(r.field) || input, r.error);
      return;
    }
    let answer;
    if (!r.feeds.length) answer = "No feed gives this copolymer.";
    else if (r.feeds.length === 1) answer = `Feed f1 = ${fix(r.feeds[0], 3)}`;
    else answer = `Feeds f1 = ${r.feeds.map((v) => fix(v, 3)).join(" or ")}`;
    setText("#out-feed", answer);
    const rangeText = r.range ? ` Reachable F1 with this pair: ${fix(r.range[0], 3)} to ${fix(r.range[1], 3)}.` : "";
    setText("#out-feed-note", (r.note || "") + rangeText);
  }

  const METHOD_TEXT = {
    "meyer-lowry": "Drift from the Meyer–Lowry integrated equation.",
    "skeist-ode": "Drift from numerical integration of the Skeist equation.",
    "no-drift": "No drift: the feed and the copolymer have the same composition throughout.",
  };

  function drawDrift(p, d) {
    const lim = d.limit ? d.limit.conversion : 2;
    const final = d.conversion[d.conversion.length - 1];
    setText("#out-limit", d.limit ? pct(lim) : TERMINAL_ONLY);
    const F10 = d.F1[0];
    setText("#out-limit-note", !d.limit ? "" : lim >= 1
      ? `F1cum stays within ${fix(F10, 3)} ± ${shortNum(d.limit.tolerance)} all the way to full conversion.`
      : `F1cum stays within ${fix(F10, 3)} ± ${shortNum(d.limit.tolerance)} up to X = ${fix(lim, 3)}.` +
        (lim > final ? " That is beyond the final conversion chosen." : ""));
    setText("#out-method", METHOD_TEXT[d.method] || `Method: ${d.method}.`);
    if (d.conversionMass && d.conversionMass.length) {
      setText("#out-mass-conversion", `Mass conversion at X = ${fix(final, 3)}: ${fix(d.conversionMass[d.conversionMass.length - 1], 3)} (from the molar masses).`);
    } else {
      setText("#out-mass-conversion", "Give both molar masses to see the mass conversion and a by-mass distribution.");
    }
    const ex = $("#out-exhausted");
    if (d.exhausted) {
      const name = d.exhausted.monomer === 1 ? m1Name(p) : m2Name(p);
      const other = d.exhausted.monomer === 1 ? m2Name(p) : m1Name(p);
      ex.textContent = `M${d.exhausted.monomer} (${name}) is practically used up at X = ${fix(d.exhausted.conversion, 3)}: ` +
        `its mole fraction in the remaining monomer falls below 10⁻⁶. Polymer made after that point is almost pure ${other}.`;
      ex.hidden = false;
    } else {
      ex.hidden = true;
      ex.textContent = "";
    }

    const tol = d.limit ? d.limit.tolerance : p.tolerance;
    const layers = [
      { type: "band", y0: F10 - tol, y1: F10 + tol, color: C.band, opacity: 0.25 },
      { type: "line", x: d.conversion, y: d.f1, color: C.feed, width: 2.2, dash: "7 4" },
      { type: "line", x: d.conversion, y: d.F1, color: C.inst, width: 2.6 },
      { type: "line", x: d.conversion, y: d.F1cum, color: C.cum, width: 2.6 },
    ];
    if (lim < final) layers.push({ type: "vline", x: lim, color: C.limit, text: `limit X = ${fix(lim, 3)}` });
    if (d.exhausted && d.exhausted.conversion <= final) {
      layers.push({ type: "vline", x: d.exhausted.conversion, color: C.feed, dash: "2 3", text: `M${d.exhausted.monomer} used up` });
    }
    const yr = Plot.range([...d.f1, ...d.F1, ...d.F1cum, F10 - tol, F10 + tol], { floor: 0, ceil: 1, minSpan: 0.05 });
    const svg = Plot.chart({
      title: `Drift from f10 = ${fix(p.f10, 3)} to X = ${fix(final, 3)}`,
      width: 600, height: 430,
      x: { min: 0, max: final, label: "X, overall molar conversion" },
      y: { min: yr[0], max: yr[1], label: "mole fraction of M1" },
      layers,
      legend: [
        { label: "feed f1", color: C.feed, dash: "7 4" },
        { label: "copolymer F1 (now)", color: C.inst },
        { label: "copolymer F1cum (so far)", color: C.cum },
        { label: `F1(f10) ± ${shortNum(tol)}`, color: C.band, kind: "box", opacity: 0.35 },
        ...(lim < final ? [{ label: "conversion limit", color: C.limit, dash: "6 4" }] : []),
      ],
    });
    const rows = [["X", ...(d.conversionMass ? ["mass conversion"] : []), "f1", "F1", "F1cum"],
      ...d.conversion.map((x, i) => [x, ...(d.conversionMass ? [d.conversionMass[i]] : []), d.f1[i], d.F1[i], d.F1cum[i]])];
    mountFigure("fig-drift", svg, "drift", rows);

    const h = d.distribution;
    if (!h) return figNote("fig-distribution", `Composition distribution: ${TERMINAL_ONLY}.`);
    const n = h.weights.length;
    const lo = h.edges[0], hi = h.edges[n];
    const basis = h.basis === "mass" ? "mass" : "moles";
    const hsvg = Plot.chart({
      title: `Composition distribution of the polymer up to X = ${fix(final, 3)}`,
      width: 600, height: 340,
      x: { min: lo, max: hi > lo ? hi : lo + 1e-3, label: "F1 of the polymer made", ticks: 6 },
      y: { min: 0, max: Math.max(...h.weights, 1e-9) * 1.1, label: `fraction of polymer (by ${basis})` },
      layers: [{ type: "bars", x0: h.edges.slice(0, n), x1: h.edges.slice(1), y: h.weights, color: C.inst }],
    });
    const hrows = [["F1 from", "F1 to", `fraction by ${basis}`], ...h.weights.map((w, i) => [h.edges[i], h.edges[i + 1], w])];
    mountFigure("fig-distribution", hsvg, "distribution", hrows);
  }

  // SEQ_ROWS: [data-stat, label, getter]. The data-stat names are stable (the browser test uses them).
  const SEQ_ROWS = [
    ["F1", "copolymer F1", (s) => s.F1],
    ["p11", "p11: M1 end adds M1", (s) => s.p11],
    ["p12", "p12: M1 end adds M2", (s) => s.p12],
    ["p21", "p21: M2 end adds M1", (s) => s.p21],
    ["p22", "p22: M2 end adds M2", (s) => s.p22],
    ["dyad11", "dyad 11", (s) => s.dyads["11"]],
    ["dyad12", "dyad 12 (+21)", (s) => s.dyads["12"]],
    ["dyad22", "dyad 22", (s) => s.dyads["22"]],
    ["triad111", "triad 111", (s) => s.triads["111"]],
    ["triad112", "triad 112 (+211)", (s) => s.triads["112"]],
    ["triad212", "triad 212", (s) => s.triads["212"]],
    ["triad222", "triad 222", (s) => s.triads["222"]],
    ["triad221", "triad 221 (+122)", (s) => s.triads["221"]],
    ["triad121", "triad 121", (s) => s.triads["121"]],
    ["meanLength1", "mean M1 run length", (s) => s.meanLength1],
    ["meanLength2", "mean M2 run length", (s) => s.meanLength2],
    ["runNumber", "run number (per 100 units)", (s) => s.runNumber],
    ["randomness", "randomness p12 + p21", (s) => s.randomness],
  ];
  const SEQ_GROUPS = { p11: "Addition probabilities", dyad11: "Dyads (sum 1)", triad111: "Triads centred on M1 (sum 1)",
    triad222: "Triads centred on M2 (sum 1)", meanLength1: "Runs" };

  function drawSequence(p, s) {
    const batch = s.batch || null;
    setText("#seq-col-feed", `At feed f1 = ${fix(p.f10, 3)}`);
    setText("#seq-col-batch", batch ? `Batch to X = ${fix(batch.conversion, 3)}` : `Batch: ${TERMINAL_ONLY}`);
    const body = document.createElement("tbody");
    const csv = [["statistic", `at feed f1 = ${p.f10}`, batch ? `batch average to X = ${batch.conversion}` : "batch average"]];
    for (const [key, label, get] of SEQ_ROWS) {
      if (SEQ_GROUPS[key]) {
        const tr = document.createElement("tr");
        tr.className = "group";
        const th = document.createElement("th");
        th.colSpan = 3;
        th.scope = "colgroup";
        th.textContent = SEQ_GROUPS[key];
        tr.append(th);
        body.append(tr);
      }
      const tr = document.createElement("tr");
      const th = document.createElement("th");
      th.scope = "row";
      th.textContent = label;
      tr.append(th);
      const feedVal = get(s);
      const batchVal = batch ? get(batch) : NaN;
      for (const [v, col] of [[feedVal, "feed"], [batchVal, "batch"]]) {
        const td = document.createElement("td");
        if (col === "feed" || batch) {
          td.dataset.stat = key;
          td.dataset.col = col;
        }
        td.textContent = fix(v, 4);
        tr.append(td);
      }
      body.append(tr);
      csv.push([label, feedVal, batch ? batchVal : ""]);
    }
    $("#seq-table tbody").replaceWith(body);
    const base = slug(p.name) + "-sequence";
    $("#seq-actions").replaceChildren(button("Save table (CSV)", () => Plot.saveCSV(csv, base + ".csv")));

    const rl = s.runLengths;
    if (!rl) return figNote("fig-runs", `Run-length distributions: ${TERMINAL_ONLY}.`);
    const w = 0.38;
    const top = Math.max(...rl.number1, ...rl.number2, 1e-9);
    const svg = Plot.chart({
      title: `Run lengths at f1 = ${fix(p.f10, 3)}`,
      width: 600, height: 340,
      x: { min: 0.4, max: rl.length.length + 0.6, label: "run length n (units)", integer: true },
      y: { min: 0, max: Math.min(1, top * 1.12), label: "number fraction of runs" },
      layers: [
        { type: "bars", x0: rl.length.map((n) => n - w), x1: rl.length.map((n) => n), y: rl.number1, color: C.m1 },
        { type: "bars", x0: rl.length.map((n) => n), x1: rl.length.map((n) => n + w), y: rl.number2, color: C.m2 },
      ],
      legend: [
        { label: `M1 runs (${m1Name(p)})`, color: C.m1, kind: "box" },
        { label: `M2 runs (${m2Name(p)})`, color: C.m2, kind: "box" },
      ],
    });
    const rows = [["run length", "M1 number fraction", "M1 weight fraction", "M2 number fraction", "M2 weight fraction"],
      ...rl.length.map((n, i) => [n, rl.number1[i], rl.weight1[i], rl.number2[i], rl.weight2[i]])];
    mountFigure("fig-runs", svg, "run-lengths", rows);
  }

  // figNote puts a note in place of a figure's chart.
  function figNote(id, text) {
    const fig = document.getElementById(id);
    const note = document.createElement("p");
    note.className = "hint";
    note.textContent = text;
    fig.querySelector(".plot-area").replaceChildren(note);
    fig.querySelector(".plot-actions").replaceChildren();
    fig.querySelector("figcaption").hidden = true;
  }

  function drawChains(p, c) {
    const svg = Plot.strips({
      title: `${c.samples.length} sample chains of ${CHAIN_LENGTH} units at f1 = ${fix(p.f10, 3)}`,
      width: 600,
      chains: c.samples,
      colors: [C.m1, C.m2],
      xLabel: "unit along the chain",
      legend: [
        { label: `M1 (${m1Name(p)})`, color: C.m1, kind: "box" },
        { label: `M2 (${m2Name(p)})`, color: C.m2, kind: "box" },
      ],
    });
    const rows = [["chain", "sequence (1 = M1, 2 = M2)"], ...c.samples.map((s, i) => [i + 1, s])];
    mountFigure("fig-chains", svg, "chains", rows);
    const actions = document.querySelector("#fig-chains .plot-actions");
    actions.append(button("Draw other chains", () => { state.seed++; recompute(); }));
  }

  // ---- Bench data -----------------------------------------------------------------------------
  //
  // The grid is state.project.bench (BenchTable in site/copoly.d.ts): the text of every cell as
  // typed, saved with the project after every edit. copoly.benchRuns converts it; a cell it
  // cannot read is marked in its row and never stops the other rows, or the saving, from going on.

  const FIT_DELAY_MS = 250;
  const MIN_FIT_RUNS = 3;
  const MAX_ROWS = 1000;             // rows in the grid (the project file's limit)
  const CELL_MAX = 200;              // characters in a cell or a label (the project file's limit)
  const TABLE_MAX_BYTES = 1 << 20;   // the largest table file read (the table reader's limit)
  // The linear methods treat each sample as made from its starting feed; above 10 % conversion
  // that is usually no longer true (common practice, no source).
  const LINEAR_LIMIT = 0.10;
  const DEFAULT_LEVEL = 0.95;

  const bench = {
    started: false,   // the estimation section has been drawn once
    columns: [],      // cell keys of the current entry forms
    result: null,     // the last BenchResult
    good: [],         // the converted runs, in table order, and
    rowOf: [],        // the table row of each
    massKey: "",      // the molar masses the last conversion used
    fit: null,        // the last FitResult, and the runs and rows it was made from
    fitRuns: [],
    fitRowOf: [],
    fitKey: "",
    fitTimer: 0,
    drawnRatios: "",  // r1, r2 in use when the fit plots were drawn
    undo: null,       // {bench, text}: the grid before the last removal or paste
  };

  const emptyBench = () => ({ feedKind: "fraction", conversionKind: "none", compositionKind: "fraction",
    element: "", carrier: 1, elementCount: 0, rows: [] });
  const copyBench = (b) => JSON.parse(JSON.stringify(b));

  // theBench returns the project's grid, giving the project an empty one when it has none.
  function theBench() {
    const p = state.project;
    if (!p.bench) p.bench = emptyBench();
    const b = p.bench;
    if (!Array.isArray(b.rows)) b.rows = [];
    for (const r of b.rows) if (!r.cells) r.cells = {};
    return b;
  }

  // columnInfo is the heading and unit of a cell key.
  function columnInfo(key, b) {
    const el = b.element || "element";
    switch (key) {
      case "f10": return ["f10", "mole fraction of M1"];
      case "mass1": return ["M1", "g charged"];
      case "mass2": return ["M2", "g charged"];
      case "moles1": return ["M1", "mol charged"];
      case "moles2": return ["M2", "mol charged"];
      case "conversion": return b.conversionKind === "mass" ? ["w", "polymer/monomer mass"] : ["X", "molar conversion"];
      case "F1": return ["F1", "mole fraction of M1"];
      case "massFraction1": return ["w1", "mass fraction of M1"];
      case "integral1": return ["I1", "M1 signal integral"];
      case "protons1": return ["H1", "protons per M1 unit"];
      case "integral2": return ["I2", "M2 signal integral"];
      case "protons2": return ["H2", "protons per M2 unit"];
      case "elementPercent": return [`${el} %`, "mass %"];
      case "sF": return ["sF", "optional"];
      case "sX": return ["sX", "optional"];
      case "sf": return ["sf", "optional"];
    }
    return [key, ""];
  }

  const FORM_HINTS = {
    mass: "Masses charged are converted with the molar masses of step 1.",
    moles: "",
    massConversion: "A gravimetric conversion is turned into a molar one with the molar masses of step 1.",
    massFraction: "A mass fraction is converted with the molar masses of step 1.",
    nmr: "For each monomer give the integral of one signal of its units and the number of protons behind that signal (for example 5 for the aromatic protons of styrene, 3 for an OCH3).",
    element: "Give the element's mass percentage in the copolymer; the molar masses of step 1 convert it.",
  };

  // fillBenchForms shows the grid's entry forms in the selects above it.
  function fillBenchForms(b) {
    $("#bench-feed-kind").value = b.feedKind || "fraction";
    $("#bench-conversion-kind").value = b.conversionKind || "none";
    $("#bench-composition-kind").value = b.compositionKind || "fraction";
    $("#bench-element").value = b.element || "";
    $("#bench-carrier").value = b.carrier === 2 ? "2" : "1";
    $("#bench-element-count").value = b.elementCount > 0 ? shortNum(b.elementCount) : "";
    clearFieldError($("#bench-element-count"));
    $("#bench-element-row").hidden = b.compositionKind !== "element";
    const hints = [];
    if (b.feedKind === "mass") hints.push(FORM_HINTS.mass);
    if (b.conversionKind === "mass") hints.push(FORM_HINTS.massConversion);
    if (FORM_HINTS[b.compositionKind]) hints.push(FORM_HINTS[b.compositionKind]);
    setText("#bench-forms-hint", hints.join(" "));
  }

  // loadBench puts the project's grid on screen from scratch (a new project, a paste, an undo).
  function loadBench() {
    if (!bench.started || !state.project) return;
    const b = theBench();
    fillBenchForms(b);
    refreshBench(true);
  }

  // benchArgs is the argument of copoly.benchRuns; the molar masses go along when both are known.
  function benchArgs(b) {
    const a = { bench: b };
    const p = state.project;
    if (p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0) {
      a.molarMass1 = p.monomer1.molarMass;
      a.molarMass2 = p.monomer2.molarMass;
    }
    return a;
  }

  // refreshBench converts the grid and shows the outcome; rebuild redraws the grid's inputs too
  // (after a change of rows or of entry forms), otherwise only what they convert to.
  function refreshBench(rebuild) {
    const b = theBench();
    const args = benchArgs(b);
    bench.massKey = `${args.molarMass1 || 0}/${args.molarMass2 || 0}`;
    const r = call("benchRuns", args);
    const box = $("#bench-error");
    if (isError(r)) {
      box.textContent = `The table cannot be converted: ${sentence(r.error)}`;
      box.hidden = false;
      bench.result = null;
      bench.good = [];
      bench.rowOf = [];
      if (rebuild || !bench.columns.length) buildGrid(b, bench.columns.length ? bench.columns : ["f10", "F1"]);
      showBenchStatus(b, null);
      scheduleFit();
      return;
    }
    box.hidden = true;
    const colsChanged = (r.columns || []).join() !== bench.columns.join();
    bench.columns = r.columns || [];
    if (rebuild || colsChanged) buildGrid(b, bench.columns);
    bench.result = r;
    bench.good = [];
    bench.rowOf = [];
    (r.runs || []).forEach((run, i) => {
      if (run) { bench.good.push(run); bench.rowOf.push(i); }
    });
    applyBenchResult(b, r);
    showBenchStatus(b, r);
    scheduleFit();
  }

  const cellId = (i, key) => `bench-r${i}-${key}`;

  // emptyGridRow is the one row of an editable grid with no rows: text across its width.
  function emptyGridRow(width, text) {
    const tr = document.createElement("tr");
    const td = document.createElement("td");
    td.colSpan = width;
    td.className = "empty-grid";
    td.textContent = text;
    tr.append(td);
    return tr;
  }

  // gridRow starts row i of an editable grid with its number as the row header.
  function gridRow(i) {
    const tr = document.createElement("tr");
    tr.dataset.row = String(i);
    const num = document.createElement("th");
    num.scope = "row";
    num.className = "row-num";
    num.textContent = String(i + 1);
    tr.append(num);
    return tr;
  }

  // buildGrid draws the grid: a row number, the label, the typed cells, the converted values
  // and a delete button per row, and under each row a line for its message.
  function buildGrid(b, cols) {
    const head1 = document.createElement("tr");
    const head2 = document.createElement("tr");
    const th = (text, attrs) => {
      const e = document.createElement("th");
      e.scope = "col";
      if (Array.isArray(text)) {
        e.append(text[0]);
        if (text[1]) {
          const u = document.createElement("span");
          u.className = "col-unit";
          u.textContent = text[1];
          e.append(u);
        }
      } else e.textContent = text;
      Object.assign(e, attrs || {});
      return e;
    };
    head1.append(th("", { colSpan: 2 }), th("As typed", { colSpan: cols.length, scope: "colgroup", className: "group-typed" }),
      th("Converted", { colSpan: 3, scope: "colgroup", className: "group-conv" }), th(""));
    head2.append(th("Row"), th(["Sample", "label"]), ...cols.map((k) => th(columnInfo(k, b))),
      th(["f10", "feed"], { className: "conv" }), th(["X", "molar"], { className: "conv" }), th(["F1", "copolymer"], { className: "conv" }),
      th(""));
    const thead = document.createElement("thead");
    thead.append(head1, head2);
    const tbody = document.createElement("tbody");
    const width = cols.length + 6;
    if (!b.rows.length) tbody.append(emptyGridRow(width, "No runs yet. Add a row, or paste rows from a spreadsheet below."));
    b.rows.forEach((row, i) => {
      const tr = gridRow(i);
      const cellInput = (key, value, label) => {
        const td = document.createElement("td");
        const input = document.createElement("input");
        input.type = "text";
        input.id = cellId(i, key);
        input.value = value || "";
        input.maxLength = CELL_MAX;
        input.autocomplete = "off";
        input.spellcheck = false;
        input.dataset.row = String(i);
        input.dataset.key = key;
        if (key !== "label") input.inputMode = "decimal";
        input.className = key === "label" ? "cell label-cell" : "cell";
        input.setAttribute("aria-label", `row ${i + 1}, ${label}`);
        input.addEventListener("input", onCellInput);
        td.append(input);
        return td;
      };
      tr.append(cellInput("label", row.label, "sample label"));
      for (const k of cols) tr.append(cellInput(k, row.cells[k], columnInfo(k, b).join(", ")));
      for (const k of ["f10", "X", "F1"]) {
        const td = document.createElement("td");
        td.className = "conv";
        td.dataset.conv = k;
        td.textContent = "";
        tr.append(td);
      }
      const act = document.createElement("td");
      const del = button("Delete", () => deleteRow(i));
      del.className = "row-delete";
      del.setAttribute("aria-label", `Delete row ${i + 1}`);
      act.append(del);
      tr.append(act);
      const msgRow = document.createElement("tr");
      msgRow.className = "row-msg";
      msgRow.hidden = true;
      const msg = document.createElement("td");
      msg.colSpan = width;
      msg.id = `bench-msg-${i}`;
      msgRow.append(msg);
      tbody.append(tr, msgRow);
    });
    $("#bench-table thead").replaceWith(thead);
    $("#bench-table tbody").replaceWith(tbody);
    $("#bench-add-row").disabled = b.rows.length >= MAX_ROWS;
  }

  // cellOfField returns the grid input named by an error field such as "runs[3].f10".
  function cellOfField(field) {
    const m = /^runs\[(\d+)\]\.([A-Za-z0-9]+)$/.exec(field || "");
    return m ? document.getElementById(cellId(Number(m[1]), m[2])) : null;
  }

  // applyBenchResult shows, row by row, the converted values and the row's problem.
  function applyBenchResult(b, r) {
    const warnRows = new Map();
    for (const w of r.warnings || []) {
      if (w.row >= 0) warnRows.set(w.row, (warnRows.get(w.row) || []).concat(w.message));
    }
    b.rows.forEach((row, i) => {
      const tr = document.querySelector(`#bench-table tr[data-row="${i}"]`);
      if (!tr) return;
      tr.querySelectorAll("input").forEach((inp) => { inp.removeAttribute("aria-invalid"); inp.removeAttribute("aria-describedby"); });
      const run = r.runs ? r.runs[i] : null;
      const err = r.errors ? r.errors[i] : null;
      const conv = { f10: run ? fix(run.f10, 4) : "", X: run ? (run.conversion > 0 ? fix(run.conversion, 4) : "low") : "", F1: run ? fix(run.F1, 4) : "" };
      tr.querySelectorAll("td.conv").forEach((td) => { td.textContent = conv[td.dataset.conv]; });
      const msgCell = document.getElementById(`bench-msg-${i}`);
      const msgRow = msgCell.parentElement;
      msgRow.className = "row-msg";
      tr.classList.remove("row-bad", "row-warn", "row-pending");
      let text = "";
      if (err) {
        const input = cellOfField(err.field);
        const pending = input && input.value.trim() === "";
        const said = err.error.replace(/^runs\[\d+\]\.?/, "").replace(/^:\s*/, "");
        text = pending ? `Not used yet: fill in ${columnInfo(input.dataset.key, b)[0]}.`
          : sentence(/\brow \d+/i.test(said) ? said : `Row ${i + 1}: ${said}`);
        if (input) {
          input.setAttribute("aria-invalid", "true");
          input.setAttribute("aria-describedby", msgCell.id);
        }
        tr.classList.add(pending ? "row-pending" : "row-bad");
        msgRow.classList.add(pending ? "pending" : "bad");
      } else if (warnRows.has(i)) {
        text = warnRows.get(i).map(sentence).join(" ");
        tr.classList.add("row-warn");
        msgRow.classList.add("warn");
      }
      msgCell.textContent = text;
      msgRow.hidden = !text;
    });
    const list = $("#bench-warnings");
    const items = (r.warnings || []).map((w) => w.message);
    const high = bench.good.filter((run) => run.conversion > LINEAR_LIMIT).length;
    if (high) {
      items.push(`${high} of ${bench.good.length} runs are above ${LINEAR_LIMIT * 100} % conversion. The linear methods (Fineman–Ross, Kelen–Tüdős) ignore the drift of the feed and are biased for them; the recommended fit in step 6 takes each run's conversion into account.`);
    }
    fillList(list, items);
    $("#bench-warnings-box").hidden = !items.length || !b.rows.length;
  }

  // capital starts a message with a capital letter unless it starts with a symbol such as r1.
  const capital = (t) => (/^[a-z]{3,}\b/.test(t) ? t[0].toUpperCase() + t.slice(1) : t);

  // fillList puts the messages into the list as items, each a sentence.
  function fillList(list, messages) {
    list.replaceChildren(...messages.map((t) => {
      const li = document.createElement("li");
      li.textContent = capital(sentence(t));
      return li;
    }));
  }

  function showBenchStatus(b, r) {
    const n = b.rows.length;
    if (!n) return setText("#bench-status", "The table is empty.");
    if (!r) return setText("#bench-status", `${n} row${n === 1 ? "" : "s"}; none converted.`);
    const bad = (r.errors || []).filter(Boolean).length;
    const good = bench.good.length;
    let text = `${n} row${n === 1 ? "" : "s"}: ${good} converted`;
    if (bad) text += `, ${bad} not yet usable (see the marked cells)`;
    text += good >= MIN_FIT_RUNS ? ". These go into the estimate in step 6." : `. The estimate needs at least ${MIN_FIT_RUNS} converted runs.`;
    setText("#bench-status", text);
  }

  // benchChanged saves the grid and converts it again.
  function benchChanged(rebuild) {
    refreshBench(rebuild);
    scheduleSave();
  }

  function onCellInput(ev) {
    if (!engine || engineStopped || !state.project) return;
    const input = ev.target;
    const i = Number(input.dataset.row);
    const key = input.dataset.key;
    const row = theBench().rows[i];
    if (!row) return;
    if (key === "label") row.label = input.value;
    else if (input.value === "") delete row.cells[key];
    else row.cells[key] = input.value;
    benchChanged(false);
  }

  function setBenchUndo(before, text) {
    bench.undo = { bench: before, text };
    setText("#bench-undo-text", text);
    $("#bench-undo-bar").hidden = false;
  }

  // dropBenchUndo forgets the grid's undo when a whole new project replaces it.
  function dropBenchUndo() {
    bench.undo = null;
    $("#bench-undo-bar").hidden = true;
  }

  function undoBench() {
    const u = bench.undo;
    $("#bench-undo-bar").hidden = true;
    if (!u || !state.project) return;
    bench.undo = null;
    state.project.bench = u.bench;
    loadBench();
    scheduleSave();
  }

  function addRow() {
    if (!state.project) return;
    const b = theBench();
    if (b.rows.length >= MAX_ROWS) return;
    b.rows.push({ label: "", cells: {} });
    benchChanged(true);
    const first = document.getElementById(cellId(b.rows.length - 1, "label"));
    if (first) first.focus();
  }

  function deleteRow(i) {
    if (!state.project) return;
    const b = theBench();
    const row = b.rows[i];
    if (!row) return;
    setBenchUndo(copyBench(b), `Row ${i + 1}${row.label ? ` (${row.label})` : ""} deleted.`);
    b.rows.splice(i, 1);
    benchChanged(true);
  }

  function clearRows() {
    if (!state.project) return;
    const b = theBench();
    if (!b.rows.length) return;
    setBenchUndo(copyBench(b), `All ${b.rows.length} rows removed.`);
    b.rows = [];
    benchChanged(true);
  }

  // setBenchForm changes one entry form of the grid; the cells typed in other forms are kept.
  function setBenchForm(key, value) {
    if (!state.project) return;
    const b = theBench();
    b[key] = value;
    fillBenchForms(b);
    benchChanged(true);
  }

  function setElementCount() {
    const input = $("#bench-element-count");
    clearFieldError(input);
    const raw = input.value.trim();
    const v = raw === "" ? 0 : parseNumber(raw);
    if (Number.isNaN(v) || v < 0) {
      setFieldError(input, `atoms per unit = “${raw}”: enter a whole number such as 1 or 2.`);
      return;
    }
    theBench().elementCount = v;
    benchChanged(false);
  }

  // benchFieldText turns a project field such as "project.bench.rows[3].cells.f10" into words.
  function benchFieldText(field) {
    const m = /bench\.rows\[(\d+)\](?:\.cells\.([A-Za-z0-9]+)|\.(label))?/.exec(field || "");
    if (!m) return "";
    return `row ${Number(m[1]) + 1}${m[2] || m[3] ? ", " + (m[3] ? "label" : m[2]) : ""}: `;
  }

  // addTable reads a pasted block or a file's text into new rows. Nothing changes when any part
  // of it cannot be read, or when the grid would no longer fit in a project.
  function addTable(text, where, fail) {
    if (!state.project) return false;
    const before = theBench();
    const r = call("pasteBench", { bench: before, text });
    if (isError(r)) { fail(`${capital(sentence(r.error.replace(/^(paste|table):\s*/, "")))} Nothing was added.`); return false; }
    const next = r.bench;
    const added = next.rows.length - before.rows.length;
    if (added <= 0) { fail("No rows were found. Nothing was added."); return false; }
    const checked = call("checkProject", { project: { ...state.project, bench: next } });
    if (isError(checked)) {
      fail(`${benchFieldText(checked.field)}${sentence(checked.error.replace(/^project\./, ""))} Nothing was added.`);
      return false;
    }
    setBenchUndo(copyBench(before), `${added} row${added === 1 ? "" : "s"} added from ${where}.`);
    state.project.bench = next;
    loadBench();
    scheduleSave();
    return true;
  }

  function pasteRows() {
    const area = $("#bench-paste");
    clearFieldError(area);
    if (!area.value.trim()) return setFieldError(area, "Paste the cells from your spreadsheet into the box first.");
    if (addTable(area.value, "the pasted block", (msg) => setFieldError(area, msg))) area.value = "";
  }

  async function importTable() {
    const input = $("#bench-import");
    const file = input.files && input.files[0];
    input.value = "";
    const box = $("#bench-error");
    box.hidden = true;
    if (!file) return;
    const fail = (msg) => { box.textContent = `${file.name} was not read: ${msg}`; box.hidden = false; };
    if (file.size > TABLE_MAX_BYTES) return fail(`it is ${file.size} bytes, more than the ${TABLE_MAX_BYTES} a table may have. Nothing was added.`);
    let text;
    try {
      text = await file.text();
    } catch (e) {
      return fail("the file could not be read. Nothing was added.");
    }
    addTable(text, file.name, fail);
  }

  // exportTable saves the grid as typed, with column names the paste box reads back.
  function exportTable() {
    if (!state.project) return;
    const b = theBench();
    const cols = bench.columns;
    const rows = [["label", ...cols], ...b.rows.map((r) => [r.label || "", ...cols.map((k) => r.cells[k] || "")])];
    Plot.saveCSV(rows, `${slug(state.project.name)}-bench-data.csv`);
  }

  // ---- Estimation -----------------------------------------------------------------------------

  const METHOD = {
    nonlinear: { name: "Nonlinear least squares, integrated model", short: "nonlinear least squares on the integrated model" },
    evm: { name: "Error-in-variables", short: "error-in-variables on the integrated model" },
    "fineman-ross": { name: "Fineman–Ross" },
    "inverted-fineman-ross": { name: "Inverted Fineman–Ross" },
    "kelen-tudos": { name: "Kelen–Tüdős" },
    "extended-kelen-tudos": { name: "Extended Kelen–Tüdős" },
    "mayo-lewis-integrated": { name: "Mayo–Lewis intersection" },
    swapped: { name: "Fineman–Ross, M1 and M2 swapped" },
    linear: { name: "Linear methods" },
  };
  const LINEAR_METHODS = ["fineman-ross", "inverted-fineman-ross", "kelen-tudos", "extended-kelen-tudos", "mayo-lewis-integrated"];
  const REGION_KIND = { F: "F-based, errors unknown", chi2: "χ², errors known", ellipse: "linearised ellipse" };
  // Marker of each method on the region plot: colour and shape.
  const MARK = {
    nonlinear: [C.cum, "circle"],
    evm: [C.limit, "circle"],
    "fineman-ross": ["#5c6b7a", "square"],
    "inverted-fineman-ross": ["#2f6fb0", "triangle"],
    "kelen-tudos": ["#c7891a", "square"],
    "extended-kelen-tudos": ["#6b7f1f", "triangle-down"],
    "mayo-lewis-integrated": ["#7a4b2a", "diamond"],
    swapped: ["#9aa5b1", "triangle"],
  };

  const rat = (v) => (Number.isFinite(v) ? (Math.abs(v) >= 100 ? v.toFixed(0) : v.toPrecision(3)) : "–");
  const se = (v) => (Number.isFinite(v) ? v.toPrecision(2) : "–");
  const span = (a, b) => (Number.isFinite(a) && Number.isFinite(b) ? `${rat(a)}–${rat(b)}` : "–");
  const levelPct = (level) => `${Number((level * 100).toPrecision(4))} %`;

  // currentLevel reads the confidence level box; NaN (with the error shown) when it is not valid.
  function currentLevel() {
    const input = $("#fit-level");
    clearFieldError(input);
    const raw = input.value.trim();
    if (raw === "") return DEFAULT_LEVEL;
    const v = parseNumber(raw);
    if (Number.isNaN(v)) { setFieldError(input, `confidence level = “${raw}” is not a number.`); return NaN; }
    if (!(v > 0 && v < 1)) { setFieldError(input, `confidence level = ${raw}: enter a fraction between 0 and 1, such as 0.95.`); return NaN; }
    return v;
  }

  function onLevelInput() {
    if (!state.project) return;
    const v = currentLevel();
    if (Number.isNaN(v)) return;
    state.project.level = v;
    scheduleSave();
    scheduleFit();
  }

  function scheduleFit(now) {
    clearTimeout(bench.fitTimer);
    bench.fitTimer = setTimeout(() => { bench.fitTimer = 0; runFit(); }, now ? 0 : FIT_DELAY_MS);
  }

  // runRows maps "row N" in a message about the fitted runs (N counting those runs from 1) to the
  // row of the grid.
  function runRows(text, rowOf) {
    return String(text).replace(/\brow (\d+)/g, (all, n) => {
      const i = Number(n) - 1;
      return i >= 0 && i < rowOf.length ? `row ${rowOf[i] + 1}` : all;
    });
  }

  // fitMessage is a message of the fit in the grid's row numbers, without a leading field name.
  const fitMessage = (text) => runRows(String(text).replace(/^runs:\s*/, ""), bench.fitRowOf);

  function runFit() {
    if (!engine || engineStopped || !state.project) return;
    const level = currentLevel();
    if (Number.isNaN(level)) return;
    const runs = bench.good;
    if (runs.length < MIN_FIT_RUNS) {
      bench.fit = null;
      bench.fitKey = "";
      $("#fit-results").hidden = true;
      setText("#fit-status", `No estimate yet: step 5 has ${runs.length} usable run${runs.length === 1 ? "" : "s"}; at least ${MIN_FIT_RUNS}, at different feeds, are needed.`);
      drawNext();
      return;
    }
    // The labels are part of the key: the plots and their saved data name the runs by them.
    const key = JSON.stringify([runs, level, bench.rowOf.map((i) => (theBench().rows[i] || {}).label || "")]);
    if (key === bench.fitKey && bench.fit) return;
    const f = call("fit", { runs, level });
    bench.fitKey = key;
    if (isError(f)) {
      bench.fit = null;
      $("#fit-results").hidden = true;
      setText("#fit-status", `No estimate: ${sentence(runRows(f.error, bench.rowOf))}`);
      drawNext();
      return;
    }
    bench.fit = f;
    bench.fitRuns = runs;
    bench.fitRowOf = bench.rowOf.slice();
    drawFit();
    drawNext();
  }

  // recommendedFit returns the name and result of the method to report.
  function recommendedFit(f) {
    const name = f.methods[f.recommended] ? f.recommended : "nonlinear";
    return [name, f.methods[name]];
  }

  function drawFit() {
    const f = bench.fit;
    const [recName, rec] = recommendedFit(f);
    if (!rec) {
      $("#fit-results").hidden = true;
      setText("#fit-status", "No estimate: the fit gave no result.");
      return;
    }
    const n = bench.fitRuns.length;
    $("#fit-results").hidden = false;
    const reg = rec.region || {};
    setText("#fit-status", `Estimated from ${n} runs: r1 = ${rat(rec.r1)}, r2 = ${rat(rec.r2)} (${METHOD[recName].short}` +
      (reg.level ? `, ${levelPct(reg.level)} joint confidence region${reg.open ? ", open" : ""}).` : ")."));
    drawFitTable(f, recName);
    const use = $("#fit-use");
    use.textContent = `Use these ratios (r1 = ${rat(rec.r1)}, r2 = ${rat(rec.r2)})`;
    setText("#fit-use-note", "Copies the recommended r1 and r2 into step 1, with a note of where they come from, and keeps the joint confidence region with the project. Steps 2 to 4 then use them.");

    const items = (f.warnings || []).map((w) => {
      const text = fitMessage(w.message);
      const name = w.method && METHOD[w.method] ? METHOD[w.method].name : "";
      return name && !text.toLowerCase().includes(name.toLowerCase()) ? `${name}: ${text}` : text;
    });
    fillList($("#fit-warnings"), items);
    $("#fit-warnings-box").hidden = !items.length;

    const hasX = bench.fitRuns.some((r) => r.conversion > 0);
    const trendText = (t, what, unit) => {
      if (!t || !Number.isFinite(t.pValue)) return `Against ${what}: not enough runs to tell.`;
      const base = `Against ${what}: slope ${sig3(t.slope)} per unit ${unit}, p = ${sig3(t.pValue)}`;
      return t.flagged ? `${base}. A trend: the residuals are not random; see the notes above.` : `${base}. No clear trend.`;
    };
    const trends = [trendText(f.trends && f.trends.feed, "the feed", "f10")];
    trends.push(hasX ? trendText(f.trends && f.trends.conversion, "conversion", "X") : "Against conversion: no run has a conversion.");
    fillList($("#fit-trends"), trends);

    const fr = f.methods["fineman-ross"], sw = f.swappedFinemanRoss;
    setText("#fit-swap-note", fr && sw
      ? `They depend on which monomer you call M1. From these same runs Fineman–Ross gives r1 = ${rat(fr.r1)}, r2 = ${rat(fr.r2)}; with the labels swapped it gives r1 = ${rat(sw.r1)}, r2 = ${rat(sw.r2)}. The recommended fit gives the same answer either way.`
      : "They also depend on which monomer you call M1: swapping the labels changes their answer.");
    drawFitPlots();
  }

  function drawFitTable(f, recName) {
    const body = document.createElement("tbody");
    const row = (key, label, m, opts) => {
      const tr = document.createElement("tr");
      tr.dataset.method = key;
      if (opts.recommended) { tr.className = "recommended"; tr.dataset.recommended = "true"; }
      if (opts.linear) tr.classList.add("linear");
      const th = document.createElement("th");
      th.scope = "row";
      th.append(label);
      if (opts.tag) {
        const t = document.createElement("span");
        t.className = opts.recommended ? "tag tag-rec" : "tag";
        t.textContent = opts.tag;
        th.append(" ", t);
      }
      tr.append(th);
      if (!m) {
        const td = document.createElement("td");
        td.colSpan = 10;
        td.className = "why-not";
        td.textContent = opts.why || "Not computed for these runs.";
        tr.append(td);
        return tr;
      }
      const reg = m.region;
      const weighted = key === "evm" || (key === "nonlinear" && m.weighted);
      const cells = [
        ["r1", rat(m.r1)], ["r2", rat(m.r2)],
        ["se1", se(m.se1)], ["se2", se(m.se2)],
        ["corr", Number.isFinite(m.corr) ? m.corr.toFixed(2) : "–"],
        ["region1", reg ? span(reg.r1Min, reg.r1Max) : "–"],
        ["region2", reg ? span(reg.r2Min, reg.r2Max) : "–"],
        ["kind", reg ? (REGION_KIND[reg.kind] || reg.kind) + (reg.open ? " (open)" : "") : "–"],
        ["chi2", weighted && Number.isFinite(m.reducedChi2) ? m.reducedChi2.toPrecision(3) : "–"],
        ["p", weighted && Number.isFinite(m.pValue) ? sig3(m.pValue) : "–"],
      ];
      for (const [col, text] of cells) {
        const td = document.createElement("td");
        td.dataset.col = col;
        td.textContent = text;
        tr.append(td);
      }
      return tr;
    };
    const whyNot = (method) => {
      const w = (f.warnings || []).find((x) => x.method === method && x.row < 0);
      return w ? `Not computed: ${sentence(fitMessage(w.message))}` : "Not computed for these runs.";
    };
    const recLabel = recName === "evm" ? "Error-in-variables, integrated model" : METHOD.nonlinear.name;
    body.append(row(recName, recLabel, f.methods[recName], { recommended: true, tag: "recommended" }));
    const other = recName === "evm" ? "nonlinear" : "evm";
    if (f.methods[other]) body.append(row(other, METHOD[other].name, f.methods[other], {}));
    else if (other === "evm") body.append(row("evm", METHOD.evm.name, null, { why: "Needs the uncertainties sF, sf and (with a conversion) sX of every run." }));
    const group = document.createElement("tr");
    group.className = "group";
    const gth = document.createElement("th");
    gth.colSpan = 11;
    gth.scope = "colgroup";
    gth.textContent = "Linear — for comparison only";
    group.append(gth);
    body.append(group);
    for (const key of LINEAR_METHODS) {
      const m = f.methods[key];
      let label = METHOD[key].name;
      if (key === "kelen-tudos" && m && Number.isFinite(m.alpha)) label += ` (α = ${sig3(m.alpha)})`;
      if (key === "extended-kelen-tudos" && m && Number.isFinite(m.alpha)) label += ` (α = ${sig3(m.alpha)})`;
      body.append(row(key, label, m, { linear: true, tag: "linear", why: whyNot(key) }));
    }
    if (f.swappedFinemanRoss) body.append(row("swapped", METHOD.swapped.name, f.swappedFinemanRoss, { linear: true, tag: "linear" }));
    $("#fit-table tbody").replaceWith(body);
  }

  // drawFitPlots draws the data with the fitted curve, the joint confidence region, the
  // residuals and the two linear plots.
  function drawFitPlots() {
    const f = bench.fit;
    if (!f) return;
    const p = state.project;
    bench.drawnRatios = `${p.r1}/${p.r2}`;
    const [recName, rec] = recommendedFit(f);
    const runs = bench.fitRuns;
    const rowOf = bench.fitRowOf;
    const labels = rowOf.map((i) => (theBench().rows[i] && theBench().rows[i].label) || `row ${i + 1}`);
    const nl = f.methods.nonlinear;

    // (a) Data and the composition curve.
    const grid = linspace(0, 1, COMPOSITION_POINTS);
    const comp = call("composition", { r1: rec.r1, r2: rec.r2, f1: grid });
    const low = runs.filter((r) => !(r.conversion > 0));
    const high = runs.filter((r) => r.conversion > 0);
    const model = runs.map((r, i) => (nl && Number.isFinite(nl.residuals[i]) ? r.F1 - nl.residuals[i] : NaN));
    const withX = runs.map((r, i) => i).filter((i) => runs[i].conversion > 0);
    const layers = [{ type: "line", x: [0, 1], y: [0, 1], color: C.diag, width: 1.5, dash: "5 5" }];
    if (!isError(comp)) layers.push({ type: "line", x: grid, y: comp.F1, color: C.inst, width: 2.6 });
    if (withX.length && nl) {
      layers.push({ type: "segments", x0: withX.map((i) => runs[i].f10), y0: withX.map((i) => runs[i].F1),
        x1: withX.map((i) => runs[i].f10), y1: withX.map((i) => model[i]), color: C.feed, width: 1 });
      layers.push({ type: "points", x: withX.map((i) => runs[i].f10), y: withX.map((i) => model[i]), color: C.cum, shape: "circle", r: 3.5, hollow: true });
    }
    if (low.length) layers.push({ type: "points", x: low.map((r) => r.f10), y: low.map((r) => r.F1), color: C.feed, shape: "circle", r: 5.5 });
    if (high.length) layers.push({ type: "points", x: high.map((r) => r.f10), y: high.map((r) => r.F1), color: C.cum, shape: "square", r: 5 });
    const legend = [{ label: `F1 at r1 = ${rat(rec.r1)}, r2 = ${rat(rec.r2)}`, color: C.inst }];
    if (low.length) legend.push({ label: "measured, low conversion", color: C.feed, kind: "point" });
    if (high.length) legend.push({ label: "measured, with conversion", color: C.cum, kind: "point", shape: "square" });
    if (withX.length && nl) legend.push({ label: "model F1cum at that conversion", color: C.cum, kind: "point", hollow: true });
    const dataSvg = Plot.chart({
      title: `Measured composition and the fitted curve (${runs.length} runs)`,
      width: 600, height: 470,
      x: { min: 0, max: 1, label: "f10, mole fraction of M1 in the starting feed", ticks: 10 },
      y: { min: 0, max: 1, label: "F1, mole fraction of M1 in the copolymer", ticks: 10 },
      layers, legend,
    });
    mountFigure("fig-fit-data", dataSvg, "bench-fit", [["label", "f10", "X", "F1 measured", "F1 model (nonlinear fit)", "residual"],
      ...runs.map((r, i) => [labels[i], r.f10, r.conversion || 0, r.F1, model[i], nl ? nl.residuals[i] : ""])]);

    drawRegion(f, recName, rec);

    // (d) Residuals against the feed and against conversion.
    if (nl) {
      const res = nl.residuals;
      const yr = Plot.range([...res, 0], { minSpan: 0.01, pad: 0.15 });
      const resChart = (x, xLabel, xMax, title) => Plot.chart({
        title, width: 600, height: 330,
        x: { min: 0, max: xMax, label: xLabel },
        y: { min: yr[0], max: yr[1], label: "F1 measured − fitted" },
        layers: [{ type: "hline", y: 0, color: C.diag, dash: "5 5" },
          { type: "points", x, y: res, color: C.cum, shape: "circle", r: 5 }],
      });
      const fsvg = resChart(runs.map((r) => r.f10), "f10, starting feed", 1, "Residuals against the feed");
      mountFigure("fig-res-feed", fsvg, "residuals-feed", [["label", "f10", "residual"], ...runs.map((r, i) => [labels[i], r.f10, res[i]])]);
      const xs = runs.map((r) => r.conversion || 0);
      const figX = document.getElementById("fig-res-conv");
      figX.hidden = !withX.length;
      if (withX.length) {
        const xsvg = resChart(xs, "X, molar conversion", Math.min(1, Math.max(...xs) * 1.15 || 1), "Residuals against conversion");
        mountFigure("fig-res-conv", xsvg, "residuals-conversion", [["label", "X", "residual"], ...runs.map((r, i) => [labels[i], xs[i], res[i]])]);
      }
    }

    // (b) Fineman–Ross and (c) Kelen–Tüdős.
    linearPlot("fig-fr", f.methods["fineman-ross"], "fineman-ross", labels, {
      title: (m) => `Fineman–Ross: G = r1·H − r2, r1 = ${rat(m.r1)}, r2 = ${rat(m.r2)} (linear)`,
      x: "H = x²/y", y: "G = x(y − 1)/y",
    });
    linearPlot("fig-kt", f.methods["kelen-tudos"], "kelen-tudos", labels, {
      title: (m) => `Kelen–Tüdős, α = ${sig3(m.alpha)}: r1 = ${rat(m.r1)}, r2 = ${rat(m.r2)} (linear)`,
      x: "ξ = H/(α + H)", y: "η = G/(α + H)", xmin: 0, xmax: 1,
    });
  }

  function linearPlot(id, m, name, labels, o) {
    const fig = document.getElementById(id);
    fig.hidden = !m;
    if (!m) return;
    const xr = o.xmin !== undefined ? [o.xmin, o.xmax] : Plot.range([...m.x, 0], { pad: 0.08 });
    const lineX = [xr[0], xr[1]];
    const lineY = lineX.map((x) => m.slope * x + m.intercept);
    const yr = Plot.range([...m.y, ...lineY], { pad: 0.1 });
    const svg = Plot.chart({
      title: o.title(m), width: 600, height: 380,
      x: { min: xr[0], max: xr[1], label: o.x },
      y: { min: yr[0], max: yr[1], label: o.y },
      layers: [{ type: "line", x: lineX, y: lineY, color: C.feed, width: 2, dash: "7 4" },
        { type: "points", x: m.x, y: m.y, color: C.cum, shape: "circle", r: 5 }],
      legend: [{ label: "runs", color: C.cum, kind: "point" }, { label: "least-squares line", color: C.feed, dash: "7 4", width: 2 }],
    });
    mountFigure(id, svg, name, [["label", o.x, o.y], ...m.x.map((x, i) => [labels[i] || "", x, m.y[i]])]);
  }

  // drawRegion draws (e): the joint confidence region of the recommended method, every method's
  // estimate and the ratios in use in step 1.
  function drawRegion(f, recName, rec) {
    const reg = rec.region || { level: DEFAULT_LEVEL, open: false, boundary: rec.jcr || [] };
    const poly = (reg && reg.boundary) || rec.jcr || [];
    const pts = [];
    const add = (key, label, m) => { if (m && Number.isFinite(m.r1) && Number.isFinite(m.r2)) pts.push({ key, label, r1: m.r1, r2: m.r2 }); };
    add(recName, `${recName === "evm" ? "error-in-variables" : "nonlinear fit"} (recommended)`, rec);
    const other = recName === "evm" ? "nonlinear" : "evm";
    add(other, other === "evm" ? "error-in-variables" : "nonlinear fit", f.methods[other]);
    for (const key of LINEAR_METHODS) add(key, METHOD[key].name, f.methods[key]);
    add("swapped", "Fineman–Ross, labels swapped", f.swappedFinemanRoss);
    const p = state.project;
    add("inuse", "in use in step 1", { r1: p.r1, r2: p.r2 });

    // The plot shows the region with room around it; estimates far outside are listed as off the plot.
    const r1s = poly.map((q) => q[0]), r2s = poly.map((q) => q[1]);
    const box = (vals, centre) => {
      let lo = Math.min(...vals, centre), hi = Math.max(...vals, centre);
      const w = Math.max(hi - lo, Math.abs(centre) * 0.1, 0.02);
      return [lo - 1.5 * w, hi + 1.5 * w];
    };
    const win1 = box(r1s, rec.r1), win2 = box(r2s, rec.r2);
    const shown = pts.filter((q) => q.r1 >= win1[0] && q.r1 <= win1[1] && q.r2 >= win2[0] && q.r2 <= win2[1]);
    const all1 = [...r1s, ...shown.map((q) => q.r1)], all2 = [...r2s, ...shown.map((q) => q.r2)];
    const x = Plot.range(all1, { pad: 0.1, minSpan: 0.02, floor: Math.min(0, ...all1) });
    const y = Plot.range(all2, { pad: 0.1, minSpan: 0.02, floor: Math.min(0, ...all2) });
    const layers = [];
    if (poly.length >= 3) layers.push({ type: "polygon", points: poly, color: C.inst, opacity: 0.16, stroke: C.inst, role: "jcr" });
    const legend = [{ label: `${levelPct(reg.level)} region${reg.open ? " (open)" : ""}`, color: C.inst, kind: "box", opacity: 0.35 }];
    for (const q of pts.slice().reverse()) {
      const [color, shape] = q.key === "inuse" ? ["#1f2933", "cross"] : q.key === recName ? ["#1f2933", "diamond"] : MARK[q.key];
      const on = shown.includes(q);
      if (on) layers.push({ type: "point", x: q.r1, y: q.r2, color, shape, r: q.key === recName ? 7 : 5.5 });
    }
    for (const q of pts) {
      const [color, shape] = q.key === "inuse" ? ["#1f2933", "cross"] : q.key === recName ? ["#1f2933", "diamond"] : MARK[q.key];
      legend.push({ label: q.label + (shown.includes(q) ? "" : " — off the plot"), color, kind: "point", shape });
    }
    const svg = Plot.chart({
      title: `Joint confidence region of r1 and r2, ${levelPct(reg.level)}${reg.open ? " — open: the data do not bound it" : ""}`,
      width: 600, height: 560,
      x: { min: x[0], max: x[1], label: "r1" },
      y: { min: y[0], max: y[1], label: "r2" },
      layers, legend,
    });
    mountFigure("fig-jcr", svg, "joint-confidence-region", [["r1", "r2"], ...poly.map((q) => [q[0], q[1]])]);
  }

  // useFitted copies the recommended ratios into step 1 with a note of where they come from,
  // and keeps the region with them.
  function useFitted() {
    const f = bench.fit;
    if (!f || !state.project) return;
    const [recName, rec] = recommendedFit(f);
    if (!rec) return;
    const round = (v) => String(Number(v.toPrecision(4)));
    $("#r1").value = round(rec.r1);
    $("#r2").value = round(rec.r2);
    const date = new Date().toISOString().slice(0, 10);
    const reg = rec.region || { level: DEFAULT_LEVEL, boundary: rec.jcr || [] };
    $("#ratio-source").value = `fitted to ${bench.fitRuns.length} runs on ${date}, ${METHOD[recName].short}, ${levelPct(reg.level)} JCR`;
    state.formJcr = (reg.boundary || []).map((q) => [q[0], q[1]]);
    recompute();
    setText("#fit-use-note", state.invalid
      ? "The ratios are in step 1, but another field there is not valid; correct it to use them."
      : `r1 and r2 in step 1 are now ${round(rec.r1)} and ${round(rec.r2)}; steps 2 to 4 use them.`);
  }

  // drawJcrNote says, in step 1, that the ratios in use carry a stored region.
  function drawJcrNote(p) {
    const jcr = p.jcr;
    const box = $("#ratio-jcr");
    if (!jcr || jcr.length < 3) { box.hidden = true; box.textContent = ""; return; }
    const r1 = jcr.map((q) => q[0]), r2 = jcr.map((q) => q[1]);
    box.textContent = `Joint confidence region kept with these ratios: r1 ${rat(Math.min(...r1))} to ${rat(Math.max(...r1))}, r2 ${rat(Math.min(...r2))} to ${rat(Math.max(...r2))} (step 6).`;
    box.hidden = false;
  }

  // ---- Next experiments and the screening estimate ----------------------------------------------

  let nextSuggestion = null;

  function drawNext() {
    const p = state.project;
    if (!p) return;
    let r1, r2, basis;
    const runs = bench.fit ? bench.fitRuns : bench.good;
    if (bench.fit) {
      const [name, rec] = recommendedFit(bench.fit);
      r1 = rec.r1; r2 = rec.r2;
      basis = `Planned from the recommended estimate (r1 = ${rat(r1)}, r2 = ${rat(r2)}, ${METHOD[name].short}) and the ${runs.length} runs already in the table.`;
    } else {
      r1 = p.r1; r2 = p.r2;
      basis = `No estimate from bench data yet: planned from the ratios in step 1 (r1 = ${rat(r1)}, r2 = ${rat(r2)})${runs.length ? ` and the ${runs.length} usable run${runs.length === 1 ? "" : "s"} in the table` : ""}.`;
    }
    const d = call("nextRuns", { r1, r2, runs });
    if (isError(d)) {
      setText("#next-basis", `No suggestion: ${sentence(d.error)}`);
      $("#next-results").hidden = true;
      nextSuggestion = null;
      return;
    }
    setText("#next-basis", basis);
    $("#next-results").hidden = false;
    nextSuggestion = d.next || [];
    const runText = (s) => `f10 = ${fix(s.f10, 3)}, stop near X = ${fix(s.conversion, 2)}`;
    const [a, b] = nextSuggestion;
    setText("#next-runs", !a ? "–" : b && runText(a) === runText(b) ? `${runText(a)}, twice (a replicate)` : nextSuggestion.map(runText).join("; "));
    setText("#next-shrink", d.shrink > 0 ? `area × ${fix(d.shrink, 2)} (to about ${Math.round(d.shrink * 100)} % of today's)` : "– (no runs yet to compare with)");
    setText("#next-dopt", `f10 = ${fix(d.dOptimal[0], 3)} and ${fix(d.dOptimal[1], 3)}`);
    setText("#next-tm", `f10 = ${fix(d.tidwellMortimer[0], 3)} and ${fix(d.tidwellMortimer[1], 3)}, from r2/(2 + r2) and 2/(2 + r1)`);
    setText("#next-middle", `f10 = ${fix(d.middle, 3)}`);
    const fraction = (theBench().feedKind || "fraction") === "fraction";
    setText("#next-add-note", fraction
      ? "Adds two rows with the feed filled in; fill in the conversion and the composition once you have measured them."
      : "The table takes the feed as masses or amounts, so the two rows get the suggested feed in their label only.");
  }

  function addNextRuns() {
    if (!state.project || !nextSuggestion || !nextSuggestion.length) return;
    const b = theBench();
    const fraction = (b.feedKind || "fraction") === "fraction";
    const room = MAX_ROWS - b.rows.length;
    nextSuggestion.slice(0, Math.max(0, room)).forEach((s, k) => {
      const label = `next ${k + 1}: stop near X = ${fix(s.conversion, 2)}${fraction ? "" : `, f10 = ${fix(s.f10, 3)}`}`;
      b.rows.push({ label, cells: fraction ? { f10: fix(s.f10, 3) } : {} });
    });
    benchChanged(true);
    setText("#next-add-note", `Added as rows ${b.rows.length - 1} and ${b.rows.length} of the table in step 5.`);
  }

  function drawScreening(p) {
    const box = $("#qe-box");
    const a = p.monomer1.name && findMonomer(p.monomer1.name), b = p.monomer2.name && findMonomer(p.monomer2.name);
    const r = a && b ? call("qe", { monomer1: a.name, monomer2: b.name }) : null;
    if (!r || isError(r)) { box.hidden = true; return; }
    setText("#qe-text", `Q–e scheme: r1 ≈ ${rat(r.r1)}, r2 ≈ ${rat(r.r2)} for ${a.name} (Q = ${shortNum(r.q1)}, e = ${shortNum(r.e1)}) with ${b.name} (Q = ${shortNum(r.q2)}, e = ${shortNum(r.e2)}). ` +
      "A rough starting point for planning the first runs when there is no data yet. The scheme ignores steric effects and often misses by a factor of two or more; it is not a measured value.");
    setText("#qe-source", `Values: ${a.name}: ${r.source1}. ${b.name}: ${r.source2}.`);
    box.hidden = false;
  }

  // afterProjectChange brings the estimation section up to date with a new valid project.
  function afterProjectChange(p) {
    drawJcrNote(p);
    if (planUI.started) planProjectChanged(p);
    if (extra.started) {
      sizeEdited();
      if (extra.sim && extra.simKey !== simKey(p)) setText("#sim-status", "The model or the starting feed has changed since these chains were grown: press Simulate to grow them again.");
    }
    if (!bench.started) return;
    drawScreening(p);
    const masses = p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0 ? `${p.monomer1.molarMass}/${p.monomer2.molarMass}` : "0/0";
    if (masses !== bench.massKey) refreshBench(false);
    if (bench.fit && bench.drawnRatios !== `${p.r1}/${p.r2}`) drawFitPlots();
    if (!bench.fit) drawNext();
  }

  // startEstimation draws steps 5 to 7 the first time, after the first results are on screen.
  function startEstimation() {
    if (bench.started || !state.project || engineStopped) return;
    bench.started = true;
    $("#fit-level").value = shortNum(state.project.level > 0 ? state.project.level : DEFAULT_LEVEL);
    loadBench();
    afterProjectChange(state.project);
    scheduleFit(true);
  }

  // ---- Monomer data and monomers of your own (step 8) ----------------------------------------------
  //
  // The user's own monomers are state.project.userMonomers (UserMonomer in site/copoly.d.ts). A
  // name typed in step 1 is looked up there first, then in the built-in library.

  const ownMonomers = () => (state.project && Array.isArray(state.project.userMonomers) ? state.project.userMonomers : []);
  const findOwn = (name) => ownMonomers().find((m) => sameName(m.name, name));

  // monomerEntry returns {own, m} for the monomer called name, or null when neither list has it.
  function monomerEntry(name) {
    if (!name) return null;
    const own = findOwn(name);
    if (own) return { own: true, m: own };
    const lib = findMonomer(name);
    return lib ? { own: false, m: lib } : null;
  }

  const STATE_TEXT = { liquid: "liquid", gas: "gas (handled under pressure)", solid: "solid" };
  const READ_SDS = "Read the supplier's safety data sheet.";

  // withSDS ends a hazard source with the advice to read the data sheet, unless it says so already.
  const withSDS = (source) => (/data sheet|SDS/.test(source) ? source : (source ? sentence(source) + " " : "") + READ_SDS);

  // monomerFacts lists [label, value, source] for one entry.
  function monomerFacts(e) {
    const m = e.m;
    const given = (v) => Number.isFinite(v) && v > 0;
    const yours = `Your entry${m.note ? `: ${m.note}` : ""}`;
    const src = (libSource) => (e.own ? yours : libSource || "");
    const hasQE = e.own ? given(m.q) : m.q !== null && m.q !== undefined;
    return [
      ["Molar mass", given(m.molarMass) ? `${shortNum(m.molarMass)} g/mol${m.formula ? ` (${m.formula})` : ""}` : "not given", src(m.source)],
      ["State at room temperature", STATE_TEXT[m.state] || "not given", ""],
      ["Density", given(m.density) ? `${shortNum(m.density)} g/mL at ${shortNum(m.densityTemp)} °C` : "not given", given(m.density) ? src(m.densitySource) : ""],
      ["Heat of polymerization, −ΔHp", given(m.heat) ? `${shortNum(m.heat)} kJ/mol` : "not given", given(m.heat) ? src(m.heatSource) : ""],
      ["Q, e", hasQE ? `Q = ${shortNum(m.q)}, e = ${shortNum(m.e)}` : "not given", hasQE ? src(m.qeSource) : ""],
      ["Hazards", m.hazards && m.hazards.length ? m.hazards.join(", ") : "none listed here", withSDS(src(m.hazardSource))],
    ];
  }

  // drawMonomerData lists the data of the two monomers of step 1, each value with its source.
  function drawMonomerData(p) {
    for (const [which, mono] of [[1, p.monomer1], [2, p.monomer2]]) {
      const box = $(`#md-${which}`);
      const h = document.createElement("h4");
      const e = monomerEntry(mono.name);
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

  // The form of a monomer of your own: [selector, key of UserMonomer, label].
  const OWN_NUMBERS = [
    ["#um-mass", "molarMass", "molar mass"],
    ["#um-density", "density", "density"],
    ["#um-density-temp", "densityTemp", "density temperature"],
    ["#um-heat", "heat", "heat of polymerization"],
    ["#um-q", "q", "Q"],
    ["#um-e", "e", "e"],
  ];
  const OWN_INPUTS = ["#um-name", ...OWN_NUMBERS.map((n) => n[0]), "#um-hazards-other", "#um-note"];
  const OWN_FIELD = { name: ["#um-name", "name"], state: ["#um-name", "state"], hazards: ["#um-hazards-other", "hazards"],
    note: ["#um-note", "note"], ...Object.fromEntries(OWN_NUMBERS.map(([sel, key, label]) => [key, [sel, label]])) };
  const own = { editing: -1, undo: null, hazardWords: [] };

  // buildHazardBoxes offers the hazard words of the built-in monomers as check boxes.
  function buildHazardBoxes() {
    const words = [];
    for (const m of state.library.monomers) for (const h of m.hazards || []) if (!words.includes(h)) words.push(h);
    own.hazardWords = words;
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
    for (const sel of OWN_INPUTS) { $(sel).value = ""; clearFieldError($(sel)); }
    $("#um-state").value = "";
    document.querySelectorAll("#um-hazard-boxes input").forEach((b) => { b.checked = false; });
    own.editing = -1;
    $("#um-save").textContent = "Save this monomer";
  }

  function editOwn(i) {
    const m = ownMonomers()[i];
    if (!m) return;
    clearOwnForm();
    own.editing = i;
    $("#um-name").value = m.name;
    for (const [sel, key] of OWN_NUMBERS) $(sel).value = m[key] !== 0 && Number.isFinite(m[key]) ? shortNum(m[key]) : "";
    $("#um-state").value = m.state || "";
    const other = [];
    for (const h of m.hazards || []) {
      const i = own.hazardWords.indexOf(h);
      if (i >= 0) $(`#um-haz-${i}`).checked = true; else other.push(h);
    }
    $("#um-hazards-other").value = other.join("; ");
    $("#um-note").value = m.note || "";
    $("#um-save").textContent = `Save the changes to ${m.name}`;
    $("#own-box").open = true;
    $("#um-name").focus();
  }

  // setOwn replaces the list of the user's monomers after checking the project with it; it
  // returns the check's error, or null.
  function setOwn(list) {
    const checked = call("checkProject", { project: { ...state.project, userMonomers: list } });
    if (isError(checked)) return checked;
    if (checked.project.userMonomers) state.project.userMonomers = checked.project.userMonomers;
    else delete state.project.userMonomers;
    ownChanged();
    scheduleSave();
    return null;
  }

  // ownChanged redraws everything that shows the user's monomers.
  function ownChanged() {
    fillMonomerPickers();
    drawOwnList();
    if (!state.project) return;
    drawLibraryNotes(state.project);
    if (planUI.started) planProjectChanged(state.project);
  }

  function saveOwn() {
    if (!state.project) return;
    for (const sel of OWN_INPUTS) clearFieldError($(sel));
    $("#um-undo").hidden = true;
    const errors = [];
    const name = $("#um-name").value.trim();
    if (!name) errors.push([$("#um-name"), "Give the monomer a name."]);
    else if (findMonomer(name)) errors.push([$("#um-name"), `“${name}” is already in the library; give yours another name, such as “${name} (our lot)”.`]);
    const m = { name, state: $("#um-state").value, note: $("#um-note").value.trim() };
    for (const [sel, key, label] of OWN_NUMBERS) {
      const raw = $(sel).value.trim();
      const v = raw === "" ? 0 : parseNumber(raw);
      if (Number.isNaN(v)) errors.push([$(sel), `${label} = “${raw}” is not a number.`]);
      m[key] = v;
    }
    m.hazards = [...document.querySelectorAll("#um-hazard-boxes input:checked")].map((b) => b.value);
    for (const h of $("#um-hazards-other").value.split(";").map((t) => t.trim()).filter(Boolean)) {
      if (!m.hazards.includes(h)) m.hazards.push(h);
    }
    if (errors.length) {
      for (const [input, message] of errors) setFieldError(input, message);
      return;
    }
    const list = ownMonomers().slice();
    let at = own.editing >= 0 && own.editing < list.length ? own.editing : list.findIndex((x) => sameName(x.name, name));
    const replaced = at >= 0;
    if (replaced) list[at] = m; else { at = list.length; list.push(m); }
    const err = setOwn(list);
    if (err) {
      const f = /^project\.userMonomers(?:\[(\d+)\])?(?:\.(\w+))?/.exec(err.field || "");
      const [sel, label] = (f && f[2] && OWN_FIELD[f[2]]) || [];
      const text = err.error.replace(/^project\.userMonomers\[\d+\]\.\w+(\[\d+\])?/, label || "value").replace(/^project\./, "");
      if (f && sel && (f[1] === undefined || Number(f[1]) === at)) setFieldError($(sel), capital(text));
      else setText("#um-status", `Not saved: ${sentence(text)}`);
      return;
    }
    clearOwnForm();
    setText("#um-status", `${name} is ${replaced ? "updated" : "saved"} with the project.`);
  }

  function removeOwn(i) {
    const before = ownMonomers().slice();
    const gone = before[i];
    if (!gone) return;
    const list = before.slice();
    list.splice(i, 1);
    const err = setOwn(list);
    if (err) return setText("#um-status", `Not removed: ${sentence(err.error)}`);
    if (own.editing >= 0) clearOwnForm();
    own.undo = before;
    setText("#um-status", `${gone.name} is removed.`);
    $("#um-undo").hidden = false;
  }

  function undoOwn() {
    $("#um-undo").hidden = true;
    const before = own.undo;
    own.undo = null;
    if (!before || !state.project) return;
    const err = setOwn(before);
    setText("#um-status", err ? `Not brought back: ${sentence(err.error)}` : "Brought back.");
  }

  function drawOwnList() {
    const list = ownMonomers();
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

  // ---- Feed planning (step 8) ----------------------------------------------------------------------
  //
  // The panel's inputs are saved in state.project.plan (the plan of a Project in site/copoly.d.ts):
  // a box's value is saved when it reads as a number the plan accepts; a box whose text is not
  // valid keeps its text on screen, is marked, and leaves the saved value as it was.

  const PLAN_DELAY_MS = 250;
  const PLAN_EVERY = 10; // the schedule shows every 10th row (and the last) unless asked for all
  const planUI = { started: false, timer: 0, key: "", result: null, args: null, allRows: false, dirty: false };

  // PLAN_BOXES: [selector, key of copoly.plan's argument, label, saved in project.plan].
  const PLAN_BOXES = [
    ["#plan-target", "targetF1", "wanted F1", true],
    ["#plan-mass", "polymerMass", "copolymer to make", true],
    ["#plan-tolerance", "tolerance", "tolerance", true],
    ["#plan-stop", "stopConversion", "stopping conversion", true],
    ["#plan-final", "finalConversion", "final conversion", true],
    ["#plan-feed-f1", "feedF1", "f1 of the mixture", true],
    ["#plan-shots", "shots", "number of shots", true],
    ["#plan-k", "rateConstant", "rate constant", true],
    ["#plan-half", "halfLife", "half-life", true],
    ["#plan-batch-mass", "batchMass", "reactor contents", true],
    ["#plan-cp", "heatCapacity", "heat capacity", true],
    ["#plan-rise-limit", "riseLimit", "limit on the rise", true],
    ["#plan-heat1", "heat1", "−ΔHp of M1", true],
    ["#plan-heat2", "heat2", "−ΔHp of M2", true],
  ];
  const PLAN_MODES = ["batch", "semibatch", "shots"];
  const PLAN_RATES = ["none", "k", "half", "table"]; // the options of #plan-rate, saved as project.plan.rateLaw
  const MODE_TEXT = { batch: "batch", semibatch: "semi-batch", shots: "shot additions" };

  // planField returns the box named by a field of copoly.plan ("timeTable[3][1]" is the table).
  function planField(field) {
    const key = String(field || "").replace(/\[.*$/, "");
    if (key === "timeTable") return $("#plan-table");
    if (key === "mode") return $("#plan-mode");
    if (key === "feed") return $("#plan-feed");
    const b = PLAN_BOXES.find((x) => x[1] === key);
    return b ? $(b[0]) : null;
  }

  // planMessage puts the panel's words in place of the API's field name at the start of a message.
  function planMessage(text) {
    return capital(String(text)
      .replace(/^timeTable\[(\d+)\] = [^:]*:/, (a, i) => `row ${Number(i) + 1} of the table:`)
      .replace(/^timeTable\[(\d+)\]\[0\]/, (a, i) => `time in row ${Number(i) + 1} of the table`)
      .replace(/^timeTable\[(\d+)\]\[1\]/, (a, i) => `conversion in row ${Number(i) + 1} of the table`)
      .replace(/^timeTable\[(\d+)\]/, (a, i) => `row ${Number(i) + 1} of the table`)
      .replace(/^timeTable/, "the table")
      .replace(/^([A-Za-z0-9]+)(?= =|:)/, (a, k) => { const b = PLAN_BOXES.find((x) => x[1] === k); return b ? b[2] : a; }));
  }

  // fieldUsed reports whether a box of the panel takes part in the plan for the chosen options.
  function fieldUsed(field) {
    const mode = $("#plan-mode").value, feed = $("#plan-feed").value, rate = $("#plan-rate").value;
    const d = field.dataset;
    return (!d.modes || d.modes.split(" ").includes(mode)) && (!d.feed || d.feed === feed) && (!d.rate || d.rate === rate);
  }

  function showPlanFields() {
    document.querySelectorAll("#plan .plan-inputs .field").forEach((f) => { f.hidden = !fieldUsed(f); });
  }

  function fillPlanForm(p) {
    const pl = p.plan || {};
    for (const [sel, key, , saved] of PLAN_BOXES) {
      const input = $(sel);
      input.value = saved && pl[key] > 0 ? shortNum(pl[key]) : "";
      clearFieldError(input);
    }
    $("#plan-mode").value = PLAN_MODES.includes(pl.mode) ? pl.mode : "semibatch";
    $("#plan-feed").value = pl.feed === "mixture" ? "mixture" : "faster";
    $("#plan-rate").value = PLAN_RATES.includes(pl.rateLaw) ? pl.rateLaw
      : pl.rateConstant > 0 ? "k" : pl.halfLife > 0 ? "half" : "none";
    // The typed text of the table is not saved: the saved numbers are written back, tab-separated.
    $("#plan-table").value = Array.isArray(pl.timeTable) ? pl.timeTable.map((row) => row.join("\t")).join("\n") : "";
    clearFieldError($("#plan-table"));
    showPlanFields();
  }

  // currentF1 is the instantaneous copolymer composition at the feed of step 3, the default target.
  function currentF1(p) {
    const r = call("composition", { r1: p.r1, r2: p.r2, f1: [p.f10] });
    return isError(r) ? NaN : r.F1[0];
  }

  // planProjectChanged brings the panel up to date with a new valid project or monomer list.
  function planProjectChanged(p) {
    drawMonomerData(p);
    const F = currentF1(p);
    $("#plan-target").placeholder = Number.isFinite(F) ? fix(F, 3) : "";
    setText("#plan-target-unit", Number.isFinite(F) ? `blank = ${fix(F, 3)}, step 3's` : "copolymer");
    $("#plan-tolerance").placeholder = shortNum(p.tolerance);
    for (const [which, mono] of [[1, p.monomer1], [2, p.monomer2]]) {
      const e = monomerEntry(mono.name);
      const heat = e && e.m.heat > 0 ? e.m.heat : NaN;
      $(`#plan-heat${which}`).placeholder = Number.isFinite(heat) ? shortNum(heat) : "";
      setText(`#plan-heat${which}-source`, !e || !Number.isFinite(heat)
        ? "Not known here: enter a value to estimate the temperature rise."
        : `Blank = ${shortNum(heat)}, ${e.own ? "your entry" : "the library's value"} (see Monomer data).`);
    }
    schedulePlan();
  }

  function schedulePlan(now) {
    clearTimeout(planUI.timer);
    planUI.timer = setTimeout(() => { planUI.timer = 0; runPlan(); }, now ? 0 : PLAN_DELAY_MS);
  }

  function onPlanInput(ev) {
    if (ev && ev.target) clearFieldError(ev.target);
    planUI.dirty = true;
    schedulePlan();
  }

  // parseTimeTable reads two pasted columns, time in min and conversion (a fraction or "35 %"), a
  // header line allowed; it returns {rows} or {error}.
  function parseTimeTable(text) {
    const rows = [];
    const lines = text.split(/\r\n|\r|\n/);
    for (let i = 0; i < lines.length; i++) {
      const line = lines[i].trim();
      if (!line) continue;
      const cells = splitCells(line).filter(Boolean);
      const v = cells.map(numberOrPercent);
      if (!rows.length && v.some(Number.isNaN)) continue; // a header line
      if (cells.length !== 2) return { error: `line ${i + 1}: give two columns, time in min and conversion; found ${cells.length}.` };
      const k = v.findIndex(Number.isNaN);
      if (k >= 0) return { error: `line ${i + 1}: “${cells[k]}” is not a number.` };
      rows.push(v);
    }
    if (rows.length < 2) return { error: "give at least two rows of time and conversion." };
    return { rows };
  }

  // readPlan reads the panel: {args} for copoly.plan, {values} of the boxes that read as numbers,
  // the {errors} beside boxes, or a {blocked} reason in words.
  function readPlan(p) {
    const values = {};
    const errors = [];
    for (const [sel, key, label] of PLAN_BOXES) {
      const input = $(sel);
      const raw = input.value.trim();
      if (raw === "") continue;
      const v = parseNumber(raw);
      if (Number.isNaN(v)) {
        if (fieldUsed(input.closest(".field"))) errors.push({ input, message: `${label} = “${raw}” is not a number.` });
        continue;
      }
      values[key] = v;
    }
    const mode = $("#plan-mode").value;
    const out = { values, errors, mode, table: null };
    const rate = $("#plan-rate").value;
    if (rate === "k" && $("#plan-k").value.trim() === "") errors.push({ input: $("#plan-k"), message: "Enter the rate constant, or choose no rate law." });
    if (rate === "half" && $("#plan-half").value.trim() === "") errors.push({ input: $("#plan-half"), message: "Enter the half-life, or choose no rate law." });
    let table = null;
    if (rate === "table") {
      const t = parseTimeTable($("#plan-table").value);
      if (t.error) errors.push({ input: $("#plan-table"), message: capital(t.error) });
      else out.table = table = t.rows;
    }
    const missing = [[1, p.monomer1], [2, p.monomer2]].filter(([, m]) => !(m.molarMass > 0)).map(([w]) => `M${w}`);
    if (missing.length) out.blocked = `the plan weighs the monomers, so give the molar mass of ${missing.join(" and ")} in step 1.`;
    else if ($("#plan-mass").value.trim() === "") out.blocked = "enter how much copolymer to make.";
    if (errors.length || out.blocked) return out;

    const F = currentF1(p);
    const args = {
      r1: p.r1, r2: p.r2, mode,
      targetF1: values.targetF1 !== undefined ? values.targetF1 : F,
      molarMass1: p.monomer1.molarMass, molarMass2: p.monomer2.molarMass,
      polymerMass: values.polymerMass,
      tolerance: values.tolerance !== undefined ? values.tolerance : p.tolerance,
    };
    const use = (key) => {
      const sel = PLAN_BOXES.find((b) => b[1] === key)[0];
      if (values[key] !== undefined && fieldUsed($(sel).closest(".field"))) args[key] = values[key];
    };
    ["stopConversion", "finalConversion", "feedF1", "shots", "rateConstant", "halfLife", "batchMass", "heatCapacity", "riseLimit", "heat1", "heat2"].forEach(use);
    if (mode === "semibatch") args.feed = $("#plan-feed").value;
    if (table) args.timeTable = table;
    // Library monomers lend the module their densities, heats and hazards by name; for the user's
    // own, the page passes the heat and works out the volume itself (drawPlan).
    for (const [which, mono] of [[1, p.monomer1], [2, p.monomer2]]) {
      const e = monomerEntry(mono.name);
      if (e && e.own) {
        if (args[`heat${which}`] === undefined && e.m.heat > 0) args[`heat${which}`] = e.m.heat;
      } else if (mono.name) {
        args[`monomer${which}`] = e ? e.m.name : mono.name;
      }
    }
    if (Array.isArray(p.jcr) && p.jcr.length >= 3) args.jcr = p.jcr;
    out.args = args;
    return out;
  }

  // savePlanInputs keeps the panel's valid values in the project (see the section comment);
  // refused names the box the plan refused, if any.
  function savePlanInputs(read, refused) {
    if (!planUI.dirty || !state.project) return;
    planUI.dirty = false;
    const prev = state.project.plan || {};
    const next = { ...prev, mode: read.mode };
    if (read.mode === "semibatch" || prev.feed) next.feed = $("#plan-feed").value;
    for (const [sel, key, , saved] of PLAN_BOXES) {
      if (!saved) continue;
      const raw = $(sel).value.trim();
      const v = read.values[key];
      if (raw === "") delete next[key];
      else if (Number.isFinite(v) && v >= 0 && key !== refused && (key !== "shots" || Number.isInteger(v))) next[key] = v;
    }
    const rate = $("#plan-rate").value;
    next.rateLaw = rate;
    if (rate !== "k") delete next.rateConstant;
    if (rate !== "half") delete next.halfLife;
    if (rate !== "table" || $("#plan-table").value.trim() === "") delete next.timeTable;
    else if (read.table && refused !== "timeTable") next.timeTable = read.table;
    // A value the project check refuses (a heat above its limit, a table the plan was not yet
    // asked about) keeps its saved value; anything else refused leaves the project as it was.
    for (let tries = 0; tries < 4; tries++) {
      if (JSON.stringify(next) === JSON.stringify(prev)) return;
      const checked = call("checkProject", { project: { ...state.project, plan: next } });
      if (!isError(checked)) {
        state.project.plan = checked.project.plan || {};
        scheduleSave();
        return;
      }
      const key = (/^project\.plan\.([A-Za-z0-9]+)/.exec(checked.field || "") || [])[1];
      if (!key || JSON.stringify(next[key]) === JSON.stringify(prev[key])) return;
      if (prev[key] === undefined) delete next[key];
      else next[key] = prev[key];
    }
  }

  function planStale(stale) {
    document.querySelector("#plan .plan-stale").hidden = !stale || !planUI.result;
  }

  function runPlan() {
    if (!planUI.started || !state.project || engineStopped) return;
    const p = state.project;
    PLAN_BOXES.forEach(([sel]) => clearFieldError($(sel)));
    clearFieldError($("#plan-table"));
    const read = readPlan(p);
    if (read.errors.length || read.blocked) {
      for (const { input, message } of read.errors) setFieldError(input, message);
      const why = read.blocked || "correct the marked field.";
      setText("#plan-status", `${planUI.result ? "Plan not updated" : "No plan yet"}: ${why}`);
      planStale(true);
      savePlanInputs(read, null);
      return;
    }
    const key = JSON.stringify([read.args, p.monomer1.name, p.monomer2.name, ownMonomers()]);
    if (key === planUI.key && planUI.result) {
      planStale(false);
      savePlanInputs(read, null);
      return;
    }
    const r = call("plan", read.args);
    if (isError(r)) {
      const input = planField(r.field);
      if (input && input.tagName !== "SELECT") setFieldError(input, planMessage(r.error));
      setText("#plan-status", input && input.tagName !== "SELECT" ? `${planUI.result ? "Plan not updated" : "No plan yet"}: correct the marked field.`
        : `No plan: ${sentence(planMessage(r.error))}`);
      planUI.key = "";
      planStale(true);
      savePlanInputs(read, String(r.field || "").replace(/\[.*$/, ""));
      return;
    }
    planUI.key = key;
    planUI.result = r;
    planUI.args = read.args;
    planStale(false);
    drawPlan(p, r, read.args);
    savePlanInputs(read, null);
  }

  // volumeText is the mL cell of the recipe: the module's volume for a library liquid, the page's
  // for a liquid of your own with a density, or why there is none.
  function volumeText(name, g, v) {
    if (Number.isFinite(v)) return fix(v, 1);
    const e = monomerEntry(name);
    const m = e ? e.m : {};
    if (e && e.own && m.state === "liquid" && m.density > 0) return fix(g / m.density, 1);
    if (m.state === "gas") return "gas: weigh it in";
    if (m.state === "solid") return "solid: weigh it";
    if (e && e.own && m.density > 0) return "give its state";
    return "no density";
  }

  const SCHEDULE_COLS = [
    ["conversion", "X", (v) => fix(v, 4)],
    ["polymer", "Polymer, g", (v) => fix(v, 1)],
    ["fed1", "Fed M1, g", (v) => fix(v, 1)],
    ["fed2", "Fed M2, g", (v) => fix(v, 1)],
    ["f1", "Feed f1", (v) => fix(v, 3)],
    ["F1", "F1 now", (v) => fix(v, 3)],
    ["F1cum", "F1cum", (v) => fix(v, 3)],
    ["inventory", "Unreacted, g", (v) => fix(v, 1)],
    ["time", "Time, min", (v) => fix(v, 1)],
    ["pump1", "Pump M1, g/min", (v) => fix(v, 2)],
    ["pump2", "Pump M2, g/min", (v) => fix(v, 2)],
  ];

  function drawPlan(p, r, args) {
    const n1 = m1Name(p), n2 = m2Name(p);
    const rows = r.schedule;
    const last = rows[rows.length - 1];
    const tol = args.tolerance;
    $("#plan-results").hidden = false;
    $("#plan-more").hidden = false;
    setText("#plan-status", `Plan: ${shortNum(args.polymerMass)} g of copolymer at F1 = ${fix(args.targetF1, 3)} ± ${shortNum(tol)}, by ${MODE_TEXT[r.mode]}` +
      (r.mode === "semibatch" ? `, metering ${r.feedF1 === 1 ? n1 : r.feedF1 === 0 ? n2 : "a mixture"}.` : "."));

    // Recipe.
    const body = document.createElement("tbody");
    for (const [which, name, g, mol, v, total] of [[1, n1, r.initial.m1, r.initial.n1, r.initial.v1, r.total.m1], [2, n2, r.initial.m2, r.initial.n2, r.initial.v2, r.total.m2]]) {
      const tr = document.createElement("tr");
      const th = document.createElement("th");
      th.scope = "row";
      th.textContent = `M${which}: ${name}`;
      tr.append(th);
      for (const [col, text] of [["m", fix(g, 1)], ["n", fix(mol, 3)], ["v", volumeText(name, g, v)], ["later", fix(total - g, 1)], ["total", fix(total, 1)]]) {
        const td = document.createElement("td");
        td.dataset.col = col;
        td.textContent = text;
        tr.append(td);
      }
      body.append(tr);
    }
    $("#plan-recipe tbody").replaceWith(body);

    // Facts.
    const facts = [["Charge the reactor at feed f1", fix(r.startF1, 3)]];
    if (r.mode === "batch") {
      facts.push(["Stop at conversion X", fix(r.stopConversion, 3) + (args.stopConversion ? "" : ` (where F1cum leaves ± ${shortNum(tol)})`)]);
    } else {
      facts.push(["Conversion at the end", fix(r.stopConversion, 3)]);
    }
    if (r.mode === "semibatch") {
      const stream = r.feedF1 === 1 ? `${n1} alone` : r.feedF1 === 0 ? `${n2} alone` : `mixture at f1 = ${fix(r.feedF1, 3)}`;
      facts.push(["Metered stream", stream]);
      const fed = last.fed1 + last.fed2;
      facts.push(["Stream per polymer formed", `${fix(r.feedPerPolymer, 3)} mol per mol of units; ${fix(fed / last.polymer, 3)} g per g`]);
    }
    if (r.mode === "shots") facts.push(["Shots", `${r.shots.length}, listed below`]);
    let product = fix(r.productF1, 3);
    if (r.band) product += ` (${fix(r.band.productLow, 3)} to ${fix(r.band.productHigh, 3)} over the ratios' region)`;
    facts.push(["Product F1", product]);
    facts.push(["Largest deviation of F1 from the target", fix(r.maxDeviation, 3) + (r.maxDeviation > tol + 1e-9 ? " — outside the tolerance" : "")]);
    if (Number.isFinite(last.time)) facts.push(["Time to the end", `${fix(last.time, 0)} min (${fix(last.time / 60, 1)} h)`]);
    $("#plan-facts").replaceChildren(...facts.map(([label, value]) => {
      const div = document.createElement("div");
      const dt = document.createElement("dt");
      dt.textContent = label;
      const dd = document.createElement("dd");
      dd.textContent = value;
      div.append(dt, dd);
      return div;
    }));
    fillList($("#plan-notes"), (r.notes || []).map((t) => t.replace(/^monomer([12]) /, "M$1 ")));

    drawSchedule(p, r);
    drawShots(r);
    drawPlanPlots(p, r, args);
    drawSafety(p, r);
    $("#starved-box").hidden = r.mode !== "semibatch";
    $("#sf-k").placeholder = args.rateConstant > 0 ? shortNum(args.rateConstant) : args.halfLife > 0 ? shortNum(Math.LN2 / args.halfLife) : "";
    drawStarved();
  }

  function drawSchedule(p, r) {
    const rows = r.schedule;
    const timed = rows.some((row) => Number.isFinite(row.time));
    // Only a semi-batch has pumps; the time column needs a rate law.
    const cols = SCHEDULE_COLS.filter(([key]) => (key !== "time" || timed) && (!key.startsWith("pump") || (timed && r.mode === "semibatch")));
    const head = document.createElement("tr");
    for (const [key, label] of cols) {
      const th = document.createElement("th");
      th.scope = "col";
      th.dataset.col = key;
      th.textContent = label;
      head.append(th);
    }
    const thead = document.createElement("thead");
    thead.append(head);
    const tbody = document.createElement("tbody");
    const lastIndex = rows.length - 1;
    rows.forEach((row, i) => {
      if (!planUI.allRows && i % PLAN_EVERY !== 0 && i !== lastIndex) return;
      const tr = document.createElement("tr");
      tr.dataset.i = String(i);
      for (const [key, , fmt] of cols) {
        const td = document.createElement("td");
        td.dataset.col = key;
        td.textContent = fmt(row[key]);
        tr.append(td);
      }
      tbody.append(tr);
    });
    $("#plan-schedule thead").replaceWith(thead);
    $("#plan-schedule tbody").replaceWith(tbody);
    const caption = $("#plan-schedule caption");
    caption.textContent = `Schedule (M1 = ${m1Name(p)}, M2 = ${m2Name(p)}; fed amounts are cumulative${timed && r.mode === "semibatch" ? "; pump rates over the step ending at the row" : ""})` +
      (planUI.allRows ? "" : `: every ${PLAN_EVERY}th of ${rows.length} rows`);
    if (!timed) caption.textContent += ". Choose a rate law above to see times and pump rates.";
    setText("#plan-all-rows", planUI.allRows ? `Show every ${PLAN_EVERY}th row` : `Show all ${rows.length} rows`);
  }

  function scheduleCSV() {
    const r = planUI.result;
    if (!r || !state.project) return;
    const p = state.project;
    const units = { conversion: "X (overall molar conversion)", polymer: "polymer g", fed1: `fed ${m1Name(p)} g`, fed2: `fed ${m2Name(p)} g`,
      f1: "feed f1", F1: "F1", F1cum: "F1cum", inventory: "unreacted monomer g", time: "time min", pump1: `pump ${m1Name(p)} g/min`, pump2: `pump ${m2Name(p)} g/min` };
    const keys = SCHEDULE_COLS.map(([key]) => key);
    const rows = [keys.map((k) => units[k]), ...r.schedule.map((row) => keys.map((k) => (row[k] === null ? "" : row[k])))];
    Plot.saveCSV(rows, `${slug(p.name)}-plan-schedule.csv`);
  }

  function drawShots(r) {
    const box = $("#plan-shots-box");
    box.hidden = r.mode !== "shots" || !r.shots.length;
    if (box.hidden) return;
    const tbody = document.createElement("tbody");
    r.shots.forEach((s, i) => {
      const tr = document.createElement("tr");
      for (const text of [String(i + 1), fix(s.polymer, 1), fix(s.m1, 2), fix(s.m2, 2), Number.isFinite(s.time) ? fix(s.time, 1) : "–"]) {
        const td = document.createElement("td");
        td.textContent = text;
        tr.append(td);
      }
      tbody.append(tr);
    });
    $("#plan-shot-table tbody").replaceWith(tbody);
  }

  // drawPlanPlots draws the copolymer composition on an axis close around the target (so that the
  // saw-tooth of shots shows), the feed in the reactor, and the product's composition distribution.
  function drawPlanPlots(p, r, args) {
    const rows = r.schedule;
    const batch = r.mode === "batch";
    const x = rows.map((row) => (batch ? row.conversion : row.polymer));
    const get = (k) => rows.map((row) => row[k]);
    const f1 = get("f1"), F1 = get("F1"), F1cum = get("F1cum");
    const target = args.targetF1, tol = args.tolerance;
    const xAxis = { min: 0, max: x[x.length - 1] > 0 ? x[x.length - 1] : 1, label: batch ? "X, overall molar conversion" : "polymer made so far, g" };
    const mode = MODE_TEXT[r.mode][0].toUpperCase() + MODE_TEXT[r.mode].slice(1);

    const layers = [{ type: "band", y0: target - tol, y1: target + tol, color: C.band, opacity: 0.25 }];
    const spread = [];
    if (r.band) {
      const poly = (lo, hi) => [...x.map((v, i) => [v, lo[i]]), ...x.map((v, i) => [v, hi[i]]).reverse()];
      layers.push({ type: "polygon", points: poly(r.band.F1cumLow, r.band.F1cumHigh), color: C.cum, opacity: 0.16, stroke: "none", role: "band-cum" });
      layers.push({ type: "polygon", points: poly(r.band.F1Low, r.band.F1High), color: C.inst, opacity: 0.16, stroke: "none", role: "band-inst" });
      spread.push(...r.band.F1Low, ...r.band.F1High, ...r.band.F1cumLow, ...r.band.F1cumHigh);
    }
    layers.push({ type: "line", x, y: F1, color: C.inst, width: 2 }, { type: "line", x, y: F1cum, color: C.cum, width: 2.4 });
    const legend = [{ label: "F1 (now)", color: C.inst }, { label: "F1cum (so far)", color: C.cum },
      { label: `wanted F1 ± ${shortNum(tol)}`, color: C.band, kind: "box", opacity: 0.35 }];
    if (r.band) legend.push({ label: "95 % of outcomes over the ratios' region", color: C.inst, kind: "box", opacity: 0.3 });
    const yr = Plot.range([...F1, ...F1cum, ...spread, target - 1.5 * tol, target + 1.5 * tol], { floor: 0, ceil: 1, minSpan: 0.01 });
    const svg = Plot.chart({
      title: `${mode}: copolymer composition on the way to ${shortNum(args.polymerMass)} g`,
      width: 600, height: 420, x: xAxis,
      y: { min: yr[0], max: yr[1], label: "F1, mole fraction of M1" },
      layers, legend,
    });
    const csv = [[batch ? "X" : "polymer g", "f1", "F1", "F1cum", ...(r.band ? ["F1 low", "F1 high", "F1cum low", "F1cum high"] : [])],
      ...x.map((v, i) => [v, f1[i], F1[i], F1cum[i], ...(r.band ? [r.band.F1Low[i], r.band.F1High[i], r.band.F1cumLow[i], r.band.F1cumHigh[i]] : [])])];
    mountFigure("fig-plan", svg, "plan-composition", csv);
    const why = {
      batch: "Instantaneous F1 and cumulative F1cum as the batch converts; it stops where F1cum would leave the shaded band (the wanted F1 ± the tolerance).",
      semibatch: "Instantaneous F1 and cumulative F1cum against the polymer made: the metered monomer holds the feed steady, so every increment of polymer has the wanted composition. (The overall conversion of a fed reactor is no clock: it rises and falls as monomer is added.)",
      shots: "Instantaneous F1 and cumulative F1cum against the polymer made. Between shots F1 falls away from the target; each shot brings it back, hence the saw-tooth.",
    }[r.mode];
    setText("#fig-plan-caption", why + (r.band ? ` The lighter bands hold 95 % of the outcomes when r1 and r2 are drawn from their joint confidence region (${r.band.samples} pairs): the same recipe, run with ratios the data cannot rule out.` : ""));

    const fr = Plot.range(f1, { floor: 0, ceil: 1, minSpan: 0.01 });
    const fsvg = Plot.chart({
      title: `Feed f1 in the reactor (charged at ${fix(r.startF1, 3)})`,
      width: 600, height: 360, x: xAxis,
      y: { min: fr[0], max: fr[1], label: "f1 of the unreacted monomer" },
      layers: [{ type: "line", x, y: f1, color: C.feed, width: 2 }],
    });
    mountFigure("fig-plan-feed", fsvg, "plan-feed", [[batch ? "X" : "polymer g", "f1"], ...x.map((v, i) => [v, f1[i]])]);
    setText("#fig-plan-feed-caption", {
      batch: "The unreacted monomer drifts as the faster monomer is used up; that drift is what moves F1.",
      semibatch: "The metering keeps the unreacted monomer at the charged composition.",
      shots: "The feed drifts between shots; each shot of monomer restores the charged composition.",
    }[r.mode]);

    const h = r.distribution;
    const n = h.weights.length;
    const lo = h.edges[0], hi = h.edges[n];
    const basis = h.basis === "mass" ? "mass" : "moles";
    const hsvg = Plot.chart({
      title: "Composition distribution of the product",
      width: 600, height: 340,
      x: { min: lo, max: hi > lo ? hi : lo + 1e-3, label: "F1 of the polymer made", ticks: 5 },
      y: { min: 0, max: Math.max(...h.weights, 1e-9) * 1.1, label: `fraction of polymer (by ${basis})` },
      layers: [{ type: "bars", x0: h.edges.slice(0, n), x1: h.edges.slice(1), y: h.weights, color: C.inst }],
    });
    mountFigure("fig-plan-dist", hsvg, "plan-distribution", [["F1 from", "F1 to", `fraction by ${basis}`], ...h.weights.map((w, i) => [h.edges[i], h.edges[i + 1], w])]);
  }

  function drawSafety(p, r) {
    const s = r.safety;
    setText("#plan-inventory", `Most unreacted monomer in the reactor: ${fix(s.inventoryMax, 1)} g, ` +
      (s.inventoryAt > 0 ? `when ${fix(s.inventoryAt, 0)} g of polymer has formed.` : "at the start, right after charging."));
    const rise = $("#plan-rise");
    rise.classList.remove("flag", "ok");
    if (s.rise === null || s.heat === null) {
      rise.textContent = "The adiabatic temperature rise is not estimated: a heat of polymerization is not known for M1 or M2. Enter −ΔHp under Safety check.";
      return drawHazards(p);
    }
    const value = document.createElement("strong");
    value.id = "plan-rise-value";
    value.textContent = `${s.rise < 10 ? fix(s.rise, 1) : fix(s.rise, 0)} K`;
    const where = s.batchMass > 0 ? `${fix(s.batchMass, 0)} g of reactor contents` : "the reactor contents";
    const parts = [`If that monomer polymerized all at once with no cooling, it would give ${fix(s.heat, 0)} kJ and heat ${where} (at ${shortNum(s.heatCapacity)} J/(g·K)) by about `, value, `, against your limit of ${shortNum(s.riseLimit)} K. `];
    const verdict = document.createElement("span");
    verdict.className = "verdict";
    verdict.textContent = s.flagged
      ? "Above the limit. Hold less unreacted monomer (meter it instead of charging it, charge less, dilute), or make sure cooling and relief can take it, then check again."
      : "Within the limit.";
    parts.push(verdict);
    const charged = r.initial.m1 + r.initial.m2;
    if (s.batchMass > 0 && s.batchMass < charged) {
      parts.push(` Check the reactor contents: ${fix(s.batchMass, 0)} g is less than the ${fix(charged, 0)} g of monomer charged.`);
    }
    rise.replaceChildren(...parts);
    rise.classList.add(s.flagged ? "flag" : "ok");
    drawHazards(p);
  }

  function drawHazards(p) {
    const out = [];
    for (const [which, mono] of [[1, p.monomer1], [2, p.monomer2]]) {
      const e = monomerEntry(mono.name);
      const para = document.createElement("p");
      const b = document.createElement("strong");
      b.textContent = `${mono.name || `M${which}`}: `;
      let text;
      if (!e) text = "no hazard data here.";
      else if (!e.m.hazards || !e.m.hazards.length) text = e.own ? "no hazards in your entry." : "no hazards listed here.";
      else text = `${e.m.hazards.join(", ")} (${e.own ? "your entry" : "library"}).`;
      para.append(b, text);
      out.push(para);
    }
    const sds = document.createElement("p");
    sds.textContent = `${READ_SDS} These lists are reminders, not the data sheet.`;
    out.push(sds);
    $("#plan-hazards").replaceChildren(...out);
  }

  // drawStarved works out the steady unreacted inventory of a starved feed (copoly.starvedFeed).
  function drawStarved() {
    const r = planUI.result, a = planUI.args;
    const rateIn = $("#sf-rate"), kIn = $("#sf-k");
    clearFieldError(rateIn);
    clearFieldError(kIn);
    delete $("#sf-out").dataset.result; // marks an answer, which the printed report keeps
    if (!r || !a || r.mode !== "semibatch") return;
    const read = (input, label, fallback) => {
      const raw = input.value.trim();
      if (raw === "") return fallback;
      const v = parseNumber(raw);
      if (Number.isNaN(v)) setFieldError(input, `${label} = “${raw}” is not a number.`);
      return v;
    };
    const feedRate = read(rateIn, "feed rate", undefined);
    const k = read(kIn, "rate constant", a.rateConstant > 0 ? a.rateConstant : a.halfLife > 0 ? Math.LN2 / a.halfLife : undefined);
    if (feedRate === undefined || k === undefined) {
      return setText("#sf-out", `Give the ${[feedRate === undefined ? "feed rate" : "", k === undefined ? "rate constant" : ""].filter(Boolean).join(" and the ")}.`);
    }
    if (Number.isNaN(feedRate) || Number.isNaN(k)) return setText("#sf-out", "");
    const s = call("starvedFeed", { r1: a.r1, r2: a.r2, targetF1: a.targetF1, feedRate, rateConstant: k, molarMass1: a.molarMass1, molarMass2: a.molarMass2 });
    if (isError(s)) {
      const input = s.field === "feedRate" ? rateIn : s.field === "rateConstant" ? kIn : null;
      const msg = capital(String(s.error).replace(/^feedRate/, "feed rate").replace(/^rateConstant/, "rate constant"));
      if (input) setFieldError(input, msg);
      return setText("#sf-out", input ? "" : sentence(msg));
    }
    $("#sf-out").dataset.result = "";
    setText("#sf-out", `About ${fix(s.inventory, 1)} g of unreacted monomer sits in the reactor, at f1 = ${fix(s.f1, 3)}. Metering faster, or a slower reaction, raises it.`);
  }

  // startPlanning draws step 8 the first time, after the first results are on screen.
  function startPlanning() {
    if (planUI.started || !state.project || engineStopped) return;
    planUI.started = true;
    buildHazardBoxes();
    drawOwnList();
    fillPlanForm(state.project);
    planProjectChanged(state.project);
    schedulePlan(true);
  }

  // loadPlanPanel puts a replaced project's plan and monomers on screen.
  function loadPlanPanel(p) {
    fillMonomerPickers();
    if (!planUI.started) return;
    clearOwnForm();
    own.undo = null;
    $("#um-undo").hidden = true;
    setText("#um-status", "");
    drawOwnList();
    fillPlanForm(p);
    // The last plan belongs to the project replaced: take it off the screen.
    planUI.key = "";
    planUI.result = null;
    planUI.args = null;
    planUI.dirty = false;
    $("#plan-results").hidden = true;
    $("#plan-more").hidden = true;
    planStale(false);
    planProjectChanged(p);
  }

  // ---- Triads, simulated chains and chain size (steps 9 and 10) --------------------------------
  //
  // The grids keep every cell as typed, in this tab. project.triads and project.sizeBins hold
  // their numbers and are saved only when every row that is not blank reads, so a cell being
  // corrected never costs the last good copy. Chromatogram slices and the simulation's inputs
  // stay in the tab.

  const DISC_DELAY_MS = 250;
  const SUM_TOLERANCE = 0.01; // a triad family summing to 1 ± 0.01 (common practice, no source)
  const TRIAD_COLS = [["f10", "f10", "feed"], ["F1", "F1", "copolymer, optional"], ["A111", "A111"], ["A112", "A112+211"],
    ["A212", "A212"], ["A222", "A222"], ["A221", "A221+122"], ["A121", "A121"]];
  const FAMILIES = [[["A111", "111"], ["A112", "112"], ["A212", "212"]], [["A222", "222"], ["A221", "221"], ["A121", "121"]]];
  const extra = {
    started: false, disc: null, discTimer: 0, sim: null, simKey: "",
    triads: { id: "triad-table", cols: TRIAD_COLS, rows: [], max: 1000, edited: () => triadsEdited() },
    bins: { id: "size-table", cols: [["low", "Low", "g/mol"], ["high", "High", "g/mol"], ["fraction", "Fraction", ""]], rows: [], max: 10000, edited: () => sizeEdited() },
    slices: { id: "size-table", cols: [["mass", "Molar mass", "g/mol"], ["signal", "Signal", "above baseline"]], rows: [], max: 10000, edited: () => sizeEdited() },
  };

  // numberOrPercent reads a cell: a number with a decimal comma or point, or a percentage.
  function numberOrPercent(text) {
    const m = /^(.*?)\s*%$/.exec(text);
    return m ? parseNumber(m[1]) / 100 : parseNumber(text);
  }

  // splitCells splits a pasted line at tabs or semicolons, else at spaces, else at commas.
  function splitCells(line) {
    let cells = line.split(/\t|;/);
    if (cells.length < 2) cells = line.trim().split(/\s+/);
    if (cells.length < 2) cells = line.split(",");
    return cells.map((c) => c.trim());
  }

  // drawGrid draws grid g ({id, cols: [[key, heading, unit]], rows: [{key: text}], edited}): a
  // row number, a text box per column and a delete button per row, and a line for its message.
  function drawGrid(g) {
    const th = (text, unit) => {
      const e = document.createElement("th");
      e.scope = "col";
      e.append(text);
      if (unit) {
        const u = document.createElement("span");
        u.className = "col-unit";
        u.textContent = unit;
        e.append(u);
      }
      return e;
    };
    const head = document.createElement("tr");
    head.append(th("Row"), ...g.cols.map(([, h, u]) => th(h, u)), th(""));
    const body = document.createElement("tbody");
    const width = g.cols.length + 2;
    if (!g.rows.length) body.append(emptyGridRow(width, "No rows yet. Add a row, or paste rows from a spreadsheet below."));
    g.rows.forEach((row, i) => {
      const tr = gridRow(i);
      for (const [key, h] of g.cols) {
        const td = document.createElement("td");
        const input = document.createElement("input");
        Object.assign(input, { type: "text", id: `${g.id}-r${i}-${key}`, value: row[key] || "", maxLength: CELL_MAX,
          autocomplete: "off", spellcheck: false, inputMode: "decimal", className: "cell" });
        input.setAttribute("aria-label", `row ${i + 1}, ${h}`);
        input.addEventListener("input", () => { row[key] = input.value; g.edited(); });
        td.append(input);
        tr.append(td);
      }
      const td = document.createElement("td");
      const del = button("Delete", () => gridRemove(g, i));
      del.className = "row-delete";
      del.setAttribute("aria-label", `Delete row ${i + 1}`);
      td.append(del);
      const msgRow = document.createElement("tr");
      msgRow.className = "row-msg";
      msgRow.hidden = true;
      const msg = document.createElement("td");
      msg.colSpan = width;
      msg.id = `${g.id}-msg-${i}`;
      msgRow.append(msg);
      tr.append(td);
      body.append(tr, msgRow);
    });
    const table = document.getElementById(g.id);
    table.querySelector("thead").replaceChildren(head);
    table.querySelector("tbody").replaceWith(body);
  }

  // gridRemove deletes row i, or every row (i < 0), keeping them for "Bring them back".
  function gridRemove(g, i) {
    if (!g.rows.length) return;
    g.undo = g.rows.map((r) => ({ ...r }));
    if (i < 0) g.rows = []; else g.rows.splice(i, 1);
    $(`#${g.id === "triad-table" ? "triad" : "size"}-undo`).hidden = false;
    drawGrid(g);
    g.edited();
  }

  function gridUndo(g, which) {
    $(`#${which}-undo`).hidden = true;
    if (!g.undo) return;
    g.rows = g.undo;
    g.undo = null;
    drawGrid(g);
    g.edited();
  }

  // readGrid reads the numbers of grid g; rows with every cell blank are skipped, need lists the
  // cells a row must have. It returns the rows read (a blank cell absent), the grid row of each
  // (at) and, by grid row, the message of a row that cannot be used ({text, key, pending}).
  function readGrid(g, need) {
    const out = { rows: [], at: [], msgs: [] };
    g.rows.forEach((row, i) => {
      if (g.cols.every(([k]) => !(row[k] || "").trim())) return;
      const v = {};
      for (const [k, h] of g.cols) {
        const raw = (row[k] || "").trim();
        const x = numberOrPercent(raw);
        if (raw === "") {
          if (need.includes(k) && !out.msgs[i]) out.msgs[i] = { text: `Not used yet: fill in ${h}.`, key: k, pending: true };
        } else if (Number.isNaN(x)) {
          out.msgs[i] = { text: `Row ${i + 1}: ${h} = “${raw}” is not a number.`, key: k };
          break;
        } else v[k] = x;
      }
      if (!out.msgs[i]) { out.rows.push(v); out.at.push(i); }
    });
    return out;
  }

  // rowError puts an error of the module about "…[j].key" beside grid row read.at[j]; it returns
  // false when the error names no row.
  function rowError(read, err, keyOf) {
    const m = /\[(\d+)\]\.(\w+)/.exec(err.field || "");
    const i = m ? read.at[Number(m[1])] : undefined;
    if (i === undefined) return false;
    read.msgs[i] = { text: `Row ${i + 1}: ${sentence(err.error.replace(/^[\w.]*\[\d+\]\.\w+\s*/, m[2] + " "))}`, key: keyOf ? keyOf(m[2]) : m[2] };
    return true;
  }

  // gridMarks shows each row's message under it and marks the cell at fault.
  function gridMarks(g, msgs) {
    g.rows.forEach((row, i) => {
      const tr = document.querySelector(`#${g.id} tr[data-row="${i}"]`);
      const cell = document.getElementById(`${g.id}-msg-${i}`);
      if (!tr || !cell) return;
      tr.querySelectorAll("input").forEach((inp) => { inp.removeAttribute("aria-invalid"); inp.removeAttribute("aria-describedby"); });
      const m = msgs[i];
      const kind = m ? (m.pending ? "pending" : "bad") : "";
      tr.className = kind ? "row-" + kind : "";
      cell.parentElement.className = "row-msg " + kind;
      cell.textContent = m ? m.text : "";
      cell.parentElement.hidden = !m;
      const input = m && document.getElementById(`${g.id}-r${i}-${m.key}`);
      if (input) {
        input.setAttribute("aria-invalid", "true");
        input.setAttribute("aria-describedby", cell.id);
      }
    });
  }

  // saveList stores list as the project's key after the project check; it returns the check's
  // error, or null.
  function saveList(key, list) {
    const p = state.project;
    if (JSON.stringify(list) === JSON.stringify(p[key] || [])) return null;
    const next = { ...p, [key]: list };
    if (!list.length) delete next[key];
    const checked = call("checkProject", { project: next });
    if (isError(checked)) return checked;
    if (list.length) p[key] = checked.project[key]; else delete p[key];
    scheduleSave();
    return null;
  }

  // pasteInto adds the rows of a pasted block to grid g: columns in the grid's order, or named by
  // a header line (headerKey maps a heading to a key). Nothing is added when a cell cannot be read.
  function pasteInto(g, area, headerKey) {
    clearFieldError(area);
    const fail = (msg) => setFieldError(area, capital(sentence(msg)) + " Nothing was added.");
    if (!area.value.trim()) return setFieldError(area, "Paste the cells from your spreadsheet into the box first.");
    let order = g.cols.map((c) => c[0]);
    const rows = [];
    const lines = area.value.split(/\r\n|\r|\n/);
    for (let n = 0; n < lines.length; n++) {
      if (!lines[n].trim()) continue;
      const cells = splitCells(lines[n]).map((c) => (/^[-–]$/.test(c) ? "" : c));
      if (!rows.length && cells.every((c) => !c || Number.isNaN(numberOrPercent(c)))) {
        const named = cells.map((c) => (headerKey ? headerKey(c) : undefined));
        if (named.some(Boolean)) order = named;
        continue;
      }
      // Columns a header does not name are left out.
      const bad = cells.findIndex((c, k) => order[k] && c && Number.isNaN(numberOrPercent(c)));
      if (bad >= 0) return fail(`line ${n + 1}: “${cells[bad]}” is not a number`);
      if (cells.length > order.length && cells.slice(order.length).some(Boolean)) return fail(`line ${n + 1} has ${cells.length} columns; the table takes ${order.length}`);
      const row = {};
      cells.forEach((c, k) => { if (order[k] && c) row[order[k]] = c; });
      rows.push(row);
    }
    if (!rows.length) return fail("no rows of numbers were found");
    if (g.rows.length + rows.length > g.max) return fail(`the table holds at most ${g.max} rows`);
    g.rows.push(...rows);
    area.value = "";
    drawGrid(g);
    g.edited();
  }

  // triadHeader maps a heading such as "f10", "F1", "A112" or "211" to a column of the triads.
  function triadHeader(c) {
    const t = c.replace(/\s/g, "");
    if (/^f(10?)?$/.test(t)) return "f10";
    if (/^F1?$/.test(t)) return "F1";
    const m = /^A?(\d{3})/i.exec(t);
    const k = m && "A" + ({ 211: "112", 122: "221" }[m[1]] || m[1]);
    return k && TRIAD_COLS.some((col) => col[0] === k) ? k : undefined;
  }

  // triadsEdited reads the triads grid, saves it when every row reads, checks the family sums
  // and schedules the comparison of the models.
  function triadsEdited() {
    if (!state.project) return;
    const g = extra.triads;
    const read = readGrid(g, ["f10"]);
    const blocked = read.msgs.some(Boolean);
    const err = blocked ? null : saveList("triads", read.rows);
    const unsaved = err && !rowError(read, err) ? ` Not saved: ${sentence(err.error)}` : "";
    read.rows.forEach((v, j) => {
      const i = read.at[j];
      for (const fam of FAMILIES) {
        const keys = fam.map((f) => f[0]);
        const sum = keys.reduce((a, k) => a + v[k], 0);
        if (!read.msgs[i] && Math.abs(sum - 1) > SUM_TOLERANCE) {
          read.msgs[i] = { text: `Row ${i + 1}: ${keys.join(" + ")} = ${fix(sum, 3)}; each family sums to 1 (within ${SUM_TOLERANCE}).`, key: keys[0] };
        }
      }
    });
    gridMarks(g, read.msgs);
    const bad = read.msgs.some(Boolean);
    setText("#triad-status", (!g.rows.length ? "The table is empty." : `${read.at.filter((i) => !read.msgs[i]).length} of ${g.rows.length} rows usable.` +
      (blocked || err ? " The table is not saved until the marked rows are corrected or completed." : bad ? " Correct the marked rows to compare the models." : "")) + unsaved);
    clearTimeout(extra.discTimer);
    if (bad) return setText("#disc-status", extra.disc ? "Comparison not updated: correct the marked rows." : "");
    extra.discTimer = setTimeout(() => runDisc(read), DISC_DELAY_MS);
  }

  // runDisc fits both models to the rows read and shows the comparison.
  function runDisc(read) {
    if (!read.rows.length) {
      extra.disc = null;
      $("#disc-results").hidden = true;
      return setText("#disc-status", "Enter measured triads to compare the terminal and the penultimate model.");
    }
    const d = call("discriminate", { runs: read.rows });
    if (isError(d)) {
      if (rowError(read, d)) gridMarks(extra.triads, read.msgs);
      return setText("#disc-status", `${extra.disc ? "Comparison not updated" : "No comparison yet"}: ${sentence(read.msgs.some(Boolean) ? "correct the marked row" : d.error.replace(/^runs:\s*/, ""))}`);
    }
    extra.disc = d;
    drawDisc(d, read);
  }

  function drawDisc(d, read) {
    $("#disc-results").hidden = false;
    setText("#disc-status", d.verdict);
    const names = { terminal: ["r1", "r2"], penultimate: ["r11", "r21", "r22", "r12"] };
    const body = document.createElement("tbody");
    for (const m of [d.terminal, d.penultimate]) {
      const tr = document.createElement("tr");
      tr.dataset.model = m.model;
      const cells = [MODEL_NAME[m.model], names[m.model].map((k, i) => `${k} = ${rat(m.params[i])} ± ${se(m.se[i])}`).join(", "),
        sig3(m.ssr), `${m.n}, ${m.k} ratios`, fix(m.aicc, 1)];
      cells.forEach((text, i) => {
        const c = document.createElement(i ? "td" : "th");
        c.textContent = text;
        tr.append(c);
      });
      body.append(tr);
    }
    $("#disc-table tbody").replaceWith(body);
    const dof = d.terminal.n - 4;
    setText("#disc-test", `Extra-sum-of-squares F-test: F = ${sig3(d.F)} on 2 and ${dof} degrees of freedom, p = ${sig3(d.pValue)} (below 0.05 favours the penultimate model). ` +
      `AICc is lower for the ${d.deltaAIC > 0 ? "penultimate" : "terminal"} model by ${fix(Math.abs(d.deltaAIC), 1)} (a difference above 2 counts).`);
    const pp = d.penultimate.params;
    $("#disc-use").textContent = `Use the penultimate ratios in step 4 (${names.penultimate.map((k, i) => `${k} = ${rat(pp[i])}`).join(", ")})`;

    // Curves of each fitted model over the feed, from copoly.sequence.
    const f = linspace(0.01, 0.99, 50);
    const tp = d.terminal.params;
    const curve = (args) => f.map((x) => { const s = call("sequence", { ...args, f1: x, maxLength: 1 }); return isError(s) ? null : s.triads; });
    const ct = curve({ r1: tp[0], r2: tp[1] });
    const cp = curve({ model: "penultimate", r11: pp[0], r21: pp[1], r22: pp[2], r12: pp[3] });
    const colors = [C.m1, C.cum, C.limit], shapes = ["circle", "square", "diamond"];
    FAMILIES.forEach((fam, k) => {
      const layers = [], legend = [], csv = [["f1", ...fam.flatMap(([, t]) => [`${t} terminal`, `${t} penultimate`])]];
      fam.forEach(([key, t], i) => {
        for (const [c, dash] of [[ct, "7 4"], [cp, null]]) layers.push({ type: "line", x: f, y: c.map((s) => (s ? s[t] : NaN)), color: colors[i], width: 2, dash });
        const rows = read.rows.filter((r) => r[key] !== undefined);
        layers.push({ type: "points", x: rows.map((r) => r.f10), y: rows.map((r) => r[key]), color: colors[i], shape: shapes[i] });
        legend.push({ label: TRIAD_COLS.find((col) => col[0] === key)[1], color: colors[i], kind: "point", shape: shapes[i] });
      });
      f.forEach((x, j) => csv.push([x, ...fam.flatMap(([, t]) => [ct[j] ? ct[j][t] : "", cp[j] ? cp[j][t] : ""])]));
      legend.push({ label: "terminal fit", color: C.feed, dash: "7 4", width: 2 }, { label: "penultimate fit", color: C.feed, width: 2 });
      mountFigure(`fig-triads${k + 1}`, Plot.chart({
        title: `Triads centred on M${k + 1}: measured and fitted`, width: 600, height: 420,
        x: { min: 0, max: 1, label: "f10, mole fraction of M1 in the feed" }, y: { min: 0, max: 1, label: "triad fraction" }, layers, legend,
      }), `triads-m${k + 1}`, csv);
    });

    const pred = document.createElement("tbody");
    read.rows.forEach((r, j) => {
      for (const [key, h] of TRIAD_COLS.slice(1)) {
        if (r[key] === undefined) continue;
        const tr = document.createElement("tr");
        for (const text of [String(read.at[j] + 1), fix(r.f10, 3), h, fix(r[key], 3), fix(d.predicted.terminal[j][key], 3), fix(d.predicted.penultimate[j][key], 3)]) {
          const td = document.createElement("td");
          td.textContent = text;
          tr.append(td);
        }
        pred.append(tr);
      }
    });
    $("#disc-pred tbody").replaceWith(pred);
  }

  // useDisc puts the fitted penultimate ratios into the model of step 4.
  function useDisc() {
    const d = extra.disc;
    if (!d || !state.project) return;
    $("#model-kind").value = "penultimate";
    MODEL_RATIOS.slice(0, 4).forEach(([k], i) => { $("#m-" + k).value = String(Number(d.penultimate.params[i].toPrecision(4))); });
    showModelFields();
    recompute();
    setText("#disc-use-note", state.invalid ? "The ratios are in step 4, but a field of steps 1 to 4 is not valid; correct it to use them."
      : "Steps 2, 3 and 4 and the simulated chains now use the explicit penultimate model with these ratios.");
  }

  const simKey = (p) => JSON.stringify([modelArgs(p), p.f10]);

  // runSim grows the chains of the simulation (copoly.chains) with the panel's inputs.
  function runSim() {
    const p = state.project;
    if (!p || engineStopped) return;
    let bad = false;
    const get = (sel, label) => {
      const input = $(sel), raw = input.value.trim(), v = parseNumber(raw);
      clearFieldError(input);
      if (Number.isNaN(v)) {
        setFieldError(input, raw ? `${label} = “${raw}” is not a number.` : `Enter the ${label}.`);
        bad = true;
      }
      return v;
    };
    const byDpn = $("#sim-kind").value === "dpn";
    const a = { ...modelArgs(p), f10: p.f10, count: get("#sim-count", "number of chains"), conversion: get("#sim-conversion", "conversion"), seed: get("#sim-seed", "seed") };
    a[byDpn ? "dpn" : "length"] = get("#sim-n", byDpn ? "DPn" : "chain length");
    if ($("#sim-functional").value) a.functional = Number($("#sim-functional").value);
    const not = extra.sim ? "Not updated" : "No chains yet";
    if (bad) return setText("#sim-status", `${not}: correct the marked field.`);
    const c = call("chains", a);
    if (isError(c)) {
      const sel = { dpn: "#sim-n", length: "#sim-n", count: "#sim-count", conversion: "#sim-conversion", seed: "#sim-seed" }[c.field];
      if (sel) setFieldError($(sel), capital(sentence(c.error.replace(/^dpn\b/, "DPn").replace(/^count\b/, "number of chains"))));
      return setText("#sim-status", `${not}: ${sel ? "correct the marked field." : sentence(c.error) + " See steps 1, 3 and 4."}`);
    }
    extra.sim = c;
    extra.simKey = simKey(p);
    drawSim(p, c, a);
  }

  function drawSim(p, c, a) {
    $("#sim-results").hidden = false;
    const n = c.compositions.length;
    setText("#sim-status", `${n} chains, ${c.units} units in all, grown with the ${MODEL_NAME[modelKind(p)]} from f10 = ${fix(p.f10, 3)}` +
      (a.conversion > 0 ? ` along a batch to X = ${shortNum(a.conversion)}.` : " at a constant feed."));
    const sv = c.stockmayerVariance;
    setText("#sim-summary", `Chain composition F1: mean ${fix(c.mean, 4)} over chains, ${fix(c.weightMean, 4)} over units; variance between chains ${sig3(c.variance)} (standard deviation ${fix(Math.sqrt(c.variance), 3)}). ` +
      (Number.isFinite(sv) ? `Stockmayer's distribution predicts ${sig3(sv)} for chains of these lengths (F1·F2·κ·⟨1/n⟩, terminal model at a constant feed).`
        : "Stockmayer's variance holds for the terminal model at a constant feed only."));

    const h = c.histogram, nb = h.weights.length, mid = h.edges.slice(0, nb).map((e, i) => (e + h.edges[i + 1]) / 2);
    const layers = [{ type: "bars", x0: h.edges.slice(0, nb), x1: h.edges.slice(1), y: h.weights, color: C.inst }];
    const legend = [{ label: "simulated chains", color: C.inst, kind: "box" }];
    if (c.stockmayer) {
      layers.push({ type: "line", x: mid, y: c.stockmayer, color: C.cum, width: 2.4 });
      legend.push({ label: "Stockmayer's distribution", color: C.cum });
    }
    const top = Math.max(...h.weights, ...(c.stockmayer || []), 1e-9);
    // The axis spans the bins that hold anything.
    const used = h.weights.map((w, i) => w > 0 || (c.stockmayer && c.stockmayer[i] > top * 1e-3));
    const i0 = Math.max(0, used.indexOf(true) - 1), i1 = Math.min(nb, used.lastIndexOf(true) + 2);
    mountFigure("fig-sim-hist", Plot.chart({
      title: `Composition of ${n} chains`, width: 600, height: 380,
      x: { min: h.edges[i0], max: h.edges[i1] > h.edges[i0] ? h.edges[i1] : h.edges[i0] + 1e-3, label: "F1 of the chain", ticks: 6 },
      y: { min: 0, max: top * 1.1, label: "fraction of units" }, layers, legend,
    }), "chain-compositions", [["F1 from", "F1 to", "fraction of units", ...(c.stockmayer ? ["Stockmayer"] : [])],
      ...h.weights.map((w, i) => [h.edges[i], h.edges[i + 1], w, ...(c.stockmayer ? [c.stockmayer[i]] : [])])]);

    const fc = c.functionalCounts;
    const name = a.functional === 1 ? m1Name(p) : m2Name(p);
    if (fc && fc.length) {
      const k = fc.map((_, i) => i), frac = fc.map((v) => v / n);
      let sum = 0;
      const last = Math.max(1, frac.findIndex((v) => (sum += v) >= 0.995));
      mountFigure("fig-sim-func", Plot.chart({
        title: `Units of M${a.functional} (${name}) per chain`, width: 600, height: 340,
        x: { min: -0.6, max: last + 0.6, label: "functional units in the chain", integer: true },
        y: { min: 0, max: Math.max(...frac, 1e-9) * 1.1, label: "fraction of chains" },
        layers: [{ type: "bars", x0: k.map((v) => v - 0.4), x1: k.map((v) => v + 0.4), y: frac, color: a.functional === 1 ? C.m1 : C.m2 }],
      }), "functional-units", [["units", "chains", "fraction"], ...fc.map((v, i) => [i, v, frac[i]])]);
      setText("#sim-func", `${pct(c.nonFunctional)} of the chains carry no ${name} unit: chains that cannot crosslink.` +
        (Number.isFinite(c.expectedNonFunctional) ? ` The terminal model gives ${pct(c.expectedNonFunctional)} analytically for these lengths at a constant feed.` : ""));
    } else {
      figNote("fig-sim-func", "Choose a functional monomer to count its units per chain.");
      setText("#sim-func", "");
    }
    mountFigure("fig-sim-strips", Plot.strips({
      title: `The first ${c.samples.length} of ${n} chains`, width: 600, chains: c.samples, colors: [C.m1, C.m2],
      legend: [{ label: `M1 (${m1Name(p)})`, color: C.m1, kind: "box" }, { label: `M2 (${m2Name(p)})`, color: C.m2, kind: "box" }],
    }), "simulated-chains", [["chain", "sequence (1 = M1, 2 = M2)"], ...c.samples.map((s, i) => [i + 1, s])]);
  }

  // sizeGrid shows the table of the chosen form and reads it.
  function sizeGrid() {
    const bins = $("#size-kind").value === "bins";
    extra.size = bins ? extra.bins : extra.slices;
    $("#size-basis").closest(".field").hidden = !bins;
    setText("#size-caption", bins ? "Classes of molar mass, each counted at the middle of its range; saved with the project"
      : "Chromatogram slices: molar mass from the calibration, detector signal proportional to the polymer's mass; these stay in this tab and are not saved with the project");
    drawGrid(extra.size);
    sizeEdited();
  }

  function loadSize(p) {
    const bins = p.sizeBins || [];
    const basis = bins.some((b) => b.numberFraction > 0) ? "numberFraction" : "weightFraction";
    $("#size-basis").value = basis;
    extra.bins.rows = bins.map((b) => ({ low: String(b.low), high: String(b.high), fraction: String(b[basis] || 0) }));
    sizeGrid();
  }

  // grouped prints a molar mass to 4 significant digits with thin spaces between thousands.
  const grouped = (v) => {
    const r = Number(v.toPrecision(4));
    return r >= 1000 ? String(Math.round(r)).replace(/\B(?=(\d{3})+(?!\d))/g, "\u202f") : String(r);
  };

  // sizeEdited reads the size table, saves the classes and shows the averages (copoly.averages).
  function sizeEdited() {
    const p = state.project;
    if (!p) return;
    const g = extra.size, bins = g === extra.bins, basis = $("#size-basis").value;
    const read = readGrid(g, g.cols.map((c) => c[0]));
    const blocked = read.msgs.some(Boolean);
    const keyOf = (k) => (/Fraction$/.test(k) ? "fraction" : k);
    const list = read.rows.map((v) => (bins ? { low: v.low, high: v.high, [basis]: v.fraction } : { mass: v.mass, signal: v.signal }));
    let err = bins && !blocked ? saveList("sizeBins", list) : null;
    let r = null;
    const not = $("#size-out").hidden ? "No averages yet" : "Averages not updated";
    let status = "";
    if (blocked) status = `${not}: ${bins ? "the table is not saved until " : ""}the marked rows are corrected or completed.`;
    else if (!list.length) status = "Enter the distribution to see its averages.";
    else if (!err) {
      const a = { [bins ? "bins" : "slices"]: list };
      const F1 = sizeF1(p);
      if (Number.isFinite(F1) && p.monomer1.molarMass > 0 && p.monomer2.molarMass > 0) Object.assign(a, { F1, molarMass1: p.monomer1.molarMass, molarMass2: p.monomer2.molarMass });
      r = call("averages", a);
      if (isError(r)) { err = r; r = null; } else drawSize(p, r, a);
    }
    if (err) status = rowError(read, err, keyOf) ? `${not}: correct the marked row.` : `${not}: ${sentence(err.error)}`;
    gridMarks(g, read.msgs);
    setText("#size-status", status);
  }

  // sizeF1 is the cumulative copolymer of step 3 at its final conversion.
  function sizeF1(p) {
    const d = call("drift", { ...modelArgs(p), f10: p.f10, conversion: [0, p.conversion] });
    return isError(d) ? NaN : d.F1cum[d.F1cum.length - 1];
  }

  function drawSize(p, r, a) {
    const rows = [["Mn", "Mn, number average", grouped(r.Mn) + " g/mol"], ["Mw", "Mw, weight average", grouped(r.Mw) + " g/mol"],
      ["Mz", "Mz", grouped(r.Mz) + " g/mol"], ["D", "Dispersity Đ = Mw/Mn", fix(r.dispersity, 3)]];
    const s = r.size;
    if (s) {
      rows.push(["DPn", "DPn, units per chain (number average)", grouped(s.DPn)], ["DPw", "DPw (weight average)", grouped(s.DPw)],
        ["units1", `M1 (${m1Name(p)}) units per chain, number average`, grouped(s.units1)],
        ["units2", `M2 (${m2Name(p)}) units per chain, number average`, grouped(s.units2)]);
    }
    $("#size-out").replaceChildren(...rows.map(([key, label, value]) => {
      const div = document.createElement("div");
      const dt = document.createElement("dt");
      dt.textContent = label;
      const dd = document.createElement("dd");
      dd.dataset.key = key;
      dd.textContent = value;
      div.append(dt, dd);
      return div;
    }));
    $("#size-out").hidden = false;
    setText("#size-note", s ? `Units per chain with F1 = ${fix(a.F1, 3)}, the cumulative copolymer of step 3 at X = ${shortNum(p.conversion)} (${MODEL_NAME[modelKind(p)]}), and the molar masses of step 1: a mean unit of ${fix(s.unitMass, 2)} g/mol. End groups are neglected.`
      : "Give both molar masses in step 1 to turn the averages into units per chain.");
  }

  // loadExtra puts a project's triads and size classes on screen.
  function loadExtra(p) {
    if (!extra.started) return;
    const TK = TRIAD_COLS.map((c) => c[0]);
    extra.triads.rows = (p.triads || []).map((r) => Object.fromEntries(TK.map((k) => [k, r[k] >= 0 ? String(r[k]) : ""])));
    extra.triads.undo = extra.bins.undo = null;
    $("#triad-undo").hidden = $("#size-undo").hidden = true;
    extra.disc = null;
    $("#disc-results").hidden = true;
    drawGrid(extra.triads);
    triadsEdited();
    loadSize(p);
  }

  // startExtra draws steps 9 and 10 the first time, after the first results are on screen.
  function startExtra() {
    if (extra.started || !state.project || engineStopped) return;
    extra.started = true;
    loadExtra(state.project);
  }

  // ---- Library ------------------------------------------------------------------------------

  const sameName = (a, b) => a.trim().toLowerCase() === b.trim().toLowerCase();
  const findMonomer = (name) => state.library.monomers.find((m) => sameName(m.name, name));

  function fillPickers() {
    const pairPick = $("#pair-pick");
    state.library.pairs.forEach((pr, i) => {
      const o = document.createElement("option");
      o.value = String(i);
      o.textContent = `${pr.monomer1} / ${pr.monomer2}: r1 ${pr.r1}, r2 ${pr.r2}${pr.temperature ? ", " + pr.temperature : ""}`;
      pairPick.append(o);
    });
    fillMonomerPickers();
  }

  // fillMonomerPickers offers the library's monomers ("b3") and the user's own ("u0"), these
  // marked "(yours)".
  function fillMonomerPickers() {
    const option = (value, text) => {
      const o = document.createElement("option");
      o.value = value;
      o.textContent = text;
      return o;
    };
    const group = (label, options) => {
      const g = document.createElement("optgroup");
      g.label = label;
      g.append(...options);
      return g;
    };
    for (const sel of ["#pick1", "#pick2"]) {
      const items = [option("", "Choose a monomer…"),
        group("Library", state.library.monomers.map((m, i) => option(`b${i}`, `${m.name} (${shortNum(m.molarMass)} g/mol)`)))];
      const mine = ownMonomers();
      if (mine.length) {
        items.push(group("Yours", mine.map((m, i) => option(`u${i}`, `${m.name} (yours${m.molarMass > 0 ? `, ${shortNum(m.molarMass)} g/mol` : ""})`))));
      }
      $(sel).replaceChildren(...items);
    }
  }

  function pickPair() {
    const pr = state.library.pairs[Number($("#pair-pick").value)];
    $("#pair-pick").value = "";
    if (!pr) return;
    const a = findMonomer(pr.monomer1), b = findMonomer(pr.monomer2);
    $("#name1").value = pr.monomer1;
    $("#name2").value = pr.monomer2;
    $("#mass1").value = a ? shortNum(a.molarMass) : "";
    $("#mass2").value = b ? shortNum(b.molarMass) : "";
    $("#r1").value = shortNum(pr.r1);
    $("#r2").value = shortNum(pr.r2);
    $("#ratio-source").value = pr.source + (pr.temperature ? ` (${pr.temperature})` : "");
    state.formJcr = null;
    recompute();
  }

  function pickMonomer(which) {
    const sel = $(`#pick${which}`);
    const v = sel.value;
    sel.value = "";
    const m = v[0] === "u" ? ownMonomers()[Number(v.slice(1))] : state.library.monomers[Number(v.slice(1))];
    if (!m) return;
    $(`#name${which}`).value = m.name;
    $(`#mass${which}`).value = m.molarMass > 0 ? shortNum(m.molarMass) : "";
    recompute();
  }

  // drawLibraryNotes shows, beside each value, the library entry that matches the names typed.
  function drawLibraryNotes(p) {
    for (const [which, mono] of [[1, p.monomer1], [2, p.monomer2]]) {
      const e = monomerEntry(mono.name);
      const m = e ? e.m : null;
      const differs = m && m.molarMass > 0 && Math.abs(m.molarMass - mono.molarMass) > 1e-9 ? " (differs from the value above)" : "";
      setText(`#mass${which}-source`, !m ? ""
        : e.own ? `Yours: ${m.name}${m.molarMass > 0 ? `, ${shortNum(m.molarMass)} g/mol` : ""}${differs}.${m.note ? ` Note: ${m.note}` : ""}`
          : `Library: ${m.name}, ${shortNum(m.molarMass)} g/mol${differs}. Source: ${m.source}`);
    }
    const n1 = p.monomer1.name, n2 = p.monomer2.name;
    const matches = state.library.pairs.filter((pr) =>
      (sameName(pr.monomer1, n1) && sameName(pr.monomer2, n2)) || (sameName(pr.monomer1, n2) && sameName(pr.monomer2, n1)));
    const texts = matches.map((pr) => {
      const flipped = !sameName(pr.monomer1, n1);
      const r1 = flipped ? pr.r2 : pr.r1, r2 = flipped ? pr.r1 : pr.r2;
      return `r1 = ${r1}, r2 = ${r2}${pr.temperature ? " at " + pr.temperature : ""}. Source: ${pr.source}`;
    });
    setText("#ratio-library", texts.length ? "Library: " + texts.join(" · ") : "");
  }

  // ---- Project file ---------------------------------------------------------------------------

  // flushPending runs at once the fit and the plan that wait for the typing to pause, so that an
  // export or a printed report made right after an edit holds that edit.
  function flushPending() {
    if (planUI.timer) { clearTimeout(planUI.timer); planUI.timer = 0; runPlan(); }
    if (bench.fitTimer) { clearTimeout(bench.fitTimer); bench.fitTimer = 0; runFit(); }
  }

  function exportProject() {
    flushPending();
    if (!state.project) return;
    const r = call("exportProject", { project: state.project });
    if (isError(r)) return showGeneralError(`Not exported: ${r.error}`);
    Plot.download(new Blob([r.json], { type: "application/json" }), r.filename);
  }

  async function importFile() {
    const input = $("#import-file");
    const file = input.files && input.files[0];
    input.value = "";
    const box = $("#import-error");
    box.hidden = true;
    if (!file) return;
    const fail = (msg) => { box.textContent = `${file.name} was not imported: ${sentence(msg)} Nothing was changed.`; box.hidden = false; };
    if (file.size > IMPORT_MAX_BYTES) return fail(`it is ${file.size} bytes, far larger than a project file.`);
    let text;
    try {
      text = await file.text();
    } catch (e) {
      return fail("the file could not be read.");
    }
    const r = call("importProject", { json: text });
    if (isError(r)) return fail(r.error);
    replaceProject(r.project, `Imported ${file.name}.`);
  }

  function startDemo() {
    const r = call("demoProject", {});
    if (isError(r)) return showGeneralError(r.error);
    replaceProject(r.project, "The invented demo project is loaded.");
  }

  function undoReplace() {
    const prev = state.previous;
    $("#undo-bar").hidden = true;
    if (!prev) return;
    state.previous = null;
    state.project = prev;
    fillForm(prev);
    updateBadge();
    recompute();
    dropBenchUndo();
    loadBench();
    loadPlanPanel(prev);
    loadExtra(prev);
  }

  // ---- Printed report ------------------------------------------------------------------------

  // stampReport writes the date and the engine's version into the print-only head of the report
  // (style.css, @media print, turns the page into the report). It runs once the page is ready
  // and again just before printing, so the date is the date of printing.
  function stampReport() {
    const d = new Date();
    const pad = (n) => String(n).padStart(2, "0");
    const off = -d.getTimezoneOffset();
    const zone = `UTC${off < 0 ? "−" : "+"}${pad(Math.floor(Math.abs(off) / 60))}:${pad(Math.abs(off) % 60)}`;
    const t = $("#print-date");
    t.dateTime = d.toISOString();
    t.textContent = `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())} (${zone})`;
    if (engine && engine.version) setText("#print-version", `version ${engine.version}`);
  }

  function wireReport() {
    $("#print-report").addEventListener("click", () => { flushPending(); stampReport(); window.print(); });
    window.addEventListener("beforeprint", () => { flushPending(); stampReport(); });
    window.matchMedia("print").addEventListener("change", (e) => { if (e.matches) stampReport(); });
    window.copolyReady.then(stampReport, () => {});
  }

  // ---- Start ----------------------------------------------------------------------------------

  function wire() {
    wireReport();
    // Ratios typed by hand no longer match the region of a fit: drop it (before recompute runs).
    for (const sel of ["#r1", "#r2"]) $(sel).addEventListener("input", () => { state.formJcr = null; });
    for (const sel of PROJECT_INPUTS) $(sel).addEventListener("input", recompute);
    $("#model-kind").addEventListener("change", () => { showModelFields(true); recompute(); });
    $("#target-F1").addEventListener("input", () => { if (state.project && !state.invalid) drawFeedFor(state.project); });
    $("#pair-pick").addEventListener("change", pickPair);
    $("#pick1").addEventListener("change", () => pickMonomer(1));
    $("#pick2").addEventListener("change", () => pickMonomer(2));
    $("#export-project").addEventListener("click", exportProject);
    $("#import-file").addEventListener("change", importFile);
    $("#start-demo").addEventListener("click", startDemo);
    $("#undo-replace").addEventListener("click", undoReplace);

    $("#bench-feed-kind").addEventListener("change", (e) => setBenchForm("feedKind", e.target.value));
    $("#bench-conversion-kind").addEventListener("change", (e) => setBenchForm("conversionKind", e.target.value));
    $("#bench-composition-kind").addEventListener("change", (e) => setBenchForm("compositionKind", e.target.value));
    $("#bench-element").addEventListener("input", (e) => {
      if (!state.project) return;
      theBench().element = e.target.value.trim();
      benchChanged(true);
    });
    $("#bench-carrier").addEventListener("change", (e) => setBenchForm("carrier", Number(e.target.value)));
    $("#bench-element-count").addEventListener("input", setElementCount);
    $("#bench-add-row").addEventListener("click", addRow);
    $("#bench-clear").addEventListener("click", clearRows);
    $("#bench-export").addEventListener("click", exportTable);
    $("#bench-import").addEventListener("change", importTable);
    $("#bench-undo").addEventListener("click", undoBench);
    $("#bench-paste-add").addEventListener("click", pasteRows);
    $("#bench-paste").addEventListener("input", () => clearFieldError($("#bench-paste")));
    $("#fit-level").addEventListener("input", onLevelInput);
    $("#fit-use").addEventListener("click", useFitted);
    $("#next-add").addEventListener("click", addNextRuns);

    for (const [sel] of PLAN_BOXES) $(sel).addEventListener("input", onPlanInput);
    $("#plan-table").addEventListener("input", onPlanInput);
    for (const sel of ["#plan-mode", "#plan-feed", "#plan-rate"]) {
      $(sel).addEventListener("change", () => { showPlanFields(); onPlanInput(); });
    }
    $("#plan-all-rows").addEventListener("click", () => {
      planUI.allRows = !planUI.allRows;
      if (planUI.result && state.project) drawSchedule(state.project, planUI.result);
    });
    $("#plan-csv").addEventListener("click", scheduleCSV);
    $("#sf-rate").addEventListener("input", drawStarved);
    const addGridRow = (g) => {
      if (!g || !state.project || g.rows.length >= g.max) return;
      g.rows.push({});
      drawGrid(g);
      g.edited();
      $(`#${g.id}-r${g.rows.length - 1}-${g.cols[0][0]}`).focus();
    };
    $("#triad-add").addEventListener("click", () => addGridRow(extra.triads));
    $("#triad-clear").addEventListener("click", () => gridRemove(extra.triads, -1));
    $("#triad-undo").addEventListener("click", () => gridUndo(extra.triads, "triad"));
    $("#triad-paste-add").addEventListener("click", () => pasteInto(extra.triads, $("#triad-paste"), triadHeader));
    $("#disc-use").addEventListener("click", useDisc);
    $("#sim-run").addEventListener("click", runSim);
    $("#sim-kind").addEventListener("change", (e) => {
      const unit = document.createElement("span");
      unit.className = "unit";
      unit.textContent = "units";
      $("#sim-n-label").replaceChildren(e.target.value === "dpn" ? "DPn " : "Length ", unit);
    });
    $("#size-kind").addEventListener("change", sizeGrid);
    $("#size-basis").addEventListener("change", sizeEdited);
    $("#size-add").addEventListener("click", () => addGridRow(extra.size));
    $("#size-clear").addEventListener("click", () => gridRemove(extra.size, -1));
    $("#size-undo").addEventListener("click", () => gridUndo(extra.size, "size"));
    $("#size-paste-add").addEventListener("click", () => pasteInto(extra.size, $("#size-paste")));
    $("#sf-k").addEventListener("input", drawStarved);
    $("#um-save").addEventListener("click", saveOwn);
    $("#um-clear").addEventListener("click", () => { clearOwnForm(); setText("#um-status", ""); });
    $("#um-undo").addEventListener("click", undoOwn);
  }

  function failStart(err) {
    const box = $("#load-banner");
    const old = err instanceof Unsupported ? " This page needs a browser from 2023 or later with WebAssembly enabled." : " Reload the page to try again.";
    box.textContent = `The calculation engine could not start: ${err && err.message ? err.message : err}.${old} Nothing you saved is lost.`;
    box.hidden = false;
    $("#engine-status").hidden = true;
    document.body.classList.add("engine-stopped");
    readyReject(err instanceof Error ? err : new Error(String(err)));
  }

  async function start() {
    wire();
    wireStorage();
    engine = await startModule();
    // Storage opens on a goroutine: ask for the project first and fill the pickers meanwhile.
    store.tab = tabName();
    const loading = callAsync("loadProject", { tab: store.tab, draft: draftCopy() });
    setText("#engine-version", engine.version ? `version ${engine.version}` : "");
    const lib = call("library", {});
    if (!isError(lib)) state.library = { monomers: lib.monomers || [], pairs: lib.pairs || [] };
    fillPickers();

    const loaded = await loading;
    performance.mark("copoly:loaded");
    let project = null;
    if (isError(loaded)) {
      state.storage = "unavailable";
      setText("#storage-message", `The saved project could not be read: ${loaded.error}`);
      $("#storage-message").hidden = false;
    } else {
      state.storage = loaded.storage;
      project = loaded.project;
      if (loaded.revision) store.revision = loaded.revision;
      showKept(loaded.kept || []);
      if (loaded.message && loaded.storage === "unavailable") {
        // #storage-status already says so; keep the engine's reason at hand without repeating it.
        $("#storage-status").title = loaded.message;
      } else if (loaded.message) {
        setText("#storage-message", loaded.message);
        $("#storage-message").hidden = false;
      }
    }
    if (project) {
      state.savedAt = project.savedAt || "";
      store.storedKey = projectKey(project);
      store.loaded = project;
    } else {
      const demo = call("demoProject", {});
      if (isError(demo)) throw new Error(demo.error);
      project = demo.project;
    }
    state.project = project;
    if (ownMonomers().length) fillMonomerPickers();
    fillForm(project);
    updateBadge();
    showStorageStatus();
    // The first draw must not count as a change: draw without scheduling a save.
    const form = readForm();
    const errs = form.errors || drawAll(project);
    if (errs.length) markInvalid(errs);
    // Typing restored from this tab's draft is a change: checked, drawn and saved like one.
    if (restoreDraft(isError(loaded) ? null : loaded.draft)) recompute();
    $("#engine-status").hidden = true;
    performance.mark("copoly:ready");
    readyResolve();
    // Steps 5 to 8 (conversion of the bench grid, the fit, the plan) come after the first results.
    setTimeout(startEstimation, 0);
    setTimeout(startPlanning, 0);
    setTimeout(startExtra, 0);
  }

  start().catch(failStart);
})();
