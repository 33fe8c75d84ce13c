// The JavaScript API of copoly: every method of the global `copoly` object.
//
// This file is the one place where the contract between the page (site/) or a lab script and the
// WebAssembly module (wasm/) is written down. The bridge in wasm/ implements exactly this; the
// page and the browser test use exactly this.
//
// Conventions (also shown on the page):
//   M1, M2   monomer 1 and monomer 2; r1 = k11/k12, r2 = k22/k21 (terminal model)
//   f1       mole fraction of M1 in the unreacted monomer mixture (the feed)
//   F1       instantaneous mole fraction of M1 units in the copolymer
//   F1cum    cumulative (average) mole fraction of M1 in the copolymer made so far
//   X        overall molar conversion of monomer, 0..1
//
// Every synchronous method takes one plain object and returns one plain object. Invalid input
// never throws: it returns a CopolyError naming the offending field. No input can stop the module.
// Methods that touch storage return a Promise that resolves (never rejects) to a result or a
// CopolyError.

export interface CopolyError {
  error: string;   // a sentence for the user, e.g. "r1 = -0.2: a reactivity ratio cannot be negative"
  field?: string;  // the input field at fault, e.g. "r1", "f1[3]", "conversion[0]", "project.monomer1.molarMass"
  code: ErrorCode; // what is wrong, in a word, e.g. "out-of-range"
  reason: string;  // the sentence without the field and value, e.g. "a reactivity ratio cannot be negative"
  value?: number;  // the offending number, when there is one, e.g. -0.2 (may be NaN or ±Infinity)
  row?: number;    // the 0-based row of a bench table or of a fit's runs the field lies in, e.g. 3 for "runs[3].f10"
}

// Codes of errors and warnings (copoly.Codes in Go, copoly/codes.go, defines them once):
//   input:   not-a-number (NaN, ±Infinity or text that is not a number), out-of-range, too-many,
//            too-long, unreachable, missing, wrong-type, not-allowed (a word not accepted),
//            not-a-table (pasted text that cannot be read)
//   project and storage: not-a-project, newer-version, damaged, no-copy, storage, not-stored,
//            storage-full, unavailable, busy
//   internal: a fault of copoly, not of the input (a recovered panic)
//   warnings of bench data: mass-balance, duplicate, no-information, few-feeds
//   warnings of fit: high-conversion, open-region, at-bound, partly-weighted, scatter, trend,
//            no-uncertainties, not-shown; a method that could not run has its error's code
export type ErrorCode =
  | "not-a-number" | "out-of-range" | "too-many" | "too-long" | "unreachable" | "missing" | "wrong-type"
  | "not-allowed" | "not-a-table" | "not-a-project" | "newer-version" | "damaged" | "no-copy" | "storage"
  | "not-stored" | "storage-full" | "unavailable" | "busy" | "internal"
  | "mass-balance" | "duplicate" | "no-information" | "few-feeds"
  | "high-conversion" | "open-region" | "at-bound" | "partly-weighted" | "scatter" | "trend"
  | "no-uncertainties" | "not-shown";

