package project

import (
	"bytes"
	"encoding/csv"
	"errors"
	"math"
	"os"
	"reflect"
	"strconv"
	"strings"
	"testing"

	"copoly/copoly"
	"copoly/copoly/bench"
)

// georgievPath is the reference the published examples must agree with: Table 1 of
// G. S. Georgiev, I. G. Dakova, S. J. Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995, A32(3),
// 497 (see testdata/README.md).
const georgievPath = "../../testdata/georgiev1995_table1.csv"

// TestExamplesMatchPublishedTable checks each published example against the reference file
// (row by row, naming file:line), the published ratios (Table 2 of the paper: acetone
// 0.42/0.51, isopropanol 0.33/0.18), the molar masses of the formulas, and its labels: valid,
// never marked invented, and citing the paper and its tables.
func TestExamplesMatchPublishedTable(t *testing.T) {
	b, err := os.ReadFile(georgievPath)
	if err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(bytes.NewReader(b))
	r.Comment = '#'
	if _, err := r.Read(); err != nil { // header: solvent,f1,F1,conversion_wt_pct
		t.Fatal(err)
	}
	type row struct {
		line  int
		cells []string
	}
	bySolvent := map[string][]row{}
	for {
		rec, err := r.Read()
		if err != nil {
			break
		}
		line, _ := r.FieldPos(0)
		bySolvent[rec[0]] = append(bySolvent[rec[0]], row{line, rec[1:]})
	}
	m1, _ := copoly.MolarMassOf("C9H10")
	m2, _ := copoly.MolarMassOf("C4H6O2")
	published := map[string][2]float64{ // Table 2 of the paper
		ExampleGeorgiev1995Acetone:     {0.42, 0.51},
		ExampleGeorgiev1995Isopropanol: {0.33, 0.18},
	}
	if names := ExampleNames(); !reflect.DeepEqual(names, []string{ExampleGeorgiev1995Acetone, ExampleGeorgiev1995Isopropanol}) {
		t.Errorf("ExampleNames() = %q", names)
	}
	for _, name := range ExampleNames() {
		p, err := Example(name)
		if err != nil {
			t.Fatalf("Example(%q) error %v", name, err)
		}
		if err := p.Validate(); err != nil {
			t.Errorf("Example(%q).Validate() = %v", name, err)
		}
		solvent := strings.TrimPrefix(name, "georgiev1995-")
		if p.Invented || strings.Contains(strings.ToLower(p.Name+p.Notes), "invented") && !strings.Contains(p.Notes, "not invented") {
			t.Errorf("Example(%q) is marked invented: %v, %q", name, p.Invented, p.Name)
		}
		for _, want := range []string{"Georgiev", "Dakova", "Simpson", "1995", "A32", "497", "10.1080/10601329508013679", "Table 1", "Table 2"} {
			if !strings.Contains(p.Citation, want) || !strings.Contains(p.Notes, want) {
				t.Errorf("Example(%q): citation %q or notes lack %q", name, p.Citation, want)
			}
		}
		if !strings.Contains(p.Name, "Published example") || !strings.Contains(p.Name, solvent) || !strings.Contains(p.Notes, "by weight") {
			t.Errorf("Example(%q): name %q does not say it is a published example in %s, or the notes do not say the conversion is by weight", name, p.Name, solvent)
		}
		// The literals in examples.go agree with the sums of atomic weights to rounding.
		if math.Abs(p.Monomer1.MolarMass-m1) > 1e-9 || math.Abs(p.Monomer2.MolarMass-m2) > 1e-9 {
			t.Errorf("Example(%q) molar masses %v, %v; MolarMassOf(C9H10, C4H6O2) = %v, %v", name, p.Monomer1.MolarMass, p.Monomer2.MolarMass, m1, m2)
		}
		if pub := published[name]; p.R1 != pub[0] || p.R2 != pub[1] {
			t.Errorf("Example(%q) ratios %v, %v; Table 2 %v, %v", name, p.R1, p.R2, pub[0], pub[1])
		}
		want := bySolvent[solvent]
		if p.Bench == nil || len(p.Bench.Rows) != len(want) || len(want) != 7 {
			t.Fatalf("Example(%q) bench %+v, want the 7 rows of %s in %s", name, p.Bench, solvent, georgievPath)
		}
		if p.Bench.ConversionKind != bench.ConversionMass {
			t.Errorf("Example(%q) conversion kind %q, want %q (Table 1 gives the conversion by weight)", name, p.Bench.ConversionKind, bench.ConversionMass)
		}
		for i, w := range want {
			c := p.Bench.Rows[i].Cells
			if c["f10"] != w.cells[0] || c["F1"] != w.cells[1] || c["conversion"] != w.cells[2]+" %" {
				t.Errorf("%s:%d: %s row %d is f10 %q, F1 %q, conversion %q; want %q, %q, %q %%",
					georgievPath, w.line, name, i+1, c["f10"], c["F1"], c["conversion"], w.cells[0], w.cells[1], w.cells[2])
			}
		}
		// The grid converts as the page converts it: the percent sign read, every row a run
		// with a molar conversion below the weight conversion's 10 % ceiling.
		runs, ok, errs, _ := p.Bench.Table().Runs(p.Monomer1.MolarMass, p.Monomer2.MolarMass)
		for i := range runs {
			w, _ := strconv.ParseFloat(want[i].cells[2], 64)
			if !ok[i] || !(runs[i].Conversion > 0.07 && runs[i].Conversion < 0.1) || runs[i].Conversion == w/100 {
				t.Errorf("%s:%d: %s row %d converts to %+v, %v (weight conversion %v %%)", georgievPath, want[i].line, name, i+1, runs[i], errs[i], w)
			}
		}
	}
}

