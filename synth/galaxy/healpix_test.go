package galaxy

import (
	"errors"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

type hpRow struct {
	kind  string
	nside int64
	f     [4]string
	line  int
}

// readHealpyRows reads testdata/healpix_healpy.tsv (healpy 1.16.1 values, made by
// testdata/regen_healpix.py).
func readHealpyRows(t *testing.T) []hpRow {
	t.Helper()
	var rows []hpRow
	for _, rec := range readTSVRows(t, "testdata/healpix_healpy.tsv", 6) {
		fs, n := rec.fields, rec.line
		ns, err := strconv.ParseInt(fs[1], 10, 64)
		if err != nil {
			t.Fatalf("line %d: %v", n, err)
		}
		rows = append(rows, hpRow{kind: fs[0], nside: ns, f: [4]string{fs[2], fs[3], fs[4], fs[5]}, line: n})
	}
	return rows
}

func mustF(t *testing.T, s string) float64 {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

func mustI(t *testing.T, s string) int64 {
	v, err := strconv.ParseInt(s, 10, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// TestHEALPixHealpy checks ang2pix (both schemes), pix2ang (pixel centres), nest → ring and
// pixel areas against healpy 1.16.1 (testdata/healpix_healpy.tsv). Pixel numbers must match
// exactly. Centres: 1e-12 rad, since both compute the same closed forms (Górski et al. 2005
// eqs. 4–9) in double precision; areas: 1e-14 relative (one division).
func TestHEALPixHealpy(t *testing.T) {
	t.Parallel()
	counts := map[string]int{}
	for _, r := range readHealpyRows(t) {
		ring, err := NewHEALPix(r.nside, Ring)
		if err != nil {
			t.Fatal(err)
		}
		nest, _ := NewHEALPix(r.nside, Nested)
		counts[r.kind]++
		switch r.kind {
		case "area":
			want := mustF(t, r.f[2])
			if got := ring.PixelAreaSr(); math.Abs(got-want) > 1e-14*want {
				t.Errorf("line %d nside %d: area %.17g, healpy %.17g", r.line, r.nside, got, want)
			}
		case "ang2pix":
			th, ph := mustF(t, r.f[0]), mustF(t, r.f[1])
			if got, want := ring.Ang2Pix(th, ph), mustI(t, r.f[2]); got != want {
				t.Errorf("line %d nside %d ring ang2pix(%.17g, %.17g) = %d, healpy %d", r.line, r.nside, th, ph, got, want)
			}
			if got, want := nest.Ang2Pix(th, ph), mustI(t, r.f[3]); got != want {
				t.Errorf("line %d nside %d nested ang2pix(%.17g, %.17g) = %d, healpy %d", r.line, r.nside, th, ph, got, want)
			}
		case "pix2ang":
			p := mustI(t, r.f[0])
			th, ph := ring.Pix2Ang(p)
			wth, wph := mustF(t, r.f[2]), mustF(t, r.f[3])
			if d := angSepRad(ph*radToDeg, 90-th*radToDeg, wph*radToDeg, 90-wth*radToDeg); d > 1e-12 {
				t.Errorf("line %d nside %d pix2ang(%d) = (%.17g, %.17g), healpy (%.17g, %.17g)", r.line, r.nside, p, th, ph, wth, wph)
			}
			// the same centre through the nested numbering
			np := ring.RingToNest(p)
			nth, nph := nest.Pix2Ang(np)
			if d := angSepRad(nph*radToDeg, 90-nth*radToDeg, wph*radToDeg, 90-wth*radToDeg); d > 1e-12 {
				t.Errorf("line %d nside %d nested pix2ang(%d) off by %g rad", r.line, r.nside, np, d)
			}
		case "maxpixrad":
			// pixelRadiusRad must bound every pixel (so its maximum is ≥ healpy's largest
			// centre-to-corner distance) without being loose by more than a factor 1.5
			want := mustF(t, r.f[2])
			var worst float64
			for p := int64(0); p < ring.NPix(); p++ {
				worst = math.Max(worst, ring.pixelRadiusRad(p))
			}
			if worst < want || worst > 1.5*want {
				t.Errorf("line %d nside %d: largest pixel bound %.6g rad, healpy max_pixrad %.6g", r.line, r.nside, worst, want)
			}
		case "nest2ring":
			p := mustI(t, r.f[0])
			if got, want := nest.NestToRing(p), mustI(t, r.f[2]); got != want {
				t.Errorf("line %d nside %d nest2ring(%d) = %d, healpy %d", r.line, r.nside, p, got, want)
			}
			if back := nest.RingToNest(mustI(t, r.f[2])); back != p {
				t.Errorf("line %d nside %d ring2nest(nest2ring(%d)) = %d", r.line, r.nside, p, back)
			}
		}
	}
	for _, k := range []string{"area", "ang2pix", "pix2ang", "nest2ring"} {
		if counts[k] < 8 {
			t.Errorf("only %d %s rows", counts[k], k)
		}
	}
}

// TestHEALPixNside checks nside validation (power of two in [1, 2^29]).
func TestHEALPixNside(t *testing.T) {
	t.Parallel()
	for _, ns := range []int64{0, -4, 3, 12, 1 << 30} {
		if _, err := NewHEALPix(ns, Ring); !errors.Is(err, ErrOutOfRange) || !strings.Contains(err.Error(), "nside") {
			t.Errorf("NewHEALPix(%d): error %v, want an nside range error", ns, err)
		}
	}
	if _, err := NewHEALPix(16, Scheme(9)); err == nil {
		t.Error("bad scheme accepted")
	}
}

// TestHEALPixPixelBox checks that every direction lies inside the sampling box of its own
// pixel (the property SampleInPixel relies on), for uniform random directions, at several
// resolutions and both schemes. This is a property of the HEALPix geometry
// (Górski et al. 2005), checked by sampling: 100000 directions per case.
func TestHEALPixPixelBox(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(3, 4))
	for _, ns := range []int64{1, 2, 4, 8, 16, 256, 4096} {
		for _, sc := range []Scheme{Ring, Nested} {
			h, _ := NewHEALPix(ns, sc)
			bad := 0
			for i := 0; i < 100000; i++ {
				z := 2*r.Float64() - 1
				phi := 2 * math.Pi * r.Float64()
				p := h.Ang2Pix(math.Acos(z), phi)
				zLo, zHi, phiC, dphi := h.pixelBox(p)
				dp := math.Abs(math.Remainder(phi-phiC, 2*math.Pi))
				if z < zLo-1e-15 || z > zHi+1e-15 || dp > dphi {
					bad++
					if bad < 5 {
						t.Errorf("nside %d %v: direction (z %.6f, phi %.6f) in pixel %d outside box z [%.6f, %.6f], phi %.6f ± %.6f",
							ns, sc, z, phi, p, zLo, zHi, phiC, dphi)
					}
				}
			}
		}
	}
}

// TestHEALPixSampleInPixel checks that samples stay in their pixel and are uniform: the
// mean of z = cos θ over the samples of a pixel equals the mean over a fine sub-pixel
// grid (the 4^5 nested children, whose centres are equal-area samples) within
// 4 standard errors (statistical, 2000 draws).
func TestHEALPixSampleInPixel(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(5, 6))
	for _, ns := range []int64{1, 8} {
		h, _ := NewHEALPix(ns, Nested)
		fine, _ := NewHEALPix(ns<<5, Nested)
		for _, p := range []int64{0, 5, h.NPix() / 2, h.NPix() - 1} {
			var sum, sum2 float64
			const n = 2000
			for i := 0; i < n; i++ {
				th, ph := h.SampleInPixel(p, r)
				if got := h.Ang2Pix(th, ph); got != p {
					t.Fatalf("nside %d: sample in pixel %d landed in %d", ns, p, got)
				}
				z := math.Cos(th)
				sum += z
				sum2 += z * z
			}
			mean := sum / n
			sd := math.Sqrt((sum2/n - mean*mean) / n)
			var ref float64
			k := int64(1) << 10
			for c := p * k; c < (p+1)*k; c++ {
				th, _ := fine.Pix2Ang(c)
				ref += math.Cos(th)
			}
			ref /= float64(k)
			if math.Abs(mean-ref) > 4*sd+1e-4 {
				t.Errorf("nside %d pixel %d: mean z of samples %.5f, sub-pixel mean %.5f (4 sd = %.5f)", ns, p, mean, ref, 4*sd)
			}
		}
	}
}
