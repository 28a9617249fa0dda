package imf

import (
	"math"
	"math/rand/v2"
)

// segment is one power-law piece dN/dm = c (m/lo)^-alpha on [lo, hi), with
// everything the hot paths need precomputed. All integrals are written with
// expm1/log1p so that slopes near alpha = 1 (number) or alpha = 2 (mass)
// keep full precision; alpha exactly 1 or 2 uses the logarithmic limit.
//
// With beta = 1 - alpha and L = ln(hi/lo), the number of stars in [lo, m] is
//
//	N(m) = c lo E(beta, ln(m/lo)),  E(b, x) = expm1(b x)/b  (= x for b = 0)
//
// and the mass is c lo^2 E(2 - alpha, ln(m/lo)) (the elementary integral of
// m^-alpha and m^(1-alpha), written in ln m; common practice).
type segment struct {
	loMsun, hiMsun float64
	alpha          float64
	beta           float64 // 1 - alpha
	beta2          float64 // 2 - alpha
	c              float64 // normalised density dN/dm at loMsun (Msun^-1)
	logRatio       float64 // L = ln(hi/lo)
	emL            float64 // expm1(beta L) (or L if beta == 0)
	invEmL         float64 // 1/emL
	invEm2L        float64 // 1/expm1(beta2 L) (or 1/L if beta2 == 0)
	pStart, pWidth float64 // CDF at lo; number fraction in the segment
	invBeta        float64 // 1/beta (0 if beta == 0)
	qScale         float64 // emL/pWidth: 1 + (p - pStart) qScale = 1 + t expm1(beta L)
	tScale         float64 // L/pWidth for beta == 0
	mStart, mWidth float64 // mass fraction below lo; mass fraction in the segment
}

// expm1Over returns E(b, x) = expm1(b x)/b, with the limit x at b = 0.
func expm1Over(b, x float64) float64 {
	if b == 0 {
		return x
	}
	return math.Expm1(b*x) / b
}

func expm1OrX(b, x float64) float64 {
	if b == 0 {
		return x
	}
	return math.Expm1(b * x)
}

// newSegment builds an unnormalised segment with density cRaw at loMsun and
// returns it together with its raw number and mass integrals.
func newSegment(loMsun, hiMsun, alpha, cRaw float64) (segment, float64, float64) {
	s := segment{loMsun: loMsun, hiMsun: hiMsun, alpha: alpha, beta: 1 - alpha, beta2: 2 - alpha, c: cRaw}
	s.logRatio = math.Log(hiMsun / loMsun)
	s.emL = expm1OrX(s.beta, s.logRatio)
	s.invEmL = 1 / s.emL
	s.invEm2L = 1 / expm1OrX(s.beta2, s.logRatio)
	n := cRaw * loMsun * expm1Over(s.beta, s.logRatio)
	m := cRaw * loMsun * loMsun * expm1Over(s.beta2, s.logRatio)
	return s, n, m
}

// prob returns the density at m inside the segment.
func (s *segment) prob(m float64) float64 {
	return s.c * math.Exp(-s.alpha*math.Log(m/s.loMsun))
}

// numberFrac returns the fraction of the segment's stars below m (lo <= m <= hi).
func (s *segment) numberFrac(m float64) float64 {
	x := math.Log(m / s.loMsun)
	if s.beta == 0 {
		return x * s.invEmL
	}
	return math.Expm1(s.beta*x) * s.invEmL
}

// massFrac returns the fraction of the segment's mass below m.
func (s *segment) massFrac(m float64) float64 {
	x := math.Log(m / s.loMsun)
	if s.beta2 == 0 {
		return x * s.invEm2L
	}
	return math.Expm1(s.beta2*x) * s.invEm2L
}

// setProb records the segment's place in the CDF and the derived
// quantile constants.
func (s *segment) setProb(pStart, pWidth float64) {
	s.pStart, s.pWidth = pStart, pWidth
	if s.beta != 0 {
		s.invBeta = 1 / s.beta
	}
	s.qScale = s.emL / pWidth
	s.tScale = s.logRatio / pWidth
}

// invert returns the mass at which the CDF equals p, for p inside the
// segment, inverting N(m)/N(hi) = t = (p - pStart)/pWidth:
//
//	m = lo exp(ln(1 + t expm1(beta L)) / beta)   (m = lo exp(t L) for beta = 0)
//
// ln(1 + u) is taken with a plain log rather than log1p: for small u it
// loses relative precision in the exponent x, but m = lo exp(x) needs only
// its absolute precision (~1e-16), and log is faster. log and exp are the
// table-driven fastLog/fastExp (fastmath.go, a few ulp). The result is kept
// inside [lo, hi] against rounding at the segment ends.
func (s *segment) invert(p float64) float64 {
	var m float64
	if s.beta == 0 {
		m = s.loMsun * fastExp((p-s.pStart)*s.tScale)
	} else {
		m = s.loMsun * fastExp(fastLog(1+(p-s.pStart)*s.qScale)*s.invBeta)
	}
	if m > s.hiMsun {
		m = s.hiMsun
	} else if !(m >= s.loMsun) { // also catches NaN from rounding below pStart
		m = s.loMsun
	}
	return m
}