// Limits. Every list, count and text has a maximum, far above real use, checked before any work
// (and a text's length before it is copied into the module); above it the result is a
// CopolyError naming the field, the value and the limit, e.g.
//   {error: "f1 = 1e+06: at most 100000 values per call", field: "f1"}.
//   lists of numbers (f1, conversion) ....... 100 000 values; drift conversion with basis "mass": 1000;
//                                              nextRuns conversions: 20
//   runs of fit and nextRuns, discriminate runs, bench.rows ... 1000
//   bench row: 64 cells, each ≤ 200 characters; label ≤ 200; pasteBench text ≤ 1 MiB, 64 columns
//   averages bins or slices ................. 10 000
//   jcr ...................................... 4096 points; timeTable 1000 rows
//   bins (drift, chains) 1–200; sequence maxLength 1–1000; seed a whole number 0 … 2⁵³ − 1
//   chains, sample chains ................... count ≤ 1000, length ≤ 10 000
//   chains, simulation ...................... count ≤ 100 000, length ≤ 10 000, dpn ≤ 100 000,
//                                              count × (dpn or length) ≤ 2·10⁷ units
//   plan .................................... steps ≤ 2000, shots ≤ 500, samples 10–5000,
//                                              samples × schedule rows ≤ 2·10⁶
//   importProject json ...................... 1 MiB; a project's names 200 characters, ratioSource
//                                              1000, notes 100 000 bytes, savedAt 64, userMonomers 100
//                                              (20 hazards each)
//   one-word options (model, mode, basis, feed, kinds) 32 characters
// fit skips the Mayo–Lewis intersection method, with a warning, above 200 runs with a conversion.
// Every limit is also in limits(), by the names of Limits below, from one Go table
// (copoly/project/limits.go): read them from there rather than copying the numbers.

export interface Limits {
  points: number; massConversions: number; designConversions: number;   // values in a list
  runs: number; minRuns: number; intersectionRuns: number;              // runs of fit, nextRuns, bench tables
  benchRows: number; cells: number; cellLength: number; labelLength: number;   // the bench grid
  pasteBytes: number; pasteRows: number; pasteColumns: number;          // pasteBench text, a table file
  triads: number; sizeBins: number; jcr: number; timeTable: number;     // rows and points
  bins: number; runLength: number; seed: number;                        // counts
  sampleChains: number; chainLength: number; simChains: number; simUnits: number; dpn: number;
  planSteps: number; shots: number; bandSamples: number; bandWork: number;
  fileBytes: number; nameLength: number; sourceLength: number; notesBytes: number; savedAtLength: number;
  wordLength: number; userMonomers: number; hazards: number; hazardLength: number;   // a project
  draftFields: number; draftBytes: number; idLength: number; keptNameLength: number;  // storage
  linearConversion: number;     // fit warns above this conversion that the linear methods are biased (0.10)
  triadSumTolerance: number;    // how far from 1 a family of measured triads may sum (0.01)
}

export interface Classification {
  kind: "ideal" | "alternating" | "strongly-alternating" | "block" | "homopolymer-mixture";
  product: number;        // r1·r2
  text: string;           // the classification in words, with the numbers behind it
}

export interface CompositionResult {
  F1: number[];           // instantaneous copolymer composition for each input f1 (Mayo–Lewis)
  azeotrope: number | null;  // f1 at which F1 = f1, or null when none lies in (0,1); null for a model other than the terminal
  classification: Classification | null;   // null for a model other than the terminal
}

export interface FeedResult {
  feeds: number[];        // feeds f1 that give targetF1 at low conversion (empty when unreachable)
  note: string;           // why there are zero, one or several feeds
  range: [number, number];   // the copolymer compositions reachable with this pair
}

export interface DriftResult {
  conversion: number[];     // overall molar conversion X (as requested, or converted from mass)
  conversionMass?: number[];  // mass conversion at each point (only when both molar masses given; basis "mass" is terminal only)
  f1: number[];             // unreacted feed f1(X)
  F1: number[];             // instantaneous copolymer F1(X)
  F1cum: number[];          // cumulative copolymer F1cum(X)
  method: "meyer-lowry" | "skeist-ode" | "no-drift";
  limit: {                  // the conversion limit for the composition tolerance (any model)
    tolerance: number;      // ± tolerance on F1cum around F1(f10) (mole fraction)
    conversion: number;     // largest X with |F1cum(X) − F1(f10)| ≤ tolerance (1 when never left)
  };
  distribution: {           // composition distribution of all the polymer made up to the last conversion (any model)
    edges: number[];        // bins+1 bin edges in instantaneous F1
    weights: number[];      // fraction of the polymer (by mass when both molar masses are given, else by moles) per bin; sums to 1
    basis: "mass" | "moles";
  };
  exhausted: null | { monomer: 1 | 2; conversion: number };  // a monomer practically used up (f < 1e-6) before the last X
}