func TestExampleFreshAndUnknown(t *testing.T) {
	a, _ := Example(ExampleGeorgiev1995Acetone)
	a.Bench.Rows[0].Cells["F1"] = "edited"
	b, _ := Example(ExampleGeorgiev1995Acetone)
	if b.Bench.Rows[0].Cells["F1"] == "edited" {
		t.Error("editing one Example() changed the next")
	}
	for _, name := range []string{"", "demo", "Georgiev1995-acetone", "georgiev1995"} {
		p, err := Example(name)
		if copoly.Field(err) != "name" || !errors.Is(err, ErrNotAllowed) || !reflect.DeepEqual(p, Project{}) {
			t.Errorf("Example(%q) = %v, %v; want an error for field name wrapping ErrNotAllowed", name, p.Name, err)
			continue
		}
		if !strings.Contains(err.Error(), ExampleGeorgiev1995Acetone) {
			t.Errorf("Example(%q) error %q does not list the examples", name, err)
		}
	}
}

// TestCitation covers the optional "citation" key: validated like the other texts, kept by a
// round trip through the file, and absent from files of projects without one (so files
// written before the key existed, like the minimal file of parse_test.go, read unchanged).
func TestCitation(t *testing.T) {
	for _, tt := range []struct {
		name     string
		citation string
		field    string
		err      error
	}{
		{"empty", "", "", nil},
		{"at limit", strings.Repeat("é", MaxSourceLength), "", nil},
		{"too long", strings.Repeat("x", MaxSourceLength+1), "project.citation", ErrTooLong},
		{"not UTF-8", "J. Polym. Sci. \xff", "project.citation", ErrWrongType},
	} {
		t.Run(tt.name, func(t *testing.T) {
			p := Demo()
			p.Citation = tt.citation
			wantValidate(t, p.Validate(), tt.field, tt.err)
		})
	}

	ex, _ := Example(ExampleGeorgiev1995Isopropanol)
	data, err := Marshal(ex)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(data, []byte(`"citation": "G. S. Georgiev`)) {
		t.Errorf("Marshal(example) does not write the citation:\n%s", data)
	}
	got, err := Parse(data)
	if err != nil || !reflect.DeepEqual(got, ex) {
		t.Errorf("Parse(Marshal(example)) = %+v, %v; want %+v", got, err, ex)
	}

	for _, p := range []Project{Demo(), mustParse(t, minimal)} {
		if p.Citation != "" {
			t.Errorf("%q has citation %q, want none", p.Name, p.Citation)
		}
		data, err := Marshal(p)
		if err != nil {
			t.Fatal(err)
		}
		if bytes.Contains(data, []byte(`"citation"`)) {
			t.Errorf("Marshal() of a project without a citation writes the key:\n%s", data)
		}
	}
	if _, err := Parse([]byte(strings.Replace(minimal, `"r1":0.5`, `"citation":7,"r1":0.5`, 1))); copoly.Field(err) != "project.citation" || !errors.Is(err, ErrWrongType) {
		t.Errorf(`Parse("citation": 7) error %v, want a wrong type for project.citation`, err)
	}
}

func mustParse(t *testing.T, s string) Project {
	t.Helper()
	p, err := Parse([]byte(s))
	if err != nil {
		t.Fatal(err)
	}
	return p
}
