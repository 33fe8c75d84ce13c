// @ts-check
// limits.js: the page's copies of limits the module defines and enforces itself. The page
// checks them first only to say so in its own words (a row it will not add, a file it will not
// read); the module's check is the one that counts. A later change reads them from
// copoly.limits(), and only this file changes. Until then each must equal its Go constant.

/** Rows of the bench grid: copoly/project.MaxRows (= copoly.MaxRuns). */
export const MAX_ROWS = 1000;
/** Characters in a grid cell or a sample label: copoly/project.MaxCellLength. */
export const CELL_MAX = 200;
/** Bytes of a bench table file read: copoly.MaxTableBytes. */
export const TABLE_MAX_BYTES = 1 << 20;
/** Rows of the triad grid: copoly.MaxTriadRuns. */
export const TRIAD_ROWS = 1000;
/** Rows of the chain-size grid (classes or slices): copoly.MaxAverageRows. */
export const SIZE_ROWS = 10000;
/** Runs the fit needs at the least (copoly's nonlinear fit refuses fewer). */
export const MIN_FIT_RUNS = 3;
/**
 * Bytes of a project file the page reads at all. The module refuses a file over
 * copoly/project.MaxFileBytes (1 MiB) with its own message; a file over twice that is refused
 * here before it is read into memory.
 */
export const IMPORT_MAX_BYTES = 2 * 1024 * 1024;