// PowerLaw is a continuous piecewise power-law mass function,
//
//	dN/dm = c_i m^-alpha_i   for b_(i-1) <= m < b_i,
//
// with the c_i fixed by continuity at every break and by normalisation on
// [lo, hi]. Salpeter (1955), Kroupa (2001), user broken power laws and
// log–log interpolated tables are all of this form. Every quantity is
// closed-form: the CDF, the quantile (inverse CDF, analytic per segment), the
// mean mass and the number and mass fractions. Build one with NewSalpeter,
// NewKroupa, NewBrokenPowerLaw, ParseTable or LoadTable.
type PowerLaw struct {
	name    string
	segs    []segment
	pUpper  []float64 // CDF at the top of each segment but the last (compact, for findP)
	meanMsn float64
}

// newPowerLaw builds a normalised PowerLaw from segment edges (len k+1,
// strictly increasing) and slopes (len k), continuous at each interior edge,
// with raw density c0 at edges[0] (only ratios matter).
func newPowerLaw(name string, edges, alphas []float64) *PowerLaw {
	k := len(alphas)
	segs := make([]segment, k)
	raws := make([]float64, k)
	rawm := make([]float64, k)
	c := 1.0
	for i := 0; i < k; i++ {
		segs[i], raws[i], rawm[i] = newSegment(edges[i], edges[i+1], alphas[i], c)
		c *= math.Exp(-alphas[i] * segs[i].logRatio) // continuity: c_(i+1) = c_i (b_i/a_i)^-alpha_i
	}
	return finishPowerLaw(name, segs, raws, rawm)
}

func finishPowerLaw(name string, segs []segment, raws, rawm []float64) *PowerLaw {
	var nTot, mTot float64
	for i := range segs {
		nTot += raws[i]
		mTot += rawm[i]
	}
	var pc, mc float64
	for i := range segs {
		segs[i].c /= nTot
		segs[i].setProb(pc, raws[i]/nTot)
		segs[i].mStart, segs[i].mWidth = mc, rawm[i]/mTot
		pc += raws[i] / nTot
		mc += rawm[i] / mTot
	}
	pUpper := make([]float64, len(segs)-1)
	for i := range pUpper {
		pUpper[i] = segs[i+1].pStart
	}
	return &PowerLaw{name: name, segs: segs, pUpper: pUpper, meanMsn: mTot / nTot}
}

// find returns the index of the segment with lo <= m < hi (the last segment
// also holds hi). m must be inside [Bounds].
func (f *PowerLaw) find(m float64) int {
	segs := f.segs
	if len(segs) <= 8 {
		for i := 0; i < len(segs)-1; i++ {
			if m < segs[i].hiMsun {
				return i
			}
		}
		return len(segs) - 1
	}
	lo, hi := 0, len(segs)-1
	for lo < hi {
		mid := (lo + hi) / 2
		if m < segs[mid].hiMsun {
			hi = mid
		} else {
			lo = mid + 1
		}
	}
	return lo
}

// findP returns the segment holding cumulative probability p: the number
// of segment tops at or below p (linear scan of the compact pUpper for few
// segments, binary search otherwise).
func (f *PowerLaw) findP(p float64) int {
	up := f.pUpper
	if len(up) <= 8 {
		i := 0
		for i < len(up) && p >= up[i] {
			i++
		}
		return i
	}
	lo, hi := 0, len(up)
	for lo < hi {
		mid := int(uint(lo+hi) >> 1)
		if p >= up[mid] {
			lo = mid + 1
		} else {
			hi = mid
		}
	}
	return lo
}

// Name returns the kind word ("salpeter", "kroupa", "broken_power_law" or "table").
func (f *PowerLaw) Name() string { return f.name }

// Bounds returns the mass limits (Msun).
func (f *PowerLaw) Bounds() (loMsun, hiMsun float64) {
	return f.segs[0].loMsun, f.segs[len(f.segs)-1].hiMsun
}

// Breaks returns the interior break masses (Msun) inside (lo, hi) and the
// slopes alpha (dN/dm ∝ m^-alpha) of the len(breaks)+1 segments, as new slices.
func (f *PowerLaw) Breaks() (breaksMsun, slopes []float64) {
	for i, s := range f.segs {
		if i > 0 {
			breaksMsun = append(breaksMsun, s.loMsun)
		}
		slopes = append(slopes, s.alpha)
	}
	return breaksMsun, slopes
}

// Prob returns the normalised dN/dm (Msun^-1) at massMsun, 0 outside [lo, hi].
func (f *PowerLaw) Prob(massMsun float64) float64 {
	lo, hi := f.Bounds()
	if !(massMsun >= lo && massMsun <= hi) {
		return 0
	}
	return f.segs[f.find(massMsun)].prob(massMsun)
}

