package galaxy

import (
	"math"
	"math/rand/v2"
	"testing"
)

// BenchmarkShellMasses10deg2 integrates 50 log-spaced shells from 10 pc to 100 kpc over a
// 10 deg² cone at (l, b) = (45°, 60°), all four components, default options.
func BenchmarkShellMasses10deg2(b *testing.B) {
	m := DefaultModel()
	r := math.Acos(1-10/(2*math.Pi)*degToRad*degToRad) * radToDeg
	cone, _ := NewCone(45, 60, r)
	shells, _ := MakeShells(10, 1e5, 50, LogSpacing)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.ShellMasses(cone, shells, nil, IntegrationOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkShellMassesWholeSky integrates 50 log-spaced shells from 10 pc to 100 kpc over
// the whole sky (graded Galactic rectangle), all four components, default options.
func BenchmarkShellMassesWholeSky(b *testing.B) {
	m := DefaultModel()
	shells, _ := MakeShells(10, 1e5, 50, LogSpacing)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.ShellMasses(WholeSky(), shells, nil, IntegrationOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkShellSamplerSample draws positions in a thin-disc shell 500–3000 pc toward
// (90°, 15°), radius 5°.
func BenchmarkShellSamplerSample(b *testing.B) {
	m := DefaultModel()
	cone, _ := NewCone(90, 15, 5)
	ss, _ := m.NewShellSampler(cone, Shell{500, 3000}, ThinDiscName)
	r := rand.New(rand.NewPCG(1, 2))
	b.ReportAllocs()
	for b.Loop() {
		if _, _, _, err := ss.Sample(r); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkGalacticToICRS(b *testing.B) {
	b.ReportAllocs()
	var s float64
	l := 0.0
	for b.Loop() {
		ra, dec := GalacticToICRS(l, 30)
		s += ra + dec
		l += 0.1
	}
	_ = s
}

func BenchmarkAng2PixNested(b *testing.B) {
	h, _ := NewHEALPix(1024, Nested)
	b.ReportAllocs()
	var s int64
	th := 0.0
	for b.Loop() {
		s += h.Ang2Pix(th, 1.3)
		th += 1e-4
		if th > math.Pi {
			th = 0
		}
	}
	_ = s
}

func BenchmarkPoissonCount(b *testing.B) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, lam := range []float64{3, 1000} {
		b.Run(map[float64]string{3: "mean3", 1000: "mean1000"}[lam], func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := PoissonCount(lam, r); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkDensityModel(b *testing.B) {
	m := DefaultModel()
	b.ReportAllocs()
	var s float64
	x := -8000.0
	for b.Loop() {
		s += m.DensityMsunPc3(x, 100, 300)
		x += 0.01
	}
	_ = s
}

// BenchmarkNewShellSampler10deg2 builds the sampler for the thin disc in a 10 deg² cone at
// (45°, 60°), shell 1–30 kpc.
func BenchmarkNewShellSampler10deg2(b *testing.B) {
	m := DefaultModel()
	r := math.Acos(1-10/(2*math.Pi)*degToRad*degToRad) * radToDeg
	cone, _ := NewCone(45, 60, r)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.NewShellSampler(cone, Shell{1000, 30000}, ThinDiscName); err != nil {
			b.Fatal(err)
		}
	}
}
