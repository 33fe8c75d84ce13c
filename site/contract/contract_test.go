//go:build !js

package contract

import (
	"fmt"
	"go/ast"
	"go/parser"
	"go/token"
	"maps"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"
)

// The files compared.
const (
	bridgeDir = "../../wasm"
	dtsFile   = "../copoly.d.ts"
)

// matchAt is the least share of common fields (common / all, of the two) at which a Go struct
// and a d.ts type count as the same object: below it they are different objects; from it up to
// 1 they are one object whose two descriptions differ.
const matchAt = 0.5

// exceptions lists fields that may be on one side only, each with the reason, as "struct.field"
// with the name of the bridge's Go struct. Keep it short: such a field is checked by nothing.
var exceptions = map[string]string{
	"benchHeadOut.rows": "benchValue adds the rows by hand, each row's cells in sorted order, which vert's conversion of a map does not keep",
}

// shape is one object type: the JS field names of a Go struct, or of a d.ts interface or object
// type.
type shape struct {
	name   string
	fields map[string]bool
}

func (s shape) list() []string {
	out := make([]string, 0, len(s.fields))
	for f := range s.fields {
		out = append(out, f)
	}
	sort.Strings(out)
	return out
}

// similarity is the share of common fields: |a ∩ b| / |a ∪ b|.
func similarity(a, b shape) float64 {
	common := 0
	for f := range a.fields {
		if b.fields[f] {
			common++
		}
	}
	all := len(a.fields) + len(b.fields) - common
	if all == 0 {
		return 0
	}
	return float64(common) / float64(all)
}

// goShapes reads every struct with js:"…" tags in the non-test Go files of dir, whatever their
// build constraints (go/parser ignores them). An anonymous struct type of a field is a shape of
// its own, named after the field.
func goShapes(t *testing.T, dir string) []shape {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(dir, "*.go"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no Go files in %s: %v", dir, err)
	}
	var out []shape
	fset := token.NewFileSet()
	for _, name := range files {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(fset, name, nil, parser.SkipObjectResolution)
		if err != nil {
			t.Fatal(err)
		}
		var walk func(prefix string, st *ast.StructType)
		walk = func(prefix string, st *ast.StructType) {
			s := shape{name: prefix, fields: map[string]bool{}}
			for _, fld := range st.Fields.List {
				if fld.Tag == nil {
					continue
				}
				tag, err := strconv.Unquote(fld.Tag.Value)
				if err != nil {
					t.Fatalf("%s: %s: tag %s: %v", fset.Position(fld.Pos()), prefix, fld.Tag.Value, err)
				}
				js, ok := reflect.StructTag(tag).Lookup("js")
				js, _, _ = strings.Cut(js, ",")
				if !ok || js == "" || js == "-" {
					continue
				}
				s.fields[js] = true
				if inner, ok := fld.Type.(*ast.StructType); ok {
					walk(prefix+"."+js, inner)
				}
			}
			if len(s.fields) > 0 {
				out = append(out, s)
			}
		}
		ast.Inspect(f, func(n ast.Node) bool {
			if ts, ok := n.(*ast.TypeSpec); ok {
				if st, ok := ts.Type.(*ast.StructType); ok {
					walk(ts.Name.Name, st)
				}
			}
			return true
		})
	}
	return out
}

// subset reports whether every field of a is one of b.
func subset(a, b shape) bool {
	for f := range a.fields {
		if !b.fields[f] {
			return false
		}
	}
	return true
}

