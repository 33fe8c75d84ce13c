//go:build js && wasm

package main

import (
	"math"
	"syscall/js"
	"testing"

	"copoly/copoly"
)

// Tests of the model options of composition, drift and sequence (ModelArgs in site/copoly.d.ts).
// The bridge adds no science, so each result is compared with a direct call of package copoly;
// the ratios are invented for the tests.

var (
	pen      = copoly.Penultimate{R11: 0.9, R21: 0.4, R22: 0.2, R12: 0.6}
	penArg   = map[string]any{"model": "penultimate", "r11": 0.9, "r21": 0.4, "r22": 0.2, "r12": 0.6}
	impl     = copoly.Implicit{R1: 0.8, R2: 0.15, S1: 0.5, S2: 2}
	implArg  = map[string]any{"model": "implicit", "r1": 0.8, "r2": 0.15, "s1": 0.5, "s2": 2}
	termArg  = map[string]any{"model": "terminal", "r1": 0.8, "r2": 0.15}
	termBare = map[string]any{"r1": 0.8, "r2": 0.15}
)

// args returns the union of the maps, later ones winning; a nil value removes the key.
func args(ms ...map[string]any) map[string]any {
	a := map[string]any{}
	for _, m := range ms {
		for k, v := range m {
			if v == nil {
				delete(a, k)
				continue
			}
			a[k] = v
		}
	}
	return a
}

// sameSequence checks the SequenceStats object v against s, exactly.
func sameSequence(t *testing.T, v js.Value, s copoly.Sequence) {
	t.Helper()
	for _, c := range []struct {
		path string
		want float64
	}{
		{"F1", s.F1}, {"p11", s.P11}, {"p12", s.P12}, {"p21", s.P21}, {"p22", s.P22},
		{"dyads.11", s.D11}, {"dyads.12", s.D12}, {"dyads.22", s.D22},
		{"triads.111", s.T111}, {"triads.112", s.T112}, {"triads.212", s.T212},
		{"triads.222", s.T222}, {"triads.221", s.T221}, {"triads.121", s.T121},
		{"meanLength1", s.MeanLength1}, {"meanLength2", s.MeanLength2},
		{"runNumber", s.RunNumber}, {"randomness", s.Randomness},
	} {
		got := v
		for _, k := range splitPath(c.path) {
			got = got.Get(k)
		}
		if got.Type() != js.TypeNumber || got.Float() != c.want {
			t.Errorf("%s = %s, want %v", c.path, stringify(got), c.want)
		}
	}
}

func TestCompositionModels(t *testing.T) {
	api, _ := testAPI(t)
	feeds := []any{0, 0.1, 0.37, 0.5, 0.9, 1}
	for _, c := range []struct {
		name  string
		arg   map[string]any
		model copoly.Model
	}{
		{"penultimate", penArg, pen},
		{"implicit", implArg, impl},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := call(api, "composition", args(c.arg, map[string]any{"f1": feeds}))
			wantNoError(t, r)
			want := make([]float64, len(feeds))
			for i, f := range feeds {
				want[i] = c.model.Instantaneous(toFloat(f))
			}
			sameFloats(t, "F1", floatsOf(t, r.Get("F1")), want)
			for _, k := range []string{"azeotrope", "classification"} {
				if !r.Get(k).IsNull() {
					t.Errorf("%s = %s for the %s model, want null", k, stringify(r.Get(k)), c.name)
				}
			}
		})
	}
	t.Run("model terminal is the default", func(t *testing.T) {
		named := call(api, "composition", args(termArg, map[string]any{"f1": feeds}))
		bare := call(api, "composition", args(termBare, map[string]any{"f1": feeds}))
		wantNoError(t, named)
		if stringify(named) != stringify(bare) {
			t.Errorf("composition(model: terminal) = %s, want %s as without model", stringify(named), stringify(bare))
		}
		if named.Get("classification").IsNull() {
			t.Error("terminal classification is null")
		}
	})
	t.Run("penultimate with r11 = r21, r22 = r12 is terminal", func(t *testing.T) {
		// The reduction stated in the Penultimate doc comment (Merz, Alfrey, Goldfinger 1946).
		p := call(api, "composition", map[string]any{"model": "penultimate", "r11": 0.8, "r21": 0.8, "r22": 0.15, "r12": 0.15, "f1": []any{0.3}})
		wantNoError(t, p)
		want := copoly.Terminal{R1: 0.8, R2: 0.15}.Instantaneous(0.3)
		if got := p.Get("F1").Index(0).Float(); math.Abs(got-want) > 1e-15 {
			t.Errorf("F1 = %v, want the terminal %v", got, want)
		}
	})
}

