// app.js: the copoly page. Loads the embedded WebAssembly module, reads the form, calls the
// `copoly` object (contract: site/copoly.d.ts) and draws the results.
//
// Rules kept here:
//   - every user or file text reaches the page through textContent, never innerHTML;
//   - an invalid input is marked beside its field and never replaces the last valid project, its
//     results stay on screen and it is never saved;
//   - the project is saved (debounced) after every valid change;
//   - the module exiting (go.run resolving) is a crash: #fatal-banner says so.
"use strict";

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

  function base64Bytes(text) {
    if (typeof Uint8Array.fromBase64 === "function") return Uint8Array.fromBase64(text);
    const bin = atob(text);
    const out = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
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
    const gz = base64Bytes(block.textContent.trim());
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

  // FIELD_INPUT maps the API's field names (after dropping "project." and any "[i]") to inputs.
  const FIELD_INPUT = {
    "name": "#project-name",
    "monomer1.name": "#name1", "monomer1.molarMass": "#mass1", "molarMass1": "#mass1", "monomer1": "#name1",
    "monomer2.name": "#name2", "monomer2.molarMass": "#mass2", "molarMass2": "#mass2", "monomer2": "#name2",
    "r1": "#r1", "r2": "#r2", "ratioSource": "#ratio-source", "notes": "#notes",
    "f10": "#f10", "f1": "#f10", "conversion": "#conversion", "tolerance": "#tolerance",
    "targetF1": "#target-F1",
  };

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
    message = message.replace(/^project\./, "");
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
    return errors.length ? { errors } : { project };
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
    for (const sel of PROJECT_INPUTS) clearFieldError($(sel));
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
    scheduleSave();
  }

  function markInvalid(errors) {
    state.invalid = true;
    for (const { input, message } of errors) {
      if (input) setFieldError(input, message);
      else showGeneralError(message);
    }
    document.querySelectorAll(".stale-note").forEach((n) => { n.hidden = false; });
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

  async function save() {
    if (!state.project || engineStopped) return;
    const project = state.project;
    const r = await callAsync("saveProject", { project });
    if (isError(r)) {
      if (state.storage === "unavailable") showStorageStatus();
      else setText("#storage-status", `Not saved: ${sentence(r.error)} Export the project to keep this version.`);
      return;
    }
    state.storage = r.storage || "indexeddb";
    project.savedAt = r.savedAt;
    state.savedAt = r.savedAt;
    showStorageStatus();
  }

  function showStorageStatus() {
    let text;
    if (state.storage === "unavailable") {
      text = "Browser storage unavailable — your work is kept only in this tab; export the project to keep it";
    } else if (state.savedAt) {
      text = `Saved ${clockTime(state.savedAt)}`;
    } else {
      text = "Not saved yet; every valid change is saved in this browser";
    }
    if (state.invalid) text += " · the marked field is not valid, so that change is not saved";
    setText("#storage-status", text);
  }

  // updateBadge shows the demo badge for the invented demo and refreshes the print copies of
  // the long text fields, which a printed input box would cut off.
  function updateBadge() {
    const p = state.project;
    $("#demo-badge").hidden = !(p && p.invented);
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
  }

  // ---- Drawing ------------------------------------------------------------------------------

  function mountFigure(id, svg, name, csvRows) {
    const fig = document.getElementById(id);
    const area = fig.querySelector(".plot-area");
    area.replaceChildren(svg);
    const actions = fig.querySelector(".plot-actions");
    const base = `${slug(state.project ? state.project.name : "")}-${name}`;
    actions.replaceChildren(
      button("Save SVG", () => Plot.saveSVG(svg, base + ".svg")),
      button("Save PNG", () => Plot.savePNG(svg, base + ".png").catch((e) => showGeneralError(`PNG not saved: ${e.message}`))),
      ...(csvRows ? [button("Save data (CSV)", () => Plot.saveCSV(csvRows, base + ".csv"))] : []),
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
    const ratios = { r1: p.r1, r2: p.r2 };

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

    if (isError(comp)) fail(comp); else drawComposition(p, comp, drift);
    if (drift) drawDrift(p, drift);
    if (isError(seq)) fail(seq); else drawSequence(p, seq);
    if (isError(chains)) fail(chains); else drawChains(p, chains);
    drawLibraryNotes(p);
    if (!errors.length) drawFeedFor(p);
    return errors;
  }

  function drawComposition(p, comp, drift) {
    const f1 = linspace(0, 1, COMPOSITION_POINTS);
    setText("#out-azeotrope", comp.azeotrope === null || comp.azeotrope === undefined ? "none" : fix(comp.azeotrope, 3));
    setText("#out-product", sig3(comp.classification.product));
    setText("#out-class", comp.classification.text);
    const layers = [
      { type: "line", x: [0, 1], y: [0, 1], color: C.diag, width: 1.5, dash: "5 5" },
      { type: "line", x: f1, y: comp.F1, color: C.inst, width: 3 },
    ];
    const legend = [
      { label: "F1 (Mayo–Lewis)", color: C.inst },
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
    const lim = d.limit.conversion;
    const final = d.conversion[d.conversion.length - 1];
    setText("#out-limit", pct(lim));
    const F10 = d.F1[0];
    setText("#out-limit-note", lim >= 1
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

    const tol = d.limit.tolerance;
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
    setText("#seq-col-batch", batch ? `Batch to X = ${fix(batch.conversion, 3)}` : "Batch");
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
        td.dataset.stat = key;
        td.dataset.col = col;
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
    for (const sel of ["#pick1", "#pick2"]) {
      state.library.monomers.forEach((m, i) => {
        const o = document.createElement("option");
        o.value = String(i);
        o.textContent = `${m.name} (${shortNum(m.molarMass)} g/mol)`;
        $(sel).append(o);
      });
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
    recompute();
  }

  function pickMonomer(which) {
    const sel = $(`#pick${which}`);
    const m = state.library.monomers[Number(sel.value)];
    sel.value = "";
    if (!m) return;
    $(`#name${which}`).value = m.name;
    $(`#mass${which}`).value = shortNum(m.molarMass);
    recompute();
  }

  // drawLibraryNotes shows, beside each value, the library entry that matches the names typed.
  function drawLibraryNotes(p) {
    for (const [which, mono] of [[1, p.monomer1], [2, p.monomer2]]) {
      const m = mono.name ? findMonomer(mono.name) : null;
      setText(`#mass${which}-source`, m
        ? `Library: ${m.name}, ${shortNum(m.molarMass)} g/mol${Math.abs(m.molarMass - mono.molarMass) > 1e-9 ? " (differs from the value above)" : ""}. Source: ${m.source}`
        : "");
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

  function exportProject() {
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
  }

  // ---- Start ----------------------------------------------------------------------------------

  function wire() {
    for (const sel of PROJECT_INPUTS) $(sel).addEventListener("input", recompute);
    $("#target-F1").addEventListener("input", () => { if (state.project && !state.invalid) drawFeedFor(state.project); });
    $("#pair-pick").addEventListener("change", pickPair);
    $("#pick1").addEventListener("change", () => pickMonomer(1));
    $("#pick2").addEventListener("change", () => pickMonomer(2));
    $("#export-project").addEventListener("click", exportProject);
    $("#import-file").addEventListener("change", importFile);
    $("#start-demo").addEventListener("click", startDemo);
    $("#undo-replace").addEventListener("click", undoReplace);
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
    engine = await startModule();
    // Storage opens on a goroutine: ask for the project first and fill the pickers meanwhile.
    const loading = callAsync("loadProject", {});
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
    } else {
      const demo = call("demoProject", {});
      if (isError(demo)) throw new Error(demo.error);
      project = demo.project;
    }
    state.project = project;
    fillForm(project);
    updateBadge();
    showStorageStatus();
    // The first draw must not count as a change: draw without scheduling a save.
    const form = readForm();
    const errs = form.errors || drawAll(project);
    if (errs.length) markInvalid(errs);
    $("#engine-status").hidden = true;
    performance.mark("copoly:ready");
    readyResolve();
  }

  start().catch(failStart);
})();
