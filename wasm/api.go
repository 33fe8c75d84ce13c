//go:build js && wasm

package main

import (
	"fmt"
	"syscall/js"

	"copoly/copoly"
	"copoly/copoly/project"
)

// The methods of the copoly object, one function each, in the order of site/copoly.d.ts. Each
// reads its argument into a fresh DTO, applies defaults, calls copoly and converts the result.
// Input checks that need science (ranges of ratios, feeds, conversions) are left to copoly; the
// bridge only checks what the JS form of the input adds: presence, JS types, whole numbers,
// the "basis" word and that molar masses come in pairs.

// Defaults of the optional arguments (site/copoly.d.ts).
const (
	defaultTolerance   = 0.02
	defaultBins        = 20
	defaultMaxLength   = 20
	defaultChainCount  = 12
	defaultChainLength = 60
	defaultSeed        = 1
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
		{"library", argOptional, library},
		{"demoProject", argOptional, demoProject},
		{"checkProject", argRequired, checkProject},
		{"exportProject", argRequired, exportProject},
		{"importProject", argRequired, importProject},
	} {
		api.Set(m.name, wrap(m.name, m.policy, m.fn))
	}
	api.Set("loadProject", wrapAsync("loadProject", argOptional, func(js.Value) (asyncJob, error) {
		return st.load, nil
	}))
	api.Set("saveProject", wrapAsync("saveProject", argRequired, func(arg js.Value) (asyncJob, error) {
		p, err := readProject(arg)
		if err != nil {
			return nil, err
		}
		return func() (any, error) { return st.save(p) }, nil
	}))
	return api
}

// composition: F1 for each feed, the azeotrope and the classification.
func composition(arg js.Value) (any, error) {
	var in compositionIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	m := copoly.Terminal{R1: in.R1, R2: in.R2}
	F1, err := m.InstantaneousTo(make([]float64, 0, len(in.F1)), in.F1)
	if err != nil {
		return nil, err
	}
	out := compositionOut{F1: F1}
	if F1 == nil {
		out.F1 = []float64{}
	}
	if az, ok := m.Azeotrope(); ok {
		out.Azeotrope = &az
	}
	c := m.Classify()
	out.Classification = classificationOut{Kind: c.Kind, Product: c.Product, Text: c.Text}
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

// drift: the batch drift at each conversion, its conversion limit and the composition
// distribution of the polymer made up to the last conversion.
func drift(arg js.Value) (any, error) {
	var in driftIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	m := copoly.Terminal{R1: in.R1, R2: in.R2}
	if err := m.Validate(); err != nil {
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
	var mm1, mm2 float64 // 0 = not given
	switch {
	case in.MolarMass1 != nil && in.MolarMass2 != nil:
		mm1, mm2 = *in.MolarMass1, *in.MolarMass2
		if err := copoly.CheckMolarMass("molarMass1", mm1); err != nil {
			return nil, err
		}
		if err := copoly.CheckMolarMass("molarMass2", mm2); err != nil {
			return nil, err
		}
	case in.MolarMass1 != nil:
		return nil, &copoly.FieldError{Field: "molarMass2", Reason: "is missing: give both molar masses or neither", Err: copoly.ErrOutOfRange}
	case in.MolarMass2 != nil:
		return nil, &copoly.FieldError{Field: "molarMass1", Reason: "is missing: give both molar masses or neither", Err: copoly.ErrOutOfRange}
	case basis == "mass":
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
		conversion = make([]float64, len(in.Conversion))
		for i, w := range in.Conversion {
			x, err := m.MolarConversion(w, in.F10, mm1, mm2)
			if err != nil {
				return nil, renameField(err, "massConversion", fmt.Sprintf("conversion[%d]", i))
			}
			conversion[i] = x
		}
	}
	d, err := m.Drift(in.F10, conversion)
	if err != nil {
		return nil, err
	}
	limit, err := m.ConversionLimit(in.F10, tolerance)
	if err != nil {
		return nil, err
	}
	last := len(conversion) - 1
	h, err := m.CompositionDistribution(in.F10, conversion[last], bins, mm1, mm2)
	if err != nil {
		return nil, renameField(err, "conversion", fmt.Sprintf("conversion[%d]", last))
	}
	if basis == "molar" && mm1 != 0 {
		conversionMass = make([]float64, len(conversion))
		for i, x := range conversion {
			conversionMass[i] = copoly.MassConversion(x, in.F10, d.Feed[i], mm1, mm2)
		}
	}

	out := driftOut{
		Conversion:     d.Conversion,
		ConversionMass: conversionMass,
		Feed:           d.Feed,
		Inst:           d.Inst,
		Cum:            d.Cum,
		Method:         d.Method,
		Limit:          limitOut{Tolerance: tolerance, Conversion: limit},
		Distribution:   histogramOut{Edges: h.Edges, Weights: h.Weights, Basis: h.Basis},
	}
	if e := d.Exhausted; e != nil {
		out.Exhausted = &exhaustedOut{Monomer: e.Monomer, Conversion: e.Conversion}
	}
	v := toJS(out)
	if conversionMass == nil {
		v.Delete("conversionMass")
	}
	return v, nil
}

// sequence: sequence statistics and run lengths at one feed, and the batch average when a
// conversion is given.
func sequence(arg js.Value) (any, error) {
	var in sequenceIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	m := copoly.Terminal{R1: in.R1, R2: in.R2}
	maxLength, err := intIn("maxLength", in.MaxLength, defaultMaxLength, 1, copoly.MaxRunLength)
	if err != nil {
		return nil, err
	}
	s, err := m.Sequence(in.F1)
	if err != nil {
		return nil, err
	}
	rl, err := m.RunLengths(in.F1, maxLength)
	if err != nil {
		return nil, err
	}
	v := toJS(sequenceDTO(s))
	v.Set("runLengths", toJS(runLengthsOut{Length: rl.Length, Number1: rl.Number1, Weight1: rl.Weight1, Number2: rl.Number2, Weight2: rl.Weight2}))
	if in.Conversion != nil {
		b, err := m.BatchSequence(in.F1, *in.Conversion)
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

// chains: sample chains grown at a constant feed.
func chains(arg js.Value) (any, error) {
	var in chainsIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, err
	}
	count, err := intIn("count", in.Count, defaultChainCount, 1, copoly.MaxChains)
	if err != nil {
		return nil, err
	}
	length, err := intIn("length", in.Length, defaultChainLength, 1, copoly.MaxChainLength)
	if err != nil {
		return nil, err
	}
	seed, err := intIn("seed", in.Seed, defaultSeed, 0, maxSeed)
	if err != nil {
		return nil, err
	}
	samples, err := copoly.Terminal{R1: in.R1, R2: in.R2}.Chains(in.F10, count, length, uint64(seed))
	if err != nil {
		return nil, err
	}
	return chainsOut{Samples: samples}, nil
}

// library: the built-in monomers and literature ratio pairs.
func library(js.Value) (any, error) {
	ms, ps := copoly.Monomers(), copoly.Pairs()
	out := libraryOut{Monomers: make([]monomerOut, len(ms)), Pairs: make([]pairOut, len(ps))}
	for i, m := range ms {
		out.Monomers[i] = monomerOut{Name: m.Name, Formula: m.Formula, MolarMass: m.MolarMass, Source: m.Source}
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
