package summary

import (
	"fmt"
	"math"
)

// Hist2D is a streaming two-dimensional fixed-bin histogram, used for Hess
// diagrams (X = colour, Y = magnitude). Like Hist1D it keeps realised counts
// and expected weight sums per cell, merges exactly, and counts values
// outside the grid (Outside) and NaN pairs (NaN) instead of dropping them.
type Hist2D struct {
	x, y    Binning
	counts  []int64 // cell (ix, iy) at iy*x.N + ix
	w, w2   []exactSum
	outside int64
	nan     int64
	wOut    exactSum
	wNaN    exactSum
}

// NewHist2D returns an empty histogram on the binnings x and y.
func NewHist2D(x, y Binning) *Hist2D {
	if x.N < 1 || y.N < 1 || !(x.Lo < x.Hi) || !(y.Lo < y.Hi) {
		panic("summary: NewHist2D with an invalid Binning (use NewBinning)")
	}
	n := x.N * y.N
	return &Hist2D{x: x, y: y, counts: make([]int64, n), w: make([]exactSum, n), w2: make([]exactSum, n)}
}

// Binnings returns the X and Y binnings.
func (h *Hist2D) Binnings() (x, y Binning) { return h.x, h.y }

func (h *Hist2D) cell(x, y float64) (int, bool) {
	sx, sy := h.x.slot(x), h.y.slot(y)
	if sx < 0 || sy < 0 {
		return -1, false
	}
	if sx == 0 || sx == h.x.N+1 || sy == 0 || sy == h.y.N+1 {
		return -1, true
	}
	return (sy-1)*h.x.N + (sx - 1), true
}

// Add counts one realised point. No allocation.
func (h *Hist2D) Add(x, y float64) {
	c, ok := h.cell(x, y)
	switch {
	case !ok:
		h.nan++
	case c < 0:
		h.outside++
	default:
		h.counts[c]++
	}
}

// AddExpected adds weight w ≥ 0 at (x, y); panics on a negative, NaN or too
// large weight (a caller bug). Weights outside the grid go to
// ExpectedOutside, those with a NaN coordinate to ExpectedNaN.
func (h *Hist2D) AddExpected(x, y, w float64) {
	checkWeight(w)
	c, ok := h.cell(x, y)
	switch {
	case !ok:
		h.wNaN.add(w)
	case c < 0:
		h.wOut.add(w)
	default:
		h.w[c].add(w)
		h.w2[c].add(w * w)
	}
}

// Merge adds o, which must have the same binnings.
func (h *Hist2D) Merge(o *Hist2D) error {
	if !h.x.same(o.x) || !h.y.same(o.y) {
		return fmt.Errorf("summary: merge of 2-d histograms with different binnings")
	}
	for i := range h.counts {
		h.counts[i] += o.counts[i]
		h.w[i].merge(o.w[i])
		h.w2[i].merge(o.w2[i])
	}
	h.outside += o.outside
	h.nan += o.nan
	h.wOut.merge(o.wOut)
	h.wNaN.merge(o.wNaN)
	return nil
}

// Clone returns an independent copy.
func (h *Hist2D) Clone() *Hist2D {
	c := NewHist2D(h.x, h.y)
	_ = c.Merge(h)
	return c
}

func (h *Hist2D) idx(ix, iy int) int {
	if ix < 0 || ix >= h.x.N || iy < 0 || iy >= h.y.N {
		panic(fmt.Sprintf("summary: cell (%d, %d) outside [0, %d) × [0, %d)", ix, iy, h.x.N, h.y.N))
	}
	return iy*h.x.N + ix
}

// Count returns the realised count of cell (ix, iy); panics outside the grid.
func (h *Hist2D) Count(ix, iy int) int64 { return h.counts[h.idx(ix, iy)] }

// Expected returns the expected count of cell (ix, iy).
func (h *Hist2D) Expected(ix, iy int) float64 { return h.w[h.idx(ix, iy)].value() }

// ExpectedErr returns sqrt(Σ w²) of cell (ix, iy).
func (h *Hist2D) ExpectedErr(ix, iy int) float64 { return math.Sqrt(h.w2[h.idx(ix, iy)].value()) }

// Outside returns the realised count of points outside the grid; NaN the
// number of points with a NaN coordinate.
func (h *Hist2D) Outside() int64 { return h.outside }

// NaN returns the number of points with a NaN coordinate.
func (h *Hist2D) NaN() int64 { return h.nan }

// ExpectedOutside returns the expected count outside the grid.
func (h *Hist2D) ExpectedOutside() float64 { return h.wOut.value() }

// ExpectedNaN returns the weights given with a NaN coordinate.
func (h *Hist2D) ExpectedNaN() float64 { return h.wNaN.value() }

// Total returns the realised count inside the grid.
func (h *Hist2D) Total() int64 {
	var t int64
	for _, c := range h.counts {
		t += c
	}
	return t
}

// MaxCount returns the largest realised cell count.
func (h *Hist2D) MaxCount() int64 {
	var m int64
	for _, c := range h.counts {
		m = max(m, c)
	}
	return m
}
