// Headless-Firefox test of the offline page: dist/copoly.html opened from file:// in Firefox ESR,
// driven over WebDriver BiDi by puppeteer-core. It is the second-browser companion of the
// Chromium test in site/browsertest/browser_test.go and checks the same elements and values.
//
// Run it with `make test-firefox`, which builds the page, installs puppeteer-core from
// package-lock.json (npm ci) when node_modules is missing and sets the environment:
//
//	COPOLY_HTML             absolute path of dist/copoly.html (required; the test skips without it)
//	COPOLY_FIREFOX          the Firefox executable; default /usr/bin/firefox-esr
//	COPOLY_REQUIRE_FIREFOX  "1": a missing Firefox fails the test instead of skipping it
//	COPOLY_FIREFOX_DUMPIO   "1": copy Firefox's own stdout and stderr to this process's
//
// Storage of a file:// page in Firefox. Firefox gives a page opened from file:// an opaque
// origin ("null" in location.origin), but keeps its IndexedDB under a storage key made from the
// file's path when security.fileuri.strict_origin_policy is true, which is Firefox's default: a
// user's project belongs to that file on that machine and survives a restart of the browser; the
// same page opened from another path starts with an empty store (Export/Import carries a project).
// Automation changes that pref: puppeteer's profile and Firefox's own remote agent both set it to
// false, under which every file:// page shares one store. This test therefore puts the user's
// default back (see launchFirefox), so that what it proves is what a user's Firefox does.

import { test } from "node:test";
import assert from "node:assert/strict";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import puppeteer from "puppeteer-core";

// Time limits. They are generous because a machine with two busy cores and no GPU starts Firefox
// slowly (up to 36 s was seen on a developer machine under load, against 9 s when quiet); they
// bound a hung browser or page, they measure nothing (the load time is measured by make bench).
const testTimeoutMs = 8 * 60_000;
const launchTimeoutMs = 120_000; // from spawning Firefox to a WebDriver BiDi session
const readyTimeoutMs = 90_000; // from a navigation to window.copolyReady
const stepTimeoutMs = 20_000; // from an input to the result or status it causes
const pollMs = 50;

const defaultFirefox = "/usr/bin/firefox-esr";
const skipMessage = "*** FIREFOX TEST SKIPPED: install Firefox ESR: apt-get install -y firefox-esr ***";

// The styrene (M1) / acrylonitrile (M2) pair: r1 = 0.40, r2 = 0.04, from Polymer Handbook,
// 4th ed. (Wiley 1999), section II, the free-radical reactivity-ratio table compiled by
// R. Z. Greenley, entry 0.40 / 0.04.
const styreneR1 = 0.4;
const acrylR2 = 0.04;
// The ratios as a person types them.
const typedR1 = "0.40";
const typedR2 = "0.04";
// wantAzeotrope is the azeotropic feed f1 = (1 − r2)/(2 − r1 − r2) = 0.96/1.56 = 0.61538…, the
// feed with F1 = f1 in the Mayo–Lewis equation (F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 66,
// 1594 (1944)), as the page prints it to three decimals.
const wantAzeotrope = "0.615";
// wantProduct is r1·r2 = 0.40 × 0.04 = 0.016 printed to three significant digits.
const wantProduct = "0.0160";

