//go:build !js

package browsertest

import (
	"context"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// The size classes of the chain-size flow: two classes centred on 10 000 and 30 000 g/mol with
// equal weight fractions. With each class counted at its middle, the definitions
//
//	Mn = Σ wᵢ / Σ (wᵢ/Mᵢ) = 1/(0.5/10 000 + 0.5/30 000) = 15 000 g/mol
//	Mw = Σ wᵢ Mᵢ / Σ wᵢ   = 0.5·10 000 + 0.5·30 000   = 20 000 g/mol
//
// (P. J. Flory, Principles of Polymer Chemistry, Cornell 1953, the number- and weight-average
// molecular weights) give the expected averages.
const (
	wantMn = 15000.0
	wantMw = 20000.0
)

// triadFeeds are the feeds of the simulated triad measurements, spread as a study would be.
var triadFeeds = []float64{0.20, 0.35, 0.50, 0.65, 0.80}

// terminalTriads is one low-conversion copolymer of the terminal model at feed f1: F1 from the
// Mayo–Lewis equation and the monomer-centred triads of the first-order Markov chain of
// additions,
//
//	A111 = p11², A112+211 = 2 p11 p12, A212 = p12²,  A222 = p22², A221+122 = 2 p22 p21, A121 = p21²
//	p11 = r1 f1/(r1 f1 + f2), p21 = f1/(f1 + r2 f2)
//
// (J. L. Koenig, Chemical Microstructure of Polymer Chains, Wiley 1980, the terminal-model
// triad relations; F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 66, 1594 (1944)), in the order
// of the page's triad table: f10, F1, A111, A112, A212, A222, A221, A121.
func terminalTriads(r1, r2, f1 float64) [8]float64 {
	f2 := 1 - f1
	p11 := r1 * f1 / (r1*f1 + f2)
	p21 := f1 / (f1 + r2*f2)
	p12, p22 := 1-p11, 1-p21
	return [8]float64{f1, mayoLewis(r1, r2, f1), p11 * p11, 2 * p11 * p12, p12 * p12, p22 * p22, 2 * p22 * p21, p21 * p21}
}

// triadBlock is the pasted block: a header and the triads of the terminal model at triadFeeds,
// rounded to three decimals (as an NMR table reports them) with a decimal comma, tab-separated.
func triadBlock(r1, r2 float64) string {
	lines := []string{"f10\tF1\tA111\tA112\tA212\tA222\tA221\tA121"}
	for _, f := range triadFeeds {
		var cells []string
		for _, v := range terminalTriads(r1, r2, f) {
			cells = append(cells, strings.Replace(strconv.FormatFloat(v, 'f', 3, 64), ".", ",", 1))
		}
		lines = append(lines, strings.Join(cells, "\t"))
	}
	return strings.Join(lines, "\n") + "\n"
}

// TestBrowserSequencesAndChains uses the model choice, the triads, the simulated chains and the
// chain-size panel as a chemist would: the explicit penultimate model with r11 = r21 = r1 and
// r22 = r12 = r2 must draw the terminal composition curve, azeotrope included; triads made by
// the terminal model must not support a penultimate effect; 2000 chains of DPn 50 give a
// composition histogram with Stockmayer's curve; two size classes give the averages of their
// definitions; a bad triad is refused and not saved; a reload brings the triads, the classes
// and the model back.
func TestBrowserSequencesAndChains(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	waitUntil(t, ctx, "the triads panel to be drawn", `
		return document.getElementById("triad-status").textContent.trim() ? "" : "#triad-status is empty";`, stepTimeout)
	w.check(t, "loading the page")

	// Reduction: the terminal curve, then the penultimate model with r11 = r21 = r1, r22 = r12 = r2.
	setInput(t, ctx, "r1", "0.40")
	setInput(t, ctx, "r2", "0.04")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	terminalCurve := compositionCurve(t, ctx)
	setSelect(t, ctx, "model-kind", "penultimate")
	for _, c := range [][2]string{{"m-r11", "0.40"}, {"m-r21", "0.40"}, {"m-r22", "0.04"}, {"m-r12", "0.04"}} {
		setInput(t, ctx, c[0], c[1])
	}
	waitText(t, ctx, "seq-caption", "penultimate")
	waitText(t, ctx, "out-azeotrope", "terminal model only")
	penultimateCurve := compositionCurve(t, ctx)
	if len(penultimateCurve) != len(terminalCurve) {
		t.Fatalf("the penultimate composition curve has %d points, the terminal one %d", len(penultimateCurve), len(terminalCurve))
	}
	for i := range terminalCurve {
		// The page draws to 0.01 px; 0.02 px allows one rounding step.
		if math.Abs(penultimateCurve[i][0]-terminalCurve[i][0]) > 0.02 || math.Abs(penultimateCurve[i][1]-terminalCurve[i][1]) > 0.02 {
			t.Fatalf("point %d of the composition curve: penultimate %v, terminal %v; with r11 = r21 = r1 and r22 = r12 = r2 they must agree", i, penultimateCurve[i], terminalCurve[i])
		}
	}
	// The azeotrope: where the drawn curve crosses the diagonal, read in the diagonal's own scale.
	// 0.003 is about one pixel of the plot plus the chord between the curve's points (common
	// practice, no source).
	az, _ := strconv.ParseFloat(wantAzeotrope, 64)
	if got := crossing(t, ctx, penultimateCurve); math.Abs(got-0.96/1.56) > 0.003 {
		t.Errorf("the penultimate curve crosses F1 = f1 at f1 = %.4f; want the terminal azeotrope (1 − r2)/(2 − r1 − r2) = %.4f (shown %s)", got, 0.96/1.56, wantAzeotrope)
	} else {
		t.Logf("penultimate model, r11 = r21 = 0.40, r22 = r12 = 0.04: the curve crosses the diagonal at f1 = %.4f (terminal azeotrope %v)", got, az)
	}
	w.check(t, "choosing the penultimate model")
	setSelect(t, ctx, "model-kind", "terminal")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)

	// Triads made by the terminal model: no penultimate effect.
	block := triadBlock(benchR1, benchR2)
	t.Logf("pasted triads:\n%s", block)
	setInput(t, ctx, "triad-paste", block)
	click(t, ctx, "triad-paste-add")
	waitUntil(t, ctx, "the verdict of the comparison", `
		const s = document.getElementById("disc-status").textContent;
		return /do not support a penultimate effect/.test(s) ? "" : "#disc-status: " + JSON.stringify(s);`, stepTimeout)
	fit := evalJS[string](t, ctx, `(document.querySelector('#disc-table tr[data-model="terminal"]') || {textContent: ""}).textContent`)
	m := regexp.MustCompile(`r1 = ([0-9.]+) ± [0-9.e+-]+, r2 = ([0-9.]+)`).FindStringSubmatch(fit)
	if m == nil {
		t.Fatalf("the terminal fit in #disc-table reads %q; want r1 = … ± …, r2 = …", fit)
	}
	for i, want := range []float64{benchR1, benchR2} {
		// Rounding the triads to 0.001 moves the fit by about 0.001 (see benchTol).
		if v, _ := strconv.ParseFloat(m[i+1], 64); math.Abs(v-want) > benchTol {
			t.Errorf("terminal fit to the triads: r%d = %s, want %v ± %v (the ratios they were made with)", i+1, m[i+1], want, benchTol)
		}
	}
	// Each triad plot marks the five measured values of its first triad with circles (and one in
	// the legend), and draws both fits for each of its three triads.
	waitUntil(t, ctx, "the measured and fitted triads plotted", `
		for (const id of ["fig-triads1", "fig-triads2"]) {
			const svg = document.querySelector("#" + id + " svg");
			if (!svg) return "no plot in #" + id;
			const circles = svg.querySelectorAll("circle").length, lines = svg.querySelectorAll("path[stroke-dasharray='7 4']").length;
			if (circles !== 6 || lines < 3) return "#" + id + ": " + circles + " circles, " + lines + " dashed lines";
		}
		return "";`, stepTimeout)
	w.check(t, "comparing the models")

	// A cell that is not a number is marked and not saved.
	setInput(t, ctx, "triad-table-r1-A111", "0,4x")
	waitUntil(t, ctx, "the bad triad cell to be marked", `
		const c = document.getElementById("triad-table-r1-A111");
		const m = document.getElementById(c.getAttribute("aria-describedby") || "");
		return c.getAttribute("aria-invalid") === "true" && m && /0,4x/.test(m.textContent) ? "" : "not marked";`, stepTimeout)

	// Simulated chains: DPn 50, 2000 chains, at the starting feed of step 3.
	setSelect(t, ctx, "sim-kind", "dpn")
	setInput(t, ctx, "sim-n", "50")
	setInput(t, ctx, "sim-count", "2000")
	setInput(t, ctx, "sim-conversion", "0")
	click(t, ctx, "sim-run")
	waitUntil(t, ctx, "the chain-composition histogram", `
		const s = document.getElementById("sim-status").textContent;
		if (!/^2000 chains/.test(s)) return "#sim-status: " + JSON.stringify(s);
		const bars = document.querySelectorAll("#fig-sim-hist svg rect[fill='#0f6e68']").length;
		if (bars < 5) return bars + " bars";
		return /Stockmayer/.test(document.querySelector("#fig-sim-hist svg").textContent) ? "" : "no Stockmayer curve in the legend";`, stepTimeout)
	f10 := evalJS[string](t, ctx, `document.getElementById("f10").value`)
	f1, err := strconv.ParseFloat(f10, 64)
	if err != nil {
		t.Fatalf("#f10 = %q", f10)
	}
	summary := evalJS[string](t, ctx, `document.getElementById("sim-summary").textContent`)
	mm := regexp.MustCompile(`mean ([0-9.]+) over chains`).FindStringSubmatch(summary)
	// 2000 chains of about 50 units: the mean composition lies within 0.01 of the Mayo–Lewis F1
	// (its standard error is about 0.002; common practice, no source).
	if mm == nil {
		t.Errorf("#sim-summary = %q; want the mean chain composition", summary)
	} else if v, _ := strconv.ParseFloat(mm[1], 64); math.Abs(v-mayoLewis(styreneR1, acrylR2, f1)) > 0.01 {
		t.Errorf("mean chain composition %v at f10 = %v; want the Mayo–Lewis F1 = %.4f ± 0.01", v, f1, mayoLewis(styreneR1, acrylR2, f1))
	}
	w.check(t, "simulating chains")

	// Chain size: two classes at 10 000 and 30 000 g/mol, equal weight fractions.
	setSelect(t, ctx, "size-kind", "bins")
	setSelect(t, ctx, "size-basis", "weightFraction")
	click(t, ctx, "size-add")
	click(t, ctx, "size-add")
	for _, c := range [][2]string{{"r0-low", "5000"}, {"r0-high", "15000"}, {"r0-fraction", "0,5"}, {"r1-low", "25000"}, {"r1-high", "35000"}, {"r1-fraction", "0,5"}} {
		setInput(t, ctx, "size-table-"+c[0], c[1])
	}
	checkAverages(t, ctx, "after entering the classes")
	storedProject(t, ctx, "the triads and the classes to be saved", `
		const t = p.triads || [], b = p.sizeBins || [];
		if (t.length !== 5) return t.length + " triad rows stored";
		if (Math.abs(t[1].A111 - `+fmt.Sprint(round3(terminalTriads(benchR1, benchR2, triadFeeds[1])[2]))+`) > 1e-12) return "row 2 A111 stored as " + t[1].A111;
		if (b.length !== 2 || b[0].low !== 5000 || b[1].weightFraction !== 0.5) return "sizeBins: " + JSON.stringify(b);
		return p.model && p.model.kind === "terminal" ? "" : "model: " + JSON.stringify(p.model);`)
	w.check(t, "entering the size classes")

	// Reload: triads (the bad cell back at its stored value), classes and model come back.
	run(t, ctx, "reload", chromedp.Reload())
	waitReady(t, ctx)
	waitUntil(t, ctx, "the triads and classes after a reload", fmt.Sprintf(`
		const v = (id) => (document.getElementById(id) || {value: "(none)"}).value;
		const rows = document.querySelectorAll("#triad-table tbody tr[data-row]").length;
		if (rows !== 5) return rows + " triad rows";
		if (Math.abs(Number(v("triad-table-r1-A111")) - %v) > 1e-12) return "row 2 A111 = " + v("triad-table-r1-A111");
		if (Number(v("triad-table-r4-f10")) !== 0.8) return "row 5 f10 = " + v("triad-table-r4-f10");
		if (v("size-table-r0-low") !== "5000" || v("size-table-r1-high") !== "35000") return "classes: " + v("size-table-r0-low") + ", " + v("size-table-r1-high");
		return document.getElementById("model-kind").value === "terminal" ? "" : "model " + document.getElementById("model-kind").value;`,
		round3(terminalTriads(benchR1, benchR2, triadFeeds[1])[2])), stepTimeout)
	checkAverages(t, ctx, "after a reload")
	waitText(t, ctx, "disc-status", "do not support a penultimate effect")
	checkNoFatalBanner(t, ctx)
	w.check(t, "reloading the page")
}

