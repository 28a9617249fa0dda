package synth

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// ksD returns the Kolmogorov–Smirnov statistic of sample xs against the CDF cdf.
func ksD(xs []float64, cdf func(float64) float64) float64 {
	sort.Float64s(xs)
	n := float64(len(xs))
	d := 0.0
	for i, x := range xs {
		f := cdf(x)
		d = math.Max(d, math.Max(math.Abs(f-float64(i)/n), math.Abs(float64(i+1)/n-f)))
	}
	return d
}

// ksCrit is the asymptotic KS critical value for a false-alarm rate of 1e-3 (c(α) = 1.949;
// Smirnov 1948 limiting distribution, common practice).
func ksCrit(n int) float64 { return 1.949 / math.Sqrt(float64(n)) }

// TestPlummerRadii checks the drawn radii against the truncated Plummer (1911) enclosed
// mass M(<r)/M = r³/(r²+a²)^{3/2}, renormalised at r_max (KS, false-alarm rate 1e-3).
func TestPlummerRadii(t *testing.T) {
	g := &Geometry{Kind: "plummer", DistancePc: 5000, ScaleRadiusPc: 2, MaxRadiusPc: 15, RADeg: 40, DecDeg: 30}
	p := newPlacement(g)
	r := rand.New(rand.NewPCG(3, 4))
	const n = 100000
	radii := make([]float64, n)
	for i := range radii {
		e, no, d, _, _, _ := p.place(r)
		radii[i] = math.Sqrt(e*e + no*no + d*d)
	}
	enc := func(x float64) float64 { return x * x * x / math.Pow(x*x+4, 1.5) }
	cdf := func(x float64) float64 { return enc(x) / enc(15) }
	if d := ksD(radii, cdf); d > ksCrit(n) {
		t.Errorf("KS D = %.4g > %.4g", d, ksCrit(n))
	}
}

// TestPlacementSky checks the sky geometry: a star on the line of sight has the
// centre's coordinates and distance d + depth; an offset of x pc east subtends
// atan(x/d) (exact vector arithmetic).
func TestPlacementSky(t *testing.T) {
	g := &Geometry{Kind: "fixed", DistancePc: 2000, RADeg: 83.5, DecDeg: -5.25}
	p := newPlacement(g)
	_, _, _, ra, dec, d := p.place(rand.New(rand.NewPCG(1, 1)))
	if math.Abs(ra-83.5) > 1e-9 || math.Abs(dec+5.25) > 1e-9 || math.Abs(d-2000) > 1e-9 {
		t.Errorf("centre: ra %g dec %g d %g", ra, dec, d)
	}
}

// TestExponentialAges checks the exponentially declining history against its CDF: with
// formation time t = max − age on [0, T], P(t < x) = (1 − e^{−x/τ}) / (1 − e^{−T/τ}).
func TestExponentialAges(t *testing.T) {
	s := expAges{minYr: 1e9, maxYr: 11e9, tauYr: 3e9}
	r := rand.New(rand.NewPCG(5, 6))
	const n = 100000
	ts := make([]float64, n)
	for i := range ts {
		a := s.Age(r)
		if a < s.minYr || a > s.maxYr {
			t.Fatalf("age %g outside [%g, %g]", a, s.minYr, s.maxYr)
		}
		ts[i] = s.maxYr - a
	}
	T := s.maxYr - s.minYr
	cdf := func(x float64) float64 { return -math.Expm1(-x/s.tauYr) / -math.Expm1(-T/s.tauYr) }
	if d := ksD(ts, cdf); d > ksCrit(n) {
		t.Errorf("KS D = %.4g > %.4g", d, ksCrit(n))
	}
}

// TestPiecewiseLinear checks the table sampler against the exact CDF of a piecewise-linear
// density (integral of the trapezoids), for a rising and a falling segment.
func TestPiecewiseLinear(t *testing.T) {
	x := []float64{0, 1, 3}
	w := []float64{0, 2, 1}
	pl, err := newPiecewiseLinear(x, w)
	if err != nil {
		t.Fatal(err)
	}
	total := 0.5*2*1 + 0.5*(2+1)*2 // 4
	cdf := func(v float64) float64 {
		if v <= 1 {
			return v * v / total // ∫0^v 2u du
		}
		u := v - 1
		return (1 + 2*u - 0.25*u*u) / total // 1 + ∫ (2 − u/2) du
	}
	r := rand.New(rand.NewPCG(7, 8))
	const n = 100000
	xs := make([]float64, n)
	for i := range xs {
		xs[i] = pl.Sample(r)
	}
	if d := ksD(xs, cdf); d > ksCrit(n) {
		t.Errorf("KS D = %.4g > %.4g", d, ksCrit(n))
	}
}

