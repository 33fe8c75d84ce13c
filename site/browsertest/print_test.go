//go:build !js

package browsertest

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"
)

// The printable area the report is laid out for: A4 (210 mm × 297 mm) less the 12 mm margins of
// the print stylesheet's @page rule, in CSS pixels of 1/96 inch (25.4 mm). Letter (215.9 mm wide)
// is wider, so a report that fits A4's width fits Letter's.
const (
	printWidthPx  = 703  // (210 − 2·12) mm / 25.4 mm · 96 = 703.0
	printHeightPx = 1031 // (297 − 2·12) mm / 25.4 mm · 96 = 1031.8, rounded down
)

// TestBrowserPrintReport prints the demo project as a report. On screen it checks the print
// control and that the sections the demo leaves empty are there; then, with print media emulated
// on a viewport as wide as A4's printable width, it checks that the report shows the monomers,
// ratios and source notes, the bench data, every estimation method (the linear ones labelled
// linear, the integrated-model fits with their intervals), the joint confidence region and drift
// plots, the plan with its safety figures and cautions, the date, the engine's version and the
// invented-demo marker; that no button, picker or paste box is printed, nor any empty section;
// that every plot fits the page's width and height; and that Chromium's PDF of it has a sensible
// number of pages. COPOLY_PDF, if set, receives the PDF.
func TestBrowserPrintReport(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	waitAllDrawn(t, ctx)
	w.check(t, "loading the page")

	// Uncertainties for every run, so that error-in-variables is computed beside nonlinear
	// least squares and the report must show both with their intervals. The numbers are test
	// inputs: any small standard uncertainties do.
	n := evalJS[int](t, ctx, `document.querySelectorAll("#bench-table tbody tr[data-row]").length`)
	if n < 3 {
		t.Fatalf("the demo has %d bench rows; the report test needs at least 3", n)
	}
	for i := range n {
		setInput(t, ctx, fmt.Sprintf("bench-r%d-sX", i), "0.01")
		setInput(t, ctx, fmt.Sprintf("bench-r%d-sf", i), "0.002")
	}
	waitUntil(t, ctx, "both integrated-model fits with their regions", `
		for (const m of ["nonlinear", "evm"]) {
			const tr = document.querySelector('#fit-table tr[data-method="' + m + '"]');
			if (!tr) return "no " + m + " row";
			const c = tr.querySelector('[data-col="region1"]');
			if (!c || !/\d–\d/.test(c.textContent)) return m + ": " + JSON.stringify(tr.textContent);
		}
		return "";`, stepTimeout)
	w.check(t, "typing the uncertainties")

	// On screen: the print control is shown and prints; the head of the report is not shown;
	// the triads and chain-size sections, empty in the demo, are (so that their absence below
	// is the print stylesheet's doing).
	waitUntil(t, ctx, "the screen view before printing", `
		const shown = (id) => document.getElementById(id).checkVisibility();
		if (!shown("print-report")) return "#print-report is not shown";
		if (shown("print-meta")) return "#print-meta is shown on screen";
		if (!shown("triads") || !shown("size")) return "#triads or #size is not shown on screen";
		return "";`, stepTimeout)
	printed := evalJS[string](t, ctx, `(() => {
		let calls = 0;
		const real = window.print;
		window.print = () => { calls++; };
		document.getElementById("print-date").textContent = "";
		document.getElementById("print-report").click();
		window.print = real;
		const date = document.getElementById("print-date").textContent;
		return calls === 1 && date ? "" : "window.print called " + calls + " times, #print-date " + JSON.stringify(date);
	})()`)
	if printed != "" {
		t.Errorf("pressing #print-report: %s", printed)
	}

	// Print media on a viewport of A4's printable width.
	run(t, ctx, "set the viewport to the printable width", chromedp.EmulateViewport(printWidthPx, printHeightPx))
	setMedia(t, ctx, "print")
	before := time.Now()
	for _, p := range evalJS[[]string](t, ctx, printChecks) {
		t.Error("printed report: " + p)
	}

	// The date is today's (or yesterday's, if midnight passed since the page stamped it) and the
	// version is the engine's.
	head := evalJS[[3]string](t, ctx, `[document.getElementById("print-meta").textContent, document.getElementById("print-date").textContent, window.copoly.version]`)
	t.Logf("report head: %q", head[0])
	m := regexp.MustCompile(`^(\d{4}-\d{2}-\d{2}) \d{2}:\d{2} \(UTC[+−]\d{2}:\d{2}\)$`).FindStringSubmatch(strings.TrimSpace(head[1]))
	switch {
	case m == nil:
		t.Errorf("#print-date = %q, want YYYY-MM-DD hh:mm (UTC±hh:mm)", head[1])
	case m[1] != before.Format(time.DateOnly) && m[1] != before.AddDate(0, 0, -1).Format(time.DateOnly):
		t.Errorf("#print-date = %q, want today, %s", head[1], before.Format(time.DateOnly))
	}
	if !strings.Contains(head[0], "version "+head[2]) {
		t.Errorf("#print-meta = %q, want the engine's version %q in it", head[0], head[2])
	}

	// Chromium's own PDF of the report, on A4.
	pdf := run(t, ctx, "print to PDF", chromedp.PrintToPDF(chromedp.PDFPaper(chromedp.PaperA4)))
	if path := os.Getenv("COPOLY_PDF"); path != "" {
		if err := os.WriteFile(path, pdf, 0o644); err != nil {
			t.Errorf("COPOLY_PDF: %v", err)
		}
	}
	pages := len(regexp.MustCompile(`/Type\s*/Page\b`).FindAll(pdf, -1))
	// A sanity range for the demo's report, chosen here (no source): its 14 plots, 6 tables and
	// the plan need at least 5 A4 pages, and more than 20 would mean the layout fell apart.
	if !bytes.HasPrefix(pdf, []byte("%PDF-")) || pages < 5 || pages > 20 {
		t.Errorf("the PDF of the report: %d bytes, %d pages; want a PDF of 5 to 20 pages", len(pdf), pages)
	}
	t.Logf("the PDF of the report on A4: %d pages, %d bytes", pages, len(pdf))

	setMedia(t, ctx, "")
	w.check(t, "printing the report")
}