// round3 rounds to three decimals, as triadBlock writes the values.
func round3(v float64) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'f', 3, 64), 64)
	return r
}

// compositionCurve returns the points of the composition curve in #fig-composition, in pixels.
func compositionCurve(t *testing.T, ctx context.Context) [][2]float64 {
	t.Helper()
	d := evalJS[string](t, ctx, `(document.querySelector('#fig-composition svg path[data-role="F1"]') || {getAttribute: () => ""}).getAttribute("d")`)
	pts := pathPoints(d)
	if len(pts) < 50 {
		t.Fatalf("the composition curve has %d points (d = %.80q…)", len(pts), d)
	}
	return pts
}

// pathPoints reads the points of an SVG path made of M and L commands.
func pathPoints(d string) [][2]float64 {
	var pts [][2]float64
	for _, m := range regexp.MustCompile(`[ML]\s*(-?[0-9.]+),(-?[0-9.]+)`).FindAllStringSubmatch(d, -1) {
		x, _ := strconv.ParseFloat(m[1], 64)
		y, _ := strconv.ParseFloat(m[2], 64)
		pts = append(pts, [2]float64{x, y})
	}
	return pts
}

// crossing returns the feed f1 at which the curve crosses the diagonal F1 = f1 inside (0, 1),
// read against the drawn diagonal, whose ends are (0, 0) and (1, 1).
func crossing(t *testing.T, ctx context.Context, curve [][2]float64) float64 {
	t.Helper()
	diag := pathPoints(evalJS[string](t, ctx, `(document.querySelector('#fig-composition svg path[data-role="diagonal"]') || {getAttribute: () => ""}).getAttribute("d")`))
	if len(diag) != 2 {
		t.Fatalf("the diagonal has %d points, want 2", len(diag))
	}
	x0, y0, x1, y1 := diag[0][0], diag[0][1], diag[1][0], diag[1][1]
	// g is the curve's height above the diagonal in data units of F1 at the point's feed.
	g := func(p [2]float64) (f, above float64) {
		f = (p[0] - x0) / (x1 - x0)
		return f, (p[1]-y0)/(y1-y0) - f
	}
	for i := 1; i < len(curve); i++ {
		fa, ga := g(curve[i-1])
		fb, gb := g(curve[i])
		if fa > 0.01 && fb < 0.99 && ga*gb < 0 {
			return fa + (fb-fa)*ga/(ga-gb)
		}
	}
	t.Fatal("the composition curve does not cross the diagonal inside (0, 1)")
	return math.NaN()
}

// checkAverages waits until the chain-size panel shows Mn and Mw of the two classes.
func checkAverages(t *testing.T, ctx context.Context, when string) {
	t.Helper()
	waitUntil(t, ctx, "Mn and Mw "+when, fmt.Sprintf(`
		const num = (k) => { const e = document.querySelector('#size-out [data-key="' + k + '"]'); return e && e.checkVisibility() ? Number(e.textContent.replace(/[^0-9.]/g, "")) : NaN; };
		const mn = num("Mn"), mw = num("Mw");
		return mn === %v && mw === %v ? "" : "Mn " + mn + ", Mw " + mw + "; " + document.getElementById("size-status").textContent;`, wantMn, wantMw), stepTimeout)
}