export interface SequenceStats {
  F1: number;
  p11: number; p12: number; p21: number; p22: number;
  dyads: { "11": number; "12": number; "22": number };     // "12" counts 12 and 21 together; sum 1
  triads: {                     // monomer-centred: 111+112+212 = 1 and 222+221+121 = 1
    "111": number; "112": number; "212": number;            // "112" counts 112 and 211 together
    "222": number; "221": number; "121": number;            // "221" counts 221 and 122 together
  };
  meanLength1: number;          // number-average run length of M1
  meanLength2: number;
  runNumber: number;            // Harwood–Ritchey run number: runs per 100 units
  randomness: number;           // B = p12 + p21 (1 random, 2 alternating, → 0 blocky)
}

export interface SequenceResult extends SequenceStats {
  runLengths?: {                // run-length distributions at this feed (terminal model only)
    length: number[];           // 1, 2, ... n
    number1: number[]; weight1: number[];   // number and weight fraction of M1 runs of each length
    number2: number[]; weight2: number[];
  };
  batch?: SequenceStats & { conversion: number };  // averaged over all polymer made from f1 (as f10) up to `conversion`
}

export interface ChainsResult {
  samples: string[];            // each chain as a string of "1" and "2", e.g. "1122121..." (a simulation: the first 12 chains, at most 200 units each)
  // The fields below come with the simulation options (dpn, conversion, functional, model):
  compositions?: number[];      // F1 of each chain
  lengths?: number[];           // units per chain
  functionalCounts?: number[];  // [k] = chains with k functional units (these three with `functional` only)
  nonFunctional?: number;       // fraction of chains without a functional unit
  expectedNonFunctional?: number | null;  // analytic (terminal, constant feed), else null
  mean?: number; variance?: number; weightMean?: number;
  stockmayerVariance?: number | null;     // F1 F2 κ ⟨1/n⟩ (terminal, constant feed), else null
  units?: number;
  histogram?: { edges: number[]; weights: number[] };     // chain compositions, weighted by units
  stockmayer?: number[] | null;           // Stockmayer's weight fractions on the same bins (terminal, constant feed, dpn)
}

// Model options accepted by composition, drift and sequence (and chains): the terminal model by
// default (r1, r2), or
export type ModelArgs =
  | { model?: "terminal"; r1: number; r2: number }
  | { model: "penultimate"; r11: number; r21: number; r22: number; r12: number }
  | { model: "implicit"; r1: number; r2: number; s1: number; s2: number };

export interface TriadRow { f10: number; F1?: number; A111?: number; A112?: number; A212?: number; A222?: number; A221?: number; A121?: number }  // a measurement absent or −1: not measured

export interface ModelFitResult { model: "terminal" | "penultimate"; params: number[]; se: (number | null)[]; ssr: number; n: number; k: number; aic: number; aicc: number }

export interface DiscriminationResult {
  terminal: ModelFitResult; penultimate: ModelFitResult;
  F: number; pValue: number | null; deltaAIC: number; supported: boolean; verdict: string;
  predicted: { terminal: TriadRow[]; penultimate: TriadRow[] };   // each model's F1 and triads at the runs' feeds
}

export interface AveragesResult {
  Mn: number; Mw: number; Mz: number; dispersity: number;
  size?: { unitMass: number; DPn: number; DPw: number; units1: number; units2: number };  // when F1 and both molar masses are given
}

