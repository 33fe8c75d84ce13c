//go:build js && wasm

package main

import (
	"encoding/json"
	"fmt"
	"syscall/js"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/fit"
	"copoly/copoly/molarmass"
	"copoly/copoly/plan"
	"copoly/copoly/project"
)

// The methods of the copoly object, one function each, in the order of site/copoly.d.ts. Each
// reads its argument into a fresh DTO, applies defaults, makes one call into copoly (or one of
// its packages) and converts the result. Every check that needs science or the vocabulary of the
// API (ranges, words such as "basis", molar masses that come in pairs, the process data of a
// monomer named) is copoly's; the bridge only checks what the JS form of the input adds:
// presence, JS types, whole numbers, and an explicit 0 where copoly would read 0 as "use the
// default".

// Defaults of the optional arguments (site/copoly.d.ts).
const (
	defaultTolerance   = 0.02
	defaultBins        = 20
	defaultMaxLength   = 20
	defaultChainCount  = 12   // sample chains only
	defaultChainLength = 60   // sample chains only
	defaultSimCount    = 1000 // a simulation
	defaultSimLength   = 100  // a simulation without a dpn
	defaultSimSamples  = 12   // chains of a simulation returned as strings
	defaultChainBins   = 30   // bins of a simulation's histogram
	defaultSeed        = 1
)

// newAPI returns the copoly object with every method bound to st for storage.
func newAPI(st *storage) js.Value {
	api := object.New()
	api.Set("version", version)
	for _, m := range []struct {
		name   string
		policy argPolicy
		fn     syncExport
	}{
		{"composition", argRequired, composition},
		{"feedFor", argRequired, feedFor},
		{"drift", argRequired, drift},
		{"sequence", argRequired, sequence},
		{"chains", argRequired, chains},
		{"discriminate", argRequired, discriminate},
		{"averages", argRequired, averages},
		{"library", argOptional, library},
		{"demoProject", argOptional, demoProject},
		{"exampleProject", argRequired, exampleProject},
		{"checkProject", argRequired, checkProject},
		{"exportProject", argRequired, exportProject},
		{"importProject", argRequired, importProject},
		{"benchRuns", argRequired, benchRuns},
		{"pasteBench", argRequired, pasteBench},
		{"fit", argRequired, fitMethod},
		{"nextRuns", argRequired, nextRuns},
		{"plan", argRequired, planMethod},
		{"starvedFeed", argRequired, starvedFeed},
		{"qe", argRequired, qe},
		{"limits", argOptional, limitsMethod},
		{"parseNumber", argRequired, parseNumber},
	} {
		api.Set(m.name, wrap(m.name, m.policy, m.fn))
	}
	registerStorage(api, st)
	return api
}

// composition: F1 for each feed by the model's composition equation; for the terminal model
// also the azeotrope and the classification (copoly.CompositionOf).
func composition(arg js.Value) (any, error) {
	m, _, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in compositionIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	c, err := copoly.CompositionOf(m, in.F1)
	if err != nil {
		return nil, err
	}
	out := compositionOut{F1: orEmpty(c.F1), Azeotrope: finiteOrNil(c.Azeotrope)}
	if k := c.Classification; k != nil {
		out.Classification = &classificationOut{Kind: k.Kind, Product: k.Product, Text: k.Text}
	}
	return out, nil
}

// feedFor: the feed that gives a target copolymer composition.
func feedFor(arg js.Value) (any, error) {
	var in feedIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	s, err := copoly.Terminal{R1: in.R1, R2: in.R2}.FeedFor(in.TargetF1)
	if err != nil {
		return nil, err
	}
	feeds := s.Feeds
	if feeds == nil {
		feeds = []float64{}
	}
	return feedOut{Feeds: feeds, Note: s.Note, Range: []float64{s.Min, s.Max}}, nil
}

