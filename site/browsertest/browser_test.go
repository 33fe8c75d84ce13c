//go:build !js

package browsertest

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"net/url"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/log"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"

	"copoly/site/internal/headless"
)

// Time limits. They are generous because a CI machine without a GPU may compile the module
// slowly; they bound a hung page, they measure nothing (the load time is measured by make bench).
const (
	testTimeout  = 3 * time.Minute
	readyTimeout = 60 * time.Second // from a navigation to window.copolyReady
	stepTimeout  = 20 * time.Second // from an input to the result or status it causes
	pollInterval = 50 * time.Millisecond

	// saveSettle is how long the test waits after typing a refused value before it reloads,
	// so that a page that wrongly saved the refused value would have done so. It is well
	// above any sensible save delay (common practice, no source).
	saveSettle = 2 * time.Second
)

// skipMessage is printed when Chromium is missing outside CI; make test-browser prints it too.
const skipMessage = "*** BROWSER TEST SKIPPED: install chromium: apt-get install -y chromium ***"

// The styrene (M1) / acrylonitrile (M2) pair: r1 = 0.40, r2 = 0.04, from Polymer Handbook,
// 4th ed. (Wiley 1999), section II, the free-radical reactivity-ratio table compiled by
// R. Z. Greenley, entry 0.40 / 0.04.
const (
	styreneR1 = 0.40
	acrylR2   = 0.04
	// wantAzeotrope is the azeotropic feed f1 = (1 − r2)/(2 − r1 − r2) = 0.96/1.56 = 0.61538…,
	// the feed with F1 = f1 in the Mayo–Lewis equation (F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc.
	// 66, 1594 (1944)), as the page prints it to three decimals.
	wantAzeotrope = "0.615"
	// wantProduct is r1·r2 = 0.40 × 0.04 = 0.016 printed to three significant digits.
	wantProduct = "0.0160"
)

// TestBrowserOfflinePage loads dist/copoly.html from file:// with a fresh browser profile,
// enters the styrene/acrylonitrile ratios, checks the results, reloads to check that IndexedDB
// kept the project, and checks that a negative ratio is refused next to its field and never
// stored. Console errors, uncaught exceptions, browser-log errors and any request other than
// the page's own file, data: and blob: URLs fail the test.
func TestBrowserOfflinePage(t *testing.T) {
	// First visit: a fresh profile, so the page shows its invented demo project.
	ctx, w, _ := openPage(t, "")
	w.check(t, "loading the page")
	waitUntil(t, ctx, "the demo badge is shown on the first visit", `
		const b = document.getElementById("demo-badge");
		if (!b) return "no #demo-badge";
		if (!b.checkVisibility()) return "#demo-badge is hidden";
		if (!b.textContent.trim()) return "#demo-badge is empty";
		return "";`, stepTimeout)
	checkNoFatalBanner(t, ctx)

	// Enter the pair as a person typing would: each keystroke fires an input event.
	setInput(t, ctx, "r1", "0.40")
	setInput(t, ctx, "r2", "0.04")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	waitText(t, ctx, "out-product", wantProduct)
	checkSequenceTable(t, ctx, styreneR1, acrylR2)
	waitUntil(t, ctx, "#storage-status says the project is saved", `
		const s = document.getElementById("storage-status");
		if (!s) return "no #storage-status";
		const text = s.textContent.trim();
		if (!/saved/i.test(text) || /(not|un|n't)\s*saved|fail|error|unavailable/i.test(text)) return "#storage-status: " + JSON.stringify(text);
		return "";`, stepTimeout)
	status := evalJS[string](t, ctx, `document.getElementById("storage-status").textContent.trim()`)
	w.check(t, "entering r1 and r2")

	// Reload in the same browser and profile: the project must come back from IndexedDB.
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkFieldValue(t, ctx, "r1", styreneR1, "after a reload (#storage-status said "+strconv.Quote(status)+" before it)")
	checkFieldValue(t, ctx, "r2", acrylR2, "after a reload")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	checkNoFatalBanner(t, ctx)
	w.check(t, "reloading the page")

	// A negative reactivity ratio is refused next to its field and never stored.
	setInput(t, ctx, "r1", "-1")
	waitUntil(t, ctx, `#r1 is marked aria-invalid="true" after typing -1`, `
		const r1 = document.getElementById("r1");
		const v = r1.getAttribute("aria-invalid");
		return v === "true" ? "" : "aria-invalid=" + JSON.stringify(v);`, stepTimeout)
	msg := evalJS[string](t, ctx, `(() => {
		const r1 = document.getElementById("r1");
		const ids = [r1.getAttribute("aria-errormessage"), r1.getAttribute("aria-describedby")]
			.filter(Boolean).join(" ").split(/\s+/).filter(Boolean);
		return ids.map(id => document.getElementById(id))
			.filter(e => e && e.checkVisibility())
			.map(e => e.textContent.trim()).filter(Boolean).join(" | ");
	})()`)
	switch {
	case msg == "":
		t.Errorf("after typing -1 in #r1: no visible error message referenced by its aria-errormessage or aria-describedby")
	case !strings.Contains(msg, "-1") && !strings.Contains(msg, "−1"):
		t.Errorf("after typing -1 in #r1: the message %q does not name the value -1", msg)
	default:
		t.Logf("error shown for r1 = -1: %q", msg)
	}
	checkNoFatalBanner(t, ctx)
	run(t, ctx, "wait for a save that must not happen", chromedp.Sleep(saveSettle))
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	// The stored project keeps r1 = 0.40; the text typed comes back as typed, still refused,
	// with a way to discard it (the draft of the form: see TestBrowserStorageDraft).
	storedProject(t, ctx, "the stored r1 to stay 0.4", `return p.r1 === 0.4 ? "" : "r1 = " + p.r1;`)
	if got := evalJS[string](t, ctx, `document.getElementById("r1").value`); got != "-1" {
		t.Errorf("after typing -1 and reloading: #r1 = %q, want the typed -1 back", got)
	}
	click(t, ctx, "draft-discard")
	checkFieldValue(t, ctx, "r1", styreneR1, "after typing -1, reloading and discarding the typing (the refused value must not be stored)")
	checkFieldValue(t, ctx, "r2", acrylR2, "after typing -1 and reloading")
	if v := evalJS[string](t, ctx, `String(document.getElementById("r1").getAttribute("aria-invalid"))`); v == "true" {
		t.Errorf(`after discarding the typing, #r1 still has aria-invalid="true"`)
	}
	w.check(t, "typing -1 and reloading")
}

