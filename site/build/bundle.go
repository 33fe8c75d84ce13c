package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"path"
	"slices"
	"strings"

	"github.com/evanw/esbuild/pkg/api"
)

// bundle joins the ES module entry of the page (a path inside site, such as "src/main.js") and
// every module it imports into one classic script: an immediately invoked function in strict
// mode, with no import or export left, no source map and no comment, so that it can be inlined
// and hashed like any other script. It uses esbuild's Go API; esbuild reads the modules from
// site only (the sitefs plugin), so an import of anything but a relative path to a .js file
// there (a package name, a URL, a file outside site) fails the build. The whitespace is
// minified, with lines of at most lineLimit characters so that an error's line and column still
// point somewhere readable; names are kept, and nothing is rewritten to older syntax. It also
// returns the paths of the modules the bundle holds.
func bundle(site fs.FS, entry string) (js []byte, modules []string, err error) {
	res := api.Build(api.BuildOptions{
		EntryPoints:      []string{entry},
		Bundle:           true,
		Write:            false,
		Format:           api.FormatIIFE,
		Platform:         api.PlatformBrowser,
		Target:           api.ESNext,
		Charset:          api.CharsetUTF8,
		LegalComments:    api.LegalCommentsNone,
		Sourcemap:        api.SourceMapNone,
		MinifyWhitespace: true,
		LineLimit:        lineLimit,
		Banner:           map[string]string{"js": `"use strict";`},
		Plugins:          []api.Plugin{sitePlugin(site)},
		LogLevel:         api.LogLevelSilent,
		Metafile:         true,
	})
	if len(res.Errors) > 0 {
		var errs []error
		for _, m := range res.Errors {
			where := ""
			if m.Location != nil {
				where = fmt.Sprintf("%s:%d:%d: ", m.Location.File, m.Location.Line, m.Location.Column)
			}
			errs = append(errs, fmt.Errorf("bundling %s: %s%s", entry, where, m.Text))
		}
		return nil, nil, errors.Join(errs...)
	}
	if len(res.OutputFiles) != 1 {
		return nil, nil, fmt.Errorf("bundling %s: esbuild wrote %d files, want 1", entry, len(res.OutputFiles))
	}
	var meta struct {
		Inputs map[string]json.RawMessage `json:"inputs"`
	}
	if err := json.Unmarshal([]byte(res.Metafile), &meta); err != nil {
		return nil, nil, fmt.Errorf("bundling %s: esbuild's metafile: %v", entry, err)
	}
	for name := range meta.Inputs {
		modules = append(modules, strings.TrimPrefix(name, siteNamespace+":"))
	}
	slices.Sort(modules)
	return res.OutputFiles[0].Contents, modules, nil
}

// lineLimit is the longest line of the bundle esbuild aims for (it breaks lines between tokens).
const lineLimit = 400

// siteNamespace is esbuild's namespace for the modules read from the site file system.
const siteNamespace = "site"

// sitePlugin resolves and loads every module from site: the entry by its path, and each import
// by a path relative to the module that imports it.
func sitePlugin(site fs.FS) api.Plugin {
	return api.Plugin{
		Name: "sitefs",
		Setup: func(b api.PluginBuild) {
			b.OnResolve(api.OnResolveOptions{Filter: `.*`}, func(a api.OnResolveArgs) (api.OnResolveResult, error) {
				var p string
				switch {
				case a.Kind == api.ResolveEntryPoint:
					p = path.Clean(a.Path)
				case strings.HasPrefix(a.Path, "./") || strings.HasPrefix(a.Path, "../"):
					p = path.Join(path.Dir(a.Importer), a.Path)
				default:
					return api.OnResolveResult{}, fmt.Errorf("import %q: the page imports only its own modules, by a relative path (./name.js)", a.Path)
				}
				if !fs.ValidPath(p) || !strings.HasSuffix(p, ".js") {
					return api.OnResolveResult{}, fmt.Errorf("import %q from %s: not a .js file inside the site directory", a.Path, a.Importer)
				}
				return api.OnResolveResult{Path: p, Namespace: siteNamespace}, nil
			})
			b.OnLoad(api.OnLoadOptions{Filter: `.*`, Namespace: siteNamespace}, func(a api.OnLoadArgs) (api.OnLoadResult, error) {
				src, err := fs.ReadFile(site, a.Path)
				if err != nil {
					return api.OnLoadResult{}, err
				}
				text := string(src)
				return api.OnLoadResult{Contents: &text, Loader: api.LoaderJS}, nil
			})
		},
	}
}