test("Firefox: the offline page computes, saves, and finds its project after a browser restart", { timeout: testTimeoutMs }, async (t) => {
  const html = process.env.COPOLY_HTML || "";
  if (!html) {
    t.skip("COPOLY_HTML is not set; run `make test-firefox`, which builds dist/copoly.html and sets it");
    return;
  }
  assert.ok(path.isAbsolute(html), `COPOLY_HTML=${JSON.stringify(html)}: want an absolute path`);
  assert.ok(fs.existsSync(html), `COPOLY_HTML=${html} does not exist (build the page with \`make site\`)`);
  const firefox = process.env.COPOLY_FIREFOX || defaultFirefox;
  if (!isExecutable(firefox)) {
    assert.notEqual(process.env.COPOLY_REQUIRE_FIREFOX, "1",
      `Firefox is required here (COPOLY_REQUIRE_FIREFOX=1) but ${firefox} is missing; install it with: apt-get install -y firefox-esr`);
    console.log(skipMessage);
    t.skip(skipMessage);
    return;
  }
  const pageURL = pathToFileURL(html).href;
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), "copoly-firefoxtest-"));
  t.after(() => fs.rmSync(profile, { recursive: true, force: true, maxRetries: 20, retryDelay: 100 }));
  const started = Date.now();
  const clock = () => `${((Date.now() - started) / 1000).toFixed(1)} s`;

  // First session: a fresh profile, so the page shows its invented demo project.
  {
    const browser = await launchFirefox(firefox, profile);
    try {
      t.diagnostic(`${await browser.version()} started with profile ${profile} at ${clock()}`);
      const { page, watch } = await openPage(browser, pageURL);
      t.diagnostic(`page ready at ${clock()}`);
      await watch.check("loading the page");
      await waitFor(page, "the demo badge to be shown on the first visit", () => {
        const b = document.getElementById("demo-badge");
        if (!b) return "no #demo-badge";
        if (!b.checkVisibility()) return "#demo-badge is hidden";
        return b.textContent.trim() ? "" : "#demo-badge is empty";
      });
      await checkNoFatalBanner(page);
      const stored = await storedProject(page);
      assert.equal(stored.storage, "indexeddb", `loadProject on the first visit: storage ${JSON.stringify(stored.storage)}, want IndexedDB`);
      assert.equal(stored.project, null, "a fresh profile already holds a stored project");

      // The demo's own numbers: the same elements, checked against the same formulas, for the
      // ratios and feed the demo shows.
      const demo = {
        r1: await fieldNumber(page, "r1"),
        r2: await fieldNumber(page, "r2"),
      };
      assert.ok(Math.abs(demo.r1 - styreneR1) > 0.01 || Math.abs(demo.r2 - acrylR2) > 0.01,
        `the demo already shows r1 = ${demo.r1}, r2 = ${demo.r2}; the test could not tell a saved edit from the demo`);
      await checkComposition(page, demo.r1, demo.r2, "the demo");
      await checkSequenceTable(page, demo.r1, demo.r2, "the demo");
      await watch.check("checking the demo's numbers");

      // Enter the pair as a person does: click into the field, select its text, type, Tab on.
      await typeInto(page, "r1", typedR1);
      await typeInto(page, "r2", typedR2);
      await waitText(page, "out-azeotrope", wantAzeotrope);
      await waitText(page, "out-product", wantProduct);
      await checkSequenceTable(page, styreneR1, acrylR2, "styrene/acrylonitrile");

      // The page reports a finished save in #storage-status ("Saved hh:mm:ss", site/src/storage.js
      // showStatus, after copoly.saveProject resolved); the module reads the same
      // project back from IndexedDB.
      await waitFor(page, "#storage-status to say the project is saved", () => {
        const s = document.getElementById("storage-status");
        if (!s) return "no #storage-status";
        const text = s.textContent.trim();
        if (!/^Saved\b/.test(text) || /(not|un|n't)\s*saved|fail|error|unavailable/i.test(text)) return "#storage-status: " + JSON.stringify(text);
        return "";
      });
      await waitStored(page, styreneR1, acrylR2);
      t.diagnostic(`edit saved at ${clock()}: #storage-status ${JSON.stringify(await textOf(page, "storage-status"))}`);
      await watch.check("entering r1 and r2 and saving");
    } finally {
      await browser.close();
    }
  }
  t.diagnostic(`Firefox closed at ${clock()}; stores in the profile: ${storageDirs(profile).join(", ") || "(none)"}`);

  // Second session: Firefox starts again on the same profile directory; the edited project
  // must come back from IndexedDB.
  {
    const browser = await launchFirefox(firefox, profile);
    try {
      t.diagnostic(`Firefox started again at ${clock()}`);
      const { page, watch } = await openPage(browser, pageURL);
      t.diagnostic(`page ready again after the restart at ${clock()}`);
      await watch.check("loading the page after the restart");
      const after = "after restarting Firefox on the same profile";
      assert.equal(await fieldNumber(page, "r1"), styreneR1, `#r1 ${after}`);
      assert.equal(await fieldNumber(page, "r2"), acrylR2, `#r2 ${after}`);
      await waitText(page, "out-azeotrope", wantAzeotrope);
      await waitText(page, "out-product", wantProduct);
      await checkSequenceTable(page, styreneR1, acrylR2, after);
      const status = await textOf(page, "storage-status");
      assert.match(status, /^Saved\b/, `#storage-status ${after}`);
      const stored = await storedProject(page);
      assert.equal(stored.storage, "indexeddb", `loadProject ${after}: storage`);
      assert.ok(stored.project, `loadProject ${after}: nothing stored`);
      assert.equal(stored.project.r1, styreneR1, `stored r1 ${after}`);
      assert.equal(stored.project.r2, acrylR2, `stored r2 ${after}`);
      await checkNoFatalBanner(page);
      await watch.check("checking the project after the restart");
    } finally {
      await browser.close();
    }
  }
  t.diagnostic(`done at ${clock()}`);
});

