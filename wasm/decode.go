//go:build js && wasm

package main

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"syscall/js"
	"unicode/utf8"

	"github.com/norunners/vert"

	"copoly/copoly"
	"copoly/copoly/project"
)

// decode reads the JS object v into *dst, a pointer to a fresh DTO struct. It first copies
// every field the struct names into a new plain object, checking presence, JS type, array
// length and array elements on the way and reporting the first problem as an error naming the
// field with prefix; then it converts the copy with vert. Checking first matters: vert turns
// null and undefined into zero values silently, skips null array elements, and names no field
// in its errors. Copying matters too: the copy has no getters or Proxy traps, and the fields
// are read with Reflect.get inside a JS call, because syscall/js catches a JS exception only
// in a call; a getter that throws during a plain Get would break the Go stack beyond recover.
func decode(v js.Value, dst any, prefix string) error {
	rv := reflect.ValueOf(dst)
	if rv.Kind() != reflect.Pointer || rv.Elem().Kind() != reflect.Struct {
		panic("copoly: decode needs a pointer to a struct")
	}
	snap, err := snapshot(v, rv.Elem().Type(), prefix)
	if err != nil {
		return err
	}
	if err := (vert.Value{Value: snap}).AssignTo(dst); err != nil {
		// snapshot accepted v, so this is a bridge bug, not bad input.
		return fmt.Errorf("copoly: reading %s: %w", orArguments(prefix), err)
	}
	return nil
}

func orArguments(prefix string) string {
	if prefix == "" {
		return "arguments"
	}
	return prefix[:len(prefix)-1]
}

// snapshot returns a plain copy of the fields of the JS object v that the struct type t names,
// or the first field that is missing or holds the wrong type.
func snapshot(v js.Value, t reflect.Type, prefix string) (js.Value, error) {
	snap := object.New()
	for i := range t.NumField() {
		sf := t.Field(i)
		if !sf.IsExported() {
			continue
		}
		name := sf.Tag.Get("js")
		field := prefix + name
		fv, err := get(v, name, field)
		if err != nil {
			return js.Value{}, err
		}
		ft := sf.Type
		optional := sf.Tag.Get("copoly") == "optional"
		if ft.Kind() == reflect.Pointer {
			ft, optional = ft.Elem(), true
		}
		if fv.IsUndefined() || fv.IsNull() {
			if optional {
				continue
			}
			reason := "is missing"
			if fv.IsNull() {
				reason = "is missing (null)"
			}
			return js.Value{}, &copoly.FieldError{Field: field, Reason: reason, Err: copoly.ErrMissing}
		}
		cv, err := copyValue(fv, ft, field, limitOf(sf, "limit"), limitOf(sf, "each"), sf.Tag.Get("pair"))
		if err != nil {
			return js.Value{}, err
		}
		snap.Set(name, cv)
	}
	return snap, nil
}

// limits are the largest sizes of the inputs that carry a limit:"nameLength" tag, by the name of the
// limit in project.Limits (the table copoly.limits() returns): entries of a list, keys of a map,
// or UTF-16 code units of a text (checked before the text is copied into Go). A limit copoly
// counts in characters (runes) is doubled here: a rune takes at most two code units, so the
// bridge never refuses a text copoly would accept, and copoly then applies its own limit, with
// its own message. A limit in UTF-8 bytes, or on a text whose every valid value is ASCII, needs
// no change (a code unit takes at least a byte; an ASCII character is one code unit).
var limits = func() map[string]int {
	m := map[string]int{}
	for _, l := range project.Limits() {
		n := int(l.Value)
		if l.Unit == project.UnitCharacters {
			n *= 2
		}
		m[l.Name] = n
	}
	return m
}()

// limitOf returns the limit named by the struct tag key of sf, 0 when there is no such tag, and
// panics on a name that is not in limits (a bridge bug).
func limitOf(sf reflect.StructField, key string) int {
	name := sf.Tag.Get(key)
	if name == "" {
		return 0
	}
	limit := limits[name]
	if limit == 0 {
		panic("copoly: decode has no limit named " + name)
	}
	return limit
}

