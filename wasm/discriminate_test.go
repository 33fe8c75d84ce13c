//go:build js && wasm

package main

import (
	"math"
	"syscall/js"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"copoly/copoly"
	"copoly/copoly/fit"
)

// triadSet returns a small set of runs generated from the penultimate model pen (invented
// ratios) with copoly.Penultimate.Sequence: five runs with the composition and every triad, one
// with the composition only and one with two triads marked -1; as fit.TriadRun (not measured
// = -1) and as the JS rows of the d.ts.
func triadSet(t *testing.T) ([]fit.TriadRun, []any) {
	t.Helper()
	var runs []fit.TriadRun
	var rows []any
	for _, f := range []float64{0.15, 0.3, 0.5, 0.7, 0.85} {
		s, err := pen.Sequence(f)
		if err != nil {
			t.Fatal(err)
		}
		runs = append(runs, fit.TriadRun{F10: f, F1: s.F1, A111: s.T111, A112: s.T112, A212: s.T212, A222: s.T222, A221: s.T221, A121: s.T121})
		rows = append(rows, map[string]any{"f10": f, "F1": s.F1, "A111": s.T111, "A112": s.T112, "A212": s.T212, "A222": s.T222, "A221": s.T221, "A121": s.T121})
	}
	s, _ := pen.Sequence(0.6)
	runs = append(runs, fit.TriadRun{F10: 0.6, F1: s.F1, A111: -1, A112: -1, A212: -1, A222: -1, A221: -1, A121: -1})
	rows = append(rows, map[string]any{"f10": 0.6, "F1": s.F1})
	s, _ = pen.Sequence(0.4)
	runs = append(runs, fit.TriadRun{F10: 0.4, F1: -1, A111: s.T111, A112: s.T112, A212: s.T212, A222: -1, A221: -1, A121: s.T121})
	rows = append(rows, map[string]any{"f10": 0.4, "F1": -1, "A111": s.T111, "A112": s.T112, "A212": s.T212, "A222": -1, "A221": nil, "A121": s.T121})
	return runs, rows
}

func sameFit(t *testing.T, v js.Value, f fit.ModelFit) {
	t.Helper()
	if got := v.Get("model").String(); got != f.Model {
		t.Errorf("model = %q, want %q", got, f.Model)
	}
	sameFloats(t, f.Model+".params", floatsOf(t, v.Get("params")), f.Params)
	se := v.Get("se")
	if se.Length() != len(f.SE) {
		t.Fatalf("%s.se has %d values, want %d", f.Model, se.Length(), len(f.SE))
	}
	for i, x := range f.SE {
		if math.IsNaN(x) {
			if !se.Index(i).IsNull() {
				t.Errorf("%s.se[%d] = %s, want null for NaN", f.Model, i, stringify(se.Index(i)))
			}
		} else if se.Index(i).Float() != x {
			t.Errorf("%s.se[%d] = %s, want %v", f.Model, i, stringify(se.Index(i)), x)
		}
	}
	for _, c := range []struct {
		key  string
		want float64
	}{{"ssr", f.SSR}, {"n", float64(f.N)}, {"k", float64(f.K)}, {"aic", f.AIC}, {"aicc", f.AICc}} {
		if got := v.Get(c.key).Float(); got != c.want {
			t.Errorf("%s.%s = %v, want %v", f.Model, c.key, got, c.want)
		}
	}
}