// pagePath returns the page named by COPOLY_HTML, or skips the test when it is unset.
func pagePath(t *testing.T) string {
	t.Helper()
	html := os.Getenv("COPOLY_HTML")
	if html == "" {
		t.Skip("COPOLY_HTML is not set; run `make test-browser`, which builds dist/copoly.html and sets it")
	}
	if !filepath.IsAbs(html) {
		t.Fatalf("COPOLY_HTML=%q: want an absolute path", html)
	}
	if _, err := os.Stat(html); err != nil {
		t.Fatalf("COPOLY_HTML: %v (build the page with `make site`)", err)
	}
	return html
}

// findChromium returns the Chromium executable. When there is none it fails the test in CI
// (env CI set, or COPOLY_REQUIRE_BROWSER=1) and otherwise skips it loudly.
func findChromium(t *testing.T) string {
	t.Helper()
	if p := headless.Chromium(); p != "" {
		return p
	}
	if os.Getenv("CI") != "" || os.Getenv("COPOLY_REQUIRE_BROWSER") == "1" {
		t.Fatal("Chromium is required here (CI or COPOLY_REQUIRE_BROWSER=1) but neither /usr/bin/chromium nor chromium on PATH exists; install it with: apt-get install -y chromium")
	}
	t.Skip(skipMessage)
	return ""
}

// startBrowser starts headless Chromium with a fresh profile directory, which lives as long as
// the test so that IndexedDB survives reloads, and returns a tab context whose events go to w.
// stop ends the browser and removes the profile.
// openPage starts Chromium with a fresh profile, makes its tab run script (if any) in every new
// document before the page's own scripts, opens the offline page from file:// and waits for
// window.copolyReady; the browser stops (after the screenshot of COPOLY_SHOT) when the test
// ends. It returns the tab, the watcher of its console and requests, and the page's URL.
func openPage(t *testing.T, script string) (context.Context, *watcher, string) {
	t.Helper()
	pageURL := (&url.URL{Scheme: "file", Path: pagePath(t)}).String()
	chromium := findChromium(t)
	w := &watcher{pageURL: pageURL}
	ctx, stop := startBrowser(t, chromium, w)
	t.Cleanup(stop)
	t.Cleanup(func() { screenshot(t, ctx) }) // runs first: cleanups run last-in first-out
	if script != "" {
		addScript(t, ctx, script)
	}
	run(t, ctx, "navigate to "+pageURL, chromedp.Navigate(pageURL))
	waitReady(t, ctx)
	return ctx, w, pageURL
}

func startBrowser(t *testing.T, chromium string, w *watcher) (ctx context.Context, stop func()) {
	t.Helper()
	profile, err := os.MkdirTemp("", "copoly-browsertest-")
	if err != nil {
		t.Fatal(err)
	}
	out := &tailBuffer{max: 8 << 10}
	allocCtx, cancelAlloc := chromedp.NewExecAllocator(context.Background(),
		append(headless.Options(chromium, profile), chromedp.CombinedOutput(out))...)
	tabCtx, cancelTab := chromedp.NewContext(allocCtx, chromedp.WithListener(w.listen))
	ctx, cancelTimeout := context.WithTimeout(tabCtx, testTimeout)
	stop = func() {
		cancelTimeout()
		cancelTab()
		cancelAlloc()
		if t.Failed() {
			t.Logf("last output of Chromium (without its D-Bus complaints):\n%s", withoutDBus(out.String()))
		}
		// Chromium's helper processes can write into the profile for a moment after the browser
		// exits, so retry the removal for a while.
		for i := 0; ; i++ {
			err := os.RemoveAll(profile)
			if err == nil {
				return
			}
			if i == 50 {
				t.Logf("removing the browser profile: %v", err)
				return
			}
			time.Sleep(100 * time.Millisecond)
		}
	}
	// Start the browser now, without the test timeout: the first Run owns the browser's life.
	if _, err := chromedp.Run(tabCtx, chromedp.Evaluate[chromedp.Void](`0`)); err != nil {
		stop()
		t.Fatalf("starting %s: %v", chromium, err)
	}
	return ctx, stop
}

