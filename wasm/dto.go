//go:build js && wasm

package main

import (
	"errors"
	"fmt"
	"maps"
	"math"
	"reflect"
	"slices"
	"strings"
	"syscall/js"
	"unicode/utf8"

	"github.com/norunners/vert"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/fit"
	"copoly/copoly/plan"
	"copoly/copoly/project"
)

// JS-facing data transfer objects. Each mirrors one argument or result of site/copoly.d.ts with
// plain js:"camelCase" tags and built-in kinds only (vert cannot convert named number types or
// fixed-size arrays). Inputs are read by decode: a field whose Go type is a pointer is optional
// (nil when absent), a field tagged copoly:"optional" may be absent and then keeps its zero
// value, every other field is required. A list, a text or a map may carry a limit:"name" tag
// naming its largest size in limits; a list of numbers without one holds at most
// copoly.MaxPoints.

// Sentinels wrapped by the errors about the JS form of an input.
var (
	// errWrongType reports a JS value of the wrong type, or one that cannot be read.
	errWrongType = errors.New("copoly: value has the wrong type")
	// errMissing reports a required input that is absent, null or undefined.
	errMissing = errors.New("copoly: value missing")
)

// modelIn is the ModelArgs of the d.ts: the model word and every ratio any model takes, each
// optional here; readModel checks that the chosen model has its own.
type modelIn struct {
	R1    *float64 `js:"r1"` // read first, as before there were other models
	R2    *float64 `js:"r2"`
	Model *string  `js:"model" limit:"word"`
	R11   *float64 `js:"r11"`
	R21   *float64 `js:"r21"`
	R22   *float64 `js:"r22"`
	R12   *float64 `js:"r12"`
	S1    *float64 `js:"s1"`
	S2    *float64 `js:"s2"`
}

// readModel reads the ModelArgs of arg and returns the model (copoly validates it): a copoly.Terminal
// when "model" is absent or "terminal", else a copoly.Penultimate or copoly.Implicit. named
// reports that the caller gave "model". Ratios that belong to another model are ignored.
func readModel(arg js.Value) (m copoly.Model, named bool, err error) {
	var in modelIn
	if err := decode(arg, &in, ""); err != nil {
		return nil, false, err
	}
	kind := project.ModelTerminal
	if in.Model != nil {
		kind = *in.Model
	}
	// need returns the values of the ratios the model takes, or an error naming the first
	// one missing.
	need := func(what string, ps ...*float64) ([]float64, error) {
		names := strings.Split(what, ", ")
		v := make([]float64, len(ps))
		for i, p := range ps {
			if p == nil {
				return nil, &copoly.FieldError{Field: names[i], Reason: fmt.Sprintf("is missing: the %s model takes %s", kind, what), Err: errMissing}
			}
			v[i] = *p
		}
		return v, nil
	}
	var v []float64
	switch kind {
	case project.ModelTerminal:
		if v, err = need("r1, r2", in.R1, in.R2); err == nil {
			m = copoly.Terminal{R1: v[0], R2: v[1]}
		}
	case project.ModelPenultimate:
		if v, err = need("r11, r21, r22, r12", in.R11, in.R21, in.R22, in.R12); err == nil {
			m = copoly.Penultimate{R11: v[0], R21: v[1], R22: v[2], R12: v[3]}
		}
	case project.ModelImplicit:
		if v, err = need("r1, r2, s1, s2", in.R1, in.R2, in.S1, in.S2); err == nil {
			m = copoly.Implicit{R1: v[0], R2: v[1], S1: v[2], S2: v[3]}
		}
	default:
		return nil, false, &copoly.FieldError{Field: "model", Reason: fmt.Sprintf("is %q; it must be %q, %q or %q", kind, project.ModelTerminal, project.ModelPenultimate, project.ModelImplicit), Err: copoly.ErrOutOfRange}
	}
	if err != nil {
		return nil, false, err
	}
	return m, in.Model != nil, nil
}

// compositionIn is the argument of composition without its ModelArgs (readModel).
type compositionIn struct {
	F1 []float64 `js:"f1"`
}

type classificationOut struct {
	Kind    string  `js:"kind"`
	Product float64 `js:"product"`
	Text    string  `js:"text"`
}

