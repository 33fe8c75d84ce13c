// @ts-check
// storage.js: saves, conflicts, kept copies and drafts (the project bar's storage notices).
//
// Each save is based on the stored revision this tab loaded or last saved; when another tab
// saved since, copoly keeps this tab's version as a conflict copy, leaves the other untouched,
// and #conflict-bar asks which to keep. A failed save (storage full) keeps the project on the
// page and in memory and is tried again with the next change. Copies set aside (stored files that
// could not be read, conflict copies) are offered in #kept-bar. The form as typed, valid or not,
// is saved as this tab's draft a moment after each keystroke and when the tab is hidden or left;
// after a reload #draft-bar says it was restored.
//
// The project is saved SAVE_DELAY_MS after each change of it (the store's "project", for any
// reason but "load" and "saved"), never while the form is invalid. This tab's storage calls run
// one after another, under a lock shared by the tabs of this browser where there is one.

import { $, button, setText } from "./dom.js";
import { download } from "./download.js";
import * as engine from "./engine.js";
import { showGeneralError } from "./fields.js";
import { DRAFT_INPUTS, formText, restoreText } from "./form.js";
import { clockTime } from "./format.js";
import { storageReason } from "./messages.js";
import { task } from "./schedule.js";

/** @import { Draft, KeptCopy, Project, Revision, SaveResult } from "../copoly" */
/** @import { PageStore, ProjectChange } from "./state.js" */

const SAVE_DELAY_MS = 300;
const DRAFT_DELAY_MS = 150;
const DRAFT_COPY = "copoly-draft"; // sessionStorage key of this tab's copy of its draft

/** @type {Set<ProjectChange | string>} the changes of the project that are saved */
const SAVED = new Set(["form", "bench", "level", "plan", "userMonomers", "triads", "sizeBins"]);

/** projectKey is what a save compares: the project without the time it was saved. @param {Project} p */
const projectKey = (p) => JSON.stringify({ ...p, savedAt: undefined });

/**
 * @typedef {object} StorageHooks  what storage asks of the page
 * @property {PageStore} store
 * @property {(p: Project, why: string) => Promise<void>} replaceProject  put p on screen in place of the project, offering to bring it back
 * @property {(p: Project) => void} fill       write a project into the form (no other part of the page)
 * @property {() => Promise<void>} recompute   read the form and draw
 */

/**
 * @typedef {object} Storage
 * @property {() => Promise<{project: Project | null, draft: Draft | null}>} load  start loading the stored project (call once, when the module runs)
 * @property {() => void} showStatus   write #storage-status
 * @property {(draft: Draft | null) => boolean} restoreDraft  put a draft's typing back into the form; it reports whether any text changed
 */

/**
 * createStorage wires the project bar's storage notices and the saving of the project.
 * @param {StorageHooks} page
 * @returns {Storage}
 */
