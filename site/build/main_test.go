package main

import (
	"bytes"
	"compress/gzip"
	"crypto/sha256"
	"encoding/base64"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"
)

var (
	cspRe    = regexp.MustCompile(`<meta http-equiv="Content-Security-Policy" content="([^"]*)">`)
	scriptRe = regexp.MustCompile(`(?s)<script>(.*?)</script>`)
	styleRe  = regexp.MustCompile(`(?s)<style>(.*?)</style>`)
	dataRe   = regexp.MustCompile(`<script type="application/octet-stream" id="copoly-wasm" data-encoding="gzip\+text7" data-bytes="(\d+)" data-gzip-bytes="(\d+)">([^<\x00\r]*)</script>`)
	// anyScript finds every script element, executable or not, to blank out code before
	// looking at the markup.
	anyScript = regexp.MustCompile(`(?s)<script[^>]*>.*?</script>|<style>.*?</style>`)
)

// fakeModule is a byte string with the WebAssembly header and incompressible random content.
func fakeModule(n int, seed uint64) []byte {
	r := rand.New(rand.NewPCG(seed, 1))
	b := make([]byte, n)
	copy(b, "\x00asm\x01\x00\x00\x00")
	for i := 8; i < n; i++ {
		b[i] = byte(r.Uint32())
	}
	return b
}

const fakeWasmExec = "\"use strict\";\n(() => { globalThis.Go = class { /* fake wasm_exec for the build test */ }; })();\n"

func sha(s string) string {
	sum := sha256.Sum256([]byte(s))
	return "'sha256-" + base64.StdEncoding.EncodeToString(sum[:]) + "'"
}

// policy parses a CSP into its directives.
func policy(t *testing.T, page string) map[string][]string {
	t.Helper()
	m := cspRe.FindAllStringSubmatch(page, -1)
	if len(m) != 1 {
		t.Fatalf("page has %d CSP meta tags, want 1", len(m))
	}
	out := map[string][]string{}
	for _, d := range strings.Split(m[0][1], ";") {
		f := strings.Fields(d)
		if len(f) == 0 {
			continue
		}
		out[f[0]] = f[1:]
	}
	return out
}

// decodeModule returns the module embedded in page.
func decodeModule(t *testing.T, page string) []byte {
	t.Helper()
	m := dataRe.FindAllStringSubmatch(page, -1)
	if len(m) != 1 {
		t.Fatalf("page has %d module data blocks, want 1", len(m))
	}
	n, _ := strconv.Atoi(m[0][2])
	gz, ok := decodeText7(m[0][3], n)
	if !ok {
		t.Fatalf("module block is not text7 of %d bytes", n)
	}
	zr, err := gzip.NewReader(bytes.NewReader(gz))
	if err != nil {
		t.Fatalf("module block is not gzip: %v", err)
	}
	raw, err := io.ReadAll(zr)
	if err != nil {
		t.Fatalf("module block does not decompress: %v", err)
	}
	return raw
}

