package plan

import (
	"fmt"
	"math"
	"math/rand/v2"

	"copoly/copoly"
)

// additions are a plan's schedule as the chemist carries it out: per row, the polymer formed
// (mol of units) and the moles of M1 and M2 added over it.
type additions struct{ dn, add1, add2 []float64 }

func (in *Input) additions(p *Recipe) additions {
	n := len(p.Schedule)
	ad := additions{make([]float64, n), make([]float64, n), make([]float64, n)}
	for i := 1; i < n; i++ {
		a, b := p.Schedule[i-1], p.Schedule[i]
		ad.add1[i] = (b.Fed1 - a.Fed1) / in.MolarMass1
		ad.add2[i] = (b.Fed2 - a.Fed2) / in.MolarMass2
		// Polymer formed over the row, in mol of units, from the planned mass and cumulative
		// composition.
		ad.dn[i] = b.Polymer/in.unitMass(b.Cum) - a.Polymer/in.unitMass(a.Cum)
	}
	return ad
}

// simulate runs the plan's schedule of charges and additions in a reactor whose monomers follow
// the terminal model m, which may differ from the model the plan was made with. The additions are
// tied to the polymer formed, as a chemist following the schedule by measured conversion would
// add them: over each row the metered amounts enter in proportion to the polymer formed, a row
// without polymer formed is a shot. The reactor balances per mole of polymer formed,
//
//	dN1/dn = a1 − F1(f1),  dN2/dn = a2 − (1 − F1(f1)),  f1 = N1/(N1 + N2)
//
// are integrated by the classical fourth-order Runge–Kutta method, sub steps per row. It
// returns the instantaneous and cumulative composition at the end of each row.
func (in *Input) simulate(p *Recipe, ad additions, m copoly.Terminal, sub int) (inst, cum []float64) {
	n1, n2 := p.Moles1, p.Moles2
	inst = make([]float64, len(p.Schedule))
	cum = make([]float64, len(p.Schedule))
	var poly1, polyN float64
	f := func(n1, n2 float64) float64 {
		t := n1 + n2
		if t <= 0 {
			return in.TargetF1
		}
		x := n1 / t
		if x < 0 {
			x = 0
		} else if x > 1 {
			x = 1
		}
		return m.Instantaneous(x)
	}
	inst[0] = f(n1, n2)
	cum[0] = inst[0]
	for i := 1; i < len(p.Schedule); i++ {
		dn := ad.dn[i]
		if dn <= 0 {
			n1 += ad.add1[i]
			n2 += ad.add2[i]
			inst[i], cum[i] = f(n1, n2), cum[i-1]
			continue
		}
		r1, r2 := ad.add1[i]/dn, ad.add2[i]/dn
		h := dn / float64(sub)
		for range sub {
			F1 := f(n1, n2)
			k1a, k1b := r1-F1, r2-(1-F1)
			F2 := f(n1+h/2*k1a, n2+h/2*k1b)
			k2a, k2b := r1-F2, r2-(1-F2)
			F3 := f(n1+h/2*k2a, n2+h/2*k2b)
			k3a, k3b := r1-F3, r2-(1-F3)
			F4 := f(n1+h*k3a, n2+h*k3b)
			k4a, k4b := r1-F4, r2-(1-F4)
			d1 := h / 6 * (k1a + 2*k2a + 2*k3a + k4a)
			d2 := h / 6 * (k1b + 2*k2b + 2*k3b + k4b)
			// Polymer of M1 formed = added − change of the unreacted M1.
			poly1 += r1*h - d1
			polyN += h
			n1, n2 = n1+d1, n2+d2
			if n1 < 0 {
				n1 = 0
			}
			if n2 < 0 {
				n2 = 0
			}
		}
		inst[i] = f(n1, n2)
		cum[i] = poly1 / polyN
	}
	return inst, cum
}

// Band is the spread of a plan's outcome over the reactivity ratios allowed by their joint
// confidence region.
type Band struct {
	// Samples is the number of (r1, r2) pairs drawn inside the region.
	Samples int
	// InstLow … CumHigh are the 2.5 % and 97.5 % quantiles over the samples of the instantaneous
	// and cumulative copolymer composition at each schedule row.
	InstLow, InstHigh, CumLow, CumHigh []float64
	// ProductLow and ProductHigh bound the composition of the whole product (the last row).
	ProductLow, ProductHigh float64
}

// Limits of [BandOf]. Each sample replays the whole schedule, so the work grows as samples
// times schedule rows: MaxBandWork allows the most samples with the default 200 steps, or the
// default 500 samples with the most steps, but not both (a minute and more in the browser).
const (
	// MaxRegionPoints bounds the polygon of the region.
	MaxRegionPoints = 4096
	MaxBandSamples  = 5000
	MaxBandWork     = 2_000_000 // samples × schedule rows
)