export interface Monomer { name: string; molarMass: number; source: string; sourceId: string }
export interface RatioPair {
  monomer1: string; monomer2: string; r1: number; r2: number;
  temperature: string;   // conditions as published; "" when the source gives none (its note says so, once)
  source: string; sourceId: string;
}
export interface LibrarySource {     // one entry of library().sources; every …sourceId names one
  id: string;
  short: string;       // the label the per-value source texts use
  citation: string;    // full citation: authors, title, journal or publisher, year, table or page
  checked: boolean;    // false: its note carries "value not checked against a printed source — confirm before use" once,
                       // and the per-value texts citing it end "(not checked — see the note on this source)"
  note: string;        // what was read and its caveats, once for all the values citing it
}

// ---- Bench data and reactivity-ratio estimation ----

// The bench-data grid as typed: one entry form for the whole table, and per row the TEXT of each
// cell (decimal comma or point, "35 %" allowed), so nothing typed is ever lost. Cell keys by form:
//   feed:        "f10" (fraction) | "mass1","mass2" (g) | "moles1","moles2" (mol)
//   conversion:  "conversion" (molar X or mass w, as a fraction) — absent when conversionKind "none"
//   composition: "F1" | "massFraction1" | "integral1","protons1","integral2","protons2" | "elementPercent"
//   uncertainties (optional, converted units): "sF", "sX", "sf"
export interface BenchTable {
  feedKind: "fraction" | "mass" | "moles" | "";
  conversionKind: "none" | "molar" | "mass" | "";
  compositionKind: "fraction" | "massFraction" | "nmr" | "element" | "";
  element: string;        // e.g. "N" (compositionKind "element")
  carrier: number;        // 1 or 2: the monomer that carries the element
  elementCount: number;   // atoms of the element per unit of the carrier
  rows: { label: string; cells: { [key: string]: string } }[];
}

// One run in mole fractions and molar conversion (conversion 0 or absent = low conversion).
export interface Run { f10: number; conversion?: number; F1: number; sF?: number; sX?: number; sf?: number }

export interface RunWarning { row: number; field: string; message: string; code: ErrorCode }   // row −1: the whole table

export interface BenchResult {
  columns: string[];                 // cell keys this table's forms use, in display order
  runs: (Run | null)[];              // one per row; null for a blank or bad row
  errors: (CopolyError | null)[];    // one per row; field names the cell, e.g. "runs[3].f10"
  warnings: RunWarning[];            // mass balance, duplicates, too few feeds, …
}

export interface LinearFit {
  r1: number; r2: number;
  x: number[]; y: number[];          // the transformed points in the method's own axes
  slope: number; intercept: number;
  alpha?: number;                    // Kelen–Tüdős α
  linear: true;                      // a linearised (historical) method: never the reported result
}

export interface Region {
  level: number;                     // e.g. 0.95
  kind: "F" | "chi2" | "ellipse";    // F: errors unknown; chi2: errors known; ellipse: linearised (EVM)
  critical: number;                  // value of the objective on the boundary
  boundary: [number, number][];      // closed polygon of (r1, r2)
  open: boolean;                     // true when the data do not bound the region
  r1Min: number; r1Max: number; r2Min: number; r2Max: number;
}

export interface NonlinearFit {
  r1: number; r2: number; se1: number | null; se2: number | null; corr: number | null;  // null when the fit is singular
  ssr: number;                       // Σe² (unweighted) or χ² (weighted)
  weighted: boolean; n: number; dof: number;
  reducedChi2?: number; pValue?: number;   // when weighted
  atBound: "" | "r1" | "r2";
  residuals: number[];               // F1,obs − F1cum,model per run
  sigma?: number[];                  // effective standard uncertainty per run (weighted)
  jcr: [number, number][];           // = region.boundary, for convenience
  region: Region;
}

export interface EVMFit {
  r1: number; r2: number; se1: number | null; se2: number | null; corr: number | null;
  phi: number; reducedChi2: number; pValue: number;
  feed: number[]; conversion: number[]; composition: number[];  // fitted true values per run
  jcr: [number, number][]; region: Region;
}