// copyValue checks one present JS value against the Go type it will be converted to and
// returns it, or a plain copy for objects and arrays. limit is the size limit of the field
// (from its limit:"…" tag): the length of a text, or the entries of a list or map; 0 for none,
// which only a list of numbers may have (it then takes copoly.MaxPoints). each is the length
// limit of every text of a list or map of texts (the each:"…" tag).
//
// It reads float64, string, bool, structs, []float64, [][]float64 (a list of pairs, each
// exactly two numbers; pair names the two in messages, from the field's pair:"…" tag, "r1, r2"
// when empty), slices of structs (each entry read as an object, named field[i]), []string (a
// list of texts, named field[i]) and map[string]string (an object whose values are all texts,
// named field.key). A field of another type, or a text, list or map without its limits, is a
// bridge bug: copyValue panics, and TestDecodeLimits finds it without a call.
func copyValue(v js.Value, t reflect.Type, field string, limit, each int, pair string) (js.Value, error) {
	jt, ok := typeOf(v)
	switch t.Kind() {
	case reflect.Float64:
		if ok && jt == js.TypeNumber {
			return v, nil
		}
		return js.Value{}, wrongType(field, "a number", v)
	case reflect.String:
		if limit > 0 {
			return copyText(v, field, limit)
		}
	case reflect.Bool:
		if ok && jt == js.TypeBoolean {
			return v, nil
		}
		return js.Value{}, wrongType(field, "true or false", v)
	case reflect.Struct:
		if ok && jt == js.TypeObject && !isArray(v) {
			return snapshot(v, t, field+".")
		}
		return js.Value{}, wrongType(field, "an object", v)
	case reflect.Slice:
		switch et := t.Elem(); {
		case et.Kind() == reflect.Float64:
			if limit == 0 {
				limit = copoly.MaxPoints
			}
			return copyNumbers(v, field, limit)
		case et.Kind() == reflect.Slice && et.Elem().Kind() == reflect.Float64 && limit > 0:
			if pair == "" {
				pair = "r1, r2"
			}
			return copyList(v, field, limit, "a list of ["+pair+"] pairs", func(e js.Value, f string) (js.Value, error) {
				if jt, ok := typeOf(e); !ok || jt != js.TypeObject || !(isArray(e) || isNumberView(e)) {
					return js.Value{}, wrongType(f, "a pair ["+pair+"] of two numbers", e)
				}
				cp, err := copyNumbers(e, f, 2)
				if errors.Is(err, copoly.ErrTooMany) || err == nil && cp.Length() != 2 {
					return js.Value{}, &copoly.FieldError{Field: f, Reason: "must be a pair [" + pair + "] of two numbers", Err: copoly.ErrWrongType}
				}
				return cp, err
			})
		case et.Kind() == reflect.String && limit > 0 && each > 0:
			return copyList(v, field, limit, "a list of texts", func(e js.Value, f string) (js.Value, error) {
				return copyText(e, f, each)
			})
		case et.Kind() == reflect.Struct && limit > 0:
			return copyList(v, field, limit, "a list of objects", func(e js.Value, f string) (js.Value, error) {
				if jt, ok := typeOf(e); !ok || jt != js.TypeObject || isArray(e) {
					return js.Value{}, wrongType(f, "an object", e)
				}
				return snapshot(e, et, f+".")
			})
		}
	case reflect.Map:
		if t.Key().Kind() == reflect.String && t.Elem().Kind() == reflect.String && limit > 0 && each > 0 {
			return copyTexts(v, field, limit, each)
		}
	}
	panic("copoly: decode cannot read a " + t.String() + " (or it lacks a limit or each tag)")
}

// copyText returns v when it is a text of at most limit UTF-16 code units. The length of a
// primitive string is read through its String wrapper, so a text too long is refused without
// being copied into Go.
func copyText(v js.Value, field string, limit int) (js.Value, error) {
	if jt, ok := typeOf(v); !ok || jt != js.TypeString {
		return js.Value{}, wrongType(field, "text", v)
	}
	if n := textLength(v); n > limit {
		return js.Value{}, tooLong(field, n, limit)
	}
	return v, nil
}

