//go:build js && wasm

package main

import (
	"fmt"
	"math"
	"reflect"
	"strings"
	"syscall/js"

	"copoly/copoly"
	"copoly/copoly/fit"
	"copoly/copoly/plan"
	"copoly/copoly/project"
)

// JS-facing data transfer objects. Each mirrors one argument or result of site/copoly.d.ts with
// plain js:"camelCase" tags and built-in kinds only (vert cannot convert named number types or
// fixed-size arrays). Inputs are read by decode: a field whose Go type is a pointer is optional
// (nil when absent), a field tagged copoly:"optional" may be absent and then keeps its zero
// value, every other field is required. A list, a text or a map may carry a limit:"nameLength" tag
// naming its largest size in limits; a list of numbers without one holds at most
// copoly.MaxPoints.

// modelIn is the ModelArgs of the d.ts: the model word and every ratio any model takes, each
// optional here; readModel checks that the chosen model has its own.
type modelIn struct {
	R1    *float64 `js:"r1"` // read first, as before there were other models
	R2    *float64 `js:"r2"`
	Model *string  `js:"model" limit:"wordLength"`
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
				return nil, &copoly.FieldError{Field: names[i], Reason: fmt.Sprintf("is missing: the %s model takes %s", kind, what), Err: copoly.ErrMissing}
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
	Basis      *string   `js:"basis" limit:"wordLength"`
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

// sizeBinDTO is one molar-mass class of averages' bins.
// A fraction left out is 0 (not given).
type sizeBinDTO struct {
	Low            float64 `js:"low"`
	High           float64 `js:"high"`
	NumberFraction float64 `js:"numberFraction" copoly:"optional"`
	WeightFraction float64 `js:"weightFraction" copoly:"optional"`
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
// (copoly.PropertiesOf) and Q–e values (copoly.QEOf; q and e null when it has none). Each
// …SourceId names an entry of libraryOut.Sources; tg is null when copoly gives none.
type monomerOut struct {
	Name            string   `js:"name"`
	Formula         string   `js:"formula"`
	MolarMass       float64  `js:"molarMass"`
	Source          string   `js:"source"`
	SourceID        string   `js:"sourceId"`
	State           string   `js:"state"`
	Density         float64  `js:"density"`
	DensityTemp     float64  `js:"densityTemp"`
	DensitySource   string   `js:"densitySource"`
	DensitySourceID string   `js:"densitySourceId"`
	Heat            float64  `js:"heat"`
	HeatSource      string   `js:"heatSource"`
	HeatSourceID    string   `js:"heatSourceId"`
	Q               *float64 `js:"q"`
	E               *float64 `js:"e"`
	QESource        string   `js:"qeSource"`
	QESourceID      string   `js:"qeSourceId"`
	Hazards         []string `js:"hazards"`
	HazardSource    string   `js:"hazardSource"`
	HazardSourceID  string   `js:"hazardSourceId"`
	Tg              *float64 `js:"tg"`
	TgSource        string   `js:"tgSource"`
	TgSourceID      string   `js:"tgSourceId"`
	TgNote          string   `js:"tgNote"`
	Hydroxyl        float64  `js:"hydroxyl"`
	Acid            float64  `js:"acid"`
	AcidTotal       float64  `js:"acidTotal"`
	GroupsSource    string   `js:"groupsSource"`
	GroupsSourceID  string   `js:"groupsSourceId"`
}

type pairOut struct {
	Monomer1    string  `js:"monomer1"`
	Monomer2    string  `js:"monomer2"`
	R1          float64 `js:"r1"`
	R2          float64 `js:"r2"`
	Temperature string  `js:"temperature"`
	Source      string  `js:"source"`
	SourceID    string  `js:"sourceId"`
}

// sourceOut is the LibrarySource of the d.ts (copoly.Source).
type sourceOut struct {
	ID       string `js:"id"`
	Short    string `js:"short"`
	Citation string `js:"citation"`
	Checked  bool   `js:"checked"`
	Note     string `js:"note"`
}

type libraryOut struct {
	Monomers []monomerOut `js:"monomers"`
	Pairs    []pairOut    `js:"pairs"`
	Sources  []sourceOut  `js:"sources"`
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

// benchRunsIn is the argument of benchRuns without its bench (readBench).
type benchRunsIn struct {
	MolarMass1 *float64 `js:"molarMass1"`
	MolarMass2 *float64 `js:"molarMass2"`
}

type runWarningOut struct {
	Row     int    `js:"row"`
	Field   string `js:"field"`
	Message string `js:"message"`
	Code    string `js:"code"`
}

// pasteBenchIn is the argument of pasteBench without its bench (readBench).
type pasteBenchIn struct {
	Text string `js:"text" limit:"pasteBytes"`
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
	Code    string `js:"code"`
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
	Monomer1 string `js:"monomer1" limit:"nameLength"`
	Monomer2 string `js:"monomer2" limit:"nameLength"`
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
	Mode            string      `js:"mode" limit:"wordLength"`
	Monomer1        *string     `js:"monomer1" limit:"nameLength"`
	Monomer2        *string     `js:"monomer2" limit:"nameLength"`
	Tolerance       *float64    `js:"tolerance"`
	StopConversion  *float64    `js:"stopConversion"`
	FinalConversion *float64    `js:"finalConversion"`
	Feed            *string     `js:"feed" limit:"wordLength"`
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

// parseNumberIn is the argument of parseNumber: the text of a number and the field to name in an
// error.
type parseNumberIn struct {
	Text  string  `js:"text" limit:"cellLength"`
	Field *string `js:"field" limit:"cellLength"`
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

// orText returns *v, or def (or "") when v is nil (absent).
func orText(v *string, def ...string) string {
	if v == nil {
		if len(def) > 0 {
			return def[0]
		}
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

// exampleIn names a published example project (project.ExampleNames).
type exampleIn struct {
	Name string `js:"name" limit:"wordLength"`
}

// importIn is the argument of importProject: the text of a project file.
type importIn struct {
	JSON string `js:"json" limit:"fileBytes"`
}