export interface FitResult {
  methods: {
    "fineman-ross"?: LinearFit;
    "inverted-fineman-ross"?: LinearFit;
    "kelen-tudos"?: LinearFit;
    "extended-kelen-tudos"?: LinearFit;
    "mayo-lewis-integrated"?: { r1: number; r2: number; curves?: { r1: number[]; r2: number[] }[] };  // curves: with fit's curves: true, one per run with a conversion
    "nonlinear"?: NonlinearFit;
    "evm"?: EVMFit;
  };
  recommended: "nonlinear" | "evm";
  swappedFinemanRoss?: { r1: number; r2: number };   // Fineman–Ross with M1/M2 swapped (label dependence)
  trends: { feed: { slope: number; pValue: number; flagged: boolean }; conversion: { slope: number; pValue: number; flagged: boolean } };
  warnings: { method: string; row: number; field: string; message: string; code: ErrorCode }[];  // a method absent from `methods` has its reason here
}

export interface NextRunsResult {
  tidwellMortimer: [number, number];   // approximate feeds r2/(2+r2), 2/(2+r1), ascending
  dOptimal: [number, number];          // exact D-optimal low-conversion pair
  middle: number;                      // an extra middle feed to expose misfit
  next: { f10: number; conversion: number }[];   // best two runs given the runs made
  shrink: number;                      // factor on the region's area (0 when no runs were given)
}

// ---- Feed planning ----

export interface MonomerData {       // one entry of library().monomers (fields beyond name/molarMass/source)
  name: string; formula: string; molarMass: number; source: string; sourceId: string;
  state: "liquid" | "gas" | "solid";
  density: number; densityTemp: number; densitySource: string; densitySourceId: string;   // g/mL at densityTemp °C
  heat: number; heatSource: string; heatSourceId: string;                                 // −ΔHp, kJ/mol
  q: number | null; e: number | null; qeSource: string; qeSourceId: string;               // Alfrey–Price Q, e (screening only; "" when none)
  hazards: string[]; hazardSource: string; hazardSourceId: string;
  tg: number | null; tgSource: string; tgSourceId: string;   // homopolymer Tg in K (null when none is given; tgNote says why)
  tgNote: string;                                            // where sources disagree, which value was chosen (e.g. PMMA tacticity)
  hydroxyl: number; acid: number; acidTotal: number;         // groups per monomer unit in the hydroxyl value, the partial acid
                                                             // value (ISO 2114 method A: an anhydride counts 1) and the total acid value (method B: 2)
  groupsSource: string; groupsSourceId: string;
}

export interface PlanRow {
  conversion: number;   // overall molar conversion of all monomer charged and fed so far
  polymer: number;      // g of copolymer formed so far (reaches polymerMass at the end)
  fed1: number; fed2: number;   // g of M1, M2 added after the initial charge, cumulative
  f1: number; F1: number; F1cum: number;   // unreacted feed, instantaneous and cumulative copolymer
  inventory: number;    // g of unreacted monomer in the reactor
  time: number | null;  // min, when a rate law or a conversion–time table is given
  pump1: number | null; pump2: number | null;   // g/min over the step ending at this row
}

export interface PlanResult {
  mode: "batch" | "semibatch" | "shots";
  startF1: number;                     // feed composition of the initial charge
  initial: { m1: number; m2: number; n1: number; n2: number; v1: number | null; v2: number | null };  // g, mol, mL (liquids with a known density)
  total: { m1: number; m2: number };   // all monomer used, charged + fed, g
  feedF1: number; feedPerPolymer: number;   // metered stream composition; mol fed per mol polymer (semibatch)
  stopConversion: number; productF1: number; maxDeviation: number;
  schedule: PlanRow[];
  shots: { polymer: number; m1: number; m2: number; time: number | null }[];
  distribution: { edges: number[]; weights: number[]; basis: "mass" | "moles" };
  inventoryMax: number;                // g
  safety: { inventoryMax: number; inventoryAt: number; heat: number | null; rise: number | null; riseLimit: number; flagged: boolean; batchMass: number; heatCapacity: number; hazards: { monomer: string; hazards: string[] }[] };
  band?: { samples: number; F1Low: number[]; F1High: number[]; F1cumLow: number[]; F1cumHigh: number[]; productLow: number; productHigh: number };  // when jcr is given
  notes: string[];
}