// waitAllDrawn waits until the page has drawn every section the demo fills: the estimate with its
// region, the plots of steps 2 and 3, and the plan with its plots.
func waitAllDrawn(t *testing.T, ctx context.Context) {
	t.Helper()
	waitUntil(t, ctx, "every section of the demo to be drawn", `
		for (const sel of ["#fig-composition svg", "#fig-drift svg", "#fig-jcr svg", "#fig-fit-data svg", "#fig-plan svg", "#fit-table tr[data-recommended]", "#plan-recipe tbody tr"]) {
			const el = document.querySelector(sel);
			if (!el || !el.checkVisibility()) return "no visible " + sel + " (plan status: " + JSON.stringify(document.getElementById("plan-status").textContent) + "; " + [...document.querySelectorAll("#plan .field-error:not([hidden])")].map((e) => e.id + ": " + e.textContent).join("; ") + ")";
		}
		return "";`, stepTimeout)
}

// setMedia emulates the CSS media type ("print", "screen"), or ends the emulation ("").
func setMedia(t *testing.T, ctx context.Context, media string) {
	t.Helper()
	run(t, ctx, "emulate media "+media, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		_, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: media})
		return err
	}))
	if media != "" {
		if got := evalJS[bool](t, ctx, fmt.Sprintf(`matchMedia(%s).matches`, jsString(media))); !got {
			t.Fatalf("matchMedia(%q) is false after emulating it", media)
		}
	}
}

