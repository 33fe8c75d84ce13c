// @ts-check
// state.js: the named state of the page (see store.js), with what each name holds.

import { Store } from "./store.js";

/** @import { FitResult, MonomerData, Project, RatioPair, Run } from "../copoly" */

/**
 * @typedef {object} Library  the built-in monomers and literature pairs (copoly.library)
 * @property {MonomerData[]} monomers
 * @property {RatioPair[]} pairs
 */

/**
 * @typedef {object} Converted  the runs of the bench grid that convert (step 5)
 * @property {Run[]} runs     in table order
 * @property {number[]} rowOf the grid row (0-based) of each run
 */

/**
 * @typedef {object} Fitted  the last estimate of step 6, with the runs it was made from
 * @property {FitResult} result
 * @property {Run[]} runs
 * @property {number[]} rowOf
 */

/**
 * @typedef {"bench" | "level" | "plan" | "userMonomers" | "triads" | "sizeBins"} ProjectPart
 * the parts of the project a later step changes by itself
 */

/**
 * @typedef {"form" | "load" | "saved" | "quiet" | ProjectPart} ProjectChange
 * Why the project was set: "form" a valid change typed in steps 1 to 4; "load" a whole project
 * put on screen (the stored one, an import, the demo, a version brought back or kept); "saved"
 * the time of a save written into it; "quiet" a part the page filled in itself (an empty bench
 * grid), not saved by itself; otherwise the part of the project a later step changed.
 */

/**
 * @typedef {object} PageState
 * @property {Project | null} project  the last valid project: on screen, saved, exported
 * @property {boolean} invalid         a field of steps 1 to 4 holds what cannot be used; its change is neither drawn nor saved
 * @property {Library} library
 * @property {"unknown" | "indexeddb" | "unavailable"} storage  where projects are saved
 * @property {string} savedAt          when the project was last saved (RFC 3339), "" when not yet
 * @property {number} seed             the seed of the sample chains of step 4
 * @property {[number, number][] | null} formJcr  the joint confidence region of the ratios in the form, when they came from a fit
 * @property {Converted} runs          the converted bench runs, for steps 6 and 7
 * @property {Fitted | null} fit       the last estimate, for step 7
 */

/** @typedef {Store<PageState>} PageStore */

/** @returns {PageStore} */
export function createState() {
  /** @type {PageState} */
  const initial = {
    project: null,
    invalid: false,
    library: { monomers: [], pairs: [] },
    storage: "unknown",
    savedAt: "",
    seed: 1,
    formJcr: null,
    runs: { runs: [], rowOf: [] },
    fit: null,
  };
  return new Store(initial);
}
