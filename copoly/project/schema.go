package project

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"reflect"
	"slices"
	"strings"

	"copoly/copoly"
)

// The reader of the project schema. A file (or a project object from the page, as JSON text) is
// decoded into plain JSON values first and then read into the Go types of this package by
// readValue, which follows their json tags: every key by its exact name, each value checked
// against the Go type it is read into, with an error that names the key by its whole path
// ("project.bench.rows[3].cells.f10") and says what was found there ("the text \"0.5\""). A key
// tagged project:"required" must be present and not null; any other key may be left out or
// null. Keys this version does not know are ignored. It is the one reader of the schema: Parse
// uses it for files, and the bridge in wasm/ sends the page's objects through it.

// maxWhole bounds the whole numbers of the schema (Project.Version, Bench.Carrier, Plan.Shots):
// they are read into an int and every valid one is far smaller.
const maxWhole = 1e9

// errTrailing reports data after the end of the one JSON value a file holds.
var errTrailing = errors.New("unexpected data after the end of the JSON value")

// decodeJSON decodes data as one JSON value with nothing after it.
func decodeJSON(data []byte) (any, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	var v any
	if err := dec.Decode(&v); err != nil {
		return nil, err
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, errTrailing
	}
	return v, nil
}

// readValue reads the JSON value x (from decodeJSON) into v, naming the errors field. pair
// names the two numbers of a [2]float64 in messages ("r1, r2"), from the pair tag of the field.
func readValue(field string, x any, v reflect.Value, pair string) error {
	switch v.Kind() {
	case reflect.Pointer:
		if x == nil {
			return nil
		}
		p := reflect.New(v.Type().Elem())
		if err := readValue(field, x, p.Elem(), pair); err != nil {
			return err
		}
		v.Set(p)
	case reflect.Struct:
		m, ok := x.(map[string]any)
		if !ok {
			return wrongType(field, "an object", x)
		}
		t := v.Type()
		for i := range t.NumField() {
			sf := t.Field(i)
			name, _, _ := strings.Cut(sf.Tag.Get("json"), ",")
			if name == "" || name == "-" || !sf.IsExported() {
				continue
			}
			f := field + "." + name
			xv, present := m[name]
			if xv == nil {
				if sf.Tag.Get("project") == "required" {
					reason := "is missing"
					if present {
						reason = "is missing (null)"
					}
					return &copoly.FieldError{Field: f, Reason: reason, Err: ErrMissing}
				}
				continue
			}
			if err := readValue(f, xv, v.Field(i), sf.Tag.Get("pair")); err != nil {
				return err
			}
		}
	case reflect.Float64:
		n, ok := x.(float64)
		if !ok {
			return wrongType(field, "a number", x)
		}
		v.SetFloat(n)
	case reflect.Int:
		n, ok := x.(float64)
		if !ok || n != math.Trunc(n) || math.Abs(n) > maxWhole {
			return wrongType(field, "a whole number", x)
		}
		v.SetInt(int64(n))
	case reflect.String:
		s, ok := x.(string)
		if !ok {
			return wrongType(field, "text", x)
		}
		v.SetString(s)
	case reflect.Bool:
		b, ok := x.(bool)
		if !ok {
			return wrongType(field, "true or false", x)
		}
		v.SetBool(b)
	case reflect.Array: // [2]float64: a pair of numbers
		l, ok := x.([]any)
		if !ok || len(l) != v.Len() {
			if ok { // say how long the list is: the usual mistake
				return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("must be a pair [%s] of two numbers, not a list of %d values", pair, len(l)), Err: ErrWrongType}
			}
			return wrongType(field, "a pair ["+pair+"] of two numbers", x)
		}
		for i, e := range l {
			if err := readValue(fmt.Sprintf("%s[%d]", field, i), e, v.Index(i), ""); err != nil {
				return err
			}
		}
	case reflect.Slice:
		l, ok := x.([]any)
		if !ok {
			return wrongType(field, kindName(v.Type(), pair), x)
		}
		s := reflect.MakeSlice(v.Type(), len(l), len(l))
		for i, e := range l {
			f := fmt.Sprintf("%s[%d]", field, i)
			if e == nil { // null where an entry belongs is not "not given"
				return wrongType(f, kindName(v.Type().Elem(), pair), nil)
			}
			if err := readValue(f, e, s.Index(i), pair); err != nil {
				return err
			}
		}
		v.Set(s)
	case reflect.Map: // map[string]string
		m, ok := x.(map[string]any)
		if !ok {
			return wrongType(field, "an object of texts", x)
		}
		out := reflect.MakeMapWithSize(v.Type(), len(m))
		keys := make([]string, 0, len(m))
		for k := range m {
			keys = append(keys, k)
		}
		slices.Sort(keys)
		for _, k := range keys {
			s, ok := m[k].(string)
			if !ok {
				return wrongType(field+"."+abbreviate(k), "text", m[k])
			}
			out.SetMapIndex(reflect.ValueOf(k), reflect.ValueOf(s))
		}
		v.Set(out)
	default:
		panic("project: the schema cannot read a " + v.Type().String())
	}
	return nil
}

