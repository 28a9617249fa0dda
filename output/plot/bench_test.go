package plot

import (
	"io"
	"math/rand/v2"
	"testing"

	"github.com/starmock/starmock/output/summary"
)

func BenchmarkCMD10k(b *testing.B) {
	r := rand.New(rand.NewPCG(1, 1))
	ps := make([]summary.Point, 10000)
	stages := []string{"main_sequence", "subgiant", "red_giant_branch", "core_helium_burning"}
	for i := range ps {
		m := 14 + 10*r.Float64()
		ps[i] = summary.Point{Colour: 0.3 + 0.1*(m-14) + 0.05*r.NormFloat64(), Mag: m, Stage: stages[i%4], Detected: i%2 == 0}
	}
	pts := PointsFromSample(ps)
	opt := CMDOptions{ColourLabel: "g − r [mag]", MagLabel: "r [mag]"}
	b.ReportAllocs()
	for b.Loop() {
		if err := CMD(io.Discard, pts, opt); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkHess(b *testing.B) {
	cb, _ := summary.NewBinning(-0.5, 2.5, 60)
	mb, _ := summary.NewBinning(12, 26, 70)
	h := summary.NewHist2D(cb, mb)
	r := rand.New(rand.NewPCG(2, 2))
	for range 50000 {
		m := 14 + 11*r.Float64()
		h.Add(0.4+0.12*(m-14)+0.06*r.NormFloat64(), m)
	}
	opt := HessOptions{ColourLabel: "g − r [mag]", MagLabel: "r [mag]"}
	b.ReportAllocs()
	for b.Loop() {
		if err := Hess(io.Discard, h, opt); err != nil {
			b.Fatal(err)
		}
	}
}
