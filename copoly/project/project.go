// Package project reads, checks, writes and stores copoly project files.
//
// A project is the set of inputs behind one copolymerization study: the two monomers, the
// reactivity ratios and where they come from, the initial feed, the last conversion and the
// composition tolerance of the drift view, and free-text notes. It is what the page saves in
// browser storage and what a user exports to or imports from a file.
//
// # File format
//
// A project file is one JSON object in copoly's own schema, written by [Marshal] and read by
// [Parse]:
//
//	{
//	  "format": "copoly-project",
//	  "version": 1,
//	  "name": "…",
//	  "monomer1": {"name": "…", "molarMass": 104.15},
//	  "monomer2": {"name": "…", "molarMass": 0},
//	  "r1": 0.8, "r2": 0.15,
//	  "ratioSource": "…",
//	  "f10": 0.5, "conversion": 0.95, "tolerance": 0.02,
//	  "notes": "…",
//	  "invented": true,
//	  "citation": "…",
//	  "savedAt": "2026-01-02T03:04:05Z",
//	  "bench": {
//	    "feedKind": "fraction", "conversionKind": "molar", "compositionKind": "fraction",
//	    "element": "", "carrier": 0, "elementCount": 0,
//	    "rows": [{"label": "…", "cells": {"f10": "0.100", "conversion": "0,04", "F1": "0.295"}}]
//	  },
//	  "level": 0.95,
//	  "jcr": [[0.71, 0.15], [0.80, 0.14], …],
//	  "model": {"kind": "penultimate", "r11": 0.9, "r21": 0.6, "r22": 0.2, "r12": 0.1},
//	  "triads": [{"f10": 0.3, "F1": 0.41, "A111": 0.12, "A112": 0.45, "A212": 0.43}, …],
//	  "sizeBins": [{"low": 10000, "high": 20000, "weightFraction": 0.25}, …],
//	  "plan": {"mode": "semibatch", "targetF1": 0.5, "polymerMass": 1000, "rateConstant": 0.01},
//	  "userMonomers": [{"name": "…", "molarMass": 198.22, "density": 1.05, "densityTemp": 20,
//	    "state": "liquid", "heat": 0, "q": 0, "e": 0, "hazards": ["irritant"], "note": "…"}]
//	}
//
// "format" must be "copoly-project". "version" is [Version]; a file with a larger version was
// made by a newer copoly and is refused with an error that says so, rather than read wrongly.
// "invented", "citation", "savedAt", "bench", "level", "jcr", "model", "triads", "sizeBins",
// "plan" and "userMonomers" are optional and left out when empty, so a file without them
// (written before they existed) still reads. "citation" is the full citation of the published
// data a project holds (the published examples, [Example]); "bench" is the bench-data grid as
// typed ([Bench]); "level" the
// confidence level of the joint region of a fit (0 or absent means 0.95); "jcr" the joint
// confidence region of the ratios in use when they came from a fit, as (r1, r2) points; "model"
// the copolymerization model of the sequences panel ([Model]), each ratio left out when not
// typed; "triads" the measured triad fractions as entered ([TriadRow]), a measurement left out
// (or -1) when not made; "sizeBins" the molar-mass classes of the chain-size panel ([SizeBin]);
// "plan" the inputs of the feed-planning panel ([Plan]), each key left out when not given;
// "userMonomers" the monomers the user added to the library ([UserMonomer]), each with its
// process data. The same object, with the same keys, is the Project of the JavaScript API
// (site/copoly.d.ts).
//
// # Errors
//
// Every error about the content of a project is a [copoly.InputError] or [copoly.FieldError]
// whose field starts with "project." ("project.r1", "project.monomer1.molarMass"), or is
// "project" for the file as a whole, so that [copoly.Field] tells the page what to highlight.
//
// # Storage
//
// [Store] keeps the current project and the previous good copy in any [hackpadfs.FS]: the
// page uses IndexedDB, the tests an in-memory file system.
package project