// watcher collects what the page must never do: console errors, uncaught exceptions, errors in
// the browser log, and requests to anything but its own file, data: and blob: URLs.
type watcher struct {
	pageURL string

	mu       sync.Mutex
	problems []string
	reported int
}

// listen receives every event of the tab, on chromedp's reading goroutine; it must not block.
func (w *watcher) listen(ev any) {
	var p string
	switch ev := ev.(type) {
	case *runtime.EventConsoleAPICalled:
		if ev.Type == runtime.ConsoleAPICalledTypeError || ev.Type == runtime.ConsoleAPICalledTypeAssert {
			p = "console." + string(ev.Type) + ": " + remoteText(ev.Args) + stackPlace(ev.StackTrace)
		}
	case *runtime.EventExceptionThrown:
		d := ev.ExceptionDetails
		text := d.Text
		if d.Exception != nil {
			text += " " + remoteText([]*runtime.RemoteObject{d.Exception})
		}
		p = fmt.Sprintf("uncaught exception: %s (%s:%d:%d)", text, d.URL, d.LineNumber+1, d.ColumnNumber+1)
	case *log.EventEntryAdded:
		if e := ev.Entry; e.Level == log.EntryLevelError {
			p = fmt.Sprintf("browser log error (%s): %s %s", e.Source, e.Text, e.URL)
		}
	case *network.EventRequestWillBeSent:
		if u := ev.Request.URL; !w.allowed(u) {
			p = fmt.Sprintf("network request: %s %s (for %s)", ev.Request.Method, u, ev.DocumentURL)
		}
	}
	if p != "" {
		w.mu.Lock()
		w.problems = append(w.problems, p)
		w.mu.Unlock()
	}
}

// allowed reports whether the page may request u: its own file (without a fragment), or data
// that never leaves the page.
func (w *watcher) allowed(u string) bool {
	u, _, _ = strings.Cut(u, "#")
	return u == w.pageURL || strings.HasPrefix(u, "data:") || strings.HasPrefix(u, "blob:")
}

// check fails the test with every problem seen since the last check.
func (w *watcher) check(t *testing.T, during string) {
	t.Helper()
	w.mu.Lock()
	fresh := w.problems[w.reported:]
	w.reported = len(w.problems)
	w.mu.Unlock()
	if len(fresh) > 0 {
		t.Errorf("while %s, the page did %d thing(s) it must never do:\n\t%s", during, len(fresh), strings.Join(fresh, "\n\t"))
	}
}

// remoteText renders console arguments or an exception: values as JSON, objects by description.
func remoteText(args []*runtime.RemoteObject) string {
	parts := make([]string, 0, len(args))
	for _, a := range args {
		switch {
		case a == nil:
		case a.Description != "":
			parts = append(parts, a.Description)
		case len(a.Value) > 0:
			var s string
			if json.Unmarshal(a.Value, &s) == nil {
				parts = append(parts, s)
			} else {
				parts = append(parts, string(a.Value))
			}
		default:
			parts = append(parts, string(a.Type))
		}
	}
	return strings.Join(parts, " ")
}

// stackPlace is " (url:line:column)" of the top frame, or "".
func stackPlace(st *runtime.StackTrace) string {
	if st == nil || len(st.CallFrames) == 0 {
		return ""
	}
	f := st.CallFrames[0]
	return fmt.Sprintf(" (%s:%d:%d)", f.URL, f.LineNumber+1, f.ColumnNumber+1)
}

// run runs a chromedp action and fails the test if it fails.
func run[T any](t *testing.T, ctx context.Context, what string, a chromedp.Action[T]) T {
	t.Helper()
	v, err := chromedp.Run(ctx, a)
	if err != nil {
		t.Fatalf("%s: %v", what, err)
	}
	return v
}

// evalJS evaluates a JavaScript expression in the page and decodes its value into T.
func evalJS[T any](t *testing.T, ctx context.Context, expr string) T {
	t.Helper()
	return run(t, ctx, "evaluating "+strings.Join(strings.Fields(expr), " "), chromedp.Evaluate[T](expr))
}

// waitReady waits until the page's copolyReady promise resolves and window.copoly exists.
func waitReady(t *testing.T, ctx context.Context) {
	t.Helper()
	rctx, cancel := context.WithTimeout(ctx, readyTimeout)
	defer cancel()
	problem, err := chromedp.Run(rctx, chromedp.Evaluate[string](`(async () => {
		if (!window.copolyReady || typeof window.copolyReady.then !== "function") return "window.copolyReady is not a promise";
		await window.copolyReady;
		if (!window.copoly || typeof window.copoly.version !== "string" || !window.copoly.version) return "window.copoly.version is missing after copolyReady";
		return "";
	})()`, chromedp.EvalAwaitPromise))
	var exc *chromedp.ExceptionError
	switch {
	case errors.As(err, &exc):
		t.Fatalf("window.copolyReady rejected: %v", err)
	case err != nil:
		t.Fatalf("waiting for window.copolyReady (up to %v): %v", readyTimeout, err)
	case problem != "":
		t.Fatal(problem)
	}
}