// drift: the batch followed to each conversion, with its conversion limit, the composition
// distribution of the product and the conversions on the other basis (copoly.ProfileOf, any
// model).
func drift(arg js.Value) (any, error) {
	m, _, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in driftIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	bins, err := intIn("bins", in.Bins, defaultBins, 1, copoly.MaxBins)
	if err != nil {
		return nil, err
	}
	p, err := copoly.ProfileOf(copoly.ProfileInput{Model: m, F10: in.F10, Conversion: in.Conversion,
		Basis: orText(in.Basis), MolarMass1: in.MolarMass1, MolarMass2: in.MolarMass2,
		Tolerance: orNumber(in.Tolerance, defaultTolerance), Bins: bins})
	if err != nil {
		return nil, err
	}
	out := driftOut{
		Conversion: p.Conversion, ConversionMass: p.ConversionMass,
		Feed: p.Feed, Inst: p.Inst, Cum: p.Cum, Method: p.Method,
		Limit:        &limitOut{Tolerance: p.Tolerance, Conversion: p.Limit},
		Distribution: &histogramOut{Edges: p.Distribution.Edges, Weights: p.Distribution.Weights, Basis: p.Distribution.Basis},
	}
	if e := p.Exhausted; e != nil {
		out.Exhausted = &exhaustedOut{Monomer: e.Monomer, Conversion: e.Conversion}
	}
	v := toJS(out)
	if p.ConversionMass == nil {
		v.Delete("conversionMass")
	}
	return v, nil
}

// sequence: sequence statistics at one feed by the model's Markov chain; for the terminal model
// also the run lengths and, when a conversion is given, the batch average
// (copoly.MicrostructureOf).
func sequence(arg js.Value) (any, error) {
	m, _, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in sequenceIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	maxLength, err := intIn("maxLength", in.MaxLength, defaultMaxLength, 1, copoly.MaxRunLength)
	if err != nil {
		return nil, err
	}
	ms, err := copoly.MicrostructureOf(copoly.MicrostructureInput{Model: m, F1: in.F1, MaxLength: maxLength,
		Batch: in.Conversion != nil, Conversion: orNumber(in.Conversion, 0)})
	if err != nil {
		return nil, err
	}
	v := toJS(sequenceDTO(ms.Sequence))
	if rl := ms.RunLengths; rl != nil {
		v.Set("runLengths", toJS(runLengthsOut{Length: rl.Length, Number1: rl.Number1, Weight1: rl.Weight1, Number2: rl.Number2, Weight2: rl.Weight2}))
	}
	if ms.Batch != nil {
		batch := toJS(sequenceDTO(*ms.Batch))
		batch.Set("conversion", *in.Conversion)
		v.Set("batch", batch)
	}
	return v, nil
}