// bandTestBudget bounds the work of drawing [BandOf]'s samples: the number of tries times the
// number of boundary points each inside-the-polygon test visits. A region from a fit (about 50
// points, more than half its bounding box inside) needs well under 1 % of it for the most
// samples; a region with next to no area would otherwise try 1000 times per sample.
const bandTestBudget = 200_000_000

// BandOf draws samples pairs (r1, r2) uniformly inside the polygon region (the joint
// confidence region of the ratios, as traced by [copoly/copoly/fit.LeastSquares]), runs the
// plan's schedule with each (see simulate; a batch simply drifts from its charge), and returns
// the 95 % band of the instantaneous and cumulative composition along the schedule. The
// sampling is seeded and reproducible. A region with no area (its points on a line), or one so
// thin that fewer than samples of the tries allowed by a fixed work budget fall inside it, gives
// a [*copoly.FieldError] naming "jcr", and samples times the schedule's rows above [MaxBandWork]
// an error naming "samples"; so the time taken is bounded whatever the input.
func BandOf(in Input, p *Recipe, region [][2]float64, samples int, seed uint64) (Band, error) {
	if err := in.validate(); err != nil {
		return Band{}, err
	}
	if len(region) < 3 || len(region) > MaxRegionPoints {
		return Band{}, &copoly.InputError{Field: "jcr", Value: float64(len(region)), Reason: fmt.Sprintf("a region needs between 3 and %d boundary points", MaxRegionPoints), Err: copoly.ErrOutOfRange}
	}
	lo1, hi1, lo2, hi2 := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for i, q := range region {
		for k, v := range q {
			if err := copoly.CheckRatio(fmt.Sprintf("jcr[%d][%d]", i, k), v); err != nil {
				return Band{}, err
			}
		}
		lo1, hi1 = math.Min(lo1, q[0]), math.Max(hi1, q[0])
		lo2, hi2 = math.Min(lo2, q[1]), math.Max(hi2, q[1])
	}
	if samples < 10 || samples > MaxBandSamples {
		return Band{}, &copoly.InputError{Field: "samples", Value: float64(samples), Reason: fmt.Sprintf("between 10 and %d samples", MaxBandSamples), Err: copoly.ErrOutOfRange}
	}
	if rows := len(p.Schedule); samples*rows > MaxBandWork {
		return Band{}, &copoly.InputError{Field: "samples", Value: float64(samples), Reason: fmt.Sprintf("%d samples of a schedule of %d rows is more than the %d sample rows a band can take; use fewer samples or steps", samples, rows, MaxBandWork), Err: copoly.ErrTooMany}
	}
	if !(polygonArea(region) > 1e-12*(hi1-lo1)*(hi2-lo2)) || hi1 == lo1 || hi2 == lo2 {
		return Band{}, &copoly.FieldError{Field: "jcr", Reason: "the region has no area to sample from (its points lie on a line or on each other)", Err: copoly.ErrOutOfRange}
	}
	maxTries := min(1000*samples, bandTestBudget/len(region))
	rng := rand.New(rand.NewPCG(seed, 0x6a6372))
	rows := len(p.Schedule)
	// A batch drifts smoothly: its band is computed at about 50 rows and interpolated between
	// them. Semi-batch and shot plans are replayed row by row (their additions are per row).
	idx := make([]int, 0, rows)
	stride := 1
	if p.Mode == ModeBatch {
		stride = max(1, (rows+49)/50)
	}
	for i := 0; i < rows; i += stride {
		idx = append(idx, i)
	}
	if idx[len(idx)-1] != rows-1 {
		idx = append(idx, rows-1)
	}
	inst := make([][]float64, rows)
	cum := make([][]float64, rows)
	ad := in.additions(p)
	drawn, tries := 0, 0
	for drawn < samples && tries < maxTries {
		tries++
		r1 := lo1 + (hi1-lo1)*rng.Float64()
		r2 := lo2 + (hi2-lo2)*rng.Float64()
		if !insidePolygon(region, r1, r2) {
			continue
		}
		drawn++
		a, c := in.outcome(p, ad, idx, copoly.Terminal{R1: r1, R2: r2})
		for k, i := range idx {
			inst[i] = append(inst[i], a[k])
			cum[i] = append(cum[i], c[k])
		}
	}
	if drawn < samples {
		return Band{}, &copoly.FieldError{Field: "jcr", Reason: fmt.Sprintf("the region is too thin to sample: %d of %d tries fell inside it, %d samples were asked for", drawn, tries, samples), Err: copoly.ErrOutOfRange}
	}
	b := Band{Samples: drawn, InstLow: make([]float64, rows), InstHigh: make([]float64, rows), CumLow: make([]float64, rows), CumHigh: make([]float64, rows)}
	for _, i := range idx {
		b.InstLow[i], b.InstHigh[i] = quantiles(inst[i])
		b.CumLow[i], b.CumHigh[i] = quantiles(cum[i])
	}
	for k := 1; k < len(idx); k++ {
		i0, i1 := idx[k-1], idx[k]
		for i := i0 + 1; i < i1; i++ {
			t := float64(i-i0) / float64(i1-i0)
			for _, v := range [][]float64{b.InstLow, b.InstHigh, b.CumLow, b.CumHigh} {
				v[i] = v[i0] + t*(v[i1]-v[i0])
			}
		}
	}
	b.ProductLow, b.ProductHigh = b.CumLow[rows-1], b.CumHigh[rows-1]
	return b, nil
}