// waitUntil runs body, the body of a JavaScript function returning "" when the condition holds
// and otherwise what the page shows instead, until the condition holds or timeout passes; then
// it fails the test with the last answer.
func waitUntil(t *testing.T, ctx context.Context, what, body string, timeout time.Duration) {
	t.Helper()
	expr := "(() => { try {" + body + "} catch (e) { return String(e); } })()"
	deadline := time.Now().Add(timeout)
	for {
		got := evalJS[string](t, ctx, expr)
		if got == "" {
			return
		}
		if time.Now().After(deadline) {
			t.Fatalf("waited %v for %s; the page shows: %s", timeout, what, got)
		}
		run(t, ctx, "poll", chromedp.Sleep(pollInterval))
	}
}

// waitText waits until the element with the id contains want in its text.
func waitText(t *testing.T, ctx context.Context, id, want string) {
	t.Helper()
	waitUntil(t, ctx, fmt.Sprintf("#%s to show %q", id, want), fmt.Sprintf(`
		const el = document.getElementById(%s);
		if (!el) return "no #" + %[1]s;
		const text = el.textContent.trim();
		return text.includes(%s) ? "" : "#" + %[1]s + ": " + JSON.stringify(text);`, jsString(id), jsString(want)), stepTimeout)
}

// setInput sets the value of the input with the id and fires an input event, as typing does.
func setInput(t *testing.T, ctx context.Context, id, value string) {
	t.Helper()
	problem := evalJS[string](t, ctx, fmt.Sprintf(`((id, v) => {
		const el = document.getElementById(id);
		if (!el) return "no #" + id;
		if (el.disabled || el.readOnly) return "#" + id + " cannot be edited";
		el.focus();
		el.value = v;
		el.dispatchEvent(new Event("input", {bubbles: true}));
		return "";
	})(%s, %s)`, jsString(id), jsString(value)))
	if problem != "" {
		t.Fatalf("typing %q into #%s: %s", value, id, problem)
	}
}

// checkFieldValue checks that the input with the id holds a number within 1e-9 of want.
func checkFieldValue(t *testing.T, ctx context.Context, id string, want float64, when string) {
	t.Helper()
	got := evalJS[string](t, ctx, fmt.Sprintf(`(document.getElementById(%s) || {value: "(no such input)"}).value`, jsString(id)))
	v, err := strconv.ParseFloat(strings.TrimSpace(got), 64)
	if err != nil || math.Abs(v-want) > 1e-9 {
		t.Errorf("%s: #%s = %q, want %v", when, id, got, want)
	}
}

// checkSequenceTable checks that every statistic cell of #seq-table holds a finite number, that
// fractions and probabilities lie in [0, 1], and that the column at the starting feed (the cells
// with data-col="feed") shows the terminal-model statistics for r1, r2 and the feed in #f10.
func checkSequenceTable(t *testing.T, ctx context.Context, r1, r2 float64) {
	t.Helper()
	waitUntil(t, ctx, "#seq-table to hold statistic cells", `
		const n = document.querySelectorAll("#seq-table [data-stat]").length;
		return n > 0 ? "" : "no [data-stat] cell in #seq-table";`, stepTimeout)
	cells := evalJS[[][3]string](t, ctx, `[...document.querySelectorAll("#seq-table [data-stat]")]
		.map(c => [c.dataset.stat, c.dataset.col || "", c.textContent.trim()])`)
	feed := map[string]float64{}
	for _, c := range cells {
		name, col, text := c[0], c[1], c[2]
		// Accept the typographic minus and a trailing percent sign.
		num := strings.TrimSpace(strings.TrimRight(strings.ReplaceAll(text, "−", "-"), "% "))
		v, err := strconv.ParseFloat(num, 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			t.Errorf("#seq-table [data-stat=%q][data-col=%q] = %q, want a finite number", name, col, text)
			continue
		}
		if isFraction(name) && !strings.Contains(text, "%") && (v < 0 || v > 1) {
			t.Errorf("#seq-table [data-stat=%q][data-col=%q] = %q, want a fraction in [0, 1]", name, col, text)
		}
		if col == "feed" {
			feed[name] = v
		}
	}
	t.Logf("#seq-table: %v", cells)

	f1Text := evalJS[string](t, ctx, `(document.getElementById("f10") || {value: ""}).value`)
	f1, err := strconv.ParseFloat(strings.TrimSpace(f1Text), 64)
	if err != nil || f1 <= 0 || f1 >= 1 {
		t.Fatalf("#f10 = %q, want a feed fraction in (0, 1)", f1Text)
	}
	// The page prints 4 decimals, so a correct value is within 5e-5 of the printed one.
	const tol = 6e-5
	for _, w := range terminalStats(r1, r2, f1) {
		got, ok := feed[w.stat]
		switch {
		case !ok:
			t.Errorf(`#seq-table has no cell [data-stat=%q][data-col="feed"]`, w.stat)
		case math.Abs(got-w.value) > tol:
			t.Errorf(`#seq-table [data-stat=%q][data-col="feed"] = %v at r1 = %v, r2 = %v, f1 = %v; want %.6f (%s)`,
				w.stat, got, r1, r2, f1, w.value, w.formula)
		}
	}
}

