// Command build writes copoly's offline page: one self-contained HTML file that opens from
// file:// with no network and no other file beside it.
//
// Usage (from the repository root; `make site` runs the first form):
//
//	go run ./site/build -wasm dist/copoly.wasm -wasmexec dist/wasm_exec.js -o dist/copoly.html
//
// The page template is site/index.html. Every `<link rel="stylesheet" href="NAME">` becomes an
// inline <style> and every `<script src="NAME"></script>` an inline <script>, both read from the
// -src directory, except wasm_exec.js, which is read from -wasmexec because it must come from the
// toolchain that built the module. A `<script type="module" src="PATH"></script>` names the entry
// of the page's ES modules (site/src/main.js): esbuild bundles it and everything it imports into
// one classic script, an immediately invoked function (bundle.go), inlined in its place. The module itself is compressed with gzip (best compression),
// encoded as text with our 7-bit encoding (text7.go; 8/7 of the bytes, against 4/3 for base64)
// and placed in a non-executable data block
//
//	<script type="application/octet-stream" id="copoly-wasm" data-encoding="gzip+text7"
//	        data-bytes="N" data-gzip-bytes="G">…</script>
//
// at the `<!-- copoly:module -->` marker; the page decodes the text, decompresses it with
// DecompressionStream("gzip") and instantiates it. At the
// `<!-- copoly:csp -->` marker the tool writes a Content-Security-Policy meta tag that allows
// exactly the inline scripts and styles it wrote, by SHA-256 hash, and nothing from anywhere else.
//
// The page is the same for any module: site/bench.sh wraps a bare Go module (site/bench/hello)
// with this tool to compare load times, and the two pages differ only in the data block.
package main

import (
	"bytes"
	"compress/gzip"
	"crypto/sha256"
	"encoding/base64"
	"errors"
	"flag"
	"fmt"
	"io/fs"
	"os"
	"regexp"
	"strings"
)

// Markers in the template that the build replaces.
const (
	cspMarker    = "<!-- copoly:csp -->"
	moduleMarker = "<!-- copoly:module -->"
)

// wasmExecName is the script name in the template that is taken from the toolchain (-wasmexec)
// rather than from the -src directory.
const wasmExecName = "wasm_exec.js"

var (
	// styleLink matches the only accepted form of a stylesheet reference in the template.
	styleLink = regexp.MustCompile(`<link rel="stylesheet" href="([A-Za-z0-9_.-]+\.css)">`)
	// scriptRef matches the only accepted form of a classic script reference in the template.
	scriptRef = regexp.MustCompile(`<script src="([A-Za-z0-9_.-]+\.js)"></script>`)
	// moduleRef matches the only accepted form of an ES module entry in the template.
	moduleRef = regexp.MustCompile(`<script type="module" src="((?:[A-Za-z0-9_-]+/)*[A-Za-z0-9_.-]+\.js)"></script>`)
	// closeScript and closeStyle find text that would end an inline element early.
	closeScript = regexp.MustCompile(`(?i)</script|<!--`)
	closeStyle  = regexp.MustCompile(`(?i)</style`)
	// external finds any attribute that could still load something after inlining.
	external = regexp.MustCompile(`(?i)\s(src|href|srcset|action|formaction|poster|data|xlink:href)\s*=\s*["']?[^"'\s>]`)
	// inlineAttr finds attributes the CSP would block.
	inlineAttr = regexp.MustCompile(`(?i)\s(style|on[a-z]+)\s*=`)
)

func main() {
	var (
		src      = flag.String("src", "site", "directory holding index.html and the files it names")
		wasmPath = flag.String("wasm", "dist/copoly.wasm", "the WebAssembly module to embed (read only)")
		execPath = flag.String("wasmexec", "dist/wasm_exec.js", "wasm_exec.js from the toolchain that built -wasm")
		out      = flag.String("o", "dist/copoly.html", "the page to write")
	)
	flag.Parse()
	if err := run(*src, *wasmPath, *execPath, *out); err != nil {
		fmt.Fprintln(os.Stderr, "site/build:", err)
		os.Exit(1)
	}
}

func run(src, wasmPath, execPath, out string) error {
	module, err := os.ReadFile(wasmPath)
	if err != nil {
		return err
	}
	wasmExec, err := os.ReadFile(execPath)
	if err != nil {
		return err
	}
	page, err := Build(os.DirFS(src), wasmExec, module)
	if err != nil {
		return err
	}
	if err := os.WriteFile(out, page, 0o644); err != nil {
		return err
	}
	fmt.Printf("wrote %s: %d bytes (module %d bytes raw)\n", out, len(page), len(module))
	return nil
}