import (
	"fmt"
	"math"
	"time"
	"unicode/utf8"

	"copoly/copoly"
	"copoly/copoly/bench"
	"copoly/copoly/plan"
)

// Format is the value of the "format" key of every project file.
const Format = "copoly-project"

// Version is the schema version this package writes and the newest it reads.
const Version = 1

// Limits on the text fields of a project. They keep a project file small enough to store and
// to read back quickly; they are a design choice of copoly.
const (
	MaxNameLength   = 200     // characters in the project name and in each monomer name
	MaxSourceLength = 1000    // characters in RatioSource and in Citation
	MaxNotesBytes   = 100_000 // bytes (UTF-8) in Notes
	// MaxSavedAtLength bounds SavedAt: RFC 3339 with nanoseconds and an offset takes 35
	// characters, but time.Parse takes any number of digits of a second.
	MaxSavedAtLength = 64
)

// Sentinel errors wrapped by the errors of this package; test for them with errors.Is.
var (
	// ErrNotProject reports data that is not a copoly project file at all.
	ErrNotProject = copoly.NewSentinel(copoly.CodeNotAProject, "project: not a copoly project file")
	// ErrNewerVersion reports a project file written by a newer copoly.
	ErrNewerVersion = copoly.NewSentinel(copoly.CodeNewerVersion, "project: made by a newer copoly")
	// ErrMissing reports a required key that is absent or null; it is copoly.ErrMissing.
	ErrMissing = copoly.ErrMissing
	// ErrWrongType reports a value of the wrong JSON type, such as text where a number belongs;
	// it is copoly.ErrWrongType.
	ErrWrongType = copoly.ErrWrongType
	// ErrTooLong reports a text field above its length limit; it is copoly.ErrTooLong.
	ErrTooLong = copoly.ErrTooLong
	// ErrDamaged reports stored projects that can no longer be read.
	ErrDamaged = copoly.NewSentinel(copoly.CodeDamaged, "project: stored project damaged")
)

// Monomer names one monomer of a project.
type Monomer struct {
	// Name is free text, at most MaxNameLength characters.
	Name string `json:"name"`
	// MolarMass is in g/mol; 0 means not given. When given it must pass copoly.CheckMolarMass.
	MolarMass float64 `json:"molarMass"`
}

// Project is one copolymerization study as saved and exported. Its JSON form is the project
// file format described in the package documentation.
type Project struct {
	Format   string  `json:"format"`  // always Format
	Version  int     `json:"version"` // always Version when written by this package
	Name     string  `json:"name"`
	Monomer1 Monomer `json:"monomer1" project:"required"`
	Monomer2 Monomer `json:"monomer2" project:"required"`
	// R1 and R2 are the terminal-model reactivity ratios, r1 = k11/k12 and r2 = k22/k21.
	R1 float64 `json:"r1" project:"required"`
	R2 float64 `json:"r2" project:"required"`
	// RatioSource says where R1 and R2 come from (free text).
	RatioSource string `json:"ratioSource"`
	// F10 is the initial mole fraction of monomer 1 in the feed, 0 < F10 < 1.
	F10 float64 `json:"f10" project:"required"`
	// Conversion is the last overall molar conversion of the drift view, 0 < Conversion ≤ 1.
	Conversion float64 `json:"conversion" project:"required"`
	// Tolerance is the ± tolerance on the cumulative copolymer composition (mole fraction) that
	// sets the conversion limit, 0 < Tolerance ≤ 0.5.
	Tolerance float64 `json:"tolerance" project:"required"`
	Notes     string  `json:"notes"`
	// Invented is true for the built-in demo scenario, whose lab and runs do not exist.
	Invented bool `json:"invented,omitempty"`
	// Citation is the full bibliographic citation of the published data the project holds (a
	// published example, see Example), so that the page, the exported file and the printed
	// report say where they come from; "" for other projects. At most MaxSourceLength
	// characters.
	Citation string `json:"citation,omitempty"`
	// SavedAt is the time of the last save in RFC 3339 form, set by Store.Save; "" if never saved.
	SavedAt string `json:"savedAt,omitempty"`
	// Bench is the bench-data grid as typed, or nil when there is none.
	Bench *Bench `json:"bench,omitempty"`
	// Level is the confidence level of the joint confidence region of a fit, in (0, 1); 0 means
	// the default 0.95.
	Level float64 `json:"level,omitempty"`
	// JCR is the joint confidence region of R1 and R2 as a closed polygon of (r1, r2) points,
	// when the ratios in use came from a fit; at most MaxJCRPoints points, each finite and ≥ 0.
	JCR [][2]float64 `json:"jcr,omitempty" pair:"r1, r2"`
	// Model is the model of the sequences panel, or nil when none was chosen.
	Model *Model `json:"model,omitempty"`
	// Triads are the measured triad fractions as entered, at most MaxTriadRows rows, or nil
	// when there are none.
	Triads []TriadRow `json:"triads,omitempty"`
	// SizeBins are the molar-mass classes of the chain-size panel as entered, at most
	// MaxSizeBins rows, or nil when there are none.
	SizeBins []SizeBin `json:"sizeBins,omitempty"`
	// Plan holds the inputs of the feed-planning panel as the user left them, or nil when there
	// are none.
	Plan *Plan `json:"plan,omitempty"`
	// UserMonomers are the monomers the user added to the library, at most MaxUserMonomers, or
	// nil when there are none.
	UserMonomers []UserMonomer `json:"userMonomers,omitempty"`
}

