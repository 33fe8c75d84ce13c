//go:build !js

package browsertest

import (
	"context"
	"encoding/json"
	"strconv"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/accessibility"
	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/input"
	"github.com/chromedp/chromedp"
)

// TestBrowserKeyboardAndNames uses the page as a keyboard and screen-reader user meets it, with
// every panel that holds controls open (the demo's estimate and plan, the own-monomer form, a
// triad row, a chain-size row and simulated chains). It checks, in Chromium's accessibility tree,
// that every visible input, select, textarea and button has an accessible name and every plot is
// an image with a telling name; that no control has a negative tabindex, radio buttons sit in a
// fieldset with a legend, and status messages are live regions; and, pressing Tab as a person
// does, that focus visits every visible control exactly once, in the order of the document and
// so of the steps, each with a visible focus outline.
func TestBrowserKeyboardAndNames(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	waitAllDrawn(t, ctx)
	evalJS[bool](t, ctx, `document.getElementById("own-box").open = true`)
	click(t, ctx, "triad-add")
	click(t, ctx, "size-add")
	click(t, ctx, "sim-run")
	waitUntil(t, ctx, "the new rows and the simulated chains", `
		if (!document.querySelector("#triad-table tbody tr[data-row] input")) return "no triad row";
		if (!document.querySelector("#size-table tbody tr[data-row] input")) return "no size row";
		const s = document.querySelector("#fig-sim-hist svg");
		return s && s.checkVisibility() ? "" : "no simulated chains: " + document.getElementById("sim-status").textContent;`, stepTimeout)
	w.check(t, "opening every panel")

	// The controls a person can see, in document order, numbered in data-a11y.
	controls := evalJS[[]string](t, ctx, `(() => {
		const sel = 'a[href], button, input, select, textarea, summary, [tabindex], [contenteditable="true"]';
		const out = [];
		for (const el of document.querySelectorAll(sel)) {
			el.removeAttribute("data-a11y");
			if (el.type === "hidden" || !el.checkVisibility({visibilityProperty: true})) continue;
			el.setAttribute("data-a11y", String(out.length));
			out.push(el.tagName.toLowerCase() + (el.id ? "#" + el.id : "") + (el.type && el.tagName === "INPUT" ? "[type=" + el.type + "]" : "") +
				(el.id ? "" : " " + JSON.stringify((el.getAttribute("aria-label") || el.textContent).trim().slice(0, 40))));
		}
		for (const svg of document.querySelectorAll("figure.plot .plot-area svg")) svg.setAttribute("data-plot", svg.closest("figure").id);
		return out;
	})()`)
	t.Logf("%d visible controls", len(controls))
	if len(controls) < 100 {
		t.Fatalf("only %d visible controls; with every panel open the page has far more", len(controls))
	}

	checkAccessibleNames(t, ctx, controls)
	for _, p := range evalJS[[]string](t, ctx, a11yRules) {
		t.Error(p)
	}
	checkTabOrder(t, ctx, controls)
	w.check(t, "walking the page by keyboard")
}

