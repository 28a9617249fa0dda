package observe

import (
	"math/rand/v2"
	"strings"
	"testing"
)

func BenchmarkObserve(b *testing.B) {
	tab, err := ParseErrorTable(strings.NewReader("mag mag_err\n16 0.004\n20 0.012\n23 0.1\n24 0.2\n"), "inline")
	if err != nil {
		b.Fatal(err)
	}
	specs := map[string]BandSpec{
		"ivezic2019":          {Band: "r", Limit5SigmaMag: 24.35, FloorMag: 0.005, SaturationMag: 16, Noise: IvezicNoise(0.039)},
		"ivezic2019+logistic": {Band: "r", Limit5SigmaMag: 24.35, FloorMag: 0.005, SaturationMag: 16, Noise: IvezicNoise(0.039), Completeness: LogisticCompleteness(0.98, 24, 0.25)},
		"background_limited":  {Band: "r", Limit5SigmaMag: 24.35, SaturationMag: 16, Noise: BackgroundLimitedNoise()},
		"table":               {Band: "r", Limit5SigmaMag: 24, SaturationMag: 16, Noise: TableNoise(tab)},
	}
	for _, name := range []string{"ivezic2019", "ivezic2019+logistic", "background_limited", "table"} {
		spec := specs[name]
		if err := spec.Validate(); err != nil {
			b.Fatal(err)
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			r := rand.New(rand.NewPCG(1, 2))
			var sink Measurement
			m := 18.0
			for b.Loop() {
				sink = spec.Observe(m, r)
				m += 0.001
				if m > 26 {
					m = 18
				}
			}
			_ = sink
		})
	}
}

func BenchmarkSurveyObserve5Bands(b *testing.B) {
	names := []string{"u", "g", "r", "i", "z"}
	var bands []BandSpec
	for i, n := range names {
		bands = append(bands, BandSpec{Band: n, Limit5SigmaMag: 23.5 + 0.2*float64(i), FloorMag: 0.005, SaturationMag: 16, Noise: IvezicNoise(0.039)})
	}
	s, err := NewSurvey(bands, nil)
	if err != nil {
		b.Fatal(err)
	}
	r := rand.New(rand.NewPCG(1, 2))
	mags := []float64{22, 21, 20.5, 20.3, 20.2}
	dst := make([]Measurement, len(mags))
	b.ReportAllocs()
	for b.Loop() {
		s.Observe(mags, r, dst)
	}
}