func toFloat(v any) float64 {
	switch x := v.(type) {
	case int:
		return float64(x)
	case float64:
		return x
	}
	panic("not a number")
}

func TestDriftModels(t *testing.T) {
	api, _ := testAPI(t)
	xs := []float64{0, 0.2, 0.5, 0.8}
	conv := []any{0, 0.2, 0.5, 0.8}
	for _, c := range []struct {
		name  string
		arg   map[string]any
		model copoly.Model
	}{
		{"penultimate", penArg, pen},
		{"implicit", implArg, impl},
	} {
		t.Run(c.name, func(t *testing.T) {
			b, err := copoly.NewBatch(c.model, 0.3)
			if err != nil {
				t.Fatal(err)
			}
			d, err := b.Drift(xs)
			if err != nil {
				t.Fatal(err)
			}
			r := call(api, "drift", args(c.arg, map[string]any{"f10": 0.3, "conversion": conv, "molarMass1": 104.15, "molarMass2": 128.17}))
			wantNoError(t, r)
			sameFloats(t, "conversion", floatsOf(t, r.Get("conversion")), d.Conversion)
			sameFloats(t, "f1", floatsOf(t, r.Get("f1")), d.Feed)
			sameFloats(t, "F1", floatsOf(t, r.Get("F1")), d.Inst)
			sameFloats(t, "F1cum", floatsOf(t, r.Get("F1cum")), d.Cum)
			if got := r.Get("method").String(); got != d.Method {
				t.Errorf("method = %q, want %q", got, d.Method)
			}
			mass := make([]float64, len(xs))
			for i, x := range xs {
				mass[i] = copoly.MassConversion(x, 0.3, d.Feed[i], 104.15, 128.17)
			}
			sameFloats(t, "conversionMass", floatsOf(t, r.Get("conversionMass")), mass)
			// Limit and distribution for any model: the same copoly routines the terminal model uses.
			lim, err := b.ConversionLimit(0.02)
			if err != nil {
				t.Fatal(err)
			}
			if got := r.Get("limit").Get("conversion").Float(); got != lim {
				t.Errorf("limit = %v, want %v (copoly.Batch.ConversionLimit)", got, lim)
			}
			if r.Get("distribution").IsNull() {
				t.Errorf("distribution is null for %s", c.name)
			}
		})
	}
	t.Run("terminal named", func(t *testing.T) {
		named := call(api, "drift", args(termArg, map[string]any{"f10": 0.3, "conversion": conv}))
		bare := call(api, "drift", args(termBare, map[string]any{"f10": 0.3, "conversion": conv}))
		wantNoError(t, named)
		if stringify(named) != stringify(bare) {
			t.Errorf("drift(model: terminal) = %s, want %s", stringify(named), stringify(bare))
		}
		if named.Get("limit").IsNull() || named.Get("distribution").IsNull() {
			t.Errorf("terminal drift without limit or distribution: %s", stringify(named))
		}
	})
}

func TestSequenceModels(t *testing.T) {
	api, _ := testAPI(t)
	for _, c := range []struct {
		name string
		arg  map[string]any
		want func() (copoly.Sequence, error)
	}{
		{"penultimate", penArg, func() (copoly.Sequence, error) { return pen.Sequence(0.4) }},
		{"implicit", implArg, func() (copoly.Sequence, error) { return impl.Penultimate().Sequence(0.4) }},
	} {
		t.Run(c.name, func(t *testing.T) {
			s, err := c.want()
			if err != nil {
				t.Fatal(err)
			}
			r := call(api, "sequence", args(c.arg, map[string]any{"f1": 0.4, "conversion": 0.5, "maxLength": 5}))
			wantNoError(t, r)
			sameSequence(t, r, s)
			for _, k := range []string{"runLengths", "batch"} {
				if !r.Get(k).IsUndefined() {
					t.Errorf("%s = %s for the %s model, want it absent", k, stringify(r.Get(k)), c.name)
				}
			}
		})
	}
	t.Run("implicit is terminal", func(t *testing.T) {
		// The implicit model's sequence is the terminal one (Implicit doc comment); the
		// second-order chain gives it to rounding.
		r := call(api, "sequence", args(implArg, map[string]any{"f1": 0.4}))
		wantNoError(t, r)
		s, _ := copoly.Terminal{R1: 0.8, R2: 0.15}.Sequence(0.4)
		if got := r.Get("triads").Get("112").Float(); math.Abs(got-s.T112) > 1e-12 {
			t.Errorf("implicit triads.112 = %v, want the terminal %v", got, s.T112)
		}
	})
}