// TestBuildSite builds the real page template in site/ around a fake module and checks the
// properties the offline page depends on.
func TestBuildSite(t *testing.T) {
	module := fakeModule(200_000, 1)
	out, err := Build(os.DirFS(".."), []byte(fakeWasmExec), module)
	if err != nil {
		t.Fatalf("Build(site) error: %v", err)
	}
	page := string(out)

	t.Run("module round trip", func(t *testing.T) {
		if got := decodeModule(t, page); !bytes.Equal(got, module) {
			t.Errorf("decoded module: %d bytes differing from the %d input bytes", len(got), len(module))
		}
		if m := dataRe.FindStringSubmatch(page); m[1] != "200000" {
			t.Errorf("data-bytes = %s, want 200000", m[1])
		}
	})

	t.Run("CSP hashes", func(t *testing.T) {
		p := policy(t, page)
		var scripts, styles []string
		for _, m := range scriptRe.FindAllStringSubmatch(page, -1) {
			scripts = append(scripts, sha(m[1]))
		}
		for _, m := range styleRe.FindAllStringSubmatch(page, -1) {
			styles = append(styles, sha(m[1]))
		}
		if len(scripts) != 2 {
			t.Errorf("%d inline scripts, want 2 (wasm_exec.js and the bundle of src/main.js)", len(scripts))
		}
		wantScript := append(slices.Clone(scripts), "'wasm-unsafe-eval'")
		if !slices.Equal(p["script-src"], wantScript) {
			t.Errorf("script-src = %v, want %v", p["script-src"], wantScript)
		}
		if !slices.Equal(p["style-src"], styles) || len(styles) != 1 {
			t.Errorf("style-src = %v, want the one style hash %v", p["style-src"], styles)
		}
		for dir, want := range map[string][]string{
			"default-src": {"'none'"},
			"img-src":     {"data:", "blob:"},
			"connect-src": {"'none'"},
			"form-action": {"'none'"},
			"base-uri":    {"'none'"},
		} {
			if !slices.Equal(p[dir], want) {
				t.Errorf("%s = %v, want %v", dir, p[dir], want)
			}
		}
		if strings.Index(page, "Content-Security-Policy") > strings.Index(page, "<script") {
			t.Error("the CSP meta tag comes after a script")
		}
	})

	t.Run("nothing external", func(t *testing.T) {
		for _, s := range []string{`src="http`, `href="http`, `src='http`, "<link", "@import", "url(http"} {
			if strings.Contains(page, s) {
				t.Errorf("page contains %q", s)
			}
		}
		markup := anyScript.ReplaceAllString(page, "")
		if m := regexp.MustCompile(`(?i)\s(src|href)\s*=`).FindString(markup); m != "" {
			t.Errorf("markup still has a %q attribute", m)
		}
		if m := regexp.MustCompile(`(?i)\s(style|on[a-z]+)\s*=`).FindString(markup); m != "" {
			t.Errorf("markup has a %q attribute, which the CSP blocks", m)
		}
		if !strings.Contains(page, fakeWasmExec) {
			t.Error("wasm_exec.js from -wasmexec is not inlined verbatim")
		}
	})

	t.Run("bundle", func(t *testing.T) {
		scripts := scriptRe.FindAllStringSubmatch(page, -1)
		if len(scripts) != 2 {
			t.Fatalf("%d inline scripts, want 2", len(scripts))
		}
		js := scripts[1][1]
		if !strings.HasPrefix(js, `"use strict";`) {
			t.Errorf("the bundle starts with %q, want the strict-mode directive", js[:min(len(js), 40)])
		}
		for _, p := range bundleProblems(js) {
			t.Error("the bundle: " + p)
		}
		// Every module under src/ is in the bundle: a module nothing imports is a mistake.
		_, modules, err := bundle(os.DirFS(".."), "src/main.js")
		if err != nil {
			t.Fatal(err)
		}
		var want []string
		err = fs.WalkDir(os.DirFS(".."), "src", func(p string, d fs.DirEntry, err error) error {
			if err == nil && !d.IsDir() && strings.HasSuffix(p, ".js") {
				want = append(want, p)
			}
			return err
		})
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(modules, want) {
			t.Errorf("the bundle holds %q, want every module of site/src: %q", modules, want)
		}
	})

	t.Run("stable ids", func(t *testing.T) {
		// The ids the browser test and lab scripts rely on (the page's public surface).
		for _, id := range []string{"r1", "r2", "f10", "conversion", "tolerance", "name1", "name2", "mass1", "mass2",
			"notes", "ratio-source", "out-azeotrope", "out-product", "out-class", "out-limit", "seq-table",
			"storage-status", "fatal-banner", "demo-badge", "copoly-wasm"} {
			if n := strings.Count(page, `id="`+id+`"`); n != 1 {
				t.Errorf(`id="%s" appears %d times, want 1`, id, n)
			}
		}
	})
}