// Validate reports the first invalid value of p as a *copoly.InputError or *copoly.FieldError
// whose field is the project key prefixed with "project.", or nil when p is a valid project.
func (p Project) Validate() error {
	if p.Format != Format {
		return &copoly.FieldError{Field: "project.format", Reason: fmt.Sprintf("is %q, not %q: not a copoly project", p.Format, Format), Err: ErrNotProject}
	}
	if err := checkVersion(float64(p.Version)); err != nil {
		return err
	}
	if err := checkText("project.name", p.Name, MaxNameLength); err != nil {
		return err
	}
	for _, m := range []struct {
		field string
		m     Monomer
	}{{"project.monomer1", p.Monomer1}, {"project.monomer2", p.Monomer2}} {
		if err := checkText(m.field+".name", m.m.Name, MaxNameLength); err != nil {
			return err
		}
		// 0 means "not given"; anything else must be a real molar mass.
		if m.m.MolarMass != 0 {
			if err := copoly.CheckMolarMass(m.field+".molarMass", m.m.MolarMass); err != nil {
				return err
			}
		}
	}
	if err := copoly.CheckRatio("project.r1", p.R1); err != nil {
		return err
	}
	if err := copoly.CheckRatio("project.r2", p.R2); err != nil {
		return err
	}
	if err := checkText("project.ratioSource", p.RatioSource, MaxSourceLength); err != nil {
		return err
	}
	if err := checkText("project.citation", p.Citation, MaxSourceLength); err != nil {
		return err
	}
	if err := copoly.CheckFraction("project.f10", p.F10); err != nil {
		return err
	}
	if p.F10 == 0 || p.F10 == 1 {
		return &copoly.InputError{Field: "project.f10", Value: p.F10, Reason: "the initial feed must hold both monomers (0 < f10 < 1)", Err: copoly.ErrOutOfRange}
	}
	if err := copoly.CheckConversion("project.conversion", p.Conversion); err != nil {
		return err
	}
	if p.Conversion == 0 {
		return &copoly.InputError{Field: "project.conversion", Value: p.Conversion, Reason: "the last conversion must be above 0", Err: copoly.ErrOutOfRange}
	}
	if math.IsNaN(p.Tolerance) || math.IsInf(p.Tolerance, 0) {
		return &copoly.InputError{Field: "project.tolerance", Value: p.Tolerance, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
	}
	if p.Tolerance <= 0 || p.Tolerance > 0.5 {
		return &copoly.InputError{Field: "project.tolerance", Value: p.Tolerance, Reason: "the composition tolerance must lie above 0 and at most 0.5", Err: copoly.ErrOutOfRange}
	}
	if len(p.Notes) > MaxNotesBytes {
		return &copoly.FieldError{Field: "project.notes", Reason: fmt.Sprintf("the notes take %d bytes; the limit is %d", len(p.Notes), MaxNotesBytes), Err: ErrTooLong}
	}
	if err := checkUTF8("project.notes", p.Notes); err != nil {
		return err
	}
	if p.SavedAt != "" {
		if err := checkText("project.savedAt", p.SavedAt, MaxSavedAtLength); err != nil {
			return err
		}
		if _, err := time.Parse(time.RFC3339, p.SavedAt); err != nil {
			return &copoly.FieldError{Field: "project.savedAt", Reason: fmt.Sprintf("%q is not a date and time in RFC 3339 form", p.SavedAt), Err: ErrWrongType}
		}
	}
	if p.Bench != nil {
		if err := CheckBench("project.bench", *p.Bench); err != nil {
			return err
		}
	}
	if math.IsNaN(p.Level) || math.IsInf(p.Level, 0) {
		return &copoly.InputError{Field: "project.level", Value: p.Level, Reason: "must be a finite number", Err: copoly.ErrNotFinite}
	}
	if p.Level != 0 && !(p.Level > 0 && p.Level < 1) {
		return &copoly.InputError{Field: "project.level", Value: p.Level, Reason: "the confidence level must lie between 0 and 1, e.g. 0.95 (0 = the default 0.95)", Err: copoly.ErrOutOfRange}
	}
	if err := checkJCR("project.jcr", p.JCR); err != nil {
		return err
	}
	if p.Model != nil {
		if err := CheckModel("project.model", *p.Model); err != nil {
			return err
		}
	}
	if err := CheckTriads("project.triads", p.Triads); err != nil {
		return err
	}
	if err := checkSizeBins("project.sizeBins", p.SizeBins); err != nil {
		return err
	}
	if p.Plan != nil {
		if err := CheckPlan("project.plan", *p.Plan); err != nil {
			return err
		}
	}
	return checkUserMonomers("project.userMonomers", p.UserMonomers)
}

// checkVersion accepts only Version, and says so plainly when v comes from a newer copoly.
func checkVersion(v float64) error {
	switch {
	case v == Version:
		return nil
	case v > Version:
		return &copoly.InputError{Field: "project.version", Value: v, Reason: fmt.Sprintf("this project was made by a newer copoly; this copoly reads version %d and older", Version), Err: ErrNewerVersion}
	default:
		return &copoly.InputError{Field: "project.version", Value: v, Reason: fmt.Sprintf("unknown project version; this copoly reads version %d", Version), Err: ErrNotProject}
	}
}

// checkText reports a text longer than max characters, or one that is not valid UTF-8.
func checkText(field, s string, max int) error {
	if n := utf8.RuneCountInString(s); n > max {
		return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("is %d characters long; the limit is %d", n, max), Err: ErrTooLong}
	}
	return checkUTF8(field, s)
}

