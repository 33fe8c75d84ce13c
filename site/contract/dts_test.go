//go:build !js

package contract

import (
	"fmt"
	"maps"
	"slices"
	"strings"
	"testing"
	"unicode"
)

// dtsShape is an object type of the d.ts.
type dtsShape struct {
	shape
	optional map[string]bool // the fields marked ? (known for declared shapes only)
	// declared: an interface or an object type written out in the d.ts; otherwise a union or an
	// intersection of them (the fields of all the members of a union; of both sides of an &).
	declared bool
}

// alt is one object a type expression may stand for: fields written out, plus the fields of
// the named types in refs (resolved once every name is known).
type alt struct {
	fields map[string]bool
	refs   []string
}

// pending is a union or intersection whose fields are known once the names are resolved.
type pending struct {
	name string
	alts []alt
}

// dtsParser reads the TypeScript declarations of copoly.d.ts: interfaces (with extends), type
// aliases, object types with properties, optional properties, quoted keys, methods and index
// signatures, unions, intersections, arrays, tuples and generic types. That is all the d.ts
// uses; anything else is an error, so that a new construct cannot silently hide fields.
type dtsParser struct {
	toks      []tok
	i         int
	shapes    []dtsShape
	pending   []pending
	ifaces    map[string]*iface
	aliases   map[string][]alt
	resolving map[string]bool
}

type iface struct {
	fields   map[string]bool
	optional map[string]bool
	extends  []string
}

type tok struct {
	kind byte // 'i' identifier, 's' string, 'n' number, 'p' punctuation
	text string
	line int
}

// builtin names types that are no object of the API.
var builtin = map[string]bool{"number": true, "string": true, "boolean": true, "null": true, "undefined": true,
	"true": true, "false": true, "void": true, "any": true, "unknown": true, "never": true, "object": true}

func tokenize(src string) ([]tok, error) {
	var out []tok
	line := 1
	for i := 0; i < len(src); {
		c := src[i]
		switch {
		case c == '\n':
			line++
			i++
		case c == ' ' || c == '\t' || c == '\r':
			i++
		case strings.HasPrefix(src[i:], "//"):
			for i < len(src) && src[i] != '\n' {
				i++
			}
		case strings.HasPrefix(src[i:], "/*"):
			end := strings.Index(src[i+2:], "*/")
			if end < 0 {
				return nil, fmt.Errorf("line %d: comment not closed", line)
			}
			line += strings.Count(src[i:i+2+end], "\n")
			i += end + 4
		case c == '"' || c == '\'':
			j := i + 1
			for j < len(src) && src[j] != c {
				j++
			}
			if j == len(src) {
				return nil, fmt.Errorf("line %d: string not closed", line)
			}
			out = append(out, tok{'s', src[i+1 : j], line})
			i = j + 1
		case c == '_' || c == '$' || unicode.IsLetter(rune(c)):
			j := i
			for j < len(src) && (src[j] == '_' || src[j] == '$' || unicode.IsLetter(rune(src[j])) || unicode.IsDigit(rune(src[j]))) {
				j++
			}
			out = append(out, tok{'i', src[i:j], line})
			i = j
		case unicode.IsDigit(rune(c)) || c == '-' && i+1 < len(src) && unicode.IsDigit(rune(src[i+1])):
			j := i + 1
			for j < len(src) && (unicode.IsDigit(rune(src[j])) || src[j] == '.') {
				j++
			}
			out = append(out, tok{'n', src[i:j], line})
			i = j
		case strings.ContainsRune("{}()[]<>;:,?|&=.", rune(c)):
			out = append(out, tok{'p', string(c), line})
			i++
		default:
			return nil, fmt.Errorf("line %d: unexpected %q", line, c)
		}
	}
	return out, nil
}

func (p *dtsParser) peek() tok {
	if p.i < len(p.toks) {
		return p.toks[p.i]
	}
	return tok{}
}

func (p *dtsParser) is(text string) bool {
	t := p.peek()
	return t.kind != 0 && t.kind != 's' && t.text == text
}

func (p *dtsParser) next() tok { t := p.peek(); p.i++; return t }

