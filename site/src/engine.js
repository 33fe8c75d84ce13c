// @ts-check
// engine.js: the page's only way into the calculation module. Every call from page code goes
// through call (or a Job's call) and returns a Promise, which the caller awaits:
//
//   const r = await engine.call("composition", { r1, r2, f1 });
//   if (engine.isError(r)) … r.error, r.field …
//
// Today it wraps the synchronous methods of globalThis.copoly, which the module defines (the
// storage methods return Promises of their own); a later change runs the module in a Web Worker,
// and then only this file (and loader.js, which would run in the worker) changes: call posts
// the method and argument and resolves with the answer. The page keeps globalThis.copoly and
// window.copolyReady for tests and lab scripts; page code never uses globalThis.copoly itself.
//
// Work that is asked for again before its answer arrives (a redraw after each keystroke) runs as
// a Job of a named purpose (newest): when a newer job of the same purpose starts, the older one's
// next call throws Superseded, so that its result is dropped and never drawn over the newer one.

import { startModule, Unsupported } from "./loader.js";

/** @import { Copoly, CopolyError } from "../copoly" */

/**
 * @typedef {{[K in keyof Copoly]: Copoly[K] extends (a: never) => unknown ? K : never}[keyof Copoly]} Method
 * the names of the module's methods
 */
/**
 * @template {Method} M
 * @typedef {Parameters<Copoly[M]>[0]} ArgOf  the argument of method M
 */
/**
 * @template {Method} M
 * @typedef {Awaited<ReturnType<Copoly[M]>> | CopolyError} ResultOf  the answer of method M: its result or an error
 */
/**
 * @typedef {object} Job  one run of work for a purpose (see newest)
 * @property {<M extends Method>(method: M, arg: ArgOf<M>) => Promise<ResultOf<M>>} call
 *   call as engine.call; throws Superseded when a newer job of the same purpose has started
 * @property {() => boolean} current  no newer job of the same purpose has started
 */

export { Unsupported };

/** @type {Copoly | null} */
let api = null;
let stopped = false;
/** @type {(() => void)[]} */
const stopHandlers = [];

/** start loads and runs the module; it rejects when it cannot (Unsupported for an old browser). */
export async function start() {
  api = await startModule(() => { if (api) stop(); });
}

/** stop marks the module as stopped (it exited, or a call threw) and tells the onStop handlers once. */
function stop() {
  if (stopped) return;
  stopped = true;
  for (const fn of stopHandlers) fn();
}

/**
 * onStop calls fn once if the module stops after it started: a crash the page must show.
 * @param {() => void} fn
 */
export function onStop(fn) {
  stopHandlers.push(fn);
}

/** running reports that the module has started and not stopped. */
export const running = () => api !== null && !stopped;

/** version is the module's version, "" before it runs. */
export const version = () => (api && api.version) || "";

/**
 * isError reports whether an answer is a CopolyError.
 * @template T
 * @param {T | CopolyError} r
 * @returns {r is CopolyError}
 */
export function isError(r) {
  return typeof r === "object" && r !== null && typeof (/** @type {{error?: unknown}} */ (r)).error === "string";
}

/**
 * pageError is an error of the page's own making in the shape of the module's errors.
 * @param {import("../copoly").ErrorCode} code
 * @param {string} sentence
 * @returns {import("../copoly").CopolyError}
 */
function pageError(code, sentence) {
  return { error: sentence, code, reason: sentence };
}

/**
 * call runs one method of the module with one plain-object argument. It never rejects: invalid
 * input, a module that is not running and a failed storage call all come back as a
 * CopolyError. A method that throws means the module has exited: onStop's handlers run.
 * @template {Method} M
 * @param {M} method
 * @param {ArgOf<M>} arg
 * @returns {Promise<ResultOf<M>>}
 */
export async function call(method, arg) {
  if (!api || stopped) return /** @type {ResultOf<M>} */ (pageError("unavailable", "The calculation engine is not running."));
  /** @type {unknown} */
  let r;
  try {
    // api[method] is a union of the methods' types, which cannot be called as one: each takes
    // the argument ArgOf<M> of its own name, as this one is.
    r = /** @type {(a: unknown) => unknown} */ (api[method]).call(api, arg || {});
  } catch (e) {
    stop();
    return /** @type {ResultOf<M>} */ (pageError("internal", "The calculation engine stopped."));
  }
  if (typeof r === "object" && r !== null && typeof (/** @type {{then?: unknown}} */ (r)).then === "function") {
    try {
      r = await /** @type {Promise<unknown>} */ (r); // a thenable: the storage methods' Promise
    } catch (e) {
      return /** @type {ResultOf<M>} */ (pageError("internal", String((e instanceof Error && e.message) || e)));
    }
  }
  if (r === undefined || r === null) return /** @type {ResultOf<M>} */ (pageError("internal", `No answer from ${method}.`));
  // The module answers each method as copoly.d.ts says (site/contract checks the bridge's DTOs against it).
  return /** @type {ResultOf<M>} */ (r);
}

/** Superseded ends a job whose purpose a newer job has taken over. */
export class Superseded extends Error {}

/** @type {Map<string, number>} the number of the newest job of each purpose */
const newestJob = new Map();

/**
 * newest runs fn as the newest job of purpose and resolves to its result, or to undefined when
 * a newer job of the same purpose took over before it ended (its answers are dropped).
 * @template T
 * @param {string} purpose
 * @param {(job: Job) => Promise<T>} fn
 * @returns {Promise<T | undefined>}
 */
export async function newest(purpose, fn) {
  const n = (newestJob.get(purpose) || 0) + 1;
  newestJob.set(purpose, n);
  const current = () => newestJob.get(purpose) === n;
  /**
   * @template {Method} M
   * @param {M} method @param {ArgOf<M>} arg
   * @returns {Promise<ResultOf<M>>}
   */
  const jobCall = async (method, arg) => {
    if (!current()) throw new Superseded(purpose);
    const r = await call(method, arg);
    if (!current()) throw new Superseded(purpose);
    return r;
  };
  /** @type {Job} */
  const job = { current, call: jobCall };
  try {
    return await fn(job);
  } catch (e) {
    if (e instanceof Superseded) return undefined;
    throw e;
  }
}