// The published example projects of exampleProject: 3-methylstyrene/methacrylic acid at 70 °C in
// acetone or in isopropanol (Georgiev, Dakova, Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995,
// A32, 497: Table 1 runs, Table 2 Kelen–Tüdős ratios).
export type ExampleName = "georgiev1995-acetone" | "georgiev1995-isopropanol";

export interface Project {
  format: "copoly-project";     // our own schema name
  version: 1;
  name: string;
  monomer1: { name: string; molarMass: number };   // molarMass in g/mol (0 = not given)
  monomer2: { name: string; molarMass: number };
  r1: number;
  r2: number;
  ratioSource: string;          // where r1 and r2 come from (free text)
  f10: number;                  // initial feed for the drift view
  conversion: number;           // last conversion for the drift view
  tolerance: number;            // composition tolerance for the conversion limit
  notes: string;
  invented?: boolean;           // true for the built-in demo scenario
  citation?: string;            // full citation of the published data the project holds (published examples)
  savedAt?: string;             // RFC 3339, set on save
  bench?: BenchTable;           // the bench-data grid, as typed
  level?: number;               // confidence level of the joint region (default 0.95)
  jcr?: [number, number][];     // the region of the ratios in use, when they came from a fit ("use these ratios")
  model?: { kind: "terminal" | "penultimate" | "implicit"; r11?: number; r21?: number; r22?: number; r12?: number; s1?: number; s2?: number };  // the sequences panel's model (terminal uses r1, r2)
  triads?: TriadRow[];          // measured triads, as entered
  sizeBins?: { low: number; high: number; numberFraction?: number; weightFraction?: number }[];  // chain-size panel
  plan?: {                      // the planning panel's inputs, as the user left them (all optional)
    mode?: string; targetF1?: number; polymerMass?: number; tolerance?: number; stopConversion?: number;
    finalConversion?: number; feed?: string; feedF1?: number; shots?: number;
    rateLaw?: "none" | "k" | "half" | "table";  // the rate-law choice: none, rate constant, half-life, timeTable
    rateConstant?: number; halfLife?: number;
    timeTable?: [number, number][];  // measured [time in min, conversion 0..1]: time increasing, conversion not decreasing, ≤ 1000 rows
    heat1?: number; heat2?: number;  // −ΔHp of M1, M2 in kJ/mol (≤ 1000), in place of the library's
    batchMass?: number; heatCapacity?: number; riseLimit?: number;
  };
  userMonomers?: UserMonomer[]; // monomers the user added to the library, at most 100; absent when none
}

// A monomer of the user's own, saved with the project. Only the name is required; a number 0
// means not given, except e, which counts only when q > 0 and may be negative.
export interface UserMonomer {
  name: string;                  // 1..200 characters, unique within the project (case ignored)
  molarMass: number;             // g/mol
  density: number;               // g/mL, at most 25, at densityTemp °C
  densityTemp: number;
  state: "liquid" | "gas" | "solid" | "";
  heat: number;                  // −ΔHp, kJ/mol, at most 1000
  q: number; e: number;          // Alfrey–Price Q–e
  hazards: string[];             // words of MonomerData.hazards or the user's own, ≤ 100 characters each, at most 20
  note: string;                  // where the values come from, ≤ 1000 characters
}