func (p *dtsParser) expect(text string) error {
	if t := p.next(); t.text != text || t.kind == 's' {
		return fmt.Errorf("line %d: want %q, found %q", t.line, text, t.text)
	}
	return nil
}

// dtsShapes returns every object type of the d.ts src.
func dtsShapes(src string) ([]dtsShape, error) {
	toks, err := tokenize(src)
	if err != nil {
		return nil, err
	}
	p := &dtsParser{toks: toks, ifaces: map[string]*iface{}, aliases: map[string][]alt{}, resolving: map[string]bool{}}
	for p.i < len(p.toks) {
		if err := p.declaration(); err != nil {
			return nil, err
		}
	}
	// Names are known: the fields of interfaces (with what they extend), then of unions and
	// intersections.
	for name := range p.ifaces {
		fields, optional, err := p.ifaceFields(name)
		if err != nil {
			return nil, err
		}
		p.shapes = append(p.shapes, dtsShape{shape{name, fields}, optional, true})
	}
	for _, pd := range p.pending {
		for k, a := range pd.alts {
			fields, err := p.altFields(a)
			if err != nil {
				return nil, err
			}
			name := pd.name
			if len(pd.alts) > 1 {
				name = fmt.Sprintf("%s (member %d)", pd.name, k+1)
			}
			if len(fields) > 0 {
				p.shapes = append(p.shapes, dtsShape{shape{name, fields}, nil, false})
			}
		}
	}
	return p.shapes, nil
}

// ifaceFields returns the fields of the interface, with those of the interfaces it extends, and
// which of them are optional.
func (p *dtsParser) ifaceFields(name string) (fields, optional map[string]bool, err error) {
	in := p.ifaces[name]
	if p.resolving[name] {
		return nil, nil, fmt.Errorf("interface %s extends itself", name)
	}
	p.resolving[name] = true
	defer delete(p.resolving, name)
	fields, optional = map[string]bool{}, map[string]bool{}
	for _, base := range in.extends {
		if _, ok := p.ifaces[base]; !ok {
			return nil, nil, fmt.Errorf("interface %s extends %s, which is no interface", name, base)
		}
		f, o, err := p.ifaceFields(base)
		if err != nil {
			return nil, nil, err
		}
		maps.Copy(fields, f)
		maps.Copy(optional, o)
	}
	maps.Copy(fields, in.fields)
	maps.Copy(optional, in.optional)
	return fields, optional, nil
}

// named is what the named type stands for.
func (p *dtsParser) named(name string) ([]alt, error) {
	if _, ok := p.ifaces[name]; ok {
		f, _, err := p.ifaceFields(name)
		return []alt{{fields: f}}, err
	}
	if alts, ok := p.aliases[name]; ok {
		return alts, nil
	}
	return nil, fmt.Errorf("type %s is not declared", name)
}

func (p *dtsParser) altFields(a alt) (map[string]bool, error) {
	out := map[string]bool{}
	for k := range a.fields {
		out[k] = true
	}
	for _, r := range a.refs {
		alts, err := p.named(r)
		if err != nil {
			return nil, err
		}
		for _, b := range alts { // a reference to a union inside an intersection: all its fields
			f, err := p.altFields(b)
			if err != nil {
				return nil, err
			}
			for k := range f {
				out[k] = true
			}
		}
	}
	return out, nil
}

func (p *dtsParser) declaration() error {
	t := p.next()
	switch t.text {
	case "export":
		return nil
	case "declare": // declare global { var copoly: Copoly; … }: the globals, no object type
		depth := 0
		for p.i < len(p.toks) {
			switch p.next().text {
			case "{":
				depth++
			case "}":
				if depth--; depth == 0 {
					return nil
				}
			}
		}
		return fmt.Errorf("line %d: declare block not closed", t.line)
	case "interface":
		name := p.next().text
		in := &iface{}
		if p.is("extends") {
			p.next()
			for {
				in.extends = append(in.extends, p.next().text)
				if !p.is(",") {
					break
				}
				p.next()
			}
		}
		fields, optional, err := p.object(name, false)
		if err != nil {
			return err
		}
		in.fields, in.optional = fields, optional
		p.ifaces[name] = in
		return nil
	case "type":
		name := p.next().text
		if err := p.expect("="); err != nil {
			return err
		}
		alts, err := p.typ(name)
		if err != nil {
			return err
		}
		p.aliases[name] = alts
		return p.expect(";")
	}
	return fmt.Errorf("line %d: unexpected %q at the top level", t.line, t.text)
}