// chains: without any simulation option (dpn, conversion, functional, model), sample chains of
// the terminal model grown at a constant feed; with one, a Monte Carlo simulation with the
// composition of every chain, its histogram and, for the terminal model at a constant feed with
// a dpn, Stockmayer's distribution on the same bins (copoly.SimulateChains either way).
func chains(arg js.Value) (any, error) {
	m, named, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in chainsIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	seed, err := intIn("seed", in.Seed, defaultSeed, 0, project.MaxSeed)
	if err != nil {
		return nil, err
	}
	bins, err := intIn("bins", in.Bins, defaultChainBins, 1, copoly.MaxBins)
	if err != nil {
		return nil, err
	}
	opt := copoly.ChainOptions{Model: m, F10: in.F10, Seed: uint64(seed)}
	samplesOnly := !named && in.DPn == nil && in.Conversion == nil && in.Functional == nil
	if samplesOnly {
		if opt.Count, err = intIn("count", in.Count, defaultChainCount, 1, copoly.MaxChains); err != nil {
			return nil, err
		}
		if opt.Length, err = intIn("length", in.Length, defaultChainLength, 1, copoly.MaxChainLength); err != nil {
			return nil, err
		}
		opt.Samples, opt.SampleUnits = opt.Count, opt.Length
	} else {
		if opt.Count, err = intIn("count", in.Count, defaultSimCount, 1, copoly.MaxSimChains); err != nil {
			return nil, err
		}
		if opt.Length, err = intIn("length", in.Length, defaultSimLength, 1, copoly.MaxChainLength); err != nil {
			return nil, err
		}
		if in.DPn != nil && *in.DPn == 0 {
			return nil, &copoly.InputError{Field: "dpn", Value: 0, Reason: "must be at least 1 (leave it out for chains of one length)", Err: copoly.ErrOutOfRange}
		}
		opt.DPn, opt.Conversion = orNumber(in.DPn, 0), orNumber(in.Conversion, 0) // conversion 0 is a constant feed
		if opt.Functional, err = intIn("functional", in.Functional, 0, 1, 2); err != nil {
			return nil, err
		}
		opt.Samples, opt.Bins = defaultSimSamples, bins
	}
	st, err := copoly.SimulateChains(opt)
	if err != nil {
		return nil, err
	}
	if samplesOnly {
		return chainsOut{Samples: st.Samples}, nil
	}
	out := chainStatsOut{
		Samples:               orNoTexts(st.Samples),
		Compositions:          orEmpty(st.Compositions),
		Lengths:               st.Lengths,
		FunctionalCounts:      st.FunctionalCounts,
		NonFunctional:         st.NonFunctional,
		ExpectedNonFunctional: finiteOrNil(st.ExpectedNonFunctional),
		Mean:                  st.Mean,
		Variance:              st.Variance,
		WeightMean:            st.WeightMean,
		StockmayerVariance:    finiteOrNil(st.StockmayerVariance),
		Units:                 st.Units,
		Histogram:             chainHistogramOut{Edges: orEmpty(st.Composition.Edges), Weights: orEmpty(st.Composition.Weights)},
		Stockmayer:            st.Stockmayer,
	}
	if path := nonFinite(out); path != "" {
		return nil, fmt.Errorf("copoly: the simulation holds a value that is not a finite number (%s); it is not shown", path)
	}
	v := toJS(out)
	if opt.Functional == 0 {
		v.Delete("functionalCounts")
		v.Delete("nonFunctional")
		v.Delete("expectedNonFunctional")
	}
	return v, nil
}

// discriminate: the terminal and the penultimate model fitted to measured compositions and
// triads and compared, with each model's values at the runs' feeds (project.Discriminate).
func discriminate(arg js.Value) (any, error) {
	var in discriminateIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	rows := triadRows(in.Runs)
	d, err := project.Discriminate("runs", rows)
	if err != nil {
		return nil, err
	}
	pred := predictedOut{Terminal: make([]triadRowOut, len(rows)), Penultimate: make([]triadRowOut, len(rows))}
	for i, r := range rows {
		pred.Terminal[i], pred.Penultimate[i] = triadRowOf(r.F10, d.Predicted.Terminal[i]), triadRowOf(r.F10, d.Predicted.Penultimate[i])
	}
	out := discriminationOut{
		Terminal:    modelFitDTO(d.Terminal),
		Penultimate: modelFitDTO(d.Penultimate),
		F:           d.F,
		PValue:      finiteOrNil(d.PValue),
		DeltaAIC:    d.DeltaAIC,
		Supported:   d.Supported,
		Verdict:     d.Verdict,
		Predicted:   pred,
	}
	if path := nonFinite(out); path != "" {
		return nil, fmt.Errorf("copoly: the comparison holds a value that is not a finite number (%s); it is not shown", path)
	}
	return out, nil
}

