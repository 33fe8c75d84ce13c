//go:build !js

package browsertest

import (
	"context"
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"maps"
	"net/http"
	"net/http/httptest"
	"net/url"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
)

// Text that would run script if the page ever treated it as HTML or put it into markup unescaped:
// an element with an error handler, an attribute break-out, and the end of a textarea followed by
// a script element.
var payloads = []string{
	`<img src=x onerror="window.__pwned=1">`,
	`"><svg onload=window.__pwned=1>`,
	`</textarea><script>window.__pwned=1</script>`,
}

// trapJS records what an injection would leave behind, and keeps the files the page saves: every
// element added later that could run or load something (img, script, iframe, object, embed, an
// svg with onload) or carries an on… attribute goes to window.__bad; every Blob the page turns
// into a download link goes to window.__saved, and the download itself is cancelled.
const trapJS = `(() => {
	window.__bad = [];
	window.__saved = [];
	const real = URL.createObjectURL.bind(URL);
	URL.createObjectURL = (blob) => { window.__saved.push(blob); return real(blob); };
	document.addEventListener("click", (e) => {
		const a = e.target instanceof Element && e.target.closest("a[download]");
		if (a) e.preventDefault();
	}, true);
	const judge = (el) => {
		if (!(el instanceof Element)) return;
		for (const e of [el, ...el.querySelectorAll("*")]) {
			const on = [...e.attributes].map((a) => a.name).filter((n) => n.startsWith("on"));
			if (["IMG", "SCRIPT", "IFRAME", "OBJECT", "EMBED"].includes(e.tagName.toUpperCase()) || on.length)
				window.__bad.push(e.tagName + " " + on.join(" ") + " " + e.outerHTML.slice(0, 80));
		}
	};
	new MutationObserver((list) => {
		for (const m of list) {
			if (m.type === "attributes") judge(m.target);
			for (const n of m.addedNodes) judge(n);
		}
	}).observe(document.documentElement, { subtree: true, childList: true, attributes: true });
	return true;
})()`

// checkInert fails the test if an injection ran or left an element behind.
func checkInert(t *testing.T, ctx context.Context, when string) {
	t.Helper()
	got := evalJS[[]string](t, ctx, `(() => {
		const out = [];
		if (window.__pwned !== undefined) out.push("window.__pwned = " + String(window.__pwned));
		out.push(...window.__bad.splice(0));
		for (const e of document.querySelectorAll("*")) {
			const on = [...e.attributes].filter((a) => a.name.startsWith("on"));
			if (on.length) out.push(e.tagName + " has " + on.map((a) => a.name).join(", "));
		}
		if (document.querySelectorAll("img, iframe, object, embed").length) out.push(document.querySelectorAll("img, iframe, object, embed").length + " img/iframe/object/embed elements");
		return out;
	})()`)
	for _, p := range got {
		t.Errorf("%s: %s", when, p)
	}
}

