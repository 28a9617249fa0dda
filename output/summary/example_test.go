package summary_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/starmock/starmock/output/summary"
)

// Realised counts per magnitude bin with Poisson errors sqrt(N), and the
// cumulative counts N(<m) at the bins' upper edges (underflow included).
func ExampleHist1D_Cumulative() {
	b, _ := summary.NewBinning(18, 21, 3)
	h := summary.NewHist1D(b)
	for _, m := range []float64{17.5, 18.2, 18.9, 19.4, 20.1, 20.5, 20.7, 20.9, 22} {
		h.Add(m)
	}
	n, nErr, _, _ := h.Cumulative()
	for i := 0; i < b.N; i++ {
		fmt.Printf("[%g, %g): %d ± %.2f   N(<%g) = %g ± %.2f\n", b.Edge(i), b.Edge(i+1), h.Count(i), h.CountErr(i), b.Edge(i+1), n[i], nErr[i])
	}
	// Output:
	// [18, 19): 2 ± 1.41   N(<19) = 3 ± 1.73
	// [19, 20): 1 ± 1.00   N(<20) = 4 ± 2.00
	// [20, 21): 4 ± 2.00   N(<21) = 8 ± 2.83
}

// Two shards sampled with the same per-chunk streams give, after Merge, the
// same points as one reservoir fed with everything.
func ExampleReservoir_Merge() {
	stream := func(chunk int) *rand.Rand { return rand.New(rand.NewPCG(7, uint64(chunk))) }
	feed := func(s *summary.Reservoir, chunk int) {
		r := stream(chunk)
		for i := range 100 {
			s.Offer(summary.Point{Mag: float64(chunk*100 + i), Stage: "main_sequence"}, r)
		}
	}
	whole, _ := summary.NewReservoir(5)
	a, _ := summary.NewReservoir(5)
	b, _ := summary.NewReservoir(5)
	for c := range 4 {
		feed(whole, c)
		if c%2 == 0 {
			feed(a, c)
		} else {
			feed(b, c)
		}
	}
	_ = b.Merge(a)
	same := true
	for i, p := range whole.Points() {
		same = same && p == b.Points()[i]
	}
	fmt.Println(b.Seen(), b.Len(), same)
	// Output:
	// 400 5 true
}
