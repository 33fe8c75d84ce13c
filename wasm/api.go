//go:build js && wasm

package main

import (
	"copoly/copoly/fit"
	"copoly/copoly/molarmass"
	"copoly/copoly/plan"
)

import (
	"fmt"
	"strings"
	"syscall/js"

	"copoly/copoly"
	"copoly/copoly/project"
)

// The methods of the copoly object, one function each, in the order of site/copoly.d.ts. Each
// reads its argument into a fresh DTO, applies defaults, calls copoly and converts the result.
// Input checks that need science (ranges of ratios, feeds, conversions) are left to copoly; the
// bridge only checks what the JS form of the input adds: presence, JS types, whole numbers,
// the "basis" word, that molar masses come in pairs, and an explicit 0 where copoly would read
// 0 as "use the default".

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
	defaultBandSamples = 500
	maxSeed            = 1<<53 - 1 // the largest whole number a JS number holds exactly
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
	} {
		api.Set(m.name, wrap(m.name, m.policy, m.fn))
	}
	registerStorage(api, st)
	return api
}

// composition: F1 for each feed by the model's composition equation; for the terminal model
// also the azeotrope and the classification (null for the other models).
func composition(arg js.Value) (any, error) {
	m, _, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in compositionIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	t, terminal := m.(copoly.Terminal)
	if !terminal {
		F1 := make([]float64, len(in.F1))
		for i, f := range in.F1 {
			if !(f >= 0 && f <= 1) { // also catches NaN; the field name is built only on error
				return nil, copoly.CheckFraction(fmt.Sprintf("f1[%d]", i), f)
			}
			F1[i] = m.Instantaneous(f)
		}
		return compositionOut{F1: F1}, nil
	}
	F1, err := t.InstantaneousTo(make([]float64, 0, len(in.F1)), in.F1)
	if err != nil {
		return nil, err
	}
	out := compositionOut{F1: orEmpty(F1)}
	if az, ok := t.Azeotrope(); ok {
		out.Azeotrope = &az
	}
	c := t.Classify()
	out.Classification = &classificationOut{Kind: c.Kind, Product: c.Product, Text: c.Text}
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

// drift: the batch drift at each conversion (copoly.DriftOf, any model), its conversion limit
// for the tolerance (copoly.ConversionLimitOf), the composition distribution of the polymer made
// up to the last conversion (copoly.CompositionDistributionOf), and conversions by mass
// (copoly.MolarConversionOf) for any model.
func drift(arg js.Value) (any, error) {
	m, _, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in driftIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	if len(in.Conversion) == 0 {
		return nil, &copoly.FieldError{Field: "conversion", Reason: "give at least one conversion", Err: copoly.ErrOutOfRange}
	}
	basis := "molar"
	if in.Basis != nil {
		basis = *in.Basis
	}
	if basis != "molar" && basis != "mass" {
		return nil, &copoly.FieldError{Field: "basis", Reason: fmt.Sprintf("is %q; it must be \"molar\" or \"mass\"", basis), Err: copoly.ErrOutOfRange}
	}
	mm1, mm2, masses, err := molarMasses(in.MolarMass1, in.MolarMass2)
	if err != nil {
		return nil, err
	}
	if basis == "mass" && !masses {
		return nil, &copoly.FieldError{Field: "molarMass1", Reason: "is missing: a conversion by mass needs both molar masses", Err: copoly.ErrOutOfRange}
	}
	tolerance := defaultTolerance
	if in.Tolerance != nil {
		tolerance = *in.Tolerance
	}
	bins, err := intIn("bins", in.Bins, defaultBins, 1, copoly.MaxBins)
	if err != nil {
		return nil, err
	}

	conversion := in.Conversion
	var conversionMass []float64
	if basis == "mass" {
		conversionMass = in.Conversion
		if conversion, err = copoly.MolarConversionsOf(m, in.Conversion, in.F10, mm1, mm2); err != nil {
			// "massConversion[3]" is the caller's "conversion[3]".
			if f := copoly.Field(err); strings.HasPrefix(f, "massConversion") {
				return nil, renameField(err, f, "conversion"+strings.TrimPrefix(f, "massConversion"))
			}
			return nil, err
		}
	}
	d, err := copoly.DriftOf(m, in.F10, conversion)
	if err != nil {
		return nil, err
	}
	out := driftOut{
		Conversion: d.Conversion,
		Feed:       d.Feed,
		Inst:       d.Inst,
		Cum:        d.Cum,
		Method:     d.Method,
	}
	limit, err := copoly.ConversionLimitOf(m, in.F10, tolerance)
	if err != nil {
		return nil, err
	}
	last := len(conversion) - 1
	h, err := copoly.CompositionDistributionOf(m, in.F10, conversion[last], bins, mm1, mm2)
	if err != nil {
		return nil, renameField(err, "conversion", fmt.Sprintf("conversion[%d]", last))
	}
	out.Limit = &limitOut{Tolerance: tolerance, Conversion: limit}
	out.Distribution = &histogramOut{Edges: h.Edges, Weights: h.Weights, Basis: h.Basis}
	if basis == "molar" && masses {
		conversionMass = make([]float64, len(conversion))
		for i, x := range conversion {
			conversionMass[i] = copoly.MassConversion(x, in.F10, d.Feed[i], mm1, mm2)
		}
	}
	out.ConversionMass = conversionMass
	if e := d.Exhausted; e != nil {
		out.Exhausted = &exhaustedOut{Monomer: e.Monomer, Conversion: e.Conversion}
	}
	v := toJS(out)
	if conversionMass == nil {
		v.Delete("conversionMass")
	}
	return v, nil
}

// sequence: sequence statistics at one feed by the model's Markov chain; for the terminal model
// also the run lengths and, when a conversion is given, the batch average.
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
	s, err := sequenceOf(m, in.F1)
	if err != nil {
		return nil, err
	}
	v := toJS(sequenceDTO(s))
	t, terminal := m.(copoly.Terminal)
	if !terminal {
		if in.Conversion != nil {
			// Not used, but a bad value is still an error rather than ignored.
			if err := copoly.CheckConversion("conversion", *in.Conversion); err != nil {
				return nil, err
			}
		}
		return v, nil
	}
	rl, err := t.RunLengths(in.F1, maxLength)
	if err != nil {
		return nil, err
	}
	v.Set("runLengths", toJS(runLengthsOut{Length: rl.Length, Number1: rl.Number1, Weight1: rl.Weight1, Number2: rl.Number2, Weight2: rl.Weight2}))
	if in.Conversion != nil {
		b, err := t.BatchSequence(in.F1, *in.Conversion)
		if err != nil {
			err = renameField(err, "f10", "f1")
			return nil, renameField(err, "conversion[0]", "conversion")
		}
		batch := toJS(sequenceDTO(b))
		batch.Set("conversion", *in.Conversion)
		v.Set("batch", batch)
	}
	return v, nil
}

