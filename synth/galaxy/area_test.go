package galaxy

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// dotCentre returns u·c for a direction and a centre, both Galactic degrees.
func dotCentre(l, b, l0, b0 float64) float64 {
	x, y, z := unitVector(l, b)
	a, c, d := unitVector(l0, b0)
	return x*a + y*c + z*d
}

// TestConeAnalytic checks the cone's solid angle and quadrature against closed forms of
// spherical geometry (common practice): Ω = 2π(1 − cos r) and ∫ (u·c) dΩ = π sin² r.
// Tolerance 1e-12 relative: Gauss–Legendre with 12 nodes integrates the polynomial
// integrand in cos ρ exactly, so only rounding remains.
func TestConeAnalytic(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ l, b, r float64 }{{0, 90, 180}, {30, 60, 1.784}, {250, -20, 45}, {10, 89.9, 5}, {0, -90, 120}} {
		c, err := NewCone(tc.l, tc.b, tc.r)
		if err != nil {
			t.Fatal(err)
		}
		rr := tc.r * degToRad
		wantOmega := 2 * math.Pi * (1 - math.Cos(rr))
		if got := c.SolidAngleSr(); math.Abs(got-wantOmega) > 1e-13*wantOmega {
			t.Errorf("%v: solid angle %.15g, want %.15g", c, got, wantOmega)
		}
		var sw, sf float64
		for _, d := range c.QuadratureDirections(12) {
			sw += d.WeightSr
			sf += d.WeightSr * dotCentre(d.LDeg, d.BDeg, tc.l, tc.b)
			if !c.Contains(d.LDeg, d.BDeg) {
				t.Errorf("%v: node (%g, %g) not contained", c, d.LDeg, d.BDeg)
			}
		}
		if math.Abs(sw-wantOmega) > 1e-12*wantOmega {
			t.Errorf("%v: weights sum %.15g, want %.15g", c, sw, wantOmega)
		}
		wantF := math.Pi * math.Sin(rr) * math.Sin(rr)
		if math.Abs(sf-wantF) > 1e-12*math.Max(wantOmega, 1e-300) {
			t.Errorf("%v: ∫u·c dΩ = %.15g, want π sin²r = %.15g", c, sf, wantF)
		}
	}
}

// TestAreaSampling draws 20000 directions from each area type and checks (a) every draw is
// Contained and (b) the sample mean of sin b equals the quadrature mean (Ω⁻¹ ∫ sin b dΩ)
// within 4 standard errors (statistical test: a uniform sampler on the sphere must match
// the area average).
func TestAreaSampling(t *testing.T) {
	t.Parallel()
	cone, _ := NewCone(120, 35, 20)
	rect, _ := NewRect(Galactic, 350, 380, -10, 40)
	eq, _ := NewRect(Equatorial, 150, 210, -20, 10)
	pix, _ := NewPixelList(Galactic, 8, Ring, []int64{0, 1, 2, 100, 300, 700, 767})
	pixEq, _ := NewPixelList(Equatorial, 4, Nested, []int64{3, 50, 120, 191})
	r := rand.New(rand.NewPCG(11, 12))
	for _, a := range []Area{cone, rect, eq, pix, pixEq, WholeSky()} {
		var ref, sw float64
		for _, d := range a.QuadratureDirections(32) {
			ref += d.WeightSr * math.Sin(d.BDeg*degToRad)
			sw += d.WeightSr
		}
		if math.Abs(sw-a.SolidAngleSr()) > 1e-10*a.SolidAngleSr() {
			t.Errorf("%v: weights sum %.12g, solid angle %.12g", a, sw, a.SolidAngleSr())
		}
		ref /= sw
		const n = 20000
		var s, s2 float64
		out := 0
		for i := 0; i < n; i++ {
			l, b := a.SampleDirection(r)
			if !a.Contains(l, b) {
				out++
			}
			v := math.Sin(b * degToRad)
			s += v
			s2 += v * v
		}
		if out > 0 {
			t.Errorf("%v: %d of %d draws not contained", a, out, n)
		}
		mean := s / n
		se := math.Sqrt((s2/n - mean*mean) / n)
		if math.Abs(mean-ref) > 4*se {
			t.Errorf("%v: sample mean sin b %.5f, area mean %.5f, 4 se %.5f", a, mean, ref, 4*se)
		}
	}
}

// TestRectSolidAngle checks Ω = Δl (sin b2 − sin b1) (closed form, common practice) for a
// 10 deg² equatorial box, and that an RA/Dec rectangle has the same solid angle as
// reported by its own quadrature (1e-12 relative).
func TestRectSolidAngle(t *testing.T) {
	t.Parallel()
	q, _ := NewRect(Equatorial, 10, 13.1623, -1.581, 1.581)
	want := 3.1623 * degToRad * 2 * math.Sin(1.581*degToRad)
	if got := q.SolidAngleSr(); math.Abs(got-want) > 1e-14 {
		t.Errorf("solid angle %.15g, want %.15g", got, want)
	}
	deg2 := q.SolidAngleSr() * radToDeg * radToDeg
	if math.Abs(deg2-10) > 0.01 {
		t.Errorf("box is %.4f deg², want ≈ 10", deg2)
	}
}

