package summary

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
)

// MaxReservoir is the largest reservoir capacity accepted.
const MaxReservoir = 10_000_000

// Point is one star as kept for plotting: colour and magnitude (mag), its
// evolutionary stage word, population component and whether it was detected.
type Point struct {
	Colour, Mag      float64
	Stage, Component string
	Detected         bool
}

type prioritised struct {
	pri uint64
	p   Point
}

// less is a total order: priority, then the point's fields, so ties (p ≈
// 2⁻⁶⁴ per pair) are still broken the same way in every run and merge order.
func (a prioritised) less(b prioritised) bool {
	if a.pri != b.pri {
		return a.pri < b.pri
	}
	if c := cmpFloat(a.p.Mag, b.p.Mag); c != 0 {
		return c < 0
	}
	if c := cmpFloat(a.p.Colour, b.p.Colour); c != 0 {
		return c < 0
	}
	if a.p.Stage != b.p.Stage {
		return a.p.Stage < b.p.Stage
	}
	if a.p.Component != b.p.Component {
		return a.p.Component < b.p.Component
	}
	return !a.p.Detected && b.p.Detected
}

func cmpFloat(a, b float64) int {
	if math.IsNaN(a) || math.IsNaN(b) { // NaN sorts first, consistently
		return cmp.Compare(boolInt(!math.IsNaN(a)), boolInt(!math.IsNaN(b)))
	}
	return cmp.Compare(a, b)
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

// Reservoir keeps a uniform random sample without replacement of at most
// Capacity points from a stream of any length, in memory bounded by the
// capacity. It is reservoir sampling with random keys (bottom-k sampling; the
// unit-weight case of Efraimidis & Spirakis 2006, Inf. Process. Lett. 97, 181
// — from memory): each offered point gets a uniform 64-bit priority and the k
// points of smallest priority are kept.
//
// Because the priority comes from the caller's stream, a sharded run whose
// chunks use the same per-chunk streams keeps exactly the same points after
// Merge as the unsharded run, in any merge order. Not safe for concurrent use.
type Reservoir struct {
	k    int
	seen int64
	heap []prioritised // max-heap on less
}

// NewReservoir returns an empty reservoir of the given capacity, in [1, 1e7].
func NewReservoir(capacity int) (*Reservoir, error) {
	if capacity < 1 || capacity > MaxReservoir {
		return nil, fmt.Errorf("summary: reservoir capacity %d outside allowed range [1, 10000000]", capacity)
	}
	return &Reservoir{k: capacity, heap: make([]prioritised, 0, min(capacity, 1<<16))}, nil
}

// Capacity returns the capacity; Seen the number of points offered (merged
// reservoirs add up); Len the number kept (min(Seen, Capacity)).
func (s *Reservoir) Capacity() int { return s.k }

// Seen returns the number of points offered, merged reservoirs included.
func (s *Reservoir) Seen() int64 { return s.seen }

// Len returns the number of points kept.
func (s *Reservoir) Len() int { return len(s.heap) }

// Offer considers one point. It takes exactly one value of r.Uint64 per call,
// whether the point is kept or not. It allocates nothing once the reservoir
// holds Capacity points (while filling, storage grows by amortised doubling
// beyond the first 65536 slots reserved at creation).
func (s *Reservoir) Offer(p Point, r *rand.Rand) {
	s.seen++
	s.push(prioritised{pri: r.Uint64(), p: p})
}

func (s *Reservoir) push(it prioritised) {
	if len(s.heap) < s.k {
		s.heap = append(s.heap, it)
		s.up(len(s.heap) - 1)
		return
	}
	if !it.less(s.heap[0]) {
		return
	}
	s.heap[0] = it
	s.down(0)
}

func (s *Reservoir) up(i int) {
	h := s.heap
	for i > 0 {
		parent := (i - 1) / 2
		if !h[parent].less(h[i]) {
			break
		}
		h[parent], h[i] = h[i], h[parent]
		i = parent
	}
}

func (s *Reservoir) down(i int) {
	h := s.heap
	n := len(h)
	for {
		l := 2*i + 1
		if l >= n {
			return
		}
		big := l
		if r := l + 1; r < n && h[l].less(h[r]) {
			big = r
		}
		if !h[i].less(h[big]) {
			return
		}
		h[i], h[big] = h[big], h[i]
		i = big
	}
}

// Merge adds the points of o (which must have the same capacity), keeping the
// Capacity points of smallest priority from both: the result is the same as
// if every point had been offered to one reservoir.
func (s *Reservoir) Merge(o *Reservoir) error {
	if s.k != o.k {
		return fmt.Errorf("summary: merge of reservoirs with capacities %d and %d (want equal)", s.k, o.k)
	}
	s.seen += o.seen
	for _, it := range o.sorted() {
		s.push(it)
	}
	return nil
}

func (s *Reservoir) sorted() []prioritised {
	out := slices.Clone(s.heap)
	slices.SortFunc(out, func(a, b prioritised) int {
		switch {
		case a.less(b):
			return -1
		case b.less(a):
			return 1
		}
		return 0
	})
	return out
}

// Points returns the kept points in increasing priority (a deterministic
// order that does not depend on offer or merge order). The slice is new.
func (s *Reservoir) Points() []Point {
	its := s.sorted()
	out := make([]Point, len(its))
	for i, it := range its {
		out[i] = it.p
	}
	return out
}
