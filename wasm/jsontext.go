//go:build js && wasm

package main

import (
	"fmt"
	"math"
	"syscall/js"

	"copoly/copoly"
	"copoly/copoly/project"
)

// The project file crosses the bridge as JSON text: one schema and one validator, the project
// package's. A project (or a bench grid) from the page is checked for what JSON cannot carry,
// turned into text by JSON.stringify and read by project.Parse (or project.ParseBench); a
// project going back to the page is project.Marshal's text read by JSON.parse. The one size
// limit is project.MaxFileBytes; every bound below follows from it.

var jsonJS = js.Global().Get("JSON")

// Bounds of the walk before JSON.stringify, each from project.MaxFileBytes: no list, object,
// text or key longer than these, and no more values in all, fits in a project file (a value
// takes at least one byte and its separator another). maxDepth is far deeper than the schema.
const (
	maxJSONValues = project.MaxFileBytes / 2
	maxJSONDepth  = 64
)

// readJSON returns the value of arg[key], a plain object, as JSON text (see jsonText). An absent
// or null value, or one that is not an object, is an error naming key.
func readJSON(arg js.Value, key string) ([]byte, error) {
	v, err := get(arg, key, key)
	if err != nil {
		return nil, err
	}
	if v.IsUndefined() || v.IsNull() {
		reason := "is missing"
		if v.IsNull() {
			reason = "is missing (null)"
		}
		return nil, &copoly.FieldError{Field: key, Reason: reason, Err: copoly.ErrMissing}
	}
	if t, ok := typeOf(v); !ok || t != js.TypeObject || isArray(v) {
		return nil, wrongType(key, "an object", v)
	}
	return jsonText(v, key)
}

// jsonText returns v as JSON text, from JSON.stringify. What JSON would refuse, or lose
// silently, is reported naming the path of the value (field.key[i]): a number that is not finite
// (JSON.stringify writes null, which would read as missing), a function, symbol or BigInt, a
// cycle; and text longer than project.MaxFileBytes, before it is copied into Go, naming the part
// of v that makes it so long.
func jsonText(v js.Value, field string) ([]byte, error) {
	var text js.Value
	if err := try(func() { text = jsonJS.Call("stringify", v) }); err != nil {
		// A BigInt, a cycle or a getter that throws: find where.
		if werr := (&walker{}).walk(v, &path{field: field}, 0); werr != nil {
			return nil, werr
		}
		return nil, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: copoly.ErrWrongType}
	}
	if n := textLength(text); n > project.MaxFileBytes {
		return nil, tooLarge(v, field, n)
	}
	if err := (&walker{}).walk(v, &path{field: field}, 0); err != nil {
		return nil, err
	}
	return []byte(text.String()), nil
}

// walker counts the values it has seen, so that shared or deeply repeated parts cannot make the
// walk long.
type walker struct{ values int }

// path is where a value sits below the walk's start: the field of the start, then keys and
// indices. It is turned into text only for an error, so a walk over many values copies no key
// into Go.
type path struct {
	up    *path
	field string   // the start: "project"
	key   js.Value // an object's key, or
	index int      // an array's index (key undefined)
}

func (p *path) String() string {
	if p.up == nil {
		return p.field
	}
	if p.key.IsUndefined() {
		return fmt.Sprintf("%s[%d]", p.up, p.index)
	}
	return p.up.String() + "." + p.key.String()
}