// launchFirefox starts headless Firefox on the profile directory over WebDriver BiDi.
async function launchFirefox(executablePath, userDataDir) {
  return puppeteer.launch({
    browser: "firefox",
    executablePath,
    headless: true,
    userDataDir,
    timeout: launchTimeoutMs,
    defaultViewport: { width: 1280, height: 1000 },
    dumpio: process.env.COPOLY_FIREFOX_DUMPIO === "1",
    extraPrefsFirefox: {
      // Firefox's own default, restored: puppeteer's profile and the remote agent's recommended
      // prefs set it to false for automation (one store shared by every file:// page); a user's
      // Firefox keeps a file:// page's storage per file path. See the top of this file.
      "security.fileuri.strict_origin_policy": true,
    },
  });
}

// openPage opens the page in the browser's tab, with every watcher in place before the page's
// first script runs, and waits for window.copolyReady.
async function openPage(browser, pageURL) {
  const page = (await browser.pages())[0] ?? (await browser.newPage());
  const watch = new Watch(page, pageURL);
  await page.evaluateOnNewDocument(installPageWatch);
  const response = await page.goto(pageURL, { waitUntil: "load", timeout: readyTimeoutMs });
  assert.ok(response === null || response.ok(), `opening ${pageURL}: ${response && response.status()}`);
  const problem = await withTimeout(page.evaluate(async () => {
    if (!window.copolyReady || typeof window.copolyReady.then !== "function") return "window.copolyReady is not a promise";
    try {
      await window.copolyReady;
    } catch (e) {
      return "window.copolyReady rejected: " + e;
    }
    if (!window.copoly || typeof window.copoly.version !== "string" || !window.copoly.version) return "window.copoly.version is missing after copolyReady";
    return "";
  }), readyTimeoutMs, "waiting for window.copolyReady");
  assert.equal(problem, "", problem);
  assert.equal(await page.evaluate(() => Array.isArray(window.__copolyFirefoxWatch)), true,
    "the in-page watch did not run before the page; the checks for CSP violations and requests would see nothing");
  return { page, watch };
}

