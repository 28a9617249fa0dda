package dust

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// gonumAV integrates ExpDisc.Density with gonum's quad.Fixed (Gauss–Legendre,
// 64 points per panel) over 400 panels, split at the mid-plane crossing and at
// the closest approach to the Galactic centre: an independent quadrature of
// the same integrand (gonum v0.17).
func gonumAV(e *ExpDisc, d float64) float64 {
	f := func(s float64) float64 { return e.density(s) }
	cuts := []float64{0}
	if e.sb != 0 {
		if k := -e.p.SunHeightPc / e.sb; k > 0 && k < d {
			cuts = append(cuts, k)
		}
	}
	if e.cl > 0 && e.cb > 0 {
		if k := e.p.SunRadiusPc * e.cl / e.cb; k > 0 && k < d && k != cuts[len(cuts)-1] {
			cuts = append(cuts, k)
		}
	}
	if len(cuts) == 3 && cuts[1] > cuts[2] {
		cuts[1], cuts[2] = cuts[2], cuts[1]
	}
	cuts = append(cuts, d)
	total := 0.0
	for c := 0; c+1 < len(cuts); c++ {
		a, b := cuts[c], cuts[c+1]
		const panels = 400
		for i := 0; i < panels; i++ {
			lo := a + (b-a)*float64(i)/panels
			hi := a + (b-a)*float64(i+1)/panels
			total += quad.Fixed(f, lo, hi, 64, quad.Legendre{}, 0)
		}
	}
	return total
}

// TestExpDiscAgainstGonum: A_V(d) from the table (Hermite between
// Gauss–Legendre nodes) or the closed form against gonum quadrature of the
// integrand, relative 1e-6 (the brief's bar), in directions that exercise the
// mid-plane crossing (b < 0 with the Sun above the plane), the Galactic
// centre (l = 0, b = 0 passes through it), the anticentre, high latitude
// and the analytic vertical and gradient-free cases.
func TestExpDiscAgainstGonum(t *testing.T) {
	t.Parallel()
	base := DefaultDiscParams(8178, DefaultSunAboveDustPlanePc) // R☉ 8178 pc: an arbitrary test value
	noGrad := base
	noGrad.ScaleLengthPc = math.Inf(1)
	cases := []struct {
		name       string
		p          DiscParams
		lDeg, bDeg float64
	}{
		{"centre", base, 0, 0}, {"anticentre", base, 180, 0}, {"l=30 b=-1", base, 30, -1},
		{"l=300 b=-5", base, 300, -5}, {"l=90 b=10", base, 90, 10}, {"l=45 b=-60", base, 45, -60},
		{"l=-20 b=0.2", base, -20, 0.2}, {"north pole", base, 0, 90}, {"south pole", base, 123, -90},
		{"no gradient b=-3", noGrad, 77, -3}, {"no gradient b=0", noGrad, 10, 0},
	}
	worst := 0.0
	for _, c := range cases {
		e, err := NewExpDisc(c.p, c.lDeg, c.bDeg)
		if err != nil {
			t.Fatal(err)
		}
		for _, d := range []float64{0.5, 10, 123.4, 500, 1000, 2345, 5000, 8178, 9000, 20000, 60000} {
			got := e.AV(d)
			want := gonumAV(e, d)
			rel := math.Abs(got-want) / math.Max(want, 1e-300)
			worst = math.Max(worst, rel)
			if rel > 1e-6 {
				t.Errorf("%s d=%g pc: A_V %.10g, gonum %.10g (rel %.2g)", c.name, d, got, want, rel)
			}
		}
	}
	t.Logf("max relative difference to gonum quad: %.2g", worst)
}