// Build returns the offline page: the template index.html from site with its stylesheets and
// classic scripts inlined (indentation and comment lines removed, see trimCode), its ES modules
// bundled into one script (see bundle), wasmExec inlined in place of wasm_exec.js, module
// embedded as gzip+text7, and a Content-Security-Policy that allows exactly the inlined code by
// hash.
func Build(site fs.FS, wasmExec, module []byte) ([]byte, error) {
	tmpl, err := fs.ReadFile(site, "index.html")
	if err != nil {
		return nil, err
	}
	html := string(tmpl)
	for _, m := range []string{cspMarker, moduleMarker} {
		if n := strings.Count(html, m); n != 1 {
			return nil, fmt.Errorf("index.html: marker %s appears %d times, want 1", m, n)
		}
	}
	if !strings.Contains(html, `<script src="`+wasmExecName+`"></script>`) {
		return nil, fmt.Errorf("index.html: no <script src=%q></script>", wasmExecName)
	}
	if err := checkTemplate(html); err != nil {
		return nil, err
	}

	var styleHashes, scriptHashes []string
	var inlineErr error
	html = styleLink.ReplaceAllStringFunc(html, func(tag string) string {
		name := styleLink.FindStringSubmatch(tag)[1]
		css, err := fs.ReadFile(site, name)
		if err != nil {
			inlineErr = errors.Join(inlineErr, err)
			return ""
		}
		css = trimCode(css, true)
		if closeStyle.Match(css) {
			inlineErr = errors.Join(inlineErr, fmt.Errorf("%s contains </style", name))
		}
		styleHashes = append(styleHashes, hash(css))
		return "<style>" + string(css) + "</style>"
	})
	html = scriptRef.ReplaceAllStringFunc(html, func(tag string) string {
		name := scriptRef.FindStringSubmatch(tag)[1]
		var (
			js  []byte
			err error
		)
		if name == wasmExecName {
			js = wasmExec
		} else if js, err = fs.ReadFile(site, name); err == nil {
			js = trimCode(js, false)
		}
		if err != nil {
			inlineErr = errors.Join(inlineErr, err)
			return ""
		}
		if closeScript.Match(js) {
			inlineErr = errors.Join(inlineErr, fmt.Errorf("%s contains </script or <!-- , which would end or confuse an inline script", name))
		}
		scriptHashes = append(scriptHashes, hash(js))
		return "<script>" + string(js) + "</script>"
	})
	html = moduleRef.ReplaceAllStringFunc(html, func(tag string) string {
		entry := moduleRef.FindStringSubmatch(tag)[1]
		js, _, err := bundle(site, entry)
		if err != nil {
			inlineErr = errors.Join(inlineErr, err)
			return ""
		}
		if closeScript.Match(js) {
			inlineErr = errors.Join(inlineErr, fmt.Errorf("the bundle of %s contains </script or <!-- , which would end or confuse an inline script", entry))
		}
		scriptHashes = append(scriptHashes, hash(js))
		return "<script>" + string(js) + "</script>"
	})
	if inlineErr != nil {
		return nil, inlineErr
	}
	data, err := embedModule(module)
	if err != nil {
		return nil, err
	}
	html = strings.Replace(html, cspMarker, cspTag(scriptHashes, styleHashes), 1)
	html = strings.Replace(html, moduleMarker, data, 1)
	return []byte(html), nil
}

// checkTemplate rejects a template that would load anything from outside the page or hold code
// the CSP would block: all code must sit in the linked .css and .js files and the ES modules,
// which the build inlines (or bundles) and hashes.
func checkTemplate(html string) error {
	csp := strings.Index(html, cspMarker)
	for _, tag := range []string{"<link", "<script", "<style"} {
		if i := strings.Index(html, tag); i >= 0 && i < csp {
			return errors.New("index.html: the CSP marker must come before every <link>, <script> and <style>")
		}
	}
	rest := styleLink.ReplaceAllString(html, "")
	rest = scriptRef.ReplaceAllString(rest, "")
	rest = moduleRef.ReplaceAllString(rest, "")
	lower := strings.ToLower(rest)
	for _, tag := range []string{"<link", "<script", "<style", "<iframe", "<object", "<embed", "<base"} {
		if strings.Contains(lower, tag) {
			return fmt.Errorf("index.html: %s… is not allowed; use a linked .css or .js file of the form the build inlines", tag)
		}
	}
	if loc := external.FindStringIndex(rest); loc != nil {
		return fmt.Errorf("index.html: %q would load something from outside the page", rest[loc[0]:min(loc[1]+40, len(rest))])
	}
	if loc := inlineAttr.FindStringIndex(rest); loc != nil {
		return fmt.Errorf("index.html: %q: style= and on…= attributes are blocked by the CSP; use the .css and .js files", rest[loc[0]:loc[1]])
	}
	return nil
}

// hash is a CSP hash source for the exact text of an inline element.
func hash(b []byte) string {
	sum := sha256.Sum256(b)
	return "'sha256-" + base64.StdEncoding.EncodeToString(sum[:]) + "'"
}

// cspTag is the page's policy: nothing may load from anywhere; only the hashed inline scripts
// and styles run; WebAssembly may be compiled; images only from data: and blob: URLs (the PNG
// export draws an SVG blob into a canvas).
func cspTag(scripts, styles []string) string {
	policy := []string{
		"default-src 'none'",
		"script-src " + strings.Join(scripts, " ") + " 'wasm-unsafe-eval'",
		"style-src " + strings.Join(styles, " "),
		"img-src data: blob:",
		"connect-src 'none'",
		"form-action 'none'",
		"base-uri 'none'",
	}
	return `<meta http-equiv="Content-Security-Policy" content="` + strings.Join(policy, "; ") + `">`
}

// embedModule is the data block holding module as text7 of its best gzip compression.
func embedModule(module []byte) (string, error) {
	if len(module) < 8 || !bytes.Equal(module[:4], []byte("\x00asm")) {
		return "", errors.New("the module is not a WebAssembly binary (no \\0asm header)")
	}
	var buf bytes.Buffer
	zw, err := gzip.NewWriterLevel(&buf, gzip.BestCompression)
	if err != nil {
		return "", err
	}
	if _, err := zw.Write(module); err != nil {
		return "", err
	}
	if err := zw.Close(); err != nil {
		return "", err
	}
	return fmt.Sprintf(`<script type="application/octet-stream" id="copoly-wasm" data-encoding="gzip+text7" data-bytes="%d" data-gzip-bytes="%d">%s</script>`,
		len(module), buf.Len(), encodeText7(buf.Bytes())), nil
}
