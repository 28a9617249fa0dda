package summary

import (
	"fmt"
	"math"
)

// MaxBins is the largest number of bins of one Binning axis.
const MaxBins = 100000

// Binning is a fixed-width binning of [Lo, Hi) into N bins of width
// (Hi − Lo)/N. Bin i holds Lo + i·w ≤ x < Lo + (i+1)·w, with the index found
// as floor((x − Lo)/w) (so a value on an edge may fall either side by one
// rounding of that division; the choice is deterministic).
type Binning struct {
	Lo, Hi float64
	N      int
}

// NewBinning returns the binning of [lo, hi) into n bins. lo and hi must be
// finite with lo < hi and n in [1, 100000].
func NewBinning(lo, hi float64, n int) (Binning, error) {
	if math.IsNaN(lo) || math.IsInf(lo, 0) || math.IsNaN(hi) || math.IsInf(hi, 0) || !(lo < hi) {
		return Binning{}, fmt.Errorf("summary: binning range [%v, %v) invalid (want finite lo < hi)", lo, hi)
	}
	if n < 1 || n > MaxBins {
		return Binning{}, fmt.Errorf("summary: binning count %d outside allowed range [1, 100000]", n)
	}
	return Binning{Lo: lo, Hi: hi, N: n}, nil
}

// NewBinningWidth returns the binning of [lo, lo + n·width) with n = ceil((hi −
// lo)/width) bins of the given width, so that hi is covered.
func NewBinningWidth(lo, hi, width float64) (Binning, error) {
	if !(width > 0) || math.IsInf(width, 0) {
		return Binning{}, fmt.Errorf("summary: bin width %v invalid (want a finite value > 0)", width)
	}
	nf := math.Ceil((hi-lo)/width - 1e-9)
	if !(nf >= 1 && nf <= MaxBins) {
		return Binning{}, fmt.Errorf("summary: binning [%v, %v) with width %v gives %v bins, outside allowed range [1, 100000]", lo, hi, width, nf)
	}
	n := int(nf)
	return NewBinning(lo, lo+float64(n)*width, n)
}

// Width returns the bin width.
func (b Binning) Width() float64 { return (b.Hi - b.Lo) / float64(b.N) }

// Edge returns the lower edge of bin i (i in [0, N]; Edge(N) = Hi).
func (b Binning) Edge(i int) float64 {
	if i == b.N {
		return b.Hi
	}
	return b.Lo + float64(i)*b.Width()
}

// Centre returns the centre of bin i.
func (b Binning) Centre(i int) float64 { return b.Lo + (float64(i)+0.5)*b.Width() }

// slot returns 0 for x < Lo, i+1 for bin i, N+1 for x ≥ Hi, and −1 for NaN.
func (b Binning) slot(x float64) int {
	if math.IsNaN(x) {
		return -1
	}
	if x < b.Lo {
		return 0
	}
	if x >= b.Hi {
		return b.N + 1
	}
	i := int((x - b.Lo) / b.Width())
	if i >= b.N { // rounding just below Hi
		i = b.N - 1
	}
	return i + 1
}

// Index returns the bin of x, or −1 below Lo (and for NaN) and N at or above Hi.
func (b Binning) Index(x float64) int {
	s := b.slot(x)
	if s < 0 {
		return -1
	}
	return s - 1
}

func (b Binning) same(o Binning) bool { return b == o }