// TestBrowserUserTextIsText types script-bearing text into every free-text field of the page
// (project name, monomer names, the ratios' source, notes, sample labels, a pasted table, a table
// file, the own-monomer form, and, to see the echo in error messages, number fields), exports the
// project and imports it back from a file whose name is itself such text. Nothing may run, no
// element may be made from the text, and the text must come back literally: on screen, in the
// saved CSV and SVG files and in the project file.
func TestBrowserUserTextIsText(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	waitAllDrawn(t, ctx)
	evalJS[bool](t, ctx, trapJS)
	w.check(t, "loading the page")

	// Typed into the fields of step 1 and the sample labels of step 5.
	typed := map[string]string{
		"project-name": payloads[0], "name1": payloads[0], "name2": payloads[1], "ratio-source": payloads[1],
		"notes": payloads[2] + "\n" + payloads[0], "bench-r0-label": payloads[0], "bench-r1-label": payloads[1], "bench-r2-label": payloads[2],
	}
	for _, id := range slices.Sorted(maps.Keys(typed)) {
		setInput(t, ctx, id, typed[id])
	}
	waitUntil(t, ctx, "the names in the plots and the plan", fmt.Sprintf(`
		const want = [%s, %s];
		const title = (document.querySelector("#fig-composition svg") || {getAttribute: () => ""}).getAttribute("aria-label") || "";
		if (!want.every((p) => title.includes(p))) return "#fig-composition: " + JSON.stringify(title);
		const recipe = document.querySelector("#plan-recipe tbody").textContent;
		return want.every((p) => recipe.includes(p)) ? "" : "#plan-recipe: " + JSON.stringify(recipe);`, jsString(payloads[0]), jsString(payloads[1])), stepTimeout)
	checkInert(t, ctx, "after typing into the fields of steps 1 and 5")
	checkLiteral(t, ctx, "after typing", map[string]string{
		"#project-name-print": payloads[0], "#ratio-source-print": payloads[1],
	}, map[string][]string{
		"#fig-composition svg": {payloads[0], payloads[1]}, "#plan-recipe tbody": {payloads[0], payloads[1]},
		"#md-1": {payloads[0]}, "#md-2": {payloads[1]}, "#fig-runs svg": {payloads[0]},
	})
	for id, want := range typed {
		if got := evalJS[string](t, ctx, fmt.Sprintf(`document.getElementById(%s).value`, jsString(id))); got != want {
			t.Errorf("#%s holds %q, want %q as typed", id, got, want)
		}
	}

	// A pasted block with the label quoted as a spreadsheet quotes it, and one with the text in a
	// number cell, which is kept as typed and marked with a message that quotes it (the text without quotation
	// marks: a cell that opens with one is read as quoted, and one inside an unquoted cell is a
	// quoting error, whose message gives the line and column instead).
	quoted := `"` + strings.ReplaceAll(payloads[0], `"`, `""`) + `"`
	setInput(t, ctx, "bench-paste", "label\tf10\tF1\n"+quoted+"\t0,45\t0,5\n")
	click(t, ctx, "bench-paste-add")
	waitUntil(t, ctx, "the pasted row", fmt.Sprintf(`
		const labels = [...document.querySelectorAll("#bench-table input[data-key=label]")].map((i) => i.value);
		return labels.at(-1) === %s ? "" : "last label " + JSON.stringify(labels.at(-1)) + "; #bench-paste-error: " + document.getElementById("bench-paste-error").textContent;`, jsString(payloads[0])), stepTimeout)
	setInput(t, ctx, "bench-paste", "f10\tF1\n"+payloads[2]+"\t0,5\n")
	click(t, ctx, "bench-paste-add")
	waitUntil(t, ctx, "the pasted bad cell kept and its message quoting it", fmt.Sprintf(`
		const p = %s;
		const cell = [...document.querySelectorAll("#bench-table input[data-key=f10]")].at(-1);
		if (!cell || cell.value !== p) return "last f10 cell: " + JSON.stringify(cell && cell.value);
		const msg = document.getElementById(cell.getAttribute("aria-describedby") || "");
		// The message shortens a long value with "…": its first 30 characters must be there as typed.
		return msg && msg.checkVisibility() && msg.textContent.includes(p.slice(0, 30)) ? "" : "message: " + JSON.stringify(msg && msg.textContent);`, jsString(payloads[2])), stepTimeout)
	setInput(t, ctx, "bench-paste", "")

	// Text in number fields: r1 (then put back), a time–conversion table, a triad table.
	r1 := evalJS[string](t, ctx, `document.getElementById("r1").value`)
	setInput(t, ctx, "r1", payloads[1])
	waitErrorQuotes(t, ctx, "r1-error", payloads[1])
	setInput(t, ctx, "r1", r1)
	setSelect(t, ctx, "plan-rate", "table")
	setInput(t, ctx, "plan-table", "0\t0\n"+payloads[0]+"\t0,5\n")
	waitErrorQuotes(t, ctx, "plan-table-error", payloads[0])
	setSelect(t, ctx, "plan-rate", "k")
	setInput(t, ctx, "triad-paste", "f10\tF1\tA111\tA112\tA212\n"+payloads[2]+"\t0,4\t0,1\t0,3\t0,6\n")
	click(t, ctx, "triad-paste-add")
	waitErrorQuotes(t, ctx, "triad-paste-error", payloads[2])
	setInput(t, ctx, "triad-paste", "")

	// A monomer of one's own with the text in its name, hazards and note.
	evalJS[bool](t, ctx, `document.getElementById("own-box").open = true`)
	setInput(t, ctx, "um-name", payloads[0])
	setInput(t, ctx, "um-mass", "100")
	setInput(t, ctx, "um-hazards-other", payloads[1])
	setInput(t, ctx, "um-note", payloads[2])
	click(t, ctx, "um-save")
	waitUntil(t, ctx, "the own monomer in the list and the pickers", fmt.Sprintf(`
		const p = %s;
		if (!document.getElementById("own-list").textContent.includes(p)) return "#own-list: " + JSON.stringify(document.getElementById("own-list").textContent) + "; #um-status: " + document.getElementById("um-status").textContent;
		return [...document.getElementById("pick1").options].some((o) => o.textContent.includes(p)) ? "" : "not offered in #pick1";`, jsString(payloads[0])), stepTimeout)

	// A table file whose name and labels carry the text.
	dir := t.TempDir()
	csvPath := filepath.Join(dir, payloads[0]+".csv")
	if err := os.WriteFile(csvPath, []byte("label,f10,F1\r\n"+`"`+strings.ReplaceAll(payloads[1], `"`, `""`)+`",0.55,0.6`+"\r\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	run(t, ctx, "choose the table file", chromedp.SetUploadFiles(chromedp.ID("bench-import"), []string{csvPath}))
	waitUntil(t, ctx, "the row read from the file", fmt.Sprintf(`
		const labels = [...document.querySelectorAll("#bench-table input[data-key=label]")].map((i) => i.value);
		const err = document.getElementById("bench-error");
		return labels.at(-1) === %s ? "" : "last label " + JSON.stringify(labels.at(-1)) + (err.hidden ? "" : "; #bench-error: " + err.textContent);`, jsString(payloads[1])), stepTimeout)
	checkInert(t, ctx, "after the paste boxes, the number fields, the own monomer and the table file")
	w.check(t, "typing, pasting and reading the text")

	// Saved files: the bench table and the fit's data as CSV, the composition plot as SVG, the
	// project as JSON.
	benchCSV := savedFile(t, ctx, "#bench-export")
	checkCSVHas(t, "the saved bench table", benchCSV, payloads...)
	checkCSVHas(t, "the saved data of #fig-fit-data", savedFile(t, ctx, "#fig-fit-data .plot-actions button:last-child"), payloads...)
	checkSVG(t, "the saved #fig-composition", savedFile(t, ctx, "#fig-composition .plot-actions button:first-child"), payloads[0], payloads[1])
	projectJSON := savedFile(t, ctx, "#export-project")
	var exported struct {
		Name     string `json:"name"`
		Monomer1 struct {
			Name string `json:"name"`
		} `json:"monomer1"`
		Notes string `json:"notes"`
	}
	if err := json.Unmarshal([]byte(projectJSON), &exported); err != nil {
		t.Fatalf("the exported project is not JSON: %v", err)
	}
	if exported.Name != payloads[0] || exported.Monomer1.Name != payloads[0] || exported.Notes != typed["notes"] {
		t.Errorf("the exported project has name %q, monomer1 %q, notes %q; want the text as typed", exported.Name, exported.Monomer1.Name, exported.Notes)
	}
	checkInert(t, ctx, "after saving the files")

	// Back to the demo, then the exported project imported from a file named with the text.
	click(t, ctx, "start-demo")
	waitUntil(t, ctx, "the demo back", fmt.Sprintf(`return document.getElementById("name1").value !== %s ? "" : "name1 still holds the text";`, jsString(payloads[0])), stepTimeout)
	projPath := filepath.Join(dir, payloads[0]+".json")
	if err := os.WriteFile(projPath, []byte(projectJSON), 0o644); err != nil {
		t.Fatal(err)
	}
	run(t, ctx, "choose the project file", chromedp.SetUploadFiles(chromedp.ID("import-file"), []string{projPath}))
	waitUntil(t, ctx, "the import", fmt.Sprintf(`
		const u = document.getElementById("undo-text").textContent, e = document.getElementById("import-error");
		if (!e.hidden) return "#import-error: " + e.textContent;
		return u.includes("Imported " + %s) ? "" : "#undo-text: " + JSON.stringify(u);`, jsString(filepath.Base(projPath))), stepTimeout)
	waitAllDrawn(t, ctx)
	checkLiteral(t, ctx, "after the import", map[string]string{
		"#project-name-print": payloads[0], "#ratio-source-print": payloads[1],
	}, map[string][]string{
		"#fig-composition svg": {payloads[0], payloads[1]}, "#plan-recipe tbody": {payloads[0], payloads[1]},
		"#undo-text": {filepath.Base(projPath)}, "#own-list": {payloads[0]},
	})
	for id, want := range typed {
		if got := evalJS[string](t, ctx, fmt.Sprintf(`document.getElementById(%s).value`, jsString(id))); got != want {
			t.Errorf("after the import, #%s holds %q, want %q", id, got, want)
		}
	}
	checkInert(t, ctx, "after the import")
	w.check(t, "exporting and importing the project")
}

// checkLiteral checks that the text of each element in exact equals its string, and that the
// text (or, for an svg, the text and aria-label) of each element in contains holds every string.
func checkLiteral(t *testing.T, ctx context.Context, when string, exact map[string]string, contains map[string][]string) {
	t.Helper()
	for sel, want := range exact {
		got := evalJS[string](t, ctx, fmt.Sprintf(`(document.querySelector(%s) || {textContent: "(missing)"}).textContent`, jsString(sel)))
		if got != want {
			t.Errorf("%s: %s shows %q, want %q literally", when, sel, got, want)
		}
	}
	for sel, wants := range contains {
		got := evalJS[string](t, ctx, fmt.Sprintf(`(() => {
			const el = document.querySelector(%s);
			if (!el) return "(missing)";
			return (el.getAttribute("aria-label") || "") + "\n" + el.textContent;
		})()`, jsString(sel)))
		for _, want := range wants {
			if !strings.Contains(got, want) {
				t.Errorf("%s: %s does not show %q literally; it shows %q", when, sel, want, got)
			}
		}
	}
}

// waitErrorQuotes waits until the error box with the id is shown and quotes text literally.
func waitErrorQuotes(t *testing.T, ctx context.Context, id, text string) {
	t.Helper()
	waitUntil(t, ctx, fmt.Sprintf("#%s to quote the text", id), fmt.Sprintf(`
		const e = document.getElementById(%s);
		if (!e || !e.checkVisibility()) return "not shown";
		return e.textContent.includes(%s) ? "" : JSON.stringify(e.textContent);`, jsString(id), jsString(text)), stepTimeout)
}

// savedFile clicks the control (a CSS selector) and returns the text of the file it saves.
func savedFile(t *testing.T, ctx context.Context, sel string) string {
	t.Helper()
	got, err := chromedp.Run(ctx, chromedp.Evaluate[[2]string](fmt.Sprintf(`(async () => {
		const b = document.querySelector(%s);
		if (!b) return ["", "no " + %[1]s];
		const n = window.__saved.length;
		b.click();
		for (let i = 0; i < 100 && window.__saved.length === n; i++) await new Promise((r) => setTimeout(r, 20));
		if (window.__saved.length === n) return ["", "nothing was saved"];
		return [await window.__saved.at(-1).text(), ""];
	})()`, jsString(sel)), chromedp.EvalAwaitPromise))
	if err != nil {
		t.Fatalf("saving with %s: %v", sel, err)
	}
	if got[1] != "" {
		t.Fatalf("saving with %s: %s", sel, got[1])
	}
	return got[0]
}

// checkCSVHas reads text with encoding/csv and checks that each string is one of its fields.
func checkCSVHas(t *testing.T, what, text string, want ...string) {
	t.Helper()
	records, err := csv.NewReader(strings.NewReader(text)).ReadAll()
	if err != nil {
		t.Errorf("%s is not CSV: %v\n%s", what, err, text)
		return
	}
	fields := map[string]bool{}
	for _, r := range records {
		for _, f := range r {
			fields[f] = true
		}
	}
	for _, w := range want {
		if !fields[w] {
			t.Errorf("%s has no field %q:\n%s", what, w, text)
		}
	}
}

// checkSVG parses text with encoding/xml: it must hold no element that runs or loads anything and
// no on… attribute, and the strings must appear literally in its text or attributes.
func checkSVG(t *testing.T, what, text string, want ...string) {
	t.Helper()
	d := xml.NewDecoder(strings.NewReader(text))
	var all strings.Builder
	elements := 0
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Errorf("%s is not XML: %v", what, err)
			return
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			elements++
			switch strings.ToLower(tok.Name.Local) {
			case "img", "script", "foreignobject", "iframe", "image", "use", "a":
				t.Errorf("%s holds a <%s> element", what, tok.Name.Local)
			}
			for _, a := range tok.Attr {
				if strings.HasPrefix(strings.ToLower(a.Name.Local), "on") {
					t.Errorf("%s: <%s> has the attribute %s=%q", what, tok.Name.Local, a.Name.Local, a.Value)
				}
				all.WriteString(a.Value + "\n")
			}
		case xml.CharData:
			all.Write(tok)
		}
	}
	if elements < 20 {
		t.Errorf("%s has only %d elements; it is not the plot", what, elements)
	}
	for _, w := range want {
		if !strings.Contains(all.String(), w) {
			t.Errorf("%s does not hold %q literally", what, w)
		}
	}
}