// outcome returns the instantaneous and cumulative composition at the schedule rows idx when the
// monomers follow m.
func (in *Input) outcome(p *Recipe, ad additions, idx []int, m copoly.Terminal) (inst, cum []float64) {
	if p.Mode != ModeBatch {
		a, c := in.simulate(p, ad, m, 1)
		inst, cum = make([]float64, len(idx)), make([]float64, len(idx))
		for k, i := range idx {
			inst[k], cum[k] = a[i], c[i]
		}
		return inst, cum
	}
	xs := make([]float64, len(idx))
	for k, i := range idx {
		xs[k] = p.Schedule[i].Conversion
	}
	b, _ := copoly.NewBatch(m, p.StartF1)
	for i := range xs {
		xs[i] = math.Min(xs[i], b.MaxConversion())
	}
	d, err := m.Drift(p.StartF1, xs)
	if err != nil {
		nan := make([]float64, len(xs))
		for i := range nan {
			nan[i] = math.NaN()
		}
		return nan, nan
	}
	return d.Inst, d.Cum
}

// quantiles returns the 2.5 % and 97.5 % quantiles of v (linear interpolation between order
// statistics, Hyndman and Fan's type 7), ignoring NaN. It selects the four order statistics it
// needs instead of sorting: BandOf asks for hundreds of quantiles of hundreds of samples.
func quantiles(v []float64) (lo, hi float64) {
	s := make([]float64, 0, len(v))
	for _, x := range v {
		if !math.IsNaN(x) {
			s = append(s, x)
		}
	}
	if len(s) == 0 {
		return math.NaN(), math.NaN()
	}
	// The order statistics are taken in increasing rank, each selection leaving the smaller
	// values to its left, so the next one searches only to the right of the last.
	from := 0
	q := func(p float64) float64 {
		x := p * float64(len(s)-1)
		i := int(x)
		a := selectNth(s, from, i)
		if i+1 >= len(s) {
			from = i
			return a
		}
		b := selectNth(s, i+1, i+1)
		from = i + 1
		return a + (x-float64(i))*(b-a)
	}
	lo = q(0.025)
	hi = q(0.975)
	return lo, hi
}

// selectNth rearranges s[from:] so that s[k] holds the value it would hold if s[from:] were
// sorted, with no larger value before it and no smaller one after it, and returns s[k]
// (Hoare's selection, "Find", Commun. ACM 1961, 4, 321, with a median-of-three pivot). Every
// value in s[:from] must be at most every value in s[from:].
func selectNth(s []float64, from, k int) float64 {
	lo, hi := from, len(s)-1
	for lo < hi {
		mid := lo + (hi-lo)/2
		// Median of three to s[mid].
		if s[mid] < s[lo] {
			s[mid], s[lo] = s[lo], s[mid]
		}
		if s[hi] < s[lo] {
			s[hi], s[lo] = s[lo], s[hi]
		}
		if s[hi] < s[mid] {
			s[hi], s[mid] = s[mid], s[hi]
		}
		pivot := s[mid]
		i, j := lo, hi
		for i <= j {
			for s[i] < pivot {
				i++
			}
			for s[j] > pivot {
				j--
			}
			if i <= j {
				s[i], s[j] = s[j], s[i]
				i++
				j--
			}
		}
		// Now s[lo..j] <= pivot <= s[i..hi], and values between j and i equal the pivot.
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return s[k]
		}
	}
	return s[k]
}

// polygonArea returns the area enclosed by the closed polygon by the shoelace formula (the
// absolute value of the signed area; a self-crossing polygon's lobes may cancel).
//
//	A = ½ |Σ (xᵢ yᵢ₊₁ − xᵢ₊₁ yᵢ)|
//
// References:
//   - B. Braden, The surveyor's area formula, College Math. J. 1986, 17, 326 (from memory).
func polygonArea(poly [][2]float64) float64 {
	var a float64
	for i, j := 0, len(poly)-1; i < len(poly); j, i = i, i+1 {
		a += poly[j][0]*poly[i][1] - poly[i][0]*poly[j][1]
	}
	return math.Abs(a) / 2
}

// insidePolygon reports whether (x, y) lies inside the closed polygon (even–odd rule).
func insidePolygon(poly [][2]float64, x, y float64) bool {
	in := false
	for i, j := 0, len(poly)-1; i < len(poly); j, i = i, i+1 {
		xi, yi, xj, yj := poly[i][0], poly[i][1], poly[j][0], poly[j][1]
		if (yi > y) != (yj > y) && x < (xj-xi)*(y-yi)/(yj-yi)+xi {
			in = !in
		}
	}
	return in
}