// CDF returns the fraction of stars below massMsun (0 below lo, 1 from hi;
// NaN for NaN).
func (f *PowerLaw) CDF(massMsun float64) float64 {
	lo, hi := f.Bounds()
	switch {
	case math.IsNaN(massMsun):
		return math.NaN()
	case massMsun <= lo:
		return 0
	case massMsun >= hi:
		return 1
	}
	s := &f.segs[f.find(massMsun)]
	return s.pStart + s.pWidth*s.numberFrac(massMsun)
}

// massBelow returns the fraction of the mass in stars below massMsun.
func (f *PowerLaw) massBelow(massMsun float64) float64 {
	lo, hi := f.Bounds()
	switch {
	case massMsun <= lo:
		return 0
	case massMsun >= hi:
		return 1
	}
	s := &f.segs[f.find(massMsun)]
	return s.mStart + s.mWidth*s.massFrac(massMsun)
}

// Quantile returns the mass (Msun) with CDF equal to p, inverting the
// segment's CDF analytically (see segment.invert). It panics if p is outside
// [0, 1] or NaN.
func (f *PowerLaw) Quantile(p float64) float64 {
	checkProb(p)
	if p == 1 {
		_, hi := f.Bounds()
		return hi
	}
	return f.quantile(p)
}

func (f *PowerLaw) quantile(p float64) float64 {
	return f.segs[f.findP(p)].invert(p)
}

// Mean returns the mean mass (Msun): the ratio of the closed-form mass and
// number integrals.
func (f *PowerLaw) Mean() float64 { return f.meanMsn }

// NumberFraction returns the fraction of stars with m1 <= m < m2. It panics
// if m1 > m2 or either is NaN.
func (f *PowerLaw) NumberFraction(m1, m2 float64) float64 {
	checkInterval(m1, m2)
	return f.CDF(m2) - f.CDF(m1)
}

// MassFraction returns the fraction of the total mass in stars with
// m1 <= m < m2. It panics if m1 > m2 or either is NaN.
func (f *PowerLaw) MassFraction(m1, m2 float64) float64 {
	checkInterval(m1, m2)
	return f.massBelow(m2) - f.massBelow(m1)
}

// Rand draws one mass (Msun) as Quantile(u) of one uniform u = r.Float64()
// in [0, 1). It does not allocate.
func (f *PowerLaw) Rand(r *rand.Rand) float64 {
	return f.quantile(r.Float64())
}

// NewBrokenPowerLaw returns the continuous broken power law
//
//	dN/dm ∝ m^-slopes[i]   between breaks[i-1] and breaks[i]
//
// (slopes[0] below breaks[0], slopes[len(breaks)] above the last break),
// truncated to [loMsun, hiMsun] and normalised there. breaksMsun must be
// positive, finite and strictly increasing; len(slopes) must equal
// len(breaksMsun)+1 and every slope must be finite. Limits of 0 select
// DefaultLoMsun and DefaultHiMsun; any 0 < lo < hi < +Inf is accepted.
// Errors wrap ErrInvalidSpec. The slices are copied.
func NewBrokenPowerLaw(breaksMsun, slopes []float64, loMsun, hiMsun float64) (*PowerLaw, error) {
	return newBroken(KindBrokenPowerLaw, breaksMsun, slopes, loMsun, hiMsun, 0, 0)
}

func newBroken(kind string, breaksMsun, slopes []float64, loMsun, hiMsun, minMsun, maxMsun float64) (*PowerLaw, error) {
	lo, hi, err := resolveLimits(kind, loMsun, hiMsun, DefaultLoMsun, DefaultHiMsun, minMsun, maxMsun)
	if err != nil {
		return nil, err
	}
	if len(slopes) != len(breaksMsun)+1 {
		return nil, specErrorf("%s needs len(slopes) = len(breaks)+1, got %d slopes for %d breaks", kind, len(slopes), len(breaksMsun))
	}
	for i, b := range breaksMsun {
		if math.IsNaN(b) || math.IsInf(b, 0) || b <= 0 {
			return nil, specErrorf("%s breaks_msun[%d]: %g Msun is not a positive finite mass", kind, i, b)
		}
		if i > 0 && b <= breaksMsun[i-1] {
			return nil, specErrorf("%s breaks_msun must be strictly increasing: breaks_msun[%d] is %g Msun after %g Msun", kind, i, b, breaksMsun[i-1])
		}
	}
	for i, a := range slopes {
		if math.IsNaN(a) || math.IsInf(a, 0) {
			return nil, specErrorf("%s slopes[%d]: %g is not a finite number", kind, i, a)
		}
	}
	edges := []float64{lo}
	alphas := []float64{}
	j := 0 // index of the slope in force at the current edge
	for j < len(breaksMsun) && breaksMsun[j] <= lo {
		j++
	}
	for ; j < len(breaksMsun) && breaksMsun[j] < hi; j++ {
		edges = append(edges, breaksMsun[j])
		alphas = append(alphas, slopes[j])
	}
	edges = append(edges, hi)
	alphas = append(alphas, slopes[j])
	return newPowerLaw(kind, edges, alphas), nil
}
