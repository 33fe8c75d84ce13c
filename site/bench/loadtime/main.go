//go:build !js

// Command loadtime measures, in headless Chromium, how long copoly's offline page takes from the
// start of navigation to window.copolyReady, against the same page built around a bare Go module
// (site/bench/hello), in one browser run. make bench runs it through site/bench.sh:
//
//	go run ./site/bench/loadtime -page dist/copoly.html -hello dist/bench/hello.html -n 7
//
// Each load opens a new tab on the file:// URL. The times are the page's own clock
// (performance.now(), milliseconds since the navigation started):
//
//   - copoly: when window.copolyReady resolves. A script injected before the page's own scripts
//     turns the window.copolyReady property into a setter that attaches the timing reaction
//     first, so the time is that of the resolution and not of the moment the test asks.
//   - hello: window.copolyHelloReadyAt, set by the bare module as its main function starts.
//
// Loads alternate between the two pages after one discarded warm-up load of each, so a drift
// of the machine's speed affects both alike. The program prints the median, minimum and maximum
// of each, the page's own performance marks (module decoded, instantiated) where present, and
// the ratio of the medians against the budget. A measurement is never a test: the program exits
// 0 whether or not the budget holds, and 1 only when it cannot measure.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"net/url"
	"os"
	"path/filepath"
	"slices"
	"time"

	"github.com/chromedp/cdproto/browser"
	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"

	"copoly/site/internal/headless"
)

// readyHook runs in every new document before the page's scripts. It records when the promise
// assigned to window.copolyReady settles, in window.__benchReadyAt (or __benchReadyError).
const readyHook = `(() => {
	let p;
	Object.defineProperty(window, "copolyReady", {
		configurable: true,
		enumerable: true,
		get() { return p; },
		set(v) {
			p = v;
			Promise.resolve(v).then(
				() => { window.__benchReadyAt = performance.now(); },
				(e) => { window.__benchReadyError = String(e && e.message || e); });
		},
	});
})();`

// Expressions that return the ready time in ms, or null while not ready; they throw when the
// page reports a failure.
const (
	copolyReadyExpr = `(() => {
		if (window.__benchReadyError) throw new Error("copolyReady rejected: " + window.__benchReadyError);
		return typeof window.__benchReadyAt === "number" ? window.__benchReadyAt : null;
	})()`
	helloReadyExpr = `typeof window.copolyHelloReadyAt === "number" ? window.copolyHelloReadyAt : null`
	// marksExpr reads the page's own start-up marks (site/src/loader.js, storage.js); absent marks are -1.
	marksExpr = `["copoly:start", "copoly:decoded", "copoly:instantiated", "copoly:running", "copoly:loaded"].map(n => {
		const m = performance.getEntriesByName(n, "mark")[0];
		return m ? m.startTime : -1;
	})`
)

// sample is one load: the ready time and the page's marks, in ms since navigation start.
type sample struct {
	ready                                         float64
	start, decoded, instantiated, running, loaded float64
}

type target struct {
	name  string
	path  string
	url   string
	ready string // expression giving the ready time
	hook  bool   // inject readyHook
	runs  []sample
}

func main() {
	var (
		pagePath  = flag.String("page", "dist/copoly.html", "the copoly page")
		helloPath = flag.String("hello", "dist/bench/hello.html", "the same page around the bare Go module")
		n         = flag.Int("n", 7, "measured loads of each page (after one warm-up load each)")
		budget    = flag.Float64("budget", 1.5, "largest acceptable ratio of the median load times, copoly/hello")
		chromium  = flag.String("chromium", "", "Chromium executable (default /usr/bin/chromium, else chromium on PATH)")
		timeout   = flag.Duration("timeout", 60*time.Second, "longest wait for one page to become ready")
	)
	flag.Parse()
	if err := run(*pagePath, *helloPath, *n, *budget, *chromium, *timeout, os.Stdout); err != nil {
		fmt.Fprintln(os.Stderr, "loadtime:", err)
		os.Exit(1)
	}
}