// averages: the molar-mass averages of a binned distribution or of chromatogram slices, and the
// degrees of polymerization when F1 and both molar masses are given (molarmass.Summarize). An
// empty list counts as not given.
func averages(arg js.Value) (any, error) {
	var in averagesIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	mi := molarmass.Input{F1: in.F1, MolarMass1: in.MolarMass1, MolarMass2: in.MolarMass2,
		Bins: make([]molarmass.Bin, len(in.Bins)), Slices: make([]molarmass.Slice, len(in.Slices))}
	for i, b := range in.Bins {
		mi.Bins[i] = molarmass.Bin{Low: b.Low, High: b.High, Number: b.NumberFraction, Weight: b.WeightFraction}
	}
	for i, s := range in.Slices {
		mi.Slices[i] = molarmass.Slice{Mass: s.Mass, Signal: s.Signal}
	}
	a, err := molarmass.Summarize(mi)
	if err != nil {
		return nil, err
	}
	out := averagesOut{Mn: a.Mn, Mw: a.Mw, Mz: a.Mz, Dispersity: a.Dispersity}
	if c := a.Size; c != nil {
		out.Size = &sizeOut{UnitMass: c.UnitMass, DPn: c.DPn, DPw: c.DPw, Units1: c.Units1, Units2: c.Units2}
	}
	if path := nonFinite(out); path != "" {
		return nil, fmt.Errorf("copoly: the averages hold a value that is not a finite number (%s); they are not shown", path)
	}
	v := toJS(out)
	if out.Size == nil {
		v.Delete("size")
	}
	return v, nil
}

// library: the built-in monomers and literature ratio pairs, and the table of sources they cite.
func library(js.Value) (any, error) {
	ms, ps, ss := copoly.Library()
	out := libraryOut{Monomers: make([]monomerOut, len(ms)), Pairs: make([]pairOut, len(ps)), Sources: make([]sourceOut, len(ss))}
	for i, m := range ms {
		o := monomerOut{Name: m.Name, Formula: m.Formula, MolarMass: m.MolarMass, Source: m.Source, SourceID: m.SourceID, Hazards: []string{}}
		if pr := m.Properties; pr != nil {
			o.State, o.Density, o.DensityTemp = pr.State, pr.Density, pr.DensityTemp
			o.DensitySource, o.DensitySourceID = pr.DensitySource, pr.DensitySourceID
			o.Heat, o.HeatSource, o.HeatSourceID = pr.HeatOfPolymerization, pr.HeatSource, pr.HeatSourceID
			o.Hazards, o.HazardSource, o.HazardSourceID = orNoTexts(pr.Hazards), pr.HazardSource, pr.HazardSourceID
			if pr.Tg > 0 {
				tg := pr.Tg
				o.Tg = &tg
			}
			o.TgSource, o.TgSourceID, o.TgNote = pr.TgSource, pr.TgSourceID, pr.TgNote
			o.Hydroxyl, o.Acid, o.AcidTotal = pr.Hydroxyl, pr.Acid, pr.AcidTotal
			o.GroupsSource, o.GroupsSourceID = pr.GroupsSource, pr.GroupsSourceID
		}
		if q := m.QE; q != nil {
			o.Q, o.E, o.QESource, o.QESourceID = &q.Q, &q.E, q.Source, q.SourceID
		}
		out.Monomers[i] = o
	}
	for i, p := range ps {
		out.Pairs[i] = pairOut{Monomer1: p.Monomer1, Monomer2: p.Monomer2, R1: p.R1, R2: p.R2, Temperature: p.Temperature, Source: p.Source, SourceID: p.SourceID}
	}
	for i, s := range ss {
		out.Sources[i] = sourceOut{ID: s.ID, Short: s.Short, Citation: s.Citation, Checked: s.Checked, Note: s.Note}
	}
	return out, nil
}

// demoProject: the invented demo scenario.
func demoProject(js.Value) (any, error) {
	return projectResult(project.Demo())
}

// exampleProject: a published example project by name (project.Example).
func exampleProject(arg js.Value) (any, error) {
	var in exampleIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	p, err := project.Example(in.Name)
	if err != nil {
		return nil, err
	}
	return projectResult(p)
}