// TestExpDiscNormalisation: dA_V/ds at the Sun equals the plane value A₀
// (definition of the normalisation), a short path in the plane gives A₀ d,
// and A_V is non-decreasing and symmetric in l ↔ −l (the disc is
// axisymmetric).
func TestExpDiscNormalisation(t *testing.T) {
	t.Parallel()
	p := DefaultDiscParams(8000, 20)
	p.AVPerKpc = 0.7
	e, _ := NewExpDisc(p, 60, 0)
	if d := e.Density(0); math.Abs(d-0.7e-3) > 1e-15 {
		t.Errorf("density at the Sun %g mag/pc, want 7e-4", d)
	}
	if a := e.AV(10); math.Abs(a-0.007)/0.007 > 1e-3 {
		t.Errorf("A_V(10 pc) in the plane %g, want 0.007 within 0.1%% (radial gradient over 10 pc)", a)
	}
	m, _ := NewExpDisc(p, -60, 0)
	prev := 0.0
	for d := 0.0; d < 30000; d += 37 {
		a := e.AV(d)
		if a < prev {
			t.Errorf("A_V decreases at %g pc: %g < %g", d, a, prev)
		}
		prev = a
		if b := m.AV(d); math.Abs(a-b) > 1e-12*math.Max(a, 1) {
			t.Errorf("l=±60 differ at %g pc: %g vs %g", d, a, b)
		}
	}
}

// TestExpDiscPoleAsymmetry: with the Sun above the dust plane, the line to the
// south pole crosses the whole layer below: A_V(∞) north = A₀ h_z, south =
// A₀ h_z (2e^{z☉/h_z} − 1) (closed form of the exponential layer; common
// practice cosec-law slab with an offset observer).
func TestExpDiscPoleAsymmetry(t *testing.T) {
	t.Parallel()
	p := DefaultDiscParams(8000, 23)
	n, _ := NewExpDisc(p, 0, 90)
	s, _ := NewExpDisc(p, 0, -90)
	a0, hz, z := p.AVPerKpc/1000, p.ScaleHeightPc, p.SunHeightPc
	wantN := a0 * hz
	wantS := a0 * hz * (2*math.Exp(z/hz) - 1)
	if g := n.AV(1e5); math.Abs(g-wantN) > 1e-12 {
		t.Errorf("north pole A_V(100 kpc) %g, want %g", g, wantN)
	}
	if g := s.AV(1e5); math.Abs(g-wantS) > 1e-12 {
		t.Errorf("south pole A_V(100 kpc) %g, want %g", g, wantS)
	}
}

// TestExpDiscBeyondTable: past MaxDistancePc the remainder is integrated
// directly, so AV keeps growing in the plane and still matches gonum.
func TestExpDiscBeyondTable(t *testing.T) {
	p := DefaultDiscParams(8000, 0)
	p.MaxDistancePc = 3000
	e, _ := NewExpDisc(p, 180, 0)
	for _, d := range []float64{2999, 3000, 3500, 10000} {
		got, want := e.AV(d), gonumAV(e, d)
		if math.Abs(got-want)/want > 1e-6 {
			t.Errorf("d=%g: %g vs gonum %g", d, got, want)
		}
	}
	if a := testing.AllocsPerRun(100, func() { e.AV(5000) }); a != 0 {
		t.Errorf("AV beyond the table allocates %v", a)
	}
}