// drain returns the problems w has seen since its last check or drain, and marks them seen: for
// a step that provokes some on purpose and judges them itself.
func (w *watcher) drain() []string {
	w.mu.Lock()
	defer w.mu.Unlock()
	fresh := slices.Clone(w.problems[w.reported:])
	w.reported = len(w.problems)
	return fresh
}

// TestBrowserContentSecurityPolicy checks that the page's Content-Security-Policy refuses code
// made from strings (eval, new Function, a string timer, an inline on… attribute, an inline script
// added later) while the module runs under 'wasm-unsafe-eval', and that nothing leaves the page:
// with a local HTTP server counting every hit, the page tries fetch, XMLHttpRequest, an image, a
// beacon, a WebSocket, an event stream, a CSS url() in a style attribute and through the CSSOM, a
// stylesheet, a script, a frame, a worker, a dynamic import and a form submission towards it. The
// server must see nothing, each attempt must be refused by the policy, and the browser's network
// events must show the page's own file and nothing else that was sent. The refusals the test
// provokes are the only console errors allowed, and only while it provokes them.
func TestBrowserContentSecurityPolicy(t *testing.T) {
	html := pagePath(t)
	chromium := findChromium(t)
	pageURL := (&url.URL{Scheme: "file", Path: html}).String()

	var hits atomic.Int64
	var hitMu sync.Mutex
	var hitPaths []string
	srv := httptest.NewServer(http.HandlerFunc(func(rw http.ResponseWriter, r *http.Request) {
		hits.Add(1)
		hitMu.Lock()
		hitPaths = append(hitPaths, r.Method+" "+r.URL.Path)
		hitMu.Unlock()
		rw.Header().Set("Access-Control-Allow-Origin", "*")
		fmt.Fprint(rw, "leaked")
	}))
	defer srv.Close()

	w := &watcher{pageURL: pageURL}
	ctx, stop := startBrowser(t, chromium, w)
	defer stop()
	defer screenshot(t, ctx)

	// Every request the browser reports, and how each one failed, from before the navigation.
	var netMu sync.Mutex
	sent := map[network.RequestID]string{}
	failed := map[network.RequestID]network.BlockedReason{}
	var order []network.RequestID
	run(t, ctx, "listen to the network", chromedp.Func(func(_ context.Context, tg *chromedp.Target) error {
		go func() {
			for ev, err := range cdp.Events(ctx, tg, network.RequestWillBeSent) {
				if err != nil {
					return
				}
				netMu.Lock()
				if _, seen := sent[ev.RequestID]; !seen {
					order = append(order, ev.RequestID)
				}
				sent[ev.RequestID] = ev.Request.URL
				netMu.Unlock()
			}
		}()
		go func() {
			for ev, err := range cdp.Events(ctx, tg, network.LoadingFailed) {
				if err != nil {
					return
				}
				netMu.Lock()
				failed[ev.RequestID] = ev.BlockedReason
				netMu.Unlock()
			}
		}()
		return nil
	}))

	run(t, ctx, "navigate to "+pageURL, chromedp.Navigate(pageURL))
	waitReady(t, ctx)
	w.check(t, "loading the page")

	// Code from strings.
	type evalResult struct {
		Eval, Function string
		Ran            []string
		Violations     []string
	}
	res, err := chromedp.Run(ctx, chromedp.Evaluate[evalResult](`(async () => {
		window.__violations = [];
		document.addEventListener("securitypolicyviolation", (e) => window.__violations.push(e.effectiveDirective + " " + e.blockedURI));
		window.__ran = [];
		const out = {};
		try { eval("window.__ran.push('eval')"); out.Eval = "ran"; } catch (e) { out.Eval = e.name; }
		try { new Function("window.__ran.push('new Function')")(); out.Function = "ran"; } catch (e) { out.Function = e.name; }
		setTimeout("window.__ran.push('a string timer')", 0);
		const b = document.createElement("button");
		b.setAttribute("onclick", "window.__ran.push('an onclick attribute')");
		document.body.append(b);
		b.click();
		b.remove();
		const s = document.createElement("script");
		s.textContent = "window.__ran.push('an inline script')";
		document.body.append(s);
		s.remove();
		await new Promise((r) => setTimeout(r, 300));
		out.Ran = window.__ran;
		out.Violations = window.__violations;
		return out;
	})()`, chromedp.EvalAwaitPromise, func(p *runtime.EvaluateParams) {
		// DevTools lets its own evaluations use eval unless told otherwise; a page's script gets no
		// such leave.
		p.AllowUnsafeEvalBlockedByCSP = new(false)
	}))
	if err != nil {
		t.Fatalf("trying code from strings: %v", err)
	}
	t.Logf("code from strings: eval → %s, new Function → %s; violations: %q", res.Eval, res.Function, res.Violations)
	if res.Eval != "EvalError" || res.Function != "EvalError" {
		t.Errorf("eval gave %q and new Function %q; want both refused with an EvalError", res.Eval, res.Function)
	}
	if len(res.Ran) > 0 {
		t.Errorf("code made from strings ran: %q", res.Ran)
	}
	for _, d := range []string{"script-src", "script-src-attr", "script-src-elem"} {
		if !slices.ContainsFunc(res.Violations, func(v string) bool { return strings.HasPrefix(v, d+" ") }) {
			t.Errorf("no securitypolicyviolation for %s; the page saw %q", d, res.Violations)
		}
	}
	checkNoFatalBanner(t, ctx)
	expectRefusals(t, w, "trying code from strings")

	// Requests towards the local server, each to its own path.
	// Each attempt's refusal names its URL, except a frame's (the origin only) and a style
	// attribute's (the attribute itself is refused, "inline").
	attempts := []struct{ path, directive, js string }{
		{"/fetch", "connect-src", `fetch(U("/fetch")).catch(() => {})`},
		{"/xhr", "connect-src", `try { const x = new XMLHttpRequest(); x.open("GET", U("/xhr")); x.send(); } catch (e) {}`},
		{"/image", "img-src", `new Image().src = U("/image")`},
		{"/beacon", "connect-src", `try { navigator.sendBeacon(U("/beacon"), "x"); } catch (e) {}`},
		{"/socket", "connect-src", `try { new WebSocket(U("/socket").replace(/^http/, "ws")); } catch (e) {}`},
		{"/events", "connect-src", `try { new EventSource(U("/events")); } catch (e) {}`},
		{"/style-attr", "style-src-attr", `{ const d = document.createElement("div"); d.setAttribute("style", "background-image: url(" + U("/style-attr") + ")"); document.body.append(d); getComputedStyle(d).backgroundImage; }`},
		{"/cssom", "img-src", `{ const d = document.createElement("div"); d.style.backgroundImage = "url(" + U("/cssom") + ")"; d.textContent = "x"; document.body.append(d); getComputedStyle(d).backgroundImage; }`},
		{"/stylesheet", "style-src-elem", `{ const l = document.createElement("link"); l.rel = "stylesheet"; l.href = U("/stylesheet"); document.head.append(l); }`},
		{"/script", "script-src-elem", `{ const s = document.createElement("script"); s.src = U("/script"); document.head.append(s); }`},
		{"/frame", "frame-src", `{ const f = document.createElement("iframe"); f.src = U("/frame"); document.body.append(f); }`},
		{"/worker", "", `try { new Worker(U("/worker")); } catch (e) {}`},
		{"/import", "script-src-elem", `import(U("/import")).catch(() => {})`},
		{"/form", "form-action", `{ const f = document.createElement("form"); f.method = "post"; f.action = U("/form"); const i = document.createElement("input"); i.name = "x"; i.value = "y"; f.append(i); document.body.append(f); f.submit(); }`},
	}
	var js strings.Builder
	fmt.Fprintf(&js, "(async () => {\n\tconst U = (p) => %s + p;\n\twindow.__violations = [];\n", jsString(srv.URL))
	for _, a := range attempts {
		fmt.Fprintf(&js, "\ttry { %s; } catch (e) {}\n", a.js)
	}
	js.WriteString("\tawait new Promise((r) => setTimeout(r, 1500));\n\treturn window.__violations;\n})()")
	violations, err := chromedp.Run(ctx, chromedp.Evaluate[[]string](js.String(), chromedp.EvalAwaitPromise))
	if err != nil {
		t.Fatalf("trying the requests: %v", err)
	}
	run(t, ctx, "let late requests arrive", chromedp.Sleep(500*time.Millisecond))
	t.Logf("violations reported to the page: %q", violations)
	if n := hits.Load(); n != 0 {
		hitMu.Lock()
		t.Errorf("the local server was reached %d times: %q", n, hitPaths)
		hitMu.Unlock()
	}
	for _, a := range attempts {
		if a.directive == "" {
			continue // a worker from another origin is refused before the policy is asked
		}
		blocked := srv.URL + a.path
		switch a.directive {
		case "frame-src":
			blocked = srv.URL
		case "style-src-attr":
			blocked = "inline"
		case "connect-src":
			if a.path == "/socket" {
				blocked = "ws" + strings.TrimPrefix(srv.URL, "http") + a.path
			}
		}
		if !slices.Contains(violations, a.directive+" "+blocked) {
			t.Errorf("%s: no securitypolicyviolation for %s", a.path, a.directive)
		}
	}
	if u := evalJS[string](t, ctx, `location.href`); u != pageURL {
		t.Errorf("the page navigated away to %s", u)
	}
	checkNoFatalBanner(t, ctx)
	expectRefusals(t, w, "trying the requests", srv.URL)

	// The browser's own account: the page's file was loaded, and any other request it reports
	// was blocked by the policy before it was sent.
	netMu.Lock()
	defer netMu.Unlock()
	ownLoad := false
	for _, id := range order {
		u := sent[id]
		switch {
		case strings.SplitN(u, "#", 2)[0] == pageURL:
			ownLoad = true
		case strings.HasPrefix(u, "data:"), strings.HasPrefix(u, "blob:"):
		case failed[id] == network.BlockedReasonCsp:
			t.Logf("reported and blocked by the policy: %s", u)
		default:
			t.Errorf("the browser reports a request that the policy did not block: %s (failed: %q)", u, failed[id])
		}
	}
	if !ownLoad {
		t.Errorf("the network events do not show the page's own load of %s; they show %d requests", pageURL, len(order))
	}
}

// expectRefusals drains the problems w saw while the test provoked refusals and fails the test
// for each that is not a Content-Security-Policy refusal (or, when server is given, a request to
// server, which the network events and the server's count then judge).
func expectRefusals(t *testing.T, w *watcher, during string, server ...string) {
	t.Helper()
	time.Sleep(200 * time.Millisecond) // log events arrive after the page's answer
	n := 0
	for _, p := range w.drain() {
		switch {
		case strings.Contains(p, "Content Security Policy"):
			n++
		case len(server) > 0 && strings.HasPrefix(p, "network request:") && strings.Contains(p, server[0]):
		default:
			t.Errorf("while %s, the page did what it must never do: %s", during, p)
		}
	}
	t.Logf("while %s: %d refusals reported in the console", during, n)
}
