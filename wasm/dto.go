//go:build js && wasm

package main

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"syscall/js"

	"github.com/norunners/vert"

	"copoly/copoly"
	"copoly/copoly/project"
)

// JS-facing data transfer objects. Each mirrors one argument or result of site/copoly.d.ts with
// plain js:"camelCase" tags and built-in kinds only (vert cannot convert named number types or
// fixed-size arrays). Inputs are read by decode: a field whose Go type is a pointer is optional
// (nil when absent), a field tagged copoly:"optional" may be absent and then keeps its zero
// value, every other field is required.

// Sentinels wrapped by the errors about the JS form of an input.
var (
	// errWrongType reports a JS value of the wrong type, or one that cannot be read.
	errWrongType = errors.New("copoly: value has the wrong type")
	// errMissing reports a required input that is absent, null or undefined.
	errMissing = errors.New("copoly: value missing")
)

type compositionIn struct {
	R1 float64   `js:"r1"`
	R2 float64   `js:"r2"`
	F1 []float64 `js:"f1"`
}

type classificationOut struct {
	Kind    string  `js:"kind"`
	Product float64 `js:"product"`
	Text    string  `js:"text"`
}

type compositionOut struct {
	F1             []float64         `js:"F1"`
	Azeotrope      *float64          `js:"azeotrope"` // null when none
	Classification classificationOut `js:"classification"`
}

type feedIn struct {
	R1       float64 `js:"r1"`
	R2       float64 `js:"r2"`
	TargetF1 float64 `js:"targetF1"`
}

type feedOut struct {
	Feeds []float64 `js:"feeds"`
	Note  string    `js:"note"`
	Range []float64 `js:"range"` // [min, max]
}

type driftIn struct {
	R1         float64   `js:"r1"`
	R2         float64   `js:"r2"`
	F10        float64   `js:"f10"`
	Conversion []float64 `js:"conversion"`
	Basis      *string   `js:"basis"`
	MolarMass1 *float64  `js:"molarMass1"`
	MolarMass2 *float64  `js:"molarMass2"`
	Tolerance  *float64  `js:"tolerance"`
	Bins       *float64  `js:"bins"`
}

type limitOut struct {
	Tolerance  float64 `js:"tolerance"`
	Conversion float64 `js:"conversion"`
}

type histogramOut struct {
	Edges   []float64 `js:"edges"`
	Weights []float64 `js:"weights"`
	Basis   string    `js:"basis"`
}

type exhaustedOut struct {
	Monomer    int     `js:"monomer"`
	Conversion float64 `js:"conversion"`
}

type driftOut struct {
	Conversion     []float64     `js:"conversion"`
	ConversionMass []float64     `js:"conversionMass"` // removed when nil
	Feed           []float64     `js:"f1"`
	Inst           []float64     `js:"F1"`
	Cum            []float64     `js:"F1cum"`
	Method         string        `js:"method"`
	Limit          limitOut      `js:"limit"`
	Distribution   histogramOut  `js:"distribution"`
	Exhausted      *exhaustedOut `js:"exhausted"` // null when no monomer runs out
}

type sequenceIn struct {
	R1         float64  `js:"r1"`
	R2         float64  `js:"r2"`
	F1         float64  `js:"f1"`
	Conversion *float64 `js:"conversion"`
	MaxLength  *float64 `js:"maxLength"`
}

type dyadsOut struct {
	D11 float64 `js:"11"`
	D12 float64 `js:"12"`
	D22 float64 `js:"22"`
}

type triadsOut struct {
	T111 float64 `js:"111"`
	T112 float64 `js:"112"`
	T212 float64 `js:"212"`
	T222 float64 `js:"222"`
	T221 float64 `js:"221"`
	T121 float64 `js:"121"`
}

type runLengthsOut struct {
	Length  []int     `js:"length"`
	Number1 []float64 `js:"number1"`
	Weight1 []float64 `js:"weight1"`
	Number2 []float64 `js:"number2"`
	Weight2 []float64 `js:"weight2"`
}

// sequenceOut is SequenceStats of the d.ts; the extra fields of SequenceResult are set on the JS
// object by the sequence export.
type sequenceOut struct {
	F1          float64   `js:"F1"`
	P11         float64   `js:"p11"`
	P12         float64   `js:"p12"`
	P21         float64   `js:"p21"`
	P22         float64   `js:"p22"`
	Dyads       dyadsOut  `js:"dyads"`
	Triads      triadsOut `js:"triads"`
	MeanLength1 float64   `js:"meanLength1"`
	MeanLength2 float64   `js:"meanLength2"`
	RunNumber   float64   `js:"runNumber"`
	Randomness  float64   `js:"randomness"`
}