// checkProject: the project as validated, or the first invalid field.
func checkProject(arg js.Value) (any, error) {
	p, err := readProject(arg)
	if err != nil {
		return nil, err
	}
	return projectResult(p)
}

// exportProject: the project file text and a file name to save it under (project.Export).
func exportProject(arg js.Value) (any, error) {
	p, err := readProject(arg)
	if err != nil {
		return nil, err
	}
	data, name, err := project.Export(p)
	if err != nil {
		return nil, err
	}
	out := object.New()
	out.Set("json", string(data))
	out.Set("filename", name)
	return out, nil
}

// importProject: the project read from a file's text. A file that does not parse changes
// nothing: the page keeps its project.
func importProject(arg js.Value) (any, error) {
	var in importIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	p, err := project.Parse([]byte(in.JSON))
	if err != nil {
		return nil, err
	}
	return projectResult(p)
}

// benchRuns: the runs of a bench table in mole fractions and molar conversion, with an error
// for each bad row and the data warnings (project.Bench.Runs).
func benchRuns(arg js.Value) (any, error) {
	b, err := readBench(arg)
	if err != nil {
		return nil, err
	}
	var in benchRunsIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	r, err := b.Runs("bench", orNumber(in.MolarMass1, 0), orNumber(in.MolarMass2, 0)) // 0: not given
	if err != nil {
		return nil, err
	}
	rs, es := array.New(), array.New()
	for i := range r.Runs {
		rs.SetIndex(i, js.Null())
		if r.OK[i] {
			rs.SetIndex(i, toJS(runOut(r.Runs[i])))
		}
		es.SetIndex(i, js.Null())
		if r.Errors[i] != nil {
			es.SetIndex(i, errorValue(r.Errors[i]))
		}
	}
	ws := make([]runWarningOut, len(r.Warnings))
	for i, w := range r.Warnings {
		ws[i] = runWarningOut{Row: w.Row, Field: w.Field, Message: w.Message, Code: w.Code}
	}
	out := object.New()
	out.Set("columns", toJS(r.Columns))
	out.Set("runs", rs)
	out.Set("errors", es)
	out.Set("warnings", toJS(ws))
	return out, nil
}

// pasteBench: the bench table with the rows of a pasted block appended (project.Bench.Paste). A
// block that cannot be read changes nothing: the error names the field "paste".
func pasteBench(arg js.Value) (any, error) {
	b, err := readBench(arg)
	if err != nil {
		return nil, err
	}
	var in pasteBenchIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	pasted, err := b.Paste("bench", in.Text)
	if err != nil {
		return nil, err
	}
	data, err := json.Marshal(pasted)
	if err != nil {
		return nil, err
	}
	out := object.New()
	out.Set("bench", fromJSON(data))
	return out, nil
}

// readBench reads the {bench} argument with the project file's reader (project.ParseBench).
func readBench(arg js.Value) (project.Bench, error) {
	data, err := readJSON(arg, "bench")
	if err != nil {
		return project.Bench{}, err
	}
	return project.ParseBench("bench", data)
}

// fit: every estimation method on the runs, with the recommended one and the warnings.
func fitMethod(arg js.Value) (any, error) {
	var in fitIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	runs, err := runsOf(in.Runs)
	if err != nil {
		return nil, err
	}
	level := 0.0 // copoly's default, 0.95
	if in.Level != nil {
		level = *in.Level
	}
	e, err := fit.Estimate(runs, level)
	if err != nil {
		return nil, err
	}
	return fitValue(e, in.Curves != nil && *in.Curves), nil
}