// checkUTF8 reports a text that is not valid UTF-8. JSON cannot carry such bytes (Marshal would
// write U+FFFD in their place), so a project holding them would not read back as it was
// saved; JavaScript text and Parse never produce them, only a Go caller can.
func checkUTF8(field, s string) error {
	if utf8.ValidString(s) {
		return nil
	}
	at := 0
	for at < len(s) {
		r, size := utf8.DecodeRuneInString(s[at:])
		if r == utf8.RuneError && size == 1 {
			break
		}
		at += size
	}
	return &copoly.FieldError{Field: field, Reason: fmt.Sprintf("is not valid UTF-8 text (byte %d is 0x%02x)", at, s[at]), Err: ErrWrongType}
}

// Demo returns the built-in demo project. Its lab, trial and runs are invented; Invented is
// true and the name, notes and run labels say so. The molar masses are those of styrene (C8H8)
// and n-butyl acrylate (C7H12O2) from standard atomic weights.
func Demo() Project {
	bench := demoBench()
	return Project{
		Format:      Format,
		Version:     Version,
		Name:        "Demo (invented): Harbour Lane pilot lab — styrene/n-butyl acrylate binder trial",
		Monomer1:    Monomer{Name: "styrene", MolarMass: 104.15},
		Monomer2:    Monomer{Name: "n-butyl acrylate", MolarMass: 128.17},
		R1:          0.80,
		R2:          0.15,
		RatioSource: "Handbook table value 0.80/0.15 (Polymer Handbook 4th ed., Greenley table), demo only",
		F10:         0.5,
		Conversion:  0.95,
		Tolerance:   0.02,
		Notes: "Invented demo scenario. Harbour Lane pilot lab, its binder trial and its runs do not exist; " +
			"nothing here is a measurement. Replace the reactivity ratios with values you have checked " +
			"for your own conditions before relying on any result.\n\n" +
			"Bench data: the eight runs HL-01 to HL-08 are invented runs, made up for this demo to look " +
			"like low- and moderate-conversion samples of this pair; they were never measured.\n\n" +
			"Safety: styrene and n-butyl acrylate are flammable and harmful; bulk and solution " +
			"copolymerizations can run away. Follow your local codes, safety data sheets and licensed practice.",
		Invented: true,
		Bench:    &bench,
		// The sequences panel starts on the terminal model with the ratios above.
		Model: &Model{Kind: ModelTerminal},
		// Invented demo settings for the planning panel, not a recipe anyone has run: a
		// semi-batch making 1 kg of a 50:50 (mol) copolymer, an assumed first-order rate
		// constant, and an assumed 2.5 kg reactor charge for the adiabatic-rise check.
		Plan: &Plan{
			Mode:         plan.ModeSemibatch,
			TargetF1:     0.5,
			PolymerMass:  1000,
			Tolerance:    0.02,
			RateConstant: 0.01,
			BatchMass:    2500,
			HeatCapacity: 2.0,
			RiseLimit:    50,
		},
	}
}

