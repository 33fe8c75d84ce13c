// @ts-check
// schedule.js: work that waits for the typing to pause. One helper for every delayed job of the
// page (the save, the draft, the fit, the plan, the comparison of the triad models): each is a
// Task that runs its function once, delayMs after the last schedule.
//
// A task made with beforeOutput is run at once, if it waits, before an export or a printed
// report (flushBeforeOutput), so that an edit made just before is in the file or on the paper.

/**
 * @typedef {object} Task
 * @property {(now?: boolean) => void} schedule  run the function delayMs from now (at the next turn when now), replacing an earlier schedule
 * @property {() => void} cancel                 forget a schedule that has not run
 * @property {() => Promise<void>} flush         run at once if scheduled; resolves when no run is under way
 * @property {() => boolean} busy                scheduled, or running
 */

/** @type {Set<Task>} */
const beforeOutput = new Set();

/**
 * task makes a Task of fn.
 * @param {() => (void | Promise<void>)} fn
 * @param {number} delayMs
 * @param {{beforeOutput?: boolean}} [opts]
 * @returns {Task}
 */
export function task(fn, delayMs, opts = {}) {
  let timer = 0;
  /** @type {Promise<void> | null} */
  let running = null;
  const run = () => {
    timer = 0;
    /** @type {Promise<void>} */
    let p;
    try {
      p = Promise.resolve(fn());
    } catch (e) {
      p = Promise.reject(e);
    }
    const done = p.finally(() => { if (running === done) running = null; });
    running = done;
    return done;
  };
  /** @type {Task} */
  const t = {
    schedule(now = false) {
      clearTimeout(timer);
      timer = window.setTimeout(run, now ? 0 : delayMs);
    },
    cancel() {
      clearTimeout(timer);
      timer = 0;
    },
    async flush() {
      if (timer) {
        clearTimeout(timer);
        await run();
      }
      while (running) await running;
    },
    busy: () => timer !== 0 || running !== null,
  };
  if (opts.beforeOutput) beforeOutput.add(t);
  return t;
}

/** flushBeforeOutput runs every waiting beforeOutput task now and resolves when all are done. */
export async function flushBeforeOutput() {
  await Promise.all([...beforeOutput].map((t) => t.flush()));
}

/** outputReady reports that no beforeOutput task waits or runs. */
export const outputReady = () => [...beforeOutput].every((t) => !t.busy());