// chains: without any simulation option (dpn, conversion, functional, model), sample chains of
// the terminal model grown at a constant feed (copoly.Terminal.Chains); with one, a Monte Carlo
// simulation (copoly.SimulateChains) with the composition of every chain, its histogram and,
// for the terminal model at a constant feed with a dpn, Stockmayer's distribution on the same
// bins.
func chains(arg js.Value) (any, error) {
	m, named, err := readModel(arg)
	if err != nil {
		return nil, err
	}
	var in chainsIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	seed, err := intIn("seed", in.Seed, defaultSeed, 0, maxSeed)
	if err != nil {
		return nil, err
	}
	bins, err := intIn("bins", in.Bins, defaultChainBins, 1, copoly.MaxBins)
	if err != nil {
		return nil, err
	}
	if !named && in.DPn == nil && in.Conversion == nil && in.Functional == nil {
		count, err := intIn("count", in.Count, defaultChainCount, 1, copoly.MaxChains)
		if err != nil {
			return nil, err
		}
		length, err := intIn("length", in.Length, defaultChainLength, 1, copoly.MaxChainLength)
		if err != nil {
			return nil, err
		}
		samples, err := m.(copoly.Terminal).Chains(in.F10, count, length, uint64(seed))
		if err != nil {
			return nil, err
		}
		return chainsOut{Samples: samples}, nil
	}

	opt := copoly.ChainOptions{Model: m, F10: in.F10, Seed: uint64(seed), Samples: defaultSimSamples}
	if opt.Count, err = intIn("count", in.Count, defaultSimCount, 1, copoly.MaxSimChains); err != nil {
		return nil, err
	}
	if opt.Length, err = intIn("length", in.Length, defaultSimLength, 1, copoly.MaxChainLength); err != nil {
		return nil, err
	}
	if in.DPn != nil {
		if *in.DPn == 0 {
			return nil, &copoly.InputError{Field: "dpn", Value: 0, Reason: "must be at least 1 (leave it out for chains of one length)", Err: copoly.ErrOutOfRange}
		}
		opt.DPn = *in.DPn
	}
	if in.Conversion != nil {
		opt.Conversion = *in.Conversion // 0 is a constant feed, as in copoly
	}
	if opt.Functional, err = intIn("functional", in.Functional, 0, 1, 2); err != nil {
		return nil, err
	}
	st, err := copoly.SimulateChains(opt)
	if err != nil {
		// A conversion past the end of the batch is named as the first of a list.
		return nil, renameField(err, "conversion[0]", "conversion")
	}
	h, err := st.Histogram(bins)
	if err != nil {
		return nil, err
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
		Histogram:             chainHistogramOut{Edges: orEmpty(h.Edges), Weights: orEmpty(h.Weights)},
	}
	if t, ok := m.(copoly.Terminal); ok && opt.DPn > 0 && opt.Conversion == 0 {
		if out.Stockmayer, err = t.Stockmayer(opt.F10, opt.DPn, h.Edges); err != nil {
			return nil, err
		}
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
// triads and compared (fit.Discriminate), with each model's values at the runs' feeds.
func discriminate(arg js.Value) (any, error) {
	var in discriminateIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	rows := triadRows(in.Runs)
	if err := project.CheckTriads("runs", rows); err != nil {
		return nil, err
	}
	runs := make([]fit.TriadRun, len(rows))
	for i, r := range rows {
		runs[i] = r.Run()
	}
	d, err := fit.Discriminate(runs)
	if err != nil {
		return nil, err
	}
	tp, pp := d.Terminal.Params, d.Penultimate.Params
	if len(tp) != 2 || len(pp) != 4 {
		return nil, fmt.Errorf("copoly: the fits hold %d and %d parameters, not 2 and 4", len(tp), len(pp))
	}
	term := copoly.Terminal{R1: tp[0], R2: tp[1]}
	pen := copoly.Penultimate{R11: pp[0], R21: pp[1], R22: pp[2], R12: pp[3]}
	pred := predictedOut{Terminal: make([]triadRowOut, len(runs)), Penultimate: make([]triadRowOut, len(runs))}
	for i, r := range runs {
		st, err := term.Sequence(r.F10)
		if err != nil {
			return nil, err
		}
		sp, err := pen.Sequence(r.F10)
		if err != nil {
			return nil, err
		}
		pred.Terminal[i], pred.Penultimate[i] = triadRowOf(r.F10, st), triadRowOf(r.F10, sp)
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

// averages: the molar-mass averages of a binned distribution (molarmass.BinAverages) or of
// chromatogram slices (molarmass.SliceAverages), and the degrees of polymerization
// (molarmass.SizeOf) when F1 and both molar masses are given. An empty list counts as not given.
func averages(arg js.Value) (any, error) {
	var in averagesIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	mm1, mm2, masses, err := molarMasses(in.MolarMass1, in.MolarMass2)
	if err != nil {
		return nil, err
	}
	var a molarmass.Averages
	switch {
	case len(in.Bins) > 0 && len(in.Slices) > 0:
		return nil, &copoly.FieldError{Field: "slices", Reason: "give bins or slices, not both", Err: copoly.ErrOutOfRange}
	case len(in.Bins) > 0:
		bins := make([]molarmass.Bin, len(in.Bins))
		for i, b := range sizeBins(in.Bins) {
			bins[i] = b.Bin()
		}
		if a, err = molarmass.BinAverages(bins); err != nil {
			return nil, err
		}
	case len(in.Slices) > 0:
		mass, signal := make([]float64, len(in.Slices)), make([]float64, len(in.Slices))
		for i, s := range in.Slices {
			mass[i], signal[i] = s.Mass, s.Signal
		}
		if a, err = molarmass.SliceAverages(mass, signal); err != nil {
			return nil, sliceField(err)
		}
	default:
		return nil, &copoly.FieldError{Field: "bins", Reason: "is missing: give the molar-mass classes (bins) or the chromatogram slices (slices)", Err: errMissing}
	}
	out := averagesOut{Mn: a.Mn, Mw: a.Mw, Mz: a.Mz, Dispersity: a.Dispersity}
	if in.F1 != nil && masses {
		c, err := molarmass.SizeOf(a, *in.F1, mm1, mm2)
		if err != nil {
			return nil, err
		}
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

// sliceField names an error of molarmass.SliceAverages the way the JS API does: "mass[3]" and
// "signal[3]" become "slices[3].mass" and "slices[3].signal"; a field about the table as a
// whole ("mass", "signal", "bins") becomes "slices".
func sliceField(err error) error {
	f := copoly.Field(err)
	for _, key := range []string{"mass", "signal"} {
		if rest, ok := strings.CutPrefix(f, key+"["); ok && strings.HasSuffix(rest, "]") {
			return renameField(err, f, "slices["+rest+"."+key)
		}
	}
	switch f {
	case "mass", "signal", "bins":
		return renameField(err, f, "slices")
	}
	return err
}

// library: the built-in monomers and literature ratio pairs.
func library(js.Value) (any, error) {
	ms, ps := copoly.Monomers(), copoly.Pairs()
	out := libraryOut{Monomers: make([]monomerOut, len(ms)), Pairs: make([]pairOut, len(ps))}
	for i, m := range ms {
		o := monomerOut{Name: m.Name, Formula: m.Formula, MolarMass: m.MolarMass, Source: m.Source, Hazards: []string{}}
		if pr, ok := copoly.PropertiesOf(m.Name); ok {
			o.State, o.Density, o.DensityTemp, o.DensitySource = pr.State, pr.Density, pr.DensityTemp, pr.DensitySource
			o.Heat, o.HeatSource = pr.HeatOfPolymerization, pr.HeatSource
			o.Hazards, o.HazardSource = orNoTexts(pr.Hazards), pr.HazardSource
		}
		if q, ok := copoly.QEOf(m.Name); ok {
			o.Q, o.E, o.QESource = &q.Q, &q.E, q.Source
		}
		out.Monomers[i] = o
	}
	for i, p := range ps {
		out.Pairs[i] = pairOut{Monomer1: p.Monomer1, Monomer2: p.Monomer2, R1: p.R1, R2: p.R2, Temperature: p.Temperature, Source: p.Source}
	}
	return out, nil
}

// demoProject: the invented demo scenario.
func demoProject(js.Value) (any, error) {
	return projectResult(project.Demo()), nil
}

// checkProject: the project as validated, or the first invalid field.
func checkProject(arg js.Value) (any, error) {
	p, err := readProject(arg)
	if err != nil {
		return nil, err
	}
	return projectResult(p), nil
}

// exportProject: the project file text and a file name to save it under.
func exportProject(arg js.Value) (any, error) {
	p, err := readProject(arg)
	if err != nil {
		return nil, err
	}
	data, err := project.Marshal(p)
	if err != nil {
		return nil, err
	}
	out := object.New()
	out.Set("json", string(data))
	out.Set("filename", project.Filename(p.Name))
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
	return projectResult(p), nil
}

// benchRuns: the runs of a bench table in mole fractions and molar conversion, with an error
// for each bad row and the data warnings.
func benchRuns(arg js.Value) (any, error) {
	var in benchRunsIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	b, err := in.Bench.bench("bench")
	if err != nil {
		return nil, err
	}
	var mm [2]float64 // 0 = not given; only the forms that weigh need them
	for i, v := range []*float64{in.MolarMass1, in.MolarMass2} {
		if v != nil && *v != 0 {
			if err := copoly.CheckMolarMass(fmt.Sprintf("molarMass%d", i+1), *v); err != nil {
				return nil, err
			}
			mm[i] = *v
		}
	}
	t := b.Table()
	runs, ok, errs, warnings := t.Runs(mm[0], mm[1])
	rs, es := array.New(), array.New()
	for i := range runs {
		rs.SetIndex(i, js.Null())
		if ok[i] {
			rs.SetIndex(i, toJS(runOut(runs[i])))
		}
		es.SetIndex(i, js.Null())
		if errs[i] != nil {
			es.SetIndex(i, errorValue(errs[i]))
		}
	}
	ws := make([]runWarningOut, len(warnings))
	for i, w := range warnings {
		ws[i] = runWarningOut{Row: w.Row, Field: w.Field, Message: w.Message}
	}
	out := object.New()
	out.Set("columns", toJS(t.Columns()))
	out.Set("runs", rs)
	out.Set("errors", es)
	out.Set("warnings", toJS(ws))
	return out, nil
}

// pasteBench: the bench table with the rows of a pasted block appended. The paste works on a
// copy, so a block that cannot be read changes nothing: the error names the field "paste".
func pasteBench(arg js.Value) (any, error) {
	var in pasteBenchIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	b, err := in.Bench.bench("bench")
	if err != nil {
		return nil, err
	}
	t := b.Table()
	if err := t.Paste(in.Text); err != nil {
		return nil, pasteError(err)
	}
	pasted := project.BenchOf(t)
	// A pasted cell or label can be longer than a project keeps; refuse it here rather than
	// hand the page a table it cannot save.
	if err := project.CheckBench("bench", pasted); err != nil {
		return nil, &copoly.FieldError{Field: "paste", Reason: "the pasted rows cannot be kept: " + err.Error(), Err: err}
	}
	out := object.New()
	out.Set("bench", benchValue(pasted))
	return out, nil
}

// pasteError names the field "paste" in an error of BenchTable.Paste (ParseTable names its
// errors "table").
func pasteError(err error) error {
	err = renameField(err, "table", "paste")
	if copoly.Field(err) != "paste" {
		return &copoly.FieldError{Field: "paste", Reason: err.Error(), Err: err}
	}
	return err
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
		warnings[i] = warningOut{Method: w.Method, Row: w.Row, Field: w.Field, Message: w.Message}
	}
	notFinite := func(method, path string) {
		warnings = append(warnings, warningOut{Method: method, Row: -1, Message: fmt.Sprintf("%s gave a value that is not a finite number (%s); it is not shown", method, path)})
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

// plan: a recipe and schedule for a target copolymer composition (plan.Make), with the
// safety figures and, when the joint confidence region of the ratios is given, the band of
// outcomes over it (plan.BandOf). Monomers named as in the built-in list lend their heats of
// polymerization (unless heat1 or heat2 is given), their densities for the volumes of the charge
// and their hazard classes. An empty jcr (or timeTable) counts as not given.
func planMethod(arg js.Value) (any, error) {
	var in planIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	pi, err := in.planInput()
	if err != nil {
		return nil, err
	}
	samples, err := intIn("samples", in.Samples, defaultBandSamples, 1, plan.MaxBandSamples)
	if err != nil {
		return nil, err
	}
	seed, err := intIn("seed", in.Seed, defaultSeed, 0, maxSeed)
	if err != nil {
		return nil, err
	}
	var lib [2]*copoly.Properties // process data of monomer1 and monomer2, nil when not built in
	var hazards []hazardsOut
	var notes []string
	for i, name := range []*string{in.Monomer1, in.Monomer2} {
		if name == nil || *name == "" {
			continue
		}
		pr, ok := copoly.PropertiesOf(*name)
		if !ok {
			notes = append(notes, fmt.Sprintf("monomer%d %q is not in the built-in list: no density, heat of polymerization or hazards were taken for it.", i+1, *name))
			continue
		}
		lib[i] = &pr
		hazards = append(hazards, hazardsOut{Monomer: *name, Hazards: orNoTexts(pr.Hazards)})
	}
	if in.Heat1 == nil && lib[0] != nil {
		pi.Heat1 = lib[0].HeatOfPolymerization
	}
	if in.Heat2 == nil && lib[1] != nil {
		pi.Heat2 = lib[1].HeatOfPolymerization
	}

	p, err := plan.Make(pi)
	if err != nil {
		return nil, err
	}
	out := planDTO(p, millilitres(p.Charge1, lib[0]), millilitres(p.Charge2, lib[1]), hazards)
	out.Notes = append(out.Notes, notes...)
	if len(in.JCR) > 0 {
		region := make([][2]float64, len(in.JCR))
		for i, pt := range in.JCR {
			region[i] = [2]float64{pt[0], pt[1]} // decode read each point as a pair
		}
		b, err := plan.BandOf(pi, p, region, samples, uint64(seed))
		if err != nil {
			return nil, err
		}
		out.Band = bandDTO(b)
	}
	if path := nonFinite(out); path != "" {
		return nil, fmt.Errorf("copoly: the plan holds a value that is not a finite number (%s); it is not shown", path)
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
		{"heat1", in.Heat1, &pi.Heat1, ""},
		{"heat2", in.Heat2, &pi.Heat2, ""},
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
	pi.Shots, pi.Steps = shots, steps
	if len(in.TimeTable) > 0 {
		pi.TimeTable = make([][2]float64, len(in.TimeTable))
		for i, row := range in.TimeTable {
			pi.TimeTable[i] = [2]float64{row[0], row[1]} // decode read each row as a pair
		}
	}
	return pi, nil
}

// millilitres is a unit conversion: the volume in mL of mass g of a built-in monomer at its
// library density, or nil when the monomer is not built in, is not a liquid at room
// temperature, or has no density.
func millilitres(mass float64, pr *copoly.Properties) *float64 {
	if pr == nil || pr.State != copoly.StateLiquid || !(pr.Density > 0) {
		return nil
	}
	v := mass / pr.Density
	return &v
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

// qe: the screening estimate of the ratios from the built-in Q–e values of two monomers.
func qe(arg js.Value) (any, error) {
	var in qeIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	var q [2]copoly.QE
	for i, name := range []string{in.Monomer1, in.Monomer2} {
		v, ok := copoly.QEOf(name)
		if !ok {
			return nil, &copoly.FieldError{Field: fmt.Sprintf("monomer%d", i+1), Reason: fmt.Sprintf("%q has no built-in Q–e values; those with values are %s", name, qeNames()), Err: copoly.ErrOutOfRange}
		}
		q[i] = v
	}
	r1, r2, err := copoly.RatiosFromQE(q[0], q[1])
	if err != nil {
		return nil, err
	}
	return qeOut{R1: r1, R2: r2, Q1: q[0].Q, E1: q[0].E, Q2: q[1].Q, E2: q[1].E, Source1: q[0].Source, Source2: q[1].Source}, nil
}

// qeNames lists the built-in monomers that have Q–e values, for an error message.
func qeNames() string {
	var names []string
	for _, m := range copoly.Monomers() {
		if _, ok := copoly.QEOf(m.Name); ok {
			names = append(names, fmt.Sprintf("%q", m.Name))
		}
	}
	if len(names) == 0 {
		return "none"
	}
	return strings.Join(names, ", ")
}

// readProject reads and validates the {project} argument.
func readProject(arg js.Value) (project.Project, error) {
	var in projectIn
	if err := decode(arg, &in, ""); err != nil {
		return project.Project{}, err
	}
	p, err := in.Project.project()
	if err != nil {
		return project.Project{}, err
	}
	return p, nil
}

func projectResult(p project.Project) js.Value {
	out := object.New()
	out.Set("project", projectValue(p))
	return out
}