// TestExpDiscErrors: each invalid parameter is reported with its field name.
func TestExpDiscErrors(t *testing.T) {
	t.Parallel()
	ok := DefaultDiscParams(8000, 20)
	mod := func(f func(*DiscParams)) DiscParams { p := ok; f(&p); return p }
	cases := []struct {
		field string
		p     DiscParams
	}{
		{"AVPerKpc", mod(func(p *DiscParams) { p.AVPerKpc = -1 })},
		{"ScaleHeightPc", mod(func(p *DiscParams) { p.ScaleHeightPc = 0 })},
		{"ScaleLengthPc", mod(func(p *DiscParams) { p.ScaleLengthPc = math.NaN() })},
		{"SunRadiusPc", mod(func(p *DiscParams) { p.SunRadiusPc = 0 })},
		{"SunHeightPc", mod(func(p *DiscParams) { p.SunHeightPc = 5000 })},
		{"MaxDistancePc", mod(func(p *DiscParams) { p.MaxDistancePc = -1 })},
	}
	for _, c := range cases {
		_, err := NewExpDisc(c.p, 0, 0)
		if !errors.Is(err, ErrDiscParams) || !strings.Contains(err.Error(), c.field) {
			t.Errorf("%s: got %v", c.field, err)
		}
	}
	for _, b := range []float64{-91, 90.5, math.NaN()} {
		if _, err := NewExpDisc(ok, 0, b); !errors.Is(err, ErrDiscParams) {
			t.Errorf("b=%g: got %v", b, err)
		}
	}
	if _, err := NewExpDisc(ok, math.Inf(1), 0); !errors.Is(err, ErrDiscParams) {
		t.Errorf("l=Inf: got %v", err)
	}
	e, _ := NewExpDisc(ok, 0, 0)
	func() {
		defer func() {
			if recover() == nil {
				t.Error("AV(-1) should panic")
			}
		}()
		e.AV(-1)
	}()
}

// BenchmarkExpDiscAV: one star's A_V lookup in a low-latitude direction.
func BenchmarkExpDiscAV(b *testing.B) {
	e, err := NewExpDisc(DefaultDiscParams(8178, 20.8), 30, -2)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	s := 0.0
	for i := 0; i < b.N; i++ {
		s += e.AV(float64(i%20000) + 0.5)
	}
	_ = s
}

// TestDiscDefaultsMatchKit: the default constants equal the rows of the
// reference kit's population_values.tsv they cite (excerpt in testdata/population_values_dust.tsv).
func TestDiscDefaultsMatchKit(t *testing.T) {
	t.Parallel()
	_, rows := readTSV(t, "testdata/population_values_dust.tsv")
	want := map[string]float64{
		"A_V_per_kpc_local_plane":        DefaultAVPerKpc,
		"dust_scale_height_lamost":       DefaultDustScaleHeightPc,
		"dust_scale_length_lamost":       DefaultDustScaleLengthPc,
		"sun_above_dust_midplane_lamost": DefaultSunAboveDustPlanePc,
	}
	found := 0
	for _, r := range rows {
		if v, ok := want[r[0]]; ok {
			found++
			if got := parseF(t, r[1]); got != v {
				t.Errorf("%s: kit %g, package default %g", r[0], got, v)
			}
		}
	}
	if found != len(want) {
		t.Errorf("found %d of %d kit rows", found, len(want))
	}
}

// TestVerticalAV: the per-star closed form against gonum Gauss–Legendre quadrature of the
// integrand A₀ exp(−(|z☉ + s sin b| − |z☉|)/h_z), split at the mid-plane crossing (where
// the integrand has a kink), to 1e-9 relative.
func TestVerticalAV(t *testing.T) {
	p := DefaultDiscParams(8200, DefaultSunAboveDustPlanePc)
	for _, b := range []float64{-90, -30, -2, -0.3, 0.5, 10, 60, 90} {
		sb := math.Sin(b * math.Pi / 180)
		f := func(s float64) float64 {
			z := p.SunHeightPc + s*sb
			return p.AVPerKpc / 1000 * math.Exp(-(math.Abs(z)-math.Abs(p.SunHeightPc))/p.ScaleHeightPc)
		}
		for _, d := range []float64{50, 800, 5000, 40000} {
			var want float64
			cross := -p.SunHeightPc / sb
			if cross > 0 && cross < d {
				want = quad.Fixed(f, 0, cross, 200, nil, 0) + quad.Fixed(f, cross, d, 2000, nil, 0)
			} else {
				want = quad.Fixed(f, 0, d, 2000, nil, 0)
			}
			got := p.VerticalAV(b, d)
			if math.Abs(got-want) > 1e-9*want {
				t.Errorf("b %g d %g: VerticalAV %.12g, quadrature %.12g", b, d, got, want)
			}
		}
	}
	if p.VerticalAV(30, 0) != 0 {
		t.Error("A_V at zero distance is not zero")
	}
}