var (
	// importStmt and exportStmt find ES module syntax left in a classic script: an import
	// statement or call, import.meta, or an export (not a name such as importProject).
	// Either starts a statement (at the start of a line, or after ; { } or a space) or, for
	// import( and import.meta, an expression.
	importStmt = regexp.MustCompile(`(?m)((^|[;{}\s])import(\s*[{*"']|\s+[\w$]+\s*(,|from\b))|(^|[^\w$.-])import\s*(\(|\.\s*meta\b))`)
	exportStmt = regexp.MustCompile(`(?m)(^|[;{}\s])export\s*(\{|\*|default\b|const\b|let\b|var\b|function\b|class\b|async\b)`)
	// evalCall finds code made from text, which the CSP refuses.
	evalCall = regexp.MustCompile(`(^|[^\w$.])(eval\s*\(|new\s+Function\s*\()`)
)

// bundleProblems lists what would stop js from running as the page's inline classic script, or
// fetch something: module syntax, a source map reference, code made from text.
func bundleProblems(js string) []string {
	var out []string
	for _, c := range []struct {
		re   *regexp.Regexp
		what string
	}{{importStmt, "an import"}, {exportStmt, "an export"}, {evalCall, "code made from text"}} {
		if m := c.re.FindString(js); m != "" {
			out = append(out, fmt.Sprintf("%s: %q", c.what, m))
		}
	}
	if strings.Contains(js, "sourceMappingURL") || strings.Contains(js, "sourceURL") {
		out = append(out, "a source map or source URL comment")
	}
	return out
}

// TestBundleProblems checks that bundleProblems finds what it looks for and passes names that
// only contain the words.
func TestBundleProblems(t *testing.T) {
	for _, js := range []string{
		`import { a } from "./a.js";`, `import a from "./a.js";`, `import * as a from "./a.js";`, `import "./a.js";`,
		`x = import("./a.js");`, `x = import.meta.url;`, `export const a = 1;`, `export { a };`, `export default a;`,
		`export function f() {}`, `eval("1")`, `x = new Function("return 1")`, "x = 1;\n//# sourceMappingURL=x.js.map",
	} {
		if len(bundleProblems(js)) == 0 {
			t.Errorf("bundleProblems(%q) found nothing", js)
		}
	}
	for _, js := range []string{`c.importProject({json});`, `c.exportProject({project});`, `const exported = 1;`, `x.eval = 1;`,
		`"import and export"`, `$("#bench-import")`, `"#import-file"`, `"Import project"`} {
		if p := bundleProblems(js); len(p) != 0 {
			t.Errorf("bundleProblems(%q) = %q, want nothing", js, p)
		}
	}
}

// TestBuildOnlyModuleDiffers checks that two pages built around different modules are the same
// apart from the embedded module, so the load-time comparison with a bare module is fair.
func TestBuildOnlyModuleDiffers(t *testing.T) {
	a, err := Build(os.DirFS(".."), []byte(fakeWasmExec), fakeModule(5000, 2))
	if err != nil {
		t.Fatal(err)
	}
	b, err := Build(os.DirFS(".."), []byte(fakeWasmExec), fakeModule(900, 3))
	if err != nil {
		t.Fatal(err)
	}
	if bytes.Equal(a, b) {
		t.Fatal("pages around different modules are identical")
	}
	strip := func(p []byte) string { return dataRe.ReplaceAllString(string(p), "MODULE") }
	if strip(a) != strip(b) {
		t.Error("pages around different modules differ outside the module block")
	}
}

