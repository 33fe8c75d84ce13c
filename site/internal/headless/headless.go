//go:build !js

// Package headless finds Debian's Chromium and gives the options copoly's browser tests
// (site/browsertest) and load-time bench (site/bench/loadtime) start it with, so that both
// measure and test the same browser set up the same way.
package headless

import (
	"os"
	"os/exec"

	"github.com/chromedp/chromedp"
)

// Chromium returns the Chromium executable: /usr/bin/chromium (Debian's package), else chromium
// on PATH, else "".
func Chromium() string {
	if fi, err := os.Stat("/usr/bin/chromium"); err == nil && !fi.IsDir() && fi.Mode()&0o111 != 0 {
		return "/usr/bin/chromium"
	}
	if p, err := exec.LookPath("chromium"); err == nil {
		return p
	}
	return ""
}

// Options starts chromium headless, with no sandbox (CI runs as root) and no GPU, in the
// profile directory given, with a 1280×1000 window, and with the background work that would
// make a run slower or noisier (updates, sync, extensions, default apps) turned off.
func Options(chromium, profile string) []chromedp.ExecAllocatorOption {
	return []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(chromium),
		chromedp.Headless,
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.NoFirstRun,
		chromedp.NoDefaultBrowserCheck,
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-extensions", true),
		chromedp.Flag("disable-default-apps", true),
		chromedp.Flag("disable-dev-shm-usage", true),
		chromedp.WindowSize(1280, 1000),
		chromedp.UserDataDir(profile),
	}
}