// fitValue converts the estimates to the FitResult of the d.ts. A method that could not run is
// absent (copoly gives its reason among the warnings). A method whose result holds a number
// that is not finite, where the d.ts promises one, is left out with a warning of its own;
// copoly's +Inf standard errors and NaN correlation of a singular fit are the one expected
// case and become null instead. curves adds the Mayo–Lewis curves.
func fitValue(e *fit.Estimates, curves bool) js.Value {
	warnings := make([]warningOut, len(e.Warnings))
	for i, w := range e.Warnings {
		warnings[i] = warningOut{Method: w.Method, Row: w.Row, Field: w.Field, Message: w.Message, Code: w.Code}
	}
	notFinite := func(method, path string) {
		warnings = append(warnings, warningOut{Method: method, Row: -1, Code: copoly.CodeNotShown, Message: fmt.Sprintf("%s gave a value that is not a finite number (%s); it is not shown", method, path)})
	}
	methods := object.New()
	add := func(name string, dto any, drop ...string) {
		if p := nonFinite(dto); p != "" {
			notFinite(name, p)
			return
		}
		v := toJS(dto)
		for _, k := range drop {
			v.Delete(k)
		}
		methods.Set(name, v)
	}
	for _, l := range []struct {
		name  string
		fit   *fit.Linear
		alpha bool
	}{
		{fit.MethodFinemanRoss, e.FinemanRoss, false},
		{fit.MethodInvertedFinemanRoss, e.InvertedFinemanRoss, false},
		{fit.MethodKelenTudos, e.KelenTudos, true},
		{fit.MethodExtendedKelenTudos, e.ExtendedKelenTudos, true},
	} {
		if l.fit == nil {
			continue
		}
		if l.alpha {
			add(l.name, linearDTO(l.fit))
		} else {
			add(l.name, linearDTO(l.fit), "alpha")
		}
	}
	if e.MayoLewis != nil {
		if curves {
			add(fit.MethodMayoLewis, mayoLewisDTO(e.MayoLewis, true))
		} else {
			add(fit.MethodMayoLewis, mayoLewisDTO(e.MayoLewis, false), "curves")
		}
	}
	if n := e.Nonlinear; n != nil {
		if n.Weighted {
			add(fit.MethodNonlinear, nonlinearDTO(n))
		} else {
			add(fit.MethodNonlinear, nonlinearDTO(n), "reducedChi2", "pValue", "sigma")
		}
	}
	if e.EVM != nil {
		add(fit.MethodEVM, evmDTO(e.EVM))
	}
	recommended := e.Recommended
	if recommended == fit.MethodEVM && methods.Get(fit.MethodEVM).IsUndefined() {
		recommended = fit.MethodNonlinear
	}
	trend := func(name string, t fit.Trend) trendOut {
		out := trendOut{Slope: t.Slope, PValue: t.PValue, Flagged: t.Flagged}
		if p := nonFinite(out); p != "" {
			notFinite(name, p)
			return trendOut{Slope: 0, PValue: 1, Flagged: false}
		}
		return out
	}
	trends := trendsOut{
		Feed:       trend("the trend of the residuals with the feed", e.TrendFeed),
		Conversion: trend("the trend of the residuals with conversion", e.TrendConversion),
	}

	out := object.New()
	out.Set("methods", methods)
	out.Set("recommended", recommended)
	if s := e.SwappedFinemanRoss; s != nil {
		if r := (ratiosOut{R1: s.R1, R2: s.R2}); nonFinite(r) == "" {
			out.Set("swappedFinemanRoss", toJS(r))
		}
	}
	out.Set("trends", toJS(trends))
	out.Set("warnings", toJS(warnings))
	return out
}

// nextRuns: where to run next to shrink the joint confidence region the most.
func nextRuns(arg js.Value) (any, error) {
	var in nextRunsIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	made, err := runsOf(in.Runs)
	if err != nil {
		return nil, err
	}
	d, err := fit.NextRuns(in.R1, in.R2, made, in.Conversions)
	if err != nil {
		return nil, err
	}
	out := nextRunsOut{
		TidwellMortimer: d.TidwellMortimer[:],
		DOptimal:        d.DOptimal[:],
		Middle:          d.Middle,
		Next:            make([]suggestionOut, len(d.Next)),
		Shrink:          d.Shrink,
	}
	for i, s := range d.Next {
		out.Next[i] = suggestionOut{F10: s.F10, Conversion: s.Conversion}
	}
	return out, nil
}