// Storage. Each save of the stored project has a revision; a page saves "based on" the revision
// it loaded or last saved, and a save whose base is no longer the stored revision (another tab
// saved meanwhile) is kept aside as a conflict copy instead of replacing the other tab's.
export interface Revision {
  n: number;                    // count of saves, 0..2^53-1 (0 with writer "": nothing stored, or a file without one)
  writer: string;               // the page that made it: 1..64 letters, digits, "-" or "_"
}

// A copy set aside in browser storage: a stored file that could not be read ("damaged", kept byte
// for byte, never replaced), or a save refused by a conflict ("conflict", one per tab).
export interface KeptCopy {
  name: string;                 // e.g. "damaged-20260302T093015Z.json", "conflict-k3f9q2.json"
  kind: "damaged" | "conflict";
  size: number;                 // bytes
  time?: string;                // RFC 3339, when it was written
}

// The form of one tab exactly as typed (valid or not), saved a moment after each keystroke.
export interface Draft {
  savedAt: string;              // RFC 3339 with milliseconds
  basedOn: Revision;            // the stored revision the tab was editing
  fields: { [input: string]: string };  // input name (1..64 letters, digits, "-", "_") → text; ≤ 200 inputs, ≤ 1 MiB
}

export interface StorageLoad {
  project: Project | null;      // null when nothing is stored, or no stored copy can be read (start from the demo)
  storage: "indexeddb" | "unavailable";
  revision: Revision;           // of project: pass it as basedOn of the next saveProject
  message?: string;             // for the user, e.g. the previous copy is shown because the latest was damaged
  damaged?: true;               // a stored copy could not be read (it is in kept)
  kept: KeptCopy[];             // copies set aside, oldest first
  draft?: Draft;                // with tab: that tab's typing, when newer than project
}

export type SaveResult =
  | { saved: true; storage: "indexeddb"; savedAt: string; revision: Revision }
  | { saved: false; storage: "indexeddb"; savedAt: string; revision: Revision;  // revision of the conflict copy
      conflict: { project: Project; revision: Revision };  // the stored project (untouched) and its revision
      kept: KeptCopy };                                     // where this save's project was kept

