//go:build !js

// Package browsertest opens the built page, dist/copoly.html, from file:// in headless Chromium
// and uses it as a person would: it types reactivity ratios, reads the results, reloads the page
// to see the project come back from IndexedDB, and types a bad value to see it refused. A second
// test pastes simulated bench data (decimal commas, tab-separated) into the bench grid, checks
// the estimated reactivity ratios and the drawn joint confidence region, copies the ratios into
// the pair panel, and reloads to see the grid kept as typed. A third plans a semi-batch in the
// feed-planning panel, checks the schedule, the recipe's mass balance and the safety box, types a
// bad amount to see it refused, reloads to see the panel's inputs kept, and adds a monomer of its
// own to see it offered in the pickers. A fourth chooses the explicit penultimate model with the
// terminal ratios and checks that it draws the terminal composition curve and azeotrope, pastes
// triads made by the terminal model and reads the verdict that they show no penultimate effect,
// simulates 2000 chains, enters two molar-mass classes to check Mn and Mw, and reloads to see the
// triads, the classes and the model kept. The storage tests break the browser storage on
// purpose: no IndexedDB (three ways), a full storage, damaged stored files, two tabs saving the
// same project, and a reload in the middle of typing. One more delays an answer of the module,
// as a module running in a Web Worker may answer late, and checks that the page shows and saves
// the newer edit, never the late answer. The page must do all this without a console error, an
// uncaught exception or any request beyond its own file.
//
// Three more look at the page itself. The print test emulates print media on a viewport as wide
// as A4's printable width and checks that the report holds every required section (with the date,
// the engine's version and the invented-demo marker) and no control or empty section, then has
// Chromium print it to PDF. The keyboard test reads Chromium's accessibility tree for the name of
// every visible control and plot, and presses Tab through the whole page. The security tests type
// script-bearing text into every free-text field, save and import files carrying it, and check
// that nothing runs and the text comes back literally; they check that the Content-Security-Policy
// refuses code from strings and that no request reaches a local server the page tries to reach
// in every way it could. Only there are console errors expected, and only the policy's refusals.
//
// The package has only a test. Run it through make, which builds the page first:
//
//	make test-browser
//
// The test reads the environment:
//
//	COPOLY_HTML             absolute path of the page (make sets it); unset: the test is skipped
//	COPOLY_REQUIRE_BROWSER  "1": a missing Chromium fails the test instead of skipping it (CI sets
//	                        CI, which has the same effect)
//	COPOLY_SHOT             if set, a PNG screenshot of the page at the end of the test is written here
//	COPOLY_PDF              if set, the print test writes the PDF of the report here
//
// Chromium is /usr/bin/chromium or the first chromium on PATH (Debian: apt-get install -y chromium).
package browsertest
