// Command sidebyside prints two runs of Go benchmarks next to each other: the same benchmarks
// run natively and as js/wasm under Node, with the ratio wasm/native of the times per operation.
// site/bench.sh runs it:
//
//	go run ./site/bench/sidebyside native.txt wasm.txt
//
// Each file is the output of `go test -run '^$' -bench . -benchmem`. A benchmark is named by
// its package and its name without the -GOMAXPROCS suffix (js/wasm prints none). When a
// benchmark appears several times (-count), the median is used. A benchmark in only one file
// is listed with "-" for the other. The program never judges the figures; it exits 1 only when
// it cannot read a file.
package main

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"regexp"
	"slices"
	"strconv"
	"strings"
)

// result is the figures of one benchmark line; a negative value means "not reported".
type result struct {
	nsPerOp, bytesPerOp, allocsPerOp float64
}

// run is one file: results by key, and the keys in order of first appearance.
type run struct {
	order   []string
	results map[string][]result
}

// procSuffix is the -GOMAXPROCS suffix that go test appends to benchmark names.
var procSuffix = regexp.MustCompile(`-\d+$`)

func main() {
	if len(os.Args) != 3 {
		fmt.Fprintln(os.Stderr, "usage: sidebyside native.txt wasm.txt")
		os.Exit(2)
	}
	native, err := readFile(os.Args[1])
	if err != nil {
		fmt.Fprintln(os.Stderr, "sidebyside:", err)
		os.Exit(1)
	}
	wasm, err := readFile(os.Args[2])
	if err != nil {
		fmt.Fprintln(os.Stderr, "sidebyside:", err)
		os.Exit(1)
	}
	write(os.Stdout, native, wasm)
}

func readFile(name string) (*run, error) {
	f, err := os.Open(name)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	r, err := parse(f)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	return r, nil
}

// parse reads `go test -bench` output: "pkg: P" lines set the package of the lines after them,
// and "BenchmarkName[-N] iterations value unit [value unit]..." lines are results.
func parse(in io.Reader) (*run, error) {
	r := &run{results: map[string][]result{}}
	pkg := ""
	sc := bufio.NewScanner(in)
	for sc.Scan() {
		line := sc.Text()
		if p, ok := strings.CutPrefix(line, "pkg: "); ok {
			pkg = strings.TrimSpace(p)
			continue
		}
		fields := strings.Fields(line)
		if len(fields) < 4 || !strings.HasPrefix(fields[0], "Benchmark") {
			continue
		}
		if _, err := strconv.ParseInt(fields[1], 10, 64); err != nil {
			continue // a log line that starts with a benchmark's name
		}
		res := result{-1, -1, -1}
		for i := 2; i+1 < len(fields); i += 2 {
			v, err := strconv.ParseFloat(fields[i], 64)
			if err != nil {
				continue
			}
			switch fields[i+1] {
			case "ns/op":
				res.nsPerOp = v
			case "B/op":
				res.bytesPerOp = v
			case "allocs/op":
				res.allocsPerOp = v
			}
		}
		if res.nsPerOp < 0 {
			continue
		}
		key := pkg + "\t" + strings.TrimPrefix(procSuffix.ReplaceAllString(fields[0], ""), "Benchmark")
		if _, seen := r.results[key]; !seen {
			r.order = append(r.order, key)
		}
		r.results[key] = append(r.results[key], res)
	}
	return r, sc.Err()
}

// median returns the median of one figure over repeated runs, or -1 if none reported it.
func median(rs []result, f func(result) float64) float64 {
	var xs []float64
	for _, r := range rs {
		if v := f(r); v >= 0 {
			xs = append(xs, v)
		}
	}
	if len(xs) == 0 {
		return -1
	}
	slices.Sort(xs)
	m := len(xs) / 2
	if len(xs)%2 == 1 {
		return xs[m]
	}
	return (xs[m-1] + xs[m]) / 2
}