func run(pagePath, helloPath string, n int, budget float64, chromium string, timeout time.Duration, w io.Writer) error {
	if n < 1 {
		return errors.New("-n must be at least 1")
	}
	if chromium == "" {
		chromium = headless.Chromium()
		if chromium == "" {
			return errors.New("no Chromium: neither /usr/bin/chromium nor chromium on PATH (apt-get install -y chromium)")
		}
	}
	copoly, err := newTarget("copoly", pagePath, copolyReadyExpr, true)
	if err != nil {
		return err
	}
	hello, err := newTarget("hello", helloPath, helloReadyExpr, false)
	if err != nil {
		return err
	}

	profile, err := os.MkdirTemp("", "copoly-loadtime-")
	if err != nil {
		return err
	}
	defer os.RemoveAll(profile)
	allocCtx, cancelAlloc := chromedp.NewExecAllocator(context.Background(), headless.Options(chromium, profile)...)
	defer cancelAlloc()
	browserCtx, cancelBrowser := chromedp.NewContext(allocCtx)
	defer cancelBrowser()
	version, err := chromedp.Run(browserCtx, func(ctx context.Context, _ *chromedp.Target) (browser.GetVersionResult, error) {
		return cdp.Call(ctx, chromedp.FromContext(ctx).Browser, browser.GetVersion, cdp.Empty{})
	})
	if err != nil {
		return fmt.Errorf("starting %s: %w", chromium, err)
	}

	for i := -1; i < n; i++ { // i = -1 is the warm-up
		for _, t := range []*target{copoly, hello} {
			s, err := load(browserCtx, t, timeout)
			if err != nil {
				return fmt.Errorf("%s load %d: %w", t.path, i+2, err)
			}
			if i >= 0 {
				t.runs = append(t.runs, s)
			}
		}
	}

	fmt.Fprintf(w, "Load time from navigation start to the ready signal, %s headless, no GPU.\n", version.Product)
	fmt.Fprintf(w, "%d loads of each page, alternating, after one warm-up each; a new tab per load.\n\n", n)
	fmt.Fprintf(w, "%-22s %9s | %-25s | %s\n", "", "", "ready signal, ms", "medians of the page's marks, ms")
	fmt.Fprintf(w, "%-22s %9s | %7s %8s %8s | %7s %8s %13s %8s %8s\n", "page", "bytes", "median", "min", "max", "start", "decoded", "instantiated", "running", "loaded")
	for _, t := range []*target{copoly, hello} {
		fi, err := os.Stat(t.path)
		if err != nil {
			return err
		}
		ready := column(t.runs, func(s sample) float64 { return s.ready })
		fmt.Fprintf(w, "%-22s %9d | %7.1f %8.1f %8.1f | %7s %8s %13s %8s %8s\n", t.path, fi.Size(),
			median(ready), slices.Min(ready), slices.Max(ready),
			markMedian(t.runs, func(s sample) float64 { return s.start }),
			markMedian(t.runs, func(s sample) float64 { return s.decoded }),
			markMedian(t.runs, func(s sample) float64 { return s.instantiated }),
			markMedian(t.runs, func(s sample) float64 { return s.running }),
			markMedian(t.runs, func(s sample) float64 { return s.loaded }))
	}
	ratio := median(column(copoly.runs, func(s sample) float64 { return s.ready })) /
		median(column(hello.runs, func(s sample) float64 { return s.ready }))
	verdict := "HOLDS"
	if ratio > budget {
		verdict = "EXCEEDED"
	}
	fmt.Fprintf(w, "\nratio of medians copoly/hello: %.2f; budget %.2fx: %s\n", ratio, budget, verdict)
	fmt.Fprintln(w, "hello is the same page around a bare Go module; its ready signal is the start of its main.")
	fmt.Fprintln(w, "copoly's is window.copolyReady: module running, project loaded, first results drawn.")
	fmt.Fprintln(w, "Marks (site/src/loader.js, storage.js): start = decoding begins, decoded = module unzipped, instantiated, running = window.copoly registered, loaded = project read from storage.")
	return nil
}

func newTarget(name, path, ready string, hook bool) (*target, error) {
	abs, err := filepath.Abs(path)
	if err != nil {
		return nil, err
	}
	if _, err := os.Stat(abs); err != nil {
		return nil, err
	}
	return &target{name: name, path: path, url: (&url.URL{Scheme: "file", Path: abs}).String(), ready: ready, hook: hook}, nil
}

// load opens t in a new tab and waits for its ready signal.
func load(browserCtx context.Context, t *target, timeout time.Duration) (sample, error) {
	tab, cancelTab := chromedp.NewContext(browserCtx)
	defer cancelTab()
	// The first Run on the tab creates it; it must not carry the timeout (see chromedp.Run).
	if err := chromedp.Do(tab, chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		if !t.hook {
			return nil
		}
		_, err := cdp.Call(ctx, tg, page.AddScriptToEvaluateOnNewDocument, page.AddScriptToEvaluateOnNewDocumentParams{Source: readyHook})
		return err
	})); err != nil {
		return sample{}, err
	}
	ctx, cancel := context.WithTimeout(tab, timeout)
	defer cancel()
	if err := chromedp.Do(ctx, chromedp.Navigate(t.url)); err != nil {
		return sample{}, err
	}
	var s sample
	for {
		v, err := chromedp.Run(ctx, chromedp.Evaluate[*float64](t.ready))
		if err != nil {
			return sample{}, err
		}
		if v != nil {
			s.ready = *v
			break
		}
		if err := chromedp.Do(ctx, chromedp.Sleep(20*time.Millisecond)); err != nil {
			return sample{}, fmt.Errorf("no ready signal: %w", err)
		}
	}
	marks, err := chromedp.Run(ctx, chromedp.Evaluate[[]float64](marksExpr))
	if err != nil {
		return sample{}, err
	}
	if len(marks) != 5 {
		return sample{}, fmt.Errorf("performance marks: got %v", marks)
	}
	s.start, s.decoded, s.instantiated, s.running, s.loaded = marks[0], marks[1], marks[2], marks[3], marks[4]
	return s, nil
}

func column(runs []sample, f func(sample) float64) []float64 {
	out := make([]float64, len(runs))
	for i, s := range runs {
		out[i] = f(s)
	}
	return out
}

func median(xs []float64) float64 {
	s := slices.Clone(xs)
	slices.Sort(s)
	m := len(s) / 2
	if len(s)%2 == 1 {
		return s[m]
	}
	return (s[m-1] + s[m]) / 2
}

// markMedian is the median of a performance mark, or "-" when the page did not set it.
func markMedian(runs []sample, f func(sample) float64) string {
	xs := column(runs, f)
	if slices.Min(xs) < 0 {
		return "-"
	}
	return fmt.Sprintf("%.1f", median(xs))
}