// installPageWatch runs in the page before its own scripts (a WebDriver BiDi preload script, which
// the page's Content-Security-Policy does not govern). It records what the protocol's events may
// not show: requests the CSP blocked, resources fetched from anywhere but the page itself or
// data:/blob: URLs, failed loads, uncaught errors and unhandled promise rejections.
function installPageWatch() {
  const seen = [];
  Object.defineProperty(window, "__copolyFirefoxWatch", { value: seen });
  const here = location.href.split("#")[0];
  const local = (u) => u.split("#")[0] === here || u.startsWith("data:") || u.startsWith("blob:");
  addEventListener("securitypolicyviolation", (e) => seen.push(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || "(inline)"}`));
  addEventListener("error", (e) => {
    if (e.target && e.target !== window) seen.push(`load error: <${e.target.localName}> ${e.target.src || e.target.href || ""}`);
    else seen.push(`error event: ${e.message} (${e.filename}:${e.lineno}:${e.colno})`);
  }, true);
  addEventListener("unhandledrejection", (e) => seen.push(`unhandled rejection: ${e.reason && e.reason.stack ? e.reason.stack : e.reason}`));
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) if (!local(e.name)) seen.push(`resource fetched: ${e.name} (${e.initiatorType})`);
  }).observe({ type: "resource", buffered: true });
}

// Watch collects what the page must never do: console errors and failed assertions, uncaught
// exceptions, and requests other than its own file and data:/blob: URLs (which never leave the
// page), from the WebDriver BiDi events and from the in-page watch.
class Watch {
  #page;
  #problems = [];

  constructor(page, pageURL) {
    this.#page = page;
    const own = pageURL.split("#")[0];
    page.on("console", (m) => {
      if (m.type() === "error" || m.type() === "assert") {
        const at = m.location();
        this.#problems.push(`console.${m.type()}: ${m.text()}${at && at.url ? ` (${at.url}:${at.lineNumber}:${at.columnNumber})` : ""}`);
      }
    });
    page.on("pageerror", (e) => this.#problems.push(`uncaught exception: ${e && e.stack ? e.stack : e}`));
    page.on("request", (r) => {
      const u = r.url().split("#")[0];
      if (u !== own && !u.startsWith("data:") && !u.startsWith("blob:")) this.#problems.push(`network request: ${r.method()} ${r.url()}`);
    });
  }

  // check fails the test with every problem seen since the last check.
  async check(during) {
    const inPage = await this.#page.evaluate(() => (window.__copolyFirefoxWatch || []).splice(0));
    const fresh = [...this.#problems.splice(0), ...inPage];
    assert.deepEqual(fresh, [], `while ${during}, the page did ${fresh.length} thing(s) it must never do:\n\t${fresh.join("\n\t")}`);
  }
}

// waitFor polls fn(...args) in the page until it returns "" and fails with its last answer, what
// the page shows instead, after timeoutMs.
async function waitFor(page, what, fn, args = [], timeoutMs = stepTimeoutMs) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const got = await page.evaluate(fn, ...args).catch((e) => `evaluating: ${e}`);
    if (got === "") return;
    if (Date.now() > deadline) assert.fail(`waited ${timeoutMs / 1000} s for ${what}; the page shows: ${got}`);
    await sleep(pollMs);
  }
}

// waitText waits until the element with the id contains want in its text.
async function waitText(page, id, want) {
  await waitFor(page, `#${id} to show ${JSON.stringify(want)}`, (id, want) => {
    const el = document.getElementById(id);
    if (!el) return "no #" + id;
    const text = el.textContent.trim();
    return text.includes(want) ? "" : "#" + id + ": " + JSON.stringify(text);
  }, [id, want]);
}

// typeInto edits the text field with the id as a person does: a click into it, Ctrl+A to select
// what it holds, the new text key by key (each key fires the input event the page listens to),
// then Tab to leave the field.
async function typeInto(page, id, text) {
  const el = await page.$(`#${id}`);
  assert.ok(el, `no #${id}`);
  assert.equal(await el.evaluate((e) => e.disabled || e.readOnly), false, `#${id} cannot be edited`);
  await el.click();
  await page.keyboard.down("Control");
  await page.keyboard.press("KeyA");
  await page.keyboard.up("Control");
  await page.keyboard.type(text);
  await page.keyboard.press("Tab");
  assert.equal(await el.evaluate((e) => e.value), text, `#${id} after typing ${JSON.stringify(text)}`);
  await el.dispose();
}

async function textOf(page, id) {
  return page.evaluate((id) => (document.getElementById(id) || { textContent: "(no #" + id + ")" }).textContent.trim(), id);
}

// fieldNumber is the number in the input with the id; it fails the test when there is none.
async function fieldNumber(page, id) {
  const text = await page.evaluate((id) => (document.getElementById(id) || { value: "(no such input)" }).value, id);
  const v = Number(text.trim());
  assert.ok(text.trim() !== "" && Number.isFinite(v), `#${id} = ${JSON.stringify(text)}, want a number`);
  return v;
}

// storedProject is what the page's module reads back from IndexedDB (copoly.loadProject).
async function storedProject(page) {
  const r = await page.evaluate(async () => {
    const r = await window.copoly.loadProject({});
    return r && r.error ? { error: r.error } : { storage: r.storage, project: r.project };
  });
  assert.equal(r.error, undefined, `copoly.loadProject: ${r.error}`);
  return r;
}

// waitStored waits until the stored project holds r1 and r2.
async function waitStored(page, r1, r2) {
  const deadline = Date.now() + stepTimeoutMs;
  for (;;) {
    const { project } = await storedProject(page);
    if (project && project.r1 === r1 && project.r2 === r2) return;
    if (Date.now() > deadline) {
      assert.fail(`waited ${stepTimeoutMs / 1000} s for r1 = ${r1}, r2 = ${r2} to be stored; stored: ${project ? `r1 = ${project.r1}, r2 = ${project.r2}` : "nothing"}`);
    }
    await sleep(pollMs);
  }
}

