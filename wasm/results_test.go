//go:build js && wasm

package main

import (
	"cmp"
	"math"
	"testing"

	"copoly/copoly"
	"copoly/copoly/fit"
	"copoly/copoly/molarmass"
	"copoly/copoly/plan"
)

// The results of the methods. The bridge adds no science (the science is tested in copoly and
// its packages, against published values, scipy and numpy), so each result is compared with
// a direct call of copoly on the input the argument stands for: that checks the reading of the
// argument and its defaults (site/copoly.d.ts). The paths name every key of every result type
// at least once, which checks the conversion back. The few values worked by hand name their
// source; the ratios 0.80/0.15 and the molar masses of styrene (C8H8) and n-butyl acrylate
// (C7H12O2) are those of the demo project, the other ratios are invented for the tests.

var (
	term    = copoly.Terminal{R1: 0.8, R2: 0.15}
	pen     = copoly.Penultimate{R11: 0.9, R21: 0.4, R22: 0.2, R12: 0.6}
	penArg  = map[string]any{"model": "penultimate", "r11": 0.9, "r21": 0.4, "r22": 0.2, "r12": 0.6}
	impl    = copoly.Implicit{R1: 0.8, R2: 0.15, S1: 0.5, S2: 2}
	implArg = map[string]any{"model": "implicit", "r1": 0.8, "r2": 0.15, "s1": 0.5, "s2": 2}
	termArg = map[string]any{"r1": 0.8, "r2": 0.15}
)

const (
	mmSt  = 104.15 // styrene, g/mol from standard atomic weights (as in project.Demo)
	mmNBA = 128.17 // n-butyl acrylate, g/mol from standard atomic weights (as in project.Demo)
)

func ptr(x float64) *float64 { return &x }

// result is one call and what its result must hold, by path (wantAt).
type result struct {
	name, method string
	arg          any
	want         map[string]any
}

func runResults(t *testing.T, cases []result) {
	api, _ := testAPI(t)
	for _, c := range cases {
		t.Run(c.method+" "+c.name, func(t *testing.T) {
			r := call(api, c.method, jsOf(c.arg))
			wantNoError(t, r)
			wantAt(t, r, c.want)
		})
	}
}

// sequencePaths are the keys of a SequenceStats object at prefix.
func sequencePaths(prefix string, s copoly.Sequence) map[string]any {
	m := map[string]any{}
	for k, v := range map[string]float64{
		"F1": s.F1, "p11": s.P11, "p12": s.P12, "p21": s.P21, "p22": s.P22,
		"dyads.11": s.D11, "dyads.12": s.D12, "dyads.22": s.D22,
		"triads.111": s.T111, "triads.112": s.T112, "triads.212": s.T212,
		"triads.222": s.T222, "triads.221": s.T221, "triads.121": s.T121,
		"meanLength1": s.MeanLength1, "meanLength2": s.MeanLength2, "runNumber": s.RunNumber, "randomness": s.Randomness,
	} {
		m[prefix+k] = v
	}
	return m
}