type compositionOut struct {
	F1             []float64          `js:"F1"`
	Azeotrope      *float64           `js:"azeotrope"`      // null when none, and for a model other than the terminal
	Classification *classificationOut `js:"classification"` // null for a model other than the terminal
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

// driftIn is the argument of drift without its ModelArgs (readModel).
type driftIn struct {
	F10        float64   `js:"f10"`
	Conversion []float64 `js:"conversion"`
	Basis      *string   `js:"basis" limit:"word"`
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
	Limit          *limitOut     `js:"limit"`        // null for a model other than the terminal
	Distribution   *histogramOut `js:"distribution"` // null for a model other than the terminal
	Exhausted      *exhaustedOut `js:"exhausted"`    // null when no monomer runs out
}

// sequenceIn is the argument of sequence without its ModelArgs (readModel).
type sequenceIn struct {
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

// chainsIn is the argument of chains without its ModelArgs (readModel).
type chainsIn struct {
	F10        float64  `js:"f10"`
	Count      *float64 `js:"count"`
	Length     *float64 `js:"length"`
	Seed       *float64 `js:"seed"`
	DPn        *float64 `js:"dpn"`
	Conversion *float64 `js:"conversion"`
	Functional *float64 `js:"functional"`
	Bins       *float64 `js:"bins"`
}

// chainsOut is the ChainsResult of sample chains only (no simulation options given).
type chainsOut struct {
	Samples []string `js:"samples"`
}

type chainHistogramOut struct {
	Edges   []float64 `js:"edges"`
	Weights []float64 `js:"weights"`
}

// chainStatsOut is the ChainsResult of a simulation. functionalCounts, nonFunctional and
// expectedNonFunctional are removed without a functional monomer.
type chainStatsOut struct {
	Samples               []string          `js:"samples"`
	Compositions          []float64         `js:"compositions"`
	Lengths               []int             `js:"lengths"`
	FunctionalCounts      []int             `js:"functionalCounts"`
	NonFunctional         float64           `js:"nonFunctional"`
	ExpectedNonFunctional *float64          `js:"expectedNonFunctional"` // null unless terminal at a constant feed
	Mean                  float64           `js:"mean"`
	Variance              float64           `js:"variance"`
	WeightMean            float64           `js:"weightMean"`
	StockmayerVariance    *float64          `js:"stockmayerVariance"` // null unless terminal at a constant feed
	Units                 int               `js:"units"`
	Histogram             chainHistogramOut `js:"histogram"`
	Stockmayer            []float64         `js:"stockmayer"` // null unless terminal at a constant feed with a dpn
}

// triadRowDTO is the TriadRow of the d.ts, read from JavaScript (discriminate's runs and a
// project's triads): f10 is required, every measurement optional (absent = not measured).
type triadRowDTO struct {
	F10  float64  `js:"f10"`
	F1   *float64 `js:"F1"`
	A111 *float64 `js:"A111"`
	A112 *float64 `js:"A112"`
	A212 *float64 `js:"A212"`
	A222 *float64 `js:"A222"`
	A221 *float64 `js:"A221"`
	A121 *float64 `js:"A121"`
}

// triadRows converts rows read from JavaScript; project.CheckTriads checks them.
func triadRows(ds []triadRowDTO) []project.TriadRow {
	if len(ds) == 0 {
		return nil
	}
	rows := make([]project.TriadRow, len(ds))
	for i, d := range ds {
		rows[i] = project.TriadRow{F10: d.F10, F1: d.F1, A111: d.A111, A112: d.A112, A212: d.A212, A222: d.A222, A221: d.A221, A121: d.A121}
	}
	return rows
}

// triadsValue returns rows as TriadRow objects with the measurements given, in the order of
// the d.ts.
func triadsValue(rows []project.TriadRow) js.Value {
	out := array.New()
	for i, r := range rows {
		v := object.New()
		v.Set("f10", r.F10)
		for _, m := range []struct {
			key string
			v   *float64
		}{{"F1", r.F1}, {"A111", r.A111}, {"A112", r.A112}, {"A212", r.A212}, {"A222", r.A222}, {"A221", r.A221}, {"A121", r.A121}} {
			if m.v != nil {
				v.Set(m.key, *m.v)
			}
		}
		out.SetIndex(i, v)
	}
	return out
}

type discriminateIn struct {
	Runs []triadRowDTO `js:"runs" limit:"triads"`
}

// triadRowOut is a TriadRow of predicted values: every key present.
type triadRowOut struct {
	F10  float64 `js:"f10"`
	F1   float64 `js:"F1"`
	A111 float64 `js:"A111"`
	A112 float64 `js:"A112"`
	A212 float64 `js:"A212"`
	A222 float64 `js:"A222"`
	A221 float64 `js:"A221"`
	A121 float64 `js:"A121"`
}

func triadRowOf(f10 float64, s copoly.Sequence) triadRowOut {
	return triadRowOut{F10: f10, F1: s.F1, A111: s.T111, A112: s.T112, A212: s.T212, A222: s.T222, A221: s.T221, A121: s.T121}
}

// modelFitOut is the ModelFitResult of the d.ts; a standard error copoly reports as NaN (a
// singular fit) is null.
type modelFitOut struct {
	Model  string     `js:"model"`
	Params []float64  `js:"params"`
	SE     []*float64 `js:"se"`
	SSR    float64    `js:"ssr"`
	N      int        `js:"n"`
	K      int        `js:"k"`
	AIC    float64    `js:"aic"`
	AICc   float64    `js:"aicc"`
}

func modelFitDTO(f fit.ModelFit) modelFitOut {
	se := make([]*float64, len(f.SE))
	for i, x := range f.SE {
		se[i] = finiteOrNil(x)
	}
	return modelFitOut{Model: f.Model, Params: orEmpty(f.Params), SE: se, SSR: f.SSR, N: f.N, K: f.K, AIC: f.AIC, AICc: f.AICc}
}

type predictedOut struct {
	Terminal    []triadRowOut `js:"terminal"`
	Penultimate []triadRowOut `js:"penultimate"`
}

// discriminationOut is the DiscriminationResult of the d.ts; pValue is null when copoly gives
// NaN (too few values for the F-test).
type discriminationOut struct {
	Terminal    modelFitOut  `js:"terminal"`
	Penultimate modelFitOut  `js:"penultimate"`
	F           float64      `js:"F"`
	PValue      *float64     `js:"pValue"`
	DeltaAIC    float64      `js:"deltaAIC"`
	Supported   bool         `js:"supported"`
	Verdict     string       `js:"verdict"`
	Predicted   predictedOut `js:"predicted"`
}

// sizeBinDTO is one molar-mass class of averages' bins and of a project's sizeBins, both ways.
// A fraction left out is 0 (not given).
type sizeBinDTO struct {
	Low            float64 `js:"low"`
	High           float64 `js:"high"`
	NumberFraction float64 `js:"numberFraction" copoly:"optional"`
	WeightFraction float64 `js:"weightFraction" copoly:"optional"`
}

// sizeBinsValue returns bins as objects; like the file format they leave out a fraction of 0.
func sizeBinsValue(bins []project.SizeBin) js.Value {
	out := array.New()
	for i, b := range bins {
		v := object.New()
		v.Set("low", b.Low)
		v.Set("high", b.High)
		if b.NumberFraction != 0 {
			v.Set("numberFraction", b.NumberFraction)
		}
		if b.WeightFraction != 0 {
			v.Set("weightFraction", b.WeightFraction)
		}
		out.SetIndex(i, v)
	}
	return out
}

type sliceDTO struct {
	Mass   float64 `js:"mass"`
	Signal float64 `js:"signal"`
}

type averagesIn struct {
	Bins       []sizeBinDTO `js:"bins" copoly:"optional" limit:"sizeBins"`
	Slices     []sliceDTO   `js:"slices" copoly:"optional" limit:"sizeBins"`
	F1         *float64     `js:"F1"`
	MolarMass1 *float64     `js:"molarMass1"`
	MolarMass2 *float64     `js:"molarMass2"`
}

type sizeOut struct {
	UnitMass float64 `js:"unitMass"`
	DPn      float64 `js:"DPn"`
	DPw      float64 `js:"DPw"`
	Units1   float64 `js:"units1"`
	Units2   float64 `js:"units2"`
}

// averagesOut is the AveragesResult of the d.ts; size is removed when nil.
type averagesOut struct {
	Mn         float64  `js:"Mn"`
	Mw         float64  `js:"Mw"`
	Mz         float64  `js:"Mz"`
	Dispersity float64  `js:"dispersity"`
	Size       *sizeOut `js:"size"`
}

// monomerOut is the MonomerData of the d.ts: a built-in monomer with its process data
// (copoly.PropertiesOf) and Q–e values (copoly.QEOf; q and e null when it has none).
type monomerOut struct {
	Name          string   `js:"name"`
	Formula       string   `js:"formula"`
	MolarMass     float64  `js:"molarMass"`
	Source        string   `js:"source"`
	State         string   `js:"state"`
	Density       float64  `js:"density"`
	DensityTemp   float64  `js:"densityTemp"`
	DensitySource string   `js:"densitySource"`
	Heat          float64  `js:"heat"`
	HeatSource    string   `js:"heatSource"`
	Q             *float64 `js:"q"`
	E             *float64 `js:"e"`
	QESource      string   `js:"qeSource"`
	Hazards       []string `js:"hazards"`
	HazardSource  string   `js:"hazardSource"`
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

// runDTO is the Run of the d.ts, both ways: mole fractions and molar conversion (0 = low
// conversion), with optional standard uncertainties (0 = not given).
type runDTO struct {
	F10        float64 `js:"f10"`
	Conversion float64 `js:"conversion" copoly:"optional"`
	F1         float64 `js:"F1"`
	SF         float64 `js:"sF" copoly:"optional"`
	SX         float64 `js:"sX" copoly:"optional"`
	Sf         float64 `js:"sf" copoly:"optional"`
}

func runOut(r copoly.Run) runDTO {
	return runDTO{F10: r.F10, Conversion: r.Conversion, F1: r.F1, SF: r.SF, SX: r.SX, Sf: r.Sf}
}

// runsOf converts runs read from JavaScript, checking that every number is finite; the ranges
// are copoly's to check.
func runsOf(in []runDTO) ([]copoly.Run, error) {
	runs := make([]copoly.Run, len(in))
	for i, d := range in {
		for _, c := range []struct {
			key string
			v   float64
		}{{"f10", d.F10}, {"conversion", d.Conversion}, {"F1", d.F1}, {"sF", d.SF}, {"sX", d.SX}, {"sf", d.Sf}} {
			if math.IsNaN(c.v) || math.IsInf(c.v, 0) {
				return nil, &copoly.InputError{Field: fmt.Sprintf("runs[%d].%s", i, c.key), Value: c.v, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
			}
		}
		runs[i] = copoly.Run{F10: d.F10, Conversion: d.Conversion, F1: d.F1, SF: d.SF, SX: d.SX, Sf: d.Sf}
	}
	return runs, nil
}

type benchRunsIn struct {
	Bench      benchDTO `js:"bench"`
	MolarMass1 *float64 `js:"molarMass1"`
	MolarMass2 *float64 `js:"molarMass2"`
}

type runWarningOut struct {
	Row     int    `js:"row"`
	Field   string `js:"field"`
	Message string `js:"message"`
}

type pasteBenchIn struct {
	Bench benchDTO `js:"bench"`
	Text  string   `js:"text" limit:"text"`
}

type fitIn struct {
	Runs   []runDTO `js:"runs" limit:"runs"`
	Level  *float64 `js:"level"`
	Curves *bool    `js:"curves"`
}

// linearOut is the LinearFit of the d.ts; alpha is removed for the methods without one.
type linearOut struct {
	R1        float64   `js:"r1"`
	R2        float64   `js:"r2"`
	X         []float64 `js:"x"`
	Y         []float64 `js:"y"`
	Slope     float64   `js:"slope"`
	Intercept float64   `js:"intercept"`
	Alpha     float64   `js:"alpha"`
	Linear    bool      `js:"linear"`
}

func linearDTO(l *fit.Linear) linearOut {
	return linearOut{R1: l.R1, R2: l.R2, X: orEmpty(l.X), Y: orEmpty(l.Y), Slope: l.Slope, Intercept: l.Intercept, Alpha: l.Alpha, Linear: true}
}

type curveOut struct {
	R1 []float64 `js:"r1"`
	R2 []float64 `js:"r2"`
}

type mayoLewisOut struct {
	R1     float64    `js:"r1"`
	R2     float64    `js:"r2"`
	Curves []curveOut `js:"curves"` // nil (removed) unless asked for
}

// mayoLewisDTO converts the intersection; its curves (one per run, up to 200 points each: most
// of a fit's result) only when asked for, as the page does not draw them.
func mayoLewisDTO(m *fit.Intersection, curves bool) mayoLewisOut {
	out := mayoLewisOut{R1: m.R1, R2: m.R2}
	if !curves {
		return out
	}
	out.Curves = make([]curveOut, len(m.Curves))
	for i, c := range m.Curves {
		out.Curves[i] = curveOut{R1: orEmpty(c[0]), R2: orEmpty(c[1])}
	}
	return out
}

type regionOut struct {
	Level    float64     `js:"level"`
	Kind     string      `js:"kind"`
	Critical float64     `js:"critical"`
	Boundary [][]float64 `js:"boundary"`
	Open     bool        `js:"open"`
	R1Min    float64     `js:"r1Min"`
	R1Max    float64     `js:"r1Max"`
	R2Min    float64     `js:"r2Min"`
	R2Max    float64     `js:"r2Max"`
}

// regionDTO returns the region and its boundary as [r1, r2] lists (vert cannot convert [2]float64).
func regionDTO(r fit.Region) (regionOut, [][]float64) {
	b := make([][]float64, len(r.Boundary))
	for i, p := range r.Boundary {
		b[i] = []float64{p[0], p[1]}
	}
	return regionOut{Level: r.Level, Kind: r.Kind, Critical: r.Critical, Boundary: b, Open: r.Open,
		R1Min: r.R1Min, R1Max: r.R1Max, R2Min: r.R2Min, R2Max: r.R2Max}, b
}

// nonlinearOut is the NonlinearFit of the d.ts. se1, se2 and corr are null when the
// linearised covariance is singular (copoly reports +Inf and NaN); reducedChi2, pValue and
// sigma are removed for an unweighted fit.
type nonlinearOut struct {
	R1          float64     `js:"r1"`
	R2          float64     `js:"r2"`
	SE1         *float64    `js:"se1"`
	SE2         *float64    `js:"se2"`
	Corr        *float64    `js:"corr"`
	SSR         float64     `js:"ssr"`
	Weighted    bool        `js:"weighted"`
	N           int         `js:"n"`
	DoF         int         `js:"dof"`
	ReducedChi2 float64     `js:"reducedChi2"`
	PValue      float64     `js:"pValue"`
	AtBound     string      `js:"atBound"`
	Residuals   []float64   `js:"residuals"`
	Sigma       []float64   `js:"sigma"`
	JCR         [][]float64 `js:"jcr"`
	Region      regionOut   `js:"region"`
}

func nonlinearDTO(n *fit.Nonlinear) nonlinearOut {
	region, jcr := regionDTO(n.Region)
	return nonlinearOut{
		R1: n.R1, R2: n.R2, SE1: finiteOrNil(n.SE1), SE2: finiteOrNil(n.SE2), Corr: finiteOrNil(n.Corr),
		SSR: n.SSR, Weighted: n.Weighted, N: n.N, DoF: n.DoF, ReducedChi2: n.ReducedChi2, PValue: n.PValue,
		AtBound: n.AtBound, Residuals: orEmpty(n.Residuals), Sigma: orEmpty(n.Sigma), JCR: jcr, Region: region,
	}
}

// evmOut is the EVMFit of the d.ts; se1, se2 and corr as in nonlinearOut.
type evmOut struct {
	R1          float64     `js:"r1"`
	R2          float64     `js:"r2"`
	SE1         *float64    `js:"se1"`
	SE2         *float64    `js:"se2"`
	Corr        *float64    `js:"corr"`
	Phi         float64     `js:"phi"`
	ReducedChi2 float64     `js:"reducedChi2"`
	PValue      float64     `js:"pValue"`
	Feed        []float64   `js:"feed"`
	Conversion  []float64   `js:"conversion"`
	Composition []float64   `js:"composition"`
	JCR         [][]float64 `js:"jcr"`
	Region      regionOut   `js:"region"`
}

func evmDTO(e *fit.EVM) evmOut {
	region, jcr := regionDTO(e.Region)
	return evmOut{
		R1: e.R1, R2: e.R2, SE1: finiteOrNil(e.SE1), SE2: finiteOrNil(e.SE2), Corr: finiteOrNil(e.Corr),
		Phi: e.Phi, ReducedChi2: e.ReducedChi2, PValue: e.PValue,
		Feed: orEmpty(e.Feed), Conversion: orEmpty(e.Conversion), Composition: orEmpty(e.Composition),
		JCR: jcr, Region: region,
	}
}

type ratiosOut struct {
	R1 float64 `js:"r1"`
	R2 float64 `js:"r2"`
}

type trendOut struct {
	Slope   float64 `js:"slope"`
	PValue  float64 `js:"pValue"`
	Flagged bool    `js:"flagged"`
}

type trendsOut struct {
	Feed       trendOut `js:"feed"`
	Conversion trendOut `js:"conversion"`
}

type warningOut struct {
	Method  string `js:"method"`
	Row     int    `js:"row"`
	Field   string `js:"field"`
	Message string `js:"message"`
}

type nextRunsIn struct {
	R1          float64   `js:"r1"`
	R2          float64   `js:"r2"`
	Runs        []runDTO  `js:"runs" copoly:"optional" limit:"runs"`
	Conversions []float64 `js:"conversions" copoly:"optional"`
}

type suggestionOut struct {
	F10        float64 `js:"f10"`
	Conversion float64 `js:"conversion"`
}

type nextRunsOut struct {
	TidwellMortimer []float64       `js:"tidwellMortimer"`
	DOptimal        []float64       `js:"dOptimal"`
	Middle          float64         `js:"middle"`
	Next            []suggestionOut `js:"next"`
	Shrink          float64         `js:"shrink"`
}

type qeIn struct {
	Monomer1 string `js:"monomer1" limit:"name"`
	Monomer2 string `js:"monomer2" limit:"name"`
}

type qeOut struct {
	R1      float64 `js:"r1"`
	R2      float64 `js:"r2"`
	Q1      float64 `js:"q1"`
	E1      float64 `js:"e1"`
	Q2      float64 `js:"q2"`
	E2      float64 `js:"e2"`
	Source1 string  `js:"source1"`
	Source2 string  `js:"source2"`
}

// planIn is the argument of plan. The pointer fields are optional; absent means copoly's
// default (a zero in plan.Input), and apply checks the few whose zero would silently
// select a default the caller did not ask for.
type planIn struct {
	R1              float64     `js:"r1"`
	R2              float64     `js:"r2"`
	TargetF1        float64     `js:"targetF1"`
	MolarMass1      float64     `js:"molarMass1"`
	MolarMass2      float64     `js:"molarMass2"`
	PolymerMass     float64     `js:"polymerMass"`
	Mode            string      `js:"mode" limit:"word"`
	Monomer1        *string     `js:"monomer1" limit:"name"`
	Monomer2        *string     `js:"monomer2" limit:"name"`
	Tolerance       *float64    `js:"tolerance"`
	StopConversion  *float64    `js:"stopConversion"`
	FinalConversion *float64    `js:"finalConversion"`
	Feed            *string     `js:"feed" limit:"word"`
	FeedF1          *float64    `js:"feedF1"`
	Shots           *float64    `js:"shots"`
	Steps           *float64    `js:"steps"`
	RateConstant    *float64    `js:"rateConstant"`
	HalfLife        *float64    `js:"halfLife"`
	TimeTable       [][]float64 `js:"timeTable" copoly:"optional" limit:"timeTable" pair:"time, conversion"`
	Heat1           *float64    `js:"heat1"`
	Heat2           *float64    `js:"heat2"`
	BatchMass       *float64    `js:"batchMass"`
	HeatCapacity    *float64    `js:"heatCapacity"`
	RiseLimit       *float64    `js:"riseLimit"`
	JCR             [][]float64 `js:"jcr" copoly:"optional" limit:"jcr"`
	Samples         *float64    `js:"samples"`
	Seed            *float64    `js:"seed"`
}

type planRowOut struct {
	Conversion float64  `js:"conversion"`
	Polymer    float64  `js:"polymer"`
	Fed1       float64  `js:"fed1"`
	Fed2       float64  `js:"fed2"`
	Feed       float64  `js:"f1"`
	Inst       float64  `js:"F1"`
	Cum        float64  `js:"F1cum"`
	Inventory  float64  `js:"inventory"`
	Time       *float64 `js:"time"`  // null without a time axis
	Pump1      *float64 `js:"pump1"` // null without a time axis
	Pump2      *float64 `js:"pump2"`
}

// initialOut is the initial charge: g, mol, and mL for a liquid of known density (else null).
type initialOut struct {
	M1 float64  `js:"m1"`
	M2 float64  `js:"m2"`
	N1 float64  `js:"n1"`
	N2 float64  `js:"n2"`
	V1 *float64 `js:"v1"`
	V2 *float64 `js:"v2"`
}

type totalOut struct {
	M1 float64 `js:"m1"`
	M2 float64 `js:"m2"`
}

type shotOut struct {
	Polymer float64  `js:"polymer"`
	M1      float64  `js:"m1"`
	M2      float64  `js:"m2"`
	Time    *float64 `js:"time"` // null without a time axis
}

type hazardsOut struct {
	Monomer string   `js:"monomer"`
	Hazards []string `js:"hazards"`
}

type safetyOut struct {
	InventoryMax float64      `js:"inventoryMax"`
	InventoryAt  float64      `js:"inventoryAt"`
	Heat         *float64     `js:"heat"` // null when a heat of polymerization is not known
	Rise         *float64     `js:"rise"`
	RiseLimit    float64      `js:"riseLimit"`
	Flagged      bool         `js:"flagged"`
	BatchMass    float64      `js:"batchMass"`
	HeatCapacity float64      `js:"heatCapacity"`
	Hazards      []hazardsOut `js:"hazards"`
}

type bandOut struct {
	Samples     int       `js:"samples"`
	InstLow     []float64 `js:"F1Low"`
	InstHigh    []float64 `js:"F1High"`
	CumLow      []float64 `js:"F1cumLow"`
	CumHigh     []float64 `js:"F1cumHigh"`
	ProductLow  float64   `js:"productLow"`
	ProductHigh float64   `js:"productHigh"`
}

// planOut is the PlanResult of the d.ts; band is removed when nil.
type planOut struct {
	Mode           string       `js:"mode"`
	StartF1        float64      `js:"startF1"`
	Initial        initialOut   `js:"initial"`
	Total          totalOut     `js:"total"`
	FeedF1         float64      `js:"feedF1"`
	FeedPerPolymer float64      `js:"feedPerPolymer"`
	StopConversion float64      `js:"stopConversion"`
	ProductF1      float64      `js:"productF1"`
	MaxDeviation   float64      `js:"maxDeviation"`
	Schedule       []planRowOut `js:"schedule"`
	Shots          []shotOut    `js:"shots"`
	Distribution   histogramOut `js:"distribution"`
	InventoryMax   float64      `js:"inventoryMax"`
	Safety         safetyOut    `js:"safety"`
	Band           *bandOut     `js:"band"`
	Notes          []string     `js:"notes"`
}

// planDTO converts a plan: NaN times, pump rates, heat, rise and volumes become null.
func planDTO(p *plan.Recipe) planOut {
	out := planOut{
		Mode:    p.Mode,
		StartF1: p.StartF1,
		Initial: initialOut{M1: p.Charge1, M2: p.Charge2, N1: p.Moles1, N2: p.Moles2,
			V1: finiteOrNil(p.Volume1), V2: finiteOrNil(p.Volume2)},
		Total:          totalOut{M1: p.Total1, M2: p.Total2},
		FeedF1:         p.FeedF1,
		FeedPerPolymer: p.FeedPerPolymer,
		StopConversion: p.StopConversion,
		ProductF1:      p.ProductF1,
		MaxDeviation:   p.MaxDeviation,
		Schedule:       make([]planRowOut, len(p.Schedule)),
		Shots:          make([]shotOut, len(p.Shots)),
		Distribution:   histogramOut{Edges: orEmpty(p.Distribution.Edges), Weights: orEmpty(p.Distribution.Weights), Basis: p.Distribution.Basis},
		InventoryMax:   p.Safety.InventoryMax,
		Safety: safetyOut{
			InventoryMax: p.Safety.InventoryMax, InventoryAt: p.Safety.InventoryAt,
			Heat: finiteOrNil(p.Safety.Heat), Rise: finiteOrNil(p.Safety.Rise),
			RiseLimit: p.Safety.RiseLimit, Flagged: p.Safety.Flagged,
			BatchMass: p.Safety.BatchMass, HeatCapacity: p.Safety.HeatCapacity,
			Hazards: make([]hazardsOut, len(p.Safety.Hazards)),
		},
		Notes: orNoTexts(p.Notes),
	}
	for i, h := range p.Safety.Hazards {
		out.Safety.Hazards[i] = hazardsOut{Monomer: h.Monomer, Hazards: orNoTexts(h.Hazards)}
	}
	for i, r := range p.Schedule {
		out.Schedule[i] = planRowOut{Conversion: r.Conversion, Polymer: r.Polymer, Fed1: r.Fed1, Fed2: r.Fed2,
			Feed: r.Feed, Inst: r.Inst, Cum: r.Cum, Inventory: r.Inventory,
			Time: finiteOrNil(r.Time), Pump1: finiteOrNil(r.Pump1), Pump2: finiteOrNil(r.Pump2)}
	}
	for i, s := range p.Shots {
		out.Shots[i] = shotOut{Polymer: s.Polymer, M1: s.Mass1, M2: s.Mass2, Time: finiteOrNil(s.Time)}
	}
	if b := p.Band; b != nil {
		out.Band = &bandOut{Samples: b.Samples, InstLow: orEmpty(b.InstLow), InstHigh: orEmpty(b.InstHigh),
			CumLow: orEmpty(b.CumLow), CumHigh: orEmpty(b.CumHigh), ProductLow: b.ProductLow, ProductHigh: b.ProductHigh}
	}
	return out
}

type starvedFeedIn struct {
	R1           float64 `js:"r1"`
	R2           float64 `js:"r2"`
	TargetF1     float64 `js:"targetF1"`
	FeedRate     float64 `js:"feedRate"`
	RateConstant float64 `js:"rateConstant"`
	MolarMass1   float64 `js:"molarMass1"`
	MolarMass2   float64 `js:"molarMass2"`
}

type starvedFeedOut struct {
	Inventory float64 `js:"inventory"`
	F1        float64 `js:"f1"`
}

// finiteOrNil returns &x, or nil (null in JavaScript) when x is NaN or infinite.
func finiteOrNil(x float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	return &x
}

// orNumber returns *v, or def when v is nil (absent).
func orNumber(v *float64, def float64) float64 {
	if v == nil {
		return def
	}
	return *v
}

// orText returns *v, or "" when v is nil (absent).
func orText(v *string) string {
	if v == nil {
		return ""
	}
	return *v
}

// orEmpty returns s, or an empty slice for nil, so that JavaScript gets [] rather than null.
func orEmpty(s []float64) []float64 {
	if s == nil {
		return []float64{}
	}
	return s
}

// orNoTexts returns s, or an empty slice for nil.
func orNoTexts(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// nonFinite returns the path of the first NaN or infinite number in the DTO v (a struct of
// numbers, texts, booleans, pointers, slices and nested structs), or "" when every number is
// finite. A nil pointer (null) counts as finite.
func nonFinite(v any) string {
	// walk reports whether rv holds a number that is not finite, and its path below rv; the
	// path is built only on the way back from one, so a long list costs no text.
	var walk func(rv reflect.Value) (string, bool)
	walk = func(rv reflect.Value) (string, bool) {
		switch rv.Kind() {
		case reflect.Float64:
			if x := rv.Float(); math.IsNaN(x) || math.IsInf(x, 0) {
				return "", true
			}
		case reflect.Pointer:
			if !rv.IsNil() {
				return walk(rv.Elem())
			}
		case reflect.Slice:
			if rv.Type().Elem().Kind() == reflect.Float64 {
				for i, x := range rv.Interface().([]float64) {
					if math.IsNaN(x) || math.IsInf(x, 0) {
						return fmt.Sprintf("[%d]", i), true
					}
				}
				return "", false
			}
			for i := range rv.Len() {
				if p, bad := walk(rv.Index(i)); bad {
					return fmt.Sprintf("[%d]%s", i, p), true
				}
			}
		case reflect.Struct:
			t := rv.Type()
			for i := range t.NumField() {
				if p, bad := walk(rv.Field(i)); bad {
					return "." + t.Field(i).Tag.Get("js") + p, true
				}
			}
		}
		return "", false
	}
	p, _ := walk(reflect.ValueOf(v))
	return strings.TrimPrefix(p, ".")
}

// projectMonomerDTO is one monomer of a Project.
type projectMonomerDTO struct {
	Name      string  `js:"name" copoly:"optional" limit:"name"`
	MolarMass float64 `js:"molarMass" copoly:"optional"`
}

// projectDTO is the Project of the d.ts, both ways. Version is a float64 so that 1.5 can be
// refused by name instead of being truncated.
type projectDTO struct {
	Format      string            `js:"format" limit:"word"`
	Version     float64           `js:"version"`
	Name        string            `js:"name" copoly:"optional" limit:"name"`
	Monomer1    projectMonomerDTO `js:"monomer1"`
	Monomer2    projectMonomerDTO `js:"monomer2"`
	R1          float64           `js:"r1"`
	R2          float64           `js:"r2"`
	RatioSource string            `js:"ratioSource" copoly:"optional" limit:"source"`
	F10         float64           `js:"f10"`
	Conversion  float64           `js:"conversion"`
	Tolerance   float64           `js:"tolerance"`
	Notes       string            `js:"notes" copoly:"optional" limit:"notes"`
	Invented    bool              `js:"invented" copoly:"optional"`
	SavedAt     string            `js:"savedAt" copoly:"optional" limit:"stamp"`
	Bench       *benchDTO         `js:"bench"`
	Level       float64           `js:"level" copoly:"optional"`
	JCR         [][]float64       `js:"jcr" copoly:"optional" limit:"jcr"`
	Model       *projectModelDTO  `js:"model"`
	// Triads and SizeBins are the tables of the d.ts; absent, null or [] means none.
	Triads   []triadRowDTO   `js:"triads" copoly:"optional" limit:"triads"`
	SizeBins []sizeBinDTO    `js:"sizeBins" copoly:"optional" limit:"sizeBins"`
	Plan     *projectPlanDTO `js:"plan"`
	// UserMonomers is the UserMonomer list of the d.ts; absent, null or [] means none.
	UserMonomers []userMonomerDTO `js:"userMonomers" copoly:"optional" limit:"userMonomers"`
}

// projectModelDTO is the model of a Project, read from JavaScript; modelValue writes one. Only
// the kind is required; a ratio left out is not typed.
type projectModelDTO struct {
	Kind string   `js:"kind" limit:"word"`
	R11  *float64 `js:"r11"`
	R21  *float64 `js:"r21"`
	R22  *float64 `js:"r22"`
	R12  *float64 `js:"r12"`
	S1   *float64 `js:"s1"`
	S2   *float64 `js:"s2"`
}

// modelValue returns m as the model object of a Project: the kind and the ratios typed, in the
// order of the d.ts.
func modelValue(m project.Model) js.Value {
	v := object.New()
	v.Set("kind", m.Kind)
	for _, r := range []struct {
		key string
		v   *float64
	}{{"r11", m.R11}, {"r21", m.R21}, {"r22", m.R22}, {"r12", m.R12}, {"s1", m.S1}, {"s2", m.S2}} {
		if r.v != nil {
			v.Set(r.key, *r.v)
		}
	}
	return v
}

// sizeBins converts molar-mass classes read from JavaScript.
func sizeBins(ds []sizeBinDTO) []project.SizeBin {
	if len(ds) == 0 {
		return nil
	}
	bins := make([]project.SizeBin, len(ds))
	for i, d := range ds {
		bins[i] = project.SizeBin{Low: d.Low, High: d.High, NumberFraction: d.NumberFraction, WeightFraction: d.WeightFraction}
	}
	return bins
}

// userMonomerDTO is one UserMonomer of a Project, both ways. Only the name is required; an
// absent number is 0 (not given), an absent state or note "", absent hazards none.
type userMonomerDTO struct {
	Name        string   `js:"name" limit:"name"`
	MolarMass   float64  `js:"molarMass" copoly:"optional"`
	Density     float64  `js:"density" copoly:"optional"`
	DensityTemp float64  `js:"densityTemp" copoly:"optional"`
	State       string   `js:"state" copoly:"optional" limit:"word"`
	Heat        float64  `js:"heat" copoly:"optional"`
	Q           float64  `js:"q" copoly:"optional"`
	E           float64  `js:"e" copoly:"optional"`
	Hazards     []string `js:"hazards" copoly:"optional" limit:"hazards" each:"hazard"`
	Note        string   `js:"note" copoly:"optional" limit:"source"`
}

// userMonomers converts the user monomers read from JavaScript (validated with the project).
func userMonomers(ds []userMonomerDTO) []project.UserMonomer {
	if len(ds) == 0 {
		return nil
	}
	ms := make([]project.UserMonomer, len(ds))
	for i, d := range ds {
		var hazards []string
		if len(d.Hazards) > 0 {
			hazards = d.Hazards
		}
		ms[i] = project.UserMonomer{Name: d.Name, MolarMass: d.MolarMass, Density: d.Density, DensityTemp: d.DensityTemp,
			State: d.State, Heat: d.Heat, Q: d.Q, E: d.E, Hazards: hazards, Note: d.Note}
	}
	return ms
}

// userMonomersOut returns ms as UserMonomer objects, every key present and hazards always a list.
func userMonomersOut(ms []project.UserMonomer) []userMonomerDTO {
	out := make([]userMonomerDTO, len(ms))
	for i, m := range ms {
		out[i] = userMonomerDTO{Name: m.Name, MolarMass: m.MolarMass, Density: m.Density, DensityTemp: m.DensityTemp,
			State: m.State, Heat: m.Heat, Q: m.Q, E: m.E, Hazards: orNoTexts(m.Hazards), Note: m.Note}
	}
	return out
}

// projectPlanDTO is the plan of a Project, read from JavaScript; planValue writes one. Every key
// is optional (0 or "" = not given, as in project.Plan). Shots is a float64 so that 2.5 can be
// refused by name instead of being truncated.
type projectPlanDTO struct {
	Mode            string      `js:"mode" copoly:"optional" limit:"word"`
	TargetF1        float64     `js:"targetF1" copoly:"optional"`
	PolymerMass     float64     `js:"polymerMass" copoly:"optional"`
	Tolerance       float64     `js:"tolerance" copoly:"optional"`
	StopConversion  float64     `js:"stopConversion" copoly:"optional"`
	FinalConversion float64     `js:"finalConversion" copoly:"optional"`
	Feed            string      `js:"feed" copoly:"optional" limit:"word"`
	FeedF1          float64     `js:"feedF1" copoly:"optional"`
	Shots           float64     `js:"shots" copoly:"optional"`
	RateLaw         string      `js:"rateLaw" copoly:"optional" limit:"word"`
	RateConstant    float64     `js:"rateConstant" copoly:"optional"`
	HalfLife        float64     `js:"halfLife" copoly:"optional"`
	TimeTable       [][]float64 `js:"timeTable" copoly:"optional" limit:"timeTable" pair:"time, conversion"`
	Heat1           float64     `js:"heat1" copoly:"optional"`
	Heat2           float64     `js:"heat2" copoly:"optional"`
	BatchMass       float64     `js:"batchMass" copoly:"optional"`
	HeatCapacity    float64     `js:"heatCapacity" copoly:"optional"`
	RiseLimit       float64     `js:"riseLimit" copoly:"optional"`
}

// plan converts the plan of a Project read from JavaScript and checks it (project.CheckPlan).
func (d projectPlanDTO) plan(field string) (project.Plan, error) {
	if d.Shots != math.Trunc(d.Shots) || math.Abs(d.Shots) > 1e9 {
		return project.Plan{}, &copoly.InputError{Field: field + ".shots", Value: d.Shots, Reason: "must be a whole number (0 or absent = the fewest within the tolerance)", Err: copoly.ErrOutOfRange}
	}
	pl := project.Plan{
		Mode: d.Mode, TargetF1: d.TargetF1, PolymerMass: d.PolymerMass, Tolerance: d.Tolerance,
		StopConversion: d.StopConversion, FinalConversion: d.FinalConversion, Feed: d.Feed, FeedF1: d.FeedF1,
		Shots: int(d.Shots), RateLaw: d.RateLaw, RateConstant: d.RateConstant, HalfLife: d.HalfLife,
		Heat1: d.Heat1, Heat2: d.Heat2,
		BatchMass: d.BatchMass, HeatCapacity: d.HeatCapacity, RiseLimit: d.RiseLimit,
	}
	if len(d.TimeTable) > 0 { // [] is no table, as in the file
		pl.TimeTable = make([][2]float64, len(d.TimeTable))
		for i, row := range d.TimeTable {
			pl.TimeTable[i] = [2]float64{row[0], row[1]} // decode read each row as a pair
		}
	}
	return pl, project.CheckPlan(field, pl)
}

// planValue returns pl as the plan object of a Project: like the file format it holds only the
// keys given (not 0 or ""), in the order of the d.ts.
func planValue(pl project.Plan) js.Value {
	v := object.New()
	for _, kv := range []struct {
		key string
		v   any
	}{
		{"mode", pl.Mode}, {"targetF1", pl.TargetF1}, {"polymerMass", pl.PolymerMass}, {"tolerance", pl.Tolerance},
		{"stopConversion", pl.StopConversion}, {"finalConversion", pl.FinalConversion},
		{"feed", pl.Feed}, {"feedF1", pl.FeedF1}, {"shots", pl.Shots},
		{"rateLaw", pl.RateLaw}, {"rateConstant", pl.RateConstant}, {"halfLife", pl.HalfLife},
		{"timeTable", pl.TimeTable}, {"heat1", pl.Heat1}, {"heat2", pl.Heat2},
		{"batchMass", pl.BatchMass}, {"heatCapacity", pl.HeatCapacity}, {"riseLimit", pl.RiseLimit},
	} {
		switch x := kv.v.(type) {
		case [][2]float64:
			if len(x) > 0 {
				rows := make([][]float64, len(x))
				for i, row := range x {
					rows[i] = []float64{row[0], row[1]}
				}
				v.Set(kv.key, toJS(rows))
			}
		case string:
			if x != "" {
				v.Set(kv.key, x)
			}
		case float64:
			if x != 0 {
				v.Set(kv.key, x)
			}
		case int:
			if x != 0 {
				v.Set(kv.key, x)
			}
		}
	}
	return v
}

// benchDTO is the BenchTable of the d.ts, read from JavaScript; benchValue writes one. Only the
// rows are required: the kinds default to "" (the first form of each), the element fields to
// "" and 0.
type benchDTO struct {
	FeedKind        string        `js:"feedKind" copoly:"optional" limit:"word"`
	ConversionKind  string        `js:"conversionKind" copoly:"optional" limit:"word"`
	CompositionKind string        `js:"compositionKind" copoly:"optional" limit:"word"`
	Element         string        `js:"element" copoly:"optional" limit:"cell"`
	Carrier         float64       `js:"carrier" copoly:"optional"`
	ElementCount    float64       `js:"elementCount" copoly:"optional"`
	Rows            []benchRowDTO `js:"rows" limit:"rows"`
}

type benchRowDTO struct {
	Label string            `js:"label" copoly:"optional" limit:"label"`
	Cells map[string]string `js:"cells" copoly:"optional" limit:"cells" each:"cell"`
}

// benchHeadOut is a BenchTable without its rows; benchValue adds them with their cells in a
// fixed order, which vert's map conversion does not keep.
type benchHeadOut struct {
	FeedKind        string  `js:"feedKind"`
	ConversionKind  string  `js:"conversionKind"`
	CompositionKind string  `js:"compositionKind"`
	Element         string  `js:"element"`
	Carrier         int     `js:"carrier"`
	ElementCount    float64 `js:"elementCount"`
}

// bench converts a BenchTable read from JavaScript and checks its structure; field is its name
// in errors ("bench", "project.bench").
func (d benchDTO) bench(field string) (project.Bench, error) {
	if d.Carrier != math.Trunc(d.Carrier) || math.Abs(d.Carrier) > 1e9 {
		return project.Bench{}, &copoly.InputError{Field: field + ".carrier", Value: d.Carrier, Reason: "the monomer carrying the element must be 1 or 2 (0 = not chosen)", Err: copoly.ErrOutOfRange}
	}
	b := project.Bench{
		FeedKind: d.FeedKind, ConversionKind: d.ConversionKind, CompositionKind: d.CompositionKind,
		Element: d.Element, Carrier: int(d.Carrier), ElementCount: d.ElementCount,
		Rows: make([]project.BenchRow, len(d.Rows)),
	}
	for i, r := range d.Rows {
		b.Rows[i] = project.BenchRow{Label: r.Label, Cells: r.Cells}
	}
	return b, project.CheckBench(field, b)
}

// benchValue returns b as a BenchTable object: rows always a list, cells always an object with
// its keys in sorted order.
func benchValue(b project.Bench) js.Value {
	v := toJS(benchHeadOut{
		FeedKind: b.FeedKind, ConversionKind: b.ConversionKind, CompositionKind: b.CompositionKind,
		Element: b.Element, Carrier: b.Carrier, ElementCount: b.ElementCount,
	})
	rows := array.New()
	for i, r := range b.Rows {
		row := object.New()
		row.Set("label", r.Label)
		cells := object.New()
		for _, k := range slices.Sorted(maps.Keys(r.Cells)) {
			cells.Set(k, r.Cells[k])
		}
		row.Set("cells", cells)
		rows.SetIndex(i, row)
	}
	v.Set("rows", rows)
	return v
}

// projectIn is the argument of checkProject, exportProject and saveProject.
type projectIn struct {
	Project projectDTO `js:"project"`
}

type importIn struct {
	JSON string `js:"json" limit:"json"`
}

func (d projectDTO) project() (project.Project, error) {
	if d.Version != math.Trunc(d.Version) || math.Abs(d.Version) > 1e9 {
		return project.Project{}, &copoly.InputError{Field: "project.version", Value: d.Version, Reason: "must be a whole number", Err: copoly.ErrOutOfRange}
	}
	p := project.Project{
		Format:       d.Format,
		Version:      int(d.Version),
		Name:         d.Name,
		Monomer1:     project.Monomer{Name: d.Monomer1.Name, MolarMass: d.Monomer1.MolarMass},
		Monomer2:     project.Monomer{Name: d.Monomer2.Name, MolarMass: d.Monomer2.MolarMass},
		R1:           d.R1,
		R2:           d.R2,
		RatioSource:  d.RatioSource,
		F10:          d.F10,
		Conversion:   d.Conversion,
		Tolerance:    d.Tolerance,
		Notes:        d.Notes,
		Invented:     d.Invented,
		SavedAt:      d.SavedAt,
		Level:        d.Level,
		Triads:       triadRows(d.Triads),
		SizeBins:     sizeBins(d.SizeBins),
		UserMonomers: userMonomers(d.UserMonomers),
	}
	if m := d.Model; m != nil {
		p.Model = &project.Model{Kind: m.Kind, R11: m.R11, R21: m.R21, R22: m.R22, R12: m.R12, S1: m.S1, S2: m.S2}
	}
	if d.Bench != nil {
		b, err := d.Bench.bench("project.bench")
		if err != nil {
			return project.Project{}, err
		}
		p.Bench = &b
	}
	if len(d.JCR) > 0 {
		p.JCR = make([][2]float64, len(d.JCR))
		for i, pt := range d.JCR {
			p.JCR[i] = [2]float64{pt[0], pt[1]} // decode read each point as a pair
		}
	}
	if d.Plan != nil {
		pl, err := d.Plan.plan("project.plan")
		if err != nil {
			return project.Project{}, err
		}
		p.Plan = &pl
	}
	return p, p.Validate()
}

// projectValue returns p as a JS object; like the file format it leaves out invented when false,
// savedAt when empty, bench, model and plan when nil, level when 0, and jcr, triads, sizeBins
// and userMonomers when empty.
func projectValue(p project.Project) js.Value {
	var jcr [][]float64
	for _, pt := range p.JCR {
		jcr = append(jcr, []float64{pt[0], pt[1]})
	}
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
		Level:       p.Level,
		JCR:         jcr,
	}).JSValue()
	if !p.Invented {
		v.Delete("invented")
	}
	if p.SavedAt == "" {
		v.Delete("savedAt")
	}
	if p.Bench != nil {
		v.Set("bench", benchValue(*p.Bench))
	} else {
		v.Delete("bench")
	}
	if p.Level == 0 {
		v.Delete("level")
	}
	if len(jcr) == 0 {
		v.Delete("jcr")
	}
	if p.Model != nil {
		v.Set("model", modelValue(*p.Model))
	} else {
		v.Delete("model")
	}
	if len(p.Triads) > 0 {
		v.Set("triads", triadsValue(p.Triads))
	} else {
		v.Delete("triads")
	}
	if len(p.SizeBins) > 0 {
		v.Set("sizeBins", sizeBinsValue(p.SizeBins))
	} else {
		v.Delete("sizeBins")
	}
	if p.Plan != nil {
		v.Set("plan", planValue(*p.Plan))
	} else {
		v.Delete("plan")
	}
	if len(p.UserMonomers) > 0 {
		v.Set("userMonomers", toJS(userMonomersOut(p.UserMonomers)))
	} else {
		v.Delete("userMonomers")
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
			reason := "is missing"
			if fv.IsNull() {
				reason = "is missing (null)"
			}
			return js.Value{}, &copoly.FieldError{Field: field, Reason: reason, Err: errMissing}
		}
		cv, err := copyValue(fv, ft, field, limitOf(sf, "limit"), limitOf(sf, "each"), sf.Tag.Get("pair"))
		if err != nil {
			return js.Value{}, err
		}
		snap.Set(name, cv)
	}
	return snap, nil
}

// limits are the largest sizes of the inputs that carry a limit:"name" tag: entries of a list,
// keys of a map, or UTF-16 code units of a text (checked before the text is copied into Go).
var limits = map[string]int{
	"runs":      bench.MaxRuns,
	"rows":      project.MaxRows,
	"cells":     project.MaxCells,
	"jcr":       project.MaxJCRPoints,
	"timeTable": plan.MaxTimeRows,
	"text":      bench.MaxBlockBytes,

	"userMonomers": project.MaxUserMonomers,
	"hazards":      project.MaxHazards,

	"triads":   project.MaxTriadRows,      // = fit.MaxTriadRuns
	"sizeBins": project.MaxSizeBins,       // = molarmass.MaxAverageRows
	"word":     project.MaxPlanWordLength, // a one-word option such as "model"

	// Texts whose limit copoly counts in characters (runes) or UTF-8 bytes: the bridge counts
	// UTF-16 code units, of which a rune takes at most two and at most as many as its UTF-8
	// bytes, so these never refuse a text copoly would accept. copoly then applies its own
	// limit, with its own message.
	"name":   2 * project.MaxNameLength,
	"source": 2 * project.MaxSourceLength,
	"label":  2 * project.MaxLabelLength,
	"cell":   2 * project.MaxCellLength,
	"hazard": 2 * project.MaxHazardLength,
	"notes":  project.MaxNotesBytes,
	"stamp":  project.MaxSavedAtLength, // ASCII: units are characters
	"json":   project.MaxFileBytes,

	// Storage (storage.go): the name of a page or writer, of a kept copy, and the inputs of a draft.
	"id":          64, // project.CheckID's limit
	"keptName":    100,
	"draftFields": project.MaxDraftFields,
}

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
					return js.Value{}, &copoly.FieldError{Field: f, Reason: "must be a pair [" + pair + "] of two numbers", Err: errWrongType}
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
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: errWrongType}
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
		return js.Value{}, &copoly.FieldError{Field: field, Reason: "cannot be read: " + err.Error(), Err: errWrongType}
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
