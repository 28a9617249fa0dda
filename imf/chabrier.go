package imf

import (
	"math"
	"math/rand/v2"
)

// ChabrierForm selects one of the two Galactic-disc mass functions of
// Chabrier (2003, PASP 115, 763, Table 1).
type ChabrierForm uint8

const (
	// ChabrierSingle is the mass function of individual objects
	// ("single objects", Chabrier 2003 eq. 17 and Table 1).
	ChabrierSingle ChabrierForm = iota + 1
	// ChabrierSystem is the mass function of unresolved systems
	// (Chabrier 2003 eq. 18 and Table 1).
	ChabrierSystem
)

// String returns the kind word "chabrier_single" or "chabrier_system".
func (f ChabrierForm) String() string {
	switch f {
	case ChabrierSingle:
		return KindChabrierSingle
	case ChabrierSystem:
		return KindChabrierSystem
	}
	return "chabrier_unknown"
}

// ChabrierParams are the parameters of a Chabrier (2003) mass function in
// the paper's dN/dlog10 m form:
//
//	xi(log m) = A exp[-(log m - log McMsun)^2 / (2 SigmaDex^2)]   m <= 1 Msun
//	xi(log m) = AHigh m^-XHigh                                  m >  1 Msun
//
// A and AHigh are in (log Msun)^-1 pc^-3 (they cancel on normalisation).
type ChabrierParams struct {
	A        float64 // lognormal amplitude (Table 1)
	McMsun   float64 // characteristic mass m_c, Msun (Table 1)
	SigmaDex float64 // width sigma of the lognormal in log10 m, dex (Table 1)
	AHigh    float64 // published high-mass amplitude A, m > 1 Msun (Table 1)
	XHigh    float64 // high-mass exponent x of xi(log m) (Table 1); alpha = x + 1 for dN/dm
}

// Params returns the Table 1 parameters of Chabrier (2003, PASP 115, 763)
// for the form, digit for digit as printed there:
//
//	single objects (eq. 17): A = 0.158, m_c = 0.079 Msun, sigma = 0.69
//	systems        (eq. 18): A = 0.086, m_c = 0.22 Msun,  sigma = 0.57
//	both, m > 1 Msun:        A = 4.43e-2, x = 1.3
//
// It panics for a ChabrierForm other than ChabrierSingle or ChabrierSystem.
func (f ChabrierForm) Params() ChabrierParams {
	switch f {
	case ChabrierSingle:
		return ChabrierParams{A: 0.158, McMsun: 0.079, SigmaDex: 0.69, AHigh: 4.43e-2, XHigh: 1.3} // Chabrier 2003 Table 1
	case ChabrierSystem:
		return ChabrierParams{A: 0.086, McMsun: 0.22, SigmaDex: 0.57, AHigh: 4.43e-2, XHigh: 1.3} // Chabrier 2003 Table 1
	}
	panic("imf: unknown ChabrierForm")
}

// ContinuousAHigh returns the high-mass amplitude that makes xi(log m)
// continuous at 1 Msun with the lognormal part:
//
//	A_h = A exp[-(log m_c)^2 / (2 sigma^2)]
//
// With the printed Table 1 values this is 0.04410 (single) and 0.04420
// (systems), against the printed 4.43e-2: the difference, 0.5% and 0.2%, is
// within what the three printed digits of sigma allow (±0.005 in sigma moves
// A_h by 1.9%).
func (p ChabrierParams) ContinuousAHigh() float64 {
	y0 := math.Log10(p.McMsun)
	return p.A * math.Exp(-y0*y0/(2*p.SigmaDex*p.SigmaDex))
}

// Chabrier is the Chabrier (2003) lognormal + power-law mass function,
// normalised on [lo, hi]. In dN/dm form (dN/dm = xi / (m ln 10)):
//
//	dN/dm ∝ exp[-(log m - log m_c)^2 / (2 sigma^2)] / m      m <= 1 Msun
//	dN/dm ∝ A_h m^-(x+1)                                       m >  1 Msun
//
// Deviation from the paper, made on purpose: the high-mass amplitude is
// A_h = ContinuousAHigh() rather than the printed 4.43e-2, so that the
// density is exactly continuous at 1 Msun, as the paper intends; the two
// differ by less than the rounding of the printed parameters (see
// ContinuousAHigh).
//
// Everything is closed form. Below 1 Msun the CDF is a difference of normal
// CDFs in log m, and the mass integral a shifted one (completing the square,
// with k = ln 10):
//
//	∫ 10^y exp[-(y-y0)^2/(2 s^2)] dy = s sqrt(2 pi) exp(y0 k + s^2 k^2/2) Phi((y - y0 - s^2 k)/s)
//
// The quantile there inverts Phi with math.Erfinv (Wichura 1988, algorithm
// AS 241, relative accuracy about 1e-16), refined by one Newton step in the
// tails; above 1 Msun it is the power-law inverse.
type Chabrier struct {
	form        ChabrierForm
	loMsun      float64
	hiMsun      float64
	joinMsun    float64 // min(hi, 1): top of the lognormal part
	y0, sigma   float64
	hasLN       bool
	phiLo       float64 // Phi(z(lo))
	lnProbScale float64 // A sigma sqrt(2 pi) / Ntot: CDF = lnProbScale (Phi(z) - phiLo)
	lnDensScale float64 // A / (Ntot ln 10)
	lnMassScale float64 // mass-fraction scale of the lognormal part
	phiMLo      float64 // Phi(w(lo)) for the mass integral
	pLN         float64 // number fraction in the lognormal part
	hasPL       bool
	seg         segment
	meanMsun    float64
}