func TestModelResults(t *testing.T) {
	feeds := []float64{0, 0.25, 0.5, 1}
	inst := func(m copoly.Model) []float64 {
		out := make([]float64, len(feeds))
		for i, f := range feeds {
			out[i] = m.Instantaneous(f)
		}
		return out
	}
	az, _ := term.Azeotrope()
	c := term.Classify()
	ff := must(term.FeedFor(0.55))

	xs := []float64{0, 0.3, 0.6, 0.9}
	d := must(term.Drift(0.5, xs))
	batch := must(copoly.NewBatch(term, 0.5))
	limit := must(batch.ConversionLimit(0.05))
	dist := must(batch.Distribution(0.9, 5, 0, 0))
	mass := make([]float64, len(xs))
	for i, x := range xs {
		mass[i] = copoly.MassConversion(x, 0.5, d.Feed[i], mmSt, mmNBA)
	}
	exh := must(term.Drift(0.5, []float64{0.5, 1}))
	if exh.Exhausted == nil {
		t.Fatal("copoly reports no exhaustion at X = 1; pick another case")
	}
	byMass := must(copoly.ProfileOf(copoly.ProfileInput{Model: term, F10: 0.5, Conversion: []float64{0.1, 0.5, 0.9},
		Basis: "mass", MolarMass1: ptr(mmSt), MolarMass2: ptr(mmNBA), Tolerance: 0.02, Bins: 20}))
	driftOf := func(m copoly.Model) map[string]any {
		b := must(copoly.NewBatch(m, 0.3))
		d := must(b.Drift(xs))
		mass := make([]float64, len(xs))
		for i, x := range xs {
			mass[i] = copoly.MassConversion(x, 0.3, d.Feed[i], mmSt, mmNBA)
		}
		return map[string]any{"conversion": d.Conversion, "f1": d.Feed, "F1": d.Inst, "F1cum": d.Cum, "method": d.Method,
			"conversionMass": mass, "limit.conversion": must(b.ConversionLimit(0.02)), "distribution.basis": "mass"}
	}

	s := must(term.Sequence(0.4))
	rl := must(term.RunLengths(0.4, 5))
	bs := must(must(copoly.NewBatch(term, 0.4)).Sequence(0.8))

	runResults(t, []result{
		{"terminal", "composition", args(termArg, map[string]any{"f1": feeds}), map[string]any{
			"F1": inst(term), "azeotrope": az, "classification.kind": c.Kind, "classification.product": c.Product, "classification.text": c.Text}},
		// r1 = r2 = 1: F1 = f1 (Mayo–Lewis 1944 equation with r1 = r2 = 1).
		{"ideal by hand", "composition", map[string]any{"r1": 1, "r2": 1, "f1": []any{0.25}}, map[string]any{"F1": []float64{0.25}}},
		{"Float64Array", "composition", jsEval(`{r1: 0.8, r2: 0.15, f1: new Float64Array([0, 0.25, 0.5, 1])}`), map[string]any{"F1": inst(term)}},
		// No azeotrope for r1 > 1 > r2 (Mayo–Lewis 1944): null, not absent.
		{"no azeotrope, no feeds", "composition", map[string]any{"r1": 2, "r2": 0.5, "f1": []any{}}, map[string]any{"azeotrope": null, "F1": []float64{}}},
		{"terminal named", "composition", args(termArg, map[string]any{"model": "terminal", "f1": feeds}), map[string]any{"F1": inst(term), "azeotrope": az}},
		{"penultimate", "composition", args(penArg, map[string]any{"f1": feeds}), map[string]any{"F1": inst(pen), "azeotrope": null, "classification": null}},
		{"implicit", "composition", args(implArg, map[string]any{"f1": feeds}), map[string]any{"F1": inst(impl), "azeotrope": null, "classification": null}},

		{"", "feedFor", args(termArg, map[string]any{"targetF1": 0.55}), map[string]any{"feeds": ff.Feeds, "note": ff.Note, "range": []float64{ff.Min, ff.Max}}},

		{"molar", "drift", args(termArg, map[string]any{"f10": 0.5, "conversion": xs, "tolerance": 0.05, "bins": 5}), map[string]any{
			"conversion": d.Conversion, "f1": d.Feed, "F1": d.Inst, "F1cum": d.Cum, "method": d.Method,
			"limit.tolerance": 0.05, "limit.conversion": limit, "exhausted": null, "conversionMass": absent,
			"distribution.edges": dist.Edges, "distribution.weights": dist.Weights, "distribution.basis": "moles"}},
		// Defaults of site/copoly.d.ts: tolerance 0.02, 20 bins.
		{"defaults", "drift", args(termArg, map[string]any{"f10": 0.5, "conversion": []any{0.5}}), map[string]any{
			"limit.tolerance": 0.02, "distribution.weights.length": 20}},
		{"molar masses", "drift", args(termArg, map[string]any{"f10": 0.5, "conversion": xs, "molarMass1": mmSt, "molarMass2": mmNBA}), map[string]any{
			"conversionMass": mass, "distribution.basis": "mass"}},
		{"by mass", "drift", args(termArg, map[string]any{"f10": 0.5, "conversion": []any{0.1, 0.5, 0.9}, "basis": "mass", "molarMass1": mmSt, "molarMass2": mmNBA}), map[string]any{
			"conversionMass": []float64{0.1, 0.5, 0.9}, "conversion": byMass.Conversion, "f1": byMass.Feed}},
		{"exhausted", "drift", args(termArg, map[string]any{"f10": 0.5, "conversion": []any{0.5, 1}}), map[string]any{
			"exhausted.monomer": exh.Exhausted.Monomer, "exhausted.conversion": exh.Exhausted.Conversion}},
		{"penultimate", "drift", args(penArg, map[string]any{"f10": 0.3, "conversion": xs, "molarMass1": mmSt, "molarMass2": mmNBA}), driftOf(pen)},
		{"implicit", "drift", args(implArg, map[string]any{"f10": 0.3, "conversion": xs, "molarMass1": mmSt, "molarMass2": mmNBA}), driftOf(impl)},

		{"terminal", "sequence", args(termArg, map[string]any{"f1": 0.4, "maxLength": 5}), args(sequencePaths("", s), map[string]any{
			"runLengths.length": rl.Length, "runLengths.number1": rl.Number1, "runLengths.weight1": rl.Weight1,
			"runLengths.number2": rl.Number2, "runLengths.weight2": rl.Weight2, "batch": absent})},
		// Default maxLength (site/copoly.d.ts): 20; with a conversion, the batch average.
		{"batch", "sequence", args(termArg, map[string]any{"f1": 0.4, "conversion": 0.8}), args(sequencePaths("batch.", bs), map[string]any{
			"runLengths.length.length": 20, "batch.conversion": 0.8})},
		{"penultimate", "sequence", args(penArg, map[string]any{"f1": 0.4, "conversion": 0.5, "maxLength": 5}), args(
			sequencePaths("", must(pen.Sequence(0.4))), map[string]any{"runLengths": absent, "batch": absent})},
		{"implicit", "sequence", args(implArg, map[string]any{"f1": 0.4}), sequencePaths("", must(impl.Penultimate().Sequence(0.4)))},
	})
}

