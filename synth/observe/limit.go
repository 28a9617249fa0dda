package observe

import "math"

// MaxNormalDeviate is the largest |z| that Observe can draw: the inverse normal
// CDF of the outermost point (1 − 2⁻⁵⁴) of its uniform grid, about 8.29. No
// measured flux exceeds f + MaxNormalDeviate·σ_f.
var MaxNormalDeviate = normalFromBits(math.MaxUint64)

// ExactFaintLimit returns a true magnitude beyond which Observe can never
// report a detection in this band, and true; or +Inf and false when no such
// magnitude exists (every magnitude keeps a non-zero, if tiny, probability).
// Two things make a detection impossible:
//
//   - the completeness is exactly 0: a completeness table whose rows reach 0
//     at magnitude m0 (c = 0 for all m ≥ m0);
//   - the S/N threshold t exceeds MaxNormalDeviate and the noise-free S/N is
//     below t − MaxNormalDeviate, since f_obs/σ_f ≤ f/σ_f + MaxNormalDeviate.
//
// The S/N boundary is found by bisection on the monotone ExpectedSNR to
// 1e−9 mag and moved 1e−6 mag fainter, so that every star fainter than the
// returned limit is certainly undetectable (the bound is safe, not tight by
// more than 1e−6 mag). Panics if Validate has not succeeded.
func (b *BandSpec) ExactFaintLimit() (float64, bool) {
	b.mustBeReady()
	limit := math.Inf(1)
	if b.Completeness.Kind == CompletenessFromTable {
		t := b.Completeness.Table
		for i, c := range t.frac {
			if c == 0 {
				limit = t.magAB[i]
				break
			}
		}
	}
	if need := b.threshold - MaxNormalDeviate; need > 0 {
		// ExpectedSNR decreases with magnitude; find where it crosses need.
		lo, hi := b.Limit5SigmaMag-40, b.Limit5SigmaMag+40
		if b.ExpectedSNR(hi) < need && b.ExpectedSNR(lo) >= need {
			for hi-lo > 1e-9 {
				mid := 0.5 * (lo + hi)
				if b.ExpectedSNR(mid) >= need {
					lo = mid
				} else {
					hi = mid
				}
			}
			limit = math.Min(limit, hi+1e-6)
		}
	}
	return limit, !math.IsInf(limit, 1)
}

// MagAtProbability returns the faintest true magnitude at which
// DetectionProbability is still at least p (p in (0, 1); panics otherwise, a
// caller bug), found by bisection to 1e−9 mag between the saturation
// magnitude (or m5 − 40 without saturation) and m5 + 40; it returns NaN if
// even the brightest unsaturated magnitude has a lower probability (e.g. a
// completeness ceiling below p), and m5 + 40 if the probability stays above p
// there. DetectionProbability decreases with magnitude for every model of
// this package (S/N falls and completeness does not rise with magnitude), so
// the bisection is well defined. Panics if Validate has not succeeded.
func (b *BandSpec) MagAtProbability(p float64) float64 {
	b.mustBeReady()
	if !(p > 0 && p < 1) {
		panic("observe: MagAtProbability: p outside (0, 1)")
	}
	lo := b.Limit5SigmaMag - 40
	if !math.IsInf(b.SaturationMag, -1) {
		lo = b.SaturationMag
	}
	hi := b.Limit5SigmaMag + 40
	if b.DetectionProbability(lo) < p {
		return math.NaN()
	}
	if b.DetectionProbability(hi) >= p {
		return hi
	}
	for hi-lo > 1e-9 {
		mid := 0.5 * (lo + hi)
		if b.DetectionProbability(mid) >= p {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}
