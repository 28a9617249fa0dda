package summary

import (
	"math"
	"math/rand/v2"
	"testing"
)

func TestReservoirUniform(t *testing.T) {
	t.Parallel()
	// Each of n = 50 points must be kept with probability k/n = 0.2. Over
	// 20000 trials the count per point is binomial(20000, 0.2): mean 4000,
	// σ = 56.6; tolerance 4.5σ = 255 (false alarm ~ 7e-6 per point, 3e-4 in all).
	const n, k, trials = 50, 10, 20000
	hits := make([]int, n)
	r := rand.New(rand.NewPCG(2, 7))
	for range trials {
		s, _ := NewReservoir(k)
		for i := range n {
			s.Offer(Point{Mag: float64(i)}, r)
		}
		if s.Len() != k || s.Seen() != n {
			t.Fatalf("len %d seen %d", s.Len(), s.Seen())
		}
		for _, p := range s.Points() {
			hits[int(p.Mag)]++
		}
	}
	mean := float64(trials) * k / n
	tol := 4.5 * math.Sqrt(trials*0.2*0.8)
	for i, h := range hits {
		if math.Abs(float64(h)-mean) > tol {
			t.Errorf("point %d kept %d times, want %.0f ± %.0f", i, h, mean, tol)
		}
	}
}

// chunkStream is the stream of chunk c (the pipeline seeds one per chunk).
func chunkStream(c int) *rand.Rand { return rand.New(rand.NewPCG(99, uint64(c))) }

func TestReservoirShardedEqualsWhole(t *testing.T) {
	t.Parallel()
	const chunks, perChunk = 12, 500
	offer := func(s *Reservoir, c int) {
		r := chunkStream(c)
		for i := range perChunk {
			s.Offer(Point{Colour: float64(c), Mag: float64(i), Stage: "main_sequence", Detected: i%2 == 0}, r)
		}
	}
	whole, _ := NewReservoir(300)
	for c := range chunks {
		offer(whole, c)
	}
	shards := make([]*Reservoir, 3)
	for i := range shards {
		shards[i], _ = NewReservoir(300)
	}
	for c := range chunks {
		offer(shards[c%3], c)
	}
	merged, _ := NewReservoir(300)
	for _, i := range []int{1, 2, 0} {
		if err := merged.Merge(shards[i]); err != nil {
			t.Fatal(err)
		}
	}
	a, b := whole.Points(), merged.Points()
	if len(a) != 300 || len(b) != 300 || merged.Seen() != chunks*perChunk {
		t.Fatalf("lengths %d %d seen %d", len(a), len(b), merged.Seen())
	}
	for i := range a {
		if a[i] != b[i] {
			t.Fatalf("point %d: whole %+v, merged %+v", i, a[i], b[i])
		}
	}
	other, _ := NewReservoir(5)
	if err := merged.Merge(other); err == nil {
		t.Error("merge of different capacities accepted")
	}
	if _, err := NewReservoir(0); err == nil {
		t.Error("capacity 0 accepted")
	}
}

type countingSource struct {
	rand.Source
	n int
}

func (c *countingSource) Uint64() uint64 { c.n++; return c.Source.Uint64() }

func TestReservoirOneDrawPerOffer(t *testing.T) {
	src := &countingSource{Source: rand.NewPCG(1, 1)}
	r := rand.New(src)
	s, _ := NewReservoir(3)
	for i := range 20 {
		s.Offer(Point{Mag: float64(i)}, r)
		if src.n != i+1 {
			t.Fatalf("after %d offers %d draws", i+1, src.n)
		}
	}
	if a := testing.AllocsPerRun(1000, func() { s.Offer(Point{Mag: 1}, r) }); a != 0 {
		t.Errorf("Offer on a full reservoir allocates %v", a)
	}
}