// simulate is copoly.SimulateChains with the defaults of chains (site/copoly.d.ts): 1000
// chains, length 100 without a dpn, seed 1, 12 sample chains, 30 bins; the statistics and the
// keys every simulation has.
func simulate(opt copoly.ChainOptions) (*copoly.ChainStats, map[string]any) {
	opt.Count = cmp.Or(opt.Count, 1000)
	if opt.DPn == 0 {
		opt.Length = cmp.Or(opt.Length, 100)
	}
	opt.Seed, opt.Samples, opt.Bins = cmp.Or(opt.Seed, 1), 12, cmp.Or(opt.Bins, 30)
	st := must(copoly.SimulateChains(opt))
	return st, map[string]any{"compositions": st.Compositions, "lengths": st.Lengths, "units": st.Units, "samples": st.Samples,
		"mean": st.Mean, "variance": st.Variance, "weightMean": st.WeightMean,
		"histogram.edges": st.Composition.Edges, "histogram.weights": st.Composition.Weights}
}

func TestChainsResults(t *testing.T) {
	dpnStats, dpn := simulate(copoly.ChainOptions{Model: term, F10: 0.5, DPn: 50})
	st, functional := simulate(copoly.ChainOptions{Model: term, F10: 0.2, Functional: 2, Count: 500, Length: 40, Seed: 7, Bins: 12})
	_, drift := simulate(copoly.ChainOptions{Model: term, F10: 0.5, DPn: 30, Conversion: 0.9, Count: 300})
	_, penultimate := simulate(copoly.ChainOptions{Model: pen, F10: 0.4, DPn: 80, Functional: 1, Count: 200})
	_, named := simulate(copoly.ChainOptions{Model: term, F10: 0.5})
	stock := must(term.Stockmayer(0.5, 50, dpnStats.Composition.Edges))
	runResults(t, []result{
		// Defaults of site/copoly.d.ts: 12 chains of 60 units, seed 1; bins are for a simulation only.
		{"samples", "chains", args(termArg, map[string]any{"f10": 0.5, "bins": 10}), map[string]any{
			"": chainsOut{Samples: must(term.Chains(0.5, 12, 60, 1))}}},
		{"samples with options", "chains", args(termArg, map[string]any{"f10": 0.5, "count": 3, "length": 7, "seed": 42}), map[string]any{
			"samples": must(term.Chains(0.5, 3, 7, 42))}},
		{"dpn", "chains", args(termArg, map[string]any{"f10": 0.5, "dpn": 50}), args(dpn, map[string]any{
			"stockmayer": stock, "stockmayerVariance": dpnStats.StockmayerVariance, "functionalCounts": absent, "nonFunctional": absent, "expectedNonFunctional": absent})},
		{"functional", "chains", args(termArg, map[string]any{"f10": 0.2, "functional": 2, "count": 500, "length": 40, "seed": 7, "bins": 12}), args(functional, map[string]any{
			"functionalCounts": st.FunctionalCounts, "nonFunctional": st.NonFunctional, "expectedNonFunctional": st.ExpectedNonFunctional,
			"stockmayer": null})}, // a fixed length: Stockmayer's distribution is for a most-probable one
		{"drift", "chains", args(termArg, map[string]any{"f10": 0.5, "dpn": 30, "conversion": 0.9, "count": 300}), args(drift, map[string]any{"stockmayer": null, "stockmayerVariance": null})},
		{"penultimate", "chains", args(penArg, map[string]any{"f10": 0.4, "dpn": 80, "functional": 1, "count": 200}), args(penultimate, map[string]any{"expectedNonFunctional": null, "stockmayer": null})},
		{"model named", "chains", args(termArg, map[string]any{"model": "terminal", "f10": 0.5}), named},
	})
}