// checkComposition checks #out-azeotrope and #out-product for the terminal model with r1, r2 (both
// below 1, so the azeotrope exists): f1az = (1 − r2)/(2 − r1 − r2), from F1 = f1 in the Mayo–Lewis
// equation (F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 66, 1594 (1944)), printed to three
// decimals, and r1·r2, printed to three significant digits. Each shown number must be within half
// a unit of its last printed digit of the formula's value.
async function checkComposition(page, r1, r2, what) {
  assert.ok(r1 < 1 && r2 < 1, `${what}: r1 = ${r1}, r2 = ${r2}; the azeotrope check needs both below 1`);
  const product = r1 * r2;
  const checks = [
    { id: "out-azeotrope", want: (1 - r2) / (2 - r1 - r2), tol: 0.5e-3 },
    { id: "out-product", want: product, tol: 0.5 * 10 ** (Math.floor(Math.log10(product)) - 2) },
  ];
  for (const { id, want, tol } of checks) {
    await waitFor(page, `#${id} to show ${want.toPrecision(6)} ± ${tol} for ${what}`, (id, want, tol) => {
      const el = document.getElementById(id);
      if (!el) return "no #" + id;
      const text = el.textContent.trim();
      return Math.abs(Number(text) - want) <= tol * (1 + 1e-9) ? "" : "#" + id + ": " + JSON.stringify(text);
    }, [id, want, tol]);
  }
}

// checkSequenceTable checks that every statistic cell of #seq-table holds a finite number, that
// fractions and probabilities lie in [0, 1], and that the column at the starting feed (the cells
// with data-col="feed") shows the terminal-model statistics for r1, r2 and the feed in #f10.
async function checkSequenceTable(page, r1, r2, what) {
  // The table is redrawn after each input; wait until its feed column is the one for r1 and r2.
  const f1 = await fieldNumber(page, "f10");
  assert.ok(f1 > 0 && f1 < 1, `#f10 = ${f1}, want a feed fraction in (0, 1)`);
  const want = terminalStats(r1, r2, f1);
  // The page prints 4 decimals, so a correct value is within 5e-5 of the printed one.
  const tol = 6e-5;
  const F1 = want.find((w) => w.stat === "F1").value;
  await waitFor(page, `#seq-table to show F1 = ${F1.toFixed(4)} for ${what}`, (F1, tol) => {
    const c = document.querySelector('#seq-table [data-stat="F1"][data-col="feed"]');
    if (!c) return 'no [data-stat="F1"][data-col="feed"] cell';
    return Math.abs(Number(c.textContent.trim()) - F1) <= tol ? "" : "F1 cell: " + JSON.stringify(c.textContent.trim());
  }, [F1, tol]);
  const cells = await page.evaluate(() => [...document.querySelectorAll("#seq-table [data-stat]")]
    .map((c) => [c.dataset.stat, c.dataset.col || "", c.textContent.trim()]));
  assert.ok(cells.length > 0, "no [data-stat] cell in #seq-table");
  const feed = new Map();
  const errors = [];
  for (const [name, col, text] of cells) {
    // Accept the typographic minus and a trailing percent sign.
    const num = text.replaceAll("−", "-").replace(/[%\s]+$/, "");
    const v = Number(num);
    if (num === "" || !Number.isFinite(v)) {
      errors.push(`[data-stat=${name}][data-col=${col}] = ${JSON.stringify(text)}, want a finite number`);
      continue;
    }
    if (isFraction(name) && !text.includes("%") && (v < 0 || v > 1)) {
      errors.push(`[data-stat=${name}][data-col=${col}] = ${JSON.stringify(text)}, want a fraction in [0, 1]`);
    }
    if (col === "feed") feed.set(name, v);
  }
  for (const w of want) {
    if (!feed.has(w.stat)) errors.push(`no cell [data-stat=${w.stat}][data-col="feed"]`);
    else if (Math.abs(feed.get(w.stat) - w.value) > tol) {
      errors.push(`[data-stat=${w.stat}][data-col="feed"] = ${feed.get(w.stat)}; want ${w.value.toFixed(6)} (${w.formula})`);
    }
  }
  assert.deepEqual(errors, [], `#seq-table for ${what} (r1 = ${r1}, r2 = ${r2}, f1 = ${f1}):\n\t${errors.join("\n\t")}`);
}