export function createStorage(page) {
  const { store } = page;
  const st = {
    /** @type {Revision} the stored revision the next save is based on */
    revision: { n: 0, writer: "" },
    storedKey: "",            // projectKey of what this tab last stored or loaded
    failed: "",               // why the last save failed; "" once one succeeds
    failedDetail: "",
    /** @type {{other: {project: Project, revision: Revision}, kept: KeptCopy} | null} while the user has not chosen */
    conflict: null,
    tab: "",                  // this tab's name for its draft
    draftDirty: false,
    edits: 0,                 // typed changes so far, to tell whether the draft is still needed
    /** @type {Project | null} the project as loaded, for "Discard the restored typing" */
    loaded: null,
    /** @type {Promise<unknown>} this tab's storage calls, one after another */
    chain: Promise.resolve(),
    /** @type {Project | null} the project a save under way will stamp with its time */
    stamp: null,
    adopting: false,          // the other tab's version is being put on screen: it is stored already
  };
  const saveTask = task(save, SAVE_DELAY_MS);
  const draftTask = task(flushDraft, DRAFT_DELAY_MS);

  /** @type {Project | null} */
  let last = null;
  store.subscribe("project", (p, why) => {
    // A save stamps the project it wrote; a later step's change of a part carries the stamp on.
    if (st.stamp && st.stamp === last) st.stamp = why === "form" || why === "load" ? null : p;
    last = p;
    if (SAVED.has(why)) saveTask.schedule();
  });
  store.subscribe("invalid", (bad) => {
    if (!bad) return;
    saveTask.cancel();
    showStatus();
  });
  engine.onStop(() => saveTask.cancel());

  /**
   * queued runs fn after this tab's earlier storage calls, and under a lock shared by the tabs
   * of this browser where there is one, so that two tabs never save at the same instant.
   * @template T
   * @param {() => Promise<T>} fn
   * @returns {Promise<T>}
   */
  function queued(fn) {
    const locks = navigator.locks;
    const run = () => (locks && typeof locks.request === "function" ? locks.request("copoly-storage", fn) : fn());
    const p = st.chain.then(run, run);
    st.chain = p.catch(() => {});
    return p;
  }

  function save() {
    if (!store.get("project") || !engine.running()) return Promise.resolve();
    return queued(storeProject);
  }

  async function storeProject() {
    const project = store.get("project");
    if (!project || !engine.running() || st.adopting) return;
    const key = projectKey(project);
    if (key === st.storedKey) { // nothing new to store
      if (st.failed) { st.failed = ""; showStatus(); }
      return;
    }
    const edits = st.edits;
    st.stamp = project;
    const r = await engine.call("saveProject", { project, basedOn: st.revision });
    const stamped = st.stamp;
    st.stamp = null;
    if (engine.isError(r)) {
      // The project stays in the store and on screen; the next change tries again.
      const { reason, short } = storageReason(r.error);
      st.failed = store.get("storage") === "unavailable" ? "" : short;
      st.failedDetail = reason;
      return showStatus();
    }
    store.set("storage", r.storage || "indexeddb");
    st.failed = st.failedDetail = "";
    if (!r.saved) return showConflict(r);
    st.revision = r.revision;
    st.storedKey = key;
    if (stamped && stamped === store.get("project")) store.set("project", { ...stamped, savedAt: r.savedAt }, "saved");
    store.set("savedAt", r.savedAt);
    showStatus();
    // The stored project now holds all that was typed: the draft is no longer needed.
    if (edits === st.edits && !store.get("invalid") && !st.draftDirty && st.tab) dropDraft();
  }

  function showStatus() {
    let text;
    const storage = store.get("storage");
    if (storage === "unavailable") {
      text = "Browser storage unavailable — your work is kept only in this tab; export the project to keep it";
    } else if (st.conflict) {
      text = "Not saved over the version another tab saved: choose above which one to keep";
    } else if (st.failed) {
      text = `Not saved: ${st.failed}. Your changes are still here and are saved with your next change; the last saved version is kept. Export the project to keep a copy now`;
    } else if (store.get("savedAt")) {
      text = `Saved ${clockTime(store.get("savedAt"))}`;
    } else {
      text = "Not saved yet; every valid change is saved in this browser";
    }
    if (store.get("invalid")) text += " · the marked field is not valid, so that change is not saved";
    const status = $("#storage-status");
    setText(status, text);
    if (st.failed) status.title = st.failedDetail;
    else if (storage !== "unavailable") status.title = "";
  }

  /** @param {Extract<SaveResult, {saved: false}>} r */
  function showConflict(r) {
    st.conflict = { other: r.conflict, kept: r.kept };
    const at = r.conflict.project.savedAt ? ` at ${clockTime(r.conflict.project.savedAt)}` : "";
    setText("#conflict-text", `Another tab or window saved this project${at}, after this tab opened it. Nothing was overwritten: ` +
      "that version stays saved, and this tab's version is kept as a separate copy. Which one do you want to keep? You can export either first.");
    $("#conflict-bar").hidden = false;
    showStatus();
  }

  function closeConflict() {
    const c = st.conflict;
    st.conflict = null;
    $("#conflict-bar").hidden = true;
    return c;
  }

  // keepMine saves this tab's project over the other tab's (which becomes the previous copy).
  async function keepMine() {
    const c = closeConflict();
    if (!c) return;
    st.revision = c.other.revision;
    st.storedKey = "";
    await save();
    if (!st.conflict && !st.failed) queued(() => engine.call("dropKept", { name: c.kept.name }));
    showStatus();
  }

  // keepOther puts the other tab's project on screen; "Bring it back" still offers this tab's.
  async function keepOther() {
    const c = closeConflict();
    if (!c) return;
    st.revision = c.other.revision;
    st.adopting = true;
    try {
      await page.replaceProject(c.other.project, "You kept the version saved in the other tab.");
    } finally {
      st.adopting = false;
    }
    const p = store.get("project");
    st.storedKey = p ? projectKey(p) : "";
    store.set("savedAt", c.other.project.savedAt || "");
    queued(() => engine.call("dropKept", { name: c.kept.name }));
    dropDraft(); // this tab's typing is not to come back over the version the user kept
    showStatus();
  }

  /** @param {Project} p */
  async function exportThis(p) {
    const r = await engine.call("exportProject", { project: p });
    if (engine.isError(r)) return showGeneralError(`Not exported: ${r.error}`);
    download(new Blob([r.json], { type: "application/json" }), r.filename);
  }

  /**
   * showKept lists the copies set aside, each to download or delete; a conflict copy can also be
   * opened in place of the project on screen.
   * @param {KeptCopy[]} list
   */
  function showKept(list) {
    const items = list.map((k) => {
      const li = document.createElement("li");
      const when = k.time ? ` on ${new Date(k.time).toLocaleDateString()} at ${clockTime(k.time)}` : "";
      const text = k.kind === "conflict"
        ? `A version kept aside when two tabs saved this project (a conflict copy)${when}.`
        : `A saved copy that could not be read (damaged), set aside${when}, ${k.size} bytes.`;
      /** @param {(r: {bytes: Uint8Array, filename: string, project?: Project}) => unknown} then */
      const fetchCopy = async (then) => {
        const r = await queued(() => engine.call("keptCopy", { name: k.name }));
        if (engine.isError(r)) return showGeneralError(`The kept copy could not be read: ${r.error}`);
        then(r);
      };
      li.append(document.createTextNode(text + " "));
      if (k.kind === "conflict") {
        li.append(button("Open it", () => fetchCopy((r) => {
          if (r.project) return page.replaceProject(r.project, "The kept version is open.");
        })), " ");
      }
      // The bridge copies the kept file into a new Uint8Array, over an ArrayBuffer of its own
      // (never a SharedArrayBuffer), which a Blob takes as it is.
      const bytes = (/** @type {{bytes: Uint8Array}} */ r) => /** @type {Uint8Array<ArrayBuffer>} */ (r.bytes);
      li.append(button("Download", () => fetchCopy((r) => download(new Blob([bytes(r)], { type: "application/octet-stream" }), r.filename))), " ");
      li.append(button("Delete", async () => {
        const r = await queued(() => engine.call("dropKept", { name: k.name }));
        if (engine.isError(r)) return showGeneralError(`The kept copy was not deleted: ${r.error}`);
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
    st.edits++;
    st.draftDirty = true;
    draftTask.schedule();
  }

  // flushDraft saves the form as typed, if it changed since the last draft: into browser storage
  // through copoly, and at once into sessionStorage. The second copy matters when the tab is
  // reloaded or closed: the page then stops before an IndexedDB write started in "pagehide" can
  // finish, while sessionStorage is written before the handler returns and survives a reload.
  function flushDraft() {
    draftTask.cancel();
    if (!st.draftDirty || !engine.running() || !st.tab) return;
    st.draftDirty = false;
    const fields = formText();
    const basedOn = st.revision;
    try {
      sessionStorage.setItem(DRAFT_COPY, JSON.stringify({ savedAt: new Date().toISOString(), basedOn, fields }));
    } catch (e) { /* no sessionStorage: the stored draft alone */ }
    queued(() => engine.call("saveDraft", { tab: st.tab, fields, basedOn }));
  }

  // dropDraft removes this tab's draft once the stored project holds it all. The sessionStorage
  // copy becomes an empty draft of now, which outranks the stored draft should the page be
  // reloaded before copoly has removed that one.
  function dropDraft() {
    draftTask.cancel();
    st.draftDirty = false;
    try {
      sessionStorage.setItem(DRAFT_COPY, JSON.stringify({ savedAt: new Date().toISOString(), basedOn: st.revision, fields: {} }));
    } catch (e) { /* no sessionStorage: the stored draft alone */ }
    queued(() => engine.call("dropDraft", { tab: st.tab }));
  }

  /** draftCopy is the sessionStorage copy of this tab's draft, or undefined. @returns {Draft | undefined} */
  function draftCopy() {
    try {
      const d = JSON.parse(sessionStorage.getItem(DRAFT_COPY) || "null");
      return d && typeof d === "object" ? d : undefined;
    } catch (e) {
      return undefined;
    }
  }

  /** @param {Draft | null} draft */
  function restoreDraft(draft) {
    if (!draft || !draft.fields) return false;
    const changed = restoreText(draft.fields);
    if (changed.includes("r1") || changed.includes("r2")) store.set("formJcr", null);
    if (!changed.length) return false;
    setText("#draft-text", `What you were typing at ${clockTime(draft.savedAt)} is back in the form: the page was closed or reloaded before all of it was saved.`);
    $("#draft-bar").hidden = false;
    return true;
  }

  function discardDraft() {
    $("#draft-bar").hidden = true;
    if (st.loaded) {
      page.fill(st.loaded);
      page.recompute();
    }
    dropDraft();
  }

  async function load() {
    st.tab = tabName();
    const loaded = await engine.call("loadProject", { tab: st.tab, draft: draftCopy() });
    performance.mark("copoly:loaded");
    /** @type {Project | null} */
    let project = null;
    if (engine.isError(loaded)) {
      store.set("storage", "unavailable");
      setText("#storage-message", `The saved project could not be read: ${loaded.error}`);
      $("#storage-message").hidden = false;
      return { project, draft: null };
    }
    store.set("storage", loaded.storage);
    project = loaded.project;
    if (loaded.revision) st.revision = loaded.revision;
    showKept(loaded.kept || []);
    if (loaded.message && loaded.storage === "unavailable") {
      // #storage-status already says so; keep the engine's reason at hand without repeating it.
      $("#storage-status").title = loaded.message;
    } else if (loaded.message) {
      setText("#storage-message", loaded.message);
      $("#storage-message").hidden = false;
    }
    if (project) {
      store.set("savedAt", project.savedAt || "");
      st.storedKey = projectKey(project);
      st.loaded = project;
    }
    return { project, draft: loaded.draft || null };
  }

  for (const sel of DRAFT_INPUTS) $(sel).addEventListener("input", draftTyped);
  $("#model-kind").addEventListener("change", draftTyped);
  document.addEventListener("visibilitychange", () => { if (document.visibilityState === "hidden") flushDraft(); });
  window.addEventListener("pagehide", flushDraft);
  $("#conflict-keep-mine").addEventListener("click", keepMine);
  $("#conflict-keep-other").addEventListener("click", keepOther);
  $("#conflict-export-mine").addEventListener("click", () => {
    const p = store.get("project");
    if (p) exportThis(p);
  });
  $("#conflict-export-other").addEventListener("click", () => { if (st.conflict) exportThis(st.conflict.other.project); });
  $("#draft-discard").addEventListener("click", discardDraft);

  return { load, showStatus, restoreDraft };
}