// TestBinaryModel checks the binary fraction (binomial, 4σ) and the power-law mass-ratio
// distribution dN/dq ∝ q^γ (KS against its CDF (q^{γ+1} − qmin^{γ+1})/(qmax^{γ+1} − qmin^{γ+1})).
func TestBinaryModel(t *testing.T) {
	f := 0.4
	b := newBinaryModel(&Binaries{Fraction: &f, MassRatio: MassRatio{Kind: "power_law", Min: 0.2, Max: 1, Gamma: 0.7}})
	r := rand.New(rand.NewPCG(9, 10))
	const n = 200000
	var qs []float64
	for i := 0; i < n; i++ {
		if m2 := b.draw(2, r); m2 > 0 {
			qs = append(qs, m2/2)
		}
	}
	frac := float64(len(qs)) / n
	if sig := math.Sqrt(f * (1 - f) / n); math.Abs(frac-f) > 4*sig {
		t.Errorf("binary fraction %.4f, want %.2f ± %.4f", frac, f, 4*sig)
	}
	g1 := 1.7
	cdf := func(q float64) float64 {
		return (math.Pow(q, g1) - math.Pow(0.2, g1)) / (1 - math.Pow(0.2, g1))
	}
	if d := ksD(qs, cdf); d > ksCrit(len(qs)) {
		t.Errorf("mass ratio KS D = %.4g > %.4g", d, ksCrit(len(qs)))
	}
	bm := newBinaryModel(&Binaries{FractionByMass: []MassFraction{{0, 0.1}, {1, 0.6}}, MassRatio: MassRatio{Kind: "flat", Min: 0.1, Max: 1}})
	if bm.fractionAt(0.5) != 0.1 || bm.fractionAt(1) != 0.6 || bm.fractionAt(20) != 0.6 {
		t.Errorf("fraction by mass: %g %g %g", bm.fractionAt(0.5), bm.fractionAt(1), bm.fractionAt(20))
	}
}

// TestCombineMags: two equal stars are 2.5 log10 2 = 0.7526 mag brighter than one (exact
// arithmetic); no light on one side leaves the other unchanged.
func TestCombineMags(t *testing.T) {
	if d := combineMags(15, 15) - 15; math.Abs(d+2.5*math.Log10(2)) > 1e-12 {
		t.Errorf("equal pair brightening %.12f, want %.12f", d, -2.5*math.Log10(2))
	}
	if combineMags(math.Inf(1), 12.5) != 12.5 || combineMags(12.5, math.Inf(1)) != 12.5 {
		t.Error("no-light side changed the magnitude")
	}
	// 10 mag apart: the faint star adds 10^-4 of the flux, −2.5 log10(1.0001) mag.
	if d := combineMags(10, 20) - 10; math.Abs(d+2.5*math.Log10(1.0001)) > 1e-12 {
		t.Errorf("faint companion adds %.3g mag", d)
	}
}

// TestStreams: streams are a pure function of (seed, component, chunk, purpose) and
// differ when any of them changes.
func TestStreams(t *testing.T) {
	a := newStream(1, 2, 3, 0).Uint64()
	if newStream(1, 2, 3, 0).Uint64() != a {
		t.Error("same key, different stream")
	}
	for _, o := range []uint64{newStream(2, 2, 3, 0).Uint64(), newStream(1, 3, 3, 0).Uint64(), newStream(1, 2, 4, 0).Uint64(), newStream(1, 2, 3, 1).Uint64()} {
		if o == a {
			t.Error("different key, same first draw")
		}
	}
}

// TestAgeQuantiles: for every star-formation history, Quantile inverts CDF (to 1e-9
// relative) and CDF agrees with the empirical distribution of Age draws (KS, false-alarm
// rate 1e-3) — so the age-cell sampling of Galactic fields and the direct sampling of
// clusters draw from the same distribution.
func TestAgeQuantiles(t *testing.T) {
	pl, err := newPiecewiseLinear([]float64{0, 2e9, 8e9, 12e9}, []float64{1, 3, 0.5, 0.5})
	if err != nil {
		t.Fatal(err)
	}
	hists := map[string]AgeSampler{
		"burst":       burstAges{ageYr: 11e9, spreadYr: 1.5e9},
		"constant":    constantAges{minYr: 0, maxYr: 10e9},
		"exponential": expAges{minYr: 1e9, maxYr: 12e9, tauYr: 4e9},
		"table":       tableAges{pl},
	}
	for name, h := range hists {
		for _, p := range []float64{0.001, 0.1, 0.5, 0.9, 0.999} {
			a := h.Quantile(p)
			if got := h.CDF(a); math.Abs(got-p) > 1e-9 {
				t.Errorf("%s: CDF(Quantile(%g)) = %.12g", name, p, got)
			}
		}
		r := rand.New(rand.NewPCG(21, 22))
		const n = 50000
		xs := make([]float64, n)
		for i := range xs {
			xs[i] = h.Age(r)
		}
		if d := ksD(xs, h.CDF); d > ksCrit(n) {
			t.Errorf("%s: KS D = %.4g > %.4g", name, d, ksCrit(n))
		}
	}
}