func TestDiscriminate(t *testing.T) {
	api, _ := testAPI(t)
	runs, rows := triadSet(t)
	r := call(api, "discriminate", map[string]any{"runs": rows})
	wantNoError(t, r)
	d, err := fit.Discriminate(runs)
	if err != nil {
		t.Fatal(err)
	}
	sameFit(t, r.Get("terminal"), d.Terminal)
	sameFit(t, r.Get("penultimate"), d.Penultimate)
	// Measured values counted by hand from triadSet: five runs of F1 and the four independent
	// triads (A111 and A222 left out, Discriminate's doc comment), one F1, and A112, A212, A121.
	if got := r.Get("terminal").Get("n").Int(); got != 5*5+1+3 {
		t.Errorf("n = %d, want 29 measured values", got)
	}
	for _, c := range []struct {
		key  string
		want float64
	}{{"F", d.F}, {"deltaAIC", d.DeltaAIC}} {
		if got := r.Get(c.key).Float(); got != c.want {
			t.Errorf("%s = %v, want %v", c.key, got, c.want)
		}
	}
	if p := r.Get("pValue"); math.IsNaN(d.PValue) && !p.IsNull() || !math.IsNaN(d.PValue) && p.Float() != d.PValue {
		t.Errorf("pValue = %s, want %v", stringify(p), d.PValue)
	}
	if r.Get("supported").Bool() != d.Supported || r.Get("verdict").String() != d.Verdict {
		t.Errorf("supported, verdict = %v, %q, want %v, %q", r.Get("supported").Bool(), r.Get("verdict").String(), d.Supported, d.Verdict)
	}

	// predicted: each fitted model's composition and triads at every run's feed.
	tp, pp := d.Terminal.Params, d.Penultimate.Params
	for _, c := range []struct {
		key string
		seq func(f float64) (copoly.Sequence, error)
	}{
		{"terminal", copoly.Terminal{R1: tp[0], R2: tp[1]}.Sequence},
		{"penultimate", copoly.Penultimate{R11: pp[0], R21: pp[1], R22: pp[2], R12: pp[3]}.Sequence},
	} {
		pred := r.Get("predicted").Get(c.key)
		if pred.Length() != len(runs) {
			t.Fatalf("predicted.%s has %d rows, want %d", c.key, pred.Length(), len(runs))
		}
		for i, run := range runs {
			s, err := c.seq(run.F10)
			if err != nil {
				t.Fatal(err)
			}
			row := pred.Index(i)
			for _, v := range []struct {
				key  string
				want float64
			}{{"f10", run.F10}, {"F1", s.F1}, {"A111", s.T111}, {"A112", s.T112}, {"A212", s.T212}, {"A222", s.T222}, {"A221", s.T221}, {"A121", s.T121}} {
				if got := row.Get(v.key); got.Type() != js.TypeNumber || got.Float() != v.want {
					t.Errorf("predicted.%s[%d].%s = %s, want %v", c.key, i, v.key, stringify(got), v.want)
				}
			}
		}
	}
	// The data come from a penultimate model, so its fit reproduces them; a check on copoly
	// through the bridge (the exact data are fitted to rounding).
	if ssr := r.Get("penultimate").Get("ssr").Float(); !scalar.EqualWithinAbs(ssr, 0, 1e-12) {
		t.Errorf("penultimate ssr = %v on data generated by the penultimate model, want ≈ 0", ssr)
	}
}

func TestDiscriminateErrors(t *testing.T) {
	api, _ := testAPI(t)
	_, rows := triadSet(t)
	with := func(i int, key string, v any) map[string]any {
		rs := make([]any, len(rows))
		copy(rs, rows)
		row := args(rows[i].(map[string]any), map[string]any{key: v})
		if v == nil {
			delete(row, key)
		}
		rs[i] = row
		return map[string]any{"runs": rs}
	}
	for _, c := range []struct {
		name        string
		arg         any
		field, text string
	}{
		{"runs missing", map[string]any{}, "runs", "missing"},
		{"runs an object", map[string]any{"runs": map[string]any{"f10": 0.5}}, "runs", "a list of objects"},
		{"runs empty", map[string]any{"runs": []any{}}, "runs", "between 1 and 1000"},
		{"too many runs", map[string]any{"runs": jsEval(`new Array(1001).fill({f10: 0.5, F1: 0.5})`)}, "runs", "at most 1000"},
		{"row a number", map[string]any{"runs": []any{0.5}}, "runs[0]", "an object"},
		{"f10 missing", with(2, "f10", nil), "runs[2].f10", "missing"},
		{"f10 one", with(2, "f10", 1), "runs[2].f10", "both monomers"},
		{"f10 above one", with(0, "f10", 1.5), "runs[0].f10", "between 0 and 1"},
		{"triad above one", with(1, "A112", 1.4), "runs[1].A112", "not measured"},
		{"triad negative, not -1", with(3, "A221", -0.2), "runs[3].A221", "not measured"},
		{"triad NaN", with(4, "A121", math.NaN()), "runs[4].A121", "finite"},
		{"F1 text", with(0, "F1", "0.4"), "runs[0].F1", "must be a number"},
		{"too few values", map[string]any{"runs": []any{map[string]any{"f10": 0.5, "F1": 0.5, "A112": 0.5}, map[string]any{"f10": 0.3, "F1": 0.3}}}, "runs", "at least 6"},
	} {
		t.Run(c.name, func(t *testing.T) {
			wantError(t, call(api, "discriminate", c.arg), c.field, c.text)
		})
	}
}