// textLength returns the length of the JS string v in UTF-16 code units, read through its
// String wrapper (syscall/js reads lengths of objects only) without copying the text into Go.
func textLength(v js.Value) int { return object.Invoke(v).Length() }

func tooLong(field string, n, limit int) error {
	return &copoly.InputError{Field: field, Value: float64(n), Reason: fmt.Sprintf("the text is %d characters long; the limit is %d", n, limit), Err: copoly.ErrTooMany}
}

// copyNumbers returns a plain Array copy of v, an Array or typed array of at most limit
// numbers. The length is checked before anything is copied.
func copyNumbers(v js.Value, field string, limit int) (js.Value, error) {
	if jt, ok := typeOf(v); !ok || jt != js.TypeObject || !(isArray(v) || isNumberView(v)) {
		return js.Value{}, wrongType(field, "a list of numbers", v)
	}
	cp, err := copyArray(v, field, limit, "values", "a list of numbers")
	if err != nil {
		return js.Value{}, err
	}
	for i := range cp.Length() {
		e := cp.Index(i)
		if et, ok := typeOf(e); !ok || et != js.TypeNumber {
			return js.Value{}, wrongType(fmt.Sprintf("%s[%d]", field, i), "a number", e)
		}
	}
	return cp, nil
}

// copyList returns a new Array holding each entry of the Array v read by each, which names
// the entry field[i]. v may hold at most limit entries.
func copyList(v js.Value, field string, limit int, want string, each func(e js.Value, field string) (js.Value, error)) (js.Value, error) {
	if jt, ok := typeOf(v); !ok || jt != js.TypeObject || !isArray(v) {
		return js.Value{}, wrongType(field, want, v)
	}
	cp, err := copyArray(v, field, limit, "entries", want)
	if err != nil {
		return js.Value{}, err
	}
	out := array.New()
	for i := range cp.Length() {
		e, err := each(cp.Index(i), fmt.Sprintf("%s[%d]", field, i))
		if err != nil {
			return js.Value{}, err
		}
		out.SetIndex(i, e)
	}
	return out, nil
}

// copyArray returns Array.from(v) for an array-like v of at most limit entries (unit names them
// in the error). The length is checked before anything is copied.
func copyArray(v js.Value, field string, limit int, unit, want string) (js.Value, error) {
	n, err := get(v, "length", field)
	if err != nil {
		return js.Value{}, err
	}
	if nt, ok := typeOf(n); !ok || nt != js.TypeNumber {
		return js.Value{}, wrongType(field, want, v)
	}
	if n.Float() > float64(limit) {
		return js.Value{}, tooMany(field, n.Float(), limit, unit)
	}
	var cp js.Value
	if err := try(func() { cp = array.Call("from", v) }); err != nil {
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: copoly.ErrWrongType}
	}
	if m := cp.Length(); m > limit {
		return js.Value{}, tooMany(field, float64(m), limit, unit)
	}
	return cp, nil
}

// copyTexts returns a copy of the object v, whose own enumerable keys (at most limit, each at
// most each characters long) must all hold texts of at most each characters. The copy has no
// prototype, so a key such as "__proto__" stays an ordinary key and reaches the checks of the
// caller instead of vanishing.
func copyTexts(v js.Value, field string, limit, each int) (js.Value, error) {
	if jt, ok := typeOf(v); !ok || jt != js.TypeObject || isArray(v) {
		return js.Value{}, wrongType(field, "an object of texts", v)
	}
	var keys js.Value
	if err := try(func() { keys = object.Call("keys", v) }); err != nil {
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: copoly.ErrWrongType}
	}
	n := keys.Length()
	if n > limit {
		return js.Value{}, tooMany(field, float64(n), limit, "entries")
	}
	cp := object.Call("create", js.Null())
	for i := range n {
		key := keys.Index(i)
		if m := textLength(key); m > each {
			return js.Value{}, &copoly.FieldError{Field: field, Reason: fmt.Sprintf("has a key %d characters long (%s); the limit is %d", m, describeText(key), each), Err: copoly.ErrTooMany}
		}
		k := key.String()
		e, err := get(v, k, field+"."+k)
		if err != nil {
			return js.Value{}, err
		}
		if _, err := copyText(e, field+"."+k, each); err != nil {
			return js.Value{}, err
		}
		cp.Set(k, e)
	}
	return cp, nil
}