func write(w io.Writer, native, wasm *run) {
	keys := slices.Clone(native.order)
	for _, k := range wasm.order {
		if !slices.Contains(keys, k) {
			keys = append(keys, k)
		}
	}
	if len(keys) == 0 {
		fmt.Fprintln(w, "no benchmark results in either run")
		return
	}
	ns := func(r result) float64 { return r.nsPerOp }
	bytes := func(r result) float64 { return r.bytesPerOp }
	allocs := func(r result) float64 { return r.allocsPerOp }
	pkg := ""
	var ratios []float64
	for _, k := range keys {
		p, name, _ := strings.Cut(k, "\t")
		if p != pkg {
			pkg = p
			fmt.Fprintf(w, "\npackage %s\n", pkg)
			fmt.Fprintf(w, "%-34s %14s %14s %12s %16s %16s\n", "benchmark", "native ns/op", "wasm ns/op", "wasm/native", "native B, allocs", "wasm B, allocs")
		}
		n, m := native.results[k], wasm.results[k]
		nn, wn := median(n, ns), median(m, ns)
		ratio := "-"
		if nn > 0 && wn > 0 {
			ratios = append(ratios, wn/nn)
			ratio = fmt.Sprintf("%.2fx", wn/nn)
		}
		fmt.Fprintf(w, "%-34s %14s %14s %12s %16s %16s\n", name, num(nn), num(wn), ratio,
			num(median(n, bytes))+", "+num(median(n, allocs)), num(median(m, bytes))+", "+num(median(m, allocs)))
	}
	if len(ratios) > 0 {
		slices.Sort(ratios)
		fmt.Fprintf(w, "\nwasm/native over %d benchmarks: median %.2fx, range %.2fx to %.2fx\n",
			len(ratios), ratios[len(ratios)/2], ratios[0], ratios[len(ratios)-1])
	}
	writeBudgets(w, native, wasm)
}

// budget is a speed target of the project: a set of benchmarks (matched by name prefix,
// summed) whose js/wasm time must stay under a limit, or whose wasm/native ratio must.
type budget struct {
	what     string
	prefixes []string
	maxMs    float64 // limit on the summed js/wasm time per operation, 0 for none
	maxRatio float64 // limit on wasm/native of each benchmark matched, 0 for none
}

// budgets are the targets set in the project's issues.
var budgets = []budget{
	{"composition, drift and sequences: wasm within 3x of native", []string{"Composition", "Drift", "Sequence", "ConversionLimit", "CompositionDistribution"}, 0, 3},
	{"full fit of 20 runs with every method and a 95 % JCR: under 50 ms in js/wasm", []string{"Estimate/20-runs"}, 50, 0},
	{"semi-batch plan of 200 steps with a 500-sample band: under 100 ms in js/wasm", []string{"Plan/semibatch-200-steps", "Plan/band-500-samples"}, 100, 0},
	{"10^6 monomer additions of Monte Carlo growth: under 100 ms in js/wasm", []string{"Chains/1e6-units"}, 100, 0},
	{"full recompute after an edit (20 runs: fits, JCR, drift, plan + band, 10^4 chains): under 100 ms in js/wasm", []string{"Recompute/edit-20-runs"}, 100, 0},
	{"multiComposition, 10^4 feeds of 6 monomers: under 20 ms in js/wasm", []string{"MultiComposition/10000-feeds-6-monomers"}, 20, 0},
	{"multiDrift, 4 monomers to X = 0.99 with 200 points: under 10 ms in js/wasm", []string{"MultiDrift/4-monomers-200-points"}, 10, 0},
	{"multiChains, 10^6 units of 4 monomers: under 100 ms in js/wasm", []string{"MultiChains/1e6-units"}, 100, 0},
}

func writeBudgets(w io.Writer, native, wasm *run) {
	ns := func(r result) float64 { return r.nsPerOp }
	fmt.Fprintln(w, "\nspeed budgets:")
	for _, b := range budgets {
		var sum float64
		var worst float64
		found, exact := 0, true
		for _, k := range wasm.order {
			_, name, _ := strings.Cut(k, "\t")
			match := false
			for _, p := range b.prefixes {
				if name == p || strings.HasPrefix(name, p+"/") {
					match = true
				}
			}
			if !match {
				continue
			}
			found++
			wn := median(wasm.results[k], ns)
			sum += wn
			if nn := median(native.results[k], ns); nn > 0 && wn > 0 {
				worst = max(worst, wn/nn)
			} else {
				exact = false
			}
		}
		verdict := "not measured"
		switch {
		case found == 0:
		case b.maxMs > 0:
			ms := sum / 1e6
			verdict = fmt.Sprintf("%.1f ms in js/wasm: ", ms)
			if ms <= b.maxMs {
				verdict += "HOLDS"
			} else {
				verdict += "EXCEEDED"
			}
		case b.maxRatio > 0 && exact:
			verdict = fmt.Sprintf("worst ratio %.2fx: ", worst)
			if worst <= b.maxRatio {
				verdict += "HOLDS"
			} else {
				verdict += "EXCEEDED"
			}
		}
		fmt.Fprintf(w, "  %-80s %s\n", b.what, verdict)
	}
}

// num formats a figure, or "-" when it was not reported: whole numbers from 1000 up, else four
// significant digits.
func num(v float64) string {
	switch {
	case v < 0:
		return "-"
	case v >= 1000:
		return strconv.FormatFloat(v, 'f', 0, 64)
	}
	return strconv.FormatFloat(v, 'g', 4, 64)
}
