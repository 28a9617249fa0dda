package summary

import (
	"math/rand/v2"
	"testing"
)

func BenchmarkHist1DAdd(b *testing.B) {
	h := NewHist1D(mustBins(b, 10, 30, 80))
	r := rand.New(rand.NewPCG(1, 1))
	xs := make([]float64, 1024)
	for i := range xs {
		xs[i] = 10 + 20*r.Float64()
	}
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		h.Add(xs[i&1023])
		h.AddExpected(xs[i&1023], 0.5)
		i++
	}
}

func BenchmarkStarCountsAdd(b *testing.B) {
	s, _ := NewStarCounts([]string{"g", "r", "i"}, mustBins(b, 10, 30, 80))
	stages := []string{"main_sequence", "red_giant_branch", "core_helium_burning"}
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		s.Add(i%3, "thin_disc", stages[i%3], 10+float64(i%200)*0.1)
		i++
	}
}

func BenchmarkReservoirOffer(b *testing.B) {
	s, _ := NewReservoir(10000)
	r := rand.New(rand.NewPCG(1, 1))
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		s.Offer(Point{Colour: 0.5, Mag: float64(i % 1000), Stage: "main_sequence", Component: "cluster"}, r)
		i++
	}
}