func (w *walker) walk(v js.Value, at *path, depth int) error {
	if w.values++; w.values > maxJSONValues {
		return &copoly.FieldError{Field: at.String(), Reason: fmt.Sprintf("holds more than %d values, more than a project file can", maxJSONValues), Err: copoly.ErrTooMany}
	}
	t, ok := typeOf(v)
	if !ok {
		return notJSON(at.String(), v)
	}
	switch t {
	case js.TypeUndefined, js.TypeNull, js.TypeBoolean:
		return nil
	case js.TypeNumber:
		if x := v.Float(); math.IsNaN(x) || math.IsInf(x, 0) {
			return &copoly.InputError{Field: at.String(), Value: x, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
		}
		return nil
	case js.TypeString:
		if n := textLength(v); n > project.MaxFileBytes {
			return &copoly.InputError{Field: at.String(), Value: float64(n), Reason: fmt.Sprintf("the text %s is %d characters long, more than a project file can hold (%d bytes)", describeText(v), n, project.MaxFileBytes), Err: copoly.ErrTooLong}
		}
		return nil
	case js.TypeObject:
	default: // a function or a symbol
		return notJSON(at.String(), v)
	}
	if depth >= maxJSONDepth {
		return &copoly.FieldError{Field: at.String(), Reason: fmt.Sprintf("is nested more than %d levels deep; a project is not", maxJSONDepth), Err: copoly.ErrWrongType}
	}
	if isArray(v) {
		cp, err := copyArray(v, at.String(), maxJSONValues, "entries", "a list")
		if err != nil {
			return err
		}
		for i := range cp.Length() {
			if err := w.walk(cp.Index(i), &path{up: at, index: i, key: js.Undefined()}, depth+1); err != nil {
				return err
			}
		}
		return nil
	}
	var keys js.Value
	if err := try(func() { keys = object.Call("keys", v) }); err != nil {
		return &copoly.FieldError{Field: at.String(), Reason: "cannot be read: " + err.Error(), Err: copoly.ErrWrongType}
	}
	n := keys.Length()
	if n > maxJSONValues {
		return tooMany(at.String(), float64(n), maxJSONValues, "entries")
	}
	for i := range n {
		key := keys.Index(i)
		if m := textLength(key); m > project.MaxFileBytes {
			return &copoly.FieldError{Field: at.String(), Reason: fmt.Sprintf("has a key %d characters long (%s), more than a project file can hold", m, describeText(key)), Err: copoly.ErrTooLong}
		}
		var e js.Value
		if err := try(func() { e = reflectJS.Call("get", v, key) }); err != nil {
			return &copoly.FieldError{Field: (&path{up: at, key: key}).String(), Reason: "cannot be read: " + err.Error(), Err: copoly.ErrWrongType}
		}
		if err := w.walk(e, &path{up: at, key: key}, depth+1); err != nil {
			return err
		}
	}
	return nil
}

// notJSON reports a value JSON cannot hold.
func notJSON(field string, v js.Value) error {
	return &copoly.FieldError{Field: field, Reason: describe(v) + " cannot be kept in a project file: give a number, text, true or false, a list or an object", Err: copoly.ErrWrongType}
}

// manyEntries is the number of entries above which tooLarge names a list or object itself
// rather than looking into each entry (which would take time and memory for each).
const manyEntries = 1000

// tooLarge reports JSON text of n characters above project.MaxFileBytes, naming the part of v
// that makes it so: from v down, the entry whose text is more than half the limit, as long as
// there is one; a text is named with its length, a list or object with its entries.
func tooLarge(v js.Value, field string, n int) error {
	for {
		var keys js.Value
		if err := try(func() { keys = object.Call("keys", v) }); err != nil {
			break
		}
		entries := keys.Length()
		if entries > manyEntries {
			return &copoly.InputError{Field: field, Value: float64(entries), Reason: fmt.Sprintf("holds %d entries: the project file would take %d characters, more than the %d bytes it can have", entries, n, project.MaxFileBytes), Err: copoly.ErrTooMany}
		}
		next, nextField := js.Undefined(), ""
		for i := range entries {
			var e, text js.Value
			key := keys.Index(i)
			if try(func() { e = reflectJS.Call("get", v, key) }) != nil {
				break
			}
			f := field + "." + key.String()
			if isArray(v) {
				f = fmt.Sprintf("%s[%d]", field, i)
			}
			t, ok := typeOf(e)
			switch {
			case ok && t == js.TypeString:
				if m := textLength(e); m > project.MaxFileBytes/2 {
					return &copoly.InputError{Field: f, Value: float64(m), Reason: fmt.Sprintf("the text %s is %d characters long, more than a project file can hold (%d bytes)", describeText(e), m, project.MaxFileBytes), Err: copoly.ErrTooLong}
				}
			case ok && t == js.TypeObject:
				if try(func() { text = jsonJS.Call("stringify", e) }) == nil && text.Type() == js.TypeString && textLength(text) > project.MaxFileBytes/2 {
					next, nextField = e, f
				}
			}
			if !next.IsUndefined() {
				break
			}
		}
		if next.IsUndefined() {
			return &copoly.InputError{Field: field, Value: float64(entries), Reason: fmt.Sprintf("holds %d entries: the project file would take %d characters, more than the %d bytes it can have", entries, n, project.MaxFileBytes), Err: copoly.ErrTooMany}
		}
		v, field = next, nextField
	}
	return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("the project file would take %d characters, more than the %d bytes it can have", n, project.MaxFileBytes), Err: copoly.ErrTooMany}
}

// fromJSON returns JSON text as a JS value.
func fromJSON(data []byte) js.Value { return jsonJS.Call("parse", string(data)) }