// terminalStats are the sequence statistics of the terminal model at feed f1, the model being a
// first-order Markov chain of monomer additions (formulas as collected in G. Odian, Principles of
// Polymerization, 4th ed., Wiley 2004, section 6-5; section number from memory):
//
//	F1 = (r1 f1² + f1 f2)/(r1 f1² + 2 f1 f2 + r2 f2²)     Mayo, Lewis, J. Am. Chem. Soc. 66, 1594 (1944)
//	p11 = r1 f1/(r1 f1 + f2),  p12 = 1 − p11,  p21 = f1/(f1 + r2 f2),  p22 = 1 − p21
//	dyads: 11 = F1 p11, 12 + 21 = 2 F1 p12, 22 = F2 p22
//	triads centred on M1: 111 = p11², 112 + 211 = 2 p11 p12, 212 = p12² (and likewise on M2)
//	mean run lengths 1/p12 and 1/p21; run number 200/(1/p12 + 1/p21)
//	(H. J. Harwood, W. M. Ritchey, J. Polym. Sci. B 2, 601 (1964)); randomness p12 + p21.
function terminalStats(r1, r2, f1) {
  const f2 = 1 - f1;
  const F1 = (r1 * f1 * f1 + f1 * f2) / (r1 * f1 * f1 + 2 * f1 * f2 + r2 * f2 * f2);
  const p11 = (r1 * f1) / (r1 * f1 + f2);
  const p21 = f1 / (f1 + r2 * f2);
  const p12 = 1 - p11;
  const p22 = 1 - p21;
  const n1 = 1 / p12;
  const n2 = 1 / p21;
  return [
    { stat: "F1", value: F1, formula: "Mayo–Lewis F1" },
    { stat: "p11", value: p11, formula: "r1 f1/(r1 f1 + f2)" },
    { stat: "p12", value: p12, formula: "1 − p11" },
    { stat: "p21", value: p21, formula: "f1/(f1 + r2 f2)" },
    { stat: "p22", value: p22, formula: "1 − p21" },
    { stat: "dyad11", value: F1 * p11, formula: "F1 p11" },
    { stat: "dyad12", value: 2 * F1 * p12, formula: "2 F1 p12" },
    { stat: "dyad22", value: (1 - F1) * p22, formula: "F2 p22" },
    { stat: "triad111", value: p11 * p11, formula: "p11²" },
    { stat: "triad112", value: 2 * p11 * p12, formula: "2 p11 p12" },
    { stat: "triad212", value: p12 * p12, formula: "p12²" },
    { stat: "triad222", value: p22 * p22, formula: "p22²" },
    { stat: "triad221", value: 2 * p22 * p21, formula: "2 p22 p21" },
    { stat: "triad121", value: p21 * p21, formula: "p21²" },
    { stat: "meanLength1", value: n1, formula: "1/p12" },
    { stat: "meanLength2", value: n2, formula: "1/p21" },
    { stat: "runNumber", value: 200 / (n1 + n2), formula: "200/(1/p12 + 1/p21)" },
    { stat: "randomness", value: p12 + p21, formula: "p12 + p21" },
  ];
}

// isFraction reports whether a statistic named as in the JS contract (copoly.d.ts) is a
// probability or a dyad or triad fraction.
function isFraction(name) {
  const n = name.toLowerCase();
  return n.startsWith("p1") || n.startsWith("p2") || n.startsWith("dyad") || n.startsWith("triad");
}

// checkNoFatalBanner fails the test if the page shows that its module stopped.
async function checkNoFatalBanner(page) {
  const text = await page.evaluate(() => {
    const b = document.getElementById("fatal-banner");
    return b && b.checkVisibility() ? "shown: " + b.textContent.trim() : "";
  });
  assert.equal(text, "", `#fatal-banner is ${text}`);
}

// storageDirs lists the per-origin stores Firefox keeps in the profile, for the log only: the
// layout is Firefox's own and may change between versions, so the test does not depend on it.
function storageDirs(profile) {
  try {
    return fs.readdirSync(path.join(profile, "storage", "default"));
  } catch {
    return [];
  }
}

function isExecutable(p) {
  try {
    fs.accessSync(p, fs.constants.X_OK);
    return fs.statSync(p).isFile();
  } catch {
    return false;
  }
}

function sleep(ms) {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

// withTimeout settles like p, or fails with what after ms.
async function withTimeout(p, ms, what) {
  let timer;
  const timeout = new Promise((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${what}: no answer within ${ms / 1000} s`)), ms);
  });
  try {
    return await Promise.race([p, timeout]);
  } finally {
    clearTimeout(timer);
  }
}