// object reads { members } and returns its fields and which are optional; record keeps it as a
// declared shape named path.
func (p *dtsParser) object(path string, record bool) (fields, optional map[string]bool, err error) {
	if err := p.expect("{"); err != nil {
		return nil, nil, err
	}
	fields, optional = map[string]bool{}, map[string]bool{}
	for !p.is("}") {
		if p.i >= len(p.toks) {
			return nil, nil, fmt.Errorf("object %s not closed", path)
		}
		if p.is("[") { // index signature [key: string]: T
			p.next()
			for !p.is("]") {
				p.next()
			}
			p.next()
			if err := p.expect(":"); err != nil {
				return nil, nil, err
			}
			if _, err := p.typ(path + "[]"); err != nil {
				return nil, nil, err
			}
		} else {
			key := p.next()
			if key.kind != 'i' && key.kind != 's' && key.kind != 'n' {
				return nil, nil, fmt.Errorf("line %d: want a property name, found %q", key.line, key.text)
			}
			fields[key.text] = true
			if p.is("?") {
				p.next()
				optional[key.text] = true
			}
			if p.is("(") { // method: parameters, then the result type
				p.next()
				for !p.is(")") {
					param := p.next()
					if p.is("?") {
						p.next()
					}
					if err := p.expect(":"); err != nil {
						return nil, nil, err
					}
					if _, err := p.typ(fmt.Sprintf("%s.%s(%s)", path, key.text, param.text)); err != nil {
						return nil, nil, err
					}
					if p.is(",") {
						p.next()
					}
				}
				p.next()
				if err := p.expect(":"); err != nil {
					return nil, nil, err
				}
				if _, err := p.typ(path + "." + key.text + "()"); err != nil {
					return nil, nil, err
				}
			} else {
				if err := p.expect(":"); err != nil {
					return nil, nil, err
				}
				if _, err := p.typ(path + "." + key.text); err != nil {
					return nil, nil, err
				}
			}
		}
		if p.is(";") || p.is(",") {
			p.next()
		}
	}
	p.next()
	if record {
		p.shapes = append(p.shapes, dtsShape{shape{path, fields}, optional, true})
	}
	return fields, optional, nil
}

// typ reads a type: a union of intersections. It returns the objects the type may stand for;
// a union of several objects is kept, with the fields of all its members, as a shape.
func (p *dtsParser) typ(path string) ([]alt, error) {
	if p.is("|") { // a leading | before the first member
		p.next()
	}
	alts, err := p.intersection(path)
	if err != nil {
		return nil, err
	}
	members := 1
	for p.is("|") {
		p.next()
		more, err := p.intersection(path)
		if err != nil {
			return nil, err
		}
		alts = append(alts, more...)
		members++
	}
	if members > 1 && len(alts) > 1 {
		all := alt{fields: map[string]bool{}}
		for _, a := range alts {
			for k := range a.fields {
				all.fields[k] = true
			}
			all.refs = append(all.refs, a.refs...)
		}
		p.pending = append(p.pending, pending{path + " (all members)", []alt{all}})
	}
	return alts, nil
}

func (p *dtsParser) intersection(path string) ([]alt, error) {
	alts, err := p.postfix(path)
	if err != nil {
		return nil, err
	}
	both := false
	for p.is("&") {
		p.next()
		more, err := p.postfix(path)
		if err != nil {
			return nil, err
		}
		switch {
		case len(alts) == 0:
			alts = more
		case len(more) > 0:
			var merged []alt
			for _, a := range alts {
				for _, b := range more {
					m := alt{fields: map[string]bool{}, refs: append(append([]string(nil), a.refs...), b.refs...)}
					for k := range a.fields {
						m.fields[k] = true
					}
					for k := range b.fields {
						m.fields[k] = true
					}
					merged = append(merged, m)
				}
			}
			alts = merged
			both = true
		}
	}
	if both {
		p.pending = append(p.pending, pending{path, alts})
	}
	return alts, nil
}

