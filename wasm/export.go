//go:build js && wasm

package main

import (
	"fmt"
	"runtime/debug"
	"syscall/js"

	"github.com/norunners/vert"

	"copoly/copoly"
)

// The export wrapper. Every method of the copoly object is a function of its one argument
// object that returns a Go value (a DTO or a ready js.Value) or an error. The adapters below
// check the argument count and type, convert the result with vert, turn an error into
// {error, field, code, reason, value?, row?} (copoly.PartsOf), and recover from any panic so that no input can stop the module: a Go panic
// that reached JavaScript would end the program for the life of the page.

// syncExport is the body of a synchronous method.
type syncExport func(arg js.Value) (any, error)

// asyncJob is the part of an asynchronous method that runs on its own goroutine behind a
// Promise. It may block (IndexedDB is asynchronous), which a JS callback must never do.
type asyncJob func() (any, error)

// asyncExport is the body of an asynchronous method: it reads its argument synchronously, while
// the caller's object is as it was at the call, and returns the job to run.
type asyncExport func(arg js.Value) (asyncJob, error)

// argPolicy says whether a method may be called without an argument.
type argPolicy int

const (
	argRequired argPolicy = iota // a(x: {...})
	argOptional                  // a(x?: {})
)

// wrap returns the JS function for a synchronous method.
func wrap(name string, policy argPolicy, fn syncExport) js.Func {
	return js.FuncOf(func(_ js.Value, args []js.Value) (result any) {
		defer func() {
			if r := recover(); r != nil {
				result = panicValue(name, r)
			}
		}()
		arg, err := oneArgument(args, policy)
		if err != nil {
			return errorValue(err)
		}
		out, err := fn(arg)
		if err != nil {
			return errorValue(err)
		}
		return toJS(out)
	})
}

// wrapAsync returns the JS function for a method that returns a Promise. The Promise always
// resolves, to the result or to an error object; it never rejects. The executor
// js.Func is made per call and released once the Promise constructor has run it.
func wrapAsync(name string, policy argPolicy, fn asyncExport) js.Func {
	return js.FuncOf(func(_ js.Value, args []js.Value) (result any) {
		defer func() {
			if r := recover(); r != nil {
				result = resolved(panicValue(name, r))
			}
		}()
		arg, err := oneArgument(args, policy)
		if err != nil {
			return resolved(errorValue(err))
		}
		job, err := fn(arg)
		if err != nil {
			return resolved(errorValue(err))
		}
		executor := js.FuncOf(func(_ js.Value, pargs []js.Value) any {
			resolve := pargs[0]
			go run(name, job, resolve)
			return nil
		})
		defer executor.Release()
		return promise.New(executor)
	})
}

// run runs job and resolves the Promise with its outcome, exactly once, even if job panics.
func run(name string, job asyncJob, resolve js.Value) {
	done := false
	defer func() {
		if r := recover(); r != nil && !done {
			resolve.Invoke(panicValue(name, r))
		}
	}()
	out, err := job()
	var v js.Value
	if err != nil {
		v = errorValue(err)
	} else {
		v = toJS(out)
	}
	done = true
	resolve.Invoke(v)
}

var (
	promise = js.Global().Get("Promise")
	object  = js.Global().Get("Object")
)

func resolved(v js.Value) js.Value { return promise.Call("resolve", v) }

// oneArgument returns the single argument object of a call, or an empty object for a method
// whose argument is optional and was left out.
func oneArgument(args []js.Value, policy argPolicy) (js.Value, error) {
	if len(args) > 1 {
		return js.Value{}, &copoly.FieldError{Field: "arguments", Reason: fmt.Sprintf("expected one object, got %d arguments", len(args)), Err: copoly.ErrWrongType}
	}
	if len(args) == 0 || args[0].IsUndefined() {
		if policy == argOptional {
			return object.New(), nil
		}
		return js.Value{}, &copoly.FieldError{Field: "arguments", Reason: "expected one object with the inputs, got nothing", Err: copoly.ErrMissing}
	}
	a := args[0]
	if t, ok := typeOf(a); !ok || t != js.TypeObject || isArray(a) {
		return js.Value{}, &copoly.FieldError{Field: "arguments", Reason: "expected one object with the inputs, got " + describe(a), Err: copoly.ErrWrongType}
	}
	return a, nil
}

// toJS converts a result: js.Value as it is, anything else with vert.
func toJS(out any) js.Value {
	if v, ok := out.(js.Value); ok {
		return v
	}
	return vert.ValueOf(out).JSValue()
}

// errorValue is the CopolyError object of the d.ts, the parts of err (copoly.PartsOf):
// {error, field, code, reason, value?, row?}. field is "" when the error names no input.
func errorValue(err error) js.Value {
	p := copoly.PartsOf(err)
	v := object.New()
	v.Set("error", p.Message)
	v.Set("field", p.Field)
	v.Set("code", p.Code)
	v.Set("reason", p.Reason)
	if p.HasValue {
		v.Set("value", p.Value)
	}
	if p.HasRow {
		v.Set("row", p.Row)
	}
	return v
}

// panicValue reports a recovered panic: a CopolyError for the page, and the stack on the
// console for whoever debugs it. It logs with console.error rather than os.Stderr: under Node
// a write to os.Stderr waits for an asynchronous callback, which never runs while a JS
// callback is blocked.
func panicValue(name string, r any) js.Value {
	msg := fmt.Sprintf("internal error in copoly.%s: %v", name, r)
	_ = try(func() { js.Global().Get("console").Call("error", msg+"\n"+string(debug.Stack())) })
	v := object.New()
	v.Set("error", msg)
	v.Set("field", "")
	v.Set("code", copoly.CodeInternal)
	v.Set("reason", msg)
	return v
}
