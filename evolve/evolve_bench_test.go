package evolve_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/starmock/starmock/evolve"
)

// kroupaInverse draws a mass from the Kroupa (2001) IMF on [0.08, 150] Msun
// (slopes 1.3 below and 2.3 above 0.5 Msun) by inverting its CDF; a local
// copy so that the benchmark does not depend on the imf package.
func kroupaInverse(u float64) float64 {
	const lo, br, hi = 0.08, 0.5, 150.0
	const a1, a2 = 1.3, 2.3
	// unnormalised integrals of m^-a on each segment, continuous at the break
	i1 := (math.Pow(br, 1-a1) - math.Pow(lo, 1-a1)) / (1 - a1)
	k := math.Pow(br, a2-a1) // continuity factor for the second segment
	i2 := k * (math.Pow(hi, 1-a2) - math.Pow(br, 1-a2)) / (1 - a2)
	x := u * (i1 + i2)
	if x < i1 {
		return math.Pow(math.Pow(lo, 1-a1)+x*(1-a1), 1/(1-a1))
	}
	return math.Pow(math.Pow(br, 1-a2)+(x-i1)/k*(1-a2), 1/(1-a2))
}

// BenchmarkEvolveKroupa measures one Evolve call averaged over a
// Kroupa-sampled population with ages uniform in 0–12 Gyr at solar Z.
func BenchmarkEvolveKroupa(b *testing.B) {
	for _, z := range []float64{0.02, 0.001} {
		b.Run(map[float64]string{0.02: "Z0.02", 0.001: "Z0.001"}[z], func(b *testing.B) {
			m, err := evolve.NewModel(z)
			if err != nil {
				b.Fatal(err)
			}
			r := rand.New(rand.NewPCG(1, 2))
			const n = 1 << 16
			mass := make([]float64, n)
			age := make([]float64, n)
			for i := range mass {
				mass[i] = kroupaInverse(r.Float64())
				age[i] = 12e9 * r.Float64()
			}
			b.ReportAllocs()
			b.ResetTimer()
			var sink float64
			for i := 0; i < b.N; i++ {
				s, err := m.Evolve(mass[i&(n-1)], age[i&(n-1)])
				if err != nil {
					b.Fatal(err)
				}
				sink += s.LuminosityLsun
			}
			_ = sink
		})
	}
}

// BenchmarkNewModel measures the per-metallicity precomputation.
func BenchmarkNewModel(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := evolve.NewModel(0.0001 + 0.0299*float64(i%100)/100); err != nil {
			b.Fatal(err)
		}
	}
}