// planMethod (plan): a recipe and schedule for a target copolymer composition, with the safety
// figures, the process data of the monomers named and, when the joint confidence region of the
// ratios is given, the band of outcomes over it (plan.Make). An empty jcr (or timeTable) counts
// as not given.
func planMethod(arg js.Value) (any, error) {
	var in planIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	pi, err := in.planInput()
	if err != nil {
		return nil, err
	}
	p, err := plan.Make(pi)
	if err != nil {
		return nil, err
	}
	return planValue(p)
}

// planValue converts a plan to the PlanResult of the d.ts, or refuses one holding a number that
// is not finite where the d.ts promises one.
func planValue(p *plan.Recipe) (js.Value, error) {
	out := planDTO(p)
	if path := nonFinite(out); path != "" {
		return js.Value{}, fmt.Errorf("copoly: the plan holds a value that is not a finite number (%s); it is not shown", path)
	}
	v := toJS(out)
	if out.Band == nil {
		v.Delete("band")
	}
	return v, nil
}

// planInput converts the argument of plan to copoly's input. An absent option stays 0, copoly's
// default. A 0 given on purpose for an option whose 0 copoly reads as "use the default" is
// refused rather than silently replaced; where the d.ts gives 0 a meaning (shots, heats, batch
// mass, rate constant, half-life) it is passed on.
func (in planIn) planInput() (plan.Input, error) {
	pi := plan.Input{
		Model:    copoly.Terminal{R1: in.R1, R2: in.R2},
		TargetF1: in.TargetF1, MolarMass1: in.MolarMass1, MolarMass2: in.MolarMass2,
		PolymerMass: in.PolymerMass, Mode: in.Mode,
		Monomer1: orText(in.Monomer1), Monomer2: orText(in.Monomer2),
		Heat1: in.Heat1, Heat2: in.Heat2, // nil: the library's, for a monomer named
	}
	for _, o := range []struct {
		field string
		v     *float64
		dst   *float64
		zero  string // why an explicit 0 is refused; "" when 0 is passed on
	}{
		{"tolerance", in.Tolerance, &pi.Tolerance, "must be above 0 (leave it out for the default 0.02)"},
		{"stopConversion", in.StopConversion, &pi.StopConversion, "must be above 0 (leave it out for the conversion limit of the tolerance)"},
		{"finalConversion", in.FinalConversion, &pi.FinalConversion, "must be above 0 (leave it out for the default 0.95)"},
		{"feedF1", in.FeedF1, &pi.FeedF1, "must be above 0 (leave it out for a stream at the target composition; for M2 alone use the feed \"faster\")"},
		{"rateConstant", in.RateConstant, &pi.RateConstant, ""},
		{"halfLife", in.HalfLife, &pi.HalfLife, ""},
		{"batchMass", in.BatchMass, &pi.BatchMass, ""},
		{"heatCapacity", in.HeatCapacity, &pi.HeatCapacity, "must be above 0, in J/(g·K) (leave it out for the default 2.0)"},
		{"riseLimit", in.RiseLimit, &pi.RiseLimit, "must be above 0, in K (leave it out for the default 50)"},
	} {
		if o.v == nil {
			continue
		}
		if *o.v == 0 && o.zero != "" {
			return plan.Input{}, &copoly.InputError{Field: o.field, Value: 0, Reason: o.zero, Err: copoly.ErrOutOfRange}
		}
		*o.dst = *o.v
	}
	if in.Feed != nil {
		pi.Feed = *in.Feed // "" is copoly's default, "faster"
	}
	shots, err := intIn("shots", in.Shots, 0, 0, plan.MaxShots)
	if err != nil {
		return plan.Input{}, err
	}
	steps, err := intIn("steps", in.Steps, 0, 1, plan.MaxSteps)
	if err != nil {
		return plan.Input{}, err
	}
	samples, err := intIn("samples", in.Samples, 0, 1, plan.MaxBandSamples) // 0: plan's default
	if err != nil {
		return plan.Input{}, err
	}
	seed, err := intIn("seed", in.Seed, defaultSeed, 0, project.MaxSeed)
	if err != nil {
		return plan.Input{}, err
	}
	pi.Shots, pi.Steps, pi.Samples, pi.Seed = shots, steps, samples, uint64(seed)
	pi.TimeTable, pi.Region = pairs(in.TimeTable), pairs(in.JCR)
	return pi, nil
}