// triadSet returns a small set of runs generated from the penultimate model pen with
// copoly.Penultimate.Sequence: five runs with the composition and every triad, one with the
// composition only and one with two triads marked -1; as fit.TriadRun (not measured = -1) and
// as the JS rows of the d.ts.
func triadSet(t *testing.T) ([]fit.TriadRun, []any) {
	t.Helper()
	var runs []fit.TriadRun
	var rows []any
	for _, f := range []float64{0.15, 0.3, 0.5, 0.7, 0.85} {
		s := must(pen.Sequence(f))
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

func TestDiscriminateResult(t *testing.T) {
	runs, rows := triadSet(t)
	d := must(fit.Discriminate(runs))
	want := map[string]any{"F": d.F, "pValue": d.PValue, "deltaAIC": d.DeltaAIC, "supported": d.Supported, "verdict": d.Verdict,
		// Measured values counted by hand from triadSet: five runs of F1 and the four independent
		// triads (A111 and A222 left out, Discriminate's doc comment), one F1, and A112, A212, A121.
		"terminal.n": 5*5 + 1 + 3}
	tp, pp := d.Terminal.Params, d.Penultimate.Params
	for _, c := range []struct {
		key string
		f   fit.ModelFit
		m   copoly.Model
	}{
		{"terminal", d.Terminal, copoly.Terminal{R1: tp[0], R2: tp[1]}},
		{"penultimate", d.Penultimate, copoly.Penultimate{R11: pp[0], R21: pp[1], R22: pp[2], R12: pp[3]}},
	} {
		for k, v := range map[string]any{"model": c.f.Model, "params": c.f.Params, "se": c.f.SE, "ssr": c.f.SSR, "n": c.f.N, "k": c.f.K, "aic": c.f.AIC, "aicc": c.f.AICc} {
			want[c.key+"."+k] = v
		}
		// Each fitted model's composition and triads at every run's feed.
		for i, run := range runs {
			s := must(c.m.Sequence(run.F10))
			for k, v := range map[string]float64{"f10": run.F10, "F1": s.F1, "A111": s.T111, "A112": s.T112, "A212": s.T212, "A222": s.T222, "A221": s.T221, "A121": s.T121} {
				want[fmtPath("predicted", c.key, i, k)] = v
			}
		}
	}
	runResults(t, []result{{"", "discriminate", map[string]any{"runs": rows}, want}})
}

// Hand case from the definitions of the averages (P. J. Flory, Principles of Polymer Chemistry,
// 1953; the formulas in the BinAverages doc comment): equal masses of chains of 10 000 and
// 30 000 g/mol give
//
//	Mn = Σw / Σ(w/M) = 2/(1/10 000 + 1/30 000) = 15 000
//	Mw = Σ wM / Σ w = (10 000 + 30 000)/2 = 20 000
//	Mz = Σ wM² / Σ wM = (10 000² + 30 000²)/40 000 = 25 000,  Đ = 20 000/15 000 = 4/3
//
// and with F1 = 0.4 of monomers of 100 and 200 g/mol (the SizeOf doc comment) a unit of
// 0.4·100 + 0.6·200 = 160 g/mol, DPn = 15 000/160 = 93.75, DPw = 20 000/160 = 125, and
// 0.4·93.75 = 37.5 and 0.6·93.75 = 56.25 units of each monomer per chain.
var handAverages = map[string]any{"Mn": near(15000), "Mw": near(20000), "Mz": near(25000), "dispersity": near(4.0 / 3), "size": absent}

func TestAveragesResults(t *testing.T) {
	bin := func(low, high float64, key string, x float64) map[string]any {
		return map[string]any{"low": low, "high": high, key: x}
	}
	slice := func(mass, signal float64) map[string]any { return map[string]any{"mass": mass, "signal": signal} }
	two := []any{slice(1e4, 1), slice(3e4, 1)}
	a := must(molarmass.SliceAverages([]float64{1e4, 3e4}, []float64{1, 1}))
	size := must(molarmass.SizeOf(a, 0.4, 100, 200))
	runResults(t, []result{
		{"weight fractions", "averages", map[string]any{"bins": []any{bin(1e4, 1e4, "weightFraction", 0.5), bin(3e4, 3e4, "weightFraction", 0.5)}}, handAverages},
		// Equal masses are three chains of 10 000 g/mol for each of 30 000 g/mol.
		{"number fractions", "averages", map[string]any{"bins": []any{bin(1e4, 1e4, "numberFraction", 0.75), bin(3e4, 3e4, "numberFraction", 0.25)}}, handAverages},
		{"slices", "averages", map[string]any{"slices": []any{slice(1e4, 2.5), slice(3e4, 2.5)}}, handAverages},
		{"empty bins with slices", "averages", map[string]any{"bins": []any{}, "slices": two}, handAverages},
		{"size", "averages", map[string]any{"slices": two, "F1": 0.4, "molarMass1": 100, "molarMass2": 200}, map[string]any{
			"Mz": a.Mz, "size.unitMass": near(160), "size.DPn": near(93.75), "size.DPw": near(125), "size.units1": near(37.5), "size.units2": near(56.25),
			"size.DPn#copoly": size.DPn, "size.units2#copoly": size.Units2}},
		{"F1 alone", "averages", map[string]any{"slices": two, "F1": 0.4}, map[string]any{"size": absent}},
		{"molar masses alone", "averages", map[string]any{"slices": two, "molarMass1": 100, "molarMass2": 200}, map[string]any{"size": absent}},
	})
}

func TestLibraryResult(t *testing.T) {
	ms, ps := copoly.Monomers(), copoly.Pairs()
	want := map[string]any{"monomers.length": len(ms), "pairs.length": len(ps)}
	for i, m := range ms {
		pr, ok := copoly.PropertiesOf(m.Name)
		if !ok {
			t.Fatalf("%s has no process data in copoly; MonomerData needs it", m.Name)
		}
		row := map[string]any{"name": m.Name, "formula": m.Formula, "molarMass": m.MolarMass, "source": m.Source,
			"state": pr.State, "density": pr.Density, "densityTemp": pr.DensityTemp, "densitySource": pr.DensitySource,
			"heat": pr.HeatOfPolymerization, "heatSource": pr.HeatSource, "hazards": orNoTexts(pr.Hazards), "hazardSource": pr.HazardSource,
			"q": null, "e": null, "qeSource": ""}
		if q, ok := copoly.QEOf(m.Name); ok {
			row["q"], row["e"], row["qeSource"] = q.Q, q.E, q.Source
		}
		for k, v := range row {
			want[fmtPath("monomers", i, k)] = v
		}
	}
	for i, p := range ps {
		for k, v := range map[string]any{"monomer1": p.Monomer1, "monomer2": p.Monomer2, "r1": p.R1, "r2": p.R2, "temperature": p.Temperature, "source": p.Source} {
			want[fmtPath("pairs", i, k)] = v
		}
	}
	runResults(t, []result{{"", "library", map[string]any{}, want}})
}

// fitRuns returns eight runs made from the terminal model with r1 = 0.8, r2 = 0.15
// (copoly.Terminal.Cumulative at each feed and conversion) with a fixed offset of ±0.006 on F1
// and all three uncertainties, so that every estimation method runs; both as Go runs and as the
// JS objects of the d.ts.
func fitRuns() ([]copoly.Run, []any) {
	feeds := []float64{0.10, 0.20, 0.30, 0.40, 0.50, 0.60, 0.70, 0.85}
	convs := []float64{0.04, 0.12, 0.06, 0.25, 0.05, 0.32, 0.18, 0.08}
	runs := make([]copoly.Run, len(feeds))
	objs := make([]any, len(feeds))
	for i, f := range feeds {
		off := 0.006
		if i%2 == 1 {
			off = -off
		}
		r := copoly.Run{F10: f, Conversion: convs[i], F1: term.Cumulative(f, convs[i]) + off, SF: 0.01, SX: 0.01, Sf: 0.005}
		runs[i] = r
		objs[i] = map[string]any{"f10": r.F10, "conversion": r.Conversion, "F1": r.F1, "sF": r.SF, "sX": r.SX, "sf": r.Sf}
	}
	return runs, objs
}

func regionPaths(prefix string, r fit.Region) map[string]any {
	m := map[string]any{prefix + "jcr": r.Boundary}
	for k, v := range map[string]any{"level": r.Level, "kind": r.Kind, "critical": r.Critical, "boundary": r.Boundary, "open": r.Open,
		"r1Min": r.R1Min, "r1Max": r.R1Max, "r2Min": r.R2Min, "r2Max": r.R2Max} {
		m[prefix+"region."+k] = v
	}
	return m
}

func warningsOf(ws []fit.Warning) []any {
	out := make([]any, len(ws))
	for i, w := range ws {
		out[i] = map[string]any{"method": w.Method, "row": w.Row, "field": w.Field, "message": w.Message, "code": w.Code}
	}
	return out
}

func TestFitResults(t *testing.T) {
	runs, objs := fitRuns()
	e := must(fit.Estimate(runs, 0))
	want := map[string]any{"recommended": "evm", "warnings": warningsOf(e.Warnings),
		"swappedFinemanRoss.r1": e.SwappedFinemanRoss.R1, "swappedFinemanRoss.r2": e.SwappedFinemanRoss.R2}
	for k, tr := range map[string]fit.Trend{"feed": e.TrendFeed, "conversion": e.TrendConversion} {
		want["trends."+k+".slope"], want["trends."+k+".pValue"], want["trends."+k+".flagged"] = tr.Slope, tr.PValue, tr.Flagged
	}
	for _, c := range []struct {
		name  string
		l     *fit.Linear
		alpha any
	}{
		{"fineman-ross", e.FinemanRoss, absent}, {"inverted-fineman-ross", e.InvertedFinemanRoss, absent},
		{"kelen-tudos", e.KelenTudos, e.KelenTudos.Alpha}, {"extended-kelen-tudos", e.ExtendedKelenTudos, e.ExtendedKelenTudos.Alpha},
	} {
		for k, v := range map[string]any{"r1": c.l.R1, "r2": c.l.R2, "slope": c.l.Slope, "intercept": c.l.Intercept, "x": c.l.X, "y": c.l.Y, "linear": true, "alpha": c.alpha} {
			want["methods."+c.name+"."+k] = v
		}
	}
	ml := e.MayoLewis
	want["methods.mayo-lewis-integrated.r1"], want["methods.mayo-lewis-integrated.r2"] = ml.R1, ml.R2
	want["methods.mayo-lewis-integrated.curves.length"] = len(ml.Curves)
	want["methods.mayo-lewis-integrated.curves.0.r1"], want["methods.mayo-lewis-integrated.curves.0.r2"] = ml.Curves[0][0], ml.Curves[0][1]
	n := e.Nonlinear
	for k, v := range map[string]any{"r1": n.R1, "r2": n.R2, "se1": n.SE1, "se2": n.SE2, "corr": n.Corr, "ssr": n.SSR, "weighted": true, "n": n.N, "dof": n.DoF,
		"reducedChi2": n.ReducedChi2, "pValue": n.PValue, "atBound": n.AtBound, "residuals": n.Residuals, "sigma": n.Sigma} {
		want["methods.nonlinear."+k] = v
	}
	v := e.EVM
	for k, x := range map[string]any{"r1": v.R1, "r2": v.R2, "se1": v.SE1, "se2": v.SE2, "corr": v.Corr, "phi": v.Phi, "reducedChi2": v.ReducedChi2,
		"pValue": v.PValue, "feed": v.Feed, "conversion": v.Conversion, "composition": v.Composition} {
		want["methods.evm."+k] = x
	}

	// The same runs without uncertainties.
	plain, plainObjs := fitRuns()
	for i := range plain {
		plain[i].SF, plain[i].SX, plain[i].Sf = 0, 0, 0
		plainObjs[i] = map[string]any{"f10": plain[i].F10, "conversion": plain[i].Conversion, "F1": plain[i].F1}
	}
	u := must(fit.Estimate(plain, 0))
	runResults(t, []result{
		{"every method", "fit", map[string]any{"runs": objs, "curves": true}, args(want, regionPaths("methods.nonlinear.", n.Region), regionPaths("methods.evm.", v.Region))},
		{"no curves", "fit", map[string]any{"runs": objs}, map[string]any{"methods.mayo-lewis-integrated.r1": ml.R1, "methods.mayo-lewis-integrated.curves": absent}},
		{"level", "fit", map[string]any{"runs": objs, "level": 0.9}, map[string]any{"methods.nonlinear.region.level": 0.9}},
		// Without uncertainties: no EVM (its reason among the warnings), an unweighted fit.
		{"unweighted", "fit", map[string]any{"runs": plainObjs}, map[string]any{"methods.nonlinear.r1": u.Nonlinear.R1, "methods.nonlinear.weighted": false,
			"methods.nonlinear.reducedChi2": absent, "methods.nonlinear.pValue": absent, "methods.nonlinear.sigma": absent,
			"methods.evm": absent, "recommended": "nonlinear", "warnings": warningsOf(u.Warnings)}},
	})
}

func TestNextRunsResults(t *testing.T) {
	runs, objs := fitRuns()
	design := func(d fit.Design) map[string]any {
		next := make([]any, len(d.Next))
		for i, s := range d.Next {
			next[i] = map[string]any{"f10": s.F10, "conversion": s.Conversion}
		}
		return map[string]any{"tidwellMortimer": d.TidwellMortimer[:], "dOptimal": d.DOptimal[:], "middle": d.Middle, "shrink": d.Shrink, "next": next}
	}
	runResults(t, []result{
		{"no runs", "nextRuns", termArg, args(design(must(fit.NextRuns(0.8, 0.15, nil, nil))), map[string]any{
			// Tidwell–Mortimer 1965 approximate feeds, ascending: r2/(2 + r2) and 2/(2 + r1).
			"tidwellMortimer.0": near(0.15 / 2.15), "tidwellMortimer.1": near(2 / 2.8)})},
		{"runs and conversions", "nextRuns", args(termArg, map[string]any{"runs": objs, "conversions": []any{0.1, 0.3}}),
			design(must(fit.NextRuns(0.8, 0.15, runs, []float64{0.1, 0.3})))},
	})
}

func TestQEResult(t *testing.T) {
	q1, _ := copoly.QEOf("styrene")
	q2, _ := copoly.QEOf("n-butyl acrylate")
	r1, r2, err := copoly.RatiosFromQE(q1, q2)
	if err != nil {
		t.Fatal(err)
	}
	runResults(t, []result{{"", "qe", map[string]any{"monomer1": "styrene", "monomer2": "n-butyl acrylate"}, map[string]any{
		"r1": r1, "r2": r2, "q1": q1.Q, "e1": q1.E, "q2": q2.Q, "e2": q2.E, "source1": q1.Source, "source2": q2.Source,
		// Alfrey–Price 1947: r1 = (Q1/Q2) exp[−e1 (e1 − e2)].
		"r1#Alfrey–Price": near(q1.Q / q2.Q * math.Exp(-q1.E*(q1.E-q2.E)))}}})
}

// planArg returns a good plan argument of the given mode with more keys set (key, value, …).
func planArg(mode string, more ...any) map[string]any {
	a := map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.5, "molarMass1": mmSt, "molarMass2": mmNBA, "polymerMass": 1000, "mode": mode}
	for i := 0; i+1 < len(more); i += 2 {
		a[more[i].(string)] = more[i+1]
	}
	return a
}

// planJCR is a small quadrilateral around (0.80, 0.15), the kind of region a fit returns.
var planJCR = [][2]float64{{0.70, 0.15}, {0.80, 0.12}, {0.90, 0.15}, {0.80, 0.18}}

func TestPlanResults(t *testing.T) {
	styrene, ok1 := copoly.PropertiesOf("styrene")
	nba, ok2 := copoly.PropertiesOf("n-butyl acrylate")
	bd, ok3 := copoly.PropertiesOf("1,3-butadiene")
	if !ok1 || !ok2 || !ok3 || bd.State != copoly.StateGas {
		t.Fatal("copoly has no process data for styrene, n-butyl acrylate or 1,3-butadiene as a gas")
	}
	// recipe returns plan.Make of the input of planArg(mode) changed by edit, and the whole
	// result the bridge must give for it (its own conversion, planValue) with more paths.
	recipe := func(mode string, edit func(*plan.Input), more map[string]any) (*plan.Recipe, map[string]any) {
		in := plan.Input{Model: term, TargetF1: 0.5, MolarMass1: mmSt, MolarMass2: mmNBA, PolymerMass: 1000, Mode: mode}
		if edit != nil {
			edit(&in)
		}
		p := must(plan.Make(in))
		return p, args(map[string]any{"": must(planValue(p))}, more)
	}
	made := func(mode string, edit func(*plan.Input), more map[string]any) map[string]any {
		_, want := recipe(mode, edit, more)
		return want
	}
	table := [][2]float64{{0, 0}, {30, 0.2}, {90, 0.6}, {240, 0.97}}
	// The richest result, semibatch with library monomers: every key by path.
	p, named := recipe(plan.ModeSemibatch, func(in *plan.Input) {
		in.RateConstant, in.BatchMass, in.Steps = 0.01, 2500, 50
		in.Monomer1, in.Monomer2 = "styrene", "n-butyl acrylate"
	}, nil)
	for k, v := range map[string]any{"mode": p.Mode, "startF1": p.StartF1, "feedF1": p.FeedF1, "feedPerPolymer": p.FeedPerPolymer,
		"stopConversion": p.StopConversion, "productF1": p.ProductF1, "maxDeviation": p.MaxDeviation, "inventoryMax": p.Safety.InventoryMax,
		"initial.m1": p.Charge1, "initial.m2": p.Charge2, "initial.n1": p.Moles1, "initial.n2": p.Moles2, "total.m1": p.Total1, "total.m2": p.Total2,
		// Volumes: mass over the library density (both are liquids).
		"initial.v1": p.Charge1 / styrene.Density, "initial.v2": p.Charge2 / nba.Density,
		"distribution.edges": p.Distribution.Edges, "distribution.weights": p.Distribution.Weights, "distribution.basis": p.Distribution.Basis,
		"safety.inventoryMax": p.Safety.InventoryMax, "safety.inventoryAt": p.Safety.InventoryAt, "safety.heat": p.Safety.Heat,
		"safety.rise": p.Safety.Rise, "safety.riseLimit": p.Safety.RiseLimit, "safety.flagged": p.Safety.Flagged,
		"safety.batchMass": p.Safety.BatchMass, "safety.heatCapacity": p.Safety.HeatCapacity,
		"safety.hazards.0.monomer": "styrene", "safety.hazards.0.hazards": styrene.Hazards, "safety.hazards.1.monomer": "n-butyl acrylate",
		"notes": orNoTexts(p.Notes), "schedule.length": len(p.Schedule), "shots": []any{}, "band": absent} {
		named[k] = v
	}
	r := p.Schedule[10]
	for k, v := range map[string]any{"conversion": r.Conversion, "polymer": r.Polymer, "fed1": r.Fed1, "fed2": r.Fed2, "f1": r.Feed, "F1": r.Inst,
		"F1cum": r.Cum, "inventory": r.Inventory, "time": r.Time, "pump1": r.Pump1, "pump2": r.Pump2} {
		named["schedule.10."+k] = v
	}
	shots, shotsWant := recipe(plan.ModeShots, func(in *plan.Input) {
		in.HalfLife, in.Shots, in.Monomer1, in.Monomer2 = 120, 40, "styrene", "1,3-butadiene"
	}, nil)
	for k, v := range map[string]any{"shots.length": 40, "initial.v2": null, "shots.3.polymer": shots.Shots[3].Polymer,
		"shots.3.m1": shots.Shots[3].Mass1, "shots.3.m2": shots.Shots[3].Mass2, "shots.3.time": shots.Shots[3].Time} {
		shotsWant[k] = v
	}
	band := func(mode string, samples int, seed uint64, edit func(*plan.Input)) map[string]any {
		in := plan.Input{Model: term, TargetF1: 0.5, MolarMass1: mmSt, MolarMass2: mmNBA, PolymerMass: 1000, Mode: mode, Steps: 40}
		if edit != nil {
			edit(&in)
		}
		b := must(plan.BandOf(in, must(plan.Make(in)), planJCR, samples, seed))
		return map[string]any{"band.samples": samples, "band.F1Low": b.InstLow, "band.F1High": b.InstHigh, "band.F1cumLow": b.CumLow,
			"band.F1cumHigh": b.CumHigh, "band.productLow": b.ProductLow, "band.productHigh": b.ProductHigh}
	}
	jcr := planJCR
	runResults(t, []result{
		// Defaults of site/copoly.d.ts: 200 steps; no names, no volumes, heats or hazards.
		{"batch without names", "plan", planArg("batch"), made(plan.ModeBatch, nil, map[string]any{"schedule.length": 201,
			"initial.v1": null, "initial.v2": null, "safety.heat": null, "safety.rise": null, "safety.hazards": []any{}, "band": absent})},
		{"semibatch with library monomers", "plan", planArg("semibatch", "monomer1", "styrene", "monomer2", "n-butyl acrylate",
			"rateConstant", 0.01, "batchMass", 2500, "steps", 50), named},
		{"heats given override the library", "plan", planArg("semibatch", "monomer1", "styrene", "monomer2", "n-butyl acrylate", "heat1", 60, "heat2", 0),
			made(plan.ModeSemibatch, func(in *plan.Input) {
				in.Monomer1, in.Monomer2, in.Heat1, in.Heat2 = "styrene", "n-butyl acrylate", ptr(60), ptr(0)
			}, map[string]any{"safety.heat": null})}, // heat2 = 0: not known
		{"mixture with a time table", "plan", planArg("semibatch", "feed", "mixture", "feedF1", 0.9, "finalConversion", 0.9, "timeTable", table),
			made(plan.ModeSemibatch, func(in *plan.Input) {
				in.Feed, in.FeedF1, in.FinalConversion, in.TimeTable = plan.FeedMixture, 0.9, 0.9, table
			}, map[string]any{"feedF1": 0.9})},
		{"shots with a half-life and a gas", "plan", planArg("shots", "monomer1", "styrene", "monomer2", "1,3-butadiene", "halfLife", 120, "shots", 40),
			shotsWant},
		{"fewest shots", "plan", planArg("shots", "tolerance", 0.03), made(plan.ModeShots, func(in *plan.Input) { in.Tolerance = 0.03 }, nil)},
		{"monomer not built in", "plan", planArg("batch", "monomer1", "Styrene", "monomer2", ""),
			made(plan.ModeBatch, func(in *plan.Input) { in.Monomer1 = "Styrene" }, map[string]any{"initial.v1": null})},
		// Defaults of site/copoly.d.ts: 500 samples, seed 1.
		{"band, defaults", "plan", planArg("semibatch", "jcr", jcr, "steps", 40), band(plan.ModeSemibatch, 500, 1, nil)},
		{"band, 40 samples, seed 7", "plan", planArg("batch", "jcr", jcr, "steps", 40, "samples", 40, "seed", 7), band(plan.ModeBatch, 40, 7, nil)},
		{"band of shots", "plan", planArg("shots", "jcr", jcr, "steps", 40, "shots", 40, "samples", 30),
			band(plan.ModeShots, 30, 1, func(in *plan.Input) { in.Shots = 40 })},
		{"empty jcr", "plan", planArg("batch", "jcr", []any{}), map[string]any{"band": absent}},
	})
}

func TestStarvedFeedResult(t *testing.T) {
	inv, f1 := must2(plan.StarvedFeed(term, 0.5, 5, 0.01, mmSt, mmNBA))
	fs := must(term.FeedFor(0.5)).Feeds[0]
	runResults(t, []result{{"", "starvedFeed", map[string]any{"r1": 0.8, "r2": 0.15, "targetF1": 0.5, "feedRate": 5, "rateConstant": 0.01,
		"molarMass1": mmSt, "molarMass2": mmNBA}, map[string]any{"inventory": inv, "f1": f1,
		// Quasi-steady state (Asua, Polymer Reaction Engineering, 2007): k·N = molar feed rate, so
		// the inventory is feedRate/(k·M̄(F1)) · M̄(f1*), f1* the feed giving F1 (Mayo–Lewis).
		"inventory#Asua": near(5 / (0.01 * (0.5*mmSt + 0.5*mmNBA)) * (fs*mmSt + (1-fs)*mmNBA)), "f1#Mayo–Lewis": fs}}})
}