// stat is one expected sequence statistic with the formula it comes from.
type stat struct {
	stat    string
	value   float64
	formula string
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
func terminalStats(r1, r2, f1 float64) []stat {
	f2 := 1 - f1
	F1 := (r1*f1*f1 + f1*f2) / (r1*f1*f1 + 2*f1*f2 + r2*f2*f2)
	p11 := r1 * f1 / (r1*f1 + f2)
	p21 := f1 / (f1 + r2*f2)
	p12, p22 := 1-p11, 1-p21
	n1, n2 := 1/p12, 1/p21
	return []stat{
		{"F1", F1, "Mayo–Lewis F1"},
		{"p11", p11, "r1 f1/(r1 f1 + f2)"},
		{"p12", p12, "1 − p11"},
		{"p21", p21, "f1/(f1 + r2 f2)"},
		{"p22", p22, "1 − p21"},
		{"dyad11", F1 * p11, "F1 p11"},
		{"dyad12", 2 * F1 * p12, "2 F1 p12"},
		{"dyad22", (1 - F1) * p22, "F2 p22"},
		{"triad111", p11 * p11, "p11²"},
		{"triad112", 2 * p11 * p12, "2 p11 p12"},
		{"triad212", p12 * p12, "p12²"},
		{"triad222", p22 * p22, "p22²"},
		{"triad221", 2 * p22 * p21, "2 p22 p21"},
		{"triad121", p21 * p21, "p21²"},
		{"meanLength1", n1, "1/p12"},
		{"meanLength2", n2, "1/p21"},
		{"runNumber", 200 / (n1 + n2), "200/(1/p12 + 1/p21)"},
		{"randomness", p12 + p21, "p12 + p21"},
	}
}

// isFraction reports whether a statistic named as in the JS contract (copoly.d.ts) is a
// probability or a dyad or triad fraction.
func isFraction(name string) bool {
	n := strings.ToLower(name)
	switch {
	case strings.HasPrefix(n, "p1"), strings.HasPrefix(n, "p2"):
		return true
	case strings.HasPrefix(n, "dyad"), strings.HasPrefix(n, "triad"):
		return true
	}
	return false
}

// checkNoFatalBanner fails the test if the page shows that its module stopped.
func checkNoFatalBanner(t *testing.T, ctx context.Context) {
	t.Helper()
	text := evalJS[string](t, ctx, `(() => {
		const b = document.getElementById("fatal-banner");
		if (!b) return "";
		return b.checkVisibility() ? "shown: " + b.textContent.trim() : "";
	})()`)
	if text != "" {
		t.Fatalf("#fatal-banner is %s", text)
	}
}

// screenshot writes a PNG of the whole page to $COPOLY_SHOT, if it is set.
func screenshot(t *testing.T, ctx context.Context) {
	path := os.Getenv("COPOLY_SHOT")
	if path == "" || ctx.Err() != nil {
		return
	}
	png, err := chromedp.Run(ctx, chromedp.FullScreenshot(100))
	if err == nil {
		err = os.WriteFile(path, png, 0o644)
	}
	if err != nil {
		t.Errorf("screenshot to COPOLY_SHOT=%s: %v", path, err)
		return
	}
	t.Logf("screenshot: %s", path)
}

// withoutDBus drops the lines in which Chromium complains that a container has no D-Bus; they
// are harmless and would bury the lines that matter.
func withoutDBus(s string) string {
	var keep []string
	for _, line := range strings.Split(s, "\n") {
		if !strings.Contains(line, "dbus") && !strings.Contains(line, "D-Bus") {
			keep = append(keep, line)
		}
	}
	return strings.Join(keep, "\n")
}

// jsString is s as a JavaScript string literal.
func jsString(s string) string {
	b, _ := json.Marshal(s)
	return string(b)
}

// tailBuffer keeps the last max bytes written to it; Chromium writes to it from its own goroutine.
type tailBuffer struct {
	mu  sync.Mutex
	buf bytes.Buffer
	max int
}

func (b *tailBuffer) Write(p []byte) (int, error) {
	b.mu.Lock()
	defer b.mu.Unlock()
	b.buf.Write(p)
	if extra := b.buf.Len() - b.max; extra > 0 {
		b.buf.Next(extra)
	}
	return len(p), nil
}

func (b *tailBuffer) String() string {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.buf.String()
}

// The styrene (M1) / methyl methacrylate (M2) pair for the bench-data test: r1 = 0.52, r2 = 0.46,
// from Polymer Handbook, 4th ed. (Wiley 1999), section II, the free-radical reactivity-ratio
// table compiled by R. Z. Greenley, the commonly quoted entry for bulk at 60 °C (values from
// memory).
const (
	benchR1 = 0.52
	benchR2 = 0.46
	// benchTol bounds |fitted − true| for each ratio. The simulated compositions are exact
	// Mayo–Lewis values rounded to three decimals, so the only error is that rounding (at most
	// 0.0005 in F1), which moves these estimates by about 0.001; 0.01 leaves room for the
	// optimiser's stopping rule (common practice, no source).
	benchTol = 0.01
)

// benchFeeds are the starting feeds f10 of the simulated runs: spread over the whole range,
// as a bench study would be.
var benchFeeds = []float64{0.10, 0.20, 0.35, 0.50, 0.65, 0.80, 0.90}

// mayoLewis is the instantaneous copolymer composition
//
//	F1 = (r1 f1² + f1 f2)/(r1 f1² + 2 f1 f2 + r2 f2²)
//
// (F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 66, 1594 (1944)).
func mayoLewis(r1, r2, f1 float64) float64 {
	f2 := 1 - f1
	return (r1*f1*f1 + f1*f2) / (r1*f1*f1 + 2*f1*f2 + r2*f2*f2)
}

// benchRow is one simulated sample as the test pastes it: label and the cell texts, written
// with a decimal comma as a spreadsheet in such a locale copies them.
type benchRow struct{ label, f10, F1 string }

func simulatedRuns() []benchRow {
	rows := make([]benchRow, len(benchFeeds))
	for i, f := range benchFeeds {
		comma := func(v float64, d int) string { return strings.Replace(strconv.FormatFloat(v, 'f', d, 64), ".", ",", 1) }
		rows[i] = benchRow{label: fmt.Sprintf("S-%d", i+1), f10: comma(f, 2), F1: comma(mayoLewis(benchR1, benchR2, f), 3)}
	}
	return rows
}

// TestBrowserBenchData uses the bench-data grid as a chemist would: it clears the demo runs,
// pastes a tab-separated block with decimal commas, waits for the estimate, checks the
// recommended r1 and r2 against the ratios the data were made from and that the joint
// confidence region is drawn, copies the ratios into step 1, reloads to see the grid and the
// ratios come back from IndexedDB, types r1 by hand to see the stored region dropped, and types
// a bad cell to see it marked and kept as typed.
func TestBrowserBenchData(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	// The demo's invented runs fill the grid once the estimation section is drawn.
	waitUntil(t, ctx, "the demo's runs in the bench grid", `
		const n = document.querySelectorAll("#bench-table tbody tr[data-row]").length;
		return n > 0 ? "" : "no rows in #bench-table";`, stepTimeout)
	w.check(t, "loading the page")

	click(t, ctx, "bench-clear")
	waitUntil(t, ctx, "an empty grid after Remove all rows", `
		const n = document.querySelectorAll("#bench-table tbody tr[data-row]").length;
		return n === 0 ? "" : n + " rows left";`, stepTimeout)
	setSelect(t, ctx, "bench-conversion-kind", "none")

	rows := simulatedRuns()
	lines := []string{"sample\tf10\tF1"}
	for _, r := range rows {
		lines = append(lines, r.label+"\t"+r.f10+"\t"+r.F1)
	}
	block := strings.Join(lines, "\n") + "\n"
	t.Logf("pasted block:\n%s", block)
	setInput(t, ctx, "bench-paste", block)
	click(t, ctx, "bench-paste-add")
	checkGrid(t, ctx, rows, "after pasting")
	// The converted column shows the feed as a mole fraction with a decimal point.
	for i, f := range benchFeeds {
		got := evalJS[string](t, ctx, fmt.Sprintf(`(document.querySelector('#bench-table tr[data-row="%d"] td[data-conv="f10"]') || {textContent: "(none)"}).textContent.trim()`, i))
		if v, err := strconv.ParseFloat(got, 64); err != nil || math.Abs(v-f) > 5e-5 {
			t.Errorf("row %d: converted f10 = %q, want %.4f (the pasted %q)", i+1, got, f, rows[i].f10)
		}
	}
	if v := evalJS[string](t, ctx, `document.getElementById("bench-paste").value`); v != "" {
		t.Errorf("#bench-paste still holds %q after the rows were added", v)
	}
	w.check(t, "pasting the runs")

	r1, r2 := checkRecommended(t, ctx, "after pasting")
	checkRegionPolygon(t, ctx)
	// The table gives the region's extent; the ratios the data were made from lie inside it.
	for _, c := range []struct {
		col  string
		want float64
	}{{"region1", benchR1}, {"region2", benchR2}} {
		text := evalJS[string](t, ctx, fmt.Sprintf(`document.querySelector('#fit-table tr[data-recommended] td[data-col=%q]').textContent`, c.col))
		lo, hi, ok := strings.Cut(strings.TrimSpace(text), "–")
		a, err1 := strconv.ParseFloat(lo, 64)
		b, err2 := strconv.ParseFloat(hi, 64)
		if !ok || err1 != nil || err2 != nil || !(a <= c.want && c.want <= b) {
			t.Errorf("#fit-table recommended %s = %q; want a range that holds %v", c.col, text, c.want)
		}
	}

	// Use these ratios: step 1 takes the recommended values and notes their origin.
	click(t, ctx, "fit-use")
	waitUntil(t, ctx, "#ratio-source to name the fit", `
		const s = document.getElementById("ratio-source").value;
		return /fitted to 7 runs/.test(s) && /JCR/.test(s) ? "" : "#ratio-source = " + JSON.stringify(s);`, stepTimeout)
	checkFieldNear(t, ctx, "r1", r1, 1e-3, "after Use these ratios")
	checkFieldNear(t, ctx, "r2", r2, 1e-3, "after Use these ratios")
	waitUntil(t, ctx, "#ratio-jcr to say a region is kept", `
		const e = document.getElementById("ratio-jcr");
		return e.checkVisibility() && /region/.test(e.textContent) ? "" : "#ratio-jcr: " + JSON.stringify(e.textContent);`, stepTimeout)
	waitStored(t, ctx, len(rows))
	w.check(t, "using the fitted ratios")

	// Reload: the grid, as typed, and the ratios with their region come back from IndexedDB.
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkGrid(t, ctx, rows, "after a reload")
	checkFieldNear(t, ctx, "r1", r1, 1e-3, "after a reload")
	checkFieldNear(t, ctx, "r2", r2, 1e-3, "after a reload")
	checkRecommended(t, ctx, "after a reload")
	checkRegionPolygon(t, ctx)
	waitUntil(t, ctx, "#ratio-jcr after a reload", `
		return document.getElementById("ratio-jcr").checkVisibility() ? "" : "#ratio-jcr is hidden";`, stepTimeout)
	checkNoFatalBanner(t, ctx)
	w.check(t, "reloading the page")

	// Ratios typed by hand are no longer the fitted ones: the stored region goes with them.
	setInput(t, ctx, "r1", "0.53")
	waitUntil(t, ctx, "#ratio-jcr to disappear after typing r1", `
		return document.getElementById("ratio-jcr").checkVisibility() ? "#ratio-jcr still shown" : "";`, stepTimeout)
	storedProject(t, ctx, "the stored project to drop its region after r1 was typed", `
		if (p.r1 !== 0.53) return "r1 = " + p.r1;
		return p.jcr === undefined || p.jcr === null || p.jcr.length === 0 ? "" : "jcr has " + p.jcr.length + " points";`)
	w.check(t, "typing r1 by hand")

	// A cell that is not a number is marked in its row, kept as typed, and does not stop the
	// other rows from being saved.
	const bad = "0,4x"
	setInput(t, ctx, "bench-r2-F1", bad)
	waitUntil(t, ctx, "the bad cell to be marked", `
		const c = document.getElementById("bench-r2-F1");
		if (c.getAttribute("aria-invalid") !== "true") return "aria-invalid=" + c.getAttribute("aria-invalid");
		const m = document.getElementById(c.getAttribute("aria-describedby") || "");
		if (!m || !m.checkVisibility()) return "no visible message for the cell";
		return m.textContent.includes("0,4x") ? "" : "message: " + JSON.stringify(m.textContent);`, stepTimeout)
	waitUntil(t, ctx, "the estimate from the six good runs", `
		const s = document.getElementById("fit-status").textContent;
		return /from 6 runs/.test(s) ? "" : "#fit-status: " + JSON.stringify(s);`, stepTimeout)
	waitStoredCell(t, ctx, 2, "F1", bad)
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	waitUntil(t, ctx, "the bad cell kept as typed after a reload", `
		const c = document.getElementById("bench-r2-F1");
		if (!c) return "no #bench-r2-F1";
		return c.value === "0,4x" && c.getAttribute("aria-invalid") === "true" ? "" : "value " + JSON.stringify(c.value) + ", aria-invalid " + c.getAttribute("aria-invalid");`, stepTimeout)
	checkNoFatalBanner(t, ctx)
	w.check(t, "typing a bad cell and reloading")
}

// click clicks the button (or other element) with the id.
func click(t *testing.T, ctx context.Context, id string) {
	t.Helper()
	problem := evalJS[string](t, ctx, fmt.Sprintf(`((id) => {
		const el = document.getElementById(id);
		if (!el) return "no #" + id;
		if (el.disabled) return "#" + id + " is disabled";
		if (!el.checkVisibility()) return "#" + id + " is hidden";
		el.click();
		return "";
	})(%s)`, jsString(id)))
	if problem != "" {
		t.Fatalf("clicking #%s: %s", id, problem)
	}
}

// setSelect chooses the option with the value in the select with the id, as a person does.
func setSelect(t *testing.T, ctx context.Context, id, value string) {
	t.Helper()
	problem := evalJS[string](t, ctx, fmt.Sprintf(`((id, v) => {
		const el = document.getElementById(id);
		if (!el) return "no #" + id;
		if (![...el.options].some(o => o.value === v)) return "#" + id + " has no option " + v;
		el.value = v;
		el.dispatchEvent(new Event("change", {bubbles: true}));
		return "";
	})(%s, %s)`, jsString(id), jsString(value)))
	if problem != "" {
		t.Fatalf("choosing %q in #%s: %s", value, id, problem)
	}
}

// checkGrid waits until the bench grid shows exactly rows, each cell holding the text as pasted
// (with its decimal comma), and no cell marked invalid.
func checkGrid(t *testing.T, ctx context.Context, rows []benchRow, when string) {
	t.Helper()
	want, _ := json.Marshal(func() [][3]string {
		out := make([][3]string, len(rows))
		for i, r := range rows {
			out[i] = [3]string{r.label, r.f10, r.F1}
		}
		return out
	}())
	waitUntil(t, ctx, "the bench grid to hold the pasted rows "+when, fmt.Sprintf(`
		const want = %s;
		const trs = [...document.querySelectorAll("#bench-table tbody tr[data-row]")];
		if (trs.length !== want.length) return trs.length + " rows, want " + want.length;
		for (let i = 0; i < want.length; i++) {
			const got = ["label", "f10", "F1"].map(k => (document.getElementById("bench-r" + i + "-" + k) || {value: "(no cell)"}).value);
			if (JSON.stringify(got) !== JSON.stringify(want[i])) return "row " + (i + 1) + ": " + JSON.stringify(got) + ", want " + JSON.stringify(want[i]);
		}
		const bad = document.querySelectorAll('#bench-table input[aria-invalid="true"]').length;
		return bad ? bad + " cells marked invalid" : "";`, want), stepTimeout)
}

// checkRecommended waits for the estimate and checks the recommended method's r1 and r2 against
// the ratios the simulated data were made from; it returns them as shown.
func checkRecommended(t *testing.T, ctx context.Context, when string) (r1, r2 float64) {
	t.Helper()
	waitUntil(t, ctx, "the recommended estimate in #fit-table "+when, `
		const tr = document.querySelector("#fit-table tr[data-recommended]");
		if (!tr || !tr.checkVisibility()) return "no visible recommended row; #fit-status: " + document.getElementById("fit-status").textContent;
		return /from 7 runs/.test(document.getElementById("fit-status").textContent) ? "" : "#fit-status: " + document.getElementById("fit-status").textContent;`, stepTimeout)
	got := evalJS[[3]string](t, ctx, `(() => {
		const tr = document.querySelector("#fit-table tr[data-recommended]");
		return [tr.dataset.method, tr.querySelector('[data-col="r1"]').textContent, tr.querySelector('[data-col="r2"]').textContent];
	})()`)
	if got[0] != "nonlinear" {
		t.Errorf("%s: the recommended method is %q; without uncertainties it must be nonlinear least squares", when, got[0])
	}
	var err1, err2 error
	r1, err1 = strconv.ParseFloat(strings.TrimSpace(got[1]), 64)
	r2, err2 = strconv.ParseFloat(strings.TrimSpace(got[2]), 64)
	if err1 != nil || err2 != nil || math.Abs(r1-benchR1) > benchTol || math.Abs(r2-benchR2) > benchTol {
		t.Errorf("%s: recommended r1 = %q, r2 = %q; want %v ± %v and %v ± %v", when, got[1], got[2], benchR1, benchTol, benchR2, benchTol)
	}
	t.Logf("%s: recommended (%s) r1 = %s, r2 = %s", when, got[0], got[1], got[2])
	return r1, r2
}

// checkRegionPolygon checks that the region plot holds the joint confidence region as a
// polygon of at least 8 distinct points, all inside the drawing.
func checkRegionPolygon(t *testing.T, ctx context.Context) {
	t.Helper()
	waitUntil(t, ctx, "the joint confidence region polygon in #fig-jcr", `
		const svg = document.querySelector("#fig-jcr svg");
		if (!svg) return "no svg in #fig-jcr";
		const poly = svg.querySelector('polygon[data-role="jcr"]');
		if (!poly) return "no region polygon";
		const [, , W, H] = svg.getAttribute("viewBox").split(/\s+/).map(Number);
		const pts = poly.getAttribute("points").trim().split(/\s+/).map(p => p.split(",").map(Number));
		const distinct = new Set(pts.map(p => p.join(","))).size;
		if (distinct < 8) return distinct + " distinct points";
		const out = pts.filter(([x, y]) => !(x >= 0 && x <= W && y >= 0 && y <= H));
		return out.length ? out.length + " points outside the drawing" : "";`, stepTimeout)
}

// checkFieldNear checks that the input with the id holds a number within tol of want.
func checkFieldNear(t *testing.T, ctx context.Context, id string, want, tol float64, when string) {
	t.Helper()
	got := evalJS[string](t, ctx, fmt.Sprintf(`(document.getElementById(%s) || {value: "(no such input)"}).value`, jsString(id)))
	v, err := strconv.ParseFloat(strings.TrimSpace(got), 64)
	if err != nil || math.Abs(v-want) > tol {
		t.Errorf("%s: #%s = %q, want %v ± %v", when, id, got, want, tol)
	}
}

// storedProject evaluates body with `p`, the project the page's module reads back from
// IndexedDB, until body returns ""; it fails the test after stepTimeout.
func storedProject(t *testing.T, ctx context.Context, what, body string) {
	t.Helper()
	deadline := time.Now().Add(stepTimeout)
	for {
		got, err := chromedp.Run(ctx, chromedp.Evaluate[string](`(async () => {
			const r = await window.copoly.loadProject({});
			if (!r || r.error) return "loadProject: " + JSON.stringify(r);
			const p = r.project;
			if (!p) return "nothing stored";
			try {`+body+`} catch (e) { return String(e); }
		})()`, chromedp.EvalAwaitPromise))
		if err != nil {
			t.Fatalf("reading the stored project: %v", err)
		}
		if got == "" {
			return
		}
		if time.Now().After(deadline) {
			t.Fatalf("waited %v for %s; the stored project: %s", stepTimeout, what, got)
		}
		run(t, ctx, "poll", chromedp.Sleep(pollInterval))
	}
}

// waitStored waits until the stored project holds n bench rows and a joint confidence region.
func waitStored(t *testing.T, ctx context.Context, n int) {
	t.Helper()
	storedProject(t, ctx, fmt.Sprintf("%d bench rows and a region to be saved", n), fmt.Sprintf(`
		const rows = p.bench && p.bench.rows ? p.bench.rows.length : 0;
		if (rows !== %d) return rows + " rows stored";
		return Array.isArray(p.jcr) && p.jcr.length >= 8 ? "" : "jcr: " + JSON.stringify(p.jcr);`, n))
}

// waitStoredCell waits until the stored bench row holds text in the cell key.
func waitStoredCell(t *testing.T, ctx context.Context, row int, key, text string) {
	t.Helper()
	storedProject(t, ctx, fmt.Sprintf("row %d, %s = %q to be saved", row+1, key, text), fmt.Sprintf(`
		const r = p.bench && p.bench.rows[%d];
		const v = r && r.cells ? r.cells[%s] : undefined;
		return v === %s ? "" : "cell: " + JSON.stringify(v);`, row, jsString(key), jsString(text)))
}