// printChecks runs in the page under print media and returns what is wrong with the report.
var printChecks = fmt.Sprintf(`(() => {
	const problems = [];
	const shown = (el) => !!el && el.checkVisibility();
	const text = (el) => (el.value !== undefined && el.tagName !== "BUTTON" ? el.value : el.textContent).trim();
	const need = (sel, what) => {
		const el = document.querySelector(sel);
		if (!shown(el)) problems.push(what + " (" + sel + ") is not printed");
		else if (!text(el)) problems.push(what + " (" + sel + ") is printed empty");
		return el;
	};

	// The head: date and version, and the invented-demo marker.
	need("#print-meta", "the date and version");
	need("#print-demo", "the invented-demo marker");
	need("#demo-badge", "the demo badge");

	// Monomers, ratios and where the values come from.
	for (const [sel, what] of [["#name1", "the name of M1"], ["#name2", "the name of M2"], ["#mass1", "the molar mass of M1"],
		["#mass2", "the molar mass of M2"], ["#mass1-source", "the source of M1's molar mass"], ["#mass2-source", "the source of M2's molar mass"],
		["#r1", "r1"], ["#r2", "r2"], ["#ratio-source-print", "where r1 and r2 come from"], ["#notes", "the notes"],
		["#out-azeotrope", "the azeotrope"], ["#out-limit", "the conversion limit"]]) need(sel, what);
	const src = document.getElementById("ratio-source-print");
	if (src && src.textContent !== document.getElementById("ratio-source").value.trim()) problems.push("#ratio-source-print differs from what was typed");

	// The bench data, every cell of every row.
	const rows = [...document.querySelectorAll("#bench-table tbody tr[data-row]")];
	if (!rows.length) problems.push("no bench rows are printed");
	for (const tr of rows) {
		if (!shown(tr)) { problems.push("bench row " + tr.dataset.row + " is not printed"); continue; }
		for (const i of tr.querySelectorAll("input")) if (!shown(i)) problems.push("bench cell " + i.id + " is not printed");
	}

	// Every method's estimate: the linear ones labelled linear, the integrated-model fits with
	// their intervals.
	const methods = [...document.querySelectorAll("#fit-table tbody tr[data-method]")];
	const names = methods.map((tr) => tr.dataset.method);
	for (const m of %s) if (!names.includes(m)) problems.push("the estimate table has no row for " + m);
	for (const tr of methods) {
		const m = tr.dataset.method;
		if (!shown(tr)) { problems.push("the estimate of " + m + " is not printed"); continue; }
		const tag = tr.querySelector("th .tag");
		const linear = %s.includes(m) || m === "swapped";
		if (linear && !(shown(tag) && tag.textContent.trim() === "linear")) problems.push("the linear method " + m + " is not labelled linear");
		if (!linear) {
			for (const col of ["r1", "r2", "region1", "region2"]) {
				const c = tr.querySelector('[data-col="' + col + '"]');
				if (!shown(c) || (col.startsWith("region") && !/\d–\d/.test(c.textContent))) problems.push(m + ": " + col + " is not printed with a value");
			}
		}
	}

	// The plots: composition, drift, the region (with its outline), the fit; all inside the page.
	for (const id of ["fig-composition", "fig-drift", "fig-jcr", "fig-fit-data", "fig-plan"]) need("#" + id + " svg", "the plot " + id);
	if (!shown(document.querySelector('#fig-jcr polygon[data-role="jcr"]'))) problems.push("the joint confidence region is not drawn in #fig-jcr");
	for (const svg of document.querySelectorAll("figure.plot svg")) {
		if (!shown(svg)) continue;
		const r = svg.getBoundingClientRect();
		const id = svg.closest("figure").id;
		if (r.width > %d + 0.5 || r.height > %d) problems.push(id + " is " + r.width.toFixed(0) + " × " + r.height.toFixed(0) + " px, larger than the printable area");
		if (r.width < 0.45 * %[3]d) problems.push(id + " is only " + r.width.toFixed(0) + " px wide: more than two plots side by side");
	}

	// The plan and its safety figures, and the cautions of steps 3 and 8.
	for (const [sel, what] of [["#plan-status", "the plan's summary"], ["#plan-recipe", "the recipe"], ["#plan-schedule", "the schedule"],
		["#plan-safety", "the plan's safety box"], ["#plan-inventory", "the unreacted monomer of the plan"], ["#plan-rise", "the adiabatic rise of the plan"],
		["#drift .caution", "the safety note of step 3"]]) need(sel, what);
	const cautions = [...document.querySelectorAll("#plan-safety .caution-list li")];
	if (cautions.length < 3 || cautions.some((li) => !shown(li))) problems.push("the plan's cautions are not all printed (" + cautions.length + " items)");
	if (!document.querySelectorAll("#plan-schedule tbody tr").length) problems.push("the schedule is printed without rows");

	// No controls: no button, picker, file input, paste box or plot buttons.
	const controls = [...document.querySelectorAll('button, label.button, input[type="file"], #pair-pick, #pick1, #pick2, .paste-box, .plot-actions')].filter(shown);
	if (controls.length) problems.push(controls.length + " controls are printed: " + controls.slice(0, 8).map((e) => e.tagName.toLowerCase() + (e.id ? "#" + e.id : "") + " " + JSON.stringify(e.textContent.trim().slice(0, 30))).join(", "));

	// No empty panels: the demo's empty sections are left out, every printed figure has its plot,
	// every printed table has rows, every printed section has more than its heading.
	for (const id of ["triads", "size"]) if (shown(document.getElementById(id))) problems.push("the empty section #" + id + " is printed");
	for (const el of document.querySelectorAll("td.empty-grid")) if (shown(el)) problems.push("an empty grid is printed: " + JSON.stringify(el.textContent));
	for (const fig of document.querySelectorAll("figure.plot")) if (shown(fig) && !shown(fig.querySelector("svg"))) problems.push("#" + fig.id + " is printed without its plot");
	for (const table of document.querySelectorAll("main table")) {
		if (shown(table) && ![...table.querySelectorAll("tbody tr")].some((tr) => shown(tr) && tr.textContent.trim() + [...tr.querySelectorAll("input")].map((i) => i.value).join("")))
			problems.push("the table #" + table.id + " is printed without rows");
	}
	for (const sec of document.querySelectorAll("main > section")) {
		if (!shown(sec)) continue;
		const rest = [...sec.children].filter((c) => c.tagName !== "H2" && shown(c) && (c.textContent.trim() || c.querySelector("svg, input, textarea")));
		if (!rest.length) problems.push("the section #" + sec.id + " is printed with nothing but its heading");
	}

	// Figures, tables and cautions are kept whole on a page.
	for (const sel of ["figure.plot", "#fit-table", "#bench-table", "#plan-recipe", "#plan-safety", "#drift .caution"]) {
		const el = document.querySelector(sel);
		if (el && getComputedStyle(el).breakInside !== "avoid") problems.push(sel + " may be split across pages (break-inside: " + getComputedStyle(el).breakInside + ")");
	}
	return problems;
})()`, jsArray(append([]string{"nonlinear", "evm"}, linearMethods...)), jsArray(linearMethods), printWidthPx, printHeightPx)

// linearMethods are the keys of the linearised estimation methods in the page's estimate table
// (the `method` names of site/copoly.d.ts).
var linearMethods = []string{"fineman-ross", "inverted-fineman-ross", "kelen-tudos", "extended-kelen-tudos", "mayo-lewis-integrated"}

// jsArray is a JavaScript array literal of the strings.
func jsArray(ss []string) string {
	parts := make([]string, len(ss))
	for i, s := range ss {
		parts[i] = jsString(s)
	}
	return "[" + strings.Join(parts, ", ") + "]"
}