// pairs returns lists decode read as pairs as [2]float64 values; an empty list is none (nil).
func pairs(rows [][]float64) [][2]float64 {
	if len(rows) == 0 {
		return nil
	}
	out := make([][2]float64, len(rows))
	for i, r := range rows {
		out[i] = [2]float64{r[0], r[1]}
	}
	return out
}

// starvedFeed: the unreacted inventory of a starved feed at the quasi-steady state.
func starvedFeed(arg js.Value) (any, error) {
	var in starvedFeedIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	inv, f1, err := plan.StarvedFeed(copoly.Terminal{R1: in.R1, R2: in.R2}, in.TargetF1, in.FeedRate, in.RateConstant, in.MolarMass1, in.MolarMass2)
	if err != nil {
		return nil, err
	}
	return starvedFeedOut{Inventory: inv, F1: f1}, nil
}

// qe: the screening estimate of the ratios from the built-in Q–e values of two monomers
// (copoly.QEPairOf).
func qe(arg js.Value) (any, error) {
	var in qeIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	q, err := copoly.QEPairOf(in.Monomer1, in.Monomer2)
	if err != nil {
		return nil, err
	}
	return qeOut{R1: q.R1, R2: q.R2, Q1: q.Monomer1.Q, E1: q.Monomer1.E, Q2: q.Monomer2.Q, E2: q.Monomer2.E, Source1: q.Monomer1.Source, Source2: q.Monomer2.Source}, nil
}

// readProject reads and validates the {project} argument, as JSON text, with project.Parse.
func readProject(arg js.Value) (project.Project, error) {
	data, err := readJSON(arg, "project")
	if err != nil {
		return project.Project{}, err
	}
	return project.Parse(data)
}

// projectValue returns p as the Project of the d.ts: its file text (project.Marshal) read by
// JSON.parse.
func projectValue(p project.Project) (js.Value, error) {
	data, err := project.Marshal(p)
	if err != nil {
		return js.Value{}, err
	}
	return fromJSON(data), nil
}

// projectResult is {project}.
func projectResult(p project.Project) (any, error) {
	v, err := projectValue(p)
	if err != nil {
		return nil, err
	}
	out := object.New()
	out.Set("project", v)
	return out, nil
}

// limitsMethod (limits): every limit of the inputs, by name (project.Limits): one object the
// page sizes its inputs and messages from.
func limitsMethod(js.Value) (any, error) {
	out := object.New()
	for _, l := range project.Limits() {
		out.Set(l.Name, l.Value)
	}
	return out, nil
}

// parseNumber: a number as a person types it or a spreadsheet writes it (bench.ParseCell: a
// decimal comma, a Unicode minus, "35 %"), with errors naming field ("number" when not given).
func parseNumber(arg js.Value) (any, error) {
	var in parseNumberIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	v, err := bench.ParseCell(orText(in.Field, "number"), in.Text)
	if err != nil {
		return nil, err
	}
	out := object.New()
	out.Set("value", v)
	return out, nil
}