// TestModelArgsErrors checks the errors of the model options for each method that takes them.
func TestModelArgsErrors(t *testing.T) {
	api, _ := testAPI(t)
	rest := map[string]map[string]any{
		"composition": {"f1": []any{0.5}},
		"drift":       {"f10": 0.5, "conversion": []any{0.5}},
		"sequence":    {"f1": 0.5},
		"chains":      {"f10": 0.5, "count": 10},
	}
	for method, r := range rest {
		for _, c := range []struct {
			name        string
			arg         map[string]any
			field, text string
		}{
			{"model unknown", map[string]any{"model": "ultimate", "r1": 1, "r2": 1}, "model", `"ultimate"`},
			{"model a number", map[string]any{"model": 2, "r1": 1, "r2": 1}, "model", "must be text"},
			{"model too long", map[string]any{"model": "penultimate-penultimate-penultimate"}, "model", "the limit is 32"},
			{"terminal named, r2 missing", map[string]any{"model": "terminal", "r1": 1}, "r2", "missing: the terminal model takes r1, r2"},
			{"penultimate r12 missing", args(penArg, map[string]any{"r12": nil}), "r12", "missing: the penultimate model takes r11, r21, r22, r12"},
			{"penultimate r11 missing with r1 given", map[string]any{"model": "penultimate", "r1": 1, "r2": 1}, "r11", "missing"},
			{"penultimate r22 negative", args(penArg, map[string]any{"r22": -0.1}), "r22", "negative"},
			{"penultimate r21 text", args(penArg, map[string]any{"r21": "0.4"}), "r21", "must be a number"},
			{"penultimate r11 NaN", args(penArg, map[string]any{"r11": math.NaN()}), "r11", "finite"},
			{"implicit s2 missing", args(implArg, map[string]any{"s2": nil}), "s2", "missing: the implicit model takes r1, r2, s1, s2"},
			{"implicit s1 zero", args(implArg, map[string]any{"s1": 0}), "s1", "positive"},
			{"implicit r2 too large", args(implArg, map[string]any{"r2": 1e5}), "r2", "outside"},
		} {
			t.Run(method+" "+c.name, func(t *testing.T) {
				wantError(t, call(api, method, args(r, c.arg)), c.field, c.text)
			})
		}
		// The same rest with a good model is good.
		for _, m := range []map[string]any{penArg, implArg, termArg} {
			wantNoError(t, call(api, method, args(r, m)))
		}
	}
	for _, c := range []struct {
		name, method string
		arg          map[string]any
		field, text  string
	}{
		{"composition f1 out of range", "composition", args(penArg, map[string]any{"f1": []any{0.5, 1.5}}), "f1[1]", "between 0 and 1"},
		{"composition f1 NaN", "composition", args(implArg, map[string]any{"f1": []any{math.NaN()}}), "f1[0]", "finite"},
		{"drift by mass without molar masses", "drift", args(penArg, map[string]any{"f10": 0.5, "conversion": []any{0.5}, "basis": "mass"}), "molarMass1", "both molar masses"},
		{"drift conversion decreasing", "drift", args(penArg, map[string]any{"f10": 0.5, "conversion": []any{0.5, 0.4}}), "conversion[1]", "must not decrease"},
		{"drift f10 above one", "drift", args(implArg, map[string]any{"f10": 1.5, "conversion": []any{0.5}}), "f10", "between 0 and 1"},
		{"sequence f1 above one", "sequence", args(penArg, map[string]any{"f1": 1.5}), "f1", "between 0 and 1"},
		{"sequence unused conversion still checked", "sequence", args(penArg, map[string]any{"f1": 0.5, "conversion": 2}), "conversion", "between 0 and 1"},
		{"sequence maxLength still checked", "sequence", args(implArg, map[string]any{"f1": 0.5, "maxLength": 0}), "maxLength", "between 1 and 1000"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, c.method, c.arg), c.field, c.text)
		})
	}
}