const ln10 = math.Ln10

// normCDF is the standard normal CDF Phi(z) = erfc(-z/sqrt 2)/2
// (Abramowitz & Stegun 1964, eq. 26.2.29).
func normCDF(z float64) float64 { return 0.5 * math.Erfc(-z/math.Sqrt2) }

// normQuantile is the inverse of Phi, z = sqrt 2 erfinv(2q - 1). In the
// tails (q < 0.05 or q > 0.95) forming 2q - 1 loses relative precision in
// the distance from the tail, so there the result is refined by one Newton
// step on the tail-accurate CDF, z -= (Phi(z) - q)/phi(z), evaluated on the
// lower tail by symmetry (1 - q is exact for q >= 0.5, Sterbenz lemma).
// The error after the step is below 1e-15 relative (quadratic convergence
// from ~1e-11).
func normQuantile(q float64) float64 {
	if q > 0.95 {
		return -normQuantile(1 - q)
	}
	z := math.Sqrt2 * math.Erfinv(2*q-1)
	if q < 0.05 && q > 0 {
		z -= (normCDF(z) - q) * math.Sqrt(2*math.Pi) * math.Exp(z*z/2) // Newton step, phi(z) = exp(-z^2/2)/sqrt(2 pi)
	}
	return z
}

// NewChabrier returns the Chabrier (2003) mass function of the given form
// with its Table 1 parameters, normalised on [loMsun, hiMsun]. Limits of 0
// select DefaultLoMsun (0.1) and DefaultHiMsun (100); limits must lie in
// [MinMassMsun, MaxMassMsun] = [0.01, 150] Msun, otherwise an error wrapping
// ErrInvalidSpec is returned. It panics for an unknown form.
func NewChabrier(form ChabrierForm, loMsun, hiMsun float64) (*Chabrier, error) {
	return newChabrier(form, loMsun, hiMsun, 0)
}

// newChabrier builds the function; aHigh > 0 replaces the continuity-derived
// high-mass amplitude (used by tests to reproduce values computed with the
// printed, slightly discontinuous 4.43e-2).
func newChabrier(form ChabrierForm, loMsun, hiMsun, aHigh float64) (*Chabrier, error) {
	p := form.Params()
	lo, hi, err := resolveLimits(form.String(), loMsun, hiMsun, DefaultLoMsun, DefaultHiMsun, MinMassMsun, MaxMassMsun)
	if err != nil {
		return nil, err
	}
	c := &Chabrier{form: form, loMsun: lo, hiMsun: hi, y0: math.Log10(p.McMsun), sigma: p.SigmaDex}
	c.joinMsun = math.Min(hi, 1)
	var nLN, mLN, nPL, mPL float64
	var lnMass0, phiMHi, phiHi float64
	if lo < 1 {
		c.hasLN = true
		s := c.sigma
		zLo := (math.Log10(lo) - c.y0) / s
		zHi := (math.Log10(c.joinMsun) - c.y0) / s
		c.phiLo, phiHi = normCDF(zLo), normCDF(zHi)
		nLN = p.A * s * math.Sqrt(2*math.Pi) * (phiHi - c.phiLo) // Chabrier 2003 eq. 17 integrated over log m
		shift := s * ln10                                        // completing the square: w = z - s ln10
		c.phiMLo, phiMHi = normCDF(zLo-shift), normCDF(zHi-shift)
		lnMass0 = p.A * s * math.Sqrt(2*math.Pi) * math.Exp(c.y0*ln10+s*s*ln10*ln10/2)
		mLN = lnMass0 * (phiMHi - c.phiMLo)
	}
	if hi > 1 {
		c.hasPL = true
		a := math.Max(lo, 1)
		ah := p.ContinuousAHigh()
		if aHigh > 0 {
			ah = aHigh
		}
		alpha := p.XHigh + 1 // dN/dm = xi/(m ln10) ∝ m^-(x+1)
		cRaw := ah * math.Pow(a, -alpha) / ln10
		c.seg, nPL, mPL = newSegment(a, hi, alpha, cRaw)
	}
	nTot, mTot := nLN+nPL, mLN+mPL
	c.meanMsun = mTot / nTot
	c.pLN = nLN / nTot
	c.lnProbScale = p.A * c.sigma * math.Sqrt(2*math.Pi) / nTot
	c.lnDensScale = p.A / (nTot * ln10)
	c.lnMassScale = lnMass0 / mTot
	if c.hasPL {
		c.seg.c /= nTot
		c.seg.setProb(c.pLN, nPL/nTot)
		c.seg.mStart, c.seg.mWidth = mLN/mTot, mPL/mTot
	}
	return c, nil
}