// TestAreaErrors checks the bad-input errors of the issue: cone radius 0 or > 180°, and
// other malformed areas, each naming the field and matching ErrOutOfRange where numeric.
func TestAreaErrors(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name  string
		err   error
		field string
	}{
		{"radius 0", func() error { _, e := NewCone(0, 0, 0); return e }(), "radius_deg"},
		{"radius 180.5", func() error { _, e := NewCone(0, 0, 180.5); return e }(), "radius_deg"},
		{"radius negative", func() error { _, e := NewCone(0, 0, -1); return e }(), "radius_deg"},
		{"radius NaN", func() error { _, e := NewCone(0, 0, math.NaN()); return e }(), "radius_deg"},
		{"cone b 91", func() error { _, e := NewCone(0, 91, 1); return e }(), "b_deg"},
		{"rect empty lon", func() error { _, e := NewRect(Galactic, 10, 10, 0, 1); return e }(), "lon_max_deg - lon_min_deg"},
		{"rect lat order", func() error { _, e := NewRect(Galactic, 0, 10, 5, 1); return e }(), "lat_max_deg"},
		{"rect lat range", func() error { _, e := NewRect(Equatorial, 0, 10, -95, 1); return e }(), "lat_min_deg"},
		{"pixel out of range", func() error { _, e := NewPixelList(Galactic, 2, Ring, []int64{48}); return e }(), "pixel 48"},
		{"nside 3", func() error { _, e := NewPixelList(Galactic, 3, Ring, []int64{1}); return e }(), "nside"},
	} {
		if tc.err == nil {
			t.Errorf("%s: no error", tc.name)
			continue
		}
		if !errors.Is(tc.err, ErrOutOfRange) {
			t.Errorf("%s: %v does not match ErrOutOfRange", tc.name, tc.err)
		}
		if !strings.Contains(tc.err.Error(), tc.field) {
			t.Errorf("%s: error %q does not name %q", tc.name, tc.err, tc.field)
		}
	}
	if _, err := NewPixelList(Galactic, 2, Ring, nil); err == nil {
		t.Error("empty pixel list accepted")
	}
	if _, err := ParseScheme("spiral"); err == nil {
		t.Error("unknown scheme accepted")
	}
}

// TestPixelListWholeSky: all 12 nside² pixels form the whole sphere, 4π sr (Górski et al.
// 2005: equal-area tessellation) and ∫ sin b dΩ = 0 by symmetry (to 1e-12 sr).
func TestPixelListWholeSky(t *testing.T) {
	t.Parallel()
	ps := make([]int64, 48)
	for i := range ps {
		ps[i] = int64(i)
	}
	a, err := NewPixelList(Galactic, 2, Nested, ps)
	if err != nil {
		t.Fatal(err)
	}
	if got := a.SolidAngleSr(); math.Abs(got-4*math.Pi) > 1e-13 {
		t.Errorf("solid angle %.15g, want 4π", got)
	}
	var s float64
	for _, d := range a.QuadratureDirections(4) {
		s += d.WeightSr * math.Sin(d.BDeg*degToRad)
	}
	if math.Abs(s) > 1e-12 {
		t.Errorf("∫ sin b dΩ = %g, want 0", s)
	}
}

// TestNewArea: each spec kind builds the matching area (solid angle by the closed forms of
// the constructors' tests) and bad kinds or fields give errors naming them.
func TestNewArea(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		spec  AreaSpec
		omega float64
	}{
		{AreaSpec{Kind: "cone", LDeg: 10, BDeg: 20, RadiusDeg: 90}, 2 * math.Pi},
		{AreaSpec{Kind: "rect", System: "icrs", LonMinDeg: 0, LonMaxDeg: 360, LatMinDeg: 0, LatMaxDeg: 90}, 2 * math.Pi},
		{AreaSpec{Kind: "healpix", System: "galactic", Nside: 1, Scheme: "nested", Pixels: []int64{0, 1, 2}}, math.Pi},
		{AreaSpec{Kind: "all_sky"}, 4 * math.Pi},
	} {
		a, err := NewArea(tc.spec)
		if err != nil {
			t.Errorf("%+v: %v", tc.spec, err)
			continue
		}
		if math.Abs(a.SolidAngleSr()-tc.omega) > 1e-12 {
			t.Errorf("%v: solid angle %g, want %g", a, a.SolidAngleSr(), tc.omega)
		}
	}
	for _, tc := range []struct {
		spec AreaSpec
		word string
	}{
		{AreaSpec{Kind: "polygon"}, `"polygon"`},
		{AreaSpec{Kind: "rect", System: "ecliptic", LonMaxDeg: 1, LatMaxDeg: 1}, `"ecliptic"`},
		{AreaSpec{Kind: "healpix", Nside: 4, Scheme: "zigzag", Pixels: []int64{1}}, `"zigzag"`},
		{AreaSpec{Kind: "cone", RadiusDeg: 0}, "radius_deg"},
	} {
		if _, err := NewArea(tc.spec); err == nil || !strings.Contains(err.Error(), tc.word) {
			t.Errorf("%+v: error %v, want one naming %s", tc.spec, err, tc.word)
		}
	}
}

// TestContainsBadLatitude: a latitude outside [−90, 90] is not a direction; every area
// answers false rather than wrapping it.
func TestContainsBadLatitude(t *testing.T) {
	t.Parallel()
	cone, _ := NewCone(0, 89, 5)
	rect, _ := NewRect(Galactic, 0, 360, 80, 90)
	pix, _ := NewPixelList(Galactic, 1, Ring, []int64{0, 1, 2, 3})
	for _, a := range []Area{cone, rect, pix} {
		for _, b := range []float64{90.5, -91, math.NaN()} {
			if a.Contains(0, b) {
				t.Errorf("%v contains b = %g", a, b)
			}
		}
	}
}