func sequenceDTO(s copoly.Sequence) sequenceOut {
	return sequenceOut{
		F1: s.F1, P11: s.P11, P12: s.P12, P21: s.P21, P22: s.P22,
		Dyads:       dyadsOut{D11: s.D11, D12: s.D12, D22: s.D22},
		Triads:      triadsOut{T111: s.T111, T112: s.T112, T212: s.T212, T222: s.T222, T221: s.T221, T121: s.T121},
		MeanLength1: s.MeanLength1, MeanLength2: s.MeanLength2,
		RunNumber: s.RunNumber, Randomness: s.Randomness,
	}
}

type chainsIn struct {
	R1     float64  `js:"r1"`
	R2     float64  `js:"r2"`
	F10    float64  `js:"f10"`
	Count  *float64 `js:"count"`
	Length *float64 `js:"length"`
	Seed   *float64 `js:"seed"`
}

type chainsOut struct {
	Samples []string `js:"samples"`
}

type monomerOut struct {
	Name      string  `js:"name"`
	Formula   string  `js:"formula"`
	MolarMass float64 `js:"molarMass"`
	Source    string  `js:"source"`
}

type pairOut struct {
	Monomer1    string  `js:"monomer1"`
	Monomer2    string  `js:"monomer2"`
	R1          float64 `js:"r1"`
	R2          float64 `js:"r2"`
	Temperature string  `js:"temperature"`
	Source      string  `js:"source"`
}

type libraryOut struct {
	Monomers []monomerOut `js:"monomers"`
	Pairs    []pairOut    `js:"pairs"`
}

// projectMonomerDTO is one monomer of a Project.
type projectMonomerDTO struct {
	Name      string  `js:"name" copoly:"optional"`
	MolarMass float64 `js:"molarMass" copoly:"optional"`
}

// projectDTO is the Project of the d.ts, both ways. Version is a float64 so that 1.5 can be
// refused by name instead of being truncated.
type projectDTO struct {
	Format      string            `js:"format"`
	Version     float64           `js:"version"`
	Name        string            `js:"name" copoly:"optional"`
	Monomer1    projectMonomerDTO `js:"monomer1"`
	Monomer2    projectMonomerDTO `js:"monomer2"`
	R1          float64           `js:"r1"`
	R2          float64           `js:"r2"`
	RatioSource string            `js:"ratioSource" copoly:"optional"`
	F10         float64           `js:"f10"`
	Conversion  float64           `js:"conversion"`
	Tolerance   float64           `js:"tolerance"`
	Notes       string            `js:"notes" copoly:"optional"`
	Invented    bool              `js:"invented" copoly:"optional"`
	SavedAt     string            `js:"savedAt" copoly:"optional"`
}

// projectIn is the argument of checkProject, exportProject and saveProject.
type projectIn struct {
	Project projectDTO `js:"project"`
}

type importIn struct {
	JSON string `js:"json"`
}

func (d projectDTO) project() (project.Project, error) {
	if d.Version != math.Trunc(d.Version) || math.Abs(d.Version) > 1e9 {
		return project.Project{}, &copoly.InputError{Field: "project.version", Value: d.Version, Reason: "must be a whole number", Err: copoly.ErrOutOfRange}
	}
	p := project.Project{
		Format:      d.Format,
		Version:     int(d.Version),
		Name:        d.Name,
		Monomer1:    project.Monomer{Name: d.Monomer1.Name, MolarMass: d.Monomer1.MolarMass},
		Monomer2:    project.Monomer{Name: d.Monomer2.Name, MolarMass: d.Monomer2.MolarMass},
		R1:          d.R1,
		R2:          d.R2,
		RatioSource: d.RatioSource,
		F10:         d.F10,
		Conversion:  d.Conversion,
		Tolerance:   d.Tolerance,
		Notes:       d.Notes,
		Invented:    d.Invented,
		SavedAt:     d.SavedAt,
	}
	return p, p.Validate()
}