func tooMany(field string, n float64, limit int, unit string) error {
	return &copoly.InputError{Field: field, Value: n, Reason: fmt.Sprintf("at most %d %s per call", limit, unit), Err: copoly.ErrTooMany}
}

// get returns v[key] read with Reflect.get inside a JS call, so that a throwing getter or
// Proxy trap becomes an error naming field.
func get(v js.Value, key string, field string) (js.Value, error) {
	var out js.Value
	if err := try(func() { out = reflectJS.Call("get", v, key) }); err != nil {
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: copoly.ErrWrongType}
	}
	return out, nil
}

// try runs fn and returns a panic from it (a JS exception thrown in a call) as an error.
func try(fn func()) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("%v", r)
		}
	}()
	fn()
	return nil
}

var (
	array       = js.Global().Get("Array")
	arrayBuffer = js.Global().Get("ArrayBuffer")
	dataView    = js.Global().Get("DataView")
	reflectJS   = js.Global().Get("Reflect")
)

// isArray reports Array.isArray(v); it runs no user code.
func isArray(v js.Value) bool { return array.Call("isArray", v).Bool() }

// isNumberView reports whether v is a typed array (a view that is not a DataView). Only a real
// view passes ArrayBuffer.isView, so the instanceof test runs no Proxy trap.
func isNumberView(v js.Value) bool {
	return arrayBuffer.Call("isView", v).Bool() && !v.InstanceOf(dataView)
}

// typeOf returns the JS type of v, or false for a value syscall/js cannot classify (a BigInt).
func typeOf(v js.Value) (t js.Type, ok bool) {
	defer func() {
		if recover() != nil {
			ok = false
		}
	}()
	return v.Type(), true
}

func wrongType(field, want string, v js.Value) error {
	return &copoly.FieldError{Field: field, Reason: "must be " + want + ", not " + describe(v), Err: copoly.ErrWrongType}
}

// describeText quotes the JS string v for a message, shortened to 40 characters: only that
// much is copied into Go, however long the text.
func describeText(v js.Value) string {
	const n = 40
	if textLength(v) <= n {
		return fmt.Sprintf("%q", v.String())
	}
	s := []rune(object.Invoke(v).Call("slice", 0, n).String())
	if len(s) > 0 && s[len(s)-1] == utf8.RuneError {
		s = s[:len(s)-1] // half of a surrogate pair, cut by the slice
	}
	return fmt.Sprintf("%q", string(s)+"…")
}

// describe names a JS value for an error message.
func describe(v js.Value) string {
	t, ok := typeOf(v)
	if !ok {
		return "a value of an unsupported kind"
	}
	switch t {
	case js.TypeUndefined:
		return "undefined"
	case js.TypeNull:
		return "null"
	case js.TypeBoolean:
		return fmt.Sprint(v.Bool())
	case js.TypeNumber:
		return fmt.Sprintf("the number %g", v.Float())
	case js.TypeString:
		return "the text " + describeText(v)
	case js.TypeFunction:
		return "a function"
	case js.TypeSymbol:
		return "a symbol"
	default:
		if isArray(v) {
			return "a list"
		}
		return "an object"
	}
}

// intIn converts an optional integer input: def when absent, otherwise a whole number in
// [min, max] or an error naming the field.
func intIn(field string, v *float64, def, min, max int) (int, error) {
	if v == nil {
		return def, nil
	}
	x := *v
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, &copoly.InputError{Field: field, Value: x, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
	}
	if x != math.Trunc(x) {
		return 0, &copoly.InputError{Field: field, Value: x, Reason: "must be a whole number", Err: copoly.ErrOutOfRange}
	}
	if x < float64(min) || x > float64(max) {
		return 0, &copoly.InputError{Field: field, Value: x, Reason: fmt.Sprintf("must be between %d and %d", min, max), Err: copoly.ErrOutOfRange}
	}
	return int(x), nil
}
