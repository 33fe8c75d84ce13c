//go:build !js

package browsertest

import (
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// slowFirstCurve makes the module answer the next composition curve (101 feeds, as steps 2 and 6
// ask for) only after slowAnswer, as a module running in a Web Worker may answer late; every
// other call is answered at once. window.__slowAnswered turns true when the late answer arrives.
const slowFirstCurve = `(() => {
	const c = window.copoly, real = c.composition;
	let slowed = false;
	window.__slowAnswered = false;
	c.composition = function (a) {
		const r = real.call(this, a);
		if (slowed || !a || !Array.isArray(a.f1) || a.f1.length !== 101) return r;
		slowed = true;
		return new Promise((resolve) => setTimeout(() => { window.__slowAnswered = true; resolve(r); }, 1500));
	};
	return true;
})()`

// TestBrowserNewerAnswerWins types r2 and then r1 while the module's answer to the first edit
// comes late, after the answer to the second: the page must show and save the second edit and
// drop the late answer, never drawing the older ratios over the newer ones.
func TestBrowserNewerAnswerWins(t *testing.T) {
	ctx, w, _ := openPage(t, "")
	waitAllDrawn(t, ctx)
	evalJS[bool](t, ctx, slowFirstCurve)

	// The demo's r1 with r2 = 0.04 is answered late; 0.40 with 0.04 at once.
	setInput(t, ctx, "r2", "0.04")
	setInput(t, ctx, "r1", "0.40")
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	waitUntil(t, ctx, "the late answer to the first edit", `return window.__slowAnswered ? "" : "not yet";`, stepTimeout)
	// Give the page a moment to draw the late answer, were it to.
	run(t, ctx, "wait after the late answer", chromedp.Sleep(200*time.Millisecond))
	waitText(t, ctx, "out-azeotrope", wantAzeotrope)
	checkSequenceTable(t, ctx, styreneR1, acrylR2)
	waitSaved(t, ctx)
	if got := storedRatios(t, ctx); got != ratios(styreneR1, acrylR2) {
		t.Errorf("stored ratios after the late answer = %s, want the second edit's %s", got, ratios(styreneR1, acrylR2))
	}
	w.check(t, "typing while an answer comes late")
}