// projectValue returns p as a JS object; like the file format it leaves out invented when false
// and savedAt when empty.
func projectValue(p project.Project) js.Value {
	v := vert.ValueOf(projectDTO{
		Format:      p.Format,
		Version:     float64(p.Version),
		Name:        p.Name,
		Monomer1:    projectMonomerDTO{Name: p.Monomer1.Name, MolarMass: p.Monomer1.MolarMass},
		Monomer2:    projectMonomerDTO{Name: p.Monomer2.Name, MolarMass: p.Monomer2.MolarMass},
		R1:          p.R1,
		R2:          p.R2,
		RatioSource: p.RatioSource,
		F10:         p.F10,
		Conversion:  p.Conversion,
		Tolerance:   p.Tolerance,
		Notes:       p.Notes,
		Invented:    p.Invented,
		SavedAt:     p.SavedAt,
	}).JSValue()
	if !p.Invented {
		v.Delete("invented")
	}
	if p.SavedAt == "" {
		v.Delete("savedAt")
	}
	return v
}

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
			return js.Value{}, &copoly.FieldError{Field: field, Reason: "is missing", Err: errMissing}
		}
		cv, err := copyValue(fv, ft, field)
		if err != nil {
			return js.Value{}, err
		}
		snap.Set(name, cv)
	}
	return snap, nil
}

// copyValue checks one present JS value against the Go type it will be converted to and
// returns it, or a plain copy for objects and arrays.
func copyValue(v js.Value, t reflect.Type, field string) (js.Value, error) {
	jt, ok := typeOf(v)
	switch t.Kind() {
	case reflect.Float64:
		if ok && jt == js.TypeNumber {
			return v, nil
		}
		return js.Value{}, wrongType(field, "a number", v)
	case reflect.String:
		if ok && jt == js.TypeString {
			return v, nil
		}
		return js.Value{}, wrongType(field, "text", v)
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
		if t.Elem().Kind() != reflect.Float64 {
			panic("copoly: decode reads only []float64 slices")
		}
		return copyNumbers(v, field)
	default:
		panic("copoly: decode cannot read a " + t.String())
	}
}

// copyNumbers returns a plain Array copy of v, an Array or typed array of at most
// copoly.MaxPoints numbers. The length is checked before anything is copied.
func copyNumbers(v js.Value, field string) (js.Value, error) {
	if jt, ok := typeOf(v); !ok || jt != js.TypeObject || !(isArray(v) || isNumberView(v)) {
		return js.Value{}, wrongType(field, "a list of numbers", v)
	}
	n, err := get(v, "length", field)
	if err != nil {
		return js.Value{}, err
	}
	if nt, ok := typeOf(n); !ok || nt != js.TypeNumber {
		return js.Value{}, wrongType(field, "a list of numbers", v)
	}
	if n.Float() > copoly.MaxPoints {
		return js.Value{}, tooMany(field, n.Float())
	}
	var cp js.Value
	if err := try(func() { cp = array.Call("from", v) }); err != nil {
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: errWrongType}
	}
	m := cp.Length()
	if m > copoly.MaxPoints {
		return js.Value{}, tooMany(field, float64(m))
	}
	for i := range m {
		e := cp.Index(i)
		if et, ok := typeOf(e); !ok || et != js.TypeNumber {
			return js.Value{}, wrongType(fmt.Sprintf("%s[%d]", field, i), "a number", e)
		}
	}
	return cp, nil
}

func tooMany(field string, n float64) error {
	return &copoly.InputError{Field: field, Value: n, Reason: fmt.Sprintf("at most %d values per call", copoly.MaxPoints), Err: copoly.ErrTooMany}
}

// get returns v[key] read with Reflect.get inside a JS call, so that a throwing getter or
// Proxy trap becomes an error naming field.
func get(v js.Value, key string, field string) (js.Value, error) {
	var out js.Value
	if err := try(func() { out = reflectJS.Call("get", v, key) }); err != nil {
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: errWrongType}
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
	return &copoly.FieldError{Field: field, Reason: "must be " + want + ", not " + describe(v), Err: errWrongType}
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
		s := v.String()
		if len(s) > 40 {
			s = s[:40] + "…"
		}
		return fmt.Sprintf("the text %q", s)
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

// renameField returns err with the field of its InputError changed from "from" to "to", so that
// an error from a copoly call names the input the way the JS API does.
func renameField(err error, from, to string) error {
	var ie *copoly.InputError
	if errors.As(err, &ie) && ie.Field == from {
		c := *ie
		c.Field = to
		return &c
	}
	var fe *copoly.FieldError
	if errors.As(err, &fe) && fe.Field == from {
		c := *fe
		c.Field = to
		return &c
	}
	return err
}