// checkAccessibleNames reads Chromium's accessibility tree and checks that every control marked
// data-a11y has a non-empty accessible name, and every plot is an image with a telling name.
func checkAccessibleNames(t *testing.T, ctx context.Context, controls []string) {
	t.Helper()
	tree := run(t, ctx, "read the accessibility tree", chromedp.Action[*accessibility.GetFullAXTreeResult](
		func(ctx context.Context, tg *chromedp.Target) (*accessibility.GetFullAXTreeResult, error) {
			res, err := cdp.Call(ctx, tg, accessibility.GetFullAXTree, accessibility.GetFullAXTreeParams{})
			return &res, err
		}))
	byBackend := map[cdp.BackendNodeID]*accessibility.Node{}
	for _, n := range tree.Nodes {
		if n.BackendDOMNodeID != 0 {
			byBackend[n.BackendDOMNodeID] = n
		}
	}

	nodes := run(t, ctx, "find the controls", chromedp.Nodes(chromedp.CSSAll("[data-a11y]")))
	if len(nodes) != len(controls) {
		t.Fatalf("found %d [data-a11y] nodes, want %d", len(nodes), len(controls))
	}
	named := 0
	for _, n := range nodes {
		i, err := strconv.Atoi(n.AttributeValue("data-a11y"))
		if err != nil || i < 0 || i >= len(controls) {
			t.Fatalf("a node has data-a11y=%q", n.AttributeValue("data-a11y"))
		}
		n.RLock()
		id := n.BackendNodeID
		n.RUnlock()
		ax := byBackend[id]
		switch name := axString(ax, func(a *accessibility.Node) *accessibility.Value { return a.Name }); {
		case ax == nil:
			t.Errorf("%s is missing from the accessibility tree", controls[i])
		case ax.Ignored:
			t.Errorf("%s is ignored by the accessibility tree", controls[i])
		case strings.TrimSpace(name) == "":
			t.Errorf("%s (role %s) has no accessible name", controls[i], axString(ax, func(a *accessibility.Node) *accessibility.Value { return a.Role }))
		default:
			named++
		}
	}
	t.Logf("%d of %d controls have an accessible name", named, len(controls))

	// Plots: an image named after what it shows (the chart's title, not a generic word).
	plots := run(t, ctx, "find the plots", chromedp.Nodes(chromedp.CSSAll("figure.plot .plot-area svg")))
	if len(plots) < 10 {
		t.Errorf("only %d plots drawn; want at least the 10 of steps 2 to 8", len(plots))
	}
	for _, n := range plots {
		n.RLock()
		id := n.BackendNodeID
		n.RUnlock()
		ax := byBackend[id]
		role := axString(ax, func(a *accessibility.Node) *accessibility.Value { return a.Role })
		name := axString(ax, func(a *accessibility.Node) *accessibility.Value { return a.Name })
		where := "#" + n.AttributeValue("data-plot")
		if ax == nil || role != "image" || len(name) < 10 || name == "chart" || name == "sample chains" {
			t.Errorf("%s: accessibility role %q, name %q; want an image named after what it shows", where, role, name)
		}
	}
}

// axString is a string property of an accessibility node, or "".
func axString(n *accessibility.Node, get func(*accessibility.Node) *accessibility.Value) string {
	if n == nil {
		return ""
	}
	v := get(n)
	if v == nil || len(v.Value) == 0 {
		return ""
	}
	var s string
	if json.Unmarshal([]byte(v.Value), &s) != nil {
		return string(v.Value)
	}
	return s
}

// a11yRules returns what breaks the page's rules for keyboard and screen-reader users, beyond
// names: negative tabindex, radio buttons outside a fieldset with a legend, status messages
// outside a live region.
const a11yRules = `(() => {
	const problems = [];
	for (const el of document.querySelectorAll("[tabindex]")) {
		if (el.tabIndex < 0) problems.push((el.id ? "#" + el.id : el.tagName) + " has tabindex " + el.getAttribute("tabindex") + ": the keyboard cannot reach it");
	}
	for (const el of document.querySelectorAll("[data-a11y]")) {
		if (el.tabIndex < 0) problems.push((el.id ? "#" + el.id : el.tagName) + " is visible but out of the tab order");
	}
	for (const r of document.querySelectorAll('input[type="radio"]')) {
		const fs = r.closest("fieldset");
		const legend = fs && fs.querySelector(":scope > legend");
		if (!legend || !legend.textContent.trim()) problems.push("the radio button #" + r.id + " is not in a fieldset with a legend");
	}
	// Every message the page writes in reply to an action or an edit.
	const live = ["engine-status", "storage-status", "storage-message", "import-error", "undo-bar", "load-banner", "fatal-banner",
		"bench-status", "bench-error", "bench-undo-bar", "fit-status", "fit-use-note", "next-add-note", "out-exhausted",
		"plan-status", "sf-out", "um-status", "triad-status", "disc-status", "disc-use-note", "sim-status", "size-status"];
	for (const id of live) {
		const el = document.getElementById(id);
		if (!el) { problems.push("no #" + id); continue; }
		const role = el.getAttribute("role"), aria = el.getAttribute("aria-live");
		if (!(role === "status" || role === "alert" || aria === "polite" || aria === "assertive")) problems.push("#" + id + " is not a live region (role " + role + ", aria-live " + aria + ")");
	}
	return problems;
})()`