// TestBuildRejects checks that templates the CSP or the offline rule would break fail the build.
func TestBuildRejects(t *testing.T) {
	const good = `<!doctype html><html><head><!-- copoly:csp --><link rel="stylesheet" href="s.css"></head>` +
		`<body><!-- copoly:module --><script src="wasm_exec.js"></script><script src="a.js"></script></body></html>`
	module := fakeModule(100, 4)
	files := func(html, js string) fstest.MapFS {
		return fstest.MapFS{
			"index.html":  {Data: []byte(html)},
			"s.css":       {Data: []byte("body{margin:0}")},
			"a.js":        {Data: []byte(js)},
			"src/main.js": {Data: []byte(`import { b } from "./b.js"; b();`)},
			"src/b.js":    {Data: []byte(`export function b() { document.title = "b"; }`)},
		}
	}
	withModule := strings.Replace(good, "</body>", `<script type="module" src="src/main.js"></script></body>`, 1)
	page, err := Build(files(withModule, "let a = 1;"), []byte(fakeWasmExec), module)
	if err != nil {
		t.Fatalf("Build(template with a module) error: %v", err)
	}
	if scripts := scriptRe.FindAllStringSubmatch(string(page), -1); len(scripts) != 3 || !strings.Contains(scripts[2][1], `document.title="b"`) {
		t.Errorf("the module entry is not bundled with its import: %q", scripts)
	}
	if _, err := Build(files(good, "let a = 1;"), []byte(fakeWasmExec), module); err != nil {
		t.Fatalf("Build(good template) error: %v", err)
	}
	tests := []struct {
		name   string
		html   string
		js     string
		module []byte
	}{
		{"external script", strings.Replace(good, "</body>", `<script src="https://example.org/x.js"></script></body>`, 1), "", module},
		{"external image", strings.Replace(good, "</body>", `<img src="http://example.org/x.png"></body>`, 1), "", module},
		{"external stylesheet", strings.Replace(good, "</head>", `<link rel="stylesheet" href="https://example.org/x.css"></head>`, 1), "", module},
		{"inline script", strings.Replace(good, "</body>", `<script>alert(1)</script></body>`, 1), "", module},
		{"inline style element", strings.Replace(good, "</head>", `<style>p{}</style></head>`, 1), "", module},
		{"style attribute", strings.Replace(good, "<body>", `<body style="color:red">`, 1), "", module},
		{"event handler attribute", strings.Replace(good, "<body>", `<body onload="go()">`, 1), "", module},
		{"missing CSP marker", strings.Replace(good, "<!-- copoly:csp -->", "", 1), "", module},
		{"missing module marker", strings.Replace(good, "<!-- copoly:module -->", "", 1), "", module},
		{"CSP marker after script", strings.Replace(strings.Replace(good, "<!-- copoly:csp -->", "", 1), "</body>", "<!-- copoly:csp --></body>", 1), "", module},
		{"missing js file", strings.Replace(good, "a.js", "b.js", 1), "", module},
		{"script closes early", good, `let s = "</script><p>";`, module},
		{"comment opener in script", good, `let s = "<!--";`, module},
		{"not a wasm module", good, "", []byte("hello, not wasm")},
		{"missing module entry", strings.Replace(withModule, "src/main.js", "src/none.js", 1), "", module},
		{"module entry outside the site", strings.Replace(withModule, "src/main.js", "../main.js", 1), "", module},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if _, err := Build(files(tc.html, tc.js), []byte(fakeWasmExec), tc.module); err == nil {
				t.Errorf("Build succeeded, want an error")
			}
		})
	}
	// Modules that import what the page must not bundle, or do not parse.
	for name, src := range map[string]string{
		"a package":             `import { x } from "some-package"; x();`,
		"a URL":                 `import { x } from "https://example.org/x.js"; x();`,
		"a file outside":        `import { x } from "../../x.js"; x();`,
		"a missing file":        `import { x } from "./none.js"; x();`,
		"a file that is not js": `import x from "./s.css"; x();`,
		"a syntax error":        `import { b } from "./b.js"; b(;`,
		"a closing script tag":  `import { b } from "./b.js"; b(); /` + `</script>/;`,
	} {
		t.Run("module importing "+name, func(t *testing.T) {
			fsys := files(withModule, "")
			fsys["src/main.js"] = &fstest.MapFile{Data: []byte(src)}
			if _, err := Build(fsys, []byte(fakeWasmExec), module); err == nil {
				t.Errorf("Build succeeded, want an error")
			}
		})
	}
}