func (p *dtsParser) postfix(path string) ([]alt, error) {
	alts, err := p.primary(path)
	if err != nil {
		return nil, err
	}
	for p.is("[") && p.i+1 < len(p.toks) && p.toks[p.i+1].text == "]" {
		p.i += 2
		alts = nil // an array is no object of the API (its elements are recorded already)
	}
	return alts, nil
}

func (p *dtsParser) primary(path string) ([]alt, error) {
	t := p.peek()
	switch {
	case t.kind == 'p' && t.text == "{":
		f, _, err := p.object(path, true)
		return []alt{{fields: f}}, err
	case t.kind == 'p' && t.text == "[": // a tuple
		p.next()
		for !p.is("]") {
			if _, err := p.typ(path + "[]"); err != nil {
				return nil, err
			}
			if p.is(",") {
				p.next()
			}
		}
		p.next()
		return nil, nil
	case t.kind == 'p' && t.text == "(":
		p.next()
		alts, err := p.typ(path)
		if err != nil {
			return nil, err
		}
		return alts, p.expect(")")
	case t.kind == 's' || t.kind == 'n':
		p.next()
		return nil, nil
	case t.kind == 'i':
		p.next()
		if p.is("<") { // a generic type (Promise<…>, Uint8Array<…>): its arguments may hold objects
			p.next()
			for !p.is(">") {
				if _, err := p.typ(path + "<>"); err != nil {
					return nil, err
				}
				if p.is(",") {
					p.next()
				}
			}
			p.next()
			return nil, nil
		}
		if builtin[t.text] || t.text == "Uint8Array" {
			return nil, nil
		}
		return []alt{{refs: []string{t.text}}}, nil
	}
	return nil, fmt.Errorf("line %d: unexpected %q in a type", t.line, t.text)
}

// TestDtsShapes reads a small d.ts with every construct copoly.d.ts uses; the fields expected
// are worked out by hand from the source.
func TestDtsShapes(t *testing.T) {
	const src = `// A comment { with: braces }
export interface Base { a: number; "11"?: string }   /* and another */
export interface Child extends Base {
  b: { c: number[]; d: [number, number] | null };
  m(x: Base & { e: string }, y?: { f: 1 | 2 }): Promise<{ g: boolean } | Err>;
  [key: string]: unknown;
}
export type U =
  | { k: "one"; p: number }
  | { k: "two"; q: number };
export interface Err { error: string; field?: string }
declare global {
  var api: Child;
}`
	shapes, err := dtsShapes(src)
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	opt := map[string][]string{}
	for _, s := range shapes {
		got = append(got, s.name+": "+strings.Join(s.list(), " "))
		for f := range s.optional {
			opt[s.name] = append(opt[s.name], f)
		}
	}
	slices.Sort(got)
	want := []string{
		"Base: 11 a",
		"Child: 11 a b m",
		"Child.b: c d",
		"Child.m()<>: g",
		"Child.m()<> (all members): error field g",
		"Child.m(x): 11 a e", // Base & {e}
		"Child.m(x): e",
		"Child.m(y): f",
		"Err: error field",
		"U (all members): k p q",
		"U: k p",
		"U: k q",
	}
	slices.Sort(want)
	if !slices.Equal(got, want) {
		t.Errorf("dtsShapes =\n\t%s\nwant\n\t%s", strings.Join(got, "\n\t"), strings.Join(want, "\n\t"))
	}
	if o := opt["Child"]; !slices.Equal(o, []string{"11"}) {
		t.Errorf("optional fields of Child = %v, want [11] (from Base)", o)
	}
	for _, bad := range []string{"export class C {}", "export interface I { a: number", "export type T = { a: number } =>;", "export interface I extends J { a: number }"} {
		if _, err := dtsShapes(bad); err == nil {
			t.Errorf("dtsShapes(%q): no error", bad)
		}
	}
}