// checkTabOrder focuses the first control and presses Tab until every control has had its turn:
// focus must visit the controls marked data-a11y exactly in their order (the document's), each
// matching :focus-visible with an outline drawn (for a visually hidden file input, on its label).
// The steps' sections must lie in the same order on screen.
func checkTabOrder(t *testing.T, ctx context.Context, controls []string) {
	t.Helper()
	if p := evalJS[string](t, ctx, `(() => {
		const tops = [...document.querySelectorAll("main > section")].filter((s) => s.checkVisibility()).map((s) => [s.id, s.getBoundingClientRect().top]);
		for (let i = 1; i < tops.length; i++) if (tops[i][1] <= tops[i - 1][1]) return "#" + tops[i][0] + " is drawn above #" + tops[i - 1][0];
		document.querySelector('[data-a11y="0"]').focus();
		return document.activeElement.dataset.a11y === "0" ? "" : "cannot focus the first control";
	})()`); p != "" {
		t.Fatal(p)
	}
	key := func(typ input.DispatchKeyEventType) input.DispatchKeyEventParams {
		return input.DispatchKeyEventParams{Type: typ, Key: "Tab", Code: "Tab", WindowsVirtualKeyCode: 9, NativeVirtualKeyCode: 9}
	}
	tab := chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		for _, typ := range []input.DispatchKeyEventType{input.DispatchKeyEventTypeRawKeyDown, input.DispatchKeyEventTypeKeyUp} {
			if _, err := cdp.Call(ctx, tg, input.DispatchKeyEvent, key(typ)); err != nil {
				return err
			}
		}
		return nil
	})
	const where = `(() => {
		const el = document.activeElement;
		if (!el || el === document.body) return ["", "focus left the controls"];
		const i = el.dataset.a11y;
		if (i === undefined) return ["", "focus is on " + el.tagName.toLowerCase() + (el.id ? "#" + el.id : "") + ", which is not a visible control"];
		const ring = el.classList.contains("visually-hidden") && el.labels && el.labels.length ? el.labels[0] : el;
		const cs = getComputedStyle(ring);
		const drawn = cs.outlineStyle !== "none" && parseFloat(cs.outlineWidth) >= 1;
		if (!el.matches(":focus-visible") || !drawn)
			return [i, "no visible focus: :focus-visible " + el.matches(":focus-visible") + ", outline " + cs.outlineStyle + " " + cs.outlineWidth + (ring !== el ? " on its label" : "")];
		return [i, ""];
	})()`
	visited := 1
	for want := 1; want < len(controls); want++ {
		run(t, ctx, "press Tab", tab)
		got := evalJS[[2]string](t, ctx, where)
		if got[0] == "" {
			t.Fatalf("Tab %d, expecting %s: %s", want, controls[want], got[1])
		}
		i, _ := strconv.Atoi(got[0])
		if i != want {
			t.Fatalf("Tab %d went to %s; in document order it should reach %s (after %s)", want, controls[i], controls[want], controls[want-1])
		}
		if got[1] != "" {
			t.Errorf("Tab %d, %s: %s", want, controls[i], got[1])
		}
		visited++
	}
	t.Logf("Tab visited all %d controls in document order", visited)
}
