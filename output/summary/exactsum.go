package summary

import (
	"math"
	"math/bits"
)

// MaxWeight is the largest weight accepted by the AddExpected methods (2^53).
const MaxWeight = 1 << 53

// exactSum is a non-negative sum held as a 128-bit unsigned fixed-point
// number with 64 fractional bits: value = hi + lo·2⁻⁶⁴. Integer addition is
// associative and commutative, so sums merged from shards in any order are
// bit-identical to the sum of an unsharded run. Each added weight is
// truncated to a multiple of 2⁻⁶⁴ (an absolute error below 5.5e−20 per term).
type exactSum struct{ hi, lo uint64 }

// add adds w, which must be finite and in [0, MaxWeight] (checked by callers).
// It panics if the sum reaches 2^64 (far beyond any star count).
func (s *exactSum) add(w float64) {
	if w == 0 {
		return
	}
	frac, exp := math.Frexp(w)       // w = frac·2^exp, frac in [0.5, 1)
	mant := uint64(frac * (1 << 53)) // exact: 53 significant bits
	sh := exp + 11                   // w·2^64 = mant·2^(exp−53+64)
	var hi, lo uint64
	switch {
	case sh >= 64:
		hi = mant << uint(sh-64)
	case sh >= 0:
		lo = mant << uint(sh)
		hi = mant >> uint(64-sh)
	case sh > -64:
		lo = mant >> uint(-sh) // truncation below 2^-64
	}
	var c uint64
	s.lo, c = bits.Add64(s.lo, lo, 0)
	s.hi, c = bits.Add64(s.hi, hi, c)
	if c != 0 {
		panic("summary: weight sum overflow (above 2^64)")
	}
}

// merge adds another exact sum.
func (s *exactSum) merge(o exactSum) {
	var c uint64
	s.lo, c = bits.Add64(s.lo, o.lo, 0)
	s.hi, c = bits.Add64(s.hi, o.hi, c)
	if c != 0 {
		panic("summary: weight sum overflow (above 2^64)")
	}
}

// value returns the sum as a float64 (correctly rounded to within one ulp).
func (s exactSum) value() float64 {
	return float64(s.hi) + float64(s.lo)*0x1p-64
}

// checkWeight panics on a weight outside [0, MaxWeight] or NaN (a caller bug).
func checkWeight(w float64) {
	if !(w >= 0 && w <= MaxWeight) {
		panic("summary: weight outside [0, 2^53] or NaN")
	}
}
