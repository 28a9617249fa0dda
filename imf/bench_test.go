package imf_test

import (
	"math/rand/v2"
	"path/filepath"
	"testing"

	"github.com/starmock/starmock/imf"
)

// BenchmarkRand measures one draw (quantile of one uniform) per iteration
// for each form, with a seeded PCG source. Targets (issue 2): >= 30 M/s per
// core for the power laws, >= 10 M/s for Chabrier. Mdraws/cpu-s divides by
// the process CPU time instead of wall time, the fairer per-core figure on
// a shared machine.
func BenchmarkRand(b *testing.B) {
	for _, c := range []struct {
		name string
		spec imf.Spec
	}{
		{"salpeter", imf.Spec{Kind: "salpeter"}},
		{"kroupa", imf.Spec{Kind: "kroupa", LoMsun: 0.01, HiMsun: 150}},
		{"chabrier_single", imf.Spec{Kind: "chabrier_single", LoMsun: 0.01, HiMsun: 150}},
		{"chabrier_system", imf.Spec{Kind: "chabrier_system"}},
		{"broken_power_law_5seg", imf.Spec{Kind: "broken_power_law", Breaks: []float64{0.2, 0.5, 1, 5}, Slopes: []float64{0.5, 1.3, 2.0, 2.3, 2.7}}},
		{"table_8nodes", imf.Spec{Kind: "table", TablePath: filepath.Join("testdata", "table_invented.txt")}},
		{"table_14nodes", imf.Spec{Kind: "table", TablePath: filepath.Join("testdata", "table_invented_fine.txt")}},
	} {
		f, err := imf.New(c.spec)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(c.name, func(b *testing.B) {
			r := rand.New(rand.NewPCG(1, 1))
			b.ReportAllocs()
			sum := 0.0
			cpu0 := processCPUSeconds()
			for b.Loop() {
				sum += f.Rand(r)
			}
			cpu := processCPUSeconds() - cpu0
			b.ReportMetric(float64(b.N)/b.Elapsed().Seconds()/1e6, "Mdraws/s")
			if cpu > 0 {
				// Throughput per CPU-second of this process (GC and runtime
				// included; nothing allocates, so this is the sampling loop).
				b.ReportMetric(float64(b.N)/cpu/1e6, "Mdraws/cpu-s")
			}
			_ = sum
		})
	}
}

// BenchmarkSampleTotalMass draws 1e4 Msun of Kroupa stars into a reused
// buffer (no allocation after the first call).
func BenchmarkSampleTotalMass(b *testing.B) {
	f, err := imf.NewKroupa(0.08, 150)
	if err != nil {
		b.Fatal(err)
	}
	r := rand.New(rand.NewPCG(1, 1))
	buf := make([]float64, 0, 40000)
	b.ReportAllocs()
	for b.Loop() {
		buf, _ = imf.SampleTotalMass(f, 1e4, r, buf)
	}
}