// TestContract compares every struct of the bridge with js:"…" tags with the object types of
// copoly.d.ts. A struct matches a d.ts type when it has exactly its fields, or only some of them
// and (a) the others are optional in the d.ts (the bridge leaves them out of this result, such
// as ChainsResult without the simulation's fields), or (b) other structs have the others and
// none has them all (the bridge reads the argument in parts, such as the project and its
// revision for saveProject). Otherwise a struct that shares most of its fields with a d.ts type
// (matchAt) is the same object described two ways, and the test names the fields found on one
// side only, less the listed exceptions; a struct like no d.ts type is a DTO the d.ts does not
// describe. The pairs matched are logged, and so are the d.ts types no struct matches (the
// bridge builds those objects by hand, or they travel as JSON).
func TestContract(t *testing.T) {
	goS := goShapes(t, bridgeDir)
	src, err := os.ReadFile(dtsFile)
	if err != nil {
		t.Fatal(err)
	}
	ts, err := dtsShapes(string(src))
	if err != nil {
		t.Fatalf("%s: %v", dtsFile, err)
	}
	if len(goS) < 10 || len(ts) < 10 {
		t.Fatalf("read %d Go structs and %d d.ts types; the reading is broken", len(goS), len(ts))
	}
	// exact is the d.ts types some struct matches exactly.
	exact := map[string]bool{}
	for _, g := range goS {
		for _, d := range ts {
			if similarity(g, d.shape) == 1 {
				exact[d.name] = true
			}
		}
	}
	matched := map[string]bool{}
	var pairs []string
	for _, g := range goS {
		var best dtsShape
		score, how := 0.0, ""
		for _, d := range ts {
			s := similarity(g, d.shape)
			h := ""
			switch {
			case s == 1:
			case subset(g, d.shape) && allOptional(d, g):
				s, h = 1, " (its fields that are not optional)"
			case subset(g, d.shape) && !exact[d.name] && coveredBy(d, goS):
				s, h = 1, " (in part: other structs have its other fields)"
			}
			// The best match; between equals, a type written out in the d.ts, then an exact one.
			if s > score || (s == score && (d.declared && !best.declared || h == "" && how != "")) {
				best, score, how = d, s, h
			}
		}
		switch {
		case score == 1:
			matched[best.name] = true
			pairs = append(pairs, fmt.Sprintf("%s = %s%s", g.name, best.name, how))
		case score >= matchAt:
			var problems []string
			for _, f := range g.list() {
				if !best.fields[f] && exceptions[g.name+"."+f] == "" {
					problems = append(problems, fmt.Sprintf("%q only in the Go struct", f))
				}
			}
			for _, f := range best.list() {
				if !g.fields[f] && exceptions[g.name+"."+f] == "" {
					problems = append(problems, fmt.Sprintf("%q only in the d.ts", f))
				}
			}
			if len(problems) > 0 {
				t.Errorf("wasm %s and copoly.d.ts %s differ: %s", g.name, best.name, strings.Join(problems, ", "))
				continue
			}
			matched[best.name] = true
			pairs = append(pairs, fmt.Sprintf("%s = %s (with the listed exceptions)", g.name, best.name))
		default:
			t.Errorf("wasm %s (fields %v) is like no type of copoly.d.ts (the closest, %s, shares %.0f %% of the fields): describe it there", g.name, g.list(), best.name, 100*score)
		}
	}
	t.Logf("%d structs of the bridge matched with types of the d.ts:\n\t%s", len(pairs), strings.Join(pairs, "\n\t"))
	// A d.ts type is described by a struct when one matched it, or has exactly its fields.
	var unmatched []string
	for _, d := range ts {
		if !d.declared || len(d.fields) == 0 || matched[d.name] || slices.ContainsFunc(goS, func(g shape) bool { return similarity(g, d.shape) == 1 }) {
			continue
		}
		if !slices.Contains(unmatched, d.name) {
			unmatched = append(unmatched, d.name)
		}
	}
	sort.Strings(unmatched)
	t.Logf("d.ts types no struct describes (built by hand in the bridge, or travelling as JSON): %s", strings.Join(unmatched, ", "))
}

// allOptional reports whether every field of d that g lacks is optional in d.
func allOptional(d dtsShape, g shape) bool {
	for f := range d.fields {
		if !g.fields[f] && !d.optional[f] {
			return false
		}
	}
	return true
}

// coveredBy reports whether the structs that have only fields of d have all of them together.
func coveredBy(d dtsShape, goS []shape) bool {
	all := map[string]bool{}
	for _, g := range goS {
		if subset(g, d.shape) {
			for f := range g.fields {
				all[f] = true
			}
		}
	}
	return len(all) == len(d.fields)
}

// TestGoShapes reads the structs of a small source: tags with options, a field left out, an
// untagged field, a nested struct; and ignores a test file and the build constraint.
func TestGoShapes(t *testing.T) {
	dir := t.TempDir()
	src := "//go:build js && wasm\n\npackage main\n\n// aIn is read from JavaScript.\ntype aIn struct {\n" +
		"\tX float64 `js:\"x\"`\n\tY *string `js:\"y\" limit:\"word\"`\n\tZ int `js:\"-\"`\n\tW int\n" +
		"\tN struct {\n\t\tP int `js:\"p,omitempty\"`\n\t} `js:\"n\"`\n}\n\ntype plain struct{ A int }\n"
	for name, text := range map[string]string{"a.go": src, "a_test.go": strings.Replace(src, "aIn", "testIn", 1)} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	got := map[string][]string{}
	for _, s := range goShapes(t, dir) {
		got[s.name] = s.list()
	}
	want := map[string][]string{"aIn": {"n", "x", "y"}, "aIn.n": {"p"}}
	if !maps.EqualFunc(got, want, slices.Equal) {
		t.Errorf("goShapes = %v, want %v (worked out by hand from the source)", got, want)
	}
}