// Name returns "chabrier_single" or "chabrier_system".
func (c *Chabrier) Name() string { return c.form.String() }

// Form returns the form (single objects or systems).
func (c *Chabrier) Form() ChabrierForm { return c.form }

// Bounds returns the mass limits (Msun).
func (c *Chabrier) Bounds() (loMsun, hiMsun float64) { return c.loMsun, c.hiMsun }

// Mean returns the mean mass (Msun) from the closed-form integrals.
func (c *Chabrier) Mean() float64 { return c.meanMsun }

// Prob returns the normalised dN/dm (Msun^-1) at massMsun, 0 outside [lo, hi].
func (c *Chabrier) Prob(massMsun float64) float64 {
	if !(massMsun >= c.loMsun && massMsun <= c.hiMsun) {
		return 0
	}
	if massMsun <= 1 {
		z := (math.Log10(massMsun) - c.y0) / c.sigma
		return c.lnDensScale * math.Exp(-z*z/2) / massMsun // Chabrier 2003 eq. 17/18 divided by m ln10
	}
	return c.seg.prob(massMsun)
}

// CDF returns the fraction of stars below massMsun (0 below lo, 1 from hi;
// NaN for NaN).
func (c *Chabrier) CDF(massMsun float64) float64 {
	switch {
	case math.IsNaN(massMsun):
		return math.NaN()
	case massMsun <= c.loMsun:
		return 0
	case massMsun >= c.hiMsun:
		return 1
	case massMsun <= 1:
		z := (math.Log10(massMsun) - c.y0) / c.sigma
		return c.lnProbScale * (normCDF(z) - c.phiLo)
	}
	return c.seg.pStart + c.seg.pWidth*c.seg.numberFrac(massMsun)
}

func (c *Chabrier) massBelow(massMsun float64) float64 {
	switch {
	case massMsun <= c.loMsun:
		return 0
	case massMsun >= c.hiMsun:
		return 1
	case massMsun <= 1:
		w := (math.Log10(massMsun)-c.y0)/c.sigma - c.sigma*ln10
		return c.lnMassScale * (normCDF(w) - c.phiMLo)
	}
	return c.seg.mStart + c.seg.mWidth*c.seg.massFrac(massMsun)
}

// NumberFraction returns the fraction of stars with m1 <= m < m2. It panics
// if m1 > m2 or either is NaN.
func (c *Chabrier) NumberFraction(m1, m2 float64) float64 {
	checkInterval(m1, m2)
	return c.CDF(m2) - c.CDF(m1)
}

// MassFraction returns the fraction of the total mass in stars with
// m1 <= m < m2. It panics if m1 > m2 or either is NaN.
func (c *Chabrier) MassFraction(m1, m2 float64) float64 {
	checkInterval(m1, m2)
	return c.massBelow(m2) - c.massBelow(m1)
}

// Quantile returns the mass (Msun) with CDF equal to p: below 1 Msun
//
//	m = 10^(log m_c + sigma Phi^-1(Phi(z_lo) + p / scale))
//
// and above it the analytic power-law inverse. It panics if p is outside
// [0, 1] or NaN.
func (c *Chabrier) Quantile(p float64) float64 {
	checkProb(p)
	if p == 1 {
		return c.hiMsun
	}
	return c.quantile(p)
}

func (c *Chabrier) quantile(p float64) float64 {
	if c.hasLN && (p < c.pLN || !c.hasPL) {
		z := normQuantile(c.phiLo + p/c.lnProbScale)
		m := fastExp((c.y0 + c.sigma*z) * ln10)
		if m < c.loMsun { // rounding at the ends of the lognormal part
			m = c.loMsun
		} else if m > c.joinMsun {
			m = c.joinMsun
		}
		return m
	}
	return c.seg.invert(p)
}

// Rand draws one mass (Msun) as Quantile(u) of one uniform u = r.Float64()
// in [0, 1). It does not allocate.
func (c *Chabrier) Rand(r *rand.Rand) float64 {
	return c.quantile(r.Float64())
}
