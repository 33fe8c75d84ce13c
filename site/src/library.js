// @ts-check
// library.js: the monomers the page knows: the module's library (copoly.library) and the user's
// own, saved with the project (UserMonomer in copoly.d.ts). A name typed in step 1 is looked up
// among the user's own first, then in the library; names match without regard to case and
// surrounding spaces.

/** @import { MonomerData, Project, UserMonomer } from "../copoly" */
/** @import { Library } from "./state.js" */

/**
 * @typedef {{own: true, m: UserMonomer} | {own: false, m: MonomerData}} MonomerEntry
 * a monomer found by name: the user's own, or the library's
 */

/** @param {string} a @param {string} b */
export const sameName = (a, b) => a.trim().toLowerCase() === b.trim().toLowerCase();

/**
 * findMonomer is the library's monomer called name.
 * @param {Library} lib @param {string} name
 */
export const findMonomer = (lib, name) => lib.monomers.find((m) => sameName(m.name, name));

/**
 * ownMonomers is the user's own monomers in the project.
 * @param {Project | null} p
 * @returns {UserMonomer[]}
 */
export const ownMonomers = (p) => (p && Array.isArray(p.userMonomers) ? p.userMonomers : []);

/**
 * monomerEntry is the monomer called name, the user's own first, or null when neither list has it.
 * @param {Library} lib @param {Project | null} p @param {string} name
 * @returns {MonomerEntry | null}
 */
export function monomerEntry(lib, p, name) {
  if (!name) return null;
  const own = ownMonomers(p).find((m) => sameName(m.name, name));
  if (own) return { own: true, m: own };
  const m = findMonomer(lib, name);
  return m ? { own: false, m } : null;
}