// demoBench returns the bench grid of the demo project. The runs are INVENTED for the demo,
// not measurements: cumulative compositions of the terminal model with r1 = 0.80, r2 = 0.15
// (copoly.Terminal.Cumulative) at the feeds and conversions below, plus seeded Gaussian
// scatter of standard deviation 0.008, rounded to three decimals. Every run states sF = 0.010
// so that the weighted fit runs.
func demoBench() Bench {
	rows := []struct{ label, f10, x, F1 string }{
		{"HL-01 (invented)", "0.100", "0.040", "0.295"},
		{"HL-02 (invented)", "0.200", "0.120", "0.418"},
		{"HL-03 (invented)", "0.300", "0.060", "0.499"},
		{"HL-04 (invented)", "0.400", "0.250", "0.529"},
		{"HL-05 (invented)", "0.500", "0.050", "0.613"},
		{"HL-06 (invented)", "0.600", "0.320", "0.663"},
		{"HL-07 (invented)", "0.700", "0.180", "0.720"},
		{"HL-08 (invented)", "0.850", "0.080", "0.841"},
	}
	b := Bench{
		FeedKind:        bench.FeedFraction,
		ConversionKind:  bench.ConversionMolar,
		CompositionKind: bench.CompositionFraction,
		Rows:            make([]BenchRow, len(rows)),
	}
	for i, r := range rows {
		b.Rows[i] = BenchRow{Label: r.label, Cells: map[string]string{
			bench.ColF10: r.f10, bench.ColConversion: r.x, bench.ColF1: r.F1, bench.ColSF: "0.010",
		}}
	}
	return b
}
