//go:build !js

package browsertest

import (
	"context"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// The storage tests break the page's browser storage on purpose (no IndexedDB, a full disk, a
// damaged stored file, two tabs saving the same project, a reload in the middle of typing) and
// check that the page says so in plain words, keeps working, and loses nothing.

// The styrene/acrylonitrile pair of TestBrowserOfflinePage (Polymer Handbook, 4th ed., Greenley
// table: r1 = 0.40, r2 = 0.04) and one more r1 for the edits below. The azeotropic feeds are
// f1 = (1 − r2)/(2 − r1 − r2) (Mayo–Lewis 1944), printed to three decimals by the page:
// 0.96/1.51 = 0.63576… for r1 = 0.45.
const (
	otherR1        = 0.45
	otherAzeotrope = "0.636"
)

// The demo's ratios, r1 = 0.80 and r2 = 0.15 (copoly/project Demo: the Polymer Handbook value
// for styrene/n-butyl acrylate).
const (
	demoR1 = 0.80
	demoR2 = 0.15
)

// addScript makes the tab of ctx run src in every new document before the page's own scripts.
func addScript(t *testing.T, ctx context.Context, src string) {
	t.Helper()
	if _, err := chromedp.Call(ctx, page.AddScriptToEvaluateOnNewDocument, page.AddScriptToEvaluateOnNewDocumentParams{Source: src}); err != nil {
		t.Fatalf("adding a script to new documents: %v", err)
	}
}

// waitStatus waits until #storage-status matches the regular expression re (case ignored).
func waitStatus(t *testing.T, ctx context.Context, what, re string) {
	t.Helper()
	waitUntil(t, ctx, "#storage-status to say "+what, fmt.Sprintf(`
		const text = document.getElementById("storage-status").textContent.trim();
		return new RegExp(%s, "i").test(text) ? "" : "#storage-status: " + JSON.stringify(text);`, jsString(re)), stepTimeout)
}

// waitSaved waits until #storage-status says the project is saved, and nothing else.
func waitSaved(t *testing.T, ctx context.Context) {
	t.Helper()
	waitStatus(t, ctx, "Saved", `^Saved \d\d:\d\d:\d\d$`)
}

// waitShown waits until the element with the id is visible and its text contains each of parts.
func waitShown(t *testing.T, ctx context.Context, id string, parts ...string) {
	t.Helper()
	list := jsonList(parts)
	waitUntil(t, ctx, fmt.Sprintf("#%s to show %q", id, parts), fmt.Sprintf(`
		const el = document.getElementById(%s);
		if (!el) return "no #" + %[1]s;
		if (!el.checkVisibility()) return "#" + %[1]s + " is hidden";
		const text = el.textContent.replace(/\s+/g, " ").trim();
		const missing = %s.filter(p => !text.includes(p));
		return missing.length ? "#" + %[1]s + ": " + JSON.stringify(text) : "";`, jsString(id), list), stepTimeout)
}

// jsonList is parts as a JavaScript array literal.
func jsonList(parts []string) string {
	q := make([]string, len(parts))
	for i, p := range parts {
		q[i] = jsString(p)
	}
	return "[" + strings.Join(q, ",") + "]"
}

// checkHidden fails the test if the element with the id is visible.
func checkHidden(t *testing.T, ctx context.Context, id, when string) {
	t.Helper()
	if evalJS[bool](t, ctx, fmt.Sprintf(`(() => { const e = document.getElementById(%s); return !!e && e.checkVisibility(); })()`, jsString(id))) {
		t.Errorf("%s: #%s is shown", when, id)
	}
}

// fieldText returns the text in the input with the id.
func fieldText(t *testing.T, ctx context.Context, id string) string {
	t.Helper()
	return evalJS[string](t, ctx, fmt.Sprintf(`(document.getElementById(%s) || {value: "(no such input)"}).value`, jsString(id)))
}

// storedRatios returns r1 and r2 of the project stored in the browser, read through the page's
// module, as "r1/r2", or what was found instead.
func storedRatios(t *testing.T, ctx context.Context) string {
	t.Helper()
	return evalAsync[string](t, ctx, `(async () => {
		const r = await window.copoly.loadProject({});
		if (!r || r.error) return "loadProject: " + JSON.stringify(r);
		return r.project ? r.project.r1 + "/" + r.project.r2 : "nothing stored";
	})()`)
}

// evalAsync evaluates a JavaScript expression whose value is a Promise, and decodes what it
// resolves to into T.
func evalAsync[T any](t *testing.T, ctx context.Context, expr string) T {
	t.Helper()
	return run(t, ctx, "evaluating "+strings.Join(strings.Fields(expr), " "), chromedp.Evaluate[T](expr, chromedp.EvalAwaitPromise))
}

// waitNoKept waits until the module lists no kept copy (the page drops a conflict copy once the
// user has chosen).
func waitNoKept(t *testing.T, ctx context.Context) {
	t.Helper()
	deadline := time.Now().Add(stepTimeout)
	for {
		got := keptCopies(t, ctx)
		if len(got) == 0 {
			return
		}
		if time.Now().After(deadline) {
			t.Fatalf("waited %v for the kept copies to go; still kept: %q", stepTimeout, got)
		}
		run(t, ctx, "poll", chromedp.Sleep(pollInterval))
	}
}

func ratios(r1, r2 float64) string {
	return strconv.FormatFloat(r1, 'f', -1, 64) + "/" + strconv.FormatFloat(r2, 'f', -1, 64)
}

// TestBrowserStorageUnavailable opens the page where IndexedDB cannot be used, in three ways a
// browser can refuse it, and checks that the page says so, computes as usual and never fails.
func TestBrowserStorageUnavailable(t *testing.T) {
	variants := []struct {
		name, script string
	}{
		{"indexedDB throws", `Object.defineProperty(window, "indexedDB", {configurable: true,
			get() { throw new DOMException("The user denied permission to access the database.", "SecurityError"); }});`},
		{"no indexedDB", `Object.defineProperty(window, "indexedDB", {configurable: true, value: undefined});`},
		{"open throws", `IDBFactory.prototype.open = function () {
			throw new DOMException("Storage is disabled in this window.", "InvalidStateError"); };`},
	}
	for _, v := range variants {
		t.Run(v.name, func(t *testing.T) {
			ctx, w, _ := openPage(t, v.script)
			waitStatus(t, ctx, "storage is unavailable", `unavailable.*export`)
			w.check(t, "loading the page")

			// The page keeps working: the results follow the typing, and nothing breaks.
			setInput(t, ctx, "r1", "0.40")
			setInput(t, ctx, "r2", "0.04")
			waitText(t, ctx, "out-azeotrope", wantAzeotrope)
			waitStatus(t, ctx, "storage is still unavailable", `unavailable`)
			checkNoFatalBanner(t, ctx)
			run(t, ctx, "let the saves and drafts run", chromedp.Sleep(saveSettle))
			checkNoFatalBanner(t, ctx)
			w.check(t, "typing without storage")

			// Text typed just before a reload still comes back (from the tab's own copy).
			setInput(t, ctx, "r2", "0.0x")
			run(t, ctx, "reload at once", chromedp.Reload())
			waitReady(t, ctx)
			if got := fieldText(t, ctx, "r2"); got != "0.0x" {
				t.Errorf("without storage, after typing and reloading at once #r2 = %q, want 0.0x", got)
			}
			waitStatus(t, ctx, "storage is unavailable after the reload", `unavailable`)
			w.check(t, "reloading without storage")
		})
	}
}

// failWrites makes IndexedDB refuse every put, as a full disk does, while
// window.copolyTestFull is true.
const failWrites = `(() => {
	const put = IDBObjectStore.prototype.put;
	IDBObjectStore.prototype.put = function (...args) {
		if (window.copolyTestFull) throw new DOMException("The quota has been exceeded.", "QuotaExceededError");
		return put.apply(this, args);
	};
})();`

// TestBrowserStorageFull saves a project, makes the storage refuse writes, edits, and checks
// that the page says the save failed and why, keeps the edit on screen, leaves the stored
// project as it was, and stores the edit with the next change once there is room again.
func TestBrowserStorageFull(t *testing.T) {
	ctx, w, _ := openPage(t, failWrites)

	setInput(t, ctx, "r1", "0.40")
	setInput(t, ctx, "r2", "0.04")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	waitSaved(t, ctx)

	evalJS[bool](t, ctx, `window.copolyTestFull = true`)
	setInput(t, ctx, "r1", strconv.FormatFloat(otherR1, 'f', -1, 64))
	// The put that throws is reported as such, or (hackpadfs reports only whole transactions)
	// found when the write does not read back.
	waitStatus(t, ctx, "the save failed because storage is full", `^Not saved: the browser('s storage for this page is full| did not keep what was written; its storage for this page may be full)\..*next change`)
	waitText(t, ctx, "out-azeotrope", otherAzeotrope) // the edit is in use on the page
	if got := storedRatios(t, ctx); got != ratios(styreneR1, acrylR2) {
		t.Errorf("stored project after a failed save = %s, want the last good one %s", got, ratios(styreneR1, acrylR2))
	}
	checkNoFatalBanner(t, ctx)
	w.check(t, "saving into a full storage")

	// Room again: the next change stores everything, the earlier edit included.
	evalJS[bool](t, ctx, `window.copolyTestFull = false`)
	setInput(t, ctx, "r2", "0.05")
	waitSaved(t, ctx)
	if got := storedRatios(t, ctx); got != ratios(otherR1, 0.05) {
		t.Errorf("stored project after the retry = %s, want %s", got, ratios(otherR1, 0.05))
	}
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkFieldValue(t, ctx, "r1", otherR1, "after the retry and a reload")
	checkFieldValue(t, ctx, "r2", 0.05, "after the retry and a reload")
	w.check(t, "retrying and reloading")
}

// damage replaces the stored file at path (of the page's hackpadfs database) with text, through
// IndexedDB itself, keeping its file record apart from the size.
func damage(t *testing.T, ctx context.Context, path, text string) {
	t.Helper()
	problem := evalAsync[string](t, ctx, fmt.Sprintf(`(async (path, text) => {
		const req = (r) => new Promise((res, rej) => { r.onsuccess = () => res(r.result); r.onerror = () => rej(r.error); });
		const db = await req(indexedDB.open("copoly"));
		try {
			const tx = db.transaction(["contents", "info"], "readwrite");
			const done = new Promise((res, rej) => { tx.oncomplete = res; tx.onerror = tx.onabort = () => rej(tx.error); });
			const info = tx.objectStore("info");
			const rec = await req(info.get(path));
			if (!rec) return "no stored file " + path;
			const bytes = new TextEncoder().encode(text);
			tx.objectStore("contents").put(bytes, path);
			rec.Size = bytes.length;
			info.put(rec, path);
			await done;
			return "";
		} finally {
			db.close();
		}
	})(%s, %s)`, jsString(path), jsString(text)))
	if problem != "" {
		t.Fatalf("damaging %s: %s", path, problem)
	}
}

// keptCopies returns the kept copies the module lists, as "kind:text" for each.
func keptCopies(t *testing.T, ctx context.Context) []string {
	t.Helper()
	return evalAsync[[]string](t, ctx, `(async () => {
		const r = await window.copoly.loadProject({});
		const out = [];
		for (const k of r.kept || []) {
			const c = await window.copoly.keptCopy({name: k.name});
			out.push(k.kind + ":" + (c.error ? "error " + c.error : new TextDecoder().decode(c.bytes)));
		}
		return out;
	})()`)
}

// TestBrowserStorageDamaged damages the stored project, first the latest copy and then the
// previous one too, and checks that the page falls back to the previous copy and then to the
// demo, says so, and keeps the damaged bytes for download, also after later saves.
func TestBrowserStorageDamaged(t *testing.T) {
	ctx, w, _ := openPage(t, "")

	// Two saves: the latest (r1 0.40, r2 0.04) and, before it, r1 0.40 with the demo's r2.
	setInput(t, ctx, "r1", "0.40")
	waitSaved(t, ctx)
	setInput(t, ctx, "r2", "0.04")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	waitStoredRatios(t, ctx, ratios(styreneR1, acrylR2))
	waitSaved(t, ctx)

	const cut = `{"format": "copoly-project", "version": 1, "name": "cut sh`
	damage(t, ctx, "projects/current.json", cut)
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkFieldValue(t, ctx, "r1", styreneR1, "after the latest copy was damaged")
	checkFieldValue(t, ctx, "r2", demoR2, "after the latest copy was damaged (the previous save)")
	waitShown(t, ctx, "storage-message", "could not be read", "previous saved version")
	waitShown(t, ctx, "kept-bar", "could not be read (damaged)", "Download")
	if got := keptCopies(t, ctx); len(got) != 1 || got[0] != "damaged:"+cut {
		t.Errorf("kept copies %q, want the damaged bytes %q", got, cut)
	}
	clickKept(t, ctx, 0, "Download")
	checkNoFatalBanner(t, ctx)
	w.check(t, "loading with the latest copy damaged")

	// Both copies damaged: the page starts from the demo and keeps both.
	const junk = "\x00not a project at all"
	damage(t, ctx, "projects/previous.json", junk)
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	waitShown(t, ctx, "demo-badge")
	checkFieldValue(t, ctx, "r1", demoR1, "with both copies damaged (the demo)")
	waitShown(t, ctx, "storage-message", "no good copy is left", "starts from the demo")
	want := []string{"damaged:" + cut, "damaged:" + junk}
	if got := keptCopies(t, ctx); !sameStrings(got, want) {
		t.Errorf("kept copies %q, want %q", got, want)
	}
	w.check(t, "loading with both copies damaged")

	// Working on from the demo replaces the damaged files, but the kept copies stay.
	setInput(t, ctx, "r1", "0.40")
	waitSaved(t, ctx)
	setInput(t, ctx, "r2", "0.04")
	waitStoredRatios(t, ctx, ratios(styreneR1, acrylR2))
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkFieldValue(t, ctx, "r2", acrylR2, "after saving over the damaged copies")
	checkHidden(t, ctx, "storage-message", "after saving over the damaged copies")
	if got := keptCopies(t, ctx); !sameStrings(got, want) {
		t.Errorf("kept copies after two more saves %q, want %q", got, want)
	}
	// Deleting one from the list removes it.
	clickKept(t, ctx, 0, "Delete")
	waitUntil(t, ctx, "one kept copy to be listed", `return document.querySelectorAll("#kept-list li").length === 1 ? "" : document.getElementById("kept-list").textContent;`, stepTimeout)
	if got := keptCopies(t, ctx); len(got) != 1 {
		t.Errorf("kept copies after deleting one: %q", got)
	}
	w.check(t, "saving over damaged copies")
}

// clickKept clicks the button labelled label in entry i of the kept-copies list.
func clickKept(t *testing.T, ctx context.Context, i int, label string) {
	t.Helper()
	problem := evalJS[string](t, ctx, fmt.Sprintf(`((i, label) => {
		const li = document.querySelectorAll("#kept-list li")[i];
		if (!li) return "no entry " + i + " in #kept-list";
		const b = [...li.querySelectorAll("button")].find(b => b.textContent === label);
		if (!b) return "no " + label + " button in " + JSON.stringify(li.textContent);
		b.click();
		return "";
	})(%d, %s)`, i, jsString(label)))
	if problem != "" {
		t.Fatal(problem)
	}
}

// waitStoredRatios waits until the stored project has r1/r2 as want.
func waitStoredRatios(t *testing.T, ctx context.Context, want string) {
	t.Helper()
	storedProject(t, ctx, "the stored ratios to be "+want, fmt.Sprintf(`return p.r1 + "/" + p.r2 === %s ? "" : p.r1 + "/" + p.r2;`, jsString(want)))
}

// sameStrings reports whether a and b hold the same texts, each as many times, in any order.
func sameStrings(a, b []string) bool {
	a, b = slices.Clone(a), slices.Clone(b)
	slices.Sort(a)
	slices.Sort(b)
	return slices.Equal(a, b)
}

// TestBrowserStorageTwoTabs opens the page in two tabs of one browser. Both edit; the second
// save finds the first tab's and must not replace it: the page says so and the user picks.
func TestBrowserStorageTwoTabs(t *testing.T) {
	ctxA, wA, pageURL := openPage(t, "")
	wB := &watcher{pageURL: pageURL}
	ctxB, cancelB := chromedp.NewContext(ctxA, chromedp.WithListener(wB.listen))
	defer cancelB()
	run(t, ctxB, "open a second tab on "+pageURL, chromedp.Navigate(pageURL))
	waitReady(t, ctxB)

	// Both tabs opened the demo with nothing stored. Tab A saves first.
	setInput(t, ctxA, "r1", "0.40")
	waitSaved(t, ctxA)
	setInput(t, ctxB, "r2", "0.04")
	waitShown(t, ctxB, "conflict-bar", "Another tab or window saved this project", "Nothing was overwritten")
	waitStatus(t, ctxB, "not saved over the other tab's version", `^Not saved over`)
	// Tab A's version is stored untouched; tab B's is kept as a conflict copy.
	if got := storedRatios(t, ctxA); got != ratios(styreneR1, demoR2) {
		t.Errorf("stored project after the conflict = %s, want tab A's %s", got, ratios(styreneR1, demoR2))
	}
	copies := keptCopies(t, ctxB)
	if len(copies) != 1 || !strings.HasPrefix(copies[0], "conflict:") || !strings.Contains(copies[0], `"r2": 0.04`) {
		t.Errorf("kept copies after the conflict = %q, want tab B's version", copies)
	}
	wA.check(t, "saving in tab A")
	wB.check(t, "saving in tab B after tab A")

	// Tab B keeps its own version: it replaces tab A's, and the conflict copy goes.
	click(t, ctxB, "conflict-keep-mine")
	waitSaved(t, ctxB)
	checkHidden(t, ctxB, "conflict-bar", "after keeping this tab's version")
	waitStoredRatios(t, ctxB, ratios(demoR1, acrylR2))
	waitNoKept(t, ctxB)

	// Tab A edits on from its old revision: now it is told, and keeps the other version.
	setInput(t, ctxA, "r2", "0.05")
	waitShown(t, ctxA, "conflict-bar", "Another tab or window saved this project")
	click(t, ctxA, "conflict-keep-other")
	checkHidden(t, ctxA, "conflict-bar", "after keeping the other tab's version")
	checkFieldValue(t, ctxA, "r1", demoR1, "tab A after keeping tab B's version")
	checkFieldValue(t, ctxA, "r2", acrylR2, "tab A after keeping tab B's version")
	waitShown(t, ctxA, "undo-bar", "Bring it back")
	run(t, ctxA, "wait for a save that must not happen", chromedp.Sleep(saveSettle))
	if got := storedRatios(t, ctxA); got != ratios(demoR1, acrylR2) {
		t.Errorf("stored project after tab A kept tab B's version = %s, want %s", got, ratios(demoR1, acrylR2))
	}
	waitNoKept(t, ctxA)
	// And tab B saves on without a conflict: tab A kept its version without saving it again.
	setInput(t, ctxB, "r1", "0.40")
	waitSaved(t, ctxB)
	checkHidden(t, ctxB, "conflict-bar", "tab B's next save")
	wA.check(t, "settling the conflict in tab A")
	wB.check(t, "settling the conflict in tab B")
}

// TestBrowserStorageDraft types valid and not-yet-valid text and reloads at once: the text must
// come back as typed, with a notice and a way to discard it.
func TestBrowserStorageDraft(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	setInput(t, ctx, "r1", "0.40")
	waitSaved(t, ctx)

	// Valid text, then text that is not a number yet, then a note; reload at once.
	setInput(t, ctx, "r2", "0.04")
	setInput(t, ctx, "f10", "0,3x")
	setInput(t, ctx, "notes", "typed just before the reload")
	run(t, ctx, "reload at once", chromedp.Reload())
	waitReady(t, ctx)
	for id, want := range map[string]string{"r1": "0.40", "r2": "0.04", "f10": "0,3x", "notes": "typed just before the reload"} {
		if got := fieldText(t, ctx, id); got != want {
			t.Errorf("after typing and reloading at once, #%s = %q, want %q", id, got, want)
		}
	}
	waitShown(t, ctx, "draft-bar", "What you were typing", "Discard")
	waitUntil(t, ctx, "#f10 to be marked invalid", `return document.getElementById("f10").getAttribute("aria-invalid") === "true" ? "" : "not marked";`, stepTimeout)
	w.check(t, "restoring the typing")

	// Discarding goes back to the stored project.
	click(t, ctx, "draft-discard")
	checkHidden(t, ctx, "draft-bar", "after discarding")
	checkFieldValue(t, ctx, "r1", styreneR1, "after discarding the restored typing")
	checkFieldValue(t, ctx, "r2", demoR2, "after discarding the restored typing")
	if got := fieldText(t, ctx, "f10"); got == "0,3x" {
		t.Errorf("after discarding, #f10 still holds %q", got)
	}
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkHidden(t, ctx, "draft-bar", "after discarding and reloading")
	checkFieldValue(t, ctx, "r2", demoR2, "after discarding and reloading")

	// Valid text typed and reloaded at once is back, then saved as the project.
	setInput(t, ctx, "r2", "0.04")
	run(t, ctx, "reload at once", chromedp.Reload())
	waitReady(t, ctx)
	if got := fieldText(t, ctx, "r2"); got != "0.04" {
		t.Errorf("valid text typed and reloaded at once: #r2 = %q, want 0.04", got)
	}
	waitSaved(t, ctx)
	waitStoredRatios(t, ctx, ratios(styreneR1, acrylR2))
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	checkFieldValue(t, ctx, "r2", acrylR2, "once the restored typing was saved")
	checkHidden(t, ctx, "draft-bar", "once the restored typing was saved")
	w.check(t, "reloading in the middle of typing")
}