// wrongType reports the value x at field where want belongs.
func wrongType(field, want string, x any) error {
	return &copoly.FieldError{Field: field, Reason: "must be " + want + ", not " + describe(x), Err: ErrWrongType}
}

// describe names a JSON value for a message: "null", "true", "the number 5", "the text \"0.5\"",
// "a list", "an object".
func describe(x any) string {
	switch x := x.(type) {
	case nil:
		return "null"
	case bool:
		return fmt.Sprint(x)
	case float64:
		return fmt.Sprintf("the number %g", x)
	case string:
		return fmt.Sprintf("the text %q", abbreviate(x))
	case []any:
		return "a list"
	default:
		return "an object"
	}
}

// abbreviate shortens a text quoted in a message to 40 characters.
func abbreviate(s string) string {
	const n = 40
	i := 0
	for k := range s { // byte offsets of the runes: no copy of a long text
		if i == n {
			return s[:k] + "…"
		}
		i++
	}
	return s
}

// kindName names a Go type of the schema as the JSON a user would have to write.
func kindName(t reflect.Type, pair string) string {
	switch t.Kind() {
	case reflect.Float64:
		return "a number"
	case reflect.Int:
		return "a whole number"
	case reflect.String:
		return "text"
	case reflect.Bool:
		return "true or false"
	case reflect.Array:
		return "a pair [" + pair + "] of two numbers"
	case reflect.Slice:
		switch t.Elem().Kind() {
		case reflect.Struct:
			return "a list of objects"
		case reflect.String:
			return "a list of texts"
		case reflect.Array:
			return "a list of [" + pair + "] pairs"
		}
		return "a list"
	default:
		return "an object"
	}
}

// ParseBench reads a bench grid given as JSON text, the BenchTable of the JavaScript API, with
// the reader of the project file: errors name the keys under field ("bench.rows[3].label").
// The grid must pass [CheckBench].
func ParseBench(field string, data []byte) (Bench, error) {
	if len(data) > MaxFileBytes {
		return Bench{}, &copoly.InputError{Field: field, Value: float64(len(data)), Reason: fmt.Sprintf("takes %d bytes, more than the %d a project file can have", len(data), MaxFileBytes), Err: copoly.ErrTooMany}
	}
	x, err := decodeJSON(data)
	if err != nil {
		return Bench{}, &copoly.FieldError{Field: field, Reason: "is not valid JSON (" + err.Error() + ")", Err: ErrWrongType}
	}
	var b Bench
	if err := readValue(field, x, reflect.ValueOf(&b).Elem(), ""); err != nil {
		return Bench{}, err
	}
	b.tidy()
	return b, CheckBench(field, b)
}

// tidy sets an empty list of rows and each empty object of cells to nil, as they are read from
// the [] and {} that MarshalJSON writes for nil.
func (b *Bench) tidy() {
	if len(b.Rows) == 0 {
		b.Rows = nil
	}
	for i := range b.Rows {
		if len(b.Rows[i].Cells) == 0 {
			b.Rows[i].Cells = nil
		}
	}
}

// MarshalJSON writes the grid with "rows" always a list, as the JavaScript API's BenchTable has
// it (nil rows are an empty list).
func (b Bench) MarshalJSON() ([]byte, error) {
	type plain Bench // without this method
	c := plain(b)
	if c.Rows == nil {
		c.Rows = []BenchRow{}
	}
	return marshalPlain(c)
}

// MarshalJSON writes the row with "cells" always an object (nil cells are an empty one).
func (r BenchRow) MarshalJSON() ([]byte, error) {
	type plain BenchRow
	c := plain(r)
	if c.Cells == nil {
		c.Cells = map[string]string{}
	}
	return marshalPlain(c)
}

// MarshalJSON writes the monomer with "hazards" always a list (nil hazards are an empty one).
func (m UserMonomer) MarshalJSON() ([]byte, error) {
	type plain UserMonomer
	c := plain(m)
	if c.Hazards == nil {
		c.Hazards = []string{}
	}
	return marshalPlain(c)
}

// marshalPlain is json.Marshal without the escaping of <, > and &, like Marshal's encoder.
func marshalPlain(v any) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimSuffix(buf.Bytes(), []byte("\n")), nil
}