export interface Copoly {
  version: string;
  composition(a: ModelArgs & { f1: number[] }): CompositionResult | CopolyError;   // classification and azeotrope: terminal only (null otherwise)
  feedFor(a: { r1: number; r2: number; targetF1: number }): FeedResult | CopolyError;
  drift(a: ModelArgs & {
    f10: number;
    conversion: number[];                      // increasing, each in [0,1]
    basis?: "molar" | "mass";                  // what `conversion` holds; default "molar"; "mass" needs molar masses
    molarMass1?: number; molarMass2?: number;  // g/mol, both or neither
    tolerance?: number;                        // default 0.02
    bins?: number;                             // default 20, 1..200
  }): DriftResult | CopolyError;
  sequence(a: ModelArgs & { f1: number; conversion?: number; maxLength?: number }): SequenceResult | CopolyError;  // batch and runLengths: terminal only
  chains(a: ModelArgs & { f10: number; count?: number; length?: number; seed?: number;
    dpn?: number; conversion?: number; functional?: 1 | 2; bins?: number }): ChainsResult | CopolyError;  // count ≤ 100000, count × length ≤ 2·10⁷
  discriminate(a: { runs: TriadRow[] }): DiscriminationResult | CopolyError;
  averages(a: { bins?: { low: number; high: number; numberFraction?: number; weightFraction?: number }[];
    slices?: { mass: number; signal: number }[];            // one of bins or slices (an empty list counts as not given)
    F1?: number; molarMass1?: number; molarMass2?: number }): AveragesResult | CopolyError;
  library(a?: {}): { monomers: MonomerData[]; pairs: RatioPair[]; sources: LibrarySource[] };
  demoProject(a?: {}): { project: Project };
  exampleProject(a: { name: ExampleName }): { project: Project } | CopolyError;  // a published example: measured runs with their citation, never invented
  checkProject(a: { project: Project }): { project: Project } | CopolyError;
  exportProject(a: { project: Project }): { json: string; filename: string } | CopolyError;
  importProject(a: { json: string }): { project: Project } | CopolyError;
  benchRuns(a: { bench: BenchTable; molarMass1?: number; molarMass2?: number }): BenchResult | CopolyError;
  pasteBench(a: { bench: BenchTable; text: string }): { bench: BenchTable } | CopolyError;  // rows appended; header names map columns
  fit(a: { runs: Run[]; level?: number; curves?: boolean }): FitResult | CopolyError;  // curves: add the Mayo–Lewis curves (most of the result; off by default)
  nextRuns(a: { r1: number; r2: number; runs?: Run[]; conversions?: number[] }): NextRunsResult | CopolyError;
  plan(a: {
    r1: number; r2: number; targetF1: number;
    molarMass1: number; molarMass2: number;   // g/mol
    polymerMass: number;                      // g of copolymer to make
    mode: "batch" | "semibatch" | "shots";
    monomer1?: string; monomer2?: string;     // library names: densities (mL), heats and hazards
    tolerance?: number;                       // ± on F1, default 0.02
    stopConversion?: number;                  // batch: default the conversion limit for the tolerance
    finalConversion?: number;                 // semibatch/shots: overall conversion at the end, default 0.95
    feed?: "faster" | "mixture"; feedF1?: number;   // semibatch stream (mixture default: at targetF1 = starved feed)
    shots?: number;                           // 0/absent: the fewest within the tolerance
    steps?: number;                           // schedule rows, default 200
    rateConstant?: number; halfLife?: number; timeTable?: [number, number][];  // 1/min; min; (min, conversion) rows
    heat1?: number; heat2?: number;           // −ΔHp kJ/mol (default from the library when names match)
    batchMass?: number; heatCapacity?: number; riseLimit?: number;   // g; J/(g·K), default 2.0; K, default 50
    jcr?: [number, number][]; samples?: number; seed?: number;       // uncertainty band (default 500 samples)
  }): PlanResult | CopolyError;
  starvedFeed(a: { r1: number; r2: number; targetF1: number; feedRate: number; rateConstant: number; molarMass1: number; molarMass2: number }): { inventory: number; f1: number } | CopolyError;
  qe(a: { monomer1: string; monomer2: string }): { r1: number; r2: number; q1: number; e1: number; q2: number; e2: number; source1: string; source2: string } | CopolyError;  // screening estimate
  limits(a?: {}): Limits;       // every limit of the inputs, as the Go code applies them
  parseNumber(a: { text: string; field?: string }): { value: number } | CopolyError;  // a number as typed: "0,35", "−0.5", "1,5e3", "35 %" (= 0.35); errors name field (default "number")
  loadProject(a?: { tab?: string;              // the page's name for its draft
    draft?: { savedAt: string; basedOn?: Revision; fields: { [input: string]: string } } }  // the page's own copy of its draft (the later one wins); one that does not read is ignored
  ): Promise<StorageLoad | CopolyError>;
  saveProject(a: { project: Project; basedOn?: Revision }): Promise<SaveResult | CopolyError>;  // basedOn absent: the zero revision
  saveDraft(a: { tab: string; fields: { [input: string]: string }; basedOn?: Revision }): Promise<{ saved: true; savedAt: string } | CopolyError>;
  dropDraft(a: { tab: string }): Promise<{ dropped: true } | CopolyError>;
  keptCopy(a: { name: string }): Promise<{ copy: KeptCopy; filename: string; bytes: Uint8Array; project?: Project } | CopolyError>;  // project: when the bytes read as one
  dropKept(a: { name: string }): Promise<{ dropped: true } | CopolyError>;
}

declare global {
  // Defined by the WebAssembly module once it has started.
  var copoly: Copoly;
  // Set by the page: resolves once the module is loaded and the first results are drawn.
  var copolyReady: Promise<void>;
}
