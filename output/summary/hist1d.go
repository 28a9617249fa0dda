package summary

import (
	"fmt"
	"math"
)

// Hist1D is a streaming fixed-bin histogram of one quantity (e.g. magnitude).
// It keeps, per bin, a realised count (integers: one per Add) and an expected
// count (a sum of weights: AddExpected, e.g. detection probabilities times
// expected star numbers), with their Poisson uncertainties:
//
//	σ(N) = sqrt(N)                  realised counts (Poisson)
//	σ(E) = sqrt(Σ w²)               expected counts from weights (common practice)
//
// Values below Lo and at or above Hi go to underflow and overflow counters,
// NaN values to a NaN counter, so nothing is silently lost. Merge is exact and
// order-independent (integer counts, 128-bit fixed-point weight sums), so
// sharded runs combine to the same numbers as one run. Not safe for
// concurrent use; give each worker its own and Merge.
type Hist1D struct {
	bins   Binning
	counts []int64    // slots: 0 underflow, 1..N bins, N+1 overflow
	nan    int64      // NaN values offered to Add
	w, w2  []exactSum // weight and squared-weight sums per slot
	wNaN   exactSum   // weights offered with a NaN value
}

// NewHist1D returns an empty histogram on the binning b (from NewBinning).
func NewHist1D(b Binning) *Hist1D {
	if b.N < 1 || !(b.Lo < b.Hi) {
		panic("summary: NewHist1D with an invalid Binning (use NewBinning)")
	}
	return &Hist1D{bins: b, counts: make([]int64, b.N+2), w: make([]exactSum, b.N+2), w2: make([]exactSum, b.N+2)}
}

// Binning returns the histogram's binning.
func (h *Hist1D) Binning() Binning { return h.bins }

// Add counts one realised value x. No allocation.
func (h *Hist1D) Add(x float64) {
	s := h.bins.slot(x)
	if s < 0 {
		h.nan++
		return
	}
	h.counts[s]++
}

// AddExpected adds weight w (expected number of stars, ≥ 0) at x. It panics on
// a weight that is negative, NaN or above MaxWeight (a caller bug). The weight
// of a NaN x goes to ExpectedNaN. No allocation.
func (h *Hist1D) AddExpected(x, w float64) {
	checkWeight(w)
	s := h.bins.slot(x)
	if s < 0 {
		h.wNaN.add(w)
		return
	}
	h.w[s].add(w)
	h.w2[s].add(w * w)
}

// Merge adds the contents of o, which must have the same binning.
func (h *Hist1D) Merge(o *Hist1D) error {
	if !h.bins.same(o.bins) {
		return fmt.Errorf("summary: merge of histograms with different binnings %+v and %+v", h.bins, o.bins)
	}
	for i := range h.counts {
		h.counts[i] += o.counts[i]
		h.w[i].merge(o.w[i])
		h.w2[i].merge(o.w2[i])
	}
	h.nan += o.nan
	h.wNaN.merge(o.wNaN)
	return nil
}

// Clone returns an independent copy.
func (h *Hist1D) Clone() *Hist1D {
	c := NewHist1D(h.bins)
	_ = c.Merge(h)
	return c
}

// Count returns the realised count in bin i (0 ≤ i < N; panics outside).
func (h *Hist1D) Count(i int) int64 { return h.counts[h.check(i)] }

// Expected returns the expected count (sum of weights) in bin i.
func (h *Hist1D) Expected(i int) float64 { return h.w[h.check(i)].value() }

// ExpectedErr returns sqrt(Σ w²) in bin i.
func (h *Hist1D) ExpectedErr(i int) float64 { return math.Sqrt(h.w2[h.check(i)].value()) }

// CountErr returns the Poisson uncertainty sqrt(N) of bin i.
func (h *Hist1D) CountErr(i int) float64 { return math.Sqrt(float64(h.Count(i))) }

// Underflow returns the realised count below Lo; Overflow at or above Hi; NaN
// the number of NaN values.
func (h *Hist1D) Underflow() int64 { return h.counts[0] }

// Overflow returns the realised count at or above Hi.
func (h *Hist1D) Overflow() int64 { return h.counts[h.bins.N+1] }

// NaN returns the number of NaN values given to Add.
func (h *Hist1D) NaN() int64 { return h.nan }

// ExpectedNaN returns the sum of the weights given to AddExpected with a NaN value.
func (h *Hist1D) ExpectedNaN() float64 { return h.wNaN.value() }

// ExpectedUnderflow returns the expected count below Lo.
func (h *Hist1D) ExpectedUnderflow() float64 { return h.w[0].value() }

// ExpectedOverflow returns the expected count at or above Hi.
func (h *Hist1D) ExpectedOverflow() float64 { return h.w[h.bins.N+1].value() }

// Total returns the realised count over all slots, NaN excluded.
func (h *Hist1D) Total() int64 {
	var t int64
	for _, c := range h.counts {
		t += c
	}
	return t
}

// ExpectedTotal returns the expected count over all slots, NaN excluded.
func (h *Hist1D) ExpectedTotal() float64 {
	var s exactSum
	for _, w := range h.w {
		s.merge(w)
	}
	return s.value()
}

// Cumulative returns, for each bin i, the realised count N(< Edge(i+1)) of
// all values below the bin's upper edge (underflow included) and its Poisson
// uncertainty sqrt(N); and the same for the expected counts (sqrt(Σ w²)).
// All four slices have N elements.
func (h *Hist1D) Cumulative() (count, countErr, expected, expectedErr []float64) {
	n := h.bins.N
	count, countErr = make([]float64, n), make([]float64, n)
	expected, expectedErr = make([]float64, n), make([]float64, n)
	c := h.counts[0]
	w, w2 := h.w[0], h.w2[0]
	for i := 0; i < n; i++ {
		c += h.counts[i+1]
		w.merge(h.w[i+1])
		w2.merge(h.w2[i+1])
		count[i], countErr[i] = float64(c), math.Sqrt(float64(c))
		expected[i], expectedErr[i] = w.value(), math.Sqrt(w2.value())
	}
	return count, countErr, expected, expectedErr
}

func (h *Hist1D) check(i int) int {
	if i < 0 || i >= h.bins.N {
		panic(fmt.Sprintf("summary: bin index %d outside [0, %d)", i, h.bins.N))
	}
	return i + 1
}
